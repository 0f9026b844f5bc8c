#include "solver/sweep/sweep_runner.h"

#include "solver/errors.h"
#include "solver/flow/flow_run.h"
#include "solver/input/case_file.h"
#include "solver/input/flow_case.h"
#include "solver/input/value_kind.h"
#include "solver/report/accuracy.h"
#include "solver/report/atomic_file.h"
#include "solver/report/caution_text.h"
#include "solver/report/plotting.h"
#include "solver/sweep/results_table.h"
#include "solver/sweep/sweep_file.h"

#include <algorithm>
#include <chrono>
#include <cmath>
#include <cstdio>
#include <filesystem>
#include <fstream>
#include <iostream>
#include <map>
#include <memory>
#include <optional>
#include <sstream>

#include <fcntl.h>
#include <sys/file.h>
#include <unistd.h>

namespace lentus::sweep
{
  namespace
  {
    namespace fs = std::filesystem;

    double seconds_now()
    {
      return std::chrono::duration<double>(std::chrono::steady_clock::now().time_since_epoch()).count();
    }

    /// Sends this process's standard output to a file while it lives (the solver's
    /// per-iteration lines would bury the progress lines; log.txt keeps them).
    class OutputRedirect
    {
    public:
      explicit OutputRedirect(const std::string &path)
      {
        std::fflush(stdout);
        std::cout.flush();
        const int file = ::open(path.c_str(), O_WRONLY | O_CREAT | O_TRUNC, 0644);
        if (file < 0)
          return;
        saved = ::dup(1);
        ::dup2(file, 1);
        ::close(file);
      }
      ~OutputRedirect()
      {
        if (saved < 0)
          return;
        std::fflush(stdout);
        std::cout.flush();
        ::dup2(saved, 1);
        ::close(saved);
      }
      OutputRedirect(const OutputRedirect &) = delete;
      OutputRedirect &operator=(const OutputRedirect &) = delete;

    private:
      int saved = -1;
    };

    std::string claim_path(const SweepPlan &plan, const std::string &id)
    {
      return (fs::path(plan.results_folder) / "claims" / id).string();
    }

    std::string attempts_path(const SweepPlan &plan, const std::string &id)
    {
      return (fs::path(plan.results_folder) / "attempts" / id).string();
    }

    unsigned int attempts_of(const SweepPlan &plan, const std::string &id)
    {
      std::ifstream input(attempts_path(plan, id));
      unsigned int  count = 0;
      return input >> count ? count : 0;
    }

    /// Atomic on POSIX file systems, NFS v3 and later included.
    bool try_claim(const SweepPlan &plan, const std::string &id)
    {
      const int file = ::open(claim_path(plan, id).c_str(), O_WRONLY | O_CREAT | O_EXCL, 0644);
      if (file < 0)
        return false;
      const std::string owner = std::to_string(::getpid()) + "\n";
      [[maybe_unused]] const auto written = ::write(file, owner.data(), owner.size());
      ::close(file);
      return true;
    }

    /// Where a case's solutions on the meshes of its sequence are kept for warm starts (a file per mesh
    /// and rank of its group).
    std::string warm_prefix(const SweepPlan &plan, const std::string &id)
    {
      return (fs::path(plan.results_folder) / "warm" / id).string();
    }

