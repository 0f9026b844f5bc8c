// Papanastasiou regularization: the limit at rest without cancellation, and
// convergence of the stress to the ideal Bingham law as M grows.
// Source: Papanastasiou 1987, J. Rheol. 31:385: tau = mu_p gamma_dot + tau_y (1 - exp(-M gamma_dot));
// limit eta -> mu_p + tau_y M as gamma_dot -> 0.
#include "rheology/law_registry.h"

#include <gtest/gtest.h>

#include <cmath>

using namespace lentus::rheology;

namespace
{
  std::unique_ptr<ViscosityLaw> bingham(const double mu_p, const double tau_y, const double M)
  {
    return registry().create("Bingham",
                             {{"Plastic viscosity", mu_p}, {"Yield stress", tau_y}, {"Regularization exponent", M}});
  }

  std::unique_ptr<ViscosityLaw> herschel_bulkley_n1(const double K, const double tau_y, const double M)
  {
    return registry().create(
      "Herschel-Bulkley", {{"Consistency", K}, {"Flow index", 1.}, {"Yield stress", tau_y}, {"Regularization exponent", M}});
  }
} // namespace

TEST(Regularization, LimitAtRestWithoutCancellation)
{
  // At gamma_dot = 1e-12, eta = mu_p + tau_y M (1 - M gamma_dot / 2 + ...).
  // With M <= 1 s the correction is below 5e-13, so eta = mu_p + tau_y M to 1e-12 relative;
  // the naive (1 - exp(-x))/x loses about 4 digits here and fails this check.
  const double g = 1e-12;
  for (const double M : {1e-3, 0.1, 1.})
    for (const double tau_y : {0.5, 10., 3000.})
      {
        const double limit = 0.2 + tau_y * M;
        EXPECT_NEAR(bingham(0.2, tau_y, M)->evaluate(g).value, limit, 1e-12 * limit) << "M = " << M;
        EXPECT_NEAR(herschel_bulkley_n1(0.2, tau_y, M)->evaluate(g).value, limit, 1e-12 * limit) << "M = " << M;
      }
  // Large M: compare with the series f(x) = 1 - x/2 + x^2/6 - ..., f'(x) = -1/2 + x/3 - x^2/8 + ...
  // (x = M g <= 1e-6), truncated where the next term is below 1e-18 relative.
  for (const double M : {1e2, 1e4, 1e6})
    {
      const double x        = M * g;
      const double expected = 0.2 + 10. * M * (1. - x / 2. + x * x / 6.);
      EXPECT_NEAR(bingham(0.2, 10., M)->evaluate(g).value, expected, 1e-14 * expected) << "M = " << M;
      // Slope at rest: d eta/d gamma_dot = tau_y M^2 f'(M g) -> -tau_y M^2 / 2.
      const double slope = 10. * M * M * (-0.5 + x / 3. - x * x / 8.);
      EXPECT_NEAR(bingham(0.2, 10., M)->evaluate(g).derivative, slope, 1e-13 * std::abs(slope)) << "M = " << M;
    }
}

TEST(Regularization, StressTendsToIdealBinghamAsMGrows)
{
  // Ideal Bingham (Bingham 1922, for gamma_dot > 0): tau = tau_y + mu_p gamma_dot.
  // The regularized stress differs by exactly tau_y exp(-M gamma_dot): it must shrink
  // monotonically with M and be below 1e-12 relative once M gamma_dot >= 40.
  const double mu_p = 0.5, tau_y = 20.;
  for (const double g : {1e-3, 1e-1, 1., 50.})
    {
      double previous_error = HUGE_VAL;
      for (const double M : {1., 10., 1e2, 1e3, 1e4, 1e5, 1e6})
        {
          const double ideal = tau_y + mu_p * g;
          const double error = std::abs(bingham(mu_p, tau_y, M)->stress(g) - ideal);
          EXPECT_LE(error, previous_error + 1e-14 * ideal) << "gamma_dot = " << g << ", M = " << M;
          EXPECT_NEAR(error, tau_y * std::exp(-M * g), 1e-12 * ideal + 1e-9 * tau_y * std::exp(-M * g));
          if (M * g >= 40.)
            {
              EXPECT_LT(error, 1e-12 * ideal);
            }
          previous_error = error;
        }
    }
}
