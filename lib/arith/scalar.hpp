// What the Chebyshev and model code needs of a scalar, for the three kinds it runs on:
// interval types (rigorous), and double / Mpfr (round-to-nearest, candidates only).
#pragma once
#include <cmath>

#include "arith/interval.hpp"

namespace porecert::arith {

template <class S>
inline constexpr bool is_interval_v = Interval<S>;

// Upper bound of |x| as a double: rigorous for intervals, plain rounding otherwise.
template <class S>
double abs_up(const S& x) {
  if constexpr (Interval<S>) {
    return mag_up(x);
  } else if constexpr (std::is_same_v<S, Mpfr>) {
    return std::fabs(x.to_double(MPFR_RNDU));
  } else {
    return std::fabs(x);
  }
}

// a + b for nonnegative doubles, rounded up (used to add norms).
inline double add_up(double a, double b) { return rounded_nearest_outward::add_up(a, b); }
inline double mul_up(double a, double b) { return rounded_nearest_outward::mul_up(a, b); }
inline double div_up(double a, double b) { return rounded_nearest_outward::div_up(a, b); }

// Scalar of kind S from an exact rational p/q (enclosure for intervals, nearest otherwise).
template <class S>
S rational(long p, long q) {
  if constexpr (Interval<S>) {
    return ratio<S>(p, q);
  } else {
    return S(static_cast<double>(p)) / S(static_cast<double>(q));
  }
}

// Nearest double to x (midpoint for intervals).
template <class S>
double to_double_nearest(const S& x) {
  if constexpr (Interval<S>) {
    return mid_double(x);
  } else if constexpr (std::is_same_v<S, Mpfr>) {
    return x.to_double();
  } else {
    return x;
  }
}

}  // namespace porecert::arith
