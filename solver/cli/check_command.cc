// `lentus check CASE`: validates a case file without solving.
#include "solver/cli/arguments.h"
#include "solver/cli/commands.h"
#include "solver/errors.h"
#include "solver/formulation/formulation.h"
#include "solver/input/case_schema.h"
#include "solver/input/flow_case.h"
#include "solver/input/fluid_section.h"
#include "solver/sweep/sweep_file.h"

#include <cmath>
#include <fstream>
#include <iostream>
#include <memory>
#include <sstream>

namespace lentus::cli
{
  namespace
  {
    /// Every case of a sweep file must be valid: all problems are listed, exit code 2.
    int check_sweep(const Arguments &arguments)
    {
      sweep::SweepSettings settings;
      if (arguments.options.count("--base"))
        settings.base_case = arguments.options.at("--base");
      settings.sets = arguments.sets;
      const sweep::SweepPlan plan = sweep::read_sweep_file(arguments.positional[0], settings, input::case_schema());
      if (plan.n_invalid() > 0)
        {
          std::string message = std::to_string(plan.n_invalid()) + " of " + std::to_string(plan.cases.size()) +
                                " cases are invalid:";
          for (const sweep::SweepCase &sweep_case : plan.cases)
            if (!sweep_case.invalid_reason.empty())
              message += "\n  " + sweep_case.invalid_reason;
          throw InputError(plan.sweep_file, 0, message);
        }
      std::cout << plan.sweep_file << ": valid sweep file\n  " << plan.cases.size() << " cases (" << plan.shape_description()
                << ") of base case " << plan.base_case << "\n  varied:";
      for (const std::string &key : plan.varied_keys)
        std::cout << (&key == &plan.varied_keys.front() ? " " : "; ") << key;
      if (plan.fluid_samples)
        std::cout << "\n  fluid samples: case " << plan.fluid_samples->fitted
                  << " holds the fit's estimates; the sweep would state each design number's spread over the "
                     "other cases in fluid_uncertainty.csv";
      std::cout << "\n  results would go to " << plan.results_folder << '\n';
      return 0;
    }
  } // namespace

  int check_command(const int argc, const char *const *argv, const int first)
  {
    const Arguments arguments = parse_arguments(argc, argv, first, {"--base"}, {"--help"});
    if (arguments.has("--help"))
      {
        std::cout << "usage: lentus check CASE [--set Section/Key=VALUE ...]\n"
                     "       lentus check SWEEP [--base CASE] [--set Section/Key=VALUE ...]\n\n"
                     "Validates CASE without solving: syntax, sections, keys, values and the relations\n"
                     "between them. Prints what was understood; exit code 2 and file:line: key on error.\n"
                     "A sweep file is recognised by its statements (base case, vary, case, ...): every\n"
                     "case it makes is read as the flow solver would read it.\n";
        return 0;
      }
    if (arguments.positional.size() != 1)
      throw InputError("command line", 0, "check needs exactly one case file; see lentus check --help");
    {
      std::ifstream     input(arguments.positional[0]);
      std::stringstream text;
      text << input.rdbuf();
      if (input && sweep::looks_like_sweep_file(text.str()))
        return check_sweep(arguments);
    }

    const input::CaseFile file  = input::CaseFile::read(arguments.positional[0], input::case_schema(), arguments.sets);
    const input::Fluid    fluid = input::read_fluid(file);
    // Read everything before saying "valid": a flow case's geometry and conditions too.
    std::unique_ptr<input::FlowCase> flow;
    if (file.is_set("Geometry/Shape"))
      flow = std::make_unique<input::FlowCase>(input::read_flow_case(file));
    std::cout << file.file_name() << ": valid\n  fluid: " << fluid.law_name;
    for (const auto &[key, value] : fluid.parameters)
      std::cout << "; " << key << " = " << rheology::format_value(value);
    std::cout << "\n  temperature shift: " << fluid.shift_name;
    if (fluid.temperature)
      std::cout << " at T = " << rheology::format_value(*fluid.temperature)
                << " K (a_T = " << rheology::format_value(fluid.shift_factor) << ")";
    std::cout << '\n';
    if (flow)
      {
        std::cout << "  geometry: " << flow->geometry_keys.shape << ", refinement " << flow->geometry_keys.refinement << "; velocity components "
                  << velocity_components(flow->model.formulation) << "; boundary roles:";
        for (const input::BoundaryCondition &bc : flow->conditions)
          std::cout << ' ' << bc.role << ';';
        std::cout << "\n  results would go to " << flow->output_folder << '\n';
      }
    return 0;
  }
} // namespace lentus::cli
