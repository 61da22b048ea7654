// Interpolation in a cross-section table: bilinear in (T, ln p), then linear in wavenumber.
#include <algorithm>
#include <cmath>

#include <fmt/format.h>

#include "bandstack/core/error.hpp"
#include "bandstack/spectral/cross_section_file.hpp"

namespace bandstack::spectral {

namespace {

// value = (1 - weight) * x[lower] + weight * x[upper] for the interval of x holding v.
struct Bracket {
  std::size_t lower = 0, upper = 0;
  double weight = 0.0;
};

// Linear in transform(x). A single point means no dependence. The caller has checked the range.
template <class Transform>
Bracket bracket(const std::vector<double>& x, double v, Transform transform) {
  if (x.size() == 1) return {};
  std::size_t k = static_cast<std::size_t>(std::upper_bound(x.begin(), x.end(), v) - x.begin());
  k = std::clamp<std::size_t>(k, 1, x.size() - 1) - 1;
  // Exactly 0 at x[k] and exactly 1 at x[k + 1], so table points are reproduced bit for bit.
  const double a = transform(x[k]), b = transform(x[k + 1]);
  return {k, k + 1, (transform(v) - a) / (b - a)};
}

bool outside(const std::vector<double>& x, double v) { return x.size() > 1 && (v < x.front() || v > x.back()); }

} // namespace

CrossSectionAbsorber::CrossSectionAbsorber(const std::filesystem::path& path)
    : table_(read_cross_section_file(path)), name_(path.string()) {}

CrossSectionAbsorber::CrossSectionAbsorber(CrossSectionTable table, std::string name)
    : table_(std::move(table)), name_(std::move(name)) {
  validate(table_, name_);
}

std::string CrossSectionAbsorber::description() const {
  std::string d = "cross-section file " + name_;
  if (!table_.title.empty()) d += ": " + table_.title;
  if (!table_.source.empty()) d += " (source: " + table_.source + ")";
  return d;
}

bool CrossSectionAbsorber::provides(Absorber a) const { return !table_.kappa[index(a)].empty(); }

std::size_t CrossSectionAbsorber::memory_bytes() const noexcept {
  std::size_t n = 0;
  for (const auto& k : table_.kappa) n += k.size() * sizeof(double);
  return n;
}

void CrossSectionAbsorber::absorption(Absorber a, const AbsorberState& state, const WavenumberGrid& grid,
                                      std::span<double> out) const {
  InputPlace place;
  place.file = name_;
  if (out.size() != grid.count)
    throw InputError(place, fmt::format("output has {} values for a grid of {} points", out.size(), grid.count));
  const auto& t = table_.temperature_k;
  const auto& p = table_.pressure_pa;
  const auto& x = table_.wavenumber_cm1;
  if (!std::isfinite(state.temperature_k) || outside(t, state.temperature_k))
    throw InputError(place, fmt::format("temperature {} K is outside the table's range [{}, {}] K (no extrapolation)",
                                        state.temperature_k, t.front(), t.back()));
  if (!(state.pressure_pa > 0.0) || !std::isfinite(state.pressure_pa) || outside(p, state.pressure_pa))
    throw InputError(place, fmt::format("pressure {} Pa is outside the table's range [{}, {}] Pa (no extrapolation)",
                                        state.pressure_pa, p.front(), p.back()));
  if (!(grid.step_cm1 > 0.0) || !std::isfinite(grid.step_cm1) || !std::isfinite(grid.start_cm1))
    throw InputError(place, fmt::format("invalid wavenumber grid (start {} cm-1, step {} cm-1)", grid.start_cm1, grid.step_cm1));
  if (grid.count == 0) return;
  // Grid points may lie outside the file's range by a millionth of its end spacing (rounding of
  // coordinates written by another program); they are clamped to the end point.
  const double low = x.front() - 1e-6 * (x[1] - x[0]);
  const double high = x.back() + 1e-6 * (x.back() - x[x.size() - 2]);
  const double first = grid.at(0), last = grid.at(grid.count - 1);
  if (!(first >= low) || !(last <= high))
    throw InputError(place, fmt::format("requested wavenumbers [{}, {}] cm-1 are not within the file's range [{}, {}] cm-1",
                                        first, last, x.front(), x.back()));
  if (!provides(a)) {
    std::fill(out.begin(), out.end(), 0.0);
    return;
  }

  const Bracket bt = bracket(t, state.temperature_k, [](double v) { return v; });
  const Bracket bp = bracket(p, state.pressure_pa, [](double v) { return std::log(v); });
  const std::size_t n_nu = x.size(), n_p = p.size();
  const double* k = table_.kappa[index(a)].data();
  const double* r00 = k + (bt.lower * n_p + bp.lower) * n_nu;
  const double* r01 = k + (bt.lower * n_p + bp.upper) * n_nu;
  const double* r10 = k + (bt.upper * n_p + bp.lower) * n_nu;
  const double* r11 = k + (bt.upper * n_p + bp.upper) * n_nu;
  const double w00 = (1.0 - bt.weight) * (1.0 - bp.weight), w01 = (1.0 - bt.weight) * bp.weight;
  const double w10 = bt.weight * (1.0 - bp.weight), w11 = bt.weight * bp.weight;

  // The file points that the grid needs, combined in (T, p) first (a loop the compiler vectorises).
  const std::size_t k_begin = std::clamp<std::size_t>(
      static_cast<std::size_t>(std::upper_bound(x.begin(), x.end(), first) - x.begin()), 1, n_nu - 1) - 1;
  const std::size_t k_end = std::clamp<std::size_t>(
      static_cast<std::size_t>(std::lower_bound(x.begin(), x.end(), last) - x.begin()) + 1, k_begin + 2, n_nu);
  std::vector<double> spectrum(k_end - k_begin);
  for (std::size_t i = k_begin; i < k_end; ++i)
    spectrum[i - k_begin] = w00 * r00[i] + w01 * r01[i] + w10 * r10[i] + w11 * r11[i];

  std::size_t j = k_begin; // interval [x[j], x[j + 1]] holding the current grid point
  for (std::size_t i = 0; i < grid.count; ++i) {
    const double nu = std::clamp(grid.at(i), x.front(), x.back());
    while (j + 2 < k_end && x[j + 1] <= nu) ++j;
    const double w = (nu - x[j]) / (x[j + 1] - x[j]);
    out[i] = (1.0 - w) * spectrum[j - k_begin] + w * spectrum[j + 1 - k_begin];
  }
}

} // namespace bandstack::spectral
