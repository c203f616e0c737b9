#include "io/stage_parser.h"

#include <doctest/doctest.h>

#include <map>

#include "circuit/feedback_network.h"
#include "test_support.h"

namespace hushgain {
namespace {

using test::RelErr;

DeviceLibrary Library() {
  DeviceLibrary lib;
  OpAmpModel m;
  m.class_name = "test class";
  m.e_w_v_per_rthz = 4e-9;
  m.i_w_a_per_rthz = 1e-12;
  m.gbw_hz = 8e6;
  m.open_loop_gain = 1e6;
  lib.opamps["precision-bipolar"] = m;
  lib.opamps["low-noise-bipolar"] = m;
  lib.resistors["thin-film"] = {"thin film", -35, 25e-6, 0.001};
  lib.resistors["thick-film"] = {"thick film", -10, 100e-6, 0.01};
  return lib;
}

const DeviceLibrary& SharedLibrary() {
  static const DeviceLibrary lib = Library();
  return lib;
}

Stage Parse(const std::string& text,
            std::map<std::string, std::string> files = {}) {
  StageContext context;
  context.library = &SharedLibrary();
  context.read_file = [files](const std::string& path) {
    auto it = files.find(path);
    if (it == files.end())
      throw Error(path, "", "cannot read: No such file or directory");
    return it->second;
  };
  return ParseStage(text, "stage.json", context);
}

const char* kGood = R"({
  "name": "load-cell bridge preamp",
  "temperature_C": 25,
  "band_Hz": {"low": "0.1", "high": "1k"},
  "opamp": {"device": "precision-bipolar", "set": {"gbw": "2 MHz"}},
  "source": {"voltage": {"resistance": "350"}},
  "stage": {
    "topology": "inverting",
    "input_resistor": "2.2k",
    "feedback": {"tee": {"r1": "47k", "r2": "47k", "r3": "1.1k"}, "capacitor": "10p"},
    "plus_resistor": "auto",
    "load": "10k"
  },
  "full_scale_output_V": 4
})";

// Replaces the first occurrence of `from` in `text`.
std::string Replace(std::string text, const std::string& from,
                    const std::string& to) {
  std::size_t at = text.find(from);
  REQUIRE(at != std::string::npos);
  return text.replace(at, from.size(), to);
}

// Replaces the first occurrence of `from` in kGood.
std::string Good(const std::string& from, const std::string& to) {
  std::string s = kGood;
  std::size_t at = s.find(from);
  REQUIRE(at != std::string::npos);
  return s.replace(at, from.size(), to);
}

TEST_CASE("a stage file resolves every value to SI") {
  const Stage s = Parse(kGood);
  CHECK(s.name == "load-cell bridge preamp");
  CHECK(RelErr(s.temperature_k, 298.15) < test::kRelTight);
  CHECK(s.band_low_hz == doctest::Approx(0.1));
  CHECK(s.band_high_hz == 1e3);
  CHECK_FALSE(s.reference_hz.has_value());
  CHECK(RelErr(ReferenceFrequencyHz(s), 10.0) < test::kRelTight);
  CHECK(s.opamp.gbw_hz == 2e6);           // overridden
  CHECK(s.opamp.e_w_v_per_rthz == 4e-9);  // from the device
  CHECK(s.source.resistance_ohm == 350);
  CHECK(s.input_resistor_ohm == 2.2e3);
  CHECK(s.feedback.kind == Feedback::Kind::kTee);
  CHECK(s.feedback.tee.r3_ohm == 1.1e3);
  CHECK(RelErr(s.feedback.capacitor_f, 10e-12) < test::kRelTight);
  CHECK(s.plus_resistor.mode == PlusResistor::Mode::kAuto);
  CHECK(*s.load_ohm == 10e3);
  CHECK(*s.full_scale_output_v == 4);
  CHECK(RelErr(FeedbackEquivalentOhm(s.feedback),
               47e3 + 47e3 + 47e3 * 47e3 / 1.1e3) < test::kRelTight);
}

