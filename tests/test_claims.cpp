// porecert check: verdicts on claims, exit codes 0 / 1 / 2 / 3 (docs/reviewing.md §3).
#include <doctest/doctest.h>

#include <cstdio>
#include <cstdlib>
#include <fstream>
#include <nlohmann/json.hpp>
#include <sstream>
#include <string>

#include "proof/claims.hpp"
#include "support/run_cli.hpp"

namespace {
using ::porecert::test::Run;
constexpr auto run_porecert = ::porecert::test::porecert_cli;
const std::string dir = "/tmp/porecert-test-claims";
std::string write(const std::string& name, const std::string& text) {
  std::system(("mkdir -p " + dir).c_str());
  std::ofstream(dir + "/" + name) << text;
  return dir + "/" + name;
}
nlohmann::json read_json(const std::string& path) {
  std::ifstream in(path);
  return nlohmann::json::parse(in);
}
const std::string head = "[problem]\nR = \"5\"\n[candidate]\nbranch = \"I\"\n";
std::string value_claim(const std::string& v, const std::string& tol) {
  return "[[claim]]\nquantity = \"f''(1)\"\nvalue = \"" + v + "\"\ntolerance = \"" + tol + "\"\n";
}
}  // namespace

TEST_CASE("certified_digits: the decimal whose half-unit interval holds the enclosure") {
  std::string u;
  CHECK(porecert::proof::certified_digits("1.23449", "1.23451", &u) == "1.2345e+00");
  CHECK(u == "1e-4");
  CHECK(porecert::proof::certified_digits("-2.0001", "-1.9999", &u) == "-2.000e+00");
  CHECK(porecert::proof::certified_digits("1", "9").empty());
}

TEST_CASE("value claims: inside the enclosure accepted, one unit off in the last certified digit rejected") {
  // The enclosure comes from the certificate of the same run; the claims are built from its digits.
  const auto first =
      run_porecert("check " + write("probe.toml", head + value_claim("-4", "1")) + " --json " + dir + "/probe.json");
  REQUIRE(first.rc == 0);
  const auto j = read_json(dir + "/probe.json");
  const auto enc = j["certificate"]["values"]["f''(1)"];
  std::string unit;
  const std::string D = porecert::proof::certified_digits(enc[0], enc[1], &unit);
  REQUIRE(!D.empty());
  // D ± unit/2 holds the enclosure; D + one unit ± 0.5 unit is disjoint from it.
  const std::string half = "5e" + std::to_string(std::stoi(unit.substr(2)) - 1);
  const auto ok = run_porecert("check " + write("ok.toml", head + value_claim(D, half)));
  CHECK(ok.rc == 0);
  CHECK(ok.out.find("accepted") != std::string::npos);
  // One unit up in the last digit: D + unit, computed exactly as a decimal sum by the reader.
  long long e = std::stoll(D.substr(D.find('e') + 1));
  std::string mant = D.substr(0, D.find('e'));
  const bool neg = mant[0] == '-';
  std::string digits;
  for (char c : mant)
    if (std::isdigit(static_cast<unsigned char>(c))) digits += c;
  // one unit toward larger magnitude, on the digit string (it may be ~38 digits long)
  int i = static_cast<int>(digits.size()) - 1;
  while (i >= 0 && digits[i] == '9') digits[i--] = '0';
  if (i < 0)
    digits.insert(digits.begin(), '1'), digits.pop_back(), e += 1;  // 9.99 -> 10.0: shift
  else
    ++digits[i];
  const std::string off = (neg ? "-" : "") + digits + "e" + std::to_string(e - (long long)(digits.size() - 1));
  const auto bad = run_porecert("check " + write("off.toml", head + value_claim(off, half)));
  CHECK(bad.rc == 1);
  CHECK(bad.out.find("rejected") != std::string::npos);
  CHECK(bad.out.find(enc[0].get<std::string>()) != std::string::npos);  // the disproving enclosure is shown
}

