// Import of 2D quadrilateral meshes written by Gmsh (MSH 2.2 or 4.1, ASCII).
// The names of the physical curves become the boundary roles; the physical
// surfaces become material ids.
#pragma once

#include "meshes/geometry.h"

#include <array>
#include <map>
#include <memory>
#include <string>

namespace lentus::meshes
{
  /// The value of Geometry/Shape that selects an imported mesh; its keys live in
  /// the subsection of the same name (File, Scale).
  inline const std::string gmsh_mesh_shape = "Gmsh mesh";

  /// A mesh read from a Gmsh file. Every boundary side must belong to a physical
  /// curve with a name; the name is the side's role ("inlet", "wall", "axis"...).
  class GmshMesh : public Geometry
  {
  public:
    /**
     * Reads `path` and checks it: first-order quadrilaterals only, every boundary
     * side in exactly one named physical curve, names usable as role names, a flat
     * mesh (z = 0), convex cells. Coordinates are multiplied by `scale` [m per mesh unit].
     * @throws rheology::InvalidParameter with key "File", value `path`; where a line of
     *   the file is to blame the problem begins "mesh file line N: ".
     */
    GmshMesh(const std::string &path, double scale);
    ~GmshMesh() override;

    void create_mesh(dealii::Triangulation<2, 2> &triangulation, unsigned int refinement) const override;
    std::map<std::string, dealii::types::boundary_id> boundary_roles() const override;
    Symmetry symmetry() const override { return Symmetry::either; }

    /// "" if no node lies at x < 0 (up to round-off); else which node does, with its
    /// line: an axisymmetric mesh has x = r >= 0.
    std::string negative_radius() const;

    /// "" if every side of `role` is parallel to one and the same coordinate axis;
    /// else which side is not (pressure, symmetry and inflow conditions need that).
    std::string not_axis_parallel(const std::string &role) const;

    /// The smallest box {x_min, x_max, y_min, y_max} [m] holding every side of `role`.
    std::array<double, 4> role_box(const std::string &role) const;

    /// Names of the physical surfaces by material id (cells outside any have id 0).
    std::map<unsigned int, std::string> material_names() const;

    /// "MSH 2.2" or "MSH 4.1".
    std::string format() const;

  private:
    struct Data;
    std::unique_ptr<Data> data;
  };
} // namespace lentus::meshes
