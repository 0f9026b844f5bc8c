// A complete flow case read from a case file: fluid, geometry, formulation,
// boundary conditions by role, numerics and outputs.
#pragma once

#include "meshes/geometry.h"
#include "solver/formulation/kinematics.h"
#include "solver/input/case_file.h"
#include "solver/input/fluid_section.h"

#include <cmath>
#include <memory>
#include <string>
#include <vector>

namespace lentus::input
{
  /// Declares Geometry, Flow, Boundary conditions, Nonlinear solver, Linear solver, Output.
  void declare_flow_case(CaseSchema &schema);

  /// One boundary condition on one role.
  struct BoundaryCondition
  {
    enum class Type
    {
      no_slip,       ///< u = 0
      moving_wall,   ///< u = wall velocity + rotation
      pressure,      ///< fully developed: tangential u = 0, normal stress = -p
      traction_free, ///< sigma n = 0 ("do-nothing")
      symmetry,      ///< u . n = 0, zero tangential traction
      axis,          ///< r = 0: u_r = 0, u_theta = 0
      inflow,        ///< fully developed profile of the fluid's own law carrying a set flow rate
      uniform_inflow, ///< the same normal speed into the domain across the role
      impeller       ///< turns with the impeller at the rotation speed (at rest in the impeller's frame)
    };
    std::string role;
    Type        type;
    double      pressure  = 0.; ///< [Pa], for Type::pressure
    double      flow_rate = 0.; ///< into the domain, [m^3/s] (axisymmetric) or [m^2/s] (planar), for Type::inflow
    double      speed     = 0.; ///< normal speed into the domain [m/s], for Type::uniform_inflow
  };

  struct FlowCase
  {
    /// Angular velocity of the impeller, 2 pi N [rad/s].
    double impeller_omega() const { return 2. * M_PI * rotation_speed; }

    std::string                        case_file;
    std::string                        case_name;   ///< file name without folder and extension
    Fluid                              fluid;
    std::string                        shape_name;
    std::vector<double>                shape_values;  ///< dimensions of a catalogue shape
    std::string                        mesh_file;     ///< Gmsh mesh: the file, as found from the working directory
    std::unique_ptr<meshes::Geometry>  geometry;
    unsigned int                       refinement = 0;
    FormulationKind                    formulation = FormulationKind::planar;
    bool                               inertia = false;
    double                             gravity[2] = {0., 0.}; ///< [m/s^2], mesh components
    std::vector<BoundaryCondition>     conditions;
    double                             wall_velocity[2] = {0., 0.}; ///< [m/s] for moving walls
    double                             rotation_rate = 0.;          ///< [rad/s] for moving walls
    double                             rotation_speed = 0.;         ///< N [rev/s] of the Impeller roles
    bool                               impeller_frame = false;      ///< solve in the impeller's rotating frame
    double                             metzner_otto_constant = 11.5; ///< k_s [-]: effective shear rate k_s N
    double                             dead_zone_fraction = 0.01;   ///< dead: slower than this x tip speed [-]
    unsigned int                       velocity_degree = 2;
    // Nonlinear solver
    double       relative_tolerance = 1e-8;
    double       absolute_tolerance = 1e-12;
    unsigned int max_iterations     = 60;
    double       picard_until       = 1e-2; ///< Picard while residual / initial residual is above this
    unsigned int max_picard_steps   = 10;
    bool         continuation       = true;
    int          mesh_sequencing    = -1; ///< levels solved first on coarser meshes; -1: automatic
    // Linear solver
    std::string  linear_solver = "automatic"; ///< automatic | direct | iterative
    unsigned int direct_limit  = 250000;      ///< DoFs up to which "automatic" chooses direct
    // Output
    std::string output_folder;
    bool        write_fields = true;
    std::string complete_text; ///< every key with its value, for the record
  };

  /// Reads and validates a flow case; throws InputError with file, line and key.
  FlowCase read_flow_case(const CaseFile &file);

  /// Reads only what the mesh needs into `flow` (case name, shape, dimensions or mesh
  /// file, refinement, formulation, velocity degree), checked as read_flow_case does;
  /// no fluid or boundary conditions are needed. Throws InputError.
  void read_geometry(const CaseFile &file, FlowCase &flow);
} // namespace lentus::input
