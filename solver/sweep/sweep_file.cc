#include "solver/sweep/sweep_file.h"

#include "rheology/parameter_table.h"
#include "solver/errors.h"
#include "solver/input/case_file.h"
#include "solver/input/flow_case.h"

#include <algorithm>
#include <cmath>
#include <cstdio>
#include <filesystem>
#include <fstream>
#include <map>
#include <set>
#include <sstream>

namespace lentus::sweep
{
  namespace
  {
    using input::trim;

    const char *statements =
      "base case = FILE, results folder = FOLDER, combine = grid|zip, vary KEY = VALUES, fix KEY = VALUE, "
      "table = FILE.csv, cases from = FILE, case NAME ... end, fluid samples = CASE NAME, plot = DESIGN NUMBER, "
      "plot against = KEY, plot curves = KEY, warm start = none|nearest";

    /// The words that start a sweep file's statements.
    const std::vector<std::string> settings_words = {"base case",    "results folder", "combine",
                                                     "table",        "cases from",     "fluid samples",
                                                     "plot against", "plot curves",    "plot",
                                                     "warm start"};

    /// One dimension of the sweep: a vary line, a table or the list of explicit cases.
    struct Dimension
    {
      std::string                        file;
      int                                line = 0;
      std::string                        what;   ///< for messages: the key, the table, "the case list"
      std::vector<std::vector<Override>> points; ///< each point sets one or more keys
      std::vector<std::string>           names;  ///< explicit cases only
    };

    std::string format_number(const double value)
    {
      char buffer[40];
      std::snprintf(buffer, sizeof buffer, "%.10g", value);
      return buffer;
    }

    std::string resolve_relative(const std::string &path, const std::string &relative_to_file)
    {
      const std::filesystem::path given(path);
      if (given.is_absolute())
        return path;
      const std::filesystem::path folder = std::filesystem::path(relative_to_file).parent_path();
      return (folder / given).lexically_normal().string();
    }

    std::string read_text(const std::string &file, const std::string &where, const int line, const std::string &what)
    {
      std::ifstream input(file);
      if (!input)
        throw InputError(where, line, what + " " + file + ": cannot open the file for reading");
      std::stringstream text;
      text << input.rdbuf();
      return text.str();
    }

    /// FNV-1a, 64 bits: a fingerprint of a case's inputs (not a security hash).
    std::uint64_t fnv1a(const std::string &text, std::uint64_t hash = 14695981039346656037ull)
    {
      for (const unsigned char c : text)
        {
          hash ^= c;
          hash *= 1099511628211ull;
        }
      return hash;
    }

    class Parser
    {
    public:
      Parser(const SweepSettings &settings_, const input::CaseSchema &schema_)
        : settings(settings_)
        , schema(schema_)
      {}

      SweepPlan parse(const std::string &text, const std::string &name);

    private:
      const SweepSettings      &settings;
      const input::CaseSchema  &schema;
      std::vector<Dimension>    dimensions;
      int                       case_list = -1; ///< index of the case-list dimension
      std::vector<Override>     fixed;
      std::map<std::string, std::pair<std::string, int>> varied_where; ///< key -> file, line
      std::set<std::string>     case_names;
      std::vector<std::string>  case_order; ///< the names, in file order (for messages)
      std::optional<FluidSamples> fluid_samples;

      /// Checks that `path` is a key that may be set, and `value` (if any) is allowed.
      void check_key(const std::string &file, int line, const std::string &path) const;
      void check_value(const std::string &file, int line, const std::string &path, const std::string &value) const;
      void claim_key(const std::string &file, int line, const std::string &path);
      std::vector<std::string> values_of(const std::string &file, int line, const std::string &path,
                                         const std::string &spec) const;
      Dimension &case_dimension(const std::string &file, int line);
      /// Reads case blocks from `text` (and a `fluid samples` line); nothing else is allowed.
      void read_case_blocks(const std::string &text, const std::string &file);
      /// A `fluid samples = NAME` line, in the sweep file or a file named by `cases from`.
      void note_fluid_samples(const std::string &file, int line, const std::string &name);
      /// The checks of the `fluid samples` line once every case block is read.
      void check_fluid_samples(const std::string &combination) const;
      void read_table(const std::string &file, const std::string &where, int line);
    };

