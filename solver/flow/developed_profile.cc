#include "solver/flow/developed_profile.h"

#include <algorithm>
#include <cmath>
#include <memory>
#include <stdexcept>

namespace lentus::flow
{
  double inverse_shear_rate(const rheology::ViscosityLaw &law, const double tau)
  {
    if (tau <= 0.)
      return 0.;
    double high = 1.;
    while (law.stress(high) < tau && high < 1e30)
      high *= 10.;
    double low = high;
    while (law.stress(low) > tau && low > 1e-300)
      low *= 0.1;
    if (law.stress(low) > tau)
      return 0.;
    // Newton on ln tau(ln gamma_dot) = ln tau, whose slope is 1 + gamma_dot eta'/eta > 0, kept inside
    // the bracket [low, high] by bisection in log space whenever a step would leave it or not shrink it.
    const double target = std::log(tau);
    double       x = 0.5 * (std::log(low) + std::log(high)), lower = std::log(low), upper = std::log(high);
    for (int i = 0; i < 200 && upper - lower > 1e-15 * std::max(1., std::abs(x)); ++i)
      {
        const double              rate = std::exp(x);
        const rheology::Viscosity eta  = law.evaluate(rate);
        const double              f    = std::log(eta.value * rate) - target;
        if (f == 0.)
          return rate;
        (f < 0. ? lower : upper) = x;
        const double slope = 1. + rate * eta.derivative / eta.value;
        const double next  = x - f / slope;
        const bool   inside = slope > 0. && next > lower && next < upper;
        const double step   = inside ? next : 0.5 * (lower + upper);
        if (std::abs(step - x) <= 1e-15 * std::max(1., std::abs(x)))
          return std::exp(step);
        x = step;
      }
    return std::exp(x);
  }

  namespace
  {
    constexpr int points = 2000;

    /// The law's inverse gamma_dot(tau) from a table of log tau against log gamma_dot at 100 points
    /// per decade of shear rate from 1e-14 to 1e14 1/s, interpolated linearly in log-log (exact for
    /// power-law and Newtonian pieces); the nested annulus search needs many thousands of inverses.
    class InverseTable
    {
    public:
      explicit InverseTable(const rheology::ViscosityLaw &law)
      {
        for (int k = 0; k <= 2800; ++k)
          {
            const double rate = std::pow(10., -14. + k / 100.);
            log_rate.push_back(std::log(rate));
            log_stress.push_back(std::log(law.stress(rate)));
          }
      }

      double operator()(const double tau) const
      {
        if (tau <= 0.)
          return 0.;
        const double level = std::log(tau);
        std::size_t  k;
        if (level <= log_stress.front())
          return std::exp(log_rate.front() + level - log_stress.front()); // Newtonian below the table
        if (level >= log_stress.back())
          k = log_stress.size() - 2; // extrapolated with the last slope
        else
          k = std::upper_bound(log_stress.begin(), log_stress.end(), level) - log_stress.begin() - 1;
        const double t = (level - log_stress[k]) / (log_stress[k + 1] - log_stress[k]);
        return std::exp(log_rate[k] + t * (log_rate[k + 1] - log_rate[k]));
      }

    private:
      std::vector<double> log_rate, log_stress;
    };

    /// Annulus a < r < b at pressure gradient G with zero stress at r^2 = c: tau_rz = (G/2)(c/r - r),
    /// du/dr = sign(tau) gamma_dot(|tau|); u integrated outward from u(a) = 0 (trapezoids). Returns u(b).
    double annulus_velocity(const InverseTable &rate, const double a, const double b, const double G, const double c,
                            std::vector<double> &u)
    {
      const double dr    = (b - a) / points;
      const auto   slope = [&](const double r) {
        const double tau = 0.5 * G * (c / r - r);
        return tau >= 0. ? rate(tau) : -rate(-tau);
      };
      u.assign(points + 1, 0.);
      double previous = slope(a);
      for (int k = 1; k <= points; ++k)
        {
          const double next = slope(a + k * dr);
          u[k]              = u[k - 1] + 0.5 * (previous + next) * dr;
          previous          = next;
        }
      return u[points];
    }

