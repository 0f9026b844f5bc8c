#include "rheology/fit/sweep_file.h"

#include "rheology/law_registry.h"

#include <gsl/gsl_cdf.h>

#include <cmath>
#include <cstdio>
#include <random>
#include <sstream>

namespace lentus::rheology::fit
{
  namespace
  {
    /// Uniform on [0, 1) from 53 random bits (portable, unlike std:: distributions).
    double uniform(std::mt19937_64 &generator)
    {
      return static_cast<double>(generator() >> 11) * 0x1.0p-53;
    }

    std::string number(const double value)
    {
      char buffer[32];
      std::snprintf(buffer, sizeof buffer, "%.6g", value);
      return buffer;
    }

    /// Lower Cholesky factor of the p x p matrix `a`; a diagonal fallback
    /// (correlations dropped) if `a` is not positive definite.
    std::vector<double> cholesky(const std::vector<double> &a, const std::size_t p, bool &diagonal_only)
    {
      std::vector<double> l(p * p, 0.);
      diagonal_only = false;
      for (std::size_t j = 0; j < p; ++j)
        {
          double sum = a[j * p + j];
          for (std::size_t k = 0; k < j; ++k)
            sum -= l[j * p + k] * l[j * p + k];
          if (!(sum > 0.))
            {
              diagonal_only = true;
              break;
            }
          l[j * p + j] = std::sqrt(sum);
          for (std::size_t i = j + 1; i < p; ++i)
            {
              double s = a[i * p + j];
              for (std::size_t k = 0; k < j; ++k)
                s -= l[i * p + k] * l[j * p + k];
              l[i * p + j] = s / l[j * p + j];
            }
        }
      if (diagonal_only)
        {
          std::fill(l.begin(), l.end(), 0.);
          for (std::size_t j = 0; j < p; ++j)
            l[j * p + j] = std::sqrt(std::max(a[j * p + j], 0.));
        }
      return l;
    }
  } // namespace

  std::vector<std::vector<double>> latin_hypercube_samples(const LawFit &fit, const std::size_t samples,
                                                           const std::uint64_t seed)
  {
    const std::size_t p = fit.estimates.size();
    std::mt19937_64   generator(seed);
    bool              diagonal_only = false;
    const std::vector<double> factor = cholesky(fit.covariance, p, diagonal_only);

    // z[k][d]: stratum pi_d(k) of N equal-probability strata of the standard normal.
    std::vector<std::vector<double>> z(samples, std::vector<double>(p));
    for (std::size_t d = 0; d < p; ++d)
      {
        std::vector<std::size_t> strata(samples);
        for (std::size_t k = 0; k < samples; ++k)
          strata[k] = k;
        for (std::size_t k = samples; k > 1; --k) // Fisher-Yates
          std::swap(strata[k - 1], strata[static_cast<std::size_t>(uniform(generator) * k)]);
        for (std::size_t k = 0; k < samples; ++k)
          z[k][d] = gsl_cdf_ugaussian_Pinv((strata[k] + uniform(generator)) / static_cast<double>(samples));
      }

    std::vector<std::vector<double>> values(samples, std::vector<double>(p));
    for (std::size_t k = 0; k < samples; ++k)
      for (std::size_t i = 0; i < p; ++i)
        {
          double theta = fit.theta[i];
          for (std::size_t j = 0; j <= i; ++j)
            theta += factor[i * p + j] * z[k][j];
          const Estimate &estimate = fit.estimates[i];
          values[k][i]             = estimate.log_scale ? std::exp(theta) : estimate.scale * theta;
        }
    return values;
  }

  std::string sweep_file(const LawFit &fit, const std::size_t samples, const std::uint64_t seed,
                         const std::string &source)
  {
    std::ostringstream text;
    text << "# Lentus sweep file, format 1: uncertainty of a fitted fluid.\n"
         << "# Fluid: " << fit.law << (fit.shift_name != "none" ? " with " + fit.shift_name + " shift" : "")
         << ", fitted by `lentus fit` to " << source << ".\n"
         << "# Base case: a case file holding the Rheology section written with this file (fluid.prm).\n"
         << "# Each `case NAME ... end` block is one run: the base case with the listed values replaced\n"
         << "# (Section/Subsection/Key = value, as --set takes them). The sweep runner reads this file.\n"
         << "# Samples: Latin hypercube of " << samples << " points (seed " << seed
         << ") of the fit's approximate sampling distribution\n"
         << "# (normal in log parameter for positive parameters, with the fit's covariance): about 95% of\n"
         << "# them lie inside the 95% confidence region. The spread of a design number over the cases is\n"
         << "# an estimate of its uncertainty from the fit alone, not from the model or the measurement.\n";
    bool diagonal_only = false;
    cholesky(fit.covariance, fit.estimates.size(), diagonal_only);
    if (diagonal_only)
      text << "# Warning: the covariance is singular; correlations were dropped.\n";

    const LawInfo     &info = registry().find(fit.law);
    std::ostringstream cases;
    auto write_case = [&](const std::string &name, const std::vector<double> &values) {
      // Check that the law accepts the sample before writing it.
      ParameterValues law_values = fit.law_values;
      for (std::size_t i = 0; i < fit.estimates.size(); ++i)
        if (fit.estimates[i].path.rfind("Rheology/" + fit.law + "/", 0) == 0)
          law_values[fit.estimates[i].key] = values[i];
      try
        {
          info.create(resolve_parameters(info.parameters, law_values, fit.law));
        }
      catch (const InvalidParameter &error)
        {
          cases << "# case " << name << " left out: " << error.what() << "\n";
          return false;
        }
      cases << "case " << name << "\n";
      for (std::size_t i = 0; i < fit.estimates.size(); ++i)
        cases << "  " << fit.estimates[i].path << " = " << number(values[i]) << "\n";
      cases << "end\n";
      return true;
    };

    std::vector<double> estimates;
    for (const Estimate &estimate : fit.estimates)
      estimates.push_back(estimate.value);
    const bool fitted  = write_case("fitted", estimates);
    const auto sampled = latin_hypercube_samples(fit, samples, seed);
    for (std::size_t k = 0; k < sampled.size(); ++k)
      {
        char name[32];
        std::snprintf(name, sizeof name, "sample-%03zu", k + 1);
        write_case(name, sampled[k]);
      }
    // The mark that makes a sweep state each design number's spread over the samples beside its
    // value in the fitted case (solver/sweep/fluid_uncertainty.h).
    if (fitted)
      text << "# `fluid samples = fitted`: the cases sample the fluid's parameters and case `fitted` holds the\n"
           << "# estimates; the sweep then writes fluid_uncertainty.csv: each design number's value in the\n"
           << "# fitted case and its 2.5-97.5% span over the samples.\n"
           << "fluid samples = fitted\n";
    return text.str() + cases.str();
  }
} // namespace lentus::rheology::fit
