/* evaporation.c: mass transfer from an evaporating water drop.
 * SPDX-License-Identifier: GPL-3.0-or-later
 *
 *   dm/dt = -pi d D_v Sh drho,   Sh = 2 + 0.6 Re^(1/2) Sc^(1/3),   Sc = mu / (rho D_v)
 *   drho  = (M_v / R) (e_w(T_w) / T_w - h e_w(T) / T)
 *   e_w(T_w) - h e_w(T) = A p (T - T_w),   A = 6.53e-4 (1 + 0.000944 t_w) 1/K
 * Maxwell's diffusion-limited evaporation (Sh = 2; e.g. Fuchs, N. A. 1959, Evaporation and Droplet Growth in
 * Gaseous Media, Pergamon, chapter 1; recalled) with the ventilation correction of Ranz, W. E. & Marshall,
 * W. R. (1952), "Evaporation from drops", Chem. Eng. Prog. 48:141 and 173; the drop at the wet-bulb temperature
 * of the psychrometer equation (WMO-No. 8, psychrometer formulae; recalled); D_v of Pruppacher & Klett (1997)
 * eq. 13-3 (recalled); e_w the CIPM-2007 saturation vapour pressure (moist_air.h). For Sh = 2, d^2 falls
 * linearly: d^2 = d0^2 - (8 D_v drho / rho_l) t (the "d^2 law").
 */
#include <math.h>

#include "core/constants.h"
#include "dragarc/evaporation.h"
#include "dragarc/moist_air.h"

double dragarc_vapour_diffusivity(double temperature, double pressure)
{
    return 2.11e-5 * pow(temperature / 273.15, 1.94) * (101325.0 / pressure);
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
