// The budget: everything a noise and offset review of one stage needs, as a
// plain value. Computed by ComputeBudget (budget/compute_budget.h), printed
// by report/. SI units throughout; "input" quantities are in volts for a
// voltage source and amperes for a current source (see input_unit).
#ifndef HUSHGAIN_BUDGET_BUDGET_H_
#define HUSHGAIN_BUDGET_BUDGET_H_

#include <optional>
#include <string>
#include <vector>

#include "budget/chain_block.h"
#include "budget/dc_output.h"
#include "budget/stage_problem.h"
#include "circuit/tee_equivalents.h"
#include "noise/noise_source.h"

namespace hushgain {

struct Contributor {
  std::string name;                      // "R_in", "R3", "e_n", "i_n-"
  NoiseKind kind = NoiseKind::kThermal;  // report/enum_words.h names it
  double output_rms_v = 0;  // sqrt(integral of S_out,k over the band)
  double share = 0;         // fraction of the total output noise power
  double output_density_ref_v_per_rthz = 0;  // at the reference frequency
  // |transfer| from the source to the output at the reference frequency,
  // V/V for a voltage source (e_n: the noise gain), V/A for a current.
  double gain_to_output_ref = 0;
  // The source's own density at the reference frequency, V or A per rtHz.
  double source_density_ref = 0;
};

// Output offset at DC (finite A0), from
//   Vout = Vos NG - Ib (H+ + H-) - (Ios/2) (H+ - H-)
// where H+- is the output per unit current injected at the +- pin and
// NG the DC noise gain. Vos and Ios have unknown sign: their terms are
// magnitudes; the Ib term keeps its sign.
struct OffsetBlock {
  double vos_v = 0;   // |Vos| * NG
  double ib_v = 0;    // signed
  double ios_v = 0;   // magnitude
  double dark_v = 0;  // photodiode dark current x DC transimpedance, signed
  double worst_case_v = 0;  // |vos| + |ib| + |ios| + |dark|
  double rss_v = 0;         // sqrt(vos^2 + ib^2 + ios^2 + dark^2)
  double noise_gain_dc = 0;
  // The R_plus value that cancels the Ib term, and the value used (0 when
  // the + input is tied to ground).
  double balance_resistor_ohm = 0;
  double plus_resistor_ohm = 0;
};

// One contributor compared between the T network and the plain resistor.
struct TeeChange {
  enum class Kind { kAdded, kRemoved, kRaised, kLowered, kSame };
  std::string name;
  Kind kind = Kind::kSame;
  double tee_output_rms_v = 0;    // 0 when absent from the tee stage
  double plain_output_rms_v = 0;  // 0 when absent from the plain stage
};

// The noise cost of a T network against the plain single resistor with the
// same equivalent resistance (everything else unchanged).
struct TeeComparison {
  double equivalent_resistance_ohm = 0;  // R1 + R2 + R1 R2 / R3
  double plain_output_rms_v = 0;
  double plain_input_rms = 0;
  double noise_cost_ratio = 0;  // tee output rms / plain output rms
  double tee_noise_gain_ref = 0;
  double plain_noise_gain_ref = 0;
  double tee_noise_gain_dc = 0;
  double plain_noise_gain_dc = 0;
  double plain_bandwidth_3db_hz = 0;
  double plain_offset_worst_case_v = 0;
  std::vector<TeeChange> changes;  // in the order of the tee's contributors
};

// The loop gain of the actual network (analysis/loop_gain.h).
struct LoopBlock {
  bool crossover_found = false;
  double crossover_hz = 0;
  double phase_margin_deg = 0;
  double dc_loop_gain = 0;
};

// What a photodiode stage adds to the budget.
struct PhotodiodeBlock {
  double responsivity_a_per_w = 0;  // 0 = not given
  double nep_w_per_rthz = 0;        // input current density / responsivity
  double nep_rms_w = 0;             // input current rms / responsivity
  double input_capacitance_f = 0;   // C_d + the op-amp's pin capacitance
  // 1 + C / C_f, the high-frequency plateau of the e_n noise gain of an
  // ideal op-amp (0 without C_f).
  double noise_gain_plateau_estimate = 0;
  double photocurrent_a = 0;        // average (signal DC level plus ambient)
  double reverse_bias_v = 0;        // 0 = zero bias (photovoltaic)
  double dark_current_a = 0;        // flowing at the stage's temperature; 0 at
                                    // zero bias
  double shunt_resistance_ohm = 0;  // at the stage's temperature
  // A T network in the feedback: its noise-equivalent resistance R_n
  // (circuit/tee_equivalents.h), the one resistor whose thermal current
  // noise matches the T's at the summing node; 0 for a plain R_f.
  double tee_noise_equivalent_ohm = 0;
};

// What a capacitive (charge) sensor adds to the budget. The signal is the
// sensor's open-circuit voltage V = Q / C_s (the budget's input unit stays
// volts "at the sensor"), so every charge figure is a voltage figure times
// C_s. The corners are the response's (Budget::bandwidth_low_hz and
// bandwidth_3db_hz, measured against the passband).
struct ChargeBlock {
  double sensor_capacitance_f = 0;    // C_s
  double leakage_resistance_ohm = 0;  // R_leak at the stage's temperature;
                                      // 0 = none
  double input_resistor_ohm = 0;      // 0: the sensor drives the - input
  // |output| per coulomb in the passband: Budget::passband_gain / C_s
  // (1 / C_f for a charge amplifier with an ideal op-amp).
  double charge_gain_v_per_c = 0;
  double input_rms_c = 0;                   // Budget::input_rms x C_s
  double input_density_ref_c_per_rthz = 0;  // at the reference frequency
  // The feedback's DC resistance (R_f, or the T network's R1 + R2 +
  // R1 R2 / R3) and the corner it makes with C_f, 1 / (2 pi R C_f): the
  // charge amplifier's low corner (0 without C_f).
  double feedback_dc_ohm = 0;
  bool feedback_is_tee = false;
  double low_corner_estimate_hz = 0;
  // Without R_in: C_s + the op-amp's pin capacitance at the - input, and
  // 1 + that / C_f, the e_n noise gain in the passband (0 without C_f or
  // with R_in).
  double input_capacitance_f = 0;
  double noise_gain_plateau_estimate = 0;
};

// AC coupling in the stage (stage.feedback.tee.c3, stage.input_capacitor):
// the closed-form corners beside the budget's own figures (the DC noise gain,
// the offsets and the -3 dB corners are computed on the network).
struct AcCouplingBlock {
  double c3_f = 0;               // in series with R3; 0 = none
  double shunt_corner_hz = 0;    // 1 / (2 pi R3 C3): the T acts above it
  double feedback_dc_ohm = 0;    // R1 + R2: the DC transresistance with C3
  double input_capacitor_f = 0;  // in series with R_in; 0 = none
  // 1 / (2 pi (R_source + R_in) C_input), the input's high-pass corner with
  // an ideal op-amp (a voltage source; 0 for a capacitive sensor, whose C_s
  // sits in series too).
  double input_corner_hz = 0;
};

// The input-referred noise in the measured quantity's units, from
// source.sensitivity: the input-referred figures divided by the sensitivity
// (the smallest change of the measurand the stage resolves; the NEP in the
// optical case).
struct MeasurandBlock {
  std::string unit;        // the sensitivity's "per": "g", "Pa", "W"
  double sensitivity = 0;  // sensitivity_unit per measurand unit
  // The unit of `sensitivity`: the input unit ("V", "A"), or "C" when a
  // capacitive sensor's is given in charge (the figures are then the
  // input-referred charge over it).
  std::string sensitivity_unit = "V";
  double input_referred_rms = 0;
  double input_referred_density_at_reference = 0;  // per rtHz
};

// The T network as its pi (star-mesh) equivalent and the currents in its
// arms (budget/tee_pi.h), for every T-network stage.
struct TeePiBlock {
  PiEquivalent arms;                // bridge (= Req), input arm, output arm
  double noise_equivalent_ohm = 0;  // circuit/tee_equivalents.h
  // R2/R3 = Req / (S/R2): what the input arm adds to the DC noise gain.
  double input_arm_noise_gain = 0;
  // |I(input arm)| / |I(bridge)| for the signal at a frequency.
  struct ArmFraction {
    double f_hz = 0;
    double fraction = 0;
  };
  ArmFraction fraction_at_dc, fraction_at_reference, fraction_at_band_high;
  // With a full-scale swing: the output arm's current there, V_fs / (S/R1),
  // and its share of the op-amp's output current.
  std::optional<double> output_arm_current_a;
  std::optional<double> output_arm_share;
};

// Which part to change (review/sensitivity.h): d ln F / d ln x of the
// output noise rms, the worst-case offset and the -3 dB bandwidth for each
// parameter x of the stage.
struct SensitivityRow {
  std::string parameter;            // "R1", "C_f", "e_n", "GBW", ...
  std::string unit;                 // of value: "ohm", "F", "V/rtHz", "Hz", ...
  double value = 0;                 // SI, at the stage's temperature
  double noise = 0;                 // d ln(output rms) / d ln(x)
  std::optional<double> offset;     // absent when the offset is zero
  std::optional<double> bandwidth;  // absent without a -3 dB point
  std::optional<double> gain;       // of the passband gain
};

struct SensitivityBlock {
  std::vector<SensitivityRow> rows;  // largest |s| first
  double step = 0;                   // h in ln x
  double largest_error = 0;          // the largest error estimate of any s
  // The change that pays most on the noise among the parameters that do not
  // set the gain (|d ln gain / d ln x| < kGainSettingSensitivity):
  // `parameter` halved (factor 0.5) or doubled (2), and the output rms then
  // over the output rms now, from a whole budget of the changed stage.
  // Empty when no such parameter moves the noise.
  std::string advice_parameter;
  double advice_factor = 0;
  double advice_noise_ratio = 0;
};

// A feedback capacitor chosen for a target ("auto").
struct CapacitorChoice {
  std::string target;         // "butterworth" or "phase margin 60 deg"
  double chosen_f = 0;        // found on the computed loop or response
  double estimate_f = 0;      // the textbook approximation
  std::string estimate_rule;  // "sqrt(C / (pi Rf GBW))"
};

// The DC drop across a resistor with a technology, from the DC solution at
// the stage's DC input level with Vos, Ib+-, Ios (taken positive) and the
// dark current as stimuli (budget/resistor_excess.h).
struct ResistorDrop {
  std::string name;        // "R_f"
  std::string technology;  // class name, "thick film"
  double noise_index_db = 0;
  double v_dc = 0;  // signed, node a to node b
};

// Which resistor's technology is worth upgrading: the one whose excess
// noise has the largest share of the output noise power, and what the
// total would be with each quieter technology of the device library.
struct ExcessAdvice {
  std::string resistor;
  std::string technology;
  double noise_index_db = 0;
  double share = 0;  // of the total output noise power
  struct Alternative {
    std::string technology;
    double noise_index_db = 0;
    double output_rms_v = 0;  // the stage's total with that resistor changed
  };
  std::vector<Alternative> alternatives;  // quietest first
};

// The output offset and noise at one temperature.
struct TemperatureCorner {
  double temperature_k = 0;
  OffsetBlock offset;
  std::string offset_dominant;  // "Vos", "Ib", "Ios" or "dark current"
  double output_rms_v = 0;
  std::string noise_dominant;  // the contributor with the largest share
  double noise_dominant_share = 0;
};

// The budget at the ends of the stage's temperature range. Drift is the
// change of the worst-case offset per kelvin (= per °C) from the nominal
// temperature to each end: (wc(T_end) - wc(T_nom)) / (T_end - T_nom), 0 when
// the end is the nominal.
struct TemperatureBlock {
  TemperatureCorner min, nominal, max;
  double drift_to_min_v_per_k = 0;
  double drift_to_max_v_per_k = 0;
};

// The bias-current compensation resistor R_plus at the balance value,
// against the + input grounded; both budgets computed through the engine.
struct CompensationBlock {
  double balance_ohm = 0;
  double offset_without_v = 0;  // worst case, + input grounded
  double offset_with_v = 0;     // worst case, R_plus = balance_ohm
  double ib_without_v = 0;
  double ib_with_v = 0;
  double noise_without_v = 0;  // output rms
  double noise_with_v = 0;
  double added_share = 0;  // (with^2 - without^2) / with^2
  double bypass_f = 0;     // the stage's C_plus, 0 = none
  // offset_with_v <= (1 - kCompensationOffsetGain) offset_without_v.
  bool worth_doing = false;
  // worth_doing and added_share > 10 % without a bypass.
  bool noise_matters = false;
};

// R_plus is worth fitting when it lowers the worst-case offset by at least
// this fraction (common practice, no source).
inline constexpr double kCompensationOffsetGain = 0.10;

// Above this share of the total output noise power R_plus's noise "matters".
inline constexpr double kCompensationNoiseShare = 0.10;
// Excess contributors below this share are folded into one row of the
// printed tables (the budget and its JSON keep every one).
inline constexpr double kNegligibleExcessShare = 1e-4;

struct Budget {
  std::string stage_name;
  std::string opamp_class;  // "JFET input", or "inline parameters"
  double opamp_gbw_hz = 0;
  double opamp_open_loop_gain = 0;
  double temperature_k = 0;
  double band_low_hz = 0;
  double band_high_hz = 0;
  double reference_hz = 0;
  std::string input_unit = "V";  // "V" or "A"

