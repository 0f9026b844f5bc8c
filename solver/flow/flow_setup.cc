// Mesh, degrees of freedom, constraints and matrices of a flow solve.
#include "solver/errors.h"
#include "solver/flow/developed_profile.h"
#include "solver/flow/flow_state.h"
#include "solver/flow/heat.h"

#include <deal.II/base/function.h>
#include <deal.II/base/utilities.h>
#include <deal.II/distributed/solution_transfer.h>
#include <deal.II/dofs/dof_renumbering.h>
#include <deal.II/dofs/dof_tools.h>
#include <deal.II/fe/fe_q.h>
#include <deal.II/lac/dynamic_sparsity_pattern.h>
#include <deal.II/lac/sparsity_tools.h>
#include <deal.II/numerics/vector_tools.h>

#include <iostream>
#include <set>

namespace lentus::flow
{
  using namespace dealii;

  void Log::line(const std::string &text)
  {
    record << text << '\n';
    if (active)
      std::cout << text << std::endl;
  }

  Physics::Physics(const input::FlowCase &flow_case)
    : flow(flow_case)
    , kind(flow_case.model.formulation)
    , n_velocity(n_velocity_components(flow_case.model.formulation))
    , law(flow_case.fluid.law)
    , density(flow_case.model.inertia || flow_case.model.gravity[0] != 0. || flow_case.model.gravity[1] != 0. ? flow_case.fluid.density.value() :
                                                                                             0.)
    , heat(make_heat_field(flow_case))
  {}

  Discretization::Discretization(const input::FlowCase &flow_case, MPI_Comm communicator)
    : comm(communicator)
    , rank(Utilities::MPI::this_mpi_process(communicator))
    , n_ranks(Utilities::MPI::n_mpi_processes(communicator))
    , triangulation(communicator)
    , fe(FE_Q<2>(flow_case.model.velocity_degree), n_velocity_components(flow_case.model.formulation),
         FE_Q<2>(flow_case.model.velocity_degree - 1), 1)
    , dof_handler(triangulation)
  {}

  FlowState::FlowState(const input::FlowCase &flow_case, MPI_Comm communicator)
    : physics(flow_case)
    , mesh(flow_case, communicator)
    , log(Utilities::MPI::this_mpi_process(communicator) == 0)
  {}

  namespace
  {
    /// Velocity of a wall that translates at `velocity` and turns at `omega` about the axis (swirl)
    /// or the origin (planar), seen from a frame turning at `frame_omega` (planar only), in mesh
    /// components (+ u_theta with swirl).
    class WallVelocity : public Function<2>
    {
    public:
      WallVelocity(const FormulationKind kind_, const unsigned int n_components, const double velocity_x,
                   const double velocity_y, const double omega_, const double frame_omega)
        : Function<2>(n_components)
        , velocity{velocity_x, velocity_y}
        , omega(omega_)
        , relative_omega(omega_ - frame_omega)
        , kind(kind_)
      {}

      double value(const Point<2> &x, const unsigned int component) const override
      {
        if (kind == FormulationKind::planar)
          {
            // u = U_wall + (Omega - Omega_frame) e_z x r = U_wall + (Omega - Omega_frame) (-y, x)
            if (component == 0)
              return velocity[0] - relative_omega * x[1];
            if (component == 1)
              return velocity[1] + relative_omega * x[0];
            return 0.;
          }
        if (component < 2)
          return velocity[component];
        if (component == 2 && kind == FormulationKind::swirl)
          return omega * x[0]; // u_theta = Omega r
        return 0.;
      }

    private:
      double          velocity[2];
      double          omega, relative_omega;
      FormulationKind kind;
    };

    /// Where a boundary role lies: it must be a straight segment parallel to a coordinate axis.
    struct Extent
    {
      int    normal_axis;  ///< 0: normal along x (r), 1: along y (z)
      double normal_sign;  ///< +1 if the outward normal points along +axis
      double low, high;    ///< range of the other coordinate
      double position;     ///< the normal coordinate of the segment

      /// The segment's end at the other coordinate `at` (low or high).
      Point<2> end(const double at) const
      {
        Point<2> point;
        point[normal_axis]     = position;
        point[1 - normal_axis] = at;
        return point;
      }
    };

