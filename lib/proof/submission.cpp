#include "proof/submission.hpp"

#include <cassert>
#include <cmath>
#include <queue>

#include "model/berman.hpp"
#include "model/operator.hpp"

namespace porecert::proof {

using arith::Id;
using Rnd = arith::rounded_nearest_outward;

namespace {

// D[0..3] of the candidate f̄ (outward double enclosures of the stored exact coefficients).
std::array<cheb::Series<Id>, 4> candidate_lift(const CertifyOutcome& o) {
  const model::Model<Id> m = model::berman<Id>(Id(0));  // only the layout and f(0), f''(0) are used
  std::vector<Id> x;
  for (const auto& h : o.candidate_hex) x.push_back(arith::from_decimal<Id>(h));
  return model::lift(model::constants_of(m, x), model::u_of(m, x));
}

Gap finish(double lower_to_cand, double upper_to_cand, double err, int boxes) {
  Gap g;
  g.to_candidate_upper = upper_to_cand;
  g.upper = Rnd::add_up(upper_to_cand, err);
  g.lower = std::max(0.0, Rnd::sub_down(lower_to_cand, err));
  g.boxes = boxes;
  return g;
}

// Tight enclosure of a Chebyshev series at a point. Interval Clenshaw in double widens like
// (1 + sqrt 2)^n near the ends of [0,1] (each step adds the widths of two terms), so the
// midpoints are summed in MPFR intervals with about 1.3 n + 64 bits (raised until the result
// is narrow) and the coefficient radii are added (|T_k| <= 1): docs/reviewing.md (R5).
struct PointSeries {
  std::vector<double> mid;
  double rad = 0;
  int bits = 0;
  explicit PointSeries(const cheb::Series<Id>& s) {
    for (const Id& c : s) {
      const double m = arith::mid_double(c);
      mid.push_back(m);
      rad = Rnd::add_up(rad, std::max(Rnd::sub_up(c.upper(), m), Rnd::sub_up(m, c.lower())));
    }
    // Trailing coefficients of negligible ℓ¹ weight join the radius (|T_k| <= 1).
    const double keep_above = 1e-17 * (1 + cheb::norm1_up(s));
    while (mid.size() > 4 && Rnd::add_up(rad, std::fabs(mid.back())) <= keep_above) {
      rad = Rnd::add_up(rad, std::fabs(mid.back()));
      mid.pop_back();
    }
    bits = 64 + static_cast<int>(1.3 * static_cast<double>(mid.size()));
  }
  Id at(double eta) {
    for (;;) {
      arith::PrecisionScope scope(bits);
      const arith::Im x = arith::Im(2) * arith::Im(eta) - arith::Im(1);
      const arith::Im x2 = arith::Im(2) * x;
      arith::Im b1(0), b2(0);
      for (std::size_t k = mid.size(); k-- > 1;) {
        arith::Im b0 = arith::Im(mid[k]) + x2 * b1 - b2;
        b2 = b1;
        b1 = b0;
      }
      const arith::Im w = arith::Im(mid.empty() ? 0.0 : mid[0]) + x * b1 - b2;
      const Id v = arith::to_id(w);
      if (arith::width_up(w) <= 0x1p-60 * (1 + arith::mag_up(v)) || bits >= 8192) return v + Id(-rad, rad);
      bits *= 2;
    }
  }
};

// sup over the pieces' spans of |s − p| (s a series, p the piece), best-first branch and bound:
// on a box with midpoint m and half-width h (g = s − p),
//   |g| <= |g(m)| + |g'(m)| h + |g''(m)| h²/2 + |g'''(m)| h³/6 + L4 h⁴/24,  L4 >= ‖s''''‖ (ℓ¹)   (R5)
// (p is cubic, so g'''' = s'''')
// with the point values enclosed tightly. The largest box bound bounds the sup; |g(m)| is a
// lower bound of it. Stops when upper <= 1.25 lower or after the box budget.
std::pair<double, double> sup_series_minus_pieces(const cheb::Series<Id>& s, const std::vector<candidate::Piece<Id>>& P,
                                                  int& boxes) {
  const cheb::Series<Id> s1 = cheb::derivative(s), s2 = cheb::derivative(s1), s3 = cheb::derivative(s2);
  PointSeries e0(s), e1(s1), e2(s2), e3(s3);
  const double L4 = cheb::norm1_up(cheb::derivative(s3));
  struct Box {
    double lo, hi, ub;
    int piece;
    bool operator<(const Box& o) const { return ub < o.ub; }
  };
  std::priority_queue<Box> q;
  double lower = 0;
  auto push = [&](double lo, double hi, int i) {
    const double m = lo + (hi - lo) / 2;
    const double h = std::max(Rnd::sub_up(m, lo), Rnd::sub_up(hi, m));
    const Id M(m);
    const Id g0 = e0.at(m) - candidate::piece_eval(P[i], M, 0);
    const Id g1 = e1.at(m) - candidate::piece_eval(P[i], M, 1);
    const Id g2 = e2.at(m) - candidate::piece_eval(P[i], M, 2);
    const Id g3 = e3.at(m) - candidate::piece_eval(P[i], M, 3);
    lower = std::max(lower, std::max(0.0, std::max(g0.lower(), -g0.upper())));
    const double hh = Rnd::mul_up(h, h);
    double ub = arith::mag_up(g0);
    ub = Rnd::add_up(ub, Rnd::mul_up(arith::mag_up(g1), h));
    ub = Rnd::add_up(ub, Rnd::mul_up(arith::mag_up(g2), Rnd::mul_up(hh, 0.5)));
    ub = Rnd::add_up(ub, Rnd::div_up(Rnd::mul_up(arith::mag_up(g3), Rnd::mul_up(hh, h)), 6.0));
    ub = Rnd::add_up(ub, Rnd::div_up(Rnd::mul_up(L4, Rnd::mul_up(hh, hh)), 24.0));
    q.push({lo, hi, ub, i});
    ++boxes;
  };
  for (int i = 0; i < static_cast<int>(P.size()); ++i) push(P[i].x0.lower(), P[i].x1.upper(), i);
  const int budget = boxes + 40000;
  while (true) {
    const Box top = q.top();
    if (top.ub <= 1.25 * lower || boxes >= budget || top.hi - top.lo < 1e-14) return {lower, top.ub};
    q.pop();
    const double m = top.lo + (top.hi - top.lo) / 2;
    push(top.lo, m, top.piece);
    push(m, top.hi, top.piece);
  }
}

}  // namespace

SubmissionDistance submission_distance(const candidate::Submission& s, const CertifyOutcome& o) {
  assert(o.certified);
  SubmissionDistance d;
  using K = candidate::Submission::Kind;
  if (s.kind == K::shooting) {
    const Id a = arith::from_decimal<Id>(s.a), b = arith::from_decimal<Id>(s.b);
    const Id da = a - o.fp0_id, db = b - o.fppp0_id;
    auto gap = [](const Id& v) {
      Gap g;
      g.upper = g.to_candidate_upper = arith::mag_up(v);
      g.lower = std::max(0.0, std::max(v.lower(), -v.upper()));
      return g;
    };
    d.fp0 = gap(da);
    d.fppp0 = gap(db);
    d.definition = "shooting data: the submitted numbers f'(0) = " + s.a + ", f'''(0) = " + s.b +
                   " against the certified enclosures";
    return d;
  }
  const auto D = candidate_lift(o);
  if (s.kind == K::chebyshev) {
    cheb::Series<Id> S;
    for (const auto& c : s.coefficients) S.push_back(arith::from_decimal<Id>(c));
    for (int k = 0; k < 4; ++k) {
      if (k > 0) S = cheb::derivative(S);
      const cheb::Series<Id> diff = cheb::add(S, cheb::scale(D[k], Id(-1)));
      const std::vector<candidate::Piece<Id>> zero{{Id(0), Id(1), {Id(0), Id(0), Id(0), Id(0)}}};
      int boxes = 0;
      const auto [lo, up] = sup_series_minus_pieces(diff, zero, boxes);
      d.sup[k] = finish(lo, up, o.c3_error[k], boxes);
    }
    d.definition = "the submitted Chebyshev series of f and its derivatives (docs/reviewing.md (R3))";
    return d;
  }
  std::string def;
  for (int k = 0; k < 4; ++k) {
    if (!s.column[k]) continue;
    int boxes = 0;
    const auto [lo, up] = sup_series_minus_pieces(D[k], candidate::pieces<Id>(s, k), boxes);
    d.sup[k] = finish(lo, up, o.c3_error[k], boxes);
    const bool hermite = k < 3 && s.column[k + 1];
    def += std::string(def.empty() ? "" : "; ") + "column " + candidate::kColumnNames[k] +
           (hermite ? ": piecewise cubic Hermite with column " + std::string(candidate::kColumnNames[k + 1]) + " (R1)"
                    : ": piecewise cubic through the 4 nearest rows (R2)");
  }
  d.definition = def;
  return d;
}

}  // namespace porecert::proof

