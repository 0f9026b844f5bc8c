// Meshes imported from Gmsh files (written by Gmsh 4.8 from the .geo files in
// tests/verification/meshes/, unstructured quadrilaterals) carry developed channel and
// pipe flow as the built-in shapes do: the same analytic checks, the same tolerance.
#include "run_case.h"

#include <gtest/gtest.h>

#include <cmath>

using lentus::testing::power_law;
using lentus::testing::run_case;

namespace
{
  const std::string meshes = std::string(LENTUS_SOURCE_DIR) + "/tests/verification/meshes/";

  std::string gmsh_geometry(const std::string &file, const double scale, const int refinement)
  {
    return R"(subsection Geometry
  set Shape = Gmsh mesh
  set Refinement = )" + std::to_string(refinement) + R"(
  subsection Gmsh mesh
    set File = )" + meshes + file + R"(
    set Scale = )" + std::to_string(scale) + R"(
  end
end
)";
  }

  double relative(const double a, const double b)
  {
    return std::abs(a - b) / std::abs(b);
  }
} // namespace

TEST(GmshMesh, PowerLawSlitFromMsh22)
{
  // Channel 2 x 1 (h = 0.5 m), pressure drop 2 Pa: G = 1 Pa/m, K = 1 Pa s^n, n = 0.5.
  // Source: power-law slit flow (Bird, Stewart & Lightfoot 2002, Transport Phenomena, ch. 8; from memory
  // for the section):
  // q = (2n/(2n+1)) (G/K)^(1/n) h^(2+1/n); within 0.5%, as the built-in Channel in fully_developed_test.
  const double n = 0.5;
  const double q = 2. * n / (2. * n + 1.) * std::pow(0.5, 2. + 1. / n);
  const auto   result = run_case("gmsh_power_law_slit", power_law(n) + gmsh_geometry("channel_msh22.msh", 1., 3) + R"(
subsection Boundary conditions
  set No-slip = bottom wall, top wall
  set Pressure = inlet, outlet
  set Pressure values = 2, 0
end
)");
  ASSERT_TRUE(result.converged) << result.reason;
  EXPECT_LT(relative(result.number("flow rate out through outlet"), q), 0.005);
}

TEST(GmshMesh, NewtonianInflowByMassFromMsh41Scaled)
{
  // The channel mesh scaled by 0.5: L = 1 m, H = 0.5 m (half-gap h = 0.25 m); mu = 1 Pa s; fed by
  // mass at 10 kg/(s m) with rho = 1000 kg/m^3, i.e. Q = 0.01 m^2/s per metre of depth.
  // Source: White (2006), Viscous Fluid Flow, 3rd ed., eq. 3-39 (plane Poiseuille flow):
  // dp = 3 mu Q L / (2 h^3) = 0.96 Pa; within 0.5%.
  const double dp     = 3. * 1. * 0.01 * 1. / (2. * std::pow(0.25, 3));
  const auto   result = run_case("gmsh_newtonian_inflow", R"(subsection Rheology
  set Viscosity law = Newtonian
  set Density = 1000
  subsection Newtonian
    set Viscosity = 1
  end
end
)" + gmsh_geometry("channel_msh41.msh", 0.5, 2) + R"(
subsection Boundary conditions
  set No-slip = bottom wall, top wall
  set Inflow = inlet
  set Inflow mass rates = 10
  set Pressure = outlet
  set Pressure values = 0
end
)");
  ASSERT_TRUE(result.converged) << result.reason;
  EXPECT_LT(relative(result.number("pressure drop inlet to outlet"), dp), 0.005);
  // Mass conservation: what enters by the set mass rate leaves through the outlet, within 0.5%.
  EXPECT_LT(relative(result.number("flow rate out through outlet"), 0.01), 0.005);
}

TEST(GmshMesh, PowerLawPipeFromMsh41)
{
  // Pipe R = 1 m, L = 1 m, pressure drop 2 Pa: tau_w = G R / 2 = 1 Pa, K = 1 Pa s^n, n = 0.5.
  // Source: power-law pipe flow (Chhabra & Richardson 2008, Non-Newtonian Flow and Applied Rheology, ch. 3;
  // from memory for the equation number): Q = (pi n/(3n+1)) R^3 (tau_w/K)^(1/n); within 0.5%.
  const double n      = 0.5;
  const double Q      = M_PI * n / (3. * n + 1.);
  const auto   result = run_case("gmsh_power_law_pipe", power_law(n) + gmsh_geometry("pipe.msh", 1., 3) + R"(
subsection Flow
  set Velocity components = r z
end
subsection Boundary conditions
  set No-slip = wall
  set Axis = axis
  set Pressure = inlet, outlet
  set Pressure values = 2, 0
end
)");
  ASSERT_TRUE(result.converged) << result.reason;
  EXPECT_LT(relative(result.number("flow rate out through outlet"), Q), 0.005);
  // Momentum balance (Bird, Stewart & Lightfoot 2002, sec. 2.3): F_z = -dp pi R^2 = -2 pi N, within 0.5%.
  EXPECT_LT(relative(result.number("axial force on the fluid from wall"), -2. * M_PI), 0.005);
}

TEST(GmshMesh, AdaptedUnstructuredMeshKeepsTheSlitFlowAndItsBar)
{
  // The same slit flow on the unstructured Gmsh channel refined by two adaptive cycles at the
  // velocity jumps (hanging nodes between cells of different levels). Source as above (Bird, Stewart &
  // Lightfoot 2002, ch. 8): q = (2n/(2n+1)) (G/K)^(1/n) h^(2+1/n), n = 0.5. The flow rate stays within
  // 0.5%, the fluid is conserved across the hanging nodes (inlet and outlet rates agree to 1e-9), and
  // the error bar contains the true error.
  const double n = 0.5;
  const double q = 2. * n / (2. * n + 1.) * std::pow(0.5, 2. + 1. / n);
  const auto   result = run_case("gmsh_adapted_power_law_slit", power_law(n) + gmsh_geometry("channel_msh22.msh", 1., 2) + R"(
subsection Boundary conditions
  set No-slip = bottom wall, top wall
  set Pressure = inlet, outlet
  set Pressure values = 2, 0
end
subsection Accuracy
  set Adaptive cycles = 2
  set Refine at = velocity jumps
end
)");
  ASSERT_TRUE(result.converged) << result.reason;
  ASSERT_EQ(result.meshes.back().refinement.rfind("adaptive cycle 2", 0), 0u);
  const double outlet = result.number("flow rate out through outlet");
  EXPECT_LT(relative(outlet, q), 0.005);
  EXPECT_LT(relative(-result.number("flow rate out through inlet"), outlet), 1e-9);
  const auto &accuracy = result.numbers.find("flow rate out through outlet")->accuracy;
  ASSERT_TRUE(accuracy.mesh_error.has_value());
  EXPECT_GE(*accuracy.mesh_error, std::abs(outlet - q));
}
