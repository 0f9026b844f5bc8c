#include "meshes/geometry.h"

#include "meshes/shapes/basic_shapes.h"
#include "meshes/shapes/obstacle_shapes.h"
#include "meshes/shapes/round_die.h"
#include "meshes/shapes/vessels.h"

namespace lentus::meshes
{
  dealii::types::boundary_id Geometry::id_of_role(const std::string &role) const
  {
    const auto roles = boundary_roles();
    const auto found = roles.find(role);
    if (found == roles.end())
      {
        std::string list;
        for (const std::string &name : role_names())
          list += (list.empty() ? "" : ", ") + name;
        throw rheology::InvalidParameter("boundary role", role, "not a boundary of this shape", "one of " + list);
      }
    return found->second;
  }

  std::vector<std::string> Geometry::role_names() const
  {
    std::map<dealii::types::boundary_id, std::string> by_id;
    for (const auto &[name, id] : boundary_roles())
      by_id[id] = name;
    std::vector<std::string> names;
    for (const auto &[id, name] : by_id)
      names.push_back(name);
    return names;
  }

  const std::vector<ShapeInfo> &shapes()
  {
    static const std::vector<ShapeInfo> catalogue = [] {
      std::vector<ShapeInfo> all = basic_shapes();
      all.push_back(round_die_shape());
      all.push_back(slit_die_shape());
      all.push_back(cylinder_in_channel_shape());
      all.push_back(sphere_in_tube_shape());
      all.push_back(disk_impeller_vessel_shape());
      all.push_back(bladed_impeller_vessel_shape());
      return all;
    }();
    return catalogue;
  }

  const ShapeInfo &find_shape(const std::string &name)
  {
    std::string list;
    for (const ShapeInfo &shape : shapes())
      {
        if (shape.name == name)
          return shape;
        list += (list.empty() ? "" : ", ") + shape.name;
      }
    throw rheology::InvalidParameter("Shape", name, "unknown shape", "one of " + list);
  }
} // namespace lentus::meshes
