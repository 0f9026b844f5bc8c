// A section's keys are written once (in its bind()): the same line declares the key with its default
// and reads it back. These tests bind a small section of their own, so they check the binder itself,
// and then the solver's own sections through the complete case schema.
// gmock before deal.II: both define an Assert.
#include <gmock/gmock.h>
#include <gtest/gtest.h>

#include "solver/errors.h"
#include "solver/input/case_schema.h"
#include "solver/input/flow_sections.h"
#include "solver/input/section_keys.h"

#include <optional>

using namespace lentus;
using namespace lentus::input;
using ::testing::HasSubstr;
using rheology::Range;

namespace
{
  enum class Mode
  {
    slow,
    fast
  };

  struct TrialSection
  {
    double                      tolerance = 1e-8;
    std::optional<double>       limit;
    unsigned int                steps = 10;
    bool                        verbose = true;
    Mode                        mode    = Mode::slow;
    std::optional<unsigned int> levels;
    std::vector<std::string>    roles;
    std::vector<double>         pair{0., -9.81};

    void bind(SectionKeys &keys)
    {
      keys.real("Tolerance", tolerance, Range::above(0.), "a tolerance [-]");
      keys.optional_real("Limit", limit, Range::at_least(0.), "a limit [s]");
      keys.integer("Steps", steps, 1, 100, "steps [-]");
      keys.boolean("Verbose", verbose, "talk");
      keys.choice<Mode>("Mode", mode, {{"slow", Mode::slow}, {"fast", Mode::fast}}, "how");
      keys.choice<std::optional<unsigned int>>("Levels", levels, {{"automatic", std::nullopt}, {"1", 1u}, {"2", 2u}},
                                               "levels");
      keys.names("Roles", roles, "roles");
      keys.reals("Pair", pair, Range::any(), "two numbers [m]", 2);
    }
  };

  CaseSchema trial_schema()
  {
    CaseSchema schema;
    declare_section<TrialSection>(schema, "Trial");
    return schema;
  }

  TrialSection read_trial(const std::string &body, const std::vector<std::string> &overrides = {})
  {
    const CaseSchema schema = trial_schema();
    return read_section<TrialSection>(
      CaseFile::parse("subsection Trial\n" + body + "end\n", "trial.prm", schema, overrides), "Trial");
  }

  InputError error_of(const std::function<void()> &action)
  {
    try
      {
        action();
      }
    catch (const InputError &error)
      {
        return error;
      }
    return InputError("(no error)");
  }
} // namespace

TEST(SectionKeys, DeclaresEveryKeyWithTheMembersDefault)
{
  const CaseSchema schema = trial_schema();
  EXPECT_EQ(schema.find("Trial/Tolerance")->default_value, "1e-8");
  EXPECT_EQ(schema.find("Trial/Limit")->default_value, ""); // not set
  EXPECT_EQ(schema.find("Trial/Steps")->default_value, "10");
  EXPECT_EQ(schema.find("Trial/Verbose")->default_value, "true");
  EXPECT_EQ(schema.find("Trial/Mode")->default_value, "slow");
  EXPECT_THAT(schema.find("Trial/Mode")->kind.choices, ::testing::ElementsAre("slow", "fast"));
  EXPECT_EQ(schema.find("Trial/Levels")->default_value, "automatic");
  EXPECT_EQ(schema.find("Trial/Pair")->default_value, "0, -9.81");
  EXPECT_EQ(schema.find("Trial/Limit")->documentation, "a limit [s]");
}

TEST(SectionKeys, ReadsDefaultsWhenNothingIsSet)
{
  const TrialSection trial = read_trial("");
  EXPECT_EQ(trial.tolerance, 1e-8);
  EXPECT_FALSE(trial.limit);
  EXPECT_EQ(trial.steps, 10u);
  EXPECT_TRUE(trial.verbose);
  EXPECT_EQ(trial.mode, Mode::slow);
  EXPECT_FALSE(trial.levels);
  EXPECT_TRUE(trial.roles.empty());
  EXPECT_THAT(trial.pair, ::testing::ElementsAre(0., -9.81));
}

