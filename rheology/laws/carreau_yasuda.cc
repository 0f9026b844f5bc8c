// Carreau-Yasuda law: eta = eta_inf + (eta_0 - eta_inf) (1 + (lambda gamma_dot)^a)^((n-1)/a).
// Carreau 1972, Trans. Soc. Rheol. 16:99; Yasuda, Armstrong & Cohen 1981, Rheol. Acta 20:163.
#include "rheology/law_helpers.h"
#include "rheology/law_registry.h"

namespace lentus::rheology
{
  namespace
  {
    struct CarreauYasuda
    {
      double eta_0, eta_inf, lambda, n, a;
    };

    Viscosity evaluate(const CarreauYasuda &parameters, const double gamma_dot)
    {
      const auto &[eta_0, eta_inf, lambda, n, a] = parameters;
      const ValueAndSlope x      = scaled_power(std::pow(lambda, a), gamma_dot, a); // (lambda gamma_dot)^a
      const double        excess = (eta_0 - eta_inf) * std::pow(1. + x.value, (n - 1.) / a);
      // d/d gamma_dot of (1+x)^((n-1)/a) = (n-1)/a (1+x)^((n-1)/a - 1) dx/d gamma_dot
      return {eta_inf + excess, excess * (n - 1.) / a * x.slope / (1. + x.value)};
    }

    void validate(const CarreauYasuda &parameters)
    {
      require_plateau_order(parameters.eta_0, parameters.eta_inf);
    }

    const LawRegistration<CarreauYasuda> registration{
      "Carreau-Yasuda", "eta = eta_inf + (eta_0 - eta_inf) (1 + (lambda gamma_dot)^a)^((n-1)/a)",
      "Newtonian plateau eta_0, power-law thinning with index n beyond 1/lambda; a sets the width of "
      "the transition (a = 2: Carreau).",
      {{"Zero-shear viscosity", "eta_0", &CarreauYasuda::eta_0, "Pa s", "viscosity plateau at low shear rate",
        Range::above(0.)},
       {"Infinite-shear viscosity", "eta_inf", &CarreauYasuda::eta_inf, "Pa s",
        "viscosity plateau at high shear rate", Range::at_least(0.), 0.},
       {"Time constant", "lambda", &CarreauYasuda::lambda, "s",
        "inverse of the shear rate where thinning starts", Range::above(0.)},
       {"Flow index", "n", &CarreauYasuda::n, "-", "power-law index of the thinning region",
        Range::above(0.)},
       {"Yasuda exponent", "a", &CarreauYasuda::a, "-", "width of the transition; 2 for Carreau",
        Range::above(0.), 2.}},
      &evaluate, nullptr, &validate,
      // Continuation: the flow index from the Newtonian n = 1 to the case's in five steps.
      {{"Flow index", Softening::Path::linear, 1., 5, ""}}};
  } // namespace
} // namespace lentus::rheology
