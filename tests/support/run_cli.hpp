// Test support: run the real porecert binary (PORECERT_BINARY, set by CMake) and collect its exit
// status and output (stdout and stderr together). Shared by the command-line tests.
#pragma once
#include <sys/wait.h>

#include <cstdio>
#include <string>

namespace porecert::test {

struct Run {
  int rc;           // exit status
  std::string out;  // stdout and stderr
};

inline Run porecert_cli(const std::string& args) {
  const std::string cmd = std::string(PORECERT_BINARY) + " " + args + " 2>&1";
  FILE* p = popen(cmd.c_str(), "r");
  std::string out;
  char buf[4096];
  while (std::fgets(buf, sizeof buf, p)) out += buf;
  const int st = pclose(p);
  return {WEXITSTATUS(st), out};
}

}  // namespace porecert::test
