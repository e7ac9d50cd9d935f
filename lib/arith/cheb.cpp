#include "arith/cheb.hpp"

#include <cmath>

namespace porecert::cheb {

namespace {
template <class S>
S cos_pi_times(long num, long den) {  // cos(π num/den), round-to-nearest
  if constexpr (std::is_same_v<S, double>) {
    return std::cos(M_PI * static_cast<double>(num) / static_cast<double>(den));
  } else {
    arith::Mpfr t;
    mpfr_const_pi(t.get(), MPFR_RNDN);
    mpfr_mul_si(t.get(), t.get(), num, MPFR_RNDN);
    mpfr_div_si(t.get(), t.get(), den, MPFR_RNDN);
    mpfr_cos(t.get(), t.get(), MPFR_RNDN);
    return t;
  }
}
}  // namespace

template <class S>
std::vector<S> chebyshev_points(std::size_t n) {
  std::vector<S> p(n);
  for (std::size_t j = 0; j < n; ++j)
    p[j] = (S(1) + cos_pi_times<S>(static_cast<long>(2 * j + 1), static_cast<long>(2 * n))) / S(2);
  return p;
}

template <class S>
Series<S> coeffs_from_values(const std::vector<S>& v) {
  const std::size_t n = v.size();
  Series<S> c(n, S(0));
  // cos(π k (2j+1)/(2n)) depends on k(2j+1) mod 4n only: tabulate once.
  std::vector<S> table(4 * n);
  for (std::size_t m = 0; m < 4 * n; ++m) table[m] = cos_pi_times<S>(static_cast<long>(m), static_cast<long>(2 * n));
  for (std::size_t k = 0; k < n; ++k) {
    S s(0);
    for (std::size_t j = 0; j < n; ++j) s += v[j] * table[(k * (2 * j + 1)) % (4 * n)];
    c[k] = s * S(2) / S(static_cast<double>(n));
  }
  c[0] = c[0] / S(2);
  return c;
}

template std::vector<double> chebyshev_points<double>(std::size_t);
template std::vector<arith::Mpfr> chebyshev_points<arith::Mpfr>(std::size_t);
template Series<double> coeffs_from_values<double>(const std::vector<double>&);
template Series<arith::Mpfr> coeffs_from_values<arith::Mpfr>(const std::vector<arith::Mpfr>&);

}  // namespace porecert::cheb