    Extent extent_of(const FlowState &state, const types::boundary_id id, const std::string &role)
    {
      // Ranks without faces of the role keep values that lose every max/min reduction.
      double axis = -1., sign = -HUGE_VAL, low = HUGE_VAL, high = -HUGE_VAL, position = -HUGE_VAL;
      for (const auto &cell : state.mesh.triangulation.active_cell_iterators())
        if (cell->is_locally_owned())
          for (const auto face_no : cell->face_indices())
            if (cell->face(face_no)->at_boundary() && cell->face(face_no)->boundary_id() == id)
              {
                const auto         face = cell->face(face_no);
                const Tensor<1, 2> edge = face->vertex(1) - face->vertex(0);
                const int face_axis = std::abs(edge[0]) < 1e-12 * edge.norm() ? 0 :
                                      std::abs(edge[1]) < 1e-12 * edge.norm() ? 1 : -2;
                if (face_axis == -2)
                  throw InputError("boundary role '" + role +
                                   "': pressure, symmetry and inflow conditions need boundaries parallel to a "
                                   "coordinate axis in this version");
                axis = face_axis;
                sign     = face->center()[face_axis] > cell->center()[face_axis] ? 1. : -1.;
                position = face->center()[face_axis];
                for (unsigned int v = 0; v < 2; ++v)
                  {
                    low  = std::min(low, face->vertex(v)[1 - face_axis]);
                    high = std::max(high, face->vertex(v)[1 - face_axis]);
                  }
              }
      return {static_cast<int>(Utilities::MPI::max(axis, state.mesh.comm)), Utilities::MPI::max(sign, state.mesh.comm),
              Utilities::MPI::min(low, state.mesh.comm), Utilities::MPI::max(high, state.mesh.comm),
              Utilities::MPI::max(position, state.mesh.comm)};
    }

    /// Whether a boundary face of a role with a symmetry condition has a vertex at `point`.
    bool symmetry_at(const FlowState &state, const Point<2> &point, const double tolerance)
    {
      const auto                    roles = state.physics.flow.geometry->boundary_roles();
      std::set<types::boundary_id>  symmetric;
      for (const input::BoundaryCondition &bc : state.physics.flow.conditions)
        if (bc.type == input::BoundaryCondition::Type::symmetry)
          symmetric.insert(roles.at(bc.role));
      int found = 0;
      for (const auto &cell : state.mesh.triangulation.active_cell_iterators())
        if (cell->is_locally_owned())
          for (const auto face_no : cell->face_indices())
            if (cell->face(face_no)->at_boundary() && symmetric.count(cell->face(face_no)->boundary_id()))
              for (unsigned int v = 0; v < 2; ++v)
                if (cell->face(face_no)->vertex(v).distance(point) < tolerance)
                  found = 1;
      return Utilities::MPI::max(found, state.mesh.comm) > 0;
    }

    int axis_of_normal(const FlowState &state, const types::boundary_id id, const std::string &role)
    {
      return extent_of(state, id, role).normal_axis;
    }

    /// The developed inflow profile on one role, as a velocity field: planar, a slit between walls, or
    /// half of one where an end of the role meets a symmetry role (the midplane); axisymmetric, a pipe
    /// when the role reaches the axis, else an annulus with walls at both ends.
    class InflowVelocity : public Function<2>
    {
    public:
      InflowVelocity(const FlowState &state, const input::BoundaryCondition &bc, const Extent &where)
        : Function<2>(state.physics.n_velocity + 1)
        , extent(where)
        , axisymmetric(is_axisymmetric(state.physics.kind))
      {
        using Channel = DevelopedProfile::Channel;
        const double width = extent.high - extent.low;
        if (axisymmetric)
          {
            if (extent.normal_axis != 1)
              throw InputError("boundary role '" + bc.role + "': an axisymmetric inflow must lie at constant z");
            const bool annulus = extent.low > 1e-9 * extent.high;
            profile = std::make_unique<DevelopedProfile>(*state.physics.law, annulus ? Channel::annulus : Channel::pipe,
                                                         extent.high, bc.flow_rate, annulus ? extent.low : 0.);
            return;
          }
        const bool low_midplane  = symmetry_at(state, extent.end(extent.low), 1e-9 * width);
        const bool high_midplane = symmetry_at(state, extent.end(extent.high), 1e-9 * width);
        if (low_midplane && high_midplane)
          throw InputError("boundary role '" + bc.role +
                           "': an inflow between two symmetry roles has no developed profile; give the "
                           "inflow a wall on at least one side");
        // A half slit (midplane at one end) carries half of the full slit's flow.
        midplane = low_midplane ? extent.low : high_midplane ? extent.high : 0.5 * (extent.low + extent.high);
        const bool half = low_midplane || high_midplane;
        profile = std::make_unique<DevelopedProfile>(*state.physics.law, Channel::slit, half ? width : 0.5 * width,
                                                     half ? 2. * bc.flow_rate : bc.flow_rate);
      }

