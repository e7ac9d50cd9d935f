// Verdicts on claims (docs/reviewing.md §3): accepted = proven by the certificate, rejected =
// disproven (with the certified enclosure that disproves it), undecided = neither (with what
// would decide it). Three-valued throughout: "undecided" is never "rejected".
#pragma once
#include <string>
#include <vector>

#include "model/claims_file.hpp"
#include "proof/certify.hpp"

namespace porecert::proof {

struct Verdict {
  int index = 0;
  std::string claim;                      // the claim in words
  arith::Tri holds = arith::Tri::unsure;  // yes = accepted, no = rejected, unsure = undecided
  std::string evidence;                   // the certified fact the verdict rests on
  std::string to_decide;                  // undecided only: what would decide it
};
inline const char* verdict_word(arith::Tri t) {
  return t == arith::Tri::yes ? "accepted" : t == arith::Tri::no ? "rejected" : "undecided";
}

// Judges every claim against the certified outcome o (from req). Claims about solutions found
// run the branch search (lib/proof/branches.hpp) once. A non-certified o leaves all undecided.
std::vector<Verdict> judge(const model::ClaimsFile& f, const CertifyRequest& req, const CertifyOutcome& o);

// The longest decimal D (significant digits) with the enclosure [lo, hi] inside the open
// interval (D − u/2, D + u/2), u one unit in D's last digit; "" if not even one digit is certain.
// Sets unit to u as a decimal string ("1e-11").
std::string certified_digits(const std::string& lo, const std::string& hi, std::string* unit = nullptr);

}  // namespace porecert::proof
