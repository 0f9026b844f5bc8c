#include "rheology/law_registry.h"

#include <stdexcept>

namespace lentus::rheology
{
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
