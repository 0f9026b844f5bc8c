// Dies: abrupt axisymmetric and planar 4:1 contractions in creeping Newtonian flow, a tube die
// (round die with a mandrel), and developed power-law flow in an annulus.
#include "../reference/annulus.h"
#include "run_case.h"

#include <gtest/gtest.h>

#include <array>
#include <cmath>
#include <fstream>
#include <iostream>
#include <sstream>
#include <string>

using lentus::testing::wall_stresses;

namespace
{
  /// Abrupt axisymmetric 4:1 contraction: barrel R = 4, land R = 1, both 10 long [m]; Newtonian,
  /// mu = 1 Pa s, Q = 1 m^3/s. With a mandrel of radius `mandrel` > 0 through the whole die: a tube die.
  std::string contraction(const double mandrel = 0.)
  {
    return lentus::testing::newtonian(1.) + R"(subsection Geometry
  set Shape = Round die
  subsection Round die
    set Barrel radius    = 4
    set Barrel length    = 10
    set Entry half-angle = 90
    set Land radius      = 1
    set Land length      = 10
    set Mandrel radius   = )" + std::to_string(mandrel) + R"(
  end
end
subsection Flow
  set Velocity components = r z
end
subsection Boundary conditions
  set No-slip         = wall)" + (mandrel > 0. ? ", mandrel" : "\n  set Axis            = axis") + R"(
  set Inflow          = inlet
  set Inflow rates    = 1
  set Pressure        = outlet
  set Pressure values = 0
end
)";
  }

  /// The rows (r, outflow velocity) of an axisymmetric run's exit_profile.csv; checks the header. (Its
  /// tangential velocity is not checked: the outlet holds it at zero as a Dirichlet condition.)
  std::vector<std::array<double, 2>> exit_profile(const std::string &folder)
  {
    std::vector<std::array<double, 2>> rows;
    std::ifstream                      profile("verification_out/" + folder + "/exit_profile.csv");
    std::string                        line;
    EXPECT_TRUE(std::getline(profile, line)) << "no exit_profile.csv in " << folder;
    EXPECT_EQ(line, "r [m],z [m],outflow velocity [m/s],tangential velocity [m/s]");
    while (std::getline(profile, line))
      {
        double            r, z, u;
        char              comma;
        std::stringstream fields(line);
        fields >> r >> comma >> z >> comma >> u;
        rows.push_back({{r, u}});
      }
    return rows;
  }
} // namespace

TEST(RoundDie, AbruptContractionEntranceLoss)
{
  std::vector<double> coefficient, drop;
  for (const int level : {0, 1, 2})
    {
      const auto result = lentus::testing::run_case("contraction_" + std::to_string(level), contraction(),
                                                    {"Geometry/Refinement=" + std::to_string(level)});
      ASSERT_TRUE(result.converged) << result.reason;
      // Analytic (Hagen-Poiseuille; Bird, Stewart & Lightfoot 2002, section 2.3): developed wall stress
      // 4 mu Q/(pi R^3), pressure drop 8 mu Q L/(pi R^4) in the land (R = 1, L = 10) and the barrel (R = 4, L = 10).
      EXPECT_NEAR(result.number("developed wall shear stress in the land"), 4. / M_PI, 1e-5 * 4. / M_PI);
      EXPECT_NEAR(result.number("developed pressure drop in the land"), 80. / M_PI, 1e-5 * 80. / M_PI);
      EXPECT_NEAR(result.number("developed pressure drop in the barrel"), 80. / (M_PI * 256.), 1e-5 * 80. / (M_PI * 256.));
      coefficient.push_back(result.number("entrance loss coefficient (Bagley end correction)"));
      drop.push_back(result.number("pressure drop inlet to outlet"));
    }
  std::cout << "entrance loss coefficient at levels 0, 1, 2: " << coefficient[0] << ", " << coefficient[1] << ", "
            << coefficient[2] << "; pressure drop " << drop[0] << ", " << drop[1] << ", " << drop[2] << std::endl;
  // Mesh convergence (common practice: three levels): the die pressure drop changes by under 1%
  // between the finest two, and the coefficient's changes shrink.
  EXPECT_LT(std::abs(drop[2] - drop[1]), 0.01 * drop[2]);
  EXPECT_LT(std::abs(coefficient[2] - coefficient[1]), std::abs(coefficient[1] - coefficient[0]));
  // Source: Sampson 1891 (Phil. Trans. R. Soc. A 182:449; the orifice, Delta p = 3 mu Q / R^3), half of
  // it assigned to the entrance after Weissberg 1962 (Phys. Fluids 5:1033) [from memory]:
  // C = (3/2) mu Q / R^3 / (2 tau_w) = 3 pi / 16 = 0.589 for an infinite contraction ratio, an upper bound for 4:1;
  // a finite 4:1 ratio gives "a somewhat lower" value. Loose lower bound 0.5 (from memory).
  EXPECT_LT(coefficient[2], 3. * M_PI / 16.);
  EXPECT_GT(coefficient[2], 0.5);

  // Exit velocity profile (exit_profile.csv): the land is long (10 radii), so the exit is developed:
  // Hagen-Poiseuille u(r) = 2 V (1 - r^2/R^2), V = Q / (pi R^2) = 1/pi m/s (analytic); within 1% of 2V.
  // Wall shear stress along the land away from its ends (z from 13 to 19.5 m): Hagen-Poiseuille
  // 4 mu Q / (pi R^3) = 4 / pi Pa (analytic) within 1%.
  const auto land = wall_stresses("contraction_2", "wall", 1, 13., 19.5);
  EXPECT_GE(land.size(), 4u);
  for (const double stress : land)
    EXPECT_NEAR(stress, 4. / M_PI, 0.01 * 4. / M_PI);

  const auto rows = exit_profile("contraction_2");
  for (const auto &[r, u] : rows)
    EXPECT_NEAR(u, 2. / M_PI * (1. - r * r), 0.01 * 2. / M_PI) << "r = " << r;
  EXPECT_GE(rows.size(), 9u);
}

