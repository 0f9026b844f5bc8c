// Fitting viscosity laws of the registry to rheometer data by nonlinear least
// squares on log shear stress (relative errors), with GSL's trust-region
// Levenberg-Marquardt solver. Positive parameters are fitted as their
// logarithm, which keeps them positive (the positivity bound) and makes the
// 95% confidence intervals multiplicative. Data at several temperatures are
// fitted jointly by time-temperature superposition:
//   tau(gamma_dot, T) = tau_ref(a_T gamma_dot),
// the form rheology/shift/temperature_shift.h uses for eta.
#pragma once

#include "rheology/fit/flow_curve_data.h"
#include "rheology/parameter_table.h"
#include "rheology/shift/temperature_shift.h"
#include "rheology/viscosity_law.h"

#include <limits>
#include <memory>
#include <string>
#include <vector>

namespace lentus::rheology::fit
{
  /// How data at several temperatures are tied together.
  enum class ShiftModel
  {
    arrhenius, ///< a_T = exp(E_a/R (1/T - 1/T_ref)): one parameter
    wlf,       ///< log10 a_T = -C1 (T - T_ref)/(C2 + T - T_ref): two parameters, 3+ temperatures
    exponential, ///< a_T = exp(-beta (T - T_ref)): one parameter
    none       ///< temperature ignored
  };

  struct FitOptions
  {
    std::vector<std::string> laws;  ///< laws to fit; empty: every law with a fit recipe
    ShiftModel shift = ShiftModel::arrhenius;
    double     reference_temperature = std::numeric_limits<double>::quiet_NaN(); ///< NaN: middle temperature
    double     confidence            = 0.95;
  };

  /// One fitted parameter: estimate, standard error and confidence interval.
  struct Estimate
  {
    std::string path;   ///< case-file path, e.g. "Rheology/Cross/Time constant"
    std::string key;    ///< e.g. "Time constant"
    std::string symbol; ///< e.g. "lambda"
    std::string unit;   ///< SI unit
    double      value          = 0.;
    double      standard_error = 0.; ///< linearized (delta method)
    double      lower = 0., upper = 0.;
    bool        log_scale = true; ///< fitted as log(value); the interval is multiplicative
    double      scale     = 1.;   ///< linear parameters: value = scale * fit variable
  };

  /// The fit of one law.
  struct LawFit
  {
    std::string law;
    bool        fitted = false;
    std::string failure; ///< why there is no fit (fitted == false)

    std::string shift_name = "none"; ///< "none", "Arrhenius", "WLF"
    double      reference_temperature = std::numeric_limits<double>::quiet_NaN();

    std::vector<Estimate>    estimates;   ///< law parameters, then shift parameters
    ParameterValues          law_values;  ///< every key of the law for a case file (fitted and fixed)
    ParameterValues          shift_values; ///< keys of the shift law for a case file
    std::vector<std::string> fixed_notes; ///< how the fixed keys were chosen
    std::vector<Estimate>    shift_factors; ///< a_T per temperature, each fitted freely

    std::vector<double> theta;      ///< fit variables at the optimum
    std::vector<double> covariance; ///< of theta, p x p row-major, scaled by s^2
    std::vector<double> correlation;

    std::size_t n_points = 0, n_parameters = 0;
    double      ssr = 0.;     ///< sum of squared log residuals
    double      rms_log = 0.; ///< sqrt(ssr / n): about the relative RMS error
    double      aic = 0., bic = 0.;
    double      akaike_weight = 0.;
    int         iterations = 0;
    std::vector<std::string> warnings;

    std::shared_ptr<const ViscosityLaw> model; ///< the fitted law at T_ref (case-file values)
    TemperatureShift                    shift;

    /// Model shear stress [Pa] at gamma_dot [1/s] and T [K] (T ignored without shift).
    double stress(double gamma_dot, double temperature) const;
  };

  /// Laws of the registry that have a fit recipe, in registry order.
  std::vector<std::string> fittable_laws();

  /// Fits one law. Throws DataError when the data cannot determine it (too few
  /// points, WLF with fewer than three temperatures) and InvalidParameter for an
  /// unknown law name.
  LawFit fit_law(const FlowCurveData &data, const std::string &law, const FitOptions &options);

  /// Fits the laws of `options` (or all); ranks by AIC (best first; failures last)
  /// and fills the Akaike weights. Laws with as many parameters as points or more are
  /// reported as not fitted; throws DataError if no law can be fitted.
  std::vector<LawFit> fit_laws(const FlowCurveData &data, const FitOptions &options);

  /// Student-t quantile for a two-sided `confidence` interval with `dof` degrees of freedom.
  double t_quantile(double confidence, std::size_t dof);
} // namespace lentus::rheology::fit
