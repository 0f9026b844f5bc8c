#include "solver/report/json_text.h"

#include <nlohmann/json.hpp>

#include <cmath>
#include <cstdio>
#include <cstdlib>

namespace lentus::report
{
  nlohmann::ordered_json json_number(const double value)
  {
    if (!std::isfinite(value))
      return nullptr;
    char buffer[40];
    std::snprintf(buffer, sizeof buffer, "%.10g", value);
    return std::strtod(buffer, nullptr);
  }

  std::string json_text(const nlohmann::ordered_json &value, const bool indented)
  {
    return value.dump(indented ? 2 : -1, ' ', false, nlohmann::ordered_json::error_handler_t::replace);
  }
} // namespace lentus::report
