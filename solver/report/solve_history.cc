#include "solver/report/solve_history.h"

#include <stdexcept>

namespace lentus::report
{
  const char *to_string(const StepKind kind)
  {
    return kind == StepKind::picard ? "Picard" : "Newton";
  }

  void SolveHistory::begin_mesh(const std::uint64_t cells, const std::uint64_t unknowns,
                                const std::string &linear_solver, const std::string &refinement)
  {
    MeshRecord mesh;
    mesh.refinement    = refinement;
    mesh.cells         = cells;
    mesh.unknowns      = unknowns;
    mesh.linear_solver = linear_solver;
    mesh_records.push_back(mesh);
  }

  void SolveHistory::add_mesh_seconds(const double seconds)
  {
    if (mesh_records.empty())
      throw std::logic_error("SolveHistory: mesh time before any mesh");
    mesh_records.back().other_seconds += seconds;
  }

  void SolveHistory::begin_solve(const std::string &label, const double initial_residual)
  {
    if (mesh_records.empty())
      throw std::logic_error("SolveHistory: a solve before any mesh");
    solve_records.push_back({mesh_records.size() - 1, label, initial_residual, {}});
  }

  void SolveHistory::add(const IterationRecord &iteration)
  {
    if (solve_records.empty())
      throw std::logic_error("SolveHistory: an iteration before any solve");
    solve_records.back().iterations.push_back(iteration);
    MeshRecord &mesh = mesh_records[solve_records.back().mesh];
    (iteration.kind == StepKind::newton ? mesh.newton : mesh.picard) += 1;
    mesh.linear += iteration.linear_iterations;
    mesh.seconds += iteration.seconds;
  }

  unsigned int SolveHistory::total_linear_iterations() const
  {
    unsigned int total = 0;
    for (const MeshRecord &mesh : mesh_records)
      total += mesh.linear;
    return total;
  }

  double SolveHistory::final_residual() const
  {
    for (auto solve = solve_records.rbegin(); solve != solve_records.rend(); ++solve)
      if (!solve->iterations.empty())
        return solve->iterations.back().residual;
    return 0.;
  }
} // namespace lentus::report
