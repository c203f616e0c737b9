#include "io/device_library.h"

#include <doctest/doctest.h>

#include <sstream>

#include "io/read_file.h"
#include "test_support.h"

namespace hushgain {
namespace {

TEST_CASE(
    "the shipped device folder loads six op-amp classes and four resistor "
    "technologies") {
  const DeviceLibrary lib = LoadDeviceLibrary(HUSHGAIN_SOURCE_DIR "/devices");
  for (const char* name :
       {"low-noise-bipolar", "precision-bipolar", "jfet-input", "cmos-general",
        "zero-drift", "electrometer-cmos"}) {
    CAPTURE(name);
    REQUIRE(lib.opamps.count(name) == 1);
    const OpAmpModel& m = lib.opamps.at(name);
    CHECK(m.gbw_hz > 0);
    CHECK(m.open_loop_gain > 1e3);
    CHECK(m.e_w_v_per_rthz > 0);
  }
  for (const char* name :
       {"thin-film", "thick-film", "metal-foil", "carbon-composition"}) {
    CAPTURE(name);
    REQUIRE(lib.resistors.count(name) == 1);
  }
  // Class ordering that any designer expects (common practice, no source):
  // the FET and CMOS inputs have far lower bias current than bipolar ones,
  // the zero-drift class the lowest Vos, foil the lowest excess noise.
  CHECK(lib.opamps.at("jfet-input").ib_a <
        1e-3 * lib.opamps.at("low-noise-bipolar").ib_a);
  CHECK(lib.opamps.at("electrometer-cmos").ib_a <
        lib.opamps.at("jfet-input").ib_a);
  CHECK(lib.opamps.at("zero-drift").vos_v <
        lib.opamps.at("precision-bipolar").vos_v);
  CHECK(lib.opamps.at("low-noise-bipolar").e_w_v_per_rthz <
        lib.opamps.at("precision-bipolar").e_w_v_per_rthz);
  CHECK(lib.resistors.at("metal-foil").noise_index_db <
        lib.resistors.at("thin-film").noise_index_db);
  CHECK(lib.resistors.at("thin-film").noise_index_db <
        lib.resistors.at("thick-film").noise_index_db);
  CHECK(lib.opamps.at("jfet-input").ib_law == BiasTemperatureLaw::kDoubling);
}

TEST_CASE("a device file without its core parameters is refused by key") {
  const char* text = R"({"kind": "opamp", "class": "c", "illustrative": "x",
                         "parameters": {"voltage_noise": "1n", "current_noise": "1p", "gbw": "1M"}})";
  CHECK_THROWS_WITH_AS(
      ParseOpAmpDevice(text, "devices/opamps/x.json"),
      "devices/opamps/x.json: /parameters/open_loop_gain: missing (required)",
      Error);
}

// GBW / A0 is the open-loop pole, where the loop search starts: 1e-300 Hz
// over 1e300 underflows to 0 and a search from 0 Hz never ended (found by
// the device fuzzer); 1e300 Hz over 1e-300 overflows; 1 / 1e-310 is
// beyond the double range (IEEE 754 binary64: largest 1.8e308, smallest
// normal 2.2e-308).
TEST_CASE("a device whose open-loop pole leaves the double range is refused") {
  const std::string core =
      R"({"kind": "opamp", "class": "c", "parameters": {"voltage_noise": "1n",
          "current_noise": "1p", )";
  CHECK_THROWS_WITH_AS(
      ParseOpAmpDevice(core + R"("open_loop_gain": 1e300, "gbw": 1e-300}})",
                       "x.json"),
      "x.json: /parameters/gbw: expected a GBW / open_loop_gain ratio (the "
      "open-loop pole) inside the double range, got 1e-300 Hz / 1e+300",
      Error);
  CHECK_THROWS_WITH_AS(
      ParseOpAmpDevice(core + R"("open_loop_gain": 1e-300, "gbw": 1e300}})",
                       "x.json"),
      "x.json: /parameters/gbw: expected a GBW / open_loop_gain ratio (the "
      "open-loop pole) inside the double range, got 1e+300 Hz / 1e-300",
      Error);
  CHECK_THROWS_WITH_AS(
      ParseOpAmpDevice(core + R"("open_loop_gain": 1e-310, "gbw": 1e-310}})",
                       "x.json"),
      "x.json: /parameters/gbw: expected a GBW / open_loop_gain ratio (the "
      "open-loop pole) inside the double range, got 1e-310 Hz / 1e-310",
      Error);
  // Extreme but inside the range: a 1e-100 Hz pole is a number.
  CHECK(ParseOpAmpDevice(core + R"("open_loop_gain": 1e100, "gbw": 1}})",
                         "x.json")
            .gbw_hz == 1);
}

TEST_CASE("a device file with an unknown parameter gets a suggestion") {
  const char* text = R"({"kind": "opamp", "class": "c", "illustrative": "x",
                         "parameters": {"voltage_noise": "1n", "current_noise": "1p", "gbw": "1M",
                                        "open_loop_gain": "1M", "voltage_noize_corner": "3"}})";
  CHECK_THROWS_WITH_AS(ParseOpAmpDevice(text, "x.json"),
                       "x.json: /parameters/voltage_noize_corner: unknown key "
                       "(did you mean \"voltage_noise_corner\"?)",
                       Error);
}

