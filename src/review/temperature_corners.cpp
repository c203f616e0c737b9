#include "review/temperature_corners.h"

#include <cmath>

#include "circuit/stage_at_temperature.h"

namespace hushgain {

std::string DominantOffsetTerm(const OffsetBlock& o) {
  std::string name = "Vos";
  double largest = std::fabs(o.vos_v);
  auto consider = [&](double v, const char* n) {
    if (std::fabs(v) > largest) {
      largest = std::fabs(v);
      name = n;
    }
  };
  consider(o.ib_v, "Ib");
  consider(o.ios_v, "Ios");
  consider(o.dark_v, "dark current");
  return name;
}

TemperatureCorner CornerOf(const Budget& b) {
  TemperatureCorner c;
  c.temperature_k = b.temperature_k;
  c.offset = b.offset;
  c.offset_dominant = DominantOffsetTerm(b.offset);
  c.output_rms_v = b.output_rms_v;
  if (!b.contributors.empty()) {
    c.noise_dominant = b.contributors.front().name;
    c.noise_dominant_share = b.contributors.front().share;
  }
  return c;
}

Status ComputeTemperatureBlock(const Stage& stage, const Budget& nominal,
                               double capacitor_f, const BudgetOptions& options,
                               TemperatureBlock* block) {
  Stage fixed = stage;
  fixed.capacitor_target.reset();
  fixed.feedback.capacitor_f = capacitor_f;
  block->nominal = CornerOf(nominal);
  for (auto [temperature_k, corner] :
       {std::pair{stage.temperature_range->min_k, &block->min},
        std::pair{stage.temperature_range->max_k, &block->max}}) {
    BudgetOutcome end =
        ComputeBudgetAsGiven(StageAtTemperature(fixed, temperature_k), options);
    if (!end.status.ok) return end.status;
    *corner = CornerOf(end.budget);
  }
  const double nominal_wc = block->nominal.offset.worst_case_v;
  auto drift = [&](const TemperatureCorner& end) {
    const double dt = end.temperature_k - block->nominal.temperature_k;
    return dt != 0 ? (end.offset.worst_case_v - nominal_wc) / dt : 0.0;
  };
  block->drift_to_min_v_per_k = drift(block->min);
  block->drift_to_max_v_per_k = drift(block->max);
  return Status::Ok();
}

}  // namespace hushgain
