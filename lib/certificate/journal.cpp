#include "certificate/journal.hpp"

#include <fcntl.h>
#include <unistd.h>

#include <cerrno>
#include <cstring>
#include <filesystem>
#include <fstream>
#include <sstream>

namespace porecert::certificate {

using nlohmann::json;

namespace {
void write_all(int fd, const std::string& s, const std::string& path) {
  std::size_t done = 0;
  while (done < s.size()) {
    const ssize_t w = ::write(fd, s.data() + done, s.size() - done);
    if (w < 0 && errno == EINTR) continue;
    if (w < 0) throw std::runtime_error("journal '" + path + "': write failed: " + std::strerror(errno));
    done += static_cast<std::size_t>(w);
  }
  if (::fsync(fd) != 0) throw std::runtime_error("journal '" + path + "': fsync failed: " + std::strerror(errno));
}
}  // namespace

Journal::Journal(const std::string& path, const json& header, bool resume, std::vector<json>* records,
                 std::string* note)
    : path_(path) {
  const std::string head_line = header.dump() + "\n";
  std::error_code ec;
  const bool exists = std::filesystem::exists(path, ec);
  if (exists && !resume)
    throw format_error("--journal: '" + path +
                       "' already exists (rule: pass --resume to continue that sweep, or remove the file)");
  std::string text;
  if (exists) {
    std::ifstream in(path, std::ios::binary);
    std::stringstream ss;
    ss << in.rdbuf();
    text = ss.str();
  }
  std::size_t keep = 0;  // bytes of complete, valid lines
  if (!text.empty()) {
    std::size_t pos = 0;
    int line_no = 0;
    while (pos < text.size()) {
      const std::size_t nl = text.find('\n', pos);
      const bool complete = nl != std::string::npos;
      const std::string line = text.substr(pos, complete ? nl - pos : std::string::npos);
      const std::size_t next = complete ? nl + 1 : text.size();
      ++line_no;
      json j;
      bool ok = true;
      try {
        j = json::parse(line);
      } catch (const json::parse_error&) {
        ok = false;
      }
      if (!complete || !ok) {
        if (next < text.size())
          throw format_error("journal '" + path + "': line " + std::to_string(line_no) +
                             " is not valid JSON and is not the last line (rule: only a truncated last line is "
                             "repaired; the journal is damaged)");
        if (note) *note = "discarded a truncated last line (" + std::to_string(line.size()) + " bytes) of the journal";
        break;
      }
      if (line_no == 1) {
        if (j != header) {
          // Name the first field that differs (a model's parameters are inside "model").
          std::string field, theirs, ours;
          for (const json* a : {&header, static_cast<const json*>(&j)})
            for (const auto& [k, v] : a->items())
              if (field.empty() && (!j.contains(k) || !header.contains(k) || j.at(k) != header.at(k))) {
                field = k;
                const std::string none = k == "model" ? "absent (Berman's model)" : "absent";
                theirs = j.contains(k) ? j.at(k).dump() : none;
                ours = header.contains(k) ? header.at(k).dump() : none;
              }
          throw format_error("--resume: journal '" + path + "' belongs to a different sweep (field \"" + field +
                             "\" is " + theirs.substr(0, 200) + " in the journal but " + ours.substr(0, 200) +
                             " for this sweep; rule: resume with the same --R, --branch, --width, --min-width, "
                             "--model and model parameters)");
        }
      } else if (records) {
        records->push_back(std::move(j));
      }
      keep = next;
      pos = next;
    }
  }
  fd_ = ::open(path.c_str(), O_WRONLY | O_CREAT, 0644);
  if (fd_ < 0) throw std::runtime_error("journal '" + path + "': cannot open: " + std::strerror(errno));
  if (::ftruncate(fd_, static_cast<off_t>(keep)) != 0 || ::lseek(fd_, 0, SEEK_END) < 0)
    throw std::runtime_error("journal '" + path + "': cannot cut back to " + std::to_string(keep) + " bytes");
  if (keep == 0) {
    if (records) records->clear();
    write_all(fd_, head_line, path_);
  }
  // Make the file's directory entry durable too.
  const std::string dir = std::filesystem::absolute(path).parent_path().string();
  const int dfd = ::open(dir.c_str(), O_RDONLY | O_DIRECTORY);
  if (dfd >= 0) {
    ::fsync(dfd);
    ::close(dfd);
  }
}

Journal::~Journal() {
  if (fd_ >= 0) ::close(fd_);
}

void Journal::append(const json& record) {
  const std::string line = record.dump() + "\n";
  std::lock_guard<std::mutex> lock(mu_);
  write_all(fd_, line, path_);
}

void Journal::remove() {
  std::lock_guard<std::mutex> lock(mu_);
  if (fd_ >= 0) ::close(fd_);
  fd_ = -1;
  std::error_code ec;
  std::filesystem::remove(path_, ec);
}

}  // namespace porecert::certificate
