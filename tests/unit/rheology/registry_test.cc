// The golden list: the one place that names every viscosity law. A law that
// fails to register (e.g. dropped by the linker) fails here.
#include "rheology/law_registry.h"
#include "sample_laws.h"

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
