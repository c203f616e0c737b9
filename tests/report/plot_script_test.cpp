#include "report/plot_script.h"

#include <doctest/doctest.h>

#include <cstdio>
#include <sstream>
#include <string>
#include <vector>

#include "report/csv_report.h"
#include "report/text_escape.h"

namespace hushgain {
namespace {

// A small budget and its samples, built by hand: two contributors, a band
// of 10 Hz .. 1 kHz, a -3 dB bandwidth of 5 kHz.
Budget SmallBudget() {
  Budget b;
  b.stage_name = "bench stage";
  b.temperature_k = 298.15;
  b.band_low_hz = 10;
  b.band_high_hz = 1e3;
  b.reference_hz = 100;
  b.bandwidth_3db_hz = 5e3;
  b.signal_gain_dc = -100;
  b.output_rms_v = 5e-6;
  b.loop.crossover_found = true;
  b.loop.crossover_hz = 6e3;
  b.loop.phase_margin_deg = 80;
  Contributor big;
  big.name = "R_in";
  big.output_rms_v = 4e-6;
  big.share = 0.64;
  Contributor small;
  small.name = "e_n";
  small.output_rms_v = 3e-6;
  small.share = 0.36;
  b.contributors = {big, small};
  return b;
}

PlotData SmallData() {
  PlotData d;
  SpectrumSamples& s = d.samples;
  s.f_hz = {1, 10, 100, 1e3, 1e4, 5e4};
  // Evaluator order differs from the budget's (largest share first).
  s.names = {"e_n", "R_in"};
  s.kinds = {NoiseKind::kOpAmpVoltage, NoiseKind::kThermal};
  s.density_v_per_rthz = {{3e-8, 3e-8, 3e-8, 3e-8, 1e-8, 1e-9},
                          {4e-8, 4e-8, 4e-8, 4e-8, 2e-8, 2e-9}};
  s.total_v_per_rthz = {5e-8, 5e-8, 5e-8, 5e-8, 2.2e-8, 2.2e-9};
  s.signal_gain_abs = {100, 100, 100, 100, 50, 10};
  s.noise_gain_abs = {101, 101, 101, 101, 50, 10};
  s.loop_gain_abs = {1e4, 1e4, 1e3, 1e2, 1, 0.1};
  d.cumulative_f_hz = {10, 100, 1e3};
  d.cumulative_rms_v = {0, 3e-6, 5e-6};
  return d;
}

int CountLines(const std::string& text, const std::string& start) {
  std::istringstream in(text);
  std::string line;
  int n = 0;
  while (std::getline(in, line)) n += line.rfind(start, 0) == 0;
  return n;
}

TEST_CASE("the plot range spans a decade around the band and the bandwidth") {
  const auto [lo, hi] = PlotFrequencyRangeHz(SmallBudget());
  CHECK(lo == doctest::Approx(1.0));
  CHECK(hi == doctest::Approx(5e4));  // 10 x the 5 kHz bandwidth
}

TEST_CASE("the plot script draws three panels from inline data") {
  PlotScriptOptions options;
  options.format = PlotFormat::kSvg;
  options.output_path = "/tmp/out.svg.tmp-1";
  const std::string gp = BuildPlotScript(SmallBudget(), SmallData(), options);
  CHECK(gp.rfind("set terminal svg ", 0) == 0);
  CHECK(gp.find("noenhanced") != std::string::npos);
  // The output path as an escaped literal: "/" is \057, "." \056, "-" \055,
  // digits are escaped too.
  CHECK(gp.find("set output \"\\057tmp\\057out\\056svg\\056tmp\\055\\061\"") !=
        std::string::npos);
  CHECK(CountLines(gp, "plot ") == 3);
  // The datablock: one line per frequency; columns f, R_in, e_n (budget
  // order), total, signal, noise and loop gain.
  const std::size_t start = gp.find("$samples << EOD\n");
  REQUIRE(start != std::string::npos);
  const std::size_t end = gp.find("EOD\n", start + 16);
  const std::string block = gp.substr(start + 16, end - start - 16);
  CHECK(CountLines(block, "") == 6);
  CHECK(block.rfind("1 4e-08 3e-08 5e-08 100 101 10000\n", 0) == 0);
  // Both band edges are drawn, and the legend names each contributor with
  // its rms and share.
  CHECK(gp.find("set arrow from first 10, graph 0 to first 10, graph 1") !=
        std::string::npos);
  CHECK(gp.find("set arrow from first 1000, graph 0 to first 1000, graph 1") !=
        std::string::npos);
  // (GnuplotString itself is checked in text_escape_test.cpp.)
  CHECK(gp.find("title " + GnuplotString("R_in  4.000 \xC2\xB5V, 64.0 %")) !=
        std::string::npos);
  CHECK(gp.find("title " + GnuplotString("e_n  3.000 \xC2\xB5V, 36.0 %")) !=
        std::string::npos);
  CHECK(gp.find("unset multiplot") != std::string::npos);
}

TEST_CASE("--only panels give one plot each") {
  for (PlotPanel p :
       {PlotPanel::kSpectrum, PlotPanel::kCumulative, PlotPanel::kGain}) {
    PlotScriptOptions options;
    options.output_path = "x.png";
    options.panels = {p};
    const std::string gp = BuildPlotScript(SmallBudget(), SmallData(), options);
    CHECK(gp.rfind("set terminal pngcairo ", 0) == 0);
    CHECK(CountLines(gp, "plot ") == 1);
  }
}

// SmallBudget with a chain: a 2nd-order Butterworth at 2 kHz into a
// 16-bit converter sampling at 10 kHz, the count stopped at 1 MHz.
Budget ChainBudget() {
  Budget b = SmallBudget();
  ChainBlock c;
  ChainFilter f;
  f.kind = ChainFilter::Kind::kButterworth;
  f.order = 2;
  f.cutoff_hz = 2e3;
  c.chain.filter = f;
  c.chain.adc.bits = 16;
  c.chain.adc.full_scale_v = 4;
  c.chain.adc.sample_rate_hz = 1e4;
  c.nyquist_hz = 5e3;
  c.counted_to_hz = 1e6;
  c.analog_rms_v = 6e-6;
  c.adc.own_noise_rms_v = 3e-6;
  c.adc.quantization_rms_v = 4e-6;
  b.chain = c;
  return b;
}

PlotData ChainData() {
  PlotData d = SmallData();
  d.chain_f_hz = {10, 1e3, 1e4, 1e5, 1e6};
  d.chain_cumulative_rms_v = {0, 4e-6, 5.9e-6, 6e-6, 6e-6};
  d.chain_filter_db = {0, -0.1, -24, -64, -104};
  return d;
}

TEST_CASE("a budget with a chain gets a fourth panel of its own") {
  CHECK(DefaultPlotPanels(SmallBudget()).size() == 3);
  const std::vector<PlotPanel> panels = DefaultPlotPanels(ChainBudget());
  REQUIRE(panels.size() == 4);
  CHECK(panels.back() == PlotPanel::kChain);
  PlotScriptOptions options;
  options.output_path = "x.svg";
  options.format = PlotFormat::kSvg;
  options.panels = panels;
  const std::string gp = BuildPlotScript(ChainBudget(), ChainData(), options);
  CHECK(CountLines(gp, "plot ") == 4);
  // One datablock line per chain point: f, cumulative rms, |H| in dB.
  const std::size_t start = gp.find("$chain << EOD\n");
  REQUIRE(start != std::string::npos);
  const std::size_t end = gp.find("EOD\n", start + 14);
  const std::string block = gp.substr(start + 14, end - start - 14);
  CHECK(CountLines(block, "") == 5);
  CHECK(block.rfind("10 0 0\n", 0) == 0);
  // Its own frequency span, the band's low edge to where the count stopped.
  CHECK(gp.find("set xrange [10:1000000]") != std::string::npos);
  // The converter's own noise with quantization, sqrt(3^2 + 4^2) = 5 uV,
  // as a level; Nyquist and the cutoff named in the legend; the filter's
  // response on the right axis.
  CHECK(gp.find("title " + GnuplotString("converter + q/\xE2\x88\x9A"
                                         "12 (5.000 \xC2\xB5V)")) !=
        std::string::npos);
  CHECK(gp.find(GnuplotString("Nyquist 5.000 kHz")) != std::string::npos);
  CHECK(gp.find(GnuplotString("filter -3 dB at 2.000 kHz")) !=
        std::string::npos);
  CHECK(gp.find("$chain using 1:3 axes x1y2") != std::string::npos);
  CHECK(gp.find("set y2range [-120:20]") != std::string::npos);
}

TEST_CASE("a pdf sheet has the png's proportions on a page of points") {
  PlotScriptOptions png, pdf;
  png.output_path = "x.png";
  pdf.output_path = "x.pdf";
  pdf.format = PlotFormat::kPdf;
  const std::string a = BuildPlotScript(SmallBudget(), SmallData(), png);
  const std::string b = BuildPlotScript(SmallBudget(), SmallData(), pdf);
  // "set terminal pngcairo size W,H" against "pdfcairo size W/72in,H/72in".
  int w = 0, h = 0;
  REQUIRE(std::sscanf(a.c_str(), "set terminal pngcairo size %d,%d", &w, &h) ==
          2);
  double w_in = 0, h_in = 0;
  REQUIRE(std::sscanf(b.c_str(), "set terminal pdfcairo size %lfin,%lfin",
                      &w_in, &h_in) == 2);
  CHECK(b.find("in fontscale 1 linewidth 2 font ") != std::string::npos);
  CHECK(w_in == doctest::Approx(w / 72.0).epsilon(1e-8));
  CHECK(h_in == doctest::Approx(h / 72.0).epsilon(1e-8));
  // Everything after the terminal and output lines is the same script.
  const auto body = [](const std::string& gp) {
    return gp.substr(gp.find("\n", gp.find("set output")) + 1);
  };
  CHECK(body(a) == body(b));
}

TEST_CASE("every panel draws major and minor grid lines") {
  PlotScriptOptions options;
  options.output_path = "x.png";
  const std::string gp = BuildPlotScript(SmallBudget(), SmallData(), options);
  // One grid per panel, minor lines (the unlabelled level-1 tics at 2..9
  // times each decade) lighter than the major ones.
  CHECK(CountLines(gp,
                   "set grid xtics ytics mxtics mytics lt 1 lc rgb "
                   "'#d8d8d8' lw 1, lt 1 lc rgb '#eeeeee' lw 1") == 3);
  CHECK(gp.find("\"\" 2 1") != std::string::npos);
}

TEST_CASE("the spectrum csv lists contributors in the budget's order") {
  const std::string csv = SpectrumToCsv(SmallBudget(), SmallData().samples);
  CHECK(csv.rfind("f_Hz,R_in_V_per_rtHz,e_n_V_per_rtHz,total_V_per_rtHz,"
                  "signal_gain_V_per_V,noise_gain_V_per_V,loop_gain_V_per_V"
                  "\r\n1,4e-08,3e-08,5e-08,100,101,10000\r\n",
                  0) == 0);
}

}  // namespace
}  // namespace hushgain
