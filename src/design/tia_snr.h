// Signal-to-noise ratio of a photodiode stage against the incident optical
// power (`hushgain tia snr`). At optical power P the signal photocurrent
// I_s = R P (R the photodiode's responsivity) adds to the stage's own
// average photocurrent I_bg (background light), so the photocurrent's shot
// noise 2 q (I_bg + R P) grows with P. Each point is a budget of the stage
// with that photocurrent (budget/compute_budget.h):
//   SNR(P) = R P / i_rms(P)
// an amplitude ratio of the signal current to the input-referred noise
// current rms over the band (the budget's input_rms); in dB, 20 log10.
//
// NEP over the band: the power at which SNR = 1. The photocurrent's shot
// noise enters where the signal does, so its input-referred density is
// sqrt(2 q I) at every frequency and
//   i_rms(P)^2 = N0^2 + 2 q R P B,  B = f_high - f_low,
// N0 the input rms at P = 0; then SNR = 1 solves
//   (R P)^2 - 2 q B (R P) - N0^2 = 0,  R P = q B + sqrt((q B)^2 + N0^2).
// That is the first guess; the power is then refined on full budgets (a
// resistor's excess noise also grows with the DC photocurrent) until
// |SNR - 1| < 1e-6.
//
// Saturation: the output's DC level is the sum of the budget's DC outputs
// (background photocurrent, dark current: budget/dc_output.h), R P times the
// DC transimpedance (the same sign) and the worst-case offset. The stage
// saturates where its magnitude reaches the limit: the full-scale swing, or
// half the op-amp's supply span, whichever is smaller (the full-scale swing
// is optional):
//   P_sat = (limit - |V_dc(0)| - offset_wc) / (R |Z_t(0)|).
#ifndef HUSHGAIN_DESIGN_TIA_SNR_H_
#define HUSHGAIN_DESIGN_TIA_SNR_H_

#include <optional>
#include <string>
#include <vector>

#include "base/status.h"
#include "circuit/stage.h"

namespace hushgain {

inline constexpr int kMaxTiaSnrPoints = 10000;

struct TiaSnrOptions {
  double power_min_w = 0;  // > 0
  double power_max_w = 0;  // > power_min_w
  int points = 31;  // log-spaced, both ends included; 2 to kMaxTiaSnrPoints

  // Empty when valid; otherwise "field: expected ..., got ...".
  std::string Validate() const;
};

struct TiaSnrPoint {
  double power_w = 0;
  double signal_current_a = 0;  // R P
  double input_rms_a = 0;       // over the band, photocurrent I_bg + R P
  double output_rms_v = 0;
  double snr = 0;          // signal_current_a / input_rms_a
  double shot_share = 0;   // the photocurrent's shot noise, of the noise power
  double dc_output_v = 0;  // the output's DC level without the offset, signed
  bool saturated = false;  // |dc_output_v| + offset worst case > limit
};

struct TiaSnrResult {
  Status status;
  std::vector<TiaSnrPoint> points;  // ascending power
  double responsivity_a_per_w = 0;
  double background_current_a = 0;  // the stage's own photocurrent
  double band_low_hz = 0, band_high_hz = 0;
  double noise_floor_a = 0;  // N0: input rms with no signal light
  double nep_w = 0;          // SNR = 1 over the band
  double offset_worst_case_v = 0;
  double dc_transimpedance_ohm = 0;  // Z_t(0), signed
  double limit_v = 0;                // the headroom limit
  std::string limit_name;            // "full-scale swing" or "half the supply"
  // Where the DC output reaches the limit; 0 when it does already without
  // signal light (a warning says so).
  double saturation_power_w = 0;
  std::vector<std::string> warnings;
};

// The limit of the output's DC level: the full-scale swing, or half the
// op-amp's supply span, whichever is smaller (the full scale is optional).
struct HeadroomLimit {
  double volts = 0;
  std::string name;  // "full-scale swing" or "half the supply span"
};
HeadroomLimit OutputHeadroomLimit(const Stage& stage);

// `stage` must be a transimpedance stage whose photodiode has a
// responsivity (asserted; the CLI refuses otherwise). A failed budget
// returns its status.
TiaSnrResult ComputeTiaSnr(const Stage& stage, const TiaSnrOptions& options);

}  // namespace hushgain

#endif  // HUSHGAIN_DESIGN_TIA_SNR_H_
