// porecert greens: rigorous enclosures of β_k = sup_η ∫|∂ᵏG/∂ηᵏ(η,s)| ds, k = 0..3, for the
// Green's function of d⁴/dη⁴ with u(0) = u''(0) = u(1) = u'(1) = 0 (docs/method.md, G1–G11).
#include <cmath>
#include <cstdio>
#include <string>

#include "arith/interval.hpp"
#include "certificate/certificate.hpp"
#include "commands.hpp"
#include "proof/greens.hpp"

namespace porecert::cli {

namespace {

struct GreensOptions {
  std::string json, tol = "1e-12";
  int bits = 0;
};

const char* const kExact[4][3] = {
    {"(39 + 55*sqrt(33))/65536", "eta = (1 + sqrt(33))/16 (interior)",
     "by hand: G >= 0, so F_0 = u_1 = (2 eta^4 - 3 eta^3 + eta)/48 (G10)"},
    {"1/48", "eta = 0", "value at eta = 0 exact; the branch and bound bounds the sup by it plus the tolerance"},
    {"1/8", "eta = 1", "value at eta = 1 exact; the branch and bound bounds the sup by it plus the tolerance"},
    {"5/8", "eta = 1", "by hand: F_3 is convex, F_3(0) = 3/8, F_3(1) = 5/8 (G11)"}};

template <arith::Interval I>
int run(const GreensOptions& o, double tol, int digits) {
  const auto beta = proof::greens_beta_detailed<I>(tol);
  const auto closed = proof::greens_beta_closed_form<I>();
  nlohmann::json j, jb = nlohmann::json::array(), jc = nlohmann::json::array(), jx = nlohmann::json::array();
  bool consistent = true;
  std::FILE* human = o.json == "-" ? stderr : stdout;  // keep stdout pure JSON with --json -
  std::fprintf(human, "porecert greens: beta_k = sup_eta int_0^1 |d^k G/d eta^k (eta,s)| ds  (%s, rel. tol %s)\n",
               o.bits == 0 ? "double intervals" : ("MPFR " + std::to_string(o.bits) + " bits").c_str(), o.tol.c_str());
  for (int k = 0; k < 4; ++k) {
    const I& v = beta[k].value;
    const std::string lo = arith::decimal_lower(v, digits), hi = arith::decimal_upper(v, digits);
    const bool overlap = !(v.upper() < closed[k].lower() || closed[k].upper() < v.lower());
    consistent = consistent && overlap;
    std::fprintf(human, "  beta_%d in [%s, %s]  = %s, attained at %s%s\n", k, lo.c_str(), hi.c_str(), kExact[k][0],
                 kExact[k][1], beta[k].tolerance_met ? "" : "  (tolerance not reached: enclosure wider)");
    jb.push_back({lo, hi});
    jc.push_back({arith::decimal_lower(closed[k], digits), arith::decimal_upper(closed[k], digits)});
    jx.push_back({{"k", k},
                  {"value", kExact[k][0]},
                  {"attained_at", kExact[k][1]},
                  {"why", kExact[k][2]},
                  {"best_point_found", beta[k].argmax},
                  {"boxes", beta[k].boxes},
                  {"tolerance_met", beta[k].tolerance_met}});
  }
  j["beta"] = jb;
  j["closed_form"] = jc;
  j["exact"] = jx;
  j["consistent_with_closed_form"] = consistent;
  j["rel_tol"] = o.tol;
  j["arithmetic"] = o.bits == 0 ? "double intervals, round to nearest plus one ulp outward"
                                : "MPFR intervals, " + std::to_string(o.bits) + " bits, directed rounding";
  j["method"] =
      "closed-form G (piecewise cubic); for fixed eta, |d^k G| integrated exactly between sign changes enclosed by "
      "interval Newton; sup over eta by branch and bound with a mean-value bound from an enclosure of F_k' "
      "(docs/method.md G6-G9). Lower end: a computed value F_k(eta); upper end: max over the remaining boxes.";
  j["green_function"] =
      "G(eta,s) = s (1-eta)^2 (3 eta - (eta+2) s^2)/12 for s <= eta, G(eta,s) = G(s,eta) for s >= eta";
  if (!o.json.empty()) {
    try {
      certificate::write_atomic(o.json, j.dump(2) + "\n");
    } catch (const std::exception& e) {
      throw input_error("--json: cannot write '" + o.json + "': " + e.what());
    }
  }
  if (!consistent) {
    std::fprintf(stderr, "porecert greens: an enclosure misses its closed form: a bug, please report\n");
    return 1;
  }
  return 0;
}

}  // namespace

Action register_greens(CLI::App& app) {
  auto o = std::make_shared<GreensOptions>();
  CLI::App* sub = app.add_subcommand("greens", "Rigorous bounds beta_0..beta_3 of the Green's function of d^4/deta^4");
  sub->add_option("--json", o->json, "Also write the enclosures as JSON to PATH ('-' = stdout)");
  sub->add_option("--tol", o->tol, "Target relative width of each enclosure (default 1e-12)");
  sub->add_option("--bits", o->bits,
                  "0 = double intervals (default); 64..4096 = MPFR intervals at that precision (--tol down to 1e-30)");
  return [o]() -> int {
    if (o->bits != 0 && (o->bits < 64 || o->bits > 4096))
      throw input_error("--bits: " + std::to_string(o->bits) + " must be 0 (double) or in 64..4096 (MPFR)");
    double tol = 0;
    try {
      const arith::Id t = arith::from_decimal<arith::Id>(o->tol);
      tol = t.upper();
    } catch (const std::invalid_argument&) {
      throw input_error("--tol: '" + o->tol + "' must be a decimal number");
    }
    // η-boxes have double end points, so the interior maximum of F_0 resolves to about 1e-30.
    const double floor = o->bits == 0 ? 1e-15 : std::max(1e-30, std::ldexp(1.0, 24 - o->bits));
    if (!(tol >= floor && tol <= 1e-3)) {
      char buf[32];
      std::snprintf(buf, sizeof buf, "%.3g", floor);
      throw input_error("--tol: '" + o->tol + "' must be in [" + buf + ", 1e-3] for --bits " + std::to_string(o->bits));
    }
    if (!o->json.empty()) certificate::check_output(o->json);
    if (o->bits == 0) return run<arith::Id>(*o, tol, 17);
    arith::PrecisionScope scope(o->bits);
    return run<arith::Im>(*o, tol, static_cast<int>(o->bits * 0.30103) + 2);
  };
}

}  // namespace porecert::cli
