// Vessel integrals: dead zones and the cavern. The cavern is the set of yielded cells connected through faces to the
// impeller; it is found on rank 0 from every rank's cells (a 2D mesh's cell list is small). Its
// radius and height come from the yield surface: the zero of the yield margin |tau| - tau_y,
// sampled on a grid of points in each cell and averaged where cells share a point.
#include "solver/flow/vessel_integrals.h"

#include "solver/flow/heat.h"

#include <deal.II/base/mpi.h>
#include <deal.II/base/quadrature_lib.h>
#include <deal.II/fe/fe_values.h>

#include <algorithm>
#include <array>
#include <cmath>
#include <map>
#include <set>

namespace lentus::flow
{
  using namespace dealii;

  bool has_impeller(const SolvedFlow &state)
  {
    return std::any_of(state.physics.flow.conditions.begin(), state.physics.flow.conditions.end(), [](const auto &bc) {
      return bc.type == input::BoundaryCondition::Type::impeller;
    });
  }

  Tensor<1, 3> fixed_frame_velocity(const SolvedFlow &state, const Point<2> &x, const Tensor<1, 3> &U)
  {
    Tensor<1, 3> lab = U;
    if (state.physics.flow.model.impeller_frame() && state.physics.kind == FormulationKind::planar)
      {
        const double omega = state.physics.flow.impeller_omega();
        lab[0] -= omega * x[1];
        lab[2] += omega * x[0];
      }
    return lab;
  }

  namespace
  {
    /// Points per cell side of the grid on which the yield margin |tau| - tau_y is sampled.
    constexpr unsigned int samples = 5;

    /// One cell as rank 0 needs it for the cavern: the centres of its four faces' halves where a
    /// neighbour is finer (hanging nodes), else of the faces themselves twice, whether some of it is
    /// yielded, whether it touches the impeller, the size of its yielded part, and the yield margin
    /// on a samples x samples grid of points (edges included).
    using CellRecord = std::array<double, 20 + 3 * samples * samples>;
    enum Slot
    {
      faces = 0, // 16 coordinates: two points a face
      yielded = 16,
      touches_impeller,
      yielded_measure, // yielded volume (axisymmetric, per radian) or area (planar)
      sample_grid = 20 // x, y, margin of each grid point, row by row
    };
    constexpr unsigned int face_points = 8;

    /// Face centres rounded to a grid much finer than any cell, as keys shared by neighbours.
    std::array<long long, 2> face_key(const double x, const double y, const double scale)
    {
      return {{std::llround(x / scale * 1e9), std::llround(y / scale * 1e9)}};
    }
  } // namespace

