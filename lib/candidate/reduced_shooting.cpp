#include "candidate/reduced_shooting.hpp"

#include <cmath>
#include <vector>

#include "model/berman_reduced.hpp"

namespace porecert::candidate {

namespace {

using LD = long double;
constexpr int kOrder = 32;

LD poly(const std::vector<LD>& Z, int j, LD tau) {  // D^j z(t0 + τ) from the series
  LD r = 0;
  for (int k = kOrder; k >= 0; --k) r = r * tau + model::derivative_coefficient(Z, j, k);
  return r;
}

}  // namespace

ReducedShot reduced_shoot(const ReducedBranch& b, LD s, LD t_max) {
  ReducedShot out;
  model::ReducedState<LD> y{};
  std::vector<LD> Z, V;
  LD t = 0;
  int zeros = 0;
  auto gp = [&](LD tau) { return model::reduced_g<LD>(1, t + tau, s, b.eps, poly(Z, 1, tau)); };
  for (int step = 0; step < 200000 && t < t_max; ++step) {
    model::reduced_taylor<LD>(y, t, s, b.eps, true, kOrder + 4, Z, V);
    // Step from the size of the last coefficients relative to the leading ones (a heuristic: the
    // proof re-checks every step with its own remainder bound).
    LD M = 0;
    for (int k = 0; k <= 8; ++k) M = std::fmax(M, std::fabs(Z[k]));
    LD h = 0.5L;
    for (int k = kOrder - 1; k <= kOrder; ++k)
      if (Z[k] != 0) h = std::fmin(h, std::pow(1e-20L * M / std::fabs(Z[k]), 1.0L / k));
    if (!(h > 1e-12L)) return out;
    const LD g0 = gp(0), g1 = gp(h);
    if ((g0 > 0) != (g1 > 0) && ++zeros == b.nth) {
      LD tau = h * g0 / (g0 - g1);  // Newton on g'(t + τ) = 0 inside the step
      for (int it = 0; it < 60; ++it) {
        const LD d = model::reduced_g<LD>(2, t + tau, s, b.eps, poly(Z, 2, tau));
        const LD dt = gp(tau) / d;
        tau -= dt;
        if (std::fabs(dt) <= 1e-19L * (t + tau)) break;
      }
      const LD sg = t + tau;
      out.sigma = sg;
      out.g = model::reduced_g<LD>(0, sg, s, b.eps, poly(Z, 0, tau));
      out.gp2 = model::reduced_g<LD>(2, sg, s, b.eps, poly(Z, 2, tau));
      out.R = sg * out.g;
      auto vpoly = [&](int j) { return poly(V, j, tau); };
      const LD dgp = model::reduced_g_ds<LD>(1, sg, poly(Z, 1, tau), vpoly(1));
      const LD dg = model::reduced_g_ds<LD>(0, sg, poly(Z, 0, tau), vpoly(0));
      out.dR_ds = -dgp * out.g / out.gp2 + sg * dg;  // (S8)
      out.steps = step + 1;
      out.ok = std::isfinite(static_cast<double>(out.R));
      return out;
    }
    model::ReducedState<LD> yn{};
    for (int j = 0; j < 4; ++j) {
      yn[j] = poly(Z, j, h);
      yn[4 + j] = poly(V, j, h);
    }
    y = yn;
    t += h;
  }
  return out;
}

std::optional<LD> reduced_solve(const ReducedBranch& b, LD R_target, LD s0, int max_iter) {
  if (s0 == 0) return std::nullopt;
  const LD sign = s0 > 0 ? 1 : -1;
  LD mu = std::log(std::fabs(s0));
  for (int it = 0; it < max_iter; ++it) {
    const LD s = sign * std::exp(mu);
    const ReducedShot r = reduced_shoot(b, s);
    if (!r.ok) return std::nullopt;
    const LD F = r.R - R_target, dmu = s * r.dR_ds;
    if (!(dmu != 0) || !std::isfinite(static_cast<double>(dmu))) return std::nullopt;
    LD step = F / dmu;
    if (step > 2) step = 2;
    if (step < -2) step = -2;
    mu -= step;
    if (std::fabs(F) <= 1e-17L * std::fabs(R_target) + 1e-17L) return sign * std::exp(mu);
    // Stagnation at the shooting's noise floor: for type III at large R the rounding of the shot
    // (|F| ≈ 1e-13 at R = 1000) is above the tolerance; a Newton step this small has converged.
    if (std::fabs(step) <= 1e-13L) return sign * std::exp(mu);
  }
  return std::nullopt;
}

}  // namespace porecert::candidate
