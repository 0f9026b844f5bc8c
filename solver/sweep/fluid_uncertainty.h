// The uncertainty a fitted fluid carries into the design numbers. A sweep whose case list
// samples the fit's confidence region (`fluid samples = NAME`, as `lentus fit` writes it)
// states for each design number its value in the fitted case NAME, that case's error bar
// (mesh + regularization) and the spread over the converged samples: the 2.5% and 97.5%
// quantiles, the smallest and the largest value. Cases that share the values of the sweep's
// other keys form one group (one fitted case and its samples); a plain sample list is one group.
// Written as fluid_uncertainty.csv and fluid_uncertainty.jsonl beside results.csv.
#pragma once

#include <cstddef>
#include <optional>
#include <string>
#include <utility>
#include <vector>

namespace lentus::sweep
{
  struct SweepPlan;
  struct ResultRow;

  /// What the spread is, in the words every output uses.
  inline const std::string fluid_uncertainty_label = "uncertainty from the fluid (fit's confidence region)";

  /// How the span is computed, in words.
  inline const std::string quantile_method =
    "2.5% and 97.5% quantiles over the converged samples by linear interpolation between order statistics "
    "(Hyndman & Fan 1996, definition 7; the default of NumPy and R)";

  /// Below this many converged samples a span is rough: the range of n samples covers on average
  /// (n - 1)/(n + 1) of the distribution, which reaches 95% at n = 39; below 41 samples the 2.5%
  /// and 97.5% quantiles lie between the two smallest and the two largest values.
  inline constexpr std::size_t samples_for_a_span = 39;

  /// The quantile p (0 <= p <= 1) of `values` (in any order, at least one): with x_1 <= ... <= x_n
  /// the sorted values, h = (n - 1) p + 1, j = floor(h): Q(p) = x_j + (h - j)(x_{j+1} - x_j)
  /// (Hyndman & Fan 1996, definition 7). Throws std::invalid_argument for no values or p outside [0, 1].
  double quantile(std::vector<double> values, double p);

  /// The fraction of a distribution that the range of n independent samples covers on average,
  /// (n - 1)/(n + 1); 0 for fewer than 2.
  double expected_range_coverage(std::size_t n);

  /// One design number of one group.
  struct FluidSpread
  {
    std::string           name, unit;
    bool                  key = false;       ///< a key number in the fitted case (or any sample)
    std::optional<double> fitted;            ///< value in the fitted case, if it converged
    std::optional<double> fitted_error;      ///< its error bar (mesh + regularization), if estimated
    std::size_t           samples = 0;       ///< sample cases of the group
    std::size_t           converged = 0;     ///< converged samples with this number
    std::optional<double> low, high;         ///< 2.5% and 97.5% quantiles over the converged samples
    std::optional<double> minimum, maximum;  ///< over the converged samples
    std::string           note;              ///< "" or what to keep in mind ("rough: ...; ...")
  };

  /// The cases that share the values of the sweep's other keys.
  struct FluidGroup
  {
    std::vector<std::pair<std::string, std::string>> values; ///< group key -> value (none: the one group)
    std::string              fitted_id;     ///< case id of the fitted case
    std::string              fitted_status; ///< its status; "" while it has no result
    std::size_t              samples = 0, converged = 0, failed = 0, missing = 0; ///< sample cases by outcome
    std::vector<FluidSpread> numbers;       ///< every design number any case of the group has
  };

  /// The groups of a fluid-samples sweep from its rows (any subset of the cases: collect may
  /// find some missing); empty if `plan` has no fluid samples.
  std::vector<FluidGroup> fluid_uncertainty(const SweepPlan &plan, const std::vector<ResultRow> &rows);

  /// fluid_uncertainty.csv and fluid_uncertainty.jsonl: one line per group and design number, each
  /// with the label, the quantile method and the full caution (solver/report/caution.h).
  std::pair<std::string, std::string> fluid_uncertainty_tables(const std::vector<FluidGroup> &groups,
                                                               const std::vector<std::string> &group_keys,
                                                               const std::vector<std::string> &group_units,
                                                               const std::string &fitted_name);

  /// The short table printed at the end of a sweep: the key numbers of each group (the first
  /// few numbers if none is a key number) with the fitted value, its error bar and the span.
  std::string fluid_uncertainty_summary(const std::vector<FluidGroup> &groups, const std::string &table_name);

  /// The design numbers the sweep's picture of the spread shows: `plot_number` if it is one,
  /// else the key numbers (at most 4), else the first 4.
  std::vector<std::string> fluid_plot_numbers(const std::vector<FluidGroup> &groups, const std::string &plot_number);
} // namespace lentus::sweep
