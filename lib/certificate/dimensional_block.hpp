// The "dimensional" block of a certificate: the [channel] inputs as given, the derived R, and the
// certified dimensional results (docs/units.md). The report re-derives the results from the stored
// inputs and the certified values, so the block's numbers are a convenience, not a source.
#pragma once
#include <nlohmann/json.hpp>

#include "model/dimensional.hpp"

namespace porecert::certificate {

// Outward decimal text of an enclosure: [lo, hi] with `digits` significant digits.
nlohmann::json interval_json(const arith::Id& x, int digits = 17);

nlohmann::json dimensional_json(const model::Channel& c, const arith::Id& fp0, const arith::Id& fpp1,
                                const arith::Id& K);

// Re-reads dimensional.inputs (strings with units) and checks that the derived R lies inside the
// certificate's R = [R_lo, R_hi]. Throws format_error naming the key, the value and the rule.
model::Channel read_dimensional(const nlohmann::json& cert, const std::string& R_lo, const std::string& R_hi);

}  // namespace porecert::certificate
