// The band builder (spectral mapping) on synthetic absorber sources whose k-distributions are known
// in closed form, so the tables and Planck fractions can be checked against analytic results.
#include "bandstack/core/constants.hpp"
#include "bandstack/core/error.hpp"
#include "bandstack/core/version.hpp"
#include "bandstack/spectral/band_builder.hpp"
#include "bandstack/spectral/planck.hpp"

#include <cmath>
#include <cstring>
#include <functional>
#include <gtest/gtest.h>
#include <limits>
#include <string>
#include <tbb/task_arena.h>

namespace bs = bandstack::spectral;
using bandstack::Gas;
using bandstack::InputError;

namespace {

// kappa_a(nu; p, T) = f_a(nu) * (p / p0) * (T / T0)^m: the pressure scaling of pressure-broadened
// line wings (kappa proportional to p) and a power law in T, applied uniformly across the band.
class SyntheticSource : public bs::AbsorberSource {
public:
  using Shape = std::function<double(double)>;
  SyntheticSource(std::array<Shape, bs::absorber_count> shapes, double m = 0.0) : shapes_(std::move(shapes)), m_(m) {}
  [[nodiscard]] std::string description() const override { return "synthetic test source"; }
  [[nodiscard]] bool provides(bs::Absorber a) const override { return static_cast<bool>(shapes_[index(a)]); }
  void absorption(bs::Absorber a, const bs::AbsorberState& s, const bs::WavenumberGrid& grid,
                  std::span<double> out) const override {
    const double scale = s.pressure_pa / p0 * std::pow(s.temperature_k / t0, m_);
    for (std::size_t i = 0; i < grid.count; ++i)
      out[i] = shapes_[index(a)] ? shapes_[index(a)](grid.at(i)) * scale : 0.0;
  }
  static constexpr double p0 = 50000.0;
  static constexpr double t0 = 250.0;

private:
  std::array<Shape, bs::absorber_count> shapes_;
  double m_;
};

SyntheticSource one_absorber(bs::Absorber a, SyntheticSource::Shape shape, double m = 0.0) {
  std::array<SyntheticSource::Shape, bs::absorber_count> shapes;
  shapes[index(a)] = std::move(shape);
  return SyntheticSource(shapes, m);
}

bs::BuildRecipe recipe_for(std::vector<std::pair<double, double>> bands, std::vector<std::size_t> gpoints,
                           double step_cm1, double ratio) {
  bs::BuildRecipe r;
  r.name = "test_set";
  r.file = "test_recipe.toml";
  r.text = "name = \"test_set\"";
  r.wavenumber_step_cm1 = step_cm1;
  r.ref_pressure_pa = {100.0, 10000.0, 50000.0, 100000.0};
  r.ref_temperature_k = {200.0, 250.0, 300.0};
  r.planck_temperature_k = {150.0, 250.0, 350.0};
  bs::OrderingState o;
  o.pressure_pa = 50000.0;
  o.temperature_k = 250.0;
  o.mole_fraction[index(Gas::h2o)] = 2000e-6;
  o.mole_fraction[index(Gas::co2)] = 400e-6;
  for (std::size_t b = 0; b < bands.size(); ++b)
    r.bands.push_back(
        bs::BandRecipe{bands[b].first, bands[b].second, bs::geometric_g_boundaries(gpoints[b], ratio), o});
  return r;
}

// Lower g edge of each g-point: the cumulative weight of the g-points before it in its band.
std::vector<double> lower_g(const bs::BandSet& set) {
  std::vector<double> g(set.gpoint_count());
  for (std::size_t k = 1; k < g.size(); ++k)
    g[k] = set.gpoint_band[k] == set.gpoint_band[k - 1] ? g[k - 1] + set.gpoint_weight[k - 1] : 0.0;
  return g;
}

bool same_bits(const std::vector<double>& a, const std::vector<double>& b) {
  return a.size() == b.size() && std::memcmp(a.data(), b.data(), a.size() * sizeof(double)) == 0;
}

} // namespace

