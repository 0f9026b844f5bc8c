// Pressure-driven flow in a slit (planar channel) and a pipe (axisymmetric)
// against analytic flow rates. The ends carry the fully developed condition at
// a set pressure, so the whole domain is in developed flow.
#include "run_case.h"

#include <gtest/gtest.h>

#include <cmath>
#include <functional>

using lentus::testing::power_law;
using lentus::testing::run_case;

namespace
{
  std::string channel_case(const std::string &rheology, const int refinement)
  {
    // Full gap H = 1 (h = 0.5), length 2, pressure drop 2 Pa: G = 1 Pa/m, tau_w = G h = 0.5 Pa.
    return lentus::testing::pressure_driven_channel(rheology, refinement, 2., 2.);
  }

  std::string pipe_case(const std::string &rheology, const int refinement, const double pressure_drop = 2.)
  {
    // Radius 1, length 1: G = pressure drop, tau_w = G R / 2.
    return rheology + R"(
subsection Geometry
  set Shape = Pipe
  set Refinement = )" + std::to_string(refinement) + R"(
  subsection Pipe
    set Radius = 1
    set Length = 1
  end
end
subsection Flow
  set Formulation = axisymmetric
end
subsection Boundary conditions
  set No-slip = wall
  set Axis = axis
  set Pressure = inlet, outlet
  set Pressure values = )" + std::to_string(pressure_drop) + R"(, 0
end
)";
  }

  std::string bingham(const double M)
  {
    return R"(subsection Rheology
  set Viscosity law = Bingham
  subsection Bingham
    set Plastic viscosity = 1
    set Yield stress = 0.5
    set Regularization exponent = )" + std::to_string(M) + R"(
  end
end
)";
  }

  double relative(const double a, const double b)
  {
    return std::abs(a - b) / std::abs(b);
  }
} // namespace

class PowerLawSlit : public ::testing::TestWithParam<double>
{};

TEST_P(PowerLawSlit, FlowRateAndEnergyBalance)
{
  const double n = GetParam();
  // Source: Bird, Stewart & Lightfoot, Transport Phenomena (power-law slit flow); CHECKS.md A1:
  // q = (2n/(2n+1)) (G/K)^(1/n) h^(2+1/n), G = 1 Pa/m, K = 1 Pa s^n, h = 0.5 m.
  const double q      = 2. * n / (2. * n + 1.) * std::pow(0.5, 2. + 1. / n);
  const auto   result = run_case("power_law_slit_n" + std::to_string(n), channel_case(power_law(n), 3));
  ASSERT_TRUE(result.converged) << result.reason;
  EXPECT_LT(relative(result.number("flow rate out through outlet"), q), 0.005) << "n = " << n;
  // Momentum balance of developed flow (Bird, Stewart & Lightfoot 2002, sec. 2.2): the walls hold
  // the fluid against the pressure force, F_x = -dp H = -2 N/m in total, 1 N/m per wall, within 0.5%.
  EXPECT_LT(relative(result.number("x force on the fluid from bottom wall"), -1.), 0.005);
  EXPECT_LT(relative(result.number("x force on the fluid from top wall"), -1.), 0.005);
  // Analytic (virtual power): power input = viscous dissipation, within 0.5%.
  EXPECT_LT(relative(result.number("power input through boundaries"), result.number("viscous dissipation")), 0.005);
}

INSTANTIATE_TEST_SUITE_P(Verification, PowerLawSlit, ::testing::Values(0.5, 1.5));

class PowerLawPipe : public ::testing::TestWithParam<double>
{};

