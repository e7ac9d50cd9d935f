// Direct contraction about a candidate (docs/method.md, "Direct method about a candidate", D15–D25).
#include "proof/direct_candidate.hpp"

#include <algorithm>
#include <cassert>
#include <cmath>
#include <cstdio>
#include <limits>
#include <map>
#include <mutex>
#include <queue>
#include <stdexcept>

#include "arith/fp_env.hpp"
#include "arith/sup_norm.hpp"
#include "proof/greens.hpp"

namespace porecert::proof {

namespace bn = boost::numeric;
using arith::Id;
using arith::Tri;
using Chain = std::array<IdSeries, 4>;  // enclosures of g, g', g'', g''' of one function

namespace {

constexpr double kInf = std::numeric_limits<double>::infinity();
using RU = arith::rounded_nearest_outward;

// η^n, n ≤ 3, as a Chebyshev series on [0,1]: η = (1 + x)/2 expanded, exact dyadic coefficients.
IdSeries mono(int n) {
  switch (n) {
    case 0:
      return {Id(1)};
    case 1:
      return {Id(0.5), Id(0.5)};
    case 2:
      return {Id(0.375), Id(0.5), Id(0.125)};
    case 3:
      return {Id(0.3125), Id(0.46875), Id(0.1875), Id(0.03125)};
    default:
      throw std::invalid_argument("mono: degree > 3");
  }
}
// Σ a_j η^j for j = 0..3.
IdSeries cubic(const Id& a0, const Id& a1, const Id& a2, const Id& a3) {
  IdSeries s{a0};
  s = cheb::axpy(s, a1, mono(1));
  s = cheb::axpy(s, a2, mono(2));
  return cheb::axpy(s, a3, mono(3));
}
IdSeries sub(const IdSeries& a, const IdSeries& b) { return cheb::axpy(a, Id(-1), b); }

// φ = (3η − η³)/2 and its derivatives: exact dyadic coefficients (no arithmetic, so no outward steps).
Chain phi_chain() {
  return {IdSeries{Id(19.0 / 32), Id(33.0 / 64), Id(-3.0 / 32), Id(-1.0 / 64)},
          IdSeries{Id(15.0 / 16), Id(-0.75), Id(-3.0 / 16)}, IdSeries{Id(-1.5), Id(-1.5)}, IdSeries{Id(-3)}};
}

const std::array<Id, 4>& betas(double tol) {
  static std::mutex mu;
  static std::map<double, std::array<Id, 4>> cache;
  std::lock_guard<std::mutex> lock(mu);
  auto it = cache.find(tol);
  if (it == cache.end()) it = cache.emplace(tol, greens_beta<Id>(tol)).first;
  return it->second;
}

// Upper bound of sup_{[0,1]} |s|: the smaller of the ℓ¹ norm and the branch-and-bound bound.
double sup_up(const IdSeries& s, double rel_tol = 1e-6, int max_boxes = 4000) {
  const double n1 = cheb::norm1_up(s);
  if (n1 == 0) return 0;
  return std::min(n1, arith::sup_norm(s, 0.0, 1.0, 0, rel_tol, max_boxes).upper);
}

// Upper bound of sup_η Σ_i scale_i |g_i(η)| (scales ≥ 0, exact doubles), branch and bound as in
// arith::sup_norm: on a box with midpoint m, half-width h, |g| ≤ |g(m)| + |g'(m)| h + ‖g''‖₁ h²/2.
double sup_weighted_sum_up(const std::vector<IdSeries>& g, const std::vector<double>& scale, double rel_tol = 1e-6,
                           int max_boxes = 4000) {
  const std::size_t n = g.size();
  std::vector<IdSeries> d(n);
  std::vector<double> L2(n);
  for (std::size_t i = 0; i < n; ++i) {
    d[i] = cheb::derivative(g[i]);
    L2[i] = cheb::norm1_up(cheb::derivative(d[i]));
  }
  struct Box {
    double lo, hi, ub;
    bool operator<(const Box& o) const { return ub < o.ub; }
  };
  std::priority_queue<Box> q;
  double lower = 0;
  int boxes = 0;
  auto bound = [&](double lo, double hi) {
    const double m = lo + (hi - lo) / 2;
    const double h = std::max(RU::sub_up(m, lo), RU::sub_up(hi, m));
    double ub = 0, lb = 0;
    for (std::size_t i = 0; i < n; ++i) {
      const Id v = cheb::eval(g[i], Id(m)), dv = cheb::eval(d[i], Id(m));
      const double t = RU::add_up(RU::add_up(arith::mag_up(v), RU::mul_up(arith::mag_up(dv), h)),
                                  RU::mul_up(RU::mul_up(L2[i], RU::mul_up(h, h)), 0.5));
      ub = RU::add_up(ub, RU::mul_up(scale[i], t));
      lb = RU::add_down(lb, RU::mul_down(scale[i], std::max(0.0, std::max(v.lower(), -v.upper()))));
    }
    lower = std::max(lower, lb);
    ++boxes;
    q.push({lo, hi, ub});
  };
  bound(0.0, 1.0);
  double upper = q.top().ub;
  while (!q.empty()) {
    const Box top = q.top();
    upper = top.ub;
    if (RU::sub_up(upper, lower) <= rel_tol * upper || boxes >= max_boxes || top.hi - top.lo < 1e-15) break;
    q.pop();
    const double m = top.lo + (top.hi - top.lo) / 2;
    bound(top.lo, m);
    bound(m, top.hi);
  }
  return upper;
}

Tri decide(const Id& lhs, const Id& rhs, bool strict) {
  if (strict ? lhs.upper() < rhs.lower() : lhs.upper() <= rhs.lower()) return Tri::yes;
  if (strict ? lhs.lower() >= rhs.upper() : lhs.lower() > rhs.upper()) return Tri::no;
  return Tri::unsure;
}
Inequality make_ineq(std::string name, std::string statement, const Id& lhs, const Id& rhs, bool strict) {
  return {std::move(name), std::move(statement), lhs, rhs, rhs - lhs, strict, decide(lhs, rhs, strict)};
}
bool all_hold(const std::vector<Inequality>& v) {
  return std::all_of(v.begin(), v.end(), [](const Inequality& q) { return q.holds == Tri::yes; });
}

struct Consts {
  Id absR, M, B, Lam;
  std::array<Id, 4> beta, w, delta;
};
// κ(ρ) = |R| B (Λ + 2Mρ)   (D21)
Id kappa_at(const Consts& c, double rho) { return c.absR * c.B * (c.Lam + Id(2) * c.M * Id(rho)); }
// Self-map (D20) k = 0..3 and contraction (D21) at ρ.
std::vector<Inequality> inequalities_at(const Consts& c, double rho) {
  std::vector<Inequality> out;
  const Id r(rho);
  for (int k = 0; k < 4; ++k) {
    const std::string ks = std::to_string(k);
    out.push_back(
        make_ineq("self-map k=" + ks,
                  "w_" + ks + " (delta_" + ks + " + |R| beta_" + ks + " (Lambda + 2 M rho) rho) <= rho   (D20)",
                  c.w[k] * (c.delta[k] + c.absR * c.beta[k] * (c.Lam + Id(2) * c.M * r) * r), r, false));
  }
  out.push_back(make_ineq("contraction on B(f~, rho)", "kappa(rho) = |R| B (Lambda + 2 M rho) < 1   (D21)",
                          kappa_at(c, rho), Id(1), true));
  return out;
}

std::string dec_lo(const Id& x) { return arith::decimal_lower(x, 17); }
std::string dec_hi(const Id& x) { return arith::decimal_upper(x, 17); }
nlohmann::json pair_json(const Id& x) { return nlohmann::json::array({dec_lo(x), dec_hi(x)}); }
std::string fmt_g(double d, int digits = 6) {
  char buf[64];
  std::snprintf(buf, sizeof buf, "%.*g", digits, d);
  return buf;
}

}  // namespace

Chain newton_candidate_chain(const std::vector<std::string>& hex) {
  if (hex.size() < 3) throw std::invalid_argument("candidate: layout [f'(0), K, u_0..] needs at least 3 entries");
  IdSeries u;
  for (std::size_t i = 2; i < hex.size(); ++i) u.push_back(arith::from_decimal<Id>(hex[i]));
  const Id a = arith::from_decimal<Id>(hex[0]);
  Chain D;
  D[3] = u;
  D[2] = cheb::antiderivative(D[3], Id(0));
  D[1] = cheb::antiderivative(D[2], a);
  D[0] = cheb::antiderivative(D[1], Id(0));
  return D;
}

IdSeries newton_candidate_series(const std::vector<std::string>& hex) { return newton_candidate_chain(hex)[0]; }

namespace {

DirectCandidateResult certify_chain(const Chain& Fb, const Id& R, const DirectCandidateOptions& opt) {
  const auto& w = opt.weights;
  for (int k = 0; k < 4; ++k)
    if (!(std::isfinite(w[k]) && w[k] > 0))
      throw std::invalid_argument("weights: w_" + std::to_string(k) + " = " + fmt_g(w[k]) +
                                  " must be a positive finite number");
  if (opt.radius && !(std::isfinite(*opt.radius) && *opt.radius >= 0))
    throw std::invalid_argument("radius: " + fmt_g(*opt.radius) + " must be a finite number >= 0");
  for (const auto& s : Fb)
    if (s.empty()) throw std::invalid_argument("candidate: empty series");

  DirectCandidateResult res;
  res.R = R;
  res.weights = w;

  // (D15) boundary correction p = a0 + a1 η + a2 η² + a3 η³.
  const Id e00 = cheb::value_at_0(Fb[0]), e20 = cheb::value_at_0(Fb[2]);
  const Id e01 = cheb::value_at_1(Fb[0]) - Id(1), e11 = cheb::value_at_1(Fb[1]);
  res.bc_residual = {e00, e20, e01, e11};
  const Id a0 = -e00, a2 = -e20 / Id(2);
  const Id A = -e01 - a0 - a2, Bv = -e11 - Id(2) * a2;
  const Id a3 = (Bv - A) / Id(2), a1 = A - a3;
  const Chain P = {cubic(a0, a1, a2, a3), cubic(a1, Id(2) * a2, Id(3) * a3, Id(0)),
                   cubic(Id(2) * a2, Id(6) * a3, Id(0), Id(0)), IdSeries{Id(6) * a3}};
  Chain F;
  for (int k = 0; k < 4; ++k) {
    F[k] = cheb::add(Fb[k], P[k]);
    res.correction_sup[k] = cheb::norm1_up(P[k]);
  }

  // (D16) u = G N(f̃): four antiderivatives of N plus the homogeneous part of (G2).
  const IdSeries N = sub(cheb::product(F[0], F[3]), cheb::product(F[1], F[2]));
  Chain Q;
  Q[3] = cheb::antiderivative(N, Id(0));
  for (int k = 2; k >= 0; --k) Q[k] = cheb::antiderivative(Q[k + 1], Id(0));
  const Id q0 = cheb::value_at_1(Q[0]), q1 = cheb::value_at_1(Q[1]);
  const Id cc = (q0 - q1) / Id(2), aa = (q1 - Id(3) * q0) / Id(2);
  const Chain U = {cheb::add(Q[0], cubic(Id(0), aa, Id(0), cc)), cheb::add(Q[1], cubic(aa, Id(0), Id(3) * cc, Id(0))),
                   cheb::add(Q[2], cubic(Id(0), Id(6) * cc, Id(0), Id(0))), cheb::add(Q[3], IdSeries{Id(6) * cc})};
  // (D17) T(f̃) and the defect T(f̃) − f̃.
  const Chain Ph = phi_chain();
  Chain Tf, Dd;
  for (int k = 0; k < 4; ++k) {
    Tf[k] = cheb::axpy(Ph[k], R, U[k]);
    Dd[k] = sub(Tf[k], F[k]);
  }

  // (D18), (D19) constants.
  Consts c;
  c.absR = bn::abs(R);
  c.beta = betas(opt.beta_rel_tol);
  res.beta = c.beta;
  for (int k = 0; k < 4; ++k) {
    c.w[k] = Id(w[k]);
    res.defect[k] = sup_up(Dd[k], 1e-3, 1000);
    c.delta[k] = Id(res.defect[k]);
    res.f_sup[k] = sup_up(F[k], 1e-6, 2000);
  }
  c.M = Id(1) / (c.w[0] * c.w[3]) + Id(1) / (c.w[1] * c.w[2]);
  c.B = bn::max(bn::max(c.w[0] * c.beta[0], c.w[1] * c.beta[1]), bn::max(c.w[2] * c.beta[2], c.w[3] * c.beta[3]));
  std::vector<double> sc(4);
  for (int i = 0; i < 4; ++i) sc[i] = RU::div_up(1.0, w[i]);
  // Λ ≥ sup_η (|f̃'''|/w_0 + |f̃''|/w_1 + |f̃'|/w_2 + |f̃|/w_3), or the sum of the suprema if smaller.
  double sum_of_sups = 0;
  for (int i = 0; i < 4; ++i) sum_of_sups = RU::add_up(sum_of_sups, RU::mul_up(sc[i], res.f_sup[3 - i]));
  res.Lambda = std::min(sum_of_sups, sup_weighted_sum_up({F[3], F[2], F[1], F[0]}, sc));
  c.Lam = Id(res.Lambda);
  res.M = c.M;
  res.B = c.B;

  // (D23) radius: just above the smallest root of the self-map quadratics (double, then checked).
  const double aR = c.absR.upper(), Mu = c.M.upper(), Bu = c.B.upper();
  bool feasible = true;
  double lo = 0, hi = kInf;
  for (int k = 0; k < 4; ++k) {
    const double wb = w[k] * c.beta[k].upper();
    const double qa = aR * wb * 2 * Mu, qb = 1 - aR * wb * res.Lambda, qc = w[k] * res.defect[k];
    if (qb <= 0) {
      feasible = false;
      break;
    }
    if (qa == 0) {
      lo = std::max(lo, qc / qb);
      continue;
    }
    const double disc = qb * qb - 4 * qa * qc;
    if (disc < 0) {
      feasible = false;
      break;
    }
    lo = std::max(lo, 2 * qc / (qb + std::sqrt(disc)));
    hi = std::min(hi, (qb + std::sqrt(disc)) / (2 * qa));
  }
  const double rv = aR * Bu > 0 ? (1 / (aR * Bu) - res.Lambda) / (2 * Mu) : kInf;  // κ(rv) = 1
  hi = std::min(hi, rv);
  feasible = feasible && rv > 0 && lo <= hi;

  double rho = 0;
  std::vector<Inequality> ineq;
  if (opt.radius) {
    rho = *opt.radius;
    ineq = inequalities_at(c, rho);
  } else if (feasible) {
    std::vector<double> tries;
    if (lo == 0) tries.push_back(0);
    for (double t : {1e-9, 1e-6, 1e-3, 0.1, 1.0}) tries.push_back(lo * (1 + t));
    if (hi < kInf)
      for (double t : {1e-6, 1e-3, 0.1, 0.5}) tries.push_back(lo + (hi - lo) * t);
    for (double t : tries) {
      rho = t;
      ineq = inequalities_at(c, rho);
      if (all_hold(ineq)) break;
    }
  } else {
    double best = -kInf;  // show the radius with the best worst relative margin
    for (int i = 0; i <= 380; ++i) {
      const double t = std::pow(10.0, -16 + i * 0.05);
      double worst = kInf;
      for (const auto& x : inequalities_at(c, t)) worst = std::min(worst, bn::median(x.margin) / bn::median(x.rhs));
      if (worst > best) best = worst, rho = t;
    }
    ineq = inequalities_at(c, rho);
  }
  res.radius = rho;
  res.kappa = kappa_at(c, rho);
  res.certified = ineq.size() == 5 && all_hold(ineq);

  // (D22) uniqueness radius: the largest ρ' ≥ ρ found with κ(ρ') < 1.
  res.uniqueness_radius = rho;
  if (res.certified) {
    if (aR == 0) {
      res.uniqueness_radius = kInf;
    } else if (rv < kInf && rv > rho) {
      for (double t : {1 - 1e-12, 1 - 1e-9, 1 - 1e-6, 1 - 1e-3, 0.9, 0.5}) {
        const double ru = rho + (rv - rho) * t;
        auto q = make_ineq("contraction on B(f~, rho') (uniqueness)",
                           "kappa(rho') = |R| B (Lambda + 2 M rho') < 1   (D22)", kappa_at(c, ru), Id(1), true);
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
    res.reason = why + " at rho = " + fmt_g(rho, 17);
    if (!opt.radius && !feasible)
      res.reason += " (no radius satisfies D20 and D21 together: |R| = " + arith::decimal_upper(c.absR, 6) +
                    " is too large for the direct method about this candidate with these weights)";
    return res;
  }

  // (D24) error bounds and values.
  const Id r(rho);
  std::array<Id, 4> e0, e1;
  for (int k = 0; k < 4; ++k) {
    e0[k] = r / c.w[k];
    e1[k] = c.absR * c.beta[k] * (c.Lam + Id(2) * c.M * r) * r;
    res.error_bounds[k] = e0[k].upper();
    res.error_bounds_T[k] = e1[k].upper();
  }
  auto value = [&](int k, bool at1) {
    const Id f = at1 ? cheb::value_at_1(F[k]) : cheb::value_at_0(F[k]);
    const Id t = at1 ? cheb::value_at_1(Tf[k]) : cheb::value_at_0(Tf[k]);
    const Id A1 = f + Id(-res.error_bounds[k], res.error_bounds[k]);
    const Id A2 = t + Id(-res.error_bounds_T[k], res.error_bounds_T[k]);
    assert(!(A1.upper() < A2.lower() || A2.upper() < A1.lower()));  // two enclosures of one number
    return bn::intersect(A1, A2);
  };
  const Id fp0 = value(1, false), fppp0 = value(3, false), fpp1 = value(2, true);
  res.values = {{"f'(0)", fp0}, {"f'''(0)", fppp0}, {"f''(1)", fpp1}, {"K", fppp0 + R * bn::square(fp0)}};
  return res;
}

}  // namespace

DirectCandidateResult certify_direct_about(const IdSeries& fbar, const Id& R, const DirectCandidateOptions& opt) {
  if (fbar.empty()) throw std::invalid_argument("candidate: empty series");
  Chain D;
  D[0] = fbar;
  for (int k = 1; k < 4; ++k) D[k] = cheb::derivative(D[k - 1]);
  return certify_chain(D, R, opt);
}

DirectCandidateResult certify_direct_about(const Chain& chain, const Id& R, const DirectCandidateOptions& opt) {
  return certify_chain(chain, R, opt);
}

nlohmann::json to_json(const DirectCandidateResult& r) {
  using nlohmann::json;
  json j;
  j["status"] = r.certified ? "certified" : "not certified";
  j["method"] = "direct about a candidate";
  j["R"] = pair_json(r.R);
  json w = json::array();
  for (double x : r.weights) w.push_back(fmt_g(x, 17));
  j["weights"] = w;
  j["norm"] = "||h|| = max_k w_k ||h^(k)||_inf, k = 0..3, on C^3[0,1]";
  j["radius"] = r.certified ? json(dec_hi(Id(r.radius))) : json(nullptr);
  j["uniqueness_radius"] = !r.certified                      ? json(nullptr)
                           : std::isinf(r.uniqueness_radius) ? json("inf")
                                                             : json(dec_lo(Id(r.uniqueness_radius)));
  json ineq = json::array();
  for (const auto& q : r.inequalities)
    ineq.push_back({{"name", q.name},
                    {"statement", q.statement},
                    {"lhs", pair_json(q.lhs)},
                    {"rhs", pair_json(q.rhs)},
                    {"margin", pair_json(q.margin)},
                    {"holds", arith::to_string(q.holds)}});
  j["inequalities"] = ineq;
  json d = json::array(), fs = json::array(), bc = json::array();
  for (int k = 0; k < 4; ++k) {
    d.push_back(dec_hi(Id(r.defect[k])));
    fs.push_back(dec_hi(Id(r.f_sup[k])));
    bc.push_back(pair_json(r.bc_residual[k]));
  }
  j["defect_sup"] = d;
  j["candidate_sup"] = fs;
  j["boundary_residuals"] = bc;
  j["Lambda"] = dec_hi(Id(r.Lambda));
  j["kappa"] = pair_json(r.kappa);
  json vals = json::object();
  for (const auto& v : r.values) vals[v.name] = pair_json(v.enclosure);
  j["values"] = r.certified ? vals : json(nullptr);
  if (!r.certified) j["reason"] = r.reason;
  j["docs"] = "docs/method.md, section 'Direct method about a candidate', equations D15-D25";
  return j;
}

C3Uniqueness c3_uniqueness_from_newton(const CertifyOutcome& o, const Id& R) {
  const arith::FpEnvScope fp_env;  // caller's rounding mode and flags restored on exit (arith/fp_env.hpp)
  C3Uniqueness u;
  if (!o.certified || o.candidate_hex.empty()) {
    u.statement = "no statement: the Newton-Kantorovich proof did not certify a candidate";
    return u;
  }
  u.attempted = true;
  u.direct = certify_chain(newton_candidate_chain(o.candidate_hex), R, {});
  const auto& d = u.direct;
  if (!d.certified) {
    u.statement = "no C^3-ball statement: " + d.reason;
    return u;
  }
  // (D25) the Newton solution f_N: ‖f_N⁽ᵏ⁾ − f̃⁽ᵏ⁾‖∞ ≤ c3_error_k + ‖p⁽ᵏ⁾‖∞.
  const Id ru = std::isinf(d.uniqueness_radius) ? Id(std::numeric_limits<double>::max()) : Id(d.uniqueness_radius);
  for (int k = 0; k < 4; ++k) {
    const std::string ks = std::to_string(k);
    u.newton_in_ball.push_back(make_ineq("Newton solution in B(f~, rho') k=" + ks,
                                         "w_" + ks + " (c3_error_" + ks + " + ||p^(" + ks + ")||) <= rho'   (D25)",
                                         Id(d.weights[k]) * (Id(o.c3_error[k]) + Id(d.correction_sup[k])), ru, false));
  }
  u.newton_solution_is_it = all_hold(u.newton_in_ball);
  char buf[1024];
  std::snprintf(buf, sizeof buf,
                "For every R in [%s, %s], Berman's problem has exactly one solution f in the C^3 ball "
                "max_k w_k ||f^(k) - f~^(k)||_inf <= %s, w = (%s, %s, %s, %s), f~ = the Newton candidate plus its "
                "boundary cubic; it lies within %s of f~ (docs/method.md D20-D22).",
                arith::decimal_lower(R, 17).c_str(), arith::decimal_upper(R, 17).c_str(),
                std::isinf(d.uniqueness_radius) ? "inf (any radius)" : dec_lo(Id(d.uniqueness_radius)).c_str(),
                fmt_g(d.weights[0]).c_str(), fmt_g(d.weights[1]).c_str(), fmt_g(d.weights[2]).c_str(),
                fmt_g(d.weights[3]).c_str(), dec_hi(Id(d.radius)).c_str());
  u.statement = buf;
  u.statement += u.newton_solution_is_it
                     ? " The Newton-certified solution lies in that ball (D25), so it is that solution."
                     : " Whether the Newton-certified solution lies in that ball was not decided (D25).";
  return u;
}

nlohmann::json to_json(const C3Uniqueness& u) {
  nlohmann::json j;
  if (!u.attempted) {
    j["status"] = "not attempted";
    j["statement"] = u.statement;
    return j;
  }
  j = to_json(u.direct);
  j["statement"] = u.statement;
  nlohmann::json nb = nlohmann::json::array();
  for (const auto& q : u.newton_in_ball)
    nb.push_back({{"name", q.name},
                  {"statement", q.statement},
                  {"lhs", pair_json(q.lhs)},
                  {"rhs", pair_json(q.rhs)},
                  {"holds", arith::to_string(q.holds)}});
  j["newton_solution_in_ball"] = nb;
  return j;
}

std::string c3_uniqueness_reach(int side, int digits, double hi) {
  assert(side == 1 || side == -1);
  auto ok = [&](double x) {
    char buf[64];
    std::snprintf(buf, sizeof buf, "%.*g", digits + 2, side * x);
    CertifyRequest req;
    req.R_lo = req.R_hi = buf;
    const CertifyOutcome o = certify_berman(req);
    return c3_uniqueness_from_newton(o, arith::from_decimal<Id>(buf)).direct.certified;
  };
  double lo = 0;
  const double tol = std::pow(10.0, -digits) * 0.5;
  while (hi - lo > tol * std::max(lo, 1e-3)) {
    const double m = lo + (hi - lo) / 2;
    (ok(m) ? lo : hi) = m;
  }
  // Largest decimal with `digits` significant digits ≤ lo that still certifies.
  const double scale = std::pow(10.0, digits - 1 - static_cast<int>(std::floor(std::log10(std::max(lo, 1e-300)))));
  for (long n = static_cast<long>(std::floor(lo * scale)); n > 0; --n)
    if (ok(static_cast<double>(n) / scale)) return fmt_g(side * static_cast<double>(n) / scale, digits);
  return "0";
}

}  // namespace porecert::proof