    /// How far apart two cases lie in the varied values: per varied key, a key whose values are
    /// numbers (or lists of as many numbers) counts the squared differences scaled by the key's range,
    /// on a logarithmic scale when every value is positive; any other key counts 1 where they differ.
    /// Cases that differ in a key that may change the mesh or the unknowns (sections Geometry, Flow,
    /// Accuracy, Nonlinear solver) are infinitely far apart: no warm start between them.
    class CaseDistances
    {
    public:
      explicit CaseDistances(const SweepPlan &plan)
      {
        const std::size_t n = plan.cases.size(), n_keys = plan.varied_keys.size();
        text.assign(n, std::vector<std::string>(n_keys));
        numbers.assign(n, std::vector<std::vector<double>>(n_keys));
        numeric.assign(n_keys, true);
        for (const std::string &key : plan.varied_keys)
          shapes_mesh.push_back(key.rfind("Geometry/", 0) == 0 || key.rfind("Flow/", 0) == 0 ||
                                key.rfind("Accuracy/", 0) == 0 || key.rfind("Nonlinear solver/", 0) == 0);
        for (std::size_t i = 0; i < n; ++i)
          for (std::size_t k = 0; k < n_keys; ++k)
            {
              for (const Override &value : plan.cases[i].overrides)
                if (value.path == plan.varied_keys[k])
                  text[i][k] = value.value;
              for (const std::string &item : input::split_list(text[i][k]))
                {
                  const std::optional<double> number = input::parse_real(item);
                  if (!number || !std::isfinite(*number))
                    numeric[k] = false;
                  numbers[i][k].push_back(number.value_or(0.));
                }
              if (numbers[i][k].empty() || numbers[i][k].size() != numbers[0][k].size())
                numeric[k] = false;
            }
        // Per key and list position: logarithmic when every value is positive, and the range.
        logarithmic.assign(n_keys, {});
        range.assign(n_keys, {});
        for (std::size_t k = 0; k < n_keys; ++k)
          if (numeric[k] && n > 0)
            for (std::size_t t = 0; t < numbers[0][k].size(); ++t)
              {
                bool positive = true;
                for (std::size_t i = 0; i < n; ++i)
                  positive = positive && numbers[i][k][t] > 0.;
                double low = INFINITY, high = -INFINITY;
                for (std::size_t i = 0; i < n; ++i)
                  {
                    const double x = positive ? std::log(numbers[i][k][t]) : numbers[i][k][t];
                    low            = std::min(low, x);
                    high           = std::max(high, x);
                  }
                logarithmic[k].push_back(positive);
                range[k].push_back(high - low);
              }
      }

      double between(const std::size_t a, const std::size_t b) const
      {
        double distance = 0.;
        for (std::size_t k = 0; k < numeric.size(); ++k)
          if (shapes_mesh[k] && text[a][k] != text[b][k])
            return INFINITY;
          else if (!numeric[k])
            distance += text[a][k] == text[b][k] ? 0. : 1.;
          else
            for (std::size_t t = 0; t < range[k].size(); ++t)
              if (range[k][t] > 0.)
                {
                  const double x = numbers[a][k][t], y = numbers[b][k][t];
                  const double d = (logarithmic[k][t] ? std::log(x) - std::log(y) : x - y) / range[k][t];
                  distance += d * d;
                }
        return distance;
      }

    private:
      std::vector<std::vector<std::string>>         text;    ///< [case][key]
      std::vector<std::vector<std::vector<double>>> numbers; ///< [case][key][list position]
      std::vector<bool>                             numeric;
      std::vector<bool>                             shapes_mesh; ///< a difference forbids a warm start
      std::vector<std::vector<bool>>                logarithmic;
      std::vector<std::vector<double>>              range;
    };

    /// The finished case nearest to case `index` whose solution on the first mesh was saved by a group of
    /// `ranks` ranks, or -1 (ties: the case closest in the list).
    long nearest_finished(const SweepPlan &plan, const CaseDistances &distances, const std::size_t index,
                          const unsigned int ranks)
    {
      long   best          = -1;
      double best_distance = INFINITY;
      for (std::size_t j = 0; j < plan.cases.size(); ++j)
        {
          if (j == index ||
              !fs::exists(warm_prefix(plan, plan.cases[j].id) + ".mesh0.0of" + std::to_string(ranks) + ".bin"))
            continue;
          const double distance = distances.between(index, j);
          if (!std::isfinite(distance))
            continue;
          const auto   gap      = [&](const long other) { return std::abs(other - static_cast<long>(index)); };
          if (distance < best_distance ||
              (distance == best_distance && gap(static_cast<long>(j)) < gap(best)))
            {
              best          = static_cast<long>(j);
              best_distance = distance;
            }
        }
      return best;
    }

