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
#include <gsl/gsl_roots.h>

#include "dragarc/flight.h"
#include "dragarc/forces.h"

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
    gsl_function fn = {imbalance, &b};
    gsl_root_fsolver *solver = gsl_root_fsolver_alloc(gsl_root_fsolver_brent);
    if (!solver)
        return dragarc_error_set(err, DRAGARC_ENOMEM, "", "could not allocate a root finder");
    int status = gsl_root_fsolver_set(solver, &fn, lo, hi);
    for (int iter = 0; status == GSL_SUCCESS && iter < 200; iter++) {
        status = gsl_root_fsolver_iterate(solver);
        if (status != GSL_SUCCESS)
            break;
        double a = gsl_root_fsolver_x_lower(solver), c = gsl_root_fsolver_x_upper(solver);
        status = gsl_root_test_interval(a, c, 0.0, 1e-13);
        if (status == GSL_SUCCESS) {
            *vt = gsl_root_fsolver_root(solver);
            break;
        }
        if (status == GSL_CONTINUE)
            status = GSL_SUCCESS;
    }
    gsl_root_fsolver_free(solver);
    if (!isfinite(*vt))
        return dragarc_error_set(err, DRAGARC_ESOLVER, "", "terminal speed: Brent's method did not converge (%s)",
                                 gsl_strerror(status));
    return DRAGARC_OK;
}
