// The fuzzed entry points (see fuzz_entry.hpp).
#include "fuzz_entry.hpp"

#include <fstream>
#include <system_error>

#include <unistd.h>

#include "bandstack/core/error.hpp"
#include "bandstack/io/band_set_file.hpp"
#include "bandstack/io/profile_file.hpp"
#include "bandstack/io/study.hpp"
#include "bandstack/spectral/cross_section_file.hpp"

namespace bandstack::fuzz {

namespace {

namespace fs = std::filesystem;

// A scratch folder private to this process, removed at exit; the netCDF readers need a real file.
class Scratch {
public:
  Scratch() : dir_(fs::temp_directory_path() / ("bandstack_fuzz_" + std::to_string(::getpid()))) {
    fs::create_directories(dir_);
  }
  ~Scratch() {
    std::error_code ignored;
    fs::remove_all(dir_, ignored);
  }
  Scratch(const Scratch&) = delete;
  Scratch& operator=(const Scratch&) = delete;

  // Writes the bytes to the scratch file and returns its path.
  fs::path write(const std::uint8_t* data, std::size_t size) const {
    const fs::path path = dir_ / "input.nc";
    std::ofstream out(path, std::ios::binary | std::ios::trunc);
    out.write(reinterpret_cast<const char*>(data), static_cast<std::streamsize>(size));
    return path;
  }

private:
  fs::path dir_;
};

const Scratch& scratch() {
  static const Scratch instance;
  return instance;
}

void read(Target target, const std::uint8_t* data, std::size_t size) {
  switch (target) {
  case Target::study: {
    const std::string_view text(reinterpret_cast<const char*>(data), size);
    (void)io::parse_study(text, "fuzz.toml");
    return;
  }
  case Target::profile_file:
    (void)io::read_profile_file(scratch().write(data, size), io::ProfileVariables{}, io::ProfileDefaults{});
    return;
  case Target::band_set_file:
    (void)io::read_band_set(scratch().write(data, size));
    return;
  case Target::cross_section_file:
    (void)spectral::read_cross_section_file(scratch().write(data, size));
    return;
  }
}

} // namespace

std::string_view target_name(Target target) {
  switch (target) {
  case Target::study: return "study";
  case Target::profile_file: return "profile_file";
  case Target::band_set_file: return "band_set_file";
  case Target::cross_section_file: return "cross_section_file";
  }
  return "unknown";
}

std::string feed(Target target, const std::uint8_t* data, std::size_t size) {
  try {
    read(target, data, size);
  } catch (const InputError& e) {
    return e.what();
  } catch (const FileError& e) {
    return e.what();
  }
  return "";
}

} // namespace bandstack::fuzz
