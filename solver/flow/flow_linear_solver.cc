// Linear solves through PETSc: MUMPS sparse LU, or FGMRES with a block upper-
// triangular (Schur-complement) field-split preconditioner: BoomerAMG on the
// velocity block and the 1/eta-weighted pressure mass matrix for the Schur
// complement, which stays spectrally equivalent under large viscosity contrasts.
#include "solver/errors.h"
#include "solver/flow/flow_state.h"

#include <deal.II/dofs/dof_tools.h>
#include <deal.II/fe/fe_values_extractors.h>
#include <deal.II/fe/mapping_q.h>

#include <petscksp.h>

#include <chrono>
#include <map>
#include <vector>

namespace lentus::flow
{
  using namespace dealii;

  namespace
  {
    void check(const PetscErrorCode code, const char *what)
    {
      if (code != 0)
        throw std::runtime_error(std::string("PETSc failed in ") + what + " (error " + std::to_string(code) + ")");
    }

    /// Holds one PETSc object and destroys it when it goes out of scope, also when a check throws.
    template <typename Object, PetscErrorCode (*destroy)(Object *)>
    class Owned
    {
    public:
      Owned() = default;
      ~Owned()
      {
        if (object)
          destroy(&object);
      }
      Owned(const Owned &)            = delete;
      Owned &operator=(const Owned &) = delete;

      Object get() const { return object; }
      /// For the Create calls that fill it in.
      Object *out() { return &object; }

    private:
      Object object = nullptr;
    };

    using OwnedKSP = Owned<KSP, KSPDestroy>;
    using OwnedVec = Owned<Vec, VecDestroy>;
    using OwnedNullSpace = Owned<MatNullSpace, MatNullSpaceDestroy>;
    using OwnedIS  = Owned<IS, ISDestroy>;
    using OwnedMat = Owned<Mat, MatDestroy>;

    /// Owned indices of one field as a PETSc index set, into `is`.
    void field_index_set(const Discretization &mesh, const ComponentMask &mask, OwnedIS &is)
    {
      const IndexSet            field = DoFTools::extract_dofs(mesh.dof_handler, mask) & mesh.owned;
      std::vector<PetscInt>     indices;
      for (const auto index : field)
        indices.push_back(static_cast<PetscInt>(index));
      check(ISCreateGeneral(mesh.comm, static_cast<PetscInt>(indices.size()), indices.data(), PETSC_COPY_VALUES,
                            is.out()),
            "ISCreateGeneral");
    }

    /// The rigid-body modes of planar velocity (two translations and the rotation) as the near null
    /// space of the velocity block, for smoothed-aggregation multigrid (GAMG builds its coarse spaces
    /// from them; BoomerAMG ignores it). Needs the node-wise numbering (x and y velocity of one node
    /// next to each other); false, and nothing set, if the owned velocity unknowns are not so paired.
    bool rigid_body_modes(const Discretization &mesh, const ComponentMask &velocity_mask, const IS velocity_is,
                          OwnedNullSpace &modes)
    {
      const IndexSet velocity = DoFTools::extract_dofs(mesh.dof_handler, velocity_mask) & mesh.owned;
      std::map<types::global_dof_index, Point<2>> points;
      DoFTools::map_dofs_to_support_points(MappingQ<2>(1), mesh.dof_handler, points, velocity_mask);
      std::vector<types::global_dof_index> indices(velocity.begin(), velocity.end());
      bool paired = indices.size() % 2 == 0;
      for (std::size_t k = 0; paired && k < indices.size(); k += 2)
        paired = indices[k + 1] == indices[k] + 1 && points.count(indices[k]) && points.count(indices[k + 1]) &&
                 points[indices[k]].distance(points[indices[k + 1]]) < 1e-12 * (1. + points[indices[k]].norm());
      if (Utilities::MPI::min(paired ? 1 : 0, mesh.comm) == 0)
        return false;
      OwnedVec coordinates;
      check(VecCreateMPI(mesh.comm, static_cast<PetscInt>(indices.size()), PETSC_DETERMINE, coordinates.out()),
            "VecCreateMPI");
      check(VecSetBlockSize(coordinates.get(), 2), "VecSetBlockSize");
      PetscScalar *values = nullptr;
      check(VecGetArray(coordinates.get(), &values), "VecGetArray");
      for (std::size_t k = 0; k < indices.size(); ++k)
        values[k] = points[indices[k]][k % 2];
      check(VecRestoreArray(coordinates.get(), &values), "VecRestoreArray");
      check(MatNullSpaceCreateRigidBody(coordinates.get(), modes.out()), "MatNullSpaceCreateRigidBody");
      // PCFIELDSPLIT hands a near null space composed on a split's index set to that split's matrix.
      check(PetscObjectCompose(reinterpret_cast<PetscObject>(velocity_is), "nearnullspace",
                               reinterpret_cast<PetscObject>(modes.get())),
            "PetscObjectCompose");
      return true;
    }
  } // namespace

