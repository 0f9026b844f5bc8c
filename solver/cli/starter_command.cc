// `lentus starter SHAPE`: prints a commented starter case for a shape, which
// `lentus check` accepts and `lentus run` solves as it stands; users edit values.
#include "meshes/geometry.h"
#include "solver/cli/arguments.h"
#include "solver/cli/commands.h"
#include "solver/errors.h"
#include "solver/report/atomic_file.h"
#include "solver/report/caution_text.h"

#include <algorithm>
#include <iomanip>
#include <iostream>
#include <sstream>

namespace lentus::cli
{
  namespace
  {
    std::string join(const std::vector<std::string> &items)
    {
      std::string list;
      for (const std::string &item : items)
        list += (list.empty() ? "" : ", ") + item;
      return list;
    }

    std::string shape_names()
    {
      std::vector<std::string> names;
      for (const meshes::ShapeInfo &shape : meshes::shapes())
        names.push_back(shape.name);
      return join(names);
    }

    /// "  set Key = value" padded, with a comment.
    std::string set_line(const std::string &indent, const std::string &key, const std::string &value,
                         const std::string &comment)
    {
      std::ostringstream line;
      line << indent << "set " << std::left << std::setw(24) << key << " = ";
      if (comment.empty())
        line << value;
      else
        line << std::setw(14) << value << " # " << comment;
      return line.str() + "\n";
    }

