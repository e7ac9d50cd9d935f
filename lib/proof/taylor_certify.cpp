#include "proof/taylor_certify.hpp"

#include <algorithm>
#include <cassert>
#include <chrono>
#include <cstdio>
#include <stdexcept>

#include "arith/fp_env.hpp"
#include "candidate/taylor_newton.hpp"
#include "model/model_spec.hpp"
#include "proof/taylor_nk.hpp"

namespace porecert::proof {

using arith::Id;

namespace {

Enclosure enclose(const Id& x) {
  return {arith::decimal_lower(x, 17), arith::decimal_upper(x, 17), arith::lower_down(x), arith::upper_up(x)};
}

Id read_R(const std::string& lo, const std::string& hi) {
  return boost::numeric::hull(arith::from_decimal<Id>(lo), arith::from_decimal<Id>(hi));
}

std::string summary(const NKBounds& b) {
  char buf[200];
  std::snprintf(buf, sizeof buf, "Y0=%.3g Z0=%.3g Z1=%.3g Z2=%.3g |A|=%.3g", b.Y0, b.Z0, b.Z1, b.Z2, b.A_norm);
  return buf;
}

// Bounds, radii and (when certified) values of a Taylor-basis result in the common outcome form;
// value_of(m, xb, r, key) encloses one reported value.
template <class M, class X, class ValueOf>
void take_taylor(CertifyOutcome& out, const M& m, const X& xb, const TaylorNKResult& r, ValueOf value_of) {
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
  if (!r.certified) return;
  // c3_error holds sup|F − F̄|, sup|F' − F̄'|, sup|F'' − F̄''| and sup|u − ū| (u = ξF''' + F'').
  for (int d = 0; d < 3 && d < static_cast<int>(r.sup_error.size()); ++d) out.c3_error[d] = r.sup_error[d];
  out.c3_error[3] = r.sup_error.back();
  for (const auto& k : m.values) {
    const Id v = value_of(m, xb, r, k);
    out.values.push_back({k.key, k.meaning, enclose(v), v});
    if (k.key == "F'(0)") out.fp0 = enclose(v), out.fp0_id = v;
    if (k.key == "F''(1)") out.fpp1 = enclose(v), out.fpp1_id = v;
    if (k.key == "K") out.K = enclose(v), out.K_id = v;
  }
}

// The proof in double intervals about the double candidate x, in the common outcome form.
CertifyOutcome prove(const model::ModelSpec& spec, const std::string& lo, const std::string& hi,
                     const std::vector<double>& x) {
  CertifyOutcome out;
  out.method = kTaylorMethod;
  out.model = spec;
  out.precision_bits = 53;
  const auto m = model::build_taylor_model<Id>(spec, read_R(lo, hi));
  out.model_id = m.id;
  const std::vector<Id> xb(x.begin(), x.end());
  const TaylorNKResult r = taylor_nk_verify(m, xb);
  take_taylor(out, m, xb, r, [](const auto&... a) { return taylor_value(a...); });
  for (double v : x) out.candidate_hex.push_back(arith::hex_exact(v));
  out.log.push_back("Taylor basis, double intervals, " + std::to_string(r.modes) + " modes: " + summary(r.bounds) +
                    (r.certified ? " -> certified" : " -> " + r.failure));
  return out;
}

// The proof about an MPFR candidate at `bits` (Y₀ and the values in MPFR intervals).
CertifyOutcome prove_mpfr(const model::ModelSpec& spec, const std::string& lo, const std::string& hi,
                          const std::vector<arith::Mpfr>& x, int bits) {
  arith::PrecisionScope scope(bits);
  CertifyOutcome out;
  out.method = kTaylorMethod;
  out.model = spec;
  out.precision_bits = bits;
  const arith::Im R = boost::numeric::hull(arith::from_decimal<arith::Im>(lo), arith::from_decimal<arith::Im>(hi));
  const auto m = model::build_taylor_model<arith::Im>(spec, R);
  out.model_id = m.id;
  std::vector<arith::Im> xb;
  for (const auto& v : x) xb.emplace_back(v, v);
  const TaylorNKResult r = taylor_nk_verify_mpfr(m, xb);
  take_taylor(out, m, xb, r, [](const auto&... a) { return taylor_value_mpfr(a...); });
  for (const auto& v : x) out.candidate_hex.push_back(arith::hex_exact(v));
  out.log.push_back("Taylor basis, MPFR " + std::to_string(bits) + " bits for Y0, " + std::to_string(r.modes) +
                    " modes: " + summary(r.bounds) + (r.certified ? " -> certified" : " -> " + r.failure));
  return out;
}

}  // namespace

CertifyOutcome certify_taylor(const CertifyRequest& req) {
  const arith::FpEnvScope fp_env;  // caller's rounding mode and flags restored on exit (arith/fp_env.hpp)
  const auto t0 = std::chrono::steady_clock::now();
  const model::ModelSpec spec = req.model;
  assert(spec.is_taylor());
  const double Rmid = arith::mid_double(read_R(req.R_lo, req.R_hi));
  // Dense LU of the finite block: beyond this many modes the proof would take minutes.
  const int n_max = std::min(req.max_modes, 1600);
  std::vector<std::string> log;
  CertifyOutcome out;
  out.method = kTaylorMethod;
  out.model = spec;
  if (req.start || req.branch != "I") {
    out.failure =
        "the porous pipe is certified on the branch continued from R = 0 only (no --start, no --branch II/III)";
    return out;
  }
  if (req.precision_bits > 53) {
    out.failure = "the Taylor-basis proof takes --precision 53 or automatic (MPFR 128 bits for Y0 when needed)";
    return out;
  }
  auto make = [spec](double R) { return model::build_taylor_model<double>(spec, R); };
  auto cand = candidate::taylor_continuation(make, Rmid, n_max, &log);
  if (!cand.converged) {
    out.failure = "no candidate: " + cand.note;
    log.push_back("Taylor candidate by continuation from R = 0: " + cand.note);
    out.log = log;
    out.seconds = std::chrono::duration<double>(std::chrono::steady_clock::now() - t0).count();
    return out;
  }
  std::vector<double> x = cand.x;
  const model::TaylorModel<double> md = make(Rmid);
  const int ns = md.n_scalars();
  auto modes = [&] { return static_cast<int>(x.size()) - ns; };
  if (req.modes > modes()) {
    x = candidate::taylor_with_modes(md, x, req.modes);
    const auto p = candidate::taylor_newton(md, x);
    if (p.converged) x = p.x;
  }
  for (int attempt = 0; attempt < 6; ++attempt) {
    out = prove(spec, req.R_lo, req.R_hi, x);
    log.insert(log.end(), out.log.begin(), out.log.end());
    if (out.certified) break;
    const bool z_problem = out.failure.rfind("Z = ", 0) == 0;
    if (!z_problem && req.precision_bits == 0) {
      // Y₀ is a double rounding floor (ill-conditioned rows for strong injection): MPFR candidate
      // and residual (docs/models.md §2).
      const int bits = 128;
      arith::PrecisionScope scope(bits);
      const auto mm = model::build_taylor_model<arith::Mpfr>(spec, arith::Mpfr(Rmid));
      const auto xm = candidate::taylor_refine_mpfr(mm, md, x, 6);
      CertifyOutcome o2 = prove_mpfr(spec, req.R_lo, req.R_hi, xm, bits);
      log.push_back("remedy: more precision (MPFR " + std::to_string(bits) + " bits for the candidate and Y0)");
      log.insert(log.end(), o2.log.begin(), o2.log.end());
      out = std::move(o2);
      break;
    }
    if (!(z_problem && out.Z1 >= out.Z0 && modes() < n_max)) break;
    x = candidate::taylor_with_modes(md, x, std::min(n_max, modes() * 3 / 2));
    const auto p = candidate::taylor_newton(md, x);
    if (p.converged) x = p.x;
    log.push_back("remedy: more modes (" + std::to_string(modes()) + ")");
  }
  out.log = log;
  out.seconds = std::chrono::duration<double>(std::chrono::steady_clock::now() - t0).count();
  return out;
}

CertifyOutcome recheck_taylor(const model::ModelSpec& spec, const std::string& R_lo, const std::string& R_hi,
                              const std::vector<std::string>& candidate_hex, int precision_bits) {
  const arith::FpEnvScope fp_env;  // caller's rounding mode and flags restored on exit (arith/fp_env.hpp)
  const auto t0 = std::chrono::steady_clock::now();
  if (precision_bits > 53) {
    arith::PrecisionScope scope(precision_bits);
    std::vector<arith::Mpfr> x;
    for (const auto& h : candidate_hex) {
      const arith::Im v = arith::from_decimal<arith::Im>(h);
      if (v.lower() != v.upper())
        throw std::invalid_argument("candidate coefficient '" + h + "' is not exact at " +
                                    std::to_string(precision_bits) + " bits");
      x.push_back(v.lower());
    }
    CertifyOutcome out = prove_mpfr(spec, R_lo, R_hi, x, precision_bits);
    out.seconds = std::chrono::duration<double>(std::chrono::steady_clock::now() - t0).count();
    return out;
  }
  std::vector<double> x;
  for (const auto& h : candidate_hex) {
    const Id v = arith::from_decimal<Id>(h);
    if (v.lower() != v.upper()) throw std::invalid_argument("candidate coefficient '" + h + "' is not a double");
    x.push_back(v.lower());
  }
  CertifyOutcome out = prove(spec, R_lo, R_hi, x);
  out.seconds = std::chrono::duration<double>(std::chrono::steady_clock::now() - t0).count();
  return out;
}

}  // namespace porecert::proof
