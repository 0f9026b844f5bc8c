// Sweep files: expansion into cases, ranges, the explicit case list of `lentus fit`,
// tables, messages with file, line and key; row files and the results table.
#include "solver/errors.h"
#include "solver/input/case_schema.h"
#include "solver/report/caution.h"
#include "solver/sweep/results_table.h"
#include "solver/sweep/sweep_file.h"
#include "sweep_parsing.h"

#include <gmock/gmock.h>
#include <gtest/gtest.h>

#include <nlohmann/json.hpp>

#include <algorithm>
#include <filesystem>
#include <fstream>
#include <limits>

#include <unistd.h>

namespace
{
  using namespace lentus;
  using ::testing::HasSubstr;


  sweep::SweepPlan parse(const std::string &text, const std::vector<std::string> &sets = {})
  {
    return lentus::testing::parse_sweep(text, sets);
  }

  std::string error_of(const std::string &text)
  {
    return lentus::testing::sweep_error_of(text);
  }

  std::string value_of(const sweep::SweepCase &sweep_case, const std::string &path)
  {
    for (const sweep::Override &value : sweep_case.overrides)
      if (value.path == path)
        return value.value;
    return "(not set)";
  }

  const std::string n_key = "Rheology/Carreau-Yasuda/Flow index";
  const std::string p_key = "Boundary conditions/Pressure values";

  TEST(SweepFile, GridNestsDimensionsInFileOrder)
  {
    const auto plan = parse("vary " + p_key + " = 100, 0; 200, 0; 300, 0\nvary " + n_key + " = 0.4, 0.6\n");
    ASSERT_EQ(plan.cases.size(), 6u);
    EXPECT_EQ(plan.shape_description(), "3 x 2 grid");
    EXPECT_EQ(plan.cases[0].id, "case-0000");
    EXPECT_EQ(value_of(plan.cases[1], p_key), "100, 0");
    EXPECT_EQ(value_of(plan.cases[1], n_key), "0.6");
    EXPECT_EQ(value_of(plan.cases[2], p_key), "200, 0");
    EXPECT_EQ(value_of(plan.cases[5], p_key), "300, 0");
    EXPECT_EQ(plan.varied_keys, (std::vector<std::string>{p_key, n_key}));
    EXPECT_EQ(plan.n_invalid(), 0u);
    EXPECT_EQ(plan.results_folder, "out/test");
  }

  TEST(SweepFile, ZipTakesTheIthValuesTogether)
  {
    const auto plan = parse("combine = zip\nvary " + n_key + " = 0.4, 0.5, 0.6\nvary " + p_key +
                            " = 100, 0; 200, 0; 300, 0\n");
    ASSERT_EQ(plan.cases.size(), 3u);
    EXPECT_EQ(value_of(plan.cases[2], n_key), "0.6");
    EXPECT_EQ(value_of(plan.cases[2], p_key), "300, 0");
    EXPECT_THAT(error_of("combine = zip\nvary " + n_key + " = 0.4, 0.5\nvary " + p_key + " = 1, 0; 2, 0; 3, 0\n"),
                HasSubstr("test.sweep:4: " + p_key + ": 3 values, but " + n_key + " (line 3) has 2"));
  }

  TEST(SweepFile, LinearAndLogarithmicRanges)
  {
    const auto plan = parse("vary " + n_key + " = linear 0.3 to 0.9, 4 values\n"
                            "vary Geometry/Pipe/Radius = logarithmic 0.01 to 1, 3 values\n");
    ASSERT_EQ(plan.cases.size(), 12u);
    // linear: 0.3, 0.5, 0.7, 0.9; logarithmic: 0.01, 0.1, 1
    EXPECT_EQ(value_of(plan.cases[3], n_key), "0.5");
    EXPECT_EQ(value_of(plan.cases[11], n_key), "0.9");
    EXPECT_EQ(value_of(plan.cases[0], "Geometry/Pipe/Radius"), "0.01");
    EXPECT_EQ(value_of(plan.cases[1], "Geometry/Pipe/Radius"), "0.1");
    EXPECT_EQ(value_of(plan.cases[2], "Geometry/Pipe/Radius"), "1");
  }

