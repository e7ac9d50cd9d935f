// The reduced-ODE proof (lib/proof/reduced_ivp, docs/method.md §S): against the independent
// reference solver, against the Newton–Kantorovich proof, against large-suction asymptotics, and
// negative tests that must end "not certified".
#include <doctest/doctest.h>

#include <cstdio>
#include <cstdlib>
#include <fstream>
#include <sstream>

#include "arith/interval.hpp"
#include "candidate/reduced_shooting.hpp"
#include "proof/branches.hpp"
#include "proof/certify.hpp"
#include "proof/reduced_ivp.hpp"
#include "reference/berman_shooting.hpp"

using namespace porecert;

namespace {
proof::CertifyOutcome reduced(const std::string& R, const std::string& branch = "I") {
  proof::CertifyRequest q;
  q.R_lo = q.R_hi = R;
  q.branch = branch;
  q.method = "reduced";
  return proof::certify_berman(q);
}
// The reference's 40-digit decimal must meet the certified interval (its own accuracy: 1e-30).
bool inside(const std::string& v, const proof::Enclosure& e) {
  const arith::Id r = arith::from_decimal<arith::Id>(v);
  return e.lo_d - 1e-30 <= r.upper() && r.lower() <= e.hi_d + 1e-30;
}
arith::Id enc(const proof::Enclosure& e) { return arith::Id(e.lo_d, e.hi_d); }
}  // namespace

TEST_CASE("reduced method: reference shooting values lie inside the enclosures (types I, II)") {
  // tests/reference/berman_shooting.hpp: Boost.Odeint + 80-digit Boost.Multiprecision, no shared code.
  for (const char* Rs : {"-20", "3", "27", "41.5"}) {
    CAPTURE(std::string(Rs));
    const auto o = reduced(Rs);
    REQUIRE(o.certified);
    CHECK(o.method == "reduced-ivp");
    const auto ref = berman_type1_reference(Rs);
    CHECK(inside(ref.fp0, o.fp0));
    CHECK(inside(ref.fppp0, o.fppp0));
    CHECK(inside(ref.fpp1, o.fpp1));
    CHECK(inside(ref.K, o.K));
    CHECK(o.structure.label == "I");
    // Not vacuous: relative width at most 1e-10. For injection the fast mode decays; the QR set
    // (docs/method.md (S13)-(S15)) keeps the widths from wrapping (6e-14 at R = -20; 1e-6 before it).
    const double rel = 1e-10;
    for (const auto* e : {&o.fp0, &o.fpp1, &o.K}) CHECK(e->hi_d - e->lo_d <= rel * std::fabs(e->lo_d));
  }
  // Type II at R = 20 from the reference started near the reduced enclosure.
  const auto o2 = reduced("20", "II");
  REQUIRE(o2.certified);
  CHECK(o2.structure.label == "II");
  const auto ref2 = berman_reference_from("20", o2.fp0.lo_d, o2.fppp0.lo_d);
  CHECK(inside(ref2.fp0, o2.fp0));
  CHECK(inside(ref2.fpp1, o2.fpp1));
  CHECK(inside(ref2.K, o2.K));
}

TEST_CASE("reduced and Newton-Kantorovich enclosures of the same solution intersect") {
  // Two independent proofs: if both are right their enclosures must meet.
  for (const char* Rs : {"0.75", "15", "33"}) {
    CAPTURE(std::string(Rs));
    proof::CertifyRequest q;
    q.R_lo = q.R_hi = Rs;
    q.method = "newton";
    const auto nk = proof::certify_berman(q);
    const auto rd = reduced(Rs);
    REQUIRE(nk.certified);
    REQUIRE(rd.certified);
    CHECK(nk.method == "newton-kantorovich");
    for (auto [a, b] : {std::pair{&nk.fp0, &rd.fp0}, {&nk.fppp0, &rd.fppp0}, {&nk.fpp1, &rd.fpp1}, {&nk.K, &rd.K}})
      CHECK(!(a->hi_d < b->lo_d || b->hi_d < a->lo_d));
  }
}

