// A complete flow case read from a case file: fluid, geometry, formulation,
// boundary conditions by role, numerics and outputs.
#pragma once

#include "meshes/geometry.h"
#include "solver/formulation/kinematics.h"
#include "solver/input/case_file.h"
#include "solver/input/flow_sections.h"
#include "solver/input/fluid_section.h"

#include <cmath>
#include <memory>
#include <string>
#include <utility>
#include <vector>

namespace lentus::input
{
  /// Declares Geometry, Flow, Boundary conditions, Nonlinear solver, Linear solver, Output.
  void declare_flow_case(CaseSchema &schema);

  /// A complete flow case: the sections as read (each owns its keys, flow_sections.h) and what is
  /// derived from them and checked across sections (the geometry, the conditions by role).
  struct FlowCase
  {
    /// Angular velocity of the impeller, 2 pi N [rad/s].
    double impeller_omega() const { return 2. * M_PI * operating.rotation_speed; }

    std::string case_file;
    std::string case_name; ///< file name without folder and extension
    Fluid       fluid;

    GeometrySection                   geometry_keys;
    GmshMeshSection                   gmsh_keys;
    FlowSection                       model;     ///< subsection Flow
    OperatingPointSection             operating;
    VesselSection                     vessel;
    BoundaryConditionsSection         boundary_keys;
    NonlinearSolverSection            nonlinear;
    LinearSolverSection               linear;
    AccuracySection                   accuracy;
    HeatSection                       heat;
    OutputSection                     output;

    // Derived and checked across sections.
    std::vector<double>               shape_values; ///< dimensions of a catalogue shape
    std::string                       mesh_file;    ///< Gmsh mesh: the file, as found from the working directory
    std::unique_ptr<meshes::Geometry> geometry;
    std::vector<BoundaryCondition>    conditions;   ///< one per role of the geometry
    std::vector<ThermalCondition>     thermal_conditions; ///< one per role with the energy equation, else none
    std::string                       output_folder; ///< Output/Folder, or out/<case name>
    std::string                       complete_text; ///< every key with its value, for the record
    /// Where Accuracy/Targeted numbers was set (file or command line, line), for a message about a
    /// name the solved case does not have.
    std::pair<std::string, int> targeted_numbers_place;
    /// A sweep's warm start (not a case-file key): each mesh of the sequence starts from the solution
    /// saved under `warm_start_from` when it was saved on the same mesh with the same ranks, and this
    /// case's converged solutions on those meshes are saved under `warm_start_save`; "" for neither.
    std::string warm_start_from, warm_start_save;
  };

  /// Reads and validates a flow case; throws InputError with file, line and key.
  FlowCase read_flow_case(const CaseFile &file);

  /// Reads only what the mesh needs into `flow` (case name, Geometry and its shape's
  /// dimensions or mesh file, Flow), checked as read_flow_case does;
  /// no fluid or boundary conditions are needed. Throws InputError.
  void read_geometry(const CaseFile &file, FlowCase &flow);
} // namespace lentus::input