TEST_CASE("a resistor technology reads its noise index; tempco and tolerance") {
  const char* text =
      R"({"kind": "resistor_technology", "class": "thin film", "illustrative": "x",
                         "noise_index_dB": -35, "temperature_coefficient_per_C": "25 ppm", "tolerance": "0.1%"})";
  const ResistorTechnology t = ParseResistorTechnology(text, "r.json");
  CHECK(t.noise_index_db == -35);
  CHECK(t.tempco_per_k == doctest::Approx(25e-6));
  CHECK(t.tolerance == doctest::Approx(1e-3));
}

TEST_CASE("offset_distribution is uniform by default and may say gaussian") {
  const std::string core =
      R"({"kind": "opamp", "class": "c", "illustrative": "x",
      "parameters": {"voltage_noise": "1n", "current_noise": "1p", "gbw": "1M", "open_loop_gain": "1M")";
  CHECK(ParseOpAmpDevice(core + "}}", "x.json").offset_distribution ==
        OffsetDistribution::kUniform);
  CHECK(ParseOpAmpDevice(core + R"(, "offset_distribution": "gaussian"}})",
                         "x.json")
            .offset_distribution == OffsetDistribution::kGaussian);
  CHECK_THROWS_WITH_AS(
      ParseOpAmpDevice(core + R"(, "offset_distribution": "normal"}})",
                       "x.json"),
      "x.json: /parameters/offset_distribution: expected \"uniform\" (within "
      "the values, "
      "read as maxima) or \"gaussian\" (the values as sigma), got \"normal\"",
      Error);
}

// The label protects the shipped data: every class file in devices/ says
// its values are illustrative, not the data of any real part (mission rule).
TEST_CASE("every shipped device file keeps its illustrative label") {
  const DeviceLibrary lib = LoadDeviceLibrary(HUSHGAIN_SOURCE_DIR "/devices");
  REQUIRE(lib.opamp_files.size() == lib.opamps.size());
  REQUIRE(lib.resistor_files.size() == lib.resistors.size());
  for (const auto* files : {&lib.opamp_files, &lib.resistor_files})
    for (const auto& [name, info] : *files) {
      CAPTURE(name);
      CHECK(info.illustrative.find("illustrative") != std::string::npos);
      CHECK(info.illustrative.find("not the data of any real part") !=
            std::string::npos);
      CHECK(info.source.empty());
    }
}

TEST_CASE("a user's part needs no illustrative line and keeps its source") {
  const char* text = R"({"kind": "opamp", "class": "my bench part",
      "source": "datasheet rev C, typical curves at 25 C",
      "parameters": {"voltage_noise": "4n", "current_noise": "0.4p",
                     "gbw": "8M", "open_loop_gain": "120 dB"}})";
  DeviceFileInfo info;
  const OpAmpModel m = ParseOpAmpDevice(text, "mine.json", &info);
  CHECK(m.class_name == "my bench part");
  CHECK(info.illustrative.empty());
  CHECK(info.source == "datasheet rev C, typical curves at 25 C");
  CHECK(info.path == "mine.json");
}

TEST_CASE("the FET and CMOS classes' current noise follows the bias current") {
  const DeviceLibrary lib = LoadDeviceLibrary(HUSHGAIN_SOURCE_DIR "/devices");
  for (const char* name : {"jfet-input", "cmos-general", "electrometer-cmos"}) {
    CAPTURE(name);
    CHECK(lib.opamps.at(name).current_noise_temperature ==
          CurrentNoiseTemperature::kWithBiasCurrent);
  }
  for (const char* name :
       {"low-noise-bipolar", "precision-bipolar", "zero-drift"}) {
    CAPTURE(name);
    CHECK(lib.opamps.at(name).current_noise_temperature ==
          CurrentNoiseTemperature::kConstant);
  }
}

const std::string kTableCore =
    R"({"kind": "opamp", "class": "c", "parameters": {"current_noise": "1f",
        "gbw": "1M", "open_loop_gain": "1M", )";

