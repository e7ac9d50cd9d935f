// libFuzzer target: the certificate reader (lib/certificate/certificate.hpp: parse_text, then parse,
// the path `porecert recheck` takes before any proof). Any bytes must end in a Stored record that
// obeys the reader's rules or in certificate::format_error; any other exception, a crash, a leak or
// undefined behaviour (ASan/UBSan) is a finding. Corpus: tests/fuzz/corpus/certificate/.
#include <cstddef>
#include <cstdint>
#include <cstdlib>
#include <string>

#include "arith/interval.hpp"
#include "certificate/certificate.hpp"

extern "C" int LLVMFuzzerTestOneInput(const std::uint8_t* data, std::size_t size) {
  using namespace porecert;
  const std::string text(reinterpret_cast<const char*>(data), size);
  try {
    const nlohmann::json doc = certificate::parse_text(text, "fuzz.json");
    const certificate::Stored s = certificate::parse(doc);
    // What the reader accepted must satisfy its documented rules.
    if (s.candidate_hex.size() < 10 || s.precision_bits < 53 || s.precision_bits > 4096) std::abort();
    for (const auto& h : s.candidate_hex) (void)arith::from_decimal<arith::Id>(h);  // throws = finding
    if (s.status == "certified" && !(s.existence_radius >= 0)) std::abort();
  } catch (const certificate::format_error&) {
    // the documented outcome for bad input
  }
  return 0;
}
