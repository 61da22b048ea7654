// run_study streams blocks of columns into the result file: the file must not depend on the block
// size or the thread count, and an unfinished run's working file is resumed or discarded.
#include "bandstack/batch/run.hpp"

#include <filesystem>
#include <fstream>
#include <map>

#include <netcdf.h>
#include <netcdf>

#include <gtest/gtest.h>

#include "bandstack/io/resumable_output.hpp"

namespace bandstack::batch {
namespace {

namespace fs = std::filesystem;

// Two columns crossed with a sweep of 5 values: 10 columns over the axes (column, co2_ppmv).
constexpr const char* study_text = R"toml(
title = "streaming check (invented scenario)"
[grid]
layers = 8
[longwave]
gauss_angles = 1
[[sweeps]]
key = "co2_ppmv"
values = [200, 280, 400, 560, 800]
[[columns]]
name = "warm"
profile = "tropical"
[[columns]]
name = "cold"
profile = "high_latitude_winter"
latitude_deg = 60
day_of_year = 172
[output]
file = "stream.nc"
)toml";

// Every variable's raw bytes by name (doubles, bytes and chars alike).
std::map<std::string, std::vector<char>> variable_bytes(const fs::path& path) {
  netCDF::NcFile file(path.string(), netCDF::NcFile::read);
  std::map<std::string, std::vector<char>> out;
  for (const auto& [name, var] : file.getVars()) {
    std::size_t n = 1;
    for (const netCDF::NcDim& d : var.getDims()) n *= d.getSize();
    std::vector<char> bytes(n * var.getType().getSize());
    EXPECT_EQ(nc_get_var(file.getId(), var.getId(), bytes.data()), NC_NOERR) << name; // raw bytes, any type
    out[name] = std::move(bytes);
  }
  return out;
}

class StreamingRun : public ::testing::Test {
protected:
  void SetUp() override {
    dir_ = fs::temp_directory_path() / ("bandstack_streaming_" + std::to_string(::getpid()));
    fs::remove_all(dir_);
    fs::create_directories(dir_ / "a");
    fs::create_directories(dir_ / "b");
  }
  void TearDown() override { fs::remove_all(dir_); }
  fs::path dir_;
};

TEST_F(StreamingRun, FileIsTheSameForAnyBlockSizeAndThreadCount) {
  const io::Study study = io::parse_study(study_text, "stream.toml");
  RunOptions one;
  one.threads = 1;
  one.chunk_columns = 1000; // one block
  one.output_directory = dir_ / "a";
  RunOptions many = one;
  many.threads = 2;
  many.chunk_columns = 3; // blocks that cut across the sweep axis
  many.output_directory = dir_ / "b";
  const RunOutcome a = run_study(study, one);
  const RunOutcome b = run_study(study, many);
  EXPECT_EQ(a.column_count, 10u);
  EXPECT_EQ(a.summaries.size(), 10u);
  EXPECT_EQ(b.interrupted_by, 0);
  const auto va = variable_bytes(a.output_file);
  const auto vb = variable_bytes(b.output_file);
  ASSERT_EQ(va.size(), vb.size());
  EXPECT_GT(va.size(), 20u);
  for (const auto& [name, bytes] : va) {
    ASSERT_TRUE(vb.count(name)) << name;
    EXPECT_TRUE(bytes == vb.at(name)) << name;
  }
  // Nothing is left next to the result.
  EXPECT_FALSE(fs::exists(io::working_path(b.output_file)));
  EXPECT_FALSE(fs::exists(io::checkpoint_path(b.output_file)));
}

TEST_F(StreamingRun, StaleOrForeignCheckpointStartsAfresh) {
  const io::Study study = io::parse_study(study_text, "stream.toml");
  RunOptions options;
  options.threads = 1;
  options.chunk_columns = 4;
  options.output_directory = dir_ / "a";
  const fs::path final_path = dir_ / "a" / "stream.nc";
  // A record of another study, with a working file that is not netCDF.
  io::write_checkpoint(io::checkpoint_path(final_path), {"0123456789abcdef", 4, 10, 8});
  std::ofstream(io::working_path(final_path)) << "not a netCDF file";
  std::vector<std::string> notes;
  options.note = [&](std::string_view n) { notes.emplace_back(n); };
  const RunOutcome outcome = run_study(study, options);
  EXPECT_EQ(outcome.resumed_from, 0u);
  ASSERT_EQ(notes.size(), 1u);
  EXPECT_NE(notes[0].find("afresh"), std::string::npos) << notes[0];
  EXPECT_TRUE(fs::exists(final_path));
  EXPECT_FALSE(fs::exists(io::checkpoint_path(final_path)));
}

TEST(Checkpoint, RecordRoundTripsAndMalformedRecordsAreIgnored) {
  const fs::path path = fs::temp_directory_path() / ("bandstack_checkpoint_" + std::to_string(::getpid()));
  io::write_checkpoint(path, {"00ff", 256, 1000, 512});
  const auto back = io::read_checkpoint(path);
  ASSERT_TRUE(back.has_value());
  EXPECT_EQ(back->run_hash, "00ff");
  EXPECT_EQ(back->chunk_columns, 256u);
  EXPECT_EQ(back->columns_total, 1000u);
  EXPECT_EQ(back->columns_written, 512u);
  std::ofstream(path) << "bandstack checkpoint 1\nrun_hash 00ff\ncolumns_written 3\n"; // fields missing
  EXPECT_FALSE(io::read_checkpoint(path).has_value());
  fs::remove(path);
  EXPECT_FALSE(io::read_checkpoint(path).has_value());
}

TEST(Checkpoint, Fnv1aMatchesPublishedTestVectors) {
  // FNV-1a 64-bit test vectors for "" and "a" (draft-eastlake-fnv test suite; from memory).
  EXPECT_EQ(io::fnv1a(""), 0xcbf29ce484222325ULL);
  EXPECT_EQ(io::fnv1a("a"), 0xaf63dc4c8601ec8cULL);
}

} // namespace
} // namespace bandstack::batch
