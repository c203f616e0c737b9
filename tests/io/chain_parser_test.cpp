// The stage file's "chain" block (io/chain_parser.h): values to SI, the
// defaults, and every refusal as one whole message with its JSON path.
#include "io/chain_parser.h"

#include <doctest/doctest.h>

#include <map>
#include <string>
#include <utility>
#include <vector>

#include "cli/run_binary.h"
#include "io/stage_parser.h"
#include "test_support.h"

namespace hushgain {
namespace {

using test::RelErr;

// The one op-amp class the test stages name.
const DeviceLibrary& TestLibrary() {
  static const DeviceLibrary library = [] {
    DeviceLibrary lib;
    OpAmpModel m;
    m.class_name = "test class";
    m.e_w_v_per_rthz = 4e-9;
    m.gbw_hz = 8e6;
    m.open_loop_gain = 1e6;
    lib.opamps["precision-bipolar"] = m;
    return lib;
  }();
  return library;
}

Stage Parse(const std::string& chain) {
  StageContext context;
  context.library = &TestLibrary();
  context.read_file = [](const std::string& path) -> std::string {
    throw Error(path, "", "cannot read");
  };
  const std::string text = R"({
    "name": "chain test",
    "band_Hz": {"low": "10", "high": "10k"},
    "opamp": {"device": "precision-bipolar"},
    "stage": {"topology": "inverting", "input_resistor": "1k",
              "feedback": {"resistor": "100k"}})" +
                           (chain.empty() ? "" : ",\n    \"chain\": " + chain) +
                           "\n}";
  return ParseStage(text, "stage.json", context);
}

TEST_CASE("a chain block resolves its filter and converter to SI") {
  const Stage s = Parse(R"({
      "filter": {"kind": "butterworth", "order": 4, "cutoff": "20k",
                 "gain": "6 dB", "noise": "15 nV/rtHz"},
      "adc": {"bits": 16, "full_scale": "4.096", "sample_rate": "200k",
              "snr_dB": 90}})");
  REQUIRE(s.chain);
  REQUIRE(s.chain->filter);
  const ChainFilter& f = *s.chain->filter;
  CHECK(f.kind == ChainFilter::Kind::kButterworth);
  CHECK(f.order == 4);
  CHECK(RelErr(f.cutoff_hz, 20e3) < test::kRelTight);
  // 6 dB = 10^(6/20) = 1.99526.
  CHECK(RelErr(f.gain, std::pow(10.0, 6.0 / 20)) < test::kRelTight);
  CHECK(RelErr(f.noise_v_per_rthz, 15e-9) < test::kRelTight);
  const ChainAdc& adc = s.chain->adc;
  CHECK(adc.bits == 16);
  CHECK(RelErr(adc.full_scale_v, 4.096) < test::kRelTight);
  CHECK(RelErr(adc.sample_rate_hz, 200e3) < test::kRelTight);
  REQUIRE(adc.snr_db);
  CHECK(*adc.snr_db == 90);
  CHECK_FALSE(adc.input_noise_rms_v);
}

TEST_CASE("a chain without a filter and a single pole without an order") {
  const Stage bare =
      Parse(R"({"adc": {"bits": 12, "full_scale": 2, "sample_rate": "1M"}})");
  REQUIRE(bare.chain);
  CHECK_FALSE(bare.chain->filter);
  CHECK_FALSE(bare.chain->adc.snr_db);
  CHECK_FALSE(bare.chain->adc.input_noise_rms_v);
  const Stage pole = Parse(R"({
      "filter": {"kind": "single_pole", "cutoff": "5k"},
      "adc": {"bits": 12, "full_scale": 2, "sample_rate": "1M",
              "input_noise_rms": "100u"}})");
  REQUIRE(pole.chain->filter);
  CHECK(pole.chain->filter->order == 1);
  CHECK(pole.chain->filter->gain == 1);
  CHECK(RelErr(*pole.chain->adc.input_noise_rms_v, 1e-4) < test::kRelTight);
  CHECK_FALSE(Parse("").chain);
}

