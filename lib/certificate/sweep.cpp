#include "certificate/sweep.hpp"

#include <cmath>
#include <exception>
#include <limits>
#include <mutex>
#include <stdexcept>
#include <thread>

#include "certificate/certificate.hpp"
#include "proof/labelled.hpp"
#include "proof/sweep.hpp"

namespace porecert::certificate::sweep {

using nlohmann::json;

namespace {

bool fold_branch(const Params& p) { return p.branch == "II" || p.branch == "III"; }

json box_R(const std::string& lo, const std::string& hi) { return json::array({lo, hi}); }

// Proves one box; the record is what the journal stores and the output lists.
json prove_box(const Params& p, const std::string& lo, const std::string& hi) {
  proof::CertifyRequest req;
  req.R_lo = lo;
  req.R_hi = hi;
  req.branch = p.branch;
  req.max_modes = p.max_modes;
  req.max_precision_bits = p.max_precision_bits;
  // Over a box the value enclosures are as wide as the box: no MPFR re-proof for width (M5).
  req.target_rel_width = std::numeric_limits<double>::infinity();
  req.search_other_labels = false;  // an unclassified structure over a wide box: bisect instead
  req.model = p.model;
  const proof::CertifyOutcome o = proof::certify_labelled(req);
  json cert = to_json(Problem{lo, hi, p.branch, ""}, o);
  cert.erase("seconds");  // the only field that differs between two runs of the same proof
  json r;
  r["R"] = box_R(lo, hi);
  // Branch labels are Berman's half-channel sign structures (docs/branches.md); the full channel and
  // the pipe carry none, so there a box is the solution continued from R = 0 (docs/sweep.md).
  const bool labelled = p.model.half_channel();
  const bool label_ok = o.certified && (labelled ? o.structure.label == p.branch : o.structure.label.empty());
  r["status"] = label_ok ? "certified" : "not certified";
  if (label_ok) {
    r["values"] = cert["values"];
    r["existence_radius"] = cert["existence_radius"];
    r["uniqueness_radius"] = cert["uniqueness_radius"];
    r["certificate"] = std::move(cert);
  } else {
    r["values"] = json::object();
    r["failure"] = o.certified ? "the proof holds but the certified structure label is '" + o.structure.label +
                                     "', not type " + p.branch
                               : o.failure;
    r["bounds"] = cert["bounds"];
  }
  return r;
}

// The centre of a Newton-Kantorovich box's proof (S3): x̄ + (R − R0) x1 with a moving centre, x̄
// otherwise; and its radius k ("existence_radius", "uniqueness_radius") about that centre.
proof::sweep::Centre centre(const json& b) {
  const json& c = b["certificate"]["candidate"];
  proof::sweep::Centre x{c["coefficients_hex"].get<std::vector<std::string>>(), {}, ""};
  if (b["certificate"].contains("moving_centre")) {
    x.tangent = c["tangent_hex"].get<std::vector<std::string>>();
    x.R0 = b["certificate"]["moving_centre"]["R0_hex"].get<std::string>();
  }
  return x;
}
std::string radius(const json& b, const char* k) {
  const json& c = b["certificate"];
  return c.contains("moving_centre") ? c["moving_centre"][k].get<std::string>() : b[k].get<std::string>();
}

}  // namespace

// The header fields of every sweep (plain Berman sweeps have exactly these).
static json base_identity(const Params& p) {
  return {{"format", "porecert-sweep-journal"},
          {"version", 1},
          {"R", box_R(p.R_lo, p.R_hi)},
          {"branch", p.branch},
          {"width", p.width},
          {"min_width", p.min_width},
          {"stop_at_gap", p.stop_at_gap || fold_branch(p)},
          {"max_modes", p.max_modes},
          {"max_precision_bits", p.max_precision_bits},
          {"software", "porecert 0.1.0"}};
}

json identity(const Params& p) {
  json id = base_identity(p);
  if (!p.model.is_berman()) {
    json mp = json::object();
    for (const auto& [k, v] : p.model.params) mp[k] = v;
    id["model"] = {{"name", p.model.name}, {"parameters", mp}};
  }
  return id;
}

// Width of the initial boxes for --width auto (docs/sweep.md S2): 1 where Berman's boxes go to the
// reduced method (type I from R = 1, type II from R = 40; its boxes from R = 13 are reduced ones too,
// but below 40 half of a unit box already fails) up to R = 500, 0.25 beyond (unit boxes
// failed near R = 1000) and for the Newton-Kantorovich boxes with the moving centre (every other
// case); type III boxes start at their measured working widths. The range is cut at each change of
// width that lies inside it.
static std::vector<std::pair<std::string, std::string>> auto_segments(const Params& p, std::vector<std::string>* w) {
  const bool reduced = p.model.is_berman() && (p.branch == "I" || p.branch == "II");
  // (start of a zone, its width), zones in increasing R; the first starts at -infinity.
  std::vector<std::pair<std::string, std::string>> zones{{"", "0.25"}};
  if (reduced && p.branch == "II")
    // Towards R = 13.12 (the end of type II, s -> infinity) the boxes that pass shrink like about
    // (R - 13.12)^2.2 (measured [13.4, 100]); starting near that width spares failed attempts and lets
    // the threads share the narrow part instead of one thread bisecting a whole initial box.
    zones.insert(zones.end(), {{"13", "0.001"}, {"13.5", "0.002"}, {"14", "0.02"}, {"15", "0.25"}});
  if (reduced) zones.insert(zones.end(), {{p.branch == "I" ? "1" : "40", "1"}, {"500", "0.25"}});
  if (p.model.is_berman() && p.branch == "III")
    // Widths of type III boxes that certify (measured 2026-12-05, docs/performance.md): Newton-Kantorovich
    // boxes are limited by Z0 near the fold (1.4e-4 at 12.2) and by Y0 ~ w^2 Z2 from R = 25 on (Z2 grows
    // to 5.6e4 at 59.5: 1.5e-4 certifies); reduced boxes above 60 about 1e-3. Starting near these spares
    // the failed attempts of bisecting from 0.25 (up to 3 s each near R = 50).
    zones.insert(zones.end(), {{"12", "0.0002"},
                               {"12.5", "0.001"},
                               {"13", "0.002"},
                               {"14", "0.004"},
                               {"25", "0.0015"},
                               {"35", "0.001"},
                               {"40", "0.0008"},
                               {"45", "0.0005"},
                               {"50", "0.0003"},
                               {"53", "0.0002"},
                               {"56", "0.00015"},
                               {"60", "0.001"}});
  const auto less = [](const std::string& x, const std::string& y) {
    return arith::tri_less(arith::from_decimal<arith::Id>(x), arith::from_decimal<arith::Id>(y)) == arith::Tri::yes;
  };
  std::vector<std::pair<std::string, std::string>> seg;
  std::string at = p.R_lo;
  for (std::size_t z = 0; z < zones.size(); ++z) {
    if (z + 1 < zones.size() && !less(p.R_lo, zones[z + 1].first)) continue;  // R_lo lies in a later zone
    const bool next_inside = z + 1 < zones.size() && less(zones[z + 1].first, p.R_hi);
    const std::string end = next_inside ? zones[z + 1].first : p.R_hi;
    seg.push_back({at, end});
    w->push_back(zones[z].second);
    at = end;
    if (!next_inside) break;
  }
  return seg;
}

Plan make_plan(const Params& p) {
  std::vector<std::string> widths{p.width};
  std::vector<std::pair<std::string, std::string>> seg{{p.R_lo, p.R_hi}};
  if (p.width == "auto") {
    widths.clear();
    seg = auto_segments(p, &widths);
  }
  Plan plan;
  for (std::size_t k = 0; k < seg.size(); ++k) {
    const double total = proof::sweep::approx_width(seg[k].first, seg[k].second);
    const double w = arith::mid_double(arith::from_decimal<arith::Id>(widths[k]));
    if (!(total > 0) || !(w > 0)) throw std::invalid_argument("empty range or width");
    const double n = std::ceil(total / w * (1 - 1e-12));
    if (n > 1e7) throw std::invalid_argument("more than 10^7 initial boxes");
    const auto pts = proof::sweep::cut_points(seg[k].first, seg[k].second, std::max(1L, static_cast<long>(n)));
    plan.points.insert(plan.points.end(), pts.begin() + (plan.points.empty() ? 0 : 1), pts.end());
  }
  plan.descending = fold_branch(p);
  const int m = static_cast<int>(plan.points.size()) - 1;
  for (int k = 0; k < m; ++k) plan.order.push_back(plan.descending ? m - 1 - k : k);
  return plan;
}

Known index_records(const std::vector<json>& records) {
  Known k;
  for (const auto& r : records) {
    if (!r.is_object() || !r.contains("R") || !r["R"].is_array() || r["R"].size() != 2 || !r["R"][0].is_string() ||
        !r["R"][1].is_string() || !r.contains("status") || !r["status"].is_string())
      throw format_error("journal: a record has no \"R\": [lo, hi] or no \"status\": " + r.dump().substr(0, 120));
    k[{r["R"][0].get<std::string>(), r["R"][1].get<std::string>()}] = r;
  }
  return k;
}

std::vector<json> settle_box(const Params& p, const std::string& lo, const std::string& hi, bool descending,
                             const Known& known, const std::function<void(const json&)>& emit) {
  const double min_w = arith::mid_double(arith::from_decimal<arith::Id>(p.min_width));
  std::vector<json> leaves;  // in processing order
  bool gap = false;
  std::function<void(const std::string&, const std::string&)> settle = [&](const std::string& a, const std::string& b) {
    if (gap) return;
    json rec;
    const auto it = known.find({a, b});
    const std::string mid = proof::sweep::split_point(a, b);
    const bool can_split = !mid.empty() && proof::sweep::approx_width(a, b) > min_w;
    if (it != known.end()) {
      rec = it->second;
    } else {
      rec = prove_box(p, a, b);
      if (rec["status"] != "certified" && can_split) {
        rec = {{"R", box_R(a, b)}, {"status", "split"}, {"failure", rec.value("failure", "")}};
      }
      emit(rec);
    }
    const std::string st = rec["status"].get<std::string>();
    if (st == "split") {
      if (mid.empty()) throw std::runtime_error("journal: box [" + a + ", " + b + "] marked split cannot be split");
      if (descending) {
        settle(mid, b);
        settle(a, mid);
      } else {
        settle(a, mid);
        settle(mid, b);
      }
      return;
    }
    leaves.push_back(rec);
    if (st != "certified") {
      gap = true;
      const std::string &from = descending ? lo : b, &to = descending ? a : hi;
      if (from != to)
        leaves.push_back({{"R", box_R(from, to)},
                          {"status", "not attempted"},
                          {"values", json::object()},
                          {"failure", "not attempted after the failure at minimum width next to it"}});
    }
  };
  settle(lo, hi);
  if (descending) std::reverse(leaves.begin(), leaves.end());
  return leaves;
}

bool has_gap(const std::vector<json>& leaves) {
  for (const auto& l : leaves)
    if (l["status"] != "certified") return true;
  return false;
}

void run_positions(const Params& p, const Plan& plan, const std::vector<int>& positions, int jobs, const Known& known,
                   const std::function<void(const json&)>& emit,
                   const std::function<void(int, const std::optional<std::vector<json>>&)>& done) {
  const bool stop = p.stop_at_gap || fold_branch(p);
  std::atomic<std::size_t> next{0};
  std::atomic<int> first_gap{std::numeric_limits<int>::max()};
  std::mutex mu;
  std::exception_ptr error;
  auto worker = [&] {
    for (;;) {
      const std::size_t k = next.fetch_add(1);
      if (k >= positions.size()) return;
      const int pos = positions[k];
      try {
        if (stop && pos > first_gap.load()) {
          std::lock_guard<std::mutex> lock(mu);
          done(pos, std::nullopt);
          continue;
        }
        const int box = plan.order[pos];
        auto leaves = settle_box(p, plan.points[box], plan.points[box + 1], plan.descending, known, emit);
        if (stop && has_gap(leaves)) {
          int cur = first_gap.load();
          while (pos < cur && !first_gap.compare_exchange_weak(cur, pos)) {
          }
        }
        std::lock_guard<std::mutex> lock(mu);
        done(pos, leaves);
      } catch (...) {
        std::lock_guard<std::mutex> lock(mu);
        if (!error) error = std::current_exception();
        next = positions.size();
        return;
      }
    }
  };
  std::vector<std::thread> pool;
  for (int t = 1; t < std::max(1, jobs); ++t) pool.emplace_back(worker);
  worker();
  for (auto& t : pool) t.join();
  if (error) std::rethrow_exception(error);
}

json assemble(const Params& p, const Plan& plan, const std::vector<std::optional<std::vector<json>>>& by_position) {
  const bool stop = p.stop_at_gap || fold_branch(p);
  const int m = static_cast<int>(plan.order.size());
  // Positions kept: all, or up to the first one with a gap when the sweep stops there (S4).
  int last = m - 1;
  if (stop)
    for (int k = 0; k < m; ++k) {
      if (!by_position[k]) throw std::runtime_error("sweep: position " + std::to_string(k) + " skipped before a gap");
      if (has_gap(*by_position[k])) {
        last = k;
        break;
      }
    }
  std::vector<const std::vector<json>*> by_box(m, nullptr);
  for (int k = 0; k <= last; ++k) {
    if (!by_position[k]) throw std::runtime_error("sweep: box at position " + std::to_string(k) + " missing");
    by_box[plan.order[k]] = &*by_position[k];
  }
  json boxes = json::array();
  bool pending = false;  // a run of boxes never reached (stopped sweep)
  std::string pend_lo, pend_hi;
  auto flush = [&] {
    if (!pending) return;
    boxes.push_back({{"R", box_R(pend_lo, pend_hi)},
                     {"status", "not attempted"},
                     {"values", json::object()},
                     {"failure", "the sweep stopped at the gap next to it"}});
    pending = false;
  };
  for (int b = 0; b < m; ++b) {
    if (!by_box[b]) {
      if (!pending) pend_lo = plan.points[b];
      pend_hi = plan.points[b + 1];
      pending = true;
      continue;
    }
    flush();
    for (const auto& l : *by_box[b]) boxes.push_back(l);
  }
  flush();

  json doc;
  doc["format"] = kFormat;
  doc["format_version"] = 1;
  doc["R"] = box_R(p.R_lo, p.R_hi);
  doc["branch"] = p.branch;
  doc["parameters"] = identity(p);
  doc["parameters"].erase("format");
  doc["parameters"].erase("version");
  // Gluing of neighbours (S3) and gaps.
  json joints = json::array(), gaps = json::array();
  bool covered = true, all_glued = true;
  const bool p_model_berman = p.model.is_berman();
  std::size_t n_cert = 0;
  for (std::size_t i = 0; i < boxes.size(); ++i) {
    const bool ci = boxes[i]["status"] == "certified";
    n_cert += ci;
    if (!ci) {
      covered = false;
      if (!gaps.empty() && gaps.back()[1] == boxes[i]["R"][0])
        gaps.back()[1] = boxes[i]["R"][1];
      else
        gaps.push_back(boxes[i]["R"]);
    }
    if (i + 1 == boxes.size()) break;
    json j{{"R", boxes[i]["R"][1]}, {"boxes", json::array({i, i + 1})}};
    const bool cj = boxes[i + 1]["status"] == "certified";
    const auto method = [](const json& b) {
      return b["certificate"].value("method", std::string("newton-kantorovich"));
    };
    if (ci && cj && (method(boxes[i]) == "reduced-ivp" || method(boxes[i + 1]) == "reduced-ivp")) {
      // Reduced method (docs/method.md (S10)): at the shared R each box's solution has s in its bracket
      // and is the only one of its chart with s in its set S; a bracket inside the other's S glues.
      const json& ca = boxes[i]["certificate"]["candidate"];
      const json& cb = boxes[i + 1]["certificate"]["candidate"];
      bool g = method(boxes[i]) == method(boxes[i + 1]) && ca.value("eps", 0) == cb.value("eps", 0) &&
               ca.value("nth_zero", 0) == cb.value("nth_zero", 0);
      if (g) {
        arith::PrecisionScope exact(1024);
        const auto v = [](const json& c, const char* k) {
          return arith::from_decimal<arith::Im>(c[k].get<std::string>());
        };
        const auto inside = [&](const json& x, const json& y) {  // bracket of x within S of y
          return v(y, "S_lo").upper() <= v(x, "s_lo").lower() && v(x, "s_hi").upper() <= v(y, "S_hi").lower();
        };
        // (S3'): S_a and S_b meet, so their union is one interval, and dR/ds has one certified sign on
        // both: R is strictly monotone on the union, so the shared R has one s there (both boxes' s).
        const auto sign = [&](const json& b) {
          const json& d = b["certificate"]["bounds"]["dR/ds on S"];
          const double lo = arith::from_decimal<arith::Id>(d[0].get<std::string>()).lower();
          const double hi = arith::from_decimal<arith::Id>(d[1].get<std::string>()).upper();
          return lo > 0 ? 1 : hi < 0 ? -1 : 0;
        };
        const auto meet = [&](const json& x, const json& y) {
          return v(y, "S_lo").upper() <= v(x, "S_hi").lower() && v(x, "S_lo").upper() <= v(y, "S_hi").lower();
        };
        const int sa = sign(boxes[i]), sb = sign(boxes[i + 1]);
        g = inside(ca, cb) || inside(cb, ca) || (sa != 0 && sa == sb && meet(ca, cb));
      }
      if (method(boxes[i]) != method(boxes[i + 1])) {
        // (S3''): the Newton–Kantorovich box's solution at the shared R, read in the reduced chart.
        const json& nk = method(boxes[i]) == "reduced-ivp" ? boxes[i + 1] : boxes[i];
        const json& rd = method(boxes[i]) == "reduced-ivp" ? boxes[i] : boxes[i + 1];
        const json& c = nk["certificate"];
        const std::string Rj = boxes[i]["R"][1].get<std::string>();
        const auto p = proof::sweep::berman_chart_point(
            centre(nk), arith::from_decimal<arith::Id>(radius(nk, "existence_radius")).upper(), Rj);
        const json& rc = rd["certificate"]["candidate"];
        const bool fp_pos = c.contains("structure") && c["structure"].value("flow_reversal", "") == "no";
        g = p_model_berman && proof::sweep::glued_mixed(p, fp_pos, rc.value("eps", 0), rc.value("nth_zero", 0),
                                                        rc["S_lo"].get<std::string>(), rc["S_hi"].get<std::string>(),
                                                        Rj) == arith::Tri::yes;
        j["shape_parameter"] = json::array({arith::decimal_lower(p.s, 17), arith::decimal_upper(p.s, 17)});
      }
      j["glued"] = g ? "glued" : "not glued";
      if (!g)
        j["reason"] = method(boxes[i]) != method(boxes[i + 1])
                          ? "the Newton-Kantorovich box's solution at the shared R is not certainly in the reduced "
                            "box's chart (f' > 0 on [0,1), same eps, first zero of f') with s inside its set S "
                            "(docs/sweep.md (S3''))"
                          : "neither box's s bracket lies in the other's uniqueness set S, nor do the two sets S "
                            "meet with one sign of dR/ds (docs/sweep.md (S3))";
    } else if (ci && cj) {
      // Distance of the proofs' centres at the shared R (S3): x̄ + (R − R0) x1 for a moving centre,
      // with the radii about it; the fixed-centre radii otherwise.
      const double d =
          proof::sweep::centre_distance_up(centre(boxes[i]), centre(boxes[i + 1]), boxes[i]["R"][1].get<std::string>());
      const arith::Tri g =
          proof::sweep::glued(d, radius(boxes[i], "existence_radius"), radius(boxes[i], "uniqueness_radius"),
                              radius(boxes[i + 1], "existence_radius"), radius(boxes[i + 1], "uniqueness_radius"));
      j["centre_distance"] = arith::decimal_upper(arith::Id(d), 17);
      j["glued"] = g == arith::Tri::yes ? "glued" : "not glued";
      if (g != arith::Tri::yes)
        j["reason"] = "distance + existence radius of one box is not below the uniqueness radius of the other (S3)";
    } else {
      j["glued"] = "not glued";
      j["reason"] = "a box on one side is not certified";
    }
    all_glued = all_glued && j["glued"] == "glued";
    joints.push_back(j);
  }
  doc["boxes"] = boxes;
  doc["joints"] = joints;
  doc["covered"] = covered;
  doc["gaps"] = gaps;
  doc["one_branch"] = covered && all_glued;
  doc["counts"] = {{"boxes", boxes.size()}, {"certified", n_cert}, {"initial_boxes", m}};
  if (stop && !covered) {
    // Last certified R: the end of the certified run from where the sweep started.
    std::string last_R;
    if (plan.descending) {
      for (std::size_t i = boxes.size(); i-- > 0;) {
        if (boxes[i]["status"] != "certified") break;
        last_R = boxes[i]["R"][0].get<std::string>();
      }
    } else {
      for (const auto& b : boxes) {
        if (b["status"] != "certified") break;
        last_R = b["R"][1].get<std::string>();
      }
    }
    std::string msg = "sweep of type " + p.branch + " stopped at its first gap";
    if (p.branch == "II" && p.model.is_berman())
      msg +=
          " while approaching the end of type II: along this branch f'(0) falls to 0 near R = 13.12 (measured, "
          "docs/branches.md), below which the solution continuing it has f'(0) < 0 and the structure of type III, "
          "down to the fold R* near 12.165 (docs/fold.md); the reduced chart's boxes shrink towards R = 13.12";
    else if (fold_branch(p))
      msg +=
          " while approaching the fold of types II/III (R* near 12.165, docs/fold.md; below R* these branches do "
          "not exist)";
    msg += last_R.empty() ? "; last certified R: none (no box was certified)" : "; last certified R = " + last_R;
    doc["stopped"] = {{"last_certified_R", last_R.empty() ? json(nullptr) : json(last_R)}, {"message", msg}};
  }
  doc["claim"] =
      "each certified box: for every R in it, a solution of the stated type exists in the ball of radius "
      "existence_radius about its candidate and is the only one in the open ball of radius uniqueness_radius "
      "(space of docs/method.md M3); 'glued' joints: the two boxes' solutions coincide at the shared R (docs/sweep.md "
      "S3)";
  doc["caution"] = kCaution;
  return doc;
}

std::vector<std::string> summary_lines(const json& doc) {
  std::vector<std::string> out;
  const auto& c = doc["counts"];
  std::size_t glued = 0;
  for (const auto& j : doc["joints"]) glued += j["glued"] == "glued";
  std::string model;  // plain Berman sweeps name no model
  if (doc["parameters"].contains("model")) {
    model = doc["parameters"]["model"]["name"].get<std::string>();
    for (const auto& [k, v] : doc["parameters"]["model"]["parameters"].items())
      model += " " + k + " = " + v.get<std::string>();
    model += ", ";
  }
  out.push_back("porecert sweep: " + model + "branch " + doc["branch"].get<std::string>() +
                ", R = " + doc["R"][0].get<std::string>() + " .. " + doc["R"][1].get<std::string>());
  out.push_back("  boxes: " + std::to_string(c["certified"].get<std::size_t>()) + " certified of " +
                std::to_string(c["boxes"].get<std::size_t>()) + " (from " +
                std::to_string(c["initial_boxes"].get<int>()) + " initial boxes)");
  out.push_back("  joints: " + std::to_string(glued) + " glued of " + std::to_string(doc["joints"].size()) +
                (doc["one_branch"].get<bool>() ? " (one branch over the whole range)" : ""));
  out.push_back(std::string("  covered: ") + (doc["covered"].get<bool>() ? "yes, the whole range" : "NO"));
  for (const auto& g : doc["gaps"])
    out.push_back("  gap: [" + g[0].get<std::string>() + ", " + g[1].get<std::string>() + "] not certified");
  if (doc.contains("stopped")) out.push_back("  STOPPED: " + doc["stopped"]["message"].get<std::string>());
  out.push_back("  " + std::string(kCaution));
  return out;
}

}  // namespace porecert::certificate::sweep