TEST(SectionKeys, ReadsWhatTheFileAndTheOverridesSet)
{
  const TrialSection trial = read_trial("  set Tolerance = 2.5e-6\n  set Limit = 30\n  set Steps = 7\n"
                                        "  set Verbose = false\n  set Mode = fast\n  set Levels = 2\n"
                                        "  set Roles = wall, lid\n  set Pair = 1, 2\n",
                                        {"Trial/Steps=9"});
  EXPECT_EQ(trial.tolerance, 2.5e-6);
  EXPECT_EQ(trial.limit, 30.);
  EXPECT_EQ(trial.steps, 9u); // the override wins
  EXPECT_FALSE(trial.verbose);
  EXPECT_EQ(trial.mode, Mode::fast);
  EXPECT_EQ(trial.levels, 2u);
  EXPECT_THAT(trial.roles, ::testing::ElementsAre("wall", "lid"));
  EXPECT_THAT(trial.pair, ::testing::ElementsAre(1., 2.));
}

TEST(SectionKeys, BadValuesCarryFileLineAndKey)
{
  const InputError choice = error_of([] { read_trial("  set Mode = quick\n"); });
  EXPECT_EQ(choice.file(), "trial.prm");
  EXPECT_EQ(choice.line(), 2);
  EXPECT_EQ(choice.key(), "Trial/Mode");
  EXPECT_THAT(choice.what(), HasSubstr("slow"));
  EXPECT_THAT(choice.what(), HasSubstr("fast"));

  const InputError range = error_of([] { read_trial("  set Verbose = true\n  set Steps = 0\n"); });
  EXPECT_EQ(range.line(), 3);
  EXPECT_EQ(range.key(), "Trial/Steps");

  const InputError count = error_of([] { read_trial("  set Pair = 1, 2, 3\n"); });
  EXPECT_EQ(count.key(), "Trial/Pair");
  EXPECT_THAT(count.what(), HasSubstr("needs 2 values, not 3"));
}

// An empty value would silently stand for the default or for "not set"; it is bad input.
TEST(SectionKeys, AnEmptyValueIsBadInput)
{
  for (const std::string key : {"Tolerance", "Limit", "Mode", "Roles", "Pair"})
    {
      const InputError empty = error_of([&] { read_trial("  set " + key + " =\n"); });
      EXPECT_EQ(empty.file(), "trial.prm") << key;
      EXPECT_EQ(empty.line(), 2) << key;
      EXPECT_EQ(empty.key(), "Trial/" + key) << key;
      EXPECT_THAT(empty.what(), HasSubstr("no value")) << key;
    }
  const InputError from_command_line = error_of([] { read_trial("", {"Trial/Mode="}); });
  EXPECT_TRUE(from_command_line.from_overrides());
  EXPECT_EQ(from_command_line.key(), "Trial/Mode");
  EXPECT_THAT(from_command_line.what(), HasSubstr("no value"));
}

TEST(SectionKeys, DefaultTextReadsBackExactly)
{
  for (const double value : {1e-8, 0.01, 1. / 3., 2.5e6, -9.81, 0.})
    EXPECT_EQ(std::stod(default_text(value)), value) << default_text(value);
  EXPECT_EQ(default_text(1e-8), "1e-8");
  EXPECT_EQ(default_text(30000.), "30000");
}

// The solver's own sections: enums and optionals, not strings and magic values.
TEST(FlowSections, NonlinearAndLinearSolverKeys)
{
  const std::string text = "subsection Nonlinear solver\n  set Mesh sequencing = 1\nend\n"
                           "subsection Linear solver\n  set Type = direct\nend\n";
  const CaseFile file = CaseFile::parse(text, "solver.prm", case_schema());
  EXPECT_EQ(read_section<NonlinearSolverSection>(file, "Nonlinear solver").mesh_sequencing, 1u);
  EXPECT_EQ(read_section<LinearSolverSection>(file, "Linear solver").type, LinearSolverType::direct);

  const CaseFile defaults = CaseFile::parse("", "empty.prm", case_schema());
  EXPECT_FALSE(read_section<NonlinearSolverSection>(defaults, "Nonlinear solver").mesh_sequencing); // automatic
  EXPECT_EQ(read_section<LinearSolverSection>(defaults, "Linear solver").type, LinearSolverType::automatic);
}
