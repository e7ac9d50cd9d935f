// Certificates: JSON documents complete enough to be re-checked from their own content
// (docs/certificate.md). Writing is atomic (temp file + rename): a failure loses nothing.
#pragma once
#include <nlohmann/json.hpp>
#include <optional>
#include <string>

#include "proof/certify.hpp"

namespace porecert::certificate {

inline constexpr const char* kFormat = "porecert-certificate";
inline constexpr int kFormatVersion = 1;

struct Problem {
  std::string R_lo, R_hi;  // decimal strings as given
  std::string branch;      // "I", "II", "III" or "" (unlabelled)
  std::string scenario;    // case title, if any
};

nlohmann::json to_json(const Problem& p, const proof::CertifyOutcome& o);

// Thrown for a malformed or truncated certificate; the message names the key and the rule.
struct format_error : std::runtime_error {
  using std::runtime_error::runtime_error;
};

// Reads and validates the fixed keys; throws format_error (and nothing else: docs/soundness.md).
// The proof's radii about x(R) = x̄ + (R − R0) x1 of an interval box (docs/method.md (M3.11)).
struct MovingCentre {
  double R0 = 0, existence_radius = 0, uniqueness_radius = 0;
};

struct Stored {
  Problem problem;
  std::string status;
  int precision_bits = 53;
  std::vector<std::string> candidate_hex;
  std::vector<std::string> tangent_hex;  // predictor of an interval box (docs/method.md (M3.11)); may be empty
  double existence_radius = 0;
  std::optional<MovingCentre> moving_centre;  // with a tangent; older certificates may lack it
  std::string method = "newton-kantorovich";         // or "reduced-ivp"
  int eps = 1, nth = 1;                              // reduced-ivp: branch data
  std::array<std::string, 4> reduced_s;              // reduced-ivp: s_lo, s_hi, S_lo, S_hi
  std::array<std::array<std::string, 2>, 4> values;  // f'(0), f'''(0), f''(1), K (half-channel models)
  model::ModelSpec model;                            // from problem.model_name / model_parameters
  std::vector<std::pair<std::string, std::array<std::string, 2>>> named_values;  // every `values` entry
};
Stored parse(const nlohmann::json& j);
nlohmann::json read_file(const std::string& path);  // throws format_error on unreadable / invalid JSON
// JSON text → document; source names it in messages (fuzz target tests/fuzz/fuzz_certificate.cpp).
nlohmann::json parse_text(const std::string& text, const std::string& source);

// Writes text to path ("-" = stdout) atomically; throws model::input_error naming the path (exit 2)
// when it cannot, and then leaves no temporary file and the old content of path as it was.
void write_atomic(const std::string& path, const std::string& text);
// Early check of an output path (same rule and message as write_atomic): creates and removes the
// temporary file only, so a run that would end in an unwritable path fails before it starts.
void check_output(const std::string& path);

inline const char* kCaution =
    "Certifies mathematics, not a plant. The similarity model assumes fully developed, steady, laminar, "
    "Newtonian flow with uniform wall velocity, far from inlet and exit. Defer to local codes and licensed "
    "engineering practice before using any number here in a design.";

}  // namespace porecert::certificate
