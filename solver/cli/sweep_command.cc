// `lentus sweep SWEEP`: runs every case of a sweep file (on MPI ranks, resumable);
// `lentus collect SWEEP`: merges the cases' rows into the results table.
#include "solver/cli/arguments.h"
#include "solver/cli/commands.h"
#include "solver/errors.h"
#include "solver/input/case_schema.h"
#include "solver/report/caution_text.h"
#include "solver/sweep/sweep_file.h"
#include "solver/sweep/sweep_runner.h"

#include <deal.II/base/mpi.h>

#include <cstdlib>
#include <iostream>

namespace lentus::cli
{
  namespace
  {
    const char *sweep_help =
      R"(usage: [mpirun -np P] lentus sweep SWEEP [--ranks-per-case K] [--output FOLDER] [--base CASE]
                                 [--set Section/Key=VALUE ...] [--case-index I] [--attempts N]
                                 [--count] [--solver-output]

Runs every case of the sweep file SWEEP: the base case with the keys it varies set
to each combination of their values. The number of cases is printed before anything
runs; every case is validated first (an invalid one is recorded as bad input).

  --ranks-per-case K  solve each case on K ranks; the P ranks form P/K groups that take
                      cases as they free up (default 1)
  --output FOLDER     results folder (default: the file's 'results folder', else out/<sweep name>)
  --base CASE         base case (default: the file's 'base case'); needed for the case
                      lists `lentus fit` writes
  --set Key=VALUE     fix a key in every case
  --case-index I      array mode: solve case I only (0-based; default $SLURM_ARRAY_TASK_ID
                      when that is set), then `lentus collect SWEEP` merges the results
  --attempts N        a case on which N runs died (killed, crashed) is recorded as crashed (default 3)
  --count             print the number of cases and stop
  --solver-output     let the solver print its iterations (default: into FOLDER/output/<case>.txt)

Results folder: cases/<case id>/ (each case's own results), rows/<case id>.txt (its line of
the table, written whole), results.csv and results.jsonl (case, varied values, status,
reason, design numbers with units, Newton iterations, wall time, and the caution on every
row), plan.txt, plot.png. A sweep over a fitted fluid's samples (`fluid samples = fitted`, as
in the samples.sweep of lentus fit) adds fluid_uncertainty.csv and .jsonl: each design number's
value in the fitted case, its error bar, and its 2.5-97.5% span over the samples (the
uncertainty from the fluid), printed at the end and drawn in fluid_uncertainty.png.
Started again on the same folder, a sweep keeps finished cases and runs the others.
Exit codes: 0 every case has its row (failed ones included), 2 bad sweep file;
array mode: the case's own code (0, 2, 3; 1 crashed).
)";

    const char *collect_help =
      R"(usage: lentus collect SWEEP [--output FOLDER] [--base CASE] [--set Section/Key=VALUE ...]

Merges the rows of the cases of SWEEP that have finished (in array mode, or by a
stopped sweep) into FOLDER/results.csv and results.jsonl (and fluid_uncertainty.csv
and .jsonl for fluid samples), draws the sweep's plot and lists the cases still missing.
Give the same --output, --base and --set as the sweep.
Exit codes: 0 every case has a result, 1 some are missing, 2 bad sweep file.
)";

    sweep::SweepSettings settings_from(const Arguments &arguments)
    {
      sweep::SweepSettings settings;
      if (arguments.options.count("--base"))
        settings.base_case = arguments.options.at("--base");
      if (arguments.options.count("--output"))
        settings.results_folder = arguments.options.at("--output");
      settings.sets = arguments.sets;
      return settings;
    }
  } // namespace

  int sweep_command(int argc, const char *const *argv, const int first)
  {
    const Arguments arguments =
      parse_arguments(argc, argv, first, {"--ranks-per-case", "--output", "--base", "--case-index", "--attempts"},
                      {"--help", "--count", "--solver-output"});
    if (arguments.has("--help"))
      {
        std::cout << sweep_help << "\n" << report::caution_lines();
        return exit_code::success;
      }
    if (arguments.positional.size() != 1)
      throw InputError("command line", 0, "sweep needs exactly one sweep file; see lentus sweep --help");

    sweep::RunnerOptions options;
    options.ranks_per_case = static_cast<unsigned int>(arguments.integer("--ranks-per-case", 1, 1, 1000000));
    options.max_attempts   = static_cast<unsigned int>(arguments.integer("--attempts", 3, 1, 1000));
    options.solver_output  = arguments.has("--solver-output");
    if (arguments.options.count("--case-index"))
      options.case_index = static_cast<std::size_t>(arguments.integer("--case-index", 0, 0, 100000000));
    else if (const char *task = std::getenv("SLURM_ARRAY_TASK_ID"); task && *task)
      {
        char      *end   = nullptr;
        const long index = std::strtol(task, &end, 10);
        if (*end != '\0' || index < 0)
          throw InputError("environment", 0,
                           std::string("SLURM_ARRAY_TASK_ID = ") + task + ": not a case index; allowed: 0, 1, 2, ...");
        options.case_index = static_cast<std::size_t>(index);
      }

    sweep::SweepSettings settings = settings_from(arguments);
    settings.validate_only         = options.case_index;
    const sweep::SweepPlan plan    = sweep::read_sweep_file(arguments.positional[0], settings, input::case_schema());
    if (plan.n_invalid() == plan.cases.size())
      {
        std::string message = "every one of the " + std::to_string(plan.cases.size()) + " cases is invalid:";
        for (std::size_t i = 0; i < plan.cases.size() && i < 5; ++i)
          message += "\n  " + plan.cases[i].invalid_reason;
        if (plan.cases.size() > 5)
          message += "\n  ...";
        throw InputError(plan.sweep_file, 0, message);
      }
    if (arguments.has("--count"))
      {
        std::cout << plan.cases.size() << '\n';
        return exit_code::success;
      }

    char                                   **mutable_argv = const_cast<char **>(argv);
    dealii::Utilities::MPI::MPI_InitFinalize mpi(argc, mutable_argv, 1);
    const unsigned int n_ranks = dealii::Utilities::MPI::n_mpi_processes(MPI_COMM_WORLD);
    try
      {
        return sweep::run_sweep(plan, input::case_schema(), options, MPI_COMM_WORLD);
      }
    catch (const InputError &)
      {
        throw; // found identically on every rank
      }
    catch (const std::exception &error)
      {
        if (n_ranks == 1)
          throw;
        // Something one rank alone ran into: the others would wait for it forever.
        std::cerr << "lentus: rank " << dealii::Utilities::MPI::this_mpi_process(MPI_COMM_WORLD)
                  << ": failed: " << error.what() << std::endl;
        MPI_Abort(MPI_COMM_WORLD, exit_code::failure);
        return exit_code::failure;
      }
  }

  int collect_command(int argc, const char *const *argv, const int first)
  {
    const Arguments arguments = parse_arguments(argc, argv, first, {"--output", "--base"}, {"--help"});
    if (arguments.has("--help"))
      {
        std::cout << collect_help << "\n" << report::caution_lines();
        return exit_code::success;
      }
    if (arguments.positional.size() != 1)
      throw InputError("command line", 0, "collect needs exactly one sweep file; see lentus collect --help");
    const sweep::SweepPlan plan =
      sweep::read_sweep_file(arguments.positional[0], settings_from(arguments), input::case_schema());
    return sweep::collect_and_report(plan, input::case_schema());
  }
} // namespace lentus::cli
