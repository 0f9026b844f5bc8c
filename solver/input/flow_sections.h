// The sections of a flow case, each a typed struct that owns its keys: `bind` declares them
// (the members' initial values are the defaults) and reads them (section_keys.h). Checks that
// relate keys of several sections are made in read_flow_case().
#pragma once

#include "solver/formulation/kinematics.h"

#include <array>
#include <optional>
#include <string>
#include <utility>
#include <vector>

namespace lentus::input
{
  class SectionKeys;

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

  /// A condition's key under Boundary conditions, e.g. "No-slip", and its meaning.
  struct ConditionKey
  {
    const char             *key;
    BoundaryCondition::Type type;
    const char             *documentation;
  };

  /// Every condition key, in the order a case file's roles are assigned.
  const std::vector<ConditionKey> &condition_keys();

  /// subsection Geometry: which shape (its dimensions are the shape's own subsection) and how fine.
  struct GeometrySection
  {
    std::string  shape;          ///< a catalogue shape or "Gmsh mesh"; "" when not set
    unsigned int refinement = 3; ///< uniform halvings of the coarse cells

    void bind(SectionKeys &keys);
  };

  /// subsection Geometry/Gmsh mesh: an imported mesh.
  struct GmshMeshSection
  {
    std::string file;       ///< as written, relative to the case file's folder; "" when not set
    double      scale = 1.; ///< [m] per mesh unit

    void bind(SectionKeys &keys);
  };

  enum class ReferenceFrame
  {
    fixed,
    impeller ///< turning with the impeller (planar only)
  };

  /// subsection Flow: what is solved for.
  struct FlowSection
  {
    FormulationKind       formulation = FormulationKind::planar; ///< key "Velocity components"
    bool                  inertia     = false;
    std::array<double, 2> gravity{{0., 0.}}; ///< [m/s^2], mesh components
    ReferenceFrame        frame           = ReferenceFrame::fixed;
    unsigned int          velocity_degree = 2;

    bool impeller_frame() const { return frame == ReferenceFrame::impeller; }

    void bind(SectionKeys &keys);
  };

  /// subsection Operating point (the flow's part; the temperature is the fluid's).
  struct OperatingPointSection
  {
    double rotation_speed = 0.; ///< N [rev/s] of the Impeller roles

    void bind(SectionKeys &keys);
  };

  /// subsection Vessel: how stirred-vessel numbers are formed.
  struct VesselSection
  {
    double metzner_otto_constant = 11.5; ///< k_s [-]: effective shear rate k_s N
    double dead_zone_fraction    = 0.01; ///< dead: slower than this x tip speed [-]

    void bind(SectionKeys &keys);
  };

  /// subsection Boundary conditions as written: roles by condition and the values that go with them.
  struct BoundaryConditionsSection
  {
    /// Role lists, in the order of condition_keys() (No-slip, Moving wall, ...).
    std::vector<std::vector<std::string>> roles;
    std::vector<double>                   pressures;      ///< [Pa], one per Pressure role
    std::vector<double>                   inflow_rates;   ///< volume rates, one per Inflow role
    std::vector<double>                   inflow_mass_rates; ///< or mass rates, one per Inflow role
    std::vector<double>                   inflow_speeds;  ///< [m/s], one per Uniform inflow role
    std::vector<double>                   wall_velocity{0., 0.}; ///< [m/s] of the moving walls
    double                                rotation_rate = 0.;    ///< [rad/s] of the moving walls

    void bind(SectionKeys &keys);
  };

  enum class LineSearch
  {
    residual, ///< backtracking on the residual norm
    energy     ///< the step where the slope of the energy along the step, R(x + s dx) . dx, vanishes
  };

  enum class NewtonLinearization
  {
    primal,     ///< the exact Jacobian of the velocity-pressure residual
    primal_dual ///< the stress kept as a second iterate at the quadrature points (Chan, Golub & Mulet 1999)
  };

  /// subsection Nonlinear solver.
  struct NonlinearSolverSection
  {
    double       relative_tolerance = 1e-8;
    double       absolute_tolerance = 1e-12;
    unsigned int max_iterations     = 60;
    double       picard_until       = 1e-2; ///< Picard while residual / initial residual is above this
    unsigned int max_picard_steps   = 10;
    bool         continuation       = true;
    LineSearch   line_search        = LineSearch::residual;
    NewtonLinearization linearization = NewtonLinearization::primal_dual;
    /// Levels solved first on coarser meshes; nullopt: chosen from the size of the problem.
    std::optional<unsigned int> mesh_sequencing;

    void bind(SectionKeys &keys);
  };

  enum class LinearSolverType
  {
    automatic, ///< direct up to `direct_limit` unknowns, else iterative
    direct,
    iterative
  };

