// Binning samples for the Monte Carlo histograms (report/histogram.h):
// every finite value counted once, the edges spanning min..max, and the
// bin count of Rice's rule (common practice, no source).
#include "report/histogram.h"

#include <doctest/doctest.h>

#include <cmath>
#include <cstdint>
#include <cstdlib>
#include <limits>
#include <numeric>
#include <vector>

namespace hushgain {
namespace {

long Sum(const Histogram& h) {
  return std::accumulate(h.counts.begin(), h.counts.end(), 0L);
}

TEST_CASE("Rice's rule: ceil(2 cbrt(n)) within the cap") {
  // 2 cbrt(1000) = 20, 2 cbrt(8) = 4, 2 cbrt(1) = 2 exactly.
  CHECK(RiceBinCount(1000, 80) == 20);
  CHECK(RiceBinCount(8, 80) == 4);
  CHECK(RiceBinCount(1, 80) == 2);
  // 2 cbrt(100000) = 92.8..., so 93, capped at 80.
  CHECK(RiceBinCount(100000, 100) == 93);
  CHECK(RiceBinCount(100000, 80) == 80);
  CHECK(RiceBinCount(0, 80) == 1);
}

TEST_CASE("ten integers in five bins: two in each") {
  // Edges 0, 1.8, 3.6, 5.4, 7.2, 9 (width 9 / 5); floor(v / 1.8) puts
  // 0,1 | 2,3 | 4,5 | 6,7 | 8 in bins 0..4 and the largest value, 9, in
  // the last bin too.
  std::vector<double> v;
  for (int k = 9; k >= 0; --k) v.push_back(k);
  const Histogram h = BinValues(v, 5);
  REQUIRE(h.Bins() == 5);
  REQUIRE(h.edges.size() == 6);
  for (int k = 0; k <= 5; ++k) CHECK(h.edges[k] == doctest::Approx(1.8 * k));
  CHECK(h.edges.back() == 9.0);
  for (long c : h.counts) CHECK(c == 2);
  CHECK(h.Width() == doctest::Approx(1.8));
}

TEST_CASE("counts sum to the sample count and the edges cover min..max") {
  // A spread of signed values from a linear congruential sequence
  // (Knuth's MMIX constants), so nothing lines up with the edges.
  std::vector<double> v;
  std::uint64_t x = 7;
  double lo = std::numeric_limits<double>::infinity(), hi = -lo;
  for (int k = 0; k < 5000; ++k) {
    x = x * 6364136223846793005ULL + 1442695040888963407ULL;
    const double u = static_cast<double>(x >> 11) * 0x1.0p-53;
    const double value = -3e-3 + 7e-3 * u * u;
    v.push_back(value);
    lo = std::min(lo, value);
    hi = std::max(hi, value);
  }
  for (int bins : {1, 7, 34, 80}) {
    INFO("bins " << bins);
    const Histogram h = BinValues(v, bins);
    CHECK(h.Bins() == bins);
    CHECK(Sum(h) == 5000);
    CHECK(h.skipped == 0);
    CHECK(h.edges.front() == lo);
    CHECK(h.edges.back() == hi);
    for (int k = 0; k < bins; ++k) CHECK(h.edges[k] < h.edges[k + 1]);
    // Each count is the number of values inside its bin, recounted here
    // (the last bin closed).
    for (int k = 0; k < bins; ++k) {
      long inside = 0;
      for (double value : v)
        if (value >= h.edges[k] &&
            (value < h.edges[k + 1] || (k == bins - 1 && value == hi)))
          ++inside;
      CHECK(std::labs(inside - h.counts[k]) <= 1);  // an edge value may round
    }
  }
}

TEST_CASE("equal values make one bin around them; non-finite values skipped") {
  const std::vector<double> v = {2.5e-3, 2.5e-3, std::nan(""), 2.5e-3,
                                 std::numeric_limits<double>::infinity()};
  const Histogram h = BinValues(v, 10);
  REQUIRE(h.Bins() == 1);
  CHECK(h.counts[0] == 3);
  CHECK(h.skipped == 2);
  CHECK(h.edges[0] < 2.5e-3);
  CHECK(h.edges[1] > 2.5e-3);
  CHECK(BinValues({std::nan("")}, 4).Bins() == 0);
}

}  // namespace
}  // namespace hushgain
