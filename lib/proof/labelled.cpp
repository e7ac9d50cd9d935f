#include "proof/labelled.hpp"

#include "candidate/reduced_shooting.hpp"
#include "proof/branches.hpp"
#include "proof/reduced_ivp.hpp"

namespace porecert::proof {

CertifyOutcome certify_labelled(const CertifyRequest& req) {
  if (req.method == "reduced" || (req.branch != "II" && req.branch != "III")) return certify_berman(req);
  if (req.model.is_berman() && !req.start && req.branch == "III") {
    // Type III up to kSearchUpToR: its Newton-Kantorovich proof needs only a start, and the reduced
    // shooting in the chart eps = -1, wall at the second zero of f' (docs/branches.md) gives one in
    // milliseconds on the III side of the fold (s < 1.4711), where the Chebyshev search over a grid of
    // starts costs seconds (a box [20, 20.004]: 7.6 s with it). Candidate side only: the proof is the
    // one of `--start`; for a point R a failure or another structure falls back to the search below.
    const arith::Id R =
        boost::numeric::hull(arith::from_decimal<arith::Id>(req.R_lo), arith::from_decimal<arith::Id>(req.R_hi));
    const double Rm = arith::mid_double(R);
    if (R.lower() > 12.1651 && R.upper() <= kSearchUpToR) {
      const candidate::ReducedBranch br{-1, 2};
      const auto s = candidate::reduced_solve(br, Rm, reduced_guess(Rm, -1, 2, 1));
      if (s && *s > 0 && *s < 1.4711L) {
        const auto shot = candidate::reduced_shoot(br, *s);
        if (shot.ok) {
          CertifyRequest q = req;
          const long double q2 = shot.sigma * shot.sigma;
          q.start = std::make_pair(static_cast<double>(-q2 / Rm), static_cast<double>(q2 * q2 * *s / Rm));
          CertifyOutcome o = certify_berman(q);
          o.log.insert(o.log.begin(), "start from the reduced shooting (eps = -1, second zero), s = " +
                                          std::to_string(static_cast<double>(*s)));
          if (o.certified && o.structure.label == "III") return o;
          // A box (sweep) is bisected instead: the search would prove the same solution from another
          // start, at 10-100 s a box (measured [50, 50.002]: 116 s, not certified either way).
          if (R.lower() < R.upper()) {
            if (o.certified) {
              o.certified = false;
              o.failure = "the proof holds but its certified structure is '" + o.structure.label + "', not type III";
            }
            return o;
          }
        }
      }
    }
  }
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
