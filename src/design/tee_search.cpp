#include "design/tee_search.h"

#include <algorithm>
#include <cassert>
#include <cmath>
#include <cstdio>
#include <functional>
#include <limits>
#include <mutex>
#include <queue>

#include "base/physical_constants.h"
#include "base/worker_pool.h"
#include "circuit/inverting_topology.h"
#include "circuit/stage_at_temperature.h"
#include "review/tee_comparison.h"

namespace hushgain {
namespace {

constexpr double kInf = std::numeric_limits<double>::infinity();
// Bounds are relaxed by this much so that rounding in their arithmetic never
// prunes a candidate that the exact evaluation would keep.
constexpr double kBoundSlack = 1e-9;
// The R3 interval is widened by this much before the exact gain test.
constexpr double kIntervalSlack = 1e-12;
// Rows handed to a worker at a time.
constexpr int kRowsPerGrab = 8;
// Full-engine budgets at most for the rankings without a proven bound
// (output noise, weighted; about 0.5 ms each). Where thousands of networks
// lie within the margin of each other, their order is finer than anything a
// designer acts on. The exact rankings have no cap.
constexpr std::size_t kMaxVerified = 512;
// A candidate's closed-form DC gain passes the window when within the
// tolerance plus this (relative to the target): rounding between the closed
// form and the engine's solve, so that the engine's gain decides.
constexpr double kGainSlack = 1e-9;

// The total order of candidates: figure of merit, then the values.
struct Key {
  double score;
  double r_in, r1, r2, r3;
  bool operator<(const Key& o) const {
    if (score != o.score) return score < o.score;
    if (r_in != o.r_in) return r_in < o.r_in;
    if (r1 != o.r1) return r1 < o.r1;
    if (r2 != o.r2) return r2 < o.r2;
    return r3 < o.r3;
  }
};

Key KeyOf(const TeeCandidate& c, double score) {
  return {score, c.r_in_ohm, c.r1_ohm, c.r2_ohm, c.r3_ohm};
}

// A pool entry is its key alone (the closed-form score and the values):
// the pool may hold tens of thousands, so it holds no budget.
TeeCandidate CandidateOf(const Key& key) {
  TeeCandidate c;
  c.r_in_ohm = key.r_in;
  c.r1_ohm = key.r1;
  c.r2_ohm = key.r2;
  c.r3_ohm = key.r3;
  c.closed_score = key.score;
  return c;
}

// Combines the two figures into the figure of merit.
struct Scorer {
  TeeRanking ranking = TeeRanking::kNoise;
  double w = 0.5;
  double noise_ref = 0;
  double offset_ref = 0;

