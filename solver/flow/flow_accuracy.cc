// What gives a run's design numbers their error bars, after the solve on the case's mesh:
// adaptive cycles (refine where the yield surface lies and where the velocity gradient jumps,
// solve again from the previous solution) until a target error is met or a budget is spent, then
// the regularization check (the same mesh at a larger Papanastasiou exponent).
#include "rheology/law_registry.h"
#include "solver/errors.h"
#include "solver/flow/flow_state.h"
#include "solver/flow/heat.h"

#include <deal.II/base/quadrature_lib.h>
#include <deal.II/base/timer.h>
#include <deal.II/distributed/grid_refinement.h>
#include <deal.II/fe/fe_values.h>
#include <deal.II/numerics/error_estimator.h>

#include <algorithm>
#include <cmath>
#include <cstdio>

namespace lentus::flow
{
  using namespace dealii;

  namespace
  {
    std::string format(const char *pattern, const double value)
    {
      char buffer[100];
      std::snprintf(buffer, sizeof buffer, pattern, value);
      return buffer;
    }

    std::string refine_at_names(const std::vector<input::RefineAt> &refine_at)
    {
      std::string names;
      for (const input::RefineAt where : refine_at)
        names += std::string(names.empty() ? "" : ", ") +
                 (where == input::RefineAt::yield_surface  ? "yield surface" :
                  where == input::RefineAt::velocity_jumps ? "velocity jumps" :
                                                             "everywhere");
      return names;
    }

    /// Yield surface: 1 + closeness on cells where the yield margin |tau| / tau_y - 1 changes sign
    /// over a 4 x 4 grid of sample points or comes within `band` of 0 (1 + 1 for a crossing).
    void add_yield_surface_indicator(const FlowState &state, const double band, dealii::Vector<float> &indicator)
    {
      const double tau_y = state.physics.law->yield_stress();
      if (!(tau_y > 0.))
        return;
      const QIterated<2>     samples(QTrapezoid<1>(), 3);
      FEValues<2>            fe_values(state.mesh.fe, samples, update_values | update_gradients | update_quadrature_points);
      const unsigned int     n_components = state.physics.n_velocity + 1;
      std::vector<dealii::Vector<double>>             values(samples.size(), dealii::Vector<double>(n_components));
      std::vector<std::vector<Tensor<1, 2>>>          gradients(samples.size(), std::vector<Tensor<1, 2>>(n_components));
      LocalTemperature local(state.physics, samples);
      for (const auto &cell : state.mesh.dof_handler.active_cell_iterators())
        if (cell->is_locally_owned())
          {
            fe_values.reinit(cell);
            fe_values.get_function_values(state.solution, values);
            fe_values.get_function_gradients(state.solution, gradients);
            local.reinit(cell);
            double lowest = HUGE_VAL, highest = -HUGE_VAL, nearest = HUGE_VAL;
            for (unsigned int q = 0; q < samples.size(); ++q)
              {
                double       u[3];
                Tensor<1, 2> grad_u[3];
                for (unsigned int c = 0; c < state.physics.n_velocity; ++c)
                  {
                    u[c]      = values[q][c];
                    grad_u[c] = gradients[q][c];
                  }
                const Point<2> &x = fe_values.quadrature_point(q);
                // On the axis r = 0 the hoop terms are limits; evaluate just off it.
                const Point<2>   at(is_axisymmetric(state.physics.kind) ? std::max(x[0], 1e-12) : x[0], x[1]);
                const Kinematics k         = kinematics(state.physics.kind, at, u, grad_u);
                const double     gamma_dot = shear_rate(k.L);
                const double     margin    = local.viscosity(*state.physics.law, gamma_dot, q).value * gamma_dot / tau_y - 1.;
                lowest                     = std::min(lowest, margin);
                highest                    = std::max(highest, margin);
                nearest                    = std::min(nearest, std::abs(margin));
              }
            float &value = indicator(cell->active_cell_index());
            if (lowest < 0. && highest > 0.)
              value += 2.f;
            else if (band > 0. && nearest < band)
              value += static_cast<float>(1. + (1. - nearest / band));
          }
    }

