// porecert sweep (docs/sweep.md): box cutting, the gluing test (S3), the journal (S5), and the real
// binary killed with SIGKILL and resumed, compared byte for byte with an uninterrupted run; the
// 2-rank MPI run compared with the threaded one (when built with PORECERT_MPI).
#include <doctest/doctest.h>
#include <signal.h>
#include <sys/wait.h>
#include <unistd.h>

#include <chrono>
#include <cmath>
#include <cstdio>
#include <filesystem>
#include <fstream>
#include <sstream>
#include <thread>

#include "certificate/journal.hpp"
#include "certificate/sweep.hpp"
#include "proof/sweep.hpp"
#include "support/run_cli.hpp"

namespace {
namespace fs = std::filesystem;
using nlohmann::json;
const std::string dir = "/tmp/porecert-test-sweep-" + std::to_string(::getpid());

using ::porecert::test::Run;
constexpr auto run = ::porecert::test::shell;
using ::porecert::test::slurp;
int lines_of(const std::string& path) {
  const std::string s = slurp(path);
  return static_cast<int>(std::count(s.begin(), s.end(), '\n'));
}
const std::string kSmall = " sweep --R=0:0.003 --width 0.0001 --min-width 0.0001";
}  // namespace

TEST_CASE("cut points share endpoints, increase, and keep the user's ends") {
  const auto p = porecert::proof::sweep::cut_points("-0.1", "0.2", 3);
  REQUIRE(p.size() == 4);
  CHECK(p[0] == "-0.1");
  CHECK(p[3] == "0.2");
  CHECK(p[1] == "0");
  CHECK(p[2] == "0.1");
  CHECK(porecert::proof::sweep::split_point("1", "1") == "");
  CHECK_THROWS_AS(porecert::proof::sweep::cut_points("1", "1", 2), std::invalid_argument);
}

TEST_CASE("candidate distance is an upper bound of the exact l1 distance") {
  // Exact by hand: |1 - 1.5| + |0.5 - 0| = 1.
  const double d = porecert::proof::sweep::candidate_distance_up({"0x1p0", "0x1p-1"}, {"0x1.8p0"});
  CHECK(d >= 1.0);
  CHECK(d <= std::nextafter(1.0, 2.0));
  // A difference of 2^-1000 (representable only in MPFR) must not be lost: the bound is > 0.
  CHECK(porecert::proof::sweep::candidate_distance_up({"0x1p0"},
                                                      {"0x1.0000000000000000000000000000000000000000000000000000"
                                                       "000000000000000000000000000000000000000000000000000000"
                                                       "0000000000000000000000000000000000000000000000000000"
                                                       "0000000000000000000000000000000000000000000000000000"
                                                       "0000000000000000000000000000000000000000000000000001p0"}) > 0);
}

TEST_CASE("gluing (S3): strict inclusion of one existence ball in the other's uniqueness ball") {
  using porecert::arith::Tri;
  namespace s = porecert::proof::sweep;
  CHECK(s::glued(0.1, "0.01", "0.2", "0.05", "0.01") == Tri::yes);      // 0.1 + 0.05 < 0.2
  CHECK(s::glued(0.1, "0.05", "0.15", "0.05", "0.15") == Tri::unsure);  // 0.15 is not < 0.15
  CHECK(s::glued(5.0, "0.1", "inf", "0.1", "0.01") == Tri::yes);
}

