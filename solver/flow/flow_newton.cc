// Nonlinear solution: Picard steps while far from the solution, then Newton
// with the exact Jacobian, both with a backtracking line search on the
// residual norm; continuation in the regularization exponent M (or the flow
// index) when a direct attempt fails.
#include "rheology/law_registry.h"
#include "rheology/shift/temperature_shift.h"
#include "solver/errors.h"
#include "solver/flow/flow_state.h"
#include "solver/flow/heat.h"
#include "solver/flow/mesh_sequencing.h"

#include <deal.II/base/timer.h>

#include <algorithm>
#include <chrono>
#include <cmath>
#include <cstdio>
#include <vector>

namespace lentus::flow
{
  using namespace dealii;

  namespace
  {
    std::string format(const char *pattern, const double a, const double b = 0., const double c = 0.)
    {
      char buffer[200];
      std::snprintf(buffer, sizeof buffer, pattern, a, b, c);
      return buffer;
    }

    using Clock = std::chrono::steady_clock;

    double seconds_since(const Clock::time_point start)
    {
      return std::chrono::duration<double>(Clock::now() - start).count();
    }

    /// Nonlinear solver/Line search = energy (creeping flow only, checked on input): the residual is
    /// then the gradient of a convex energy (viscous dissipation potential less the work of gravity
    /// and of set pressures) constrained by continuity.
    bool uses_energy_search(const Physics &physics)
    {
      return physics.flow.nonlinear.line_search == input::LineSearch::energy;
    }

