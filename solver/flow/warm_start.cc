// A sweep's warm start: a converged flow solution on one mesh saved to one file per rank,
// and read back as the start of a neighbouring case solved on the same mesh with as many ranks.
#include "solver/flow/flow_state.h"
#include "solver/report/atomic_file.h"

#include <cstdint>
#include <cstring>
#include <fstream>

namespace lentus::flow
{
  using namespace dealii;

  namespace
  {
    constexpr char magic[8] = {'L', 'N', 'T', 'W', 'A', 'R', 'M', '1'};

    /// What must agree for a saved solution to be read on this mesh: sizes, this rank's range of
    /// unknowns and moments of the cells' areas (the same mesh, not just as many cells).
    struct Header
    {
      char                  tag[8];
      std::uint64_t         n_dofs = 0, n_cells = 0, n_ranks = 0, rank = 0, n_owned = 0, first_owned = 0;
      double                moments[4] = {0., 0., 0., 0.};
    };

    Header header_of(const FlowState &state)
    {
      const Discretization &mesh = state.mesh;
      Header                header;
      std::memcpy(header.tag, magic, sizeof magic);
      header.n_dofs      = mesh.dof_handler.n_dofs();
      header.n_cells     = mesh.triangulation.n_global_active_cells();
      header.n_ranks     = mesh.n_ranks;
      header.rank        = mesh.rank;
      header.n_owned     = mesh.owned.n_elements();
      header.first_owned = mesh.owned.n_elements() > 0 ? mesh.owned.nth_index_in_set(0) : 0;
      for (const auto &cell : mesh.triangulation.active_cell_iterators())
        if (cell->is_locally_owned())
          {
            const double area = cell->measure();
            const auto   x    = cell->center();
            header.moments[0] += area;
            header.moments[1] += area * x[0];
            header.moments[2] += area * x[1];
            header.moments[3] += area * x[0] * x[1];
          }
      Utilities::MPI::sum(header.moments, mesh.comm, header.moments);
      return header;
    }

    bool same_mesh(const Header &a, const Header &b)
    {
      if (std::memcmp(a.tag, b.tag, sizeof magic) != 0 || a.n_dofs != b.n_dofs || a.n_cells != b.n_cells ||
          a.n_ranks != b.n_ranks || a.rank != b.rank || a.n_owned != b.n_owned || a.first_owned != b.first_owned)
        return false;
      const double scale = std::abs(a.moments[0]) + std::abs(a.moments[1]) + std::abs(a.moments[2]) +
                           std::abs(a.moments[3]);
      for (unsigned int i = 0; i < 4; ++i)
        if (std::abs(a.moments[i] - b.moments[i]) > 1e-12 * scale)
          return false;
      return true;
    }

    std::string rank_file(const std::string &prefix, const Discretization &mesh)
    {
      return prefix + "." + std::to_string(mesh.rank) + "of" + std::to_string(mesh.n_ranks) + ".bin";
    }
  } // namespace

  void save_warm_start(const FlowState &state, const std::string &prefix)
  {
    const Header header = header_of(state); // collective
    std::string  content(reinterpret_cast<const char *>(&header), sizeof header);
    for (const auto index : state.mesh.owned)
      {
        const double value = state.solution[index];
        content.append(reinterpret_cast<const char *>(&value), sizeof value);
      }
    report::write_file_atomically(rank_file(prefix, state.mesh), content);
  }

  bool load_warm_start(FlowState &state, const std::string &prefix, std::string &why)
  {
    const Header expected = header_of(state); // collective
    std::ifstream input(rank_file(prefix, state.mesh), std::ios::binary);
    Header        found;
    bool          ok = static_cast<bool>(input) && input.read(reinterpret_cast<char *>(&found), sizeof found) &&
              same_mesh(found, expected);
    Vector owned_solution(state.mesh.owned, state.mesh.comm);
    if (ok)
      {
        std::vector<double> values(expected.n_owned);
        ok = static_cast<bool>(input.read(reinterpret_cast<char *>(values.data()),
                                          static_cast<std::streamsize>(values.size() * sizeof(double))));
        std::size_t i = 0;
        for (const auto index : state.mesh.owned)
          owned_solution[index] = values[i++];
      }
    if (Utilities::MPI::min(ok ? 1 : 0, state.mesh.comm) == 0)
      {
        why = "no solution saved on the same mesh with as many ranks";
        return false;
      }
    owned_solution.compress(VectorOperation::insert);
    state.mesh.nonzero_constraints.distribute(owned_solution); // this case's own boundary values
    state.solution = owned_solution;
    return true;
  }
} // namespace lentus::flow
