#include "solver/input/case_file.h"

#include "solver/errors.h"

#include <deal.II/base/parameter_handler.h>

#include <algorithm>
#include <fstream>
#include <limits>
#include <sstream>

namespace lentus::input
{
  namespace
  {
    std::string parent_of(const std::string &path)
    {
      const auto slash = path.rfind('/');
      return slash == std::string::npos ? std::string() : path.substr(0, slash);
    }

    std::string leaf_of(const std::string &path)
    {
      const auto slash = path.rfind('/');
      return slash == std::string::npos ? path : path.substr(slash + 1);
    }

    std::string join(const std::vector<std::string> &items)
    {
      std::string list;
      for (const std::string &item : items)
        list += (list.empty() ? "" : ", ") + item;
      return list.empty() ? "(none)" : list;
    }

    /// " (did you mean 'x'?)" when one candidate is close to `word`.
    std::string suggestion(const std::string &word, const std::vector<std::string> &candidates)
    {
      std::string best;
      std::size_t best_distance = 4;
      for (const std::string &candidate : candidates)
        {
          const std::size_t distance = edit_distance(word, candidate);
          if (distance < best_distance)
            {
              best          = candidate;
              best_distance = distance;
            }
        }
      return best.empty() ? "" : " (did you mean '" + best + "'?)";
    }

    std::string describe_section(const std::string &section)
    {
      return section.empty() ? "the top level" : "subsection " + section;
    }

    /// Declares the schema in a ParameterHandler (all values as text; the
    /// schema does the checking) so that the file also passes deal.II's parser.
    void declare_in(dealii::ParameterHandler &prm, const CaseSchema &schema)
    {
      for (const KeyDeclaration &key : schema.keys())
        {
          std::vector<std::string> sections;
          std::string              rest = key.path;
          for (auto slash = rest.find('/'); slash != std::string::npos; slash = rest.find('/'))
            {
              sections.push_back(rest.substr(0, slash));
              rest = rest.substr(slash + 1);
            }
          for (const std::string &section : sections)
            prm.enter_subsection(section);
          prm.declare_entry(rest, key.default_value, dealii::Patterns::Anything(),
                            key.documentation + " Allowed: " + key.kind.describe() + ".");
          for (std::size_t i = 0; i < sections.size(); ++i)
            prm.leave_subsection();
        }
    }
  } // namespace

  void check_value(const std::string &file, const int line, const KeyDeclaration &declaration,
                   const std::string &value)
  {
    if (value.empty())
      throw InputError(file, line, declaration.path,
                       declaration.path + " = (empty): no value; allowed: " + declaration.kind.describe() +
                         (declaration.default_value.empty() ? std::string() :
                                                              std::string(file == InputError::command_line_overrides ?
                                                                            " (or leave out this --set" :
                                                                            " (or remove the line") +
                                                                " for the default, " + declaration.default_value + ")"));
    if (const auto problem = declaration.kind.problem(value))
      throw InputError(file, line, declaration.path,
                       declaration.path + " = " + value + ": " + *problem + "; allowed: " +
                         declaration.kind.describe());
  }

  void CaseSchema::declare(const std::string &path,
                           const std::string &default_value,
                           const ValueKind &kind,
                           const std::string &documentation)
  {
    if (find(path))
      throw std::logic_error("case-file key declared twice: " + path);
    declarations.push_back({path, default_value, kind, documentation});
  }

  const KeyDeclaration *CaseSchema::find(const std::string &path) const
  {
    for (const KeyDeclaration &key : declarations)
      if (key.path == path)
        return &key;
    return nullptr;
  }

  bool CaseSchema::has_section(const std::string &section_path) const
  {
    if (section_path.empty())
      return true;
    for (const KeyDeclaration &key : declarations)
      if (key.path.compare(0, section_path.size() + 1, section_path + "/") == 0)
        return true;
    return false;
  }

  std::vector<std::string> CaseSchema::keys_in(const std::string &section_path) const
  {
    std::vector<std::string> keys;
    for (const KeyDeclaration &key : declarations)
      if (parent_of(key.path) == section_path)
        keys.push_back(leaf_of(key.path));
    return keys;
  }

