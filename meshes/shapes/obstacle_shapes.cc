// Round obstacles for verification: a cylinder in a planar channel (the geometry of the
// Schaefer & Turek 1996 benchmark when sized so) and a sphere on the axis of a tube
// (axisymmetric, the meridional half-plane r >= 0).
//
// Mesh: a tensor grid of near-square cells in which a box around the obstacle is replaced by
// one ring of cells between the box outline and the circle (each box point joined to its radial
// projection on the circle). The circle carries a SphericalManifold and the ring cells a
// TransfiniteInterpolationManifold, so refinement follows the circle; both are attached to the
// triangulation being built, which may be a parallel::distributed::Triangulation.
#include "meshes/shapes/obstacle_shapes.h"

#include "meshes/spacing.h"

#include <deal.II/grid/grid_tools.h>
#include <deal.II/grid/manifold_lib.h>
#include <deal.II/grid/tria.h>

#include <algorithm>
#include <array>
#include <cmath>

namespace lentus::meshes
{
  namespace
  {
    using dealii::Point;
    using rheology::InvalidParameter;
    using rheology::ParameterInfo;
    using rheology::Range;
    using rheology::format_short;
    using rheology::format_value;

    constexpr dealii::types::manifold_id circle_manifold = 1; ///< faces on the obstacle
    constexpr dealii::types::manifold_id ring_manifold   = 2; ///< cells touching the obstacle

    /// Grid lines 0 = start ... box_low, centre, box_high ... end = total, graded away from the box.
    std::vector<double> grid_lines(const double box_low, const double centre, const double box_high, const double total,
                                   const double first, const double growth_low, const double growth_high)
    {
      std::vector<double> lines = geometric(box_low, 0., first, growth_low);
      std::reverse(lines.begin(), lines.end());
      if (centre > lines.back())
        lines.push_back(centre);
      for (const double x : geometric(box_high, total, first, growth_high))
        lines.push_back(x);
      return lines;
    }

    /// Quadrilaterals given by their corners in cyclic order (either sense), vertices merged by position.
    class QuadBuilder
    {
    public:
      explicit QuadBuilder(const double tolerance_) : tolerance(tolerance_) {}

      void quad(std::array<Point<2>, 4> corners)
      {
        double twice_area = 0.;
        for (unsigned int i = 0; i < 4; ++i)
          twice_area += corners[i][0] * corners[(i + 1) % 4][1] - corners[(i + 1) % 4][0] * corners[i][1];
        if (twice_area < 0.)
          std::swap(corners[1], corners[3]); // counter-clockwise
        dealii::CellData<2> cell;
        // deal.II numbers a quadrilateral's vertices lexicographically: 0, 1, 3, 2 run counter-clockwise.
        cell.vertices[0] = vertex(corners[0]);
        cell.vertices[1] = vertex(corners[1]);
        cell.vertices[3] = vertex(corners[2]);
        cell.vertices[2] = vertex(corners[3]);
        cells.push_back(cell);
      }

      void create(dealii::Triangulation<2> &triangulation)
      {
        dealii::GridTools::consistently_order_cells(cells);
        triangulation.create_triangulation(vertices, cells, dealii::SubCellData());
      }

    private:
      unsigned int vertex(const Point<2> &x)
      {
        for (unsigned int i = 0; i < vertices.size(); ++i)
          if (vertices[i].distance(x) < tolerance)
            return i;
        vertices.push_back(x);
        return static_cast<unsigned int>(vertices.size() - 1);
      }

      double                           tolerance;
      std::vector<Point<2>>            vertices;
      std::vector<dealii::CellData<2>> cells;
    };

    /// A boundary side of the coarse mesh, known by its end points.
    struct Side
    {
      Point<2> a, b;
      double   tolerance;

      /// Both ends on the line x[axis] = value.
      bool on_line(const unsigned int axis, const double value) const
      {
        return std::abs(a[axis] - value) < tolerance && std::abs(b[axis] - value) < tolerance;
      }

      /// Both ends on the circle.
      bool on_circle(const Point<2> &centre, const double radius) const
      {
        return std::abs(a.distance(centre) - radius) < tolerance && std::abs(b.distance(centre) - radius) < tolerance;
      }
    };

