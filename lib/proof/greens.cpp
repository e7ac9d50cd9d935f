// Green's function bounds (docs/method.md, "Green's function and the direct method", G1–G11).
#include "proof/greens.hpp"

#include <algorithm>
#include <cassert>
#include <cmath>
#include <optional>
#include <queue>
#include <stdexcept>
#include <string>
#include <vector>

#include "arith/fp_env.hpp"

namespace porecert::proof {

namespace bn = boost::numeric;
using arith::Id;
using arith::Im;
using arith::Interval;
using arith::Tri;

GreensTable greens_table(int k) {
  assert(0 <= k && k <= 4);
  // 12·G on each side, [i][j] = coefficient of ηⁱ sʲ (eq. G4), and the same divided by s (left)
  // or by (1−s)² (right) (eq. G4').
  static constexpr long left0[4][4] = {{0, 0, 0, -2}, {0, 3, 0, 3}, {0, -6, 0, 0}, {0, 3, 0, -1}};
  static constexpr long right0[4][4] = {{0, 0, 0, 0}, {0, 3, -6, 3}, {0, 0, 0, 0}, {-2, 3, 0, -1}};
  static constexpr long left_red0[4][4] = {{0, 0, -2, 0}, {3, 0, 3, 0}, {-6, 0, 0, 0}, {3, 0, -1, 0}};
  static constexpr long right_red0[4][4] = {{0, 0, 0, 0}, {0, 3, 0, 0}, {0, 0, 0, 0}, {-2, -1, 0, 0}};
  GreensTable t;
  for (int i = 0; i + k <= 3; ++i) {
    long f = 1;  // (i+k)!/i!
    for (int m = i + 1; m <= i + k; ++m) f *= m;
    for (int j = 0; j < 4; ++j) {
      t.left[i][j] = left0[i + k][j] * f;
      t.right[i][j] = right0[i + k][j] * f;
      t.left_reduced[i][j] = left_red0[i + k][j] * f;
      t.right_reduced[i][j] = right_red0[i + k][j] * f;
    }
  }
  return t;
}

namespace {

template <Interval I>
using Poly = std::array<I, 4>;  // coefficients of s⁰..s³
template <Interval I>
using Scalar = arith::scalar_of<I>;

template <Interval I>
I horner(const Poly<I>& a, const I& x) {
  I r = a[3];
  for (int j = 2; j >= 0; --j) r = r * x + a[j];
  return r;
}

template <Interval I>
Poly<I> derivative(const Poly<I>& a) {
  return {a[1], a[2] * I(2), a[3] * I(3), I(0)};
}

// Intersection of two enclosures of the same set (they must overlap).
template <Interval I>
I meet(const I& a, const I& b) {
  assert(!(a.upper() < b.lower() || b.upper() < a.lower()));
  return bn::intersect(a, b);
}

// Horner intersected with the mean-value form about the midpoint; encloses {p(x) : x ∈ X}.
template <Interval I>
I eval(const Poly<I>& a, const I& x) {
  const I h = horner(a, x);
  if (bn::singleton(x)) return h;
  const I c(bn::median(x));
  return meet(h, horner(a, c) + horner(derivative(a), x) * (x - c));
}

// Coefficients in s of Σ c[i][j] ηⁱ sʲ for every η ∈ eta.
template <Interval I>
Poly<I> coeffs_in_s(const std::array<std::array<long, 4>, 4>& c, const I& eta) {
  Poly<I> a;
  for (int j = 0; j < 4; ++j) {
    I r(static_cast<double>(c[3][j]));
    for (int i = 2; i >= 0; --i) r = r * eta + I(static_cast<double>(c[i][j]));
    a[j] = r;
  }
  return a;
}

template <Interval I>
bool is_zero(const Poly<I>& a) {
  for (const I& c : a)
    if (!(c.lower() == 0 && c.upper() == 0)) return false;
  return true;
}

// Σ_j q_j (y^{j+1} − x^{j+1})/(j+1) = ∫_x^y q(s) ds, with x, y intervals (coefficientwise, so the
// box coefficients are used once).
template <Interval I>
I segment(const Poly<I>& q, const I& x, const I& y) {
  I px = x, py = y, r(0);
  for (int j = 0; j < 4; ++j) {
    r += q[j] * (py - px) / I(j + 1);
    px = px * x;
    py = py * y;
  }
  return r;
}

// Enclosure of ∫_lo^hi sgn(r(η,s)) q(η,s) ds for every η of the box on which the coefficient
// enclosures r, q were computed (eqs. G6–G7). r is the reduced piece: the sign polynomial divided
// by its known factor s or (1−s)², which is positive inside (0,1), so r has no forced zero at an
// end. With abs_mode, q = (positive factor)·r and the result encloses ∫|q|.
// Phase 1 splits [lo,hi] into runs of certain sign; a sign change is a zero of r enclosed, for
// every η of the box, by interval Newton on a piece where r is strictly monotone. Pieces that stay
// unresolved at width leaf_width are kept as runs of unknown sign and contribute ±mag(q)·width
// (≥ 0 in abs_mode). Phase 2 integrates q over each maximal run in one antiderivative difference,
// so rounding does not accumulate with the number of pieces.
template <Interval I>
class SgnIntegral {
 public:
  SgnIntegral(const Poly<I>& r, const Poly<I>& q, bool abs_mode, double leaf_width)
      : r_(r), dr_(derivative(r)), q_(q), abs_mode_(abs_mode), leaf_(leaf_width) {}