  /// subsection Linear solver.
  struct LinearSolverSection
  {
    LinearSolverType type         = LinearSolverType::automatic;
    /// Unknowns up to which automatic chooses direct. Measured (Bingham cavity, Bn 20, 592 387
    /// unknowns, 1 rank, one after the other): direct 268 s and 2.8 GiB peak, iterative 504 s and 1.9 GiB.
    unsigned int     direct_limit = 700000;

    void bind(SectionKeys &keys);
  };

  /// Where an adaptive cycle refines (Accuracy/Refine at).
  enum class RefineAt
  {
    yield_surface,  ///< cells the yield surface |tau| = tau_y crosses, or lies near
    velocity_jumps, ///< jumps of the velocity gradient across faces (Kelly et al. 1983)
    everywhere      ///< every cell (uniform refinement)
  };

  /// subsection Accuracy: error bars on the design numbers, adaptive refinement, a target error.
  struct AccuracySection
  {
    /// Solve at least this many coarser meshes first (as Nonlinear solver/Mesh sequencing does) so
    /// that every number gets a mesh error; 0: only the meshes that mesh sequencing solves anyway.
    unsigned int coarser_meshes = 2;
    /// Refinement cycles after the case's mesh: at most this many (fewer once a target is met).
    unsigned int adaptive_cycles = 0;
    std::vector<RefineAt> refine_at{RefineAt::yield_surface, RefineAt::velocity_jumps};
    double refined_fraction   = 0.25; ///< of the cells, by indicator, refined per cycle [-]
    double coarsened_fraction = 0.;   ///< of the cells with the smallest indicator, coarsened per cycle [-]
    double yield_band         = 0.2;  ///< refine where | |tau| / tau_y - 1 | is below this [-]
    /// Cycles stop once every targeted number's error bar is below this fraction of its value.
    std::optional<double> target_relative_error;
    std::vector<std::string> targeted_numbers; ///< names or symbols; empty: the key numbers
    std::optional<double> maximum_unknowns;      ///< budget: no cycle beyond this many unknowns
    std::optional<double> maximum_wall_time;     ///< budget [s]: no new cycle after this
    bool   regularization_check = true; ///< yield-stress fluids: solve again at a larger M
    double regularization_factor = 4.;  ///< the larger M / M [-]

    void bind(SectionKeys &keys);
  };

  /// One thermal condition on one role (subsection Heat).
  struct ThermalCondition
  {
    enum class Type
    {
      set_temperature, ///< T = T_wall (a heated or cooled wall)
      insulated,       ///< no heat flow: k dT/dn = 0 (also axes and symmetry planes)
      heat_transfer,   ///< heat flow into the fluid h (T_surrounding - T) per unit area
      inlet,           ///< T = T_inlet where the fluid enters
      outflow          ///< the fluid leaves: no conduction across, k dT/dn = 0
    };
    std::string role;
    Type        type;
    double      temperature = 0.; ///< [K]: wall, surrounding or (uniform) inlet temperature
    double      coefficient = 0.; ///< h [W/(m^2 K)], for heat_transfer
    /// An inlet's temperature across the role from Inlet temperature files: (position, T [K]) rows,
    /// positions increasing along coordinate `profile_axis` (0: x or r, 1: y or z). Empty: uniform.
    std::vector<std::pair<double, double>> profile;
    int                                    profile_axis = 0;

    /// The temperature at the point (x0, x1) of the role [K]: `temperature`, or the profile
    /// interpolated linearly (beyond its ends, the end values).
    double temperature_at(double x0, double x1) const;
  };

  /// A thermal condition's key under Heat, e.g. "Set temperature", and its meaning.
  struct ThermalConditionKey
  {
    const char             *key;
    ThermalCondition::Type type;
    const char             *documentation;
  };

  /// Every thermal condition key, in the order a case file's roles are assigned.
  const std::vector<ThermalConditionKey> &thermal_condition_keys();

  /// subsection Heat: the energy equation, its conditions by role as written, and the coupling.
  struct HeatSection
  {
    bool energy_equation = false;
    bool viscous_heating = true;
    /// Role lists, in the order of thermal_condition_keys().
    std::vector<std::vector<std::string>> roles;
    std::vector<double> wall_temperatures;        ///< [K], one per Set temperature role
    std::vector<double> transfer_coefficients;    ///< [W/(m^2 K)], one per Heat transfer role
    std::vector<double> surrounding_temperatures; ///< [K], one per Heat transfer role
    std::vector<double> inlet_temperatures;       ///< [K], one per Inlet temperature role; empty: the melt's
    std::vector<std::string> inlet_temperature_files; ///< CSV profiles, one per Inlet temperature role, or none
    unsigned int        coupling_iterations = 40;
    double              coupling_tolerance  = 1e-6; ///< [K] largest temperature change between passes
    bool                isothermal_comparison = true;

    void bind(SectionKeys &keys);
  };

  /// subsection Output.
  struct OutputSection
  {
    std::string folder;               ///< "" : out/<case name>
    bool        write_fields   = true;
    bool        write_pictures = true;

    void bind(SectionKeys &keys);
  };
} // namespace lentus::input
