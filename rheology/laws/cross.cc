// Cross law: eta = eta_inf + (eta_0 - eta_inf) / (1 + (lambda gamma_dot)^m).
// Cross 1965, J. Colloid Sci. 20:417.
#include "rheology/law_helpers.h"
#include "rheology/law_registry.h"

namespace lentus::rheology
{
  namespace
  {
    struct Cross
    {
      double eta_0, eta_inf, lambda, m;
    };

    Viscosity evaluate(const Cross &parameters, const double gamma_dot)
    {
      const auto &[eta_0, eta_inf, lambda, m] = parameters;
      const ValueAndSlope x     = scaled_power(std::pow(lambda, m), gamma_dot, m); // (lambda gamma_dot)^m
      const double        denom = 1. + x.value;
      return {eta_inf + (eta_0 - eta_inf) / denom, -(eta_0 - eta_inf) * x.slope / (denom * denom)};
    }

    void validate(const Cross &parameters)
    {
      require_plateau_order(parameters.eta_0, parameters.eta_inf);
    }

    const LawRegistration<Cross> registration{
      "Cross", "eta = eta_inf + (eta_0 - eta_inf) / (1 + (lambda gamma_dot)^m)",
      "Newtonian plateau eta_0 at low shear rate, shear thinning with slope about m - 1 beyond "
      "1/lambda, plateau eta_inf at high shear rate (Cross 1965).",
      {{"Zero-shear viscosity", "eta_0", &Cross::eta_0, "Pa s", "viscosity plateau at low shear rate",
        Range::above(0.)},
       {"Infinite-shear viscosity", "eta_inf", &Cross::eta_inf, "Pa s",
        "viscosity plateau at high shear rate", Range::at_least(0.), 0.},
       {"Time constant", "lambda", &Cross::lambda, "s",
        "inverse of the shear rate where thinning starts", Range::above(0.)},
       {"Rate index", "m", &Cross::m, "-", "Cross exponent; thinning slope of log eta is -m",
        Range::above(0.)}},
      &evaluate, nullptr, &validate};
  } // namespace
} // namespace lentus::rheology
