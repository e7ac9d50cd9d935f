// MPFR intervals on Boost.Interval: every bound is computed by MPFR with MPFR_RNDD/MPFR_RNDU
// at the run-time working precision (Mpfr::working_precision()), so each bound is the
// correctly rounded directed result; transcendental bounds come from MPFR too.
#pragma once
#include <boost/numeric/interval.hpp>

#include "arith/interval_double.hpp"
#include "arith/mpfr_real.hpp"

namespace porecert::arith {

struct rounded_mpfr {
  // No rounding mode is ever switched, so the protected and unprotected forms coincide.
  using unprotected_rounding = rounded_mpfr;
  using F2 = int (*)(mpfr_ptr, mpfr_srcptr, mpfr_srcptr, mpfr_rnd_t);
  using F1 = int (*)(mpfr_ptr, mpfr_srcptr, mpfr_rnd_t);
  static Mpfr op2(F2 f, const Mpfr& x, const Mpfr& y, mpfr_rnd_t r, const char* w) {
    Mpfr z;
    f(z.get(), x.get(), y.get(), r);
    if (mpfr_nan_p(z.get())) detail::throw_nan(w);
    return z;
  }
  static Mpfr op1(F1 f, const Mpfr& x, mpfr_rnd_t r, const char* w) {
    Mpfr z;
    f(z.get(), x.get(), r);
    if (mpfr_nan_p(z.get())) detail::throw_nan(w);
    return z;
  }
  static Mpfr add_down(const Mpfr& x, const Mpfr& y) { return op2(mpfr_add, x, y, MPFR_RNDD, "add"); }
  static Mpfr add_up(const Mpfr& x, const Mpfr& y) { return op2(mpfr_add, x, y, MPFR_RNDU, "add"); }
  static Mpfr sub_down(const Mpfr& x, const Mpfr& y) { return op2(mpfr_sub, x, y, MPFR_RNDD, "sub"); }
  static Mpfr sub_up(const Mpfr& x, const Mpfr& y) { return op2(mpfr_sub, x, y, MPFR_RNDU, "sub"); }
  static Mpfr mul_down(const Mpfr& x, const Mpfr& y) { return op2(mpfr_mul, x, y, MPFR_RNDD, "mul"); }
  static Mpfr mul_up(const Mpfr& x, const Mpfr& y) { return op2(mpfr_mul, x, y, MPFR_RNDU, "mul"); }
  static Mpfr div_down(const Mpfr& x, const Mpfr& y) { return op2(mpfr_div, x, y, MPFR_RNDD, "div"); }
  static Mpfr div_up(const Mpfr& x, const Mpfr& y) { return op2(mpfr_div, x, y, MPFR_RNDU, "div"); }
  static Mpfr sqrt_down(const Mpfr& x) { return op1(mpfr_sqrt, x, MPFR_RNDD, "sqrt"); }
  static Mpfr sqrt_up(const Mpfr& x) { return op1(mpfr_sqrt, x, MPFR_RNDU, "sqrt"); }
  static Mpfr exp_down(const Mpfr& x) { return op1(mpfr_exp, x, MPFR_RNDD, "exp"); }
  static Mpfr exp_up(const Mpfr& x) { return op1(mpfr_exp, x, MPFR_RNDU, "exp"); }
  static Mpfr log_down(const Mpfr& x) { return op1(mpfr_log, x, MPFR_RNDD, "log"); }
  static Mpfr log_up(const Mpfr& x) { return op1(mpfr_log, x, MPFR_RNDU, "log"); }
  static Mpfr atan_down(const Mpfr& x) { return op1(mpfr_atan, x, MPFR_RNDD, "atan"); }
  static Mpfr atan_up(const Mpfr& x) { return op1(mpfr_atan, x, MPFR_RNDU, "atan"); }
  static Mpfr cos_down(const Mpfr& x) { return op1(mpfr_cos, x, MPFR_RNDD, "cos"); }
  static Mpfr cos_up(const Mpfr& x) { return op1(mpfr_cos, x, MPFR_RNDU, "cos"); }
  static Mpfr median(const Mpfr& x, const Mpfr& y) {
    Mpfr z = op2(mpfr_add, x, y, MPFR_RNDN, "median");
    mpfr_div_2ui(z.get(), z.get(), 1, MPFR_RNDN);
    return z;
  }
  static Mpfr int_down(const Mpfr& x) { return op1(mpfr_rint_floor, x, MPFR_RNDD, "floor"); }
  static Mpfr int_up(const Mpfr& x) { return op1(mpfr_rint_ceil, x, MPFR_RNDU, "ceil"); }
  static Mpfr conv(const Mpfr& v, mpfr_rnd_t r) {
    Mpfr z;
    mpfr_set(z.get(), v.get(), r);
    if (mpfr_nan_p(z.get())) detail::throw_nan("conversion");
    return z;
  }
  static Mpfr conv(double v, mpfr_rnd_t r) {
    if (v != v) detail::throw_nan("conversion");
    Mpfr z;
    mpfr_set_d(z.get(), v, r);
    return z;
  }
  static Mpfr conv(long v, mpfr_rnd_t r) {
    Mpfr z;
    mpfr_set_si(z.get(), v, r);
    return z;
  }
  static Mpfr conv(int v, mpfr_rnd_t r) { return conv(static_cast<long>(v), r); }
  template <class U>
  static Mpfr conv_down(const U& v) {
    return conv(v, MPFR_RNDD);
  }
  template <class U>
  static Mpfr conv_up(const U& v) {
    return conv(v, MPFR_RNDU);
  }
};

struct checking_catch_nan_mpfr {
  static Mpfr pos_inf() {
    Mpfr z;
    mpfr_set_inf(z.get(), 1);
    return z;
  }
  static Mpfr neg_inf() {
    Mpfr z;
    mpfr_set_inf(z.get(), -1);
    return z;
  }
  static Mpfr nan() { detail::throw_nan("interval nan()"); }
  static bool is_nan(const Mpfr& x) { return mpfr_nan_p(x.get()) != 0; }
  static Mpfr empty_lower() { detail::throw_nan("empty interval"); }
  static Mpfr empty_upper() { detail::throw_nan("empty interval"); }
  static bool is_empty(const Mpfr& l, const Mpfr& u) { return !(l <= u); }
};

using Im =
    boost::numeric::interval<Mpfr, boost::numeric::interval_lib::policies<rounded_mpfr, checking_catch_nan_mpfr>>;

}  // namespace porecert::arith
