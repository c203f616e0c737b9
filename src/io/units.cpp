#include "io/units.h"

#include <algorithm>
#include <array>
#include <cmath>
#include <cstdio>
#include <cstdlib>
#include <string>
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

// Splits "12.4k Ohm" into the number 12.4 and the suffix "k Ohm".
// Returns false when no number starts the text.
bool SplitNumber(std::string_view text, double* number,
                 std::string_view* suffix) {
  if (!StartsWithDigitOrSign(text)) return false;
  // strtod needs a terminated copy; the text is short.
  std::string copy(text);
  // strtod accepts "inf", "nan" and hex floats: refuse those by hand.
  for (char c : copy) {
    if (c == 'x' || c == 'X') {
      if (copy.find("0x") != std::string::npos ||
          copy.find("0X") != std::string::npos)
        return false;
    }
  }
  char* end = nullptr;
  *number = std::strtod(copy.c_str(), &end);
  if (end == copy.c_str()) return false;
  std::size_t used = static_cast<std::size_t>(end - copy.c_str());
  // strtod takes the "e" of an exponent; "4.7e" or "1E" without digits is not
  // an exponent but would be eaten by some libcs: it never is by glibc.
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
  return std::strtod(joined.c_str(), nullptr) * scale;
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
  const double rounded = std::strtod(buf, nullptr);
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
