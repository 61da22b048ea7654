#include "bandstack/solvers/angular_quadrature.hpp"

#include "bandstack/core/error.hpp"

#include <Eigen/Eigenvalues>
#include <cmath>
#include <string>

namespace bandstack::solvers {

AngularQuadrature gauss_quadrature(int n) {
  if (n < 1 || n > 8) {
    InputPlace place;
    place.item = "angle_count";
    throw InputError(place, "Gauss angular quadrature needs 1 to 8 directions, got " + std::to_string(n));
  }
  // Golub & Welsch (1969, Math. Comp. 23, 221-230): the nodes are the eigenvalues of the Jacobi
  // matrix of the three-term recurrence, the weights the squared first eigenvector components
  // times the total mass (here 1). Recurrence of the monic Jacobi polynomials with alpha = 0,
  // beta = 1 on (-1, 1) (Gautschi 2004, Orthogonal Polynomials, Table 1.1):
  //   a_k = 1 / ((2k+1)(2k+3)),   b_k = k (k+1) / (2k+1)^2;
  // the map mu = (1 + x) / 2 turns weight (1 + x) into weight 2 mu on (0, 1).
  const auto size = static_cast<Eigen::Index>(n);
  Eigen::VectorXd diagonal(size);
  Eigen::VectorXd sub_diagonal(size > 1 ? size - 1 : 0);
  for (Eigen::Index k = 0; k < size; ++k) {
    const double kd = static_cast<double>(k);
    diagonal(k) = 0.5 * (1.0 + 1.0 / ((2.0 * kd + 1.0) * (2.0 * kd + 3.0)));
    if (k + 1 < size) {
      const double k1 = kd + 1.0;
      sub_diagonal(k) = 0.5 * std::sqrt(k1 * (k1 + 1.0)) / (2.0 * k1 + 1.0);
    }
  }
  AngularQuadrature q;
  q.mu.resize(static_cast<std::size_t>(n));
  q.weight.resize(static_cast<std::size_t>(n));
  if (n == 1) {
    q.mu[0] = diagonal(0);
    q.weight[0] = 1.0;
    return q;
  }
  Eigen::SelfAdjointEigenSolver<Eigen::MatrixXd> solver;
  solver.computeFromTridiagonal(diagonal, sub_diagonal, Eigen::ComputeEigenvectors);
  if (solver.info() != Eigen::Success) throw InternalError("Gauss angular quadrature: eigen solve failed");
  double total = 0.0;
  for (Eigen::Index j = 0; j < size; ++j) {
    const double v = solver.eigenvectors()(0, j);
    q.mu[static_cast<std::size_t>(j)] = solver.eigenvalues()(j);
    q.weight[static_cast<std::size_t>(j)] = v * v;
    total += v * v;
  }
  // Eigenvectors are normalised already; dividing by the sum removes the last rounding so an
  // isotropic radiance gives pi I to the last bit.
  for (double& w : q.weight)
    w /= total;
  return q;
}

AngularQuadrature diffusivity_quadrature(double diffusivity) {
  if (!std::isfinite(diffusivity) || diffusivity < 1.0) {
    InputPlace place;
    place.item = "diffusivity";
    throw InputError(place, "diffusivity factor must be finite and >= 1, got " + std::to_string(diffusivity));
  }
  return AngularQuadrature{{1.0 / diffusivity}, {1.0}};
}

void validate(const AngularQuadrature& angles, const char* item) {
  InputPlace place;
  place.item = item;
  if (angles.mu.empty() || angles.mu.size() != angles.weight.size())
    throw InputError(place, "needs at least one direction and as many weights as directions (got " +
                                std::to_string(angles.mu.size()) + " directions, " +
                                std::to_string(angles.weight.size()) + " weights)");
  for (std::size_t j = 0; j < angles.mu.size(); ++j) {
    if (!(angles.mu[j] > 0.0 && angles.mu[j] <= 1.0))
      throw InputError(place, "direction cosine " + std::to_string(j) + " must lie in (0, 1]");
    if (!(angles.weight[j] > 0.0) || !std::isfinite(angles.weight[j]))
      throw InputError(place, "weight " + std::to_string(j) + " must be finite and > 0");
  }
}

} // namespace bandstack::solvers
