#include "rheology/fit/law_fit.h"

#include "rheology/fit/fit_recipes.h"
#include "rheology/law_registry.h"

#include <gsl/gsl_blas.h>
#include <gsl/gsl_cdf.h>
#include <gsl/gsl_errno.h>
#include <gsl/gsl_multifit_nlinear.h>

#include <algorithm>
#include <cmath>
#include <functional>
#include <sstream>

namespace lentus::rheology::fit
{
  namespace
  {
    /// Residual given to the solver where the model cannot be evaluated (a
    /// parameter combination the law rejects): large, so the step is refused.
    constexpr double penalty = 30.;

    // ------------------------------------------------------------------
    // The least-squares driver: GSL's trust-region solver with the
    // Levenberg-Marquardt subproblem and a central-difference Jacobian.
    // ------------------------------------------------------------------
    struct Problem
    {
      std::size_t n = 0, p = 0;
      std::function<void(const std::vector<double> &, std::vector<double> &)> residuals;
    };

    struct Solution
    {
      std::vector<double> theta;
      std::vector<double> unscaled_covariance; ///< (J^T J)^-1, p x p
      double              ssr = HUGE_VAL;
      int                 status     = GSL_FAILURE;
      int                 iterations = 0;
    };

    int residual_callback(const gsl_vector *x, void *parameters, gsl_vector *f)
    {
      const Problem      &problem = *static_cast<const Problem *>(parameters);
      std::vector<double> theta(problem.p), residuals(problem.n);
      for (std::size_t j = 0; j < problem.p; ++j)
        theta[j] = gsl_vector_get(x, j);
      problem.residuals(theta, residuals);
      for (std::size_t i = 0; i < problem.n; ++i)
        gsl_vector_set(f, i, std::isfinite(residuals[i]) ? residuals[i] : penalty);
      return GSL_SUCCESS;
    }

    Solution least_squares(const Problem &problem, std::vector<double> start)
    {
      gsl_set_error_handler_off(); // statuses are returned and checked, never abort
      gsl_multifit_nlinear_parameters parameters = gsl_multifit_nlinear_default_parameters();
      parameters.trs    = gsl_multifit_nlinear_trs_lm;
      parameters.scale  = gsl_multifit_nlinear_scale_more;
      parameters.fdtype = GSL_MULTIFIT_NLINEAR_CTRDIFF;
      gsl_multifit_nlinear_workspace *workspace =
        gsl_multifit_nlinear_alloc(gsl_multifit_nlinear_trust, &parameters, problem.n, problem.p);
      gsl_multifit_nlinear_fdf fdf;
      fdf.f      = residual_callback;
      fdf.df     = nullptr; // finite differences
      fdf.fvv    = nullptr;
      fdf.n      = problem.n;
      fdf.p      = problem.p;
      fdf.params = const_cast<Problem *>(&problem);

      Solution         solution;
      gsl_vector_view  x0 = gsl_vector_view_array(start.data(), problem.p);
      int              info = 0;
      solution.status       = gsl_multifit_nlinear_init(&x0.vector, &fdf, workspace);
      if (solution.status == GSL_SUCCESS)
        solution.status = gsl_multifit_nlinear_driver(500, 1e-10, 1e-10, 0., nullptr, nullptr, &info, workspace);

      const gsl_vector *x = gsl_multifit_nlinear_position(workspace);
      const gsl_vector *f = gsl_multifit_nlinear_residual(workspace);
      solution.theta.resize(problem.p);
      for (std::size_t j = 0; j < problem.p; ++j)
        solution.theta[j] = gsl_vector_get(x, j);
      gsl_blas_ddot(f, f, &solution.ssr);
      solution.iterations = static_cast<int>(gsl_multifit_nlinear_niter(workspace));

      gsl_matrix *covariance = gsl_matrix_alloc(problem.p, problem.p);
      gsl_multifit_nlinear_covar(gsl_multifit_nlinear_jac(workspace), 0., covariance);
      solution.unscaled_covariance.assign(covariance->data, covariance->data + problem.p * problem.p);
      gsl_matrix_free(covariance);
      gsl_multifit_nlinear_free(workspace);
      if (!std::isfinite(solution.ssr))
        solution.ssr = HUGE_VAL;
      return solution;
    }

