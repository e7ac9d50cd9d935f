// Adversarial trials (docs/soundness.md §1): random damage to good candidates and to certificates.
// Every trial must end "not certified" / rejected, or every certified enclosure must contain the
// independent reference (tests/reference/berman_shooting.hpp: Boost.Odeint + cpp_bin_float at 80
// digits, no code shared with lib/). A certified enclosure that misses the reference is a false
// certificate and fails the test, printed with its seed so it can be replayed.
//
// Count: PORECERT_TRIALS core trials (default 1500) times PORECERT_TEST_SCALE (default 1); the big
// run of docs/soundness.md is `PORECERT_TRIALS=100000 build/test_adversarial`. Seed: PORECERT_SEED.
#include <doctest/doctest.h>
#include <sys/wait.h>

#include <cctype>
#include <chrono>
#include <cstdio>
#include <cstdlib>
#include <fstream>
#include <limits>
#include <map>
#include <nlohmann/json.hpp>
#include <random>
#include <sstream>
#include <string>
#include <vector>

#include "candidate/galerkin_newton.hpp"
#include "model/berman.hpp"
#include "proof/branches.hpp"
#include "proof/certify.hpp"
#include "proof/newton_kantorovich.hpp"
#include "reference/berman_shooting.hpp"

using namespace porecert;
using arith::Id;

namespace {

double env_double(const char* name, double dflt) {
  const char* s = std::getenv(name);
  return s && *s ? std::atof(s) : dflt;
}
long trial_count(double dflt) {
  return std::max(1L, static_cast<long>(env_double("PORECERT_TRIALS", dflt) * env_double("PORECERT_TEST_SCALE", 1)));
}

// The reference value as an interval: its 40-digit decimal, enclosed outward, widened by the
// reference's own accuracy (1e-30 relative; the solver's half-step check is 1e-42).
Id ref_interval(const std::string& v) {
  const Id r = arith::from_decimal<Id>(v);
  const double slack = 1e-30 * (1 + std::max(std::fabs(r.lower()), std::fabs(r.upper())));
  return Id(std::nextafter(r.lower() - slack, -INFINITY), std::nextafter(r.upper() + slack, INFINITY));
}
bool meets(const Id& certified, const Id& ref) {
  return !(certified.upper() < ref.lower() || ref.upper() < certified.lower());
}

struct Point {
  std::string R;  // decimal text, exact
  BermanReference ref;
  candidate::Vec x;  // good (non-rigorous) type I candidate
};

// Grid of R, type I: tiny |R| (down to 1e-300), both signs, a few moderate values. One reference and
// one candidate each, computed once and shared by all trials.
const std::vector<Point>& grid() {
  static const std::vector<Point> g = [] {
    std::vector<Point> out;
    for (const char* R : {"-4", "-1.5", "-0.25", "-1e-9", "-1e-300", "0", "1e-300", "1e-9", "0.5", "1", "1.25", "3"}) {
      Point p;
      p.R = R;
      p.ref = berman_type1_reference(R);
      const double Rd = std::atof(R);
      auto make = [](double r) { return model::berman<double>(r); };
      const auto c = candidate::continuation(make, candidate::poiseuille(make(0.0), 24), 0.0, Rd, 3000, nullptr);
      REQUIRE(c.converged);
      p.x = c.x;
      out.push_back(std::move(p));
    }
    return out;
  }();
  return g;
}

struct Tally {
  long trials = 0, certified = 0, rejected = 0, false_certificates = 0;
};

// The proof core in double intervals about x at R = [lo, hi]; checks every enclosure against refs.
void prove_and_check(const std::string& what, unsigned long seed, const Id& R, const candidate::Vec& x,
                     const std::vector<const BermanReference*>& refs, Tally& t) {
  ++t.trials;
  std::vector<Id> xb(x.begin(), x.end());
  proof::NKResult<Id> r;
  try {
    r = proof::nk_verify(model::berman(R), xb);
  } catch (const std::invalid_argument&) {  // fewer than 8 modes: the documented refusal
    ++t.rejected;
    return;
  }
  if (!r.certified) {
    ++t.rejected;
    return;
  }
  ++t.certified;
  bool ok = !refs.empty();  // a certificate with nothing to check it against counts as false
  for (const BermanReference* ref : refs)
    ok = ok && meets(r.fp0, ref_interval(ref->fp0)) && meets(r.fppp0, ref_interval(ref->fppp0)) &&
         meets(r.fpp1, ref_interval(ref->fpp1)) && meets(r.K, ref_interval(ref->K));
  if (!ok) {
    ++t.false_certificates;
    std::printf("FALSE CERTIFICATE: %s, seed %lu, R = [%a, %a], f'(0) in [%a, %a], K in [%a, %a]\n", what.c_str(), seed,
                R.lower(), R.upper(), r.fp0.lower(), r.fp0.upper(), r.K.lower(), r.K.upper());
  }
}

Id R_of(const std::string& s) { return arith::from_decimal<Id>(s); }

}  // namespace

