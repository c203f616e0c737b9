#include "montecarlo/spread.h"

#include <algorithm>
#include <atomic>
#include <cmath>
#include <functional>
#include <limits>
#include <memory>
#include <optional>
#include <string>

#include "analysis/restamp_solver.h"
#include "base/physical_constants.h"
#include "base/worker_pool.h"
#include "budget/headroom.h"
#include "budget/offset.h"
#include "budget/resistor_excess.h"
#include "circuit/expand_stage.h"
#include "circuit/stage_at_temperature.h"
#include "montecarlo/random_stream.h"
#include "noise/excess_noise.h"

namespace hushgain {
// A resistor as the draws see it (outside the anonymous namespace: the
// run's SpreadDraws, declared in the header, holds them).
struct SpreadResistor {
  double ohms_25 = 0;
  double tolerance = 0;
  double tempco_per_k = 0;
  bool excess = false;  // has a technology (and is noisy)
  double noise_index_db = 0;
  double excess_per_v2 = 0;  // K of S = K / f per volt^2 of drop
  int a = -1, b = -1;        // unknown indices
  // A photodiode's R_sh: divided by PhotodiodeTemperatureFactor at T.
  bool photodiode_shunt = false;
};

namespace {

// Samples a worker takes at a time.
constexpr long kBlock = 512;
// The worst-case bound visits 2^m tolerance corners; beyond this m it is
// not computed.
constexpr int kMaxCornerResistors = 16;
constexpr double kInfinity = std::numeric_limits<double>::infinity();

// One noise source with the parts of its density that change per sample.
struct SourceSlot {
  Port port;
  double white = 0, corner = 0, flicker = 0;
  int thermal_of = -1;  // resistor whose 4kT/R this is
  int excess_of = -1;   // resistor whose excess noise this is
  // An op-amp current noise that follows the bias current: white_25 and the
  // table are the 25 °C values, scaled per sample by CurrentNoiseFactor^2.
  bool follows_bias = false;
  // A dark current's shot noise: white_25 times PhotodiodeTemperatureFactor.
  bool follows_dark = false;
  double white_25 = 0;
  int table_row = -1;  // row of Model::table_psd; -1: no table
  double table_scale = 1;
};

// Everything a sample needs that does not change between samples.
struct Model {
  Netlist netlist;  // at 25 °C
  MnaSystem system;
  std::unique_ptr<RestampSolver> prototype;
  std::vector<SpreadResistor> resistors;
  std::vector<SourceSlot> sources;
  std::vector<QuadratureNode> nodes;
  std::vector<double> inverse_f;  // 1 / f of each node
  std::vector<int> table_slots;   // the sources with a tabulated density
  // A tabulated density at every node: row r of the sources with a table,
  // table_psd[r * nodes.size() + node] (fixed per run: tabulated once).
  std::vector<double> table_psd;
  Port signal, e_n, i_plus, i_minus;
  // The photocurrent (the DC point only: it is the signal's DC level) and
  // the dark currents at 25 °C (the DC point and the offset; times
  // PhotodiodeTemperatureFactor at T).
  std::vector<std::pair<Port, double>> photo_junctions;
  std::vector<std::pair<Port, double>> dark_junctions;
  Photodiode photodiode;
  OpAmpModel opamp;  // 25 °C values
  double nominal_k = 298.15;
  std::optional<TemperatureRange> range;
  double dc_input = 0;
  bool any_excess = false;
  // The headroom check's fixed inputs (budget/headroom.h).
  std::optional<double> full_scale_v;
  double supply_v = 0;
  // Where a sample's gain is read: 0 for DC; a stage that blocks DC (a
  // capacitive sensor) has no DC gain, so its |gain| at the reference.
  double gain_hz = 0;
  // Every capacitor of the netlist (its 25 °C value and tolerance); drawn
  // and restamped only when one has a tolerance.
  std::vector<std::pair<double, double>> capacitors;  // farads, tolerance
  bool vary_capacitors = false;
};

// The parts of a sample that its random stream decides.
struct Draw {
  double temperature_k = 0;
  double vos_v = 0;
  double ios_a = 0;
  double ib_a = 0;
};

}  // namespace

// Everything DrawSample reads: the run keeps it to replay any sample.
struct SpreadDraws {
  std::uint64_t seed = 1;
  double nominal_k = 298.15;
  std::optional<TemperatureRange> range;
  std::vector<SpreadResistor> resistors;
  std::vector<std::pair<double, double>> capacitors;  // farads, tolerance
  OpAmpModel opamp;
  Photodiode photodiode;
};

namespace {

struct Workspace {
  explicit Workspace(const Model& m)
      : solver(*m.prototype),
        ohms(m.resistors.size()),
        farads(m.capacitors.size()),
        slots(m.sources),
        level(m.sources.size()),
        slope(m.sources.size()),
        norms(m.sources.size()),
        rhs(m.system.size()) {}
  RestampSolver solver;
  std::vector<double> ohms;
  std::vector<double> farads;
  std::vector<SourceSlot> slots;
  // A slot's density at f without its table: level + slope / f.
  std::vector<double> level;
  std::vector<double> slope;
  std::vector<double> norms;  // each source's |H|^2 at one node
  std::vector<double> rhs;
  HeadroomInputs headroom;  // reused per sample
};

// A resistor's value at T with relative error e: tempco, and the
// photodiode's law for R_sh.
double OhmsAt(const Photodiode& photodiode, const SpreadResistor& r, double e,
              double t) {
  double ohms =
      r.ohms_25 * (1.0 + e) * ResistorTemperatureFactor(r.tempco_per_k, t);
  if (r.photodiode_shunt) ohms /= PhotodiodeTemperatureFactor(photodiode, t);
  return ohms;
}

double OhmsAt(const Model& m, const SpreadResistor& r, double e, double t) {
  return OhmsAt(m.photodiode, r, e, t);
}

double DcOffset(const Model& m, const RestampSolver& s, const Draw& d,
                double* dc_gain) {
  *dc_gain = s.TransferReal(m.signal);
  const double te = s.TransferReal(m.e_n);
  const double hp = s.TransferReal(m.i_plus);
  const double hm = s.TransferReal(m.i_minus);
  double offset = SignedOffset(d.vos_v, d.ib_a, d.ios_a, te, hp, hm);
  const double dark =
      PhotodiodeTemperatureFactor(m.photodiode, d.temperature_k);
  for (const auto& [port, amperes] : m.dark_junctions)
    offset += dark * amperes * s.TransferReal(port);
  return offset;
}

// Evaluates one sample whose resistor (and capacitor) values are already
// in w.ohms (and w.farads). With node_psd, the output density at every
// node goes there too.
Status EvaluateAt(const Model& m, const Draw& d, Workspace& w,
                  SpreadSample* out, double* node_psd = nullptr) {
  RestampSolver& s = w.solver;
  if (m.vary_capacitors) s.SetCapacitors(w.farads.data());
  s.SetResistors(w.ohms.data());
  Status st = s.SolveAdjoint(0.0);
  if (!st.ok) return st;
  out->temperature_k = d.temperature_k;
  out->vos_v = d.vos_v;
  out->ios_a = d.ios_a;
  double dc_gain = 0;
  out->offset_v = DcOffset(m, s, d, &dc_gain);
  out->gain = dc_gain;
  // The sample's DC output against its full scale and supply: its own
  // offset (the dark current inside it), the photocurrent's and the
  // dc_input's outputs at its own transfers, signs known.
  double photo_v = 0;
  for (const auto& [port, amperes] : m.photo_junctions)
    photo_v += amperes * s.TransferReal(port);
  const double input_v = dc_gain * m.dc_input;
  HeadroomInputs& h = w.headroom;
  h.offset_v = std::fabs(out->offset_v);
  h.dc_total_v = std::fabs(out->offset_v + photo_v + input_v);
  h.full_scale_v = m.full_scale_v;
  h.supply_span_v = m.supply_v;
  if (h.dc_outputs.empty()) h.dc_outputs = {{"I_ph", 0}, {"dc_input", 0}};
  h.dc_outputs[0].volts = photo_v;
  h.dc_outputs[1].volts = input_v;
  out->problems = HeadroomProblemBits(h);

  const double four_kt = 4.0 * kBoltzmannJPerK * d.temperature_k;
  if (m.any_excess) {
    // The sample's own DC point (budget/resistor_excess.h stimuli).
    std::fill(w.rhs.begin(), w.rhs.end(), 0.0);
    auto add = [&](Port p, double v) {
      if (p.plus >= 0) w.rhs[p.plus] += v;
      if (p.minus >= 0) w.rhs[p.minus] -= v;
    };
    if (m.dc_input != 0) add(m.signal, m.dc_input);
    add(m.e_n, d.vos_v);
    add(m.i_plus, -(d.ib_a + 0.5 * d.ios_a));
    add(m.i_minus, -(d.ib_a - 0.5 * d.ios_a));
    for (const auto& [port, amperes] : m.photo_junctions) add(port, amperes);
    const double dark =
        PhotodiodeTemperatureFactor(m.photodiode, d.temperature_k);
    for (const auto& [port, amperes] : m.dark_junctions)
      add(port, dark * amperes);
    s.SolveDirectDc(w.rhs.data());
  }
  const double bias_noise =
      std::pow(CurrentNoiseFactor(m.opamp, d.temperature_k), 2);
  const double dark_factor =
      PhotodiodeTemperatureFactor(m.photodiode, d.temperature_k);
  for (SourceSlot& slot : w.slots) {
    if (slot.follows_dark) slot.white = slot.white_25 * dark_factor;
    if (slot.follows_bias) {
      slot.white = slot.white_25 * bias_noise;
      slot.table_scale = bias_noise;
    }
    if (slot.thermal_of >= 0) slot.white = four_kt / w.ohms[slot.thermal_of];
    if (slot.excess_of >= 0) {
      const SpreadResistor& r = m.resistors[slot.excess_of];
      const double va = r.a >= 0 ? w.rhs[r.a] : 0.0;
      const double vb = r.b >= 0 ? w.rhs[r.b] : 0.0;
      const double ohms = w.ohms[slot.excess_of];
      slot.flicker =
          ExcessNoiseCoefficient(r.noise_index_db, va - vb) / (ohms * ohms);
    }
  }
  // white (1 + corner / f) + flicker / f as level + slope / f: no division
  // in the loop over nodes, the tables added apart.
  const std::size_t slot_count = w.slots.size();
  for (std::size_t k = 0; k < slot_count; ++k) {
    const SourceSlot& slot = w.slots[k];
    w.level[k] = slot.white;
    w.slope[k] = slot.white * slot.corner + slot.flicker;
  }
  double power = 0;
  const std::size_t node_count = m.nodes.size();
  const double* level = w.level.data();
  const double* slope = w.slope.data();
  double* norms = w.norms.data();  // |H|^2 of each source, its order
  for (std::size_t q = 0; q < node_count; ++q) {
    const QuadratureNode& node = m.nodes[q];
    st = s.TransferNorms(node.f_hz, norms);
    if (!st.ok) return st;
    // Sum of |H|^2 level and of |H|^2 slope apart: two chains of sums.
    double level_sum = 0, slope_sum = 0;
    for (std::size_t k = 0; k < slot_count; ++k) {
      level_sum += norms[k] * level[k];
      slope_sum += norms[k] * slope[k];
    }
    double psd = level_sum + slope_sum * m.inverse_f[q];
    for (const int k : m.table_slots) {
      const SourceSlot& slot = w.slots[k];
      psd += norms[k] * slot.table_scale *
             m.table_psd[slot.table_row * node_count + q];
    }
    if (node_psd != nullptr) node_psd[q] = psd;
    power += node.weight_hz * psd;
  }
  out->noise_rms_v = std::sqrt(power);
  if (m.gain_hz > 0) {
    st = s.SolveAdjoint(m.gain_hz);
    if (!st.ok) return st;
    out->gain = std::sqrt(s.TransferNorm(m.signal));
  }
  return Status::Ok();
}

// Sample `index`'s draws, its resistor values in *ohms and its capacitor
// values in *farads (each sized to the model's).
Draw DrawSample(const SpreadDraws& m, std::uint64_t index,
                std::vector<double>* ohms, std::vector<double>* farads) {
  RandomStream rng(m.seed, index);
  Draw d;
  d.temperature_k = m.nominal_k;
  if (m.range)
    d.temperature_k =
        m.range->min_k + (m.range->max_k - m.range->min_k) * rng.Uniform01();
  for (std::size_t k = 0; k < m.resistors.size(); ++k) {
    const SpreadResistor& r = m.resistors[k];
    const double e = rng.UniformSymmetric(r.tolerance);
    (*ohms)[k] = OhmsAt(m.photodiode, r, e, d.temperature_k);
  }
  // Capacitors without a tolerance draw nothing, so a stage without
  // capacitor tolerances keeps its samples for a given seed.
  for (std::size_t k = 0; k < m.capacitors.size(); ++k) {
    const auto [farads_25, tolerance] = m.capacitors[k];
    (*farads)[k] = tolerance > 0
                       ? farads_25 * (1.0 + rng.UniformSymmetric(tolerance))
                       : farads_25;
  }
  const bool gaussian =
      m.opamp.offset_distribution == OffsetDistribution::kGaussian;
  const double vos_25 = gaussian ? rng.Gaussian(m.opamp.vos_v)
                                 : rng.UniformSymmetric(m.opamp.vos_v);
  const double drift = rng.UniformSymmetric(m.opamp.vos_drift_v_per_k);
  const double ios_25 = gaussian ? rng.Gaussian(m.opamp.ios_a)
                                 : rng.UniformSymmetric(m.opamp.ios_a);
  const double k = BiasCurrentFactor(m.opamp, d.temperature_k);
  d.vos_v = vos_25 + drift * (d.temperature_k - kDeviceReferenceK);
  d.ios_a = ios_25 * k;
  d.ib_a = m.opamp.ib_a * k;
  return d;
}

Status BuildModel(const Stage& stage, const BudgetOutcome& nominal, Model* m) {
  Stage s25 = stage;
  s25.capacitor_target.reset();
  s25.feedback.capacitor_f = nominal.stage_used.feedback.capacitor_f;
  m->netlist = ExpandStage(s25);
  Status st = MnaSystem::Build(m->netlist, &m->system);
  if (!st.ok) return st;
  m->prototype = std::make_unique<RestampSolver>(m->system, m->netlist);
  m->opamp = stage.opamp;
  m->nominal_k = stage.temperature_k;
  m->range = stage.temperature_range;
  m->dc_input = stage.dc_input;
  m->full_scale_v = stage.full_scale_output_v;
  m->supply_v = stage.opamp.supply_v;
  m->nodes = QuadratureNodes(nominal.noise_partition);
  for (const QuadratureNode& node : m->nodes)
    m->inverse_f.push_back(1.0 / node.f_hz);
  const Netlist& net = m->netlist;
  for (const Resistor& r : net.resistors) {
    SpreadResistor info;
    info.ohms_25 = r.ohms;
    info.a = m->system.NodeIndex(r.a);
    info.b = m->system.NodeIndex(r.b);
    info.photodiode_shunt =
        stage.topology == Topology::kTransimpedance && r.name == "R_sh";
    if (const ResistorSpec* spec = ResistorSpecFor(stage, r.name)) {
      info.tolerance = spec->tolerance;
      info.tempco_per_k = spec->technology.tempco_per_k;
      info.excess = r.noisy;
      info.noise_index_db = spec->technology.noise_index_db;
      info.excess_per_v2 = ExcessNoiseCoefficient(info.noise_index_db, 1.0);
      m->any_excess = m->any_excess || r.noisy;
    }
    m->resistors.push_back(info);
  }
  for (const Capacitor& c : net.capacitors) {
    const double tolerance = CapacitorToleranceFor(stage, c.name);
    m->capacitors.push_back({c.farads, tolerance});
    m->vary_capacitors = m->vary_capacitors || tolerance > 0;
  }
  m->signal = m->system.Compile(net.signal);
  m->e_n = m->system.Compile(Excitation{OpAmpInputVoltage{0}});
  m->i_plus = m->system.Compile(
      Excitation{CurrentInjection{net.opamps[0].plus, kGround}});
  m->i_minus = m->system.Compile(
      Excitation{CurrentInjection{net.opamps[0].minus, kGround}});
  m->photodiode = stage.photodiode;
  for (const JunctionCurrent& j : net.junction_currents) {
    const Port port = m->system.Compile(Excitation{CurrentInjection{j.b, j.a}});
    (j.is_signal ? m->photo_junctions : m->dark_junctions)
        .push_back({port, j.amperes});
  }
  // The budget's sources, in its order (noise/noise_source.h), then one
  // excess source per resistor with a technology.
  std::vector<int> noisy;
  for (std::size_t k = 0; k < net.resistors.size(); ++k)
    if (net.resistors[k].noisy) noisy.push_back(static_cast<int>(k));
  int next_thermal = 0;
  for (const NoiseSource& src : CollectNoiseSources(net, stage.temperature_k)) {
    SourceSlot slot;
    slot.port = m->system.Compile(src.excitation);
    slot.white = src.white_psd;
    slot.white_25 = src.white_psd;
    slot.corner = src.corner_hz;
    slot.follows_bias = src.kind == NoiseKind::kOpAmpCurrent &&
                        m->opamp.current_noise_temperature ==
                            CurrentNoiseTemperature::kWithBiasCurrent;
    if (!src.table.empty()) {
      slot.table_row = static_cast<int>(m->table_psd.size() / m->nodes.size());
      for (const QuadratureNode& node : m->nodes)
        m->table_psd.push_back(src.table.PsdAt(node.f_hz));
    }
    if (slot.table_row >= 0)
      m->table_slots.push_back(static_cast<int>(m->sources.size()));
    slot.follows_dark = src.kind == NoiseKind::kShot && src.name == "I_dark";
    if (src.kind == NoiseKind::kThermal)
      slot.thermal_of = noisy[next_thermal++];
    m->sources.push_back(slot);
  }
  for (std::size_t k = 0; k < net.resistors.size(); ++k) {
    if (!m->resistors[k].excess) continue;
    SourceSlot slot;
    slot.port = m->system.Compile(
        Excitation{CurrentInjection{net.resistors[k].a, net.resistors[k].b}});
    slot.excess_of = static_cast<int>(k);
    m->sources.push_back(slot);
  }
  std::vector<Port> ports;
  for (const SourceSlot& slot : m->sources) ports.push_back(slot.port);
  m->prototype->SetNormPorts(ports);
  return Status::Ok();
}

// The draw of a sample with every error zero: the nominal temperature,
// Vos = Ios = 0, the bias current at the nominal temperature.
Draw NominalDraw(const Model& m) {
  Draw d;
  d.temperature_k = m.nominal_k;
  d.ib_a = m.opamp.ib_a * BiasCurrentFactor(m.opamp, m.nominal_k);
  return d;
}

// The per-sample rule (see SpreadRun::noise_nodes): m->nodes go from the
// Kronrod-15 nodes of every interval of `partition` to its Gauss-7 nodes,
// their weights scaled by K_i / G_i, the two rules' integrals of the
// nominal output density on the interval, so the nominal density still
// integrates to the Kronrod sum. An interval keeps its 15 nodes when
// |K_i - G_i| exceeds `tolerance` times the whole nominal integral (a
// converged nominal budget meets that on every interval: its summed
// estimate met it) or its G_i is not positive. w.ohms holds the nominal
// resistors.
Status ReduceNodes(const std::vector<LogInterval>& partition, double tolerance,
                   Model* m, Workspace& w) {
  const std::size_t full_count = m->nodes.size();
  std::vector<double> psd(full_count, 0.0);
  SpreadSample unused;
  Status st = EvaluateAt(*m, NominalDraw(*m), w, &unused, psd.data());
  if (!st.ok) return st;
  const std::vector<QuadratureNode> gauss = GaussNodes(partition);
  double total = 0;
  for (std::size_t q = 0; q < full_count; ++q)
    total += m->nodes[q].weight_hz * psd[q];
  std::vector<QuadratureNode> nodes;
  std::vector<std::size_t> kept;  // index into the full nodes
  for (std::size_t i = 0; i < partition.size(); ++i) {
    double k_sum = 0, g_sum = 0;
    for (std::size_t j = 0; j < 15; ++j)
      k_sum += m->nodes[15 * i + j].weight_hz * psd[15 * i + j];
    for (std::size_t j = 0; j < 7; ++j)
      g_sum += gauss[7 * i + j].weight_hz * psd[15 * i + 2 * j + 1];
    if (g_sum > 0 && std::isfinite(k_sum / g_sum) &&
        std::fabs(k_sum - g_sum) <= tolerance * total) {
      const double scale = k_sum / g_sum;
      for (std::size_t j = 0; j < 7; ++j) {
        nodes.push_back(
            {gauss[7 * i + j].f_hz, gauss[7 * i + j].weight_hz * scale});
        kept.push_back(15 * i + 2 * j + 1);
      }
    } else {
      for (std::size_t j = 0; j < 15; ++j) {
        nodes.push_back(m->nodes[15 * i + j]);
        kept.push_back(15 * i + j);
      }
    }
  }
  std::vector<double> inverse_f, table_psd;
  for (std::size_t q : kept) inverse_f.push_back(m->inverse_f[q]);
  for (std::size_t row = 0; row * full_count < m->table_psd.size(); ++row)
    for (std::size_t q : kept)
      table_psd.push_back(m->table_psd[row * full_count + q]);
  m->nodes = std::move(nodes);
  m->inverse_f = std::move(inverse_f);
  m->table_psd = std::move(table_psd);
  return Status::Ok();
}

// See SpreadRun::worst_case_offset_v.
double WorstCaseOffset(const Model& m, Workspace& w) {
  std::vector<int> varied;
  for (std::size_t k = 0; k < m.resistors.size(); ++k)
    if (m.resistors[k].tolerance > 0) varied.push_back(static_cast<int>(k));
  if (static_cast<int>(varied.size()) > kMaxCornerResistors) return 0;
  std::vector<double> temperatures = {m.nominal_k};
  if (m.range) {
    temperatures.push_back(m.range->min_k);
    temperatures.push_back(m.range->max_k);
    if (m.range->min_k < kDeviceReferenceK &&
        kDeviceReferenceK < m.range->max_k)
      temperatures.push_back(kDeviceReferenceK);
  }
  double bound = 0;
  for (double t : temperatures) {
    const double k = BiasCurrentFactor(m.opamp, t);
    const double vos =
        std::fabs(m.opamp.vos_v) +
        std::fabs(m.opamp.vos_drift_v_per_k) * std::fabs(t - kDeviceReferenceK);
    const double ios = std::fabs(m.opamp.ios_a * k);
    const double ib = m.opamp.ib_a * k;
    double vos_term = 0, ib_term = 0, ios_term = 0, dark_term = 0;
    for (long corner = 0; corner < (1L << varied.size()); ++corner) {
      for (std::size_t k2 = 0; k2 < m.resistors.size(); ++k2) {
        w.ohms[k2] = OhmsAt(m, m.resistors[k2], 0.0, t);
      }
      for (std::size_t v = 0; v < varied.size(); ++v) {
        const SpreadResistor& r = m.resistors[varied[v]];
        const double e = (corner >> v) & 1 ? r.tolerance : -r.tolerance;
        w.ohms[varied[v]] = OhmsAt(m, r, e, t);
      }
      w.solver.SetResistors(w.ohms.data());
      if (!w.solver.SolveAdjoint(0.0).ok) return 0;
      const double te = w.solver.TransferReal(m.e_n);
      const double hp = w.solver.TransferReal(m.i_plus);
      const double hm = w.solver.TransferReal(m.i_minus);
      double h_sum = hp + hm;
      if (std::fabs(h_sum) < 1e-9 * (std::fabs(hp) + std::fabs(hm))) h_sum = 0;
      double dark = 0;
      for (const auto& [port, amperes] : m.dark_junctions)
        dark += PhotodiodeTemperatureFactor(m.photodiode, t) * amperes *
                w.solver.TransferReal(port);
      vos_term = std::max(vos_term, vos * std::fabs(te));
      ib_term = std::max(ib_term, std::fabs(ib * h_sum));
      ios_term = std::max(ios_term, 0.5 * ios * std::fabs(hp - hm));
      dark_term = std::max(dark_term, std::fabs(dark));
    }
    bound = std::max(bound, vos_term + ib_term + ios_term + dark_term);
  }
  // Rounding of the sums above against the samples': one part in 1e12.
  return bound * (1 + 1e-12);
}

}  // namespace

std::string SpreadOptions::Validate() const {
  if (samples < 1 || samples > kMaxSpreadSamples)
    return "samples: expected 1 to " + std::to_string(kMaxSpreadSamples) +
           ", got " + std::to_string(samples);
  if (threads < 0 || threads > kMaxWorkerThreads)
    return "threads: expected 0 (all) to " + std::to_string(kMaxWorkerThreads) +
           ", got " + std::to_string(threads);
  return budget.Validate();
}

SpreadRun RunSpread(const Stage& stage, const SpreadOptions& options,
                    const SpreadControl& control) {
  SpreadRun run;
  BudgetOutcome nominal = ComputeBudget(stage, options.budget);
  if (!nominal.status.ok) {
    run.status = nominal.status;
    return run;
  }
  run.nominal = nominal.budget;
  run.gaussian_offsets =
      stage.opamp.offset_distribution == OffsetDistribution::kGaussian;
  Model model;
  run.status = BuildModel(stage, nominal, &model);
  if (!run.status.ok) return run;
  for (const Resistor& r : model.netlist.resistors)
    run.resistor_names.push_back(r.name);
  const std::size_t m = model.resistors.size();

  // The nominal point: every resistor exact at the nominal temperature.
  {
    Workspace w(model);
    for (std::size_t k = 0; k < m; ++k)
      w.ohms[k] = OhmsAt(model, model.resistors[k], 0.0, model.nominal_k);
    w.solver.SetResistors(w.ohms.data());
    run.status = w.solver.SolveAdjoint(0.0);
    if (!run.status.ok) return run;
    run.nominal_gain = w.solver.TransferReal(model.signal);
    // A DC gain more than 3 dB below the gain at the reference (the rule of
    // analysis/frequency_response.h) is no gain to measure errors against.
    const double ref_hz = ReferenceFrequencyHz(stage);
    run.status = w.solver.SolveAdjoint(ref_hz);
    if (!run.status.ok) return run;
    const double at_ref = std::sqrt(w.solver.TransferNorm(model.signal));
    if (std::fabs(run.nominal_gain) < at_ref / std::sqrt(2.0)) {
      model.gain_hz = ref_hz;
      run.gain_hz = ref_hz;
      run.nominal_gain = at_ref;
    }
    run.worst_case_offset_v = WorstCaseOffset(model, w);
    run.noise_nodes_full = static_cast<int>(model.nodes.size());
    if (!options.every_node) {
      for (std::size_t k = 0; k < m; ++k)
        w.ohms[k] = OhmsAt(model, model.resistors[k], 0.0, model.nominal_k);
      for (std::size_t k = 0; k < model.capacitors.size(); ++k)
        w.farads[k] = model.capacitors[k].first;
      run.status =
          ReduceNodes(nominal.noise_partition,
                      options.budget.integration.relative_tolerance, &model, w);
      if (!run.status.ok) return run;
    }
    run.noise_nodes = static_cast<int>(model.nodes.size());
  }

  auto draws = std::make_shared<SpreadDraws>();
  draws->seed = options.seed;
  draws->nominal_k = model.nominal_k;
  draws->range = model.range;
  draws->resistors = model.resistors;
  draws->capacitors = model.capacitors;
  draws->opamp = model.opamp;
  draws->photodiode = model.photodiode;
  run.draws = draws;
  if (model.vary_capacitors)
    for (const Capacitor& c : model.netlist.capacitors)
      run.capacitor_names.push_back(c.name);

  const long total = options.samples;
  run.figures.Resize(static_cast<std::size_t>(total));
  const int threads =
      WorkerCount(options.threads, (total + kBlock - 1) / kBlock);
  std::atomic<long> next{0}, done{0};
  std::atomic<bool> failed{false};
  std::vector<Status> failures(threads);
  // The lowest and highest temperature each worker drew.
  std::vector<std::pair<double, double>> temperatures(
      threads, {model.nominal_k, model.nominal_k});
  auto stopped = [&] {
    return control.stop && control.stop->load(std::memory_order_relaxed);
  };
  auto worker = [&](int id) {
    Workspace w(model);
    SpreadFigures& f = run.figures;
    double t_lo = kInfinity, t_hi = -kInfinity;
    while (!failed.load(std::memory_order_relaxed) && !stopped()) {
      const long begin = next.fetch_add(kBlock);
      if (begin >= total) break;
      const long end = std::min(total, begin + kBlock);
      for (long i = begin; i < end; ++i) {
        const Draw d = DrawSample(*draws, static_cast<std::uint64_t>(i),
                                  &w.ohms, &w.farads);
        t_lo = std::min(t_lo, d.temperature_k);
        t_hi = std::max(t_hi, d.temperature_k);
        SpreadSample out;
        Status s = EvaluateAt(model, d, w, &out);
        if (!s.ok) {
          failures[id] = s;
          failed = true;
          break;
        }
        f.gain[i] = out.gain;
        f.offset_v[i] = out.offset_v;
        f.noise_rms_v[i] = out.noise_rms_v;
        static_assert(kStageProblemCount <= 8, "problems are held in 8 bits");
        f.problems[i] = static_cast<std::uint8_t>(out.problems);
      }
      done.fetch_add(end - begin);
    }
    if (t_lo <= t_hi) temperatures[id] = {t_lo, t_hi};
  };
  std::function<void()> tick;
  if (control.progress) tick = [&] { control.progress(done.load(), total); };
  RunWorkers(threads, worker, tick);
  for (const Status& s : failures)
    if (!s.ok) {
      run.status = s;
      return run;
    }
  if (stopped() && done.load() < total) {
    run.interrupted = true;
    run.figures = SpreadFigures();
    return run;
  }
  // Min and max do not depend on which worker drew what.
  run.temperature_low_k = kInfinity;
  run.temperature_high_k = -kInfinity;
  for (const auto& [lo, hi] : temperatures) {
    run.temperature_low_k = std::min(run.temperature_low_k, lo);
    run.temperature_high_k = std::max(run.temperature_high_k, hi);
  }
  return run;
}

void SpreadFigures::Resize(std::size_t n) {
  gain.resize(n);
  offset_v.resize(n);
  noise_rms_v.resize(n);
  problems.resize(n);
}

SpreadSample SpreadRun::Sample(std::size_t i, std::vector<double>* ohms,
                               std::vector<double>* farads) const {
  std::vector<double> own_ohms, own_farads;
  if (ohms == nullptr) ohms = &own_ohms;
  if (farads == nullptr) farads = &own_farads;
  ohms->resize(draws->resistors.size());
  farads->resize(draws->capacitors.size());
  const Draw d =
      DrawSample(*draws, static_cast<std::uint64_t>(i), ohms, farads);
  // Only the varied capacitors' values are the run's (capacitor_names).
  if (capacitor_names.empty()) farads->clear();
  SpreadSample s;
  s.temperature_k = d.temperature_k;
  s.vos_v = d.vos_v;
  s.ios_a = d.ios_a;
  s.gain = figures.gain[i];
  s.gain_error = GainError(i);
  s.offset_v = figures.offset_v[i];
  s.noise_rms_v = figures.noise_rms_v[i];
  s.problems = figures.problems[i];
  return s;
}

}  // namespace hushgain
