// Quantities at the edge: parsing "4.7n", "2.2 MOhm", "10pF", "4 nV/rtHz",
// "120 dB" into SI doubles, and printing SI doubles in engineering notation.
// Nothing else in hushgain converts units.
//
// Grammar: <number> [space] [SI prefix] [unit symbol]
//   prefixes  f p n u µ m k M G T  (case matters: m is milli, M is mega)
//   units     depend on the kind of quantity (see UnitSymbols); the symbol
//             is optional, a bare prefix ("2.2k") is enough.
//   IEC 60062 letter code for resistances: "4k7" = 4.7k, "2R2" = 2.2.
// A gain accepts "dB" (20 log10 of the ratio) instead of a prefix.
#ifndef HUSHGAIN_IO_UNITS_H_
#define HUSHGAIN_IO_UNITS_H_

#include <optional>
#include <string>
#include <string_view>

namespace hushgain {

enum class Quantity {
  kResistance,      // ohm
  kCapacitance,     // F
  kFrequency,       // Hz
  kVoltage,         // V
  kCurrent,         // A
  kVoltageDensity,  // V/rtHz
  kCurrentDensity,  // A/rtHz
  kGain,            // V/V (dimensionless), or dB
  kVoltageDrift,    // V/K (the same as V/°C for a difference)
  kTemperature,     // °C, a plain number
  kResponsivity,    // A/W
  kRatio,           // dimensionless, may take "%" or "ppm"
  kPower,           // W
  kCharge,          // C (coulombs)
};

// What the quantity is called in an error message: "a resistance".
std::string_view QuantityName(Quantity quantity);

// Parses `text` as `quantity`. Returns the SI value, or nullopt with a short
// reason in `why` (when given). Accepts only finite values.
std::optional<double> ParseQuantity(std::string_view text, Quantity quantity,
                                    std::string* why = nullptr);

// Engineering notation with `digits` significant digits (3 or 4) and an SI
// prefix: FormatEng(1.2345e-6, "V") == "1.235 µV"; FormatEng(0, "V") == "0 V".
// Values outside 1e-15 .. 1e15 fall back to scientific notation.
std::string FormatEng(double value, std::string_view unit, int digits = 4);

// The same with ASCII "u" for micro, for CSV headers and terminals that
// cannot show "µ".
std::string FormatEngAscii(double value, std::string_view unit, int digits = 4);

// Display width of UTF-8 text in terminal columns (code points).
int DisplayWidth(std::string_view text);

}  // namespace hushgain

#endif  // HUSHGAIN_IO_UNITS_H_
