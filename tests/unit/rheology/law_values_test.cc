// Each law against values computed by hand from its defining formula
// (analytic; each formula's source is cited in the law's file, e.g. rheology/laws/cross.cc).
#include "rheology/law_helpers.h"
#include "rheology/law_registry.h"

#include <gtest/gtest.h>

#include <cmath>

using namespace lentus::rheology;

namespace
{
  constexpr double tight = 1e-13; // relative, for closed-form arithmetic

  void expect_relative(const double actual, const double expected, const double tolerance, const std::string &what)
  {
    EXPECT_NEAR(actual, expected, tolerance * std::abs(expected)) << what;
  }
} // namespace

TEST(LawValues, Newtonian)
{
  // Analytic: eta = mu at every shear rate, derivative 0.
  const auto law = registry().create("Newtonian", {{"Viscosity", 2.}});
  for (const double g : {0., 1e-9, 1., 1e7})
    {
      EXPECT_EQ(law->evaluate(g).value, 2.);
      EXPECT_EQ(law->evaluate(g).derivative, 0.);
    }
}

TEST(LawValues, PowerLawThinningAndItsCap)
{
  // Analytic: K = 10 Pa s^n, n = 0.5, gamma_dot = 4: eta = 10 / 2 = 5 Pa s;
  // d eta/d gamma_dot = (n - 1) eta / gamma_dot = -0.625 Pa s^2.
  const auto law = registry().create("Power law", {{"Consistency", 10.}, {"Flow index", 0.5}, {"Maximum viscosity", 1000.}});
  expect_relative(law->evaluate(4.).value, 5., tight, "eta");
  expect_relative(law->evaluate(4.).derivative, -0.625, tight, "derivative");
  // Below gamma_dot = (K / eta_max)^(1/(1-n)) = 1e-4 1/s the cap holds, slope 0.
  EXPECT_EQ(law->evaluate(1e-5).value, 1000.);
  EXPECT_EQ(law->evaluate(1e-5).derivative, 0.);
  EXPECT_EQ(law->evaluate(0.).value, 1000.);
  expect_relative(law->stress(4.), 20., tight, "tau = K gamma_dot^n");
}

TEST(LawValues, PowerLawThickeningAndItsFloor)
{
  // Analytic: K = 2 Pa s^n, n = 2, gamma_dot = 3: eta = 6 Pa s, derivative K (n-1) = 2 Pa s^2.
  const auto law = registry().create("Power law", {{"Consistency", 2.}, {"Flow index", 2.}, {"Minimum viscosity", 1.}});
  expect_relative(law->evaluate(3.).value, 6., tight, "eta");
  expect_relative(law->evaluate(3.).derivative, 2., tight, "derivative");
  // 2 * 0.1 = 0.2 < eta_min = 1: clipped.
  EXPECT_EQ(law->evaluate(0.1).value, 1.);
  EXPECT_EQ(law->evaluate(0.1).derivative, 0.);
  EXPECT_EQ(law->evaluate(0.).value, 1.);
}

TEST(LawValues, Cross)
{
  // Analytic: eta_0 = 100, eta_inf = 1 Pa s, lambda = 2 s, m = 1, gamma_dot = 0.5 1/s:
  // x = lambda gamma_dot = 1, eta = 1 + 99 / 2 = 50.5 Pa s;
  // d eta/d gamma_dot = -(eta_0 - eta_inf) (dx/d gamma_dot) / (1 + x)^2 = -99 * 2 / 4 = -49.5 Pa s^2.
  const auto law = registry().create(
    "Cross", {{"Zero-shear viscosity", 100.}, {"Infinite-shear viscosity", 1.}, {"Time constant", 2.}, {"Rate index", 1.}});
  expect_relative(law->evaluate(0.5).value, 50.5, tight, "eta");
  expect_relative(law->evaluate(0.5).derivative, -49.5, tight, "derivative");
  EXPECT_EQ(law->evaluate(0.).value, 100.);
  expect_relative(law->evaluate(1e12).value, 1., 1e-9, "eta_inf plateau");
}

