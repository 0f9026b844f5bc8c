// Registry of viscosity laws. A law registers itself with one statement at the
// bottom of its own file (rheology/laws/<name>.cc):
//
//   const LawRegistration<CarreauYasuda> registration{
//     "Carreau-Yasuda", "formula", "description",
//     {{"Zero-shear viscosity", "eta_0", &CarreauYasuda::eta_0, "Pa s", "...", Range::above(0.)}, ...},
//     &evaluate, &yield_stress, &validate,
//     {{"Flow index", Softening::Path::linear, 1.}},     // what continuation may soften
//     "");                                                // the regularization parameter, if any
//
// The parameter table feeds the case-file declaration, `lentus laws` and the
// rheometer fitter, so nothing is written twice.
#pragma once

#include "rheology/parameter_table.h"
#include "rheology/viscosity_law.h"

#include <functional>
#include <memory>
#include <optional>
#include <string>
#include <vector>

namespace lentus::rheology
{
  /// A parameter that continuation may soften when a solve fails: the solver starts from an easier
  /// value and steps to the case's own. Laws say which of their parameters make a problem hard.
  struct Softening
  {
    enum class Path
    {
      geometric, ///< from `easy` x the case's value up to it, in `steps` equal ratios (e.g. M from M/1000)
      linear     ///< from the value `easy` to the case's, in `steps` equal steps (e.g. n from 1)
    };
    std::string key;  ///< the parameter softened
    Path        path = Path::linear;
    double      easy = 1.;
    unsigned int steps = 5;
    /// Applies only where this parameter is > 0 (e.g. the yield stress for M); "" for always. A
    /// linear softening does not apply where the case's value already is the easy one.
    std::string only_if_positive;
  };

  /// The values of continuation in one parameter, the case's own last.
  struct ContinuationPath
  {
    std::string         key;
    std::vector<double> values;
  };

  /// Everything the rest of Lentus knows about one law.
  struct LawInfo
  {
    std::string                name;        ///< registered name, e.g. "Cross"
    std::string                formula;     ///< eta(gamma_dot) in plain text
    std::string                description; ///< one or two sentences
    std::vector<ParameterInfo> parameters;  ///< in the order of `create`'s vector
    /// Builds the law from values in table order. Checks ranges and the
    /// relations between parameters; throws InvalidParameter.
    std::function<std::unique_ptr<ViscosityLaw>(const std::vector<double> &)> create;
    /// What continuation may soften, in the order to try; the first that applies is taken.
    std::vector<Softening> softenings;
    /// The parameter of a regularization whose error the run estimates by solving again at a larger
    /// value (the Papanastasiou exponent M); "" when the law is not regularized.
    std::string regularization;

    /// The continuation path for a fluid with these complete parameter values (by key), or
    /// nothing when no softening applies.
    std::optional<ContinuationPath> continuation_path(const ParameterValues &values) const;
  };

  /// All registered laws, in registration order.
  class LawRegistry
  {
  public:
    /// Adds a law; throws std::logic_error on a duplicate name.
    void add(LawInfo law);

    /// The law called `name`; throws InvalidParameter (key "Viscosity law")
    /// listing the registered names when there is none.
    const LawInfo &find(const std::string &name) const;

    bool has(const std::string &name) const;

    std::vector<std::string>    names() const;
    const std::vector<LawInfo> &laws() const { return entries; }

    /// Builds law `name` from values by key, completed by the table's defaults.
    std::unique_ptr<ViscosityLaw> create(const std::string &name,
                                         const ParameterValues &values) const;

  private:
    std::vector<LawInfo> entries;
  };

  /// The one registry (function-local static: no initialization-order issue).
  LawRegistry &registry();

  /// A law whose parameters are the struct P, evaluated by free functions.
  template <class P>
  class TabledLaw : public ViscosityLaw
  {
  public:
    using Evaluate    = Viscosity (*)(const P &, double);
    using YieldStress = double (*)(const P &);

    TabledLaw(std::string name_, P parameters_, Evaluate evaluate_, YieldStress yield_)
      : law_name(std::move(name_))
      , parameters(parameters_)
      , evaluate_function(evaluate_)
      , yield_function(yield_)
    {}

    Viscosity   evaluate(double gamma_dot) const override { return evaluate_function(parameters, gamma_dot); }
    double      yield_stress() const override { return yield_function ? yield_function(parameters) : 0.; }
    std::string name() const override { return law_name; }

  private:
    std::string law_name;
    P           parameters;
    Evaluate    evaluate_function;
    YieldStress yield_function;
  };

  /// Registers the law with parameter struct P at static-initialization time.
  template <class P>
  struct LawRegistration
  {
    struct Row
    {
      std::string key;
      std::string symbol;
      double P::*member;
      std::string unit;
      std::string meaning;
      Range       range;
      double      default_value = required;
    };
    using Evaluate    = typename TabledLaw<P>::Evaluate;
    using YieldStress = typename TabledLaw<P>::YieldStress;
    /// Checks relations between parameters; throws InvalidParameter.
    using Validate = void (*)(const P &);

    LawRegistration(const std::string &name,
                    const std::string &formula,
                    const std::string &description,
                    const std::vector<Row> &rows,
                    Evaluate evaluate,
                    YieldStress yield_stress,
                    Validate validate,
                    std::vector<Softening> softenings = {},
                    std::string regularization = "")
    {
      LawInfo info;
      info.name        = name;
      info.formula     = formula;
      info.description = description;
      info.softenings  = std::move(softenings);
      info.regularization = std::move(regularization);
      for (const Row &row : rows)
        info.parameters.push_back({row.key, row.symbol, row.unit, row.meaning, row.range, row.default_value});
      info.create = [name, rows, evaluate, yield_stress, validate](const std::vector<double> &values)
        -> std::unique_ptr<ViscosityLaw> {
        if (values.size() != rows.size())
          throw std::logic_error("law " + name + " needs " + std::to_string(rows.size()) + " parameters");
        P parameters{};
        for (std::size_t i = 0; i < rows.size(); ++i)
          {
            if (!rows[i].range.contains(values[i]))
              throw InvalidParameter(rows[i].key, format_value(values[i]), "out of range for " + name,
                                     rows[i].range.describe() + " [" + rows[i].unit + "]");
            parameters.*(rows[i].member) = values[i];
          }
        if (validate)
          validate(parameters);
        return std::make_unique<TabledLaw<P>>(name, parameters, evaluate, yield_stress);
      };
      registry().add(std::move(info));
    }
  };
} // namespace lentus::rheology