  // Signal gain from the source to the output, V/V or V/A.
  double signal_gain_ref = 0;  // magnitude at the reference frequency
  double signal_gain_phase_ref_deg = 0;
  double signal_gain_dc = 0;  // signed (negative for an inverting stage)
  double noise_gain_ref = 0;  // |e_n -> output| at the reference frequency
  double noise_gain_dc = 0;
  // The response against its passband (analysis/frequency_response.h,
  // SummarizePassband): the passband gain is |gain(0)|, or for a stage that
  // blocks DC (|gain(0)| more than 3 dB below its largest in-band gain) that
  // largest in-band gain; bandwidth and peaking are measured against it.
  bool blocks_dc = false;
  double passband_gain = 0;
  double bandwidth_3db_hz = 0;  // high corner; 0 when not found below 100 GBW
  double bandwidth_low_hz = 0;  // low corner of a DC-blocking stage, else 0
  double peaking_db = 0;        // largest |gain| over the passband gain, dB
  double peak_hz = 0;           // 0 when there is no peaking
  // The largest |e_n -> output| over frequency (refined), or the DC value
  // with noise_gain_flat when it never rises above DC (peak_hz 0 then).
  double noise_gain_peak = 0;
  double noise_gain_peak_hz = 0;
  bool noise_gain_flat = false;
  LoopBlock loop;
  double feedback_capacitor_f = 0;  // as used (chosen when "auto")
  std::optional<CapacitorChoice> capacitor_choice;
  std::optional<PhotodiodeBlock> photodiode;
  std::optional<ChargeBlock> charge;           // a capacitive sensor
  std::optional<AcCouplingBlock> ac_coupling;  // C3 or an input capacitor