TEST_CASE("property claims and exit codes") {
  // R = 5 (suction, below the fold R* ~ 12.165 of docs/fold.md): type I, one solution found.
  const std::string claims = head +
                             "[[claim]]\nproperty = \"f' > 0 on [0, 1)\"\n"
                             "[[claim]]\nproperty = \"f' > 0 on [0, 1]\"\n"
                             "[[claim]]\nquantity = \"f''(1)\"\nbelow = \"-3\"\n"
                             "[[claim]]\nproperty = \"unique\"\nradius = \"1e-6\"\n";
  auto r = run_porecert("check " + write("props.toml", claims) + " --json " + dir + "/props.json");
  CHECK(r.rc == 1);  // claim 2 is false: f'(1) = 0 exactly
  const auto j = read_json(dir + "/props.json");
  REQUIRE(j["verdicts"].size() == 4);
  CHECK(j["verdicts"][0]["verdict"] == "accepted");
  CHECK(j["verdicts"][1]["verdict"] == "rejected");
  CHECK(j["verdicts"][2]["verdict"] == "accepted");  // f''(1) = -3 at R = 0 and decreases with suction
  CHECK(j["verdicts"][3]["verdict"] == "accepted");
  // Undecided only: exit 3. A unique-ball claim far beyond any certified radius.
  r = run_porecert("check " + write("undecided.toml", head + "[[claim]]\nproperty = \"unique\"\nradius = \"1e6\"\n"));
  CHECK(r.rc == 3);
  CHECK(r.out.find("undecided") != std::string::npos);
  CHECK(r.out.find("to decide") != std::string::npos);
}

TEST_CASE("claims file bad input: exit 2 naming the key") {
  auto r = run_porecert("check " + write("float.toml", head + "[[claim]]\nquantity = \"K\"\nvalue = 1.5\n"));
  CHECK(r.rc == 2);
  CHECK(r.out.find("value") != std::string::npos);
  CHECK(r.out.find("TOML float") != std::string::npos);
  r = run_porecert("check " + write("key.toml", head + "[[claim]]\nquantity = \"f(1)\"\nvalue = \"1\"\n"));
  CHECK(r.rc == 2);
  CHECK(r.out.find("f(1)") != std::string::npos);
  r = run_porecert("check " +
                   write("nosrc.toml", "[problem]\nR = \"5\"\n[candidate]\n[[claim]]\nproperty = \"f > 0\"\n"));
  CHECK(r.rc == 2);
  CHECK(r.out.find("candidate sources") != std::string::npos);
}

TEST_CASE("claims reader: a key of the wrong type or of another kind of claim is refused, not ignored") {
  // Found by tests/fuzz/fuzz_claims.cpp (docs/soundness.md §2): these were accepted and the key dropped,
  // so `on = 1` judged the claim on [0, 1] and `about = 1` about the solution.
  using porecert::model::input_error;
  using porecert::model::read_claims_text;
  const auto refusal = [](const std::string& text) -> std::string {
    try {
      (void)read_claims_text(text, "t.toml");
    } catch (const input_error& e) {
      return e.what();
    }
    return "(accepted)";
  };
  const std::string sign = "[[claim]]\nproperty = \"f' > 0\"\n", unique = "[[claim]]\nproperty = \"unique\"\n";
  CHECK(refusal(head + sign + "on = 1\n").find("on: must be a string") != std::string::npos);
  CHECK(refusal(head + unique + "radius = \"1e-3\"\nabout = 1\n").find("about: must be a string") != std::string::npos);
  CHECK(refusal(head + "[[claim]]\nproperty = \"solutions found\"\nexactly = true\n")
            .find("exactly: must be an integer") != std::string::npos);
  CHECK(refusal(head + "modes = \"64\"\n" + sign).find("modes: must be an integer") != std::string::npos);
  CHECK(refusal(head + "precision_bits = 128.0\n" + sign).find("precision_bits: must be an integer") !=
        std::string::npos);
  CHECK(refusal("[problem]\nR = \"5\"\n[candidate]\nbranch = \"I\"\ncsv = 1\n" + sign).find("csv: must be a string") !=
        std::string::npos);
  CHECK(refusal(head + "[[claim]]\nquantity = \"K\"\nbelow = \"6\"\nradius = \"1\"\n")
            .find("key 'radius' does not belong to a bound claim") != std::string::npos);
  CHECK(refusal(head + unique + "radius = \"1e-3\"\nquantity = 5\n").find("quantity or property, not both") !=
        std::string::npos);
  // The same claims with the keys written right are read, with the values given.
  const auto f = read_claims_text(head + "modes = 64\nprecision_bits = 128\n" + sign + "on = \"(0, 0.5]\"\n" + unique +
                                      "radius = \"1e-3\"\nabout = \"candidate\"\n" +
                                      "[[claim]]\nproperty = \"solutions found\"\nexactly = 2\n",
                                  "t.toml");
  CHECK(f.modes == 64);
  CHECK(f.precision_bits == 128);
  REQUIRE(f.claims.size() == 3);
  CHECK(f.claims[0].b == "0.5");
  CHECK(!f.claims[0].a_closed);
  CHECK(f.claims[1].about_candidate);
  CHECK(f.claims[2].count == 2);
}
