// Gmsh meshes in case files: what is read from a .msh file (roles, cells, scale,
// orientation) and every rejection with the case file, key, mesh-file line and remedy.
// GoogleMock first: deal.II defines a macro Assert.
#include <gmock/gmock.h>
#include <gtest/gtest.h>

#include "meshes/gmsh_mesh.h"
#include "solver/errors.h"
#include "solver/input/case_schema.h"
#include "solver/input/flow_case.h"

#include <deal.II/grid/tria.h>

#include <filesystem>
#include <fstream>
#include <map>
#include <string>

#include <unistd.h>

using namespace lentus;
using ::testing::HasSubstr;

namespace
{
  // Two unit squares side by side, x in [0, 2], y in [0, 1]; inlet at x = 0, outlet at x = 2.
  const std::string two_squares = R"($MeshFormat
2.2 0 8
$EndMeshFormat
$PhysicalNames
4
1 1 "inlet"
1 2 "outlet"
1 3 "wall"
2 4 "fluid"
$EndPhysicalNames
$Nodes
6
1 0 0 0
2 1 0 0
3 2 0 0
4 2 1 0
5 1 1 0
6 0 1 0
$EndNodes
$Elements
8
1 1 2 3 1 1 2
2 1 2 3 1 2 3
3 1 2 2 2 3 4
4 1 2 3 3 4 5
5 1 2 3 3 5 6
6 1 2 1 4 6 1
7 3 2 4 1 1 2 5 6
8 3 2 4 1 2 3 4 5
$EndElements
)";

  std::string replaced(std::string text, const std::string &from, const std::string &to)
  {
    const auto where = text.find(from);
    EXPECT_NE(where, std::string::npos) << from;
    return text.replace(where, from.size(), to);
  }

  /// Writes `mesh` next to the test and returns a case using it (case file "case.prm" in the same folder).
  std::string case_with_mesh(const std::string &mesh, const std::string &components = "x y",
                             const std::string &conditions = "  set No-slip = wall\n  set Pressure = inlet, outlet\n"
                                                             "  set Pressure values = 1, 0\n")
  {
    std::ofstream(std::filesystem::path("gmsh_unit_test.msh")) << mesh;
    return R"(subsection Rheology
  set Viscosity law = Newtonian
  set Density = 1000
  subsection Newtonian
    set Viscosity = 1
  end
end
subsection Geometry
  set Shape = Gmsh mesh
  set Refinement = 1
  subsection Gmsh mesh
    set File = gmsh_unit_test.msh
    set Scale = 0.01
  end
end
subsection Flow
  set Velocity components = )" + components + R"(
end
subsection Boundary conditions
)" + conditions + "end\n";
  }

  std::string message_of(const std::string &case_text)
  {
    try
      {
        input::read_flow_case(input::CaseFile::parse(case_text, "case.prm", input::case_schema()));
      }
    catch (const InputError &error)
      {
        return error.what();
      }
    return "(no error)";
  }
} // namespace

/// Each test runs in a folder of its own: ctest runs the tests of this file side by side, and they all
/// write gmsh_unit_test.msh next to case.prm (the mesh path in a case file is relative to the case file).
class GmshMeshFile : public ::testing::Test
{
protected:
  void SetUp() override
  {
    previous_ = std::filesystem::current_path();
    const auto *info = ::testing::UnitTest::GetInstance()->current_test_info();
    folder_ = std::filesystem::temp_directory_path() /
              ("lentus_gmsh_test_" + std::string(info->name()) + "_" + std::to_string(::getpid()));
    std::filesystem::create_directories(folder_);
    std::filesystem::current_path(folder_);
  }
  void TearDown() override
  {
    std::filesystem::current_path(previous_);
    std::error_code ignored;
    std::filesystem::remove_all(folder_, ignored);
  }

private:
  std::filesystem::path previous_;
  std::filesystem::path folder_;
};

