#include "solver/report/accuracy.h"

#include <cmath>
#include <cstdio>

namespace lentus::report
{
  namespace
  {
    std::string format(const char *pattern, const double a, const double b = 0.)
    {
      char buffer[200];
      std::snprintf(buffer, sizeof buffer, pattern, a, b);
      return buffer;
    }

    /// Roache's (1994) estimate for values that do not show their order of convergence: the
    /// theoretical order and a safety factor of 3; the finest value is not extrapolated.
    MeshErrorEstimate fallback(const double fine, const double coarse, const double ratio, const std::string &why)
    {
      const double error = 3. * std::abs(fine - coarse) / (std::pow(ratio, theoretical_order) - 1.);
      return {error, fine, theoretical_order, false,
              why + "; GCI with the theoretical order " + format("%g", theoretical_order) +
                " and safety factor 3 (Roache 1994), not extrapolated"};
    }

    /// The same from three meshes whose changes show no order (they oscillate, or the last one
    /// collapses, as when an adaptive cycle refines away from what decides a number): the larger of
    /// the two steps' estimates, so that a step that happened not to change the number does not
    /// make its bar vanish (common practice: bound an oscillation by its amplitude).
    MeshErrorEstimate fallback(const MeshValue &fine, const MeshValue &middle, const MeshValue &coarse,
                               const std::string &why)
    {
      MeshErrorEstimate estimate = fallback(fine.value, middle.value, std::sqrt(fine.cells / middle.cells), why);
      const double      earlier  = 3. * std::abs(middle.value - coarse.value) /
                             (std::pow(std::sqrt(middle.cells / coarse.cells), theoretical_order) - 1.);
      if (earlier > estimate.error)
        {
          estimate.error = earlier;
          estimate.method += "; bound by the larger, earlier step";
        }
      return estimate;
    }

    /// Celik et al. (2008), eqs. 3a-3c: the apparent order p from three solutions, by fixed-point
    /// iteration; NaN when it has none.
    double apparent_order(const double r21, const double r32, const double e21, const double e32)
    {
      const double s     = e32 / e21 > 0. ? 1. : -1.;
      const double ratio = std::log(std::abs(e32 / e21));
      double       p     = std::abs(ratio) / std::log(r21);
      for (int iteration = 0; iteration < 100; ++iteration)
        {
          const double a = std::pow(r21, p) - s, b = std::pow(r32, p) - s;
          if (!(a > 0. && b > 0.))
            return std::nan("");
          const double next = std::abs(ratio + std::log(a / b)) / std::log(r21);
          if (!std::isfinite(next))
            return std::nan("");
          if (std::abs(next - p) < 1e-12 * std::max(1., p))
            return next;
          p = next;
        }
      return p;
    }
  } // namespace

  std::optional<MeshErrorEstimate> estimate_mesh_error(const std::vector<MeshValue> &sequence)
  {
    const std::size_t n = sequence.size();
    if (n < 2)
      return std::nullopt;
    // Changes at round-off level (a flow area, a rate set by a boundary condition) count as none.
    double scale = 0.;
    for (const MeshValue &entry : sequence)
      scale = std::max(scale, std::abs(entry.value));
    const auto changed = [scale](const double a, const double b) { return std::abs(a - b) > 1e-10 * scale; };
    const MeshValue &fine = sequence[n - 1], &middle = sequence[n - 2];
    // Celik et al. (2008), eq. 1: h = (area / cells)^(1/2) in 2D, so r = (cells_fine / cells_coarse)^(1/2).
    const double r21 = std::sqrt(fine.cells / middle.cells);
    const double e21 = changed(middle.value, fine.value) ? middle.value - fine.value : 0.;
    if (!(r21 > 1.))
      return std::nullopt;
    if (n == 2)
      {
        if (e21 == 0.)
          return MeshErrorEstimate{0., fine.value, theoretical_order, false, "unchanged on the last two meshes"};
        return fallback(fine.value, middle.value, r21, "two meshes");
      }
    const MeshValue &coarse = sequence[n - 3];
    const double     r32    = std::sqrt(middle.cells / coarse.cells);
    const double     e32    = changed(coarse.value, middle.value) ? coarse.value - middle.value : 0.;
    if (e21 == 0. && e32 == 0.)
      return MeshErrorEstimate{0., fine.value, theoretical_order, false, "unchanged on the last three meshes"};
    if (e21 == 0.)
      {
        // Unchanged only on the last step: the error of the middle mesh's value bounds it.
        MeshErrorEstimate estimate = fallback(middle.value, coarse.value, r32, "unchanged on the last two meshes only");
        estimate.extrapolated      = fine.value;
        return estimate;
      }
    if (!(r32 > 1.))
      return fallback(fine.value, middle.value, r21, "three meshes not refined in turn");
    if (e32 / e21 < 0.)
      return fallback(fine, middle, coarse, "three meshes, oscillating values");
    const double p = apparent_order(r21, r32, e21, e32);
    if (!std::isfinite(p) || p < 0.5 || p > 4.)
      return fallback(fine, middle, coarse,
                      std::isfinite(p) ? format("three meshes, implausible observed order %.3g", p) :
                                         std::string("three meshes, no observed order"));
    const double rp = std::pow(r21, p);
    return MeshErrorEstimate{1.25 * std::abs(e21) / (rp - 1.), (rp * fine.value - middle.value) / (rp - 1.), p, true,
                             format("three meshes, observed order %.3g; GCI with safety factor 1.25 (Roache 1994; "
                                    "Celik et al. 2008), Richardson extrapolation",
                                    p)};
  }