    // ------------------------------------------------------------------
    // The model: law parameters (some fitted, some fixed) and a shift.
    // ------------------------------------------------------------------
    enum class ShiftKind
    {
      none,
      free,
      arrhenius,
      wlf,
      exponential
    };

    /// Arrhenius activation energy is fitted as E_a / this [J/mol].
    constexpr double energy_scale = 1e4;
    /// The exponential shift's temperature sensitivity is fitted as beta / this [1/K].
    constexpr double sensitivity_scale = 1e-2;

    class Model
    {
    public:
      Model(const LawInfo &info_, const Recipe &recipe, const ParameterValues &fixed)
        : info(info_)
      {
        law_template.resize(info.parameters.size());
        for (std::size_t i = 0; i < info.parameters.size(); ++i)
          {
            const ParameterInfo &parameter = info.parameters[i];
            const auto           given     = fixed.find(parameter.key);
            law_template[i] = given != fixed.end() ? given->second : parameter.default_value;
            if (std::find(recipe.fitted.begin(), recipe.fitted.end(), parameter.key) != recipe.fitted.end())
              fitted_index.push_back(i);
          }
      }

      const LawInfo            &info;
      std::vector<double>       law_template;
      std::vector<std::size_t>  fitted_index;
      ShiftKind                 kind = ShiftKind::none;
      double                    reference_temperature = 0.;
      std::vector<double>       free_temperatures;
      const std::vector<Measurement> *points = nullptr;

      std::size_t n_law() const { return fitted_index.size(); }
      std::size_t n_shift() const
      {
        switch (kind)
          {
            case ShiftKind::none: return 0;
            case ShiftKind::free: return free_temperatures.size();
            case ShiftKind::arrhenius: return 1;
            case ShiftKind::wlf: return 2;
            case ShiftKind::exponential: return 1;
          }
        return 0;
      }
      std::size_t n_parameters() const { return n_law() + n_shift(); }

      std::vector<double> law_values(const std::vector<double> &theta) const
      {
        std::vector<double> values = law_template;
        for (std::size_t j = 0; j < fitted_index.size(); ++j)
          values[fitted_index[j]] = std::exp(theta[j]);
        return values;
      }

      /// ln a_T; NaN where the shift is undefined (WLF singularity).
      double log_shift(const std::vector<double> &theta, const double temperature) const
      {
        const std::size_t k = n_law();
        switch (kind)
          {
            case ShiftKind::none:
              return 0.;
            case ShiftKind::free:
              {
                const auto found = std::find(free_temperatures.begin(), free_temperatures.end(), temperature);
                return found == free_temperatures.end() ? 0. : theta[k + (found - free_temperatures.begin())];
              }
            case ShiftKind::arrhenius:
              // ln a_T = E_a/R (1/T - 1/T_ref)
              return theta[k] * energy_scale / gas_constant * (1. / temperature - 1. / reference_temperature);
            case ShiftKind::exponential:
              // ln a_T = -beta (T - T_ref)
              return -theta[k] * sensitivity_scale * (temperature - reference_temperature);
            case ShiftKind::wlf:
              {
                // ln a_T = -ln(10) C1 (T - T_ref) / (C2 + T - T_ref)
                const double c1 = std::exp(theta[k]), c2 = std::exp(theta[k + 1]);
                const double dt = temperature - reference_temperature;
                if (!(c2 + dt > 0.))
                  return std::numeric_limits<double>::quiet_NaN();
                return -std::log(10.) * c1 * dt / (c2 + dt);
              }
          }
        return 0.;
      }

      void residuals(const std::vector<double> &theta, std::vector<double> &r) const
      {
        std::unique_ptr<ViscosityLaw> law;
        try
          {
            law = info.create(law_values(theta));
          }
        catch (const std::exception &)
          {
            std::fill(r.begin(), r.end(), penalty);
            return;
          }
        for (std::size_t i = 0; i < points->size(); ++i)
          {
            const Measurement &point = (*points)[i];
            const double       shift = log_shift(theta, point.temperature);
            const double       model = law->stress(std::exp(shift) * point.shear_rate);
            r[i] = std::isfinite(shift) && model > 0. && std::isfinite(model)
                     ? std::log(model) - std::log(point.shear_stress)
                     : penalty;
          }
      }