TEST_F(GmshMeshFile, RolesCellsScaleAndMaterials)
{
  const input::FlowCase flow =
    input::read_flow_case(input::CaseFile::parse(case_with_mesh(two_squares), "case.prm", input::case_schema()));
  EXPECT_EQ(flow.geometry_keys.shape, "Gmsh mesh");
  EXPECT_EQ(flow.mesh_file, "gmsh_unit_test.msh");
  EXPECT_EQ(flow.geometry->role_names(), (std::vector<std::string>{"inlet", "outlet", "wall"}));
  dealii::Triangulation<2> triangulation;
  flow.geometry->create_mesh(triangulation, 1);
  EXPECT_EQ(triangulation.n_active_cells(), 8u);
  std::map<dealii::types::boundary_id, double> length;
  double                                       area = 0.;
  for (const auto &cell : triangulation.active_cell_iterators())
    {
      area += cell->measure();
      EXPECT_EQ(cell->material_id(), 4u); // the physical surface's tag
      for (const auto &face : cell->face_iterators())
        if (face->at_boundary())
          length[face->boundary_id()] += face->measure();
    }
  // Exact (elementary geometry of the test mesh above): its nodes span 2 x 1 units; at Scale
  // 0.01 m per unit that is a 0.02 m x 0.01 m rectangle, area 2e-4 m^2, ends 0.01 m, walls 2 x 0.02 m.
  EXPECT_NEAR(area, 2e-4, 1e-15);
  const auto roles = flow.geometry->boundary_roles();
  EXPECT_NEAR(length[roles.at("inlet")], 0.01, 1e-15);
  EXPECT_NEAR(length[roles.at("outlet")], 0.01, 1e-15);
  EXPECT_NEAR(length[roles.at("wall")], 0.04, 1e-15);
  EXPECT_EQ(dynamic_cast<const meshes::GmshMesh &>(*flow.geometry).material_names().at(4), "fluid");
}

TEST_F(GmshMeshFile, ClockwiseCellsAreTurned)
{
  const std::string clockwise = replaced(two_squares, "7 3 2 4 1 1 2 5 6", "7 3 2 4 1 1 6 5 2");
  const input::FlowCase flow =
    input::read_flow_case(input::CaseFile::parse(case_with_mesh(clockwise), "case.prm", input::case_schema()));
  dealii::Triangulation<2> triangulation;
  flow.geometry->create_mesh(triangulation, 0);
  // Exact (elementary geometry): each unit square is 0.01 m x 0.01 m = 1e-4 m^2, positive once turned.
  for (const auto &cell : triangulation.active_cell_iterators())
    EXPECT_NEAR(cell->measure(), 1e-4, 1e-15);
}

TEST_F(GmshMeshFile, RejectsTriangles)
{
  const std::string triangles = replaced(replaced(two_squares, "8\n1 1 2", "9\n1 1 2"), "$EndElements",
                                         "9 2 2 4 1 1 2 5\n$EndElements");
  const std::string message = message_of(case_with_mesh(triangles));
  EXPECT_THAT(message, HasSubstr("case.prm:12: Geometry/Gmsh mesh/File = gmsh_unit_test.msh: mesh file line 30: "
                                 "element 9 is a triangle (Gmsh type 2); allowed: quadrilaterals only"));
  EXPECT_THAT(message, HasSubstr("Mesh.RecombineAll = 1"));
}

TEST_F(GmshMeshFile, RejectsBoundarySidesWithoutRole)
{
  const std::string no_outlet = replaced(replaced(two_squares, "3 1 2 2 2 3 4\n", ""), "8\n1 1 2", "7\n1 1 2");
  EXPECT_THAT(message_of(case_with_mesh(no_outlet)),
              HasSubstr("mesh file line 28: the boundary side from (0.02, 0) to (0.02, 0.01) of element 8 belongs "
                        "to no physical curve; allowed: every boundary curve in a named physical curve"));
}

TEST_F(GmshMeshFile, RejectsUnnamedAndUnusablePhysicalCurves)
{
  const std::string unnamed = replaced(replaced(two_squares, "1 2 \"outlet\"\n", ""), "4\n1 1 \"inlet\"", "3\n1 1 \"inlet\"");
  EXPECT_THAT(message_of(case_with_mesh(unnamed)),
              HasSubstr("mesh file line 23: boundary line element 3 belongs to physical curve 2, which has no name in "
                        "$PhysicalNames"));
  const std::string comma = replaced(two_squares, "\"inlet\"", "\"in,let\"");
  EXPECT_THAT(message_of(case_with_mesh(comma)),
              HasSubstr("mesh file line 6: physical curve 1 is named 'in,let', which cannot be a role name"));
}

