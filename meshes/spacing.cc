#include "meshes/spacing.h"

#include <algorithm>
#include <cmath>
#include <limits>

namespace lentus::meshes
{
  std::vector<double> graded(const double from, const double to, const unsigned int n,
                             const bool fine_start, const bool fine_end)
  {
    const double        a = 0.5;
    std::vector<double> points;
    for (unsigned int i = 0; i <= n; ++i)
      {
        const double s = static_cast<double>(i) / n;
        double       f = s;
        if (fine_start && fine_end)
          f = s - a * std::sin(2. * M_PI * s) / (2. * M_PI);
        else if (fine_start)
          f = s - a * std::sin(M_PI * s) / M_PI;
        else if (fine_end)
          f = s + a * std::sin(M_PI * s) / M_PI;
        points.push_back(from + (to - from) * f);
      }
    points.front() = from;
    points.back()  = to;
    return points;
  }

  std::vector<double> stretched(const double from, const double to, const double fine,
                                const bool fine_start, const bool fine_end, const double largest)
  {
    const double length = to - from, growth = 1.3;
    if (!fine_start && !fine_end)
      {
        const unsigned int n = std::max(1u, static_cast<unsigned int>(std::lround(length / (2. * fine))));
        return graded(from, to, n, false, false);
      }
    // One-sided progression over `span` starting fine: sizes f q^i scaled to fill the span exactly.
    const auto one_sided = [&](const double span) {
      std::vector<double> sizes;
      double              total = 0.;
      if (std::isfinite(largest))
        {
          // Grow from `fine` up to `largest`, then keep that size; fit the span by scaling.
          double size = fine;
          while (total + 0.5 * size < span)
            {
              sizes.push_back(size);
              total += size;
              size = std::min(size * growth, largest);
            }
          if (sizes.empty())
            sizes.push_back(total = span);
          for (double &each : sizes)
            each *= span / total;
          return sizes;
        }
      const auto n = std::max(1u, static_cast<unsigned int>(std::ceil(
                                    std::log(1. + span * (growth - 1.) / fine) / std::log(growth) - 1e-9)));
      for (unsigned int i = 0; i < n; ++i)
        {
          sizes.push_back(std::pow(growth, i));
          total += sizes.back();
        }
      for (double &size : sizes)
        size *= span / total;
      return sizes;
    };
    std::vector<double> sizes;
    if (fine_start && fine_end)
      {
        sizes = one_sided(0.5 * length);
        const std::vector<double> mirrored(sizes.rbegin(), sizes.rend());
        sizes.insert(sizes.end(), mirrored.begin(), mirrored.end());
      }
    else
      {
        sizes = one_sided(length);
        if (fine_end)
          std::reverse(sizes.begin(), sizes.end());
      }
    std::vector<double> points{from};
    for (const double size : sizes)
      points.push_back(points.back() + size);
    points.back() = to;
    return points;
  }

  std::vector<double> geometric(const double near, const double far, const double first, const double growth)
  {
    const double length = std::abs(far - near);
    if (length <= 1e-12 * first)
      return {far};
    const unsigned int n =
      growth <= 1. + 1e-12 ?
        std::max(1u, static_cast<unsigned int>(std::round(length / first))) :
        std::max(1u, static_cast<unsigned int>(std::round(std::log1p(length * (growth - 1.) / first) / std::log(growth))));
    std::vector<double> sizes(n);
    double              sum = 0.;
    for (unsigned int i = 0; i < n; ++i)
      sum += (sizes[i] = std::pow(growth, i));
    std::vector<double> points{near};
    double              at = near;
    for (unsigned int i = 0; i < n; ++i)
      points.push_back(at += (far > near ? 1. : -1.) * length * sizes[i] / sum);
    points.back() = far;
    return points;
  }

  unsigned int cells_for(const double length, const double size)
  {
    return std::max(1u, static_cast<unsigned int>(std::lround(length / size)));
  }

  void append(std::vector<double> &points, const std::vector<double> &more)
  {
    points.insert(points.end(), points.empty() ? more.begin() : more.begin() + 1, more.end());
  }
} // namespace lentus::meshes
