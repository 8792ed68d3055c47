/* evaporation.c: mass transfer from an evaporating water drop.
 * SPDX-License-Identifier: GPL-3.0-or-later
 *
 *   dm/dt = -pi d D_v Sh drho(T_s),   Sh = 2 + 0.6 Re^(1/2) Sc^(1/3),   Sc = mu / (rho D_v)
 *   drho(T_s) = (M_v / R) (e_w(T_s) / T_s - h e_w(T) / T)
 *   Nu k (T - T_s) = Sh D_v L(T_s) drho(T_s),   Nu = 2 + 0.6 Re^(1/2) Pr^(1/3),   Pr = mu c_p / k
 * Maxwell's diffusion-limited evaporation (Sh = 2; e.g. Fuchs, N. A. 1959, Evaporation and Droplet Growth in
 * Gaseous Media, Pergamon, chapter 1; recalled) with the ventilation corrections for heat and mass of Ranz,
 * W. E. & Marshall, W. R. (1952), "Evaporation from drops", Chem. Eng. Prog. 48:141 and 173; the drop at the
 * temperature T_s where the heat conducted in from the air pays for the latent heat carried off (the quasi-steady
 * heat balance of the same papers; Pruppacher & Klett 1997, Microphysics of Clouds and Precipitation, section
 * 13.2); D_v (eq. 13-3) and k (eq. 13-18a) of Pruppacher & Klett (recalled); L of Rogers & Yau (1989), A Short
 * Course in Cloud Physics, 3rd ed., Table 2.1 (recalled); e_w the CIPM-2007 saturation vapour pressure
 * (moist_air.h). For Sh = Nu = 2, d^2 falls linearly: d^2 = d0^2 - (8 D_v drho / rho_l) t (the "d^2 law").
 */
#include <math.h>

#include "core/constants.h"
#include "dragarc/evaporation.h"
#include "dragarc/moist_air.h"

double dragarc_vapour_diffusivity(double temperature, double pressure)
{
    return 2.11e-5 * pow(temperature / 273.15, 1.94) * (101325.0 / pressure);
}

double dragarc_air_conductivity(double temperature)
{
    /* (5.69 + 0.017 t) 1e-5 cal / (cm s K), t in degC; 1 cal / (cm s K) = 418.4 W / (m K) */
    return 4.184e-3 * (5.69 + 0.017 * (temperature - 273.15));
}

double dragarc_latent_heat(double temperature)
{
    return 2.501e6 - DRAGARC_LATENT_HEAT_SLOPE * (temperature - 273.15);
}

double dragarc_drop_heat_residual(double ts, double temperature, double pressure, double relative_humidity,
                                  double nu_over_sh)
{
    return nu_over_sh * dragarc_air_conductivity(temperature) * (temperature - ts) -
           dragarc_vapour_diffusivity(temperature, pressure) * dragarc_latent_heat(ts) *
               dragarc_vapour_density_excess(ts, temperature, relative_humidity);
}

double dragarc_heat_to_mass_ratio(double reynolds, double density, double viscosity, double temperature,
                                  double dv)
{
    double k = dragarc_air_conductivity(temperature);
    double pr = viscosity * DRAGARC_AIR_CP / k, sc = viscosity / (density * dv), v = 0.6 * sqrt(reynolds);
    return (2.0 + v * cbrt(pr)) / (2.0 + v * cbrt(sc));
}

double dragarc_psychrometer_residual(double tw, double temperature, double pressure, double relative_humidity)
{
    double a = 6.53e-4 * (1.0 + 0.000944 * (tw - 273.15));
    return dragarc_cipm_saturation_vapour_pressure(tw) -
           relative_humidity * dragarc_cipm_saturation_vapour_pressure(temperature) - a * pressure * (temperature - tw);
}

double dragarc_vapour_density_excess(double tw, double temperature, double relative_humidity)
{
    return DRAGARC_CIPM_M_VAPOUR / DRAGARC_CIPM_R *
           (dragarc_cipm_saturation_vapour_pressure(tw) / tw -
            relative_humidity * dragarc_cipm_saturation_vapour_pressure(temperature) / temperature);
}

double dragarc_evaporation_rate(double diameter, double reynolds, double density, double viscosity, double dv,
                                double drho)
{
    double sc = viscosity / (density * dv);
    double sh = 2.0 + 0.6 * sqrt(reynolds) * cbrt(sc);
    return -DRAGARC_PI * diameter * dv * sh * drho;
}

int dragarc_evaporation_check(const dragarc_evaporation *e, dragarc_error *err)
{
    if (e->enabled && !(e->nonvolatile_fraction >= 0.0 && e->nonvolatile_fraction <= 1.0))
        return dragarc_error_set(err, DRAGARC_EINVAL, "nonvolatile_fraction", "must be between 0 and 1 (got %g)",
                                 e->nonvolatile_fraction);
    return DRAGARC_OK;
}
