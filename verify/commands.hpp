// The porecert command line: one register_* function per subcommand, each in its own file.
// Exit codes everywhere: 0 certified / done, 1 not certified, 2 bad input, 4 internal error (docs/cli.md).
#pragma once
#include <CLI/CLI.hpp>
#include <functional>
#include <string>

#include "model/case_file.hpp"

namespace porecert::cli {

// A subcommand registers its options and returns the action to run when it was chosen.
using Action = std::function<int()>;

Action register_verify(CLI::App& app);
Action register_greens(CLI::App& app);
Action register_recheck(CLI::App& app);
Action register_branches(CLI::App& app);
Action register_fold(CLI::App& app);
Action register_report(CLI::App& app);
Action register_import(CLI::App& app);
Action register_check(CLI::App& app);
Action register_sweep(CLI::App& app);

// Bad user input: message names the option/field, the value and the rule; exit status 2.
using input_error = model::input_error;

}  // namespace porecert::cli
