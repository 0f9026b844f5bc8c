// Design numbers by integration over cells and boundary roles, and field output.
#include "solver/flow/flow_report.h"

#include "solver/flow/developed_profile.h"
#include "solver/flow/vessel_numbers.h"

#include <deal.II/base/quadrature_lib.h>
#include <deal.II/dofs/dof_tools.h>
#include <deal.II/fe/fe_values.h>
#include <deal.II/fe/mapping_q1.h>
#include <deal.II/numerics/data_out.h>
#include <deal.II/numerics/data_postprocessor.h>

#include <algorithm>
#include <array>
#include <cmath>
#include <fstream>
#include <sstream>

namespace lentus::flow
{
  using namespace dealii;

  namespace
  {
    /// Shear rate, viscosity, von Mises stress |tau| = eta gamma_dot and the unyielded indicator.
    class DerivedFields : public DataPostprocessor<2>
    {
    public:
      explicit DerivedFields(const FlowState &state_) : state(state_) {}

      void evaluate_vector_field(const DataPostprocessorInputs::Vector<2> &inputs,
                                 std::vector<dealii::Vector<double>> &computed) const override
      {
        const double tau_y = state.law->yield_stress();
        for (unsigned int q = 0; q < inputs.solution_values.size(); ++q)
          {
            double       values[3];
            Tensor<1, 2> gradients[3];
            for (unsigned int c = 0; c < state.n_velocity; ++c)
              {
                values[c]    = inputs.solution_values[q][c];
                gradients[c] = inputs.solution_gradients[q][c];
              }
            const Point<2> &x = inputs.evaluation_points[q];
            // On the axis r = 0 the hoop terms are limits; evaluate just off it.
            const Point<2>     at(is_axisymmetric(state.kind) ? std::max(x[0], 1e-12) : x[0], x[1]);
            const Kinematics   u         = kinematics(state.kind, at, values, gradients);
            const double       gamma_dot = shear_rate(u.L);
            const double       eta       = state.law->evaluate(gamma_dot).value;
            computed[q](0)               = gamma_dot;
            computed[q](1)               = eta;
            computed[q](2)               = eta * gamma_dot;
            computed[q](3)               = (tau_y > 0. && eta * gamma_dot < tau_y) ? 1. : 0.;
            computed[q](4)               = fixed_frame_velocity(state, at, u.U).norm();
          }
      }

      std::vector<std::string> get_names() const override
      {
        return {"shear_rate", "viscosity", "von_Mises_stress", "unyielded", "speed"};
      }

      UpdateFlags get_needed_update_flags() const override
      {
        return update_values | update_gradients | update_quadrature_points;
      }

    private:
      const FlowState &state;
    };

    /// A wall: the fluid sticks to it (at rest, moving or turning with the impeller).
    bool is_wall(const input::BoundaryCondition &bc)
    {
      return bc.type == input::BoundaryCondition::Type::no_slip ||
             bc.type == input::BoundaryCondition::Type::moving_wall ||
             bc.type == input::BoundaryCondition::Type::impeller;
    }
  } // namespace

