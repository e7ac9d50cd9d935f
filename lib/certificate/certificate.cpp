#include "certificate/certificate.hpp"

#include <cstdio>
#include <filesystem>
#include <fstream>
#include <sstream>

#include "arith/fp_env.hpp"
#include "model/case_file.hpp"
#include "proof/taylor_certify.hpp"

namespace porecert::certificate {

using nlohmann::json;

namespace {
std::string up_str(double v) {
  if (std::isinf(v)) return "inf";
  return arith::decimal_upper(arith::Id(v), 17);
}
std::string down_str(double v) {
  if (std::isinf(v)) return "inf";
  return arith::decimal_lower(arith::Id(v), 17);
}
json pair(const proof::Enclosure& e) { return json::array({e.lo, e.hi}); }
const char* kValueKeys[4] = {"f'(0)", "f'''(0)", "f''(1)", "K"};
}  // namespace

// The reduced-ODE proof's own keys (docs/certificate.md, "reduced-ivp"): they replace the
// Newton-Kantorovich space, bounds and candidate.
void reduced_into(json& j, const proof::ReducedResult& r) {
  j["method"] = "reduced-ivp";
  j["space"] = {{"description",
                 "shape parameter s = f'''(0) / (R f'(0)^2) of solutions with sign(R f'(0)) = eps and eta = 1 the "
                 "nth zero of f' on (0,1] (docs/method.md (S3), (S10)); radii are distances in s from the candidate"},
                {"weights", {{"s", 1}}}};
  j["uniqueness"] = r.certified
                        ? "for every R in the interval, exactly one solution has eps and nth as stated and s in "
                          "[S_lo, S_hi]; it has s in [s_lo, s_hi] (not a global uniqueness claim)"
                        : "none";
  j["error_bounds_meaning"] =
      "half-width of the certified tube: |f^(k)(eta) - m_k(eta)| <= bound for every eta in [0,1], m_k the "
      "midpoint of the certified pointwise enclosure (when the bracket is split, that of the piece holding "
      "the solution's s; docs/method.md (S11))";
  const auto id_pair = [](const arith::Id& x) { return json::array({down_str(x.lower()), up_str(x.upper())}); };
  j["bounds"] = {{"R(s_lo)", id_pair(r.R_at_s_lo)},
                 {"R(s_hi)", id_pair(r.R_at_s_hi)},
                 {"dR/ds on S", id_pair(r.dR_ds)},
                 {"inequalities",
                  "R(s_lo) and R(s_hi) lie on opposite sides of every R in the interval (existence, intermediate value "
                  "theorem); 0 is not in dR/ds on S (uniqueness); every Taylor step validated (docs/method.md (S9))"}};
  json pf = json::array(), pfp = json::array();
  for (std::size_t i = 0; i < r.profile_f.size(); ++i) {
    pf.push_back(id_pair(r.profile_f[i]));
    pfp.push_back(id_pair(r.profile_fp[i]));
  }
  j["profile"] = {
      {"eta", "i / " + std::to_string(proof::kProfileSamples) + ", i = 0.." + std::to_string(proof::kProfileSamples)},
      {"f", pf},
      {"f'", pfp}};
  j["candidate"] = {{"kind", "reduced shape parameter"},
                    {"eps", r.eps},
                    {"nth_zero", r.nth},
                    {"s_lo", r.s_lo},
                    {"s_hi", r.s_hi},
                    {"S_lo", r.S_lo},
                    {"S_hi", r.S_hi},
                    {"arithmetic", r.precision_bits <= 53 ? "double intervals" : "MPFR intervals"},
                    {"precision_bits", r.precision_bits},
                    {"taylor_order", r.order},
                    {"taylor_steps", r.steps}};
}

// The Taylor-basis proof's own keys (docs/certificate.md, "taylor-newton-kantorovich"; docs/models.md
// §2): they replace the Chebyshev space, error bounds and candidate layout.
void taylor_into(json& j, const proof::CertifyOutcome& o) {
  j["method"] = proof::kTaylorMethod;
  j["space"] = {{"description",
                 "x = (F'(0), K, u) with u = xi F''' + F'' = (xi F'')' = sum_n u_n xi^n, a Taylor series about "
                 "xi = 0; norm |F'(0)| + |K| + sum_n |u_n| (l1 of Taylor coefficients, weight rho^n with rho = 1, "
                 "so sup over [0,1] of any series is at most its norm; docs/models.md (V2.6))"},
                {"weights", {{"F'(0)", 1}, {"K", 1}, {"u_n", "1 (rho = 1)"}}}};
  j["error_bounds"] = {{"sup|F - Fbar|", up_str(o.c3_error[0])},
                       {"sup|F' - Fbar'|", up_str(o.c3_error[1])},
                       {"sup|F'' - Fbar''|", up_str(o.c3_error[2])},
                       {"sup|u - ubar| (u = xi F''' + F'')", up_str(o.c3_error[3])}};
  j["error_bounds_meaning"] = "sup over xi in [0,1] of the difference between the true solution and the candidate";
  j["bounds"]["radii_polynomial"] =
      "p(r) = Z2 r^2 - (1 - max(Z0, Z1)) r + Y0 < 0 at r = existence_radius (docs/models.md (V2.8)-(V2.9))";
  j["candidate"]["layout"] =
      "[F'(0), K, u_0, ..., u_{N-1}], u = xi F''' + F'' = sum u_n xi^n, F'' = sum u_n xi^n / (n + 1), F(0) = 0";
  j["candidate"]["basis"] = "Taylor (monomials xi^n on [0,1], xi = r^2/a^2)";
}

json to_json(const Problem& p, const proof::CertifyOutcome& o) {
  json j;
  j["format"] = kFormat;
  j["format_version"] = kFormatVersion;
  j["status"] = o.certified ? "certified" : "not certified";
  j["R"] = json::array({p.R_lo, p.R_hi});
  const model::ModelSpec& spec = o.model;
  json params = {{"R", json::array({p.R_lo, p.R_hi})}};
  json mparams = json::object();
  for (const auto& [k, v] : spec.params) {
    params[k] = v;
    mparams[k] = v;
  }
  j["problem"] = {{"model", model::model_id_of(spec)},
                  {"model_name", spec.name},
                  {"model_parameters", mparams},
                  {"equation", model::equation_of(spec)},
                  {"boundary_conditions", model::boundary_conditions(spec)},
                  {"parameters", params},
                  {"R_meaning",
                   "wall Reynolds number V h / nu; R > 0 suction, R < 0 injection; the certificate holds for every R "
                   "in the interval"}};
  if (!spec.is_berman()) j["problem"]["documentation"] = "docs/models.md";
  if (spec.is_taylor())
    j["problem"]["R_meaning"] =
        "wall Reynolds number of the porous pipe (R > 0 read as suction, R < 0 as injection, by analogy with "
        "Berman's equation; docs/models.md §2); "
        "the certificate holds for every R in the interval";
  if (!p.scenario.empty()) j["scenario"] = p.scenario;
  if (!p.branch.empty()) j["branch_requested"] = p.branch;
  if (o.certified && !o.structure.label.empty()) {
    const auto spans = [](const std::vector<proof::Span>& v) {
      json a = json::array();
      for (const auto& s : v) a.push_back(json::array({down_str(s.first), up_str(s.second)}));
      return a;
    };
    j["branch"] = o.structure.label;
    j["structure"] = {{"label", o.structure.label},
                      {"reason", o.structure.reason},
                      {"flow_reversal", arith::to_string(o.structure.reversal)},
                      {"reversal_where", spans(o.structure.reversal_where)},
                      {"f_negative_where", spans(o.structure.f_negative)},
                      {"meaning",
                       "flow_reversal: 'yes' = f' < 0 certified on reversal_where; 'no' = f' > 0 certified on [0,1); "
                       "'unsure' = neither could be certified"}};
  }
  j["method"] = "newton-kantorovich";
  const std::string c0 = model::free_constant_text(spec);
  const std::string fn = spec.name == "full-channel" ? "g" : "f";
  j["space"] = {
      {"description", "x = (" + c0 + ", K, u) with u = " + fn + "''' as a Chebyshev series on [0,1]; norm |" + c0 +
                          "| + |K| + sum_k |u_k| (l1 of Chebyshev coefficients, weight 1 on every component)"},
      {"weights", {{c0, 1}, {"K", 1}, {"u_k", "1 (nu = 1)"}}}};
  j["existence_radius"] = up_str(o.existence_radius);
  j["uniqueness_radius"] = down_str(o.uniqueness_radius);
  j["uniqueness"] = o.certified
                        ? "the true solution is the only one in the open ball of radius uniqueness_radius about "
                          "the candidate, in the space above (not a global uniqueness claim)"
                        : "none";
  j["error_bounds"] = {{"sup|f - fbar|", up_str(o.c3_error[0])},
                       {"sup|f' - fbar'|", up_str(o.c3_error[1])},
                       {"sup|f'' - fbar''|", up_str(o.c3_error[2])},
                       {"sup|f''' - fbar'''|", up_str(o.c3_error[3])}};
  if (o.certified && !o.values.empty()) {
    j["values"] = json::object();
    json meaning = json::object();
    for (const auto& v : o.values) {
      j["values"][v.key] = pair(v.enc);
      meaning[v.key] = v.meaning;
    }
    j["value_meanings"] = meaning;
  } else if (o.certified) {
    j["values"] = {{kValueKeys[0], pair(o.fp0)},
                   {kValueKeys[1], pair(o.fppp0)},
                   {kValueKeys[2], pair(o.fpp1)},
                   {kValueKeys[3], pair(o.K)}};
  } else {
    j["values"] = json::object();
    j["failure"] = o.failure;
  }
  j["bounds"] = {{"Y0", up_str(o.Y0)},
                 {"Z0", up_str(o.Z0)},
                 {"Z1", up_str(o.Z1)},
                 {"Z2", up_str(o.Z2)},
                 {"norm_A", up_str(o.A_norm)},
                 {"radii_polynomial", "p(r) = Z2 r^2 - (1 - max(Z0, Z1)) r + Y0 < 0 at r = existence_radius"}};
  j["candidate"] = {
      {"modes", o.modes},
      {"arithmetic", o.precision_bits <= 53 ? "double intervals" : "MPFR intervals"},
      {"precision_bits", o.precision_bits},
      {"layout", spec.name == "full-channel"
                     ? "[g''(0), K_x, u_0, ..., u_{N-1}], u = g''' = sum u_k T_k(2 x - 1), x = (eta + 1)/2"
                     : "[f'(0), K, u_0, ..., u_{N-1}], u = f''' = sum u_k T_k(2 eta - 1)"},
      {"coefficients_hex", o.candidate_hex}};
  if (!o.tangent_hex.empty()) {
    j["candidate"]["tangent_hex"] = o.tangent_hex;
    j["candidate"]["tangent_meaning"] =
        "x1: for R in the box the proof is about x(R) = coefficients + (R - R0) x1, R0 the double nearest the "
        "midpoint of R; existence_radius and uniqueness_radius are stated about the coefficients, moving_centre "
        "holds the proof's own radii about x(R) (docs/method.md (M3.11), (M3.12))";
  }
  if (o.moving_centre && o.certified)
    j["moving_centre"] = {
        {"R0_hex", arith::hex_exact(o.R0)},
        {"existence_radius", up_str(o.centre_existence_radius)},
        {"uniqueness_radius", down_str(o.centre_uniqueness_radius)},
        {"meaning",
         "for each R of the box, with x(R) = candidate.coefficients_hex + (R - R0) candidate.tangent_hex: a true "
         "solution lies within existence_radius of x(R) and is the only one in the open ball of radius "
         "uniqueness_radius about x(R), in the space above (docs/method.md (M3.11))"}};
  if (o.reduced) reduced_into(j, *o.reduced);
  if (o.method == proof::kTaylorMethod) taylor_into(j, o);
  j["log"] = o.log;
  j["seconds"] = o.seconds;
  j["caution"] = kCaution;
  j["software"] = {{"name", "porecert"}, {"version", "0.1.0"}};
  return j;
}

namespace {
// A short, non-recursive picture of a value for messages (a deep array must not recurse here).
std::string shown(const json& v) {
  if (v.is_array()) return "an array of " + std::to_string(v.size());
  if (v.is_object()) return "an object";
  std::string s = v.dump(-1, ' ', false, json::error_handler_t::replace);
  return s.size() > 60 ? s.substr(0, 60) + "..." : s;
}
const json& need(const json& j, const char* key, json::value_t type, const char* rule) {
  if (!j.is_object() || !j.contains(key))
    throw format_error(std::string("certificate: key \"") + key + "\" is missing (" + rule + ")");
  const json& v = j.at(key);
  if (v.type() != type && !(type == json::value_t::number_integer && v.is_number_unsigned()))
    throw format_error(std::string("certificate: key \"") + key + "\" has value " + shown(v) + " (" + rule + ")");
  return v;
}
// An integer key in [lo, hi], checked before any narrowing or arithmetic.
int int_in(const json& j, const char* key, std::int64_t lo, std::int64_t hi, const std::string& field) {
  const json& v = need(j, key, json::value_t::number_integer, "an integer");
  const bool fits = !v.is_number_unsigned() || v.get<std::uint64_t>() <= static_cast<std::uint64_t>(hi);
  const std::int64_t x = fits ? v.get<std::int64_t>() : hi + 1;
  if (x < lo || x > hi)
    throw format_error("certificate: " + field + " is " + shown(v) + ", must be in [" + std::to_string(lo) + ", " +
                       std::to_string(hi) + "]");
  return static_cast<int>(x);
}
std::array<std::string, 2> str_pair(const json& v, const std::string& key) {
  if (!v.is_array() || v.size() != 2 || !v[0].is_string() || !v[1].is_string())
    throw format_error("certificate: \"" + key + "\" must be [lo, hi] as two decimal strings, got " + shown(v));
  return {v[0].get<std::string>(), v[1].get<std::string>()};
}
// [lo, hi] of finite decimals with lo <= hi (compared exactly at 1024 bits).
std::array<std::string, 2> decimal_pair(const json& v, const std::string& key) {
  const auto p = str_pair(v, key);
  arith::PrecisionScope exact(1024);
  try {
    const arith::Im a = arith::from_decimal<arith::Im>(p[0]), b = arith::from_decimal<arith::Im>(p[1]);
    if (!(a.lower() <= b.upper()))
      throw format_error("certificate: \"" + key + "\" = [" + p[0] + ", " + p[1] + "] has lo above hi");
  } catch (const std::invalid_argument& e) {
    throw format_error("certificate: \"" + key + "\": " + e.what());
  }
  return p;
}
}  // namespace

Stored parse(const json& j) {
  const arith::FpEnvScope fp_env;  // caller's rounding mode and flags restored on exit (arith/fp_env.hpp)
  Stored s;
  const auto& fmt = need(j, "format", json::value_t::string, "must be \"porecert-certificate\"");
  if (fmt.get<std::string>() != kFormat)
    throw format_error("certificate: key \"format\" is " + shown(fmt) + ", must be \"porecert-certificate\"");
  s.status = need(j, "status", json::value_t::string, "\"certified\" or \"not certified\"").get<std::string>();
  if (s.status != "certified" && s.status != "not certified")
    throw format_error("certificate: key \"status\" is " + shown(j.at("status")) +
                       ", must be \"certified\" or \"not certified\"");
  const auto R = str_pair(need(j, "R", json::value_t::array, "[lo, hi] decimal strings"), "R");
  try {
    model::check_R("certificate: R", R[0], R[1]);
  } catch (const model::input_error& e) {
    throw format_error(e.what());
  }
  s.problem.R_lo = R[0];
  s.problem.R_hi = R[1];
  const auto& prob = need(j, "problem", json::value_t::object, "the problem statement");
  const auto model = need(prob, "model", json::value_t::string, "model identifier").get<std::string>();
  if (prob.contains("model_name")) {  // model specs (docs/models.md); older files are Berman's
    const auto& name = need(prob, "model_name", json::value_t::string, "a model name of docs/models.md");
    const auto& mp = need(prob, "model_parameters", json::value_t::object, "parameter name -> decimal string");
    s.model.name = name.get<std::string>();
    for (const auto& [k, v] : mp.items()) {
      if (!v.is_string())
        throw format_error("certificate: problem.model_parameters." + k + " has value " + shown(v) +
                           " (must be a decimal string)");
      s.model.params.emplace_back(k, v.get<std::string>());
    }
    try {
      s.model = model::checked(s.model);
    } catch (const model::input_error& e) {
      throw format_error(std::string("certificate: problem: ") + e.what());
    }
  }
  const std::string m0_id = model::model_id_of(s.model);
  if (model != m0_id)
    throw format_error("certificate: problem.model is " + shown(prob.at("model")) +
                       " but model_name/model_parameters give \"" + m0_id + "\"");
  if (j.contains("branch") && j["branch"].is_string()) s.problem.branch = j["branch"].get<std::string>();
  const auto& cand = need(j, "candidate", json::value_t::object, "the candidate, exactly");
  // The precision range of `verify --precision`; the modes the proof accepts (nk_verify needs >= 8).
  s.precision_bits = int_in(cand, "precision_bits", 53, 4096, "candidate.precision_bits");
  s.method = j.contains("method") && j["method"].is_string() ? j["method"].get<std::string>() : "newton-kantorovich";
  if ((s.method == proof::kTaylorMethod) != s.model.is_taylor())
    throw format_error("certificate: method is " +
                       shown(j.contains("method") ? j["method"] : json("newton-kantorovich")) +
                       " but problem.model_name is \"" + s.model.name +
                       "\" (rule: the porous pipe and only it is "
                       "certified by \"" +
                       proof::kTaylorMethod + "\")");
  if (s.method == "reduced-ivp") {
    s.eps = int_in(cand, "eps", -1, 1, "candidate.eps");
    s.nth = int_in(cand, "nth_zero", 1, 8, "candidate.nth_zero");
    if (s.eps == 0) throw format_error("certificate: candidate.eps is 0, must be +1 or -1");
    const char* keys[4] = {"s_lo", "s_hi", "S_lo", "S_hi"};
    for (int i = 0; i < 4; ++i) {
      s.reduced_s[i] = need(cand, keys[i], json::value_t::string, "an exact decimal or hex string").get<std::string>();
      try {
        (void)arith::from_decimal<arith::Id>(s.reduced_s[i]);
      } catch (const std::invalid_argument& e) {
        throw format_error(std::string("certificate: candidate.") + keys[i] + ": " + e.what());
      }
    }
  } else {
    const int modes = int_in(cand, "modes", 8, 100000, "candidate.modes");
    const auto& coeffs = need(cand, "coefficients_hex", json::value_t::array, "list of exact hex strings");
    if (coeffs.size() != static_cast<std::size_t>(modes) + 2)
      throw format_error("certificate: candidate.coefficients_hex has " + std::to_string(coeffs.size()) +
                         " entries, must be modes + 2 = " + std::to_string(modes + 2) + " (truncated?)");
    for (const auto& c : coeffs) {
      if (!c.is_string()) throw format_error("certificate: candidate.coefficients_hex holds a non-string " + shown(c));
      bool exact = false;
      try {  // exact at the stored precision: the candidate is a point (docs/certificate.md)
        if (s.precision_bits <= 53) {
          const arith::Id v = arith::from_decimal<arith::Id>(c.get<std::string>());
          exact = v.lower() == v.upper();
        } else {
          arith::PrecisionScope scope(s.precision_bits);
          const arith::Im v = arith::from_decimal<arith::Im>(c.get<std::string>());
          exact = v.lower() == v.upper();
        }
      } catch (const std::invalid_argument& e) {
        throw format_error(std::string("certificate: candidate.coefficients_hex: ") + e.what());
      }
      if (!exact)
        throw format_error("certificate: candidate.coefficients_hex: candidate coefficient '" +
                           c.get<std::string>().substr(0, 60) + "' is not " +
                           (s.precision_bits <= 53 ? std::string("a double")
                                                   : "exact at " + std::to_string(s.precision_bits) + " bits") +
                           " (rule: exact at candidate.precision_bits)");
      s.candidate_hex.push_back(c.get<std::string>());
    }
    if (cand.contains("tangent_hex")) {
      const auto& t = need(cand, "tangent_hex", json::value_t::array, "list of exact hex strings");
      if (t.size() != coeffs.size())
        throw format_error("certificate: candidate.tangent_hex has " + std::to_string(t.size()) +
                           " entries, must equal coefficients_hex (" + std::to_string(coeffs.size()) + ")");
      for (const auto& c : t) {
        bool exact = false;
        if (c.is_string()) try {
            const arith::Id v = arith::from_decimal<arith::Id>(c.get<std::string>());
            exact = v.lower() == v.upper();
          } catch (const std::invalid_argument&) {
          }
        if (!exact)
          throw format_error("certificate: candidate.tangent_hex: entry " + shown(c) +
                             " is not a double (rule: exact hex or decimal strings of doubles)");
        s.tangent_hex.push_back(c.get<std::string>());
      }
    }
  }
  if (j.contains("moving_centre") && s.status == "certified") {
    const auto& mc = need(j, "moving_centre", json::value_t::object, "the radii about the moving centre");
    if (s.tangent_hex.empty())
      throw format_error(
          "certificate: moving_centre is present but candidate.tangent_hex is not (rule: a moving "
          "centre needs a tangent)");
    const auto num = [&](const char* k, bool up) {
      const std::string t = need(mc, k, json::value_t::string, "decimal string").get<std::string>();
      double v = 0;
      try {
        const arith::Id x = arith::from_decimal<arith::Id>(t);
        v = up ? x.upper() : x.lower();
      } catch (const std::invalid_argument&) {
        throw format_error(std::string("certificate: moving_centre.") + k + " is \"" + t.substr(0, 60) +
                           "\", must be a decimal number");
      }
      if (!(v >= 0))
        throw format_error(std::string("certificate: moving_centre.") + k + " is \"" + t.substr(0, 60) +
                           "\", must be >= 0");
      return v;
    };
    MovingCentre c;
    c.existence_radius = num("existence_radius", true);
    c.uniqueness_radius = num("uniqueness_radius", false);
    const std::string r0 = need(mc, "R0_hex", json::value_t::string, "exact hex string of a double").get<std::string>();
    bool exact = false;
    try {
      const arith::Id v = arith::from_decimal<arith::Id>(r0);
      exact = v.lower() == v.upper();
      c.R0 = v.lower();
    } catch (const std::invalid_argument&) {
    }
    if (!exact)
      throw format_error("certificate: moving_centre.R0_hex is \"" + r0.substr(0, 60) +
                         "\", must be an exact double (rule: hex or decimal string of a double)");
    s.moving_centre = c;
  }
  const auto er = need(j, "existence_radius", json::value_t::string, "decimal string").get<std::string>();
  if (s.status == "certified") {  // an uncertified result may state "inf"
    try {
      s.existence_radius = arith::from_decimal<arith::Id>(er).upper();
    } catch (const std::invalid_argument&) {
      throw format_error("certificate: existence_radius is \"" + er.substr(0, 60) + "\", must be a decimal number");
    }
    if (!(s.existence_radius >= 0))
      throw format_error("certificate: existence_radius is \"" + er.substr(0, 60) + "\", must be >= 0");
  }
  const auto& vals = need(j, "values", json::value_t::object, "the value enclosures");
  for (const auto& [k, v] : vals.items()) s.named_values.emplace_back(k, str_pair(v, "values." + k));
  if (s.status == "certified")
    for (const auto& key : model::value_keys_of(s.model))
      if (!vals.contains(key.key)) throw format_error("certificate: values.\"" + key.key + "\" is missing");
  if (s.status == "certified" && s.model.half_channel())
    for (int i = 0; i < 4; ++i) {
      if (!vals.contains(kValueKeys[i]))
        throw format_error(std::string("certificate: values.\"") + kValueKeys[i] + "\" is missing");
      s.values[i] = decimal_pair(vals.at(kValueKeys[i]), std::string("values.") + kValueKeys[i]);
    }
  return s;
}

json parse_text(const std::string& text, const std::string& source) {
  const arith::FpEnvScope fp_env;  // number parsing (strtod) follows the rounding mode
  try {
    return json::parse(text);
  } catch (const json::exception& e) {
    throw format_error("certificate: '" + source + "' is not valid JSON (truncated?): " + e.what());
  }
}

json read_file(const std::string& path) {
  std::ifstream in(path, std::ios::binary);
  if (!in) throw format_error("certificate: cannot read file '" + path + "'");
  std::stringstream ss;
  ss << in.rdbuf();
  return parse_text(ss.str(), path);
}

void write_atomic(const std::string& path, const std::string& text) {
  if (path == "-") {
    std::fwrite(text.data(), 1, text.size(), stdout);
    std::fflush(stdout);
    return;
  }
  // Bad output path = bad input (exit 2); the temporary file never survives a failure.
  const std::string tmp = path + ".tmp-porecert";
  const auto fail = [&](const std::string& why) {
    std::error_code ec;
    std::filesystem::remove(tmp, ec);
    return model::input_error("output '" + path + "': cannot write (" + why +
                              "; rule: the directory must exist and be writable, the path must not be a directory); "
                              "nothing was written");
  };
  if (path.empty()) throw fail("empty path");
  {
    std::ofstream out(tmp, std::ios::binary | std::ios::trunc);
    if (!out) throw fail("cannot create '" + tmp + "'");
    out << text;
    out.flush();
    if (!out) throw fail("write to '" + tmp + "' failed");
  }
  std::error_code ec;
  std::filesystem::rename(tmp, path, ec);
  if (ec) throw fail(ec.message());
}

void check_output(const std::string& path) {
  if (path == "-") return;
  const std::string tmp = path + ".tmp-porecert";
  std::error_code ec;
  if (path.empty() || std::filesystem::is_directory(path, ec))
    throw model::input_error("output '" + path + "': is " + (path.empty() ? "empty" : "a directory") +
                             " (rule: a file path in a writable directory); nothing was written");
  {
    std::ofstream out(tmp, std::ios::binary | std::ios::trunc);
    if (!out)
      throw model::input_error("output '" + path + "': cannot create '" + tmp +
                               "' (rule: the directory must exist and be writable); nothing was written");
  }
  std::filesystem::remove(tmp, ec);
}

}  // namespace porecert::certificate
