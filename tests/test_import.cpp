// Submissions from other programs (lib/candidate/import.hpp, lib/proof/submission.hpp):
// validation of CSV input, and the rigorous distance of a real solver's output from the truth.
#include <doctest/doctest.h>

#include <cmath>
#include <cstdio>
#include <fstream>
#include <string>

#include "candidate/import.hpp"
#include "proof/submission.hpp"
#include "reference/berman_shooting.hpp"
#include "support/run_cli.hpp"

using namespace porecert;

namespace {
using ::porecert::test::Run;
constexpr auto porecert_run = ::porecert::test::porecert_cli;
const std::string bad = PORECERT_SOURCE_DIR "/tests/data/bad/";
bool has(const std::string& s, const std::string& w) { return s.find(w) != std::string::npos; }
}  // namespace

TEST_CASE("CSV bad input: exit 2 and a message naming the row or column, the value and the rule") {
  auto r = porecert_run("import " + bad + "bad_header.csv --R=1");
  CHECK(r.rc == 2);
  CHECK(has(r.out, "header column 'g'"));
  r = porecert_run("import " + bad + "nan.csv --R=1");
  CHECK(r.rc == 2);
  CHECK(has(r.out, "row 5"));
  CHECK(has(r.out, "column f"));
  CHECK(has(r.out, "'nan'"));
  r = porecert_run("import " + bad + "unsorted.csv --R=1");
  CHECK(r.rc == 2);
  CHECK(has(r.out, "row 7"));  // rows 6 and 7 (x = 0.5, 0.6) swapped
  CHECK(has(r.out, "strictly increasing"));
  r = porecert_run("import " + bad + "few_rows.csv --R=1");
  CHECK(r.rc == 2);
  CHECK(has(r.out, "3 data rows"));
  CHECK(has(r.out, "at least 8"));
  r = porecert_run("import " + bad + "no_f.csv --R=1");
  CHECK(r.rc == 2);
  CHECK(has(r.out, "column 'f' is missing"));
  r = porecert_run("import " + bad + "does-not-exist.csv --R=1");
  CHECK(r.rc == 2);
}

TEST_CASE("interpolants reproduce cubics exactly (R1, R2)") {
  // Invented data: f = (3x - x^3)/2 (the exact R = 0 solution) and f' at 11 nodes; both the
  // Hermite (R1) and the four-point (R2) interpolants of a cubic are the cubic itself.
  candidate::Submission s;
  s.kind = candidate::Submission::Kind::csv;
  s.column[0].emplace();
  s.column[1].emplace();
  for (int i = 0; i <= 10; ++i) {
    const double x = i / 10.0;
    char b[3][64];
    std::snprintf(b[0], 64, "%d/10", i);
    s.x.push_back(i == 10 ? "1" : "0." + std::to_string(i));
    std::snprintf(b[1], 64, "%.17g", (3 * x - x * x * x) / 2);
    std::snprintf(b[2], 64, "%.17g", 1.5 * (1 - x * x));
    s.column[0]->push_back(b[1]);
    s.column[1]->push_back(b[2]);
  }
  for (int k : {0, 1}) {
    const auto P = candidate::pieces<double>(s, k);
    for (double e : {0.03, 0.47, 0.99}) {
      int i = std::min(9, static_cast<int>(e * 10));
      const double want = k == 0 ? (3 * e - e * e * e) / 2 : 1.5 * (1 - e * e);
      CHECK(std::fabs(candidate::piece_eval(P[i], e, 0) - want) < 1e-13);
    }
  }
}

