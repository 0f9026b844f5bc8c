// The algorithm of a flow run, step by step; each step lives in its own file.
#include "solver/flow/flow_run.h"

#include "solver/flow/case_output.h"
#include "solver/flow/flow_state.h"
#include "solver/flow/integrals.h"
#include "solver/flow/results.h"
#include "solver/report/case_folder.h"

#include <deal.II/base/timer.h>

namespace lentus::flow
{
  FlowRun::FlowRun(const input::FlowCase &flow, MPI_Comm communicator)
    : state(std::make_unique<FlowState>(flow, communicator))
  {
    const dealii::Timer timer;
    report::CaseFolder  folder(flow.output_folder, "summary.json", "Output/Folder", communicator); // refused early
    log_start(*state);
    SolveOutcome outcome = solve_with_mesh_sequencing(*state); // builds the meshes, solves on each
    improve_accuracy(*state, outcome, timer.wall_time());       // adaptive cycles, regularization check
    make_pressure_mean_free(*state);
    const double    solved           = timer.wall_time();
    report::Summary summary          = summarize(*state, outcome);
    summary.history.add_seconds(report::Phase::design_numbers, timer.wall_time() - solved);
    summary.resources.wall_seconds   = timer.wall_time();
    write_case_folder(*state, summary, folder);
    run_result = result_of(summary, folder.path());
  }

  FlowRun::~FlowRun() = default;

  RunResult run_flow_case(const input::FlowCase &flow, MPI_Comm communicator)
  {
    return FlowRun(flow, communicator).result();
  }
} // namespace lentus::flow