    ResultRow start_row(const SweepPlan &plan, const SweepCase &sweep_case)
    {
      ResultRow row;
      row.index       = sweep_case.index;
      row.id          = sweep_case.id;
      row.name        = sweep_case.name;
      row.folder      = case_folder(plan, sweep_case);
      row.fingerprint = sweep_case.fingerprint;
      for (const Override &value : sweep_case.overrides)
        if (std::find(plan.varied_keys.begin(), plan.varied_keys.end(), value.path) != plan.varied_keys.end())
          row.values.emplace_back(value.path, value.value);
      return row;
    }

    /// Solves one case on `group` (collective) and returns its row.
    /// `neighbour`: the case whose saved solutions are the starts (warm start = nearest), or -1.
    ResultRow solve_case(const SweepPlan &plan, const SweepCase &sweep_case, const input::CaseSchema &schema,
                         const RunnerOptions &options, MPI_Comm group, const long neighbour = -1)
    {
      int rank = 0, size = 1;
      MPI_Comm_rank(group, &rank);
      MPI_Comm_size(group, &size);
      ResultRow row = start_row(plan, sweep_case);
      row.ranks     = static_cast<unsigned int>(size);
      if (!sweep_case.invalid_reason.empty())
        {
          row.status = status::bad_input;
          row.reason = sweep_case.invalid_reason;
          return row;
        }
      const double start = seconds_now();
      try
        {
          std::unique_ptr<OutputRedirect> quiet;
          if (!options.solver_output)
            quiet = std::make_unique<OutputRedirect>(
              rank == 0 ? (fs::path(plan.results_folder) / "output" / (sweep_case.id + ".txt")).string() : "/dev/null");
          const input::CaseFile file =
            input::CaseFile::parse(plan.base_text, plan.base_case, schema, case_overrides(plan, sweep_case));
          input::FlowCase flow = input::read_flow_case(file);
          if (plan.warm_start)
            {
              flow.warm_start_save = warm_prefix(plan, sweep_case.id);
              if (neighbour >= 0)
                flow.warm_start_from = warm_prefix(plan, plan.cases[static_cast<std::size_t>(neighbour)].id);
            }
          const flow::RunResult result = flow::run_flow_case(flow, group);
          row.status            = result.converged ? status::converged : status::not_converged;
          row.reason            = result.reason;
          row.newton_iterations = result.newton_iterations;
          for (const report::DesignNumber &number : result.numbers.all())
            row.numbers.push_back(
              {number.name, number.value, number.unit, report::total_error(number.accuracy), number.key});
        }
      catch (const InputError &error)
        {
          row.status = status::bad_input;
          row.reason = error.what();
        }
      catch (const NoConvergence &error)
        {
          row.status = status::not_converged;
          row.reason = error.what();
        }
      catch (const std::exception &error)
        {
          row.status = status::crashed;
          row.reason = error.what();
        }
      row.wall_time = seconds_now() - start;
      return row;
    }

    /// What a leader knows about finished cases, for progress lines.
    class Progress
    {
    public:
      Progress(const SweepPlan &plan_, unsigned int groups_)
        : plan(plan_)
        , groups(groups_)
      {
        for (const SweepCase &sweep_case : plan.cases)
          fingerprints[sweep_case.id] = sweep_case.fingerprint;
      }

      /// Reads row files not seen before.
      void update()
      {
        std::error_code error;
        for (const auto &entry : fs::directory_iterator(fs::path(plan.results_folder) / "rows", error))
          {
            const std::string file = entry.path().filename().string();
            if (file.size() < 5 || file.compare(file.size() - 4, 4, ".txt") != 0)
              continue;
            const std::string id    = file.substr(0, file.size() - 4);
            const auto        known = fingerprints.find(id);
            if (known == fingerprints.end() || seen.count(id))
              continue;
            ResultRow row;
            if (!read_row(plan.results_folder, id, known->second, row))
              continue;
            seen[id] = row.status;
            if (row.status != status::converged)
              ++failures;
            if (row.status != status::bad_input && row.wall_time > 0.)
              {
                solved_seconds += row.wall_time;
                ++solved;
              }
          }
      }

