// `hushgain tia snr` end to end: the built binary, its exit code, the whole
// stderr message, the JSON and CSV it prints and the picture it draws.
#include <doctest/doctest.h>

#include <cmath>
#include <nlohmann/json.hpp>
#include <string>
#include <vector>

#include "cli/cli_support.h"
#include "cli/run_binary.h"
#include "test_support.h"

namespace hushgain {
namespace {

using test::ReadAll;
using test::RunBinary;
using test::TempFolder;

constexpr const char* kStage = "examples/smoke-chamber-receiver.json";

test::RunResult Snr(const std::vector<std::string>& args) {
  std::vector<std::string> all = {"tia", "snr"};
  all.insert(all.end(), args.begin(), args.end());
  return RunBinary(HUSHGAIN_BINARY, all, HUSHGAIN_SOURCE_DIR);
}

TEST_CASE(
    "tia snr prints SNR against power with the NEP where it crosses 1 and the "
    "saturation power") {
  const test::RunResult r =
      Snr({kStage, "--power-range", "1p..10u", "--points", "15", "--json"});
  INFO("stderr: " << r.err);
  REQUIRE(r.exit_code == 0);
  const nlohmann::json doc = nlohmann::json::parse(r.out);
  const auto& points = doc.at("points");
  REQUIRE(points.size() == 15);
  CHECK(points.front().at("optical_power_W").get<double>() ==
        doctest::Approx(1e-12));
  CHECK(points.back().at("optical_power_W").get<double>() ==
        doctest::Approx(10e-6));
  const double nep = doc.at("nep_W").get<double>();
  // SNR rises through 1 at the NEP: below it every point is under 1, above
  // it every point over 1.
  for (const auto& p : points) {
    const double power = p.at("optical_power_W").get<double>();
    const double snr = p.at("snr").get<double>();
    CHECK((power < nep) == (snr < 1));
    // The signal current is R P with the example's 0.55 A/W.
    CHECK(std::fabs(p.at("signal_current_A").get<double>() / (0.55 * power) -
                    1) < 1e-12);
  }
  // The example's 10 M transimpedance and 4 V full scale: saturation near
  // 4 V / (0.55 A/W x 10 M) = 727 nW, less the stray light's and offset's
  // share of the swing.
  const double sat = doc.at("saturation_power_W").get<double>();
  CHECK(sat < 4 / (0.55 * 10e6));
  CHECK(sat > 0.9 * 4 / (0.55 * 10e6));
  CHECK(doc.at("limit").get<std::string>() == "full-scale swing");
  for (const auto& p : points)
    CHECK(p.at("saturated").get<bool>() ==
          (p.at("optical_power_W").get<double>() > sat));
}

TEST_CASE("tia snr as CSV and as text") {
  const test::RunResult csv =
      Snr({kStage, "--power-range", "1n..1u", "--points", "4", "--csv"});
  REQUIRE(csv.exit_code == 0);
  const auto rows = test::ReadCsv(csv.out);
  REQUIRE(rows.size() == 5);
  CHECK(rows[0][0] == "optical_power_W");
  CHECK(rows[0][4] == "snr");
  const test::RunResult text =
      Snr({kStage, "--power-range", "1n..1u", "--points", "4"});
  REQUIRE(text.exit_code == 0);
  CHECK(text.out.find("NEP over 1.000 Hz to 20.00 kHz: ") != std::string::npos);
  CHECK(text.out.find("saturates above ") != std::string::npos);
}

TEST_CASE("tia snr refuses bad input with exit code 2 and one line") {
  struct Case {
    std::vector<std::string> args;
    std::string message;
  };
  const Case cases[] = {
      {{kStage, "--power-range", "1n-1m"},
       "error: command line: --power-range: expected LOW..HIGH optical powers "
       "such as 1n..1m, got \"1n-1m\"\n"},
      {{kStage, "--power-range", "1m..1n"},
       "error: command line: --power-range: expected a power above "
       "power_min_w (0.001 W), got 1e-09\n"},
      {{kStage, "--power-range", "0..1m"},
       "error: command line: --power-range: expected a positive power, got "
       "\"0\"\n"},
      {{kStage, "--power-range", "1n..1m", "--points", "1"},
       "error: command line: --points: expected 2 to 10000, got 1\n"},
      {{"examples/geophone-preamp.json", "--power-range", "1n..1m"},
       "error: examples/geophone-preamp.json: /stage/topology: tia snr "
       "needs a \"transimpedance\" stage\n"},
  };
  for (const Case& c : cases) {
    CAPTURE(c.args);
    const test::RunResult r = Snr(c.args);
    CHECK(r.exit_code == 2);
    CHECK(r.err == c.message);
    CHECK(r.out == "");
  }
}

TEST_CASE("tia snr --plot writes a log-log picture of SNR against power") {
  TempFolder dir("tiasnrplot");
  const std::string svg = dir / "snr.svg";
  const test::RunResult r =
      Snr({kStage, "--power-range", "1p..10u", "--points", "9", "--plot", svg});
  INFO("stderr: " << r.err);
  REQUIRE(r.exit_code == 0);
  const std::string text = ReadAll(svg);
  std::string why;
  CHECK_MESSAGE(test::WellFormedXml(text, &why), why);
  const std::string decoded = test::DecodeXmlEntities(text);
  CHECK(decoded.find(">Signal current R x P against the input noise rms<") !=
        std::string::npos);
  CHECK(decoded.find("NEP over the band") != std::string::npos);
}

}  // namespace
}  // namespace hushgain
