// Herschel-Bulkley fluid regularized after Papanastasiou:
// eta = K max(gamma_dot, gamma_min)^(n-1) + tau_y (1 - exp(-M gamma_dot)) / gamma_dot.
// Herschel & Bulkley 1926, Kolloid-Z. 39:291; Papanastasiou 1987, J. Rheol. 31:385.
#include "rheology/law_helpers.h"
#include "rheology/law_registry.h"

namespace lentus::rheology
{
  namespace
  {
    struct HerschelBulkley
    {
      double K, n, tau_y, M, gamma_min;
    };

    Viscosity evaluate(const HerschelBulkley &parameters, const double gamma_dot)
    {
      const auto &[K, n, tau_y, M, gamma_min] = parameters;
      // Power-law part with a shear-rate floor: constant (slope 0) below the floor.
      const ValueAndSlope power = gamma_dot > gamma_min ? scaled_power(K, gamma_dot, n - 1.)
                                                        : ValueAndSlope{scaled_power(K, gamma_min, n - 1.).value, 0.};
      const ValueAndSlope f = papanastasiou_ratio(M * gamma_dot);
      return {power.value + tau_y * M * f.value, power.slope + tau_y * M * M * f.slope};
    }

    double yield_stress(const HerschelBulkley &parameters)
    {
      return parameters.tau_y;
    }

    void validate(const HerschelBulkley &parameters)
    {
      if (parameters.n < 1. && !(parameters.gamma_min > 0.))
        throw InvalidParameter("Shear-rate floor", format_value(parameters.gamma_min),
                               "with Flow index = " + format_value(parameters.n) +
                                 " < 1 the power-law term K gamma_dot^(n-1) is unbounded at rest",
                               "a shear-rate floor > 0 [1/s], well below the shear rates of interest");
    }

    const LawRegistration<HerschelBulkley> registration{
      "Herschel-Bulkley", "eta = K max(gamma_dot, gamma_min)^(n-1) + tau_y (1 - exp(-M gamma_dot)) / gamma_dot",
      "Yield stress tau_y plus a power law K gamma_dot^n once yielded, with Papanastasiou's regularization "
      "(M [s]). The shear-rate floor gamma_min bounds the power-law term at rest (required when n < 1).",
      {{"Consistency", "K", &HerschelBulkley::K, "Pa s^n", "consistency index of the yielded material",
        Range::above(0.)},
       {"Flow index", "n", &HerschelBulkley::n, "-", "flow behaviour index of the yielded material",
        Range::above(0.)},
       {"Yield stress", "tau_y", &HerschelBulkley::tau_y, "Pa", "stress below which the material does not flow",
        Range::at_least(0.)},
       {"Regularization exponent", "M", &HerschelBulkley::M, "s",
        "Papanastasiou exponent; larger is closer to the ideal law", Range::above(0.)},
       {"Shear-rate floor", "gamma_min", &HerschelBulkley::gamma_min, "1/s",
        "the power-law term uses max(gamma_dot, gamma_min) (required > 0 when n < 1)", Range::at_least(0.), 0.}},
      &evaluate, &yield_stress, &validate,
      // Continuation: M from M/1000 up when there is a yield stress, else the flow index from 1.
      {{"Regularization exponent", Softening::Path::geometric, 1e-3, 4, "Yield stress"},
       {"Flow index", Softening::Path::linear, 1., 5, ""}},
      // The regularization error: a second solve at a larger M.
      "Regularization exponent"};
  } // namespace
} // namespace lentus::rheology
