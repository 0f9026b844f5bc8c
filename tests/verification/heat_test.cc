// The energy equation (Heat/Energy equation = true) against closed forms: viscous heating in
// developed Couette, slit and pipe flows, Nahme's Couette flow with a temperature-dependent
// viscosity, the thermal entrance of a pipe and a slit (Graetz), and the energy balance of a
// heated die with a temperature shift. The closed forms are derived beside each test.
#include "run_case.h"

#include <gtest/gtest.h>

#include <cmath>
#include <filesystem>
#include <fstream>
#include <iostream>
#include <string>

using lentus::flow::FlowRun;
using lentus::testing::flow_case;
using lentus::testing::newtonian;
using lentus::testing::power_law;
using lentus::testing::relative_difference;

namespace
{
  /// Density, heat capacity and conductivity of the fluid (inserted into its Rheology section) and
  /// the melt temperature, then a Heat section with `conditions` (its role and value keys).
  std::string thermal(const std::string &rheology, const double rho, const double cp, const double k,
                      const double melt_temperature, const std::string &conditions, const bool viscous_heating = true)
  {
    std::string fluid = rheology;
    const auto  first = fluid.find('\n');
    fluid.insert(first + 1, "  set Density = " + lentus::testing::digits(rho) + "\n  set Heat capacity = " +
                              lentus::testing::digits(cp) + "\n  set Thermal conductivity = " +
                              lentus::testing::digits(k) + "\n");
    return fluid + "subsection Operating point\n  set Temperature = " + lentus::testing::digits(melt_temperature) +
           "\nend\nsubsection Heat\n  set Energy equation = true\n  set Viscous heating = " +
           (viscous_heating ? "true" : "false") + "\n" + conditions + "end\n";
  }

  /// `rheology` with the exponential shift a_T = exp(-beta (T - T_ref)).
  std::string exponential_shift(const std::string &rheology, const double beta, const double reference)
  {
    std::string fluid = rheology;
    fluid.insert(fluid.find('\n') + 1, "  set Temperature shift = Exponential\n  subsection Exponential\n"
                                        "    set Temperature sensitivity = " + lentus::testing::digits(beta) +
                                          "\n    set Reference temperature = " + lentus::testing::digits(reference) +
                                          "\n  end\n");
    return fluid;
  }

  // The developed profiles below do not depend on rho c_p (u . grad T = 0). Their ends are insulated, so
  // the temperature along the flow is held only by conduction, and the streamline-upwind term of the end
  // cells (whose test functions do not integrate to zero along the flow) disturbs the developed profile by
  // the discrete profile's own residual. rho c_p = 1e-3 J/(m^3 K) makes convection and that term negligible,
  // so the checks see the conduction and dissipation terms alone (at a melt's 1e6 J/(m^3 K) the insulated
  // inlet fixes the temperature along the flow only weakly, and round-off shows at 1e-5 K).
  const double small_rho_cp = 1e-3;

  /// Plane Couette flow: 0 < y < 1 m between a resting bottom wall and a top wall moving at U [m/s],
  /// 0 < x < 1 m with developed (set-pressure, equal) ends; both walls at T0, insulated ends.
  /// With `walls`, other thermal conditions for the two walls.
  std::string couette(const std::string &rheology, const double U, const double k, const double T0,
                      const int refinement, const std::string &walls = "")
  {
    return thermal(rheology, small_rho_cp, 1., k, T0,
                   (walls.empty() ? "  set Set temperature = bottom wall, top wall\n  set Wall temperatures = " +
                                      lentus::testing::digits(T0) + ", " + lentus::testing::digits(T0) + "\n" :
                                    walls) +
                     "  set Insulated = inlet, outlet\n") +
           R"(subsection Geometry
  set Shape = Channel
  set Refinement = )" + std::to_string(refinement) + R"(
  subsection Channel
    set Length = 1
    set Height = 1
  end
end
subsection Boundary conditions
  set No-slip = bottom wall
  set Moving wall = top wall
  set Wall velocity = )" + lentus::testing::digits(U) + R"(, 0
  set Pressure = inlet, outlet
  set Pressure values = 0, 0
end
)";
  }

  /// The largest |T_h - T| over `points` + 1 equally spaced points from `from` to `to`.
  template <typename Exact>
  double largest_error(const FlowRun &run, const dealii::Point<2> &from, const dealii::Point<2> &to, const int points,
                       const Exact &exact)
  {
    double largest = 0.;
    for (int i = 0; i <= points; ++i)
      {
        const dealii::Point<2> x = from + (static_cast<double>(i) / points) * (to - from);
        largest                  = std::max(largest, std::abs(run.temperature_at(x) - exact(x)));
      }
    return largest;
  }
} // namespace

