// How accurate a design number is: its mesh error from the sequence of meshes a run solved on
// (Richardson extrapolation and the Grid Convergence Index) and, for a regularized yield-stress
// fluid, its regularization error from a second solve at a larger Papanastasiou exponent.
// Plain C++: the estimates work on numbers, not on fields.
#pragma once

#include "solver/report/design_number.h"

#include <cstdint>
#include <optional>
#include <string>
#include <vector>

namespace lentus::report
{
  /// The design numbers of one converged mesh of a run.
  struct MeshNumbers
  {
    std::uint64_t cells = 0, unknowns = 0;
    DesignNumbers numbers;
  };

  /// One number on one mesh: the cell count sets the mesh size h ~ cells^(-1/2) in 2D.
  struct MeshValue
  {
    double cells;
    double value;
  };

  struct MeshErrorEstimate
  {
    double      error;        ///< |value on the finest mesh - its limit|, estimated; same unit
    double      extrapolated; ///< the estimated limit h -> 0
    double      order;        ///< the order of convergence used
    bool        observed;     ///< order observed on three meshes (else the theoretical order)
    std::string method;       ///< in words, for summary.json
  };

  /// The formal order of Taylor-Hood Q2-Q1 (velocity in H1, pressure in L2: O(h^2)), used when the
  /// observed order cannot be trusted.
  constexpr double theoretical_order = 2.;

  /// The mesh error of the finest value of `sequence` (coarse to fine). Three meshes or more: the
  /// last three, the apparent order p by the fixed-point iteration of Celik et al. (2008, J. Fluids
  /// Eng. 130:078001, eqs. 3-5), extrapolation by their eq. 6 and the fine-grid convergence index
  /// GCI = 1.25 |phi_1 - phi_2| / (r^p - 1) (Roache 1994, J. Fluids Eng. 116:405; Celik et al. eq. 8).
  /// With two meshes, oscillating values or an order outside [0.5, 4]: the theoretical order and a
  /// safety factor of 3 (Roache 1994), from three meshes the larger of the last two steps' bars.
  /// Changes below 1e-10 of the values count as none; unchanged values: error 0. One mesh: nothing.
  std::optional<MeshErrorEstimate> estimate_mesh_error(const std::vector<MeshValue> &sequence);

  struct RegularizationEstimate
  {
    double      error;        ///< |value at M - its limit M -> infinity|, estimated
    double      extrapolated; ///< the estimated ideal-fluid value
    std::string method;
  };

  /// The regularization error of `at_m` from a second solve at `factor` x M giving `at_larger_m`. The
  /// limit is extrapolated assuming the error falls as 1/M; the error bar assumes only that it
  /// falls as 1/sqrt(M), i.e. |at_m - limit| <= |at_larger_m - at_m| sqrt(k) / (sqrt(k) - 1), so that
  /// it still covers a slower approach (twice the change for k = 4).
  RegularizationEstimate estimate_regularization_error(double at_m, double at_larger_m, double factor);

  /// Fills every number's accuracy in `numbers` (those of the final mesh): mesh errors from
  /// `meshes` (coarse to fine, the last the final mesh) and, if given, regularization errors from
  /// `at_larger_m`, the same numbers at `factor` x M on the final mesh.
  void estimate_accuracy(DesignNumbers &numbers, const std::vector<MeshNumbers> &meshes,
                         const DesignNumbers *at_larger_m, double factor);

  /// The number's error bar: mesh and regularization errors added (nothing if neither is known).
  std::optional<double> total_error(const Accuracy &accuracy);

  /// "1.234 +/- 0.012" style text: the value and its error bar, or the value alone.
  std::string value_with_error(const DesignNumber &number);
} // namespace lentus::report
