#include "report/plot_script.h"

#include <algorithm>
#include <cassert>
#include <cmath>
#include <cstdio>

#include "base/physical_constants.h"
#include "base/printf.h"
#include "io/units.h"
#include "report/plot_axes.h"
#include "report/text_escape.h"

namespace hushgain {
namespace {

std::string LogNum(double v) { return PlotLogNumber(v); }
std::string Short(double v, const std::string& unit) {
  return ShortEng(v, unit);
}

// Sheet geometry in pixels. The legend column on the right holds names
// with their rms and share; the left margin holds tic labels with units.
constexpr int kWidthPx = SheetLayout{}.width_px;
constexpr int kLeftPx = 150;
constexpr int kLegendPx = 440;
// Room between the plot and the legend for the dB axis of the gain panel.
constexpr int kKeyGapPx = 95;
constexpr int kHeadingPx = 90;
constexpr int kPanelTopPx = 60;     // panel title and band-edge labels
constexpr int kPanelBottomPx = 75;  // tic labels and axis label

int PlotHeightPx(PlotPanel panel) {
  switch (panel) {
    case PlotPanel::kSpectrum:
      return 520;
    case PlotPanel::kCumulative:
      return 300;
    case PlotPanel::kGain:
      return 360;
    case PlotPanel::kChain:
      return 360;
  }
  return 300;
}

// Our own colours, chosen to stay apart on white and in grey print; past
// the tenth contributor the dash pattern changes.
constexpr const char* kColours[] = {"#1f5fa8", "#d1495b", "#2e933c", "#e09f1f",
                                    "#7b4b94", "#00a0a0", "#9c6644", "#c44f9b",
                                    "#5c6b73", "#8ab833"};
constexpr int kColourCount = sizeof kColours / sizeof kColours[0];
constexpr const char* kBandShade = "#e4e4e4";
constexpr const char* kEdgeColour = "#444444";

// 0.5, 20, 5000, then 1e4, 2e5: short enough for a tic.
std::string GainLabel(double value) {
  if (value >= 1 && value < 1e4) return Printf("%.0f", value);
  if (value < 1 && value >= 1e-3) return Printf("%g", value);
  std::string s = Printf("%.0e", value);  // "2e+05"
  const std::size_t e = s.find('e');
  std::string exponent = s.substr(e + 1);
  const bool negative = exponent[0] == '-';
  exponent.erase(0, 1);
  while (exponent.size() > 1 && exponent[0] == '0') exponent.erase(0, 1);
  return s.substr(0, e) + "e" + (negative ? "-" : "") + exponent;
}

int FloorDecade(double v) {
  return static_cast<int>(std::floor(std::log10(v)));
}
int CeilDecade(double v) { return static_cast<int>(std::ceil(std::log10(v))); }

struct Frame {
  double top = 0, bottom = 0;  // screen fractions of the plot area
};

class ScriptWriter {
 public:
  ScriptWriter(const Budget& b, const PlotData& d, const PlotScriptOptions& o)
      : b_(b), d_(d), o_(o) {
    for (const Contributor& c : b.contributors)
      if (int k = d.samples.Find(c.name); k >= 0) order_.push_back(k);
    for (std::size_t k = 0; k < d.samples.names.size(); ++k)
      if (std::find(order_.begin(), order_.end(), static_cast<int>(k)) ==
          order_.end())
        order_.push_back(static_cast<int>(k));
    const auto range = PlotFrequencyRangeHz(b);
    f_min_ = range.first;
    f_max_ = range.second;
    height_px_ = kHeadingPx;
    for (PlotPanel p : o.panels)
      height_px_ += kPanelTopPx + PlotHeightPx(p) + kPanelBottomPx;
  }

  std::string Write() {
    Terminal();
    Data();
    out_ += "set multiplot\n";
    Heading();
    int y_px = kHeadingPx;
    bool first = true;
    for (PlotPanel p : o_.panels) {
      Frame f;
      f.top = 1.0 - static_cast<double>(y_px + kPanelTopPx) / height_px_;
      f.bottom =
          1.0 - static_cast<double>(y_px + kPanelTopPx + PlotHeightPx(p)) /
                    height_px_;
      y_px += kPanelTopPx + PlotHeightPx(p) + kPanelBottomPx;
      Reset(f);
      switch (p) {
        case PlotPanel::kSpectrum:
          Spectrum(f);
          break;
        case PlotPanel::kCumulative:
          Cumulative(f);
          break;
        case PlotPanel::kGain:
          Gain(f);
          break;
        case PlotPanel::kChain:
          Chain(f);
          break;
      }
      if (first) out_ += "unset label 1\nunset label 2\n";
      first = false;
    }
    out_ += "unset multiplot\nset output\n";
    return out_;
  }