      std::size_t done() const { return seen.size(); }

      std::string line(const ResultRow &row)
      {
        update();
        const std::size_t total = plan.cases.size();
        char              head[64];
        std::snprintf(head, sizeof head, "[%*zu/%zu] ", static_cast<int>(std::to_string(total).size()), done(), total);
        std::ostringstream text;
        text << head << row.id << (row.name.empty() ? "" : " (" + row.name + ")") << ": " << row.status;
        char figures[80];
        std::snprintf(figures, sizeof figures, " in %.2f s, %u Newton", row.wall_time, row.newton_iterations);
        if (row.status != status::bad_input)
          text << figures;
        text << " | failures " << failures;
        if (solved > 0 && done() < total)
          {
            const double left = (total - done()) * solved_seconds / solved / groups;
            char         estimate[40];
            if (left < 1.)
              std::snprintf(estimate, sizeof estimate, "under 1 s");
            else if (left < 120.)
              std::snprintf(estimate, sizeof estimate, "%.0f s", left);
            else if (left < 7200.)
              std::snprintf(estimate, sizeof estimate, "%.1f min", left / 60.);
            else
              std::snprintf(estimate, sizeof estimate, "%.1f h", left / 3600.);
            text << " | about " << estimate << " left";
          }
        if (row.status != status::converged && !row.reason.empty())
          text << "\n    " << row.reason;
        return text.str();
      }

    private:
      const SweepPlan                      &plan;
      unsigned int                          groups;
      std::map<std::string, std::uint64_t> fingerprints;
      std::map<std::string, std::string>   seen;
      std::size_t                          failures = 0, solved = 0;
      double                               solved_seconds = 0.;
    };

    void print_line(const std::string &text)
    {
      std::printf("%s\n", text.c_str());
      std::fflush(stdout);
    }

    /// The full caution, at the end of what a runner, an array task or collect prints.
    void print_caution()
    {
      std::printf("%s", report::caution_lines().c_str());
      std::fflush(stdout);
    }

