// porecert report: a self-contained HTML page from a certificate, a branches result or a sweep.
#include <cstdio>

#include "certificate/certificate.hpp"
#include "commands.hpp"
#include "report/report.hpp"

namespace porecert::cli {

Action register_report(CLI::App& app) {
  auto* sub = app.add_subcommand("report", "Write a self-contained HTML report (inline SVG) of a certificate");
  struct Opts {
    std::string input, html;
  };
  auto o = std::make_shared<Opts>();
  sub->add_option("input", o->input, "Certificate, `porecert branches` result or list of certificates (JSON)")
      ->required();
  sub->add_option("--html", o->html, "Write the page to PATH (written atomically)")->required();
  return [o] {
    std::string page;
    try {
      const auto in = report::load(o->input);
      page = report::render_html(in, o->input);
    } catch (const certificate::format_error& e) {
      throw input_error(e.what());
    }
    try {
      certificate::write_atomic(o->html, page);
    } catch (const std::exception& e) {
      throw input_error("--html: cannot write '" + o->html + "' (" + e.what() + ")");
    }
    if (o->html != "-") std::printf("porecert report: wrote %s (%zu bytes)\n", o->html.c_str(), page.size());
    return 0;
  };
}

}  // namespace porecert::cli
