// porecert branches: every solution the search finds at R, certified, labelled, proved distinct.
#include <cstdio>

#include "certificate/certificate.hpp"
#include "commands.hpp"
#include "model_options.hpp"
#include "proof/branches.hpp"

namespace porecert::cli {

Action register_branches(CLI::App& app) {
  auto* sub = app.add_subcommand("branches", "Find, certify and separate all solution branches at R");
  struct Opts {
    std::string R, json;
    int precision = 0;
    ModelOptions mo;
  };
  auto o = std::make_shared<Opts>();
  sub->add_option("--R", o->R, "Wall Reynolds number: VALUE or LO:HI")->required();
  sub->add_option("--json", o->json, "Write the result (JSON) to PATH, or - for stdout");
  sub->add_option("--precision", o->precision, "Interval precision in bits (default: automatic)");
  add_model_options(sub, o->mo);
  return [o] {
    proof::CertifyRequest req;
    req.model = spec_from(o->mo);
    std::tie(req.R_lo, req.R_hi) = model::parse_R("--R", o->R);
    if (o->precision != 0 && (o->precision < 53 || o->precision > 4096))
      throw input_error("--precision: " + std::to_string(o->precision) + " is outside 53..4096 bits");
    req.precision_bits = o->precision;
    if (!o->json.empty()) certificate::check_output(o->json);
    const auto b = proof::certify_branches(req);
    nlohmann::json j;
    j["format"] = "porecert-branches";
    j["R"] = nlohmann::json::array({req.R_lo, req.R_hi});
    j["searched_region"] = b.region;
    j["pairwise_disjoint"] = b.pairwise_disjoint;
    j["model"] = model::model_id_of(req.model);
    j["claim"] =
        "each certified solution exists and is unique in its ball; no claim is made about solutions outside "
        "the searched region";
    j["solutions"] = nlohmann::json::array();
    const bool quiet = o->json == "-";
    if (!quiet)
      std::printf("porecert branches: %s, R = %s%s%s\n  searched: %s\n", model::describe(req.model).c_str(),
                  req.R_lo.c_str(), req.R_lo == req.R_hi ? "" : " .. ", req.R_lo == req.R_hi ? "" : req.R_hi.c_str(),
                  b.region.c_str());
    for (std::size_t i = 0; i < b.solutions.size(); ++i) {
      const auto& s = b.solutions[i];
      certificate::Problem p{req.R_lo, req.R_hi, "", ""};
      auto cj = certificate::to_json(p, s);
      cj["found_by"] = b.origins[i];
      j["solutions"].push_back(cj);
      if (quiet) continue;
      if (!s.certified) {
        std::printf("  [%zu] NOT CERTIFIED (%s): %s\n", i + 1, b.origins[i].c_str(), s.failure.c_str());
        continue;
      }
      if (!req.model.is_berman()) {  // the model's own value keys (docs/models.md)
        std::printf("  [%zu] %s%s\n", i + 1, s.structure.label.empty() ? "" : ("type " + s.structure.label).c_str(),
                    s.structure.label.empty() ? "(unlabelled)" : "");
        for (const auto& nv : s.values)
          std::printf("        %-8s in [%s, %s]\n", nv.key.c_str(), nv.enc.lo.c_str(), nv.enc.hi.c_str());
        std::printf("        existence radius %.3g, unique within %.3g; found by %s\n", s.existence_radius,
                    s.uniqueness_radius, b.origins[i].c_str());
        continue;
      }
      std::printf("  [%zu] type %-3s f'(0) in [%s, %s]\n        f''(1) in [%s, %s]  K in [%s, %s]\n", i + 1,
                  s.structure.label.c_str(), s.fp0.lo.c_str(), s.fp0.hi.c_str(), s.fpp1.lo.c_str(), s.fpp1.hi.c_str(),
                  s.K.lo.c_str(), s.K.hi.c_str());
      std::printf("        existence radius %.3g, unique within %.3g; %s\n", s.existence_radius, s.uniqueness_radius,
                  s.structure.reason.c_str());
      std::printf("        flow reversal: %s%s\n", arith::to_string(s.structure.reversal),
                  s.structure.reversal == arith::Tri::yes
                      ? (" on " + proof::spans_text(s.structure.reversal_where)).c_str()
                      : "");
    }
    if (!quiet) {
      std::printf("  %zu solution(s) found; pairwise distinct (disjoint enclosures): %s\n", b.solutions.size(),
                  b.pairwise_disjoint ? "proved" : "NOT proved");
      std::printf("  No claim is made about solutions outside the searched region. %s\n", certificate::kCaution);
    }
    if (!o->json.empty()) certificate::write_atomic(o->json, j.dump(2) + "\n");
    bool all = !b.solutions.empty();
    for (const auto& s : b.solutions) all = all && s.certified;
    return all && b.pairwise_disjoint ? 0 : 1;
  };
}

}  // namespace porecert::cli
