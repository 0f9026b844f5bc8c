// fit.json: written by nlohmann-json; names with control characters, quotes and
// backslashes come back unchanged through a JSON parser, and numbers that are not
// finite become null (JSON has no NaN). Source: RFC 8259 (2017), sections 6 and 7.
#include "rheology/fit/fit_report.h"
#include "rheology/fit/law_fit.h"
#include "synthetic_data.h"

#include <gtest/gtest.h>
#include <nlohmann/json.hpp>

#include <cmath>
#include <limits>
#include <string>
#include <vector>

namespace lentus::rheology::fit
{
  namespace
  {
    TEST(FitJson, ControlCharactersRoundTripAndNonFiniteNumbersAreNull)
    {
      FlowCurveData data = testing::make_data([](double g) { return 5. + 2. * std::sqrt(g); }, 1e-2, 1e3, 12, 0.02, 3);
      data.source        = "lab\t\"run 7\"\nC:\\data\x01.csv";
      FitOptions options;
      options.laws             = {"Herschel-Bulkley"};
      std::vector<LawFit> fits = fit_laws(data, options);
      ASSERT_EQ(fits.size(), 1u);
      ASSERT_TRUE(fits[0].fitted);
      fits[0].warnings.push_back("tab\there, newline\nthere");
      fits[0].aic = std::numeric_limits<double>::quiet_NaN();
      fits[0].bic = std::numeric_limits<double>::infinity();

      const std::string text = json_report(data, fits, options);
      for (const char c : text)
        EXPECT_FALSE(static_cast<unsigned char>(c) < 0x20 && c != '\n') << "raw control character in fit.json";
      const nlohmann::json json = nlohmann::json::parse(text);
      EXPECT_EQ(json["data"]["file"].get<std::string>(), data.source);
      EXPECT_EQ(json["laws"][0]["warnings"].back().get<std::string>(), "tab\there, newline\nthere");
      EXPECT_TRUE(json["laws"][0]["aic"].is_null());
      EXPECT_TRUE(json["laws"][0]["bic"].is_null());
      // The keys in the order they always had (a reader may rely on it only through names).
      const auto               ordered = nlohmann::ordered_json::parse(text);
      std::vector<std::string> keys;
      for (const auto &item : ordered.items())
        keys.push_back(item.key());
      EXPECT_EQ(keys, (std::vector<std::string>{"data", "method", "confidence", "ranking", "caution", "laws"}));
      // 10 significant digits, as before the JSON library: the confidence level 0.95 reads 0.95.
      EXPECT_NE(text.find("\"confidence\": 0.95,"), std::string::npos);
    }
  } // namespace
} // namespace lentus::rheology::fit
