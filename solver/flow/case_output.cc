#include "solver/flow/case_output.h"

#include "solver/flow/fields.h"
#include "solver/formulation/formulation.h"
#include "solver/report/caution.h"
#include "solver/version.h"

#include <deal.II/base/timer.h>

#include <cstdio>

namespace lentus::flow
{
  void log_start(FlowState &state)
  {
    const input::FlowCase &flow = state.physics.flow;
    state.log.line("lentus " + std::string(version) + ": case " + flow.case_file + " on " +
                   std::to_string(state.mesh.n_ranks) + " rank(s)");
    state.log.line("Fluid: " + flow.fluid.law_name + "; velocity components: " + velocity_components(flow.model.formulation) +
                   (flow.model.inertia ? ", with inertia" : ", creeping flow"));
  }

  void write_case_folder(FlowState &state, report::Summary &summary, report::CaseFolder &folder)
  {
    const dealii::Timer timer;
    if (state.physics.flow.output.write_fields)
      write_fields(state, folder.staging());
    const std::string exit_profile = exit_profile_csv(state);
    const std::string wall_profile = wall_profile_csv(state);
    summary.history.add_seconds(report::Phase::output, timer.wall_time());
    summary.resources.wall_seconds += timer.wall_time();

    state.log.line(summary.converged ? "Converged." : "NOT CONVERGED: " + summary.reason);
    state.log.line("Design numbers" + std::string(summary.converged ? "" : " (of the last iterate, not converged)") +
                   ":");
    for (const std::string &line : report::design_number_lines(summary.numbers))
      state.log.line(line);
    for (const std::string &caution : summary.case_cautions)
      state.log.line("Note: " + caution);
    state.log.line(std::string("Caution: ") + report::caution);
    state.log.line(report::phase_line(summary));

    folder.write("summary.json", report::to_json(summary));
    folder.write("case.prm", state.physics.flow.complete_text);
    folder.write("log.txt", state.log.text());
    if (!exit_profile.empty())
      folder.write("exit_profile.csv", exit_profile);
    if (!wall_profile.empty())
      folder.write("wall_profile.csv", wall_profile);
    folder.commit();
    if (state.mesh.rank == 0)
      std::printf("Results in %s\n", folder.path().c_str());
  }

  RunResult result_of(const report::Summary &summary, const std::string &folder)
  {
    RunResult result;
    result.converged = summary.converged;
    result.reason    = summary.converged ?
                         "" :
                         summary.reason + " (last iterate written to " + folder + ", marked not converged)";
    result.numbers   = summary.numbers;
    result.meshes    = summary.history.meshes();
    result.target_met    = summary.accuracy.target_met;
    result.target_status = summary.accuracy.target_status;
    result.newton_iterations = result.meshes.empty() ? 0 : result.meshes.back().newton;
    return result;
  }
} // namespace lentus::flow