  std::vector<DesignNumber> design_numbers(FlowState &state)
  {
    const bool        axisymmetric = is_axisymmetric(state.kind);
    const double      factor       = axisymmetric ? 2. * M_PI : 1.;
    const std::string per          = axisymmetric ? "" : "/m";
    const std::string volume_unit  = axisymmetric ? "m^3" : "m^2";
    const std::string flow_unit    = axisymmetric ? "m^3/s" : "m^2/s";
    const unsigned int pressure_component = state.n_velocity;

    const QGauss<2>  quadrature(state.fe.degree + 1);
    const QGauss<1>  face_quadrature(state.fe.degree + 1);
    FEValues<2>      fe_values(state.fe, quadrature,
                               update_values | update_gradients | update_quadrature_points | update_JxW_values);
    FEFaceValues<2>  face_values(state.fe, face_quadrature,
                                 update_values | update_quadrature_points | update_normal_vectors | update_JxW_values);
    std::vector<dealii::Vector<double>>    values(quadrature.size(), dealii::Vector<double>(state.n_velocity + 1));
    std::vector<dealii::Vector<double>>    face_point_values(face_quadrature.size(),
                                                          dealii::Vector<double>(state.n_velocity + 1));
    std::vector<std::vector<Tensor<1, 2>>> gradients(quadrature.size(), std::vector<Tensor<1, 2>>(state.n_velocity + 1));

    // Mean-free pressure when it was pinned: p -= int p w / int w.
    if (state.pressure_pinned)
      {
        double integral[2] = {0., 0.};
        for (const auto &cell : state.dof_handler.active_cell_iterators())
          if (cell->is_locally_owned())
            {
              fe_values.reinit(cell);
              fe_values.get_function_values(state.solution, values);
              for (unsigned int q = 0; q < quadrature.size(); ++q)
                {
                  const double w = volume_weight(state.kind, fe_values.quadrature_point(q)) * fe_values.JxW(q);
                  integral[0] += values[q][pressure_component] * w;
                  integral[1] += w;
                }
            }
        Utilities::MPI::sum(ArrayView<const double>(integral, 2), state.comm, ArrayView<double>(integral, 2));
        const double   mean = integral[0] / integral[1];
        const IndexSet pressure_dofs =
          DoFTools::extract_dofs(state.dof_handler, state.fe.component_mask(FEValuesExtractors::Scalar(pressure_component)));
        Vector owned(state.owned, state.comm);
        owned = state.solution;
        for (const auto index : pressure_dofs & state.owned)
          owned[index] -= mean;
        owned.compress(VectorOperation::add);
        state.solution = owned;
      }

    // Cell integrals: volume, dissipation, unyielded, maximum speed.
    const double tau_y = state.law->yield_stress();
    double       sums[5] = {0., 0., 0., 0., 0.}; // area, volume, dissipation, unyielded area, unyielded volume
    double       max_speed = 0.;
    for (const auto &cell : state.dof_handler.active_cell_iterators())
      if (cell->is_locally_owned())
        {
          fe_values.reinit(cell);
          fe_values.get_function_values(state.solution, values);
          fe_values.get_function_gradients(state.solution, gradients);
          for (unsigned int q = 0; q < quadrature.size(); ++q)
            {
              const Point<2>    &x = fe_values.quadrature_point(q);
              const double       w = volume_weight(state.kind, x) * fe_values.JxW(q);
              const Kinematics   u = kinematics(state.kind, x, &values[q][0], gradients[q].data());
              const double       gamma_dot = shear_rate(u.L);
              const double       eta       = state.law->evaluate(gamma_dot).value;
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
    Utilities::MPI::sum(ArrayView<const double>(sums, 5), state.comm, ArrayView<double>(sums, 5));
    max_speed = Utilities::MPI::max(max_speed, state.comm);

    // Boundary integrals per role: flux, weighted pressure, weighted length.
    const auto                         roles = state.flow.geometry->boundary_roles();
    std::map<types::boundary_id, std::array<double, 3>> role_sums;
    for (const auto &[name, id] : roles)
      role_sums[id] = std::array<double, 3>{};
    for (const auto &cell : state.dof_handler.active_cell_iterators())
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
                  const double w = volume_weight(state.kind, face_values.quadrature_point(q)) * face_values.JxW(q);
                  sum[0] += (face_point_values[q][0] * n[0] + face_point_values[q][1] * n[1]) * w;
                  sum[1] += face_point_values[q][pressure_component] * w;
                  sum[2] += w;
                }
            }
    for (auto &[id, sum] : role_sums)
      Utilities::MPI::sum(ArrayView<const double>(sum.data(), 3), state.comm, ArrayView<double>(sum.data(), 3));

    // Reactions: torque and power of each role from the unconstrained residual (consistent with the
    // discrete equations). Each boundary unknown belongs to the first role that constrains it.
    Vector reactions;
    assemble_reactions(state, state.solution, reactions);
    std::map<types::global_dof_index, Point<2>> support_points;
    DoFTools::map_dofs_to_support_points(MappingQ1<2>(), state.dof_handler, support_points);
    std::vector<IndexSet> component_dofs;
    for (unsigned int c = 0; c < state.n_velocity; ++c)
      {
        ComponentMask mask(state.n_velocity + 1, false);
        mask.set(c, true);
        component_dofs.push_back(DoFTools::extract_dofs(state.dof_handler, mask));
      }
    ComponentMask velocity_mask(state.n_velocity + 1, true);
    velocity_mask.set(state.n_velocity, false);
    IndexSet                       claimed(state.dof_handler.n_dofs());
    std::map<std::string, double>  role_torque, role_power;
    std::map<std::string, std::array<double, 2>> role_force;
    // Walls first, so that a corner unknown shared with a symmetry, axis or pressure role (which
    // leave some of its components free) counts for the wall.
    std::vector<input::BoundaryCondition> walls_first;
    for (const bool wall_pass : {true, false})
      for (const input::BoundaryCondition &bc : state.flow.conditions)
        {
          // Roles that fix every velocity component come first.
          const bool fixed = is_wall(bc) || bc.type == input::BoundaryCondition::Type::inflow ||
                             bc.type == input::BoundaryCondition::Type::uniform_inflow;
          if (fixed == wall_pass)
            walls_first.push_back(bc);
        }
    for (const input::BoundaryCondition &bc : walls_first)
      {
        const IndexSet on_role =
          DoFTools::extract_boundary_dofs(state.dof_handler, velocity_mask, {roles.at(bc.role)}) & state.owned;
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
            for (unsigned int c = 0; c < 2; ++c)
              if (component_dofs[c].is_element(index))
                force[c] += reaction;
            // Torque about the axis (swirl: r R_theta) or the origin (planar: x R_y - y R_x).
            if (state.kind == FormulationKind::planar)
              torque += component_dofs[0].is_element(index) ? -x[1] * reaction : x[0] * reaction;
            else if (state.kind == FormulationKind::swirl && component_dofs[2].is_element(index))
              torque += x[0] * reaction;
          }
        role_torque[bc.role] = factor * Utilities::MPI::sum(torque, state.comm);
        role_power[bc.role]  = factor * Utilities::MPI::sum(power, state.comm);
        Utilities::MPI::sum(ArrayView<const double>(force, 2), state.comm, ArrayView<double>(force, 2));
        role_force[bc.role] = {{factor * force[0], factor * force[1]}};
      }

