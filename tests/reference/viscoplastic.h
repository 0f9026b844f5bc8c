// Reference solutions of viscoplastic flows, computed here from their closed forms (and, where a
// closed form is derived below, checked against a quadrature of its integral in the unit tests).
// Plain C++: no deal.II, no Lentus code, so that an expected value never comes from the code it checks.
#pragma once

#include <cmath>
#include <functional>
#include <sstream>
#include <string>

namespace lentus::testing
{
  /// x with 17 significant digits, for a case file (std::to_string keeps 6 decimals).
  inline std::string digits(const double x)
  {
    std::ostringstream text;
    text.precision(17);
    text << x;
    return text.str();
  }

  /// Composite Simpson rule of f over [a, b] with `intervals` (even) subintervals.
  inline double simpson(const std::function<double(double)> &f, const double a, const double b,
                        const int intervals = 20000)
  {
    const double h   = (b - a) / intervals;
    double       sum = f(a) + f(b);
    for (int i = 1; i < intervals; ++i)
      sum += (i % 2 ? 4. : 2.) * f(a + i * h);
    return sum * h / 3.;
  }

  /// Steady circular Couette flow of an ideal Bingham fluid (plastic viscosity mu_p, yield stress tau_y)
  /// between an inner cylinder of radius R_i turning at Omega and a fixed outer one, with the inner wall
  /// stress tau_i above tau_y. The momentum balance gives tau(r) = tau_i R_i^2 / r^2 whatever the law
  /// (Bird, Stewart & Lightfoot 2002, Transport Phenomena, Example 3.6-3 for the Newtonian case); the
  /// fluid yields where tau > tau_y, i.e. for r < r_y = R_i sqrt(tau_i / tau_y), and there
  /// -r d(omega)/dr = (tau - tau_y) / mu_p. With omega(r_y) = 0 (the rigid outer fluid at rest):
  ///   Omega = (1/mu_p) int_{R_i}^{r_y} (tau(r) - tau_y) / r dr = (tau_y / (2 mu_p)) [t - 1 - ln t],
  /// t = tau_i / tau_y, when r_y is inside the gap (Bird, Dai & Yarusso 1983, Rev. Chem. Eng. 1:1, from
  /// memory for the equation; for a fully yielded gap it becomes the Reiner-Riwlin equation, Reiner &
  /// Riwlin 1927, Kolloid-Z. 43:1). At R_i = 1, tau_i = 3, mu_p = tau_y = 1: Omega = 1 - ln sqrt(3),
  /// r_y = sqrt(3).
  struct BinghamCouette
  {
    double rotation_rate; ///< Omega [rad/s]
    double yield_radius;  ///< r_y [m]
  };

  inline BinghamCouette bingham_couette(const double R_i, const double tau_i, const double mu_p, const double tau_y)
  {
    const double t = tau_i / tau_y;
    return {tau_y / (2. * mu_p) * (t - 1. - std::log(t)), R_i * std::sqrt(t)};
  }

  /// Flow rate of an ideal Herschel-Bulkley fluid (tau = tau_y + K gamma_dot^n once yielded; Herschel &
  /// Bulkley 1926, Kolloid-Z. 39:291) in a pipe of radius R with wall stress tau_w > tau_y.
  /// Derivation: in developed pipe flow tau(r) = tau_w r / R (force balance), so the
  /// Rabinowitsch-Mooney integral (Rabinowitsch 1929, Z. Phys. Chem. A145:1; Mooney 1931, J. Rheol. 2:210)
  ///   Q = (pi R^3 / tau_w^3) int_0^tau_w tau^2 gamma_dot(tau) dtau
  /// holds for any law; with gamma_dot = ((tau - tau_y)/K)^s, s = 1/n, above tau_y (0 below) and
  /// tau = tau_y + x, X = tau_w - tau_y:
  ///   int_0^X (tau_y + x)^2 (x/K)^s dx = K^-s [tau_y^2 X^(s+1)/(s+1) + 2 tau_y X^(s+2)/(s+2) + X^(s+3)/(s+3)].
  /// The same result is in Chhabra & Richardson 2008, Non-Newtonian Flow and Applied Rheology, ch. 3
  /// (from memory for the equation number); n = 1 gives the Buckingham-Reiner equation.
  inline double herschel_bulkley_pipe_flow_rate(const double R, const double tau_w, const double K, const double n,
                                                const double tau_y)
  {
    const double s = 1. / n, X = tau_w - tau_y;
    const double integral = std::pow(K, -s) * (tau_y * tau_y * std::pow(X, s + 1.) / (s + 1.) +
                                               2. * tau_y * std::pow(X, s + 2.) / (s + 2.) +
                                               std::pow(X, s + 3.) / (s + 3.));
    return M_PI * R * R * R / (tau_w * tau_w * tau_w) * integral;
  }

  /// Buckingham-Reiner flow rate of an ideal Bingham fluid in a pipe (Buckingham 1921, Proc. ASTM
  /// 21:1154): Q = (pi R^3 tau_w / (4 mu_p)) [1 - 4/3 phi + phi^4 / 3], phi = tau_y / tau_w.
  inline double buckingham_reiner_flow_rate(const double R, const double tau_w, const double mu_p, const double tau_y)
  {
    const double phi = tau_y / tau_w;
    return M_PI * R * R * R * tau_w / (4. * mu_p) * (1. - 4. / 3. * phi + std::pow(phi, 4) / 3.);
  }

  /// Flow rate in a pipe of radius R at wall stress tau_w of the Bingham fluid regularized after
  /// Papanastasiou 1987 (J. Rheol. 31:385): tau(g) = mu_p g + tau_y (1 - exp(-m g)), written here from
  /// the paper, not from the code under test. The Rabinowitsch-Mooney integral in the shear rate (no
  /// inversion of the law): Q = (pi R^3 / tau_w^3) int_0^{g_w} tau(g)^2 g tau'(g) dg, tau(g_w) = tau_w;
  /// g_w by bisection, the integral by Simpson's rule (smooth integrand; 20000 intervals).
  inline double papanastasiou_bingham_pipe_flow_rate(const double R, const double tau_w, const double mu_p,
                                                     const double tau_y, const double m)
  {
    const auto tau   = [&](const double g) { return mu_p * g + tau_y * (1. - std::exp(-m * g)); };
    const auto slope = [&](const double g) { return mu_p + tau_y * m * std::exp(-m * g); };
    double     low = 0., high = tau_w / mu_p; // tau(high) >= tau_w
    for (int i = 0; i < 200; ++i)
      (tau(0.5 * (low + high)) < tau_w ? low : high) = 0.5 * (low + high);
    const double g_w = 0.5 * (low + high);
    const double integral =
      simpson([&](const double g) { return tau(g) * tau(g) * g * slope(g); }, 0., g_w, 20000);
    return M_PI * R * R * R / (tau_w * tau_w * tau_w) * integral;
  }
} // namespace lentus::testing