  /// The direct solver of one mesh: its KSP keeps MUMPS's analysis (ordering and symbolic
  /// factorization) while the matrix keeps its sparsity pattern, so that a Newton step pays only
  /// for the numerical factorization (PETSc redoes the analysis itself if the pattern changes).
  struct KeptLinearSolver
  {
    OwnedKSP ksp;
  };

  namespace
  {
    using Clock = std::chrono::steady_clock;

    double seconds_since(const Clock::time_point start)
    {
      return std::chrono::duration<double>(Clock::now() - start).count();
    }

    /// MUMPS sparse LU through PETSc's KSPPREONLY + PCLU, set up once per mesh.
    KSP direct_solver(const Discretization &mesh, LinearSystem &system)
    {
      if (!system.kept_solver)
        {
          auto kept = std::make_shared<KeptLinearSolver>();
          check(KSPCreate(mesh.comm, kept->ksp.out()), "KSPCreate");
          const KSP ksp = kept->ksp.get();
          PC        pc;
          check(KSPSetOptionsPrefix(ksp, "lentus_"), "KSPSetOptionsPrefix");
          check(KSPSetType(ksp, KSPPREONLY), "KSPSetType");
          check(KSPGetPC(ksp, &pc), "KSPGetPC");
          check(PCSetType(pc, PCLU), "PCSetType");
          check(PCFactorSetMatSolverType(pc, MATSOLVERMUMPS), "PCFactorSetMatSolverType");
          // PETSC_OPTIONS with the prefix (e.g. "-lentus_ksp_view") reach the direct solver too;
          // without such options the solver stays as set above.
          check(KSPSetFromOptions(ksp), "KSPSetFromOptions");
          system.kept_solver = kept;
        }
      const KSP ksp = system.kept_solver->ksp.get();
      // The same matrix object with new values: PCSetUp refactors numerically only.
      check(KSPSetOperators(ksp, system.system_matrix.petsc_matrix(), system.system_matrix.petsc_matrix()),
            "KSPSetOperators");
      return ksp;
    }
  } // namespace

