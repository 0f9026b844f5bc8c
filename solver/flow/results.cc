#include "solver/flow/results.h"

#include "solver/flow/heat.h"
#include "solver/flow/integrals.h"
#include "solver/flow/vessel_integrals.h"
#include "solver/report/numbers.h"

#include <deal.II/base/mpi.h>

#include <fstream>

namespace lentus::flow
{
  namespace
  {
    /// Peak resident memory (VmHWM) of this process [MiB]; 0 where /proc is not there.
    double peak_memory()
    {
      std::ifstream status("/proc/self/status");
      std::string   line;
      while (std::getline(status, line))
        if (line.rfind("VmHWM:", 0) == 0)
          return std::stod(line.substr(6)) / 1024.;
      return 0.;
    }

    /// The few numbers a user of a case that is neither a die nor a vessel came for.
    void mark_default_key_numbers(report::DesignNumbers &numbers)
    {
      for (const report::DesignNumber &number : numbers.all())
        if (number.key)
          return;
      for (const char *name : {"pressure drop inlet to outlet", "maximum speed", "unyielded volume fraction",
                               "unyielded area fraction"})
        numbers.mark_key(name);
    }

    std::vector<std::string> case_cautions(const FlowState &state, const report::DesignNumbers &numbers)
    {
      const input::FlowCase   &flow = state.physics.flow;
      std::vector<std::string> cautions;
      if (has_impeller(state) && !is_axisymmetric(state.physics.kind))
        cautions.emplace_back("A planar section of a vessel ignores the axial flow and the ends of the impeller: "
                              "torque and power are per metre of depth of an idealized, infinitely long impeller.");
      const bool die = !flow.geometry->straight_sections().empty() && numbers.find("pressure drop inlet to outlet");
      if (flow.heat.energy_equation)
        cautions.emplace_back(
          "Temperatures from the energy equation with constant density, heat capacity and conductivity, the "
          "viscosity following the temperature through the case's temperature shift; the die body, heaters and "
          "surroundings enter only through the thermal conditions of the case's roles." +
          std::string(die ? " The die pressure drop covers only the modelled barrel and die with its heating; "
                            "screens, adapters and the melt's pressure dependence are not included. Developed-flow "
                            "values and the entrance loss are those of the isothermal melt at " +
                              rheology::format_short(*flow.fluid.temperature) + " K." :
                            ""));
      else if (die)
        cautions.emplace_back(
          "The die pressure drop covers only the modelled barrel and die, at one uniform temperature (" +
          (!flow.fluid.temperature ? std::string("the fluid's reference temperature") :
                                     rheology::format_short(*flow.fluid.temperature) + " K") +
          "); screens, adapters, viscous heating and the melt's pressure dependence are not included.");
      if (state.physics.law->yield_stress() > 0.)
        cautions.emplace_back("Yield-stress fluid regularized after Papanastasiou: unyielded regions and the cavern "
                              "are approximations that move as the regularization exponent grows.");
      return cautions;
    }
  } // namespace

  namespace
  {
    /// The design numbers of the state's solution (pressure already mean-free).
    report::DesignNumbers design_numbers(const SolvedFlow &state)
    {
      const input::FlowCase      &flow = state.physics.flow;
      const Formulation           formulation(state.physics.kind);
      const report::FlowIntegrals integrals = flow_integrals(state);

      report::DesignNumbers numbers;
      report::add_role_numbers(formulation, integrals, numbers);
      report::add_die_numbers(formulation, *state.physics.law, flow.geometry->straight_sections(), integrals, numbers);
      if (has_impeller(state))
        {
          report::Impeller impeller;
          impeller.rotation_speed        = flow.operating.rotation_speed;
          impeller.diameter              = flow.geometry->impeller_diameter();
          impeller.density               = flow.fluid.density;
          impeller.metzner_otto_constant = flow.vessel.metzner_otto_constant;
          report::add_vessel_numbers(formulation, *state.physics.law, impeller, integrals, vessel_integrals(state),
                                     numbers);
        }
      report::add_energy_and_region_numbers(formulation, state.physics.law->yield_stress(), integrals, numbers);
      add_heat_numbers(state, numbers);
      mark_default_key_numbers(numbers);
      return numbers;
    }
  } // namespace

  report::DesignNumbers current_design_numbers(FlowState &state, const Physics &physics)
  {
    const Vector solved = state.solution;
    make_pressure_mean_free(state);
    report::DesignNumbers numbers = design_numbers(SolvedFlow{physics, state.mesh, state.solution});
    state.solution                = solved;
    return numbers;
  }

  report::DesignNumbers current_design_numbers(FlowState &state)
  {
    return current_design_numbers(state, state.physics);
  }

  report::Summary summarize(const FlowState &state, const SolveOutcome &outcome)
  {
    const input::FlowCase &flow = state.physics.flow;
    report::Summary        summary;
    summary.numbers = design_numbers(state);
    if (has_impeller(state))
      summary.dead_zone_fraction = flow.vessel.dead_zone_fraction;
    // Error bars only for a converged run, whose final mesh is the last of outcome.mesh_numbers.
    if (outcome.converged)
      report::estimate_accuracy(summary.numbers, outcome.mesh_numbers,
                                outcome.at_larger_m ? &*outcome.at_larger_m : nullptr, outcome.regularization_factor);
    report::DesignNumbers &numbers = summary.numbers;

    summary.case_file           = flow.case_file;
    summary.converged           = outcome.converged;
    summary.reason              = outcome.reason;
    summary.velocity_components = velocity_components(state.physics.kind);
    summary.viscosity_law       = flow.fluid.law_name;
    summary.yield_stress        = state.physics.law->yield_stress();
    summary.cells               = state.mesh.triangulation.n_global_active_cells();
    summary.unknowns            = state.mesh.dof_handler.n_dofs();
    summary.history             = outcome.history;
    summary.case_cautions       = case_cautions(state, numbers);
    summary.accuracy.target              = flow.accuracy.target_relative_error;
    if (flow.accuracy.target_relative_error)
      {
        std::string worst;
        summary.accuracy.target_met    = outcome.converged && accuracy_target_met(state, numbers, worst);
        summary.accuracy.target_status = std::string(summary.accuracy.target_met ? "target met " : "target not met ") +
                                         outcome.target_status + (worst.empty() ? "" : "; largest: " + worst);
      }
    summary.accuracy.regularization_note = outcome.regularization_note;
    summary.accuracy.meshes              = outcome.mesh_numbers;
    summary.accuracy.regularization_factor = outcome.at_larger_m ? outcome.regularization_factor : 0.;
    const double memory         = peak_memory();
    summary.resources.peak_memory_per_rank  = dealii::Utilities::MPI::max(memory, state.mesh.comm);
    summary.resources.peak_memory_all_ranks = dealii::Utilities::MPI::sum(memory, state.mesh.comm);
    summary.resources.ranks                 = state.mesh.n_ranks;
    return summary;
  }
} // namespace lentus::flow
