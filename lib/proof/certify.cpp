#include "proof/certify.hpp"

#include <chrono>
#include <cmath>
#include <stdexcept>

#include "arith/fp_env.hpp"
#include "candidate/galerkin_newton.hpp"
#include "candidate/reduced_shooting.hpp"
#include "model/berman.hpp"
#include "model/model_spec.hpp"
#include "model/operator.hpp"
#include "proof/branches.hpp"
#include "proof/newton_kantorovich.hpp"
#include "proof/taylor_certify.hpp"

namespace porecert::proof {

using arith::Id;
using arith::Im;
using arith::Mpfr;

namespace {

template <arith::Interval I>
Enclosure enclose(const I& x) {
  return {arith::decimal_lower(x, std::is_same_v<I, Id> ? 17 : 40),
          arith::decimal_upper(x, std::is_same_v<I, Id> ? 17 : 40), arith::lower_down(x), arith::upper_up(x)};
}

template <arith::Interval I>
void take(CertifyOutcome& out, const NKResult<I>& r) {
  out.certified = r.certified;
  out.failure = r.failure;
  out.modes = r.modes;
  out.Y0 = r.bounds.Y0;
  out.Z0 = r.bounds.Z0;
  out.Z1 = r.bounds.Z1;
  out.Z2 = r.bounds.Z2;
  out.A_norm = r.bounds.A_norm;
  out.existence_radius = r.existence_radius;
  out.uniqueness_radius = r.uniqueness_radius;
  out.c3_error = r.c3_error;
  out.moving_centre = r.moving_centre;
  out.R0 = r.R0;
  out.centre_existence_radius = r.centre_existence_radius;
  out.centre_uniqueness_radius = r.centre_uniqueness_radius;
  if (r.certified) {
    out.fp0 = enclose(r.fp0);
    out.fppp0 = enclose(r.fppp0);
    out.fpp1 = enclose(r.fpp1);
    out.K = enclose(r.K);
    out.fp0_id = arith::to_id(r.fp0);
    out.K_id = arith::to_id(r.K);
    out.fpp1_id = arith::to_id(r.fpp1);
    out.fppp0_id = arith::to_id(r.fppp0);
  }
}

// The model's reported values (model::ValueKey): scale · (D^d f̄(at) ± c3_error[d]), or
// scale · (K̄ ± r) for d = −1; a free constant at 0 uses its own component ± r (tighter). f̄, r and
// the errors are those of the proof's centre: x̄, or x̄(R) = x̄ + δ x1 over a box, where a value is
// affine in δ and enclosed as value(x̄) + [δ] value(x1) (docs/method.md (M3.13)).
template <arith::Interval I>
void add_values(CertifyOutcome& out, const model::Model<I>& m, const std::vector<I>& x, const NKResult<I>& r) {
  out.model_id = m.id;
  out.values.clear();
  if (!r.certified) return;
  const bool mv = r.moving_centre;
  const auto D = model::lift(model::constants_of(m, x), model::u_of(m, x));
  const auto D1 = mv ? model::lift_direction(m, r.tangent) : std::array<cheb::Series<I>, 4>{};
  const auto comp = [&](int i) { return mv ? x[i] + r.delta * r.tangent[i] : x[i]; };
  const I ball(-r.centre_existence_radius, r.centre_existence_radius);
  for (const auto& k : m.values) {
    I v;
    if (k.d < 0) {
      v = comp(m.k_index()) + ball;
    } else if (k.at == 0 && k.d < 3 && m.fixed_at_0[k.d]) {
      v = *m.fixed_at_0[k.d];
    } else if (k.at == 0 && k.d < 3) {
      v = comp(m.free_index(k.d)) + ball;
    } else {
      const I at = I(k.at);
      const auto value = [&](const cheb::Series<I>& s) {
        return k.at == 1 ? cheb::value_at_1(s) : k.at == 0 ? cheb::value_at_0(s) : cheb::eval(s, at);
      };
      I p = value(D[k.d]);
      if (mv) p = p + r.delta * value(D1[k.d]);
      v = p + I(-r.centre_c3_error[k.d], r.centre_c3_error[k.d]);
    }
    v = v * I(k.scale);
    out.values.push_back({k.key, k.meaning, enclose(v), arith::to_id(v)});
  }
}

// Sign structure of the certified solution from the proof's centre in outward double intervals:
// x̄, or the two ends x̄ + δ_lo x1, x̄ + δ_hi x1 of the centres over a box (M3.13).
template <arith::Interval I>
void add_structure(CertifyOutcome& out, const model::Model<I>& m, const std::vector<I>& x, const NKResult<I>& r) {
  if (!out.certified) return;
  // The labels (docs/branches.md) are about half-channel profiles with f(0) = f''(0) = 0.
  if (!m.fixed_at_0[0] || !m.fixed_at_0[2]) return;
  const model::Model<Id> md = model::convert<Id>(m, [](const I& v) { return arith::to_id(v); });
  std::vector<std::array<cheb::Series<Id>, 4>> vertices;
  const Id dl = arith::to_id(r.delta);
  for (const double s : r.moving_centre ? std::vector<double>{dl.lower(), dl.upper()} : std::vector<double>{0.0}) {
    std::vector<Id> xd;
    for (std::size_t i = 0; i < x.size(); ++i)
      xd.push_back(r.moving_centre ? arith::to_id(x[i]) + Id(s) * arith::to_id(r.tangent[i]) : arith::to_id(x[i]));
    vertices.push_back(model::lift(model::constants_of(md, xd), model::u_of(md, xd)));
  }
  out.structure = classify(vertices, r.centre_c3_error, out.fp0_id);
}

template <arith::Interval I>
I read_R(const std::string& lo, const std::string& hi) {
  const I a = arith::from_decimal<I>(lo), b = arith::from_decimal<I>(hi);
  return boost::numeric::hull(a, b);
}

std::string summary(const NKBounds& b) {
  char buf[200];
  std::snprintf(buf, sizeof buf, "Y0=%.3g Z0=%.3g Z1=%.3g Z2=%.3g", b.Y0, b.Z0, b.Z1, b.Z2);
  return buf;
}

// Proof in double intervals about a double candidate.
// The predictor of an interval box (M3.11) about R0 = the double nearest the box midpoint.
template <arith::Interval I>
RPredictor<I> predictor_of(const model::ModelSpec& spec, const I& R, const candidate::Vec& tangent) {
  const double R0 = arith::mid_double(arith::to_id(R));
  RPredictor<I> p;
  for (double v : tangent) p.tangent.emplace_back(v);
  p.delta = R - I(R0);
  p.R0 = R0;
  p.at_R0 = model::build_model<I>(spec, I(R0));
  p.at_0 = model::build_model<I>(spec, I(0));
  p.at_1 = model::build_model<I>(spec, I(1));
  return p;
}

// A box of R (not a point) with a tangent of the same length as the candidate: use the predictor.
template <arith::Interval I, class X>
bool use_predictor(const I& R, const X& x, const candidate::Vec& tangent) {
  return !tangent.empty() && tangent.size() == x.size() && R.lower() < R.upper();
}

CertifyOutcome prove_double(const model::ModelSpec& spec, const std::string& lo, const std::string& hi,
                            const candidate::Vec& x, const candidate::Vec& tangent = {}) {
  CertifyOutcome out;
  const Id R = read_R<Id>(lo, hi);
  std::vector<Id> xb(x.begin(), x.end());
  const auto mdl = model::build_model<Id>(spec, R);
  const bool pred = use_predictor(R, x, tangent);
  const auto r = pred ? nk_verify(mdl, xb, predictor_of(spec, R, tangent)) : nk_verify(mdl, xb);
  if (pred)
    for (double v : tangent) out.tangent_hex.push_back(arith::hex_exact(v));
  take(out, r);
  out.model = spec;
  add_values(out, mdl, xb, r);
  add_structure(out, mdl, xb, r);
  out.precision_bits = 53;
  out.log.push_back("double, " + std::to_string(r.modes) + " modes: " + summary(r.bounds) +
                    (r.certified ? " -> certified" : " -> " + r.failure));
  for (double v : x) out.candidate_hex.push_back(arith::hex_exact(v));
  return out;
}

// Proof in MPFR intervals about an MPFR candidate.
CertifyOutcome prove_mpfr(const model::ModelSpec& spec, const std::string& lo, const std::string& hi,
                          const std::vector<Mpfr>& x, int bits, const candidate::Vec& tangent = {}) {
  arith::PrecisionScope scope(bits);
  CertifyOutcome out;
  const Im R = read_R<Im>(lo, hi);
  std::vector<Im> xb;
  for (const Mpfr& v : x) xb.emplace_back(v, v);
  const auto mdl = model::build_model<Im>(spec, R);
  const bool pred = use_predictor(R, x, tangent);
  const auto r = pred ? nk_verify(mdl, xb, predictor_of(spec, R, tangent)) : nk_verify(mdl, xb);
  if (pred)
    for (double v : tangent) out.tangent_hex.push_back(arith::hex_exact(v));
  take(out, r);
  out.model = spec;
  add_values(out, mdl, xb, r);
  add_structure(out, mdl, xb, r);
  out.precision_bits = bits;
  out.log.push_back("MPFR " + std::to_string(bits) + " bits, " + std::to_string(r.modes) +
                    " modes: " + summary(r.bounds) + (r.certified ? " -> certified" : " -> " + r.failure));
  for (const Mpfr& v : x) out.candidate_hex.push_back(arith::hex_exact(v));
  return out;
}

// True when some value enclosure is relatively wider than rel (values at 0 are skipped).
bool wider_than(const CertifyOutcome& o, double rel) {
  std::vector<const Enclosure*> all = {&o.fp0, &o.fppp0, &o.fpp1, &o.K};
  for (const auto& v : o.values) all.push_back(&v.enc);
  for (const Enclosure* e : all) {
    const double mid = 0.5 * (e->lo_d + e->hi_d);
    if (mid != 0 && (e->hi_d - e->lo_d) > rel * std::fabs(mid)) return true;
  }
  return false;
}

// The solution at R = 0 in the model's layout: Berman's exact profile, or (any model) one Newton
// solve of the then linear problem from zero (non-rigorous; a start for continuation).
candidate::Vec start_at_zero(const model::ModelSpec& spec, int n, int n_max) {
  const auto m0 = model::build_model<double>(spec, 0.0);
  if (spec.is_berman()) return candidate::poiseuille(m0, n);
  const auto r = candidate::solve_with_decay(m0, candidate::Vec(m0.n_scalars() + n, 0.0), n, n_max);
  return r.x;
}

}  // namespace

namespace {
const char* kReducedKeys[4] = {"f'(0)", "f'''(0)", "f''(1)", "K"};  // order of ReducedResult::value
}  // namespace

CertifyOutcome outcome_of(const ReducedResult& r) {
  CertifyOutcome out;
  out.certified = r.certified;
  out.failure = r.failure;
  out.log = r.log;
  out.precision_bits = r.precision_bits;
  out.existence_radius = r.existence_radius;
  out.uniqueness_radius = r.uniqueness_radius;
  out.c3_error = r.c3_error;
  out.method = "reduced-ivp";
  out.reduced = r;
  if (r.certified) {
    Enclosure* e[4] = {&out.fp0, &out.fppp0, &out.fpp1, &out.K};
    Id* d[4] = {&out.fp0_id, &out.fppp0_id, &out.fpp1_id, &out.K_id};
    for (int k = 0; k < 4; ++k) {
      *e[k] = {r.value_lo[k], r.value_hi[k], r.value[k].lower(), r.value[k].upper()};
      *d[k] = r.value[k];
    }
    out.structure = r.structure;
    // The model's reported values (docs/models.md), in its key order: for Berman the same four.
    const auto m = model::berman<double>(0.0);
    out.model_id = m.id;
    for (const auto& k : m.values)
      for (int i = 0; i < 4; ++i)
        if (k.key == kReducedKeys[i]) out.values.push_back({k.key, k.meaning, *e[i], *d[i]});
  }
  return out;
}

CertifyOutcome certify_reduced(const CertifyRequest& req, int eps, int nth, long double s_guess) {
  const auto t0 = std::chrono::steady_clock::now();
  CertifyOutcome out = outcome_of(reduced_certify(req.R_lo, req.R_hi, eps, nth, s_guess, req.precision_bits));
  out.seconds = std::chrono::duration<double>(std::chrono::steady_clock::now() - t0).count();
  return out;
}

namespace {
// Branch data of the reduced method for a labelled branch (docs/method.md §S): (eps, nth, guess).
struct ReducedPick {
  int eps, nth;
  long double guess;
};
std::optional<ReducedPick> reduced_pick(const CertifyRequest& req, double R) {
  if (R == 0) return std::nullopt;
  if (req.start) {
    const double a = req.start->first, b = req.start->second;
    if (a == 0) return std::nullopt;
    return ReducedPick{(R * a > 0) ? 1 : -1, 1, candidate::reduced_s_of(R, a, b)};
  }
  if (req.branch == "I")
    return R > 0 ? ReducedPick{1, 1, reduced_guess(R, 1, 1, -1)} : ReducedPick{-1, 1, reduced_guess(R, -1, 1, 1)};
  if (req.branch == "II" && R > 0) return ReducedPick{1, 1, reduced_guess(R, 1, 1, 1)};
  return std::nullopt;
}
}  // namespace

// Interval boxes with R_lo at or above this are tried with the reduced method first. Below it the
// Newton-Kantorovich boxes (M3.11) are as wide and glue with each other; for injection the reduced
// method's boxes were narrower than Newton-Kantorovich's in our runs (docs/sweep.md).
constexpr double kReducedBoxFrom = 1;
// A box of suction at or above this that the reduced method cannot prove is not retried with
// Newton-Kantorovich: that proof needs thousands of modes there and fails on such a box after
// tens of seconds (measured [40, 45]: 4.8 s, [100, 110]: 110 s); a sweep bisects instead.
constexpr double kNoFallbackBoxFrom = 30;

CertifyOutcome certify_berman(const CertifyRequest& req) {
  if (req.model.is_taylor()) return certify_taylor(req);  // the porous pipe (docs/models.md §2)
  const arith::FpEnvScope fp_env;  // caller's rounding mode and flags restored on exit (arith/fp_env.hpp)
  const auto t0 = std::chrono::steady_clock::now();
  const Id Rint = read_R<Id>(req.R_lo, req.R_hi);
  const double Rmid = arith::mid_double(Rint);
  // Strong suction: the reduced method first (types I and II are exponentially close there, which
  // costs the Newton-Kantorovich proof modes and precision; docs/method.md §S).
  std::vector<std::string> pre;
  if (req.method == "reduced" && !req.model.is_berman()) {
    CertifyOutcome out;
    out.failure = "the reduced method rests on the symmetries of Berman's half-channel equation (docs/method.md §S)";
    return out;
  }
  // Boxes of R (sweeps): for suction the reduced method covers a wide box with one proof, so it goes
  // first there too (docs/sweep.md).
  const bool box = Rint.lower() < Rint.upper();
  const bool reduced_box = box && Rint.lower() >= kReducedBoxFrom;
  if (req.model.is_berman() && (req.method == "reduced" || (req.method == "auto" && !req.start && req.branch == "I" &&
                                                            (Rint.lower() >= 40 || reduced_box)))) {
    const auto pick = reduced_pick(req, Rmid);
    if (!pick) {
      CertifyOutcome out;
      out.failure = "the reduced method needs R != 0 and branch I, II (suction) or --start a,b with a != 0";
      return out;
    }
    CertifyOutcome r = certify_reduced(req, pick->eps, pick->nth, pick->guess);
    if (r.certified || req.method == "reduced") return r;
    if (box && Rint.lower() >= kNoFallbackBoxFrom) {
      r.log.push_back("no Newton-Kantorovich retry for a box with R >= " + std::to_string(int(kNoFallbackBoxFrom)) +
                      " (docs/sweep.md S2): narrower boxes instead");
      return r;
    }
    pre = r.log;
    pre.push_back("reduced method: " + r.failure + "; trying Newton-Kantorovich");
  }
  const model::ModelSpec spec = req.model;
  auto make = [spec](double R) { return model::build_model<double>(spec, R); };
  const model::Model<double> md = make(Rmid);
  std::vector<std::string> log;

  // 1. Candidate (non-rigorous).
  candidate::NewtonReport cand;
  if (req.start) {
    const int n0 = std::max(32, req.modes);
    cand = candidate::solve_with_decay(md, candidate::guess_from_shooting(md, req.start->first, req.start->second, n0),
                                       n0, req.max_modes);
    log.push_back("candidate from --start " + std::to_string(req.start->first) + "," +
                  std::to_string(req.start->second) + ": " + (cand.converged ? "converged" : cand.note));
  } else {
    cand = candidate::continuation(make, start_at_zero(spec, 24, req.max_modes), 0.0, Rmid, req.max_modes, nullptr);
    log.push_back("candidate by continuation from R = 0 (type I): " +
                  std::string(cand.converged ? "converged" : cand.note));
  }
  if (!cand.converged) {
    CertifyOutcome out;
    out.model = spec;
    out.failure = "no candidate: " + cand.note;
    out.log = pre;  // the reduced method's attempts first, when it was tried
    out.log.insert(out.log.end(), log.begin(), log.end());
    return out;
  }
  CertifyOutcome out = certify_from(req, cand.x);
  if (!req.start && req.branch == "I" && out.certified && spec.is_berman() && out.structure.label != "I" &&
      req.search_other_labels) {
    // Continuation can jump to a nearby branch where branches crowd (types I and II for large
    // suction): the certified structure says so; then look for type I with the branch search.
    log.push_back("continuation ended on a solution of certified type " + out.structure.label +
                  "; searching all branches for type I");
    for (auto& s : certify_branches(req).solutions)
      if (s.certified && s.structure.label == "I") {
        out = std::move(s);
        break;
      }
  }
  log.insert(log.end(), out.log.begin(), out.log.end());
  log.insert(log.begin(), pre.begin(), pre.end());
  out.log = log;
  out.seconds = std::chrono::duration<double>(std::chrono::steady_clock::now() - t0).count();
  return out;
}

CertifyOutcome certify_from(const CertifyRequest& req, const std::vector<double>& x_candidate) {
  if (req.model.is_taylor()) {  // a Chebyshev candidate means nothing for a Taylor model
    CertifyOutcome out;
    out.model = req.model;
    out.failure = "--model " + req.model.name + ": no Chebyshev candidate proof for a Taylor-basis model";
    return out;
  }
  const arith::FpEnvScope fp_env;  // caller's rounding mode and flags restored on exit (arith/fp_env.hpp)
  const auto t0 = std::chrono::steady_clock::now();
  const Id Rint = read_R<Id>(req.R_lo, req.R_hi);
  const double Rmid = arith::mid_double(Rint);
  const model::ModelSpec spec = req.model;
  const model::Model<double> md = model::build_model<double>(spec, Rmid);
  std::vector<std::string> log;
  CertifyOutcome out;
  // 2. Modes: coefficient decay already reached; add modes until the tail estimate is small.
  int N = std::max(candidate::modes_of(md, x_candidate), req.modes);
  {
    const model::Model<Id> mi = model::build_model<Id>(spec, Rint);
    auto tail_at = [&](int n) {
      std::vector<Id> xi;
      for (double v : candidate::with_modes(md, x_candidate, n)) xi.push_back(Id(v));
      return tail_estimate(mi, xi, n);
    };
    if (req.modes == 0)
      while (tail_at(N) > 0.3 && N < req.max_modes) N = std::min(req.max_modes, N * 5 / 4 + 4);
  }
  candidate::Vec x = candidate::with_modes(md, x_candidate, N);
  if (N > candidate::modes_of(md, x_candidate)) {
    const auto polished = candidate::newton(md, x, 4);
    if (polished.converged) x = polished.x;
  }

  // First-order predictor over an interval box (M3.11): the branch tangent at the midpoint.
  auto tangent_for = [&](const candidate::Vec& xc) {
    if (!(Rint.lower() < Rint.upper())) return candidate::Vec{};
    return candidate::tangent_in_R(md, model::build_model<double>(spec, 0.0), model::build_model<double>(spec, 1.0),
                                   xc);
  };
  // 3. Proof, with remedies.
  int bits = req.precision_bits;
  double last_Y0 = 0;  // Y0 of the previous attempt at lower precision (0: none yet)
  for (int attempt = 0; attempt < 14; ++attempt) {
    if (bits == 0 || bits == 53) {
      out = prove_double(spec, req.R_lo, req.R_hi, x, tangent_for(x));
    } else {
      arith::PrecisionScope scope(bits);
      const Eigen::PartialPivLU<arith::MatD> lu(candidate::truncated_jacobian(md, x));
      const model::Model<Mpfr> mm = model::build_model<Mpfr>(spec, Mpfr(Rmid));
      double last = 0;
      const int steps = 2 + bits / 40;
      const auto xm = candidate::refine_mpfr(mm, x, lu, steps, &last);
      out = prove_mpfr(spec, req.R_lo, req.R_hi, xm, bits, tangent_for(x));
    }
    log.insert(log.end(), out.log.begin(), out.log.end());
    if (out.certified) break;
    const bool z_problem = out.failure.rfind("Z = ", 0) == 0;
    if (z_problem && out.Z1 >= out.Z0 && N < req.max_modes) {
      N = std::min(req.max_modes, N * 3 / 2);
      x = candidate::with_modes(md, x, N);
      last_Y0 = 0;  // another truncation: Y0 is not comparable
      log.push_back("remedy: more modes (" + std::to_string(N) + ")");
      continue;
    }
    // More precision helps only while Y0 is rounding-bound. When the last doubling did not even halve
    // Y0 (an interval box: Y0 is then set by the box width, (M3.11)), the next ones will not either;
    // stop rather than pay for 256-1024 bits (a failing Newton-Kantorovich box at R = [80, 80.001]: 78 s before this
    // rule, 13 s after).
    if (!z_problem && last_Y0 > 0 && !(out.Y0 < 0.5 * last_Y0)) {
      log.push_back("stop: more precision did not lower Y0 (" + std::to_string(last_Y0) + " -> " +
                    std::to_string(out.Y0) + "); the residual is not rounding-bound");
      break;
    }
    if (!z_problem && bits < req.max_precision_bits && req.precision_bits == 0) {
      last_Y0 = out.Y0;
      bits = (bits == 0 || bits == 53) ? 128 : bits * 2;
      log.push_back("remedy: more precision (MPFR " + std::to_string(bits) + " bits)");
      continue;
    }
    break;
  }
  // Over an interval of R wider than 1e-10 relative the values are as wide as the box (the solution
  // moves across it), so a re-proof in MPFR cannot tighten them to the target (measured
  // R = [-300, -299.75]: 23 s with it, 6 s without).
  const bool point_R = !(Rint.upper() - Rint.lower() > 1e-10 * std::max(1.0, std::fabs(Rmid)));
  if (out.certified && point_R && req.precision_bits == 0 && out.precision_bits <= 53 &&
      wider_than(out, req.target_rel_width)) {
    // Tighter enclosures: Y0 is rounding-bound in double; prove again about an MPFR candidate.
    const int b2 = 128;
    arith::PrecisionScope scope(b2);
    const Eigen::PartialPivLU<arith::MatD> lu(candidate::truncated_jacobian(md, x));
    double last = 0;
    const auto xm = candidate::refine_mpfr(model::build_model<Mpfr>(spec, Mpfr(Rmid)), x, lu, 5, &last);
    CertifyOutcome tight = prove_mpfr(spec, req.R_lo, req.R_hi, xm, b2, tangent_for(x));
    log.push_back("relative width above " + std::to_string(req.target_rel_width) + " in double: " + tight.log.back());
    if (tight.certified) out = std::move(tight);
  }
  out.log = log;
  out.seconds = std::chrono::duration<double>(std::chrono::steady_clock::now() - t0).count();
  return out;
}

CertifyOutcome recheck_berman(const std::string& R_lo, const std::string& R_hi,
                              const std::vector<std::string>& candidate_hex, int precision_bits,
                              const std::vector<std::string>& tangent_hex) {
  return recheck_model(model::ModelSpec{}, R_lo, R_hi, candidate_hex, precision_bits, tangent_hex);
}

CertifyOutcome recheck_model(const model::ModelSpec& spec, const std::string& R_lo, const std::string& R_hi,
                             const std::vector<std::string>& candidate_hex, int precision_bits,
                             const std::vector<std::string>& tangent_hex) {
  if (spec.is_taylor()) {
    if (!tangent_hex.empty()) throw std::invalid_argument("a Taylor-basis certificate has no tangent_hex");
    return recheck_taylor(spec, R_lo, R_hi, candidate_hex, precision_bits);
  }
  const arith::FpEnvScope fp_env;  // caller's rounding mode and flags restored on exit (arith/fp_env.hpp)
  const auto t0 = std::chrono::steady_clock::now();
  CertifyOutcome out;
  candidate::Vec tangent;
  for (const auto& h : tangent_hex) {
    const Id v = arith::from_decimal<Id>(h);
    if (v.lower() != v.upper()) throw std::invalid_argument("tangent coefficient '" + h + "' is not a double");
    tangent.push_back(v.lower());
  }
  if (!tangent.empty() && tangent.size() != candidate_hex.size())
    throw std::invalid_argument("the tangent has " + std::to_string(tangent.size()) + " entries, the candidate " +
                                std::to_string(candidate_hex.size()) + " (rule: equal lengths)");
  if (precision_bits <= 53) {
    candidate::Vec x;
    for (const auto& h : candidate_hex) {
      const Id v = arith::from_decimal<Id>(h);
      if (v.lower() != v.upper()) throw std::invalid_argument("candidate coefficient '" + h + "' is not a double");
      x.push_back(v.lower());
    }
    out = prove_double(spec, R_lo, R_hi, x, tangent);
  } else {
    arith::PrecisionScope scope(precision_bits);
    std::vector<Mpfr> x;
    for (const auto& h : candidate_hex) {
      const Im v = arith::from_decimal<Im>(h);
      if (v.lower() != v.upper())
        throw std::invalid_argument("candidate coefficient '" + h + "' is not exact at " +
                                    std::to_string(precision_bits) + " bits");
      x.push_back(v.lower());
    }
    out = prove_mpfr(spec, R_lo, R_hi, x, precision_bits, tangent);
  }
  out.seconds = std::chrono::duration<double>(std::chrono::steady_clock::now() - t0).count();
  return out;
}

}  // namespace porecert::proof
