#include "bandstack/io/atomic_output.hpp"

#include <cerrno>
#include <cstdio>
#include <cstring>
#include <string>

#include <fcntl.h>
#include <sys/stat.h>
#include <stdlib.h>
#include <unistd.h>

#include "bandstack/core/error.hpp"

namespace bandstack::io {

namespace {

std::filesystem::path folder_of(const std::filesystem::path& path) {
  std::filesystem::path folder = path.parent_path();
  return folder.empty() ? std::filesystem::path(".") : folder;
}

} // namespace

void check_output_folder(const std::filesystem::path& path) {
  const std::filesystem::path folder = folder_of(path);
  std::error_code ec;
  if (!std::filesystem::is_directory(folder, ec))
    throw FileError(path.string(), "the output folder '" + folder.string() + "' does not exist");
  if (::access(folder.c_str(), W_OK | X_OK) != 0)
    throw FileError(path.string(), "the output folder '" + folder.string() + "' is not writable");
  if (std::filesystem::is_directory(path, ec))
    throw FileError(path.string(), "the output path is a folder, not a file name");
}

AtomicOutput::AtomicOutput(std::filesystem::path final_path) : final_(std::move(final_path)) {
  check_output_folder(final_);
  std::string name = ".";
  name.append(final_.filename().string()).append(".part-XXXXXX"); // append, not operator+: GCC 12 -Wrestrict false positive
  std::string pattern = (folder_of(final_) / name).string();
  const int fd = ::mkstemp(pattern.data());
  if (fd < 0) throw FileError(final_.string(), std::string("cannot create a temporary file: ") + std::strerror(errno));
  ::close(fd);
  temporary_ = pattern;
}

AtomicOutput::~AtomicOutput() {
  if (!committed_) {
    std::error_code ec;
    std::filesystem::remove(temporary_, ec);
  }
}

void AtomicOutput::commit() {
  // fsync the data before the rename so that a crash cannot leave a renamed but empty file.
  const int fd = ::open(temporary_.c_str(), O_RDONLY);
  if (fd < 0 || ::fsync(fd) != 0) {
    if (fd >= 0) ::close(fd);
    throw FileError(final_.string(), std::string("cannot flush the output to disk: ") + std::strerror(errno));
  }
  ::close(fd);
  // mkstemp creates the file 0600; results are ordinary files readable as the umask allows.
  const mode_t mask = ::umask(0);
  ::umask(mask);
  ::chmod(temporary_.c_str(), 0666 & ~mask);
  if (std::rename(temporary_.c_str(), final_.c_str()) != 0)
    throw FileError(final_.string(), std::string("cannot move the finished output into place: ") + std::strerror(errno));
  committed_ = true;
}

} // namespace bandstack::io
