// The floating-point environment of a public entry point (docs/soundness.md §5, fp-traps 9).
// The double intervals compute in round-to-nearest and step one ulp outward; they need IEEE
// defaults: round-to-nearest, no flush-to-zero / denormals-are-zero, traps masked. A caller may
// have set anything (an upward rounding mode, FTZ from a fast-math main program, an enabled
// FE_INVALID trap). FpEnvScope saves the caller's whole environment (rounding mode, exception
// flags, trap masks, and on x86 the MXCSR FTZ/DAZ bits), installs the IEEE default environment
// (FE_DFL_ENV), and puts the caller's environment back on exit, also when an exception leaves.
// So results do not depend on the caller's environment (bit for bit), and the caller finds its
// rounding mode and exception flags as it left them: flags raised inside are not reported.
#pragma once
#include <cfenv>

namespace porecert::arith {

class FpEnvScope {
 public:
  FpEnvScope() {
    std::fegetenv(&saved_);
    std::fesetenv(FE_DFL_ENV);
  }
  ~FpEnvScope() { std::fesetenv(&saved_); }
  FpEnvScope(const FpEnvScope&) = delete;
  FpEnvScope& operator=(const FpEnvScope&) = delete;

 private:
  std::fenv_t saved_;
};

}  // namespace porecert::arith
