// Dimensional channel data ([channel] in a case file) and the certified dimensional results
// derived from a certificate's value enclosures. Formulas and equation numbers: docs/units.md.
// Every number is a double interval enclosing the exact value for every input inside its
// enclosure (the text of the case file, read exactly, and the certified values).
#pragma once
#include <map>
#include <string>
#include <vector>

#include "arith/interval.hpp"

namespace porecert::model {

// The [channel] fields, as given (text with units), and their SI enclosures.
struct Channel {
  std::map<std::string, std::string> given;  // field -> text, exactly as in the case file
  arith::Id h, V, nu, mu, rho, U0, x;        // m, m/s, m^2/s, Pa s, kg/m^3, m/s, m
};

// Field names accepted in [channel] (docs/units.md §U2).
const std::vector<std::string>& channel_fields();

// Reads and checks the fields (prefix names the table in messages, e.g. "channel"). Rules:
// half_width > 0; wall_velocity any sign (> 0 suction, < 0 injection); exactly one of
// kinematic_viscosity and dynamic_viscosity, > 0; density > 0; mean_inlet_velocity >= 0 (0: closed end);
// axial_position >= 0 and upstream of the point where suction has drawn off all the flow
// (U0 - V x / h > 0, (U3)). Throws input_error naming the field, the value and the rule.
Channel read_channel(const std::map<std::string, std::string>& fields, const std::string& prefix = "channel");

// R = V h / nu (U1): encloses the wall Reynolds number of the inputs.
arith::Id reynolds(const Channel& c);

// Mean axial velocity at x, U(x) = U0 - V x / h (U3).
arith::Id mean_velocity_at_x(const Channel& c);

struct DimResult {
  std::string key, label, symbol, unit, equation;
  arith::Id value;
};

// The certified dimensional results at x (U3)-(U7) from enclosures of f'(0), f''(1), K:
// mean velocity, centre-line velocity, wall shear stress, axial pressure gradient, wall velocity.
// Each encloses the exact value for every solution the certificate covers.
std::vector<DimResult> dimensional_results(const Channel& c, const arith::Id& fp0, const arith::Id& fpp1,
                                           const arith::Id& K);

// Velocities at y = eta h from enclosures of f'(eta), f(eta): u = U(x) f'(eta) (U4), v = V f(eta) (U5).
arith::Id axial_velocity(const Channel& c, const arith::Id& fprime_eta);
arith::Id normal_velocity(const Channel& c, const arith::Id& f_eta);

}  // namespace porecert::model
