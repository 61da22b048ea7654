#include "bandstack/batch/run.hpp"

#include <cstring>

#include <gtest/gtest.h>

namespace bandstack::batch {
namespace {

bool bit_identical(const std::vector<double>& a, const std::vector<double>& b) {
  return a.size() == b.size() && std::memcmp(a.data(), b.data(), a.size() * sizeof(double)) == 0;
}

TEST(Run, ResultsAreBitIdenticalForAnyThreadCount) {
  io::Study study = io::parse_study(io::demo_study_text(), "demo");
  // Many columns so that the work is really split between threads.
  const std::vector<io::ColumnSpec> base = study.columns;
  for (int copy = 0; copy < 8; ++copy)
    for (io::ColumnSpec spec : base) {
      spec.name.append("_").append(std::to_string(copy));
      spec.settings.co2_mole_fraction *= 1.0 + 0.1 * copy;
      study.columns.push_back(spec);
    }
  const auto columns = build_columns(study);
  const auto one = compute_columns(study, columns, 1);
  const auto two = compute_columns(study, columns, 2);
  const auto four = compute_columns(study, columns, 4);
  ASSERT_EQ(one.size(), columns.size());
  for (std::size_t c = 0; c < one.size(); ++c) {
    EXPECT_TRUE(bit_identical(one[c].longwave.flux_up, two[c].longwave.flux_up)) << c;
    EXPECT_TRUE(bit_identical(one[c].longwave.flux_down, four[c].longwave.flux_down)) << c;
    EXPECT_TRUE(bit_identical(one[c].longwave.heating_rate_k_day, four[c].longwave.heating_rate_k_day)) << c;
  }
}

TEST(Run, BadColumnIsNamedInTheError) {
  io::Study study = io::parse_study("[[columns]]\nname = \"cold\"\nprofile = \"tropical\"\n", "s.toml");
  study.columns[0].settings.surface_emissivity = 1.5; // bypasses the parser's own range check
  try {
    (void)build_columns(study);
    FAIL() << "expected an InputError";
  } catch (const InputError& e) {
    EXPECT_NE(std::string(e.what()).find("cold"), std::string::npos) << e.what();
    EXPECT_NE(std::string(e.what()).find("surface_emissivity"), std::string::npos) << e.what();
  }
}

} // namespace
} // namespace bandstack::batch