 private:
  void Terminal() {
    out_ += TerminalCommands(o_.format, kWidthPx, height_px_, o_.output_path);
  }

  // Datablocks hold numbers only. $samples: f, one column per contributor
  // (budget order), total, |signal gain|, |noise gain|, |loop gain|.
  void Data() {
    const SpectrumSamples& s = d_.samples;
    out_ += "$samples << EOD\n";
    for (std::size_t i = 0; i < s.f_hz.size(); ++i) {
      out_ += PlotNumber(s.f_hz[i]);
      for (int k : order_) out_ += " " + LogNum(s.density_v_per_rthz[k][i]);
      out_ += " " + LogNum(s.total_v_per_rthz[i]) + " " +
              LogNum(s.signal_gain_abs[i]) + " " + LogNum(s.noise_gain_abs[i]) +
              " " + LogNum(s.loop_gain_abs[i]) + "\n";
    }
    out_ += "EOD\n";
    out_ += "$cumulative << EOD\n";
    for (std::size_t i = 0; i < d_.cumulative_f_hz.size(); ++i)
      out_ += PlotNumber(d_.cumulative_f_hz[i]) + " " +
              PlotNumber(d_.cumulative_rms_v[i]) + "\n";
    out_ += "EOD\n";
    // The band total (from the band integral) as a level across the band.
    const double total = b_.output_rms_v;
    out_ += "$band_total << EOD\n" + PlotNumber(b_.band_low_hz) + " " +
            PlotNumber(total) + "\n" + PlotNumber(b_.band_high_hz) + " " +
            PlotNumber(total) + "\nEOD\n";
    if (!d_.chain_f_hz.empty()) {
      out_ += "$chain << EOD\n";
      for (std::size_t i = 0; i < d_.chain_f_hz.size(); ++i)
        out_ += PlotNumber(d_.chain_f_hz[i]) + " " +
                PlotNumber(d_.chain_cumulative_rms_v[i]) + " " +
                PlotNumber(d_.chain_filter_db[i]) + "\n";
      out_ += "EOD\n";
    }
  }

  void Heading() {
    const std::string summary =
        Printf("%.2f", b_.temperature_k - kZeroCelsiusK) +
        " \xC2\xB0"
        "C, band " +
        FormatEng(b_.band_low_hz, "Hz") + " to " +
        FormatEng(b_.band_high_hz, "Hz") +
        (b_.charge ? ", charge gain " +
                         Printf("%.4g", b_.charge->charge_gain_v_per_c * 1e-9) +
                         " mV/pC in the passband"
         : b_.input_unit == "A"
             ? ", transimpedance " + FormatEng(b_.signal_gain_dc, "\xCE\xA9") +
                   " at DC"
             : ", signal gain " + Printf("%.4g", b_.signal_gain_dc) +
                   " V/V at DC") +
        ";  output " + FormatEng(b_.output_rms_v, "V") + " rms (" +
        FormatEng(b_.output_peak_to_peak_v, "V") + " p-p), input-referred " +
        FormatEng(b_.input_rms, b_.input_unit) + " rms";
    out_ += "set label 1 " + GnuplotString(b_.stage_name) +
            " at screen 0.5, screen " + PlotNumber(1.0 - 32.0 / height_px_) +
            " center font ',16'\n";
    out_ += "set label 2 " + GnuplotString(summary) +
            " at screen 0.5, screen " + PlotNumber(1.0 - 64.0 / height_px_) +
            " center\n";
  }

