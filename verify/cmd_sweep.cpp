// porecert sweep: certify a branch for every R in a range (docs/sweep.md). Threads on one
// machine; with the MPI build (CMake option PORECERT_MPI) and `mpirun -np N`, the initial boxes
// are dealt round-robin to the ranks and rank 0 gathers, journals and writes the one result.
#include <unistd.h>

#include <chrono>
#include <cmath>
#include <condition_variable>
#include <cstdio>
#include <cstdlib>
#include <deque>
#include <mutex>
#include <thread>

#include "certificate/journal.hpp"
#include "certificate/sweep.hpp"
#include "commands.hpp"
#include "model_options.hpp"
#include "proof/sweep.hpp"

#ifdef PORECERT_MPI
#include <mpi.h>
#endif

namespace porecert::cli {

namespace {

namespace sw = certificate::sweep;
using nlohmann::json;

struct SweepOptions {
  std::string R, branch = "I", json, journal, width = "auto", min_width = "0.00001";
  int jobs = 0;
  bool resume = false, stop_at_gap = false;
  ModelOptions mo;
};

// Ranks: 1 without MPI or when not started by mpirun.
struct Ranks {
  int rank = 0, size = 1;
  bool mpi = false;
};

Ranks start_mpi() {
  Ranks r;
#ifdef PORECERT_MPI
  // Only when launched by an MPI starter: a plain run stays a plain program.
  if (std::getenv("OMPI_COMM_WORLD_SIZE") || std::getenv("PMI_SIZE") || std::getenv("PMIX_RANK")) {
    int provided = 0;
    MPI_Init_thread(nullptr, nullptr, MPI_THREAD_FUNNELED, &provided);
    MPI_Comm_rank(MPI_COMM_WORLD, &r.rank);
    MPI_Comm_size(MPI_COMM_WORLD, &r.size);
    r.mpi = true;
  }
#endif
  return r;
}

void stop_mpi(const Ranks& r) {
#ifdef PORECERT_MPI
  if (r.mpi) MPI_Finalize();
#else
  (void)r;
#endif
}

#ifdef PORECERT_MPI
constexpr int kTagRecord = 1, kTagDone = 2;
void send_text(const std::string& s, int tag) {
  MPI_Send(s.data(), static_cast<int>(s.size()), MPI_CHAR, 0, tag, MPI_COMM_WORLD);
}
std::string bcast_text(const Ranks& r, std::string s) {
  long n = static_cast<long>(s.size());
  MPI_Bcast(&n, 1, MPI_LONG, 0, MPI_COMM_WORLD);
  s.resize(static_cast<std::size_t>(n));
  MPI_Bcast(s.data(), static_cast<int>(n), MPI_CHAR, 0, MPI_COMM_WORLD);
  return s;
}
#endif

std::string check_width(const std::string& opt, const std::string& v) {
  arith::Id x;
  try {
    x = arith::from_decimal<arith::Id>(v);
  } catch (const std::invalid_argument&) {
    throw input_error(opt + ": '" + v + "' is not a decimal number" +
                      (opt == "--width" ? std::string(" (rule: a decimal > 0, or auto)") : std::string()));
  }
  if (!(x.lower() > 0)) throw input_error(opt + ": '" + v + "' must be > 0");
  return v;
}

// Progress on stderr: a rewritten line on a terminal, a plain line at most every 30 s otherwise.
class Progress {
 public:
  Progress(std::size_t total) : total_(total), tty_(::isatty(2) != 0), t0_(clock::now()), last_(t0_) {}
  void box_done(const std::string& R_reached) {
    ++done_;
    const auto now = clock::now();
    const double el = std::chrono::duration<double>(now - t0_).count();
    if (!tty_ && std::chrono::duration<double>(now - last_).count() < 30 && done_ < total_) return;
    last_ = now;
    const double rate = el > 0 ? done_ / el : 0;
    const double eta = rate > 0 ? (total_ - done_) / rate : 0;
    std::fprintf(stderr, "%ssweep: %zu/%zu initial boxes, %.2f boxes/s, R reached %s, ETA %.0f s%s",
                 tty_ ? "\r\033[K" : "", done_, total_, rate, R_reached.c_str(), eta, tty_ ? "" : "\n");
    if (tty_ && done_ == total_) std::fprintf(stderr, "\n");
    std::fflush(stderr);
  }

