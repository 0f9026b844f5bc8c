// Sweep files: a base case plus the keys to vary. Parsing, expansion into the
// list of cases (full grid or zipped), and validation of every case before
// anything runs. Format (version 2; version 1, the explicit case list that
// `lentus fit` writes, is a subset):
//
//   # comments start at '#'
//   base case      = pipe.prm                # relative to this file (or --base)
//   results folder = out/pipe_sweep          # default out/<sweep file name>; --output overrides
//   combine        = grid                    # grid: every combination | zip: i-th values together
//   vary Boundary conditions/Inflow rates = 2e-4, 5e-4, 1e-3          # a list (';' if values hold ',')
//   vary Rheology/Herschel-Bulkley/Yield stress = linear 10 to 60, 6 values
//   vary Geometry/Pipe/Radius = logarithmic 0.01 to 0.04, 3 values
//   table      = points.csv                  # header: key paths; one case per row
//   cases from = out/fit_paste/samples.sweep     # the case blocks of another sweep file
//   case NAME                                # explicit cases (format 1)
//     Section/Subsection/Key = value
//   end
//   fluid samples = fitted                   # the case list samples a fitted fluid; this case holds the estimates
//   fix Geometry/Refinement = 2              # the same in every case
//   plot           = pressure drop inlet to outlet   # design number drawn...
//   plot against   = Boundary conditions/Inflow rates # ...against this key,
//   plot curves    = Rheology/Herschel-Bulkley/Yield stress # one curve per value of this one
//   warm start     = nearest                 # none (default) | nearest: each mesh of a case's sequence
//                                            # starts from the nearest finished case's solution on it
//
// Each `vary` line, each table and the list of explicit cases is one dimension;
// the grid nests them in file order (the last varies fastest).
#pragma once

#include <cstdint>
#include <optional>
#include <string>
#include <vector>

namespace lentus::input
{
  class CaseSchema;
}

namespace lentus::sweep
{
  /// One key set to one value, with where it was written (for messages).
  struct Override
  {
    std::string path;  ///< "Section/Subsection/Key"
    std::string value;
    std::string file;  ///< sweep file, table or "command line (--set)"
    int         line = 0;
  };

  /// One case of the sweep: the base case with `overrides` applied.
  struct SweepCase
  {
    std::size_t           index = 0;      ///< 0-based, the --case-index
    std::string           id;             ///< "case-0003" (folder name)
    std::string           name;           ///< of an explicit case block, else ""
    std::vector<Override> overrides;      ///< varied values, then explicit case values, then fixed ones
    std::string           invalid_reason; ///< "" if the case passed validation, else the message
    std::uint64_t         fingerprint = 0; ///< of base case text and overrides: a stored result is reused only if equal
  };

  /// `fluid samples = NAME`: the explicit cases sample a fitted fluid's confidence region (as
  /// `lentus fit` writes them) and case NAME holds the fit's estimates; every other case of the
  /// list is a sample. The sweep then states each design number's spread over the samples.
  struct FluidSamples
  {
    std::string              fitted; ///< name of the case with the estimates
    std::string              file;   ///< where the line is (for messages)
    int                      line = 0;
    std::vector<std::string> keys;   ///< the keys the case list sets (the fluid's parameters)
  };

  /// A parsed sweep file, expanded into its cases.
  struct SweepPlan
  {
    std::string              sweep_file;
    std::string              base_case;      ///< path as usable from the working directory
    std::string              base_text;      ///< contents of the base case
    std::string              results_folder;
    std::string              combination = "grid"; ///< grid | zip
    bool                     warm_start  = false;  ///< warm start = nearest: a case starts from a finished neighbour
    std::vector<std::string> varied_keys;    ///< table columns, in file order
    std::vector<std::size_t> dimension_sizes;
    bool                     has_names = false; ///< explicit cases exist
    std::vector<SweepCase>   cases;
    std::string              plot_number, plot_against, plot_curves; ///< "" if not set
    std::optional<FluidSamples> fluid_samples;                       ///< if the case list is marked so

    std::size_t n_invalid() const;
    /// The varied keys outside the fluid samples' case list: the cases that share their values
    /// (one fitted case and its samples) form one group. Empty without fluid samples.
    std::vector<std::string> group_keys() const;
    /// "3 x 4 grid", "2 dimensions zipped" or "one list".
    std::string shape_description() const;
    /// Every case spelled out, for the record (plan.txt in the results folder).
    std::string plan_text() const;
  };

  /// Command-line settings that change what a sweep file means.
  struct SweepSettings
  {
    std::string              base_case;      ///< --base (wins over the file's `base case`)
    std::string              results_folder; ///< --output (wins over `results folder`)
    std::vector<std::string> sets;           ///< --set Section/Key=value: fixed in every case
    /// Array mode: read only this case as the solver would (the others were checked
    /// when the sweep was checked or submitted; a few ms each adds up over many tasks).
    std::optional<std::size_t> validate_only;
  };

  /// True if `text` reads as a sweep file rather than a case file: its first
  /// statement is one of the sweep file's own words (base case, vary, case, ...).
  bool looks_like_sweep_file(const std::string &text);

  /// Reads, expands and validates a sweep file. Mistakes in the sweep file itself
  /// (syntax, unknown key, a value the key does not accept, a bad range) throw
  /// InputError "file:line: key ...: problem; allowed: ...". A case whose values are
  /// acceptable one by one but not together (the flow case reader rejects it) is
  /// kept with its `invalid_reason` set, naming the sweep file line and key.
  SweepPlan read_sweep_file(const std::string &file, const SweepSettings &settings, const input::CaseSchema &schema);

  /// The same from text; `name` stands for the file in messages and relative paths.
  SweepPlan parse_sweep_file(const std::string &text,
                             const std::string &name,
                             const SweepSettings &settings,
                             const input::CaseSchema &schema);

  /// The overrides of a case as `--set` strings, plus Output/Folder.
  std::vector<std::string> case_overrides(const SweepPlan &plan, const SweepCase &sweep_case);

  /// Folder of a case: <results folder>/cases/<id>.
  std::string case_folder(const SweepPlan &plan, const SweepCase &sweep_case);

  /// The unit of a case-file key from its documentation ("[Pa]"), "" if none.
  std::string unit_of_key(const input::CaseSchema &schema, const std::string &path);
} // namespace lentus::sweep
