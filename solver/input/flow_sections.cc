#include "solver/input/flow_sections.h"

#include "meshes/geometry.h"
#include "meshes/gmsh_mesh.h"
#include "solver/input/section_keys.h"

#include <algorithm>
#include <cmath>

namespace lentus::input
{
  using rheology::Range;

  const std::vector<ConditionKey> &condition_keys()
  {
    static const std::vector<ConditionKey> keys = {
      {"No-slip", BoundaryCondition::Type::no_slip, "Roles where the fluid sticks to a fixed wall: u = 0."},
      {"Moving wall", BoundaryCondition::Type::moving_wall,
       "Roles of walls that move: u = Wall velocity + Rotation rate x r (swirl: u_theta = Rotation rate * r)."},
      {"Pressure", BoundaryCondition::Type::pressure,
       "Roles of fully developed inlets and outlets at a set pressure (Pressure values): tangential velocity 0, "
       "normal stress -p."},
      {"Traction-free", BoundaryCondition::Type::traction_free,
       "Roles of outflows with zero traction (do-nothing); not exact for developed flow at a die exit."},
      {"Symmetry", BoundaryCondition::Type::symmetry, "Roles of symmetry planes or slip walls: u . n = 0."},
      {"Axis", BoundaryCondition::Type::axis, "Roles on the axis r = 0 (axisymmetric): u_r = 0, u_theta = 0."},
      {"Inflow", BoundaryCondition::Type::inflow,
       "Roles where the fluid enters fully developed, with the profile of its own viscosity law carrying the "
       "flow rate of Inflow rates (a slit from wall to wall or half of one beside a Symmetry role; a pipe "
       "from the axis to the wall, or an annulus between two walls)."},
      {"Uniform inflow", BoundaryCondition::Type::uniform_inflow,
       "Roles where the fluid enters with the same normal speed everywhere (Inflow speeds), e.g. a plug "
       "or a far-field stream; the tangential velocity is 0."},
      {"Impeller", BoundaryCondition::Type::impeller,
       "Roles that turn with the impeller at Operating point/Rotation speed N: u_theta = 2 pi N r (swirl), "
       "u = 2 pi N e_z x r (planar, fixed frame); at rest when solved in the impeller's frame."},
    };
    return keys;
  }

  void GeometrySection::bind(SectionKeys &keys)
  {
    std::vector<std::string> shape_names;
    for (const meshes::ShapeInfo &info : meshes::shapes())
      shape_names.push_back(info.name);
    shape_names.push_back(meshes::gmsh_mesh_shape);
    keys.selection("Shape", shape, shape_names,
              "Which shape; its dimensions (for Gmsh mesh: the mesh file) are set in the subsection of the "
              "same name.");
    keys.integer("Refinement", refinement, 0, 12,
                 "Number of uniform refinements of the coarse mesh (each halves the cell size).");
  }

  void GmshMeshSection::bind(SectionKeys &keys)
  {
    keys.text("File", file,
              "Path of a 2D quadrilateral mesh saved by Gmsh (MSH 2.2 or 4.1, ASCII), relative to the case "
              "file's folder; the names of its physical curves are the boundary roles.");
    keys.real("Scale", scale, Range::above(0.), "Length of one mesh unit [m], e.g. 0.001 for a mesh drawn in millimetres.");
  }

  void FlowSection::bind(SectionKeys &keys)
  {
    keys.choice<FormulationKind>("Velocity components", formulation,
                                 {{"x y", FormulationKind::planar},
                                  {"r z", FormulationKind::axisymmetric},
                                  {"r z theta", FormulationKind::swirl}},
                                 "The velocity components solved for. x y: planar flow (u_x, u_y), totals per metre "
                                 "of depth; r z: axisymmetric flow (u_r, u_z) with the mesh's x as the radius r and "
                                 "y as the axial coordinate z; r z theta: axisymmetric with swirl, also the "
                                 "circumferential u_theta.");
    keys.boolean("Inertia", inertia, "Include the inertia term rho (u . grad) u (needs Rheology/Density).");
    std::vector<double> g(gravity.begin(), gravity.end());
    keys.reals("Gravity", g, Range::any(),
               "Body force per unit mass g [m/s^2], two mesh components (x, y) or (r, z); needs Density if not 0.", 2);
    gravity = {{g[0], g[1]}};
    keys.choice<ReferenceFrame>("Reference frame", frame,
                                {{"fixed", ReferenceFrame::fixed}, {"impeller", ReferenceFrame::impeller}},
                                "fixed: the laboratory frame; impeller (planar only): the frame turning with the "
                                "impeller at the rotation speed, where a bladed impeller's flow is steady; fixed "
                                "walls then move at -2 pi N e_z x r, and with inertia the Coriolis and centrifugal "
                                "forces act.");
    keys.integer("Velocity degree", velocity_degree, 2, 4,
                 "Polynomial degree of the velocity (Taylor-Hood: pressure one lower).");
  }