 private:
  using clock = std::chrono::steady_clock;
  std::size_t total_, done_ = 0;
  bool tty_;
  clock::time_point t0_, last_;
};

int run_sweep(const SweepOptions& v) {
  sw::Params p;
  std::tie(p.R_lo, p.R_hi) = model::parse_R("--R", v.R);
  if (proof::sweep::approx_width(p.R_lo, p.R_hi) <= 0 ||
      arith::tri_less(arith::from_decimal<arith::Id>(p.R_lo), arith::from_decimal<arith::Id>(p.R_hi)) !=
          arith::Tri::yes)
    throw input_error("--R: '" + v.R + "' must be a range LO:HI with LO < HI");
  if (v.branch != "I" && v.branch != "II" && v.branch != "III")
    throw input_error("--branch: '" + v.branch + "' is not a branch (rule: I, II or III)");
  p.branch = v.branch;
  p.model = spec_from(v.mo);
  if (!p.model.is_berman() && p.branch != "I")
    throw input_error("--branch: '" + p.branch + "' is for Berman's model only (rule: with --model " + p.model.name +
                      " sweep --branch I, the branch continued from R = 0; docs/models.md §6)");
  p.width = v.width == "auto" ? v.width : check_width("--width", v.width);
  p.min_width = check_width("--min-width", v.min_width);
  if (p.width != "auto" && arith::tri_less(arith::from_decimal<arith::Id>(p.width), arith::from_decimal<arith::Id>(p.min_width)) ==
      arith::Tri::yes)
    throw input_error("--min-width: " + p.min_width + " exceeds --width " + p.width + " (rule: min-width <= width)");
  p.stop_at_gap = v.stop_at_gap;
  if (v.jobs < 0 || v.jobs > 256) throw input_error("--jobs: " + std::to_string(v.jobs) + " is outside 1..256");
  const int jobs = v.jobs > 0 ? v.jobs : std::max(1u, std::thread::hardware_concurrency());
  sw::Plan plan;
  try {
    plan = sw::make_plan(p);
  } catch (const std::invalid_argument& e) {
    throw input_error("--R/--width: cannot cut [" + p.R_lo + ", " + p.R_hi + "] into boxes of width " + p.width + " (" +
                      e.what() + ")");
  }
  const std::string journal_path =
      !v.journal.empty() ? v.journal
                         : (!v.json.empty() && v.json != "-" ? v.json + ".journal" : "porecert-sweep.journal");

  const Ranks ranks = start_mpi();
  std::unique_ptr<certificate::Journal> journal;
  std::vector<json> records;
  std::string note, error;
  if (ranks.rank == 0) {
    try {
      journal = std::make_unique<certificate::Journal>(journal_path, sw::identity(p), v.resume, &records, &note);
    } catch (const certificate::format_error& e) {
      error = e.what();
    }
  }
  std::string shared = error.empty() ? json(records).dump() : "!" + error;
#ifdef PORECERT_MPI
  if (ranks.mpi) shared = bcast_text(ranks, shared);
#endif
  if (!shared.empty() && shared[0] == '!') {
    stop_mpi(ranks);
    throw input_error(shared.substr(1));
  }
  if (ranks.rank != 0) records = json::parse(shared).get<std::vector<json>>();
  if (ranks.rank == 0 && !note.empty()) std::fprintf(stderr, "sweep: %s\n", note.c_str());
  if (ranks.rank == 0 && !records.empty())
    std::fprintf(stderr, "sweep: resuming with %zu settled boxes from %s\n", records.size(), journal_path.c_str());
  sw::Known known;
  try {
    known = sw::index_records(records);
  } catch (const certificate::format_error& e) {
    stop_mpi(ranks);
    throw input_error(e.what());
  }

  const int m = static_cast<int>(plan.order.size());
  std::vector<int> mine;
  for (int k = ranks.rank; k < m; k += ranks.size) mine.push_back(k);
  std::vector<std::optional<std::vector<json>>> by_position(m);
  Progress progress(static_cast<std::size_t>(m));
  auto reached = [&](int pos) {
    const int b = plan.order[pos];
    return plan.descending ? plan.points[b] : plan.points[b + 1];
  };

  // Non-root ranks hand their messages to the main thread, the only one that calls MPI.
  std::mutex qmu;
  std::condition_variable qcv;
  std::deque<std::pair<int, std::string>> queue;
  bool workers_done = false;
  auto post = [&](int tag, std::string s) {
    {
      std::lock_guard<std::mutex> lock(qmu);
      queue.emplace_back(tag, std::move(s));
    }
    qcv.notify_one();
  };
  std::function<void(const json&)> emit;
  std::function<void(int, const std::optional<std::vector<json>>&)> done;
  if (ranks.rank == 0) {
    emit = [&](const json& r) { journal->append(r); };
    done = [&](int pos, const std::optional<std::vector<json>>& l) {
      std::lock_guard<std::mutex> lock(qmu);  // the MPI receiver below writes here too
      by_position[pos] = l;
      progress.box_done(reached(pos));
    };
  } else {
    emit = [&](const json& r) { post(1, r.dump()); };
    done = [&](int pos, const std::optional<std::vector<json>>& l) {
      post(2, json{{"pos", pos}, {"leaves", l ? json(*l) : json(nullptr)}}.dump());
    };
  }
  std::exception_ptr failure;
  std::thread work([&] {
    try {
      sw::run_positions(p, plan, mine, jobs, known, emit, done);
    } catch (...) {
      failure = std::current_exception();
    }
    {
      std::lock_guard<std::mutex> lock(qmu);
      workers_done = true;
    }
    qcv.notify_one();
  });
#ifdef PORECERT_MPI
  if (ranks.mpi && ranks.rank != 0) {
    for (;;) {
      std::unique_lock<std::mutex> lock(qmu);
      qcv.wait(lock, [&] { return !queue.empty() || workers_done; });
      if (queue.empty() && workers_done) break;
      auto item = std::move(queue.front());
      queue.pop_front();
      lock.unlock();
      send_text(item.second, item.first == 1 ? kTagRecord : kTagDone);
    }
  } else if (ranks.mpi) {
    const std::size_t remote = static_cast<std::size_t>(m) - mine.size();
    std::size_t got = 0;
    while (got < remote) {
      int flag = 0;
      MPI_Status st;
      MPI_Iprobe(MPI_ANY_SOURCE, MPI_ANY_TAG, MPI_COMM_WORLD, &flag, &st);
      if (!flag) {
        std::this_thread::sleep_for(std::chrono::milliseconds(2));
        continue;
      }
      int n = 0;
      MPI_Get_count(&st, MPI_CHAR, &n);
      std::string s(static_cast<std::size_t>(n), '\0');
      MPI_Recv(s.data(), n, MPI_CHAR, st.MPI_SOURCE, st.MPI_TAG, MPI_COMM_WORLD, MPI_STATUS_IGNORE);
      const json j = json::parse(s);
      if (st.MPI_TAG == kTagRecord) {
        journal->append(j);
      } else {
        std::lock_guard<std::mutex> lock(qmu);  // serialises with the local workers' done()
        const int pos = j["pos"].get<int>();
        if (!j["leaves"].is_null()) by_position[pos] = j["leaves"].get<std::vector<json>>();
        progress.box_done(reached(pos));
        ++got;
      }
    }
  }
#endif
  work.join();
  if (failure) {
    stop_mpi(ranks);
    std::rethrow_exception(failure);
  }
  int rc = 0;
  if (ranks.rank == 0) {
    const json doc = sw::assemble(p, plan, by_position);
    if (!v.json.empty()) certificate::write_atomic(v.json, doc.dump(1) + "\n");
    if (v.json != "-")
      for (const auto& line : sw::summary_lines(doc)) std::printf("%s\n", line.c_str());
    if (!v.json.empty() && v.json != "-") std::printf("  sweep written to %s\n", v.json.c_str());
    journal->remove();
    rc = doc["covered"].get<bool>() ? 0 : 1;
  }
  stop_mpi(ranks);
  return rc;
}

}  // namespace

Action register_sweep(CLI::App& app) {
  auto* sub = app.add_subcommand("sweep", "Certify a branch for every R in a range, box by box (docs/sweep.md)");
  auto v = std::make_shared<SweepOptions>();
  sub->add_option("--R", v->R, "Range of the wall Reynolds number LO:HI (decimals)")->required();
  sub->add_option("--branch", v->branch, "Branch: I (default), II or III");
  sub->add_option("--json", v->json, "Write the sweep result (JSON) to PATH, or - for stdout");
  sub->add_option("--jobs", v->jobs, "Threads (default: the number of cores)");
  sub->add_flag("--resume", v->resume, "Continue the interrupted sweep recorded in the journal");
  sub->add_option("--journal", v->journal, "Journal file (default: JSON path + .journal, or porecert-sweep.journal)");
  sub->add_option("--width", v->width, "Width of the initial boxes, or auto (default: 0.25, and 1 for type I boxes of Berman's problem at R >= 1; docs/sweep.md S2)");
  sub->add_option("--min-width", v->min_width,
                  "A box narrower than this that fails is reported as a gap (default 1e-5)");
  sub->add_flag("--stop-at-gap", v->stop_at_gap, "Stop at the first gap (always on for II and III)");
  add_model_options(sub, v->mo);
  return [v] { return run_sweep(*v); };
}

}  // namespace porecert::cli
