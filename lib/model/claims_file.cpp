#include "model/claims_file.hpp"

#include <toml++/toml.h>

#include <algorithm>
#include <filesystem>
#include <fstream>
#include <map>
#include <set>
#include <sstream>

#include "arith/fp_env.hpp"
#include "arith/interval.hpp"

namespace porecert::model {

namespace {

std::string trim(std::string s) {
  while (!s.empty() && std::isspace(static_cast<unsigned char>(s.front()))) s.erase(s.begin());
  while (!s.empty() && std::isspace(static_cast<unsigned char>(s.back()))) s.pop_back();
  return s;
}

// A decimal string (or an integer), checked as a finite number.
std::string decimal(const toml::node& n, const std::string& field) {
  std::string t;
  if (n.is_string()) {
    t = *n.value<std::string>();
  } else if (n.is_integer()) {
    t = std::to_string(*n.value<std::int64_t>());
  } else if (n.is_floating_point()) {
    throw input_error(field + ": the TOML float " + std::to_string(*n.value<double>()) +
                      " would be rounded to binary; write it as a string, e.g. \"1e-6\", so it is read exactly");
  } else {
    throw input_error(field + ": must be a decimal string");
  }
  try {
    arith::from_decimal<arith::Id>(t);
  } catch (const std::invalid_argument&) {
    throw input_error(field + ": '" + t + "' is not a finite decimal number");
  }
  return t;
}

void only_keys(const toml::table& t, const std::string& where, const std::set<std::string>& allowed) {
  for (auto&& [k, v] : t) {
    (void)v;
    if (!allowed.count(std::string(k.str()))) {
      std::string list;
      for (const auto& a : allowed) list += (list.empty() ? "" : ", ") + a;
      throw input_error(where + ": unknown key '" + std::string(k.str()) + "' (allowed: " + list + ")");
    }
  }
}

// A key of the wrong type is refused, never ignored in silence (toml++'s value<T>() would skip it, or
// convert 64.0 or true to an integer).
std::optional<std::string> string_key(const toml::table& t, const std::string& field, const char* key) {
  const toml::node* n = t.get(key);
  if (!n) return std::nullopt;
  if (!n->is_string()) throw input_error(field + " " + key + ": must be a string");
  return *n->value<std::string>();
}
std::optional<std::int64_t> integer_key(const toml::table& t, const std::string& field, const char* key) {
  const toml::node* n = t.get(key);
  if (!n) return std::nullopt;
  if (!n->is_integer()) throw input_error(field + " " + key + ": must be an integer");
  return *n->value<std::int64_t>();
}

// "[a, b)" and friends.
void parse_interval(const std::string& text, const std::string& field, Claim& c) {
  const std::string t = trim(text);
  const auto comma = t.find(',');
  if (t.size() < 5 || (t.front() != '[' && t.front() != '(') || (t.back() != ']' && t.back() != ')') ||
      comma == std::string::npos)
    throw input_error(field + ": '" + text + "' is not an interval (rule: like \"[0, 1)\" or \"[0.2, 0.8]\")");
  c.a_closed = t.front() == '[';
  c.b_closed = t.back() == ']';
  c.a = trim(t.substr(1, comma - 1));
  c.b = trim(t.substr(comma + 1, t.size() - comma - 2));
  arith::Id a, b;
  try {
    a = arith::from_decimal<arith::Id>(c.a);
    b = arith::from_decimal<arith::Id>(c.b);
  } catch (const std::invalid_argument&) {
    throw input_error(field + ": '" + text + "' has an end that is not a finite decimal number");
  }
  if (!(0 <= a.lower() && a.upper() < b.lower() && b.upper() <= 1))
    throw input_error(field + ": '" + text + "' (rule: 0 <= a < b <= 1)");
}

// field names the property key in messages, claim the [[claim]] table (for its key 'on').
void parse_sign(const std::string& text, const std::string& field, const std::string& claim, Claim& c,
                const toml::table& t) {
  std::string s = trim(text), on;
  if (const auto p = s.find(" on "); p != std::string::npos) {
    on = s.substr(p + 4);
    s = trim(s.substr(0, p));
  }
  if (auto o = string_key(t, claim, "on")) {
    if (!on.empty()) throw input_error(field + ": the interval is given twice (in property and in 'on')");
    on = *o;
  }
  std::size_t i = 0;
  if (s.empty() || s[0] != 'f') throw input_error(field + ": '" + text + "' (rule: like \"f' > 0 on [0, 1)\")");
  ++i;
  while (i < s.size() && s[i] == '\'') ++i;
  c.order = static_cast<int>(i) - 1;
  const std::string rest = trim(s.substr(i));
  if (c.order > 3) throw input_error(field + ": '" + text + "' (rule: f, f', f'' or f''')");
  if (rest == "> 0") {
    c.positive = true;
  } else if (rest == "< 0") {
    c.positive = false;
  } else {
    throw input_error(field + ": '" + text +
                      "' (rule: \"f^(k) > 0\" or \"f^(k) < 0\", then optionally \" on [a, b)\")");
  }
  if (on.empty()) on = "[0, 1]";
  parse_interval(on, field, c);
  c.text = s + " on " + trim(on);
}

}  // namespace

ClaimsFile read_claims_file(const std::string& path) {
  std::ifstream in(path, std::ios::binary);
  if (!in) throw input_error("claims file '" + path + "': cannot be read");
  std::stringstream ss;
  ss << in.rdbuf();
  return read_claims_text(ss.str(), path);
}

ClaimsFile read_claims_text(std::string_view text, const std::string& path) {
  const arith::FpEnvScope fp_env;  // caller's rounding mode and flags restored on exit (arith/fp_env.hpp)
  toml::table t;
  try {
    t = toml::parse(text, path);
  } catch (const toml::parse_error& e) {
    std::string where = e.source().begin ? " at line " + std::to_string(e.source().begin.line) : "";
    throw input_error("claims file '" + path + "'" + where + ": " + std::string(e.description()));
  }
  ClaimsFile f;
  f.path = path;
  const std::string where = "claims file '" + path + "'";
  only_keys(t, where, {"problem", "model", "candidate", "claim"});
  if (const toml::node* mn = t.get("model")) {
    // [model]: name and parameters as in case files (docs/models.md §0); messages name the key.
    const toml::table* mt = mn->as_table();
    if (!mt) throw input_error(where + ": 'model' must be a table [model]");
    only_keys(*mt, "[model]", {"name", "wall-ratio", "expansion", "hartmann", "slip"});
    ModelSpec spec;
    if (const auto n = string_key(*mt, "[model]", "name"))
      spec.name = *n;
    else
      throw input_error(
          "[model] name: missing (rule: name = one of berman, full-channel, moving-walls, mhd, slip, pipe)");
    for (auto&& [k, v] : *mt)
      if (k.str() != "name") spec.set(std::string(k.str()), decimal(v, "[model] " + std::string(k.str())));
    try {
      f.model = checked(spec);
    } catch (const input_error& e) {
      std::string m = e.what();  // "--model: ..." / "--hartmann: ..." in the claims file's words
      if (m.rfind("--model", 0) == 0)
        m = "[model] name" + m.substr(7);
      else if (m.rfind("--", 0) == 0)
        m = "[model] " + m.substr(2);
      throw input_error(m);
    }
  }
  std::vector<std::string> value_keys;
  for (const auto& vk : value_keys_of(f.model)) value_keys.push_back(vk.key);
  const toml::table* prob = t["problem"].as_table();
  if (!prob) throw input_error(where + ": table [problem] is missing (rule: [problem] with R)");
  only_keys(*prob, "[problem]", {"R", "title"});
  const toml::node* R = (*prob)["R"].node();
  if (!R) throw input_error("[problem] R: missing (rule: R = \"10\" or R = [\"9.9\", \"10.1\"])");
  if (const toml::array* arr = R->as_array()) {
    if (arr->size() != 2) throw input_error("[problem] R: an interval must have two entries [LO, HI]");
    f.R_lo = decimal(*arr->get(0), "[problem] R");
    f.R_hi = decimal(*arr->get(1), "[problem] R");
  } else {
    f.R_lo = f.R_hi = decimal(*R, "[problem] R");
  }
  check_R("[problem] R", f.R_lo, f.R_hi);

  const toml::table* cand = t["candidate"].as_table();
  if (!cand) throw input_error(where + ": table [candidate] is missing (rule: csv, chebyshev, start or branch)");
  only_keys(*cand, "[candidate]", {"csv", "chebyshev", "start", "branch", "modes", "precision_bits"});
  const auto dir = std::filesystem::path(path).parent_path();
  auto rel = [&](const std::string& p) { return std::filesystem::path(p).is_absolute() ? p : (dir / p).string(); };
  int sources = 0;
  if (auto s = string_key(*cand, "[candidate]", "csv")) f.csv = rel(*s), ++sources;
  if (auto s = string_key(*cand, "[candidate]", "chebyshev")) f.chebyshev = rel(*s), ++sources;
  if (auto s = string_key(*cand, "[candidate]", "branch")) {
    if (*s != "I") throw input_error("[candidate] branch: '" + *s + "' (rule: \"I\"; other branches via start)");
    f.branch = *s;
    ++sources;
  }
  if (const toml::node* sn = cand->get("start")) {
    const toml::array* st = sn->as_array();
    if (!st || st->size() != 2) throw input_error("[candidate] start: must be [f'(0), f'''(0)], two decimal strings");
    f.start =
        std::make_pair(decimal(*st->get(0), "[candidate] start[0]"), decimal(*st->get(1), "[candidate] start[1]"));
    ++sources;
  }
  if (sources != 1)
    throw input_error("[candidate]: " + std::to_string(sources) +
                      " candidate sources given (rule: exactly one of csv, chebyshev, start, branch)");
  if (!f.model.is_berman() && (f.csv || f.chebyshev))
    throw input_error(std::string("[candidate] ") + (f.csv ? "csv" : "chebyshev") + ": with [model] name = \"" +
                      f.model.name +
                      "\" (rule: submitted samples and series are read as Berman's f; with another model use "
                      "branch = \"I\" or start)");
  if (f.model.is_taylor() && f.start)
    throw input_error(
        "[candidate] start: with [model] name = \"pipe\" (rule: the porous pipe is certified on the "
        "branch continued from R = 0; use branch = \"I\")");
  if (auto m = integer_key(*cand, "[candidate]", "modes")) {
    if (*m != 0 && (*m < 8 || *m > 4000))
      throw input_error("[candidate] modes: " + std::to_string(*m) + " is outside 8..4000");
    f.modes = static_cast<int>(*m);
  }
  if (auto p = integer_key(*cand, "[candidate]", "precision_bits")) {
    if (*p != 0 && (*p < 53 || *p > 4096))
      throw input_error("[candidate] precision_bits: " + std::to_string(*p) + " is outside 53..4096");
    f.precision_bits = static_cast<int>(*p);
  }

  if (const toml::node* cl = t["claim"].node()) {
    const toml::array* arr = cl->as_array();
    if (!arr) throw input_error(where + ": 'claim' must be an array of tables [[claim]]");
    int idx = 0;
    for (const toml::node& n : *arr) {
      ++idx;
      const std::string field = "[[claim]] #" + std::to_string(idx);
      const toml::table* c = n.as_table();
      if (!c) throw input_error(field + ": must be a table");
      only_keys(*c, field,
                {"quantity", "value", "tolerance", "relative_tolerance", "below", "above", "property", "on", "radius",
                 "about", "exactly", "at_least", "note"});
      Claim k;
      k.index = idx;
      if (c->contains("quantity") && c->contains("property"))
        throw input_error(field + ": give quantity or property, not both");
      if (auto q = string_key(*c, field, "quantity")) {
        k.quantity = *q;
        if (std::find(value_keys.begin(), value_keys.end(), k.quantity) == value_keys.end()) {
          std::string list;
          for (const auto& vk : value_keys) list += (list.empty() ? "" : ", ") + vk;
          throw input_error(field + " quantity: '" + k.quantity + "' is not a value key of model " + f.model.name +
                            " (rule: " + list + ")");
        }
        const bool has_value = c->contains("value"), has_below = c->contains("below"), has_above = c->contains("above");
        if (has_value + has_below + has_above != 1)
          throw input_error(field + ": give exactly one of value, below, above with quantity '" + k.quantity + "'");
        if (has_value) {
          k.kind = Claim::Kind::value;
          k.value = decimal(*(*c)["value"].node(), field + " value");
          if (c->contains("tolerance") && c->contains("relative_tolerance"))
            throw input_error(field + ": give tolerance or relative_tolerance, not both");
          if (c->contains("tolerance")) k.tolerance = decimal(*(*c)["tolerance"].node(), field + " tolerance");
          if (c->contains("relative_tolerance")) {
            k.tolerance = decimal(*(*c)["relative_tolerance"].node(), field + " relative_tolerance");
            k.relative = true;
          }
          if (arith::from_decimal<arith::Id>(k.tolerance).lower() < 0)
            throw input_error(field + " tolerance: '" + k.tolerance + "' is negative (rule: >= 0)");
          k.text = k.quantity + " = " + k.value + " +/- " + k.tolerance + (k.relative ? " (relative)" : "");
        } else {
          k.kind = Claim::Kind::bound;
          k.below = has_below;
          k.bound = decimal(*(*c)[has_below ? "below" : "above"].node(), field + (has_below ? " below" : " above"));
          k.text = k.quantity + (k.below ? " < " : " > ") + k.bound;
        }
      } else if (auto p = string_key(*c, field, "property")) {
        const std::string prop = trim(*p);
        if (prop == "unique") {
          k.kind = Claim::Kind::unique;
          if (!c->contains("radius")) throw input_error(field + ": property 'unique' needs radius = \"r\"");
          k.radius = decimal(*(*c)["radius"].node(), field + " radius");
          if (arith::from_decimal<arith::Id>(k.radius).lower() <= 0)
            throw input_error(field + " radius: '" + k.radius + "' (rule: > 0)");
          const std::string about = string_key(*c, field, "about").value_or("solution");
          if (about != "solution" && about != "candidate")
            throw input_error(field + " about: '" + about + "' (rule: \"solution\" or \"candidate\")");
          k.about_candidate = about == "candidate";
          k.text = "unique in the ball of radius " + k.radius + " about the " + about;
        } else if (prop == "solutions found") {
          k.kind = Claim::Kind::solutions;
          const bool ex = c->contains("exactly"), al = c->contains("at_least");
          if (ex == al) throw input_error(field + ": property 'solutions found' needs exactly = N or at_least = N");
          const auto v = integer_key(*c, field, ex ? "exactly" : "at_least");
          if (!v || *v < 0 || *v > 100)
            throw input_error(field + std::string(ex ? " exactly" : " at_least") + ": must be an integer in 0..100");
          k.count = static_cast<int>(*v);
          k.exactly = ex;
          k.text = std::string(ex ? "exactly " : "at least ") + std::to_string(k.count) + " solutions found";
        } else {
          k.kind = Claim::Kind::sign;
          if (!f.model.half_channel())
            throw input_error(field + " property: '" + prop + "' with [model] name = \"" + f.model.name +
                              "\" (rule: sign claims are about f on the half channel [0, 1]; for this model use "
                              "value, bound, unique or solutions-found claims)");
          parse_sign(prop, field + " property", field, k, *c);
        }
      } else {
        throw input_error(field + ": needs 'quantity' (a value key) or 'property'");
      }
      // A key of another kind of claim (a radius on a value claim, an interval on a bound) would be
      // ignored in silence: refused.
      static const std::map<Claim::Kind, std::pair<const char*, std::set<std::string>>> uses{
          {Claim::Kind::value, {"value", {"quantity", "value", "tolerance", "relative_tolerance", "note"}}},
          {Claim::Kind::bound, {"bound", {"quantity", "below", "above", "note"}}},
          {Claim::Kind::sign, {"sign", {"property", "on", "note"}}},
          {Claim::Kind::unique, {"unique", {"property", "radius", "about", "note"}}},
          {Claim::Kind::solutions, {"solutions found", {"property", "exactly", "at_least", "note"}}}};
      const auto& [kind_name, keys] = uses.at(k.kind);
      for (auto&& [key, v] : *c) {
        (void)v;
        if (!keys.count(std::string(key.str()))) {
          std::string list;
          for (const auto& a : keys) list += (list.empty() ? "" : ", ") + a;
          throw input_error(field + ": key '" + std::string(key.str()) + "' does not belong to a " + kind_name +
                            " claim (keys of that kind: " + list + ")");
        }
      }
      f.claims.push_back(k);
    }
  }
  if (f.claims.empty()) throw input_error(where + ": no [[claim]] tables (rule: at least one claim)");
  return f;
}

}  // namespace porecert::model
