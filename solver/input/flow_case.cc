#include "solver/input/flow_case.h"

#include "meshes/gmsh_mesh.h"
#include "solver/errors.h"
#include "solver/formulation/formulation.h"
#include "solver/input/section_keys.h"

#include <algorithm>
#include <cmath>
#include <filesystem>
#include <fstream>
#include <map>
#include <set>

namespace lentus::input
{
  namespace
  {
    using rheology::Range;

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
    for (const meshes::ShapeInfo &shape : meshes::shapes())
      for (const rheology::ParameterInfo &parameter : shape.parameters)
        schema.declare("Geometry/" + shape.name + "/" + parameter.key,
                       parameter.has_default() ? rheology::format_value(parameter.default_value) : "",
                       ValueKind::real(parameter.range),
                       parameter.symbol + " [" + parameter.unit + "]: " + parameter.meaning + ".");
    declare_section<GmshMeshSection>(schema, "Geometry/" + meshes::gmsh_mesh_shape);
    declare_section<GeometrySection>(schema, "Geometry");
    declare_section<FlowSection>(schema, "Flow");
    declare_section<OperatingPointSection>(schema, "Operating point");
    declare_section<VesselSection>(schema, "Vessel");
    declare_section<BoundaryConditionsSection>(schema, "Boundary conditions");
    declare_section<NonlinearSolverSection>(schema, "Nonlinear solver");
    declare_section<LinearSolverSection>(schema, "Linear solver");
    declare_section<AccuracySection>(schema, "Accuracy");
    declare_section<HeatSection>(schema, "Heat");
    declare_section<OutputSection>(schema, "Output");
  }

