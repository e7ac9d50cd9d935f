#include "model/units.hpp"

#include <cctype>
#include <vector>

#include "model/case_file.hpp"

namespace porecert::model {

namespace {
using arith::Id;

struct Symbol {
  const char* name;
  const char* factor;  // SI value of one unit, as a decimal (read with from_decimal: an enclosure)
  Dim dim;
};
// Whole symbols are tried before prefix + symbol, so "min" is a minute and "mm" a millimetre.
const Symbol kSymbols[] = {
    {"m", "1", {1, 0, 0}},     {"g", "1e-3", {0, 1, 0}},   {"s", "1", {0, 0, 1}},    {"min", "60", {0, 0, 1}},
    {"h", "3600", {0, 0, 1}},  {"L", "1e-3", {3, 0, 0}},   {"Pa", "1", {-1, 1, -2}}, {"N", "1", {1, 1, -2}},
    {"P", "0.1", {-1, 1, -1}}, {"St", "1e-4", {2, 0, -1}},
};
struct Prefix {
  const char* name;
  const char* factor;
};
const Prefix kPrefixes[] = {{"G", "1e9"},  {"M", "1e6"},         {"k", "1e3"},         {"c", "1e-2"}, {"m", "1e-3"},
                            {"u", "1e-6"}, {"\xC2\xB5", "1e-6"}, {"\xCE\xBC", "1e-6"}, {"n", "1e-9"}, {"p", "1e-12"}};
const char* kRule =
    "units are SI symbols m, g, s, min, h, L, Pa, N, P, St with prefixes G M k c m u n p, combined with "
    "spaces, '*' or '/' and integer powers '^N', e.g. \"1.5 mm\", \"20 um/s\", \"1.0e-6 m^2/s\", \"1 mPa s\"";

[[noreturn]] void bad(const std::string& field, const std::string& text, const std::string& why) {
  throw input_error(field + ": '" + text + "': " + why + " (rule: " + kRule + ")");
}

// One factor "prefix symbol" (no power): its SI value and dimension, or false.
bool lookup(const std::string& tok, Id& factor, Dim& dim) {
  for (const auto& s : kSymbols)
    if (tok == s.name) {
      factor = arith::from_decimal<Id>(s.factor);
      dim = s.dim;
      return true;
    }
  for (const auto& p : kPrefixes) {
    const std::string pn = p.name;
    if (tok.size() <= pn.size() || tok.compare(0, pn.size(), pn) != 0) continue;
    const std::string rest = tok.substr(pn.size());
    for (const auto& s : kSymbols)
      if (rest == s.name && rest != "min" && rest != "h") {  // no "kmin", "mh"
        factor = arith::from_decimal<Id>(p.factor) * arith::from_decimal<Id>(s.factor);
        dim = s.dim;
        return true;
      }
  }
  return false;
}
}  // namespace

std::string dim_text(const Dim& d) {
  static const char* names[3] = {"m", "kg", "s"};
  std::string out;
  for (int i = 0; i < 3; ++i) {
    if (d[i] == 0) continue;
    if (!out.empty()) out += " ";
    out += names[i];
    if (d[i] != 1) out += "^" + std::to_string(d[i]);
  }
  return out.empty() ? "1 (dimensionless)" : out;
}

Quantity parse_quantity(const std::string& field, const std::string& text) {
  std::size_t i = 0;
  const std::size_t n = text.size();
  while (i < n && std::isspace(static_cast<unsigned char>(text[i]))) ++i;
  const std::size_t num_begin = i;
  if (i < n && (text[i] == '+' || text[i] == '-')) ++i;
  bool digits = false;
  while (i < n && std::isdigit(static_cast<unsigned char>(text[i]))) ++i, digits = true;
  if (i < n && text[i] == '.') {
    ++i;
    while (i < n && std::isdigit(static_cast<unsigned char>(text[i]))) ++i, digits = true;
  }
  if (!digits) bad(field, text, "no number at the start");
  if (i < n && (text[i] == 'e' || text[i] == 'E')) {
    std::size_t j = i + 1;
    if (j < n && (text[j] == '+' || text[j] == '-')) ++j;
    if (j < n && std::isdigit(static_cast<unsigned char>(text[j]))) {
      while (j < n && std::isdigit(static_cast<unsigned char>(text[j]))) ++j;
      i = j;
    }
  }
  Quantity q;
  try {
    q.si = arith::from_decimal<Id>(text.substr(num_begin, i - num_begin));
  } catch (const std::invalid_argument& e) {
    bad(field, text, e.what());
  }
  // Units: tokens separated by spaces, '*', '.' or '/'; '/' makes the next factor a divisor.
  bool any = false, divide = false;
  while (i < n) {
    const char c = text[i];
    if (std::isspace(static_cast<unsigned char>(c)) || c == '*' || c == '.') {
      ++i;
      continue;
    }
    if (c == '/') {
      if (divide) bad(field, text, "two '/' in a row");
      divide = true;
      ++i;
      continue;
    }
    std::size_t j = i;
    while (j < n && !std::isspace(static_cast<unsigned char>(text[j])) && text[j] != '*' && text[j] != '.' &&
           text[j] != '/' && text[j] != '^')
      ++j;
    const std::string tok = text.substr(i, j - i);
    Id factor;
    Dim dim{};
    if (tok.empty() || !lookup(tok, factor, dim)) bad(field, text, "unknown unit '" + tok + "'");
    int power = 1;
    if (j < n && text[j] == '^') {
      std::size_t k = j + 1;
      const bool neg = k < n && text[k] == '-';
      if (neg || (k < n && text[k] == '+')) ++k;
      if (!(k < n && std::isdigit(static_cast<unsigned char>(text[k])))) bad(field, text, "'^' needs an integer power");
      power = text[k] - '0';
      ++k;
      if (k < n && std::isdigit(static_cast<unsigned char>(text[k]))) bad(field, text, "power out of range -9..9");
      if (neg) power = -power;
      j = k;
    }
    if (power == 0) bad(field, text, "power 0");
    if (divide) power = -power;
    divide = false;
    for (int p = 0; p < std::abs(power); ++p) q.si = power > 0 ? q.si * factor : q.si / factor;
    for (int d = 0; d < 3; ++d) q.dim[d] += dim[d] * power;
    any = true;
    i = j;
  }
  if (divide) bad(field, text, "'/' with nothing after it");
  if (!any) bad(field, text, "no unit given");
  return q;
}

Id parse_quantity_as(const std::string& field, const std::string& text, const Dim& want, const std::string& what) {
  const Quantity q = parse_quantity(field, text);
  if (q.dim != want)
    throw input_error(field + ": '" + text + "' has dimension " + dim_text(q.dim) + "; it must be " + what + " (" +
                      dim_text(want) + ")");
  return q.si;
}

}  // namespace porecert::model
