// summary.json: written by one JSON library, valid whatever the text holds, with every
// design number's fields and every mesh's and solve's record.
#include "solver/report/caution.h"
#include "solver/report/summary.h"

#include <gtest/gtest.h>
#include <nlohmann/json.hpp>

#include <cmath>
#include <limits>

namespace
{
  using namespace lentus::report;

  Summary two_mesh_summary()
  {
    Summary summary;
    summary.case_file           = "odd \"name\"\twith\ncontrol\x01characters.prm";
    summary.converged           = true;
    summary.velocity_components = "r z";
    summary.viscosity_law       = "Bingham";
    summary.yield_stress        = 12.5;
    summary.numbers.add("pressure drop inlet to outlet", "dp", 1234.5678901234567, "Pa", Group::flow, true);
    summary.numbers.add("not a number", "x", std::numeric_limits<double>::quiet_NaN(), "-", Group::regions);
    summary.history.begin_mesh(64, 1000, "direct (MUMPS)");
    summary.history.begin_solve("direct solve", 10.);
    summary.history.add({StepKind::picard, 1., 1., 1, 0.5});
    summary.history.add({StepKind::newton, 1e-3, 0.5, 1, 0.25});
    summary.history.begin_mesh(256, 4000, "direct (MUMPS)");
    summary.history.begin_solve("from the coarser mesh", 0.1);
    summary.history.add({StepKind::newton, 1e-9, 1., 1, 1.});
    summary.case_cautions.emplace_back("a case caution");
    return summary;
  }
} // namespace

// Control characters, quotes and tabs in a case name come out escaped (RFC 8259, section 7):
// the text parses and gives the name back unchanged.
TEST(Summary, AnyTextRoundTrips)
{
  const Summary        summary = two_mesh_summary();
  const nlohmann::json json    = nlohmann::json::parse(to_json(summary));
  EXPECT_EQ(json.at("case").get<std::string>(), summary.case_file);
  EXPECT_EQ(json.at("caution").get<std::string>(), caution);
  EXPECT_EQ(json.at("case cautions").at(0).get<std::string>(), "a case caution");
}

// Numbers keep 17 significant digits (enough to round-trip a double); a non-finite one is null.
TEST(Summary, NumbersRoundTripAndNonFiniteIsNull)
{
  const nlohmann::json json    = nlohmann::json::parse(to_json(two_mesh_summary()));
  const auto          &numbers = json.at("design numbers");
  const auto          &dp      = numbers.at("pressure drop inlet to outlet");
  EXPECT_EQ(dp.at("value").get<double>(), 1234.5678901234567);
  EXPECT_EQ(dp.at("unit"), "Pa");
  EXPECT_EQ(dp.at("symbol"), "dp");
  EXPECT_EQ(dp.at("group"), "flow");
  EXPECT_TRUE(dp.at("key").get<bool>());
  EXPECT_TRUE(dp.at("mesh error").is_null());
  EXPECT_TRUE(dp.at("error").is_null());
  EXPECT_EQ(dp.at("mesh error method"), "not estimated");
  EXPECT_EQ(dp.at("regularization error method"), "not estimated");
  EXPECT_TRUE(numbers.at("not a number").at("value").is_null());
  EXPECT_TRUE(json.at("dead-zone speed fraction").is_null());
}

// An estimated accuracy is written in full: the bar is the sum of its parts, each with its method, and
// the accuracy block lists every mesh's numbers.
TEST(Summary, AccuracyIsWrittenWithItsMethods)
{
  Summary summary = two_mesh_summary();
  DesignNumber dp = *summary.numbers.find("pressure drop inlet to outlet");
  dp.accuracy.mesh_error           = 3.;
  dp.accuracy.mesh_method          = "three meshes";
  dp.accuracy.order                = 1.5;
  dp.accuracy.regularization_error = 0.5;
  dp.accuracy.regularization_method = "second solve";
  dp.accuracy.extrapolated         = 1230.;
  summary.numbers.replace(dp);
  summary.accuracy.regularization_factor = 4.;
  summary.accuracy.meshes.push_back({64, 1000, summary.numbers});
  const nlohmann::json json  = nlohmann::json::parse(to_json(summary));
  const auto          &entry = json.at("design numbers").at("pressure drop inlet to outlet");
  EXPECT_EQ(entry.at("error").get<double>(), 3.5);
  EXPECT_EQ(entry.at("mesh error method"), "three meshes");
  EXPECT_EQ(entry.at("order of convergence").get<double>(), 1.5);
  EXPECT_EQ(entry.at("regularization error").get<double>(), 0.5);
  EXPECT_EQ(entry.at("extrapolated value").get<double>(), 1230.);
  EXPECT_EQ(json.at("accuracy").at("regularization check"), "made");
  EXPECT_EQ(json.at("accuracy").at("target"), "none");
  EXPECT_EQ(json.at("accuracy").at("meshes").at(0).at("design numbers").at("pressure drop inlet to outlet").get<double>(),
            1234.5678901234567);
  const auto lines = design_number_lines(summary.numbers);
  EXPECT_NE(lines.at(0).find("+/- 3.5"), std::string::npos) << lines.at(0);
}

