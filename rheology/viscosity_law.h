// The viscosity-law interface: eta(gamma_dot) and its derivative, free of the
// mesh and of deal.II. gamma_dot = sqrt(2 D:D) >= 0 is the shear-rate magnitude.
#pragma once

#include <memory>
#include <string>

namespace lentus::rheology
{
  /// eta [Pa s] and d eta / d gamma_dot [Pa s^2] at one shear rate.
  struct Viscosity
  {
    double value;
    double derivative;
  };

  /// A generalized-Newtonian law eta(gamma_dot). Objects are immutable and
  /// therefore safe to share between threads.
  class ViscosityLaw
  {
  public:
    virtual ~ViscosityLaw() = default;

    /// eta and d eta / d gamma_dot at gamma_dot >= 0 [1/s]. Finite at
    /// gamma_dot = 0 for every law (bounded or regularized).
    virtual Viscosity evaluate(double gamma_dot) const = 0;

    /// Yield stress tau_y [Pa]; 0 for laws without one.
    virtual double yield_stress() const { return 0.; }

    /// Registered name, e.g. "Carreau-Yasuda".
    virtual std::string name() const = 0;

    /// Shear stress magnitude tau = eta(gamma_dot) gamma_dot [Pa].
    double stress(const double gamma_dot) const
    {
      return evaluate(gamma_dot).value * gamma_dot;
    }
  };
} // namespace lentus::rheology
