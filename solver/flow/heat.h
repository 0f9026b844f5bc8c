// The temperature field of a flow solved with the energy equation (Heat/Energy equation):
// its finite element and unknowns, the viscosity at the local temperature, and the split
// coupling with the flow. Heavy header: include it only from solver/flow/*.cc.
#pragma once

#include "solver/flow/flow_state.h"

#include <deal.II/base/quadrature.h>
#include <deal.II/fe/fe_q.h>
#include <deal.II/fe/fe_values.h>

#include <memory>
#include <optional>
#include <vector>

namespace lentus::flow
{
  /// The temperature field on the flow's mesh and what the energy equation needs of the case.
  struct HeatField
  {
    explicit HeatField(const input::FlowCase &flow);

    dealii::FE_Q<2>                   fe; ///< Lagrange Q_k, k the velocity degree
    dealii::DoFHandler<2>             dof_handler;
    dealii::IndexSet                  owned, relevant;
    dealii::AffineConstraints<double> nonzero_constraints, zero_constraints, hanging_constraints;
    Matrix                            matrix;
    Vector                            residual;    ///< -R, owned
    Vector                            temperature; ///< [K], ghosted

    rheology::TemperatureShift shift;
    double                     melt_temperature; ///< Operating point/Temperature [K]
    double                     melt_factor;      ///< a_T(melt_temperature), 1 without a shift
    double                     rho_cp;           ///< rho c_p [J/(m^3 K)]
    double                     conductivity;     ///< k [W/(m K)]
    bool                       viscous_heating;

    bool coupled = false; ///< the flow's viscosity follows the temperature field
    bool solved  = false; ///< the temperature field belongs to the current mesh's flow
    /// The design numbers of the flow at the uniform melt temperature on the current mesh.
    std::optional<report::DesignNumbers> isothermal;
    std::vector<double>                  changes; ///< largest temperature change of each pass [K]
    unsigned int                         energy_newton_steps = 0; ///< of the last coupled solve, all passes

    /// a_T(T) / a_T(melt temperature): the factor that turns the case's law into the law at T.
    double relative_shift(double temperature) const;
    /// d ln a_T / dT at T [1/K].
    double log_slope(double temperature) const { return shift.log_slope(temperature); }
  };

  /// The temperature and the viscosity at the points of a quadrature of flow cells. Inactive (the
  /// law as it is) without the energy equation or before the flow is coupled to the temperature.
  class LocalTemperature
  {
  public:
    LocalTemperature(const Physics &physics, const dealii::Quadrature<2> &quadrature);

    bool active() const { return field != nullptr; }
    /// Reads the temperatures at the points of `flow_cell` (a cell of the flow's DoFHandler).
    void reinit(const dealii::DoFHandler<2>::cell_iterator &flow_cell);
    double temperature(const unsigned int q) const { return temperatures[q]; }
    /// eta(gamma_dot, T) = s law(s gamma_dot) with s = a_T(T) / a_T(melt), and d eta / d gamma_dot.
    rheology::Viscosity viscosity(const rheology::ViscosityLaw &law, const double gamma_dot, const unsigned int q) const
    {
      if (!field)
        return law.evaluate(gamma_dot);
      const double              s = shifts[q];
      const rheology::Viscosity v = law.evaluate(s * gamma_dot);
      return {s * v.value, s * s * v.derivative};
    }

  private:
    const HeatField                      *field = nullptr;
    std::unique_ptr<dealii::FEValues<2>> fe_values;
    std::vector<double>                  temperatures, shifts;
  };

  /// The viscosity at T of a point in a flow cell (unit-cell coordinates), for output and profiles.
  rheology::Viscosity viscosity_at_point(const Physics &physics, const dealii::DoFHandler<2>::cell_iterator &flow_cell,
                                         const dealii::Point<2> &unit_point, double gamma_dot);

  /// Unknowns, constraints (set temperatures, inlets, hanging nodes), matrix and the uniform melt
  /// temperature as first iterate, on the flow's current mesh. Called by setup_dofs().
  void setup_heat(FlowState &state);

  /// Assembles the energy equation's residual at the state's temperature into heat.residual (as
  /// -R) and, with `with_matrix`, its Jacobian in T at the fixed flow `flow_solution` (ghosted).
  /// With `reactions`, the residual without Dirichlet constraints instead (owned): at a node of a
  /// set-temperature role, the heat flowing into the fluid there [W per radian or per metre].
  /// Returns the l2 norm of the residual.
  double assemble_heat(const Physics &physics, const Discretization &mesh, const Vector &flow_solution, HeatField &heat,
                       bool with_matrix, Vector *reactions = nullptr);

  /// The split coupled solve on the current mesh, from the converged flow at the melt temperature:
  /// energy equation at the current flow, flow at the new temperatures, until no temperature changes
  /// by more than Heat/Coupling tolerance. Records the isothermal numbers first. True if converged;
  /// else outcome.reason says why.
  bool solve_coupled_heat(FlowState &state, SolveOutcome &outcome);

  /// The heat design numbers of a solved flow with the energy equation (none without).
  void add_heat_numbers(const SolvedFlow &state, report::DesignNumbers &numbers);
} // namespace lentus::flow
