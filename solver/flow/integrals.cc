// Integrals over cells and boundary roles, and reactions by role.
#include "solver/flow/integrals.h"

#include "solver/flow/heat.h"
#include "solver/flow/vessel_integrals.h"
#include "solver/formulation/formulation.h"

#include <deal.II/base/quadrature_lib.h>
#include <deal.II/dofs/dof_tools.h>
#include <deal.II/fe/fe_values.h>
#include <deal.II/fe/mapping_q1.h>

#include <algorithm>
#include <array>

namespace lentus::flow
{
  using namespace dealii;

  namespace
  {
    /// A wall: the fluid sticks to it (at rest, moving or turning with the impeller).
    bool is_wall(const input::BoundaryCondition &bc)
    {
      return bc.type == input::BoundaryCondition::Type::no_slip ||
             bc.type == input::BoundaryCondition::Type::moving_wall ||
             bc.type == input::BoundaryCondition::Type::impeller;
    }

    /// Volume, dissipation, unyielded region, maximum speed.
    report::CellIntegrals cell_integrals(const SolvedFlow &state)
    {
      const QGauss<2> quadrature(state.mesh.fe.degree + 1);
      FEValues<2>     fe_values(state.mesh.fe, quadrature,
                                update_values | update_gradients | update_quadrature_points | update_JxW_values);
      std::vector<dealii::Vector<double>>    values(quadrature.size(), dealii::Vector<double>(state.physics.n_velocity + 1));
      std::vector<std::vector<Tensor<1, 2>>> gradients(quadrature.size(),
                                                       std::vector<Tensor<1, 2>>(state.physics.n_velocity + 1));
      const double tau_y     = state.physics.law->yield_stress();
      LocalTemperature local(state.physics, quadrature);
      double       sums[5]   = {0., 0., 0., 0., 0.}; // area, volume, dissipation, unyielded area, unyielded volume
      double       max_speed = 0.;
      for (const auto &cell : state.mesh.dof_handler.active_cell_iterators())
        if (cell->is_locally_owned())
          {
            fe_values.reinit(cell);
            fe_values.get_function_values(state.solution, values);
            fe_values.get_function_gradients(state.solution, gradients);
            local.reinit(cell);
            for (unsigned int q = 0; q < quadrature.size(); ++q)
              {
                const Point<2>  &x         = fe_values.quadrature_point(q);
                const double     w         = volume_weight(state.physics.kind, x) * fe_values.JxW(q);
                const Kinematics u         = kinematics(state.physics.kind, x, &values[q][0], gradients[q].data());
                const double     gamma_dot = shear_rate(u.L);
                const double     eta       = local.viscosity(*state.physics.law, gamma_dot, q).value;
                sums[0] += fe_values.JxW(q);
                sums[1] += w;
                sums[2] += eta * gamma_dot * gamma_dot * w; // 2 eta D:D = eta gamma_dot^2
                if (tau_y > 0. && eta * gamma_dot < tau_y)
                  {
                    sums[3] += fe_values.JxW(q);
                    sums[4] += w;
                  }
                max_speed = std::max(max_speed, fixed_frame_velocity(state, x, u.U).norm());
              }
          }
      Utilities::MPI::sum(ArrayView<const double>(sums, 5), state.mesh.comm, ArrayView<double>(sums, 5));
      report::CellIntegrals cells;
      cells.area             = sums[0];
      cells.volume           = sums[1];
      cells.dissipation      = sums[2];
      cells.unyielded_area   = sums[3];
      cells.unyielded_volume = sums[4];
      cells.max_speed        = Utilities::MPI::max(max_speed, state.mesh.comm);
      return cells;
    }

    /// Flux, weighted pressure and weighted length of every role.
    void add_face_integrals(const SolvedFlow &state, std::map<std::string, report::RoleIntegrals> &roles)
    {
      const unsigned int pressure_component = state.physics.n_velocity;
      const QGauss<1>    face_quadrature(state.mesh.fe.degree + 1);
      FEFaceValues<2>    face_values(state.mesh.fe, face_quadrature,
                                     update_values | update_quadrature_points | update_normal_vectors | update_JxW_values);
      std::vector<dealii::Vector<double>> face_point_values(face_quadrature.size(),
                                                            dealii::Vector<double>(state.physics.n_velocity + 1));
      std::map<types::boundary_id, std::array<double, 3>> role_sums;
      const auto                                          ids = state.physics.flow.geometry->boundary_roles();
      for (const auto &[name, id] : ids)
        role_sums[id] = std::array<double, 3>{};
      for (const auto &cell : state.mesh.dof_handler.active_cell_iterators())
        if (cell->is_locally_owned())
          for (const auto face_no : cell->face_indices())
            if (cell->face(face_no)->at_boundary())
              {
                face_values.reinit(cell, face_no);
                face_values.get_function_values(state.solution, face_point_values);
                auto &sum = role_sums[cell->face(face_no)->boundary_id()];
                for (unsigned int q = 0; q < face_quadrature.size(); ++q)
                  {
                    // Only the in-plane components (mesh components 0, 1) cross the boundary.
                    const Tensor<1, 2> &n = face_values.normal_vector(q);
                    const double w = volume_weight(state.physics.kind, face_values.quadrature_point(q)) * face_values.JxW(q);
                    sum[0] += (face_point_values[q][0] * n[0] + face_point_values[q][1] * n[1]) * w;
                    sum[1] += face_point_values[q][pressure_component] * w;
                    sum[2] += w;
                  }
              }
      for (auto &[id, sum] : role_sums)
        Utilities::MPI::sum(ArrayView<const double>(sum.data(), 3), state.mesh.comm, ArrayView<double>(sum.data(), 3));
      for (const auto &[name, id] : ids)
        {
          report::RoleIntegrals &role = roles[name];
          role.flux                   = role_sums.at(id)[0];
          role.pressure               = role_sums.at(id)[1];
          role.weight                 = role_sums.at(id)[2];
        }
    }

