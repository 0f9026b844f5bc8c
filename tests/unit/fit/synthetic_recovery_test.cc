// Synthetic recovery: data generated from a
// law with known parameters must give them back: exactly without noise, and
// inside the 95% confidence intervals about 95% of the time with 2% noise.
#include "rheology/fit/law_fit.h"
#include "synthetic_data.h"

#include <gtest/gtest.h>

#include <algorithm>
#include <cstdio>
#include <iostream>
#include <sstream>

namespace lentus::rheology::fit
{
  namespace
  {
    using testing::make_data;
    using testing::synthetic_laws;
    using testing::SyntheticLaw;

    FitOptions only(const std::string &law)
    {
      FitOptions options;
      options.laws = {law};
      return options;
    }

    const Estimate &estimate_of(const LawFit &fit, const std::string &key)
    {
      for (const Estimate &estimate : fit.estimates)
        if (estimate.key == key)
          return estimate;
      throw std::logic_error("no estimate " + key);
    }

    class EveryLaw : public ::testing::TestWithParam<SyntheticLaw>
    {};

    // Source: analytic (noise-free data from the law itself; the least-squares optimum is the truth).
    TEST_P(EveryLaw, NoiseFreeDataGiveTheParametersBack)
    {
      const SyntheticLaw &law  = GetParam();
      const FlowCurveData data = make_data(law.stress, law.rate_low, law.rate_high, law.points, 0., 1);
      const LawFit        fit  = fit_law(data, law.law, only(law.law));
      ASSERT_TRUE(fit.fitted) << fit.failure;
      EXPECT_EQ(fit.estimates.size(), law.truth.size());
      for (const auto &[key, value] : law.truth)
        EXPECT_NEAR(estimate_of(fit, key).value, value, 1e-6 * value) << law.law << ": " << key;
      EXPECT_LT(fit.rms_log, 1e-8);
    }

    // Source: the meaning of a 95% confidence interval (for the linearized intervals of nonlinear least
    // squares only approximately: Bates & Watts 1988, Nonlinear Regression Analysis and Its Applications,
    // ch. 2; from memory for the chapter); the band 88-99% over 200 seeds is about +-4 binomial standard
    // deviations around 95% (common practice).
    TEST_P(EveryLaw, ConfidenceIntervalsCoverTheTruthAbout95PercentWith2PercentNoise)
    {
      const SyntheticLaw        &law   = GetParam();
      constexpr int              seeds = 200;
      std::map<std::string, int> covered;
      for (int seed = 1; seed <= seeds; ++seed)
        {
          const FlowCurveData data = make_data(law.stress, law.rate_low, law.rate_high, law.points, 0.02, seed);
          const LawFit        fit  = fit_law(data, law.law, only(law.law));
          ASSERT_TRUE(fit.fitted) << fit.failure << " (seed " << seed << ")";
          for (const auto &[key, value] : law.truth)
            {
              const Estimate &estimate = estimate_of(fit, key);
              covered[key] += estimate.lower <= value && value <= estimate.upper;
            }
        }
      for (const auto &[key, count] : covered)
        {
          const double coverage = static_cast<double>(count) / seeds;
          RecordProperty(law.law + "/" + key, std::to_string(coverage));
          std::cout << "coverage " << law.law << " / " << key << ": " << 100. * coverage << "%\n";
          EXPECT_GE(coverage, 0.88) << law.law << ": " << key;
          EXPECT_LE(coverage, 0.99) << law.law << ": " << key;
        }
    }

    // Analytic: the sum of squares does not depend on the order of its terms.
    TEST_P(EveryLaw, OrderOfTheDataDoesNotMatter)
    {
      const SyntheticLaw &law  = GetParam();
      FlowCurveData       data = make_data(law.stress, law.rate_low, law.rate_high, law.points, 0.02, 7);
      const LawFit        forward = fit_law(data, law.law, only(law.law));
      std::reverse(data.points.begin(), data.points.end());
      std::rotate(data.points.begin(), data.points.begin() + 3, data.points.end());
      const LawFit shuffled = fit_law(data, law.law, only(law.law));
      for (std::size_t i = 0; i < forward.estimates.size(); ++i)
        {
          EXPECT_NEAR(shuffled.estimates[i].value, forward.estimates[i].value, 1e-6 * forward.estimates[i].value);
          EXPECT_NEAR(shuffled.estimates[i].upper, forward.estimates[i].upper, 1e-5 * forward.estimates[i].upper);
        }
    }

