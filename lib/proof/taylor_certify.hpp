// The certification driver for Taylor models (the porous pipe, docs/models.md §2): candidate by
// continuation in R (lib/candidate/taylor_newton.hpp, non-rigorous) → proof (taylor_nk_verify)
// with more modes as the remedy when Z₁ is the obstacle and an MPFR (128-bit) candidate and Y₀
// when Y₀ is. Output in the common CertifyOutcome form
// with method "taylor-newton-kantorovich".
#pragma once
#include <string>
#include <vector>

#include "proof/certify.hpp"

namespace porecert::proof {

inline constexpr const char* kTaylorMethod = "taylor-newton-kantorovich";

// Certifies the solution continued from R = 0 for req.model (must be a Taylor model).
CertifyOutcome certify_taylor(const CertifyRequest& req);

// Re-runs the proof on a stored candidate (exact hex numbers at precision_bits, layout
// [scalars, u_0..u_{N−1}]): double intervals for 53 bits, else Y₀ and the values in MPFR intervals.
// Throws std::invalid_argument when a coefficient is not exact at precision_bits.
CertifyOutcome recheck_taylor(const model::ModelSpec& spec, const std::string& R_lo, const std::string& R_hi,
                              const std::vector<std::string>& candidate_hex, int precision_bits);

}  // namespace porecert::proof
