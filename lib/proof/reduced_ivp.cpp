#include "proof/reduced_ivp.hpp"

#include <algorithm>
#include <cmath>
#include <cstdlib>
#include <functional>
#include <optional>

#include "arith/fp_env.hpp"
#include "candidate/reduced_shooting.hpp"
#include "model/berman_reduced.hpp"
#include "proof/lohner.hpp"

namespace porecert::proof {

using arith::Id;
using arith::Im;
using arith::Interval;
using arith::Mpfr;

namespace {

enum class Part { none, integration, bracket, uniqueness };

template <Interval I>
bool subset_of(const I& a, const I& b) {  // a ⊆ b
  return b.lower() <= a.lower() && a.upper() <= b.upper();
}
template <Interval I>
int sgn(const I& x) {  // +1 / −1 when surely so, 0 when unsure
  if (x.lower() > 0) return 1;
  if (x.upper() < 0) return -1;
  return 0;
}
template <Interval I>
I hull2(const I& a, const I& b) {
  return boost::numeric::hull(a, b);
}
// log |x| upper bound of the magnitude (for step-size heuristics only; never a bound).
template <Interval I>
double log_mag(const I& x) {
  if constexpr (std::is_same_v<I, Id>) {
    const double m = arith::mag_up(x);
    return m > 0 ? std::log(m) : -1e300;
  } else {
    const Mpfr& a = x.lower();
    const Mpfr& b = x.upper();
    auto lg = [](const Mpfr& v) {
      if (mpfr_zero_p(v.get())) return -1e300;
      long e = 0;
      const double d = mpfr_get_d_2exp(&e, v.get(), MPFR_RNDN);
      return std::log(std::fabs(d)) + static_cast<double>(e) * std::log(2.0);
    };
    return std::max(lg(a), lg(b));
  }
}

template <Interval I>
struct StepData {
  double t0 = 0, t1 = 0;
  I H;                              // enclosure of t1 − t0
  std::array<std::vector<I>, 8> c;  // Taylor coefficients at t0, orders 0..p
  std::array<I, 8> E;               // order p+1 coefficient over the step (remainder)
  std::array<I, 8> B;               // state over [t0, t1]
  std::array<I, 8> y1;              // state at t1
  // Lohner data (S14), when the run keeps a QR representation: the state at t0 is in x̂ + A r; cc
  // the Taylor coefficients at x̂, Dc[(i N + j)(p + 1) + k] the gradient of coefficient k of
  // component i over the hull of the set, N = components + 1 (s).
  int N = 0;
  std::array<std::vector<I>, 8> cc;
  std::vector<I> Dc;
  std::vector<double> A;
  std::vector<I> r;
};

template <Interval I>
struct Run {
  bool ok = false;
  std::string failure;
  std::vector<StepData<I>> steps;
  std::vector<std::pair<int, int>> zero_runs;  // step ranges holding the counted zeros of g'
  std::vector<int> sign_after;                 // sign of g' after each counted zero
};

template <Interval I>
void coefficients(const model::ReducedState<I>& y, const I& t, const I& s, int eps, bool var, int p,
                  std::array<std::vector<I>, 8>& c) {
  std::vector<I> Z, V;
  model::reduced_taylor<I>(y, t, s, eps, var, p + 4, Z, V);
  for (int j = 0; j < 8; ++j) {
    c[j].clear();
    if (j >= 4 && !var) continue;
    for (int k = 0; k <= p + 1; ++k)
      c[j].push_back(j < 4 ? model::derivative_coefficient(Z, j, k) : model::derivative_coefficient(V, j - 4, k));
  }
}

template <Interval I>
I horner(const std::vector<I>& c, int p, const I& tau) {
  I r = c[p];
  for (int k = p - 1; k >= 0; --k) r = r * tau + c[k];
  return r;
}

template <Interval I>
I tau_pow(const I& tau, int n) {
  I r(1);
  for (int i = 0; i < n; ++i) r = r * tau;
  return r;
}

// One validated step (docs/method.md (S9)): the high-order a-priori enclosure
//     P(τ) + [0,H]^{p+1} E' ⊂ int B  with E' = c_{p+1}(B, [t0, t1]) ⊆ E  and  B = P + [0,H]^{p+1} E + slack,
// after which y(t0 + τ) ∈ Σ_k c_k τ^k + τ^{p+1} E' for every τ in [0, H] (Lagrange remainder).
template <Interval I>
bool try_step(const model::ReducedState<I>& y0, const std::array<std::vector<I>, 8>& c0, double t0, double t1,
              const I& s, int eps, bool var, int p, StepData<I>& out) {
  const int nc = var ? 8 : 4;
  out.t0 = t0;
  out.t1 = t1;
  out.H = I(t1) - I(t0);
  const I Hb = arith::make_unchecked<I>(arith::unchecked, arith::scalar_of<I>(0), out.H.upper());
  const I Hq = tau_pow(Hb, p + 1);
  std::array<I, 8> P, E;
  for (int j = 0; j < nc; ++j) {
    P[j] = horner(c0[j], p, Hb);
    E[j] = c0[j][p + 1] * I(-1.0, 3.0);
  }
  const I T = hull2(I(t0), I(t1));
  std::array<std::vector<I>, 8> cB;
  for (int iter = 0; iter < 14; ++iter) {
    model::ReducedState<I> B{};
    for (int j = 0; j < nc; ++j) {
      const I slack = P[j] * I(-0x1p-40, 0x1p-40) + I(-1e-300, 1e-300);
      B[j] = P[j] + Hq * E[j] + slack;
    }
    coefficients(B, T, s, eps, var, p, cB);
    bool ok = true;
    for (int j = 0; j < nc; ++j) ok = ok && subset_of(cB[j][p + 1], E[j]);
    if (ok) {
      for (int j = 0; j < nc; ++j) {
        out.E[j] = cB[j][p + 1];
        out.B[j] = P[j] + Hq * out.E[j];
        out.y1[j] = horner(c0[j], p, out.H) + tau_pow(out.H, p + 1) * out.E[j];
        out.c[j] = c0[j];
      }
      return true;
    }
    for (int j = 0; j < nc; ++j) {
      I e = hull2(E[j], cB[j][p + 1]);
      E[j] = e + (e - e) * I(0.5);
    }
  }
  return false;
}

// Pointwise enclosure of component j at t in the interval tt (within the step).
template <Interval I>
I eval_in_step(const StepData<I>& st, int j, int p, const I& tt) {
  const I zero(0);
  I tau = tt - I(st.t0);
  const I lo = arith::make_unchecked<I>(arith::unchecked, arith::scalar_of<I>(0), st.H.upper());
  tau = boost::numeric::intersect(tau, lo);
  const I plain = horner(st.c[j], p, tau) + tau_pow(tau, p + 1) * st.E[j];
  if (st.N == 0) return plain;
  // Mean-value form about the centre (S14) at τ: Ψ_τ(x̂) + τ^{p+1} E + (DΨ_τ A) r.
  const int N = st.N;
  I acc = horner(st.cc[j], p, tau) + tau_pow(tau, p + 1) * st.E[j];
  std::vector<I> Jrow(N);
  for (int q = 0; q < N; ++q) {
    I a = st.Dc[(j * N + q) * (p + 1) + p];
    for (int k = p - 1; k >= 0; --k) a = a * tau + st.Dc[(j * N + q) * (p + 1) + k];
    Jrow[q] = a;
  }
  for (int m = 0; m < N; ++m) {
    I jm(0);
    for (int q = 0; q < N; ++q)
      if (st.A[q * N + m] != 0.0) jm = jm + Jrow[q] * I(st.A[q * N + m]);
    acc = acc + jm * st.r[m];
  }
  assert(boost::numeric::overlap(acc, plain));
  return boost::numeric::intersect(acc, plain);
}

// State enclosure at every t in tt, from the steps of run range [a, b] that meet tt.
template <Interval I>
std::array<I, 8> eval_at(const Run<I>& run, int a, int b, int nc, int p, const I& tt) {
  std::array<I, 8> r{};
  bool any = false;
  for (int i = a; i <= b; ++i) {
    const auto& st = run.steps[i];
    if (tt.upper() < st.t0 || tt.lower() > st.t1) continue;
    const I part = boost::numeric::intersect(tt, hull2(I(st.t0), I(st.t1)));
    for (int j = 0; j < nc; ++j) {
      const I v = eval_in_step(st, j, p, part);
      r[j] = any ? hull2(r[j], v) : v;
    }
    any = true;
  }
  assert(any && "eval_at: point outside the run");
  return r;
}

// n intervals whose union covers x (consecutive pieces share an enclosed endpoint).
template <Interval I>
std::vector<I> pieces(const I& x, int n) {
  if (n <= 1) return {x};
  std::vector<I> out;
  const I lo(x.lower()), w = I(x.upper()) - I(x.lower());
  I prev = lo;
  for (int i = 1; i <= n; ++i) {
    const I next = i == n ? I(x.upper()) : lo + w * I(i) / I(n);
    out.push_back(hull2(prev, next));
    prev = next;
  }
  return out;
}
template <Interval I>
double rel_width(const I& x) {
  const double m = arith::mag_up(x);
  return m > 0 ? arith::width_up(x) / m : 0;
}

// Magnitude and width of an interval, as intervals (no double overflow for MPFR magnitudes).
template <Interval I>
I mag(const I& x) {
  return I(boost::numeric::norm(x));
}
template <Interval I>
I wid(const I& x) {
  return I(x.upper()) - I(x.lower());
}

struct Settings {
  bool lohner = false;  // QR representation between steps (S13)-(S15); used where the fast mode decays (ε = −1)
  int p = 24;
  double log_tol = std::log(1e-17);
  double t_max = 1000;
  int max_steps = 10000;  // type III at R = 1000 takes 2070 steps, types I/II there 179
};

// The Lohner step (S14) for the extended state X = (y, s) (n = nc + 1; s' = 0): with Ψ(X) the Taylor
// polynomial of the step at H, y(t1) ∈ Ψ(x̂) + H^{p+1} E + DΨ(hull) A r, DΨ by dual numbers over the
// hull of the set (the segment from x̂ to every point of the set lies in it). Returns the new set;
// the caller intersects its hull with the plain enclosure of the step.
template <Interval I, int N>
lohner::Set<I> lohner_step(const lohner::Set<I>& set, StepData<I>& st, int eps, bool var, int p) {
  using D = lohner::Dual<I, N>;
  const int nc = N - 1;
  assert((var ? 8 : 4) == nc);
  const std::vector<I> Yh = lohner::hull(set);
  // Point coefficients at the centre.
  model::ReducedState<I> yc{};
  for (int j = 0; j < 8; ++j) yc[j] = j < nc ? set.x[j] : I(0);
  std::array<std::vector<I>, 8> cc;
  coefficients(yc, I(st.t0), set.x[nc], eps, var, p, cc);
  // Dual coefficients over the hull.
  model::ReducedState<D> yd{};
  for (int j = 0; j < 8; ++j) yd[j] = j < nc ? D::variable(Yh[j], j) : D(0);
  const D sd = D::variable(Yh[nc], nc);
  std::vector<D> Z, V;
  model::reduced_taylor<D>(yd, D(I(st.t0)), sd, eps, var, p + 4, Z, V);
  std::vector<I> v(N), M(N * N, I(0));
  std::vector<I> J(N * N, I(0));
  st.N = N;
  st.cc = cc;
  st.A = set.A;
  st.r = set.r;
  st.Dc.assign(N * N * (p + 1), I(0));
  for (int i = 0; i < nc; ++i) {
    I acc = cc[i][p];
    for (int k = p - 1; k >= 0; --k) acc = acc * st.H + cc[i][k];
    v[i] = acc + tau_pow(st.H, p + 1) * st.E[i];
    for (int j = 0; j < N; ++j) {
      auto coef = [&](int k) {
        const D& c = i < 4 ? Z[k + i] : V[k + i - 4];
        long f = 1;
        for (int q = 1; q <= (i < 4 ? i : i - 4); ++q) f *= (k + q);
        return c.grad(j) * I(f);
      };
      for (int k = 0; k <= p; ++k) st.Dc[(i * N + j) * (p + 1) + k] = coef(k);
      I a = coef(p);
      for (int k = p - 1; k >= 0; --k) a = a * st.H + coef(k);
      J[i * N + j] = a;
    }
  }
  v[nc] = set.x[nc];
  J[nc * N + nc] = I(1);
  for (int i = 0; i < N; ++i)
    for (int k = 0; k < N; ++k) {
      I acc(0);
      for (int j = 0; j < N; ++j)
        if (set.A[j * N + k] != 0.0) acc = acc + J[i * N + j] * I(set.A[j * N + k]);
      M[i * N + k] = acc;
    }
  return lohner::update<I>(v, M, set.r);
}

// Validated integration of (S5)(S6) from t = 0 with s in s, counting the zeros of g' = ε + s t²/2 + s u'
// (S8) until the nth; every zero is certified simple (g'' of one sign on its run of steps).
template <Interval I>
Run<I> integrate(const I& s, int eps, int nth, bool var, const Settings& cfg) {
  Run<I> run;
  const int nc = var ? 8 : 4;
  const int p = cfg.p;
  model::ReducedState<I> y{};
  for (auto& v : y) v = I(0);
  double t = 0;
  int sign_before = eps, run_first = -1, run_g2 = 0;
  bool in_run = false;
  std::array<std::vector<I>, 8> c0;
  lohner::Set<I> set;
  if (cfg.lohner) {
    std::vector<I> x0(nc + 1, I(0));
    x0[nc] = s;
    set = lohner::from_box<I>(x0);
  }
  while (t < cfg.t_max) {
    if (run.steps.size() >= static_cast<std::size_t>(cfg.max_steps)) {
      // A budget, not a claim: where g' keeps away from 0 and the fast mode is stiff (|g| large,
      // steps of about 1/|g|) the run would crawl on; failing is always sound (docs/method.md (S9)).
      run.failure = "more than " + std::to_string(cfg.max_steps) + " Taylor steps (reached t = " + std::to_string(t) +
                    ", last step " + std::to_string(run.steps.back().t1 - run.steps.back().t0) + ")";
      return run;
    }
    coefficients(y, I(t), s, eps, var, p, c0);
    // Step size from the last coefficients of z (heuristic; the proof checks the step).
    double lm = -1e300;
    for (int k = 0; k <= 8; ++k) lm = std::max(lm, log_mag(c0[0][k]));
    double h = 0.5;
    for (int k = p - 1; k <= p; ++k) {
      const double lc = log_mag(c0[0][k]);
      if (lc > -1e299) h = std::min(h, std::exp((cfg.log_tol + lm - lc) / k));
    }
    StepData<I> st;
    bool done = false;
    for (int attempt = 0; attempt < 24 && !done; ++attempt, h *= 0.5) {
      const double t1 = t + h;
      if (!(t1 > t)) break;
      if (!try_step(y, c0, t, t1, s, eps, var, p, st)) {
        continue;
      }
      // Keep the validated remainder H^{p+1}|E| near the truncation tolerance: the a-priori box
      // overestimates c_{p+1}, so the heuristic step alone can leave a wide remainder.
      {
        const double lh = (p + 1) * std::log(arith::upper_up(st.H));
        double excess = lh + log_mag(st.E[0]) - (cfg.log_tol + lm);
        // With the QR representation the widths no longer wrap, so the remainders of u', u'', u'''
        // (larger than that of u by about (rate/H)^j) decide the width: keep each near its tolerance.
        for (int j = 1; cfg.lohner && j < 4; ++j) {
          double lmj = -1e300;
          for (int k = 0; k <= 8; ++k) lmj = std::max(lmj, log_mag(c0[j][k]));
          excess = std::max(excess, lh + log_mag(st.E[j]) - (cfg.log_tol + lmj));
        }
        if (excess > std::log(16.0) && attempt < 16) {
          h = 2 * h * std::max(0.05, std::exp(-excess / (p + 1)));  // the loop halves it again
          continue;
        }
      }
      const I T = hull2(I(t), I(t1));
      const int g1b = sgn(model::reduced_g(1, T, s, eps, st.B[1]));
      const int g2b = sgn(model::reduced_g(2, T, s, eps, st.B[2]));
      if ((in_run || g1b == 0) && (g2b == 0 || (in_run && g2b != run_g2))) {
        continue;  // zero not isolated yet
      }
      done = true;
      if (cfg.lohner) {
        try {
          set = var ? lohner_step<I, 9>(set, st, eps, var, p) : lohner_step<I, 5>(set, st, eps, var, p);
        } catch (const std::runtime_error& e) {
          run.failure = "QR (Lohner) step at t = " + std::to_string(t) + " failed: " + e.what();
          return run;
        }
        const std::vector<I> Y = lohner::hull(set);
        for (int j = 0; j < nc; ++j) {
          assert(boost::numeric::overlap(Y[j], st.y1[j]) && "Lohner and plain enclosures of one state are disjoint");
          st.y1[j] = boost::numeric::intersect(Y[j], st.y1[j]);
        }
      }
      const int idx = static_cast<int>(run.steps.size());
      run.steps.push_back(st);
      if (!in_run && g1b == 0) {
        in_run = true;
        run_first = idx;
        run_g2 = g2b;
      }
      if (in_run) {
        const int se = sgn(model::reduced_g(1, I(t1), s, eps, st.y1[1]));
        if (se != 0) {
          in_run = false;
          if (se != sign_before) {
            run.zero_runs.push_back({run_first, idx});
            run.sign_after.push_back(se);
            sign_before = se;
            if (static_cast<int>(run.zero_runs.size()) == nth) {
              run.ok = true;
              return run;
            }
          }
        }
      }
      for (int j = 0; j < nc; ++j) y[j] = st.y1[j];
      t = t1;
    }
    if (!done) {
      run.failure = "Taylor step at t = " + std::to_string(t) +
                    " could not be validated (a-priori enclosure or zero isolation of g' failed)";
      return run;
    }
  }
  run.failure =
      "g' has fewer than " + std::to_string(nth) + " certified zeros on [0, " + std::to_string(cfg.t_max) + "]";
  return run;
}

// Boxes of g, g', g'', g''', g'''' over a step (S4), g'''' = g g''' − g' g'' from (S1).
template <Interval I>
std::array<I, 5> g_boxes(const StepData<I>& st, const I& T, const I& s, int eps) {
  std::array<I, 5> G;
  for (int k = 0; k < 4; ++k) G[k] = model::reduced_g(k, T, s, eps, st.B[k]);
  G[4] = G[0] * G[3] - G[1] * G[2];
  return G;
}

// Direct tube bound (S11) of a run with s in s and σ in sig: per step and k, half the width of the
// pointwise enclosure of f^(k) = σ^{k+1} g^(k)(σ η)/R — coefficient and remainder widths of u^(k),
// the s-dependence at fixed u (∂g^(k)/∂s|_u · width s) and the shift t = σ η (|g^(k+1)| · width σ).
template <Interval I>
std::array<I, 4> tube_direct(const Run<I>& run, const I& s, const I& sig, const I& R, int eps, int p) {
  std::array<I, 4> out{I(0), I(0), I(0), I(0)};
  const I wS = wid(sig), ws = wid(s);
  for (const auto& st : run.steps) {
    if (st.t0 > sig.upper()) break;
    const I T = hull2(I(st.t0), I(st.t1));
    const I H(st.H.upper());
    const auto G = g_boxes(st, T, s, eps);
    for (int k = 0; k < 4; ++k) {
      I wz(0), Hm(1);
      for (int m = 0; m <= p; ++m) {
        wz = wz + wid(st.c[k][m]) * Hm;
        Hm = Hm * H;
      }
      wz = wz + wid(st.E[k]) * Hm;
      const I dsG = k == 0   ? T * T * T / I(6) + st.B[0]
                    : k == 1 ? T * T / I(2) + st.B[1]
                    : k == 2 ? T + st.B[2]
                             : I(1) + st.B[3];
      const I wg = mag(dsG) * ws + mag(s) * wz + mag(G[k + 1]) * wS;
      I fac = sig / R;
      for (int i = 0; i < k; ++i) fac = fac * sig;
      const I w = (mag(fac) * wg + mag(G[k]) * wid(fac)) / I(2);
      if (out[k].upper() < w.upper()) out[k] = I(w.upper());
    }
  }
  return out;
}

// Narrows the interval holding the zero of g' of the given run (monotone there) by bisection on
// pointwise enclosures; returns Σ with the zero in its interior.
template <Interval I>
I isolate_zero(const Run<I>& run, int zi, const I& s, int eps, int p) {
  const auto [a_idx, b_idx] = run.zero_runs[zi];
  const int before = zi == 0 ? eps : run.sign_after[zi - 1];
  const int after = run.sign_after[zi];
  double a = run.steps[a_idx].t0, b = run.steps[b_idx].t1;
  for (int it = 0; it < 200; ++it) {
    const double m = 0.5 * (a + b);
    if (!(m > a && m < b)) break;
    const I mm(m);
    const int sg = sgn(model::reduced_g(1, mm, s, eps, eval_at(run, a_idx, b_idx, 4, p, mm)[1]));
    if (sg == before)
      a = m;
    else if (sg == after)
      b = m;
    else
      break;
  }
  return hull2(I(a), I(b));
}

template <Interval I>
I read_interval(const std::string& lo, const std::string& hi) {
  return hull2(arith::from_decimal<I>(lo), arith::from_decimal<I>(hi));
}

template <Interval I>
std::string dec_lo(const I& x) {
  return arith::decimal_lower(x);
}
template <Interval I>
std::string dec_hi(const I& x) {
  return arith::decimal_upper(x);
}

// R(s) = σ g(σ) (S3) at the nth zero σ of g' for every s in s (thin in use), and σ itself: the
// validated run (S9) (with the QR set (S13)-(S15) when cfg.lohner), σ isolated by bisection (S8),
// R by the mean-value form about the midpoint of Σ intersected with the direct product. Returns ""
// or the failure of the run; the enclosures are set only on success.
template <Interval I>
std::string R_at(const I& s, int eps, int nth, const Settings& cfg, I* out_R, I* out_sig, I* out_g2 = nullptr) {
  const Run<I> run = integrate(s, eps, nth, false, cfg);
  if (!run.ok) return run.failure;
  const I sig = isolate_zero(run, nth - 1, s, eps, cfg.p);
  const auto [a, b] = run.zero_runs[nth - 1];
  const auto st = eval_at(run, a, b, 4, cfg.p, sig);
  // d/dσ σ g = g + σ g'; the direct form adds the widths of the parts of g over Σ.
  const I sm(boost::numeric::median(sig));
  const auto ym = eval_at(run, a, b, 4, cfg.p, sm);
  const I slope = model::reduced_g(0, sig, s, eps, st[0]) + sig * model::reduced_g(1, sig, s, eps, st[1]);
  *out_R = boost::numeric::intersect(sig * model::reduced_g(0, sig, s, eps, st[0]),
                                     sm * model::reduced_g(0, sm, s, eps, ym[0]) + slope * (sig - sm));
  *out_sig = sig;
  if (out_g2) *out_g2 = model::reduced_g(2, sig, s, eps, st[2]);
  return "";
}

Settings settings_for(int eps, int bits) {
  Settings cfg;
  if (bits > 53) {
    cfg.p = std::max(24, bits / 3);
    cfg.log_tol = std::min(std::log(1e-17), -0.75 * bits * std::log(2.0));
  }
  cfg.lohner = eps < 0;  // the fast mode decays: plain intervals wrap (S13)
  return cfg;
}

// What a variational run over a piece P of s tells step 3 of the proof (values, tube, structure).
template <Interval I>
struct PieceView {
  std::array<I, 4> dv;  // d/ds of the values over P (numerator over the R interval)
  std::array<I, 4> vp;  // values over P: mean-value form about its midpoint, or the direct hull
  std::array<I, 4> ds_sup{I(0), I(0), I(0), I(0)};  // sup over η of |∂f^(k)/∂s| over P (S11)
  std::array<I, 4> tube;                            // tube half-widths about P's own centre (S11)
  std::vector<arith::Id> prof_f, prof_fp;
  Structure structure;
  int steps = 0;
  I piece;
};

struct Proved {
  ReducedResult r;
  Part part = Part::none;
};

template <Interval I>
Proved prove_impl(const std::string& R_lo, const std::string& R_hi, int eps, int nth, const std::string& sa,
                  const std::string& sb, const std::string& SA, const std::string& SB, int bits) {
  Proved out;
  ReducedResult& r = out.r;
  r.eps = eps;
  r.nth = nth;
  r.precision_bits = bits;
  r.s_lo = sa;
  r.s_hi = sb;
  r.S_lo = SA;
  r.S_hi = SB;
  const Settings cfg = settings_for(eps, std::is_same_v<I, Im> ? bits : 53);
  r.order = cfg.p;
  const I R = read_interval<I>(R_lo, R_hi);
  const I s_a = arith::from_decimal<I>(sa), s_b = arith::from_decimal<I>(sb);
  const I S_a = arith::from_decimal<I>(SA), S_b = arith::from_decimal<I>(SB);
  const int sR = sgn(R);
  auto fail = [&](Part part, const std::string& why) {
    out.part = part;
    r.failure = why;
    r.log.push_back("not certified: " + why);
    return out;
  };
  if (sR == 0)
    return fail(Part::bracket, "R = [" + R_lo + ", " + R_hi + "] contains 0: the reduced method needs R != 0");
  if (!(s_a.upper() < s_b.lower()) || !(S_a.upper() <= s_a.lower()) || !(s_b.upper() <= S_b.lower()))
    return fail(Part::bracket, "endpoints not ordered: need S_lo <= s_lo < s_hi <= S_hi");
  const I s_ab = hull2(s_a, s_b), S = hull2(S_a, S_b);
  if (sgn(S) == 0) return fail(Part::uniqueness, "the uniqueness set S contains s = 0");

  // 1. R at the bracket ends (thin s).
  I Ra, Rb, sig_a, sig_b, g2_a, g2_b;  // σ and g''(σ) at the ends serve the values (step 3)
  if (auto e = R_at<I>(s_a, eps, nth, cfg, &Ra, &sig_a, &g2_a); !e.empty())
    return fail(Part::integration, "at s_lo: " + e);
  if (auto e = R_at<I>(s_b, eps, nth, cfg, &Rb, &sig_b, &g2_b); !e.empty())
    return fail(Part::integration, "at s_hi: " + e);
  r.R_at_s_lo = arith::to_id(Ra);
  r.R_at_s_hi = arith::to_id(Rb);
  const bool up = Ra.upper() < R.lower() && R.upper() < Rb.lower();
  const bool down = Rb.upper() < R.lower() && R.upper() < Ra.lower();
  if (!up && !down) {
    char buf[300];
    std::snprintf(buf, sizeof buf,
                  "bracket: R(s_lo) in [%.17g, %.17g] and R(s_hi) in [%.17g, %.17g] do not straddle R = [%s, %s]",
                  r.R_at_s_lo.lower(), r.R_at_s_lo.upper(), r.R_at_s_hi.lower(), r.R_at_s_hi.upper(), R_lo.c_str(),
                  R_hi.c_str());
    return fail(Part::bracket, buf);
  }
  r.log.push_back("bracket: R(s_lo), R(s_hi) straddle R (intermediate value theorem, (S10)); width of R(s_lo) " +
                  std::to_string(arith::width_up(Ra)));

  // Numerators of the values (S3): R f'(0) = ε σ², R f'''(0) = σ⁴ s, R f''(1) = σ³ g''(σ), R K = σ⁴ (1 + s).
  auto numerators = [&](const I& sig, const I& s, const I& g2) {
    const I q2 = sig * sig, q3 = q2 * sig, q4 = q2 * q2;
    return std::array<I, 4>{I(eps) * q2, q4 * s, q3 * g2, q4 * (I(1) + s)};
  };
  // What one variational run over a piece P of s gives for step 3: derivatives and direct hulls of
  // the values, the tube's ingredients, profile samples and the sign structure. with_mid: also the
  // mean-value form about the piece's midpoint (one more run without the variational part).
  auto view_of = [&](const Run<I>& run, const I& P, bool with_mid, PieceView<I>& v) -> std::string {
    v.steps = static_cast<int>(run.steps.size());
    v.piece = P;
    const I sig = isolate_zero(run, nth - 1, P, eps, cfg.p);
    const auto [za, zb] = run.zero_runs[nth - 1];
    const auto yv = eval_at(run, za, zb, 8, cfg.p, sig);
    const I g2 = model::reduced_g(2, sig, P, eps, yv[2]), g3 = model::reduced_g(3, sig, P, eps, yv[3]);
    if (sgn(g2) == 0) return "g'' may vanish where g' does (over a piece of the bracket)";
    const I dg1 = model::reduced_g_ds(1, sig, yv[1], yv[5]);
    const I sp = I(0) - dg1 / g2;  // σ'(s), (S8)
    const I dg2 = model::reduced_g_ds(2, sig, yv[2], yv[6]);
    const I p2 = sig * sig, p3 = p2 * sig, p4 = p2 * p2;
    v.dv = {I(2 * eps) * sig * sp / R, (I(4) * p3 * sp * P + p4) / R, (p3 * (g3 * sp + dg2) - I(3) * p2 * dg1) / R,
            (I(4) * p3 * sp * (I(1) + P) + p4) / R};
    const auto Nh = numerators(sig, P, g2);
    std::array<I, 4> vh;  // direct hull over P
    for (int k = 0; k < 4; ++k) vh[k] = v.vp[k] = Nh[k] / R;
    std::array<I, 4> thin_m;
    const I pm(boost::numeric::median(P));
    if (with_mid) {
      // (S12): V(s) ∈ V(s_m) + V'(P) (P − s_m); a plain hull over s would lose the correlation of σ and s.
      const Run<I> mrun = integrate(pm, eps, nth, false, cfg);
      if (!mrun.ok) return "at a piece's midpoint: " + mrun.failure;
      const I sig_m = isolate_zero(mrun, nth - 1, pm, eps, cfg.p);
      const auto [ma, mb] = mrun.zero_runs[nth - 1];
      const auto ym = eval_at(mrun, ma, mb, 4, cfg.p, sig_m);
      const auto Nm = numerators(sig_m, pm, model::reduced_g(2, sig_m, pm, eps, ym[2]));
      for (int k = 0; k < 4; ++k) v.vp[k] = boost::numeric::intersect(Nm[k] / R + v.dv[k] * (P - pm), vh[k]);
      thin_m = tube_direct(mrun, pm, sig_m, R, eps, cfg.p);
    }
    const auto direct = tube_direct(run, P, sig, R, eps, cfg.p);
    // sup |∂f^(k)/∂s| over the steps up to the wall, f^(k) = σ^{k+1} g^(k)(σ η)/R (S11).
    for (const auto& st : run.steps) {
      if (st.t0 > sig.upper()) break;
      const I T = hull2(I(st.t0), I(st.t1));
      const auto G = g_boxes(st, T, P, eps);
      for (int k = 0; k < 4; ++k) {
        I sk(1);
        for (int i = 0; i < k; ++i) sk = sk * sig;
        const I dgk = model::reduced_g_ds(k, T, st.B[k], st.B[4 + k]);
        const I d = mag((I(k + 1) * sk * sp * G[k] + sk * sig * (G[k + 1] * (T / sig) * sp + dgk)) / R);
        if (v.ds_sup[k].upper() < d.upper()) v.ds_sup[k] = I(d.upper());
      }
    }
    // Tube half-widths (S11): the smaller of (a) the direct bound at the piece's midpoint plus
    // sup |∂f^(k)/∂s| · |s − s_m| over the piece (a sup of a sum is at most the sum of the sups) and
    // (b) the direct bound over the piece.
    const I half = mag(P - pm);
    for (int k = 0; k < 4; ++k) {
      v.tube[k] = direct[k];
      if (with_mid) {
        const I a = thin_m[k] + v.ds_sup[k] * half;
        if (a.upper() < direct[k].upper()) v.tube[k] = a;
      }
    }
    // Profile samples for reports (docs/certificate.md): f(η_i), f'(η_i) at η_i = i/128,
    // f = σ g(σ η)/R, f' = σ² g'(σ η)/R.
    for (int i = 0; i <= kProfileSamples; ++i) {
      const I eta = I(i) / I(kProfileSamples);
      const I tt = sig * eta;
      const auto y = eval_at(run, 0, static_cast<int>(run.steps.size()) - 1, 4, cfg.p, tt);
      v.prof_f.push_back(arith::to_id(sig * model::reduced_g(0, tt, P, eps, y[0]) / R));
      v.prof_fp.push_back(arith::to_id(sig * sig * model::reduced_g(1, tt, P, eps, y[1]) / R));
    }
    // Structure and flow reversal (sign f^(k) = sign R · sign g^(k)).
    Structure& S_ = v.structure;
    const int fp0 = eps * sR;
    std::vector<I> zeros;
    for (int zi = 0; zi < nth; ++zi) zeros.push_back(isolate_zero(run, zi, P, eps, cfg.p) / sig);
    if (fp0 < 0) {
      S_.label = "III";
      S_.reason = "f'(0) = eps sigma^2 / R < 0 (reduced chart eps = " + std::to_string(eps) + ")";
      S_.reversal = arith::Tri::yes;
      S_.reversal_where.push_back({0.0, nth == 1 ? 1.0 : arith::lower_down(zeros[0])});
    } else {
      if (nth == 1) {
        S_.reversal = arith::Tri::no;
      } else {
        S_.reversal = arith::Tri::yes;
        S_.reversal_where.push_back({arith::upper_up(zeros[0]), arith::lower_down(zeros[1])});
      }
      bool neg_pp = true, initial = true;
      for (const auto& sp : run.steps) {
        if (sp.t0 > sig.upper()) break;
        const I T = hull2(I(sp.t0), I(sp.t1));
        const int q2 = sR * sgn(model::reduced_g(2, T, P, eps, sp.B[2]));
        if (q2 < 0) {
          initial = false;
          continue;
        }
        if (q2 == 0 && initial && sR * sgn(model::reduced_g(3, T, P, eps, sp.B[3])) < 0) continue;
        neg_pp = false;
        break;
      }
      if (neg_pp && nth == 1) {
        S_.label = "I";
        S_.reason =
            "f''' < 0 near the centre plane and f'' < 0 on the rest of (0,1] (certified step by step), f'(0) > 0";
      } else {
        S_.label = "unclassified";
        for (const auto& sp : run.steps) {
          if (sp.t1 > sig.lower()) break;
          if (sR * sgn(model::reduced_g(2, I(sp.t1), P, eps, sp.y1[2])) > 0) {
            S_.label = "II";
            char buf[160];
            std::snprintf(buf, sizeof buf, "f'(0) > 0 and f'' > 0 at eta = t/sigma with t = %.6g", sp.t1);
            S_.reason = buf;
            break;
          }
        }
      }
    }
    return "";
  };

  // 2. Monotonicity of R(s) on S (uniqueness) with the variational equation (S6), S split into
  // pieces when one run over all of S cannot isolate the zeros of g'. A piece that fails is split
  // in four; the pieces that succeed are kept. The runs of pieces that meet the bracket also give
  // the values (step 3), so a wide bracket needs no second set of variational runs.
  std::vector<PieceView<I>> uviews;
  const int fresh_n = std::clamp(static_cast<int>(rel_width(s_ab) / 1e-6), 1, 64);
  auto slope_on = [&](const I& Sp, I* d_out, Run<I>* keep) -> std::string {
    *keep = integrate(Sp, eps, nth, true, cfg);
    const Run<I>& run = *keep;
    if (!run.ok) return "over S: " + run.failure;
    // dR/ds (S8) at the zeros of g' for all s in the piece: Σ by bisection, the state there pointwise.
    const I sigS = isolate_zero(run, nth - 1, Sp, eps, cfg.p);
    const auto [a, b] = run.zero_runs[nth - 1];
    const auto y = eval_at(run, a, b, 8, cfg.p, sigS);
    const I g = model::reduced_g(0, sigS, Sp, eps, y[0]);
    const I gpp = model::reduced_g(2, sigS, Sp, eps, y[2]);
    if (sgn(gpp) == 0) return "g'' may vanish where g' does (over S)";
    *d_out =
        I(0) - model::reduced_g_ds(1, sigS, y[1], y[5]) * g / gpp + sigS * model::reduced_g_ds(0, sigS, y[0], y[4]);
    return "";
  };
  int n_unique = 0;  // pieces of S used
  bool views_cover = true;
  {
    std::string why;
    I d;
    // piece, depth (depth 2: a sixteenth of S). When S is the bracket and the bracket is wide, the
    // values' pieces (below) serve the uniqueness too.
    std::vector<std::pair<I, int>> todo{{S, 0}};
    if (fresh_n > 1 && S.lower() == s_ab.lower() && S.upper() == s_ab.upper()) {
      todo.clear();
      const auto parts = pieces(S, fresh_n);
      for (auto it = parts.rbegin(); it != parts.rend(); ++it) todo.push_back({*it, 2});
    }
    bool first = true;
    while (!todo.empty()) {
      const auto [Sp, depth] = todo.back();
      todo.pop_back();
      I di;
      Run<I> run;
      std::string e = slope_on(Sp, &di, &run);
      if (e.empty() && sgn(di) == 0 && depth < 2) e = "dR/ds may vanish on the piece";
      if (!e.empty()) {
        if (depth >= 2) {
          why = e;
          break;
        }
        auto sub = pieces(Sp, 4);
        for (auto it = sub.rbegin(); it != sub.rend(); ++it) todo.push_back({*it, depth + 1});
        continue;
      }
      if (boost::numeric::overlap(Sp, s_ab)) {
        PieceView<I> v;
        if (!view_of(run, Sp, true, v).empty()) views_cover = false;
        uviews.push_back(std::move(v));
      }
      d = first ? di : hull2(d, di);
      first = false;
      ++n_unique;
      if (sgn(d) == 0) {
        char buf[200];
        std::snprintf(buf, sizeof buf, "uniqueness: dR/ds over S in [%.3g, %.3g] may vanish", arith::to_id(d).lower(),
                      arith::to_id(d).upper());
        why = buf;
        break;
      }
    }
    if (!why.empty()) return fail(Part::uniqueness, why);
    r.log.push_back("uniqueness: dR/ds has one sign on S (" + std::to_string(n_unique) + " piece(s))");
    r.dR_ds = arith::to_id(d);
  }

  // 3. Values, tube and structure for s in [s_lo, s_hi] (S11), (S12), from variational runs over
  // pieces that cover the bracket, one per 1e-6 of its relative width and at most 64: those of
  // step 2 when there are as many, else fresh ones (the values widen fast with a piece's width).
  auto fresh_views = [&](std::vector<PieceView<I>>& out) -> std::string {
    out.clear();
    for (const I& P : pieces(s_ab, fresh_n)) {
      const Run<I> run = integrate(P, eps, nth, true, cfg);
      if (!run.ok) return "over [s_lo, s_hi]: " + run.failure;
      PieceView<I> v;
      if (auto e = view_of(run, P, true, v); !e.empty()) return e;
      out.push_back(std::move(v));
    }
    return "";
  };
  auto one_structure = [](const std::vector<PieceView<I>>& vs) {
    for (const auto& v : vs)
      if (v.structure.label != vs[0].structure.label || v.structure.reversal != vs[0].structure.reversal) return false;
    return true;
  };
  auto monotone = [](const std::vector<PieceView<I>>& vs, int k) {
    const int s0 = sgn(vs[0].dv[k]);
    for (const auto& v : vs)
      if (sgn(v.dv[k]) != s0) return false;
    return s0 != 0;
  };
  std::vector<PieceView<I>> views;
  bool from_unique = views_cover && !uviews.empty();
  const I fresh_w = wid(s_ab) / I(fresh_n) * I(1.0001);
  for (const auto& v : uviews) from_unique = from_unique && wid(v.piece).upper() <= fresh_w.lower();
  if (from_unique) {
    views = std::move(uviews);
    if (!one_structure(views)) {
      r.log.push_back("values: the pieces of S do not give one structure; the bracket's own pieces");
      from_unique = false;
    }
  }
  if (!from_unique)
    if (auto e = fresh_views(views); !e.empty()) return fail(Part::integration, e);

  const auto Na = numerators(sig_a, s_a, g2_a), Nb = numerators(sig_b, s_b, g2_b);
  int n_monotone = 0;
  for (int k = 0; k < 4; ++k) {
    I v = views[0].vp[k];
    for (const auto& w : views) v = hull2(v, w.vp[k]);
    // (S12') A value numerator whose derivative has one sign on pieces covering the bracket is
    // monotone there: its range is the hull of its values at s_lo and s_hi.
    // Both are widened by 2^-(bits - 24) relative (an interval of R only, a sweep box) so that a
    // re-proof at more bits, whose enclosures differ by rounding, lies inside (recheck compares by
    // containment; measured: 1.4e-11 relative at R = [300, 301], 53 against 64 bits).
    const I rel_pad(std::ldexp(1.0, -(std::is_same_v<I, Id> ? 53 : bits) + 24));
    if (fresh_n > 1) v = v + mag(v) * rel_pad * I(-1.0, 1.0);
    if (monotone(views, k)) {
      const I m = hull2(Na[k], Nb[k]) / R;
      v = boost::numeric::intersect(v, m + mag(m) * rel_pad * I(-1.0, 1.0));
      ++n_monotone;
    }
    r.value[k] = arith::to_id(v);
    r.value_lo[k] = dec_lo(v);
    r.value_hi[k] = dec_hi(v);
    // The tube's centre is that of the piece holding the solution's s (S11).
    r.c3_error[k] = 0;
    for (const auto& w : views) r.c3_error[k] = std::max(r.c3_error[k], arith::upper_up(w.tube[k]));
  }
  r.profile_f = views[0].prof_f;
  r.profile_fp = views[0].prof_fp;
  r.structure = views[0].structure;
  r.steps = views[0].steps;
  for (const auto& v : views)
    for (std::size_t i = 0; i < r.profile_f.size(); ++i) {
      r.profile_f[i] = hull2(r.profile_f[i], v.prof_f[i]);
      r.profile_fp[i] = hull2(r.profile_fp[i], v.prof_fp[i]);
    }
  if (!one_structure(views)) {
    r.structure = Structure{};
    r.structure.label = "unclassified";
    r.structure.reason = "the pieces of the bracket do not share one certified structure";
  }
  r.log.push_back("values: " + std::to_string(views.size()) + " piece(s) of " + (from_unique ? "S" : "the bracket") +
                  ", " + std::to_string(n_monotone) + " of 4 by monotonicity (S12')");
  r.certified = true;
  r.log.push_back("certified: " + std::to_string(r.steps) + " Taylor steps of order " + std::to_string(cfg.p));
  return out;
}

Proved prove_any(const std::string& R_lo, const std::string& R_hi, int eps, int nth, const std::string& sa,
                 const std::string& sb, const std::string& SA, const std::string& SB, int bits) {
  if (bits <= 53) return prove_impl<Id>(R_lo, R_hi, eps, nth, sa, sb, SA, SB, 53);
  arith::PrecisionScope scope(bits);
  return prove_impl<Im>(R_lo, R_hi, eps, nth, sa, sb, SA, SB, bits);
}

// Exact string of the long double x rounded to the working format (double or MPFR bits).
std::string exact_string(long double x, int bits) {
  if (bits <= 53) return arith::hex_exact(static_cast<double>(x));
  arith::PrecisionScope scope(bits);
  Mpfr m;
  mpfr_set_ld(m.get(), x, MPFR_RNDN);
  return arith::hex_exact(m);
}

}  // namespace

ReducedResult reduced_prove(const std::string& R_lo, const std::string& R_hi, int eps, int nth, const std::string& s_lo,
                            const std::string& s_hi, const std::string& S_lo, const std::string& S_hi,
                            int precision_bits) {
  return prove_any(R_lo, R_hi, eps, nth, s_lo, s_hi, S_lo, S_hi, precision_bits).r;
}

ReducedShotEnclosure reduced_R_of_s(const std::string& s, int eps, int nth, int precision_bits) {
  const arith::FpEnvScope fp_env;
  ReducedShotEnclosure out;
  auto run = [&]<Interval I>(I) {
    const Settings cfg = settings_for(eps, std::is_same_v<I, Im> ? precision_bits : 53);
    I R, sig;
    out.failure = R_at<I>(arith::from_decimal<I>(s), eps, nth, cfg, &R, &sig);
    out.ok = out.failure.empty();
    if (out.ok) {
      out.R = arith::to_id(R);
      out.sigma = arith::to_id(sig);
    }
  };
  if (precision_bits <= 53) {
    run(Id(0));
  } else {
    arith::PrecisionScope scope(precision_bits);
    run(Im(0));
  }
  return out;
}

long double reduced_guess(double R, int eps, int nth, int sign_s) {
  if (R < 0) return std::acos(-1.0L) / (2.0L * std::fabs(R));    // injection, f → sin(πη/2)
  if (nth == 1 && sign_s > 0 && R < 57) {
    // Type II below R = 57: log-log interpolation of s against R − 13.12 in our own measured candidates
    // (reduced shooting, not a source; s -> infinity as R falls to about 13.12). Only a Newton start.
    static constexpr double kR[] = {13.2185, 13.302, 13.5143, 14.1309, 15.0141, 16.5902,
                                    19.9419, 24.8533, 30.7803, 40.9946, 50.0063, 57.6671};
    static constexpr double kS[] = {365.04, 109.95, 24.533, 4.0552, 1.2214, 0.36788,
                                    0.082085, 0.018316, 0.0040868, 3.7074e-4, 4.54e-5, 7.5046e-6};
    constexpr int n = 12;
    const double x = std::log(std::max(R - 13.12, 0.05));
    int k = 0;
    while (k + 2 < n && x > std::log(kR[k + 1] - 13.12)) ++k;
    const double x0 = std::log(kR[k] - 13.12), x1 = std::log(kR[k + 1] - 13.12);
    const double y0 = std::log(kS[k]), y1 = std::log(kS[k + 1]);
    return std::exp(static_cast<long double>(y0 + (x - x0) * (y1 - y0) / (x1 - x0)));
  }
  if (nth == 1) return sign_s * std::exp(-std::fabs(R) / 4.4L);  // types I (s < 0) and II (s > 0), R large
  if (eps < 0 && nth == 2) {
    // Type III (f'(0) < 0, wall at the second zero of f'): log-log interpolation in our own measured
    // candidates (reduced shooting, not a source); beyond the table the end slopes. Only a start for
    // Newton: the proof checks whatever it converges to. Near the fold (R* ≈ 12.1651 at s ≈ 1.4711,
    // docs/branches.md) R(s) is quadratic in s: the start stays on the type III side, s < 1.4711.
    static constexpr double kR[] = {12.2838, 12.5573, 13.1208, 14.1645, 15.9651, 18.879, 23.2975, 29.5744,
                                    37.9558, 48.5541, 61.4062, 100,     200,     400,     1000};
    static constexpr double kS[] = {0.90484,  0.67032,  0.49659,  0.36788, 0.27253,  0.2019,  0.14957, 0.1108,
                                    0.082085, 0.060810, 0.045049, 0.0226,  0.00733,  0.00215, 0.000403};
    constexpr int n = 15;
    if (R < kR[0]) {
      const double q = std::sqrt(std::max(R - 12.1651, 0.0) / (kR[0] - 12.1651));
      return static_cast<long double>(1.4711 - (1.4711 - kS[0]) * std::min(q, 1.0));
    }
    int k = 0;
    while (k + 2 < n && R > kR[k + 1]) ++k;
    const double x = std::log(R), x0 = std::log(kR[k]), x1 = std::log(kR[k + 1]);
    const double y0 = std::log(kS[k]), y1 = std::log(kS[k + 1]);
    return std::exp(static_cast<long double>(y0 + (x - x0) * (y1 - y0) / (x1 - x0)));
  }
  return 0.05L;
}

ReducedResult reduced_certify(const std::string& R_lo, const std::string& R_hi, int eps, int nth, long double s_guess,
                              int precision_bits) {
  ReducedResult fail;
  fail.eps = eps;
  fail.nth = nth;
  const Id Rint = hull2(arith::from_decimal<Id>(R_lo), arith::from_decimal<Id>(R_hi));
  const long double Rmid = arith::mid_double(Rint);
  const candidate::ReducedBranch br{eps, nth};
  const auto sbar = candidate::reduced_solve(br, Rmid, s_guess);
  if (!sbar) {
    fail.failure =
        "no candidate: reduced shooting did not converge from s = " + std::to_string(static_cast<double>(s_guess));
    return fail;
  }
  const int bits = precision_bits != 0 ? precision_bits : (std::fabs(*sbar) > 1e-140L ? 53 : 128);
  const long double R0 = arith::lower_down(Rint), R1 = arith::upper_up(Rint);
  long double margin = (bits <= 53 ? 2e-14L : std::ldexp(1.0L, -std::min(bits, 60) + 10)) * (1 + std::fabs(Rmid));
  // A box's bracket reaches a hundredth of its width past each end, so that a neighbouring proof's
  // solution at the shared R falls inside S with room to spare (docs/sweep.md (S3'')).
  if (R1 > R0) margin = std::max(margin, (R1 - R0) / 100);
  if (eps < 0 && Rint.lower() > 0) {
    // Type III: the enclosure of R(s̄) is far wider than the default margin (2e-7 at R = 1000), so
    // start the bracket outside it instead of widening it attempt by attempt.
    const auto e = reduced_R_of_s(exact_string(*sbar, bits), eps, nth, bits);
    if (e.ok) margin = std::max(margin, static_cast<long double>(2 * arith::width_up(e.R)));
  }
  std::vector<std::string> log;
  log.push_back("candidate: reduced shooting, eps = " + std::to_string(eps) + ", zero " + std::to_string(nth) +
                ", s = " + exact_string(*sbar, 53));
  // Bracket ends: the (non-rigorous) s where R(s) = R0 - margin and R1 + margin; R is monotone near s̄.
  std::optional<long double> sa, sb;
  auto solve_ends = [&]() {
    sa = candidate::reduced_solve(br, R0 - margin, *sbar);
    sb = candidate::reduced_solve(br, R1 + margin, *sbar);
    if (sa && sb && *sa > *sb) std::swap(sa, sb);
    return sa && sb;
  };
  if (!solve_ends()) {
    fail.failure = "no candidate: reduced shooting did not reach the ends of the R interval";
    fail.log = log;
    return fail;
  }
  // S about s̄: uniqueness set. Type III: the variational run over a wide S loses the QR set (its
  // Jacobian over the hull grows without bound), so start S at twice the bracket.
  // An interval of R with eps = 1 (a sweep box): S = the bracket, which the joints need (docs/sweep.md
  // (S3'')); a wider S there only fails first (measured at R = [300, 301]).
  long double rho = eps < 0 && Rint.lower() > 0 ? 2 * (*sb - *sa) : std::max(std::fabs(*sbar) / 32, 2 * (*sb - *sa));
  if (eps > 0 && R1 > R0) rho = 0;
  for (int attempt = 0; attempt < 12; ++attempt) {
    const long double lo = std::min(*sa, *sbar), hi = std::max(*sb, *sbar);
    const long double SA = std::min(lo, *sbar - rho), SB = std::max(hi, *sbar + rho);
    Proved p = prove_any(R_lo, R_hi, eps, nth, exact_string(*sa, bits), exact_string(*sb, bits), exact_string(SA, bits),
                         exact_string(SB, bits), bits);
    log.insert(log.end(), p.r.log.begin(), p.r.log.end());
    if (p.r.certified) {
      p.r.log = log;
      p.r.existence_radius = static_cast<double>(std::max(*sbar - *sa, *sb - *sbar)) * (1 + 1e-15);
      p.r.uniqueness_radius = static_cast<double>(std::min(*sbar - SA, SB - *sbar)) * (1 - 1e-15);
      return p.r;
    }
    if (p.part == Part::bracket) {
      margin *= 4;
      if (!solve_ends()) break;
      log.push_back("remedy: wider bracket");
    } else if (p.part == Part::uniqueness && rho > 0) {
      rho = rho / 8 < (*sb - *sa) / 4 ? 0 : rho / 8;  // last try: S = the bracket itself
      log.push_back("remedy: smaller uniqueness set");
    } else {
      p.r.log = log;
      return p.r;
    }
  }
  fail.failure = "not certified after 12 attempts";
  fail.log = log;
  return fail;
}

}  // namespace porecert::proof
