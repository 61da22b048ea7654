#include "bandstack/spectral/band_set.hpp"

#include "bandstack/core/error.hpp"

#include <cmath>
#include <fmt/format.h>
#include <optional>

namespace bandstack::spectral {

namespace {

// Messages name the variables as the band-set file does (docs/band-set-file.md), so an error found
// after reading a file points at what the user sees in it.
[[noreturn]] void fail(const std::string& file, const std::string& variable, const std::string& message) {
  InputPlace place;
  place.file = file;
  place.item = variable;
  throw InputError(place, message);
}

void require_size(const std::string& file, const char* variable, std::size_t size, std::size_t expected,
                  const char* what) {
  if (size != expected) fail(file, variable, fmt::format("has {} values, expected {} ({})", size, expected, what));
}

void require_finite(const std::string& file, const char* variable, const std::vector<double>& v) {
  for (std::size_t i = 0; i < v.size(); ++i)
    if (!std::isfinite(v[i])) fail(file, variable, fmt::format("value {} at index {} is not finite", v[i], i));
}

void require_positive_increasing(const std::string& file, const char* variable, const std::vector<double>& v) {
  if (v.empty()) fail(file, variable, "is empty");
  require_finite(file, variable, v);
  for (std::size_t i = 0; i < v.size(); ++i) {
    if (!(v[i] > 0.0)) fail(file, variable, fmt::format("value {} at index {} must be > 0", v[i], i));
    if (i > 0 && !(v[i] > v[i - 1]))
      fail(file, variable,
           fmt::format("must be strictly increasing: index {} ({}) does not exceed index {} ({})", i, v[i], i - 1,
                       v[i - 1]));
  }
}

} // namespace

void validate(const BandSet& set, const std::string& file) {
  const std::size_t n_band = set.band_count();
  const std::size_t n_g = set.gpoint_count();
  const std::size_t n_p = set.ref_pressure_pa.size();
  const std::size_t n_t = set.ref_temperature_k.size();
  const std::size_t n_pt = set.planck_temperature_k.size();

  if (n_band == 0) fail(file, "band_lower_wavenumber", "the band set has no bands");
  require_size(file, "band_upper_wavenumber", set.band_upper_cm1.size(), n_band, "one per band");
  require_finite(file, "band_lower_wavenumber", set.band_lower_cm1);
  require_finite(file, "band_upper_wavenumber", set.band_upper_cm1);
  for (std::size_t b = 0; b < n_band; ++b) {
    if (!(set.band_lower_cm1[b] >= 0.0))
      fail(file, "band_lower_wavenumber", fmt::format("band {}: {} cm-1 must be >= 0", b, set.band_lower_cm1[b]));
    if (!(set.band_upper_cm1[b] > set.band_lower_cm1[b]))
      fail(file, "band_upper_wavenumber",
           fmt::format("band {}: upper edge {} cm-1 must exceed the lower edge {} cm-1", b, set.band_upper_cm1[b],
                       set.band_lower_cm1[b]));
    if (b > 0 && set.band_lower_cm1[b] != set.band_upper_cm1[b - 1])
      fail(file, "band_lower_wavenumber",
           fmt::format("bands must be contiguous and increasing: band {} starts at {} cm-1, band {} ends at {} cm-1", b,
                       set.band_lower_cm1[b], b - 1, set.band_upper_cm1[b - 1]));
  }

  if (n_g == 0) fail(file, "gpoint_band", "the band set has no g-points");
  require_size(file, "gpoint_weight", set.gpoint_weight.size(), n_g, "one per g-point");
  std::vector<double> weight_sum(n_band, 0.0);
  for (std::size_t g = 0; g < n_g; ++g) {
    const std::size_t b = set.gpoint_band[g];
    if (b >= n_band)
      fail(file, "gpoint_band", fmt::format("g-point {}: band index {} is not below the band count {}", g, b, n_band));
    if (g > 0 && b != set.gpoint_band[g - 1] && b != set.gpoint_band[g - 1] + 1)
      fail(file, "gpoint_band",
           fmt::format(
               "g-point {}: band {} follows band {}; the g-points of each band must be contiguous and in band order", g,
               b, set.gpoint_band[g - 1]));
    if (g == 0 && b != 0) fail(file, "gpoint_band", fmt::format("g-point 0 belongs to band {}, not band 0", b));
    const double w = set.gpoint_weight[g];
    if (!(std::isfinite(w) && w > 0.0 && w <= 1.0))
      fail(file, "gpoint_weight", fmt::format("g-point {}: weight {} must be in (0, 1]", g, w));
    weight_sum[b] += w;
  }
  if (set.gpoint_band.back() != n_band - 1)
    fail(file, "gpoint_band",
         fmt::format("band {} has no g-point (the last g-point belongs to band {})", set.gpoint_band.back() + 1,
                     set.gpoint_band.back()));
  for (std::size_t b = 0; b < n_band; ++b)
    if (std::abs(weight_sum[b] - 1.0) > 1e-9)
      fail(file, "gpoint_weight",
           fmt::format("band {}: the weights of its g-points sum to {:.15g}, not 1", b, weight_sum[b]));

  require_positive_increasing(file, "ref_pressure", set.ref_pressure_pa);
  require_positive_increasing(file, "ref_temperature", set.ref_temperature_k);
  require_positive_increasing(file, "planck_temperature", set.planck_temperature_k);

  require_size(file, "absorption_coefficient", set.absorption_coefficient.size(), absorber_count * n_g * n_t * n_p,
               "absorber x gpoint x ref_temperature x ref_pressure");
  for (Absorber a : all_absorbers) {
    for (std::size_t g = 0; g < n_g; ++g)
      for (std::size_t t = 0; t < n_t; ++t)
        for (std::size_t p = 0; p < n_p; ++p) {
          const double k = set.kappa(a, g, t, p);
          const auto where = [&] {
            return fmt::format("{} at g-point {}, ref_temperature {}, ref_pressure {}", absorber_name(a), g, t, p);
          };
          if (!std::isfinite(k))
            fail(file, "absorption_coefficient", fmt::format("{}: value {} is not finite", where(), k));
          if (k < 0.0) fail(file, "absorption_coefficient", fmt::format("{}: value {} is negative", where(), k));
          if (!set.absorber_present[index(a)] && k != 0.0)
            fail(file, "absorption_coefficient",
                 fmt::format("{}: value {} for an absorber the set does not include", where(), k));
        }
  }

  require_size(file, "planck_fraction", set.planck_fraction.size(), n_g * n_pt, "gpoint x planck_temperature");
  for (std::size_t t = 0; t < n_pt; ++t) {
    std::vector<double> sum(n_band, 0.0);
    for (std::size_t g = 0; g < n_g; ++g) {
      const double f = set.planck_fraction[g * n_pt + t];
      if (!(std::isfinite(f) && f >= 0.0 && f <= 1.0))
        fail(file, "planck_fraction",
             fmt::format("g-point {}, planck_temperature {}: value {} must be in [0, 1]", g, t, f));
      sum[set.gpoint_band[g]] += f;
    }
    for (std::size_t b = 0; b < n_band; ++b)
      if (std::abs(sum[b] - 1.0) > 1e-9)
        fail(file, "planck_fraction",
             fmt::format("band {}, planck_temperature {} ({} K): the fractions of its g-points sum to {:.15g}, not 1",
                         b, t, set.planck_temperature_k[t], sum[b]));
  }

  if (!set.solar_weight.empty()) {
    require_size(file, "solar_weight", set.solar_weight.size(), n_g, "one per g-point");
    double total = 0.0;
    for (std::size_t g = 0; g < n_g; ++g) {
      const double w = set.solar_weight[g];
      if (!(std::isfinite(w) && w >= 0.0 && w <= 1.0))
        fail(file, "solar_weight", fmt::format("g-point {}: value {} must be in [0, 1]", g, w));
      total += w;
    }
    if (std::abs(total - 1.0) > 1e-9)
      fail(file, "solar_weight", fmt::format("the solar weights of all g-points sum to {:.15g}, not 1", total));
  }
  if (!set.rayleigh_cross_section_m2_kg.empty()) {
    if (set.solar_weight.empty())
      fail(file, "rayleigh_cross_section", "is given for a set without solar weights (a longwave set)");
    require_size(file, "rayleigh_cross_section", set.rayleigh_cross_section_m2_kg.size(), n_g, "one per g-point");
    for (std::size_t g = 0; g < n_g; ++g) {
      const double r = set.rayleigh_cross_section_m2_kg[g];
      if (!(std::isfinite(r) && r >= 0.0))
        fail(file, "rayleigh_cross_section", fmt::format("g-point {}: value {} must be finite and >= 0", g, r));
    }
  }
}

} // namespace bandstack::spectral