    /// Rank 0 prepares the folder; every rank learns whether that worked.
    void prepare_folder(const SweepPlan &plan, const RunnerOptions &options, MPI_Comm world, int &lock_file,
                        std::size_t &done_before, std::size_t &retried)
    {
      int rank = 0;
      MPI_Comm_rank(world, &rank);
      std::string problem;
      unsigned long counts[2] = {0, 0};
      if (rank == 0)
        try
          {
            const fs::path folder(plan.results_folder);
            if (fs::exists(folder) && !fs::is_directory(folder))
              throw InputError("results folder = " + plan.results_folder +
                               ": exists and is not a folder; allowed: a new folder or one an earlier sweep wrote");
            // Refuse a folder holding anything a sweep does not write (it may be someone's data).
            if (fs::exists(folder))
              for (const auto &entry : fs::directory_iterator(folder))
                {
                  const std::string name = entry.path().filename().string();
                  if (name[0] != '.' && name != "plan.txt" && name != "cases" && name != "rows" && name != "claims" &&
                      name != "attempts" && name != "output" && name != "warm" && name != "runner.lock" && name != "results.csv" &&
                      name != "results.jsonl" && name != "plot.png" && name != "fluid_uncertainty.csv" &&
                      name != "fluid_uncertainty.jsonl" && name != "fluid_uncertainty.png")
                    throw InputError("results folder = " + plan.results_folder + ": holds " + name +
                                     ", which a sweep does not write; allowed: a new folder, or one an earlier "
                                     "sweep wrote");
                }
            for (const char *sub : {"cases", "rows", "claims", "attempts", "output", "warm"})
              fs::create_directories(folder / sub);
            if (!options.case_index)
              {
                lock_file = ::open((folder / "runner.lock").c_str(), O_RDWR | O_CREAT, 0644);
                if (lock_file < 0 || ::flock(lock_file, LOCK_EX | LOCK_NB) != 0)
                  throw InputError("results folder = " + plan.results_folder +
                                   ": another sweep runner is working in it (runner.lock is held); allowed: wait "
                                   "for it to finish, or choose another folder with --output");
                // Half-written files of a run that died: temporary files and partial case folders.
                for (const fs::path &place :
                     {folder, folder / "rows", folder / "attempts", folder / "cases", folder / "warm"})
                  for (const auto &entry : fs::directory_iterator(place))
                    {
                      const std::string name = entry.path().filename().string();
                      if (name.find(".tmp-") != std::string::npos ||
                          (name.size() > 8 && name.compare(name.size() - 8, 8, ".partial") == 0))
                        fs::remove_all(entry.path());
                    }
                // Claims left now belong to runs that died: count the attempt and free the case.
                for (const auto &entry : fs::directory_iterator(folder / "claims"))
                  {
                    const std::string id = entry.path().filename().string();
                    fs::remove(entry.path());
                    for (const SweepCase &sweep_case : plan.cases)
                      if (sweep_case.id == id)
                        {
                          ResultRow row;
                          if (!read_row(plan.results_folder, id, sweep_case.fingerprint, row))
                            {
                              report::write_file_atomically(attempts_path(plan, id),
                                                            std::to_string(attempts_of(plan, id) + 1) + "\n");
                              ++counts[1];
                            }
                        }
                  }
              }
            if (!options.case_index || !fs::exists(folder / "plan.txt"))
              report::write_file_atomically((folder / "plan.txt").string(), plan.plan_text());
            for (const SweepCase &sweep_case : plan.cases)
              {
                ResultRow row;
                counts[0] += read_row(plan.results_folder, sweep_case.id, sweep_case.fingerprint, row);
              }
          }
        catch (const std::exception &error)
          {
            problem = error.what();
            if (!dynamic_cast<const InputError *>(&error))
              problem = "!" + problem;
          }
      unsigned long length = problem.size();
      MPI_Bcast(&length, 1, MPI_UNSIGNED_LONG, 0, world);
      problem.resize(length);
      MPI_Bcast(problem.data(), static_cast<int>(length), MPI_CHAR, 0, world);
      MPI_Bcast(counts, 2, MPI_UNSIGNED_LONG, 0, world);
      if (!problem.empty())
        {
          if (problem[0] == '!')
            throw std::runtime_error(problem.substr(1));
          throw InputError(problem);
        }
      done_before = counts[0];
      retried     = counts[1];
    }

    int array_case(const SweepPlan &plan, const input::CaseSchema &schema, const RunnerOptions &options,
                   MPI_Comm world)
    {
      int rank = 0;
      MPI_Comm_rank(world, &rank);
      const std::size_t index = *options.case_index;
      if (index >= plan.cases.size())
        throw InputError("command line", 0,
                         "--case-index = " + std::to_string(index) + ": no such case; allowed: 0 to " +
                           std::to_string(plan.cases.size() - 1) + " (the sweep has " +
                           std::to_string(plan.cases.size()) + " cases)");
      int         lock_file = -1, size = 1;
      MPI_Comm_size(world, &size);
      std::size_t done_before = 0, retried = 0;
      prepare_folder(plan, options, world, lock_file, done_before, retried);
      const SweepCase &sweep_case = plan.cases[index];
      int              already    = 0;
      ResultRow        row;
      if (rank == 0)
        already = read_row(plan.results_folder, sweep_case.id, sweep_case.fingerprint, row);
      MPI_Bcast(&already, 1, MPI_INT, 0, world);
      if (already)
        {
          if (rank == 0)
            print_line(sweep_case.id + ": done earlier (" + row.status + "); nothing to do");
          return exit_code::success;
        }
      long neighbour = -1;
      if (rank == 0 && plan.warm_start)
        neighbour = nearest_finished(plan, CaseDistances(plan), index, static_cast<unsigned int>(size));
      MPI_Bcast(&neighbour, 1, MPI_LONG, 0, world);
      row = solve_case(plan, sweep_case, schema, options, world, neighbour);
      if (rank == 0)
        {
          write_row(plan.results_folder, row);
          Progress progress(plan, 1);
          print_line(progress.line(row));
          print_caution();
        }
      return row.status == status::converged     ? exit_code::success :
             row.status == status::not_converged ? exit_code::no_convergence :
             row.status == status::bad_input     ? exit_code::bad_input :
                                                   exit_code::failure;
    }
  } // namespace

