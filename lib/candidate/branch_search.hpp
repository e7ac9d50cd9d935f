// NON-RIGOROUS branch finding for Berman's problem (docs/branches.md). Finds candidate
// solutions only; each is certified (or not) by lib/proof. The search region is reported so
// that no global claim is made from it.
#pragma once
#include <string>
#include <vector>

#include "candidate/galerkin_newton.hpp"

namespace porecert::candidate {

struct Found {
  Vec x;                // Galerkin candidate at the requested R
  double a = 0, b = 0;  // shooting data f'(0), f'''(0) of the candidate
  std::string origin;   // how it was found
};

struct SearchReport {
  std::vector<Found> found;
  std::string region;  // the searched region, in words
  std::vector<std::string> log;
};

// Shooting residual (f(1) − 1, f'(1)) for data (a, b) by RK4 with `steps` steps (plain double).
std::array<double, 2> shoot(double R, double a, double b, int steps = 2000);

// Type I by continuation from R = 0; for R above 12 a damped-Newton shooting scan from a grid of
// (f'(0), f'''(0)) at R_s = min(R, 25), each hit continued to R in Chebyshev form; duplicates
// removed. n_max bounds the Chebyshev modes.
SearchReport find_branches(double R, int n_max = 3000);

}  // namespace porecert::candidate
