// Pieces every radii-polynomial proof here shares (docs/method.md (M3.2)): entries of a
// midpoint-radius matrix from intervals, ‖A F‖ for an interval vector, and the radii-polynomial
// verdict itself, so that the one-function verifier and the fold verifier cannot drift apart.
#pragma once
#include <string>
#include <vector>

#include "arith/interval.hpp"
#include "arith/midrad.hpp"

namespace porecert::proof {

// M(i, j) ← an enclosure of v: midpoint rounded to nearest, radius rounded up to cover v.
void put_entry(arith::MidRad& M, int i, int j, const arith::Id& v);

// Upper bound of ‖A F‖₁ for a point matrix A (exact doubles) and an interval vector F.
double apply_norm_up(const arith::MatD& A, const std::vector<arith::Id>& F);
double apply_norm_up(const arith::MatD& A, const std::vector<arith::Im>& F);

// Short display of a bound in failure messages.
std::string short_number(double v);

struct RadiiVerdict {
  bool certified = false;
  std::string failure;           // the inequality that failed and by how much
  double existence_radius = 0;   // r with p(r) < 0 confirmed in intervals, rounded up
  double uniqueness_radius = 0;  // lower bound of the larger root; +inf when Z2 = 0
};

// p(r) = Z2 r² − (1 − Z) r + Y0 with Z = max(Z0, Z1), all upper bounds (M3.2).
RadiiVerdict radii_polynomial(double Y0, double Z0, double Z1, double Z2);

}  // namespace porecert::proof
