// What a case-file value may be, with a check that explains a rejection.
#pragma once

#include "rheology/parameter_table.h"

#include <optional>
#include <string>
#include <vector>

namespace lentus::input
{
  /// The kind and allowed values of one case-file key.
  struct ValueKind
  {
    enum class Type
    {
      real,
      integer,
      selection,
      boolean,
      text,
      real_list
    };

    Type                     type = Type::text;
    rheology::Range          range;   ///< real, integer, real_list
    std::vector<std::string> choices; ///< selection

    static ValueKind real(const rheology::Range &range);
    static ValueKind integer(long lower, long upper);
    static ValueKind selection(const std::vector<std::string> &choices);
    static ValueKind boolean();
    static ValueKind text();
    static ValueKind real_list(const rheology::Range &range);

    /// nullopt if `value` is acceptable, else what is wrong.
    std::optional<std::string> problem(const std::string &value) const;

    /// What is allowed, e.g. "a finite real number > 0" or "one of a, b".
    std::string describe() const;
  };

  /// Parses a whole string as a real number ("inf" accepted); nullopt if it is not one.
  std::optional<double> parse_real(const std::string &text);

  /// Splits a comma-separated list and trims each item.
  std::vector<std::string> split_list(const std::string &text);

  /// Removes leading and trailing white space.
  std::string trim(const std::string &text);

  /// Levenshtein distance, case-insensitive, for "did you mean" hints.
  std::size_t edit_distance(const std::string &a, const std::string &b);
} // namespace lentus::input
