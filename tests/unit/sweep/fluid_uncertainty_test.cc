// The uncertainty from the fluid: quantiles, the `fluid samples` line of sweep files, the
// spread of design numbers over the samples of a fitted fluid and its tables.
#include "solver/errors.h"
#include "solver/input/case_schema.h"
#include "solver/report/caution.h"
#include "solver/sweep/fluid_uncertainty.h"
#include "solver/sweep/results_table.h"
#include "solver/sweep/sweep_file.h"
#include "sweep_parsing.h"

#include <gmock/gmock.h>
#include <gtest/gtest.h>

#include <nlohmann/json.hpp>

#include <algorithm>
#include <filesystem>
#include <fstream>
#include <random>
#include <stdexcept>

#include <unistd.h>

namespace
{
  using namespace lentus;
  using ::testing::HasSubstr;
  using ::testing::Not;

  const std::string n_key     = "Rheology/Carreau-Yasuda/Flow index";
  const std::string p_key     = "Boundary conditions/Pressure values";
  const std::string dp        = "pressure drop inlet to outlet";

  sweep::SweepPlan parse(const std::string &text, const std::vector<std::string> &sets = {})
  {
    return lentus::testing::parse_sweep(text, sets);
  }

  std::string error_of(const std::string &text)
  {
    return lentus::testing::sweep_error_of(text);
  }

  /// A case list: `fitted` and samples sample-001 ... sample-NNN, with Flow index values.
  std::string case_list(const std::size_t samples)
  {
    std::string text = "case fitted\n  " + n_key + " = 0.5\nend\n";
    for (std::size_t k = 1; k <= samples; ++k)
      text += "case sample-00" + std::to_string(k) + "\n  " + n_key + " = 0." + std::to_string(40 + k) + "\nend\n";
    return text;
  }

  // Source: Hyndman, R. J. & Fan, Y. (1996), Sample quantiles in statistical packages, The American
  // Statistician 50(4), 361-365, definition 7: Q(p) = x_j + (h - j)(x_{j+1} - x_j), h = (n - 1) p + 1,
  // j = floor(h), x_1 <= ... <= x_n. Values computed by hand from it for the list 7, 1, 10, 3, 2, 4
  // (sorted 1, 2, 3, 4, 7, 10; n - 1 = 5).
  TEST(FluidUncertainty, QuantilesInterpolateBetweenOrderStatistics)
  {
    const std::vector<double> values = {7., 1., 10., 3., 2., 4.};
    EXPECT_DOUBLE_EQ(sweep::quantile(values, 0.025), 1.125); // h = 1.125: 1 + 0.125 (2 - 1)
    EXPECT_DOUBLE_EQ(sweep::quantile(values, 0.25), 2.25);   // h = 2.25: 2 + 0.25 (3 - 2)
    EXPECT_DOUBLE_EQ(sweep::quantile(values, 0.975), 9.625); // h = 5.875: 7 + 0.875 (10 - 7)
    EXPECT_DOUBLE_EQ(sweep::quantile(values, 0.), 1.);
    EXPECT_DOUBLE_EQ(sweep::quantile(values, 1.), 10.);
    // Source: the example of numpy.percentile in the NumPy reference, np.percentile([[10, 7, 4],
    // [3, 2, 1]], 50) = 3.5 (NumPy's default method, "linear", is definition 7; from memory).
    EXPECT_DOUBLE_EQ(sweep::quantile({10., 7., 4., 3., 2., 1.}, 0.5), 3.5);
    // One value is every quantile; with 41 values the 2.5% quantile is the second smallest exactly
    // (h = 40 x 0.025 + 1 = 2), the 97.5% one the second largest (definition 7 above).
    EXPECT_DOUBLE_EQ(sweep::quantile({4.5}, 0.975), 4.5);
    std::vector<double> many(41);
    for (std::size_t i = 0; i < many.size(); ++i)
      many[i] = static_cast<double>(40 - i) * 0.5;
    EXPECT_DOUBLE_EQ(sweep::quantile(many, 0.025), 0.5);
    EXPECT_DOUBLE_EQ(sweep::quantile(many, 0.975), 19.5);
    EXPECT_THROW(sweep::quantile({}, 0.5), std::invalid_argument);
    EXPECT_THROW(sweep::quantile({1.}, 1.5), std::invalid_argument);
  }

