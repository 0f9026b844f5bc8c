// Geometries: a shape builds the mesh and names the role of every boundary.
// Case files select a shape by name and size it; boundary conditions and
// design numbers refer to roles ("inlet", "wall", "axis"...), never to ids.
#pragma once

#include "meshes/straight_section.h"
#include "rheology/parameter_table.h"

#include <deal.II/grid/tria.h>

#include <functional>
#include <map>
#include <memory>
#include <string>
#include <vector>

namespace lentus::meshes
{
  /// Which coordinate systems a shape may be solved in.
  enum class Symmetry
  {
    planar_only,        ///< x, y
    axisymmetric_only,  ///< x[0] = r >= 0, x[1] = z
    either
  };

  /// A sized shape, ready to mesh.
  class Geometry
  {
  public:
    virtual ~Geometry() = default;

    /// Straight sections in flow order (empty for shapes without).
    virtual std::vector<StraightSection> straight_sections() const { return {}; }

    /// Builds the coarse mesh with boundary ids, refined `refinement` times.
    virtual void create_mesh(dealii::Triangulation<2> &triangulation, unsigned int refinement) const = 0;

    /// Role name -> boundary id, for every boundary of the shape.
    virtual std::map<std::string, dealii::types::boundary_id> boundary_roles() const = 0;

    virtual Symmetry symmetry() const = 0;

    /// Diameter D of the shape's impeller [m] (the one the vessel numbers refer to); 0 without one.
    virtual double impeller_diameter() const { return 0.; }

    /// The id of `role`; throws rheology::InvalidParameter (key "boundary role") listing the roles.
    dealii::types::boundary_id id_of_role(const std::string &role) const;

    /// Role names in id order.
    std::vector<std::string> role_names() const;
  };

  /// Catalogue entry of a shape.
  struct ShapeInfo
  {
    std::string                            name;        ///< as in case files, e.g. "Channel"
    std::string                            description; ///< one sentence with the roles
    std::vector<rheology::ParameterInfo>   parameters;  ///< dimensions [m], in `create` order
    std::function<std::unique_ptr<Geometry>(const std::vector<double> &)> create; ///< throws InvalidParameter
    std::vector<double> example; ///< plausible dimensions for starter cases (invented), in `parameters` order
  };

  /// Every shape, in catalogue order.
  const std::vector<ShapeInfo> &shapes();

  /// The shape called `name`; throws rheology::InvalidParameter listing the names.
  const ShapeInfo &find_shape(const std::string &name);
} // namespace lentus::meshes
