// Reference values for fully developed axial flow in a concentric annulus (Newtonian: Bird, Stewart &
// Lightfoot 2002, Transport Phenomena, section 2.4; power law: Hanks & Larsen 1979),
// computed independently of the solver: shared by the unit and the verification tests.
#pragma once

#include "viscoplastic.h"

#include <algorithm>
#include <cmath>
#include <functional>

namespace lentus::testing
{
  /// Newtonian annulus, Bird, Stewart & Lightfoot 2002, Transport Phenomena, section 2.4:
  /// Q = (pi G R^4 / (8 mu)) [(1 - k^4) - (1 - k^2)^2 / ln(1/k)], outer radius R, inner k R.
  inline double newtonian_annulus_flow_rate(const double mu, const double R, const double k, const double G)
  {
    return M_PI * G * std::pow(R, 4) / (8. * mu) * ((1. - std::pow(k, 4)) - std::pow(1. - k * k, 2) / std::log(1. / k));
  }

  struct PowerLawAnnulusFlow
  {
    double lambda;    ///< radius of zero stress over R
    double flow_rate; ///< [m^3/s]
  };

  /// Power-law annulus (consistency K, flow index n, outer radius R, inner k R, pressure gradient G),
  /// in the exact form of Hanks & Larsen 1979, Ind. Eng. Chem. Fundam. 18:33, s = 1/n,
  /// xi = r/R: lambda solves int_k^lambda (lambda^2/xi - xi)^s dxi = int_lambda^1 (xi - lambda^2/xi)^s dxi,
  /// Q = (pi R^3 n / (3n + 1)) (R G / (2K))^s [(1 - lambda^2)^(1+s) - k^(1-s) (lambda^2 - k^2)^(1+s)].
  inline PowerLawAnnulusFlow power_law_annulus(const double K, const double n, const double R, const double k,
                                               const double G)
  {
    const double s        = 1. / n;
    const auto   mismatch = [&](const double lambda) {
      const double l2 = lambda * lambda;
      return simpson([&](const double x) { return std::pow(std::max(l2 / x - x, 0.), s); }, k, lambda) -
             simpson([&](const double x) { return std::pow(std::max(x - l2 / x, 0.), s); }, lambda, 1.);
    };
    double low = k, high = 1.;
    for (int i = 0; i < 60; ++i)
      {
        const double middle = 0.5 * (low + high);
        (mismatch(middle) < 0. ? low : high) = middle;
      }
    const double lambda = 0.5 * (low + high), l2 = lambda * lambda;
    return {lambda, M_PI * std::pow(R, 3) * n / (3. * n + 1.) * std::pow(R * G / (2. * K), s) *
                      (std::pow(1. - l2, 1. + s) - std::pow(k, 1. - s) * std::pow(l2 - k * k, 1. + s))};
  }
} // namespace lentus::testing
