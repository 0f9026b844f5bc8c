// Point values and error norms of a solved flow.
#include "solver/flow/flow_run.h"
#include "solver/flow/flow_state.h"
#include "solver/flow/heat.h"

#include <deal.II/base/quadrature_lib.h>
#include <deal.II/fe/fe_values.h>
#include <deal.II/fe/mapping_q1.h>
#include <deal.II/grid/grid_tools.h>
#include <deal.II/lac/vector.h>

#include <cmath>
#include <stdexcept>

namespace lentus::flow
{
  using namespace dealii;

  std::vector<double> FlowRun::values_at(const Point<2> &x) const
  {
    const unsigned int  n_components = state->physics.n_velocity + 1;
    std::vector<double> sums(n_components + 1, 0.); // values, then the number of ranks that found x
    const MappingQ1<2>  mapping;
    try
      {
        const auto found = GridTools::find_active_cell_around_point(mapping, state->mesh.dof_handler, x);
        if (found.first->is_locally_owned())
          {
            const Quadrature<2> at_point(GeometryInfo<2>::project_to_unit_cell(found.second));
            FEValues<2>         fe_values(mapping, state->mesh.fe, at_point, update_values);
            fe_values.reinit(found.first);
            std::vector<dealii::Vector<double>> values(1, dealii::Vector<double>(n_components));
            fe_values.get_function_values(state->solution, values);
            for (unsigned int c = 0; c < n_components; ++c)
              sums[c] = values[0][c];
            sums[n_components] = 1.;
          }
      }
    catch (const std::exception &)
      {
        // x is not in a cell this rank knows; another rank has it.
      }
    Utilities::MPI::sum(ArrayView<const double>(sums), state->mesh.comm, ArrayView<double>(sums));
    if (sums[n_components] < 1.)
      throw std::out_of_range("point outside the flow domain");
    std::vector<double> values(n_components);
    for (unsigned int c = 0; c < n_components; ++c)
      values[c] = sums[c] / sums[n_components];
    return values;
  }

  double FlowRun::temperature_at(const Point<2> &x) const
  {
    const HeatField *heat = state->physics.heat.get();
    if (!heat || !heat->solved)
      throw std::logic_error("no temperature field: the case was not solved with Heat/Energy equation = true");
    double             sums[2] = {0., 0.}; // temperature, number of ranks that found x
    const MappingQ1<2> mapping;
    try
      {
        const auto found = GridTools::find_active_cell_around_point(mapping, heat->dof_handler, x);
        if (found.first->is_locally_owned())
          {
            const Quadrature<2> at_point(GeometryInfo<2>::project_to_unit_cell(found.second));
            FEValues<2>         fe_values(mapping, heat->fe, at_point, update_values);
            fe_values.reinit(found.first);
            std::vector<double> value(1);
            fe_values.get_function_values(heat->temperature, value);
            sums[0] = value[0];
            sums[1] = 1.;
          }
      }
    catch (const std::exception &)
      {
        // x is not in a cell this rank knows; another rank has it.
      }
    Utilities::MPI::sum(ArrayView<const double>(sums, 2), state->mesh.comm, ArrayView<double>(sums, 2));
    if (sums[1] < 1.)
      throw std::out_of_range("point outside the flow domain");
    return sums[0] / sums[1];
  }

  double FlowRun::velocity_error(const std::function<Tensor<1, 2>(const Point<2> &)> &exact) const
  {
    const QGauss<2> quadrature(state->mesh.fe.degree + 2);
    FEValues<2>     fe_values(state->mesh.fe, quadrature, update_values | update_quadrature_points | update_JxW_values);
    std::vector<dealii::Vector<double>> values(quadrature.size(), dealii::Vector<double>(state->physics.n_velocity + 1));
    double                              sum = 0.;
    for (const auto &cell : state->mesh.dof_handler.active_cell_iterators())
      if (cell->is_locally_owned())
        {
          fe_values.reinit(cell);
          fe_values.get_function_values(state->solution, values);
          for (unsigned int q = 0; q < quadrature.size(); ++q)
            {
              const Point<2>     &x = fe_values.quadrature_point(q);
              const Tensor<1, 2> u = exact(x);
              const double       w = volume_weight(state->physics.kind, x) * fe_values.JxW(q);
              for (unsigned int c = 0; c < 2; ++c)
                sum += std::pow(values[q][c] - u[c], 2) * w;
            }
        }
    return std::sqrt(Utilities::MPI::sum(sum, state->mesh.comm));
  }
} // namespace lentus::flow
