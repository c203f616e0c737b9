#include <doctest/doctest.h>

#include <cmath>

#include "base/physical_constants.h"
#include "noise/noise_source.h"
#include "test_support.h"

namespace hushgain {
namespace {

using test::RelErr;

// A lone resistor as a netlist, for its thermal noise source.
double ThermalCurrentDensity(double ohms, double temperature_k) {
  Netlist net;
  NodeId a = net.AddNode("a");
  net.resistors.push_back({"R", a, kGround, ohms, true});
  std::vector<NoiseSource> sources = CollectNoiseSources(net, temperature_k);
  REQUIRE(sources.size() == 1);
  return std::sqrt(sources[0].PsdAt(1.0));
}

TEST_CASE("the SI constants are the exact 2019 values") {
  // 26th CGPM (2018), SI Brochure 9th ed.: k and e are exact.
  CHECK(kBoltzmannJPerK == 1.380649e-23);
  CHECK(kElementaryChargeC == 1.602176634e-19);
  CHECK(kZeroCelsiusK == 273.15);
}

TEST_CASE("resistor thermal noise matches the sqrt(4kT/R) table") {
  // REFERENCES.md section 1 (Johnson 1928, Nyquist 1928), fA/rtHz, derived
  // there with mpmath and checked with scipy.constants.
  struct Row {
    double ohms, t_k, fa_per_rthz;
  };
  const Row rows[] = {
      {1e3, 290.0, 4001.940579},  {1e3, 300.0, 4070.354776},
      {1e3, 298.15, 4057.785107}, {10e3, 290.0, 1265.524729},
      {10e3, 300.0, 1287.159198}, {10e3, 298.15, 1283.184319},
      {1e6, 290.0, 126.5524729},  {1e6, 300.0, 128.7159198},
      {1e6, 298.15, 128.3184319},
  };
  for (const Row& r : rows) {
    CAPTURE(r.ohms);
    CAPTURE(r.t_k);
    CHECK(RelErr(ThermalCurrentDensity(r.ohms, r.t_k) * 1e15, r.fa_per_rthz) <
          test::kRelTable);
    // The voltage form sqrt(4kTR) in nV/rtHz is the current form times R.
    CHECK(RelErr(ThermalCurrentDensity(r.ohms, r.t_k) * r.ohms * 1e9,
                 r.fa_per_rthz * r.ohms * 1e-6) < test::kRelTable);
  }
}

TEST_CASE("4kT at the standard noise temperature 290 K is 1.60155e-20 J") {
  // REFERENCES.md section 1: 4kT = 1.601 552 84e-20 J at 290 K.
  CHECK(RelErr(test::FourKT(290.0), 1.60155284e-20) < test::kRelTable);
  CHECK(RelErr(test::FourKT(298.15), 1.64656200e-20) < test::kRelTable);
}

TEST_CASE(
    "op-amp noise sources carry e_w^2 (1 + f_c/f) and skip a grounded pin") {
  Netlist net;
  NodeId minus = net.AddNode("minus");
  NodeId out = net.AddNode("out");
  net.resistors.push_back({"R_f", minus, out, 1e3, true});
  OpAmpModel m = test::IdealOpAmp(10e-9, 1e-12);
  m.f_cv_hz = 100;
  m.f_ci_hz = 10;
  net.opamps.push_back({"op-amp", kGround, minus, out, m});
  std::vector<NoiseSource> sources = CollectNoiseSources(net, 300);
  REQUIRE(sources.size() == 3);  // R_f, e_n, i_n- (i_n+ is at ground)
  CHECK(sources[1].name == "e_n");
  CHECK(RelErr(sources[1].PsdAt(100.0), 2 * 100e-18) < test::kRelTight);
  CHECK(sources[2].name == "i_n-");
  CHECK(RelErr(sources[2].PsdAt(1.0), 11e-24) < test::kRelTight);
}

}  // namespace
}  // namespace hushgain
