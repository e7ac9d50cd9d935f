// porecert verify / porecert recheck: certify one solution, or re-check a stored certificate.
#include <chrono>
#include <cstdio>
#include <iostream>

#include "certificate/certificate.hpp"
#include "certificate/dimensional_block.hpp"
#include "certificate/recheck.hpp"
#include "commands.hpp"
#include "model_options.hpp"
#include "proof/branches.hpp"
#include "proof/certify.hpp"
#include "proof/direct.hpp"
#include "proof/direct_candidate.hpp"
#include "proof/fold.hpp"
#include "proof/labelled.hpp"
#include "proof/taylor_certify.hpp"

namespace porecert::cli {

namespace {

struct VerifyOptions {
  std::string case_file, R, branch, start, json, method = "auto";
  int precision = 0, modes = 0;
  ModelOptions mo;
};

std::pair<double, double> parse_start(const std::string& s) {
  const auto comma = s.find(',');
  if (comma == std::string::npos) throw input_error("--start: '" + s + "' must be two numbers a,b (f'(0), f'''(0))");
  try {
    std::size_t p1 = 0, p2 = 0;
    const std::string a = s.substr(0, comma), b = s.substr(comma + 1);
    const double x = std::stod(a, &p1), y = std::stod(b, &p2);
    if (p1 != a.size() || p2 != b.size() || !std::isfinite(x) || !std::isfinite(y)) throw std::invalid_argument(s);
    return {x, y};
  } catch (const std::exception&) {
    throw input_error("--start: '" + s + "' must be two finite numbers a,b (f'(0), f'''(0))");
  }
}

void print_summary(const proof::CertifyOutcome& o, const std::string& R_lo, const std::string& R_hi,
                   const std::string& branch) {
  std::printf("porecert verify: %s, R = %s%s%s, branch %s\n", model::describe(o.model).c_str(), R_lo.c_str(),
              R_lo == R_hi ? "" : " .. ", R_lo == R_hi ? "" : R_hi.c_str(),
              branch.empty() ? "(unlabelled)" : branch.c_str());
  const std::string arith_text =
      o.precision_bits <= 53 ? "double intervals" : "MPFR " + std::to_string(o.precision_bits) + " bits";
  if (o.reduced) {
    const auto& r = *o.reduced;
    std::printf("  method:    reduced ODE (docs/method.md S), eps = %+d, wall at zero %d of f', %s\n", r.eps, r.nth,
                arith_text.c_str());
    if (o.certified)
      std::printf("  bounds:    R(s_lo) in [%.17g, %.17g], R(s_hi) in [%.17g, %.17g], dR/ds on S in [%.3g, %.3g]\n",
                  r.R_at_s_lo.lower(), r.R_at_s_lo.upper(), r.R_at_s_hi.lower(), r.R_at_s_hi.upper(), r.dR_ds.lower(),
                  r.dR_ds.upper());
  } else if (o.method == proof::kTaylorMethod) {
    std::printf("  candidate: %d Taylor coefficients about xi = 0, %s\n", o.modes, arith_text.c_str());
    std::printf("  bounds:    Y0 = %.3g  Z0 = %.3g  Z1 = %.3g  Z2 = %.3g  |A| = %.3g\n", o.Y0, o.Z0, o.Z1, o.Z2,
                o.A_norm);
  } else {
    std::printf("  candidate: %d Chebyshev modes, %s\n", o.modes, arith_text.c_str());
    std::printf("  bounds:    Y0 = %.3g  Z0 = %.3g  Z1 = %.3g  Z2 = %.3g\n", o.Y0, o.Z0, o.Z1, o.Z2);
  }
  if (!o.certified) {
    std::printf("  NOT CERTIFIED: %s\n", o.failure.c_str());
    for (const auto& l : o.log) std::printf("    %s\n", l.c_str());
    return;
  }
  if (o.reduced) {
    const auto& r = *o.reduced;
    std::printf(
        "  CERTIFIED: for every R given, exactly one solution with this eps and wall zero has shape parameter\n");
    std::printf("             s = f'''(0)/(R f'(0)^2) in [%s, %s]; it has s in [%s, %s]\n", r.S_lo.c_str(),
                r.S_hi.c_str(), r.s_lo.c_str(), r.s_hi.c_str());
    std::printf("  tube half-widths |f^(k) - m_k| <= %.3g, %.3g, %.3g, %.3g for k = 0..3 (every eta)\n", o.c3_error[0],
                o.c3_error[1], o.c3_error[2], o.c3_error[3]);
  } else if (o.method == proof::kTaylorMethod) {
    std::printf("  CERTIFIED: a true solution lies within %.3g of the candidate and is the only one within %.3g\n",
                o.existence_radius, o.uniqueness_radius);
    std::printf("             (l1 norm of (F'(0), K, Taylor coefficients of u = xi F''' + F''), docs/models.md §2)\n");
    std::printf("  sup|F^(k) - candidate^(k)| on [0,1] <= %.3g, %.3g, %.3g for k = 0, 1, 2\n", o.c3_error[0],
                o.c3_error[1], o.c3_error[2]);
  } else {
    std::printf("  CERTIFIED: a true solution lies within %.3g of the candidate and is the only one within %.3g\n",
                o.existence_radius, o.uniqueness_radius);
    std::printf("             (l1 norm of (%s, K, Chebyshev coefficients of %s'''))\n",
                model::free_constant_text(o.model).c_str(), o.model.half_channel() ? "f" : "g");
    if (o.moving_centre)
      // (M3.12) restates the box's radii about one fixed candidate, which can leave no uniqueness
      // radius; the per-R statement about the moving centre x(R) = x + (R - R0) x1 is the sharp one.
      std::printf(
          "             for each R of the box, about the moving centre x(R) = x + (R - R0) x1 (docs/method.md "
          "M3.11):\n             within %.3g, the only one within %.3g\n",
          o.centre_existence_radius, o.centre_uniqueness_radius);
    std::printf("  sup|f^(k) - candidate^(k)| <= %.3g for k = 0..3\n", o.c3_error[3]);
  }
  if (!o.model.is_berman()) {  // the model's own value keys (docs/models.md)
    for (const auto& nv : o.values)
      std::printf("  %-8s in [%s, %s]   (%s)\n", nv.key.c_str(), nv.enc.lo.c_str(), nv.enc.hi.c_str(),
                  nv.meaning.c_str());
    if (!o.structure.label.empty())
      std::printf("  structure: type %s (%s)\n", o.structure.label.c_str(), o.structure.reason.c_str());
    std::printf("  time %.2f s. %s\n", o.seconds, certificate::kCaution);
    return;
  }
  std::printf("  f'(0)   in [%s, %s]\n", o.fp0.lo.c_str(), o.fp0.hi.c_str());
  std::printf("  f'''(0) in [%s, %s]\n", o.fppp0.lo.c_str(), o.fppp0.hi.c_str());
  std::printf("  f''(1)  in [%s, %s]   (wall shear)\n", o.fpp1.lo.c_str(), o.fpp1.hi.c_str());
  std::printf("  K       in [%s, %s]   (axial pressure constant)\n", o.K.lo.c_str(), o.K.hi.c_str());
  if (!o.structure.label.empty()) {
    std::printf("  structure: type %s (%s)\n", o.structure.label.c_str(), o.structure.reason.c_str());
    std::printf("  flow reversal (f' < 0 somewhere): %s%s\n", arith::to_string(o.structure.reversal),
                o.structure.reversal == arith::Tri::yes
                    ? (", on " + proof::spans_text(o.structure.reversal_where)).c_str()
                    : "");
  }
  std::printf("  time %.2f s. %s\n", o.seconds, certificate::kCaution);
}

// The direct Banach contraction about the R = 0 profile (lib/proof/direct.hpp, docs/method.md D1-D14).
int run_direct(const proof::CertifyRequest& req, const std::string& json_path) {
  const arith::Id R =
      boost::numeric::hull(arith::from_decimal<arith::Id>(req.R_lo), arith::from_decimal<arith::Id>(req.R_hi));
  const proof::DirectResult r = proof::certify_direct(R);
  nlohmann::json j = proof::to_json(r);
  j["R"] = nlohmann::json::array({req.R_lo, req.R_hi});
  j["caution"] = certificate::kCaution;
  if (json_path != "-") {
    std::printf("porecert verify --method direct: Berman half-channel, R = %s%s%s, about the R = 0 profile\n",
                req.R_lo.c_str(), req.R_lo == req.R_hi ? "" : " .. ", req.R_lo == req.R_hi ? "" : req.R_hi.c_str());
    for (const auto& q : j["inequalities"])
      std::printf("  %-40s %s  lhs <= %s, rhs >= %s, margin >= %s\n", q.value("name", "").c_str(),
                  q.value("holds", "") == "yes" ? "holds" : "FAILS", q["lhs"][1].get<std::string>().c_str(),
                  q["rhs"][0].get<std::string>().c_str(), q["margin"][0].get<std::string>().c_str());
    if (r.certified)
      std::printf(
          "  CERTIFIED: unique solution in the weighted C3 ball of radius %.6g about (3 eta - eta^3)/2 "
          "(unique up to radius %.6g)\n",
          r.radius, r.uniqueness_radius);
    else
      std::printf("  NOT CERTIFIED: %s\n", r.reason.c_str());
    std::printf("  %s\n", certificate::kCaution);
  }
  if (!json_path.empty()) certificate::write_atomic(json_path, j.dump(2) + "\n");
  return proof::direct_exit_code(r);
}

int run_verify(const VerifyOptions& v) {
  proof::CertifyRequest req;
  certificate::Problem prob;
  std::string json_path = v.json;
  std::optional<model::Channel> channel;  // dimensional inputs (docs/units.md), from the case file
  if (!v.case_file.empty()) {
    const auto c = model::read_case_file(v.case_file);
    if (c.R) std::tie(req.R_lo, req.R_hi) = *c.R;
    if (c.branch) req.branch = *c.branch;
    if (c.start) req.start = c.start;
    if (c.modes) req.modes = *c.modes;
    if (c.precision_bits) req.precision_bits = *c.precision_bits;
    if (c.certificate && json_path.empty()) json_path = *c.certificate;
    prob.scenario = c.title;
    if (!c.channel.empty()) channel = model::read_channel(c.channel);
    req.model = spec_from(v.mo, &c);
  } else {
    req.model = spec_from(v.mo);
  }
  if (!v.R.empty() && channel)
    throw input_error("--R: '" + v.R + "' given with a case file whose [channel] table determines R (rule: give one)");
  if (!v.R.empty()) std::tie(req.R_lo, req.R_hi) = model::parse_R("--R", v.R);
  if (req.R_lo.empty())
    throw input_error("--R: missing (give --R=VALUE or --R=LO:HI, or a case file with flow.reynolds)");
  if (!v.branch.empty()) req.branch = v.branch;
  if (!v.start.empty()) {
    req.start = parse_start(v.start);
    if (v.branch.empty()) req.branch = "";
  }
  if (v.precision) req.precision_bits = v.precision;
  if (v.modes) req.modes = v.modes;
  if (req.branch != "I" && req.branch != "II" && req.branch != "III" && !req.branch.empty())
    throw input_error("--branch: '" + req.branch + "' is not a branch (rule: I, II or III, or give --start a,b)");
  if (req.branch.empty() && !req.start)
    throw input_error("--start: needed when no branch is named (rule: --branch I or --start a,b)");
  if (req.precision_bits != 0 && (req.precision_bits < 53 || req.precision_bits > 4096))
    throw input_error("--precision: " + std::to_string(req.precision_bits) + " is outside 53..4096 bits");
  if (req.modes != 0 && (req.modes < 8 || req.modes > 4000))
    throw input_error("--modes: " + std::to_string(req.modes) + " is outside 8..4000");
  if (v.method != "auto" && v.method != "newton" && v.method != "direct" && v.method != "reduced")
    throw input_error("--method: '" + v.method + "' is not a method (rule: auto, newton, reduced or direct)");
  if (!req.model.is_berman() && req.branch != "I" && !req.start)
    throw input_error("--branch: '" + req.branch + "' is for Berman's model only (rule: with --model " +
                      req.model.name + " use --branch I or --start a,b, or porecert branches)");
  if (req.model.is_taylor() && channel)
    throw input_error(
        "[channel]: given with model 'pipe' (rule: the dimensional results of docs/units.md are for "
        "the channel models; the pipe has none yet)");
  if (req.model.is_taylor() && req.start)
    throw input_error("--start: not for --model " + req.model.name +
                      " (rule: the porous pipe is certified on the branch continued from R = 0; use --branch I)");
  if (req.model.is_taylor() && req.precision_bits > 53)
    throw input_error(
        "--precision: " + std::to_string(req.precision_bits) + " with --model " + req.model.name +
        " (rule: --precision 53 or automatic; automatic adds MPFR 128 bits for the candidate and Y0 when the double "
        "proof fails on Y0, docs/models.md §2)");
  if (!req.model.is_berman() && (v.method == "direct" || v.method == "reduced"))
    throw input_error("--method: '" + v.method + "' is for Berman's model only (rule: with --model " + req.model.name +
                      " use newton or auto)");
  if (!json_path.empty()) certificate::check_output(json_path);  // before the run, not after it
  if (v.method == "direct") return run_direct(req, json_path);
  req.method = v.method;
  prob.R_lo = req.R_lo;
  prob.R_hi = req.R_hi;
  prob.branch = req.start ? "" : req.branch;

  // Types II and III: the branch search, then the solution whose certified label matches.
  const proof::CertifyOutcome o = proof::certify_labelled(req);
  nlohmann::json cert = certificate::to_json(prob, o);
  std::string c3_line;
  {  // C3-ball uniqueness: direct contraction about the Newton candidate (lib/proof/direct_candidate.hpp, D15-D25).
    const arith::Id R =
        boost::numeric::hull(arith::from_decimal<arith::Id>(req.R_lo), arith::from_decimal<arith::Id>(req.R_hi));
    if (o.certified && req.model.is_berman() && boost::numeric::abs(R).upper() <= 2) {
      const auto u = proof::c3_uniqueness_from_newton(o, R);
      cert["c3_uniqueness"] = proof::to_json(u);
      c3_line = u.direct.certified
                    ? "  C3 ball:   unique solution within weighted C3 radius " +
                          cert["c3_uniqueness"]["uniqueness_radius"].get<std::string>() +
                          " of the candidate (direct contraction, w = 115,30,5,1)"
                    : "  C3 ball:   not certified (" + std::string(u.direct.reason.substr(0, 80)) + "...)";
    }
  }
  if (channel && o.certified) {
    cert["dimensional"] = certificate::dimensional_json(*channel, o.fp0_id, o.fpp1_id, o.K_id);
  }
  const std::string text = cert.dump(2) + "\n";
  if (json_path != "-") print_summary(o, req.R_lo, req.R_hi, prob.branch);
  if (json_path != "-" && !c3_line.empty()) std::printf("%s\n", c3_line.c_str());
  if (json_path != "-" && cert.contains("dimensional")) {
    std::printf("  dimensional results (docs/units.md; R from the [channel] inputs):\n");
    for (const auto& [k, r] : cert["dimensional"]["results"].items())
      std::printf("    %-54s in [%s, %s] %s\n", r["label"].get<std::string>().c_str(),
                  r["value"][0].get<std::string>().c_str(), r["value"][1].get<std::string>().c_str(),
                  r["unit"].get<std::string>().c_str());
  }
  if (!json_path.empty()) {
    certificate::write_atomic(json_path, text);
    if (json_path != "-") std::printf("  certificate written to %s\n", json_path.c_str());
  }
  return o.certified ? 0 : 1;
}

}  // namespace

Action register_verify(CLI::App& app) {
  auto* sub = app.add_subcommand("verify", "Certify one solution of Berman's problem at R (a number or an interval)");
  auto v = std::make_shared<VerifyOptions>();
  sub->add_option("case", v->case_file, "Case file (TOML, docs/case-files.md)");
  sub->add_option("--R", v->R, "Wall Reynolds number: VALUE or LO:HI (decimal; R > 0 suction)")
      ->allow_extra_args(false);
  sub->add_option("--branch", v->branch, "Solution branch: I (continuation from R = 0), II or III (branch search)");
  sub->add_option("--start", v->start, "Shooting guess a,b for f'(0), f'''(0) (instead of --branch)");
  sub->add_option("--precision", v->precision, "Interval precision in bits (53 = double; default: automatic)");
  sub->add_option("--modes", v->modes, "Chebyshev modes (default: from coefficient decay and the tail bound)");
  sub->add_option("--json", v->json, "Write the certificate (JSON) to PATH, or - for stdout");
  sub->add_option(
      "--method", v->method,
      "Proof method: auto (default), newton (Newton-Kantorovich about a Chebyshev candidate), reduced (validated "
      "Taylor integration of the symmetry-reduced ODE, docs/method.md S) or direct (contraction about the R = 0 "
      "profile)");
  add_model_options(sub, v->mo);
  return [v] { return run_verify(*v); };
}

// Re-proves a `porecert fold` result from its stored candidate; the stated fold_R must contain it.
int recheck_fold_file(const std::string& path, const nlohmann::json& j) {
  const auto bad = [&](const std::string& what) {
    return input_error("fold certificate '" + path + "': " + what + " (truncated or not written by porecert fold?)");
  };
  if (!j.contains("candidate") || !j["candidate"].is_object() || !j["candidate"].contains("coefficients_hex") ||
      !j["candidate"]["coefficients_hex"].is_array())
    throw bad("key \"candidate.coefficients_hex\" is missing");
  if (!j["candidate"].contains("precision_bits") || !j["candidate"]["precision_bits"].is_number_integer())
    throw bad("key \"candidate.precision_bits\" is missing or not an integer");
  if (!j.contains("fold_R") || !j["fold_R"].is_array() || j["fold_R"].size() != 2 || !j["fold_R"][0].is_string() ||
      !j["fold_R"][1].is_string())
    throw bad("key \"fold_R\" must be [lo, hi] as decimal strings");
  std::vector<std::string> hex;
  for (const auto& c : j["candidate"]["coefficients_hex"]) {
    if (!c.is_string()) throw bad("candidate.coefficients_hex holds a non-string");
    hex.push_back(c.get<std::string>());
  }
  proof::FoldOutcome o;
  try {
    const std::string kind =
        j.contains("kind") && j["kind"].is_string() ? j["kind"].get<std::string>() : "turning-point";
    if (kind != "turning-point" && kind != "symmetry-breaking")
      throw bad("key \"kind\" is \"" + kind + "\" (must be turning-point or symmetry-breaking)");
    o = proof::recheck_fold(hex, j["candidate"]["precision_bits"].get<int>(),
                            kind == "symmetry-breaking" ? proof::fold::kEvenPerturbation : proof::fold::kTurningPoint);
  } catch (const std::invalid_argument& e) {
    throw bad(e.what());
  }
  std::printf("porecert recheck: %s (fold, %d modes, %d bits)\n", path.c_str(), o.modes, o.precision_bits);
  if (!o.certified) {
    std::printf("  REJECTED: the proof does not go through: %s\n", o.failure.c_str());
    return 1;
  }
  arith::PrecisionScope exact(1024);
  auto num = [](const std::string& d) { return arith::from_decimal<arith::Im>(d).lower(); };
  const std::string lo = j["fold_R"][0].get<std::string>(), hi = j["fold_R"][1].get<std::string>();
  if (!(num(lo) <= num(o.R_lo) && num(o.R_hi) <= num(hi))) {
    std::printf("  REJECTED: stated fold_R = [%s, %s] does not contain the re-proved [%s, %s]\n", lo.c_str(),
                hi.c_str(), o.R_lo.c_str(), o.R_hi.c_str());
    return 1;
  }
  std::printf("  CONFIRMED: fold R* in [%s, %s] re-proved from the stored candidate (%.2f s)\n", o.R_lo.c_str(),
              o.R_hi.c_str(), o.seconds);
  return 0;
}

// Re-check of a reduced-method certificate (docs/method.md §S) or of a model other than Berman's:
// the proof is re-run from the stored candidate alone (reduced: at a different precision, 53 → 64
// bits, b → b + 64) and every stated value must contain the re-proved one.
int recheck_stated_values(const std::string& path, const certificate::Stored& s) {
  const bool reduced = s.method == "reduced-ivp";
  const int bits = !reduced ? s.precision_bits : s.precision_bits <= 53 ? 64 : s.precision_bits + 64;
  proof::CertifyOutcome o;
  const auto t0 = std::chrono::steady_clock::now();
  try {
    o = reduced ? proof::outcome_of(proof::reduced_prove(s.problem.R_lo, s.problem.R_hi, s.eps, s.nth, s.reduced_s[0],
                                                         s.reduced_s[1], s.reduced_s[2], s.reduced_s[3], bits))
                : proof::recheck_model(s.model, s.problem.R_lo, s.problem.R_hi, s.candidate_hex, s.precision_bits,
                                       s.tangent_hex);
  } catch (const std::invalid_argument& e) {
    throw input_error("certificate '" + path + "': " + e.what());
  }
  o.seconds = std::chrono::duration<double>(std::chrono::steady_clock::now() - t0).count();
  std::printf("porecert recheck: %s (R = [%s, %s], %s; stored at %d bits, re-run at %d bits)\n", path.c_str(),
              s.problem.R_lo.c_str(), s.problem.R_hi.c_str(),
              reduced ? "reduced ODE" : (std::to_string(o.modes) + " modes, " + s.model.name).c_str(), s.precision_bits,
              bits);
  if (!o.certified) {
    std::printf("  REJECTED: the proof does not go through: %s\n", o.failure.c_str());
    return 1;
  }
  bool ok = reduced || o.existence_radius <= s.existence_radius;
  if (!ok)
    std::printf("  REJECTED: re-computed existence radius %.17g exceeds the stated %.17g\n", o.existence_radius,
                s.existence_radius);
  // Compare decimal strings exactly: rounding both the same way at 1024 bits preserves their order.
  arith::PrecisionScope exact(1024);
  auto num = [](const std::string& d) { return arith::from_decimal<arith::Im>(d).lower(); };
  for (const auto& nv : o.values) {  // the model's keys (docs/models.md)
    const std::array<std::string, 2>* stated = nullptr;
    for (const auto& [k, v] : s.named_values)
      if (k == nv.key) stated = &v;
    if (!stated) {
      std::printf("  REJECTED: the certificate states no value for %s\n", nv.key.c_str());
      ok = false;
      continue;
    }
    const bool holds = num((*stated)[0]) <= num(nv.enc.lo) && num(nv.enc.hi) <= num((*stated)[1]);
    std::printf("  %-4s values.%-21s stated [%s, %s], re-proved [%s, %s]\n", holds ? "ok" : "FAIL", nv.key.c_str(),
                (*stated)[0].c_str(), (*stated)[1].c_str(), nv.enc.lo.c_str(), nv.enc.hi.c_str());
    ok = ok && holds;
  }
  std::printf(ok ? "  CONFIRMED: proof re-run from the stored candidate; every stated value holds (%.2f s)\n"
                 : "  REJECTED: a stated value does not contain the re-proved one (%.2f s)\n",
              o.seconds);
  return ok ? 0 : 1;
}

Action register_recheck(CLI::App& app) {
  auto* sub = app.add_subcommand("recheck", "Re-run the proof from a certificate's own content and compare");
  auto path = std::make_shared<std::string>();
  sub->add_option("certificate", *path, "Certificate file (JSON)")->required();
  return [path] {
    certificate::Stored s;
    nlohmann::json doc;
    try {
      doc = certificate::read_file(*path);
      if (doc.is_object() && doc.value("format", "") == "porecert-fold") return recheck_fold_file(*path, doc);
      s = certificate::parse(doc);
    } catch (const certificate::format_error& e) {
      throw input_error(e.what());
    }
    if (s.status != "certified") {
      std::printf("porecert recheck: %s: the certificate claims no proof (status \"%s\")\n", path->c_str(),
                  s.status.c_str());
      return 1;
    }
    if (s.method == "reduced-ivp" || !s.model.is_berman()) return recheck_stated_values(*path, s);
    certificate::RecheckReport rep;
    try {
      rep = certificate::independent_recheck(doc);
    } catch (const certificate::format_error& e) {
      throw input_error(e.what());
    }
    std::printf("porecert recheck: %s (R = [%s, %s], %d modes; stored at %d bits, re-derived at MPFR %d bits)\n",
                path->c_str(), s.problem.R_lo.c_str(), s.problem.R_hi.c_str(), rep.modes, s.precision_bits,
                rep.precision_bits);
    if (!rep.proof_ok) {
      std::printf("  REJECTED: the proof does not go through: %s\n", rep.failure.c_str());
      return 1;
    }
    const certificate::RecheckField* first = nullptr;
    for (const auto& f : rep.fields) {
      std::printf("  %-4s %-28s %s\n", f.ok ? "ok" : "FAIL", f.field.c_str(), f.detail.c_str());
      if (!f.ok && !first) first = &f;
    }
    if (first) {
      std::printf("  REJECTED: first mismatch in field %s\n", first->field.c_str());
      return 1;
    }
    std::printf("  CONFIRMED: every stored bound, radius, error bound and value re-derived independently (%.2f s)\n",
                rep.seconds);
    return 0;
  };
}

}  // namespace porecert::cli