// Plane Couette flow with viscous dissipation, constant viscosity, both walls at T0.
// Source: Bird, Stewart & Lightfoot 2002, Transport Phenomena, 2nd ed., sec. 10.4 (viscous heat
// source): k T'' = -mu (U/H)^2 with T(0) = T(H) = T0 gives T - T0 = (mu U^2 / 2k) xi (1 - xi), xi = y/H.
// The profile is quadratic, so the Q2 temperature holds it exactly: only solver error remains.
TEST(ViscousHeating, PlaneCouetteProfileIsExact)
{
  const double mu = 2., U = 1.5, k = 0.5, T0 = 400.;
  const FlowRun run(flow_case("heat_couette", couette(newtonian(mu), U, k, T0, 2)), MPI_COMM_WORLD);
  ASSERT_TRUE(run.result().converged) << run.result().reason;
  const double rise  = mu * U * U / (2. * k);
  const auto   exact = [&](const dealii::Point<2> &x) { return T0 + rise * x[1] * (1. - x[1]); };
  EXPECT_LT(largest_error(run, {0.37, 0.}, {0.37, 1.}, 40, exact), 1e-8 * rise);
  EXPECT_NEAR(run.result().number("maximum temperature"), T0 + rise / 4., 1e-8 * rise);
  // Heat balance (the same section): all the dissipated heat mu (U/H)^2 H L = 4.5 W/m leaves through
  // the two walls, half each; the flow carries none out.
  const double dissipated = mu * U * U;
  EXPECT_NEAR(run.result().number("viscous dissipation"), dissipated, 1e-8 * dissipated);
  EXPECT_NEAR(run.result().number("heat into the fluid through 'bottom wall'"), -dissipated / 2., 1e-8 * dissipated);
  EXPECT_NEAR(run.result().number("heat into the fluid through 'top wall'"), -dissipated / 2., 1e-8 * dissipated);
  EXPECT_NEAR(run.result().number("net heat carried out by the flow"), 0., 1e-8 * dissipated);
  // Without a temperature shift the viscosity does not follow T: the wall shear stress is mu U/H
  // (Bird, Stewart & Lightfoot 2002, sec. 1.1); the moving top wall pulls the fluid with mu U/H * L.
  EXPECT_LT(relative_difference(run.result().number("x force on the fluid from top wall"), mu * U), 1e-8);
}

