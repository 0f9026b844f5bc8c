// The sweep file over the confidence region: Latin-hypercube structure,
// determinism and format.
#include "rheology/fit/sweep_file.h"
#include "synthetic_data.h"

#include <gmock/gmock.h>
#include <gtest/gtest.h>

#include <gsl/gsl_cdf.h>

#include <set>

namespace lentus::rheology::fit
{
  namespace
  {
    LawFit herschel_bulkley_fit()
    {
      FitOptions options;
      options.laws = {"Herschel-Bulkley"};
      const FlowCurveData data =
        testing::make_data([](double g) { return 5. + 2. * std::sqrt(g); }, 1e-2, 1e3, 20, 0.02, 3);
      return fit_law(data, "Herschel-Bulkley", options);
    }

    // Source: analytic (definition of a Latin hypercube, McKay, Beckman & Conover 1979,
    // Technometrics 21:239): in the standardized variables z = L^-1 (theta - theta_hat), each
    // coordinate puts exactly one sample in each of the N equal-probability strata.
    TEST(SweepFile, SamplesFormALatinHypercubeOfTheFitDistribution)
    {
      const LawFit      fit = herschel_bulkley_fit();
      const std::size_t p = fit.estimates.size(), samples = 16;
      const auto        values = latin_hypercube_samples(fit, samples, 42);
      ASSERT_EQ(values.size(), samples);
      // Cholesky factor of the covariance (positive definite here).
      std::vector<double> l(p * p, 0.);
      for (std::size_t j = 0; j < p; ++j)
        {
          double sum = fit.covariance[j * p + j];
          for (std::size_t k = 0; k < j; ++k)
            sum -= l[j * p + k] * l[j * p + k];
          ASSERT_GT(sum, 0.);
          l[j * p + j] = std::sqrt(sum);
          for (std::size_t i = j + 1; i < p; ++i)
            {
              double s = fit.covariance[i * p + j];
              for (std::size_t k = 0; k < j; ++k)
                s -= l[i * p + k] * l[j * p + k];
              l[i * p + j] = s / l[j * p + j];
            }
        }
      std::vector<std::set<long>> strata(p);
      for (const auto &sample : values)
        {
          std::vector<double> z(p);
          for (std::size_t i = 0; i < p; ++i) // forward substitution
            {
              double r = std::log(sample[i]) - fit.theta[i];
              for (std::size_t j = 0; j < i; ++j)
                r -= l[i * p + j] * z[j];
              z[i] = r / l[i * p + i];
              strata[i].insert(static_cast<long>(std::floor(gsl_cdf_ugaussian_P(z[i]) * samples)));
            }
        }
      for (std::size_t i = 0; i < p; ++i)
        EXPECT_EQ(strata[i].size(), samples) << fit.estimates[i].key;
    }

    TEST(SweepFile, IsDeterministicForASeedAndListsEveryCase)
    {
      const LawFit      fit  = herschel_bulkley_fit();
      const std::string text = sweep_file(fit, 8, 1, "paste.csv");
      EXPECT_EQ(text, sweep_file(fit, 8, 1, "paste.csv"));
      EXPECT_NE(text, sweep_file(fit, 8, 2, "paste.csv"));
      EXPECT_THAT(text, ::testing::HasSubstr("case fitted\n  Rheology/Herschel-Bulkley/Consistency = "));
      EXPECT_THAT(text, ::testing::HasSubstr("case sample-008\n"));
      // Marked as samples of the fluid, naming the case with the estimates, before the cases.
      EXPECT_LT(text.find("\nfluid samples = fitted\n"), text.find("\ncase fitted\n"));
      std::size_t cases = 0, ends = 0;
      for (std::size_t at = text.find("\ncase "); at != std::string::npos; at = text.find("\ncase ", at + 1))
        ++cases;
      for (std::size_t at = text.find("\nend\n"); at != std::string::npos; at = text.find("\nend\n", at + 1))
        ++ends;
      EXPECT_EQ(cases, 9u);
      EXPECT_EQ(ends, 9u);
    }
  } // namespace
} // namespace lentus::rheology::fit