      Solution solve(const std::vector<double> &start) const
      {
        Problem problem;
        problem.n         = points->size();
        problem.p         = n_parameters();
        problem.residuals = [this](const std::vector<double> &theta, std::vector<double> &r) { residuals(theta, r); };
        return least_squares(problem, start);
      }
    };

    std::vector<double> log_of_fitted(const Model &model, const ParameterValues &values)
    {
      std::vector<double> theta;
      for (const std::size_t index : model.fitted_index)
        theta.push_back(std::log(values.at(model.info.parameters[index].key)));
      return theta;
    }

    /// Least-squares line y = intercept + slope x.
    std::pair<double, double> line_fit(const std::vector<double> &x, const std::vector<double> &y)
    {
      const double n  = static_cast<double>(x.size());
      double       sx = 0., sy = 0., sxx = 0., sxy = 0.;
      for (std::size_t i = 0; i < x.size(); ++i)
        {
          sx += x[i];
          sy += y[i];
          sxx += x[i] * x[i];
          sxy += x[i] * y[i];
        }
      const double denominator = n * sxx - sx * sx;
      const double slope       = denominator != 0. ? (n * sxy - sx * sy) / denominator : 0.;
      return {(sy - slope * sx) / n, slope};
    }

    /// Four significant digits, for messages.
    std::string short_number(const double value)
    {
      std::ostringstream text;
      text.precision(4);
      text << value;
      return text.str();
    }

    std::string format_percent(const double fraction)
    {
      std::ostringstream text;
      text.precision(2);
      text << 100. * fraction << "%";
      return text.str();
    }

    /// The lowest shear rate brought to the reference temperature, a_T gamma_dot.
    double lowest_reduced_rate(const LawFit &fit, const std::vector<Measurement> &points)
    {
      double lowest = HUGE_VAL;
      for (const Measurement &point : points)
        {
          const double a_T = fit.shift.kind() == TemperatureShift::Kind::none ? 1. : fit.shift.factor(point.temperature);
          lowest           = std::min(lowest, a_T * point.shear_rate);
        }
      return lowest;
    }

    const Estimate *find_estimate(const LawFit &fit, const std::string &key)
    {
      for (const Estimate &estimate : fit.estimates)
        if (estimate.key == key)
          return &estimate;
      return nullptr;
    }