  void read_geometry(const CaseFile &file, FlowCase &flow)
  {
    flow.case_file     = file.file_name();
    flow.case_name     = std::filesystem::path(file.file_name()).stem().string();
    flow.geometry_keys = read_section<GeometrySection>(file, "Geometry");
    flow.model         = read_section<FlowSection>(file, "Flow");

    const std::string &shape_name = flow.geometry_keys.shape;
    if (shape_name.empty())
      file.fail("Geometry/Shape", "missing", file.declaration("Geometry/Shape").kind.describe());
    const meshes::GmshMesh *imported = nullptr;
    if (shape_name == meshes::gmsh_mesh_shape)
      {
        const std::string section = "Geometry/" + meshes::gmsh_mesh_shape;
        flow.gmsh_keys            = read_section<GmshMeshSection>(file, section);
        const std::string &name   = flow.gmsh_keys.file;
        if (name.empty())
          file.fail(section + "/File", "missing", "the path of a Gmsh .msh file, relative to the case file's folder");
        // Relative to the case file, not to the working directory.
        flow.mesh_file = (std::filesystem::path(file.file_name()).parent_path() / name).lexically_normal().string();
        if (std::filesystem::path(name).is_absolute())
          flow.mesh_file = name;
        try
          {
            auto mesh     = std::make_unique<meshes::GmshMesh>(flow.mesh_file, flow.gmsh_keys.scale);
            imported      = mesh.get();
            flow.geometry = std::move(mesh);
          }
        catch (const rheology::InvalidParameter &error)
          {
            file.fail(section + "/File", error.problem, error.allowed);
          }
      }
    else
      {
        const meshes::ShapeInfo &shape         = meshes::find_shape(shape_name);
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

    const FormulationKind  formulation = flow.model.formulation;
    const std::string      components  = velocity_components(formulation);
    const std::string      key         = "Flow/Velocity components";
    const meshes::Symmetry symmetry    = flow.geometry->symmetry();
    if (symmetry == meshes::Symmetry::planar_only && is_axisymmetric(formulation))
      file.fail(key, "shape " + shape_name + " is planar", "x y");
    if (symmetry == meshes::Symmetry::axisymmetric_only && !is_axisymmetric(formulation))
      file.fail(key, "shape " + shape_name + " is axisymmetric", "r z, or r z theta (with swirl)");
    if (imported && is_axisymmetric(formulation))
      {
        const std::string problem = imported->negative_radius();
        if (!problem.empty())
          file.fail("Geometry/" + meshes::gmsh_mesh_shape + "/File",
                    problem + ", but " + key + " = " + components + " takes x as the radius r",
                    "a mesh with x >= 0 (the axis at x = 0), or " + key + " = x y");
      }
  }

  namespace
  {
    /// Hands out the values of a list key one role at a time; `finish` checks that none is left.
    struct Values
    {
      const std::vector<double> &values;
      std::string                key, roles_under, what;
      std::size_t                next = 0;
      double take(const CaseFile &file)
      {
        if (next >= values.size())
          file.fail(key, "fewer values than roles under " + roles_under, "one " + what + " per role, in order");
        return values[next++];
      }
      void finish(const CaseFile &file) const
      {
        if (next != values.size())
          file.fail(key, "more values than roles under " + roles_under, "one " + what + " per role, in order");
      }
    };

    /// The conditions by role of `flow`'s geometry from its Boundary conditions section: every listed
    /// role exists, every role gets exactly one condition, and the values match the roles.
    void assign_conditions(const CaseFile &file, FlowCase &flow)
    {
      const BoundaryConditionsSection &keys = flow.boundary_keys;
      // "shape Channel", or "Gmsh mesh meshes/die.msh" in messages.
      const std::string shape_name = flow.mesh_file.empty() ? "shape " + flow.geometry_keys.shape :
                                                              "Gmsh mesh " + flow.gmsh_keys.file;
      std::map<std::string, std::string> assigned; // role -> key that assigned it
      const auto                         roles = flow.geometry->role_names();
      std::string                        role_list;
      for (const std::string &role : roles)
        role_list += (role_list.empty() ? "" : ", ") + role;

      // Inflow rates by volume, or by mass divided by the density.
      const std::string mass_key  = conditions + "Inflow mass rates";
      const bool        by_mass   = file.is_set(mass_key);
      const std::string rates_key = by_mass ? mass_key : conditions + "Inflow rates";
      if (by_mass && file.is_set(conditions + "Inflow rates"))
        file.fail(mass_key,
                  "Inflow rates is set too (line " + std::to_string(file.line_of(conditions + "Inflow rates")) + ")",
                  "either Inflow rates [m^3/s] or Inflow mass rates [kg/s], one value per role under Inflow");
      if (by_mass && !flow.fluid.density)
        file.fail(mass_key, "a mass rate needs the fluid's density, and Rheology/Density is not set",
                  "Rheology/Density [kg/m^3] set, or volume rates under Inflow rates instead");
      std::vector<double> inflow_rates = by_mass ? keys.inflow_mass_rates : keys.inflow_rates;
      if (by_mass)
        for (double &rate : inflow_rates)
          rate *= 1. / *flow.fluid.density;

      Values pressures{keys.pressures, conditions + "Pressure values", "Pressure", "pressure [Pa]"};
      Values rates{inflow_rates, rates_key, "Inflow", "flow rate"};
      Values speeds{keys.inflow_speeds, conditions + "Inflow speeds", "Uniform inflow", "speed [m/s]"};

      for (std::size_t c = 0; c < condition_keys().size(); ++c)
        {
          const ConditionKey &condition = condition_keys()[c];
          const std::string   key       = conditions + condition.key;
          for (const std::string &role : keys.roles[c])
            {
              if (std::find(roles.begin(), roles.end(), role) == roles.end())
                file.fail(key, "'" + role + "' is not a boundary role of " + shape_name,
                          "role names among " + role_list);
              if (assigned.count(role))
                file.fail(key, "role '" + role + "' already has a condition (" + assigned[role] + ")",
                          "one condition per role");
              if (condition.type == BoundaryCondition::Type::axis && !is_axisymmetric(flow.model.formulation))
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
                                "for Pressure, Symmetry, Inflow and Uniform inflow: roles whose sides all run along "
                                "x or all along y");
                    if (condition.type == BoundaryCondition::Type::inflow)
                      inflow_fits(file, key, role, *imported, flow.model.formulation, shape_name);
                  }
              assigned[role] = condition.key;
              BoundaryCondition bc{role, condition.type, 0.};
              if (condition.type == BoundaryCondition::Type::pressure)
                bc.pressure = pressures.take(file);
              if (condition.type == BoundaryCondition::Type::inflow)
                bc.flow_rate = rates.take(file);
              if (condition.type == BoundaryCondition::Type::uniform_inflow)
                bc.speed = speeds.take(file);
              flow.conditions.push_back(bc);
            }
        }
      pressures.finish(file);
      rates.finish(file);
      speeds.finish(file);
      for (const std::string &role : roles)
        if (!assigned.count(role))
          file.fail(conditions + "No-slip", "boundary role '" + role + "' of " + shape_name + " has no condition",
                    "every role (" + role_list + ") listed under exactly one of No-slip, Moving wall, Pressure, "
                    "Traction-free, Symmetry, Axis, Inflow, Uniform inflow, Impeller");
    }
  } // namespace

  namespace
  {
    /// Reads an inlet temperature profile (Heat/Inlet temperature files) into `bc`; returns "" or the
    /// problem, naming the file (as `name`, written in the case file) and its line.
    std::string read_temperature_profile(const std::string &path, const std::string &name, ThermalCondition &bc)
    {
      std::ifstream input(path);
      if (!input)
        return "cannot open '" + name + "' (" + path + ")";
      std::string line;
      int         number = 0;
      bool        header = false;
      while (std::getline(input, line))
        {
          ++number;
          const auto first = line.find_first_not_of(" \t\r");
          if (first == std::string::npos || line[first] == '#')
            continue;
          const auto  comma = line.find(',');
          const auto  trim  = [](std::string text) {
            const auto begin = text.find_first_not_of(" \t\r"), end = text.find_last_not_of(" \t\r");
            return begin == std::string::npos ? std::string() : text.substr(begin, end - begin + 1);
          };
          const std::string where = "'" + name + "' line " + std::to_string(number) + ": ";
          if (comma == std::string::npos || line.find(',', comma + 1) != std::string::npos)
            return where + "not two comma-separated columns";
          const std::string left = trim(line.substr(0, comma)), right = trim(line.substr(comma + 1));
          if (!header)
            {
              if (left == "x [m]" || left == "r [m]")
                bc.profile_axis = 0;
              else if (left == "y [m]" || left == "z [m]")
                bc.profile_axis = 1;
              else
                return where + "the header's first column is '" + left + "', not x [m], y [m], r [m] or z [m]";
              if (right != "temperature [K]")
                return where + "the header's second column is '" + right + "', not temperature [K]";
              header = true;
              continue;
            }
          double position = 0., temperature = 0.;
          try
            {
              std::size_t used = 0;
              position         = std::stod(left, &used);
              if (used != left.size())
                throw std::invalid_argument(left);
              temperature = std::stod(right, &used);
              if (used != right.size())
                throw std::invalid_argument(right);
            }
          catch (const std::exception &)
            {
              return where + "'" + line + "' is not two numbers";
            }
          if (!std::isfinite(position) || !std::isfinite(temperature) || !(temperature > 0.))
            return where + "position and temperature must be finite, the temperature > 0 K";
          if (!bc.profile.empty() && !(position > bc.profile.back().first))
            return where + "the positions must increase from row to row";
          bc.profile.emplace_back(position, temperature);
        }
      if (!header)
        return "'" + name + "' has no header line (e.g. r [m],temperature [K])";
      if (bc.profile.size() < 2)
        return "'" + name + "' has fewer than two rows of position and temperature";
      bc.temperature = bc.profile.front().second;
      return "";
    }

    /// The thermal conditions by role from subsection Heat (only with Heat/Energy equation = true):
    /// every listed role exists, every role gets exactly one, the values match the roles, and the
    /// fluid has what the energy equation needs.
    void assign_thermal_conditions(const CaseFile &file, FlowCase &flow)
    {
      const std::string  heat = "Heat/";
      const HeatSection &keys = flow.heat;
      const auto        &condition_list = thermal_condition_keys();
      if (!keys.energy_equation)
        {
          for (std::size_t c = 0; c < condition_list.size(); ++c)
            if (!keys.roles[c].empty())
              file.fail(heat + condition_list[c].key, "thermal conditions are set, but Heat/Energy equation = false",
                        "Energy equation = true, or no thermal conditions");
          return;
        }
      const Fluid &fluid = flow.fluid;
      if (!fluid.thermal_conductivity)
        file.fail("Rheology/Thermal conductivity", "missing; the energy equation (Heat/Energy equation) needs it",
                  "k > 0 [W/(m K)]");
      if (!fluid.heat_capacity)
        file.fail("Rheology/Heat capacity", "missing; the energy equation (Heat/Energy equation) needs it",
                  "c_p > 0 [J/(kg K)]");
      if (!fluid.density)
        file.fail("Rheology/Density", "missing; the energy equation (Heat/Energy equation) needs it",
                  "a density > 0 kg/m^3");
      if (!fluid.temperature)
        file.fail("Operating point/Temperature",
                  "missing; the energy equation needs the melt's temperature (inlets, start, isothermal comparison)",
                  "a temperature > 0 K");

      const std::string shape_name = flow.mesh_file.empty() ? "shape " + flow.geometry_keys.shape :
                                                              "Gmsh mesh " + flow.gmsh_keys.file;
      const auto        roles      = flow.geometry->role_names();
      std::string       role_list, key_list;
      for (const std::string &role : roles)
        role_list += (role_list.empty() ? "" : ", ") + role;
      for (const ThermalConditionKey &condition : condition_list)
        key_list += (key_list.empty() ? "" : ", ") + std::string(condition.key);

      const std::vector<double> melt(keys.roles[3].size(), *fluid.temperature);
      Values walls{keys.wall_temperatures, heat + "Wall temperatures", "Set temperature", "temperature [K]"};
      Values coefficients{keys.transfer_coefficients, heat + "Heat transfer coefficients", "Heat transfer",
                          "coefficient [W/(m^2 K)]"};
      Values surroundings{keys.surrounding_temperatures, heat + "Surrounding temperatures", "Heat transfer",
                          "temperature [K]"};
      const std::vector<double> from_files; // with Inlet temperature files, no uniform values are taken
      Values inlets{!keys.inlet_temperature_files.empty() ? from_files :
                    keys.inlet_temperatures.empty()       ? melt :
                                                            keys.inlet_temperatures,
                    heat + "Inlet temperatures", "Inlet temperature", "temperature [K]"};

      if (!keys.inlet_temperature_files.empty() && !keys.inlet_temperatures.empty())
        file.fail(heat + "Inlet temperature files", "set together with Heat/Inlet temperatures",
                  "either uniform Inlet temperatures or Inlet temperature files, not both");
      std::size_t                        next_file = 0;
      std::map<std::string, std::string> assigned;
      for (std::size_t c = 0; c < condition_list.size(); ++c)
        {
          const ThermalConditionKey &condition = condition_list[c];
          const std::string          key       = heat + condition.key;
          for (const std::string &role : keys.roles[c])
            {
              if (std::find(roles.begin(), roles.end(), role) == roles.end())
                file.fail(key, "'" + role + "' is not a boundary role of " + shape_name, "role names among " + role_list);
              if (assigned.count(role))
                file.fail(key, "role '" + role + "' already has a thermal condition (" + assigned[role] + ")",
                          "one thermal condition per role");
              assigned[role] = condition.key;
              const auto flow_condition =
                std::find_if(flow.conditions.begin(), flow.conditions.end(), [&](const auto &bc) { return bc.role == role; });
              using Flow = BoundaryCondition::Type;
              const bool crossed = flow_condition != flow.conditions.end() &&
                                   (flow_condition->type == Flow::pressure || flow_condition->type == Flow::traction_free ||
                                    flow_condition->type == Flow::inflow || flow_condition->type == Flow::uniform_inflow);
              if ((condition.type == ThermalCondition::Type::inlet || condition.type == ThermalCondition::Type::outflow) &&
                  !crossed)
                file.fail(key, "role '" + role + "' is not crossed by the flow (its flow condition is not Pressure, "
                               "Traction-free, Inflow or Uniform inflow)",
                          "roles where fluid enters or leaves; walls get Set temperature, Insulated or Heat transfer");
              ThermalCondition bc;
              bc.role = role;
              bc.type = condition.type;
              if (condition.type == ThermalCondition::Type::set_temperature)
                bc.temperature = walls.take(file);
              if (condition.type == ThermalCondition::Type::heat_transfer)
                {
                  bc.coefficient = coefficients.take(file);
                  bc.temperature = surroundings.take(file);
                }
              if (condition.type == ThermalCondition::Type::inlet && keys.inlet_temperature_files.empty())
                bc.temperature = inlets.take(file);
              if (condition.type == ThermalCondition::Type::inlet && !keys.inlet_temperature_files.empty())
                {
                  const std::string files_key = heat + "Inlet temperature files";
                  if (next_file >= keys.inlet_temperature_files.size())
                    file.fail(files_key, "fewer files than roles under Inlet temperature",
                              "one file per role, in order");
                  const std::string &name = keys.inlet_temperature_files[next_file++];
                  const std::string  path =
                    std::filesystem::path(name).is_absolute() ?
                      name :
                      (std::filesystem::path(file.file_name()).parent_path() / name).lexically_normal().string();
                  const std::string problem = read_temperature_profile(path, name, bc);
                  if (!problem.empty())
                    file.fail(files_key, problem,
                              "CSV files with a header 'r [m],temperature [K]' (or x, y, z) and rows of increasing "
                              "position and temperature > 0 K");
                }
              flow.thermal_conditions.push_back(bc);
            }
        }
      if (next_file != keys.inlet_temperature_files.size())
        file.fail(heat + "Inlet temperature files", "more files than roles under Inlet temperature",
                  "one file per role, in order");
      walls.finish(file);
      coefficients.finish(file);
      surroundings.finish(file);
      inlets.finish(file);
      for (const std::string &role : roles)
        if (!assigned.count(role))
          file.fail(heat + "Insulated", "boundary role '" + role + "' of " + shape_name + " has no thermal condition",
                    "every role (" + role_list + ") listed under exactly one of " + key_list +
                      " (axes and symmetry planes: Insulated)");
    }
  } // namespace

  FlowCase read_flow_case(const CaseFile &file)
  {
    FlowCase flow;
    flow.fluid = read_fluid(file);
    read_geometry(file, flow);
    flow.operating     = read_section<OperatingPointSection>(file, "Operating point");
    flow.vessel        = read_section<VesselSection>(file, "Vessel");
    flow.boundary_keys = read_section<BoundaryConditionsSection>(file, "Boundary conditions");
    flow.nonlinear     = read_section<NonlinearSolverSection>(file, "Nonlinear solver");
    flow.linear        = read_section<LinearSolverSection>(file, "Linear solver");
    flow.accuracy      = read_section<AccuracySection>(file, "Accuracy");
    flow.heat          = read_section<HeatSection>(file, "Heat");
    flow.output        = read_section<OutputSection>(file, "Output");

    const FlowSection &model = flow.model;
    if ((model.inertia || model.gravity[0] != 0. || model.gravity[1] != 0.) && !flow.fluid.density)
      file.fail("Rheology/Density", "missing; inertia and gravity need it", "a density > 0 kg/m^3");
    if (model.inertia && flow.nonlinear.line_search == LineSearch::energy)
      file.fail("Nonlinear solver/Line search", "the flow has inertia (Flow/Inertia = true), whose residual is not "
                "the gradient of an energy", "residual with inertia");

    assign_conditions(file, flow);
    assign_thermal_conditions(file, flow);

    // Impellers: a speed when there are impeller roles, and the rotating frame only for planar flow.
    const double rotation_speed = flow.operating.rotation_speed;
    const bool   has_impeller   = std::any_of(flow.conditions.begin(), flow.conditions.end(), [](const auto &bc) {
      return bc.type == BoundaryCondition::Type::impeller;
    });
    if (has_impeller && !(rotation_speed > 0.))
      file.fail("Operating point/Rotation speed", "missing or zero; the Impeller roles turn at it",
                "N > 0 [rev/s]");
    if (!has_impeller && rotation_speed > 0.)
      file.fail("Operating point/Rotation speed", "set, but no role is listed under Boundary conditions/Impeller",
                "0, or list the turning roles under Impeller");
    if (model.impeller_frame() && model.formulation != FormulationKind::planar)
      file.fail("Flow/Reference frame", "the impeller's frame is for planar flow; axisymmetric flow is steady in "
                "the fixed frame", "fixed");
    if (has_impeller && model.formulation == FormulationKind::axisymmetric)
      file.fail(conditions + "Impeller", "a turning impeller needs the swirl velocity",
                "Flow/Velocity components = r z theta, or x y");
    if (model.impeller_frame() && !has_impeller)
      file.fail("Flow/Reference frame", "no role is listed under Boundary conditions/Impeller", "fixed");

    const unsigned int refinement = flow.geometry_keys.refinement;
    if (flow.nonlinear.mesh_sequencing && *flow.nonlinear.mesh_sequencing > refinement)
      file.fail("Nonlinear solver/Mesh sequencing",
                "more coarse levels than the mesh has (Geometry/Refinement = " + std::to_string(refinement) + ")",
                "automatic, or 0 to " + std::to_string(refinement));

    const AccuracySection &accuracy = flow.accuracy;
    if (accuracy.target_relative_error && accuracy.adaptive_cycles == 0)
      file.fail("Accuracy/Target relative error", "set, but Accuracy/Adaptive cycles = 0 leaves no cycle to reach it",
                "Adaptive cycles > 0, or no target");
    if ((accuracy.maximum_unknowns || accuracy.maximum_wall_time) && accuracy.adaptive_cycles == 0)
      file.fail(accuracy.maximum_unknowns ? "Accuracy/Maximum unknowns" : "Accuracy/Maximum wall time",
                "a budget for adaptive cycles, but Accuracy/Adaptive cycles = 0", "Adaptive cycles > 0, or no budget");
    if (accuracy.adaptive_cycles > 0 && accuracy.refine_at.empty())
      file.fail("Accuracy/Refine at", "empty, but Accuracy/Adaptive cycles > 0",
                "yield surface, velocity jumps or everywhere");
    if (accuracy.adaptive_cycles > 0 && accuracy.refine_at == std::vector<RefineAt>{RefineAt::yield_surface} &&
        !(flow.fluid.law->yield_stress() > 0.))
      file.fail("Accuracy/Refine at", "only the yield surface, but the fluid has no yield stress",
                "velocity jumps or everywhere (alone or with yield surface)");
    if (!accuracy.targeted_numbers.empty() && !accuracy.target_relative_error)
      file.fail("Accuracy/Targeted numbers", "set, but no Accuracy/Target relative error", "a target, or no names");
    if (accuracy.coarsened_fraction + accuracy.refined_fraction > 1.)
      file.fail("Accuracy/Coarsened fraction",
                "with Accuracy/Refined fraction = " + rheology::format_short(accuracy.refined_fraction) +
                  ", more than all the cells",
                "at most 1 - Refined fraction = " + rheology::format_short(1. - accuracy.refined_fraction));
    flow.targeted_numbers_place = file.place_of("Accuracy/Targeted numbers");

    flow.output_folder = flow.output.folder.empty() ? (std::filesystem::path("out") / flow.case_name).string() :
                                                      flow.output.folder;
    flow.complete_text = file.complete_text();
    if (!flow.mesh_file.empty())
      flow.complete_text = with_absolute_mesh_file(flow.complete_text, flow.mesh_file);
    return flow;
  }
} // namespace lentus::input