TEST_CASE("mixed joint (S3''): the Chebyshev box's solution read in the reduced chart") {
  using porecert::arith::Tri;
  namespace s = porecert::proof::sweep;
  // Exact case: x = (f'(0), K, u) = (3/2, -3, [-3]) is the R = 0 profile f = (3η − η³)/2 (f''' = −3);
  // at R = 1 its shape parameter s = f'''(0) / (R f'(0)²) is −3 / (9/4) = −4/3 (docs/method.md (S3)).
  const s::Centre c{{"0x1.8p0", "-0x1.8p1", "-0x1.8p1"}, {}, ""};
  const auto p0 = s::berman_chart_point(c, 0, "1");
  CHECK(p0.s.lower() <= -4.0 / 3);
  CHECK(p0.s.upper() >= -4.0 / 3);
  CHECK(p0.s.upper() - p0.s.lower() < 1e-15);
  // u_1 T_1(−1) = −u_1 enters with its sign: u = −3 + 0.5 T_1 gives f'''(0) = −3.5.
  const auto p1 = s::berman_chart_point({{"0x1.8p0", "0", "-0x1.8p1", "0x1p-1"}, {}, ""}, 0, "1");
  CHECK(p1.s.lower() <= -3.5 / 2.25);
  CHECK(p1.s.upper() >= -3.5 / 2.25);
  // Moving centre: x̄ + (R − R0) x1 with x1 = (0, 0, −1): at R = 1, R0 = 0.5, f'''(0) = −3.5.
  const auto p2 = s::berman_chart_point({{"0x1.8p0", "0", "-0x1.8p1"}, {"0", "0", "-0x1p0"}, "0.5"}, 0, "1");
  CHECK(p2.s.lower() <= -3.5 / 2.25);
  CHECK(p2.s.upper() >= -3.5 / 2.25);
  // A ball of radius 0.01 widens s; it still holds the exact −4/3.
  const auto pr = s::berman_chart_point(c, 0.01, "1");
  CHECK(pr.s.lower() < -4.0 / 3 - 1e-3);
  CHECK(pr.s.upper() > -4.0 / 3 + 1e-3);
  CHECK(s::glued_mixed(pr, true, 1, 1, "-1.4", "-1.3", "1") == Tri::yes);
  CHECK(s::glued_mixed(pr, true, 1, 1, "-1.335", "-1.3", "1") == Tri::unsure);  // s sticks out of S
  CHECK(s::glued_mixed(pr, false, 1, 1, "-1.4", "-1.3", "1") == Tri::unsure);   // f' > 0 not certified
  CHECK(s::glued_mixed(pr, true, -1, 1, "-1.4", "-1.3", "1") == Tri::unsure);   // other eps
  CHECK(s::glued_mixed(pr, true, 1, 2, "-1.4", "-1.3", "1") == Tri::unsure);    // wall at the 2nd zero
  // f'(0) may vanish: s is the whole line and nothing glues.
  const auto pz = s::berman_chart_point({{"0x1p-10", "0", "-0x1.8p1"}, {}, ""}, 0.01, "1");
  CHECK(std::isinf(pz.s.upper()));
  CHECK(s::glued_mixed(pz, true, 1, 1, "-1e300", "1e300", "1") == Tri::unsure);
  CHECK_THROWS_AS(s::berman_chart_point(c, 0, "0"), std::invalid_argument);
}

TEST_CASE("sweep across R = 1: Chebyshev box and reduced box glued (S3'')") {
  fs::create_directories(dir);
  const auto r = run(std::string(PORECERT_BINARY) + " sweep --R=0.9:1.1 --width 0.1 --json " + dir + "/mixed.json");
  CHECK(r.rc == 0);
  const json d = json::parse(slurp(dir + "/mixed.json"));
  CHECK(d["covered"] == true);
  REQUIRE(d["boxes"].size() == 2);
  CHECK(d["boxes"][0]["certificate"]["method"] == "newton-kantorovich");
  CHECK(d["boxes"][1]["certificate"]["method"] == "reduced-ivp");
  REQUIRE(d["joints"].size() == 1);
  CHECK(d["joints"][0]["glued"] == "glued");
  CHECK(d["joints"][0].contains("shape_parameter"));
  CHECK(d["one_branch"] == true);
}

TEST_CASE("type II from R = 40: unit boxes in the reduced chart, labelled II, s > 0 on every box") {
  fs::create_directories(dir);
  const auto r = run(std::string(PORECERT_BINARY) + " sweep --R=40:41 --branch II --json " + dir + "/ii.json");
  CHECK(r.rc == 0);
  const json d = json::parse(slurp(dir + "/ii.json"));
  CHECK(d["covered"] == true);
  REQUIRE(d["boxes"].size() == 1);  // --width auto: one unit box
  const json& c = d["boxes"][0]["certificate"];
  CHECK(c["method"] == "reduced-ivp");
  CHECK(c["structure"]["label"] == "II");
  // Type II is the s > 0 side of the reduced chart (docs/method.md (S10)): f'''(0) > 0.
  CHECK(std::stod(d["boxes"][0]["values"]["f'''(0)"][0].get<std::string>()) > 0);
}

