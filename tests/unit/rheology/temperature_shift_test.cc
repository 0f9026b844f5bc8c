// Time-temperature superposition: shift factors and the shifted law.
#include "rheology/law_registry.h"
#include "rheology/shift/temperature_shift.h"

#include <gmock/gmock.h>
#include <gtest/gtest.h>

#include <cmath>

using namespace lentus::rheology;

TEST(TemperatureShift, ArrheniusValue)
{
  // Arrhenius: a_T = exp(E_a/R (1/T - 1/T_ref)); E_a = 50 kJ/mol, T_ref = 473.15 K, T = 493.15 K, with the
  // molar gas constant R = 8.314462618 J/(mol K) (CODATA 2018), computed here from the formula.
  const auto shift = TemperatureShift::arrhenius(50e3, 473.15);
  const double expected = std::exp(50e3 / 8.314462618 * (1. / 493.15 - 1. / 473.15));
  EXPECT_NEAR(shift.factor(493.15), expected, 1e-14 * expected);
  EXPECT_DOUBLE_EQ(shift.factor(473.15), 1.);
  EXPECT_GT(shift.factor(453.15), 1.); // viscosity rises as temperature falls
}

TEST(TemperatureShift, WlfValue)
{
  // WLF: log10 a_T = -C1 (T - T_ref)/(C2 + T - T_ref); with the "universal" constants C1 = 17.44,
  // C2 = 51.6 K (Williams, Landel & Ferry 1955, J. Am. Chem. Soc. 77:3701, from memory; used here
  // only as inputs), T_ref = 373.15 K, T = 393.15 K: a_T = 10^(-17.44*20/71.6), computed here.
  const auto   shift    = TemperatureShift::wlf(17.44, 51.6, 373.15);
  const double expected = std::pow(10., -17.44 * 20. / 71.6);
  EXPECT_NEAR(shift.factor(393.15), expected, 1e-12 * expected);
  EXPECT_DOUBLE_EQ(shift.factor(373.15), 1.);
}

TEST(TemperatureShift, WlfEquivalentActivationEnergy)
{
  // Derived here from the WLF equation (Williams, Landel & Ferry 1955, J. Am. Chem. Soc. 77:3701):
  // ln a_T = -ln(10) C1 (T - T_ref)/(C2 + T - T_ref), so d ln a_T / d(1/T) = -T^2 d ln a_T / dT
  // = ln(10) C1 C2 T^2 / (C2 + T - T_ref)^2 = E_a(T)/R, the local (equivalent) activation energy.
  const double c1 = 8.86, c2 = 101.6, t_ref = 400., t = 430.;
  const auto   shift = TemperatureShift::wlf(c1, c2, t_ref);
  const double h     = 1e-3; // step in T [K]
  const double slope = (std::log(shift.factor(t + h)) - std::log(shift.factor(t - h))) / (1. / (t + h) - 1. / (t - h));
  const double expected = std::log(10.) * c1 * c2 * t * t / std::pow(c2 + t - t_ref, 2);
  EXPECT_NEAR(slope, expected, 1e-6 * expected);
}

TEST(TemperatureShift, ShiftedCarreauScalesZeroShearViscosityAndTimeConstant)
{
  // Time-temperature superposition without vertical shift (Ferry 1980, Viscoelastic Properties of Polymers,
  // 3rd ed., ch. 11; from memory for the chapter): eta(gamma_dot, T) = a_T eta(a_T gamma_dot, T_ref),
  // which for Carreau-Yasuda is the same law with eta_0 and lambda both multiplied by a_T.
  const double a   = 0.37;
  const auto   ref = std::shared_ptr<const ViscosityLaw>(registry().create(
    "Carreau-Yasuda", {{"Zero-shear viscosity", 2000.}, {"Time constant", 0.5}, {"Flow index", 0.4}, {"Yasuda exponent", 1.2}}));
  const auto direct = registry().create(
    "Carreau-Yasuda",
    {{"Zero-shear viscosity", 2000. * a}, {"Time constant", 0.5 * a}, {"Flow index", 0.4}, {"Yasuda exponent", 1.2}});
  const auto hot = shifted(ref, a);
  for (const double g : {1e-3, 0.1, 2., 300.})
    {
      EXPECT_NEAR(hot->evaluate(g).value, direct->evaluate(g).value, 1e-12 * direct->evaluate(g).value);
      EXPECT_NEAR(hot->evaluate(g).derivative, direct->evaluate(g).derivative,
                  1e-12 * std::abs(direct->evaluate(g).derivative));
    }
}