    void Parser::check_key(const std::string &file, const int line, const std::string &path) const
    {
      if (schema.find(path))
        {
          if (path == "Output/Folder")
            throw InputError(file, line, path,
                             path + ": set by the sweep runner (each case gets <results folder>/cases/<case id>); "
                                    "allowed: any other key; set the sweep's folder with 'results folder = FOLDER'");
          return;
        }
      std::string best;
      std::size_t best_distance = 6;
      std::string same_leaf;
      for (const input::KeyDeclaration &key : schema.keys())
        {
          const std::size_t distance = input::edit_distance(path, key.path);
          if (distance < best_distance)
            {
              best          = key.path;
              best_distance = distance;
            }
          if (same_leaf.empty() && path.size() < key.path.size() &&
              key.path.compare(key.path.size() - path.size(), path.size(), path) == 0 &&
              key.path[key.path.size() - path.size() - 1] == '/')
            same_leaf = key.path;
        }
      const std::string hint = !same_leaf.empty() ? " (did you mean '" + same_leaf + "'?)" :
                               !best.empty()      ? " (did you mean '" + best + "'?)" :
                                                    std::string();
      throw InputError(file, line, path,
                       path + ": unknown key" + hint +
                         "; allowed: a case-file key written Section/Subsection/Key (lentus laws lists the fluids' keys)");
    }

    void Parser::check_value(const std::string &file, const int line, const std::string &path,
                             const std::string &value) const
    {
      input::check_value(file, line, *schema.find(path), value);
    }

    void Parser::claim_key(const std::string &file, const int line, const std::string &path)
    {
      const auto previous = varied_where.find(path);
      if (previous != varied_where.end())
        throw InputError(file, line,
                         path + ": already set by the sweep in " + previous->second.first + ":" +
                           std::to_string(previous->second.second) +
                           "; allowed: each key varied, listed in a case, or fixed in one place only");
      varied_where[path] = {file, line};
    }

    std::vector<std::string> Parser::values_of(const std::string &file, const int line, const std::string &path,
                                               const std::string &spec) const
    {
      const std::string allowed = "a list 'v1, v2, ...' (';' between values that hold commas), "
                                  "'linear FROM to TO, N values' or 'logarithmic FROM to TO, N values'";
      std::istringstream words(spec);
      std::string        first;
      words >> first;
      if (first == "linear" || first == "logarithmic")
        {
          std::string rest = spec.substr(first.size());
          for (char &c : rest)
            if (c == ',')
              c = ' ';
          std::istringstream       tokens(rest);
          std::vector<std::string> token;
          for (std::string word; tokens >> word;)
            token.push_back(word);
          const auto from  = token.size() >= 4 ? input::parse_real(token[0]) : std::nullopt;
          const auto to    = token.size() >= 4 ? input::parse_real(token[2]) : std::nullopt;
          const auto count = token.size() >= 4 ? input::parse_real(token[3]) : std::nullopt;
          if (token.size() < 4 || token.size() > 5 || token[1] != "to" || !from || !to || !count ||
              (token.size() == 5 && token[4] != "values"))
            throw InputError(file, line, path + " = " + spec + ": cannot read the range; allowed: " + allowed);
          if (!(*count >= 2.) || *count != std::floor(*count) || *count > 100000.)
            throw InputError(file, line,
                             path + " = " + spec + ": the number of values must be a whole number from 2 to 100000; "
                                                   "allowed: " + allowed);
          if (first == "logarithmic" && !(*from > 0. && *to > 0.))
            throw InputError(file, line,
                             path + " = " + spec + ": a logarithmic range needs FROM and TO above 0; allowed: " +
                               "'linear FROM to TO, N values' for ranges through 0");
          const auto               n = static_cast<std::size_t>(*count);
          std::vector<std::string> values;
          for (std::size_t i = 0; i < n; ++i)
            {
              const double t = static_cast<double>(i) / static_cast<double>(n - 1);
              // Exact end points; in between v = a + t (b - a), or a (b/a)^t.
              const double v = i == 0     ? *from :
                               i == n - 1 ? *to :
                               first == "linear" ? *from + t * (*to - *from) :
                                                   std::exp(std::log(*from) + t * (std::log(*to) - std::log(*from)));
              values.push_back(format_number(v));
            }
          return values;
        }
      const char               separator = spec.find(';') != std::string::npos ? ';' : ',';
      std::vector<std::string> values;
      std::string              item;
      std::istringstream       items(spec);
      while (std::getline(items, item, separator))
        values.push_back(trim(item));
      if (!spec.empty() && spec.back() == separator)
        values.push_back("");
      if (separator == ';' && !values.empty() && values.back().empty())
        values.pop_back(); // "0, -9.81;" is a list of one value holding a comma
      if (values.empty())
        throw InputError(file, line, path + " = (empty): no values; allowed: " + allowed);
      for (const std::string &value : values)
        if (value.empty())
          throw InputError(file, line, path + " = " + spec + ": an empty value in the list; allowed: " + allowed);
      return values;
    }