  I over(double lo, double hi) const {
    assert(lo <= hi);
    if (lo == hi || is_zero(r_) || is_zero(q_)) return I(0);
    std::vector<Run> runs;
    isolate(lo, hi, 0, runs);
    std::vector<Run> merged;
    for (const Run& x : runs) {
      if (!merged.empty() && x.sign != 0 && merged.back().sign == x.sign)
        merged.back().b = x.b;
      else
        merged.push_back(x);
    }
    I total(0);
    for (const Run& x : merged) {
      if (x.sign == 0) {
        const I S = bn::hull(x.a, x.b);
        const Scalar<I> m = (I(bn::abs(eval(q_, S)).upper()) * (I(S.upper()) - I(S.lower()))).upper();
        total += abs_mode_ ? I(Scalar<I>(0), m) : I(-m, m);
      } else {
        const I v = segment(q_, x.a, x.b);
        total += x.sign > 0 ? v : -v;
      }
    }
    return total;
  }

 private:
  struct Run {
    I a, b;    // end points (points, or enclosures of a zero of r)
    int sign;  // sign of r on the run for every η; 0 = unknown
  };

  void isolate(double lo, double hi, int depth, std::vector<Run>& out) const {
    const I L(lo), H(hi), S(lo, hi);
    const I v = eval(r_, S);
    if (arith::tri_positive(v) == Tri::yes) return out.push_back({L, H, 1});
    if (arith::tri_negative(v) == Tri::yes) return out.push_back({L, H, -1});
    const I d = eval(dr_, S);
    const Tri up = arith::tri_positive(d), down = arith::tri_negative(d);
    const double mid = lo + (hi - lo) / 2;
    const bool can_split = depth < 60 && hi - lo > leaf_ && lo < mid && mid < hi;
    if ((up == Tri::yes || down == Tri::yes) && monotone(lo, hi, up == Tri::yes ? 1 : -1, can_split, out)) return;
    if (!can_split) return out.push_back({L, H, 0});
    isolate(lo, mid, depth + 1, out);
    isolate(mid, hi, depth + 1, out);
  }

  // r(η,·) strictly monotone on [lo,hi] with sign(∂r/∂s) = sigma for every η of the box.
  // Appends the runs and returns true, or returns false (nothing appended) when the zero is not
  // isolated well enough yet and the caller can bisect.
  bool monotone(double lo, double hi, int sigma, bool can_split, std::vector<Run>& out) const {
    const I L(lo), H(hi), S(lo, hi);
    const I rl = eval(r_, L), rh = eval(r_, H);
    auto has_sign = [](const I& x, int sg) {
      return (sg > 0 ? arith::tri_positive(x) : arith::tri_negative(x)) == Tri::yes;
    };
    if (has_sign(rl, sigma)) return out.push_back({L, H, sigma}), true;    // zero (if any) left of lo
    if (has_sign(rh, -sigma)) return out.push_back({L, H, -sigma}), true;  // zero right of hi
    // ρ(η) = the zero clamped to [lo,hi], enclosed for every η (interval Newton, eq. G7).
    bool empty = false;
    I R = S;
    for (int it = 0; it < 40; ++it) {
      const I c(bn::median(R));
      const I N = c - eval(r_, c) / eval(dr_, R);
      if (N.upper() < R.lower() || R.upper() < N.lower()) {
        empty = true;  // no zero in S for any η of the box
        break;
      }
      const I Rn = bn::intersect(R, N);
      const bool progress = bn::width(Rn) < bn::width(R) * Scalar<I>(0.75);
      R = Rn;
      if (!progress) break;
    }
    const bool with_lo = !has_sign(rl, -sigma), with_hi = !has_sign(rh, sigma);
    I rho = empty ? (with_lo ? L : H) : R;
    if (empty && !(with_lo || with_hi)) rho = S;  // unreachable: a zero exists by continuity
    if (with_lo) rho = bn::hull(rho, L);
    if (with_hi) rho = bn::hull(rho, H);
    if (can_split && bn::width(rho) > bn::width(S) / Scalar<I>(4)) return false;
    out.push_back({L, rho, -sigma});
    out.push_back({rho, H, sigma});
    return true;
  }