// Heat transfer to surroundings through a wall: Couette flow with dissipation, the top wall held at T0,
// the bottom one exchanging heat with surroundings at T_s through a coefficient h. Derived here (Bird,
// Stewart & Lightfoot 2002, Transport Phenomena, sec. 10.4 for the source; sec. 10.6 for the heat-transfer
// condition -k dT/dn = h (T - T_s) at a wall): k T'' = -S with S = mu (U/H)^2, T(H) = T0 and
// -k T'(0) = h (T_s - T(0)) give T = A + B y - S y^2 / (2k), B = -h (T_s - T0 - S H^2/(2k)) / (k + h H)
// [H = 1 m], A = T0 - B + S/(2k). A quadratic: exact in Q2.
TEST(ViscousHeating, CouetteWithHeatTransferWall)
{
  const double mu = 1., U = 2., k = 0.5, T0 = 400., Ts = 300., h = 3.;
  const FlowRun run(flow_case("heat_transfer_couette",
                              couette(newtonian(mu), U, k, T0, 2,
                                      "  set Set temperature = top wall\n  set Wall temperatures = 400\n"
                                      "  set Heat transfer = bottom wall\n  set Heat transfer coefficients = 3\n"
                                      "  set Surrounding temperatures = 300\n")),
                    MPI_COMM_WORLD);
  ASSERT_TRUE(run.result().converged) << run.result().reason;
  const double S = mu * U * U, B = -h * (Ts - T0 - S / (2. * k)) / (k + h), A = T0 - B + S / (2. * k);
  const auto   exact = [&](const dealii::Point<2> &x) { return A + B * x[1] - S * x[1] * x[1] / (2. * k); };
  EXPECT_LT(largest_error(run, {0.61, 0.}, {0.61, 1.}, 40, exact), 1e-8 * T0);
  // Heat into the fluid per metre of depth (L = 1 m): through the bottom h (T_s - T(0)) = -k B, through the
  // top k T'(H) = k B - S; together they carry off the dissipation S.
  EXPECT_NEAR(run.result().number("heat into the fluid through 'bottom wall'"), -k * B, 1e-8 * S);
  EXPECT_NEAR(run.result().number("heat into the fluid through 'top wall'"), k * B - S, 1e-8 * S);
  // Brinkman number mu U^2 / (k dT) with dT the largest wall or surrounding difference, here |T_s - T0|.
  EXPECT_NEAR(run.result().number("Brinkman number"), mu * U * U / (k * 100.), 1e-10);
}

// Swirl: Taylor-Couette flow between cylinders R_i = 1 m (turning at omega) and R_o = 2 m (at rest), both
// at T0, with dissipation (velocity components r z theta). Derived here (Bird, Stewart & Lightfoot 2002,
// Transport Phenomena, sec. 3.6 for u_theta = A r + B/r, sec. 10.4 and its problems for the heat source):
// the dissipation mu (r d(u_theta/r)/dr)^2 = 4 mu B^2 / r^4 and (k/r)(r T')' = -4 mu B^2/r^4 give
// T = T0 + C1 ln r + C2 - mu B^2 / (k r^2), with B = omega R_i^2 R_o^2 / (R_o^2 - R_i^2) and C1, C2 from
// T(R_i) = T(R_o) = T0.
TEST(ViscousHeating, TaylorCouetteWithSwirl)
{
  const double mu = 1., k = 0.1, T0 = 420., omega = 1., Ri = 1., Ro = 2.;
  const std::string heat = thermal(newtonian(mu), small_rho_cp, 1., k, T0,
                                   "  set Set temperature = inner wall, outer wall\n"
                                   "  set Wall temperatures = 420, 420\n  set Insulated = bottom, top\n");
  const FlowRun run(flow_case("heat_taylor_couette", lentus::testing::couette_gap(heat, omega, 3)), MPI_COMM_WORLD);
  ASSERT_TRUE(run.result().converged) << run.result().reason;
  const double B = omega * Ri * Ri * Ro * Ro / (Ro * Ro - Ri * Ri), c = mu * B * B / k;
  // T(Ri) = T(Ro) = T0: C1 ln Ri + C2 = c / Ri^2, C1 ln Ro + C2 = c / Ro^2.
  const double C1    = (c / (Ro * Ro) - c / (Ri * Ri)) / (std::log(Ro) - std::log(Ri));
  const double C2    = c / (Ri * Ri) - C1 * std::log(Ri);
  const auto   exact = [&](const dealii::Point<2> &x) { return T0 + C1 * std::log(x[0]) + C2 - c / (x[0] * x[0]); };
  double       rise  = 0.;
  for (int i = 0; i <= 100; ++i)
    rise = std::max(rise, exact(dealii::Point<2>(Ri + (Ro - Ri) * i / 100., 0.)) - T0);
  EXPECT_LT(largest_error(run, {Ri, 0.1}, {Ro, 0.1}, 40, exact), 1e-3 * rise);
  // All the dissipation, the power the inner wall puts in, leaves through the two walls.
  const double dissipation = run.result().number("viscous dissipation");
  EXPECT_NEAR(run.result().number("heat into the fluid through 'inner wall'") +
                run.result().number("heat into the fluid through 'outer wall'"),
              -dissipation, 1e-8 * dissipation);
}

