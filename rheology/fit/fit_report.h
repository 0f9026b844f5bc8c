// What `lentus fit` prints and writes: a text report with the ranking, the
// fitted fluid as a ready-to-paste case-file section, a JSON summary and the
// table the plotting script draws.
#pragma once

#include "rheology/fit/flow_curve_data.h"
#include "rheology/fit/law_fit.h"

#include <string>
#include <vector>

namespace lentus::rheology::fit
{
  /// The caution every report carries.
  extern const char *const caution;

  /// Ranking, parameters with standard errors and confidence intervals, warnings.
  /// `fits` as returned by fit_laws (ranked).
  std::string text_report(const FlowCurveData &data, const std::vector<LawFit> &fits, const FitOptions &options);

  /// `subsection Rheology ... end` with the keys of the case files, for `fit`
  /// (which must be fitted); comments give the intervals and the chosen values.
  std::string case_section(const LawFit &fit, const std::string &source);

  /// Everything in machine-readable form.
  std::string json_report(const FlowCurveData &data, const std::vector<LawFit> &fits, const FitOptions &options);

  /// CSV for scripts/plot_fit.py: the data with the best law's residuals and the
  /// curves of up to `curves` best laws, per temperature.
  std::string plot_table(const FlowCurveData &data, const std::vector<LawFit> &fits, std::size_t curves);
} // namespace lentus::rheology::fit
