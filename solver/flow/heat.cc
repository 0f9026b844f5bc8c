// The energy equation at a given flow and its split coupling with the flow.
//
// With U the velocity (mesh components a = (U_0, U_2) convect the temperature; a swirl does not),
// w the volume weight (1, or r when axisymmetric), S = eta gamma_dot^2 the viscous dissipation and
// phi a temperature test function, the residual is
//   R_phi = int [ rho c_p (a . grad T) phi + k grad T . grad phi - S phi ] w dx              (1)
//         + sum_K int_K tau (a . grad phi) r_K w dx                                       (2) SUPG
//         + int_{heat transfer roles} h (T - T_s) phi w ds                                (3)
// with the strong residual r_K = rho c_p a . grad T - k (lap T + [axisymmetric] T_r / r) - S and
// the streamline-upwind/Petrov-Galerkin parameter of Brooks & Hughes 1982 (Comput. Methods Appl.
// Mech. Eng. 32:199), tau = h/(2|a|) (coth Pe - 1/Pe), Pe = |a| h rho c_p / (2 k), with h the
// cell's diameter over the element degree (common practice for higher-order elements). Set
// temperatures and inlets are Dirichlet conditions; insulated and outflow roles are natural
// (k dT/dn = 0). The viscosity follows the temperature by time-temperature superposition,
// eta(gamma_dot, T) = s eta_case(s gamma_dot), s = a_T(T)/a_T(T_melt), so that
// d eta/dT = s (d ln a_T/dT) [eta_case(s gamma_dot) + s gamma_dot eta_case'(s gamma_dot)]     (4)
// enters the Jacobian in T through dS/dT.
#include "solver/flow/heat.h"

#include "solver/errors.h"

#include <deal.II/base/function.h>
#include <deal.II/base/quadrature_lib.h>
#include <deal.II/base/timer.h>
#include <deal.II/dofs/dof_tools.h>
#include <deal.II/fe/mapping_q1.h>
#include <deal.II/lac/dynamic_sparsity_pattern.h>
#include <deal.II/lac/full_matrix.h>
#include <deal.II/lac/petsc_solver.h>
#include <deal.II/lac/solver_control.h>
#include <deal.II/lac/sparsity_tools.h>
#include <deal.II/lac/vector.h>
#include <deal.II/numerics/vector_tools.h>

#include <cmath>
#include <map>

namespace lentus::flow
{
  using namespace dealii;

  HeatField::HeatField(const input::FlowCase &flow)
    : fe(flow.model.velocity_degree)
    , shift(flow.fluid.shift)
    , melt_temperature(flow.fluid.temperature.value())
    , melt_factor(flow.fluid.shift.kind() == rheology::TemperatureShift::Kind::none ? 1. :
                                                                                   flow.fluid.shift.factor(melt_temperature))
    , rho_cp(flow.fluid.density.value() * flow.fluid.heat_capacity.value())
    , conductivity(flow.fluid.thermal_conductivity.value())
    , viscous_heating(flow.heat.viscous_heating)
  {}

  double HeatField::relative_shift(const double temperature) const
  {
    if (shift.kind() == rheology::TemperatureShift::Kind::none)
      return 1.;
    return shift.factor(temperature) / melt_factor;
  }

  std::shared_ptr<HeatField> make_heat_field(const input::FlowCase &flow)
  {
    return flow.heat.energy_equation ? std::make_shared<HeatField>(flow) : nullptr;
  }

  LocalTemperature::LocalTemperature(const Physics &physics, const Quadrature<2> &quadrature)
  {
    if (!physics.heat || !physics.heat->coupled)
      return;
    field     = physics.heat.get();
    fe_values = std::make_unique<FEValues<2>>(field->fe, quadrature, update_values);
    temperatures.resize(quadrature.size());
    shifts.resize(quadrature.size());
  }

  void LocalTemperature::reinit(const DoFHandler<2>::cell_iterator &flow_cell)
  {
    if (!field)
      return;
    const DoFHandler<2>::active_cell_iterator cell(&field->dof_handler.get_triangulation(), flow_cell->level(),
                                                   flow_cell->index(), &field->dof_handler);
    fe_values->reinit(cell);
    fe_values->get_function_values(field->temperature, temperatures);
    for (unsigned int q = 0; q < temperatures.size(); ++q)
      shifts[q] = field->relative_shift(temperatures[q]);
  }

