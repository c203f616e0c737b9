#include "budget/offset.h"

#include <cmath>

namespace hushgain {

OffsetBlock SumOffsets(const OpAmpModel& opamp, double noise_gain_dc,
                       double h_plus_ohm, double h_minus_ohm, double dark_v) {
  OffsetBlock block;
  block.noise_gain_dc = noise_gain_dc;
  block.vos_v = std::fabs(opamp.vos_v * noise_gain_dc);
  // A current flowing into a pin leaves the network: an injection of -Ib.
  // With R_plus at the balance value H+ = -H- up to rounding; a residue
  // below 1e-9 of the terms is that rounding, not an offset.
  double h_sum = h_plus_ohm + h_minus_ohm;
  if (std::fabs(h_sum) <
      1e-9 * (std::fabs(h_plus_ohm) + std::fabs(h_minus_ohm)))
    h_sum = 0;
  block.ib_v = -opamp.ib_a * h_sum;
  block.ios_v = std::fabs(0.5 * opamp.ios_a * (h_plus_ohm - h_minus_ohm));
  block.dark_v = dark_v;
  block.worst_case_v =
      block.vos_v + std::fabs(block.ib_v) + block.ios_v + std::fabs(dark_v);
  block.rss_v = std::sqrt(block.vos_v * block.vos_v + block.ib_v * block.ib_v +
                          block.ios_v * block.ios_v + dark_v * dark_v);
  return block;
}

}  // namespace hushgain
