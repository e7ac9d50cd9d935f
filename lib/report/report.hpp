// `porecert report`: one self-contained HTML page (inline SVG and CSS, no network) from a
// certificate, a `porecert branches` result or a list of certificates (a sweep). Reading reuses
// certificate::parse; every number shown is taken from, or derived rigorously from, the input
// (docs/report.md says what each plot and table encloses).
#pragma once
#include <nlohmann/json.hpp>
#include <string>
#include <vector>

#include "arith/interval.hpp"

namespace porecert::report {

struct ReportInput {
  std::string kind;                     // "certificate", "branches" or "list"
  std::vector<nlohmann::json> entries;  // certificates, each validated by certificate::parse
  nlohmann::json top;                   // the whole document (searched region etc. for branches)
};

// Reads and validates PATH. Accepted: a porecert-certificate object; an object with a
// "solutions" array (porecert branches) or a "certificates" array (a sweep); a JSON array of
// certificates. Throws certificate::format_error naming the key (entries as "solutions[i]").
ReportInput load(const std::string& path);

// The HTML page. Throws certificate::format_error when a certified entry lacks what the page
// needs (error_bounds, bounds, a readable candidate, dimensional inputs that do not match R).
std::string render_html(const ReportInput& in, const std::string& source_name);

// The profile enclosures the page draws, for one certified certificate: at eta_i = i/128 (exact;
// the pipe: xi_i = i/128), i = 0..128, or for the full channel eta_i = -1 + i/128, i = 0..256,
// f(eta_i) and f'(eta_i) enclose the true solution's values (docs/report.md (R1)-(R2)).
struct Profile {
  std::vector<double> eta;
  std::vector<arith::Id> f, fp;
};
Profile certified_profile(const nlohmann::json& cert);

// Ids of the elements the page always carries for this input (the Chromium test checks them).
std::vector<std::string> expected_ids(const ReportInput& in);

}  // namespace porecert::report