  void OperatingPointSection::bind(SectionKeys &keys)
  {
    keys.real("Rotation speed", rotation_speed, Range::at_least(0.),
              "N [rev/s]: rotation speed of the roles listed under Boundary conditions/Impeller "
              "(counter-clockwise about the axis or the origin).");
  }

  void VesselSection::bind(SectionKeys &keys)
  {
    keys.real("Metzner-Otto constant", metzner_otto_constant, Range::above(0.),
              "k_s [-]: effective shear rate k_s N for the apparent viscosity of the Metzner-Otto Reynolds "
              "number (Metzner & Otto 1957; about 10-13 for turbines).");
    keys.real("Dead-zone speed fraction", dead_zone_fraction, Range::at_least(0.),
              "[-]: fluid slower than this fraction of the impeller tip speed pi N D counts as dead, as "
              "does unyielded fluid.");
  }

  void BoundaryConditionsSection::bind(SectionKeys &keys)
  {
    roles.resize(condition_keys().size());
    for (std::size_t c = 0; c < condition_keys().size(); ++c)
      keys.names(condition_keys()[c].key, roles[c],
                 std::string(condition_keys()[c].documentation) + " Comma-separated role names of the shape.");
    keys.reals("Pressure values", pressures, Range::any(),
               "p [Pa] for each role listed under Pressure, in the same order.");
    keys.reals("Inflow rates", inflow_rates, Range::any(),
               "Q into the domain for each role listed under Inflow, in order: [m^3/s] axisymmetric, "
               "[m^2/s] per metre of depth planar.");
    keys.reals("Inflow mass rates", inflow_mass_rates, Range::any(),
               "Instead of Inflow rates: mass flow rate into the domain for each role listed under Inflow, in "
               "order: [kg/s] axisymmetric, [kg/(s m)] per metre of depth planar; divided by Rheology/Density.");
    keys.reals("Inflow speeds", inflow_speeds, Range::any(),
               "U [m/s] normal speed into the domain for each role listed under Uniform inflow, in order.");
    keys.reals("Wall velocity", wall_velocity, Range::any(),
               "[m/s] velocity of the moving walls, two mesh components (x, y) or (r, z).", 2);
    keys.real("Rotation rate", rotation_rate, Range::any(),
              "Omega [rad/s] of the moving walls about the axis (swirl) or the origin (planar).");
  }

  void NonlinearSolverSection::bind(SectionKeys &keys)
  {
    keys.real("Relative tolerance", relative_tolerance, Range::above(0.),
              "Converged when the residual norm falls below this fraction of the first one [-].");
    keys.real("Absolute tolerance", absolute_tolerance, Range::at_least(0.),
              "... or below this absolute value (residual in N per radian or per metre depth).");
    keys.integer("Maximum iterations", max_iterations, 1, 10000, "Newton and Picard iterations per solve.");
    keys.real("Picard until", picard_until, Range::above(0.),
              "Picard steps while residual / first residual is above this, then Newton [-].");
    keys.integer("Maximum Picard steps", max_picard_steps, 0, 10000, "Picard steps at most before Newton takes over.");
    keys.choice<LineSearch>("Line search", line_search,
                            {{"residual", LineSearch::residual}, {"energy", LineSearch::energy}},
                            "How far along each Newton or Picard step to go. residual: halve the step until the "
                            "residual norm falls; energy: the step length where the slope of the flow's energy "
                            "along the step, R(x + s dx) . dx, vanishes (regula falsi; creeping flow only, whose "
                            "residual is the gradient of a convex energy). residual took fewer steps on the "
                            "yield-stress cases measured.");
    keys.choice<NewtonLinearization>(
      "Newton linearization", linearization,
      {{"primal", NewtonLinearization::primal}, {"primal-dual", NewtonLinearization::primal_dual}},
      "primal: Newton's exact Jacobian in velocity and pressure, after Picard steps (Picard until, "
      "Maximum Picard steps); primal-dual: the stress is a second iterate at the quadrature points, "
      "updated by its own linearization and bounded by the law's stress at the new shear rate, which "
      "keeps Newton's model sound where the shear rate is small or turns (yield-stress and strongly "
      "shear-thinning fluids), and needs no Picard steps from a start next to the solution in creeping flow; the same solution "
      "either way.");
    keys.boolean("Continuation", continuation,
                 "When a solve fails, approach the case by continuation from an easier one: in the density "
                 "(Reynolds number) with inertia, else in what the viscosity law names (the regularization "
                 "exponent M of a yield-stress fluid, or the flow index from 1).");
    keys.choice<std::optional<unsigned int>>(
      "Mesh sequencing", mesh_sequencing,
      {{"automatic", std::nullopt}, {"0", 0u}, {"1", 1u}, {"2", 2u}, {"3", 3u}, {"4", 4u}},
      "Solve first on meshes this many levels coarser than Geometry/Refinement, each finer mesh "
      "starting from the solution interpolated from the one before: fewer and cheaper Newton steps "
      "on large meshes. automatic: none up to 30000 unknowns; above, at least 2 levels and as many "
      "as bring the first mesh down to about 15000 unknowns (at most 4).");
  }

