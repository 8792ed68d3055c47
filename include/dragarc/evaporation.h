/* evaporation.h: a water drop evaporating in flight (the d^2 law with a ventilation correction).
 *
 * Copyright (C) 2026 the dragarc developers. SPDX-License-Identifier: GPL-3.0-or-later
 *
 *   dm/dt = -pi d D_v Sh (rho_v,s(T_s) - rho_v,inf),     Sh = 2 + 0.6 Re^(1/2) Sc^(1/3)
 *   Nu k (T - T_s) = Sh D_v L (rho_v,s(T_s) - rho_v,inf),  Nu = 2 + 0.6 Re^(1/2) Pr^(1/3)
 * The drop sits at the temperature T_s where the heat it draws from the air pays for the water it loses (the
 * quasi-steady heat balance), the vapour at its surface is saturated at T_s, the air's vapour density follows
 * from its relative humidity; Sh and Nu are the Ranz-Marshall Sherwood and Nusselt numbers (Sh = 2 is Maxwell's
 * still-air law, whose d^2 falls linearly in time). Only the water evaporates: a non-volatile fraction of the
 * first volume stays as a residue.
 */
#ifndef DRAGARC_EVAPORATION_H
#define DRAGARC_EVAPORATION_H

#include "dragarc/dragarc.h"

#ifdef __cplusplus
extern "C" {
#endif

/* The smallest drop followed: a drop without residue that shrinks below this diameter has evaporated. */
#define DRAGARC_EVAPORATED_DIAMETER 1e-6 /* m */

typedef struct dragarc_evaporation {
    int enabled;                 /* the projectile is a water drop that evaporates (projectile.evaporation) */
    double nonvolatile_fraction; /* by volume of the drop at launch, 0 to 1: what stays when the water is gone */
} dragarc_evaporation;

/* Diffusivity of water vapour in air (m^2/s) at T (K) and p (Pa): 2.11e-5 (T/273.15)^1.94 (101325/p)
 * (Pruppacher & Klett 1997, Microphysics of Clouds and Precipitation, eq. 13-3; recalled). */
double dragarc_vapour_diffusivity(double temperature, double pressure);

/* Specific heat of dry air at constant pressure, J/(kg K), for the Prandtl number (e.g. Rogers & Yau 1989,
 * A Short Course in Cloud Physics, 3rd ed., Table 2.1: 1005; recalled). */
#define DRAGARC_AIR_CP 1005.0

/* Thermal conductivity of air (W/(m K)) at T (K): (5.69 + 0.017 t) 1e-5 cal/(cm s K), t in degC (Pruppacher &
 * Klett 1997, eq. 13-18a; recalled): 0.02381 at 0 degC, 0.02523 at 20 degC. */
double dragarc_air_conductivity(double temperature);

/* Latent heat of vaporisation of water (J/kg) at T (K): 2.501e6 - 2370 t, t in degC (a straight line through
 * Rogers & Yau 1989, Table 2.1: 2.501e6 at 0 degC, 2.454e6 at 20 degC; recalled). */
double dragarc_latent_heat(double temperature);
#define DRAGARC_LATENT_HEAT_SLOPE 2370.0 /* J/(kg K): -dL/dT of that line */

/* Residual of a drop's heat balance at a trial surface temperature ts (K), air at T (K), p (Pa) and relative
 * humidity h, with nu_over_sh = Nu / Sh (1 in still air): (Nu/Sh) k(T) (T - ts) - D_v(T, p) L(ts) drho(ts).
 * Zero at the drop's temperature; it falls as ts rises. */
double dragarc_drop_heat_residual(double ts, double temperature, double pressure, double relative_humidity,
                                  double nu_over_sh);

/* Nu / Sh of a drop with Reynolds number re in air of density rho, viscosity mu and temperature T, vapour
 * diffusivity dv: (2 + 0.6 Re^(1/2) Pr^(1/3)) / (2 + 0.6 Re^(1/2) Sc^(1/3)), Pr = mu c_p / k, Sc = mu / (rho dv)
 * (Ranz & Marshall 1952). 1 at rest, about 1.06 for a fast drop. */
double dragarc_heat_to_mass_ratio(double reynolds, double density, double viscosity, double temperature,
                                  double dv);

/* The drop's temperature (K): the root of dragarc_drop_heat_residual, by Newton's method kept inside the bracket
 * [T - 60 K, T] by bisection (src/numerics/terminal.c), to 1e-10 K. Saturated air (h >= 1) gives T itself. */
int dragarc_drop_temperature(double temperature, double pressure, double relative_humidity, double nu_over_sh,
                             double *ts, dragarc_error *err);

/* Residual of the psychrometer equation at a trial wet-bulb temperature tw (K), air at T (K), p (Pa) and
 * relative humidity h: e_w(tw) - h e_w(T) - A p (T - tw), A = 6.53e-4 (1 + 0.000944 (tw - 273.15)) 1/K (WMO
 * Guide to Meteorological Instruments and Methods of Observation, WMO-No. 8, annex on psychrometer formulae,
 * the ventilated Assmann psychrometer; recalled), e_w the CIPM-2007 saturation vapour pressure. Zero at T_w. */
double dragarc_psychrometer_residual(double tw, double temperature, double pressure, double relative_humidity);

/* Water-vapour density excess (kg/m^3) at the surface of a drop at tw (K) in air at T (K) with relative
 * humidity h: (e_w(tw) / tw - h e_w(T) / T) M_v / R (ideal gas). */
double dragarc_vapour_density_excess(double tw, double temperature, double relative_humidity);

/* dm/dt (kg/s, <= 0) of a drop of diameter d (m) with Reynolds number re in air of density rho (kg/m^3) and
 * viscosity mu (Pa s), vapour diffusivity dv (m^2/s) and density excess drho (kg/m^3). */
double dragarc_evaporation_rate(double diameter, double reynolds, double density, double viscosity, double dv,
                                double drho);

/* The wet-bulb temperature (K) of air at T (K), p (Pa) and relative humidity h (0 to 1): the root of the
 * psychrometer equation above, by GSL's Brent solver (src/numerics/terminal.c). */
int dragarc_wet_bulb_temperature(double temperature, double pressure, double relative_humidity, double *tw,
                                 dragarc_error *err);

/* Check the fields; err->field relative to the evaporation object. */
int dragarc_evaporation_check(const dragarc_evaporation *e, dragarc_error *err);

#ifdef __cplusplus
}
#endif
#endif
