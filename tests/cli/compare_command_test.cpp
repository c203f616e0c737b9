// `hushgain compare` end to end: each row is the budget `budget --device`
// prints (both run through the built binary), the ranking, the refused
// rows, the whole error messages.
#include <doctest/doctest.h>

#include <cmath>
#include <nlohmann/json.hpp>
#include <string>
#include <vector>

#include "cli/cli_support.h"
#include "cli/run_binary.h"
#include "cli/temp_folder.h"
#include "test_support.h"

namespace hushgain {
namespace {

using nlohmann::json;
using test::RunBinary;

const std::string kDevices = std::string(HUSHGAIN_SOURCE_DIR) + "/devices";

test::RunResult Compare(std::vector<std::string> args) {
  std::vector<std::string> all = {"--devices", kDevices, "compare"};
  all.insert(all.end(), args.begin(), args.end());
  return RunBinary(HUSHGAIN_BINARY, all);
}

json ParseOrFail(const test::RunResult& r) {
  INFO("stderr: " << r.err);
  REQUIRE(r.exit_code == 0);
  return json::parse(r.out);
}

// Equal to 1e-12 relative; both null when the figure does not exist.
void CheckSame(const json& a, const json& b, const char* what) {
  CAPTURE(what);
  REQUIRE(a.is_null() == b.is_null());
  if (a.is_null()) return;
  const double x = a.get<double>(), y = b.get<double>();
  CHECK(test::RelErr(x, y) <= 1e-12);
}

TEST_CASE("compare gives each op-amp the figures of budget with that device") {
  for (const char* example :
       {"geophone-preamp", "thermopile-stage", "smoke-chamber-receiver"}) {
    CAPTURE(example);
    const json doc =
        ParseOrFail(Compare({test::ExamplePath(example), "--json"}));
    const json& devices = doc.at("devices");
    REQUIRE(devices.size() == 6);  // every op-amp of the shipped folder
    for (const json& row : devices) {
      const std::string name = row.at("device").get<std::string>();
      CAPTURE(name);
      REQUIRE(row.at("status") == "ok");
      const test::RunResult b =
          RunBinary(HUSHGAIN_BINARY,
                    {"--devices", kDevices, "budget",
                     test::ExamplePath(example), "--device", name, "--json"});
      const json budget = ParseOrFail(b);
      CheckSame(row.at("input_referred_rms"),
                budget.at("noise").at("input_referred_rms"), "input rms");
      CheckSame(row.at("offset_worst_case_V"),
                budget.at("offset").at("worst_case_V"), "offset");
      CheckSame(row.at("phase_margin_deg"),
                budget.at("loop").at("phase_margin_deg"), "phase margin");
      CheckSame(row.at("bandwidth_3db_Hz"),
                budget.at("response").at("bandwidth_3db_Hz"), "bandwidth");
      CHECK(row.at("warnings") == budget.at("warnings"));
    }
  }
}

TEST_CASE("compare ranks by input noise or offset with the fitting first") {
  for (const std::string rank : {"input-noise", "offset"}) {
    CAPTURE(rank);
    const json doc = ParseOrFail(Compare(
        {test::ExamplePath("geophone-preamp"), "--json", "--rank", rank}));
    CHECK(doc.at("ranking") == rank);
    const char* key =
        rank == "offset" ? "offset_worst_case_V" : "input_referred_rms";
    const json& devices = doc.at("devices");
    for (std::size_t i = 0; i < devices.size(); ++i) {
      CHECK(devices[i].at("rank") == i + 1);
      if (i == 0) continue;
      const json& a = devices[i - 1];
      const json& b = devices[i];
      const bool a_fits = a.at("verdict") == "fits";
      const bool b_fits = b.at("verdict") == "fits";
      CHECK((a_fits || !b_fits));
      if (a_fits == b_fits)
        CHECK(a.at(key).get<double>() <= b.at(key).get<double>());
    }
  }
}

TEST_CASE("compare takes a list of device names and part files") {
  test::TempFolder folder("compare");
  const std::string part = folder
                               .Write("my-amp.json", R"({
    "kind": "opamp", "class": "my amp",
    "parameters": {"voltage_noise": "4n", "current_noise": "0.4p",
                   "open_loop_gain": "120 dB", "gbw": "10 MHz"}})")
                               .string();
  const json doc =
      ParseOrFail(Compare({test::ExamplePath("thermopile-stage"), "--json",
                           "--devices-list", "jfet-input," + part}));
  const json& devices = doc.at("devices");
  REQUIRE(devices.size() == 2);
  for (const json& row : devices) {
    if (row.at("device") != part) continue;
    CHECK(row.at("class") == "my amp");
    // White e_n and i_n: R_opt = 4 nV / 0.4 pA = 10 kOhm at any frequency
    // (the stage runs at 35 °C; a constant i_n does not move).
    CHECK(test::RelErr(row.at("optimum_source_resistance_ohm").get<double>(),
                       4e-9 / 0.4e-12) < 1e-12);
    // The thermopile's 50 k element through R_in 10 k.
    CHECK(doc.at("source_resistance_seen_ohm").get<double>() == 60e3);
    CHECK(test::RelErr(row.at("source_to_optimum_ratio").get<double>(),
                       60e3 / 10e3) < 1e-12);
  }
}

TEST_CASE("compare keeps a refused op-amp as a row") {
  // A phase-margin target for the automatic C_f that two shipped classes
  // reach and the others do not (each shows its best).
  test::TempFolder folder("compare");
  const std::string stage = folder
                                .Write("pd.json", R"({
    "name": "pd test", "band_Hz": {"low": "10", "high": "1k"},
    "opamp": {"device": "jfet-input"},
    "source": {"photodiode": {"capacitance": "1n"}},
    "stage": {"topology": "transimpedance",
              "feedback": {"resistor": "100k", "capacitor": "auto",
                           "capacitor_target": {"phase_margin_deg": 87.2}},
              "load": "10k"}})")
                                .string();
  const test::RunResult r = Compare({stage, "--json"});
  REQUIRE(r.exit_code == 0);
  const json doc = json::parse(r.out);
  int refused = 0;
  bool after_refused = false;
  for (const json& row : doc.at("devices")) {
    const bool ok = row.at("status") == "ok";
    CHECK((ok || row.at("rank").is_null()));
    CHECK(!(ok && after_refused));  // refused rows come last
    if (ok) continue;
    after_refused = true;
    ++refused;
    CHECK(row.at("verdict") == "refused");
    CHECK(row.at("input_referred_rms").is_null());
    const std::string why = row.at("refusal").get<std::string>();
    CHECK(why.find("no feedback capacitor from 1 aF to 1 uF gives a phase "
                   "margin of 87.2 deg") == 0);
    CHECK(r.err.find("warning: " + row.at("device").get<std::string>() +
                     ": analysis refused: " + why + "\n") != std::string::npos);
  }
  CHECK(refused > 0);
  CHECK(refused < 6);
}