TEST_CASE("scipy solve_bvp output at R = 10: certified, with a rigorous distance that the reference confirms") {
  // tests/data/scipy_solve_bvp_R10.csv: SciPy 1.10 solve_bvp (a general-purpose collocation solver),
  // produced by tests/data/solve_bvp_berman.py. The outside check: the reference solver
  // (tests/reference/berman_shooting.hpp, Boost.Odeint in 80 digits) gives f'(0), f'''(0), f''(1); the
  // submitted values at the mesh ends must lie within the certified distances of them.
  const auto s = candidate::read_csv(PORECERT_SOURCE_DIR "/tests/data/scipy_solve_bvp_R10.csv");
  proof::CertifyRequest req;
  req.R_lo = req.R_hi = "10";
  const auto r = proof::certify_submission(req, s);
  REQUIRE(r.outcome.certified);
  REQUIRE(r.distance);
  const auto ref = berman_ref::make_reference(berman_ref::solve_type1("10"));
  const double a_sub = std::stod((*s.column[1])[0]), b_sub = std::stod((*s.column[3])[0]);
  const double fpp1_sub = std::stod((*s.column[2]).back());
  const auto& d = *r.distance;
  for (int k = 0; k < 4; ++k) {
    REQUIRE(d.sup[k]);
    CHECK(d.sup[k]->lower <= d.sup[k]->upper);
  }
  // Points are in the sup; the slack 1e-15 covers the double rounding of the reference digits.
  CHECK(std::fabs(a_sub - ref.fp0_d) <= d.sup[1]->upper + 1e-15);
  CHECK(std::fabs(fpp1_sub - ref.fpp1_d) <= d.sup[2]->upper + 1e-15);
  CHECK(std::fabs(b_sub - ref.fppp0_d) <= d.sup[3]->upper + 1e-15);
  // Not loose: the observed end-point errors are within a factor 10 of the certified sup (the sup is
  // over the whole interval, so it may exceed a single point's error; both are measured here).
  CHECK(d.sup[2]->upper <= 10 * std::max(1e-12, std::fabs(fpp1_sub - ref.fpp1_d)) + 1e-7);
  CHECK(d.sup[0]->upper < 1e-8);
}

TEST_CASE("Chebyshev series import: the exact R = 0 solution is at distance ~0, and R shifts it by O(R)") {
  // Exact case: at R = 0 the solution is (3η − η³)/2 (Berman 1953; docs/method.md), whose series
  // docs/examples/poiseuille-series.json holds exactly. The certified distance must be tiny.
  const auto s = candidate::read_chebyshev_json(PORECERT_SOURCE_DIR "/docs/examples/poiseuille-series.json");
  proof::CertifyRequest req;
  req.R_lo = req.R_hi = "0";
  auto r = proof::certify_submission(req, s);
  REQUIRE(r.outcome.certified);
  for (int k = 0; k < 4; ++k) CHECK(r.distance->sup[k]->upper < 1e-12);
  // At R = 0.01 the true profile differs from the R = 0 one by O(R): a positive lower bound is proved.
  req.R_lo = req.R_hi = "0.01";
  r = proof::certify_submission(req, s);
  REQUIRE(r.outcome.certified);
  CHECK(r.distance->sup[2]->lower > 1e-4);
  CHECK(r.distance->sup[2]->upper < 1e-2);
  // The distance of f''(1) is inside the sup: |−3 − f''(1)| ≤ sup|P2 − f''|.
  CHECK(std::fabs(-3 - 0.5 * (r.outcome.fpp1_id.lower() + r.outcome.fpp1_id.upper())) <= r.distance->sup[2]->upper);
}

TEST_CASE("Chebyshev JSON bad input: numbers refused, unknown keys refused") {
  std::ofstream(std::string("/tmp/porecert-test-key.json")) << "{\"series_of\": \"f\", \"coeffs\": []}";
  auto r = porecert_run("import /tmp/porecert-test-key.json --R=1");
  CHECK(r.rc == 2);
  CHECK(has(r.out, "unknown key \"coeffs\""));
  std::ofstream(std::string("/tmp/porecert-test-num.json"))
      << "{\"series_of\": \"f\", \"coefficients\": [0.5, 1, 2, 3]}";
  r = porecert_run("import /tmp/porecert-test-num.json --R=1");
  CHECK(r.rc == 2);
  CHECK(has(r.out, "coefficients[0]"));
  CHECK(has(r.out, "rounded to binary"));
}