    /// Velocity jumps: Kelly et al.'s (1983) estimator of the velocity, scaled to at most 1.
    void add_velocity_jump_indicator(const FlowState &state, dealii::Vector<float> &indicator)
    {
      dealii::Vector<float> jumps(state.mesh.triangulation.n_active_cells());
      ComponentMask         velocity(state.physics.n_velocity + 1, true);
      velocity.set(state.physics.n_velocity, false);
      KellyErrorEstimator<2>::estimate(state.mesh.dof_handler, QGauss<1>(state.mesh.fe.degree + 1), {}, state.solution,
                                       jumps, velocity, nullptr, numbers::invalid_unsigned_int,
                                       state.mesh.triangulation.locally_owned_subdomain());
      float largest = 0.f;
      for (const auto &cell : state.mesh.triangulation.active_cell_iterators())
        if (cell->is_locally_owned())
          largest = std::max(largest, jumps(cell->active_cell_index()));
      largest = Utilities::MPI::max(largest, state.mesh.comm);
      if (largest > 0.f)
        for (const auto &cell : state.mesh.triangulation.active_cell_iterators())
          if (cell->is_locally_owned())
            indicator(cell->active_cell_index()) += jumps(cell->active_cell_index()) / largest;
    }

    /// Sets the refine and coarsen flags of one adaptive cycle. Each indicator chosen picks its own
    /// share of Refined fraction (the largest of its values), so that a wide yield band cannot starve
    /// a singular corner of refinement, nor the other way round; coarsening takes the cells where
    /// their sum is smallest.
    void flag_cells(FlowState &state)
    {
      const input::AccuracySection &accuracy      = state.physics.flow.accuracy;
      const auto                   &refine_at     = accuracy.refine_at;
      auto                         &triangulation = state.mesh.triangulation;
      const auto chosen = [&](const input::RefineAt where) {
        return std::find(refine_at.begin(), refine_at.end(), where) != refine_at.end();
      };
      if (chosen(input::RefineAt::everywhere))
        {
          for (const auto &cell : triangulation.active_cell_iterators())
            if (cell->is_locally_owned())
              cell->set_refine_flag();
          return;
        }
      std::vector<dealii::Vector<float>> indicators;
      if (chosen(input::RefineAt::yield_surface) && state.physics.law->yield_stress() > 0.)
        {
          indicators.emplace_back(triangulation.n_active_cells());
          add_yield_surface_indicator(state, accuracy.yield_band, indicators.back());
        }
      if (chosen(input::RefineAt::velocity_jumps))
        {
          indicators.emplace_back(triangulation.n_active_cells());
          add_velocity_jump_indicator(state, indicators.back());
        }
      if (indicators.empty())
        return;
      const double     share = accuracy.refined_fraction / static_cast<double>(indicators.size());
      std::vector<bool> refine(triangulation.n_active_cells(), false);
      dealii::Vector<float> sum(triangulation.n_active_cells());
      for (const dealii::Vector<float> &indicator : indicators)
        {
          sum += indicator;
          parallel::distributed::GridRefinement::refine_and_coarsen_fixed_number(triangulation, indicator, share, 0.);
          // Nothing where this indicator does not ask for it (a yield band narrower than its share).
          for (const auto &cell : triangulation.active_cell_iterators())
            if (cell->is_locally_owned())
              {
                if (cell->refine_flag_set() && indicator(cell->active_cell_index()) > 0.f)
                  refine[cell->active_cell_index()] = true;
                cell->clear_refine_flag();
                cell->clear_coarsen_flag();
              }
        }
      if (accuracy.coarsened_fraction > 0.)
        parallel::distributed::GridRefinement::refine_and_coarsen_fixed_number(triangulation, sum, 0.,
                                                                               accuracy.coarsened_fraction);
      // No cell coarser than the case's mesh.
      const unsigned int case_level = state.physics.flow.geometry_keys.refinement;
      for (const auto &cell : triangulation.active_cell_iterators())
        if (cell->is_locally_owned())
          {
            cell->clear_refine_flag();
            if (refine[cell->active_cell_index()])
              {
                cell->clear_coarsen_flag();
                cell->set_refine_flag();
              }
            else if (cell->coarsen_flag_set() && static_cast<unsigned int>(cell->level()) <= case_level)
              cell->clear_coarsen_flag();
          }
    }

