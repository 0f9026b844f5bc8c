// Integrals of a solved flow over cells and boundary roles, and the reactions on
// roles, for the design numbers of solver/report. Heavy header: solver/flow/*.cc only.
#pragma once

#include "solver/flow/flow_state.h"
#include "solver/report/integrals.h"

namespace lentus::flow
{
  /// When the pressure was pinned at one unknown (no role sets it), shifts it so that its
  /// volume-weighted mean is zero. Collective.
  void make_pressure_mean_free(FlowState &state);

  /// Cell integrals, role integrals and reactions (torque, power, forces of each role from the
  /// unconstrained residual: consistent with the discrete equations). Collective.
  report::FlowIntegrals flow_integrals(const SolvedFlow &state);
} // namespace lentus::flow
