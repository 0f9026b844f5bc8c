// Parameter descriptions shared by viscosity laws and temperature shifts:
// key, symbol, unit, meaning, allowed range and default. One table feeds the
// case-file declaration, `lentus laws` and the validation of values.
#pragma once

#include <limits>
#include <map>
#include <stdexcept>
#include <string>
#include <vector>

namespace lentus::rheology
{
  /// A value given for a named parameter was rejected.
  /// what() reads "<key> = <value>: <problem>; allowed: <allowed>".
  class InvalidParameter : public std::invalid_argument
  {
  public:
    InvalidParameter(const std::string &key,
                     const std::string &value_text,
                     const std::string &problem,
                     const std::string &allowed);

    std::string key;        ///< the parameter's key, e.g. "Flow index"
    std::string value_text; ///< the value as given, or "(not set)"
    std::string problem;    ///< what is wrong
    std::string allowed;    ///< what would be accepted
  };

  /// Text of a double as a user would write it (shortest form that reads back exactly).
  std::string format_value(double value);

  /// Text of a computed double for messages: 10 significant digits.
  std::string format_short(double value);

  /// An interval of allowed real values; NaN is never allowed, infinity only
  /// when `infinity_allowed` is set.
  struct Range
  {
    double lower            = -std::numeric_limits<double>::infinity();
    bool   lower_inclusive  = true;
    double upper            = std::numeric_limits<double>::infinity();
    bool   upper_inclusive  = true;
    bool   infinity_allowed = false;

    static Range above(double lower);    ///< (lower, inf)
    static Range at_least(double lower); ///< [lower, inf)
    static Range any();                  ///< any finite real
    static Range closed(double lower, double upper); ///< [lower, upper]

    /// The same range, also accepting +infinity.
    Range or_infinite() const;

    bool        contains(double value) const;
    std::string describe() const; ///< e.g. "a finite real number > 0"
  };

  /// Marks a parameter that has no default and must be given.
  inline constexpr double required = std::numeric_limits<double>::quiet_NaN();

  /// One row of a parameter table.
  struct ParameterInfo
  {
    std::string key;     ///< name in case files, in the words of the trade
    std::string symbol;  ///< symbol in the formula, e.g. "eta_0"
    std::string unit;    ///< SI unit, "-" if dimensionless
    std::string meaning; ///< one sentence
    Range       range;
    double      default_value = required; ///< NaN: must be given

    bool has_default() const { return default_value == default_value; }
  };

  /// Parameter values by key, as read from a case file or a fit.
  using ParameterValues = std::map<std::string, double>;

  /// Checks `values` against `table`: every key known, every value in range,
  /// every parameter without default present. Returns the values completed by
  /// defaults, in table order. Throws InvalidParameter naming the first problem.
  std::vector<double> resolve_parameters(const std::vector<ParameterInfo> &table,
                                         const ParameterValues &values,
                                         const std::string &owner);
} // namespace lentus::rheology
