// Axisymmetric round die: barrel (reservoir), converging entry (half-angle, or
// abrupt at 90 degrees) and land, in the meridional plane (r, z), flow along +z.
#include "meshes/shapes/round_die.h"

#include "meshes/spacing.h"

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

    /// A structured mesh given by rows at increasing z, each row a list of transverse positions from
    /// the centre (axis, symmetry plane or mandrel) outwards; the cells between two rows span the
    /// columns both rows have (so a row with fewer columns makes an abrupt step).
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

    /// Round die (axisymmetric; transverse coordinate r, axis at r = 0, or a mandrel of radius R_m
    /// along the whole die for a tube die) or flat-sheet slit die (planar; transverse coordinate x,
    /// symmetry plane at x = 0, the half gap meshed).
    ///
    /// Grading: across the flow, cells are up to 3x finer at the walls (sine grading, 3 coarse cells
    /// across the land); along the flow, they start at the wall cell size at the entry corners and
    /// grow by 1.3 per cell away from them, up to the channel's width; the abrupt entry's outer ring is
    /// fine at the re-entrant corner and at the barrel wall.
    class RoundDie : public Geometry
    {
    public:
      RoundDie(const double barrel_radius_,
               const double barrel_length_,
               const double half_angle_degrees,
               const double land_radius_,
               const double land_length_,
               const double mandrel_radius_,
               const bool   slit_)
        : slit(slit_)
        , barrel_radius(barrel_radius_)
        , barrel_length(barrel_length_)
        , half_angle(half_angle_degrees * M_PI / 180.)
        , land_radius(land_radius_)
        , land_length(land_length_)
        , mandrel_radius(mandrel_radius_)
      {}

      void create_mesh(dealii::Triangulation<2> &triangulation, const unsigned int refinement) const override
      {
        const bool   mandrel     = mandrel_radius > 0.;
        const bool   abrupt      = half_angle >= 0.5 * M_PI - 1e-12;
        const double cone_length = abrupt ? 0. : (barrel_radius - land_radius) / std::tan(half_angle);
        const double entry = barrel_length, land_start = barrel_length + cone_length;
        const double end   = land_start + land_length;
        const double gap   = land_radius - mandrel_radius; // the land's width across the flow
        // Across the land: 3 cells, finer toward the wall (and the mandrel).
        const std::vector<double> land_row = graded(mandrel_radius, land_radius, 3, mandrel, true);
        const double              fine     = land_row.back() - land_row[land_row.size() - 2];
        std::vector<double>       z;
        std::vector<std::vector<double>> radii;
        const auto add_rows = [&](const std::vector<double> &levels, const std::function<std::vector<double>(double)> &row) {
          for (std::size_t i = z.empty() ? 0 : 1; i < levels.size(); ++i)
            {
              z.push_back(levels[i]);
              radii.push_back(row(levels[i]));
            }
        };
        if (abrupt)
          {
            // Barrel: the land's column [R_m, R_l] and an outer ring [R_l, R_b]; land: that column only.
            std::vector<double> barrel_row = land_row;
            append(barrel_row, stretched(land_radius, barrel_radius, fine, true, true));
            add_rows(stretched(0., entry, fine, false, true, barrel_radius - mandrel_radius),
                     [&](double) { return barrel_row; });
            add_rows(stretched(entry, end, fine, true, false, gap), [&](double) { return land_row; });
          }
        else
          {
            // One set of columns whose width follows the wall: barrel, cone, land; as many columns as
            // the barrel is wide in land gaps (at least 3).
            const unsigned int columns =
              std::max(3u, cells_for(barrel_radius - mandrel_radius, land_radius - mandrel_radius));
            const auto radius_at = [&](const double level) {
              if (level <= entry)
                return barrel_radius;
              if (level >= land_start)
                return land_radius;
              return barrel_radius - (level - entry) * std::tan(half_angle);
            };
            const auto row = [&](const double level) {
              return graded(mandrel_radius, radius_at(level), columns, mandrel, true);
            };
            const double land_fine   = row(end).back() - row(end)[columns - 1];
            const double barrel_fine = row(0.).back() - row(0.)[columns - 1];
            add_rows(stretched(0., entry, barrel_fine, false, true, barrel_radius - mandrel_radius), row);
            const double spacing = 0.5 * (barrel_radius + land_radius - 2. * mandrel_radius) / columns;
            add_rows(graded(entry, land_start, cells_for(cone_length, spacing), true, true), row);
            add_rows(stretched(land_start, end, land_fine, true, false, gap), row);
          }
        rows_to_mesh(triangulation, z, radii);

        const auto roles = boundary_roles();
        for (const auto &cell_iterator : triangulation.active_cell_iterators())
          for (const auto &face : cell_iterator->face_iterators())
            if (face->at_boundary())
              {
                const dealii::Point<2> center = face->center();
                const double           tolerance = 1e-9 * end;
                const char *role = std::abs(center[1]) < tolerance                  ? "inlet" :
                                   std::abs(center[1] - end) < tolerance            ? "outlet" :
                                   std::abs(center[0] - mandrel_radius) < tolerance ? centre_role() :
                                                                                      "wall";
                face->set_boundary_id(roles.at(role));
              }
        triangulation.refine_global(refinement);
      }

      std::map<std::string, dealii::types::boundary_id> boundary_roles() const override
      {
        return {{"inlet", 0}, {"outlet", 1}, {"wall", 2}, {centre_role(), 3}};
      }

      Symmetry symmetry() const override { return slit ? Symmetry::planar_only : Symmetry::axisymmetric_only; }

      std::vector<StraightSection> straight_sections() const override
      {
        const double fraction = slit ? 0.5 : 1.;
        return {{"barrel", !slit, barrel_radius, barrel_length, fraction, mandrel_radius},
                {"land", !slit, land_radius, land_length, fraction, mandrel_radius}};
      }

    private:
      bool   slit;
      double barrel_radius, barrel_length, half_angle, land_radius, land_length, mandrel_radius;

      /// The role at the centre of the cross-section.
      const char *centre_role() const { return slit ? "symmetry" : mandrel_radius > 0. ? "mandrel" : "axis"; }
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
            "converging entry of half-angle alpha (90: abrupt), land of radius R_l and length L_l; optionally "
            "a mandrel of radius R_m along the whole die (an annular tube die); roles: inlet (z = 0), outlet "
            "(end of the land), wall, and axis (no mandrel) or mandrel",
            {{"Barrel radius", "R_b", "m", "radius of the reservoir upstream of the die", Range::above(0.)},
             {"Barrel length", "L_b", "m", "length of the reservoir modelled", Range::above(0.)},
             entry_half_angle(),
             {"Land radius", "R_l", "m", "radius of the die land (the capillary)", Range::above(0.)},
             {"Land length", "L_l", "m", "length of the die land", Range::above(0.)},
             {"Mandrel radius", "R_m", "m", "radius of a mandrel on the axis through the whole die (tube die); 0 for none",
              Range::at_least(0.), 0.}},
            [](const std::vector<double> &v) -> std::unique_ptr<Geometry> {
              if (!(v[3] < v[0]))
                throw InvalidParameter("Land radius", format_value(v[3]),
                                       "not smaller than Barrel radius = " + format_value(v[0]),
                                       "Land radius < Barrel radius");
              if (!(v[5] < v[3]))
                throw InvalidParameter("Mandrel radius", format_value(v[5]),
                                       "not smaller than Land radius = " + format_value(v[3]),
                                       "0 <= Mandrel radius < Land radius");
              return std::make_unique<RoundDie>(v[0], v[1], v[2], v[3], v[4], v[5], false);
            },
            {0.01, 0.02, 30., 0.0015, 0.015, 0.}};
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
              return std::make_unique<RoundDie>(v[0], v[1], v[2], v[3], v[4], 0., true);
            },
            {0.003, 0.01, 45., 0.0005, 0.02}};
  }
} // namespace lentus::meshes
