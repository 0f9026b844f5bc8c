// The caution of solver/report/caution.h laid out for text outputs: help screens,
// comment lines of a written case file, the end of a command's output.
#pragma once

#include <cstddef>
#include <string>

namespace lentus::report
{
  /// "Caution: " and the full caution, wrapped at word boundaries into lines of at most
  /// `width` characters, each starting with `prefix` (e.g. "# ") and ending with '\n'.
  std::string caution_lines(const std::string &prefix = "", std::size_t width = 88);
} // namespace lentus::report
