#include "proof/labelled.hpp"

#include "proof/branches.hpp"

namespace porecert::proof {

CertifyOutcome certify_labelled(const CertifyRequest& req) {
  if (req.method == "reduced" || (req.branch != "II" && req.branch != "III")) return certify_berman(req);
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
