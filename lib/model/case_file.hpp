// Case files (TOML, porecert's own layout; docs/case-files.md). Decimals are read as strings
// so that they are exact: a TOML float is refused with a message saying how to write it.
#pragma once
#include <map>
#include <optional>
#include <stdexcept>
#include <string>
#include <string_view>
#include <utility>
#include <vector>

namespace porecert::model {

// Bad input in a case file or on the command line: names the field, the value and the rule.
struct input_error : std::runtime_error {
  using std::runtime_error::runtime_error;
};

struct CaseSettings {
  std::string title, description;
  std::optional<std::pair<std::string, std::string>> R;  // [lo, hi] decimal strings
  std::optional<std::string> branch;
  std::optional<std::pair<double, double>> start;
  std::optional<int> modes, precision_bits;
  std::optional<std::string> certificate;  // output path (relative to the working directory)
  // [model] table (docs/models.md): name and parameters as decimal strings.
  std::optional<std::string> model_name;
  std::vector<std::pair<std::string, std::string>> model_params;
  // [channel]: dimensional inputs as given ("1.5 mm"); when present, R is derived from them
  // (docs/units.md) and `R` holds the outward decimal ends of R = V h / nu.
  std::map<std::string, std::string> channel;
};

// Parses a case file; throws input_error naming the field (and nothing else: docs/soundness.md).
CaseSettings read_case_file(const std::string& path);
// The same from the file's text; source names it in messages (fuzz target tests/fuzz/fuzz_case_file.cpp).
CaseSettings read_case_text(std::string_view text, const std::string& source);

// "VALUE" or "LO:HI" → [lo, hi], checked: finite decimals, lo ≤ hi, |R| ≤ 1e5.
std::pair<std::string, std::string> parse_R(const std::string& field, const std::string& text);
// Checks a [lo, hi] pair of decimal strings by the same rules.
void check_R(const std::string& field, const std::string& lo, const std::string& hi);

}  // namespace porecert::model