    /// One Newton/Picard solve from state.solution; true if converged. With `give_up_when_stalled`,
    /// it stops once Newton crawls (the residual fell by less than 10% over the last `stall_limit`
    /// Newton steps), so that continuation can take over early.
    /// `reference_residual` > 0 replaces the first residual as the measure of the relative tolerance
    /// (a start interpolated from a coarser mesh is already closer than the state at rest).
    bool iterate(FlowState &state, const Physics &physics, const bool direct, SolveOutcome &outcome,
                 const std::string &label, std::string &why,
                 const bool give_up_when_stalled = false, const unsigned int max_picard_steps = ~0u,
                 const double reference_residual = 0.)
    {
      const unsigned int  stall_limit = 4;
      std::vector<double> newton_residuals; // of the current run of Newton steps, the one before them first
      const input::FlowCase &flow = state.physics.flow;
      Vector                 current(state.mesh.owned, state.mesh.comm), update(state.mesh.owned, state.mesh.comm),
        trial(state.mesh.owned, state.mesh.comm);
      Vector ghosted(state.mesh.owned, state.mesh.relevant, state.mesh.comm);
      current                 = state.solution;
      state.system.dual_valid = false; // primal-dual Newton starts from the stress of the start
      const auto   started    = Clock::now();
      const double first      = assemble(physics, state.mesh, state.solution, Linearization::none, state.system);
      outcome.history.add_seconds(report::Phase::residual_assembly, seconds_since(started));
      const bool energy_search = uses_energy_search(physics);
      double       residual   = first;
      unsigned int picard     = 0;
      double       previous   = residual;
      const double reference  = reference_residual > 0. ? reference_residual : first;
      const double target     = std::max(flow.nonlinear.relative_tolerance * reference, flow.nonlinear.absolute_tolerance);
      state.log.line(format("  initial residual %.3e", first));
      outcome.history.begin_solve(label, first);
      if (!std::isfinite(first))
        {
          why = "the residual of the initial iterate is not finite";
          return false;
        }
      if (residual <= target)
        return true;
      const unsigned int picard_limit = std::min(flow.nonlinear.max_picard_steps, max_picard_steps);
      for (unsigned int iteration = 1; iteration <= flow.nonlinear.max_iterations; ++iteration)
        {
          Timer              timer;
          const auto         step_start = Clock::now();
          const Linearization linearization =
            (residual / first > flow.nonlinear.picard_until && picard < picard_limit) ?
              Linearization::picard :
                                                                                      Linearization::newton;
          if (linearization == Linearization::picard)
            ++picard;
          state.system.pressure_mass_wanted = !direct;
          assemble(physics, state.mesh, state.solution, linearization, state.system);
          // Inexact Newton (Eisenstat & Walker 1996, choice 2): solve each linear system only as
          // accurately as the nonlinear residual warrants, but well below the final target.
          const double forcing = linearization == Linearization::picard ?
                                   1e-2 :
                                   std::min(1e-1, std::max({0.9 * std::pow(residual / previous, 2.),
                                                            0.1 * target / residual, 1e-12}));
          outcome.history.add_seconds(report::Phase::jacobian_assembly, seconds_since(step_start));
          LinearSolve linear;
          try
            {
              linear = solve_linear(physics, state.mesh, state.system, update, direct, forcing);
            }
          catch (const NoConvergence &error)
            {
              why = error.what();
              return false;
            }
          outcome.history.add_seconds(report::Phase::solver_setup, linear.setup_seconds);
          outcome.history.add_seconds(report::Phase::linear_solve, linear.solve_seconds);
          const unsigned int linear_iterations = linear.iterations;

          const auto search_start = Clock::now();
          // R(x) . dx: negative when the step goes down the energy (system.residual holds -R(x)).
          const double slope_at_start = -(state.system.residual * update);
          // Evaluates x + step dx: the residual norm, and the energy's slope R(x + step dx) . dx.
          double     trial_slope = 0.;
          const auto evaluate    = [&](const double step) {
            trial = current;
            trial.add(step, update);
            state.mesh.nonzero_constraints.distribute(trial);
            ghosted                  = trial;
            const double trial_norm = assemble(physics, state.mesh, ghosted, Linearization::none, state.system);
            trial_slope              = -(state.system.residual * update);
            return trial_norm;
          };
          double step = 1., trial_residual = 0.;
          bool   accepted = false;
          if (energy_search && slope_at_start < 0.)
            {
              // The energy is convex along the step: its slope rises from slope_at_start < 0. Take the
              // whole step if the slope is still negative or nearly zero there; else find its zero by
              // regula falsi (Illinois variant) in (0, 1), a few residuals at most.
              const double close_enough = 0.1 * std::abs(slope_at_start);
              trial_residual            = evaluate(1.);
              for (int halving = 0; halving < 10 && !(std::isfinite(trial_residual) && std::isfinite(trial_slope));
                   ++halving)
                trial_residual = evaluate(step *= 0.5);
              accepted = std::isfinite(trial_residual) && std::isfinite(trial_slope);
              double low = 0., slope_low = slope_at_start, high = step, slope_high = trial_slope;
              int    kept_side = 0;
              for (int secant = 0; accepted && secant < 5 && trial_slope > close_enough; ++secant)
                {
                  step = high - slope_high * (high - low) / (slope_high - slope_low);
                  step = std::clamp(step, low + 0.02 * (high - low), high - 0.02 * (high - low));
                  trial_residual = evaluate(step);
                  if (!std::isfinite(trial_residual) || !std::isfinite(trial_slope))
                    {
                      accepted = false;
                      break;
                    }
                  if (std::abs(trial_slope) <= close_enough)
                    break;
                  if (trial_slope > 0.)
                    {
                      high = step, slope_high = trial_slope;
                      if (kept_side == -1)
                        slope_low *= 0.5;
                      kept_side = -1;
                    }
                  else
                    {
                      low = step, slope_low = trial_slope;
                      if (kept_side == 1)
                        slope_high *= 0.5;
                      kept_side = 1;
                    }
                }
            }
          else
            {
              // Backtracking: accept the first step length that lowers the residual norm enough.
              for (int halving = 0; halving <= 10; ++halving, step *= 0.5)
                {
                  trial_residual = evaluate(step);
                  if (std::isfinite(trial_residual) && trial_residual < (1. - 1e-4 * step) * residual)
                    {
                      accepted = true;
                      break;
                    }
                }
              if (!accepted && linearization == Linearization::picard)
                {
                  // A Picard step need not lower the residual: take it whole, as fixed-point iteration does.
                  step           = 1.;
                  trial_residual = evaluate(1.);
                  accepted       = std::isfinite(trial_residual);
                }
            }
          outcome.history.add_seconds(report::Phase::line_search, seconds_since(search_start));
          if (!accepted)
            {
              why = "the line search found no step that lowers the residual (iteration " + std::to_string(iteration) +
                    ", residual " + format("%.3e", residual) + ")";
              return false;
            }
          current        = trial;
          state.solution = ghosted;
          previous       = residual;
          residual       = trial_residual;
          const report::StepKind kind =
            linearization == Linearization::picard ? report::StepKind::picard : report::StepKind::newton;
          outcome.history.add({kind, residual, step, linear_iterations, timer.wall_time()});
          state.log.line(format("  %3.0f ", iteration) + report::to_string(kind) +
                         format("  residual %.3e  step %.3g", residual, step) +
                         format("  linear iterations %.0f  %.2f s", linear_iterations, timer.wall_time()));
          if (residual <= target)
            return true;
          if (linearization == Linearization::newton)
            {
              if (newton_residuals.empty())
                newton_residuals.push_back(previous);
              newton_residuals.push_back(residual);
            }
          else
            newton_residuals.clear();
          const std::size_t n = newton_residuals.size();
          if (give_up_when_stalled && n > stall_limit && residual > 0.9 * newton_residuals[n - 1 - stall_limit])
            {
              why = "Newton stalled: the residual fell by less than 10% in " + std::to_string(stall_limit) +
                    " steps (residual " + format("%.3e", residual) + ")";
              return false;
            }
        }
      why = "no convergence in " + std::to_string(flow.nonlinear.max_iterations) + " iterations (residual " +
            format("%.3e", residual) + ", target " + format("%.3e", target) + ")";
      return false;
    }

