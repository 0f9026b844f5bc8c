// JSON output through one library (nlohmann-json, ordered so keys keep the order
// they were set in): the number format the results files share, and the text.
#pragma once

#include <nlohmann/json_fwd.hpp>

#include <string>

namespace lentus::report
{
  /// `value` rounded to 10 significant digits (the precision of the results table's CSV),
  /// or null if it is not finite (JSON has no NaN or infinity).
  nlohmann::ordered_json json_number(double value);

  /// The text of `value`: indented by 2 (one key per line) or on one line (JSON lines).
  /// Strings are escaped by the library (control characters as \n, \t or \u00XX); bytes that
  /// are not UTF-8 become U+FFFD instead of failing.
  std::string json_text(const nlohmann::ordered_json &value, bool indented);
} // namespace lentus::report
