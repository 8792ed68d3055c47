/* atmosphere.c: the U.S. Standard Atmosphere 1976 below 86 km, a constant fluid, an isothermal
 * exponential atmosphere, and the day's weather at the site carried up the standard lapse rate ("local").
 * SPDX-License-Identifier: GPL-3.0-or-later
 *
 * U.S. Standard Atmosphere 1976 (NOAA, NASA, USAF; NASA-TM-X-74335), sections 1.2-1.3: with the
 * geopotential altitude H = r0 Z / (r0 + Z) and the molecular-scale temperature linear in H within each
 * of seven layers (bases b, lapse rates L_b),
 *   T = T_b + L_b (H - H_b)
 *   p = p_b [T_b / T]^(g0 M0 / (R* L_b))        (L_b != 0)      eq. 33a
 *   p = p_b exp(-g0 M0 (H - H_b) / (R* T_b))    (L_b == 0)      eq. 33b
 *   rho = p M0 / (R* T)                                          eq. 42
 *   a = sqrt(gamma R* T / M0)                                    eq. 50
 *   mu = beta T^1.5 / (T + S)  (Sutherland)                      eq. 51
 * Density, pressure and the speed of sound follow from the molecular-scale temperature T_M. From 80 to
 * 86 km the mean molecular weight falls slightly (Table 8 of the standard, M/M0 from 1 to 0.999579), so
 * the kinetic temperature T = T_M M/M0 (eq. 21) is up to 0.04 % below T_M; the viscosity uses T.
 * The M/M0 values below are the standard's Table 8 at 0.5 km steps (recalled; the 86 km end,
 * T = 186.8673 K, is checked in tests/reference/test_isa_1976.c), interpolated linearly.
 * The base pressures p_b follow from p0 = 101325 Pa by the same formulas carried up layer by layer; they
 * are stored to 17 digits (they agree with the standard's Table 4: 22632.06, 5474.889, 868.0187, 110.9063,
 * 66.93887, 3.956420 Pa), and tests/reference/test_isa_1976.c recomputes them from the formulas.
 *
 * "local": the site datum's temperature T0, pressure p0 and relative humidity h, carried to height z by the
 * standard's first-layer lapse rate L = -6.5 K/km with the site as the layer base, eq. 33a unchanged:
 *   T = T0 + L z,   p = p0 (T0 / T)^(g0 M0 / (R* L)),   h constant,
 * and the air at (T, p, h) is moist air by CIPM-2007 (moist_air.c). z is used as a geopotential height (g
 * taken as g0: at 1 km the pressure differs from the geometric reading by 2e-5) and the hydrostatic
 * balance is that of dry air (docs/models.md gives what both leave out). Valid 1 km below to 11 km above
 * the site: the standard's lapse rate holds in the troposphere only.
 */
#include <math.h>
#include <stddef.h>

#include "dragarc/atmosphere.h"
#include "dragarc/moist_air.h"

#define R_STAR 8314.32  /* J/(kmol K) */
#define M0 28.9644      /* kg/kmol */
#define SUTH_BETA 1.458e-6
#define SUTH_S 110.4

#define GMR (DRAGARC_ISA_G0 * M0 / R_STAR) /* K/m' */

typedef struct layer {
    double h;     /* m', geopotential base */
    double t;     /* K, base temperature */
    double lapse; /* K/m' */
    double p;     /* Pa, base pressure */
    double expo;  /* g0 M0 / (R* L_b), the exponent of eq. 33a (0 for isothermal layers) */
} layer;

static const layer LAYERS[] = {
    {0.0, 288.15, -0.0065, 101325.0, GMR / -0.0065},
    {11000.0, 216.65, 0.0, 22632.063973462911, 0.0},
    {20000.0, 216.65, 0.001, 5474.8886696777745, GMR / 0.001},
    {32000.0, 228.65, 0.0028, 868.01868475522792, GMR / 0.0028},
    {47000.0, 270.65, 0.0, 110.90630555496608, 0.0},
    {51000.0, 270.65, -0.0028, 66.938873118687383, GMR / -0.0028},
    {71000.0, 214.65, -0.002, 3.9564204280407318, GMR / -0.002},
};
#define NLAYERS (sizeof LAYERS / sizeof LAYERS[0])
#define H_TOP 84852.0

