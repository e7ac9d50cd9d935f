#include "proof/structure.hpp"

#include <algorithm>
#include <cstdio>

namespace porecert::proof {

using arith::Id;
using R = arith::rounded_nearest_outward;

namespace {
void push_merged(std::vector<Span>& v, Span s) {
  if (!v.empty() && v.back().second >= s.first) {
    v.back().second = std::max(v.back().second, s.second);
  } else {
    v.push_back(s);
  }
}
bool covers(const std::vector<Span>& v, double a, double b) {
  for (const Span& s : v)
    if (s.first <= a && b <= s.second) return true;
  return false;
}
// Points in both sorted, merged span lists.
std::vector<Span> intersect(const std::vector<Span>& a, const std::vector<Span>& b) {
  std::vector<Span> out;
  std::size_t i = 0, j = 0;
  while (i < a.size() && j < b.size()) {
    const double lo = std::max(a[i].first, b[j].first), hi = std::min(a[i].second, b[j].second);
    if (lo <= hi) push_merged(out, {lo, hi});
    (a[i].second < b[j].second) ? ++i : ++j;
  }
  return out;
}
// Sign cover valid for every member of the family (the series are its vertices, M3.13).
SignCover cover_all(const std::vector<std::array<cheb::Series<Id>, 4>>& vs, int d, double err) {
  SignCover c = sign_cover(vs[0][d], err, 0.0, 1.0);
  for (std::size_t k = 1; k < vs.size(); ++k) {
    const SignCover o = sign_cover(vs[k][d], err, 0.0, 1.0);
    c.positive = intersect(c.positive, o.positive);
    c.negative = intersect(c.negative, o.negative);
  }
  return c;
}
}  // namespace

SignCover sign_cover(const cheb::Series<Id>& s_full, double err, double a, double b, double tol) {
  // Drop the coefficients whose ℓ¹ tail is negligible; the dropped norm joins the error (sup ≤ ℓ¹).
  cheb::Series<Id> s = s_full;
  {
    const double total = cheb::norm1_up(s_full);
    double tail = 0;
    std::size_t keep = s.size();
    while (keep > 8) {
      const double t = R::add_up(tail, arith::mag_up(s[keep - 1]));
      if (t > 1e-14 * std::max(1.0, total)) break;
      tail = t;
      --keep;
    }
    s.resize(keep);
    err = R::add_up(err, tail);
  }
  const cheb::Series<Id> ds = cheb::derivative(s);
  const double L = cheb::norm1_up(ds);
  SignCover out;
  // Depth-first from the left so the output comes sorted.
  std::vector<Span> stack{{a, b}};
  std::size_t budget = 400000;
  while (!stack.empty() && budget-- > 0) {
    const Span box = stack.back();
    stack.pop_back();
    const double m = box.first + (box.second - box.first) / 2;
    const double half = std::max(R::sub_up(m, box.first), R::sub_up(box.second, m));
    // Lipschitz bound on the box: the global ℓ¹ one, or the (loose but local) Clenshaw range of s'.
    const double Lbox = std::min(L, arith::mag_up(cheb::eval(ds, Id(box.first, box.second))));
    const Id v = cheb::eval(s, Id(m)) + Id(-err, err) + Id(-R::mul_up(Lbox, half), R::mul_up(Lbox, half));
    if (v.lower() > 0) {
      push_merged(out.positive, box);
    } else if (v.upper() < 0) {
      push_merged(out.negative, box);
    } else if (box.second - box.first <= tol) {
      push_merged(out.unsure, box);
    } else {
      stack.push_back({m, box.second});
      stack.push_back({box.first, m});
    }
  }
  for (const Span& s2 : stack) push_merged(out.unsure, s2);  // budget exhausted: unsure, never dropped
  return out;
}

std::string spans_text(const std::vector<Span>& v) {
  std::string t;
  char buf[80];
  for (const Span& s : v) {
    std::snprintf(buf, sizeof buf, "%s[%.6g, %.6g]", t.empty() ? "" : ", ", s.first, s.second);
    t += buf;
  }
  return t.empty() ? "none" : t;
}

Structure classify(const std::array<cheb::Series<Id>, 4>& D, const std::array<double, 4>& e, const Id& fp0) {
  return classify(std::vector<std::array<cheb::Series<Id>, 4>>{D}, e, fp0);
}

Structure classify(const std::vector<std::array<cheb::Series<Id>, 4>>& vertices, const std::array<double, 4>& e,
                   const Id& fp0) {
  Structure st;
  if (vertices.empty()) {
    st.label = "unclassified";
    st.reason = "no profile given";
    return st;
  }
  const SignCover c0 = cover_all(vertices, 0, e[0]);
  const SignCover c1 = cover_all(vertices, 1, e[1]);
  const SignCover c2 = cover_all(vertices, 2, e[2]);
  const SignCover c3 = cover_all(vertices, 3, e[3]);
  st.reversal_where = c1.negative;
  st.f_negative = c0.negative;
  // f'' < 0 on (0, 1]: f''' < 0 on [0, eta1] (with f''(0) = 0 exactly) and f'' < 0 on [eta1, 1].
  double eta1 = 1.0;
  for (auto it = c2.negative.rbegin(); it != c2.negative.rend(); ++it)
    if (it->second >= eta1 && it->first < eta1) eta1 = it->first;
  const bool type1 = eta1 < 1.0 && (eta1 == 0.0 || covers(c3.negative, 0.0, eta1));
  // Then f' > 0 on [0,1) follows from f'(1) >= 0, which the true solution meets exactly: f'(1) = 0,
  // or f'(1) = -beta f''(1) > 0 with slip beta > 0 (f''(1) < 0 here).
  // Any label: f' > 0 certified on [0, eta1] and f'' < 0 on [eta1, 1] give f' > f'(1) >= 0 on
  // [eta1, 1) as well, so no reversal (type II: the velocity peak off the centre plane, then a
  // monotone fall to the wall).
  const bool fp_positive = eta1 < 1.0 && covers(c1.positive, 0.0, eta1);
  if (!c1.negative.empty()) {
    st.reversal = arith::Tri::yes;
  } else if (type1 || fp_positive) {
    st.reversal = arith::Tri::no;
  }
  char buf[320];
  if (type1) {
    st.label = "I";
    std::snprintf(
        buf, sizeof buf,
        "certified: f''' < 0 on [0, %.3g] and f'' < 0 on [%.3g, 1]; with f''(0) = 0 and f'(1) >= 0 (f'(1) = 0, "
        "or -beta f''(1) > 0 with slip) this gives f'' < 0 on (0,1] and f' > 0 on [0,1)",
        eta1, eta1);
    st.reason = buf;
  } else if (fp0.upper() < 0) {
    st.label = "III";
    st.reason = "certified: f'(0) < 0; f < 0 on " + spans_text(c0.negative);
  } else if (fp0.lower() > 0 && !c2.positive.empty()) {
    st.label = "II";
    st.reason = "certified: f'(0) > 0 and f'' > 0 on " + spans_text(c2.positive);
  } else {
    st.label = "unclassified";
    st.reason = "no structural property could be certified";
  }
  return st;
}

}  // namespace porecert::proof
