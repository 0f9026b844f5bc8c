// Linear solves through PETSc: MUMPS sparse LU, or FGMRES with a block upper-
// triangular (Schur-complement) field-split preconditioner: BoomerAMG on the
// velocity block and the 1/eta-weighted pressure mass matrix for the Schur
// complement, which stays spectrally equivalent under large viscosity contrasts.
#include "solver/errors.h"
#include "solver/flow/flow_state.h"

#include <deal.II/dofs/dof_tools.h>
#include <deal.II/fe/fe_values_extractors.h>

#include <petscksp.h>

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

    /// Owned indices of one field as a PETSc index set.
    IS field_index_set(const Discretization &mesh, const ComponentMask &mask)
    {
      const IndexSet            field = DoFTools::extract_dofs(mesh.dof_handler, mask) & mesh.owned;
      std::vector<PetscInt>     indices;
      for (const auto index : field)
        indices.push_back(static_cast<PetscInt>(index));
      IS is;
      check(ISCreateGeneral(mesh.comm, static_cast<PetscInt>(indices.size()), indices.data(), PETSC_COPY_VALUES, &is),
            "ISCreateGeneral");
      return is;
    }
  } // namespace

  unsigned int solve_linear(const Physics &physics, const Discretization &mesh, LinearSystem &system,
                            Vector &update, const bool direct, const double relative_tolerance)
  {
    KSP ksp;
    PC  pc;
    check(KSPCreate(mesh.comm, &ksp), "KSPCreate");
    // The prefix must precede the field split, whose sub-solvers inherit it.
    check(KSPSetOptionsPrefix(ksp, "lentus_"), "KSPSetOptionsPrefix");
    check(KSPSetOperators(ksp, system.system_matrix.petsc_matrix(), system.system_matrix.petsc_matrix()),
          "KSPSetOperators");
    check(KSPGetPC(ksp, &pc), "KSPGetPC");
    IS  velocity_is = nullptr, pressure_is = nullptr;
    Mat schur_preconditioner = nullptr;
    if (direct)
      {
        check(KSPSetType(ksp, KSPPREONLY), "KSPSetType");
        check(PCSetType(pc, PCLU), "PCSetType");
        check(PCFactorSetMatSolverType(pc, MATSOLVERMUMPS), "PCFactorSetMatSolverType");
      }
    else
      {
        const FEValuesExtractors::Vector velocity(0);
        const FEValuesExtractors::Scalar pressure(physics.n_velocity);
        ComponentMask                    velocity_mask(physics.n_velocity + 1, false);
        for (unsigned int c = 0; c < physics.n_velocity; ++c)
          velocity_mask.set(c, true);
        velocity_is = field_index_set(mesh, velocity_mask);
        // Node-wise numbering (renumber_node_wise): the velocity block is a system of n_velocity unknowns per node.
        check(ISSetBlockSize(velocity_is, static_cast<PetscInt>(physics.n_velocity)), "ISSetBlockSize");
        pressure_is = field_index_set(mesh, mesh.fe.component_mask(pressure));
        check(MatCreateSubMatrix(system.pressure_mass.petsc_matrix(), pressure_is, pressure_is, MAT_INITIAL_MATRIX,
                                 &schur_preconditioner),
              "MatCreateSubMatrix");
        // S = -B A^-1 B^T is negative: precondition with -M_p(1/eta).
        check(MatScale(schur_preconditioner, -1.), "MatScale");
        check(KSPSetType(ksp, KSPFGMRES), "KSPSetType");
        check(KSPGMRESSetRestart(ksp, 200), "KSPGMRESSetRestart");
        check(KSPSetTolerances(ksp, relative_tolerance, 1e-30, 1e10, 2000), "KSPSetTolerances");
        check(PCSetType(pc, PCFIELDSPLIT), "PCSetType");
        check(PCFieldSplitSetIS(pc, "u", velocity_is), "PCFieldSplitSetIS");
        check(PCFieldSplitSetIS(pc, "p", pressure_is), "PCFieldSplitSetIS");
        check(PCFieldSplitSetType(pc, PC_COMPOSITE_SCHUR), "PCFieldSplitSetType");
        check(PCFieldSplitSetSchurFactType(pc, PC_FIELDSPLIT_SCHUR_FACT_UPPER), "PCFieldSplitSetSchurFactType");
        check(PCFieldSplitSetSchurPre(pc, PC_FIELDSPLIT_SCHUR_PRE_USER, schur_preconditioner),
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
    const PetscErrorCode solved = KSPSolve(ksp, static_cast<const Vec &>(system.residual), static_cast<const Vec &>(owned_update));
    KSPConvergedReason reason;
    PetscInt           iterations = 0;
    KSPGetConvergedReason(ksp, &reason);
    KSPGetIterationNumber(ksp, &iterations);
    KSPDestroy(&ksp);
    if (velocity_is)
      ISDestroy(&velocity_is);
    if (pressure_is)
      ISDestroy(&pressure_is);
    if (schur_preconditioner)
      MatDestroy(&schur_preconditioner);
    if (solved != 0 || reason < 0)
      throw NoConvergence(std::string(direct ? "the direct solver (MUMPS)" : "FGMRES") +
                          " failed on the linearized system (PETSc reason " + std::to_string(int(reason)) +
                          "); the Jacobian may be singular: check that every boundary has a condition");
    mesh.zero_constraints.distribute(owned_update);
    update = owned_update;
    return direct ? 1u : static_cast<unsigned int>(iterations);
  }
} // namespace lentus::flow
