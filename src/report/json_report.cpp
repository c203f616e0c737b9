#include "report/json_report.h"

#include <nlohmann/json.hpp>

#include "report/enum_words.h"
#include "report/real_parts_json.h"

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

// "chain": the blocks and the fold; "adc": the converter's figures (the
// keys snr_dB, enob_bits, noise_free_bits, effective_resolution_bits).
void AddChainJson(const ChainBlock& c, nlohmann::json& out) {
  using nlohmann::json;
  json filter = nullptr;
  if (c.chain.filter) {
    const ChainFilter& f = *c.chain.filter;
    filter = {{"kind", FilterKindWord(f.kind)},
              {"order", f.order},
              {"cutoff_Hz", f.cutoff_hz},
              {"gain", f.gain},
              {"noise_V_per_rtHz", f.noise_v_per_rthz},
              {"enbw_Hz", c.filter_enbw_hz}};
  }
  json second = nullptr;
  if (c.second_stage_network) {
    const SecondStageFigures& n = *c.second_stage_network;
    second = {
        {"stage", c.chain.second_stage->file},
        {"name", n.stage_name},
        {"opamp_class", n.opamp_class},
        {"gain_dc", n.signal_gain_dc},
        {"passband_gain", n.passband_gain},
        {"gain_at_reference", n.signal_gain_ref},
        {"noise_gain_at_reference", n.noise_gain_ref},
        {"bandwidth_Hz", n.bandwidth_3db_hz},
    };
  } else if (c.chain.second_stage) {
    const SecondStage& s = *c.chain.second_stage;
    second = {
        {"gain", s.gain},
        {"noise_gain", s.noise_gain},
        {"bandwidth_Hz", s.bandwidth_hz},
        {"gbw_Hz", s.gbw_hz},
        {"input_noise",
         {{"density_V_per_rtHz", s.input_noise.density},
          {"corner_Hz", s.input_noise.corner_hz}}},
        {"input_current_noise",
         {{"density_A_per_rtHz", s.input_current_noise.density},
          {"corner_Hz", s.input_current_noise.corner_hz}}},
        {"source_resistance_ohm", s.source_resistance_ohm},
    };
  }
  auto shares = [](const std::vector<ChainNoiseShare>& list) {
    json a = json::array();
    for (const ChainNoiseShare& s : list)
      a.push_back({{"name", s.name}, {"rms_V", s.rms_v}, {"share", s.share}});
    return a;
  };
  out["chain"] = {
      {"second_stage", second},
      {"filter", filter},
      {"gain_dc", c.chain_gain_dc},
      {"blocks", shares(c.blocks)},
      {"front_end_contributors", shares(c.front_end_contributors)},
      {"second_stage_contributors", shares(c.second_stage_contributors)},
      {"dominant", c.dominant},
      {"analog_rms_V", c.analog_rms_v},
      {"total_rms_V", c.total_rms_v},
      {"total_lsb_rms", c.adc.noise_lsb_rms},
      {"fold",
       {{"nyquist_Hz", c.nyquist_hz},
        {"in_zone_rms_V", c.in_zone_rms_v},
        {"folded_rms_V", c.folded_rms_v},
        {"counted_to_Hz", c.counted_to_hz},
        {"tail_fraction", c.tail_fraction},
        {"limited", c.fold_limited},
        {"below_converter_Hz",
         c.below_converter_hz > 0 ? json(c.below_converter_hz) : json()},
        {"converter_density_V_per_rtHz", c.converter_density_v_per_rthz}}},
  };
  const ChainAdc& adc = c.chain.adc;
  out["adc"] = {
      {"bits", adc.bits},
      {"full_scale_V", adc.full_scale_v},
      {"sample_rate_Hz", adc.sample_rate_hz},
      {"lsb_V", c.adc.lsb_v},
      {"quantization_rms_V", c.adc.quantization_rms_v},
      {"own_noise_rms_V", c.adc.own_noise_rms_v},
      {"noise_rms_V", c.total_rms_v},
      {"noise_lsb_rms", c.adc.noise_lsb_rms},
      {"snr_dB", c.adc.snr_db},
      {"enob_bits", c.adc.enob_bits},
      {"noise_free_bits", c.adc.noise_free_bits},
      {"effective_resolution_bits", c.adc.effective_resolution_bits},
  };
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
                       {"dc", b.noise_gain_dc},
                       {"peak", b.noise_gain_peak},
                       {"peak_Hz", b.noise_gain_peak_hz},
                       {"flat", b.noise_gain_flat}};
  out["response"] = {{"bandwidth_3db_Hz", b.bandwidth_3db_hz},
                     {"bandwidth_low_Hz", b.bandwidth_low_hz},
                     {"blocks_dc", b.blocks_dc},
                     {"passband_gain", b.passband_gain},
                     {"peaking_dB", b.peaking_db},
                     {"peak_Hz", b.peak_hz}};
  // Null margin and crossover when the loop gain never falls through 1.
  out["loop"] = {{"phase_margin_deg", nullptr},
                 {"crossover_Hz", nullptr},
                 {"dc_loop_gain", b.loop.dc_loop_gain}};
  if (b.loop.crossover_found) {
    out["loop"]["phase_margin_deg"] = b.loop.phase_margin_deg;
    out["loop"]["crossover_Hz"] = b.loop.crossover_hz;
  }
  out["feedback_capacitor_F"] = b.feedback_capacitor_f;
  if (b.capacitor_choice)
    out["feedback_capacitor_choice"] = {
        {"target", b.capacitor_choice->target},
        {"chosen_F", b.capacitor_choice->chosen_f},
        {"estimate_F", b.capacitor_choice->estimate_f},
        {"estimate_rule", b.capacitor_choice->estimate_rule}};

  json contributors = json::array();
  for (const Contributor& c : b.contributors) {
    contributors.push_back({
        {"name", c.name},
        {"kind", NoiseKindWord(c.kind)},
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
      {"input_referred_rms_at_reference_gain", b.input_rms_at_reference_gain},
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
  json dc_outputs = json::array();
  for (const DcOutputTerm& term : b.dc_outputs)
    dc_outputs.push_back({{"name", term.name}, {"output_V", term.volts}});
  out["dc_outputs"] = dc_outputs;
  if (b.photodiode) {
    const PhotodiodeBlock& pd = *b.photodiode;
    out["photodiode"] = {
        {"input_capacitance_F", pd.input_capacitance_f},
        {"noise_gain_plateau_estimate", pd.noise_gain_plateau_estimate},
        {"responsivity_A_per_W", pd.responsivity_a_per_w},
        {"photocurrent_A", pd.photocurrent_a},
        {"reverse_bias_V", pd.reverse_bias_v},
        {"dark_current_A", pd.dark_current_a},
        {"shunt_resistance_ohm", pd.shunt_resistance_ohm}};
    if (pd.tee_noise_equivalent_ohm > 0)
      out["photodiode"]["tee_noise_equivalent_resistance_ohm"] =
          pd.tee_noise_equivalent_ohm;
    if (pd.responsivity_a_per_w > 0) {
      out["noise"]["nep_W_per_rtHz"] = pd.nep_w_per_rthz;
      out["noise"]["nep_rms_W"] = pd.nep_rms_w;
    }
  }
  if (b.charge) {
    const ChargeBlock& c = *b.charge;
    out["charge"] = {
        {"sensor_capacitance_F", c.sensor_capacitance_f},
        {"leakage_resistance_ohm", c.leakage_resistance_ohm},
        {"input_resistor_ohm", c.input_resistor_ohm},
        {"charge_gain_V_per_C", c.charge_gain_v_per_c},
        {"low_corner_Hz", b.bandwidth_low_hz},
        {"high_corner_Hz", b.bandwidth_3db_hz},
        {"feedback_dc_resistance_ohm", c.feedback_dc_ohm},
        {"low_corner_estimate_Hz", c.low_corner_estimate_hz},
        {"input_capacitance_F", c.input_capacitance_f},
        {"noise_gain_plateau_estimate", c.noise_gain_plateau_estimate}};
    out["noise"]["input_referred_charge_rms_C"] = c.input_rms_c;
    out["noise"]["input_referred_charge_density_C_per_rtHz"] =
        c.input_density_ref_c_per_rthz;
  }
  if (b.ac_coupling) {
    const AcCouplingBlock& a = *b.ac_coupling;
    out["ac_coupling"] = {{"c3_F", a.c3_f},
                          {"shunt_corner_Hz", a.shunt_corner_hz},
                          {"feedback_dc_resistance_ohm", a.feedback_dc_ohm},
                          {"input_capacitor_F", a.input_capacitor_f},
                          {"input_corner_Hz", a.input_corner_hz}};
  }
  if (b.measurand) {
    const MeasurandBlock& m = *b.measurand;
    out["noise"]["measurand"] = {
        {"unit", m.unit},
        {"sensitivity_per_unit", m.sensitivity},
        {"sensitivity_unit", m.sensitivity_unit},
        {"input_referred_rms", m.input_referred_rms},
        {"input_referred_density_at_reference",
         m.input_referred_density_at_reference},
    };
  }
  if (b.full_scale_output_v) {
    out["full_scale_output_V"] = *b.full_scale_output_v;
    if (b.full_scale_output_current_a)
      out["full_scale_output_current_A"] = *b.full_scale_output_current_a;
    out["output_current_limit_A"] = b.output_current_limit_a;
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
  if (b.tee_pi) {
    const TeePiBlock& pi = *b.tee_pi;
    json fractions = {{"dc", pi.fraction_at_dc.fraction},
                      {"reference", pi.fraction_at_reference.fraction},
                      {"band_high", pi.fraction_at_band_high.fraction}};
    out["tee"]["pi"] = {
        {"bridge_ohm", pi.arms.bridge_ohm},
        {"input_arm_ohm", pi.arms.input_arm_ohm},
        {"output_arm_ohm", pi.arms.output_arm_ohm},
        {"noise_equivalent_resistance_ohm", pi.noise_equivalent_ohm},
        {"input_arm_noise_gain", pi.input_arm_noise_gain},
        {"input_arm_current_fraction", fractions},
        {"output_arm_current_A", pi.output_arm_current_a
                                     ? json(*pi.output_arm_current_a)
                                     : json(nullptr)},
        {"output_arm_current_share",
         pi.output_arm_share ? json(*pi.output_arm_share) : json(nullptr)},
    };
  }
  if (b.chain) AddChainJson(*b.chain, out);
  if (b.sensitivity) {
    const SensitivityBlock& s = *b.sensitivity;
    json rows = json::array();
    auto opt = [](const std::optional<double>& v) {
      return v ? json(*v) : json(nullptr);
    };
    for (const SensitivityRow& r : s.rows)
      rows.push_back({{"parameter", r.parameter},
                      {"unit", r.unit},
                      {"value", r.value},
                      {"noise", r.noise},
                      {"offset", opt(r.offset)},
                      {"bandwidth", opt(r.bandwidth)},
                      {"gain", opt(r.gain)}});
    out["sensitivity"] = rows;
    out["sensitivity_method"] = {
        {"kind", "central differences in ln x with Richardson extrapolation"},
        {"step", s.step},
        {"largest_error_estimate", s.largest_error}};
    if (!s.advice_parameter.empty())
      out["sensitivity_advice"] = {{"parameter", s.advice_parameter},
                                   {"factor", s.advice_factor},
                                   {"output_rms_ratio", s.advice_noise_ratio}};
  }
  AddRealPartsJson(b, out);
  json flags = json::array();
  for (StageProblem p : b.problems) flags.push_back(StageProblemWord(p));
  out["flags"] = flags;
  out["warnings"] = b.warnings;
  return out.dump(2) + "\n";
}

}  // namespace hushgain