/* Pressure at geopotential H (m') within layer i whose base pressure is pb. */
static double layer_pressure(const layer *l, double pb, double h)
{
    if (l->lapse == 0.0)
        return pb * exp(-GMR * (h - l->h) / l->t);
    double t = l->t + l->lapse * (h - l->h);
    return pb * pow(l->t / t, l->expo);
}

double dragarc_isa_geopotential(double z) { return DRAGARC_ISA_R_EARTH * z / (DRAGARC_ISA_R_EARTH + z); }

double dragarc_air_viscosity(double temperature)
{
    return SUTH_BETA * temperature * sqrt(temperature) / (temperature + SUTH_S);
}

static double air_sound_speed(double temperature)
{
    return sqrt(DRAGARC_ISA_GAMMA * R_STAR / M0 * temperature);
}

/* M/M0 at geometric altitude z, U.S. Standard Atmosphere 1976 Table 8 (80 to 86 km). */
static double molecular_weight_ratio(double z)
{
    static const double RATIO[] = {1.000000, 0.999996, 0.999989, 0.999971, 0.999941, 0.999909, 0.999870,
                                   0.999829, 0.999786, 0.999741, 0.999694, 0.999641, 0.999579};
    if (z <= 80000.0)
        return 1.0;
    double u = (z - 80000.0) / 500.0;
    size_t i = (size_t)u;
    if (i >= sizeof RATIO / sizeof RATIO[0] - 1)
        return RATIO[sizeof RATIO / sizeof RATIO[0] - 1];
    double f = u - (double)i;
    return RATIO[i] + f * (RATIO[i + 1] - RATIO[i]);
}

int dragarc_isa_eval(double z, double temperature_offset, dragarc_air *out, dragarc_error *err)
{
    if (!(z >= DRAGARC_ISA_Z_MIN && z <= DRAGARC_ISA_Z_MAX))
        return dragarc_error_set(err, DRAGARC_ERANGE, "",
                                 "altitude %.6g m is outside the U.S. Standard Atmosphere 1976 range "
                                 "(-5000 to 86000 m geometric)",
                                 z);
    double h = dragarc_isa_geopotential(z);
    size_t i = 0;
    while (i + 1 < NLAYERS && h >= LAYERS[i + 1].h)
        i++;
    const layer *l = &LAYERS[i];
    double t_std = l->t + l->lapse * (h - l->h);
    double p = layer_pressure(l, l->p, h);
    double tm = t_std + temperature_offset; /* molecular-scale temperature */
    if (!(tm > 0.0))
        return dragarc_error_set(err, DRAGARC_ERANGE, "",
                                 "temperature offset %.6g K makes the temperature at %.6g m non-positive",
                                 temperature_offset, z);
    double t = tm * molecular_weight_ratio(z); /* kinetic temperature */
    out->temperature = t;
    out->pressure = p;
    out->density = p * M0 / (R_STAR * tm);
    out->speed_of_sound = air_sound_speed(tm);
    out->viscosity = dragarc_air_viscosity(t);
    return DRAGARC_OK;
}

/* The local model at height z (m above the site datum). */
static int local_eval(const dragarc_atmosphere *atm, double z, dragarc_air *out, dragarc_error *err)
{
    if (!(z >= DRAGARC_LOCAL_Z_MIN && z <= DRAGARC_LOCAL_Z_MAX))
        return dragarc_error_set(err, DRAGARC_ERANGE, "environment.atmosphere",
                                 "height %.6g m is outside the 'local' model, which holds from -1000 to 11000 m "
                                 "about the site datum (the standard troposphere's lapse rate)",
                                 z);
    const layer site = {0.0, atm->temperature, DRAGARC_LOCAL_LAPSE, atm->pressure, GMR / DRAGARC_LOCAL_LAPSE};
    double t = site.t + site.lapse * z;
    double p = layer_pressure(&site, site.p, z);
    dragarc_moist_air m;
    int rc = dragarc_moist_air_eval(t, p, atm->relative_humidity, DRAGARC_CIPM_X_CO2, &m, err);
    if (rc != DRAGARC_OK) {
        dragarc_error_prefix(err, "environment.atmosphere");
        return rc;
    }
    out->temperature = t;
    out->pressure = p;
    out->density = m.density;
    out->speed_of_sound = m.speed_of_sound;
    out->viscosity = m.viscosity;
    return DRAGARC_OK;
}

