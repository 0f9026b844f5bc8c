#include "rheology/shift/temperature_shift.h"

#include <cmath>

namespace lentus::rheology
{
  namespace
  {
    const ParameterInfo reference_temperature_row{
      "Reference temperature", "T_ref", "K", "temperature at which the law's parameters were measured",
      Range::above(0.)};

    class ShiftedLaw : public ViscosityLaw
    {
    public:
      ShiftedLaw(std::shared_ptr<const ViscosityLaw> law_, const double a_)
        : law(std::move(law_))
        , a(a_)
      {}

      Viscosity evaluate(const double gamma_dot) const override
      {
        const Viscosity reference = law->evaluate(a * gamma_dot);
        return {a * reference.value, a * a * reference.derivative};
      }
      double      yield_stress() const override { return law->yield_stress(); }
      std::string name() const override { return law->name(); }

    private:
      std::shared_ptr<const ViscosityLaw> law;
      double                              a;
    };
  } // namespace

  const std::vector<ShiftInfo> &TemperatureShift::catalogue()
  {
    static const std::vector<ShiftInfo> shifts{
      {"none", "a_T = 1", {}},
      {"Arrhenius",
       "a_T = exp(E_a / R (1/T - 1/T_ref)), R = 8.314462618 J/(mol K)",
       {{"Activation energy", "E_a", "J/mol", "flow activation energy", Range::at_least(0.)},
        reference_temperature_row}},
      {"WLF",
       "log10 a_T = -C1 (T - T_ref) / (C2 + T - T_ref)  (Williams, Landel & Ferry 1955)",
       {{"C1", "C1", "-", "WLF constant C1", Range::above(0.)},
        {"C2", "C2", "K", "WLF constant C2; a_T is singular at T = T_ref - C2", Range::above(0.)},
        reference_temperature_row}},
      {"Exponential",
       "a_T = exp(-beta (T - T_ref))",
       {{"Temperature sensitivity", "beta", "1/K", "relative fall of the viscosity per kelvin", Range::at_least(0.)},
        reference_temperature_row}}};
    return shifts;
  }

  TemperatureShift TemperatureShift::arrhenius(const double activation_energy_,
                                               const double reference_temperature_)
  {
    const auto values = resolve_parameters(catalogue()[1].parameters,
                                           {{"Activation energy", activation_energy_},
                                            {"Reference temperature", reference_temperature_}},
                                           "temperature shift Arrhenius");
    TemperatureShift shift;
    shift.shift_kind            = Kind::arrhenius;
    shift.activation_energy     = values[0];
    shift.reference_temperature = values[1];
    return shift;
  }

  TemperatureShift TemperatureShift::wlf(const double c1_, const double c2_, const double reference_temperature_)
  {
    const auto values = resolve_parameters(catalogue()[2].parameters,
                                           {{"C1", c1_}, {"C2", c2_}, {"Reference temperature", reference_temperature_}},
                                           "temperature shift WLF");
    TemperatureShift shift;
    shift.shift_kind            = Kind::wlf;
    shift.c1                    = values[0];
    shift.c2                    = values[1];
    shift.reference_temperature = values[2];
    return shift;
  }

  TemperatureShift TemperatureShift::exponential(const double beta_, const double reference_temperature_)
  {
    const auto values = resolve_parameters(catalogue()[3].parameters,
                                           {{"Temperature sensitivity", beta_},
                                            {"Reference temperature", reference_temperature_}},
                                           "temperature shift Exponential");
    TemperatureShift shift;
    shift.shift_kind            = Kind::exponential;
    shift.beta                  = values[0];
    shift.reference_temperature = values[1];
    return shift;
  }

  TemperatureShift TemperatureShift::create(const std::string &name, const ParameterValues &values)
  {
    for (const ShiftInfo &info : catalogue())
      if (info.name == name)
        {
          const auto resolved = resolve_parameters(info.parameters, values, "temperature shift " + name);
          if (name == "Arrhenius")
            return arrhenius(resolved[0], resolved[1]);
          if (name == "WLF")
            return wlf(resolved[0], resolved[1], resolved[2]);
          if (name == "Exponential")
            return exponential(resolved[0], resolved[1]);
          return TemperatureShift();
        }
    throw InvalidParameter("Temperature shift", name, "unknown temperature shift", "one of none, Arrhenius, WLF, Exponential");
  }

  double TemperatureShift::factor(const double temperature) const
  {
    if (shift_kind == Kind::none)
      return 1.;
    if (!std::isfinite(temperature) || !(temperature > 0.))
      throw InvalidParameter("Temperature", format_value(temperature), "not an absolute temperature",
                             "a finite temperature > 0 K");
    if (shift_kind == Kind::arrhenius)
      return std::exp(activation_energy / gas_constant * (1. / temperature - 1. / reference_temperature));
    if (shift_kind == Kind::exponential)
      {
        const double factor = std::exp(-beta * (temperature - reference_temperature));
        if (!(factor > 0.) || !std::isfinite(factor))
          throw InvalidParameter("Temperature", format_value(temperature),
                                 "so far from the reference temperature that a_T = exp(-beta (T - T_ref)) is 0 or "
                                 "overflows",
                                 "a temperature nearer T_ref = " + format_short(reference_temperature) + " K");
        return factor;
      }

    // The WLF law is singular at T = T_ref - C2; near it a_T overflows.
    const double difference = temperature - reference_temperature;
    const std::string singular = format_short(reference_temperature - c2);
    if (!(c2 + difference > 0.))
      throw InvalidParameter("Temperature", format_value(temperature),
                             "at or below the WLF singularity T_ref - C2 = " + singular + " K", "T > " + singular + " K");
    const double factor = std::pow(10., -c1 * difference / (c2 + difference));
    if (!std::isfinite(factor) || !(factor > 0.))
      throw InvalidParameter("Temperature", format_value(temperature),
                             "so close to the WLF singularity T_ref - C2 = " + singular + " K that a_T overflows",
                             "T > " + singular + " K, well clear of it");
    return factor;
  }

  double TemperatureShift::log_slope(const double temperature) const
  {
    if (shift_kind == Kind::none)
      return 0.;
    factor(temperature); // the same checks of the domain
    if (shift_kind == Kind::arrhenius)
      return -activation_energy / (gas_constant * temperature * temperature);
    if (shift_kind == Kind::exponential)
      return -beta;
    // d/dT [-ln10 C1 x / (C2 + x)] with x = T - T_ref
    const double denominator = c2 + temperature - reference_temperature;
    return -std::log(10.) * c1 * c2 / (denominator * denominator);
  }

  std::unique_ptr<ViscosityLaw> shifted(std::shared_ptr<const ViscosityLaw> law, const double shift_factor)
  {
    if (!std::isfinite(shift_factor) || !(shift_factor > 0.))
      throw InvalidParameter("Temperature", "(shift factor " + format_value(shift_factor) + ")",
                             "the temperature shift factor a_T is not a finite positive number",
                             "a temperature where a_T is finite and > 0");
    return std::make_unique<ShiftedLaw>(std::move(law), shift_factor);
  }
} // namespace lentus::rheology
