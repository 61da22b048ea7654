// The flux variables of a result file (docs/output-file.md): longwave and shortwave profiles,
// per-column summaries, and the band coordinate with by-band variables.
#include <vector>

#include "bandstack/core/error.hpp"
#include "io/netcdf_put.hpp"

namespace bandstack::io::detail {

namespace {

// What the by-band description needs of either result type.
struct BandFields {
  const std::vector<double>* lower;
  const std::vector<double>* upper;
  const std::vector<double>* up;
  const std::vector<double>* down;
  const std::vector<double>* heating;
};

template <class Result> BandFields band_fields(const Result& r) {
  return {&r.band_lower_cm1, &r.band_upper_cm1, &r.flux_up_by_band, &r.flux_down_by_band, &r.heating_rate_by_band};
}

// A by-band profile variable: n_band x length values per column.
void by_band(Table& table, const std::string& name, const std::string& band, const std::string& dim, const Attributes& a,
             std::function<const std::vector<double>&(const R&)> get) {
  const std::size_t n = table.dim_size(band) * table.dim_size(dim);
  table.add(name, {band, dim}, a).get = [get = std::move(get), n, name](const R& r, double* out) {
    const std::vector<double>& v = get(r);
    if (v.size() != n) throw InternalError("by-band length mismatch while writing " + name);
    std::copy(v.begin(), v.end(), out);
  };
}

// A CF coordinate `band_<kind>` (band centre, cm-1) with bounds, and <kind>_{flux_up,flux_down,
// heating_rate}_by_band. All columns must share the bands (checked when writing).
void describe_bands(Table& table, const std::string& kind, const char* kind_words,
                    const std::function<BandFields(const R&)>& fields, const R& sample) {
  const BandFields first = fields(sample);
  const std::size_t n_band = first.lower->size();
  const std::string band_name = "band_" + kind;
  table.add_dim(band_name, n_band);
  table.add_dim("bounds", 2);
  Variable coord;
  coord.name = band_name;
  coord.per_column = false;
  coord.dims = {band_name};
  coord.attributes = {{"units", "cm-1"}, {"long_name", std::string("centre wavenumber of the ") + kind_words + " band"},
                      {"bounds", band_name + "_bounds"}};
  Variable bound;
  bound.name = band_name + "_bounds";
  bound.per_column = false;
  bound.dims = {band_name, "bounds"};
  bound.attributes = {{"units", "cm-1"}, {"long_name", std::string("lower and upper wavenumber of the ") + kind_words + " band"}};
  for (std::size_t b = 0; b < n_band; ++b) {
    coord.values.push_back(0.5 * ((*first.lower)[b] + (*first.upper)[b]));
    bound.values.push_back((*first.lower)[b]);
    bound.values.push_back((*first.upper)[b]);
  }
  table.variables.push_back(std::move(coord));
  table.variables.push_back(std::move(bound));
  const std::string words(kind_words);
  by_band(table, kind + "_flux_up_by_band", band_name, "level", {"W m-2", ("upwelling " + words + " flux in each band").c_str(), nullptr},
          [fields](const R& r) -> const auto& { return *fields(r).up; });
  by_band(table, kind + "_flux_down_by_band", band_name, "level", {"W m-2", ("downwelling " + words + " flux in each band").c_str(), nullptr},
          [fields](const R& r) -> const auto& { return *fields(r).down; });
  by_band(table, kind + "_heating_rate_by_band", band_name, "layer",
          {"K day-1", (words + " radiative heating rate in each band").c_str(), nullptr},
          [fields](const R& r) -> const auto& { return *fields(r).heating; });
}

} // namespace

void describe_longwave(Table& t, const R& sample) {
  t.profile("lw_flux_up", "level", {"W m-2", "upwelling longwave flux", "upwelling_longwave_flux_in_air"},
            [](const R& r) -> const auto& { return r.longwave.flux_up; });
  t.profile("lw_flux_down", "level", {"W m-2", "downwelling longwave flux", "downwelling_longwave_flux_in_air"},
            [](const R& r) -> const auto& { return r.longwave.flux_down; });
  t.profile("lw_heating_rate", "layer",
            {"K day-1", "longwave radiative heating rate", "tendency_of_air_temperature_due_to_longwave_heating"},
            [](const R& r) -> const auto& { return r.longwave.heating_rate_k_day; });
  if (sample.longwave.band_count() > 0)
    describe_bands(t, "lw", "longwave", [](const R& r) { return band_fields(r.longwave); }, sample);
  t.scalar("olr", {"W m-2", "outgoing longwave radiation at the top of the atmosphere", "toa_outgoing_longwave_flux"},
           [](const R& r) { return r.longwave.olr(); });
  t.scalar("surface_lw_flux_down", {"W m-2", "downwelling longwave flux at the surface", "surface_downwelling_longwave_flux_in_air"},
           [](const R& r) { return r.longwave.surface_down(); });
}

void describe_shortwave(Table& t, const R& sample) {
  if (!sample.has_shortwave()) return;
  t.profile("sw_flux_up", "level", {"W m-2", "upwelling shortwave flux", "upwelling_shortwave_flux_in_air"},
            [](const R& r) -> const auto& { return r.shortwave.flux_up; });
  t.profile("sw_flux_down", "level", {"W m-2", "downwelling shortwave flux (direct + diffuse)", "downwelling_shortwave_flux_in_air"},
            [](const R& r) -> const auto& { return r.shortwave.flux_down; });
  t.profile("sw_flux_down_direct", "level", {"W m-2", "downwelling direct-beam shortwave flux on a horizontal surface", nullptr},
            [](const R& r) -> const auto& { return r.shortwave.flux_down_direct; });
  t.profile("sw_flux_down_diffuse", "level", {"W m-2", "downwelling diffuse shortwave flux", nullptr},
            [](const R& r) -> const auto& { return r.shortwave.flux_down_diffuse; });
  t.profile("sw_heating_rate", "layer",
            {"K day-1", "shortwave radiative heating rate", "tendency_of_air_temperature_due_to_shortwave_heating"},
            [](const R& r) -> const auto& { return r.shortwave.heating_rate_k_day; });
  if (sample.shortwave.band_count() > 0)
    describe_bands(t, "sw", "shortwave", [](const R& r) { return band_fields(r.shortwave); }, sample);
  t.scalar("toa_sw_flux_down", {"W m-2", "incoming solar flux at the top of the atmosphere", "toa_incoming_shortwave_flux"},
           [](const R& r) { return r.shortwave.toa_incoming(); });
  t.scalar("toa_sw_flux_up", {"W m-2", "reflected solar flux at the top of the atmosphere", "toa_outgoing_shortwave_flux"},
           [](const R& r) { return r.shortwave.reflected(); });
  t.scalar("absorbed_solar", {"W m-2", "solar flux absorbed by atmosphere and surface", nullptr},
           [](const R& r) { return r.shortwave.absorbed_solar(); });
  t.scalar("surface_sw_flux_down", {"W m-2", "downwelling shortwave flux at the surface", "surface_downwelling_shortwave_flux_in_air"},
           [](const R& r) { return r.shortwave.flux_down.back(); });
  t.scalar("toa_net_flux", {"W m-2", "net downward radiative flux at the top of the atmosphere (absorbed solar - OLR)", nullptr},
           [](const R& r) { return r.shortwave.absorbed_solar() - r.longwave.olr(); });
  t.scalar("cos_solar_zenith", {"1", "cosine of the solar zenith angle used", nullptr},
           [](const R& r) { return r.column.sun.cos_zenith; });
}

} // namespace bandstack::io::detail
