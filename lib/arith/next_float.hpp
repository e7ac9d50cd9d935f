// One-ulp steps and error-free sums on IEEE binary64, the basis of the
// round-to-nearest-plus-outward-step policy (docs/enclosures.md §2, trap 9).
#pragma once
#include <bit>
#include <cfloat>
#include <cmath>
#include <cstdint>
#include <limits>
#include <utility>

#if defined(__FAST_MATH__)
#error "porecert: the fast-math mode breaks outward rounding (docs/enclosures.md, forbidden flags)"
#endif
#if defined(__FLT_EVAL_METHOD__) && __FLT_EVAL_METHOD__ != 0
#error "porecert: needs FLT_EVAL_METHOD == 0 (SSE2 double arithmetic, no x87 excess precision)"
#endif

namespace porecert::arith {

// Smallest double strictly greater than x; +inf stays +inf, NaN stays NaN.
inline double next_up(double x) noexcept {
  if (std::isnan(x) || x == std::numeric_limits<double>::infinity()) return x;
  if (x == 0.0) return std::numeric_limits<double>::denorm_min();
  auto b = std::bit_cast<std::uint64_t>(x);
  b = (x > 0) ? b + 1 : b - 1;
  return std::bit_cast<double>(b);
}

// Largest double strictly less than x; -inf stays -inf, NaN stays NaN.
inline double next_down(double x) noexcept { return -next_up(-x); }

// Exact error of s = fl(a + b) (Knuth's TwoSum): a + b = s + e exactly when s is finite.
inline double two_sum_error(double a, double b, double s) noexcept {
  if (std::fabs(a) < std::fabs(b)) std::swap(a, b);  // else s - a can overflow for finite s (then NaN)
  const double bb = s - a;
  return (a - (s - bb)) + (b - bb);
}

}  // namespace porecert::arith
