// What a run writes and says: the log's opening lines, the case folder's files, and
// the in-memory result returned to callers.
#pragma once

#include "solver/flow/flow_run.h"
#include "solver/flow/flow_state.h"
#include "solver/report/case_folder.h"
#include "solver/report/summary.h"

namespace lentus::flow
{
  /// The log's first lines: version, case, ranks, fluid and velocity components.
  void log_start(FlowState &state);

  /// Logs the status, design numbers and seconds by phase, and writes the folder: fields (VTU/PVD),
  /// die profiles (CSV), summary.json, case.prm and log.txt; then commits it. The time of the output
  /// is added to the summary's phases and wall time. Collective.
  void write_case_folder(FlowState &state, report::Summary &summary, report::CaseFolder &folder);

  /// What run_flow_case returns for `summary`, written to `folder`.
  RunResult result_of(const report::Summary &summary, const std::string &folder);
} // namespace lentus::flow
