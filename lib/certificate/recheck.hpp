// Independent re-check of a certificate (docs/certificate.md, docs/reviewing.md §4): the proof is
// re-run from the stored candidate along the MPFR path at a precision different from the stored
// one (53 → 128 bits; b → b + 64), and every stored number is compared with the re-derived one:
// bounds Y0, Z0, Z1, Z2, norm_A (stored upper bounds must be ≥ the recomputed ones), the radii
// (consistent with the recomputed radii polynomial), the four C3 error bounds and the four value
// enclosures (stored must contain recomputed). Trusts none of the stored numbers.
#pragma once
#include <nlohmann/json.hpp>
#include <string>
#include <vector>

#include "certificate/certificate.hpp"

namespace porecert::certificate {

struct RecheckField {
  std::string field;  // e.g. "bounds.Y0", "values.f''(1)"
  bool ok = false;
  std::string detail;  // stored vs recomputed
};

struct RecheckReport {
  bool proof_ok = false;   // the re-run proof certifies
  std::string failure;     // when it does not
  int precision_bits = 0;  // of the re-run
  int modes = 0;
  std::vector<RecheckField> fields;  // in certificate order
  double seconds = 0;
  bool all_ok() const {
    if (!proof_ok) return false;
    for (const auto& f : fields)
      if (!f.ok) return false;
    return true;
  }
};

// Reads every number it checks from j (throws format_error naming a missing / malformed key).
RecheckReport independent_recheck(const nlohmann::json& j);

}  // namespace porecert::certificate
