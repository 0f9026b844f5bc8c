// `lentus fit DATA.csv`: fits the viscosity laws to rheometer data, ranks them
// and writes the fitted fluid (case-file section), a JSON summary, a sweep
// file over the confidence region and a picture.
#include "rheology/fit/fit_report.h"
#include "rheology/fit/law_fit.h"
#include "rheology/fit/sweep_file.h"
#include "rheology/law_registry.h"
#include "solver/cli/arguments.h"
#include "solver/cli/commands.h"
#include "solver/errors.h"
#include "solver/report/atomic_file.h"
#include "solver/report/plotting.h"

#include <filesystem>
#include <iostream>

namespace lentus::cli
{
  namespace
  {
    const char *help = R"(usage: lentus fit DATA.csv [options]

Fits viscosity laws to rheometer data by nonlinear least squares on log shear
stress (relative errors; Levenberg-Marquardt, GSL), ranks them by AIC and prints
each law's parameters with standard errors and 95% confidence intervals, with
warnings where the data cannot pin a parameter down.

DATA.csv: a header naming the columns, then one line per point; '#' starts a comment.
  shear rate [1/s],shear stress [Pa]          or   shear rate [1/s],viscosity [Pa s]
  optional column: temperature [K] (or [degC]); data at several temperatures are
  fitted jointly by time-temperature superposition with one shift law.
  Units: shear rate 1/s, s^-1; shear stress Pa, kPa, MPa, dyn/cm^2;
  viscosity Pa s, mPa s, kPa s, cP, P; temperature K, degC.
Yield-stress laws (Bingham, Herschel-Bulkley) are fitted as the ideal law
tau = tau_y + ...; the case file gets a Papanastasiou exponent M that matches it
over the measured range.

options:
  --law NAME                 fit only this law (default: every law; see lentus laws)
  --shift Arrhenius|WLF|Exponential|none temperature shift for data at several temperatures (default Arrhenius)
  --reference-temperature T  T_ref [K], one of the measured temperatures (default: the middle one)
  --rate-unit U, --stress-unit U, --viscosity-unit U, --temperature-unit U
                             unit of a column whose header gives none (default SI)
  --output DIR               folder for the results (default out/fit_<data file name>)
  --samples N                Latin-hypercube samples in the sweep file, 2..1000 (default 10)
  --seed S                   seed of the samples (default 1)
  --no-plot                  do not draw fit.png

writes DIR/fluid.prm (the fitted fluid, a case-file section), DIR/fit.json,
DIR/samples.sweep (cases sampling the confidence region, for a sweep) and DIR/fit.png.
Fitted parameters are model estimates: check them against measurements.
)";

    rheology::fit::ShiftModel shift_model(const Arguments &arguments)
    {
      const auto found = arguments.options.find("--shift");
      if (found == arguments.options.end() || found->second == "Arrhenius")
        return rheology::fit::ShiftModel::arrhenius;
      if (found->second == "WLF")
        return rheology::fit::ShiftModel::wlf;
      if (found->second == "Exponential")
        return rheology::fit::ShiftModel::exponential;
      if (found->second == "none")
        return rheology::fit::ShiftModel::none;
      throw InputError("command line", 0,
                       "--shift = " + found->second + ": unknown shift; allowed: Arrhenius, WLF, Exponential, none");
    }

