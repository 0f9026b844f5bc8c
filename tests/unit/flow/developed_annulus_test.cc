// Fully developed axial flow in a concentric annulus (the inflow profile and die numbers of a
// tube die with a mandrel) against the exact Newtonian solution and the exact power-law form.
#include "rheology/law_registry.h"
#include "solver/flow/developed_profile.h"
#include "../../reference/annulus.h"

#include <gtest/gtest.h>

#include <cmath>

namespace
{
  using lentus::flow::DevelopedProfile;
  using lentus::testing::simpson;

  std::shared_ptr<const lentus::rheology::ViscosityLaw> law(const std::string &name,
                                                            const lentus::rheology::ParameterValues &values)
  {
    return lentus::rheology::registry().create(name, values);
  }

  /// 2 pi int_a^b u r dr of the computed profile.
  double carried(const DevelopedProfile &profile, const double a, const double b)
  {
    return 2. * M_PI * simpson([&](const double r) { return profile.velocity(r) * r; }, a, b);
  }
} // namespace

TEST(DevelopedAnnulus, NewtonianMatchesExactSolution)
{
  // Bird, Stewart & Lightfoot 2002, Transport Phenomena, section 2.4:
  // Q = (pi G R^4 / (8 mu)) [(1 - k^4) - (1 - k^2)^2 / ln(1/k)], lambda^2 = (1 - k^2) / (2 ln(1/k)),
  // u(r) = (G R^2 / (4 mu)) [1 - (r/R)^2 + (1 - k^2) ln(r/R) / ln(1/k)].
  const double mu = 2., R = 0.02, k = 0.4, G = 3e4; // inputs only
  const double Q  = lentus::testing::newtonian_annulus_flow_rate(mu, R, k, G);
  const DevelopedProfile profile(*law("Newtonian", {{"Viscosity", mu}}), DevelopedProfile::Channel::annulus, R, Q,
                                 k * R);
  EXPECT_NEAR(profile.pressure_gradient(), G, 1e-5 * G);
  const double lambda = std::sqrt((1. - k * k) / (2. * std::log(1. / k)));
  EXPECT_NEAR(profile.zero_stress_radius(), lambda * R, 1e-5 * R);
  const double peak = G * R * R / (4. * mu) * (1. - lambda * lambda + 2. * lambda * lambda * std::log(lambda));
  for (const double r : {0.41 * R, 0.5 * R, lambda * R, 0.8 * R, 0.99 * R})
    {
      const double exact = G * R * R / (4. * mu) *
                           (1. - r * r / (R * R) + (1. - k * k) * std::log(r / R) / std::log(1. / k));
      EXPECT_NEAR(profile.velocity(r), exact, 1e-5 * peak) << "r = " << r;
    }
  EXPECT_EQ(profile.velocity(0.3 * R), 0.);
  EXPECT_EQ(profile.velocity(1.01 * R), 0.);
  EXPECT_NEAR(carried(profile, k * R, R), Q, 1e-6 * Q);
  // Force balance (exact): G pi (R^2 - a^2) = 2 pi (a tau_a + R tau_R); the mean is G (R - a) / 2.
  const double g = profile.pressure_gradient();
  EXPECT_NEAR(k * R * profile.inner_wall_stress() + R * profile.outer_wall_stress(), 0.5 * g * R * R * (1. - k * k),
              1e-10 * g * R * R);
  EXPECT_NEAR(profile.wall_stress(), 0.5 * g * R * (1. - k), 1e-10 * g * R);
  // Wall stresses of the exact profile: tau = (G/2)(lambda^2 R^2 / r - r) at r = a and r = R.
  EXPECT_NEAR(profile.inner_wall_stress(), 0.5 * G * (lambda * lambda * R / k - k * R), 1e-5 * G * R);
  EXPECT_NEAR(profile.outer_wall_stress(), 0.5 * G * (R - lambda * lambda * R), 1e-5 * G * R);

  // Reversed flow: the same profile with the sign of Q.
  const DevelopedProfile back(*law("Newtonian", {{"Viscosity", mu}}), DevelopedProfile::Channel::annulus, R, -Q, k * R);
  EXPECT_NEAR(back.pressure_gradient(), -G, 1e-5 * G);
  EXPECT_NEAR(back.velocity(0.6 * R), -profile.velocity(0.6 * R), 1e-9 * peak);
}