    /// The linear solver of Linear solver/Type on the current mesh ("automatic": by size).
    bool use_direct(const FlowState &state)
    {
      const input::FlowCase &flow = state.physics.flow;
      return flow.linear.type == input::LinearSolverType::direct ||
             (flow.linear.type == input::LinearSolverType::automatic &&
              state.mesh.dof_handler.n_dofs() <= flow.linear.direct_limit);
    }

    std::string linear_solver_name(const bool direct)
    {
      return direct ? "direct (MUMPS)" : "FGMRES, block-triangular preconditioner";
    }

  } // namespace

  std::shared_ptr<const rheology::ViscosityLaw> law_with(const input::Fluid &fluid, const std::string &key,
                                                         const double value)
  {
    rheology::ParameterValues parameters = fluid.parameters;
    parameters[key]                      = value;
    std::shared_ptr<const rheology::ViscosityLaw> law = rheology::registry().create(fluid.law_name, parameters);
    if (fluid.shift_factor != 1.)
      law = rheology::shifted(law, fluid.shift_factor);
    return law;
  }

  void record_mesh(FlowState &state, SolveOutcome &outcome, const std::string &refinement)
  {
    outcome.history.begin_mesh(state.mesh.triangulation.n_global_active_cells(), state.mesh.dof_handler.n_dofs(),
                               linear_solver_name(use_direct(state)), refinement);
  }