TEST(LawValues, CarreauYasuda)
{
  // Analytic: eta_0 = 1000 Pa s, eta_inf = 0, lambda = 1 s, n = 0.5, a = 2, gamma_dot = sqrt(3):
  // x = (lambda gamma_dot)^a = 3, eta = 1000 (1 + 3)^(-1/4) = 1000 / sqrt(2) Pa s;
  // d eta/d gamma_dot = eta (n-1)/a (a x / gamma_dot) / (1 + x) = -(1000 / sqrt(2)) sqrt(3) / 8 Pa s^2.
  const auto law = registry().create(
    "Carreau-Yasuda", {{"Zero-shear viscosity", 1000.}, {"Time constant", 1.}, {"Flow index", 0.5}});
  expect_relative(law->evaluate(std::sqrt(3.)).value, 1000. / std::sqrt(2.), tight, "eta");
  const double slope = 1000. / std::sqrt(2.) * (0.5 - 1.) / 2. * (2. * 3. / std::sqrt(3.)) / (1. + 3.);
  expect_relative(slope, -1000. / std::sqrt(2.) * std::sqrt(3.) / 8., tight, "hand simplification");
  expect_relative(law->evaluate(std::sqrt(3.)).derivative, slope, 1e-12, "derivative");
  EXPECT_EQ(law->evaluate(0.).value, 1000.);
  // Analytic: far beyond 1/lambda, eta -> eta_0 (lambda gamma_dot)^(n-1): power law of index n.
  expect_relative(law->evaluate(1e8).value, 1000. * std::pow(1e8, -0.5), 1e-8, "power-law asymptote");
}

TEST(LawValues, Bingham)
{
  // Analytic: mu_p = 0.1 Pa s, tau_y = 10 Pa, M = 100 s, gamma_dot = 0.05 1/s, M gamma_dot = 5:
  // eta = 0.1 + 10 (1 - e^-5) / 0.05 (about 198.75 Pa s), tau = eta gamma_dot (about 9.94 Pa).
  const auto law = registry().create("Bingham", {{"Plastic viscosity", 0.1}, {"Yield stress", 10.}, {"Regularization exponent", 100.}});
  const double eta = 0.1 + 10. * (1. - std::exp(-5.)) / 0.05;
  expect_relative(law->evaluate(0.05).value, eta, tight, "eta");
  // Papanastasiou 1987: tau = mu_p gamma_dot + tau_y (1 - e^(-M gamma_dot)), written without eta.
  expect_relative(law->stress(0.05), 0.1 * 0.05 + 10. * (1. - std::exp(-5.)), tight, "tau");
  // Limit at rest (Papanastasiou 1987): mu_p + tau_y M = 1000.1 Pa s.
  expect_relative(law->evaluate(0.).value, 1000.1, tight, "eta at rest");
}

TEST(LawValues, HerschelBulkley)
{
  // Analytic: K = 5 Pa s^n, n = 0.5, tau_y = 10 Pa, M = 100 s, gamma_dot = 4 1/s:
  // eta = 5 / 2 + 10 (1 - e^-400) / 4 = 5.0 Pa s (e^-400 is below double precision).
  const auto law = registry().create("Herschel-Bulkley", {{"Consistency", 5.},
                                                          {"Flow index", 0.5},
                                                          {"Yield stress", 10.},
                                                          {"Regularization exponent", 100.},
                                                          {"Shear-rate floor", 1e-6}});
  expect_relative(law->evaluate(4.).value, 5., tight, "eta");
  // Below the floor the power-law term is K floor^(n-1) = 5 / 1e-3 = 5000 Pa s, slope from it 0.
  expect_relative(law->evaluate(1e-8).value, 5000. + 10. * 100. * (-std::expm1(-1e-6) / 1e-6), tight, "floor");
}

TEST(PapanastasiouRatio, SeriesAndDirectAgreeAtTheSwitch)
{
  // Analytic: f(x) = (1 - e^-x)/x, f'(x) = (e^-x (1 + x) - 1) / x^2; the two
  // branches of the helper must meet at x = 0.5 to near machine precision.
  const auto below = papanastasiou_ratio(std::nextafter(0.5, 0.));
  const auto above = papanastasiou_ratio(0.5);
  EXPECT_NEAR(below.slope, above.slope, 1e-14);
  // f'(0.5) = (1.5 e^-0.5 - 1) / 0.25
  EXPECT_NEAR(above.slope, (1.5 * std::exp(-0.5) - 1.) / 0.25, 1e-15);
  // Series at x = 1e-3: f'(x) = -1/2 + x/3 - x^2/8 + x^3/30 - x^4/144 + x^5/840 - ...
  const double x = 1e-3;
  EXPECT_NEAR(papanastasiou_ratio(x).slope, -0.5 + x / 3. - x * x / 8. + x * x * x / 30. - std::pow(x, 4) / 144. + std::pow(x, 5) / 840., 1e-16);
  EXPECT_EQ(papanastasiou_ratio(0.).value, 1.);
  EXPECT_EQ(papanastasiou_ratio(0.).slope, -0.5);
}