double dragarc_atmosphere_ceiling(const dragarc_atmosphere *atm)
{
    switch (atm->model) {
    case DRAGARC_ATMOSPHERE_ISA: return DRAGARC_ISA_Z_MAX - atm->site_elevation;
    case DRAGARC_ATMOSPHERE_LOCAL: return DRAGARC_LOCAL_Z_MAX;
    case DRAGARC_ATMOSPHERE_CONSTANT:
    case DRAGARC_ATMOSPHERE_EXPONENTIAL: break;
    }
    return INFINITY;
}

size_t dragarc_atmosphere_breaks(const dragarc_atmosphere *atm, double *out, size_t max)
{
    if (atm->model != DRAGARC_ATMOSPHERE_ISA)
        return 0;
    size_t n = 0;
    for (size_t i = 1; i < NLAYERS; i++, n++) /* geometric altitude of each geopotential base */
        if (n < max)
            out[n] = DRAGARC_ISA_R_EARTH * LAYERS[i].h / (DRAGARC_ISA_R_EARTH - LAYERS[i].h) - atm->site_elevation;
    for (int k = 0; k <= 12; k++, n++)
        if (n < max)
            out[n] = 80000.0 + 500.0 * k - atm->site_elevation;
    return n;
}

void dragarc_atmosphere_default(dragarc_atmosphere *atm)
{
    atm->model = DRAGARC_ATMOSPHERE_ISA;
    atm->site_elevation = 0.0;
    atm->temperature_offset = 0.0;
    atm->density = 1.225;
    atm->viscosity = 1.7894e-5;
    atm->temperature = DRAGARC_ISA_T0;
    atm->speed_of_sound = 0.0;
    atm->scale_height = 8500.0;
    atm->pressure = DRAGARC_ISA_P0;
    atm->relative_humidity = 0.0;
}