  double operator()(double rms, double offset, double input_rms) const {
    switch (ranking) {
      case TeeRanking::kInputNoise:
        return input_rms;
      case TeeRanking::kNoise:
        return rms;
      case TeeRanking::kOffset:
        return offset;
      case TeeRanking::kWeighted: {
        double s = 0;
        if (noise_ref > 0) s += (1 - w) * rms / noise_ref;
        if (offset_ref > 0) s += w * offset / offset_ref;
        return s;
      }
    }
    return rms;
  }
};

// The closed form of the stage as the full engine budgets it: ComputeBudget
// moves the op-amp to the stage's temperature (|Vos| + |drift| |T - 25 °C|,
// Ib and Ios by their law, i_n with the bias current:
// circuit/stage_at_temperature.h), so the closed form takes the same
// values. With the 25 °C values the offset bound of a stage away from 25 °C
// was loose by the drift (every network within that margin had to be
// budgeted) or, where Ib and i_n fall with temperature, not a bound at all.
ClosedFormModel ModelAtTemperature(const Stage& stage) {
  Stage at = stage;
  at.opamp = StageAtTemperature(stage, stage.temperature_k).opamp;
  return MakeClosedFormModel(at);
}

// The input-noise bound's model. The noise current of R_plus (4kT/Rp) and
// i_n+ flow into the + node, which holds R_plus, its bypass capacitor, the
// pin's C_cm to ground and C_diff to the summing node. Across C_diff lies
// v+ - v- = v+ / (1 + T): where |1 + T| >= 1 (a loop that does not peak
// inside the band) C_diff draws at most w C_diff |v+|, so the node's
// admittance is at most 1/Rp + w_H (C_plus + C_cm + C_diff) over the band.
// The + pin's voltage then is at least the current times Rp / (1 + Rp B),
// and it reaches the output as e_n does (at least NG at DC: header). Left
// out, these terms (a tenth of the power of a low-gain stage with an
// automatic R_plus) put the bound below the figures of thousands of
// networks, each of which was budgeted. A stage that breaks the assumption
// shows in the check of every verified network against its bound.
ClosedFormModel BoundModel(const Stage& stage, const ClosedFormModel& model) {
  ClosedFormModel bound = model;
  bound.plus_shunt_s = 2 * kPi * stage.band_high_hz *
                       (stage.plus_resistor_bypass_f + stage.opamp.c_cm_f +
                        stage.opamp.c_diff_f);
  return bound;
}

// What the closed-form sweep shares between its workers.
struct Sweep {
  const TeeSearchOptions* options = nullptr;
  ClosedFormModel model;
  // The input-noise bound's model: the + input resistor's noise only as
  // much as the capacitance across it lets through at the band's top
  // (BoundModel).
  ClosedFormModel bound_model;
  // The ideal gain Req/Ra of a network whose DC gain (finite A0) is in the
  // window is below ideal_gain_max (header: the DC gain's shortfall).
  double ideal_gain_max = kInf;
  // 1 / (1 + delta): the smallest DC gain / ideal gain of any network.
  double loop_factor_min = 0;
  double bound_factor = 1;  // 1 - epsilon of the ranking (header)
  Scorer scorer;
  std::vector<double> values;
  std::vector<double> inv_values;
  std::vector<double> inputs;  // R_in values
  // The (R_in, R1) rows, in increasing order of their lower bound, so the
  // pool fills with good candidates early and the bounds prune the rest.
  struct RowSpec {
    double bound;
    std::uint32_t in_index;
    std::uint32_t i1;
    bool operator<(const RowSpec& o) const {
      if (bound != o.bound) return bound < o.bound;
      if (in_index != o.in_index) return in_index < o.in_index;
      return i1 < o.i1;
    }
  };
  std::vector<RowSpec> rows;
  std::size_t pool = 0;
  std::uint64_t total_rows = 0;

