// Double intervals on Boost.Interval with a rounding policy that needs no rounding mode:
// every operation is done in round-to-nearest (correctly rounded by IEEE 754) and the result
// is stepped one ulp outward unless it is proven exact. Constant folding, common-subexpression
// elimination and thread rounding state cannot break it (traps 1-4, 9 in docs/enclosures.md).
// Transcendental functions come from MPFR, rounded outward (libm is not correctly rounded).
#pragma once
#include <boost/numeric/interval.hpp>
#include <stdexcept>

#include "arith/next_float.hpp"

namespace porecert::arith {

// Thrown whenever an operation on the proof path would produce NaN (trap 6).
struct nan_error : std::domain_error {
  using std::domain_error::domain_error;
};

namespace detail {
[[noreturn]] void throw_nan(const char* where);
double mpfr_transc_down(int fn, double x);
double mpfr_transc_up(int fn, double x);
enum transc_fn : int { fn_exp, fn_log, fn_sin, fn_cos, fn_atan };
}  // namespace detail

// Rounding policy: IEEE round-to-nearest result plus a one-ulp outward step.
// Requires the FPU in round-to-nearest (checked by require_round_to_nearest()).
struct rounded_nearest_outward {
  // No rounding mode is ever switched, so the protected and unprotected forms coincide.
  using unprotected_rounding = rounded_nearest_outward;
  static double chk(double r, const char* w) {
    if (std::isnan(r)) detail::throw_nan(w);
    return r;
  }
  // Sums: TwoSum tells whether fl(x+y) is exact or on which side it rounded.
  static double add_down(double x, double y) {
    const double s = x + y;
    if (!std::isfinite(s)) {
      chk(s, "add");
      if (s > 0 && std::isfinite(x) && std::isfinite(y)) return std::numeric_limits<double>::max();
      return s;
    }
    return two_sum_error(x, y, s) < 0 ? next_down(s) : s;
  }
  static double add_up(double x, double y) {
    const double s = x + y;
    if (!std::isfinite(s)) {
      chk(s, "add");
      if (s < 0 && std::isfinite(x) && std::isfinite(y)) return std::numeric_limits<double>::lowest();
      return s;
    }
    return two_sum_error(x, y, s) > 0 ? next_up(s) : s;
  }
  static double sub_down(double x, double y) { return add_down(x, -y); }
  static double sub_up(double x, double y) { return add_up(x, -y); }
  // Products and quotients are proven exact only when a factor is 0 or a power of two
  // and the result is normal (scaling by 2^k then loses no bit); otherwise step outward.
  static bool pow2(double x) {
    const auto b = std::bit_cast<std::uint64_t>(x);
    return (b & 0x000FFFFFFFFFFFFFull) == 0 && ((b >> 52) & 0x7FF) != 0 && ((b >> 52) & 0x7FF) != 0x7FF;
  }
  static bool exact_mul(double x, double y, double p) {
    // |p| > DBL_MIN, not >=: a subnormal exact product can round up to DBL_MIN.
    return x == 0 || y == 0 || ((pow2(x) || pow2(y)) && std::fabs(p) > DBL_MIN && std::isfinite(p));
  }
  static double mul_down(double x, double y) {
    const double p = chk(x * y, "mul");
    return exact_mul(x, y, p) ? p : next_down(p);
  }
  static double mul_up(double x, double y) {
    const double p = chk(x * y, "mul");
    return exact_mul(x, y, p) ? p : next_up(p);
  }
  static double div_down(double x, double y) {
    const double q = chk(x / y, "div");
    return (x == 0 || (pow2(y) && std::fabs(q) > DBL_MIN && std::isfinite(q))) ? q : next_down(q);
  }
  static double div_up(double x, double y) {
    const double q = chk(x / y, "div");
    return (x == 0 || (pow2(y) && std::fabs(q) > DBL_MIN && std::isfinite(q))) ? q : next_up(q);
  }
  static double sqrt_down(double x) {
    const double r = chk(std::sqrt(x), "sqrt");
    // fma is one rounding: 0 proves r*r == x once x >= 2^-970 (below, a nonzero r*r - x can underflow to 0).
    return (x == 0 || x >= 0x1p-970) && std::fma(r, r, -x) == 0 ? r : next_down(r);
  }
  static double sqrt_up(double x) {
    const double r = chk(std::sqrt(x), "sqrt");
    return (x == 0 || x >= 0x1p-970) && std::fma(r, r, -x) == 0 ? r : next_up(r);
  }
  static double median(double x, double y) { return chk(x * 0.5 + y * 0.5, "median"); }
  static double int_down(double x) { return std::floor(x); }
  static double int_up(double x) { return std::ceil(x); }
  template <class U>
  static double conv_down(const U& v) {
    if constexpr (std::is_same_v<U, double>) {
      return chk(v, "conversion");
    } else {
      // Compare in long double (64-bit significand: exact for every integer type up to 64 bits),
      // never by casting d back to U (2^63 does not fit in long).
      const double d = static_cast<double>(v);
      return (static_cast<long double>(d) <= static_cast<long double>(v)) ? d : next_down(d);
    }
  }
  template <class U>
  static double conv_up(const U& v) {
    if constexpr (std::is_same_v<U, double>) {
      return chk(v, "conversion");
    } else {
      const double d = static_cast<double>(v);
      return (static_cast<long double>(d) >= static_cast<long double>(v)) ? d : next_up(d);
    }
  }
  // Used by boost::numeric::exp etc.: correctly rounded MPFR results.
  static double exp_down(double x) { return detail::mpfr_transc_down(detail::fn_exp, x); }
  static double exp_up(double x) { return detail::mpfr_transc_up(detail::fn_exp, x); }
  static double log_down(double x) { return detail::mpfr_transc_down(detail::fn_log, x); }
  static double log_up(double x) { return detail::mpfr_transc_up(detail::fn_log, x); }
  static double atan_down(double x) { return detail::mpfr_transc_down(detail::fn_atan, x); }
  static double atan_up(double x) { return detail::mpfr_transc_up(detail::fn_atan, x); }
  static double cos_down(double x) { return detail::mpfr_transc_down(detail::fn_cos, x); }
  static double cos_up(double x) { return detail::mpfr_transc_up(detail::fn_cos, x); }
};

// Checking policy: NaN anywhere (input or bound) throws instead of slipping through (trap 6).
template <class T>
struct checking_catch_nan : boost::numeric::interval_lib::checking_base<T> {
  static T nan() { detail::throw_nan("interval nan()"); }
  static bool is_nan(const T& x) { return x != x; }
  static T empty_lower() { detail::throw_nan("empty interval"); }
  static T empty_upper() { detail::throw_nan("empty interval"); }
  static bool is_empty(const T& l, const T& u) { return !(l <= u); }
};

using Id = boost::numeric::interval<
    double, boost::numeric::interval_lib::policies<rounded_nearest_outward, checking_catch_nan<double>>>;

// Throws std::logic_error unless the FPU rounds to nearest (the policy's one assumption).
void require_round_to_nearest();

}  // namespace porecert::arith
