// Mesh sequencing (Nonlinear solver/Mesh sequencing): solving first on coarser meshes and
// starting each finer mesh from the interpolated solution gives the answer of a solve from rest.
#include "run_case.h"

#include <gtest/gtest.h>

#include <fstream>
#include <sstream>

namespace
{
  std::string channel_case()
  {
    return lentus::testing::pressure_driven_channel(lentus::testing::newtonian(1.), 2, 1., 1.) + R"(
subsection Nonlinear solver
  set Mesh sequencing = 1
end
subsection Accuracy
  set Coarser meshes = 0   # only the sequencing under test
end
)";
  }
} // namespace

TEST(MeshSequencing, PoiseuilleIsCarriedOverExactly)
{
  // Analytic: plane Poiseuille flow (Bird, Stewart & Lightfoot 2002, problem 2B.3): u = G y (H - y) / (2 mu), linear
  // pressure, q = G H^3 / (12 mu) = 1/12 m^2/s for G = 1 Pa/m, H = 1 m, mu = 1 Pa s. The Q2-Q1
  // space holds it exactly, so the coarse solution interpolated to the finer mesh already solves
  // the finer problem: no iteration there, and the flow rate to round-off.
  const auto result = lentus::testing::run_case("sequencing_poiseuille", channel_case());
  ASSERT_TRUE(result.converged) << result.reason;
  ASSERT_EQ(result.meshes.size(), 2u);
  EXPECT_GT(result.meshes[1].unknowns, 3 * result.meshes[0].unknowns);
  EXPECT_EQ(result.meshes[0].newton + result.meshes[0].picard, 1u); // linear problem
  EXPECT_EQ(result.meshes[1].newton + result.meshes[1].picard, 0u);
  EXPECT_NEAR(result.number("flow rate out through outlet"), 1. / 12., 1e-10);
}

TEST(MeshSequencing, HydrostaticPressureInClosedBox)
{
  // Analytic: hydrostatic equilibrium, u = 0 and p = p0 - rho g y (exact in Q1). The box has no
  // pressure boundary, so the pressure is pinned at one unknown on each mesh; the carried-over
  // pressure must stay consistent with that pin. The walls carry the weight of the fluid:
  // rho g A = 1000 * 9.81 * 1 N/m upward on the fluid.
  const std::string text = lentus::testing::newtonian(1.) + R"(subsection Geometry
  set Shape = Cavity
  set Refinement = 3
  subsection Cavity
    set Side length = 1
  end
end
subsection Flow
  set Gravity = 0, -9.81
end
subsection Boundary conditions
  set No-slip = walls, lid
end
subsection Nonlinear solver
  set Mesh sequencing = 2
end
)";
  const auto result =
    lentus::testing::run_case("sequencing_hydrostatic", text, {"Rheology/Density=1000"});
  ASSERT_TRUE(result.converged) << result.reason;
  ASSERT_EQ(result.meshes.size(), 3u);
  EXPECT_EQ(result.meshes[2].newton + result.meshes[2].picard, 0u);
  EXPECT_NEAR(result.number("y force on the fluid from walls") + result.number("y force on the fluid from lid"), 9810.,
              1e-8 * 9810.);
}

TEST(MeshSequencing, BinghamCavitySameAnswerAsFromRest)
{
  // Consistency (common practice): the same discrete problem, solved from rest and along the
  // mesh sequence, to the same nonlinear tolerance (1e-8 relative residual): the design numbers
  // agree far below the discretization error. Bingham cavity, Bn = 20, M = 1000 s, level 4.
  std::ifstream     input(std::string(LENTUS_SOURCE_DIR) + "/tests/verification/cases/bingham_cavity.prm");
  std::stringstream text;
  text << input.rdbuf();
  // automatic: 2.5e3 unknowns, below the 3e4 at which sequencing starts: one mesh (no coarser meshes
  // for the mesh error either, so that only the sequencing is under test).
  const auto from_rest =
    lentus::testing::run_case("sequencing_cavity_rest", text.str(), {"Accuracy/Coarser meshes=0"});
  const auto sequenced = lentus::testing::run_case(
    "sequencing_cavity", text.str(), {"Nonlinear solver/Mesh sequencing=2", "Accuracy/Coarser meshes=0"});
  ASSERT_TRUE(from_rest.converged) << from_rest.reason;
  ASSERT_TRUE(sequenced.converged) << sequenced.reason;
  ASSERT_EQ(from_rest.meshes.size(), 1u);
  ASSERT_EQ(sequenced.meshes.size(), 3u);
  EXPECT_EQ(sequenced.meshes[2].unknowns, from_rest.meshes[0].unknowns);
  for (const char *name : {"torque on the fluid from lid", "x force on the fluid from lid", "viscous dissipation"})
    EXPECT_NEAR(sequenced.number(name), from_rest.number(name), 1e-6 * std::abs(from_rest.number(name))) << name;
  EXPECT_NEAR(sequenced.number("unyielded area fraction"), from_rest.number("unyielded area fraction"), 1e-3);
}
