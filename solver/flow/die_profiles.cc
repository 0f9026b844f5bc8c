// Profiles of a die as CSV: the velocity across the exit, and the wall shear rate and stress
// along every no-slip wall (for the land: the developed values, the entry overshoot and the exit).
#include "solver/flow/fields.h"
#include "solver/flow/heat.h"

#include "solver/formulation/kinematics.h"

#include <deal.II/base/mpi.h>
#include <deal.II/base/quadrature_lib.h>
#include <deal.II/fe/fe_values.h>

#include <algorithm>
#include <array>
#include <cmath>
#include <sstream>

namespace lentus::flow
{
  using namespace dealii;

  std::string exit_profile_csv(const FlowState &state)
  {
    const auto roles = state.physics.flow.geometry->boundary_roles();
    if (!roles.count("outlet"))
      return "";
    const types::boundary_id outlet = roles.at("outlet");
    // Nodes of the outlet faces: the face's support points of the first velocity component.
    const Quadrature<1> nodes(state.mesh.fe.base_element(0).get_unit_face_support_points());
    FEFaceValues<2>     face_values(state.mesh.fe, nodes, update_values | update_quadrature_points | update_normal_vectors);
    std::vector<dealii::Vector<double>> values(nodes.size(), dealii::Vector<double>(state.physics.n_velocity + 1));
    std::vector<std::array<double, 5>>  rows; // transverse coordinate, x, y, normal velocity, tangential velocity
    for (const auto &cell : state.mesh.dof_handler.active_cell_iterators())
      if (cell->is_locally_owned())
        for (const auto face_no : cell->face_indices())
          if (cell->face(face_no)->at_boundary() && cell->face(face_no)->boundary_id() == outlet)
            {
              face_values.reinit(cell, face_no);
              face_values.get_function_values(state.solution, values);
              for (unsigned int q = 0; q < nodes.size(); ++q)
                {
                  const Point<2>     &x = face_values.quadrature_point(q);
                  const Tensor<1, 2> &n = face_values.normal_vector(q);
                  const int           t = std::abs(n[0]) > std::abs(n[1]) ? 1 : 0;
                  const double        normal = values[q][0] * n[0] + values[q][1] * n[1];
                  const double        tangential = values[q][0] * n[1] - values[q][1] * n[0];
                  rows.push_back(std::array<double, 5>{{x[t], x[0], x[1], normal, tangential}});
                }
            }
    const auto all = Utilities::MPI::gather(state.mesh.comm, rows, 0);
    if (state.mesh.rank != 0)
      return "";
    std::vector<std::array<double, 5>> merged;
    for (const auto &part : all)
      merged.insert(merged.end(), part.begin(), part.end());
    std::sort(merged.begin(), merged.end());
    std::ostringstream csv;
    csv << (is_axisymmetric(state.physics.kind) ? "r [m],z [m]" : "x [m],y [m]")
        << ",outflow velocity [m/s],tangential velocity [m/s]\n";
    csv.precision(10);
    for (std::size_t i = 0; i < merged.size(); ++i)
      if (i == 0 || std::abs(merged[i][0] - merged[i - 1][0]) > 1e-12 * (std::abs(merged[i][0]) + 1e-300))
        csv << merged[i][1] << ',' << merged[i][2] << ',' << merged[i][3] << ',' << merged[i][4] << '\n';
    return csv.str();
  }

  std::string wall_profile_csv(const FlowState &state)
  {
    const auto roles = state.physics.flow.geometry->boundary_roles();
    if (!roles.count("outlet"))
      return "";
    // Walls: the roles with a no-slip condition, in the order of the case file.
    std::vector<std::string> walls;
    for (const input::BoundaryCondition &bc : state.physics.flow.conditions)
      if (bc.type == input::BoundaryCondition::Type::no_slip)
        walls.push_back(bc.role);
    if (walls.empty())
      return "";
    const types::boundary_id outlet = roles.at("outlet");
    const QGauss<1>          quadrature(state.mesh.fe.degree + 1);
    FEFaceValues<2>          face_values(state.mesh.fe, quadrature,
                                         update_values | update_gradients | update_quadrature_points |
                                           update_normal_vectors);
    std::vector<dealii::Vector<double>>    values(quadrature.size(), dealii::Vector<double>(state.physics.n_velocity + 1));
    std::vector<std::vector<Tensor<1, 2>>> gradients(quadrature.size(), std::vector<Tensor<1, 2>>(state.physics.n_velocity + 1));
    // The flow direction is the outlet's normal: the axis along which the rows are ordered.
    int axial = -1;
    for (const auto &cell : state.mesh.dof_handler.active_cell_iterators())
      if (cell->is_locally_owned())
        for (const auto face_no : cell->face_indices())
          if (cell->face(face_no)->at_boundary() && cell->face(face_no)->boundary_id() == outlet)
            {
              const Tensor<1, 2> edge = cell->face(face_no)->vertex(1) - cell->face(face_no)->vertex(0);
              axial                   = std::abs(edge[0]) < std::abs(edge[1]) ? 0 : 1;
            }
    axial = Utilities::MPI::max(axial, state.mesh.comm);
    if (axial < 0)
      return "";
    // Rows: wall index, axial coordinate, x, y, shear rate, stress.
    std::vector<std::array<double, 6>> rows;
    for (std::size_t w = 0; w < walls.size(); ++w)
      {
        const types::boundary_id id = roles.at(walls[w]);
        for (const auto &cell : state.mesh.dof_handler.active_cell_iterators())
          if (cell->is_locally_owned())
            for (const auto face_no : cell->face_indices())
              if (cell->face(face_no)->at_boundary() && cell->face(face_no)->boundary_id() == id)
                {
                  face_values.reinit(cell, face_no);
                  face_values.get_function_values(state.solution, values);
                  face_values.get_function_gradients(state.solution, gradients);
                  for (unsigned int q = 0; q < quadrature.size(); ++q)
                    {
                      const Point<2>    &x = face_values.quadrature_point(q);
                      const Kinematics   u = kinematics(state.physics.kind, x, &values[q][0], gradients[q].data());
                      const double       rate = shear_rate(u.L);
                      const double eta =
                        state.physics.heat && state.physics.heat->coupled ?
                          viscosity_at_point(state.physics, cell,
                                             face_values.get_mapping().transform_real_to_unit_cell(cell, x), rate).value :
                          state.physics.law->evaluate(rate).value;
                      rows.push_back({{static_cast<double>(w), x[axial], x[0], x[1], rate, eta * rate}});
                    }
                }
      }
    const auto all = Utilities::MPI::gather(state.mesh.comm, rows, 0);
    if (state.mesh.rank != 0)
      return "";
    std::vector<std::array<double, 6>> merged;
    for (const auto &part : all)
      merged.insert(merged.end(), part.begin(), part.end());
    std::sort(merged.begin(), merged.end());
    std::ostringstream csv;
    csv << "role," << (is_axisymmetric(state.physics.kind) ? "r [m],z [m]" : "x [m],y [m]")
        << ",wall shear rate [1/s],wall shear stress [Pa]\n";
    csv.precision(10);
    for (const auto &row : merged)
      csv << walls[static_cast<std::size_t>(row[0])] << ',' << row[2] << ',' << row[3] << ',' << row[4] << ','
          << row[5] << '\n';
    return csv.str();
  }
} // namespace lentus::flow
