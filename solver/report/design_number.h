// One design number: what a user reads off a run (die pressure, torque, cavern
// radius...), with its unit, a symbol, and room for how accurate it is.
#pragma once

#include <optional>
#include <string>
#include <vector>

namespace lentus::report
{
  /// What a number is about; the report and the results table group by it.
  enum class Group
  {
    flow,    ///< flow rates, pressures, forces and torques on roles, speeds
    die,     ///< developed flow in straight sections, entrance loss
    vessel,  ///< impeller torque and power, dimensionless groups, dead zones, cavern
    energy,  ///< power input and dissipation
    regions, ///< areas, volumes, unyielded fractions
    heat     ///< temperatures, heat flows, thermal groups (with the energy equation)
  };

  /// "flow", "die", "vessel", "energy", "regions", "heat".
  const char *to_string(Group group);

  /// How accurate a number is (solver/report/accuracy.h). Empty until an estimate is made: a mesh
  /// error from the sequence of meshes a run solved on, a regularization error from a second
  /// Papanastasiou exponent; the methods say how, in words.
  struct Accuracy
  {
    std::optional<double> mesh_error;           ///< same unit as the value
    std::string           mesh_method = "not estimated";
    std::optional<double> order;                ///< of convergence with the mesh, as used
    std::optional<double> regularization_error; ///< same unit as the value
    std::string           regularization_method = "not estimated";
    std::optional<double> extrapolated;         ///< the value with the estimated errors removed
  };

  struct DesignNumber
  {
    std::string name;   ///< unique within a run, e.g. "pressure drop inlet to outlet"
    std::string symbol; ///< short, ASCII, e.g. "dp"
    std::string unit;   ///< SI, e.g. "Pa", "m^3/s", "N m/m", "-"
    double      value = 0.;
    Group       group = Group::flow;
    bool        key   = false; ///< one of the few numbers a user came for (shown first)
    /// False for a number whose change from mesh to mesh is not an error that shrinks (the location of
    /// an extreme, which jumps between nodes): it gets no error bar.
    bool        estimable = true;
    Accuracy    accuracy;
  };

  /// Appends numbers in order; a name given twice is a programming error (std::logic_error).
  class DesignNumbers
  {
  public:
    void add(DesignNumber number);
    void add(const std::string &name, const std::string &symbol, double value, const std::string &unit, Group group,
             bool key = false);
    void append(const DesignNumbers &other);

    const std::vector<DesignNumber> &all() const { return entries; }
    const DesignNumber *find(const std::string &name) const;
    /// The value of `name`; throws std::out_of_range if absent.
    double value(const std::string &name) const;
    /// Marks `name` as a key number if present.
    void mark_key(const std::string &name);
    /// Replaces the number of the same name; throws std::out_of_range if absent.
    void replace(const DesignNumber &number);

  private:
    std::vector<DesignNumber> entries;
  };
} // namespace lentus::report