TEST_F(GmshMeshFile, AxisymmetricNeedsPositiveRadius)
{
  const std::string shifted = replaced(two_squares, "1 0 0 0\n", "1 -0.5 0 0\n");
  EXPECT_THAT(message_of(case_with_mesh(shifted, "r z",
                                        "  set No-slip = wall, inlet\n  set Traction-free = outlet\n")),
              HasSubstr("case.prm:12: Geometry/Gmsh mesh/File = gmsh_unit_test.msh: mesh file line 13: node 1 lies at "
                        "x = -0.005 m (after scaling), but Flow/Velocity components = r z takes x as the radius r"));
  // The same mesh is fine when planar.
  EXPECT_EQ(message_of(case_with_mesh(shifted, "x y", "  set No-slip = wall, inlet\n  set Traction-free = outlet\n")),
            "(no error)");
}

TEST_F(GmshMeshFile, RolesOfTheMeshInConditions)
{
  EXPECT_THAT(message_of(case_with_mesh(two_squares, "x y",
                                        "  set No-slip = wall, exit\n  set Pressure = inlet, outlet\n"
                                        "  set Pressure values = 1, 0\n")),
              HasSubstr("Boundary conditions/No-slip = wall, exit: 'exit' is not a boundary role of Gmsh mesh "
                        "gmsh_unit_test.msh; allowed: role names among inlet, outlet, wall"));
  // A pressure condition needs a side parallel to an axis.
  const std::string slanted = replaced(two_squares, "4 2 1 0\n", "4 2.5 1 0\n");
  EXPECT_THAT(message_of(case_with_mesh(slanted)),
              HasSubstr("Boundary conditions/Pressure = inlet, outlet: role 'outlet' has a side from (0.02, 0) to "
                        "(0.025, 0.01) that is not parallel to a coordinate axis"));
}

TEST_F(GmshMeshFile, InflowOnOneSegment)
{
  // The developed inflow profile of an axisymmetric case reaches from the axis at one z.
  EXPECT_THAT(message_of(case_with_mesh(two_squares, "r z",
                                        "  set No-slip = wall, inlet\n  set Inflow = outlet\n"
                                        "  set Inflow rates = 1e-6\n")),
              HasSubstr("case.prm:21: Boundary conditions/Inflow = outlet: role 'outlet' of Gmsh mesh "
                        "gmsh_unit_test.msh spans x (r) from 0.02 to 0.02 m and y (z) from 0 to 0.01 m; allowed: an "
                        "axisymmetric inflow at one z, from the axis r = 0 to a wall or between two walls"));
  // Planar: the same role is one straight segment from wall to wall.
  EXPECT_EQ(message_of(case_with_mesh(two_squares, "x y",
                                      "  set No-slip = wall, inlet\n  set Inflow = outlet\n"
                                      "  set Inflow rates = 1e-6\n")),
            "(no error)");
}

TEST_F(GmshMeshFile, RecordedCaseNamesTheMeshByItsAbsolutePath)
{
  // case.prm in a results folder runs from anywhere.
  const input::FlowCase flow =
    input::read_flow_case(input::CaseFile::parse(case_with_mesh(two_squares), "case.prm", input::case_schema()));
  EXPECT_THAT(flow.complete_text,
              HasSubstr("set File  = " + std::filesystem::absolute("gmsh_unit_test.msh").lexically_normal().string() +
                        " "));
}

TEST_F(GmshMeshFile, FileProblems)
{
  const std::string missing = replaced(case_with_mesh(two_squares), "gmsh_unit_test.msh", "no_such.msh");
  EXPECT_THAT(message_of(missing), HasSubstr("case.prm:12: Geometry/Gmsh mesh/File = no_such.msh: cannot open the "
                                             "mesh file no_such.msh"));
  EXPECT_THAT(message_of(case_with_mesh(replaced(two_squares, "2.2 0 8", "4.0 0 8"))),
              HasSubstr("mesh file line 2: MSH format version 4.0 is not read; allowed: versions 2.2 and 4.1"));
  EXPECT_THAT(message_of(case_with_mesh(replaced(two_squares, "2.2 0 8", "2.2 1 8"))),
              HasSubstr("mesh file line 2: a binary MSH file; allowed: ASCII MSH files (in Gmsh: Mesh.Binary = 0)"));
  EXPECT_THAT(message_of(case_with_mesh(replaced(two_squares, "8 3 2 4 1 2 3 4 5", "8 3 2 4 1 2 3 4 7"))),
              HasSubstr("mesh file line 29: element 8 uses node 7, which $Nodes does not list"));
}
