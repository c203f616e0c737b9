// A noise density given as a table of points, as a datasheet curve is read:
// (f_1, d_1) ... (f_n, d_n), frequencies strictly increasing, densities in
// V/rtHz or A/rtHz. Between points the curve is a straight line in log-log:
//   d(f) = d_i (f / f_i)^s_i,   s_i = ln(d_{i+1} / d_i) / ln(f_{i+1} / f_i)
// for f_i <= f <= f_{i+1}. Beyond the ends it continues with the end
// segment's slope (TableEnds::kSlope) or stays at the end value
// (TableEnds::kFlat). The power density is d(f)^2, a power law on every
// segment, so its integral has the closed form
//   integral of d_i^2 (f / f_i)^p df from a to b, p = 2 s_i,
//     = d_i^2 a (a / f_i)^p (e^{(p + 1) L} - 1) / (p + 1),  L = ln(b / a),
//   which is d_i^2 a (a / f_i)^p L when p = -1 (a 1/f segment).
// The table's points are the curve's kinks: an integrator should split its
// partition there (Breakpoints).
#ifndef HUSHGAIN_CIRCUIT_NOISE_TABLE_H_
#define HUSHGAIN_CIRCUIT_NOISE_TABLE_H_

#include <string>
#include <vector>

namespace hushgain {

enum class TableEnds {
  kSlope,  // the end segment's log-log slope continues
  kFlat,   // the end density continues
};

struct NoiseTable {
  // Empty: no table. Otherwise at least two points, f strictly increasing
  // and positive, densities positive (the parser checks; Validate() tells).
  std::vector<double> f_hz;
  std::vector<double> density;  // V/rtHz or A/rtHz
  TableEnds ends = TableEnds::kSlope;

  bool empty() const { return f_hz.empty(); }

  // Empty when the table is usable (or empty); otherwise the first broken
  // rule, naming the point.
  [[nodiscard]] std::string Validate() const;

  // d(f) and d(f)^2; 0 for an empty table. f_hz > 0.
  double DensityAt(double f_hz) const;
  double PsdAt(double f_hz) const;

  // The exact integral of d(f)^2 over [f_low_hz, f_high_hz], 0 < f_low <=
  // f_high: the sum of the closed forms above over the pieces. 0 for an
  // empty table.
  double PsdIntegral(double f_low_hz, double f_high_hz) const;

  // The table's frequencies strictly inside (f_low_hz, f_high_hz).
  std::vector<double> Breakpoints(double f_low_hz, double f_high_hz) const;

  // Every density times `factor` (> 0).
  void Scale(double factor);
};

}  // namespace hushgain

#endif  // HUSHGAIN_CIRCUIT_NOISE_TABLE_H_