TEST_CASE(
    "--width auto: zones of width 0.25 and 1, cut at R = 1 (I), 40 (II) and 500; type II narrower below 15; type III "
    "by measured widths") {
  namespace sw = porecert::certificate::sweep;
  const auto boxes = [](const char* lo, const char* hi, const char* branch) {
    sw::Params p;
    p.R_lo = lo;
    p.R_hi = hi;
    p.branch = branch;
    const auto plan = sw::make_plan(p);
    CHECK(plan.points.front() == lo);
    CHECK(plan.points.back() == hi);
    return plan.points.size() - 1;
  };
  CHECK(boxes("-50", "50", "I") == 204 + 49);        // [-50, 1] by 0.25, [1, 50] by 1
  CHECK(boxes("0.5", "600", "I") == 2 + 499 + 400);  // and [500, 600] by 0.25 again
  CHECK(boxes("1", "2", "I") == 1);
  CHECK(boxes("30", "50", "II") == 40 + 10);
  CHECK(boxes("13.4", "16", "II") == 100 + 250 + 50 + 4);  // narrower towards the end of type II
  CHECK(boxes("12", "13", "II") == 4);
  // Type III starts at its measured working widths (docs/sweep.md S2): 0.0002 next to the fold,
  // 0.002 on [13, 14), 0.004 from 14, 0.0015 from 25, 0.001 from 35, 0.0008 from 40, 0.0005 from 45,
  // 0.0003 from 50, 0.0002 from 53, 0.00015 from 56, 0.001 from 60.
  CHECK(boxes("12.2", "12.3", "III") == 500);
  CHECK(boxes("13", "14", "III") == 500);
  CHECK(boxes("20", "21", "III") == 250);
  CHECK(boxes("59.97", "60.1", "III") == 200 + 100);
  CHECK(boxes("1", "2", "III") == 4);  // no type III below the fold: the plain width, the proof says no
  sw::Params p;
  p.R_lo = "-1";
  p.R_hi = "1";
  p.width = "0.5";
  CHECK(sw::make_plan(p).points.size() == 5);  // an explicit width is used as given
}

TEST_CASE("journal: header check, truncated last line discarded, damaged middle line refused") {
  fs::create_directories(dir);
  const std::string path = dir + "/unit.journal";
  fs::remove(path);
  const json head{{"format", "porecert-sweep-journal"}, {"sweep", 1}};
  {
    porecert::certificate::Journal j(path, head, false, nullptr, nullptr);
    j.append({{"R", {"0", "1"}}, {"status", "certified"}});
    j.append({{"R", {"1", "2"}}, {"status", "split"}});
  }
  CHECK_THROWS_AS(porecert::certificate::Journal(path, head, false, nullptr, nullptr),
                  porecert::certificate::format_error);
  CHECK_THROWS_AS(porecert::certificate::Journal(path, json{{"sweep", 2}}, true, nullptr, nullptr),
                  porecert::certificate::format_error);
  { std::ofstream(path, std::ios::app) << "{\"R\":[\"2\",\"3\"],\"sta"; }  // a kill mid-write
  std::vector<json> rec;
  std::string note;
  {
    porecert::certificate::Journal j(path, head, true, &rec, &note);
    CHECK(rec.size() == 2);
    CHECK(note.find("truncated") != std::string::npos);
    j.append({{"R", {"2", "3"}}, {"status", "certified"}});
  }
  rec.clear();
  { porecert::certificate::Journal j(path, head, true, &rec, nullptr); }
  CHECK(rec.size() == 3);
  // Garbage before the last line is not a torn write: refuse.
  const std::string text = slurp(path);
  { std::ofstream(path, std::ios::trunc) << text.substr(0, text.size() / 2) << "\n" << text; }
  CHECK_THROWS_AS(porecert::certificate::Journal(path, head, true, &rec, nullptr), porecert::certificate::format_error);
}

TEST_CASE("sweep of type I near R = 0: covered, glued, and every box encloses Berman's series") {
  fs::create_directories(dir);
  const auto r = run(std::string(PORECERT_BINARY) + " sweep --R=0:0.0004 --width 0.0001 --min-width 0.0001 --json " +
                     dir + "/near0.json");
  CHECK(r.rc == 0);
  CHECK(r.out.find("covered: yes") != std::string::npos);
  const json d = json::parse(slurp(dir + "/near0.json"));
  CHECK(d["covered"] == true);
  CHECK(d["one_branch"] == true);
  REQUIRE(d["boxes"].size() == 4);
  for (const auto& b : d["boxes"]) {
    CHECK(b["status"] == "certified");
    // Berman 1953 (re-derived in ../shared/notes/method.md): f'(0) = 3/2 - R/140 + O(R^2); at
    // R <= 4e-4 the O(R^2) term is below 1e-8, inside the box enclosure (it spans the R/140 change).
    const double R = 0.5 * (std::stod(b["R"][0].get<std::string>()) + std::stod(b["R"][1].get<std::string>()));
    const double fp0 = 1.5 - R / 140;
    CHECK(std::stod(b["values"]["f'(0)"][0].get<std::string>()) < fp0 - 1e-7);
    CHECK(std::stod(b["values"]["f'(0)"][1].get<std::string>()) > fp0 + 1e-7);
  }
  for (const auto& j : d["joints"]) CHECK(j["glued"] == "glued");
  CHECK(!fs::exists(dir + "/near0.json.journal"));  // removed once the result is written
}

