// The interval concept every higher layer is templated over, and the operations on it that
// are not Boost.Interval's own: exact decimal input, outward decimal output, three-valued
// comparisons, named unchecked construction, conversions between the two implementations.
// Enclosure contract: docs/enclosures.md §1. Every function here that returns an interval
// returns a set containing the exact real result; "tightest" is said where it holds.
#pragma once
#include <concepts>
#include <string>
#include <string_view>

#include "arith/interval_double.hpp"
#include "arith/interval_mpfr.hpp"

namespace porecert::arith {

template <class I>
concept Interval = std::same_as<I, Id> || std::same_as<I, Im>;

template <Interval I>
using scalar_of = typename I::base_type;

// Three-valued answer of a predicate on intervals: "unsure" is never "no" (docs/enclosures.md §4).
enum class Tri { no, yes, unsure };
inline const char* to_string(Tri t) { return t == Tri::yes ? "yes" : t == Tri::no ? "no" : "unsure"; }

// Tag for the only constructor that skips the lo <= hi and NaN checks.
struct unchecked_t {
  explicit unchecked_t() = default;
};
inline constexpr unchecked_t unchecked{};

template <Interval I>
I make_unchecked(unchecked_t, const scalar_of<I>& lo, const scalar_of<I>& hi) {
  return I(lo, hi, true);
}

// ---- bounds as doubles ---------------------------------------------------------------
// Largest double <= lower bound / smallest double >= upper bound.
inline double lower_down(const Id& x) { return x.lower(); }
inline double upper_up(const Id& x) { return x.upper(); }
inline double lower_down(const Im& x) { return x.lower().to_double(MPFR_RNDD); }
inline double upper_up(const Im& x) { return x.upper().to_double(MPFR_RNDU); }
// Upper bound of max |x| over the interval.
template <Interval I>
double mag_up(const I& x) {
  const double a = -lower_down(x), b = upper_up(x);
  return a > b ? a : b;
}
// Upper bound of the width hi - lo.
template <Interval I>
double width_up(const I& x) {
  return rounded_nearest_outward::sub_up(upper_up(x), lower_down(x));
}
// Midpoint rounded to nearest (a point inside the interval, for candidates and displays).
template <Interval I>
double mid_double(const I& x) {
  if constexpr (std::same_as<I, Id>) {
    return boost::numeric::median(x);
  } else {
    return boost::numeric::median(x).to_double();
  }
}

// ---- construction -----------------------------------------------------------------------
// Tightest enclosure of the decimal (or 0x hex) number written in s. Throws
// std::invalid_argument naming s when it is not a finite number in that syntax.
template <Interval I>
I from_decimal(std::string_view s);
template <>
Id from_decimal<Id>(std::string_view s);
template <>
Im from_decimal<Im>(std::string_view s);

// Exact point (every int and double is representable in both implementations).
template <Interval I>
I point(double d) {
  return I(d);
}
// Enclosure of p/q (tightest for the double implementation when |p|, |q| ≤ 2^53; the integers
// are converted outward, so the result encloses p/q for every p, q).
template <Interval I>
I ratio(long p, long q) {
  return I(p) / I(q);
}
// Outward conversion to the double implementation (exact when the bounds are doubles).
inline Id to_id(const Id& x) { return x; }
inline Id to_id(const Im& x) { return make_unchecked<Id>(unchecked, lower_down(x), upper_up(x)); }
// Conversion from a double interval: exact at working precision >= 53 bits, outward below.
template <Interval I>
I from_id(const Id& x) {
  if constexpr (std::same_as<I, Id>) {
    return x;
  } else {
    return I(x.lower(), x.upper());  // conv_down/conv_up: outward even below 53 bits
  }
}
// Enclosure of pi (tightest in double; at working precision for MPFR).
template <Interval I>
I pi();
template <>
Id pi<Id>();
template <>
Im pi<Im>();
// Enclosure of cos over the interval x, for any finite x (argument reduction in MPFR with enough
// bits for the exponent of x). Use this, not boost::numeric::cos: Boost's reduction by 2π loses
// containment for 2^25 ≲ |x| ≲ 2^56 on Id (tests/test_interval_containment.cpp) and is loose on Im.
Id cos_of(const Id& x);
Im cos_of(const Im& x);

// ---- output -------------------------------------------------------------------------------
// Decimal strings with `digits` significant digits: lower bound rounded down, upper rounded up,
// so [decimal_lower, decimal_upper] read back contains the interval.
std::string decimal_lower(const Id& x, int digits = 17);
std::string decimal_upper(const Id& x, int digits = 17);
std::string decimal_lower(const Im& x, int digits = 40);
std::string decimal_upper(const Im& x, int digits = 40);
// Exact hexadecimal form of a double / an MPFR number ("%a" style); read back exactly by from_decimal.
std::string hex_exact(double d);
std::string hex_exact(const Mpfr& m);

// ---- three-valued predicates ---------------------------------------------------------------
template <Interval I>
Tri tri_less(const I& a, const I& b) {  // a < b ?
  if (a.upper() < b.lower()) return Tri::yes;
  if (a.lower() >= b.upper()) return Tri::no;
  return Tri::unsure;
}
template <Interval I>
Tri tri_positive(const I& a) {  // a > 0 ?
  if (a.lower() > 0) return Tri::yes;
  if (a.upper() <= 0) return Tri::no;
  return Tri::unsure;
}
template <Interval I>
Tri tri_negative(const I& a) {  // a < 0 ?
  if (a.upper() < 0) return Tri::yes;
  if (a.lower() >= 0) return Tri::no;
  return Tri::unsure;
}
template <Interval I>
Tri tri_disjoint(const I& a, const I& b) {  // are the exact values surely different?
  if (a.upper() < b.lower() || b.upper() < a.lower()) return Tri::yes;
  if (boost::numeric::singleton(a) && boost::numeric::singleton(b) && a.lower() == b.lower()) return Tri::no;
  return Tri::unsure;
}

}  // namespace porecert::arith
