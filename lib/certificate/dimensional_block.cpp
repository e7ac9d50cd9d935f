#include "certificate/dimensional_block.hpp"

#include "certificate/certificate.hpp"
#include "model/case_file.hpp"

namespace porecert::certificate {

using nlohmann::json;

json interval_json(const arith::Id& x, int digits) {
  return json::array({arith::decimal_lower(x, digits), arith::decimal_upper(x, digits)});
}

json dimensional_json(const model::Channel& c, const arith::Id& fp0, const arith::Id& fpp1, const arith::Id& K) {
  json j;
  j["inputs"] = c.given;
  j["derived"] = {{"R", interval_json(model::reynolds(c))},
                  {"kinematic_viscosity_m2_per_s", interval_json(c.nu)},
                  {"dynamic_viscosity_Pa_s", interval_json(c.mu)}};
  json res = json::object();
  for (const auto& r : model::dimensional_results(c, fp0, fpp1, K))
    res[r.key] = {{"label", r.label}, {"unit", r.unit}, {"value", interval_json(r.value)}, {"equation", r.equation}};
  j["results"] = res;
  j["similarity_form"] =
      "psi = (h U0 - V x) f(eta), eta = y/h; u = U(x) f'(eta), v = V f(eta), U(x) = U0 - V x/h (docs/units.md)";
  j["meaning"] =
      "every value is an interval [lo, hi] in SI units that holds for every solution the certificate covers; "
      "the inputs are read exactly from their text";
  return j;
}

model::Channel read_dimensional(const json& cert, const std::string& R_lo, const std::string& R_hi) {
  const json& d = cert.at("dimensional");
  if (!d.is_object() || !d.contains("inputs") || !d["inputs"].is_object())
    throw format_error(
        "certificate: key \"dimensional.inputs\" is missing or not an object (written by porecert "
        "verify from a case file's [channel] table)");
  std::map<std::string, std::string> f;
  for (auto it = d["inputs"].begin(); it != d["inputs"].end(); ++it) {
    if (!it.value().is_string())
      throw format_error("certificate: dimensional.inputs." + it.key() + " is " + it.value().dump() +
                         " (rule: a string with a unit)");
    f[it.key()] = it.value().get<std::string>();
  }
  model::Channel c;
  try {
    c = model::read_channel(f, "dimensional.inputs");
  } catch (const model::input_error& e) {
    throw format_error(std::string("certificate: ") + e.what());
  }
  const arith::Id R = model::reynolds(c);
  const arith::Id lo = arith::from_decimal<arith::Id>(R_lo), hi = arith::from_decimal<arith::Id>(R_hi);
  if (!(lo.upper() <= R.lower() && R.upper() <= hi.lower()))  // exact: both sides are doubles or enclosures
    throw format_error("certificate: dimensional.inputs give R in [" + arith::decimal_lower(R, 17) + ", " +
                       arith::decimal_upper(R, 17) + "], not inside the certified R = [" + R_lo + ", " + R_hi +
                       "] (rule: the inputs must lie in what was certified)");
  return c;
}

}  // namespace porecert::certificate
