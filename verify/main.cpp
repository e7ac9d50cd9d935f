#include <cstdio>
#include <exception>
#include <vector>

#include "commands.hpp"

int main(int argc, char** argv) {
  CLI::App app{
      "porecert: machine-checked certificates for Berman's porous-channel flow.\n"
      "Certifies mathematics, not a plant: see README.md, 'Cautions'."};
  app.require_subcommand(1);
  std::vector<std::pair<CLI::App*, porecert::cli::Action>> actions;
  auto add = [&](porecert::cli::Action (*reg)(CLI::App&)) {
    const std::size_t before = app.get_subcommands({}).size();
    porecert::cli::Action act = reg(app);
    auto subs = app.get_subcommands({});
    if (subs.size() > before) actions.emplace_back(subs.back(), std::move(act));
  };
  add(porecert::cli::register_verify);
  add(porecert::cli::register_greens);
  add(porecert::cli::register_recheck);
  add(porecert::cli::register_branches);
  add(porecert::cli::register_fold);
  add(porecert::cli::register_report);
  add(porecert::cli::register_import);
  add(porecert::cli::register_check);
  add(porecert::cli::register_sweep);
  try {
    app.parse(argc, argv);
  } catch (const CLI::ParseError& e) {
    bool known = false;
    for (const CLI::App* sub : app.get_subcommands({})) known = known || (argc > 1 && sub->get_name() == argv[1]);
    if (argc > 1 && argv[1][0] != '-' && !known) {
      std::fprintf(stderr,
                   "porecert: bad input: '%s' is not a subcommand (rule: verify, recheck, branches, fold or greens)\n",
                   argv[1]);
      return 2;
    }
    const int rc = app.exit(e);
    return rc == 0 ? 0 : 2;
  }
  try {
    for (auto& [sub, act] : actions)
      if (sub->parsed()) return act();
  } catch (const porecert::cli::input_error& e) {
    std::fprintf(stderr, "porecert: bad input: %s\n", e.what());
    return 2;
  } catch (const std::exception& e) {
    std::fprintf(stderr, "porecert: internal error: %s\n", e.what());
    return 4;  // 3 is check's "undecided"
  }
  return 2;
}
