// Every contributor's output noise density, the total, and the signal and
// e_n noise gain magnitudes, sampled on a given frequency grid: the data of
// the spectrum CSV and of the plots. The same evaluator as the budget
// (noise/spectrum_evaluator.h), one adjoint solve per frequency:
//   density_k(f) = sqrt(S_out,k(f))            V/rtHz
//   total(f)     = sqrt(sum over k of S_out,k(f))
//   signal_gain(f) = |source -> output|        V/V (V/A for a current)
//   noise_gain(f)  = |e_n -> output|           V/V
//   loop_gain(f)   = |T(f)|, the return ratio of the op-amp in its network
//                    (analysis/loop_gain.h)       V/V
#ifndef HUSHGAIN_BUDGET_SAMPLE_SPECTRA_H_
#define HUSHGAIN_BUDGET_SAMPLE_SPECTRA_H_

#include <string>
#include <vector>

#include "base/status.h"
#include "budget/budget.h"
#include "circuit/stage.h"

namespace hushgain {

struct SpectrumSamples {
  std::vector<double> f_hz;
  // Contributors in the evaluator's order, named and kinded as the budget
  // names them ("R_in", "thermal").
  std::vector<std::string> names;
  std::vector<NoiseKind> kinds;
  // density_v_per_rthz[k][i]: contributor k at f_hz[i].
  std::vector<std::vector<double>> density_v_per_rthz;
  std::vector<double> total_v_per_rthz;
  std::vector<double> signal_gain_abs;
  std::vector<double> noise_gain_abs;
  std::vector<double> loop_gain_abs;

  // Index of `name` in names, or -1.
  int Find(const std::string& name) const;
};

struct SpectrumOutcome {
  Status status;  // singular network, or a non-finite value (named, with f)
  SpectrumSamples samples;
};

// The stage must be valid and every f > 0. A feedback capacitor given as a
// target ("auto") is chosen as the budget chooses it
// (budget/feedback_capacitor.h); pass StageAsBudgeted to reuse a budget's
// choice instead. Never prints.
SpectrumOutcome SampleSpectra(const Stage& stage,
                              const std::vector<double>& f_hz);

// `stage` with the feedback capacitor `budget` (computed from it) used, so
// the samples describe the very network of the budget.
Stage StageAsBudgeted(const Stage& stage, const Budget& budget);

}  // namespace hushgain

#endif  // HUSHGAIN_BUDGET_SAMPLE_SPECTRA_H_
