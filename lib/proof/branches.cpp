#include "proof/branches.hpp"

#include "arith/fp_env.hpp"
#include "candidate/branch_search.hpp"
#include "candidate/model_search.hpp"

namespace porecert::proof {

arith::Tri distinct(const CertifyOutcome& a, const CertifyOutcome& b) {
  if (!a.certified || !b.certified) return arith::Tri::unsure;
  const arith::Id* pa[4] = {&a.fp0_id, &a.K_id, &a.fpp1_id, &a.fppp0_id};
  const arith::Id* pb[4] = {&b.fp0_id, &b.K_id, &b.fpp1_id, &b.fppp0_id};
  for (int i = 0; i < 4; ++i)
    if (arith::tri_disjoint(*pa[i], *pb[i]) == arith::Tri::yes) return arith::Tri::yes;
  for (const auto& va : a.values)  // the model's own value keys (docs/models.md)
    for (const auto& vb : b.values)
      if (va.key == vb.key && arith::tri_disjoint(va.id, vb.id) == arith::Tri::yes) return arith::Tri::yes;
  return arith::Tri::unsure;
}

BranchesOutcome certify_branches(const CertifyRequest& req) {
  const arith::FpEnvScope fp_env;  // caller's rounding mode and flags restored on exit (arith/fp_env.hpp)
  BranchesOutcome out;
  if (req.model.is_taylor()) {  // no branch search in a Taylor basis: the branch from R = 0 only
    out.solutions.push_back(certify_berman(req));
    out.origins.push_back("continuation from R = 0 (Taylor basis, docs/models.md §2)");
    out.region =
        "no search: only the solution continued in R from the exact R = 0 solution F = 2 xi - xi^2 (Taylor basis, "
        "docs/models.md §2); other solutions of the pipe equation at this R, if any, were not looked for";
    out.pairwise_disjoint = out.solutions[0].certified;  // one solution: nothing to separate
    return out;
  }
  const arith::Id R =
      boost::numeric::hull(arith::from_decimal<arith::Id>(req.R_lo), arith::from_decimal<arith::Id>(req.R_hi));
  const double Rm = arith::mid_double(R);
  if (R.lower() >= kReducedFromR && req.model.is_berman()) {
    // Strong suction: types I and II by the reduced method (docs/method.md §S), one on each side of
    // s = 0; the Chebyshev search only below kSearchUpToR (its proofs stop closing above).
    for (int sign_s : {-1, 1}) {
      out.solutions.push_back(certify_reduced(req, 1, 1, reduced_guess(Rm, 1, 1, sign_s)));
      out.origins.push_back(std::string("reduced shooting, f'(0) > 0, s ") + (sign_s < 0 ? "< 0" : "> 0"));
    }
    out.region = "reduced shape parameter s of either sign with f'(0) > 0 and the wall at the first zero of f'";
    if (Rm <= kSearchUpToR) {
      const auto search = candidate::find_branches(Rm, req.max_modes);
      out.region += "; " + search.region;
      out.log = search.log;
      for (const auto& f : search.found) {
        CertifyOutcome c = certify_from(req, f.x);
        bool dup = false;  // the same solution as a reduced one (not disjoint from it)?
        for (std::size_t i = 0; i < 2; ++i)
          dup = dup || (out.solutions[i].certified && c.certified && distinct(c, out.solutions[i]) != arith::Tri::yes);
        if (dup) continue;
        out.solutions.push_back(std::move(c));
        out.origins.push_back(f.origin);
      }
    } else {
      // Type III by the reduced method in the chart eps = -1 (f'(0) < 0), the wall at the second zero
      // of f' (the first is where the reversed core flow turns), kept as a Lohner QR set (S13)-(S15).
      out.solutions.push_back(certify_reduced(req, -1, 2, reduced_guess(Rm, -1, 2, 1)));
      out.origins.push_back("reduced shooting, f'(0) < 0, wall at the second zero of f'");
      out.region +=
          "; type III: reduced shape parameter s > 0 with f'(0) < 0 and the wall at the second zero of f', one "
          "Newton start from a table of measured s (solutions with f'(0) < 0 elsewhere were not looked for above R "
          "= " +
          std::to_string(static_cast<int>(kSearchUpToR)) + ")";
    }
  } else {
    const auto search = req.model.is_berman() ? candidate::find_branches(Rm, req.max_modes)
                                              : candidate::find_model_solutions(req.model, Rm, req.max_modes);
    out.region = search.region;
    out.log = search.log;
    for (const auto& f : search.found) {
      out.solutions.push_back(certify_from(req, f.x));
      out.origins.push_back(f.origin);
    }
  }
  bool all = !out.solutions.empty();
  for (std::size_t i = 0; i < out.solutions.size(); ++i)
    for (std::size_t j = i + 1; j < out.solutions.size(); ++j)
      all = all && distinct(out.solutions[i], out.solutions[j]) == arith::Tri::yes;
  for (const auto& s : out.solutions) all = all && s.certified;
  out.pairwise_disjoint = all;
  return out;
}

}  // namespace porecert::proof
