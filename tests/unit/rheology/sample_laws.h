// Parameter sets used by the rheology tests: one or more per registered law,
// chosen so that shear thinning and thickening and both sides of every
// exponent (m, a, n around 1) are covered. Invented values, used only as
// inputs; every expected result is computed from the formulas.
#pragma once

#include "rheology/parameter_table.h"

#include <ostream>
#include <string>
#include <vector>

namespace lentus::rheology::testing
{
  struct SampleLaw
  {
    std::string     label;
    std::string     law;
    ParameterValues values;
  };

  /// GoogleTest prints the label, not the bytes.
  inline void PrintTo(const SampleLaw &sample, std::ostream *stream)
  {
    *stream << sample.label;
  }

  inline std::vector<SampleLaw> sample_laws()
  {
    return {
      {"Newtonian", "Newtonian", {{"Viscosity", 2.5}}},
      {"PowerLawThinning", "Power law", {{"Consistency", 10.}, {"Flow index", 0.4}, {"Maximum viscosity", 1e9}}},
      {"PowerLawThickening", "Power law", {{"Consistency", 2.}, {"Flow index", 1.6}, {"Minimum viscosity", 1e-12}}},
      {"CrossBelowOne", "Cross",
       {{"Zero-shear viscosity", 500.}, {"Infinite-shear viscosity", 0.2}, {"Time constant", 0.3}, {"Rate index", 0.7}}},
      {"CrossAboveOne", "Cross", {{"Zero-shear viscosity", 80.}, {"Time constant", 2.}, {"Rate index", 1.3}}},
      {"Carreau", "Carreau-Yasuda", {{"Zero-shear viscosity", 3000.}, {"Time constant", 0.8}, {"Flow index", 0.35}}},
      {"CarreauYasudaSmallA", "Carreau-Yasuda",
       {{"Zero-shear viscosity", 1500.},
        {"Infinite-shear viscosity", 0.5},
        {"Time constant", 0.05},
        {"Flow index", 0.3},
        {"Yasuda exponent", 0.6}}},
      {"Bingham", "Bingham", {{"Plastic viscosity", 0.5}, {"Yield stress", 20.}, {"Regularization exponent", 1e3}}},
      {"HerschelBulkleyThinning", "Herschel-Bulkley",
       {{"Consistency", 3.}, {"Flow index", 0.45}, {"Yield stress", 15.}, {"Regularization exponent", 500.},
        {"Shear-rate floor", 1e-9}}},
      {"HerschelBulkleyThickening", "Herschel-Bulkley",
       {{"Consistency", 0.8}, {"Flow index", 1.4}, {"Yield stress", 5.}, {"Regularization exponent", 200.}}},
    };
  }
} // namespace lentus::rheology::testing
