// Runs the cases of a sweep on MPI ranks.
//
// Full sweep: the world communicator is split into groups of `ranks_per_case`
// ranks. The first rank of each group (its leader) takes the next case that is
// neither done nor taken by creating <results>/claims/<case id> with O_EXCL (an
// atomic claim on the shared file system, so groups take cases as they free up
// with no dispatcher), tells its group, and the group solves the case on its
// communicator. The leader writes the case's row file by rename and drops the
// claim. Rank 0 of the world holds an exclusive lock on <results>/runner.lock for
// the whole run (released by the system even on SIGKILL), so on start every claim
// left in the folder belongs to a dead run: those cases are run again, and a case
// that a runner died on `max_attempts` times is recorded as crashed.
//
// Array mode (`case_index` set): the world solves that one case only, without
// lock or claims; `lentus collect` merges the rows afterwards.
#pragma once

#include <mpi.h>

#include <optional>
#include <string>

namespace lentus::input
{
  class CaseSchema;
}

namespace lentus::sweep
{
  struct SweepPlan;

  struct RunnerOptions
  {
    unsigned int               ranks_per_case = 1;
    std::optional<std::size_t> case_index;        ///< array mode
    unsigned int               max_attempts = 3;  ///< runs that may die on one case before it counts as crashed
    bool                       solver_output = false; ///< let the solver print to standard output
  };

  /// Runs the sweep (or one case of it) and returns the exit code: full sweep 0 when
  /// every case has its row (whatever its status); array mode 0 converged, 3 not
  /// converged, 2 bad input, 1 crashed. Collective on `world`.
  int run_sweep(const SweepPlan &plan, const input::CaseSchema &schema, const RunnerOptions &options, MPI_Comm world);

  /// Merges the rows into the table (and draws the plot if the sweep asks for one);
  /// prints what it did. Returns 0 if every case has a row, else 1.
  int collect_and_report(const SweepPlan &plan, const input::CaseSchema &schema);
} // namespace lentus::sweep