// Nahme's problem: plane Couette flow of a Newtonian fluid whose viscosity falls exponentially with
// temperature, mu = mu0 exp(-beta (T - T0)), both walls at T0 (Nahme 1940, Ing.-Arch. 11:191; the
// same problem as Bird, Stewart & Lightfoot 2002, Transport Phenomena, problem 10B on viscous heating
// with a temperature-dependent viscosity). Derived here: the shear stress tau is uniform, so with
// theta = beta (T - T0) and xi = y/H, theta'' = -(beta tau^2 H^2 / (mu0 k)) e^theta, theta(0) = theta(1)
// = 0, whose solution is theta = 2 ln[cosh(c/2) / cosh(c (xi - 1/2))]. The wall speed
// U = int tau/mu dy = (tau H / mu0) sinh(c)/c then fixes c through the Nahme-Griffith number
// Na = beta mu0 U^2 / k: sinh^2(c/2) = Na/8. Hence T_max - T0 = ln(1 + Na/8)/beta and
// tau = mu0 U c / (H sinh c).
class NahmeCouette : public ::testing::TestWithParam<double>
{};

TEST_P(NahmeCouette, ExponentialShift)
{
  // Na = 5: a moderate coupling; Na = 50: a strong one (the viscosity at the hottest point a thirtieth
  // of the wall's), which the split coupled solve must still converge for.
  const double Na  = GetParam();
  const double mu0 = 1., U = 2., T0 = 450., beta = 0.5, k = beta * mu0 * U * U / Na;
  const double c  = 2. * std::asinh(std::sqrt(Na / 8.));
  const std::string fluid = exponential_shift(newtonian(mu0), beta, T0);
  const FlowRun run(flow_case("heat_nahme_" + std::to_string(static_cast<int>(Na)), couette(fluid, U, k, T0, 4),
                              {"Heat/Coupling tolerance=1e-9"}),
                    MPI_COMM_WORLD);
  ASSERT_TRUE(run.result().converged) << run.result().reason;
  const auto exact = [&](const dealii::Point<2> &x) {
    return T0 + 2. / beta * std::log(std::cosh(c / 2.) / std::cosh(c * (x[1] - 0.5)));
  };
  const double rise = std::log(1. + Na / 8.) / beta;
  EXPECT_LT(largest_error(run, {0.5, 0.}, {0.5, 1.}, 40, exact), 1e-4 * rise);
  EXPECT_LT(std::abs(run.result().number("maximum temperature") - (T0 + rise)), 1e-4 * rise);
  const double tau = mu0 * U * c / std::sinh(c);
  EXPECT_LT(relative_difference(run.result().number("x force on the fluid from top wall"), tau), 1e-4);
  // The isothermal comparison is the same case at T0 throughout: tau = mu0 U / H.
  EXPECT_LT(relative_difference(run.result().number("Nahme-Griffith number"), Na), 1e-6);
}

INSTANTIATE_TEST_SUITE_P(ViscousHeating, NahmeCouette, ::testing::Values(5., 50.));

