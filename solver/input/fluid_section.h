// The case file's fluid: subsection Rheology (viscosity law, temperature
// shift, density) and the temperature of subsection Operating point.
#pragma once

#include "rheology/parameter_table.h"
#include "rheology/shift/temperature_shift.h"
#include "rheology/viscosity_law.h"
#include "solver/input/case_file.h"

#include <memory>
#include <optional>
#include <string>

namespace lentus::input
{
  /// Declares Rheology/... (every law's and every shift's keys; only the
  /// selected ones are read) and Operating point/Temperature.
  void declare_fluid(CaseSchema &schema);

  /// A fluid as described by a case file.
  struct Fluid
  {
    std::string                                   law_name;
    rheology::ParameterValues                     parameters;     ///< as given plus defaults
    std::shared_ptr<const rheology::ViscosityLaw> reference_law;  ///< at the reference temperature
    std::string                                   shift_name;
    rheology::TemperatureShift                    shift;
    std::optional<double>                         temperature;    ///< [K], if set
    double                                        shift_factor;   ///< a_T at `temperature` (1 without shift)
    std::optional<double>                         density;        ///< [kg/m^3], if set
    std::optional<double>                         heat_capacity;  ///< c_p [J/(kg K)], if set
    std::optional<double>                         thermal_conductivity; ///< k [W/(m K)], if set
    std::shared_ptr<const rheology::ViscosityLaw> law;            ///< at `temperature`
  };

  /// Reads and validates the fluid. `temperature` overrides Operating
  /// point/Temperature (a command-line option). Throws InputError.
  Fluid read_fluid(const CaseFile &file, std::optional<double> temperature = std::nullopt);
} // namespace lentus::input