  // Source: the range of n independent samples of a continuous distribution covers on average the
  // fraction (n - 1)/(n + 1) of it (F(x_(k)) is Beta(k, n + 1 - k) with mean k/(n + 1); Wilks 1941,
  // Ann. Math. Statist. 12, 91-96; from memory). Checked against a Monte Carlo estimate with uniform
  // samples, where the covered fraction is max - min: 20000 draws, standard error about 8e-4 for n = 10.
  TEST(FluidUncertainty, SampleRangeCoversWhatOrderStatisticsSay)
  {
    EXPECT_DOUBLE_EQ(sweep::expected_range_coverage(10), 9. / 11.);
    EXPECT_DOUBLE_EQ(sweep::expected_range_coverage(sweep::samples_for_a_span), 0.95);
    EXPECT_LT(sweep::expected_range_coverage(sweep::samples_for_a_span - 1), 0.95);
    EXPECT_EQ(sweep::expected_range_coverage(1), 0.);
    std::mt19937_64                        generator(7);
    std::uniform_real_distribution<double> uniform(0., 1.);
    for (const std::size_t n : {std::size_t(5), std::size_t(10), std::size_t(39)})
      {
        double sum = 0.;
        for (int draw = 0; draw < 20000; ++draw)
          {
            double low = 1., high = 0.;
            for (std::size_t i = 0; i < n; ++i)
              {
                const double u = uniform(generator);
                low            = std::min(low, u);
                high           = std::max(high, u);
              }
            sum += high - low;
          }
        EXPECT_NEAR(sum / 20000., sweep::expected_range_coverage(n), 5e-3) << n << " samples";
      }
  }

  TEST(FluidUncertainty, SweepFileMarksTheCaseListAsFluidSamples)
  {
    const auto plan = parse("fluid samples = fitted\n" + case_list(3));
    ASSERT_TRUE(plan.fluid_samples.has_value());
    EXPECT_EQ(plan.fluid_samples->fitted, "fitted");
    EXPECT_EQ(plan.fluid_samples->line, 2);
    EXPECT_EQ(plan.fluid_samples->keys, std::vector<std::string>{n_key});
    EXPECT_TRUE(plan.group_keys().empty());
    EXPECT_THAT(plan.plan_text(), HasSubstr("fluid samples: case fitted holds the fit's estimates"));
    EXPECT_TRUE(sweep::looks_like_sweep_file("# from lentus fit\nfluid samples = fitted\ncase fitted\n"));
    EXPECT_FALSE(parse(case_list(3)).fluid_samples.has_value());
    // Crossed with another key: that key makes the groups.
    const auto crossed = parse("vary " + p_key + " = 100, 0; 200, 0\nfluid samples = fitted\n" + case_list(2));
    ASSERT_EQ(crossed.cases.size(), 6u);
    EXPECT_EQ(crossed.group_keys(), std::vector<std::string>{p_key});
  }

  std::string temporary_file(const std::string &name, const std::string &text)
  {
    const auto folder = std::filesystem::temp_directory_path() / ("lentus_fluid_test_" + std::to_string(::getpid()));
    std::filesystem::create_directories(folder);
    std::ofstream(folder / name) << text;
    return (folder / name).string();
  }

  TEST(FluidUncertainty, TheLineMayStandInTheFileNamedByCasesFrom)
  {
    // As `lentus fit` writes samples.sweep, crossed with flow rates in a sweep file of one's own.
    const std::string list = temporary_file("samples.sweep", "# fit\nfluid samples = fitted\n" + case_list(2));
    const auto        plan = parse("cases from = " + list + "\nvary " + p_key + " = 100, 0; 200, 0\n");
    ASSERT_TRUE(plan.fluid_samples.has_value());
    EXPECT_EQ(plan.fluid_samples->file, list);
    EXPECT_EQ(plan.fluid_samples->line, 2);
    EXPECT_THAT(error_of("fluid samples = fitted\ncases from = " + list + "\n"),
                HasSubstr(list + ":2: fluid samples = fitted: set twice (first in test.sweep:2); allowed: one"));
  }