// Fully developed plane Poiseuille flow with dissipation, walls at T_w (full gap H = 2h = 1 m, G = 1 Pa/m).
// Source: Bird, Stewart & Lightfoot 2002, Transport Phenomena, sec. 10.4 and its problems; derived here:
// u = (G h^2/2mu)(1 - eta^2), eta = y'/h, mean velocity U = G h^2/(3 mu); k T'' = -mu u'^2 = -G^2 y'^2/mu
// gives T - T_w = (G^2 h^4 / 12 mu k)(1 - eta^4) = (3 mu U^2 / 4k)(1 - eta^4).
TEST(ViscousHeating, PlanePoiseuilleProfile)
{
  const double mu = 1., k = 0.01, Tw = 500.;
  const std::string text =
    thermal(newtonian(mu), small_rho_cp, 1., k, Tw,
            "  set Set temperature = bottom wall, top wall\n  set Wall temperatures = 500, 500\n"
            "  set Insulated = inlet, outlet\n") +
    lentus::testing::pressure_driven_channel("", 3, 2., 2.);
  const FlowRun run(flow_case("heat_poiseuille", text), MPI_COMM_WORLD);
  ASSERT_TRUE(run.result().converged) << run.result().reason;
  const double h = 0.5, U = 1. * h * h / (3. * mu);
  const double rise  = 3. * mu * U * U / (4. * k);
  const auto   exact = [&](const dealii::Point<2> &x) { return Tw + rise * (1. - std::pow((x[1] - h) / h, 4)); };
  // Between the nodes, Q2 on 8 cells across the gap cannot follow a quartic closer than its interpolation
  // error, bounded by h^3 max|T'''| / (9 sqrt 3) = 2.4% of the rise here (h = 1/4 in eta; Brenner & Scott
  // 2008, The Mathematical Theory of Finite Element Methods, ch. 4, for the form of the bound); the nodes
  // (where the hottest point is found) are much closer.
  EXPECT_LT(largest_error(run, {1.1, 0.}, {1.1, 1.}, 40, exact), 1e-2 * rise);
  EXPECT_LT(std::abs(run.result().number("maximum temperature") - (Tw + rise)), 1e-3 * rise);
}

// The same in a pipe (R = 1 m, G = 2 Pa/m): u = (G R^2/4mu)(1 - rho^2), U = G R^2/(8 mu);
// (k/r)(r T')' = -mu u'^2 = -G^2 r^2/(4 mu) gives T - T_w = (G^2 R^4/(64 mu k))(1 - rho^4) = (mu U^2/k)(1 - rho^4).
// Source: Bird, Stewart & Lightfoot 2002, Transport Phenomena, sec. 10.4 and its problems (derived here).
TEST(ViscousHeating, PipeProfile)
{
  const double mu = 1., k = 0.05, Tw = 480.;
  const std::string text = thermal(newtonian(mu), small_rho_cp, 1., k, Tw,
                                   "  set Set temperature = wall\n  set Wall temperatures = 480\n"
                                   "  set Insulated = axis, inlet, outlet\n") +
                           lentus::testing::pressure_driven_pipe("", 3);
  const FlowRun run(flow_case("heat_pipe", text), MPI_COMM_WORLD);
  ASSERT_TRUE(run.result().converged) << run.result().reason;
  const double U     = 2. / (8. * mu);
  const double rise  = mu * U * U / k;
  const auto   exact = [&](const dealii::Point<2> &x) { return Tw + rise * (1. - std::pow(x[0], 4)); };
  // Interpolation error between nodes as for the slit above (2.4% bound); the nodes much closer.
  EXPECT_LT(largest_error(run, {0., 0.6}, {1., 0.6}, 40, exact), 1e-2 * rise);
  EXPECT_LT(std::abs(run.result().number("maximum temperature") - (Tw + rise)), 1e-3 * rise);
  // The hottest node lies on the axis, or (the profile is flat there, 1 - rho^4) within one node spacing
  // of it (1/16 m on this mesh).
  EXPECT_LE(run.result().number("maximum temperature at r"), 1. / 16. + 1e-12);
}

