// One number through a printf format, for report cells ("x%.3f", "%.1f dB").
// Engineering notation with SI prefixes is io/units.h's FormatEng.
#ifndef HUSHGAIN_BASE_PRINTF_H_
#define HUSHGAIN_BASE_PRINTF_H_

#include <cstdio>
#include <string>

namespace hushgain {

inline std::string Printf(const char* format, double value) {
  char buf[96];
  std::snprintf(buf, sizeof buf, format, value);
  return buf;
}

}  // namespace hushgain

#endif  // HUSHGAIN_BASE_PRINTF_H_
