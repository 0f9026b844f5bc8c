#include "rheology/fit/flow_curve_data.h"

#include "rheology/parameter_table.h"

#include <algorithm>
#include <cctype>
#include <cerrno>
#include <cmath>
#include <cstdlib>
#include <fstream>
#include <limits>
#include <map>
#include <set>

namespace lentus::rheology::fit
{
  namespace
  {
    std::string describe_location(const std::string &file, const int line)
    {
      return file + (line > 0 ? ":" + std::to_string(line) : std::string());
    }

    std::string trim(const std::string &text)
    {
      const auto first = text.find_first_not_of(" \t\r\n");
      if (first == std::string::npos)
        return "";
      const auto last = text.find_last_not_of(" \t\r\n");
      return text.substr(first, last - first + 1);
    }

    /// Lower case with runs of blanks, '_' and '-' collapsed to one space.
    std::string normalized(const std::string &text)
    {
      std::string result;
      for (const char c : trim(text))
        {
          const bool blank = c == ' ' || c == '\t' || c == '_' || c == '-';
          if (blank)
            {
              if (!result.empty() && result.back() != ' ')
                result += ' ';
            }
          else
            result += static_cast<char>(std::tolower(static_cast<unsigned char>(c)));
        }
      return trim(result);
    }

    std::vector<std::string> split_fields(const std::string &line)
    {
      std::vector<std::string> fields;
      std::string              field;
      for (const char c : line)
        if (c == ',')
          {
            fields.push_back(trim(field));
            field.clear();
          }
        else
          field += c;
      fields.push_back(trim(field));
      return fields;
    }

    /// Units by quantity: name (normalized: lower case, no blanks) -> factor to SI.
    const std::map<std::string, std::vector<std::pair<std::string, double>>> &unit_table()
    {
      static const std::map<std::string, std::vector<std::pair<std::string, double>>> table{
        {"shear rate", {{"1/s", 1.}, {"s^-1", 1.}, {"s-1", 1.}}},
        {"shear stress", {{"pa", 1.}, {"kpa", 1e3}, {"mpa", 1e6}, {"dyn/cm^2", 0.1}, {"dyn/cm2", 0.1}}},
        {"viscosity",
         {{"pas", 1.}, {"pa.s", 1.}, {"pa*s", 1.}, {"mpas", 1e-3}, {"mpa.s", 1e-3}, {"kpas", 1e3}, {"cp", 1e-3},
          {"p", 0.1}}},
      };
      return table;
    }

    /// Allowed spellings shown in messages (the table above uses lower case without blanks;
    /// "mPa s" and "MPa" differ only in case, so case matters for those two).
    const std::map<std::string, std::string> &shown_units()
    {
      static const std::map<std::string, std::string> shown{
        {"shear rate", "1/s, s^-1"},
        {"shear stress", "Pa, kPa, MPa, dyn/cm^2"},
        {"viscosity", "Pa s, mPa s, kPa s, cP, P"},
        {"temperature", "K, degC"},
      };
      return shown;
    }

    std::string compact(const std::string &unit)
    {
      std::string result;
      for (const char c : unit)
        if (c != ' ')
          result += c;
      return result;
    }

    /// Kelvin from a temperature in `unit` ("K" or degrees Celsius).
    double to_kelvin(const double value, const std::string &unit)
    {
      return unit == "K" ? value : value + 273.15;
    }

    bool is_temperature_unit(const std::string &unit)
    {
      return unit == "K" || unit == "degC" || unit == "C" || unit == "°C";
    }

    struct Column
    {
      std::string quantity; ///< "shear rate", "shear stress", "viscosity", "temperature"
      std::string header;   ///< as written, for messages
      std::string unit;     ///< as written (or from the options)
      double      factor = 1.;
      std::size_t index  = 0;
    };

    std::string column_label(const Column &column)
    {
      return std::to_string(column.index + 1) + " '" + column.header + "'";
    }
  } // namespace

