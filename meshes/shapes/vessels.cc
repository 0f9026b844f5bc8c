// Stirred vessels. The axisymmetric vessel is a tensor grid in (r, z) with the disk and the
// shaft cut out; the planar vessel is a polar grid whose angular lines bend so that every
// blade's sides are straight (x, y) lines at distance w/2 from the blade's centre line.
#include "meshes/shapes/vessels.h"

#include "meshes/spacing.h"

#include <deal.II/grid/grid_tools.h>
#include <deal.II/grid/manifold_lib.h>
#include <deal.II/grid/tria.h>

#include <algorithm>
#include <cmath>

namespace lentus::meshes
{
  namespace
  {
    using rheology::InvalidParameter;
    using rheology::ParameterInfo;
    using rheology::Range;
    using rheology::format_value;

    /// Axisymmetric vessel in (r, z): tank of radius R_T filled to H, a disk of diameter D and
    /// thickness t whose mid-plane is at clearance C above the bottom, on a shaft of radius r_s
    /// (0: no shaft) from the disk up through the free surface.
    class DiskImpellerVessel : public Geometry
    {
    public:
      DiskImpellerVessel(const double tank_radius_, const double fill_height_, const double shaft_radius_,
                         const double diameter_, const double thickness_, const double clearance_)
        : tank_radius(tank_radius_)
        , fill_height(fill_height_)
        , shaft_radius(shaft_radius_)
        , diameter(diameter_)
        , thickness(thickness_)
        , clearance(clearance_)
      {}

      void create_mesh(dealii::Triangulation<2> &triangulation, const unsigned int refinement) const override
      {
        const double tip = 0.5 * diameter, below = clearance - 0.5 * thickness, above = clearance + 0.5 * thickness;
        // Coarse cells of D/12 at the disk, its tip and the walls, growing away from them.
        const double fine = tip / 6.;
        std::vector<double> r, z;
        if (shaft_radius > 0.)
          append(r, stretched(0., shaft_radius, fine, false, true));
        append(r, stretched(shaft_radius, tip, fine, shaft_radius > 0., true));
        append(r, stretched(tip, tank_radius, fine, true, true));
        append(z, stretched(0., below, fine, true, true));
        append(z, graded(below, above, cells_for(thickness, fine), false, false));
        append(z, stretched(above, fill_height, fine, true, false));

        std::vector<dealii::Point<2>> vertices;
        for (const double zk : z)
          for (const double rj : r)
            vertices.emplace_back(rj, zk);
        std::vector<dealii::CellData<2>> cells;
        const double                     tolerance = 1e-9 * tank_radius;
        for (std::size_t k = 0; k + 1 < z.size(); ++k)
          for (std::size_t j = 0; j + 1 < r.size(); ++j)
            {
              const double rc = 0.5 * (r[j] + r[j + 1]), zc = 0.5 * (z[k] + z[k + 1]);
              const bool   disk  = rc < tip - tolerance && zc > below && zc < above;
              const bool   shaft = rc < shaft_radius - tolerance && zc > above;
              if (disk || shaft)
                continue;
              dealii::CellData<2> cell;
              const auto          n = static_cast<unsigned int>(r.size());
              cell.vertices[0]      = static_cast<unsigned int>(k * n + j);
              cell.vertices[1]      = static_cast<unsigned int>(k * n + j + 1);
              cell.vertices[2]      = static_cast<unsigned int>((k + 1) * n + j);
              cell.vertices[3]      = static_cast<unsigned int>((k + 1) * n + j + 1);
              cells.push_back(cell);
            }
        dealii::SubCellData subcells;
        dealii::GridTools::delete_unused_vertices(vertices, cells, subcells);
        triangulation.create_triangulation(vertices, cells, subcells);

        const auto roles = boundary_roles();
        for (const auto &cell : triangulation.active_cell_iterators())
          for (const auto &face : cell->face_iterators())
            if (face->at_boundary())
              {
                const dealii::Point<2> c = face->center();
                const char *role = std::abs(c[0]) < tolerance                        ? "axis" :
                                   std::abs(c[0] - tank_radius) < tolerance          ? "tank wall" :
                                   std::abs(c[1]) < tolerance                        ? "bottom" :
                                   std::abs(c[1] - fill_height) < tolerance          ? "free surface" :
                                   (c[1] > above + tolerance && shaft_radius > 0.) ? "shaft" :
                                                                                      "impeller";
                face->set_boundary_id(roles.at(role));
              }
        triangulation.refine_global(refinement);
      }

      std::map<std::string, dealii::types::boundary_id> boundary_roles() const override
      {
        std::map<std::string, dealii::types::boundary_id> roles{
          {"impeller", 0}, {"tank wall", 2}, {"bottom", 3}, {"free surface", 4}, {"axis", 5}};
        if (shaft_radius > 0.)
          roles["shaft"] = 1;
        return roles;
      }

      Symmetry symmetry() const override { return Symmetry::axisymmetric_only; }

      double impeller_diameter() const override { return diameter; }

    private:
      double tank_radius, fill_height, shaft_radius, diameter, thickness, clearance;
    };

