// Grouped finite differences (src/climate/grouped_jacobian.hpp): the assembled Jacobian is exact for
// the matrices its model describes (a band plus a background constant along each row), and each row
// keeps its sum over every group for any matrix (by construction: Curtis, Powell & Reid 1974).
#include "climate/grouped_jacobian.hpp"

#include <cmath>
#include <gtest/gtest.h>

namespace detail = bandstack::climate::detail;

namespace {

// Group responses J p_g (p_g: the indicator of group g over the layers) and the surface column.
std::vector<Eigen::VectorXd> responses(const Eigen::MatrixXd& j, std::size_t group_count) {
  const auto n = static_cast<std::size_t>(j.cols() - 1);
  std::vector<Eigen::VectorXd> r;
  for (std::size_t g = 0; g < group_count; ++g) {
    Eigen::VectorXd p = Eigen::VectorXd::Zero(j.cols());
    for (std::size_t layer : detail::jacobian_group(g, group_count, n)) p[static_cast<Eigen::Index>(layer)] = 1.0;
    r.push_back(j * p);
  }
  return r;
}

// Band of half width b with entries depending on (i, j), plus background c_i off the band.
Eigen::MatrixXd band_plus_background(std::size_t n, std::size_t b) {
  const auto size = static_cast<Eigen::Index>(n + 1);
  Eigen::MatrixXd j(size, size);
  for (Eigen::Index i = 0; i < size; ++i)
    for (Eigen::Index k = 0; k < size; ++k) {
      const double background = 0.01 * (1.0 + 0.1 * static_cast<double>(i));
      j(i, k) = std::abs(i - k) <= static_cast<Eigen::Index>(b) ? -1.0 + 0.3 * static_cast<double>(i - k) +
                                                                     0.01 * static_cast<double>(i)
                                                               : background;
    }
  for (Eigen::Index i = 0; i < size; ++i) j(i, size - 1) = 2.0 + static_cast<double>(i); // surface column
  return j;
}

} // namespace

TEST(GroupedJacobian, GroupsAndCount) {
  EXPECT_EQ(detail::jacobian_group_count(60, 2), 6u);
  EXPECT_EQ(detail::jacobian_group_count(4, 2), 4u);
  EXPECT_EQ(detail::jacobian_group(1, 6, 14), (std::vector<std::size_t>{1, 7, 13}));
}

TEST(GroupedJacobian, ExactForBandPlusRowBackground) {
  for (std::size_t b : {1u, 2u, 3u}) {
    const std::size_t n = 31;
    const Eigen::MatrixXd j = band_plus_background(n, b);
    const Eigen::MatrixXd a =
        detail::assemble_grouped_jacobian(responses(j, detail::jacobian_group_count(n, b)), j.col(j.cols() - 1), b);
    EXPECT_LT((a - j).cwiseAbs().maxCoeff(), 1e-12) << "b = " << b;
  }
}

// With far-field weights w_j the model is a band plus c_i w_j off it: reproduced exactly (by
// construction), and the group sums of any matrix are still kept.
TEST(GroupedJacobian, ExactForBandPlusWeightedBackground) {
  const std::size_t n = 31, b = 2, groups = detail::jacobian_group_count(n, b);
  std::vector<double> w(n);
  for (std::size_t j = 0; j < n; ++j) w[j] = std::exp(0.15 * static_cast<double>(j)); // like sqrt(dp), log grid
  Eigen::MatrixXd j = band_plus_background(n, b);
  for (Eigen::Index i = 0; i < j.rows(); ++i)
    for (Eigen::Index k = 0; k + 1 < j.cols(); ++k)
      if (std::abs(i - k) > static_cast<Eigen::Index>(b)) j(i, k) *= w[static_cast<std::size_t>(k)];
  const Eigen::MatrixXd a = detail::assemble_grouped_jacobian(responses(j, groups), j.col(j.cols() - 1), b, w);
  EXPECT_LT((a - j).cwiseAbs().maxCoeff(), 1e-12);
  // Equal weights cannot describe it.
  const Eigen::MatrixXd equal = detail::assemble_grouped_jacobian(responses(j, groups), j.col(j.cols() - 1), b);
  EXPECT_GT((equal - j).cwiseAbs().maxCoeff(), 1e-3);
  const Eigen::MatrixXd r = Eigen::MatrixXd::Random(j.rows(), j.cols());
  const std::vector<Eigen::VectorXd> rr = responses(r, groups);
  const Eigen::MatrixXd ar = detail::assemble_grouped_jacobian(rr, r.col(r.cols() - 1), b, w);
  for (std::size_t g = 0; g < groups; ++g) {
    Eigen::VectorXd sum = Eigen::VectorXd::Zero(r.rows());
    for (std::size_t layer : detail::jacobian_group(g, groups, n)) sum += ar.col(static_cast<Eigen::Index>(layer));
    EXPECT_LT((sum - rr[g]).cwiseAbs().maxCoeff(), 1e-12) << "group " << g;
  }
}

TEST(GroupedJacobian, RowSumsOverEachGroupKept) {
  const std::size_t n = 25, b = 2, groups = detail::jacobian_group_count(n, b);
  Eigen::MatrixXd j = Eigen::MatrixXd::Random(static_cast<Eigen::Index>(n + 1), static_cast<Eigen::Index>(n + 1));
  const std::vector<Eigen::VectorXd> r = responses(j, groups);
  const Eigen::MatrixXd a = detail::assemble_grouped_jacobian(r, j.col(j.cols() - 1), b);
  for (std::size_t g = 0; g < groups; ++g) {
    Eigen::VectorXd sum = Eigen::VectorXd::Zero(j.rows());
    for (std::size_t layer : detail::jacobian_group(g, groups, n)) sum += a.col(static_cast<Eigen::Index>(layer));
    EXPECT_LT((sum - r[g]).cwiseAbs().maxCoeff(), 1e-12) << "group " << g;
  }
  // With one layer per group the assembly is the ordinary forward-difference Jacobian.
  const Eigen::MatrixXd full = detail::assemble_grouped_jacobian(responses(j, n), j.col(j.cols() - 1), b);
  EXPECT_LT((full - j).cwiseAbs().maxCoeff(), 1e-15);
}
