// A resistor technology class (thin film, thick film, ...): class-typical
// figures used for excess noise and drift. Illustrative, not any maker's.
#ifndef HUSHGAIN_CIRCUIT_RESISTOR_TECHNOLOGY_H_
#define HUSHGAIN_CIRCUIT_RESISTOR_TECHNOLOGY_H_

#include <string>

namespace hushgain {

struct ResistorTechnology {
  std::string class_name;
  // Current-noise index, dB of µV (rms, one decade) per V of DC drop
  // (IEC 60195).
  double noise_index_db = 0;
  double tempco_per_k = 0;  // temperature coefficient, 1/K
  double tolerance = 0;     // relative, e.g. 0.001 for 0.1 %
};

}  // namespace hushgain

#endif  // HUSHGAIN_CIRCUIT_RESISTOR_TECHNOLOGY_H_
