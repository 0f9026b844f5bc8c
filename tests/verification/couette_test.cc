// Bingham fluid between coaxial cylinders, the inner one rotating, in the
// axisymmetric formulation with swirl (circular Couette flow).
#include "run_case.h"

#include <gtest/gtest.h>

#include <cmath>

TEST(BinghamCouette, TorqueAndYieldRadius)
{
  // Source: CHECKS.md A8 [derived; ODE quadrature], after Reiner & Riwlin 1927: R_i = 1, R_o = 2,
  // mu_p = 1, tau_y = 1, Omega = 0.450694 rad/s <-> torque per unit length T/L = 6 pi N m/m, yield
  // radius r_y = 1.732051 m. Height 0.25 m with symmetry ends: T = 6 pi * 0.25.
  const std::string text = R"(
subsection Rheology
  set Viscosity law = Bingham
  subsection Bingham
    set Plastic viscosity = 1
    set Yield stress = 1
    set Regularization exponent = 1000
  end
end
subsection Geometry
  set Shape = Annular gap
  set Refinement = 3
  subsection Annular gap
    set Inner radius = 1
    set Outer radius = 2
    set Height = 0.25
  end
end
subsection Flow
  set Formulation = axisymmetric with swirl
end
subsection Boundary conditions
  set Moving wall = inner wall
  set Rotation rate = 0.450694
  set No-slip = outer wall
  set Symmetry = bottom, top
end
)";
  const auto result = lentus::testing::run_case("bingham_couette", text);
  ASSERT_TRUE(result.converged) << result.reason;
  const double torque = 6. * M_PI * 0.25;
  // Regularization (M = 1000 s) and discretization together: within 1%.
  EXPECT_NEAR(result.number("torque on the fluid from inner wall"), torque, 0.01 * torque);
  // The unyielded region is r_y < r < R_o: area fraction (2 - 1.732051) / 1 = 0.267949; the
  // regularized yield surface is smeared over O(1/M) in shear rate: within 0.02.
  EXPECT_NEAR(result.number("unyielded area fraction"), 2. - 1.732051, 0.02);
  // Analytic (virtual power): torque x rotation rate = dissipation, within 0.5%.
  EXPECT_NEAR(result.number("power input through boundaries"), result.number("viscous dissipation"),
              0.005 * result.number("viscous dissipation"));
  EXPECT_NEAR(result.number("power input through boundaries"), 2. * M_PI * torque / (2. * M_PI) * 0.450694,
              0.01 * torque * 0.450694);
}
