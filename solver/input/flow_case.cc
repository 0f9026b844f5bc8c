#include "solver/input/flow_case.h"

#include "meshes/gmsh_mesh.h"
#include "solver/errors.h"

#include <algorithm>
#include <cmath>
#include <filesystem>
#include <map>
#include <set>

namespace lentus::input
{
  namespace
  {
    using rheology::Range;

    struct ConditionKey
    {
      const char               *key;
      BoundaryCondition::Type   type;
      const char               *documentation;
    };

    const ConditionKey condition_keys[] = {
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

    const std::string conditions = "Boundary conditions/";

    /// `complete` (a case's complete text) with the Gmsh mesh file given by its absolute path.
    std::string with_absolute_mesh_file(std::string complete, const std::string &mesh_file)
    {
      const auto section = complete.find("subsection " + meshes::gmsh_mesh_shape + "\n");
      const auto key     = section == std::string::npos ? section : complete.find("set File", section);
      const auto equals  = key == std::string::npos ? key : complete.find('=', key);
      if (equals == std::string::npos)
        return complete;
      const auto end = complete.find_first_of("#\n", equals);
      return complete.replace(equals, end - equals,
                              "= " + std::filesystem::absolute(mesh_file).lexically_normal().string() + " ");
    }

    /// The developed inflow profile spans a straight segment: wall to wall (planar), or at constant
    /// y = z from the axis x = 0 or between two walls (axisymmetric). Built-in shapes are made so.
    void inflow_fits(const CaseFile &file, const std::string &key, const std::string &role,
                     const meshes::GmshMesh &mesh, const FormulationKind formulation, const std::string &where)
    {
      const auto   box  = mesh.role_box(role);
      const double size = std::max(box[1] - box[0], box[3] - box[2]);
      const auto   text = [&](const int d) {
        return rheology::format_short(box[2 * d]) + " to " + rheology::format_short(box[2 * d + 1]);
      };
      if (is_axisymmetric(formulation) && box[3] - box[2] > 1e-10 * size)
        file.fail(key, "role '" + role + "' of " + where + " spans x (r) from " + text(0) + " m and y (z) from " +
                         text(1) + " m",
                  "an axisymmetric inflow at one z, from the axis r = 0 to a wall or between two walls");
      if (box[1] - box[0] > 1e-10 * size && box[3] - box[2] > 1e-10 * size)
        file.fail(key, "role '" + role + "' of " + where + " spans x from " + text(0) + " m and y from " + text(1) +
                         " m: not one straight segment",
                  "an inflow on one straight segment from wall to wall");
    }
  } // namespace

