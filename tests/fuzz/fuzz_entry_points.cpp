#include "fuzz/fuzz_entry_points.h"

#include <cmath>
#include <exception>
#include <optional>
#include <string>
#include <string_view>

#include "analysis/mna_system.h"
#include "budget/compute_budget.h"
#include "circuit/expand_stage.h"
#include "circuit/opamp_model.h"
#include "io/device_library.h"
#include "io/error.h"
#include "io/stage_parser.h"
#include "io/units.h"
#include "report/device_report.h"

namespace hushgain::fuzz {
namespace {

constexpr int kQuantityKinds = 13;  // Quantity::kResistance .. kPower

// Two op-amp classes and one resistor technology with class-typical values,
// in memory: the stage fuzzer reads no file.
constexpr std::string_view kJfetOpAmp = R"({
  "kind": "opamp", "class": "JFET input",
  "illustrative": "class-typical values for budgeting; illustrative, not the data of any real part",
  "parameters": {
    "voltage_noise": "6 nV/rtHz", "voltage_noise_corner": "50 Hz",
    "current_noise": "3 fA/rtHz", "current_noise_corner": "0",
    "open_loop_gain": "120 dB", "gbw": "5 MHz", "output_resistance": "100",
    "input_capacitance_cm": "5p", "input_capacitance_diff": "5p",
    "offset_voltage": "300u", "offset_voltage_drift": "3 uV/C",
    "bias_current": "5p", "offset_current": "2p",
    "bias_current_temperature": {"law": "doubling", "interval_C": 10},
    "output_current_limit": "20m", "supply_span": "36"}})";
constexpr std::string_view kZeroDriftOpAmp = R"({
  "kind": "opamp", "class": "chopper / zero-drift",
  "illustrative": "class-typical values for budgeting; illustrative, not the data of any real part",
  "parameters": {
    "voltage_noise": "15 nV/rtHz", "current_noise": "100 fA/rtHz",
    "open_loop_gain": "150 dB", "gbw": "2 MHz",
    "offset_voltage": "3u", "bias_current": "100p", "offset_current": "200p",
    "bias_current_temperature": {"law": "constant"}}})";
constexpr std::string_view kThinFilm = R"({
  "kind": "resistor_technology", "class": "thin film",
  "illustrative": "class-typical values for budgeting; illustrative, not the data of any real part",
  "noise_index_dB": -35, "temperature_coefficient_per_C": "25 ppm",
  "tolerance": "0.1%"})";

constexpr std::string_view kThickFilm =
    R"({"kind": "resistor_technology", "class": "thick film",
  "illustrative": "class-typical values for budgeting; illustrative, not the data of any real part",
  "noise_index_dB": -10, "temperature_coefficient_per_C": "100 ppm",
  "tolerance": "1%"})";

const DeviceLibrary& Library() {
  // Built once per process from the literals above (a test fixture, not a
  // cache of program state).
  static const DeviceLibrary library = [] {
    DeviceLibrary l;
    l.opamps["jfet-input"] = ParseOpAmpDevice(kJfetOpAmp, "jfet-input.json");
    l.opamps["zero-drift"] =
        ParseOpAmpDevice(kZeroDriftOpAmp, "zero-drift.json");
    l.resistors["thin-film"] =
        ParseResistorTechnology(kThinFilm, "thin-film.json");
    l.resistors["thick-film"] =
        ParseResistorTechnology(kThickFilm, "thick-film.json");
    return l;
  }();
  return library;
}

// A device named by path: "custom.json" exists, every other path does not.
std::string ReadDevice(const std::string& path) {
  if (path == "custom.json") return std::string(kJfetOpAmp);
  throw Error(path, "", "cannot read: no such file or directory");
}

bool Finite(double v) { return std::isfinite(v); }
bool Positive(double v) { return std::isfinite(v) && v > 0; }
bool NonNegative(double v) { return std::isfinite(v) && v >= 0; }

