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

}  // namespace hushgain
