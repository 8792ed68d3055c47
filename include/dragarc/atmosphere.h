/* atmosphere.h: the fluid a projectile flies through, as a function of height.
 *
 * Copyright (C) 2026 the dragarc developers. SPDX-License-Identifier: GPL-3.0-or-later
 *
 * Models: the U.S. Standard Atmosphere 1976 (0 to 86 km geometric altitude, with a temperature
 * offset), a constant fluid (any gas or liquid; density 0 is a vacuum), an isothermal exponential
 * atmosphere, and the day's weather at the site ("local": temperature, pressure and relative humidity,
 * moist air by CIPM-2007, the standard lapse rate above). Heights passed to dragarc_atmosphere_eval are metres above the site datum (local z);
 * the model adds the site elevation. SI units throughout.
 */
#ifndef DRAGARC_ATMOSPHERE_H
#define DRAGARC_ATMOSPHERE_H

#include <stddef.h>

#include "dragarc/dragarc.h"

#ifdef __cplusplus
extern "C" {
#endif

/* Constants of the U.S. Standard Atmosphere 1976 (NOAA/NASA/USAF, NASA-TM-X-74335, section 1.2). */
#define DRAGARC_ISA_G0 9.80665               /* m/s^2, standard gravity */
#define DRAGARC_ISA_R_EARTH 6356766.0        /* m, effective Earth radius r0 */
#define DRAGARC_ISA_R_AIR 287.0531           /* J/(kg K), R* / M0 = 8314.32 / 28.9644 */
#define DRAGARC_ISA_GAMMA 1.4                /* ratio of specific heats */
#define DRAGARC_ISA_T0 288.15                /* K, sea-level temperature */
#define DRAGARC_ISA_P0 101325.0              /* Pa, sea-level pressure */
#define DRAGARC_ISA_Z_MIN (-5000.0)          /* m geometric, lowest altitude tabulated by the standard */
#define DRAGARC_ISA_Z_MAX 86000.0            /* m geometric, top of the constant-composition region */

/* The "local" model: the standard's troposphere lapse rate carried from the site's weather. */
#define DRAGARC_LOCAL_LAPSE (-0.0065)        /* K/m, U.S. Standard Atmosphere 1976, first layer */
#define DRAGARC_LOCAL_Z_MIN (-1000.0)        /* m below the site datum */
#define DRAGARC_LOCAL_Z_MAX 11000.0          /* m above the site datum: the standard troposphere's depth */
#define DRAGARC_LOCAL_T_MIN 180.0            /* K, site temperature */
#define DRAGARC_LOCAL_T_MAX 340.0
#define DRAGARC_LOCAL_P_MIN 30000.0          /* Pa, site pressure */
#define DRAGARC_LOCAL_P_MAX 110000.0

typedef enum dragarc_atmosphere_model {
    DRAGARC_ATMOSPHERE_ISA = 0,
    DRAGARC_ATMOSPHERE_CONSTANT,
    DRAGARC_ATMOSPHERE_EXPONENTIAL,
    DRAGARC_ATMOSPHERE_LOCAL
} dragarc_atmosphere_model;

/* The state of the fluid at one point. */
typedef struct dragarc_air {
    double temperature;    /* K */
    double pressure;       /* Pa */
    double density;        /* kg/m^3 */
    double speed_of_sound; /* m/s */
    double viscosity;      /* dynamic viscosity, Pa s */
} dragarc_air;

/* An atmosphere as the scenario describes it. Plain data; nothing to free. */
typedef struct dragarc_atmosphere {
    dragarc_atmosphere_model model;
    double site_elevation;     /* m, geometric altitude of the local datum z = 0 (isa) */
    double temperature_offset; /* K, added to the standard temperature at every altitude (isa) */
    double density;            /* kg/m^3: the fluid's (constant) or at the site datum (exponential) */
    double viscosity;          /* Pa s (constant); exponential uses Sutherland's law at `temperature` */
    double temperature;        /* K (constant, exponential; local: at the site datum) */
    double speed_of_sound;     /* m/s (constant); 0 = that of air at `temperature` */
    double scale_height;       /* m (exponential) */
    double pressure;           /* Pa, at the site datum (local) */
    double relative_humidity;  /* fraction of saturation, 0 to 1, at every height (local) */
} dragarc_atmosphere;

/* Defaults: ISA, site at sea level, no offset. */
void dragarc_atmosphere_default(dragarc_atmosphere *atm);

/* U.S. Standard Atmosphere 1976 at geometric altitude z (m), with every temperature shifted by
 * temperature_offset (K) while the pressure stays that of the standard at z, so that
 * density = p_std(z) / (R (T_std(z) + offset)). DRAGARC_ERANGE outside -5 km .. 86 km or when the
 * shifted temperature is not positive. */
int dragarc_isa_eval(double z, double temperature_offset, dragarc_air *out, dragarc_error *err);

/* Geopotential altitude H (m') of geometric altitude z (m): H = r0 z / (r0 + z). */
double dragarc_isa_geopotential(double z);

/* Sutherland's law for the viscosity of air (Pa s) at temperature T (K), with the 1976 standard's
 * constants beta = 1.458e-6 kg/(m s K^0.5) and S = 110.4 K. */
double dragarc_air_viscosity(double temperature);

/* The fluid at height z (m above the site datum). Errors as dragarc_isa_eval; for the local model
 * DRAGARC_ERANGE (field "environment.atmosphere") outside -1000 m .. 11000 m about the site datum. */
int dragarc_atmosphere_eval(const dragarc_atmosphere *atm, double z, dragarc_air *out, dragarc_error *err);

/* Heights z above the site datum (m) where the model's temperature gradient jumps (the ISA's layer bases,
 * and the 0.5 km rows of its molecular-weight table above 80 km): the equations of motion are smooth
 * between them, not across. Writes at most max, returns how many there are; none for the other models. */
size_t dragarc_atmosphere_breaks(const dragarc_atmosphere *atm, double *out, size_t max);

/* The height above the site datum (m) where the model ends: 86 km altitude (isa), 11 km above the site
 * (local), INFINITY for the other models. */
double dragarc_atmosphere_ceiling(const dragarc_atmosphere *atm);

/* Check the fields of an atmosphere; on failure err->field names the bad field relative to the
 * atmosphere object ("density", "scale_height", "relative_humidity", ...). */
int dragarc_atmosphere_check(const dragarc_atmosphere *atm, dragarc_error *err);

#ifdef __cplusplus
}
#endif
#endif