  void Reset(const Frame& f) {
    out_ +=
        "unset object\nunset arrow\nunset label 10\nunset label 11\n"
        "unset label 12\nunset label 13\nunset label 14\n"
        "unset logscale\nunset y2tics\nunset y2label\nunset title\n"
        "set ytics auto nomirror\nset xtics auto\n";
    out_ += "set lmargin at screen " + PlotNumber(double(kLeftPx) / kWidthPx) +
            "\n";
    out_ += "set rmargin at screen " +
            PlotNumber(double(kWidthPx - kLegendPx) / kWidthPx) + "\n";
    out_ += "set tmargin at screen " + PlotNumber(f.top) + "\n";
    out_ += "set bmargin at screen " + PlotNumber(f.bottom) + "\n";
    out_ += "set logscale x\n";
    out_ +=
        "set xrange [" + PlotNumber(f_min_) + ":" + PlotNumber(f_max_) + "]\n";
    out_ += LogTicsCommand("x", f_min_, f_max_,
                           [](double v) { return Short(v, "Hz"); });
    out_ += "set xlabel 'frequency (Hz)'\n";
    out_ += GridCommand();
    out_ += "set border 3 lw 1\nset xtics nomirror out\nset ytics out\n";
    // The parts outside the band shaded, the edges drawn and labelled above
    // the plot.
    out_ += "set object 1 rect from graph 0, graph 0 to first " +
            PlotNumber(b_.band_low_hz) + ", graph 1 behind fc rgb '" +
            kBandShade + "' fs solid 1.0 noborder\n";
    out_ += "set object 2 rect from first " + PlotNumber(b_.band_high_hz) +
            ", graph 0 to graph 1, graph 1 behind fc rgb '" + kBandShade +
            "' fs solid 1.0 noborder\n";
    for (double edge : {b_.band_low_hz, b_.band_high_hz})
      out_ += "set arrow from first " + PlotNumber(edge) +
              ", graph 0 to first " + PlotNumber(edge) +
              ", graph 1 nohead dt 2 lw 1.5 lc rgb '" + kEdgeColour +
              "' front\n";
    out_ +=
        "set label 10 " +
        GnuplotString("band " + Short(b_.band_low_hz, "Hz") + " \xE2\x96\xB8") +
        " at first " + PlotNumber(b_.band_low_hz) +
        ", graph 1 right offset 0.4,0.7 tc rgb '" + kEdgeColour + "'\n";
    out_ += "set label 11 " +
            GnuplotString("\xE2\x97\x82 " + Short(b_.band_high_hz, "Hz") +
                          " band") +
            " at first " + PlotNumber(b_.band_high_hz) +
            ", graph 1 left offset -0.4,0.7 tc rgb '" + kEdgeColour + "'\n";
    out_ += "set key at screen " +
            PlotNumber(double(kWidthPx - kLegendPx + kKeyGapPx) / kWidthPx) +
            ", screen " + PlotNumber(f.top) +
            " left top Left reverse samplen 2.5 spacing 1.25 "
            "box lc rgb '#bbbbbb' width -1\n";
  }

  void PanelTitle(const std::string& title) {
    out_ += "set label 12 " + GnuplotString(title) +
            " at graph 0, graph 1 left offset 0,2.2 font ',13'\n";
  }

  void Spectrum(const Frame&) {
    const SpectrumSamples& s = d_.samples;
    double y_max = 0, y_min = HUGE_VAL;
    for (double v : s.total_v_per_rthz) y_max = std::max(y_max, v);
    for (int k : order_)
      for (double v : s.density_v_per_rthz[k])
        if (v > 0) y_min = std::min(y_min, v);
    const int hi = CeilDecade(y_max * 1.05);
    // Five decades below the top are enough to see what matters; smaller
    // contributors leave the plot but keep their legend line.
    const int lo = std::max(FloorDecade(std::min(y_min, y_max)), hi - 4);
    PanelTitle("Output noise density by contributor");
    out_ += "set logscale y\n";
    // The slight padding keeps gnuplot from dropping the end tics.
    out_ += "set yrange [" + PlotNumber(std::pow(10.0, lo) * 0.999) + ":" +
            PlotNumber(std::pow(10.0, hi) * 1.001) + "]\n";
    out_ +=
        LogTicsCommand("y", std::pow(10.0, lo), std::pow(10.0, hi),
                       [](double v) { return Short(v, "V/\xE2\x88\x9AHz"); });
    out_ += "set ylabel 'output noise density (V/\xE2\x88\x9AHz)'\n";
    out_ += "set key title 'in-band output rms, share' left\n";
    std::string plot =
        "plot $samples using 1:" + std::to_string(order_.size() + 2) +
        " with lines lw 3.5 lc rgb '#000000' title " +
        GnuplotString("total  " + FormatEng(b_.output_rms_v, "V") + ", 100 %");
    for (std::size_t j = 0; j < order_.size(); ++j) {
      const std::string& name = s.names[order_[j]];
      std::string legend = name;
      for (const Contributor& c : b_.contributors)
        if (c.name == name)
          legend += "  " + FormatEng(c.output_rms_v, "V") + ", " +
                    (c.share < 0.0005 ? std::string("<0.1 %")
                                      : Printf("%.1f %%", 100.0 * c.share));
      // A curve that lies on an earlier one (the two i_n of a balanced
      // stage) is dashed so both stay visible.
      const int dash =
          SameAsEarlier(j) ? 2 : 1 + static_cast<int>(j) / kColourCount;
      plot += ", \\\n  $samples using 1:" + std::to_string(j + 2) +
              " with lines lw " + (dash == 2 ? "2.5" : "2") + " lc rgb '" +
              kColours[j % kColourCount] + "' dt " + std::to_string(dash) +
              " title " + GnuplotString(legend);
    }
    out_ += plot + "\n";
    out_ += "set key notitle\n";
  }