TEST_CASE("an op-amp can come inline or from a device file by path") {
  const Stage inline_stage = Parse(Good(
      R"("device": "precision-bipolar", "set": {"gbw": "2 MHz"})",
      R"("set": {"voltage_noise": "3n", "current_noise": "1p", "open_loop_gain": "120 dB", "gbw": "5M"})"));
  CHECK(inline_stage.opamp.open_loop_gain == doctest::Approx(1e6));
  CHECK(inline_stage.opamp.class_name == "inline parameters");

  const std::string device =
      R"({"kind": "opamp", "class": "my class", "illustrative": "x",
    "parameters": {"voltage_noise": "7n", "current_noise": "2f", "open_loop_gain": 1e5, "gbw": "3M"}})";
  const Stage from_path = Parse(Good(R"("device": "precision-bipolar")",
                                     R"("device": "parts/mine.json")"),
                                {{"parts/mine.json", device}});
  CHECK(from_path.opamp.class_name == "my class");
  CHECK(from_path.opamp.e_w_v_per_rthz == doctest::Approx(7e-9));
  CHECK(from_path.opamp.gbw_hz == 2e6);  // "set" still applies on top
}

TEST_CASE("bad stage files name the file and the JSON path") {
  struct Case {
    std::string text;
    std::string message;
  };
  const Case cases[] = {
      {Good(R"("r2": "47k")", R"("r2": "ten")"),
       R"(stage.json: /stage/feedback/tee/r2: expected a resistance, got "ten" (no number))"},
      {Good(R"("input_resistor": "2.2k")", R"("input_resistor": "-2.2k")"),
       R"(stage.json: /stage/input_resistor: expected a positive resistance, got "-2.2k")"},
      {Good(R"("input_resistor": "2.2k")", R"("input_resistor": 0)"),
       R"(stage.json: /stage/input_resistor: expected a positive resistance, got 0)"},
      {Good(R"("load": "10k")", R"("load": "10 kV")"),
       R"(stage.json: /stage/load: expected a resistance, got "10 kV" (unknown unit "kV"))"},
      {Good(R"("load": "10k")", R"("load": true)"),
       R"(stage.json: /stage/load: expected a resistance, got a boolean)"},
      {Good(R"("low": "0.1")", R"("low": "2k")"),
       R"(stage.json: /band_Hz/high: expected a frequency above the low edge (2.000 kHz), got "1k")"},
      {Good(R"("low": "0.1")", R"("low": 0)"),
       R"(stage.json: /band_Hz/low: expected a positive frequency (1/f noise diverges at 0 Hz), got 0)"},
      {Good(R"("device": "precision-bipolar")",
            R"("device": "precision-bipolr")"),
       R"(stage.json: /opamp/device: unknown op-amp device "precision-bipolr" (did you mean "precision-bipolar"?))"},
      {Good(R"("load": "10k")", R"("lod": "10k")"),
       R"(stage.json: /stage/lod: unknown key (did you mean "load"?))"},
      {Good(R"("input_resistor": "2.2k",)", ""),
       R"(stage.json: /stage/input_resistor: missing (required))"},
      {Good(R"("band_Hz")", R"("band_hz")"),
       R"(stage.json: /band_Hz: missing (required; is "band_hz" a typo?))"},
      {Good(R"("topology": "inverting")", R"("topology": "inverter")"),
       R"(stage.json: /stage/topology: unknown topology "inverter" (did you mean "inverting"?))"},
      {Good(R"("tee": {"r1": "47k", "r2": "47k", "r3": "1.1k"})",
            R"("resistor": "1M", "tee": {})"),
       R"(stage.json: /stage/feedback: expected exactly one of "resistor" or "tee")"},
      {Good(R"("gbw": "2 MHz")", R"("gbw": "-2 MHz")"),
       R"(stage.json: /opamp/set/gbw: expected a positive frequency, got "-2 MHz")"},
      {Good(R"("temperature_C": 25)", R"("temperature_C": -300)"),
       R"(stage.json: /temperature_C: expected a temperature above -273.15 °C and below 1000 °C, got -300)"},
      {Good(R"("plus_resistor": "auto")", R"("plus_resistor": "automatic")"),
       R"(stage.json: /stage/plus_resistor: expected a resistance, got "automatic" (no number))"},
      {"{\n  \"name\": \"x\",\n  oops\n}",
       R"(stage.json: malformed JSON at line 3, column 3: invalid literal; expected string literal)"},
      {"[1, 2]", R"(stage.json: /: expected an object, got an array)"},
  };
  for (const Case& c : cases) {
    CAPTURE(c.text);
    CHECK_THROWS_WITH_AS(Parse(c.text), c.message.c_str(), Error);
  }
}