  RegularizationEstimate estimate_regularization_error(const double at_m, const double at_larger_m, const double factor)
  {
    const double change = at_larger_m - at_m;
    const double root   = std::sqrt(factor);
    return {std::abs(change) * root / (root - 1.), at_larger_m + change / (factor - 1.),
            format("second solve at %g x M on the final mesh; bound assumes the error falls at least as M^(-1/2), "
                   "extrapolation as 1/M",
                   factor)};
  }

  void estimate_accuracy(DesignNumbers &numbers, const std::vector<MeshNumbers> &meshes, const DesignNumbers *at_larger_m,
                         const double factor)
  {
    for (const DesignNumber &entry : numbers.all())
      {
        Accuracy accuracy;
        if (!entry.estimable)
          {
            accuracy.mesh_method = accuracy.regularization_method =
              "not estimated: a location, whose change between meshes is no error estimate";
            DesignNumber updated = entry;
            updated.accuracy     = accuracy;
            numbers.replace(updated);
            continue;
          }
        std::vector<MeshValue> sequence;
        for (const MeshNumbers &mesh : meshes)
          if (const DesignNumber *on_mesh = mesh.numbers.find(entry.name); on_mesh && std::isfinite(on_mesh->value))
            sequence.push_back({static_cast<double>(mesh.cells), on_mesh->value});
        double shift = 0.;
        if (const auto mesh = std::isfinite(entry.value) ? estimate_mesh_error(sequence) : std::nullopt)
          {
            accuracy.mesh_error  = mesh->error;
            accuracy.mesh_method = mesh->method;
            accuracy.order       = mesh->order;
            shift += mesh->extrapolated - entry.value;
          }
        else
          accuracy.mesh_method = sequence.size() < 2 ? "one mesh: not estimated" : "not estimated";
        if (at_larger_m)
          {
            const DesignNumber *other = at_larger_m->find(entry.name);
            if (other && std::isfinite(other->value) && std::isfinite(entry.value))
              {
                const RegularizationEstimate estimate = estimate_regularization_error(entry.value, other->value, factor);
                accuracy.regularization_error         = estimate.error;
                accuracy.regularization_method        = estimate.method;
                shift += estimate.extrapolated - entry.value;
              }
          }
        if (accuracy.mesh_error || accuracy.regularization_error)
          accuracy.extrapolated = entry.value + shift;
        DesignNumber updated = entry;
        updated.accuracy     = accuracy;
        numbers.replace(updated);
      }
  }

  std::optional<double> total_error(const Accuracy &accuracy)
  {
    if (!accuracy.mesh_error && !accuracy.regularization_error)
      return std::nullopt;
    return accuracy.mesh_error.value_or(0.) + accuracy.regularization_error.value_or(0.);
  }

  std::string value_with_error(const DesignNumber &number)
  {
    const std::optional<double> error = total_error(number.accuracy);
    if (!error)
      return format("%.6g", number.value);
    return format("%.6g +/- ", number.value) + format("%.2g", *error);
  }
} // namespace lentus::report
