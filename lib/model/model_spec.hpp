// A model chosen by name and parameters (decimal strings, as the user wrote them), and the
// factory building Model<S> from it (docs/models.md). The default spec is Berman's half-channel
// problem, so callers that never name a model get exactly the old behaviour.
#pragma once
#include <cassert>
#include <string>
#include <type_traits>
#include <utility>
#include <vector>

#include "arith/interval.hpp"
#include "model/pipe.hpp"
#include "model/variants.hpp"

namespace porecert::model {

struct ModelSpec {
  std::string name = "berman";  // berman, full-channel, moving-walls, mhd, slip, pipe (model_names())
  // Parameters by option name without dashes: wall-ratio, expansion, hartmann, slip.
  std::vector<std::pair<std::string, std::string>> params;

  // The decimal text of parameter p, or dflt when it is not set.
  std::string get(const std::string& p, const std::string& dflt = "0") const {
    for (const auto& [k, v] : params)
      if (k == p) return v;
    return dflt;
  }
  bool has(const std::string& p) const {
    for (const auto& kv : params)
      if (kv.first == p) return true;
    return false;
  }
  void set(const std::string& p, const std::string& v) {
    for (auto& kv : params)
      if (kv.first == p) {
        kv.second = v;
        return;
      }
    params.emplace_back(p, v);
  }
  bool is_berman() const { return name == "berman" && params.empty(); }
  // Half-channel models share Berman's symmetry conditions f(0) = f''(0) = 0 and value keys.
  bool half_channel() const { return name != "full-channel" && name != "pipe"; }
  // Models in a Taylor basis about 0 (lib/model/taylor_model.hpp; docs/models.md §2): the porous pipe.
  bool is_taylor() const { return name == "pipe"; }
  bool operator==(const ModelSpec&) const = default;
};

// Names accepted by --model, and the parameters each accepts ("slip" is accepted by every
// half-channel model; the one named first is required unless it has a default).
const std::vector<std::string>& model_names();
std::vector<std::string> parameters_of(const std::string& name);

// Checks the name, the parameter names and values (finite decimals in range: |wall-ratio| ≤ 10,
// 0 ≤ hartmann ≤ 100, |expansion| ≤ 100, 0 ≤ slip ≤ 100) and fills defaults (wall-ratio = 1).
// Throws input_error naming the option (--model, --wall-ratio, ...), the value and the rule.
ModelSpec checked(ModelSpec spec);

// "Berman half-channel", "full channel, a = 0.5", ... for messages.
std::string describe(const ModelSpec& spec);
// The boundary conditions in words (in the physical variable; docs/models.md).
std::vector<std::string> boundary_conditions(const ModelSpec& spec);
// The free constant at 0 of the unknown layout, in words ("f'(0)" or "g''(0)").
std::string free_constant_text(const ModelSpec& spec);

// A user decimal as S: an enclosure for interval types, a nearby point for double / Mpfr (candidates only).
template <class S>
S decimal_as(const std::string& text) {
  if constexpr (arith::Interval<S>) {
    return arith::from_decimal<S>(text);
  } else if constexpr (std::is_same_v<S, double>) {
    return arith::mid_double(arith::from_decimal<arith::Id>(text));
  } else {
    return arith::from_decimal<arith::Im>(text).lower();
  }
}

// Model<S> of a checked spec at R (R may be an interval). Parameters enter as enclosures of the
// user's decimals, so a proof with interval S holds for the exact decimal values.
// Not for Taylor models (spec.is_taylor(): use build_taylor_model).
template <class S>
Model<S> build_model(const ModelSpec& spec, const S& R) {
  assert(!spec.is_taylor());
  Model<S> m;
  if (spec.name == "full-channel") return full_channel(R, decimal_as<S>(spec.get("wall-ratio", "1")));
  if (spec.name == "mhd") {
    const S M = decimal_as<S>(spec.get("hartmann"));
    m = berman_mhd(R, M * M);
  } else if (spec.name == "moving-walls") {
    m = berman_moving_walls(R, decimal_as<S>(spec.get("expansion")));
  } else {
    m = berman(R);  // berman, slip
  }
  if (spec.has("slip")) {
    const S beta = decimal_as<S>(spec.get("slip"));
    const Model<S> s = berman_slip(R, beta);
    m.rows[1] = s.rows[1];
    m.id += "-slip";
    m.params.push_back({"beta", beta});
  }
  return m;
}

// TaylorModel<S> of a checked Taylor spec (spec.is_taylor()) at R (R may be an interval).
template <class S>
TaylorModel<S> build_taylor_model(const ModelSpec& spec, const S& R) {
  assert(spec.is_taylor());
  return pipe(R);
}

// The texts of a spec's model, whichever basis it uses (for certificates and messages).
std::string model_id_of(const ModelSpec& spec);
std::string equation_of(const ModelSpec& spec);
std::vector<ValueKey> value_keys_of(const ModelSpec& spec);

}  // namespace porecert::model