// Analytic k-distribution of a symmetric exponential band (derivation): kappa(nu) = k0 exp(-|nu - nu0|/l)
// on a band of width W centred on nu0. The share of the band with kappa below k0 exp(-d/l) is the
// share with |nu - nu0| > d, i.e. 1 - 2d/W; so sorted ascending, kappa(g) = k0 exp(-(1 - g) W / (2l)).
// Its mean over [g1, g2] is k0 (2l/W) [exp(-(1-g2) W/(2l)) - exp(-(1-g1) W/(2l))] / (g2 - g1)
// (the same as the descending-g form k0 (2l/W)(e^{-g1' W/2l} - e^{-g2' W/2l})/(g2' - g1') with g' = 1 - g).
TEST(BandBuilder, MeansMatchAnalyticExponentialKDistribution) {
  const double k0 = 100.0, nu0 = 630.0, l = 5.0, lower = 600.0, upper = 660.0, w = upper - lower;
  const auto source =
      one_absorber(bs::Absorber::co2, [=](double nu) { return k0 * std::exp(-std::abs(nu - nu0) / l); });
  const bs::BandSet set = bs::build_band_set(recipe_for({{lower, upper}}, {7}, 0.01, 0.7), source);
  ASSERT_EQ(set.gpoint_count(), 7u);
  const std::vector<double> g1 = lower_g(set);
  for (std::size_t g = 0; g < 7; ++g) {
    const double g2 = g1[g] + set.gpoint_weight[g];
    const double c = w / (2.0 * l);
    const double expected = k0 / c * (std::exp(-(1.0 - g2) * c) - std::exp(-(1.0 - g1[g]) * c)) / (g2 - g1[g]);
    // Tolerance: the fine grid samples kappa at interval midpoints. The midpoint rule errs by about
    // (h/l)^2/24 = 2e-7 relative (h = 0.01 cm-1); where a g boundary falls on a sample, the sample
    // goes whole to one side, an error of about h^2/(4 l dnu) relative for a g-point spanning dnu on
    // each side of nu0: 5e-6 for the narrowest one here (dnu = 1 cm-1).
    EXPECT_NEAR(set.kappa(bs::Absorber::co2, g, 1, 2) / expected, 1.0, 1e-5) << "g-point " << g;
  }
  // The 6000 fine-grid points split as the geometric rule says (each boundary rounded to the nearest point).
  const std::vector<double> rule = bs::geometric_g_boundaries(7, 0.7);
  for (std::size_t g = 0; g < 7; ++g)
    EXPECT_NEAR(set.gpoint_weight[g], rule[g + 1] - rule[g], 1.0 / 6000.0 + 1e-15);
}

TEST(BandBuilder, TablesFollowPressureAndTemperatureScaling) {
  // A source with kappa proportional to p (T/T0)^1.5 at every wavenumber: every table entry, being a
  // mean over a fixed set of wavenumbers, scales the same way (spectral mapping keeps the sets).
  const auto source = one_absorber(
      bs::Absorber::h2o, [](double nu) { return 3.0 * std::exp(-(nu - 300.0) / 40.0); }, 1.5);
  for (const bs::GpointMean mean : {bs::GpointMean::arithmetic, bs::GpointMean::transmission}) {
    bs::BuildRecipe r = recipe_for({{300.0, 400.0}, {400.0, 550.0}}, {5, 6}, 0.05, 0.8);
    r.gpoint_mean = mean;
    const bs::BandSet set = bs::build_band_set(r, source);
    for (std::size_t g = 0; g < set.gpoint_count(); ++g)
      for (std::size_t t = 0; t < 3; ++t)
        for (std::size_t p = 0; p < 4; ++p) {
          const double ratio =
              set.ref_pressure_pa[p] / set.ref_pressure_pa[2] * std::pow(set.ref_temperature_k[t] / 250.0, 1.5);
          EXPECT_NEAR(set.kappa(bs::Absorber::h2o, g, t, p) / set.kappa(bs::Absorber::h2o, g, 1, 2), ratio,
                      1e-12 * ratio);
        }
  }
}