  std::vector<Contributor> contributors;  // largest share first
  double output_rms_v = 0;
  double output_peak_to_peak_v = 0;  // 6.6 x rms (about 99.9 % of the time)
  double output_density_ref_v_per_rthz = 0;
  // sqrt(integral of S_out(f) / |gain(f)|^2 df over the band): the noise an
  // ideal source at the input would need to make the same output.
  double input_rms = 0;
  // output rms / |gain(f_ref)|: the same when the gain is flat over the band.
  double input_rms_at_reference_gain = 0;
  double input_density_ref_per_rthz = 0;    // output density / |gain(f_ref)|
  std::optional<MeasurandBlock> measurand;  // with source.sensitivity

  OffsetBlock offset;
  // The photocurrent's, dark current's and dc_input's DC output, in that
  // order, each present when not zero (budget/dc_output.h).
  std::vector<DcOutputTerm> dc_outputs;

  std::optional<double> full_scale_output_v;
  // The op-amp's output current at the full-scale swing (load and feedback
  // network), against the device's limit.
  std::optional<double> full_scale_output_current_a;
  double output_current_limit_a = 0;
  std::optional<double> snr_db;            // full-scale sine rms / noise rms
  std::optional<double> dynamic_range_db;  // 2 x full scale / noise p-p

