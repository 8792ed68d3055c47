/* lift.c: lift coefficients of a spinning ball against the spin factor S = r w_perp / |v_rel|.
 * SPDX-License-Identifier: GPL-3.0-or-later
 *
 * constant:     C_L = cl.
 * sawicki2003:  C_L = 1.5 S (S < 0.1), 0.09 + 0.6 S (S >= 0.1): the bilinear fit to measured baseball lift of
 *               Sawicki, G. S., Hubbard, M. & Stronge, W. J. (2003), "How to hit home runs: optimum baseball bat
 *               swing parameters for maximum range trajectories", Am. J. Phys. 71:1152 (recalled; the two
 *               pieces meet at S = 0.1, C_L = 0.15).
 * table:        C_L(S) through the given points, Steffen's monotone interpolation (Steffen 1990, Astron.
 *               Astrophys. 239:443; GSL's gsl_interp_steffen) so that no overshoot appears between measured
 *               points; held at the first and last value outside them.
 */
#include <math.h>
#include <stdio.h>
#include <stdlib.h>
#include <string.h>

#include <gsl/gsl_errno.h>
#include <gsl/gsl_interp.h>

#include "dragarc/lift.h"

static const char *const NAMES[] = {"none", "constant", "sawicki2003", "table"};

const char *dragarc_lift_model_name(dragarc_lift_model m)
{
    return (unsigned)m < sizeof NAMES / sizeof *NAMES ? NAMES[m] : NULL;
}

int dragarc_lift_model_from_name(const char *name, dragarc_lift_model *out)
{
    for (size_t i = 0; i < sizeof NAMES / sizeof *NAMES; i++)
        if (name && strcmp(name, NAMES[i]) == 0) {
            *out = (dragarc_lift_model)i;
            return DRAGARC_OK;
        }
    return DRAGARC_EINVAL;
}

void dragarc_lift_clear(dragarc_lift *l)
{
    if (!l)
        return;
    if (l->interp)
        gsl_interp_free((gsl_interp *)l->interp);
    free(l->s);
    free(l->c);
    memset(l, 0, sizeof *l);
}

int dragarc_lift_table_set(dragarc_lift *l, const double *s, const double *cl, size_t n, dragarc_error *err)
{
    if (n < 2)
        return dragarc_error_set(err, DRAGARC_EINVAL, "points", "needs at least 2 points (got %zu)", n);
    for (size_t i = 0; i < n; i++) {
        char field[48];
        snprintf(field, sizeof field, "points[%zu]", i);
        if (!(s[i] >= 0.0 && s[i] <= 10.0))
            return dragarc_error_set(err, DRAGARC_EINVAL, field, "spin factor must be between 0 and 10 (got %g)", s[i]);
        if (!(cl[i] >= 0.0 && cl[i] <= 1.0))
            return dragarc_error_set(err, DRAGARC_EINVAL, field, "lift coefficient must be between 0 and 1 (got %g)",
                                     cl[i]);
        if (i > 0 && !(s[i] > s[i - 1]))
            return dragarc_error_set(err, DRAGARC_EINVAL, field, "spin factors must increase strictly (%g follows %g)",
                                     s[i], s[i - 1]);
    }
    double *ss = malloc(n * sizeof *ss), *cs = malloc(n * sizeof *cs);
    gsl_interp *ip = gsl_interp_alloc(n >= 3 ? gsl_interp_steffen : gsl_interp_linear, n);
    if (!ss || !cs || !ip) {
        free(ss), free(cs);
        if (ip)
            gsl_interp_free(ip);
        return dragarc_error_set(err, DRAGARC_ENOMEM, "points", "out of memory for %zu points", n);
    }
    memcpy(ss, s, n * sizeof *ss);
    memcpy(cs, cl, n * sizeof *cs);
    if (gsl_interp_init(ip, ss, cs, n) != GSL_SUCCESS) {
        free(ss), free(cs), gsl_interp_free(ip);
        return dragarc_error_set(err, DRAGARC_EINVAL, "points", "GSL could not set up the interpolation");
    }
    dragarc_lift_clear(l);
    l->model = DRAGARC_LIFT_TABLE;
    l->npoints = n;
    l->s = ss;
    l->c = cs;
    l->interp = ip;
    return DRAGARC_OK;
}

int dragarc_lift_copy(dragarc_lift *dst, const dragarc_lift *src, dragarc_error *err)
{
    *dst = *src;
    dst->s = dst->c = NULL;
    dst->interp = NULL;
    if (src->model != DRAGARC_LIFT_TABLE)
        return DRAGARC_OK;
    dst->model = DRAGARC_LIFT_NONE;
    dst->npoints = 0;
    return dragarc_lift_table_set(dst, src->s, src->c, src->npoints, err);
}

int dragarc_lift_check(const dragarc_lift *l, dragarc_error *err)
{
    switch (l->model) {
    case DRAGARC_LIFT_NONE:
    case DRAGARC_LIFT_SAWICKI2003: return DRAGARC_OK;
    case DRAGARC_LIFT_CONSTANT:
        if (!(l->cl >= 0.0 && l->cl <= 1.0))
            return dragarc_error_set(err, DRAGARC_EINVAL, "cl", "must be between 0 and 1 (got %g)", l->cl);
        return DRAGARC_OK;
    case DRAGARC_LIFT_TABLE:
        if (l->npoints < 2 || !l->interp)
            return dragarc_error_set(err, DRAGARC_EINVAL, "points", "needs at least 2 points");
        return DRAGARC_OK;
    }
    return dragarc_error_set(err, DRAGARC_EINVAL, "model", "unknown lift model %d", (int)l->model);
}

double dragarc_lift_coefficient(const dragarc_lift *l, double S)
{
    switch (l->model) {
    case DRAGARC_LIFT_CONSTANT: return l->cl;
    case DRAGARC_LIFT_SAWICKI2003: return S < 0.1 ? 1.5 * S : 0.09 + 0.6 * S;
    case DRAGARC_LIFT_TABLE:
        if (S <= l->s[0])
            return l->c[0];
        if (S >= l->s[l->npoints - 1])
            return l->c[l->npoints - 1];
        /* A NULL accelerator keeps evaluation read-only, so threads may share one table. */
        return gsl_interp_eval((const gsl_interp *)l->interp, l->s, l->c, S, NULL);
    default: return 0.0;
    }
}
