#include "rheology/fit/fit_report.h"

#include "rheology/law_registry.h"

#include <nlohmann/json.hpp>

#include <algorithm>
#include <cmath>
#include <cstdio>
#include <cstdlib>
#include <sstream>

namespace lentus::rheology::fit
{
  const char *const caution =
    "Fitted parameters are model estimates from the data given: check the fluid's predictions against "
    "measurements before relying on them; results never replace pressure-relief devices, local codes or review "
    "by a licensed engineer.";

  namespace
  {
    std::string number(const double value, const int digits = 6)
    {
      char buffer[40];
      std::snprintf(buffer, sizeof buffer, "%.*g", digits, value);
      return buffer;
    }

    std::string padded(const std::string &text, const std::size_t width)
    {
      return text.size() >= width ? text + " " : text + std::string(width - text.size(), ' ');
    }

    /// A number as JSON with the 10 significant digits fit.json has always had; null if not finite.
    nlohmann::ordered_json json_number(const double value)
    {
      if (!std::isfinite(value))
        return nullptr;
      char buffer[40];
      std::snprintf(buffer, sizeof buffer, "%.10g", value);
      return std::strtod(buffer, nullptr);
    }

    std::string shift_text(const LawFit &fit)
    {
      if (fit.shift_name == "none")
        return "";
      return " + " + fit.shift_name + " shift (T_ref = " + number(fit.reference_temperature) + " K)";
    }

    double shear_rate_min(const FlowCurveData &data)
    {
      double lowest = HUGE_VAL;
      for (const Measurement &point : data.points)
        lowest = std::min(lowest, point.shear_rate);
      return lowest;
    }

    double shear_rate_max(const FlowCurveData &data)
    {
      double highest = 0.;
      for (const Measurement &point : data.points)
        highest = std::max(highest, point.shear_rate);
      return highest;
    }

    std::string data_summary(const FlowCurveData &data)
    {
      std::ostringstream text;
      text << data.points.size() << " points, shear rate " << number(shear_rate_min(data), 4) << " .. "
           << number(shear_rate_max(data), 4) << " 1/s";
      const auto temperatures = data.temperatures();
      if (!temperatures.empty())
        {
          text << ", temperature";
          for (const double temperature : temperatures)
            text << " " << number(temperature) << (temperature == temperatures.back() ? " K" : ",");
        }
      return text.str();
    }

    const char *method =
      "nonlinear least squares on log shear stress (relative errors), Levenberg-Marquardt (GSL trust region); "
      "positive parameters fitted as logarithms; standard errors from the Jacobian at the optimum (delta method); "
      "intervals from Student's t";
  } // namespace

  std::string text_report(const FlowCurveData &data, const std::vector<LawFit> &fits, const FitOptions &options)
  {
    std::ostringstream text;
    const std::string  level = number(100. * options.confidence) + "%";
    text << "Rheometer data: " << data.source << ": " << data_summary(data) << "\n"
         << "Method: " << method << ".\n\n";

    text << "Ranking by AIC (lower is better; Akaike weight = relative support)\n"
         << "rank  " << padded("law", 36) << padded("params", 7) << padded("RMS [%]", 9) << padded("AIC", 10)
         << padded("BIC", 10) << padded("dAIC", 9) << "weight\n";
    int rank = 0;
    for (const LawFit &fit : fits)
      {
        if (!fit.fitted)
          {
            text << "  -   " << padded(fit.law, 36) << "not fitted: " << fit.failure << "\n";
            continue;
          }
        ++rank;
        text << padded(std::to_string(rank), 6) << padded(fit.law + (fit.shift_name != "none" ? " + " + fit.shift_name : ""), 36)
             << padded(std::to_string(fit.n_parameters), 7)
             << padded(number(100. * (std::exp(fit.rms_log) - 1.), 3), 9) << padded(number(fit.aic, 5), 10)
             << padded(number(fit.bic, 5), 10) << padded(number(fit.aic - fits.front().aic, 3), 9)
             << number(fit.akaike_weight, 3) << "\n";
      }

    rank = 0;
    for (const LawFit &fit : fits)
      {
        if (!fit.fitted)
          continue;
        ++rank;
        text << "\n" << rank << ". " << fit.law << shift_text(fit) << ": RMS " << number(100. * (std::exp(fit.rms_log) - 1.), 3)
             << "% of stress, " << fit.iterations << " iterations\n";
        text << "   " << padded("parameter", 26) << padded("value", 13) << padded("std. error", 13) << level
             << " interval\n";
        for (const Estimate &estimate : fit.estimates)
          text << "   " << padded(estimate.key + (estimate.symbol != estimate.key ? " " + estimate.symbol : ""), 26) << padded(number(estimate.value), 13)
               << padded(number(estimate.standard_error, 3), 13) << "[" << number(estimate.lower) << ", "
               << number(estimate.upper) << "] " << estimate.unit << "\n";
        if (!fit.shift_factors.empty())
          {
            text << "   shift factors fitted freely per temperature (a_T = 1 at T_ref):\n";
            for (const Estimate &factor : fit.shift_factors)
              text << "     " << padded(factor.key, 30) << padded(number(factor.value), 13) << "[" << number(factor.lower)
                   << ", " << number(factor.upper) << "]\n";
          }
        for (const std::string &warning : fit.warnings)
          text << "   warning: " << warning << "\n";
      }

    text << "\nFitted fluid (rank 1), ready to paste into a case file:\n\n"
         << case_section(fits.front(), data.source) << "\nCaution: " << caution << "\n";
    return text.str();
  }

