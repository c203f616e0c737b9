// The JSON Schemas in schema/ and the parsers know the same keys. The
// parsers' vocabulary is recorded with a KeyLog (io/json_reader.h) while
// they read every example and device file and the variants below, which
// take the branches the examples do not (a plain resistor with an automatic
// capacitor and a phase-margin target, an inline op-amp, every bias-current
// law, every resistor override, a chain with each way of giving the
// converter's noise, a second stage given as a file); the schemas' keys are
// collected by walking "properties" through $ref, allOf/anyOf/oneOf and
// then/else. Both sides are sets of (JSON pointer of the object, key); the
// test prints what one side has and the other lacks. A new parser key fails
// here until the schema has it (DEVELOPERS.md, "JSON Schemas").
#include <doctest/doctest.h>

#include <filesystem>
#include <fstream>
#include <nlohmann/json.hpp>
#include <set>
#include <sstream>
#include <string>
#include <utility>
#include <vector>

#include "io/device_library.h"
#include "io/json_reader.h"
#include "io/stage_parser.h"

namespace hushgain::test {
namespace {

namespace fs = std::filesystem;
using nlohmann::json;
using Keys = KeyLog::Keys;

const fs::path kSource = HUSHGAIN_SOURCE_DIR;

std::string ReadText(const fs::path& path) {
  std::ifstream in(path, std::ios::binary);
  std::ostringstream out;
  out << in.rdbuf();
  return out.str();
}

std::vector<fs::path> JsonFiles(const fs::path& folder, bool recursive) {
  std::vector<fs::path> out;
  if (recursive) {
    for (const auto& e : fs::recursive_directory_iterator(folder))
      if (e.path().extension() == ".json") out.push_back(e.path());
  } else {
    for (const auto& e : fs::directory_iterator(folder))
      if (e.path().extension() == ".json") out.push_back(e.path());
  }
  return out;
}

// Collects the keys a schema allows, by object path ("" is the top).
class SchemaKeys {
 public:
  explicit SchemaKeys(const fs::path& file) { Walk(Load(file), file, ""); }
  const Keys& keys() const { return keys_; }

 private:
  const json& Load(const fs::path& file) {
    const std::string name = file.lexically_normal().string();
    auto it = documents_.find(name);
    if (it == documents_.end())
      it = documents_.emplace(name, json::parse(ReadText(file))).first;
    return it->second;
  }

  // "other.schema.json#/$defs/x" or "#/$defs/x", relative to `file`.
  std::pair<const json*, fs::path> Resolve(const std::string& ref,
                                           const fs::path& file) {
    const std::size_t hash = ref.find('#');
    const std::string where = ref.substr(0, hash);
    const fs::path target =
        where.empty() ? file : file.parent_path() / fs::path(where);
    const json& document = Load(target);
    const std::string pointer =
        hash == std::string::npos ? "" : ref.substr(hash + 1);
    return {&document.at(json::json_pointer(pointer)), target};
  }

  void Walk(const json& node, const fs::path& file, const std::string& path) {
    if (!node.is_object()) return;
    if (node.contains("$ref")) {
      auto [target, target_file] =
          Resolve(node["$ref"].get<std::string>(), file);
      Walk(*target, target_file, path);
    }
    if (node.contains("properties"))
      for (auto it = node["properties"].begin(); it != node["properties"].end();
           ++it) {
        keys_.emplace(path, it.key());
        Walk(it.value(), file, path + "/" + it.key());
      }
    if (node.contains("items")) Walk(node["items"], file, path + "/*");
    for (const char* group : {"allOf", "anyOf", "oneOf"})
      if (node.contains(group))
        for (const json& sub : node[group]) Walk(sub, file, path);
    for (const char* branch : {"then", "else"})
      if (node.contains(branch)) Walk(node[branch], file, path);
  }

  std::map<std::string, json> documents_;
  Keys keys_;
};

DeviceLibrary ShippedLibrary() {
  return LoadDeviceLibrary((kSource / "devices").string());
}

// Parses `stage` (a JSON object) and fails the test on an error.
void ParseStageJson(const json& stage, const std::string& what,
                    const DeviceLibrary& library) {
  StageContext context;
  context.library = &library;
  context.read_file = [](const std::string& path) -> std::string {
    FAIL("the key test names devices by library name, not by path: " << path);
    return "";
  };
  INFO("stage: " << what);
  CHECK_NOTHROW(ParseStage(stage.dump(), what, context));
}

json Example(const std::string& name) {
  return json::parse(ReadText(kSource / "examples" / (name + ".json")));
}

std::string Difference(const Keys& a, const Keys& b) {
  std::string out;
  for (const auto& [path, key] : a)
    if (!b.count({path, key})) out += "  " + path + " : " + key + "\n";
  return out.empty() ? "  (none)\n" : out;
}

TEST_CASE("the stage schema and the stage parser know the same keys") {
  const DeviceLibrary library = ShippedLibrary();
  KeyLog log;
  for (const fs::path& file : JsonFiles(kSource / "examples", false))
    ParseStageJson(json::parse(ReadText(file)), file.filename().string(),
                   library);

  // Branches the examples may not take.
  json tee = Example("geophone-preamp");
  tee.merge_patch(R"({
    "$schema": "../schema/stage.schema.json",
    "temperature_C": {"min": -10, "nominal": 20, "max": 60},
    "dc_input": "1m",
    "opamp": {"set": {"offset_distribution": "gaussian",
                      "bias_current_temperature": {"law": "doubling",
                                                   "interval_C": 10}}},
    "stage": {"plus_resistor": "auto", "plus_resistor_bypass": "1u"},
    "resistors": {"technology": "thin-film", "tolerance": "0.1%",
                  "R_source": {"tolerance": "1%"}, "R_in": {},
                  "R1": {"technology": "thick-film"}, "R2": {}, "R3": {},
                  "R_plus": {}, "R_load": {}}
  })"_json);
  ParseStageJson(tee, "tee variant", library);

