// Solves one flow case and writes its folder: fields (VTU/PVD), summary.json, log.
#pragma once

#include "solver/input/flow_case.h"

#include <mpi.h>

namespace lentus::flow
{
  /// Runs the case on `communicator`. Returns 0 when converged; throws
  /// NoConvergence (after writing the last iterate, marked not converged).
  int run_flow_case(const input::FlowCase &flow_case, MPI_Comm communicator);
} // namespace lentus::flow