  TEST(SweepFile, ExplicitCaseListOfFitIsAccepted)
  {
    // The format `lentus fit` writes (rheology/fit/sweep_file.h), with a base case given.
    const auto plan = parse("# Lentus sweep file, format 1\ncase fitted\n  " + n_key +
                            " = 0.4\n  Rheology/Carreau-Yasuda/Time constant = 2\nend\n"
                            "case sample-001\n  " + n_key + " = 0.45\n  Rheology/Carreau-Yasuda/Time constant = 1.5\nend\n");
    ASSERT_EQ(plan.cases.size(), 2u);
    EXPECT_TRUE(plan.has_names);
    EXPECT_EQ(plan.cases[1].name, "sample-001");
    EXPECT_EQ(value_of(plan.cases[1], "Rheology/Carreau-Yasuda/Time constant"), "1.5");
    EXPECT_TRUE(sweep::looks_like_sweep_file("# comment\ncase fitted\n"));
    EXPECT_TRUE(sweep::looks_like_sweep_file("base case = a.prm\n"));
    EXPECT_FALSE(sweep::looks_like_sweep_file("subsection Rheology\nend\n"));
  }

  TEST(SweepFile, CaseListIsOneDimensionOfTheGrid)
  {
    const auto plan = parse("case a\n  " + n_key + " = 0.4\nend\ncase b\n  " + n_key + " = 0.6\nend\nvary " + p_key +
                            " = 100, 0; 200, 0; 300, 0\n");
    ASSERT_EQ(plan.cases.size(), 6u);
    EXPECT_EQ(plan.cases[4].name, "b");
    EXPECT_EQ(value_of(plan.cases[4], p_key), "200, 0");
  }

  TEST(SweepFile, FixedValuesAndCommandLineSetsReachEveryCase)
  {
    const auto plan = parse("vary " + n_key + " = 0.4, 0.6\nfix Geometry/Refinement = 1\n", {"Output/Write fields=false"});
    for (const auto &sweep_case : plan.cases)
      {
        EXPECT_EQ(value_of(sweep_case, "Geometry/Refinement"), "1");
        EXPECT_EQ(value_of(sweep_case, "Output/Write fields"), "false");
      }
    EXPECT_NE(plan.cases[0].fingerprint, plan.cases[1].fingerprint);
    EXPECT_EQ(plan.cases[0].fingerprint, parse("vary " + n_key + " = 0.4, 0.7\nfix Geometry/Refinement = 1\n",
                                               {"Output/Write fields=false"}).cases[0].fingerprint);
  }

  TEST(SweepFile, MistakesNameFileLineAndKey)
  {
    EXPECT_THAT(error_of("vary Rheology/Carreau-Yasuda/Flow indx = 0.4\n"),
                HasSubstr("test.sweep:2: Rheology/Carreau-Yasuda/Flow indx: unknown key (did you mean '" + n_key + "'?)"));
    EXPECT_THAT(error_of("vary " + n_key + " = 0.4, -1\n"),
                HasSubstr("test.sweep:2: " + n_key + " = -1: out of range; allowed:"));
    EXPECT_THAT(error_of("vary " + n_key + " = linear 0.3 to 0.9\n"),
                HasSubstr("test.sweep:2: " + n_key + " = linear 0.3 to 0.9: cannot read the range"));
    EXPECT_THAT(error_of("vary Geometry/Pipe/Radius = logarithmic 0 to 1, 3 values\n"),
                HasSubstr("test.sweep:2: Geometry/Pipe/Radius = logarithmic 0 to 1, 3 values: a logarithmic range "
                          "needs FROM and TO above 0"));
    EXPECT_THAT(error_of("vary " + n_key + " = 0.4\nfix " + n_key + " = 0.5\n"),
                HasSubstr("test.sweep:3: " + n_key + ": already set by the sweep in test.sweep:2"));
    EXPECT_THAT(error_of("combine = diagonal\nvary " + n_key + " = 0.4\n"),
                HasSubstr("test.sweep:2: combine = diagonal: unknown combination; allowed: grid"));
    // An empty value is bad input here as in a case file (it would stand for the default).
    EXPECT_THAT(error_of("vary " + n_key + " = 0.4\nfix Geometry/Refinement =\n"),
                HasSubstr("test.sweep:3: Geometry/Refinement = (empty): no value; allowed:"));
    EXPECT_THAT(error_of("vary Output/Folder = a, b\n"), HasSubstr("test.sweep:2: Output/Folder: set by the sweep runner"));
    EXPECT_THAT(error_of("sweep " + n_key + " = 0.4\n"), HasSubstr("test.sweep:2: cannot read 'sweep"));
    EXPECT_THAT(error_of("case a\n  " + n_key + " = 0.4\n"), HasSubstr("test.sweep:2: case a is not closed by 'end'"));
    EXPECT_THAT(error_of("fix Geometry/Refinement = 1\n"), HasSubstr("test.sweep: nothing varies"));
    EXPECT_THAT(error_of("vary " + n_key + " = 0.4\nplot = maximum speed\nplot against = Geometry/Pipe/Radius\n"),
                HasSubstr("test.sweep:4: plot against = Geometry/Pipe/Radius: not a varied key; allowed: " + n_key));
  }

