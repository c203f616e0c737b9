// `spread`: a Monte Carlo of a stage over the spread of real parts and the
// temperature range. Each sample draws, from its own random stream
// (montecarlo/random_stream.h, seeded by the run's seed and the sample's
// index):
//   temperature  uniform over [min, max] of the stage's range (the nominal
//                without a range)
//   resistors    R = R_25 (1 + e) (1 + tc (T - 25 °C)), e uniform within
//                +-tolerance of the resistor's spec (no spec: exact)
//   capacitors   C = C_25 (1 + e), e uniform within +-tolerance of the
//                stage's capacitors block (CapacitorToleranceFor; none: exact,
//                and no draw)
//   Vos          uniform within +-offset_voltage, or Gaussian with it as
//                sigma (OpAmpModel::offset_distribution), plus the drift
//                d (T - 25 °C) with d uniform within +-offset_voltage_drift
//   Ios          like Vos (uniform within +-Ios or Gaussian), then scaled
//                with the bias-current law k(T); Ib = Ib_25 k(T)
// and computes, through the engine (analysis/restamp_solver.h):
//   gain         the DC signal gain (finite A0), V/V or V/A; for a stage
//                that blocks DC (a capacitive sensor: its DC gain more than
//                3 dB below its gain at the reference) the |gain| at the
//                reference frequency
//   gain error   gain / nominal gain - 1
//   offset       Vos NG - Ib (H+ + H-) - (Ios/2)(H+ - H-) + dark, signed
//   noise        the total output rms over the band, excess noise
//                included at the sample's own DC point, integrated on the
//                nominal budget's converged partition
//                (integrate/band_integral.h) by the Gauss-7 rule of each
//                interval, its weights scaled by K/G: the Kronrod-15 over
//                the Gauss-7 integral of the nominal density there. The
//                nominal density integrates exactly to the budget's sum,
//                and a sample's error is the change of the Gauss rule's
//                relative error from the nominal's (itself within the
//                budget's 1e-4): about 1e-10 of the rms on the examples,
//                4e-8 with 5 % parts and a 90 K range. An interval
//                whose nominal Gauss-Kronrod difference exceeds the
//                tolerance of the whole keeps its 15 nodes
// An "auto" R_plus is the part chosen at 25 °C (the balance value), which
// then spreads like the others. Results do not depend on the thread count.
#ifndef HUSHGAIN_MONTECARLO_SPREAD_H_
#define HUSHGAIN_MONTECARLO_SPREAD_H_

#include <atomic>
#include <cstdint>
#include <functional>
#include <memory>
#include <string>
#include <vector>

#include "base/status.h"
#include "base/worker_pool.h"
#include "budget/budget.h"
#include "budget/compute_budget.h"
#include "circuit/stage.h"

namespace hushgain {

// The documented range of --samples: 1 to a hundred million. A run holds
// kSpreadBytesPerSample a sample (SpreadFigures) and, while the statistics
// are found, one more double a sample (spread_statistics.h): 33 bytes, so
// 3.3 GB at the most; what a sample drew is replayed, not held.
inline constexpr long kMaxSpreadSamples = 100'000'000;
inline constexpr long kSpreadBytesPerSample = 25;

struct SpreadOptions {
  long samples = 10000;    // at least 1
  std::uint64_t seed = 1;  // any value
  int threads = 0;         // 0 = the machine's hardware threads
  BudgetOptions budget;    // for the nominal budget
  // Integrate every sample's noise on all 15 Kronrod nodes of every
  // interval instead of the scaled Gauss-7 rule (SpreadRun::noise_nodes):
  // the reference the reduced rule is checked against.
  bool every_node = false;

  // Empty when valid; names the field, its value and the rule.
  std::string Validate() const;
};

// One sample whole: what it drew and what the engine made of it.
struct SpreadSample {
  double temperature_k = 0;
  double vos_v = 0;  // at the sample's temperature, signed
  double ios_a = 0;  // at the sample's temperature, signed
  double gain = 0;
  double gain_error = 0;
  double offset_v = 0;
  double noise_rms_v = 0;
  // StageProblemBit()s of the sample's headroom check (budget/headroom.h):
  // offset or DC output beyond full scale or half the supply, clipping.
  std::uint32_t problems = 0;
};

// What the engine computed for every sample, index order, one array a
// figure (kSpreadBytesPerSample a sample).
struct SpreadFigures {
  std::vector<double> gain;  // V/V or V/A, at SpreadRun::gain_hz
  std::vector<double> offset_v;
  std::vector<double> noise_rms_v;
  std::vector<std::uint8_t> problems;  // StageProblemBit()s (8 of them)

  std::size_t size() const { return gain.size(); }
  void Resize(std::size_t n);
};

// What a run needs to replay the draws of any sample (spread.cpp).
struct SpreadDraws;

struct SpreadRun {
  Status status;
  bool interrupted = false;
  Budget nominal;                 // the budget at the nominal temperature
  double nominal_gain = 0;        // the gain the errors are relative to
  double gain_hz = 0;             // where the gains are read: 0 = DC
  bool gaussian_offsets = false;  // the op-amp's offset_distribution
  SpreadFigures figures;          // index order
  // The lowest and highest temperature drawn.
  double temperature_low_k = 0;
  double temperature_high_k = 0;
  std::vector<std::string> resistor_names;  // netlist order
  // With a capacitor tolerance: every capacitor (netlist order); empty
  // otherwise (Sample() then draws no capacitor).
  std::vector<std::string> capacitor_names;
  // Max over the range ends (and 25 °C) of the sum of each offset term's
  // largest magnitude over the corners of the tolerance box, with |Vos| +
  // |drift| |T - 25 °C| and |Ios| k(T): a bound on every sample when the
  // offsets are uniform; 0 when the box has more than 16 varied resistors.
  double worst_case_offset_v = 0;
  // Frequency nodes of each sample's noise integral, and the Kronrod-15
  // nodes of the nominal partition (15 an interval) they were cut from.
  int noise_nodes = 0;
  int noise_nodes_full = 0;
  std::shared_ptr<const SpreadDraws> draws;

  std::size_t size() const { return figures.size(); }
  // gain / nominal_gain - 1 of sample i.
  double GainError(std::size_t i) const {
    return figures.gain[i] / nominal_gain - 1.0;
  }
  // Sample i (< size()) whole: its draws replayed from the seed (the same
  // arithmetic as the run's, so the same bits), with the resistor values
  // (resistor_names order) in *ohms and the capacitor values
  // (capacitor_names order) in *farads when given.
  SpreadSample Sample(std::size_t i, std::vector<double>* ohms = nullptr,
                      std::vector<double>* farads = nullptr) const;
};

struct SpreadControl {
  // Set (e.g. from a SIGINT handler) to stop early; the run is then marked
  // interrupted and holds no samples.
  const std::atomic<bool>* stop = nullptr;
  // Called on the calling thread about ten times a second: (done, total).
  std::function<void(long, long)> progress;
};

// The stage as io produced it (25 °C values); never prints.
SpreadRun RunSpread(const Stage& stage, const SpreadOptions& options,
                    const SpreadControl& control = {});

}  // namespace hushgain

#endif  // HUSHGAIN_MONTECARLO_SPREAD_H_
