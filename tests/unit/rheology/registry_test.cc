// The golden list: the one place that names every viscosity law. A law that
// fails to register (e.g. dropped by the linker) fails here.
#include "rheology/law_registry.h"
#include "sample_laws.h"

#include <cmath>
#include <stdexcept>

#include <gmock/gmock.h>
#include <gtest/gtest.h>

using namespace lentus::rheology;

TEST(Registry, HoldsExactlyTheSixLaws)
{
  EXPECT_THAT(registry().names(), ::testing::UnorderedElementsAre("Newtonian", "Power law", "Cross", "Carreau-Yasuda",
                                                                  "Bingham", "Herschel-Bulkley"));
}

TEST(Registry, EveryLawHasASample)
{
  for (const std::string &name : registry().names())
    {
      bool found = false;
      for (const auto &sample : lentus::rheology::testing::sample_laws())
        found = found || sample.law == name;
      EXPECT_TRUE(found) << name << " has no sample in sample_laws.h";
    }
}

TEST(Registry, EveryParameterHasUnitAndMeaning)
{
  for (const LawInfo &law : registry().laws())
    {
      EXPECT_FALSE(law.formula.empty()) << law.name;
      for (const ParameterInfo &parameter : law.parameters)
        {
          EXPECT_FALSE(parameter.unit.empty()) << law.name << "/" << parameter.key;
          EXPECT_FALSE(parameter.meaning.empty()) << law.name << "/" << parameter.key;
        }
    }
}

TEST(Registry, UnknownLawListsTheKnownOnes)
{
  try
    {
      registry().create("Carreau", {});
      FAIL() << "no exception";
    }
  catch (const InvalidParameter &error)
    {
      EXPECT_EQ(error.key, "Viscosity law");
      EXPECT_THAT(error.what(), ::testing::HasSubstr("Carreau-Yasuda"));
      EXPECT_THAT(error.what(), ::testing::HasSubstr("Herschel-Bulkley"));
    }
}

TEST(Registry, YieldStressOnlyForYieldStressLaws)
{
  for (const auto &sample : lentus::rheology::testing::sample_laws())
    {
      const auto law      = registry().create(sample.law, sample.values);
      const auto expected = sample.values.count("Yield stress") ? sample.values.at("Yield stress") : 0.;
      EXPECT_EQ(law->yield_stress(), expected) << sample.label;
      EXPECT_EQ(law->name(), sample.law);
    }
}

// Continuation asks the registration what to soften. The paths are the ones the solver used when it
// named the keys itself (M from 1e-3 M in four equal decades-ratios of 10^0.75; n from 1 in five
// equal steps), so every converged demo takes the same steps as before.
TEST(Registry, ContinuationSoftensWhatTheLawSays)
{
  const auto path_of = [](const std::string &law, const ParameterValues &values) {
    return registry().find(law).continuation_path(values);
  };
  const double M       = 1e3;
  const auto   bingham = path_of("Bingham", {{"Plastic viscosity", 0.5}, {"Yield stress", 20.}, {"Regularization exponent", M}});
  ASSERT_TRUE(bingham);
  EXPECT_EQ(bingham->key, "Regularization exponent");
  ASSERT_EQ(bingham->values.size(), 5u);
  for (int k = 0; k <= 4; ++k)
    EXPECT_NEAR(bingham->values[k], M * std::pow(10., -0.75 * (4 - k)), 1e-12 * M) << k;
  EXPECT_EQ(bingham->values.back(), M); // the case's own value, exactly

  // No yield stress: nothing to regularize, and a Newtonian Bingham fluid needs no continuation.
  EXPECT_FALSE(path_of("Bingham", {{"Plastic viscosity", 0.5}, {"Yield stress", 0.}, {"Regularization exponent", M}}));

  // Herschel-Bulkley: M first where there is a yield stress, else the flow index from 1.
  const ParameterValues hb = {{"Consistency", 3.}, {"Flow index", 0.45}, {"Yield stress", 15.},
                              {"Regularization exponent", 500.}, {"Shear-rate floor", 1e-9}};
  EXPECT_EQ(path_of("Herschel-Bulkley", hb)->key, "Regularization exponent");
  ParameterValues no_yield = hb;
  no_yield["Yield stress"] = 0.;
  const auto flow_index    = path_of("Herschel-Bulkley", no_yield);
  ASSERT_TRUE(flow_index);
  EXPECT_EQ(flow_index->key, "Flow index");
  ASSERT_EQ(flow_index->values.size(), 6u);
  for (int k = 0; k <= 5; ++k)
    EXPECT_NEAR(flow_index->values[k], 1. + (0.45 - 1.) * k / 5., 1e-15) << k;

  // A power-law fluid of index 1 is Newtonian: nothing to soften; Newtonian and Cross never are.
  EXPECT_FALSE(path_of("Power law", {{"Consistency", 2.}, {"Flow index", 1.}, {"Minimum viscosity", 0.},
                                     {"Maximum viscosity", 1e9}}));
  EXPECT_EQ(path_of("Power law", {{"Consistency", 2.}, {"Flow index", 1.6}, {"Minimum viscosity", 0.},
                                  {"Maximum viscosity", 1e9}})->values.front(), 1.);
  EXPECT_FALSE(path_of("Newtonian", {{"Viscosity", 2.5}}));
  EXPECT_FALSE(path_of("Cross", {{"Zero-shear viscosity", 500.}, {"Infinite-shear viscosity", 0.2},
                                 {"Time constant", 0.3}, {"Rate index", 0.7}}));
}

// A registration that softens a key it does not have is a programming error, caught at once.
TEST(Registry, SofteningAnUnknownKeyIsAnError)
{
  LawInfo law = registry().find("Newtonian");
  law.softenings.push_back({"Flow index", Softening::Path::linear, 1., 5, ""});
  EXPECT_THROW(law.continuation_path({{"Viscosity", 2.5}}), std::logic_error);
}
