#include "report/report.hpp"

#include <algorithm>
#include <cmath>
#include <cstdio>
#include <optional>
#include <sstream>

#include "arith/cheb.hpp"
#include "arith/interval.hpp"
#include "certificate/certificate.hpp"
#include "certificate/dimensional_block.hpp"
#include "model/dimensional.hpp"
#include "model/operator.hpp"

namespace porecert::report {

using arith::Id;
using certificate::format_error;
using nlohmann::json;

namespace {

// ---- reading ------------------------------------------------------------------------------

const char* kErrKeys[4] = {"sup|f - fbar|", "sup|f' - fbar'|", "sup|f'' - fbar''|", "sup|f''' - fbar'''|"};
const char* kValKeys[4] = {"f'(0)", "f'''(0)", "f''(1)", "K"};
constexpr int kSamples = 128;  // eta_i = i/128: exact dyadic sample points

struct Solution {
  json j;
  certificate::Stored st;
  std::string where;  // "" or "solutions[2]" for messages
  bool certified = false;
  std::array<double, 4> err{};            // sup-norm error bounds, rounded up
  std::array<Id, 4> val;                  // f'(0), f'''(0), f''(1), K
  std::vector<Id> f, fp;                  // enclosures of f(eta_i), f'(eta_i), i = 0..kSamples
  std::optional<model::Channel> channel;  // dimensional inputs, when the certificate has them
  std::string label;                      // branch label or ""
  bool half = true;                       // a half-channel model (the page's f'(0), f''(1), K columns)
  bool has_profile = false;               // f, fp above are filled
  bool pipe = false;                      // Taylor-basis pipe: f, fp are F(xi_i), F'(xi_i), xi = r²/a²
};

std::string key_name(const std::string& where, const std::string& key) {
  return where.empty() ? key : where + "." + key;
}

// The stored candidate enclosed in double intervals (MPFR coefficients rounded outward); at least 3.
std::vector<Id> candidate_of(const std::vector<std::string>& hex, const std::string& where) {
  std::vector<Id> x;
  for (std::size_t i = 0; i < hex.size(); ++i) {
    try {
      x.push_back(arith::from_decimal<Id>(hex[i]));
    } catch (const std::invalid_argument&) {
      throw format_error("certificate: " + key_name(where, "candidate.coefficients_hex[" + std::to_string(i) + "]") +
                         " = \"" + hex[i] + "\" (rule: a hex or decimal number)");
    }
  }
  if (x.size() < 3)
    throw format_error("certificate: " + key_name(where, "candidate.coefficients_hex") + " is too short");
  return x;
}

double decimal_up(const json& j, const std::string& key, const std::string& where) {
  if (!j.is_string())
    throw format_error("certificate: " + key_name(where, key) + " is " + j.dump().substr(0, 60) +
                       " (rule: a decimal string)");
  const std::string s = j.get<std::string>();
  if (s == "inf") return INFINITY;
  try {
    return arith::from_decimal<Id>(s).upper();
  } catch (const std::invalid_argument&) {
    throw format_error("certificate: " + key_name(where, key) + " is \"" + s + "\" (rule: a decimal number)");
  }
}

// The porous pipe (docs/models.md §2, docs/report.md (R3)): candidate [F'(0), K, u_0 .. u_{N-1}] in the
// Taylor basis about xi = 0, F' = F'(0) + sum u_n xi^(n+1)/(n+1)^2, F = F'(0) xi + sum u_n xi^(n+2)/((n+1)^2 (n+2));
// F(xi_i), F'(xi_i) enclosed as the candidate's value (interval Horner-free sum, xi_i = i/128 exact) +- the
// certified sup-norm errors on [0,1].
Solution read_taylor(Solution s) {
  const json& j = s.j;
  const std::string& where = s.where;
  static const char* keys[4] = {"sup|F - Fbar|", "sup|F' - Fbar'|", "sup|F'' - Fbar''|",
                                "sup|u - ubar| (u = xi F''' + F'')"};
  if (!j.contains("error_bounds") || !j["error_bounds"].is_object())
    throw format_error("certificate: key \"" + key_name(where, "error_bounds") + "\" is missing (rule: an object)");
  for (int k = 0; k < 4; ++k) {
    const std::string f = std::string("error_bounds.") + keys[k];
    if (!j["error_bounds"].contains(keys[k]))
      throw format_error("certificate: key \"" + key_name(where, f) + "\" is missing");
    s.err[k] = decimal_up(j["error_bounds"][keys[k]], f, where);
    if (!(s.err[k] >= 0) || !std::isfinite(s.err[k]))
      throw format_error("certificate: " + key_name(where, f) + " must be a finite number >= 0");
  }
  if (!j.contains("bounds") || !j["bounds"].is_object())
    throw format_error("certificate: key \"" + key_name(where, "bounds") + "\" is missing (rule: an object)");
  s.half = false;
  s.pipe = true;
  const std::vector<Id> x = candidate_of(s.st.candidate_hex, where);
  for (int i = 0; i <= kSamples; ++i) {
    const Id xi = Id(i) / Id(kSamples);   // exact: a dyadic
    Id F = x[0] * xi, Fp = x[0], p = xi;  // p = xi^(n+1)
    for (std::size_t n = 0; n + 2 < x.size(); ++n) {
      const Id m = Id(static_cast<double>(n + 1));  // small integers: exact
      const Id t = x[n + 2] * p / (m * m);
      Fp += t;
      F += t * xi / (m + Id(1));
      p *= xi;
    }
    s.f.push_back(F + Id(-s.err[0], s.err[0]));
    s.fp.push_back(Fp + Id(-s.err[1], s.err[1]));
  }
  // F(0) = 0, F(1) = 1, F'(1) = 0 hold exactly for the true solution (V2.1): intersect.
  s.f[0] = Id(0);
  s.f[kSamples] = Id(1);
  s.fp[kSamples] = Id(0);
  s.has_profile = true;
  return s;
}

Solution read_solution(const json& j, const std::string& where) {
  Solution s;
  s.j = j;
  s.where = where;
  try {
    s.st = certificate::parse(j);
  } catch (const format_error& e) {
    if (where.empty()) throw;
    throw format_error(where + ": " + e.what());
  }
  s.certified = s.st.status == "certified";
  s.label = s.st.problem.branch;
  if (!s.certified) return s;
  if (s.st.model.is_taylor()) return read_taylor(std::move(s));
  if (!j.contains("error_bounds") || !j["error_bounds"].is_object())
    throw format_error("certificate: key \"" + key_name(where, "error_bounds") + "\" is missing (rule: an object)");
  for (int k = 0; k < 4; ++k) {
    if (!j["error_bounds"].contains(kErrKeys[k]))
      throw format_error("certificate: key \"" + key_name(where, std::string("error_bounds.") + kErrKeys[k]) +
                         "\" is missing");
    s.err[k] = decimal_up(j["error_bounds"][kErrKeys[k]], std::string("error_bounds.") + kErrKeys[k], where);
    if (!(s.err[k] >= 0) || !std::isfinite(s.err[k]))
      throw format_error("certificate: " + key_name(where, std::string("error_bounds.") + kErrKeys[k]) +
                         " must be a finite number >= 0");
  }
  if (!j.contains("bounds") || !j["bounds"].is_object())
    throw format_error("certificate: key \"" + key_name(where, "bounds") + "\" is missing (rule: an object)");
  const bool reduced = s.st.method == "reduced-ivp";
  s.half = s.st.model.half_channel();
  if (!s.half) return s;  // values by their own keys (values_section); no profile plot for this model
  for (const char* b : {"Y0", "Z0", "Z1", "Z2"})
    if (!reduced)
      if (!j["bounds"].contains(b) || !j["bounds"][b].is_string())
        throw format_error("certificate: key \"" + key_name(where, std::string("bounds.") + b) +
                           "\" is missing (rule: a decimal string)");
  for (int k = 0; k < 4; ++k) {
    try {
      s.val[k] =
          boost::numeric::hull(arith::from_decimal<Id>(s.st.values[k][0]), arith::from_decimal<Id>(s.st.values[k][1]));
    } catch (const std::exception&) {
      throw format_error("certificate: " + key_name(where, std::string("values.") + kValKeys[k]) + " = [" +
                         s.st.values[k][0] + ", " + s.st.values[k][1] + "] (rule: decimal strings, lo <= hi)");
    }
  }
  if (reduced) {  // the proof's own profile samples (docs/certificate.md, reduced-ivp)
    const auto bad = [&](const std::string& what) {
      return format_error("certificate: " + key_name(where, "profile") + " " + what + " (rule: arrays f and f' of " +
                          std::to_string(kSamples + 1) + " [lo, hi] decimal pairs)");
    };
    if (!j.contains("profile") || !j["profile"].is_object()) throw bad("is missing");
    for (const char* key : {"f", "f'"}) {
      const json& a = j["profile"].value(key, json());
      if (!a.is_array() || a.size() != kSamples + 1)
        throw bad(std::string("has no array ") + key + " of the right length");
      for (const auto& e : a) {
        if (!e.is_array() || e.size() != 2 || !e[0].is_string() || !e[1].is_string())
          throw bad("holds a malformed pair");
        Id v;
        try {
          v = boost::numeric::hull(arith::from_decimal<Id>(e[0].get<std::string>()),
                                   arith::from_decimal<Id>(e[1].get<std::string>()));
        } catch (const std::exception&) {
          throw bad("holds a pair that is not two decimals");
        }
        (key[1] ? s.fp : s.f).push_back(v);
      }
    }
    s.has_profile = true;
    if (j.contains("dimensional")) s.channel = certificate::read_dimensional(j, s.st.problem.R_lo, s.st.problem.R_hi);
    return s;
  }
  // The candidate, enclosed in double intervals (MPFR coefficients are rounded outward): [f'(0), K, u...].
  const std::vector<Id> x = candidate_of(s.st.candidate_hex, where);
  const cheb::Series<Id> u(x.begin() + 2, x.end());
  const auto D = model::lift<Id>({Id(0), x[0], Id(0)}, u);
  // docs/report.md (R1): f(eta) in fbar(eta) +- e_0, f'(eta) in fbar'(eta) +- e_1 at each sample.
  for (int i = 0; i <= kSamples; ++i) {
    const Id eta = Id(i) / Id(kSamples);  // exact: a dyadic
    s.f.push_back(cheb::eval(D[0], eta) + Id(-s.err[0], s.err[0]));
    s.fp.push_back(cheb::eval(D[1], eta) + Id(-s.err[1], s.err[1]));
  }
  // f(0) = 0 and f(1) = 1, f'(1) = 0 hold exactly for the true solution: intersect (R2).
  s.f[0] = Id(0);
  s.f[kSamples] = Id(1);
  s.fp[kSamples] = Id(0);
  s.has_profile = true;
  if (j.contains("dimensional")) s.channel = certificate::read_dimensional(j, s.st.problem.R_lo, s.st.problem.R_hi);
  return s;
}

std::vector<Solution> read_all(const ReportInput& in) {
  std::vector<Solution> v;
  for (std::size_t i = 0; i < in.entries.size(); ++i)
    v.push_back(read_solution(
        in.entries[i], in.kind == "certificate"
                           ? ""
                           : (in.kind == "branches" ? "solutions[" : "certificates[") + std::to_string(i) + "]"));
  return v;
}

// ---- text helpers -------------------------------------------------------------------------

std::string esc(const std::string& s) {
  std::string o;
  for (char c : s) {
    switch (c) {
      case '&':
        o += "&amp;";
        break;
      case '<':
        o += "&lt;";
        break;
      case '>':
        o += "&gt;";
        break;
      case '"':
        o += "&quot;";
        break;
      default:
        o += c;
    }
  }
  return o;
}
std::string num(double v, int digits = 6) {
  char b[64];
  std::snprintf(b, sizeof b, "%.*g", digits, v);
  return b;
}
// Outward decimal enclosure text of x scaled by an exact-enough display factor (an enclosure too).
std::string ival(const Id& x, int digits = 10) {
  return "[" + arith::decimal_lower(x, digits) + ", " + arith::decimal_upper(x, digits) + "]";
}
std::string ival_str(const std::array<std::string, 2>& p) { return "[" + p[0] + ", " + p[1] + "]"; }
std::string R_text(const certificate::Stored& s) {
  return s.problem.R_lo == s.problem.R_hi ? s.problem.R_lo : "[" + s.problem.R_lo + ", " + s.problem.R_hi + "]";
}
std::string jstr(const json& j, const std::string& key, const std::string& dflt = "—") {
  return j.contains(key) && j[key].is_string() ? j[key].get<std::string>() : dflt;
}

// Display unit for a plot axis (plots only; tables stay in SI).
struct DisplayUnit {
  double factor = 1;  // display value = SI value * factor (1, 1e3, 1e6: exact doubles)
  std::string name;
};
DisplayUnit pick_unit(double maxabs, bool velocity) {
  DisplayUnit d;
  if (maxabs >= 0.1) {
    d.factor = 1;
    d.name = velocity ? "m/s" : "m";
  } else if (maxabs * 1e3 >= 0.1) {
    d.factor = 1e3;
    d.name = velocity ? "mm/s" : "mm";
  } else {
    d.factor = 1e6;
    d.name = velocity ? "µm/s" : "µm";
  }
  return d;
}

// ---- SVG ----------------------------------------------------------------------------------

const char* kColors[] = {"#1f6f8b", "#c8553d", "#6a4c93", "#3a7d44", "#b08900", "#555555"};

// Names carry R only when the input mixes several R (a sweep); branches share one R.
bool g_mixed_R = false;
std::string solution_name(const Solution& s, std::size_t k, std::size_t n) {
  std::string t = s.label.empty() ? "solution" : "type " + s.label;
  if (n > 1) t = "[" + std::to_string(k + 1) + "] " + t;
  if (n > 1 && g_mixed_R) t += ", R = " + R_text(s.st);
  return t;
}
// One colour per branch label everywhere on the page; unlabelled solutions by index.
std::string color_for(const Solution& s, std::size_t k) {
  if (s.label == "I") return kColors[0];
  if (s.label == "II") return kColors[1];
  if (s.label == "III") return kColors[2];
  return kColors[3 + k % 3];
}

std::vector<double> nice_ticks(double lo, double hi, int want = 5) {
  const double span = hi - lo;
  if (!(span > 0)) return {lo};
  const double raw = span / want, mag = std::pow(10.0, std::floor(std::log10(raw)));
  double step = mag;
  for (double m : {1.0, 2.0, 2.5, 5.0, 10.0})
    if (raw <= m * mag) {
      step = m * mag;
      break;
    }
  std::vector<double> t;
  for (double v = std::ceil(lo / step) * step; v <= hi + 1e-9 * span; v += step)
    t.push_back(std::abs(v) < 1e-12 * step ? 0 : v);
  return t;
}

struct Band {
  std::string name, color;
  std::vector<double> pos, lo, hi;  // position (vertical axis) and value enclosure (horizontal axis)
};

struct Frame {
  double W = 540, H = 380, L = 70, R = 20, T = 34, B = 52;
  double xlo, xhi, ylo, yhi;
  double px(double x) const { return L + (x - xlo) / (xhi - xlo) * (W - L - R); }
  double py(double y) const { return T + (yhi - y) / (yhi - ylo) * (H - T - B); }
};

std::string axes(const Frame& f, const std::string& xlabel, const std::string& ylabel) {
  std::ostringstream o;
  o << "<rect class=\"plotbg\" x=\"" << f.L << "\" y=\"" << f.T << "\" width=\"" << f.W - f.L - f.R << "\" height=\""
    << f.H - f.T - f.B << "\"/>\n";
  for (double t : nice_ticks(f.xlo, f.xhi)) {
    o << "<line class=\"grid\" x1=\"" << num(f.px(t)) << "\" x2=\"" << num(f.px(t)) << "\" y1=\"" << f.T << "\" y2=\""
      << f.H - f.B << "\"/>";
    o << "<text class=\"tick\" x=\"" << num(f.px(t)) << "\" y=\"" << f.H - f.B + 16 << "\" text-anchor=\"middle\">"
      << num(t, 4) << "</text>\n";
  }
  for (double t : nice_ticks(f.ylo, f.yhi)) {
    o << "<line class=\"grid\" x1=\"" << f.L << "\" x2=\"" << f.W - f.R << "\" y1=\"" << num(f.py(t)) << "\" y2=\""
      << num(f.py(t)) << "\"/>";
    o << "<text class=\"tick\" x=\"" << f.L - 6 << "\" y=\"" << num(f.py(t) + 4) << "\" text-anchor=\"end\">"
      << num(t, 4) << "</text>\n";
  }
  o << "<text class=\"axlabel\" x=\"" << (f.L + f.W - f.R) / 2 << "\" y=\"" << f.H - 12 << "\" text-anchor=\"middle\">"
    << esc(xlabel) << "</text>\n";
  o << "<text class=\"axlabel\" transform=\"translate(16," << (f.T + f.H - f.B) / 2
    << ") rotate(-90)\" text-anchor=\"middle\">" << esc(ylabel) << "</text>\n";
  return o.str();
}

// A profile plot: value horizontally, position across the channel vertically, walls dashed.
std::string profile_svg(const std::string& id, const std::string& title, const std::vector<Band>& bands,
                        const std::string& xlabel, const std::string& ylabel, double wall) {
  Frame f;
  double lo = 0, hi = 0;
  for (const auto& b : bands)
    for (std::size_t i = 0; i < b.lo.size(); ++i) lo = std::min(lo, b.lo[i]), hi = std::max(hi, b.hi[i]);
  if (!(hi > lo)) hi = lo + 1;
  const double pad = 0.06 * (hi - lo);
  f.xlo = lo - pad;
  f.xhi = hi + pad;
  f.ylo = -wall * 1.08;
  f.yhi = wall * 1.08;
  std::ostringstream o;
  o << "<svg id=\"" << id << "\" class=\"plot\" viewBox=\"0 0 " << f.W << " " << f.H << "\" role=\"img\" aria-label=\""
    << esc(title) << "\">\n<title>" << esc(title) << "</title>\n";
  o << axes(f, xlabel, ylabel);
  for (double w : {wall, -wall})
    o << "<line class=\"wall\" x1=\"" << f.L << "\" x2=\"" << f.W - f.R << "\" y1=\"" << num(f.py(w)) << "\" y2=\""
      << num(f.py(w)) << "\"/>";
  o << "<text class=\"walltext\" x=\"" << f.W - f.R - 4 << "\" y=\"" << num(f.py(wall) - 5)
    << "\" text-anchor=\"end\">porous wall</text>\n";
  o << "<line class=\"zero\" x1=\"" << num(f.px(0)) << "\" x2=\"" << num(f.px(0)) << "\" y1=\"" << f.T << "\" y2=\""
    << f.H - f.B << "\"/>\n";
  for (std::size_t k = 0; k < bands.size(); ++k) {
    const auto& b = bands[k];
    std::ostringstream poly, mid;
    for (std::size_t i = 0; i < b.pos.size(); ++i) poly << num(f.px(b.lo[i])) << "," << num(f.py(b.pos[i])) << " ";
    for (std::size_t i = b.pos.size(); i-- > 0;) poly << num(f.px(b.hi[i])) << "," << num(f.py(b.pos[i])) << " ";
    for (std::size_t i = 0; i < b.pos.size(); ++i)
      mid << num(f.px(0.5 * (b.lo[i] + b.hi[i]))) << "," << num(f.py(b.pos[i])) << " ";
    o << "<polygon class=\"tube\" data-series=\"" << k << "\" points=\"" << poly.str() << "\" fill=\"" << b.color
      << "\" stroke=\"" << b.color << "\"/>\n";
    o << "<polyline class=\"curve\" points=\"" << mid.str() << "\" stroke=\"" << b.color << "\"/>\n";
    o << "<rect x=\"" << f.L + 10 << "\" y=\"" << f.T + 34 + 16 * k << "\" width=\"12\" height=\"8\" fill=\"" << b.color
      << "\"/><text class=\"legend\" x=\"" << f.L + 28 << "\" y=\"" << f.T + 42 + 16 * k << "\">" << esc(b.name)
      << "</text>\n";
  }
  o << "<text class=\"ptitle\" x=\"" << f.L << "\" y=\"20\">" << esc(title) << "</text>\n</svg>\n";
  return o.str();
}

// Branch diagram: f''(1) against R, each certificate a certified box (drawn at least 8 px).
std::string branch_svg(const std::vector<Solution>& sols) {
  Frame f;
  f.W = 700;
  f.H = 400;
  double rlo = INFINITY, rhi = -INFINITY, vlo = INFINITY, vhi = -INFINITY;
  for (const auto& s : sols) {
    if (!s.certified || !s.half) continue;
    const Id R =
        boost::numeric::hull(arith::from_decimal<Id>(s.st.problem.R_lo), arith::from_decimal<Id>(s.st.problem.R_hi));
    rlo = std::min(rlo, R.lower());
    rhi = std::max(rhi, R.upper());
    vlo = std::min(vlo, s.val[2].lower());
    vhi = std::max(vhi, s.val[2].upper());
  }
  const double rpad = std::max(0.08 * (rhi - rlo), 0.05 * std::abs(rhi) + 0.5),
               vpad = std::max(0.08 * (vhi - vlo), 0.5);
  f.xlo = rlo - rpad;
  f.xhi = rhi + rpad;
  f.ylo = vlo - vpad;
  f.yhi = vhi + vpad;
  std::ostringstream o;
  o << "<svg id=\"plot-branches\" class=\"plot wide\" viewBox=\"0 0 " << f.W << " " << f.H
    << "\" role=\"img\" aria-label=\"branch diagram\">\n<title>Certified solutions: f''(1) against R</title>\n";
  o << axes(f, "wall Reynolds number R", "f''(1)  (dimensionless wall shear)");
  for (std::size_t k = 0; k < sols.size(); ++k) {
    const auto& s = sols[k];
    if (!s.certified) continue;
    const Id R =
        boost::numeric::hull(arith::from_decimal<Id>(s.st.problem.R_lo), arith::from_decimal<Id>(s.st.problem.R_hi));
    double x0 = f.px(R.lower()), x1 = f.px(R.upper()), y0 = f.py(s.val[2].upper()), y1 = f.py(s.val[2].lower());
    const double cx = 0.5 * (x0 + x1), cy = 0.5 * (y0 + y1);
    x0 = std::min(x0, cx - 4);
    x1 = std::max(x1, cx + 4);
    y0 = std::min(y0, cy - 4);
    y1 = std::max(y1, cy + 4);
    const std::string col = color_for(s, k);
    o << "<rect class=\"box\" x=\"" << num(x0) << "\" y=\"" << num(y0) << "\" width=\"" << num(x1 - x0)
      << "\" height=\"" << num(y1 - y0) << "\" stroke=\"" << col << "\"><title>"
      << esc(s.label.empty() ? "unlabelled" : "type " + s.label) << ": R in " << esc(R_text(s.st)) << ", f''(1) in "
      << esc(ival_str(s.st.values[2])) << "</title></rect>";
    o << "<text class=\"boxlabel\" x=\"" << num(x1 + 4) << "\" y=\"" << num(cy + 4) << "\" fill=\"" << col << "\">"
      << esc(s.label.empty() ? "?" : s.label) << "</text>\n";
  }
  o << "<text class=\"ptitle\" x=\"" << f.L
    << "\" y=\"20\">f''(1) against R: certified boxes (drawn at least 8 px)</text>\n</svg>\n";
  return o.str();
}

// ---- page sections ------------------------------------------------------------------------

std::string profiles_section(const std::vector<Solution>& sols) {
  // Dimensional plots only when there is exactly one certified solution with channel data.
  std::vector<const Solution*> cert;
  for (const auto& s : sols)  // at most six overlaid profiles, all of the first one's geometry (channel or pipe)
    if (s.certified && s.has_profile && cert.size() < 6 && (cert.empty() || cert[0]->pipe == s.pipe))
      cert.push_back(&s);
  if (cert.empty()) return "";
  const bool pipe = cert[0]->pipe;
  std::size_t ncert_all = 0;
  for (const auto& s : sols) ncert_all += s.certified;
  // Colours by label when the labels tell the curves apart, else by position.
  bool unique_labels = true;
  for (std::size_t a = 0; a < cert.size(); ++a)
    for (std::size_t b = a + 1; b < cert.size(); ++b) unique_labels = unique_labels && cert[a]->label != cert[b]->label;
  const bool dim = cert.size() == 1 && cert[0]->channel;
  std::vector<Band> ub, vb;
  double h_disp = 1;
  std::string pos_label = "eta = y/h  (0 centre plane, ±1 walls)", u_label = "f'(eta)  (u / U(x))",
              v_label = "f(eta)  (v / V)";
  DisplayUnit uu, vu, hu;
  if (pipe) {
    pos_label = "r/a  (0 axis, ±1 wall; sampled at xi = r²/a² = i/128)";
    u_label = "F'(xi)  (axial velocity shape)";
    v_label = "F(xi)  (stream-function shape)";
  }
  if (dim) {
    const auto& c = *cert[0]->channel;
    const double umax = std::abs(model::mean_velocity_at_x(c).upper()) * 2, vmax = arith::mag_up(c.V);
    uu = pick_unit(umax, true);
    vu = pick_unit(vmax, true);
    hu = pick_unit(arith::mid_double(c.h), false);
    h_disp = arith::mid_double(c.h) * hu.factor;
    pos_label = "y  [" + hu.name + "]  (0 centre plane)";
    u_label = "axial velocity u(x, y)  [" + uu.name + "]";
    v_label = "wall-normal velocity v(y)  [" + vu.name + "]";
  }
  for (std::size_t k = 0; k < cert.size(); ++k) {
    const Solution& s = *cert[k];
    const std::size_t idx = static_cast<std::size_t>(cert[k] - sols.data());  // position in the input
    Band u{
        solution_name(s, idx, sols.size()), unique_labels ? color_for(s, k) : std::string(kColors[k % 6]), {}, {}, {}},
        v = u;
    // Mirror to the whole channel: f' is even and f odd in eta (symmetric problem). The pipe: F(r²/a²)
    // is even in r; the drawing places sample xi_i at r/a = ±sqrt(xi_i) (position only, not a value).
    for (int i = -kSamples; i <= kSamples; ++i) {
      const int a = std::abs(i);
      Id fp = s.fp[a], fv = i < 0 && !pipe ? Id(0) - s.f[a] : s.f[a];
      if (dim) {
        fp = model::axial_velocity(*s.channel, fp) * Id(uu.factor);
        fv = model::normal_velocity(*s.channel, fv) * Id(vu.factor);
      }
      const double pos = pipe ? (i < 0 ? -1 : 1) * std::sqrt(double(a) / kSamples) : h_disp * i / kSamples;
      u.pos.push_back(pos);
      u.lo.push_back(fp.lower());
      u.hi.push_back(fp.upper());
      v.pos.push_back(pos);
      v.lo.push_back(fv.lower());
      v.hi.push_back(fv.upper());
    }
    ub.push_back(u);
    vb.push_back(v);
  }
  std::ostringstream o;
  o << "<section id=\"profiles\"><h2>Velocity profiles with the certified tube</h2>\n";
  double emax = 0;
  for (const auto* s : cert) emax = std::max({emax, s->err[0], s->err[1]});
  o << "<p class=\"note\">Shaded: the certified enclosure of the true solution at each of " << 2 * kSamples + 1
    << " sample points across the channel (candidate ± the certified sup-norm error, at most " << num(emax, 3)
    << (pipe ? " in F and F'" : " in f and f'")
    << "; outlines are drawn one pixel wide, so a tube thinner than a pixel shows as a line). "
       "Between sample points the drawing interpolates; the table below lists enclosures at chosen points.";
  if (ncert_all > cert.size())
    o << " Profiles of the first " << cert.size() << " of " << ncert_all << " certified solutions are shown.";
  o << "</p>\n";
  o << "<div class=\"plots\">"
    << profile_svg("plot-u",
                   dim    ? "Axial velocity u(x, y)"
                   : pipe ? "Axial velocity shape F'(xi), porous pipe"
                          : "Axial velocity shape f'(eta)",
                   ub, u_label, pos_label, h_disp)
    << profile_svg("plot-v",
                   dim    ? "Wall-normal velocity v(y)"
                   : pipe ? "Stream-function shape F(xi), porous pipe"
                          : "Stream-function shape f(eta)",
                   vb, v_label, pos_label, h_disp)
    << "</div>\n";
  // Enclosures at chosen points, first solution (or each, compactly).
  o << "<table id=\"profile-table\" class=\"data\"><caption>Certified enclosures at chosen "
       "points</caption><tr><th>solution</th>"
    << (pipe ? "<th>xi = r²/a²</th><th>F(xi)</th><th>F'(xi)</th>"
             : "<th>eta = y/h</th><th>f(eta)</th><th>f'(eta)</th>");
  if (dim) o << "<th>u [m/s]</th><th>v [m/s]</th>";
  o << "</tr>\n";
  for (std::size_t k = 0; k < cert.size(); ++k)
    for (int i : {0, 32, 64, 96, 128}) {
      const Solution& s = *cert[k];
      o << "<tr><td>" << esc(solution_name(s, static_cast<std::size_t>(cert[k] - sols.data()), sols.size()))
        << "</td><td>" << num(double(i) / kSamples) << "</td><td class=\"iv\">" << ival(s.f[i])
        << "</td><td class=\"iv\">" << ival(s.fp[i]) << "</td>";
      if (dim)
        o << "<td class=\"iv\">" << ival(model::axial_velocity(*s.channel, s.fp[i])) << "</td><td class=\"iv\">"
          << ival(model::normal_velocity(*s.channel, s.f[i])) << "</td>";
      o << "</tr>\n";
    }
  o << "</table></section>\n";
  return o.str();
}

std::string values_section(const std::vector<Solution>& sols) {
  std::ostringstream o;
  o << "<section><h2>Certified values</h2>\n<table id=\"values\" class=\"data\"><tr><th>solution</th><th>R</th>"
       "<th>f'(0)<br><small>centre-line speed / mean</small></th><th>f''(1)<br><small>wall shear</small></th>"
       "<th>K<br><small>pressure constant</small></th><th>f'''(0)</th><th>structure</th></tr>\n";
  for (std::size_t k = 0; k < sols.size(); ++k) {
    const auto& s = sols[k];
    o << "<tr><td>" << esc(solution_name(s, k, sols.size())) << "</td><td class=\"iv\">" << esc(R_text(s.st))
      << "</td>";
    if (!s.certified) {
      o << "<td colspan=\"5\" class=\"fail\">not certified: " << esc(jstr(s.j, "failure")) << "</td></tr>\n";
      continue;
    }
    if (!s.half) {  // a model with its own value keys (docs/models.md)
      std::string t;
      for (const auto& [key, v] : s.st.named_values) t += (t.empty() ? "" : "; ") + key + " in " + ival_str(v);
      o << "<td colspan=\"4\" class=\"iv\">" << esc(t) << "</td>";
    } else {
      for (int i : {0, 2, 3, 1}) o << "<td class=\"iv\">" << esc(ival_str(s.st.values[i])) << "</td>";
    }
    std::string st = "—";
    if (s.j.contains("structure") && s.j["structure"].is_object())
      st = "type " + jstr(s.j["structure"], "label", "?") +
           "; flow reversal: " + jstr(s.j["structure"], "flow_reversal", "?");
    o << "<td>" << esc(st) << "</td></tr>\n";
  }
  o << "</table>\n<p class=\"note\">Every interval holds for the true solution and, when R is an interval, for every R "
       "in "
       "it. Decimal ends are rounded outward.</p></section>\n";
  return o.str();
}

std::string proof_section(const std::vector<Solution>& sols) {
  std::ostringstream o;
  o << "<section><h2>The inequalities that close the proof</h2>\n<p class=\"note\">Newton–Kantorovich in the ℓ¹ space "
       "of "
       "(f'(0), K, Chebyshev coefficients of f'''): with Z = max(Z0, Z1), p(r) = Z2 r² − (1 − Z) r + Y0. If Z &lt; 1 "
       "and p(r) &lt; 0 at r = r₋, a true solution lies within r₋ of the candidate and is the only one in the ball "
       "of radius r₊ (docs/method.md (M3.1)–(M3.2)). The verdicts below are re-evaluated here from the stated "
       "(rounded-up) bounds in 256-bit interval arithmetic; p grows with Y0, Z and Z2, so a negative bound from "
       "rounded-up inputs is still a proof of the inequality.</p>\n";
  o << "<table id=\"proof\" "
       "class=\"data\"><tr><th>solution</th><th>Y0</th><th>Z0</th><th>Z1</th><th>Z2</th><th>‖A‖</th>"
       "<th>r₋ (existence)</th><th>r₊ (uniqueness)</th><th>Z &lt; 1</th><th>p(r₋) &lt; 0</th><th>modes / "
       "arithmetic</th></tr>\n";
  for (std::size_t k = 0; k < sols.size(); ++k) {
    const auto& s = sols[k];
    if (!s.certified) continue;
    const json& b = s.j["bounds"];
    if (s.st.method == "reduced-ivp") {  // docs/method.md (S10): the two inequalities of the reduced method
      o << "<tr><td>" << esc(solution_name(s, k, sols.size())) << "</td><td colspan=\"10\">reduced method: R(s_lo) in "
        << esc(b.contains("R(s_lo)") ? b["R(s_lo)"].dump() : "?") << ", R(s_hi) in "
        << esc(b.contains("R(s_hi)") ? b["R(s_hi)"].dump() : "?") << " (they straddle R: existence); dR/ds on S in "
        << esc(b.contains("dR/ds on S") ? b["dR/ds on S"].dump() : "?")
        << " (excludes 0: uniqueness for s in S); radii in s: " << esc(jstr(s.j, "existence_radius")) << " / "
        << esc(jstr(s.j, "uniqueness_radius")) << "</td></tr>\n";
      continue;
    }
    std::string zv = "unsure", pv = "unsure", pbound = "";
    {
      arith::PrecisionScope scope(256);
      try {
        const auto rd = [](const std::string& t) { return arith::from_decimal<arith::Im>(t); };
        const arith::Im Y0 = rd(b["Y0"].get<std::string>()), Z0 = rd(b["Z0"].get<std::string>()),
                        Z1 = rd(b["Z1"].get<std::string>()), Z2 = rd(b["Z2"].get<std::string>()),
                        r = rd(s.j["existence_radius"].get<std::string>());
        const arith::Im Z = boost::numeric::max(Z0, Z1);
        const arith::Im p = Z2 * r * r - (arith::Im(1) - Z) * r + Y0;
        zv = arith::to_string(arith::tri_less(Z, arith::Im(1)));
        pv = arith::to_string(arith::tri_negative(p));
        pbound = " (p ≤ " + arith::decimal_upper(p, 4) + ")";
      } catch (const std::exception&) {
      }
    }
    std::string modes = "—";
    if (s.j.contains("candidate") && s.j["candidate"].is_object()) {
      const json& c = s.j["candidate"];
      modes = (c.contains("modes") ? c["modes"].dump() : "?") + " / " + jstr(c, "arithmetic", "?");
      if (c.value("precision_bits", 53) > 53) modes += " " + c["precision_bits"].dump() + " bits";
    }
    o << "<tr><td>" << esc(solution_name(s, k, sols.size())) << "</td>";
    for (const char* key : {"Y0", "Z0", "Z1", "Z2"}) o << "<td class=\"iv\">" << esc(jstr(b, key)) << "</td>";
    o << "<td class=\"iv\">" << esc(jstr(b, "norm_A")) << "</td><td class=\"iv\">" << esc(jstr(s.j, "existence_radius"))
      << "</td><td class=\"iv\">" << esc(jstr(s.j, "uniqueness_radius")) << "</td><td class=\""
      << (zv == "yes" ? "ok" : "fail") << "\">" << zv << "</td><td class=\"" << (pv == "yes" ? "ok" : "fail") << "\">"
      << pv << esc(pbound) << "</td><td>" << esc(modes) << "</td></tr>\n";
  }
  o << "</table>\n<p class=\"note\">Consequences stated in the certificate: sup|f⁽ᵏ⁾ − f̄⁽ᵏ⁾| ≤ ";
  bool first = true;
  for (const auto& s : sols)
    if (s.certified) {
      if (!first) o << "; ";
      o << num(s.err[3], 3);
      first = false;
    }
  o << " (k = 0..3; for the porous pipe: sup|F⁽ᵏ⁾ − F̄⁽ᵏ⁾| on [0,1], k = 0..2, and sup|u − ū|, u = ξF''' + F'', "
       "in the ℓ¹ space of (F'(0), K, Taylor coefficients of u about ξ = 0), docs/models.md §2). “Unique” means unique "
       "in the stated ball, not globally.";
  for (const auto& s : sols)
    if (s.certified && s.j.contains("c3_uniqueness") && s.j["c3_uniqueness"].is_object() &&
        s.j["c3_uniqueness"].contains("uniqueness_radius"))
      o << " A direct contraction also proves uniqueness in a weighted C³ ball of radius "
        << esc(jstr(s.j["c3_uniqueness"], "uniqueness_radius")) << " about the candidate (docs/method.md (D25)).";
  o << "</p></section>\n";
  return o.str();
}

std::string dimensional_section(const std::vector<Solution>& sols) {
  std::ostringstream o;
  for (std::size_t k = 0; k < sols.size(); ++k) {
    const auto& s = sols[k];
    if (!s.certified || !s.channel) continue;
    const auto& c = *s.channel;
    o << "<section><h2>Dimensional results" << (sols.size() > 1 ? " — " + esc(solution_name(s, k, sols.size())) : "")
      << "</h2>\n<div class=\"twocol\"><table id=\"dim-inputs\" class=\"data\"><caption>Inputs (read exactly from the "
         "case file)</caption><tr><th>field</th><th>as given</th></tr>\n";
    for (const auto& [key, text] : c.given) o << "<tr><td>" << esc(key) << "</td><td>" << esc(text) << "</td></tr>\n";
    o << "<tr><td>R = V h / ν (U1)</td><td class=\"iv\">" << ival(model::reynolds(c), 12) << "</td></tr>\n</table>\n";
    o << "<table id=\"dimensional\" class=\"data\"><caption>Certified results at x = "
      << esc(c.given.at("axial_position"))
      << "</caption><tr><th>quantity</th><th>enclosure</th><th>unit</th><th>docs/units.md</th></tr>\n";
    const auto res = model::dimensional_results(c, s.val[0], s.val[2], s.val[3]);
    for (const auto& r : res)
      o << "<tr id=\"dim-" << r.key << "\"><td>" << esc(r.label) << " <i>" << esc(r.symbol)
        << "</i></td><td class=\"iv\">" << ival(r.value) << "</td><td>" << esc(r.unit) << "</td><td>" << esc(r.equation)
        << "</td></tr>\n";
    o << "</table></div>\n<p class=\"note\">Similarity form ψ = (h U₀ − V x) f(η), η = y/h: u = U(x) f'(η), v = V "
         "f(η), "
         "U(x) = U₀ − V x / h. τ_w = −μ U(x) f''(1) / h is the axial force per unit area the fluid exerts on a wall; "
         "dp/dx = μ U(x) K / h². Every entry is an interval computed from the certified enclosures and the exactly "
         "read inputs with outward rounding.</p></section>\n";
  }
  return o.str();
}

const char* kCss = R"CSS(
:root{--ink:#1d2a30;--muted:#5b6b73;--accent:#1f6f8b;--paper:#fbfaf6;--line:#d9d4c7;--ok:#2e7d32;--bad:#b3261e}
*{box-sizing:border-box}
body{margin:0;background:#ece8df;color:var(--ink);font:15px/1.5 "DejaVu Sans",system-ui,sans-serif}
header{background:linear-gradient(120deg,#12343b,#1f6f8b);color:#f4f1ea;padding:22px 36px 18px}
header h1{margin:0 0 4px;font-size:24px;font-weight:600;letter-spacing:.2px}
header .sub{opacity:.85;font-size:14px}
.chip{display:inline-block;padding:2px 10px;border-radius:11px;font-size:13px;font-weight:600;margin-right:8px}
.chip.ok{background:#d8f0d9;color:#14501a}.chip.bad{background:#f8d7d4;color:#7a1410}
main{max-width:1180px;margin:18px auto;padding:0 18px}
section{background:var(--paper);border:1px solid var(--line);border-radius:8px;padding:14px 20px;margin:0 0 16px}
h2{font-size:18px;margin:2px 0 10px;color:#12343b;border-bottom:2px solid var(--accent);display:table}
.plots{display:flex;flex-wrap:wrap;gap:12px}
svg.plot{width:540px;max-width:100%;height:auto;background:#fff;border:1px solid var(--line);border-radius:6px}
svg.plot.wide{width:700px}
.plotbg{fill:#fcfcfa;stroke:#b9b3a5}
.grid{stroke:#e6e1d6;stroke-width:1}.zero{stroke:#9aa5ab;stroke-dasharray:3 3}
.wall{stroke:#6b5e4b;stroke-width:3;stroke-dasharray:8 4}
.walltext{font-size:11px;fill:#6b5e4b}
.tick{font-size:11px;fill:var(--muted)}.axlabel{font-size:12.5px;fill:var(--ink)}
.ptitle{font-size:14px;font-weight:600;fill:#12343b}.legend{font-size:12px;fill:var(--ink)}
.tube{fill-opacity:.35;stroke-width:1}.curve{fill:none;stroke-width:1.6}
.box{fill:none;stroke-width:2}.boxlabel{font-size:13px;font-weight:700}
table.data{border-collapse:collapse;margin:8px 0;font-size:13px}
table.data th{background:#e9e4d8;text-align:left;padding:5px 8px;border-bottom:1px solid var(--line);vertical-align:bottom}
table.data td{padding:4px 8px;border-bottom:1px solid #eee9de;vertical-align:top}
table.data caption{text-align:left;font-weight:600;padding:4px 0;color:#12343b}
td.iv{font-family:"DejaVu Sans Mono",monospace;font-size:12px;word-break:break-all}
td.ok{color:var(--ok);font-weight:600}td.fail{color:var(--bad);font-weight:600}
.note{color:var(--muted);font-size:13px;max-width:1080px}
.twocol{display:flex;flex-wrap:wrap;gap:22px;align-items:flex-start}
#cautions{border-left:6px solid #c8553d;background:#fff6ee}
#cautions li{margin:4px 0}
details{font-size:13px;color:var(--muted)}
footer{color:var(--muted);font-size:12px;text-align:center;padding:8px 0 24px}
)CSS";

}  // namespace

ReportInput load(const std::string& path) {
  ReportInput in;
  in.top = certificate::read_file(path);
  const json& t = in.top;
  if (t.is_array()) {
    in.kind = "list";
    for (const auto& e : t) in.entries.push_back(e);
  } else if (t.is_object() && t.contains("solutions")) {
    if (!t["solutions"].is_array())
      throw format_error("report input: key \"solutions\" must be an array of certificates");
    in.kind = "branches";
    for (const auto& e : t["solutions"]) in.entries.push_back(e);
  } else if (t.is_object() && t.contains("certificates")) {
    if (!t["certificates"].is_array())
      throw format_error("report input: key \"certificates\" must be an array of certificates");
    in.kind = "list";
    for (const auto& e : t["certificates"]) in.entries.push_back(e);
  } else {
    in.kind = "certificate";
    in.entries.push_back(t);
  }
  if (in.entries.empty()) throw format_error("report input: '" + path + "' holds no certificates (rule: at least one)");
  if (in.entries.size() > 500)
    throw format_error("report input: '" + path + "' holds " + std::to_string(in.entries.size()) +
                       " certificates (rule: at most 500 per page)");
  read_all(in);  // validate everything now, so that bad input fails before any output
  return in;
}

Profile certified_profile(const json& cert) {
  const Solution s = read_solution(cert, "");
  if (!s.certified)
    throw format_error("certificate: status is \"" + s.st.status + "\" (rule: a profile needs a proof)");
  Profile p;
  for (int i = 0; i <= kSamples; ++i) p.eta.push_back(double(i) / kSamples);
  p.f = s.f;
  p.fp = s.fp;
  return p;
}

std::vector<std::string> expected_ids(const ReportInput& in) {
  const auto sols = read_all(in);
  std::vector<std::string> ids{"summary", "values", "cautions"};
  bool any = false, dim = false, prof = false, half = false;
  for (const auto& s : sols)
    any = any || s.certified, dim = dim || (s.certified && s.channel), prof = prof || (s.certified && s.has_profile),
    half = half || (s.certified && s.half);
  if (prof) ids.insert(ids.end(), {"plot-u", "plot-v", "profile-table"});
  if (any) ids.push_back("proof");
  if (dim) ids.push_back("dimensional");
  if (sols.size() > 1 && half) ids.push_back("plot-branches");
  return ids;
}

std::string render_html(const ReportInput& in, const std::string& source_name) {
  const auto sols = read_all(in);
  g_mixed_R = false;
  for (const auto& s : sols)
    g_mixed_R =
        g_mixed_R || s.st.problem.R_lo != sols[0].st.problem.R_lo || s.st.problem.R_hi != sols[0].st.problem.R_hi;
  std::size_t ncert = 0;
  for (const auto& s : sols) ncert += s.certified;
  std::string title = "porecert report";
  if (in.kind == "certificate" && in.top.contains("scenario") && in.top["scenario"].is_string())
    title = in.top["scenario"].get<std::string>();
  else if (in.kind == "branches")
    title = "All solutions found at R = " + R_text(sols[0].st);
  else if (in.kind == "list")
    title = std::to_string(sols.size()) + " certificates";
  std::ostringstream o;
  o << "<!DOCTYPE html>\n<html lang=\"en\"><head><meta charset=\"utf-8\">\n"
       "<meta name=\"viewport\" content=\"width=device-width, initial-scale=1\">\n"
       "<meta http-equiv=\"Content-Security-Policy\" content=\"default-src 'none'; style-src 'unsafe-inline'; "
       "script-src 'unsafe-inline'; img-src data:\">\n<title>"
    << esc(title) << " — porecert</title>\n<style>" << kCss << "</style></head><body>\n";
  o << "<header><h1>" << esc(title) << "</h1><div class=\"sub\"><span class=\"chip "
    << (ncert == sols.size() ? "ok" : "bad") << "\">" << ncert << " of " << sols.size() << " certified</span>"
    << "Berman's porous-wall channel flow, f'''' + R (f' f'' − f f''') = 0 on [0, 1]; source: " << esc(source_name)
    << "</div></header>\n<main>\n";
  // Summary.
  o << "<section id=\"summary\"><h2>Summary</h2><ul>";
  for (std::size_t k = 0; k < sols.size(); ++k) {
    const auto& s = sols[k];
    o << "<li><b>" << esc(solution_name(s, k, sols.size())) << "</b> at R = " << esc(R_text(s.st)) << ": "
      << (s.certified ? "certified" : "NOT certified");
    if (s.certified && s.j.contains("structure") && s.j["structure"].is_object())
      o << " — " << esc(jstr(s.j["structure"], "reason", ""));
    o << "</li>";
  }
  o << "</ul>";
  if (in.kind == "branches")
    o << "<p class=\"note\">Searched region: " << esc(jstr(in.top, "searched_region"))
      << ". Pairwise distinct (disjoint "
      << "enclosures): " << (in.top.value("pairwise_disjoint", false) ? "proved" : "not proved")
      << ". No claim is made about solutions outside the searched region.</p>";
  o << "</section>\n";
  bool any_half = false;
  for (const auto& s : sols) any_half = any_half || (s.certified && s.half);
  if (sols.size() > 1 && ncert > 0 && any_half)
    o << "<section id=\"branches\"><h2>Branch diagram</h2>" << branch_svg(sols) << "</section>\n";
  o << profiles_section(sols) << dimensional_section(sols) << values_section(sols);
  if (ncert > 0) o << proof_section(sols);
  o << "<section id=\"cautions\"><h2>Cautions</h2><ul>"
       "<li>porecert certifies <b>mathematics, not a plant</b>. The similarity solution assumes fully developed, "
       "steady, laminar, Newtonian, incompressible flow between parallel walls with uniform wall velocity, far from "
       "inlet and exit.</li>"
       "<li>Real channels have entrance regions, non-uniform permeation, fouling, roughness and possible instability "
       "(the symmetric solution can lose stability to asymmetric states, which the half-channel model cannot see).</li>"
       "<li>“Unique” means unique in the stated ball, not globally: for suction beyond R ≈ 12.165 there are several "
       "solutions.</li>"
       "<li>Before any number here feeds a design, defer to local codes and licensed engineering practice.</li>"
       "</ul></section>\n";
  o << "<details><summary>Attempt log</summary><pre>";
  for (const auto& s : sols)
    if (s.j.contains("log") && s.j["log"].is_array())
      for (const auto& l : s.j["log"])
        if (l.is_string()) o << esc(l.get<std::string>()) << "\n";
  o << "</pre></details>\n</main>\n<footer>porecert report · self-contained page (no network) · "
       "<span id=\"render-check\" data-status=\"pending\">render check pending</span></footer>\n";
  // A self-check for headless renderers: every expected element present and the plots laid out.
  o << "<script>(function(){var ids=[";
  const auto ids = expected_ids(in);
  for (std::size_t i = 0; i < ids.size(); ++i) o << (i ? "," : "") << "\"" << ids[i] << "\"";
  o << "];var bad=ids.filter(function(i){var e=document.getElementById(i);if(!e)return true;"
       "if(e.getBBox){var b=e.getBoundingClientRect();return !(b.width>0&&b.height>0);}return false;});"
       "var c=document.getElementById('render-check');c.setAttribute('data-status',bad.length?'missing':'ok');"
       "c.textContent=bad.length?('missing: '+bad.join(' ')):'render check ok';})();</script>\n";
  o << "</body></html>\n";
  return o.str();
}

}  // namespace porecert::report
