// How each viscosity law of the registry is fitted: which keys are fitted,
// which are held fixed (and at what value, for the fit and for a case file),
// and the automatic starting guesses. A law without a recipe is listed by
// `lentus fit` as not fitted.
#pragma once

#include "rheology/fit/flow_curve_data.h"
#include "rheology/parameter_table.h"

#include <string>
#include <vector>

namespace lentus::rheology::fit
{
  struct Recipe
  {
    std::string              law;
    std::vector<std::string> fitted; ///< keys fitted (all positive: fitted as their logarithm)

    /// Values of the other keys during the fit, given the lowest shear rate [1/s] of the data.
    ParameterValues (*fit_fixed)(double lowest_rate);

    /// Adds the keys held fixed to `values` (which holds the fitted ones) for a case
    /// file, with a note on each; `lowest_rate` is at the reference temperature.
    void (*case_fixed)(double lowest_rate, ParameterValues &values, std::vector<std::string> &notes);

    /// Starting guesses from points sorted by shear rate (several: the best fit wins).
    std::vector<ParameterValues> (*starts)(const std::vector<Measurement> &sorted_points);
  };

  /// The recipe of `law`, nullptr if there is none.
  const Recipe *find_recipe(const std::string &law);
} // namespace lentus::rheology::fit
