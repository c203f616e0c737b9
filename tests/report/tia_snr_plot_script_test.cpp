// The `tia snr --plot` script, read as text: the points inline (saturated
// ones apart), log axes in watts, SNR = 1 drawn, the NEP marked on it, the
// saturation power drawn, and the stage's name only as an escaped literal.
#include "report/tia_snr_plot_script.h"

#include <doctest/doctest.h>

#include <string>

#include "report/text_escape.h"

namespace hushgain {
namespace {

// A name that would run a command if it reached gnuplot unquoted.
const char* kHostile = "\"; system(\"touch pwned\") ; `id` @x '";

TiaSnrResult Curve() {
  TiaSnrResult r;
  r.responsivity_a_per_w = 0.5;
  r.background_current_a = 1e-9;
  r.band_low_hz = 1;
  r.band_high_hz = 1e4;
  r.nep_w = 2e-11;
  r.limit_v = 4;
  r.limit_name = "full-scale swing";
  r.saturation_power_w = 5e-7;
  for (double p : {1e-12, 1e-10, 1e-8, 1e-6}) {
    TiaSnrPoint pt;
    pt.power_w = p;
    pt.snr = p / 2e-11;
    pt.saturated = p > 5e-7;
    r.points.push_back(pt);
  }
  return r;
}

std::string Block(const std::string& gp, const std::string& name) {
  const std::string start = "$" + name + " << EOD\n";
  const std::size_t from = gp.find(start);
  REQUIRE(from != std::string::npos);
  const std::size_t end = gp.find("EOD\n", from + start.size());
  return gp.substr(from + start.size(), end - from - start.size());
}

TEST_CASE(
    "the SNR sheet holds the points, SNR = 1, the NEP and the saturation "
    "power") {
  Stage stage;
  stage.name = kHostile;
  TiaSnrPlotOptions options;
  options.output_path = "/tmp/x.png";
  const std::string gp = BuildTiaSnrPlotScript(stage, Curve(), options);
  CHECK(Block(gp, "snr") == "1e-12 0.05\n1e-10 5\n1e-08 500\n");
  CHECK(Block(gp, "saturated") == "1e-06 50000\n");
  CHECK(Block(gp, "nep") == "2e-11 1\n");
  CHECK(gp.find("set logscale x\nset logscale y\n") != std::string::npos);
  CHECK(gp.find("set arrow 1 from graph 0, first 1 to graph 1, first 1") !=
        std::string::npos);
  CHECK(gp.find("set arrow 2 from first 5e-07, graph 0 to first 5e-07") !=
        std::string::npos);
  // The name reaches gnuplot only as an escaped literal.
  CHECK(gp.find(GnuplotString(kHostile)) != std::string::npos);
  CHECK(gp.find("system(\"touch") == std::string::npos);
  CHECK(gp.find("`id`") == std::string::npos);
}

}  // namespace
}  // namespace hushgain