    Dimension &Parser::case_dimension(const std::string &file, const int line)
    {
      if (case_list < 0)
        {
          dimensions.push_back({file, line, "the case list", {}, {}});
          case_list = static_cast<int>(dimensions.size()) - 1;
        }
      return dimensions[case_list];
    }

    void Parser::read_case_blocks(const std::string &text, const std::string &file)
    {
      std::istringstream stream(text);
      std::string        raw;
      int                line_number = 0;
      int                open_line   = 0;
      std::string        open_name;
      std::vector<Override> open_values;
      while (std::getline(stream, raw))
        {
          ++line_number;
          const std::string line = trim(raw.substr(0, raw.find('#')));
          if (line.empty())
            continue;
          if (open_line == 0)
            {
              const auto equals = line.find('=');
              if (equals != std::string::npos && trim(line.substr(0, equals)) == "fluid samples")
                {
                  note_fluid_samples(file, line_number, trim(line.substr(equals + 1)));
                  continue;
                }
              if (line.rfind("case ", 0) != 0 && line != "case")
                throw InputError(file, line_number,
                                 "cannot read '" + line + "'; a file named by 'cases from' holds only "
                                                          "'case NAME' ... 'end' blocks, a 'fluid samples = CASE "
                                                          "NAME' line and comments");
              open_name = trim(line.substr(4));
              open_line = line_number;
              open_values.clear();
              if (open_name.empty() || open_name.find_first_not_of("abcdefghijklmnopqrstuvwxyzABCDEFGHIJKLMNOPQRSTUVWXYZ"
                                                                   "0123456789._-") != std::string::npos)
                throw InputError(file, line_number,
                                 "case '" + open_name + "': not a case name; allowed: letters, digits, '.', '_', '-'");
              if (!case_names.insert(open_name).second)
                throw InputError(file, line_number, "case '" + open_name + "': named twice; allowed: unique names");
              case_order.push_back(open_name);
              continue;
            }
          if (line == "end")
            {
              Dimension &list = case_dimension(file, open_line);
              list.points.push_back(open_values);
              list.names.push_back(open_name);
              open_line = 0;
              continue;
            }
          const auto equals = line.find('=');
          if (equals == std::string::npos)
            throw InputError(file, line_number,
                             "cannot read '" + line + "' in case " + open_name +
                               "; allowed: 'Section/Subsection/Key = value' lines, then 'end'");
          const std::string path  = trim(line.substr(0, equals));
          const std::string value = trim(line.substr(equals + 1));
          check_key(file, line_number, path);
          check_value(file, line_number, path, value);
          for (const Override &earlier : open_values)
            if (earlier.path == path)
              throw InputError(file, line_number,
                               path + ": set twice in case " + open_name + " (first on line " +
                                 std::to_string(earlier.line) + "); keep one");
          open_values.push_back({path, value, file, line_number});
        }
      if (open_line != 0)
        throw InputError(file, open_line, "case " + open_name + " is not closed by 'end'");
    }

    void Parser::note_fluid_samples(const std::string &file, const int line, const std::string &name)
    {
      if (name.empty())
        throw InputError(file, line,
                         "fluid samples = (empty): a value is needed; allowed: the name of the case that holds the "
                         "fit's estimates (fitted in the case list lentus fit writes)");
      if (fluid_samples)
        throw InputError(file, line,
                         "fluid samples = " + name + ": set twice (first in " + fluid_samples->file + ":" +
                           std::to_string(fluid_samples->line) + "); allowed: one 'fluid samples' line");
      fluid_samples = FluidSamples{name, file, line, {}};
    }

    void Parser::check_fluid_samples(const std::string &combination) const
    {
      if (!fluid_samples)
        return;
      const std::string what = "fluid samples = " + fluid_samples->fitted;
      if (case_list < 0)
        throw InputError(fluid_samples->file, fluid_samples->line,
                         what + ": the sweep has no explicit cases to be samples; allowed: with 'case NAME' ... "
                                "'end' blocks or 'cases from = FILE' (the samples.sweep of lentus fit), one of "
                                "them named " + fluid_samples->fitted);
      if (!case_names.count(fluid_samples->fitted))
        {
          std::string names;
          for (std::size_t i = 0; i < case_order.size() && i < 5; ++i)
            names += (i ? ", " : "") + case_order[i];
          if (case_order.size() > 5)
            names += ", ... (" + std::to_string(case_order.size()) + " cases)";
          throw InputError(fluid_samples->file, fluid_samples->line,
                           what + ": no case of that name; allowed: the name of the case with the fit's estimates, "
                                  "one of " + names);
        }
      if (case_order.size() < 2)
        throw InputError(fluid_samples->file, fluid_samples->line,
                         what + ": the case list holds no samples besides it; allowed: a case list with the fitted "
                                "case and one or more samples (lentus fit --samples N)");
      if (combination == "zip" && dimensions.size() > 1)
        throw InputError(fluid_samples->file, fluid_samples->line,
                         what + ": with 'combine = zip' each sample would run at other values of the other keys, "
                                "and their effect would count as the fluid's; allowed: combine = grid (every "
                                "sample at every value of the other keys)");
    }

