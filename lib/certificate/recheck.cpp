#include "certificate/recheck.hpp"

#include <algorithm>
#include <cstdio>

#include "proof/radii.hpp"

namespace porecert::certificate {

using arith::Id;
using arith::Im;
using nlohmann::json;
using Rnd = arith::rounded_nearest_outward;

namespace {

const json& key(const json& j, const std::string& path, const std::string& k) {
  if (!j.is_object() || !j.contains(k))
    throw format_error("certificate: key \"" + path + k + "\" is missing (truncated?)");
  return j.at(k);
}
std::string text(const json& j, const std::string& path, const std::string& k) {
  const json& v = key(j, path, k);
  if (!v.is_string()) throw format_error("certificate: \"" + path + k + "\" must be a decimal string, got " + v.dump());
  return v.get<std::string>();
}
// An upper bound stored as a decimal string ("inf" allowed): the smallest double ≥ it is not
// needed, the largest double ≤ it suffices for "stored ≥ recomputed" checks, read downward.
double down_of(const std::string& s, const std::string& field) {
  if (s == "inf") return std::numeric_limits<double>::infinity();
  try {
    return arith::from_decimal<Id>(s).lower();
  } catch (const std::invalid_argument&) {
    throw format_error("certificate: \"" + field + "\" is \"" + s + "\", not a decimal number");
  }
}
double up_of(const std::string& s, const std::string& field) {
  if (s == "inf") return std::numeric_limits<double>::infinity();
  try {
    return arith::from_decimal<Id>(s).upper();
  } catch (const std::invalid_argument&) {
    throw format_error("certificate: \"" + field + "\" is \"" + s + "\", not a decimal number");
  }
}
std::string num(double v) {
  char b[40];
  std::snprintf(b, sizeof b, "%.17g", v);
  return b;
}
// p(r) = Z2 r² − (1 − Z) r + Y0 < 0 in double intervals (M3.2).
bool p_negative(double Y0, double Z, double Z2, double r) {
  const Id R(r);
  return (Id(Z2) * R * R - (Id(1) - Id(Z)) * R + Id(Y0)).upper() < 0;
}

}  // namespace

RecheckReport independent_recheck(const json& j) {
  const Stored s = parse(j);  // fixed keys, candidate, values (throws format_error)
  if (s.status != "certified") throw format_error("certificate: status is \"" + s.status + "\"; nothing to re-check");
  const json& bounds = key(j, "", "bounds");
  const json& errs = key(j, "", "error_bounds");
  const char* bkeys[5] = {"Y0", "Z0", "Z1", "Z2", "norm_A"};
  double stored_b[5];
  for (int i = 0; i < 5; ++i)
    stored_b[i] = down_of(text(bounds, "bounds.", bkeys[i]), std::string("bounds.") + bkeys[i]);
  const char* ekeys[4] = {"sup|f - fbar|", "sup|f' - fbar'|", "sup|f'' - fbar''|", "sup|f''' - fbar'''|"};
  double stored_e[4];
  for (int k = 0; k < 4; ++k)
    stored_e[k] = down_of(text(errs, "error_bounds.", ekeys[k]), std::string("error_bounds.") + ekeys[k]);
  const double r_exist = up_of(text(j, "", "existence_radius"), "existence_radius");
  const double r_uniq = down_of(text(j, "", "uniqueness_radius"), "uniqueness_radius");

  RecheckReport rep;
  rep.precision_bits = s.precision_bits <= 53 ? 128 : s.precision_bits + 64;
  proof::CertifyOutcome o;
  try {
    o = proof::recheck_berman(s.problem.R_lo, s.problem.R_hi, s.candidate_hex, rep.precision_bits, s.tangent_hex);
  } catch (const std::invalid_argument& e) {
    throw format_error(std::string("certificate: candidate.coefficients_hex: ") + e.what());
  }
  rep.modes = o.modes;
  rep.seconds = o.seconds;
  rep.proof_ok = o.certified;
  if (!o.certified) {
    rep.failure = o.failure;
    return rep;
  }
  auto add = [&](const std::string& f, bool ok, const std::string& d) { rep.fields.push_back({f, ok, d}); };
  // Bounds: a stored upper bound is confirmed when it is not below the recomputed one.
  const double rec_b[5] = {o.Y0, o.Z0, o.Z1, o.Z2, o.A_norm};
  for (int i = 0; i < 5; ++i)
    add(std::string("bounds.") + bkeys[i], stored_b[i] >= rec_b[i],
        "stored " + num(stored_b[i]) + ", recomputed " + num(rec_b[i]));
  // Radii: the stated ones must satisfy the recomputed radii polynomial (or be implied by its roots).
  const double Z = std::max(o.Z0, o.Z1);
  // With a tangent the stated radii are about x̄ but the polynomial is about x̄(R) (M3.12): only the
  // direct comparison applies.
  const bool fixed = s.tangent_hex.empty();
  const bool exist_ok = o.existence_radius <= r_exist || (fixed && p_negative(o.Y0, Z, o.Z2, r_exist));
  add("existence_radius", exist_ok,
      "stored " + num(r_exist) + ", recomputed " + num(o.existence_radius) + " (p(r) < 0 required at the stored r)");
  const bool uniq_ok = r_uniq <= o.uniqueness_radius || (fixed && p_negative(o.Y0, Z, o.Z2, r_uniq));
  add("uniqueness_radius", uniq_ok,
      "stored " + num(r_uniq) + ", recomputed " + num(o.uniqueness_radius) + " (must not exceed the larger root)");
  // Radii about the moving centre (M3.11): the same rules, and the same point R0.
  if (s.moving_centre) {
    const auto& mc = *s.moving_centre;
    add("moving_centre.R0_hex", o.moving_centre && mc.R0 == o.R0,
        "stored " + num(mc.R0) + ", recomputed " + num(o.R0) + " (the double nearest the box midpoint)");
    add("moving_centre.existence_radius",
        o.moving_centre && (o.centre_existence_radius <= mc.existence_radius ||
                            p_negative(o.Y0, Z, o.Z2, mc.existence_radius)),
        "stored " + num(mc.existence_radius) + ", recomputed " + num(o.centre_existence_radius) +
            " (p(r) < 0 required at the stored r)");
    add("moving_centre.uniqueness_radius",
        o.moving_centre && (mc.uniqueness_radius <= o.centre_uniqueness_radius ||
                            p_negative(o.Y0, Z, o.Z2, mc.uniqueness_radius)),
        "stored " + num(mc.uniqueness_radius) + ", recomputed " + num(o.centre_uniqueness_radius) +
            " (must not exceed the larger root)");
  }
  // C3 error bounds: c3[k] = λ_k r; the stored ones must cover the recomputed ones.
  for (int k = 0; k < 4; ++k) {
    bool ok = stored_e[k] >= o.c3_error[k];
    if (!ok && exist_ok && r_exist < o.existence_radius)  // scaled to the stored (valid, smaller) radius
      ok = stored_e[k] >= Rnd::mul_up(Rnd::div_up(o.c3_error[k], o.existence_radius), r_exist);
    add(std::string("error_bounds.") + ekeys[k], ok,
        "stored " + num(stored_e[k]) + ", recomputed " + num(o.c3_error[k]));
  }
  // Values: the stored enclosure must contain the recomputed one (decimals compared at 1024 bits).
  const proof::Enclosure* mine[4] = {&o.fp0, &o.fppp0, &o.fpp1, &o.K};
  const char* names[4] = {"f'(0)", "f'''(0)", "f''(1)", "K"};
  arith::PrecisionScope exact(1024);
  auto dec = [](const std::string& d) { return arith::from_decimal<Im>(d); };
  for (int i = 0; i < 4; ++i) {
    const bool ok = dec(s.values[i][0]).lower() <= dec(mine[i]->lo).lower() &&
                    dec(mine[i]->hi).upper() <= dec(s.values[i][1]).upper();
    add(std::string("values.") + names[i], ok,
        "stored [" + s.values[i][0] + ", " + s.values[i][1] + "], recomputed [" + mine[i]->lo + ", " + mine[i]->hi +
            "]");
  }
  return rep;
}

}  // namespace porecert::certificate
