#include "circuit/opamp_model.h"

#include <cmath>

namespace hushgain {

double VoltageNoiseDensity(const OpAmpModel& model, double f_hz) {
  const double e_w = model.e_w_v_per_rthz;
  return std::sqrt(e_w * e_w * (1 + model.f_cv_hz / f_hz) +
                   model.voltage_noise_table.PsdAt(f_hz));
}

double CurrentNoiseDensity(const OpAmpModel& model, double f_hz) {
  const double i_w = model.i_w_a_per_rthz;
  return std::sqrt(i_w * i_w * (1 + model.f_ci_hz / f_hz) +
                   model.current_noise_table.PsdAt(f_hz));
}

}  // namespace hushgain
