// Command-line options choosing a model (docs/models.md), shared by verify and branches.
#pragma once
#include <CLI/CLI.hpp>
#include <memory>
#include <string>

#include "model/case_file.hpp"
#include "model/model_spec.hpp"

namespace porecert::cli {

struct ModelOptions {
  std::string model, wall_ratio, expansion, hartmann, slip;
};

inline void add_model_options(CLI::App* sub, ModelOptions& o) {
  sub->add_option("--model", o.model,
                  "Model: berman (default), full-channel, moving-walls, mhd, slip, pipe (porous pipe; docs/models.md)");
  sub->add_option("--wall-ratio", o.wall_ratio, "full-channel: f(-1) = -a, decimal a (default 1)");
  sub->add_option("--expansion", o.expansion, "moving-walls: wall expansion ratio alpha (decimal)");
  sub->add_option("--hartmann", o.hartmann, "mhd: Hartmann number M >= 0 (decimal)");
  sub->add_option("--slip", o.slip, "slip length beta >= 0 at the wall, f'(1) + beta f''(1) = 0 (decimal)");
}

// The spec from a case file's [model] table (if any) overridden by the options; checked.
inline model::ModelSpec spec_from(const ModelOptions& o, const model::CaseSettings* c = nullptr) {
  model::ModelSpec s;
  if (c && c->model_name) s.name = *c->model_name;
  if (c)
    for (const auto& [k, v] : c->model_params) s.set(k, v);
  if (!o.model.empty()) s.name = o.model;
  if (!o.wall_ratio.empty()) s.set("wall-ratio", o.wall_ratio);
  if (!o.expansion.empty()) s.set("expansion", o.expansion);
  if (!o.hartmann.empty()) s.set("hartmann", o.hartmann);
  if (!o.slip.empty()) s.set("slip", o.slip);
  return model::checked(s);
}

}  // namespace porecert::cli
