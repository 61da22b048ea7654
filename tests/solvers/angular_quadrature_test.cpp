#include "bandstack/core/error.hpp"
#include "bandstack/solvers/angular_quadrature.hpp"

#include <cmath>
#include <gtest/gtest.h>
#include <numeric>

namespace bs = bandstack::solvers;

namespace {

double weighted_moment(const bs::AngularQuadrature& q, int k) {
  double sum = 0.0;
  for (std::size_t j = 0; j < q.size(); ++j)
    sum += q.weight[j] * std::pow(q.mu[j], k);
  return sum;
}

} // namespace

// Analytic: the flux measure 2 mu dmu on (0, 1) has moments int_0^1 2 mu mu^k dmu = 2 / (k + 2),
// and an n-node Gauss rule is exact for polynomials of degree <= 2n - 1 (Gauss quadrature theorem,
// e.g. Abramowitz & Stegun 1964, 25.4.29-25.4.33).
TEST(AngularQuadrature, GaussIntegratesMuPolynomialsExactly) {
  for (int n = 1; n <= 8; ++n) {
    const bs::AngularQuadrature q = bs::gauss_quadrature(n);
    ASSERT_EQ(q.size(), static_cast<std::size_t>(n));
    for (std::size_t j = 0; j < q.size(); ++j) {
      EXPECT_GT(q.mu[j], 0.0);
      EXPECT_LT(q.mu[j], 1.0);
      EXPECT_GT(q.weight[j], 0.0);
    }
    // Isotropic radiance: sum of weights reproduces F = pi I exactly.
    EXPECT_NEAR(std::accumulate(q.weight.begin(), q.weight.end(), 0.0), 1.0, 1e-15) << "n = " << n;
    for (int k = 0; k <= 2 * n - 1; ++k)
      EXPECT_NEAR(weighted_moment(q, k), 2.0 / (k + 2), 1e-14) << "n = " << n << ", degree " << k;
    // ... and it is a genuine Gauss rule, not better: degree 2n is not integrated exactly.
    EXPECT_GT(std::abs(weighted_moment(q, 2 * n) - 2.0 / (2 * n + 2)), 1e-10) << "n = " << n;
  }
}

// Analytic: for weight mu on (0, 1) the monic orthogonal polynomials are p1 = mu - 2/3 and
// p2 = mu^2 - 6/5 mu + 3/10 (from the orthogonality conditions), so the nodes are 2/3 and
// (6 -+ sqrt 6)/10; the 2-node weights follow from w1 + w2 = 1, w1 mu1 + w2 mu2 = 2/3.
TEST(AngularQuadrature, LowOrderNodesMatchClosedForm) {
  const bs::AngularQuadrature one = bs::gauss_quadrature(1);
  EXPECT_NEAR(one.mu[0], 2.0 / 3.0, 1e-16);
  EXPECT_DOUBLE_EQ(one.weight[0], 1.0);

  const bs::AngularQuadrature two = bs::gauss_quadrature(2);
  const double mu1 = (6.0 - std::sqrt(6.0)) / 10.0;
  const double mu2 = (6.0 + std::sqrt(6.0)) / 10.0;
  EXPECT_NEAR(two.mu[0], mu1, 1e-15);
  EXPECT_NEAR(two.mu[1], mu2, 1e-15);
  const double w1 = (mu2 - 2.0 / 3.0) / (mu2 - mu1);
  EXPECT_NEAR(two.weight[0], w1, 1e-15);
  EXPECT_NEAR(two.weight[1], 1.0 - w1, 1e-15);
}

// Elsasser (1942) diffusivity factor 1.66 (common practice): one direction mu = 1/1.66, weight 1,
// so an isotropic radiance gives pi I.
TEST(AngularQuadrature, DiffusivityIsOneDirection) {
  const bs::AngularQuadrature q = bs::diffusivity_quadrature(1.66);
  ASSERT_EQ(q.size(), 1u);
  EXPECT_DOUBLE_EQ(q.mu[0], 1.0 / 1.66);
  EXPECT_DOUBLE_EQ(q.weight[0], 1.0);
  EXPECT_DOUBLE_EQ(bs::diffusivity_quadrature().mu[0], 1.0 / 1.66);
}

TEST(AngularQuadrature, RejectsBadInput) {
  EXPECT_THROW((void)bs::gauss_quadrature(0), bandstack::InputError);
  EXPECT_THROW((void)bs::gauss_quadrature(9), bandstack::InputError);
  EXPECT_THROW((void)bs::gauss_quadrature(-3), bandstack::InputError);
  EXPECT_THROW((void)bs::diffusivity_quadrature(0.5), bandstack::InputError);
  EXPECT_THROW((void)bs::diffusivity_quadrature(std::nan("")), bandstack::InputError);
  EXPECT_THROW(bs::validate(bs::AngularQuadrature{{0.5, 0.0}, {0.5, 0.5}}), bandstack::InputError);
  EXPECT_THROW(bs::validate(bs::AngularQuadrature{{0.5}, {0.5, 0.5}}), bandstack::InputError);
  EXPECT_THROW(bs::validate(bs::AngularQuadrature{{0.5}, {-1.0}}), bandstack::InputError);
  EXPECT_THROW(bs::validate(bs::AngularQuadrature{}), bandstack::InputError);
  EXPECT_NO_THROW(bs::validate(bs::gauss_quadrature(8)));
}
