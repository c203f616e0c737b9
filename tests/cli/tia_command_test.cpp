// `hushgain tia suggest` end to end: the built binary, its exit code, the
// whole stderr message, and the proposals it prints.
#include <doctest/doctest.h>

#include <cmath>
#include <nlohmann/json.hpp>

#include "base/physical_constants.h"
#include "cli/run_binary.h"
#include "test_support.h"

namespace hushgain {
namespace {

using test::RunBinary;

test::RunResult Tia(const std::vector<std::string>& args) {
  std::vector<std::string> all = {"tia"};
  all.insert(all.end(), args.begin(), args.end());
  return RunBinary(HUSHGAIN_BINARY, all, HUSHGAIN_SOURCE_DIR);
}

TEST_CASE(
    "tia suggest proposes the largest E24 R_f whose flat bandwidth reaches the "
    "target") {
  const test::RunResult r =
      Tia({"suggest", "examples/smoke-chamber-receiver.json", "--bandwidth",
           "50k", "--json"});
  REQUIRE(r.exit_code == 0);
  CHECK(r.err == "");
  const nlohmann::json doc = nlohmann::json::parse(r.out);
  const auto& rows = doc.at("rows");
  const int best = doc.at("best").get<int>();
  REQUIRE(best >= 0);
  const auto& chosen = rows.at(best);
  CHECK(chosen.at("meets_target").get<bool>());
  CHECK(std::fabs(chosen.at("bandwidth_3db_Hz").get<double>() / 50e3 - 1) <
        1e-3);
  // The next E24 value up misses the target (REFERENCES.md section 7:
  // the flat bandwidth sqrt(GBW / (2 pi R_f C)) falls with R_f).
  REQUIRE(rows.size() == static_cast<std::size_t>(best) + 2);
  CHECK_FALSE(rows.at(best + 1).at("meets_target").get<bool>());
  CHECK(rows.at(best + 1).at("butterworth_bandwidth_Hz").get<double>() < 50e3);
  // The textbook estimate GBW / (2 pi C f^2) with C = 47 p + 5 p + 5 p and
  // GBW = 10 MHz (the example's photodiode and op-amp) lands near the choice.
  const double estimate = 10e6 / (2 * kPi * 57e-12 * 2.5e9);
  CHECK(std::fabs(doc.at("largest_rf_estimate_ohm").get<double>() / estimate -
                  1) < 1e-9);
  CHECK(chosen.at("rf_ohm").get<double>() < 1.3 * estimate);
  CHECK(chosen.at("rf_ohm").get<double>() > 0.7 * estimate);
}

TEST_CASE("tia suggest refuses bad input with exit code 2 and one line") {
  struct Case {
    std::vector<std::string> args;
    std::string message;
  };
  const Case cases[] = {
      {{"sugest"},
       "error: command line: unknown tia command \"sugest\" (did you mean "
       "\"suggest\"?); try tia --help\n"},
      {{"suggest", "examples/geophone-preamp.json", "--bandwidth", "5k"},
       "error: examples/geophone-preamp.json: /stage/topology: tia suggest "
       "needs a \"transimpedance\" stage\n"},
      {{"suggest", "examples/smoke-chamber-receiver.json", "--bandwidth",
        "fast"},
       "error: command line: --bandwidth: expected a positive frequency, got "
       "\"fast\" (no number)\n"},
      {{"suggest", "examples/smoke-chamber-receiver.json", "--bandwidth",
        "-5k"},
       "error: command line: --bandwidth: expected a positive frequency, got "
       "\"-5k\"\n"},
      {{"suggest", "examples/smoke-chamber-receiver.json", "--bandwidth", "50k",
        "--series", "E69"},
       "error: command line: --series: unknown series \"E69\" (did you mean "
       "\"E6\"?)\n"},
      {{"suggest", "examples/smoke-chamber-receiver.json", "--bandwidth", "50k",
        "--cap-series", "E7"},
       "error: command line: --cap-series: unknown series \"E7\" (did you "
       "mean \"E6\"?)\n"},
      {{"suggest", "examples/smoke-chamber-receiver.json", "--bandwidth", "50k",
        "--background", "-1u"},
       "error: command line: --background: expected a non-negative current, "
       "got \"-1u\"\n"},
      {{"suggest", "examples/smoke-chamber-receiver.json", "--bandwidth", "50k",
        "--min", "1M", "--max", "1k"},
       "error: command line: --max: 1k is below --min 1M\n"},
      {{"suggest", "examples/nowhere.json", "--bandwidth", "50k"},
       "error: examples/nowhere.json: cannot read: no such file or "
       "directory\n"},
  };
  for (const Case& c : cases) {
    CAPTURE(c.message);
    const test::RunResult r = Tia(c.args);
    CHECK(r.exit_code == 2);
    CHECK(r.out == "");
    CHECK(r.err == c.message);
  }
}

TEST_CASE(
    "tia suggest with an unreachable target exits 1 and says what to change") {
  const test::RunResult r =
      Tia({"suggest", "examples/smoke-chamber-receiver.json", "--bandwidth",
           "20M"});
  CHECK(r.exit_code == 1);
  CHECK(r.out == "");
  CHECK(r.err.find("a faster op-amp or a smaller photodiode is needed") !=
        std::string::npos);
}

TEST_CASE(
    "tia suggest with background light and an E6 capacitor series says the "
    "headroom binds") {
  // 1 uA of background light on the example's 4 V full scale: R_f at most
  // about 4 M (I_bg R_f plus the offset), far below the 5 kHz target's.
  const test::RunResult r =
      Tia({"suggest", "examples/smoke-chamber-receiver.json", "--bandwidth",
           "5k", "--background", "1u", "--cap-series", "E6", "--json"});
  INFO("stderr: " << r.err);
  REQUIRE(r.exit_code == 0);
  const nlohmann::json doc = nlohmann::json::parse(r.out);
  CHECK(doc.at("limited_by") == "headroom");
  CHECK(doc.at("headroom_limit") == "full-scale swing");
  CHECK(doc.at("background_current_A").get<double>() == 1e-6);
  const auto& best = doc.at("rows").at(doc.at("best").get<int>());
  CHECK(best.at("fits_headroom").get<bool>());
  CHECK(best.at("rf_ohm").get<double>() <= 4e6);
  CHECK(best.at("headroom_used_V").get<double>() <= 4);
  // C_f = 0.2 pF parasitic + an E6 part (IEC 60063: 1.0 1.5 2.2 3.3 4.7 6.8).
  const double part = best.at("capacitor_part_F").get<double>();
  const double cf = best.at("cf_F").get<double>();
  CHECK(std::fabs(cf - part - 0.2e-12) < 1e-18);
  const double m = part / std::pow(10.0, std::floor(std::log10(part)));
  bool in_e6 = false;
  for (double v : {1.0, 1.5, 2.2, 3.3, 4.7, 6.8})
    in_e6 = in_e6 || std::fabs(m / v - 1) < 1e-9;
  CHECK(in_e6);
}

}  // namespace
}  // namespace hushgain
