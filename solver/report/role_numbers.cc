// Numbers of every case: flows, pressures, forces and torques on roles; energy; regions.
#include "solver/report/numbers.h"

namespace lentus::report
{
  namespace
  {
    double mean_pressure(const RoleIntegrals &role)
    {
      return role.weight > 0. ? role.pressure / role.weight : 0.;
    }
  } // namespace

  void add_role_numbers(const Formulation &formulation, const FlowIntegrals &integrals, DesignNumbers &numbers)
  {
    const double      factor = formulation.total_factor();
    const std::string per    = formulation.per_depth();
    for (const ConditionInfo &condition : integrals.conditions)
      {
        const RoleIntegrals &role = integrals.roles.at(condition.role);
        const std::string   &name = condition.role;
        numbers.add("flow rate out through " + name, "Q", factor * role.flux, formulation.flow_rate_unit(),
                    Group::flow);
        numbers.add("mean pressure on " + name, "p", mean_pressure(role), "Pa", Group::flow);
        if (!condition.wall)
          continue;
        if (formulation.has_torque())
          numbers.add("torque on the fluid from " + name, "T", factor * role.torque, "N m" + per, Group::flow);
        // Force the wall exerts on the fluid (the fluid's drag on the wall is its negative). Axisymmetric:
        // the axial force only (the radial one cancels around the circumference).
        if (formulation.axisymmetric())
          numbers.add("axial force on the fluid from " + name, "F_z", factor * role.force[1], "N", Group::flow);
        else
          {
            numbers.add("x force on the fluid from " + name, "F_x", factor * role.force[0], "N/m", Group::flow);
            numbers.add("y force on the fluid from " + name, "F_y", factor * role.force[1], "N/m", Group::flow);
          }
      }
    if (integrals.roles.count("inlet") && integrals.roles.count("outlet"))
      numbers.add("pressure drop inlet to outlet", "dp",
                  integrals.roles.at("inlet").pressure / integrals.roles.at("inlet").weight -
                    integrals.roles.at("outlet").pressure / integrals.roles.at("outlet").weight,
                  "Pa", Group::flow);
  }

  void add_energy_and_region_numbers(const Formulation &formulation, const double yield_stress,
                                     const FlowIntegrals &integrals, DesignNumbers &numbers)
  {
    const double      factor = formulation.total_factor();
    const std::string per    = formulation.per_depth();
    // Power put in: the reactions' work on roles with set velocities; -p Q on roles at a set pressure.
    double power_in = 0.;
    for (const ConditionInfo &condition : integrals.conditions)
      {
        const RoleIntegrals &role = integrals.roles.at(condition.role);
        power_in += factor * role.power;
        if (condition.set_pressure)
          power_in -= *condition.set_pressure * (factor * role.flux);
      }
    const CellIntegrals &cells = integrals.cells;
    numbers.add("power input through boundaries", "P_in", power_in, "W" + per, Group::energy);
    numbers.add("viscous dissipation", "Phi", factor * cells.dissipation, "W" + per, Group::energy);
    numbers.add("maximum speed", "u_max", cells.max_speed, "m/s", Group::flow);
    numbers.add("flow area", "A", cells.area, "m^2", Group::regions);
    if (formulation.axisymmetric())
      numbers.add("flow volume", "V", factor * cells.volume, "m^3", Group::regions);
    if (yield_stress > 0.)
      {
        numbers.add("unyielded area fraction", "phi_u,A", cells.unyielded_area / cells.area, "-", Group::regions);
        if (formulation.axisymmetric())
          numbers.add("unyielded volume fraction", "phi_u", cells.unyielded_volume / cells.volume, "-",
                      Group::regions);
      }
  }
} // namespace lentus::report
