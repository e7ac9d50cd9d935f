// The certification driver for Taylor models (the porous pipe, docs/models.md §2): candidate by
// continuation in R (lib/candidate/taylor_newton.hpp, non-rigorous) → proof (taylor_nk_verify)
// with more modes as the remedy when Z₁ is the obstacle. Output in the common CertifyOutcome form
// with method "taylor-newton-kantorovich".
#pragma once
#include <string>
#include <vector>

#include "proof/certify.hpp"

namespace porecert::proof {

inline constexpr const char* kTaylorMethod = "taylor-newton-kantorovich";

// Certifies the solution continued from R = 0 for req.model (must be a Taylor model).
CertifyOutcome certify_taylor(const CertifyRequest& req);

// Re-runs the proof on a stored candidate (exact hex doubles, layout [scalars, u_0..u_{N−1}]).
// Throws std::invalid_argument when a coefficient is not a double or precision_bits > 53 (this
// proof runs in double intervals only).
CertifyOutcome recheck_taylor(const model::ModelSpec& spec, const std::string& R_lo, const std::string& R_hi,
                              const std::vector<std::string>& candidate_hex, int precision_bits);

}  // namespace porecert::proof