  bool solve_from_current(FlowState &state, const Physics &physics, SolveOutcome &outcome, const std::string &label,
                          const bool newton_first)
  {
    const bool direct = use_direct(state);
    state.log.line("Nonlinear solve (" + label + "), linear solver " + linear_solver_name(direct));
    // The tolerance stays relative to the residual of the state at rest, as on a cold start.
    const Vector start = state.solution;
    initial_solution(state);
    const auto   started = Clock::now();
    const double at_rest = assemble(physics, state.mesh, state.solution, Linearization::none, state.system);
    outcome.history.add_seconds(report::Phase::residual_assembly, seconds_since(started));
    state.solution       = start;
    std::string why;
    if (newton_first)
      {
        // Next to the solution already: Newton at once; if it stalls, again with the Picard start.
        if (iterate(state, physics, direct, outcome, label, why, true, 0u, at_rest))
          return true;
        state.log.line("  Newton from the current solution failed (" + why + "); again with Picard steps first");
        state.solution = start;
      }
    // From a start next to the solution a few Picard steps are enough before primal Newton takes over
    // (Bingham cavity, M = 1000, final mesh of 37507 unknowns from the coarser mesh's solution:
    // Bn 2: 3 Picard + 9 Newton steps against 7 + 7; Bn 20: 3 + 16 against 10 + 13; the whole
    // sequenced solve 14% and 15% faster), and primal-dual Newton needs none in creeping flow (the
    // same: Bn 2, 10 Newton steps on the final mesh and 4.6 s in all against 6.8 s; Bn 20, 12 steps
    // and 5.5 s against 8.5 s; primal Newton without Picard steps took 40 steps at Bn 2). If it
    // fails, it is tried again with the Picard steps.
    const bool primal_dual = physics.flow.nonlinear.linearization == input::NewtonLinearization::primal_dual &&
                             !physics.flow.model.inertia;
    const unsigned int picard_steps = 3;
    if (!newton_first && primal_dual)
      {
        if (iterate(state, physics, direct, outcome, label, why, false, 0u, at_rest))
          return true;
        state.log.line("  Newton from the current solution failed (" + why + "); again with Picard steps first");
        state.solution = start;
      }
    if (iterate(state, physics, direct, outcome,
                label + (newton_first || primal_dual ? " (retry with Picard steps)" : ""), why, false, picard_steps,
                at_rest))
      return true;
    outcome.reason = why;
    return false;
  }

  void solve_nonlinear(FlowState &state, SolveOutcome &outcome)
  {
    const input::FlowCase &flow = state.physics.flow;
    outcome.converged           = false;
    outcome.reason.clear();
    const auto             n_dofs = state.mesh.dof_handler.n_dofs();
    const bool             direct = use_direct(state);
    state.log.line("Nonlinear solve: " + std::to_string(n_dofs) + " unknowns, linear solver " +
                   linear_solver_name(direct));

    initial_solution(state);
    std::string why;
    // The direct attempt may crawl for a while and still converge sooner than continuation would
    // (Bingham cavity, Bn = 20, level 5: 34 Newton steps, against 46 when it gives up early), so it
    // is not cut short.
    if (iterate(state, state.physics, direct, outcome, "direct solve", why))
      {
        outcome.converged = true;
        return;
      }
    state.log.line("  direct attempt failed: " + why);

    // Continuation from an easier problem, each step starting from the previous solution: in the
    // Reynolds number (density) with inertia, else in what the law's registration says makes it hard
    // (the regularization exponent of a yield-stress fluid, a flow index, ...).
    const input::Fluid &fluid = flow.fluid;
    std::string         key;
    std::vector<double> path;
    bool                in_density   = false;
    const double        full_density = state.physics.density;
    if (full_density > 0. && flow.model.inertia)
      {
        key        = "Density (Reynolds number)";
        in_density = true;
        for (const double fraction : {1e-3, 1e-2, 0.1, 0.3, 1.})
          path.push_back(full_density * fraction);
      }
    else if (const auto softened = rheology::registry().find(fluid.law_name).continuation_path(fluid.parameters))
      {
        key  = softened->key;
        path = softened->values;
      }
    if (!flow.nonlinear.continuation || key.empty())
      {
        outcome.reason = why;
        return;
      }
    state.log.line("Continuation in " + key + ":");
    initial_solution(state);
    for (const double value : path)
      {
        // The softened problem of this step; the case's own physics stays as it is.
        Physics softened = state.physics;
        if (in_density)
          softened.density = value;
        else
          softened.law = law_with(fluid, key, value);
        const std::string label = key + " = " + rheology::format_short(value);
        outcome.history.add_continuation_step(label);
        state.log.line(" " + label);
        // Each step starts next to the previous solution: Newton at once (two Picard steps at most
        // for the first, which starts from rest); a stalled Newton gets a second try with Picard.
        // The retry starts again from the previous step's solution, with the usual Picard start.
        const unsigned int picard_steps = value == path.front() ? 2u : 0u;
        const Vector       start        = state.solution;
        bool               done         = iterate(state, softened, direct, outcome, label, why, true, picard_steps);
        if (!done)
          {
            state.log.line("  Newton from the previous step failed (" + why + "); again with Picard steps first");
            state.solution = start;
            done           = iterate(state, softened, direct, outcome, label + " (retry with Picard steps)", why);
          }
        if (!done)
          {
            outcome.reason = "continuation in " + key + " failed at " + rheology::format_short(value) + ": " + why;
            return;
          }
      }
    outcome.converged = true;
  }

