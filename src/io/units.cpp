#include "io/units.h"

#include <algorithm>
#include <array>
#include <cctype>
#include <charconv>
#include <cmath>
#include <cstdio>
#include <cstdlib>
#include <limits>
#include <string>
#include <system_error>
#include <vector>

namespace hushgain {
namespace {

struct Prefix {
  std::string_view symbol;
  double scale;
};

// "µ" appears twice: the micro sign U+00B5 and the Greek mu U+03BC.
constexpr std::array<Prefix, 12> kPrefixes = {{
    {"f", 1e-15},
    {"p", 1e-12},
    {"n", 1e-9},
    {"u", 1e-6},
    {"\xC2\xB5", 1e-6},
    {"\xCE\xBC", 1e-6},
    {"m", 1e-3},
    {"k", 1e3},
    {"M", 1e6},
    {"G", 1e9},
    {"T", 1e12},
    {"", 1.0},
}};

std::vector<std::string_view> UnitSymbols(Quantity quantity) {
  switch (quantity) {
    case Quantity::kResistance:
      return {"Ohm", "ohm", "Ohms", "ohms", "\xCE\xA9", "\xE2\x84\xA6"};
    case Quantity::kCapacitance:
      return {"F"};
    case Quantity::kFrequency:
      return {"Hz"};
    case Quantity::kVoltage:
      return {"V"};
    case Quantity::kCurrent:
      return {"A"};
    case Quantity::kVoltageDensity:
      return {"V/rtHz", "V/sqrtHz", "V/sqrt(Hz)", "V/\xE2\x88\x9AHz"};
    case Quantity::kCurrentDensity:
      return {"A/rtHz", "A/sqrtHz", "A/sqrt(Hz)", "A/\xE2\x88\x9AHz"};
    case Quantity::kGain:
      return {"V/V"};
    case Quantity::kVoltageDrift:
      return {"V/K", "V/C",
              "V/\xC2\xB0"
              "C"};
    case Quantity::kTemperature:
      return {"C",
              "\xC2\xB0"
              "C"};
    case Quantity::kResponsivity:
      return {"A/W"};
    case Quantity::kRatio:
      return {};
    case Quantity::kPower:
      return {"W"};
    case Quantity::kCharge:
      return {"C"};
  }
  return {};
}

std::string_view Trim(std::string_view s) {
  while (!s.empty() && (s.front() == ' ' || s.front() == '\t'))
    s.remove_prefix(1);
  while (!s.empty() && (s.back() == ' ' || s.back() == '\t'))
    s.remove_suffix(1);
  return s;
}

bool StartsWithDigitOrSign(std::string_view s) {
  return !s.empty() && (std::isdigit(static_cast<unsigned char>(s[0])) ||
                        s[0] == '+' || s[0] == '-' || s[0] == '.');
}

// std::from_chars on a decimal number: never the locale's decimal point
// (strtod would read "4,7" under a German LC_NUMERIC), no hex, no leading
// space. An optional "+" is skipped (from_chars takes only "-"). A number
// beyond the range of a double reads as +-infinity (refused later as not
// finite) and one below it as 0, as strtod gives them. Returns the count
// of characters used, 0 when no number starts the text.
std::size_t ReadDecimal(std::string_view text, double* number) {
  std::size_t skip = 0;
  if (!text.empty() && text[0] == '+') {
    if (text.size() < 2 || text[1] == '-' || text[1] == '+') return 0;
    skip = 1;
  }
  const char* first = text.data() + skip;
  const char* last = text.data() + text.size();
  const std::from_chars_result r =
      std::from_chars(first, last, *number, std::chars_format::general);
  if (r.ptr == first) return 0;
  if (r.ec == std::errc::result_out_of_range) {
    // The decimal exponent decides: digits before the point (leading zeros
    // dropped) plus the written exponent.
    const std::string_view span(first, r.ptr - first);
    const bool negative = span[0] == '-';
    const std::size_t e = span.find_first_of("eE");
    const std::string_view mantissa = span.substr(0, e);
    long exponent = 0;
    if (e != std::string_view::npos) {
      std::string_view digits = span.substr(e + 1);
      if (!digits.empty() && digits[0] == '+') digits.remove_prefix(1);
      const auto er = std::from_chars(digits.data(),
                                      digits.data() + digits.size(), exponent);
      if (er.ec == std::errc::result_out_of_range)
        exponent = digits[0] == '-' ? -100000 : 100000;
    }
    long leading = 0;  // digits before the point, or -zeros after it
    const std::size_t point = mantissa.find('.');
    const std::string_view whole =
        mantissa.substr(negative ? 1 : 0, point == std::string_view::npos
                                              ? std::string_view::npos
                                              : point - (negative ? 1 : 0));
    const std::size_t nonzero = whole.find_first_not_of('0');
    if (nonzero != std::string_view::npos) {
      leading = static_cast<long>(whole.size() - nonzero);
    } else if (point != std::string_view::npos) {
      const std::string_view fraction = mantissa.substr(point + 1);
      const std::size_t first_digit = fraction.find_first_not_of('0');
      leading = -static_cast<long>(first_digit == std::string_view::npos
                                       ? fraction.size()
                                       : first_digit);
    }
    const double magnitude =
        exponent + leading > 0 ? std::numeric_limits<double>::infinity() : 0.0;
    *number = negative ? -magnitude : magnitude;
  }
  return skip + static_cast<std::size_t>(r.ptr - first);
}

// Splits "12.4k Ohm" into the number 12.4 and the suffix "k Ohm".
// Returns false when no number starts the text.
bool SplitNumber(std::string_view text, double* number,
                 std::string_view* suffix) {
  if (!StartsWithDigitOrSign(text)) return false;
  // A hex float is no quantity ("0x1p3"): refused as no number.
  if (text.find("0x") != std::string_view::npos ||
      text.find("0X") != std::string_view::npos)
    return false;
  // "-inf" and "-nan" read as numbers and are refused later as not finite.
  const std::size_t used = ReadDecimal(text, number);
  if (used == 0) return false;
  *suffix = text.substr(used);
  return true;
}

// IEC 60062 letter code: digits, one of R k M G T (or m) in place of the
// decimal point, digits: "4k7", "2R2", "1M0". Returns nullopt when `text`
// is not of that form.
std::optional<double> ParseLetterCode(std::string_view text) {
  std::size_t pos = 0;
  while (pos < text.size() &&
         std::isdigit(static_cast<unsigned char>(text[pos])))
    ++pos;
  if (pos == 0 || pos + 1 >= text.size()) return std::nullopt;
  double scale = 0;
  switch (text[pos]) {
    case 'R':
      scale = 1;
      break;
    case 'k':
      scale = 1e3;
      break;
    case 'K':
      scale = 1e3;
      break;
    case 'M':
      scale = 1e6;
      break;
    case 'G':
      scale = 1e9;
      break;
    case 'T':
      scale = 1e12;
      break;
    default:
      return std::nullopt;
  }
  std::string_view fraction = text.substr(pos + 1);
  for (char c : fraction)
    if (!std::isdigit(static_cast<unsigned char>(c))) return std::nullopt;
  std::string joined =
      std::string(text.substr(0, pos)) + "." + std::string(fraction);
  double value = 0;
  ReadDecimal(joined, &value);
  return value * scale;
}

std::optional<double> Fail(std::string* why, std::string reason) {
  if (why) *why = std::move(reason);
  return std::nullopt;
}

std::string FormatWith(double value, std::string_view unit, int digits,
                       bool ascii) {
  if (value == 0) return "0 " + std::string(unit);
  if (!std::isfinite(value))
    return std::string(value > 0 ? "inf " : "-inf ") + std::string(unit);
  if (digits < 1) digits = 1;
  // Round to the significant digits first, so 9.99996e6 becomes 10.00e6
  // and takes the next prefix when it must.
  char buf[64];
  std::snprintf(buf, sizeof buf, "%.*e", digits - 1, value);
  double rounded = 0;
  ReadDecimal(buf, &rounded);
  int exponent3 =
      static_cast<int>(std::floor(std::log10(std::fabs(rounded)) / 3.0)) * 3;
  const double mantissa = rounded / std::pow(10.0, exponent3);
  const double m = std::fabs(mantissa);
  const int int_digits = m >= 99.95 ? 3 : m >= 9.995 ? 2 : 1;
  std::snprintf(buf, sizeof buf, "%.*f", std::max(0, digits - int_digits),
                mantissa);
  if (exponent3 < -15 || exponent3 > 12) {
    std::snprintf(buf, sizeof buf, "%.*e", digits - 1, value);
    return std::string(buf) + " " + std::string(unit);
  }
  std::string_view prefix;
  switch (exponent3) {
    case -15:
      prefix = "f";
      break;
    case -12:
      prefix = "p";
      break;
    case -9:
      prefix = "n";
      break;
    case -6:
      prefix = ascii ? "u" : "\xC2\xB5";
      break;
    case -3:
      prefix = "m";
      break;
    case 0:
      prefix = "";
      break;
    case 3:
      prefix = "k";
      break;
    case 6:
      prefix = "M";
      break;
    case 9:
      prefix = "G";
      break;
    case 12:
      prefix = "T";
      break;
  }
  return std::string(buf) + " " + std::string(prefix) + std::string(unit);
}

}  // namespace

std::string_view QuantityName(Quantity quantity) {
  switch (quantity) {
    case Quantity::kResistance:
      return "a resistance";
    case Quantity::kCapacitance:
      return "a capacitance";
    case Quantity::kFrequency:
      return "a frequency";
    case Quantity::kVoltage:
      return "a voltage";
    case Quantity::kCurrent:
      return "a current";
    case Quantity::kVoltageDensity:
      return "a voltage noise density";
    case Quantity::kCurrentDensity:
      return "a current noise density";
    case Quantity::kGain:
      return "a gain";
    case Quantity::kVoltageDrift:
      return "a voltage drift";
    case Quantity::kTemperature:
      return "a temperature";
    case Quantity::kResponsivity:
      return "a responsivity";
    case Quantity::kRatio:
      return "a ratio";
    case Quantity::kPower:
      return "a power";
    case Quantity::kCharge:
      return "a charge";
  }
  return "a value";
}

std::optional<double> ParseQuantity(std::string_view text, Quantity quantity,
                                    std::string* why) {
  std::string_view trimmed = Trim(text);
  if (trimmed.empty()) return Fail(why, "empty value");

  if (quantity == Quantity::kResistance) {
    if (auto coded = ParseLetterCode(trimmed)) {
      // 400 digits before the "R" overflow to infinity.
      if (!std::isfinite(*coded)) return Fail(why, "out of range");
      return coded;
    }
  }

  double number = 0;
  std::string_view suffix;
  if (!SplitNumber(trimmed, &number, &suffix)) return Fail(why, "no number");
  if (!std::isfinite(number)) return Fail(why, "not a finite number");
  suffix = Trim(suffix);

  if (quantity == Quantity::kGain && suffix == "dB") {
    double ratio = std::pow(10.0, number / 20.0);
    if (!std::isfinite(ratio)) return Fail(why, "gain out of range");
    return ratio;
  }
  if (quantity == Quantity::kRatio) {
    if (suffix.empty()) return number;
    if (suffix == "%") return number * 1e-2;
    if (suffix == "ppm") return number * 1e-6;
    return Fail(why, "unknown unit \"" + std::string(suffix) + "\"");
  }
  if (quantity == Quantity::kTemperature) {
    for (std::string_view unit : UnitSymbols(quantity))
      if (suffix.empty() || suffix == unit) return number;
    return Fail(why, "unknown unit \"" + std::string(suffix) + "\"");
  }

  for (const Prefix& prefix : kPrefixes) {
    if (suffix.substr(0, prefix.symbol.size()) != prefix.symbol) continue;
    std::string_view rest = Trim(suffix.substr(prefix.symbol.size()));
    bool unit_ok = rest.empty();
    for (std::string_view unit : UnitSymbols(quantity))
      if (rest == unit) unit_ok = true;
    // A bare unit symbol without a prefix must not be read as a prefix:
    // "1 m" is milli, "1 F" is one farad. Prefix "" is tried last.
    if (!unit_ok) continue;
    // "2 mOhm" vs "2 m": both milli; an empty suffix after a prefix is fine.
    double value = number * prefix.scale;
    if (!std::isfinite(value)) return Fail(why, "out of range");
    return value;
  }
  return Fail(why, "unknown unit \"" + std::string(suffix) + "\"");
}

std::string FormatEng(double value, std::string_view unit, int digits) {
  return FormatWith(value, unit, digits, /*ascii=*/false);
}

std::string FormatEngAscii(double value, std::string_view unit, int digits) {
  return FormatWith(value, unit, digits, /*ascii=*/true);
}

int DisplayWidth(std::string_view text) {
  int width = 0;
  for (unsigned char c : text)
    if ((c & 0xC0) != 0x80) ++width;
  return width;
}

}  // namespace hushgain
