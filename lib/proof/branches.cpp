#include "proof/branches.hpp"

#include "arith/fp_env.hpp"
#include "candidate/branch_search.hpp"

namespace porecert::proof {

arith::Tri distinct(const CertifyOutcome& a, const CertifyOutcome& b) {
  if (!a.certified || !b.certified) return arith::Tri::unsure;
  const arith::Id* pa[4] = {&a.fp0_id, &a.K_id, &a.fpp1_id, &a.fppp0_id};
  const arith::Id* pb[4] = {&b.fp0_id, &b.K_id, &b.fpp1_id, &b.fppp0_id};
  for (int i = 0; i < 4; ++i)
    if (arith::tri_disjoint(*pa[i], *pb[i]) == arith::Tri::yes) return arith::Tri::yes;
  return arith::Tri::unsure;
}

BranchesOutcome certify_branches(const CertifyRequest& req) {
  const arith::FpEnvScope fp_env;  // caller's rounding mode and flags restored on exit (arith/fp_env.hpp)
  BranchesOutcome out;
  const arith::Id R =
      boost::numeric::hull(arith::from_decimal<arith::Id>(req.R_lo), arith::from_decimal<arith::Id>(req.R_hi));
  const auto search = candidate::find_branches(arith::mid_double(R), req.max_modes);
  out.region = search.region;
  out.log = search.log;
  for (const auto& f : search.found) {
    out.solutions.push_back(certify_from(req, f.x));
    out.origins.push_back(f.origin);
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
