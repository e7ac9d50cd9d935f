// The fold (turning point) of the suction branches II/III as a zero of an extended system
// (Moore & Spence 1980, SIAM J. Numer. Anal. 17:567), proved by Newton–Kantorovich (docs/fold.md).
// With g = R f the parameter R is only a boundary value:
//   (F1) u_g + g'² − g g'' − K̃ = 0,            g''' = u_g, g(0) = 0, g''(0) = 0, g'(0) = a
//   (F2) g(1) − R = 0,   (F3) g'(1) = 0
//   (F4) u_v + 2 g'v' − g v'' − g'' v − κ = 0,  v''' = u_v, v(0) = 0, v''(0) = 0, v'(0) = 1
//   (F5) v(1) = 0,       (F6) v'(1) = 0
// Unknown x = (a, K̃, R, κ, u_g modes 0..N−1, u_v modes 0..N−1); equations in the order
// (F2, F3, F5, F6, F1 modes, F4 modes). Norm: ℓ¹ over all components (docs/fold.md (F8)).
#pragma once
#include <array>
#include <string>
#include <vector>

#include "arith/interval.hpp"
#include "model/operator.hpp"
#include "proof/newton_kantorovich.hpp"

namespace porecert::proof {

namespace fold {

inline constexpr int kScalars = 4;  // a = g'(0), K̃ = R K, R, κ (or the free constant of v, below)
inline constexpr int kA = 0, kK = 1, kR = 2, kKappa = 3;

// The space of the null vector v (docs/fold.md §7): its constants v(0), v'(0), v''(0) at η = 0,
// one of them normalised and the others fixed, and which unknown is the fourth scalar. With
// free_d = −1 the fourth scalar is κ of (F4); with free_d = d it is v^{(d)}(0) and κ ≡ 0.
struct NullSpace {
  std::array<double, 3> v0;  // fixed constants (the entry free_d is ignored); exact small integers
  int free_d;
  const char* name;
};
// Turning point of the half-channel problem: v odd, v'(0) = 1 (F7).
inline constexpr NullSpace kTurningPoint{{0, 1, 0}, -1, "turning-point"};
// Symmetry breaking of the full channel on the half channel: v even (v'(0) = v'''(0) = 0),
// v(0) = 1; the once-integrated (F4) is then odd, so κ = 0 and v''(0) is the fourth unknown (F14).
inline constexpr NullSpace kEvenPerturbation{{1, 0, 0}, 2, "symmetry-breaking"};

template <class S>
int modes_of(const std::vector<S>& x) {
  return (static_cast<int>(x.size()) - kScalars) / 2;
}

template <class S>
struct Value {
  std::array<S, 4> rows;   // (F2), (F3), (F5), (F6)
  cheb::Series<S> e1, e4;  // (F1), (F4): all coefficients, no truncation
};

// D^0..D^3 of g and of v (F1), (F4).
template <class S>
struct Lifted {
  std::array<cheb::Series<S>, 4> G, V;
};

template <class S>
Lifted<S> lift_x(const std::vector<S>& x, const NullSpace& ns = kTurningPoint) {
  const int N = modes_of(x);
  const cheb::Series<S> ug(x.begin() + kScalars, x.begin() + kScalars + N);
  const cheb::Series<S> uv(x.begin() + kScalars + N, x.begin() + kScalars + 2 * N);
  std::array<S, 3> c{S(ns.v0[0]), S(ns.v0[1]), S(ns.v0[2])};
  if (ns.free_d >= 0) c[ns.free_d] = x[kKappa];
  return {model::lift<S>({S(0), x[kA], S(0)}, ug), model::lift<S>(c, uv)};
}

// F(x): on interval types an enclosure of the exact residual of (F1)-(F6).
template <class S>
Value<S> residual(const std::vector<S>& x, const NullSpace& ns = kTurningPoint) {
  const Lifted<S> L = lift_x(x, ns);
  const auto &G = L.G, &V = L.V;
  Value<S> v;
  v.rows = {cheb::value_at_1(G[0]) - x[kR], cheb::value_at_1(G[1]), cheb::value_at_1(V[0]), cheb::value_at_1(V[1])};
  v.e1 = cheb::add(cheb::add(G[3], cheb::product(G[1], G[1])), cheb::scale(cheb::product(G[0], G[2]), S(-1)));
  v.e1[0] = v.e1[0] - x[kK];
  cheb::Series<S> q = cheb::scale(cheb::product(G[1], V[1]), S(2));
  q = cheb::add(q, cheb::scale(cheb::add(cheb::product(G[0], V[2]), cheb::product(G[2], V[0])), S(-1)));
  v.e4 = cheb::add(V[3], q);
  if (ns.free_d < 0) v.e4[0] = v.e4[0] - x[kKappa];
  return v;
}

// DF(x̄) applied to a direction: scalar s (0..3), or mode k of u_g (block 0) / u_v (block 1),
// any k ≥ 0 (tail columns too). bar = lift_x(x̄). On intervals: enclosure of the exact column.
template <class S>
Value<S> column(const Lifted<S>& bar, int scalar, int block, int k, const NullSpace& ns = kTurningPoint) {
  const auto &G = bar.G, &V = bar.V;
  std::array<cheb::Series<S>, 4> dG, dV;
  bool has_g = false, has_v = false;
  Value<S> v;
  v.rows = {S(0), S(0), S(0), S(0)};
  v.e1 = {S(0)};
  v.e4 = {S(0)};
  cheb::Series<S> unit;
  if (block >= 0) {
    unit.assign(k + 1, S(0));
    unit[k] = S(1);
  }
  if (scalar == kA) {
    dG = model::lift<S>({S(0), S(1), S(0)}, {});
    has_g = true;
  } else if (scalar == kK) {
    v.e1[0] = S(-1);
  } else if (scalar == kR) {
    v.rows[0] = S(-1);
  } else if (scalar == kKappa && ns.free_d < 0) {
    v.e4[0] = S(-1);
  } else if (scalar == kKappa) {  // the free constant v^{(free_d)}(0)
    std::array<S, 3> c{S(0), S(0), S(0)};
    c[ns.free_d] = S(1);
    dV = model::lift<S>(c, {});
    has_v = true;
  } else if (block == 0) {
    dG = model::lift<S>({S(0), S(0), S(0)}, unit);
    has_g = true;
  } else {
    dV = model::lift<S>({S(0), S(0), S(0)}, unit);
    has_v = true;
  }
  using model::product_sparse;
  auto sub = [](cheb::Series<S> a, const cheb::Series<S>& b) { return cheb::add(std::move(a), cheb::scale(b, S(-1))); };
  if (has_g) {
    v.rows[0] = v.rows[0] + cheb::value_at_1(dG[0]);
    v.rows[1] = cheb::value_at_1(dG[1]);
    v.e1 = cheb::add(v.e1, dG[3]);
    v.e1 = cheb::add(v.e1, cheb::scale(product_sparse(G[1], dG[1]), S(2)));
    v.e1 = sub(v.e1, product_sparse(G[0], dG[2]));
    v.e1 = sub(v.e1, product_sparse(G[2], dG[0]));
    v.e4 = cheb::add(v.e4, cheb::scale(product_sparse(V[1], dG[1]), S(2)));
    v.e4 = sub(v.e4, product_sparse(V[2], dG[0]));
    v.e4 = sub(v.e4, product_sparse(V[0], dG[2]));
  }
  if (has_v) {
    v.rows[2] = cheb::value_at_1(dV[0]);
    v.rows[3] = cheb::value_at_1(dV[1]);
    v.e4 = cheb::add(v.e4, dV[3]);
    v.e4 = cheb::add(v.e4, cheb::scale(product_sparse(G[1], dV[1]), S(2)));
    v.e4 = sub(v.e4, product_sparse(G[0], dV[2]));
    v.e4 = sub(v.e4, product_sparse(G[2], dV[0]));
  }
  return v;
}

// Column j of the unknown layout (scalars, then u_g modes, then u_v modes; N modes each).
template <class S>
Value<S> column_j(const Lifted<S>& bar, int N, int j, const NullSpace& ns = kTurningPoint) {
  if (j < kScalars) return column(bar, j, -1, 0, ns);
  if (j < kScalars + N) return column(bar, -1, 0, j - kScalars, ns);
  return column(bar, -1, 1, j - kScalars - N, ns);
}

}  // namespace fold

// Same bounds as the one-function verifier's radii polynomial.
using FoldBounds = NKBounds;

template <arith::Interval I>
struct FoldResult {
  bool certified = false;
  std::string failure;  // the inequality that failed and by how much (empty if certified)
  FoldBounds bounds;
  double existence_radius = 0;   // r₋ rounded up (ball in X, docs/fold.md (F8))
  double uniqueness_radius = 0;  // r₊ rounded down
  int modes = 0;
  // Enclosures of the true zero's components (valid only when certified):
  I R;                    // the fold R*
  I fp0, fppp0, fpp1, K;  // f'(0) = a/R, f'''(0) = g'''(0)/R, f''(1) = g''(1)/R, K = K̃/R at R*
  I kappa;                // κ of (F4), or the free constant of v (NullSpace::free_d)
};

// Encloses everything in FoldResult for the zero of (F1)-(F6) near the candidate xbar (layout
// above, N ≥ 8 modes). Z bounds in double intervals about the candidate's outward double hull,
// Y₀ in the candidate's arithmetic. Mathematical failure: certified = false with the reason.
template <arith::Interval I>
FoldResult<I> fold_verify(const std::vector<I>& xbar, const fold::NullSpace& ns = fold::kTurningPoint);

// The whole pipeline: non-rigorous candidate (lib/candidate/fold_candidate), proof in double
// intervals, and, when the R* enclosure is wider than target_width or Y₀ is the obstacle, an
// MPFR-refined candidate with Y₀ in MPFR intervals (precision_bits; 0 = automatic 128).
struct FoldOutcome {
  bool certified = false;
  std::string failure;
  FoldBounds bounds;
  double existence_radius = 0, uniqueness_radius = 0;
  int modes = 0, precision_bits = 53;
  arith::Id R, fp0, fppp0, fpp1, K, kappa;           // outward double hulls
  std::string R_lo, R_hi;                            // outward decimal strings of the R* enclosure
  std::array<std::array<std::string, 2>, 4> values;  // f'(0), f'''(0), f''(1), K as outward decimals
  std::vector<std::string> log;
  double seconds = 0;
  std::vector<std::string> candidate_hex;  // the candidate proved about, exactly (for recheck)
};
// modes: Chebyshev modes per function (0: automatic, by coefficient decay).
FoldOutcome certify_fold(double target_width = 1e-10, int precision_bits = 0, int modes = 0);
// The symmetry-breaking point of type I in the full channel (a = 1) as the zero of the same
// extended system with the even null space kEvenPerturbation (docs/fold.md §7).
FoldOutcome certify_symmetry_breaking(double target_width = 1e-10, int precision_bits = 0, int modes = 0);
// The proof alone, about a stored candidate (hex strings, layout above) at precision_bits
// (≤ 53: double intervals). Throws std::invalid_argument for a malformed candidate.
FoldOutcome recheck_fold(const std::vector<std::string>& candidate_hex, int precision_bits,
                         const fold::NullSpace& ns = fold::kTurningPoint);

}  // namespace porecert::proof