  std::string case_section(const LawFit &fit, const std::string &source)
  {
    std::ostringstream text;
    text << "# Fitted by `lentus fit` to " << source << ": " << fit.law << shift_text(fit) << ", RMS "
         << number(100. * (std::exp(fit.rms_log) - 1.), 3) << "% of stress.\n"
         << "# Model estimate: check it against measurements before relying on it.\n"
         << "subsection Rheology\n"
         << "  set Viscosity law     = " << fit.law << "\n"
         << "  set Temperature shift = " << fit.shift_name << "\n";

    auto write_values = [&](const std::string &section, const ParameterValues &values,
                            const std::vector<std::string> &order) {
      std::size_t width = 0;
      for (const std::string &key : order)
        if (values.count(key))
          width = std::max(width, key.size());
      text << "  subsection " << section << "\n";
      for (const std::string &key : order)
        {
          const auto found = values.find(key);
          if (found == values.end() || !std::isfinite(found->second))
            continue;
          std::string comment;
          for (const Estimate &estimate : fit.estimates)
            if (estimate.path == "Rheology/" + section + "/" + key)
              comment = estimate.unit + ", 95% interval [" + number(estimate.lower, 4) + ", " +
                        number(estimate.upper, 4) + "]";
          if (comment.empty())
            comment = key == "Reference temperature" ? "K" : "held fixed, see the notes below";
          text << "    set " << padded(key, width + 1) << "= " << number(found->second) << "   # " << comment << "\n";
        }
      text << "  end\n";
    };

    std::vector<std::string> law_keys;
    for (const ParameterInfo &parameter : registry().find(fit.law).parameters)
      law_keys.push_back(parameter.key);
    write_values(fit.law, fit.law_values, law_keys);
    if (fit.shift_name == "Arrhenius")
      write_values("Arrhenius", fit.shift_values, {"Activation energy", "Reference temperature"});
    if (fit.shift_name == "WLF")
      write_values("WLF", fit.shift_values, {"C1", "C2", "Reference temperature"});
    if (fit.shift_name == "Exponential")
      write_values("Exponential", fit.shift_values, {"Temperature sensitivity", "Reference temperature"});
    text << "end\n";
    if (fit.shift_name != "none")
      text << "# A temperature shift needs the temperature of the case; T_ref here, so that this file\n"
           << "# checks on its own. When pasting the Rheology section, keep the case's own operating point.\n"
           << "subsection Operating point\n"
           << "  set Temperature = " << number(fit.reference_temperature) << "   # K\n"
           << "end\n";
    for (const std::string &note : fit.fixed_notes)
      text << "# Note: " << note << "\n";
    return text.str();
  }

