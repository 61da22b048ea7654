#pragma once
// One homogeneous layer in the delta-Eddington approximation (Joseph, Wiscombe & Weinman 1976,
// J. Atmos. Sci. 33, 2452): the phase function's forward peak is moved into the unscattered beam,
// then the layer is solved with the Eddington two-stream equations (coefficients of Meador &
// Weaver 1980, J. Atmos. Sci. 37, 630, Table 1). The shortwave column kernel (shortwave.hpp)
// combines such layers by adding; these functions expose the single layer for other solvers and
// for tests.

namespace bandstack::solvers {

// Optical properties after delta scaling.
struct DeltaScaled {
  double optical_depth;            // tau' = (1 - omega f) tau
  double single_scattering_albedo; // omega' = (1 - f) omega / (1 - omega f), in [0, 1]
  double asymmetry;                // g' = (g - f) / (1 - f)
};

// Delta scaling with forward-peak fraction f = g^2 (Joseph et al. 1976) for g > 0. For g <= 0
// there is no forward peak to remove and the properties are returned unchanged (f = 0), because
// f = g^2 would give |g'| > 1 for g < -1/2. The case omega = 1, g = 1 (all light scattered
// straight ahead) gives tau' = 0 and omega' = 1.
// Inputs: tau finite >= 0, omega in [0, 1], g in [-1, 1]; throws InputError otherwise.
[[nodiscard]] DeltaScaled delta_eddington_scaling(double optical_depth, double single_scattering_albedo,
                                                  double asymmetry);

// Reflectance and transmittance of one layer (all dimensionless, per unit incident flux on a
// horizontal surface).
//   reflectance_diffuse, transmittance_diffuse  for diffuse light entering at either face (the
//       layer is symmetric); absorptance_diffuse = 1 - R - T, computed without cancellation so
//       that it is exactly 0 for omega' = 1
//   reflectance_direct            direct beam in, diffuse out at the top
//   transmittance_direct_diffuse  direct beam in, diffuse out at the bottom
//   transmittance_direct          the unscattered beam, exp(-tau'/mu0)
// For weakly scattering layers (omega'(4 - 3g') < 1) the Eddington closure gives a slightly
// negative diffuse reflectance (at most about -0.072, for omega = 0 and a thick layer): a known
// property of the approximation, kept so that absorption and energy stay consistent. Likewise,
// for strong backscattering (g < -2/3, which delta scaling leaves alone) the beam's diffuse
// transmittance can come out slightly negative (about -0.017 at worst, for g = -1).
struct LayerReflectance {
  double reflectance_diffuse;
  double transmittance_diffuse;
  double absorptance_diffuse;
  double reflectance_direct;
  double transmittance_direct_diffuse;
  double transmittance_direct;
};

// The layer of optical depth tau, single-scattering albedo omega and asymmetry factor g (before
// delta scaling, which this function applies) lit by a beam at cosine of solar zenith angle mu0.
// Inputs: tau finite >= 0, omega in [0, 1], g in [-1, 1], mu0 in (0, 1]; throws InputError
// otherwise. Agrees with the printed closed forms to 1e-12 (relative, or absolute below 1e-3) for
// tau from 0 to 1e6 and beyond (results stay finite to tau = 1e300), omega up to and including 1,
// and through the removable singularity k mu0 = 1 of those forms, where the kernel switches to a
// series (tests/solvers/delta_eddington_test.cpp, also against a numerical solution of the
// two-stream equations).
[[nodiscard]] LayerReflectance delta_eddington_layer(double optical_depth, double single_scattering_albedo,
                                                     double asymmetry, double cos_zenith);

} // namespace bandstack::solvers
