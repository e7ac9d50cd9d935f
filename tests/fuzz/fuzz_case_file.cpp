// libFuzzer target: the case-file reader (lib/model/case_file.hpp). Any bytes must end in settings
// that obey the reader's own rules or in model::input_error; any other exception, a crash, a leak
// or undefined behaviour (ASan/UBSan) is a finding. Corpus: tests/fuzz/corpus/case_file/.
#include <cstddef>
#include <cstdint>
#include <cstdlib>
#include <string_view>

#include "arith/interval.hpp"
#include "model/case_file.hpp"

extern "C" int LLVMFuzzerTestOneInput(const std::uint8_t* data, std::size_t size) {
  using namespace porecert;
  const std::string_view text(reinterpret_cast<const char*>(data), size);
  try {
    const model::CaseSettings c = model::read_case_text(text, "fuzz.toml");
    // What the reader accepted must satisfy its documented rules.
    if (c.R) {
      const arith::Id lo = arith::from_decimal<arith::Id>(c.R->first), hi = arith::from_decimal<arith::Id>(c.R->second);
      if (!(lo.lower() <= hi.upper()) || lo.lower() < -1e5 || hi.upper() > 1e5) std::abort();
    }
    if (c.modes && *c.modes != 0 && (*c.modes < 8 || *c.modes > 4000)) std::abort();
    if (c.precision_bits && *c.precision_bits != 0 && (*c.precision_bits < 53 || *c.precision_bits > 4096))
      std::abort();
  } catch (const model::input_error&) {
    // the documented outcome for bad input
  }
  return 0;
}
