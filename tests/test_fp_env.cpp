// The floating-point environment of every public entry point (docs/soundness.md §5).
// Contract (lib/arith/fp_env.hpp): an entry point runs in the IEEE default environment whatever the
// caller set, and gives the caller its environment back. So (a) results are bit-identical under
// FE_TONEAREST, FE_UPWARD, FE_DOWNWARD, FE_TOWARDZERO, with flush-to-zero / denormals-are-zero set,
// and with FE_INVALID / FE_DIVBYZERO / FE_OVERFLOW traps enabled; (b) afterwards the rounding
// mode, the exception flags (exactly the caller's, none added), the trap mask and MXCSR are as before.
#include <doctest/doctest.h>

#include <cfenv>
#include <cstring>
#include <functional>
#include <string>
#include <vector>
#if defined(__x86_64__)
#include <xmmintrin.h>
#endif

#include "candidate/galerkin_newton.hpp"
#include "certificate/certificate.hpp"
#include "model/berman.hpp"
#include "model/case_file.hpp"
#include "proof/branches.hpp"
#include "proof/certify.hpp"
#include "proof/direct.hpp"
#include "proof/greens.hpp"
#include "proof/newton_kantorovich.hpp"

using namespace porecert;
using arith::Id;

namespace {

// The bits of every number a result states, for an exact comparison.
using Bits = std::vector<std::uint64_t>;
void add(Bits& b, double d) {
  std::uint64_t u;
  std::memcpy(&u, &d, sizeof u);
  b.push_back(u);
}
void add(Bits& b, const Id& x) {
  add(b, x.lower());
  add(b, x.upper());
}
void add(Bits& b, const std::string& s) {
  for (unsigned char c : s) b.push_back(c);
  b.push_back(0xffff);
}
Bits of(const proof::CertifyOutcome& o) {
  Bits b;
  b.push_back(o.certified);
  for (const Id& x : {o.fp0_id, o.K_id, o.fpp1_id, o.fppp0_id}) add(b, x);
  for (double d : {o.Y0, o.Z0, o.Z1, o.Z2, o.existence_radius, o.uniqueness_radius}) add(b, d);
  for (const auto& h : o.candidate_hex) add(b, h);
  for (const auto* e : {&o.fp0, &o.fppp0, &o.fpp1, &o.K}) add(b, e->lo + ":" + e->hi);
  return b;
}

struct Env {
  int round;
  bool ftz, traps;
  const char* name;
};

// Runs f in the caller environment env with the flags `raised` already up; checks the environment
// afterwards and returns f's result bits.
Bits run_in(const Env& env, const std::function<Bits()>& f) {
  std::feclearexcept(FE_ALL_EXCEPT);
  REQUIRE(std::fesetround(env.round) == 0);
#if defined(__x86_64__)
  const unsigned csr0 = _mm_getcsr();
  if (env.ftz) _mm_setcsr(_mm_getcsr() | 0x8040);  // FTZ (bit 15) and DAZ (bit 6)
#endif
  const int raised = FE_UNDERFLOW;  // a flag the caller had up before the call
  std::feraiseexcept(raised);
#if defined(__GLIBC__)
  if (env.traps) feenableexcept(FE_INVALID | FE_DIVBYZERO | FE_OVERFLOW);
#endif
#if defined(__x86_64__)
  const unsigned csr_before = _mm_getcsr();
#endif
  const Bits out = f();
  const int round_after = std::fegetround();
  const int flags_after = std::fetestexcept(FE_ALL_EXCEPT);
#if defined(__x86_64__)
  const unsigned csr_after = _mm_getcsr();
#endif
#if defined(__GLIBC__)
  const int traps_after = fegetexcept();
  fedisableexcept(FE_ALL_EXCEPT);
  CHECK(traps_after == (env.traps ? (FE_INVALID | FE_DIVBYZERO | FE_OVERFLOW) : 0));
#endif
#if defined(__x86_64__)
  _mm_setcsr(csr0);
  // MXCSR holds the SSE flags too: compare with the state just before the call, which had them.
  CHECK(((csr_after ^ csr_before) & ~0x3fu) == 0);  // control bits (rounding, FTZ, DAZ, masks) unchanged
#endif
  std::fesetround(FE_TONEAREST);
  CHECK(round_after == env.round);
  CHECK(flags_after == raised);  // the caller's flags exactly: none cleared, none added
  std::feclearexcept(FE_ALL_EXCEPT);
  return out;
}

void same_everywhere(const char* what, const std::function<Bits()>& f) {
  CAPTURE(std::string(what));
  const Env envs[] = {{FE_TONEAREST, false, false, "nearest"},      {FE_UPWARD, false, false, "upward"},
                      {FE_DOWNWARD, false, false, "downward"},      {FE_TOWARDZERO, false, false, "toward zero"},
                      {FE_UPWARD, true, false, "upward + FTZ/DAZ"}, {FE_TONEAREST, false, true, "traps enabled"}};
  const Bits ref = run_in(envs[0], f);
  for (const Env& e : envs) {
    CAPTURE(std::string(e.name));
    CHECK(run_in(e, f) == ref);
  }
}

}  // namespace

