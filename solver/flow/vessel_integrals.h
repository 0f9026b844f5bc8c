// Integrals of stirred vessels: dead zones and the cavern (the yielded region around the
// impeller); solver/report/vessel_numbers.cc turns them into design numbers.
#pragma once

#include "solver/flow/flow_state.h"
#include "solver/report/integrals.h"

namespace lentus::flow
{
  /// Velocity in the fixed (laboratory) frame from the velocity U (3 slots, see kinematics.h) of the
  /// frame the case is solved in: adds 2 pi N e_z x r when solved in the impeller's frame.
  dealii::Tensor<1, 3> fixed_frame_velocity(const SolvedFlow &state, const dealii::Point<2> &x,
                                            const dealii::Tensor<1, 3> &U);

  /// True if the case has roles under Boundary conditions/Impeller.
  bool has_impeller(const SolvedFlow &state);

  /// Dead-zone and cavern integrals of a case with impeller roles. All ranks call.
  report::VesselIntegrals vessel_integrals(const SolvedFlow &state);
} // namespace lentus::flow
