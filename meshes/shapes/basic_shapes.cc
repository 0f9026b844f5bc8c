// Rectangular shapes meshed by subdivided rectangles with near-square cells.
#include "meshes/shapes/basic_shapes.h"

#include <deal.II/grid/tria.h>
#include <deal.II/grid/grid_generator.h>

#include <array>
#include <cmath>

namespace lentus::meshes
{
  namespace
  {
    using rheology::ParameterInfo;
    using rheology::Range;

    /// A rectangle [x0, x1] x [y0, y1] whose four sides carry the given roles
    /// (left, right, bottom, top; equal names share an id).
    class Rectangle : public Geometry
    {
    public:
      Rectangle(const dealii::Point<2> &lower,
                const dealii::Point<2> &upper,
                const std::array<std::string, 4> &side_roles,
                const Symmetry symmetry_)
        : lower_corner(lower)
        , upper_corner(upper)
        , sides(side_roles)
        , kind(symmetry_)
      {}

      void create_mesh(dealii::Triangulation<2> &triangulation, const unsigned int refinement) const override
      {
        const double width  = upper_corner[0] - lower_corner[0];
        const double height = upper_corner[1] - lower_corner[1];
        // Near-square coarse cells: the shorter side gets one cell.
        const double cell = std::min(width, height);
        const std::vector<unsigned int> repetitions{
          static_cast<unsigned int>(std::max(1., std::round(width / cell))),
          static_cast<unsigned int>(std::max(1., std::round(height / cell)))};
        dealii::GridGenerator::subdivided_hyper_rectangle(triangulation, repetitions, lower_corner, upper_corner,
                                                          /*colorize=*/true);
        // colorize: 0 left, 1 right, 2 bottom, 3 top -> role ids
        const auto roles = boundary_roles();
        for (const auto &cell_iterator : triangulation.active_cell_iterators())
          for (const auto &face : cell_iterator->face_iterators())
            if (face->at_boundary())
              face->set_boundary_id(roles.at(sides[face->boundary_id()]));
        triangulation.refine_global(refinement);
      }

      std::map<std::string, dealii::types::boundary_id> boundary_roles() const override
      {
        std::map<std::string, dealii::types::boundary_id> roles;
        for (unsigned int side = 0; side < 4; ++side)
          if (!roles.count(sides[side]))
            roles.emplace(sides[side], static_cast<dealii::types::boundary_id>(roles.size()));
        return roles;
      }

      Symmetry symmetry() const override { return kind; }

    private:
      dealii::Point<2>           lower_corner, upper_corner;
      std::array<std::string, 4> sides;
      Symmetry                   kind;
    };

    const ParameterInfo length{"Length", "L", "m", "length along the flow", Range::above(0.)};
  } // namespace

  std::vector<ShapeInfo> basic_shapes()
  {
    return {
      {"Channel",
       "rectangle [0, L] x [0, H] (slit between parallel plates); roles: inlet (x = 0), outlet (x = L), "
       "bottom wall (y = 0), top wall (y = H)",
       {length, {"Height", "H", "m", "gap between the plates", Range::above(0.)}},
       [](const std::vector<double> &v) -> std::unique_ptr<Geometry> {
         return std::make_unique<Rectangle>(dealii::Point<2>(0., 0.), dealii::Point<2>(v[0], v[1]),
                                            std::array<std::string, 4>{{"inlet", "outlet", "bottom wall", "top wall"}},
                                            Symmetry::planar_only);
       },
       {1., 0.1}},
      {"Pipe",
       "circular pipe, axisymmetric: (r, z) in [0, R] x [0, L]; roles: axis (r = 0), wall (r = R), "
       "inlet (z = 0), outlet (z = L)",
       {{"Radius", "R", "m", "pipe radius", Range::above(0.)}, length},
       [](const std::vector<double> &v) -> std::unique_ptr<Geometry> {
         return std::make_unique<Rectangle>(dealii::Point<2>(0., 0.), dealii::Point<2>(v[0], v[1]),
                                            std::array<std::string, 4>{{"axis", "wall", "inlet", "outlet"}},
                                            Symmetry::axisymmetric_only);
       },
       {0.05, 0.5}},
      {"Annular gap",
       "gap between two coaxial cylinders, axisymmetric: (r, z) in [R_i, R_o] x [0, H]; roles: inner wall, "
       "outer wall, bottom (z = 0), top (z = H)",
       {{"Inner radius", "R_i", "m", "radius of the inner cylinder", Range::above(0.)},
        {"Outer radius", "R_o", "m", "radius of the outer cylinder", Range::above(0.)},
        {"Height", "H", "m", "axial extent of the modelled gap", Range::above(0.)}},
       [](const std::vector<double> &v) -> std::unique_ptr<Geometry> {
         if (!(v[1] > v[0]))
           throw rheology::InvalidParameter("Outer radius", rheology::format_value(v[1]),
                                            "not larger than Inner radius = " + rheology::format_value(v[0]),
                                            "Outer radius > Inner radius");
         return std::make_unique<Rectangle>(dealii::Point<2>(v[0], 0.), dealii::Point<2>(v[1], v[2]),
                                            std::array<std::string, 4>{{"inner wall", "outer wall", "bottom", "top"}},
                                            Symmetry::axisymmetric_only);
       },
       {0.05, 0.1, 0.02}},
      {"Cavity",
       "square cavity [0, S] x [0, S]; roles: lid (y = S), walls (the other three sides)",
       {{"Side length", "S", "m", "side of the square", Range::above(0.)}},
       [](const std::vector<double> &v) -> std::unique_ptr<Geometry> {
         return std::make_unique<Rectangle>(dealii::Point<2>(0., 0.), dealii::Point<2>(v[0], v[0]),
                                            std::array<std::string, 4>{{"walls", "walls", "walls", "lid"}},
                                            Symmetry::planar_only);
       },
       {0.1}},
    };
  }
} // namespace lentus::meshes
