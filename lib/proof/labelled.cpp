#include "proof/labelled.hpp"

#include "proof/branches.hpp"
#include "proof/reduced_ivp.hpp"

namespace porecert::proof {

CertifyOutcome certify_labelled(const CertifyRequest& req) {
  if (req.method == "reduced" || (req.branch != "II" && req.branch != "III")) return certify_berman(req);
  // Type II from kTypeIIChartFrom (the chart eps = +1 with s > 0 holds it down to R ≈ 13.12, where
  // f'(0) -> 0, docs/branches.md) and type III above kSearchUpToR: prove that chart alone, without the
  // other branches and the Chebyshev search (a sweep box of type II at R = 40 cost 15 s with them).
  if (req.model.is_berman() && !req.start) {
    const arith::Id R =
        boost::numeric::hull(arith::from_decimal<arith::Id>(req.R_lo), arith::from_decimal<arith::Id>(req.R_hi));
    const double Rm = arith::mid_double(R);
    std::optional<CertifyOutcome> direct;
    const bool box = req.R_lo != req.R_hi;
    if (req.branch == "II" && R.lower() >= kTypeIIChartFrom)
      direct = certify_reduced(req, 1, 1, reduced_guess(Rm, 1, 1, 1));
    if (direct && box && req.branch == "II" && !(direct->certified && direct->structure.label == "II")) {
      // A box of type II is not retried with the Chebyshev search: its Newton-Kantorovich boxes below
      // R = 40 did not finish [20, 20.5] in 900 s (docs/performance.md), so a failure here is a gap.
      if (direct->certified) {
        direct->certified = false;
        direct->failure = "the reduced proof holds but its certified structure is '" + direct->structure.label +
                          "', not type II";
      }
      return *direct;
    }
    else if (req.branch == "III" && R.lower() > kSearchUpToR)
      direct = certify_reduced(req, -1, 2, reduced_guess(Rm, -1, 2, 1));
    if (direct && direct->certified && direct->structure.label == req.branch) return *direct;
    // Above kSearchUpToR certify_branches would run the same reduced proof again: say why it failed.
    if (direct && R.lower() > kSearchUpToR) {
      if (direct->certified) {
        direct->certified = false;
        direct->failure = "the reduced proof holds but its certified structure is '" + direct->structure.label +
                          "', not type " + req.branch;
      }
      return *direct;
    }
  }
  const auto all = certify_branches(req);
  for (const auto& s : all.solutions)
    if (s.certified && s.structure.label == req.branch) return s;
  CertifyOutcome o;
  o.failure = "no certified solution with the structure of type " + req.branch + " was found in the searched region (" +
              all.region + ")";
  o.log = all.log;
  return o;
}

}  // namespace porecert::proof
