// Small numerical building blocks shared by the viscosity laws.
#pragma once

#include "rheology/parameter_table.h"

#include <cmath>

namespace lentus::rheology
{
  /// A value and its derivative with respect to the argument.
  struct ValueAndSlope
  {
    double value;
    double slope;
  };

  /// Papanastasiou's ratio f(x) = (1 - exp(-x)) / x and f'(x) for x >= 0,
  /// without cancellation near x = 0 (f(0) = 1, f'(0) = -1/2).
  ///   f(x)  = -expm1(-x) / x
  ///   f'(x) = (exp(-x) (1 + x) - 1) / x^2 = sum_{k>=1} (-1)^k k x^(k-1) / (k+1)!
  /// Papanastasiou 1987, J. Rheol. 31:385 (the regularized stress).
  inline ValueAndSlope papanastasiou_ratio(const double x)
  {
    if (x == 0.)
      return {1., -0.5};
    const double value = -std::expm1(-x) / x;
    if (x >= 0.5)
      return {value, (std::exp(-x) * (1. + x) - 1.) / (x * x)};
    // Series: term_k = (-1)^k k x^(k-1)/(k+1)!; |term_{k+1}/term_k| < x/2.
    double slope      = 0.;
    double power      = 1.; // x^(k-1)
    double factorial  = 2.; // (k+1)!
    for (int k = 1; k <= 30; ++k)
      {
        const double term = (k % 2 == 1 ? -1. : 1.) * k * power / factorial;
        slope += term;
        if (std::abs(term) < 1e-18 * std::abs(slope))
          break;
        power *= x;
        factorial *= (k + 2);
      }
    return {value, slope};
  }

  /// c x^e and its derivative c e x^(e-1) for x >= 0. At x = 0 the value is
  /// c 0^e (0, c or inf) and the slope is its right limit where that is
  /// finite and 0 where it diverges (a law then bounds the value anyway).
  inline ValueAndSlope scaled_power(const double c, const double x, const double e)
  {
    if (x > 0.)
      {
        const double value = c * std::pow(x, e);
        return {value, e * value / x};
      }
    if (e == 0.)
      return {c, 0.};
    if (e == 1.)
      return {0., c};
    return {e > 0. ? 0. : HUGE_VAL, 0.};
  }

  /// Laws with two Newtonian plateaus need eta_0 >= eta_inf; throws InvalidParameter.
  inline void require_plateau_order(const double eta_0, const double eta_inf)
  {
    if (eta_0 < eta_inf)
      throw InvalidParameter("Zero-shear viscosity", format_value(eta_0),
                             "below Infinite-shear viscosity = " + format_value(eta_inf),
                             "Zero-shear viscosity >= Infinite-shear viscosity");
  }
} // namespace lentus::rheology
