// NON-RIGOROUS solution search for the model variants (docs/models.md §5). Finds candidate
// points only; each is certified (or not) by lib/proof. Berman's own search (with the shooting
// scan for types II/III) stays in branch_search.hpp. The searched region is reported in words.
#pragma once
#include <string>

#include "candidate/branch_search.hpp"
#include "model/model_spec.hpp"

namespace porecert::candidate {

// Continuation in R from the R = 0 solution; for the full channel also continuation in R at the
// wall ratios a ± 1/2 followed by continuation in a back to a at fixed R (this reaches the
// asymmetric solutions, docs/models.md §1.3), and for a = 1 the mirror image
// g(x) ↦ −g(1 − x) of every solution found. Duplicates removed.
SearchReport find_model_solutions(const model::ModelSpec& spec, double R, int n_max = 3000);

// The mirror image of a full-channel candidate with a = 1 (exact in double: signs only, and
// g''(1) summed from the coefficients).
Vec mirror_full_channel(const model::Model<double>& m, const Vec& x);

}  // namespace porecert::candidate
