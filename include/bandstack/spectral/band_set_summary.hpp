#pragma once
// A readable summary of a band set, as `bandstack bands info SET.nc` prints it.
#include "bandstack/spectral/band_set.hpp"

#include <string>

namespace bandstack::spectral {

// Several lines of plain text (ending in a newline): name, absorber source, builder version, band
// edges (cm-1) with g-point counts, total g-points, the reference and Planck temperature grids, the
// absorbers with their units, and per band and absorber the range of the absorption coefficient over
// the band's g-points at the table node nearest to 500 hPa and 260 K. An absorber is listed in a band
// only if its optical depth in a nominal column (25 kg m-2 of water, 400 ppmv CO2, 300 Dobson units of
// ozone, 1.8 ppmv CH4, 0.32 ppmv N2O, vapour pressure 1000 Pa) reaches 1e-3 there. Numbers are
// formatted independently of the process locale.
[[nodiscard]] std::string describe_band_set(const BandSet& set);

} // namespace bandstack::spectral