TEST_CASE("a device path that cannot be read is an error at /opamp/device") {
  CHECK_THROWS_WITH_AS(
      Parse(Good(R"("device": "precision-bipolar")",
                 R"("device": "nowhere/x.json")")),
      R"(stage.json: /opamp/device: cannot read: No such file or directory (nowhere/x.json))",
      Error);
}

TEST_CASE(
    "a temperature range, resistor technologies, a DC input and a bypass are "
    "read") {
  const Stage s = Parse(
      Replace(Good(R"("temperature_C": 25,)",
                   R"("temperature_C": {"min": -20, "nominal": 30, "max": 70},
      "dc_input": "-5m",
      "resistors": {"technology": "thin-film", "tolerance": "0.05%",
                    "R3": {"technology": "thick-film"}, "R_plus": {"tolerance": "1%"}},)"),
              R"("plus_resistor": "auto",)",
              R"("plus_resistor": "auto", "plus_resistor_bypass": "10u",)"));
  CHECK(RelErr(s.temperature_k, 303.15) < test::kRelTight);
  REQUIRE(s.temperature_range.has_value());
  CHECK(RelErr(s.temperature_range->min_k, 253.15) < test::kRelTight);
  CHECK(RelErr(s.temperature_range->max_k, 343.15) < test::kRelTight);
  CHECK(RelErr(s.dc_input, -5e-3) < test::kRelTight);
  CHECK(RelErr(s.plus_resistor_bypass_f, 10e-6) < test::kRelTight);
  REQUIRE(s.resistors.has_value());
  CHECK(s.resistors->technology.class_name == "thin film");
  CHECK(RelErr(s.resistors->tolerance, 5e-4) < test::kRelTight);
  // R3 takes the thick film's own tolerance; R_plus inherits thin film.
  CHECK(ResistorSpecFor(s, "R3")->technology.class_name == "thick film");
  CHECK(RelErr(ResistorSpecFor(s, "R3")->tolerance, 0.01) < test::kRelTight);
  CHECK(ResistorSpecFor(s, "R_plus")->technology.class_name == "thin film");
  CHECK(RelErr(ResistorSpecFor(s, "R_plus")->tolerance, 0.01) <
        test::kRelTight);
  CHECK(ResistorSpecFor(s, "R1")->technology.class_name == "thin film");
  // The source's resistance belongs to the sensor: no spec unless named.
  CHECK(ResistorSpecFor(s, "R_source") == nullptr);
}

