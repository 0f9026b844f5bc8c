#include "rheology/fit/fit_recipes.h"

#include <algorithm>
#include <cmath>

namespace lentus::rheology::fit
{
  namespace
  {
    /// Least-squares line y = intercept + slope x over points [first, last).
    struct Line
    {
      double intercept, slope;
    };

    template <class X, class Y>
    Line line_through(const std::vector<Measurement> &points, std::size_t first, std::size_t last, X x, Y y)
    {
      double n = 0., sx = 0., sy = 0., sxx = 0., sxy = 0.;
      for (std::size_t i = first; i < last; ++i)
        {
          const double xi = x(points[i]), yi = y(points[i]);
          n += 1.;
          sx += xi;
          sy += yi;
          sxx += xi * xi;
          sxy += xi * yi;
        }
      const double denominator = n * sxx - sx * sx;
      const double slope       = denominator > 0. ? (n * sxy - sx * sy) / denominator : 0.;
      return {(sy - slope * sx) / std::max(n, 1.), slope};
    }

    double log_rate(const Measurement &point) { return std::log(point.shear_rate); }
    double log_stress(const Measurement &point) { return std::log(point.shear_stress); }
    double log_viscosity(const Measurement &point) { return std::log(point.shear_stress / point.shear_rate); }

    double clamp(const double value, const double low, const double high)
    {
      return std::isfinite(value) ? std::min(std::max(value, low), high) : low;
    }

    /// Slope of log eta against log gamma_dot over the highest-rate third (at least 2 points).
    double high_rate_slope(const std::vector<Measurement> &points)
    {
      const std::size_t n     = points.size();
      const std::size_t first = n > 6 ? n - n / 3 : (n > 2 ? n - 2 : 0);
      return line_through(points, first, n, log_rate, log_viscosity).slope;
    }

    /// Viscosity at the lowest rate and the rate where eta has fallen to half of it.
    std::pair<double, double> plateau_and_half_rate(const std::vector<Measurement> &points)
    {
      const double eta_low = points.front().shear_stress / points.front().shear_rate;
      for (std::size_t i = 1; i < points.size(); ++i)
        if (points[i].shear_stress / points[i].shear_rate < 0.5 * eta_low)
          return {eta_low, std::sqrt(points[i].shear_rate * points[i - 1].shear_rate)};
      return {eta_low, 10. * points.back().shear_rate};
    }

    /// Rounds to two significant digits (for values chosen, not fitted).
    double round_two(const double value)
    {
      const double magnitude = std::pow(10., std::floor(std::log10(value)) - 1.);
      return std::round(value / magnitude) * magnitude;
    }

    /// Papanastasiou exponent for a case file: M * lowest shear rate = 100, so the
    /// regularized stress equals the fitted ideal stress over the measured range
    /// (relative difference tau_y exp(-100) / tau).
    void regularization_note(const double lowest_rate, ParameterValues &values, std::vector<std::string> &notes)
    {
      values["Regularization exponent"] = round_two(100. / lowest_rate);
      notes.push_back("Regularization exponent: the ideal law was fitted; M = 100 / (lowest shear rate) makes the "
                      "regularized law equal to it over the measured range. A larger M sharpens the yield surface "
                      "and makes the flow problem harder.");
    }

