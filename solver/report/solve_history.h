// What the nonlinear solver did, recorded as it happens: the meshes solved on
// (several under mesh sequencing), the solves on each (a direct attempt, the steps of
// a continuation) and every iteration. Plain C++; summary.json and the log read it.
#pragma once

#include <array>
#include <cstdint>
#include <string>
#include <vector>

namespace lentus::report
{
  enum class StepKind
  {
    picard, ///< viscosity frozen, Oseen inertia
    newton  ///< exact Jacobian
  };

  /// "Picard", "Newton".
  const char *to_string(StepKind kind);

  /// Where a run's wall time goes, so that every speed claim can be measured.
  enum class Phase
  {
    residual_assembly, ///< residuals outside the line search (initial, reference at rest)
    jacobian_assembly, ///< matrix and residual of a step
    solver_setup,      ///< factorization or preconditioner set-up
    linear_solve,      ///< the linear solve after its set-up
    line_search,       ///< the residuals of trial steps
    mesh_setup,        ///< meshes, refinement, transfer, unknowns and sparsity patterns
    design_numbers,    ///< design numbers and their error estimates
    output,            ///< fields written to the case folder
    energy_equation    ///< assembly and solves of the energy equation
  };
  inline constexpr std::size_t n_phases = 9;

  /// "residual assembly", "Jacobian assembly", ...
  const char *to_string(Phase phase);

  /// Seconds spent in each phase.
  struct PhaseSeconds
  {
    std::array<double, n_phases> seconds{};

    double &operator[](Phase phase) { return seconds[static_cast<std::size_t>(phase)]; }
    double  operator[](Phase phase) const { return seconds[static_cast<std::size_t>(phase)]; }
    double  total() const;
    PhaseSeconds &operator+=(const PhaseSeconds &other);
  };

  struct IterationRecord
  {
    StepKind     kind;
    double       residual;          ///< after the step
    double       step;              ///< line-search step length
    unsigned int linear_iterations; ///< of this step's linear solve (1 for the direct solver)
    double       seconds;
  };

  /// One run of iterations from one start: a direct attempt, one continuation step, or a solve
  /// from the coarser mesh's solution.
  struct SolveRecord
  {
    std::size_t                  mesh; ///< index into SolveHistory::meshes
    std::string                  label; ///< "direct solve", "Regularization exponent = 10", ...
    double                       initial_residual = 0.;
    std::vector<IterationRecord> iterations;
  };

  struct MeshRecord
  {
    std::uint64_t cells = 0, unknowns = 0;
    std::string   linear_solver; ///< as chosen for this mesh
    std::string   refinement = "case mesh"; ///< how the mesh was made: "coarser mesh", "adaptive cycle 1: ..."
    // Totals over the mesh's solves.
    unsigned int newton = 0, picard = 0, linear = 0;
    double       seconds = 0.; ///< in nonlinear iterations
    double       other_seconds = 0.; ///< refinement, indicator and set-up of the mesh
    PhaseSeconds phases;              ///< of the work on this mesh
  };

  class SolveHistory
  {
  public:
    /// A new mesh: the solves that follow belong to it.
    void begin_mesh(std::uint64_t cells, std::uint64_t unknowns, const std::string &linear_solver,
                    const std::string &refinement = "case mesh");
    /// Wall time of the current mesh outside the nonlinear iterations (refinement, set-up) [s].
    void add_mesh_seconds(double seconds);
    /// Time spent in `phase`, counted to the current mesh (to the run before any mesh) [s].
    void add_seconds(Phase phase, double seconds);
    /// Every phase over the whole run.
    PhaseSeconds run_phases() const;

    /// A new solve on the current mesh.
    void begin_solve(const std::string &label, double initial_residual);
    /// An iteration of the current solve.
    void add(const IterationRecord &iteration);
    /// A continuation step's label, as it began.
    void add_continuation_step(const std::string &label) { continuation.push_back(label); }

    const std::vector<MeshRecord>  &meshes() const { return mesh_records; }
    const std::vector<SolveRecord> &solves() const { return solve_records; }
    const std::vector<std::string> &continuation_steps() const { return continuation; }

    /// Linear iterations over every mesh; the residual after the last iteration (0 without any).
    unsigned int total_linear_iterations() const;
    double       final_residual() const;

  private:
    std::vector<MeshRecord>  mesh_records;
    std::vector<SolveRecord> solve_records;
    std::vector<std::string> continuation;
    PhaseSeconds             before_meshes;
  };
} // namespace lentus::report
