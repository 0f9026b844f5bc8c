// Inflow given by mass (Boundary conditions/Inflow mass rates) instead of by volume:
// converted with Rheology/Density, exactly one of the two keys, messages with line and key.
// GoogleMock first: deal.II (through flow_case.h) defines a macro Assert.
#include <gmock/gmock.h>
#include <gtest/gtest.h>

#include "solver/errors.h"
#include "solver/input/case_schema.h"
#include "solver/input/flow_case.h"

using namespace lentus;
using ::testing::HasSubstr;

namespace
{
  std::string pipe_case(const std::string &density, const std::string &rates)
  {
    return R"(subsection Rheology
  set Viscosity law = Newtonian
)" + density + R"(  subsection Newtonian
    set Viscosity = 2
  end
end
subsection Geometry
  set Shape = Pipe
  subsection Pipe
    set Radius = 0.02
    set Length = 0.5
  end
end
subsection Flow
  set Velocity components = r z
end
subsection Boundary conditions
  set No-slip = wall
  set Axis = axis
  set Inflow = inlet
)" + rates + R"(  set Pressure = outlet
  set Pressure values = 0
end
)";
  }

  std::string message_of(const std::string &text)
  {
    try
      {
        input::read_flow_case(input::CaseFile::parse(text, "pipe.prm", input::case_schema()));
      }
    catch (const InputError &error)
      {
        return error.what();
      }
    return "(no error)";
  }

  double inflow_rate(const input::FlowCase &flow)
  {
    for (const input::BoundaryCondition &bc : flow.conditions)
      if (bc.type == input::BoundaryCondition::Type::inflow)
        return bc.flow_rate;
    return -1.;
  }
} // namespace

TEST(InflowMassRate, DividedByTheDensity)
{
  // Q = m_dot / rho: 0.6 kg/s of a fluid of 1200 kg/m^3 is 5e-4 m^3/s (definition of density).
  const auto by_mass = input::read_flow_case(input::CaseFile::parse(
    pipe_case("  set Density = 1200\n", "  set Inflow mass rates = 0.6\n"), "pipe.prm", input::case_schema()));
  EXPECT_DOUBLE_EQ(inflow_rate(by_mass), 0.6 / 1200.);
  const auto by_volume = input::read_flow_case(input::CaseFile::parse(
    pipe_case("  set Density = 1200\n", "  set Inflow rates = 5e-4\n"), "pipe.prm", input::case_schema()));
  EXPECT_DOUBLE_EQ(inflow_rate(by_volume), 5e-4);
}

TEST(InflowMassRate, NeedsTheDensity)
{
  EXPECT_THAT(message_of(pipe_case("", "  set Inflow mass rates = 0.6\n")),
              HasSubstr("pipe.prm:21: Boundary conditions/Inflow mass rates = 0.6: a mass rate needs the fluid's "
                        "density, and Rheology/Density is not set; allowed: Rheology/Density [kg/m^3] set, or volume "
                        "rates under Inflow rates instead"));
}

TEST(InflowMassRate, NotTogetherWithVolumeRates)
{
  EXPECT_THAT(message_of(pipe_case("  set Density = 1200\n",
                                   "  set Inflow rates = 5e-4\n  set Inflow mass rates = 0.6\n")),
              HasSubstr("pipe.prm:23: Boundary conditions/Inflow mass rates = 0.6: Inflow rates is set too (line 22); "
                        "allowed: either Inflow rates [m^3/s] or Inflow mass rates [kg/s], one value per role under "
                        "Inflow"));
}

TEST(InflowMassRate, OneValuePerInflowRole)
{
  EXPECT_THAT(message_of(pipe_case("  set Density = 1200\n", "  set Inflow mass rates = 0.6, 0.2\n")),
              HasSubstr("pipe.prm:22: Boundary conditions/Inflow mass rates = 0.6, 0.2: more values than roles under "
                        "Inflow"));
}