    /// Splits one CSV line; double quotes protect commas ("" is a quote).
    std::vector<std::string> csv_cells(const std::string &line)
    {
      std::vector<std::string> cells(1);
      bool                     quoted = false;
      for (std::size_t i = 0; i < line.size(); ++i)
        {
          const char c = line[i];
          if (quoted && c == '"' && i + 1 < line.size() && line[i + 1] == '"')
            cells.back() += '"', ++i;
          else if (c == '"')
            quoted = !quoted;
          else if (c == ',' && !quoted)
            cells.emplace_back();
          else
            cells.back() += c;
        }
      for (std::string &cell : cells)
        cell = trim(cell);
      return cells;
    }

    void Parser::read_table(const std::string &file, const std::string &where, const int line)
    {
      const std::string        text = read_text(file, where, line, "table =");
      std::istringstream       stream(text);
      std::string              raw;
      int                      line_number = 0;
      std::vector<std::string> header;
      Dimension                table{where, line, "table " + file, {}, {}};
      while (std::getline(stream, raw))
        {
          ++line_number;
          if (!raw.empty() && raw.back() == '\r')
            raw.pop_back();
          if (trim(raw).empty() || trim(raw)[0] == '#')
            continue;
          const std::vector<std::string> cells = csv_cells(raw);
          if (header.empty())
            {
              header = cells;
              for (const std::string &path : header)
                {
                  check_key(file, line_number, path);
                  claim_key(file, line_number, path);
                }
              continue;
            }
          if (cells.size() != header.size())
            throw InputError(file, line_number,
                             std::to_string(cells.size()) + " cells; allowed: one per column of the header (" +
                               std::to_string(header.size()) + ")");
          std::vector<Override> point;
          for (std::size_t c = 0; c < cells.size(); ++c)
            {
              check_value(file, line_number, header[c], cells[c]);
              point.push_back({header[c], cells[c], file, line_number});
            }
          table.points.push_back(point);
        }
      if (table.points.empty())
        throw InputError(file, 0, "no rows; allowed: a header of key paths, then one row per case");
      dimensions.push_back(table);
    }

