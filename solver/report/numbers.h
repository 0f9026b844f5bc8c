// Design numbers by kind, from precomputed integrals: small functions that never
// touch a mesh or a solution. Each appends to a DesignNumbers list.
#pragma once

#include "meshes/straight_section.h"
#include "rheology/viscosity_law.h"
#include "solver/formulation/formulation.h"
#include "solver/report/design_number.h"
#include "solver/report/integrals.h"

#include <optional>
#include <vector>

namespace lentus::report
{
  /// Flow rate and mean pressure on every role; torque and forces on walls; the pressure drop
  /// inlet to outlet when the shape has both roles.
  void add_role_numbers(const Formulation &formulation, const FlowIntegrals &integrals, DesignNumbers &numbers);

  /// Dies (shapes with straight sections, an inlet and an outlet): the developed flow of the fluid's
  /// law at the computed throughput in each section, and the entrance loss beyond it.
  void add_die_numbers(const Formulation &formulation, const rheology::ViscosityLaw &law,
                       const std::vector<meshes::StraightSection> &sections, const FlowIntegrals &integrals,
                       DesignNumbers &numbers);

  /// What a stirred vessel's numbers need besides integrals.
  struct Impeller
  {
    double rotation_speed = 0.;        ///< N [rev/s]
    double diameter = 0.;              ///< D [m]; 0 when the shape has none
    std::optional<double> density;     ///< [kg/m^3], if given
    double metzner_otto_constant = 0.; ///< k_s [-]
  };

  /// Impeller torque and power, tip speed, Metzner-Otto shear rate and viscosity, power number
  /// and Reynolds numbers, dead-zone fractions and, for yield-stress fluids, the cavern.
  void add_vessel_numbers(const Formulation &formulation, const rheology::ViscosityLaw &law, const Impeller &impeller,
                          const FlowIntegrals &flow, const VesselIntegrals &vessel, DesignNumbers &numbers);

  /// Power put in through the boundaries and dissipated, maximum speed, flow area and volume,
  /// unyielded fractions (yield-stress fluids).
  void add_energy_and_region_numbers(const Formulation &formulation, double yield_stress,
                                     const FlowIntegrals &integrals, DesignNumbers &numbers);
} // namespace lentus::report
