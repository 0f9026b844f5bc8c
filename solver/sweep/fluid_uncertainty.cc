#include "solver/sweep/fluid_uncertainty.h"

#include "solver/report/caution.h"
#include "solver/report/json_text.h"
#include "solver/sweep/results_table.h"
#include "solver/sweep/sweep_file.h"
#include "solver/sweep/table_cells.h"

#include <algorithm>
#include <cmath>
#include <cstdio>
#include <map>
#include <set>
#include <sstream>
#include <stdexcept>

#include <nlohmann/json.hpp>

namespace lentus::sweep
{
  namespace
  {
    std::string format(const char *pattern, const double value)
    {
      char buffer[48];
      std::snprintf(buffer, sizeof buffer, pattern, value);
      return buffer;
    }

    std::string count_text(const std::size_t count, const std::string &one, const std::string &many)
    {
      return std::to_string(count) + " " + (count == 1 ? one : many);
    }

    /// What to keep in mind about one number's span, "" if nothing.
    std::string note_of(const FluidGroup &group, const FluidSpread &spread, const std::size_t converged_rows)
    {
      std::vector<std::string> notes;
      if (group.fitted_status.empty())
        notes.push_back("the fitted case has no result yet");
      else if (group.fitted_status != status::converged)
        notes.push_back("the fitted case: " + group.fitted_status + ", so no fitted value");
      else if (!spread.fitted)
        notes.push_back("the fitted case has no value of this number");
      if (group.failed > 0)
        notes.push_back(std::to_string(group.failed) + " of " + count_text(group.samples, "sample", "samples") +
                        " did not converge or failed and are left out: the span may be too narrow");
      if (group.missing > 0)
        notes.push_back(std::to_string(group.missing) + " of " + count_text(group.samples, "sample", "samples") +
                        " have no result yet");
      if (converged_rows > spread.converged)
        notes.push_back(
          count_text(converged_rows - spread.converged, "converged sample has", "converged samples have") +
          " no value of this number");
      if (spread.converged == 0)
        notes.push_back("no converged sample, so no span");
      else if (spread.converged == 1)
        notes.push_back("rough: one converged sample, so no spread");
      else if (spread.converged < samples_for_a_span)
        notes.push_back("rough: the range of " + std::to_string(spread.converged) + " samples covers on average " +
                        format("%.0f", 100. * expected_range_coverage(spread.converged)) +
                        "% of the fluid's spread, not 95% (that takes " + std::to_string(samples_for_a_span) +
                        " or more: lentus fit --samples)");
      if (spread.fitted && spread.low && (*spread.fitted < *spread.low || *spread.fitted > *spread.high))
        notes.push_back("the fitted value lies outside the span");
      std::string text;
      for (const std::string &note : notes)
        text += (text.empty() ? "" : "; ") + note;
      return text;
    }

    nlohmann::ordered_json optional_number(const std::optional<double> &value)
    {
      return value ? report::json_number(*value) : nlohmann::ordered_json(nullptr);
    }

    std::string optional_text(const std::optional<double> &value)
    {
      return value ? number_text(*value) : std::string();
    }
  } // namespace

  double quantile(std::vector<double> values, const double p)
  {
    if (values.empty() || !(p >= 0. && p <= 1.))
      throw std::invalid_argument("quantile: needs at least one value and 0 <= p <= 1");
    std::sort(values.begin(), values.end());
    // Hyndman & Fan (1996), definition 7, with 0-based indices: h - 1 = (n - 1) p.
    const double      h = static_cast<double>(values.size() - 1) * p;
    const std::size_t j = static_cast<std::size_t>(std::floor(h));
    if (j + 1 >= values.size())
      return values.back();
    return values[j] + (h - static_cast<double>(j)) * (values[j + 1] - values[j]);
  }

  double expected_range_coverage(const std::size_t n)
  {
    // E[F(x_(n)) - F(x_(1))] = (n - 1)/(n + 1) for n independent samples of any continuous
    // distribution F: F(x_(k)) is Beta(k, n + 1 - k) distributed, of mean k/(n + 1).
    return n < 2 ? 0. : static_cast<double>(n - 1) / static_cast<double>(n + 1);
  }