    /// The tensor grid xs x ys without the cells inside the box [xs[box_x[0]], xs[box_x[1]]] x
    /// [ys[box_y[0]], ys[box_y[1]]], plus one ring of cells joining the grid points on the box outline
    /// to their radial projections on the circle (centre, radius) inside it. `closed`: the circle lies
    /// wholly inside the box; otherwise the box's left side is the axis r = 0 through the centre, and
    /// the ring runs from the bottom of the box round to its top.
    void obstacle_mesh(dealii::Triangulation<2> &triangulation,
                       const std::vector<double> &xs,
                       const std::vector<double> &ys,
                       const Point<2>            &centre,
                       const double               radius,
                       const Point<2>            &box_low,
                       const Point<2>            &box_high,
                       const bool                 closed)
    {
      const double tolerance = 1e-6 * radius;
      QuadBuilder  builder(tolerance);
      const auto   inside_box = [&](const Point<2> &x) {
        return x[0] > box_low[0] && x[0] < box_high[0] && x[1] > box_low[1] && x[1] < box_high[1];
      };
      for (std::size_t i = 0; i + 1 < xs.size(); ++i)
        for (std::size_t j = 0; j + 1 < ys.size(); ++j)
          if (!inside_box(Point<2>(0.5 * (xs[i] + xs[i + 1]), 0.5 * (ys[j] + ys[j + 1]))))
            builder.quad({{Point<2>(xs[i], ys[j]), Point<2>(xs[i + 1], ys[j]), Point<2>(xs[i + 1], ys[j + 1]),
                           Point<2>(xs[i], ys[j + 1])}});

      // The box outline counter-clockwise: bottom, right, top, then (closed only) left.
      std::vector<double> box_xs, box_ys;
      for (const double x : xs)
        if (x >= box_low[0] - tolerance && x <= box_high[0] + tolerance)
          box_xs.push_back(x);
      for (const double y : ys)
        if (y >= box_low[1] - tolerance && y <= box_high[1] + tolerance)
          box_ys.push_back(y);
      std::vector<Point<2>> outline;
      for (std::size_t i = 0; i + 1 < box_xs.size(); ++i)
        outline.emplace_back(box_xs[i], box_low[1]);
      for (std::size_t j = 0; j + 1 < box_ys.size(); ++j)
        outline.emplace_back(box_high[0], box_ys[j]);
      for (std::size_t i = box_xs.size() - 1; i > 0; --i)
        outline.emplace_back(box_xs[i], box_high[1]);
      if (closed)
        for (std::size_t j = box_ys.size() - 1; j > 0; --j)
          outline.emplace_back(box_low[0], box_ys[j]);
      else
        outline.emplace_back(box_low[0], box_high[1]);

      const auto on_circle = [&](const Point<2> &x) { return centre + radius / x.distance(centre) * (x - centre); };
      const std::size_t n = outline.size();
      for (std::size_t k = 0; k < (closed ? n : n - 1); ++k)
        {
          const Point<2> &a = outline[k], &b = outline[(k + 1) % n];
          builder.quad({{on_circle(a), on_circle(b), b, a}});
        }
      builder.create(triangulation);

      // Manifolds: the circle, and transfinite interpolation inside the ring cells.
      for (const auto &cell : triangulation.active_cell_iterators())
        for (const auto &face : cell->face_iterators())
          if (face->at_boundary() && Side{face->vertex(0), face->vertex(1), tolerance}.on_circle(centre, radius))
            {
              face->set_manifold_id(circle_manifold);
              cell->set_manifold_id(ring_manifold);
            }
      triangulation.set_manifold(circle_manifold, dealii::SphericalManifold<2>(centre));
      dealii::TransfiniteInterpolationManifold<2> ring;
      ring.initialize(triangulation);
      triangulation.set_manifold(ring_manifold, ring);
    }

    /// Half-size of the box on one side of the obstacle: two radii, or up to the boundary when
    /// less than one radius would be left between them.
    double box_extent(const double clearance, const double radius)
    {
      return clearance - 2. * radius < radius ? clearance : 2. * radius;
    }