// The documented rules of an accepted stage; "" when all hold.
std::string CheckStage(const Stage& s) {
  if (!Positive(s.temperature_k)) return "temperature_k not positive";
  if (!Positive(s.band_low_hz)) return "band low not positive";
  if (!(Finite(s.band_high_hz) && s.band_high_hz > s.band_low_hz))
    return "band high not above low";
  if (s.reference_hz && !Positive(*s.reference_hz))
    return "reference frequency not positive";
  const OpAmpModel& o = s.opamp;
  if (!Positive(o.open_loop_gain) || !Positive(o.gbw_hz))
    return "op-amp gain or GBW not positive";
  for (double v :
       {o.e_w_v_per_rthz, o.f_cv_hz, o.i_w_a_per_rthz, o.f_ci_hz,
        o.output_resistance_ohm, o.c_cm_f, o.c_diff_f, o.vos_v, o.ios_a})
    if (!NonNegative(v)) return "op-amp parameter negative or not finite";
  if (!Finite(o.ib_a) || !Finite(o.vos_drift_v_per_k) ||
      !Finite(o.ib_law_value))
    return "op-amp parameter not finite";
  if (!Positive(o.output_current_limit_a) || !Positive(o.supply_v))
    return "op-amp drive not positive";
  const Feedback& f = s.feedback;
  if (f.kind == Feedback::Kind::kResistor && !Positive(f.resistor_ohm))
    return "feedback resistor not positive";
  if (f.kind == Feedback::Kind::kTee &&
      !(Positive(f.tee.r1_ohm) && Positive(f.tee.r2_ohm) &&
        Positive(f.tee.r3_ohm)))
    return "tee resistor not positive";
  if (!NonNegative(f.capacitor_f)) return "feedback capacitor negative";
  if (!NonNegative(f.tee.c3_f) || !NonNegative(s.input_capacitor_f))
    return "coupling capacitor negative";
  if (s.input_capacitor_f > 0 && !Positive(s.input_resistor_ohm))
    return "input capacitor without an input resistor";
  if (s.topology == Topology::kInverting && s.capacitive) {
    if (!Positive(s.capacitive->capacitance_f))
      return "sensor capacitance not positive";
    if (!NonNegative(s.capacitive->leakage_resistance_ohm) ||
        !NonNegative(s.input_resistor_ohm))
      return "sensor leakage or input resistor negative";
  } else if (s.topology == Topology::kInverting) {
    if (!Positive(s.input_resistor_ohm)) return "input resistor not positive";
    if (!NonNegative(s.source.resistance_ohm))
      return "source resistance negative";
  } else {
    const Photodiode& p = s.photodiode;
    for (double v : {p.capacitance_f, p.shunt_resistance_ohm, p.dark_current_a,
                     p.responsivity_a_per_w, p.photocurrent_a, p.reverse_bias_v,
                     p.bias_noise_v_per_rthz, p.series_resistance_ohm})
      if (!NonNegative(v)) return "photodiode parameter negative";
    if (!Positive(p.doubling_interval_k))
      return "doubling interval not positive";
  }
  if (s.plus_resistor.mode == PlusResistor::Mode::kValue &&
      !Positive(s.plus_resistor.ohms))
    return "plus resistor not positive";
  if (s.load_ohm && !Positive(*s.load_ohm)) return "load not positive";
  if (s.full_scale_output_v && !Positive(*s.full_scale_output_v))
    return "full scale not positive";
  return "";
}

// Builds and solves the accepted stage at both band edges: a Status
// failure is a legitimate answer, a crash or a non-finite transfer after
// an ok Status is not.
std::string CheckSolves(const Stage& stage) {
  const Netlist net = ExpandStage(stage);
  MnaSystem system;
  if (!MnaSystem::Build(net, &system).ok) return "";
  AdjointSolver solver(system);
  const Port signal = system.Compile(net.signal);
  for (double f : {0.0, stage.band_low_hz, stage.band_high_hz}) {
    if (!solver.SolveAt(f).ok) continue;
    const auto t = solver.Transfer(signal);
    if (!Finite(t.real()) || !Finite(t.imag()))
      return "non-finite signal transfer after an ok solve";
  }
  return "";
}

