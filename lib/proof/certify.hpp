// The certification driver: candidate (non-rigorous, lib/candidate) → proof (nk_verify) with the
// obvious remedies when a proof fails: more modes when Z₁ is the obstacle, more MPFR precision
// when Y₀ is (docs/method.md §M5). Output is plain data for the certificate writer.
#pragma once
#include <array>
#include <optional>
#include <string>
#include <utility>
#include <vector>

#include "arith/interval.hpp"
#include "proof/structure.hpp"

namespace porecert::proof {

struct CertifyRequest {
  std::string R_lo, R_hi;                          // decimal strings; equal for a point R
  std::string branch = "I";                        // "I" (continuation from R = 0) or "" with start
  std::optional<std::pair<double, double>> start;  // shooting guess (f'(0), f'''(0))
  int precision_bits = 0;                          // 0: automatic (double first, then MPFR)
  int modes = 0;                                   // 0: automatic
  int max_modes = 3000;
  int max_precision_bits = 1024;
  // With automatic precision: when a value enclosure is relatively wider than this after a double
  // proof, the proof is redone about an MPFR-refined candidate (docs/method.md §M5).
  double target_rel_width = 1e-12;
  // Type I: when the certified label is not I, search all branches for type I (costly; the sweep
  // turns it off and bisects instead).
  bool search_other_labels = true;
};

struct Enclosure {
  std::string lo, hi;  // outward decimal strings
  double lo_d = 0, hi_d = 0;
};

struct CertifyOutcome {
  bool certified = false;
  std::string failure;
  std::vector<std::string> log;  // attempts and remedies, in order
  int modes = 0;
  int precision_bits = 53;  // 53: double intervals; else MPFR bits
  double Y0 = 0, Z0 = 0, Z1 = 0, Z2 = 0, A_norm = 0;
  double existence_radius = 0, uniqueness_radius = 0;
  std::array<double, 4> c3_error{};
  Enclosure fp0, fppp0, fpp1, K;
  // Candidate, exactly: hex strings of the unknown layout [f'(0), K, u_0 .. u_{N-1}].
  std::vector<std::string> candidate_hex;
  double seconds = 0;
  Structure structure;                        // certified sign structure and branch label (when certified)
  arith::Id fp0_id, K_id, fpp1_id, fppp0_id;  // the value enclosures as double intervals
};

// Runs the whole certification for Berman's half-channel problem.
CertifyOutcome certify_berman(const CertifyRequest& req);
// The proof part only, about a given (non-rigorous) Galerkin candidate in the model's layout.
CertifyOutcome certify_from(const CertifyRequest& req, const std::vector<double>& x_candidate);

// Re-runs the proof on a stored candidate (hex strings) at the stored precision: no solver.
CertifyOutcome recheck_berman(const std::string& R_lo, const std::string& R_hi,
                              const std::vector<std::string>& candidate_hex, int precision_bits);

}  // namespace porecert::proof
