// The Bingham lid-driven cavity at Bn = 20, M = 1000 s: a robustness check of the nonlinear solver
// (it must converge from rest), not a verification against a published solution. Published
// solutions of this flow exist (Mitsoulis & Zisis 2001, J. Non-Newtonian Fluid Mech. 101:173;
// Syrakos, Georgiou & Alexandrou 2013, J. Non-Newtonian Fluid Mech. 195:19; from memory), but
// their tables were not at hand, so no number of theirs is checked here: this is a consistency
// check. (tests/verification/mesh_sequencing_test.cc compares this case sequenced and unsequenced.)
#include "run_case.h"

#include <gtest/gtest.h>

#include <fstream>
#include <sstream>

TEST(BinghamCavity, ConvergesFromRestAtBn20)
{
  std::ifstream     input(std::string(LENTUS_SOURCE_DIR) + "/tests/verification/cases/bingham_cavity.prm");
  std::stringstream text;
  text << input.rdbuf();
  const auto result = lentus::testing::run_case("bingham_cavity", text.str());
  ASSERT_TRUE(result.converged) << result.reason;
  // The one energy check kept in the suite, and it holds by construction: the power put in is computed
  // from the reactions of the discrete equations (the unconstrained residual) times the wall velocity,
  // and testing the discrete equations with the discrete solution itself gives exactly the discrete
  // dissipation. So it checks the post-processing (reactions and the dissipation integral agree, to the
  // solver tolerance), not the viscosity law or the solution.
  EXPECT_NEAR(result.number("power input through boundaries"), result.number("viscous dissipation"),
              1e-6 * result.number("viscous dissipation"));
  // At Bn = 20 rigid zones fill much of the cavity (common practice: a loose plausibility bound only).
  EXPECT_GT(result.number("unyielded area fraction"), 0.3);
  EXPECT_LT(result.number("unyielded area fraction"), 0.9);
}
