#include "report/real_parts_json.h"

#include <nlohmann/json.hpp>

namespace hushgain {

void AddRealPartsJson(const Budget& b, nlohmann::json& out) {
  using nlohmann::json;
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
                           {"worth_doing", c.worth_doing},
                           {"noise_matters", c.noise_matters}};
  }
  if (!b.resistor_drops.empty()) {
    json drops = json::array();
    for (const ResistorDrop& d : b.resistor_drops)
      drops.push_back({{"name", d.name},
                       {"technology", d.technology},
                       {"noise_index_dB", d.noise_index_db},
                       {"dc_drop_V", d.v_dc}});
    out["resistors"] = {{"dc_drops", drops}};
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
}

}  // namespace hushgain