  void declare_flow_case(CaseSchema &schema)
  {
    std::vector<std::string> shape_names;
    for (const meshes::ShapeInfo &shape : meshes::shapes())
      {
        shape_names.push_back(shape.name);
        for (const rheology::ParameterInfo &parameter : shape.parameters)
          schema.declare("Geometry/" + shape.name + "/" + parameter.key,
                         parameter.has_default() ? rheology::format_value(parameter.default_value) : "",
                         ValueKind::real(parameter.range),
                         parameter.symbol + " [" + parameter.unit + "]: " + parameter.meaning + ".");
      }
    shape_names.push_back(meshes::gmsh_mesh_shape);
    schema.declare("Geometry/" + meshes::gmsh_mesh_shape + "/File", "", ValueKind::text(),
                   "Path of a 2D quadrilateral mesh saved by Gmsh (MSH 2.2 or 4.1, ASCII), relative to the case "
                   "file's folder; the names of its physical curves are the boundary roles.");
    schema.declare("Geometry/" + meshes::gmsh_mesh_shape + "/Scale", "1", ValueKind::real(Range::above(0.)),
                   "Length of one mesh unit [m], e.g. 0.001 for a mesh drawn in millimetres.");
    schema.declare("Geometry/Shape", "", ValueKind::selection(shape_names),
                   "Which shape; its dimensions (for Gmsh mesh: the mesh file) are set in the subsection of the "
                   "same name.");
    schema.declare("Geometry/Refinement", "3", ValueKind::integer(0, 12),
                   "Number of uniform refinements of the coarse mesh (each halves the cell size).");

    schema.declare("Flow/Formulation", "planar",
                   ValueKind::selection({"planar", "axisymmetric", "axisymmetric with swirl"}),
                   "planar: (x, y) per unit depth; axisymmetric: (r, z) with x = r; with swirl: also u_theta.");
    schema.declare("Flow/Inertia", "false", ValueKind::boolean(),
                   "Include the inertia term rho (u . grad) u (needs Rheology/Density).");
    schema.declare("Flow/Gravity", "0, 0", ValueKind::real_list(Range::any()),
                   "Body force per unit mass g [m/s^2], two mesh components (x, y) or (r, z); needs Density if not 0.");
    schema.declare("Flow/Reference frame", "fixed", ValueKind::selection({"fixed", "impeller"}),
                   "fixed: the laboratory frame; impeller (planar only): the frame turning with the impeller "
                   "at the rotation speed, where a bladed impeller's flow is steady; fixed walls then move at "
                   "-2 pi N e_z x r, and with inertia the Coriolis and centrifugal forces act.");
    schema.declare("Operating point/Rotation speed", "0", ValueKind::real(Range::at_least(0.)),
                   "N [rev/s]: rotation speed of the roles listed under Boundary conditions/Impeller "
                   "(counter-clockwise about the axis or the origin).");
    schema.declare("Vessel/Metzner-Otto constant", "11.5", ValueKind::real(Range::above(0.)),
                   "k_s [-]: effective shear rate k_s N for the apparent viscosity of the Metzner-Otto Reynolds "
                   "number (Metzner & Otto 1957; about 10-13 for turbines).");
    schema.declare("Vessel/Dead-zone speed fraction", "0.01", ValueKind::real(Range::at_least(0.)),
                   "[-]: fluid slower than this fraction of the impeller tip speed pi N D counts as dead, as "
                   "does unyielded fluid.");
    schema.declare("Flow/Velocity degree", "2", ValueKind::integer(2, 4),
                   "Polynomial degree of the velocity (Taylor-Hood: pressure one lower).");

    for (const ConditionKey &condition : condition_keys)
      schema.declare(conditions + condition.key, "", ValueKind::text(),
                     std::string(condition.documentation) + " Comma-separated role names of the shape.");
    schema.declare(conditions + "Pressure values", "", ValueKind::real_list(Range::any()),
                   "p [Pa] for each role listed under Pressure, in the same order.");
    schema.declare(conditions + "Inflow rates", "", ValueKind::real_list(Range::any()),
                   "Q into the domain for each role listed under Inflow, in order: [m^3/s] axisymmetric, "
                   "[m^2/s] per metre of depth planar.");
    schema.declare(conditions + "Inflow mass rates", "", ValueKind::real_list(Range::any()),
                   "Instead of Inflow rates: mass flow rate into the domain for each role listed under Inflow, in "
                   "order: [kg/s] axisymmetric, [kg/(s m)] per metre of depth planar; divided by Rheology/Density.");
    schema.declare(conditions + "Inflow speeds", "", ValueKind::real_list(Range::any()),
                   "U [m/s] normal speed into the domain for each role listed under Uniform inflow, in order.");
    schema.declare(conditions + "Wall velocity", "0, 0", ValueKind::real_list(Range::any()),
                   "[m/s] velocity of the moving walls, two mesh components (x, y) or (r, z).");
    schema.declare(conditions + "Rotation rate", "0", ValueKind::real(Range::any()),
                   "Omega [rad/s] of the moving walls about the axis (swirl) or the origin (planar).");

    schema.declare("Nonlinear solver/Relative tolerance", "1e-8", ValueKind::real(Range::above(0.)),
                   "Converged when the residual norm falls below this fraction of the first one [-].");
    schema.declare("Nonlinear solver/Absolute tolerance", "1e-12", ValueKind::real(Range::at_least(0.)),
                   "... or below this absolute value (residual in N per radian or per metre depth).");
    schema.declare("Nonlinear solver/Maximum iterations", "60", ValueKind::integer(1, 10000),
                   "Newton and Picard iterations per solve.");
    schema.declare("Nonlinear solver/Picard until", "1e-2", ValueKind::real(Range::above(0.)),
                   "Picard steps while residual / first residual is above this, then Newton [-].");
    schema.declare("Nonlinear solver/Maximum Picard steps", "10", ValueKind::integer(0, 10000),
                   "Picard steps at most before Newton takes over.");
    schema.declare("Nonlinear solver/Continuation", "true", ValueKind::boolean(),
                   "When a solve fails, approach the case by continuation (Regularization exponent M, "
                   "then flow index) from an easier one.");
    schema.declare("Nonlinear solver/Mesh sequencing", "automatic",
                   ValueKind::selection({"automatic", "0", "1", "2", "3", "4"}),
                   "Solve first on meshes this many levels coarser than Geometry/Refinement, each finer mesh "
                   "starting from the solution interpolated from the one before: fewer and cheaper Newton steps "
                   "on large meshes. automatic: none up to 30000 unknowns; above, at least 2 levels and as many "
                   "as bring the first mesh down to about 15000 unknowns (at most 4).");
    schema.declare("Linear solver/Type", "automatic", ValueKind::selection({"automatic", "direct", "iterative"}),
                   "direct: sparse LU (MUMPS); iterative: FGMRES with a block-triangular preconditioner "
                   "(AMG on velocity, 1/eta-weighted pressure mass matrix).");
    schema.declare("Linear solver/Direct up to", "250000", ValueKind::integer(1, 1000000000),
                   "automatic chooses the direct solver up to this many unknowns.");
    schema.declare("Output/Folder", "", ValueKind::text(),
                   "Folder for the results; default out/<case name> next to the working directory.");
    schema.declare("Output/Write fields", "true", ValueKind::boolean(), "Write VTU/PVD field files.");
    schema.declare("Output/Write pictures", "true", ValueKind::boolean(),
                   "lentus run: draw PNG pictures and report.html into the folder (scripts/draw_case.py, needs "
                   "python3-matplotlib); not in sweeps.");
  }