TEST_CASE("a second stage resolves its gain and its pole") {
  const Stage s = Parse(R"({
      "second_stage": {"gain": -10, "noise_gain": 11,
                       "bandwidth": {"gbw": "11M"},
                       "input_noise": {"density": "5n", "corner": "10"},
                       "input_current_noise": {"density": "1p"},
                       "source_resistance": "2k"},
      "adc": {"bits": 16, "full_scale": 4, "sample_rate": "100k"}})");
  REQUIRE(s.chain->second_stage);
  const SecondStage& st = *s.chain->second_stage;
  CHECK(st.gain == -10);
  CHECK(st.noise_gain == 11);
  CHECK(RelErr(st.gbw_hz, 11e6) < test::kRelTight);
  CHECK(RelErr(st.bandwidth_hz, 1e6) < test::kRelTight);  // GBW / NG
  CHECK(RelErr(st.input_noise.density, 5e-9) < test::kRelTight);
  CHECK(st.input_noise.corner_hz == 10);
  CHECK(RelErr(st.input_current_noise.density, 1e-12) < test::kRelTight);
  CHECK(st.input_current_noise.corner_hz == 0);
  CHECK(st.source_resistance_ohm == 2000);
  // Defaults: noise gain |gain|, flat.
  const Stage plain = Parse(R"({"second_stage": {"gain": "20 dB"},
      "adc": {"bits": 16, "full_scale": 4, "sample_rate": "100k"}})");
  CHECK(RelErr(plain.chain->second_stage->noise_gain, 10) < test::kRelTight);
  CHECK(plain.chain->second_stage->bandwidth_hz == 0);
}

TEST_CASE("bad chain blocks name the JSON path") {
  const std::string adc =
      R"("adc": {"bits": 16, "full_scale": 4, "sample_rate": "100k"})";
  auto filter = [&](const std::string& f) {
    return "{\"filter\": " + f + ", " + adc + "}";
  };
  auto converter = [](const std::string& a) {
    return R"({"adc": {"bits": 16, "full_scale": 4, )" + a + "}}";
  };
  const std::vector<std::pair<std::string, std::string>> cases = {
      {filter(R"({"kind": "buterworth", "order": 2, "cutoff": "1k"})"),
       R"(stage.json: /chain/filter/kind: unknown filter kind "buterworth" (did you mean "butterworth"?) (expected butterworth, bessel, single_pole or none))"},
      {filter(R"({"kind": "bessel", "order": 2, "cutof": "1k"})"),
       R"(stage.json: /chain/filter/cutoff: missing (required; is "cutof" a typo?))"},
      {filter(R"({"kind": "bessel", "order": 2, "cutoff": "1k", "gian": 2})"),
       R"(stage.json: /chain/filter/gian: unknown key (did you mean "gain"?))"},
      {filter(R"({"kind": "butterworth", "order": 2.5, "cutoff": "1k"})"),
       R"(stage.json: /chain/filter/order: expected a whole number from 1 to 10, got 2.5)"},
      {filter(R"({"kind": "butterworth", "order": 11, "cutoff": "1k"})"),
       R"(stage.json: /chain/filter/order: expected a whole number from 1 to 10, got 11)"},
      {filter(R"({"kind": "single_pole", "order": 2, "cutoff": "1k"})"),
       R"(stage.json: /chain/filter/order: expected a whole number from 1 to 1, got 2)"},
      {filter(R"({"kind": "none", "cutoff": "1k"})"),
       R"(stage.json: /chain/filter/cutoff: not with a filter of kind "none")"},
      {filter(R"({"kind": "butterworth", "order": 2, "cutoff": "0"})"),
       R"(stage.json: /chain/filter/cutoff: expected a positive frequency, got "0")"},
      {filter(
           R"({"kind": "butterworth", "order": 2, "cutoff": "1k", "gain": -2})"),
       R"(stage.json: /chain/filter/gain: expected a positive gain, got -2)"},
      {filter(
           R"({"kind": "butterworth", "order": 2, "cutoff": "1k", "noise": "-1n"})"),
       R"(stage.json: /chain/filter/noise: expected a non-negative voltage density, got "-1n")"},
      {R"({"filter": {"kind": "none"}})",
       R"(stage.json: /chain/adc: missing (required))"},
      {R"({"adc": {"bits": 16, "full_scale": 4, "sample_rate": "100k"}, "second": 1})",
       R"(stage.json: /chain/second: unknown key)"},
      {R"({"adc": {"bits": 0, "full_scale": 4, "sample_rate": "100k"}})",
       R"(stage.json: /chain/adc/bits: expected a whole number from 1 to 32, got 0)"},
      {R"({"adc": {"bits": "16", "full_scale": 4, "sample_rate": "100k"}})",
       R"(stage.json: /chain/adc/bits: expected a whole number from 1 to 32, got a string)"},
      {R"({"adc": {"bits": 16, "full_scale": "-4", "sample_rate": "100k"}})",
       R"(stage.json: /chain/adc/full_scale: expected a positive voltage (the peak-to-peak input range), got "-4")"},
      {converter(R"("sample_rate": "15")"),
       R"(stage.json: /chain/adc/sample_rate: expected a rate above twice the band's low edge (20.00 Hz), got "15")"},
      {converter(
           R"("sample_rate": "100k", "snr_dB": 90, "input_noise_rms": "1u")"),
       R"(stage.json: /chain/adc/snr_dB: expected "input_noise_rms" or "snr_dB", not both)"},
      {converter(R"("sample_rate": "100k", "snr_dB": 99)"),
       R"(stage.json: /chain/adc/snr_dB: expected a number of dB above 0 and at most the ideal 98.09 dB of a 16-bit converter, got 99)"},
      {converter(R"("sample_rate": "100k", "snr_dB": "90 dB")"),
       R"(stage.json: /chain/adc/snr_dB: expected a number of dB above 0 and at most the ideal 98.09 dB of a 16-bit converter, got a string)"},
      {converter(R"("sample_rate": "100k", "input_noise_rms": "-1u")"),
       R"(stage.json: /chain/adc/input_noise_rms: expected a non-negative voltage, got "-1u")"},
      {R"({"second_stage": {"gain": 0}, )" + adc + "}",
       R"(stage.json: /chain/second_stage/gain: expected a non-zero gain, got 0)"},
      {R"({"second_stage": {"gain": 10, "noise_gain": 0.5}, )" + adc + "}",
       R"(stage.json: /chain/second_stage/noise_gain: expected a gain of at least 1, got 0.5)"},
      {R"({"second_stage": {"gain": 10, "bandwidth": {"gwb": "1M"}}, )" + adc +
           "}",
       R"(stage.json: /chain/second_stage/bandwidth/gbw: missing (required; is "gwb" a typo?))"},
      {R"({"second_stage": {"gain": 10, "bandwidth": "-1k"}, )" + adc + "}",
       R"(stage.json: /chain/second_stage/bandwidth: expected a positive frequency, got "-1k")"},
      {R"({"second_stage": {"gain": 10, "input_current_noise": {"density": "1p"}}, )" +
           adc + "}",
       R"(stage.json: /chain/second_stage/input_current_noise: needs a "source_resistance" beside it (the resistance the input sees))"},
      {R"({"second_stage": {"gain": 10, "input_noise": {"density": "1 pA/rtHz"}}, )" +
           adc + "}",
       R"(stage.json: /chain/second_stage/input_noise/density: expected a voltage noise density, got "1 pA/rtHz" (unknown unit "pA/rtHz"))"},
      {R"({"second_stage": {"gain": 10, "input_noise": {"density": "1n", "corner": "-1"}}, )" +
           adc + "}",
       R"(stage.json: /chain/second_stage/input_noise/corner: expected a non-negative frequency (0 = white), got "-1")"},
      {R"({"second_stage": {"gain": 10, "source_resistance": "-1"}, )" + adc +
           "}",
       R"(stage.json: /chain/second_stage/source_resistance: expected a non-negative resistance, got "-1")"},
      {R"({"second_stge": {"gain": 10}, )" + adc + "}",
       R"(stage.json: /chain/second_stge: unknown key (did you mean "second_stage"?))"},
      {converter(R"("sample_rate": "100k", "sample_rat": 1)"),
       R"(stage.json: /chain/adc/sample_rat: unknown key (did you mean "sample_rate"?))"},
  };
  for (const auto& [text, message] : cases) {
    CAPTURE(text);
    CHECK_THROWS_WITH_AS(Parse(text), message.c_str(), Error);
  }
}

