// Embeds hushgain's computing core: a stage built in code (no stage file),
// its budget computed and printed, and one figure checked against a closed
// form so the program fails when the library it linked is wrong.
//
// Stage: an inverting amplifier, R_in = 10 kOhm, R_f = 1 MOhm, a quiet
// op-amp (e_n = 1 nV/rtHz white, no current noise, A0 = 1e7, GBW = 1 GHz:
// close to ideal in a 10 Hz .. 1 kHz band), 25 °C.
// R_f's thermal noise reaches the output with gain 1 (ideal op-amp), so its
// output rms is sqrt(4 k T R_f (f_high - f_low)) (Johnson-Nyquist; k from
// the SI definition, 1.380649e-23 J/K).
#include <cmath>
#include <cstdio>

#include "budget/compute_budget.h"  // installed: include/hushgain/budget/

int main() {
  hushgain::Stage stage;
  stage.name = "embedded inverting stage";
  stage.temperature_k = 298.15;
  stage.band_low_hz = 10;
  stage.band_high_hz = 1000;
  stage.topology = hushgain::Topology::kInverting;
  stage.input_resistor_ohm = 10e3;
  stage.feedback.kind = hushgain::Feedback::Kind::kResistor;
  stage.feedback.resistor_ohm = 1e6;
  stage.opamp.class_name = "quiet ideal-ish op-amp";
  stage.opamp.e_w_v_per_rthz = 1e-9;
  stage.opamp.open_loop_gain = 1e7;
  stage.opamp.gbw_hz = 1e9;

  const hushgain::BudgetOutcome outcome =
      hushgain::ComputeBudget(stage, hushgain::BudgetOptions{});
  if (!outcome.status.ok) {
    std::fprintf(stderr, "budget refused: %s\n",
                 outcome.status.message.c_str());
    return 1;
  }
  const hushgain::Budget& budget = outcome.budget;
  std::printf("%s: output noise %.4g V rms\n", budget.stage_name.c_str(),
              budget.output_rms_v);
  double r_f_rms = -1;
  for (const hushgain::Contributor& c : budget.contributors) {
    std::printf("  %-6s %.4g V rms  %5.1f %%\n", c.name.c_str(), c.output_rms_v,
                100 * c.share);
    if (c.name == "R_f") r_f_rms = c.output_rms_v;
  }
  const double expected = std::sqrt(4 * 1.380649e-23 * 298.15 * 1e6 * 990);
  const double error = std::fabs(r_f_rms / expected - 1);
  std::printf("R_f: %.6g V rms, closed form %.6g V rms, relative error %.1e\n",
              r_f_rms, expected, error);
  // 1e-3: the finite loop gain (1e7 / 101 at DC) and the integral's 1e-4.
  return error < 1e-3 ? 0 : 1;
}
