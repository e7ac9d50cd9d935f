#include "proof/sweep.hpp"

#include <cmath>
#include <cstdio>
#include <limits>
#include <stdexcept>

namespace porecert::proof::sweep {

using arith::Id;
using arith::Im;

namespace {
// The decimal text of v with `decimals` digits after the point.
std::string fixed(double v, int decimals) {
  char buf[64];
  std::snprintf(buf, sizeof buf, "%.*f", decimals, v);
  std::string s = buf;
  if (s.find('.') != std::string::npos) {
    while (s.back() == '0') s.pop_back();
    if (s.back() == '.') s.pop_back();
  }
  if (s == "-0") s = "0";
  return s;
}
// Component i of the centre c at Rc: x̄_i + (Rc − R0) x1_i, or x̄_i without a tangent (exact data,
// zero past the end); at the caller's MPFR precision.
Im centre_component(const Centre& c, const Im& Rc, std::size_t i) {
  if (i >= c.coefficients.size()) return Im(0);
  Im x = arith::from_decimal<Im>(c.coefficients[i]);
  if (!c.tangent.empty()) {
    if (c.tangent.size() != c.coefficients.size())
      throw std::invalid_argument("tangent and candidate differ in length");
    x = x + (Rc - arith::from_decimal<Im>(c.R0)) * arith::from_decimal<Im>(c.tangent[i]);
  }
  return x;
}
// Certainly a < b as real numbers (both decimal strings).
bool certainly_less(const std::string& a, const std::string& b) {
  return arith::tri_less(arith::from_decimal<Id>(a), arith::from_decimal<Id>(b)) == arith::Tri::yes;
}
}  // namespace

double approx_width(const std::string& lo, const std::string& hi) {
  return arith::mid_double(arith::from_decimal<Id>(hi)) - arith::mid_double(arith::from_decimal<Id>(lo));
}

std::vector<std::string> cut_points(const std::string& lo, const std::string& hi, long n) {
  if (n < 1) throw std::invalid_argument("cut_points: n must be >= 1");
  const double a = arith::mid_double(arith::from_decimal<Id>(lo)), b = arith::mid_double(arith::from_decimal<Id>(hi));
  const double step = (b - a) / static_cast<double>(n);
  if (!(step > 0)) throw std::invalid_argument("range [" + lo + ", " + hi + "] is empty or too narrow");
  // A resolution of step/1000 keeps the points short and leaves every box within 0.2 % of step.
  const int decimals = std::max(0, std::min(30, static_cast<int>(std::ceil(-std::log10(step / 1000)))));
  std::vector<std::string> p{lo};
  for (long k = 1; k < n; ++k) {
    std::string s = fixed(a + static_cast<double>(k) * step, decimals);
    if (!certainly_less(p.back(), s)) {
      char buf[40];
      std::snprintf(buf, sizeof buf, "%.17g", a + static_cast<double>(k) * step);
      s = buf;
      if (!certainly_less(p.back(), s))
        throw std::invalid_argument("range [" + lo + ", " + hi + "] is too narrow for " + std::to_string(n) +
                                    " boxes in double precision");
    }
    p.push_back(s);
  }
  if (!certainly_less(p.back(), hi))
    throw std::invalid_argument("range [" + lo + ", " + hi + "] is too narrow for " + std::to_string(n) +
                                " boxes in double precision");
  p.push_back(hi);
  return p;
}

std::string split_point(const std::string& lo, const std::string& hi) {
  try {
    return cut_points(lo, hi, 2)[1];
  } catch (const std::invalid_argument&) {
    return "";
  }
}

double candidate_distance_up(const std::vector<std::string>& a, const std::vector<std::string>& b) {
  return centre_distance_up({a, {}, ""}, {b, {}, ""}, "0");
}

double centre_distance_up(const Centre& a, const Centre& b, const std::string& R_joint) {
  arith::PrecisionScope scope(2200);
  const Im Rc = arith::from_decimal<Im>(R_joint);
  Im sum(0);
  const std::size_t n = std::max(a.coefficients.size(), b.coefficients.size());
  for (std::size_t i = 0; i < n; ++i)
    sum = sum + boost::numeric::abs(centre_component(a, Rc, i) - centre_component(b, Rc, i));
  return arith::upper_up(sum);
}

ChartPoint berman_chart_point(const Centre& c, double r_up, const std::string& R_joint) {
  arith::PrecisionScope scope(2200);
  const Im Rc = arith::from_decimal<Im>(R_joint);
  if (!(arith::lower_down(Rc) > 0 || arith::upper_up(Rc) < 0))
    throw std::invalid_argument("berman_chart_point: R = " + R_joint + " must be nonzero");
  if (c.coefficients.size() < 3) throw std::invalid_argument("berman_chart_point: candidate shorter than 3");
  const auto comp = [&](std::size_t i) { return centre_component(c, Rc, i); };
  const Im ball(-r_up, r_up);
  const Im fp0 = comp(0) + ball;
  Im u0(0);  // u(0) = Σ_k u_k T_k(−1) = Σ_k (−1)^k u_k (cheb::value_at_0)
  for (std::size_t i = 2; i < c.coefficients.size(); ++i) u0 = (i % 2 == 0) ? u0 + comp(i) : u0 - comp(i);
  const Im fppp0 = u0 + ball;
  ChartPoint p{arith::to_id(fp0), Id::whole()};
  if (arith::lower_down(fp0) > 0 || arith::upper_up(fp0) < 0)
    p.s = arith::to_id(fppp0 / (Rc * boost::numeric::square(fp0)));
  return p;
}

arith::Tri glued_mixed(const ChartPoint& p, bool f_prime_positive, int eps, int nth, const std::string& S_lo,
                       const std::string& S_hi, const std::string& R_joint) {
  const Id Rc = arith::from_decimal<Id>(R_joint);
  const int sign_R = Rc.lower() > 0 ? 1 : Rc.upper() < 0 ? -1 : 0;
  if (!f_prime_positive || !(p.fp0.lower() > 0) || sign_R == 0 || eps != sign_R || nth != 1) return arith::Tri::unsure;
  arith::PrecisionScope scope(1100);  // the stored S ends (at most 1024 bits) are exact here
  const double lo_up = arith::upper_up(arith::from_decimal<Im>(S_lo));
  const double hi_down = arith::lower_down(arith::from_decimal<Im>(S_hi));
  return lo_up < p.s.lower() && p.s.upper() < hi_down ? arith::Tri::yes : arith::Tri::unsure;
}

arith::Tri glued(double dist_up, const std::string& exist_a, const std::string& uniq_a, const std::string& exist_b,
                 const std::string& uniq_b) {
  const auto uniq_down = [](const std::string& s) {
    return s == "inf" ? std::numeric_limits<double>::infinity() : arith::from_decimal<Id>(s).lower();
  };
  const auto reach_up = [&](const std::string& e) {
    return (Id(dist_up) + Id(arith::from_decimal<Id>(e).upper())).upper();
  };
  if (reach_up(exist_b) < uniq_down(uniq_a) || reach_up(exist_a) < uniq_down(uniq_b)) return arith::Tri::yes;
  return arith::Tri::unsure;
}

}  // namespace porecert::proof::sweep