TEST_CASE("noise tables read values with units and replace the white level") {
  const OpAmpModel m = ParseOpAmpDevice(
      kTableCore + R"("voltage_noise_table": [["10", "40 nV/rtHz"],
          ["100 Hz", 12e-9], ["1k", "8n"]],
          "current_noise_table": [[1, "1f"], [1e4, "30 fA/rtHz"]],
          "noise_table_ends": "flat",
          "current_noise_temperature": "with_bias_current"}})",
      "x.json");
  CHECK(m.e_w_v_per_rthz == 0);  // the table alone describes e_n
  // current_noise is given beside its table: the two add.
  CHECK(m.i_w_a_per_rthz == doctest::Approx(1e-15));
  REQUIRE(m.voltage_noise_table.f_hz.size() == 3);
  CHECK(m.voltage_noise_table.f_hz[1] == doctest::Approx(100));
  CHECK(m.voltage_noise_table.density[0] == doctest::Approx(40e-9));
  CHECK(m.voltage_noise_table.ends == TableEnds::kFlat);
  CHECK(m.current_noise_table.ends == TableEnds::kFlat);
  CHECK(m.current_noise_table.density[1] == doctest::Approx(30e-15));
  CHECK(m.current_noise_temperature ==
        CurrentNoiseTemperature::kWithBiasCurrent);
  // Given beside its white level, a table adds on top.
  const OpAmpModel both = ParseOpAmpDevice(
      kTableCore +
          R"("voltage_noise": "5n", "voltage_noise_table": [[1, "1u"], [100, "10n"]]}})",
      "x.json");
  CHECK(both.e_w_v_per_rthz == doctest::Approx(5e-9));
  CHECK(both.voltage_noise_table.ends == TableEnds::kSlope);  // the default
  CHECK(both.current_noise_temperature == CurrentNoiseTemperature::kConstant);
}

TEST_CASE("a bad noise table is refused with the path of the bad point") {
  struct Case {
    const char* table;
    const char* message;
  };
  const Case cases[] = {
      {R"([[10, "5n"]])",
       "x.json: /parameters/voltage_noise_table: expected at least two points "
       "[frequency, density], got 1"},
      {R"([[10, "5n"], [100, "4n"], [50, "4n"]])",
       "x.json: /parameters/voltage_noise_table/2/0: expected a frequency "
       "above "
       "the previous point's (100.0 Hz), got 50"},
      {R"([[10, "5n"], [10, "4n"]])",
       "x.json: /parameters/voltage_noise_table/1/0: expected a frequency "
       "above "
       "the previous point's (10.00 Hz), got 10"},
      {R"([[10, "5n"], [100, 0]])",
       "x.json: /parameters/voltage_noise_table/1/1: expected a positive "
       "voltage noise density, got 0"},
      {R"([[10, "5n"], [100, "loud"]])",
       "x.json: /parameters/voltage_noise_table/1/1: expected a voltage noise "
       "density, got \"loud\" (no number)"},
      {R"([[0, "5n"], [100, "4n"]])",
       "x.json: /parameters/voltage_noise_table/0/0: expected a positive "
       "frequency, got 0"},
      {R"([[10, "5n"], [100]])",
       "x.json: /parameters/voltage_noise_table/1: expected a point "
       "[frequency, "
       "density], got an array of 1"},
      {R"({"10": "5n"})",
       "x.json: /parameters/voltage_noise_table: expected a table [[frequency, "
       "density], ...], got an object"},
  };
  for (const Case& c : cases) {
    CAPTURE(c.table);
    CHECK_THROWS_WITH_AS(
        ParseOpAmpDevice(
            kTableCore + R"("voltage_noise_table": )" + c.table + "}}",
            "x.json"),
        c.message, Error);
  }
  CHECK_THROWS_WITH_AS(
      ParseOpAmpDevice(kTableCore + R"("voltage_noise": "1n",
          "current_noise_temperature": "shot"}})",
                       "x.json"),
      "x.json: /parameters/current_noise_temperature: expected "
      "\"with_bias_current\" (i_n^2 follows the bias current) or "
      "\"constant\", got \"shot\"",
      Error);
  CHECK_THROWS_WITH_AS(
      ParseOpAmpDevice(kTableCore + R"("voltage_noise": "1n",
          "noise_table_ends": "zero"}})",
                       "x.json"),
      "x.json: /parameters/noise_table_ends: expected \"slope\" (the end "
      "segments continue) or \"flat\" (the end values continue), got \"zero\"",
      Error);
  CHECK_THROWS_WITH_AS(
      ParseOpAmpDevice(kTableCore + "\"gain\": 1}}", "x.json"),
      "x.json: /parameters/voltage_noise: missing (required, or "
      "\"voltage_noise_table\")",
      Error);
}

TEST_CASE(
    "the device template lists every key and loads once its comments go") {
  const std::string path =
      HUSHGAIN_SOURCE_DIR "/devices/opamps/TEMPLATE.json.example";
  const std::string text = ReadTextFile(path);
  // The user's step: delete every line that starts with //.
  std::istringstream lines(text);
  std::string line, json;
  while (std::getline(lines, line)) {
    const std::size_t first = line.find_first_not_of(' ');
    if (first != std::string::npos && line.compare(first, 2, "//") == 0)
      continue;
    json += line + "\n";
  }
  DeviceFileInfo info;
  const OpAmpModel m = ParseOpAmpDevice(json, path, &info);
  CHECK(info.illustrative.empty());
  CHECK_FALSE(info.source.empty());
  CHECK_FALSE(m.voltage_noise_table.empty());
  CHECK_FALSE(m.current_noise_table.empty());
  for (const std::string& key : OpAmpParameterKeys()) {
    CAPTURE(key);
    CHECK(json.find("\"" + key + "\":") != std::string::npos);
  }
}

}  // namespace
}  // namespace hushgain
