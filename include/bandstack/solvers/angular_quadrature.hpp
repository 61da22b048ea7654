#pragma once
// Angular quadrature for hemispheric fluxes from radiances.
//
// Normalisation (used by every solver): the flux through a horizontal surface from the radiance
// field I(mu) of one hemisphere (mu = cosine of the zenith angle, azimuthally symmetric) is
//     F = 2 pi \int_0^1 I(mu) mu dmu  ~=  pi * sum_j weight[j] * I(mu[j]),
// i.e. `weight` approximates the measure 2 mu dmu on (0, 1), whose total is 1. The weights sum to
// exactly 1, so an isotropic radiance I gives F = pi I with any quadrature.
#include <cstddef>
#include <vector>

namespace bandstack::solvers {

struct AngularQuadrature {
  std::vector<double> mu;     // direction cosines, each in (0, 1]
  std::vector<double> weight; // weights of the measure 2 mu dmu, each > 0, summing to 1
  [[nodiscard]] std::size_t size() const noexcept { return mu.size(); }
};

// Gauss quadrature with `n` nodes (1 <= n <= 8) for the weight function 2 mu on (0, 1)
// (Gauss-Jacobi, alpha = 0, beta = 1, mapped to (0, 1)): exact when I(mu) is a polynomial of
// degree <= 2n - 1 (the rule for moments of x f(x) on (0, 1), cf. Abramowitz & Stegun 1964,
// 25.4.33 and Table 25.8; from memory). n = 1 gives the single direction mu = 2/3; n = 2 gives
// mu = (6 -+ sqrt 6)/10. Nodes are in increasing mu.
// Throws InputError for n outside 1..8.
[[nodiscard]] AngularQuadrature gauss_quadrature(int n);

// One direction mu = 1 / diffusivity with weight 1 (the diffusivity approximation; 1.66 is the
// usual factor, after Elsasser 1942). Exact for isotropic radiance. Throws InputError unless
// diffusivity is finite and >= 1.
[[nodiscard]] AngularQuadrature diffusivity_quadrature(double diffusivity = 1.66);

// Checks that mu and weight have the same nonzero size, every mu in (0, 1], every weight > 0 and
// finite. Throws InputError naming `item` otherwise. The weight sum is not forced to 1.
void validate(const AngularQuadrature& angles, const char* item = "angular_quadrature");

} // namespace bandstack::solvers
