#include "model/case_file.hpp"

#include <toml++/toml.h>

#include <cmath>
#include <fstream>
#include <initializer_list>
#include <sstream>

#include "arith/fp_env.hpp"
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
  const arith::FpEnvScope fp_env;  // caller's rounding mode and flags restored on exit (arith/fp_env.hpp)
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

namespace {
// Every key of a table must be known: a misspelt key would otherwise be ignored in silence.
void only_keys(const toml::table& t, const std::string& table, std::initializer_list<const char*> allowed) {
  for (auto&& [k, v] : t) {
    const std::string key(k.str());
    bool ok = false;
    std::string list;
    for (const char* a : allowed) {
      ok = ok || key == a;
      list += (list.empty() ? "" : ", ") + std::string(a);
    }
    if (!ok) throw input_error(table + "." + key + ": unknown key (allowed in [" + table + "]: " + list + ")");
  }
}
const toml::table* sub_table(const toml::table& t, const char* name) {
  const toml::node* n = t.get(name);
  if (!n) return nullptr;
  if (!n->is_table()) throw input_error(std::string("[") + name + "]: must be a table");
  return n->as_table();
}
std::string string_of(const toml::table& t, const std::string& table, const char* key) {
  const toml::node* n = t.get(key);
  if (!n->is_string()) throw input_error(table + "." + key + ": must be a string");
  return *n->value<std::string>();
}
// An integer field in lo..hi, or 0 (automatic); checked before narrowing to int.
int int_of(const toml::table& t, const std::string& table, const char* key, std::int64_t lo, std::int64_t hi) {
  const toml::node* n = t.get(key);
  const std::string field = table + "." + key;
  if (!n->is_integer()) throw input_error(field + ": must be an integer");
  const std::int64_t v = *n->value<std::int64_t>();
  if (v != 0 && (v < lo || v > hi))
    throw input_error(field + ": " + std::to_string(v) + " is outside " + std::to_string(lo) + ".." +
                      std::to_string(hi) + " (0 = automatic)");
  return static_cast<int>(v);
}
}  // namespace

CaseSettings read_case_file(const std::string& path) {
  std::ifstream in(path, std::ios::binary);
  if (!in) throw input_error("case file '" + path + "': cannot be read");
  std::stringstream ss;
  ss << in.rdbuf();
  return read_case_text(ss.str(), path);
}

CaseSettings read_case_text(std::string_view text, const std::string& path) {
  const arith::FpEnvScope fp_env;  // caller's rounding mode and flags restored on exit (arith/fp_env.hpp)
  toml::table t;
  try {
    t = toml::parse(text, path);
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
  if (const toml::table* cs = sub_table(t, "case")) {
    only_keys(*cs, "case", {"title", "description"});
    if (cs->contains("title")) c.title = string_of(*cs, "case", "title");
    if (cs->contains("description")) c.description = string_of(*cs, "case", "description");
  }
  if (const toml::table* fl = sub_table(t, "flow")) {
    only_keys(*fl, "flow", {"reynolds"});
    if (const toml::node* r = fl->get("reynolds")) {
      if (const toml::array* arr = r->as_array()) {
        if (arr->size() != 2) throw input_error("flow.reynolds: a range must have two entries [LO, HI]");
        c.R = {number_text(*arr->get(0), "flow.reynolds"), number_text(*arr->get(1), "flow.reynolds")};
      } else {
        const std::string s = number_text(*r, "flow.reynolds");
        c.R = {s, s};
      }
      check_R("flow.reynolds", c.R->first, c.R->second);
    }
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
  if (const toml::table* ce = sub_table(t, "certify")) {
    only_keys(*ce, "certify", {"branch", "start", "modes", "precision_bits", "certificate"});
    if (ce->contains("branch")) c.branch = string_of(*ce, "certify", "branch");
    // The ranges of the command line (docs/cli.md).
    if (ce->contains("modes")) c.modes = int_of(*ce, "certify", "modes", 8, 4000);
    if (ce->contains("precision_bits")) c.precision_bits = int_of(*ce, "certify", "precision_bits", 53, 4096);
    if (ce->contains("certificate")) {
      c.certificate = string_of(*ce, "certify", "certificate");
      if (c.certificate->empty()) throw input_error("certify.certificate: must not be empty");
    }
    if (const toml::node* sn = ce->get("start")) {
      const toml::array* a = sn->as_array();
      if (!a || a->size() != 2) throw input_error("certify.start: must be [f'(0), f'''(0)], two numbers");
      auto num = [&](std::size_t i) {
        const toml::node& n = *a->get(i);
        if (n.is_number())
          if (auto d = n.value<double>(); d && std::isfinite(*d)) return *d;  // a guess only: not on the proof path
        throw input_error("certify.start: entries must be finite numbers");
      };
      c.start = std::make_pair(num(0), num(1));
    }
  }
  return c;
}

}  // namespace porecert::model
