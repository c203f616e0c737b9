#include "circuit/noise_table.h"

#include <algorithm>
#include <cmath>
#include <sstream>

namespace hushgain {
namespace {

// One power-law piece: d(f) = density (f / anchor_hz)^slope.
struct Piece {
  double anchor_hz = 0;
  double density = 0;
  double slope = 0;
};

double SegmentSlope(const NoiseTable& t, std::size_t i) {
  return std::log(t.density[i + 1] / t.density[i]) /
         std::log(t.f_hz[i + 1] / t.f_hz[i]);
}

// Piece j of n + 1: j = 0 below f_1, j = i + 1 on [f_i, f_{i+1}] (0-based
// points), j = n above f_n.
Piece PieceAt(const NoiseTable& t, std::size_t j) {
  const std::size_t n = t.f_hz.size();
  const bool flat = t.ends == TableEnds::kFlat;
  if (j == 0) return {t.f_hz[0], t.density[0], flat ? 0 : SegmentSlope(t, 0)};
  if (j == n)
    return {t.f_hz[n - 1], t.density[n - 1], flat ? 0 : SegmentSlope(t, n - 2)};
  return {t.f_hz[j - 1], t.density[j - 1], SegmentSlope(t, j - 1)};
}

// The piece whose range holds f: the number of points at or below f.
std::size_t PieceIndex(const NoiseTable& t, double f_hz) {
  return static_cast<std::size_t>(
      std::upper_bound(t.f_hz.begin(), t.f_hz.end(), f_hz) - t.f_hz.begin());
}

// integral of d^2 (f / f0)^p df from a to b (see the header): written with
// expm1 so that p near -1 loses no digits.
double PieceIntegral(const Piece& piece, double a, double b) {
  if (!(b > a)) return 0;
  const double p = 2.0 * piece.slope;
  const double g = p + 1.0;
  const double l = std::log(b / a);
  const double x = g * l;
  const double growth =
      std::fabs(x) < 1e-12 ? 1.0 + 0.5 * x : std::expm1(x) / x;
  return piece.density * piece.density * a * std::pow(a / piece.anchor_hz, p) *
         l * growth;
}

}  // namespace

std::string NoiseTable::Validate() const {
  std::ostringstream out;
  if (f_hz.size() != density.size()) {
    out << "the table has " << f_hz.size() << " frequencies and "
        << density.size() << " densities";
  } else if (f_hz.size() == 1) {
    out << "a table needs at least two points, got one";
  } else {
    for (std::size_t i = 0; i < f_hz.size(); ++i) {
      if (!(f_hz[i] > 0 && std::isfinite(f_hz[i]))) {
        out << "point " << i << ": the frequency must be positive";
        break;
      }
      if (i > 0 && !(f_hz[i] > f_hz[i - 1])) {
        out << "point " << i
            << ": frequencies must increase strictly from point to point";
        break;
      }
      if (!(density[i] > 0 && std::isfinite(density[i]))) {
        out << "point " << i << ": the density must be positive";
        break;
      }
    }
  }
  return out.str();
}

double NoiseTable::DensityAt(double f) const {
  if (empty()) return 0;
  const Piece piece = PieceAt(*this, PieceIndex(*this, f));
  return piece.density * std::pow(f / piece.anchor_hz, piece.slope);
}

double NoiseTable::PsdAt(double f) const {
  const double d = DensityAt(f);
  return d * d;
}

double NoiseTable::PsdIntegral(double f_low_hz, double f_high_hz) const {
  if (empty() || !(f_high_hz > f_low_hz)) return 0;
  const std::size_t n = f_hz.size();
  double sum = 0;
  for (std::size_t j = PieceIndex(*this, f_low_hz); j <= n; ++j) {
    const double lo = j == 0 ? f_low_hz : std::max(f_low_hz, f_hz[j - 1]);
    const double hi = j == n ? f_high_hz : std::min(f_high_hz, f_hz[j]);
    sum += PieceIntegral(PieceAt(*this, j), lo, hi);
    if (hi >= f_high_hz) break;
  }
  return sum;
}

std::vector<double> NoiseTable::Breakpoints(double f_low_hz,
                                            double f_high_hz) const {
  std::vector<double> out;
  for (double f : f_hz)
    if (f > f_low_hz && f < f_high_hz) out.push_back(f);
  return out;
}

void NoiseTable::Scale(double factor) {
  for (double& d : density) d *= factor;
}

}  // namespace hushgain
