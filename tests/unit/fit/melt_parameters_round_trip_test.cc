// A synthetic round trip, not a check against published data: no published raw (shear rate, stress)
// table with matching published fit parameters is at hand. Data are generated from Carreau parameters
// of the size a polymer melt has, with 2% noise, and the fitter must give them back within its
// intervals. (tests/unit/fit/synthetic_recovery_test.cc does the same for every law.)
#include "rheology/fit/law_fit.h"
#include "synthetic_data.h"

#include <gtest/gtest.h>

namespace lentus::rheology::fit
{
  namespace
  {
    // Carreau fit of a polystyrene melt at 453 K: eta_0 = 1.48e4 Pa s, lambda = 1.04 s, n = 0.398, a = 2.
    // The parameters are recalled from Bird, Armstrong & Hassager 1987, Dynamics of Polymeric Liquids
    // vol. 1, Table 4.1-2 (from memory, low confidence: not verified against the table). They serve only
    // as realistic inputs: the check is a round trip of the fitter and does not depend on those digits.
    constexpr double eta_0 = 1.48e4, lambda = 1.04, n = 0.398, a = 2.;

    double carreau_stress(const double g)
    {
      return g * eta_0 * std::pow(1. + std::pow(lambda * g, a), (n - 1.) / a);
    }

    TEST(SyntheticRoundTrip, CarreauMeltParametersAreRecoveredWithinTheirIntervals)
    {
      // Shear rates 1e-3..1e3 1/s (both plateau and thinning region), 2% noise.
      const FlowCurveData data = testing::make_data(carreau_stress, 1e-3, 1e3, 25, 0.02, 453);
      FitOptions          options;
      const std::vector<LawFit> fits = fit_laws(data, options);
      const LawFit *carreau = nullptr;
      for (const LawFit &fit : fits)
        if (fit.law == "Carreau-Yasuda")
          carreau = &fit;
      ASSERT_NE(carreau, nullptr);
      ASSERT_TRUE(carreau->fitted);
      const std::map<std::string, double> truth{
        {"Zero-shear viscosity", eta_0}, {"Time constant", lambda}, {"Flow index", n}, {"Yasuda exponent", a}};
      for (const Estimate &estimate : carreau->estimates)
        {
          const double value = truth.at(estimate.key);
          EXPECT_LE(estimate.lower, value) << estimate.key;
          EXPECT_GE(estimate.upper, value) << estimate.key;
          // With 2% scatter, each parameter within 10% (common practice for a well-posed fit).
          EXPECT_NEAR(estimate.value, value, 0.1 * value) << estimate.key;
        }
      // The generating law is among the two best (Cross fits a Carreau curve nearly as well).
      EXPECT_TRUE(fits[0].law == "Carreau-Yasuda" || fits[1].law == "Carreau-Yasuda") << fits[0].law;
    }
  } // namespace
} // namespace lentus::rheology::fit