  json plain = Example("load-cell-bridge");
  plain.merge_patch(R"({
    "opamp": {"device": null, "set": {
      "voltage_noise": "10n", "current_noise": "1p", "open_loop_gain": "1M",
      "gbw": "1M",
      "bias_current_temperature": {"law": "coefficient", "per_C": "-0.5%"}}},
    "stage": {"feedback": {"capacitor": "auto",
                           "capacitor_target": {"phase_margin_deg": 60}},
              "plus_resistor": "10k"},
    "resistors": {"technology": "thin-film", "R_f": {}}
  })"_json);
  ParseStageJson(plain, "plain variant", library);

  json photodiode = Example("smoke-chamber-receiver");
  photodiode.merge_patch(R"({
    "opamp": {"set": {"bias_current_temperature": {"law": "constant"}}},
    "resistors": {"R_sh": {"technology": "thin-film"}}
  })"_json);
  ParseStageJson(photodiode, "photodiode variant", library);
  json lit = Example("smoke-chamber-receiver");
  lit.merge_patch(R"({
    "source": {"photodiode": {"photocurrent": null, "optical_power": "1u",
                              "reverse_bias": "5", "bias_noise": "10n",
                              "series_resistance": "20", "dark_current": "1n",
                              "doubling_interval_C": 8}},
    "resistors": {"R_s": {"technology": "thin-film"}}
  })"_json);
  ParseStageJson(lit, "lit photodiode variant", library);
  json photocurrent = Example("smoke-chamber-receiver");
  photocurrent.merge_patch(
      R"({"source": {"photodiode": {"photocurrent": "10n"}},
          "stage": {"feedback": {"parasitic_capacitance": "0.1p"}}})"_json);
  ParseStageJson(photocurrent, "photocurrent variant", library);
  json sensor = Example("load-cell-bridge");
  sensor.merge_patch(
      R"({"source": {"noise": {"density": "5n", "corner": "10"},
                     "sensitivity": {"value": "2 mV", "per": "V"}}})"_json);
  ParseStageJson(sensor, "sensor noise and sensitivity variant", library);
  json chain = Example("load-cell-bridge");
  chain.merge_patch(R"({"chain": {
      "filter": {"kind": "bessel", "order": 3, "cutoff": "2k", "gain": 2,
                 "noise": "20n"},
      "adc": {"bits": 24, "full_scale": 5, "sample_rate": "10k",
              "input_noise_rms": "1u"}}})"_json);
  ParseStageJson(chain, "chain variant", library);
  json second = Example("load-cell-bridge");
  second.merge_patch(R"({"chain": {
      "second_stage": {"gain": -10, "noise_gain": 11,
                       "bandwidth": {"gbw": "10M"},
                       "input_noise": {"density": "5n", "corner": "10"},
                       "input_current_noise": {"density": "1p",
                                               "corner": "100"},
                       "source_resistance": "1k"},
      "adc": {"bits": 24, "full_scale": 5, "sample_rate": "10k"}}})"_json);
  ParseStageJson(second, "second stage variant", library);
  // A second stage given as a stage file: the example pair, read from disk
  // (both files' keys are recorded).
  {
    INFO("stage: examples/two-stage/geophone-front-end.json");
    CHECK_NOTHROW(LoadStageFile(
        (kSource / "examples/two-stage/geophone-front-end.json").string(),
        library));
  }
  json converter = Example("load-cell-bridge");
  converter.merge_patch(R"({"chain": {"adc": {"bits": 16, "full_scale": 5,
      "sample_rate": "10k", "snr_dB": 90}}})"_json);
  ParseStageJson(converter, "converter variant", library);
  json charge = Example("load-cell-bridge");
  charge.merge_patch(
      R"({"source": {"voltage": null,
                     "capacitive": {"capacitance": "1n",
                                    "leakage_resistance": "10G"}},
          "resistors": {"technology": "thin-film",
                        "R_leak": {"tolerance": "20 %"}}})"_json);
  ParseStageJson(charge, "capacitive sensor variant", library);
  json coupled = Example("load-cell-bridge");
  coupled.merge_patch(
      R"({"stage": {"input_capacitor": "10u",
                    "feedback": {"resistor": null,
                                 "tee": {"r1": "100k", "r2": "100k",
                                         "r3": "1k", "c3": "100u"}}}})"_json);
  ParseStageJson(coupled, "AC coupling variant", library);
  json caps = coupled;
  caps.merge_patch(
      R"({"stage": {"plus_resistor": "auto", "plus_resistor_bypass": "1u"},
          "capacitors": {"tolerance": "5 %", "C_f": {"tolerance": "1 %"},
                         "C3": {"tolerance": "20 %"},
                         "C_input": {"tolerance": "10 %"},
                         "C_plus": {"tolerance": "20 %"}}})"_json);
  ParseStageJson(caps, "capacitors variant", library);
  json sensor_caps = Example("smoke-chamber-receiver");
  sensor_caps.merge_patch(
      R"({"capacitors": {"C_d": {"tolerance": "20 %"}}})"_json);
  ParseStageJson(sensor_caps, "photodiode capacitor variant", library);
  json charge_caps = charge;
  charge_caps["stage"].erase("input_resistor");
  charge_caps.merge_patch(
      R"({"capacitors": {"C_s": {"tolerance": "10 %"}}})"_json);
  ParseStageJson(charge_caps, "sensor capacitor variant", library);

  const Keys schema = SchemaKeys(kSource / "schema/stage.schema.json").keys();
  INFO("in the parser, not in schema/stage.schema.json:\n"
       << Difference(log.keys(), schema)
       << "in schema/stage.schema.json, not read by the parser on any "
          "example or variant here:\n"
       << Difference(schema, log.keys()));
  CHECK(log.keys() == schema);
}