  std::string json_report(const FlowCurveData &data, const std::vector<LawFit> &fits, const FitOptions &options)
  {
    using json = nlohmann::ordered_json;
    json temperatures = json::array();
    for (const double temperature : data.temperatures())
      temperatures.push_back(json_number(temperature));
    json report;
    report["data"] = {{"file", data.source},
                      {"points", data.points.size()},
                      {"shear rate range [1/s]", {json_number(shear_rate_min(data)), json_number(shear_rate_max(data))}},
                      {"temperatures [K]", temperatures}};
    report["method"]     = method;
    report["confidence"] = json_number(options.confidence);
    report["ranking"]    = "AIC, lower is better";
    report["caution"]    = caution;

    auto estimate_json = [](const Estimate &estimate) {
      return json{{"key", estimate.key},
                  {"path", estimate.path},
                  {"symbol", estimate.symbol},
                  {"unit", estimate.unit},
                  {"value", json_number(estimate.value)},
                  {"standard error", json_number(estimate.standard_error)},
                  {"lower", json_number(estimate.lower)},
                  {"upper", json_number(estimate.upper)}};
    };

    json laws = json::array();
    int  rank = 0;
    for (const LawFit &fit : fits)
      {
        json law = {{"law", fit.law}, {"fitted", fit.fitted}};
        if (!fit.fitted)
          {
            law["failure"] = fit.failure;
            laws.push_back(law);
            continue;
          }
        law["rank"]                       = ++rank;
        law["temperature shift"]          = fit.shift_name;
        law["reference temperature [K]"]  = json_number(fit.reference_temperature);
        law["points"]                     = fit.n_points;
        law["parameters fitted"]          = fit.n_parameters;
        law["rms log residual"]           = json_number(fit.rms_log);
        law["aic"]                        = json_number(fit.aic);
        law["bic"]                        = json_number(fit.bic);
        law["akaike weight"]              = json_number(fit.akaike_weight);
        law["iterations"]                 = fit.iterations;
        json parameters                   = json::array();
        for (const Estimate &estimate : fit.estimates)
          parameters.push_back(estimate_json(estimate));
        law["parameters"] = parameters;
        const std::size_t p           = fit.estimates.size();
        json              correlation = json::array();
        for (std::size_t i = 0; i < p; ++i)
          {
            json row = json::array();
            for (std::size_t j = 0; j < p; ++j)
              row.push_back(json_number(fit.correlation[i * p + j]));
            correlation.push_back(row);
          }
        law["correlation"] = correlation;
        json case_values   = json::object();
        for (const auto &[key, value] : fit.law_values)
          case_values[key] = json_number(value);
        for (const auto &[key, value] : fit.shift_values)
          case_values[fit.shift_name + "/" + key] = json_number(value);
        law["case values"] = case_values;
        json shift_factors = json::array();
        for (const Estimate &factor : fit.shift_factors)
          shift_factors.push_back(estimate_json(factor));
        law["shift factors"] = shift_factors;
        law["warnings"]      = fit.warnings;
        law["notes"]         = fit.fixed_notes;
        laws.push_back(law);
      }
    report["laws"] = laws;
    // Invalid UTF-8 (a file name in another encoding) becomes U+FFFD instead of an exception.
    return report.dump(2, ' ', false, json::error_handler_t::replace) + "\n";
  }

  std::string plot_table(const FlowCurveData &data, const std::vector<LawFit> &fits, const std::size_t curves)
  {
    std::ostringstream csv;
    csv << "kind,law,temperature [K],shear rate [1/s],shear stress [Pa],viscosity [Pa s],residual [%]\n";
    const LawFit &best = fits.front();
    for (const Measurement &point : data.points)
      {
        const double model = best.stress(point.shear_rate, point.temperature);
        csv << "data," << best.law << "," << number(point.temperature, 10) << "," << number(point.shear_rate, 10) << ","
            << number(point.shear_stress, 10) << "," << number(point.shear_stress / point.shear_rate, 10) << ","
            << number(100. * (point.shear_stress / model - 1.), 6) << "\n";
      }
    const double low = 0.5 * shear_rate_min(data), high = 2. * shear_rate_max(data);
    std::vector<double> temperatures = data.temperatures();
    if (temperatures.empty())
      temperatures.push_back(std::nan(""));
    std::size_t drawn = 0;
    for (const LawFit &fit : fits)
      {
        if (!fit.fitted || drawn++ == curves)
          break;
        for (const double temperature : temperatures)
          for (int i = 0; i <= 80; ++i)
            {
              const double rate   = low * std::pow(high / low, i / 80.);
              const double stress = fit.stress(rate, temperature);
              csv << "curve," << fit.law << "," << number(temperature, 10) << "," << number(rate, 10) << ","
                  << number(stress, 10) << "," << number(stress / rate, 10) << ",\n";
            }
      }
    return csv.str();
  }
} // namespace lentus::rheology::fit
