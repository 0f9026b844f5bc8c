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

  /// The velocity across the role "outlet" (a die exit): CSV text on rank 0, one row per node of
  /// the outlet, ordered by the transverse coordinate; empty if the shape has no outlet. All ranks call.
  std::string exit_profile_csv(const FlowState &state);

  /// Wall shear rate gamma_dot and stress eta gamma_dot at the Gauss points of every no-slip role's
  /// faces: CSV text on rank 0 (role, coordinates, rate, stress), ordered by role and along the flow
  /// (the outlet's normal); empty without an outlet role or a no-slip role. All ranks call.
  std::string wall_profile_csv(const FlowState &state);

  /// Writes the VTU/PVTU/PVD field files into `folder` (all ranks).
  void write_fields(const FlowState &state, const std::string &folder);
} // namespace lentus::flow
