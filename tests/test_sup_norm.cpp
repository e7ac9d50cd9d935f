// Sup-norm enclosures against exact values.
#include <doctest/doctest.h>

#include <cmath>

#include "arith/sup_norm.hpp"

using namespace porecert::arith;

TEST_CASE("sup-norm of T_5(2η−1) on [0,1] is exactly 1; on [0.45, 0.55] it is |T_5| at the ends") {
  porecert::cheb::Series<Id> c(6, Id(0));
  c[5] = Id(1);
  const SupNorm s = sup_norm(c, 0.0, 1.0, 0, 1e-9);
  CHECK(s.lower <= 1.0);
  CHECK(s.upper >= 1.0);
  CHECK(s.upper - s.lower <= 1e-8);
  // On [0.45, 0.55]: x ∈ [−0.1, 0.1], T_5(x) = 16x⁵ − 20x³ + 5x is monotone there: max at x = ±0.1.
  const double exact = 16e-5 - 20e-3 + 0.5;
  const SupNorm t = sup_norm(c, 0.45, 0.55, 0, 1e-9);
  CHECK(t.lower <= exact + 1e-15);
  CHECK(t.upper >= exact - 1e-15);
  CHECK(t.upper - t.lower <= 1e-8);
}

TEST_CASE("sup-norm of a derivative: d/dη of η³ is 3η², sup on [0,1] = 3") {
  // η³ in the shifted basis: η = (1+x)/2, η³ = (1 + 3x + 3x² + x³)/8 = (10 T0 + 15 T1 + 6 T2 + T3)/32.
  porecert::cheb::Series<Id> c = {ratio<Id>(10, 32), ratio<Id>(15, 32), ratio<Id>(6, 32), ratio<Id>(1, 32)};
  const SupNorm s = sup_norm(c, 0.0, 1.0, 1, 1e-10);
  CHECK(s.lower <= 3.0);
  CHECK(s.upper >= 3.0);
  CHECK(s.upper - s.lower <= 1e-9);
  const SupNorm m = sup_norm(c, 0.0, 1.0, 1, 1e-10);
  CHECK(std::isfinite(m.upper));
}

TEST_CASE("sup-norm in MPFR intervals agrees") {
  PrecisionScope p(200);
  porecert::cheb::Series<Im> c(6, Im(0));
  c[5] = Im(1);
  const SupNorm s = sup_norm(c, 0.0, 1.0, 0, 1e-9);
  CHECK(s.lower <= 1.0);
  CHECK(s.upper >= 1.0);
}
