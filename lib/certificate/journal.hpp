// Sweep journal (docs/sweep.md §S5): a JSON-lines file, one header line naming the sweep's
// parameters, then one line per settled box, each written with a single write() and fsync'd.
// A last line without its newline or not valid JSON (a kill mid-write) is discarded and cut off.
#pragma once
#include <mutex>
#include <nlohmann/json.hpp>
#include <string>
#include <vector>

#include "certificate/certificate.hpp"

namespace porecert::certificate {

inline constexpr const char* kJournalFormat = "porecert-sweep-journal";

class Journal {
 public:
  // resume = false: path must not exist; it is created with the header line. resume = true: an
  // existing journal must carry exactly this header (else format_error naming both); its records
  // are returned in *records; a missing or empty journal starts afresh. *note says what was done
  // (e.g. a discarded truncated line). Throws format_error on a malformed complete line.
  Journal(const std::string& path, const nlohmann::json& header, bool resume, std::vector<nlohmann::json>* records,
          std::string* note);
  ~Journal();
  Journal(const Journal&) = delete;
  Journal& operator=(const Journal&) = delete;

  // Appends one record line and fsyncs it. Thread-safe.
  void append(const nlohmann::json& record);
  // Closes and deletes the journal (after the final output is safely written).
  void remove();

 private:
  std::string path_;
  int fd_ = -1;
  std::mutex mu_;
};

}  // namespace porecert::certificate