TEST(BandBuilder, PlanckFractionsMatchSubBandIntegrals) {
  // kappa decreasing in nu: ascending key = descending wavenumber, so g-point [g1, g2] holds exactly
  // the sub-band [upper - g2 W, upper - g1 W]. Its Planck fraction must equal the ratio of the
  // Planck integrals over sub-band and band (planck_band_radiance, itself checked against quadrature
  // in planck_test). Midpoint sums on a 0.02 cm-1 grid err by (h c2/T)^2/24, below 1e-9 here.
  const double lower = 500.0, upper = 800.0;
  const auto source = one_absorber(bs::Absorber::co2, [=](double nu) { return 10.0 * std::exp(-(nu - lower) / 50.0); });
  const bs::BandSet set = bs::build_band_set(recipe_for({{lower, upper}}, {6}, 0.02, 0.75), source);
  const std::vector<double> g1 = lower_g(set);
  for (std::size_t t = 0; t < 3; ++t) {
    const double temperature = set.planck_temperature_k[t];
    const double band = bs::planck_band_radiance(lower, upper, temperature);
    double sum = 0.0;
    for (std::size_t g = 0; g < 6; ++g) {
      const double hi = upper - g1[g] * (upper - lower), lo = hi - set.gpoint_weight[g] * (upper - lower);
      const double expected = bs::planck_band_radiance(lo, hi, temperature) / band;
      EXPECT_NEAR(set.planck_fraction[g * 3 + t], expected, 1e-8) << "g-point " << g << " at " << temperature << " K";
      sum += set.planck_fraction[g * 3 + t];
    }
    EXPECT_NEAR(sum, 1.0, 1e-14);
  }
}

TEST(BandBuilder, TiesAreBrokenByWavenumber) {
  // A flat spectrum: every key ties, so g-points are consecutive runs of increasing wavenumber, and
  // the g-point fractions are those of the consecutive sub-bands (as above).
  const auto source = one_absorber(bs::Absorber::co2, [](double) { return 2.5; });
  const bs::BuildRecipe r = recipe_for({{100.0, 400.0}}, {4}, 0.1, 0.6);
  const bs::BandSet set = bs::build_band_set(r, source);
  const std::vector<double> g1 = lower_g(set);
  for (std::size_t g = 0; g < 4; ++g) {
    const double lo = 100.0 + g1[g] * 300.0, hi = lo + set.gpoint_weight[g] * 300.0;
    EXPECT_NEAR(set.planck_fraction[g * 3 + 1],
                bs::planck_band_radiance(lo, hi, 250.0) / bs::planck_band_radiance(100.0, 400.0, 250.0), 1e-8);
    EXPECT_EQ(set.kappa(bs::Absorber::co2, g, 1, 2), 2.5);
  }
  EXPECT_TRUE(same_bits(bs::build_band_set(r, source).planck_fraction, set.planck_fraction));
}

TEST(BandBuilder, BitIdenticalForOneAndTwoThreads) {
  std::array<SyntheticSource::Shape, bs::absorber_count> shapes;
  shapes[index(bs::Absorber::h2o)] = [](double nu) {
    return 50.0 * std::exp(-(nu - 100.0) / 60.0) * (1.0 + 0.3 * std::sin(nu));
  };
  shapes[index(bs::Absorber::co2)] = [](double nu) { return 100.0 * std::exp(-std::abs(nu - 667.5) / 10.2); };
  shapes[index(bs::Absorber::h2o_self_continuum)] = [](double nu) { return 1e-6 * std::exp(-nu / 127.0); };
  const SyntheticSource source(shapes, 0.7);
  for (const bs::GpointMean mean : {bs::GpointMean::arithmetic, bs::GpointMean::transmission}) {
    bs::BuildRecipe r =
        recipe_for({{100.0, 400.0}, {400.0, 600.0}, {600.0, 700.0}, {700.0, 900.0}}, {4, 8, 12, 6}, 0.05, 0.8);
    r.gpoint_mean = mean;
    r.bands[2].ordering.pressure_pa = 10000.0;
    bs::BandSet one, two;
    tbb::task_arena(1).execute([&] { one = bs::build_band_set(r, source); });
    tbb::task_arena(2).execute([&] { two = bs::build_band_set(r, source); });
    EXPECT_TRUE(same_bits(one.absorption_coefficient, two.absorption_coefficient));
    EXPECT_TRUE(same_bits(one.planck_fraction, two.planck_fraction));
    EXPECT_TRUE(same_bits(one.gpoint_weight, two.gpoint_weight));
  }
}

