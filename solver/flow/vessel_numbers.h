// Design numbers of stirred vessels: impeller torque and power, power number, Metzner-Otto
// Reynolds number, dead zones and the cavern (the yielded region around the impeller).
#pragma once

#include "solver/flow/flow_run.h"
#include "solver/flow/flow_state.h"

#include <map>
#include <string>
#include <vector>

namespace lentus::flow
{
  /// Velocity in the fixed (laboratory) frame from the velocity U (3 slots, see kinematics.h) of the
  /// frame the case is solved in: adds 2 pi N e_z x r when solved in the impeller's frame.
  dealii::Tensor<1, 3> fixed_frame_velocity(const FlowState &state, const dealii::Point<2> &x,
                                            const dealii::Tensor<1, 3> &U);

  /// True if the case has roles under Boundary conditions/Impeller.
  bool has_impeller(const FlowState &state);

  /// Appends the vessel numbers when the case has impeller roles. `torque_on_fluid` holds the torque
  /// each wall role exerts on the fluid (about the axis, or the origin when planar). All ranks call.
  void append_vessel_numbers(const FlowState &state, const std::map<std::string, double> &torque_on_fluid,
                             std::vector<DesignNumber> &numbers);
} // namespace lentus::flow