  TEST(FluidUncertainty, MistakesInTheLineNameFileAndLine)
  {
    EXPECT_THAT(error_of("fluid samples = best\n" + case_list(2)),
                HasSubstr("test.sweep:2: fluid samples = best: no case of that name; allowed: the name of the case "
                          "with the fit's estimates, one of fitted, sample-001, sample-002"));
    EXPECT_THAT(error_of("vary " + n_key + " = 0.4, 0.5\nfluid samples = fitted\n"),
                HasSubstr("test.sweep:3: fluid samples = fitted: the sweep has no explicit cases to be samples"));
    EXPECT_THAT(error_of("fluid samples = fitted\ncase fitted\n  " + n_key + " = 0.5\nend\n"),
                HasSubstr("test.sweep:2: fluid samples = fitted: the case list holds no samples besides it"));
    EXPECT_THAT(error_of("combine = zip\nvary " + p_key + " = 100, 0; 200, 0; 300, 0\nfluid samples = fitted\n" +
                         case_list(2)),
                HasSubstr("test.sweep:4: fluid samples = fitted: with 'combine = zip' each sample would run at "
                          "other values of the other keys"));
    EXPECT_THAT(error_of("fluid samples =\n" + case_list(2)), HasSubstr("test.sweep:2: fluid samples = (empty)"));
    EXPECT_THAT(error_of("fluid samples = fitted\nfluid samples = fitted\n" + case_list(2)),
                HasSubstr("test.sweep:3: fluid samples = fitted: set twice (first in test.sweep:2)"));
    // Zip of the case list alone is the list itself: nothing mixes in.
    EXPECT_EQ(parse("combine = zip\nfluid samples = fitted\n" + case_list(2)).cases.size(), 3u);
  }

  sweep::ResultRow row_of(const sweep::SweepCase &sweep_case, const std::string &status, const double pressure_drop,
                          const std::optional<double> error = std::nullopt)
  {
    sweep::ResultRow row;
    row.index   = sweep_case.index;
    row.id      = sweep_case.id;
    row.name    = sweep_case.name;
    row.status  = status;
    row.numbers = {{dp, pressure_drop, "Pa", error, true},
                   {"maximum speed", pressure_drop / 1000., "m/s", std::nullopt, false}};
    return row;
  }

  // Five samples, one of them not converged, the fitted case with an error bar: the span is over the
  // four converged samples (hand-computed by definition 7, Hyndman & Fan 1996: sorted 90, 100, 110, 130;
  // h - 1 = 3 x 0.025 = 0.075: 90 + 0.075 x 10 = 90.75; 3 x 0.975 = 2.925: 110 + 0.925 x 20 = 128.5).
  TEST(FluidUncertainty, SpreadOverTheConvergedSamplesBesideTheFittedValue)
  {
    const auto plan = parse("fluid samples = fitted\n" + case_list(5));
    const std::vector<sweep::ResultRow> rows = {
      row_of(plan.cases[0], sweep::status::converged, 105., 2.),
      row_of(plan.cases[1], sweep::status::converged, 130.),
      row_of(plan.cases[2], sweep::status::not_converged, 500.), // its last iterate must not count
      row_of(plan.cases[3], sweep::status::converged, 90.),
      row_of(plan.cases[4], sweep::status::converged, 110.),
      row_of(plan.cases[5], sweep::status::converged, 100.),
    };
    const auto groups = sweep::fluid_uncertainty(plan, rows);
    ASSERT_EQ(groups.size(), 1u);
    const sweep::FluidGroup &group = groups[0];
    EXPECT_EQ(group.fitted_id, "case-0000");
    EXPECT_EQ(group.samples, 5u);
    EXPECT_EQ(group.converged, 4u);
    EXPECT_EQ(group.failed, 1u);
    ASSERT_EQ(group.numbers.size(), 2u);
    const sweep::FluidSpread &spread = group.numbers[0];
    EXPECT_EQ(spread.name, dp);
    EXPECT_TRUE(spread.key);
    EXPECT_FALSE(group.numbers[1].key);
    EXPECT_EQ(*spread.fitted, 105.);
    EXPECT_EQ(*spread.fitted_error, 2.);
    EXPECT_EQ(spread.converged, 4u);
    EXPECT_DOUBLE_EQ(*spread.low, 90.75);
    EXPECT_DOUBLE_EQ(*spread.high, 128.5);
    EXPECT_EQ(*spread.minimum, 90.);
    EXPECT_EQ(*spread.maximum, 130.);
    EXPECT_THAT(spread.note, HasSubstr("1 of 5 samples did not converge or failed and are left out"));
    // (n - 1)/(n + 1) = 3/5 for 4 samples (see SampleRangeCoversWhatOrderStatisticsSay).
    EXPECT_THAT(spread.note, HasSubstr("rough: the range of 4 samples covers on average 60% of the fluid's spread"));
    EXPECT_EQ(sweep::fluid_plot_numbers(groups, ""), std::vector<std::string>{dp});
    EXPECT_EQ(sweep::fluid_plot_numbers(groups, "maximum speed"), std::vector<std::string>{"maximum speed"});

    // The fitted case without a result (collect before it finished), a sample missing too.
    const auto partial = sweep::fluid_uncertainty(plan, {rows[1], rows[3]});
    EXPECT_FALSE(partial[0].numbers[0].fitted.has_value());
    EXPECT_EQ(partial[0].missing, 3u);
    EXPECT_THAT(partial[0].numbers[0].note, HasSubstr("the fitted case has no result yet"));
    EXPECT_THAT(partial[0].numbers[0].note, HasSubstr("3 of 5 samples have no result yet"));
  }