TEST_CASE("R = 0.01: Berman's 1953 series up to the stated O(R^2) bound") {
  // Berman 1953 (J. Appl. Phys. 24:1232), re-derived in method.md; remainder bounded by 0.05 R².
  const double R = 0.01;
  const auto o = reduced("0.01");
  REQUIRE(o.certified);
  const double tol = 0.05 * R * R;
  CHECK(std::fabs(o.K.lo_d - (-3 + 81.0 / 35 * R)) < tol);
  CHECK(std::fabs(o.fpp1.lo_d - (-3 - 3.0 / 35 * R)) < tol);
  CHECK(std::fabs(o.fp0.lo_d - (1.5 - R / 140)) < tol);
  CHECK(std::fabs(o.fppp0.lo_d - (-3 + 9.0 / 140 * R)) < tol);
}

TEST_CASE("strong suction: R = 1000 types I and II, asymptotics and separation") {
  // Large suction, type I: f''(1) = -R + O(1), K = R + O(1), f'(0) -> 1 (common practice in the
  // asymptotic literature, e.g. Terrill 1964, from memory). Type II approaches type I, but the sign
  // of f'''(0) = sigma^4 s / R separates them (docs/method.md §S).
  const auto i1 = reduced("1000", "I");
  const auto i2 = reduced("1000", "II");
  REQUIRE(i1.certified);
  REQUIRE(i2.certified);
  CHECK(i1.structure.label == "I");
  CHECK(i2.structure.label == "II");
  CHECK(i1.structure.reversal == arith::Tri::no);
  CHECK(std::fabs(i1.fpp1.lo_d + 1000) < 2);
  CHECK(std::fabs(i1.K.lo_d - 1000) < 3);
  CHECK(std::fabs(i1.fp0.lo_d - 1) < 2e-3);
  CHECK(i1.fppp0.hi_d < 0);
  CHECK(i2.fppp0.lo_d > 0);
  CHECK(proof::distinct(i1, i2) == arith::Tri::yes);
  // The two are exponentially close: |f'''(0)| below 1e-100 (our own numerics; not a source).
  CHECK(std::fabs(i1.fppp0.lo_d) < 1e-100);
}

TEST_CASE("an interval of R: one reduced certificate contains the point ones") {
  proof::CertifyRequest q;
  q.R_lo = "99";
  q.R_hi = "101";
  q.method = "reduced";
  const auto wide = proof::certify_berman(q);
  REQUIRE(wide.certified);
  for (const char* Rs : {"99", "100", "101"}) {
    const auto p = reduced(Rs);
    REQUIRE(p.certified);
    CHECK(boost::numeric::subset(enc(p.K), enc(wide.K)));
    CHECK(boost::numeric::subset(enc(p.fpp1), enc(wide.fpp1)));
  }
}

TEST_CASE("negative: wrong R, wrong chart, bad endpoints all end not certified") {
  const auto good = reduced("27");
  REQUIRE(good.certified);
  const auto& r = *good.reduced;
  // The bracket for R = 27 cannot hold for R = 27.5.
  auto p = proof::reduced_prove("27.5", "27.5", 1, 1, r.s_lo, r.s_hi, r.S_lo, r.S_hi, 53);
  CHECK_FALSE(p.certified);
  CHECK(p.failure.find("bracket") != std::string::npos);
  // The other chart (f'(0) < 0): no such solution with these s.
  p = proof::reduced_prove("27", "27", -1, 1, r.s_lo, r.s_hi, r.S_lo, r.S_hi, 53);
  CHECK_FALSE(p.certified);
  // Swapped endpoints and a uniqueness set through s = 0.
  p = proof::reduced_prove("27", "27", 1, 1, r.s_hi, r.s_lo, r.S_lo, r.S_hi, 53);
  CHECK_FALSE(p.certified);
  p = proof::reduced_prove("27", "27", 1, 1, r.s_lo, r.s_hi, r.S_lo, "0x1p-10", 53);
  CHECK_FALSE(p.certified);
  // A bracket that is one ulp wide cannot straddle R: the proof must not claim it.
  p = proof::reduced_prove("27", "27", 1, 1, r.s_lo, r.s_lo, r.S_lo, r.S_hi, 53);
  CHECK_FALSE(p.certified);
  // The same endpoints re-prove at MPFR precision (the checker is precision-independent).
  p = proof::reduced_prove("27", "27", 1, 1, r.s_lo, r.s_hi, r.S_lo, r.S_hi, 96);
  CHECK(p.certified);
}

