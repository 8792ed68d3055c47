/* terminal.c: still-air terminal speed with the drag model's own law.
 * SPDX-License-Identifier: GPL-3.0-or-later
 *
 * Solves D(v) v = (m - rho_f V) g for the airspeed v with GSL's Brent solver (Brent 1973, Algorithms
 * for Minimization without Derivatives, ch. 4). The bracket grows geometrically from a small speed by
 * a factor 1.2 so that the lowest root is found: the one a body falling from rest reaches first
 * (a sphere through the drag crisis can have more than one).
 */
#include <math.h>

#include <gsl/gsl_errno.h>

#include "dragarc/flight.h"
#include "dragarc/forces.h"
#include "dragarc/evaporation.h"
#include "dragarc/moist_air.h"
#include "numerics/roots.h"

typedef struct balance {
    const dragarc_projectile *p;
    dragarc_air air;
    double weight; /* N, net of buoyancy */
} balance;

static double imbalance(double v, void *user)
{
    const balance *b = user;
    return dragarc_drag_factor(&b->p->drag, v, &b->air, b->p->diameter, b->p->area) * v - b->weight;
}

int dragarc_terminal_speed(const dragarc_scenario *s, double z, double *vt, dragarc_error *err)
{
    *vt = NAN;
    balance b = {.p = &s->projectile};
    int rc = dragarc_atmosphere_eval(&s->atmosphere, z, &b.air, err);
    if (rc != DRAGARC_OK)
        return rc;
    b.weight = (s->projectile.mass - b.air.density * s->projectile.volume) * s->gravity;
    if (!(b.weight > 0.0) || s->projectile.drag.model == DRAGARC_DRAG_NONE)
        return DRAGARC_OK;
    if (b.air.density == 0.0 && s->projectile.drag.model != DRAGARC_DRAG_LINEAR &&
        s->projectile.drag.model != DRAGARC_DRAG_QUADRATIC)
        return DRAGARC_OK; /* vacuum: nothing holds the body back */
    /* Bracket by factors of 4 from 1 m/s, down or up: drag times speed grows with speed in every law here,
     * so the balance lies between the last speed short of the weight and the first past it. */
    double lo = 0.0, hi = 1.0;
    if (imbalance(hi, &b) < 0.0) {
        do {
            lo = hi;
            hi *= 4.0;
            if (hi > 1e7)
                return DRAGARC_OK; /* no balance below 10,000 km/s: treat as none */
        } while (imbalance(hi, &b) < 0.0);
    } else {
        lo = 0.25;
        while (lo > 1e-12 && imbalance(lo, &b) >= 0.0) {
            hi = lo;
            lo *= 0.25;
        }
        if (lo <= 1e-12)
            lo = 0.0;
    }
    int status = dragarc_brent_root(imbalance, &b, lo, hi, 1e-13, vt);
    if (status == GSL_ENOMEM)
        return dragarc_error_set(err, DRAGARC_ENOMEM, "", "could not allocate a root finder");
    /* A balance far below the search's floor (found while fuzzing the fly pipeline: environment.gravity 1e-100
     * made `fly` fail with exit 3): Brent's relative test cannot close on a root that close to the bracket's end
     * at 0 in 200 steps. The bracket is then [0, hi], hi < 4e-12 m/s, and the speed is 0 to within that. */
    if (!isfinite(*vt) && lo == 0.0)
        *vt = 0.0;
    if (!isfinite(*vt))
        return dragarc_error_set(err, DRAGARC_ESOLVER, "", "terminal speed: Brent's method did not converge (%s)",
                                 gsl_strerror(status));
    return DRAGARC_OK;
}

typedef struct air_state {
    double temperature, pressure, humidity;
} air_state;

static double psychrometer(double tw, void *user)
{
    const air_state *a = user;
    return dragarc_psychrometer_residual(tw, a->temperature, a->pressure, a->humidity);
}

int dragarc_wet_bulb_temperature(double temperature, double pressure, double relative_humidity, double *tw,
                                 dragarc_error *err)
{
    air_state a = {temperature, pressure, relative_humidity};
    /* The residual is negative 60 K below the air (no vapour pressure there to speak of) and not negative at the
     * air's own temperature (saturated air: zero), so the wet bulb lies between. */
    if (relative_humidity >= 1.0) {
        *tw = temperature;
        return DRAGARC_OK;
    }
    int status = dragarc_brent_root(psychrometer, &a, temperature - 60.0, temperature, 1e-12, tw);
    if (status != GSL_SUCCESS)
        return dragarc_error_set(err, DRAGARC_ESOLVER, "environment.atmosphere",
                                 "wet-bulb temperature: Brent's method did not converge (%s)", gsl_strerror(status));
    return DRAGARC_OK;
}

int dragarc_drop_temperature(double temperature, double pressure, double relative_humidity, double nu_over_sh,
                             double *ts, dragarc_error *err)
{
    if (relative_humidity >= 1.0) {
        *ts = temperature;
        return DRAGARC_OK;
    }
    /* g(x) = r k (T - x) - D_v L(x) (M_v / R) (e_w(x) / x - h e_w(T) / T), dragarc_drop_heat_residual with what
     * does not depend on x worked out once; it falls as x rises: positive 60 K below the air, not positive at the
     * air's own temperature. Newton's method with the slope of e_w / T from the Clausius-Clapeyron relation,
     * d ln e_w / dT = L M_v / (R T^2) (a slope good to about 1 %, so each step gains two digits or more, and only
     * the root itself must be exact), replaced by bisection whenever it would leave the bracket that the signs
     * keep; stops when a step is under 1e-10 K. One exponential a step. */
    const double t = temperature, r = nu_over_sh * dragarc_air_conductivity(t);
    const double dv = dragarc_vapour_diffusivity(t, pressure), c = DRAGARC_CIPM_M_VAPOUR / DRAGARC_CIPM_R;
    const double air = relative_humidity * dragarc_cipm_saturation_vapour_pressure(t) / t;
    double lo = t - 60.0, hi = t, x = t - 5.0;
    for (int i = 0; i < 200; i++) {
        double f = dragarc_cipm_saturation_vapour_pressure(x) / x, L = dragarc_latent_heat(x);
        double g = r * (t - x) - dv * L * c * (f - air);
        if (g > 0.0)
            lo = x;
        else
            hi = x;
        double df = f * (L * DRAGARC_CIPM_M_VAPOUR / (DRAGARC_CIPM_R * x * x) - 1.0 / x);
        double slope = -r - dv * c * (L * df - DRAGARC_LATENT_HEAT_SLOPE * (f - air));
        double next = slope < 0.0 ? x - g / slope : 0.5 * (lo + hi);
        if (!(next > lo && next < hi))
            next = 0.5 * (lo + hi);
        if (fabs(next - x) < 1e-10 || hi - lo < 1e-10) {
            *ts = next;
            return DRAGARC_OK;
        }
        x = next;
    }
    return dragarc_error_set(err, DRAGARC_ESOLVER, "environment.atmosphere",
                             "drop temperature: the heat balance did not converge");
}