TEST_CASE("adversarial candidates: perturbed, cut, wrong R, interval R, tiny and huge R") {
  const auto& g = grid();
  const auto m0 = model::berman<double>(0.0);
  const long n = trial_count(1500);
  const unsigned long seed0 = static_cast<unsigned long>(env_double("PORECERT_SEED", 20261202));
  std::map<std::string, Tally> tally;
  const auto t0 = std::chrono::steady_clock::now();
  for (long i = 0; i < n; ++i) {
    const unsigned long seed = seed0 + static_cast<unsigned long>(i);
    std::mt19937_64 rng(seed);
    auto uni = [&](double a, double b) { return std::uniform_real_distribution<double>(a, b)(rng); };
    auto pick = [&](std::size_t k) { return std::uniform_int_distribution<std::size_t>(0, k - 1)(rng); };
    const std::size_t a = pick(g.size());
    const Point& p = g[a];
    candidate::Vec x = p.x;
    const int N = candidate::modes_of(m0, x);
    switch (i % 7) {
      case 0: {  // coefficients perturbed: relative size 1e-16 .. 1e-1 on a random subset
        const double eps = std::pow(10.0, uni(-16, -1));
        const double share = uni(0, 1);
        for (double& v : x)
          if (uni(0, 1) < share) v += eps * uni(-1, 1) * (std::fabs(v) + 1e-300);
        prove_and_check("perturbed", seed, R_of(p.R), x, {&p.ref}, tally["perturbed coefficients"]);
        break;
      }
      case 1: {  // modes cut off (down to below the proof's minimum of 8) or padded with noise
        const int keep = static_cast<int>(pick(static_cast<std::size_t>(N))) + 1;
        x = candidate::with_modes(m0, x, keep);
        if (uni(0, 1) < 0.3) {
          x = candidate::with_modes(m0, x, N + 8);
          for (int k = keep; k < N + 8; ++k) x[2 + k] = std::pow(10.0, uni(-20, -2)) * uni(-1, 1);
        }
        prove_and_check("cut", seed, R_of(p.R), x, {&p.ref}, tally["modes cut / padded"]);
        break;
      }
      case 2: {  // wrong R: the candidate of one grid R proved at another
        std::size_t b = pick(g.size());
        if (b == a) b = (a + 1) % g.size();
        prove_and_check("wrong R", seed, R_of(g[b].R), x, {&g[b].ref}, tally["wrong R"]);
        break;
      }
      case 3: {  // an interval of R between two grid points, candidate one end, the other or between
        std::size_t b = pick(g.size());
        const std::size_t lo = std::min(a, b), hi = std::max(a, b);
        const double w = uni(0, 1);
        candidate::Vec xl = g[lo].x, xh = g[hi].x;
        const int M = std::max(candidate::modes_of(m0, xl), candidate::modes_of(m0, xh));
        xl = candidate::with_modes(m0, xl, M);
        xh = candidate::with_modes(m0, xh, M);
        for (std::size_t k = 0; k < xl.size(); ++k) xl[k] = (1 - w) * xl[k] + w * xh[k];
        std::vector<const BermanReference*> refs;
        for (std::size_t k = lo; k <= hi; ++k) refs.push_back(&g[k].ref);  // the grid is sorted by R
        prove_and_check("interval R", seed, boost::numeric::hull(R_of(g[lo].R), R_of(g[hi].R)), xl, refs,
                        tally["interval of R"]);
        break;
      }
      case 4: {  // huge |R| (the supported limit 1e5 and nearby) with a small-R candidate: no reference exists,
                 // so any certificate here counts as false
        static const char* huge[] = {"1e5", "-1e5", "99999.75", "-5e4", "2e4", "-3.3e4"};
        prove_and_check("huge R", seed, R_of(huge[pick(6)]), x, {}, tally["huge |R|"]);
        break;
      }
      case 5: {  // structured damage: a sign flipped, an entry zeroed or huge or subnormal, all scaled, scalars swapped
        const std::size_t k = pick(x.size());
        switch (pick(5)) {
          case 4: {  // an entry overflowing the arithmetic, or subnormal
            const double e[4] = {1e300, -std::numeric_limits<double>::max(), 4.9e-324, -1e-310};
            x[k] = e[pick(4)];
            break;
          }
          case 0:
            x[k] = -x[k];
            break;
          case 1:
            x[k] = 0;
            break;
          case 2:
            for (double& v : x) v *= 1 + std::pow(10.0, uni(-15, -1)) * (uni(0, 1) < 0.5 ? -1 : 1);
            break;
          default:
            std::swap(x[0], x[1]);
            break;
        }
        prove_and_check("damaged", seed, R_of(p.R), x, {&p.ref}, tally["sign / zero / scale / swap"]);
        break;
      }
      default: {  // the unchanged candidate at its own R (the control: these should certify)
        prove_and_check("good", seed, R_of(p.R), x, {&p.ref}, tally["unchanged (control)"]);
        break;
      }
    }
  }
  const double secs = std::chrono::duration<double>(std::chrono::steady_clock::now() - t0).count();
  Tally all;
  for (const auto& [name, t] : tally) {
    std::printf("  %-28s %8ld trials %8ld certified %8ld rejected %4ld false\n", name.c_str(), t.trials, t.certified,
                t.rejected, t.false_certificates);
    all.trials += t.trials;
    all.certified += t.certified;
    all.rejected += t.rejected;
    all.false_certificates += t.false_certificates;
  }
  std::printf(
      "adversarial candidates: %ld trials, %ld certified (all contain the reference), %ld rejected, %ld false; "
      "%.0f trials/s\n",
      all.trials, all.certified, all.rejected, all.false_certificates, all.trials / secs);
  CHECK(all.false_certificates == 0);
  // The trials are not vacuous: controls certify, and damage is caught.
  CHECK(tally["unchanged (control)"].certified == tally["unchanged (control)"].trials);
  CHECK(tally["huge |R|"].certified == 0);
  CHECK(all.rejected > 0);
}

