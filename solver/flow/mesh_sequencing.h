// How many coarser meshes Nonlinear solver/Mesh sequencing = automatic solves first.
#pragma once

namespace lentus::flow
{
  /// Coarser mesh levels for a final mesh of about `unknowns` unknowns built with `refinement`
  /// refinements of its coarse mesh: none up to 30000 unknowns; above, at least 2 (about 4x fewer
  /// unknowns per level) and as many as bring the first mesh down to about 15000 unknowns, at most
  /// 4 and never more than `refinement`.
  unsigned int automatic_coarser_levels(double unknowns, unsigned int refinement);
} // namespace lentus::flow
