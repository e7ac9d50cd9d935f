#include "proof/claims.hpp"

#include <optional>

#include "model/berman.hpp"
#include "model/operator.hpp"
#include "proof/branches.hpp"
#include "proof/radii.hpp"
#include "proof/structure.hpp"

namespace porecert::proof {

using arith::Id;
using arith::Im;
using arith::Tri;
using model::Claim;
using Rnd = arith::rounded_nearest_outward;

namespace {

constexpr int kExactBits = 1024;  // decimal comparisons: both sides rounded outward at 1024 bits

Im num(const std::string& d) { return arith::from_decimal<Im>(d); }

const Enclosure& enclosure_of(const CertifyOutcome& o, const std::string& key) {
  if (!o.model.is_berman()) {  // the model's own value keys (docs/models.md §0), checked by the reader
    for (const auto& nv : o.values)
      if (nv.key == key) return nv.enc;
    throw std::logic_error("claims: value key '" + key + "' not among the certified values");
  }
  if (key == "f'(0)") return o.fp0;
  if (key == "f'''(0)") return o.fppp0;
  if (key == "f''(1)") return o.fpp1;
  return o.K;
}

std::string interval_text(const std::string& lo, const std::string& hi) { return "[" + lo + ", " + hi + "]"; }

Verdict value_claim(const Claim& c, const CertifyOutcome& o) {
  arith::PrecisionScope scope(kExactBits);
  const Enclosure& e = enclosure_of(o, c.quantity);
  const Im E = boost::numeric::hull(num(e.lo), num(e.hi));
  const Im v = num(c.value), t = num(c.tolerance);
  const Im tol = c.relative ? t * boost::numeric::abs(v) : t;
  const arith::Mpfr clo = (v - tol).lower(), chi = (v + tol).upper();
  Verdict r;
  std::string unit;
  const std::string digits = certified_digits(e.lo, e.hi, &unit);
  r.evidence = "certified " + c.quantity + " in " + interval_text(e.lo, e.hi) +
               (digits.empty() ? "" : " (certified digits " + digits + ", +/- " + unit + "/2)");
  if (clo <= E.lower() && E.upper() <= chi) {
    r.holds = Tri::yes;
  } else if (E.upper() < clo || E.lower() > chi) {
    r.holds = Tri::no;
  } else {
    r.to_decide =
        "the enclosure overlaps an end of the claimed interval; a narrower enclosure (more precision, e.g. "
        "precision_bits = 256) or a different tolerance would decide";
  }
  return r;
}

Verdict bound_claim(const Claim& c, const CertifyOutcome& o) {
  arith::PrecisionScope scope(kExactBits);
  const Enclosure& e = enclosure_of(o, c.quantity);
  const Im E = boost::numeric::hull(num(e.lo), num(e.hi));
  const Im X = num(c.bound);
  Verdict r;
  r.evidence = "certified " + c.quantity + " in " + interval_text(e.lo, e.hi);
  const Tri less = arith::tri_less(E, X);  // true value < bound ?
  r.holds = c.below ? less : (arith::tri_less(X, E));
  if (r.holds == Tri::unsure)
    r.to_decide = "the enclosure contains the bound " + c.bound + "; a narrower enclosure would decide";
  return r;
}

std::array<cheb::Series<Id>, 4> lift_candidate(const CertifyOutcome& o) {
  const model::Model<Id> m = model::berman<Id>(Id(0));
  std::vector<Id> x;
  for (const auto& h : o.candidate_hex) x.push_back(arith::from_decimal<Id>(h));
  return model::lift(model::constants_of(m, x), model::u_of(m, x));
}

Verdict sign_claim(const Claim& c, const CertifyOutcome& o) {
  Verdict r;
  const Id a = arith::from_decimal<Id>(c.a), b = arith::from_decimal<Id>(c.b);
  const std::string name = c.order == 0 ? "f" : std::string("f") + std::string(c.order, '\'');
  // Exact boundary values: f(0) = 0, f''(0) = 0, f(1) = 1, f'(1) = 0 (the true solution meets them).
  const bool has0 = c.a_closed && a.upper() == 0, has1 = c.b_closed && b.lower() == 1;
  if ((c.order == 0 || c.order == 2) && has0) {
    r.holds = Tri::no;
    r.evidence =
        name + "(0) = 0 exactly (boundary condition), so " + name + (c.positive ? " > 0" : " < 0") + " fails at 0";
    return r;
  }
  // With a slip wall f'(1) = -beta f''(1) need not vanish: only f(1) = 1 is exact there.
  const bool fp1_zero = !o.model.has("slip");
  if (has1 && ((c.order == 1 && fp1_zero) || (c.order == 0 && !c.positive))) {
    r.holds = Tri::no;
    r.evidence =
        name + "(1) = " + (c.order == 1 ? "0" : "1") + " exactly (boundary condition), so the claim fails at 1";
    return r;
  }
  // Type I (any half-channel model): f'' < 0 on (0,1] makes f' decrease to f'(1) >= 0 (f'(1) = 0, or
  // -beta f''(1) > 0 with slip), so f' > 0 on [0,1) too.
  if (o.structure.label == "I" && ((c.order == 1 && c.positive && (b.upper() < 1 || !c.b_closed)) ||
                                   (c.order == 2 && !c.positive && (a.lower() > 0 || !c.a_closed)))) {
    r.holds = Tri::yes;
    r.evidence = "certified type I structure: " + o.structure.reason;
    return r;
  }
  const auto D = lift_candidate(o);
  const SignCover cov = sign_cover(D[c.order], o.c3_error[c.order], a.lower(), b.upper(), 1e-7);
  const auto& good = c.positive ? cov.positive : cov.negative;
  const auto& bad = c.positive ? cov.negative : cov.positive;
  for (const Span& s : good)
    if (s.first <= a.lower() && b.upper() <= s.second) {
      r.holds = Tri::yes;
      r.evidence = "certified: " + name + (c.positive ? " > 0" : " < 0") + " on " + spans_text({s}) +
                   " (candidate's series +/- the certified error " + short_number(o.c3_error[c.order]) + ")";
      return r;
    }
  for (const Span& s : bad)
    if (std::max(s.first, a.upper()) < std::min(s.second, b.lower())) {
      r.holds = Tri::no;
      r.evidence = "certified: " + name + (c.positive ? " < 0" : " > 0") + " on " + spans_text({s});
      return r;
    }
  r.evidence = "sign certified on " + spans_text(good) + "; unsure on " + spans_text(cov.unsure);
  r.to_decide =
      "a smaller error bound (more precision or modes) where the sign is unsure, unless " + name + " has a zero there";
  return r;
}

Verdict unique_claim(const Claim& c, const CertifyOutcome& o) {
  Verdict r;
  const double rad = arith::from_decimal<Id>(c.radius).upper();
  const double need = c.about_candidate ? rad : Rnd::add_up(rad, o.existence_radius);
  r.evidence = "certified: unique in the open ball of radius " + short_number(o.uniqueness_radius) +
               " about the candidate; the solution lies within " + short_number(o.existence_radius) +
               " of it (norm: |f'(0)| + |K| + l1 of the Chebyshev coefficients of f''')";
  if (need <= o.uniqueness_radius) {
    r.holds = Tri::yes;
  } else {
    r.to_decide = "a uniqueness radius of at least " + short_number(need) +
                  " (more modes or precision lower Z and Z2); uniqueness is disproved only by a second certified "
                  "solution inside the ball";
  }
  return r;
}

struct Search {
  int found = 0, distinct = 0;
  std::string region;
};

Verdict solutions_claim(const Claim& c, const Search& s) {
  Verdict r;
  r.evidence = "the branch search of " + s.region + " found " + std::to_string(s.found) + " certified solutions, " +
               std::to_string(s.distinct) + " of them proved pairwise distinct (so at least that many solutions exist)";
  if (c.exactly) {
    if (s.distinct > c.count) {
      r.holds = Tri::no;
    } else if (s.found == c.count && s.distinct == c.count) {
      r.holds = Tri::yes;
      r.evidence += "; no claim is made about solutions outside the searched region";
    } else {
      r.to_decide = "the search is not exhaustive: it cannot show that fewer solutions exist";
    }
  } else {
    r.holds = s.distinct >= c.count ? Tri::yes : Tri::unsure;
    if (r.holds == Tri::unsure) r.to_decide = "a search that finds and certifies more distinct solutions";
  }
  return r;
}

}  // namespace

std::string certified_digits(const std::string& lo, const std::string& hi, std::string* unit) {
  arith::PrecisionScope scope(kExactBits);
  const Im L = num(lo), H = num(hi);
  const arith::Mpfr m = ((L + H) / Im(2)).lower();
  const Im mid(m, m);              // a point: its rounding down and up bracket the nearest decimal
  for (int d = 40; d >= 1; --d) {  // d significant digits
    for (const std::string& D : {arith::decimal_lower(mid, d), arith::decimal_upper(mid, d)}) {
      const auto e = D.find_first_of("eE");
      if (e == std::string::npos) continue;
      const int expo = std::stoi(D.substr(e + 1));
      const std::string u = "1e" + std::to_string(expo - d + 1);
      const Im half = num("5e" + std::to_string(expo - d));
      const Im Dv = num(D);
      if ((Dv - half).upper() < L.lower() && H.upper() < (Dv + half).lower()) {
        if (unit) *unit = u;
        return D;
      }
    }
  }
  return "";
}

std::vector<Verdict> judge(const model::ClaimsFile& f, const CertifyRequest& req, const CertifyOutcome& o) {
  std::vector<Verdict> out;
  std::optional<Search> search;
  for (const Claim& c : f.claims) {
    Verdict v;
    if (!o.certified) {
      v.evidence = "no certified solution: " + o.failure;
      v.to_decide = "a candidate that certifies";
    } else {
      switch (c.kind) {
        case Claim::Kind::value:
          v = value_claim(c, o);
          break;
        case Claim::Kind::bound:
          v = bound_claim(c, o);
          break;
        case Claim::Kind::sign:
          v = sign_claim(c, o);
          break;
        case Claim::Kind::unique:
          v = unique_claim(c, o);
          break;
        case Claim::Kind::solutions:
          if (!search) {
            const BranchesOutcome b = certify_branches(req);
            Search s;
            s.region = b.region;
            std::vector<const CertifyOutcome*> kept;
            for (const auto& sol : b.solutions) {
              if (!sol.certified) continue;
              ++s.found;
              bool new_one = true;
              for (const auto* k : kept) new_one = new_one && distinct(sol, *k) == Tri::yes;
              if (new_one) kept.push_back(&sol);
            }
            s.distinct = static_cast<int>(kept.size());
            search = s;
          }
          v = solutions_claim(c, *search);
          break;
      }
    }
    v.index = c.index;
    v.claim = c.text;
    out.push_back(v);
  }
  return out;
}

}  // namespace porecert::proof
