// Power law (Ostwald-de Waele): eta = K gamma_dot^(n-1), clipped to
// [eta_min, eta_max]. n < 1 thins, n > 1 thickens.
#include "rheology/law_helpers.h"
#include "rheology/law_registry.h"

namespace lentus::rheology
{
  namespace
  {
    struct PowerLaw
    {
      double K, n, eta_min, eta_max;
    };

    Viscosity evaluate(const PowerLaw &parameters, const double gamma_dot)
    {
      const auto &[K, n, eta_min, eta_max] = parameters;
      // Where the clip is active eta does not depend on gamma_dot: slope 0.
      const ValueAndSlope eta = scaled_power(K, gamma_dot, n - 1.);
      if (eta.value >= eta_max)
        return {eta_max, 0.};
      if (eta.value <= eta_min)
        return {eta_min, 0.};
      return {eta.value, eta.slope};
    }

    void validate(const PowerLaw &parameters)
    {
      const auto &[K, n, eta_min, eta_max] = parameters;
      if (!(eta_min < eta_max))
        throw InvalidParameter("Minimum viscosity", format_value(eta_min),
                               "not below Maximum viscosity = " + format_value(eta_max),
                               "Minimum viscosity < Maximum viscosity");
      if (n < 1. && !std::isfinite(eta_max))
        throw InvalidParameter("Maximum viscosity", "inf",
                               "a shear-thinning power law (Flow index = " + format_value(n) +
                                 " < 1) is unbounded as the shear rate goes to 0",
                               "a finite viscosity cap [Pa s], e.g. the zero-shear viscosity of the material");
      if (n > 1. && !(eta_min > 0.))
        throw InvalidParameter("Minimum viscosity", format_value(eta_min),
                               "a shear-thickening power law (Flow index = " + format_value(n) +
                                 " > 1) has zero viscosity at rest",
                               "a viscosity floor > 0 [Pa s]");
    }

    const LawRegistration<PowerLaw> registration{
      "Power law", "eta = K gamma_dot^(n-1), clipped to [eta_min, eta_max]",
      "Ostwald-de Waele power law; n < 1 shear thinning, n > 1 shear thickening. The bounds keep the "
      "viscosity finite and positive at rest; they are required on the side where the law is unbounded.",
      {{"Consistency", "K", &PowerLaw::K, "Pa s^n", "consistency index", Range::above(0.)},
       {"Flow index", "n", &PowerLaw::n, "-", "flow behaviour index", Range::above(0.)},
       {"Minimum viscosity", "eta_min", &PowerLaw::eta_min, "Pa s",
        "lower viscosity bound (required > 0 when n > 1)", Range::at_least(0.), 0.},
       {"Maximum viscosity", "eta_max", &PowerLaw::eta_max, "Pa s",
        "upper viscosity bound (required finite when n < 1)", Range::above(0.).or_infinite(), HUGE_VAL}},
      &evaluate, nullptr, &validate,
      // Continuation: the flow index from the Newtonian n = 1 to the case's in five steps.
      {{"Flow index", Softening::Path::linear, 1., 5, ""}}};
  } // namespace
} // namespace lentus::rheology