// A front stage file "sub/front.json" whose chain names a second stage,
// with the files a test provides by the path they are read at.
Stage ParseWithFiles(const std::string& second_stage,
                     std::map<std::string, std::string> files) {
  StageContext context;
  context.library = &TestLibrary();
  context.read_file = [files](const std::string& path) -> std::string {
    auto it = files.find(path);
    if (it == files.end())
      throw Error(path, "", "cannot read: no such file or directory");
    return it->second;
  };
  context.folder = "sub";
  context.path = "sub/front.json";
  const std::string text = R"({
    "name": "front",
    "band_Hz": {"low": "10", "high": "10k"},
    "opamp": {"device": "precision-bipolar"},
    "stage": {"topology": "inverting", "input_resistor": "1k",
              "feedback": {"resistor": "100k"}},
    "chain": {"second_stage": )" +
                           second_stage +
                           R"(,
              "adc": {"bits": 16, "full_scale": 4, "sample_rate": "100k"}}
  })";
  return ParseStage(text, "sub/front.json", context);
}

// An ordinary stage file; `extra` adds top-level keys.
std::string SecondFile(
    const std::string& extra = "",
    const std::string& opamp = R"({"device": "precision-bipolar"})") {
  return R"({
    "name": "gain ten",
    "band_Hz": {"low": "1", "high": "1k"},
    "opamp": )" +
         opamp + R"(,
    "stage": {"topology": "inverting", "input_resistor": "2k",
              "feedback": {"resistor": "20k"}})" +
         extra + "\n  }";
}