  rheology::Viscosity viscosity_at_point(const Physics &physics, const DoFHandler<2>::cell_iterator &flow_cell,
                                         const Point<2> &unit_point, const double gamma_dot)
  {
    LocalTemperature local(physics, Quadrature<2>(std::vector<Point<2>>{unit_point}));
    local.reinit(flow_cell);
    return local.viscosity(*physics.law, gamma_dot, 0);
  }

  namespace
  {
    using Clock = std::chrono::steady_clock;
    double seconds_since(const Clock::time_point start)
    {
      return std::chrono::duration<double>(Clock::now() - start).count();
    }

    /// The smallest and largest entries of an owned vector, over all ranks.
    std::pair<double, double> extremes(const Vector &vector, const MPI_Comm comm)
    {
      double lowest = HUGE_VAL, highest = -HUGE_VAL;
      const auto [first, last] = vector.local_range();
      for (auto i = first; i < last; ++i)
        {
          lowest  = std::min(lowest, vector(i));
          highest = std::max(highest, vector(i));
        }
      return {Utilities::MPI::min(lowest, comm), Utilities::MPI::max(highest, comm)};
    }

    /// tau of SUPG for cell size h, speed |a| and diffusivity kappa (Brooks & Hughes 1982).
    double supg_parameter(const double h, const double speed, const double diffusivity)
    {
      if (!(speed > 0.) || !(h > 0.))
        return 0.;
      const double peclet = speed * h / (2. * diffusivity);
      // coth(Pe) - 1/Pe, by its series Pe/3 - Pe^3/45 where it cancels.
      const double xi = peclet < 1e-3 ? peclet / 3. - peclet * peclet * peclet / 45. : 1. / std::tanh(peclet) - 1. / peclet;
      return h / (2. * speed) * xi;
    }
  } // namespace

  void setup_heat(FlowState &state)
  {
    if (!state.physics.heat)
      return;
    HeatField             &heat = *state.physics.heat;
    const input::FlowCase &flow = state.physics.flow;
    heat.dof_handler.reinit(state.mesh.triangulation);
    heat.dof_handler.distribute_dofs(heat.fe);
    heat.owned = heat.dof_handler.locally_owned_dofs();
    DoFTools::extract_locally_relevant_dofs(heat.dof_handler, heat.relevant);

    const auto roles = flow.geometry->boundary_roles();
    for (AffineConstraints<double> *constraints : {&heat.nonzero_constraints, &heat.zero_constraints})
      {
        const bool homogeneous = constraints == &heat.zero_constraints;
        constraints->clear();
        constraints->reinit(heat.relevant);
        DoFTools::make_hanging_node_constraints(heat.dof_handler, *constraints);
        // Set temperatures first: where a heated wall meets an inlet, the wall's temperature holds.
        for (const auto type : {input::ThermalCondition::Type::set_temperature, input::ThermalCondition::Type::inlet})
          for (const input::ThermalCondition &bc : flow.thermal_conditions)
            if (bc.type == type)
              {
                // A uniform value, or an inlet's profile across the role.
                const ScalarFunctionFromFunctionObject<2> held(
                  [&bc, homogeneous](const Point<2> &x) { return homogeneous ? 0. : bc.temperature_at(x[0], x[1]); });
                VectorTools::interpolate_boundary_values(heat.dof_handler, roles.at(bc.role), held, *constraints);
              }
        constraints->close();
      }
    heat.hanging_constraints.clear();
    heat.hanging_constraints.reinit(heat.relevant);
    DoFTools::make_hanging_node_constraints(heat.dof_handler, heat.hanging_constraints);
    heat.hanging_constraints.close();

    DynamicSparsityPattern pattern(heat.relevant);
    DoFTools::make_sparsity_pattern(heat.dof_handler, pattern, heat.zero_constraints, false);
    SparsityTools::distribute_sparsity_pattern(pattern, heat.owned, state.mesh.comm, heat.relevant);
    heat.matrix.reinit(heat.owned, heat.owned, pattern, state.mesh.comm);
    heat.residual.reinit(heat.owned, state.mesh.comm);
    Vector start(heat.owned, state.mesh.comm);
    start = heat.melt_temperature;
    heat.nonzero_constraints.distribute(start);
    heat.temperature.reinit(heat.owned, heat.relevant, state.mesh.comm);
    heat.temperature = start;
    heat.coupled     = false;
    heat.solved      = false;
    heat.isothermal.reset();
  }

