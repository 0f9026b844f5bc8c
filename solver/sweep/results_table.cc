#include "solver/sweep/results_table.h"

#include "solver/input/value_kind.h"
#include "solver/report/atomic_file.h"
#include "solver/report/caution.h"
#include "solver/report/json_text.h"
#include "solver/sweep/fluid_uncertainty.h"
#include "solver/sweep/sweep_file.h"
#include "solver/sweep/table_cells.h"

#include <cmath>
#include <cstdio>
#include <filesystem>
#include <fstream>
#include <sstream>

#include <nlohmann/json.hpp>

namespace lentus::sweep
{
  namespace
  {
    std::string escape(const std::string &text)
    {
      std::string out;
      for (const char c : text)
        out += c == '\\' ? std::string("\\\\") : c == '\t' ? std::string("\\t") : c == '\n' ? std::string("\\n") :
                                                                                            std::string(1, c);
      return out;
    }

    std::string unescape(const std::string &text)
    {
      std::string out;
      for (std::size_t i = 0; i < text.size(); ++i)
        if (text[i] == '\\' && i + 1 < text.size())
          {
            const char next = text[++i];
            out += next == 't' ? '\t' : next == 'n' ? '\n' : next;
          }
        else
          out += text[i];
      return out;
    }

    std::vector<std::string> split_tabs(const std::string &line)
    {
      std::vector<std::string> fields;
      std::string              field;
      std::istringstream       stream(line);
      while (std::getline(stream, field, '\t'))
        fields.push_back(unescape(field));
      if (!line.empty() && line.back() == '\t')
        fields.emplace_back();
      return fields;
    }
  } // namespace

  std::string number_text(const double value)
  {
    if (!std::isfinite(value))
      return "";
    char buffer[40];
    std::snprintf(buffer, sizeof buffer, "%.10g", value);
    return buffer;
  }

  std::string csv_cell(const std::string &text)
  {
    if (text.find_first_of(",\"\r\n") == std::string::npos)
      return text;
    std::string out = "\"";
    for (const char c : text)
      out += c == '"' ? std::string("\"\"") : std::string(1, c);
    return out + "\"";
  }

  nlohmann::ordered_json json_value(const std::string &text)
  {
    const auto number = input::parse_real(text);
    if (!number || !std::isfinite(*number))
      return text;
    if (std::abs(*number) < 1e15 && *number == std::round(*number))
      return static_cast<long long>(*number);
    return report::json_number(*number);
  }

  std::string row_text(const ResultRow &row)
  {
    std::ostringstream text;
    char               fingerprint[20];
    std::snprintf(fingerprint, sizeof fingerprint, "%016llx", static_cast<unsigned long long>(row.fingerprint));
    text << "index\t" << row.index << "\nid\t" << escape(row.id) << "\nname\t" << escape(row.name) << "\nfolder\t"
         << escape(row.folder) << "\nfingerprint\t" << fingerprint << "\n";
    for (const auto &[key, value] : row.values)
      text << "value\t" << escape(key) << "\t" << escape(value) << "\n";
    text << "status\t" << escape(row.status) << "\nreason\t" << escape(row.reason) << "\n";
    for (const ResultNumber &number : row.numbers)
      {
        char value[40];
        std::snprintf(value, sizeof value, "%.17g", number.value);
        text << "number\t" << escape(number.name) << "\t" << value << "\t" << escape(number.unit);
        if (number.error)
          std::snprintf(value, sizeof value, "%.17g", *number.error);
        if (number.error || number.key)
          text << "\t" << (number.error ? value : "");
        if (number.key)
          text << "\tkey";
        text << "\n";
      }
    text << "Newton iterations\t" << row.newton_iterations << "\nwall time\t" << number_text(row.wall_time)
         << "\nranks\t" << row.ranks << "\nend\n";
    return text.str();
  }

