#include "candidate/model_search.hpp"

#include <cmath>
#include <cstdio>

#include "model/operator.hpp"

namespace porecert::candidate {

Vec mirror_full_channel(const model::Model<double>& m, const Vec& x) {
  // g̃(x) = −g(1 − x): g̃''' = g'''(1 − x), so u_k ↦ (−1)^k u_k; g̃''(0) = −g''(1); K unchanged.
  const auto D = model::lift(model::constants_of(m, x), model::u_of(m, x));
  Vec y = x;
  y[m.free_index(2)] = -cheb::value_at_1(D[2]);
  for (int k = 1; k < static_cast<int>(x.size()) - m.n_scalars(); k += 2) y[m.n_scalars() + k] = -x[m.n_scalars() + k];
  return y;
}

namespace {
Vec zero_solution(const model::ModelSpec& spec, int n_max) {
  const auto m0 = model::build_model<double>(spec, 0.0);
  return solve_with_decay(m0, Vec(m0.n_scalars() + 24, 0.0), 24, n_max).x;
}
}  // namespace

SearchReport find_model_solutions(const model::ModelSpec& spec, double R, int n_max) {
  SearchReport rep;
  auto make_R = [spec](double r) { return model::build_model<double>(spec, r); };
  const auto m = make_R(R);
  auto add = [&](Vec x, const std::string& origin) {
    // Distinct by the scalars and f'''(0) of the candidate (the free constant, K and u(0)).
    const auto D = model::lift(model::constants_of(m, x), model::u_of(m, x));
    const double a = x[0], b = cheb::value_at_0(D[3]), c = cheb::value_at_1(D[2]);
    for (const Found& f : rep.found) {
      const auto E = model::lift(model::constants_of(m, f.x), model::u_of(m, f.x));
      const double c2 = cheb::value_at_1(E[2]);
      if (std::fabs(f.a - a) < 1e-6 * (1 + std::fabs(a)) && std::fabs(f.b - b) < 1e-6 * (1 + std::fabs(b)) &&
          std::fabs(c2 - c) < 1e-6 * (1 + std::fabs(c)))
        return;
    }
    rep.found.push_back({std::move(x), a, b, origin});
  };
  const auto c = continuation(make_R, zero_solution(spec, n_max), 0.0, R, n_max);
  rep.log.push_back(std::string("continuation in R from R = 0: ") + (c.converged ? "converged" : c.note));
  if (c.converged) add(c.x, "continuation in R from R = 0");
  rep.region = "continuation in R from the R = 0 solution";
  if (spec.name != "full-channel") return rep;

  const std::string a_text = spec.get("wall-ratio", "1");
  const double a = model::decimal_as<double>(a_text);
  char buf[200];
  for (double da : {-0.5, 0.5}) {
    model::ModelSpec s2 = spec;
    const double a2 = a + da;
    std::snprintf(buf, sizeof buf, "%.17g", a2);
    s2.set("wall-ratio", buf);
    auto make2 = [s2](double r) { return model::build_model<double>(s2, r); };
    const auto c2 = continuation(make2, zero_solution(s2, n_max), 0.0, R, n_max);
    if (!c2.converged) {
      rep.log.push_back(std::string("continuation in R at a = ") + buf + ": " + c2.note);
      continue;
    }
    // Continuation in a at fixed R (the same routine, with a as its parameter).
    auto make_a = [spec, R](double aa) {
      model::ModelSpec s3 = spec;
      char b3[64];
      std::snprintf(b3, sizeof b3, "%.17g", aa);
      s3.set("wall-ratio", b3);
      return model::build_model<double>(s3, R);
    };
    const auto c3 = continuation(make_a, c2.x, a2, a, n_max);
    rep.log.push_back(std::string("continuation in R at a = ") + buf + ", then in a to " + a_text + ": " +
                      (c3.converged ? "converged" : c3.note));
    if (c3.converged) add(c3.x, std::string("continuation in R at a = ") + buf + ", then in a");
  }
  rep.region = "continuation in R from R = 0 at a, a - 1/2 and a + 1/2, the latter two then continued in a to a";
  if (model::decimal_as<double>(a_text) == 1.0) {
    const std::size_t n = rep.found.size();
    for (std::size_t i = 0; i < n; ++i)
      add(mirror_full_channel(m, rep.found[i].x), "mirror image of " + rep.found[i].origin);
    rep.region += "; for a = 1 the mirror image of each";
  }
  return rep;
}

}  // namespace porecert::candidate
