// The offset sum of budget/offset.h against the superposition written out
// by hand (common practice, no source: the DC model of an op-amp with Vos in
// series with the + input and Ib+-, Ios at the pins; any op-amp textbook's
// offset chapter).
#include "budget/offset.h"

#include <doctest/doctest.h>

#include <cmath>

#include "test_support.h"

namespace hushgain {
namespace {

using test::RelErr;

OpAmpModel Part(double vos, double ib, double ios) {
  OpAmpModel m;
  m.vos_v = vos;
  m.ib_a = ib;
  m.ios_a = ios;
  return m;
}

TEST_CASE("offset terms are Vos NG and the pin currents through H+ and H-") {
  // Inverting stage R_in = 10k, R_f = 1M, + pin grounded through 9.9k:
  // NG = 101, H- = +R_f (a current injected at - appears as +R_f at the
  // output), H+ = -NG * 9.9k (it raises V+ by 9.9k per amp).
  const double ng = 101, hm = 1e6, hp = -101 * 9.9e3;
  const OffsetBlock b = SumOffsets(Part(-2e-3, 10e-9, 1e-9), ng, hp, hm);
  CHECK(RelErr(b.vos_v, 2e-3 * 101) < test::kRelIdeal);
  CHECK(RelErr(b.ib_v, -10e-9 * (hp + hm)) < test::kRelIdeal);
  CHECK(RelErr(b.ios_v, 0.5e-9 * std::fabs(hp - hm)) < test::kRelIdeal);
  CHECK(RelErr(b.worst_case_v, b.vos_v + std::fabs(b.ib_v) + b.ios_v) <
        test::kRelIdeal);
  CHECK(RelErr(b.rss_v, std::sqrt(b.vos_v * b.vos_v + b.ib_v * b.ib_v +
                                  b.ios_v * b.ios_v)) < test::kRelIdeal);
}

TEST_CASE("a balanced bias-current transfer below 1e-9 of its terms is zero") {
  // With R_plus at the balance value H+ = -H- up to rounding.
  CHECK(BiasCurrentTransfer(-1e6, 1e6 * (1 + 1e-12)) == 0);
  CHECK(BiasCurrentTransfer(-1e6, 1e6 * (1 + 1e-6)) != 0);
  CHECK(SumOffsets(Part(0, 1e-9, 0), 101, -1e6, 1e6 * (1 + 1e-12)).ib_v == 0);
}

TEST_CASE("the signed offset of a draw keeps every sign") {
  const double ng = 101, hp = -5e5, hm = 1e6;
  const double expected =
      -1e-3 * ng - 2e-9 * (hp + hm) - 0.5 * -1e-9 * (hp - hm);
  CHECK(RelErr(SignedOffset(-1e-3, 2e-9, -1e-9, ng, hp, hm), expected) <
        test::kRelIdeal);
}

TEST_CASE("the dark-current term joins the worst case and the rss") {
  const OffsetBlock b = SumOffsets(Part(1e-3, 0, 0), 2, 0, 0, -3e-3);
  CHECK(RelErr(b.worst_case_v, 2e-3 + 3e-3) < test::kRelIdeal);
  CHECK(RelErr(b.rss_v, std::sqrt(4e-6 + 9e-6)) < test::kRelIdeal);
}

}  // namespace
}  // namespace hushgain