  std::atomic<std::uint64_t> next_row{0};
  std::atomic<std::uint64_t> rows_done{0};
  std::atomic<double> threshold{kInf};  // the pool's worst score so far
};

// Lower bound of the figure of merit over every network with input arm
// Ra whose R1 is at least r1_lb, k = R2/R3 at least k_lb and Rp at least
// rp_lb; gain at least g_lo. Each term of the closed form grows with each
// of these (header of closed_form_budget.h).
double LowerBound(const Sweep& s, double ra, double g_lo, double r1_lb,
                  double r2_lb, double k_lb, double rp_lb) {
  const ClosedFormModel& m = s.model;
  const double req_lo = g_lo * ra;
  const double ng = 1 + k_lb + g_lo;
  const double power =
      m.thermal_w * (ra * g_lo * g_lo + r1_lb * (1 + k_lb) * (1 + k_lb) +
                     r2_lb * (1 + k_lb) + rp_lb * ng * ng) +
      m.e_n_power * ng * ng +
      m.i_n_power * (req_lo * req_lo + rp_lb * rp_lb * ng * ng);
  const double offset = m.vos_v * ng + m.half_ios_a * (req_lo + rp_lb * ng);
  // The input-referred bound's terms over G^2 fall as G grows: take the
  // largest ideal gain of the window (no + input resistor terms).
  double input_rms = 0;
  if (s.scorer.ranking == TeeRanking::kInputNoise) {
    const double gm = s.ideal_gain_max;
    const double q = (1 + k_lb) / gm;  // 0 when the window is unbounded
    const double in_power =
        m.thermal_w * (ra + r1_lb * (1 + k_lb) * q / gm + r2_lb * q / gm) +
        m.e_n_power * (1 + q) * (1 + q) + m.i_n_power * ra * ra;
    input_rms = std::sqrt(in_power);
  }
  return s.scorer(std::sqrt(power), offset * s.loop_factor_min, input_rms) *
         s.bound_factor * (1 - kBoundSlack);
}

double PlusLowerBound(const Sweep& s, double ra, double fb_lb) {
  switch (s.model.plus_mode) {
    case PlusResistor::Mode::kNone:
      return 0;
    case PlusResistor::Mode::kValue:
      return s.model.plus_ohm;
    case PlusResistor::Mode::kAuto:
      return ra * fb_lb / (ra + fb_lb);
  }
  return 0;
}

double KLowerBound(double req_lo, double r1, double vmin, double vmax) {
  return std::max(vmin / vmax, (req_lo - r1 - vmax) / r1);
}

using Heap = std::priority_queue<Key>;

void LowerThreshold(std::atomic<double>& threshold, double value) {
  double current = threshold.load(std::memory_order_relaxed);
  while (value < current && !threshold.compare_exchange_weak(
                                current, value, std::memory_order_relaxed)) {
  }
}

struct WorkerOut {
  std::vector<Key> kept;
  std::uint64_t in_tolerance = 0;
  std::uint64_t rows_pruned = 0;
};

void Worker(Sweep& s, WorkerOut* out) {
  const TeeSearchOptions& o = *s.options;
  const std::vector<double>& v = s.values;
  const int n = static_cast<int>(v.size());
  const double vmax = v.back();
  const double g = o.target_gain;
  const double tol = o.gain_tolerance;
  const double g_lo = g * (1 - tol);
  Heap heap;
  std::vector<double> power(n);
  const bool need_offset =
      o.ranking == TeeRanking::kOffset || o.ranking == TeeRanking::kWeighted;
  const bool need_power = o.ranking != TeeRanking::kOffset;
  // The input-noise bound takes the + input resistor's terms attenuated.
  const ClosedFormModel& power_model =
      o.ranking == TeeRanking::kInputNoise ? s.bound_model : s.model;

  for (;;) {
    if (o.cancel && o.cancel->load(std::memory_order_relaxed)) break;
    const std::uint64_t first =
        s.next_row.fetch_add(kRowsPerGrab, std::memory_order_relaxed);
    if (first >= s.total_rows) break;
    const std::uint64_t last =
        std::min<std::uint64_t>(first + kRowsPerGrab, s.total_rows);
    for (std::uint64_t row = first; row < last; ++row) {
      const Sweep::RowSpec& spec = s.rows[row];
      const double r_in = s.inputs[spec.in_index];
      const double ra = s.model.source_ohm + r_in;
      const double r1 = v[spec.i1];
      const double req_lo = g_lo * ra;
      const double req_hi = s.ideal_gain_max * ra;  // may be infinite
      double threshold = s.threshold.load(std::memory_order_relaxed);
      if (spec.bound > threshold) {
        ++out->rows_pruned;
        continue;
      }
      const double inv_ra = 1 / ra;
      int lo = 0;
      int hi = 0;
      for (int i2 = 0; i2 < n; ++i2) {
        const double r2 = v[i2];
        const double sum = r1 + r2;
        if (sum >= req_hi) break;
        const double r3_lo = std::isinf(req_hi) ? 0
                                                : r1 * r2 / (req_hi - sum) *
                                                      (1 - kIntervalSlack);
        if (r3_lo > vmax) break;
        const double r3_hi =
            req_lo > sum ? r1 * r2 / (req_lo - sum) * (1 + kIntervalSlack)
                         : kInf;
        while (lo < n && v[lo] < r3_lo) ++lo;
        if (hi < lo) hi = lo;
        while (hi < n && v[hi] <= r3_hi) ++hi;
        if (lo >= hi) continue;
        if (need_power)
          ClosedFormTeePowerRow(power_model, r_in, r1, r2, &s.inv_values[lo],
                                hi - lo, power.data());
        for (int i3 = lo; i3 < hi; ++i3) {
          // The DC gain is below the ideal Req / Ra: below the window's
          // lower edge already, the network cannot be in tolerance.
          const double k = r2 * s.inv_values[i3];
          const double ideal_gain = (r1 + r2 + r1 * k) * inv_ra;
          if (ideal_gain < g_lo * (1 - kGainSlack)) continue;
          // The tolerance applies to the DC gain with A0, R_o and the load.
          const double dc_gain =
              ClosedFormTeeDcGain(s.model, r_in, r1, r2, v[i3]);
          if (!(std::fabs(dc_gain - g) <= (tol + kGainSlack) * g)) continue;
          ++out->in_tolerance;
          const double rms = need_power ? std::sqrt(power[i3 - lo]) : 0;
          double offset = 0;
          if (need_offset)
            offset =
                ClosedFormTee(s.model, r_in, r1, r2, v[i3]).offset_worst_case_v;
          double score = 0;
          switch (o.ranking) {
            case TeeRanking::kInputNoise:
              score = rms / ideal_gain * s.bound_factor;
              break;
            case TeeRanking::kOffset:
              score = offset * (dc_gain / ideal_gain) * s.bound_factor;
              break;
            default:
              score = s.scorer(rms, offset, 0);
          }
          if (score > threshold) continue;
          const Key key{score, r_in, r1, r2, v[i3]};
          if (heap.size() >= s.pool && !(key < heap.top())) continue;
          heap.push(key);
          if (heap.size() > s.pool) heap.pop();
          if (heap.size() == s.pool) {
            LowerThreshold(s.threshold, heap.top().score);
            threshold = s.threshold.load(std::memory_order_relaxed);
          }
        }
      }
    }
    s.rows_done.fetch_add(last - first, std::memory_order_relaxed);
  }
  while (!heap.empty()) {
    out->kept.push_back(heap.top());
    heap.pop();
  }
}

struct SweepOutcome {
  std::vector<Key> pool;  // best first
  std::uint64_t in_tolerance = 0;
  std::uint64_t rows_pruned = 0;
  bool cancelled = false;
};

// `report` says whether to call the progress callback: only the first
// sweep does, so the fraction never goes back.
SweepOutcome RunSweep(const Stage& stage, const TeeSearchOptions& o,
                      const Scorer& scorer, std::size_t pool_size,
                      bool report) {
  Sweep s;
  s.options = &o;
  s.model = ModelAtTemperature(stage);
  s.bound_model = BoundModel(stage, s.model);
  s.scorer = scorer;
  s.values = o.values;
  for (double x : s.values) s.inv_values.push_back(1 / x);
  s.pool = pool_size;

  s.inputs = o.input_values;
  if (s.inputs.empty()) s.inputs.push_back(stage.input_resistor_ohm);
  const double vmin = s.values.front();
  const double vmax = s.values.back();
  const double g_lo = o.target_gain * (1 - o.gain_tolerance);
  const DcGainWindow window = WindowOf(s.model, o, vmin, vmax);
  s.ideal_gain_max = window.ideal_gain_max;
  s.loop_factor_min = window.loop_factor_min;
  s.bound_factor = BoundFactor(o);
  for (std::uint32_t in = 0; in < s.inputs.size(); ++in) {
    const double ra = s.model.source_ohm + s.inputs[in];
    for (std::uint32_t i1 = 0; i1 < s.values.size(); ++i1) {
      const double r1 = s.values[i1];
      const double k_lb = KLowerBound(g_lo * ra, r1, vmin, vmax);
      s.rows.push_back(
          {LowerBound(s, ra, g_lo, r1, vmin, k_lb, PlusLowerBound(s, ra, r1)),
           in, i1});
    }
  }
  std::sort(s.rows.begin(), s.rows.end());
  s.total_rows = s.rows.size();

  const int threads = WorkerCount(o.threads, static_cast<long>(s.total_rows));
  std::vector<WorkerOut> outs(threads);
  std::function<void()> tick;
  if (o.progress && report)
    tick = [&] {
      const std::uint64_t done = s.rows_done.load(std::memory_order_relaxed);
      o.progress(static_cast<double>(std::min(done, s.total_rows)) /
                 std::max<std::uint64_t>(1, s.total_rows));
    };
  RunWorkers(
      threads, [&](int t) { Worker(s, &outs[t]); }, tick);

  SweepOutcome result;
  for (WorkerOut& w : outs) {
    result.in_tolerance += w.in_tolerance;
    result.rows_pruned += w.rows_pruned;
    result.pool.insert(result.pool.end(), w.kept.begin(), w.kept.end());
    w.kept = {};
  }
  std::sort(result.pool.begin(), result.pool.end());
  if (result.pool.size() > pool_size) result.pool.resize(pool_size);
  result.cancelled = o.cancel && o.cancel->load();
  if (o.progress && report && !result.cancelled) o.progress(1.0);
  return result;
}

std::string Describe(const TeeCandidate& c) {
  char buf[160];
  std::snprintf(buf, sizeof buf, "R_in %.6g, R1 %.6g, R2 %.6g, R3 %.6g ohm",
                c.r_in_ohm, c.r1_ohm, c.r2_ohm, c.r3_ohm);
  return buf;
}

}  // namespace

DcGainWindow WindowOf(const ClosedFormModel& model,
                      const TeeSearchOptions& options, double vmin,
                      double vmax) {
  DcGainWindow w;
  const double g_hi = options.target_gain * (1 + options.gain_tolerance);
  // The output divider: R_o into the load in parallel with the T network,
  // which loads the output with at least R2 >= vmin.
  double rho = 1;
  if (model.output_ohm > 0) {
    const double r_eff = 1 / (1 / vmin + model.load_siemens);
    rho = r_eff / (r_eff + model.output_ohm);
  }
  const double ng_max = 1 + vmax / vmin + 2 * g_hi;
  const double t_min = model.open_loop_gain * rho / ng_max;
  if (t_min > 4) {
    const double delta = 2 / t_min + 1e-6;
    w.ideal_gain_max = g_hi * (1 + delta) * (1 + kGainSlack);
    w.loop_factor_min = 1 / (1 + delta);
  }
  return w;
}

double BoundFactor(const TeeSearchOptions& options) {
  switch (options.ranking) {
    case TeeRanking::kInputNoise:
    case TeeRanking::kOffset:
      return 1 - 1e-6;
    default:
      return 1;
  }
}

std::string TeeSearchOptions::Validate() const {
  auto sorted_positive = [](const std::vector<double>& xs) {
    for (std::size_t i = 0; i < xs.size(); ++i) {
      if (!(xs[i] > 0) || !std::isfinite(xs[i])) return false;
      if (i > 0 && !(xs[i] > xs[i - 1])) return false;
    }
    return true;
  };
  char buf[160];
  if (values.empty()) return "values: no resistor values to search";
  if (!sorted_positive(values))
    return "values: expected positive values in increasing order";
  if (!sorted_positive(input_values))
    return "input_values: expected positive values in increasing order";
  if (!(target_gain > 0) || !std::isfinite(target_gain)) {
    std::snprintf(buf, sizeof buf,
                  "target_gain: expected a positive gain, got %g", target_gain);
    return buf;
  }
  if (!(gain_tolerance >= 0) || !(gain_tolerance < 1)) {
    std::snprintf(buf, sizeof buf,
                  "gain_tolerance: expected a ratio in [0, 1), got %g",
                  gain_tolerance);
    return buf;
  }
  if (!(offset_weight >= 0 && offset_weight <= 1)) {
    std::snprintf(buf, sizeof buf,
                  "offset_weight: expected a weight in [0, 1], got %g",
                  offset_weight);
    return buf;
  }
  if (top < 1 || top > kMaxTeeSearchTop)
    return "top: expected 1 to " + std::to_string(kMaxTeeSearchTop) + ", got " +
           std::to_string(top);
  if (pool < 0) return "pool: expected 0 or more, got " + std::to_string(pool);
  if (!(verify_margin >= 0 && verify_margin < 1)) {
    std::snprintf(buf, sizeof buf,
                  "verify_margin: expected a ratio in [0, 1), got %g",
                  verify_margin);
    return buf;
  }
  if (threads < 0 || threads > kMaxWorkerThreads)
    return "threads: expected 0 (every core) to " +
           std::to_string(kMaxWorkerThreads) + ", got " +
           std::to_string(threads);
  return budget.Validate();
}

Stage WithTee(const Stage& stage, double r_in, double r1, double r2,
              double r3) {
  Stage s = stage;
  s.input_resistor_ohm = r_in;
  s.feedback.kind = Feedback::Kind::kTee;
  s.feedback.tee = {r1, r2, r3};
  return s;
}

double FullScore(const Budget& budget, const TeeSearchOptions& options,
                 double noise_ref_v, double offset_ref_v) {
  Scorer scorer{options.ranking, options.offset_weight, noise_ref_v,
                offset_ref_v};
  return scorer(budget.output_rms_v, budget.offset.worst_case_v,
                budget.input_rms);
}

TeeSearchResult SearchTee(const Stage& stage, const TeeSearchOptions& o) {
  assert(o.Validate().empty());
  TeeSearchResult result;
  const std::size_t n = o.values.size();
  const std::size_t n_in = o.input_values.empty() ? 1 : o.input_values.size();
  result.combinations = static_cast<std::uint64_t>(n) * n * n * n_in;

  const BudgetOptions& ranking_budget = o.budget;

  // The references of the weighted figure: the stage as given.
  const ClosedFormModel model = ModelAtTemperature(stage);
  const ClosedFormFigures closed_ref =
      stage.feedback.kind == Feedback::Kind::kTee
          ? ClosedFormTee(model, stage.input_resistor_ohm,
                          stage.feedback.tee.r1_ohm, stage.feedback.tee.r2_ohm,
                          stage.feedback.tee.r3_ohm)
          : ClosedFormPlain(model, stage.input_resistor_ohm,
                            stage.feedback.resistor_ohm);
  const Scorer closed_scorer{o.ranking, o.offset_weight,
                             closed_ref.output_rms_v,
                             closed_ref.offset_worst_case_v};
  if (!o.verify) {
    SweepOutcome sweep =
        RunSweep(stage, o, closed_scorer, static_cast<std::size_t>(o.top),
                 /*report=*/true);
    result.in_tolerance = sweep.in_tolerance;
    result.rows_pruned = sweep.rows_pruned;
    result.cancelled = sweep.cancelled;
    for (const Key& key : sweep.pool) {
      TeeCandidate c = CandidateOf(key);
      c.closed = ClosedFormTee(model, c.r_in_ohm, c.r1_ohm, c.r2_ohm, c.r3_ohm);
      result.best.push_back(std::move(c));
    }
    result.status = Status::Ok();
    return result;
  }
  // The full-engine references of the weighted figure (only it needs them).
  double noise_ref = 0;
  double offset_ref = 0;
  if (o.ranking == TeeRanking::kWeighted) {
    const BudgetOutcome full_ref = ComputeBudget(stage, ranking_budget);
    if (!full_ref.status.ok) {
      result.status =
          Status::Fail("the stage as given: " + full_ref.status.message);
      return result;
    }
    noise_ref = full_ref.budget.output_rms_v;
    offset_ref = full_ref.budget.offset.worst_case_v;
  }

  std::size_t pool_size =
      o.pool > 0 ? static_cast<std::size_t>(o.pool)
                 : static_cast<std::size_t>(std::max(4 * o.top, o.top + 32));
  SweepOutcome sweep =
      RunSweep(stage, o, closed_scorer, pool_size, /*report=*/true);
  result.in_tolerance = sweep.in_tolerance;
  result.rows_pruned = sweep.rows_pruned;
  result.cancelled = sweep.cancelled;

  // Verification by the full engine, in closed-form order, in batches of a
  // fixed size so that the stop rule sees the same sequence on any number
  // of threads. Only networks whose engine DC gain is within the tolerance
  // are ranked. Only the best `top` verified keep their budgets (the stop
  // rule needs no more): memory stays that and one batch, however many
  // networks have to be budgeted.
  const bool exact =
      o.ranking == TeeRanking::kInputNoise || o.ranking == TeeRanking::kOffset;
  const double g = o.target_gain;
  const std::size_t top = static_cast<std::size_t>(o.top);
  std::vector<std::pair<Key, TeeCandidate>> kept;  // best first, at most top
  int budgets = 0;
  bool bound_failed = false;
  double ratio_min = kInf;
  std::size_t next = 0;
  for (;;) {
    if (next >= sweep.pool.size()) {
      // The pool ran out: done if it held every candidate in tolerance,
      // otherwise search again with a larger pool (its best are the same).
      if (sweep.pool.size() < pool_size || result.cancelled) break;
      pool_size *= 4;
      SweepOutcome larger =
          RunSweep(stage, o, closed_scorer, pool_size, /*report=*/false);
      result.cancelled = larger.cancelled;
      result.in_tolerance = larger.in_tolerance;
      result.rows_pruned = larger.rows_pruned;
      sweep.pool = std::move(larger.pool);
      if (next >= sweep.pool.size()) break;
    }
    const std::size_t batch_size = budgets == 0 ? top : 8;
    const std::size_t end = std::min(sweep.pool.size(), next + batch_size);
    std::vector<BudgetOutcome> outcomes(end - next);
    ParallelFor(static_cast<int>(end - next), o.threads, [&](int i) {
      const Key& key = sweep.pool[next + i];
      outcomes[i] = ComputeBudget(
          WithTee(stage, key.r_in, key.r1, key.r2, key.r3), ranking_budget);
    });
    for (std::size_t i = 0; i < outcomes.size(); ++i) {
      TeeCandidate c = CandidateOf(sweep.pool[next + i]);
      if (!outcomes[i].status.ok) {
        result.status =
            Status::Fail(Describe(c) + ": " + outcomes[i].status.message);
        return result;
      }
      ++budgets;
      c.budget = std::move(outcomes[i].budget);
      outcomes[i] = {};
      c.score = FullScore(c.budget, o, noise_ref, offset_ref);
      if (!(std::fabs(std::fabs(c.budget.signal_gain_dc) / g - 1) <=
            o.gain_tolerance))
        continue;
      // The full figure carries the integrator's error (relative, on the
      // total power: at most 3 tol on an rms with margin).
      const double check = o.ranking == TeeRanking::kInputNoise
                               ? 1 - 3 * o.budget.integration.relative_tolerance
                               : 1.0;
      if (exact && c.score < c.closed_score * check && !bound_failed) {
        bound_failed = true;
        result.warnings.push_back(
            "the closed-form bound failed for " + Describe(c) +
            " (the full engine's figure is below it): the list may miss a "
            "network that belongs in it");
      }
      if (!exact && c.closed_score > 0)
        ratio_min = std::min(ratio_min, c.score / c.closed_score);
      const Key key = KeyOf(c, c.score);
      if (kept.size() >= top && !(key < kept.back().first)) continue;
      const auto at = std::upper_bound(
          kept.begin(), kept.end(), key,
          [](const Key& k, const auto& entry) { return k < entry.first; });
      kept.insert(at, {key, std::move(c)});
      if (kept.size() > top) kept.pop_back();
    }
    next = end;
    if (result.cancelled) break;
    const bool full_top = kept.size() >= top;
    if (exact) {
      // Every unverified network's full figure is at least its bound, and
      // the pool is in order of the bound: once the next bound is above
      // the top-th verified figure, no unverified network can enter.
      if (full_top && next < sweep.pool.size() &&
          sweep.pool[next].score > kept.back().first.score)
        break;
      continue;
    }
    if (static_cast<std::size_t>(budgets) >= kMaxVerified) {
      std::string why = "verification stopped after " +
                        std::to_string(budgets) + " full-engine budgets";
      if (next < sweep.pool.size() && full_top && ratio_min < kInf &&
          ratio_min > 0) {
        // How far below the smallest full/closed ratio seen an unverified
        // network's ratio would have to fall to enter the top.
        const double needed =
            1 - kept.back().first.score / (sweep.pool[next].score * ratio_min);
        char buf[160];
        std::snprintf(buf, sizeof buf,
                      "; an unverified network would enter the top %d only if "
                      "its full-engine figure fell %.3g %% further below its "
                      "closed form than any verified one's",
                      o.top, 100 * std::max(0.0, needed));
        why += buf;
      }
      result.warnings.push_back(why);
      break;
    }
    // Without a positive closed-form figure there is no ratio to bound the
    // rest with: the closed-form order stands.
    if (ratio_min == kInf && full_top) break;
    if (full_top && next < sweep.pool.size()) {
      const double top_score = kept.back().first.score;
      const double bound =
          sweep.pool[next].score * ratio_min * (1 - o.verify_margin);
      if (bound > top_score) break;
    }
  }
  result.verified = budgets;
  const std::size_t shown = kept.size();
  for (auto& [key, c] : kept) {
    c.closed = ClosedFormTee(model, c.r_in_ohm, c.r1_ohm, c.r2_ohm, c.r3_ohm);
    result.best.push_back(std::move(c));
  }
  kept.clear();

  // The shown candidates get their comparison with the plain resistor.
  std::vector<BudgetOutcome> plains(shown);
  ParallelFor(static_cast<int>(shown), o.threads, [&](int i) {
    plains[i] =
        ComputeBudget(PlainEquivalent(WithTee(
                          stage, result.best[i].r_in_ohm, result.best[i].r1_ohm,
                          result.best[i].r2_ohm, result.best[i].r3_ohm)),
                      ranking_budget);
  });
  for (std::size_t i = 0; i < shown; ++i) {
    TeeCandidate& c = result.best[i];
    if (!plains[i].status.ok) {
      result.status = Status::Fail(
          Describe(c) + ", plain equivalent: " + plains[i].status.message);
      return result;
    }
    c.budget.tee =
        CompareTee(c.budget, plains[i].budget,
                   c.r1_ohm + c.r2_ohm + c.r1_ohm * c.r2_ohm / c.r3_ohm);
  }
  result.status = Status::Ok();
  return result;
}

}  // namespace hushgain
