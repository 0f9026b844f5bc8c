// Residual and Jacobian of steady generalized-Newtonian flow.
//
// With U, L the velocity and its gradient (solver/formulation/kinematics.h),
// D = sym L, gamma_dot = sqrt(2 D:D), w the volume weight, the residual for a
// velocity test function (U_v, L_v) and a pressure test function q is
//   R_v = int [ 2 eta D:L_v                      (1) viscous stress
//               + rho (L U) . U_v                (2) inertia (centrifugal, Coriolis included)
//               - p tr L_v                       (3) pressure
//               - rho g . U_v                    (4) gravity
//               + rho [2 Omega e_z x u - Omega^2 r] . U_v   (4a) Coriolis and centrifugal force in
//                                                           a frame turning at Omega (planar, inertia)
//             ] w dx
//         + int_{pressure roles} p_set (n . U_v) w ds   (5) set normal stress
//   R_q = - int q tr L w dx                      (6) continuity
// The Jacobian in direction (U_d, L_d, p_d):
//   int [ 2 eta D_d:D_v + 4 eta'/gamma_dot (D:D_d)(D:D_v)   (1') Newton; Picard keeps the first part
//         + rho (L_d U + L U_d) . U_v                         (2') Newton; Picard (Oseen) keeps L_d U
//         + rho 2 Omega (e_z x U_d) . U_v                     (4a')
//         - p_d tr L_v - q tr L_d ] w dx                      (3') (6')
#include "solver/flow/flow_state.h"

#include <deal.II/base/quadrature_lib.h>
#include <deal.II/fe/fe_values.h>
#include <deal.II/lac/full_matrix.h>
#include <deal.II/lac/vector.h>

#include <cmath>

namespace lentus::flow
{
  using namespace dealii;

  namespace
  {
    double assemble_into(const Physics &physics,
                         const Discretization &mesh,
                         const Vector &evaluation_point,
                         const Linearization linearization,
                         LinearSystem &system,
                         Vector *reactions);
  }

  double assemble(const Physics &physics, const Discretization &mesh, const Vector &evaluation_point,
                  const Linearization linearization, LinearSystem &system)
  {
    return assemble_into(physics, mesh, evaluation_point, linearization, system, nullptr);
  }

  void assemble_reactions(const Physics &physics, const Discretization &mesh, const Vector &evaluation_point,
                          Vector &reactions)
  {
    reactions.reinit(mesh.owned, mesh.comm);
    LinearSystem residual_only;
    residual_only.residual.reinit(mesh.owned, mesh.comm);
    assemble_into(physics, mesh, evaluation_point, Linearization::none, residual_only, &reactions);
  }

