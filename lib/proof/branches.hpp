// Every solution the search finds at R, each certified, labelled by its certified structure,
// and proved pairwise distinct by disjoint enclosures (docs/branches.md).
#pragma once
#include <string>
#include <vector>

#include "proof/certify.hpp"

namespace porecert::proof {

struct BranchesOutcome {
  std::vector<CertifyOutcome> solutions;  // certified or not, in the order found
  std::vector<std::string> origins;       // how each candidate was found
  bool pairwise_disjoint = false;         // true only when every certified pair is proved distinct
  std::string region;                     // what was searched (no global claim beyond it)
  std::vector<std::string> log;
};

// From R = kReducedFromR on, types I and II come from the reduced method; the Chebyshev branch
// search runs up to kSearchUpToR (measured reach of its proofs, docs/branches.md).
inline constexpr double kReducedFromR = 40;
inline constexpr double kSearchUpToR = 60;
// Type II (f'(0) > 0, s > 0 in the chart eps = +1) is tried in the reduced chart from here on: along
// the branch R(s) falls towards R ≈ 13.12 as s -> infinity (f'(0) -> 0; measured, docs/branches.md),
// and below that R the solution continuing it has f'(0) < 0 (structure III).
inline constexpr double kTypeIIChartFrom = 13;

BranchesOutcome certify_branches(const CertifyRequest& req);

// Two certified solutions are different if some value enclosure is disjoint.
arith::Tri distinct(const CertifyOutcome& a, const CertifyOutcome& b);

}  // namespace porecert::proof
