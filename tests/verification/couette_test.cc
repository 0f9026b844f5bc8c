// Bingham fluid between coaxial cylinders, the inner one rotating, in the
// axisymmetric formulation with swirl (circular Couette flow).
#include "../reference/viscoplastic.h"
#include "run_case.h"

#include <gtest/gtest.h>

#include <cmath>

TEST(BinghamCouette, TorqueAndYieldRadius)
{
  // Source: circular Couette flow of a Bingham fluid (tests/reference/viscoplastic.h: the momentum
  // balance tau = tau_i R_i^2 / r^2 with the Bingham law; Bird, Dai & Yarusso 1983, Rev. Chem. Eng. 1:1;
  // Reiner & Riwlin 1927, Kolloid-Z. 43:1). R_i = 1 m, R_o = 2 m, mu_p = 1 Pa s, tau_y = 1 Pa, inner wall
  // stress tau_i = 3 Pa: Omega = 1 - ln sqrt(3) rad/s, r_y = sqrt(3) m, torque per unit length
  // T/L = 2 pi R_i^2 tau_i = 6 pi N m/m. Height 0.25 m with symmetry ends: T = 6 pi * 0.25 N m.
  const auto exact = lentus::testing::bingham_couette(1., 3., 1., 1.);
  EXPECT_NEAR(exact.rotation_rate, 1. - std::log(std::sqrt(3.)), 1e-15);
  EXPECT_NEAR(exact.yield_radius, std::sqrt(3.), 1e-15);
  const std::string text = lentus::testing::bingham_couette_case(exact.rotation_rate, 3);
  const auto result = lentus::testing::run_case("bingham_couette", text);
  ASSERT_TRUE(result.converged) << result.reason;
  const double torque = 2. * M_PI * 1. * 3. * 0.25;
  // Regularization (M = 1000 s) and discretization together: within 1%.
  EXPECT_NEAR(result.number("torque on the fluid from inner wall"), torque, 0.01 * torque);
  // The unyielded region is r_y < r < R_o: area fraction (R_o - r_y) / (R_o - R_i) of the meridional
  // section; the regularized yield surface is smeared over O(1/M) in shear rate: within 0.02.
  EXPECT_NEAR(result.number("unyielded area fraction"), (2. - exact.yield_radius) / (2. - 1.), 0.02);
}