    /// The targeted numbers of the case: its names or symbols, else the key numbers.
    std::vector<const report::DesignNumber *> targeted(const FlowState &state, const report::DesignNumbers &numbers)
    {
      const input::FlowCase                    &flow = state.physics.flow;
      std::vector<const report::DesignNumber *> chosen;
      if (flow.accuracy.targeted_numbers.empty())
        {
          for (const report::DesignNumber &number : numbers.all())
            if (number.key)
              chosen.push_back(&number);
          return chosen;
        }
      for (const std::string &name : flow.accuracy.targeted_numbers)
        {
          const report::DesignNumber *found = nullptr;
          for (const report::DesignNumber &number : numbers.all())
            if (number.name == name || number.symbol == name)
              found = &number;
          if (!found)
            {
              std::string known, given;
              for (const report::DesignNumber &number : numbers.all())
                known += (known.empty() ? "" : ", ") + number.name + " (" + number.symbol + ")";
              for (const std::string &each : flow.accuracy.targeted_numbers)
                given += (given.empty() ? "" : ", ") + each;
              const std::string key = "Accuracy/Targeted numbers";
              throw InputError(flow.targeted_numbers_place.first, flow.targeted_numbers_place.second, key,
                               key + " = " + given + ": this case has no design number '" + name +
                                 "'; allowed: names or symbols of its design numbers: " + known);
            }
          chosen.push_back(found);
        }
      return chosen;
    }

    /// Whether the mesh error of every targeted number is below the target, on the meshes so far.
    bool mesh_target_met(const FlowState &state, const SolveOutcome &outcome, std::string &worst)
    {
      report::DesignNumbers numbers = outcome.mesh_numbers.back().numbers;
      report::estimate_accuracy(numbers, outcome.mesh_numbers, nullptr, 0.);
      return accuracy_target_met(state, numbers, worst);
    }

    void adaptive_cycles(FlowState &state, SolveOutcome &outcome, const double seconds_so_far)
    {
      const input::AccuracySection &accuracy   = state.physics.flow.accuracy;
      const bool                    has_target = accuracy.target_relative_error.has_value();
      Timer                         clock;
      std::string                   worst;
      unsigned int                  cycle = 1;
      for (; cycle <= accuracy.adaptive_cycles && outcome.converged; ++cycle)
        {
          if (has_target && !outcome.mesh_numbers.empty() && mesh_target_met(state, outcome, worst))
            break;
          // Every rank takes the same decision: the slowest rank's clock.
          const double elapsed = Utilities::MPI::max(seconds_so_far + clock.wall_time(), state.mesh.comm);
          if (accuracy.maximum_wall_time && elapsed > *accuracy.maximum_wall_time)
            {
              outcome.target_status = "budget spent after " + std::to_string(cycle - 1) +
                                      " adaptive cycles: Maximum wall time (" + format("%g", *accuracy.maximum_wall_time) +
                                      " s) reached";
              return;
            }
          Timer timer;
          flag_cells(state);
          unsigned int flagged = 0;
          for (const auto &cell : state.mesh.triangulation.active_cell_iterators())
            if (cell->is_locally_owned() && cell->refine_flag_set())
              ++flagged;
          if (Utilities::MPI::sum(flagged, state.mesh.comm) == 0)
            {
              state.log.line("Adaptive cycle " + std::to_string(cycle) + ": no cell to refine; cycles stop");
              break;
            }
          if (accuracy.maximum_unknowns)
            {
              // The cells of the next mesh are known from the flags (with the closure the mesh needs);
              // its unknowns, from today's unknowns per cell with 10% to spare.
              state.mesh.triangulation.prepare_coarsening_and_refinement();
              double refined = 0., coarsened = 0.;
              for (const auto &cell : state.mesh.triangulation.active_cell_iterators())
                if (cell->is_locally_owned())
                  {
                    refined += cell->refine_flag_set() ? 1. : 0.;
                    coarsened += cell->coarsen_flag_set() ? 1. : 0.;
                  }
              const double cells    = static_cast<double>(state.mesh.triangulation.n_global_active_cells());
              const double next     = cells + 3. * Utilities::MPI::sum(refined, state.mesh.comm) -
                                  0.75 * Utilities::MPI::sum(coarsened, state.mesh.comm);
              const double expected = 1.1 * static_cast<double>(state.mesh.dof_handler.n_dofs()) * next / cells;
              if (expected > *accuracy.maximum_unknowns)
                {
                  for (const auto &cell : state.mesh.triangulation.active_cell_iterators())
                    {
                      cell->clear_refine_flag();
                      cell->clear_coarsen_flag();
                    }
                  outcome.target_status = "budget spent after " + std::to_string(cycle - 1) +
                                          " adaptive cycles: the next mesh would exceed Maximum unknowns (" +
                                          format("%.0f", *accuracy.maximum_unknowns) + ")";
                  return;
                }
            }
          transfer_to_flagged_mesh(state);
          const std::string where = refine_at_names(accuracy.refine_at);
          record_mesh(state, outcome, "adaptive cycle " + std::to_string(cycle) + ": " + where);
          outcome.history.add_mesh_seconds(timer.wall_time());
          state.log.line("Adaptive cycle " + std::to_string(cycle) + " (" + where + "): " +
                         std::to_string(state.mesh.triangulation.n_global_active_cells()) + " cells, " +
                         std::to_string(state.mesh.dof_handler.n_dofs()) + " unknowns" +
                         format(" (indicator and refinement %.2f s)", timer.wall_time()));
          outcome.converged = solve_from_current(state, state.physics, outcome, "adaptive cycle " + std::to_string(cycle));
          if (outcome.converged && state.physics.heat)
            outcome.converged = solve_coupled_heat(state, outcome);
          if (outcome.converged)
            {
              Timer numbers_timer;
              outcome.mesh_numbers.push_back({state.mesh.triangulation.n_global_active_cells(),
                                              state.mesh.dof_handler.n_dofs(), current_design_numbers(state)});
              outcome.history.add_seconds(report::Phase::design_numbers, numbers_timer.wall_time());
            }
        }
      outcome.target_status = "after " + std::to_string(cycle - 1) + " of at most " +
                              std::to_string(accuracy.adaptive_cycles) + " adaptive cycles";
    }