    SweepPlan Parser::parse(const std::string &text, const std::string &name)
    {
      SweepPlan   plan;
      plan.sweep_file = name;
      std::map<std::string, int> setting_lines;
      std::map<std::string, std::string> setting_values;
      std::string inline_cases; // case blocks, with blank lines in place of other lines to keep line numbers
      bool        in_case  = false;
      bool        saw_case = false;

      std::istringstream stream(text);
      std::string        raw;
      int                line_number = 0;
      while (std::getline(stream, raw))
        {
          ++line_number;
          const std::string line = trim(raw.substr(0, raw.find('#')));
          const auto        space = line.find_first_of(" \t");
          const std::string first = line.substr(0, space);
          if (in_case || first == "case")
            {
              if (!in_case)
                {
                  in_case  = true;
                  saw_case = true;
                  case_dimension(name, line_number); // its place among the dimensions
                }
              if (line == "end")
                in_case = false;
              inline_cases += raw + "\n";
              continue;
            }
          inline_cases += "\n";
          if (line.empty())
            continue;
          if (line == "end")
            throw InputError(name, line_number, "'end' without a matching 'case NAME'");
          const auto equals = line.find('=');
          if (first == "vary" || first == "fix")
            {
              if (equals == std::string::npos)
                throw InputError(name, line_number, "expected '" + first + " Section/Subsection/Key = " +
                                                      (first == "vary" ? "VALUES'" : "VALUE'"));
              const std::string path  = trim(line.substr(first.size(), equals - first.size()));
              const std::string value = trim(line.substr(equals + 1));
              check_key(name, line_number, path);
              claim_key(name, line_number, path);
              if (first == "fix")
                {
                  check_value(name, line_number, path, value);
                  fixed.push_back({path, value, name, line_number});
                  continue;
                }
              Dimension dimension{name, line_number, path, {}, {}};
              for (const std::string &value_text : values_of(name, line_number, path, value))
                {
                  check_value(name, line_number, path, value_text);
                  dimension.points.push_back(std::vector<Override>{Override{path, value_text, name, line_number}});
                }
              dimensions.push_back(dimension);
              continue;
            }
          std::string word;
          for (const std::string &candidate : settings_words)
            if (line.compare(0, candidate.size(), candidate) == 0 && equals != std::string::npos &&
                trim(line.substr(0, equals)) == candidate)
              {
                word = candidate;
                break;
              }
          if (word.empty())
            throw InputError(name, line_number, "cannot read '" + line + "'; allowed statements: " + statements);
          const std::string value = trim(line.substr(equals + 1));
          if (value.empty())
            throw InputError(name, line_number, word + " = (empty): a value is needed");
          if (word == "table")
            {
              read_table(resolve_relative(value, name), name, line_number);
              continue;
            }
          if (word == "fluid samples")
            {
              note_fluid_samples(name, line_number, value);
              continue;
            }
          if (word == "cases from")
            {
              const std::string file = resolve_relative(value, name);
              case_dimension(name, line_number);
              read_case_blocks(read_text(file, name, line_number, "cases from ="), file);
              continue;
            }
          if (setting_lines.count(word))
            throw InputError(name, line_number,
                             word + ": set twice (first on line " + std::to_string(setting_lines[word]) + "); keep one");
          setting_lines[word]  = line_number;
          setting_values[word] = value;
          if (word == "warm start" && value != "none" && value != "nearest")
            throw InputError(name, line_number,
                             "warm start = " + value + ": unknown choice; allowed: none (every case from rest, the "
                                                       "default), nearest (from the nearest finished case's solution "
                                                       "on the first mesh)");
          if (word == "combine" && value != "grid" && value != "zip")
            throw InputError(name, line_number,
                             "combine = " + value + ": unknown combination; allowed: grid (every combination), "
                                                    "zip (the i-th values of every dimension together)");
        }
      if (saw_case)
        read_case_blocks(inline_cases, name);
      if (case_list >= 0 && dimensions[case_list].points.empty())
        throw InputError(dimensions[case_list].file, dimensions[case_list].line,
                         "the case list is empty; allowed: 'case NAME' ... 'end' blocks");
      // The keys the explicit cases set are varied too; a key may be varied in one place only.
      if (case_list >= 0)
        for (const std::vector<Override> &point : dimensions[case_list].points)
          for (const Override &value : point)
            {
              for (const Override &fixed_value : fixed)
                if (fixed_value.path == value.path)
                  throw InputError(value.file, value.line,
                                   value.path + ": also fixed in " + fixed_value.file + ":" +
                                     std::to_string(fixed_value.line) + "; allowed: a key in one place only");
              for (std::size_t d = 0; d < dimensions.size(); ++d)
                if (static_cast<int>(d) != case_list && !dimensions[d].points.empty())
                  for (const Override &other : dimensions[d].points.front())
                    if (other.path == value.path)
                      throw InputError(value.file, value.line,
                                       value.path + ": also varied in " + other.file + ":" +
                                         std::to_string(other.line) + "; allowed: a key in one place only");
            }

      // Command-line --set: fixed in every case.
      for (const std::string &assignment : settings.sets)
        {
          const std::string where  = InputError::command_line_overrides;
          const auto        equals = assignment.find('=');
          if (equals == std::string::npos)
            throw InputError(where, 0, assignment + ": expected --set Section/Key=value");
          const std::string path  = trim(assignment.substr(0, equals));
          const std::string value = trim(assignment.substr(equals + 1));
          check_key(where, 0, path);
          check_value(where, 0, path, value);
          if (varied_where.count(path))
            throw InputError(where, 0,
                             path + ": also set by the sweep file (" + varied_where[path].first + ":" +
                               std::to_string(varied_where[path].second) + "); allowed: keys the sweep does not set");
          fixed.push_back({path, value, where, 0});
        }

      // Settings.
      plan.combination = setting_values.count("combine") ? setting_values["combine"] : "grid";
      plan.warm_start  = setting_values.count("warm start") && setting_values["warm start"] == "nearest";
      check_fluid_samples(plan.combination);
      if (!settings.base_case.empty())
        plan.base_case = settings.base_case;
      else if (setting_values.count("base case"))
        plan.base_case = resolve_relative(setting_values["base case"], name);
      else
        throw InputError(name, 0,
                         "no base case; allowed: a line 'base case = CASE.prm' (relative to the sweep file) or "
                         "--base CASE.prm");
      plan.base_text = read_text(plan.base_case, settings.base_case.empty() ? name : "command line (--base)",
                                 settings.base_case.empty() ? setting_lines["base case"] : 0, "base case =");
      if (!settings.results_folder.empty())
        plan.results_folder = settings.results_folder;
      else if (setting_values.count("results folder"))
        plan.results_folder = setting_values["results folder"];
      else
        plan.results_folder = (std::filesystem::path("out") / std::filesystem::path(name).stem()).string();

      // Dimensions -> cases.
      if (dimensions.empty())
        throw InputError(name, 0,
                         "nothing varies, so there are no cases; allowed: 'vary KEY = VALUES' lines, a 'table = "
                         "FILE.csv', or 'case NAME' ... 'end' blocks");
      std::size_t total = plan.combination == "zip" ? dimensions.front().points.size() : 1;
      for (const Dimension &dimension : dimensions)
        {
          plan.dimension_sizes.push_back(dimension.points.size());
          if (plan.combination == "zip" && dimension.points.size() != total)
            throw InputError(dimension.file, dimension.line,
                             dimension.what + ": " + std::to_string(dimension.points.size()) +
                               " values, but " + dimensions.front().what + " (line " +
                               std::to_string(dimensions.front().line) + ") has " + std::to_string(total) +
                               "; allowed: the same number in every dimension with 'combine = zip'");
          if (plan.combination == "grid")
            {
              total *= dimension.points.size();
              if (total > 1000000)
                throw InputError(dimension.file, dimension.line,
                                 "the grid has more than 1000000 cases; allowed: at most 1000000");
            }
          for (const Override &value : dimension.points.front())
            if (std::find(plan.varied_keys.begin(), plan.varied_keys.end(), value.path) == plan.varied_keys.end())
              plan.varied_keys.push_back(value.path);
          // Explicit cases may set different keys: every key any of them sets is a column.
          for (const std::vector<Override> &point : dimension.points)
            for (const Override &value : point)
              if (std::find(plan.varied_keys.begin(), plan.varied_keys.end(), value.path) == plan.varied_keys.end())
                plan.varied_keys.push_back(value.path);
        }
      plan.has_names = case_list >= 0;
      if (fluid_samples)
        {
          plan.fluid_samples = fluid_samples;
          for (const std::vector<Override> &point : dimensions[case_list].points)
            for (const Override &value : point)
              if (std::find(plan.fluid_samples->keys.begin(), plan.fluid_samples->keys.end(), value.path) ==
                  plan.fluid_samples->keys.end())
                plan.fluid_samples->keys.push_back(value.path);
        }

      const int width = std::max<int>(4, static_cast<int>(std::to_string(total - 1).size()));
      for (std::size_t index = 0; index < total; ++index)
        {
          SweepCase sweep_case;
          sweep_case.index = index;
          const std::string digits = std::to_string(index);
          sweep_case.id = "case-" + std::string(static_cast<std::size_t>(width) - digits.size(), '0') + digits;
          // Nested loops in file order: the last dimension varies fastest.
          std::size_t rest = index;
          std::vector<std::size_t> position(dimensions.size());
          for (std::size_t d = dimensions.size(); d-- > 0;)
            {
              const std::size_t size = dimensions[d].points.size();
              position[d]            = plan.combination == "zip" ? index : rest % size;
              rest                   = plan.combination == "zip" ? rest : rest / size;
            }
          for (std::size_t d = 0; d < dimensions.size(); ++d)
            {
              const auto &point = dimensions[d].points[position[d]];
              sweep_case.overrides.insert(sweep_case.overrides.end(), point.begin(), point.end());
              if (!dimensions[d].names.empty())
                sweep_case.name = dimensions[d].names[position[d]];
            }
          sweep_case.overrides.insert(sweep_case.overrides.end(), fixed.begin(), fixed.end());
          std::uint64_t hash = fnv1a(plan.base_text);
          for (const Override &value : sweep_case.overrides)
            hash = fnv1a(value.path + "=" + value.value + "\n", hash);
          sweep_case.fingerprint = hash;
          plan.cases.push_back(sweep_case);
        }

      // Plot settings refer to the varied keys.
      plan.plot_number  = setting_values.count("plot") ? setting_values["plot"] : "";
      plan.plot_against = setting_values.count("plot against") ? setting_values["plot against"] : "";
      plan.plot_curves  = setting_values.count("plot curves") ? setting_values["plot curves"] : "";
      std::string varied_list;
      for (const std::string &key : plan.varied_keys)
        varied_list += (varied_list.empty() ? "" : ", ") + key;
      for (const std::string word : {"plot against", "plot curves"})
        {
          const std::string &key = word == std::string("plot against") ? plan.plot_against : plan.plot_curves;
          if (!key.empty() && std::find(plan.varied_keys.begin(), plan.varied_keys.end(), key) == plan.varied_keys.end())
            throw InputError(name, setting_lines[word], word + " = " + key + ": not a varied key; allowed: " + varied_list);
        }
      if (!plan.plot_number.empty() && plan.plot_against.empty())
        throw InputError(name, setting_lines["plot"],
                         "plot = " + plan.plot_number + ": needs 'plot against = KEY'; allowed: " + varied_list);
      if (plan.plot_number.empty() && (!plan.plot_against.empty() || !plan.plot_curves.empty()))
        throw InputError(name, setting_lines[plan.plot_against.empty() ? "plot curves" : "plot against"],
                         "a plot needs 'plot = DESIGN NUMBER' (a column of the results table)");
      return plan;
    }

