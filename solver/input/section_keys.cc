#include "solver/input/section_keys.h"

#include <cmath>

namespace lentus::input
{
  std::string default_text(const double value)
  {
    std::string text = rheology::format_value(value);
    for (const char *exponent : {"e-0", "e+0"})
      if (const auto at = text.find(exponent); at != std::string::npos)
        text.erase(at + 2, 1);
    if (const auto at = text.find("e+"); at != std::string::npos)
      text.erase(at + 1, 1);
    return text;
  }

  SectionKeys SectionKeys::declaring(CaseSchema &schema, const std::string &section)
  {
    return SectionKeys(&schema, nullptr, section);
  }

  SectionKeys SectionKeys::reading(const CaseFile &file, const std::string &section)
  {
    return SectionKeys(nullptr, &file, section);
  }

  std::optional<std::string> SectionKeys::bind(const std::string &key, const std::string &default_value,
                                               const ValueKind &kind, const std::string &meaning)
  {
    if (schema)
      {
        schema->declare(path(key), default_value, kind, meaning);
        return std::nullopt;
      }
    if (!file->is_set(path(key)))
      return std::nullopt;
    return file->get(path(key));
  }

  void SectionKeys::real(const std::string &key, double &value, const rheology::Range &range,
                         const std::string &meaning)
  {
    if (bind(key, default_text(value), ValueKind::real(range), meaning))
      value = file->get_real(path(key));
  }

  void SectionKeys::optional_real(const std::string &key, std::optional<double> &value,
                                  const rheology::Range &range, const std::string &meaning)
  {
    if (bind(key, value ? default_text(*value) : "", ValueKind::real(range), meaning))
      value = file->get_real(path(key));
  }

  void SectionKeys::integer(const std::string &key, unsigned int &value, const long lower, const long upper,
                            const std::string &meaning)
  {
    if (bind(key, std::to_string(value), ValueKind::integer(lower, upper), meaning))
      value = static_cast<unsigned int>(file->get_real(path(key)));
  }

  void SectionKeys::boolean(const std::string &key, bool &value, const std::string &meaning)
  {
    if (const auto given = bind(key, value ? "true" : "false", ValueKind::boolean(), meaning))
      value = *given == "true";
  }

  void SectionKeys::text(const std::string &key, std::string &value, const std::string &meaning)
  {
    if (const auto given = bind(key, value, ValueKind::text(), meaning))
      value = *given;
  }

  void SectionKeys::selection(const std::string &key, std::string &value, const std::vector<std::string> &choices,
                              const std::string &meaning)
  {
    if (const auto given = bind(key, value, ValueKind::selection(choices), meaning))
      value = *given;
  }

  void SectionKeys::names(const std::string &key, std::vector<std::string> &value, const std::string &meaning)
  {
    std::string joined;
    for (const std::string &name : value)
      joined += (joined.empty() ? "" : ", ") + name;
    if (const auto given = bind(key, joined, ValueKind::text(), meaning))
      value = split_list(*given);
  }

  void SectionKeys::reals(const std::string &key, std::vector<double> &value, const rheology::Range &range,
                          const std::string &meaning, const std::optional<std::size_t> count)
  {
    std::string joined;
    for (const double number : value)
      joined += (joined.empty() ? "" : ", ") + default_text(number);
    if (const auto given = bind(key, joined, ValueKind::real_list(range), meaning))
      {
        value.clear();
        for (const std::string &item : split_list(*given))
          value.push_back(*parse_real(item));
        if (count && value.size() != *count)
          file->fail(path(key), "needs " + std::to_string(*count) + " values, not " + std::to_string(value.size()),
                     std::to_string(*count) + " real numbers separated by commas");
      }
  }
} // namespace lentus::input