  // Whether contributor order_[j] is within 1 % of an earlier one at every
  // frequency.
  bool SameAsEarlier(std::size_t j) const {
    const auto& d = d_.samples.density_v_per_rthz;
    for (std::size_t i = 0; i < j; ++i) {
      bool same = true;
      const auto& a = d[order_[i]];
      const auto& b = d[order_[j]];
      for (std::size_t n = 0; n < a.size() && same; ++n)
        same = std::fabs(a[n] - b[n]) <= 0.01 * std::max(a[n], b[n]);
      if (same) return true;
    }
    return false;
  }

  void Cumulative(const Frame&) {
    const auto [scale, unit] = UnitScale(b_.output_rms_v, "V");
    PanelTitle("Cumulative output noise from the low band edge up");
    out_ +=
        "set yrange [0:" + PlotNumber(1.15 * b_.output_rms_v / scale) + "]\n";
    out_ += "set ytics auto\nset format y '%g'\n";
    out_ += "set ylabel " + GnuplotString("output rms (" + unit + ")") + "\n";
    out_ += "plot $cumulative using 1:($2/" + PlotNumber(scale) +
            ") with lines lw 3 lc rgb '" + kColours[0] + "' title " +
            GnuplotString("rms from " + Short(b_.band_low_hz, "Hz") + " to f") +
            ", \\\n  $band_total using 1:($2/" + PlotNumber(scale) +
            ") with lines dt 3 lw 1.5 lc rgb '#000000' title " +
            GnuplotString("band total " + FormatEng(b_.output_rms_v, "V") +
                          " rms") +
            "\n";
    out_ += "set format y '% h'\n";
  }

  // A log range around the curves: a little room above the largest value,
  // at most `decades` below it, and always the unity line when `with_unity`.
  static std::pair<double, double> LogRange(
      const std::vector<const std::vector<double>*>& curves, double decades,
      bool with_unity) {
    double y_max = 0, y_min = HUGE_VAL;
    for (const auto* v : curves)
      for (double x : *v)
        if (x > 0) {
          y_max = std::max(y_max, x);
          y_min = std::min(y_min, x);
        }
    if (!(y_max > 0)) y_max = y_min = 1;
    const double top = y_max * 2.5;
    double bottom = std::max(y_min / 1.5, top * std::pow(10.0, -decades));
    if (with_unity) bottom = std::min(bottom, 0.3);
    return {bottom, top};
  }

  // A vertical marker line; its words go into the legend (a key entry in
  // the same colour and dash), so no text ever crosses a curve.
  std::string Marker(double f, const std::string& text, const char* colour) {
    out_ += "set arrow from first " + PlotNumber(f) + ", graph 0 to first " +
            PlotNumber(f) + ", graph 1 nohead dt 4 lw 1.5 lc rgb '" + colour +
            "' front\n";
    return ", \\\n  keyentry with lines dt 4 lw 1.5 lc rgb '" +
           std::string(colour) + "' title " + GnuplotString(text);
  }

