// Point spacings for structured grids: the rows and columns of the shapes built from
// tensor-like grids (dies, vessels, obstacles), graded toward walls, corners and tips.
#pragma once

#include <limits>
#include <vector>

namespace lentus::meshes
{
  /// n + 1 points from `from` to `to`; cells up to 3x smaller toward the ends marked fine
  /// (sine grading: the count stays n, only the spacing changes).
  std::vector<double> graded(double from, double to, unsigned int n, bool fine_start, bool fine_end);

  /// Points from `from` to `to` whose cells start at about `fine` at the ends marked fine and grow
  /// by a factor 1.3 per cell away from them, up to about `largest` (uniform cells of about 2 `fine`
  /// if neither end is fine).
  std::vector<double> stretched(double from, double to, double fine, bool fine_start, bool fine_end,
                                double largest = std::numeric_limits<double>::infinity());

  /// Points from `near` to `far` (either direction): the first cell `first` long at `near`, each
  /// further cell `growth` times the previous, scaled to end exactly at `far`; {far} if they coincide.
  std::vector<double> geometric(double near, double far, double first, double growth);

  /// The number of cells of about `size` in `length` (at least 1).
  unsigned int cells_for(double length, double size);

  /// Appends the points of `more`, without its first (shared) point unless `points` is empty.
  void append(std::vector<double> &points, const std::vector<double> &more);
} // namespace lentus::meshes