  void LinearSolverSection::bind(SectionKeys &keys)
  {
    keys.choice<LinearSolverType>("Type", type,
                                  {{"automatic", LinearSolverType::automatic},
                                   {"direct", LinearSolverType::direct},
                                   {"iterative", LinearSolverType::iterative}},
                                  "direct: sparse LU (MUMPS); iterative: FGMRES with a block-triangular "
                                  "preconditioner (AMG on velocity, 1/eta-weighted pressure mass matrix).");
    keys.integer("Direct up to", direct_limit, 1, 1000000000,
                 "automatic chooses the direct solver up to this many unknowns (it took 2.8 GiB at 592 387 "
                 "unknowns on one rank), the iterative one above.");
  }

  void AccuracySection::bind(SectionKeys &keys)
  {
    keys.integer("Coarser meshes", coarser_meshes, 0, 4,
                 "Solve on at least this many coarser meshes first (each with half the cells' size; as many as "
                 "Geometry/Refinement allows), so that every design number gets a mesh error from the sequence "
                 "(2: three meshes, Richardson extrapolation with the observed order; 1: two meshes, a cruder "
                 "bound; 0: only the meshes Nonlinear solver/Mesh sequencing solves anyway) [-].");
    keys.integer("Adaptive cycles", adaptive_cycles, 0, 30,
                 "Refinement cycles after the case's mesh, each refining the cells chosen by Refine at and "
                 "solving again from the previous solution; with a Target relative error, at most this many [-].");
    keys.choices<RefineAt>("Refine at", refine_at,
                           {{"yield surface", RefineAt::yield_surface},
                            {"velocity jumps", RefineAt::velocity_jumps},
                            {"everywhere", RefineAt::everywhere}},
                           "Where adaptive cycles refine: yield surface (cells where |tau| - tau_y changes sign or "
                           "lies within Yield band; yield-stress fluids only), velocity jumps (jumps of the velocity "
                           "gradient across faces, Kelly et al. 1983: corners, tips, thin layers), everywhere "
                           "(uniform refinement).");
    keys.real("Refined fraction", refined_fraction, Range::closed(0.01, 1.),
              "Fraction of the cells refined in each adaptive cycle, those with the largest indicator [-].");
    keys.real("Coarsened fraction", coarsened_fraction, Range::closed(0., 0.5),
              "Fraction of the cells, those with the smallest indicator (e.g. deep inside rigid plugs and dead "
              "zones), coarsened in each adaptive cycle where they were refined before [-].");
    keys.real("Yield band", yield_band, Range::closed(0., 1.),
              "Yield surface refinement also takes cells where | |tau| / tau_y - 1 | is below this [-].");
    keys.optional_real("Target relative error", target_relative_error, Range::above(0.),
                       "Adaptive cycles stop once the error bar of every targeted number is below this fraction of "
                       "its value [-]; not set: all Adaptive cycles are run.");
    keys.names("Targeted numbers", targeted_numbers,
               "Design numbers (names or symbols, as in summary.json) that Target relative error applies to; "
               "empty: the key numbers of the case.");
    keys.optional_real("Maximum unknowns", maximum_unknowns, Range::above(0.),
                       "Budget: no adaptive cycle whose mesh would exceed this many unknowns (predicted from the cells it "
                       "would refine, with 10% to spare) [-]; not set: none.");
    keys.optional_real("Maximum wall time", maximum_wall_time, Range::above(0.),
                       "Budget: no new adaptive cycle once the run has taken this long [s]; not set: none.");
    keys.boolean("Regularization check", regularization_check,
                 "Yield-stress fluids regularized after Papanastasiou: solve once more on the final mesh at "
                 "Regularization factor x M and give every design number a regularization error.");
    keys.real("Regularization factor", regularization_factor, Range::closed(1.5, 100.),
              "The larger regularization exponent of the check, as a multiple of the case's M [-].");
  }

