// Non-rigorous shooting on the symmetry-reduced form of Berman's equation (lib/model/berman_reduced.hpp,
// docs/method.md §S). Its output is a point (ε, n, s) that the proof (lib/proof/reduced_ivp) checks;
// nothing here is a bound. Arithmetic: long double, whose exponent range holds the e^{±R/2} sizes
// of w and s up to R of a few thousand.
#pragma once
#include <optional>

namespace porecert::candidate {

// A branch of the reduced problem: sign of g'(0) (= sign of R f'(0)) and which zero of g' is the wall.
struct ReducedBranch {
  int eps = 1;  // +1 or −1
  int nth = 1;  // 1: the first zero of g' on (0, ∞)
};

struct ReducedShot {
  bool ok = false;
  long double sigma = 0, R = 0, dR_ds = 0;  // σ, R(s) = σ g(σ), dR/ds
  long double g, gp2;                       // g(σ), g''(σ)
  int steps = 0;
};

// Integrates (S4)–(S5) from t = 0 until the nth zero of g' = ε + s w' (or t_max) and returns σ,
// R(s) and dR/ds (S7). ok = false when no such zero is found before t_max.
ReducedShot reduced_shoot(const ReducedBranch& b, long double s, long double t_max = 400);

// Newton on μ = log|s| (sign of s kept) for R(s) = R_target, from s0. nullopt when it does not converge.
std::optional<long double> reduced_solve(const ReducedBranch& b, long double R_target, long double s0,
                                         int max_iter = 60);

// Shape parameter s = f'''(0) / (R f'(0)²) and branch sign of a solution given by its centre data (S3).
inline long double reduced_s_of(long double R, long double fp0, long double fppp0) {
  return fppp0 / (R * fp0 * fp0);
}

}  // namespace porecert::candidate