    /// A value the case would ignore: a key in subsection S/N where a selection key of S
    /// (Viscosity law, Temperature shift, Shape) chooses another subsection than N.
    /// The case reader accepts such keys, so a sweep over them would change nothing.
    std::string ignored_value(const input::CaseFile &file, const input::CaseSchema &schema,
                              const SweepCase &sweep_case)
    {
      for (const Override &value : sweep_case.overrides)
        {
          const auto last = value.path.rfind('/');
          if (last == std::string::npos)
            continue;
          const std::string subsection = value.path.substr(0, last);
          const auto        middle     = subsection.rfind('/');
          if (middle == std::string::npos)
            continue;
          const std::string section = subsection.substr(0, middle);
          const std::string chosen  = subsection.substr(middle + 1);
          for (const input::KeyDeclaration &key : schema.keys())
            if (key.path.compare(0, section.size() + 1, section + "/") == 0 &&
                key.path.find('/', section.size() + 1) == std::string::npos &&
                key.kind.type == input::ValueKind::Type::selection &&
                std::find(key.kind.choices.begin(), key.kind.choices.end(), chosen) != key.kind.choices.end() &&
                file.get(key.path) != chosen)
              return value.file + (value.line > 0 ? ":" + std::to_string(value.line) : std::string()) + ": " +
                     sweep_case.id + (sweep_case.name.empty() ? "" : " (" + sweep_case.name + ")") + ": " +
                     value.path + " = " + value.value + ": would be ignored, because " + key.path + " = " +
                     (file.get(key.path).empty() ? std::string("(not set)") : file.get(key.path)) +
                     "; allowed: keys of the selected " + key.path.substr(key.path.rfind('/') + 1) +
                     " (or vary " + key.path + " too)";
        }
      return "";
    }

