#include "analysis/bracketed_root.h"

#include <doctest/doctest.h>

#include <cmath>

#include "test_support.h"

namespace hushgain {
namespace {

TEST_CASE("bracketed root finds the cube root of two") {
  // x^3 - 2 = 0 at x = 2^(1/3) (closed form, std::cbrt).
  int calls = 0;
  auto g = [&](double x, double* value) {
    ++calls;
    *value = x * x * x - 2;
    return Status::Ok();
  };
  double root = 0;
  REQUIRE(FindBracketedRoot(g, 1.0, -1.0, 2.0, 6.0, 1e-12, &root).ok);
  CHECK(std::fabs(root - std::cbrt(2.0)) < 1e-12);
  // Superlinear on a smooth function: bisection would take 40 halvings of
  // [1, 2] to reach 1e-12 (common practice, no source).
  CHECK(calls < 15);
}

TEST_CASE("bracketed root finds the fixed point of the cosine") {
  // cos x = x at x = 0.7390851332151607 (the Dottie number, from memory;
  // checked here by its own equation).
  auto g = [](double x, double* value) {
    *value = std::cos(x) - x;
    return Status::Ok();
  };
  double root = 0;
  REQUIRE(FindBracketedRoot(g, 0.0, 1.0, 1.0, std::cos(1.0) - 1.0, 1e-14, &root)
              .ok);
  CHECK(std::fabs(root - 0.7390851332151607) < 1e-13);
  CHECK(std::fabs(std::cos(root) - root) < 1e-13);
}

TEST_CASE("bracketed root falls back to bisection on a step") {
  // A step at 0.3 has no root to interpolate to: the bracket still
  // closes on it.
  auto g = [](double x, double* value) {
    *value = x < 0.3 ? 1.0 : -1.0;
    return Status::Ok();
  };
  double root = 0;
  REQUIRE(FindBracketedRoot(g, 0.0, 1.0, 1.0, -1.0, 1e-9, &root).ok);
  CHECK(std::fabs(root - 0.3) < 1e-9);
}

TEST_CASE("bracketed root passes a failing evaluation on") {
  auto g = [](double, double* value) {
    *value = 0.5;
    return Status::Fail("the network is singular at 1 kHz");
  };
  double root = -1;
  const Status s = FindBracketedRoot(g, 0.0, 1.0, 1.0, -1.0, 1e-9, &root);
  CHECK_FALSE(s.ok);
  CHECK(s.message == "the network is singular at 1 kHz");
  CHECK(root == -1);
}

}  // namespace
}  // namespace hushgain