  double assemble_heat(const Physics &physics, const Discretization &mesh, const Vector &flow_solution, HeatField &heat,
                       const bool with_matrix, Vector *reactions)
  {
    const FormulationKind kind       = physics.kind;
    const unsigned int    n_velocity = physics.n_velocity;
    const unsigned int    degree     = heat.fe.degree;
    const QGauss<2>       quadrature(degree + 1);
    const QGauss<1>       face_quadrature(degree + 1);
    FEValues<2>           values_T(heat.fe, quadrature,
                                   update_values | update_gradients | update_hessians | update_quadrature_points |
                                     update_JxW_values);
    FEValues<2>           values_u(mesh.fe, quadrature, update_values | update_gradients);
    FEFaceValues<2>       face_T(heat.fe, face_quadrature, update_values | update_quadrature_points | update_JxW_values);
    const unsigned int    n_dofs = heat.fe.n_dofs_per_cell();
    const unsigned int    n_q    = quadrature.size();
    FullMatrix<double>    cell_matrix(n_dofs, n_dofs);
    dealii::Vector<double> cell_residual(n_dofs);
    std::vector<types::global_dof_index> dof_indices(n_dofs);
    std::vector<double>                  T(n_q);
    std::vector<Tensor<1, 2>>            grad_T(n_q);
    std::vector<Tensor<2, 2>>            hessian_T(n_q);
    std::vector<double>                  T_face(face_quadrature.size());
    std::vector<dealii::Vector<double>>    u_values(n_q, dealii::Vector<double>(n_velocity + 1));
    std::vector<std::vector<Tensor<1, 2>>> u_gradients(n_q, std::vector<Tensor<1, 2>>(n_velocity + 1));
    std::vector<double>       streamline(n_dofs), operator_of(n_dofs);

    // Heat transfer roles: boundary id -> (h, T_s).
    std::map<types::boundary_id, std::pair<double, double>> transfer;
    for (const input::ThermalCondition &bc : physics.flow.thermal_conditions)
      if (bc.type == input::ThermalCondition::Type::heat_transfer)
        transfer[physics.flow.geometry->id_of_role(bc.role)] = {bc.coefficient, bc.temperature};

    const double rho_cp = heat.rho_cp, k = heat.conductivity, diffusivity = k / rho_cp;
    const bool   axisymmetric = is_axisymmetric(kind);
    if (with_matrix)
      heat.matrix = 0.;
    if (reactions)
      {
        reactions->reinit(heat.owned, mesh.comm);
        *reactions = 0.;
      }
    else
      heat.residual = 0.;

    for (const auto &cell : heat.dof_handler.active_cell_iterators())
      {
        if (!cell->is_locally_owned())
          continue;
        const DoFHandler<2>::active_cell_iterator flow_cell(&mesh.triangulation, cell->level(), cell->index(),
                                                            &mesh.dof_handler);
        values_T.reinit(cell);
        values_u.reinit(flow_cell);
        cell->get_dof_indices(dof_indices);
        values_T.get_function_values(heat.temperature, T);
        values_T.get_function_gradients(heat.temperature, grad_T);
        values_T.get_function_hessians(heat.temperature, hessian_T);
        values_u.get_function_values(flow_solution, u_values);
        values_u.get_function_gradients(flow_solution, u_gradients);
        cell_matrix   = 0.;
        cell_residual = 0.;
        const double h = cell->diameter() / degree;

        for (unsigned int q = 0; q < n_q; ++q)
          {
            const Point<2>  &x = values_T.quadrature_point(q);
            const double     w = volume_weight(kind, x) * values_T.JxW(q);
            const Kinematics u = kinematics(kind, x, &u_values[q][0], u_gradients[q].data());
            Tensor<1, 2>     a;
            a[0] = u.U[0];
            a[1] = u.U[2];
            const double gamma_dot = shear_rate(u.L);
            // The viscosity at this point's temperature (4).
            const double              s   = heat.relative_shift(T[q]);
            const rheology::Viscosity eta = physics.law->evaluate(s * gamma_dot);
            const double source = heat.viscous_heating ? s * eta.value * gamma_dot * gamma_dot : 0.;
            const double d_source =
              heat.viscous_heating ?
                s * heat.log_slope(T[q]) * (eta.value + s * gamma_dot * eta.derivative) * gamma_dot * gamma_dot :
                0.;
            const double laplacian = trace(hessian_T[q]) + (axisymmetric ? grad_T[q][0] / x[0] : 0.);
            const double strong    = rho_cp * (a * grad_T[q]) - k * laplacian - source;
            const double tau       = supg_parameter(h, a.norm(), diffusivity);
            for (unsigned int i = 0; i < n_dofs; ++i)
              {
                const double       phi      = values_T.shape_value(i, q);
                const Tensor<1, 2> grad_phi = values_T.shape_grad(i, q);
                streamline[i]               = a * grad_phi;
                if (with_matrix)
                  operator_of[i] = rho_cp * streamline[i] -
                                   k * (trace(values_T.shape_hessian(i, q)) + (axisymmetric ? grad_phi[0] / x[0] : 0.)) -
                                   d_source * phi;
                // (1) and (2)
                cell_residual(i) +=
                  (rho_cp * (a * grad_T[q]) * phi + k * (grad_T[q] * grad_phi) - source * phi + tau * streamline[i] * strong) *
                  w;
              }
            if (!with_matrix)
              continue;
            for (unsigned int i = 0; i < n_dofs; ++i)
              {
                const double       phi_i      = values_T.shape_value(i, q);
                const Tensor<1, 2> grad_phi_i = values_T.shape_grad(i, q);
                for (unsigned int j = 0; j < n_dofs; ++j)
                  {
                    const double phi_j = values_T.shape_value(j, q);
                    cell_matrix(i, j) += (rho_cp * streamline[j] * phi_i + k * (values_T.shape_grad(j, q) * grad_phi_i) -
                                          d_source * phi_j * phi_i + tau * streamline[i] * operator_of[j]) *
                                         w;
                  }
              }
          }

        // (3) heat transfer to the surroundings
        for (const auto face_no : cell->face_indices())
          if (cell->face(face_no)->at_boundary())
            {
              const auto found = transfer.find(cell->face(face_no)->boundary_id());
              if (found == transfer.end())
                continue;
              const auto [coefficient, surrounding] = found->second;
              face_T.reinit(cell, face_no);
              face_T.get_function_values(heat.temperature, T_face);
              for (unsigned int q = 0; q < face_quadrature.size(); ++q)
                {
                  const double w = volume_weight(kind, face_T.quadrature_point(q)) * face_T.JxW(q);
                  for (unsigned int i = 0; i < n_dofs; ++i)
                    {
                      cell_residual(i) += coefficient * (T_face[q] - surrounding) * face_T.shape_value(i, q) * w;
                      if (with_matrix)
                        for (unsigned int j = 0; j < n_dofs; ++j)
                          cell_matrix(i, j) += coefficient * face_T.shape_value(j, q) * face_T.shape_value(i, q) * w;
                    }
                }
            }

        if (reactions)
          {
            heat.hanging_constraints.distribute_local_to_global(cell_residual, dof_indices, *reactions);
            continue;
          }
        cell_residual *= -1.;
        if (with_matrix)
          heat.zero_constraints.distribute_local_to_global(cell_matrix, cell_residual, dof_indices, heat.matrix,
                                                            heat.residual);
        else
          heat.zero_constraints.distribute_local_to_global(cell_residual, dof_indices, heat.residual);
      }
    if (reactions)
      {
        reactions->compress(VectorOperation::add);
        return reactions->l2_norm();
      }
    if (with_matrix)
      heat.matrix.compress(VectorOperation::add);
    heat.residual.compress(VectorOperation::add);
    return heat.residual.l2_norm();
  }