TEST(BandBuilder, OrderingKeyWeighsAbsorbersByMassMixingRatio) {
  // Mass mixing ratio q = x M_gas / M_dry_air (definition); the self-continuum's optical depth per
  // unit air mass is kappa q_h2o e_h2o with e_h2o = x_h2o p (absorber.hpp).
  bs::OrderingState o;
  o.pressure_pa = 30000.0;
  o.mole_fraction[index(Gas::co2)] = 400e-6;
  o.mole_fraction[index(Gas::h2o)] = 1e-3;
  const auto w = bs::ordering_key_weights(o);
  // Molar masses 44.0095 (CO2), 18.01528 (H2O), 28.9644 g/mol (dry air, US Standard Atmosphere 1976).
  EXPECT_NEAR(w[index(bs::Absorber::co2)], 400e-6 * 44.0095 / 28.9644, 1e-15);
  EXPECT_NEAR(w[index(bs::Absorber::h2o)], 1e-3 * 18.01528 / 28.9644, 1e-15);
  EXPECT_NEAR(w[index(bs::Absorber::h2o_self_continuum)], 1e-3 * 18.01528 / 28.9644 * 1e-3 * 30000.0, 1e-15);
  EXPECT_EQ(w[index(bs::Absorber::o3)], 0.0);

  // Two overlapping absorbers with opposite slopes: the one with the larger q kappa decides the order.
  std::array<SyntheticSource::Shape, bs::absorber_count> shapes;
  shapes[index(bs::Absorber::co2)] = [](double nu) { return nu - 500.0; }; // rising
  shapes[index(bs::Absorber::h2o)] = [](double nu) { return 600.0 - nu; }; // falling
  const SyntheticSource source(shapes);
  bs::BuildRecipe r = recipe_for({{500.0, 600.0}}, {4}, 0.1, 1.0);
  bs::BandSet set = bs::build_band_set(r, source); // q_co2 = 6.1e-4 < q_h2o = 1.2e-3: water decides
  EXPECT_GT(set.kappa(bs::Absorber::co2, 0, 1, 2), set.kappa(bs::Absorber::co2, 3, 1, 2));
  EXPECT_LT(set.kappa(bs::Absorber::h2o, 0, 1, 2), set.kappa(bs::Absorber::h2o, 3, 1, 2));
  r.bands[0].ordering.mole_fraction[index(Gas::h2o)] = 100e-6; // q_h2o = 6.2e-5: CO2 decides
  set = bs::build_band_set(r, source);
  EXPECT_LT(set.kappa(bs::Absorber::co2, 0, 1, 2), set.kappa(bs::Absorber::co2, 3, 1, 2));
  EXPECT_GT(set.kappa(bs::Absorber::h2o, 0, 1, 2), set.kappa(bs::Absorber::h2o, 3, 1, 2));
  // Linear shapes, 4 equal g-points of a 100 cm-1 band: the weakest g-point of CO2 covers 500-525,
  // mean kappa 12.5 at the ordering state (arithmetic mean of a linear function).
  EXPECT_NEAR(set.kappa(bs::Absorber::co2, 0, 1, 2), 12.5, 1e-9);
}

TEST(BandBuilder, TransmissionMeanOfTwoValuedBin) {
  // One g-point over a band where kappa is k1 on one half and k2 on the other: the transmission
  // mean at unit mean optical depth is -kbar ln((e^{-k1/kbar} + e^{-k2/kbar})/2), kbar = (k1+k2)/2
  // (definition of the rule, band_builder.hpp); it lies below the arithmetic mean (Jensen's inequality).
  const double k1 = 1.0, k2 = 9.0, kbar = 5.0;
  const auto source = one_absorber(bs::Absorber::o3, [=](double nu) { return nu < 1000.0 ? k1 : k2; });
  bs::BuildRecipe r = recipe_for({{980.0, 1020.0}}, {1}, 0.1, 1.0);
  r.gpoint_mean = bs::GpointMean::transmission;
  const bs::BandSet set = bs::build_band_set(r, source);
  const double expected = -kbar * std::log(0.5 * (std::exp(-k1 / kbar) + std::exp(-k2 / kbar)));
  EXPECT_NEAR(set.kappa(bs::Absorber::o3, 0, 1, 2), expected, 1e-12);
  EXPECT_LT(expected, kbar);
}