// Power-law slit flow with dissipation, walls at T_w, half gap h = 0.5 m, G = 1 Pa/m, K = 1 Pa s^n.
// Derived here from tau = G y (y from the midplane; Bird, Stewart & Lightfoot 2002, Transport Phenomena,
// sec. 8.3 for the stress, sec. 10.4 for the heat source): gamma_dot = (G y/K)^(1/n), S = tau gamma_dot, and
// k T'' = -S with T(h) = T_w, T'(0) = 0 gives
// T - T_w = G^((n+1)/n) K^(-1/n) n^2 / [k (2n+1)(3n+1)] (h^((3n+1)/n) - |y|^((3n+1)/n)).
TEST(ViscousHeating, PowerLawSlitProfile)
{
  const double n = 0.5, k = 0.001, Tw = 470., h = 0.5;
  const std::string text =
    thermal(power_law(n), small_rho_cp, 1., k, Tw,
            "  set Set temperature = bottom wall, top wall\n  set Wall temperatures = 470, 470\n"
            "  set Insulated = inlet, outlet\n") +
    lentus::testing::pressure_driven_channel("", 3, 2., 2.);
  const FlowRun run(flow_case("heat_power_law_slit", text), MPI_COMM_WORLD);
  ASSERT_TRUE(run.result().converged) << run.result().reason;
  const double m     = (3. * n + 1.) / n;
  const double scale = std::pow(1., (n + 1.) / n) * n * n / (k * (2. * n + 1.) * (3. * n + 1.));
  const double rise  = scale * std::pow(h, m);
  const auto   exact = [&](const dealii::Point<2> &x) { return Tw + scale * (std::pow(h, m) - std::pow(std::abs(x[1] - h), m)); };
  // Between nodes Q2 follows T ~ 1 - eta^5 to within h^3 max|T'''| / (9 sqrt 3) = 6% of the rise at
  // most (as above); found about 0.6%. The nodes are closer.
  EXPECT_LT(largest_error(run, {0.9, 0.}, {0.9, 1.}, 40, exact), 1e-2 * rise);
  EXPECT_LT(std::abs(run.result().number("maximum temperature") - (Tw + rise)), 2e-3 * rise);
}

namespace
{
  /// The bulk (flow-weighted) temperature across a straight duct at axial position `axial`
  /// (r or y from 0 to `width`; weight r when axisymmetric), by Simpson's rule on probes.
  double bulk_temperature(const FlowRun &run, const double axial, const double width, const bool axisymmetric)
  {
    const int points = 200;
    double    flux = 0., carried = 0.;
    for (int i = 0; i <= points; ++i)
      {
        const double     s = width * i / points;
        const dealii::Point<2> x = axisymmetric ? dealii::Point<2>(s, axial) : dealii::Point<2>(axial, s);
        const double     u = run.values_at(x)[axisymmetric ? 1 : 0] * (axisymmetric ? s : 1.);
        const double     weight = (i == 0 || i == points) ? 1. : (i % 2 ? 4. : 2.);
        flux += weight * u;
        carried += weight * u * run.temperature_at(x);
      }
    return carried / flux;
  }
} // namespace