      double value(const Point<2> &x, const unsigned int component) const override
      {
        if (static_cast<int>(component) != extent.normal_axis)
          return 0.;
        const int    t = 1 - extent.normal_axis;
        const double s = axisymmetric ? x[t] : x[t] - midplane;
        return -extent.normal_sign * profile->velocity(s); // into the domain
      }

    private:
      Extent                            extent;
      bool                              axisymmetric;
      double                            midplane = 0.;
      std::unique_ptr<DevelopedProfile> profile;
    };
  } // namespace

  /// Within each rank's range: the velocity unknowns node by node (all components of a node
  /// consecutive), then the pressure. The velocity block then has a block size equal to the
  /// number of velocity components, which lets algebraic multigrid treat it as a system.
  void renumber_node_wise(FlowState &state)
  {
    const IndexSet                       owned = state.mesh.dof_handler.locally_owned_dofs();
    std::vector<types::global_dof_index> new_numbers(owned.n_elements(), numbers::invalid_dof_index);
    types::global_dof_index              next = owned.n_elements() ? *owned.begin() : 0;
    const FiniteElement<2>              &velocity_base = state.mesh.fe.base_element(0);
    std::vector<types::global_dof_index> dof_indices(state.mesh.fe.n_dofs_per_cell());
    const auto assign = [&](const types::global_dof_index index) {
      if (owned.is_element(index) && new_numbers[owned.index_within_set(index)] == numbers::invalid_dof_index)
        new_numbers[owned.index_within_set(index)] = next++;
    };
    for (const auto &cell : state.mesh.dof_handler.active_cell_iterators())
      if (cell->is_locally_owned())
        {
          cell->get_dof_indices(dof_indices);
          for (unsigned int j = 0; j < velocity_base.n_dofs_per_cell(); ++j)
            for (unsigned int c = 0; c < state.physics.n_velocity; ++c)
              assign(dof_indices[state.mesh.fe.component_to_system_index(c, j)]);
        }
    for (const auto &cell : state.mesh.dof_handler.active_cell_iterators())
      if (cell->is_locally_owned())
        {
          cell->get_dof_indices(dof_indices);
          for (unsigned int j = 0; j < state.mesh.fe.base_element(1).n_dofs_per_cell(); ++j)
            assign(dof_indices[state.mesh.fe.component_to_system_index(state.physics.n_velocity, j)]);
        }
    // Unknowns owned here but only on cells of other ranks (rare): keep them, at the end.
    for (std::size_t i = 0; i < new_numbers.size(); ++i)
      if (new_numbers[i] == numbers::invalid_dof_index)
        new_numbers[i] = next++;
    state.mesh.dof_handler.renumber_dofs(new_numbers);
  }

  void create_mesh(FlowState &state, const unsigned int level)
  {
    state.mesh.dof_handler.clear();
    state.mesh.triangulation.clear();
    state.physics.flow.geometry->create_mesh(state.mesh.triangulation, level);
  }

  namespace
  {
    /// The pressure unknown pinned to zero when no boundary fixes the pressure level (the smallest
    /// pressure index), or invalid_dof_index.
    types::global_dof_index pinned_pressure(const FlowState &state)
    {
      if (!state.mesh.pressure_pinned)
        return numbers::invalid_dof_index;
      const FEValuesExtractors::Scalar pressure(state.physics.n_velocity);
      const IndexSet pressure_dofs = DoFTools::extract_dofs(state.mesh.dof_handler, state.mesh.fe.component_mask(pressure));
      const types::global_dof_index first =
        pressure_dofs.n_elements() ? *pressure_dofs.begin() : numbers::invalid_dof_index;
      return Utilities::MPI::min(first, state.mesh.comm);
    }
  } // namespace

  void refine_and_transfer(FlowState &state)
  {
    for (const auto &cell : state.mesh.triangulation.active_cell_iterators())
      if (cell->is_locally_owned())
        cell->set_refine_flag();
    transfer_to_flagged_mesh(state);
  }

