#include "grouped_jacobian.hpp"

#include <algorithm>

#include "bandstack/core/error.hpp"

namespace bandstack::climate::detail {

std::size_t jacobian_group_count(std::size_t layer_count, std::size_t half_bandwidth) {
  return std::min(2 * half_bandwidth + 2, layer_count);
}

std::vector<std::size_t> jacobian_group(std::size_t g, std::size_t group_count, std::size_t layer_count) {
  std::vector<std::size_t> layers;
  for (std::size_t j = g; j < layer_count; j += group_count) layers.push_back(j);
  return layers;
}

Eigen::MatrixXd assemble_grouped_jacobian(const std::vector<Eigen::VectorXd>& group_response,
                                          const Eigen::VectorXd& surface_response, std::size_t half_bandwidth,
                                          const std::vector<double>& far_weight) {
  const auto n = surface_response.size() - 1; // layers
  const auto group_count = static_cast<std::size_t>(group_response.size());
  if (n < 1 || group_count < 1 || group_count > static_cast<std::size_t>(n))
    throw InternalError("grouped Jacobian: bad group count");
  for (const Eigen::VectorXd& r : group_response)
    if (r.size() != n + 1) throw InternalError("grouped Jacobian: response of the wrong size");
  Eigen::MatrixXd jacobian = Eigen::MatrixXd::Zero(n + 1, n + 1);
  jacobian.col(n) = surface_response;
  if (!far_weight.empty() && far_weight.size() != static_cast<std::size_t>(n))
    throw InternalError("grouped Jacobian: far-field weights of the wrong size");
  std::vector<double> w = far_weight;
  if (w.empty()) w.assign(static_cast<std::size_t>(n), 1.0);
  std::vector<std::vector<std::size_t>> groups(group_count);
  std::vector<double> group_weight(group_count, 0.0);
  for (std::size_t g = 0; g < group_count; ++g) {
    groups[g] = jacobian_group(g, group_count, static_cast<std::size_t>(n));
    for (std::size_t j : groups[g]) group_weight[g] += w[j];
  }
  const auto band = static_cast<Eigen::Index>(half_bandwidth);
  std::vector<Eigen::Index> nearest(group_count);
  for (Eigen::Index i = 0; i <= n; ++i) {
    // Nearest layer of each group to row i, and the background per layer from the groups with no
    // layer in the band.
    double background = 0.0;
    int far_groups = 0;
    for (std::size_t g = 0; g < group_count; ++g) {
      Eigen::Index best = static_cast<Eigen::Index>(groups[g].front());
      for (std::size_t j : groups[g])
        if (std::abs(static_cast<Eigen::Index>(j) - i) < std::abs(best - i)) best = static_cast<Eigen::Index>(j);
      nearest[g] = best;
      if (std::abs(best - i) > band) {
        background += group_response[g][i] / group_weight[g];
        ++far_groups;
      }
    }
    if (far_groups > 0) background /= far_groups;
    for (std::size_t g = 0; g < group_count; ++g) {
      const double response = group_response[g][i];
      if (group_count == static_cast<std::size_t>(n)) {
        jacobian(i, nearest[g]) = response; // one layer per group: ordinary differences
      } else if (std::abs(nearest[g] - i) > band) {
        for (std::size_t j : groups[g]) jacobian(i, static_cast<Eigen::Index>(j)) = response * w[j] / group_weight[g];
      } else {
        for (std::size_t j : groups[g]) jacobian(i, static_cast<Eigen::Index>(j)) = background * w[j];
        jacobian(i, nearest[g]) =
            response - (group_weight[g] - w[static_cast<std::size_t>(nearest[g])]) * background;
      }
    }
  }
  return jacobian;
}

} // namespace bandstack::climate::detail