TEST_CASE("the device schema and the device parser know the same keys") {
  KeyLog log;
  for (const fs::path& file : JsonFiles(kSource / "devices", true)) {
    const std::string text = ReadText(file);
    INFO("device: " << file.string());
    if (file.parent_path().filename() == "opamps")
      CHECK_NOTHROW(ParseOpAmpDevice(text, file.string()));
    else
      CHECK_NOTHROW(ParseResistorTechnology(text, file.string()));
  }
  json opamp =
      json::parse(ReadText(kSource / "devices/opamps/precision-bipolar.json"));
  for (const char* law :
       {R"({"law": "constant"})", R"({"law": "doubling", "interval_C": 8})",
        R"({"law": "coefficient", "per_C": "-0.4%"})"}) {
    opamp["$schema"] = "../../schema/device.schema.json";
    opamp["parameters"]["bias_current_temperature"] = json::parse(law);
    opamp["parameters"]["offset_distribution"] = "uniform";
    INFO("law: " << law);
    CHECK_NOTHROW(ParseOpAmpDevice(opamp.dump(), "variant.json"));
  }
  json resistor =
      json::parse(ReadText(kSource / "devices/resistors/thin-film.json"));
  resistor["$schema"] = "../../schema/device.schema.json";
  CHECK_NOTHROW(ParseResistorTechnology(resistor.dump(), "variant.json"));

  const Keys schema = SchemaKeys(kSource / "schema/device.schema.json").keys();
  INFO("in the parser, not in schema/device.schema.json:\n"
       << Difference(log.keys(), schema)
       << "in schema/device.schema.json, not read by the parser:\n"
       << Difference(schema, log.keys()));
  CHECK(log.keys() == schema);
}

TEST_CASE("a stage file may carry \"$schema\" and comments") {
  const DeviceLibrary library = ShippedLibrary();
  StageContext context;
  context.library = &library;
  const std::string plain = ReadText(kSource / "examples/geophone-preamp.json");
  std::string annotated = plain;
  annotated.replace(annotated.find('{'), 1,
                    "// a T-network preamp\n{\n  \"$schema\": "
                    "\"../schema/stage.schema.json\", /* for editors */\n");
  annotated.insert(annotated.find("\"load\""), "// the ADC's input\n  ");
  const Stage a = ParseStage(plain, "plain.json", context);
  const Stage b = ParseStage(annotated, "annotated.json", context);
  CHECK(a.name == b.name);
  CHECK(a.load_ohm == b.load_ohm);
  CHECK(a.feedback.tee.r3_ohm == b.feedback.tee.r3_ohm);
  // "$schema" is accepted at the top only.
  json nested = json::parse(plain);
  nested["band_Hz"]["$schema"] = "x";
  CHECK_THROWS_WITH_AS(ParseStage(nested.dump(), "nested.json", context),
                       "nested.json: /band_Hz/$schema: unknown key", Error);
}

}  // namespace
}  // namespace hushgain::test
