// Claims files (TOML, porecert's own layout; docs/reviewing.md §3): the problem, where the
// candidate comes from, and the claims to judge. Decimals are strings (read exactly); TOML
// floats are refused; every error names the table / key, the value and the rule (exit 2).
#pragma once
#include <optional>
#include <string>
#include <string_view>
#include <utility>
#include <vector>

#include "model/case_file.hpp"
#include "model/model_spec.hpp"

namespace porecert::model {

struct Claim {
  enum class Kind { value, bound, sign, unique, solutions } kind = Kind::value;
  int index = 0;     // 1-based position among the [[claim]] tables
  std::string text;  // the claim in words, for reports
  // value / bound: one of the model's value keys (Berman: f'(0), f'''(0), f''(1), K; docs/models.md §0).
  std::string quantity;
  std::string value, tolerance = "0";  // value claims: |true − value| ≤ tolerance ...
  bool relative = false;               // ... or ≤ tolerance·|value| (relative_tolerance)
  std::string bound;                   // bound claims: true < bound (below) or > bound (above)
  bool below = true;
  // sign: f^{(order)} > 0 (positive) or < 0 on the interval from a to b, ends open or closed.
  int order = 0;
  bool positive = true;
  std::string a = "0", b = "1";
  bool a_closed = true, b_closed = true;
  // unique: the only solution within radius of the true solution (about = "solution") or of the
  // candidate (about = "candidate"), in the certificate's norm.
  std::string radius;
  bool about_candidate = false;
  // solutions: the branch search finds exactly / at least `count` distinct certified solutions.
  int count = 0;
  bool exactly = true;
};

struct ClaimsFile {
  std::string path;
  std::string R_lo, R_hi;
  ModelSpec model;  // [model] table (checked); default Berman
  // Exactly one candidate source.
  std::optional<std::string> csv, chebyshev;  // paths, resolved relative to the claims file
  std::optional<std::pair<std::string, std::string>> start;
  std::optional<std::string> branch;
  int modes = 0, precision_bits = 0;
  std::vector<Claim> claims;
};

// Reads a claims file; throws input_error naming the table / key, the value and the rule.
ClaimsFile read_claims_file(const std::string& path);
// The same from the file's text; path names it in messages and is the directory that csv / chebyshev
// paths are resolved against (fuzz target tests/fuzz/fuzz_claims.cpp).
ClaimsFile read_claims_text(std::string_view text, const std::string& path);

inline constexpr const char* kValueKeys[4] = {"f'(0)", "f'''(0)", "f''(1)", "K"};

}  // namespace porecert::model