  namespace
  {
    /// Newton on the energy equation at the state's flow, from the current temperature field, until a
    /// step changes no temperature by more than `enough` [K] (or 1e-10 of the melt temperature);
    /// returns the number of linear solves. Throws NoConvergence.
    unsigned int solve_energy_equation(FlowState &state, SolveOutcome &outcome, const double enough)
    {
      HeatField   &heat    = *state.physics.heat;
      const auto   started = Clock::now();
      Vector       current(heat.owned, state.mesh.comm), update(heat.owned, state.mesh.comm);
      current = heat.temperature;
      heat.nonzero_constraints.distribute(current);
      heat.temperature = current;
      // Linear in T when the viscosity does not follow it or nothing is dissipated: one solve.
      const bool linear = heat.shift.kind() == rheology::TemperatureShift::Kind::none || !heat.viscous_heating;
      const unsigned int max_steps = 30;
      double             previous  = HUGE_VAL;
      for (unsigned int step = 1; step <= max_steps; ++step)
        {
          assemble_heat(state.physics, state.mesh, state.solution, heat, true);
          SolverControl                    control(1, 0.);
          PETScWrappers::SparseDirectMUMPS solver(control, state.mesh.comm);
          update = 0.;
          solver.solve(heat.matrix, update, heat.residual);
          heat.zero_constraints.distribute(update);
          current += update;
          const double change = update.linfty_norm();
          heat.temperature    = current;
          if (!std::isfinite(change) || !(extremes(current, state.mesh.comm).first > 0.))
            throw NoConvergence("the energy equation's Newton iterate has temperatures at or below 0 K or not finite "
                                "(step " + std::to_string(step) + ")");
          // Converged: a change of 1e-10 of the melt temperature, or one below 1e-7 of it that no longer
          // shrinks (Newton's quadratic convergence has reached the round-off of the linear solves).
          const bool stalled = change <= 1e-7 * heat.melt_temperature && change > 0.5 * previous;
          previous           = change;
          if (linear || change <= std::max(enough, 1e-10 * heat.melt_temperature) || stalled)
            {
              outcome.history.add_seconds(report::Phase::energy_equation, seconds_since(started));
              return step;
            }
        }
      throw NoConvergence("the energy equation's Newton iteration did not converge in " + std::to_string(max_steps) +
                          " steps at the current flow");
    }