TEST_CASE(
    "bad temperature ranges and resistor blocks are whole-message errors") {
  struct Case {
    std::string text;
    std::string message;
  };
  const Case cases[] = {
      {Good(R"("temperature_C": 25)",
            R"("temperature_C": {"min": 70, "max": -20})"),
       R"(stage.json: /temperature_C: expected min <= nominal <= max, got min 70, nominal 25, max -20)"},
      {Good(R"("temperature_C": 25)",
            R"("temperature_C": {"min": 0, "nominal": 80, "max": 70})"),
       R"(stage.json: /temperature_C: expected min <= nominal <= max, got min 0, nominal 80, max 70)"},
      {Good(R"("temperature_C": 25)",
            R"("temperature_C": {"min": 0, "max": 70, "typ": 20})"),
       R"(stage.json: /temperature_C/typ: unknown key)"},
      {Good(R"("temperature_C": 25,)",
            R"("resistors": {"technology": "thin-flim"},)"),
       R"(stage.json: /resistors/technology: unknown resistor technology "thin-flim" (did you mean "thin-film"?))"},
      {Good(R"("temperature_C": 25,)",
            R"("resistors": {"technology": "thin-film", "tolerance": "-1%"},)"),
       R"(stage.json: /resistors/tolerance: expected a tolerance from 0 to below 100 %, got "-1%")"},
      {Good(R"("temperature_C": 25,)",
            R"("resistors": {"technology": "thin-film", "R_fb": {}},)"),
       R"(stage.json: /resistors/R_fb: unknown resistor name (did you mean "R_f"?) (expected "technology", "tolerance" or a resistor: R_in, R_f, R1, R2, R3, R_plus, R_load, R_source, R_sh, R_s, R_leak))"},
      {Good(R"("temperature_C": 25,)",
            R"("resistors": {"technology": "thin-film", "R_f": {}},)"),
       R"(stage.json: /resistors/R_f: this stage has no R_f)"},
      {Good(R"("temperature_C": 25,)",
            R"("resistors": {"R1": {"tolerance": "1%"}},)"),
       R"(stage.json: /resistors/R1/technology: missing (required))"},
      {Replace(Good(R"("load": "10k")",
                    R"("load": "10k", "plus_resistor_bypass": "1u")"),
               R"("plus_resistor": "auto",)", ""),
       R"(stage.json: /stage/plus_resistor_bypass: needs a "plus_resistor" to bypass)"},
  };
  for (const Case& c : cases) {
    CAPTURE(c.text);
    CHECK_THROWS_WITH_AS(Parse(c.text), c.message.c_str(), Error);
  }
}

}  // namespace
}  // namespace hushgain

namespace hushgain {
namespace {

const char* kReceiver = R"({
  "name": "receiver",
  "band_Hz": {"low": "1", "high": "10k"},
  "opamp": {"device": "precision-bipolar"},
  "source": {"photodiode": {"capacitance": "100p", "responsivity": "0.5 A/W",
                            "optical_power": "2 uW", "reverse_bias": "5",
                            "bias_noise": "20 nV/rtHz", "dark_current": "1n",
                            "series_resistance": "50", "doubling_interval_C": 8}},
  "stage": {"topology": "transimpedance", "feedback": {"resistor": "1M"}}
})";

TEST_CASE("a photodiode's light, bias, series resistance and doubling law") {
  const Stage s = Parse(kReceiver);
  // optical power x responsivity: 2 uW x 0.5 A/W = 1 uA.
  CHECK(RelErr(s.photodiode.photocurrent_a, 1e-6) < test::kRelTight);
  CHECK(s.photodiode.reverse_bias_v == 5);
  CHECK(RelErr(s.photodiode.bias_noise_v_per_rthz, 20e-9) < test::kRelTight);
  CHECK(s.photodiode.series_resistance_ohm == 50);
  CHECK(s.photodiode.doubling_interval_k == 8);
  const Stage plain =
      Parse(Replace(Replace(Replace(kReceiver, R"("optical_power": "2 uW")",
                                    R"("photocurrent": "3n")"),
                            R"("bias_noise": "20 nV/rtHz",)", ""),
                    R"("reverse_bias": "5",)", ""));
  CHECK(RelErr(plain.photodiode.photocurrent_a, 3e-9) < test::kRelTight);
  CHECK(plain.photodiode.reverse_bias_v == 0);  // zero bias by default
  CHECK(Parse(Replace(kReceiver, R"(, "doubling_interval_C": 8)", ""))
            .photodiode.doubling_interval_k == 10);
}