    void regularization_check(FlowState &state, SolveOutcome &outcome)
    {
      const input::FlowCase &flow = state.physics.flow;
      const std::string      key  = rheology::registry().find(flow.fluid.law_name).regularization;
      if (key.empty() || !(state.physics.law->yield_stress() > 0.))
        {
          outcome.regularization_note = "not needed: the fluid has no regularized yield stress";
          return;
        }
      if (!flow.accuracy.regularization_check)
        {
          outcome.regularization_note = "switched off (Accuracy/Regularization check = false)";
          return;
        }
      if (!outcome.converged)
        {
          outcome.regularization_note = "not made: the run did not converge";
          return;
        }
      const double factor = flow.accuracy.regularization_factor;
      const double larger = factor * flow.fluid.parameters.at(key);
      Physics      stiffer = state.physics;
      stiffer.law          = law_with(flow.fluid, key, larger);
      const Vector solved  = state.solution;
      const std::string label = "regularization check: " + key + " = " + rheology::format_short(larger);
      state.log.line("Regularization check: the final mesh again at " + key + " = " + rheology::format_short(larger) +
                     " (" + format("%g", factor) + " x the case's)");
      const std::string reason = outcome.reason;
      if (solve_from_current(state, stiffer, outcome, label, true))
        {
          Timer numbers_timer;
          outcome.at_larger_m           = current_design_numbers(state, stiffer);
          outcome.history.add_seconds(report::Phase::design_numbers, numbers_timer.wall_time());
          outcome.regularization_factor = factor;
        }
      else
        outcome.regularization_note = "did not converge (" + outcome.reason + "); no regularization error";
      outcome.reason = reason;
      state.solution = solved;
    }
  } // namespace

  bool accuracy_target_met(const FlowState &state, const report::DesignNumbers &numbers, std::string &worst)
  {
    const double target  = *state.physics.flow.accuracy.target_relative_error;
    double       largest = -1.;
    bool         met     = true;
    for (const report::DesignNumber *number : targeted(state, numbers))
      {
        const auto   error    = report::total_error(number->accuracy);
        const double size     = std::abs(number->value);
        const double relative = !error ? HUGE_VAL : *error == 0. ? 0. : *error / size;
        met                   = met && relative <= target;
        if (relative > largest)
          {
            largest = relative;
            worst   = number->name;
            if (!error)
              worst += ", no error bar";
            else
              {
                worst += ", error bar " + format("%.3g", relative * 100.) + "%";
                const auto &accuracy = number->accuracy;
                if (accuracy.regularization_error && size > 0.)
                  worst += " (mesh " + format("%.3g", accuracy.mesh_error.value_or(0.) / size * 100.) +
                           "%, regularization " + format("%.3g", *accuracy.regularization_error / size * 100.) + "%)";
              }
          }
      }
    return met;
  }

  void improve_accuracy(FlowState &state, SolveOutcome &outcome, const double seconds_so_far)
  {
    adaptive_cycles(state, outcome, seconds_so_far);
    regularization_check(state, outcome);
  }
} // namespace lentus::flow
