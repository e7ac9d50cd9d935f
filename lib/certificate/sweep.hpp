// `porecert sweep`: cover a range of R by boxes, each certified for every R in it (interval
// parameter), bisected where a proof fails, neighbours glued by their uniqueness balls
// (docs/sweep.md). The records are JSON objects: the same whether proved now or read back from
// the journal, so a resumed sweep gives byte-identical output.
#pragma once
#include <atomic>
#include <functional>
#include <map>
#include <nlohmann/json.hpp>
#include <optional>
#include <string>
#include <vector>

#include "model/model_spec.hpp"

namespace porecert::certificate::sweep {

inline constexpr const char* kFormat = "porecert-sweep";

struct Params {
  std::string R_lo, R_hi;             // decimal strings, lo < hi
  std::string branch = "I";           // I, II or III
  std::string width = "auto";         // width of the initial boxes, or "auto" (S2)
  std::string min_width = "0.00001";  // a box narrower than this that fails is a gap (S2)
  bool stop_at_gap = false;           // always true for II/III (S4)
  int max_modes = 3000;
  int max_precision_bits = 128;
  model::ModelSpec model;  // checked; default Berman (docs/models.md)
};

// What identifies the sweep in its journal header (everything that changes the result). A model
// other than plain Berman adds "model": {"name", "parameters"} (Berman headers are unchanged).
nlohmann::json identity(const Params& p);

// The initial boxes and the order they are processed in: ascending R for type I, descending
// (towards the fold) for II/III.
struct Plan {
  std::vector<std::string> points;  // boxes [points[i], points[i+1]]
  std::vector<int> order;           // order[k] = index of the k-th box processed
  bool descending = false;
};
Plan make_plan(const Params& p);  // throws std::invalid_argument when the range cannot be cut

// Records already settled (from a journal), by box.
using Known = std::map<std::pair<std::string, std::string>, nlohmann::json>;
Known index_records(const std::vector<nlohmann::json>& records);

// Settles one initial box by depth-first bisection (S2). Every box proved here (certified, split,
// or failed at minimum width) is passed to emit (for the journal) before it is used; boxes found
// in `known` are reused without proving. Returns the leaves in ascending R, covering [lo, hi]:
// "certified", "not certified" (failed at minimum width) or "not attempted" (after that failure).
std::vector<nlohmann::json> settle_box(const Params& p, const std::string& lo, const std::string& hi, bool descending,
                                       const Known& known, const std::function<void(const nlohmann::json&)>& emit);

bool has_gap(const std::vector<nlohmann::json>& leaves);

// Settles the boxes at the given positions of plan.order with `jobs` threads. done(position,
// leaves) is called under a lock as each box finishes; leaves is empty (nullopt) for a box skipped
// because an earlier position (in plan.order) already has a gap and the sweep stops there.
void run_positions(const Params& p, const Plan& plan, const std::vector<int>& positions, int jobs, const Known& known,
                   const std::function<void(const nlohmann::json&)>& emit,
                   const std::function<void(int, const std::optional<std::vector<nlohmann::json>>&)>& done);

// The final document from the leaves of every position (nullopt: skipped). Deterministic: it
// depends only on the parameters and the leaves.
nlohmann::json assemble(const Params& p, const Plan& plan,
                        const std::vector<std::optional<std::vector<nlohmann::json>>>& by_position);

// One line per fact for the terminal summary.
std::vector<std::string> summary_lines(const nlohmann::json& doc);

}  // namespace porecert::certificate::sweep
