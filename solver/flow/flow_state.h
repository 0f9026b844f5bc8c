// The state of one flow solve, shared by the translation units of solver/flow/.
// Heavy header: include it only from solver/flow/*.cc.
#pragma once

#include "rheology/viscosity_law.h"
#include "solver/input/flow_case.h"
#include "solver/report/accuracy.h"
#include "solver/report/solve_history.h"

#include <deal.II/base/conditional_ostream.h>
#include <deal.II/base/index_set.h>
#include <deal.II/distributed/tria.h>
#include <deal.II/dofs/dof_handler.h>
#include <deal.II/fe/fe_system.h>
#include <deal.II/lac/affine_constraints.h>
#include <deal.II/lac/petsc_sparse_matrix.h>
#include <deal.II/lac/petsc_vector.h>

#include <memory>
#include <optional>
#include <sstream>
#include <string>
#include <vector>

namespace lentus::flow
{
  using Vector = dealii::PETScWrappers::MPI::Vector;
  using Matrix = dealii::PETScWrappers::MPI::SparseMatrix;

  /// The outcome of a solve: converged or why not, and what the solver did on each mesh.
  struct SolveOutcome
  {
    bool                 converged = false;
    std::string          reason; ///< why not converged
    report::SolveHistory history;
    /// The design numbers of every mesh solved to convergence, coarse to fine (for the mesh error).
    std::vector<report::MeshNumbers> mesh_numbers;
    /// The design numbers of the regularization check (at regularization_factor x M), if made.
    std::optional<report::DesignNumbers> at_larger_m;
    double                               regularization_factor = 0.;
    std::string regularization_note; ///< why there is no regularization check, when there is none
    /// How the adaptive cycles ended, in words ("after 3 of at most 5 adaptive cycles", "budget spent ...").
    std::string target_status;
  };

  /// Messages go to standard output (rank 0) and into the case's log.
  class Log
  {
  public:
    explicit Log(bool active_) : active(active_) {}
    void line(const std::string &text);
    std::string text() const { return record.str(); }

  private:
    bool               active;
    std::ostringstream record;
  };

  struct HeatField;

  /// What is solved: the case, its formulation, the fluid's law and the density. Passed const;
  /// a continuation step solves a softened copy and leaves the case's physics as it is.
  struct Physics
  {
    Physics(const input::FlowCase &flow_case);

    const input::FlowCase                        &flow;
    FormulationKind                               kind;
    unsigned int                                  n_velocity; ///< 2, or 3 with swirl
    std::shared_ptr<const rheology::ViscosityLaw> law;
    double                                        density = 0.; ///< 0 when neither inertia nor gravity
    /// The temperature field with Heat/Energy equation (shared by the copies a continuation or the
    /// regularization check makes), else null. heat.h.
    std::shared_ptr<HeatField> heat;
  };

  /// The discretization: mesh, finite elements, unknowns and their constraints.
  struct Discretization
  {
    Discretization(const input::FlowCase &flow_case, MPI_Comm communicator);

    MPI_Comm                                        comm;
    unsigned int                                    rank, n_ranks;
    dealii::parallel::distributed::Triangulation<2> triangulation;
    dealii::FESystem<2>                             fe;
    dealii::DoFHandler<2>                           dof_handler;
    dealii::IndexSet                                owned, relevant;
    dealii::AffineConstraints<double>               nonzero_constraints, zero_constraints;
    dealii::AffineConstraints<double>               hanging_constraints; ///< only those of hanging nodes
    bool                                            pressure_pinned = false;
  };

  /// A linear solver kept from one Newton step to the next on the same mesh (flow_linear_solver.cc):
  /// the direct solver's symbolic factorization is made once per mesh.
  struct KeptLinearSolver;

  /// The linear system of the current linearization.
  struct LinearSystem
  {
    Matrix system_matrix;
    Matrix pressure_mass; ///< 1/eta-weighted pressure mass matrix (Schur-complement preconditioner)
    Vector residual;      ///< -R, owned
    /// Whether assemble() fills pressure_mass (only the iterative solver uses it).
    bool pressure_mass_wanted = true;
    /// Set up by solve_linear(), dropped by setup_dofs() (a new mesh has a new sparsity pattern).
    std::shared_ptr<KeptLinearSolver> kept_solver;
    /// Primal-dual Newton (Nonlinear solver/Newton linearization): per quadrature point of every
    /// active cell, the strain rate, the stress used and the law's values of the last Newton
    /// assembly. Valid only between Newton assemblies of one solve (iterate() and Picard steps
    /// drop it; a stale state is never read because its size no longer matches).
    std::vector<double> dual;
    bool                dual_valid = false;
  };

  /// A solved flow as the design numbers see it: the physics it was solved for, the mesh and the
  /// solution (ghosted). A FlowState converts to one; the regularization check makes one with the
  /// stiffer law it solved for.
  struct SolvedFlow
  {
    const Physics        &physics;
    const Discretization &mesh;
    const Vector         &solution;
  };

  /// One flow solve: physics (const), discretization, linear system, solution and log.
  struct FlowState
  {
    operator SolvedFlow() const { return {physics, mesh, solution}; }

    FlowState(const input::FlowCase &flow_case, MPI_Comm communicator);

    const Physics  physics;
    Discretization mesh;
    LinearSystem   system;
    Vector         solution; ///< ghosted
    Log            log;
  };