  TEST(SweepFile, CaseThatTheFlowReaderRejectsIsKeptWithItsLine)
  {
    const auto plan = parse("vary " + p_key + " = 100, 0; 100, 0, 7\n");
    ASSERT_EQ(plan.cases.size(), 2u);
    EXPECT_EQ(plan.n_invalid(), 1u);
    EXPECT_EQ(plan.cases[0].invalid_reason, "");
    EXPECT_THAT(plan.cases[1].invalid_reason,
                HasSubstr("test.sweep:2: case-0001: " + p_key + " = 100, 0, 7: more values than roles under Pressure"));
  }

  TEST(ResultsTable, RowFilesRoundTripAndIncompleteOnesAreRejected)
  {
    sweep::ResultRow row;
    row.index       = 3;
    row.id          = "case-0003";
    row.name        = "a\tb";
    row.fingerprint = 0xfedcba9876543210ull;
    row.values      = {{p_key, "100, 0"}};
    row.status      = sweep::status::not_converged;
    row.reason      = "line one\nline two";
    row.numbers     = {{"pressure drop inlet to outlet", 1234.5678901234567, "Pa", 0.012345678901234567}};
    row.wall_time   = 1.5;
    const std::string text = sweep::row_text(row);
    sweep::ResultRow  back;
    ASSERT_TRUE(sweep::parse_row(text, back));
    EXPECT_EQ(back.name, row.name);
    EXPECT_EQ(back.reason, row.reason);
    EXPECT_EQ(back.fingerprint, row.fingerprint);
    EXPECT_EQ(back.numbers[0].value, row.numbers[0].value);
    EXPECT_EQ(back.numbers[0].error, row.numbers[0].error); // the error bar too, to the last bit
    EXPECT_FALSE(sweep::parse_row(text.substr(0, text.size() - 4), back)); // no final "end"
  }

  // Every byte but the row file's own separators survives the row file: tabs, line breaks,
  // carriage returns, backslashes (also before 't' and 'n'), other control characters, and
  // a value that reads like the last line.
  TEST(ResultsTable, RowFilesKeepAnyText)
  {
    const std::string odd = "a\tb\nc\rd\\e\\tf\\ng\x01h\"i\\";
    sweep::ResultRow  row;
    row.id      = "case-0001";
    row.name    = odd;
    row.folder  = "end";
    row.values  = {{p_key, odd}, {"k", ""}};
    row.status  = sweep::status::bad_input;
    row.reason  = "\n" + odd + "\t";
    row.numbers = {{odd, -0.0, "", std::nullopt}, {"n", 1e-300, odd, std::nullopt}};
    sweep::ResultRow back;
    ASSERT_TRUE(sweep::parse_row(sweep::row_text(row), back));
    EXPECT_EQ(back.name, odd);
    EXPECT_EQ(back.folder, "end");
    EXPECT_EQ(back.values, row.values);
    EXPECT_EQ(back.reason, row.reason);
    ASSERT_EQ(back.numbers.size(), 2u);
    EXPECT_EQ(back.numbers[0].name, odd);
    EXPECT_EQ(back.numbers[0].unit, "");
    EXPECT_EQ(back.numbers[1].value, 1e-300);
    EXPECT_EQ(back.numbers[1].unit, odd);
  }

