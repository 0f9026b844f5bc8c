// Dies: developed flow at the computed throughput in each straight section (exact 1D solution of
// the fluid's law), and the entrance loss beyond it (Bagley 1957: dp = 2 tau_w (L/R + e)).
#include "solver/flow/developed_profile.h"
#include "solver/report/numbers.h"

#include <cmath>

namespace lentus::report
{
  void add_die_numbers(const Formulation &formulation, const rheology::ViscosityLaw &law,
                       const std::vector<meshes::StraightSection> &sections, const FlowIntegrals &integrals,
                       DesignNumbers &numbers)
  {
    if (sections.empty() || !integrals.roles.count("inlet") || !integrals.roles.count("outlet"))
      return;
    const RoleIntegrals &in = integrals.roles.at("inlet"), &out = integrals.roles.at("outlet");
    const double modelled   = formulation.total_factor() * out.flux;
    const double total_drop = in.pressure / in.weight - out.pressure / out.weight;
    double       developed  = 0., last_wall_stress = 0.;
    for (const meshes::StraightSection &section : sections)
      {
        // The whole section's flow (a half slit carries half of it).
        const double throughput = modelled / section.flow_fraction;
        const bool   annulus    = section.pipe && section.inner > 0.;
        const bool   land       = &section == &sections.back(); // the section the melt leaves by
        using Channel           = flow::DevelopedProfile::Channel;
        const flow::DevelopedProfile profile(law, annulus ? Channel::annulus : section.pipe ? Channel::pipe : Channel::slit,
                                             section.size, throughput, section.inner);
        const double wall_stress = profile.wall_stress();
        const double drop        = std::abs(profile.pressure_gradient()) * section.length;
        developed += drop;
        const std::string in_section = " in the " + section.name;
        numbers.add("developed pressure drop" + in_section, "dp_dev", drop, "Pa", Group::die);
        // Annulus: the mean over both walls' perimeters, then each wall.
        numbers.add("developed wall shear stress" + in_section, "tau_w", wall_stress, "Pa", Group::die, land);
        if (annulus)
          {
            numbers.add("developed wall shear stress on the mandrel" + in_section, "tau_w,i",
                        profile.inner_wall_stress(), "Pa", Group::die);
            numbers.add("developed wall shear stress on the outer wall" + in_section, "tau_w,o",
                        profile.outer_wall_stress(), "Pa", Group::die);
          }
        // Apparent wall shear rate: 4Q/(pi R^3) (pipe), 3q/(2h^2) per unit depth (slit), and for an
        // annulus the slit value of its gap: 6Q/(pi (R + a)(R - a)^2); the true rate from the law.
        const double apparent =
          annulus      ? 6. * throughput / (M_PI * (section.size + section.inner) * std::pow(section.size - section.inner, 2)) :
          section.pipe ? 4. * throughput / (M_PI * std::pow(section.size, 3)) :
                         1.5 * throughput / std::pow(section.size, 2);
        numbers.add("apparent wall shear rate" + in_section, "gamma_a", apparent, "1/s", Group::die);
        numbers.add("wall shear rate" + in_section, "gamma_w", flow::inverse_shear_rate(law, wall_stress), "1/s",
                    Group::die, land);
        numbers.add("apparent viscosity" + in_section, "eta_a", wall_stress / apparent, "Pa s", Group::die);
        last_wall_stress = wall_stress;
      }
    numbers.add("entrance pressure loss", "dp_e", total_drop - developed, "Pa", Group::die, true);
    // dp_entrance = 2 tau_w e, so that dp = 2 tau_w (L/D + e) with D the radius (pipe) or the full
    // gap (slit; annulus, with the perimeter-mean wall stress) of the last section.
    numbers.add("entrance loss coefficient (Bagley end correction)", "e", (total_drop - developed) / (2. * last_wall_stress),
                "-", Group::die);
    numbers.mark_key("pressure drop inlet to outlet");
  }
} // namespace lentus::report
