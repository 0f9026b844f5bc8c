// Field output: the solution and derived fields as VTU/PVTU/PVD.
#include "solver/flow/fields.h"

#include "solver/flow/heat.h"
#include "solver/flow/vessel_integrals.h"

#include <deal.II/base/quadrature_lib.h>
#include <deal.II/dofs/dof_tools.h>
#include <deal.II/fe/fe_values.h>
#include <deal.II/fe/mapping_q1.h>
#include <deal.II/numerics/data_out.h>
#include <deal.II/numerics/data_postprocessor.h>

#include <algorithm>
#include <array>
#include <cmath>
#include <fstream>
#include <sstream>

namespace lentus::flow
{
  using namespace dealii;

  namespace
  {
    /// Shear rate, viscosity, the stress magnitude |tau| = eta gamma_dot = sqrt(tau:tau / 2) (1/sqrt(3) of
    /// the von Mises equivalent stress of structural mechanics), the unyielded indicator and the speed.
    class DerivedFields : public DataPostprocessor<2>
    {
    public:
      explicit DerivedFields(const FlowState &state_) : state(state_) {}

      void evaluate_vector_field(const DataPostprocessorInputs::Vector<2> &inputs,
                                 std::vector<dealii::Vector<double>> &computed) const override
      {
        const double tau_y   = state.physics.law->yield_stress();
        const bool   thermal = state.physics.heat && state.physics.heat->coupled;
        const MappingQ1<2> mapping;
        for (unsigned int q = 0; q < inputs.solution_values.size(); ++q)
          {
            double       values[3];
            Tensor<1, 2> gradients[3];
            for (unsigned int c = 0; c < state.physics.n_velocity; ++c)
              {
                values[c]    = inputs.solution_values[q][c];
                gradients[c] = inputs.solution_gradients[q][c];
              }
            const Point<2> &x = inputs.evaluation_points[q];
            // On the axis r = 0 the hoop terms are limits; evaluate just off it.
            const Point<2>     at(is_axisymmetric(state.physics.kind) ? std::max(x[0], 1e-12) : x[0], x[1]);
            const Kinematics   u         = kinematics(state.physics.kind, at, values, gradients);
            const double       gamma_dot = shear_rate(u.L);
            // With the energy equation, the viscosity at the point's temperature.
            const double eta =
              thermal ? viscosity_at_point(state.physics, inputs.template get_cell<2>(),
                                           mapping.transform_real_to_unit_cell(inputs.template get_cell<2>(), x), gamma_dot)
                          .value :
                        state.physics.law->evaluate(gamma_dot).value;
            computed[q](0)               = gamma_dot;
            computed[q](1)               = eta;
            computed[q](2)               = eta * gamma_dot;
            computed[q](3)               = (tau_y > 0. && eta * gamma_dot < tau_y) ? 1. : 0.;
            computed[q](4)               = fixed_frame_velocity(state, at, u.U).norm();
          }
      }

      std::vector<std::string> get_names() const override
      {
        return {"shear_rate", "viscosity", "stress_magnitude", "unyielded", "speed"};
      }

      UpdateFlags get_needed_update_flags() const override
      {
        return update_values | update_gradients | update_quadrature_points;
      }

    private:
      const FlowState &state;
    };

  } // namespace

  void write_fields(const FlowState &state, const std::string &folder)
  {
    DataOut<2>               data_out;
    std::vector<std::string> names;
    std::vector<DataComponentInterpretation::DataComponentInterpretation> interpretation;
    for (unsigned int c = 0; c < 2; ++c)
      {
        names.emplace_back("velocity");
        interpretation.push_back(DataComponentInterpretation::component_is_part_of_vector);
      }
    if (state.physics.n_velocity == 3)
      {
        names.emplace_back("swirl_velocity");
        interpretation.push_back(DataComponentInterpretation::component_is_scalar);
      }
    names.emplace_back("pressure");
    interpretation.push_back(DataComponentInterpretation::component_is_scalar);
    data_out.attach_dof_handler(state.mesh.dof_handler);
    data_out.add_data_vector(state.solution, names, DataOut<2>::type_dof_data, interpretation);
    const DerivedFields derived(state);
    data_out.add_data_vector(state.solution, derived);
    dealii::Vector<float> partition(state.mesh.triangulation.n_active_cells());
    for (const auto &cell : state.mesh.triangulation.active_cell_iterators())
      if (cell->is_locally_owned())
        partition(cell->active_cell_index()) = static_cast<float>(state.mesh.rank);
    data_out.add_data_vector(partition, "partition");
    if (state.physics.heat && state.physics.heat->solved)
      data_out.add_data_vector(state.physics.heat->dof_handler, state.physics.heat->temperature, "temperature");
    data_out.build_patches(state.mesh.fe.degree);
    const std::string record = data_out.write_vtu_with_pvtu_record(folder + "/", "fields", 0, state.mesh.comm, 2, 0);
    if (state.mesh.rank == 0)
      {
        std::ofstream pvd(folder + "/fields.pvd");
        DataOutBase::write_pvd_record(pvd, {{0., record}});
      }
  }
} // namespace lentus::flow
