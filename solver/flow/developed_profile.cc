#include "solver/flow/developed_profile.h"

#include <cmath>
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
    for (int i = 0; i < 80; ++i)
      {
        const double middle = std::sqrt(low * high);
        (law.stress(middle) < tau ? low : high) = middle;
      }
    return std::sqrt(low * high);
  }

  namespace
  {
    constexpr int points = 2000;

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
                                     const Channel channel,
                                     const double h_,
                                     const double flow_rate)
    : h(h_)
  {
    if (flow_rate == 0.)
      {
        u.assign(points + 1, 0.);
        return;
      }
    const double target = std::abs(flow_rate);
    double       low = 1e-12, high = 1.;
    while (profile(law, channel, h, high, u) < target)
      {
        high *= 10.;
        if (high > 1e12)
          throw std::runtime_error("no wall stress up to 1e12 Pa carries the flow rate");
      }
    for (int i = 0; i < 60; ++i)
      {
        const double middle = std::sqrt(low * high);
        (profile(law, channel, h, middle, u) < target ? low : high) = middle;
      }
    tau_w                = std::sqrt(low * high);
    const double carried = profile(law, channel, h, tau_w, u);
    // Scale the small remaining bisection and quadrature error away so the profile carries Q exactly.
    for (double &value : u)
      value *= flow_rate / carried;
  }

  double DevelopedProfile::velocity(const double s) const
  {
    const double position = std::abs(s) / h * points;
    if (position >= points)
      return 0.;
    const int    k = static_cast<int>(position);
    const double t = position - k;
    return (1. - t) * u[k] + t * u[k + 1];
  }
} // namespace lentus::flow
