// `lentus check CASE`: validates a case file without solving.
#include "solver/cli/arguments.h"
#include "solver/cli/commands.h"
#include "solver/errors.h"
#include "solver/input/case_schema.h"
#include "solver/input/flow_case.h"
#include "solver/input/fluid_section.h"

#include <cmath>
#include <iostream>

namespace lentus::cli
{
  int check_command(const int argc, const char *const *argv, const int first)
  {
    const Arguments arguments = parse_arguments(argc, argv, first, {}, {"--help"});
    if (arguments.has("--help"))
      {
        std::cout << "usage: lentus check CASE [--set Section/Key=VALUE ...]\n\n"
                     "Validates CASE without solving: syntax, sections, keys, values and the relations\n"
                     "between them. Prints what was understood; exit code 2 and file:line: key on error.\n";
        return 0;
      }
    if (arguments.positional.size() != 1)
      throw InputError("command line", 0, "check needs exactly one case file; see lentus check --help");

    const input::CaseFile file  = input::CaseFile::read(arguments.positional[0], input::case_schema(), arguments.sets);
    const input::Fluid    fluid = input::read_fluid(file);
    std::cout << file.file_name() << ": valid\n  fluid: " << fluid.law_name;
    for (const auto &[key, value] : fluid.parameters)
      std::cout << "; " << key << " = " << rheology::format_value(value);
    std::cout << "\n  temperature shift: " << fluid.shift_name;
    if (!std::isnan(fluid.temperature))
      std::cout << " at T = " << rheology::format_value(fluid.temperature)
                << " K (a_T = " << rheology::format_value(fluid.shift_factor) << ")";
    std::cout << '\n';
    if (file.is_set("Geometry/Shape"))
      {
        const input::FlowCase flow = input::read_flow_case(file);
        std::cout << "  geometry: " << flow.shape_name << ", refinement " << flow.refinement << "; formulation "
                  << to_string(flow.formulation) << "; boundary roles:";
        for (const input::BoundaryCondition &bc : flow.conditions)
          std::cout << ' ' << bc.role << ';';
        std::cout << "\n  results would go to " << flow.output_folder << '\n';
      }
    return 0;
  }
} // namespace lentus::cli