  TEST(FluidUncertainty, EachValueOfTheOtherKeysIsAGroupOfItsOwn)
  {
    const auto plan = parse("vary " + p_key + " = 100, 0; 200, 0\nfluid samples = fitted\n" + case_list(2));
    // Grid order: the pressure varies slowest; cases 0-2 at 100 Pa, 3-5 at 200 Pa.
    std::vector<sweep::ResultRow> rows;
    for (const sweep::SweepCase &sweep_case : plan.cases)
      rows.push_back(row_of(sweep_case, sweep::status::converged, 10. * static_cast<double>(sweep_case.index + 1)));
    const auto groups = sweep::fluid_uncertainty(plan, rows);
    ASSERT_EQ(groups.size(), 2u);
    EXPECT_EQ(groups[1].values, (std::vector<std::pair<std::string, std::string>>{{p_key, "200, 0"}}));
    EXPECT_EQ(groups[1].fitted_id, "case-0003");
    EXPECT_EQ(*groups[1].numbers[0].fitted, 40.);
    EXPECT_EQ(*groups[1].numbers[0].minimum, 50.);
    EXPECT_EQ(*groups[1].numbers[0].maximum, 60.);
    EXPECT_EQ(*groups[0].numbers[0].maximum, 30.);
    EXPECT_THAT(groups[0].numbers[0].note, HasSubstr("the fitted value lies outside the span"));

    // Tables: one line per group and number, the group's value with its unit, the label, the
    // method and the full caution on every line (as results.csv and results.jsonl carry it).
    const auto [csv, jsonl] = sweep::fluid_uncertainty_tables(groups, plan.group_keys(), {"Pa"}, "fitted");
    EXPECT_EQ(csv.substr(0, csv.find('\n') + 1),
              "Boundary conditions/Pressure values [Pa],design number,unit,key number,fitted case,fitted status,"
              "fitted value,fitted error (mesh + regularization),samples,converged samples,2.5% quantile,"
              "97.5% quantile,minimum,maximum,note,uncertainty,quantiles,caution\n");
    EXPECT_THAT(csv, HasSubstr("\"200, 0\"," + dp + ",Pa,yes,case-0003 (fitted),converged,40,,2,2,50.25,59.75,50,60,"));
    EXPECT_EQ(std::count(csv.begin(), csv.end(), '\n'), 5);
    std::istringstream lines(jsonl);
    int                count = 0;
    for (std::string text; std::getline(lines, text); ++count)
      {
        const auto line = nlohmann::json::parse(text);
        EXPECT_EQ(line["caution"].get<std::string>(), report::caution);
        EXPECT_EQ(line["fluid"]["what"].get<std::string>(), sweep::fluid_uncertainty_label);
        EXPECT_THAT(line["fluid"]["quantiles"].get<std::string>(), HasSubstr("Hyndman & Fan 1996, definition 7"));
      }
    EXPECT_EQ(count, 4);
    const auto first = nlohmann::json::parse(jsonl.substr(0, jsonl.find('\n')));
    EXPECT_EQ(first["values"][p_key]["value"].get<std::string>(), "100, 0");
    EXPECT_EQ(first["fitted case"]["value"].get<double>(), 10.);
    EXPECT_EQ(first["fluid"]["2.5% quantile"].get<double>(), 20.25);

    const std::string summary = sweep::fluid_uncertainty_summary(groups, "fluid_uncertainty.csv");
    EXPECT_THAT(summary, HasSubstr("Uncertainty from the fluid (fit's confidence region), key numbers"));
    EXPECT_THAT(summary, HasSubstr("at " + p_key + " = 200, 0:"));
    EXPECT_THAT(summary, HasSubstr("2 of 2"));
    EXPECT_THAT(summary, Not(HasSubstr("maximum speed"))) << "only the key numbers";
  }
} // namespace