    std::vector<DesignNumber> numbers;
    double                    power_in = 0.;
    for (const input::BoundaryCondition &bc : state.flow.conditions)
      {
        const auto  &sum = role_sums.at(roles.at(bc.role));
        const double flow_rate = factor * sum[0];
        numbers.push_back({"flow rate out through " + bc.role, flow_rate, flow_unit});
        numbers.push_back({"mean pressure on " + bc.role, sum[2] > 0. ? sum[1] / sum[2] : 0., "Pa"});
        const bool wall = is_wall(bc);
        if (wall && state.kind != FormulationKind::axisymmetric)
          numbers.push_back({"torque on the fluid from " + bc.role, role_torque[bc.role], "N m" + per});
        // Force the wall exerts on the fluid (the fluid's drag on the wall is its negative). Axisymmetric:
        // the axial force only (the radial one cancels around the circumference).
        if (wall && axisymmetric)
          numbers.push_back({"axial force on the fluid from " + bc.role, role_force[bc.role][1], "N"});
        else if (wall)
          {
            numbers.push_back({"x force on the fluid from " + bc.role, role_force[bc.role][0], "N/m"});
            numbers.push_back({"y force on the fluid from " + bc.role, role_force[bc.role][1], "N/m"});
          }
        // Power put in: the reactions' work on Dirichlet roles; -p Q on roles at a set pressure.
        power_in += role_power[bc.role];
        if (bc.type == input::BoundaryCondition::Type::pressure)
          power_in -= bc.pressure * flow_rate;
      }
    if (roles.count("inlet") && roles.count("outlet"))
      {
        const auto &in = role_sums.at(roles.at("inlet")), &out = role_sums.at(roles.at("outlet"));
        numbers.push_back({"pressure drop inlet to outlet", in[1] / in[2] - out[1] / out[2], "Pa"});
      }
    // Dies: developed flow at the computed throughput in each straight section (exact 1D solution of
    // the fluid's law), and the entrance loss beyond it (Bagley 1957: dp = 2 tau_w (L/R + e)).
    const auto sections = state.flow.geometry->straight_sections();
    if (!sections.empty() && roles.count("inlet") && roles.count("outlet"))
      {
        const auto  &out        = role_sums.at(roles.at("outlet"));
        const auto  &in         = role_sums.at(roles.at("inlet"));
        const double modelled   = factor * out[0];
        const double total_drop = in[1] / in[2] - out[1] / out[2];
        double       developed  = 0., last_wall_stress = 0.;
        for (const meshes::StraightSection &section : sections)
          {
            // The whole section's flow (a half slit carries half of it).
            const double throughput = modelled / section.flow_fraction;
            const bool   annulus    = section.pipe && section.inner > 0.;
            using Channel           = DevelopedProfile::Channel;
            const DevelopedProfile profile(*state.law,
                                           annulus ? Channel::annulus : section.pipe ? Channel::pipe : Channel::slit,
                                           section.size, throughput, section.inner);
            const double wall_stress = profile.wall_stress();
            const double drop        = std::abs(profile.pressure_gradient()) * section.length;
            developed += drop;
            numbers.push_back({"developed pressure drop in the " + section.name, drop, "Pa"});
            // Annulus: the mean over both walls' perimeters, then each wall.
            numbers.push_back({"developed wall shear stress in the " + section.name, wall_stress, "Pa"});
            if (annulus)
              {
                numbers.push_back({"developed wall shear stress on the mandrel in the " + section.name,
                                   profile.inner_wall_stress(), "Pa"});
                numbers.push_back({"developed wall shear stress on the outer wall in the " + section.name,
                                   profile.outer_wall_stress(), "Pa"});
              }
            // Apparent wall shear rate: 4Q/(pi R^3) (pipe), 3q/(2h^2) per unit depth (slit), and for an
            // annulus the slit value of its gap: 6Q/(pi (R + a)(R - a)^2); the true rate from the law.
            const double apparent =
              annulus      ? 6. * throughput / (M_PI * (section.size + section.inner) * std::pow(section.size - section.inner, 2)) :
              section.pipe ? 4. * throughput / (M_PI * std::pow(section.size, 3)) :
                             1.5 * throughput / std::pow(section.size, 2);
            numbers.push_back({"apparent wall shear rate in the " + section.name, apparent, "1/s"});
            numbers.push_back(
              {"wall shear rate in the " + section.name, inverse_shear_rate(*state.law, wall_stress), "1/s"});
            numbers.push_back({"apparent viscosity in the " + section.name, wall_stress / apparent, "Pa s"});
            last_wall_stress = wall_stress;
          }
        numbers.push_back({"entrance pressure loss", total_drop - developed, "Pa"});
        // dp_entrance = 2 tau_w e, so that dp = 2 tau_w (L/D + e) with D the radius (pipe) or the full
        // gap (slit; annulus, with the perimeter-mean wall stress) of the last section.
        numbers.push_back({"entrance loss coefficient (Bagley end correction)",
                           (total_drop - developed) / (2. * last_wall_stress), "-"});
      }

