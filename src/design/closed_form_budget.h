// The low-frequency budget of an inverting stage with T-network (or plain)
// feedback in closed form: an ideal op-amp (infinite gain and bandwidth, no
// input capacitance), densities integrated exactly over the band. Cheap
// enough to rank millions of candidate networks; the full engine
// (budget/compute_budget.h) re-verifies the few that are shown.
//
// With Ra = R_source + R_in, Req = R1 + R2 + R1 R2 / R3 (Kennelly 1899) and
// k = R2 / R3, the DC gains to the output are (REFERENCES.md section 6):
//   signal  Req / Ra                 e_n, R_plus, i_n+   NG = 1 + k + Req/Ra
//   R_in, R_source  Req / Ra         R1   1 + k       R2   1
//   R3      k (as 4kTR3, i.e. R2 sqrt(4kT/R3))          i_n-  Req (V/A)
// A plain feedback resistor Rf is R1 = Rf with R2 = 0 (k = 0, Req = Rf).
// Over the band [fL, fH] a density w (1 + fc/f) integrates to
//   w (fH - fL + fc ln(fH/fL))                        (REFERENCES.md section 4)
// so the output noise power is
//   P = 4kT B [Ra (Req/Ra)^2 + R1 (1+k)^2 + R2 (1+k) + Rp NG^2]
//       + e_w^2 Bv NG^2 + i_w^2 Bi (Req^2 + Rp^2 NG^2)
// with B = fH - fL, Bv and Bi the same with the e_n and i_n corners, Rp the
// + input resistor (none, a value, or "auto" = Ra || (R1 + R2 || R3)); the
// Rp terms are times 1 / (1 + Rp plus_shunt_s)^2 (1 unless set, below).
// The load draws no noise at an ideal output. The worst-case DC offset is
//   |Vos| NG + |Ib (Req - Rp NG)| + |Ios|/2 (Req + Rp NG).
//
// The DC gain with the op-amp's finite open-loop gain A0 and output
// resistance R_o into the load R_L (the macro model of
// analysis/mna_system.h at f = 0: a controlled source A0 (v+ - v-) behind
// R_o, no input current) is the nodal solution of the summing node n, the
// T's centre t and the output o with the source at 1 V (v+ = 0):
//   (ga + g1) v_n - g1 v_t = ga
//   -g1 v_n + (g1 + g2 + g3) v_t - g2 v_o = 0
//   -g2 v_t + (g2 + gL + go) v_o + go A0 v_n = 0      (R_o > 0)
//   v_o = -A0 v_n                                     (R_o = 0)
// with g = 1/R. It tends to -Req/Ra as A0 grows.
#ifndef HUSHGAIN_DESIGN_CLOSED_FORM_BUDGET_H_
#define HUSHGAIN_DESIGN_CLOSED_FORM_BUDGET_H_

#include "circuit/stage.h"

namespace hushgain {

// A stage's constants, computed once and shared by every candidate.
struct ClosedFormModel {
  double source_ohm = 0;  // R_source
  double thermal_w = 0;   // 4kT (fH - fL), V^2/ohm
  // e_w^2 (fH - fL + f_cv ln(fH/fL)) + the table's exact integral, V^2
  double e_n_power = 0;
  // i_w^2 (fH - fL + f_ci ln(fH/fL)) + the table's exact integral, A^2
  double i_n_power = 0;
  double vos_v = 0;       // |Vos|
  double ib_a = 0;        // Ib, signed
  double half_ios_a = 0;  // |Ios| / 2
  PlusResistor::Mode plus_mode = PlusResistor::Mode::kNone;
  double plus_ohm = 0;        // kValue
  double open_loop_gain = 0;  // A0 at DC
  double output_ohm = 0;      // R_o
  double load_siemens = 0;    // 1 / R_L, 0 without a load
  // For lower bounds only (design/tee_search.h): the largest susceptance
  // across R_plus in the band, S. The + input resistor's noise (4kT/Rp and
  // i_n+, currents into the + node) reaches the + pin through Rp in
  // parallel with that susceptance, |Z|^2 >= Rp^2 / (1 + Rp B)^2 (the
  // triangle inequality on the admittance: true whatever the susceptance's
  // phase), so its terms are taken times 1 / (1 + Rp B)^2. 0, as
  // MakeClosedFormModel leaves it: the ideal op-amp, nothing across Rp.
  double plus_shunt_s = 0;
};

ClosedFormModel MakeClosedFormModel(const Stage& stage);

struct ClosedFormFigures {
  double equivalent_ohm = 0;   // Req
  double gain = 0;             // |signal gain| = Req / Ra
  double noise_gain = 0;       // NG
  double output_power_v2 = 0;  // P, V^2 over the band
  double output_rms_v = 0;     // sqrt(P)
  double offset_worst_case_v = 0;
};

// A T network R1, R2, R3 with input resistor R_in.
ClosedFormFigures ClosedFormTee(const ClosedFormModel& model, double r_in,
                                double r1, double r2, double r3);

// |DC gain| of a T network with the finite A0, R_o and load of the model
// (the nodal solution above).
double ClosedFormTeeDcGain(const ClosedFormModel& model, double r_in, double r1,
                           double r2, double r3);

// The plain stage: one feedback resistor Rf.
ClosedFormFigures ClosedFormPlain(const ClosedFormModel& model, double r_in,
                                  double rf);

// The output noise power P of a row of T networks sharing R_in, R1 and R2,
// for n values of R3 given with their reciprocals: out[j] for r3[j]. The
// hot loop of the search and of its benchmark; no branches, vectorizable.
void ClosedFormTeePowerRow(const ClosedFormModel& model, double r_in, double r1,
                           double r2, const double* inv_r3, int n, double* out);

}  // namespace hushgain

#endif  // HUSHGAIN_DESIGN_CLOSED_FORM_BUDGET_H_
