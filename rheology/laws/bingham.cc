// Bingham plastic regularized after Papanastasiou:
// eta = mu_p + tau_y (1 - exp(-M gamma_dot)) / gamma_dot.
// Papanastasiou 1987, J. Rheol. 31:385. Limit at rest: mu_p + tau_y M.
#include "rheology/law_helpers.h"
#include "rheology/law_registry.h"

namespace lentus::rheology
{
  namespace
  {
    struct Bingham
    {
      double mu_p, tau_y, M;
    };

    Viscosity evaluate(const Bingham &parameters, const double gamma_dot)
    {
      const auto &[mu_p, tau_y, M] = parameters;
      // tau_y (1 - exp(-M g)) / g = tau_y M f(M g);  d/dg = tau_y M^2 f'(M g)
      const ValueAndSlope f = papanastasiou_ratio(M * gamma_dot);
      return {mu_p + tau_y * M * f.value, tau_y * M * M * f.slope};
    }

    double yield_stress(const Bingham &parameters)
    {
      return parameters.tau_y;
    }

    const LawRegistration<Bingham> registration{
      "Bingham", "eta = mu_p + tau_y (1 - exp(-M gamma_dot)) / gamma_dot",
      "Bingham plastic with Papanastasiou's regularization: flows with plastic viscosity mu_p once the "
      "stress exceeds tau_y; M [s] sets how sharply (the ideal law is the limit M -> inf).",
      {{"Plastic viscosity", "mu_p", &Bingham::mu_p, "Pa s", "slope of stress against shear rate once yielded",
        Range::above(0.)},
       {"Yield stress", "tau_y", &Bingham::tau_y, "Pa", "stress below which the material does not flow",
        Range::at_least(0.)},
       {"Regularization exponent", "M", &Bingham::M, "s",
        "Papanastasiou exponent; larger is closer to the ideal law", Range::above(0.)}},
      &evaluate, &yield_stress, nullptr,
      // Continuation: M from M/1000 up in four steps (the flow of a nearly Newtonian fluid first).
      {{"Regularization exponent", Softening::Path::geometric, 1e-3, 4, "Yield stress"}},
      // The regularization error: a second solve at a larger M.
      "Regularization exponent"};
  } // namespace
} // namespace lentus::rheology
