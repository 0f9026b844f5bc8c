// Solves one flow case and writes its folder: fields (VTU/PVD), summary.json, log.
#pragma once

#include "solver/input/flow_case.h"

#include <mpi.h>

#include <string>
#include <vector>

namespace lentus::flow
{
  struct DesignNumber
  {
    std::string name;
    double      value;
    std::string unit;
  };

  struct RunResult
  {
    bool                      converged = false;
    std::string               reason;  ///< why not converged
    std::vector<DesignNumber> numbers; ///< of the last iterate
    unsigned int              newton_iterations = 0;

    /// The value of the design number `name`; throws std::out_of_range if absent.
    double number(const std::string &name) const;
  };

  /// Runs the case on `communicator` and writes its folder (also when not
  /// converged: the last iterate, marked so in summary.json).
  RunResult run_flow_case(const input::FlowCase &flow_case, MPI_Comm communicator);
} // namespace lentus::flow