    /// Sets every boundary face's id from the role name `role_at(side)` returns.
    template <typename RoleAt>
    void set_roles(dealii::Triangulation<2> &triangulation,
                   const std::map<std::string, dealii::types::boundary_id> &roles,
                   const double tolerance,
                   const RoleAt &role_at)
    {
      for (const auto &cell : triangulation.active_cell_iterators())
        for (const auto &face : cell->face_iterators())
          if (face->at_boundary())
            face->set_boundary_id(roles.at(role_at(Side{face->vertex(0), face->vertex(1), tolerance})));
    }

    class CylinderInChannel : public Geometry
    {
    public:
      CylinderInChannel(const double length_, const double height_, const Point<2> &centre_, const double radius_)
        : length(length_)
        , height(height_)
        , centre(centre_)
        , radius(radius_)
      {}

      void create_mesh(dealii::Triangulation<2> &triangulation, const unsigned int refinement) const override
      {
        const double left = box_extent(centre[0], radius), right = box_extent(length - centre[0], radius);
        const double below = box_extent(centre[1], radius), above = box_extent(height - centre[1], radius);
        const double cell = 2. * radius;
        const auto   xs = grid_lines(centre[0] - left, centre[0], centre[0] + right, length, cell, 1., 1.);
        const auto   ys = grid_lines(centre[1] - below, centre[1], centre[1] + above, height, cell, 1., 1.);
        obstacle_mesh(triangulation, xs, ys, centre, radius, Point<2>(centre[0] - left, centre[1] - below),
                      Point<2>(centre[0] + right, centre[1] + above), /*closed=*/true);
        set_roles(triangulation, boundary_roles(), 1e-6 * radius, [&](const Side &side) {
          return side.on_line(0, 0.)     ? "inlet" :
                 side.on_line(0, length) ? "outlet" :
                 side.on_line(1, 0.)     ? "bottom wall" :
                 side.on_line(1, height) ? "top wall" :
                                           "cylinder";
        });
        triangulation.refine_global(refinement);
      }

      std::map<std::string, dealii::types::boundary_id> boundary_roles() const override
      {
        return {{"inlet", 0}, {"outlet", 1}, {"bottom wall", 2}, {"top wall", 3}, {"cylinder", 4}};
      }

      Symmetry symmetry() const override { return Symmetry::planar_only; }

    private:
      double   length, height;
      Point<2> centre;
      double   radius;
    };

    class SphereInTube : public Geometry
    {
    public:
      SphereInTube(const double tube_radius_, const double upstream_, const double downstream_, const double radius_)
        : tube_radius(tube_radius_)
        , upstream(upstream_)
        , downstream(downstream_)
        , radius(radius_)
      {}

      void create_mesh(dealii::Triangulation<2> &triangulation, const unsigned int refinement) const override
      {
        const double   outward = box_extent(tube_radius, radius);
        const double   before = box_extent(upstream, radius), after = box_extent(downstream, radius);
        const double   cell   = 2. * radius;
        const Point<2> centre(0., upstream);
        // Radially near-square cells; along the tube, cells grow away from the sphere (the
        // disturbance of creeping flow in a tube decays exponentially with distance).
        const double   growth = 1.2;
        std::vector<double> rs{0.};
        for (const double r : geometric(outward, tube_radius, cell, 1.))
          rs.push_back(r);
        const auto zs = grid_lines(upstream - before, upstream, upstream + after, upstream + downstream,
                                   std::min(cell, tube_radius), growth, growth);
        obstacle_mesh(triangulation, rs, zs, centre, radius, Point<2>(0., upstream - before),
                      Point<2>(outward, upstream + after), /*closed=*/false);
        set_roles(triangulation, boundary_roles(), 1e-6 * radius, [&](const Side &side) {
          return side.on_circle(centre, radius)         ? "sphere" :
                 side.on_line(1, 0.)                    ? "inlet" :
                 side.on_line(1, upstream + downstream) ? "outlet" :
                 side.on_line(0, 0.)                    ? "axis" :
                                                          "tube wall";
        });
        triangulation.refine_global(refinement);
      }

      std::map<std::string, dealii::types::boundary_id> boundary_roles() const override
      {
        return {{"inlet", 0}, {"outlet", 1}, {"tube wall", 2}, {"sphere", 3}, {"axis", 4}};
      }

