#include "model/dimensional.hpp"

#include "model/case_file.hpp"
#include "model/units.hpp"

namespace porecert::model {

using arith::Id;

const std::vector<std::string>& channel_fields() {
  static const std::vector<std::string> f{"half_width",        "wall_velocity", "kinematic_viscosity",
                                          "dynamic_viscosity", "density",       "mean_inlet_velocity",
                                          "axial_position"};
  return f;
}

Channel read_channel(const std::map<std::string, std::string>& fields, const std::string& prefix) {
  for (const auto& [k, v] : fields) {
    bool known = false;
    for (const auto& f : channel_fields()) known = known || f == k;
    if (!known)
      throw input_error(prefix + "." + k +
                        ": unknown field (allowed: half_width, wall_velocity, kinematic_viscosity "
                        "or dynamic_viscosity, density, mean_inlet_velocity, axial_position)");
  }
  Channel c;
  c.given = fields;
  auto need = [&](const std::string& k) -> const std::string& {
    auto it = fields.find(k);
    if (it == fields.end())
      throw input_error(prefix + "." + k + ": missing (rule: docs/units.md §U2 lists the fields)");
    return it->second;
  };
  auto positive = [&](const std::string& k, const Id& v, bool allow_zero) {
    const bool ok = allow_zero ? v.lower() >= 0 : v.lower() > 0;
    if (!ok)
      throw input_error(prefix + "." + k + ": '" + fields.at(k) + "' must be " +
                        (allow_zero ? "zero or positive" : "positive"));
  };
  const auto F = [&](const std::string& k) { return prefix + "." + k; };
  c.h = parse_quantity_as(F("half_width"), need("half_width"), kLength, "a length");
  positive("half_width", c.h, false);
  c.V = parse_quantity_as(F("wall_velocity"), need("wall_velocity"), kVelocity, "a velocity");
  c.rho = parse_quantity_as(F("density"), need("density"), kDensity, "a density");
  positive("density", c.rho, false);
  const bool has_nu = fields.count("kinematic_viscosity"), has_mu = fields.count("dynamic_viscosity");
  if (has_nu == has_mu)
    throw input_error(prefix + ".kinematic_viscosity / " + prefix +
                      ".dynamic_viscosity: give exactly one of them (the other follows from the density)");
  if (has_nu) {
    c.nu = parse_quantity_as(F("kinematic_viscosity"), need("kinematic_viscosity"), kKinematicViscosity,
                             "a kinematic viscosity");
    positive("kinematic_viscosity", c.nu, false);
    c.mu = c.nu * c.rho;
  } else {
    c.mu =
        parse_quantity_as(F("dynamic_viscosity"), need("dynamic_viscosity"), kDynamicViscosity, "a dynamic viscosity");
    positive("dynamic_viscosity", c.mu, false);
    c.nu = c.mu / c.rho;
  }
  c.U0 = parse_quantity_as(F("mean_inlet_velocity"), need("mean_inlet_velocity"), kVelocity, "a velocity");
  positive("mean_inlet_velocity", c.U0, true);  // 0: a closed end at x = 0 (Berman's own case)
  c.x = parse_quantity_as(F("axial_position"), need("axial_position"), kLength, "a length");
  positive("axial_position", c.x, true);
  if (!(mean_velocity_at_x(c).lower() > 0))
    throw input_error(F("axial_position") + ": '" + fields.at("axial_position") +
                      "' is at or past the point where the walls have drawn off all the inflow (rule: "
                      "mean_inlet_velocity - wall_velocity * axial_position / half_width > 0, docs/units.md (U3))");
  return c;
}

Id reynolds(const Channel& c) { return c.V * c.h / c.nu; }

Id mean_velocity_at_x(const Channel& c) { return c.U0 - c.V * c.x / c.h; }

Id axial_velocity(const Channel& c, const Id& fprime_eta) { return mean_velocity_at_x(c) * fprime_eta; }
Id normal_velocity(const Channel& c, const Id& f_eta) { return c.V * f_eta; }

std::vector<DimResult> dimensional_results(const Channel& c, const Id& fp0, const Id& fpp1, const Id& K) {
  const Id U = mean_velocity_at_x(c);
  std::vector<DimResult> r;
  r.push_back({"mean_velocity", "mean axial velocity at x", "U(x)", "m/s", "(U3)", U});
  r.push_back({"centreline_velocity", "centre-line velocity", "u(x,0)", "m/s", "(U4)", U * fp0});
  r.push_back({"wall_shear_stress", "wall shear stress (fluid on wall, downstream positive)", "tau_w", "Pa", "(U6)",
               Id(0) - c.mu * U * fpp1 / c.h});
  r.push_back({"pressure_gradient", "axial pressure gradient", "dp/dx", "Pa/m", "(U7)", c.mu * U * K / (c.h * c.h)});
  r.push_back({"wall_velocity", "wall-normal velocity at the wall", "v(x,h)", "m/s", "(U5)", c.V});
  return r;
}

}  // namespace porecert::model
