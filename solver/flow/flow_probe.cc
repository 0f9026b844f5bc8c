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

  namespace
  {
    /// The `n_components` values of the field `vector` (on `dof_handler`) at x, over all ranks: the
    /// rank whose cell holds x evaluates it. Collective. Throws std::out_of_range if no rank finds x.
    template <typename VectorType>
    std::vector<double> field_values_at(const DoFHandler<2> &dof_handler, const VectorType &vector,
                                        const unsigned int n_components, const Point<2> &x, const MPI_Comm comm)
    {
      std::vector<double> sums(n_components + 1, 0.); // values, then the number of ranks that found x
      const MappingQ1<2>  mapping;
      try
        {
          const auto found = GridTools::find_active_cell_around_point(mapping, dof_handler, x);
          if (found.first->is_locally_owned())
            {
              const Quadrature<2> at_point(GeometryInfo<2>::project_to_unit_cell(found.second));
              FEValues<2>         fe_values(mapping, dof_handler.get_fe(), at_point, update_values);
              fe_values.reinit(found.first);
              std::vector<dealii::Vector<double>> values(1, dealii::Vector<double>(n_components));
              fe_values.get_function_values(vector, values);
              for (unsigned int c = 0; c < n_components; ++c)
                sums[c] = values[0][c];
              sums[n_components] = 1.;
            }
        }
      catch (const std::exception &)
        {
          // x is not in a cell this rank knows; another rank has it.
        }
      Utilities::MPI::sum(ArrayView<const double>(sums), comm, ArrayView<double>(sums));
      if (sums[n_components] < 1.)
        throw std::out_of_range("point outside the flow domain");
      std::vector<double> values(n_components);
      for (unsigned int c = 0; c < n_components; ++c)
        values[c] = sums[c] / sums[n_components];
      return values;
    }
  } // namespace

  std::vector<double> FlowRun::values_at(const Point<2> &x) const
  {
    return field_values_at(state->mesh.dof_handler, state->solution, state->physics.n_velocity + 1, x, state->mesh.comm);
  }

  double FlowRun::temperature_at(const Point<2> &x) const
  {
    const HeatField *heat = state->physics.heat.get();
    if (!heat || !heat->solved)
      throw std::logic_error("no temperature field: the case was not solved with Heat/Energy equation = true");
    return field_values_at(heat->dof_handler, heat->temperature, 1, x, state->mesh.comm)[0];
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