  void transfer_to_flagged_mesh(FlowState &state)
  {
    parallel::distributed::SolutionTransfer<2, Vector> transfer(state.mesh.dof_handler);
    state.mesh.triangulation.prepare_coarsening_and_refinement();
    transfer.prepare_for_coarsening_and_refinement(state.solution);
    state.mesh.triangulation.execute_coarsening_and_refinement();
    setup_dofs(state);
    Vector interpolated(state.mesh.owned, state.mesh.comm);
    transfer.interpolate(interpolated);
    // Without a pressure boundary the pressure is known up to a constant, pinned at one unknown
    // whose index differs on the new mesh: shift the interpolated pressure to vanish there.
    const types::global_dof_index pinned = pinned_pressure(state);
    if (pinned != numbers::invalid_dof_index)
      {
        const double shift = Utilities::MPI::sum(state.mesh.owned.is_element(pinned) ? double(interpolated[pinned]) : 0.,
                                                 state.mesh.comm);
        const FEValuesExtractors::Scalar pressure(state.physics.n_velocity);
        const IndexSet owned_pressures =
          DoFTools::extract_dofs(state.mesh.dof_handler, state.mesh.fe.component_mask(pressure)) & state.mesh.owned;
        std::vector<Vector::size_type> indices;
        std::vector<double>            values;
        for (const auto index : owned_pressures)
          {
            indices.push_back(index);
            values.push_back(interpolated[index] - shift);
          }
        interpolated.set(indices, values);
        interpolated.compress(VectorOperation::insert);
      }
    state.mesh.nonzero_constraints.distribute(interpolated);
    state.solution = interpolated;
  }