    INSTANTIATE_TEST_SUITE_P(Fit, EveryLaw, ::testing::ValuesIn(synthetic_laws()),
                             [](const auto &info) {
                               std::string name = info.param.law;
                               std::replace(name.begin(), name.end(), ' ', '_');
                               std::replace(name.begin(), name.end(), '-', '_');
                               return name;
                             });

    // Analytic (invariance to a unit change, Pa <-> dyn/cm^2): a stress unit scales tau by a constant,
    // which moves K and tau_y by the same factor and leaves n unchanged.
    TEST(FitUnits, StressInDynPerSquareCentimetreGivesTheSameFluid)
    {
      const SyntheticLaw law = synthetic_laws()[5]; // Herschel-Bulkley
      ASSERT_EQ(law.law, "Herschel-Bulkley");
      const FlowCurveData pascal = make_data(law.stress, law.rate_low, law.rate_high, law.points, 0.02, 3);
      std::string         csv    = "shear rate [1/s],shear stress [dyn/cm^2]\n";
      for (const Measurement &point : pascal.points)
        {
          char line[80];
          std::snprintf(line, sizeof line, "%.17g,%.17g\n", point.shear_rate, 10. * point.shear_stress);
          csv += line;
        }
      std::istringstream input(csv);
      const FlowCurveData dyne = read_flow_curve(input, "dyne.csv");
      const LawFit        a    = fit_law(pascal, law.law, only(law.law));
      const LawFit        b    = fit_law(dyne, law.law, only(law.law));
      for (std::size_t i = 0; i < a.estimates.size(); ++i)
        {
          EXPECT_NEAR(b.estimates[i].value, a.estimates[i].value, 1e-6 * a.estimates[i].value);
          EXPECT_NEAR(b.estimates[i].lower, a.estimates[i].lower, 1e-5 * a.estimates[i].lower);
        }
    }

    // Source: analytic (time-temperature superposition with an exact Arrhenius shift, noise free).
    TEST(FitTemperature, ArrheniusShiftIsRecoveredFromThreeTemperatures)
    {
      const double energy = 42e3, reference = 483.15;
      const auto   shift  = TemperatureShift::arrhenius(energy, reference);
      std::vector<std::pair<double, double>> sets;
      for (const double temperature : {463.15, 483.15, 503.15})
        sets.push_back({temperature, shift.factor(temperature)});
      const SyntheticLaw law  = synthetic_laws()[3]; // Carreau-Yasuda
      const FlowCurveData data = make_data(law.stress, 1e-2, 1e3, 15, 0., 1, sets);
      const LawFit        fit  = fit_law(data, law.law, only(law.law));
      ASSERT_TRUE(fit.fitted) << fit.failure;
      EXPECT_EQ(fit.shift_name, "Arrhenius");
      EXPECT_EQ(fit.reference_temperature, reference);
      EXPECT_NEAR(estimate_of(fit, "Activation energy").value, energy, 1e-5 * energy);
      for (const auto &[key, value] : law.truth)
        EXPECT_NEAR(estimate_of(fit, key).value, value, 1e-6 * value) << key;
      ASSERT_EQ(fit.shift_factors.size(), 3u);
      for (std::size_t i = 0; i < 3; ++i)
        EXPECT_NEAR(fit.shift_factors[i].value, sets[i].second, 1e-6 * sets[i].second);
      // The fitted fluid evaluates like the truth at another temperature (analytic).
      EXPECT_NEAR(fit.stress(3., 473.15), law.stress(shift.factor(473.15) * 3.), 1e-6 * law.stress(3.));
    }

