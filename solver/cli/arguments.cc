#include "solver/cli/arguments.h"

#include "solver/errors.h"
#include "solver/input/value_kind.h"

#include <cmath>

namespace lentus::cli
{
  Arguments parse_arguments(const int argc,
                            const char *const *argv,
                            const int first,
                            const std::set<std::string> &valued,
                            const std::set<std::string> &switches)
  {
    Arguments arguments;
    for (int i = first; i < argc; ++i)
      {
        std::string word = argv[i];
        if (word.rfind("--", 0) != 0 || word == "--")
          {
            arguments.positional.push_back(word);
            continue;
          }
        std::string value;
        bool        inline_value = false;
        if (const auto equals = word.find('='); equals != std::string::npos && word.rfind("--set", 0) != 0)
          {
            value        = word.substr(equals + 1);
            word         = word.substr(0, equals);
            inline_value = true;
          }
        if (word == "--set" || valued.count(word))
          {
            if (!inline_value)
              {
                if (i + 1 >= argc)
                  throw InputError("command line", 0, word + ": needs a value");
                value = argv[++i];
              }
            if (word == "--set")
              arguments.sets.push_back(value);
            else
              arguments.options[word] = value;
          }
        else if (switches.count(word) && !inline_value)
          arguments.flags.insert(word);
        else
          {
            std::string allowed;
            for (const auto &option : valued)
              allowed += (allowed.empty() ? "" : ", ") + option + " VALUE";
            for (const auto &option : switches)
              allowed += (allowed.empty() ? "" : ", ") + option;
            throw InputError("command line", 0,
                             "unknown option " + word + "; allowed: " + (allowed.empty() ? "none" : allowed));
          }
      }
    return arguments;
  }

  std::optional<double> Arguments::optional_real(const std::string &name, const rheology::Range &range) const
  {
    const auto found = options.find(name);
    if (found == options.end())
      return std::nullopt;
    const auto value = input::parse_real(found->second);
    if (!value || !range.contains(*value))
      throw InputError("command line", 0,
                       name + " = " + found->second + ": " + (value ? "out of range" : "not a real number") +
                         "; allowed: " + range.describe());
    return value;
  }

  double Arguments::real(const std::string &name, const double fallback, const rheology::Range &range) const
  {
    const auto value = optional_real(name, range);
    return value ? *value : fallback;
  }

  long Arguments::integer(const std::string &name, const long fallback, const long lower, const long upper) const
  {
    const auto found = options.find(name);
    if (found == options.end())
      return fallback;
    const auto value = input::parse_real(found->second);
    if (!value || std::floor(*value) != *value || *value < lower || *value > upper)
      throw InputError("command line", 0,
                       name + " = " + found->second + ": not an integer in range; allowed: an integer from " +
                         std::to_string(lower) + " to " + std::to_string(upper));
    return static_cast<long>(*value);
  }
} // namespace lentus::cli
