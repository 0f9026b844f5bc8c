// Fully developed velocity profile of any viscosity law in a slit, a pipe or a
// concentric annulus at a given flow rate, for inflow boundaries and die numbers.
#pragma once

#include "rheology/viscosity_law.h"

#include <vector>

namespace lentus::flow
{
  /// The shear rate at which the law's stress eta(gamma_dot) gamma_dot equals tau [Pa] (tau(gamma_dot)
  /// increasing), by bisection in log space; 0 for tau <= 0.
  double inverse_shear_rate(const rheology::ViscosityLaw &law, double tau);

  /// u(s) for the flow rate Q (slit: per unit depth [m^2/s]; pipe and annulus: [m^3/s]), from the
  /// exact 1D momentum balance and the law's inverse gamma_dot(tau):
  /// - slit and pipe: tau(s) = tau_w s / h, u(s) = int_s^h gamma_dot(tau_w t / h) dt, s the distance
  ///   from the midplane or the axis, tau_w found so that the profile carries Q (the
  ///   Rabinowitsch-Mooney construction: Rabinowitsch 1929, Z. Phys. Chem. A145:1; Mooney 1931, J. Rheol. 2:210);
  /// - annulus between radii a < b, walls at both: tau_rz(r) = (G/2)(lambda^2 b^2 / r - r), with the
  ///   pressure gradient G and the radius lambda b of zero stress found by a nested root search:
  ///   lambda so that u, integrated outward from u(a) = 0, vanishes at b; G so that the profile
  ///   carries Q (the construction of Fredrickson & Bird 1958, Ind. Eng. Chem. 50:347, from memory for the
  ///   volume and page, for any law).
  class DevelopedProfile
  {
  public:
    enum class Channel
    {
      slit,
      pipe,
      annulus
    };

    /// h: half-gap (slit), radius (pipe) or outer radius (annulus) [m]; inner: the annulus's inner
    /// radius [m] (0 < inner < h), unused otherwise. Throws std::runtime_error if no wall stress up
    /// to 1e12 Pa carries Q.
    DevelopedProfile(const rheology::ViscosityLaw &law, Channel channel, double h, double flow_rate, double inner = 0.);

    /// Velocity along the channel [m/s] at s: the distance from the midplane or the axis (slit, pipe;
    /// 0 at |s| >= h) or the radius (annulus; 0 outside [inner, h]).
    double velocity(double s) const;

    /// Slit and pipe: the wall shear stress [Pa]. Annulus: the wall stress averaged over both walls'
    /// perimeters, G (b - a) / 2 by the force balance.
    double wall_stress() const { return tau_w; }

    /// Wall shear stress magnitudes on the inner and outer walls [Pa] (both wall_stress() but for an annulus).
    double inner_wall_stress() const { return tau_inner; }
    double outer_wall_stress() const { return tau_outer; }

    /// -dp/dz [Pa/m] of the developed flow (sign of Q).
    double pressure_gradient() const { return gradient; }

    /// Radius of zero shear stress (annulus; where the velocity peaks) [m]; 0 otherwise and at Q = 0.
    double zero_stress_radius() const { return zero_stress; }

  private:
    Channel             channel;
    double              h, a, tau_w = 0., tau_inner = 0., tau_outer = 0., gradient = 0., zero_stress = 0.;
    std::vector<double> u; ///< on N + 1 equally spaced points over [0, h] (slit, pipe) or [a, h] (annulus)
  };
} // namespace lentus::flow