TEST(TemperatureShift, YieldStressIsNotShifted)
{
  const auto ref = std::shared_ptr<const ViscosityLaw>(registry().create(
    "Bingham", {{"Plastic viscosity", 1.}, {"Yield stress", 7.}, {"Regularization exponent", 100.}}));
  EXPECT_EQ(shifted(ref, 0.5)->yield_stress(), 7.);
}

TEST(TemperatureShift, BadTemperatures)
{
  const auto wlf = TemperatureShift::wlf(17.44, 51.6, 373.15);
  try
    {
      wlf.factor(321.55); // = T_ref - C2: the singularity
      FAIL();
    }
  catch (const InvalidParameter &error)
    {
      EXPECT_EQ(error.key, "Temperature");
      EXPECT_THAT(error.what(), ::testing::HasSubstr("WLF singularity"));
      EXPECT_THAT(error.what(), ::testing::HasSubstr("T > 321.55 K"));
    }
  EXPECT_THROW(wlf.factor(300.), InvalidParameter);
  EXPECT_THROW(wlf.factor(321.56), InvalidParameter); // 0.01 K above: a_T = 10^90000 overflows
  EXPECT_NO_THROW(wlf.factor(331.55));                // 10 K above: a_T = 10^72.5, finite
  const auto arrhenius = TemperatureShift::arrhenius(4e4, 450.);
  EXPECT_THROW(arrhenius.factor(0.), InvalidParameter);
  EXPECT_THROW(arrhenius.factor(-10.), InvalidParameter);
  EXPECT_THROW(arrhenius.factor(std::nan("")), InvalidParameter);
  EXPECT_THROW(arrhenius.factor(HUGE_VAL), InvalidParameter);
  EXPECT_EQ(TemperatureShift().factor(std::nan("")), 1.); // no shift: temperature not needed
}

TEST(TemperatureShift, ExponentialValueAndSlope)
{
  // Exponential shift a_T = exp(-beta (T - T_ref)), the first-order form of any shift about T_ref
  // (its log slope is -beta by definition); values computed here from the formula.
  const auto shift = TemperatureShift::exponential(0.02, 473.15);
  EXPECT_NEAR(shift.factor(483.15), std::exp(-0.2), 1e-14);
  EXPECT_DOUBLE_EQ(shift.factor(473.15), 1.);
  EXPECT_DOUBLE_EQ(shift.log_slope(500.), -0.02);
  EXPECT_THROW(shift.factor(-1.), InvalidParameter);
  EXPECT_THROW(TemperatureShift::exponential(-0.1, 473.15), InvalidParameter);
  const auto created = TemperatureShift::create("Exponential", {{"Temperature sensitivity", 0.03},
                                                                {"Reference temperature", 450.}});
  EXPECT_NEAR(created.factor(460.), std::exp(-0.3), 1e-14);
}

TEST(TemperatureShift, LogSlopeMatchesFiniteDifferences)
{
  // d ln a_T / dT of every shift against a central difference of ln a_T (the formulas of
  // Arrhenius and of Williams, Landel & Ferry 1955, differentiated in temperature_shift.cc).
  const double h = 1e-3;
  for (const TemperatureShift &shift : {TemperatureShift::arrhenius(60e3, 470.), TemperatureShift::wlf(8.86, 101.6, 400.),
                                        TemperatureShift::exponential(0.015, 480.), TemperatureShift()})
    for (const double t : {430., 480., 520.})
      {
        const double difference = (std::log(shift.factor(t + h)) - std::log(shift.factor(t - h))) / (2. * h);
        EXPECT_NEAR(shift.log_slope(t), difference, 1e-7 * std::max(1e-3, std::abs(difference))) << t;
      }
  EXPECT_EQ(TemperatureShift().log_slope(300.), 0.);
}