  namespace
  {
  double assemble_into(const Physics &physics,
                       const Discretization &mesh,
                       const Vector &evaluation_point,
                       const Linearization linearization,
                       LinearSystem &system,
                       Vector *reactions)
  {
    const bool             with_matrix = linearization != Linearization::none;
    const bool             newton      = linearization == Linearization::newton;
    const FESystem<2>     &fe          = mesh.fe;
    const unsigned int     n_velocity  = physics.n_velocity;
    const FormulationKind  kind        = physics.kind;
    const QGauss<2>        quadrature(fe.degree + 1);
    const QGauss<1>        face_quadrature(fe.degree + 1);
    FEValues<2>            fe_values(fe, quadrature,
                                     update_values | update_gradients | update_quadrature_points | update_JxW_values);
    FEFaceValues<2>        face_values(fe, face_quadrature,
                                       update_values | update_normal_vectors | update_quadrature_points |
                                         update_JxW_values);
    const unsigned int     dofs_per_cell = fe.n_dofs_per_cell();
    const unsigned int     n_q           = quadrature.size();
    FullMatrix<double>     cell_matrix(dofs_per_cell, dofs_per_cell), cell_mass(dofs_per_cell, dofs_per_cell);
    dealii::Vector<double> cell_residual(dofs_per_cell);
    std::vector<types::global_dof_index> dof_indices(dofs_per_cell);
    std::vector<dealii::Vector<double>>  values(n_q, dealii::Vector<double>(n_velocity + 1));
    std::vector<std::vector<Tensor<1, 2>>> gradients(n_q, std::vector<Tensor<1, 2>>(n_velocity + 1));
    std::vector<Kinematics> shape(dofs_per_cell);
    std::vector<double>     shape_divergence(dofs_per_cell), shape_pressure(dofs_per_cell);
    std::vector<Tensor<2, 3>> shape_strain(dofs_per_cell);
    std::vector<unsigned int> pressure_dofs; // cell-local indices of the pressure unknowns
    for (unsigned int i = 0; i < dofs_per_cell; ++i)
      if (fe.system_to_component_index(i).first == n_velocity)
        pressure_dofs.push_back(i);
    const auto                           n_pressure = static_cast<unsigned int>(pressure_dofs.size());
    FullMatrix<double>                   pressure_mass(n_pressure, n_pressure);
    std::vector<types::global_dof_index> pressure_indices(n_pressure);

    std::map<types::boundary_id, double> set_pressure;
    for (const input::BoundaryCondition &bc : physics.flow.conditions)
      if (bc.type == input::BoundaryCondition::Type::pressure)
        set_pressure[physics.flow.geometry->id_of_role(bc.role)] = bc.pressure;

    // Inertia only when switched on (a density may be present for gravity alone).
    const double rho         = physics.flow.model.inertia ? physics.density : 0.;
    const double rho_gravity = physics.density;
    const double frame_omega = (physics.flow.model.impeller_frame() && kind == FormulationKind::planar) ? physics.flow.impeller_omega() : 0.;
    Tensor<1, 3> gravity;
    gravity[0] = physics.flow.model.gravity[0];
    gravity[2] = physics.flow.model.gravity[1];

    if (with_matrix)
      {
        system.system_matrix = 0.;
        system.pressure_mass = 0.;
      }
    system.residual = 0.;

    for (const auto &cell : mesh.dof_handler.active_cell_iterators())
      {
        if (!cell->is_locally_owned())
          continue;
        fe_values.reinit(cell);
        cell->get_dof_indices(dof_indices);
        fe_values.get_function_values(evaluation_point, values);
        fe_values.get_function_gradients(evaluation_point, gradients);
        cell_matrix   = 0.;
        cell_mass     = 0.;
        cell_residual = 0.;

        for (unsigned int q = 0; q < n_q; ++q)
          {
            const Point<2> &x = fe_values.quadrature_point(q);
            const double    w = volume_weight(kind, x) * fe_values.JxW(q);

            const Kinematics   u = kinematics(kind, x, &values[q][0], gradients[q].data());
            const Tensor<2, 3> D = strain_rate(u.L);
            const double       gamma_dot = std::sqrt(2. * contract(D, D));
            const auto         eta       = physics.law->evaluate(gamma_dot);
            const double       p         = values[q][n_velocity];
            const Tensor<1, 3> convection = u.L * u.U;
            // (4a): 2 Omega e_z x u - Omega^2 r, with e_z x u = (-u_y, u_x) (mesh components 0 and 2).
            Tensor<1, 3> frame;
            if (frame_omega != 0.)
              {
                frame[0] = -2. * frame_omega * u.U[2] - frame_omega * frame_omega * x[0];
                frame[2] = 2. * frame_omega * u.U[0] - frame_omega * frame_omega * x[1];
              }
            // d eta/d gamma_dot * d gamma_dot / dD: the Newton term needs 4 eta'/gamma_dot.
            const double newton_factor = (newton && gamma_dot > 1e-300) ? 4. * eta.derivative / gamma_dot : 0.;

            for (unsigned int i = 0; i < dofs_per_cell; ++i)
              {
                const unsigned int component = fe.system_to_component_index(i).first;
                shape[i]                     = Kinematics();
                shape_pressure[i]            = 0.;
                if (component < n_velocity)
                  {
                    double       shape_values[3] = {0., 0., 0.};
                    Tensor<1, 2> shape_gradients[3];
                    shape_values[component]    = fe_values.shape_value(i, q);
                    shape_gradients[component] = fe_values.shape_grad(i, q);
                    shape[i]                   = kinematics(kind, x, shape_values, shape_gradients);
                  }
                else
                  shape_pressure[i] = fe_values.shape_value(i, q);
                shape_strain[i]     = strain_rate(shape[i].L);
                shape_divergence[i] = trace(shape[i].L);
              }

            for (unsigned int i = 0; i < dofs_per_cell; ++i)
              {
                // (1) + (2) + (3) + (4) for velocity tests, (6) for pressure tests
                cell_residual(i) += (2. * eta.value * contract(D, shape_strain[i]) +
                                     rho * convection * shape[i].U - p * shape_divergence[i] -
                                     rho_gravity * gravity * shape[i].U - shape_pressure[i] * trace(u.L) +
                                     rho * frame * shape[i].U) *
                                    w;
                if (!with_matrix)
                  continue;
                const double D_dot_Di = contract(D, shape_strain[i]);
                for (unsigned int j = 0; j < dofs_per_cell; ++j)
                  {
                    double entry = 2. * eta.value * contract(shape_strain[j], shape_strain[i]) // (1')
                                   + newton_factor * contract(D, shape_strain[j]) * D_dot_Di   // (1') Newton
                                   - shape_pressure[j] * shape_divergence[i]                   // (3')
                                   - shape_pressure[i] * shape_divergence[j];                  // (6')
                    if (rho != 0.)
                      {
                        Tensor<1, 3> linearized = shape[j].L * u.U; // (2') Oseen part
                        if (newton)
                          linearized += u.L * shape[j].U;
                        // (4a') the Coriolis force is linear in u: kept by Picard and Newton alike
                        linearized[0] -= 2. * frame_omega * shape[j].U[2];
                        linearized[2] += 2. * frame_omega * shape[j].U[0];
                        entry += rho * linearized * shape[i].U;
                      }
                    cell_matrix(i, j) += entry * w;
                    // 1/eta-weighted pressure mass matrix for the Schur-complement preconditioner
                    cell_mass(i, j) += shape_pressure[i] * shape_pressure[j] / eta.value * w;
                  }
              }
          }

        // (5) set normal stress on pressure roles
        for (const auto face_no : cell->face_indices())
          if (cell->face(face_no)->at_boundary())
            {
              const auto found = set_pressure.find(cell->face(face_no)->boundary_id());
              if (found == set_pressure.end())
                continue;
              face_values.reinit(cell, face_no);
              for (unsigned int q = 0; q < face_quadrature.size(); ++q)
                {
                  const Point<2>     &x = face_values.quadrature_point(q);
                  const Tensor<1, 2> &n = face_values.normal_vector(q);
                  const double        w = volume_weight(kind, x) * face_values.JxW(q);
                  for (unsigned int i = 0; i < dofs_per_cell; ++i)
                    {
                      const unsigned int component = fe.system_to_component_index(i).first;
                      if (component < 2)
                        cell_residual(i) += found->second * n[component] * face_values.shape_value(i, q) * w;
                    }
                }
            }

        if (reactions)
          {
            // Hanging unknowns hand their share to the unknowns they depend on, so that the reactions
            // are those of the conforming test functions (the walls' lifts).
            mesh.hanging_constraints.distribute_local_to_global(cell_residual, dof_indices, *reactions);
            continue;
          }
        // The system is J d = -R.
        cell_residual *= -1.;
        if (with_matrix)
          {
            mesh.zero_constraints.distribute_local_to_global(cell_matrix, cell_residual, dof_indices,
                                                              system.system_matrix, system.residual);
            // Only the pressure block of cell_mass is non-zero; the matrix has the pressure pattern.
            for (unsigned int i = 0; i < n_pressure; ++i)
              {
                pressure_indices[i] = dof_indices[pressure_dofs[i]];
                for (unsigned int j = 0; j < n_pressure; ++j)
                  pressure_mass(i, j) = cell_mass(pressure_dofs[i], pressure_dofs[j]);
              }
            mesh.zero_constraints.distribute_local_to_global(pressure_mass, pressure_indices, system.pressure_mass);
          }
        else
          mesh.zero_constraints.distribute_local_to_global(cell_residual, dof_indices, system.residual);
      }

    if (with_matrix)
      {
        system.system_matrix.compress(VectorOperation::add);
        system.pressure_mass.compress(VectorOperation::add);
      }
    if (reactions)
      {
        reactions->compress(VectorOperation::add);
        return reactions->l2_norm();
      }
    system.residual.compress(VectorOperation::add);
    return system.residual.l2_norm();
  }
  } // namespace
} // namespace lentus::flow