    /// Planar vessel cross-section: a circle of radius R_T around a hub of radius r_h carrying
    /// `blades` straight blades of width w reaching out to the tip radius r_h + L_b, the first
    /// along +x. Solved in the impeller's frame, the impeller is at rest and the wall turns.
    class BladedImpellerVessel : public Geometry
    {
    public:
      BladedImpellerVessel(const double vessel_radius_, const double hub_radius_, const unsigned int blades_,
                           const double blade_length, const double blade_width_)
        : vessel_radius(vessel_radius_)
        , hub_radius(hub_radius_)
        , tip_radius(hub_radius_ + blade_length)
        , blades(blades_)
        , blade_width(blade_width_)
      {}

      void create_mesh(dealii::Triangulation<2> &triangulation, const unsigned int refinement) const override
      {
        // Angular lines: per blade sector 2 `side` cells between blades and one across the blade.
        const unsigned int side    = 2;
        const unsigned int sectors = std::max(blades, 1u);
        const unsigned int per     = blades > 0 ? 2 * side + 1 : 24;
        const unsigned int around  = sectors * per;
        const double       sector  = 2. * M_PI / sectors;
        const double       size    = blades > 0 ? 0.5 * (tip_radius - hub_radius) : 2. * M_PI * hub_radius / per;
        std::vector<double> radii;
        if (blades > 0)
          {
            append(radii, graded(hub_radius, tip_radius, cells_for(tip_radius - hub_radius, size), true, true));
            append(radii, graded(tip_radius, vessel_radius, std::max(2u, cells_for(vessel_radius - tip_radius, size)),
                                 true, true));
          }
        else
          append(radii, graded(hub_radius, vessel_radius, 8, true, true));

        // Half-angle of the band around a blade's centre line at radius rho: the blade's own
        // half-width up to the tip, then widening to an even share of the sector at the wall.
        const double even = 0.5 * sector / per;
        const auto   band = [&](const double rho) {
          const double at_tip = std::asin(0.5 * blade_width / std::min(rho, tip_radius));
          if (rho <= tip_radius)
            return at_tip;
          const double s = (rho - tip_radius) / (vessel_radius - tip_radius);
          return (1. - s) * at_tip + s * even;
        };
        std::vector<dealii::Point<2>> vertices;
        for (const double rho : radii)
          for (unsigned int i = 0; i < around; ++i)
            {
              double theta;
              if (blades == 0)
                theta = sector * i / per;
              else
                {
                  const unsigned int k = i / per, local = i % per;
                  const double       centre = sector * k, half = band(rho);
                  // local 0..side-1: from the middle between blades to the blade band; side, side + 1: band edges.
                  if (local < side)
                    theta = centre - 0.5 * sector + (0.5 * sector - half) * local / side;
                  else if (local == side)
                    theta = centre - half;
                  else
                    theta = centre + half + (0.5 * sector - half) * (local - side - 1) / side;
                }
              vertices.emplace_back(rho * std::cos(theta), rho * std::sin(theta));
            }
        std::vector<dealii::CellData<2>> cells;
        for (std::size_t j = 0; j + 1 < radii.size(); ++j)
          for (unsigned int i = 0; i < around; ++i)
            {
              const bool in_blade = blades > 0 && i % per == side && radii[j + 1] <= tip_radius * (1. + 1e-12);
              if (in_blade)
                continue;
              const unsigned int next = (i + 1) % around;
              dealii::CellData<2> cell;
              cell.vertices[0] = static_cast<unsigned int>(j * around + i);
              cell.vertices[1] = static_cast<unsigned int>((j + 1) * around + i);
              cell.vertices[2] = static_cast<unsigned int>(j * around + next);
              cell.vertices[3] = static_cast<unsigned int>((j + 1) * around + next);
              cells.push_back(cell);
            }
        dealii::SubCellData subcells;
        dealii::GridTools::delete_unused_vertices(vertices, cells, subcells);
        triangulation.create_triangulation(vertices, cells, subcells);

        // Roles; the vessel wall and the hub follow circles when refined, blades stay straight.
        const auto   roles     = boundary_roles();
        const double tolerance = 1e-9 * vessel_radius;
        for (const auto &cell : triangulation.active_cell_iterators())
          for (const auto &face : cell->face_iterators())
            if (face->at_boundary())
              {
                const double r0 = face->vertex(0).norm(), r1 = face->vertex(1).norm();
                const bool   wall = std::abs(r0 - vessel_radius) < tolerance && std::abs(r1 - vessel_radius) < tolerance;
                const bool   hub  = std::abs(r0 - hub_radius) < tolerance && std::abs(r1 - hub_radius) < tolerance;
                face->set_boundary_id(roles.at(wall ? "vessel wall" : "impeller"));
                if (wall || hub)
                  face->set_manifold_id(1);
              }
        triangulation.set_manifold(1, dealii::SphericalManifold<2>(dealii::Point<2>()));
        triangulation.refine_global(refinement);
      }

      std::map<std::string, dealii::types::boundary_id> boundary_roles() const override
      {
        return {{"impeller", 0}, {"vessel wall", 1}};
      }

