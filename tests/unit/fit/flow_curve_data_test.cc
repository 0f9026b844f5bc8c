// Reading rheometer CSV data: columns, units, comments and the messages for bad data.
#include "rheology/fit/flow_curve_data.h"

#include <gmock/gmock.h>
#include <gtest/gtest.h>

#include <sstream>

namespace lentus::rheology::fit
{
  namespace
  {
    FlowCurveData read(const std::string &text, const UnitOptions &units = {})
    {
      std::istringstream input(text);
      return read_flow_curve(input, "data.csv", units);
    }

    std::string message_of(const std::string &text, const UnitOptions &units = {})
    {
      try
        {
          read(text, units);
        }
      catch (const DataError &error)
        {
          return error.what();
        }
      return "(no error)";
    }

    TEST(FlowCurveData, ReadsStressWithCommentsAndBlankLines)
    {
      const FlowCurveData data = read("# a comment\n\nshear rate [1/s], shear stress [Pa]\n0.1, 5\n\n# note\n1,7.5\n");
      ASSERT_EQ(data.points.size(), 2u);
      EXPECT_EQ(data.points[0].shear_rate, 0.1);
      EXPECT_EQ(data.points[0].shear_stress, 5.);
      EXPECT_EQ(data.points[0].line, 4);
      EXPECT_EQ(data.points[1].line, 7);
      EXPECT_FALSE(data.has_temperature);
    }

    // Source: analytic (tau = eta gamma_dot; 1 cP = 1e-3 Pa s, 1 dyn/cm^2 = 0.1 Pa, 1 kPa = 1e3 Pa,
    // T[K] = T[degC] + 273.15 — SI definitions).
    TEST(FlowCurveData, ConvertsUnitsToSi)
    {
      const FlowCurveData viscosity = read("Shear_Rate [s^-1],Viscosity [cP],Temperature [degC]\n2,1500,190\n");
      EXPECT_DOUBLE_EQ(viscosity.points[0].shear_stress, 2. * 1.5);
      EXPECT_DOUBLE_EQ(viscosity.points[0].temperature, 463.15);
      EXPECT_TRUE(viscosity.has_temperature);
      EXPECT_DOUBLE_EQ(read("shear rate [1/s],shear stress [dyn/cm^2]\n1,50\n").points[0].shear_stress, 5.);
      EXPECT_DOUBLE_EQ(read("shear rate [1/s],shear stress [kPa]\n1,5\n").points[0].shear_stress, 5e3);
      EXPECT_DOUBLE_EQ(read("shear rate [1/s],viscosity [mPa s]\n1,5\n").points[0].shear_stress, 5e-3);
    }

    TEST(FlowCurveData, UnitsFromOptionsApplyToColumnsWithoutOne)
    {
      UnitOptions units;
      units.shear_stress = "kPa";
      units.temperature  = "degC";
      const FlowCurveData data = read("shear rate,shear stress,temperature\n1,2,0\n", units);
      EXPECT_DOUBLE_EQ(data.points[0].shear_stress, 2e3);
      EXPECT_DOUBLE_EQ(data.points[0].temperature, 273.15);
      // A unit in the header wins over the option.
      EXPECT_DOUBLE_EQ(read("shear rate,shear stress [Pa]\n1,2\n", units).points[0].shear_stress, 2.);
    }

    TEST(FlowCurveData, ListsTheDistinctTemperatures)
    {
      const FlowCurveData data = read("temperature [K],shear rate [1/s],shear stress [Pa]\n"
                                      "500,1,2\n480,1,3\n500,2,3\n");
      EXPECT_THAT(data.temperatures(), ::testing::ElementsAre(480., 500.));
    }

    TEST(FlowCurveData, BadDataNameFileLineColumnAndWhatIsAllowed)
    {
      using ::testing::HasSubstr;
      const std::string header = "shear rate [1/s],shear stress [Pa]\n";
      EXPECT_EQ(message_of(header + "1,2\n-3,4\n"),
                "data.csv:3: column 1 'shear rate [1/s]' = -3: must be > 0; allowed: a shear rate > 0 (the laws are "
                "fitted on log scales; drop points at rest)");
      EXPECT_THAT(message_of(header + "0,4\n"), HasSubstr("data.csv:2: column 1 'shear rate [1/s]' = 0: must be > 0"));
      EXPECT_THAT(message_of(header + "1,NaN\n"),
                  HasSubstr("data.csv:2: column 2 'shear stress [Pa]' = NaN: not a finite number"));
      EXPECT_THAT(message_of(header + "1,inf\n"), HasSubstr("= inf: not a finite number"));
      EXPECT_THAT(message_of(header + "1,\n"), HasSubstr("data.csv:2: column 2 'shear stress [Pa]' = (empty): not a number"));
      EXPECT_THAT(message_of(header + "1,2,3\n"), HasSubstr("data.csv:2: 3 values where the header (line 1) names 2"));
      EXPECT_THAT(message_of(""), HasSubstr("data.csv: empty file"));
      EXPECT_THAT(message_of("# only a comment\n"), HasSubstr("data.csv: empty file"));
      EXPECT_THAT(message_of(header), HasSubstr("data.csv:1: no data below the header"));
      EXPECT_THAT(message_of("shear rate [1/s],torque [N m]\n1,2\n"),
                  HasSubstr("data.csv:1: column 2 'torque [N m]': unknown column; allowed: shear rate, shear stress, "
                            "viscosity, temperature"));
      EXPECT_THAT(message_of("shear stress [Pa]\n2\n"), HasSubstr("data.csv:1: the header has no shear rate column"));
      EXPECT_THAT(message_of("shear rate [1/s]\n2\n"),
                  HasSubstr("data.csv:1: the header has neither a shear stress nor a viscosity column"));
      EXPECT_THAT(message_of("shear rate [1/min],shear stress [Pa]\n1,2\n"),
                  HasSubstr("column 1 'shear rate [1/min]': unknown unit [1/min] for shear rate; allowed: 1/s, s^-1"));
      EXPECT_THAT(message_of("shear rate [1/s,shear stress [Pa]\n1,2\n"), HasSubstr("unit bracket not closed"));
      EXPECT_THAT(message_of("temperature [F],shear rate [1/s],shear stress [Pa]\n1,2,3\n"),
                  HasSubstr("unknown unit [F]; allowed: K, degC"));
      EXPECT_THAT(message_of("temperature [K],shear rate [1/s],shear stress [Pa]\n0,2,3\n"),
                  HasSubstr("data.csv:2: column 1 'temperature [K]' = 0: at or below absolute zero"));
      UnitOptions bad;
      bad.shear_stress = "psi";
      EXPECT_THAT(message_of("shear rate,shear stress\n1,2\n", bad), HasSubstr("unknown unit [psi] for shear stress"));
    }

    TEST(FlowCurveData, MissingFileIsReported)
    {
      try
        {
          read_flow_curve_file("/nonexistent/flow.csv");
          FAIL() << "no error";
        }
      catch (const DataError &error)
        {
          EXPECT_THAT(error.what(), ::testing::HasSubstr("/nonexistent/flow.csv: cannot open the data file"));
        }
    }
  } // namespace
} // namespace lentus::rheology::fit