  int collect_and_report(const SweepPlan &plan, const input::CaseSchema &schema)
  {
    const CollectReport report = collect_results(plan, schema);
    std::string         counts;
    for (const auto &[name, count] : report.by_status)
      counts += (counts.empty() ? "" : ", ") + std::to_string(count) + " " + name;
    print_line("Table: " + report.csv_path + " and " + report.jsonl_path + " (" + std::to_string(report.rows) +
               " of " + std::to_string(plan.cases.size()) + " cases" + (counts.empty() ? "" : ": " + counts) + ")");
    if (!report.missing.empty())
      {
        std::string list;
        for (std::size_t i = 0; i < report.missing.size() && i < 20; ++i)
          list += (i ? ", " : "") + report.missing[i];
        if (report.missing.size() > 20)
          list += ", ...";
        print_line("Missing " + std::to_string(report.missing.size()) + " case(s) without a result: " + list +
                   " (run them with lentus sweep, or --case-index I)");
      }
    if (!report.fluid_plot_numbers.empty())
      {
        const std::string picture = (fs::path(plan.results_folder) / "fluid_uncertainty.png").string();
        if (!report::plotting_available())
          print_line("No picture of the fluid's uncertainty: " + report::plotting_install_hint());
        else
          {
            std::vector<std::string> arguments = {report.csv_path, "--fluid", report.fluid_csv_path, "--output",
                                                  picture};
            for (const std::string &number : report.fluid_plot_numbers)
              arguments.insert(arguments.end(), {"--number", number});
            if (report::run_script("plot_sweep.py", arguments) == 0)
              print_line("Plot of the fluid's uncertainty: " + picture);
            else
              print_line("No picture of the fluid's uncertainty: scripts/plot_sweep.py failed (see above)");
          }
      }
    if (!plan.plot_number.empty() && report.rows > 0)
      {
        const std::string picture = (fs::path(plan.results_folder) / "plot.png").string();
        if (!report::plotting_available())
          print_line("No plot: " + report::plotting_install_hint());
        else
          {
            std::vector<std::string> arguments = {report.csv_path, "--number", plan.plot_number,
                                                  "--against",     plan.plot_against, "--output", picture};
            if (!plan.plot_curves.empty())
              arguments.insert(arguments.end(), {"--curves", plan.plot_curves});
            if (report::run_script("plot_sweep.py", arguments) == 0)
              print_line("Plot: " + picture);
            else
              print_line("No plot: scripts/plot_sweep.py failed (see above)");
          }
      }
    // The fluid's uncertainty last, right above the caution.
    if (!report.fluid_csv_path.empty())
      print_line("Table of the uncertainty from the fluid: " + report.fluid_csv_path + " and " +
                 report.fluid_jsonl_path + "\n" +
                 report.fluid_summary.substr(0, report.fluid_summary.find_last_not_of('\n') + 1));
    // The solutions kept for warm starts are not results: gone once every case has its row.
    std::error_code ignored;
    if (report.missing.empty())
      fs::remove_all(fs::path(plan.results_folder) / "warm", ignored);
    print_caution();
    return report.missing.empty() ? exit_code::success : exit_code::failure;
  }

