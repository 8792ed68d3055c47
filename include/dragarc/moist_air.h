/* moist_air.h: the density, speed of sound and viscosity of moist air from its temperature, pressure and
 * relative humidity.
 *
 * Copyright (C) 2026 the dragarc developers. SPDX-License-Identifier: GPL-3.0-or-later
 *
 * Density by the CIPM-2007 equation (Picard, A., Davis, R. S., Glaser, M. & Fujii, K. 2008, Revised formula
 * for the density of moist air (CIPM-2007), Metrologia 45:149-155, Appendix A1). The equation is stated for
 * 15 to 27 degC and 600 to 1100 hPa; outside that it is an extrapolation (docs/models.md says how far it
 * holds). Relative humidity is a fraction of saturation, 0 to 1. SI units throughout.
 */
#ifndef DRAGARC_MOIST_AIR_H
#define DRAGARC_MOIST_AIR_H

#include "dragarc/dragarc.h"

#ifdef __cplusplus
extern "C" {
#endif

/* Constants of the CIPM-2007 equation (Picard et al. 2008, Appendix A1). */
#define DRAGARC_CIPM_R 8.314472         /* J/(mol K), molar gas constant (CODATA 2006) */
#define DRAGARC_CIPM_M_VAPOUR 18.01528e-3 /* kg/mol, molar mass of water */
#define DRAGARC_CIPM_X_CO2 0.0004       /* mole fraction of CO2 in dry air the equation's M_a refers to */

/* Moist air at one temperature and pressure, with the intermediate quantities of the CIPM-2007 equation. */
typedef struct dragarc_moist_air {
    double saturation_vapour_pressure; /* Pa, p_sv(T) over liquid water */
    double enhancement_factor;         /* f(p, t), dimensionless */
    double vapour_fraction;            /* x_v, mole fraction of water vapour */
    double compressibility;            /* Z, dimensionless */
    double dry_molar_mass;             /* kg/mol, M_a of the dry air at its CO2 fraction */
    double density;                    /* kg/m^3 */
    double speed_of_sound;             /* m/s, ideal-gas mixture (docs/models.md) */
    double viscosity;                  /* Pa s, Sutherland's law for dry air (humidity ignored) */
} dragarc_moist_air;

/* Saturation vapour pressure of water (Pa) at temperature T (K): exp(A T^2 + B T + C + D/T). */
double dragarc_cipm_saturation_vapour_pressure(double temperature);

/* Enhancement factor f = alpha + beta p + gamma t^2 at pressure p (Pa) and temperature T (K; t in degC). */
double dragarc_cipm_enhancement_factor(double pressure, double temperature);

/* Compressibility factor Z of moist air at pressure p (Pa), temperature T (K) and vapour mole fraction x_v. */
double dragarc_cipm_compressibility(double pressure, double temperature, double vapour_fraction);

/* Molar mass of dry air (kg/mol) with CO2 mole fraction x: [28.96546 + 12.011 (x - 0.0004)] 1e-3. */
double dragarc_cipm_dry_molar_mass(double co2_fraction);

/* Moist air at temperature T (K, > 0), pressure p (Pa, > 0), relative humidity h (0 to 1) and CO2 mole
 * fraction (0 to 0.01; DRAGARC_CIPM_X_CO2 is the usual value). DRAGARC_EINVAL for a value out of range, with
 * err->field "temperature", "pressure", "relative_humidity" or "co2_fraction"; DRAGARC_ERANGE when the
 * vapour would make up the whole pressure (boiling water). Fills *out only on success. */
int dragarc_moist_air_eval(double temperature, double pressure, double relative_humidity, double co2_fraction,
                           dragarc_moist_air *out, dragarc_error *err);

#ifdef __cplusplus
}
#endif
#endif
