// Newtonian lid-driven cavity at Re = 100 with inertia.
#include "run_case.h"

#include <gtest/gtest.h>

#include <algorithm>
#include <cmath>
#include <iostream>

namespace
{
  const char *cavity = R"(
subsection Rheology
  set Viscosity law = Newtonian
  set Density = 1
  subsection Newtonian
    set Viscosity = 0.01
  end
end
subsection Geometry
  set Shape = Cavity
  set Refinement = 5
  subsection Cavity
    set Side length = 1
  end
end
subsection Flow
  set Inertia = true
end
subsection Boundary conditions
  set No-slip = walls
  set Moving wall = lid
  set Wall velocity = 1, 0
end
)";
} // namespace

TEST(LidDrivenCavity, Reynolds100)
{
  // Re = rho U L / mu = 1 * 1 * 1 / 0.01 = 100.
  const lentus::flow::FlowRun run(lentus::testing::flow_case("cavity_re100", cavity), MPI_COMM_WORLD);
  ASSERT_TRUE(run.result().converged) << run.result().reason;

  // Source: Ghia, Ghia & Shin 1982, J. Comput. Phys. 48:387, Table I (u on x = 0.5) and Table II
  // (v on y = 0.5), Re = 100. Tolerance 0.01 (1% of the lid speed): Ghia's own grid error is of
  // that order (their 129 x 129 grid; later spectral solutions, Botella & Peyret 1998, Comput. Fluids
  // 27:421, differ from their tables by up to about 2% at Re = 1000; from memory).
  const double u_table[][2] = {{0.9766, 0.84123},  {0.9688, 0.78871},  {0.9609, 0.73722},  {0.9531, 0.68717},
                               {0.8516, 0.23151},  {0.7344, 0.00332},  {0.6172, -0.13641}, {0.5, -0.20581},
                               {0.4531, -0.2109},  {0.2813, -0.15662}, {0.1719, -0.1015},  {0.1016, -0.06434},
                               {0.0703, -0.04775}, {0.0625, -0.04192}, {0.0547, -0.03717}};
  for (const auto &[y, u] : u_table)
    EXPECT_NEAR(run.values_at({0.5, y})[0], u, 0.01) << "u(0.5, " << y << ")";
  const double v_table[][2] = {{0.9688, -0.05906}, {0.9531, -0.08864}, {0.9063, -0.16914}, {0.8594, -0.22445},
                               {0.8047, -0.24533}, {0.5, 0.05454},     {0.2344, 0.17527},  {0.1563, 0.16077},
                               {0.0938, 0.12317},  {0.0625, 0.09233}};
  for (const auto &[x, v] : v_table)
    EXPECT_NEAR(run.values_at({x, 0.5})[1], v, 0.01) << "v(" << x << ", 0.5)";

  // Source: Marchi, Suero & Araki 2009, J. Braz. Soc. Mech. Sci. Eng. 31 (1024^2 grid, Richardson
  // extrapolation), Re = 100: u_min = -0.2140417, v_max = 0.1795728, v_min = -0.2538030. Extrema
  // sampled every 1/400 along the centrelines; within 0.2%.
  double u_min = 1., v_max = -1., v_min = 1.;
  for (int i = 1; i < 400; ++i)
    {
      const double s = i / 400.;
      u_min          = std::min(u_min, run.values_at({0.5, s})[0]);
      const double v = run.values_at({s, 0.5})[1];
      v_max          = std::max(v_max, v);
      v_min          = std::min(v_min, v);
    }
  std::cout << "u_min " << u_min << ", v_max " << v_max << ", v_min " << v_min << std::endl;
  EXPECT_NEAR(u_min, -0.2140417, 0.002 * 0.2140417);
  EXPECT_NEAR(v_max, 0.1795728, 0.002 * 0.1795728);
  EXPECT_NEAR(v_min, -0.2538030, 0.002 * 0.2538030);
}
