// Submissions from other programs (docs/reviewing.md §2): a CSV of samples, a Chebyshev series
// (JSON), or shooting data f'(0), f'''(0). The readers validate the input (bad input → input_error
// naming row / column / key, value and rule, exit 2). The *submitted solution* is defined exactly
// by the interpolant of docs/reviewing.md (R1)-(R3); `pieces` builds it over any scalar (intervals
// for the rigorous distance in lib/proof/submission.hpp, double for the candidate).
// NON-RIGOROUS: `candidate_from` turns a submission into a point candidate for lib/proof to check.
#pragma once
#include <array>
#include <optional>
#include <string>
#include <string_view>
#include <vector>

#include "arith/interval.hpp"
#include "candidate/galerkin_newton.hpp"
#include "model/case_file.hpp"

namespace porecert::candidate {

inline constexpr int kCsvMinRows = 8;
inline constexpr int kCsvMaxRows = 200000;
inline constexpr const char* kColumnNames[4] = {"f", "f'", "f''", "f'''"};

struct Submission {
  enum class Kind { csv, chebyshev, shooting } kind = Kind::csv;
  std::string source;  // file name or "start"
  // csv: x and the columns present (column k = k-th derivative of f), as written (decimal text).
  std::vector<std::string> x;
  std::array<std::optional<std::vector<std::string>>, 4> column;
  // chebyshev: coefficients of f in T_k(2η − 1), as written.
  std::vector<std::string> coefficients;
  // shooting: f'(0), f'''(0) as written.
  std::string a, b;
};

// Reads a CSV: optional '#' comment lines, a header naming columns among x, f, f', f'', f'''
// (x and f required, each at most once, any order), then rows of finite decimals, x strictly
// increasing from exactly 0 to exactly 1, at least kCsvMinRows rows. Throws input_error.
Submission read_csv(const std::string& path);
// The same from the file's text; source names it in messages (fuzz target tests/fuzz/fuzz_csv.cpp).
Submission read_csv_text(std::string_view text, const std::string& source);
// Reads {"series_of": "f", "coefficients": ["...", ...]} (decimal or hex strings, at least 4).
Submission read_chebyshev_json(const std::string& path);
// Shooting data (decimal strings); throws input_error when not finite numbers.
Submission shooting(const std::string& a, const std::string& b);

// One piece of the submitted interpolant of column k on [x_i, x_{i+1}]:
// p(η) = c0 + c1 t + c2 t² + c3 t³, t = η − x_i (docs/reviewing.md (R1)-(R2)).
template <class S>
struct Piece {
  S x0, x1;
  std::array<S, 4> c;
};
// The pieces of column k (requires the column present). On interval S the coefficients enclose
// the exact ones of the interpolant of the decimal data.
template <class S>
std::vector<Piece<S>> pieces(const Submission& s, int k);
// Value of the j-th derivative (j ≤ 3) of a piece at η.
template <class S>
S piece_eval(const Piece<S>& p, const S& eta, int j = 0);

struct ImportReport {
  Vec x;               // candidate in the layout [f'(0), K, u_0 ..] (Newton-refined when converged)
  Vec x_as_submitted;  // the same before Newton (the submission projected on the layout)
  bool converged = false;
  std::vector<std::string> log;
};
// Candidate for Berman's problem at R (a double) from the submission.
ImportReport candidate_from(const Submission& s, double R, int max_modes = 3000);

}  // namespace porecert::candidate