TEST_CASE("kill -9 mid-sweep, --resume: output identical to an uninterrupted run") {
  fs::create_directories(dir);
  const std::string bin = PORECERT_BINARY;
  const auto a = run(bin + kSmall + " --jobs 2 --json " + dir + "/a.json");
  REQUIRE(a.rc == 0);
  const std::string journal = dir + "/b.journal";
  fs::remove(journal);
  const pid_t pid = ::fork();
  REQUIRE(pid >= 0);
  if (pid == 0) {
    const std::string args = kSmall + " --jobs 2 --json " + dir + "/b.json --journal " + journal;
    ::execl("/bin/sh", "sh", "-c", ("exec " + bin + args + " >/dev/null 2>&1").c_str(), static_cast<char*>(nullptr));
    ::_exit(127);
  }
  // Kill once a few boxes are journaled (header + 3 records), well before the 30 boxes are done.
  const auto t0 = std::chrono::steady_clock::now();
  while (lines_of(journal) < 4 && std::chrono::steady_clock::now() - t0 < std::chrono::seconds(300))
    std::this_thread::sleep_for(std::chrono::milliseconds(20));
  ::kill(pid, SIGKILL);
  int st = 0;
  ::waitpid(pid, &st, 0);
  CHECK(WIFSIGNALED(st));
  REQUIRE(fs::exists(journal));
  CHECK(!fs::exists(dir + "/b.json"));  // killed before the end: no half-written result
  const int before = lines_of(journal);
  CHECK(before >= 4);
  CHECK(before < 31);
  { std::ofstream(journal, std::ios::app) << "{\"R\":[\"0.0029\",\"0.003\"],\"status\":\"cert"; }  // torn write
  // A fresh run refuses the existing journal; a different sweep cannot resume it.
  const auto fresh = run(bin + kSmall + " --json " + dir + "/b.json --journal " + journal);
  CHECK(fresh.rc == 2);
  CHECK(fresh.out.find("--resume") != std::string::npos);
  const auto other = run(bin + " sweep --R=0:0.004 --width 0.0001 --min-width 0.0001 --resume --json " + dir +
                         "/b.json --journal " + journal);
  CHECK(other.rc == 2);
  CHECK(other.out.find("different sweep") != std::string::npos);
  const auto b = run(bin + kSmall + " --jobs 2 --resume --json " + dir + "/b.json --journal " + journal);
  CHECK(b.rc == 0);
  CHECK(b.out.find("truncated") != std::string::npos);
  CHECK(b.out.find("resuming") != std::string::npos);
  CHECK(slurp(dir + "/a.json") == slurp(dir + "/b.json"));
  CHECK(!fs::exists(journal));
}

TEST_CASE("one thread and two threads give the same bytes") {
  fs::create_directories(dir);
  const std::string bin = PORECERT_BINARY;
  const std::string args = " sweep --R=-0.0003:0.0003 --width 0.0001 --min-width 0.0001";
  REQUIRE(run(bin + args + " --jobs 1 --json " + dir + "/j1.json").rc == 0);
  REQUIRE(run(bin + args + " --jobs 2 --json " + dir + "/j2.json").rc == 0);
  CHECK(slurp(dir + "/j1.json") == slurp(dir + "/j2.json"));
}

TEST_CASE("MPI: 2 ranks give the same result as threads") {
#ifdef PORECERT_MPIEXEC
  fs::create_directories(dir);
  const std::string bin = PORECERT_BINARY;
  const std::string args = " sweep --R=0:0.0006 --width 0.0001 --min-width 0.0001";
  REQUIRE(run(bin + args + " --jobs 2 --json " + dir + "/t.json").rc == 0);
  // CI runs as root; 2 ranks on a 2-core machine shared with other jobs.
  const auto m = run(std::string(PORECERT_MPIEXEC) + " --allow-run-as-root --oversubscribe -np 2 " + bin + args +
                     " --jobs 1 --json " + dir + "/m.json");
  CHECK(m.rc == 0);
  INFO(m.out);
  CHECK(slurp(dir + "/t.json") == slurp(dir + "/m.json"));
#else
  MESSAGE("skipped: porecert built without PORECERT_MPI (install libopenmpi-dev openmpi-bin and reconfigure)");
#endif
}

TEST_CASE("a type II sweep into the fold stops and names the last certified R") {
  fs::create_directories(dir);
  // Below R* (near 12.165, docs/fold.md) type II does not exist: the box [12.1, 12.15] cannot be
  // certified, so the sweep, which runs downward from 12.2, must stop with the message.
  const auto r = run(std::string(PORECERT_BINARY) +
                     " sweep --R=12.1:12.2 --branch II --width 0.05 --min-width 0.05 --json " + dir + "/fold.json");
  CHECK(r.rc == 1);
  CHECK(r.out.find("STOPPED") != std::string::npos);
  CHECK(r.out.find("fold") != std::string::npos);
  const json d = json::parse(slurp(dir + "/fold.json"));
  CHECK(d["covered"] == false);
  REQUIRE(d.contains("stopped"));
  CHECK(d["stopped"]["message"].get<std::string>().find("last certified R") != std::string::npos);
}