  void read_geometry(const CaseFile &file, FlowCase &flow)
  {
    flow.case_file = file.file_name();
    flow.case_name = std::filesystem::path(file.file_name()).stem().string();

    flow.shape_name = file.get("Geometry/Shape");
    if (flow.shape_name.empty())
      {
        std::string list;
        for (const meshes::ShapeInfo &shape : meshes::shapes())
          list += (list.empty() ? "" : ", ") + shape.name;
        file.fail("Geometry/Shape", "missing", "one of " + list + ", " + meshes::gmsh_mesh_shape);
      }
    const meshes::GmshMesh *imported = nullptr;
    if (flow.shape_name == meshes::gmsh_mesh_shape)
      {
        const std::string key  = "Geometry/" + meshes::gmsh_mesh_shape + "/File";
        const std::string name = file.get(key);
        if (name.empty())
          file.fail(key, "missing", "the path of a Gmsh .msh file, relative to the case file's folder");
        // Relative to the case file, not to the working directory.
        flow.mesh_file = (std::filesystem::path(file.file_name()).parent_path() / name).lexically_normal().string();
        if (std::filesystem::path(name).is_absolute())
          flow.mesh_file = name;
        try
          {
            auto mesh = std::make_unique<meshes::GmshMesh>(
              flow.mesh_file, file.get_real("Geometry/" + meshes::gmsh_mesh_shape + "/Scale"));
            imported      = mesh.get();
            flow.geometry = std::move(mesh);
          }
        catch (const rheology::InvalidParameter &error)
          {
            file.fail(key, error.problem, error.allowed);
          }
      }
    else
      {
        const meshes::ShapeInfo &shape         = meshes::find_shape(flow.shape_name);
        const std::string        shape_section = "Geometry/" + shape.name + "/";
        for (const rheology::ParameterInfo &parameter : shape.parameters)
          flow.shape_values.push_back(file.get_real(shape_section + parameter.key));
        try
          {
            flow.geometry = shape.create(flow.shape_values);
          }
        catch (const rheology::InvalidParameter &error)
          {
            file.fail(shape_section + error.key, error.problem, error.allowed);
          }
      }
    flow.refinement = static_cast<unsigned int>(file.get_real("Geometry/Refinement"));

    const std::string formulation = file.get("Flow/Formulation");
    flow.formulation = formulation == "planar"         ? FormulationKind::planar :
                       formulation == "axisymmetric"   ? FormulationKind::axisymmetric :
                                                         FormulationKind::swirl;
    const meshes::Symmetry symmetry = flow.geometry->symmetry();
    if (symmetry == meshes::Symmetry::planar_only && is_axisymmetric(flow.formulation))
      file.fail("Flow/Formulation", "shape " + flow.shape_name + " is planar", "planar");
    if (symmetry == meshes::Symmetry::axisymmetric_only && !is_axisymmetric(flow.formulation))
      file.fail("Flow/Formulation", "shape " + flow.shape_name + " is axisymmetric",
                "axisymmetric, or axisymmetric with swirl");
    if (imported && is_axisymmetric(flow.formulation))
      {
        const std::string problem = imported->negative_radius();
        if (!problem.empty())
          file.fail("Geometry/" + meshes::gmsh_mesh_shape + "/File",
                    problem + ", but Flow/Formulation = " + formulation + " takes x as the radius r",
                    "a mesh with x >= 0 (the axis at x = 0), or Flow/Formulation = planar");
      }
    flow.velocity_degree = static_cast<unsigned int>(file.get_real("Flow/Velocity degree"));
  }

