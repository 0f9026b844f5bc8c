// Field output of a solved flow (VTU/PVTU/PVD) and the die profiles (CSV).
#pragma once

#include "solver/flow/flow_state.h"

#include <string>

namespace lentus::flow
{
  /// Writes the VTU/PVTU/PVD field files into `folder` (all ranks): velocity, swirl velocity,
  /// pressure, shear rate, viscosity, stress magnitude, unyielded indicator, speed, partition.
  void write_fields(const FlowState &state, const std::string &folder);

  /// The velocity across the role "outlet" (a die exit): CSV text on rank 0, one row per node of
  /// the outlet, ordered by the transverse coordinate; empty if the shape has no outlet. All ranks call.
  std::string exit_profile_csv(const FlowState &state);

  /// Wall shear rate gamma_dot and stress eta gamma_dot at the Gauss points of every no-slip role's
  /// faces: CSV text on rank 0 (role, coordinates, rate, stress), ordered by role and along the flow
  /// (the outlet's normal); empty without an outlet role or a no-slip role. All ranks call.
  std::string wall_profile_csv(const FlowState &state);
} // namespace lentus::flow
