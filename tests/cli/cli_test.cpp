// End-to-end runs of the bandstack executable: exit codes, messages and files.
#include <array>
#include <cstdio>
#include <filesystem>
#include <fstream>
#include <string>

#include <gtest/gtest.h>

#include "cli/invoke.hpp"

namespace {

namespace fs = std::filesystem;

using bandstack::testing::invoke;
using bandstack::testing::Outcome;

class Cli : public bandstack::testing::ScratchFolderTest {};

TEST_F(Cli, Version) {
  const Outcome r = invoke("--version");
  EXPECT_EQ(r.exit_code, 0);
  EXPECT_NE(r.output.find("bandstack 0."), std::string::npos) << r.output;
}

TEST_F(Cli, DemoWritesResult) {
  const Outcome r = invoke("demo --out " + dir_.string());
  ASSERT_EQ(r.exit_code, 0) << r.output;
  EXPECT_TRUE(fs::exists(dir_ / "tarrow_sound_demo.nc"));
  EXPECT_TRUE(fs::exists(dir_ / "equilibrium_demo.nc"));
  EXPECT_NE(r.output.find("warm_pool_buoy"), std::string::npos) << r.output;
  EXPECT_NE(r.output.find("doubled_co2"), std::string::npos) << r.output; // the experiments' summary
}

TEST_F(Cli, EquilibriumThatCannotBeReachedIsAnErrorWithoutOutput) {
  // One Newton step and no time marching cannot bring a column to equilibrium.
  const fs::path study = write("s.toml", "[grid]\nlayers = 20\n[equilibrium]\nmax_newton_iterations = 1\n"
                                         "time_marching_fallback = false\n[[columns]]\nname=\"t\"\nprofile=\"tropical\"\n"
                                         "[output]\nfile=\"r.nc\"\n");
  const Outcome r = invoke("run " + study.string() + " --out " + dir_.string());
  EXPECT_EQ(r.exit_code, 2) << r.output;
  EXPECT_NE(r.output.find("columns[0] \"t\""), std::string::npos) << r.output;
  EXPECT_NE(r.output.find("did not converge in 1 iterations"), std::string::npos) << r.output;
  EXPECT_FALSE(fs::exists(dir_ / "r.nc"));
}

TEST_F(Cli, RunStudyWritesIntoOutFolder) {
  const fs::path study = write("s.toml", "[[columns]]\nname=\"t\"\nprofile=\"tropical\"\n[output]\nfile=\"r.nc\"\n");
  const Outcome missing = invoke("run " + study.string() + " --out " + (dir_ / "one").string());
  EXPECT_EQ(missing.exit_code, 2) << missing.output; // the folder does not exist yet
  fs::create_directories(dir_ / "one");
  const Outcome r = invoke("run " + study.string() + " --threads 1 --out " + (dir_ / "one").string());
  ASSERT_EQ(r.exit_code, 0) << r.output;
  EXPECT_TRUE(fs::exists(dir_ / "one" / "r.nc"));
  EXPECT_FALSE(fs::exists(dir_ / "r.nc"));
}

TEST_F(Cli, CheckAcceptsGoodStudy) {
  const fs::path study = write("s.toml", "[[columns]]\nprofile=\"us_standard_1976\"\n");
  const Outcome r = invoke("check " + study.string());
  EXPECT_EQ(r.exit_code, 0) << r.output;
  EXPECT_NE(r.output.find("ok"), std::string::npos);
}

TEST_F(Cli, MalformedStudyGivesExitTwoAndWritesNothing) {
  const fs::path study = write("bad.toml", "[grid]\nlayers = 0\n[[columns]]\nprofile=\"tropical\"\n[output]\nfile=\"never.nc\"\n");
  for (const char* command : {"check ", "run "}) {
    const Outcome r = invoke(command + study.string());
    EXPECT_EQ(r.exit_code, 2) << r.output;
    EXPECT_NE(r.output.find("bad.toml:2:10: 'grid.layers'"), std::string::npos) << r.output;
  }
  EXPECT_FALSE(fs::exists(dir_ / "never.nc"));
}

TEST_F(Cli, MissingStudyFileAndBadOptionsGiveExitTwo) {
  EXPECT_EQ(invoke("run " + (dir_ / "absent.toml").string()).exit_code, 2);
  EXPECT_EQ(invoke("run").exit_code, 2);
  EXPECT_EQ(invoke("frobnicate").exit_code, 2);
  EXPECT_EQ(invoke("demo --threads 0").exit_code, 2);
}

TEST_F(Cli, UnwritableOutputLeavesNoFile) {
  const fs::path study = write("s.toml", "[[columns]]\nprofile=\"tropical\"\n[output]\nfile=\"missing_folder/r.nc\"\n");
  const Outcome r = invoke("run " + study.string());
  EXPECT_EQ(r.exit_code, 2) << r.output;
  EXPECT_NE(r.output.find("does not exist"), std::string::npos) << r.output;
}

} // namespace
