#include "design/opamp_comparison.h"

#include <algorithm>
#include <cassert>

#include "circuit/stage_at_temperature.h"

namespace hushgain {
namespace {

NoiseKindShares SharesByKind(const Budget& budget) {
  NoiseKindShares s;
  for (const Contributor& c : budget.contributors) {
    switch (c.kind) {
      case NoiseKind::kOpAmpVoltage:
        s.voltage_noise += c.share;
        break;
      case NoiseKind::kOpAmpCurrent:
        s.current_noise += c.share;
        break;
      case NoiseKind::kThermal:
      case NoiseKind::kExcess:
        s.resistor += c.share;
        break;
      case NoiseKind::kShot:
      case NoiseKind::kSupply:
      case NoiseKind::kSensorVoltage:
      case NoiseKind::kSensorCurrent:
        s.other += c.share;
        break;
    }
  }
  return s;
}

double RankKey(const OpAmpComparisonRow& row, OpAmpRanking ranking) {
  return ranking == OpAmpRanking::kOffset ? row.budget.offset.worst_case_v
                                          : row.budget.input_rms;
}

OpAmpComparisonRow Evaluate(const Stage& stage, const NamedOpAmp& opamp,
                            const OpAmpComparison& result,
                            const ReviewOptions& options) {
  OpAmpComparisonRow row;
  row.device = opamp.name;
  row.class_name = opamp.model.class_name;
  row.e_n_ref_v_per_rthz =
      VoltageNoiseDensity(opamp.model, result.reference_hz);
  row.i_n_ref_a_per_rthz =
      CurrentNoiseDensity(opamp.model, result.reference_hz) *
      CurrentNoiseFactor(opamp.model, stage.temperature_k);
  if (result.voltage_source) {
    row.optimum_source_ohm = OptimumSourceResistanceOhm(
        opamp.model, result.reference_hz, stage.temperature_k);
    if (row.optimum_source_ohm)
      row.source_to_optimum =
          result.source_resistance_seen_ohm / *row.optimum_source_ohm;
  }
  Stage with = stage;
  with.opamp = opamp.model;
  BudgetOutcome outcome = ReviewStage(with, options);
  row.status = outcome.status;
  if (!outcome.status.ok) return row;
  row.budget = std::move(outcome.budget);
  const Budget& b = row.budget;
  row.shares = SharesByKind(b);
  row.low_phase_margin =
      b.loop.crossover_found && b.loop.phase_margin_deg < kLowPhaseMarginDeg;
  row.narrow_bandwidth =
      b.bandwidth_3db_hz > 0 && b.bandwidth_3db_hz < b.band_high_hz;
  row.high_low_corner = b.bandwidth_low_hz > b.band_low_hz;
  return row;
}

}  // namespace

bool OpAmpComparisonRow::Fits() const {
  return status.ok && budget.problems.empty() && !low_phase_margin &&
         !narrow_bandwidth && !high_low_corner;
}

std::optional<double> OptimumSourceResistanceOhm(const OpAmpModel& model,
                                                 double f_hz,
                                                 double temperature_k) {
  const double i_n = CurrentNoiseDensity(model, f_hz) *
                     CurrentNoiseFactor(model, temperature_k);
  if (!(i_n > 0)) return std::nullopt;
  return VoltageNoiseDensity(model, f_hz) / i_n;
}

OpAmpComparison CompareOpAmps(const Stage& stage,
                              const std::vector<NamedOpAmp>& opamps,
                              const OpAmpComparisonOptions& options) {
  assert(options.Validate().empty());
  OpAmpComparison result;
  result.ranking = options.ranking;
  result.reference_hz = ReferenceFrequencyHz(stage);
  result.band_low_hz = stage.band_low_hz;
  result.band_high_hz = stage.band_high_hz;
  result.input_unit = stage.topology == Topology::kTransimpedance ? "A" : "V";
  result.voltage_source =
      stage.topology == Topology::kInverting && !stage.capacitive;
  if (result.voltage_source)
    result.source_resistance_seen_ohm =
        stage.source.resistance_ohm + stage.input_resistor_ohm;

  std::vector<OpAmpComparisonRow> budgeted, refused;
  for (const NamedOpAmp& opamp : opamps) {
    OpAmpComparisonRow row = Evaluate(stage, opamp, result, options.review);
    (row.status.ok ? budgeted : refused).push_back(std::move(row));
  }
  // The devices that fit first: a quiet row whose gain has collapsed is no
  // answer.
  std::stable_sort(
      budgeted.begin(), budgeted.end(),
      [&](const OpAmpComparisonRow& a, const OpAmpComparisonRow& b) {
        if (a.Fits() != b.Fits()) return a.Fits();
        const double ka = RankKey(a, options.ranking);
        const double kb = RankKey(b, options.ranking);
        if (ka != kb) return ka < kb;
        return a.device < b.device;
      });
  for (std::size_t i = 0; i < budgeted.size(); ++i)
    budgeted[i].rank = static_cast<int>(i) + 1;
  result.rows = std::move(budgeted);
  for (OpAmpComparisonRow& row : refused) result.rows.push_back(std::move(row));
  return result;
}

}  // namespace hushgain
