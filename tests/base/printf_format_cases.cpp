// Calls of Printf (base/printf.h) compiled one case at a time by
// tests/base/printf_format_check.cmake (CTest printf_format_checked), with
// the flags every hushgain target gets. Case 0 holds correct calls and must
// compile; every other case holds one mistake the compiler must refuse.
// This file is not part of any target.
#include <string>

#include "base/printf.h"

namespace hushgain {

std::string FormatCase(const char* text) {
  (void)text;
#if FORMAT_CASE == 0
  // Correct: doubles for %f %g %e, an int for %d and the precision of %.*f,
  // a string for %s, a literal %%.
  return Printf("x%.3f", 1.06) + Printf("%.4g V at %.4g Hz", 1.0, 2.0) +
         Printf("%d rows", 3) + Printf("x%.*f", 2, 1.06) + Printf("%s", text) +
         Printf("%.1f %%", 50.0) + Printf("no numbers");
#elif FORMAT_CASE == 1
  // An int conversion given a double: the crash of issue 12, defect 10.
  return Printf("x%d", 1.06);
#elif FORMAT_CASE == 2
  // A string conversion given a double: read as a pointer at run time.
  return Printf("%s", 1.0);
#elif FORMAT_CASE == 3
  // Two conversions, one argument: the second is read from nowhere.
  return Printf("%.4g V at %.4g Hz", 1.0);
#elif FORMAT_CASE == 4
  // A double conversion given a string.
  return Printf("%g", text);
#elif FORMAT_CASE == 5
  // A format that is not a literal cannot be checked (-Wformat-nonliteral,
  // part of -Wformat=2).
  return Printf(text, 1.0);
#else
#error "unknown FORMAT_CASE"
#endif
}

}  // namespace hushgain
