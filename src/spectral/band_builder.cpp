// k-distributions by spectral mapping (West, Crisp & Chen 1990, JQSRT 43; see also the correlated-k
// method of Goody et al. 1989, JQSRT 42, and Lacis & Oinas 1991, JGR 96; from memory): the fine-grid
// points of a band are grouped by the size of their absorption at one reference state, and each group
// keeps its identity at every other state. Unlike resorting kappa at each (p, T), the groups are sets
// of wavenumbers, so several absorbers overlap exactly as they do on the fine grid within a group, and
// each group has its own Planck fraction.
#include "bandstack/spectral/band_builder.hpp"

#include "bandstack/core/constants.hpp"
#include "bandstack/core/error.hpp"
#include "bandstack/core/version.hpp"
#include "bandstack/spectral/planck.hpp"
#include "bandstack/spectral/rayleigh.hpp"
#include "bandstack/spectral/solar_spectrum.hpp"

#include <algorithm>
#include <cmath>
#include <cstdint>
#include <fmt/format.h>
#include <limits>
#include <map>
#include <numeric>
#include <tbb/blocked_range.h>
#include <tbb/enumerable_thread_specific.h>
#include <tbb/parallel_for.h>

namespace bandstack::spectral {

namespace {

InputPlace recipe_place(const BuildRecipe& recipe, std::string item) {
  InputPlace place;
  place.file = recipe.file;
  place.item = std::move(item);
  return place;
}

void require_increasing(const BuildRecipe& recipe, const std::vector<double>& v, const char* name) {
  if (v.empty()) throw InputError(recipe_place(recipe, name), "is empty");
  for (std::size_t k = 0; k < v.size(); ++k)
    if (!std::isfinite(v[k]) || v[k] <= 0.0 || (k > 0 && !(v[k] > v[k - 1])))
      throw InputError(recipe_place(recipe, name),
                       fmt::format("must be positive, finite and strictly increasing (value {} at index {})", v[k], k));
}

// Where each band and g-point sits on the fine grid.
struct Layout {
  WavenumberGrid grid;
  std::vector<std::size_t> band_first;    // first fine-grid index of each band; band_first[n_band] = grid.count
  std::vector<std::size_t> gpoint_first;  // first g-point of each band; gpoint_first[n_band] = n_g
  std::vector<std::size_t> gpoint_points; // fine-grid points of each g-point
  std::vector<std::uint32_t> gpoint_of;   // g-point of each fine-grid point
};

Layout make_layout(const BuildRecipe& recipe) {
  if (recipe.bands.empty()) throw InputError(recipe_place(recipe, "bands"), "the recipe has no bands");
  Layout l;
  l.grid =
      make_wavenumber_grid(recipe.bands.front().lower_cm1, recipe.bands.back().upper_cm1, recipe.wavenumber_step_cm1);
  const double step = recipe.wavenumber_step_cm1;
  for (std::size_t b = 0; b < recipe.bands.size(); ++b) {
    const BandRecipe& band = recipe.bands[b];
    const double steps = (band.lower_cm1 - l.grid.start_cm1) / step;
    const std::string item = fmt::format("bands[{}]", b);
    if (b > 0 && band.lower_cm1 != recipe.bands[b - 1].upper_cm1)
      throw InputError(recipe_place(recipe, item + ".lower_cm1"), "bands must be contiguous and increasing");
    if (!(band.upper_cm1 > band.lower_cm1))
      throw InputError(recipe_place(recipe, item + ".upper_cm1"), "must exceed lower_cm1");
    if (std::abs(steps - std::round(steps)) > 1e-9 * std::max(1.0, steps))
      throw InputError(recipe_place(recipe, item + ".lower_cm1"),
                       fmt::format("{} cm-1 is not on the {} cm-1 fine grid", band.lower_cm1, step));
    l.band_first.push_back(static_cast<std::size_t>(std::llround(steps)));
  }
  l.band_first.push_back(l.grid.count);

  l.gpoint_of.resize(l.grid.count);
  for (std::size_t b = 0; b < recipe.bands.size(); ++b) {
    const std::vector<double>& g = recipe.bands[b].g_boundaries;
    const std::size_t n = l.band_first[b + 1] - l.band_first[b];
    if (g.size() < 2 || g.front() != 0.0 || g.back() != 1.0)
      throw InputError(recipe_place(recipe, fmt::format("bands[{}].g_boundaries", b)), "must start at 0 and end at 1");
    l.gpoint_first.push_back(l.gpoint_points.size());
    for (std::size_t k = 0; k + 1 < g.size(); ++k) {
      const auto cut_lo = static_cast<std::size_t>(std::llround(g[k] * static_cast<double>(n)));
      const auto cut_hi = static_cast<std::size_t>(std::llround(g[k + 1] * static_cast<double>(n)));
      if (cut_hi <= cut_lo)
        throw InputError(
            recipe_place(recipe, fmt::format("bands[{}].g_boundaries", b)),
            fmt::format("g-point {} ([{}, {}]) gets no fine-grid wavenumber (the band has {} points): use a "
                        "smaller wavenumber_step_cm1 or wider g-points",
                        k, g[k], g[k + 1], n));
      l.gpoint_points.push_back(cut_hi - cut_lo);
    }
  }
  l.gpoint_first.push_back(l.gpoint_points.size());
  if (l.gpoint_points.size() > std::numeric_limits<std::uint32_t>::max()) throw InputError("too many g-points");
  return l;
}

// kappa of `a` at `state` on the whole grid into `out`, checked: InputError for negative or non-finite values.
void evaluate(const AbsorberSource& source, Absorber a, const AbsorberState& state, const WavenumberGrid& grid,
              std::vector<double>& out) {
  out.resize(grid.count);
  source.absorption(a, state, grid, out);
  for (std::size_t i = 0; i < grid.count; ++i)
    if (!(out[i] >= 0.0 && out[i] <= std::numeric_limits<double>::max()))
      throw InputError(InputPlace{source.description(), std::string(absorber_name(a)), {}, {}, {}, {}},
                       fmt::format("absorption coefficient {} at {} cm-1, {} Pa, {} K: must be finite and >= 0", out[i],
                                   grid.at(i), state.pressure_pa, state.temperature_k));
}

bool same_state(const OrderingState& x, const OrderingState& y) {
  return x.pressure_pa == y.pressure_pa && x.temperature_k == y.temperature_k && x.mole_fraction == y.mole_fraction;
}

// Rayleigh cross-section per unit mass of air at every fine-grid point (empty unless the recipe asks
// for Rayleigh scattering).
std::vector<double> rayleigh_on_grid(const BuildRecipe& recipe, const WavenumberGrid& grid) {
  std::vector<double> r;
  if (!recipe.solar || !recipe.solar->rayleigh_scattering) return r;
  if (grid.end_cm1() > rayleigh_max_wavenumber_cm1)
    throw InputError(recipe_place(recipe, "solar.rayleigh_scattering"),
                     fmt::format("Rayleigh scattering is defined up to {} cm-1 (0.2 um); the bands reach {} cm-1",
                                 rayleigh_max_wavenumber_cm1, grid.end_cm1()));
  r.resize(grid.count);
  for (std::size_t i = 0; i < grid.count; ++i)
    r[i] = rayleigh_cross_section_m2_kg(grid.at(i));
  return r;
}

// Sorts each band's points by its ordering key and assigns them to g-points (fills layout.gpoint_of).
// `rayleigh` (per unit mass of air, like the key) is added to the key when not empty.
void assign_gpoints(const BuildRecipe& recipe, const AbsorberSource& source,
                    const std::array<bool, absorber_count>& present, const std::vector<double>& rayleigh, Layout& l) {
  const std::size_t n_band = recipe.bands.size();
  // Bands that share an ordering state share one evaluation of the key over the whole grid.
  std::vector<std::size_t> group(n_band);
  std::vector<std::size_t> representative;
  for (std::size_t b = 0; b < n_band; ++b) {
    std::size_t k = 0;
    while (k < representative.size() && !same_state(recipe.bands[representative[k]].ordering, recipe.bands[b].ordering))
      ++k;
    if (k == representative.size()) representative.push_back(b);
    group[b] = k;
  }
  std::vector<std::vector<double>> keys(representative.size());
  tbb::parallel_for(std::size_t{0}, representative.size(), [&](std::size_t k) {
    const OrderingState& o = recipe.bands[representative[k]].ordering;
    const std::array<double, absorber_count> w = ordering_key_weights(o);
    std::vector<double> kappa;
    std::vector<double>& key = keys[k];
    if (rayleigh.empty())
      key.assign(l.grid.count, 0.0);
    else
      key = rayleigh;
    for (Absorber a : all_absorbers) {
      if (!present[index(a)] || w[index(a)] == 0.0) continue;
      evaluate(source, a, AbsorberState{o.pressure_pa, o.temperature_k}, l.grid, kappa);
      for (std::size_t i = 0; i < l.grid.count; ++i)
        key[i] += w[index(a)] * kappa[i];
    }
  });
  tbb::parallel_for(std::size_t{0}, n_band, [&](std::size_t b) {
    const std::vector<double>& key = keys[group[b]];
    std::vector<std::size_t> order(l.band_first[b + 1] - l.band_first[b]);
    std::iota(order.begin(), order.end(), l.band_first[b]);
    // Stable: equal keys keep increasing wavenumber, so the g-points are the same on every run.
    std::stable_sort(order.begin(), order.end(), [&](std::size_t i, std::size_t j) { return key[i] < key[j]; });
    std::size_t position = 0;
    for (std::size_t g = l.gpoint_first[b]; g < l.gpoint_first[b + 1]; ++g)
      for (std::size_t m = 0; m < l.gpoint_points[g]; ++m)
        l.gpoint_of[order[position++]] = static_cast<std::uint32_t>(g);
  });
}

struct Scratch {
  std::vector<double> values;
  std::vector<double> sums;
  std::vector<double> second;
};

// Every table entry of one (absorber, T, p) from one evaluation of kappa over the whole grid. Each task
// writes only its own slots and sums in fixed grid order, so the result does not depend on threads.
void fill_tables(const BuildRecipe& recipe, const AbsorberSource& source,
                 const std::array<bool, absorber_count>& present, const Layout& l, BandSet& set) {
  const std::size_t n_g = l.gpoint_points.size();
  const std::size_t n_t = set.ref_temperature_k.size();
  const std::size_t n_p = set.ref_pressure_pa.size();
  std::vector<Absorber> absorbers;
  for (Absorber a : all_absorbers)
    if (present[index(a)]) absorbers.push_back(a);
  tbb::enumerable_thread_specific<Scratch> scratch;
  tbb::parallel_for(
      tbb::blocked_range<std::size_t>(0, absorbers.size() * n_t * n_p, 1),
      [&](const tbb::blocked_range<std::size_t>& range) {
        Scratch& s = scratch.local();
        for (std::size_t task = range.begin(); task != range.end(); ++task) {
          const Absorber a = absorbers[task / (n_t * n_p)];
          const std::size_t t = task / n_p % n_t;
          const std::size_t p = task % n_p;
          evaluate(source, a, AbsorberState{set.ref_pressure_pa[p], set.ref_temperature_k[t]}, l.grid, s.values);
          s.sums.assign(n_g, 0.0);
          for (std::size_t i = 0; i < l.grid.count; ++i)
            s.sums[l.gpoint_of[i]] += s.values[i];
          for (std::size_t g = 0; g < n_g; ++g)
            s.sums[g] /= static_cast<double>(l.gpoint_points[g]);
          if (recipe.gpoint_mean == GpointMean::transmission) {
            // Mean transmission of the bin on the path whose mean optical depth is 1: scale-free, so a
            // kappa that scales uniformly with p or T gives a table entry that scales the same way.
            s.second.assign(n_g, 0.0);
            for (std::size_t i = 0; i < l.grid.count; ++i) {
              const double mean = s.sums[l.gpoint_of[i]];
              if (mean > 0.0) s.second[l.gpoint_of[i]] += std::exp(-s.values[i] / mean);
            }
            for (std::size_t g = 0; g < n_g; ++g)
              if (s.sums[g] > 0.0)
                s.sums[g] = -s.sums[g] * std::log(s.second[g] / static_cast<double>(l.gpoint_points[g]));
          }
          for (std::size_t g = 0; g < n_g; ++g)
            set.absorption_coefficient[((index(a) * n_g + g) * n_t + t) * n_p + p] = s.sums[g];
        }
      });
}

// Planck fractions by midpoint sums on the fine grid, the same quadrature a line-resolved calculation
// on that grid uses, so a g-point carries exactly the emission of its wavenumbers.
void fill_planck(const Layout& l, std::size_t n_band, BandSet& set) {
  const std::size_t n_g = l.gpoint_points.size();
  const std::size_t n_pt = set.planck_temperature_k.size();
  tbb::enumerable_thread_specific<std::vector<double>> scratch;
  tbb::parallel_for(std::size_t{0}, n_pt, [&](std::size_t t) {
    std::vector<double>& sums = scratch.local();
    sums.assign(n_g, 0.0);
    const double temperature = set.planck_temperature_k[t];
    for (std::size_t i = 0; i < l.grid.count; ++i)
      sums[l.gpoint_of[i]] += planck_radiance(l.grid.at(i), temperature);
    for (std::size_t b = 0; b < n_band; ++b) {
      double total = 0.0;
      for (std::size_t g = l.gpoint_first[b]; g < l.gpoint_first[b + 1]; ++g)
        total += sums[g];
      for (std::size_t g = l.gpoint_first[b]; g < l.gpoint_first[b + 1]; ++g)
        set.planck_fraction[g * n_pt + t] = total > 0.0 ? sums[g] / total : set.gpoint_weight[g];
    }
  });
}

// A recipe built in code has not been through the parser: check the solar source.
void check_solar(const BuildRecipe& recipe, const SolarRecipe& solar) {
  if (solar.spectrum_file && !solar.brightness_node_cm1.empty())
    throw InputError(recipe_place(recipe, "solar.spectrum_file"),
                     "give spectrum_file or brightness-temperature nodes, not both");
  if (!(solar.temperature_k > 0.0) || !std::isfinite(solar.temperature_k))
    throw InputError(recipe_place(recipe, "solar.temperature_k"), "must be positive and finite");
  const std::vector<double>& x = solar.brightness_node_cm1;
  const std::vector<double>& y = solar.brightness_node_k;
  if (x.size() != y.size() || x.size() == 1)
    throw InputError(recipe_place(recipe, "solar.brightness_temperature_k"),
                     "needs as many values as solar.brightness_temperature_cm1, and at least two (or none)");
  for (std::size_t k = 0; k < x.size(); ++k)
    if (!std::isfinite(x[k]) || !(x[k] >= 0.0) || (k > 0 && !(x[k] > x[k - 1])) || !std::isfinite(y[k]) || !(y[k] > 0.0))
      throw InputError(recipe_place(recipe, "solar.brightness_temperature_cm1"),
                       fmt::format("node {}: wavenumbers must be >= 0 and strictly increasing, temperatures positive "
                                   "(got {} cm-1, {} K)",
                                   k, x[k], y[k]));
}

// The solar spectrum file of a recipe, read and checked to cover the whole fine grid (no
// extrapolation: a spectrum that stops inside the set would silently darken its ends).
SolarSpectrum load_solar_spectrum(const BuildRecipe& recipe, const std::filesystem::path& path, const Layout& l) {
  SolarSpectrum spectrum = read_solar_spectrum_file(path);
  const double lo = l.grid.start_cm1, hi = l.grid.end_cm1();
  if (!spectrum.covers(lo, hi))
    throw InputError(InputPlace{path.string(), "wavenumber", {}, {}, {}, {}},
                     fmt::format("the spectrum covers {}-{} cm-1, but the bands of {} span {}-{} cm-1 ({:.6g}-{:.6g} "
                                 "nm): the solar spectrum must cover the whole set",
                                 spectrum.wavenumber_cm1.front(), spectrum.wavenumber_cm1.back(),
                                 recipe.file.empty() ? std::string("the recipe") : recipe.file, lo, hi, 1e7 / hi,
                                 lo > 0.0 ? 1e7 / lo : std::numeric_limits<double>::infinity()));
  return spectrum;
}

// Solar weights and Rayleigh cross-sections of a shortwave set, by midpoint sums of the solar
// spectrum on the fine grid (B_nu(T_b(nu)), or the file's irradiance when `spectrum` is given), the
// quadrature the rest of the builder uses; the constant step cancels in the normalisation. Sums run
// in grid order in one task, so the result does not depend on threads.
void fill_solar(const SolarRecipe& solar, const SolarSpectrum* spectrum, const Layout& l,
                const std::vector<double>& rayleigh, BandSet& set) {
  const std::size_t n_g = l.gpoint_points.size();
  std::vector<double> energy(n_g, 0.0), scattering(n_g, 0.0);
  for (std::size_t i = 0; i < l.grid.count; ++i) {
    const double nu = l.grid.at(i);
    const double e = spectrum ? spectrum->irradiance(nu) : planck_radiance(nu, solar.brightness_temperature_k(nu));
    energy[l.gpoint_of[i]] += e;
    if (!rayleigh.empty()) scattering[l.gpoint_of[i]] += e * rayleigh[i];
  }
  double total = 0.0;
  for (double e : energy)
    total += e;
  if (!(total > 0.0)) {
    if (spectrum && solar.spectrum_file)
      throw InputError(InputPlace{solar.spectrum_file->string(), "spectral_irradiance", {}, {}, {}, {}},
                       "is zero everywhere in the set's bands");
    throw InputError("the solar spectrum has no energy in the set's bands");
  }
  set.solar_weight.resize(n_g);
  for (std::size_t g = 0; g < n_g; ++g)
    set.solar_weight[g] = energy[g] / total;
  if (rayleigh.empty()) return;
  set.rayleigh_cross_section_m2_kg.resize(n_g);
  for (std::size_t g = 0; g < n_g; ++g)
    set.rayleigh_cross_section_m2_kg[g] = energy[g] > 0.0 ? scattering[g] / energy[g] : 0.0;
}

} // namespace

double SolarRecipe::brightness_temperature_k(double nu_cm1) const noexcept {
  const std::vector<double>& x = brightness_node_cm1;
  const std::vector<double>& y = brightness_node_k;
  if (x.size() < 2 || y.size() != x.size() || !(nu_cm1 >= x.front() && nu_cm1 <= x.back())) return temperature_k;
  const auto j = static_cast<std::size_t>(std::upper_bound(x.begin(), x.end(), nu_cm1) - x.begin());
  const std::size_t k = std::min(std::max<std::size_t>(j, 1), x.size() - 1);
  const double f = (nu_cm1 - x[k - 1]) / (x[k] - x[k - 1]);
  return y[k - 1] + f * (y[k] - y[k - 1]);
}

std::array<double, absorber_count> ordering_key_weights(const OrderingState& state) noexcept {
  std::array<double, absorber_count> w{};
  for (Gas g : all_gases)
    w[index(g)] = state.mole_fraction[index(g)] * gas_molar_mass_kg_mol(g) / constants::molar_mass_dry_air_kg_mol;
  const double x_h2o = state.mole_fraction[index(Gas::h2o)];
  w[index(Absorber::h2o_self_continuum)] = w[index(Absorber::h2o)] * x_h2o * state.pressure_pa;
  return w;
}

BandSet build_band_set(const BuildRecipe& recipe, const AbsorberSource& source) {
  require_increasing(recipe, recipe.ref_pressure_pa, "reference_grid pressures");
  require_increasing(recipe, recipe.ref_temperature_k, "reference_grid temperatures");
  require_increasing(recipe, recipe.planck_temperature_k, "reference_grid Planck temperatures");
  Layout layout = make_layout(recipe);

  BandSet set;
  set.name = recipe.name;
  set.source_description = source.description();
  set.recipe_text = recipe.text;
  set.builder_version = std::string(version());
  set.ref_pressure_pa = recipe.ref_pressure_pa;
  set.ref_temperature_k = recipe.ref_temperature_k;
  set.planck_temperature_k = recipe.planck_temperature_k;
  for (Absorber a : all_absorbers)
    set.absorber_present[index(a)] = source.provides(a);
  for (std::size_t b = 0; b < recipe.bands.size(); ++b) {
    set.band_lower_cm1.push_back(recipe.bands[b].lower_cm1);
    set.band_upper_cm1.push_back(recipe.bands[b].upper_cm1);
    const double n = static_cast<double>(layout.band_first[b + 1] - layout.band_first[b]);
    for (std::size_t g = layout.gpoint_first[b]; g < layout.gpoint_first[b + 1]; ++g) {
      set.gpoint_band.push_back(b);
      set.gpoint_weight.push_back(static_cast<double>(layout.gpoint_points[g]) / n);
    }
  }
  const std::size_t n_g = set.gpoint_count();
  set.absorption_coefficient.assign(absorber_count * n_g * set.ref_temperature_k.size() * set.ref_pressure_pa.size(),
                                    0.0);
  set.planck_fraction.assign(n_g * set.planck_temperature_k.size(), 0.0);

  std::optional<SolarSpectrum> spectrum;
  if (recipe.solar) {
    check_solar(recipe, *recipe.solar);
    if (recipe.solar->spectrum_file) {
      spectrum = load_solar_spectrum(recipe, *recipe.solar->spectrum_file, layout);
      set.source_description += fmt::format("; solar spectrum file {}{}", recipe.solar->spectrum_file->string(),
                                            spectrum->title.empty() ? "" : ": " + spectrum->title);
    }
  }
  const std::vector<double> rayleigh = rayleigh_on_grid(recipe, layout.grid);
  assign_gpoints(recipe, source, set.absorber_present, rayleigh, layout);
  fill_tables(recipe, source, set.absorber_present, layout, set);
  fill_planck(layout, recipe.bands.size(), set);
  if (recipe.solar) fill_solar(*recipe.solar, spectrum ? &*spectrum : nullptr, layout, rayleigh, set);
  validate(set, recipe.file);
  return set;
}

} // namespace bandstack::spectral