  FlowCase read_flow_case(const CaseFile &file)
  {
    FlowCase flow;
    flow.fluid = read_fluid(file);
    read_geometry(file, flow);
    // "shape Channel", or "Gmsh mesh meshes/die.msh" in messages.
    const std::string shape_name = flow.mesh_file.empty() ?
                                     "shape " + flow.shape_name :
                                     "Gmsh mesh " + file.get("Geometry/" + meshes::gmsh_mesh_shape + "/File");

    flow.inertia = file.get("Flow/Inertia") == "true";
    const auto gravity = split_list(file.get("Flow/Gravity"));
    if (gravity.size() != 2)
      file.fail("Flow/Gravity", "needs two components", "two real numbers, e.g. 0, -9.81");
    flow.gravity[0] = *parse_real(gravity[0]);
    flow.gravity[1] = *parse_real(gravity[1]);
    if ((flow.inertia || flow.gravity[0] != 0. || flow.gravity[1] != 0.) && std::isnan(flow.fluid.density))
      file.fail("Rheology/Density", "missing; inertia and gravity need it", "a density > 0 kg/m^3");

    // Boundary conditions: every listed role exists, every role gets exactly one condition.
    std::map<std::string, std::string> assigned; // role -> key that assigned it
    const auto                         roles = flow.geometry->role_names();
    std::string                        role_list;
    for (const std::string &role : roles)
      role_list += (role_list.empty() ? "" : ", ") + role;
    std::vector<double> pressures;
    for (const std::string &value : split_list(file.get(conditions + "Pressure values")))
      pressures.push_back(*parse_real(value));
    unsigned int        pressure_index = 0;
    // Inflow rates by volume, or by mass divided by the density.
    const std::string   mass_key  = conditions + "Inflow mass rates";
    const std::string   rates_key = file.is_set(mass_key) ? mass_key : conditions + "Inflow rates";
    const double        per_rate  = rates_key == mass_key ? 1. / flow.fluid.density : 1.;
    if (rates_key == mass_key && file.is_set(conditions + "Inflow rates"))
      file.fail(mass_key, "Inflow rates is set too (line " + std::to_string(file.line_of(conditions + "Inflow rates")) +
                            ")",
                "either Inflow rates [m^3/s] or Inflow mass rates [kg/s], one value per role under Inflow");
    if (rates_key == mass_key && std::isnan(flow.fluid.density))
      file.fail(mass_key, "a mass rate needs the fluid's density, and Rheology/Density is not set",
                "Rheology/Density [kg/m^3] set, or volume rates under Inflow rates instead");
    std::vector<double> inflow_rates;
    for (const std::string &value : split_list(file.get(rates_key)))
      inflow_rates.push_back(*parse_real(value) * per_rate);
    unsigned int inflow_index = 0;
    std::vector<double> speeds;
    for (const std::string &value : split_list(file.get(conditions + "Inflow speeds")))
      speeds.push_back(*parse_real(value));
    unsigned int speed_index = 0;
    for (const ConditionKey &condition : condition_keys)
      {
        const std::string key = conditions + condition.key;
        for (const std::string &role : split_list(file.get(key)))
          {
            if (std::find(roles.begin(), roles.end(), role) == roles.end())
              file.fail(key, "'" + role + "' is not a boundary role of " + shape_name,
                        "role names among " + role_list);
            if (assigned.count(role))
              file.fail(key, "role '" + role + "' already has a condition (" + assigned[role] + ")",
                        "one condition per role");
            if (condition.type == BoundaryCondition::Type::axis && !is_axisymmetric(flow.formulation))
              file.fail(key, "an axis condition needs an axisymmetric formulation", "no Axis roles when planar");
            if (const auto *imported = dynamic_cast<const meshes::GmshMesh *>(flow.geometry.get()))
              if (condition.type == BoundaryCondition::Type::pressure ||
                  condition.type == BoundaryCondition::Type::symmetry ||
                  condition.type == BoundaryCondition::Type::inflow ||
                  condition.type == BoundaryCondition::Type::uniform_inflow)
                {
                  const std::string problem = imported->not_axis_parallel(role);
                  if (!problem.empty())
                    file.fail(key, problem + " in " + shape_name,
                              "for Pressure, Symmetry, Inflow and Uniform inflow: roles whose sides all run along x or "
                              "all along y");
                  if (condition.type == BoundaryCondition::Type::inflow)
                    inflow_fits(file, key, role, *imported, flow.formulation, shape_name);
                }
            assigned[role] = condition.key;
            BoundaryCondition bc{role, condition.type, 0.};
            if (condition.type == BoundaryCondition::Type::pressure)
              {
                if (pressure_index >= pressures.size())
                  file.fail(conditions + "Pressure values",
                            "fewer values than roles under Pressure", "one pressure [Pa] per role, in order");
                bc.pressure = pressures[pressure_index++];
              }
            if (condition.type == BoundaryCondition::Type::inflow)
              {
                if (inflow_index >= inflow_rates.size())
                  file.fail(rates_key, "fewer values than roles under Inflow",
                            "one flow rate per role, in order");
                bc.flow_rate = inflow_rates[inflow_index++];
              }
            if (condition.type == BoundaryCondition::Type::uniform_inflow)
              {
                if (speed_index >= speeds.size())
                  file.fail(conditions + "Inflow speeds", "fewer values than roles under Uniform inflow",
                            "one speed [m/s] per role, in order");
                bc.speed = speeds[speed_index++];
              }
            flow.conditions.push_back(bc);
          }
      }
    if (pressure_index != pressures.size())
      file.fail(conditions + "Pressure values", "more values than roles under Pressure",
                "one pressure [Pa] per role, in order");
    if (inflow_index != inflow_rates.size())
      file.fail(rates_key, "more values than roles under Inflow", "one flow rate per role, in order");
    if (speed_index != speeds.size())
      file.fail(conditions + "Inflow speeds", "more values than roles under Uniform inflow",
                "one speed [m/s] per role, in order");
    for (const std::string &role : roles)
      if (!assigned.count(role))
        file.fail(conditions + "No-slip", "boundary role '" + role + "' of " + shape_name + " has no condition",
                  "every role (" + role_list + ") listed under exactly one of No-slip, Moving wall, Pressure, "
                  "Traction-free, Symmetry, Axis, Inflow, Uniform inflow, Impeller");
    const auto wall_velocity = split_list(file.get(conditions + "Wall velocity"));
    if (wall_velocity.size() != 2)
      file.fail(conditions + "Wall velocity", "needs two components", "two real numbers [m/s]");
    flow.wall_velocity[0] = *parse_real(wall_velocity[0]);
    flow.wall_velocity[1] = *parse_real(wall_velocity[1]);
    flow.rotation_rate    = file.get_real(conditions + "Rotation rate");

    // Impellers: a speed when there are impeller roles, and the rotating frame only for planar flow.
    flow.rotation_speed        = file.get_real("Operating point/Rotation speed");
    flow.impeller_frame        = file.get("Flow/Reference frame") == "impeller";
    flow.metzner_otto_constant = file.get_real("Vessel/Metzner-Otto constant");
    flow.dead_zone_fraction    = file.get_real("Vessel/Dead-zone speed fraction");
    const bool has_impeller = std::any_of(flow.conditions.begin(), flow.conditions.end(), [](const auto &bc) {
      return bc.type == BoundaryCondition::Type::impeller;
    });
    if (has_impeller && !(flow.rotation_speed > 0.))
      file.fail("Operating point/Rotation speed", "missing or zero; the Impeller roles turn at it",
                "N > 0 [rev/s]");
    if (!has_impeller && flow.rotation_speed > 0.)
      file.fail("Operating point/Rotation speed", "set, but no role is listed under Boundary conditions/Impeller",
                "0, or list the turning roles under Impeller");
    if (flow.impeller_frame && flow.formulation != FormulationKind::planar)
      file.fail("Flow/Reference frame", "the impeller's frame is for planar flow; axisymmetric flow is steady in "
                "the fixed frame", "fixed");
    if (has_impeller && flow.formulation == FormulationKind::axisymmetric)
      file.fail(conditions + "Impeller", "a turning impeller needs the swirl velocity",
                "Flow/Formulation = axisymmetric with swirl, or planar");
    if (flow.impeller_frame && !has_impeller)
      file.fail("Flow/Reference frame", "no role is listed under Boundary conditions/Impeller", "fixed");

    flow.relative_tolerance = file.get_real("Nonlinear solver/Relative tolerance");
    flow.absolute_tolerance = file.get_real("Nonlinear solver/Absolute tolerance");
    flow.max_iterations     = static_cast<unsigned int>(file.get_real("Nonlinear solver/Maximum iterations"));
    flow.picard_until       = file.get_real("Nonlinear solver/Picard until");
    flow.max_picard_steps   = static_cast<unsigned int>(file.get_real("Nonlinear solver/Maximum Picard steps"));
    flow.continuation       = file.get("Nonlinear solver/Continuation") == "true";
    {
      const std::string sequencing = file.get("Nonlinear solver/Mesh sequencing");
      flow.mesh_sequencing         = sequencing == "automatic" ? -1 : std::stoi(sequencing);
      if (flow.mesh_sequencing > static_cast<int>(flow.refinement))
        file.fail("Nonlinear solver/Mesh sequencing",
                  "more coarse levels than the mesh has (Geometry/Refinement = " +
                    std::to_string(flow.refinement) + ")",
                  "automatic, or 0 to " + std::to_string(flow.refinement));
    }
    flow.linear_solver      = file.get("Linear solver/Type");
    flow.direct_limit       = static_cast<unsigned int>(file.get_real("Linear solver/Direct up to"));

    flow.output_folder = file.get("Output/Folder");
    if (flow.output_folder.empty())
      flow.output_folder = (std::filesystem::path("out") / flow.case_name).string();
    flow.write_fields  = file.get("Output/Write fields") == "true";
    flow.complete_text = file.complete_text();
    if (!flow.mesh_file.empty())
      flow.complete_text = with_absolute_mesh_file(flow.complete_text, flow.mesh_file);
    return flow;
  }
} // namespace lentus::input
