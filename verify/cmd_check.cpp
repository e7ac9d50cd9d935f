// porecert import / porecert check: certify a submission from another program and judge claims
// about it (docs/reviewing.md).
#include <cstdio>

#include "candidate/import.hpp"
#include "certificate/certificate.hpp"
#include "commands.hpp"
#include "model/claims_file.hpp"
#include "proof/claims.hpp"
#include "proof/submission.hpp"

namespace porecert::cli {

namespace {

nlohmann::json distance_json(const proof::SubmissionDistance& d) {
  nlohmann::json j;
  j["definition"] = d.definition;
  auto gap = [](const proof::Gap& g) {
    return nlohmann::json{{"lower", arith::decimal_lower(arith::Id(g.lower), 3)},
                          {"upper", arith::decimal_upper(arith::Id(g.upper), 3)},
                          {"to_candidate_upper", arith::decimal_upper(arith::Id(g.to_candidate_upper), 3)}};
  };
  const char* keys[4] = {"sup|P0 - f|", "sup|P1 - f'|", "sup|P2 - f''|", "sup|P3 - f'''|"};
  for (int k = 0; k < 4; ++k)
    if (d.sup[k]) j[keys[k]] = gap(*d.sup[k]);
  if (d.fp0) j["|a - f'(0)|"] = gap(*d.fp0);
  if (d.fppp0) j["|b - f'''(0)|"] = gap(*d.fppp0);
  return j;
}

void print_distance(const proof::SubmissionDistance& d) {
  std::printf("  distance of the submission from the certified solution (%s):\n", d.definition.c_str());
  const char* names[4] = {"f", "f'", "f''", "f'''"};
  for (int k = 0; k < 4; ++k)
    if (d.sup[k])
      std::printf("    sup|submitted %-4s - true %-4s| in [%.3g, %.3g]\n", names[k], names[k], d.sup[k]->lower,
                  d.sup[k]->upper);
  if (d.fp0) std::printf("    |submitted f'(0) - true f'(0)|     in [%.3g, %.3g]\n", d.fp0->lower, d.fp0->upper);
  if (d.fppp0) std::printf("    |submitted f'''(0) - true f'''(0)| in [%.3g, %.3g]\n", d.fppp0->lower, d.fppp0->upper);
}

void print_outcome(const proof::SubmissionOutcome& r) {
  const auto& o = r.outcome;
  for (const auto& l : r.log) std::printf("    %s\n", l.c_str());
  if (!o.certified) {
    std::printf("  NOT CERTIFIED: %s\n", o.failure.c_str());
    return;
  }
  std::printf(
      "  CERTIFIED (%s): true solution within %.3g of the %s candidate, unique within %.3g\n",
      o.precision_bits <= 53 ? "double intervals" : ("MPFR " + std::to_string(o.precision_bits) + " bits").c_str(),
      o.existence_radius, r.used_refinement ? "Newton-refined" : "submitted", o.uniqueness_radius);
  if (!o.model.is_berman()) {  // the model's own value keys (docs/models.md §0)
    for (const auto& nv : o.values)
      std::printf("  %-8s in [%s, %s]\n", nv.key.c_str(), nv.enc.lo.c_str(), nv.enc.hi.c_str());
  } else {
    std::printf("  f''(1) in [%s, %s]   K in [%s, %s]\n", o.fpp1.lo.c_str(), o.fpp1.hi.c_str(), o.K.lo.c_str(),
                o.K.hi.c_str());
  }
  if (r.distance) print_distance(*r.distance);
}

candidate::Submission submission_of(const model::ClaimsFile& f) {
  if (f.csv) return candidate::read_csv(*f.csv);
  if (f.chebyshev) return candidate::read_chebyshev_json(*f.chebyshev);
  return candidate::shooting(f.start->first, f.start->second);
}

proof::CertifyRequest request_of(const model::ClaimsFile& f) {
  proof::CertifyRequest req;
  req.R_lo = f.R_lo;
  req.R_hi = f.R_hi;
  req.modes = f.modes;
  req.precision_bits = f.precision_bits;
  req.model = f.model;
  if (f.model.is_taylor() && f.precision_bits > 53)
    throw input_error("[candidate] precision_bits: " + std::to_string(f.precision_bits) +
                      " with [model] name = \"pipe\" (rule: 53 or 0 = automatic; docs/models.md §2)");
  return req;
}

}  // namespace

Action register_import(CLI::App& app) {
  auto* sub = app.add_subcommand("import", "Certify a solution submitted by another program and bound its true error");
  struct Opts {
    std::string file, R, json, kind = "auto";
  };
  auto o = std::make_shared<Opts>();
  sub->add_option("file", o->file, "CSV of samples (x,f[,f',f'',f''']) or Chebyshev series (JSON)")->required();
  sub->add_option("--R", o->R, "Wall Reynolds number: VALUE or LO:HI")->required();
  sub->add_option("--json", o->json, "Write the certificate (with a 'submission' block) to PATH, or - for stdout");
  return [o] {
    const auto [lo, hi] = model::parse_R("--R", o->R);
    const bool json_file = o->file.size() > 5 && o->file.substr(o->file.size() - 5) == ".json";
    const candidate::Submission s = json_file ? candidate::read_chebyshev_json(o->file) : candidate::read_csv(o->file);
    proof::CertifyRequest req;
    req.R_lo = lo;
    req.R_hi = hi;
    const auto r = proof::certify_submission(req, s);
    if (o->json != "-") {
      std::printf("porecert import: %s, R = %s\n", o->file.c_str(), o->R.c_str());
      print_outcome(r);
      std::printf("  %s\n", certificate::kCaution);
    }
    if (!o->json.empty()) {
      certificate::Problem p{lo, hi, "", "import of " + o->file};
      nlohmann::json cert = certificate::to_json(p, r.outcome);
      if (r.distance) cert["submission"] = distance_json(*r.distance);
      certificate::write_atomic(o->json, cert.dump(2) + "\n");
    }
    return r.outcome.certified ? 0 : 1;
  };
}

Action register_check(CLI::App& app) {
  auto* sub = app.add_subcommand("check", "Judge the claims of a claims file: accepted, rejected or undecided");
  auto path = std::make_shared<std::string>();
  auto json = std::make_shared<std::string>();
  sub->add_option("claims", *path, "Claims file (TOML, docs/reviewing.md)")->required();
  sub->add_option("--json", *json, "Write the verdicts (JSON) to PATH, or - for stdout");
  return [path, json] {
    const model::ClaimsFile f = model::read_claims_file(*path);
    const proof::CertifyRequest req = request_of(f);
    proof::SubmissionOutcome r;
    std::string source;
    if (f.branch) {
      r.outcome = proof::certify_berman(req);
      r.log = r.outcome.log;
      source = "branch I";
    } else if (!f.model.is_berman()) {  // a shooting start in the model's own variable (docs/models.md §6)
      proof::CertifyRequest rs = req;
      rs.branch = "";
      rs.start = std::make_pair(arith::mid_double(arith::from_decimal<arith::Id>(f.start->first)),
                                arith::mid_double(arith::from_decimal<arith::Id>(f.start->second)));
      r.outcome = proof::certify_berman(rs);
      r.log = r.outcome.log;
      source = "start = [" + f.start->first + ", " + f.start->second + "]";
    } else {
      const candidate::Submission s = submission_of(f);
      source = f.csv ? *f.csv : f.chebyshev ? *f.chebyshev : "start = [" + s.a + ", " + s.b + "]";
      r = proof::certify_submission(req, s);
    }
    const auto verdicts = proof::judge(f, req, r.outcome);
    int rejected = 0, undecided = 0;
    for (const auto& v : verdicts) {
      rejected += v.holds == arith::Tri::no;
      undecided += v.holds == arith::Tri::unsure;
    }
    if (*json != "-") {
      std::printf("porecert check: %s (%s, R = %s%s%s, candidate: %s)\n", path->c_str(),
                  model::describe(f.model).c_str(), f.R_lo.c_str(), f.R_lo == f.R_hi ? "" : " .. ",
                  f.R_lo == f.R_hi ? "" : f.R_hi.c_str(), source.c_str());
      print_outcome(r);
      for (const auto& v : verdicts) {
        std::printf("  claim %d: %-9s %s\n", v.index, proof::verdict_word(v.holds), v.claim.c_str());
        std::printf("             %s\n", v.evidence.c_str());
        if (!v.to_decide.empty()) std::printf("             to decide: %s\n", v.to_decide.c_str());
      }
      std::printf("  %zu claims: %zu accepted, %d rejected, %d undecided. %s\n", verdicts.size(),
                  verdicts.size() - rejected - undecided, rejected, undecided, certificate::kCaution);
    }
    if (!json->empty()) {
      nlohmann::json j;
      j["format"] = "porecert-verdicts";
      j["format_version"] = 1;
      j["claims_file"] = *path;
      j["R"] = nlohmann::json::array({f.R_lo, f.R_hi});
      nlohmann::json mp = nlohmann::json::object();
      for (const auto& [k, v] : f.model.params) mp[k] = v;
      j["model"] = {{"name", f.model.name}, {"parameters", mp}, {"id", model::model_id_of(f.model)}};
      j["candidate_source"] = source;
      j["certified"] = r.outcome.certified;
      j["log"] = r.log;
      if (r.distance) j["submission"] = distance_json(*r.distance);
      j["verdicts"] = nlohmann::json::array();
      for (const auto& v : verdicts)
        j["verdicts"].push_back({{"index", v.index},
                                 {"claim", v.claim},
                                 {"verdict", proof::verdict_word(v.holds)},
                                 {"evidence", v.evidence},
                                 {"to_decide", v.to_decide}});
      if (r.outcome.certified) {
        certificate::Problem p{f.R_lo, f.R_hi, "", "claims file " + *path};
        j["certificate"] = certificate::to_json(p, r.outcome);
      }
      j["caution"] = certificate::kCaution;
      certificate::write_atomic(*json, j.dump(2) + "\n");
    }
    return rejected ? 1 : undecided ? 3 : 0;
  };
}

}  // namespace porecert::cli