  DataError::DataError(const std::string &file_,
                       const int line_,
                       const std::string &column,
                       const std::string &value_text,
                       const std::string &problem,
                       const std::string &allowed)
    : std::invalid_argument(describe_location(file_, line_) + ": " +
                            (column.empty() ? std::string()
                                            : "column " + column + (value_text.empty() ? "" : " = " + value_text) +
                                                ": ") +
                            problem + "; allowed: " + allowed)
    , file(file_)
    , line(line_)
  {}

  double unit_factor(const std::string &quantity, const std::string &unit)
  {
    const auto &table = unit_table();
    const auto  found = table.find(quantity);
    if (found == table.end())
      throw std::invalid_argument("no units for " + quantity);
    std::string key = compact(unit);
    // "MPa" (megapascal) and "mPa s" (millipascal second) differ only in case.
    if (quantity == "shear stress" && key == "MPa")
      return 1e6;
    if (quantity == "shear stress" && key == "mPa")
      return 1e-3;
    std::transform(key.begin(), key.end(), key.begin(), [](unsigned char c) { return std::tolower(c); });
    for (const auto &[name, factor] : found->second)
      if (name == key)
        return factor;
    throw std::invalid_argument("unknown unit [" + unit + "] for " + quantity);
  }

  std::string allowed_units(const std::string &quantity)
  {
    const auto found = shown_units().find(quantity);
    return found == shown_units().end() ? "" : found->second;
  }

  std::vector<double> FlowCurveData::temperatures() const
  {
    std::set<double> distinct;
    if (has_temperature)
      for (const Measurement &point : points)
        distinct.insert(point.temperature);
    return {distinct.begin(), distinct.end()};
  }