int dragarc_atmosphere_check(const dragarc_atmosphere *atm, dragarc_error *err)
{
    switch (atm->model) {
    case DRAGARC_ATMOSPHERE_ISA:
        if (!(atm->site_elevation >= DRAGARC_ISA_Z_MIN && atm->site_elevation <= DRAGARC_ISA_Z_MAX))
            return dragarc_error_set(err, DRAGARC_EINVAL, "site_elevation",
                                     "must be between -5000 and 86000 m (got %g)", atm->site_elevation);
        if (!(fabs(atm->temperature_offset) <= 100.0))
            return dragarc_error_set(err, DRAGARC_EINVAL, "temperature_offset",
                                     "must be between -100 and 100 K (got %g)", atm->temperature_offset);
        return DRAGARC_OK;
    case DRAGARC_ATMOSPHERE_CONSTANT:
        if (!(atm->density >= 0.0 && isfinite(atm->density)))
            return dragarc_error_set(err, DRAGARC_EINVAL, "density", "must be zero or positive (got %g)",
                                     atm->density);
        if (!(atm->viscosity > 0.0 && isfinite(atm->viscosity)))
            return dragarc_error_set(err, DRAGARC_EINVAL, "viscosity", "must be positive (got %g)",
                                     atm->viscosity);
        if (!(atm->temperature > 0.0 && isfinite(atm->temperature)))
            return dragarc_error_set(err, DRAGARC_EINVAL, "temperature", "must be positive, in K (got %g)",
                                     atm->temperature);
        if (!(atm->speed_of_sound >= 0.0 && isfinite(atm->speed_of_sound)))
            return dragarc_error_set(err, DRAGARC_EINVAL, "speed_of_sound",
                                     "must be positive, or 0 for that of air at the temperature (got %g)",
                                     atm->speed_of_sound);
        return DRAGARC_OK;
    case DRAGARC_ATMOSPHERE_EXPONENTIAL:
        if (!(atm->density >= 0.0 && isfinite(atm->density)))
            return dragarc_error_set(err, DRAGARC_EINVAL, "density", "must be zero or positive (got %g)",
                                     atm->density);
        if (!(atm->scale_height > 0.0 && isfinite(atm->scale_height)))
            return dragarc_error_set(err, DRAGARC_EINVAL, "scale_height", "must be positive (got %g)",
                                     atm->scale_height);
        if (!(atm->temperature > 0.0 && isfinite(atm->temperature)))
            return dragarc_error_set(err, DRAGARC_EINVAL, "temperature", "must be positive, in K (got %g)",
                                     atm->temperature);
        return DRAGARC_OK;
    case DRAGARC_ATMOSPHERE_LOCAL: {
        /* A number that fits the range only in a common unit of the trade gets the hint to say its unit. */
        double t = atm->temperature, p = atm->pressure, h = atm->relative_humidity;
        if (!(t >= DRAGARC_LOCAL_T_MIN && t <= DRAGARC_LOCAL_T_MAX))
            return t >= -93.15 && t <= 66.85
                       ? dragarc_error_set(err, DRAGARC_EINVAL, "temperature",
                                           "must be between 180 and 340 K (got %g): for degrees Celsius write the "
                                           "unit, \"%g degC\"",
                                           t, t)
                       : dragarc_error_set(err, DRAGARC_EINVAL, "temperature", "must be between 180 and 340 K (got %g)",
                                           t);
        if (!(p >= DRAGARC_LOCAL_P_MIN && p <= DRAGARC_LOCAL_P_MAX))
            return p >= 300.0 && p <= 1100.0
                       ? dragarc_error_set(err, DRAGARC_EINVAL, "pressure",
                                           "must be between 30000 and 110000 Pa (got %g): for hectopascals write the "
                                           "unit, \"%g hPa\"",
                                           p, p)
                       : dragarc_error_set(err, DRAGARC_EINVAL, "pressure",
                                           "must be between 30000 and 110000 Pa (got %g)", p);
        if (!(h >= 0.0 && h <= 1.0))
            return h > 1.0 && h <= 100.0
                       ? dragarc_error_set(err, DRAGARC_EINVAL, "relative_humidity",
                                           "must be between 0 and 1 (got %g): a fraction, so %g %% is %g", h, h,
                                           h / 100.0)
                       : dragarc_error_set(err, DRAGARC_EINVAL, "relative_humidity",
                                           "must be between 0 and 1 (got %g)", h);
        return DRAGARC_OK;
    }
    }
    return dragarc_error_set(err, DRAGARC_EINVAL, "model", "unknown atmosphere model %d", (int)atm->model);
}

int dragarc_atmosphere_eval(const dragarc_atmosphere *atm, double z, dragarc_air *out, dragarc_error *err)
{
    switch (atm->model) {
    case DRAGARC_ATMOSPHERE_ISA:
        return dragarc_isa_eval(atm->site_elevation + z, atm->temperature_offset, out, err);
    case DRAGARC_ATMOSPHERE_CONSTANT:
        out->temperature = atm->temperature;
        out->density = atm->density;
        out->pressure = atm->density * DRAGARC_ISA_R_AIR * atm->temperature;
        out->speed_of_sound = atm->speed_of_sound > 0.0 ? atm->speed_of_sound : air_sound_speed(atm->temperature);
        out->viscosity = atm->viscosity;
        return DRAGARC_OK;
    case DRAGARC_ATMOSPHERE_EXPONENTIAL:
        /* Isothermal: rho = rho0 exp(-z / H) with the site datum as the reference level. */
        out->temperature = atm->temperature;
        out->density = atm->density * exp(-z / atm->scale_height);
        out->pressure = out->density * DRAGARC_ISA_R_AIR * atm->temperature;
        out->speed_of_sound = air_sound_speed(atm->temperature);
        out->viscosity = dragarc_air_viscosity(atm->temperature);
        return DRAGARC_OK;
    case DRAGARC_ATMOSPHERE_LOCAL:
        return local_eval(atm, z, out, err);
    }
    return dragarc_error_set(err, DRAGARC_EINVAL, "environment.atmosphere.model", "unknown model");
}