  std::optional<TeeComparison> tee;
  std::optional<TeePiBlock> tee_pi;             // a T network's pi equivalent
  std::optional<SensitivityBlock> sensitivity;  // review/sensitivity.h

  std::vector<ResistorDrop> resistor_drops;
  std::optional<ExcessAdvice> excess_advice;
  std::optional<TemperatureBlock> temperature;
  std::optional<CompensationBlock> compensation;
  // The signal chain to the converter (stage file "chain"), composed by
  // review/review.h; none without a chain.
  std::optional<ChainBlock> chain;

  int integration_evaluations = 0;
  double integration_relative_error = 0;  // estimate
  std::vector<std::string> warnings;
  // What the warnings that say the stage cannot work found, as data (for
  // the flags of tee sweep, tee search and spread rows).
  std::vector<StageProblem> problems;
};

// Where input_rms and input_rms_at_reference_gain differ by more than this
// fraction, the report says which one it prints and why.
inline constexpr double kInputRmsDefinitionsDiffer = 0.01;

// Phase margins below these draw a warning, and a severe one (common
// practice, no source); compare's verdict uses the first.
inline constexpr double kLowPhaseMarginDeg = 45.0;
inline constexpr double kSeverePhaseMarginDeg = 20.0;

// The crest factor used for peak-to-peak noise: 6.6 x rms holds about
// 99.9 % of the time for Gaussian noise (common practice; erf(3.3/sqrt 2)
// = 0.99903).
inline constexpr double kPeakToPeakPerRms = 6.6;

}  // namespace hushgain

#endif  // HUSHGAIN_BUDGET_BUDGET_H_
