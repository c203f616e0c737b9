// Proposing a transimpedance design for a bandwidth target: given the
// photodiode and the op-amp of a transimpedance stage, which feedback
// resistor (from a list of preferred values) and capacitor meet the -3 dB
// bandwidth, and what noise each choice leaves.
//
// For each R_f the largest bandwidth with an acceptable response is that of
// the Butterworth C_f (budget/feedback_capacitor.h): it falls with R_f, so
// the largest R_f that still reaches the target is found by bisection over
// the sorted list. Each proposed row then gets the C_f that puts the
// computed -3 dB point exactly on the target (more C_f than Butterworth:
// a flatter, better damped response), and a full budget.
//
// Headroom: the stage's own photocurrent (background light) and dark
// current put a DC level on the output, I x R_f, and the offset adds its
// worst case; both must fit the output's limit (the full-scale swing, or
// half the supply span: design/tia_snr.h, OutputHeadroomLimit). That too
// falls with R_f, so the largest R_f that fits is found the same way, and
// the best R_f is the smaller of the two: the suggestion says which limit
// binds.
//
// With a capacitor series (IEC 60063, E6 or E12 in practice) C_f is built
// of the feedback resistor's own parasitic capacitance C_p
// (feedback.parasitic_capacitance, default 0.2 pF for a small surface-mount
// part: common practice) plus one part of the series: the largest value
// that leaves C_p + part at or below the C_f for the target (so the -3 dB
// point stays at or above it) and at or above the Butterworth C_f (so the
// response stays flat), else the smallest value above. A C_f that C_p alone
// already exceeds is "parasitic alone": no part fitted.
#ifndef HUSHGAIN_DESIGN_TIA_SUGGEST_H_
#define HUSHGAIN_DESIGN_TIA_SUGGEST_H_

#include <optional>
#include <string>
#include <vector>

#include "base/status.h"
#include "circuit/preferred_series.h"
#include "circuit/stage.h"

namespace hushgain {

// The documented range of --rows: 1 to 1000.
inline constexpr int kMaxTiaRows = 1000;

struct TiaSuggestOptions {
  double bandwidth_hz = 0;  // the -3 dB target, > 0
  // Candidate feedback resistors, any order; at least one.
  std::vector<double> resistors_ohm;
  int rows = 6;  // the largest R_f that meets the target and rows-1 below it
  // C_f from a series with the parasitic counted in; nullopt: C_f as
  // computed (any value).
  std::optional<PreferredSeries> capacitor_series;
  double parasitic_capacitance_f = 0.2e-12;  // >= 0

  // Empty when valid; otherwise names the field, its value and the rule.
  std::string Validate() const;
};

struct TiaCandidate {
  double rf_ohm = 0;
  double cf_f = 0;
  bool meets_target = false;    // false for the first R_f above the best
  double bandwidth_3db_hz = 0;  // 0: beyond the search (100 x GBW)
  // The most this R_f can give, flat; 0: beyond the search (100 x GBW).
  double butterworth_bandwidth_hz = 0;
  double phase_margin_deg = 0;
  double peaking_db = 0;
  double output_rms_v = 0;
  double input_rms_a = 0;
  double input_density_a_per_rthz = 0;  // at the stage's reference frequency
  double nep_w_per_rthz = 0;            // 0 without a responsivity
  // With a capacitor series: the fitted part (cf_f = part + parasitic), or
  // 0 and parasitic_alone when the parasitic is already enough.
  double capacitor_part_f = 0;
  bool parasitic_alone = false;
  // The DC output of the stage's photocurrent and dark current (signed)
  // and, with the worst-case offset, its use of the headroom limit.
  double dc_output_v = 0;
  double headroom_used_v = 0;  // |dc_output_v| + offset worst case
  bool fits_headroom = true;
};

// Which limit sets the largest R_f.
enum class TiaLimit { kBandwidth, kHeadroom };

struct TiaSuggestion {
  Status status;
  std::vector<TiaCandidate> rows;  // ascending R_f; the best meets the target
  int best = -1;  // the largest R_f that meets the target and fits
  TiaLimit limited_by = TiaLimit::kBandwidth;
  double headroom_limit_v = 0;
  std::string
      headroom_limit_name;  // "full-scale swing", "half the supply span"
  double background_current_a = 0;  // photocurrent + flowing dark current
  // The textbook estimate of that largest R_f: GBW / (2 pi C f_3dB^2)
  // (from f_3dB ~ sqrt(GBW / (2 pi R_f C))).
  double largest_rf_estimate_ohm = 0;
};

// `stage` must be a transimpedance stage; its feedback resistor and
// capacitor are replaced by the candidates.
TiaSuggestion SuggestTransimpedance(const Stage& stage,
                                    const TiaSuggestOptions& options);

}  // namespace hushgain

#endif  // HUSHGAIN_DESIGN_TIA_SUGGEST_H_