  FlowCurveData read_flow_curve(std::istream &input, const std::string &source, const UnitOptions &units)
  {
    const std::string known = "shear rate, shear stress, viscosity, temperature (each with an optional [unit])";
    FlowCurveData     data;
    data.source = source;

    std::vector<Column> columns;
    std::string         text;
    int                 line_number = 0;
    int                 header_line = 0;
    const Column       *rate = nullptr, *stress = nullptr, *viscosity = nullptr, *temperature = nullptr;

    while (std::getline(input, text))
      {
        ++line_number;
        const std::string line = trim(text);
        if (line.empty() || line[0] == '#')
          continue;
        const std::vector<std::string> fields = split_fields(line);

        if (columns.empty())
          {
            // The header: "name [unit]" per column.
            header_line = line_number;
            for (std::size_t i = 0; i < fields.size(); ++i)
              {
                Column column;
                column.header = fields[i];
                column.index  = i;
                std::string name = fields[i];
                if (const auto open = name.find('['); open != std::string::npos)
                  {
                    const auto close = name.find(']', open);
                    if (close == std::string::npos)
                      throw DataError(source, line_number, column_label(column), "", "unit bracket not closed",
                                      "name [unit], e.g. shear rate [1/s]");
                    column.unit = trim(name.substr(open + 1, close - open - 1));
                    name        = name.substr(0, open);
                  }
                column.quantity = normalized(name);
                if (column.quantity == "stress")
                  column.quantity = "shear stress";
                if (column.quantity == "viscosity" || column.quantity == "shear viscosity" ||
                    column.quantity == "apparent viscosity")
                  column.quantity = "viscosity";
                const std::set<std::string> quantities{"shear rate", "shear stress", "viscosity", "temperature"};
                if (!quantities.count(column.quantity))
                  throw DataError(source, line_number, column_label(column), "",
                                  fields[i].empty() ? "empty column name" : "unknown column", known);
                for (const Column &other : columns)
                  if (other.quantity == column.quantity)
                    throw DataError(source, line_number, column_label(column), "",
                                    "a second " + column.quantity + " column (first: column " +
                                      column_label(other) + ")",
                                    "each quantity once");
                if (column.unit.empty())
                  column.unit = column.quantity == "shear rate"     ? units.shear_rate
                                : column.quantity == "shear stress" ? units.shear_stress
                                : column.quantity == "viscosity"    ? units.viscosity
                                                                    : units.temperature;
                if (column.quantity == "temperature")
                  {
                    if (column.unit.empty())
                      column.unit = "K";
                    if (column.unit == "°C" || column.unit == "C")
                      column.unit = "degC";
                    if (!is_temperature_unit(column.unit))
                      throw DataError(source, line_number, column_label(column), "",
                                      "unknown unit [" + column.unit + "]", allowed_units("temperature"));
                  }
                else if (!column.unit.empty())
                  {
                    try
                      {
                        column.factor = unit_factor(column.quantity, column.unit);
                      }
                    catch (const std::invalid_argument &)
                      {
                        throw DataError(source, line_number, column_label(column), "",
                                        "unknown unit [" + column.unit + "] for " + column.quantity,
                                        allowed_units(column.quantity));
                      }
                  }
                columns.push_back(column);
              }
            for (const Column &column : columns)
              {
                if (column.quantity == "shear rate")
                  rate = &column;
                if (column.quantity == "shear stress")
                  stress = &column;
                if (column.quantity == "viscosity")
                  viscosity = &column;
                if (column.quantity == "temperature")
                  temperature = &column;
              }
            if (!rate)
              throw DataError(source, line_number, "", "", "the header has no shear rate column",
                              "a header naming the columns: " + known);
            if (!stress && !viscosity)
              throw DataError(source, line_number, "", "",
                              "the header has neither a shear stress nor a viscosity column",
                              "a header naming the columns: " + known);
            data.has_temperature = temperature != nullptr;
            continue;
          }

        if (fields.size() != columns.size())
          throw DataError(source, line_number, "", "",
                          std::to_string(fields.size()) + " values where the header (line " +
                            std::to_string(header_line) + ") names " + std::to_string(columns.size()) + " columns",
                          "one value per column, separated by commas");

        std::vector<double> values(columns.size());
        for (const Column &column : columns)
          {
            const std::string &field = fields[column.index];
            char              *end   = nullptr;
            errno                    = 0;
            const double value       = std::strtod(field.c_str(), &end);
            if (field.empty() || end != field.c_str() + field.size())
              throw DataError(source, line_number, column_label(column), field.empty() ? "(empty)" : field,
                              "not a number", "a finite real number");
            if (!std::isfinite(value))
              throw DataError(source, line_number, column_label(column), field, "not a finite number",
                              "a finite real number");
            if (column.quantity == "temperature")
              {
                values[column.index] = to_kelvin(value, column.unit);
                if (!(values[column.index] > 0.))
                  throw DataError(source, line_number, column_label(column), field, "at or below absolute zero",
                                  "a temperature > 0 K");
              }
            else
              {
                if (!(value > 0.))
                  throw DataError(source, line_number, column_label(column), field, "must be > 0",
                                  column.quantity == "shear rate"
                                    ? "a shear rate > 0 (the laws are fitted on log scales; drop points at rest)"
                                    : "a " + column.quantity + " > 0 (the fit works on log stress)");
                values[column.index] = value * column.factor;
              }
          }
        Measurement point;
        point.shear_rate   = values[rate->index];
        point.shear_stress = stress ? values[stress->index] : values[viscosity->index] * point.shear_rate;
        point.temperature  = temperature ? values[temperature->index] : std::numeric_limits<double>::quiet_NaN();
        point.line         = line_number;
        data.points.push_back(point);
      }

    if (columns.empty())
      throw DataError(source, 0, "", "", "empty file: no header line and no data",
                      "a header naming the columns (" + known + ") followed by one line per measured point");
    if (data.points.empty())
      throw DataError(source, header_line, "", "", "no data below the header",
                      "one line per measured point, e.g. 0.1,12.5");
    return data;
  }

  FlowCurveData read_flow_curve_file(const std::string &path, const UnitOptions &units)
  {
    std::ifstream input(path);
    if (!input)
      throw DataError(path, 0, "", "", "cannot open the data file", "a readable CSV file");
    return read_flow_curve(input, path, units);
  }
} // namespace lentus::rheology::fit
