#include "report/json_report.h"

#include <nlohmann/json.hpp>

namespace hushgain {
namespace {

const char* ChangeName(TeeChange::Kind kind) {
  switch (kind) {
    case TeeChange::Kind::kAdded:
      return "added";
    case TeeChange::Kind::kRemoved:
      return "removed";
    case TeeChange::Kind::kRaised:
      return "raised";
    case TeeChange::Kind::kLowered:
      return "lowered";
    case TeeChange::Kind::kSame:
      return "same";
  }
  return "same";
}

}  // namespace

std::string BudgetToJson(const Budget& b) {
  using nlohmann::json;
  json out;
  out["stage"] = b.stage_name;
  out["opamp"] = {{"class", b.opamp_class},
                  {"gbw_Hz", b.opamp_gbw_hz},
                  {"open_loop_gain", b.opamp_open_loop_gain}};
  out["temperature_K"] = b.temperature_k;
  out["band_Hz"] = {b.band_low_hz, b.band_high_hz};
  out["reference_frequency_Hz"] = b.reference_hz;
  out["signal_gain"] = {
      {"magnitude", b.signal_gain_ref},
      {"phase_deg", b.signal_gain_phase_ref_deg},
      {"dc", b.signal_gain_dc},
      {"unit", b.input_unit == "A" ? "V/A" : "V/V"},
  };
  out["noise_gain"] = {{"at_reference", b.noise_gain_ref},
                       {"dc", b.noise_gain_dc}};
  out["response"] = {{"bandwidth_3db_Hz", b.bandwidth_3db_hz},
                     {"peaking_dB", b.peaking_db}};

  json contributors = json::array();
  for (const Contributor& c : b.contributors) {
    contributors.push_back({
        {"name", c.name},
        {"kind", c.kind},
        {"output_rms_V", c.output_rms_v},
        {"share", c.share},
        {"output_density_V_per_rtHz", c.output_density_ref_v_per_rthz},
        {"gain_to_output", c.gain_to_output_ref},
        {"source_density_per_rtHz", c.source_density_ref},
    });
  }
  out["noise"] = {
      {"output_rms_V", b.output_rms_v},
      {"output_peak_to_peak_V", b.output_peak_to_peak_v},
      {"peak_to_peak_per_rms", kPeakToPeakPerRms},
      {"output_density_V_per_rtHz", b.output_density_ref_v_per_rthz},
      {"input_referred_rms", b.input_rms},
      {"input_referred_density_per_rtHz", b.input_density_ref_per_rthz},
      {"input_referred_unit", b.input_unit},
      {"contributors", contributors},
      {"integration",
       {{"evaluations", b.integration_evaluations},
        {"relative_error_estimate", b.integration_relative_error}}},
  };
  out["offset"] = {
      {"vos_V", b.offset.vos_v},
      {"ib_V", b.offset.ib_v},
      {"ios_V", b.offset.ios_v},
      {"dark_V", b.offset.dark_v},
      {"worst_case_V", b.offset.worst_case_v},
      {"rss_V", b.offset.rss_v},
      {"noise_gain_dc", b.offset.noise_gain_dc},
      {"plus_resistor_ohm", b.offset.plus_resistor_ohm},
      {"balance_resistor_ohm", b.offset.balance_resistor_ohm},
  };
  if (b.photodiode) {
    const PhotodiodeBlock& pd = *b.photodiode;
    out["photodiode"] = {{"input_capacitance_F", pd.input_capacitance_f},
                         {"noise_gain_plateau_estimate", pd.noise_gain_plateau_estimate},
                         {"responsivity_A_per_W", pd.responsivity_a_per_w}};
    if (pd.responsivity_a_per_w > 0) {
      out["noise"]["nep_W_per_rtHz"] = pd.nep_w_per_rthz;
      out["noise"]["nep_rms_W"] = pd.nep_rms_w;
    }
  }
  if (b.full_scale_output_v) {
    out["full_scale_output_V"] = *b.full_scale_output_v;
    out["snr_dB"] = *b.snr_db;
    out["dynamic_range_dB"] = *b.dynamic_range_db;
  }
  if (b.tee) {
    const TeeComparison& t = *b.tee;
    json changes = json::array();
    for (const TeeChange& c : t.changes)
      changes.push_back({{"name", c.name},
                         {"change", ChangeName(c.kind)},
                         {"tee_output_rms_V", c.tee_output_rms_v},
                         {"plain_output_rms_V", c.plain_output_rms_v}});
    out["tee"] = {
        {"equivalent_resistance_ohm", t.equivalent_resistance_ohm},
        {"plain_output_rms_V", t.plain_output_rms_v},
        {"plain_input_referred_rms", t.plain_input_rms},
        {"noise_cost_ratio", t.noise_cost_ratio},
        {"noise_gain_at_reference",
         {{"tee", t.tee_noise_gain_ref}, {"plain", t.plain_noise_gain_ref}}},
        {"noise_gain_dc",
         {{"tee", t.tee_noise_gain_dc}, {"plain", t.plain_noise_gain_dc}}},
        {"plain_bandwidth_3db_Hz", t.plain_bandwidth_3db_hz},
        {"plain_offset_worst_case_V", t.plain_offset_worst_case_v},
        {"contributors", changes},
    };
  }
  if (b.temperature) {
    auto corner = [](const TemperatureCorner& c) {
      return json{{"temperature_K", c.temperature_k},
                  {"vos_V", c.offset.vos_v},
                  {"ib_V", c.offset.ib_v},
                  {"ios_V", c.offset.ios_v},
                  {"dark_V", c.offset.dark_v},
                  {"worst_case_V", c.offset.worst_case_v},
                  {"rss_V", c.offset.rss_v},
                  {"offset_dominant", c.offset_dominant},
                  {"output_rms_V", c.output_rms_v},
                  {"noise_dominant", c.noise_dominant},
                  {"noise_dominant_share", c.noise_dominant_share}};
    };
    const TemperatureBlock& t = *b.temperature;
    out["temperature"] = {{"min", corner(t.min)},
                          {"nominal", corner(t.nominal)},
                          {"max", corner(t.max)},
                          {"drift_to_min_V_per_K", t.drift_to_min_v_per_k},
                          {"drift_to_max_V_per_K", t.drift_to_max_v_per_k}};
  }
  if (b.compensation) {
    const CompensationBlock& c = *b.compensation;
    out["compensation"] = {{"balance_resistor_ohm", c.balance_ohm},
                           {"offset_worst_case_without_V", c.offset_without_v},
                           {"offset_worst_case_with_V", c.offset_with_v},
                           {"ib_without_V", c.ib_without_v},
                           {"ib_with_V", c.ib_with_v},
                           {"output_rms_without_V", c.noise_without_v},
                           {"output_rms_with_V", c.noise_with_v},
                           {"added_noise_share", c.added_share},
                           {"bypass_F", c.bypass_f},
                           {"noise_matters", c.noise_matters}};
  }
  if (!b.resistor_drops.empty()) {
    json drops = json::array();
    for (const ResistorDrop& d : b.resistor_drops)
      drops.push_back({{"name", d.name},
                       {"technology", d.technology},
                       {"noise_index_dB", d.noise_index_db},
                       {"dc_drop_V", d.v_dc}});
    out["resistors"] = {{"dc_drops", drops}, {"excess_left_out", b.excess_left_out}};
    if (b.excess_advice) {
      const ExcessAdvice& a = *b.excess_advice;
      json alternatives = json::array();
      for (const ExcessAdvice::Alternative& alt : a.alternatives)
        alternatives.push_back({{"technology", alt.technology},
                                {"noise_index_dB", alt.noise_index_db},
                                {"output_rms_V", alt.output_rms_v}});
      out["resistors"]["excess_advice"] = {{"resistor", a.resistor},
                                           {"technology", a.technology},
                                           {"noise_index_dB", a.noise_index_db},
                                           {"share", a.share},
                                           {"alternatives", alternatives}};
    }
  }
  out["warnings"] = b.warnings;
  return out.dump(2) + "\n";
}

}  // namespace hushgain
