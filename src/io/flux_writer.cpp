// The flux variables of a result file (docs/output-file.md): longwave and shortwave profiles,
// per-column summaries, and the band coordinate with by-band variables.
#include <vector>

#include "bandstack/core/error.hpp"
#include "io/netcdf_put.hpp"

namespace bandstack::io::detail {

using netCDF::NcDim;
using netCDF::NcFile;
using netCDF::NcVar;
using R = batch::ColumnResult;

namespace {

// What the by-band writer needs of either result type.
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

// A CF coordinate `band_<kind>` (band centre, cm-1) with bounds, and <kind>_{flux_up,flux_down,
// heating_rate}_by_band. All columns must share the bands.
void write_bands(NcFile& file, std::span<const R> results, const std::string& kind, const char* kind_words,
                 const std::function<BandFields(const R&)>& fields, const Lead& lead, const NcDim& level,
                 const NcDim& layer) {
  const BandFields first = fields(results.front());
  const std::size_t n_band = first.lower->size();
  const std::string band_name = "band_" + kind;
  const NcDim band = file.addDim(band_name, n_band);
  NcDim bounds = file.getDim("bounds");
  if (bounds.isNull()) bounds = file.addDim("bounds", 2);
  std::vector<double> centre(n_band), edges(2 * n_band);
  for (std::size_t b = 0; b < n_band; ++b) {
    centre[b] = 0.5 * ((*first.lower)[b] + (*first.upper)[b]);
    edges[2 * b] = (*first.lower)[b];
    edges[2 * b + 1] = (*first.upper)[b];
  }
  NcVar coord = file.addVar(band_name, netCDF::ncDouble, band);
  coord.putAtt("units", "cm-1");
  coord.putAtt("long_name", std::string("centre wavenumber of the ") + kind_words + " band");
  coord.putAtt("bounds", band_name + "_bounds");
  coord.putVar(centre.data());
  NcVar bound = file.addVar(band_name + "_bounds", netCDF::ncDouble, {band, bounds});
  bound.putAtt("units", "cm-1");
  bound.putAtt("long_name", std::string("lower and upper wavenumber of the ") + kind_words + " band");
  bound.putVar(edges.data());

  std::vector<double> up, down, heating;
  for (const R& r : results) {
    const BandFields f = fields(r);
    if (*f.lower != *first.lower || *f.upper != *first.upper)
      throw InternalError("all columns of one result file must use the same " + std::string(kind_words) + " bands");
    BANDSTACK_ASSERT(f.up->size() == n_band * level.getSize() && f.heating->size() == n_band * layer.getSize());
    up.insert(up.end(), f.up->begin(), f.up->end());
    down.insert(down.end(), f.down->begin(), f.down->end());
    heating.insert(heating.end(), f.heating->begin(), f.heating->end());
  }
  const std::string words(kind_words);
  add_variable(file, kind + "_flux_up_by_band", lead.with({band, level}), {"W m-2", ("upwelling " + words + " flux in each band").c_str(), nullptr}, lead.coordinates)
      .putVar(up.data());
  add_variable(file, kind + "_flux_down_by_band", lead.with({band, level}), {"W m-2", ("downwelling " + words + " flux in each band").c_str(), nullptr}, lead.coordinates)
      .putVar(down.data());
  add_variable(file, kind + "_heating_rate_by_band", lead.with({band, layer}),
               {"K day-1", (words + " radiative heating rate in each band").c_str(), nullptr}, lead.coordinates)
      .putVar(heating.data());
}

} // namespace

void write_longwave(NcFile& file, std::span<const R> results, const Lead& lead, const NcDim& level, const NcDim& layer) {
  const std::size_t n_level = level.getSize(), n_layer = layer.getSize();
  const std::vector<NcDim> per_level = lead.with({level}), per_layer = lead.with({layer}), scalar = lead.dims;
  put_profile(add_variable(file, "lw_flux_up", per_level, {"W m-2", "upwelling longwave flux", "upwelling_longwave_flux_in_air"}, lead.coordinates),
              results, n_level, [](const R& r) -> const auto& { return r.longwave.flux_up; });
  put_profile(add_variable(file, "lw_flux_down", per_level, {"W m-2", "downwelling longwave flux", "downwelling_longwave_flux_in_air"}, lead.coordinates),
              results, n_level, [](const R& r) -> const auto& { return r.longwave.flux_down; });
  put_profile(add_variable(file, "lw_heating_rate", per_layer,
                           {"K day-1", "longwave radiative heating rate", "tendency_of_air_temperature_due_to_longwave_heating"}, lead.coordinates),
              results, n_layer, [](const R& r) -> const auto& { return r.longwave.heating_rate_k_day; });
  if (results.front().longwave.band_count() > 0)
    write_bands(file, results, "lw", "longwave", [](const R& r) { return band_fields(r.longwave); }, lead, level, layer);
  put_per_column(add_variable(file, "olr", scalar, {"W m-2", "outgoing longwave radiation at the top of the atmosphere", "toa_outgoing_longwave_flux"}, lead.coordinates),
                 results, [](const R& r) { return r.longwave.olr(); });
  put_per_column(add_variable(file, "surface_lw_flux_down", scalar,
                              {"W m-2", "downwelling longwave flux at the surface", "surface_downwelling_longwave_flux_in_air"}, lead.coordinates),
                 results, [](const R& r) { return r.longwave.surface_down(); });
}

void write_shortwave(NcFile& file, std::span<const R> results, const Lead& lead, const NcDim& level, const NcDim& layer) {
  if (!results.front().has_shortwave()) return;
  for (const R& r : results)
    if (!r.has_shortwave()) throw InternalError("every column of one result file needs shortwave results, or none");
  const std::size_t n_level = level.getSize(), n_layer = layer.getSize();
  const std::vector<NcDim> per_level = lead.with({level}), per_layer = lead.with({layer}), scalar = lead.dims;
  put_profile(add_variable(file, "sw_flux_up", per_level, {"W m-2", "upwelling shortwave flux", "upwelling_shortwave_flux_in_air"}, lead.coordinates),
              results, n_level, [](const R& r) -> const auto& { return r.shortwave.flux_up; });
  put_profile(add_variable(file, "sw_flux_down", per_level, {"W m-2", "downwelling shortwave flux (direct + diffuse)", "downwelling_shortwave_flux_in_air"}, lead.coordinates),
              results, n_level, [](const R& r) -> const auto& { return r.shortwave.flux_down; });
  put_profile(add_variable(file, "sw_flux_down_direct", per_level, {"W m-2", "downwelling direct-beam shortwave flux on a horizontal surface", nullptr}, lead.coordinates),
              results, n_level, [](const R& r) -> const auto& { return r.shortwave.flux_down_direct; });
  put_profile(add_variable(file, "sw_flux_down_diffuse", per_level, {"W m-2", "downwelling diffuse shortwave flux", nullptr}, lead.coordinates),
              results, n_level, [](const R& r) -> const auto& { return r.shortwave.flux_down_diffuse; });
  put_profile(add_variable(file, "sw_heating_rate", per_layer,
                           {"K day-1", "shortwave radiative heating rate", "tendency_of_air_temperature_due_to_shortwave_heating"}, lead.coordinates),
              results, n_layer, [](const R& r) -> const auto& { return r.shortwave.heating_rate_k_day; });
  if (results.front().shortwave.band_count() > 0)
    write_bands(file, results, "sw", "shortwave", [](const R& r) { return band_fields(r.shortwave); }, lead, level, layer);
  put_per_column(add_variable(file, "toa_sw_flux_down", scalar, {"W m-2", "incoming solar flux at the top of the atmosphere", "toa_incoming_shortwave_flux"}, lead.coordinates),
                 results, [](const R& r) { return r.shortwave.toa_incoming(); });
  put_per_column(add_variable(file, "toa_sw_flux_up", scalar, {"W m-2", "reflected solar flux at the top of the atmosphere", "toa_outgoing_shortwave_flux"}, lead.coordinates),
                 results, [](const R& r) { return r.shortwave.reflected(); });
  put_per_column(add_variable(file, "absorbed_solar", scalar, {"W m-2", "solar flux absorbed by atmosphere and surface", nullptr}, lead.coordinates),
                 results, [](const R& r) { return r.shortwave.absorbed_solar(); });
  put_per_column(add_variable(file, "surface_sw_flux_down", scalar,
                              {"W m-2", "downwelling shortwave flux at the surface", "surface_downwelling_shortwave_flux_in_air"}, lead.coordinates),
                 results, [](const R& r) { return r.shortwave.flux_down.back(); });
  put_per_column(add_variable(file, "toa_net_flux", scalar,
                              {"W m-2", "net downward radiative flux at the top of the atmosphere (absorbed solar - OLR)", nullptr}, lead.coordinates),
                 results, [](const R& r) { return r.shortwave.absorbed_solar() - r.longwave.olr(); });
  put_per_column(add_variable(file, "cos_solar_zenith", scalar, {"1", "cosine of the solar zenith angle used", nullptr}, lead.coordinates),
                 results, [](const R& r) { return r.column.sun.cos_zenith; });
}

} // namespace bandstack::io::detail
