// From a solved flow to its typed summary: integrals once, then the design numbers of
// each kind (solver/report/numbers.h), the status and the case's cautions.
#pragma once

#include "solver/flow/flow_state.h"
#include "solver/report/summary.h"

namespace lentus::flow
{
  /// The summary of the solved state (does not change the solution; call
  /// make_pressure_mean_free() first). Collective.
  report::Summary summarize(const FlowState &state, const SolveOutcome &outcome);
} // namespace lentus::flow
