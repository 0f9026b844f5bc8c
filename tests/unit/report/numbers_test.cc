// The design-number functions against closed forms, from integrals made up for a
// known flow (no mesh): they must turn integrals into the right totals and units.
#include "rheology/law_registry.h"
#include "solver/report/numbers.h"

#include <gtest/gtest.h>

#include <cmath>

namespace
{
  using namespace lentus;
  using namespace lentus::report;

  /// A round die of one land: developed Newtonian flow Q through radius R, length L, with the
  /// inlet's mean pressure `extra` above the developed drop (an entrance loss).
  FlowIntegrals round_die(const double Q, const double inlet_pressure)
  {
    FlowIntegrals integrals;
    integrals.conditions = {{"inlet", false, false, {}}, {"wall", true, false, {}}, {"outlet", false, false, 0.}};
    // Per radian: the outlet carries Q / (2 pi); mean pressures are int p w / int w.
    integrals.roles["inlet"]  = {-Q / (2. * M_PI), inlet_pressure * 0.5, 0.5, 0., 0., {0., 0.}};
    integrals.roles["outlet"] = {Q / (2. * M_PI), 0., 0.5, 0., 0., {0., 0.}};
    integrals.roles["wall"]   = {0., 0., 1., 0., 0., {0., 0.}};
    return integrals;
  }
} // namespace

// Hagen-Poiseuille flow (Bird, Stewart & Lightfoot 2002, Transport Phenomena, eq. 2.3-21):
// dp = 8 mu Q L / (pi R^4), tau_w = 4 mu Q / (pi R^3), gamma_w = 4 Q / (pi R^3); the entrance
// loss is the rest of the drop, and Bagley's end correction e = dp_e / (2 tau_w) (Bagley 1957).
TEST(DieNumbers, HagenPoiseuilleLandAndEntranceLoss)
{
  const double mu = 2.5, Q = 3e-6, R = 2e-3, L = 0.02, loss = 1.5e5;
  const auto   law = rheology::registry().create("Newtonian", {{"Viscosity", mu}});
  const double developed = 8. * mu * Q * L / (M_PI * std::pow(R, 4));
  const double tau_w     = 4. * mu * Q / (M_PI * std::pow(R, 3));
  const meshes::StraightSection land{"land", true, R, L};

  DesignNumbers numbers;
  const Formulation axisymmetric(FormulationKind::axisymmetric);
  const FlowIntegrals integrals = round_die(Q, developed + loss);
  add_role_numbers(axisymmetric, integrals, numbers);
  add_die_numbers(axisymmetric, *law, {land}, integrals, numbers);
  EXPECT_NEAR(numbers.value("flow rate out through outlet"), Q, 1e-15 * Q);
  EXPECT_NEAR(numbers.value("developed pressure drop in the land"), developed, 1e-6 * developed);
  EXPECT_NEAR(numbers.value("developed wall shear stress in the land"), tau_w, 1e-6 * tau_w);
  EXPECT_NEAR(numbers.value("wall shear rate in the land"), tau_w / mu, 1e-6 * tau_w / mu);
  EXPECT_NEAR(numbers.value("apparent viscosity in the land"), mu, 1e-6 * mu);
  EXPECT_NEAR(numbers.value("entrance pressure loss"), loss, 1e-6 * loss);
  EXPECT_NEAR(numbers.value("entrance loss coefficient (Bagley end correction)"), loss / (2. * tau_w),
              1e-6 * loss / tau_w);
  // What a die designer came for is marked.
  for (const char *name : {"pressure drop inlet to outlet", "entrance pressure loss", "wall shear rate in the land",
                           "developed wall shear stress in the land"})
    EXPECT_TRUE(numbers.find(name)->key) << name;
  EXPECT_EQ(numbers.find("flow rate out through outlet")->unit, "m^3/s");
}

// The same integrals of a planar case are per metre of depth: no 2 pi, units per metre (the
// convention of a planar section's totals: common practice).
TEST(RoleNumbers, PlanarTotalsArePerMetreOfDepth)
{
  FlowIntegrals integrals = round_die(1e-4, 10.);
  integrals.roles["wall"].torque   = 0.3;
  integrals.roles["wall"].force[0] = 2.;
  DesignNumbers numbers;
  add_role_numbers(Formulation(FormulationKind::planar), integrals, numbers);
  EXPECT_DOUBLE_EQ(numbers.value("flow rate out through outlet"), 1e-4 / (2. * M_PI));
  EXPECT_EQ(numbers.find("flow rate out through outlet")->unit, "m^2/s");
  EXPECT_DOUBLE_EQ(numbers.value("torque on the fluid from wall"), 0.3);
  EXPECT_EQ(numbers.find("torque on the fluid from wall")->unit, "N m/m");
  EXPECT_DOUBLE_EQ(numbers.value("x force on the fluid from wall"), 2.);
  EXPECT_DOUBLE_EQ(numbers.value("pressure drop inlet to outlet"), 10.);
  // Axisymmetric without swirl: no torque; the axial force over the full circle.
  DesignNumbers axisymmetric;
  add_role_numbers(Formulation(FormulationKind::axisymmetric), integrals, axisymmetric);
  EXPECT_EQ(axisymmetric.find("torque on the fluid from wall"), nullptr);
  EXPECT_EQ(axisymmetric.find("axial force on the fluid from wall")->unit, "N");
}

// Power number Po = P / (rho N^3 D^5) with P = 2 pi N T, and the Metzner-Otto Reynolds number
// rho N D^2 / eta(k_s N) (Metzner & Otto 1957, AIChE J. 3:3): for a Newtonian fluid their product
// is 2 pi T / (mu N D^3), free of the density (derived here from the two definitions).
TEST(VesselNumbers, PowerNumberTimesReynoldsNumberOfCreepingFlow)
{
  const double mu = 10., rho = 1000., N = 2., D = 0.1, T = 0.05;
  const auto   law = rheology::registry().create("Newtonian", {{"Viscosity", mu}});
  FlowIntegrals flow;
  flow.conditions             = {{"impeller", true, true, {}}};
  flow.roles["impeller"]      = {0., 0., 1., T / (2. * M_PI), 0., {0., 0.}};
  const VesselIntegrals vessel{1., 1., 0.25, 0.25, 0., 0., 0.};
  DesignNumbers numbers;
  add_vessel_numbers(Formulation(FormulationKind::swirl), *law, {N, D, rho, 11.5}, flow, vessel, numbers);
  EXPECT_NEAR(numbers.value("impeller torque"), T, 1e-14);
  EXPECT_NEAR(numbers.value("impeller power"), 2. * M_PI * N * T, 1e-14);
  const double Po = numbers.value("power number"), Re = numbers.value("Metzner-Otto Reynolds number");
  EXPECT_NEAR(Po * Re, 2. * M_PI * T / (mu * N * std::pow(D, 3)), 1e-9);
  EXPECT_DOUBLE_EQ(numbers.value("dead-zone volume fraction"), 0.25);
  EXPECT_EQ(numbers.find("cavern radius"), nullptr); // no yield stress, no cavern

  // Without a density there is no power number nor Reynolds number, and no division by zero.
  DesignNumbers without_density;
  add_vessel_numbers(Formulation(FormulationKind::swirl), *law, {N, D, std::nullopt, 11.5}, flow, vessel,
                     without_density);
  EXPECT_EQ(without_density.find("power number"), nullptr);
  EXPECT_EQ(without_density.find("Metzner-Otto Reynolds number"), nullptr);
  EXPECT_NEAR(without_density.value("impeller power"), 2. * M_PI * N * T, 1e-14);
}
