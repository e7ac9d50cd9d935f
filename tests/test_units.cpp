// Unit parser (lib/model/units): exact reading, conversion factors by definition of the units
// (SI brochure, 9th ed., BIPM 2019: prefixes, litre, minute, hour; poise and stokes as CGS units),
// rejection of unknown units with the field and the text named.
#include <doctest/doctest.h>

#include "model/case_file.hpp"
#include "model/units.hpp"

using namespace porecert;
using arith::Id;

namespace {
// A double interval that encloses the exact decimal d contains its tightest enclosure.
bool encloses(const Id& x, const char* d) {
  const Id t = arith::from_decimal<Id>(d);
  return x.lower() <= t.lower() && t.upper() <= x.upper();
}
bool thin(const Id& x) { return arith::width_up(x) <= 1e-14 * arith::mag_up(x); }
}  // namespace

TEST_CASE("quantities convert to SI by the definitions of the units, as enclosures") {
  struct C {
    const char* text;
    const char* si;
    model::Dim dim;
  } cases[] = {
      {"1.5 mm", "0.0015", model::kLength},
      {"25 um", "25e-6", model::kLength},
      {"25 \xC2\xB5m", "25e-6", model::kLength},  // micro sign
      {"20 um/s", "2e-5", model::kVelocity},
      {"1.0e-6 m^2/s", "1e-6", model::kKinematicViscosity},
      {"1 cSt", "1e-6", model::kKinematicViscosity},  // 1 St = 1 cm^2/s
      {"28 mPa s", "0.028", model::kDynamicViscosity},
      {"28 mPa*s", "0.028", model::kDynamicViscosity},
      {"28 mPa.s", "0.028", model::kDynamicViscosity},
      {"1 cP", "1e-3", model::kDynamicViscosity},  // 1 P = 0.1 Pa s
      {"998 kg/m^3", "998", model::kDensity},
      {"54 L/m^2/h", "1.5e-5", model::kVelocity},  // 54 L/(m^2 h): permeate flux
      {"3 min", "180", {0, 0, 1}},
      {"2 N/m^2", "2", model::kPressure},
      {"-0.2 m/s", "-0.2", model::kVelocity},
      {"5 kPa/m", "5000", model::kPressureGradient},
      {"1 s^-1", "1", {0, 0, -1}},
  };
  for (const auto& c : cases) {
    CAPTURE(c.text);
    const auto q = model::parse_quantity("channel.x", c.text);
    CHECK(q.dim == c.dim);
    CHECK(encloses(q.si, c.si));
    CHECK(thin(q.si));
  }
}

TEST_CASE("whole symbols win over prefix + symbol") {
  CHECK(model::parse_quantity("f", "1 min").dim == model::Dim{0, 0, 1});  // minute, not milli-inch
  CHECK(encloses(model::parse_quantity("f", "1 mm").si, "0.001"));
  CHECK(encloses(model::parse_quantity("f", "1 Pa").si, "1"));  // pascal, not peta-annum
  CHECK(encloses(model::parse_quantity("f", "1 ms").si, "0.001"));
}

TEST_CASE("bad quantities are input errors naming the field, the text and the rule") {
  for (const char* bad :
       {"1.5 furlong", "1.5", "mm", "1.5 mm^", "1.5 m^10", "1.5 mm//s", "1.5 mm/", "nan m", "1.5 kmin", "1,5 mm", ""}) {
    CAPTURE(bad);
    try {
      model::parse_quantity("channel.half_width", bad);
      FAIL("accepted");
    } catch (const model::input_error& e) {
      const std::string m = e.what();
      CHECK(m.find("channel.half_width") != std::string::npos);
      CHECK(m.find(std::string("'") + bad + "'") != std::string::npos);
      CHECK(m.find("rule") != std::string::npos);
    }
  }
  try {
    model::parse_quantity_as("channel.half_width", "1.5 m/s", model::kLength, "a length");
    FAIL("accepted");
  } catch (const model::input_error& e) {
    CHECK(std::string(e.what()).find("must be a length") != std::string::npos);
  }
}