    std::string kelvin(const double value)
    {
      std::ostringstream text;
      text.precision(4);
      text << value << " K";
      return text.str();
    }
  } // namespace

  bool solve_coupled_heat(FlowState &state, SolveOutcome &outcome)
  {
    HeatField                &heat = *state.physics.heat;
    const input::HeatSection &keys = state.physics.flow.heat;
    heat.coupled                   = false;
    heat.changes.clear();
    heat.energy_newton_steps = 0;
    if (keys.isothermal_comparison)
      {
        const auto started = Clock::now();
        heat.isothermal    = current_design_numbers(state);
        outcome.history.add_seconds(report::Phase::design_numbers, seconds_since(started));
      }
    // The viscosity follows the temperature only through a shift: without one the coupling is one way.
    const bool two_way = heat.shift.kind() != rheology::TemperatureShift::Kind::none;
    state.log.line("Energy equation: " + std::to_string(heat.dof_handler.n_dofs()) + " temperature unknowns (Lagrange Q" +
                   std::to_string(heat.fe.degree) + ", SUPG), " +
                   (two_way ? "coupled both ways through the temperature shift" :
                              "one way (no temperature shift: the viscosity does not follow T)"));
    try
      {
        for (unsigned int pass = 1; pass <= keys.coupling_iterations; ++pass)
          {
            const Vector previous = heat.temperature;
            // After the first pass the flow moves the temperatures by less each pass: Newton on the energy
            // equation need not go further than a twentieth of the last pass's change (inexact inner solves;
            // the pass that meets the coupling tolerance leaves both equations converged to it).
            const double       enough = pass > 1 ? 0.05 * heat.changes.back() : 0.;
            const unsigned int steps  = solve_energy_equation(state, outcome, enough);
            heat.energy_newton_steps += steps;
            heat.solved = true;
            Vector difference(heat.owned, state.mesh.comm);
            difference = heat.temperature;
            Vector old_owned(heat.owned, state.mesh.comm);
            old_owned = previous;
            difference -= old_owned;
            const double change = difference.linfty_norm();
            heat.changes.push_back(change);
            Vector owned_T(heat.owned, state.mesh.comm);
            owned_T                  = heat.temperature;
            const auto [lowest, highest] = extremes(owned_T, state.mesh.comm);
            state.log.line("  pass " + std::to_string(pass) + ": energy equation " + std::to_string(steps) +
                           (steps == 1 ? " Newton step" : " Newton steps") + ", largest temperature change " + kelvin(change) +
                           ", temperatures " + kelvin(lowest) + " to " + kelvin(highest));
            if (!two_way || (pass > 1 && change <= keys.coupling_tolerance))
              return true;
            heat.coupled = true;
            if (!solve_from_current(state, state.physics, outcome, "flow at the temperatures of pass " + std::to_string(pass),
                                    true))
              {
                outcome.reason = "coupled flow and energy equation: the flow did not converge at the temperatures of "
                                 "pass " + std::to_string(pass) + " (" + outcome.reason + ")";
                return false;
              }
          }
      }
    catch (const rheology::InvalidParameter &error)
      {
        outcome.reason = "coupled flow and energy equation: a temperature left the shift's range (" +
                         std::string(error.problem) + ")";
        return false;
      }
    catch (const NoConvergence &error)
      {
        outcome.reason = std::string("coupled flow and energy equation: ") + error.what();
        return false;
      }
    outcome.reason = "coupled flow and energy equation did not converge in " + std::to_string(keys.coupling_iterations) +
                     " passes (last temperature change " + kelvin(heat.changes.back()) +
                     ", tolerance Heat/Coupling tolerance = " + kelvin(keys.coupling_tolerance) + ")";
    return false;
  }
} // namespace lentus::flow
