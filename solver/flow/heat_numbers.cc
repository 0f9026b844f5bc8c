// The design numbers of the temperature field: flow-weighted mean temperatures where the fluid
// crosses the boundary, the temperature rise, the hottest point, the heat flowing in through each
// wall, the heat carried across each crossed role, the Brinkman and Nahme-Griffith numbers, and the
// isothermal pressures beside the non-isothermal ones.
#include "solver/flow/heat.h"
#include "solver/flow/vessel_integrals.h"
#include "solver/formulation/formulation.h"

#include <deal.II/base/mpi.h>
#include <deal.II/base/quadrature_lib.h>
#include <deal.II/dofs/dof_tools.h>
#include <deal.II/fe/fe_values.h>

#include <algorithm>
#include <array>
#include <cmath>
#include <map>
#include <set>

namespace lentus::flow
{
  using namespace dealii;

  namespace
  {
    /// Per role: volume flux out, T-weighted flux out, heat transfer into the fluid.
    struct RoleSums
    {
      double flux = 0., temperature_flux = 0., transfer = 0., held_flux = 0.; ///< held: T of the condition's data
    };

    using Type = input::ThermalCondition::Type;
  } // namespace

  void add_heat_numbers(const SolvedFlow &state, report::DesignNumbers &numbers)
  {
    if (!state.physics.heat || !state.physics.heat->solved)
      return;
    HeatField             &heat = *state.physics.heat;
    const input::FlowCase &flow = state.physics.flow;
    const Formulation      formulation(state.physics.kind);
    const double           factor = formulation.total_factor();
    const std::string      per    = formulation.per_depth();
    const MPI_Comm         comm   = state.mesh.comm;
    using report::Group;

    // Boundary integrals by role.
    std::map<types::boundary_id, const input::ThermalCondition *> condition_of;
    for (const input::ThermalCondition &bc : flow.thermal_conditions)
      condition_of[flow.geometry->id_of_role(bc.role)] = &bc;
    std::map<std::string, RoleSums> sums;
    const QGauss<1>     face_quadrature(heat.fe.degree + 1);
    FEFaceValues<2>     face_u(state.mesh.fe, face_quadrature,
                               update_values | update_normal_vectors | update_quadrature_points | update_JxW_values);
    FEFaceValues<2>     face_T(heat.fe, face_quadrature, update_values);
    std::vector<dealii::Vector<double>> u_face(face_quadrature.size(), dealii::Vector<double>(state.physics.n_velocity + 1));
    std::vector<double> T_face(face_quadrature.size());
    // Cells: dissipation-weighted viscosity at the melt temperature, and the hottest point.
    const QGauss<2>     quadrature(heat.fe.degree + 1);
    FEValues<2>         cell_u(state.mesh.fe, quadrature, update_values | update_gradients | update_quadrature_points |
                                                          update_JxW_values);
    std::vector<dealii::Vector<double>>    u_values(quadrature.size(), dealii::Vector<double>(state.physics.n_velocity + 1));
    std::vector<std::vector<Tensor<1, 2>>> u_gradients(quadrature.size(),
                                                       std::vector<Tensor<1, 2>>(state.physics.n_velocity + 1));
    const Quadrature<2> nodes(heat.fe.get_unit_support_points());
    FEValues<2>         cell_T(heat.fe, nodes, update_values | update_quadrature_points);
    std::vector<double> T_nodes(nodes.size());
    // The largest speed at the nodes (walls included, unlike the quadrature points of "maximum speed").
    FEValues<2>         cell_u_nodes(state.mesh.fe, nodes, update_values | update_quadrature_points);
    std::vector<dealii::Vector<double>> u_nodes(nodes.size(), dealii::Vector<double>(state.physics.n_velocity + 1));
    std::vector<Tensor<1, 2>>           no_gradients(state.physics.n_velocity + 1);
    double                              fastest_node = 0.;
    FEValues<2>         cell_gradient_T(heat.fe, quadrature, update_gradients);
    std::vector<Tensor<1, 2>> grad_T(quadrature.size());
    // int eta(T_melt) gamma_dot^2 w, int gamma_dot^2 w, int rho c_p u . grad T w
    double              weighted[3] = {0., 0., 0.};
    std::array<double, 3> hottest{{-HUGE_VAL, 0., 0.}};
    for (const auto &cell : heat.dof_handler.active_cell_iterators())
      {
        if (!cell->is_locally_owned())
          continue;
        const DoFHandler<2>::active_cell_iterator flow_cell(&state.mesh.triangulation, cell->level(), cell->index(),
                                                            &state.mesh.dof_handler);
        cell_T.reinit(cell);
        cell_T.get_function_values(heat.temperature, T_nodes);
        for (unsigned int q = 0; q < nodes.size(); ++q)
          if (T_nodes[q] > hottest[0])
            hottest = {{T_nodes[q], cell_T.quadrature_point(q)[0], cell_T.quadrature_point(q)[1]}};
        cell_u_nodes.reinit(flow_cell);
        cell_u_nodes.get_function_values(state.solution, u_nodes);
        for (unsigned int q = 0; q < nodes.size(); ++q)
          {
            const Point<2> &x = cell_u_nodes.quadrature_point(q);
            const Point<2>  at(is_axisymmetric(state.physics.kind) ? std::max(x[0], 1e-12) : x[0], x[1]);
            const Kinematics u = kinematics(state.physics.kind, at, &u_nodes[q][0], no_gradients.data());
            fastest_node       = std::max(fastest_node, fixed_frame_velocity(state, at, u.U).norm());
          }
        cell_u.reinit(flow_cell);
        cell_u.get_function_values(state.solution, u_values);
        cell_u.get_function_gradients(state.solution, u_gradients);
        cell_gradient_T.reinit(cell);
        cell_gradient_T.get_function_gradients(heat.temperature, grad_T);
        for (unsigned int q = 0; q < quadrature.size(); ++q)
          {
            const Point<2>  &x = cell_u.quadrature_point(q);
            const double     w = volume_weight(state.physics.kind, x) * cell_u.JxW(q);
            const Kinematics u = kinematics(state.physics.kind, x, &u_values[q][0], u_gradients[q].data());
            const double     g = shear_rate(u.L);
            weighted[0] += state.physics.law->evaluate(g).value * g * g * w;
            weighted[1] += g * g * w;
            weighted[2] += heat.rho_cp * (u.U[0] * grad_T[q][0] + u.U[2] * grad_T[q][1]) * w;
          }
        for (const auto face_no : cell->face_indices())
          {
            if (!cell->face(face_no)->at_boundary())
              continue;
            const auto found = condition_of.find(cell->face(face_no)->boundary_id());
            if (found == condition_of.end())
              continue;
            const input::ThermalCondition &bc = *found->second;
            face_u.reinit(flow_cell, face_no);
            face_T.reinit(cell, face_no);
            face_u.get_function_values(state.solution, u_face);
            face_T.get_function_values(heat.temperature, T_face);
            RoleSums &role = sums[bc.role];
            for (unsigned int q = 0; q < face_quadrature.size(); ++q)
              {
                const Point<2> &x = face_u.quadrature_point(q);
                const double    w = volume_weight(state.physics.kind, x) * face_u.JxW(q);
                const Tensor<1, 2> &n = face_u.normal_vector(q);
                const double    un = u_face[q][0] * n[0] + u_face[q][1] * n[1];
                role.flux += un * w;
                role.temperature_flux += T_face[q] * un * w;
                role.held_flux += bc.temperature_at(x[0], x[1]) * un * w;
                if (bc.type == Type::heat_transfer)
                  role.transfer += bc.coefficient * (bc.temperature - T_face[q]) * w;
              }
          }
      }
    Utilities::MPI::sum(ArrayView<const double>(weighted, 3), comm, ArrayView<double>(weighted, 3));

    // Consistent heat flows at the nodes of held temperatures (set temperatures and inlets): the
    // residual without their constraints. A node shared by two such roles counts for the first,
    // set temperatures before inlets, as in the constraints.
    Vector reactions;
    assemble_heat(state.physics, state.mesh, state.solution, heat, false, &reactions);
    std::map<std::string, double> held;
    {
      std::set<types::global_dof_index> counted;
      for (const Type type : {Type::set_temperature, Type::inlet})
        for (const input::ThermalCondition &bc : flow.thermal_conditions)
          if (bc.type == type)
            {
              const IndexSet dofs =
                DoFTools::extract_boundary_dofs(heat.dof_handler, ComponentMask(), {flow.geometry->id_of_role(bc.role)});
              double sum = 0.;
              for (const auto i : dofs)
                if (heat.owned.is_element(i) && counted.insert(i).second)
                  sum += reactions[i];
              held[bc.role] = Utilities::MPI::sum(sum, comm);
            }
    }

    // The hottest point over all ranks.
    const auto all_hottest = Utilities::MPI::all_gather(comm, hottest);
    for (const auto &candidate : all_hottest)
      if (candidate[0] > hottest[0])
        hottest = candidate;

    const bool axisymmetric = formulation.axisymmetric();
    double     out_flux = 0., out_temperature_flux = 0., in_flux = 0., in_temperature_flux = 0.;
    double     largest_difference = 0.;
    for (const input::ThermalCondition &bc : flow.thermal_conditions)
      {
        RoleSums role;
        role.flux             = Utilities::MPI::sum(sums[bc.role].flux, comm);
        role.temperature_flux = Utilities::MPI::sum(sums[bc.role].temperature_flux, comm);
        role.transfer         = Utilities::MPI::sum(sums[bc.role].transfer, comm);
        role.held_flux        = Utilities::MPI::sum(sums[bc.role].held_flux, comm);
        const std::string name = "'" + bc.role + "'";
        if (bc.type == Type::outflow)
          {
            if (role.flux != 0.)
              numbers.add("mean temperature at " + name, "T_m", role.temperature_flux / role.flux, "K", Group::heat);
            numbers.add("heat carried out through " + name, "H",
                        factor * heat.rho_cp * (role.temperature_flux - heat.melt_temperature * role.flux), "W" + per,
                        Group::heat);
            out_flux += role.flux;
            out_temperature_flux += role.temperature_flux;
          }
        if (bc.type == Type::inlet)
          {
            // The fluid enters at the role's set temperature (uniform or its profile): the heat it carries
            // in is that of the data, not of the interpolated field (whose corner nodes hold a neighbouring
            // wall's temperature).
            const double carried = bc.profile.empty() ? bc.temperature * role.flux : role.held_flux;
            if (!bc.profile.empty() && role.flux != 0.)
              numbers.add("mean temperature at " + name, "T_m", carried / role.flux, "K", Group::heat);
            numbers.add("heat carried out through " + name, "H",
                        factor * heat.rho_cp * (carried - heat.melt_temperature * role.flux) + 0., "W" + per,
                        Group::heat);
            in_flux += role.flux;
            in_temperature_flux += carried;
            numbers.add("heat conducted into the fluid through " + name, "Q_c", factor * held[bc.role], "W" + per,
                        Group::heat);
          }
        if (bc.type == Type::set_temperature)
          numbers.add("heat into the fluid through " + name, "Q", factor * held[bc.role], "W" + per, Group::heat);
        if (bc.type == Type::heat_transfer)
          numbers.add("heat into the fluid through " + name, "Q", factor * role.transfer, "W" + per, Group::heat);
        if (bc.type == Type::set_temperature || bc.type == Type::heat_transfer)
          largest_difference = std::max(largest_difference, std::abs(bc.temperature - heat.melt_temperature));
      }
    if (out_flux != 0.)
      {
        const double outlet = out_temperature_flux / out_flux;
        const double inlet  = in_flux != 0. ? in_temperature_flux / in_flux : heat.melt_temperature;
        numbers.add("temperature rise inlet to outlet", "dT", outlet - inlet, "K", Group::heat, true);
      }
    // The balance of the energy equation: what the flow carries out net (volume form, int rho c_p u . grad T)
    // equals the viscous dissipation (the design number of that name, with Viscous heating) plus the heat
    // into the fluid through walls and inlets, to solver precision; the sum of the per-role convected heats
    // above (boundary form) equals it to discretization precision (the discrete velocity is divergence-free
    // only weakly).
    numbers.add("net heat carried out by the flow", "H_net", factor * weighted[2], "W" + per, Group::heat);
    numbers.add("maximum temperature", "T_max", hottest[0], "K", Group::heat, true);
    // Where it is: a node, which jumps between meshes; no error bar.
    for (int c = 0; c < 2; ++c)
      {
        report::DesignNumber where;
        where.name      = std::string("maximum temperature at ") + (axisymmetric ? "rz"[c] : "xy"[c]);
        where.symbol    = std::string(1, axisymmetric ? "rz"[c] : "xy"[c]) + "_Tmax";
        where.value     = hottest[1 + c];
        where.unit      = "m";
        where.group     = Group::heat;
        where.estimable = false;
        numbers.add(where);
      }

    // Thermal groups of the case: U the largest speed (at the nodes; in a die, the land's centreline), eta the
    // dissipation-weighted mean viscosity at the melt temperature, int eta gamma_dot^2 / int gamma_dot^2.
    fastest_node       = Utilities::MPI::max(fastest_node, comm);
    const double speed = fastest_node;
    const double viscosity = weighted[1] > 0. ? weighted[0] / weighted[1] : state.physics.law->evaluate(0.).value;
    const double beta      = 0. - heat.log_slope(heat.melt_temperature); // +0 without a shift
    const double heating   = viscosity * speed * speed / heat.conductivity; // [K]
    numbers.add("Nahme-Griffith number", "Na", beta * heating, "-", Group::heat);
    if (largest_difference > 0.)
      numbers.add("Brinkman number", "Br", heating / largest_difference, "-", Group::heat);

    if (heat.isothermal)
      for (const char *name : {"pressure drop inlet to outlet", "impeller torque", "impeller power"})
        if (const report::DesignNumber *isothermal = heat.isothermal->find(name))
          {
            report::DesignNumber copy = *isothermal;
            copy.name                 = std::string("isothermal ") + name;
            copy.symbol += "_iso";
            // A key number's isothermal value is a key number too: the user sees both side by side.
            const report::DesignNumber *heated = numbers.find(name);
            copy.key                           = heated && heated->key;
            copy.group    = Group::heat;
            copy.accuracy = {};
            numbers.add(copy);
          }
  }
} // namespace lentus::flow