    /// Rewrites a flow-case reader message about an overridden key so that it
    /// points at the sweep line that set the key.
    /// The reason a case cannot run: a problem with a value the sweep set (reaching the case as a
    /// command-line override) is placed at the sweep line that set it; anything else at the sweep file.
    std::string locate(const std::exception &error, const SweepPlan &plan, const SweepCase &sweep_case)
    {
      const std::string label = sweep_case.id + (sweep_case.name.empty() ? "" : " (" + sweep_case.name + ")");
      if (const auto *input = dynamic_cast<const InputError *>(&error); input && input->from_overrides())
        for (const Override &value : sweep_case.overrides)
          if (value.path == input->key())
            return value.file + (value.line > 0 ? ":" + std::to_string(value.line) : std::string()) + ": " + label +
                   ": " + input->detail();
      return plan.sweep_file + ": " + label + ": " + error.what();
    }
  } // namespace

  std::size_t SweepPlan::n_invalid() const
  {
    std::size_t count = 0;
    for (const SweepCase &sweep_case : cases)
      count += !sweep_case.invalid_reason.empty();
    return count;
  }

  std::vector<std::string> SweepPlan::group_keys() const
  {
    std::vector<std::string> keys;
    if (fluid_samples)
      for (const std::string &key : varied_keys)
        if (std::find(fluid_samples->keys.begin(), fluid_samples->keys.end(), key) == fluid_samples->keys.end())
          keys.push_back(key);
    return keys;
  }

  std::string SweepPlan::shape_description() const
  {
    if (dimension_sizes.size() == 1)
      return "one list";
    if (combination == "zip")
      return std::to_string(dimension_sizes.size()) + " dimensions zipped";
    std::string text;
    for (const std::size_t size : dimension_sizes)
      text += (text.empty() ? "" : " x ") + std::to_string(size);
    return text + " grid";
  }

