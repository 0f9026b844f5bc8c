// A Gmsh mesh checked and turned into cells: quadrilaterals only, every boundary side
// in one named physical curve, names usable as roles; problems name the file's line.
#include "meshes/gmsh_mesh.h"

#include "meshes/gmsh_file.h"
#include "rheology/parameter_table.h"

#include <deal.II/grid/grid_tools.h>
#include <deal.II/grid/tria.h>
#include <deal.II/grid/tria_description.h>

#include <algorithm>
#include <cctype>
#include <cmath>
#include <fstream>
#include <set>
#include <unordered_map>
#include <vector>

namespace lentus::meshes
{
  namespace
  {
    using rheology::format_short;
    using gmsh::Element;
    using gmsh::FileProblem;
    using gmsh::PhysicalName;
    using gmsh::fail;

    /// A role name must survive a comma-separated list in a case file.
    bool usable_role_name(const std::string &name)
    {
      if (name.empty() || !std::isalpha(static_cast<unsigned char>(name[0])) || name.back() == ' ')
        return false;
      for (const char c : name)
        if (!std::isalnum(static_cast<unsigned char>(c)) && c != ' ' && c != '-' && c != '_' && c != '.')
          return false;
      return true;
    }

    std::string point_text(const dealii::Point<2> &p)
    {
      return "(" + format_short(p[0]) + ", " + format_short(p[1]) + ")";
    }
  } // namespace

  struct GmshMesh::Data
  {
    std::string                                       version;
    std::vector<dealii::Point<2>>                     vertices;
    std::vector<int>                                  vertex_lines;   ///< line of each vertex's node
    std::vector<long>                                 vertex_tags;    ///< node tag of each vertex
    std::vector<dealii::CellData<2>>                  cells;
    dealii::SubCellData                               boundary;
    std::map<std::string, dealii::types::boundary_id> roles;
    std::map<unsigned int, std::string>               materials;
  };

  GmshMesh::~GmshMesh() = default;

