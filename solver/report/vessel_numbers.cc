// Stirred vessels: impeller torque and power, power number and Metzner-Otto Reynolds number,
// dead zones and the cavern (the yielded region around the impeller).
#include "solver/report/numbers.h"

#include <cmath>

namespace lentus::report
{
  void add_vessel_numbers(const Formulation &formulation, const rheology::ViscosityLaw &law, const Impeller &impeller,
                          const FlowIntegrals &flow, const VesselIntegrals &vessel, DesignNumbers &numbers)
  {
    const bool        axisymmetric = formulation.axisymmetric();
    const std::string per          = formulation.per_depth();
    const double      N            = impeller.rotation_speed;
    const double      D            = impeller.diameter;
    const std::optional<double> density = impeller.density;
    const double      tau_y        = law.yield_stress();

    // Torque and power the impeller roles put into the fluid.
    double torque = 0.;
    for (const ConditionInfo &condition : flow.conditions)
      if (condition.impeller)
        torque += formulation.total_factor() * flow.roles.at(condition.role).torque;
    const double power = 2. * M_PI * N * torque;
    numbers.add("impeller torque", "T_i", torque, "N m" + per, Group::vessel, true);
    numbers.add("impeller power", "P", power, "W" + per, Group::vessel, true);
    if (D > 0.)
      {
        numbers.add("impeller tip speed", "v_tip", M_PI * N * D, "m/s", Group::vessel);
        // Metzner & Otto (1957): effective shear rate k_s N and the apparent viscosity there.
        const double rate     = impeller.metzner_otto_constant * N;
        const double apparent = law.evaluate(rate).value;
        numbers.add("Metzner-Otto shear rate", "gamma_MO", rate, "1/s", Group::vessel);
        numbers.add("apparent viscosity at the Metzner-Otto shear rate", "eta_MO", apparent, "Pa s", Group::vessel);
        if (density)
          {
            const double rho = *density;
            // Po = P / (rho N^3 D^5); per metre of depth when planar: P' / (rho N^3 D^4).
            numbers.add("power number", "Po", power / (rho * N * N * N * std::pow(D, axisymmetric ? 5 : 4)), "-",
                        Group::vessel, true);
            numbers.add("Metzner-Otto Reynolds number", "Re_MO", rho * N * D * D / apparent, "-", Group::vessel);
            if (tau_y > 0.)
              numbers.add("yield Reynolds number", "Re_y", rho * N * N * D * D / tau_y, "-", Group::vessel);
          }
      }
    numbers.add("dead-zone area fraction", "phi_d,A", vessel.dead_area / vessel.area, "-", Group::vessel,
                !axisymmetric);
    if (axisymmetric)
      numbers.add("dead-zone volume fraction", "phi_d", vessel.dead_volume / vessel.volume, "-", Group::vessel, true);
    if (!(tau_y > 0.))
      return;
    // The cavern's extent: the interpolated yield surface (see solver/flow/vessel_integrals.cc).
    numbers.add("cavern radius", "R_c", vessel.cavern_radius, "m", Group::vessel, true);
    if (axisymmetric)
      {
        numbers.add("cavern height", "H_c", vessel.cavern_height, "m", Group::vessel, true);
        numbers.add("cavern volume fraction", "phi_c", vessel.cavern_measure / vessel.volume, "-", Group::vessel);
      }
    else
      numbers.add("cavern area fraction", "phi_c,A", vessel.cavern_measure / vessel.area, "-", Group::vessel);
  }
} // namespace lentus::report
