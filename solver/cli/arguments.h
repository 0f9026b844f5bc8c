// A small command-line reader: positional arguments, `--name value` options,
// flags and repeated `--set Section/Key=value` overrides.
#pragma once

#include "rheology/parameter_table.h"

#include <map>
#include <optional>
#include <set>
#include <string>
#include <vector>

namespace lentus::cli
{
  struct Arguments
  {
    std::vector<std::string>           positional;
    std::map<std::string, std::string> options; ///< "--from" -> "1e-3"
    std::set<std::string>              flags;   ///< "--help"
    std::vector<std::string>           sets;    ///< values of repeated --set

    /// The real value of option `name`, `fallback` if absent; throws
    /// InputError if it is not a number in `range`.
    double real(const std::string &name, double fallback, const rheology::Range &range) const;
    std::optional<double> optional_real(const std::string &name, const rheology::Range &range) const;
    /// The integer value of option `name` in [lower, upper].
    long integer(const std::string &name, long fallback, long lower, long upper) const;
    bool has(const std::string &flag) const { return flags.count(flag) > 0; }
  };

  /// Reads argv[first..argc). `valued` options take a value, `switches` do
  /// not; "--set" is always accepted. Throws InputError for anything else.
  Arguments parse_arguments(int argc,
                            const char *const *argv,
                            int first,
                            const std::set<std::string> &valued,
                            const std::set<std::string> &switches);
} // namespace lentus::cli