    /// Warnings about what the data cannot pin down.
    void add_warnings(LawFit &fit, const std::vector<Measurement> &points, const Solution &solution)
    {
      if (solution.status != GSL_SUCCESS)
        fit.warnings.push_back(std::string("the solver stopped before its convergence test was met (") +
                               gsl_strerror(solution.status) + " after " + std::to_string(solution.iterations) +
                               " iterations); treat the estimates with care");

      for (const Estimate &estimate : fit.estimates)
        {
          if (!(estimate.standard_error > 0.))
            {
              fit.warnings.push_back(estimate.key + " is not determined by the data: the fit does not depend on it "
                                                    "near the optimum (its interval is meaningless)");
              continue;
            }
          const bool poor = estimate.log_scale ? !(estimate.upper < 10. * estimate.lower)
                                               : !(estimate.standard_error < 0.5 * std::abs(estimate.value));
          if (poor)
            fit.warnings.push_back(estimate.key + " is poorly determined: its confidence interval is [" +
                                   short_number(estimate.lower) + ", " + short_number(estimate.upper) + "] " +
                                   estimate.unit);
        }

      const std::size_t p = fit.estimates.size();
      for (std::size_t i = 0; i < p; ++i)
        for (std::size_t j = i + 1; j < p; ++j)
          {
            const double r = fit.correlation[i * p + j];
            if (std::abs(r) > 0.95)
              fit.warnings.push_back(fit.estimates[i].key + " and " + fit.estimates[j].key +
                                     " are strongly correlated (r = " + short_number(std::round(r * 1000.) / 1000.) +
                                     "): the data pin a combination of them rather than each one");
          }

      if (!fit.model)
        return;
      const double lowest = lowest_reduced_rate(fit, points);

      // Zero-shear viscosity: needs data on the low-shear plateau.
      if (const Estimate *eta_0 = find_estimate(fit, "Zero-shear viscosity"))
        {
          const double ratio = fit.model->evaluate(lowest).value / eta_0->value;
          if (ratio < 0.9)
            {
              std::string advice;
              if (const Estimate *lambda = find_estimate(fit, "Time constant"))
                advice = "; measure down to about " + short_number(0.1 / lambda->value) + " 1/s";
              fit.warnings.push_back("no low-shear plateau in the data: at the lowest shear rate (" +
                                     short_number(lowest) + " 1/s" +
                                     (fit.shift_name != "none" ? " at T_ref" : "") + ") the fitted viscosity is " +
                                     format_percent(ratio) +
                                     " of the Zero-shear viscosity, which is therefore an extrapolation" + advice);
            }
        }

      // Yield stress: needs data where it carries a good part of the stress.
      if (const Estimate *tau_y = find_estimate(fit, "Yield stress"))
        {
          const double share = tau_y->value / fit.model->stress(lowest);
          if (share < 0.5)
            {
              // Shear rate where the viscous part is a tenth of the yield stress (bisection in log rate).
              double low = std::log(lowest) - 30., high = std::log(lowest);
              for (int k = 0; k < 100; ++k)
                {
                  const double middle = 0.5 * (low + high);
                  (fit.model->stress(std::exp(middle)) - tau_y->value > 0.1 * tau_y->value ? high : low) = middle;
                }
              fit.warnings.push_back("lowest shear rate too high to see a yield stress: at " + short_number(lowest) +
                                     " 1/s the fitted yield stress is only " + format_percent(share) +
                                     " of the stress; measure down to about " + short_number(std::exp(high)) +
                                     " 1/s");
            }
        }
    }

