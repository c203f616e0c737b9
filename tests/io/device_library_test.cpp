#include "io/device_library.h"

#include <doctest/doctest.h>

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

}  // namespace
}  // namespace hushgain
