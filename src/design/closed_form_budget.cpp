#include "design/closed_form_budget.h"

#include <cmath>

#include "base/physical_constants.h"

namespace hushgain {
namespace {

// The + input resistor for a network whose feedback DC resistance seen from
// the summing node is `feedback_dc_ohm` (R1 + R2 || R3, or Rf).
double PlusOhm(const ClosedFormModel& m, double ra, double feedback_dc_ohm) {
  switch (m.plus_mode) {
    case PlusResistor::Mode::kNone:
      return 0;
    case PlusResistor::Mode::kValue:
      return m.plus_ohm;
    case PlusResistor::Mode::kAuto:
      return ra * feedback_dc_ohm / (ra + feedback_dc_ohm);
  }
  return 0;
}

// The closed form itself, for any (R1, R2, k = R2/R3): see the header.
ClosedFormFigures Evaluate(const ClosedFormModel& m, double r_in, double r1,
                           double r2, double k, double feedback_dc_ohm) {
  ClosedFormFigures f;
  const double ra = m.source_ohm + r_in;
  const double req = r1 + r2 + r1 * k;
  const double g = req / ra;
  const double ng = 1 + k + g;
  const double rp = PlusOhm(m, ra, feedback_dc_ohm);
  const double shunt = 1 + rp * m.plus_shunt_s;
  // Exactly 1 without a shunt: the figures are the same to the last bit.
  const double plus_factor = 1 / (shunt * shunt);
  f.equivalent_ohm = req;
  f.gain = g;
  f.noise_gain = ng;
  f.output_power_v2 =
      m.thermal_w * (ra * g * g + r1 * (1 + k) * (1 + k) + r2 * (1 + k) +
                     plus_factor * rp * ng * ng) +
      m.e_n_power * ng * ng +
      m.i_n_power * (req * req + plus_factor * rp * rp * ng * ng);
  f.output_rms_v = std::sqrt(f.output_power_v2);
  f.offset_worst_case_v = m.vos_v * ng + std::fabs(m.ib_a * (req - rp * ng)) +
                          m.half_ios_a * (req + rp * ng);
  return f;
}

}  // namespace

ClosedFormModel MakeClosedFormModel(const Stage& stage) {
  ClosedFormModel m;
  const double fl = stage.band_low_hz;
  const double fh = stage.band_high_hz;
  const double width = fh - fl;
  const double log_ratio = std::log(fh / fl);
  const OpAmpModel& op = stage.opamp;
  m.source_ohm = stage.source.resistance_ohm;
  m.thermal_w = 4.0 * kBoltzmannJPerK * stage.temperature_k * width;
  m.e_n_power =
      op.e_w_v_per_rthz * op.e_w_v_per_rthz * (width + op.f_cv_hz * log_ratio) +
      op.voltage_noise_table.PsdIntegral(fl, fh);
  m.i_n_power =
      op.i_w_a_per_rthz * op.i_w_a_per_rthz * (width + op.f_ci_hz * log_ratio) +
      op.current_noise_table.PsdIntegral(fl, fh);
  m.vos_v = std::fabs(op.vos_v);
  m.ib_a = op.ib_a;
  m.half_ios_a = 0.5 * std::fabs(op.ios_a);
  m.plus_mode = stage.plus_resistor.mode;
  m.plus_ohm = stage.plus_resistor.ohms;
  m.open_loop_gain = op.open_loop_gain;
  m.output_ohm = op.output_resistance_ohm;
  m.load_siemens = stage.load_ohm ? 1 / *stage.load_ohm : 0;
  return m;
}

double ClosedFormTeeDcGain(const ClosedFormModel& m, double r_in, double r1,
                           double r2, double r3) {
  // Eliminate v_t with the first equation and v_o with the second:
  // v_t = a v_n - b, v_o = c v_n - d; the third gives v_n.
  const double ga = 1 / (m.source_ohm + r_in);
  const double g1 = 1 / r1, g2 = 1 / r2, g3 = 1 / r3;
  const double sum = g1 + g2 + g3;
  const double a = (ga + g1) / g1;
  const double b = ga / g1;
  const double c = (sum * a - g1) / g2;
  const double d = sum * b / g2;
  const double a0 = m.open_loop_gain;
  double v_n = 0;
  if (m.output_ohm > 0) {
    const double go = 1 / m.output_ohm;
    const double so = g2 + m.load_siemens + go;
    v_n = (so * d - g2 * b) / (so * c - g2 * a + go * a0);
  } else {
    v_n = d / (c + a0);
  }
  return std::fabs(c * v_n - d);
}

ClosedFormFigures ClosedFormTee(const ClosedFormModel& model, double r_in,
                                double r1, double r2, double r3) {
  return Evaluate(model, r_in, r1, r2, r2 / r3, r1 + r2 * r3 / (r2 + r3));
}

ClosedFormFigures ClosedFormPlain(const ClosedFormModel& model, double r_in,
                                  double rf) {
  return Evaluate(model, r_in, rf, 0, 0, rf);
}

void ClosedFormTeePowerRow(const ClosedFormModel& m, double r_in, double r1,
                           double r2, const double* inv_r3, int n,
                           double* out) {
  const double ra = m.source_ohm + r_in;
  const double inv_ra = 1 / ra;
  const double tw = m.thermal_w;
  const double en = m.e_n_power;
  const double in = m.i_n_power;
  if (m.plus_mode == PlusResistor::Mode::kAuto) {
    for (int j = 0; j < n; ++j) {
      const double k = r2 * inv_r3[j];
      const double req = r1 + r2 + r1 * k;
      const double g = req * inv_ra;
      const double ng = 1 + k + g;
      // R1 + R2 || R3 = R1 + R2 / (1 + k); Rp = Ra || that.
      const double fb = r1 + r2 / (1 + k);
      const double rp = ra * fb / (ra + fb);
      const double shunt = 1 + rp * m.plus_shunt_s;
      const double plus_factor = 1 / (shunt * shunt);
      out[j] = tw * (ra * g * g + r1 * (1 + k) * (1 + k) + r2 * (1 + k) +
                     plus_factor * rp * ng * ng) +
               en * ng * ng +
               in * (req * req + plus_factor * rp * rp * ng * ng);
    }
    return;
  }
  const double rp = m.plus_mode == PlusResistor::Mode::kValue ? m.plus_ohm : 0;
  const double shunt = 1 + rp * m.plus_shunt_s;
  const double plus_power = (tw * rp + in * rp * rp) * (1 / (shunt * shunt));
  for (int j = 0; j < n; ++j) {
    const double k = r2 * inv_r3[j];
    const double req = r1 + r2 + r1 * k;
    const double g = req * inv_ra;
    const double ng = 1 + k + g;
    out[j] = tw * (ra * g * g + r1 * (1 + k) * (1 + k) + r2 * (1 + k)) +
             (en + plus_power) * ng * ng + in * req * req;
  }
}

}  // namespace hushgain