TEST_CASE("bad photodiode keys name the JSON path") {
  const std::string pd = "stage.json: /source/photodiode/";
  const std::vector<std::pair<std::string, std::string>> cases = {
      {Replace(kReceiver, R"("optical_power": "2 uW")",
               R"("optical_power": "2 uW", "photocurrent": "1n")"),
       pd +
           R"(optical_power: expected "photocurrent" or "optical_power", not both)"},
      {Replace(kReceiver, R"("responsivity": "0.5 A/W",)", ""),
       pd + R"(optical_power: needs a "responsivity" beside it (A/W))"},
      {Replace(kReceiver, R"("optical_power": "2 uW")",
               R"("photocurrent": "-1n")"),
       pd + R"(photocurrent: expected a non-negative current, got "-1n")"},
      {Replace(kReceiver, R"("reverse_bias": "5")", R"("reverse_bias": "-5")"),
       pd +
           R"(reverse_bias: expected a non-negative voltage (0 = zero bias), got "-5")"},
      {Replace(kReceiver, R"("reverse_bias": "5",)", ""),
       pd +
           R"(bias_noise: needs a positive "reverse_bias" (at zero bias the diode returns to ground, no supply))"},
      {Replace(kReceiver, R"("doubling_interval_C": 8)",
               R"("doubling_interval_C": 0)"),
       pd +
           R"(doubling_interval_C: expected a positive interval in °C, got 0)"},
      {Replace(kReceiver, R"("series_resistance": "50")",
               R"("series_resistance": "0")"),
       pd + R"(series_resistance: expected a positive resistance, got "0")"},
      {Replace(kReceiver, R"("name": "receiver",)",
               R"("name": "receiver", "dc_input": "1n",)"),
       R"(stage.json: /dc_input: not with the photodiode's photocurrent (it is the input's DC level); give one of them)"},
  };
  for (const auto& [text, message] : cases) {
    CAPTURE(text);
    CHECK_THROWS_WITH_AS(Parse(text), message.c_str(), Error);
  }
}

TEST_CASE("the sensor's own noise and its sensitivity, in the source's units") {
  const Stage v = Parse(Good(R"("source": {"voltage": {"resistance": "350"}})",
                             R"("source": {"voltage": {"resistance": "350"},
                    "noise": {"density": "12 nV/rtHz", "corner": "3 Hz"},
                    "sensitivity": {"value": "2 mV", "per": "V"}})"));
  REQUIRE(v.sensor_noise);
  CHECK(RelErr(v.sensor_noise->density, 12e-9) < test::kRelTight);
  CHECK(v.sensor_noise->corner_hz == 3);
  REQUIRE(v.sensitivity);
  CHECK(RelErr(v.sensitivity->value, 2e-3) < test::kRelTight);
  CHECK(v.sensitivity->per == "V");
  CHECK_FALSE(Parse(kGood).sensor_noise);
  CHECK_FALSE(Parse(kGood).sensitivity);

  // A photodiode's noise is a current; its sensitivity per W is its
  // responsivity, which it supplies when the diode does not give one.
  const Stage pd = Parse(
      Replace(Replace(Replace(kReceiver, R"("responsivity": "0.5 A/W",)", ""),
                      R"("optical_power": "2 uW")", R"("photocurrent": "1n")"),
              R"("doubling_interval_C": 8})",
              R"("doubling_interval_C": 8}, "noise": {"density": "3 fA/rtHz"},
         "sensitivity": {"value": "0.55 A", "per": "W"})"));
  REQUIRE(pd.sensor_noise);
  CHECK(RelErr(pd.sensor_noise->density, 3e-15) < test::kRelTight);
  CHECK(pd.sensor_noise->corner_hz == 0);
  CHECK(RelErr(pd.photodiode.responsivity_a_per_w, 0.55) < test::kRelTight);
}

TEST_CASE("bad sensor noise and sensitivity name the JSON path") {
  const std::string voltage = R"("source": {"voltage": {"resistance": "350"}})";
  auto with = [&](const std::string& extra) {
    return Good(voltage, R"("source": {"voltage": {"resistance": "350"}, )" +
                             extra + "}");
  };
  const std::vector<std::pair<std::string, std::string>> cases = {
      {with(R"("noise": {"density": "1 pA/rtHz"})"),
       R"(stage.json: /source/noise/density: expected a voltage noise density, got "1 pA/rtHz" (unknown unit "pA/rtHz"))"},
      {with(R"("noise": {"density": "-1n"})"),
       R"(stage.json: /source/noise/density: expected a non-negative voltage density, got "-1n")"},
      {with(R"("noise": {"density": "1n", "corner": "-1"})"),
       R"(stage.json: /source/noise/corner: expected a non-negative frequency (0 = white), got "-1")"},
      {with(R"("noise": {"corner": "1"})"),
       R"(stage.json: /source/noise/density: missing (required))"},
      {with(R"("sensitivity": {"value": "10 pC", "per": "g"})"),
       R"(stage.json: /source/sensitivity/value: expected a voltage, got "10 pC" (unknown unit "pC"))"},
      {with(R"("sensitivity": {"value": "0", "per": "g"})"),
       R"(stage.json: /source/sensitivity/value: expected a positive voltage per unit of the measurand, got "0")"},
      {with(R"("sensitivity": {"value": "1m", "per": "m/s 2"})"),
       R"(stage.json: /source/sensitivity/per: expected the measurand's unit, a short word without spaces ("g", "Pa", "W"), got "m/s 2")"},
      {Replace(
           kReceiver, R"("doubling_interval_C": 8})",
           R"("doubling_interval_C": 8}, "sensitivity": {"value": "0.6 A", "per": "W"})"),
       R"(stage.json: /source/sensitivity: expected the photodiode's responsivity (0.5 A/W) when per "W", got 0.6 A/W)"},
  };
  for (const auto& [text, message] : cases) {
    CAPTURE(text);
    CHECK_THROWS_WITH_AS(Parse(text), message.c_str(), Error);
  }
}

}  // namespace
}  // namespace hushgain