// The iteration totals of the numerics are the final mesh's; each mesh and each solve is listed.
TEST(Summary, MeshesAndSolvesAsRecorded)
{
  const nlohmann::json json     = nlohmann::json::parse(to_json(two_mesh_summary()));
  const auto          &numerics = json.at("numerics");
  EXPECT_EQ(numerics.at("Newton iterations"), 1);
  EXPECT_EQ(numerics.at("Picard iterations"), 0);
  EXPECT_EQ(numerics.at("final residual").get<double>(), 1e-9);
  ASSERT_EQ(numerics.at("meshes").size(), 2u);
  EXPECT_EQ(numerics.at("meshes").at(0).at("Newton iterations"), 1);
  EXPECT_EQ(numerics.at("meshes").at(0).at("Picard iterations"), 1);
  EXPECT_EQ(numerics.at("meshes").at(0).at("seconds").get<double>(), 0.75);
  EXPECT_EQ(numerics.at("meshes").at(1).at("cells"), 256);
  ASSERT_EQ(numerics.at("solves").size(), 2u);
  const auto &first = numerics.at("solves").at(0);
  EXPECT_EQ(first.at("mesh"), 0);
  EXPECT_EQ(first.at("initial residual").get<double>(), 10.);
  EXPECT_EQ(first.at("iterations").at(0).at("kind"), "Picard");
  EXPECT_EQ(first.at("iterations").at(1).at("step").get<double>(), 0.5);
  EXPECT_EQ(numerics.at("solves").at(1).at("label"), "from the coarser mesh");
}

// Text that is not UTF-8 (a file name from another system, say) does not fail a finished run.
TEST(Summary, TextThatIsNotUtf8IsReplaced)
{
  Summary summary   = two_mesh_summary();
  summary.case_file = "case\xff\xfe.prm";
  std::string text;
  ASSERT_NO_THROW(text = to_json(summary));
  EXPECT_NO_THROW(nlohmann::json::parse(text));
}

TEST(DesignNumbers, ANameTwiceIsAnError)
{
  DesignNumbers numbers;
  numbers.add("maximum speed", "u_max", 1., "m/s", Group::flow);
  EXPECT_THROW(numbers.add("maximum speed", "u_max", 2., "m/s", Group::flow), std::logic_error);
  EXPECT_THROW(numbers.value("torque"), std::out_of_range);
}

// Seconds by phase: each mesh's own, the run's sums, and the rest of the wall time as "other";
// the log's line lists them largest first.
TEST(Summary, SecondsByPhase)
{
  Summary summary = two_mesh_summary();
  summary.history.add_seconds(Phase::jacobian_assembly, 2.);
  summary.history.add_seconds(Phase::solver_setup, 3.);
  summary.history.add_seconds(Phase::line_search, 0.5);
  summary.resources.wall_seconds = 10.;
  SolveHistory before;
  before.add_seconds(Phase::mesh_setup, 0.25); // before any mesh: counted to the run
  before.begin_mesh(4, 50, "direct (MUMPS)");
  before.add_mesh_seconds(0.5);
  EXPECT_EQ(before.run_phases()[Phase::mesh_setup], 0.75);

  const nlohmann::json json   = nlohmann::json::parse(to_json(summary));
  const auto          &phases = json.at("numerics").at("seconds by phase");
  for (std::size_t i = 0; i < n_phases; ++i)
    EXPECT_TRUE(phases.contains(to_string(static_cast<Phase>(i)))) << to_string(static_cast<Phase>(i));
  EXPECT_EQ(phases.at("Jacobian assembly").get<double>(), 2.);
  EXPECT_EQ(phases.at("linear solver set-up").get<double>(), 3.);
  EXPECT_EQ(phases.at("other").get<double>(), 4.5);
  // The phases were added while the second mesh was the current one: the first has none.
  EXPECT_EQ(json.at("numerics").at("meshes").at(0).at("seconds by phase").at("Jacobian assembly").get<double>(), 0.);
  EXPECT_EQ(json.at("numerics").at("meshes").at(1).at("seconds by phase").at("Jacobian assembly").get<double>(), 2.);

  const std::string line = phase_line(summary);
  EXPECT_EQ(line.find("Seconds by phase: other 4.50, linear solver set-up 3.00, Jacobian assembly 2.00, line search 0.50"),
            0u)
    << line;
  EXPECT_NE(line.find("(of 10.00 s wall time)"), std::string::npos) << line;
}
