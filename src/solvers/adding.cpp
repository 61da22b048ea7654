// GCC keeps floating-point selects out of vectorised loops while it assumes floating-point
// operations may trap; bandstack never enables traps, so this file drops that assumption (as
// longwave_many.cpp does).
#if defined(__GNUC__) && !defined(__clang__)
#pragma GCC optimize("no-trapping-math")
#endif

#include "solvers/adding.hpp"

#include "solvers/delta_eddington_kernel.hpp"

namespace bandstack::solvers::detail {

namespace {

// Everything that does not depend on the neighbouring layers, for all cells at once (step 1 of
// delta_eddington_kernel.hpp). The layer solution is split into three loops so that each is short
// enough for the processor to overlap iterations; with the long dependency chains of sqrt, exp and
// division in one loop body, latency would set the pace.
BANDSTACK_VECTOR_CLONES
void prepare_cells(std::size_t count, double inv_mu0, const double* __restrict tau, const double* __restrict ssa,
                   const double* __restrict asym, double* __restrict tau_s, double* __restrict w_s,
                   double* __restrict g_s, double* __restrict k, double* __restrict inv_k, double* __restrict t,
                   double* __restrict t_m1) {
  for (std::size_t m = 0; m < count; ++m) {
    const ScaledCell c = scaled_cell(tau[m], ssa[m], asym[m], inv_mu0);
    tau_s[m] = c.tau;
    w_s[m] = c.w;
    g_s[m] = c.g;
    k[m] = c.k;
    inv_k[m] = c.inv_k;
    t[m] = c.t;
    t_m1[m] = c.t_minus_1;
  }
}

// The direct beam, top down: S_{i+1} = S_i t_i at the levels.
BANDSTACK_VECTOR_CLONES
void beam_through_layer(std::size_t n, const double* __restrict beam_in, const double* __restrict t,
                        double* __restrict beam_out) {
  for (std::size_t q = 0; q < n; ++q) beam_out[q] = beam_in[q] * t[q];
}

// For one layer and every point: step 2, the exponential e^{-k tau}.
BANDSTACK_VECTOR_CLONES
void layer_exponentials(std::size_t n, const double* __restrict tau, const double* __restrict k,
                        const double* __restrict inv_k, double* __restrict e, double* __restrict em1,
                        double* __restrict c) {
  for (std::size_t q = 0; q < n; ++q) {
    const LayerExponential p = layer_exponential(tau[q], k[q], inv_k[q]);
    e[q] = p.e;
    em1[q] = p.e_minus_1;
    c[q] = p.c;
  }
}

// For one layer and every point: step 3, reflectances and transmittances.
BANDSTACK_VECTOR_CLONES
void layer_optics(std::size_t n, double mu0, double inv_mu0, const double* __restrict tau, const double* __restrict w,
                  const double* __restrict g, const double* __restrict k, const double* __restrict t,
                  const double* __restrict t_m1, const double* __restrict e, const double* __restrict em1,
                  const double* __restrict c, double* __restrict r_dif, double* __restrict t_dif,
                  double* __restrict a_dif, double* __restrict r_dir, double* __restrict t_dir) {
  for (std::size_t q = 0; q < n; ++q) {
    const LayerReflectance l =
        eddington_layer(tau[q], w[q], g[q], k[q], mu0, inv_mu0, t[q], t_m1[q], LayerExponential{e[q], em1[q], c[q]});
    r_dif[q] = l.reflectance_diffuse;
    t_dif[q] = l.transmittance_diffuse;
    a_dif[q] = l.absorptance_diffuse;
    r_dir[q] = l.reflectance_direct;
    t_dir[q] = l.transmittance_direct_diffuse;
  }
}

// One layer of the upward adding pass (surface to top). Below the layer's bottom level the
// atmosphere and surface are summarised by their diffuse albedo A (with 1 - A kept separately
// as B, so that 1 - R A never cancels) and by the upward diffuse flux U* they send back from
// the direct beam alone. Adding the layer (R, T diffuse; R_dir, T_dir diffuse; beam S at its top)
// with multiple reflections between layer and below summed as 1/(1 - R A) (the adding method for
// fluxes, e.g. Coakley, Cess & Yurevich 1983, J. Atmos. Sci. 40, 116; Liou 2002, An Introduction
// to Atmospheric Radiation, 2nd ed.; both from memory):
//   A_top  = R + T^2 A / (1 - R A),      1 - A_top = (a (a + 2T) + B (R (a + T) + T^2)) / (1 - R A)
//   U*_top = R_dir S + T (U* + A T_dir S) / (1 - R A)
// with a = 1 - R - T and 1 - R A = (a + T) + R B. Kept for the downward pass: the diffuse flux at
// the layer's bottom is D_bot = (T_dir S + R U* + T D_top) / (1 - R A) = source + factor D_top.
struct AddedLayer {
  double albedo, complement, up, source, factor;
};

BANDSTACK_ALWAYS_INLINE AddedLayer add_layer(double r, double tr, double a, double r_dir, double t_dir, double sun,
                                             double a_bot, double b_bot, double u_bot) noexcept {
  const double inv = 1.0 / ((a + tr) + r * b_bot);
  const double t_dir_sun = t_dir * sun;
  return {r + tr * tr * a_bot * inv, (a * (a + 2.0 * tr) + b_bot * (r * (a + tr) + tr * tr)) * inv,
          r_dir * sun + tr * (u_bot + a_bot * t_dir_sun) * inv, (t_dir_sun + r * u_bot) * inv, tr * inv};
}

BANDSTACK_VECTOR_CLONES
void add_layer_up(std::size_t n, const double* __restrict r_dif, const double* __restrict t_dif,
                  const double* __restrict a_dif, const double* __restrict r_dir, const double* __restrict t_dir,
                  const double* __restrict beam_top, const double* __restrict albedo_bot,
                  const double* __restrict complement_bot, const double* __restrict up_bot,
                  double* __restrict albedo_top, double* __restrict complement_top, double* __restrict up_top,
                  double* __restrict source, double* __restrict factor) {
  for (std::size_t q = 0; q < n; ++q) {
    const AddedLayer x = add_layer(r_dif[q], t_dif[q], a_dif[q], r_dir[q], t_dir[q], beam_top[q], albedo_bot[q],
                                   complement_bot[q], up_bot[q]);
    albedo_top[q] = x.albedo;
    complement_top[q] = x.complement;
    up_top[q] = x.up;
    source[q] = x.source;
    factor[q] = x.factor;
  }
}

// One layer of the downward pass: the diffuse flux at the bottom level, then the upward flux
// there, U = U* + A D.
BANDSTACK_VECTOR_CLONES
void add_layer_down(std::size_t n, const double* __restrict source, const double* __restrict factor,
                    const double* __restrict down_top, const double* __restrict albedo_bot, double* __restrict down_bot,
                    double* __restrict up_bot) {
  for (std::size_t q = 0; q < n; ++q) {
    const double d = source[q] + factor[q] * down_top[q];
    down_bot[q] = d;
    up_bot[q] += albedo_bot[q] * d;
  }
}

// One g-point: the layer solutions do not depend on each other, so steps 1-3 run as single loops
// over all layers (vectorised across layers), then the adding recursions.
void single_point_column(const ShortwaveColumnView& v) {
  const std::size_t layers = v.layers;
  const double mu0 = v.mu0;
  const double inv_mu0 = 1.0 / mu0;
  double* up = v.flux_up;
  double* direct = v.flux_down_direct;
  double* diffuse = v.flux_down_diffuse;
  double* next = v.scratch;
  auto take = [&next](std::size_t count) {
    double* slice = next;
    next += count;
    return slice;
  };
  double* tau = take(layers);
  double* w = take(layers);
  double* g = take(layers);
  double* k = take(layers);
  double* inv_k = take(layers);
  double* t = take(layers);
  double* t_m1 = take(layers);
  double* e = take(layers);
  double* em1 = take(layers);
  double* c = take(layers);
  double* r_dif = take(layers);
  double* t_dif = take(layers);
  double* a_dif = take(layers);
  double* r_dir = take(layers);
  double* t_dir = take(layers);
  double* source = take(layers);
  double* factor = take(layers);
  double* albedo = take(layers + 1);
  double* complement = take(layers + 1);

  prepare_cells(layers, inv_mu0, v.tau, v.ssa, v.asym, tau, w, g, k, inv_k, t, t_m1);
  layer_exponentials(layers, tau, k, inv_k, e, em1, c);
  layer_optics(layers, mu0, inv_mu0, tau, w, g, k, t, t_m1, e, em1, c, r_dif, t_dif, a_dif, r_dir, t_dir);
  direct[0] = mu0 * v.toa_flux[0];
  diffuse[0] = 0.0;
  for (std::size_t i = 0; i < layers; ++i) direct[i + 1] = direct[i] * t[i];
  albedo[layers] = v.albedo_diffuse[0];
  complement[layers] = 1.0 - v.albedo_diffuse[0];
  up[layers] = v.albedo_direct[0] * direct[layers];
  for (std::size_t i = layers; i-- > 0;) {
    const AddedLayer x = add_layer(r_dif[i], t_dif[i], a_dif[i], r_dir[i], t_dir[i], direct[i], albedo[i + 1],
                                   complement[i + 1], up[i + 1]);
    albedo[i] = x.albedo;
    complement[i] = x.complement;
    up[i] = x.up;
    source[i] = x.source;
    factor[i] = x.factor;
  }
  for (std::size_t i = 0; i < layers; ++i) {
    diffuse[i + 1] = source[i] + factor[i] * diffuse[i];
    up[i + 1] += albedo[i + 1] * diffuse[i + 1];
  }
}

} // namespace

void shortwave_column(const ShortwaveColumnView& v) {
  if (v.points == 1) {
    single_point_column(v);
    return;
  }
  const std::size_t n = v.points;
  const std::size_t layers = v.layers;
  const std::size_t cells = layers * n;
  const double inv_mu0 = 1.0 / v.mu0;

  // Scratch layout (shortwave_scratch_size): per cell, per level, then one layer's worth.
  double* next = v.scratch;
  auto take = [&next](std::size_t count) {
    double* slice = next;
    next += count;
    return slice;
  };
  double* tau_s = take(cells);
  double* w_s = take(cells);
  double* g_s = take(cells);
  double* k = take(cells);
  double* inv_k = take(cells);
  double* beam_t = take(cells);
  double* beam_t_m1 = take(cells);
  double* source = take(cells);
  double* factor = take(cells);
  double* albedo = take(cells + n);
  double* complement = take(cells + n);
  double* e = take(n);
  double* em1 = take(n);
  double* c = take(n);
  double* r_dif = take(n);
  double* t_dif = take(n);
  double* a_dif = take(n);
  double* r_dir = take(n);
  double* t_dir = take(n);

  for (std::size_t q = 0; q < n; ++q) {
    v.flux_down_direct[q] = v.mu0 * v.toa_flux[q];
    v.flux_down_diffuse[q] = 0.0;
  }
  prepare_cells(cells, inv_mu0, v.tau, v.ssa, v.asym, tau_s, w_s, g_s, k, inv_k, beam_t, beam_t_m1);
  for (std::size_t i = 0; i < layers; ++i) {
    const std::size_t at = i * n;
    beam_through_layer(n, v.flux_down_direct + at, beam_t + at, v.flux_down_direct + at + n);
  }

  // The surface: Lambertian, albedo_direct for the beam and albedo_diffuse for diffuse light.
  for (std::size_t q = 0; q < n; ++q) {
    albedo[cells + q] = v.albedo_diffuse[q];
    complement[cells + q] = 1.0 - v.albedo_diffuse[q];
    v.flux_up[cells + q] = v.albedo_direct[q] * v.flux_down_direct[cells + q];
  }
  for (std::size_t i = layers; i-- > 0;) {
    const std::size_t at = i * n;
    layer_exponentials(n, tau_s + at, k + at, inv_k + at, e, em1, c);
    layer_optics(n, v.mu0, inv_mu0, tau_s + at, w_s + at, g_s + at, k + at, beam_t + at, beam_t_m1 + at, e, em1, c,
                 r_dif, t_dif, a_dif, r_dir, t_dir);
    add_layer_up(n, r_dif, t_dif, a_dif, r_dir, t_dir, v.flux_down_direct + at, albedo + at + n,
                 complement + at + n, v.flux_up + at + n, albedo + at, complement + at, v.flux_up + at,
                 source + at, factor + at);
  }
  // No diffuse light enters at the top, so the upward flux there is U* already.
  for (std::size_t i = 0; i < layers; ++i) {
    const std::size_t at = i * n;
    add_layer_down(n, source + at, factor + at, v.flux_down_diffuse + at, albedo + at + n,
                   v.flux_down_diffuse + at + n, v.flux_up + at + n);
  }
}

} // namespace bandstack::solvers::detail
