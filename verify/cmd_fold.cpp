// porecert fold: enclose the turning point R* where branches II and III are born (docs/fold.md).
#include <cmath>
#include <cstdio>

#include "certificate/certificate.hpp"
#include "commands.hpp"
#include "proof/branches.hpp"
#include "proof/fold.hpp"

namespace porecert::cli {

Action register_fold(CLI::App& app) {
  auto* sub = app.add_subcommand("fold", "Enclose the fold R* of the suction branches II/III (extended system)");
  struct Opts {
    std::string json;
    int precision = 0, modes = 0;
    bool skip_below = false;
    std::string model = "berman", kind = "turning-point";
  };
  auto o = std::make_shared<Opts>();
  sub->add_option("--json", o->json, "Write the result (JSON) to PATH, or - for stdout");
  sub->add_option("--precision", o->precision, "53 (double intervals only) or MPFR bits 64..4096 (default: automatic)");
  sub->add_option("--modes", o->modes, "Chebyshev modes per function, 16..2000 (default: automatic)");
  sub->add_flag("--no-below-check", o->skip_below, "Skip the branch search just below (or above) the enclosure");
  sub->add_option("--model", o->model, "berman (default) or full-channel (a = 1; docs/models.md)");
  sub->add_option("--kind", o->kind,
                  "turning-point (berman: fold of II/III) or symmetry-breaking (full-channel: pitchfork of type I)");
  return [o] {
    if (o->model != "berman" && o->model != "full-channel")
      throw input_error("--model: '" + o->model + "' has no fold computation (rule: berman or full-channel)");
    if (o->kind != "turning-point" && o->kind != "symmetry-breaking")
      throw input_error("--kind: '" + o->kind + "' is not a kind (rule: turning-point or symmetry-breaking)");
    if ((o->model == "full-channel") != (o->kind == "symmetry-breaking"))
      throw input_error("--kind: '" + o->kind + "' with --model " + o->model +
                        " (rule: berman with turning-point, full-channel with symmetry-breaking)");
    const bool sb = o->kind == "symmetry-breaking";
    if (o->precision != 0 && o->precision != 53 && (o->precision < 64 || o->precision > 4096))
      throw input_error("--precision: " + std::to_string(o->precision) +
                        " must be 0 (automatic), 53, or 64..4096 bits");
    if (o->modes != 0 && (o->modes < 16 || o->modes > 2000))
      throw input_error("--modes: " + std::to_string(o->modes) + " must be 0 (automatic) or 16..2000");
    if (!o->json.empty()) certificate::check_output(o->json);
    const proof::FoldOutcome f = sb ? proof::certify_symmetry_breaking(1e-10, o->precision, o->modes)
                                    : proof::certify_fold(1e-10, o->precision, o->modes);
    const bool quiet = o->json == "-";
    nlohmann::json j;
    j["format"] = "porecert-fold";
    j["kind"] = o->kind;
    j["model"] = o->model;
    j["problem"] = sb ? "full channel, equal walls (a = 1): symmetry-breaking point of the type I (symmetric) solution"
                      : "Berman half-channel, suction: turning point of the branches II/III";
    j["method"] =
        sb ? "Newton-Kantorovich (radii polynomial) for the extended system (F1)-(F6) of docs/fold.md in g = R f on "
             "the half channel with the even null space (F14): v(0) = 1, v'(0) = 0, kappa = 0, v''(0) unknown"
           : "Newton-Kantorovich (radii polynomial) for the extended system (F1)-(F6) of docs/fold.md in g = R f: "
             "F(g, K~, R) = 0, D_(g,K~) F v = 0, v'(0) = 1 (Moore & Spence 1980); Chebyshev series, l1 norm over all "
             "components";
    j["status"] = f.certified ? "certified" : "not certified";
    if (!f.certified) j["failure"] = f.failure;
    j["modes"] = f.modes;
    j["precision_bits"] = f.precision_bits;
    j["bounds"] = {{"Y0", f.bounds.Y0},
                   {"Z0", f.bounds.Z0},
                   {"Z1", f.bounds.Z1},
                   {"Z2", f.bounds.Z2},
                   {"A_norm", f.bounds.A_norm}};
    j["log"] = f.log;
    j["candidate"] = {{"modes", f.modes},
                      {"precision_bits", f.precision_bits},
                      {"layout", sb ? "[a = g'(0), K~, R, v''(0), u_g modes, u_v modes], g = R f"
                                    : "[a = g'(0), K~, R, kappa, u_g modes, u_v modes], g = R f"},
                      {"coefficients_hex", f.candidate_hex}};
    j["seconds"] = f.seconds;
    std::string below_R;
    if (f.certified) {
      j["fold_R"] = {f.R_lo, f.R_hi};
      j["existence_radius"] = f.existence_radius;
      j["uniqueness_radius"] = f.uniqueness_radius;
      j["values"] = {{"f'(0)", f.values[0]}, {"f'''(0)", f.values[1]}, {"f''(1)", f.values[2]}, {"K", f.values[3]}};
      j["nondegeneracy"] =
          sb ? "the zero is a nondegenerate (isolated) zero of the extended system restricted to odd f and even v: "
               "DF is invertible there, so (Werner & Spence 1984, from memory) R* is a simple symmetry-breaking "
               "bifurcation point of the symmetric solution in the full channel; unique in the ball of radius "
               "uniqueness_radius"
             : "the zero is a nondegenerate (isolated) zero of the extended system: ||I - A DF|| < 1 on the ball makes "
               "DF invertible there, so (Moore & Spence 1980) R* is a simple turning point; the zero is unique in the "
               "ball of radius uniqueness_radius";
      // An R just below the enclosure: two decimals, at least 0.05 below its lower end.
      char buf[32];
      if (sb)  // above the pitchfork, where the asymmetric pair should exist
        std::snprintf(buf, sizeof buf, "%.2f", std::ceil((f.R.upper() + 0.25) * 100) / 100);
      else
        std::snprintf(buf, sizeof buf, "%.2f", std::floor((f.R.lower() - 0.05) * 100) / 100);
      below_R = buf;
    }
    if (!quiet) {
      std::printf("%s\n", sb ? "porecert fold: full channel (a = 1), symmetry-breaking point of type I"
                             : "porecert fold: Berman half-channel, suction, turning point of branches II/III");
      const std::string prec =
          f.precision_bits <= 53 ? "double intervals" : "MPFR " + std::to_string(f.precision_bits) + " bits";
      std::printf("  %d Chebyshev modes per function, %s, %.2f s\n", f.modes, prec.c_str(), f.seconds);
      std::printf("  bounds: Y0 = %.3g  Z0 = %.3g  Z1 = %.3g  Z2 = %.3g  |A| = %.3g\n", f.bounds.Y0, f.bounds.Z0,
                  f.bounds.Z1, f.bounds.Z2, f.bounds.A_norm);
      if (f.certified) {
        std::printf("  CERTIFIED: R* in [%s, %s]\n", f.R_lo.c_str(), f.R_hi.c_str());
        std::printf("  existence radius %.3g, unique within %.3g (l1 ball of the extended unknowns)\n",
                    f.existence_radius, f.uniqueness_radius);
        const char* names[4] = {"f'(0)", "f'''(0)", "f''(1)", "K"};
        for (int i = 0; i < 4; ++i)
          std::printf("  %-8s in [%s, %s]\n", names[i], f.values[i][0].c_str(), f.values[i][1].c_str());
        if (sb) {
          std::printf("  (values of the symmetric solution at R*; v''(0) of the even null vector in [%s, %s])\n",
                      arith::decimal_lower(f.kappa).c_str(), arith::decimal_upper(f.kappa).c_str());
          std::printf("  nondegenerate zero of the extended system: a simple symmetry-breaking point\n");
        } else {
          std::printf("  nondegenerate zero of the extended system: a simple turning point (Moore & Spence 1980)\n");
        }
      } else {
        std::printf("  NOT CERTIFIED: %s\n", f.failure.c_str());
      }
    }
    if (f.certified && !o->skip_below) {
      proof::CertifyRequest req;
      req.R_lo = req.R_hi = below_R;
      if (sb) req.model = model::checked(model::ModelSpec{"full-channel", {}});
      const auto b = proof::certify_branches(req);
      int certified = 0;
      for (const auto& s : b.solutions) certified += s.certified ? 1 : 0;
      j[sb ? "above_point_check" : "below_fold_check"] = {{"R", below_R},
                                                          {"solutions_found", b.solutions.size()},
                                                          {"solutions_certified", certified},
                                                          {"searched_region", b.region}};
      if (!quiet)
        std::printf("  %s, R = %s: %zu solution(s) found (%d certified); searched: %s\n",
                    sb ? "above the point" : "below the fold", below_R.c_str(), b.solutions.size(), certified,
                    b.region.c_str());
    }
    if (!quiet) std::printf("  %s\n", certificate::kCaution);
    if (!o->json.empty()) certificate::write_atomic(o->json, j.dump(2) + "\n");
    return f.certified ? 0 : 1;
  };
}

}  // namespace porecert::cli