    /// Torque, power and forces of each role from the unconstrained residual. Each boundary
    /// unknown belongs to the first role that constrains it.
    void add_reactions(const SolvedFlow &state, std::map<std::string, report::RoleIntegrals> &roles)
    {
      const Formulation formulation(state.physics.kind);
      Vector            reactions;
      assemble_reactions(state.physics, state.mesh, state.solution, reactions);
      std::map<types::global_dof_index, Point<2>> support_points;
      DoFTools::map_dofs_to_support_points(MappingQ1<2>(), state.mesh.dof_handler, support_points);
      std::vector<IndexSet> component_dofs;
      for (unsigned int c = 0; c < state.physics.n_velocity; ++c)
        {
          ComponentMask mask(state.physics.n_velocity + 1, false);
          mask.set(c, true);
          component_dofs.push_back(DoFTools::extract_dofs(state.mesh.dof_handler, mask));
        }
      ComponentMask velocity_mask(state.physics.n_velocity + 1, true);
      velocity_mask.set(state.physics.n_velocity, false);
      IndexSet   claimed(state.mesh.dof_handler.n_dofs());
      const auto ids = state.physics.flow.geometry->boundary_roles();
      // Walls first, so that a corner unknown shared with a symmetry, axis or pressure role (which
      // leave some of its components free) counts for the wall; roles that fix every velocity
      // component come first.
      std::vector<input::BoundaryCondition> walls_first;
      for (const bool wall_pass : {true, false})
        for (const input::BoundaryCondition &bc : state.physics.flow.conditions)
          {
            const bool fixed = is_wall(bc) || bc.type == input::BoundaryCondition::Type::inflow ||
                               bc.type == input::BoundaryCondition::Type::uniform_inflow;
            if (fixed == wall_pass)
              walls_first.push_back(bc);
          }
      for (const input::BoundaryCondition &bc : walls_first)
        {
          const IndexSet on_role =
            DoFTools::extract_boundary_dofs(state.mesh.dof_handler, velocity_mask, {ids.at(bc.role)}) & state.mesh.owned;
          double torque = 0., power = 0.;
          double force[2] = {0., 0.};
          for (const auto index : on_role)
            {
              if (claimed.is_element(index))
                continue;
              claimed.add_index(index);
              const double    reaction = reactions[index];
              const Point<2> &x        = support_points.at(index);
              power += reaction * state.solution[index];
              unsigned int component = 0;
              while (!component_dofs[component].is_element(index))
                ++component;
              if (component < 2)
                force[component] += reaction;
              torque += formulation.torque_arm(component, x) * reaction;
            }
          report::RoleIntegrals &role = roles[bc.role];
          role.torque                 = Utilities::MPI::sum(torque, state.mesh.comm);
          role.power                  = Utilities::MPI::sum(power, state.mesh.comm);
          Utilities::MPI::sum(ArrayView<const double>(force, 2), state.mesh.comm, ArrayView<double>(force, 2));
          role.force[0] = force[0];
          role.force[1] = force[1];
        }
    }
  } // namespace

  void make_pressure_mean_free(FlowState &state)
  {
    if (!state.mesh.pressure_pinned)
      return;
    const unsigned int pressure_component = state.physics.n_velocity;
    const QGauss<2>    quadrature(state.mesh.fe.degree + 1);
    FEValues<2>        fe_values(state.mesh.fe, quadrature, update_values | update_quadrature_points | update_JxW_values);
    std::vector<dealii::Vector<double>> values(quadrature.size(), dealii::Vector<double>(state.physics.n_velocity + 1));
    // p -= int p w / int w.
    double integral[2] = {0., 0.};
    for (const auto &cell : state.mesh.dof_handler.active_cell_iterators())
      if (cell->is_locally_owned())
        {
          fe_values.reinit(cell);
          fe_values.get_function_values(state.solution, values);
          for (unsigned int q = 0; q < quadrature.size(); ++q)
            {
              const double w = volume_weight(state.physics.kind, fe_values.quadrature_point(q)) * fe_values.JxW(q);
              integral[0] += values[q][pressure_component] * w;
              integral[1] += w;
            }
        }
    Utilities::MPI::sum(ArrayView<const double>(integral, 2), state.mesh.comm, ArrayView<double>(integral, 2));
    const double   mean = integral[0] / integral[1];
    const IndexSet pressure_dofs =
      DoFTools::extract_dofs(state.mesh.dof_handler, state.mesh.fe.component_mask(FEValuesExtractors::Scalar(pressure_component)));
    Vector owned(state.mesh.owned, state.mesh.comm);
    owned = state.solution;
    for (const auto index : pressure_dofs & state.mesh.owned)
      owned[index] -= mean;
    owned.compress(VectorOperation::add);
    state.solution = owned;
  }

  report::FlowIntegrals flow_integrals(const SolvedFlow &state)
  {
    report::FlowIntegrals integrals;
    for (const input::BoundaryCondition &bc : state.physics.flow.conditions)
      {
        report::ConditionInfo condition;
        condition.role     = bc.role;
        condition.wall     = is_wall(bc);
        condition.impeller = bc.type == input::BoundaryCondition::Type::impeller;
        if (bc.type == input::BoundaryCondition::Type::pressure)
          condition.set_pressure = bc.pressure;
        integrals.conditions.push_back(condition);
      }
    integrals.cells = cell_integrals(state);
    add_face_integrals(state, integrals.roles);
    add_reactions(state, integrals.roles);
    return integrals;
  }
} // namespace lentus::flow
