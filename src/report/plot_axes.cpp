#include "report/plot_axes.h"

#include <cmath>
#include <cstdio>

#include "io/units.h"
#include "report/text_escape.h"

namespace hushgain {

std::string PlotNumber(double v) {
  if (!std::isfinite(v)) return "NaN";
  char buf[40];
  std::snprintf(buf, sizeof buf, "%.9g", v);
  return buf;
}

std::string PlotLogNumber(double v) { return v > 0 ? PlotNumber(v) : "NaN"; }

std::string ShortEng(double value, const std::string& unit) {
  std::string s = FormatEng(value, unit);
  const std::size_t space = s.find(' ');
  std::string number = s.substr(0, space);
  const std::string rest = space == std::string::npos ? "" : s.substr(space);
  if (number.find('.') != std::string::npos &&
      number.find('e') == std::string::npos) {
    while (number.back() == '0') number.pop_back();
    if (number.back() == '.') number.pop_back();
  }
  return number + rest;
}

std::string TerminalCommands(PlotFormat format, int width_px, int height_px,
                             const std::string& output_path) {
  std::string terminal;
  std::string size = std::to_string(width_px) + "," + std::to_string(height_px);
  switch (format) {
    case PlotFormat::kPng:
      terminal = "pngcairo";
      break;
    case PlotFormat::kSvg:
      terminal = "svg";
      break;
    case PlotFormat::kPdf:
      // pdfcairo sizes are in inches: 72 points each, one point per pixel.
      // Its text and lines come out about half as heavy as pngcairo's at
      // the same size (gnuplot 5.4, seen side by side): fontscale 1 and
      // linewidth 2 give the PNG's look.
      terminal = "pdfcairo";
      size = PlotNumber(width_px / 72.0) + "in," +
             PlotNumber(height_px / 72.0) + "in fontscale 1 linewidth 2";
      break;
  }
  return "set terminal " + terminal + " size " + size +
         " font 'DejaVu Sans,11' noenhanced background rgb 'white'\n"
         "set encoding utf8\n"
         "set output " +
         GnuplotString(output_path) + "\n";
}

std::string GridCommand() {
  return "set grid xtics ytics mxtics mytics lt 1 lc rgb '#d8d8d8' lw 1, "
         "lt 1 lc rgb '#eeeeee' lw 1\n";
}

std::string LogTicsCommand(const char* axis, double v_min, double v_max,
                           const std::function<std::string(double)>& label) {
  const double lo_v = v_min * (1 - 1e-9), hi_v = v_max * (1 + 1e-9);
  const int lo = static_cast<int>(std::floor(std::log10(lo_v)));
  const int hi = static_cast<int>(std::ceil(std::log10(hi_v)));
  int decades_inside = 0;
  for (int d = lo; d <= hi; ++d) {
    const double v = std::pow(10.0, d);
    if (v >= lo_v && v <= hi_v) ++decades_inside;
  }
  const bool label_2_5 = decades_inside < 3;
  std::string list;
  for (int d = lo; d <= hi; ++d) {
    const double decade = std::pow(10.0, d);
    for (int m = 1; m <= 9; ++m) {
      const double v = m * decade;
      if (v < lo_v || v > hi_v) continue;
      const bool labelled =
          m == 1 || decades_inside == 0 || (label_2_5 && (m == 2 || m == 5));
      if (!list.empty()) list += ", ";
      list += labelled ? GnuplotString(label(v)) + " " + PlotNumber(v)
                       : "\"\" " + PlotNumber(v) + " 1";
    }
  }
  return std::string("set ") + axis + "tics (" + list + ")\n";
}

std::pair<double, std::string> UnitScale(double max, const std::string& unit) {
  if (!(max > 0)) return {1.0, unit};
  const int exponent3 = 3 * static_cast<int>(std::floor(std::log10(max) / 3.0));
  const double scale = std::pow(10.0, exponent3);
  const std::string s = FormatEng(scale, unit);
  const std::size_t space = s.find(' ');
  return {scale, space == std::string::npos ? unit : s.substr(space + 1)};
}

std::string PanelFrame(const SheetLayout& l, int index, int height_px,
                       const std::string& title, int border) {
  const int top_px = l.heading_px +
                     index * (l.panel_top_px + l.panel_px + l.panel_bottom_px) +
                     l.panel_top_px;
  const double top = 1.0 - static_cast<double>(top_px) / height_px;
  const double bottom =
      1.0 - static_cast<double>(top_px + l.panel_px) / height_px;
  const double width = l.width_px;
  std::string out;
  if (index > 0) out += "unset label 1\nunset label 2\n";
  out +=
      "unset object\nunset arrow\nunset label 12\nunset logscale\n"
      "unset y2tics\nunset y2label\n"
      "set ytics auto nomirror out\nset xtics auto nomirror out\n"
      "set format y '%g'\nset format x '%g'\n";
  out += "set lmargin at screen " + PlotNumber(l.left_px / width) + "\n";
  out += "set rmargin at screen " +
         PlotNumber((l.width_px - l.legend_px) / width) + "\n";
  out += "set tmargin at screen " + PlotNumber(top) + "\n";
  out += "set bmargin at screen " + PlotNumber(bottom) + "\n";
  out += GridCommand();
  out += "set border " + std::to_string(border) + " lw 1\n";
  out += "set key at screen " +
         PlotNumber((l.width_px - l.legend_px + l.key_gap_px) / width) +
         ", screen " + PlotNumber(top) +
         " left top Left reverse samplen 2.5 spacing 1.3 "
         "box lc rgb '#bbbbbb' width -1\n";
  out += "set label 12 " + GnuplotString(title) +
         " at graph 0, graph 1 left offset 0,1.4 font ',13'\n";
  return out;
}

}  // namespace hushgain