TEST_P(PowerLawPipe, FlowRateAndEnergyBalance)
{
  const double n = GetParam();
  // Source: CHECKS.md A2 (Chhabra & Richardson 2008, ch. 3): Q = (pi n/(3n+1)) R^3 (tau_w/K)^(1/n),
  // R = 1 m, tau_w = G R/2 = 1 Pa, K = 1 Pa s^n.
  const double Q      = M_PI * n / (3. * n + 1.);
  const auto   result = run_case("power_law_pipe_n" + std::to_string(n), pipe_case(power_law(n), 3));
  ASSERT_TRUE(result.converged) << result.reason;
  EXPECT_LT(relative(result.number("flow rate out through outlet"), Q), 0.005) << "n = " << n;
  // Momentum balance (Bird, Stewart & Lightfoot 2002, sec. 2.3): F_z = -dp pi R^2 = -2 pi N, within 0.5%.
  EXPECT_LT(relative(result.number("axial force on the fluid from wall"), -2. * M_PI), 0.005);
  EXPECT_LT(relative(result.number("power input through boundaries"), result.number("viscous dissipation")), 0.005);
}

INSTANTIATE_TEST_SUITE_P(Verification, PowerLawPipe, ::testing::Values(0.5, 1.5));

TEST(BinghamPipe, RegularizedFlowRateAndConvergenceToBuckinghamReiner)
{
  // Source: CHECKS.md A5 [computed by quadrature of the regularized law]: R = 1, tau_w = 1, mu_p = 1,
  // tau_y = 0.5; Q_reg(m = 10) = 0.317774, Q_reg(m = 100) = 0.280702; Buckingham-Reiner
  // (Buckingham 1921; CHECKS.md A3) Q = (pi R^4 G/(8 mu_p)) [1 - 4/3 phi + phi^4/3] = 0.278162.
  const double buckingham_reiner = M_PI * 2. / 8. * (1. - 4. / 3. * 0.5 + std::pow(0.5, 4) / 3.);
  EXPECT_NEAR(buckingham_reiner, 0.278162, 1e-6);
  const auto coarse = run_case("bingham_pipe_10", pipe_case(bingham(10.), 3));
  const auto sharp  = run_case("bingham_pipe_100", pipe_case(bingham(100.), 3));
  ASSERT_TRUE(coarse.converged) << coarse.reason;
  ASSERT_TRUE(sharp.converged) << sharp.reason;
  const double q10 = coarse.number("flow rate out through outlet"), q100 = sharp.number("flow rate out through outlet");
  EXPECT_LT(relative(q10, 0.317774), 0.005);
  EXPECT_LT(relative(q100, 0.280702), 0.005);
  // The error against the ideal Bingham fluid shrinks as M grows.
  EXPECT_LT(relative(q100, buckingham_reiner), relative(q10, buckingham_reiner));
  EXPECT_LT(relative(sharp.number("power input through boundaries"), sharp.number("viscous dissipation")), 0.005);
  // Plug radius r_p = phi R (Buckingham-Reiner; CHECKS.md A3): the developed stress is exactly
  // tau = G r / 2 whatever the law, so the unyielded part of the meridional section is r < r_p,
  // a fraction phi = 0.5 of it, up to the quadrature-point spacing (1/24 of the radius here).
  EXPECT_NEAR(sharp.number("unyielded area fraction"), 0.5, 1. / 24.);
}

TEST(HerschelBulkleyPipe, FlowRate)
{
  // Source: CHECKS.md A4 [derived, checked by quadrature]: tau_w = 1, K = 1, n = 0.5, tau_y = 0.3, R = 1:
  // Q = 0.251073 (ideal law). With M = 1e4 s the regularization shifts Q by well under 0.5%
  // (A5: about 0.087/M relative for a Bingham fluid at phi = 0.5).
  const std::string fluid = R"(subsection Rheology
  set Viscosity law = Herschel-Bulkley
  subsection Herschel-Bulkley
    set Consistency = 1
    set Flow index = 0.5
    set Yield stress = 0.3
    set Regularization exponent = 1e4
    set Shear-rate floor = 1e-10
  end
end
)";
  const auto result = run_case("herschel_bulkley_pipe", pipe_case(fluid, 4));
  ASSERT_TRUE(result.converged) << result.reason;
  EXPECT_LT(relative(result.number("flow rate out through outlet"), 0.251073), 0.005);
}
