// The same stage with each of several op-amps (`hushgain compare`): one full
// review per op-amp (review/review.h ReviewStage, the op-amp replaced whole,
// as `budget --device` does), ranked, with what each class is good and bad
// at:
//   - the output noise power by kind of contributor: the op-amp's voltage
//     noise through the noise gain (e_n), its current noise through the
//     impedances at its pins (i_n, both pins), the resistors' thermal and
//     excess noise, and the rest (shot noise, a bias supply, the sensor's
//     own noise); the four shares add up to 1;
//   - for a voltage source, the class's optimum source resistance at the
//     reference frequency f_ref,
//       R_opt = e_n(f_ref) / i_n(f_ref)
//     where the input-referred e_n and i_n terms are equal: in an inverting
//     stage the op-amp's - input sees the source through R_s + R_in, whose
//     current-noise term referred to the input is i_n (R_s + R_in) while the
//     voltage-noise term is e_n (1 + (R_s + R_in) / R_f) ~ e_n. A source
//     well below R_opt is e_n-bound (a bipolar input fits), well above it
//     i_n-bound (a FET input fits). i_n is taken at the stage's temperature
//     (circuit/stage_at_temperature.h CurrentNoiseFactor), e_n as given;
//   - a verdict: the stage fits, or which check fails (the budget's
//     StageProblem flags, a phase margin below kLowPhaseMarginDeg, a -3 dB
//     bandwidth below the band's upper edge, a low corner above its lower
//     edge, or a refused analysis).
// A device whose budget is refused (an unstable loop, a singular network) is
// a row with its status, never an abort.
#ifndef HUSHGAIN_DESIGN_OPAMP_COMPARISON_H_
#define HUSHGAIN_DESIGN_OPAMP_COMPARISON_H_

#include <optional>
#include <string>
#include <vector>

#include "base/status.h"
#include "budget/budget.h"
#include "circuit/opamp_model.h"
#include "circuit/stage.h"
#include "review/review.h"

namespace hushgain {

// How the rows are ordered: by input-referred noise rms (default) or by
// worst-case output offset, smallest first.
enum class OpAmpRanking { kInputNoise, kOffset };

struct NamedOpAmp {
  std::string name;  // as the user named it: a device name or a file path
  OpAmpModel model;
};

struct OpAmpComparisonOptions {
  // The review of every row (`budget` uses cli/stage_input.h
  // FullReviewOptions; the same options give the same figures).
  ReviewOptions review;
  OpAmpRanking ranking = OpAmpRanking::kInputNoise;

  // Empty when valid; otherwise "field: expected ..., got ...".
  std::string Validate() const { return review.Validate(); }
};

// Fractions of the total output noise power, by kind of contributor.
struct NoiseKindShares {
  double voltage_noise = 0;  // e_n (NoiseKind::kOpAmpVoltage)
  double current_noise = 0;  // i_n at both pins (kOpAmpCurrent)
  double resistor = 0;       // thermal and excess noise of resistors
  double other = 0;          // shot, supply, the sensor's own noise
};

struct OpAmpComparisonRow {
  std::string device;  // NamedOpAmp::name
  std::string class_name;
  Status status;  // not ok: the review was refused (budget then empty)
  Budget budget;  // the full review's budget
  int rank = 0;   // 1 = best; 0 for a refused row
  NoiseKindShares shares;
  double e_n_ref_v_per_rthz = 0;  // at the reference frequency
  double i_n_ref_a_per_rthz = 0;  // at the reference, the stage's temperature
  // Voltage source only: R_opt = e_n / i_n (none when i_n is 0), and the
  // source as the op-amp sees it, (R_s + R_in) / R_opt.
  std::optional<double> optimum_source_ohm;
  std::optional<double> source_to_optimum;
  // The checks beside budget.problems (each false for a refused row).
  bool low_phase_margin = false;  // crossover found, margin below 45 deg
  bool narrow_bandwidth = false;  // 0 < -3 dB bandwidth < band's upper edge
  bool high_low_corner = false;   // low corner above the band's lower edge

  // True when the review ran and no check fails.
  bool Fits() const;
};

struct OpAmpComparison {
  OpAmpRanking ranking = OpAmpRanking::kInputNoise;
  // The rows that fit, by the ranking (ties by device name), then the
  // budgeted rows where a check fails, by the ranking, then the refused
  // ones in the order given.
  std::vector<OpAmpComparisonRow> rows;
  double reference_hz = 0;
  double band_low_hz = 0, band_high_hz = 0;
  std::string input_unit = "V";  // "V" or "A" (a photodiode)
  // An inverting stage driven by a voltage source (not a photodiode, not a
  // capacitive sensor): only then is R_opt reported.
  bool voltage_source = false;
  double source_resistance_seen_ohm = 0;  // R_s + R_in; voltage source only
};

// e_n(f) / i_n(f) of `model` at `temperature_k` (i_n scaled by
// CurrentNoiseFactor); none when i_n is 0. f_hz > 0.
std::optional<double> OptimumSourceResistanceOhm(const OpAmpModel& model,
                                                 double f_hz,
                                                 double temperature_k);

// `stage` must be valid, `options` valid (asserted). Never prints.
OpAmpComparison CompareOpAmps(const Stage& stage,
                              const std::vector<NamedOpAmp>& opamps,
                              const OpAmpComparisonOptions& options);

}  // namespace hushgain

#endif  // HUSHGAIN_DESIGN_OPAMP_COMPARISON_H_