    /// Fills estimates, statistics, case values and warnings from a solution.
    void describe(LawFit &fit, const Model &model, const Recipe &recipe, const Solution &solution,
                  const std::vector<Measurement> &points, const FitOptions &options)
    {
      const std::size_t n = points.size(), p = model.n_parameters();
      fit.n_points     = n;
      fit.n_parameters = p;
      fit.theta        = solution.theta;
      fit.ssr          = solution.ssr;
      fit.iterations   = solution.iterations;
      const double variance = solution.ssr / static_cast<double>(n - p); // s^2
      fit.covariance.resize(p * p);
      for (std::size_t k = 0; k < p * p; ++k)
        fit.covariance[k] = variance * solution.unscaled_covariance[k];
      fit.correlation.resize(p * p);
      for (std::size_t i = 0; i < p; ++i)
        for (std::size_t j = 0; j < p; ++j)
          {
            const double denominator = std::sqrt(fit.covariance[i * p + i] * fit.covariance[j * p + j]);
            fit.correlation[i * p + j] = denominator > 0. ? fit.covariance[i * p + j] / denominator : 0.;
          }

      const double t = t_quantile(options.confidence, n - p);
      auto make_estimate = [&](const std::size_t j, Estimate estimate) {
        const double theta = solution.theta[j], error = std::sqrt(std::max(fit.covariance[j * p + j], 0.));
        if (estimate.log_scale)
          {
            // Delta method for the standard error; the interval is exact under the log transform.
            estimate.value          = std::exp(theta);
            estimate.standard_error = estimate.value * error;
            estimate.lower          = std::exp(theta - t * error);
            estimate.upper          = std::exp(theta + t * error);
          }
        else
          {
            estimate.value          = estimate.scale * theta;
            estimate.standard_error = estimate.scale * error;
            estimate.lower          = estimate.value - t * estimate.standard_error;
            estimate.upper          = estimate.value + t * estimate.standard_error;
          }
        return estimate;
      };

      for (std::size_t j = 0; j < model.n_law(); ++j)
        {
          const ParameterInfo &parameter = model.info.parameters[model.fitted_index[j]];
          fit.estimates.push_back(make_estimate(
            j, {"Rheology/" + fit.law + "/" + parameter.key, parameter.key, parameter.symbol, parameter.unit}));
          fit.law_values[parameter.key] = fit.estimates.back().value;
        }
      const std::size_t k = model.n_law();
      if (model.kind == ShiftKind::arrhenius)
        {
          Estimate energy{"Rheology/Arrhenius/Activation energy", "Activation energy", "E_a", "J/mol"};
          energy.log_scale = false;
          energy.scale     = energy_scale;
          fit.estimates.push_back(make_estimate(k, energy));
        }
      if (model.kind == ShiftKind::exponential)
        {
          Estimate sensitivity{"Rheology/Exponential/Temperature sensitivity", "Temperature sensitivity", "beta",
                               "1/K"};
          sensitivity.log_scale = false;
          sensitivity.scale     = sensitivity_scale;
          fit.estimates.push_back(make_estimate(k, sensitivity));
        }
      if (model.kind == ShiftKind::wlf)
        {
          fit.estimates.push_back(make_estimate(k, {"Rheology/WLF/C1", "C1", "C1", "-"}));
          fit.estimates.push_back(make_estimate(k + 1, {"Rheology/WLF/C2", "C2", "C2", "K"}));
        }

      // The shift of the case file.
      try
        {
          if (model.kind == ShiftKind::arrhenius)
            {
              fit.shift_name   = "Arrhenius";
              fit.shift_values = {{"Activation energy", fit.estimates[k].value},
                                  {"Reference temperature", model.reference_temperature}};
              fit.shift        = TemperatureShift::create("Arrhenius", fit.shift_values);
            }
          if (model.kind == ShiftKind::exponential)
            {
              fit.shift_name   = "Exponential";
              fit.shift_values = {{"Temperature sensitivity", fit.estimates[k].value},
                                  {"Reference temperature", model.reference_temperature}};
              fit.shift        = TemperatureShift::create("Exponential", fit.shift_values);
            }
          if (model.kind == ShiftKind::wlf)
            {
              fit.shift_name   = "WLF";
              fit.shift_values = {{"C1", fit.estimates[k].value},
                                  {"C2", fit.estimates[k + 1].value},
                                  {"Reference temperature", model.reference_temperature}};
              fit.shift        = TemperatureShift::create("WLF", fit.shift_values);
            }
        }
      catch (const InvalidParameter &error)
        {
          fit.warnings.push_back("the fitted temperature shift is not usable in a case file: " +
                                 std::string(error.what()));
          fit.shift_name = "none";
          fit.shift_values.clear();
          fit.shift = TemperatureShift();
        }

      // Keys held fixed, chosen for a case file from the data.
      double lowest = HUGE_VAL;
      for (const Measurement &point : points)
        lowest = std::min(lowest, std::exp(model.log_shift(solution.theta, point.temperature)) * point.shear_rate);
      recipe.case_fixed(lowest, fit.law_values, fit.fixed_notes);
      try
        {
          fit.model = model.info.create(resolve_parameters(model.info.parameters, fit.law_values, fit.law));
        }
      catch (const InvalidParameter &error)
        {
          fit.failure = "the fitted parameters are not accepted in a case file: " + std::string(error.what());
          return;
        }

      const double dn = static_cast<double>(n);
      const double k_aic = static_cast<double>(p + 1); // + the residual variance
      const double log_mean_square = std::log(std::max(solution.ssr / dn, 1e-300));
      fit.rms_log = std::sqrt(solution.ssr / dn);
      // Akaike 1974, IEEE Trans. Autom. Control 19:716; Schwarz 1978, Ann. Stat. 6:461
      // (Gaussian errors on log stress, additive constants dropped).
      fit.aic    = dn * log_mean_square + 2. * k_aic;
      fit.bic    = dn * log_mean_square + k_aic * std::log(dn);
      fit.fitted = true;
      add_warnings(fit, points, solution);
    }

