// Synthetic flow curves from closed-form laws (written out here, independent
// of rheology/laws/) with optional multiplicative noise, for the fit tests.
#pragma once

#include "rheology/fit/flow_curve_data.h"
#include "rheology/shift/temperature_shift.h"

#include <gsl/gsl_randist.h>
#include <gsl/gsl_rng.h>

#include <cmath>
#include <functional>
#include <map>
#include <ostream>
#include <string>
#include <vector>

namespace lentus::rheology::fit::testing
{
  /// Ideal shear stress tau(gamma_dot) [Pa] of a law, analytic:
  /// Newtonian mu g; power law K g^n; Cross g eta_0/(1 + (lambda g)^m);
  /// Carreau-Yasuda g eta_0 (1 + (lambda g)^a)^((n-1)/a); Bingham tau_y + mu_p g;
  /// Herschel-Bulkley tau_y + K g^n (infinite-shear viscosity 0).
  using StressFunction = std::function<double(double)>;

  struct SyntheticLaw
  {
    std::string                   law;
    std::map<std::string, double> truth; ///< fitted keys -> true values
    StressFunction                stress;
    double                        rate_low, rate_high;
    int                           points;
  };

  /// Test names show the law, not the bytes of the struct.
  inline void PrintTo(const SyntheticLaw &law, std::ostream *os)
  {
    *os << law.law;
  }

  /// One test law per registry law; values are inputs for the tests (invented, of the size
  /// real fluids have; e.g. Herschel-Bulkley (5 Pa, 2 Pa s^n, 0.5) on 1e-2..1e3 1/s).
  inline std::vector<SyntheticLaw> synthetic_laws()
  {
    return {
      {"Newtonian", {{"Viscosity", 2.5}}, [](double g) { return 2.5 * g; }, 1e-2, 1e3, 20},
      {"Power law", {{"Consistency", 10.}, {"Flow index", 0.4}}, [](double g) { return 10. * std::pow(g, 0.4); },
       1e-2, 1e3, 20},
      {"Cross",
       {{"Zero-shear viscosity", 1000.}, {"Time constant", 1.}, {"Rate index", 0.7}},
       [](double g) { return g * 1000. / (1. + std::pow(1. * g, 0.7)); },
       1e-3, 1e3, 25},
      {"Carreau-Yasuda",
       {{"Zero-shear viscosity", 1e4}, {"Time constant", 1.}, {"Flow index", 0.4}, {"Yasuda exponent", 2.}},
       [](double g) { return g * 1e4 * std::pow(1. + std::pow(1. * g, 2.), (0.4 - 1.) / 2.); },
       1e-3, 1e3, 25},
      {"Bingham", {{"Plastic viscosity", 2.}, {"Yield stress", 5.}}, [](double g) { return 5. + 2. * g; }, 1e-2, 1e3,
       20},
      {"Herschel-Bulkley",
       {{"Consistency", 2.}, {"Flow index", 0.5}, {"Yield stress", 5.}},
       [](double g) { return 5. + 2. * std::pow(g, 0.5); },
       1e-2, 1e3, 20},
    };
  }

  /// Log-spaced shear rates with tau = stress(a_T g) (1 + noise z), z standard normal
  /// from GSL's MT19937 with `seed` (deterministic); temperature NaN if not given.
  inline FlowCurveData make_data(const StressFunction &stress, double low, double high, int points,
                                 double noise, unsigned long seed,
                                 const std::vector<std::pair<double, double>> &temperatures_and_shifts = {})
  {
    gsl_rng *generator = gsl_rng_alloc(gsl_rng_mt19937);
    gsl_rng_set(generator, seed);
    FlowCurveData data;
    data.source          = "synthetic";
    data.has_temperature = !temperatures_and_shifts.empty();
    std::vector<std::pair<double, double>> sets = temperatures_and_shifts;
    if (sets.empty())
      sets.push_back({std::nan(""), 1.});
    int line = 2;
    for (const auto &[temperature, a_T] : sets)
      for (int i = 0; i < points; ++i)
        {
          const double g   = low * std::pow(high / low, static_cast<double>(i) / (points - 1));
          const double tau = stress(a_T * g) * (1. + noise * gsl_ran_gaussian(generator, 1.));
          data.points.push_back({g, tau, temperature, line++});
        }
    gsl_rng_free(generator);
    return data;
  }
} // namespace lentus::rheology::fit::testing