  namespace
  {
    void log_mesh(FlowState &state, const std::string &stage)
    {
      const input::FlowCase &flow = state.physics.flow;
      state.log.line(stage + (stage.empty() ? "Mesh: " : "mesh: ") +
                     std::to_string(state.mesh.triangulation.n_global_active_cells()) + " cells, " +
                     std::to_string(state.mesh.dof_handler.n_dofs()) + " unknowns (Taylor-Hood Q" +
                     std::to_string(flow.model.velocity_degree) + "-Q" + std::to_string(flow.model.velocity_degree - 1) + ")");
    }

    /// From the solution interpolated from the coarser mesh; true if converged. The Picard steps
    /// come first here too: Newton started at once from the interpolated solution crawls (Bingham
    /// cavity, Bn = 20, M = 1000: its steps are cut to 1/8 - 1/64 by the line search and it
    /// stalls), as the yield surfaces move when the mesh is refined.
    bool solve_from_interpolated(FlowState &state, SolveOutcome &outcome)
    {
      return solve_from_current(state, state.physics, outcome, "from the coarser mesh");
    }

    /// A sweep's warm start on mesh `mesh_index` of the sequence (0: the first): from a neighbouring
    /// case's solution saved on the same mesh; false when there is none, or when it does not converge
    /// from there (state.solution is then the start it had, and the caller solves as usual).
    bool solve_from_warm_start(FlowState &state, SolveOutcome &outcome, const unsigned int mesh_index)
    {
      const std::string &from = state.physics.flow.warm_start_from;
      if (from.empty())
        return false;
      const Vector own_start = state.solution;
      std::string  why;
      if (!load_warm_start(state, from + ".mesh" + std::to_string(mesh_index), why))
        {
          state.log.line("Warm start: " + why + "; as without one");
          return false;
        }
      state.log.line("Warm start from " + from);
      try
        {
          outcome.converged = solve_from_current(state, state.physics, outcome, "from a neighbouring case");
        }
      catch (const NoConvergence &error)
        {
          outcome.converged = false;
          outcome.reason    = error.what();
        }
      if (!outcome.converged)
        {
          state.log.line("  the warm start did not converge (" + outcome.reason + "); as without one");
          state.solution = own_start;
        }
      return outcome.converged;
    }

    /// Keeps a converged mesh's solution for the sweep's later cases (warm start = nearest).
    void save_for_warm_starts(const FlowState &state, const SolveOutcome &outcome, const unsigned int mesh_index)
    {
      const std::string &save = state.physics.flow.warm_start_save;
      if (outcome.converged && !save.empty())
        save_warm_start(state, save + ".mesh" + std::to_string(mesh_index));
    }

    /// The design numbers of a converged mesh, for the mesh error of every number.
    void record_numbers(FlowState &state, SolveOutcome &outcome)
    {
      if (!outcome.converged)
        return;
      const auto started = Clock::now();
      outcome.mesh_numbers.push_back({state.mesh.triangulation.n_global_active_cells(),
                                      state.mesh.dof_handler.n_dofs(), current_design_numbers(state)});
      outcome.history.add_seconds(report::Phase::design_numbers, seconds_since(started));
    }
  } // namespace

