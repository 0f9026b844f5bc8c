// Newtonian fluid: eta = mu.
#include "rheology/law_registry.h"

namespace lentus::rheology
{
  namespace
  {
    struct Newtonian
    {
      double mu;
    };

    Viscosity evaluate(const Newtonian &parameters, double /*gamma_dot*/)
    {
      return {parameters.mu, 0.};
    }

    const LawRegistration<Newtonian> registration{
      "Newtonian", "eta = mu", "Constant viscosity (Newton's law of viscosity).",
      {{"Viscosity", "mu", &Newtonian::mu, "Pa s", "dynamic viscosity", Range::above(0.)}},
      &evaluate, nullptr, nullptr};
  } // namespace
} // namespace lentus::rheology
