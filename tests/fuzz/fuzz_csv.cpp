// libFuzzer target: the CSV candidate reader (lib/candidate/import.hpp: read_csv_text, what
// `porecert import` and a claims file's csv source read before any candidate or proof). Any bytes
// must end in a Submission that obeys the reader's rules or in model::input_error; any other
// exception, a crash, a leak or undefined behaviour (ASan/UBSan) is a finding. Corpus: tests/fuzz/corpus/csv/.
#include <cstddef>
#include <cstdint>
#include <cstdlib>
#include <string_view>

#include "arith/interval.hpp"
#include "candidate/import.hpp"

extern "C" int LLVMFuzzerTestOneInput(const std::uint8_t* data, std::size_t size) {
  using namespace porecert;
  const std::string_view text(reinterpret_cast<const char*>(data), size);
  try {
    const candidate::Submission s = candidate::read_csv_text(text, "fuzz.csv");
    // What the reader accepted must satisfy its documented rules.
    const std::size_t n = s.x.size();
    if (s.kind != candidate::Submission::Kind::csv || n < candidate::kCsvMinRows || n > candidate::kCsvMaxRows ||
        !s.column[0])
      std::abort();
    for (const auto& col : s.column)
      if (col) {
        if (col->size() != n) std::abort();
        for (const auto& v : *col) (void)arith::from_decimal<arith::Id>(v);  // throws = finding
      }
    // x: exactly 0 first, exactly 1 last, strictly increasing (enclosures disjoint), inside [0, 1].
    arith::Id prev;
    for (std::size_t i = 0; i < n; ++i) {
      const arith::Id x = arith::from_decimal<arith::Id>(s.x[i]);  // throws = finding
      if (i == 0 && !(x.lower() == 0 && x.upper() == 0)) std::abort();
      if (i > 0 && !(prev.upper() < x.lower())) std::abort();
      if (x.upper() > 1) std::abort();
      prev = x;
    }
    if (!(prev.lower() == 1 && prev.upper() == 1)) std::abort();
  } catch (const model::input_error&) {
    // the documented outcome for bad input
  }
  return 0;
}
