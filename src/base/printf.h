// Numbers through a printf format, for report cells and messages ("x%.3f",
// "%.1f dB", "%.4g V at %.4g Hz"). The one printf-style helper: it carries
// the compiler's format attribute, so every call's arguments are checked
// against its format at compile time (the build uses -Wformat=2; a mismatch
// such as Printf("x%d", 1.06) is a compile error under HUSHGAIN_WERROR, and
// the CTest printf_format_checked proves it). The result is never
// truncated. Engineering notation with SI prefixes is io/units.h's
// FormatEng.
#ifndef HUSHGAIN_BASE_PRINTF_H_
#define HUSHGAIN_BASE_PRINTF_H_

#include <cstdarg>
#include <cstdio>
#include <string>

namespace hushgain {

__attribute__((format(printf, 1, 2))) inline std::string Printf(
    const char* format, ...) {
  va_list args;
  va_start(args, format);
  va_list measure;
  va_copy(measure, args);
  const int length = std::vsnprintf(nullptr, 0, format, measure);
  va_end(measure);
  std::string out;
  if (length > 0) {
    out.resize(static_cast<std::size_t>(length));
    // Writes length characters and the terminating null at out[length],
    // which std::string keeps.
    std::vsnprintf(out.data(), out.size() + 1, format, args);
  }
  va_end(args);
  return out;
}

}  // namespace hushgain

#endif  // HUSHGAIN_BASE_PRINTF_H_