TEST(SlitDie, AbruptContractionDevelopedFlow)
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
      // Analytic (plane Poiseuille; Bird, Stewart & Lightfoot 2002, problem 2B.3): tau_w = 3 mu q / (2 h^2)
      // = 1.5 Pa in the land (h = 1 m), pressure drop tau_w L / h = 15 Pa; apparent wall shear rate
      // 6 q / H^2 = 1.5 1/s.
      EXPECT_NEAR(result.number("developed wall shear stress in the land"), 1.5, 1e-5 * 1.5);
      EXPECT_NEAR(result.number("developed pressure drop in the land"), 15., 1e-5 * 15.);
      EXPECT_NEAR(result.number("apparent wall shear rate in the land"), 1.5, 1e-6 * 1.5); // from the computed outflow
      drop.push_back(result.number("pressure drop inlet to outlet"));
    }
  std::cout << "slit die pressure drop at levels 0, 1, 2: " << drop[0] << ", " << drop[1] << ", " << drop[2]
            << std::endl;
  // Mesh convergence (common practice): under 1% between the finest two levels.
  EXPECT_LT(std::abs(drop[2] - drop[1]), 0.01 * drop[2]);
  // The total exceeds the developed drops (land 15 Pa; manifold tau_w L / h with tau_w = 3 mu q / (2 h^2),
  // h = 4 m): the entrance loss of a Newtonian contraction is positive.
  EXPECT_GT(drop[2], 15. + 3. * 1. / (2. * 16.) * 10. / 4.);
}