    // Source: analytic (exact WLF shift, noise free); Williams, Landel & Ferry 1955, J. Am. Chem. Soc. 77:3701.
    TEST(FitTemperature, WlfConstantsAreRecoveredFromFourTemperatures)
    {
      const auto shift = TemperatureShift::wlf(4.5, 150., 473.15);
      std::vector<std::pair<double, double>> sets;
      for (const double temperature : {453.15, 473.15, 493.15, 513.15})
        sets.push_back({temperature, shift.factor(temperature)});
      const SyntheticLaw law  = synthetic_laws()[2]; // Cross
      const FlowCurveData data = make_data(law.stress, 1e-2, 1e3, 15, 0., 1, sets);
      FitOptions          options = only(law.law);
      options.shift                 = ShiftModel::wlf;
      options.reference_temperature = 473.15;
      const LawFit fit              = fit_law(data, law.law, options);
      ASSERT_TRUE(fit.fitted) << fit.failure;
      EXPECT_EQ(fit.shift_name, "WLF");
      EXPECT_NEAR(estimate_of(fit, "C1").value, 4.5, 1e-5 * 4.5);
      EXPECT_NEAR(estimate_of(fit, "C2").value, 150., 1e-5 * 150.);
    }

    // Source: analytic (exact exponential shift a_T = exp(-beta (T - T_ref)), noise free; the form of the
    // viscosity-temperature law often credited to Reynolds 1886, Phil. Trans. R. Soc. 177:157, from memory).
    TEST(FitTemperature, ExponentialSensitivityIsRecoveredFromThreeTemperatures)
    {
      const double beta = 0.021, reference = 483.15;
      const auto   shift = TemperatureShift::exponential(beta, reference);
      std::vector<std::pair<double, double>> sets;
      for (const double temperature : {463.15, 483.15, 503.15})
        sets.push_back({temperature, shift.factor(temperature)});
      const SyntheticLaw  law     = synthetic_laws()[3]; // Carreau-Yasuda
      const FlowCurveData data    = make_data(law.stress, 1e-2, 1e3, 15, 0., 1, sets);
      FitOptions          options = only(law.law);
      options.shift               = ShiftModel::exponential;
      const LawFit fit            = fit_law(data, law.law, options);
      ASSERT_TRUE(fit.fitted) << fit.failure;
      EXPECT_EQ(fit.shift_name, "Exponential");
      EXPECT_EQ(fit.reference_temperature, reference);
      EXPECT_NEAR(estimate_of(fit, "Temperature sensitivity").value, beta, 1e-5 * beta);
      for (const auto &[key, value] : law.truth)
        EXPECT_NEAR(estimate_of(fit, key).value, value, 1e-6 * value) << key;
      // The fitted fluid evaluates like the truth at another temperature (analytic).
      EXPECT_NEAR(fit.stress(3., 473.15), law.stress(shift.factor(473.15) * 3.), 1e-6 * law.stress(3.));
    }

    // Source: the meaning of a 95% confidence interval (as above), applied to the activation energy;
    // band as above for 100 seeds (about +-3 binomial standard deviations; common practice).
    TEST(FitTemperature, IntervalsCoverTheTruthWithAnArrheniusShift)
    {
      const double energy = 42e3, reference = 483.15;
      const auto   shift  = TemperatureShift::arrhenius(energy, reference);
      std::vector<std::pair<double, double>> sets;
      for (const double temperature : {463.15, 483.15, 503.15})
        sets.push_back({temperature, shift.factor(temperature)});
      const SyntheticLaw         law   = synthetic_laws()[3];
      constexpr int              seeds = 100;
      std::map<std::string, int> covered;
      std::map<std::string, double> truth(law.truth.begin(), law.truth.end());
      truth["Activation energy"] = energy;
      for (int seed = 1; seed <= seeds; ++seed)
        {
          const FlowCurveData data = make_data(law.stress, 1e-2, 1e3, 12, 0.02, seed, sets);
          const LawFit        fit  = fit_law(data, law.law, only(law.law));
          ASSERT_TRUE(fit.fitted);
          for (const auto &[key, value] : truth)
            {
              const Estimate &e = estimate_of(fit, key);
              covered[key] += e.lower <= value && value <= e.upper;
            }
        }
      for (const auto &[key, count] : covered)
        {
          std::cout << "coverage with temperature shift, " << key << ": " << count << "%\n";
          EXPECT_GE(count, 88) << key;
          EXPECT_LE(count, 100) << key;
        }
    }
  } // namespace
} // namespace lentus::rheology::fit
