// The keys of one case-file section, written once. A section's struct has one member function
//
//   void bind(SectionKeys &keys)
//   {
//     keys.real("Relative tolerance", relative_tolerance, Range::above(0.), "... [-].");
//     keys.choice("Type", type, {{"automatic", Type::automatic}, {"direct", Type::direct}}, "...");
//   }
//
// that both declares the keys in the schema (the member's initial value is the default, as
// deal.II's ParameterHandler::add_parameter does) and reads them from a checked case file into the
// members. A key, its kind, default, meaning and unit therefore live in one line.
#pragma once

#include "solver/input/case_file.h"

#include <algorithm>
#include <optional>
#include <string>
#include <utility>
#include <vector>

namespace lentus::input
{
  class SectionKeys
  {
  public:
    /// Declares the keys of `section` ("Nonlinear solver", "Geometry/Gmsh mesh") in `schema`.
    static SectionKeys declaring(CaseSchema &schema, const std::string &section);
    /// Reads the keys of `section` from `file` into the members bound.
    static SectionKeys reading(const CaseFile &file, const std::string &section);

    /// "Section/Key" of a key of this section.
    std::string path(const std::string &key) const { return section + "/" + key; }

    void real(const std::string &key, double &value, const rheology::Range &range, const std::string &meaning);
    /// A real number with no default; nullopt when the file does not set it.
    void optional_real(const std::string &key, std::optional<double> &value, const rheology::Range &range,
                       const std::string &meaning);
    void integer(const std::string &key, unsigned int &value, long lower, long upper, const std::string &meaning);
    void boolean(const std::string &key, bool &value, const std::string &meaning);
    /// Free text; an empty default means "not set".
    void text(const std::string &key, std::string &value, const std::string &meaning);
    /// One of `choices`, kept as text; an empty default means "not set".
    void selection(const std::string &key, std::string &value, const std::vector<std::string> &choices,
                   const std::string &meaning);
    /// Comma-separated names (e.g. boundary roles); empty by default.
    void names(const std::string &key, std::vector<std::string> &value, const std::string &meaning);
    /// Comma-separated real numbers; with `count`, exactly that many.
    void reals(const std::string &key, std::vector<double> &value, const rheology::Range &range,
               const std::string &meaning, std::optional<std::size_t> count = std::nullopt);

    /// One of named choices, e.g. an enum or std::optional<unsigned int> with "automatic" for nullopt.
    template <class T>
    void choice(const std::string &key, T &value, const std::vector<std::pair<std::string, T>> &choices,
                const std::string &meaning)
    {
      std::vector<std::string> words;
      std::string              current;
      for (const auto &[word, choice_value] : choices)
        {
          words.push_back(word);
          if (choice_value == value)
            current = word;
        }
      if (schema)
        {
          if (current.empty())
            throw std::logic_error("default of " + path(key) + " is none of its choices");
          schema->declare(path(key), current, ValueKind::selection(words), meaning);
          return;
        }
      if (!file->is_set(path(key)))
        return;
      const std::string given = file->get(path(key));
      for (const auto &[word, choice_value] : choices)
        if (word == given)
          value = choice_value;
    }

    /// A comma-separated list of named choices (each at most once), e.g. a list of enums.
    template <class T>
    void choices(const std::string &key, std::vector<T> &value, const std::vector<std::pair<std::string, T>> &words,
                 const std::string &meaning)
    {
      std::vector<std::string> given, allowed;
      for (const auto &[word, choice_value] : words)
        {
          allowed.push_back(word);
          for (const T &chosen : value)
            if (chosen == choice_value)
              given.push_back(word);
        }
      std::string listed;
      for (const std::string &word : allowed)
        listed += (listed.empty() ? "" : ", ") + word;
      names(key, given, meaning + " Choices: " + listed + ".");
      if (schema)
        return;
      std::vector<T> chosen;
      for (const std::string &word : given)
        {
          const auto found = std::find_if(words.begin(), words.end(), [&](const auto &entry) { return entry.first == word; });
          if (found == words.end())
            file->fail(path(key), "'" + word + "' is not one of the choices", "a comma-separated list of: " + listed);
          if (std::find(chosen.begin(), chosen.end(), found->second) != chosen.end())
            file->fail(path(key), "'" + word + "' is listed twice", "each of " + listed + " at most once");
          chosen.push_back(found->second);
        }
      value = chosen;
    }

  private:
    SectionKeys(CaseSchema *schema_, const CaseFile *file_, std::string section_)
      : schema(schema_)
      , file(file_)
      , section(std::move(section_))
    {}

    /// Declares (with the default text) or returns the text given; nullopt when not given.
    std::optional<std::string> bind(const std::string &key, const std::string &default_text, const ValueKind &kind,
                                    const std::string &meaning);

    CaseSchema      *schema = nullptr;
    const CaseFile  *file   = nullptr;
    std::string      section;
  };

  /// A section struct's keys declared in `schema`, from a default-constructed struct.
  template <class Section>
  void declare_section(CaseSchema &schema, const std::string &name)
  {
    Section     defaults;
    SectionKeys keys = SectionKeys::declaring(schema, name);
    defaults.bind(keys);
  }

  /// A section struct read from `file`: its defaults, overwritten by what the file sets.
  template <class Section>
  Section read_section(const CaseFile &file, const std::string &name)
  {
    Section     section;
    SectionKeys keys = SectionKeys::reading(file, name);
    section.bind(keys);
    return section;
  }

  /// A real number as a default in the schema: the shortest text that reads back exactly, with the
  /// exponent written plainly ("1e-8", not "1e-08").
  std::string default_text(double value);
} // namespace lentus::input
