#include "budget/offset.h"

#include <cmath>

namespace hushgain {

double BiasCurrentTransfer(double h_plus_ohm, double h_minus_ohm) {
  const double h_sum = h_plus_ohm + h_minus_ohm;
  if (std::fabs(h_sum) <
      1e-9 * (std::fabs(h_plus_ohm) + std::fabs(h_minus_ohm)))
    return 0;
  return h_sum;
}

double SignedOffset(double vos_v, double ib_a, double ios_a,
                    double noise_gain_dc, double h_plus_ohm,
                    double h_minus_ohm) {
  return vos_v * noise_gain_dc -
         ib_a * BiasCurrentTransfer(h_plus_ohm, h_minus_ohm) -
         0.5 * ios_a * (h_plus_ohm - h_minus_ohm);
}

OffsetBlock SumOffsets(const OpAmpModel& opamp, double noise_gain_dc,
                       double h_plus_ohm, double h_minus_ohm, double dark_v) {
  OffsetBlock block;
  block.noise_gain_dc = noise_gain_dc;
  block.vos_v = std::fabs(opamp.vos_v * noise_gain_dc);
  // A current flowing into a pin leaves the network: an injection of -Ib.
  block.ib_v = -opamp.ib_a * BiasCurrentTransfer(h_plus_ohm, h_minus_ohm);
  block.ios_v = std::fabs(0.5 * opamp.ios_a * (h_plus_ohm - h_minus_ohm));
  block.dark_v = dark_v;
  block.worst_case_v =
      block.vos_v + std::fabs(block.ib_v) + block.ios_v + std::fabs(dark_v);
  block.rss_v = std::sqrt(block.vos_v * block.vos_v + block.ib_v * block.ib_v +
                          block.ios_v * block.ios_v + dark_v * dark_v);
  return block;
}

}  // namespace hushgain
