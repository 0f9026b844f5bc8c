// Fully developed velocity profile of any viscosity law in a slit or a pipe
// at a given flow rate, for inflow boundaries.
#pragma once

#include "rheology/viscosity_law.h"

#include <vector>

namespace lentus::flow
{
  /// The shear rate at which the law's stress eta(gamma_dot) gamma_dot equals tau [Pa] (tau(gamma_dot)
  /// increasing), by bisection in log space; 0 for tau <= 0.
  double inverse_shear_rate(const rheology::ViscosityLaw &law, double tau);

  /// u(s), s = distance from the midplane (slit) or the axis (pipe), for the
  /// flow rate Q (slit: per unit depth [m^2/s]; pipe: [m^3/s]). Built from the
  /// exact 1D momentum balance tau(s) = tau_w s / h and the law's inverse
  /// gamma_dot(tau): u(s) = int_s^h gamma_dot(tau_w t / h) dt, with tau_w
  /// found so that the profile carries Q (CHECKS.md A6; Rabinowitsch-Mooney).
  class DevelopedProfile
  {
  public:
    enum class Channel
    {
      slit,
      pipe
    };

    /// h: half-gap (slit) or radius (pipe) [m]. Throws std::runtime_error if
    /// no wall stress up to 1e12 Pa carries Q.
    DevelopedProfile(const rheology::ViscosityLaw &law, Channel channel, double h, double flow_rate);

    /// Velocity along the channel at distance s from the midplane or axis [m/s]; 0 at |s| >= h.
    double velocity(double s) const;

    double wall_stress() const { return tau_w; }

  private:
    double              h, tau_w = 0.;
    std::vector<double> u; ///< on N + 1 equally spaced s_k = h k / N
  };
} // namespace lentus::flow
