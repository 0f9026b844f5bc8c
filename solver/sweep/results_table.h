// The results of a sweep: one row file per finished case (rows/<case id>.txt,
// written whole by rename), merged into results.csv and results.jsonl.
// A case is done exactly when its row file exists with the fingerprint of the
// case's current inputs, so a restarted sweep skips it and the table holds
// each case once.
#pragma once

#include <cstdint>
#include <optional>
#include <string>
#include <utility>
#include <vector>

namespace lentus::input
{
  class CaseSchema;
}

namespace lentus::sweep
{
  struct SweepPlan;

  /// Status words of the table.
  namespace status
  {
    inline const std::string converged     = "converged";
    inline const std::string not_converged = "not converged";
    inline const std::string bad_input     = "bad input";
    inline const std::string crashed       = "crashed";
  } // namespace status

  struct ResultNumber
  {
    std::string           name;
    double                value;
    std::string           unit;
    std::optional<double> error; ///< error bar (mesh + regularization), same unit; none if not estimated
    bool                  key = false; ///< one of the few numbers a user came for (report::DesignNumber::key)
  };

  /// One case's line of the table.
  struct ResultRow
  {
    std::size_t                                      index = 0;
    std::string                                      id, name, folder;
    std::uint64_t                                    fingerprint = 0;
    std::vector<std::pair<std::string, std::string>> values; ///< varied key -> value
    std::string                                      status, reason;
    std::vector<ResultNumber>                        numbers;
    unsigned int                                     newton_iterations = 0;
    double                                           wall_time = 0.; ///< [s], read and solve and write
    unsigned int                                     ranks = 1;
  };

  /// Text of a row file (tab-separated fields, escaped; last line "end").
  std::string row_text(const ResultRow &row);

  /// Parses a row file; false if it is malformed or incomplete.
  bool parse_row(const std::string &text, ResultRow &row);

  /// <results folder>/rows/<id>.txt
  std::string row_path(const std::string &results_folder, const std::string &id);

  /// Writes the row file atomically (temporary name, then rename).
  void write_row(const std::string &results_folder, const ResultRow &row);

  /// Reads the row of `id`; false if absent, malformed, or for other inputs (`fingerprint` differs).
  bool read_row(const std::string &results_folder, const std::string &id, std::uint64_t fingerprint, ResultRow &row);

  /// The table as CSV (header: case, [name,] each varied key [unit], status, reason,
  /// each design number [unit], Newton iterations, wall time [s], ranks, folder, caution;
  /// cells quoted per RFC 4180) and as JSON lines (one object per case, the same fields).
  /// Design-number columns: every name any row has, in order of first appearance. Every
  /// row carries the full caution (solver/report/caution.h), so that it goes wherever a row
  /// is copied; a file beside the table would stay behind.
  std::pair<std::string, std::string> table_text(const std::vector<ResultRow> &rows,
                                                 const std::vector<std::string> &varied_keys,
                                                 const std::vector<std::string> &varied_units,
                                                 bool with_names);

  struct CollectReport
  {
    std::size_t              rows = 0, failures = 0;
    std::vector<std::pair<std::string, std::size_t>> by_status; ///< status -> cases, in order of first appearance
    std::vector<std::string> missing; ///< ids without a current row
    std::string              csv_path, jsonl_path;
    /// Fluid samples only (solver/sweep/fluid_uncertainty.h): the third table, its printed summary
    /// and the design numbers its picture shows.
    std::string              fluid_csv_path, fluid_jsonl_path, fluid_summary;
    std::vector<std::string> fluid_plot_numbers;
  };

  /// Merges the rows of every case of `plan` into results.csv and results.jsonl
  /// in the results folder (both written atomically); for fluid samples also
  /// fluid_uncertainty.csv and fluid_uncertainty.jsonl (removed when the sweep has none, so
  /// that no earlier one stays beside a new table).
  CollectReport collect_results(const SweepPlan &plan, const input::CaseSchema &schema);
} // namespace lentus::sweep
