#include "arith/interval.hpp"

#include <mpfr.h>

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
    case fn_exp: mpfr_exp(t, t, r); break;
    case fn_log: mpfr_log(t, t, r); break;
    case fn_sin: mpfr_sin(t, t, r); break;
    case fn_cos: mpfr_cos(t, t, r); break;
    default: mpfr_atan(t, t, r); break;
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
    if (!(std::isdigit(static_cast<unsigned char>(c)) || c == '.' || c == 'e' || c == 'E' || c == '+' ||
          c == '-' || c == 'x' || c == 'X' || c == 'p' || c == 'P' || (c >= 'a' && c <= 'f') ||
          (c >= 'A' && c <= 'F')))
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