  bool parse_row(const std::string &text, ResultRow &row)
  {
    row = ResultRow();
    std::istringstream stream(text);
    std::string        line;
    bool               complete = false;
    try
      {
        while (std::getline(stream, line))
          {
            const std::vector<std::string> f = split_tabs(line);
            if (f.empty())
              return false;
            const std::string &key = f[0];
            if (key == "end")
              {
                complete = true;
                break;
              }
            if (f.size() < 2)
              return false;
            if (key == "index")
              row.index = std::stoul(f[1]);
            else if (key == "id")
              row.id = f[1];
            else if (key == "name")
              row.name = f[1];
            else if (key == "folder")
              row.folder = f[1];
            else if (key == "fingerprint")
              row.fingerprint = std::stoull(f[1], nullptr, 16);
            else if (key == "value" && f.size() == 3)
              row.values.emplace_back(f[1], f[2]);
            else if (key == "status")
              row.status = f[1];
            else if (key == "reason")
              row.reason = f[1];
            else if (key == "number" && (f.size() == 4 || f.size() == 5 || (f.size() == 6 && f[5] == "key")))
              row.numbers.push_back({f[1], std::stod(f[2]), f[3],
                                     f.size() >= 5 && !f[4].empty() ? std::optional<double>(std::stod(f[4])) :
                                                                       std::nullopt,
                                     f.size() == 6});
            else if (key == "Newton iterations")
              row.newton_iterations = std::stoul(f[1]);
            else if (key == "wall time")
              row.wall_time = f[1].empty() ? 0. : std::stod(f[1]);
            else if (key == "ranks")
              row.ranks = std::stoul(f[1]);
            else
              return false;
          }
      }
    catch (const std::exception &)
      {
        return false;
      }
    return complete && !row.id.empty() && !row.status.empty();
  }

  std::string row_path(const std::string &results_folder, const std::string &id)
  {
    return (std::filesystem::path(results_folder) / "rows" / (id + ".txt")).string();
  }

  void write_row(const std::string &results_folder, const ResultRow &row)
  {
    std::filesystem::create_directories(std::filesystem::path(results_folder) / "rows");
    report::write_file_atomically(row_path(results_folder, row.id), row_text(row));
  }

  bool read_row(const std::string &results_folder, const std::string &id, const std::uint64_t fingerprint,
                ResultRow &row)
  {
    std::ifstream input(row_path(results_folder, id));
    if (!input)
      return false;
    std::stringstream text;
    text << input.rdbuf();
    return parse_row(text.str(), row) && row.id == id && row.fingerprint == fingerprint;
  }

  std::pair<std::string, std::string> table_text(const std::vector<ResultRow> &rows,
                                                 const std::vector<std::string> &varied_keys,
                                                 const std::vector<std::string> &varied_units,
                                                 const bool with_names)
  {
    // Design-number columns: in order of first appearance; the unit of the first row that has it.
    // Each followed by its error column when some row has an error bar for it.
    std::vector<std::pair<std::string, std::string>> columns;
    std::vector<bool>                                with_error;
    for (const ResultRow &row : rows)
      for (const ResultNumber &number : row.numbers)
        {
          std::size_t k = 0;
          while (k < columns.size() && columns[k].first != number.name)
            ++k;
          if (k == columns.size())
            {
              columns.emplace_back(number.name, number.unit);
              with_error.push_back(false);
            }
          with_error[k] = with_error[k] || number.error.has_value();
        }

    std::ostringstream csv, jsonl;
    csv << "case";
    if (with_names)
      csv << ",name";
    for (std::size_t k = 0; k < varied_keys.size(); ++k)
      csv << "," << csv_cell(varied_keys[k] + (varied_units[k].empty() ? "" : " [" + varied_units[k] + "]"));
    csv << ",status,reason";
    for (std::size_t k = 0; k < columns.size(); ++k)
      {
        csv << "," << csv_cell(columns[k].first + " [" + columns[k].second + "]");
        if (with_error[k])
          csv << "," << csv_cell(columns[k].first + " error [" + columns[k].second + "]");
      }
    csv << ",Newton iterations,wall time [s],ranks,folder,caution\n";

    for (const ResultRow &row : rows)
      {
        auto value_of = [&](const std::string &key) {
          for (const auto &[k, v] : row.values)
            if (k == key)
              return v;
          return std::string();
        };
        csv << csv_cell(row.id);
        if (with_names)
          csv << "," << csv_cell(row.name);
        for (const std::string &key : varied_keys)
          csv << "," << csv_cell(value_of(key));
        csv << "," << csv_cell(row.status) << "," << csv_cell(row.reason);
        for (std::size_t k = 0; k < columns.size(); ++k)
          {
            std::string cell, error;
            for (const ResultNumber &number : row.numbers)
              if (number.name == columns[k].first)
                {
                  cell  = number_text(number.value);
                  error = number.error ? number_text(*number.error) : std::string();
                }
            csv << "," << cell;
            if (with_error[k])
              csv << "," << error;
          }
        csv << "," << row.newton_iterations << "," << number_text(row.wall_time) << "," << row.ranks << ","
            << csv_cell(row.folder) << "," << csv_cell(report::caution) << "\n";

        using json = nlohmann::ordered_json;
        json line;
        line["case"]  = row.id;
        line["index"] = row.index;
        if (with_names)
          line["name"] = row.name;
        json values = json::object();
        for (std::size_t k = 0; k < varied_keys.size(); ++k)
          {
            const std::string value = value_of(varied_keys[k]);
            values[varied_keys[k]]  = {{"value", value.empty() ? json(nullptr) : json_value(value)},
                                       {"unit", varied_units[k]}};
          }
        line["values"] = values;
        line["status"] = row.status;
        line["reason"] = row.reason;
        json numbers   = json::object();
        for (const ResultNumber &number : row.numbers)
          numbers[number.name] = {{"value", report::json_number(number.value)},
                                  {"error", number.error ? report::json_number(*number.error) : json(nullptr)},
                                  {"unit", number.unit}};
        line["design numbers"]    = numbers;
        line["Newton iterations"] = row.newton_iterations;
        line["wall time [s]"]     = report::json_number(row.wall_time);
        line["ranks"]             = row.ranks;
        line["folder"]            = row.folder;
        line["caution"]           = report::caution;
        jsonl << report::json_text(line, false) << "\n";
      }
    return {csv.str(), jsonl.str()};
  }

