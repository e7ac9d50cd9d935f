// Rigorous distance between a submitted solution (lib/candidate/import.hpp, docs/reviewing.md
// (R1)-(R3)) and the certified true solution f*: sup over [0,1] of |P_k − f̄^{(k)}| enclosed by
// branch and bound in double intervals (never by sampling), plus the certificate's bound
// sup|f*^{(k)} − f̄^{(k)}| ≤ c3_error[k] (docs/reviewing.md (R4)).
#pragma once
#include <array>
#include <optional>
#include <string>

#include "candidate/import.hpp"
#include "proof/certify.hpp"

namespace porecert::proof {

struct Gap {
  double lower = 0;               // ≤ sup|P_k − f*^{(k)}| (rounded down; 0 when nothing is known)
  double upper = 0;               // ≥ sup|P_k − f*^{(k)}| (rounded up)
  double to_candidate_upper = 0;  // ≥ sup|P_k − f̄^{(k)}|
  int boxes = 0;
};

struct SubmissionDistance {
  // k = 0..3: sup-norm distances of the submitted k-th derivative (column k, or the series'
  // k-th derivative) from the true f^{(k)}; empty when the submission has no such column.
  std::array<std::optional<Gap>, 4> sup;
  // Shooting data: |a − f*'(0)| and |b − f*'''(0)| (upper bounds; lower bounds 0 if unknown).
  std::optional<Gap> fp0, fppp0;
  std::string definition;  // what "the submitted solution" means here, in words
};

// Encloses the distances for a certified outcome o (requires o.certified). The bounds are valid
// whatever the submission; they are loose (upper − lower up to ~2% of upper, more when the box
// budget runs out) but never too small.
SubmissionDistance submission_distance(const candidate::Submission& s, const CertifyOutcome& o);

}  // namespace porecert::proof

namespace porecert::proof {

struct SubmissionOutcome {
  CertifyOutcome outcome;
  bool certified_as_submitted = false;         // the submission's own point passed the proof, no Newton step
  bool used_refinement = false;                // outcome is about the Newton-refined point
  std::optional<SubmissionDistance> distance;  // when certified
  std::vector<std::string> log;
};

// Certifies a submission: first the point built from it as submitted (docs/reviewing.md §2);
// then the Newton-refined point (used when it certifies: tighter enclosures); then the distances (R4).
SubmissionOutcome certify_submission(const CertifyRequest& req, const candidate::Submission& s);

}  // namespace porecert::proof