  LinearSolve solve_linear(const Physics &physics, const Discretization &mesh, LinearSystem &system,
                           Vector &update, const bool direct, const double relative_tolerance)
  {
    LinearSolve result;
    const auto  start = Clock::now();
    OwnedKSP    owned_ksp;
    OwnedIS     velocity_is, pressure_is;
    OwnedMat    schur_preconditioner;
    OwnedNullSpace near_null_space;
    KSP         ksp = nullptr;
    if (direct)
      ksp = direct_solver(mesh, system);
    else
      {
        check(KSPCreate(mesh.comm, owned_ksp.out()), "KSPCreate");
        ksp = owned_ksp.get();
        PC pc;
        // The prefix must precede the field split, whose sub-solvers inherit it.
        check(KSPSetOptionsPrefix(ksp, "lentus_"), "KSPSetOptionsPrefix");
        check(KSPSetOperators(ksp, system.system_matrix.petsc_matrix(), system.system_matrix.petsc_matrix()),
              "KSPSetOperators");
        check(KSPGetPC(ksp, &pc), "KSPGetPC");
        const FEValuesExtractors::Scalar pressure(physics.n_velocity);
        ComponentMask                    velocity_mask(physics.n_velocity + 1, false);
        for (unsigned int c = 0; c < physics.n_velocity; ++c)
          velocity_mask.set(c, true);
        field_index_set(mesh, velocity_mask, velocity_is);
        // Node-wise numbering (renumber_node_wise): the velocity block is a system of n_velocity unknowns per node.
        check(ISSetBlockSize(velocity_is.get(), static_cast<PetscInt>(physics.n_velocity)), "ISSetBlockSize");
        // GAMG chosen through PETSC_OPTIONS gets the rigid-body modes of planar flow. Measured on the
        // Bingham cavity, Bn 20, Newton steps: 39-48 / 50-56 / 105-108 FGMRES iterations per step at
        // 9.5e3 / 3.8e4 / 1.5e5 unknowns against 16 / 20-22 / 28-30 with the default BoomerAMG, so
        // BoomerAMG stays the default.
        char      velocity_pc[64] = "";
        PetscBool velocity_pc_given = PETSC_FALSE;
        check(PetscOptionsGetString(nullptr, nullptr, "-lentus_fieldsplit_u_pc_type", velocity_pc, sizeof velocity_pc,
                                    &velocity_pc_given),
              "PetscOptionsGetString");
        if (physics.kind == FormulationKind::planar && velocity_pc_given && std::string(velocity_pc) == "gamg")
          rigid_body_modes(mesh, velocity_mask, velocity_is.get(), near_null_space);
        field_index_set(mesh, mesh.fe.component_mask(pressure), pressure_is);
        check(MatCreateSubMatrix(system.pressure_mass.petsc_matrix(), pressure_is.get(), pressure_is.get(),
                                 MAT_INITIAL_MATRIX, schur_preconditioner.out()),
              "MatCreateSubMatrix");
        // S = -B A^-1 B^T is negative: precondition with -M_p(1/eta).
        check(MatScale(schur_preconditioner.get(), -1.), "MatScale");
        check(KSPSetType(ksp, KSPFGMRES), "KSPSetType");
        check(KSPGMRESSetRestart(ksp, 200), "KSPGMRESSetRestart");
        check(KSPSetTolerances(ksp, relative_tolerance, 1e-30, 1e10, 2000), "KSPSetTolerances");
        check(PCSetType(pc, PCFIELDSPLIT), "PCSetType");
        check(PCFieldSplitSetIS(pc, "u", velocity_is.get()), "PCFieldSplitSetIS");
        check(PCFieldSplitSetIS(pc, "p", pressure_is.get()), "PCFieldSplitSetIS");
        check(PCFieldSplitSetType(pc, PC_COMPOSITE_SCHUR), "PCFieldSplitSetType");
        check(PCFieldSplitSetSchurFactType(pc, PC_FIELDSPLIT_SCHUR_FACT_UPPER), "PCFieldSplitSetSchurFactType");
        check(PCFieldSplitSetSchurPre(pc, PC_FIELDSPLIT_SCHUR_PRE_USER, schur_preconditioner.get()),
              "PCFieldSplitSetSchurPre");
        // Defaults; PETSC_OPTIONS (e.g. "-lentus_fieldsplit_u_pc_type gamg") may override them.
        for (const auto &[name, value] : {std::pair<const char *, const char *>{"-lentus_fieldsplit_u_ksp_type", "preonly"},
                                          {"-lentus_fieldsplit_u_pc_type", "hypre"},
                                          {"-lentus_fieldsplit_u_pc_hypre_type", "boomeramg"},
                                          {"-lentus_fieldsplit_p_ksp_type", "preonly"},
                                          {"-lentus_fieldsplit_p_pc_type", "jacobi"}})
          {
            PetscBool given = PETSC_FALSE;
            check(PetscOptionsHasName(nullptr, nullptr, name, &given), "PetscOptionsHasName");
            if (!given)
              check(PetscOptionsSetValue(nullptr, name, value), "PetscOptionsSetValue");
          }
        check(KSPSetFromOptions(ksp), "KSPSetFromOptions");
      }

    Vector owned_update(mesh.owned, mesh.comm);
    // The factorization or preconditioner set-up, timed apart from the solve.
    const PetscErrorCode set_up = KSPSetUp(ksp);
    result.setup_seconds        = seconds_since(start);
    const auto           solve_start = Clock::now();
    const PetscErrorCode solved = set_up != 0 ? set_up : KSPSolve(ksp, static_cast<const Vec &>(system.residual), static_cast<const Vec &>(owned_update));
    KSPConvergedReason reason;
    PetscInt           iterations = 0;
    KSPGetConvergedReason(ksp, &reason);
    KSPGetIterationNumber(ksp, &iterations);
    if (solved != 0 || reason < 0)
      {
        system.kept_solver.reset(); // a failed factorization is not kept
        throw NoConvergence(std::string(direct ? "the direct solver (MUMPS)" : "FGMRES") +
                          " failed on the linearized system (PETSc reason " + std::to_string(int(reason)) +
                          "); the Jacobian may be singular: check that every boundary has a condition");
      }
    mesh.zero_constraints.distribute(owned_update);
    update               = owned_update;
    result.iterations    = direct ? 1u : static_cast<unsigned int>(iterations);
    result.solve_seconds = seconds_since(solve_start);
    return result;
  }
} // namespace lentus::flow