namespace hushgain {
namespace {

// kGood with a capacitive sensor in place of the voltage source and
// `input` as the stage's input resistor line ("" for none).
std::string Capacitive(const std::string& sensor,
                       const std::string& input = "") {
  return Replace(Good(R"("source": {"voltage": {"resistance": "350"}})",
                      R"("source": )" + sensor),
                 R"("input_resistor": "2.2k",)", input);
}

TEST_CASE("a capacitive sensor with and without an input resistor") {
  const Stage s = Parse(Capacitive(
      R"({"capacitive": {"capacitance": "1.2n", "leakage_resistance": "20G"},
          "sensitivity": {"value": "10 pC", "per": "g"}})"));
  REQUIRE(s.capacitive);
  CHECK(RelErr(s.capacitive->capacitance_f, 1.2e-9) < test::kRelTight);
  CHECK(RelErr(s.capacitive->leakage_resistance_ohm, 20e9) < test::kRelTight);
  CHECK(s.input_resistor_ohm == 0);
  REQUIRE(s.sensitivity);
  CHECK(s.sensitivity->in_charge);
  CHECK(RelErr(s.sensitivity->value, 10e-12) < test::kRelTight);

  const Stage r = Parse(Capacitive(
      R"({"capacitive": {"capacitance": "1n"},
          "sensitivity": {"value": "2 mV", "per": "Pa"}})",
      R"("input_resistor": "10k",)"));
  REQUIRE(r.capacitive);
  CHECK(r.capacitive->leakage_resistance_ohm == 0);
  CHECK(RelErr(r.input_resistor_ohm, 10e3) < test::kRelTight);
  REQUIRE(r.sensitivity);
  CHECK_FALSE(r.sensitivity->in_charge);
  CHECK(RelErr(r.sensitivity->value, 2e-3) < test::kRelTight);
  CHECK_FALSE(Parse(kGood).capacitive);
}