    std::string starter_text(const meshes::ShapeInfo &shape)
    {
      const auto geometry = shape.create(shape.example);
      const auto roles    = geometry->role_names();
      // A first set of conditions from the role names; every role gets one.
      std::vector<std::string> no_slip, moving, pressure, symmetry, axis, impeller;
      const bool               vessel = std::count(roles.begin(), roles.end(), "impeller") > 0;
      std::vector<std::string> pressures;
      bool                     rotating = false;
      for (const std::string &role : roles)
        if (role == "inlet")
          {
            pressure.push_back(role);
            pressures.push_back("1000");
          }
        else if (role == "outlet")
          {
            pressure.push_back(role);
            pressures.push_back("0");
          }
        else if (role == "axis")
          axis.push_back(role);
        else if (role == "impeller" || role == "shaft")
          impeller.push_back(role);
        else if (role == "symmetry" || role == "top" || role == "free surface" || (role == "bottom" && !vessel))
          symmetry.push_back(role);
        else if (role == "lid")
          moving.push_back(role);
        else if (role == "inner wall")
          {
            moving.push_back(role);
            rotating = true;
          }
        else
          no_slip.push_back(role);
      const bool        axisymmetric = geometry->symmetry() == meshes::Symmetry::axisymmetric_only;
      const std::string components   = !axisymmetric                      ? "x y" :
                                       (rotating || !impeller.empty()) ? "r z theta" :
                                                                         "r z";

      std::ostringstream text;
      text << "# Starter case for the shape \"" << shape.name << "\" (written by lentus starter).\n"
           << "# " << shape.description << ".\n"
           << "# The example values are placeholders: set your fluid, dimensions and conditions, then\n"
           << "#   lentus check THIS_FILE && lentus run THIS_FILE\n"
           << "# Units are SI.\n"
           << report::caution_lines("# ") << "\n"
           << "subsection Rheology\n"
           << set_line("  ", "Viscosity law", "Newtonian", "lentus laws lists every law and its keys")
           << set_line("  ", "Density", "1000", "kg/m^3")
           << "  subsection Newtonian\n"
           << set_line("    ", "Viscosity", "1", "Pa s")
           << "  end\nend\n\n"
           << "subsection Geometry\n"
           << set_line("  ", "Shape", shape.name, "")
           << set_line("  ", "Refinement", "2", "uniform halvings of the coarse cells")
           << "  subsection " << shape.name << "\n";
      for (std::size_t i = 0; i < shape.parameters.size(); ++i)
        text << set_line("    ", shape.parameters[i].key, rheology::format_value(shape.example[i]),
                         shape.parameters[i].symbol + " [" + shape.parameters[i].unit + "]: " +
                           shape.parameters[i].meaning);
      text << "  end\nend\n\n"
           << "subsection Flow\n"
           << set_line("  ", "Velocity components", components,
                            components == "x y" ? "planar, per metre of depth" :
                            components == "r z" ? "axisymmetric: x is the radius" :
                                                  "axisymmetric with swirl u_theta")
           << set_line("  ", "Inertia", "false", "true needs Rheology/Density");
      if (!impeller.empty() && !axisymmetric)
        text << set_line("  ", "Reference frame", "impeller", "steady in the frame turning with the impeller");
      text << "end\n\n";
      if (!impeller.empty())
        text << "subsection Operating point\n"
             << set_line("  ", "Rotation speed", "1", "N [rev/s] of the Impeller roles")
             << "end\n\n"
             << "subsection Vessel\n"
             << set_line("  ", "Metzner-Otto constant", "11.5", "k_s [-]: effective shear rate k_s N")
             << set_line("  ", "Dead-zone speed fraction", "0.01", "[-] of the tip speed pi N D")
             << "end\n\n";
      text
           << "subsection Boundary conditions       # every role gets exactly one condition\n";
      if (!no_slip.empty())
        text << set_line("  ", "No-slip", join(no_slip), "");
      if (!moving.empty())
        {
          text << set_line("  ", "Moving wall", join(moving), "");
          if (rotating)
            text << set_line("  ", "Rotation rate", "1", "rad/s about the axis");
          else
            text << set_line("  ", "Wall velocity", "0.01, 0", "m/s");
        }
      if (!pressure.empty())
        text << set_line("  ", "Pressure", join(pressure), "fully developed ends at a set pressure")
             << set_line("  ", "Pressure values", join(pressures), "Pa, in the same order");
      if (!symmetry.empty())
        text << set_line("  ", "Symmetry", join(symmetry), "");
      if (!axis.empty())
        text << set_line("  ", "Axis", join(axis), "");
      if (std::any_of(shape.parameters.begin(), shape.parameters.end(),
                      [](const rheology::ParameterInfo &p) { return p.key == "Mandrel radius"; }))
        text << "  # With Mandrel radius > 0 (a tube die) the role axis becomes mandrel, a wall:\n"
             << "  # set No-slip = wall, mandrel   and no Axis line.\n";
      if (!impeller.empty())
        text << set_line("  ", "Impeller", join(impeller), "turn at Operating point/Rotation speed");
      text << "end\n";
      return text.str();
    }
  } // namespace

  int starter_command(const int argc, const char *const *argv, const int first)
  {
    const Arguments arguments = parse_arguments(argc, argv, first, {"--output"}, {"--help"});
    if (arguments.has("--help"))
      {
        std::cout << "usage: lentus starter SHAPE [--output FILE]\n\n"
                     "Prints a commented starter case for SHAPE (one of " +
                       shape_names() +
                       ") that lentus check accepts and lentus run solves as it stands; edit its values.\n";
        return 0;
      }
    if (arguments.positional.size() != 1)
      throw InputError("command line", 0, "starter needs one shape; allowed: " + shape_names());
    const meshes::ShapeInfo *shape = nullptr;
    for (const meshes::ShapeInfo &candidate : meshes::shapes())
      if (candidate.name == arguments.positional[0])
        shape = &candidate;
    if (!shape)
      throw InputError("command line", 0,
                       "starter " + arguments.positional[0] + ": unknown shape; allowed: " + shape_names());
    const std::string text = starter_text(*shape);
    if (arguments.options.count("--output"))
      report::write_file_atomically(arguments.options.at("--output"), text);
    else
      std::cout << text;
    return 0;
  }
} // namespace lentus::cli