TEST(BandBuilder, ProvenanceAndAbsentAbsorbers) {
  const auto source = one_absorber(bs::Absorber::ch4, [](double) { return 1.0; });
  const bs::BandSet set = bs::build_band_set(recipe_for({{1200.0, 1400.0}}, {2}, 0.5, 1.0), source);
  EXPECT_EQ(set.name, "test_set");
  EXPECT_EQ(set.source_description, "synthetic test source");
  EXPECT_EQ(set.recipe_text, "name = \"test_set\"");
  EXPECT_EQ(set.builder_version, std::string(bandstack::version()));
  EXPECT_TRUE(set.absorber_present[index(bs::Absorber::ch4)]);
  EXPECT_FALSE(set.absorber_present[index(bs::Absorber::co2)]);
  EXPECT_EQ(set.kappa(bs::Absorber::co2, 1, 2, 3), 0.0);
}

TEST(BandBuilder, RefusesInconsistentRecipesAndBadSources) {
  const auto ok = one_absorber(bs::Absorber::co2, [](double) { return 1.0; });
  bs::BuildRecipe r = recipe_for({{500.0, 600.0}, {600.0, 700.0}}, {2, 2}, 0.1, 1.0);
  r.bands[1].lower_cm1 = 600.05;
  EXPECT_THROW((void)bs::build_band_set(r, ok), InputError); // not contiguous, not on the grid
  r = recipe_for({{500.0, 500.5}}, {8}, 0.1, 1.0);           // 5 points cannot fill 8 g-points
  try {
    (void)bs::build_band_set(r, ok);
    FAIL();
  } catch (const InputError& e) {
    EXPECT_NE(std::string(e.what()).find("bands[0].g_boundaries"), std::string::npos) << e.what();
  }
  r = recipe_for({{500.0, 600.0}}, {2}, 0.1, 1.0);
  r.ref_temperature_k = {250.0, 200.0};
  EXPECT_THROW((void)bs::build_band_set(r, ok), InputError);
  r = recipe_for({{500.0, 600.0}}, {2}, 0.1, 1.0);
  const auto negative = one_absorber(bs::Absorber::n2o, [](double nu) { return nu > 550.0 ? -1.0 : 1.0; });
  EXPECT_THROW((void)bs::build_band_set(r, negative), InputError);
  const auto nan = one_absorber(bs::Absorber::n2o, [](double) { return std::numeric_limits<double>::quiet_NaN(); });
  EXPECT_THROW((void)bs::build_band_set(r, nan), InputError);
}

TEST(GeometricGBoundaries, WidthsShrinkByTheRatio) {
  const std::vector<double> uniform = bs::geometric_g_boundaries(4, 1.0);
  EXPECT_EQ(uniform, (std::vector<double>{0.0, 0.25, 0.5, 0.75, 1.0}));
  const std::vector<double> g = bs::geometric_g_boundaries(5, 0.5);
  ASSERT_EQ(g.size(), 6u);
  EXPECT_EQ(g.front(), 0.0);
  EXPECT_EQ(g.back(), 1.0);
  // Widths 1, 1/2, 1/4, 1/8, 1/16 over their sum 31/16 (geometric series).
  EXPECT_NEAR(g[1], 16.0 / 31.0, 1e-15);
  for (std::size_t k = 1; k + 1 < g.size(); ++k)
    EXPECT_NEAR((g[k + 1] - g[k]) / (g[k] - g[k - 1]), 0.5, 1e-12);
  EXPECT_THROW((void)bs::geometric_g_boundaries(0, 0.5), InputError);
  EXPECT_THROW((void)bs::geometric_g_boundaries(3, 1.5), InputError);
}
