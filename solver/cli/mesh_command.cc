// `lentus mesh CASE`: the mesh of a case without solving. Writes the cells (MPI
// partition, material) and the boundary sides (role id) for ParaView, a legend of the
// roles in mesh.json, and prints cells, unknowns and each role's sides and length.
#include "meshes/gmsh_mesh.h"
#include "rheology/parameter_table.h"
#include "solver/cli/arguments.h"
#include "solver/cli/commands.h"
#include "solver/errors.h"
#include "solver/formulation/formulation.h"
#include "solver/input/case_schema.h"
#include "solver/input/flow_case.h"
#include "solver/report/case_folder.h"
#include "solver/report/json_text.h"

#include <deal.II/base/mpi.h>
#include <deal.II/distributed/tria.h>
#include <deal.II/dofs/dof_handler.h>
#include <deal.II/fe/fe_q.h>
#include <deal.II/fe/fe_system.h>
#include <deal.II/lac/vector.h>
#include <deal.II/numerics/data_out.h>

#include <cmath>
#include <cstdio>
#include <filesystem>
#include <iostream>
#include <map>
#include <sstream>

#include <nlohmann/json.hpp>

namespace lentus::cli
{
  namespace
  {
    using namespace dealii;

    const char *help = R"(usage: [mpirun -np P] lentus mesh CASE [--output FOLDER] [--set Section/Key=VALUE ...]

Builds the mesh of CASE (its Geometry and Flow/Velocity components; no fluid or boundary
conditions needed) without solving, prints the number of cells and unknowns and every
boundary role with its number of sides and its length, and writes FOLDER (default
out/<case name>_mesh):
  mesh.pvd           open in ParaView: the two parts below
  mesh_cells.vtu     the cells, with fields partition (MPI rank) and material
  mesh_boundary.vtu  the boundary sides, with fields role (id) and length [m]
  mesh.json          cells, unknowns, and the roles by id: name, sides, length (and, for
                     axisymmetric cases, the area of the surface of revolution)
On P ranks the partition is the one `lentus run` uses on P ranks.
Exit codes: 0 written, 2 bad input (nothing written).
)";

    std::string number(const double value)
    {
      char buffer[40];
      std::snprintf(buffer, sizeof buffer, "%.10g", value);
      return buffer;
    }

    /// One boundary side: its ends and role id.
    struct Side
    {
      double       x0, y0, x1, y1;
      unsigned int role;
    };

