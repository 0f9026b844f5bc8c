// Error bars that tell the truth, and adaptive refinement that buys accuracy cheaply, on flows
// with exact answers.
#include "../reference/viscoplastic.h"
#include "run_case.h"
#include "solver/report/accuracy.h"

#include <gtest/gtest.h>

#include <cmath>

using lentus::testing::relative_difference;
using lentus::testing::run_case;

namespace
{
  /// The value's error bar (mesh + regularization); fails the test if there is none.
  double error_bar(const lentus::flow::RunResult &result, const std::string &name)
  {
    const lentus::report::DesignNumber *number = result.numbers.find(name);
    EXPECT_NE(number, nullptr) << name;
    if (!number)
      return 0.;
    const auto error = lentus::report::total_error(number->accuracy);
    EXPECT_TRUE(error.has_value()) << name << " has no error bar";
    return error.value_or(0.);
  }

  /// The bar contains the true error |value - exact| and is at most `factor` times larger.
  void expect_truthful(const lentus::flow::RunResult &result, const std::string &name, const double exact,
                       const double factor = 10.)
  {
    const double value = result.number(name), bar = error_bar(result, name);
    const double truth = std::abs(value - exact);
    EXPECT_GE(bar, truth) << name << ": " << value << " +/- " << bar << ", exact " << exact;
    EXPECT_LE(bar, factor * truth) << name << ": " << value << " +/- " << bar << ", exact " << exact;
  }
} // namespace

// Power-law slit, n = 0.5 (no regularization: the bar is the mesh error alone). Source: q =
// (2n/(2n+1)) (G/K)^(1/n) h^(2+1/n) (Bird, Stewart & Lightfoot 2002, Transport Phenomena, ch. 8; from
// memory for the section), G = 1 Pa/m, K = 1 Pa s^n, h = 0.5 m.
TEST(ErrorBars, PowerLawSlitFlowRate)
{
  const double n      = 0.5;
  const double q      = 2. * n / (2. * n + 1.) * std::pow(0.5, 2. + 1. / n);
  const auto   result = run_case("error_bar_power_law_slit",
                               lentus::testing::pressure_driven_channel(lentus::testing::power_law(n), 3, 2., 2.));
  ASSERT_TRUE(result.converged) << result.reason;
  ASSERT_EQ(result.meshes.size(), 3u); // two coarser meshes for the error estimate by default
  expect_truthful(result, "flow rate out through outlet", q);
}

// Bingham pipe at M = 100 s against the ideal fluid: the Buckingham-Reiner flow rate (Buckingham 1921,
// Proc. ASTM 21:1154). The regularization error bar contains the true difference between the
// regularized law's own flow rate (Papanastasiou 1987, J. Rheol. 31:385; by quadrature of the
// Rabinowitsch-Mooney integral, tests/reference/viscoplastic.h) and the ideal fluid's, and the
// extrapolated value is closer to the ideal fluid's than the computed one. The plug radius
// r_p = (tau_y / tau_w) R = 0.5 m (Buckingham 1921): the unyielded area fraction 0.5 of the section.
TEST(ErrorBars, BinghamPipeFlowRateAgainstBuckinghamReiner)
{
  using namespace lentus::testing;
  const double ideal       = buckingham_reiner_flow_rate(1., 1., 1., 0.5);
  const double regularized = papanastasiou_bingham_pipe_flow_rate(1., 1., 1., 0.5, 100.);
  const auto   result      = run_case("error_bar_bingham_pipe", lentus::testing::pressure_driven_pipe(lentus::testing::bingham(100.), 3));
  ASSERT_TRUE(result.converged) << result.reason;
  const std::string                   name   = "flow rate out through outlet";
  const lentus::report::DesignNumber &number = *result.numbers.find(name);
  ASSERT_TRUE(number.accuracy.regularization_error.has_value());
  EXPECT_GE(*number.accuracy.regularization_error, std::abs(regularized - ideal));
  EXPECT_LE(*number.accuracy.regularization_error, 10. * std::abs(regularized - ideal));
  ASSERT_TRUE(number.accuracy.extrapolated.has_value());
  EXPECT_LT(std::abs(*number.accuracy.extrapolated - ideal), 0.2 * std::abs(number.value - ideal));
  expect_truthful(result, name, ideal);
  EXPECT_NEAR(result.number("unyielded area fraction"), 0.5, 1. / 24.);
}

