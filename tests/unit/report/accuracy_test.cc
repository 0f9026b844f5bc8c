// The error estimates of solver/report/accuracy.h on sequences whose limit is known exactly:
// phi(h) = phi_0 + C h^p on meshes of N cells, h = N^(-1/2) (Celik et al. 2008, J. Fluids Eng.
// 130:078001, eqs. 1-8; Roache 1994, J. Fluids Eng. 116:405), and a regularized value that
// approaches its limit as 1/M.
#include "solver/report/accuracy.h"

#include <gtest/gtest.h>

#include <cmath>

using namespace lentus::report;

namespace
{
  /// phi_0 + C h^p on meshes of `cells` cells (h = cells^(-1/2)).
  std::vector<MeshValue> power_sequence(const std::vector<double> &cells, const double phi_0, const double C,
                                        const double p)
  {
    std::vector<MeshValue> sequence;
    for (const double N : cells)
      sequence.push_back({N, phi_0 + C * std::pow(N, -p / 2.)});
    return sequence;
  }
} // namespace

// Three uniformly refined meshes (r = 2): the observed order is p and Richardson's extrapolation
// (Celik et al. eq. 6) is exact for an exact power law; the GCI is 1.25 |phi_1 - phi_2| / (r^p - 1).
TEST(MeshError, ThreeMeshesRecoverOrderAndLimit)
{
  for (const double p : {1., 2., 3.})
    {
      const auto sequence = power_sequence({100., 400., 1600.}, 5., 3., p);
      const auto estimate = estimate_mesh_error(sequence);
      ASSERT_TRUE(estimate);
      EXPECT_TRUE(estimate->observed);
      EXPECT_NEAR(estimate->order, p, 1e-9);
      EXPECT_NEAR(estimate->extrapolated, 5., 1e-12);
      const double change = std::abs(sequence[2].value - sequence[1].value);
      EXPECT_NEAR(estimate->error, 1.25 * change / (std::pow(2., p) - 1.), 1e-12);
      // The bar contains the true error of the finest value, with the factor 1.25 to spare.
      EXPECT_NEAR(estimate->error / std::abs(sequence[2].value - 5.), 1.25, 1e-9);
    }
}

// Unequal refinement ratios (adaptive cycles): the fixed-point iteration of Celik et al. eq. 3 with
// q(p) = ln((r21^p - s) / (r32^p - s)) still recovers the order and the limit.
TEST(MeshError, UnequalRatiosUseTheFixedPointIteration)
{
  const auto sequence = power_sequence({1000., 1900., 3500.}, -2., 40., 1.5);
  const auto estimate = estimate_mesh_error(sequence);
  ASSERT_TRUE(estimate);
  EXPECT_TRUE(estimate->observed);
  EXPECT_NEAR(estimate->order, 1.5, 1e-8);
  EXPECT_NEAR(estimate->extrapolated, -2., 1e-9);
}

// Only the last three meshes count: a fourth, coarser one with another behaviour changes nothing.
TEST(MeshError, UsesTheLastThreeMeshes)
{
  auto sequence = power_sequence({100., 400., 1600.}, 1., 1., 2.);
  const auto three = estimate_mesh_error(sequence);
  sequence.insert(sequence.begin(), MeshValue{25., 123.});
  const auto four = estimate_mesh_error(sequence);
  ASSERT_TRUE(three && four);
  EXPECT_EQ(three->error, four->error);
  EXPECT_EQ(three->extrapolated, four->extrapolated);
}

// Two meshes: Roache's safety factor 3 with the theoretical order, no extrapolation.
TEST(MeshError, TwoMeshesUseFactorThreeAndTheTheoreticalOrder)
{
  const std::vector<MeshValue> sequence{{100., 2.}, {400., 2.3}};
  const auto                   estimate = estimate_mesh_error(sequence);
  ASSERT_TRUE(estimate);
  EXPECT_FALSE(estimate->observed);
  EXPECT_EQ(estimate->order, theoretical_order);
  EXPECT_NEAR(estimate->error, 3. * 0.3 / (std::pow(2., theoretical_order) - 1.), 1e-12);
  EXPECT_EQ(estimate->extrapolated, 2.3);
}

// Oscillating values and implausible orders fall back to Roache's estimate with the larger step, and
// say so.
TEST(MeshError, OscillatingOrImplausibleFallsBack)
{
  const std::vector<MeshValue> oscillating{{100., 1.}, {400., 1.2}, {1600., 1.1}};
  const auto                   a = estimate_mesh_error(oscillating);
  ASSERT_TRUE(a);
  EXPECT_FALSE(a->observed);
  // The larger step, 1 -> 1.2, bounds the oscillation: 3 x 0.2 / (2^2 - 1).
  EXPECT_NEAR(a->error, 3. * 0.2 / 3., 1e-12);
  EXPECT_NE(a->method.find("oscillating"), std::string::npos);
  // Changes that shrink by 1000 per halving: an observed order of about 10.
  const std::vector<MeshValue> too_fast{{100., 1.}, {400., 1.1}, {1600., 1.1001}};
  const auto                   b = estimate_mesh_error(too_fast);
  ASSERT_TRUE(b);
  EXPECT_FALSE(b->observed);
  EXPECT_NE(b->method.find("implausible"), std::string::npos);
  // The last step hardly changed the value: its bar comes from the step before, 3 x 0.1 / 3.
  EXPECT_NEAR(b->error, 0.1, 1e-12);
}

