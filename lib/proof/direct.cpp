// Direct Banach contraction about φ (docs/method.md, "Green's function and the direct method", D1–D14).
#include "proof/direct.hpp"

#include <algorithm>
#include <cassert>
#include <cmath>
#include <cstdio>
#include <limits>
#include <map>
#include <mutex>
#include <stdexcept>

#include "arith/fp_env.hpp"
#include "proof/greens.hpp"

namespace porecert::proof {

namespace bn = boost::numeric;
using arith::Id;
using arith::Tri;

std::array<double, 4> default_direct_weights() { return {115, 30, 5, 1}; }
std::array<double, 4> optimised_direct_weights() { return {120.482421875, 31.322265625, 5.2197265625, 1}; }

namespace {

using Poly = std::vector<Id>;  // ascending powers of η
constexpr double kInf = std::numeric_limits<double>::infinity();

Id horner(const Poly& p, const Id& x) {
  Id r(0);
  for (auto it = p.rbegin(); it != p.rend(); ++it) r = r * x + *it;
  return r;
}
Poly derivative(const Poly& p) {
  Poly d;
  for (std::size_t j = 1; j < p.size(); ++j) d.push_back(p[j] * Id(static_cast<double>(j)));
  if (d.empty()) d.push_back(Id(0));
  return d;
}
// Encloses {p(x) : x ∈ X}: Horner intersected with the mean-value form.
Id eval(const Poly& p, const Id& x) {
  const Id h = horner(p, x);
  if (bn::singleton(x)) return h;
  const Id c(bn::median(x));
  const Id m = horner(p, c) + horner(derivative(p), x) * (x - c);
  assert(!(h.upper() < m.lower() || m.upper() < h.lower()));  // two enclosures of one set
  return bn::intersect(h, m);
}
Poly ints(std::initializer_list<long> c) {
  Poly p;
  for (long v : c) p.push_back(Id(static_cast<double>(v)));
  return p;
}

// φ⁽ᵏ⁾ (exact coefficients) and 280·v⁽ᵏ⁾, v = G N(φ) = (−η⁷ + 3η³ − 2η)/280 (D4), k = 0..3.
std::array<Poly, 4> phi_derivs() {
  std::array<Poly, 4> d;
  d[0] = {Id(0), Id(1.5), Id(0), Id(-0.5)};
  for (int k = 1; k < 4; ++k) d[k] = derivative(d[k - 1]);
  return d;
}
std::array<Poly, 4> v280_derivs() {
  std::array<Poly, 4> d;
  d[0] = ints({0, -2, 0, 3, 0, 0, 0, -1});
  for (int k = 1; k < 4; ++k) d[k] = derivative(d[k - 1]);
  return d;
}

// Weight-independent constants, computed once per β tolerance.
struct Fixed {
  std::array<Id, 4> beta, v_sup, phi_sup;
};
const Fixed& fixed_constants(double beta_rel_tol) {
  static std::mutex mu;
  static std::map<double, Fixed> cache;
  std::lock_guard<std::mutex> lock(mu);
  auto it = cache.find(beta_rel_tol);
  if (it != cache.end()) return it->second;
  Fixed f;
  f.beta = greens_beta<Id>(beta_rel_tol);
  const auto ph = phi_derivs();
  const auto v = v280_derivs();
  for (int k = 0; k < 4; ++k) {
    f.v_sup[k] = sup_abs_poly_sum({v[k]}, {Id(1)}, 1e-12) / Id(280);
    f.phi_sup[k] = sup_abs_poly_sum({ph[k]}, {Id(1)}, 1e-12);
  }
  return cache.emplace(beta_rel_tol, f).first->second;
}

struct Consts {
  std::array<Id, 4> beta, v_sup, phi_sup, wbeta;
  Id L, M, B;
};
Consts constants(const std::array<double, 4>& w, double beta_rel_tol) {
  const Fixed& f = fixed_constants(beta_rel_tol);
  Consts c{f.beta, f.v_sup, f.phi_sup, {}, Id(0), Id(0), Id(0)};
  const auto ph = phi_derivs();
  // L = sup_η (|φ|/w_3 + |φ'|/w_2 + |φ''|/w_1 + |φ'''|/w_0)   (D5)
  c.L = sup_abs_poly_sum({ph[0], ph[1], ph[2], ph[3]},
                         {Id(1) / Id(w[3]), Id(1) / Id(w[2]), Id(1) / Id(w[1]), Id(1) / Id(w[0])}, 1e-12);
  c.M = Id(1) / (Id(w[0]) * Id(w[3])) + Id(1) / (Id(w[1]) * Id(w[2]));  // (D6)
  for (int k = 0; k < 4; ++k) c.wbeta[k] = Id(w[k]) * c.beta[k];
  c.B = bn::max(bn::max(c.wbeta[0], c.wbeta[1]), bn::max(c.wbeta[2], c.wbeta[3]));  // (D3)
  return c;
}

Tri decide(const Id& lhs, const Id& rhs, bool strict) {
  if (strict ? lhs.upper() < rhs.lower() : lhs.upper() <= rhs.lower()) return Tri::yes;
  if (strict ? lhs.lower() >= rhs.upper() : lhs.lower() > rhs.upper()) return Tri::no;
  return Tri::unsure;
}
Inequality make_ineq(std::string name, std::string statement, const Id& lhs, const Id& rhs, bool strict) {
  return {std::move(name), std::move(statement), lhs, rhs, rhs - lhs, strict, decide(lhs, rhs, strict)};
}

// The self-map inequalities (D7) at radius r, k = 0..3, and the contraction inequality (D8).
std::vector<Inequality> inequalities_at(const Id& absR, double r, const Consts& c, const std::array<double, 4>& w) {
  std::vector<Inequality> out;
  const Id rI(r);
  const Id quad = c.L * rI + c.M * bn::square(rI);
  for (int k = 0; k < 4; ++k) {
    const std::string ks = std::to_string(k);
    out.push_back(make_ineq("self-map k=" + ks,
                            "|R| w_" + ks + " (V_" + ks + " + beta_" + ks + " (L r + M r^2)) <= r   (D7)",
                            absR * Id(w[k]) * (c.v_sup[k] + c.beta[k] * quad), rI, false));
  }
  out.push_back(make_ineq("contraction on B(phi, r)", "kappa(r) = |R| B (L + 2 M r) < 1   (D8)",
                          absR * c.B * (c.L + Id(2) * c.M * rI), Id(1), true));
  return out;
}
bool all_hold(const std::vector<Inequality>& v) {
  return std::all_of(v.begin(), v.end(), [](const Inequality& q) { return q.holds == Tri::yes; });
}

// Non-rigorous (double) feasibility of D9 for |R| = a: the interval [lo, hi] of radii where every
// self-map quadratic is ≤ 0 and the contraction holds (hi = min(r₊, r_v)).
struct Feasible {
  bool ok = false;
  double lo = 0, hi = kInf, rv = kInf;
};
Feasible feasible(double a, const Consts& c, const std::array<double, 4>& w) {
  Feasible f;
  const double L = c.L.upper(), M = c.M.upper(), B = c.B.upper();
  for (int k = 0; k < 4; ++k) {
    const double wb = w[k] * c.beta[k].upper();
    const double A = a * wb * M, Bq = 1 - a * wb * L, C = a * w[k] * c.v_sup[k].upper();
    if (Bq <= 0) return f;
    if (A == 0) {
      f.lo = std::max(f.lo, C / Bq);
      continue;
    }
    const double disc = Bq * Bq - 4 * A * C;
    if (disc < 0) return f;
    const double sq = std::sqrt(disc);
    f.lo = std::max(f.lo, 2 * C / (Bq + sq));
    f.hi = std::min(f.hi, (Bq + sq) / (2 * A));
  }
  f.rv = a * B > 0 ? (1 / (a * B) - L) / (2 * M) : kInf;
  if (!(f.rv > 0)) return f;
  f.hi = std::min(f.hi, f.rv);
  f.ok = f.lo <= f.hi;
  return f;
}

std::string dec_lo(const Id& x) { return arith::decimal_lower(x, 17); }
std::string dec_hi(const Id& x) { return arith::decimal_upper(x, 17); }
nlohmann::json pair_json(const Id& x) { return nlohmann::json::array({dec_lo(x), dec_hi(x)}); }
// A decimal string that reads back exactly as d when one of ≤ 17 digits exists, else hex.
std::string exact_string(double d) {
  char buf[64];
  std::snprintf(buf, sizeof buf, "%.17g", d);
  const Id back = arith::from_decimal<Id>(buf);
  if (bn::singleton(back) && back.lower() == d) return buf;
  return arith::hex_exact(d);
}
std::string fmt_g(double d) {
  char buf[64];
  std::snprintf(buf, sizeof buf, "%.6g", d);
  return buf;
}

}  // namespace

Id sup_abs_poly_sum(const std::vector<std::vector<Id>>& polys, const std::vector<Id>& scales, double rel_tol) {
  assert(polys.size() == scales.size());
  std::vector<Poly> d;
  for (const Poly& p : polys) d.push_back(derivative(p));
  auto point = [&](double x) {
    Id s(0);
    for (std::size_t i = 0; i < polys.size(); ++i) s += scales[i] * bn::abs(horner(polys[i], Id(x)));
    return s;
  };
  // a.e. derivative of Σ c_i |p_i| on [a,b]: c_i sgn(p_i) p_i', sign hull [−1,1] where p_i may vanish.
  auto deriv = [&](double a, double b) {
    const Id X(a, b);
    Id s(0);
    for (std::size_t i = 0; i < polys.size(); ++i) {
      const Id v = eval(polys[i], X), dv = eval(d[i], X);
      const Id sg = arith::tri_positive(v) == Tri::yes   ? Id(1)
                    : arith::tri_negative(v) == Tri::yes ? Id(-1)
                                                         : Id(-1, 1);
      s += scales[i] * sg * dv;
    }
    return s;
  };
  return sup_by_subdivision<Id>(point, deriv, 0.0, 1.0, rel_tol).value;
}

std::string unproved_inequalities_text(const std::vector<Inequality>& ineq) {
  std::string why;
  for (const auto& q : ineq) {
    if (q.holds == Tri::yes) continue;
    if (!why.empty()) why += "; ";
    why += q.name + (q.holds == Tri::no ? " fails" : " is not proved") + ": lhs - rhs in [" +
           arith::decimal_lower(-q.margin, 6) + ", " + arith::decimal_upper(-q.margin, 6) + "]";
  }
  return why;
}

DirectResult certify_direct(const Id& R, const DirectOptions& opt) {
  const arith::FpEnvScope fp_env;  // caller's rounding mode and flags restored on exit (arith/fp_env.hpp)
  for (int k = 0; k < 4; ++k)
    if (!(std::isfinite(opt.weights[k]) && opt.weights[k] > 0))
      throw std::invalid_argument("weights: w_" + std::to_string(k) + " = " + fmt_g(opt.weights[k]) +
                                  " must be a positive finite number");
  if (opt.radius && !(std::isfinite(*opt.radius) && *opt.radius >= 0))
    throw std::invalid_argument("radius: " + fmt_g(*opt.radius) + " must be a finite number >= 0");

  const auto& w = opt.weights;
  const Consts c = constants(w, opt.beta_rel_tol);
  DirectResult res;
  res.R = R;
  res.weights = w;
  res.beta = c.beta;
  res.v_sup = c.v_sup;
  res.phi_sup = c.phi_sup;
  res.L = c.L;
  res.M = c.M;
  res.B = c.B;
  const Id absR = bn::abs(R);
  const double a = absR.upper();
  const Feasible f = feasible(a, c, w);

  // Radius (D9): just above the largest lower root, else further inside the feasible interval.
  double r = 0;
  std::vector<Inequality> ineq;
  if (opt.radius) {
    r = *opt.radius;
    ineq = inequalities_at(absR, r, c, w);
  } else if (f.ok) {
    std::vector<double> tries;
    if (f.lo > 0)
      tries.push_back(std::min(f.lo * (1 + 1e-9), f.hi));
    else
      tries.push_back(0);
    for (double t : {1e-6, 1e-3, 0.1, 0.5})
      if (f.hi < kInf) tries.push_back(f.lo + (f.hi - f.lo) * t);
    for (double t : tries) {
      r = t;
      ineq = inequalities_at(absR, r, c, w);
      if (all_hold(ineq)) break;
    }
  } else {
    // Not feasible: show the inequalities at the radius with the best worst relative margin.
    double best = -kInf;
    for (int i = 0; i <= 320; ++i) {
      const double t = std::pow(10.0, -8 + i * 0.05);
      const auto q = inequalities_at(absR, t, c, w);
      double worst = kInf;
      for (const auto& x : q) worst = std::min(worst, bn::median(x.margin) / bn::median(x.rhs));
      if (worst > best) best = worst, r = t;
    }
    ineq = inequalities_at(absR, r, c, w);
  }
  res.radius = r;
  res.certified = all_hold(ineq);

  // Uniqueness radius (D10): largest r_u ≥ r found with κ(r_u) < 1.
  res.uniqueness_radius = r;
  if (res.certified) {
    if (a == 0) {
      res.uniqueness_radius = kInf;
    } else if (f.rv < kInf && f.rv > r) {
      for (double t : {1 - 1e-12, 1 - 1e-9, 1 - 1e-6, 1 - 1e-3, 0.9, 0.5}) {
        const double ru = r + (f.rv - r) * t;
        auto q = make_ineq("contraction on B(phi, r_u) (uniqueness)", "kappa(r_u) = |R| B (L + 2 M r_u) < 1   (D10)",
                           absR * c.B * (c.L + Id(2) * c.M * Id(ru)), Id(1), true);
        if (q.holds == Tri::yes) {
          res.uniqueness_radius = ru;
          ineq.push_back(q);
          break;
        }
      }
    }
  }
  res.inequalities = ineq;

  if (!res.certified) {
    const std::string why = unproved_inequalities_text(ineq);
    res.reason = why + " at r = " + exact_string(r);
    if (!opt.radius && !f.ok)
      res.reason += " (no radius satisfies D7 and D8 together: |R| = " + arith::decimal_upper(absR, 6) +
                    " is too large for the direct method about phi with these weights)";
    return res;
  }

  // Error bounds (D11, D11') and values (D12).
  const Id rI(r);
  const Id quad = c.L * rI + c.M * bn::square(rI);
  std::array<Id, 4> e0, e1;
  for (int k = 0; k < 4; ++k) {
    e0[k] = rI / Id(w[k]);
    e1[k] = absR * c.beta[k] * quad;
    res.error_bounds[k] = e0[k].upper();
    res.error_bounds_first_order[k] = e1[k].upper();
  }
  const auto ph = phi_derivs();
  const auto v = v280_derivs();
  auto value = [&](int k, double x) {
    const Id X(x);
    const Id p = horner(ph[k], X), vk = horner(v[k], X) / Id(280);
    const Id A = p + Id(-res.error_bounds[k], res.error_bounds[k]);
    const Id Bv = p + R * vk + Id(-res.error_bounds_first_order[k], res.error_bounds_first_order[k]);
    assert(!(A.upper() < Bv.lower() || Bv.upper() < A.lower()));
    return bn::intersect(A, Bv);
  };
  const Id fp0 = value(1, 0), fppp0 = value(3, 0), fpp1 = value(2, 1);
  res.values = {{"f'(0)", fp0}, {"f'''(0)", fppp0}, {"f''(1)", fpp1}, {"K", fppp0 + R * bn::square(fp0)}};
  return res;
}

nlohmann::json to_json(const DirectResult& r) {
  using nlohmann::json;
  json j;
  j["status"] = r.certified ? "certified" : "not certified";
  j["method"] = "direct";
  j["R"] = pair_json(r.R);
  json weights = json::array(), weights_hex = json::array();
  for (double x : r.weights) {
    weights.push_back(exact_string(x));
    weights_hex.push_back(arith::hex_exact(x));
  }
  j["space"] = {
      {"description",
       "C^3[0,1] functions h = f - phi, phi(eta) = (3 eta - eta^3)/2; norm ||h|| = max_k w_k ||h^(k)||_inf, k = 0..3"},
      {"weights", weights},
      {"weights_hex", weights_hex},
      {"ball", "closed ball B(phi, r) = { f in C^3[0,1] : ||f - phi|| <= r }"}};
  json ineq = json::array();
  for (const auto& q : r.inequalities)
    ineq.push_back({{"name", q.name},
                    {"statement", q.statement},
                    {"lhs", pair_json(q.lhs)},
                    {"rhs", pair_json(q.rhs)},
                    {"margin", pair_json(q.margin)},
                    {"holds", arith::to_string(q.holds)}});
  j["inequalities"] = ineq;
  json cst;
  json beta = json::array(), vs = json::array(), ps = json::array();
  for (int k = 0; k < 4; ++k) {
    beta.push_back(pair_json(r.beta[k]));
    vs.push_back(pair_json(r.v_sup[k]));
    ps.push_back(pair_json(r.phi_sup[k]));
  }
  cst["beta"] = beta;
  cst["v_sup"] = vs;
  cst["phi_sup"] = ps;
  cst["L"] = pair_json(r.L);
  cst["M"] = pair_json(r.M);
  cst["B"] = pair_json(r.B);
  cst["meaning"] =
      "beta_k = sup_eta int |d^k G/d eta^k| ds; v = G N(phi) = (-eta^7 + 3 eta^3 - 2 eta)/280, v_sup_k = "
      "||v^(k)||_inf; "
      "L = sup_eta(|phi|/w_3 + |phi'|/w_2 + |phi''|/w_1 + |phi'''|/w_0); M = 1/(w_0 w_3) + 1/(w_1 w_2); B = max_k w_k "
      "beta_k";
  j["constants"] = cst;
  j["docs"] = "docs/method.md, section 'Green's function and the direct method', equations D1-D12";
  if (!r.certified) {
    j["existence_radius"] = nullptr;
    j["uniqueness_radius"] = nullptr;
    j["error_bounds"] = nullptr;
    j["values"] = nullptr;
    j["tried_radius"] = exact_string(r.radius);
    j["reason"] = r.reason;
    j["uniqueness"] = "nothing is claimed: the proof did not go through";
    return j;
  }
  j["existence_radius"] = dec_hi(Id(r.radius));
  j["uniqueness_radius"] = std::isinf(r.uniqueness_radius) ? std::string("inf") : dec_lo(Id(r.uniqueness_radius));
  json eb = json::array(), eb1 = json::array();
  for (int k = 0; k < 4; ++k) {
    eb.push_back(dec_hi(Id(r.error_bounds[k])));
    eb1.push_back(dec_hi(Id(r.error_bounds_first_order[k])));
  }
  j["error_bounds"] = eb;
  j["error_bounds_meaning"] = "entry k bounds ||f^(k) - phi^(k)||_inf (= r / w_k, rounded up), k = 0..3";
  j["error_bounds_first_order"] = eb1;
  j["error_bounds_first_order_meaning"] =
      "entry k bounds ||f^(k) - phi^(k) - R v^(k)||_inf (<= |R| beta_k (L r + M r^2), rounded up), for every R in the "
      "interval";
  json vals;
  for (const auto& x : r.values) vals[x.name] = pair_json(x.enclosure);
  j["values"] = vals;
  j["values_meaning"] =
      "enclosures valid for every R in the interval: phi's values widened by error_bounds, intersected with "
      "phi + R v widened by error_bounds_first_order; K = f'''(0) + R f'(0)^2";
  j["uniqueness"] =
      "For every R in the interval there is exactly one solution f of Berman's problem with ||f - phi|| <= "
      "existence_radius "
      "in the weighted C^3 norm of 'space'; it is also the only solution with ||f - phi|| <= uniqueness_radius "
      "(T is a contraction on that larger ball). Solutions outside that C^3 ball are not excluded.";
  return j;
}

nlohmann::json certify_direct_json(const Id& R, const DirectOptions& options) {
  return to_json(certify_direct(R, options));
}

int direct_exit_code(const nlohmann::json& certificate) {
  return certificate.value("status", "") == "certified" ? 0 : 1;
}

namespace {
Id side_interval(int side, const Id& x) { return side > 0 ? Id(0, x.upper()) : Id(-x.upper(), 0); }
// Largest decimal with `digits` significant digits that is ≤ x (x > 0), as a string.
std::string decimal_floor(double x, int digits, long step_down) {
  const int e = static_cast<int>(std::floor(std::log10(x)));
  const double scale = std::pow(10.0, digits - 1 - e);
  long n = static_cast<long>(std::floor(x * scale)) - step_down;
  if (n < 1) n = 1;
  const int frac = std::max(0, digits - 1 - e);
  char buf[64];
  std::snprintf(buf, sizeof buf, "%.*f", frac, static_cast<double>(n) / scale);
  return buf;
}
}  // namespace

DirectReach direct_reach(int side, const std::array<double, 4>& weights, int digits) {
  assert(side == 1 || side == -1);
  DirectOptions opt;
  opt.weights = weights;
  auto ok = [&](double x) { return certify_direct(side_interval(side, Id(x)), opt).certified; };
  double lo = 0, hi = 1;
  while (ok(hi) && hi < 1e3) lo = hi, hi *= 2;
  for (int i = 0; i < 50; ++i) {
    const double m = lo + (hi - lo) / 2;
    (ok(m) ? lo : hi) = m;
  }
  DirectReach out;
  if (lo <= 0) {  // nothing certified: report the check at a tiny |R|
    out.R1 = "0";
    out.check = certify_direct(side_interval(side, Id(1e-300)), opt);
    return out;
  }
  for (long step = 0; step < 5; ++step) {
    out.R1 = decimal_floor(lo, digits, step);
    out.check = certify_direct(side_interval(side, arith::from_decimal<Id>(out.R1)), opt);
    if (out.check.certified) break;
  }
  return out;
}

double direct_feasible_R(const std::array<double, 4>& w) {
  const Consts c = constants(w, 1e-12);
  double lo = 0, hi = 16;
  for (int i = 0; i < 60; ++i) {
    const double m = (lo + hi) / 2;
    (feasible(m, c, w).ok ? lo : hi) = m;
  }
  return lo;
}

std::array<double, 4> optimise_direct_weights(const std::array<double, 4>& start, int max_evals) {
  // Compass search in (log w_0, log w_1, log w_2) with all 26 directions of {−1,0,1}³: the objective
  // is a max-type function with kinks where constraints balance, where axis steps alone stall.
  std::array<double, 3> x{std::log(start[0] / start[3]), std::log(start[1] / start[3]), std::log(start[2] / start[3])};
  auto weights_of = [](const std::array<double, 3>& y, double grid) {
    std::array<double, 4> w{};
    for (int i = 0; i < 3; ++i) w[i] = std::exp(y[i]);
    w[3] = 1;
    if (grid > 0)
      for (int i = 0; i < 3; ++i) w[i] = std::max(grid, std::round(w[i] / grid) * grid);
    return w;
  };
  double best = direct_feasible_R(weights_of(x, 0));
  int evals = 1;
  double step = 0.25;
  while (step > 1e-5 && evals < max_evals) {
    bool improved = false;
    for (int d = 0; d < 27 && evals < max_evals; ++d) {
      if (d == 13) continue;  // (0,0,0)
      const std::array<int, 3> dir{d / 9 - 1, (d / 3) % 3 - 1, d % 3 - 1};
      auto y = x;
      for (int i = 0; i < 3; ++i) y[i] += dir[i] * step;
      const double v = direct_feasible_R(weights_of(y, 0));
      ++evals;
      if (v > best) {
        best = v, x = y, improved = true;
        break;
      }
    }
    if (!improved) step /= 2;
  }
  // Exact short decimals: multiples of 2⁻¹⁰; keep the best of the grid neighbours.
  const double grid = 0x1p-10;
  std::array<double, 4> w = weights_of(x, grid), bestw = w;
  double bv = direct_feasible_R(w);
  for (int d = 0; d < 27; ++d) {
    std::array<double, 4> t = w;
    const std::array<int, 3> dir{d / 9 - 1, (d / 3) % 3 - 1, d % 3 - 1};
    for (int i = 0; i < 3; ++i) t[i] = std::max(grid, t[i] + dir[i] * grid);
    const double v = direct_feasible_R(t);
    if (v > bv) bv = v, bestw = t;
  }
  return bestw;
}

}  // namespace porecert::proof