  GmshMesh::GmshMesh(const std::string &path, const double scale)
    : data(std::make_unique<Data>())
  {
    std::ifstream input(path);
    if (!input)
      throw rheology::InvalidParameter("File", path, "cannot open the mesh file " + path,
                                       "a readable Gmsh .msh file; a relative path is taken from the case file's "
                                       "folder");
    try
      {
        const gmsh::FileContent content = gmsh::read_msh(input);
        data->version             = content.version;
        const auto name_of = [&](const int dimension, const int tag) -> const PhysicalName * {
          const auto found = content.physical_names.find({dimension, tag});
          return found == content.physical_names.end() ? nullptr : &found->second;
        };

        // Cells: the vertices they use, in the order first used.
        std::unordered_map<long, unsigned int> vertex_of_node;
        const auto vertex = [&](const long node, const Element &element) {
          const auto known = vertex_of_node.find(node);
          if (known != vertex_of_node.end())
            return known->second;
          const auto found = content.nodes.find(node);
          if (found == content.nodes.end())
            fail(element.line, "element " + std::to_string(element.tag) + " uses node " + std::to_string(node) +
                                 ", which $Nodes does not list",
                 "elements whose nodes are all listed");
          const auto index = static_cast<unsigned int>(data->vertices.size());
          vertex_of_node[node] = index;
          data->vertices.emplace_back(found->second.x * scale, found->second.y * scale);
          data->vertex_lines.push_back(found->second.line);
          data->vertex_tags.push_back(node);
          return index;
        };
        std::vector<const Element *> quads;
        for (const Element &element : content.elements)
          if (element.type == 3)
            quads.push_back(&element);
        if (quads.empty())
          fail(0, "no quadrilateral cells (Gmsh type 3)",
               "a 2D quadrilateral mesh; where physical groups are defined, Gmsh saves only their elements: "
               "put the domain in a Physical Surface");
        std::vector<std::array<unsigned int, 4>> corners; // counter-clockwise
        for (const Element *quad : quads)
          {
            std::array<unsigned int, 4> c;
            for (unsigned int i = 0; i < 4; ++i)
              c[i] = vertex(quad->nodes[i], *quad);
            corners.push_back(c);
          }

        // A flat mesh in the x-y plane.
        double low[2] = {HUGE_VAL, HUGE_VAL}, high[2] = {-HUGE_VAL, -HUGE_VAL};
        for (const dealii::Point<2> &p : data->vertices)
          for (unsigned int d = 0; d < 2; ++d)
            {
              low[d]  = std::min(low[d], p[d]);
              high[d] = std::max(high[d], p[d]);
            }
        const double size = std::hypot(high[0] - low[0], high[1] - low[1]);
        for (std::size_t v = 0; v < data->vertices.size(); ++v)
          if (std::abs(content.nodes.at(data->vertex_tags[v]).z * scale) > 1e-9 * size)
            fail(data->vertex_lines[v], "node " + std::to_string(data->vertex_tags[v]) + " has z = " +
                                          format_short(content.nodes.at(data->vertex_tags[v]).z),
                 "a 2D mesh in the plane z = 0 (x along r, y along z for axisymmetric cases)");

        // Convex cells, each turned counter-clockwise; Gmsh numbers the corners around the cell,
        // deal.II lexicographically (0 1 3 2).
        for (std::size_t q = 0; q < quads.size(); ++q)
          {
            std::array<unsigned int, 4> &c = corners[q];
            int                          positive = 0, negative = 0;
            for (unsigned int i = 0; i < 4; ++i)
              {
                const dealii::Tensor<1, 2> a     = data->vertices[c[(i + 1) % 4]] - data->vertices[c[i]];
                const dealii::Tensor<1, 2> b     = data->vertices[c[(i + 2) % 4]] - data->vertices[c[(i + 1) % 4]];
                const double               cross = a[0] * b[1] - a[1] * b[0];
                if (cross > 1e-10 * a.norm() * b.norm())
                  ++positive;
                else if (cross < -1e-10 * a.norm() * b.norm())
                  ++negative;
              }
            if (positive != 4 && negative != 4)
              fail(quads[q]->line, "element " + std::to_string(quads[q]->tag) +
                                     " is not a convex quadrilateral (a corner angle of 180 degrees or more, "
                                     "or sides of zero length)",
                   "convex quadrilaterals");
            if (negative == 4)
              std::swap(c[1], c[3]);
            dealii::CellData<2> cell;
            cell.vertices    = {c[0], c[1], c[3], c[2]};
            cell.material_id = static_cast<dealii::types::material_id>(quads[q]->physical);
            data->cells.push_back(cell);
            if (quads[q]->physical != 0)
              if (const PhysicalName *name = name_of(2, quads[q]->physical))
                data->materials[quads[q]->physical] = name->name;
          }

        // Sides: those of one cell only are on the boundary.
        struct Side
        {
          unsigned int   count = 0;
          const Element *cell  = nullptr;
          int            physical = -1; ///< -1: no boundary line yet
          const Element *line  = nullptr;
        };
        std::map<std::pair<unsigned int, unsigned int>, Side> sides;
        const auto key = [](unsigned int a, unsigned int b) { return std::make_pair(std::min(a, b), std::max(a, b)); };
        for (std::size_t q = 0; q < quads.size(); ++q)
          for (unsigned int i = 0; i < 4; ++i)
            {
              Side &side = sides[key(corners[q][i], corners[q][(i + 1) % 4])];
              ++side.count;
              side.cell = quads[q];
            }

        for (const Element &line : content.elements)
          {
            if (line.type != 1)
              continue;
            const auto a = vertex_of_node.find(line.nodes[0]), b = vertex_of_node.find(line.nodes[1]);
            const auto side = a == vertex_of_node.end() || b == vertex_of_node.end() ?
                                sides.end() :
                                sides.find(key(a->second, b->second));
            if (side == sides.end())
              fail(line.line, "line element " + std::to_string(line.tag) + " is not a side of any quadrilateral",
                   "boundary lines on the sides of the mesh's cells (mesh curves and surfaces together)");
            const PhysicalName *name = name_of(1, line.physical);
            if (side->second.count > 1)
              {
                if (line.physical != 0)
                  fail(line.line, "line element " + std::to_string(line.tag) + " of physical curve " +
                                    (name ? "'" + name->name + "'" : std::to_string(line.physical)) +
                                    " lies inside the domain",
                       "physical curves on the boundary only (a role names a boundary)");
                continue; // an internal curve saved without a group (Mesh.SaveAll): harmless
              }
            if (line.several_physicals)
              fail(line.line, "line element " + std::to_string(line.tag) + " belongs to several physical curves",
                   "each boundary curve in exactly one named physical curve (one role per boundary side)");
            if (line.physical == 0)
              fail(line.line, "boundary line element " + std::to_string(line.tag) + " belongs to no physical curve",
                   "each boundary curve in a named physical curve, e.g. Physical Curve(\"wall\") = {3, 4};");
            if (!name)
              fail(line.line, "boundary line element " + std::to_string(line.tag) + " belongs to physical curve " +
                                std::to_string(line.physical) + ", which has no name in $PhysicalNames",
                   "named physical curves, e.g. Physical Curve(\"wall\") = {3, 4}; the name is the boundary role");
            if (!usable_role_name(name->name))
              fail(name->line, "physical curve " + std::to_string(line.physical) + " is named '" + name->name +
                                 "', which cannot be a role name",
                   "letters, digits, spaces, '-', '_' and '.', beginning with a letter (case files list roles "
                   "separated by commas)");
            if (side->second.physical >= 0 && side->second.physical != line.physical)
              fail(line.line, "line element " + std::to_string(line.tag) + " puts a boundary side in physical curve '" +
                                name->name + "', which is already in '" + name_of(1, side->second.physical)->name +
                                "' (line " + std::to_string(side->second.line->line) + ")",
                   "one physical curve per boundary side (one role per side)");
            side->second.physical = line.physical;
            side->second.line     = &line;
          }

        // Every boundary side has a role; role ids follow the physical tags.
        std::set<int> tags;
        for (const auto &[vertices, side] : sides)
          if (side.count == 1)
            {
              if (side.physical < 0)
                {
                  std::size_t missing = 0;
                  for (const auto &[other_vertices, other] : sides)
                    missing += other.count == 1 && other.physical < 0;
                  fail(side.cell->line,
                       "the boundary side from " + point_text(data->vertices[vertices.first]) + " to " +
                         point_text(data->vertices[vertices.second]) + " of element " + std::to_string(side.cell->tag) +
                         " belongs to no physical curve" +
                         (missing > 1 ? " (nor do " + std::to_string(missing - 1) + " other sides)" : ""),
                       "every boundary curve in a named physical curve, e.g. Physical Curve(\"wall\") = {3, 4}; "
                       "(a side between cells that do not share their nodes also counts as boundary)");
                }
              tags.insert(side.physical);
            }
        std::map<int, dealii::types::boundary_id> id_of_tag;
        for (const int tag : tags)
          {
            const std::string &name = name_of(1, tag)->name;
            if (!data->roles.count(name))
              data->roles.emplace(name, static_cast<dealii::types::boundary_id>(data->roles.size()));
            id_of_tag[tag] = data->roles.at(name);
          }
        for (const auto &[vertices, side] : sides)
          if (side.count == 1)
            {
              dealii::CellData<1> line;
              line.vertices    = {vertices.first, vertices.second};
              line.boundary_id = id_of_tag.at(side.physical);
              data->boundary.boundary_lines.push_back(line);
            }
      }
    catch (const FileProblem &problem)
      {
        throw rheology::InvalidParameter("File", path,
                                         (problem.line > 0 ? "mesh file line " + std::to_string(problem.line) + ": " :
                                                             std::string()) +
                                           problem.problem,
                                         problem.allowed);
      }
    dealii::GridTools::consistently_order_cells(data->cells);
  }

