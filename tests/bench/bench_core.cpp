// Benchmark of the arithmetic core (not a test): midpoint-radius vs naive interval matrix products, Chebyshev products
// in Id and Im-128, and Id vs Im-128 dot products. Prints N, method, seconds per call. Run: make bench
// (docs/performance.md, "Arithmetic core").
#include <chrono>
#include <cstdio>
#include <functional>
#include <random>
#include <string>
#include <vector>

#include "arith/cheb.hpp"
#include "arith/midrad.hpp"

using namespace porecert;
using arith::Id;
using arith::Im;
using arith::MatD;
using arith::MidRad;

namespace {
// Seconds per call: repeat until min_total seconds have passed (at least once, at most max_reps).
double time_it(const std::function<void()>& f, int& reps, double min_total = 0.5, int max_reps = 50) {
  using clk = std::chrono::steady_clock;
  reps = 0;
  const auto t0 = clk::now();
  double el = 0;
  do {
    f();
    ++reps;
    el = std::chrono::duration<double>(clk::now() - t0).count();
  } while (el < min_total && reps < max_reps);
  return el / reps;
}
void row(long n, const std::string& method, double s, int reps, const std::string& note = "") {
  std::printf("| %7ld | %-38s | %12.6f | %4d | %s\n", n, method.c_str(), s, reps, note.c_str());
  std::fflush(stdout);
}
std::string sci(double v) {
  char b[32];
  std::snprintf(b, sizeof b, "%.3g", v);
  return b;
}
volatile double sink = 0;  // keeps results alive
}  // namespace

int main(int argc, char** argv) {
  const bool skip_naive_1000 = argc > 1 && std::string(argv[1]) == "--skip-naive-1000";
  std::mt19937_64 g(42);
  std::uniform_real_distribution<double> u(-1, 1);
  std::printf("| N       | method                                 | seconds/call | reps | note\n");
  std::printf("|---------|----------------------------------------|--------------|------|-----\n");

  for (long n : {200L, 500L, 1000L}) {
    MatD A(n, n), Bm(n, n), Br(n, n);
    for (long j = 0; j < n; ++j)
      for (long i = 0; i < n; ++i) {
        A(i, j) = u(g);
        Bm(i, j) = u(g);
        Br(i, j) = std::ldexp(std::fabs(u(g)), -40);
      }
    const MidRad B{Bm, Br};
    int reps = 0;
    double rad_max = 0;
    const double t = time_it(
        [&] {
          const MidRad C = arith::product(A, B);
          rad_max = C.rad.maxCoeff();
          sink = sink + C.mid(0, 0);
        },
        reps);
    row(n, "midrad product (Eigen, 2 GEMMs)", t, reps, "max rad " + sci(rad_max));

    if (n == 1000 && skip_naive_1000) {
      row(n, "naive Id triple loop", 0, 0, "skipped (--skip-naive-1000)");
      continue;
    }
    std::vector<Id> Ai(static_cast<std::size_t>(n * n), Id(0.0)), Bi(Ai), Ci(Ai);
    for (long j = 0; j < n; ++j)
      for (long i = 0; i < n; ++i) {
        Ai[static_cast<std::size_t>(i + n * j)] = Id(A(i, j));
        Bi[static_cast<std::size_t>(i + n * j)] = Id(arith::rounded_nearest_outward::sub_down(Bm(i, j), Br(i, j)),
                                                     arith::rounded_nearest_outward::add_up(Bm(i, j), Br(i, j)));
      }
    double wmax = 0;
    const double tn = time_it(
        [&] {
          for (long j = 0; j < n; ++j)
            for (long i = 0; i < n; ++i) {
              Id s(0.0);
              for (long k = 0; k < n; ++k)
                s += Ai[static_cast<std::size_t>(i + n * k)] * Bi[static_cast<std::size_t>(k + n * j)];
              Ci[static_cast<std::size_t>(i + n * j)] = s;
            }
          for (const Id& c : Ci) wmax = std::max(wmax, boost::numeric::width(c) / 2);
          sink = sink + Ci[0].lower();
        },
        reps, 0.5, n == 1000 ? 1 : 50);
    row(n, "naive Id triple loop", tn, reps, "max rad " + sci(wmax) + (n == 1000 ? " (1 rep)" : ""));
  }

  {  // Chebyshev product, N = 1000 coefficients each
    const long n = 1000;
    cheb::Series<Id> a, b;
    for (long k = 0; k < n; ++k) {
      a.push_back(Id(u(g) / static_cast<double>(k + 1)));
      b.push_back(Id(u(g) / static_cast<double>(k + 1)));
    }
    int reps = 0;
    const double t = time_it([&] { sink = sink + cheb::product(a, b)[0].lower(); }, reps);
    row(n, "Chebyshev product, Id", t, reps);
    arith::PrecisionScope ps(128);
    cheb::Series<Im> am, bm;
    for (long k = 0; k < n; ++k) {
      am.push_back(arith::from_id<Im>(a[static_cast<std::size_t>(k)]));
      bm.push_back(arith::from_id<Im>(b[static_cast<std::size_t>(k)]));
    }
    const double tm = time_it([&] { sink = sink + cheb::product(am, bm)[0].lower().to_double(); }, reps, 0.5, 3);
    row(n, "Chebyshev product, Im-128", tm, reps);
  }

  {  // dot product of length 10^5
    const long n = 100000;
    std::vector<Id> x, y;
    for (long k = 0; k < n; ++k) {
      x.push_back(Id(u(g)));
      y.push_back(Id(u(g)));
    }
    int reps = 0;
    const double t = time_it(
        [&] {
          Id s(0.0);
          for (long k = 0; k < n; ++k) s += x[static_cast<std::size_t>(k)] * y[static_cast<std::size_t>(k)];
          sink = sink + s.lower();
        },
        reps);
    row(n, "dot product, Id", t, reps);
    arith::PrecisionScope ps(128);
    std::vector<Im> xm, ym;
    for (long k = 0; k < n; ++k) {
      xm.push_back(arith::from_id<Im>(x[static_cast<std::size_t>(k)]));
      ym.push_back(arith::from_id<Im>(y[static_cast<std::size_t>(k)]));
    }
    const double tm = time_it(
        [&] {
          Im s(0);
          for (long k = 0; k < n; ++k) s += xm[static_cast<std::size_t>(k)] * ym[static_cast<std::size_t>(k)];
          sink = sink + s.lower().to_double();
        },
        reps);
    row(n, "dot product, Im-128", tm, reps);
  }
  return 0;
}
