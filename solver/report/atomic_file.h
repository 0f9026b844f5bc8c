// Files appear whole or not at all: written under a temporary name in the
// same folder, then renamed.
#pragma once

#include <string>

namespace lentus::report
{
  /// A temporary name next to `path` (same folder, so rename is atomic).
  std::string temporary_name_for(const std::string &path);

  /// Writes `content` to `path` atomically; throws std::runtime_error naming the path.
  void write_file_atomically(const std::string &path, const std::string &content);

  /// Renames `from` to `to`; throws std::runtime_error naming both.
  void rename_file(const std::string &from, const std::string &to);
} // namespace lentus::report
