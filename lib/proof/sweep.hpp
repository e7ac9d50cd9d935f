// Proof-side pieces of a sweep over a range of R (docs/sweep.md): cutting [LO, HI] into boxes
// that share their endpoints exactly, and the gluing test between neighbouring boxes (S3).
#pragma once
#include <string>
#include <vector>

#include "arith/interval.hpp"

namespace porecert::proof::sweep {

// n boxes covering [lo, hi]: n + 1 decimal strings, the first lo and the last hi as given, the
// others short decimals (rounded to a resolution of a thousandth of a box) between them. Every
// point is certainly (as a real number) above the previous one; throws std::invalid_argument when
// that cannot be had (the range is too narrow for n boxes).
std::vector<std::string> cut_points(const std::string& lo, const std::string& hi, long n);

// A decimal strictly inside (lo, hi) near the midpoint (cut_points with n = 2), or "" when the box
// is too narrow to split in double precision.
std::string split_point(const std::string& lo, const std::string& hi);

// Approximate width hi - lo in double (used only to decide when to stop bisecting).
double approx_width(const std::string& lo, const std::string& hi);

// Upper bound of ‖x̄a − x̄b‖ in the space of the certificate (docs/method.md §M3): |Δf'(0)| + |ΔK|
// + Σ_k |Δu_k|, the shorter candidate padded with zeros. Candidates are exact hex strings in the
// layout [f'(0), K, u_0, ...]; computed in MPFR at 2200 bits (every stored candidate, at most 1024
// bits, is exact there), summed with upward rounding. Throws std::invalid_argument on a
// malformed string.
double candidate_distance_up(const std::vector<std::string>& a, const std::vector<std::string>& b);

// The centre of a box's proof at R (docs/method.md (M3.11)): x̄ + (R − R0) x1, or x̄ when the
// tangent is empty. Exact hex (or decimal) strings in the layout of candidate_distance_up.
struct Centre {
  std::vector<std::string> coefficients, tangent;
  std::string R0;  // ignored when tangent is empty
};

// Upper bound of ‖c_a(R_joint) − c_b(R_joint)‖ (same norm and arithmetic as above; R_joint a
// decimal string, enclosed). Throws std::invalid_argument on malformed strings or a tangent whose
// length differs from its candidate's.
double centre_distance_up(const Centre& a, const Centre& b, const std::string& R_joint);

// The solution a Newton–Kantorovich box of plain Berman proves at the decimal R_joint, in the chart
// of the reduced method (docs/method.md (S3)): encloses f'(0) and s = f'''(0) / (R f'(0)²) for
// every x within r_up of the centre c at R_joint (ℓ¹ norm of §M3, weight 1, layout
// [f'(0), K, u_0, ...] with u = f''', so |Δf'(0)| ≤ r and |Δf'''(0)| ≤ r as |T_k(−1)| = 1).
// Loose only by MPFR rounding at 2200 bits. s is the whole line when f'(0) may vanish. Throws
// std::invalid_argument on malformed strings, a candidate shorter than 3 or R_joint = 0.
struct ChartPoint {
  arith::Id fp0, s;
};
ChartPoint berman_chart_point(const Centre& c, double r_up, const std::string& R_joint);

// (S3''), docs/sweep.md: a reduced box (eps, nth, uniqueness set [S_lo, S_hi], exact strings)
// next to a Newton–Kantorovich box at R_joint whose certified structure gives f' > 0 on [0, 1)
// (f_prime_positive): yes when f'(0) > 0, eps = sign(R_joint), nth = 1 and the chart point's s
// lies strictly inside (S_lo, S_hi); unsure otherwise (never no).
arith::Tri glued_mixed(const ChartPoint& p, bool f_prime_positive, int eps, int nth, const std::string& S_lo,
                       const std::string& S_hi, const std::string& R_joint);

// (S3): yes when dist + r_exist(b) < r_uniq(a) or dist + r_exist(a) < r_uniq(b), each sum rounded
// up and r_uniq rounded down (radii as the certificate writes them; "inf" allowed for r_uniq);
// unsure otherwise (never no: a failed test proves nothing).
arith::Tri glued(double dist_up, const std::string& exist_a, const std::string& uniq_a, const std::string& exist_b,
                 const std::string& uniq_b);

}  // namespace porecert::proof::sweep