    /// The boundary sides as VTK line cells with their role id and length.
    std::string boundary_vtu(const std::vector<Side> &sides)
    {
      std::ostringstream vtu;
      vtu << "<?xml version=\"1.0\"?>\n<VTKFile type=\"UnstructuredGrid\" version=\"0.1\" byte_order=\"LittleEndian\">\n"
          << "<UnstructuredGrid>\n<Piece NumberOfPoints=\"" << 2 * sides.size() << "\" NumberOfCells=\""
          << sides.size() << "\">\n<Points>\n<DataArray type=\"Float64\" NumberOfComponents=\"3\" format=\"ascii\">\n";
      for (const Side &side : sides)
        vtu << number(side.x0) << ' ' << number(side.y0) << " 0 " << number(side.x1) << ' ' << number(side.y1)
            << " 0\n";
      vtu << "</DataArray>\n</Points>\n<Cells>\n<DataArray type=\"Int64\" Name=\"connectivity\" format=\"ascii\">\n";
      for (std::size_t i = 0; i < sides.size(); ++i)
        vtu << 2 * i << ' ' << 2 * i + 1 << '\n';
      vtu << "</DataArray>\n<DataArray type=\"Int64\" Name=\"offsets\" format=\"ascii\">\n";
      for (std::size_t i = 0; i < sides.size(); ++i)
        vtu << 2 * (i + 1) << '\n';
      vtu << "</DataArray>\n<DataArray type=\"UInt8\" Name=\"types\" format=\"ascii\">\n";
      for (std::size_t i = 0; i < sides.size(); ++i)
        vtu << "3\n"; // VTK_LINE
      vtu << "</DataArray>\n</Cells>\n<CellData Scalars=\"role\">\n"
          << "<DataArray type=\"Int32\" Name=\"role\" format=\"ascii\">\n";
      for (const Side &side : sides)
        vtu << side.role << '\n';
      vtu << "</DataArray>\n<DataArray type=\"Float64\" Name=\"length\" format=\"ascii\">\n";
      for (const Side &side : sides)
        vtu << number(std::hypot(side.x1 - side.x0, side.y1 - side.y0)) << '\n';
      vtu << "</DataArray>\n</CellData>\n</Piece>\n</UnstructuredGrid>\n</VTKFile>\n";
      return vtu.str();
    }
  } // namespace

  int mesh_command(int argc, const char *const *argv, const int first)
  {
    const Arguments arguments = parse_arguments(argc, argv, first, {"--output"}, {"--help"});
    if (arguments.has("--help"))
      {
        std::cout << help;
        return 0;
      }
    if (arguments.positional.size() != 1)
      throw InputError("command line", 0, "mesh needs exactly one case file; see lentus mesh --help");

    char                                   **mutable_argv = const_cast<char **>(argv);
    Utilities::MPI::MPI_InitFinalize         mpi(argc, mutable_argv, 1);
    const MPI_Comm                           comm = MPI_COMM_WORLD;
    const unsigned int                       rank = Utilities::MPI::this_mpi_process(comm);
    const input::CaseFile file = input::CaseFile::read(arguments.positional[0], input::case_schema(), arguments.sets);
    input::FlowCase       flow;
    input::read_geometry(file, flow);

    const std::string folder = arguments.options.count("--output") ? arguments.options.at("--output") :
                                                                     "out/" + flow.case_name + "_mesh";
    // Replaces only an earlier preview (it holds mesh.json); appears whole or not at all.
    report::CaseFolder case_folder(folder, "mesh.json", "--output", comm);

    parallel::distributed::Triangulation<2> triangulation(comm);
    flow.geometry->create_mesh(triangulation, flow.geometry_keys.refinement);
    const unsigned int n_velocity = n_velocity_components(flow.model.formulation);
    const FESystem<2>  fe(FE_Q<2>(flow.model.velocity_degree), n_velocity, FE_Q<2>(flow.model.velocity_degree - 1), 1);
    DoFHandler<2>      dof_handler(triangulation);
    dof_handler.distribute_dofs(fe);

    // Cells: partition and material.
    Vector<float> partition(triangulation.n_active_cells()), material(triangulation.n_active_cells());
    std::vector<double> local_sides; // x0 y0 x1 y1 role, per boundary side of an owned cell
    double              low[2] = {HUGE_VAL, HUGE_VAL}, high[2] = {-HUGE_VAL, -HUGE_VAL};
    for (const auto &cell : triangulation.active_cell_iterators())
      if (cell->is_locally_owned())
        {
          partition[cell->active_cell_index()] = static_cast<float>(cell->subdomain_id());
          material[cell->active_cell_index()]  = static_cast<float>(cell->material_id());
          for (unsigned int v = 0; v < 4; ++v)
            for (unsigned int d = 0; d < 2; ++d)
              {
                low[d]  = std::min(low[d], cell->vertex(v)[d]);
                high[d] = std::max(high[d], cell->vertex(v)[d]);
              }
          for (const auto &face : cell->face_iterators())
            if (face->at_boundary())
              local_sides.insert(local_sides.end(), {face->vertex(0)[0], face->vertex(0)[1], face->vertex(1)[0],
                                                     face->vertex(1)[1], static_cast<double>(face->boundary_id())});
        }
    for (unsigned int d = 0; d < 2; ++d)
      {
        low[d]  = Utilities::MPI::min(low[d], comm);
        high[d] = Utilities::MPI::max(high[d], comm);
      }
    const auto gathered = Utilities::MPI::gather(comm, local_sides, 0);

    DataOut<2> data_out;
    data_out.attach_triangulation(triangulation);
    data_out.add_data_vector(partition, "partition", DataOut<2>::type_cell_data);
    data_out.add_data_vector(material, "material", DataOut<2>::type_cell_data);
    data_out.build_patches();
    data_out.write_vtu_in_parallel(case_folder.staging() + "mesh_cells.vtu", comm);

    if (rank == 0)
      {
        std::vector<Side> sides;
        for (const std::vector<double> &part : gathered)
          for (std::size_t i = 0; i + 4 < part.size(); i += 5)
            sides.push_back({part[i], part[i + 1], part[i + 2], part[i + 3], static_cast<unsigned int>(part[i + 4])});
        const bool axisymmetric = is_axisymmetric(flow.model.formulation);
        struct RoleSum
        {
          std::size_t sides  = 0;
          double      length = 0., area = 0.;
        };
        std::map<unsigned int, RoleSum> sums;
        for (const Side &side : sides)
          {
            const double length = std::hypot(side.x1 - side.x0, side.y1 - side.y0);
            RoleSum     &sum    = sums[side.role];
            ++sum.sides;
            sum.length += length;
            sum.area += 2. * M_PI * 0.5 * (side.x0 + side.x1) * length; // surface of revolution about x = 0
          }
        const auto                          roles = flow.geometry->boundary_roles();
        std::map<unsigned int, std::string> names;
        for (const auto &[name, id] : roles)
          names[id] = name;
        std::map<unsigned int, std::string> materials;
        if (const auto *imported = dynamic_cast<const meshes::GmshMesh *>(flow.geometry.get()))
          materials = imported->material_names();

        const std::string shape = flow.mesh_file.empty() ?
                                    "shape " + flow.geometry_keys.shape :
                                    "Gmsh mesh " + flow.mesh_file + " (" +
                                      dynamic_cast<const meshes::GmshMesh &>(*flow.geometry).format() + ")";
        std::printf("Mesh of %s: %s, refinement %u, velocity components %s\n", flow.case_file.c_str(), shape.c_str(),
                    flow.geometry_keys.refinement, velocity_components(flow.model.formulation));
        std::printf("  extent: x from %s to %s m, y from %s to %s m\n", rheology::format_short(low[0]).c_str(),
                    rheology::format_short(high[0]).c_str(), rheology::format_short(low[1]).c_str(),
                    rheology::format_short(high[1]).c_str());
        std::printf("  cells: %u; unknowns: %llu (Taylor-Hood Q%u-Q%u, %u velocity components)\n",
                    triangulation.n_global_active_cells(),
                    static_cast<unsigned long long>(dof_handler.n_dofs()), flow.model.velocity_degree,
                    flow.model.velocity_degree - 1, n_velocity);
        std::printf("  boundary roles:\n    %3s  %-20s %8s %14s%s\n", "id", "role", "sides", "length [m]",
                    axisymmetric ? "      area [m^2]" : "");
        using json   = nlohmann::ordered_json;
        json summary = {{"case", flow.case_file}, {"shape", flow.geometry_keys.shape}};
        if (!flow.mesh_file.empty())
          summary["mesh file"] = flow.mesh_file;
        summary["refinement"]          = flow.geometry_keys.refinement;
        summary["velocity components"] = velocity_components(flow.model.formulation);
        summary["cells"]               = triangulation.n_global_active_cells();
        summary["unknowns"]            = dof_handler.n_dofs();
        summary["velocity degree"]     = flow.model.velocity_degree;
        summary["ranks"]               = Utilities::MPI::n_mpi_processes(comm);
        json roles_json                = json::array();
        for (const auto &[id, name] : names)
          {
            const RoleSum sum = sums.count(id) ? sums.at(id) : RoleSum();
            char area[40] = "";
            if (axisymmetric)
              std::snprintf(area, sizeof area, "  %14s", rheology::format_short(sum.area).c_str());
            std::printf("    %3u  %-20s %8zu %14s%s\n", id, name.c_str(), sum.sides,
                        rheology::format_short(sum.length).c_str(), area);
            json role = {
              {"id", id}, {"name", name}, {"sides", sum.sides}, {"length [m]", report::json_number(sum.length)}};
            if (axisymmetric)
              role["area [m^2]"] = report::json_number(sum.area);
            roles_json.push_back(role);
          }
        summary["roles"] = roles_json;
        if (!materials.empty())
          {
            std::printf("  materials:");
            json materials_json = json::array();
            for (const auto &[id, name] : materials)
              {
                std::printf(" %u = %s;", id, name.c_str());
                materials_json.push_back(json{{"id", id}, {"name", name}});
              }
            std::printf("\n");
            summary["materials"] = materials_json;
          }

        case_folder.write("mesh_boundary.vtu", boundary_vtu(sides));
        case_folder.write("mesh.json", report::json_text(summary, true) + "\n");
        case_folder.write("mesh.pvd", "<?xml version=\"1.0\"?>\n<VTKFile type=\"Collection\" version=\"0.1\">\n"
                                      "<Collection>\n"
                                      "  <DataSet part=\"0\" name=\"cells\" file=\"mesh_cells.vtu\"/>\n"
                                      "  <DataSet part=\"1\" name=\"boundary\" file=\"mesh_boundary.vtu\"/>\n"
                                      "</Collection>\n</VTKFile>\n");
      }
    case_folder.commit();
    if (rank == 0)
      std::printf("Written: %s (cells with partition and material; boundary sides with role id), mesh.json\n",
                  (std::filesystem::path(folder) / "mesh.pvd").c_str());
    return 0;
  }
} // namespace lentus::cli