  // From 30000 unknowns up, measured: Bingham cavity, Bn 20, 37507 unknowns: 31 s against 69 s
  // from rest; bladed gel vessel demo, 42592 unknowns: 41 s against 114 s. The first mesh down to
  // about 15000 unknowns: on the Bingham cavity, Bn 20, with 592387 unknowns, a first mesh of 37507
  // unknowns took 40 Newton steps from rest on 1 rank but 115 with continuation on 2; one of 9539
  // took 38 and 41, and the whole solve 386 s against 423 s on 1 rank, 232 s against 269 s on 2.
  unsigned int automatic_coarser_levels(const double unknowns, const unsigned int refinement)
  {
    const double automatic_from = 3e4, first_mesh = 1.5e4;
    if (unknowns <= automatic_from)
      return 0;
    unsigned int levels = std::min(2u, refinement);
    while (levels < std::min(4u, refinement) && unknowns / std::pow(4., levels) > first_mesh)
      ++levels;
    return levels;
  }

  SolveOutcome solve_with_mesh_sequencing(FlowState &state)
  {
    const input::FlowCase &flow = state.physics.flow;
    const unsigned int     refinement = flow.geometry_keys.refinement;
    const auto   started   = Clock::now();
    const bool   automatic = !flow.nonlinear.mesh_sequencing;
    unsigned int levels    = automatic ? std::min(2u, refinement) : *flow.nonlinear.mesh_sequencing;
    create_mesh(state, refinement - levels);
    // Sequencing's own choice, then at least the coarser meshes the mesh error needs.
    unsigned int chosen = levels;
    if (automatic && levels > 0)
      {
        state.mesh.dof_handler.distribute_dofs(state.mesh.fe); // to count the unknowns
        chosen = automatic_coarser_levels(static_cast<double>(state.mesh.dof_handler.n_dofs()) * std::pow(4., levels),
                                          refinement);
      }
    chosen = std::max(chosen, std::min(flow.accuracy.coarser_meshes, refinement));
    if (chosen < levels)
      state.mesh.triangulation.refine_global(levels - chosen);
    else if (chosen > levels)
      create_mesh(state, refinement - chosen);
    levels = chosen;
    setup_dofs(state);
    SolveOutcome outcome;
    record_mesh(state, outcome, levels > 0 ? "coarser mesh" : "case mesh");
    outcome.history.add_mesh_seconds(seconds_since(started));
    log_mesh(state, levels > 0 ? "Mesh sequencing over " + std::to_string(levels + 1) + " meshes; first " : "");
    const auto attempt = [&](const auto &solve) {
      try
        {
          solve();
        }
      catch (const NoConvergence &error)
        {
          outcome.converged = false;
          outcome.reason    = error.what();
        }
    };
    // With the energy equation, each mesh's flow at the melt temperature is followed by the coupled solve.
    const auto with_heat = [&] {
      if (outcome.converged && state.physics.heat)
        outcome.converged = solve_coupled_heat(state, outcome);
    };
    attempt([&] {
      if (!solve_from_warm_start(state, outcome, 0))
        solve_nonlinear(state, outcome);
      save_for_warm_starts(state, outcome, 0);
      with_heat();
    });
    record_numbers(state, outcome);
    for (unsigned int remaining = levels; remaining > 0; --remaining)
      {
        const bool  follow = outcome.converged;
        Timer       timer;
        refine_and_transfer(state);
        record_mesh(state, outcome, remaining > 1 ? "coarser mesh" : "case mesh");
        outcome.history.add_mesh_seconds(timer.wall_time());
        log_mesh(state, remaining > 1 ? "Finer " : "Final ");
        const unsigned int mesh_index = levels - remaining + 1;
        if (follow)
          attempt([&] {
            if (!solve_from_warm_start(state, outcome, mesh_index))
              outcome.converged = solve_from_interpolated(state, outcome);
            save_for_warm_starts(state, outcome, mesh_index);
            with_heat();
          });
        if (!outcome.converged && remaining == 1)
          {
            // Sequencing failed: solve the final mesh from rest, as without mesh sequencing.
            state.log.line("  mesh sequencing did not converge (" + outcome.reason + "); solving from rest");
            attempt([&] {
              solve_nonlinear(state, outcome);
              with_heat();
            });
          }
        record_numbers(state, outcome);
      }
    return outcome;
  }
} // namespace lentus::flow
