// Test support: run a shell command or the real porecert binary (PORECERT_BINARY, set by CMake) and
// collect its exit status and output (stdout and stderr together); read and write whole files.
// Shared by the command-line tests.
#pragma once
#include <sys/wait.h>

#include <cstdio>
#include <fstream>
#include <sstream>
#include <string>

namespace porecert::test {

struct Run {
  int rc;           // exit status
  std::string out;  // stdout and stderr
};

inline Run shell(const std::string& cmd) {
  FILE* p = popen((cmd + " 2>&1").c_str(), "r");
  std::string out;
  char buf[4096];
  while (std::fgets(buf, sizeof buf, p)) out += buf;
  const int st = pclose(p);
  return {WEXITSTATUS(st), out};
}

inline Run porecert_cli(const std::string& args) { return shell(std::string(PORECERT_BINARY) + " " + args); }

inline std::string slurp(const std::string& path) {
  std::ifstream in(path, std::ios::binary);
  std::stringstream ss;
  ss << in.rdbuf();
  return ss.str();
}

inline void spit(const std::string& path, const std::string& text) { std::ofstream(path, std::ios::binary) << text; }

// `porecert verify VERIFY_ARGS --json DIR/STEM.json`, then `porecert report` of it to DIR/STEM.html.
// Returns the page, or "" with the failing command's output in *log when either step fails.
inline std::string verify_and_report(const std::string& verify_args, const std::string& dir, const std::string& stem,
                                     std::string* log) {
  shell("mkdir -p " + dir);
  const std::string json = dir + "/" + stem + ".json", html = dir + "/" + stem + ".html";
  for (const std::string& cmd : {"verify " + verify_args + " --json " + json, "report " + json + " --html " + html}) {
    const Run r = porecert_cli(cmd);
    if (r.rc != 0) {
      *log = cmd + ": exit " + std::to_string(r.rc) + "\n" + r.out;
      return "";
    }
  }
  return slurp(html);
}

}  // namespace porecert::test
