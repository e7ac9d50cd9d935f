// Bad input, every reader and every command-line option (docs/soundness.md §4, the table there is
// written from this test's own runs: build/bad-input-table.md). Each case must exit with status 2,
// print "porecert: bad input" or a parse error naming the option / field and the offending value,
// never "internal error", and leave an existing output file byte for byte as it was, with no
// temporary file beside it (certificate::write_atomic writes a temporary file and renames it).
#include <doctest/doctest.h>
#include <sys/wait.h>

#include <cstdio>
#include <cstdlib>
#include <filesystem>
#include <fstream>
#include <sstream>
#include <string>
#include <vector>

namespace {

struct Run {
  int rc;
  std::string out;
};
Run porecert(const std::string& args) {
  const std::string cmd = std::string(PORECERT_BINARY) + " " + args + " 2>&1 </dev/null";
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
void put(const std::string& path, const std::string& text) {
  std::ofstream f(path, std::ios::binary);
  f << text;
}

const std::string dir = "/tmp/porecert-test-bad-input";
const std::string out_path = dir + "/precious.json";  // an existing output that must survive
const std::string kPrecious = "{\"precious\": \"bytes written before the failing run\"}\n";

struct Case {
  std::string reader;             // table column: the command or reader
  std::string what;               // the kind of malformation
  std::string args;               // arguments; @IN = the input file below, @OUT = the precious output
  std::string input;              // content of @IN (case file or certificate), if any
  std::vector<std::string> must;  // substrings the message must contain (option/field, value)
};

std::string subst(std::string s, const std::string& in) {
  for (auto [key, val] : {std::pair<std::string, std::string>{"@IN", in}, {"@OUT", out_path}})
    for (std::size_t p; (p = s.find(key)) != std::string::npos;) s.replace(p, key.size(), val);
  return s;
}

// A valid certificate to damage, made once.
const std::string& good_certificate() {
  static const std::string c = [] {
    std::filesystem::create_directories(dir);
    const Run r = porecert("verify --R=1 --precision 53 --json " + dir + "/good.json");
    REQUIRE(r.rc == 0);
    return slurp(dir + "/good.json");
  }();
  return c;
}
std::string replaced(const std::string& from, const std::string& to) {
  std::string c = good_certificate();
  const auto p = c.find(from);
  REQUIRE_MESSAGE(p != std::string::npos, from);
  c.replace(p, from.size(), to);
  return c;
}
std::string replaced_last(const std::string& from, const std::string& to) {
  std::string c = good_certificate();
  const auto p = c.rfind(from);
  REQUIRE_MESSAGE(p != std::string::npos, from);
  c.replace(p, from.size(), to);
  return c;
}
std::string first_hex() {
  const std::string& c = good_certificate();
  const auto p = c.find("\"coefficients_hex\": [");
  const auto q = c.find('"', c.find('"', p + 21) + 1);
  return c.substr(c.find('"', p + 21), q - c.find('"', p + 21) + 1);
}

std::vector<Case> cases() {
  const std::string toml_ok = "[flow]\nreynolds = \"2\"\n";
  std::vector<Case> v = {
      // verify: --R
      {"verify", "--R not a number", "verify --R=abc --json @OUT", "", {"--R", "abc"}},
      {"verify", "--R NaN", "verify --R=nan --json @OUT", "", {"--R", "nan"}},
      {"verify", "--R infinite", "verify --R=inf --json @OUT", "", {"--R", "inf"}},
      {"verify", "--R empty", "verify --R=", "", {"--R"}},
      {"verify", "--R interval missing an end", "verify --R=1: --json @OUT", "", {"--R"}},
      {"verify", "--R interval with three ends", "verify --R=1:2:3 --json @OUT", "", {"--R", "2:3"}},
      {"verify", "--R lower end above upper", "verify --R=2:1 --json @OUT", "", {"--R", "2:1", "LO <= HI"}},
      {"verify", "--R beyond 1e5", "verify --R=3e5 --json @OUT", "", {"--R", "3e5", "range"}},
      {"verify", "--R just beyond -1e5", "verify --R=-100000.5 --json @OUT", "", {"--R", "-100000.5", "range"}},
      {"verify", "--R overflowing exponent", "verify --R=1e999999 --json @OUT", "", {"--R", "1e999999"}},
      {"verify", "--R trailing junk", "verify --R=1.5x --json @OUT", "", {"--R", "1.5x"}},
      {"verify", "--R missing", "verify --json @OUT", "", {"--R", "missing"}},
      // verify: other options
      {"verify", "--branch unknown", "verify --R=1 --branch IV --json @OUT", "", {"--branch", "IV"}},
      {"verify", "--branch lower case", "verify --R=1 --branch i --json @OUT", "", {"--branch", "'i'"}},
      {"verify", "--start one number", "verify --R=1 --start 1 --json @OUT", "", {"--start", "'1'"}},
      {"verify", "--start not numbers", "verify --R=1 --start a,b --json @OUT", "", {"--start", "a,b"}},
      {"verify", "--start NaN", "verify --R=1 --start nan,1 --json @OUT", "", {"--start", "nan,1"}},
      {"verify", "--start overflow", "verify --R=1 --start 1e999,1 --json @OUT", "", {"--start", "1e999,1"}},
      {"verify", "--start three numbers", "verify --R=1 --start 1,2,3 --json @OUT", "", {"--start", "1,2,3"}},
      {"verify", "--precision below 53", "verify --R=1 --precision 52 --json @OUT", "", {"--precision", "52"}},
      {"verify", "--precision above 4096", "verify --R=1 --precision 5000 --json @OUT", "", {"--precision", "5000"}},
      {"verify", "--precision not an integer", "verify --R=1 --precision abc --json @OUT", "", {"--precision", "abc"}},
      {"verify", "--precision overflows int", "verify --R=1 --precision 99999999999 --json @OUT", "", {"--precision"}},
      {"verify", "--modes below 8", "verify --R=1 --modes 7 --json @OUT", "", {"--modes", "7"}},
      {"verify", "--modes above 4000", "verify --R=1 --modes 4001 --json @OUT", "", {"--modes", "4001"}},
      {"verify", "--modes negative", "verify --R=1 --modes -5 --json @OUT", "", {"--modes", "-5"}},
      {"verify", "--method unknown", "verify --R=1 --method banach --json @OUT", "", {"--method", "banach"}},
      {"verify", "unknown option", "verify --R=1 --bogus --json @OUT", "", {"--bogus"}},
      {"verify",
       "--json into a missing directory",
       "verify --R=1 --json " + dir + "/no/such/dir/c.json",
       "",
       {"no/such/dir/c.json", "nothing was written"}},
      {"verify", "--json is a directory", "verify --R=1 --json " + dir, "", {dir, "directory"}},
      // verify CASE.toml (lib/model/case_file)
      {"case file", "file missing", "verify " + dir + "/none.toml --json @OUT", "", {"none.toml"}},
      {"case file", "empty file (no R)", "verify @IN --json @OUT", "", {"--R", "missing"}},
      {"case file", "not TOML", "verify @IN --json @OUT", "[flow\nreynolds = \"1\"\n", {"case file", "line 1"}},
      {"case file", "binary garbage", "verify @IN --json @OUT", std::string("\x00\xff\xfe[[", 5), {"case file"}},
      {"case file", "unknown table", "verify @IN --json @OUT", toml_ok + "[solver]\nx = 1\n", {"[solver]"}},
      {"case file",
       "unknown key (typo)",
       "verify @IN --json @OUT",
       toml_ok + "[certify]\nmode = 40\n",
       {"certify.mode", "unknown key"}},
      {"case file", "table given as a value", "verify @IN --json @OUT", "flow = 5\n", {"[flow]", "table"}},
      {"case file",
       "reynolds a TOML float",
       "verify @IN --json @OUT",
       "[flow]\nreynolds = 12.5\n",
       {"flow.reynolds", "12.5", "string"}},
      {"case file", "reynolds a boolean", "verify @IN --json @OUT", "[flow]\nreynolds = true\n", {"flow.reynolds"}},
      {"case file",
       "reynolds not a number",
       "verify @IN --json @OUT",
       "[flow]\nreynolds = \"x1\"\n",
       {"flow.reynolds", "x1"}},
      {"case file",
       "reynolds range of one",
       "verify @IN --json @OUT",
       "[flow]\nreynolds = [\"1\"]\n",
       {"flow.reynolds", "two entries"}},
      {"case file",
       "reynolds range reversed",
       "verify @IN --json @OUT",
       "[flow]\nreynolds = [\"2\", \"1\"]\n",
       {"flow.reynolds", "2:1"}},
      {"case file",
       "reynolds out of range",
       "verify @IN --json @OUT",
       "[flow]\nreynolds = \"1e6\"\n",
       {"flow.reynolds", "1e6", "range"}},
      {"case file",
       "reynolds integer out of range",
       "verify @IN --json @OUT",
       "[flow]\nreynolds = 9223372036854775807\n",
       {"flow.reynolds", "9223372036854775807"}},
      {"case file",
       "branch not a string",
       "verify @IN --json @OUT",
       toml_ok + "[certify]\nbranch = 2\n",
       {"certify.branch", "string"}},
      {"case file",
       "branch unknown",
       "verify @IN --json @OUT",
       toml_ok + "[certify]\nbranch = \"IV\"\n",
       {"--branch", "IV"}},
      {"case file",
       "modes too small",
       "verify @IN --json @OUT",
       toml_ok + "[certify]\nmodes = 3\n",
       {"certify.modes", "3"}},
      {"case file",
       "modes wraps int (2^32 + 8)",
       "verify @IN --json @OUT",
       toml_ok + "[certify]\nmodes = 4294967304\n",
       {"certify.modes", "4294967304"}},
      {"case file",
       "modes a float",
       "verify @IN --json @OUT",
       toml_ok + "[certify]\nmodes = 40.0\n",
       {"certify.modes", "integer"}},
      {"case file",
       "precision_bits a string",
       "verify @IN --json @OUT",
       toml_ok + "[certify]\nprecision_bits = \"x\"\n",
       {"certify.precision_bits", "integer"}},
      {"case file",
       "precision_bits out of range",
       "verify @IN --json @OUT",
       toml_ok + "[certify]\nprecision_bits = 100000\n",
       {"certify.precision_bits", "100000"}},
      {"case file",
       "start of one number",
       "verify @IN --json @OUT",
       toml_ok + "[certify]\nstart = [1.0]\n",
       {"certify.start"}},
      {"case file",
       "start not numbers",
       "verify @IN --json @OUT",
       toml_ok + "[certify]\nstart = [\"a\", 1]\n",
       {"certify.start"}},
      {"case file",
       "start infinite",
       "verify @IN --json @OUT",
       toml_ok + "[certify]\nstart = [inf, 1.0]\n",
       {"certify.start", "finite"}},
      {"case file",
       "certificate path empty",
       "verify @IN",
       toml_ok + "[certify]\ncertificate = \"\"\n",
       {"certify.certificate"}},
      {"case file",
       "title not a string",
       "verify @IN --json @OUT",
       toml_ok + "[case]\ntitle = 5\n",
       {"case.title", "string"}},
      // recheck CERT.json (lib/certificate)
      {"recheck", "file missing", "recheck " + dir + "/none.json", "", {"none.json"}},
      {"recheck", "empty file", "recheck @IN", "", {"not valid JSON"}},
      {"recheck", "truncated", "recheck @IN", "", {"truncated"}},
      {"recheck", "not JSON", "recheck @IN", "porecert\n", {"not valid JSON"}},
      {"recheck", "JSON but not an object", "recheck @IN", "[1, 2]\n", {"\"format\"", "missing"}},
      {"recheck", "deeply nested arrays", "recheck @IN", std::string(100000, '['), {"not valid JSON"}},
      {"recheck", "invalid UTF-8 in a string", "recheck @IN", "{\"format\": \"\xff\xfe\"}", {"not valid JSON"}},
      {"recheck", "wrong format name", "recheck @IN", "", {"\"format\"", "porecert-certificate"}},
      {"recheck", "status unknown", "recheck @IN", "", {"\"status\"", "proved"}},
      {"recheck", "R not a number", "recheck @IN", "", {"R", "abc"}},
      {"recheck", "R out of range", "recheck @IN", "", {"R", "1e9", "range"}},
      {"recheck", "R reversed", "recheck @IN", "", {"R", "LO <= HI"}},
      {"recheck", "R a number, not strings", "recheck @IN", "", {"\"R\"", "decimal strings"}},
      {"recheck", "model unknown", "recheck @IN", "", {"problem.model", "other-model"}},
      {"recheck", "precision_bits below 53", "recheck @IN", "", {"candidate.precision_bits", "52"}},
      {"recheck", "precision_bits 2^64 - 1", "recheck @IN", "", {"candidate.precision_bits", "18446744073709551615"}},
      {"recheck", "precision_bits a string", "recheck @IN", "", {"\"precision_bits\"", "\"53\""}},
      {"recheck", "modes below 8", "recheck @IN", "", {"candidate.modes", "2"}},
      {"recheck", "modes 2^31 - 1 (modes + 2 overflows int)", "recheck @IN", "", {"candidate.modes", "2147483647"}},
      {"recheck", "modes negative", "recheck @IN", "", {"candidate.modes", "-9223372036854775808"}},
      {"recheck", "coefficient list shorter than modes + 2", "recheck @IN", "", {"coefficients_hex", "modes + 2"}},
      {"recheck", "coefficient not a string", "recheck @IN", "", {"coefficients_hex", "non-string"}},
      {"recheck", "coefficient not a number", "recheck @IN", "", {"coefficients_hex", "zz"}},
      {"recheck", "coefficient infinite", "recheck @IN", "", {"coefficients_hex", "inf"}},
      {"recheck", "coefficient not exact in double (53 bits)", "recheck @IN", "", {"0.1", "not a double"}},
      {"recheck", "existence_radius not a number", "recheck @IN", "", {"existence_radius", "small"}},
      {"recheck", "existence_radius negative", "recheck @IN", "", {"existence_radius", "-1", ">= 0"}},
      {"recheck", "a value enclosure missing", "recheck @IN", "", {"values.\"K\"", "missing"}},
      {"recheck", "a value enclosure reversed", "recheck @IN", "", {"values.K", "lo above hi"}},
      {"recheck", "a value enclosure not numbers", "recheck @IN", "", {"values.K", "big"}},
      {"recheck",
       "fold result without fold_R",
       "recheck @IN",
       "{\"format\": \"porecert-fold\", \"candidate\": {\"coefficients_hex\": [], \"precision_bits\": 53}}\n",
       {"fold_R"}},
      {"recheck",
       "fold result with a bad coefficient",
       "recheck @IN",
       "{\"format\": \"porecert-fold\", \"fold_R\": [\"12\", \"13\"], \"candidate\": {\"coefficients_hex\": [\"zz\"], "
       "\"precision_bits\": 53}}\n",
       {"fold certificate", "coefficients"}},
      {"recheck", "no file given", "recheck", "", {"certificate"}},
      // branches, fold, greens
      {"branches", "--R missing", "branches --json @OUT", "", {"--R"}},
      {"branches", "--R not a number", "branches --R=abc --json @OUT", "", {"--R", "abc"}},
      {"branches", "--R out of range", "branches --R=-2e5 --json @OUT", "", {"--R", "-2e5", "range"}},
      {"branches", "--precision below 53", "branches --R=20 --precision 40 --json @OUT", "", {"--precision", "40"}},
      {"branches",
       "--json into a missing directory",
       "branches --R=20 --json " + dir + "/no/x.json",
       "",
       {"no/x.json"}},
      {"fold", "--precision between 53 and 64", "fold --precision 60 --json @OUT", "", {"--precision", "60"}},
      {"fold", "--modes below 16", "fold --modes 10 --json @OUT", "", {"--modes", "10"}},
      {"fold", "--modes above 2000", "fold --modes 3000 --json @OUT", "", {"--modes", "3000"}},
      {"fold", "--json into a missing directory", "fold --json " + dir + "/no/x.json", "", {"no/x.json"}},
      {"fold", "unexpected argument", "fold extra --json @OUT", "", {"extra"}},
      {"greens", "--bits below 64", "greens --bits 10 --json @OUT", "", {"--bits", "10"}},
      {"greens", "--tol not a number", "greens --tol abc --json @OUT", "", {"--tol", "abc"}},
      {"greens", "--tol too large", "greens --tol 1 --json @OUT", "", {"--tol", "'1'"}},
      {"greens", "--tol below double resolution", "greens --tol 1e-20 --json @OUT", "", {"--tol", "1e-20"}},
      {"greens", "--json into a missing directory", "greens --json " + dir + "/no/x.json", "", {"no/x.json"}},
      {"porecert", "no subcommand", "", "", {"subcommand"}},
      {"porecert", "unknown subcommand", "prove --R=1", "", {"prove"}},
  };
  // Certificate inputs: damage the good certificate one key at a time.
  const std::string& good = good_certificate();
  const std::string hex = first_hex();
  const std::vector<std::pair<std::string, std::string>> damage = {
      {"truncated", good.substr(0, good.size() / 2)},
      {"wrong format name", replaced("\"porecert-certificate\"", "\"other-certificate\"")},
      {"status unknown", replaced_last("\"status\": \"certified\"", "\"status\": \"proved\"")},
      {"R not a number", replaced("\"R\": [\n    \"1\",\n    \"1\"\n  ]", "\"R\": [\"abc\", \"1\"]")},
      {"R out of range", replaced("\"R\": [\n    \"1\",\n    \"1\"\n  ]", "\"R\": [\"1e9\", \"1e9\"]")},
      {"R reversed", replaced("\"R\": [\n    \"1\",\n    \"1\"\n  ]", "\"R\": [\"2\", \"1\"]")},
      {"R a number, not strings", replaced("\"R\": [\n    \"1\",\n    \"1\"\n  ]", "\"R\": 1")},
      {"model unknown", replaced("\"berman-half-channel\"", "\"other-model\"")},
      {"precision_bits below 53", replaced("\"precision_bits\": 53", "\"precision_bits\": 52")},
      {"precision_bits 2^64 - 1", replaced("\"precision_bits\": 53", "\"precision_bits\": 18446744073709551615")},
      {"precision_bits a string", replaced("\"precision_bits\": 53", "\"precision_bits\": \"53\"")},
      {"modes below 8", replaced("\"modes\": ", "\"modes\": 2, \"was\": ")},
      {"modes 2^31 - 1 (modes + 2 overflows int)", replaced("\"modes\": ", "\"modes\": 2147483647, \"was\": ")},
      {"modes negative", replaced("\"modes\": ", "\"modes\": -9223372036854775808, \"was\": ")},
      {"coefficient list shorter than modes + 2", replaced(hex + ",", "")},
      {"coefficient not a string", replaced(hex, "1.5")},
      {"coefficient not a number", replaced(hex, "\"zz\"")},
      {"coefficient infinite", replaced(hex, "\"inf\"")},
      {"coefficient not exact in double (53 bits)", replaced(hex, "\"0.1\"")},
      {"existence_radius not a number", replaced("\"existence_radius\": \"", "\"existence_radius\": \"small")},
      {"existence_radius negative", replaced("\"existence_radius\": \"", "\"existence_radius\": \"-1")},
      {"a value enclosure missing", replaced_last("\"K\": [", "\"K_was\": [")},
      {"a value enclosure reversed", replaced_last("\"K\": [", "\"K\": [\"1\", \"0\"], \"K_was\": [")},
      {"a value enclosure not numbers", replaced_last("\"K\": [", "\"K\": [\"big\", \"1\"], \"K_was\": [")},
  };
  for (auto& c : v)
    if (c.reader == "recheck" && c.input.empty())
      for (const auto& [what, text] : damage)
        if (what == c.what) c.input = text;
  return v;
}

}  // namespace

TEST_CASE("bad input everywhere: exit 2, message names what and why, nothing clobbered or half-written") {
  std::filesystem::create_directories(dir);
  std::filesystem::remove_all(dir + "/no");
  std::ofstream table("bad-input-table.md");
  table << "| reader / command | malformed input | exit | message (first line) |\n|---|---|---|---|\n";
  int n = 0;
  for (const Case& c : cases()) {
    CAPTURE(c.reader);
    CAPTURE(c.what);
    const std::string in = dir + "/input";
    std::filesystem::remove(in);
    if (c.args.find("@IN") != std::string::npos) put(in, c.input);
    put(out_path, kPrecious);
    const std::string args = subst(c.args, in);
    const Run r = porecert(args);
    CAPTURE(args);
    CAPTURE(r.out);
    CHECK(r.rc == 2);
    for (const auto& m : c.must) CHECK_MESSAGE(r.out.find(m) != std::string::npos, m);
    CHECK(r.out.find("internal error") == std::string::npos);
    // The existing output is untouched and no temporary file is left behind.
    CHECK(slurp(out_path) == kPrecious);
    for (const auto& e : std::filesystem::directory_iterator(dir))
      CHECK_MESSAGE(e.path().string().find(".tmp-porecert") == std::string::npos, e.path().string());
    CHECK(!std::filesystem::exists(dir + "/no"));
    // The input itself is not modified either.
    if (c.args.find("@IN") != std::string::npos) CHECK(slurp(in) == c.input);
    std::string first = r.out.substr(0, r.out.find('\n'));
    for (std::size_t p; (p = first.find('|')) != std::string::npos;) first.replace(p, 1, "/");
    if (first.size() > 240) first = first.substr(0, 237) + "...";
    table << "| " << c.reader << " | " << c.what << " | " << r.rc << " | `" << first << "` |\n";
    ++n;
  }
  std::printf("bad input: %d cases, table in bad-input-table.md\n", n);
}

TEST_CASE("a good run replaces the output whole; a failing write keeps the old file") {
  std::filesystem::create_directories(dir);
  put(out_path, kPrecious);
  REQUIRE(porecert("verify --R=0.5 --json " + out_path).rc == 0);
  const std::string c = slurp(out_path);
  CHECK(c.find("\"status\": \"certified\"") != std::string::npos);
  CHECK(c.back() == '\n');
  // A read-only directory: the run fails before the proof, with exit 2, and the old file stays.
  const std::string ro = dir + "/ro";
  std::filesystem::create_directories(ro);
  put(ro + "/c.json", kPrecious);
  std::filesystem::permissions(ro, std::filesystem::perms::owner_read | std::filesystem::perms::owner_exec);
  const bool root = porecert("greens --json " + ro + "/probe.json").rc == 0;  // root ignores permissions
  std::filesystem::remove(ro + "/probe.json");
  if (!root) {
    const Run r = porecert("verify --R=0.5 --json " + ro + "/c.json");
    CHECK(r.rc == 2);
    CHECK(slurp(ro + "/c.json") == kPrecious);
  } else {
    MESSAGE("running as root: the read-only directory case is not testable here");
  }
  std::filesystem::permissions(ro, std::filesystem::perms::owner_all);
}
