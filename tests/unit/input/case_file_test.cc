// Case-file reading: format details, overrides, and where messages point.
#include "solver/errors.h"
#include "solver/input/case_schema.h"
#include "solver/input/fluid_section.h"

#include <gmock/gmock.h>
#include <gtest/gtest.h>

#include <cmath>

using namespace lentus;
using namespace lentus::input;
using ::testing::HasSubstr;

namespace
{
  const char *melt = R"(# comment line
subsection Rheology
  set Viscosity law = Carreau-Yasuda   # trailing comment
  subsection Carreau-Yasuda
    set Zero-shear viscosity = \
        2500
    set Time constant = 0.4
    set Flow index = 0.3
  end
end
)";

  std::string message_of(const std::function<void()> &action)
  {
    try
      {
        action();
      }
    catch (const InputError &error)
      {
        return error.what();
      }
    return "(no error)";
  }
} // namespace

TEST(CaseFile, ReadsCommentsContinuationsAndDefaults)
{
  const CaseFile file = CaseFile::parse(melt, "melt.prm", case_schema());
  EXPECT_EQ(file.get("Rheology/Viscosity law"), "Carreau-Yasuda");
  EXPECT_EQ(file.get_real("Rheology/Carreau-Yasuda/Zero-shear viscosity"), 2500.);
  EXPECT_EQ(file.line_of("Rheology/Carreau-Yasuda/Zero-shear viscosity"), 5);
  EXPECT_EQ(file.line_of("Rheology/Carreau-Yasuda/Time constant"), 7);
  EXPECT_EQ(file.get("Rheology/Carreau-Yasuda/Yasuda exponent"), "2"); // declared default
  EXPECT_FALSE(file.is_set("Rheology/Carreau-Yasuda/Yasuda exponent"));
  EXPECT_EQ(file.get("Rheology/Temperature shift"), "none");
  EXPECT_FALSE(file.is_set("Rheology/Density"));
  EXPECT_FALSE(read_fluid(file).density);     // not set: no magic value
  EXPECT_FALSE(read_fluid(file).temperature);
  // The completed case lists every declared key.
  EXPECT_THAT(file.complete_text(), HasSubstr("Herschel-Bulkley"));
}

TEST(CaseFile, FluidFromFile)
{
  const Fluid fluid = read_fluid(CaseFile::parse(melt, "melt.prm", case_schema()));
  EXPECT_EQ(fluid.law_name, "Carreau-Yasuda");
  EXPECT_EQ(fluid.shift_factor, 1.);
  EXPECT_EQ(fluid.law->evaluate(0.).value, 2500.);
  EXPECT_EQ(fluid.parameters.at("Yasuda exponent"), 2.);
}

TEST(CaseFile, OverridesWinAndAreNamedInMessages)
{
  const CaseFile file =
    CaseFile::parse(melt, "melt.prm", case_schema(), {"Rheology/Carreau-Yasuda/Flow index = 0.5"});
  EXPECT_EQ(file.get_real("Rheology/Carreau-Yasuda/Flow index"), 0.5);
  EXPECT_THAT(message_of([] { CaseFile::parse(melt, "melt.prm", case_schema(), {"Rheology/Carreau-Yasuda/Flow indx=1"}); }),
              HasSubstr("did you mean 'Rheology/Carreau-Yasuda/Flow index'"));
  EXPECT_THAT(message_of([] { CaseFile::parse(melt, "melt.prm", case_schema(), {"Rheology/Density"}); }),
              HasSubstr("expected --set Section/Key=value"));
}

TEST(CaseFile, SemanticErrorsPointAtTheLine)
{
  // The relation eta_0 >= eta_inf is checked by the law; the message still names file, line and key.
  const std::string text = std::string(melt).replace(std::string(melt).find("    set Time"), 0,
                                                     "    set Infinite-shear viscosity = 3000\n");
  EXPECT_THAT(message_of([&] { read_fluid(CaseFile::parse(text, "melt.prm", case_schema())); }),
              HasSubstr("melt.prm:5: Rheology/Carreau-Yasuda/Zero-shear viscosity = 2500: below Infinite-shear "
                        "viscosity = 3000"));
}

TEST(CaseFile, SyntaxErrors)
{
  EXPECT_THAT(message_of([] { CaseFile::parse("end\n", "x.prm", case_schema()); }),
              HasSubstr("x.prm:1: 'end' without a matching 'subsection'"));
  EXPECT_THAT(message_of([] { CaseFile::parse("subsection Rheology\n  Viscosity law = Cross\nend\n", "x.prm", case_schema()); }),
              HasSubstr("x.prm:2: cannot read 'Viscosity law = Cross'"));
  EXPECT_THAT(message_of([] { CaseFile::parse("subsection Rheology\n  set Density 5\nend\n", "x.prm", case_schema()); }),
              HasSubstr("x.prm:2: expected 'set Key = value'"));
  EXPECT_THAT(message_of([] { CaseFile::parse("include other.prm\n", "x.prm", case_schema()); }),
              HasSubstr("x.prm:1: 'include' is not supported"));
}