// "" when a refusal keeps the message rules: one line, starting with the
// file it names.
std::string CheckRefusal(const Error& e, const std::string& who) {
  const std::string message = e.what();
  if (message.find('\n') != std::string::npos)
    return who + " error message spans lines: " + message;
  if (message.rfind(e.source(), 0) != 0)
    return who + " error message does not start with its file: " + message;
  return "";
}

// The documented rules of an accepted op-amp device; "" when all hold.
std::string CheckOpAmp(const OpAmpModel& o) {
  for (double v : {o.e_w_v_per_rthz, o.f_cv_hz, o.i_w_a_per_rthz, o.f_ci_hz,
                   o.output_resistance_ohm, o.c_cm_f, o.c_diff_f, o.vos_v,
                   o.vos_drift_v_per_k, o.ios_a})
    if (!NonNegative(v)) return "parameter negative or not finite";
  if (!Finite(o.ib_a) || !Finite(o.ib_law_value))
    return "bias current or its law not finite";
  if (o.ib_law == BiasTemperatureLaw::kDoubling && !Positive(o.ib_law_value))
    return "doubling interval not positive";
  if (!Positive(o.open_loop_gain) || !Positive(o.gbw_hz) ||
      !Positive(o.output_current_limit_a) || !Positive(o.supply_v))
    return "gain, GBW, output current or supply not positive";
  for (const NoiseTable* t : {&o.voltage_noise_table, &o.current_noise_table}) {
    if (const std::string why = t->Validate(); !why.empty())
      return "noise table: " + why;
    for (std::size_t i = 0; i < t->f_hz.size(); ++i)
      if (!Positive(t->f_hz[i]) || !Positive(t->density[i]))
        return "noise table point not positive and finite";
  }
  // The densities at the points of a table and between them are numbers.
  for (double f : {1e-3, 0.1, 10.0, 1e3, 1e5, 1e7}) {
    if (!NonNegative(VoltageNoiseDensity(o, f)) ||
        !NonNegative(CurrentNoiseDensity(o, f)))
      return "noise density not a non-negative number at " + std::to_string(f) +
             " Hz";
  }
  return "";
}

// A transimpedance stage and a tee stage that take their op-amp from the
// file "device.json" (the fuzzed bytes).
constexpr std::string_view kDeviceStages[] = {
    R"({"name": "device under test", "band_Hz": {"low": "1", "high": "10k"},
  "opamp": {"device": "device.json"},
  "source": {"photodiode": {"capacitance": "20p", "shunt_resistance": "1G",
    "dark_current": "1n"}},
  "stage": {"topology": "transimpedance",
    "feedback": {"resistor": "1M", "capacitor": "2p"}}})",
    R"({"name": "device in a tee", "band_Hz": {"low": "0.1", "high": "20k"},
  "opamp": {"device": "device.json"},
  "source": {"voltage": {"resistance": "1k"}},
  "stage": {"topology": "inverting", "input_resistor": "10k",
    "feedback": {"tee": {"r1": "100k", "r2": "100k", "r3": "1k"},
                 "capacitor": "10p"},
    "plus_resistor": "auto", "load": "10k"},
  "full_scale_output_V": 10})"};

}  // namespace

std::string FuzzQuantity(const std::uint8_t* data, std::size_t size) {
  if (size == 0) return "";
  const auto kind = static_cast<Quantity>(data[0] % kQuantityKinds);
  const std::string_view text(reinterpret_cast<const char*>(data) + 1,
                              size - 1);
  try {
    std::string why;
    const std::optional<double> v = ParseQuantity(text, kind, &why);
    if (v) {
      if (!std::isfinite(*v))
        return "ParseQuantity accepted a non-finite value";
      (void)FormatEng(*v, "V");
      (void)FormatEngAscii(*v, "V", 3);
    } else if (why.empty()) {
      return "ParseQuantity refused without a reason";
    }
    (void)DisplayWidth(text);
    (void)QuantityName(kind);
  } catch (const std::exception& e) {
    return std::string("ParseQuantity threw: ") + e.what();
  } catch (...) {
    return "ParseQuantity threw a non-exception";
  }
  return "";
}