  std::vector<FluidGroup> fluid_uncertainty(const SweepPlan &plan, const std::vector<ResultRow> &rows)
  {
    std::vector<FluidGroup> groups;
    if (!plan.fluid_samples)
      return groups;
    const std::vector<std::string>          keys = plan.group_keys();
    std::map<std::string, const ResultRow *> by_id;
    for (const ResultRow &row : rows)
      by_id[row.id] = &row;
    auto row_of = [&](const std::string &id) -> const ResultRow * {
      const auto found = by_id.find(id);
      return found == by_id.end() ? nullptr : found->second;
    };

    // Groups in order of first appearance; the fitted case and the samples of each.
    std::vector<std::vector<std::string>> sample_ids;
    for (const SweepCase &sweep_case : plan.cases)
      {
        std::vector<std::pair<std::string, std::string>> values;
        for (const std::string &key : keys)
          for (const Override &value : sweep_case.overrides)
            if (value.path == key)
              values.emplace_back(key, value.value);
        std::size_t g = 0;
        while (g < groups.size() && groups[g].values != values)
          ++g;
        if (g == groups.size())
          {
            groups.emplace_back();
            groups.back().values = values;
            sample_ids.emplace_back();
          }
        if (sweep_case.name == plan.fluid_samples->fitted)
          groups[g].fitted_id = sweep_case.id;
        else
          sample_ids[g].push_back(sweep_case.id);
      }

    for (std::size_t g = 0; g < groups.size(); ++g)
      {
        FluidGroup      &group  = groups[g];
        const ResultRow *fitted = row_of(group.fitted_id);
        group.fitted_status     = fitted ? fitted->status : "";
        group.samples           = sample_ids[g].size();
        std::vector<const ResultRow *> converged, with_numbers;
        if (fitted)
          with_numbers.push_back(fitted);
        for (const std::string &id : sample_ids[g])
          {
            const ResultRow *row = row_of(id);
            if (!row)
              ++group.missing;
            else if (row->status == status::converged)
              converged.push_back(row);
            else
              ++group.failed;
            if (row)
              with_numbers.push_back(row);
          }
        group.converged = converged.size();

        // Every number any case of the group has, in order of first appearance (fitted case first).
        for (const ResultRow *row : with_numbers)
          for (const ResultNumber &number : row->numbers)
            {
              auto known = std::find_if(group.numbers.begin(), group.numbers.end(),
                                        [&](const FluidSpread &spread) { return spread.name == number.name; });
              if (known == group.numbers.end())
                {
                  FluidSpread spread;
                  spread.name = number.name;
                  spread.unit = number.unit;
                  group.numbers.push_back(spread);
                  known = group.numbers.end() - 1;
                }
              known->key = known->key || number.key;
            }
        for (FluidSpread &spread : group.numbers)
          {
            spread.samples = group.samples;
            if (fitted && fitted->status == status::converged)
              for (const ResultNumber &number : fitted->numbers)
                if (number.name == spread.name && std::isfinite(number.value))
                  {
                    spread.fitted       = number.value;
                    spread.fitted_error = number.error;
                  }
            std::vector<double> values;
            for (const ResultRow *row : converged)
              for (const ResultNumber &number : row->numbers)
                if (number.name == spread.name && std::isfinite(number.value))
                  values.push_back(number.value);
            spread.converged = values.size();
            if (!values.empty())
              {
                spread.low     = quantile(values, 0.025);
                spread.high    = quantile(values, 0.975);
                spread.minimum = *std::min_element(values.begin(), values.end());
                spread.maximum = *std::max_element(values.begin(), values.end());
              }
            spread.note = note_of(group, spread, converged.size());
          }
      }
    return groups;
  }

  std::pair<std::string, std::string> fluid_uncertainty_tables(const std::vector<FluidGroup> &groups,
                                                               const std::vector<std::string> &group_keys,
                                                               const std::vector<std::string> &group_units,
                                                               const std::string &fitted_name)
  {
    std::ostringstream csv, jsonl;
    for (std::size_t k = 0; k < group_keys.size(); ++k)
      csv << csv_cell(group_keys[k] + (group_units[k].empty() ? "" : " [" + group_units[k] + "]")) << ",";
    csv << "design number,unit,key number,fitted case,fitted status,fitted value,"
           "fitted error (mesh + regularization),samples,converged samples,2.5% quantile,97.5% quantile,minimum,"
           "maximum,note,uncertainty,quantiles,caution\n";
    for (const FluidGroup &group : groups)
      for (const FluidSpread &spread : group.numbers)
        {
          for (const auto &[key, value] : group.values)
            csv << csv_cell(value) << ",";
          csv << csv_cell(spread.name) << "," << csv_cell(spread.unit) << "," << (spread.key ? "yes" : "no") << ","
              << csv_cell(group.fitted_id + " (" + fitted_name + ")") << "," << csv_cell(group.fitted_status) << ","
              << optional_text(spread.fitted) << "," << optional_text(spread.fitted_error) << "," << spread.samples
              << "," << spread.converged << "," << optional_text(spread.low) << "," << optional_text(spread.high)
              << "," << optional_text(spread.minimum) << "," << optional_text(spread.maximum) << ","
              << csv_cell(spread.note) << "," << csv_cell(fluid_uncertainty_label) << "," << csv_cell(quantile_method)
              << "," << csv_cell(report::caution) << "\n";

          using json = nlohmann::ordered_json;
          json values = json::object();
          for (std::size_t k = 0; k < group.values.size(); ++k)
            values[group.values[k].first] = {{"value", json_value(group.values[k].second)},
                                             {"unit", k < group_units.size() ? group_units[k] : ""}};
          json line;
          line["values"]        = values;
          line["design number"] = spread.name;
          line["unit"]          = spread.unit;
          line["key"]           = spread.key;
          line["fitted case"]   = {{"case", group.fitted_id},
                                   {"name", fitted_name},
                                   {"status", group.fitted_status},
                                   {"value", optional_number(spread.fitted)},
                                   {"error", optional_number(spread.fitted_error)}};
          line["fluid"]         = {{"what", fluid_uncertainty_label},
                                   {"samples", spread.samples},
                                   {"converged samples", spread.converged},
                                   {"2.5% quantile", optional_number(spread.low)},
                                   {"97.5% quantile", optional_number(spread.high)},
                                   {"minimum", optional_number(spread.minimum)},
                                   {"maximum", optional_number(spread.maximum)},
                                   {"quantiles", quantile_method}};
          line["note"]          = spread.note;
          line["caution"]       = report::caution;
          jsonl << report::json_text(line, false) << "\n";
        }
    return {csv.str(), jsonl.str()};
  }

