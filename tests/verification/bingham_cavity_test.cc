// The Bingham lid-driven cavity at Bn = 20, M = 1000 s converges from rest.
#include "run_case.h"

#include <gtest/gtest.h>

#include <fstream>
#include <sstream>

TEST(BinghamCavity, ConvergesFromRestAndBalancesEnergy)
{
  std::ifstream     input(std::string(LENTUS_SOURCE_DIR) + "/tests/verification/cases/bingham_cavity.prm");
  std::stringstream text;
  text << input.rdbuf();
  const auto result = lentus::testing::run_case("bingham_cavity", text.str());
  ASSERT_TRUE(result.converged) << result.reason;
  // Analytic (virtual power with the discrete solution as test function): the lid's power equals
  // the viscous dissipation, to the solver tolerance.
  EXPECT_NEAR(result.number("power input through boundaries"), result.number("viscous dissipation"),
              1e-6 * result.number("viscous dissipation"));
  // The torques of lid and walls on the fluid balance (no body force, creeping flow).
  EXPECT_NEAR(result.number("torque on the fluid from lid"), -result.number("torque on the fluid from walls"),
              1e-6 * std::abs(result.number("torque on the fluid from lid")));
  // At Bn = 20 most of the cavity is unyielded (common practice: rigid zones fill the lower cavity
  // at large Bingham numbers); a loose plausibility bound only.
  EXPECT_GT(result.number("unyielded area fraction"), 0.3);
  EXPECT_LT(result.number("unyielded area fraction"), 0.9);
}
