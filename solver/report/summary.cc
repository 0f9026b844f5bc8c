#include "solver/report/summary.h"

#include "solver/report/caution.h"
#include "solver/version.h"

#include <nlohmann/json.hpp>

#include <algorithm>
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

    std::string format_error(const double error)
    {
      char text[40];
      std::snprintf(text, sizeof text, "%.2g", error);
      return text;
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
                             {"error", optional_number(total_error(entry.accuracy))},
                             {"mesh error", optional_number(entry.accuracy.mesh_error)},
                             {"mesh error method", entry.accuracy.mesh_method},
                             {"order of convergence", optional_number(entry.accuracy.order)},
                             {"regularization error", optional_number(entry.accuracy.regularization_error)},
                             {"regularization error method", entry.accuracy.regularization_method},
                             {"extrapolated value", optional_number(entry.accuracy.extrapolated)}};

    const RunAccuracy &accuracy = summary.accuracy;
    Json &estimate = json["accuracy"] = Json::object();
    estimate["error"] = "per design number: error = mesh error + regularization error, in the number's unit; "
                        "an estimate, not a guarantee";
    estimate["target relative error"] = optional_number(accuracy.target);
    estimate["target"] = accuracy.target ? (accuracy.target_met ? "met" : "not met") : "none";
    estimate["target status"] = accuracy.target_status;
    estimate["regularization factor"] =
      accuracy.regularization_factor > 0. ? number(accuracy.regularization_factor) : Json(nullptr);
    estimate["regularization check"] = accuracy.regularization_factor > 0. ? "made" : accuracy.regularization_note;
    Json &sequence = estimate["meshes"] = Json::array();
    for (const MeshNumbers &mesh : accuracy.meshes)
      {
        Json values = Json::object();
        for (const DesignNumber &entry : mesh.numbers.all())
          values[entry.name] = number(entry.value);
        sequence.push_back({{"cells", mesh.cells}, {"unknowns", mesh.unknowns}, {"design numbers", std::move(values)}});
      }

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
    const auto phase_object = [](const PhaseSeconds &phases) {
      Json object = Json::object();
      for (std::size_t i = 0; i < n_phases; ++i)
        object[to_string(static_cast<Phase>(i))] = number(phases.seconds[i]);
      return object;
    };
    const PhaseSeconds run_phases = history.run_phases();
    Json &by_phase = numerics["seconds by phase"] = phase_object(run_phases);
    by_phase["other"] = number(std::max(0., summary.resources.wall_seconds - run_phases.total()));
    Json &meshes = numerics["meshes"] = Json::array();
    for (const MeshRecord &mesh : history.meshes())
      meshes.push_back({{"unknowns", mesh.unknowns},
                        {"seconds by phase", phase_object(mesh.phases)},
                        {"cells", mesh.cells},
                        {"refinement", mesh.refinement},
                        {"set-up seconds", number(mesh.other_seconds)},
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
    // Text that is not valid UTF-8 (a case path, say) is written with replacement characters
    // rather than failing a finished solve.
    return json.dump(2, ' ', false, Json::error_handler_t::replace) + "\n";
  }

  std::string phase_line(const Summary &summary)
  {
    const PhaseSeconds phases = summary.history.run_phases();
    std::vector<std::pair<double, std::string>> parts;
    for (std::size_t i = 0; i < n_phases; ++i)
      parts.emplace_back(phases.seconds[i], to_string(static_cast<Phase>(i)));
    parts.emplace_back(std::max(0., summary.resources.wall_seconds - phases.total()), "other");
    std::stable_sort(parts.begin(), parts.end(), [](const auto &a, const auto &b) { return a.first > b.first; });
    std::string line = "Seconds by phase:";
    char        text[120];
    for (const auto &[seconds, name] : parts)
      {
        std::snprintf(text, sizeof text, "%s %s %.2f", line.back() == ':' ? "" : ",", name.c_str(), seconds);
        line += text;
      }
    std::snprintf(text, sizeof text, " (of %.2f s wall time)", summary.resources.wall_seconds);
    return line + text;
  }

  std::vector<std::string> design_number_lines(const DesignNumbers &numbers)
  {
    std::vector<std::string> lines;
    for (const DesignNumber &number : numbers.all())
      {
        char line[300];
        const std::optional<double> error = total_error(number.accuracy);
        const std::string error_text = error ? "+/- " + format_error(*error) : std::string();
        std::snprintf(line, sizeof line, "  %-45s %14.6g %-12s %s", number.name.c_str(), number.value,
                      error_text.c_str(), number.unit.c_str());
        lines.emplace_back(line);
      }
    return lines;
  }
} // namespace lentus::report
