#include "proof/certify.hpp"

#include <chrono>
#include <cmath>
#include <stdexcept>

#include "arith/fp_env.hpp"
#include "candidate/galerkin_newton.hpp"
#include "model/berman.hpp"
#include "model/operator.hpp"
#include "proof/branches.hpp"
#include "proof/newton_kantorovich.hpp"

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

// Sign structure of the certified solution from the candidate's outward double hull.
template <arith::Interval I>
void add_structure(CertifyOutcome& out, const model::Model<I>& m, const std::vector<I>& x) {
  if (!out.certified) return;
  const model::Model<Id> md = model::convert<Id>(m, [](const I& v) { return arith::to_id(v); });
  std::vector<Id> xd;
  for (const I& v : x) xd.push_back(arith::to_id(v));
  const auto D = model::lift(model::constants_of(md, xd), model::u_of(md, xd));
  out.structure = classify(D, out.c3_error, out.fp0_id);
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
CertifyOutcome prove_double(const std::string& lo, const std::string& hi, const candidate::Vec& x) {
  CertifyOutcome out;
  const Id R = read_R<Id>(lo, hi);
  std::vector<Id> xb(x.begin(), x.end());
  const auto mdl = model::berman(R);
  const auto r = nk_verify(mdl, xb);
  take(out, r);
  add_structure(out, mdl, xb);
  out.precision_bits = 53;
  out.log.push_back("double, " + std::to_string(r.modes) + " modes: " + summary(r.bounds) +
                    (r.certified ? " -> certified" : " -> " + r.failure));
  for (double v : x) out.candidate_hex.push_back(arith::hex_exact(v));
  return out;
}

// Proof in MPFR intervals about an MPFR candidate.
CertifyOutcome prove_mpfr(const std::string& lo, const std::string& hi, const std::vector<Mpfr>& x, int bits) {
  arith::PrecisionScope scope(bits);
  CertifyOutcome out;
  const Im R = read_R<Im>(lo, hi);
  std::vector<Im> xb;
  for (const Mpfr& v : x) xb.emplace_back(v, v);
  const auto mdl = model::berman(R);
  const auto r = nk_verify(mdl, xb);
  take(out, r);
  add_structure(out, mdl, xb);
  out.precision_bits = bits;
  out.log.push_back("MPFR " + std::to_string(bits) + " bits, " + std::to_string(r.modes) +
                    " modes: " + summary(r.bounds) + (r.certified ? " -> certified" : " -> " + r.failure));
  for (const Mpfr& v : x) out.candidate_hex.push_back(arith::hex_exact(v));
  return out;
}

// True when some value enclosure is relatively wider than rel (values at 0 are skipped).
bool wider_than(const CertifyOutcome& o, double rel) {
  for (const Enclosure* e : {&o.fp0, &o.fppp0, &o.fpp1, &o.K}) {
    const double mid = 0.5 * (e->lo_d + e->hi_d);
    if (mid != 0 && (e->hi_d - e->lo_d) > rel * std::fabs(mid)) return true;
  }
  return false;
}

}  // namespace

CertifyOutcome certify_berman(const CertifyRequest& req) {
  const arith::FpEnvScope fp_env;  // caller's rounding mode and flags restored on exit (arith/fp_env.hpp)
  const auto t0 = std::chrono::steady_clock::now();
  const Id Rint = read_R<Id>(req.R_lo, req.R_hi);
  const double Rmid = arith::mid_double(Rint);
  auto make = [](double R) { return model::berman<double>(R); };
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
    cand = candidate::continuation(make, candidate::poiseuille(make(0.0), 24), 0.0, Rmid, req.max_modes, nullptr);
    log.push_back("candidate by continuation from R = 0 (type I): " +
                  std::string(cand.converged ? "converged" : cand.note));
  }
  if (!cand.converged) {
    CertifyOutcome out;
    out.failure = "no candidate: " + cand.note;
    out.log = log;
    return out;
  }
  CertifyOutcome out = certify_from(req, cand.x);
  if (!req.start && req.branch == "I" && out.certified && out.structure.label != "I") {
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
  out.log = log;
  out.seconds = std::chrono::duration<double>(std::chrono::steady_clock::now() - t0).count();
  return out;
}

