// `hushgain devices [NAME]` and `--device NAME`, end to end.
#include <doctest/doctest.h>

#include <cmath>
#include <nlohmann/json.hpp>
#include <string>
#include <vector>

#include "cli/cli_support.h"
#include "cli/temp_folder.h"
#include "io/device_library.h"
#include "test_support.h"

namespace hushgain {
namespace {

using json = nlohmann::json;
using test::ExamplePath;
using test::ReadAll;
using test::RunBinary;
using test::RunResult;

const std::string kDevices = std::string(HUSHGAIN_SOURCE_DIR) + "/devices";

TEST_CASE("devices lists every op-amp with its density at 1 kHz") {
  const RunResult r =
      RunBinary(HUSHGAIN_BINARY, {"devices", "--devices", kDevices, "--json"});
  REQUIRE(r.exit_code == 0);
  const json list = json::parse(r.out);
  const DeviceLibrary library = LoadDeviceLibrary(kDevices);
  REQUIRE(list["opamps"].size() == library.opamps.size());
  for (const json& row : list["opamps"]) {
    const std::string name = row["name"];
    CAPTURE(name);
    const OpAmpModel& m = library.opamps.at(name);
    // e_n(f)^2 = e_w^2 (1 + f_c / f) at f = 1 kHz, the white-plus-1/f model
    // of the device file (common practice, no source; the model's header).
    const double e_n = m.e_w_v_per_rthz * std::sqrt(1 + m.f_cv_hz / 1e3);
    if (m.voltage_noise_table.empty())
      CHECK(test::RelErr(row["e_n_1kHz_V_per_rtHz"].get<double>(), e_n) <
            1e-12);
    CHECK(row["gbw_Hz"].get<double>() == m.gbw_hz);
    CHECK(row["data"] == "illustrative");  // every shipped class says so
  }
  CHECK(list["resistors"].size() == library.resistors.size());

  const RunResult text =
      RunBinary(HUSHGAIN_BINARY, {"devices", "--devices", kDevices});
  CHECK(text.exit_code == 0);
  for (const auto& [name, m] : library.opamps)
    CHECK(text.out.find(name) != std::string::npos);
}

TEST_CASE(
    "devices NAME prints one device's parameters as its file gives them") {
  const RunResult r = RunBinary(
      HUSHGAIN_BINARY,
      {"devices", "jfet-input", "--devices", kDevices, "--format", "json"});
  REQUIRE(r.exit_code == 0);
  const json d = json::parse(r.out);
  // devices/opamps/jfet-input.json: 6 nV/rtHz, 50 Hz, 5 MHz, 300 uV, 5 pA.
  CHECK(d["kind"] == "opamp");
  CHECK(test::RelErr(d["parameters"]["voltage_noise"].get<double>(), 6e-9) <
        1e-12);
  CHECK(d["parameters"]["voltage_noise_corner"].get<double>() == 50);
  CHECK(d["parameters"]["gbw"].get<double>() == 5e6);
  CHECK(test::RelErr(d["parameters"]["offset_voltage"].get<double>(), 300e-6) <
        1e-12);
  CHECK(test::RelErr(d["parameters"]["bias_current"].get<double>(), 5e-12) <
        1e-12);
  CHECK(d["data"] == "illustrative");

  for (const char* format : {"text", "markdown", "csv"}) {
    const RunResult t = RunBinary(
        HUSHGAIN_BINARY,
        {"devices", "thin-film", "--devices", kDevices, "--format", format});
    CHECK(t.exit_code == 0);
    CHECK(t.out.find("tolerance") != std::string::npos);
  }
}

TEST_CASE("a user's part is listed as user data with its source") {
  test::TempFolder folder;
  folder.Write("opamps/my-part.json", R"({
  "kind": "opamp", "class": "my bench part",
  "source": "my own measurement, 2026",
  "parameters": {"voltage_noise": "4n", "current_noise": "1f",
                 "open_loop_gain": "1M", "gbw": "3M"}
})");
  folder.Write("resistors/film.json",
               ReadAll(kDevices + "/resistors/thin-film.json"));
  const std::string dir = folder.path().string();
  const RunResult list =
      RunBinary(HUSHGAIN_BINARY, {"devices", "--devices", dir});
  REQUIRE(list.exit_code == 0);
  CHECK(list.out.find("my-part") != std::string::npos);
  CHECK(list.out.find("user") != std::string::npos);
  const RunResult one =
      RunBinary(HUSHGAIN_BINARY, {"devices", "my-part", "--devices", dir});
  CHECK(one.exit_code == 0);
  CHECK(one.out.find("my own measurement, 2026") != std::string::npos);
}

TEST_CASE("devices refuses an unknown name with a suggestion") {
  const RunResult r = RunBinary(
      HUSHGAIN_BINARY, {"devices", "jfet-inptu", "--devices", kDevices});
  CHECK(r.exit_code == 2);
  CHECK(r.err == "error: command line: devices: no device \"jfet-inptu\" in " +
                     kDevices + " (did you mean \"jfet-input\"?)\n");
  CHECK(r.out.empty());
}

// The stage file with its op-amp block replaced by {"device": NAME}.
std::string WithDevice(const std::string& stage_path, const std::string& name) {
  json stage = json::parse(ReadAll(stage_path));
  stage["opamp"] = {{"device", name}};
  return stage.dump(2);
}

TEST_CASE("--device gives the budget of the stage written with that device") {
  test::TempFolder folder;
  const std::string example = ExamplePath("geophone-preamp");
  for (const char* device : {"low-noise-bipolar", "zero-drift"}) {
    CAPTURE(device);
    folder.Write("edited.json", WithDevice(example, device));
    const RunResult edited = RunBinary(
        HUSHGAIN_BINARY, {"budget", (folder.path() / "edited.json").string(),
                          "--devices", kDevices, "--json"});
    const RunResult flag =
        RunBinary(HUSHGAIN_BINARY, {"budget", example, "--devices", kDevices,
                                    "--device", device, "--json"});
    REQUIRE(edited.exit_code == 0);
    REQUIRE(flag.exit_code == 0);
    const json a = json::parse(edited.out);
    const json b = json::parse(flag.out);
    CHECK(a["noise"] == b["noise"]);
    CHECK(a["offset"] == b["offset"]);
    CHECK(a["opamp"] == b["opamp"]);
  }
}

TEST_CASE("--device is refused with a suggestion when the name is unknown") {
  for (const std::vector<std::string>& command :
       std::vector<std::vector<std::string>>{
           {"budget", ExamplePath("geophone-preamp")},
           {"plot", ExamplePath("geophone-preamp"), "-o", "x.png"},
           {"spread", ExamplePath("geophone-preamp")},
           {"tee", "sweep", ExamplePath("geophone-preamp")},
           {"tee", "search", ExamplePath("geophone-preamp"), "--max", "100k"},
           {"tia", "suggest", ExamplePath("smoke-chamber-receiver"),
            "--bandwidth", "10k"},
           {"tia", "snr", ExamplePath("smoke-chamber-receiver"),
            "--power-range", "1n..1u"}}) {
    std::vector<std::string> args = command;
    for (const char* a : {"--devices", "", "--device", "jfet-inptu"})
      args.push_back(a);
    args[args.size() - 3] = kDevices;
    CAPTURE(args.front());
    const RunResult r = RunBinary(HUSHGAIN_BINARY, args);
    CHECK(r.exit_code == 2);
    CHECK(r.err ==
          "error: command line: --device: unknown op-amp device "
          "\"jfet-inptu\" (did you mean \"jfet-input\"?)\n");
  }
}

}  // namespace
}  // namespace hushgain
