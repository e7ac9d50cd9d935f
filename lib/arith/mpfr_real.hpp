// A thin RAII owner of an mpfr_t with a run-time working precision, the scalar under the
// MPFR intervals (interval_mpfr.hpp). Its own operators round to nearest: they are for
// candidates and bookkeeping, never for bounds (bounds go through rounded_mpfr).
#pragma once
#include <mpfr.h>

#include <string>
#include <utility>

namespace porecert::arith {

class Mpfr {
 public:
  // Precision (bits) new numbers get; per thread, default 128.
  static mpfr_prec_t& working_precision();

  Mpfr() {
    mpfr_init2(v_, working_precision());
    mpfr_set_zero(v_, 1);
  }
  Mpfr(int x) {
    mpfr_init2(v_, working_precision());
    mpfr_set_si(v_, x, MPFR_RNDN);
  }
  Mpfr(long x) {
    mpfr_init2(v_, working_precision());
    mpfr_set_si(v_, x, MPFR_RNDN);
  }
  Mpfr(double x) {
    mpfr_init2(v_, working_precision());
    mpfr_set_d(v_, x, MPFR_RNDN);
  }
  Mpfr(const Mpfr& o) {
    mpfr_init2(v_, mpfr_get_prec(o.v_));
    mpfr_set(v_, o.v_, MPFR_RNDN);
  }
  Mpfr(Mpfr&& o) noexcept {
    mpfr_init2(v_, MPFR_PREC_MIN);
    mpfr_swap(v_, o.v_);
  }
  Mpfr& operator=(const Mpfr& o) {
    if (this != &o) {
      mpfr_set_prec(v_, mpfr_get_prec(o.v_));
      mpfr_set(v_, o.v_, MPFR_RNDN);
    }
    return *this;
  }
  Mpfr& operator=(Mpfr&& o) noexcept {
    mpfr_swap(v_, o.v_);
    return *this;
  }
  ~Mpfr() { mpfr_clear(v_); }

  mpfr_ptr get() { return v_; }
  mpfr_srcptr get() const { return v_; }
  double to_double(mpfr_rnd_t r = MPFR_RNDN) const { return mpfr_get_d(v_, r); }

  friend Mpfr operator+(const Mpfr& a, const Mpfr& b) {
    Mpfr r;
    mpfr_add(r.v_, a.v_, b.v_, MPFR_RNDN);
    return r;
  }
  friend Mpfr operator-(const Mpfr& a, const Mpfr& b) {
    Mpfr r;
    mpfr_sub(r.v_, a.v_, b.v_, MPFR_RNDN);
    return r;
  }
  friend Mpfr operator*(const Mpfr& a, const Mpfr& b) {
    Mpfr r;
    mpfr_mul(r.v_, a.v_, b.v_, MPFR_RNDN);
    return r;
  }
  friend Mpfr operator/(const Mpfr& a, const Mpfr& b) {
    Mpfr r;
    mpfr_div(r.v_, a.v_, b.v_, MPFR_RNDN);
    return r;
  }
  friend Mpfr operator-(const Mpfr& a) {
    Mpfr r(a);
    mpfr_neg(r.v_, r.v_, MPFR_RNDN);
    return r;
  }
  Mpfr& operator+=(const Mpfr& b) {
    mpfr_add(v_, v_, b.v_, MPFR_RNDN);
    return *this;
  }
  Mpfr& operator-=(const Mpfr& b) {
    mpfr_sub(v_, v_, b.v_, MPFR_RNDN);
    return *this;
  }
  Mpfr& operator*=(const Mpfr& b) {
    mpfr_mul(v_, v_, b.v_, MPFR_RNDN);
    return *this;
  }
  Mpfr& operator/=(const Mpfr& b) {
    mpfr_div(v_, v_, b.v_, MPFR_RNDN);
    return *this;
  }
  friend bool operator<(const Mpfr& a, const Mpfr& b) { return mpfr_less_p(a.v_, b.v_); }
  friend bool operator<=(const Mpfr& a, const Mpfr& b) { return mpfr_lessequal_p(a.v_, b.v_); }
  friend bool operator>(const Mpfr& a, const Mpfr& b) { return mpfr_greater_p(a.v_, b.v_); }
  friend bool operator>=(const Mpfr& a, const Mpfr& b) { return mpfr_greaterequal_p(a.v_, b.v_); }
  friend bool operator==(const Mpfr& a, const Mpfr& b) { return mpfr_equal_p(a.v_, b.v_); }
  friend bool operator!=(const Mpfr& a, const Mpfr& b) { return !mpfr_equal_p(a.v_, b.v_); }

 private:
  mpfr_t v_;
};

inline Mpfr abs(const Mpfr& a) {
  Mpfr r(a);
  mpfr_abs(r.get(), r.get(), MPFR_RNDN);
  return r;
}
inline Mpfr sqrt(const Mpfr& a) {
  Mpfr r;
  mpfr_sqrt(r.get(), a.get(), MPFR_RNDN);
  return r;
}
inline Mpfr cos(const Mpfr& a) {
  Mpfr r;
  mpfr_cos(r.get(), a.get(), MPFR_RNDN);
  return r;
}
inline bool isnan(const Mpfr& a) { return mpfr_nan_p(a.get()) != 0; }

// Sets the working precision for the lifetime of the scope, then restores it.
class PrecisionScope {
 public:
  explicit PrecisionScope(mpfr_prec_t bits) : saved_(Mpfr::working_precision()) { Mpfr::working_precision() = bits; }
  ~PrecisionScope() { Mpfr::working_precision() = saved_; }
  PrecisionScope(const PrecisionScope&) = delete;
  PrecisionScope& operator=(const PrecisionScope&) = delete;

 private:
  mpfr_prec_t saved_;
};

}  // namespace porecert::arith
