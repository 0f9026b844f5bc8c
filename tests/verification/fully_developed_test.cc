// Pressure-driven flow in a slit (planar channel) and a pipe (axisymmetric)
// against analytic flow rates. The ends carry the fully developed condition at
// a set pressure, so the whole domain is in developed flow.
#include "../reference/viscoplastic.h"
#include "run_case.h"

#include <gtest/gtest.h>
#include <petscsys.h>

#include <cmath>
#include <functional>

using lentus::testing::bingham;
using lentus::testing::power_law;
using lentus::testing::pressure_driven_pipe;
using lentus::testing::run_case;

namespace
{
  std::string channel_case(const std::string &rheology, const int refinement)
  {
    // Full gap H = 1 (h = 0.5), length 2, pressure drop 2 Pa: G = 1 Pa/m, tau_w = G h = 0.5 Pa.
    return lentus::testing::pressure_driven_channel(rheology, refinement, 2., 2.);
  }

  double relative(const double a, const double b)
  {
    return std::abs(a - b) / std::abs(b);
  }
} // namespace

class PowerLawSlit : public ::testing::TestWithParam<double>
{};

TEST_P(PowerLawSlit, FlowRateAndWallForces)
{
  const double n = GetParam();
  // Source: power-law slit flow (Bird, Stewart & Lightfoot 2002, Transport Phenomena, ch. 8, generalized
  // Newtonian fluids; from memory for the section): q = (2n/(2n+1)) (G/K)^(1/n) h^(2+1/n), G = 1 Pa/m,
  // K = 1 Pa s^n, h = 0.5 m.
  const double q      = 2. * n / (2. * n + 1.) * std::pow(0.5, 2. + 1. / n);
  const auto   result = run_case("power_law_slit_n" + std::to_string(n), channel_case(power_law(n), 3));
  ASSERT_TRUE(result.converged) << result.reason;
  EXPECT_LT(relative(result.number("flow rate out through outlet"), q), 0.005) << "n = " << n;
  // Momentum balance of developed flow (Bird, Stewart & Lightfoot 2002, sec. 2.2): the walls hold
  // the fluid against the pressure force, F_x = -dp H = -2 N/m in total, 1 N/m per wall, within 0.5%.
  EXPECT_LT(relative(result.number("x force on the fluid from bottom wall"), -1.), 0.005);
  EXPECT_LT(relative(result.number("x force on the fluid from top wall"), -1.), 0.005);
}

INSTANTIATE_TEST_SUITE_P(Verification, PowerLawSlit, ::testing::Values(0.5, 1.5));

// PETSc's GAMG on the velocity block, chosen through PETSc's options (set here in the process, as
// PETSC_OPTIONS would), gets the rigid-body modes of planar flow as its near null space and finds the
// same slit flow rate (same source as above).
TEST(PowerLawSlitIterative, GamgOnTheVelocityBlock)
{
  const double n = 0.5;
  const double q = 2. * n / (2. * n + 1.) * std::pow(0.5, 2. + 1. / n);
  ASSERT_EQ(PetscOptionsSetValue(nullptr, "-lentus_fieldsplit_u_pc_type", "gamg"), 0);
  const auto result =
    run_case("power_law_slit_gamg", channel_case(power_law(n), 3), {"Linear solver/Type=iterative"});
  PetscOptionsClearValue(nullptr, "-lentus_fieldsplit_u_pc_type");
  ASSERT_TRUE(result.converged) << result.reason;
  EXPECT_LT(relative(result.number("flow rate out through outlet"), q), 0.005);
}

class PowerLawPipe : public ::testing::TestWithParam<double>
{};

TEST_P(PowerLawPipe, FlowRateAndWallForce)
{
  const double n = GetParam();
  // Source: power-law pipe flow (Chhabra & Richardson 2008, Non-Newtonian Flow and Applied Rheology,
  // ch. 3; from memory for the equation number): Q = (pi n/(3n+1)) R^3 (tau_w/K)^(1/n), R = 1 m,
  // tau_w = G R/2 = 1 Pa, K = 1 Pa s^n.
  const double Q      = M_PI * n / (3. * n + 1.);
  const auto   result = run_case("power_law_pipe_n" + std::to_string(n), pressure_driven_pipe(power_law(n), 3));
  ASSERT_TRUE(result.converged) << result.reason;
  EXPECT_LT(relative(result.number("flow rate out through outlet"), Q), 0.005) << "n = " << n;
  // Momentum balance (Bird, Stewart & Lightfoot 2002, sec. 2.3): F_z = -dp pi R^2 = -2 pi N, within 0.5%.
  EXPECT_LT(relative(result.number("axial force on the fluid from wall"), -2. * M_PI), 0.005);
}

INSTANTIATE_TEST_SUITE_P(Verification, PowerLawPipe, ::testing::Values(0.5, 1.5));