    /// The best of several starts (lowest sum of squares).
    Solution best_of(const Model &model, const std::vector<std::vector<double>> &starts)
    {
      Solution best;
      for (const std::vector<double> &start : starts)
        {
          Solution candidate = model.solve(start);
          if (candidate.ssr < best.ssr)
            best = std::move(candidate);
        }
      return best;
    }

    std::vector<Measurement> sorted_by_rate(std::vector<Measurement> points)
    {
      std::sort(points.begin(), points.end(),
                [](const Measurement &a, const Measurement &b) { return a.shear_rate < b.shear_rate; });
      return points;
    }
    /// Throws DataError when the shift model needs more temperatures than the data have.
    void check_temperatures(const FlowCurveData &data, const FitOptions &options)
    {
      const std::size_t count = data.temperatures().size();
      if (options.shift == ShiftModel::wlf && count > 1 && count < 3)
        throw DataError(data.source, 0, "", "",
                        "the WLF shift has two constants and needs data at three temperatures or more; the file has " +
                          std::to_string(count),
                        "data at 3 or more temperatures, or the Arrhenius shift");
    }
  } // namespace

  double LawFit::stress(const double gamma_dot, const double temperature) const
  {
    const double a_T =
      shift.kind() == TemperatureShift::Kind::none || std::isnan(temperature) ? 1. : shift.factor(temperature);
    return model->stress(a_T * gamma_dot);
  }

  double t_quantile(const double confidence, const std::size_t dof)
  {
    return gsl_cdf_tdist_Pinv(1. - 0.5 * (1. - confidence), static_cast<double>(dof));
  }

  std::vector<std::string> fittable_laws()
  {
    std::vector<std::string> names;
    for (const std::string &name : registry().names())
      if (find_recipe(name))
        names.push_back(name);
    return names;
  }

