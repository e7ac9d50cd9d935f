// Certify the solution of a named branch (I, II or III) at R (a number or an interval): type I by
// continuation (certify_berman), II/III by the branch search keeping the solution whose
// certified structure label matches (docs/branches.md). Shared by `verify` and `sweep`.
#pragma once
#include "proof/certify.hpp"

namespace porecert::proof {

// req.branch must be "I", "II", "III" or "" with req.start. For II/III: the first certified
// solution of the search whose certified label equals req.branch; when none is, certified = false
// and failure names the searched region. Never throws on mathematical failure.
CertifyOutcome certify_labelled(const CertifyRequest& req);

}  // namespace porecert::proof
