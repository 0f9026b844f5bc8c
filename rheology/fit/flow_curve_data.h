// Rheometer data for fitting: a CSV file of shear rate against shear stress
// (or viscosity), optionally with a temperature column. Plain C++.
//
// Format (see DEVELOPERS.md, "Rheometer data"):
//   # comment lines and blank lines are ignored
//   shear rate [1/s],shear stress [Pa],temperature [K]
//   0.01,35.2,483.15
// Columns are named in the words of the trade, each with an optional unit in
// brackets: "shear rate" [1/s, s^-1], "shear stress" [Pa, kPa, MPa, mPa, dyn/cm^2],
// "viscosity" [Pa s, mPa s, kPa s, cP, P], "temperature" [K, degC, C].
// A column without a unit takes it from UnitOptions, else SI.
#pragma once

#include <iosfwd>
#include <stdexcept>
#include <string>
#include <vector>

namespace lentus::rheology::fit
{
  /// Bad rheometer data. what() reads
  /// "file:line: column 'name' = value: problem; allowed: ...".
  class DataError : public std::invalid_argument
  {
  public:
    DataError(const std::string &file, int line, const std::string &column, const std::string &value_text,
              const std::string &problem, const std::string &allowed);
    std::string file;
    int         line; ///< 1-based; 0 when the whole file is concerned
  };

  /// Units for columns whose header gives none (empty: SI).
  struct UnitOptions
  {
    std::string shear_rate, shear_stress, viscosity, temperature;
  };

  /// One measured point, in SI units.
  struct Measurement
  {
    double shear_rate;   ///< [1/s] > 0
    double shear_stress; ///< [Pa] > 0
    double temperature;  ///< [K] > 0; NaN when the file has no temperature column
    int    line;         ///< line in the file
  };

  struct FlowCurveData
  {
    std::string              source; ///< file name, for messages
    std::vector<Measurement> points;
    bool                     has_temperature = false;

    /// The distinct temperatures [K], ascending (empty without a temperature column).
    std::vector<double> temperatures() const;
  };

  /// Reads CSV data from `input`; `source` names it in messages.
  /// Throws DataError naming file, line and column for anything unusable.
  FlowCurveData read_flow_curve(std::istream &input, const std::string &source, const UnitOptions &units = {});

  /// Reads the CSV file at `path`; throws DataError if it cannot be opened.
  FlowCurveData read_flow_curve_file(const std::string &path, const UnitOptions &units = {});

  /// Factor to SI of a unit of `quantity` ("shear rate", "shear stress", "viscosity");
  /// throws std::invalid_argument listing the allowed units. Temperature units
  /// are affine and handled by to_kelvin.
  double unit_factor(const std::string &quantity, const std::string &unit);

  /// The allowed units of `quantity`, for messages.
  std::string allowed_units(const std::string &quantity);
} // namespace lentus::rheology::fit