CertifyOutcome certify_from(const CertifyRequest& req, const std::vector<double>& x_candidate) {
  const arith::FpEnvScope fp_env;  // caller's rounding mode and flags restored on exit (arith/fp_env.hpp)
  const auto t0 = std::chrono::steady_clock::now();
  const Id Rint = read_R<Id>(req.R_lo, req.R_hi);
  const double Rmid = arith::mid_double(Rint);
  auto make = [](double R) { return model::berman<double>(R); };
  const model::Model<double> md = make(Rmid);
  std::vector<std::string> log;
  CertifyOutcome out;
  // 2. Modes: coefficient decay already reached; add modes until the tail estimate is small.
  int N = std::max(candidate::modes_of(md, x_candidate), req.modes);
  {
    const model::Model<Id> mi = model::berman(Rint);
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

  // 3. Proof, with remedies.
  int bits = req.precision_bits;
  for (int attempt = 0; attempt < 14; ++attempt) {
    if (bits == 0 || bits == 53) {
      out = prove_double(req.R_lo, req.R_hi, x);
    } else {
      arith::PrecisionScope scope(bits);
      const Eigen::PartialPivLU<arith::MatD> lu(candidate::truncated_jacobian(md, x));
      const model::Model<Mpfr> mm = model::berman<Mpfr>(Mpfr(Rmid));
      double last = 0;
      const int steps = 2 + bits / 40;
      const auto xm = candidate::refine_mpfr(mm, x, lu, steps, &last);
      out = prove_mpfr(req.R_lo, req.R_hi, xm, bits);
    }
    log.insert(log.end(), out.log.begin(), out.log.end());
    if (out.certified) break;
    const bool z_problem = out.failure.rfind("Z = ", 0) == 0;
    if (z_problem && out.Z1 >= out.Z0 && N < req.max_modes) {
      N = std::min(req.max_modes, N * 3 / 2);
      x = candidate::with_modes(md, x, N);
      log.push_back("remedy: more modes (" + std::to_string(N) + ")");
      continue;
    }
    if (!z_problem && bits < req.max_precision_bits && req.precision_bits == 0) {
      bits = (bits == 0 || bits == 53) ? 128 : bits * 2;
      log.push_back("remedy: more precision (MPFR " + std::to_string(bits) + " bits)");
      continue;
    }
    break;
  }
  if (out.certified && req.precision_bits == 0 && out.precision_bits <= 53 && wider_than(out, req.target_rel_width)) {
    // Tighter enclosures: Y0 is rounding-bound in double; prove again about an MPFR candidate.
    const int b2 = 128;
    arith::PrecisionScope scope(b2);
    const Eigen::PartialPivLU<arith::MatD> lu(candidate::truncated_jacobian(md, x));
    double last = 0;
    const auto xm = candidate::refine_mpfr(model::berman<Mpfr>(Mpfr(Rmid)), x, lu, 5, &last);
    CertifyOutcome tight = prove_mpfr(req.R_lo, req.R_hi, xm, b2);
    log.push_back("relative width above " + std::to_string(req.target_rel_width) + " in double: " + tight.log.back());
    if (tight.certified) out = std::move(tight);
  }
  out.log = log;
  out.seconds = std::chrono::duration<double>(std::chrono::steady_clock::now() - t0).count();
  return out;
}

CertifyOutcome recheck_berman(const std::string& R_lo, const std::string& R_hi,
                              const std::vector<std::string>& candidate_hex, int precision_bits) {
  const arith::FpEnvScope fp_env;  // caller's rounding mode and flags restored on exit (arith/fp_env.hpp)
  const auto t0 = std::chrono::steady_clock::now();
  CertifyOutcome out;
  if (precision_bits <= 53) {
    candidate::Vec x;
    for (const auto& h : candidate_hex) {
      const Id v = arith::from_decimal<Id>(h);
      if (v.lower() != v.upper()) throw std::invalid_argument("candidate coefficient '" + h + "' is not a double");
      x.push_back(v.lower());
    }
    out = prove_double(R_lo, R_hi, x);
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
    out = prove_mpfr(R_lo, R_hi, x, precision_bits);
  }
  out.seconds = std::chrono::duration<double>(std::chrono::steady_clock::now() - t0).count();
  return out;
}

}  // namespace porecert::proof
