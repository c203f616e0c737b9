#include "io/stage_parser.h"

#include <algorithm>
#include <cmath>
#include <filesystem>
#include <memory>
#include <string>

#include "base/physical_constants.h"
#include "circuit/stage_resistors.h"
#include "io/chain_parser.h"
#include "io/json_reader.h"
#include "io/read_file.h"
#include "io/suggest.h"
#include "io/units.h"

namespace hushgain {
namespace {

std::string Dump(const nlohmann::json& value) { return value.dump(); }

double PositiveResistance(ObjectReader& reader, const std::string& key) {
  double ohms = reader.Quantity(key, Quantity::kResistance);
  if (!(ohms > 0))
    throw reader.ErrorAt(
        key, "expected a positive resistance, got " + Dump(reader.Get(key)));
  return ohms;
}

double PositiveCapacitance(ObjectReader& reader, const std::string& key) {
  double farads = reader.Quantity(key, Quantity::kCapacitance);
  if (!(farads > 0))
    throw reader.ErrorAt(
        key, "expected a positive capacitance, got " + Dump(reader.Get(key)));
  return farads;
}

double NonNegativeCapacitance(ObjectReader& reader, const std::string& key) {
  double farads = reader.Quantity(key, Quantity::kCapacitance);
  if (!(farads >= 0))
    throw reader.ErrorAt(key, "expected a non-negative capacitance, got " +
                                  Dump(reader.Get(key)));
  return farads;
}

OpAmpModel ParseOpAmp(ObjectReader& reader, const StageContext& context) {
  OpAmpModel model;
  bool from_device = false;
  if (auto device = reader.OptionalString("device")) {
    from_device = true;
    model =
        FindOpAmp(*context.library, *device, reader.source(),
                  reader.PathOf("device"), [&context](const std::string& path) {
                    return context.read_file(ResolveStagePath(context, path));
                  });
  }
  if (reader.Has("set")) {
    ObjectReader set = reader.Object("set");
    if (!from_device) RequireCoreOpAmpParameters(set);
    ApplyOpAmpParameters(set, &model);
    if (!from_device) model.class_name = "inline parameters";
  } else if (!from_device) {
    throw reader.ErrorHere(
        "expected \"device\" or \"set\" (inline parameters)");
  }
  reader.Finish();
  return model;
}

// Reads the feedback path; a capacitor of "auto" sets `target`.
Feedback ParseFeedback(ObjectReader& reader,
                       std::optional<CapacitorTarget>* target) {
  Feedback fb;
  const bool has_resistor = reader.Has("resistor");
  const bool has_tee = reader.Has("tee");
  if (has_resistor == has_tee)
    throw reader.ErrorHere("expected exactly one of \"resistor\" or \"tee\"");
  if (has_resistor) {
    fb.kind = Feedback::Kind::kResistor;
    fb.resistor_ohm = PositiveResistance(reader, "resistor");
  } else {
    fb.kind = Feedback::Kind::kTee;
    ObjectReader tee = reader.Object("tee");
    fb.tee.r1_ohm = PositiveResistance(tee, "r1");
    fb.tee.r2_ohm = PositiveResistance(tee, "r2");
    fb.tee.r3_ohm = PositiveResistance(tee, "r3");
    if (tee.Has("c3")) fb.tee.c3_f = PositiveCapacitance(tee, "c3");
    tee.Finish();
  }
  if (reader.Has("parasitic_capacitance"))
    fb.parasitic_capacitance_f =
        NonNegativeCapacitance(reader, "parasitic_capacitance");
  const bool automatic = reader.Has("capacitor") &&
                         reader.Get("capacitor").is_string() &&
                         reader.Get("capacitor").get<std::string>() == "auto";
  if (automatic) {
    CapacitorTarget t;
    if (reader.Has("capacitor_target")) {
      const nlohmann::json& v = reader.Get("capacitor_target");
      if (v.is_string() && v.get<std::string>() == "butterworth") {
        t.kind = CapacitorTarget::Kind::kButterworth;
      } else if (v.is_object()) {
        ObjectReader pm = reader.Object("capacitor_target");
        const nlohmann::json& deg = pm.Get("phase_margin_deg");
        if (!deg.is_number() ||
            !(deg.get<double>() > 0 && deg.get<double>() < 90))
          throw pm.ErrorAt(
              "phase_margin_deg",
              "expected a number of degrees between 0 and 90, got " +
                  Dump(deg));
        t.kind = CapacitorTarget::Kind::kPhaseMargin;
        t.phase_margin_deg = deg.get<double>();
        pm.Finish();
      } else {
        throw reader.ErrorAt(
            "capacitor_target",
            "expected \"butterworth\" or {\"phase_margin_deg\": ...}, got " +
                Dump(v));
      }
    }
    *target = t;
  } else {
    if (reader.Has("capacitor"))
      fb.capacitor_f = NonNegativeCapacitance(reader, "capacitor");
    if (reader.Has("capacitor_target"))
      throw reader.ErrorAt("capacitor_target",
                           "only with \"capacitor\": \"auto\"");
  }
  reader.Finish();
  return fb;
}

PlusResistor ParsePlusResistor(ObjectReader& reader) {
  PlusResistor plus;
  if (!reader.Has("plus_resistor")) return plus;
  const nlohmann::json& value = reader.Get("plus_resistor");
  if (value.is_string() && value.get<std::string>() == "auto") {
    plus.mode = PlusResistor::Mode::kAuto;
    return plus;
  }
  double ohms = ReadQuantity(value, Quantity::kResistance, reader.source(),
                             reader.PathOf("plus_resistor"));
  if (!(ohms >= 0))
    throw reader.ErrorAt(
        "plus_resistor",
        "expected \"auto\" or a non-negative resistance, got " + Dump(value));
  if (ohms > 0) {
    plus.mode = PlusResistor::Mode::kValue;
    plus.ohms = ohms;
  }
  return plus;
}

SignalSource ParseVoltageSource(ObjectReader& reader) {
  SignalSource source;
  ObjectReader voltage = reader.Object("voltage");
  if (voltage.Has("resistance")) {
    source.resistance_ohm =
        voltage.Quantity("resistance", Quantity::kResistance);
    if (!(source.resistance_ohm >= 0))
      throw voltage.ErrorAt("resistance",
                            "expected a non-negative resistance, got " +
                                Dump(voltage.Get("resistance")));
  }
  voltage.Finish();
  return source;
}

// source.capacitive: {"capacitance", "leakage_resistance"}.
CapacitiveSensor ParseCapacitiveSensor(ObjectReader& reader) {
  CapacitiveSensor sensor;
  ObjectReader r = reader.Object("capacitive");
  sensor.capacitance_f = PositiveCapacitance(r, "capacitance");
  if (r.Has("leakage_resistance"))
    sensor.leakage_resistance_ohm = PositiveResistance(r, "leakage_resistance");
  r.Finish();
  return sensor;
}

Photodiode ParsePhotodiode(ObjectReader& reader) {
  Photodiode pd;
  ObjectReader r = reader.Object("photodiode");
  pd.capacitance_f = NonNegativeCapacitance(r, "capacitance");
  if (r.Has("shunt_resistance"))
    pd.shunt_resistance_ohm = PositiveResistance(r, "shunt_resistance");
  if (auto dark = r.OptionalQuantity("dark_current", Quantity::kCurrent)) {
    if (!(*dark >= 0))
      throw r.ErrorAt("dark_current", "expected a non-negative current, got " +
                                          Dump(r.Get("dark_current")));
    pd.dark_current_a = *dark;
  }
  if (auto resp = r.OptionalQuantity("responsivity", Quantity::kResponsivity)) {
    if (!(*resp > 0))
      throw r.ErrorAt("responsivity", "expected a positive responsivity, got " +
                                          Dump(r.Get("responsivity")));
    pd.responsivity_a_per_w = *resp;
  }
  // The average photocurrent: given, or optical power x responsivity.
  if (r.Has("photocurrent") && r.Has("optical_power"))
    throw r.ErrorAt("optical_power",
                    "expected \"photocurrent\" or \"optical_power\", not both");
  if (auto amperes = r.OptionalQuantity("photocurrent", Quantity::kCurrent)) {
    if (!(*amperes >= 0))
      throw r.ErrorAt("photocurrent", "expected a non-negative current, got " +
                                          Dump(r.Get("photocurrent")));
    pd.photocurrent_a = *amperes;
  }
  if (auto watts = r.OptionalQuantity("optical_power", Quantity::kPower)) {
    if (!(*watts >= 0))
      throw r.ErrorAt("optical_power", "expected a non-negative power, got " +
                                           Dump(r.Get("optical_power")));
    if (!r.Has("responsivity"))
      throw r.ErrorAt("optical_power",
                      "needs a \"responsivity\" beside it (A/W)");
    pd.photocurrent_a = *watts * pd.responsivity_a_per_w;
    if (!std::isfinite(pd.photocurrent_a))
      throw r.ErrorAt("optical_power",
                      "expected a power whose photocurrent is finite, got " +
                          Dump(r.Get("optical_power")));
  }
  if (auto volts = r.OptionalQuantity("reverse_bias", Quantity::kVoltage)) {
    if (!(*volts >= 0))
      throw r.ErrorAt("reverse_bias",
                      "expected a non-negative voltage (0 = zero bias), got " +
                          Dump(r.Get("reverse_bias")));
    pd.reverse_bias_v = *volts;
  }
  if (auto noise =
          r.OptionalQuantity("bias_noise", Quantity::kVoltageDensity)) {
    if (!(*noise >= 0))
      throw r.ErrorAt("bias_noise",
                      "expected a non-negative voltage density, got " +
                          Dump(r.Get("bias_noise")));
    if (!(pd.reverse_bias_v > 0))
      throw r.ErrorAt("bias_noise",
                      "needs a positive \"reverse_bias\" (at zero bias the "
                      "diode returns to ground, no supply)");
    pd.bias_noise_v_per_rthz = *noise;
  }
  if (r.Has("series_resistance"))
    pd.series_resistance_ohm = PositiveResistance(r, "series_resistance");
  if (auto interval =
          r.OptionalQuantity("doubling_interval_C", Quantity::kTemperature)) {
    if (!(*interval > 0))
      throw r.ErrorAt("doubling_interval_C",
                      "expected a positive interval in °C, got " +
                          Dump(r.Get("doubling_interval_C")));
    pd.doubling_interval_k = *interval;
  }
  r.Finish();
  return pd;
}

// source.noise: {"density": ..., "corner": ...}, a voltage density for a
// voltage source, a current density for a photodiode.
SensorNoise ParseSensorNoise(ObjectReader& src, bool current) {
  ObjectReader r = src.Object("noise");
  SensorNoise noise;
  noise.density = r.Quantity("density", current ? Quantity::kCurrentDensity
                                                : Quantity::kVoltageDensity);
  if (!(noise.density >= 0))
    throw r.ErrorAt("density", std::string("expected a non-negative ") +
                                   (current ? "current" : "voltage") +
                                   " density, got " + Dump(r.Get("density")));
  if (auto corner = r.OptionalQuantity("corner", Quantity::kFrequency)) {
    if (!(*corner >= 0))
      throw r.ErrorAt("corner",
                      "expected a non-negative frequency (0 = white), got " +
                          Dump(r.Get("corner")));
    noise.corner_hz = *corner;
  }
  r.Finish();
  return noise;
}

// A capacitive sensor's sensitivity: a charge ("10 pC") or a voltage
// ("2 mV") per unit, told apart by the unit, which must be given.
void ReadChargeOrVoltage(ObjectReader& r, Sensitivity* sens) {
  const nlohmann::json& v = r.Get("value");
  std::optional<double> charge, volts;
  if (v.is_string()) {
    const std::string text = v.get<std::string>();
    charge = ParseQuantity(text, Quantity::kCharge);
    volts = ParseQuantity(text, Quantity::kVoltage);
  }
  // A bare number or prefix ("10p") reads as either: ask for the unit.
  if (charge.has_value() == volts.has_value())
    throw r.ErrorAt("value",
                    "expected a charge (\"10 pC\") or a voltage (\"2 mV\") "
                    "with its unit, got " +
                        Dump(v));
  sens->in_charge = charge.has_value();
  sens->value = charge ? *charge : *volts;
}

// source.sensitivity: {"value": "10 pC", "per": "g"}; the value is in the
// source's own quantity (for a capacitive sensor a charge or a voltage).
Sensitivity ParseSensitivity(ObjectReader& src, Quantity source_quantity,
                             bool capacitive) {
  ObjectReader r = src.Object("sensitivity");
  Sensitivity sens;
  if (capacitive)
    ReadChargeOrVoltage(r, &sens);
  else
    sens.value = r.Quantity("value", source_quantity);
  if (!(sens.value > 0))
    throw r.ErrorAt(
        "value", "expected a positive " +
                     std::string(QuantityName(sens.in_charge ? Quantity::kCharge
                                                             : source_quantity))
                         .substr(2) +
                     " per unit of the measurand, got " + Dump(r.Get("value")));
  sens.per = r.String("per");
  if (sens.per.empty() || sens.per.size() > 32 ||
      sens.per.find_first_of(" \t\n\r\"") != std::string::npos)
    throw r.ErrorAt("per",
                    "expected the measurand's unit, a short word without "
                    "spaces (\"g\", \"Pa\", \"W\"), got " +
                        Dump(r.Get("per")));
  r.Finish();
  return sens;
}

double Celsius(ObjectReader& reader, const std::string& key) {
  const double celsius = reader.Quantity(key, Quantity::kTemperature);
  if (!(celsius > -kZeroCelsiusK && celsius < 1000))
    throw reader.ErrorAt(
        key, "expected a temperature above -273.15 °C and below 1000 °C, got " +
                 Dump(reader.Get(key)));
  return celsius;
}

std::string Number(double value) {
  char buf[32];
  std::snprintf(buf, sizeof buf, "%g", value);
  return buf;
}

// "temperature_C": a number (the nominal), or {"min", "nominal", "max"}
// (nominal defaults to 25).
void ParseTemperature(ObjectReader& top, Stage* stage) {
  if (!top.Has("temperature_C")) return;
  if (!top.Get("temperature_C").is_object()) {
    stage->temperature_k = Celsius(top, "temperature_C") + kZeroCelsiusK;
    return;
  }
  ObjectReader t = top.Object("temperature_C");
  const double lo = Celsius(t, "min");
  const double hi = Celsius(t, "max");
  const double nominal = t.Has("nominal") ? Celsius(t, "nominal") : 25.0;
  if (!(lo <= nominal && nominal <= hi))
    throw top.ErrorAt("temperature_C",
                      "expected min <= nominal <= max, got min " + Number(lo) +
                          ", nominal " + Number(nominal) + ", max " +
                          Number(hi));
  t.Finish();
  stage->temperature_k = nominal + kZeroCelsiusK;
  stage->temperature_range =
      TemperatureRange{lo + kZeroCelsiusK, hi + kZeroCelsiusK};
}

double Tolerance(ObjectReader& reader) {
  const double t = reader.Quantity("tolerance", Quantity::kRatio);
  if (!(t >= 0 && t < 1))
    throw reader.ErrorAt("tolerance",
                         "expected a tolerance from 0 to below 100 %, got " +
                             Dump(reader.Get("tolerance")));
  return t;
}

// {"technology": name, "tolerance": ratio}; the technology may be inherited.
ResistorSpec ParseResistorSpec(ObjectReader& reader,
                               const DeviceLibrary& library,
                               const ResistorSpec* inherit) {
  ResistorSpec spec;
  if (reader.Has("technology") || !inherit) {
    spec.technology_name = reader.String("technology");
    auto it = library.resistors.find(spec.technology_name);
    if (it == library.resistors.end())
      throw reader.ErrorAt(
          "technology",
          "unknown resistor technology \"" + spec.technology_name + "\"" +
              DidYouMean(spec.technology_name, library.ResistorNames()));
    spec.technology = it->second;
    spec.tolerance = spec.technology.tolerance;
  } else {
    spec = *inherit;
  }
  if (reader.Has("tolerance")) spec.tolerance = Tolerance(reader);
  return spec;
}

const std::vector<std::string>& ResistorNames() {
  static const std::vector<std::string> names = {
      "R_source", "R_in",   "R_f",  "R1",  "R2",    "R3",
      "R_plus",   "R_load", "R_sh", "R_s", "R_leak"};
  return names;
}

// "resistors": {"technology", "tolerance", "<R name>": {...}, ...}.
void ParseResistors(ObjectReader& top, const DeviceLibrary& library,
                    Stage* stage) {
  if (!top.Has("resistors")) return;
  ObjectReader r = top.Object("resistors");
  if (r.Has("technology"))
    stage->resistors = ParseResistorSpec(r, library, nullptr);
  else if (r.Has("tolerance"))
    throw r.ErrorAt("tolerance", "needs a \"technology\" beside it");
  std::vector<std::string> present;
  for (auto& [name, ohms] : StageResistors(*stage)) present.push_back(name);
  if (stage->plus_resistor.mode == PlusResistor::Mode::kAuto)
    present.push_back("R_plus");
  for (auto it = r.json().begin(); it != r.json().end(); ++it) {
    const std::string& key = it.key();
    if (key == "technology" || key == "tolerance") continue;
    const auto& names = ResistorNames();
    if (std::find(names.begin(), names.end(), key) == names.end())
      throw r.ErrorAt(key, "unknown resistor name" + DidYouMean(key, names) +
                               " (expected \"technology\", \"tolerance\" or a "
                               "resistor: R_in, R_f, "
                               "R1, R2, R3, R_plus, R_load, R_source, R_sh, "
                               "R_s, R_leak)");
    if (std::find(present.begin(), present.end(), key) == present.end())
      throw r.ErrorAt(key, "this stage has no " + key);
    ObjectReader o = r.Object(key);
    stage->resistor_overrides[key] = ParseResistorSpec(
        o, library, stage->resistors ? &*stage->resistors : nullptr);
    o.Finish();
  }
  r.Finish();
}

// The netlist names of the capacitors the stage has.
std::vector<std::string> PresentCapacitors(const Stage& stage) {
  std::vector<std::string> out;
  if (stage.feedback.capacitor_f > 0 || stage.capacitor_target)
    out.push_back("C_f");
  if (stage.feedback.kind == Feedback::Kind::kTee &&
      stage.feedback.tee.c3_f > 0)
    out.push_back("C3");
  if (stage.input_capacitor_f > 0) out.push_back("C_input");
  if (stage.plus_resistor_bypass_f > 0) out.push_back("C_plus");
  if (stage.capacitive) out.push_back("C_s");
  if (stage.topology == Topology::kTransimpedance &&
      stage.photodiode.capacitance_f > 0)
    out.push_back("C_d");
  return out;
}

// "capacitors": {"tolerance": ratio, "<C name>": {"tolerance": ratio}, ...}.
void ParseCapacitors(ObjectReader& top, Stage* stage) {
  if (!top.Has("capacitors")) return;
  ObjectReader r = top.Object("capacitors");
  if (r.Has("tolerance")) stage->capacitors.tolerance = Tolerance(r);
  static const std::vector<std::string> names = {"C_f",    "C3",  "C_input",
                                                 "C_plus", "C_s", "C_d"};
  const std::vector<std::string> present = PresentCapacitors(*stage);
  for (auto it = r.json().begin(); it != r.json().end(); ++it) {
    const std::string& key = it.key();
    if (key == "tolerance") continue;
    if (std::find(names.begin(), names.end(), key) == names.end())
      throw r.ErrorAt(key, "unknown capacitor name" + DidYouMean(key, names) +
                               " (expected \"tolerance\" or a capacitor: "
                               "C_f, C3, C_input, C_plus, C_s, C_d)");
    if (std::find(present.begin(), present.end(), key) == present.end())
      throw r.ErrorAt(key, "this stage has no " + key);
    ObjectReader o = r.Object(key);
    stage->capacitors.overrides[key] = Tolerance(o);
    o.Finish();
  }
  r.Finish();
}

// Two names of one file: the same file on disk (links followed), or, when
// either is not there, the same absolute path once normalised.
bool SameFile(const std::string& a, const std::string& b) {
  namespace fs = std::filesystem;
  std::error_code ec;
  if (fs::exists(a, ec) && fs::exists(b, ec)) {
    const bool same = fs::equivalent(a, b, ec);
    if (!ec) return same;
  }
  const fs::path x = fs::absolute(a, ec).lexically_normal();
  const fs::path y = fs::absolute(b, ec).lexically_normal();
  return x == y;
}

// chain.second_stage.stage: the file relative to this one's folder, read
// as a second stage (its devices relative to its own folder).
std::shared_ptr<const Stage> LoadSecondStage(ObjectReader& reader,
                                             const std::string& key,
                                             const std::string& file,
                                             const StageContext& context) {
  const std::string resolved = ResolveStagePath(context, file);
  if (!context.path.empty() && SameFile(resolved, context.path))
    throw reader.ErrorAt(key, "names this stage file itself (" + resolved +
                                  "): a stage cannot follow itself");
  if (!context.read_file)
    throw reader.ErrorAt(key, "no files can be read here (" + resolved + ")");
  std::string text;
  try {
    text = context.read_file(resolved);
  } catch (const Error& e) {
    throw reader.ErrorAt(key, e.message() + " (" + resolved + ")");
  }
  StageContext nested = context;
  nested.folder = std::filesystem::path(resolved).parent_path().string();
  nested.path = resolved;
  nested.as_second_stage = true;
  return std::make_shared<const Stage>(ParseStage(text, resolved, nested));
}

}  // namespace

std::string ResolveStagePath(const StageContext& context,
                             const std::string& path) {
  const std::filesystem::path p(path);
  if (context.folder.empty() || !p.is_relative()) return path;
  return (std::filesystem::path(context.folder) / p).string();
}

Stage ParseStage(std::string_view json_text, std::string_view source_name,
                 const StageContext& context) {
  const std::string source(source_name);
  nlohmann::json doc = ParseJsonText(json_text, source);
  ObjectReader top(doc, source, "");
  Stage stage;
  stage.name = top.String("name");

  ParseTemperature(top, &stage);

  ObjectReader band = top.Object("band_Hz");
  stage.band_low_hz = band.Quantity("low", Quantity::kFrequency);
  stage.band_high_hz = band.Quantity("high", Quantity::kFrequency);
  if (!(stage.band_low_hz > 0))
    throw band.ErrorAt(
        "low",
        "expected a positive frequency (1/f noise diverges at 0 Hz), got " +
            Dump(band.Get("low")));
  if (!(stage.band_high_hz > stage.band_low_hz))
    throw band.ErrorAt("high", "expected a frequency above the low edge (" +
                                   FormatEng(stage.band_low_hz, "Hz") +
                                   "), got " + Dump(band.Get("high")));
  band.Finish();

  if (auto ref = top.OptionalQuantity("reference_frequency_Hz",
                                      Quantity::kFrequency)) {
    if (!(*ref > 0))
      throw top.ErrorAt("reference_frequency_Hz",
                        "expected a positive frequency, got " +
                            Dump(top.Get("reference_frequency_Hz")));
    stage.reference_hz = *ref;
  }

  ObjectReader opamp = top.Object("opamp");
  stage.opamp = ParseOpAmp(opamp, context);

  ObjectReader st = top.Object("stage");
  const std::string topology = st.String("topology");
  if (topology == "inverting") {
    stage.topology = Topology::kInverting;
  } else if (topology == "transimpedance") {
    stage.topology = Topology::kTransimpedance;
  } else {
    throw st.ErrorAt("topology",
                     "unknown topology \"" + topology + "\"" +
                         DidYouMean(topology, {"inverting", "transimpedance"}));
  }
  const bool photodiode = stage.topology == Topology::kTransimpedance;
  if (context.as_second_stage && photodiode)
    throw st.ErrorAt("topology",
                     "a second stage is \"inverting\" (the front stage's "
                     "output is a voltage)");
  if (context.as_second_stage && top.Has("source"))
    throw top.ErrorAt("source",
                      "not in a second stage file (the front stage's output "
                      "drives its input resistor, as a 0 ohm voltage source)");

  if (top.Has("source")) {
    ObjectReader src = top.Object("source");
    if (photodiode) {
      if (!src.Has("photodiode"))
        throw src.ErrorHere("expected \"photodiode\" for a " + topology +
                            " stage");
      stage.photodiode = ParsePhotodiode(src);
    } else {
      const bool voltage = src.Has("voltage");
      if (voltage == src.Has("capacitive"))
        throw src.ErrorHere(
            "expected exactly one of \"voltage\" or \"capacitive\" for an " +
            topology + " stage");
      if (voltage)
        stage.source = ParseVoltageSource(src);
      else
        stage.capacitive = ParseCapacitiveSensor(src);
    }
    if (src.Has("noise"))
      stage.sensor_noise = ParseSensorNoise(src, photodiode);
    if (src.Has("sensitivity")) {
      stage.sensitivity = ParseSensitivity(
          src, photodiode ? Quantity::kCurrent : Quantity::kVoltage,
          stage.capacitive.has_value());
      // A photodiode's sensitivity in A per W is its responsivity.
      if (photodiode && stage.sensitivity->per == "W") {
        const double given = stage.photodiode.responsivity_a_per_w;
        const double value = stage.sensitivity->value;
        if (given > 0 && std::fabs(given - value) > 1e-12 * given)
          throw src.ErrorAt("sensitivity",
                            "expected the photodiode's responsivity (" +
                                Dump(given) + " A/W) when per \"W\", got " +
                                Dump(value) + " A/W");
        if (!(given > 0)) stage.photodiode.responsivity_a_per_w = value;
      }
    }
    src.Finish();
  } else if (photodiode) {
    throw top.ErrorAt(
        "source",
        "missing (required: a transimpedance stage needs \"photodiode\")");
  }

  if (photodiode) {
    if (st.Has("input_resistor"))
      throw st.ErrorAt("input_resistor",
                       "not used by a transimpedance stage (the photodiode "
                       "drives the - input)");
  } else if (stage.capacitive) {
    // Optional: without it the sensor drives the - input directly.
    if (st.Has("input_resistor"))
      stage.input_resistor_ohm = PositiveResistance(st, "input_resistor");
  } else {
    stage.input_resistor_ohm = PositiveResistance(st, "input_resistor");
  }
  if (st.Has("input_capacitor")) {
    if (photodiode)
      throw st.ErrorAt("input_capacitor",
                       "not used by a transimpedance stage (it has no input "
                       "resistor)");
    if (!(stage.input_resistor_ohm > 0))
      throw st.ErrorAt("input_capacitor",
                       "needs an \"input_resistor\" to sit in series with");
    stage.input_capacitor_f = PositiveCapacitance(st, "input_capacitor");
  }
  ObjectReader fb = st.Object("feedback");
  stage.feedback = ParseFeedback(fb, &stage.capacitor_target);
  if (stage.capacitive && stage.capacitor_target)
    throw fb.ErrorAt("capacitor",
                     "\"auto\" is not for a capacitive sensor: C_f sets its "
                     "charge gain (-1/C_f); give a capacitance");
  stage.plus_resistor = ParsePlusResistor(st);
  if (st.Has("plus_resistor_bypass")) {
    if (stage.plus_resistor.mode == PlusResistor::Mode::kNone)
      throw st.ErrorAt("plus_resistor_bypass",
                       "needs a \"plus_resistor\" to bypass");
    stage.plus_resistor_bypass_f =
        NonNegativeCapacitance(st, "plus_resistor_bypass");
  }
  if (st.Has("load")) stage.load_ohm = PositiveResistance(st, "load");
  st.Finish();

  if (top.Has("dc_input")) {
    if (stage.capacitive)
      throw top.ErrorAt("dc_input",
                        "not with a capacitive sensor (its capacitance "
                        "passes no DC)");
    stage.dc_input = top.Quantity(
        "dc_input", photodiode ? Quantity::kCurrent : Quantity::kVoltage);
    if (photodiode && stage.photodiode.photocurrent_a > 0)
      throw top.ErrorAt("dc_input",
                        "not with the photodiode's photocurrent (it is the "
                        "input's DC level); give one of them");
  }
  ParseResistors(top, *context.library, &stage);
  ParseCapacitors(top, &stage);

  if (auto fs =
          top.OptionalQuantity("full_scale_output_V", Quantity::kVoltage)) {
    if (!(*fs > 0))
      throw top.ErrorAt("full_scale_output_V",
                        "expected a positive voltage, got " +
                            Dump(top.Get("full_scale_output_V")));
    stage.full_scale_output_v = *fs;
  }
  if (top.Has("chain")) {
    if (context.as_second_stage)
      throw top.ErrorAt("chain",
                        "not in a second stage file (the front stage's file "
                        "holds the chain)");
    ObjectReader chain = top.Object("chain");
    stage.chain = ParseChain(chain, stage.band_low_hz,
                             [&context](ObjectReader& r, const std::string& key,
                                        const std::string& file) {
                               return LoadSecondStage(r, key, file, context);
                             });
  }
  top.Finish();
  return stage;
}

Stage LoadStageFile(const std::string& path, const DeviceLibrary& library) {
  // "-" is standard input; its device files are found from the current
  // folder.
  const bool from_stdin = path == "-";
  const std::string text =
      from_stdin ? ReadStandardInput(kStandardInputName) : ReadTextFile(path);
  const std::filesystem::path folder =
      from_stdin ? std::filesystem::path()
                 : std::filesystem::path(path).parent_path();
  StageContext context;
  context.library = &library;
  context.read_file = [](const std::string& file) {
    return ReadTextFile(file);
  };
  context.folder = folder.string();
  context.path = from_stdin ? "" : path;
  return ParseStage(text, from_stdin ? kStandardInputName : path, context);
}

}  // namespace hushgain