// Bingham Couette flow: the torque on the inner cylinder at the rotation rate of inner wall stress
// tau_i = 3 Pa is 2 pi R_i^2 tau_i H (momentum balance; Bird, Dai & Yarusso 1983, Rev. Chem. Eng. 1:1;
// tests/reference/viscoplastic.h), and the yield radius r_y = R_i sqrt(tau_i / tau_y) = sqrt(3) m
// (Reiner & Riwlin 1927, Kolloid-Z. 43:1).
TEST(ErrorBars, BinghamCouetteTorque)
{
  const auto exact  = lentus::testing::bingham_couette(1., 3., 1., 1.);
  const auto result = run_case("error_bar_bingham_couette", lentus::testing::bingham_couette_case(exact.rotation_rate, 3));
  ASSERT_TRUE(result.converged) << result.reason;
  expect_truthful(result, "torque on the fluid from inner wall", 2. * M_PI * 3. * 0.25);
}

// Adaptive refinement at the yield surface: one cycle from the uniform mesh of refinement 3 finds the
// yield radius sqrt(3) m within 0.2%, with fewer unknowns than the first uniform mesh that does
// (refinement 4; refinement 3 does not). The yield radius is R_o - (unyielded area fraction) (R_o - R_i):
// the unyielded region is r_y < r < R_o over the whole height.
TEST(AdaptiveRefinement, BinghamCouetteYieldRadius)
{
  const auto   exact        = lentus::testing::bingham_couette(1., 3., 1., 1.);
  const auto   yield_radius = [](const lentus::flow::RunResult &result) {
    return 2. - result.number("unyielded area fraction");
  };
  const auto adapted = run_case("adaptive_couette", lentus::testing::bingham_couette_case(exact.rotation_rate, 3),
                                {"Accuracy/Adaptive cycles=1", "Accuracy/Refine at=yield surface"});
  const auto uniform_3 = run_case("uniform_couette_3", lentus::testing::bingham_couette_case(exact.rotation_rate, 3));
  const auto uniform_4 = run_case("uniform_couette_4", lentus::testing::bingham_couette_case(exact.rotation_rate, 4));
  for (const auto *result : {&adapted, &uniform_3, &uniform_4})
    ASSERT_TRUE(result->converged) << result->reason;
  ASSERT_EQ(adapted.meshes.back().refinement.rfind("adaptive cycle 1", 0), 0u);
  EXPECT_LE(relative_difference(yield_radius(adapted), exact.yield_radius), 0.002);
  EXPECT_GT(relative_difference(yield_radius(uniform_3), exact.yield_radius), 0.002);
  EXPECT_LE(relative_difference(yield_radius(uniform_4), exact.yield_radius), 0.002);
  EXPECT_LT(adapted.meshes.back().unknowns, uniform_4.meshes.back().unknowns);
}

// A target relative error stops the cycles once met, and a budget of unknowns stops them with the
// target not met (the run still succeeds). Power-law slit as above.
TEST(AdaptiveRefinement, TargetAndBudget)
{
  const std::string text =
    lentus::testing::pressure_driven_channel(lentus::testing::power_law(0.5), 2, 2., 2.);
  const auto met = run_case("target_met", text,
                            {"Accuracy/Adaptive cycles=6", "Accuracy/Refine at=velocity jumps",
                             "Accuracy/Target relative error=0.002", "Accuracy/Targeted numbers=flow rate out through outlet"});
  ASSERT_TRUE(met.converged) << met.reason;
  EXPECT_TRUE(met.target_met) << met.target_status;
  const lentus::report::DesignNumber &q = *met.numbers.find("flow rate out through outlet");
  EXPECT_LE(*lentus::report::total_error(q.accuracy), 0.002 * std::abs(q.value));
  EXPECT_LT(met.meshes.size(), 3u + 6u); // stopped before the last cycle
  const auto spent = run_case("target_budget", text,
                              {"Accuracy/Adaptive cycles=6", "Accuracy/Target relative error=1e-9",
                               "Accuracy/Maximum unknowns=2000"});
  ASSERT_TRUE(spent.converged) << spent.reason;
  EXPECT_FALSE(spent.target_met);
  EXPECT_NE(spent.target_status.find("budget spent"), std::string::npos) << spent.target_status;
  EXPECT_LE(spent.meshes.back().unknowns, 2000u);
}