  LawFit fit_law(const FlowCurveData &data, const std::string &law_name, const FitOptions &options)
  {
    const LawInfo &info = registry().find(law_name);
    LawFit         fit;
    fit.law             = law_name;
    const Recipe *recipe = find_recipe(law_name);
    if (!recipe)
      {
        fit.failure = "no fit recipe (starting guesses and fixed keys) in rheology/fit/fit_recipes.cc";
        return fit;
      }

    const std::vector<double> temperatures = data.temperatures();
    const bool multi = temperatures.size() > 1 && options.shift != ShiftModel::none;
    double     reference = std::numeric_limits<double>::quiet_NaN();
    if (multi)
      {
        reference = temperatures[temperatures.size() / 2];
        if (!std::isnan(options.reference_temperature))
          {
            if (std::find(temperatures.begin(), temperatures.end(), options.reference_temperature) ==
                temperatures.end())
              {
                std::string list;
                for (const double temperature : temperatures)
                  list += (list.empty() ? "" : ", ") + format_value(temperature);
                throw InvalidParameter("Reference temperature", format_value(options.reference_temperature),
                                       "not one of the temperatures measured", "one of " + list + " [K]");
              }
            reference = options.reference_temperature;
          }
      }
    fit.reference_temperature = reference;
    check_temperatures(data, options);

    const std::size_t n_law   = recipe->fitted.size();
    const std::size_t n_shift = multi ? (options.shift == ShiftModel::wlf ? 2 : 1) : 0;
    const std::size_t p       = n_law + n_shift;
    if (data.points.size() <= p)
      throw DataError(data.source, 0, "", "",
                      std::to_string(data.points.size()) + " data points cannot determine the " + std::to_string(p) +
                        " parameters of " + law_name + (multi ? " with its temperature shift" : "") +
                        " and their errors",
                      "at least " + std::to_string(p + 1) + " points (better several per parameter)");

    // Step 1: the law alone on the data at the reference temperature (or all data).
    std::vector<Measurement> reference_points;
    for (const Measurement &point : data.points)
      if (!multi || point.temperature == reference)
        reference_points.push_back(point);
    if (reference_points.size() <= n_law)
      reference_points = data.points;
    reference_points = sorted_by_rate(reference_points);

    double lowest_rate = HUGE_VAL;
    for (const Measurement &point : data.points)
      lowest_rate = std::min(lowest_rate, point.shear_rate);
    Model model(info, *recipe, recipe->fit_fixed(lowest_rate));
    model.points = &reference_points;
    std::vector<std::vector<double>> starts;
    for (const ParameterValues &start : recipe->starts(reference_points))
      starts.push_back(log_of_fitted(model, start));
    Solution solution = best_of(model, starts);

    const std::vector<Measurement> &all_points = data.points;
    if (multi)
      {
        // Step 2: a free shift factor per temperature, each first placed by a scan of ln a_T
        // with the law held, then all fitted jointly with the law.
        model.points                = &all_points;
        model.kind                  = ShiftKind::free;
        model.reference_temperature = reference;
        for (const double temperature : temperatures)
          if (temperature != reference)
            model.free_temperatures.push_back(temperature);
        std::vector<double> theta = solution.theta;
        for (const double temperature : model.free_temperatures)
          {
            std::vector<Measurement> at_temperature;
            for (const Measurement &point : all_points)
              if (point.temperature == temperature)
                at_temperature.push_back(point);
            Model single            = model;
            single.kind             = ShiftKind::free;
            single.free_temperatures = {temperature};
            single.points           = &at_temperature;
            double best_shift = 0., best_ssr = HUGE_VAL;
            std::vector<double> trial = solution.theta;
            trial.push_back(0.);
            std::vector<double> r(at_temperature.size());
            for (double log_shift = -15.; log_shift <= 15.; log_shift += 0.05)
              {
                trial.back() = log_shift;
                single.residuals(trial, r);
                double ssr = 0.;
                for (const double value : r)
                  ssr += value * value;
                if (ssr < best_ssr)
                  {
                    best_ssr   = ssr;
                    best_shift = log_shift;
                  }
              }
            theta.push_back(best_shift);
          }
        const Solution free_solution = model.solve(theta);

        // Report the free shift factors with their intervals.
        {
          LawFit free_fit;
          free_fit.law = law_name;
          Model         free_model = model;
          const std::size_t n = all_points.size(), q = free_model.n_parameters();
          const double      variance = free_solution.ssr / static_cast<double>(n - q);
          const double      t        = t_quantile(options.confidence, n - q);
          for (const double temperature : temperatures)
            {
              Estimate factor{"", "Shift factor at " + format_short(temperature) + " K", "a_T", "-"};
              factor.value = factor.lower = factor.upper = 1.;
              if (temperature != reference)
                {
                  const std::size_t j =
                    n_law + (std::find(model.free_temperatures.begin(), model.free_temperatures.end(), temperature) -
                             model.free_temperatures.begin());
                  const double error    = std::sqrt(std::max(variance * free_solution.unscaled_covariance[j * q + j], 0.));
                  factor.value          = std::exp(free_solution.theta[j]);
                  factor.standard_error = factor.value * error;
                  factor.lower          = std::exp(free_solution.theta[j] - t * error);
                  factor.upper          = std::exp(free_solution.theta[j] + t * error);
                }
              fit.shift_factors.push_back(factor);
            }
        }

        // Step 3: the shift law, started from the free shift factors.
        std::vector<double> start(free_solution.theta.begin(), free_solution.theta.begin() + n_law);
        if (options.shift == ShiftModel::arrhenius)
          {
            // ln a_T = (E_a/R) x with x = 1/T - 1/T_ref: least squares through the origin.
            double sxy = 0., sxx = 0.;
            for (std::size_t i = 0; i < model.free_temperatures.size(); ++i)
              {
                const double x = 1. / model.free_temperatures[i] - 1. / reference;
                sxy += x * free_solution.theta[n_law + i];
                sxx += x * x;
              }
            start.push_back(sxy / sxx * gas_constant / energy_scale);
            model.kind = ShiftKind::arrhenius;
          }
        else if (options.shift == ShiftModel::exponential)
          {
            // ln a_T = -beta x with x = T - T_ref: least squares through the origin.
            double sxy = 0., sxx = 0.;
            for (std::size_t i = 0; i < model.free_temperatures.size(); ++i)
              {
                const double x = model.free_temperatures[i] - reference;
                sxy += x * free_solution.theta[n_law + i];
                sxx += x * x;
              }
            start.push_back(-sxy / sxx / sensitivity_scale);
            model.kind = ShiftKind::exponential;
          }
        else
          {
            // dT / log10 a_T = -C2/C1 - dT/C1 is a line in dT.
            std::vector<double> x, y;
            for (std::size_t i = 0; i < model.free_temperatures.size(); ++i)
              {
                const double dt = model.free_temperatures[i] - reference;
                x.push_back(dt);
                y.push_back(dt / (free_solution.theta[n_law + i] / std::log(10.)));
              }
            const auto [intercept, slope] = line_fit(x, y);
            double c1 = -1. / slope, c2 = -intercept * c1;
            if (!(c1 > 0. && c2 > 0. && std::isfinite(c1) && std::isfinite(c2)))
              {
                // Williams, Landel & Ferry 1955 "universal" values about T_g + 50 K (from memory).
                c1 = 8.86;
                c2 = 101.6;
              }
            start.push_back(std::log(c1));
            start.push_back(std::log(c2));
            model.kind = ShiftKind::wlf;
          }
        model.free_temperatures.clear();
        solution = model.solve(start);
      }
    else
      model.points = &all_points;

    // With one temperature the step-1 solution on all points is final; redo it on all
    // points when step 1 used a subset.
    if (!multi && reference_points.size() != all_points.size())
      solution = model.solve(solution.theta);

    if (!(solution.ssr < HUGE_VAL))
      {
        fit.failure = "the solver found no parameters where the law can be evaluated";
        return fit;
      }
    describe(fit, model, *recipe, solution, all_points, options);
    if (temperatures.size() > 1 && options.shift == ShiftModel::none)
      fit.warnings.push_back("the data hold " + std::to_string(temperatures.size()) +
                             " temperatures but no shift was fitted (--shift none): one curve through all of them");
    return fit;
  }

