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
#include "solver/flow/heat.h"

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
  /// A symmetric 3x3 tensor in Mandel's notation (xx, yy, zz, sqrt2 xy, sqrt2 xz, sqrt2 yz), so that
  /// the double contraction A:B is the plain dot product of six numbers.
  struct Mandel
  {
    double v[6];
  };

  Mandel mandel_of_strain(const Tensor<2, 3> &L)
  {
    const double half_root2 = 0.5 * std::sqrt(2.);
    return {{L[0][0], L[1][1], L[2][2], half_root2 * (L[0][1] + L[1][0]), half_root2 * (L[0][2] + L[2][0]),
             half_root2 * (L[1][2] + L[2][1])}};
  }

  double dot(const Mandel &a, const Mandel &b)
  {
    return a.v[0] * b.v[0] + a.v[1] * b.v[1] + a.v[2] * b.v[2] + a.v[3] * b.v[3] + a.v[4] * b.v[4] + a.v[5] * b.v[5];
  }

  double assemble_into(const Physics &physics,
                       const Discretization &mesh,
                       const Vector &evaluation_point,
                       const Linearization linearization,
                       LinearSystem &system,
                       Vector *reactions)
  {
    const bool             with_matrix = linearization != Linearization::none;
    const bool             newton      = linearization == Linearization::newton;
    const bool             with_mass   = with_matrix && system.pressure_mass_wanted;
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
    FullMatrix<double>     cell_matrix(dofs_per_cell, dofs_per_cell);
    dealii::Vector<double> cell_residual(dofs_per_cell);
    std::vector<types::global_dof_index> dof_indices(dofs_per_cell);
    std::vector<dealii::Vector<double>>  values(n_q, dealii::Vector<double>(n_velocity + 1));
    std::vector<std::vector<Tensor<1, 2>>> gradients(n_q, std::vector<Tensor<1, 2>>(n_velocity + 1));
    // Cell-local indices of the velocity and pressure unknowns, and each one's component. A velocity
    // shape function has one non-zero component: its U, symmetric gradient and divergence are
    // computed once per quadrature point, and the pairs of the velocity block cost one 6-term
    // dot product (the pressure-pressure block of the system matrix is zero and skipped).
    std::vector<unsigned int> velocity_dofs, pressure_dofs, component_of(dofs_per_cell);
    for (unsigned int i = 0; i < dofs_per_cell; ++i)
      {
        component_of[i] = fe.system_to_component_index(i).first;
        (component_of[i] == n_velocity ? pressure_dofs : velocity_dofs).push_back(i);
      }
    const auto n_u = static_cast<unsigned int>(velocity_dofs.size());
    const auto n_pressure = static_cast<unsigned int>(pressure_dofs.size());
    std::vector<Tensor<1, 3>> shape_U(n_u), shape_transport(n_u);
    std::vector<Mandel>       shape_strain(n_u);
    std::vector<double>       shape_divergence(n_u), strain_projection(n_u), shape_pressure(n_pressure);
    FullMatrix<double>                   pressure_mass(n_pressure, n_pressure);
    std::vector<types::global_dof_index> pressure_indices(n_pressure);

    // With the energy equation coupled, the viscosity at each point's temperature.
    LocalTemperature local(physics, quadrature);
    std::map<types::boundary_id, double> set_pressure;
    for (const input::BoundaryCondition &bc : physics.flow.conditions)
      if (bc.type == input::BoundaryCondition::Type::pressure)
        set_pressure[physics.flow.geometry->id_of_role(bc.role)] = bc.pressure;

    // Inertia only when switched on (a density may be present for gravity alone).
    const double rho         = physics.flow.model.inertia ? physics.density : 0.;
    const double rho_gravity = physics.density;
    const double frame_omega = (physics.flow.model.impeller_frame() && kind == FormulationKind::planar) ? physics.flow.impeller_omega() : 0.;
    // Primal-dual Newton: the stress t at each quadrature point is a second iterate (Chan, Golub &
    // Mulet 1999, SIAM J. Sci. Comput. 20:1964, for total variation; here for tau = 2 eta D). With d
    // the strain rate in Mandel's notation, n = d/|d|, sigma(gamma_dot) = eta gamma_dot the flow curve
    // and sigma' its slope, the linearized law t |d| = sqrt2 sigma d gives the tangent
    //   C = 2 eta I + 2 sigma' n n^T - (t n^T + n t^T) / (2 |d|)        (symmetrized)
    // which is Newton's 2 eta (I - n n^T) + 2 sigma' n n^T when t = 2 eta d. After a step the stress
    // moves along the tangent, t_new = 2 eta d + C (d_new - d), and is bounded by the law's stress at
    // the new strain rate, |t_new| <= 2 eta(d_new) |d_new|, which keeps C positive.
    const bool         primal_dual = newton && physics.flow.nonlinear.linearization == input::NewtonLinearization::primal_dual;
    constexpr unsigned n_dual      = 14; // d (6), t (6), eta, sigma'
    const std::size_t  dual_size   = static_cast<std::size_t>(mesh.triangulation.n_active_cells()) * n_q * n_dual;
    const bool         dual_known  = primal_dual && system.dual_valid && system.dual.size() == dual_size;
    if (primal_dual && !dual_known)
      system.dual.assign(dual_size, 0.);
    std::vector<double> dual_n(n_u), dual_t(n_u);

    // Without inertia the Jacobian is symmetric (the residual is the gradient of an energy):
    // one triangle of the velocity block is computed and mirrored.
    const bool symmetric = rho == 0.;
    Tensor<1, 3> gravity;
    gravity[0] = physics.flow.model.gravity[0];
    gravity[2] = physics.flow.model.gravity[1];

    if (with_matrix)
      system.system_matrix = 0.;
    if (with_mass)
      system.pressure_mass = 0.;
    system.residual = 0.;

    for (const auto &cell : mesh.dof_handler.active_cell_iterators())
      {
        if (!cell->is_locally_owned())
          continue;
        fe_values.reinit(cell);
        cell->get_dof_indices(dof_indices);
        fe_values.get_function_values(evaluation_point, values);
        fe_values.get_function_gradients(evaluation_point, gradients);
        local.reinit(cell);
        cell_matrix   = 0.;
        pressure_mass = 0.;
        cell_residual = 0.;

        for (unsigned int q = 0; q < n_q; ++q)
          {
            const Point<2> &x = fe_values.quadrature_point(q);
            const double    w = volume_weight(kind, x) * fe_values.JxW(q);

            const Kinematics   u = kinematics(kind, x, &values[q][0], gradients[q].data());
            const Mandel       D = mandel_of_strain(u.L);
            const double       gamma_dot = std::sqrt(2. * dot(D, D));
            const auto         eta       = local.viscosity(*physics.law, gamma_dot, q);
            const double       p         = values[q][n_velocity];
            const double       divergence = trace(u.L);
            const Tensor<1, 3> convection = u.L * u.U;
            // (4a): 2 Omega e_z x u - Omega^2 r, with e_z x u = (-u_y, u_x) (mesh components 0 and 2).
            Tensor<1, 3> frame;
            if (frame_omega != 0.)
              {
                frame[0] = -2. * frame_omega * u.U[2] - frame_omega * frame_omega * x[0];
                frame[2] = 2. * frame_omega * u.U[0] - frame_omega * frame_omega * x[1];
              }
            // The force per unit velocity test function: viscous stress (1) and the body forces
            // (2), (4), (4a) (constant over the shape functions).
            const Tensor<1, 3> body = rho * convection - rho_gravity * gravity + rho * frame;
            // d eta/d gamma_dot * d gamma_dot / dD: the Newton term needs 4 eta'/gamma_dot.
            const double newton_factor = (newton && gamma_dot > 1e-300) ? 4. * eta.derivative / gamma_dot : 0.;
            // Primal-dual: n, the stress t and the scale 1/(2|d|) of this point (dual_scale = 0: Newton's own).
            Mandel n{}, t{};
            double dual_scale = 0., slope = 0.;
            const double strain_norm = std::sqrt(dot(D, D));
            if (primal_dual && strain_norm > 1e-300)
              {
                double *const stored = &system.dual[(cell->active_cell_index() * n_q + q) * n_dual];
                slope                = eta.value + eta.derivative * gamma_dot; // sigma'
                for (unsigned int k = 0; k < 6; ++k)
                  {
                    n.v[k] = D.v[k] / strain_norm;
                    t.v[k] = 2. * eta.value * D.v[k];
                  }
                const double old_norm = std::sqrt(stored[0] * stored[0] + stored[1] * stored[1] + stored[2] * stored[2] +
                                                  stored[3] * stored[3] + stored[4] * stored[4] + stored[5] * stored[5]);
                if (dual_known && old_norm > 1e-300)
                  {
                    // t_new = 2 eta_old d_old + C_old (d - d_old), C_old from the stored state.
                    const double *d_old = stored, *t_old = stored + 6;
                    const double  eta_old = stored[12], slope_old = stored[13];
                    double        change[6], n_old[6];
                    double        n_change = 0., t_change = 0.;
                    for (unsigned int k = 0; k < 6; ++k)
                      {
                        change[k] = D.v[k] - d_old[k];
                        n_old[k]  = d_old[k] / old_norm;
                        n_change += n_old[k] * change[k];
                        t_change += t_old[k] * change[k];
                      }
                    Mandel moved;
                    for (unsigned int k = 0; k < 6; ++k)
                      moved.v[k] = 2. * eta_old * d_old[k] + 2. * eta_old * change[k] + 2. * slope_old * n_old[k] * n_change -
                                   (t_old[k] * n_change + n_old[k] * t_change) / (2. * old_norm);
                    const double bound = 2. * eta.value * strain_norm, size = std::sqrt(dot(moved, moved));
                    const double scale = size > bound ? bound / size : 1.;
                    for (unsigned int k = 0; k < 6; ++k)
                      t.v[k] = scale * moved.v[k];
                  }
                for (unsigned int k = 0; k < 6; ++k)
                  {
                    stored[k]     = D.v[k];
                    stored[6 + k] = t.v[k];
                  }
                stored[12] = eta.value;
                stored[13] = slope;
                dual_scale = 1. / (2. * strain_norm);
              }

            for (unsigned int a = 0; a < n_u; ++a)
              {
                const unsigned int i               = velocity_dofs[a];
                const unsigned int component       = component_of[i];
                double             shape_values[3] = {0., 0., 0.};
                Tensor<1, 2>       shape_gradients[3];
                shape_values[component]    = fe_values.shape_value(i, q);
                shape_gradients[component] = fe_values.shape_grad(i, q);
                const Kinematics shape     = kinematics(kind, x, shape_values, shape_gradients);
                shape_U[a]                 = shape.U;
                shape_strain[a]            = mandel_of_strain(shape.L);
                shape_divergence[a]        = trace(shape.L);
                strain_projection[a]       = dot(D, shape_strain[a]);
                if (dual_scale > 0.)
                  {
                    dual_n[a] = dot(n, shape_strain[a]);
                    dual_t[a] = dot(t, shape_strain[a]);
                  }
                // (1) + (2) + (3) + (4) + (4a)
                cell_residual(i) += (2. * eta.value * strain_projection[a] + body * shape.U - p * shape_divergence[a]) * w;
                if (with_matrix && rho != 0.)
                  {
                    // (2') the Oseen part, Newton's second part and (4a') the Coriolis force (linear in
                    // u: kept by Picard and Newton alike), as the force of shape function a.
                    Tensor<1, 3> linearized = shape.L * u.U;
                    if (newton)
                      linearized += u.L * shape.U;
                    linearized[0] -= 2. * frame_omega * shape.U[2];
                    linearized[2] += 2. * frame_omega * shape.U[0];
                    shape_transport[a] = rho * linearized;
                  }
              }
            for (unsigned int b = 0; b < n_pressure; ++b)
              {
                shape_pressure[b] = fe_values.shape_value(pressure_dofs[b], q);
                cell_residual(pressure_dofs[b]) -= shape_pressure[b] * divergence * w; // (6)
              }
            if (!with_matrix)
              continue;

            const double two_eta_w = 2. * eta.value * w, newton_w = newton_factor * w;
            for (unsigned int a = 0; a < n_u; ++a)
              {
                const unsigned int i      = velocity_dofs[a];
                const unsigned int last   = symmetric ? a + 1 : n_u;
                const double       newton_a = newton_w * strain_projection[a];
                for (unsigned int c = 0; c < last; ++c)
                  {
                    // (1') and its Newton part
                    double entry = two_eta_w * dot(shape_strain[a], shape_strain[c]);
                    if (dual_scale > 0.)
                      entry += w * (2. * slope * dual_n[a] * dual_n[c] -
                                    dual_scale * (dual_t[a] * dual_n[c] + dual_n[a] * dual_t[c]));
                    else
                      entry += newton_a * strain_projection[c];
                    if (rho != 0.)
                      entry += shape_transport[c] * shape_U[a] * w; // (2'), (4a')
                    cell_matrix(i, velocity_dofs[c]) += entry;
                  }
                for (unsigned int b = 0; b < n_pressure; ++b)
                  {
                    // (3') and (6')
                    const double entry = -shape_pressure[b] * shape_divergence[a] * w;
                    cell_matrix(i, pressure_dofs[b]) += entry;
                    cell_matrix(pressure_dofs[b], i) += entry;
                  }
              }
            if (with_mass)
              // 1/eta-weighted pressure mass matrix for the Schur-complement preconditioner
              for (unsigned int b = 0; b < n_pressure; ++b)
                for (unsigned int c = 0; c < n_pressure; ++c)
                  pressure_mass(b, c) += shape_pressure[b] * shape_pressure[c] / eta.value * w;
          }
        if (with_matrix && symmetric)
          for (unsigned int a = 0; a < n_u; ++a)
            for (unsigned int c = 0; c < a; ++c)
              cell_matrix(velocity_dofs[c], velocity_dofs[a]) = cell_matrix(velocity_dofs[a], velocity_dofs[c]);

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
            if (with_mass)
              {
                for (unsigned int b = 0; b < n_pressure; ++b)
                  pressure_indices[b] = dof_indices[pressure_dofs[b]];
                mesh.zero_constraints.distribute_local_to_global(pressure_mass, pressure_indices, system.pressure_mass);
              }
          }
        else
          mesh.zero_constraints.distribute_local_to_global(cell_residual, dof_indices, system.residual);
      }

    if (with_matrix)
      system.dual_valid = primal_dual;
    if (with_matrix)
      system.system_matrix.compress(VectorOperation::add);
    if (with_mass)
      system.pressure_mass.compress(VectorOperation::add);
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