    std::string option_or(const Arguments &arguments, const std::string &name, const std::string &fallback)
    {
      const auto found = arguments.options.find(name);
      return found == arguments.options.end() ? fallback : found->second;
    }
  } // namespace

  int fit_command(const int argc, const char *const *argv, const int first)
  {
    const Arguments arguments =
      parse_arguments(argc, argv, first,
                      {"--law", "--shift", "--reference-temperature", "--rate-unit", "--stress-unit", "--viscosity-unit",
                       "--temperature-unit", "--output", "--samples", "--seed"},
                      {"--help", "--no-plot"});
    if (arguments.has("--help"))
      {
        std::cout << help;
        return exit_code::success;
      }
    if (arguments.positional.size() != 1)
      throw InputError("command line", 0, "fit needs exactly one data file; see lentus fit --help");
    if (!arguments.sets.empty())
      throw InputError("command line", 0, "--set: not used by fit; allowed: the options of lentus fit --help");

    // Everything is read and checked before anything is written.
    rheology::fit::FitOptions options;
    options.shift = shift_model(arguments);
    if (const auto law = arguments.options.find("--law"); law != arguments.options.end())
      {
        const auto names = rheology::fit::fittable_laws();
        if (std::find(names.begin(), names.end(), law->second) == names.end())
          {
            std::string list;
            for (const std::string &name : names)
              list += (list.empty() ? "" : ", ") + name;
            throw InputError("command line", 0, "--law = " + law->second + ": unknown law; allowed: " + list);
          }
        options.laws = {law->second};
      }
    if (const auto reference = arguments.optional_real("--reference-temperature", rheology::Range::above(0.)))
      options.reference_temperature = *reference;
    const long samples = arguments.integer("--samples", 10, 2, 1000);
    const long seed    = arguments.integer("--seed", 1, 0, 2147483647);

    rheology::fit::UnitOptions units;
    units.shear_rate   = option_or(arguments, "--rate-unit", "");
    units.shear_stress = option_or(arguments, "--stress-unit", "");
    units.viscosity    = option_or(arguments, "--viscosity-unit", "");
    units.temperature  = option_or(arguments, "--temperature-unit", "");

    const std::string data_path = arguments.positional[0];
    const std::string output    = option_or(arguments, "--output",
                                         "out/fit_" + std::filesystem::path(data_path).stem().string());
    const bool        plot      = !arguments.has("--no-plot");

    rheology::fit::FlowCurveData       data;
    std::vector<rheology::fit::LawFit> fits;
    try
      {
        data = rheology::fit::read_flow_curve_file(data_path, units);
        fits = rheology::fit::fit_laws(data, options);
      }
    catch (const rheology::fit::DataError &error)
      {
        throw InputError(error.what());
      }
    catch (const rheology::InvalidParameter &error)
      {
        throw InputError("command line", 0, "--reference-temperature = " + error.value_text + ": " + error.problem +
                                              "; allowed: " + error.allowed);
      }
    if (plot && !report::plotting_available())
      throw std::runtime_error("cannot draw fit.png: " + report::plotting_install_hint() +
                               " (or pass --no-plot); nothing written");

    const rheology::fit::LawFit &best = fits.front();
    const std::string report_text = rheology::fit::text_report(data, fits, options);

    // Write under temporary names; rename only when all are complete.
    std::filesystem::create_directories(output);
    const std::filesystem::path folder(output);
    const std::vector<std::pair<std::string, std::string>> files{
      {(folder / "fluid.prm").string(), rheology::fit::case_section(best, data.source)},
      {(folder / "fit.json").string(), rheology::fit::json_report(data, fits, options)},
      {(folder / "samples.sweep").string(),
       rheology::fit::sweep_file(best, static_cast<std::size_t>(samples), static_cast<std::uint64_t>(seed), data.source)}};
    std::vector<std::pair<std::string, std::string>> renames;
    std::error_code                                  ignored;
    auto remove_temporaries = [&] {
      for (const auto &[temporary, target] : renames)
        std::filesystem::remove(temporary, ignored);
    };
    try
      {
        for (const auto &[path, content] : files)
          {
            const std::string temporary = report::temporary_name_for(path) + ".part";
            report::write_file_atomically(temporary, content);
            renames.push_back({temporary, path});
          }
        if (plot)
          {
            const std::string image  = (folder / "fit.png").string();
            const std::string table  = report::temporary_name_for(image) + ".csv";
            const std::string drawn  = report::temporary_name_for(image) + ".png";
            report::write_file_atomically(table, rheology::fit::plot_table(data, fits, 3));
            renames.push_back({drawn, image});
            const std::string title = "Fit to " + std::filesystem::path(data_path).filename().string();
            const int status = report::run_script("plot_fit.py", {table, drawn, title});
            std::filesystem::remove(table, ignored);
            if (status != 0)
              throw std::runtime_error("the plot script failed (exit " + std::to_string(status) + "); nothing written");
          }
      }
    catch (...)
      {
        remove_temporaries();
        throw;
      }
    for (const auto &[temporary, target] : renames)
      report::rename_file(temporary, target);

    std::cout << report_text;
    for (const auto &[temporary, target] : renames)
      std::cerr << "lentus: wrote " << target << '\n';
    return exit_code::success;
  }
} // namespace lentus::cli