      Symmetry symmetry() const override { return Symmetry::planar_only; }

      double impeller_diameter() const override { return 2. * (blades > 0 ? tip_radius : hub_radius); }

    private:
      double       vessel_radius, hub_radius, tip_radius;
      unsigned int blades;
      double       blade_width;
    };

    void require_below(const std::string &key, const double value, const std::string &limit_text, const double limit)
    {
      if (!(value < limit))
        throw InvalidParameter(key, format_value(value), "not smaller than " + limit_text + " = " + format_value(limit),
                               key + " < " + limit_text);
    }
  } // namespace

  ShapeInfo disk_impeller_vessel_shape()
  {
    return {"Disk impeller vessel",
            "axisymmetric stirred vessel in (r, z): flat-bottomed tank of radius R_T filled to height H, a flat "
            "disk impeller of diameter D and thickness t with its mid-plane at clearance C above the bottom, on "
            "a shaft of radius r_s (0: no shaft) rising through the free surface; roles: impeller (the disk), "
            "shaft, tank wall, bottom, free surface (slip), axis",
            {{"Tank radius", "R_T", "m", "inner radius of the tank", Range::above(0.)},
             {"Fill height", "H", "m", "height of the free surface above the bottom", Range::above(0.)},
             {"Shaft radius", "r_s", "m", "radius of the shaft; 0 for none", Range::at_least(0.), 0.},
             {"Impeller diameter", "D", "m", "diameter of the disk", Range::above(0.)},
             {"Disk thickness", "t", "m", "axial thickness of the disk", Range::above(0.)},
             {"Clearance", "C", "m", "height of the disk's mid-plane above the bottom", Range::above(0.)}},
            [](const std::vector<double> &v) -> std::unique_ptr<Geometry> {
              require_below("Impeller diameter", v[3], "tank diameter 2 R_T", 2. * v[0]);
              require_below("Shaft radius", v[2], "impeller radius D/2", 0.5 * v[3]);
              require_below("Disk thickness", v[4], "fill height H", v[1]);
              if (!(v[5] - 0.5 * v[4] > 0.) || !(v[5] + 0.5 * v[4] < v[1]))
                throw InvalidParameter("Clearance", format_value(v[5]),
                                       "puts the disk outside the fill (below the bottom or above the free surface)",
                                       "t/2 < C < H - t/2 = " + format_value(v[1] - 0.5 * v[4]));
              return std::make_unique<DiskImpellerVessel>(v[0], v[1], v[2], v[3], v[4], v[5]);
            },
            {0.3, 0.6, 0.015, 0.2, 0.01, 0.2}};
  }

  ShapeInfo bladed_impeller_vessel_shape()
  {
    Range blade_count = Range::at_least(0.);
    blade_count.upper = 12.;
    return {"Bladed impeller vessel",
            "planar cross-section of a cylindrical vessel of radius R_T around an impeller at its centre: a hub "
            "of radius r_h with N_b straight blades of length L_b (hub to tip) and width w, the first along +x; "
            "solve it in the impeller's frame (Flow/Reference frame = impeller); roles: impeller (hub and "
            "blades), vessel wall. Torques and powers are per metre of depth.",
            {{"Vessel radius", "R_T", "m", "inner radius of the vessel", Range::above(0.)},
             {"Hub radius", "r_h", "m", "radius of the impeller hub", Range::above(0.)},
             {"Number of blades", "N_b", "-", "whole number of blades, 0 to 12 (0: a plain rotating hub)",
              blade_count},
             {"Blade length", "L_b", "m", "radial length of a blade from the hub to its tip", Range::at_least(0.)},
             {"Blade width", "w", "m", "width (thickness) of a blade", Range::at_least(0.)}},
            [](const std::vector<double> &v) -> std::unique_ptr<Geometry> {
              if (v[2] != std::floor(v[2]))
                throw InvalidParameter("Number of blades", format_value(v[2]), "not a whole number", "0, 1, ..., 12");
              const auto blades = static_cast<unsigned int>(v[2]);
              require_below("Hub radius", v[1], "vessel radius R_T", v[0]);
              if (blades > 0)
                {
                  if (!(v[3] > 0.))
                    throw InvalidParameter("Blade length", format_value(v[3]), "must be positive with blades",
                                           "L_b > 0");
                  require_below("Blade length", v[3], "the gap R_T - r_h", v[0] - v[1]);
                  // Neighbouring blades must not touch at the hub: w/2 < r_h sin(pi / N_b), with room to mesh.
                  const double limit = 2. * v[1] * std::sin(M_PI / std::max(blades, 2u)) * 0.8;
                  if (!(v[4] > 0.) || !(v[4] < limit))
                    throw InvalidParameter("Blade width", format_value(v[4]),
                                           "blades must have a width and must not touch at the hub",
                                           "0 < w < 1.6 r_h sin(pi / N_b) = " + format_value(limit));
                }
              return std::make_unique<BladedImpellerVessel>(v[0], v[1], blades, v[3], v[4]);
            },
            {0.25, 0.03, 4., 0.1, 0.015}};
  }
} // namespace lentus::meshes
