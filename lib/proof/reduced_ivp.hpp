// Proof on the symmetry-reduced form of Berman's equation (docs/method.md §S): a validated Taylor
// integration of (S5)–(S6) with a high-order a-priori enclosure per step, a certified count of the
// zeros of g', the intermediate value theorem for existence and a sign of dR/ds for uniqueness.
// Statement proved (S10): for every R in [R_lo, R_hi] there is exactly one solution of Berman's
// problem whose shape data (ε, s, n) have ε = sign(R f'(0)), s ∈ S and η = 1 the n-th zero of f'
// on (0, 1]; its s lies in [s_lo, s_hi]; its values lie in the enclosures returned.
// Specific to Berman's half-channel equation (it rests on the symmetries (S2)); the Newton–Kantorovich
// verifier stays the method for the other models.
#pragma once
#include <array>
#include <string>
#include <vector>

#include "arith/interval.hpp"
#include "proof/structure.hpp"

namespace porecert::proof {

inline constexpr int kProfileSamples = 128;

struct ReducedResult {
  bool certified = false;
  std::string failure;           // the inequality or check that failed, and by how much
  std::vector<std::string> log;  // attempts, in order
  int eps = 1, nth = 1;          // branch data
  int precision_bits = 53;       // 53: double intervals; else MPFR bits
  int order = 0, steps = 0;      // Taylor order and steps of the value run
  // Exact endpoints (hex strings, read back with from_decimal): existence bracket and uniqueness set.
  std::string s_lo, s_hi, S_lo, S_hi;
  // Enclosures of R(s_lo), R(s_hi) and of dR/ds over S (outward doubles).
  arith::Id R_at_s_lo, R_at_s_hi, dR_ds;
  // Values for every R in [R_lo, R_hi] (outward decimal strings and double hulls).
  std::array<std::string, 4> value_lo, value_hi;  // f'(0), f'''(0), f''(1), K
  std::array<arith::Id, 4> value;
  // Half-width of the certified tube: |f^(k)(η) − m_k(η)| ≤ c3_error[k] for every η in [0,1], with
  // m_k the midpoint of the certified pointwise enclosure (of the piece holding s when split; (S11)).
  std::array<double, 4> c3_error{};
  // Enclosures of f(η_i) and f'(η_i), η_i = i / kProfileSamples (for reports).
  std::vector<arith::Id> profile_f, profile_fp;
  double existence_radius = 0, uniqueness_radius = 0;  // in s, about the candidate s̄
  Structure structure;
};

// The checker: proves the statement (S10) for the given exact endpoints (decimal or hex strings),
// at precision_bits (53: double intervals). Used by certification and by recheck alike.
ReducedResult reduced_prove(const std::string& R_lo, const std::string& R_hi, int eps, int nth, const std::string& s_lo,
                            const std::string& s_hi, const std::string& S_lo, const std::string& S_hi,
                            int precision_bits);

// Finds the candidate shape parameter near s_guess (non-rigorous shooting), chooses the bracket and
// the uniqueness set, and calls reduced_prove. precision_bits = 0: automatic (double when the sizes
// of s and z fit, else MPFR).
ReducedResult reduced_certify(const std::string& R_lo, const std::string& R_hi, int eps, int nth, long double s_guess,
                              int precision_bits = 0);

// Enclosures of σ, the nth zero of g' on (0, t_max], and of R(s) = σ g(σ) (S3) for the exact s
// (decimal or hex string), from the same validated run as the proof (with the QR set (S13)-(S15)
// for eps = −1). Loose where the run is long (widths grow with the step count); ok = false with the
// failed check when the run cannot certify the zero (no claim then). Exposed for tests.
struct ReducedShotEnclosure {
  bool ok = false;
  std::string failure;
  arith::Id sigma, R;
};
ReducedShotEnclosure reduced_R_of_s(const std::string& s, int eps, int nth, int precision_bits = 53);

// A starting shape parameter for the branch (eps, nth) at R from the asymptotics (docs/method.md §S):
// type I / II: s ≈ ∓exp(−R/4.4…); injection: s ≈ −π/(2R); type III (eps = −1, nth = 2, R > 0) by
// log-log interpolation in a table of measured candidates (R = 20 … 1000).
long double reduced_guess(double R, int eps, int nth, int sign_s);

}  // namespace porecert::proof