// Thermal entrance (Graetz problem) of a pipe without dissipation: developed flow enters at T_in, the
// wall is held at T_w. Far downstream the bulk temperature difference decays as exp(-2 h z / (rho c_p U R)),
// with the Nusselt number h D / k -> 3.66 at constant wall temperature.
// Source: Shah & London 1978, Laminar Flow Forced Convection in Ducts, ch. V (Nu_T = 3.657). A slice
// balance gives Nu = -(rho c_p U R^2 / k) d ln(T_b - T_w)/dz. Peclet number U D/alpha = 200: axial
// conduction changes Nu_T by well under 1% there (same source, from memory for the figure).
TEST(ThermalEntrance, PipeNusseltNumber)
{
  const double R = 0.1, U = 1., rho_cp = 1e6, alpha = U * 2. * R / 200., k = alpha * rho_cp;
  const std::string heat = thermal(newtonian(1.), 1000., 1000., k, 400.,
                                   "  set Set temperature = wall\n  set Wall temperatures = 300\n"
                                   "  set Inlet temperature = inlet\n  set Outflow = outlet\n  set Insulated = axis\n",
                                   false);
  const FlowRun run(flow_case("heat_graetz_pipe", lentus::testing::inflow_pipe(heat, 2, R, 6., U * M_PI * R * R)),
                    MPI_COMM_WORLD);
  ASSERT_TRUE(run.result().converged) << run.result().reason;
  const double z1 = 3., z2 = 5., Tw = 300.;
  const double theta1 = bulk_temperature(run, z1, R, true) - Tw, theta2 = bulk_temperature(run, z2, R, true) - Tw;
  const double nusselt = -(rho_cp * U * R * R / k) * std::log(theta2 / theta1) / (z2 - z1);
  std::cout << "pipe: Nusselt number far downstream " << nusselt << " (Shah & London 1978: 3.657)\n";
  EXPECT_NEAR(nusselt, 3.657, 0.005 * 3.657);
}

// The same between parallel plates, full gap H, both walls at T_w: Nu = h (2H)/k -> 7.54.
// Source: Shah & London 1978, Laminar Flow Forced Convection in Ducts, ch. VI (Nu_T = 7.541). A slice
// balance gives Nu = -(rho c_p U H^2 / k) d ln(T_b - T_w)/dx. Peclet number U (2H)/alpha = 200.
TEST(ThermalEntrance, ParallelPlatesNusseltNumber)
{
  const double H = 0.2, U = 1., rho_cp = 1e6, alpha = U * 2. * H / 200., k = alpha * rho_cp;
  const std::string heat =
    thermal(newtonian(1.), 1000., 1000., k, 400.,
            "  set Set temperature = bottom wall, top wall\n  set Wall temperatures = 300, 300\n"
            "  set Inlet temperature = inlet\n  set Outflow = outlet\n",
            false);
  const FlowRun run(flow_case("heat_graetz_plates", lentus::testing::inflow_channel(heat, 2, H, 6., U * H)),
                    MPI_COMM_WORLD);
  ASSERT_TRUE(run.result().converged) << run.result().reason;
  const double x1 = 2., x2 = 4., Tw = 300.;
  const double theta1 = bulk_temperature(run, x1, H, false) - Tw, theta2 = bulk_temperature(run, x2, H, false) - Tw;
  const double nusselt = -(rho_cp * U * H * H / k) * std::log(theta2 / theta1) / (x2 - x1);
  std::cout << "plates: Nusselt number far downstream " << nusselt << " (Shah & London 1978: 7.541)\n";
  EXPECT_NEAR(nusselt, 7.541, 0.005 * 7.541);
}