std::string FuzzStage(const std::uint8_t* data, std::size_t size) {
  const std::string_view text(reinterpret_cast<const char*>(data), size);
  StageContext context;
  context.library = &Library();
  context.read_file = ReadDevice;
  Stage stage;
  try {
    stage = ParseStage(text, "stage.json", context);
  } catch (const Error& e) {
    const std::string message = e.what();
    if (message.find('\n') != std::string::npos)
      return "error message spans lines: " + message;
    if (message.rfind(e.source(), 0) != 0)
      return "error message does not start with its file: " + message;
    return "";
  } catch (const std::exception& e) {
    return std::string("ParseStage threw a non-Error: ") + e.what();
  } catch (...) {
    return "ParseStage threw a non-exception";
  }
  std::string broken = CheckStage(stage);
  if (!broken.empty()) return "accepted stage breaks a rule: " + broken;
  try {
    return CheckSolves(stage);
  } catch (const std::exception& e) {
    return std::string("the engine threw: ") + e.what();
  }
}

std::string FuzzDevice(const std::uint8_t* data, std::size_t size) {
  const std::string text(reinterpret_cast<const char*>(data), size);
  DeviceLibrary library = Library();
  bool opamp = false;
  try {
    DeviceFileInfo info;
    const OpAmpModel model = ParseOpAmpDevice(text, "device.json", &info);
    if (std::string broken = CheckOpAmp(model); !broken.empty())
      return "accepted op-amp breaks a rule: " + broken;
    library.opamps["device"] = model;
    library.opamp_files["device"] = info;
    opamp = true;
  } catch (const Error& e) {
    if (std::string f = CheckRefusal(e, "op-amp"); !f.empty()) return f;
  } catch (const std::exception& e) {
    return std::string("ParseOpAmpDevice threw a non-Error: ") + e.what();
  }
  bool resistor = false;
  try {
    DeviceFileInfo info;
    const ResistorTechnology tech =
        ParseResistorTechnology(text, "device.json", &info);
    if (!Finite(tech.noise_index_db) || !Finite(tech.tempco_per_k) ||
        !NonNegative(tech.tolerance))
      return "accepted resistor technology breaks a rule";
    library.resistors["device"] = tech;
    library.resistor_files["device"] = info;
    resistor = true;
  } catch (const Error& e) {
    if (std::string f = CheckRefusal(e, "resistor"); !f.empty()) return f;
  } catch (const std::exception& e) {
    return std::string("ParseResistorTechnology threw a non-Error: ") +
           e.what();
  }
  if (opamp && resistor) return "one file accepted as two kinds of device";
  if (!opamp && !resistor) return "";
  try {
    for (const char* format : {"text", "json", "markdown", "csv"}) {
      (void)DeviceListReport(library, format);
      (void)DeviceDetailReport(library, "device", format);
    }
  } catch (const std::exception& e) {
    return std::string("the device report threw: ") + e.what();
  }
  if (!opamp) return "";
  // The op-amp in two stages: parsed by name of its file, built, solved
  // and budgeted. A refusal of the stage is an answer; a budget that says
  // ok must hold numbers.
  StageContext context;
  context.library = &library;
  context.read_file = [&text](const std::string& path) -> std::string {
    if (path == "device.json") return text;
    throw Error(path, "", "cannot read: no such file or directory");
  };
  for (std::string_view stage_text : kDeviceStages) {
    Stage stage;
    try {
      stage = ParseStage(stage_text, "stage.json", context);
    } catch (const Error& e) {
      if (std::string f = CheckRefusal(e, "stage with the op-amp"); !f.empty())
        return f;
      continue;
    } catch (const std::exception& e) {
      return std::string("ParseStage threw a non-Error: ") + e.what();
    }
    try {
      if (std::string f = CheckSolves(stage); !f.empty()) return f;
      BudgetOptions options;
      options.integration.relative_tolerance = 1e-3;
      const BudgetOutcome outcome = ComputeBudget(stage, options);
      if (outcome.status.ok && (!NonNegative(outcome.budget.output_rms_v) ||
                                !NonNegative(outcome.budget.input_rms)))
        return "a budget that says ok holds a noise that is not a number";
    } catch (const std::exception& e) {
      return std::string("the engine threw: ") + e.what();
    }
  }
  return "";
}

}  // namespace hushgain::fuzz
