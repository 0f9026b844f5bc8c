// Properties every law must have, checked for every sample parameter set:
// a new law gets these tests by adding a sample.
#include "rheology/law_registry.h"
#include "sample_laws.h"

#include <gtest/gtest.h>

#include <cmath>

using namespace lentus::rheology;
using lentus::rheology::testing::SampleLaw;

namespace
{
  /// Fourth-order central difference of eta at g with step h:
  /// (8 (f(g+h) - f(g-h)) - (f(g+2h) - f(g-2h))) / (12 h); error O(h^4).
  double central_difference(const ViscosityLaw &law, const double g, const double h)
  {
    const auto f = [&](const double x) { return law.evaluate(x).value; };
    return (8. * (f(g + h) - f(g - h)) - (f(g + 2. * h) - f(g - 2. * h))) / (12. * h);
  }

  std::vector<double> log_spaced(const double from, const double to, const int per_decade)
  {
    std::vector<double> values;
    const int           n = static_cast<int>(std::round(std::log10(to / from) * per_decade));
    for (int i = 0; i <= n; ++i)
      values.push_back(from * std::pow(10., static_cast<double>(i) / per_decade));
    return values;
  }
} // namespace

class EveryLaw : public ::testing::TestWithParam<SampleLaw>
{};

// Analytic check: d eta / d gamma_dot equals the limit of difference quotients.
// Relative error < 1e-6 where the derivative is well conditioned, i.e. where it
// is not negligible against eta / gamma_dot; elsewhere it must be negligible too.
TEST_P(EveryLaw, DerivativeMatchesCentralDifference)
{
  const auto law = registry().create(GetParam().law, GetParam().values);
  for (const double g : log_spaced(1e-6, 1e6, 7))
    {
      const Viscosity eta   = law->evaluate(g);
      const double    exact = eta.derivative;
      const double    fd    = central_difference(*law, g, 1e-3 * g);
      const double    scale = eta.value / g; // natural size of d eta / d gamma_dot
      if (std::abs(exact) >= 1e-3 * scale)
        EXPECT_LT(std::abs(fd - exact), 1e-6 * std::abs(exact))
          << GetParam().label << " at gamma_dot = " << g << " 1/s: exact " << exact << ", difference " << fd;
      else
        EXPECT_LT(std::abs(fd - exact), 1e-9 * scale)
          << GetParam().label << " at gamma_dot = " << g << " 1/s: exact " << exact << ", difference " << fd;
    }
}

// Analytic: a generalized-Newtonian fluid's stress tau = eta(gamma_dot) gamma_dot must not fall as the
// shear rate rises (a falling flow curve would make the shear rate at a given stress, and so the
// developed flow, not unique). It does for every sample but a Cross law with rate index m > 1: with
// eta_inf = 0 its stress falls as gamma_dot^(1-m) at high rates (from the law of Cross 1965, J. Colloid
// Sci. 20:417). The stress is formed here from eta and its slope from the exact derivative; the
// law's own stress() is eta times gamma_dot by definition and is not what is checked.
TEST_P(EveryLaw, FlowCurveRisesAndViscosityIsFinitePositive)
{
  const auto law        = registry().create(GetParam().law, GetParam().values);
  const auto rate_index = GetParam().values.find("Rate index");
  const bool rising =
    !(GetParam().law == "Cross" && rate_index != GetParam().values.end() && rate_index->second > 1.);
  double     last_stress = 0.;
  for (const double g : log_spaced(1e-8, 1e6, 4))
    {
      const Viscosity eta = law->evaluate(g);
      EXPECT_TRUE(std::isfinite(eta.value) && eta.value > 0.) << GetParam().label << " at " << g;
      EXPECT_TRUE(std::isfinite(eta.derivative)) << GetParam().label << " at " << g;
      const double stress = eta.value * g;
      // d tau / d gamma_dot = eta + gamma_dot d eta / d gamma_dot >= 0 (up to round-off of the sum).
      if (rising)
        {
          EXPECT_GE(eta.value + g * eta.derivative, -1e-12 * eta.value) << GetParam().label << " at " << g;
          EXPECT_GE(stress, last_stress * (1. - 1e-12)) << GetParam().label << " at " << g;
        }
      last_stress = stress;
    }
  const Viscosity at_rest = law->evaluate(0.);
  EXPECT_TRUE(std::isfinite(at_rest.value) && at_rest.value > 0.) << GetParam().label << " at rest";
  EXPECT_TRUE(std::isfinite(at_rest.derivative)) << GetParam().label << " at rest";
}

INSTANTIATE_TEST_SUITE_P(Rheology,
                         EveryLaw,
                         ::testing::ValuesIn(lentus::rheology::testing::sample_laws()),
                         [](const ::testing::TestParamInfo<SampleLaw> &info) { return info.param.label; });