namespace porecert::proof {

SubmissionOutcome certify_submission(const CertifyRequest& req, const candidate::Submission& s) {
  SubmissionOutcome r;
  const Id R = boost::numeric::hull(arith::from_decimal<Id>(req.R_lo), arith::from_decimal<Id>(req.R_hi));
  const candidate::ImportReport imp = candidate::candidate_from(s, arith::mid_double(R), req.max_modes);
  r.log = imp.log;
  {  // 1. the submission's own point, exactly as projected on the layout
    std::vector<std::string> hex;
    for (double v : imp.x_as_submitted) hex.push_back(arith::hex_exact(v));
    const CertifyOutcome as_is = recheck_berman(req.R_lo, req.R_hi, hex, 53);
    if (as_is.certified) {
      r.outcome = as_is;
      r.certified_as_submitted = true;
      r.log.push_back("the submitted point itself is certified (no refinement needed)");
    } else {
      r.log.push_back("the submitted point as it stands is too crude to certify: " + as_is.failure);
    }
  }
  // 2. The Newton refinement, certified too: its enclosures are tighter, so the distances are.
  if (imp.converged) {
    CertifyOutcome refined = certify_from(req, imp.x);
    r.log.push_back(std::string("Newton-refined candidate: ") + (refined.certified ? "certified" : refined.failure));
    if (refined.certified) {
      r.outcome = std::move(refined);
      r.used_refinement = true;
    }
  } else {
    r.log.push_back("Newton refinement of the submission did not converge");
  }
  if (!r.outcome.certified && r.outcome.failure.empty())
    r.outcome.failure = "neither the submission nor its refinement certified";
  r.log.insert(r.log.end(), r.outcome.log.begin(), r.outcome.log.end());
  if (r.outcome.certified) r.distance = submission_distance(s, r.outcome);
  return r;
}

}  // namespace porecert::proof
