/* moist_air.c: moist air from temperature, pressure and relative humidity: the CIPM-2007 density, an
 * ideal-gas-mixture speed of sound, and Sutherland's viscosity of dry air.
 * SPDX-License-Identifier: GPL-3.0-or-later
 *
 * Density: Picard, A., Davis, R. S., Glaser, M. & Fujii, K. (2008), Revised formula for the density of moist
 * air (CIPM-2007), Metrologia 45:149-155, Appendix A1. With T in K, t = T - 273.15 K, p in Pa, h the relative
 * humidity (0 to 1):
 *   p_sv = 1 Pa exp(A T^2 + B T + C + D/T)                        saturation vapour pressure
 *   f    = alpha + beta p + gamma t^2                              enhancement factor
 *   x_v  = h f p_sv / p                                            mole fraction of water vapour
 *   Z    = 1 - (p/T) [a0 + a1 t + a2 t^2 + (b0 + b1 t) x_v + (c0 + c1 t) x_v^2] + (p/T)^2 (d + e x_v^2)
 *   M_a  = [28.96546 + 12.011 (x_CO2 - 0.0004)] 1e-3 kg/mol        dry air
 *   rho  = p M_a / (Z R T) [1 - x_v (1 - M_v / M_a)]
 * with R = 8.314472 J/(mol K) and M_v = 18.01528e-3 kg/mol. The paper itself could not be read here: the
 * constants below are those that several independent public implementations citing its Appendix A1 print,
 * digit for digit alike (an R package, a Fortran module of a weather service, Java and C++ libraries). tests/reference/test_moist_air.c checks p_sv against IAPWS values.
 *
 * Speed of sound: an ideal-gas mixture (common practice, no source): a = sqrt(gamma R T / M) with the mean
 * molar mass M = (1 - x_v) M_a + x_v M_v and gamma = (c_v + R) / c_v, c_v = [(1 - x_v) 5/2 + x_v 3] R, the
 * equipartition heat capacities of a diatomic gas (gamma = 1.4, as the U.S. Standard Atmosphere 1976 takes
 * for air) and of a rigid non-linear molecule (water, gamma = 4/3). It ignores the departure of Z from 1
 * (about 4e-4 near sea level), which changes a by the same order.
 *
 * Viscosity: Sutherland's law for dry air (dragarc_air_viscosity). Water vapour is the less viscous gas, so
 * humid air is slightly less viscous; docs/models.md estimates by how much and why it is ignored.
 */
#include <math.h>

#include "dragarc/atmosphere.h"
#include "dragarc/moist_air.h"

#define T_ZERO_CELSIUS 273.15 /* K */

/* The constants of the paper's Appendix A1: saturation vapour pressure, */
#define PSV_A 1.2378847e-5  /* K^-2 */
#define PSV_B -1.9121316e-2 /* K^-1 */
#define PSV_C 33.93711047
#define PSV_D -6.3431645e3 /* K */

/* enhancement factor, */
#define F_ALPHA 1.00062
#define F_BETA 3.14e-8 /* Pa^-1 */
#define F_GAMMA 5.6e-7 /* K^-2 */

/* compressibility factor (eq. A1.4 according to one implementation that cites it). */
#define Z_A0 1.58123e-6  /* K Pa^-1 */
#define Z_A1 -2.9331e-8  /* Pa^-1 */
#define Z_A2 1.1043e-10  /* K^-1 Pa^-1 */
#define Z_B0 5.707e-6    /* K Pa^-1 */
#define Z_B1 -2.051e-8   /* Pa^-1 */
#define Z_C0 1.9898e-4   /* K Pa^-1 */
#define Z_C1 -2.376e-6   /* Pa^-1 */
#define Z_D 1.83e-11     /* K^2 Pa^-2 */
#define Z_E -0.765e-8    /* K^2 Pa^-2 */

double dragarc_cipm_saturation_vapour_pressure(double temperature)
{
    double t = temperature;
    return exp(PSV_A * t * t + PSV_B * t + PSV_C + PSV_D / t);
}

double dragarc_cipm_enhancement_factor(double pressure, double temperature)
{
    double t = temperature - T_ZERO_CELSIUS;
    return F_ALPHA + F_BETA * pressure + F_GAMMA * t * t;
}

double dragarc_cipm_compressibility(double pressure, double temperature, double vapour_fraction)
{
    double t = temperature - T_ZERO_CELSIUS, x = vapour_fraction, pt = pressure / temperature;
    return 1.0 - pt * (Z_A0 + Z_A1 * t + Z_A2 * t * t + (Z_B0 + Z_B1 * t) * x + (Z_C0 + Z_C1 * t) * x * x) +
           pt * pt * (Z_D + Z_E * x * x);
}

double dragarc_cipm_dry_molar_mass(double co2_fraction)
{
    return (28.96546 + 12.011 * (co2_fraction - DRAGARC_CIPM_X_CO2)) * 1e-3;
}

int dragarc_moist_air_eval(double temperature, double pressure, double relative_humidity, double co2_fraction,
                           dragarc_moist_air *out, dragarc_error *err)
{
    if (!(temperature > 0.0 && isfinite(temperature)))
        return dragarc_error_set(err, DRAGARC_EINVAL, "temperature", "must be positive, in K (got %g)", temperature);
    if (!(pressure > 0.0 && isfinite(pressure)))
        return dragarc_error_set(err, DRAGARC_EINVAL, "pressure", "must be positive, in Pa (got %g)", pressure);
    if (!(relative_humidity >= 0.0 && relative_humidity <= 1.0))
        return dragarc_error_set(err, DRAGARC_EINVAL, "relative_humidity", "must be between 0 and 1 (got %g)",
                                 relative_humidity);
    if (!(co2_fraction >= 0.0 && co2_fraction <= 0.01))
        return dragarc_error_set(err, DRAGARC_EINVAL, "co2_fraction", "must be between 0 and 0.01 (got %g)",
                                 co2_fraction);
    double psv = dragarc_cipm_saturation_vapour_pressure(temperature);
    double f = dragarc_cipm_enhancement_factor(pressure, temperature);
    double xv = relative_humidity * f * psv / pressure;
    if (!(xv < 1.0))
        return dragarc_error_set(err, DRAGARC_ERANGE, "relative_humidity",
                                 "water vapour at %g %% humidity would make up the whole pressure of %g Pa at %g K "
                                 "(the water boils)",
                                 100.0 * relative_humidity, pressure, temperature);
    double z = dragarc_cipm_compressibility(pressure, temperature, xv);
    double ma = dragarc_cipm_dry_molar_mass(co2_fraction);
    double m = (1.0 - xv) * ma + xv * DRAGARC_CIPM_M_VAPOUR;
    double cv = (1.0 - xv) * 2.5 + xv * 3.0; /* molar heat capacity at constant volume, in units of R */
    out->saturation_vapour_pressure = psv;
    out->enhancement_factor = f;
    out->vapour_fraction = xv;
    out->compressibility = z;
    out->dry_molar_mass = ma;
    out->density = pressure * ma / (z * DRAGARC_CIPM_R * temperature) * (1.0 - xv * (1.0 - DRAGARC_CIPM_M_VAPOUR / ma));
    out->speed_of_sound = sqrt((cv + 1.0) / cv * DRAGARC_CIPM_R * temperature / m);
    out->viscosity = dragarc_air_viscosity(temperature);
    return DRAGARC_OK;
}
