#include "candidate/import.hpp"

#include <algorithm>
#include <fstream>
#include <nlohmann/json.hpp>
#include <sstream>

#include "arith/fp_env.hpp"
#include "model/berman.hpp"

namespace porecert::candidate {

using model::input_error;

namespace {

std::string trim(const std::string& s) {
  const auto b = s.find_first_not_of(" \t\r\n");
  if (b == std::string::npos) return "";
  const auto e = s.find_last_not_of(" \t\r\n");
  std::string t = s.substr(b, e - b + 1);
  if (t.size() >= 2 && t.front() == '"' && t.back() == '"') t = t.substr(1, t.size() - 2);
  return t;
}

std::vector<std::string> split(const std::string& line) {
  std::vector<std::string> out;
  std::string cur;
  std::istringstream in(line);
  while (std::getline(in, cur, ',')) out.push_back(trim(cur));
  if (!line.empty() && line.back() == ',') out.push_back("");
  return out;
}

// Decimal text → enclosure; the caller names the place in the message.
arith::Id number(const std::string& text, const std::string& where) {
  try {
    return arith::from_decimal<arith::Id>(text);
  } catch (const std::invalid_argument&) {
    throw input_error(where + ": '" + text + "' is not a finite decimal number (rule: finite numbers only)");
  }
}

template <class S>
S from_text(const std::string& t) {
  if constexpr (arith::Interval<S>) {
    return arith::from_decimal<S>(t);
  } else {
    return arith::mid_double(arith::from_decimal<arith::Id>(t));
  }
}

// p(t) ← p(t)·(t − z) + c, monomial coefficients (lowest first).
template <class S>
void times_linear_plus(std::array<S, 4>& p, int& deg, const S& z, const S& c) {
  std::array<S, 4> q{S(0), S(0), S(0), S(0)};
  for (int i = 0; i <= deg; ++i) {
    q[i + 1] = q[i + 1] + p[i];
    q[i] = q[i] - z * p[i];
  }
  q[0] = q[0] + c;
  p = q;
  ++deg;
}

}  // namespace

Submission read_csv(const std::string& path) {
  std::ifstream file(path, std::ios::binary);
  if (!file) throw input_error("CSV '" + path + "': cannot read the file");
  std::stringstream ss;
  ss << file.rdbuf();
  return read_csv_text(ss.str(), path);
}

Submission read_csv_text(std::string_view text, const std::string& path) {
  const arith::FpEnvScope fp_env;  // caller's rounding mode and flags restored on exit (arith/fp_env.hpp)
  std::istringstream in{std::string(text)};
  Submission s;
  s.kind = Submission::Kind::csv;
  s.source = path;
  std::string line;
  int lineno = 0;
  std::vector<int> role;  // per column: -1 = x, 0..3 = derivative order
  while (std::getline(in, line)) {
    ++lineno;
    const std::string t = trim(line);
    if (t.empty() || t[0] == '#') continue;
    for (const std::string& name : split(line)) {
      int r = -2;
      if (name == "x") r = -1;
      for (int k = 0; k < 4; ++k)
        if (name == kColumnNames[k]) r = k;
      if (r == -2)
        throw input_error("CSV '" + path + "' line " + std::to_string(lineno) + ": header column '" + name +
                          "' is not one of x, f, f', f'', f''' (rule: the first non-comment line names the columns)");
      if (std::find(role.begin(), role.end(), r) != role.end())
        throw input_error("CSV '" + path + "' line " + std::to_string(lineno) + ": header column '" + name +
                          "' appears twice (rule: each column at most once)");
      role.push_back(r);
    }
    break;
  }
  if (role.empty()) throw input_error("CSV '" + path + "': no header line (rule: a header naming x, f, ...)");
  if (std::find(role.begin(), role.end(), -1) == role.end())
    throw input_error("CSV '" + path + "' header: column 'x' is missing (rule: x and f are required)");
  if (std::find(role.begin(), role.end(), 0) == role.end())
    throw input_error("CSV '" + path + "' header: column 'f' is missing (rule: x and f are required)");
  for (int r : role)
    if (r >= 0) s.column[r].emplace();
  int row = 0;
  arith::Id prev_x;
  while (std::getline(in, line)) {
    ++lineno;
    const std::string t = trim(line);
    if (t.empty() || t[0] == '#') continue;
    ++row;
    if (row > kCsvMaxRows)
      throw input_error("CSV '" + path + "': more than " + std::to_string(kCsvMaxRows) + " rows (rule: at most " +
                        std::to_string(kCsvMaxRows) + ")");
    const auto fields = split(line);
    const std::string where =
        "CSV '" + path + "' row " + std::to_string(row) + " (line " + std::to_string(lineno) + ")";
    if (fields.size() != role.size())
      throw input_error(where + ": " + std::to_string(fields.size()) + " fields, the header has " +
                        std::to_string(role.size()) + " (rule: every row has one value per header column)");
    for (std::size_t c = 0; c < fields.size(); ++c) {
      const std::string name = role[c] < 0 ? "x" : kColumnNames[role[c]];
      const arith::Id v = number(fields[c], where + ", column " + name);
      if (role[c] < 0) {
        if (row == 1 && !(v.lower() == 0 && v.upper() == 0))
          throw input_error(where + ", column x: first x is '" + fields[c] +
                            "' (rule: the mesh covers [0, 1]: first x = 0 exactly)");
        if (row > 1 && !(prev_x.upper() < v.lower()))
          throw input_error(where + ", column x: '" + fields[c] + "' is not above the previous x '" + s.x.back() +
                            "' (rule: x strictly increasing)");
        if (v.upper() > 1)
          throw input_error(where + ", column x: '" + fields[c] + "' is above 1 (rule: the mesh lies in [0, 1])");
        prev_x = v;
        s.x.push_back(fields[c]);
      } else {
        s.column[role[c]]->push_back(fields[c]);
      }
    }
  }
  if (row < kCsvMinRows)
    throw input_error("CSV '" + path + "': " + std::to_string(row) + " data rows (rule: at least " +
                      std::to_string(kCsvMinRows) + ")");
  if (!(prev_x.lower() == 1 && prev_x.upper() == 1))
    throw input_error("CSV '" + path + "' row " + std::to_string(row) + ", column x: last x is '" + s.x.back() +
                      "' (rule: the mesh covers [0, 1]: last x = 1 exactly)");
  return s;
}

Submission read_chebyshev_json(const std::string& path) {
  std::ifstream in(path);
  if (!in) throw input_error("Chebyshev file '" + path + "': cannot read the file");
  std::stringstream ss;
  ss << in.rdbuf();
  nlohmann::json j;
  try {
    j = nlohmann::json::parse(ss.str());
  } catch (const nlohmann::json::parse_error& e) {
    throw input_error("Chebyshev file '" + path + "': not valid JSON: " + e.what());
  }
  const std::string where = "Chebyshev file '" + path + "'";
  if (!j.is_object()) throw input_error(where + ": must be a JSON object");
  for (auto it = j.begin(); it != j.end(); ++it)
    if (it.key() != "series_of" && it.key() != "coefficients" && it.key() != "comment")
      throw input_error(where + ": unknown key \"" + it.key() + "\" (allowed: series_of, coefficients, comment)");
  if (!j.contains("series_of") || j["series_of"] != "f")
    throw input_error(where + ": key \"series_of\" must be \"f\" (the series is of f itself)");
  if (!j.contains("coefficients") || !j["coefficients"].is_array())
    throw input_error(where + ": key \"coefficients\" is missing or not an array");
  Submission s;
  s.kind = Submission::Kind::chebyshev;
  s.source = path;
  int k = 0;
  for (const auto& c : j["coefficients"]) {
    const std::string w = where + ", coefficients[" + std::to_string(k) + "]";
    if (!c.is_string())
      throw input_error(w + ": " + c.dump() +
                        " is a JSON number, which would be rounded to binary (rule: decimal or hex strings, e.g. "
                        "\"0.75\")");
    number(c.get<std::string>(), w);
    s.coefficients.push_back(c.get<std::string>());
    ++k;
  }
  if (k < 4 || k > 10000)
    throw input_error(where + ": " + std::to_string(k) + " coefficients (rule: between 4 and 10000)");
  return s;
}

Submission shooting(const std::string& a, const std::string& b) {
  number(a, "candidate.start[0] (f'(0))");
  number(b, "candidate.start[1] (f'''(0))");
  Submission s;
  s.kind = Submission::Kind::shooting;
  s.source = "start";
  s.a = a;
  s.b = b;
  return s;
}

template <class S>
std::vector<Piece<S>> pieces(const Submission& s, int k) {
  assert(s.kind == Submission::Kind::csv && s.column[k]);
  const int n = static_cast<int>(s.x.size());
  std::vector<S> X(n), Y(n), Dy;
  for (int i = 0; i < n; ++i) {
    X[i] = from_text<S>(s.x[i]);
    Y[i] = from_text<S>((*s.column[k])[i]);
  }
  const bool hermite = k < 3 && s.column[k + 1].has_value();
  if (hermite) {
    Dy.resize(n);
    for (int i = 0; i < n; ++i) Dy[i] = from_text<S>((*s.column[k + 1])[i]);
  }
  std::vector<Piece<S>> out;
  for (int i = 0; i + 1 < n; ++i) {
    Piece<S> p{X[i], X[i + 1], {S(0), S(0), S(0), S(0)}};
    if (hermite) {  // (R1)
      const S h = X[i + 1] - X[i];
      const S slope = (Y[i + 1] - Y[i]) / h;
      p.c = {Y[i], Dy[i], (S(3) * slope - S(2) * Dy[i] - Dy[i + 1]) / h, (Dy[i] + Dy[i + 1] - S(2) * slope) / (h * h)};
    } else {  // (R2): cubic through the four nodes j0..j0+3 nearest the piece, Newton form
      const int j0 = std::clamp(i - 1, 0, n - 4);
      std::array<S, 4> z, dd;
      for (int q = 0; q < 4; ++q) {
        z[q] = X[j0 + q] - X[i];
        dd[q] = Y[j0 + q];
      }
      for (int level = 1; level < 4; ++level)
        for (int q = 3; q >= level; --q) dd[q] = (dd[q] - dd[q - 1]) / (z[q] - z[q - level]);
      std::array<S, 4> c{dd[3], S(0), S(0), S(0)};
      int deg = 0;
      for (int q = 2; q >= 0; --q) times_linear_plus(c, deg, z[q], dd[q]);
      p.c = c;
    }
    out.push_back(p);
  }
  return out;
}

template <class S>
S piece_eval(const Piece<S>& p, const S& eta, int j) {
  std::array<S, 4> c = p.c;
  for (int d = 0; d < j; ++d) {
    for (int i = 0; i < 3; ++i) c[i] = S(i + 1) * c[i + 1];
    c[3] = S(0);
  }
  const S t = eta - p.x0;
  return c[0] + t * (c[1] + t * (c[2] + t * c[3]));
}

template std::vector<Piece<double>> pieces<double>(const Submission&, int);
template std::vector<Piece<arith::Id>> pieces<arith::Id>(const Submission&, int);
template double piece_eval<double>(const Piece<double>&, const double&, int);
template arith::Id piece_eval<arith::Id>(const Piece<arith::Id>&, const arith::Id&, int);

ImportReport candidate_from(const Submission& s, double R, int max_modes) {
  const model::Model<double> md = model::berman<double>(R);
  ImportReport rep;
  const int ns = md.n_scalars();
  Vec x;
  if (s.kind == Submission::Kind::shooting) {
    x = guess_from_shooting(md, from_text<double>(s.a), from_text<double>(s.b), 32);
    rep.log.push_back("candidate from shooting data f'(0) = " + s.a + ", f'''(0) = " + s.b + " (RK4, then Newton)");
  } else {
    double fp0 = 0;
    cheb::Series<double> u;
    if (s.kind == Submission::Kind::chebyshev) {
      cheb::Series<double> F;
      for (const auto& c : s.coefficients) F.push_back(from_text<double>(c));
      const auto F1 = cheb::derivative(F);
      fp0 = cheb::value_at_0(F1);
      u = cheb::derivative(cheb::derivative(F1));
      rep.log.push_back("candidate from " + std::to_string(F.size()) + " Chebyshev coefficients of f");
    } else {
      // f''' at Chebyshev points from the highest column present, differentiated as needed.
      int k = 3;
      while (!s.column[k]) --k;
      const auto P = pieces<double>(s, k);
      const int n = 48;
      const auto pts = cheb::chebyshev_points<double>(n);
      std::vector<double> vals(n);
      for (int q = 0; q < n; ++q) {
        auto it =
            std::upper_bound(P.begin(), P.end(), pts[q], [](double e, const Piece<double>& p) { return e < p.x1; });
        if (it == P.end()) --it;
        vals[q] = piece_eval(*it, pts[q], 3 - k);
      }
      u = cheb::coeffs_from_values(vals);
      fp0 = s.column[1] ? from_text<double>((*s.column[1])[0]) : piece_eval(pieces<double>(s, 0).front(), 0.0, 1);
      rep.log.push_back("candidate from " + std::to_string(s.x.size()) + " CSV rows: f''' at " + std::to_string(n) +
                        " Chebyshev points from column " + kColumnNames[k]);
    }
    if (u.size() < 24) u.resize(24, 0.0);
    x.assign(ns + u.size(), 0.0);
    x[md.free_index(1)] = fp0;
    x[md.k_index()] = cheb::value_at_0(u) + R * fp0 * fp0;  // (M2.1) at η = 0, where f = 0
    std::copy(u.begin(), u.end(), x.begin() + ns);
  }
  rep.x_as_submitted = x;
  const NewtonReport nr = solve_with_decay(md, x, std::max(32, modes_of(md, x)), max_modes);
  rep.converged = nr.converged;
  rep.x = nr.converged ? nr.x : x;
  rep.log.push_back(nr.converged ? "Newton refinement converged in " + std::to_string(nr.iterations) + " iterations, " +
                                       std::to_string(modes_of(md, nr.x)) + " modes"
                                 : "Newton refinement did not converge: " + nr.note);
  return rep;
}

}  // namespace porecert::candidate
