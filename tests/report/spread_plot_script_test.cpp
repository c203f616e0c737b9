// The Monte Carlo histogram script (report/spread_plot_script.h), read as
// text: each panel's inline bins hold every sample, the mean, percentile
// and limit lines sit at the summary's values in display units, a far
// limit stays in the legend only, and the stage name is an escaped literal.
#include "report/spread_plot_script.h"

#include <doctest/doctest.h>

#include <sstream>
#include <string>
#include <vector>

#include "report/plot_axes.h"
#include "report/text_escape.h"

namespace hushgain {
namespace {

const char* kHostile = "\"; system(\"touch pwned\") ; `id` @x '";

// 1000 samples: gain error -1 % .. +1 % in steps, offset -5 mV .. +5 mV,
// noise 100 uV .. 110 uV, all evenly spread.
SpreadRun Run() {
  SpreadRun run;
  run.nominal.stage_name = kHostile;
  run.nominal.band_low_hz = 10;
  run.nominal.band_high_hz = 1e3;
  run.nominal_gain = 1;
  run.temperature_low_k = run.temperature_high_k = 298.15;
  run.figures.Resize(1000);
  for (int k = 0; k < 1000; ++k) {
    const double u = k / 999.0;
    run.figures.gain[k] = 1 + (-0.01 + 0.02 * u);  // gain error -1 .. +1 %
    run.figures.offset_v[k] = -5e-3 + 10e-3 * u;
    run.figures.noise_rms_v[k] = 100e-6 + 10e-6 * u;
  }
  return run;
}

// The sum of the second column of datablock `name`.
long BlockCount(const std::string& script, const std::string& name) {
  const std::size_t start = script.find(name + " << EOD\n");
  REQUIRE(start != std::string::npos);
  std::istringstream in(script.substr(
      start + name.size() + 8,
      script.find("EOD\n", start + name.size() + 8) - start - name.size() - 8));
  long total = 0;
  double centre;
  long count;
  while (in >> centre >> count) total += count;
  return total;
}

bool HasVertical(const std::string& script, double x) {
  return script.find("set arrow from first " + PlotNumber(x) +
                     ", graph 0 to first " + PlotNumber(x)) !=
         std::string::npos;
}

TEST_CASE("the histogram script bins every sample and marks the summary") {
  const SpreadRun run = Run();
  SpreadLimits limits;
  limits.gain_error = 0.008;  // inside the samples' range: drawn
  limits.offset_v = 1.0;      // 1 V against +-5 mV: off the axis
  const SpreadSummary summary = Summarize(run, limits);
  SpreadPlotOptions o;
  o.format = PlotFormat::kSvg;
  o.output_path = "/tmp/x.svg";
  const std::string script = BuildSpreadPlotScript(run, summary, limits, o);

  for (const char* block : {"$hist0", "$hist1", "$hist2"})
    CHECK(BlockCount(script, block) == 1000);
  // Gain error in %: the mean and percentiles times 100, limits at +-0.8.
  CHECK(HasVertical(script, 100 * summary.gain_error.mean));
  CHECK(HasVertical(script, 100 * summary.gain_error.p_low));
  CHECK(HasVertical(script, 100 * summary.gain_error.p_high));
  CHECK(HasVertical(script, 0.8));
  CHECK(HasVertical(script, -0.8));
  // Offset in mV (largest magnitude 5 mV), the 1 V limit not drawn.
  CHECK(script.find(GnuplotString("output offset (mV)")) != std::string::npos);
  CHECK(HasVertical(script, summary.offset.p_high / 1e-3));
  CHECK_FALSE(HasVertical(script, 1000.0));
  const std::string off = GnuplotString(" (off the axis)");
  CHECK(script.find(off.substr(1, off.size() - 2) + "\"") != std::string::npos);
  // Noise in µV.
  CHECK(script.find(GnuplotString("output noise rms (\xC2\xB5V)")) !=
        std::string::npos);
  CHECK(HasVertical(script, summary.noise.mean / 1e-6));
  // The name only as an escaped literal.
  CHECK(script.find(GnuplotString(kHostile)) != std::string::npos);
  CHECK(script.find(kHostile) == std::string::npos);
  CHECK(script.find("system(") == std::string::npos);
}

}  // namespace
}  // namespace hushgain