    const std::vector<Recipe> &recipes()
    {
      static const std::vector<Recipe> list{
        {"Newtonian",
         {"Viscosity"},
         [](double) { return ParameterValues{}; },
         [](double, ParameterValues &, std::vector<std::string> &) {},
         [](const std::vector<Measurement> &points) {
           // Geometric mean of tau / gamma_dot.
           const Line line = line_through(points, 0, points.size(), log_rate, log_viscosity);
           return std::vector<ParameterValues>{
             {{"Viscosity", std::exp(line.intercept + line.slope * 0.5 * (log_rate(points.front()) + log_rate(points.back())))}}};
         }},

        {"Power law",
         {"Consistency", "Flow index"},
         // Bounds far outside any data during the fit (the clip never acts).
         [](double) { return ParameterValues{{"Minimum viscosity", 1e-300}, {"Maximum viscosity", 1e300}}; },
         [](const double lowest_rate, ParameterValues &values, std::vector<std::string> &notes) {
           const double K = values.at("Consistency"), n = values.at("Flow index");
           const double bound = round_two(K * std::pow(0.1 * lowest_rate, n - 1.));
           if (n < 1.)
             {
               values["Maximum viscosity"] = bound;
               notes.push_back("Maximum viscosity: the fitted law's viscosity at a tenth of the lowest measured shear "
                               "rate; below that the law is not supported by the data.");
             }
           else if (n > 1.)
             {
               values["Minimum viscosity"] = bound;
               notes.push_back("Minimum viscosity: the fitted law's viscosity at a tenth of the lowest measured shear "
                               "rate; below that the law is not supported by the data.");
             }
         },
         [](const std::vector<Measurement> &points) {
           const Line line = line_through(points, 0, points.size(), log_rate, log_stress);
           return std::vector<ParameterValues>{
             {{"Consistency", std::exp(line.intercept)}, {"Flow index", clamp(line.slope, 0.05, 3.)}}};
         }},

        {"Cross",
         {"Zero-shear viscosity", "Time constant", "Rate index"},
         [](double) { return ParameterValues{{"Infinite-shear viscosity", 0.}}; },
         [](double, ParameterValues &values, std::vector<std::string> &notes) {
           values["Infinite-shear viscosity"] = 0.;
           notes.push_back("Infinite-shear viscosity = 0: held fixed (common practice; the high-shear plateau is "
                           "rarely inside the measured range).");
         },
         [](const std::vector<Measurement> &points) {
           const auto [eta_low, half_rate] = plateau_and_half_rate(points);
           const double m                  = clamp(-high_rate_slope(points), 0.2, 1.5);
           std::vector<ParameterValues> starts;
           for (const double factor : {1., 3., 0.3})
             starts.push_back({{"Zero-shear viscosity", 1.1 * eta_low * (factor > 1. ? factor : 1.)},
                               {"Time constant", factor / half_rate},
                               {"Rate index", m}});
           return starts;
         }},

        {"Carreau-Yasuda",
         {"Zero-shear viscosity", "Time constant", "Flow index", "Yasuda exponent"},
         [](double) { return ParameterValues{{"Infinite-shear viscosity", 0.}}; },
         [](double, ParameterValues &values, std::vector<std::string> &notes) {
           values["Infinite-shear viscosity"] = 0.;
           notes.push_back("Infinite-shear viscosity = 0: held fixed (common practice; the high-shear plateau is "
                           "rarely inside the measured range).");
         },
         [](const std::vector<Measurement> &points) {
           const auto [eta_low, half_rate] = plateau_and_half_rate(points);
           const double n                  = clamp(1. + high_rate_slope(points), 0.05, 0.95);
           std::vector<ParameterValues> starts;
           for (const double a : {2., 0.7})
             for (const double factor : {1., 3.})
               starts.push_back({{"Zero-shear viscosity", 1.1 * eta_low * factor},
                                 {"Time constant", factor / half_rate},
                                 {"Flow index", n},
                                 {"Yasuda exponent", a}});
           return starts;
         }},

        {"Bingham",
         {"Plastic viscosity", "Yield stress"},
         [](const double lowest_rate) { return ParameterValues{{"Regularization exponent", 1e6 / lowest_rate}}; },
         [](const double lowest_rate, ParameterValues &values, std::vector<std::string> &notes) {
           regularization_note(lowest_rate, values, notes);
         },
         [](const std::vector<Measurement> &points) {
           const double tau_low = points.front().shear_stress, tau_high = points.back().shear_stress;
           const double rate_high = points.back().shear_rate;
           std::vector<ParameterValues> starts;
           for (const double fraction : {0.9, 0.5, 0.05})
             starts.push_back({{"Yield stress", fraction * tau_low},
                               {"Plastic viscosity", std::max(tau_high - fraction * tau_low, 0.1 * tau_high) / rate_high}});
           return starts;
         }},

        {"Herschel-Bulkley",
         {"Consistency", "Flow index", "Yield stress"},
         [](const double lowest_rate) {
           return ParameterValues{{"Regularization exponent", 1e6 / lowest_rate}, {"Shear-rate floor", 1e-9 * lowest_rate}};
         },
         [](const double lowest_rate, ParameterValues &values, std::vector<std::string> &notes) {
           regularization_note(lowest_rate, values, notes);
           values["Shear-rate floor"] = round_two(1e-3 * lowest_rate);
           notes.push_back("Shear-rate floor: a thousandth of the lowest measured shear rate; it bounds K gamma_dot^(n-1) "
                           "at rest and does not change the law over the measured range.");
         },
         [](const std::vector<Measurement> &points) {
           std::vector<ParameterValues> starts;
           const double tau_low = points.front().shear_stress;
           for (const double fraction : {0.95, 0.7, 0.3, 0.02})
             {
               const double yield = fraction * tau_low;
               const Line   line  = line_through(points, 0, points.size(), log_rate,
                                               [yield](const Measurement &point) {
                                                 return std::log(std::max(point.shear_stress - yield, 1e-3 * point.shear_stress));
                                               });
               starts.push_back({{"Consistency", std::exp(line.intercept)},
                                 {"Flow index", clamp(line.slope, 0.05, 2.)},
                                 {"Yield stress", yield}});
             }
           return starts;
         }},
      };
      return list;
    }
  } // namespace

  const Recipe *find_recipe(const std::string &law)
  {
    for (const Recipe &recipe : recipes())
      if (recipe.law == law)
        return &recipe;
    return nullptr;
  }
} // namespace lentus::rheology::fit
