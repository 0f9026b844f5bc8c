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

// Analytic: tau = eta gamma_dot; a generalized-Newtonian fluid's stress must
// not fall as the shear rate rises (monotone flow curve) for these samples,
// all of which have Cross m <= 1 or thinning indices > 0.
TEST_P(EveryLaw, StressIsEtaTimesShearRateAndFinitePositive)
{
  const auto law = registry().create(GetParam().law, GetParam().values);
  for (const double g : log_spaced(1e-8, 1e6, 4))
    {
      const Viscosity eta = law->evaluate(g);
      EXPECT_TRUE(std::isfinite(eta.value) && eta.value > 0.) << GetParam().label << " at " << g;
      EXPECT_TRUE(std::isfinite(eta.derivative)) << GetParam().label << " at " << g;
      EXPECT_DOUBLE_EQ(law->stress(g), eta.value * g);
    }
  const Viscosity at_rest = law->evaluate(0.);
  EXPECT_TRUE(std::isfinite(at_rest.value) && at_rest.value > 0.) << GetParam().label << " at rest";
  EXPECT_TRUE(std::isfinite(at_rest.derivative)) << GetParam().label << " at rest";
}

INSTANTIATE_TEST_SUITE_P(Rheology,
                         EveryLaw,
                         ::testing::ValuesIn(lentus::rheology::testing::sample_laws()),
                         [](const ::testing::TestParamInfo<SampleLaw> &info) { return info.param.label; });
