// The table of contents of a flow run: mesh, unknowns, nonlinear solve,
// design numbers, outputs written whole into the case folder.
#include "solver/flow/flow_run.h"

#include "rheology/parameter_table.h"
#include "solver/errors.h"
#include "solver/flow/flow_report.h"
#include "solver/flow/flow_state.h"
#include "solver/report/atomic_file.h"
#include "solver/version.h"

#include <deal.II/base/mpi.h>
#include <deal.II/base/timer.h>

#include <cstdint>
#include <cstdio>
#include <vector>
#include <stdexcept>
#include <filesystem>
#include <fstream>
#include <sstream>

namespace lentus::flow
{
  namespace
  {
    std::string json_string(const std::string &text)
    {
      std::string out = "\"";
      for (const char c : text)
        out += c == '"' ? std::string("\\\"") : c == '\\' ? std::string("\\\\") : c == '\n' ? std::string("\\n") : std::string(1, c);
      return out + "\"";
    }

    std::string json_number(const double value)
    {
      if (!std::isfinite(value))
        return "null";
      char buffer[40];
      std::snprintf(buffer, sizeof buffer, "%.12g", value);
      return buffer;
    }

    const char *caution =
      "Results are estimates from a model: check them against measurements. They never replace pressure-relief "
      "devices, local pressure-equipment and machinery codes, or review by a licensed engineer.";
  } // namespace

  double RunResult::number(const std::string &name) const
  {
    for (const DesignNumber &entry : numbers)
      if (entry.name == name)
        return entry.value;
    throw std::out_of_range("no design number '" + name + "'");
  }

  RunResult run_flow_case(const input::FlowCase &flow, MPI_Comm communicator)
  {
    return FlowRun(flow, communicator).result();
  }

  FlowRun::~FlowRun() = default;

  FlowRun::FlowRun(const input::FlowCase &flow, MPI_Comm communicator)
    : state(std::make_unique<FlowState>(flow, communicator))
  {
    run_result = solve_and_report(*state);
  }

