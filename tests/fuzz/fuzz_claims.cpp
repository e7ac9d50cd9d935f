// libFuzzer target: the claims-file reader (lib/model/claims_file.hpp: read_claims_text, what
// `porecert check` reads before any proof). Any bytes must end in a ClaimsFile that obeys the
// reader's rules or in model::input_error; any other exception, a crash, a leak or undefined
// behaviour (ASan/UBSan) is a finding, and so is a key of the file that was accepted but not used
// (a wrong type or a key of another kind of claim ignored in silence). Corpus: tests/fuzz/corpus/claims/.
#include <toml++/toml.h>

#include <algorithm>
#include <cstddef>
#include <cstdint>
#include <cstdlib>
#include <set>
#include <string>
#include <string_view>

#include "arith/interval.hpp"
#include "model/claims_file.hpp"

namespace {
using namespace porecert;
arith::Id num(const std::string& s) { return arith::from_decimal<arith::Id>(s); }  // throws = finding
// The keys each kind of claim uses (docs/reviewing.md §3); any other key present is a finding.
std::set<std::string> keys_of(model::Claim::Kind k) {
  using K = model::Claim::Kind;
  switch (k) {
    case K::value:
      return {"quantity", "value", "tolerance", "relative_tolerance", "note"};
    case K::bound:
      return {"quantity", "below", "above", "note"};
    case K::sign:
      return {"property", "on", "note"};
    case K::unique:
      return {"property", "radius", "about", "note"};
    default:
      return {"property", "exactly", "at_least", "note"};
  }
}
}  // namespace

extern "C" int LLVMFuzzerTestOneInput(const std::uint8_t* data, std::size_t size) {
  const std::string_view text(reinterpret_cast<const char*>(data), size);
  try {
    const std::string path = "fuzz/claims.toml";
    const model::ClaimsFile f = model::read_claims_text(text, path);
    // What the reader accepted must satisfy its documented rules.
    const arith::Id lo = num(f.R_lo), hi = num(f.R_hi);
    if (!(lo.lower() <= hi.upper()) || lo.lower() < -1e5 || hi.upper() > 1e5) std::abort();
    if (int(f.csv.has_value()) + f.chebyshev.has_value() + f.start.has_value() + f.branch.has_value() != 1)
      std::abort();
    if (f.branch && *f.branch != "I") std::abort();
    if (f.start) (void)num(f.start->first), (void)num(f.start->second);
    if (f.modes != 0 && (f.modes < 8 || f.modes > 4000)) std::abort();
    if (f.precision_bits != 0 && (f.precision_bits < 53 || f.precision_bits > 4096)) std::abort();
    if (f.claims.empty()) std::abort();
    // Each key of the file was used: read the same text with toml++ and compare.
    const toml::table t = toml::parse(text, path);
    const toml::table& cand = *t["candidate"].as_table();
    if (cand.contains("modes") && !(cand["modes"].is_integer() && *cand["modes"].value<std::int64_t>() == f.modes))
      std::abort();
    if (cand.contains("precision_bits") &&
        !(cand["precision_bits"].is_integer() && *cand["precision_bits"].value<std::int64_t>() == f.precision_bits))
      std::abort();
    if (cand.contains("csv") != f.csv.has_value() || cand.contains("chebyshev") != f.chebyshev.has_value() ||
        cand.contains("start") != f.start.has_value() || cand.contains("branch") != f.branch.has_value())
      std::abort();
    const toml::array& arr = *t["claim"].as_array();
    if (arr.size() != f.claims.size()) std::abort();
    for (std::size_t i = 0; i < f.claims.size(); ++i) {
      const model::Claim& c = f.claims[i];
      const toml::table& tc = *arr.get(i)->as_table();
      if (c.index != static_cast<int>(i) + 1 || c.text.empty()) std::abort();
      const std::set<std::string> used = keys_of(c.kind);
      for (auto&& [k, v] : tc)
        if (!used.count(std::string(k.str()))) std::abort();
      switch (c.kind) {
        case model::Claim::Kind::value:
          (void)num(c.value);
          if (!(num(c.tolerance).lower() >= 0)) std::abort();
          [[fallthrough]];
        case model::Claim::Kind::bound: {  // a value key of the file's model ([model] table; default Berman)
          bool known = false;
          for (const auto& vk : model::value_keys_of(f.model)) known = known || vk.key == c.quantity;
          if (!known) std::abort();
        }
          if (c.kind == model::Claim::Kind::bound) (void)num(c.bound);
          break;
        case model::Claim::Kind::sign: {
          if (c.order < 0 || c.order > 3) std::abort();
          const arith::Id a = num(c.a), b = num(c.b);
          if (!(0 <= a.lower() && a.upper() < b.lower() && b.upper() <= 1)) std::abort();
          if (tc.contains("on") && !tc["on"].is_string()) std::abort();
          break;
        }
        case model::Claim::Kind::unique:
          if (!(num(c.radius).lower() > 0)) std::abort();
          if (tc.contains("about") &&
              !(tc["about"].is_string() && (*tc["about"].value<std::string>() == "candidate") == c.about_candidate))
            std::abort();
          break;
        case model::Claim::Kind::solutions: {
          const char* key = c.exactly ? "exactly" : "at_least";
          if (c.count < 0 || c.count > 100 || !tc[key].is_integer() || *tc[key].value<std::int64_t>() != c.count)
            std::abort();
          break;
        }
      }
    }
  } catch (const model::input_error&) {
    // the documented outcome for bad input
  }
  return 0;
}
