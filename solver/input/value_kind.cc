#include "solver/input/value_kind.h"

#include <algorithm>
#include <cctype>
#include <cerrno>
#include <cmath>
#include <cstdlib>

namespace lentus::input
{
  ValueKind ValueKind::real(const rheology::Range &range)
  {
    ValueKind kind;
    kind.type  = Type::real;
    kind.range = range;
    return kind;
  }

  ValueKind ValueKind::integer(const long lower, const long upper)
  {
    ValueKind kind;
    kind.type        = Type::integer;
    kind.range.lower = static_cast<double>(lower);
    kind.range.upper = static_cast<double>(upper);
    return kind;
  }

  ValueKind ValueKind::selection(const std::vector<std::string> &choices)
  {
    ValueKind kind;
    kind.type    = Type::selection;
    kind.choices = choices;
    return kind;
  }

  ValueKind ValueKind::boolean()
  {
    ValueKind kind;
    kind.type = Type::boolean;
    return kind;
  }

  ValueKind ValueKind::text()
  {
    return ValueKind();
  }

  ValueKind ValueKind::real_list(const rheology::Range &range)
  {
    ValueKind kind;
    kind.type  = Type::real_list;
    kind.range = range;
    return kind;
  }

  std::string trim(const std::string &text)
  {
    const auto first = text.find_first_not_of(" \t\r\n");
    if (first == std::string::npos)
      return "";
    const auto last = text.find_last_not_of(" \t\r\n");
    return text.substr(first, last - first + 1);
  }

  std::optional<double> parse_real(const std::string &raw)
  {
    const std::string text = trim(raw);
    if (text.empty())
      return std::nullopt;
    // strtod also reads hexadecimal and "nan"; a case file should not.
    for (const char c : text)
      if (!(std::isdigit(static_cast<unsigned char>(c)) || c == '.' || c == '-' || c == '+' || c == 'e' ||
            c == 'E' || c == 'i' || c == 'n' || c == 'f' || c == 'I' || c == 'N' || c == 'F'))
        return std::nullopt;
    errno          = 0;
    char        *end = nullptr;
    const double value = std::strtod(text.c_str(), &end);
    if (end != text.c_str() + text.size() || std::isnan(value) || (errno == ERANGE && std::isinf(value)))
      return std::nullopt;
    return value;
  }

  std::vector<std::string> split_list(const std::string &text)
  {
    std::vector<std::string> items;
    std::size_t              start = 0;
    while (start <= text.size())
      {
        const auto comma = text.find(',', start);
        const auto end   = comma == std::string::npos ? text.size() : comma;
        items.push_back(trim(text.substr(start, end - start)));
        if (comma == std::string::npos)
          break;
        start = comma + 1;
      }
    if (items.size() == 1 && items[0].empty())
      items.clear();
    return items;
  }

  std::optional<std::string> ValueKind::problem(const std::string &raw) const
  {
    const std::string value = trim(raw);
    switch (type)
      {
        case Type::text:
          return std::nullopt;
        case Type::boolean:
          if (value == "true" || value == "false")
            return std::nullopt;
          return std::string("not a truth value");
        case Type::selection:
          if (std::find(choices.begin(), choices.end(), value) != choices.end())
            return std::nullopt;
          return std::string("not a known choice");
        case Type::integer:
          {
            const auto number = parse_real(value);
            if (!number || std::floor(*number) != *number)
              return std::string("not an integer");
            if (!range.contains(*number))
              return std::string("out of range");
            return std::nullopt;
          }
        case Type::real:
          {
            const auto number = parse_real(value);
            if (!number)
              return std::string("not a real number");
            if (!range.contains(*number))
              return std::string("out of range");
            return std::nullopt;
          }
        case Type::real_list:
          {
            const auto items = split_list(value);
            if (items.empty())
              return std::string("an empty list");
            for (const std::string &item : items)
              {
                const auto number = parse_real(item);
                if (!number)
                  return "item '" + item + "' is not a real number";
                if (!range.contains(*number))
                  return "item '" + item + "' is out of range";
              }
            return std::nullopt;
          }
      }
    return std::nullopt;
  }

  std::string ValueKind::describe() const
  {
    switch (type)
      {
        case Type::text:
          return "any text";
        case Type::boolean:
          return "true or false";
        case Type::selection:
          {
            std::string list;
            for (const std::string &choice : choices)
              list += (list.empty() ? "" : ", ") + choice;
            return "one of " + list;
          }
        case Type::integer:
          return "an integer from " + rheology::format_value(range.lower) + " to " +
                 rheology::format_value(range.upper);
        case Type::real:
          return range.describe();
        case Type::real_list:
          return "a comma-separated list of " + range.describe() + " values";
      }
    return "";
  }

  std::size_t edit_distance(const std::string &a, const std::string &b)
  {
    std::vector<std::size_t> previous(b.size() + 1), current(b.size() + 1);
    for (std::size_t j = 0; j <= b.size(); ++j)
      previous[j] = j;
    for (std::size_t i = 1; i <= a.size(); ++i)
      {
        current[0] = i;
        for (std::size_t j = 1; j <= b.size(); ++j)
          {
            const bool same = std::tolower(static_cast<unsigned char>(a[i - 1])) ==
                              std::tolower(static_cast<unsigned char>(b[j - 1]));
            current[j] = std::min({previous[j] + 1, current[j - 1] + 1, previous[j - 1] + (same ? 0 : 1)});
          }
        std::swap(previous, current);
      }
    return previous[b.size()];
  }
} // namespace lentus::input