  std::string fluid_uncertainty_summary(const std::vector<FluidGroup> &groups, const std::string &table_name)
  {
    if (groups.empty())
      return "";
    const bool         any_key = std::any_of(groups.begin(), groups.end(), [](const FluidGroup &group) {
      return std::any_of(group.numbers.begin(), group.numbers.end(), [](const FluidSpread &s) { return s.key; });
    });
    std::ostringstream text;
    text << "Uncertainty from the fluid (fit's confidence region), " << (any_key ? "key numbers" : "first numbers")
         << " (every number, with minimum and maximum: " << table_name << "):\n";
    const std::size_t shown_groups = std::min<std::size_t>(groups.size(), 12);
    for (std::size_t g = 0; g < shown_groups; ++g)
      {
        const FluidGroup &group = groups[g];
        std::string       indent = "  ";
        if (!group.values.empty())
          {
            std::string place;
            for (const auto &[key, value] : group.values)
              place += (place.empty() ? "" : ", ") + key + " = " + value;
            text << "  at " << place << ":\n";
            indent = "    ";
          }
        std::vector<const FluidSpread *> shown;
        for (const FluidSpread &spread : group.numbers)
          if ((any_key ? spread.key : true) && shown.size() < (any_key ? 8u : 4u))
            shown.push_back(&spread);
        std::size_t width = 13;
        for (const FluidSpread *spread : shown)
          width = std::max(width, std::min<std::size_t>(spread->name.size(), 40));
        char line[320];
        std::snprintf(line, sizeof line, "%s%-*s  %-24s  %-11s  %-11s  %-9s  %s\n", indent.c_str(),
                      static_cast<int>(width), "design number", "fitted +/- mesh+reg.", "2.5%", "97.5%", "unit",
                      "converged samples");
        text << line;
        for (const FluidSpread *spread : shown)
          {
            const std::string fitted =
              spread->fitted ? format("%.5g", *spread->fitted) +
                                 (spread->fitted_error ? " +/- " + format("%.2g", *spread->fitted_error) : "") :
                               std::string("-");
            std::snprintf(line, sizeof line, "%s%-*s  %-24s  %-11s  %-11s  %-9s  %zu of %zu\n", indent.c_str(),
                          static_cast<int>(width), spread->name.c_str(), fitted.c_str(),
                          spread->low ? format("%.5g", *spread->low).c_str() : "-",
                          spread->high ? format("%.5g", *spread->high).c_str() : "-", spread->unit.c_str(),
                          spread->converged, spread->samples);
            text << line;
          }
        // Each note once per group (most hold for every number).
        std::vector<std::string> notes;
        for (const FluidSpread *spread : shown)
          {
            std::istringstream parts(spread->note);
            std::string        part;
            while (std::getline(parts, part, ';'))
              {
                const auto first = part.find_first_not_of(' ');
                if (first == std::string::npos)
                  continue;
                part = part.substr(first);
                if (part == "the fitted value lies outside the span")
                  part = spread->name + ": " + part;
                if (std::find(notes.begin(), notes.end(), part) == notes.end())
                  notes.push_back(part);
              }
          }
        for (const std::string &note : notes)
          text << indent << "Note: " << note << "\n";
      }
    if (groups.size() > shown_groups)
      text << "  ... " << groups.size() - shown_groups << " more groups in " << table_name << "\n";
    text << "  Span: " << quantile_method << ".\n";
    return text.str();
  }

  std::vector<std::string> fluid_plot_numbers(const std::vector<FluidGroup> &groups, const std::string &plot_number)
  {
    std::vector<std::string> names;
    if (groups.empty())
      return names;
    for (const FluidGroup &group : groups)
      for (const FluidSpread &spread : group.numbers)
        if (!plot_number.empty() && spread.name == plot_number)
          return {plot_number};
    for (const bool keys_only : {true, false})
      {
        for (const FluidGroup &group : groups)
          for (const FluidSpread &spread : group.numbers)
            if ((!keys_only || spread.key) && names.size() < 4 &&
                std::find(names.begin(), names.end(), spread.name) == names.end())
              names.push_back(spread.name);
        if (!names.empty())
          break;
      }
    return names;
  }
} // namespace lentus::sweep