TEST_CASE("compare refuses an unknown device and a bad rank in one line") {
  const test::RunResult unknown =
      Compare({test::ExamplePath("geophone-preamp"), "--devices-list",
               "jfet-input,precision-bipolr"});
  CHECK(unknown.exit_code == 2);
  CHECK(unknown.out.empty());
  CHECK(unknown.err ==
        "error: command line: --devices-list: unknown op-amp device "
        "\"precision-bipolr\" (did you mean \"precision-bipolar\"?)\n");

  const test::RunResult twice =
      Compare({test::ExamplePath("geophone-preamp"), "--devices-list",
               "zero-drift,zero-drift"});
  CHECK(twice.exit_code == 2);
  CHECK(twice.err ==
        "error: command line: --devices-list: device \"zero-drift\" is named "
        "twice\n");

  const test::RunResult empty = Compare(
      {test::ExamplePath("geophone-preamp"), "--devices-list", "zero-drift,"});
  CHECK(empty.exit_code == 2);
  CHECK(empty.err ==
        "error: command line: --devices-list: expected device names or part "
        "files separated by commas, got \"zero-drift,\"\n");

  const test::RunResult rank =
      Compare({test::ExamplePath("geophone-preamp"), "--rank", "ofset"});
  CHECK(rank.exit_code == 2);
  CHECK(rank.out.empty());
  CHECK(rank.err ==
        "error: command line: --rank: expected input-noise or offset, got "
        "\"ofset\" (did you mean \"offset\"?)\n");
}