TEST(TubeDie, NewtonianAnnularLandAndMeshConvergence)
{
  // Abrupt 4:1 round die with a mandrel of half the land radius through the whole die (a tube die).
  const std::string text = contraction(0.5);
  // Exact annulus (Bird, Stewart & Lightfoot 2002, section 2.4; tests/reference/annulus.h): G from Q = 1.
  const double k = 0.5, G_land = 1. / lentus::testing::newtonian_annulus_flow_rate(1., 1., k, 1.);
  const double G_barrel  = 1. / lentus::testing::newtonian_annulus_flow_rate(1., 4., 0.125, 1.);
  const double lambda2   = (1. - k * k) / (2. * std::log(1. / k));
  const double tau_inner = 0.5 * G_land * (lambda2 / k - k), tau_outer = 0.5 * G_land * (1. - lambda2);
  std::vector<double> drop;
  for (const int level : {0, 1, 2})
    {
      const auto result = lentus::testing::run_case("tube_die_" + std::to_string(level), text,
                                                    {"Geometry/Refinement=" + std::to_string(level)});
      ASSERT_TRUE(result.converged) << result.reason;
      EXPECT_NEAR(result.number("developed pressure drop in the land"), 10. * G_land, 1e-5 * 10. * G_land);
      EXPECT_NEAR(result.number("developed pressure drop in the barrel"), 10. * G_barrel, 1e-5 * 10. * G_barrel);
      EXPECT_NEAR(result.number("developed wall shear stress on the mandrel in the land"), tau_inner, 1e-5 * tau_inner);
      EXPECT_NEAR(result.number("developed wall shear stress on the outer wall in the land"), tau_outer,
                  1e-5 * tau_outer);
      // Perimeter mean (force balance, exact): G (R - a) / 2.
      EXPECT_NEAR(result.number("developed wall shear stress in the land"), 0.25 * G_land, 1e-5 * G_land);
      drop.push_back(result.number("pressure drop inlet to outlet"));
      // The total exceeds the developed drops (Newtonian entrance loss is positive).
      EXPECT_GT(drop.back(), 10. * (G_land + G_barrel));
    }
  std::cout << "tube die pressure drop at levels 0, 1, 2: " << drop[0] << ", " << drop[1] << ", " << drop[2]
            << std::endl;
  // Mesh convergence (common practice: three levels): under 1% between the finest two.
  EXPECT_LT(std::abs(drop[2] - drop[1]), 0.01 * drop[2]);

  // Exit profile: the land is 20 gaps long, so the exit is developed (Bird, Stewart & Lightfoot 2002,
  // section 2.4): u(r) = (G R^2 / 4 mu) [1 - (r/R)^2 + (1 - k^2) ln(r/R) / ln(1/k)]; within 1% of its peak.
  const double  peak = 0.25 * G_land * (1. - lambda2 + lambda2 * std::log(lambda2));
  // Along the land away from its ends (z from 15 to 19.5 m: 10 gaps after the entry), the computed
  // wall shear stress on each wall is the developed one (same source) within 1%.
  const auto mandrel = wall_stresses("tube_die_2", "mandrel", 1, 15., 19.5);
  const auto outer   = wall_stresses("tube_die_2", "wall", 1, 15., 19.5);
  EXPECT_GE(mandrel.size(), 4u);
  EXPECT_GE(outer.size(), 4u);
  for (const double stress : mandrel)
    EXPECT_NEAR(stress, tau_inner, 0.01 * tau_inner);
  for (const double stress : outer)
    EXPECT_NEAR(stress, tau_outer, 0.01 * tau_outer);

  const auto rows = exit_profile("tube_die_2");
  for (const auto &[r, u] : rows)
    {
      const double exact = 0.25 * G_land * (1. - r * r + (1. - k * k) * std::log(r) / std::log(1. / k));
      EXPECT_NEAR(u, exact, 0.01 * peak) << "r = " << r;
      EXPECT_GE(r, 0.5 - 1e-12);
    }
  EXPECT_GE(rows.size(), 9u);
}

TEST(AnnularPipe, PowerLawPressureDropMatchesExactForm)
{
  // Axial flow of a power-law fluid (n = 0.5) up an annular gap 0.5 < r < 1, 4 long: the inflow gets the
  // developed annulus profile, so the computed pressure drop is G L with G from the exact form of
  // Hanks & Larsen 1979 (Ind. Eng. Chem. Fundam. 18:33; tests/reference/annulus.h) at the same flow rate;
  // within 0.5%.
  const double G    = 2.;
  const auto   flow = lentus::testing::power_law_annulus(1., 0.5, 1., 0.5, G);
  const std::string text = lentus::testing::power_law(0.5) + R"(subsection Geometry
  set Shape = Annular gap
  set Refinement = 2
  subsection Annular gap
    set Inner radius = 0.5
    set Outer radius = 1
    set Height       = 4
  end
end
subsection Flow
  set Velocity components = r z
end
subsection Boundary conditions
  set No-slip         = inner wall, outer wall
  set Inflow          = bottom
  set Inflow rates    = )" + std::to_string(flow.flow_rate) + R"(
  set Pressure        = top
  set Pressure values = 0
end
)";
  const auto result = lentus::testing::run_case("power_law_annulus", text);
  ASSERT_TRUE(result.converged) << result.reason;
  EXPECT_NEAR(result.number("mean pressure on bottom"), 4. * G, 0.005 * 4. * G);
}