  void Gain(const Frame&) {
    const SpectrumSamples& s = d_.samples;
    // A current source's signal gain is a transimpedance (V/A): it gets the
    // left axis alone, the V/V gains the right one. Otherwise every gain is
    // V/V on the left and the right axis reads the same in dB.
    const bool transimpedance = b_.input_unit == "A";
    std::vector<const std::vector<double>*> ratio_curves = {&s.noise_gain_abs,
                                                            &s.loop_gain_abs};
    if (!transimpedance) ratio_curves.push_back(&s.signal_gain_abs);
    const auto [r_bottom, r_top] = LogRange(ratio_curves, 6, true);
    PanelTitle("Signal gain, e_n noise gain and loop gain (magnitude)");
    out_ += "set logscale y\n";
    const char* ratio_axis = "x1y1";
    if (transimpedance) {
      const auto [z_bottom, z_top] = LogRange({&s.signal_gain_abs}, 4, false);
      out_ += "set yrange [" + PlotNumber(z_bottom) + ":" + PlotNumber(z_top) +
              "]\n";
      out_ += LogTicsCommand("y", z_bottom, z_top,
                             [](double v) { return Short(v, "\xCE\xA9"); });
      out_ += "set ylabel " + GnuplotString("transimpedance (V/A = \xCE\xA9)") +
              "\n";
      out_ += "set logscale y2\n";
      out_ += "set y2range [" + PlotNumber(r_bottom) + ":" + PlotNumber(r_top) +
              "]\n";
      out_ += "set y2tics out\n";
      out_ += LogTicsCommand("y2", r_bottom, r_top, GainLabel);
      out_ += "set y2label 'noise gain, loop gain (V/V)'\n";
      ratio_axis = "x1y2";
    } else {
      out_ += "set yrange [" + PlotNumber(r_bottom) + ":" + PlotNumber(r_top) +
              "]\n";
      out_ += LogTicsCommand("y", r_bottom, r_top, GainLabel);
      out_ += "set ylabel 'gain (V/V)'\n";
      out_ += "set y2range [" + PlotNumber(20.0 * std::log10(r_bottom)) + ":" +
              PlotNumber(20.0 * std::log10(r_top)) + "]\n";
      out_ += "set y2tics 20 out\nset y2label 'dB'\n";
    }
    out_ += "set border 11 lw 1\n";
    // The unity line, where the loop gain crosses over.
    out_ += std::string("set arrow from graph 0, ") +
            (transimpedance ? "second" : "first") + " 1 to graph 1, " +
            (transimpedance ? "second" : "first") +
            " 1 nohead dt 3 lw 1 lc rgb '#888888'\n";

    // The -3 dB bandwidth and the loop crossover, named in the legend.
    const double bw = b_.bandwidth_3db_hz;
    const bool crossover = b_.loop.crossover_found &&
                           b_.loop.crossover_hz > f_min_ &&
                           b_.loop.crossover_hz < f_max_;
    std::string markers;
    if (bw > 0)
      markers += Marker(bw, "-3 dB at " + FormatEng(bw, "Hz"), kColours[1]);
    if (crossover)
      markers += Marker(b_.loop.crossover_hz,
                        "crossover " + FormatEng(b_.loop.crossover_hz, "Hz") +
                            ", PM " + Printf("%.1f", b_.loop.phase_margin_deg) +
                            "\xC2\xB0",
                        kColours[4]);

    const int cols = static_cast<int>(order_.size());
    out_ += "plot $samples using 1:" + std::to_string(cols + 3) +
            " axes x1y1 with lines lw 2.5 lc rgb '" + kColours[0] + "' title " +
            GnuplotString("|signal gain| (" +
                          std::string(transimpedance ? "V/A" : "V/V") + ")") +
            ", \\\n  $samples using 1:" + std::to_string(cols + 4) + " axes " +
            ratio_axis + " with lines lw 2.5 dt 2 lc rgb '" + kColours[2] +
            "' title " + GnuplotString("|e_n noise gain| (V/V)") +
            ", \\\n  $samples using 1:" + std::to_string(cols + 5) + " axes " +
            ratio_axis + " with lines lw 2 dt 5 lc rgb '" + kColours[4] +
            "' title " + GnuplotString("|loop gain| (V/V)") + markers + "\n";
    out_ += "set border 3\nunset logscale y2\n";
  }

