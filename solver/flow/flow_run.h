// Solves one flow case and writes its folder: fields (VTU/PVD), summary.json, log.
#pragma once

#include "solver/input/flow_case.h"
#include "solver/report/design_number.h"
#include "solver/report/solve_history.h"

#include <deal.II/base/point.h>
#include <deal.II/base/tensor.h>

#include <mpi.h>

#include <functional>
#include <memory>
#include <string>
#include <vector>

namespace lentus::flow
{
  struct RunResult
  {
    bool                            converged = false;
    std::string                     reason;  ///< why not converged
    report::DesignNumbers           numbers; ///< of the last iterate
    unsigned int                    newton_iterations = 0; ///< on the final mesh
    std::vector<report::MeshRecord> meshes;                ///< coarsest first; the last is the final mesh
    bool                            target_met = false;    ///< Accuracy/Target relative error met
    std::string                     target_status;         ///< in words; "" without a target

    /// The value of the design number `name`; throws std::out_of_range if absent.
    double number(const std::string &name) const { return numbers.value(name); }
  };

  /// Runs the case on `communicator` and writes its folder (also when not
  /// converged: the last iterate, marked so in summary.json).
  RunResult run_flow_case(const input::FlowCase &flow_case, MPI_Comm communicator);

  struct FlowState;

  /// A solved case kept in memory so that its fields can be probed.
  class FlowRun
  {
  public:
    /// Solves `flow_case` and writes its folder, as run_flow_case does.
    FlowRun(const input::FlowCase &flow_case, MPI_Comm communicator);
    ~FlowRun();

    const RunResult &result() const { return run_result; }

    /// Velocity (mesh components, then u_theta with swirl) and pressure at x.
    /// Collective: every rank calls it with the same point. Throws if x is outside the mesh.
    std::vector<double> values_at(const dealii::Point<2> &x) const;

    /// L2 norm of u_h - u over the flow domain, with the volume weight (1 or r; no 2 pi),
    /// for an exact velocity given in mesh components. Collective.
    double velocity_error(const std::function<dealii::Tensor<1, 2>(const dealii::Point<2> &)> &exact) const;

    /// Temperature [K] at x of a case solved with the energy equation. Collective. Throws
    /// std::logic_error without a temperature field, std::out_of_range if x is outside the mesh.
    double temperature_at(const dealii::Point<2> &x) const;

  private:
    std::unique_ptr<FlowState> state;
    RunResult                  run_result;
  };
} // namespace lentus::flow
