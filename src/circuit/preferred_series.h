// IEC 60063 preferred-number series for resistors and capacitors: E6, E12,
// E24 (two significant figures) and E48, E96, E192 (three), as the lists the
// standard publishes. They are data, not the formula round(10^(i/N)): E24
// departs from the rounded geometric series at 8 values (2.7 3.0 3.3 3.6
// 3.9 4.3 4.7 8.2) and E192 lists 9.20 where the formula gives 9.19.
#ifndef HUSHGAIN_CIRCUIT_PREFERRED_SERIES_H_
#define HUSHGAIN_CIRCUIT_PREFERRED_SERIES_H_

#include <optional>
#include <span>
#include <string>
#include <string_view>
#include <vector>

namespace hushgain {

enum class PreferredSeries { kE6, kE12, kE24, kE48, kE96, kE192 };

// "E6" ... "E192".
std::string_view SeriesName(PreferredSeries series);

// Every series name, in increasing density (for "did you mean").
std::vector<std::string> SeriesNames();

// The series named `name` (exact, case-sensitive "E96"; "e96" is also
// accepted), or nullopt.
std::optional<PreferredSeries> SeriesFromName(std::string_view name);

// The values of one decade in hundredths, ascending: E24 gives 100, 110,
// ..., 910; E96 gives 100, 102, ..., 976. N values for series EN.
std::span<const int> SeriesHundredths(PreferredSeries series);

// Every value of the series in [min_ohm, max_ohm] (both ends included, to a
// relative 1e-9), ascending, as mantissa x 10^k in SI units. Empty when none
// lies in the range; requires 0 < min_ohm <= max_ohm (asserted).
std::vector<double> SeriesValuesInRange(PreferredSeries series, double min_ohm,
                                        double max_ohm);

}  // namespace hushgain

#endif  // HUSHGAIN_CIRCUIT_PREFERRED_SERIES_H_
