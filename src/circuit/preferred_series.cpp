#include "circuit/preferred_series.h"

#include <array>
#include <cassert>
#include <cmath>

namespace hushgain {
namespace {

// IEC 60063 (2nd ed. 1963), the tables of preferred values, in hundredths.
constexpr std::array<int, 6> kE6 = {100, 150, 220, 330, 470, 680};
constexpr std::array<int, 12> kE12 = {100, 120, 150, 180, 220, 270,
                                      330, 390, 470, 560, 680, 820};
constexpr std::array<int, 24> kE24 = {100, 110, 120, 130, 150, 160, 180, 200,
                                      220, 240, 270, 300, 330, 360, 390, 430,
                                      470, 510, 560, 620, 680, 750, 820, 910};
constexpr std::array<int, 48> kE48 = {
    100, 105, 110, 115, 121, 127, 133, 140, 147, 154, 162, 169,
    178, 187, 196, 205, 215, 226, 237, 249, 261, 274, 287, 301,
    316, 332, 348, 365, 383, 402, 422, 442, 464, 487, 511, 536,
    562, 590, 619, 649, 681, 715, 750, 787, 825, 866, 909, 953};
constexpr std::array<int, 96> kE96 = {
    100, 102, 105, 107, 110, 113, 115, 118, 121, 124, 127, 130, 133, 137,
    140, 143, 147, 150, 154, 158, 162, 165, 169, 174, 178, 182, 187, 191,
    196, 200, 205, 210, 215, 221, 226, 232, 237, 243, 249, 255, 261, 267,
    274, 280, 287, 294, 301, 309, 316, 324, 332, 340, 348, 357, 365, 374,
    383, 392, 402, 412, 422, 432, 442, 453, 464, 475, 487, 499, 511, 523,
    536, 549, 562, 576, 590, 604, 619, 634, 649, 665, 681, 698, 715, 732,
    750, 768, 787, 806, 825, 845, 866, 887, 909, 931, 953, 976};
constexpr std::array<int, 192> kE192 = {
    100, 101, 102, 104, 105, 106, 107, 109, 110, 111, 113, 114, 115, 117, 118,
    120, 121, 123, 124, 126, 127, 129, 130, 132, 133, 135, 137, 138, 140, 142,
    143, 145, 147, 149, 150, 152, 154, 156, 158, 160, 162, 164, 165, 167, 169,
    172, 174, 176, 178, 180, 182, 184, 187, 189, 191, 193, 196, 198, 200, 203,
    205, 208, 210, 213, 215, 218, 221, 223, 226, 229, 232, 234, 237, 240, 243,
    246, 249, 252, 255, 258, 261, 264, 267, 271, 274, 277, 280, 284, 287, 291,
    294, 298, 301, 305, 309, 312, 316, 320, 324, 328, 332, 336, 340, 344, 348,
    352, 357, 361, 365, 370, 374, 379, 383, 388, 392, 397, 402, 407, 412, 417,
    422, 427, 432, 437, 442, 448, 453, 459, 464, 470, 475, 481, 487, 493, 499,
    505, 511, 517, 523, 530, 536, 542, 549, 556, 562, 569, 576, 583, 590, 597,
    604, 612, 619, 626, 634, 642, 649, 657, 665, 673, 681, 690, 698, 706, 715,
    723, 732, 741, 750, 759, 768, 777, 787, 796, 806, 816, 825, 835, 845, 856,
    866, 876, 887, 898, 909, 920, 931, 942, 953, 965, 976, 988};

// Relative slack on the range ends, so that "100k" written as 1e5 includes
// 100 x 10^3 whatever the rounding of the decade power.
constexpr double kRangeSlack = 1e-9;

}  // namespace

std::string_view SeriesName(PreferredSeries series) {
  switch (series) {
    case PreferredSeries::kE6:
      return "E6";
    case PreferredSeries::kE12:
      return "E12";
    case PreferredSeries::kE24:
      return "E24";
    case PreferredSeries::kE48:
      return "E48";
    case PreferredSeries::kE96:
      return "E96";
    case PreferredSeries::kE192:
      return "E192";
  }
  return "E6";
}

std::vector<std::string> SeriesNames() {
  return {"E6", "E12", "E24", "E48", "E96", "E192"};
}

std::optional<PreferredSeries> SeriesFromName(std::string_view name) {
  for (PreferredSeries s :
       {PreferredSeries::kE6, PreferredSeries::kE12, PreferredSeries::kE24,
        PreferredSeries::kE48, PreferredSeries::kE96, PreferredSeries::kE192}) {
    const std::string_view canonical = SeriesName(s);
    if (name == canonical) return s;
    if (name.size() == canonical.size() && name[0] == 'e' &&
        name.substr(1) == canonical.substr(1))
      return s;
  }
  return std::nullopt;
}

std::span<const int> SeriesHundredths(PreferredSeries series) {
  switch (series) {
    case PreferredSeries::kE6:
      return kE6;
    case PreferredSeries::kE12:
      return kE12;
    case PreferredSeries::kE24:
      return kE24;
    case PreferredSeries::kE48:
      return kE48;
    case PreferredSeries::kE96:
      return kE96;
    case PreferredSeries::kE192:
      return kE192;
  }
  return kE6;
}

std::vector<double> SeriesValuesInRange(PreferredSeries series, double min_ohm,
                                        double max_ohm) {
  assert(min_ohm > 0 && min_ohm <= max_ohm);
  const std::span<const int> decade = SeriesHundredths(series);
  const double lo = min_ohm * (1 - kRangeSlack);
  const double hi = max_ohm * (1 + kRangeSlack);
  std::vector<double> out;
  // Values are hundredths x 10^k: start one decade below min's decade.
  int k = static_cast<int>(std::floor(std::log10(min_ohm))) - 3;
  for (;; ++k) {
    // 10^k as an exact power of ten where it is representable: multiply
    // or divide by an integer power so that 4.7 x 10^3 is 4700 exactly.
    const double scale = k >= 0 ? std::pow(10.0, k) : 1.0 / std::pow(10.0, -k);
    if (decade.front() * scale > hi) break;
    for (int h : decade) {
      const double v = k >= 0 ? h * std::pow(10.0, k) : h / std::pow(10.0, -k);
      if (v >= lo && v <= hi) out.push_back(v);
    }
  }
  return out;
}

}  // namespace hushgain