  // Names and reasons with control characters, quotes and commas: results.jsonl parses back to
  // the same text (RFC 8259, 2017, section 7: control characters escaped), results.csv quotes
  // such cells and doubles quotes (RFC 4180, 2005, section 2, rules 6 and 7). Numbers that are
  // not finite are null in JSON and empty in CSV. Both carry the full caution on every row.
  TEST(ResultsTable, AnyNameSurvivesBothTablesAndEveryRowCarriesTheCaution)
  {
    const std::string name = "tab\there, \"quoted\"\nnext\rline\x02";
    sweep::ResultRow  row;
    row.id      = "case-0000";
    row.name    = name;
    row.values  = {{p_key, "100, 0"}, {"Geometry/Refinement", "2"}};
    row.status  = sweep::status::not_converged;
    row.reason  = "said \"no\"\tthen\nstopped";
    row.numbers = {{"maximum speed", std::numeric_limits<double>::quiet_NaN(), "m/s", std::nullopt},
                   {"flow rate", 1.234567890123e-5, "m^3/s", std::nullopt}};
    const auto [csv, jsonl] =
      sweep::table_text({row}, {p_key, "Geometry/Refinement"}, {"Pa", ""}, true);

    ASSERT_EQ(std::count(jsonl.begin(), jsonl.end(), '\n'), 1) << "one line per case";
    const auto line = nlohmann::ordered_json::parse(jsonl);
    EXPECT_EQ(line["name"].get<std::string>(), name);
    EXPECT_EQ(line["reason"].get<std::string>(), row.reason);
    EXPECT_TRUE(line["design numbers"]["maximum speed"]["value"].is_null());
    EXPECT_EQ(line["design numbers"]["flow rate"]["value"].get<double>(), 1.234567890e-5); // 10 digits, as the CSV
    EXPECT_TRUE(line["values"]["Geometry/Refinement"]["value"].is_number_integer());
    EXPECT_EQ(line["values"]["Geometry/Refinement"]["value"].get<int>(), 2);
    EXPECT_EQ(line["caution"].get<std::string>(), report::caution);
    std::vector<std::string> keys;
    for (const auto &item : line.items())
      keys.push_back(item.key());
    EXPECT_EQ(keys, (std::vector<std::string>{"case", "index", "name", "values", "status", "reason", "design numbers",
                                              "Newton iterations", "wall time [s]", "ranks", "folder", "caution"}));

    EXPECT_THAT(csv, HasSubstr(",\"tab\there, \"\"quoted\"\"\nnext\rline\x02\","));
    EXPECT_THAT(csv, HasSubstr(",\"said \"\"no\"\"\tthen\nstopped\","));
    EXPECT_THAT(csv, HasSubstr(",not converged,"));
    EXPECT_THAT(csv, HasSubstr("stopped\",,1.23456789e-05,"));
    EXPECT_THAT(csv, HasSubstr(",folder,caution\n"));
    EXPECT_THAT(csv, HasSubstr(",\"" + std::string(report::caution) + "\"\n"));
  }

  TEST(ResultsTable, HeaderCarriesUnitsAndCellsAreQuoted)
  {
    sweep::ResultRow row;
    row.id      = "case-0000";
    row.values  = {{p_key, "100, 0"}};
    row.status  = sweep::status::converged;
    row.numbers = {{"maximum speed", 0.25, "m/s", std::nullopt}};
    const auto [csv, jsonl] = sweep::table_text({row}, {p_key}, {"Pa"}, false);
    EXPECT_THAT(csv, HasSubstr("case,Boundary conditions/Pressure values [Pa],status,reason,maximum speed [m/s],"
                               "Newton iterations,wall time [s],ranks,folder,caution\n"));
    EXPECT_THAT(csv, HasSubstr("case-0000,\"100, 0\",converged,,0.25,"));
    const auto line = nlohmann::json::parse(jsonl);
    // Compared as text: Google Test would print a JSON value as a container of itself.
    EXPECT_EQ(line["design numbers"]["maximum speed"].dump(), R"({"error":null,"unit":"m/s","value":0.25})");
    EXPECT_EQ(line["values"][p_key]["value"].get<std::string>(), "100, 0");
    EXPECT_EQ(sweep::unit_of_key(input::case_schema(), n_key), "-");
    EXPECT_EQ(sweep::unit_of_key(input::case_schema(), "Geometry/Pipe/Radius"), "m");
  }

  // Row files keep whether a number is a key number; rows written before that still read.
  TEST(ResultsTable, RowFilesKeepKeyNumbers)
  {
    sweep::ResultRow row;
    row.id      = "case-0000";
    row.status  = sweep::status::converged;
    row.numbers = {{"pressure drop inlet to outlet", 1.5, "Pa", std::nullopt, true},
                   {"a", 2., "m", 0.5, true},
                   {"b", 3., "m", 0.25, false}};
    sweep::ResultRow back;
    ASSERT_TRUE(sweep::parse_row(sweep::row_text(row), back));
    ASSERT_EQ(back.numbers.size(), 3u);
    EXPECT_TRUE(back.numbers[0].key);
    EXPECT_FALSE(back.numbers[0].error.has_value());
    EXPECT_TRUE(back.numbers[1].key);
    EXPECT_EQ(back.numbers[1].error, 0.5);
    EXPECT_FALSE(back.numbers[2].key);
    ASSERT_TRUE(sweep::parse_row("id\tcase-0001\nstatus\tconverged\nnumber\tb\t3\tm\t0.25\nend\n", back));
    EXPECT_FALSE(back.numbers[0].key);
    EXPECT_EQ(back.numbers[0].error, 0.25);
    EXPECT_FALSE(sweep::parse_row("id\tcase-0001\nstatus\tconverged\nnumber\tb\t3\tm\t0.25\tkez\nend\n", back));
  }

