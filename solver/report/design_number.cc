#include "solver/report/design_number.h"

#include <stdexcept>

namespace lentus::report
{
  const char *to_string(const Group group)
  {
    switch (group)
      {
        case Group::flow:
          return "flow";
        case Group::die:
          return "die";
        case Group::vessel:
          return "vessel";
        case Group::energy:
          return "energy";
        case Group::regions:
          return "regions";
        case Group::heat:
          return "heat";
      }
    return "flow";
  }

  void DesignNumbers::add(DesignNumber number)
  {
    if (find(number.name))
      throw std::logic_error("design number '" + number.name + "' given twice");
    entries.push_back(std::move(number));
  }

  void DesignNumbers::add(const std::string &name, const std::string &symbol, const double value,
                          const std::string &unit, const Group group, const bool key)
  {
    DesignNumber number;
    number.name   = name;
    number.symbol = symbol;
    number.unit   = unit;
    number.value  = value;
    number.group  = group;
    number.key    = key;
    add(std::move(number));
  }

  void DesignNumbers::append(const DesignNumbers &other)
  {
    for (const DesignNumber &number : other.all())
      add(number);
  }

  const DesignNumber *DesignNumbers::find(const std::string &name) const
  {
    for (const DesignNumber &number : entries)
      if (number.name == name)
        return &number;
    return nullptr;
  }

  double DesignNumbers::value(const std::string &name) const
  {
    if (const DesignNumber *number = find(name))
      return number->value;
    throw std::out_of_range("no design number '" + name + "'");
  }

  void DesignNumbers::replace(const DesignNumber &number)
  {
    for (DesignNumber &entry : entries)
      if (entry.name == number.name)
        {
          entry = number;
          return;
        }
    throw std::out_of_range("no design number '" + number.name + "'");
  }

  void DesignNumbers::mark_key(const std::string &name)
  {
    for (DesignNumber &number : entries)
      if (number.name == name)
        number.key = true;
  }
} // namespace lentus::report
