// Dimensional results (lib/model/dimensional, docs/units.md (U1)-(U7)). Outside sources: plane
// Poiseuille flow between plates 2h apart with mean velocity U has centre-line velocity 3U/2, wall
// shear 3 mu U / h and dp/dx = -3 mu U / h^2 (e.g. White, Viscous Fluid Flow, 3rd ed., §3-3.2;
// from memory), i.e. f = (3 eta - eta^3)/2, f'(0) = 3/2, f''(1) = -3, K = -3 at R = 0; and the mass
// balance U(x) = U0 - V x / h (fluid drawn off through both walls).
#include <doctest/doctest.h>

#include "model/case_file.hpp"
#include "model/dimensional.hpp"

using namespace porecert;
using arith::Id;

namespace {
bool encloses(const Id& x, const char* d) {
  const Id t = arith::from_decimal<Id>(d);
  return x.lower() <= t.lower() && t.upper() <= x.upper();
}
std::map<std::string, std::string> base() {
  return {{"half_width", "1 mm"},     {"wall_velocity", "0 m/s"},         {"kinematic_viscosity", "1e-6 m^2/s"},
          {"density", "1000 kg/m^3"}, {"mean_inlet_velocity", "0.1 m/s"}, {"axial_position", "0 m"}};
}
const model::DimResult& get(const std::vector<model::DimResult>& r, const std::string& k) {
  for (const auto& x : r)
    if (x.key == k) return x;
  FAIL("missing " << k);
  return r.front();
}
}  // namespace

TEST_CASE("R = 0: plane Poiseuille wall shear, pressure gradient and centre-line velocity") {
  const auto c = model::read_channel(base());
  CHECK(encloses(model::reynolds(c), "0"));
  const auto r = model::dimensional_results(c, Id(1.5), Id(-3), Id(-3));
  CHECK(encloses(get(r, "centreline_velocity").value, "0.15"));  // 3U/2
  CHECK(encloses(get(r, "wall_shear_stress").value, "0.3"));     // 3 mu U / h = 3e-3 * 0.1 / 1e-3
  CHECK(encloses(get(r, "pressure_gradient").value, "-300"));    // -3 mu U / h^2
  CHECK(arith::width_up(get(r, "pressure_gradient").value) < 1e-10);
}

TEST_CASE("R = V h / nu, the dynamic-viscosity route and the mass balance") {
  auto f = base();
  f["wall_velocity"] = "15 um/s";
  f["half_width"] = "0.5 mm";
  const auto c = model::read_channel(f);
  CHECK(encloses(model::reynolds(c), "0.0075"));
  f.erase("kinematic_viscosity");
  f["dynamic_viscosity"] = "1 mPa s";  // nu = mu / rho = 1e-6 m^2/s
  const auto d = model::read_channel(f);
  CHECK(encloses(model::reynolds(d), "0.0075"));
  f["axial_position"] = "2 m";  // U(x) = 0.1 - 15e-6 * 2 / 5e-4 = 0.04 m/s
  CHECK(encloses(model::mean_velocity_at_x(model::read_channel(f)), "0.04"));
  f["axial_position"] = "4 m";  // past the point where all inflow has been drawn off (3.33 m)
  CHECK_THROWS_AS(model::read_channel(f), model::input_error);
}

TEST_CASE("bad [channel] data: input errors naming the field") {
  auto expect = [](std::map<std::string, std::string> f, const std::string& needle) {
    try {
      model::read_channel(f);
      FAIL("accepted");
    } catch (const model::input_error& e) {
      CHECK(std::string(e.what()).find(needle) != std::string::npos);
    }
  };
  auto f = base();
  f["dynamic_viscosity"] = "1 mPa s";
  expect(f, "exactly one");
  f = base();
  f.erase("density");
  expect(f, "channel.density");
  f = base();
  f["half_width"] = "-1 mm";
  expect(f, "channel.half_width");
  f = base();
  f["half_width"] = "1 mm/s";
  expect(f, "must be a length");
  f = base();
  f["colour"] = "blue";
  expect(f, "channel.colour");
}
