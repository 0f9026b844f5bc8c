// Integrals of a solved flow over its cells and boundary roles, computed once by
// solver/flow (integrals.cc, vessel_integrals.cc) and turned into design numbers by
// the functions of numbers.h. Plain C++. Integrals are per radian (axisymmetric,
// weight r) or per metre of depth (planar); Formulation::total_factor() makes totals.
#pragma once

#include <map>
#include <optional>
#include <string>
#include <vector>

namespace lentus::report
{
  /// One boundary condition as the numbers need it, in the case's order.
  struct ConditionInfo
  {
    std::string           role;
    bool                  wall     = false; ///< no-slip, moving wall or impeller
    bool                  impeller = false; ///< turns with the impeller
    std::optional<double> set_pressure;     ///< [Pa], roles at a set pressure
  };

  /// Over one role's faces, and its reactions (from the unconstrained residual).
  struct RoleIntegrals
  {
    double flux     = 0.; ///< int u.n w ds
    double pressure = 0.; ///< int p w ds
    double weight   = 0.; ///< int w ds
    double torque   = 0.; ///< of the reactions about the axis (swirl) or the origin (planar)
    double power    = 0.; ///< sum of reaction times velocity over the role's unknowns
    double force[2] = {0., 0.}; ///< reactions in mesh components
  };

  struct CellIntegrals
  {
    double area = 0.;              ///< int dA
    double volume = 0.;            ///< int w dA
    double dissipation = 0.;       ///< int eta gamma_dot^2 w dA
    double unyielded_area = 0.;    ///< where |tau| < tau_y
    double unyielded_volume = 0.;
    double max_speed = 0.;         ///< [m/s], in the fixed frame
  };

  struct FlowIntegrals
  {
    std::vector<ConditionInfo>           conditions;
    std::map<std::string, RoleIntegrals> roles; ///< every role of the geometry
    CellIntegrals                        cells;
  };

  /// Dead zones and the cavern of a stirred vessel (see solver/flow/vessel_integrals.cc).
  struct VesselIntegrals
  {
    double area = 0., volume = 0.;           ///< int dA, int w dA
    double dead_area = 0., dead_volume = 0.; ///< unyielded or slower than the dead-zone speed
    double cavern_radius = 0.;  ///< [m], from the axis (axisymmetric) or the origin (planar)
    double cavern_height = 0.;  ///< [m], axial extent
    double cavern_measure = 0.; ///< yielded area or volume (per radian) connected to the impeller
  };
} // namespace lentus::report
