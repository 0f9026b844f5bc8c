// `lentus laws`: the catalogue of viscosity laws and temperature shifts.
#include "rheology/law_registry.h"
#include "rheology/shift/temperature_shift.h"
#include "solver/cli/arguments.h"
#include "solver/cli/commands.h"

#include <iomanip>
#include <iostream>

namespace lentus::cli
{
  namespace
  {
    void print_table(const std::vector<rheology::ParameterInfo> &parameters)
    {
      for (const rheology::ParameterInfo &parameter : parameters)
        {
          std::cout << "    " << std::left << std::setw(26) << parameter.key << std::setw(10) << parameter.symbol
                    << std::setw(8) << parameter.unit << parameter.meaning << "; "
                    << parameter.range.describe();
          if (parameter.has_default())
            std::cout << "; default " << rheology::format_value(parameter.default_value);
          else
            std::cout << "; required";
          std::cout << '\n';
        }
    }
  } // namespace

  int laws_command(const int argc, const char *const *argv, const int first)
  {
    const Arguments arguments = parse_arguments(argc, argv, first, {}, {"--help"});
    if (arguments.has("--help"))
      {
        std::cout << "usage: lentus laws\n\n"
                     "Lists every viscosity law and temperature shift with its formula and parameters\n"
                     "(case-file key, symbol, SI unit, meaning, allowed values, default).\n"
                     "In a case file: subsection Rheology / set Viscosity law = NAME / subsection NAME.\n";
        return 0;
      }
    std::cout << "Viscosity laws (shear rate gamma_dot [1/s], viscosity eta [Pa s]):\n";
    for (const rheology::LawInfo &law : rheology::registry().laws())
      {
        std::cout << "\n  " << law.name << ":  " << law.formula << "\n    " << law.description << '\n';
        print_table(law.parameters);
      }
    std::cout << "\nTemperature shifts (set Temperature shift = NAME; eta(gamma_dot, T) = a_T eta(a_T gamma_dot, "
                 "T_ref)):\n";
    for (const rheology::ShiftInfo &shift : rheology::TemperatureShift::catalogue())
      {
        std::cout << "\n  " << shift.name << ":  " << shift.formula << '\n';
        print_table(shift.parameters);
      }
    return 0;
  }
} // namespace lentus::cli
