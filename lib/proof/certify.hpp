// The certification driver: candidate (non-rigorous, lib/candidate) → proof (nk_verify) with the
// obvious remedies when a proof fails: more modes when Z₁ is the obstacle, more MPFR precision
// when Y₀ is (docs/method.md §M5). Output is plain data for the certificate writer.
#pragma once
#include <array>
#include <optional>
#include <string>
#include <utility>
#include <vector>

#include "arith/interval.hpp"
#include "model/model_spec.hpp"
#include "proof/reduced_ivp.hpp"
#include "proof/structure.hpp"

namespace porecert::proof {

struct CertifyRequest {
  std::string R_lo, R_hi;                          // decimal strings; equal for a point R
  std::string branch = "I";                        // "I" (continuation from R = 0) or "" with start
  std::optional<std::pair<double, double>> start;  // shooting guess (f'(0), f'''(0))
  int precision_bits = 0;                          // 0: automatic (double first, then MPFR)
  int modes = 0;                                   // 0: automatic
  int max_modes = 3000;
  int max_precision_bits = 1024;
  // With automatic precision: when a value enclosure is relatively wider than this after a double
  // proof, the proof is redone about an MPFR-refined candidate (docs/method.md §M5).
  double target_rel_width = 1e-12;
  // "auto" (Newton–Kantorovich; the reduced method for strong suction, docs/method.md §S),
  // "newton" or "reduced".
  std::string method = "auto";
  model::ModelSpec model;  // default: Berman's half-channel problem (docs/models.md)
  // Type I: when the certified label is not I, search all branches for type I (costly; the sweep
  // turns it off and bisects instead).
  bool search_other_labels = true;
};

struct Enclosure {
  std::string lo, hi;  // outward decimal strings
  double lo_d = 0, hi_d = 0;
};

// One reported value of the model (model::ValueKey), enclosed.
struct NamedValue {
  std::string key, meaning;
  Enclosure enc;
  arith::Id id;
};

struct CertifyOutcome {
  bool certified = false;
  std::string failure;
  std::vector<std::string> log;  // attempts and remedies, in order
  int modes = 0;
  int precision_bits = 53;  // 53: double intervals; else MPFR bits
  double Y0 = 0, Z0 = 0, Z1 = 0, Z2 = 0, A_norm = 0;
  double existence_radius = 0, uniqueness_radius = 0;
  std::array<double, 4> c3_error{};
  Enclosure fp0, fppp0, fpp1, K;
  // Candidate, exactly: hex strings of the unknown layout [f'(0), K, u_0 .. u_{N-1}].
  std::vector<std::string> candidate_hex;
  // Interval boxes of R: the tangent x1 of the first-order predictor (docs/method.md (M3.11)),
  // exact hex strings, about R0 = the double nearest the box midpoint; empty otherwise.
  std::vector<std::string> tangent_hex;
  // With a tangent: the proof's radii about the moving centre x̄(R) = x̄ + (R − R0) x1, valid for
  // each R of the box (existence_radius and uniqueness_radius restate them about x̄).
  bool moving_centre = false;
  double R0 = 0;
  double centre_existence_radius = 0, centre_uniqueness_radius = 0;
  double seconds = 0;
  Structure structure;                        // certified sign structure and branch label (when certified)
  arith::Id fp0_id, K_id, fpp1_id, fppp0_id;  // the value enclosures as double intervals
  std::string method = "newton-kantorovich";  // or "reduced-ivp" (then `reduced` holds the proof data)
  std::optional<ReducedResult> reduced;
  // The model proved and its reported values (docs/models.md). For Berman and the half-channel
  // variants `values` repeats fp0, fppp0, fpp1, K; for the full channel fp0 .. K above are the
  // raw [0,1]-variable quantities and `values` holds the η-scaled ones.
  model::ModelSpec model;
  std::string model_id;
  std::vector<NamedValue> values;
};

// Runs the whole certification for the model req.model (default: Berman's half-channel problem;
// the name is kept for the callers that predate model specs).
CertifyOutcome certify_berman(const CertifyRequest& req);
// The proof part only, about a given (non-rigorous) Galerkin candidate in the model's layout.
CertifyOutcome certify_from(const CertifyRequest& req, const std::vector<double>& x_candidate);

// The reduced-ODE proof (docs/method.md §S) for the branch with sign(R f'(0)) = eps and the wall at
// the nth zero of f', from the shape-parameter guess s_guess; the outcome in the common form.
CertifyOutcome certify_reduced(const CertifyRequest& req, int eps, int nth, long double s_guess);
// The common form of a reduced-method result (also used by recheck).
CertifyOutcome outcome_of(const ReducedResult& r);

// Re-runs the proof on a stored candidate (hex strings) at the stored precision: no solver.
CertifyOutcome recheck_berman(const std::string& R_lo, const std::string& R_hi,
                              const std::vector<std::string>& candidate_hex, int precision_bits,
                              const std::vector<std::string>& tangent_hex = {});
// The same for any model spec (recheck_berman is this with the default spec).
CertifyOutcome recheck_model(const model::ModelSpec& spec, const std::string& R_lo, const std::string& R_hi,
                             const std::vector<std::string>& candidate_hex, int precision_bits,
                             const std::vector<std::string>& tangent_hex = {});

}  // namespace porecert::proof