TEST(BinghamPipe, RegularizedFlowRateAndConvergenceToBuckinghamReiner)
{
  // R = 1 m, tau_w = G R / 2 = 1 Pa, mu_p = 1 Pa s, tau_y = 0.5 Pa (phi = 0.5).
  // Source: the flow rate of the regularized law itself, tau = mu_p g + tau_y (1 - exp(-M g))
  // (Papanastasiou 1987, J. Rheol. 31:385), by quadrature of the Rabinowitsch-Mooney integral
  // (Rabinowitsch 1929, Z. Phys. Chem. A145:1; tests/reference/viscoplastic.h), at M = 10 s and 100 s;
  // and the ideal Bingham fluid's Buckingham-Reiner flow rate (Buckingham 1921, Proc. ASTM 21:1154).
  using namespace lentus::testing;
  const double buckingham_reiner = buckingham_reiner_flow_rate(1., 1., 1., 0.5);
  const double regularized_10 = papanastasiou_bingham_pipe_flow_rate(1., 1., 1., 0.5, 10.);
  const double regularized_100 = papanastasiou_bingham_pipe_flow_rate(1., 1., 1., 0.5, 100.);
  const auto coarse = run_case("bingham_pipe_10", pressure_driven_pipe(bingham(10.), 3));
  const auto sharp  = run_case("bingham_pipe_100", pressure_driven_pipe(bingham(100.), 3));
  ASSERT_TRUE(coarse.converged) << coarse.reason;
  ASSERT_TRUE(sharp.converged) << sharp.reason;
  const double q10 = coarse.number("flow rate out through outlet"), q100 = sharp.number("flow rate out through outlet");
  // Discretization error only (the regularized law is the reference): within 0.5%.
  EXPECT_LT(relative(q10, regularized_10), 0.005);
  EXPECT_LT(relative(q100, regularized_100), 0.005);
  // The error against the ideal Bingham fluid shrinks as M grows.
  EXPECT_LT(relative(q100, buckingham_reiner), relative(q10, buckingham_reiner));
  // Plug radius r_p = phi R (Buckingham 1921): the developed stress is exactly tau = G r / 2 whatever the
  // law, so the unyielded part of the meridional section is r < r_p, a fraction phi = 0.5 of it, up to
  // the quadrature-point spacing (1/24 of the radius here).
  EXPECT_NEAR(sharp.number("unyielded area fraction"), 0.5, 1. / 24.);
}

// Nonlinear solver/Line search = energy, and Newton linearization = primal, find the same solution
// as the defaults (backtracking on the residual, primal-dual Newton): the flow rate against the regularized law's own (Papanastasiou 1987; quadrature of the
// Rabinowitsch-Mooney integral, tests/reference/viscoplastic.h), and both runs' flow rates agree to the
// nonlinear tolerance.
TEST(BinghamPipe, EnergyLineSearchFindsTheSameSolution)
{
  using namespace lentus::testing;
  const double regularized = papanastasiou_bingham_pipe_flow_rate(1., 1., 1., 0.5, 100.);
  const auto   energy   = run_case("bingham_pipe_energy", pressure_driven_pipe(bingham(100.), 3), {"Nonlinear solver/Line search=energy"});
  const auto   residual = run_case("bingham_pipe_residual", pressure_driven_pipe(bingham(100.), 3));
  ASSERT_TRUE(energy.converged) << energy.reason;
  ASSERT_TRUE(residual.converged) << residual.reason;
  const double q = energy.number("flow rate out through outlet");
  EXPECT_LT(relative(q, regularized), 0.005);
  EXPECT_LT(relative(q, residual.number("flow rate out through outlet")), 1e-6);
  // Primal Newton (with its Picard start) instead of the default primal-dual one (Chan, Golub &
  // Mulet 1999) changes the path, not the solution.
  const auto primal = run_case("bingham_pipe_primal", pressure_driven_pipe(bingham(100.), 3),
                               {"Nonlinear solver/Newton linearization=primal"});
  ASSERT_TRUE(primal.converged) << primal.reason;
  EXPECT_LT(relative(primal.number("flow rate out through outlet"), q), 1e-6);
}

TEST(HerschelBulkleyPipe, FlowRate)
{
  // Source: the Herschel-Bulkley pipe flow rate derived in tests/reference/viscoplastic.h from the
  // Rabinowitsch-Mooney integral (Herschel & Bulkley 1926, Kolloid-Z. 39:291; Rabinowitsch 1929, Z. Phys.
  // Chem. A145:1): tau_w = 1 Pa, K = 1 Pa s^n, n = 0.5, tau_y = 0.3 Pa, R = 1 m (ideal law). The
  // regularization shifts Q by O(1/M): for the Bingham pipe above (phi = 0.5, shear-rate scale 1/s) the
  // quadrature of the regularized law gives about 0.9/M relative; at M = 1e4 s that is about 1e-4,
  // well under the 0.5% allowed.
  const double exact = lentus::testing::herschel_bulkley_pipe_flow_rate(1., 1., 1., 0.5, 0.3);
  // The closed form against a direct quadrature of its integral, tau^2 gamma_dot(tau) over [tau_y, tau_w].
  const auto   integrand  = [](const double tau) { return tau * tau * std::pow(tau - 0.3, 2.); };
  const double quadrature = M_PI * lentus::testing::simpson(integrand, 0.3, 1., 2000);
  EXPECT_NEAR(exact, quadrature, 1e-10 * exact);
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
  const auto result = run_case("herschel_bulkley_pipe", pressure_driven_pipe(fluid, 4));
  ASSERT_TRUE(result.converged) << result.reason;
  EXPECT_LT(relative(result.number("flow rate out through outlet"), exact), 0.005);
}
