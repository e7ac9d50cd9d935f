#include "model/model_spec.hpp"

#include <algorithm>
#include <cmath>

#include "model/case_file.hpp"

namespace porecert::model {

const std::vector<std::string>& model_names() {
  static const std::vector<std::string> n = {"berman", "full-channel", "moving-walls", "mhd", "slip", "pipe"};
  return n;
}

std::vector<std::string> parameters_of(const std::string& name) {
  if (name == "full-channel") return {"wall-ratio"};
  if (name == "moving-walls") return {"expansion", "slip"};
  if (name == "mhd") return {"hartmann", "slip"};
  if (name == "pipe") return {};
  return {"slip"};  // berman, slip
}

namespace {
struct Range {
  double lo, hi;
  const char* text;
};
Range range_of(const std::string& p) {
  if (p == "wall-ratio") return {-10, 10, "-10 <= a <= 10"};
  if (p == "hartmann") return {0, 100, "0 <= M <= 100"};
  if (p == "expansion") return {-100, 100, "-100 <= alpha <= 100"};
  return {0, 100, "0 <= beta <= 100"};  // slip
}
std::string joined(const std::vector<std::string>& v) {
  std::string s;
  for (const auto& x : v) s += (s.empty() ? "" : ", ") + x;
  return s;
}
}  // namespace

ModelSpec checked(ModelSpec spec) {
  const auto& names = model_names();
  if (std::find(names.begin(), names.end(), spec.name) == names.end())
    throw input_error("--model: '" + spec.name + "' is not a model (rule: one of " + joined(names) + ")");
  const auto allowed = parameters_of(spec.name);
  for (const auto& [k, v] : spec.params) {
    if (std::find(allowed.begin(), allowed.end(), k) == allowed.end())
      throw input_error("--" + k + ": not a parameter of --model " + spec.name + " (rule: it takes " +
                        (allowed.empty() ? std::string("none") : joined(allowed)) + ")");
    arith::Id x;
    try {
      x = arith::from_decimal<arith::Id>(v);
    } catch (const std::invalid_argument& e) {
      throw input_error("--" + k + ": " + e.what());
    }
    const Range r = range_of(k);
    if (!(x.lower() >= r.lo && x.upper() <= r.hi))
      throw input_error("--" + k + ": '" + v + "' is out of range (rule: " + r.text + ")");
  }
  if (allowed.empty()) return spec;  // pipe: no parameters besides R
  const std::string first = allowed.front();
  if (spec.name == "full-channel" && !spec.has("wall-ratio")) spec.set("wall-ratio", "1");
  if (spec.name != "berman" && !spec.has(first))
    throw input_error("--" + first + ": missing (rule: --model " + spec.name + " needs --" + first + ")");
  return spec;
}

std::string describe(const ModelSpec& spec) {
  std::string s = spec.name == "full-channel"   ? "full channel"
                  : spec.name == "moving-walls" ? "half channel, moving walls"
                  : spec.name == "mhd"          ? "half channel, MHD"
                  : spec.name == "slip"         ? "half channel, slip wall"
                  : spec.name == "pipe"         ? "porous pipe"
                                                : "Berman half-channel";
  for (const auto& [k, v] : spec.params) {
    const char* sym = k == "wall-ratio" ? "a" : k == "expansion" ? "alpha" : k == "hartmann" ? "M" : "beta";
    s += std::string(", ") + sym + " = " + v;
  }
  return s;
}

std::vector<std::string> boundary_conditions(const ModelSpec& spec) {
  if (spec.name == "full-channel")
    return {"f(-1) = -a", "f'(-1) = 0", "f(1) = 1", "f'(1) = 0",
            "as solved on x = (eta + 1)/2: g(0) = -a, g'(0) = 0, g(1) = 1, g'(1) = 0"};
  if (spec.name == "pipe")
    return {"F(0) = 0", "F'' bounded at xi = 0 (regularity)", "F(1) = 1", "F'(1) = 0", "xi = r^2/a^2"};
  if (spec.has("slip")) return {"f(0) = 0", "f''(0) = 0", "f(1) = 1", "f'(1) + beta f''(1) = 0"};
  return {"f(0) = 0", "f''(0) = 0", "f(1) = 1", "f'(1) = 0"};
}

std::string free_constant_text(const ModelSpec& spec) {
  return spec.name == "full-channel" ? "g''(0)" : spec.name == "pipe" ? "F'(0)" : "f'(0)";
}

std::string model_id_of(const ModelSpec& spec) {
  return spec.is_taylor() ? build_taylor_model<double>(spec, 0.0).id : build_model<double>(spec, 0.0).id;
}
std::string equation_of(const ModelSpec& spec) {
  return spec.is_taylor() ? build_taylor_model<double>(spec, 0.0).equation_text
                          : build_model<double>(spec, 0.0).equation_text;
}
std::vector<ValueKey> value_keys_of(const ModelSpec& spec) {
  return spec.is_taylor() ? build_taylor_model<double>(spec, 0.0).values : build_model<double>(spec, 0.0).values;
}

}  // namespace porecert::model
