// Physical quantities with units, read exactly: "1.5 mm", "20 um/s", "1.0e-6 m^2/s", "1 mPa s".
// The number goes through from_decimal and every conversion factor is an enclosure, so the SI
// value is an interval that contains the exact value of the text (docs/units.md §U1).
#pragma once
#include <array>
#include <string>

#include "arith/interval.hpp"

namespace porecert::model {

// Exponents of (metre, kilogram, second).
using Dim = std::array<int, 3>;
inline constexpr Dim kLength{1, 0, 0}, kVelocity{1, 0, -1}, kKinematicViscosity{2, 0, -1}, kDynamicViscosity{-1, 1, -1},
    kDensity{-3, 1, 0}, kPressure{-1, 1, -2}, kPressureGradient{-2, 1, -2};

struct Quantity {
  arith::Id si;  // encloses the exact value in SI base units
  Dim dim{};
};

// Parses "NUMBER UNITS". Units: products/quotients of prefixed symbols with optional integer
// powers ("kg/m^3", "mPa s", "mPa*s", "m^2/s", "s^-1"); "/" divides by the next factor only.
// Symbols: m, g, s, min, h, L, Pa, N, P (poise), St (stokes); prefixes G M k c m u µ μ n p.
// Out of rule (no number, unknown unit, power out of -9..9): throws input_error naming field,
// text and rule. Encloses the exact value; loose only by the outward rounding of the factors.
Quantity parse_quantity(const std::string& field, const std::string& text);

// parse_quantity, then checks the dimension; `what` names it in the message ("a length").
arith::Id parse_quantity_as(const std::string& field, const std::string& text, const Dim& want,
                            const std::string& what);

// "m^2 s^-1"-style spelling of a dimension, for messages.
std::string dim_text(const Dim& d);

}  // namespace porecert::model
