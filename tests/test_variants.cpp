// Model variants go through the unchanged proof layer; checked against exact R = 0 solutions.
#include <doctest/doctest.h>

#include <cmath>

#include "candidate/galerkin_newton.hpp"
#include "model/variants.hpp"
#include "proof/newton_kantorovich.hpp"

using namespace porecert;
using arith::Id;

TEST_CASE("slip wall at R = 0: f = a eta + b eta^3, K = -3/(1 + 3 beta) (derived by hand)") {
  const Id beta = arith::from_decimal<Id>("0.1");
  const auto md = model::berman_slip<double>(0.0, 0.1);
  auto c = candidate::newton(md, candidate::poiseuille(md, 16), 30);
  REQUIRE(c.converged);
  std::vector<Id> x(c.x.begin(), c.x.end());
  const auto r = proof::nk_verify(model::berman_slip(Id(0), beta), x);
  REQUIRE(r.certified);
  const Id K = Id(-3) / (Id(1) + Id(3) * beta);
  const Id a = (Id(3) + Id(6) * beta) / (Id(2) + Id(6) * beta);
  CHECK(boost::numeric::overlap(r.K, K));
  CHECK(boost::numeric::overlap(r.fp0, a));
  CHECK(arith::width_up(r.K) < 1e-12);
  // Not Berman's value: the slip row really is in effect.
  CHECK(!boost::numeric::in(-3.0, r.K));
}

TEST_CASE("MHD at R = 0: f'' = B sinh(M eta), K = -M^2 A with A = -B M cosh M, B = 1/(sinh M - M cosh M)") {
  const double M = 2.0;
  const auto md = model::berman_mhd<double>(0.0, M * M);
  auto c = candidate::newton(md, candidate::poiseuille(md, 40), 30);
  REQUIRE(c.converged);
  std::vector<Id> x(c.x.begin(), c.x.end());
  const auto r = proof::nk_verify(model::berman_mhd(Id(0), Id(M * M)), x);
  REQUIRE(r.certified);
  const double B = 1.0 / (std::sinh(M) - M * std::cosh(M)), A = -B * M * std::cosh(M);
  // libm values (not rigorous) compared with a tolerance far above their error.
  CHECK(std::fabs(arith::mid_double(r.K) - (-M * M * A)) < 1e-12);
  CHECK(std::fabs(arith::mid_double(r.fp0) - (A + B * M)) < 1e-12);
}

TEST_CASE("variants at R != 0 certify through the same proof layer") {
  const auto md = model::berman_mhd<double>(5.0, 4.0);
  auto make = [](double R) { return model::berman_mhd<double>(R, 4.0); };
  auto c = candidate::continuation(make, candidate::poiseuille(md, 24), 0.0, 5.0, 400);
  REQUIRE(c.converged);
  std::vector<Id> x(c.x.begin(), c.x.end());
  const auto r = proof::nk_verify(model::berman_mhd(Id(5), Id(4)), x);
  CHECK(r.certified);
  const auto rs = proof::nk_verify(model::berman(Id(5)), x);  // same candidate, plain Berman: wrong problem
  CHECK_FALSE(rs.certified);
}
