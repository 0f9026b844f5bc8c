// Case files in deal.II's ParameterHandler format, checked against a schema
// of our own so that every problem is reported with file, line, key, the value
// found and what is allowed.
#pragma once

#include "solver/input/value_kind.h"

#include <map>
#include <memory>
#include <string>
#include <utility>
#include <vector>

namespace lentus::input
{
  /// One declared key; `path` is "Section/Subsection/Key".
  struct KeyDeclaration
  {
    std::string path;
    std::string default_value; ///< "" means "not set" (required where used)
    ValueKind   kind;
    std::string documentation; ///< meaning and unit
  };

  /// Throws InputError (file, line, key) unless `value` suits the key. An empty value is bad input
  /// too: it would silently stand for the default or for "not set", which its writer cannot have meant.
  void check_value(const std::string &file, int line, const KeyDeclaration &declaration, const std::string &value);

  /// Every section and key a case file may contain.
  class CaseSchema
  {
  public:
    /// Declares a key. `path` is "Section/.../Key".
    void declare(const std::string &path,
                 const std::string &default_value,
                 const ValueKind &kind,
                 const std::string &documentation);

    const KeyDeclaration *find(const std::string &path) const;
    bool                  has_section(const std::string &section_path) const;
    std::vector<std::string> keys_in(const std::string &section_path) const;
    std::vector<std::string> subsections_in(const std::string &section_path) const;
    const std::vector<KeyDeclaration> &keys() const { return declarations; }

  private:
    std::vector<KeyDeclaration> declarations;
  };

  /// A parsed and validated case file. Paths are "Section/.../Key".
  class CaseFile
  {
  public:
    /// Reads `file`, checks syntax, sections, keys and value kinds, applies
    /// `overrides` ("Section/Key=value", from the command line).
    /// Throws InputError naming file, line and key.
    static CaseFile read(const std::string &file,
                         const CaseSchema &schema,
                         const std::vector<std::string> &overrides = {});

    /// The same from text; `name` stands for the file in messages.
    static CaseFile parse(const std::string &text,
                          const std::string &name,
                          const CaseSchema &schema,
                          const std::vector<std::string> &overrides = {});

    /// True if the key was given a non-empty value in the file or an override.
    bool is_set(const std::string &path) const;

    /// The value given, else the declared default.
    std::string get(const std::string &path) const;

    /// The value as a real number; throws InputError if it is not set.
    double get_real(const std::string &path) const;

    /// The schema's declaration of a key (its kind, default and meaning).
    const KeyDeclaration &declaration(const std::string &path) const;

    /// Line of the key's `set`; else of its section's `subsection`; else 0.
    int line_of(const std::string &path) const;

    /// Where a key's value came from: the file and the line of its `set`, or
    /// InputError::command_line_overrides and 0.
    std::pair<std::string, int> place_of(const std::string &path) const;

    /// Throws InputError "file:line: path = value: problem; allowed: allowed".
    [[noreturn]] void fail(const std::string &path, const std::string &problem, const std::string &allowed) const;

    const std::string &file_name() const { return name; }

    /// The complete case (every declared key with its value) in the same format.
    std::string complete_text() const;

  private:
    struct Given
    {
      std::string value;
      int         line; ///< 0 for command-line overrides
    };

    std::string                        name;
    const CaseSchema                  *schema = nullptr;
    std::map<std::string, Given>       given;
    std::map<std::string, int>         section_lines;
  };
} // namespace lentus::input