  report::VesselIntegrals vessel_integrals(const SolvedFlow &state)
  {
    const input::FlowCase &flow         = state.physics.flow;
    const bool             axisymmetric = is_axisymmetric(state.physics.kind);
    const double           tau_y        = state.physics.law->yield_stress();
    const double           tip_speed    = M_PI * flow.operating.rotation_speed * flow.geometry->impeller_diameter();
    std::set<types::boundary_id> impeller_ids;
    const auto                   roles = flow.geometry->boundary_roles();
    for (const input::BoundaryCondition &bc : flow.conditions)
      if (bc.type == input::BoundaryCondition::Type::impeller)
        impeller_ids.insert(roles.at(bc.role));

    // Dead zones and the cells of the cavern.
    const QGauss<2>                        quadrature(state.mesh.fe.degree + 1);
    FEValues<2>                            fe_values(state.mesh.fe, quadrature,
                                                     update_values | update_gradients | update_quadrature_points |
                                                       update_JxW_values);
    std::vector<dealii::Vector<double>>    values(quadrature.size(), dealii::Vector<double>(state.physics.n_velocity + 1));
    std::vector<std::vector<Tensor<1, 2>>> gradients(quadrature.size(), std::vector<Tensor<1, 2>>(state.physics.n_velocity + 1));
    double                                 sums[4] = {0., 0., 0., 0.}; // area, volume, dead area, dead volume
    std::vector<CellRecord>                records;
    double                                 scale = 0.;
    // The yield margin on a grid of points of each cell, edges included (see the cavern below).
    std::vector<Point<2>> grid;
    for (unsigned int j = 0; j < samples; ++j)
      for (unsigned int i = 0; i < samples; ++i)
        grid.emplace_back(static_cast<double>(i) / (samples - 1), static_cast<double>(j) / (samples - 1));
    const Quadrature<2>                    sample_rule(grid);
    FEValues<2>                            sample_values(state.mesh.fe, sample_rule,
                                                         update_values | update_gradients | update_quadrature_points);
    std::vector<dealii::Vector<double>>    grid_values(grid.size(), dealii::Vector<double>(state.physics.n_velocity + 1));
    std::vector<std::vector<Tensor<1, 2>>> grid_gradients(grid.size(), std::vector<Tensor<1, 2>>(state.physics.n_velocity + 1));
    LocalTemperature local(state.physics, quadrature), local_samples(state.physics, sample_rule);
    for (const auto &cell : state.mesh.dof_handler.active_cell_iterators())
      if (cell->is_locally_owned())
        {
          fe_values.reinit(cell);
          fe_values.get_function_values(state.solution, values);
          fe_values.get_function_gradients(state.solution, gradients);
          local.reinit(cell);
          CellRecord record{};
          for (unsigned int q = 0; q < quadrature.size(); ++q)
            {
              const Point<2>    &x = fe_values.quadrature_point(q);
              const double       w = volume_weight(state.physics.kind, x) * fe_values.JxW(q);
              const Kinematics   u = kinematics(state.physics.kind, x, &values[q][0], gradients[q].data());
              const double       gamma_dot = shear_rate(u.L);
              const bool         unyielded  = tau_y > 0. && local.viscosity(*state.physics.law, gamma_dot, q).value * gamma_dot < tau_y;
              const double       speed      = fixed_frame_velocity(state, x, u.U).norm();
              const bool         dead       = unyielded || speed < flow.vessel.dead_zone_fraction * tip_speed;
              sums[0] += fe_values.JxW(q);
              sums[1] += w;
              if (dead)
                {
                  sums[2] += fe_values.JxW(q);
                  sums[3] += w;
                }
              if (tau_y > 0. && !unyielded)
                {
                  record[yielded] = 1.;
                  record[yielded_measure] += w;
                }
            }
          if (tau_y > 0.)
            {
              sample_values.reinit(cell);
              sample_values.get_function_values(state.solution, grid_values);
              sample_values.get_function_gradients(state.solution, grid_gradients);
              local_samples.reinit(cell);
              for (unsigned int k = 0; k < grid.size(); ++k)
                {
                  const Point<2>    &x = sample_values.quadrature_point(k);
                  const Kinematics   u = kinematics(state.physics.kind, x, &grid_values[k][0], grid_gradients[k].data());
                  const double       gamma_dot = shear_rate(u.L);
                  record[sample_grid + 3 * k]     = x[0];
                  record[sample_grid + 3 * k + 1] = x[1];
                  record[sample_grid + 3 * k + 2] = local_samples.viscosity(*state.physics.law, gamma_dot, k).value * gamma_dot - tau_y;
                }
            }
          for (const auto face_no : cell->face_indices())
            {
              // A finer neighbour's face is a half of this one: its centre is the key they share.
              const auto face = cell->face(face_no);
              for (unsigned int half = 0; half < 2; ++half)
                {
                  const Point<2> c                           = face->has_children() ? face->child(half)->center() : face->center();
                  record[faces + 2 * (2 * face_no + half)]     = c[0];
                  record[faces + 2 * (2 * face_no + half) + 1] = c[1];
                }
              if (cell->face(face_no)->at_boundary() && impeller_ids.count(cell->face(face_no)->boundary_id()))
                record[touches_impeller] = 1.;
            }
          scale = std::max(scale, cell->center().norm() + cell->diameter());
          records.push_back(record);
        }
    Utilities::MPI::sum(ArrayView<const double>(sums, 4), state.mesh.comm, ArrayView<double>(sums, 4));
    report::VesselIntegrals result;
    result.area        = sums[0];
    result.volume      = sums[1];
    result.dead_area   = sums[2];
    result.dead_volume = sums[3];
    if (!(tau_y > 0.))
      return result;

    // Cavern: flood fill on rank 0 from the yielded cells at the impeller through yielded neighbours.
    scale                 = Utilities::MPI::max(scale, state.mesh.comm);
    const auto all        = Utilities::MPI::gather(state.mesh.comm, records, 0);
    double     cavern[4]  = {0., 0., 0., 0.}; // radius, height, measure, found
    if (state.mesh.rank == 0)
      {
        std::vector<CellRecord> cells;
        for (const auto &part : all)
          cells.insert(cells.end(), part.begin(), part.end());
        // The stress jumps across cell edges (gradients of a continuous velocity), and near the yield
        // surface of a regularized law the jump can decide the sign of the margin. Average the margin
        // over the cells sharing a point, so that it is continuous and its zero level (the yield
        // surface) falls inside cells rather than on their edges.
        std::map<std::array<long long, 2>, std::pair<double, int>> shared;
        for (const CellRecord &cell : cells)
          for (unsigned int k = 0; k < samples * samples; ++k)
            {
              auto &entry = shared[face_key(cell[sample_grid + 3 * k], cell[sample_grid + 3 * k + 1], scale)];
              entry.first += cell[sample_grid + 3 * k + 2];
              entry.second += 1;
            }
        for (CellRecord &cell : cells)
          for (unsigned int k = 0; k < samples * samples; ++k)
            {
              const auto &entry = shared[face_key(cell[sample_grid + 3 * k], cell[sample_grid + 3 * k + 1], scale)];
              cell[sample_grid + 3 * k + 2] = entry.first / entry.second;
              if (cell[sample_grid + 3 * k + 2] >= 0.)
                cell[yielded] = 1.;
            }
        double top = -HUGE_VAL, bottom = HUGE_VAL;
        // Extends the cavern by a cell's yielded grid points and the zeros of the margin's linear
        // interpolant between grid neighbours.
        const auto extend_by = [&](const CellRecord &cell) {
          const auto point = [&](const unsigned int k) {
            return Point<2>(cell[sample_grid + 3 * k], cell[sample_grid + 3 * k + 1]);
          };
          const auto extend = [&](const Point<2> &x) {
            cavern[0] = std::max(cavern[0], axisymmetric ? x[0] : x.norm());
            top       = std::max(top, x[1]);
            bottom    = std::min(bottom, x[1]);
          };
          for (unsigned int k = 0; k < samples * samples; ++k)
            {
              const double margin = cell[sample_grid + 3 * k + 2];
              if (margin >= 0.)
                extend(point(k));
              // The neighbours to the right and above.
              for (const unsigned int n : {k % samples + 1 < samples ? k + 1 : k, k + samples < samples * samples ? k + samples : k})
                {
                  const double other = cell[sample_grid + 3 * n + 2];
                  if (n != k && (margin >= 0.) != (other >= 0.))
                    extend(point(k) + (point(n) - point(k)) * (margin / (margin - other)));
                }
            }
        };
        std::map<std::array<long long, 2>, std::vector<std::size_t>> by_face;
        for (std::size_t i = 0; i < cells.size(); ++i)
          {
            std::set<std::array<long long, 2>> keys; // a face without halves gives its centre twice
            for (unsigned int f = 0; f < face_points; ++f)
              keys.insert(face_key(cells[i][faces + 2 * f], cells[i][faces + 2 * f + 1], scale));
            for (const auto &key : keys)
              by_face[key].push_back(i);
          }
        std::vector<bool>        reached(cells.size(), false);
        std::vector<std::size_t> front;
        for (std::size_t i = 0; i < cells.size(); ++i)
          if (cells[i][yielded] > 0. && cells[i][touches_impeller] > 0.)
            {
              reached[i] = true;
              front.push_back(i);
            }
        while (!front.empty())
          {
            const std::size_t i = front.back();
            front.pop_back();
            extend_by(cells[i]);
            cavern[2] += cells[i][yielded_measure];
            cavern[3] = 1.;
            for (unsigned int f = 0; f < face_points; ++f)
              for (const std::size_t j :
                   by_face[face_key(cells[i][faces + 2 * f], cells[i][faces + 2 * f + 1], scale)])
                if (!reached[j] && cells[j][yielded] > 0.)
                  {
                    reached[j] = true;
                    front.push_back(j);
                  }
          }
        cavern[1] = cavern[3] > 0. && top >= bottom ? top - bottom : 0.; // no yielded sample: no extent
      }
    MPI_Bcast(cavern, 4, MPI_DOUBLE, 0, state.mesh.comm);
    result.cavern_radius  = cavern[0];
    result.cavern_height  = cavern[1];
    result.cavern_measure = cavern[2];
    return result;
  }
} // namespace lentus::flow