  int run_sweep(const SweepPlan &plan, const input::CaseSchema &schema, const RunnerOptions &options, MPI_Comm world)
  {
    int rank = 0, size = 1;
    MPI_Comm_rank(world, &rank);
    MPI_Comm_size(world, &size);
    if (options.case_index)
      return array_case(plan, schema, options, world);

    const unsigned int k = options.ranks_per_case;
    if (k == 0 || static_cast<unsigned int>(size) % k != 0)
      throw InputError("command line", 0,
                       "--ranks-per-case = " + std::to_string(k) + ": does not divide the " + std::to_string(size) +
                         " MPI ranks; allowed: a divisor of the rank count (mpirun -np P with P = k x groups)");
    const unsigned int groups = static_cast<unsigned int>(size) / k;

    int         lock_file   = -1;
    std::size_t done_before = 0, retried = 0;
    prepare_folder(plan, options, world, lock_file, done_before, retried);
    if (rank == 0)
      {
        std::ostringstream head;
        head << "Sweep " << plan.sweep_file << ": " << plan.cases.size() << " cases (" << plan.shape_description()
             << ") of base case " << plan.base_case << "; " << groups << " group(s) of " << k << " rank(s); results in "
             << plan.results_folder;
        if (done_before > 0)
          head << "\nResuming: " << done_before << " case(s) done earlier are kept";
        if (retried > 0)
          head << (done_before > 0 ? "; " : "\n") << retried
               << " case(s) were being solved when a run stopped: they are run again (up to --attempts)";
        if (plan.n_invalid() > 0)
          {
            head << "\n" << plan.n_invalid() << " case(s) are invalid and are recorded as bad input without solving:";
            for (const SweepCase &sweep_case : plan.cases)
              if (!sweep_case.invalid_reason.empty())
                head << "\n    " << sweep_case.invalid_reason;
          }
        print_line(head.str());
      }

    MPI_Comm group;
    MPI_Comm_split(world, rank / static_cast<int>(k), rank, &group);
    int group_rank = 0;
    MPI_Comm_rank(group, &group_rank);
    const bool leader = group_rank == 0;

    Progress    progress(plan, groups);
    std::size_t cursor = 0;
    std::optional<CaseDistances> distances;
    if (leader && plan.warm_start)
      distances.emplace(plan);
    while (true)
      {
        // [case index or -1, 1 = record as crashed without solving, the warm start's case or -1]
        long next[3] = {-1, 0, -1};
        if (leader)
          for (; cursor < plan.cases.size(); ++cursor)
            {
              const SweepCase &candidate = plan.cases[cursor];
              ResultRow        row;
              if (read_row(plan.results_folder, candidate.id, candidate.fingerprint, row) ||
                  !try_claim(plan, candidate.id))
                continue;
              // Another group may have finished it between the look and the claim.
              if (read_row(plan.results_folder, candidate.id, candidate.fingerprint, row))
                {
                  fs::remove(claim_path(plan, candidate.id));
                  continue;
                }
              next[0] = static_cast<long>(cursor);
              next[1] = attempts_of(plan, candidate.id) >= options.max_attempts;
              if (distances)
                next[2] = nearest_finished(plan, *distances, cursor, k);
              ++cursor;
              break;
            }
        MPI_Bcast(next, 3, MPI_LONG, 0, group);
        if (next[0] < 0)
          break;
        const SweepCase &sweep_case = plan.cases[static_cast<std::size_t>(next[0])];
        ResultRow        row;
        if (next[1])
          {
            row        = start_row(plan, sweep_case);
            row.ranks  = k;
            row.status = status::crashed;
            row.reason = "a sweep runner stopped while solving this case " +
                         std::to_string(attempts_of(plan, sweep_case.id)) +
                         " times (killed, or it crashed the process); not tried again";
          }
        else
          row = solve_case(plan, sweep_case, schema, options, group, next[2]);
        if (leader)
          {
            write_row(plan.results_folder, row);
            fs::remove(claim_path(plan, sweep_case.id));
            print_line(progress.line(row));
          }
      }
    MPI_Comm_free(&group);
    MPI_Barrier(world);
    int code = exit_code::success;
    if (rank == 0)
      code = collect_and_report(plan, schema);
    MPI_Bcast(&code, 1, MPI_INT, 0, world);
    if (lock_file >= 0)
      ::close(lock_file);
    return code;
  }
} // namespace lentus::sweep