  const std::vector<ThermalConditionKey> &thermal_condition_keys()
  {
    static const std::vector<ThermalConditionKey> keys = {
      {"Set temperature", ThermalCondition::Type::set_temperature,
       "Roles held at a set temperature (Wall temperatures), e.g. a die body at its heater setting."},
      {"Insulated", ThermalCondition::Type::insulated,
       "Roles through which no heat flows: adiabatic walls, the axis and symmetry planes."},
      {"Heat transfer", ThermalCondition::Type::heat_transfer,
       "Roles that exchange heat with surroundings at a set temperature: heat flow into the fluid "
       "h (T_surrounding - T) per unit area (Heat transfer coefficients, Surrounding temperatures)."},
      {"Inlet temperature", ThermalCondition::Type::inlet,
       "Roles where the fluid enters at a set temperature (Inlet temperatures, or Operating point/Temperature)."},
      {"Outflow", ThermalCondition::Type::outflow,
       "Roles where the fluid leaves; no conduction across them (k dT/dn = 0). Their flow-weighted mean "
       "temperature is reported."},
    };
    return keys;
  }

  double ThermalCondition::temperature_at(const double x0, const double x1) const
  {
    if (profile.empty())
      return temperature;
    const double position = profile_axis == 0 ? x0 : x1;
    if (position <= profile.front().first)
      return profile.front().second;
    if (position >= profile.back().first)
      return profile.back().second;
    const auto upper = std::lower_bound(profile.begin(), profile.end(), std::make_pair(position, -HUGE_VAL));
    const auto lower = upper - 1;
    const double t   = (position - lower->first) / (upper->first - lower->first);
    return lower->second + t * (upper->second - lower->second);
  }

  void HeatSection::bind(SectionKeys &keys)
  {
    keys.boolean("Energy equation", energy_equation,
                 "Solve for the temperature field with the flow: rho c_p u . grad T = div(k grad T) + eta "
                 "gamma_dot^2, the viscosity at the local temperature through Rheology/Temperature shift. Needs "
                 "Rheology/Density, Heat capacity, Thermal conductivity and Operating point/Temperature (the "
                 "melt's temperature, also that of the isothermal comparison).");
    keys.boolean("Viscous heating", viscous_heating, "Include the viscous dissipation eta gamma_dot^2 as heat source.");
    roles.resize(thermal_condition_keys().size());
    for (std::size_t c = 0; c < thermal_condition_keys().size(); ++c)
      keys.names(thermal_condition_keys()[c].key, roles[c],
                 std::string(thermal_condition_keys()[c].documentation) + " Comma-separated role names of the shape.");
    keys.reals("Wall temperatures", wall_temperatures, Range::above(0.),
               "T [K] for each role listed under Set temperature, in the same order.");
    keys.reals("Heat transfer coefficients", transfer_coefficients, Range::at_least(0.),
               "h [W/(m^2 K)] for each role listed under Heat transfer, in the same order.");
    keys.reals("Surrounding temperatures", surrounding_temperatures, Range::above(0.),
               "T [K] of the surroundings of each role listed under Heat transfer, in the same order.");
    keys.reals("Inlet temperatures", inlet_temperatures, Range::above(0.),
               "T [K] for each role listed under Inlet temperature, in order; empty: all at Operating "
               "point/Temperature.");
    keys.names("Inlet temperature files", inlet_temperature_files,
               "Instead of Inlet temperatures: a CSV file for each role listed under Inlet temperature, in order, "
               "relative to the case file's folder, with the temperature across the role: a header 'r [m],temperature "
               "[K]' (or x, y, z: the coordinate that varies along the role), then rows of position and "
               "temperature, positions increasing; linear between rows, the end values beyond them.");
    keys.integer("Coupling iterations", coupling_iterations, 1, 1000,
                 "Passes at most of the split solve: energy equation at the current flow, then the flow at the "
                 "new temperatures.");
    keys.real("Coupling tolerance", coupling_tolerance, Range::above(0.),
              "The coupled solve has converged when no temperature changes by more than this between two "
              "passes [K].");
    keys.boolean("Isothermal comparison", isothermal_comparison,
                 "Solve the flow first at the uniform Operating point/Temperature and report its pressures "
                 "beside the non-isothermal ones.");
  }

  void OutputSection::bind(SectionKeys &keys)
  {
    keys.text("Folder", folder, "Folder for the results; default out/<case name> next to the working directory.");
    keys.boolean("Write fields", write_fields, "Write VTU/PVD field files.");
    keys.boolean("Write pictures", write_pictures,
                 "lentus run: draw PNG pictures and report.html into the folder (scripts/draw_case.py, needs "
                 "python3-matplotlib); not in sweeps.");
  }
} // namespace lentus::input
