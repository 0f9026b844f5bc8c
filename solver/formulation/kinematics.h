// Everything that differs between planar, axisymmetric and swirling flow.
//
// A velocity is written as a 3-vector U and its gradient as a 3x3 tensor L
// (L_ij = d u_i / d x_j in physical components), in the slots (0, 1, 2) =
//   planar:            (x, out-of-plane, y)          U = (u_x, 0, u_y)
//   axisymmetric:      (r, theta, z)                 U = (u_r, 0, u_z)
//   with swirl:        (r, theta, z)                 U = (u_r, u_theta, u_z)
// with, in cylindrical components (no theta dependence),
//   L = [[d_r u_r, -u_theta/r, d_z u_r], [d_r u_theta, u_r/r, d_z u_theta], [d_r u_z, 0, d_z u_z]].
// Then D = sym(L), div u = tr L, gamma_dot = sqrt(2 D:D), and the convective
// term (u . grad) u = L U carries the centrifugal (-u_theta^2/r) and Coriolis
// (u_r u_theta / r) terms. The weak form is written once with U, L and the
// volume weight w (1, or r; the factor 2 pi is applied in reports).
#pragma once

#include <deal.II/base/point.h>
#include <deal.II/base/tensor.h>

#include <cmath>
#include <string>

namespace lentus
{
  enum class FormulationKind
  {
    planar,
    axisymmetric,
    swirl
  };

  /// Velocity components on the 2D mesh: 2, 2, 3.
  inline unsigned int n_velocity_components(const FormulationKind kind)
  {
    return kind == FormulationKind::swirl ? 3 : 2;
  }

  inline bool is_axisymmetric(const FormulationKind kind)
  {
    return kind != FormulationKind::planar;
  }

  /// Volume weight w: 1 (planar, per unit depth) or r (axisymmetric, per radian).
  inline double volume_weight(const FormulationKind kind, const dealii::Point<2> &x)
  {
    return kind == FormulationKind::planar ? 1. : x[0];
  }

  /// U and L of one velocity field (or of one shape function) at one point.
  struct Kinematics
  {
    dealii::Tensor<1, 3> U;
    dealii::Tensor<2, 3> L;
  };

  /// U and L from the mesh components of the velocity and their gradients.
  /// `values[c]`, `gradients[c]`: component c of the unknown (c < n_velocity_components).
  inline Kinematics kinematics(const FormulationKind kind,
                               const dealii::Point<2> &x,
                               const double *values,
                               const dealii::Tensor<1, 2> *gradients)
  {
    Kinematics k;
    // Mesh component -> slot: (0, 1) -> (0, 2) without swirl; (0, 1, 2) -> (0, 2, 1) with
    // swirl, whose unknowns are ordered (u_r, u_z, u_theta).
    const unsigned int slot_of[3] = {0, 2, 1};
    const unsigned int n          = n_velocity_components(kind);
    for (unsigned int c = 0; c < n; ++c)
      {
        const unsigned int i = slot_of[c];
        k.U[i]               = values[c];
        k.L[i][0]            = gradients[c][0];
        k.L[i][2]            = gradients[c][1];
      }
    if (is_axisymmetric(kind))
      {
        const double r = x[0];
        k.L[1][1]      = k.U[0] / r;  // hoop strain rate u_r / r
        k.L[0][1]      = -k.U[1] / r; // -u_theta / r (swirl only; 0 otherwise)
      }
    return k;
  }

  /// D = sym(L).
  inline dealii::Tensor<2, 3> strain_rate(const dealii::Tensor<2, 3> &L)
  {
    return 0.5 * (L + dealii::transpose(L));
  }

  /// Double contraction A:B.
  inline double contract(const dealii::Tensor<2, 3> &A, const dealii::Tensor<2, 3> &B)
  {
    return dealii::scalar_product(A, B);
  }

  /// Shear rate gamma_dot = sqrt(2 D:D) of the velocity gradient L.
  inline double shear_rate(const dealii::Tensor<2, 3> &L)
  {
    const dealii::Tensor<2, 3> D = strain_rate(L);
    return std::sqrt(2. * contract(D, D));
  }
} // namespace lentus
