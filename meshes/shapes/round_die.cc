// Axisymmetric round die: barrel (reservoir), converging entry (half-angle, or
// abrupt at 90 degrees) and land, in the meridional plane (r, z), flow along +z.
#include "meshes/shapes/round_die.h"

#include <deal.II/grid/tria.h>

#include <cmath>
#include <functional>

namespace lentus::meshes
{
  namespace
  {
    using rheology::InvalidParameter;
    using rheology::ParameterInfo;
    using rheology::Range;
    using rheology::format_value;

    /// A structured mesh given by rows at increasing z, each row a list of radii from 0 outwards;
    /// the cells between two rows span the columns both rows have (so a row with fewer columns
    /// makes an abrupt step).
    void rows_to_mesh(dealii::Triangulation<2> &triangulation,
                      const std::vector<double> &z,
                      const std::vector<std::vector<double>> &radii)
    {
      std::vector<dealii::Point<2>>          vertices;
      std::vector<std::vector<unsigned int>> index(z.size());
      for (std::size_t k = 0; k < z.size(); ++k)
        for (const double r : radii[k])
          {
            index[k].push_back(static_cast<unsigned int>(vertices.size()));
            vertices.emplace_back(r, z[k]);
          }
      std::vector<dealii::CellData<2>> cells;
      for (std::size_t k = 0; k + 1 < z.size(); ++k)
        {
          const std::size_t columns = std::min(radii[k].size(), radii[k + 1].size());
          for (std::size_t j = 0; j + 1 < columns; ++j)
            {
              dealii::CellData<2> cell;
              cell.vertices[0] = index[k][j];
              cell.vertices[1] = index[k][j + 1];
              cell.vertices[2] = index[k + 1][j];
              cell.vertices[3] = index[k + 1][j + 1];
              cells.push_back(cell);
            }
        }
      triangulation.create_triangulation(vertices, cells, dealii::SubCellData());
    }

    std::vector<double> evenly(const double from, const double to, const unsigned int n)
    {
      std::vector<double> points;
      for (unsigned int i = 0; i <= n; ++i)
        points.push_back(from + (to - from) * i / n);
      return points;
    }

    /// Round die (axisymmetric; transverse coordinate r, axis at r = 0) or flat-sheet slit die
    /// (planar; transverse coordinate x, symmetry plane at x = 0, the half gap meshed).
    class RoundDie : public Geometry
    {
    public:
      RoundDie(const double barrel_radius_,
               const double barrel_length_,
               const double half_angle_degrees,
               const double land_radius_,
               const double land_length_,
               const bool   slit_ = false)
        : slit(slit_)
        , barrel_radius(barrel_radius_)
        , barrel_length(barrel_length_)
        , half_angle(half_angle_degrees * M_PI / 180.)
        , land_radius(land_radius_)
        , land_length(land_length_)
      {}

      void create_mesh(dealii::Triangulation<2> &triangulation, const unsigned int refinement) const override
      {
        // Coarse cells about as long as wide: the land radius gets `inner` cells.
        const unsigned int  inner = 2;
        const double        cell  = land_radius / inner;
        const bool          abrupt = half_angle >= 0.5 * M_PI - 1e-12;
        const double        cone_length = abrupt ? 0. : (barrel_radius - land_radius) / std::tan(half_angle);
        std::vector<double> z;
        std::vector<std::vector<double>> radii;
        const auto add_rows = [&](const double from, const double to, const std::function<std::vector<double>(double)> &row,
                                  const double spacing, const bool include_first) {
          const unsigned int n = std::max(1u, static_cast<unsigned int>(std::round((to - from) / spacing)));
          for (unsigned int i = include_first ? 0 : 1; i <= n; ++i)
            {
              const double level = from + (to - from) * i / n;
              z.push_back(level);
              radii.push_back(row(level));
            }
        };
        if (abrupt)
          {
            // Barrel: inner column [0, R_l] and outer ring [R_l, R_b]; land: inner column only.
            const unsigned int outer = std::max(1u, static_cast<unsigned int>(std::round((barrel_radius - land_radius) / cell)));
            const auto barrel_row = [&](double) {
              std::vector<double> row = evenly(0., land_radius, inner);
              const auto          ring = evenly(land_radius, barrel_radius, outer);
              row.insert(row.end(), ring.begin() + 1, ring.end());
              return row;
            };
            add_rows(0., barrel_length, barrel_row, barrel_radius / (inner + outer), true);
            add_rows(barrel_length, barrel_length + land_length, [&](double) { return evenly(0., land_radius, inner); },
                     cell, false);
          }
        else
          {
            // One column of `columns` cells whose width follows the wall: barrel, cone, land.
            const unsigned int columns = std::max(inner, static_cast<unsigned int>(std::round(barrel_radius / cell / 2.)));
            const auto radius_at = [&](const double level) {
              if (level <= barrel_length)
                return barrel_radius;
              if (level >= barrel_length + cone_length)
                return land_radius;
              return barrel_radius - (level - barrel_length) * std::tan(half_angle);
            };
            const auto row = [&](const double level) { return evenly(0., radius_at(level), columns); };
            add_rows(0., barrel_length, row, barrel_radius / columns, true);
            add_rows(barrel_length, barrel_length + cone_length, row, 0.5 * (barrel_radius + land_radius) / columns, false);
            add_rows(barrel_length + cone_length, barrel_length + cone_length + land_length, row, land_radius / columns,
                     false);
          }
        rows_to_mesh(triangulation, z, radii);

        const double end = z.back();
        const auto   roles = boundary_roles();
        for (const auto &cell_iterator : triangulation.active_cell_iterators())
          for (const auto &face : cell_iterator->face_iterators())
            if (face->at_boundary())
              {
                const dealii::Point<2> center = face->center();
                const double           tolerance = 1e-9 * end;
                const char *role = std::abs(center[1]) < tolerance       ? "inlet" :
                                   std::abs(center[1] - end) < tolerance ? "outlet" :
                                   std::abs(center[0]) < tolerance       ? (slit ? "symmetry" : "axis") :
                                                                           "wall";
                face->set_boundary_id(roles.at(role));
              }
        triangulation.refine_global(refinement);
      }

