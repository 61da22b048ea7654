#pragma once
// Private to src/solvers: the delta-Eddington layer written without libm calls or branches, so
// that the shortwave kernel's loops over g-points vectorise (as vector_math.hpp does for the
// longwave). Callers validate inputs first. Files that include this header compile with
// "no-trapping-math" (see adding.cpp) so that the selects below stay inside vectorised loops.
//
// The layer is computed in three steps, so that the kernel can run each as its own short loop:
//   1. scaled_cell: delta scaling, the two-stream eigenvalue k and the direct-beam transmission;
//   2. layer_exponential: e^{-k tau};
//   3. eddington_layer: reflectances and transmittances.
// delta_eddington_unchecked chains them for one layer.
#include "bandstack/solvers/delta_eddington.hpp"
#include "solvers/vector_math.hpp"

#include <bit>
#include <cstdint>

// The layer code is long; GCC would not inline it on its own, and a call inside a loop stops
// vectorisation.
#if defined(__GNUC__)
#define BANDSTACK_ALWAYS_INLINE [[gnu::always_inline]] inline
#else
#define BANDSTACK_ALWAYS_INLINE inline
#endif

namespace bandstack::solvers::detail {

// e^z and e^z - 1 from one reduction (vector_math.hpp), each to a few 1e-16 relative; also
// whether the reduction left z alone (|z| <= ln2/2), in which case e^z - 1 = z + z^2 s exactly as
// computed and `s` is returned for callers that need (e^z - 1)/z = 1 + z s without cancellation.
// Below z = -708 e^z is returned as 0 (the reduction clamps there).
struct ExpParts {
  double exp;
  double expm1;
  double s;
  bool reduced; // true when |z| > ln2/2
};

BANDSTACK_ALWAYS_INLINE ExpParts exp_parts(double z) noexcept {
  const Expm1Parts p = expm1_parts(z);
  const double poly = p.r + p.r * (p.r * p.s); // e^r - 1
  const double expm1 = p.scale * poly + (p.scale - 1.0);
  const double exp = z < -708.0 ? 0.0 : p.scale * (1.0 + poly);
  return {exp, expm1, p.s, p.n != 0.0};
}

// sqrt(x) and 1/sqrt(x) for x in [0, 3] without libm: GCC keeps std::sqrt out of vectorised loops
// unless errno handling is off for the whole build (-fno-math-errno; "#pragma GCC optimize" does
// not reach it in GCC 12). Reciprocal square root from the bit-pattern estimate (3.4% error at
// most; Lomont 2003, "Fast inverse square root", from memory), four Newton steps
// y <- y (3/2 - x y^2 / 2) (0.034 -> 2e-3 -> 5e-6 -> 4e-11 -> 3e-21 relative), then one Newton
// step for the root itself. The root matched std::sqrt exactly for 1e6 arguments from 1e-300 to 3
// while this was written. Arguments below 1e-300 give 0 for both.
struct SqrtParts {
  double root;
  double inverse;
};

BANDSTACK_ALWAYS_INLINE SqrtParts vector_sqrt(double x) noexcept {
  const bool positive = x > 1e-300;
  const double xs = positive ? x : 1.0;
  double y = std::bit_cast<double>(std::uint64_t{0x5FE6EB50C7B537A9} - (std::bit_cast<std::uint64_t>(xs) >> 1));
  const double h = 0.5 * xs;
  y = y * (1.5 - h * y * y);
  y = y * (1.5 - h * y * y);
  y = y * (1.5 - h * y * y);
  y = y * (1.5 - h * y * y);
  double r = xs * y;
  r = r + 0.5 * y * (xs - r * r);
  return {positive ? r : 0.0, positive ? y : 0.0};
}

// Optical depths are capped here: beyond 1e100 nothing representable changes (a conservative
// layer's transmittance ~ 1/tau is then below 1e-100), and the cap keeps k tau finite.
constexpr double largest_optical_depth = 1e100;

// Step 1 for one cell: delta scaling (Joseph et al. 1976; f = g^2 for g > 0, none for g <= 0, see
// delta_eddington.hpp), omega' = (1 - f) omega/(1 - omega f), written as
// 1 - (1 - omega)/(1 - omega f) for omega > 1/2 (so that 1 - omega' keeps its relative accuracy
// and omega = 1 stays exactly 1), and g' = g/(1 + g) (= (g - f)/(1 - f), finite at g = 1), one
// division for both; k = sqrt(3 (1 - w)(1 - w g)) of the Eddington
// equations and 1/k; the direct-beam transmission t = e^{-tau'/mu0} and t - 1.
struct ScaledCell {
  double tau, w, g, k, inv_k, t, t_minus_1;
};

BANDSTACK_ALWAYS_INLINE ScaledCell scaled_cell(double tau, double omega, double g, double inv_mu0) noexcept {
  const bool forward = g > 0.0;
  const double f = forward ? g * g : 0.0;
  const double den = 1.0 - omega * f; // 0 only for omega = g = 1
  const double den_safe = den > 0.0 ? den : 1.0;
  const double one_plus_g = forward ? 1.0 + g : 1.0;
  const double inv = 1.0 / (den_safe * one_plus_g);
  const double w = omega > 0.5 ? 1.0 - (1.0 - omega) * one_plus_g * inv : (1.0 - f) * omega * one_plus_g * inv;
  const double gs = forward ? g * den_safe * inv : g;
  const double tau_s = den * tau;
  const SqrtParts k = vector_sqrt(3.0 * (1.0 - w) * (1.0 - w * gs));
  const ExpParts beam = exp_parts(-tau_s * inv_mu0);
  return {tau_s, w, gs, k.root, k.inverse, beam.exp, beam.expm1};
}

// Step 2: e = e^{-k tau}, e - 1 and c = (1 - e)/k (-> tau as k -> 0), for the capped tau.
struct LayerExponential {
  double e, e_minus_1, c;
};

BANDSTACK_ALWAYS_INLINE LayerExponential layer_exponential(double tau, double k, double inv_k) noexcept {
  tau = tau < largest_optical_depth ? tau : largest_optical_depth;
  const double z = -k * tau;
  const ExpParts p = exp_parts(z);
  // Unreduced: (1 - e)/k = tau (e^z - 1)/z = tau (1 + z s) without cancellation; reduced:
  // |k tau| > ln2/2 > 0 and -(e - 1)/k is accurate.
  const double c = p.reduced ? -p.expm1 * inv_k : tau * (1.0 + z * p.s);
  return {p.exp, p.expm1, c};
}

// Step 3: the Eddington layer for delta-scaled (tau, w, g), its k, mu0 and 1/mu0, the direct-beam
// factors t and t - 1 and the layer exponential.
//
// Equations: the two-stream system of Meador & Weaver (1980) eq. (2) with their Eddington
// coefficients (Table 1):
//   g1 = (7 - w(4 + 3g))/4, g2 = -(1 - w(4 - 3g))/4, g3 = (2 - 3 g mu0)/4, g4 = 1 - g3,
//   k = sqrt(g1^2 - g2^2) = sqrt(3 (1 - w)(1 - w g)), a1 = g1 g4 + g2 g3, a2 = g1 g3 + g2 g4.
// Diffuse incidence: R = g2 sinh(k tau)/(k cosh(k tau) + g1 sinh(k tau)) and
// T = k/(k cosh + g1 sinh) (the homogeneous solution). Direct beam: Meador & Weaver eqs. (14) and
// (15) (the closed forms are quoted in tests/solvers/delta_eddington_test.cpp, which evaluates
// them independently). Written as they stand, those forms overflow (e^{k tau}), cancel as
// k -> 0 (conservative scattering) and are 0/0 at k mu0 = 1, so they are rearranged here, with
// e = e^{-k tau}, t = e^{-tau/mu0}, c = (1 - e)/k, s = (1 - e^2)/k = c (1 + e):
//   k cosh + g1 sinh = k D e^{k tau} / 2 with D = (1 + e^2) + g1 s, so R = g2 s / D, T = 2 e / D;
//   the 0/0 at k mu0 = 1 sits in d = (e - t)/(1 - k mu0) = t x (e^y - 1)/y with x = tau/mu0,
//   y = x (1 - k mu0), evaluated by its series for |y| < 0.05;
//   for k >= 1/2 the numerators of R and T_diffuse (after multiplying by e^{-k tau} and
//   splitting off d) are divided by k directly:
//     R_dir  = w [(a2 + k g3) + (a2 - k g3) e^2 - 2 a2 e t - 2 (a2 - k g3) e d] / ((1 + k mu0) k D)
//     T_dif  = w [2 (a1 + k g4) d + (a1 + k g4) t + (a1 - k g4) e^2 t - 2 a1 e] / ((1 + k mu0) k D)
//   for k < 1/2 (where 1 - k mu0 >= 1/2) the factor k is removed analytically, with
//   W = (c - mu0 (1 - t))/(1 - k mu0):
//     R_dir  = w [a2 (k c^2 + 2 e W) + g3 (1 - e^2) + 2 g3 e d] / ((1 + k mu0) D)
//     T_dif  = w [a1 (2 c - t s - 2 W) + g4 (2 d + t (1 - e^2))] / ((1 + k mu0) D)
// Both forms agree with the originals to ~1e-15 (checked in 60-digit arithmetic while writing).
// All divisions of the step share one (they dominate the cost after the exponentials).
BANDSTACK_ALWAYS_INLINE LayerReflectance eddington_layer(double tau, double w, double g, double k, double mu0,
                                                         double inv_mu0, double t, double t_minus_1,
                                                         const LayerExponential& ek) noexcept {
  tau = tau < largest_optical_depth ? tau : largest_optical_depth;
  const double g1 = 0.25 * (7.0 - w * (4.0 + 3.0 * g));
  const double g2 = 0.25 * (w * (4.0 - 3.0 * g) - 1.0);
  const double g3 = 0.25 * (2.0 - 3.0 * g * mu0);
  const double g4 = 1.0 - g3;
  const double a1 = g1 * g4 + g2 * g3;
  const double a2 = g1 * g3 + g2 * g4;

  const double e = ek.e;
  const double c = ek.c;
  const double s = c * (1.0 + e);
  const double one_minus_e2 = -ek.e_minus_1 * (1.0 + e);
  const double den = (1.0 + e * e) + g1 * s;

  const bool small_k = k < 0.5;
  const double kk = small_k ? 1.0 : k;
  const double one_plus = 1.0 + k * mu0;
  const double om = 1.0 - k * mu0;
  const double om_safe = om != 0.0 ? om : 1.0; // om = 0 is only used through the series below
  const double scale = den * one_plus * kk;    // in [1, ~1e100]
  const double inv_all = 1.0 / (scale * om_safe);
  const double q = inv_all * om_safe;          // 1 / ((1 + k mu0) kk D)
  const double inv_om = inv_all * scale;       // 1 / (1 - k mu0)
  const double inv_den = q * one_plus * kk;    // 1 / D

  LayerReflectance out;
  out.reflectance_diffuse = g2 * s * inv_den;
  out.transmittance_diffuse = 2.0 * e * inv_den;
  // 1 - R - T = ((1 - e)^2 + (g1 - g2) s)/D with g1 - g2 = 2 (1 - w): zero for w = 1.
  out.absorptance_diffuse = (ek.e_minus_1 * ek.e_minus_1 + 2.0 * (1.0 - w) * s) * inv_den;
  out.transmittance_direct = t;

  const double x = tau * inv_mu0;
  const double y = x * om;
  // (e^y - 1)/y to y^8/9!: the first omitted term is below 1e-18 for |y| < 0.05.
  const double psi =
      1.0 + y * (1.0 / 2 + y * (1.0 / 6 + y * (1.0 / 24 + y * (1.0 / 120 + y * (1.0 / 720 + y * (1.0 / 5040 +
                                                                     y * (1.0 / 40320 + y * (1.0 / 362880))))))));
  // e - t from the e^z - 1 parts while both are near 1, else directly; with |y| >= 0.05 neither
  // cancels by more than a factor of ~40.
  const double e_minus_t = x < 1.0 ? ek.e_minus_1 - t_minus_1 : e - t;
  const double d = (y < 0.05 && y > -0.05) ? t * x * psi : e_minus_t * inv_om;

  // k < 1/2: the forms with k divided out.
  const double wt = (c + mu0 * t_minus_1) * inv_om;
  const double nr_small = a2 * (k * c * c + 2.0 * e * wt) + g3 * one_minus_e2 + 2.0 * g3 * e * d;
  const double nt_small = a1 * (2.0 * c - t * s - 2.0 * wt) + g4 * (2.0 * d + t * one_minus_e2);
  // k >= 1/2.
  const double e2 = e * e;
  const double nr_large = (a2 + k * g3) + (a2 - k * g3) * e2 - 2.0 * a2 * e * t - 2.0 * (a2 - k * g3) * e * d;
  const double nt_large = 2.0 * (a1 + k * g4) * d + (a1 + k * g4) * t + (a1 - k * g4) * e2 * t - 2.0 * a1 * e;
  const double common = w * q;
  out.reflectance_direct = (small_k ? nr_small : nr_large) * common;
  out.transmittance_direct_diffuse = (small_k ? nt_small : nt_large) * common;
  return out;
}

// The whole layer from unscaled properties.
BANDSTACK_ALWAYS_INLINE LayerReflectance delta_eddington_unchecked(double tau, double omega, double g,
                                                                   double mu0) noexcept {
  const double inv_mu0 = 1.0 / mu0;
  const ScaledCell s = scaled_cell(tau, omega, g, inv_mu0);
  return eddington_layer(s.tau, s.w, s.g, s.k, mu0, inv_mu0, s.t, s.t_minus_1, layer_exponential(s.tau, s.k, s.inv_k));
}

// Delta scaling alone (for delta_eddington_scaling).
BANDSTACK_ALWAYS_INLINE DeltaScaled delta_scale(double tau, double omega, double g) noexcept {
  const ScaledCell s = scaled_cell(tau, omega, g, 1.0);
  return {s.tau, s.w, s.g};
}

} // namespace bandstack::solvers::detail
