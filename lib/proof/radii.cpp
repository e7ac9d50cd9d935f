#include "proof/radii.hpp"

#include <algorithm>
#include <limits>
#include <sstream>

namespace porecert::proof {

using arith::Id;
using arith::Im;
using arith::MatD;
using arith::MidRad;
using Rnd = arith::rounded_nearest_outward;

void put_entry(MidRad& M, int i, int j, const Id& v) {
  const double mid = arith::mid_double(v);
  M.mid(i, j) = mid;
  M.rad(i, j) = std::max(Rnd::sub_up(v.upper(), mid), Rnd::sub_up(mid, v.lower()));
}

double apply_norm_up(const MatD& A, const std::vector<Id>& F) {
  const Eigen::Index n = A.rows();
  MidRad f{MatD(n, 1), MatD(n, 1)};
  for (Eigen::Index i = 0; i < n; ++i) put_entry(f, static_cast<int>(i), 0, F[i]);
  return arith::column_norms_up(arith::product(A, f))(0);
}

double apply_norm_up(const MatD& A, const std::vector<Im>& F) {
  const Eigen::Index n = A.rows();
  double s = 0;
  for (Eigen::Index i = 0; i < n; ++i) {
    Im acc(0);
    for (Eigen::Index j = 0; j < n; ++j)
      if (A(i, j) != 0) acc = acc + Im(arith::Mpfr(A(i, j))) * F[j];
    s = Rnd::add_up(s, arith::mag_up(acc));
  }
  return s;
}

std::string short_number(double v) {
  std::ostringstream o;
  o.precision(3);
  o << v;
  return o.str();
}

RadiiVerdict radii_polynomial(double Y0, double Z0, double Z1, double Z2) {
  RadiiVerdict v;
  const double Z = std::max(Z0, Z1);
  const Id gap = Id(1) - Id(Z);
  if (!(gap.lower() > 0)) {
    v.failure = "Z = max(Z0, Z1) = " + short_number(Z) + " must be < 1 (short by " + short_number(Z - 1) +
                "); Z0 = " + short_number(Z0) + ", Z1 = " + short_number(Z1) +
                (Z1 >= Z0 ? " (more modes help Z1)" : "");
    return v;
  }
  const Id disc = gap * gap - Id(4) * Id(Z2) * Id(Y0);
  if (!(disc.lower() > 0)) {
    v.failure = "(1 - Z)^2 - 4 Z2 Y0 = " + short_number(disc.lower()) + " must be > 0; Y0 = " + short_number(Y0) +
                ", Z2 = " + short_number(Z2) + " (a more accurate candidate or more precision lowers Y0)";
    return v;
  }
  const Id root = sqrt(Id(disc.lower()));
  const Id rminus = Id(2) * Id(Y0) / (Id(gap.lower()) + Id(root.lower()));
  double r = Rnd::mul_up(rminus.upper(), 1.0 + 0x1p-20);  // a little above the root: p(r) < 0 strictly
  if (r == 0) r = std::numeric_limits<double>::denorm_min();
  const Id p = Id(Z2) * Id(r) * Id(r) - gap * Id(r) + Id(Y0);
  if (!(p.upper() < 0)) {
    v.failure = "p(r) = Z2 r^2 - (1 - Z) r + Y0 < 0 could not be confirmed at r = " + short_number(r);
    return v;
  }
  v.existence_radius = r;
  v.uniqueness_radius = Z2 == 0 ? std::numeric_limits<double>::infinity()
                                : ((Id(gap.lower()) + Id(root.lower())) / (Id(2) * Id(Z2))).lower();
  v.certified = true;
  return v;
}

}  // namespace porecert::proof