  Poly<I> r_, dr_, q_;
  bool abs_mode_;
  double leaf_;
};

constexpr double kLeafWidth = 0x1p-40;  // point evaluations: unresolved pieces are ~|p''|·2⁻¹²⁰

[[noreturn]] void domain(const std::string& what) { throw std::domain_error("greens: " + what); }

template <Interval I>
Scalar<I> upper_of(const I& x) {
  return x.upper();
}
template <Interval I>
double to_double(const Scalar<I>& x) {
  if constexpr (std::same_as<I, Id>) {
    return x;
  } else {
    return x.to_double();
  }
}

}  // namespace

template <Interval I>
I greens_piece(int k, bool left, const I& eta, const I& s) {
  assert(0 <= k && k <= 4);
  const GreensTable t = greens_table(k);
  return horner(coeffs_in_s(left ? t.left : t.right, eta), s) / I(12);
}

template <Interval I>
I greens_eval(int k, const I& eta, const I& s) {
  const I unit(0, 1);
  if (!bn::subset(eta, unit) || !bn::subset(s, unit)) domain("greens_eval needs eta, s in [0,1]");
  const bool maybe_left = !(s.lower() > eta.upper());   // some s ≤ η
  const bool maybe_right = !(s.upper() < eta.lower());  // some s ≥ η
  if (maybe_left && maybe_right) return bn::hull(greens_piece(k, true, eta, s), greens_piece(k, false, eta, s));
  return greens_piece(k, maybe_left, eta, s);
}

template <Interval I>
I greens_abs_integral(int k, double eta) {
  if (k < 0 || k > 3) domain("k = " + std::to_string(k) + " is outside 0..3");
  if (!(eta >= 0 && eta <= 1)) domain("eta = " + std::to_string(eta) + " is outside [0,1]");
  const GreensTable t = greens_table(k);
  const I E(eta);
  I total(0);
  if (eta > 0)
    total += SgnIntegral<I>(coeffs_in_s(t.left_reduced, E), coeffs_in_s(t.left, E), true, kLeafWidth).over(0, eta);
  if (eta < 1)
    total += SgnIntegral<I>(coeffs_in_s(t.right_reduced, E), coeffs_in_s(t.right, E), true, kLeafWidth).over(eta, 1);
  return total / I(12);
}

template <Interval I>
I greens_abs_integral_derivative(int k, double lo, double hi) {
  assert(0 <= k && k <= 3 && 0 <= lo && lo <= hi && hi <= 1);
  const GreensTable t = greens_table(k), t1 = greens_table(k + 1);
  const I E(lo, hi);
  const Poly<I> pl = coeffs_in_s(t.left, E), pr = coeffs_in_s(t.right, E);
  const Poly<I> ql = coeffs_in_s(t1.left, E), qr = coeffs_in_s(t1.right, E);
  const double leaf = std::max(hi - lo, kLeafWidth);
  I d = bn::abs(eval(pl, E)) - bn::abs(eval(pr, E));  // |p_L(η,η)| − |p_R(η,η)| (eq. G8)
  if (lo > 0) d += SgnIntegral<I>(coeffs_in_s(t.left_reduced, E), ql, false, leaf).over(0, lo);
  if (hi < 1) d += SgnIntegral<I>(coeffs_in_s(t.right_reduced, E), qr, false, leaf).over(hi, 1);
  if (hi > lo) {  // ∫_lo^η and ∫_η^hi: |·| ≤ mag(q)·(hi − lo)
    const I m = I(bn::abs(eval(ql, E)).upper()) + I(bn::abs(eval(qr, E)).upper());
    d += I(-1, 1) * m * (I(hi) - I(lo));
  }
  return d / I(12);
}

template <Interval I>
SupEnclosure<I> sup_by_subdivision(const std::function<I(double)>& point, const std::function<I(double, double)>& deriv,
                                   double lo, double hi, double rel_tol, std::size_t max_boxes, int initial_boxes) {
  assert(lo <= hi && initial_boxes >= 1 && rel_tol >= 0);
  struct Box {
    double a, b, m;
    I Fa, Fb, Fm;
    Scalar<I> U;
  };
  auto cmp = [](const Box& x, const Box& y) { return x.U < y.U; };
  std::priority_queue<Box, std::vector<Box>, decltype(cmp)> heap(cmp);
  SupEnclosure<I> out{I(0), lo, 0, false};
  bool have_lb = false;
  Scalar<I> lb = 0;
  auto value_at = [&](double x) {
    const I F = point(x);
    if (!have_lb || lb < F.lower()) {
      lb = F.lower();
      out.argmax = x;
      have_lb = true;
    }
    return F;
  };
  // Upper bound of F on [a,b] (eq. G9); also evaluates F at the midpoint (kept for splitting).
  auto make_box = [&](double a, double b, const I& Fa, const I& Fb) {
    ++out.boxes;
    const double m = a + (b - a) / 2;
    const bool splittable = a < m && m < b;
    Box B{a, b, m, Fa, Fb, splittable ? value_at(m) : Fa, upper_of(Fa)};
    if (a == b) return B;
    const I D = deriv(a, b);
    if (arith::tri_positive(D) == Tri::yes) {
      B.U = upper_of(Fb);
    } else if (arith::tri_negative(D) == Tri::yes) {
      B.U = upper_of(Fa);
    } else {
      const I X(a, b);
      B.U = std::min(upper_of<I>(Fa + D * (X - I(a))), upper_of<I>(Fb + D * (X - I(b))));
      if (splittable) B.U = std::min(B.U, upper_of<I>(B.Fm + D * (X - I(m))));
    }
    return B;
  };
  std::vector<double> xs(initial_boxes + 1);
  std::vector<I> Fs;
  for (int i = 0; i <= initial_boxes; ++i) {
    xs[i] = (i == initial_boxes) ? hi : lo + (hi - lo) * i / initial_boxes;
    Fs.push_back(value_at(xs[i]));
  }
  for (int i = 0; i < initial_boxes; ++i) heap.push(make_box(xs[i], xs[i + 1], Fs[i], Fs[i + 1]));
  std::vector<Box> stuck;  // boxes too narrow to split in double
  while (!heap.empty()) {
    const Box top = heap.top();
    const double gap = to_double<I>(top.U - lb);  // stopping rule only, not a bound
    if (gap <= rel_tol * std::fabs(to_double<I>(lb))) {
      out.tolerance_met = true;
      break;
    }
    if (out.boxes >= max_boxes) break;
    heap.pop();
    if (!(top.a < top.m && top.m < top.b)) {
      stuck.push_back(top);
      continue;
    }
    for (const Box& child : {make_box(top.a, top.m, top.Fa, top.Fm), make_box(top.m, top.b, top.Fm, top.Fb)})
      if (!(child.U < lb)) heap.push(child);
  }
  Scalar<I> ub = lb;
  if (!heap.empty() && ub < heap.top().U) ub = heap.top().U;
  for (const Box& b : stuck)
    if (ub < b.U) ub = b.U;
  if (!stuck.empty()) out.tolerance_met = false;
  out.value = I(lb, ub);
  return out;
}

template <Interval I>
std::array<SupEnclosure<I>, 4> greens_beta_detailed(double rel_tol) {
  const arith::FpEnvScope fp_env;  // caller's rounding mode and flags restored on exit (arith/fp_env.hpp)
  std::array<SupEnclosure<I>, 4> out;
  for (int k = 0; k < 4; ++k) {
    out[k] = sup_by_subdivision<I>([k](double x) { return greens_abs_integral<I>(k, x); },
                                   [k](double a, double b) { return greens_abs_integral_derivative<I>(k, a, b); }, 0.0,
                                   1.0, rel_tol);
  }
  return out;
}

template <Interval I>
std::array<I, 4> greens_beta(double rel_tol) {
  const auto d = greens_beta_detailed<I>(rel_tol);
  return {d[0].value, d[1].value, d[2].value, d[3].value};
}

template <Interval I>
std::array<I, 4> greens_beta_closed_form() {
  const I r33 = bn::sqrt(I(33));
  return {(I(39) + I(55) * r33) / I(65536), I(1) / I(48), I(1) / I(8), I(5) / I(8)};
}

template <Interval I>
I greens_beta0_argmax() {
  return (I(1) + bn::sqrt(I(33))) / I(16);
}

#define PORECERT_GREENS_INSTANTIATE(I)                                                                            \
  template I greens_piece<I>(int, bool, const I&, const I&);                                                      \
  template I greens_eval<I>(int, const I&, const I&);                                                             \
  template I greens_abs_integral<I>(int, double);                                                                 \
  template I greens_abs_integral_derivative<I>(int, double, double);                                              \
  template SupEnclosure<I> sup_by_subdivision<I>(const std::function<I(double)>&,                                 \
                                                 const std::function<I(double, double)>&, double, double, double, \
                                                 std::size_t, int);                                               \
  template std::array<SupEnclosure<I>, 4> greens_beta_detailed<I>(double);                                        \
  template std::array<I, 4> greens_beta<I>(double);                                                               \
  template std::array<I, 4> greens_beta_closed_form<I>();                                                         \
  template I greens_beta0_argmax<I>();

PORECERT_GREENS_INSTANTIATE(Id)
PORECERT_GREENS_INSTANTIATE(Im)
#undef PORECERT_GREENS_INSTANTIATE

}  // namespace porecert::proof