  CollectReport collect_results(const SweepPlan &plan, const input::CaseSchema &schema)
  {
    CollectReport          report;
    std::vector<ResultRow> rows;
    for (const SweepCase &sweep_case : plan.cases)
      {
        ResultRow row;
        if (read_row(plan.results_folder, sweep_case.id, sweep_case.fingerprint, row))
          {
            report.failures += row.status != status::converged;
            bool counted = false;
            for (auto &[name, count] : report.by_status)
              if (name == row.status)
                counted = ++count > 0;
            if (!counted)
              report.by_status.emplace_back(row.status, 1);
            rows.push_back(row);
          }
        else
          report.missing.push_back(sweep_case.id);
      }
    report.rows = rows.size();
    std::vector<std::string> units;
    for (const std::string &key : plan.varied_keys)
      units.push_back(unit_of_key(schema, key));
    const auto [csv, jsonl] = table_text(rows, plan.varied_keys, units, plan.has_names);
    std::filesystem::create_directories(plan.results_folder);
    report.csv_path   = (std::filesystem::path(plan.results_folder) / "results.csv").string();
    report.jsonl_path = (std::filesystem::path(plan.results_folder) / "results.jsonl").string();
    report::write_file_atomically(report.csv_path, csv);
    report::write_file_atomically(report.jsonl_path, jsonl);

    // Fluid samples: the third table. Without them, one an earlier sweep wrote into this folder
    // would stand beside a table it does not belong to; the picture of earlier tables goes
    // either way (the runner draws it again from the new ones).
    const std::filesystem::path folder(plan.results_folder);
    const std::filesystem::path fluid_csv   = folder / "fluid_uncertainty.csv";
    const std::filesystem::path fluid_jsonl = folder / "fluid_uncertainty.jsonl";
    std::filesystem::remove(folder / "fluid_uncertainty.png");
    if (!plan.fluid_samples)
      {
        std::filesystem::remove(fluid_csv);
        std::filesystem::remove(fluid_jsonl);
        return report;
      }
    const std::vector<FluidGroup> groups = fluid_uncertainty(plan, rows);
    std::vector<std::string>      group_units;
    for (const std::string &key : plan.group_keys())
      group_units.push_back(unit_of_key(schema, key));
    const auto [fluid_csv_text, fluid_jsonl_text] =
      fluid_uncertainty_tables(groups, plan.group_keys(), group_units, plan.fluid_samples->fitted);
    report.fluid_csv_path   = fluid_csv.string();
    report.fluid_jsonl_path = fluid_jsonl.string();
    report::write_file_atomically(report.fluid_csv_path, fluid_csv_text);
    report::write_file_atomically(report.fluid_jsonl_path, fluid_jsonl_text);
    report.fluid_summary      = fluid_uncertainty_summary(groups, report.fluid_csv_path);
    report.fluid_plot_numbers = fluid_plot_numbers(groups, plan.plot_number);
    return report;
  }
} // namespace lentus::sweep