TEST_CASE("adversarial driver: certify_from about damaged candidates, swapped branch at R = 20") {
  // The whole driver (mode choice, polishing, MPFR remedies, labels) about a damaged candidate: it
  // may repair the candidate, but what it certifies must contain the reference of the certified label.
  proof::CertifyRequest q;
  q.R_lo = q.R_hi = "20";
  const auto b = proof::certify_branches(q);
  std::map<std::string, BermanReference> ref;
  std::map<std::string, candidate::Vec> cand;
  for (const auto& s : b.solutions) {
    REQUIRE(s.certified);
    ref[s.structure.label] = berman_reference_from("20", s.fp0.lo_d, s.fppp0.lo_d);  // the guess only starts Newton
    candidate::Vec x;
    for (const auto& h : s.candidate_hex) x.push_back(arith::from_decimal<Id>(h).lower());
    cand[s.structure.label] = x;
  }
  REQUIRE(ref.size() == 3);  // types I, II, III (docs/branches.md)
  // The three references are distinct solutions: a swapped label cannot pass by accident.
  CHECK(std::fabs(ref["I"].fp0_d - ref["II"].fp0_d) > 1e-3);
  CHECK(std::fabs(ref["II"].fp0_d - ref["III"].fp0_d) > 1e-3);
  const long n = std::max(3L, trial_count(1500) / 100);
  long certified = 0, false_certs = 0;
  for (long i = 0; i < n; ++i) {
    std::mt19937_64 rng(7 + i);
    const char* labels[3] = {"I", "II", "III"};
    const std::string from = labels[i % 3];
    candidate::Vec x = cand[from];
    const double eps = std::pow(10.0, std::uniform_real_distribution<double>(-14, -3)(rng));
    for (double& v : x) v *= 1 + eps * std::uniform_real_distribution<double>(-1, 1)(rng);
    proof::CertifyRequest r = q;
    r.branch = from == "I" ? "II" : "I";  // the request names the wrong branch; certify_from must not care
    const auto o = proof::certify_from(r, x);
    if (!o.certified) continue;
    ++certified;
    const auto it = ref.find(o.structure.label);
    const bool ok = it != ref.end() && meets(o.fp0_id, ref_interval(it->second.fp0)) &&
                    meets(o.K_id, ref_interval(it->second.K)) && meets(o.fpp1_id, ref_interval(it->second.fpp1)) &&
                    meets(o.fppp0_id, ref_interval(it->second.fppp0));
    if (!ok) {
      ++false_certs;
      std::printf("FALSE CERTIFICATE: driver trial %ld from type %s labelled '%s'\n", i, from.c_str(),
                  o.structure.label.c_str());
    }
  }
  std::printf("adversarial driver: %ld trials, %ld certified, %ld false\n", n, certified, false_certs);
  CHECK(false_certs == 0);
  CHECK(certified > 0);
}