    /// The annulus profile at mean wall stress T = G (b - a) / 2: c from u(b) = 0 (u(b) grows with c
    /// from below 0 at c = a^2 to above 0 at c = b^2), then the flow rate 2 pi int u r dr.
    double annulus_profile(const InverseTable &rate, const double a, const double b, const double T, double &c,
                           std::vector<double> &u)
    {
      const double G = 2. * T / (b - a);
      double       low = a * a, high = b * b;
      while (high - low > 1e-14 * b * b)
        {
          c = 0.5 * (low + high);
          (annulus_velocity(rate, a, b, G, c, u) < 0. ? low : high) = c;
        }
      c = 0.5 * (low + high);
      annulus_velocity(rate, a, b, G, c, u);
      // Remove the small remaining end value linearly so that u(b) = 0 exactly.
      for (int k = 0; k <= points; ++k)
        u[k] -= u[points] * k / points;
      const double dr        = (b - a) / points;
      double       flow_rate = 0.;
      for (int k = 0; k < points; ++k)
        flow_rate += 0.5 * (u[k] * (a + k * dr) + u[k + 1] * (a + (k + 1) * dr)) * dr;
      return 2. * M_PI * flow_rate;
    }

    /// u_k on s_k = h k / points for wall stress tau_w, and the flow rate it carries.
    double profile(const rheology::ViscosityLaw &law,
                   const DevelopedProfile::Channel channel,
                   const double h,
                   const double tau_w,
                   std::vector<double> &u)
    {
      std::vector<double> rate(points + 1);
      for (int k = 0; k <= points; ++k)
        rate[k] = inverse_shear_rate(law, tau_w * k / points);
      u.assign(points + 1, 0.);
      const double ds = h / points;
      for (int k = points - 1; k >= 0; --k)
        u[k] = u[k + 1] + 0.5 * (rate[k] + rate[k + 1]) * ds;
      double flow_rate = 0.;
      for (int k = 0; k < points; ++k)
        {
          const double s0 = k * ds, s1 = (k + 1) * ds;
          flow_rate += channel == DevelopedProfile::Channel::slit ? 0.5 * (u[k] + u[k + 1]) * ds :
                                                                    0.5 * (u[k] * s0 + u[k + 1] * s1) * ds;
        }
      return channel == DevelopedProfile::Channel::slit ? 2. * flow_rate : 2. * M_PI * flow_rate;
    }
  } // namespace

  DevelopedProfile::DevelopedProfile(const rheology::ViscosityLaw &law,
                                     const Channel channel_,
                                     const double h_,
                                     const double flow_rate,
                                     const double inner)
    : channel(channel_)
    , h(h_)
    , a(channel_ == Channel::annulus ? inner : 0.)
  {
    if (channel == Channel::annulus && !(a > 0. && a < h))
      throw std::runtime_error("an annulus needs 0 < inner radius < outer radius");
    if (flow_rate == 0.)
      {
        u.assign(points + 1, 0.);
        return;
      }
    const double target = std::abs(flow_rate);
    std::unique_ptr<InverseTable> table;
    if (channel == Channel::annulus)
      table = std::make_unique<InverseTable>(law);
    double     c       = 0.;
    const auto carried = [&](const double stress) {
      return channel == Channel::annulus ? annulus_profile(*table, a, h, stress, c, u) :
                                           profile(law, channel, h, stress, u);
    };
    // Bisection in log space on the (mean) wall stress.
    double low = 1e-12, high = 1.;
    while (carried(high) < target)
      {
        high *= 10.;
        if (high > 1e12)
          throw std::runtime_error("no wall stress up to 1e12 Pa carries the flow rate");
      }
    while (high / low > 1. + 1e-13)
      {
        const double middle = std::sqrt(low * high);
        (carried(middle) < target ? low : high) = middle;
      }
    tau_w                = std::sqrt(low * high);
    const double result  = carried(tau_w);
    const double sign    = flow_rate > 0. ? 1. : -1.;
    // Scale the small remaining bisection and quadrature error away so the profile carries Q exactly.
    for (double &value : u)
      value *= flow_rate / result;
    switch (channel)
      {
        case Channel::slit:
          gradient = sign * tau_w / h;
          break;
        case Channel::pipe:
          gradient = sign * 2. * tau_w / h;
          break;
        case Channel::annulus:
          gradient    = sign * 2. * tau_w / (h - a);
          zero_stress = std::sqrt(c);
          break;
      }
    tau_inner = tau_outer = tau_w;
    if (channel == Channel::annulus)
      {
        tau_inner = 0.5 * std::abs(gradient) * (c / a - a);
        tau_outer = 0.5 * std::abs(gradient) * (h - c / h);
      }
  }

  double DevelopedProfile::velocity(const double s) const
  {
    const double from     = channel == Channel::annulus ? s - a : std::abs(s);
    const double position = from / (h - a) * points;
    if (position >= points || position < 0.)
      return 0.;
    const int    k = static_cast<int>(position);
    const double t = position - k;
    return (1. - t) * u[k] + t * u[k + 1];
  }
} // namespace lentus::flow
