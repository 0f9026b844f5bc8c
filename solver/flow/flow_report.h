// Design numbers of a solved flow, with units.
#pragma once

#include "solver/flow/flow_run.h"
#include "solver/flow/flow_state.h"

#include <string>
#include <vector>

namespace lentus::flow
{
  /// Makes the pressure mean-free when it was pinned; returns the design numbers.
  std::vector<DesignNumber> design_numbers(FlowState &state);

  /// Writes the VTU/PVTU/PVD field files into `folder` (all ranks).
  void write_fields(const FlowState &state, const std::string &folder);
} // namespace lentus::flow
