#include "solver/report/solve_history.h"

#include <stdexcept>

namespace lentus::report
{
  const char *to_string(const StepKind kind)
  {
    return kind == StepKind::picard ? "Picard" : "Newton";
  }

  const char *to_string(const Phase phase)
  {
    switch (phase)
      {
        case Phase::residual_assembly:
          return "residual assembly";
        case Phase::jacobian_assembly:
          return "Jacobian assembly";
        case Phase::solver_setup:
          return "linear solver set-up";
        case Phase::linear_solve:
          return "linear solve";
        case Phase::line_search:
          return "line search";
        case Phase::mesh_setup:
          return "meshes and set-up";
        case Phase::design_numbers:
          return "design numbers";
        case Phase::output:
          return "fields output";
        case Phase::energy_equation:
          return "energy equation";
      }
    return "?";
  }

  double PhaseSeconds::total() const
  {
    double sum = 0.;
    for (const double value : seconds)
      sum += value;
    return sum;
  }

  PhaseSeconds &PhaseSeconds::operator+=(const PhaseSeconds &other)
  {
    for (std::size_t i = 0; i < n_phases; ++i)
      seconds[i] += other.seconds[i];
    return *this;
  }

  void SolveHistory::add_seconds(const Phase phase, const double seconds)
  {
    (mesh_records.empty() ? before_meshes : mesh_records.back().phases)[phase] += seconds;
  }

  PhaseSeconds SolveHistory::run_phases() const
  {
    PhaseSeconds sum = before_meshes;
    for (const MeshRecord &mesh : mesh_records)
      sum += mesh.phases;
    return sum;
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
    mesh_records.back().phases[Phase::mesh_setup] += seconds;
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