TEST_CASE("bad capacitive sensors name the JSON path") {
  const std::vector<std::pair<std::string, std::string>> cases = {
      {Capacitive(R"({"capacitive": {"leakage_resistance": "1G"}})"),
       R"(stage.json: /source/capacitive/capacitance: missing (required))"},
      {Capacitive(R"({"capacitive": {"capacitance": "0"}})"),
       R"(stage.json: /source/capacitive/capacitance: expected a positive capacitance, got "0")"},
      {Capacitive(
           R"({"capacitive": {"capacitance": "1n", "leakage_resistance": "-1G"}})"),
       R"(stage.json: /source/capacitive/leakage_resistance: expected a positive resistance, got "-1G")"},
      {Capacitive(
           R"({"capacitive": {"capacitance": "1n", "leakage_resistence": "1G"}})"),
       R"(stage.json: /source/capacitive/leakage_resistence: unknown key (did you mean "leakage_resistance"?))"},
      {Capacitive(
           R"({"capacitive": {"capacitance": "1n"}, "voltage": {"resistance": "1k"}})"),
       R"(stage.json: /source: expected exactly one of "voltage" or "capacitive" for an inverting stage)"},
      {Capacitive(R"({"noise": {"density": "1n"}})"),
       R"(stage.json: /source: expected exactly one of "voltage" or "capacitive" for an inverting stage)"},
      {Capacitive(R"({"capacitive": {"capacitance": "1n"},
                      "sensitivity": {"value": "10p", "per": "g"}})"),
       R"(stage.json: /source/sensitivity/value: expected a charge ("10 pC") or a voltage ("2 mV") with its unit, got "10p")"},
      {Capacitive(R"({"capacitive": {"capacitance": "1n"},
                      "sensitivity": {"value": 1e-11, "per": "g"}})"),
       R"(stage.json: /source/sensitivity/value: expected a charge ("10 pC") or a voltage ("2 mV") with its unit, got 1e-11)"},
      {Capacitive(R"({"capacitive": {"capacitance": "1n"},
                      "sensitivity": {"value": "10 pA", "per": "g"}})"),
       R"(stage.json: /source/sensitivity/value: expected a charge ("10 pC") or a voltage ("2 mV") with its unit, got "10 pA")"},
      {Capacitive(R"({"capacitive": {"capacitance": "1n"},
                      "sensitivity": {"value": "-10 pC", "per": "g"}})"),
       R"(stage.json: /source/sensitivity/value: expected a positive charge per unit of the measurand, got "-10 pC")"},
      {Replace(Capacitive(R"({"capacitive": {"capacitance": "1n"}})"),
               R"("capacitor": "10p")", R"("capacitor": "auto")"),
       R"(stage.json: /stage/feedback/capacitor: "auto" is not for a capacitive sensor: C_f sets its charge gain (-1/C_f); give a capacitance)"},
      {Replace(Capacitive(R"({"capacitive": {"capacitance": "1n"}})"),
               R"("full_scale_output_V": 4)",
               R"("full_scale_output_V": 4, "dc_input": "1")"),
       R"(stage.json: /dc_input: not with a capacitive sensor (its capacitance passes no DC))"},
      {Good(R"("input_resistor": "2.2k",)", ""),
       R"(stage.json: /stage/input_resistor: missing (required))"},
  };
  for (const auto& [text, message] : cases) {
    CAPTURE(text);
    CHECK_THROWS_WITH_AS(Parse(text), message.c_str(), Error);
  }
}

TEST_CASE("a capacitive sensor's leakage takes a resistor override") {
  const Stage s = Parse(Replace(
      Capacitive(
          R"({"capacitive": {"capacitance": "1n", "leakage_resistance": "5G"}})"),
      R"("full_scale_output_V": 4)",
      R"("full_scale_output_V": 4,
         "resistors": {"technology": "thin-film",
                       "R_leak": {"technology": "thick-film"}})"));
  REQUIRE(s.resistor_overrides.count("R_leak") == 1);
  CHECK(s.resistor_overrides.at("R_leak").technology_name == "thick-film");
  // The leakage is the sensor's: the stage's technology does not reach it.
  Stage no_override = s;
  no_override.resistor_overrides.clear();
  CHECK(ResistorSpecFor(no_override, "R_leak") == nullptr);
  CHECK(ResistorSpecFor(no_override, "R_f") != nullptr);
}

}  // namespace
}  // namespace hushgain

