#include "rheology/law_registry.h"

#include <cmath>
#include <stdexcept>

namespace lentus::rheology
{
  std::optional<ContinuationPath> LawInfo::continuation_path(const ParameterValues &values) const
  {
    for (const Softening &softening : softenings)
      {
        const auto found = values.find(softening.key);
        if (found == values.end())
          throw std::logic_error("law " + name + " softens '" + softening.key + "', which it does not have");
        if (!softening.only_if_positive.empty() && !(values.at(softening.only_if_positive) > 0.))
          continue;
        const double target = found->second;
        if (softening.path == Softening::Path::linear && target == softening.easy)
          continue;
        ContinuationPath path{softening.key, {}};
        for (unsigned int k = 0; k <= softening.steps; ++k)
          {
            const double step = k;
            // Geometric: the exponent of 10 in equal steps (exact in binary for the usual 4 steps).
            path.values.push_back(
              softening.path == Softening::Path::linear ?
                softening.easy + (target - softening.easy) * step / softening.steps :
                target * std::pow(10., std::log10(softening.easy) * (1. - step / softening.steps)));
          }
        path.values.back() = target;
        return path;
      }
    return std::nullopt;
  }

  LawRegistry &registry()
  {
    static LawRegistry the_registry;
    return the_registry;
  }

  void LawRegistry::add(LawInfo law)
  {
    if (has(law.name))
      throw std::logic_error("viscosity law '" + law.name + "' registered twice");
    entries.push_back(std::move(law));
  }

  bool LawRegistry::has(const std::string &name) const
  {
    for (const LawInfo &law : entries)
      if (law.name == name)
        return true;
    return false;
  }

  const LawInfo &LawRegistry::find(const std::string &name) const
  {
    for (const LawInfo &law : entries)
      if (law.name == name)
        return law;
    std::string list;
    for (const LawInfo &law : entries)
      list += (list.empty() ? "" : ", ") + law.name;
    throw InvalidParameter("Viscosity law", name, "unknown viscosity law", "one of " + list);
  }

  std::vector<std::string> LawRegistry::names() const
  {
    std::vector<std::string> list;
    for (const LawInfo &law : entries)
      list.push_back(law.name);
    return list;
  }

  std::unique_ptr<ViscosityLaw> LawRegistry::create(const std::string &name,
                                                    const ParameterValues &values) const
  {
    const LawInfo &law = find(name);
    return law.create(resolve_parameters(law.parameters, values, "viscosity law " + name));
  }
} // namespace lentus::rheology
