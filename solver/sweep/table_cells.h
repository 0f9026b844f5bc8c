// Cells of the sweep's tables, shared by results.csv/.jsonl and fluid_uncertainty.csv/.jsonl.
#pragma once

#include <nlohmann/json_fwd.hpp>

#include <string>

namespace lentus::sweep
{
  /// A number as the tables print it (10 significant digits); "" if it is not finite.
  std::string number_text(double value);

  /// A cell per RFC 4180: quoted when it holds a comma, a quote or a line break; quotes doubled.
  std::string csv_cell(const std::string &text);

  /// A varied value in JSON: a number if it reads as one (an integer if it is one), else the text.
  nlohmann::ordered_json json_value(const std::string &text);
} // namespace lentus::sweep