TEST_CASE("CLI: a reduced certificate re-checks; an edited value or a cut file is refused") {
  const std::string dir = "/tmp/porecert-test-reduced";
  std::system(("mkdir -p " + dir).c_str());
  auto run = [](const std::string& args) {
    FILE* p = popen((std::string(PORECERT_BINARY) + " " + args + " 2>&1").c_str(), "r");
    std::string out;
    char buf[4096];
    while (std::fgets(buf, sizeof buf, p)) out += buf;
    return std::pair{WEXITSTATUS(pclose(p)), out};
  };
  auto [rc, out] = run("verify --R=200 --json " + dir + "/r200.json");
  REQUIRE(rc == 0);
  CHECK(out.find("reduced ODE") != std::string::npos);
  CHECK(run("recheck " + dir + "/r200.json").first == 0);
  {
    // An interval of R (a sweep box): values by monotonicity (S12'), widened so that the re-proof at
    // 64 bits lies inside; the recheck must confirm every value (it failed before the widening).
    auto [rc2, out2] = run("verify --R=200:200.00001 --json " + dir + "/r200box.json");
    REQUIRE(rc2 == 0);
    std::ifstream bin(dir + "/r200box.json");
    std::stringstream bs;
    bs << bin.rdbuf();
    CHECK(bs.str().find("by monotonicity (S12')") != std::string::npos);
    CHECK(run("recheck " + dir + "/r200box.json").first == 0);
  }
  std::ifstream in(dir + "/r200.json");
  std::stringstream ss;
  ss << in.rdbuf();
  std::string text = ss.str();
  // Edit the stated f''(1) enclosure [lo, hi] into [lo, lo]: too narrow to hold the solution.
  const auto k = text.find("\"f''(1)\": [");
  REQUIRE(k != std::string::npos);
  const auto a0 = text.find('"', k + 10), a1 = text.find('"', a0 + 1);
  const auto b0 = text.find('"', a1 + 1), b1 = text.find('"', b0 + 1);
  const std::string lo = text.substr(a0, a1 - a0 + 1);
  std::string tampered = text.substr(0, b0) + lo + text.substr(b1 + 1);
  std::ofstream(dir + "/bad.json") << tampered;
  CHECK(run("recheck " + dir + "/bad.json").first == 1);
  std::ofstream(dir + "/cut.json") << text.substr(0, text.size() / 2);
  CHECK(run("recheck " + dir + "/cut.json").first == 2);
}

TEST_CASE("type II Newton start: the measured table leads the shooting to s > 0 from R = 13.4 to 56") {
  // Candidate side only (lib/candidate): the start must converge on the type II side of the chart.
  for (double R : {13.4, 13.8, 14.5, 17.0, 22.0, 28.0, 36.0, 45.0, 56.0}) {
    CAPTURE(R);
    const auto s = candidate::reduced_solve({1, 1}, R, proof::reduced_guess(R, 1, 1, 1));
    REQUIRE(s.has_value());
    CHECK(*s > 0);
    const auto shot = candidate::reduced_shoot({1, 1}, *s);
    REQUIRE(shot.ok);
    CHECK(std::fabs(static_cast<double>(shot.R) - R) < 1e-9 * R);
  }
}