TEST_CASE("compare as CSV holds the JSON's figures one record per device") {
  const std::string stage = test::ExamplePath("thermopile-stage");
  const json doc = ParseOrFail(Compare({stage, "--json"}));
  const test::RunResult csv = Compare({stage, "--csv"});
  REQUIRE(csv.exit_code == 0);
  const auto records = test::ReadCsv(csv.out);
  REQUIRE(records.size() == 7);  // the header and six op-amps
  const std::vector<std::string>& header = records.front();
  const std::vector<std::string> expected = {
      "rank",
      "device",
      "class",
      "input_referred_rms_V",
      "input_referred_density_V_per_rtHz",
      "output_rms_V",
      "dominant",
      "dominant_share",
      "offset_worst_case_V",
      "phase_margin_deg",
      "bandwidth_3db_Hz",
      "share_voltage_noise",
      "share_current_noise",
      "share_resistor",
      "share_other",
      "e_n_at_reference_V_per_rtHz",
      "i_n_at_reference_A_per_rtHz",
      "optimum_source_resistance_ohm",
      "source_to_optimum_ratio",
      "verdict"};
  CHECK(header == expected);
  auto column = [&](const std::string& name) {
    for (std::size_t k = 0; k < header.size(); ++k)
      if (header[k] == name) return k;
    FAIL("no column " << name);
    return std::size_t{0};
  };
  for (std::size_t i = 1; i < records.size(); ++i) {
    const json& row = doc.at("devices")[i - 1];
    CAPTURE(row.at("device"));
    CHECK(records[i][column("device")] == row.at("device"));
    CHECK(records[i][column("rank")] == std::to_string(i));
    CHECK(records[i][column("verdict")] == row.at("verdict"));
    // CSV numbers carry nine significant digits.
    for (const auto& [csv_name, json_name] :
         std::vector<std::pair<std::string, std::string>>{
             {"input_referred_rms_V", "input_referred_rms"},
             {"offset_worst_case_V", "offset_worst_case_V"},
             {"optimum_source_resistance_ohm",
              "optimum_source_resistance_ohm"}}) {
      CAPTURE(csv_name);
      CHECK(test::RelErr(std::stod(records[i][column(csv_name)]),
                         row.at(json_name).get<double>()) < 1e-8);
    }
    CHECK(test::RelErr(std::stod(records[i][column("share_current_noise")]),
                       row.at("shares").at("current_noise").get<double>()) <
          1e-8);
  }
}

TEST_CASE("compare as Markdown has a heading and two pipe tables") {
  const test::RunResult md =
      Compare({test::ExamplePath("thermopile-stage"), "--format", "markdown"});
  REQUIRE(md.exit_code == 0);
  CHECK(md.out.rfind("## thermopile stage, 50 k element, slow DC readout: "
                     "op-amp classes compared\n",
                     0) == 0);
  CHECK(md.out.find("\n| rank | device | class | input noise rms |") !=
        std::string::npos);
  CHECK(md.out.find("\n| device | e\\_n x NG | i\\_n | resistors | other |") !=
        std::string::npos);
  // Each table: its header, the delimiter row and six op-amps.
  std::size_t rows = 0;
  for (std::size_t at = md.out.find("\n| "); at != std::string::npos;
       at = md.out.find("\n| ", at + 1))
    ++rows;
  CHECK(rows == 2 * (2 + 6));
}

TEST_CASE("compare draws each op-amp's noise as bars split by kind") {
  test::TempFolder folder("compare-plot");
  const std::string svg = folder / "bars.svg";
  const test::RunResult r =
      Compare({test::ExamplePath("thermopile-stage"), "--plot", svg});
  INFO("stderr: " << r.err);
  REQUIRE(r.exit_code == 0);
  const std::string picture = test::ReadAll(svg);
  std::string why;
  CHECK_MESSAGE(test::WellFormedXml(picture, &why), why);
  // Every op-amp is named on its line, and every kind in the legend.
  for (const char* name : {"zero-drift", "jfet-input", "low-noise-bipolar",
                           "e_n x noise gain", "i_n (both inputs)"})
    CHECK(test::DecodeXmlEntities(picture).find(name) != std::string::npos);
  CHECK(folder.Files() == std::vector<std::string>{"bars.svg"});

  const test::RunResult bad = Compare(
      {test::ExamplePath("thermopile-stage"), "--plot", folder / "bars.gif"});
  CHECK(bad.exit_code == 2);
  CHECK(bad.err ==
        "error: command line: --plot: expected a file name ending "
        "in .png, .svg or .pdf, got \"" +
            folder / "bars.gif" + "\"\n");
}

TEST_CASE("compare as text names the ranking and the optimum source") {
  const test::RunResult r = Compare({test::ExamplePath("geophone-preamp")});
  REQUIRE(r.exit_code == 0);
  CHECK(r.out.find("ranked by input-referred noise rms, smallest first") !=
        std::string::npos);
  CHECK(r.out.find("R_opt = e_n/i_n") != std::string::npos);
  for (const char* name : {"jfet-input", "low-noise-bipolar", "zero-drift"})
    CHECK(r.out.find(name) != std::string::npos);
}

}  // namespace
}  // namespace hushgain
