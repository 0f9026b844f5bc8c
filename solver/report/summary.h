// Everything a run reports, typed: the case, the status, the design numbers, the
// numerics and the cautions. summary.json is this, serialized by to_json().
#pragma once

#include "solver/report/accuracy.h"
#include "solver/report/design_number.h"
#include "solver/report/solve_history.h"

#include <optional>
#include <string>
#include <vector>

namespace lentus::report
{
  /// Wall time and memory of a run (the iteration figures are in the SolveHistory).
  struct Resources
  {
    double       wall_seconds = 0.;
    double       peak_memory_per_rank = 0.;  ///< [MiB], the largest over the ranks
    double       peak_memory_all_ranks = 0.; ///< [MiB], the sum over the ranks
    unsigned int ranks = 1;
  };

  /// How the run estimated its accuracy (the numbers' own estimates are in their Accuracy).
  struct RunAccuracy
  {
    std::optional<double>    target;        ///< Accuracy/Target relative error
    bool                     target_met = false;
    std::string              target_status; ///< in words; "" without a target
    double                   regularization_factor = 0.; ///< of the check made; 0: none
    std::string              regularization_note;       ///< why there is no check, when there is none
    std::vector<MeshNumbers> meshes;                    ///< every converged mesh, coarse to fine
  };

  struct Summary
  {
    std::string case_file;
    bool        converged = false;
    std::string reason; ///< why not converged; empty when converged
    std::string velocity_components; ///< "x y", "r z" or "r z theta"
    std::string viscosity_law;
    double      yield_stress = 0.;   ///< [Pa] of the law at the case temperature
    std::optional<double> dead_zone_fraction; ///< vessels that report dead zones
    DesignNumbers         numbers;            ///< of the last iterate
    std::uint64_t         cells = 0, unknowns = 0; ///< of the final mesh
    SolveHistory          history;
    Resources             resources;
    std::vector<std::string> case_cautions; ///< beside the general caution (report::caution)
    RunAccuracy              accuracy;
  };

  /// summary.json's text (nlohmann-json; see SUMMARY in DEVELOPERS.md for the fields).
  std::string to_json(const Summary &summary);

  /// The design numbers as aligned lines "  name   value +/- error unit" for the log and the terminal.
  std::vector<std::string> design_number_lines(const DesignNumbers &numbers);

  /// "Seconds by phase: Jacobian assembly 1.2, ..., other 0.1 (of 5.3 s wall time)": the run's
  /// phases, largest first.
  std::string phase_line(const Summary &summary);
} // namespace lentus::report
