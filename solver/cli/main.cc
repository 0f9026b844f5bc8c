// lentus: steady generalized-Newtonian flow. Dispatches the subcommands and
// maps failures to exit codes: 0 success, 2 bad input, 3 no convergence, 1 other.
#include "rheology/parameter_table.h"
#include "solver/cli/commands.h"
#include "solver/errors.h"
#include "solver/report/caution_text.h"
#include "solver/version.h"

#include <deal.II/base/config.h>

#include <cstring>
#include <iostream>
#include <string>

namespace
{
  const char *usage = R"(usage: lentus [--help] [--version] COMMAND [ARGS]

Steady flows of generalized-Newtonian fluids (power law, Cross, Carreau-Yasuda,
Bingham and Herschel-Bulkley regularized after Papanastasiou) in 2D planar and
axisymmetric geometries.

commands:
  laws         list the viscosity laws and temperature shifts with their parameters and units
  flow-curve   print (and draw) the flow curve of the fluid in a case file
  run          solve the flow in a case file and write its results folder
  starter      print a commented starter case for a shape
  mesh         write and describe the mesh of a case (cells, unknowns, boundary roles) without solving
  check        validate a case file (or a sweep file) without solving
  sweep        run every case of a sweep file, on MPI ranks, resumable; one results table
  collect      merge the finished cases of a sweep into its results table
  fit          fit viscosity laws to rheometer data (confidence intervals, ranking, case section)

`lentus COMMAND --help` describes each command.
Exit codes: 0 success, 1 other failure, 2 bad input, 3 solver did not converge.

)";
}

int main(int argc, char **argv)
{
  using namespace lentus;
  try
    {
      if (argc < 2 || std::strcmp(argv[1], "--help") == 0 || std::strcmp(argv[1], "-h") == 0 ||
          std::strcmp(argv[1], "help") == 0)
        {
          std::cout << usage << lentus::report::caution_lines("");
          return argc < 2 ? exit_code::bad_input : exit_code::success;
        }
      const std::string command = argv[1];
      if (command == "--version")
        {
          std::cout << "lentus " << version << " (deal.II " << DEAL_II_PACKAGE_VERSION << ")\n";
          return exit_code::success;
        }
      if (command == "laws")
        return cli::laws_command(argc, argv, 2);
      if (command == "flow-curve")
        return cli::flow_curve_command(argc, argv, 2);
      if (command == "run")
        return cli::run_command(argc, argv, 2);
      if (command == "starter")
        return cli::starter_command(argc, argv, 2);
      if (command == "check")
        return cli::check_command(argc, argv, 2);
      if (command == "mesh")
        return cli::mesh_command(argc, argv, 2);
      if (command == "fit")
        return cli::fit_command(argc, argv, 2);
      if (command == "sweep")
        return cli::sweep_command(argc, argv, 2);
      if (command == "collect")
        return cli::collect_command(argc, argv, 2);
      throw InputError("command line", 0,
                       "unknown command '" + command + "'; allowed: laws, flow-curve, run, starter, mesh, check, fit, sweep, collect (see lentus --help)");
    }
  catch (const InputError &error)
    {
      std::cerr << "lentus: error: " << error.what() << '\n';
      return exit_code::bad_input;
    }
  catch (const rheology::InvalidParameter &error)
    {
      std::cerr << "lentus: error: " << error.what() << '\n';
      return exit_code::bad_input;
    }
  catch (const NoConvergence &error)
    {
      std::cerr << "lentus: not converged: " << error.what() << '\n';
      return exit_code::no_convergence;
    }
  catch (const std::exception &error)
    {
      std::cerr << "lentus: failed: " << error.what() << '\n';
      return exit_code::failure;
    }
}