  // flow_setup.cc
  /// The geometry's mesh `level` refinements above its coarse mesh (no unknowns yet).
  void create_mesh(FlowState &state, unsigned int level);
  /// Unknowns, constraints, sparsity patterns, matrices and vectors on the current mesh.
  void setup_dofs(FlowState &state);
  /// Refines every cell once and carries state.solution over to the finer mesh (interpolation;
  /// Dirichlet values and the pinned pressure are set anew), with setup_dofs().
  void refine_and_transfer(FlowState &state);
  /// The same after the refine and coarsen flags of the triangulation's cells were set.
  void transfer_to_flagged_mesh(FlowState &state);
  /// Velocity node by node, then pressure, within each rank's range (called by setup_dofs).
  void renumber_node_wise(FlowState &state);
  /// The initial iterate: zero with the Dirichlet values.
  void initial_solution(FlowState &state);

  // warm_start.cc
  /// Saves the solution (collective; one file per rank, `prefix`.<rank>of<ranks>.bin, written whole).
  void save_warm_start(const FlowState &state, const std::string &prefix);
  /// Reads a solution saved on the same mesh with as many ranks into state.solution, with this
  /// case's Dirichlet values; false (and `why`) when there is none. Collective.
  bool load_warm_start(FlowState &state, const std::string &prefix, std::string &why);

  // heat.cc
  /// The case's temperature field, unset until setup_dofs(); null without Heat/Energy equation.
  std::shared_ptr<HeatField> make_heat_field(const input::FlowCase &flow);

  // flow_assembly.cc
  enum class Linearization
  {
    none,   ///< residual only
    picard, ///< eta frozen, Oseen inertia
    newton  ///< exact Jacobian
  };
  /// Assembles the residual R(u) of `evaluation_point` (ghosted) for `physics` into system.residual
  /// as -R, and the matrix (and the 1/eta-weighted pressure mass matrix) unless `linearization` is
  /// none. Returns the l2 norm of R over the unconstrained unknowns.
  double assemble(const Physics &physics, const Discretization &mesh, const Vector &evaluation_point,
                  Linearization linearization, LinearSystem &system);

  /// The residual R(u) of `evaluation_point` without any constraint applied
  /// (owned vector): on Dirichlet boundaries R_i is the work of the boundary
  /// traction on shape function i, which gives consistent reaction forces,
  /// torques and powers (more accurate than integrating stresses over the surface).
  void assemble_reactions(const Physics &physics, const Discretization &mesh, const Vector &evaluation_point,
                          Vector &reactions);

  // flow_linear_solver.cc
  /// What one linear solve did.
  struct LinearSolve
  {
    unsigned int iterations    = 0;  ///< 1 for the direct solver
    double       setup_seconds = 0.; ///< factorization or preconditioner set-up
    double       solve_seconds = 0.; ///< the solve after it
  };
  /// Solves system_matrix * update = residual. `relative_tolerance` is the iterative solver's
  /// residual reduction. The direct solver keeps its symbolic factorization in system.kept_solver
  /// for the following steps on the same mesh.
  LinearSolve solve_linear(const Physics &physics, const Discretization &mesh, LinearSystem &system,
                           Vector &update, bool direct, double relative_tolerance = 1e-10);

  // flow_newton.cc
  /// The fluid's law with one parameter replaced (continuation, regularization check), at the case's
  /// temperature.
  std::shared_ptr<const rheology::ViscosityLaw> law_with(const input::Fluid &fluid, const std::string &key,
                                                         double value);
  /// Newton with line search, Picard start and continuation on the current mesh, from rest.
  /// Appends to `outcome`; leaves the last iterate in state.solution.
  void solve_nonlinear(FlowState &state, SolveOutcome &outcome);
  /// The whole solve: creates the mesh (and its coarser ones under mesh sequencing), solves on
  /// each, and leaves the state on the mesh of Geometry/Refinement.
  SolveOutcome solve_with_mesh_sequencing(FlowState &state);
  /// Iterations from state.solution for `physics` on the current mesh (no continuation), the
  /// tolerance relative to the residual at rest; true if converged. `label` names the solve in the
  /// history. `newton_first`: Newton at once (for a start next to the solution), Picard steps first
  /// only if it stalls.
  bool solve_from_current(FlowState &state, const Physics &physics, SolveOutcome &outcome, const std::string &label,
                          bool newton_first = false);
  /// Starts the history's record of the current mesh (`refinement`: how it was made).
  void record_mesh(FlowState &state, SolveOutcome &outcome, const std::string &refinement);

  // results.cc
  /// The design numbers of the current solution, with the pressure made mean-free on a copy (the
  /// state is left as it was). Collective.
  report::DesignNumbers current_design_numbers(FlowState &state);
  /// The same for a solution of other physics on the state's mesh (the regularization check).
  report::DesignNumbers current_design_numbers(FlowState &state, const Physics &physics);

  // flow_accuracy.cc
  /// Adaptive cycles after the solve on the case's mesh (Accuracy/Adaptive cycles, until a target
  /// is met or a budget spent), then the regularization check. `seconds_so_far`: the run's wall time
  /// before it [s], for Accuracy/Maximum wall time. Appends to `outcome`.
  void improve_accuracy(FlowState &state, SolveOutcome &outcome, double seconds_so_far);
  /// Whether the error bar of every targeted number (Accuracy/Targeted numbers, else the key numbers)
  /// is below Accuracy/Target relative error; `worst`: the number with the largest relative error bar,
  /// in words. Throws InputError for a targeted name the case does not have.
  bool accuracy_target_met(const FlowState &state, const report::DesignNumbers &numbers, std::string &worst);
} // namespace lentus::flow
