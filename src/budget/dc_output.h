// The DC levels at the op-amp's output that are not offsets of the op-amp:
// the photodiode's average photocurrent and dark current, and the stage's
// dc_input, each times its DC transfer to the output (finite A0):
//   volts = I_ph Z_t(0), I_dark Z_t(0), dc_input x signal gain(0)
// Signed (an inverting stage's output goes negative for a positive input).
// The headroom check adds them to the worst-case offset and compares the
// sum with the full-scale swing and the supply.
#ifndef HUSHGAIN_BUDGET_DC_OUTPUT_H_
#define HUSHGAIN_BUDGET_DC_OUTPUT_H_

#include <string>

namespace hushgain {

struct DcOutputTerm {
  std::string name;  // "I_ph", "I_dark", "dc_input"
  double volts = 0;  // at the op-amp output, signed
};

}  // namespace hushgain

#endif  // HUSHGAIN_BUDGET_DC_OUTPUT_H_
