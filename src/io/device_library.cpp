#include "io/device_library.h"

#include <cmath>
#include <filesystem>
#include <fstream>
#include <sstream>

#include "base/printf.h"
#include "io/read_file.h"
#include "io/suggest.h"

namespace hushgain {
namespace {

enum class Rule { kPositive, kNonNegative, kAny };

struct OpAmpKey {
  const char* key;
  Quantity quantity;
  double OpAmpModel::*member;
  Rule rule;
};

// The parameter keys of an op-amp, in the order the README documents them.
const OpAmpKey kOpAmpKeys[] = {
    {"voltage_noise", Quantity::kVoltageDensity, &OpAmpModel::e_w_v_per_rthz,
     Rule::kNonNegative},
    {"voltage_noise_corner", Quantity::kFrequency, &OpAmpModel::f_cv_hz,
     Rule::kNonNegative},
    {"current_noise", Quantity::kCurrentDensity, &OpAmpModel::i_w_a_per_rthz,
     Rule::kNonNegative},
    {"current_noise_corner", Quantity::kFrequency, &OpAmpModel::f_ci_hz,
     Rule::kNonNegative},
    {"open_loop_gain", Quantity::kGain, &OpAmpModel::open_loop_gain,
     Rule::kPositive},
    {"gbw", Quantity::kFrequency, &OpAmpModel::gbw_hz, Rule::kPositive},
    {"output_resistance", Quantity::kResistance,
     &OpAmpModel::output_resistance_ohm, Rule::kNonNegative},
    {"input_capacitance_cm", Quantity::kCapacitance, &OpAmpModel::c_cm_f,
     Rule::kNonNegative},
    {"input_capacitance_diff", Quantity::kCapacitance, &OpAmpModel::c_diff_f,
     Rule::kNonNegative},
    {"offset_voltage", Quantity::kVoltage, &OpAmpModel::vos_v,
     Rule::kNonNegative},
    {"offset_voltage_drift", Quantity::kVoltageDrift,
     &OpAmpModel::vos_drift_v_per_k, Rule::kNonNegative},
    {"bias_current", Quantity::kCurrent, &OpAmpModel::ib_a, Rule::kAny},
    {"offset_current", Quantity::kCurrent, &OpAmpModel::ios_a,
     Rule::kNonNegative},
    {"output_current_limit", Quantity::kCurrent,
     &OpAmpModel::output_current_limit_a, Rule::kPositive},
    {"supply_span", Quantity::kVoltage, &OpAmpModel::supply_v, Rule::kPositive},
};

void CheckRule(double value, Rule rule, Quantity quantity, ObjectReader& reader,
               const std::string& key) {
  const bool ok = rule == Rule::kAny ||
                  (rule == Rule::kPositive && value > 0) ||
                  (rule == Rule::kNonNegative && value >= 0);
  if (ok) return;
  std::string q(QuantityName(quantity));
  q = q.substr(q.find(' ') + 1);  // "a resistance" -> "resistance"
  throw reader.ErrorAt(
      key, std::string("expected a ") +
               (rule == Rule::kPositive ? "positive " : "non-negative ") + q +
               ", got " + reader.json().at(key).dump());
}

// The engine divides by the open-loop pole GBW / A0 (where the loop and
// response searches start) and by A0: each positive alone, their ratio can
// still leave the double range (1e-300 Hz over 1e300 is 0, and a search
// from 0 Hz never moves). Checked on the whole model, so that a stage's
// "set" is checked with the device it changes.
void CheckOpenLoopPole(ObjectReader& reader, const OpAmpModel& model) {
  const char* key = reader.Has("gbw")              ? "gbw"
                    : reader.Has("open_loop_gain") ? "open_loop_gain"
                                                   : nullptr;
  if (key == nullptr) return;
  const double pole = model.gbw_hz / model.open_loop_gain;
  if (std::isnormal(pole) && std::isfinite(1 / model.open_loop_gain)) return;
  throw reader.ErrorAt(
      key, Printf("expected a GBW / open_loop_gain ratio (the open-loop "
                  "pole) inside the double range, got %g Hz / %g",
                  model.gbw_hz, model.open_loop_gain));
}

void ApplyBiasTemperature(ObjectReader& reader, OpAmpModel* model) {
  if (!reader.Has("bias_current_temperature")) return;
  ObjectReader law = reader.Object("bias_current_temperature");
  std::string name = law.String("law");
  if (name == "constant") {
    model->ib_law = BiasTemperatureLaw::kNone;
    model->ib_law_value = 0;
  } else if (name == "doubling") {
    model->ib_law = BiasTemperatureLaw::kDoubling;
    model->ib_law_value = law.Quantity("interval_C", Quantity::kTemperature);
    if (!(model->ib_law_value > 0))
      throw law.ErrorAt("interval_C", "expected a positive interval in °C");
  } else if (name == "coefficient") {
    model->ib_law = BiasTemperatureLaw::kCoefficient;
    model->ib_law_value = law.Quantity("per_C", Quantity::kRatio);
  } else {
    throw law.ErrorAt(
        "law",
        "expected \"constant\", \"doubling\" or \"coefficient\", got \"" +
            name + "\"");
  }
  law.Finish();
}

// A tabulated density: [[frequency, density], ...], at least two points,
// frequencies strictly increasing and positive, densities positive. Every
// error names the JSON path of the bad point (or of its bad value).
NoiseTable ReadNoiseTable(ObjectReader& reader, const std::string& key,
                          Quantity density_kind) {
  const nlohmann::json& value = reader.Get(key);
  const std::string path = reader.PathOf(key);
  const std::string& source = reader.source();
  if (!value.is_array())
    throw reader.ErrorAt(key,
                         "expected a table [[frequency, density], ...], got " +
                             JsonTypeName(value));
  if (value.size() < 2)
    throw reader.ErrorAt(
        key, "expected at least two points [frequency, density], got " +
                 std::to_string(value.size()));
  NoiseTable table;
  std::string density_name(QuantityName(density_kind));
  density_name = density_name.substr(density_name.find(' ') + 1);
  for (std::size_t i = 0; i < value.size(); ++i) {
    const nlohmann::json& point = value[i];
    const std::string at = path + "/" + std::to_string(i);
    if (!point.is_array() || point.size() != 2)
      throw Error(
          source, at,
          "expected a point [frequency, density], got " +
              (point.is_array() ? "an array of " + std::to_string(point.size())
                                : JsonTypeName(point)));
    const double f =
        ReadQuantity(point[0], Quantity::kFrequency, source, at + "/0");
    if (!(f > 0))
      throw Error(source, at + "/0",
                  "expected a positive frequency, got " + point[0].dump());
    if (!table.f_hz.empty() && !(f > table.f_hz.back()))
      throw Error(source, at + "/0",
                  "expected a frequency above the previous point's (" +
                      FormatEng(table.f_hz.back(), "Hz") + "), got " +
                      point[0].dump());
    const double d = ReadQuantity(point[1], density_kind, source, at + "/1");
    if (!(d > 0))
      throw Error(
          source, at + "/1",
          "expected a positive " + density_name + ", got " + point[1].dump());
    table.f_hz.push_back(f);
    table.density.push_back(d);
  }
  return table;
}

// The tables, their ends and the current noise's temperature law. A table
// given without its white level in the same object replaces the
// white-plus-corner description (white level 0); given with it, the two add
// in power.
void ApplyNoiseTables(ObjectReader& reader, OpAmpModel* model) {
  if (reader.Has("voltage_noise_table")) {
    model->voltage_noise_table = ReadNoiseTable(reader, "voltage_noise_table",
                                                Quantity::kVoltageDensity);
    if (!reader.Has("voltage_noise")) model->e_w_v_per_rthz = 0;
  }
  if (reader.Has("current_noise_table")) {
    model->current_noise_table = ReadNoiseTable(reader, "current_noise_table",
                                                Quantity::kCurrentDensity);
    if (!reader.Has("current_noise")) model->i_w_a_per_rthz = 0;
  }
  if (auto ends = reader.OptionalString("noise_table_ends")) {
    TableEnds value;
    if (*ends == "slope")
      value = TableEnds::kSlope;
    else if (*ends == "flat")
      value = TableEnds::kFlat;
    else
      throw reader.ErrorAt("noise_table_ends",
                           "expected \"slope\" (the end segments continue) "
                           "or \"flat\" (the end values continue), got \"" +
                               *ends + "\"");
    model->voltage_noise_table.ends = value;
    model->current_noise_table.ends = value;
  }
  if (auto law = reader.OptionalString("current_noise_temperature")) {
    if (*law == "constant")
      model->current_noise_temperature = CurrentNoiseTemperature::kConstant;
    else if (*law == "with_bias_current")
      model->current_noise_temperature =
          CurrentNoiseTemperature::kWithBiasCurrent;
    else
      throw reader.ErrorAt(
          "current_noise_temperature",
          "expected \"with_bias_current\" (i_n^2 follows the bias current) "
          "or \"constant\", got \"" +
              *law + "\"");
  }
}

std::vector<std::string> Names(const auto& map) {
  std::vector<std::string> out;
  for (const auto& [name, value] : map) out.push_back(name);
  return out;
}

}  // namespace

std::vector<std::string> DeviceLibrary::OpAmpNames() const {
  return Names(opamps);
}
std::vector<std::string> DeviceLibrary::ResistorNames() const {
  return Names(resistors);
}

std::vector<std::string> OpAmpParameterKeys() {
  std::vector<std::string> keys;
  for (const OpAmpKey& k : kOpAmpKeys) keys.push_back(k.key);
  for (const char* key : {"voltage_noise_table", "current_noise_table",
                          "noise_table_ends", "current_noise_temperature",
                          "bias_current_temperature", "offset_distribution"})
    keys.push_back(key);
  return keys;
}

void ApplyOpAmpParameters(ObjectReader& reader, OpAmpModel* model) {
  for (const OpAmpKey& k : kOpAmpKeys) {
    if (!reader.Has(k.key)) continue;
    double value = reader.Quantity(k.key, k.quantity);
    CheckRule(value, k.rule, k.quantity, reader, k.key);
    model->*k.member = value;
  }
  CheckOpenLoopPole(reader, *model);
  ApplyBiasTemperature(reader, model);
  ApplyNoiseTables(reader, model);
  if (auto spread = reader.OptionalString("offset_distribution")) {
    if (*spread == "uniform")
      model->offset_distribution = OffsetDistribution::kUniform;
    else if (*spread == "gaussian")
      model->offset_distribution = OffsetDistribution::kGaussian;
    else
      throw reader.ErrorAt(
          "offset_distribution",
          "expected \"uniform\" (within the values, read as maxima) or "
          "\"gaussian\" (the values as sigma), got \"" +
              *spread + "\"");
  }
  reader.Finish();
}

void RequireCoreOpAmpParameters(ObjectReader& reader) {
  for (const char* key :
       {"voltage_noise", "current_noise", "open_loop_gain", "gbw"}) {
    const std::string table = std::string(key) + "_table";
    if (reader.Has(key)) continue;
    if ((table == "voltage_noise_table" || table == "current_noise_table") &&
        reader.Has(table))
      continue;
    throw reader.ErrorAt(
        key, table == "voltage_noise_table" || table == "current_noise_table"
                 ? "missing (required, or \"" + table + "\")"
                 : std::string("missing (required)"));
  }
}

OpAmpModel ParseOpAmpDevice(std::string_view json_text,
                            const std::string& source, DeviceFileInfo* info) {
  nlohmann::json doc = ParseJsonText(json_text, source);
  ObjectReader top(doc, source, "");
  std::string kind = top.String("kind");
  if (kind != "opamp")
    throw top.ErrorAt("kind", "expected \"opamp\", got \"" + kind + "\"");
  OpAmpModel model;
  model.class_name = top.String("class");
  // A shipped class says its values are illustrative; a user's copy of a
  // datasheet need not, and may say where its numbers came from.
  DeviceFileInfo file{source, top.OptionalString("illustrative").value_or(""),
                      top.OptionalString("source").value_or("")};
  if (info) *info = file;
  ObjectReader parameters = top.Object("parameters");
  RequireCoreOpAmpParameters(parameters);
  ApplyOpAmpParameters(parameters, &model);
  top.Finish();
  return model;
}

ResistorTechnology ParseResistorTechnology(std::string_view json_text,
                                           const std::string& source,
                                           DeviceFileInfo* info) {
  nlohmann::json doc = ParseJsonText(json_text, source);
  ObjectReader top(doc, source, "");
  std::string kind = top.String("kind");
  if (kind != "resistor_technology")
    throw top.ErrorAt("kind",
                      "expected \"resistor_technology\", got \"" + kind + "\"");
  ResistorTechnology tech;
  tech.class_name = top.String("class");
  DeviceFileInfo file{source, top.OptionalString("illustrative").value_or(""),
                      top.OptionalString("source").value_or("")};
  if (info) *info = file;
  const nlohmann::json& index = top.Get("noise_index_dB");
  if (!index.is_number())
    throw top.ErrorAt("noise_index_dB", "expected a number of dB");
  tech.noise_index_db = index.get<double>();
  tech.tempco_per_k =
      top.Quantity("temperature_coefficient_per_C", Quantity::kRatio);
  tech.tolerance = top.Quantity("tolerance", Quantity::kRatio);
  if (!(tech.tolerance >= 0))
    throw top.ErrorAt("tolerance", "expected a non-negative tolerance");
  top.Finish();
  return tech;
}

DeviceLibrary LoadDeviceLibrary(const std::string& directory) {
  namespace fs = std::filesystem;
  DeviceLibrary library;
  if (!fs::is_directory(directory))
    throw Error(directory, "", "device folder not found");
  for (const char* sub : {"opamps", "resistors"}) {
    fs::path folder = fs::path(directory) / sub;
    if (!fs::is_directory(folder)) continue;
    for (const fs::directory_entry& entry : fs::directory_iterator(folder)) {
      if (entry.path().extension() != ".json") continue;
      std::string source = entry.path().string();
      std::string text = ReadTextFile(source);
      std::string name = entry.path().stem().string();
      if (std::string(sub) == "opamps")
        library.opamps[name] =
            ParseOpAmpDevice(text, source, &library.opamp_files[name]);
      else
        library.resistors[name] = ParseResistorTechnology(
            text, source, &library.resistor_files[name]);
    }
  }
  return library;
}

namespace {

bool LooksLikePath(const std::string& device) {
  return device.find('/') != std::string::npos ||
         (device.size() > 5 &&
          device.compare(device.size() - 5, 5, ".json") == 0);
}

}  // namespace

OpAmpModel FindOpAmp(
    const DeviceLibrary& library, const std::string& device,
    const std::string& source, const std::string& path,
    const std::function<std::string(const std::string&)>& read_file) {
  if (LooksLikePath(device)) {
    std::string text;
    try {
      text = read_file(device);
    } catch (const Error& e) {
      throw Error(source, path, e.message() + " (" + device + ")");
    }
    return ParseOpAmpDevice(text, device);
  }
  auto it = library.opamps.find(device);
  if (it == library.opamps.end())
    throw Error(source, path,
                "unknown op-amp device \"" + device + "\"" +
                    DidYouMean(device, library.OpAmpNames()));
  return it->second;
}

}  // namespace hushgain
