#include "rheology/parameter_table.h"

#include <cmath>
#include <cstdio>
#include <sstream>

namespace lentus::rheology
{
  InvalidParameter::InvalidParameter(const std::string &key_,
                                     const std::string &value_text_,
                                     const std::string &problem_,
                                     const std::string &allowed_)
    : std::invalid_argument(key_ + " = " + value_text_ + ": " + problem_ +
                            "; allowed: " + allowed_)
    , key(key_)
    , value_text(value_text_)
    , problem(problem_)
    , allowed(allowed_)
  {}

  std::string format_value(const double value)
  {
    if (std::isnan(value))
      return "nan";
    if (std::isinf(value))
      return value > 0 ? "inf" : "-inf";
    // Shortest of %.6g .. %.17g that reads back exactly.
    char buffer[40];
    for (int digits = 6; digits <= 17; ++digits)
      {
        std::snprintf(buffer, sizeof buffer, "%.*g", digits, value);
        if (std::strtod(buffer, nullptr) == value)
          break;
      }
    return buffer;
  }

  std::string format_short(const double value)
  {
    char buffer[40];
    std::snprintf(buffer, sizeof buffer, "%.10g", value);
    return buffer;
  }

  Range Range::above(const double lower)
  {
    Range range;
    range.lower           = lower;
    range.lower_inclusive = false;
    return range;
  }

  Range Range::at_least(const double lower)
  {
    Range range;
    range.lower = lower;
    return range;
  }

  Range Range::closed(const double lower, const double upper)
  {
    Range range;
    range.lower = lower;
    range.upper = upper;
    return range;
  }

  Range Range::any()
  {
    return Range();
  }

  Range Range::or_infinite() const
  {
    Range range            = *this;
    range.infinity_allowed = true;
    return range;
  }

  bool Range::contains(const double value) const
  {
    if (std::isnan(value))
      return false;
    if (std::isinf(value))
      return infinity_allowed && value > 0 && upper == HUGE_VAL;
    const bool above_lower = lower_inclusive ? value >= lower : value > lower;
    const bool below_upper = upper_inclusive ? value <= upper : value < upper;
    return above_lower && below_upper;
  }

  std::string Range::describe() const
  {
    std::ostringstream text;
    text << "a finite real number";
    if (std::isfinite(lower))
      text << (lower_inclusive ? " >= " : " > ") << format_value(lower);
    if (std::isfinite(upper))
      text << (std::isfinite(lower) ? " and" : "")
           << (upper_inclusive ? " <= " : " < ") << format_value(upper);
    if (infinity_allowed)
      text << ", or inf (no bound)";
    return text.str();
  }

  std::vector<double> resolve_parameters(const std::vector<ParameterInfo> &table,
                                         const ParameterValues &values,
                                         const std::string &owner)
  {
    for (const auto &[key, value] : values)
      {
        bool known = false;
        for (const ParameterInfo &row : table)
          known = known || row.key == key;
        if (!known)
          {
            std::string keys;
            for (const ParameterInfo &row : table)
              keys += (keys.empty() ? "" : ", ") + row.key;
            throw InvalidParameter(key, format_value(value),
                                   "not a parameter of " + owner,
                                   "the keys " + keys);
          }
      }

    std::vector<double> resolved;
    resolved.reserve(table.size());
    for (const ParameterInfo &row : table)
      {
        const auto found = values.find(row.key);
        if (found == values.end())
          {
            if (!row.has_default())
              throw InvalidParameter(row.key, "(not set)",
                                     "required by " + owner + " and missing",
                                     row.range.describe() + " [" + row.unit + "]");
            resolved.push_back(row.default_value);
            continue;
          }
        if (!row.range.contains(found->second))
          throw InvalidParameter(row.key, format_value(found->second),
                                 "out of range for " + owner,
                                 row.range.describe() + " [" + row.unit + "]");
        resolved.push_back(found->second);
      }
    return resolved;
  }
} // namespace lentus::rheology