  std::vector<LawFit> fit_laws(const FlowCurveData &data, const FitOptions &options)
  {
    const bool               named = !options.laws.empty();
    const std::vector<std::string> names = named ? options.laws : fittable_laws();
    std::vector<LawFit>      fits;
    check_temperatures(data, options);
    std::size_t fewest_parameters = 0;
    std::string smallest_law;
    for (const std::string &name : names)
      {
        try
          {
            fits.push_back(fit_law(data, name, options));
          }
        catch (const DataError &error)
          {
            if (named)
              throw;
            LawFit failed;
            failed.law     = name;
            failed.failure = error.what();
            // The only data problem left to fit_law is too few points for this law.
            const Recipe *recipe = find_recipe(name);
            const std::size_t p  = recipe ? recipe->fitted.size() : 0;
            if (recipe && (smallest_law.empty() || p < fewest_parameters))
              {
                fewest_parameters = p;
                smallest_law      = name;
              }
            fits.push_back(failed);
          }
      }
    std::stable_sort(fits.begin(), fits.end(), [](const LawFit &a, const LawFit &b) {
      if (a.fitted != b.fitted)
        return a.fitted;
      return a.fitted && a.aic < b.aic;
    });
    if (fits.empty() || !fits.front().fitted)
      {
        if (!smallest_law.empty())
          throw DataError(data.source, 0, "", "",
                          std::to_string(data.points.size()) + " data points: too few to fit any law with error estimates",
                          "at least " + std::to_string(fewest_parameters + 1) + " points (" + smallest_law + ", " +
                            std::to_string(fewest_parameters) + " parameter" + (fewest_parameters > 1 ? "s" : "") +
                            "), better several per parameter");
        throw std::runtime_error("no law could be fitted to " + data.source);
      }
    // Akaike weights: exp(-dAIC/2), normalized over the fitted laws.
    double total = 0.;
    for (LawFit &fit : fits)
      if (fit.fitted)
        total += fit.akaike_weight = std::exp(-0.5 * (fit.aic - fits.front().aic));
    for (LawFit &fit : fits)
      fit.akaike_weight /= total;
    return fits;
  }
} // namespace lentus::rheology::fit
