// What a report needs to know of the formulation, asked instead of branched on:
// totals per metre of depth (planar) or over the full circle (axisymmetric), the
// units that follow, and the arm of a reaction force about the axis of rotation.
#pragma once

#include "solver/formulation/kinematics.h"

#include <string>

namespace lentus
{
  /// "x y", "r z" or "r z theta": the velocity components solved for.
  const char *velocity_components(FormulationKind kind);

  class Formulation
  {
  public:
    explicit Formulation(const FormulationKind kind_) : kind(kind_) {}

    FormulationKind type() const { return kind; }
    bool            axisymmetric() const { return is_axisymmetric(kind); }
    bool            swirl() const { return kind == FormulationKind::swirl; }

    /// Integrals over the mesh (weighted by r when axisymmetric, i.e. per radian) times this give
    /// totals: 2 pi (axisymmetric) or 1 (planar: per metre of depth).
    double total_factor() const { return axisymmetric() ? 2. * M_PI : 1.; }

    /// Appended to the unit of an extensive total: "" (axisymmetric) or "/m" (per metre of depth).
    std::string per_depth() const { return axisymmetric() ? "" : "/m"; }
    /// Unit of a flow rate: "m^3/s" or "m^2/s" (per metre of depth).
    std::string flow_rate_unit() const { return axisymmetric() ? "m^3/s" : "m^2/s"; }

    /// Wall roles carry a torque about the axis (swirl) or the origin (planar); none without swirl.
    bool has_torque() const { return kind != FormulationKind::axisymmetric; }

    /// Arm of a reaction in mesh component `component` at x for the torque about the axis of
    /// rotation (planar: about the origin, x R_y - y R_x; swirl: r R_theta; otherwise 0).
    double torque_arm(const unsigned int component, const dealii::Point<2> &x) const
    {
      if (kind == FormulationKind::planar)
        return component == 0 ? -x[1] : component == 1 ? x[0] : 0.;
      return kind == FormulationKind::swirl && component == 2 ? x[0] : 0.;
    }

    /// The weight of volume integrals: 1 or r.
    double volume_weight(const dealii::Point<2> &x) const { return lentus::volume_weight(kind, x); }

  private:
    FormulationKind kind;
  };
} // namespace lentus
