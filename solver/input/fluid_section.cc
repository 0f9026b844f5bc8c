#include "solver/input/fluid_section.h"

#include "rheology/law_registry.h"
#include "solver/errors.h"
#include "solver/input/section_keys.h"

#include <cmath>

namespace lentus::input
{
  namespace
  {
    const std::string section = "Rheology";

    /// The fluid's keys outside the law tables (which the registry declares itself).
    struct FluidScalars
    {
      std::optional<double> density, heat_capacity, thermal_conductivity;

      void bind(SectionKeys &keys)
      {
        keys.optional_real("Density", density, rheology::Range::above(0.),
                           "rho [kg/m^3]: mass density of the fluid; needed with inertia, gravity, a mass flow rate "
                           "or the energy equation.");
        keys.optional_real("Heat capacity", heat_capacity, rheology::Range::above(0.),
                           "c_p [J/(kg K)]: specific heat capacity at constant pressure; needed with the energy "
                           "equation (Heat/Energy equation).");
        keys.optional_real("Thermal conductivity", thermal_conductivity, rheology::Range::above(0.),
                           "k [W/(m K)]: thermal conductivity; needed with the energy equation.");
      }
    };

    /// The temperature of the fluid; its own section, so that a fluid-only file may set it.
    struct FluidTemperature
    {
      std::optional<double> temperature;

      void bind(SectionKeys &keys)
      {
        keys.optional_real("Temperature", temperature, rheology::Range::above(0.),
                           "T [K]: temperature of the fluid; needed when a temperature shift is selected.");
      }
    };
    const std::string temperature_section = "Operating point";

    std::string documentation_of(const rheology::ParameterInfo &parameter)
    {
      return parameter.symbol + " [" + parameter.unit + "]: " + parameter.meaning + "." +
             (parameter.has_default() ? "" : " Required when this law is selected.");
    }

    /// Values of the parameters given in `subsection`, by key.
    rheology::ParameterValues given_values(const CaseFile &file,
                                           const std::string &subsection,
                                           const std::vector<rheology::ParameterInfo> &table)
    {
      rheology::ParameterValues values;
      for (const rheology::ParameterInfo &parameter : table)
        {
          const std::string path = subsection + "/" + parameter.key;
          if (file.is_set(path))
            values[parameter.key] = file.get_real(path);
        }
      return values;
    }
  } // namespace

  void declare_fluid(CaseSchema &schema)
  {
    const auto &laws = rheology::registry();
    schema.declare(section + "/Viscosity law", "", ValueKind::selection(laws.names()),
                   "Which eta(gamma_dot) law the fluid follows; its parameters are set in the subsection of "
                   "the same name. Formulas and units: lentus laws.");
    for (const rheology::LawInfo &law : laws.laws())
      for (const rheology::ParameterInfo &parameter : law.parameters)
        schema.declare(section + "/" + law.name + "/" + parameter.key,
                       parameter.has_default() ? rheology::format_value(parameter.default_value) : "",
                       ValueKind::real(parameter.range), documentation_of(parameter));

    std::vector<std::string> shift_names;
    for (const rheology::ShiftInfo &shift : rheology::TemperatureShift::catalogue())
      shift_names.push_back(shift.name);
    schema.declare(section + "/Temperature shift", "none", ValueKind::selection(shift_names),
                   "Time-temperature superposition of the law: eta(gamma_dot, T) = a_T eta(a_T gamma_dot, T_ref). "
                   "Its parameters are set in the subsection of the same name.");
    for (const rheology::ShiftInfo &shift : rheology::TemperatureShift::catalogue())
      for (const rheology::ParameterInfo &parameter : shift.parameters)
        schema.declare(section + "/" + shift.name + "/" + parameter.key, "", ValueKind::real(parameter.range),
                       documentation_of(parameter));

    declare_section<FluidScalars>(schema, section);
    declare_section<FluidTemperature>(schema, temperature_section);
  }

  Fluid read_fluid(const CaseFile &file, const std::optional<double> temperature)
  {
    Fluid fluid;
    const std::string law_key = section + "/Viscosity law";
    fluid.law_name            = file.get(law_key);
    if (fluid.law_name.empty())
      file.fail(law_key, "missing", "one of " + [] {
                  std::string list;
                  for (const std::string &name : rheology::registry().names())
                    list += (list.empty() ? "" : ", ") + name;
                  return list;
                }());

    const rheology::LawInfo &law        = rheology::registry().find(fluid.law_name);
    const std::string        law_section = section + "/" + fluid.law_name;
    try
      {
        const auto resolved = rheology::resolve_parameters(law.parameters, given_values(file, law_section, law.parameters),
                                                           "viscosity law " + law.name);
        for (std::size_t i = 0; i < resolved.size(); ++i)
          fluid.parameters[law.parameters[i].key] = resolved[i];
        fluid.reference_law = law.create(resolved);
      }
    catch (const rheology::InvalidParameter &error)
      {
        file.fail(law_section + "/" + error.key, error.problem, error.allowed);
      }

    fluid.shift_name                 = file.get(section + "/Temperature shift");
    const std::string shift_section = section + "/" + fluid.shift_name;
    for (const rheology::ShiftInfo &info : rheology::TemperatureShift::catalogue())
      if (info.name == fluid.shift_name)
        try
          {
            fluid.shift = rheology::TemperatureShift::create(info.name, given_values(file, shift_section, info.parameters));
          }
        catch (const rheology::InvalidParameter &error)
          {
            file.fail(shift_section + "/" + error.key, error.problem, error.allowed);
          }

    const std::string temperature_key = temperature_section + "/Temperature";
    fluid.temperature  = temperature ? temperature : read_section<FluidTemperature>(file, temperature_section).temperature;
    fluid.shift_factor = 1.;
    if (fluid.shift.kind() != rheology::TemperatureShift::Kind::none)
      {
        if (!fluid.temperature)
          file.fail(temperature_key, "missing; the temperature shift " + fluid.shift_name + " needs it",
                    "a temperature > 0 K");
        try
          {
            fluid.shift_factor = fluid.shift.factor(*fluid.temperature);
            fluid.law          = rheology::shifted(fluid.reference_law, fluid.shift_factor);
          }
        catch (const rheology::InvalidParameter &error)
          {
            if (temperature)
              throw InputError("command line", 0, "--temperature = " + error.value_text + ": " + error.problem +
                                                    "; allowed: " + error.allowed);
            file.fail(temperature_key, error.problem, error.allowed);
          }
      }
    else
      fluid.law = fluid.reference_law;

    const FluidScalars scalars = read_section<FluidScalars>(file, section);
    fluid.density              = scalars.density;
    fluid.heat_capacity        = scalars.heat_capacity;
    fluid.thermal_conductivity = scalars.thermal_conductivity;
    return fluid;
  }
} // namespace lentus::input
