// `lentus flow-curve CASE`: shear rate, shear stress and viscosity of the
// case's fluid over a range of shear rates, as CSV, optionally drawn.
#include "rheology/law_registry.h"
#include "solver/cli/arguments.h"
#include "solver/cli/commands.h"
#include "solver/errors.h"
#include "solver/input/case_schema.h"
#include "solver/input/fluid_section.h"
#include "solver/report/atomic_file.h"
#include "solver/report/plotting.h"

#include <cmath>
#include <cstdio>
#include <filesystem>
#include <iostream>
#include <sstream>

namespace lentus::cli
{
  namespace
  {
    const char *help = R"(usage: lentus flow-curve CASE [options]

Prints the flow curve of the fluid in CASE (subsection Rheology) as CSV:
shear rate [1/s], shear stress [Pa], viscosity [Pa s], at log-spaced shear rates.

options:
  --from RATE          lowest shear rate [1/s] (default 1e-3)
  --to RATE            highest shear rate [1/s] (default 1e3)
  --points N           number of shear rates, 2..100000 (default 31)
  --temperature T      temperature [K] (default: Operating point/Temperature)
  --output FILE.csv    write the CSV to FILE instead of standard output
  --plot FILE.png      also draw stress and viscosity against shear rate (log-log)
  --set S/K=VALUE      override a case-file value, e.g. --set "Rheology/Cross/Rate index=0.7"
)";

    std::string csv_number(const double value)
    {
      char buffer[32];
      std::snprintf(buffer, sizeof buffer, "%.10g", value);
      return buffer;
    }
  } // namespace

  int flow_curve_command(const int argc, const char *const *argv, const int first)
  {
    const Arguments arguments = parse_arguments(argc, argv, first,
                                                {"--from", "--to", "--points", "--temperature", "--output", "--plot"},
                                                {"--help"});
    if (arguments.has("--help"))
      {
        std::cout << help;
        return 0;
      }
    if (arguments.positional.size() != 1)
      throw InputError("command line", 0, "flow-curve needs exactly one case file; see lentus flow-curve --help");

    const double from   = arguments.real("--from", 1e-3, rheology::Range::above(0.));
    const double to     = arguments.real("--to", 1e3, rheology::Range::above(0.));
    const long   points = arguments.integer("--points", 31, 2, 100000);
    if (!(to > from))
      throw InputError("command line", 0,
                       "--to = " + rheology::format_value(to) + ": not above --from = " + rheology::format_value(from) +
                         "; allowed: --to > --from");
    const auto temperature = arguments.optional_real("--temperature", rheology::Range::above(0.));

    const std::string    case_path = arguments.positional[0];
    const input::CaseFile file     = input::CaseFile::read(case_path, input::case_schema(), arguments.sets);
    const input::Fluid    fluid    = input::read_fluid(file, temperature);

    std::ostringstream csv;
    csv << "shear rate [1/s],shear stress [Pa],viscosity [Pa s]\n";
    for (long i = 0; i < points; ++i)
      {
        const double gamma_dot = from * std::pow(to / from, static_cast<double>(i) / (points - 1));
        const double eta       = fluid.law->evaluate(gamma_dot).value;
        csv << csv_number(gamma_dot) << ',' << csv_number(eta * gamma_dot) << ',' << csv_number(eta) << '\n';
      }

    const auto output = arguments.options.find("--output");
    const auto plot   = arguments.options.find("--plot");
    if (plot != arguments.options.end())
      {
        if (!report::plotting_available())
          throw std::runtime_error("cannot draw " + plot->second + ": " + report::plotting_install_hint());
        // Draw from a temporary CSV into a temporary PNG; rename only when all succeeded.
        const std::string data_file  = report::temporary_name_for(plot->second) + ".csv";
        const std::string image_file = report::temporary_name_for(plot->second) + ".png";
        report::write_file_atomically(data_file, csv.str());
        std::string title = "Flow curve: " + fluid.law_name;
        if (fluid.temperature)
          title += ", T = " + rheology::format_value(*fluid.temperature) + " K";
        const int status = report::run_script("plot_flow_curve.py", {data_file, image_file, title});
        std::error_code ignored;
        std::filesystem::remove(data_file, ignored);
        if (status != 0)
          {
            std::filesystem::remove(image_file, ignored);
            throw std::runtime_error("the plot script failed (exit " + std::to_string(status) + "); nothing written");
          }
        if (output != arguments.options.end())
          report::write_file_atomically(output->second, csv.str());
        report::rename_file(image_file, plot->second);
        std::cerr << "lentus: wrote " << plot->second << '\n';
      }
    else if (output != arguments.options.end())
      report::write_file_atomically(output->second, csv.str());

    if (output == arguments.options.end())
      std::cout << csv.str();
    else
      std::cerr << "lentus: wrote " << output->second << '\n';
    return 0;
  }
} // namespace lentus::cli
