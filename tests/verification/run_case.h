// Runs a case given as text and returns its design numbers.
#pragma once

#include "../reference/viscoplastic.h"
#include "solver/flow/flow_run.h"
#include "solver/input/case_file.h"
#include "solver/input/case_schema.h"
#include "solver/input/flow_case.h"

#include <cmath>
#include <fstream>
#include <sstream>
#include <string>
#include <vector>

namespace lentus::testing
{
  /// Solves `text` (a case file) with its output in build/tests/verification_out/<name> (a folder per test:
  /// ctest runs the tests side by side).
  inline input::FlowCase flow_case(const std::string &name,
                                   const std::string &text,
                                   std::vector<std::string> overrides = {})
  {
    overrides.push_back("Output/Folder=verification_out/" + name);
    const input::CaseFile file = input::CaseFile::parse(text, name + ".prm", input::case_schema(), overrides);
    return input::read_flow_case(file);
  }

  /// Rheology section of a power-law fluid, K = 1 Pa s^n, flow index n, viscosity bounds far away.
  inline std::string power_law(const double n)
  {
    return R"(subsection Rheology
  set Viscosity law = Power law
  subsection Power law
    set Consistency = 1
    set Flow index = )" + std::to_string(n) + R"(
    set Minimum viscosity = 1e-8
    set Maximum viscosity = 1e8
  end
end
)";
  }

  /// Rheology section of a Newtonian fluid of viscosity mu [Pa s].
  inline std::string newtonian(const double mu)
  {
    return R"(subsection Rheology
  set Viscosity law = Newtonian
  subsection Newtonian
    set Viscosity = )" + std::to_string(mu) + R"(
  end
end
)";
  }

  /// A channel 0 < x < `length`, 0 < y < 1 m [m] between two no-slip walls, driven by the pressure
  /// `inlet_pressure` [Pa] at x = 0 against 0 at x = `length`, after the `rheology` section.
  inline std::string pressure_driven_channel(const std::string &rheology, const int refinement, const double length,
                                             const double inlet_pressure)
  {
    return rheology + R"(
subsection Geometry
  set Shape = Channel
  set Refinement = )" + std::to_string(refinement) + R"(
  subsection Channel
    set Length = )" + std::to_string(length) + R"(
    set Height = 1
  end
end
subsection Boundary conditions
  set No-slip = bottom wall, top wall
  set Pressure = inlet, outlet
  set Pressure values = )" + std::to_string(inlet_pressure) + R"(, 0
end
)";
  }

  /// A Bingham fluid, mu_p = 1 Pa s, yield stress `yield_stress` [Pa], Papanastasiou exponent M [s].
  inline std::string bingham(const double M, const double yield_stress = 0.5)
  {
    return R"(subsection Rheology
  set Viscosity law = Bingham
  subsection Bingham
    set Plastic viscosity = 1
    set Yield stress = )" + std::to_string(yield_stress) + R"(
    set Regularization exponent = )" + std::to_string(M) + R"(
  end
end
)";
  }

  /// A pipe of radius 1 m and length 1 m (r z), driven by `pressure_drop` [Pa] from inlet to outlet,
  /// after the `rheology` section: tau_w = pressure_drop R / (2 L).
  inline std::string pressure_driven_pipe(const std::string &rheology, const int refinement,
                                          const double pressure_drop = 2.)
  {
    return rheology + R"(
subsection Geometry
  set Shape = Pipe
  set Refinement = )" + std::to_string(refinement) + R"(
  subsection Pipe
    set Radius = 1
    set Length = 1
  end
end
subsection Flow
  set Velocity components = r z
end
subsection Boundary conditions
  set No-slip = wall
  set Axis = axis
  set Pressure = inlet, outlet
  set Pressure values = )" + std::to_string(pressure_drop) + R"(, 0
end
)";
  }

  /// A pipe of `radius` and `length` [m] (r z) fed through its inlet with the developed profile at
  /// `flow_rate` [m^3/s], at pressure 0 at its outlet, after the `rheology` section (and any others).
  inline std::string inflow_pipe(const std::string &rheology, const int refinement, const double radius,
                                 const double length, const double flow_rate)
  {
    return rheology + R"(
subsection Geometry
  set Shape = Pipe
  set Refinement = )" + std::to_string(refinement) + R"(
  subsection Pipe
    set Radius = )" + digits(radius) + R"(
    set Length = )" + digits(length) + R"(
  end
end
subsection Flow
  set Velocity components = r z
end
subsection Boundary conditions
  set No-slip = wall
  set Axis = axis
  set Inflow = inlet
  set Inflow rates = )" + digits(flow_rate) + R"(
  set Pressure = outlet
  set Pressure values = 0
end
)";
  }

  /// A channel 0 < x < `length`, 0 < y < `height` [m] between two no-slip walls, fed through its inlet
  /// with the developed profile at `flow_rate` [m^2/s], at pressure 0 at its outlet, after `rheology`.
  inline std::string inflow_channel(const std::string &rheology, const int refinement, const double height,
                                    const double length, const double flow_rate)
  {
    return rheology + R"(
subsection Geometry
  set Shape = Channel
  set Refinement = )" + std::to_string(refinement) + R"(
  subsection Channel
    set Length = )" + digits(length) + R"(
    set Height = )" + digits(height) + R"(
  end
end
subsection Boundary conditions
  set No-slip = bottom wall, top wall
  set Inflow = inlet
  set Inflow rates = )" + digits(flow_rate) + R"(
  set Pressure = outlet
  set Pressure values = 0
end
)";
  }

  /// The fluid of `rheology` (and any other sections) between cylinders R_i = 1 m and R_o = 2 m,
  /// 0.25 m high with symmetry ends, the inner one turning at `omega` [rad/s] (r z theta).
  inline std::string couette_gap(const std::string &rheology, const double omega, const int refinement)
  {
    return rheology + R"(
subsection Geometry
  set Shape = Annular gap
  set Refinement = )" + std::to_string(refinement) + R"(
  subsection Annular gap
    set Inner radius = 1
    set Outer radius = 2
    set Height = 0.25
  end
end
subsection Flow
  set Velocity components = r z theta
end
subsection Boundary conditions
  set Moving wall = inner wall
  set Rotation rate = )" + digits(omega) + R"(
  set No-slip = outer wall
  set Symmetry = bottom, top
end
)";
  }

  /// A Bingham fluid (mu_p = 1 Pa s, tau_y = 1 Pa, M = 1000 s) in couette_gap().
  inline std::string bingham_couette_case(const double omega, const int refinement)
  {
    return couette_gap(bingham(1000., 1.), omega, refinement);
  }

  /// |a - b| / |b|.
  inline double relative_difference(const double a, const double b)
  {
    return std::abs(a - b) / std::abs(b);
  }

  /// Wall shear stress [Pa] from a run's wall_profile.csv at the points of `role` whose coordinate
  /// `axial` (0: x or r, 1: y or z) lies in [from, to].
  inline std::vector<double> wall_stresses(const std::string &folder, const std::string &role, const int axial,
                                           const double from, const double to)
  {
    std::vector<double> stresses;
    std::ifstream       profile("verification_out/" + folder + "/wall_profile.csv");
    std::string         line;
    if (!std::getline(profile, line) || line.rfind("role,", 0) != 0)
      return stresses;
    while (std::getline(profile, line))
      {
        std::stringstream fields(line);
        std::string       name, cell;
        std::getline(fields, name, ',');
        std::vector<double> numbers;
        while (std::getline(fields, cell, ','))
          numbers.push_back(std::stod(cell));
        if (name == role && numbers.size() == 4 && numbers[axial] >= from && numbers[axial] <= to)
          stresses.push_back(numbers[3]);
      }
    return stresses;
  }

  inline flow::RunResult run_case(const std::string &name,
                                  const std::string &text,
                                  const std::vector<std::string> &overrides = {})
  {
    return flow::run_flow_case(flow_case(name, text, overrides), MPI_COMM_WORLD);
  }
} // namespace lentus::testing
