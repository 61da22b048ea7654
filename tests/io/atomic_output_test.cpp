#include "bandstack/io/atomic_output.hpp"

#include <fstream>

#include <gtest/gtest.h>

#include "bandstack/core/error.hpp"

namespace bandstack::io {
namespace {

namespace fs = std::filesystem;

class AtomicOutputTest : public ::testing::Test {
protected:
  void SetUp() override {
    dir_ = fs::temp_directory_path() / ("bandstack_atomic_" + std::to_string(::testing::UnitTest::GetInstance()->random_seed()) +
                                        ::testing::UnitTest::GetInstance()->current_test_info()->name());
    fs::remove_all(dir_);
    fs::create_directories(dir_);
  }
  void TearDown() override { fs::remove_all(dir_); }
  std::size_t file_count() const { return static_cast<std::size_t>(std::distance(fs::directory_iterator(dir_), fs::directory_iterator())); }
  fs::path dir_;
};

TEST_F(AtomicOutputTest, FinalFileAppearsOnlyOnCommit) {
  const fs::path target = dir_ / "result.nc";
  {
    AtomicOutput out(target);
    std::ofstream(out.temporary_path()) << "complete";
    EXPECT_FALSE(fs::exists(target));
    out.commit();
  }
  EXPECT_TRUE(fs::exists(target));
  EXPECT_EQ(file_count(), 1u);
}

TEST_F(AtomicOutputTest, FailureLeavesEarlierFileUntouchedAndNoTemporary) {
  const fs::path target = dir_ / "result.nc";
  std::ofstream(target) << "old complete result";
  try {
    AtomicOutput out(target);
    std::ofstream(out.temporary_path()) << "half writ";
    throw std::runtime_error("simulated failure mid-write");
  } catch (const std::runtime_error&) {
  }
  std::ifstream in(target);
  std::string text;
  std::getline(in, text);
  EXPECT_EQ(text, "old complete result");
  EXPECT_EQ(file_count(), 1u);
}

TEST_F(AtomicOutputTest, MissingFolderIsAFileError) {
  EXPECT_THROW(AtomicOutput(dir_ / "no_such_folder" / "x.nc"), FileError);
}

TEST_F(AtomicOutputTest, FolderAsTargetIsAFileError) {
  fs::create_directories(dir_ / "sub");
  EXPECT_THROW(check_output_folder(dir_ / "sub"), FileError);
}

} // namespace
} // namespace bandstack::io
