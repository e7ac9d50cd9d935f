// Direct Banach contraction about a candidate f̄ (docs/method.md, "Direct method about a candidate", D15–D25).
//   T(f) = φ + R·G[N(f)],  N(f) = f f''' − f' f'',  on C³[0,1] with ‖h‖ = max_k w_k ‖h⁽ᵏ⁾‖∞.
// The centre is f̃ = f̄ + p, p the cubic that makes f̃ meet the four boundary conditions exactly (D15).
// Defect T(f̃) − f̃ is computed as an exact interval series (D16, D17); the self-map (D20) and
// contraction (D21) inequalities on B(f̃, ρ) give one fixed point there (a C⁴ solution, D1), unique in
// B(f̃, ρ') for the uniqueness radius ρ' ≥ ρ (D22). R is an interval; all arithmetic is outward-rounded
// double intervals (arith::Id).
#pragma once
#include <array>
#include <nlohmann/json.hpp>
#include <optional>
#include <string>
#include <vector>

#include "arith/cheb.hpp"
#include "arith/interval.hpp"
#include "proof/certify.hpp"
#include "proof/direct.hpp"

namespace porecert::proof {

using IdSeries = cheb::Series<arith::Id>;

// Chebyshev series (on [0,1]) of f̄ from a Newton candidate in the layout [f'(0), K, u_0..u_{N−1}],
// f̄''' = Σ u_k T_k, f̄(0) = f̄''(0) = 0, f̄'(0) = x[0]: encloses the exact antiderivatives of the
// stored numbers (hex strings; MPFR strings are rounded outward to double intervals).
// Throws std::invalid_argument if a string is not a number or the layout is too short.
IdSeries newton_candidate_series(const std::vector<std::string>& candidate_hex);
// Enclosures of f̄, f̄', f̄'', f̄''' of that candidate, each from the antiderivatives of the exact u.
std::array<IdSeries, 4> newton_candidate_chain(const std::vector<std::string>& candidate_hex);

struct DirectCandidateOptions {
  std::array<double, 4> weights = default_direct_weights();  // positive finite doubles
  std::optional<double> radius;  // ball radius ρ (exact double ≥ 0); default: the smallest found (D23)
  double beta_rel_tol = 1e-12;   // relative width of the β_k enclosures
};

struct DirectCandidateResult {
  bool certified = false;
  arith::Id R{0};
  std::array<double, 4> weights{};
  double radius = 0;             // ρ (exact double): existence and uniqueness in B(f̃, ρ)
  double uniqueness_radius = 0;  // ρ' ≥ ρ (exact double; +inf when R = 0): uniqueness in B(f̃, ρ')
  // Enclosures of f̄(0), f̄''(0), f̄(1) − 1, f̄'(1) before the correction (D15).
  std::array<arith::Id, 4> bc_residual{};
  // Upper bounds (exact doubles): δ_k ≥ ‖(T(f̃) − f̃)⁽ᵏ⁾‖∞ (D18), F_k ≥ ‖f̃⁽ᵏ⁾‖∞, Λ ≥ sup of D19's sum.
  std::array<double, 4> defect{}, f_sup{};
  std::array<double, 4> correction_sup{};  // ≥ ‖p⁽ᵏ⁾‖∞ (ℓ¹ norms, D15)
  double Lambda = 0;
  std::array<arith::Id, 4> beta{};
  arith::Id M{0}, B{0}, kappa{0};  // M (D6), B = max_k w_k β_k, κ(ρ) (D21)
  std::vector<Inequality> inequalities;
  std::string reason;  // empty when certified; else the failed inequality and by how much
  // Upper bounds (exact doubles) of ‖f⁽ᵏ⁾ − f̃⁽ᵏ⁾‖∞ ≤ ρ/w_k and ‖f⁽ᵏ⁾ − T(f̃)⁽ᵏ⁾‖∞ ≤ |R| β_k (Λ + 2Mρ) ρ (D24).
  std::array<double, 4> error_bounds{}, error_bounds_T{};
  std::vector<DirectValue> values;  // f'(0), f'''(0), f''(1), K (D24); empty unless certified
};

// Runs the proof about the candidate series fbar (Chebyshev series of f̄ on [0,1], interval coefficients:
// the statement holds for every member, each corrected by its own p) for every R in the interval R.
// Throws std::invalid_argument on bad weights / radius or an empty series. Mathematical failure is
// certified = false with the reason.
DirectCandidateResult certify_direct_about(const IdSeries& fbar, const arith::Id& R,
                                           const DirectCandidateOptions& options = {});
// The same with the derivatives given: chain[k] encloses f̄⁽ᵏ⁾ (tighter than differentiating the series).
DirectCandidateResult certify_direct_about(const std::array<IdSeries, 4>& chain, const arith::Id& R,
                                           const DirectCandidateOptions& options = {});

nlohmann::json to_json(const DirectCandidateResult& r);

// Combination (issue 4, item 4): the direct proof about a certified Newton candidate at R, default weights.
struct C3Uniqueness {
  bool attempted = false;  // false: the Newton outcome was not certified (nothing run)
  DirectCandidateResult direct;
  std::string statement;  // the C³-ball uniqueness statement (or why there is none)
  // w_k (c3_error_k + ‖p⁽ᵏ⁾‖∞) ≤ ρ' for k = 0..3 (D25): the Newton-certified solution lies in B(f̃, ρ'),
  // so it is the one solution there.
  std::vector<Inequality> newton_in_ball;
  bool newton_solution_is_it = false;
};
C3Uniqueness c3_uniqueness_from_newton(const CertifyOutcome& newton, const arith::Id& R);
// JSON: status, radius, uniqueness_radius, weights, statement, inequalities, values, defect.
nlohmann::json to_json(const C3Uniqueness& u);

// Largest R₁ (`digits` significant digits) such that certify_berman at R = side·R₁ and the combination
// both certify, by bisection over R ∈ (0, hi] (measurement, not a proof of a range: each R is a point).
std::string c3_uniqueness_reach(int side, int digits = 3, double hi = 4);

}  // namespace porecert::proof
