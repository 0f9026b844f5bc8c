// Round die: abrupt axisymmetric 4:1 contraction in creeping Newtonian flow.
#include "run_case.h"

#include <gtest/gtest.h>

#include <cmath>
#include <fstream>
#include <iostream>
#include <sstream>
#include <string>

namespace
{
  const char *contraction = R"(subsection Rheology
  set Viscosity law = Newtonian
  subsection Newtonian
    set Viscosity = 1
  end
end
subsection Geometry
  set Shape = Round die
  subsection Round die
    set Barrel radius    = 4
    set Barrel length    = 10
    set Entry half-angle = 90
    set Land radius      = 1
    set Land length      = 10
  end
end
subsection Flow
  set Formulation = axisymmetric
end
subsection Boundary conditions
  set No-slip         = wall
  set Axis            = axis
  set Inflow          = inlet
  set Inflow rates    = 1
  set Pressure        = outlet
  set Pressure values = 0
end
)";
} // namespace

TEST(RoundDie, AbruptContractionEntranceLoss)
{
  std::vector<double> coefficient, drop;
  for (const int level : {0, 1, 2})
    {
      const auto result = lentus::testing::run_case("contraction_" + std::to_string(level), contraction,
                                                    {"Geometry/Refinement=" + std::to_string(level)});
      ASSERT_TRUE(result.converged) << result.reason;
      // Analytic (Hagen-Poiseuille; CHECKS.md A2 with n = 1): developed wall stress 4 mu Q/(pi R^3),
      // pressure drop 8 mu Q L/(pi R^4) in the land (R = 1, L = 10) and the barrel (R = 4, L = 10).
      EXPECT_NEAR(result.number("developed wall shear stress in the land"), 4. / M_PI, 1e-5 * 4. / M_PI);
      EXPECT_NEAR(result.number("developed pressure drop in the land"), 80. / M_PI, 1e-5 * 80. / M_PI);
      EXPECT_NEAR(result.number("developed pressure drop in the barrel"), 80. / (M_PI * 256.), 1e-5 * 80. / (M_PI * 256.));
      // Analytic (virtual power): power input = viscous dissipation within 0.5%.
      EXPECT_NEAR(result.number("power input through boundaries"), result.number("viscous dissipation"),
                  0.005 * result.number("viscous dissipation"));
      coefficient.push_back(result.number("entrance loss coefficient (Bagley end correction)"));
      drop.push_back(result.number("pressure drop inlet to outlet"));
    }
  std::cout << "entrance loss coefficient at levels 0, 1, 2: " << coefficient[0] << ", " << coefficient[1] << ", "
            << coefficient[2] << "; pressure drop " << drop[0] << ", " << drop[1] << ", " << drop[2] << std::endl;
  // Mesh convergence (common practice: three levels): the die pressure drop changes by under 1%
  // between the finest two, and the coefficient's changes shrink.
  EXPECT_LT(std::abs(drop[2] - drop[1]), 0.01 * drop[2]);
  EXPECT_LT(std::abs(coefficient[2] - coefficient[1]), std::abs(coefficient[1] - coefficient[0]));
  // Source: Sampson 1891 (orifice), half assigned to the entrance after Weissberg 1962, via CHECKS.md B5
  // [from memory]: C = 3 pi / 16 = 0.589 for an infinite contraction ratio, an upper bound for 4:1;
  // a finite 4:1 ratio gives "a somewhat lower" value. Loose lower bound 0.5 (from memory).
  EXPECT_LT(coefficient[2], 3. * M_PI / 16.);
  EXPECT_GT(coefficient[2], 0.5);

  // Exit velocity profile (exit_profile.csv): the land is long (10 radii), so the exit is developed:
  // Hagen-Poiseuille u(r) = 2 V (1 - r^2/R^2), V = Q / (pi R^2) = 1/pi m/s (analytic); within 1% of 2V.
  std::ifstream profile("verification_out/contraction_2/exit_profile.csv");
  std::string   line;
  ASSERT_TRUE(std::getline(profile, line)) << "no exit_profile.csv";
  EXPECT_EQ(line, "r [m],z [m],outflow velocity [m/s],tangential velocity [m/s]");
  int rows = 0;
  while (std::getline(profile, line))
    {
      double            r, z, u, t;
      char              comma;
      std::stringstream fields(line);
      fields >> r >> comma >> z >> comma >> u >> comma >> t;
      EXPECT_NEAR(u, 2. / M_PI * (1. - r * r), 0.01 * 2. / M_PI) << "r = " << r;
      EXPECT_NEAR(t, 0., 1e-12);
      ++rows;
    }
  EXPECT_GE(rows, 9);
}

TEST(SlitDie, AbruptContractionDevelopedFlowAndEnergy)
{
  // Half of a planar 4:1 slit contraction (symmetry plane at x = 0). The half carries 0.5 m^2/s, so the
  // full slit carries q = 1 m^2/s per metre of width.
  const std::string text = R"(subsection Rheology
  set Viscosity law = Newtonian
  subsection Newtonian
    set Viscosity = 1
  end
end
subsection Geometry
  set Shape = Slit die
  subsection Slit die
    set Manifold half-gap = 4
    set Manifold length   = 10
    set Land half-gap     = 1
    set Land length       = 10
  end
end
subsection Boundary conditions
  set No-slip         = wall
  set Symmetry        = symmetry
  set Inflow          = inlet
  set Inflow rates    = 0.5
  set Pressure        = outlet
  set Pressure values = 0
end
)";
  std::vector<double> drop;
  for (const int level : {0, 1, 2})
    {
      const auto result = lentus::testing::run_case("slit_die_" + std::to_string(level), text,
                                                    {"Geometry/Refinement=" + std::to_string(level)});
      ASSERT_TRUE(result.converged) << result.reason;
      // Analytic (plane Poiseuille; CHECKS.md A1 with n = 1): tau_w = 3 mu q / (2 h^2) = 1.5 Pa in the
      // land (h = 1 m), pressure drop tau_w L / h = 15 Pa; apparent wall shear rate 6 q / H^2 = 1.5 1/s.
      EXPECT_NEAR(result.number("developed wall shear stress in the land"), 1.5, 1e-5 * 1.5);
      EXPECT_NEAR(result.number("developed pressure drop in the land"), 15., 1e-5 * 15.);
      EXPECT_NEAR(result.number("apparent wall shear rate in the land"), 1.5, 1e-6 * 1.5); // from the computed outflow
      EXPECT_NEAR(result.number("power input through boundaries"), result.number("viscous dissipation"),
                  0.005 * result.number("viscous dissipation"));
      drop.push_back(result.number("pressure drop inlet to outlet"));
    }
  std::cout << "slit die pressure drop at levels 0, 1, 2: " << drop[0] << ", " << drop[1] << ", " << drop[2]
            << std::endl;
  // Mesh convergence (common practice): under 1% between the finest two levels.
  EXPECT_LT(std::abs(drop[2] - drop[1]), 0.01 * drop[2]);
  // The total exceeds the developed drops (land 15 Pa; manifold tau_w L / h = (1.5 / 16) * 10 / 4 =
  // 0.234375 Pa): the entrance loss of a Newtonian contraction is positive.
  EXPECT_GT(drop[2], 15. + 0.234375);
}
