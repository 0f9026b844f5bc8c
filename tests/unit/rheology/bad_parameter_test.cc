// Every rejected parameter gives a message naming the parameter, the value
// given and what is allowed.
#include "rheology/law_registry.h"
#include "rheology/shift/temperature_shift.h"

#include <gmock/gmock.h>
#include <gtest/gtest.h>

#include <cmath>

using namespace lentus::rheology;
using ::testing::HasSubstr;

namespace
{
  struct BadCase
  {
    std::string     label;
    std::string     law;
    ParameterValues values;
    std::string     key;      ///< parameter the message must name
    std::string     value;    ///< value text the message must show
    std::string     allowed;  ///< part of the "allowed" text
  };

  void PrintTo(const BadCase &bad, std::ostream *stream)
  {
    *stream << bad.label;
  }

  const double infinity = HUGE_VAL;
  const double not_a_number = std::nan("");

  std::vector<BadCase> bad_cases()
  {
    return {
      {"FlowIndexZero", "Power law", {{"Consistency", 1.}, {"Flow index", 0.}, {"Maximum viscosity", 10.}}, "Flow index", "0", "> 0"},
      {"FlowIndexNegative", "Carreau-Yasuda", {{"Zero-shear viscosity", 1.}, {"Time constant", 1.}, {"Flow index", -0.35}},
       "Flow index", "-0.35", "> 0"},
      {"ConsistencyNaN", "Herschel-Bulkley",
       {{"Consistency", not_a_number}, {"Flow index", 1.}, {"Yield stress", 1.}, {"Regularization exponent", 10.}}, "Consistency", "nan",
       "finite"},
      {"ViscosityInfinite", "Newtonian", {{"Viscosity", infinity}}, "Viscosity", "inf", "finite"},
      {"NegativeYieldStress", "Bingham", {{"Plastic viscosity", 1.}, {"Yield stress", -5.}, {"Regularization exponent", 10.}},
       "Yield stress", "-5", ">= 0"},
      {"ExponentMZero", "Bingham", {{"Plastic viscosity", 1.}, {"Yield stress", 5.}, {"Regularization exponent", 0.}},
       "Regularization exponent", "0", "> 0"},
      {"ExponentMNegative", "Herschel-Bulkley",
       {{"Consistency", 1.}, {"Flow index", 1.}, {"Yield stress", 1.}, {"Regularization exponent", -1.}},
       "Regularization exponent", "-1", "> 0"},
      {"CrossEta0BelowEtaInf", "Cross",
       {{"Zero-shear viscosity", 1.}, {"Infinite-shear viscosity", 2.}, {"Time constant", 1.}, {"Rate index", 0.8}},
       "Zero-shear viscosity", "1", "Zero-shear viscosity >= Infinite-shear viscosity"},
      {"CarreauEta0BelowEtaInf", "Carreau-Yasuda",
       {{"Zero-shear viscosity", 1.}, {"Infinite-shear viscosity", 3.}, {"Time constant", 1.}, {"Flow index", 0.5}},
       "Zero-shear viscosity", "1", "Zero-shear viscosity >= Infinite-shear viscosity"},
      {"ThinningPowerLawWithoutCap", "Power law", {{"Consistency", 1.}, {"Flow index", 0.5}}, "Maximum viscosity", "inf",
       "finite viscosity cap"},
      {"ThickeningPowerLawWithoutFloor", "Power law", {{"Consistency", 1.}, {"Flow index", 1.5}}, "Minimum viscosity", "0",
       "viscosity floor > 0"},
      {"BoundsReversed", "Power law",
       {{"Consistency", 1.}, {"Flow index", 0.5}, {"Minimum viscosity", 5.}, {"Maximum viscosity", 2.}}, "Minimum viscosity",
       "5", "Minimum viscosity < Maximum viscosity"},
      {"ThinningHerschelBulkleyWithoutFloor", "Herschel-Bulkley",
       {{"Consistency", 1.}, {"Flow index", 0.5}, {"Yield stress", 1.}, {"Regularization exponent", 10.}}, "Shear-rate floor",
       "0", "shear-rate floor > 0"},
      {"MissingRequired", "Cross", {{"Zero-shear viscosity", 1.}, {"Rate index", 0.8}}, "Time constant", "(not set)", "> 0"},
      {"UnknownKey", "Newtonian", {{"Viscosity", 1.}, {"Flow index", 0.5}}, "Flow index", "0.5", "the keys Viscosity"},
    };
  }
} // namespace

class BadParameter : public ::testing::TestWithParam<BadCase>
{};

TEST_P(BadParameter, MessageNamesKeyValueAndAllowed)
{
  const BadCase &bad = GetParam();
  try
    {
      registry().create(bad.law, bad.values);
      FAIL() << "accepted " << bad.label;
    }
  catch (const InvalidParameter &error)
    {
      EXPECT_EQ(error.key, bad.key);
      EXPECT_EQ(error.value_text, bad.value);
      EXPECT_THAT(error.allowed, HasSubstr(bad.allowed));
      EXPECT_THAT(error.what(), HasSubstr(bad.key + " = " + bad.value + ": "));
      EXPECT_THAT(error.what(), HasSubstr("allowed: "));
    }
}

INSTANTIATE_TEST_SUITE_P(Rheology,
                         BadParameter,
                         ::testing::ValuesIn(bad_cases()),
                         [](const ::testing::TestParamInfo<BadCase> &info) { return info.param.label; });

TEST(BadShiftParameter, MessagesNameTheParameter)
{
  const auto expect_message = [](const auto &make, const std::string &key, const std::string &value) {
    try
      {
        make();
        FAIL() << key;
      }
    catch (const InvalidParameter &error)
      {
        EXPECT_EQ(error.key, key);
        EXPECT_EQ(error.value_text, value);
      }
  };
  expect_message([] { TemperatureShift::arrhenius(-1., 400.); }, "Activation energy", "-1");
  expect_message([] { TemperatureShift::arrhenius(4e4, 0.); }, "Reference temperature", "0");
  expect_message([] { TemperatureShift::wlf(0., 51.6, 400.); }, "C1", "0");
  expect_message([] { TemperatureShift::wlf(17.44, -3., 400.); }, "C2", "-3");
  expect_message([] { TemperatureShift::wlf(17.44, 51.6, not_a_number); }, "Reference temperature", "nan");
  expect_message([] { TemperatureShift::create("Arrhenius", {{"Activation energy", 4e4}}); }, "Reference temperature",
                 "(not set)");
  expect_message([] { TemperatureShift::create("Eyring", {}); }, "Temperature shift", "Eyring");
}
