#pragma once
// Private to src/solvers: the passes of the shortwave kernel over all g-points of a column
// (adding.cpp). Arrays are point-fastest ([level or layer] * n + point); inputs are validated by
// the caller (shortwave.cpp).
#include <cstddef>

namespace bandstack::solvers::detail {

struct ShortwaveColumnView {
  std::size_t points;            // n
  std::size_t layers;            // N
  const double* tau;             // N x n, unscaled
  const double* ssa;             // N x n
  const double* asym;            // N x n
  double mu0;
  const double* toa_flux;        // n, normal to the beam
  const double* albedo_direct;   // n
  const double* albedo_diffuse;  // n
  double* flux_up;               // (N+1) x n
  double* flux_down_direct;      // (N+1) x n
  double* flux_down_diffuse;     // (N+1) x n
  double* scratch;               // shortwave_scratch_size(N, n) values
};

// Scratch values shortwave_column needs for N layers and n points (one point has its own layout).
[[nodiscard]] constexpr std::size_t shortwave_scratch_size(std::size_t layers, std::size_t points) noexcept {
  return points == 1 ? 17 * layers + 2 * (layers + 1) : (9 * layers + 2 * (layers + 1) + 8) * points;
}

// Fills all three flux outputs.
void shortwave_column(const ShortwaveColumnView& v);

} // namespace bandstack::solvers::detail
