// Replays every kept fuzz input through the fuzzed entry points: the crash inputs of
// fuzz/regressions/<target>/ (each once crashed a reader, see fuzz/README.md) and the seed corpora
// of fuzz/corpus/<target>/. Each must end normally or with an expected InputError or FileError;
// the seeds, being valid files, must be accepted.
#include <fstream>
#include <iterator>
#include <string>
#include <vector>

#include <gtest/gtest.h>

#include "fuzz_entry.hpp"

namespace {

namespace fs = std::filesystem;
using bandstack::fuzz::Target;

std::vector<std::uint8_t> bytes_of(const fs::path& path) {
  std::ifstream in(path, std::ios::binary);
  return {std::istreambuf_iterator<char>(in), std::istreambuf_iterator<char>()};
}

std::vector<fs::path> inputs(const std::string& folder, Target target) {
  std::vector<fs::path> files;
  const fs::path dir = fs::path(BANDSTACK_FUZZ_DIR) / folder / std::string(bandstack::fuzz::target_name(target));
  if (!fs::is_directory(dir)) return files;
  for (const fs::directory_entry& e : fs::directory_iterator(dir))
    if (e.is_regular_file() && e.path().filename().string().front() != '.') files.push_back(e.path());
  return files;
}

class FuzzInputs : public ::testing::TestWithParam<Target> {};

TEST_P(FuzzInputs, CrashInputsAreRejectedCleanly) {
  for (const fs::path& file : inputs("regressions", GetParam())) {
    const std::vector<std::uint8_t> data = bytes_of(file);
    std::string message;
    EXPECT_NO_THROW(message = bandstack::fuzz::feed(GetParam(), data.data(), data.size())) << file;
    RecordProperty(file.filename().string(), message);
  }
}

TEST_P(FuzzInputs, SeedsAreAccepted) {
  const std::vector<fs::path> seeds = inputs("corpus", GetParam());
  EXPECT_FALSE(seeds.empty()) << "no seeds in fuzz/corpus/" << bandstack::fuzz::target_name(GetParam());
  for (const fs::path& file : seeds) {
    const std::vector<std::uint8_t> data = bytes_of(file);
    std::string message = "(threw)";
    EXPECT_NO_THROW(message = bandstack::fuzz::feed(GetParam(), data.data(), data.size())) << file;
    EXPECT_EQ(message, "") << file;
  }
}

INSTANTIATE_TEST_SUITE_P(Fuzz, FuzzInputs,
                         ::testing::Values(Target::study, Target::profile_file, Target::band_set_file,
                                           Target::cross_section_file),
                         [](const ::testing::TestParamInfo<Target>& param) {
                           return std::string(bandstack::fuzz::target_name(param.param));
                         });

} // namespace