  void GmshMesh::create_mesh(dealii::Triangulation<2> &triangulation, const unsigned int refinement) const
  {
    triangulation.create_triangulation(data->vertices, data->cells, data->boundary);
    triangulation.refine_global(refinement);
  }

  std::map<std::string, dealii::types::boundary_id> GmshMesh::boundary_roles() const
  {
    return data->roles;
  }

  std::string GmshMesh::negative_radius() const
  {
    double size = 0.;
    for (const dealii::Point<2> &p : data->vertices)
      size = std::max(size, p.norm());
    for (std::size_t v = 0; v < data->vertices.size(); ++v)
      if (data->vertices[v][0] < -1e-10 * size)
        return "mesh file line " + std::to_string(data->vertex_lines[v]) + ": node " +
               std::to_string(data->vertex_tags[v]) + " lies at x = " + format_short(data->vertices[v][0]) +
               " m (after scaling)";
    return "";
  }

  std::string GmshMesh::not_axis_parallel(const std::string &role) const
  {
    const dealii::types::boundary_id id   = id_of_role(role);
    int                              axis = -1; // 0: sides along x, 1: along y
    for (const dealii::CellData<1> &line : data->boundary.boundary_lines)
      if (line.boundary_id == id)
        {
          const dealii::Point<2> &a = data->vertices[line.vertices[0]], &b = data->vertices[line.vertices[1]];
          const dealii::Tensor<1, 2> edge      = b - a;
          const int                  side_axis = std::abs(edge[1]) <= 1e-12 * edge.norm() ? 0 :
                                                 std::abs(edge[0]) <= 1e-12 * edge.norm() ? 1 :
                                                                                            -1;
          if (side_axis < 0 || (axis >= 0 && side_axis != axis))
            return "role '" + role + "' has a side from " + point_text(a) + " to " + point_text(b) +
                   (side_axis < 0 ? " that is not parallel to a coordinate axis" :
                                    std::string(" along ") + (side_axis == 0 ? "x" : "y") + " and others along " +
                                      (axis == 0 ? "x" : "y"));
          axis = side_axis;
        }
    return "";
  }

  std::array<double, 4> GmshMesh::role_box(const std::string &role) const
  {
    const dealii::types::boundary_id id  = id_of_role(role);
    std::array<double, 4>            box = {{HUGE_VAL, -HUGE_VAL, HUGE_VAL, -HUGE_VAL}};
    for (const dealii::CellData<1> &line : data->boundary.boundary_lines)
      if (line.boundary_id == id)
        for (const unsigned int v : line.vertices)
          for (unsigned int d = 0; d < 2; ++d)
            {
              box[2 * d]     = std::min(box[2 * d], data->vertices[v][d]);
              box[2 * d + 1] = std::max(box[2 * d + 1], data->vertices[v][d]);
            }
    return box;
  }

  std::map<unsigned int, std::string> GmshMesh::material_names() const
  {
    return data->materials;
  }

  std::string GmshMesh::format() const
  {
    return "MSH " + data->version;
  }
} // namespace lentus::meshes
