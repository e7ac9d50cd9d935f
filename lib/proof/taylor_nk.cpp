#include "proof/taylor_nk.hpp"

#include <algorithm>
#include <stdexcept>

#include "arith/fp_env.hpp"
#include "arith/midrad.hpp"
#include "model/taylor_operator.hpp"
#include "proof/radii.hpp"

namespace porecert::proof {

using arith::Id;
using arith::Im;
using arith::MatD;
using arith::MidRad;
using Rnd = arith::rounded_nearest_outward;

namespace {
double norm_up(const model::Poly<Id>& a) {
  double s = 0;
  for (const Id& v : a) s = Rnd::add_up(s, arith::mag_up(v));
  return s;
}
double up(const Id& v) { return v.upper(); }
}  // namespace

namespace {
// The proof about xbar (double intervals); with mi, xi given, Y₀ is computed in MPFR intervals about
// the MPFR candidate xi (xbar its outward double hull), everything else as without them.
TaylorNKResult verify_core(const model::TaylorModel<Id>& m, const std::vector<Id>& xbar,
                           const model::TaylorModel<Im>* mi, const std::vector<Im>* xi) {
  if (!m.well_formed()) throw std::invalid_argument("Taylor model '" + m.id + "' is not well formed");
  for (std::size_t j = 0; j < m.alpha.size(); ++j)
    if (!(m.alpha[j].lower() >= 0) || (j == 0 && !(m.alpha[0].lower() > 0)))
      throw std::invalid_argument("Taylor model '" + m.id + "': principal part needs alpha_0 > 0, alpha_j >= 0");
  const int ns = m.n_scalars();
  const int N = static_cast<int>(xbar.size()) - ns;
  if (N < 8) throw std::invalid_argument("Taylor proof needs at least 8 modes");
  const int n = ns + N;
  const int nr = static_cast<int>(m.rows.size());
  TaylorNKResult res;
  res.modes = N;
  const auto G = model::taylor_derivatives(m, xbar);

  // Φ_r(l) = Σ_d a_{r,d} λ_d(l): row r of a tail mode l (V2.7), computed on demand.
  std::vector<std::vector<Id>> Phi(nr);
  auto phi = [&](int r, long l) -> const Id& {
    auto& v = Phi[r];
    while (static_cast<long>(v.size()) <= l - N) {
      const long q = N + static_cast<long>(v.size());
      Id s(0);
      for (int d = 0; d <= m.p; ++d) s = s + m.rows[r].coef[d] * model::taylor_lift(m, d, q);
      v.push_back(s);
    }
    return v[l - N];
  };
  // sup_{l ≥ N} |Φ_r(l)| ≤ Σ_d |a_{r,d}| λ_d(N): λ_d decreases in l because σ does not (V2.4).
  std::vector<double> phi_hat(nr, 0.0);
  for (int r = 0; r < nr; ++r)
    for (int d = 0; d <= m.p; ++d)
      phi_hat[r] =
          Rnd::add_up(phi_hat[r], Rnd::mul_up(arith::mag_up(m.rows[r].coef[d]), up(model::taylor_lift(m, d, N))));

  // Finite block D' = D − WΦC and spill norms ‖C e_j‖ (V2.8).
  MidRad D{MatD::Zero(n, n), MatD::Zero(n, n)};
  std::vector<double> spill(n, 0.0);
  for (int j = 0; j < n; ++j) {
    const auto col = model::taylor_column(m, G, j);
    for (int r = 0; r < nr; ++r) {
      Id v = col.rows[r];
      for (long l = N; l < static_cast<long>(col.modes.size()); ++l) v = v - phi(r, l) * col.modes[l];
      put_entry(D, r, j, v);
    }
    for (int k = 0; k < N && k < static_cast<int>(col.modes.size()); ++k) put_entry(D, ns + k, j, col.modes[k]);
    for (long l = N; l < static_cast<long>(col.modes.size()); ++l)
      spill[j] = Rnd::add_up(spill[j], arith::mag_up(col.modes[l]));
  }
  const Eigen::PartialPivLU<MatD> lu(D.mid);
  const MatD A = lu.inverse();
  if (!A.allFinite()) {
    res.failure = "the finite part of DF(candidate) is numerically singular (no approximate inverse)";
    return res;
  }
  // ‖A_N W_r‖ = column r of A_N (W_r is the unit vector of row r).
  double coupling = 0;  // Σ_r ‖A_N W_r‖ sup|Φ_r|
  for (int r = 0; r < nr; ++r) {
    double s = 0;
    for (int i = 0; i < n; ++i) s = Rnd::add_up(s, std::fabs(A(i, r)));
    coupling = Rnd::add_up(coupling, Rnd::mul_up(s, phi_hat[r]));
  }
  res.bounds.A_norm = std::max(arith::operator_norm1_up(A), Rnd::add_up(1.0, coupling));

  // Z₀: finite columns.
  {
    const Eigen::VectorXd cols = arith::identity_defect_column_norms_up(arith::product(A, D));
    double z = 0;
    for (int j = 0; j < n; ++j) z = std::max(z, Rnd::add_up(cols(j), spill[j]));
    res.bounds.Z0 = z;
  }
  // Z₁: tail columns k ≥ N, ‖M e_k‖ ≤ μ(N) (V2.8).
  {
    double mu = 0;
    for (const auto& t : m.lin)
      mu = Rnd::add_up(mu, Rnd::mul_up(arith::mag_up(t.coef), up(model::taylor_lift(m, t.d, N))));
    for (const auto& t : m.quad) {
      const double a = Rnd::mul_up(norm_up(G[t.d1]), up(model::taylor_lift(m, t.d2, N)));
      const double b = Rnd::mul_up(norm_up(G[t.d2]), up(model::taylor_lift(m, t.d1, N)));
      mu = Rnd::add_up(mu, Rnd::mul_up(arith::mag_up(t.coef), Rnd::add_up(a, b)));
    }
    res.bounds.Z1 = Rnd::mul_up(mu, Rnd::add_up(1.0, coupling));
  }
  // Y₀ = ‖A_N (F_N − WΦ F_tail)‖ + ‖F_tail‖.
  if (mi) {
    const auto F = model::taylor_residual(*mi, *xi);
    std::vector<Im> top(n, Im(0));
    for (int r = 0; r < nr; ++r) {
      Im v = F.rows[r];
      for (long l = N; l < static_cast<long>(F.modes.size()); ++l) {
        Im ph(0);
        for (int d = 0; d <= m.p; ++d) ph = ph + mi->rows[r].coef[d] * model::taylor_lift(*mi, d, l);
        v = v - ph * F.modes[l];
      }
      top[r] = v;
    }
    double bottom = 0;
    for (long l = 0; l < static_cast<long>(F.modes.size()); ++l) {
      if (l < N)
        top[ns + l] = F.modes[l];
      else
        bottom = Rnd::add_up(bottom, arith::mag_up(F.modes[l]));
    }
    res.bounds.Y0 = Rnd::add_up(apply_norm_up(A, top), bottom);
  } else {
    const auto F = model::taylor_residual(m, xbar);
    std::vector<Id> top(n, Id(0));
    for (int r = 0; r < nr; ++r) {
      Id v = F.rows[r];
      for (long l = N; l < static_cast<long>(F.modes.size()); ++l) v = v - phi(r, l) * F.modes[l];
      top[r] = v;
    }
    double bottom = 0;
    for (long l = 0; l < static_cast<long>(F.modes.size()); ++l) {
      if (l < N)
        top[ns + l] = F.modes[l];
      else
        bottom = Rnd::add_up(bottom, arith::mag_up(F.modes[l]));
    }
    res.bounds.Y0 = Rnd::add_up(apply_norm_up(A, top), bottom);
  }
  // Λ_d (V2.9) and Z₂ = ‖A‖ Σ_quad 2|c| Λ_{d1} Λ_{d2}.
  res.lift_norm.assign(m.p + 1, 0.0);
  for (int d = 0; d <= m.p; ++d) {
    double L = up(model::taylor_lift(m, d, 0));
    for (int e = d; e < m.p; ++e)
      if (!m.fixed_at_0[e]) L = std::max(L, up(model::taylor_inv_factorial<Id>(e - d)));
    res.lift_norm[d] = L;
  }
  {
    double s = 0;
    for (const auto& t : m.quad)
      s = Rnd::add_up(s, Rnd::mul_up(Rnd::mul_up(2.0, arith::mag_up(t.coef)),
                                     Rnd::mul_up(res.lift_norm[t.d1], res.lift_norm[t.d2])));
    res.bounds.Z2 = Rnd::mul_up(res.bounds.A_norm, s);
  }
  const RadiiVerdict v = radii_polynomial(res.bounds.Y0, res.bounds.Z0, res.bounds.Z1, res.bounds.Z2);
  res.certified = v.certified;
  res.failure = v.failure;
  res.existence_radius = v.existence_radius;
  res.uniqueness_radius = v.uniqueness_radius;
  if (v.certified) {
    for (int d = 0; d <= m.p; ++d) res.sup_error.push_back(Rnd::mul_up(res.lift_norm[d], v.existence_radius));
    res.sup_error.push_back(v.existence_radius);
  }
  return res;
}

template <arith::Interval I>
Id value_impl(const model::TaylorModel<I>& m, const std::vector<I>& xbar, const TaylorNKResult& r,
              const model::ValueKey& k) {
  const I ball(-r.existence_radius, r.existence_radius);
  I v;
  if (k.d < 0) {
    v = xbar[m.k_index()] + ball;
  } else if (k.at == 0 && k.d < m.p && m.fixed_at_0[k.d]) {
    v = *m.fixed_at_0[k.d];
  } else if (k.at == 0 && k.d < m.p) {
    v = xbar[m.free_index(k.d)] + ball;
  } else {
    const auto G = model::taylor_derivatives(m, xbar);
    const I p = k.at == 1 ? model::taylor_at_1(G[k.d]) : model::taylor_eval(G[k.d], I(k.at));
    v = p + I(-r.sup_error[k.d], r.sup_error[k.d]);
  }
  return arith::to_id(v * I(k.scale));
}
}  // namespace

TaylorNKResult taylor_nk_verify(const model::TaylorModel<Id>& m, const std::vector<Id>& xbar) {
  const arith::FpEnvScope fp_env;  // caller's rounding mode and flags restored on exit (arith/fp_env.hpp)
  return verify_core(m, xbar, nullptr, nullptr);
}

TaylorNKResult taylor_nk_verify_mpfr(const model::TaylorModel<Im>& m, const std::vector<Im>& xbar) {
  const arith::FpEnvScope fp_env;  // caller's rounding mode and flags restored on exit (arith/fp_env.hpp)
  const auto md = model::convert_taylor<Id>(m, [](const Im& v) { return arith::to_id(v); });
  std::vector<Id> xd;
  for (const Im& v : xbar) xd.push_back(arith::to_id(v));
  return verify_core(md, xd, &m, &xbar);
}

Id taylor_value_mpfr(const model::TaylorModel<Im>& m, const std::vector<Im>& xbar, const TaylorNKResult& r,
                     const model::ValueKey& k) {
  return value_impl(m, xbar, r, k);
}

Id taylor_value(const model::TaylorModel<Id>& m, const std::vector<Id>& xbar, const TaylorNKResult& r,
                const model::ValueKey& k) {
  return value_impl(m, xbar, r, k);
}

}  // namespace porecert::proof
