// A capacitive sensor end to end: `hushgain budget` in text, Markdown and
// JSON shows the charge gain, the corners and the input-referred charge, and
// commands that need a voltage source refuse one with a whole message.
#include <doctest/doctest.h>

#include <cmath>
#include <fstream>
#include <nlohmann/json.hpp>
#include <string>

#include "base/physical_constants.h"
#include "cli/cli_support.h"
#include "cli/temp_folder.h"
#include "test_support.h"

namespace hushgain {
namespace {

using nlohmann::json;
using test::RelErr;
using test::RunHushgain;
using test::TempFolder;

// 1 nF into 1 G || 100 pF: 10 mV/pC, low corner 1/(2 pi 1G 100p) = 1.59 Hz.
constexpr const char* kChargeAmp = R"({
  "name": "charge amplifier",
  "band_Hz": {"low": "20", "high": "10k"},
  "reference_frequency_Hz": "1k",
  "opamp": {"device": "jfet-input"},
  "source": {"capacitive": {"capacitance": "1n", "leakage_resistance": "10G"},
             "sensitivity": {"value": "10 pC", "per": "g"}},
  "stage": {"topology": "inverting",
            "feedback": {"resistor": "1G", "capacitor": "100p"}}
})";

std::string WriteStage(const TempFolder& dir, const std::string& text) {
  const std::string path = dir / "charge.json";
  std::ofstream(path) << text;
  return path;
}

TEST_CASE(
    "a charge amplifier's budget reports its charge gain and charge noise") {
  TempFolder dir("charge");
  const std::string path = WriteStage(dir, kChargeAmp);
  const auto r = RunHushgain({"budget", "--format", "json", path});
  REQUIRE(r.exit_code == 0);
  const json b = json::parse(r.out);
  REQUIRE(b.contains("charge"));
  const json& c = b["charge"];
  // The charge gain is the passband gain over C_s; 1/C_f within the
  // op-amp's finite gain (GBW 5 MHz against a noise gain near 11: 1e-3).
  CHECK(RelErr(c["charge_gain_V_per_C"].get<double>(),
               b["response"]["passband_gain"].get<double>() / 1e-9) < 1e-12);
  CHECK(RelErr(c["charge_gain_V_per_C"].get<double>(), 1 / 100e-12) < 1e-3);
  CHECK(RelErr(c["low_corner_estimate_Hz"].get<double>(),
               1 / (2 * kPi * 1e9 * 100e-12)) < 1e-12);
  CHECK(c["low_corner_Hz"].get<double>() ==
        b["response"]["bandwidth_low_Hz"].get<double>());
  CHECK(c["high_corner_Hz"].get<double>() ==
        b["response"]["bandwidth_3db_Hz"].get<double>());
  CHECK(RelErr(c["low_corner_Hz"].get<double>(),
               c["low_corner_estimate_Hz"].get<double>()) < 1e-3);
  const json& n = b["noise"];
  CHECK(n["input_referred_unit"] == "V");
  CHECK(RelErr(n["input_referred_charge_rms_C"].get<double>(),
               n["input_referred_rms"].get<double>() * 1e-9) < 1e-12);
  CHECK(RelErr(n["input_referred_charge_density_C_per_rtHz"].get<double>(),
               n["input_referred_density_per_rtHz"].get<double>() * 1e-9) <
        1e-12);
  CHECK(n["measurand"]["sensitivity_unit"] == "C");
  CHECK(RelErr(n["measurand"]["input_referred_rms"].get<double>(),
               n["input_referred_charge_rms_C"].get<double>() / 10e-12) <
        1e-12);

  const auto text = RunHushgain({"budget", path});
  REQUIRE(text.exit_code == 0);
  CHECK(text.out.find("  charge gain 10 mV/pC in the passband") !=
        std::string::npos);
  CHECK(text.out.find("straight into the - input; low corner 1/(2 pi R_f "
                      "C_f) = 1.592 Hz") != std::string::npos);
  CHECK(text.out.find("  input-referred charge  ") != std::string::npos);
  const auto md = RunHushgain({"budget", "--format", "markdown", path});
  REQUIRE(md.exit_code == 0);
  CHECK(md.out.find("- charge gain: ") != std::string::npos);
  CHECK(md.out.find("- input-referred charge: ") != std::string::npos);
  CHECK(md.out.find("(10.00 pC per g)") != std::string::npos);
}

TEST_CASE("tee search refuses a capacitive sensor with one line") {
  TempFolder dir("charge-tee");
  std::string text = kChargeAmp;
  const std::string from = R"({"resistor": "1G", "capacitor": "100p"})";
  text.replace(text.find(from), from.size(),
               R"({"tee": {"r1": "1M", "r2": "1M", "r3": "1k"},
                   "capacitor": "100p"})");
  const std::string path = WriteStage(dir, text);
  const auto r = RunHushgain({"tee", "search", path, "--max", "1M"});
  CHECK(r.exit_code == 2);
  CHECK(r.err == "error: " + path +
                     ": /source/capacitive: tee search needs a voltage source "
                     "(its gain target is R_eq / (R_source + R_in)); tee "
                     "sweep takes a capacitive sensor\n");
  const auto sweep = RunHushgain({"tee", "sweep", path, "--points", "3"});
  CHECK(sweep.exit_code == 0);
}

TEST_CASE("tee search refuses AC coupling and tee sweep keeps C3") {
  TempFolder dir("coupled-tee");
  const std::string base = R"({
    "name": "AC-coupled tee",
    "band_Hz": {"low": "10", "high": "5k"},
    "opamp": {"device": "jfet-input"},
    "source": {"voltage": {"resistance": "1k"}},
    "stage": {"topology": "inverting", "input_resistor": "10k", INPUT
              "feedback": {"tee": {"r1": "100k", "r2": "100k", "r3": "1k" C3}}}
  })";
  auto stage = [&](const std::string& input, const std::string& c3) {
    std::string text = base;
    text.replace(text.find("INPUT"), 5, input);
    text.replace(text.find(" C3"), 3, c3);
    return WriteStage(dir, text);
  };
  std::string path = stage("", R"(, "c3": "100u")");
  auto r = RunHushgain({"tee", "search", path, "--max", "100k"});
  CHECK(r.exit_code == 2);
  CHECK(r.err == "error: " + path +
                     ": /stage/feedback/tee/c3: tee search's closed forms "
                     "take no C3 in series with R3; tee sweep takes one\n");
  // Every row of the sweep keeps C3: its DC noise gain is 1 + (R1 + R2) /
  // R_a (ideal-op-amp closed form; the device's A0 moves it below 1e-3).
  r = RunHushgain({"tee", "sweep", path, "--points", "3", "--format", "json"});
  REQUIRE(r.exit_code == 0);
  const json sweep = json::parse(r.out);
  for (const json& row : sweep["rows"]) {
    if (row["plain"].get<bool>()) continue;
    const double r1 = row["r1_ohm"], r2 = row["r2_ohm"];
    CHECK(RelErr(row["noise_gain_dc"].get<double>(), 1 + (r1 + r2) / 11e3) <
          1e-3);
  }
  path = stage(R"("input_capacitor": "10u",)", "");
  r = RunHushgain({"tee", "search", path, "--max", "100k"});
  CHECK(r.exit_code == 2);
  CHECK(r.err == "error: " + path +
                     ": /stage/input_capacitor: tee search's closed forms "
                     "take no input capacitor; tee sweep takes one\n");
}

}  // namespace
}  // namespace hushgain
