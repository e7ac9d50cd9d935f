// Direct Banach contraction about the R = 0 profile φ(η) = (3η − η³)/2 (docs/method.md, D1–D12).
//   T(f) = φ + R·G[N(f)],  N(f) = f f''' − f' f'',  on C³[0,1] with ‖h‖ = max_k w_k ‖h⁽ᵏ⁾‖∞.
// If the self-map inequalities (D7) and the contraction inequality (D8) hold on the closed ball
// B(φ, r), T has exactly one fixed point there, and it is a C⁴ solution of Berman's problem
// (D1). Uniqueness holds in the C³ ball B(φ, r_u) for the uniqueness radius r_u ≥ r of D10.
// R is an interval: every bound depends on R only through |R| and is valid for every R inside.
// All arithmetic on the proof path is outward-rounded double intervals (arith::Id).
#pragma once
#include <array>
#include <nlohmann/json.hpp>
#include <optional>
#include <string>
#include <vector>

#include "arith/interval.hpp"

namespace porecert::proof {

// Default weights w_0..w_3 = (115, 30, 5, 1) ≈ β_3/β_k: they make every w_k β_k about equal
// (docs/method.md D13). Exact doubles.
std::array<double, 4> default_direct_weights();
// Weights found by optimise_direct_weights (non-rigorous search, docs/method.md D14): multiples
// of 2⁻¹⁰, so exact short decimals.
std::array<double, 4> optimised_direct_weights();

struct DirectOptions {
  std::array<double, 4> weights = default_direct_weights();  // positive finite doubles
  std::optional<double> radius;  // ball radius r (exact double ≥ 0); default: chosen by D9
  double beta_rel_tol = 1e-12;   // target relative width of the β_k enclosures
};

// One inequality of the proof, "lhs ≤ rhs" (or "<" for contractions), over every R in the interval.
struct Inequality {
  std::string name;                       // e.g. "self-map k=0"
  std::string statement;                  // the formula, with its equation number in docs/method.md
  arith::Id lhs, rhs, margin;             // margin = rhs − lhs (enclosures)
  bool strict = false;                    // "<" rather than "≤"
  arith::Tri holds = arith::Tri::unsure;  // yes: proved; no: proved false; unsure: not decided
};

// "name fails: lhs - rhs in [..]; ..." for every inequality that is not proved (for reasons).
std::string unproved_inequalities_text(const std::vector<Inequality>& ineq);

struct DirectValue {
  std::string name;     // "f'(0)", "f'''(0)", "f''(1)", "K"
  arith::Id enclosure;  // contains the value of the certified solution for every R in the interval
};

struct DirectResult {
  bool certified = false;
  arith::Id R{0};
  std::array<double, 4> weights{};
  double radius = 0;             // r (exact double): existence and uniqueness in B(φ, r)
  double uniqueness_radius = 0;  // r_u ≥ r (exact double; +inf when R = 0): uniqueness in B(φ, r_u)
  // Constants (enclosures): β_k (G5), V_k = ‖v⁽ᵏ⁾‖∞ (D4), ‖φ⁽ᵏ⁾‖∞, L (D5), M (D6), B = max w_k β_k.
  std::array<arith::Id, 4> beta{}, v_sup{}, phi_sup{};
  arith::Id L{0}, M{0}, B{0};
  std::vector<Inequality> inequalities;
  std::string reason;  // empty when certified; else the failed inequality and by how much
  // Upper bounds (exact doubles, rounded up) of ‖f⁽ᵏ⁾ − φ⁽ᵏ⁾‖∞ = r/w_k (D11) and of
  // ‖f⁽ᵏ⁾ − φ⁽ᵏ⁾ − R v⁽ᵏ⁾‖∞ ≤ |R| β_k (L r + M r²) (D11'). Meaningful only when certified.
  std::array<double, 4> error_bounds{}, error_bounds_first_order{};
  std::vector<DirectValue> values;  // D12; empty unless certified
};

// Runs the proof for every R in the interval R. Throws std::invalid_argument when a weight is not
// a positive finite double or the radius is negative / not finite (message names the option).
// Mathematical failure is not an exception: certified = false with the reason.
DirectResult certify_direct(const arith::Id& R, const DirectOptions& options = {});

// The certificate as JSON (docs/method.md D-section; values as outward decimal strings): keys status, R, method,
// existence_radius, uniqueness_radius, space, error_bounds, values, inequalities, uniqueness, ...
nlohmann::json to_json(const DirectResult& result);
nlohmann::json certify_direct_json(const arith::Id& R, const DirectOptions& options = {});

// Exit status of `porecert verify --method direct`: 0 certified, 1 not certified.
inline int direct_exit_code(const DirectResult& r) { return r.certified ? 0 : 1; }
int direct_exit_code(const nlohmann::json& certificate);

// Largest R₁ with `digits` significant decimal digits such that the proof holds for every R in
// [0, R₁] (side = +1, suction) or [−R₁, 0] (side = −1, injection), with the given weights.
// The search is a bisection; the returned result is the rigorous check at the found R₁
// (certified unless no R₁ > 0 works, then the check at the smallest R tried).
struct DirectReach {
  std::string R1;  // decimal string of R₁ (exact decimal; the checked interval contains [0, R₁])
  DirectResult check;
};
DirectReach direct_reach(int side, const std::array<double, 4>& weights, int digits = 4);

// Non-rigorous search for weights (w_3 = 1) maximising the feasible |R| of D9 (pattern search in
// log w from `start`, at most max_evals objective evaluations). Returns the weights rounded to
// multiples of 2⁻¹⁰. Not on the proof path: check the result with direct_reach.
std::array<double, 4> optimise_direct_weights(const std::array<double, 4>& start, int max_evals = 400);
// The non-rigorous objective: largest |R| for which D9 has a feasible r, in double.
double direct_feasible_R(const std::array<double, 4>& weights);

// Enclosure of sup_{η∈[0,1]} Σ_i scale_i |p_i(η)| for polynomials p_i (ascending coefficients),
// by rigorous subdivision (greens.hpp, sup_by_subdivision). Target relative width rel_tol.
arith::Id sup_abs_poly_sum(const std::vector<std::vector<arith::Id>>& polys, const std::vector<arith::Id>& scales,
                           double rel_tol = 1e-12);

}  // namespace porecert::proof