  std::string SweepPlan::plan_text() const
  {
    std::ostringstream text;
    text << "# Lentus sweep plan: every case of " << sweep_file << ", spelled out (for the record).\n"
         << "# base case: " << base_case << "\n# " << cases.size() << " cases, " << shape_description() << "\n";
    if (fluid_samples)
      text << "# fluid samples: case " << fluid_samples->fitted
           << " holds the fit's estimates, the other cases of the list are samples of the fluid\n";
    for (const SweepCase &sweep_case : cases)
      {
        text << sweep_case.id << (sweep_case.name.empty() ? "" : " (" + sweep_case.name + ")") << ":";
        for (const Override &value : sweep_case.overrides)
          text << (&value == &sweep_case.overrides.front() ? " " : "; ") << value.path << " = " << value.value;
        if (!sweep_case.invalid_reason.empty())
          text << "  [invalid: " << sweep_case.invalid_reason << "]";
        text << "\n";
      }
    return text.str();
  }

  bool looks_like_sweep_file(const std::string &text)
  {
    std::istringstream stream(text);
    std::string        raw;
    while (std::getline(stream, raw))
      {
        const std::string line = trim(raw.substr(0, raw.find('#')));
        if (line.empty())
          continue;
        const std::string first = line.substr(0, line.find_first_of(" \t"));
        if (first == "vary" || first == "fix" || first == "case")
          return true;
        for (const std::string &word : settings_words)
          if (line.rfind(word, 0) == 0 && line.find('=') != std::string::npos &&
              trim(line.substr(0, line.find('='))) == word)
            return true;
        return false;
      }
    return false;
  }

  SweepPlan read_sweep_file(const std::string &file, const SweepSettings &settings, const input::CaseSchema &schema)
  {
    return parse_sweep_file(read_text(file, file, 0, "sweep file"), file, settings, schema);
  }

  SweepPlan parse_sweep_file(const std::string &text,
                             const std::string &name,
                             const SweepSettings &settings,
                             const input::CaseSchema &schema)
  {
    Parser    parser(settings, schema);
    SweepPlan plan = parser.parse(text, name);

    // The base case must be readable on its own (its syntax and keys), with the fixed values.
    {
      std::vector<std::string> fixed_sets;
      const SweepCase         &first = plan.cases.front();
      for (const Override &value : first.overrides)
        if (std::find(plan.varied_keys.begin(), plan.varied_keys.end(), value.path) == plan.varied_keys.end())
          fixed_sets.push_back(value.path + "=" + value.value);
      input::CaseFile::parse(plan.base_text, plan.base_case, schema, fixed_sets);
    }
    // Every case is read as the flow solver would read it, before anything runs.
    for (SweepCase &sweep_case : plan.cases)
      {
        if (settings.validate_only && *settings.validate_only != sweep_case.index)
          continue;
        try
          {
            const input::CaseFile file =
              input::CaseFile::parse(plan.base_text, plan.base_case, schema, case_overrides(plan, sweep_case));
            input::read_flow_case(file);
            sweep_case.invalid_reason = ignored_value(file, schema, sweep_case);
          }
        catch (const std::exception &error) // InputError, or a law's own complaint
          {
            sweep_case.invalid_reason = locate(error, plan, sweep_case);
          }
      }
    return plan;
  }

  std::vector<std::string> case_overrides(const SweepPlan &plan, const SweepCase &sweep_case)
  {
    std::vector<std::string> sets;
    for (const Override &value : sweep_case.overrides)
      sets.push_back(value.path + "=" + value.value);
    sets.push_back("Output/Folder=" + case_folder(plan, sweep_case));
    return sets;
  }

  std::string case_folder(const SweepPlan &plan, const SweepCase &sweep_case)
  {
    return (std::filesystem::path(plan.results_folder) / "cases" / sweep_case.id).string();
  }

  std::string unit_of_key(const input::CaseSchema &schema, const std::string &path)
  {
    const input::KeyDeclaration *declaration = schema.find(path);
    if (!declaration)
      return "";
    std::vector<std::string> units;
    const std::string       &text = declaration->documentation;
    for (auto open = text.find('['); open != std::string::npos; open = text.find('[', open + 1))
      {
        const auto close = text.find(']', open);
        if (close == std::string::npos)
          break;
        const std::string unit = text.substr(open + 1, close - open - 1);
        if (std::find(units.begin(), units.end(), unit) == units.end())
          units.push_back(unit);
      }
    std::string joined;
    for (const std::string &unit : units)
      joined += (joined.empty() ? "" : " or ") + unit;
    return joined;
  }
} // namespace lentus::sweep