      std::map<std::string, dealii::types::boundary_id> boundary_roles() const override
      {
        return {{"inlet", 0}, {"outlet", 1}, {"wall", 2}, {slit ? "symmetry" : "axis", 3}};
      }

      Symmetry symmetry() const override { return slit ? Symmetry::planar_only : Symmetry::axisymmetric_only; }

      std::vector<StraightSection> straight_sections() const override
      {
        const double fraction = slit ? 0.5 : 1.;
        return {{"barrel", !slit, barrel_radius, barrel_length, fraction},
                {"land", !slit, land_radius, land_length, fraction}};
      }

    private:
      bool   slit;
      double barrel_radius, barrel_length, half_angle, land_radius, land_length;
    };
  } // namespace

  namespace
  {
    /// The entry half-angle row shared by the die shapes: 0 < alpha <= 90 degrees, default abrupt.
    ParameterInfo entry_half_angle()
    {
      Range range = Range::above(0.);
      range.upper = 90.;
      return {"Entry half-angle", "alpha", "degree", "half-angle of the converging entry; 90 for an abrupt entry",
              range, 90.};
    }
  } // namespace

  ShapeInfo round_die_shape()
  {
    return {"Round die",
            "axisymmetric round die in (r, z), flow along +z: barrel (reservoir) of radius R_b and length L_b, "
            "converging entry of half-angle alpha (90: abrupt), land of radius R_l and length L_l; roles: inlet "
            "(z = 0), outlet (end of the land), wall, axis",
            {{"Barrel radius", "R_b", "m", "radius of the reservoir upstream of the die", Range::above(0.)},
             {"Barrel length", "L_b", "m", "length of the reservoir modelled", Range::above(0.)},
             entry_half_angle(),
             {"Land radius", "R_l", "m", "radius of the die land (the capillary)", Range::above(0.)},
             {"Land length", "L_l", "m", "length of the die land", Range::above(0.)}},
            [](const std::vector<double> &v) -> std::unique_ptr<Geometry> {
              if (!(v[3] < v[0]))
                throw InvalidParameter("Land radius", format_value(v[3]),
                                       "not smaller than Barrel radius = " + format_value(v[0]),
                                       "Land radius < Barrel radius");
              return std::make_unique<RoundDie>(v[0], v[1], v[2], v[3], v[4]);
            },
            {0.01, 0.02, 30., 0.0015, 0.015}};
  }

  ShapeInfo slit_die_shape()
  {
    return {"Slit die",
            "planar flat-sheet slit die, half of the gap meshed (x >= 0, symmetry plane x = 0), flow along +y: "
            "manifold gap of half-width H_b and length L_b, converging entry of half-angle alpha (90: abrupt), "
            "land of half-gap H_l and length L_l; roles: inlet (y = 0), outlet (end of the land), wall, symmetry. "
            "Flow rates are per metre of die width and for the half gap.",
            {{"Manifold half-gap", "H_b", "m", "half-width of the gap upstream of the land", Range::above(0.)},
             {"Manifold length", "L_b", "m", "length of the upstream gap modelled", Range::above(0.)},
             entry_half_angle(),
             {"Land half-gap", "H_l", "m", "half of the die-land opening", Range::above(0.)},
             {"Land length", "L_l", "m", "length of the die land", Range::above(0.)}},
            [](const std::vector<double> &v) -> std::unique_ptr<Geometry> {
              if (!(v[3] < v[0]))
                throw InvalidParameter("Land half-gap", format_value(v[3]),
                                       "not smaller than Manifold half-gap = " + format_value(v[0]),
                                       "Land half-gap < Manifold half-gap");
              return std::make_unique<RoundDie>(v[0], v[1], v[2], v[3], v[4], true);
            },
            {0.003, 0.01, 45., 0.0005, 0.02}};
  }
} // namespace lentus::meshes