    append_vessel_numbers(state, role_torque, numbers);
    numbers.push_back({"power input through boundaries", power_in, "W" + per});
    numbers.push_back({"viscous dissipation", factor * sums[2], "W" + per});
    numbers.push_back({"maximum speed", max_speed, "m/s"});
    numbers.push_back({"flow area", sums[0], "m^2"});
    if (axisymmetric)
      numbers.push_back({"flow volume", factor * sums[1], "m^3"});
    if (tau_y > 0.)
      {
        numbers.push_back({"unyielded area fraction", sums[3] / sums[0], "-"});
        if (axisymmetric)
          numbers.push_back({"unyielded volume fraction", sums[4] / sums[1], "-"});
      }
    return numbers;
  }

  void write_fields(const FlowState &state, const std::string &folder)
  {
    DataOut<2>               data_out;
    std::vector<std::string> names;
    std::vector<DataComponentInterpretation::DataComponentInterpretation> interpretation;
    for (unsigned int c = 0; c < 2; ++c)
      {
        names.emplace_back("velocity");
        interpretation.push_back(DataComponentInterpretation::component_is_part_of_vector);
      }
    if (state.n_velocity == 3)
      {
        names.emplace_back("swirl_velocity");
        interpretation.push_back(DataComponentInterpretation::component_is_scalar);
      }
    names.emplace_back("pressure");
    interpretation.push_back(DataComponentInterpretation::component_is_scalar);
    data_out.attach_dof_handler(state.dof_handler);
    data_out.add_data_vector(state.solution, names, DataOut<2>::type_dof_data, interpretation);
    const DerivedFields derived(state);
    data_out.add_data_vector(state.solution, derived);
    dealii::Vector<float> partition(state.triangulation.n_active_cells());
    for (const auto &cell : state.triangulation.active_cell_iterators())
      if (cell->is_locally_owned())
        partition(cell->active_cell_index()) = static_cast<float>(state.rank);
    data_out.add_data_vector(partition, "partition");
    data_out.build_patches(state.fe.degree);
    const std::string record = data_out.write_vtu_with_pvtu_record(folder + "/", "fields", 0, state.comm, 2, 0);
    if (state.rank == 0)
      {
        std::ofstream pvd(folder + "/fields.pvd");
        DataOutBase::write_pvd_record(pvd, {{0., record}});
      }
  }
} // namespace lentus::flow
