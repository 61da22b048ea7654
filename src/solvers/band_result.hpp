#pragma once
// Private to solvers: completes a band-resolved result (longwave or shortwave) from its by-band
// fluxes: totals summed over bands in band order, heating rates in total and by band.
#include <cstddef>
#include <span>
#include <string>

#include <fmt/format.h>

#include "bandstack/atmosphere/column.hpp"
#include "bandstack/core/error.hpp"
#include "bandstack/solvers/heating.hpp"

namespace bandstack::solvers::detail {

// out[b * levels + k] = the sum of rows[k * n_g + g] over the g-points g of band b ([first[b],
// first[b + 1])), for every level k. Four partial sums per band keep the adds independent (a band
// of 8 g-points is two rounds instead of eight dependent adds).
inline void band_sums(const double* rows, std::size_t levels, std::size_t n_g, const std::size_t* first,
                      std::size_t n_band, double* out) {
  for (std::size_t k = 0; k < levels; ++k) {
    const double* row = rows + k * n_g;
    for (std::size_t b = 0; b < n_band; ++b) {
      double s0 = 0.0, s1 = 0.0, s2 = 0.0, s3 = 0.0;
      std::size_t g = first[b];
      for (; g + 4 <= first[b + 1]; g += 4) {
        s0 += row[g];
        s1 += row[g + 1];
        s2 += row[g + 2];
        s3 += row[g + 3];
      }
      for (; g < first[b + 1]; ++g) s0 += row[g];
      out[b * levels + k] = (s0 + s1) + (s2 + s3);
    }
  }
}

template <class Result> void finish_band_result(const atmosphere::Column& column, Result& result, const char* item) {
  const std::size_t n = column.layer_count();
  const std::size_t levels = n + 1;
  const std::size_t n_band = result.band_count();
  if (n_band == 0 || result.band_upper_cm1.size() != n_band || result.flux_up_by_band.size() != n_band * levels ||
      result.flux_down_by_band.size() != n_band * levels)
    throw InputError(InputPlace::of(item),
                     fmt::format("band-resolved fluxes need {} bands x {} levels and one upper edge per band", n_band, levels));
  result.flux_up.assign(levels, 0.0);
  result.flux_down.assign(levels, 0.0);
  for (std::size_t b = 0; b < n_band; ++b)
    for (std::size_t k = 0; k < levels; ++k) {
      result.flux_up[k] += result.flux_up_by_band[b * levels + k];
      result.flux_down[k] += result.flux_down_by_band[b * levels + k];
    }
  result.heating_rate_k_day.resize(n);
  heating_rate_k_day(column.pressure_level_pa, result.flux_up, result.flux_down, column.gravity_m_s2,
                     result.heating_rate_k_day);
  result.heating_rate_by_band.resize(n_band * n);
  const std::span<const double> up(result.flux_up_by_band), down(result.flux_down_by_band);
  for (std::size_t b = 0; b < n_band; ++b)
    heating_rate_k_day(column.pressure_level_pa, up.subspan(b * levels, levels), down.subspan(b * levels, levels),
                       column.gravity_m_s2, std::span<double>(result.heating_rate_by_band).subspan(b * n, n));
}

} // namespace bandstack::solvers::detail
