#include "arith/interval.hpp"

#include <mpfr.h>

#include <algorithm>
#include <cfenv>
#include <cstdlib>
#include <stdexcept>

namespace porecert::arith {

mpfr_prec_t& Mpfr::working_precision() {
  thread_local mpfr_prec_t p = 128;
  return p;
}

namespace detail {
void throw_nan(const char* where) { throw nan_error(std::string("NaN produced in interval ") + where); }

static double transc(int fn, double x, mpfr_rnd_t r) {
  if (x != x) throw_nan("transcendental");
  mpfr_t t;
  mpfr_init2(t, 200);
  mpfr_set_d(t, x, MPFR_RNDN);  // exact
  switch (fn) {
    case fn_exp:
      mpfr_exp(t, t, r);
      break;
    case fn_log:
      mpfr_log(t, t, r);
      break;
    case fn_sin:
      mpfr_sin(t, t, r);
      break;
    case fn_cos:
      mpfr_cos(t, t, r);
      break;
    default:
      mpfr_atan(t, t, r);
      break;
  }
  // Directed rounding twice in the same direction is the directed rounding (grids nest).
  const double d = mpfr_get_d(t, r);
  const bool bad = mpfr_nan_p(t);
  mpfr_clear(t);
  if (bad) throw_nan("transcendental");
  return d;
}
double mpfr_transc_down(int fn, double x) { return transc(fn, x, MPFR_RNDD); }
double mpfr_transc_up(int fn, double x) { return transc(fn, x, MPFR_RNDU); }
}  // namespace detail

void require_round_to_nearest() {
  if (std::fegetround() != FE_TONEAREST)
    throw std::logic_error("porecert: the FPU is not in round-to-nearest; the interval policy needs it");
}

namespace {
// Parses s completely into t with rounding r; false if s is not a finite number.
bool parse_into(mpfr_t t, std::string_view s, mpfr_rnd_t r) {
  std::string str(s);
  if (str.empty()) return false;
  for (char c : str)
    if (!(std::isdigit(static_cast<unsigned char>(c)) || c == '.' || c == 'e' || c == 'E' || c == '+' || c == '-' ||
          c == 'x' || c == 'X' || c == 'p' || c == 'P' || (c >= 'a' && c <= 'f') || (c >= 'A' && c <= 'F')))
      return false;
  char* end = nullptr;
  mpfr_strtofr(t, str.c_str(), &end, 0, r);
  if (end != str.c_str() + str.size()) return false;
  return mpfr_number_p(t) != 0;
}
[[noreturn]] void bad_number(std::string_view s) {
  throw std::invalid_argument("'" + std::string(s) + "' is not a finite decimal or hexadecimal number");
}
std::string fmt(const char* f, int digits, mpfr_srcptr x) {
  char* buf = nullptr;
  mpfr_asprintf(&buf, f, digits - 1, x);
  std::string out(buf);
  mpfr_free_str(buf);
  return out;
}
}  // namespace

template <>
Id from_decimal<Id>(std::string_view s) {
  mpfr_t lo, hi;
  mpfr_inits2(256, lo, hi, static_cast<mpfr_ptr>(nullptr));
  const bool ok = parse_into(lo, s, MPFR_RNDD) && parse_into(hi, s, MPFR_RNDU);
  const double l = mpfr_get_d(lo, MPFR_RNDD), h = mpfr_get_d(hi, MPFR_RNDU);
  mpfr_clears(lo, hi, static_cast<mpfr_ptr>(nullptr));
  if (!ok || !std::isfinite(l) || !std::isfinite(h)) bad_number(s);
  return Id(l, h);
}

template <>
Im from_decimal<Im>(std::string_view s) {
  Mpfr lo, hi;
  if (!parse_into(lo.get(), s, MPFR_RNDD) || !parse_into(hi.get(), s, MPFR_RNDU)) bad_number(s);
  return Im(lo, hi);
}

template <>
Id pi<Id>() {
  mpfr_t t;
  mpfr_init2(t, 200);
  mpfr_const_pi(t, MPFR_RNDD);
  const double l = mpfr_get_d(t, MPFR_RNDD);
  mpfr_const_pi(t, MPFR_RNDU);
  const double h = mpfr_get_d(t, MPFR_RNDU);
  mpfr_clear(t);
  return Id(l, h);
}

template <>
Im pi<Im>() {
  Mpfr lo, hi;
  mpfr_const_pi(lo.get(), MPFR_RNDD);
  mpfr_const_pi(hi.get(), MPFR_RNDU);
  return Im(lo, hi);
}

std::string decimal_lower(const Id& x, int digits) {
  mpfr_t t;
  mpfr_init2(t, 64);
  mpfr_set_d(t, x.lower(), MPFR_RNDN);
  std::string s = fmt("%.*RDe", digits, t);
  mpfr_clear(t);
  return s;
}
std::string decimal_upper(const Id& x, int digits) {
  mpfr_t t;
  mpfr_init2(t, 64);
  mpfr_set_d(t, x.upper(), MPFR_RNDN);
  std::string s = fmt("%.*RUe", digits, t);
  mpfr_clear(t);
  return s;
}
std::string decimal_lower(const Im& x, int digits) { return fmt("%.*RDe", digits, x.lower().get()); }
std::string decimal_upper(const Im& x, int digits) { return fmt("%.*RUe", digits, x.upper().get()); }

namespace {
// [min, max] of cos on [a, b] into lo (rounded down) and hi (rounded up), at precision prec.
void cos_range(mpfr_srcptr a, mpfr_srcptr b, mpfr_prec_t prec, mpfr_ptr lo, mpfr_ptr hi) {
  mpfr_t t, u, pi_lo, pi_hi, k;
  mpfr_inits2(prec, t, u, pi_lo, pi_hi, k, static_cast<mpfr_ptr>(nullptr));
  mpfr_const_pi(pi_lo, MPFR_RNDD);
  mpfr_const_pi(pi_hi, MPFR_RNDU);
  mpfr_sub(t, b, a, MPFR_RNDD);
  mpfr_mul_ui(u, pi_hi, 2, MPFR_RNDU);
  if (mpfr_cmp(t, u) >= 0) {  // a full period inside
    mpfr_set_si(lo, -1, MPFR_RNDD);
    mpfr_set_si(hi, 1, MPFR_RNDU);
  } else {
    mpfr_cos(t, a, MPFR_RNDD);
    mpfr_cos(u, b, MPFR_RNDD);
    mpfr_min(lo, t, u, MPFR_RNDD);
    mpfr_cos(t, a, MPFR_RNDU);
    mpfr_cos(u, b, MPFR_RNDU);
    mpfr_max(hi, t, u, MPFR_RNDU);
    // Multiples jπ that may lie in [a, b]: j from floor(a/π) to ceil(b/π) (at most 4 candidates).
    mpfr_div(t, a, (mpfr_sgn(a) >= 0 ? pi_hi : pi_lo), MPFR_RNDD);
    mpfr_floor(k, t);
    mpfr_div(u, b, (mpfr_sgn(b) >= 0 ? pi_lo : pi_hi), MPFR_RNDU);
    mpfr_ceil(u, u);
    for (; mpfr_cmp(k, u) <= 0; mpfr_add_ui(k, k, 1, MPFR_RNDN)) {
      // Is jπ possibly inside [a, b]? Test with the outward enclosure [j π_lo, j π_hi] (or reversed for j < 0).
      mpfr_t e1, e2;
      mpfr_inits2(prec, e1, e2, static_cast<mpfr_ptr>(nullptr));
      mpfr_mul(e1, k, pi_lo, MPFR_RNDD);
      mpfr_mul(e2, k, pi_hi, MPFR_RNDU);
      if (mpfr_sgn(k) < 0) {
        mpfr_mul(e1, k, pi_hi, MPFR_RNDD);
        mpfr_mul(e2, k, pi_lo, MPFR_RNDU);
      }
      const bool maybe_inside = mpfr_cmp(e2, a) >= 0 && mpfr_cmp(e1, b) <= 0;
      mpfr_clears(e1, e2, static_cast<mpfr_ptr>(nullptr));
      if (!maybe_inside) continue;
      mpfr_fmod_ui(t, k, 2, MPFR_RNDN);
      if (mpfr_zero_p(t))
        mpfr_set_si(hi, 1, MPFR_RNDU);
      else
        mpfr_set_si(lo, -1, MPFR_RNDD);
    }
  }
  mpfr_clears(t, u, pi_lo, pi_hi, k, static_cast<mpfr_ptr>(nullptr));
}
mpfr_prec_t reduction_precision(mpfr_srcptr a, mpfr_srcptr b, mpfr_prec_t base) {
  long e = 0;
  if (!mpfr_zero_p(a)) e = std::max(e, static_cast<long>(mpfr_get_exp(a)));
  if (!mpfr_zero_p(b)) e = std::max(e, static_cast<long>(mpfr_get_exp(b)));
  return base + e + 64;
}
}  // namespace

Id cos_of(const Id& x) {
  mpfr_t a, b, lo, hi;
  mpfr_inits2(64, a, b, static_cast<mpfr_ptr>(nullptr));
  mpfr_set_d(a, x.lower(), MPFR_RNDN);
  mpfr_set_d(b, x.upper(), MPFR_RNDN);
  const mpfr_prec_t p = reduction_precision(a, b, 64);
  mpfr_inits2(p, lo, hi, static_cast<mpfr_ptr>(nullptr));
  cos_range(a, b, p, lo, hi);
  const Id r(mpfr_get_d(lo, MPFR_RNDD), mpfr_get_d(hi, MPFR_RNDU));
  mpfr_clears(a, b, lo, hi, static_cast<mpfr_ptr>(nullptr));
  return r;
}

Im cos_of(const Im& x) {
  const mpfr_prec_t p = reduction_precision(x.lower().get(), x.upper().get(), Mpfr::working_precision());
  mpfr_t lo, hi;
  mpfr_inits2(p, lo, hi, static_cast<mpfr_ptr>(nullptr));
  cos_range(x.lower().get(), x.upper().get(), p, lo, hi);
  Mpfr l, h;
  mpfr_set(l.get(), lo, MPFR_RNDD);
  mpfr_set(h.get(), hi, MPFR_RNDU);
  mpfr_clears(lo, hi, static_cast<mpfr_ptr>(nullptr));
  return Im(l, h);
}

std::string hex_exact(double d) {
  char buf[64];
  std::snprintf(buf, sizeof buf, "%a", d);
  return buf;
}
std::string hex_exact(const Mpfr& m) {
  char* buf = nullptr;
  mpfr_asprintf(&buf, "%Ra", m.get());
  std::string out(buf);
  mpfr_free_str(buf);
  return out;
}

}  // namespace porecert::arith