TEST_CASE("certify_berman, certify_from, recheck_berman: same bits, caller's environment restored") {
  proof::CertifyRequest q;
  q.R_lo = q.R_hi = "2.5";
  same_everywhere("certify_berman", [&] { return of(proof::certify_berman(q)); });
  proof::CertifyRequest qi = q;
  qi.R_lo = "-1.5";
  qi.R_hi = "-1.25";
  same_everywhere("certify_berman, interval R", [&] { return of(proof::certify_berman(qi)); });
  const auto o = proof::certify_berman(q);
  REQUIRE(o.certified);
  std::vector<double> x;
  for (const auto& h : o.candidate_hex) x.push_back(arith::from_decimal<Id>(h).lower());
  same_everywhere("certify_from", [&] { return of(proof::certify_from(q, x)); });
  proof::CertifyRequest q53 = q;
  q53.precision_bits = 53;
  const auto d = proof::certify_berman(q53);
  REQUIRE(d.certified);
  same_everywhere("recheck_berman (double)",
                  [&] { return of(proof::recheck_berman("2.5", "2.5", d.candidate_hex, 53)); });
  same_everywhere("recheck_berman (MPFR)",
                  [&] { return of(proof::recheck_berman("2.5", "2.5", o.candidate_hex, o.precision_bits)); });
}

TEST_CASE("nk_verify, certify_branches, certify_direct, greens: same bits, environment restored") {
  auto make = [](double r) { return model::berman<double>(r); };
  const auto c = candidate::continuation(make, candidate::poiseuille(make(0.0), 24), 0.0, 1.0, 3000, nullptr);
  REQUIRE(c.converged);
  same_everywhere("nk_verify<Id>", [&] {
    std::vector<Id> xb(c.x.begin(), c.x.end());
    const auto r = proof::nk_verify(model::berman(Id(1)), xb);
    Bits b;
    b.push_back(r.certified);
    for (const Id& v : {r.fp0, r.fppp0, r.fpp1, r.K}) add(b, v);
    for (double v : r.c3_error) add(b, v);
    return b;
  });
  same_everywhere("certify_branches", [&] {
    proof::CertifyRequest q;
    q.R_lo = q.R_hi = "4";
    const auto br = proof::certify_branches(q);
    Bits b;
    for (const auto& s : br.solutions) {
      const Bits o = of(s);
      b.insert(b.end(), o.begin(), o.end());
    }
    return b;
  });
  same_everywhere("certify_direct", [&] {
    const auto r = proof::certify_direct(arith::from_decimal<Id>("0.27"));
    Bits b;
    b.push_back(r.certified);
    add(b, r.radius);
    add(b, r.uniqueness_radius);
    for (const Id& v : r.beta) add(b, v);
    return b;
  });
  same_everywhere("greens_beta_detailed", [&] {
    Bits b;
    for (const auto& s : proof::greens_beta_detailed<Id>(1e-8)) add(b, s.value);
    return b;
  });
}

TEST_CASE("readers: case file, R, certificate: same result, environment restored, also when they throw") {
  const std::string toml = "[flow]\nreynolds = [\"0.1\", \"0.3\"]\n[certify]\nstart = [1.1, -0.5]\nmodes = 40\n";
  same_everywhere("read_case_text", [&] {
    const auto cs = model::read_case_text(toml, "t.toml");
    Bits b;
    add(b, cs.R->first + ":" + cs.R->second);
    add(b, cs.start->first);  // a TOML float (a guess): parsed the same in every rounding mode
    add(b, cs.start->second);
    return b;
  });
  same_everywhere("read_case_text, bad input", [&] {
    Bits b;
    try {
      (void)model::read_case_text("[flow]\nreynolds = 12.5\n", "t.toml");
    } catch (const model::input_error& e) {
      add(b, std::string(e.what()));
    }
    REQUIRE(!b.empty());
    return b;
  });
  proof::CertifyRequest q;
  q.R_lo = q.R_hi = "1";
  q.precision_bits = 53;
  const auto o = proof::certify_berman(q);
  REQUIRE(o.certified);
  const std::string text = certificate::to_json({"1", "1", "I", ""}, o).dump(2) + "\n";
  same_everywhere("certificate parse_text + parse", [&] {
    const auto s = certificate::parse(certificate::parse_text(text, "c.json"));
    Bits b;
    add(b, s.existence_radius);
    for (const auto& h : s.candidate_hex) add(b, h);
    // "seconds" is a JSON float: strtod follows the rounding mode unless parse_text resets it.
    add(b, certificate::parse_text(text, "c.json")["seconds"].get<double>());
    return b;
  });
  same_everywhere("certificate parse, bad input", [&] {
    Bits b;
    try {
      (void)certificate::parse(certificate::parse_text(text.substr(0, text.size() / 2), "c.json"));
    } catch (const certificate::format_error& e) {
      add(b, std::string(e.what()));
    }
    REQUIRE(!b.empty());
    return b;
  });
}
