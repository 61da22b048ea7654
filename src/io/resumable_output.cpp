#include "bandstack/io/resumable_output.hpp"

#include <cerrno>
#include <cstdio>
#include <cstring>
#include <fstream>
#include <sstream>

#include <fcntl.h>
#include <sys/stat.h>
#include <unistd.h>

#include <netcdf.h>

#include "bandstack/core/error.hpp"

namespace bandstack::io {

namespace {

std::filesystem::path sibling(const std::filesystem::path& final_path, const char* suffix) {
  std::string name = ".";
  name.append(final_path.filename().string()).append(suffix);
  return final_path.parent_path() / name;
}

void fsync_path(const std::filesystem::path& path, const std::filesystem::path& reported) {
  const int fd = ::open(path.c_str(), O_RDONLY);
  if (fd < 0 || ::fsync(fd) != 0) {
    if (fd >= 0) ::close(fd);
    throw FileError(reported.string(), std::string("cannot flush to disk: ") + std::strerror(errno));
  }
  ::close(fd);
}

constexpr const char* header = "bandstack checkpoint 1";

} // namespace

std::filesystem::path working_path(const std::filesystem::path& final_path) { return sibling(final_path, ".partial"); }
std::filesystem::path checkpoint_path(const std::filesystem::path& final_path) { return sibling(final_path, ".checkpoint"); }

std::optional<Checkpoint> read_checkpoint(const std::filesystem::path& path) {
  std::ifstream in(path);
  if (!in) return std::nullopt;
  std::string line;
  if (!std::getline(in, line) || line != header) return std::nullopt;
  Checkpoint c;
  bool hash = false, chunk = false, total = false, written = false;
  while (std::getline(in, line)) {
    std::istringstream words(line);
    std::string key;
    words >> key;
    if (key == "run_hash") hash = static_cast<bool>(words >> c.run_hash);
    else if (key == "chunk_columns") chunk = static_cast<bool>(words >> c.chunk_columns);
    else if (key == "columns_total") total = static_cast<bool>(words >> c.columns_total);
    else if (key == "columns_written") written = static_cast<bool>(words >> c.columns_written);
  }
  if (!(hash && chunk && total && written) || c.columns_written > c.columns_total) return std::nullopt;
  return c;
}

void write_checkpoint(const std::filesystem::path& path, const Checkpoint& c) {
  std::filesystem::path temporary = path;
  temporary += ".new";
  {
    std::ofstream out(temporary, std::ios::trunc);
    out << header << "\nrun_hash " << c.run_hash << "\nchunk_columns " << c.chunk_columns << "\ncolumns_total "
        << c.columns_total << "\ncolumns_written " << c.columns_written << "\n";
    out.flush();
    if (!out) throw FileError(path.string(), "cannot write the checkpoint record");
  }
  fsync_path(temporary, path);
  if (std::rename(temporary.c_str(), path.c_str()) != 0)
    throw FileError(path.string(), std::string("cannot replace the checkpoint record: ") + std::strerror(errno));
}

void finish_resumable(const std::filesystem::path& final_path) {
  const std::filesystem::path working = working_path(final_path);
  fsync_path(working, final_path);
  const mode_t mask = ::umask(0);
  ::umask(mask);
  ::chmod(working.c_str(), 0666 & ~mask);
  if (std::rename(working.c_str(), final_path.c_str()) != 0)
    throw FileError(final_path.string(), std::string("cannot move the finished output into place: ") + std::strerror(errno));
  std::error_code ec;
  std::filesystem::remove(checkpoint_path(final_path), ec);
}

void discard_resumable(const std::filesystem::path& final_path) noexcept {
  std::error_code ec;
  std::filesystem::remove(working_path(final_path), ec);
  std::filesystem::remove(checkpoint_path(final_path), ec);
}

std::uint64_t fnv1a(std::string_view text, std::uint64_t seed) noexcept {
  std::uint64_t h = seed;
  for (const char ch : text) {
    h ^= static_cast<unsigned char>(ch);
    h *= 0x100000001b3ULL; // FNV 64-bit prime (draft-eastlake-fnv)
  }
  return h;
}

bool working_file_opens(const std::filesystem::path& final_path) noexcept {
  int id = -1;
  if (nc_open(working_path(final_path).c_str(), NC_WRITE, &id) != NC_NOERR) return false;
  return nc_close(id) == NC_NOERR;
}

} // namespace bandstack::io