  void setup_dofs(FlowState &state)
  {
    const input::FlowCase &flow = state.physics.flow;
    state.mesh.dof_handler.distribute_dofs(state.mesh.fe);
    renumber_node_wise(state);
    state.mesh.owned    = state.mesh.dof_handler.locally_owned_dofs();
    DoFTools::extract_locally_relevant_dofs(state.mesh.dof_handler, state.mesh.relevant);

    const auto roles = flow.geometry->boundary_roles();
    for (AffineConstraints<double> *constraints : {&state.mesh.nonzero_constraints, &state.mesh.zero_constraints})
      {
        const bool homogeneous = constraints == &state.mesh.zero_constraints;
        constraints->clear();
        constraints->reinit(state.mesh.relevant);
        DoFTools::make_hanging_node_constraints(state.mesh.dof_handler, *constraints);
        const unsigned int              n_components = state.physics.n_velocity + 1;
        const Functions::ZeroFunction<2> zero(n_components);
        // Walls as seen from the frame of reference (the impeller's frame turns at 2 pi N).
        const double       frame_omega = flow.model.impeller_frame() ? flow.impeller_omega() : 0.;
        const WallVelocity fixed_wall(state.physics.kind, n_components, 0., 0., 0., frame_omega);
        const WallVelocity wall(state.physics.kind, n_components, flow.boundary_keys.wall_velocity[0], flow.boundary_keys.wall_velocity[1],
                                flow.boundary_keys.rotation_rate, frame_omega);
        const WallVelocity impeller(state.physics.kind, n_components, 0., 0., flow.impeller_omega(), frame_omega);
        for (const input::BoundaryCondition &bc : flow.conditions)
          {
            const types::boundary_id id = roles.at(bc.role);
            std::vector<bool>        mask(n_components, false);
            std::unique_ptr<Function<2>> inflow;
            const Function<2>       *values = &zero;
            switch (bc.type)
              {
                case input::BoundaryCondition::Type::no_slip:
                  std::fill(mask.begin(), mask.begin() + state.physics.n_velocity, true);
                  if (!homogeneous && flow.model.impeller_frame())
                    values = &fixed_wall;
                  break;
                case input::BoundaryCondition::Type::impeller:
                  std::fill(mask.begin(), mask.begin() + state.physics.n_velocity, true);
                  values = homogeneous ? static_cast<const Function<2> *>(&zero) : &impeller;
                  break;
                case input::BoundaryCondition::Type::moving_wall:
                  std::fill(mask.begin(), mask.begin() + state.physics.n_velocity, true);
                  values = homogeneous ? static_cast<const Function<2> *>(&zero) : &wall;
                  break;
                case input::BoundaryCondition::Type::pressure:
                  // Fully developed: the in-plane tangential component vanishes.
                  mask[1 - axis_of_normal(state, id, bc.role)] = true;
                  break;
                case input::BoundaryCondition::Type::symmetry:
                  mask[axis_of_normal(state, id, bc.role)] = true;
                  break;
                case input::BoundaryCondition::Type::axis:
                  mask[0] = true; // u_r
                  if (state.physics.n_velocity == 3)
                    mask[2] = true; // u_theta
                  break;
                case input::BoundaryCondition::Type::inflow:
                  std::fill(mask.begin(), mask.begin() + state.physics.n_velocity, true);
                  if (!homogeneous)
                    {
                      inflow = std::make_unique<InflowVelocity>(state, bc, extent_of(state, id, bc.role));
                      values = inflow.get();
                    }
                  break;
                case input::BoundaryCondition::Type::uniform_inflow:
                  std::fill(mask.begin(), mask.begin() + state.physics.n_velocity, true);
                  if (!homogeneous)
                    {
                      const Extent where = extent_of(state, id, bc.role);
                      dealii::Vector<double> velocity(n_components);
                      velocity[where.normal_axis] = -where.normal_sign * bc.speed; // into the domain
                      inflow = std::make_unique<Functions::ConstantFunction<2>>(velocity);
                      values = inflow.get();
                    }
                  break;
                case input::BoundaryCondition::Type::traction_free:
                  continue;
              }
            VectorTools::interpolate_boundary_values(state.mesh.dof_handler, id, *values, *constraints,
                                                     ComponentMask(mask));
          }
      }

    // Without a pressure or traction boundary the pressure is fixed only up to a
    // constant: pin the smallest pressure unknown (reports use the mean-free pressure).
    bool pressure_boundary = false;
    for (const input::BoundaryCondition &bc : flow.conditions)
      pressure_boundary = pressure_boundary || bc.type == input::BoundaryCondition::Type::pressure ||
                          bc.type == input::BoundaryCondition::Type::traction_free;
    state.mesh.pressure_pinned = !pressure_boundary;
    if (state.mesh.pressure_pinned)
      {
        const types::global_dof_index first = pinned_pressure(state);
        for (AffineConstraints<double> *constraints : {&state.mesh.nonzero_constraints, &state.mesh.zero_constraints})
          if (state.mesh.relevant.is_element(first) && !constraints->is_constrained(first))
            constraints->add_line(first);
      }
    state.mesh.nonzero_constraints.close();
    state.mesh.zero_constraints.close();
    state.mesh.hanging_constraints.clear();
    state.mesh.hanging_constraints.reinit(state.mesh.relevant);
    DoFTools::make_hanging_node_constraints(state.mesh.dof_handler, state.mesh.hanging_constraints);
    state.mesh.hanging_constraints.close();

    state.system.kept_solver.reset(); // its factorization belongs to the old mesh: freed first
    DynamicSparsityPattern pattern(state.mesh.relevant);
    DoFTools::make_sparsity_pattern(state.mesh.dof_handler, pattern, state.mesh.zero_constraints, false);
    SparsityTools::distribute_sparsity_pattern(pattern, state.mesh.owned, state.mesh.comm, state.mesh.relevant);
    state.system.system_matrix.reinit(state.mesh.owned, state.mesh.owned, pattern, state.mesh.comm);
    // The Schur-complement preconditioner's pressure mass matrix couples pressures only: its own,
    // much smaller pattern (on the full pattern it would double the matrix memory).
    Table<2, DoFTools::Coupling> pressure_only(state.physics.n_velocity + 1, state.physics.n_velocity + 1);
    pressure_only.fill(DoFTools::none);
    pressure_only(state.physics.n_velocity, state.physics.n_velocity) = DoFTools::always;
    DynamicSparsityPattern pressure_pattern(state.mesh.relevant);
    DoFTools::make_sparsity_pattern(state.mesh.dof_handler, pressure_only, pressure_pattern, state.mesh.zero_constraints, false);
    SparsityTools::distribute_sparsity_pattern(pressure_pattern, state.mesh.owned, state.mesh.comm, state.mesh.relevant);
    state.system.pressure_mass.reinit(state.mesh.owned, state.mesh.owned, pressure_pattern, state.mesh.comm);
    state.system.residual.reinit(state.mesh.owned, state.mesh.comm);
    state.solution.reinit(state.mesh.owned, state.mesh.relevant, state.mesh.comm);
    setup_heat(state);
  }

  void initial_solution(FlowState &state)
  {
    Vector owned_solution(state.mesh.owned, state.mesh.comm);
    owned_solution = 0.;
    state.mesh.nonzero_constraints.distribute(owned_solution);
    state.solution = owned_solution;
  }
} // namespace lentus::flow
