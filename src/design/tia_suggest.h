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
#ifndef HUSHGAIN_DESIGN_TIA_SUGGEST_H_
#define HUSHGAIN_DESIGN_TIA_SUGGEST_H_

#include <string>
#include <vector>

#include "base/status.h"
#include "circuit/stage.h"

namespace hushgain {

// The documented range of --rows: 1 to 1000.
inline constexpr int kMaxTiaRows = 1000;

struct TiaSuggestOptions {
  double bandwidth_hz = 0;  // the -3 dB target, > 0
  // Candidate feedback resistors, any order; at least one.
  std::vector<double> resistors_ohm;
  int rows = 6;  // the largest R_f that meets the target and rows-1 below it

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
};

struct TiaSuggestion {
  Status status;
  std::vector<TiaCandidate> rows;  // ascending R_f; the best meets the target
  int best = -1;                   // index of the largest R_f that meets it
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