  std::vector<std::string> CaseSchema::subsections_in(const std::string &section_path) const
  {
    std::vector<std::string> sections;
    const std::string        prefix = section_path.empty() ? "" : section_path + "/";
    for (const KeyDeclaration &key : declarations)
      {
        if (key.path.compare(0, prefix.size(), prefix) != 0)
          continue;
        const std::string rest  = key.path.substr(prefix.size());
        const auto        slash = rest.find('/');
        if (slash == std::string::npos)
          continue;
        const std::string name = rest.substr(0, slash);
        if (std::find(sections.begin(), sections.end(), name) == sections.end())
          sections.push_back(name);
      }
    return sections;
  }

  CaseFile CaseFile::read(const std::string &file,
                          const CaseSchema &schema,
                          const std::vector<std::string> &overrides)
  {
    std::ifstream input(file);
    if (!input)
      throw InputError(file, 0, "cannot open the case file for reading");
    std::stringstream text;
    text << input.rdbuf();
    return parse(text.str(), file, schema, overrides);
  }

  CaseFile CaseFile::parse(const std::string &text,
                           const std::string &name,
                           const CaseSchema &schema,
                           const std::vector<std::string> &overrides)
  {
    CaseFile result;
    result.name   = name;
    result.schema = &schema;

    std::vector<std::pair<std::string, int>> open; // section path, line
    std::istringstream                        stream(text);
    std::string                               raw;
    int                                       line_number = 0;
    while (std::getline(stream, raw))
      {
        ++line_number;
        const int first_line = line_number;
        // Comments start at '#'; a trailing backslash continues the line.
        std::string line = raw.substr(0, raw.find('#'));
        while (!trim(line).empty() && trim(line).back() == '\\' && std::getline(stream, raw))
          {
            ++line_number;
            line = trim(line);
            line.pop_back();
            line += " " + trim(raw.substr(0, raw.find('#')));
          }
        line = trim(line);
        if (line.empty())
          continue;

        const std::string current = open.empty() ? std::string() : open.back().first;
        const auto        space   = line.find_first_of(" \t");
        const std::string keyword = line.substr(0, space);
        const std::string rest    = space == std::string::npos ? "" : trim(line.substr(space));

        if (keyword == "subsection")
          {
            const std::string section = current.empty() ? rest : current + "/" + rest;
            if (rest.empty())
              throw InputError(name, first_line, "'subsection' needs a name");
            if (!schema.has_section(section))
              {
                const auto known = schema.subsections_in(current);
                throw InputError(name, first_line,
                                 "unknown subsection '" + rest + "' in " + describe_section(current) +
                                   suggestion(rest, known) + "; allowed: " + join(known));
              }
            open.emplace_back(section, first_line);
            result.section_lines.emplace(section, first_line);
          }
        else if (keyword == "end")
          {
            if (open.empty())
              throw InputError(name, first_line, "'end' without a matching 'subsection'");
            open.pop_back();
          }
        else if (keyword == "set")
          {
            const auto equals = rest.find('=');
            if (equals == std::string::npos)
              throw InputError(name, first_line, "expected 'set Key = value'");
            const std::string key   = trim(rest.substr(0, equals));
            const std::string value = trim(rest.substr(equals + 1));
            const std::string path  = current.empty() ? key : current + "/" + key;
            const KeyDeclaration *declaration = schema.find(path);
            if (!declaration)
              {
                const auto known = schema.keys_in(current);
                throw InputError(name, first_line, path,
                                 path + ": unknown key in " + describe_section(current) + suggestion(key, known) +
                                   "; allowed keys: " + join(known));
              }
            const auto previous = result.given.find(path);
            if (previous != result.given.end())
              throw InputError(name, first_line, path,
                               path + ": set twice (first on line " + std::to_string(previous->second.line) +
                                 "); keep one");
            check_value(name, first_line, *declaration, value);
            result.given[path] = {value, first_line};
          }
        else if (keyword == "include")
          throw InputError(name, first_line, "'include' is not supported; write the case in one file");
        else
          throw InputError(name, first_line,
                           "cannot read '" + line + "'; expected 'subsection Name', 'set Key = value' or 'end'");
      }
    if (!open.empty())
      throw InputError(name, open.back().second,
                       "subsection " + open.back().first + " is not closed by 'end'");

    for (const std::string &assignment : overrides)
      {
        const std::string where  = InputError::command_line_overrides;
        const auto        equals = assignment.find('=');
        if (equals == std::string::npos)
          throw InputError(where, 0, assignment + ": expected --set Section/Key=value");
        const std::string     path        = trim(assignment.substr(0, equals));
        const std::string     value       = trim(assignment.substr(equals + 1));
        const KeyDeclaration *declaration = schema.find(path);
        if (!declaration)
          {
            std::vector<std::string> all;
            std::string              same_leaf;
            for (const KeyDeclaration &key : schema.keys())
              {
                all.push_back(key.path);
                if (same_leaf.empty() && path.size() < key.path.size() &&
                    key.path.compare(key.path.size() - path.size(), path.size(), path) == 0 &&
                    key.path[key.path.size() - path.size() - 1] == '/')
                  same_leaf = " (did you mean '" + key.path + "'?)";
              }
            throw InputError(where, 0, path,
                             path + ": unknown key" + (same_leaf.empty() ? suggestion(path, all) : same_leaf) +
                               "; keys are written Section/Subsection/Key as in the case file");
          }
        check_value(where, 0, *declaration, value);
        result.given[path] = {value, 0};
      }

    // The file must also be accepted by deal.II's own reader of the format.
    dealii::ParameterHandler prm;
    declare_in(prm, schema);
    try
      {
        prm.parse_input_from_string(text, name);
      }
    catch (const dealii::ExceptionBase &error)
      {
        std::ostringstream info;
        error.print_info(info);
        throw InputError(name, 0, trim(info.str()));
      }
    return result;
  }

