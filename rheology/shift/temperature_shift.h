// Time-temperature superposition: a shift factor a_T(T) and a wrapper that
// applies it to any viscosity law, eta(gamma_dot, T) = a_T eta_ref(a_T gamma_dot).
// For Carreau-type laws this scales eta_0 and lambda by a_T; yield stresses
// are unchanged. Viscosity falls as the temperature rises (a_T < 1 for T > T_ref).
#pragma once

#include "rheology/parameter_table.h"
#include "rheology/viscosity_law.h"

#include <memory>
#include <string>
#include <vector>

namespace lentus::rheology
{
  /// Molar gas constant R [J/(mol K)] (CODATA 2018, exact).
  inline constexpr double gas_constant = 8.314462618;

  /// Catalogue entry of a shift law, for case files and `lentus laws`.
  struct ShiftInfo
  {
    std::string                name;    ///< "none", "Arrhenius", "WLF"
    std::string                formula; ///< a_T in plain text
    std::vector<ParameterInfo> parameters;
  };

  /// A temperature shift law with validated parameters.
  class TemperatureShift
  {
  public:
    enum class Kind
    {
      none,
      arrhenius,
      wlf,
      exponential
    };

    /// a_T = 1.
    TemperatureShift() = default;

    /// a_T = exp(E_a / R (1/T - 1/T_ref)); E_a [J/mol] >= 0, T_ref [K] > 0.
    static TemperatureShift arrhenius(double activation_energy, double reference_temperature);

    /// log10 a_T = -C1 (T - T_ref) / (C2 + T - T_ref); C1 [-] > 0, C2 [K] > 0, T_ref [K] > 0.
    /// Williams, Landel & Ferry 1955, J. Am. Chem. Soc. 77:3701.
    static TemperatureShift wlf(double c1, double c2, double reference_temperature);

    /// a_T = exp(-beta (T - T_ref)); beta [1/K] >= 0, T_ref [K] > 0. The exponential (Reynolds) form
    /// that die designers use over a narrow temperature window.
    static TemperatureShift exponential(double beta, double reference_temperature);

    /// The shift named `name` ("none", "Arrhenius", "WLF", "Exponential") from values by key.
    static TemperatureShift create(const std::string &name, const ParameterValues &values);

    /// The shift laws with their parameter tables.
    static const std::vector<ShiftInfo> &catalogue();

    /// a_T at temperature T [K]. Throws InvalidParameter (key "Temperature")
    /// for T <= 0 K, non-finite T, or (WLF) T at or below T_ref - C2.
    double factor(double temperature) const;

    /// d ln a_T / d T [1/K] at temperature T (<= 0: viscosity falls as T rises); 0 without shift.
    /// Same domain as factor().
    double log_slope(double temperature) const;

    Kind kind() const { return shift_kind; }

  private:
    Kind   shift_kind = Kind::none;
    double activation_energy = 0., c1 = 0., c2 = 0., beta = 0., reference_temperature = 0.;
  };

  /// The law `law` at a temperature with shift factor a_T > 0:
  /// eta(g) = a_T eta_ref(a_T g),  d eta/d g = a_T^2 eta_ref'(a_T g).
  std::unique_ptr<ViscosityLaw> shifted(std::shared_ptr<const ViscosityLaw> law, double shift_factor);
} // namespace lentus::rheology