namespace hushgain {
namespace {

TEST_CASE("AC coupling: C3 in series with R3 and a capacitor with R_in") {
  const Stage s =
      Parse(Replace(Good(R"("r3": "1.1k"})", R"("r3": "1.1k", "c3": "47u"})"),
                    R"("input_resistor": "2.2k",)",
                    R"("input_resistor": "2.2k", "input_capacitor": "1u",)"));
  CHECK(RelErr(s.feedback.tee.c3_f, 47e-6) < test::kRelTight);
  CHECK(RelErr(s.input_capacitor_f, 1e-6) < test::kRelTight);
  const Stage plain = Parse(kGood);
  CHECK(plain.feedback.tee.c3_f == 0);
  CHECK(plain.input_capacitor_f == 0);
  // The DC path of the feedback is R1 + R2 with C3.
  CHECK(RelErr(FeedbackDcOhm(s.feedback), 94e3) < test::kRelTight);
  CHECK(RelErr(FeedbackDcTransresistanceOhm(s.feedback), 94e3) <
        test::kRelTight);
  CHECK(RelErr(FeedbackEquivalentOhm(s.feedback),
               47e3 + 47e3 + 47e3 * 47e3 / 1.1e3) < test::kRelTight);
}

TEST_CASE("bad coupling capacitors name the JSON path") {
  const std::vector<std::pair<std::string, std::string>> cases = {
      {Good(R"("r3": "1.1k"})", R"("r3": "1.1k", "c3": "0"})"),
       R"(stage.json: /stage/feedback/tee/c3: expected a positive capacitance, got "0")"},
      {Good(R"("r3": "1.1k"})", R"("r3": "1.1k", "c3": "1 kOhm"})"),
       R"(stage.json: /stage/feedback/tee/c3: expected a capacitance, got "1 kOhm" (unknown unit "kOhm"))"},
      {Good(R"("input_resistor": "2.2k",)",
            R"("input_resistor": "2.2k", "input_capacitor": "-1u",)"),
       R"(stage.json: /stage/input_capacitor: expected a positive capacitance, got "-1u")"},
      {Capacitive(R"({"capacitive": {"capacitance": "1n"}})",
                  R"("input_capacitor": "1u",)"),
       R"(stage.json: /stage/input_capacitor: needs an "input_resistor" to sit in series with)"},
  };
  for (const auto& [text, message] : cases) {
    CAPTURE(text);
    CHECK_THROWS_WITH_AS(Parse(text), message.c_str(), Error);
  }
}

}  // namespace
}  // namespace hushgain

namespace hushgain {
namespace {

// kGood with a capacitors block beside the resistors.
std::string WithCapacitors(const std::string& block) {
  return Good(R"("full_scale_output_V": 4)",
              R"("full_scale_output_V": 4, "capacitors": )" + block);
}

TEST_CASE("capacitor tolerances for spread, with overrides by name") {
  const Stage s = Parse(
      WithCapacitors(R"({"tolerance": "10 %", "C_f": {"tolerance": "1 %"}})"));
  CHECK(RelErr(s.capacitors.tolerance, 0.1) < test::kRelTight);
  CHECK(RelErr(CapacitorToleranceFor(s, "C_f"), 0.01) < test::kRelTight);
  CHECK(RelErr(CapacitorToleranceFor(s, "C3"), 0.1) < test::kRelTight);
  // The sensor's capacitance takes a tolerance only by name.
  CHECK(CapacitorToleranceFor(s, "C_s") == 0);
  CHECK(Parse(kGood).capacitors.tolerance == 0);
  CHECK(Parse(kGood).capacitors.overrides.empty());
}

TEST_CASE("bad capacitor blocks name the JSON path") {
  const std::vector<std::pair<std::string, std::string>> cases = {
      {WithCapacitors(R"({"tolerance": "120 %"})"),
       R"(stage.json: /capacitors/tolerance: expected a tolerance from 0 to below 100 %, got "120 %")"},
      {WithCapacitors(R"({"C_ff": {"tolerance": "1 %"}})"),
       R"(stage.json: /capacitors/C_ff: unknown capacitor name (did you mean "C_f"?) (expected "tolerance" or a capacitor: C_f, C3, C_input, C_plus, C_s, C_d))"},
      {WithCapacitors(R"({"C3": {"tolerance": "1 %"}})"),
       R"(stage.json: /capacitors/C3: this stage has no C3)"},
      {WithCapacitors(R"({"C_f": {}})"),
       R"(stage.json: /capacitors/C_f/tolerance: missing (required))"},
      {WithCapacitors(R"({"tolerance": "1 %", "technology": "film"})"),
       R"(stage.json: /capacitors/technology: unknown capacitor name (expected "tolerance" or a capacitor: C_f, C3, C_input, C_plus, C_s, C_d))"},
  };
  for (const auto& [text, message] : cases) {
    CAPTURE(text);
    CHECK_THROWS_WITH_AS(Parse(text), message.c_str(), Error);
  }
}

}  // namespace
}  // namespace hushgain