// An inlet temperature profile (Heat/Inlet temperature files): developed pipe flow entering with
// T = T0 + dT r/R, insulated wall, no dissipation. The fluid carries in its cup-mixing (flow-weighted)
// temperature, with u = 2U (1 - (r/R)^2): T_b = T0 + dT int (1-s^2) s^2 ds / int (1-s^2) s ds = T0 + 8 dT/15
// (Bird, Stewart & Lightfoot 2002, Transport Phenomena, sec. 10.8 for the cup-mixing temperature; the
// integral done here). Energy conservation with an insulated wall (same source, sec. 11.2): what leaves is
// what entered plus what conduction brings in at the inlet.
TEST(InletProfile, CupMixingTemperatureCarriedThrough)
{
  const double T0 = 400., dT = 10., R = 0.1, Q = 1e-3, rho_cp = 1e6;
  {
    std::filesystem::create_directories("verification_out");
    std::ofstream profile("verification_out/inlet_profile.csv");
    profile << "# temperature across the inlet\nr [m],temperature [K]\n0,400\n0.1,410\n";
  }
  const std::string heat = thermal(newtonian(1.), 1000., 1000., 0.5, T0,
                                   "  set Insulated = wall, axis\n  set Inlet temperature = inlet\n"
                                   "  set Inlet temperature files = verification_out/inlet_profile.csv\n"
                                   "  set Outflow = outlet\n",
                                   false);
  const FlowRun run(flow_case("heat_inlet_profile", lentus::testing::inflow_pipe(heat, 2, R, 1., Q)), MPI_COMM_WORLD);
  ASSERT_TRUE(run.result().converged) << run.result().reason;
  // The inlet holds the profile: linear in r, exact at every point of the role.
  EXPECT_NEAR(run.temperature_at({0.03, 0.}), T0 + 0.3 * dT, 1e-9 * dT);
  const double inlet = run.result().number("mean temperature at 'inlet'");
  EXPECT_NEAR(inlet, T0 + 8. * dT / 15., 1e-6 * dT);
  const double conducted = run.result().number("heat conducted into the fluid through 'inlet'");
  EXPECT_NEAR(run.result().number("net heat carried out by the flow"), conducted, 1e-8 * rho_cp * Q * dT);
  EXPECT_NEAR(run.result().number("mean temperature at 'outlet'"), inlet + conducted / (rho_cp * Q), 1e-2 * dT);
}

// A heated round die with a temperature-dependent melt (exponential shift): the split coupled solve
// converges, and the energy balance holds. Conservation of energy (Bird, Stewart & Lightfoot 2002,
// Transport Phenomena, sec. 11.2): what the flow carries out net (int rho c_p u . grad T) equals the
// heat dissipated plus the heat into the fluid through walls and inlet, to solver precision (the discrete
// equations, summed over all test functions, say exactly that); the per-role convected heats
// rho c_p int (T - T_in) u . n agree with it to discretization precision.
TEST(CoupledHeat, HeatedDieEnergyBalanceAndLowerPressure)
{
  const std::string fluid = exponential_shift(power_law(0.4), 0.02, 470.);
  // rho c_p = 1e3 J/(m^3 K) (not a melt's 1e6) keeps the thermal layer at the heated wall (Peclet number
  // U R / alpha about 160) resolved by the mesh, so that the boundary form of the balance is accurate.
  const std::string heat = thermal(fluid, 1., 1000., 0.2, 470.,
                                   "  set Set temperature = wall\n  set Wall temperatures = 490\n"
                                   "  set Inlet temperature = inlet\n  set Outflow = outlet\n  set Insulated = axis\n");
  const auto result = lentus::testing::run_case("heat_die_balance", lentus::testing::inflow_pipe(heat, 3, 0.1, 1., 0.01));
  ASSERT_TRUE(result.converged) << result.reason;
  const double dissipated = result.number("viscous dissipation");
  const double wall       = result.number("heat into the fluid through 'wall'");
  const double inlet      = result.number("heat conducted into the fluid through 'inlet'");
  const double net        = result.number("net heat carried out by the flow");
  const double scale      = std::abs(dissipated) + std::abs(wall);
  EXPECT_GT(wall, 0.); // the die is hotter than the melt
  EXPECT_NEAR(net, dissipated + wall + inlet, 1e-8 * scale);
  const double carried = result.number("heat carried out through 'outlet'") + result.number("heat carried out through 'inlet'");
  EXPECT_NEAR(carried, net, 2e-2 * scale);
  // The melt warms, so its viscosity and the pressure fall below the isothermal ones.
  EXPECT_GT(result.number("temperature rise inlet to outlet"), 0.);
  EXPECT_LT(result.number("pressure drop inlet to outlet"), result.number("isothermal pressure drop inlet to outlet"));
}
