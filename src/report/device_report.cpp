#include "report/device_report.h"

#include <nlohmann/json.hpp>
#include <utility>
#include <vector>

#include "base/printf.h"
#include "io/units.h"
#include "report/table.h"
#include "report/text_escape.h"
#include "report/unit_symbols.h"

namespace hushgain {
namespace {

std::string Label(const DeviceFileInfo& info) {
  return info.illustrative.empty() ? "user" : "illustrative";
}

const DeviceFileInfo& InfoOf(const std::map<std::string, DeviceFileInfo>& files,
                             const std::string& name) {
  static const DeviceFileInfo kNoInfo;
  auto it = files.find(name);
  return it == files.end() ? kNoInfo : it->second;
}

std::string BiasLawText(const OpAmpModel& m) {
  switch (m.ib_law) {
    case BiasTemperatureLaw::kDoubling:
      return "doubles every " + Printf("%g", m.ib_law_value) +
             " \xC2\xB0"
             "C";
    case BiasTemperatureLaw::kCoefficient:
      return Printf(
          "%g per \xC2\xB0"
          "C",
          m.ib_law_value);
    case BiasTemperatureLaw::kNone:
      break;
  }
  return "constant";
}

Table OpAmpTable(const DeviceLibrary& library, bool si) {
  Table t;
  t.header = {"name", "class", "e_n at 1 kHz", "e_n corner", "i_n at 1 kHz",
              "GBW",  "Vos",   "Ib",           "data"};
  if (si)
    t.header = {"name",
                "class",
                "e_n_1kHz_V_per_rtHz",
                "e_n_corner_Hz",
                "i_n_1kHz_A_per_rtHz",
                "gbw_Hz",
                "vos_V",
                "ib_A",
                "data"};
  t.align = {Table::Align::kLeft,  Table::Align::kLeft,  Table::Align::kRight,
             Table::Align::kRight, Table::Align::kRight, Table::Align::kRight,
             Table::Align::kRight, Table::Align::kRight, Table::Align::kLeft};
  for (const auto& [name, m] : library.opamps) {
    const double e = VoltageNoiseDensity(m, kDeviceSpotHz);
    const double i = CurrentNoiseDensity(m, kDeviceSpotHz);
    const std::string data = Label(InfoOf(library.opamp_files, name));
    if (si)
      t.AddRow({name, m.class_name, Printf("%.6g", e),
                Printf("%.6g", m.f_cv_hz), Printf("%.6g", i),
                Printf("%.6g", m.gbw_hz), Printf("%.6g", m.vos_v),
                Printf("%.6g", m.ib_a), data});
    else
      t.AddRow(
          {name, m.class_name, FormatEng(e, std::string("V") + kPerRtHz),
           m.voltage_noise_table.empty() ? FormatEng(m.f_cv_hz, "Hz") : "table",
           FormatEng(i, std::string("A") + kPerRtHz), FormatEng(m.gbw_hz, "Hz"),
           FormatEng(m.vos_v, "V"), FormatEng(m.ib_a, "A"), data});
  }
  return t;
}

Table ResistorTable(const DeviceLibrary& library) {
  Table t;
  t.header = {"name", "class", "noise index", "tempco", "tolerance", "data"};
  t.align = {Table::Align::kLeft,  Table::Align::kLeft,  Table::Align::kRight,
             Table::Align::kRight, Table::Align::kRight, Table::Align::kLeft};
  for (const auto& [name, r] : library.resistors)
    t.AddRow({name, r.class_name, Printf("%.1f dB", r.noise_index_db),
              Printf("%g ppm/\xC2\xB0"
                     "C",
                     r.tempco_per_k * 1e6),
              Printf("%g %%", r.tolerance * 100),
              Label(InfoOf(library.resistor_files, name))});
  return t;
}

nlohmann::json TableJson(const NoiseTable& table) {
  nlohmann::json points = nlohmann::json::array();
  for (std::size_t k = 0; k < table.f_hz.size(); ++k)
    points.push_back({table.f_hz[k], table.density[k]});
  return points;
}

// One op-amp's parameters as (key, display value, SI value) in the order
// of the device file's keys (README, "Device files").
struct Field {
  std::string key;
  std::string shown;
  double si;
};

std::vector<Field> OpAmpFields(const OpAmpModel& m) {
  const std::string v_rthz = std::string("V") + kPerRtHz;
  const std::string a_rthz = std::string("A") + kPerRtHz;
  return {
      {"voltage_noise", FormatEng(m.e_w_v_per_rthz, v_rthz), m.e_w_v_per_rthz},
      {"voltage_noise_corner", FormatEng(m.f_cv_hz, "Hz"), m.f_cv_hz},
      {"current_noise", FormatEng(m.i_w_a_per_rthz, a_rthz), m.i_w_a_per_rthz},
      {"current_noise_corner", FormatEng(m.f_ci_hz, "Hz"), m.f_ci_hz},
      {"open_loop_gain", Printf("%.6g", m.open_loop_gain), m.open_loop_gain},
      {"gbw", FormatEng(m.gbw_hz, "Hz"), m.gbw_hz},
      {"output_resistance", FormatEng(m.output_resistance_ohm, "\xCE\xA9"),
       m.output_resistance_ohm},
      {"input_capacitance_cm", FormatEng(m.c_cm_f, "F"), m.c_cm_f},
      {"input_capacitance_diff", FormatEng(m.c_diff_f, "F"), m.c_diff_f},
      {"offset_voltage", FormatEng(m.vos_v, "V"), m.vos_v},
      {"offset_voltage_drift",
       FormatEng(m.vos_drift_v_per_k,
                 "V/\xC2\xB0"
                 "C"),
       m.vos_drift_v_per_k},
      {"bias_current", FormatEng(m.ib_a, "A"), m.ib_a},
      {"offset_current", FormatEng(m.ios_a, "A"), m.ios_a},
      {"output_current_limit", FormatEng(m.output_current_limit_a, "A"),
       m.output_current_limit_a},
      {"supply_span", FormatEng(m.supply_v, "V"), m.supply_v},
  };
}

std::string OpAmpDetail(const std::string& name, const OpAmpModel& m,
                        const DeviceFileInfo& info, const std::string& format) {
  const std::vector<Field> fields = OpAmpFields(m);
  const std::string in_text =
      m.current_noise_temperature == CurrentNoiseTemperature::kWithBiasCurrent
          ? "with_bias_current"
          : "constant";
  if (format == "json") {
    nlohmann::json parameters = nlohmann::json::object();
    for (const Field& f : fields) parameters[f.key] = f.si;
    parameters["bias_current_temperature"] = BiasLawText(m);
    parameters["current_noise_temperature"] = in_text;
    if (!m.voltage_noise_table.empty())
      parameters["voltage_noise_table"] = TableJson(m.voltage_noise_table);
    if (!m.current_noise_table.empty())
      parameters["current_noise_table"] = TableJson(m.current_noise_table);
    nlohmann::json out = {{"name", name},          {"kind", "opamp"},
                          {"class", m.class_name}, {"file", info.path},
                          {"data", Label(info)},   {"parameters", parameters}};
    if (!info.illustrative.empty()) out["illustrative"] = info.illustrative;
    if (!info.source.empty()) out["source"] = info.source;
    return out.dump(2) + "\n";
  }
  Table t;
  t.header = {"parameter", "value"};
  if (format == "csv") t.header = {"parameter", "value_SI"};
  for (const Field& f : fields)
    t.AddRow({f.key, format == "csv" ? Printf("%.6g", f.si) : f.shown});
  t.AddRow({"bias_current_temperature", BiasLawText(m)});
  t.AddRow({"current_noise_temperature", in_text});
  auto add_table = [&](const char* key, const NoiseTable& table,
                       const std::string& unit) {
    for (std::size_t k = 0; k < table.f_hz.size(); ++k)
      t.AddRow({std::string(key) + " " + FormatEng(table.f_hz[k], "Hz"),
                format == "csv" ? Printf("%.6g", table.density[k])
                                : FormatEng(table.density[k], unit)});
  };
  add_table("voltage_noise_table", m.voltage_noise_table,
            std::string("V") + kPerRtHz);
  add_table("current_noise_table", m.current_noise_table,
            std::string("A") + kPerRtHz);
  if (format == "csv") return RenderCsv(t);
  std::string head;
  const std::string about =
      info.illustrative.empty()
          ? "user part" + (info.source.empty() ? "" : ": " + info.source)
          : info.illustrative;
  if (format == "markdown") {
    head = "## " + EscapeMarkdown(name) + " (" + EscapeMarkdown(m.class_name) +
           ")\n\n- file: " + EscapeMarkdown(info.path) +
           "\n- data: " + EscapeMarkdown(about) + "\n\n";
    return head + RenderMarkdown(t);
  }
  head = EscapeText(name) + " (" + EscapeText(m.class_name) +
         ")\n  file: " + EscapeText(info.path) +
         "\n  data: " + EscapeText(about) + "\n\n";
  return head + RenderText(t);
}

std::string ResistorDetail(const std::string& name, const ResistorTechnology& r,
                           const DeviceFileInfo& info,
                           const std::string& format) {
  if (format == "json") {
    nlohmann::json out = {{"name", name},
                          {"kind", "resistor_technology"},
                          {"class", r.class_name},
                          {"file", info.path},
                          {"data", Label(info)},
                          {"noise_index_dB", r.noise_index_db},
                          {"temperature_coefficient_per_C", r.tempco_per_k},
                          {"tolerance", r.tolerance}};
    if (!info.illustrative.empty()) out["illustrative"] = info.illustrative;
    if (!info.source.empty()) out["source"] = info.source;
    return out.dump(2) + "\n";
  }
  Table t;
  t.header = {"parameter", "value"};
  const bool csv = format == "csv";
  t.AddRow({"noise_index", csv ? Printf("%.6g", r.noise_index_db)
                               : Printf("%.1f dB", r.noise_index_db)});
  t.AddRow({"temperature_coefficient", csv ? Printf("%.6g", r.tempco_per_k)
                                           : Printf("%g ppm/\xC2\xB0"
                                                    "C",
                                                    r.tempco_per_k * 1e6)});
  t.AddRow({"tolerance", csv ? Printf("%.6g", r.tolerance)
                             : Printf("%g %%", r.tolerance * 100)});
  if (csv) return RenderCsv(t);
  const std::string about =
      info.illustrative.empty() ? "user data" : info.illustrative;
  if (format == "markdown")
    return "## " + EscapeMarkdown(name) + " (" + EscapeMarkdown(r.class_name) +
           ")\n\n- file: " + EscapeMarkdown(info.path) +
           "\n- data: " + EscapeMarkdown(about) + "\n\n" + RenderMarkdown(t);
  return EscapeText(name) + " (" + EscapeText(r.class_name) +
         ")\n  file: " + EscapeText(info.path) +
         "\n  data: " + EscapeText(about) + "\n\n" + RenderText(t);
}

}  // namespace

Table OpAmpParameterTable(const OpAmpModel& m) {
  Table t;
  t.header = {"parameter", "value"};
  t.align = {Table::Align::kLeft, Table::Align::kRight};
  for (const Field& f : OpAmpFields(m)) t.AddRow({f.key, f.shown});
  t.AddRow({"bias_current_temperature", BiasLawText(m)});
  t.AddRow(
      {"current_noise_temperature",
       m.current_noise_temperature == CurrentNoiseTemperature::kWithBiasCurrent
           ? "with_bias_current"
           : "constant"});
  return t;
}

std::string DeviceListReport(const DeviceLibrary& library,
                             const std::string& format) {
  if (format == "csv") return RenderCsv(OpAmpTable(library, true));
  if (format == "json") {
    nlohmann::json opamps = nlohmann::json::array();
    for (const auto& [name, m] : library.opamps)
      opamps.push_back(
          {{"name", name},
           {"class", m.class_name},
           {"e_n_1kHz_V_per_rtHz", VoltageNoiseDensity(m, kDeviceSpotHz)},
           {"e_n_corner_Hz", m.f_cv_hz},
           {"i_n_1kHz_A_per_rtHz", CurrentNoiseDensity(m, kDeviceSpotHz)},
           {"gbw_Hz", m.gbw_hz},
           {"vos_V", m.vos_v},
           {"ib_A", m.ib_a},
           {"data", Label(InfoOf(library.opamp_files, name))}});
    nlohmann::json resistors = nlohmann::json::array();
    for (const auto& [name, r] : library.resistors)
      resistors.push_back(
          {{"name", name},
           {"class", r.class_name},
           {"noise_index_dB", r.noise_index_db},
           {"temperature_coefficient_per_C", r.tempco_per_k},
           {"tolerance", r.tolerance},
           {"data", Label(InfoOf(library.resistor_files, name))}});
    return nlohmann::json{{"opamps", opamps}, {"resistors", resistors}}.dump(
               2) +
           "\n";
  }
  if (format == "markdown")
    return "## Op-amps\n\n" + RenderMarkdown(OpAmpTable(library, false)) +
           "\n## Resistor technologies\n\n" +
           RenderMarkdown(ResistorTable(library));
  return "op-amps\n" + RenderText(OpAmpTable(library, false)) +
         "\nresistor technologies\n" + RenderText(ResistorTable(library)) +
         "\n\"illustrative\": a shipped class with class-typical values; "
         "\"user\": a part file of your own.\n";
}

std::string DeviceDetailReport(const DeviceLibrary& library,
                               const std::string& name,
                               const std::string& format) {
  if (auto it = library.opamps.find(name); it != library.opamps.end())
    return OpAmpDetail(name, it->second, InfoOf(library.opamp_files, name),
                       format);
  const ResistorTechnology& r = library.resistors.at(name);
  return ResistorDetail(name, r, InfoOf(library.resistor_files, name), format);
}

}  // namespace hushgain
