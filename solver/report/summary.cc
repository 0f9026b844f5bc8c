#include "solver/report/summary.h"

#include "solver/report/caution.h"
#include "solver/version.h"

#include <nlohmann/json.hpp>

#include <cmath>
#include <cstdio>

namespace lentus::report
{
  namespace
  {
    using Json = nlohmann::ordered_json;

    /// Non-finite numbers have no JSON form: null.
    Json number(const double value)
    {
      return std::isfinite(value) ? Json(value) : Json(nullptr);
    }

    Json optional_number(const std::optional<double> &value)
    {
      return value ? number(*value) : Json(nullptr);
    }
  } // namespace

  std::string to_json(const Summary &summary)
  {
    const SolveHistory &history = summary.history;
    Json                json;
    json["case"]                = summary.case_file;
    json["lentus version"]      = version;
    json["converged"]           = summary.converged;
    json["status"]              = summary.converged ? "converged" : "not converged";
    json["reason"]              = summary.reason;
    json["velocity components"] = summary.velocity_components;
    json["viscosity law"]       = summary.viscosity_law;
    json["yield stress [Pa]"]   = number(summary.yield_stress);
    json["dead-zone speed fraction"] = optional_number(summary.dead_zone_fraction);

    Json &numbers = json["design numbers"] = Json::object();
    for (const DesignNumber &entry : summary.numbers.all())
      numbers[entry.name] = {{"value", number(entry.value)},
                             {"unit", entry.unit},
                             {"symbol", entry.symbol},
                             {"group", to_string(entry.group)},
                             {"key", entry.key},
                             {"mesh error", optional_number(entry.accuracy.mesh_error)},
                             {"regularization error", optional_number(entry.accuracy.regularization_error)},
                             {"extrapolated value", optional_number(entry.accuracy.extrapolated)},
                             {"error method", entry.accuracy.method}};

    // The iteration totals are those of the final mesh; every mesh has its own line in "meshes".
    const MeshRecord   final_mesh = history.meshes().empty() ? MeshRecord() : history.meshes().back();
    const double       steps      = std::max(1., static_cast<double>(final_mesh.newton + final_mesh.picard));
    Json              &numerics   = json["numerics"];
    numerics["unknowns"]          = summary.unknowns;
    numerics["cells"]             = summary.cells;
    numerics["Newton iterations"] = final_mesh.newton;
    numerics["Picard iterations"] = final_mesh.picard;
    numerics["linear iterations"] = final_mesh.linear;
    numerics["linear solver"]     = final_mesh.linear_solver;
    numerics["continuation steps"] = history.continuation_steps().size();
    numerics["final residual"]     = number(history.final_residual());
    numerics["linear iterations per step"]  = number(final_mesh.linear / steps);
    numerics["seconds per step"]            = number(final_mesh.seconds / steps);
    numerics["peak memory per rank [MiB]"]  = number(summary.resources.peak_memory_per_rank);
    numerics["peak memory all ranks [MiB]"] = number(summary.resources.peak_memory_all_ranks);
    numerics["wall time [s]"]               = number(summary.resources.wall_seconds);
    numerics["ranks"]                       = summary.resources.ranks;
    Json &meshes = numerics["meshes"] = Json::array();
    for (const MeshRecord &mesh : history.meshes())
      meshes.push_back({{"unknowns", mesh.unknowns},
                        {"cells", mesh.cells},
                        {"linear solver", mesh.linear_solver},
                        {"Newton iterations", mesh.newton},
                        {"Picard iterations", mesh.picard},
                        {"linear iterations", mesh.linear},
                        {"seconds", number(mesh.seconds)}});
    Json &solves = numerics["solves"] = Json::array();
    for (const SolveRecord &solve : history.solves())
      {
        Json iterations = Json::array();
        for (const IterationRecord &iteration : solve.iterations)
          iterations.push_back({{"kind", to_string(iteration.kind)},
                                {"residual", number(iteration.residual)},
                                {"step", number(iteration.step)},
                                {"linear iterations", iteration.linear_iterations},
                                {"seconds", number(iteration.seconds)}});
        solves.push_back({{"mesh", solve.mesh},
                          {"label", solve.label},
                          {"initial residual", number(solve.initial_residual)},
                          {"iterations", std::move(iterations)}});
      }
    json["caution"]       = caution;
    json["case cautions"] = summary.case_cautions;
    return json.dump(2) + "\n";
  }

  std::vector<std::string> design_number_lines(const DesignNumbers &numbers)
  {
    std::vector<std::string> lines;
    for (const DesignNumber &number : numbers.all())
      {
        char line[300];
        std::snprintf(line, sizeof line, "  %-45s %14.6g %s", number.name.c_str(), number.value, number.unit.c_str());
        lines.emplace_back(line);
      }
    return lines;
  }
} // namespace lentus::report
