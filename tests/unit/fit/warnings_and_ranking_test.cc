// What the fit says about the data: ranking by AIC and the warnings when the
// data cannot pin a parameter down.
#include "rheology/fit/fit_report.h"
#include "rheology/fit/law_fit.h"
#include "synthetic_data.h"

#include <gmock/gmock.h>
#include <gtest/gtest.h>

namespace lentus::rheology::fit
{
  namespace
  {
    using ::testing::HasSubstr;
    using testing::make_data;

    FitOptions only(const std::string &law)
    {
      FitOptions options;
      options.laws = {law};
      return options;
    }

    bool has_warning(const LawFit &fit, const std::string &text)
    {
      for (const std::string &warning : fit.warnings)
        if (warning.find(text) != std::string::npos)
          return true;
      return false;
    }

    double herschel_bulkley(const double g) { return 5. + 2. * std::sqrt(g); }

    // Source: Akaike 1974, IEEE Trans. Autom. Control 19:716 (the criterion); that it picks the
    // generating law when the others misfit by far more than the noise is common practice.
    TEST(FitRanking, GeneratingLawRanksFirstAndWeightsSumToOne)
    {
      const FlowCurveData       data = make_data(herschel_bulkley, 1e-2, 1e3, 20, 0.02, 11);
      const std::vector<LawFit> fits = fit_laws(data, FitOptions{});
      ASSERT_EQ(fits.size(), 6u);
      EXPECT_EQ(fits.front().law, "Herschel-Bulkley");
      double total = 0.;
      for (std::size_t i = 0; i < fits.size(); ++i)
        {
          ASSERT_TRUE(fits[i].fitted) << fits[i].law;
          total += fits[i].akaike_weight;
          if (i > 0)
            {
              EXPECT_LE(fits[i - 1].aic, fits[i].aic);
            }
        }
      EXPECT_NEAR(total, 1., 1e-12);
      // Analytic: AIC - BIC = k (2 - ln N) for the same fit.
      const double k = static_cast<double>(fits[0].n_parameters + 1);
      EXPECT_NEAR(fits[0].aic - fits[0].bic, k * (2. - std::log(20.)), 1e-9);
    }

    // Source: the requirement (no low-shear plateau -> warn); threshold common practice.
    TEST(FitWarnings, NoLowShearPlateauIsReported)
    {
      const auto carreau = [](double g) { return g * 1e4 * std::pow(1. + g * g, -0.3); };
      const LawFit without = fit_law(make_data(carreau, 10., 1e3, 15, 0.02, 5), "Carreau-Yasuda", only("Carreau-Yasuda"));
      EXPECT_TRUE(has_warning(without, "no low-shear plateau in the data"));
      const LawFit with = fit_law(make_data(carreau, 1e-3, 1e3, 25, 0.02, 5), "Carreau-Yasuda", only("Carreau-Yasuda"));
      EXPECT_FALSE(has_warning(with, "no low-shear plateau")) << ::testing::PrintToString(with.warnings);
    }

    // Source: the requirement (lowest shear rate too high to see a yield stress).
    TEST(FitWarnings, LowestShearRateTooHighForAYieldStressIsReported)
    {
      const LawFit high = fit_law(make_data(herschel_bulkley, 100., 1e4, 15, 0.02, 5), "Herschel-Bulkley",
                                  only("Herschel-Bulkley"));
      EXPECT_TRUE(has_warning(high, "lowest shear rate too high to see a yield stress"));
      const LawFit low = fit_law(make_data(herschel_bulkley, 1e-2, 1e3, 20, 0.02, 5), "Herschel-Bulkley",
                                 only("Herschel-Bulkley"));
      EXPECT_FALSE(has_warning(low, "too high to see a yield stress"));
    }

    // Source: analytic (over one decade far from gamma_dot = 1, log K and n are nearly collinear).
    TEST(FitWarnings, StronglyCorrelatedParametersAreReported)
    {
      const auto   power = [](double g) { return 10. * std::pow(g, 0.4); };
      const LawFit fit   = fit_law(make_data(power, 100., 1000., 10, 0.02, 5), "Power law", only("Power law"));
      EXPECT_TRUE(has_warning(fit, "Consistency and Flow index are strongly correlated"));
    }

    TEST(FitReport, CaseSectionUsesTheCaseFileKeysAndCarriesTheCaution)
    {
      const FlowCurveData data = make_data(herschel_bulkley, 1e-2, 1e3, 20, 0.02, 11);
      const LawFit        fit  = fit_law(data, "Herschel-Bulkley", only("Herschel-Bulkley"));
      const std::string   text = case_section(fit, "paste.csv");
      EXPECT_THAT(text, HasSubstr("subsection Rheology\n  set Viscosity law     = Herschel-Bulkley\n"
                                  "  set Temperature shift = none\n  subsection Herschel-Bulkley\n"));
      for (const std::string key : {"Consistency", "Flow index", "Yield stress", "Regularization exponent",
                                    "Shear-rate floor"})
        EXPECT_THAT(text, HasSubstr("    set " + key)) << key;
      EXPECT_THAT(text, HasSubstr("Model estimate: check it against measurements"));
      // Source: analytic (M = 100 / lowest shear rate = 100 / 0.01 1/s).
      EXPECT_EQ(fit.law_values.at("Regularization exponent"), 1e4);
      const std::string json = json_report(data, {fit}, FitOptions{});
      EXPECT_THAT(json, HasSubstr("\"law\": \"Herschel-Bulkley\""));
      EXPECT_THAT(json, HasSubstr("\"caution\""));
    }
  } // namespace
} // namespace lentus::rheology::fit