  bool CaseFile::is_set(const std::string &path) const
  {
    const auto found = given.find(path);
    return found != given.end() && !found->second.value.empty();
  }

  std::string CaseFile::get(const std::string &path) const
  {
    const auto found = given.find(path);
    if (found != given.end())
      return found->second.value;
    const KeyDeclaration *declaration = schema->find(path);
    if (!declaration)
      throw std::logic_error("undeclared case-file key " + path);
    return declaration->default_value;
  }

  double CaseFile::get_real(const std::string &path) const
  {
    const std::string value = get(path);
    if (value.empty())
      fail(path, "missing", schema->find(path)->kind.describe() + " (" + schema->find(path)->documentation + ")");
    const auto number = parse_real(value);
    if (!number)
      fail(path, "not a real number", schema->find(path)->kind.describe());
    return *number;
  }

  const KeyDeclaration &CaseFile::declaration(const std::string &path) const
  {
    const KeyDeclaration *found = schema->find(path);
    if (!found)
      throw std::logic_error("undeclared case-file key " + path);
    return *found;
  }

  int CaseFile::line_of(const std::string &path) const
  {
    const auto found = given.find(path);
    if (found != given.end())
      return found->second.line;
    for (std::string section = parent_of(path); !section.empty(); section = parent_of(section))
      {
        const auto opened = section_lines.find(section);
        if (opened != section_lines.end())
          return opened->second;
      }
    return 0;
  }

  std::pair<std::string, int> CaseFile::place_of(const std::string &path) const
  {
    const auto found             = given.find(path);
    const bool from_command_line = found != given.end() && found->second.line == 0;
    return {from_command_line ? InputError::command_line_overrides : name, from_command_line ? 0 : line_of(path)};
  }

  void CaseFile::fail(const std::string &path, const std::string &problem, const std::string &allowed) const
  {
    const auto [where, line] = place_of(path);
    std::string value        = get(path);
    throw InputError(where, line, path,
                     path + " = " + (value.empty() ? std::string("(not set)") : value) + ": " + problem +
                       "; allowed: " + allowed);
  }

  std::string CaseFile::complete_text() const
  {
    dealii::ParameterHandler prm;
    declare_in(prm, *schema);
    for (const auto &[path, value] : given)
      {
        std::vector<std::string> sections;
        std::string              rest = path;
        for (auto slash = rest.find('/'); slash != std::string::npos; slash = rest.find('/'))
          {
            sections.push_back(rest.substr(0, slash));
            rest = rest.substr(slash + 1);
          }
        for (const std::string &section : sections)
          prm.enter_subsection(section);
        prm.set(rest, value.value);
        for (std::size_t i = 0; i < sections.size(); ++i)
          prm.leave_subsection();
      }
    std::ostringstream text;
    prm.print_parameters(text, dealii::ParameterHandler::Text);
    // A key without a value is written as a comment: an empty value is bad input when read back.
    std::istringstream printed(text.str());
    std::string        complete, line;
    while (std::getline(printed, line))
      {
        const std::string content = trim(line);
        const auto        indent  = line.substr(0, line.find_first_not_of(' '));
        if (content.rfind("set ", 0) == 0 && content.back() == '=')
          line = indent + "# " + trim(content.substr(0, content.size() - 1)) + " = (not set)";
        complete += line + "\n";
      }
    return complete;
  }
} // namespace lentus::input