// A number that does not change (a flow rate set by a condition, an area) has no mesh error; nor one
// that changes only at round-off; one mesh gives no estimate at all.
TEST(MeshError, UnchangedRoundOffAndSingleMesh)
{
  const auto same = estimate_mesh_error({{100., 0.25}, {400., 0.25}, {1600., 0.25}});
  ASSERT_TRUE(same);
  EXPECT_EQ(same->error, 0.);
  const auto round_off = estimate_mesh_error({{100., 0.01}, {400., 0.01 * (1. + 2e-16)}, {1600., 0.01 * (1. - 3e-16)}});
  ASSERT_TRUE(round_off);
  EXPECT_EQ(round_off->error, 0.);
  EXPECT_FALSE(estimate_mesh_error({{100., 1.}}));
}

// A value that approaches its limit as 1/M (as the Papanastasiou-regularized Bingham pipe flow rate
// does: tests/verification/accuracy_test.cc): from M and 4 M the limit is extrapolated exactly, and
// the bar (which assumes only M^(-1/2)) is twice the change, 1.5 x the true error.
TEST(RegularizationError, ExtrapolatesAsOneOverM)
{
  const double limit = 0.3, C = 2., M = 100.;
  const double at_m = limit + C / M, at_4m = limit + C / (4. * M);
  const auto   estimate = estimate_regularization_error(at_m, at_4m, 4.);
  EXPECT_NEAR(estimate.extrapolated, limit, 1e-15);
  EXPECT_NEAR(estimate.error, 2. * (at_m - at_4m), 1e-15);
  EXPECT_GE(estimate.error, at_m - limit);
}

// The accuracy of a list of numbers: mesh and regularization errors add up to the bar, the
// extrapolated value removes both estimated errors, numbers missing on a mesh are skipped.
TEST(Accuracy, CombinesMeshAndRegularizationErrors)
{
  std::vector<MeshNumbers> meshes(3);
  const double             cells[3] = {100., 400., 1600.};
  for (int i = 0; i < 3; ++i)
    {
      meshes[i].cells = static_cast<std::uint64_t>(cells[i]);
      meshes[i].numbers.add("flow rate", "Q", 1. + 0.5 * std::pow(cells[i], -1.), "m^3/s", Group::flow);
    }
  DesignNumbers final_numbers = meshes[2].numbers;
  final_numbers.add("only here", "x", 7., "-", Group::flow);
  DesignNumbers at_larger_m;
  at_larger_m.add("flow rate", "Q", meshes[2].numbers.value("flow rate") - 0.03, "m^3/s", Group::flow);
  estimate_accuracy(final_numbers, meshes, &at_larger_m, 4.);
  const Accuracy &q = final_numbers.find("flow rate")->accuracy;
  ASSERT_TRUE(q.mesh_error && q.regularization_error && q.extrapolated);
  EXPECT_NEAR(*q.regularization_error, 2. * 0.03, 1e-14);
  EXPECT_NEAR(*total_error(q), *q.mesh_error + *q.regularization_error, 1e-15);
  // Mesh limit 1, regularization shift -0.03 - 0.03 / 3.
  EXPECT_NEAR(*q.extrapolated, 1. - 0.04, 1e-12);
  const Accuracy &x = final_numbers.find("only here")->accuracy;
  EXPECT_FALSE(x.mesh_error);
  EXPECT_FALSE(total_error(x));
  EXPECT_EQ(value_with_error(*final_numbers.find("only here")), "7");
}

// A number marked not estimable (a location that jumps between nodes) gets no error bar even where its
// mesh sequence would give one.
TEST(Accuracy, LocationsGetNoErrorBar)
{
  std::vector<MeshNumbers> meshes(3);
  const double             cells[3] = {100., 400., 1600.};
  for (int i = 0; i < 3; ++i)
    {
      meshes[i].cells = static_cast<std::uint64_t>(cells[i]);
      DesignNumber where;
      where.name      = "hottest at x";
      where.symbol    = "x_T";
      where.unit      = "m";
      where.value     = 0.3 + 0.1 * std::pow(cells[i], -1.);
      where.group     = Group::heat;
      where.estimable = false;
      meshes[i].numbers.add(where);
    }
  DesignNumbers final_numbers = meshes[2].numbers;
  estimate_accuracy(final_numbers, meshes, nullptr, 4.);
  const Accuracy &x = final_numbers.find("hottest at x")->accuracy;
  EXPECT_FALSE(x.mesh_error);
  EXPECT_FALSE(x.extrapolated);
  EXPECT_NE(x.mesh_method.find("a location"), std::string::npos);
}
