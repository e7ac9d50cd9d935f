#include "model/case_file.hpp"

#include <toml++/toml.h>

#include "arith/interval.hpp"
#include "model/dimensional.hpp"

namespace porecert::model {

namespace {
constexpr double kRmax = 1e5;

std::string number_text(const toml::node& n, const std::string& field) {
  if (auto s = n.value<std::string>(); s && n.is_string()) return *s;
  if (n.is_integer()) return std::to_string(*n.value<std::int64_t>());
  if (n.is_floating_point())
    throw input_error(field + ": the TOML float " + std::to_string(*n.value<double>()) +
                      " would be rounded to binary; write decimals as strings, e.g. " +
                      field.substr(field.rfind('.') + 1) + " = \"12.5\", so they are read exactly");
  throw input_error(field + ": must be a decimal string or an integer");
}
}  // namespace

void check_R(const std::string& field, const std::string& lo, const std::string& hi) {
  arith::Id a, b;
  try {
    a = arith::from_decimal<arith::Id>(lo);
    b = arith::from_decimal<arith::Id>(hi);
  } catch (const std::invalid_argument& e) {
    throw input_error(field + ": " + e.what());
  }
  if (!(a.lower() <= b.upper()))
    throw input_error(field + ": '" + lo + ":" + hi + "' has lower end above upper end (rule: LO <= HI)");
  if (a.lower() < -kRmax || b.upper() > kRmax)
    throw input_error(field + ": '" + (lo == hi ? lo : lo + ":" + hi) +
                      "' is outside the supported range -1e5 <= R <= 1e5");
}

std::pair<std::string, std::string> parse_R(const std::string& field, const std::string& text) {
  const auto colon = text.find(':');
  std::string lo = text, hi = text;
  if (colon != std::string::npos) {
    lo = text.substr(0, colon);
    hi = text.substr(colon + 1);
  }
  check_R(field, lo, hi);
  return {lo, hi};
}

CaseSettings read_case_file(const std::string& path) {
  toml::table t;
  try {
    t = toml::parse_file(path);
  } catch (const toml::parse_error& e) {
    std::string where = e.source().begin ? " at line " + std::to_string(e.source().begin.line) : "";
    throw input_error("case file '" + path + "'" + where + ": " + std::string(e.description()));
  }
  CaseSettings c;
  for (auto&& [k, v] : t) {
    const std::string key(k.str());
    if (key != "case" && key != "flow" && key != "certify" && key != "model" && key != "channel")
      throw input_error("case file '" + path + "': unknown table [" + key +
                        "] (allowed: [case], [flow], [channel], [certify], [model])");
  }
  if (const toml::table* mt = t["model"].as_table()) {
    for (auto&& [k, v] : *mt) {
      const std::string key(k.str());
      if (key == "name") {
        if (!v.is_string()) throw input_error("model.name: must be a string, e.g. name = \"full-channel\"");
        c.model_name = *v.value<std::string>();
      } else if (key == "wall-ratio" || key == "expansion" || key == "hartmann" || key == "slip") {
        c.model_params.emplace_back(key, number_text(v, "model." + key));
      } else {
        throw input_error("case file '" + path + "': unknown key model." + key +
                          " (allowed: name, wall-ratio, expansion, hartmann, slip)");
      }
    }
  }
  if (auto s = t["case"]["title"].value<std::string>()) c.title = *s;
  if (auto s = t["case"]["description"].value<std::string>()) c.description = *s;
  if (const toml::node* r = t["flow"]["reynolds"].node()) {
    if (const toml::array* arr = r->as_array()) {
      if (arr->size() != 2) throw input_error("flow.reynolds: a range must have two entries [LO, HI]");
      c.R = {number_text(*arr->get(0), "flow.reynolds"), number_text(*arr->get(1), "flow.reynolds")};
    } else {
      const std::string s = number_text(*r, "flow.reynolds");
      c.R = {s, s};
    }
    check_R("flow.reynolds", c.R->first, c.R->second);
  }
  if (const toml::table* ch = t["channel"].as_table()) {
    for (auto&& [k, v] : *ch) {
      const std::string field = "channel." + std::string(k.str());
      if (!v.is_string())
        throw input_error(field +
                          ": must be a string with a unit, e.g. \"1.5 mm\" (numbers without units are refused)");
      c.channel[std::string(k.str())] = *v.value<std::string>();
    }
    if (c.R)
      throw input_error("flow.reynolds: given together with [channel], which determines R = V h / nu (rule: give one)");
    const Channel chan = read_channel(c.channel);
    const arith::Id R = reynolds(chan);
    c.R = {arith::decimal_lower(R, 17), arith::decimal_upper(R, 17)};
    check_R("channel (R = wall_velocity * half_width / kinematic_viscosity)", c.R->first, c.R->second);
  }
  if (auto s = t["certify"]["branch"].value<std::string>()) c.branch = *s;
  if (auto n = t["certify"]["modes"].value<std::int64_t>()) c.modes = static_cast<int>(*n);
  if (auto n = t["certify"]["precision_bits"].value<std::int64_t>()) c.precision_bits = static_cast<int>(*n);
  if (auto s = t["certify"]["certificate"].value<std::string>()) c.certificate = *s;
  if (const toml::array* a = t["certify"]["start"].as_array()) {
    if (a->size() != 2) throw input_error("certify.start: must be [f'(0), f'''(0)]");
    auto num = [&](std::size_t i) {
      const toml::node& n = *a->get(i);
      if (auto d = n.value<double>()) return *d;  // a guess only: not on the proof path
      throw input_error("certify.start: entries must be numbers");
    };
    c.start = std::make_pair(num(0), num(1));
  }
  return c;
}

}  // namespace porecert::model
