// Carries the uncertainty of a fit into design numbers: a sweep file whose
// cases sample the fitted parameters' confidence region by Latin hypercube
// (McKay, Beckman & Conover 1979, Technometrics 21:239).
//
// Format (version 1), read by the sweep runner:
//   # comments
//   fluid samples = fitted                (the cases sample a fluid; `fitted` holds the estimates)
//   case NAME
//     Section/Subsection/Key = value      (one override, as `--set` takes it)
//   end
// Each case is the base case (the Rheology section `lentus fit` writes) with
// the listed values replaced. The first case, "fitted", holds the estimates; the
// `fluid samples` line makes a sweep state each design number's spread over the
// samples (fluid_uncertainty.csv). It is left out if the fitted case is.
#pragma once

#include "rheology/fit/law_fit.h"

#include <cstdint>
#include <string>
#include <vector>

namespace lentus::rheology::fit
{
  /// `samples` points of the fitted parameters (one row per sample, one value per
  /// estimate of `fit`, in the same order). Latin hypercube in the standard normal
  /// space, mapped through the Cholesky factor of the fit covariance (in the fit
  /// variables: logarithms of positive parameters), so the samples follow the fit's
  /// approximate sampling distribution: about 95% of them lie in the 95% region.
  /// Deterministic for a given seed.
  std::vector<std::vector<double>> latin_hypercube_samples(const LawFit &fit, std::size_t samples, std::uint64_t seed);

  /// The sweep file text; `source` names the data in its header.
  std::string sweep_file(const LawFit &fit, std::size_t samples, std::uint64_t seed, const std::string &source);
} // namespace lentus::rheology::fit
