#include "io/units.h"

#include <doctest/doctest.h>

#include "test_support.h"

namespace hushgain {
namespace {

using test::kRelTight;
using test::RelErr;

double Parse(const char* text, Quantity q) {
  std::string why;
  auto v = ParseQuantity(text, q, &why);
  REQUIRE_MESSAGE(v.has_value(), text << ": " << why);
  return *v;
}

TEST_CASE("SI prefixes scale values and case matters: m is milli; M is mega") {
  CHECK(RelErr(Parse("12.4k", Quantity::kResistance), 12.4e3) < kRelTight);
  CHECK(RelErr(Parse("2.2 MOhm", Quantity::kResistance), 2.2e6) < kRelTight);
  CHECK(RelErr(Parse("2.2 mOhm", Quantity::kResistance), 2.2e-3) < kRelTight);
  CHECK(RelErr(Parse("10pF", Quantity::kCapacitance), 10e-12) < kRelTight);
  CHECK(RelErr(Parse("4 nV/rtHz", Quantity::kVoltageDensity), 4e-9) <
        kRelTight);
  CHECK(RelErr(Parse("0.5 pA/rtHz", Quantity::kCurrentDensity), 0.5e-12) <
        kRelTight);
  CHECK(RelErr(Parse("3 fA/\xE2\x88\x9AHz", Quantity::kCurrentDensity), 3e-15) <
        kRelTight);
  CHECK(RelErr(Parse("1 kHz", Quantity::kFrequency), 1e3) < kRelTight);
  CHECK(RelErr(Parse("5 GHz", Quantity::kFrequency), 5e9) < kRelTight);
  CHECK(RelErr(Parse("1T", Quantity::kResistance), 1e12) < kRelTight);
  CHECK(RelErr(Parse("25 uV", Quantity::kVoltage), 25e-6) < kRelTight);
  CHECK(RelErr(Parse("25 \xC2\xB5V", Quantity::kVoltage), 25e-6) <
        kRelTight);  // micro sign
  CHECK(RelErr(Parse("25 \xCE\xBCV", Quantity::kVoltage), 25e-6) <
        kRelTight);  // Greek mu
  CHECK(RelErr(Parse("1 m", Quantity::kVoltage), 1e-3) < kRelTight);
  CHECK(RelErr(Parse("100", Quantity::kResistance), 100) < kRelTight);
  CHECK(RelErr(Parse("1e-9", Quantity::kCurrent), 1e-9) < kRelTight);
  CHECK(RelErr(Parse("0.3 uV/C", Quantity::kVoltageDrift), 0.3e-6) < kRelTight);
}

TEST_CASE("a bare unit symbol is the unit; not a prefix") {
  CHECK(RelErr(Parse("1 F", Quantity::kCapacitance), 1.0) < kRelTight);
  CHECK(RelErr(Parse("1 fF", Quantity::kCapacitance), 1e-15) < kRelTight);
  CHECK(RelErr(Parse("3 V", Quantity::kVoltage), 3.0) < kRelTight);
  CHECK(RelErr(Parse("3 Ohm", Quantity::kResistance), 3.0) < kRelTight);
}

TEST_CASE("IEC 60062 letter code reads 4k7 as 4.7 kOhm and 2R2 as 2.2 Ohm") {
  // IEC 60062 resistance code letters (common practice on schematics).
  CHECK(RelErr(Parse("4k7", Quantity::kResistance), 4.7e3) < kRelTight);
  CHECK(RelErr(Parse("2R2", Quantity::kResistance), 2.2) < kRelTight);
  CHECK(RelErr(Parse("1M5", Quantity::kResistance), 1.5e6) < kRelTight);
}

TEST_CASE("gains take dB as 20 log10 and ratios take % and ppm") {
  CHECK(RelErr(Parse("120 dB", Quantity::kGain), 1e6) < kRelTight);
  CHECK(RelErr(Parse("1M", Quantity::kGain), 1e6) < kRelTight);
  CHECK(RelErr(Parse("0.5%", Quantity::kRatio), 5e-3) < kRelTight);
  CHECK(RelErr(Parse("25 ppm", Quantity::kRatio), 25e-6) < kRelTight);
}

TEST_CASE("bad values are refused with the reason") {
  std::string why;
  CHECK_FALSE(ParseQuantity("ten", Quantity::kResistance, &why));
  CHECK(why == "no number");
  CHECK_FALSE(ParseQuantity("10 kV", Quantity::kResistance, &why));
  CHECK(why == "unknown unit \"kV\"");
  CHECK_FALSE(ParseQuantity("10K", Quantity::kResistance, &why));
  CHECK(why == "unknown unit \"K\"");
  CHECK_FALSE(ParseQuantity("", Quantity::kResistance, &why));
  CHECK(why == "empty value");
  CHECK_FALSE(ParseQuantity("inf", Quantity::kResistance, &why));
  CHECK_FALSE(ParseQuantity("nan", Quantity::kResistance, &why));
  CHECK_FALSE(ParseQuantity("0x10", Quantity::kResistance, &why));
  CHECK_FALSE(ParseQuantity("1e999", Quantity::kResistance, &why));
  CHECK_FALSE(ParseQuantity("1 pF", Quantity::kResistance, &why));
  // Found by the quantity fuzzer: a letter code too long for a double.
  CHECK_FALSE(
      ParseQuantity(std::string(400, '2') + "R2", Quantity::kResistance, &why));
  CHECK(why == "out of range");
}

TEST_CASE("numbers are read as the C locale writes them whatever the locale") {
  // std::from_chars: "." is the decimal point, a "+" may lead, extremes
  // read as strtod gives them (infinity refused as not finite, values
  // below the smallest double as 0).
  std::string why;
  CHECK(ParseQuantity("+4.7k", Quantity::kResistance) == 4700.0);
  CHECK(ParseQuantity("-5m", Quantity::kVoltage) == -0.005);
  CHECK(ParseQuantity(".5u", Quantity::kVoltage) == 0.5e-6);
  CHECK(ParseQuantity("2.5e3", Quantity::kFrequency) == 2500.0);
  CHECK(ParseQuantity("1e-999", Quantity::kVoltage) == 0.0);
  CHECK(ParseQuantity("-1e-999", Quantity::kVoltage) == 0.0);
  CHECK_FALSE(ParseQuantity("4,7k", Quantity::kResistance, &why));
  CHECK(why == "unknown unit \",7k\"");
  CHECK_FALSE(ParseQuantity("+-1", Quantity::kVoltage, &why));
  CHECK(why == "no number");
  CHECK_FALSE(ParseQuantity("-1e999", Quantity::kVoltage, &why));
  CHECK(why == "not a finite number");
  CHECK_FALSE(
      ParseQuantity("0.0000001e999999999999999", Quantity::kVoltage, &why));
  CHECK(why == "not a finite number");
}

TEST_CASE("engineering notation prints 4 significant digits and an SI prefix") {
  CHECK(FormatEng(1.23456e-6, "V") == "1.235 \xC2\xB5V");
  CHECK(FormatEng(9.99996e6, "\xCE\xA9") ==
        "10.00 M\xCE\xA9");  // rounding carries
  CHECK(FormatEng(4.967e6, "\xCE\xA9") == "4.967 M\xCE\xA9");
  CHECK(FormatEng(0, "V") == "0 V");
  CHECK(FormatEng(999.96, "Hz") == "1.000 kHz");
  CHECK(FormatEng(-28.94521e-3, "V") == "-28.95 mV");
  CHECK(FormatEng(12.5, "Hz", 3) == "12.5 Hz");
  CHECK(FormatEngAscii(3.3e-6, "V") == "3.300 uV");
  CHECK(DisplayWidth("1.235 \xC2\xB5V") == 8);  // the micro sign is one column
}

}  // namespace
}  // namespace hushgain