  // A number with an error bar in some row gets an error column beside it (empty where a row has no
  // bar); the JSON lines carry the bar as "error".
  TEST(ResultsTable, ErrorBarsGetTheirOwnColumns)
  {
    sweep::ResultRow first, second;
    first.id       = "case-0000";
    first.status   = sweep::status::converged;
    first.numbers  = {{"pressure drop inlet to outlet", 2.5e6, "Pa", 1.25e4}, {"maximum speed", 0.25, "m/s", std::nullopt}};
    second.id      = "case-0001";
    second.status  = sweep::status::converged;
    second.numbers = {{"pressure drop inlet to outlet", 3e6, "Pa", std::nullopt}};
    const auto [csv, jsonl] = sweep::table_text({first, second}, {}, {}, false);
    EXPECT_THAT(csv, HasSubstr("case,status,reason,pressure drop inlet to outlet [Pa],"
                               "pressure drop inlet to outlet error [Pa],maximum speed [m/s],Newton iterations"));
    EXPECT_THAT(csv, HasSubstr("case-0000,converged,,2500000,12500,0.25,"));
    EXPECT_THAT(csv, HasSubstr("case-0001,converged,,3000000,,,"));
    const auto line = nlohmann::json::parse(jsonl.substr(0, jsonl.find('\n')));
    EXPECT_EQ(line["design numbers"]["pressure drop inlet to outlet"]["error"].get<double>(), 1.25e4);
  }
} // namespace

namespace
{
  std::string temporary_file(const std::string &name, const std::string &text)
  {
    const auto folder = std::filesystem::temp_directory_path() / ("lentus_sweep_test_" + std::to_string(::getpid()));
    std::filesystem::create_directories(folder);
    std::ofstream(folder / name) << text;
    return (folder / name).string();
  }

  TEST(SweepFile, TableRowsAreCases)
  {
    const std::string table = temporary_file("points.csv", "# two cases\n" + n_key + "," + p_key +
                                                              "\n0.4,\"100, 0\"\n0.6,\"300, 0\"\n");
    const auto plan = parse("table = " + table + "\nvary Geometry/Refinement = 1, 2\n");
    ASSERT_EQ(plan.cases.size(), 4u);
    EXPECT_EQ(value_of(plan.cases[2], n_key), "0.6");
    EXPECT_EQ(value_of(plan.cases[2], p_key), "300, 0");
    EXPECT_EQ(value_of(plan.cases[3], "Geometry/Refinement"), "2");
  }

  TEST(SweepFile, CasesFromAnotherFileJoinTheCaseList)
  {
    const std::string list = temporary_file("fit_samples.sweep", "# as lentus fit writes it\ncase fitted\n  " + n_key +
                                                                "= 0.4\nend\ncase sample-001\n  " + n_key + " = 0.5\nend\n");
    const auto plan = parse("cases from = " + list + "\nvary " + p_key + " = 100, 0; 200, 0\n");
    ASSERT_EQ(plan.cases.size(), 4u);
    EXPECT_EQ(plan.cases[3].name, "sample-001");
    EXPECT_EQ(value_of(plan.cases[3], n_key), "0.5");
    EXPECT_EQ(value_of(plan.cases[3], p_key), "200, 0");
    const std::string bad = temporary_file("bad_list.prm", "case a\n  " + n_key + " = 0.4\nend\nvary " + n_key + " = 1\n");
    EXPECT_THAT(error_of("cases from = " + bad + "\n"),
                HasSubstr(bad + ":4: cannot read 'vary " + n_key + " = 1'; a file named by 'cases from' holds only"));
  }

  TEST(SweepFile, ValuesTheCaseWouldIgnoreMakeItInvalid)
  {
    // The base case selects Carreau-Yasuda and a pipe: Cross parameters and channel
    // dimensions would change nothing (a fitted case list against the wrong base case).
    const auto plan = parse("vary Rheology/Cross/Zero-shear viscosity = 5, 6\n");
    ASSERT_EQ(plan.n_invalid(), 2u);
    EXPECT_THAT(plan.cases[0].invalid_reason,
                HasSubstr("test.sweep:2: case-0000: Rheology/Cross/Zero-shear viscosity = 5: would be ignored, because "
                          "Rheology/Viscosity law = Carreau-Yasuda"));
    EXPECT_EQ(parse("vary Geometry/Channel/Length = 1, 2\n").n_invalid(), 2u);
    EXPECT_EQ(parse("vary " + n_key + " = 0.5, 0.6\n").n_invalid(), 0u);
  }
} // namespace