      Symmetry symmetry() const override { return Symmetry::axisymmetric_only; }

    private:
      double tube_radius, upstream, downstream, radius;
    };
  } // namespace

  ShapeInfo cylinder_in_channel_shape()
  {
    return {"Cylinder in channel",
            "planar channel [0, L] x [0, H] with a circular cylinder of radius R_c centred at (x_c, y_c), flow "
            "along +x; roles: inlet (x = 0), outlet (x = L), bottom wall (y = 0), top wall (y = H), cylinder",
            {{"Length", "L", "m", "length of the channel along the flow", Range::above(0.)},
             {"Height", "H", "m", "gap between the channel walls", Range::above(0.)},
             {"Cylinder centre x", "x_c", "m", "distance of the cylinder's centre from the inlet", Range::above(0.)},
             {"Cylinder centre y", "y_c", "m", "height of the cylinder's centre above the bottom wall",
              Range::above(0.)},
             {"Cylinder radius", "R_c", "m", "radius of the cylinder", Range::above(0.)}},
            [](const std::vector<double> &v) -> std::unique_ptr<Geometry> {
              const double length = v[0], height = v[1], x = v[2], y = v[3], radius = v[4];
              if (!(x < length))
                throw InvalidParameter("Cylinder centre x", format_value(x),
                                       "not inside the channel (Length = " + format_value(length) + ")",
                                       "0 < Cylinder centre x < Length");
              if (!(y < height))
                throw InvalidParameter("Cylinder centre y", format_value(y),
                                       "not inside the channel (Height = " + format_value(height) + ")",
                                       "0 < Cylinder centre y < Height");
              const double clearance = std::min(std::min(x, length - x), std::min(y, height - y));
              if (!(radius < clearance))
                throw InvalidParameter("Cylinder radius", format_value(radius),
                                       "the cylinder does not fit inside the channel: it reaches the " +
                                         std::string(clearance == x ? "inlet" : clearance == length - x ? "outlet" :
                                                     clearance == y ? "bottom wall" : "top wall"),
                                       "Cylinder radius < " + format_short(clearance) +
                                         " (the centre's distance to the nearest side)");
              return std::make_unique<CylinderInChannel>(length, height, Point<2>(x, y), radius);
            },
            {0.6, 0.1, 0.1, 0.05, 0.015}};
  }

  ShapeInfo sphere_in_tube_shape()
  {
    return {"Sphere in tube",
            "axisymmetric (r, z): a sphere of radius R_s centred on the axis of a tube of radius R_t, the inlet "
            "(z = 0) L_u upstream of its centre and the outlet L_d downstream, flow along +z; roles: inlet, "
            "outlet, tube wall (r = R_t), sphere, axis (both pieces of r = 0)",
            {{"Tube radius", "R_t", "m", "inner radius of the tube", Range::above(0.)},
             {"Upstream length", "L_u", "m", "distance from the inlet to the sphere's centre", Range::above(0.)},
             {"Downstream length", "L_d", "m", "distance from the sphere's centre to the outlet", Range::above(0.)},
             {"Sphere radius", "R_s", "m", "radius of the sphere", Range::above(0.)}},
            [](const std::vector<double> &v) -> std::unique_ptr<Geometry> {
              const double tube = v[0], upstream = v[1], downstream = v[2], radius = v[3];
              if (!(radius < tube))
                throw InvalidParameter("Sphere radius", format_value(radius),
                                       "not smaller than Tube radius = " + format_value(tube),
                                       "Sphere radius < Tube radius");
              if (!(radius < upstream))
                throw InvalidParameter("Upstream length", format_value(upstream),
                                       "the sphere (radius " + format_value(radius) + ") reaches the inlet",
                                       "Upstream length > Sphere radius");
              if (!(radius < downstream))
                throw InvalidParameter("Downstream length", format_value(downstream),
                                       "the sphere (radius " + format_value(radius) + ") reaches the outlet",
                                       "Downstream length > Sphere radius");
              return std::make_unique<SphereInTube>(tube, upstream, downstream, radius);
            },
            {0.01, 0.06, 0.06, 0.004}};
  }
} // namespace lentus::meshes
