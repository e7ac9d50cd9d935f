#include "candidate/branch_search.hpp"

#include <cmath>
#include <cstdio>

#include "model/berman.hpp"
#include "model/operator.hpp"

namespace porecert::candidate {

namespace {
using St = std::array<double, 4>;
St rhs(double R, const St& y) { return {y[1], y[2], y[3], R * (y[0] * y[3] - y[1] * y[2])}; }

// Damped Newton on the 2-D shooting map; false if it does not converge.
bool shoot_newton(double R, double& a, double& b) {
  for (int it = 0; it < 60; ++it) {
    const auto r = shoot(R, a, b, 800);
    if (!std::isfinite(r[0]) || !std::isfinite(r[1])) return false;
    if (std::fabs(r[0]) + std::fabs(r[1]) < 1e-10) return true;
    const double ha = 1e-7 * std::max(1.0, std::fabs(a)), hb = 1e-7 * std::max(1.0, std::fabs(b));
    const auto ra = shoot(R, a + ha, b, 800), rb = shoot(R, a, b + hb, 800);
    const double j11 = (ra[0] - r[0]) / ha, j21 = (ra[1] - r[1]) / ha, j12 = (rb[0] - r[0]) / hb,
                 j22 = (rb[1] - r[1]) / hb;
    const double det = j11 * j22 - j12 * j21;
    if (!std::isfinite(det) || det == 0) return false;
    double da = (j22 * r[0] - j12 * r[1]) / det, db = (-j21 * r[0] + j11 * r[1]) / det;
    double lam = 1;
    const double n0 = std::fabs(r[0]) + std::fabs(r[1]);
    for (int k = 0; k < 20; ++k, lam /= 2) {  // backtracking
      const auto rt = shoot(R, a - lam * da, b - lam * db, 800);
      if (std::isfinite(rt[0]) && std::fabs(rt[0]) + std::fabs(rt[1]) < n0) break;
    }
    a -= lam * da;
    b -= lam * db;
    if (std::fabs(a) > 50 || std::fabs(b) > 5000) return false;
  }
  return false;
}

double fppp0_of(const Model<double>& m, const Vec& x) { return cheb::value_at_0(model::u_of(m, x)); }
}  // namespace

std::array<double, 2> shoot(double R, double a, double b, int steps) {
  St y{0, a, 0, b};
  const double h = 1.0 / steps;
  for (int s = 0; s < steps; ++s) {
    const St k1 = rhs(R, y);
    St t;
    for (int i = 0; i < 4; ++i) t[i] = y[i] + 0.5 * h * k1[i];
    const St k2 = rhs(R, t);
    for (int i = 0; i < 4; ++i) t[i] = y[i] + 0.5 * h * k2[i];
    const St k3 = rhs(R, t);
    for (int i = 0; i < 4; ++i) t[i] = y[i] + h * k3[i];
    const St k4 = rhs(R, t);
    for (int i = 0; i < 4; ++i) y[i] += h / 6 * (k1[i] + 2 * k2[i] + 2 * k3[i] + k4[i]);
  }
  return {y[0] - 1, y[1]};
}

SearchReport find_branches(double R, int n_max) {
  SearchReport rep;
  auto make = [](double r) { return model::berman<double>(r); };
  const Model<double> m = make(R);
  auto add = [&](Vec x, const std::string& origin) {
    const double a = x[m.free_index(1)], b = fppp0_of(m, x);
    for (const Found& f : rep.found)
      if (std::fabs(f.a - a) < 1e-6 * (1 + std::fabs(a)) && std::fabs(f.b - b) < 1e-6 * (1 + std::fabs(b))) return;
    rep.found.push_back({std::move(x), a, b, origin});
  };
  // Type I: continuation from the R = 0 profile.
  const auto c = continuation(make, poiseuille(make(0.0), 24), 0.0, R, n_max);
  if (c.converged) add(c.x, "continuation from R = 0");
  rep.log.push_back(std::string("continuation from R = 0: ") + (c.converged ? "converged" : c.note));
  // Shooting scan (safety net, and the source of types II/III beyond the fold).
  const double Rs = std::min(R, 25.0);
  const std::vector<double> as = {-8, -6, -5, -4, -3, -2, -1, -0.5, 0, 0.5, 1, 1.5, 2};
  const std::vector<double> bs = {-30, -10, -3, -1, 0, 1, 3, 10, 30, 60, 100, 200};
  char buf[300];
  std::snprintf(buf, sizeof buf,
                "type I by continuation in R from 0; damped Newton shooting from the %zu x %zu grid f'(0) in [-8, 2], "
                "f'''(0) in [-30, 200] at R = %g%s",
                as.size(), bs.size(), Rs, Rs < R ? ", each hit continued in R to the target" : "");
  rep.region = buf;
  const Model<double> ms = make(Rs);
  std::vector<std::pair<double, double>> hits;
  for (double a0 : as)
    for (double b0 : bs) {
      double a = a0, b = b0;
      if (!shoot_newton(Rs, a, b)) continue;
      bool dup = false;
      for (auto& h : hits)
        dup = dup || (std::fabs(h.first - a) < 1e-5 * (1 + std::fabs(a)) &&
                      std::fabs(h.second - b) < 1e-5 * (1 + std::fabs(b)));
      if (!dup) hits.push_back({a, b});
    }
  for (auto [a, b] : hits) {
    auto s = solve_with_decay(ms, guess_from_shooting(ms, a, b, 64), 64, n_max);
    if (!s.converged) continue;
    if (Rs != R) {
      s = continuation(make, s.x, Rs, R, n_max);
      if (!s.converged) {
        rep.log.push_back("shooting hit (" + std::to_string(a) + ", " + std::to_string(b) +
                          ") lost in continuation: " + s.note);
        continue;
      }
    }
    add(s.x,
        "shooting scan at R = " + std::to_string(Rs) + " from (" + std::to_string(a) + ", " + std::to_string(b) + ")");
  }
  return rep;
}

}  // namespace porecert::candidate