  RunResult solve_and_report(FlowState &state)
  {
    const input::FlowCase &flow         = state.flow;
    MPI_Comm               communicator = state.comm;
    dealii::Timer          timer;

    // The results folder is replaced when the run ends: refuse a folder that holds anything else.
    const std::filesystem::path target(flow.output_folder);
    if (std::filesystem::exists(target) &&
        (!std::filesystem::is_directory(target) ||
         (!std::filesystem::is_empty(target) && !std::filesystem::exists(target / "summary.json"))))
      throw InputError("Output/Folder = " + flow.output_folder +
                       ": exists and is not a Lentus results folder (no summary.json); it would be replaced; "
                       "allowed: a new folder, or one written by an earlier run");
    state.log.line("lentus " + std::string(version) + ": case " + flow.case_file + " on " +
                   std::to_string(state.n_ranks) + " rank(s)");
    state.log.line("Fluid: " + flow.fluid.law_name + "; formulation: " + to_string(flow.formulation) +
                   (flow.inertia ? ", with inertia" : ", creeping flow"));

    const SolveReport report = solve_with_mesh_sequencing(state);
    const std::vector<DesignNumber> numbers = design_numbers(state);
    // Iteration figures of each mesh solved on (several under mesh sequencing); summary.json's
    // totals are those of the final mesh.
    std::vector<MeshSteps> meshes;
    for (const std::uint64_t unknowns : report.meshes)
      meshes.push_back({unknowns});
    if (meshes.empty() || meshes.back().unknowns != state.dof_handler.n_dofs())
      meshes.push_back({state.dof_handler.n_dofs()});
    for (const IterationRecord &record : report.iterations)
      for (MeshSteps &mesh : meshes)
        if (mesh.unknowns == record.unknowns)
          {
            (record.kind == "Newton" ? mesh.newton : mesh.picard) += 1;
            mesh.linear += record.linear_iterations;
            mesh.seconds += record.seconds;
            break;
          }
    const double                    seconds = timer.wall_time();
    // Peak resident memory (VmHWM) of each rank [MiB].
    double peak_memory = 0.;
    {
      std::ifstream status("/proc/self/status");
      std::string   line;
      while (std::getline(status, line))
        if (line.rfind("VmHWM:", 0) == 0)
          peak_memory = std::stod(line.substr(6)) / 1024.;
    }
    const double peak_memory_max = dealii::Utilities::MPI::max(peak_memory, communicator);
    const double peak_memory_sum = dealii::Utilities::MPI::sum(peak_memory, communicator);

    // Everything goes to a partial folder first, renamed when complete.
    const std::filesystem::path folder(flow.output_folder);
    const std::filesystem::path partial = folder.string() + ".partial";
    if (state.rank == 0)
      {
        std::filesystem::remove_all(partial);
        std::filesystem::create_directories(partial);
      }
    MPI_Barrier(communicator);
    if (flow.write_fields)
      write_fields(state, partial.string());
    const std::string exit_profile = exit_profile_csv(state);
    const std::string wall_profile = wall_profile_csv(state);

    state.log.line(report.converged ? "Converged." : "NOT CONVERGED: " + report.reason);
    state.log.line("Design numbers" + std::string(report.converged ? "" : " (of the last iterate, not converged)") + ":");
    for (const DesignNumber &number : numbers)
      {
        char line[200];
        std::snprintf(line, sizeof line, "  %-45s %14.6g %s", number.name.c_str(), number.value, number.unit.c_str());
        state.log.line(line);
      }
    state.log.line(std::string("Caution: ") + caution);

    if (state.rank == 0)
      {
        const MeshSteps   &final_mesh = meshes.back();
        const unsigned int newton = final_mesh.newton, picard = final_mesh.picard;
        const double       steps  = std::max(1., static_cast<double>(newton + picard));
        std::ostringstream json;
        json << "{\n  \"case\": " << json_string(flow.case_file) << ",\n  \"lentus version\": " << json_string(version)
             << ",\n  \"converged\": " << (report.converged ? "true" : "false")
             << ",\n  \"status\": " << json_string(report.converged ? "converged" : "not converged")
             << ",\n  \"reason\": " << json_string(report.reason)
             << ",\n  \"formulation\": " << json_string(to_string(flow.formulation))
             << ",\n  \"viscosity law\": " << json_string(flow.fluid.law_name) << ",\n  \"design numbers\": {";
        for (std::size_t i = 0; i < numbers.size(); ++i)
          json << (i ? "," : "") << "\n    " << json_string(numbers[i].name) << ": {\"value\": "
               << json_number(numbers[i].value) << ", \"unit\": " << json_string(numbers[i].unit) << "}";
        json << "\n  },\n  \"numerics\": {\n    \"unknowns\": " << state.dof_handler.n_dofs()
             << ",\n    \"cells\": " << state.triangulation.n_global_active_cells()
             << ",\n    \"Newton iterations\": " << newton << ",\n    \"Picard iterations\": " << picard
             << ",\n    \"linear iterations\": " << final_mesh.linear
             << ",\n    \"linear solver\": " << json_string(report.linear_solver)
             << ",\n    \"continuation steps\": " << report.continuation_steps.size()
             << ",\n    \"final residual\": "
             << json_number(report.iterations.empty() ? 0. : report.iterations.back().residual)
             << ",\n    \"linear iterations per step\": " << json_number(final_mesh.linear / steps)
             << ",\n    \"seconds per step\": " << json_number(final_mesh.seconds / steps)
             << ",\n    \"peak memory per rank [MiB]\": " << json_number(peak_memory_max)
             << ",\n    \"peak memory all ranks [MiB]\": " << json_number(peak_memory_sum)
             << ",\n    \"wall time [s]\": " << json_number(seconds) << ",\n    \"ranks\": " << state.n_ranks
             << ",\n    \"meshes\": [";
        for (std::size_t i = 0; i < meshes.size(); ++i)
          json << (i ? "," : "") << "\n      {\"unknowns\": " << meshes[i].unknowns << ", \"Newton iterations\": "
               << meshes[i].newton << ", \"Picard iterations\": " << meshes[i].picard
               << ", \"linear iterations\": " << meshes[i].linear
               << ", \"seconds\": " << json_number(meshes[i].seconds) << "}";
        json << (meshes.empty() ? "]" : "\n    ]")
             << "\n  },\n  \"caution\": " << json_string(caution) << "\n}\n";
        report::write_file_atomically((partial / "summary.json").string(), json.str());
        report::write_file_atomically((partial / "case.prm").string(), flow.complete_text);
        report::write_file_atomically((partial / "log.txt").string(), state.log.text());
        if (!exit_profile.empty())
          report::write_file_atomically((partial / "exit_profile.csv").string(), exit_profile);
        if (!wall_profile.empty())
          report::write_file_atomically((partial / "wall_profile.csv").string(), wall_profile);
        std::filesystem::remove_all(folder);
        if (folder.has_parent_path())
          std::filesystem::create_directories(folder.parent_path());
        std::filesystem::rename(partial, folder);
        std::printf("Results in %s\n", folder.c_str());
      }
    MPI_Barrier(communicator);
    RunResult result;
    result.converged = report.converged;
    result.reason    = report.converged ? "" :
                                          report.reason + " (last iterate written to " + folder.string() +
                                          ", marked not converged)";
    result.numbers   = numbers;
    result.newton_iterations = meshes.back().newton;
    result.meshes            = meshes;
    return result;
  }
} // namespace lentus::flow