class PowerLawAnnulus : public ::testing::TestWithParam<std::pair<double, double>>
{};

TEST_P(PowerLawAnnulus, MatchesExactForm)
{
  // Hanks & Larsen 1979, Ind. Eng. Chem. Fundam. 18:33 (exact form; tests/reference/annulus.h).
  const auto [n, k] = GetParam();
  const double K = 5., R = 0.01, G = 2e5; // inputs only
  const auto exact = lentus::testing::power_law_annulus(K, n, R, k, G);
  const double lambda = exact.lambda, Q = exact.flow_rate;
  const DevelopedProfile profile(
    *law("Power law", {{"Consistency", K}, {"Flow index", n}, {"Minimum viscosity", 1e-12}, {"Maximum viscosity", 1e12}}),
    DevelopedProfile::Channel::annulus, R, Q, k * R);
  // Tolerance: 1e-4 (the law's inverse is tabulated at 100 points per decade; exact for a power law,
  // so this bounds the quadratures of both sides).
  EXPECT_NEAR(profile.pressure_gradient(), G, 1e-4 * G) << "n = " << n << ", kappa = " << k;
  EXPECT_NEAR(profile.zero_stress_radius(), lambda * R, 1e-4 * R);
  EXPECT_NEAR(carried(profile, k * R, R), Q, 1e-5 * Q);
}

INSTANTIATE_TEST_SUITE_P(FlowIndexAndRadiusRatio, PowerLawAnnulus,
                         ::testing::Values(std::make_pair(0.5, 0.5), std::make_pair(0.3, 0.1),
                                           std::make_pair(1.5, 0.7)));

TEST(DevelopedAnnulus, NarrowGapApproachesSlit)
{
  // Bird, Stewart & Lightfoot 2002, section 2.4: as k -> 1 the annulus becomes a plane slit of
  // half-gap h = (R - a)/2 and width 2 pi (R + a)/2; slit power law (Bird, Stewart & Lightfoot 2002,
  // ch. 8; from memory for the section):
  // q = (2 n h^2 / (2n + 1)) (tau_w / K)^(1/n), tau_w = G h, per unit width.
  const double K = 3., n = 0.6, R = 0.05, a = 0.0495, G = 1e6; // inputs only
  const double h = 0.5 * (R - a), q = 2. * n * h * h / (2. * n + 1.) * std::pow(G * h / K, 1. / n);
  const double Q = q * M_PI * (R + a);
  const DevelopedProfile profile(
    *law("Power law", {{"Consistency", K}, {"Flow index", n}, {"Minimum viscosity", 1e-12}, {"Maximum viscosity", 1e12}}),
    DevelopedProfile::Channel::annulus, R, Q, a);
  // The curvature correction is of order (R - a)/R = 1%: within 0.5% here.
  EXPECT_NEAR(profile.pressure_gradient(), G, 5e-3 * G);
  EXPECT_NEAR(profile.inner_wall_stress(), profile.outer_wall_stress(), 2e-2 * profile.outer_wall_stress());
}

TEST(DevelopedAnnulus, RefusesAnInnerRadiusOutsideTheAnnulus)
{
  const auto water = law("Newtonian", {{"Viscosity", 1e-3}});
  EXPECT_THROW(DevelopedProfile(*water, DevelopedProfile::Channel::annulus, 1., 1e-3, 1.), std::runtime_error);
  EXPECT_THROW(DevelopedProfile(*water, DevelopedProfile::Channel::annulus, 1., 1e-3, 0.), std::runtime_error);
}
