// `lentus run CASE`: solves a flow case and writes its folder.
#include "solver/cli/arguments.h"
#include "solver/cli/commands.h"
#include "solver/errors.h"
#include "solver/flow/flow_pictures.h"
#include "solver/flow/flow_run.h"
#include "solver/input/case_schema.h"
#include "solver/input/flow_case.h"
#include "solver/report/caution_text.h"

#include <deal.II/base/mpi.h>

#include <iostream>

namespace lentus::cli
{
  int run_command(int argc, const char *const *argv, const int first)
  {
    const Arguments arguments = parse_arguments(argc, argv, first, {"--output"}, {"--help", "--no-pictures"});
    if (arguments.has("--help"))
      {
        std::cout << "usage: [mpirun -np P] lentus run CASE [--output FOLDER] [--no-pictures] [--set Section/Key=VALUE ...]\n\n"
                     "Solves the flow in CASE and writes FOLDER (default: Output/Folder, else out/<case name>):\n"
                     "fields.pvd/.pvtu/.vtu (velocity, pressure, shear rate, viscosity, stress magnitude,\n"
                     "unyielded indicator, partition), summary.json (design numbers with units), log.txt, case.prm,\n"
                     "and PNG pictures with report.html (scripts/draw_case.py, needs python3-matplotlib; off with\n"
                     "--no-pictures or Output/Write pictures = false; a drawing failure is only a warning).\n"
                     "Exit codes: 0 converged, 2 bad input, 3 not converged (the last iterate is still written).\n\n"
                  << report::caution_lines();
        return 0;
      }
    if (arguments.positional.size() != 1)
      throw InputError("command line", 0, "run needs exactly one case file; see lentus run --help");
    std::vector<std::string> sets = arguments.sets;
    if (arguments.options.count("--output"))
      sets.push_back("Output/Folder=" + arguments.options.at("--output"));

    char                                   **mutable_argv = const_cast<char **>(argv);
    dealii::Utilities::MPI::MPI_InitFinalize mpi(argc, mutable_argv, 1);
    const input::CaseFile  file = input::CaseFile::read(arguments.positional[0], input::case_schema(), sets);
    const input::FlowCase  flow = input::read_flow_case(file);
    const flow::RunResult result = flow::run_flow_case(flow, MPI_COMM_WORLD);
    // Pictures of the finished folder (also of a last iterate that did not converge).
    if (!arguments.has("--no-pictures") && flow.output.write_pictures &&
        dealii::Utilities::MPI::this_mpi_process(MPI_COMM_WORLD) == 0)
      flow::draw_pictures(flow.output_folder);
    if (!result.converged)
      throw NoConvergence(result.reason);
    return 0;
  }
} // namespace lentus::cli
