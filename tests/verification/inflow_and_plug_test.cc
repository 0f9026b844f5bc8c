// Inflow at a set flow rate with the fluid's own developed profile, and the
// plug of a Bingham fluid in a slit.
#include "run_case.h"

#include <gtest/gtest.h>

#include <cmath>

TEST(InflowProfile, PowerLawPipePressureDrop)
{
  // Source: power-law pipe flow (Chhabra & Richardson 2008, Non-Newtonian Flow and Applied Rheology,
  // ch. 3; from memory for the equation number): for Q = (pi n/(3n+1)) R^3 (tau_w/K)^(1/n) the wall
  // stress is tau_w, and the force balance gives the developed pressure drop 2 L tau_w / R. With n = 0.5,
  // K = 1 Pa s^n, R = 1 m, L = 2 m, tau_w = 1 Pa: Q = 0.2 pi m^3/s, pressure drop 4 Pa. The inflow carries
  // the developed profile, so the whole pipe is developed: within 0.5%.
  const double      Q    = M_PI * 0.5 / 2.5;
  const std::string text = R"(subsection Rheology
  set Viscosity law = Power law
  subsection Power law
    set Consistency = 1
    set Flow index = 0.5
    set Maximum viscosity = 1e8
  end
end
)";
  const auto result =
    lentus::testing::run_case("inflow_power_law_pipe", lentus::testing::inflow_pipe(text, 3, 1., 2., Q));
  ASSERT_TRUE(result.converged) << result.reason;
  EXPECT_NEAR(result.number("flow rate out through inlet"), -Q, 1e-3 * Q);
  EXPECT_NEAR(result.number("flow rate out through outlet"), Q, 1e-3 * Q);
  EXPECT_NEAR(result.number("pressure drop inlet to outlet"), 4., 0.005 * 4.);
}

TEST(BinghamSlit, PlugWidthAndFlowRate)
{
  // Source: Bingham slit flow (Buckingham 1921, Proc. ASTM 21:1154; Bird, Dai & Yarusso 1983, Rev. Chem.
  // Eng. 1:1): slit of half-gap h = 0.5 m,
  // G = 1 Pa/m, mu_p = 1 Pa s, tau_y = 0.25 Pa: tau_w = G h = 0.5 Pa, phi = 0.5, plug half-width
  // y_p = phi h, q = (2 h^3 G / (3 mu_p)) [1 - 3/2 phi + phi^3 / 2].
  // The developed stress is exactly tau = G |y| whatever the law, so the unyielded (|tau| < tau_y)
  // fraction of the channel is phi = 0.5 up to the quadrature-point spacing (1/48 of the gap here);
  // the flow rate carries the regularization error O(1/M) (M = 1e4 s): within 0.5%.
  const std::string text = lentus::testing::pressure_driven_channel(R"(subsection Rheology
  set Viscosity law = Bingham
  subsection Bingham
    set Plastic viscosity = 1
    set Yield stress = 0.25
    set Regularization exponent = 1e4
  end
end
)", 4, 1., 1.);
  const auto result = lentus::testing::run_case("bingham_slit", text);
  ASSERT_TRUE(result.converged) << result.reason;
  const double phi = 0.5, h = 0.5;
  const double q   = 2. * h * h * h / 3. * (1. - 1.5 * phi + 0.5 * phi * phi * phi);
  EXPECT_NEAR(result.number("flow rate out through outlet"), q, 0.005 * q);
  EXPECT_NEAR(result.number("unyielded area fraction"), phi, 1. / 48.);
}

namespace
{
  /// Newtonian (mu = 1 Pa s) channel 0 < x < 10 m, 0 < y < 1 m, inlet at x = 0, outlet at a set pressure.
  std::string channel(const std::string &conditions)
  {
    return lentus::testing::newtonian(1.) + R"(subsection Geometry
  set Shape = Channel
  set Refinement = 3
  subsection Channel
    set Length = 10
    set Height = 1
  end
end
subsection Boundary conditions
)" + conditions + R"(  set Pressure        = outlet
  set Pressure values = 0
end
)";
  }
} // namespace

TEST(InflowProfile, HalfSlitBesideASymmetryPlane)
{
  // The channel is the upper half of a slit of half-gap h = 1 m (symmetry at y = 0). Plane Poiseuille
  // (Bird, Stewart & Lightfoot 2002, Transport Phenomena, problem 2B.3, from memory for the number): the
  // full slit carries q = (2/3) G h^3 / mu, the half q/2 = 1/3 m^2/s at G = 1 Pa/m. The inflow is
  // developed, so the pressure drop over 10 m is 10 Pa within 0.5%.
  const auto result = lentus::testing::run_case(
    "inflow_half_slit", channel("  set No-slip = top wall\n  set Symmetry = bottom wall\n  set Inflow = inlet\n"
                                "  set Inflow rates = 0.3333333333333333\n"));
  ASSERT_TRUE(result.converged) << result.reason;
  EXPECT_NEAR(result.number("pressure drop inlet to outlet"), 10., 0.005 * 10.);
}

TEST(UniformInflow, PlugEntersAndDevelops)
{
  // A plug U = 0.5 m/s enters a slit of gap H = 1 m. The inlet's end nodes belong to the walls (u = 0),
  // so the plug carries q = U H less a corner piece of the end cells (analytic: less than one cell of
  // 8 here). Continuity (exact: constants are in the pressure space): the outflow equals the inflow.
  // Far from the inlet the flow is plane Poiseuille (Bird, Stewart & Lightfoot 2002, problem 2B.3): wall shear stress
  // 6 mu q / H^2, within 1% beyond 5 gaps from the inlet.
  const auto result = lentus::testing::run_case(
    "uniform_inflow", channel("  set No-slip = bottom wall, top wall\n  set Uniform inflow = inlet\n"
                              "  set Inflow speeds = 0.5\n"));
  ASSERT_TRUE(result.converged) << result.reason;
  const double q = -result.number("flow rate out through inlet");
  EXPECT_LT(q, 0.5);
  EXPECT_GT(q, 0.5 * (1. - 1. / 8.));
  EXPECT_NEAR(result.number("flow rate out through outlet"), q, 1e-8 * q);
  const auto stresses = lentus::testing::wall_stresses("uniform_inflow", "bottom wall", 0, 5., 9.5);
  EXPECT_GE(stresses.size(), 10u);
  for (const double stress : stresses)
    EXPECT_NEAR(stress, 6. * q, 0.01 * 6. * q);
  // The plug needs extra pressure to develop: more than the developed 12 mu q L / H^3.
  EXPECT_GT(result.number("pressure drop inlet to outlet"), 120. * q);
}
