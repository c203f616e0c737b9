// Physical constants, SI. Both are exact by definition in the 2019 SI
// (26th CGPM, 2018; SI Brochure, 9th ed., BIPM 2019; CODATA 2018 lists them
// as exact).
#ifndef HUSHGAIN_BASE_PHYSICAL_CONSTANTS_H_
#define HUSHGAIN_BASE_PHYSICAL_CONSTANTS_H_

namespace hushgain {

inline constexpr double kBoltzmannJPerK = 1.380649e-23;
inline constexpr double kElementaryChargeC = 1.602176634e-19;
// T/K = t/°C + 273.15 (SI Brochure).
inline constexpr double kZeroCelsiusK = 273.15;
inline constexpr double kPi = 3.14159265358979323846;

}  // namespace hushgain

#endif  // HUSHGAIN_BASE_PHYSICAL_CONSTANTS_H_