TEST_CASE("a second stage file is read relative to the stage file's folder") {
  const Stage s = ParseWithFiles(R"({"stage": "second.json"})",
                                 {{"sub/second.json", SecondFile()}});
  REQUIRE(s.chain->second_stage);
  const SecondStage& st = *s.chain->second_stage;
  CHECK(st.is_network());
  CHECK(st.file == "second.json");
  CHECK(st.network->name == "gain ten");
  CHECK(st.network->input_resistor_ohm == 2e3);
  CHECK(st.network->feedback.resistor_ohm == 20e3);
  CHECK(st.network->opamp.gbw_hz == 8e6);
  // Its devices are read relative to its own folder.
  const Stage nested = ParseWithFiles(
      R"({"stage": "stages/second.json"})",
      {{"sub/stages/second.json",
        SecondFile("", R"({"device": "parts/amp.json"})")},
       {"sub/stages/parts/amp.json",
        test::ReadAll(std::string(HUSHGAIN_SOURCE_DIR) +
                      "/devices/opamps/precision-bipolar.json")}});
  CHECK(nested.chain->second_stage->network->opamp.class_name ==
        "precision bipolar");
  // An absolute path is taken as it is.
  const Stage absolute = ParseWithFiles(R"({"stage": "/abs/second.json"})",
                                        {{"/abs/second.json", SecondFile()}});
  CHECK(absolute.chain->second_stage->network->name == "gain ten");
}

TEST_CASE("a bad second stage file is named with its JSON path") {
  const std::map<std::string, std::string> none;
  auto check = [](const std::string& second,
                  const std::map<std::string, std::string>& files,
                  const std::string& message) {
    CAPTURE(second);
    CHECK_THROWS_WITH_AS(ParseWithFiles(second, files), message.c_str(), Error);
  };
  check(R"({"stage": "second.json"})", none,
        "sub/front.json: /chain/second_stage/stage: cannot read: no such file "
        "or directory (sub/second.json)");
  check(R"({"stage": "front.json"})", none,
        "sub/front.json: /chain/second_stage/stage: names this stage file "
        "itself (sub/front.json): a stage cannot follow itself");
  check(R"({"stage": "./x/../front.json"})", none,
        "sub/front.json: /chain/second_stage/stage: names this stage file "
        "itself (sub/./x/../front.json): a stage cannot follow itself");
  check(
      R"({"stage": ""})", none,
      R"(sub/front.json: /chain/second_stage/stage: expected the path of a stage file, got "")");
  check(R"({"stage": 5})", none,
        "sub/front.json: /chain/second_stage/stage: expected a string, got a "
        "number");
  check(
      R"({"stage": "second.json", "gain": 10})", none,
      R"(sub/front.json: /chain/second_stage/gain: not with "stage" (the second stage file's own network sets its gain, bandwidth and noise))");
  const std::string chain =
      R"(,
    "chain": {"adc": {"bits": 16, "full_scale": 4, "sample_rate": "100k"}})";
  check(R"({"stage": "second.json"})", {{"sub/second.json", SecondFile(chain)}},
        "sub/second.json: /chain: not in a second stage file (the front "
        "stage's file holds the chain)");
  check(R"({"stage": "second.json"})",
        {{"sub/second.json",
          SecondFile(R"(, "source": {"voltage": {"resistance": "50"}})")}},
        "sub/second.json: /source: not in a second stage file (the front "
        "stage's output drives its input resistor, as a 0 ohm voltage "
        "source)");
  std::string tia = SecondFile();
  tia.replace(tia.find("\"inverting\""), 11, "\"transimpedance\"");
  check(
      R"({"stage": "second.json"})", {{"sub/second.json", tia}},
      R"(sub/second.json: /stage/topology: a second stage is "inverting" (the front stage's output is a voltage))");
  std::string bad = SecondFile();
  bad.replace(bad.find("\"2k\""), 4, "\"-2k\"");
  check(
      R"({"stage": "second.json"})", {{"sub/second.json", bad}},
      R"(sub/second.json: /stage/input_resistor: expected a positive resistance, got "-2k")");
  check(R"({"stage": "second.json"})",
        {{"sub/second.json", SecondFile("", R"({"device": "amp.json"})")}},
        "sub/second.json: /opamp/device: cannot read: no such file or "
        "directory (amp.json)");
  check(R"({"stage": "second.json"})", {{"sub/second.json", "{\"name\": "}},
        "sub/second.json: malformed JSON at line 1, column 10: unexpected end "
        "of input; expected '[', '{', or a literal");
}

TEST_CASE("a data-sheet SNR within the printed rounding of the ideal is kept") {
  // 16 bits: the ideal 98.0905 dB is printed 98.09; 98.09 is accepted and
  // means an ideal converter.
  const Stage s = Parse(
      R"({"adc": {"bits": 16, "full_scale": 4, "sample_rate": "100k", "snr_dB": 98.09}})");
  REQUIRE(s.chain->adc.snr_db);
  CHECK(*s.chain->adc.snr_db == doctest::Approx(98.09));
}

}  // namespace
}  // namespace hushgain