  // The chain's own frequency span, from the band's low edge to where its
  // count stopped; the cumulative analog rms at the converter's input (left,
  // linear) with the converter's own noise and quantization as a level, and
  // the filter's response in dB (right).
  void Chain(const Frame&) {
    const ChainBlock& c = *b_.chain;
    // The band's low edge is the panel's left end: no label there.
    out_ += "unset label 10\n";
    const double f_lo = d_.chain_f_hz.front();
    const double f_hi = d_.chain_f_hz.back();
    out_ += "set xrange [" + PlotNumber(f_lo) + ":" + PlotNumber(f_hi) + "]\n";
    out_ += LogTicsCommand("x", f_lo, f_hi,
                           [](double v) { return Short(v, "Hz"); });
    const double converter_rms =
        std::hypot(c.adc.own_noise_rms_v, c.adc.quantization_rms_v);
    const double top = std::max(c.analog_rms_v, converter_rms);
    const auto [scale, unit] = UnitScale(top, "V");
    PanelTitle("Signal chain: noise at the converter's input and the filter");
    out_ += "set yrange [0:" + PlotNumber(1.15 * top / scale) + "]\n";
    out_ += "set ytics auto\nset format y '%g'\n";
    out_ += "set ylabel " +
            GnuplotString("cumulative rms at the ADC input (" + unit + ")") +
            "\n";
    double db_min = 0, db_max = -HUGE_VAL;
    for (double v : d_.chain_filter_db) {
      db_min = std::min(db_min, v);
      db_max = std::max(db_max, v);
    }
    const double y2_top = 20 * std::ceil((db_max + 10) / 20);
    const double y2_bottom =
        std::max(20 * std::floor(db_min / 20), y2_top - 160);
    out_ += "set y2range [" + PlotNumber(y2_bottom) + ":" + PlotNumber(y2_top) +
            "]\n";
    out_ += "set y2tics 20 out\nset y2label 'filter |H| (dB)'\n";
    out_ += "set border 11 lw 1\n";
    std::string markers = Marker(
        c.nyquist_hz, "Nyquist " + FormatEng(c.nyquist_hz, "Hz"), kColours[1]);
    if (c.chain.filter && c.chain.filter->kind != ChainFilter::Kind::kNone)
      markers += Marker(
          c.chain.filter->cutoff_hz,
          "filter -3 dB at " + FormatEng(c.chain.filter->cutoff_hz, "Hz"),
          kColours[2]);
    out_ += "$converter << EOD\n" + PlotNumber(f_lo) + " " +
            PlotNumber(converter_rms) + "\n" + PlotNumber(f_hi) + " " +
            PlotNumber(converter_rms) + "\nEOD\n";
    out_ += "plot $chain using 1:($2/" + PlotNumber(scale) +
            ") axes x1y1 with lines lw 3 lc rgb '" + kColours[0] + "' title " +
            GnuplotString("analog, " + Short(b_.band_low_hz, "Hz") + " to f (" +
                          FormatEng(c.analog_rms_v, "V") + ")") +
            ", \\\n  $converter using 1:($2/" + PlotNumber(scale) +
            ") axes x1y1 with lines dt 3 lw 1.5 lc rgb '#000000' title " +
            GnuplotString(
                "converter + q/\xE2\x88\x9A"
                "12 (" +
                FormatEng(converter_rms, "V") + ")") +
            ", \\\n  $chain using 1:3 axes x1y2 with lines lw 2 dt 2 lc rgb '" +
            kColours[3] + "' title " + GnuplotString("filter |H| (dB)") +
            markers + "\n";
    out_ += "set format y '% h'\nset border 3\n";
  }

  const Budget& b_;
  const PlotData& d_;
  const PlotScriptOptions& o_;
  std::vector<int> order_;
  double f_min_ = 1, f_max_ = 10;
  int height_px_ = 0;
  std::string out_;
};

}  // namespace

std::vector<PlotPanel> DefaultPlotPanels(const Budget& budget) {
  std::vector<PlotPanel> panels = {PlotPanel::kSpectrum, PlotPanel::kCumulative,
                                   PlotPanel::kGain};
  if (budget.chain) panels.push_back(PlotPanel::kChain);
  return panels;
}

std::pair<double, double> PlotFrequencyRangeHz(const Budget& b) {
  const double top = std::max(b.band_high_hz, b.bandwidth_3db_hz);
  return {b.band_low_hz / 10.0, top * 10.0};
}

std::string BuildPlotScript(const Budget& budget, const PlotData& data,
                            const PlotScriptOptions& options) {
  assert(data.samples.f_hz.size() >= 2 && !options.panels.empty());
  assert(data.cumulative_f_hz.size() == data.cumulative_rms_v.size());
  assert(std::all_of(options.panels.begin(), options.panels.end(),
                     [&](PlotPanel p) {
                       return p != PlotPanel::kChain ||
                              (budget.chain && data.chain_f_hz.size() >= 2);
                     }));
  return ScriptWriter(budget, data, options).Write();
}

}  // namespace hushgain