namespace {
struct Run {
  int rc;
  std::string out;
};
Run run_cli(const std::string& args) {
  const std::string cmd = std::string(PORECERT_BINARY) + " " + args + " 2>&1";
  FILE* p = popen(cmd.c_str(), "r");
  std::string out;
  char buf[4096];
  while (std::fgets(buf, sizeof buf, p)) out += buf;
  const int st = pclose(p);
  return {WIFEXITED(st) ? WEXITSTATUS(st) : 128 + WTERMSIG(st), out};
}
std::string slurp(const std::string& path) {
  std::ifstream in(path, std::ios::binary);
  std::stringstream ss;
  ss << in.rdbuf();
  return ss.str();
}
}  // namespace

TEST_CASE("tampered certificates: recheck rejects, refuses, or confirms only what contains the reference") {
  const std::string dir = "/tmp/porecert-test-adversarial";
  std::system(("mkdir -p " + dir).c_str());
  const std::string base_path = dir + "/base.json";
  REQUIRE(run_cli("verify --R=0.5 --json " + base_path).rc == 0);
  const std::string base = slurp(base_path);
  const nlohmann::json j0 = nlohmann::json::parse(base);
  const auto& g = grid();
  const long n = std::max(8L, trial_count(1500) / 30);
  long rc_count[4] = {0, 0, 0, 0}, false_confirm = 0, other = 0;
  for (long i = 0; i < n; ++i) {
    std::mt19937_64 rng(99 + i);
    auto pick = [&](std::size_t k) { return std::uniform_int_distribution<std::size_t>(0, k - 1)(rng); };
    nlohmann::json j = j0;
    std::string text;
    switch (i % 8) {
      case 0: {  // one hex digit of one coefficient changed, or the coefficient made huge
        auto& c = j["candidate"]["coefficients_hex"];
        const std::size_t k = pick(c.size());
        std::string h = c[k];
        const std::size_t at = h.find('.') + 1 + pick(8);
        if (at < h.size() && std::isxdigit(static_cast<unsigned char>(h[at]))) h[at] = h[at] == '7' ? '8' : '7';
        c[k] = pick(3) == 0 ? std::string(pick(2) ? "0x1p+1020" : "-0x1.fffffffffffffp+1023") : h;
        break;
      }
      case 1:  // R moved to another grid value
        j["R"] = {g[pick(g.size())].R, g[pick(g.size())].R};
        break;
      case 2: {  // a stated value enclosure narrowed or shifted
        const char* keys[4] = {"f'(0)", "f'''(0)", "f''(1)", "K"};
        auto& v = j["values"][keys[pick(4)]];
        const double lo = std::atof(v[0].get<std::string>().c_str()), hi = std::atof(v[1].get<std::string>().c_str());
        const double d = (hi - lo) * (pick(2) ? 0.25 : 3.0) * (pick(2) ? 1 : -1);
        char b1[40], b2[40];
        std::snprintf(b1, sizeof b1, "%.17g", lo + d);
        std::snprintf(b2, sizeof b2, "%.17g", hi + d);
        v = {std::string(b1), std::string(b2)};
        break;
      }
      case 3:  // existence radius stated smaller (or larger, which is harmless)
        j["existence_radius"] = pick(2) ? "1e-300" : "1e-3";
        break;
      case 4:  // precision, modes or status changed
        switch (pick(3)) {
          case 0:
            j["candidate"]["precision_bits"] = pick(2) ? 128 : 7;
            break;
          case 1:
            j["candidate"]["modes"] = j["candidate"]["modes"].get<int>() - 1;
            break;
          default:
            j["status"] = "not certified";
        }
        break;
      case 5:  // a key removed
        switch (pick(4)) {
          case 0:
            j.erase("values");
            break;
          case 1:
            j["candidate"].erase("coefficients_hex");
            break;
          case 2:
            j.erase("R");
            break;
          default:
            j["values"].erase("K");
        }
        break;
      default:
        break;
    }
    text = j.dump(2) + "\n";
    if (i % 8 == 6) text = base.substr(0, pick(base.size()));                // truncated at a random byte
    if (i % 8 == 7) text[pick(text.size())] = static_cast<char>(pick(256));  // one random byte
    const std::string path = dir + "/t.json";
    {
      std::ofstream f(path, std::ios::binary);
      f << text;
    }
    const Run r = run_cli("recheck " + path);
    if (r.rc >= 0 && r.rc <= 3) ++rc_count[r.rc];
    if (r.rc != 0 && r.rc != 1 && r.rc != 2) {
      ++other;
      std::printf("recheck trial %ld: exit %d\n%s\n", i, r.rc, r.out.c_str());
      continue;
    }
    if (r.rc != 0) continue;
    // Confirmed: every stated enclosure must contain the reference at the stated R.
    const nlohmann::json t = nlohmann::json::parse(text);
    const std::string R = t["R"][0];
    if (t["R"][1] != t["R"][0]) {
      ++false_confirm;  // no tamper above makes a proper interval: nothing to compare with
      continue;
    }
    const BermanReference ref = berman_type1_reference(R);
    auto stated = [&](const char* key) {
      return Id(arith::from_decimal<Id>(t["values"][key][0].get<std::string>()).lower(),
                arith::from_decimal<Id>(t["values"][key][1].get<std::string>()).upper());
    };
    const bool ok = meets(stated("f'(0)"), ref_interval(ref.fp0)) && meets(stated("K"), ref_interval(ref.K)) &&
                    meets(stated("f''(1)"), ref_interval(ref.fpp1)) &&
                    meets(stated("f'''(0)"), ref_interval(ref.fppp0));
    if (!ok) {
      ++false_confirm;
      std::printf("FALSE CONFIRMATION: recheck trial %ld\n", i);
    }
  }
  std::printf(
      "tampered certificates: %ld trials: %ld confirmed (all contain the reference), %ld rejected, %ld bad input, "
      "%ld internal error, %ld false\n",
      n, rc_count[0], rc_count[1], rc_count[2], rc_count[3], false_confirm);
  CHECK(false_confirm == 0);
  CHECK(other == 0);
  CHECK(rc_count[1] + rc_count[2] > 0);
}
