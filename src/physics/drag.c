/* drag.c: drag laws reduced to one drag factor D (kg/s), F = -D v_rel.
 * SPDX-License-Identifier: GPL-3.0-or-later
 *
 * Smooth sphere: Clift, R., Grace, J. R. & Weber, M. E. (1978), Bubbles, Drops, and Particles,
 * Academic Press, Table 5.2 ("recommended drag correlations"), with w = log10(Re):
 *   Re <= 0.01            Cd = 3/16 + 24/Re
 *   0.01 < Re <= 20       Cd = 24/Re [1 + 0.1315 Re^(0.82 - 0.05 w)]
 *   20 < Re <= 260        Cd = 24/Re [1 + 0.1935 Re^0.6305]
 *   260 < Re <= 1.5e3     log10 Cd = 1.6435 - 1.1242 w + 0.1558 w^2
 *   1.5e3 < Re <= 1.2e4   log10 Cd = -2.4571 + 2.5558 w - 0.9295 w^2 + 0.1049 w^3
 *   1.2e4 < Re <= 4.4e4   log10 Cd = -1.9181 + 0.6370 w - 0.0636 w^2
 *   4.4e4 < Re <= 3.38e5  log10 Cd = -4.3390 + 1.5809 w - 0.1546 w^2
 *   3.38e5 < Re <= 4e5    Cd = 29.78 - 5.3 w
 *   4e5 < Re <= 1e6       Cd = 0.1 w - 0.49
 *   Re > 1e6              Cd = 0.19 - 8e4/Re
 * This covers the Stokes, intermediate and Newton regimes and the drag crisis (the minimum near
 * Re = 4e5). The fit has a small step at Re = 4e5 (0.089 -> 0.070), as published.
 * To stay finite at Re -> 0 the code works with Cd Re / 24, so that D = (A mu / (2 d)) 24 (Cd Re / 24).
 *
 * Tables: Cd against Reynolds number (interpolated in log Re), Mach number or airspeed, with GSL's
 * Steffen interpolation (Steffen 1990, Astron. Astrophys. 239:443: monotone between points, so no
 * spurious overshoot), linear for two points, clamped beyond the ends. The abscissa is the natural
 * logarithm, which is cheaper than log10 and gives the same curve: Steffen's cubic does not change when
 * the abscissa is scaled by a constant.
 *
 * Spin tables: Cd against Reynolds number and spin factor S, bilinear in (ln Re, S) with GSL's
 * gsl_interp2d_bilinear, clamped at the edges of the grid: the data of a wind-tunnel sweep of speed and spin
 * (e.g. a spinning ball's drag rising with S) used as measured, without a fitted form.
 */
#include <math.h>
#include <stdio.h>
#include <stdlib.h>
#include <string.h>

#include <gsl/gsl_errno.h>
#include <gsl/gsl_interp.h>
#include <gsl/gsl_interp2d.h>

#include "dragarc/drag.h"

static const char *const MODEL_NAMES[] = {"none", "constant", "linear", "quadratic", "sphere", "table", "spin_table"};
static const char *const AXIS_NAMES[] = {"reynolds", "mach", "speed"};

const char *dragarc_drag_model_name(dragarc_drag_model model)
{
    return (unsigned)model < sizeof MODEL_NAMES / sizeof *MODEL_NAMES ? MODEL_NAMES[model] : NULL;
}

int dragarc_drag_model_from_name(const char *name, dragarc_drag_model *out)
{
    for (size_t i = 0; i < sizeof MODEL_NAMES / sizeof *MODEL_NAMES; i++)
        if (strcmp(name, MODEL_NAMES[i]) == 0) {
            *out = (dragarc_drag_model)i;
            return DRAGARC_OK;
        }
    return DRAGARC_EINVAL;
}

const char *dragarc_drag_axis_name(dragarc_drag_axis axis)
{
    return (unsigned)axis < sizeof AXIS_NAMES / sizeof *AXIS_NAMES ? AXIS_NAMES[axis] : NULL;
}

int dragarc_drag_axis_from_name(const char *name, dragarc_drag_axis *out)
{
    for (size_t i = 0; i < sizeof AXIS_NAMES / sizeof *AXIS_NAMES; i++)
        if (strcmp(name, AXIS_NAMES[i]) == 0) {
            *out = (dragarc_drag_axis)i;
            return DRAGARC_OK;
        }
    return DRAGARC_EINVAL;
}

double dragarc_sphere_cd_re24(double re)
{
    if (re <= 0.01)
        return 1.0 + 3.0 / 16.0 * re / 24.0;
    /* One logarithm and one exponential per call: Re^a = exp(a ln Re), 10^q = exp(q ln 10). */
    const double ln10 = 2.30258509299404568402;
    double lnre = log(re), w = lnre / ln10;
    if (re <= 20.0)
        return 1.0 + 0.1315 * exp((0.82 - 0.05 * w) * lnre);
    if (re <= 260.0)
        return 1.0 + 0.1935 * exp(0.6305 * lnre);
    double cd;
    if (re <= 1.5e3)
        cd = exp(ln10 * (1.6435 - 1.1242 * w + 0.1558 * w * w));
    else if (re <= 1.2e4)
        cd = exp(ln10 * (-2.4571 + w * (2.5558 + w * (-0.9295 + w * 0.1049))));
    else if (re <= 4.4e4)
        cd = exp(ln10 * (-1.9181 + 0.6370 * w - 0.0636 * w * w));
    else if (re <= 3.38e5)
        cd = exp(ln10 * (-4.3390 + 1.5809 * w - 0.1546 * w * w));
    else if (re <= 4e5)
        cd = 29.78 - 5.3 * w;
    else if (re <= 1e6)
        cd = 0.1 * w - 0.49;
    else
        cd = 0.19 - 8e4 / re;
    return cd * re / 24.0;
}

double dragarc_sphere_cd(double re)
{
    if (re <= 0.0)
        return INFINITY;
    return 24.0 / re * dragarc_sphere_cd_re24(re);
}

static double table_cd(const dragarc_drag *d, double x)
{
    double u = d->axis == DRAGARC_AXIS_REYNOLDS ? (x > 0.0 ? log(x) : -INFINITY) : x;
    if (u <= d->u[0])
        return d->y[0];
    if (u >= d->u[d->npoints - 1])
        return d->y[d->npoints - 1];
    /* A NULL accelerator keeps evaluation read-only, so threads may share one table. */
    return gsl_interp_eval((const gsl_interp *)d->interp, d->u, d->y, u, NULL);
}

static double spin_table_cd(const dragarc_drag *d, double re, double S)
{
    double u = re > 0.0 ? log(re) : -INFINITY;
    u = u < d->u[0] ? d->u[0] : u > d->u[d->npoints - 1] ? d->u[d->npoints - 1] : u;
    S = S < d->s[0] ? d->s[0] : S > d->s[d->ns - 1] ? d->s[d->ns - 1] : S;
    /* NULL accelerators keep evaluation read-only, so threads may share one table. */
    return gsl_interp2d_eval((const gsl_interp2d *)d->interp, d->u, d->s, d->y, u, S, NULL, NULL);
}

double dragarc_drag_scale(const dragarc_drag *d)
{
    return d->scale == 0.0 ? 1.0 : d->scale;
}

/* The unscaled law. */
static double law_cd(const dragarc_drag *d, double reynolds, double mach, double speed)
{
    switch (d->model) {
    case DRAGARC_DRAG_CONSTANT: return d->cd;
    case DRAGARC_DRAG_SPHERE: return dragarc_sphere_cd(reynolds);
    case DRAGARC_DRAG_TABLE:
        return table_cd(d, d->axis == DRAGARC_AXIS_REYNOLDS ? reynolds : d->axis == DRAGARC_AXIS_MACH ? mach : speed);
    case DRAGARC_DRAG_SPIN_TABLE: return spin_table_cd(d, reynolds, 0.0);
    default: return NAN;
    }
}

double dragarc_drag_cd(const dragarc_drag *d, double reynolds, double mach, double speed)
{
    return dragarc_drag_scale(d) * law_cd(d, reynolds, mach, speed);
}

double dragarc_drag_factor(const dragarc_drag *d, double speed, const dragarc_air *air, double diameter,
                           double area)
{
    return dragarc_drag_factor_spin(d, speed, air, diameter, area, 0.0);
}

/* The unscaled law. */
static double law_factor(const dragarc_drag *d, double speed, const dragarc_air *air, double diameter, double area,
                         double spin_factor)
{
    switch (d->model) {
    case DRAGARC_DRAG_NONE: return 0.0;
    case DRAGARC_DRAG_LINEAR: return d->k;
    case DRAGARC_DRAG_QUADRATIC: return d->c * speed;
    case DRAGARC_DRAG_CONSTANT: return 0.5 * air->density * d->cd * area * speed;
    case DRAGARC_DRAG_SPHERE: {
        if (air->density == 0.0)
            return 0.0;
        double re = air->density * speed * diameter / air->viscosity;
        return 12.0 * area * air->viscosity / diameter * dragarc_sphere_cd_re24(re);
    }
    case DRAGARC_DRAG_TABLE: {
        double x = d->axis == DRAGARC_AXIS_REYNOLDS ? air->density * speed * diameter / air->viscosity
                   : d->axis == DRAGARC_AXIS_MACH   ? speed / air->speed_of_sound
                                                    : speed;
        return 0.5 * air->density * table_cd(d, x) * area * speed;
    }
    case DRAGARC_DRAG_SPIN_TABLE:
        return 0.5 * air->density * spin_table_cd(d, air->density * speed * diameter / air->viscosity, spin_factor) *
               area * speed;
    }
    return 0.0;
}

double dragarc_drag_factor_spin(const dragarc_drag *d, double speed, const dragarc_air *air, double diameter,
                                double area, double spin_factor)
{
    return dragarc_drag_scale(d) * law_factor(d, speed, air, diameter, area, spin_factor);
}

void dragarc_drag_clear(dragarc_drag *d)
{
    if (!d)
        return;
    if (d->interp && d->model == DRAGARC_DRAG_SPIN_TABLE)
        gsl_interp2d_free((gsl_interp2d *)d->interp);
    else if (d->interp)
        gsl_interp_free((gsl_interp *)d->interp);
    free(d->s);
    free(d->x);
    free(d->u);
    free(d->y);
    memset(d, 0, sizeof *d);
    d->model = DRAGARC_DRAG_NONE;
}

/* Replace what d held by a table whose arrays and interpolation object it now owns. */
static void install(dragarc_drag *d, dragarc_drag_model model, dragarc_drag_axis axis, size_t n, double *x, double *u,
                    double *y, size_t ns, double *s, void *interp)
{
    const double scale = d->scale;
    dragarc_drag_clear(d);
    d->scale = scale;
    d->model = model;
    d->axis = axis;
    d->npoints = n;
    d->x = x;
    d->u = u;
    d->y = y;
    d->ns = ns;
    d->s = s;
    d->interp = interp;
}

int dragarc_drag_table_set(dragarc_drag *d, dragarc_drag_axis axis, const double *x, const double *y, size_t n,
                           dragarc_error *err)
{
    if (n < 2)
        return dragarc_error_set(err, DRAGARC_EINVAL, "points", "needs at least 2 points (got %zu)", n);
    for (size_t i = 0; i < n; i++) {
        char field[48];
        snprintf(field, sizeof field, "points[%zu]", i);
        if (!isfinite(x[i]) || !isfinite(y[i]))
            return dragarc_error_set(err, DRAGARC_EINVAL, field, "values must be finite numbers");
        if (axis == DRAGARC_AXIS_REYNOLDS ? !(x[i] > 0.0) : !(x[i] >= 0.0))
            return dragarc_error_set(err, DRAGARC_EINVAL, field, "%s %g must be %s", dragarc_drag_axis_name(axis),
                                     x[i], axis == DRAGARC_AXIS_REYNOLDS ? "positive" : "zero or positive");
        if (!(y[i] > 0.0))
            return dragarc_error_set(err, DRAGARC_EINVAL, field, "cd %g must be positive", y[i]);
        if (i > 0 && !(x[i] > x[i - 1]))
            return dragarc_error_set(err, DRAGARC_EINVAL, field,
                                     "%s values must increase strictly (%g follows %g)",
                                     dragarc_drag_axis_name(axis), x[i], x[i - 1]);
    }
    double *xs = malloc(n * sizeof *xs), *us = malloc(n * sizeof *us), *ys = malloc(n * sizeof *ys);
    gsl_interp *ip = gsl_interp_alloc(n >= 3 ? gsl_interp_steffen : gsl_interp_linear, n);
    if (!xs || !us || !ys || !ip)
        goto fail_nomem;
    for (size_t i = 0; i < n; i++) {
        xs[i] = x[i];
        us[i] = axis == DRAGARC_AXIS_REYNOLDS ? log(x[i]) : x[i];
        ys[i] = y[i];
    }
    for (size_t i = 1; i < n; i++)
        if (!(us[i] > us[i - 1])) {
            char field[48];
            snprintf(field, sizeof field, "points[%zu]", i);
            free(xs), free(us), free(ys), gsl_interp_free(ip);
            return dragarc_error_set(err, DRAGARC_EINVAL, field, "reynolds values too close together to interpolate");
        }
    if (gsl_interp_init(ip, us, ys, n) != GSL_SUCCESS) {
        free(xs), free(us), free(ys), gsl_interp_free(ip);
        return dragarc_error_set(err, DRAGARC_EINVAL, "points", "GSL could not set up the interpolation");
    }
    install(d, DRAGARC_DRAG_TABLE, axis, n, xs, us, ys, 0, NULL, ip);
    return DRAGARC_OK;
fail_nomem:
    free(xs), free(us), free(ys);
    if (ip)
        gsl_interp_free(ip);
    return dragarc_error_set(err, DRAGARC_ENOMEM, "points", "out of memory for %zu points", n);
}

int dragarc_drag_spin_table_set(dragarc_drag *d, const double *re, size_t nre, const double *s, size_t ns,
                                const double *cd, dragarc_error *err)
{
    char field[48];
    if (nre < 2)
        return dragarc_error_set(err, DRAGARC_EINVAL, "reynolds", "needs at least 2 values (got %zu)", nre);
    if (ns < 2)
        return dragarc_error_set(err, DRAGARC_EINVAL, "spin_factor", "needs at least 2 values (got %zu)", ns);
    for (size_t i = 0; i < nre; i++) {
        snprintf(field, sizeof field, "reynolds[%zu]", i);
        if (!(re[i] > 0.0 && isfinite(re[i])))
            return dragarc_error_set(err, DRAGARC_EINVAL, field, "must be positive (got %g)", re[i]);
        if (i > 0 && !(log(re[i]) > log(re[i - 1])))
            return dragarc_error_set(err, DRAGARC_EINVAL, field, "must increase strictly (%g follows %g)", re[i],
                                     re[i - 1]);
    }
    for (size_t j = 0; j < ns; j++) {
        snprintf(field, sizeof field, "spin_factor[%zu]", j);
        if (!(s[j] >= 0.0 && s[j] <= 10.0))
            return dragarc_error_set(err, DRAGARC_EINVAL, field, "must be between 0 and 10 (got %g)", s[j]);
        if (j > 0 && !(s[j] > s[j - 1]))
            return dragarc_error_set(err, DRAGARC_EINVAL, field, "must increase strictly (%g follows %g)", s[j],
                                     s[j - 1]);
    }
    for (size_t i = 0; i < nre; i++)
        for (size_t j = 0; j < ns; j++)
            if (!(cd[i * ns + j] > 0.0 && cd[i * ns + j] < 100.0)) {
                snprintf(field, sizeof field, "cd[%zu][%zu]", i, j);
                return dragarc_error_set(err, DRAGARC_EINVAL, field, "must be positive and below 100 (got %g)",
                                         cd[i * ns + j]);
            }
    double *xs = malloc(nre * sizeof *xs), *us = malloc(nre * sizeof *us), *ss = malloc(ns * sizeof *ss);
    double *zs = malloc(nre * ns * sizeof *zs);
    gsl_interp2d *ip = gsl_interp2d_alloc(gsl_interp2d_bilinear, nre, ns);
    if (!xs || !us || !ss || !zs || !ip) {
        free(xs), free(us), free(ss), free(zs);
        if (ip)
            gsl_interp2d_free(ip);
        return dragarc_error_set(err, DRAGARC_ENOMEM, "cd", "out of memory for %zu x %zu values", nre, ns);
    }
    for (size_t i = 0; i < nre; i++)
        xs[i] = re[i], us[i] = log(re[i]);
    memcpy(ss, s, ns * sizeof *ss);
    for (size_t i = 0; i < nre; i++)
        for (size_t j = 0; j < ns; j++)
            gsl_interp2d_set(ip, zs, i, j, cd[i * ns + j]);
    if (gsl_interp2d_init(ip, us, ss, zs, nre, ns) != GSL_SUCCESS) {
        free(xs), free(us), free(ss), free(zs), gsl_interp2d_free(ip);
        return dragarc_error_set(err, DRAGARC_EINVAL, "cd", "GSL could not set up the interpolation");
    }
    install(d, DRAGARC_DRAG_SPIN_TABLE, DRAGARC_AXIS_REYNOLDS, nre, xs, us, zs, ns, ss, ip);
    return DRAGARC_OK;
}

int dragarc_drag_copy(dragarc_drag *dst, const dragarc_drag *src, dragarc_error *err)
{
    *dst = *src;
    dst->x = dst->u = dst->y = dst->s = NULL;
    dst->interp = NULL;
    if (src->model != DRAGARC_DRAG_TABLE && src->model != DRAGARC_DRAG_SPIN_TABLE)
        return DRAGARC_OK;
    dst->model = DRAGARC_DRAG_NONE;
    dst->npoints = dst->ns = 0;
    if (src->model == DRAGARC_DRAG_TABLE)
        return dragarc_drag_table_set(dst, src->axis, src->x, src->y, src->npoints, err);
    /* back from GSL's order (x fastest) to the setter's (s fastest) */
    double *cd = malloc(src->npoints * src->ns * sizeof *cd);
    if (!cd)
        return dragarc_error_set(err, DRAGARC_ENOMEM, "cd", "out of memory");
    for (size_t i = 0; i < src->npoints; i++)
        for (size_t j = 0; j < src->ns; j++)
            cd[i * src->ns + j] = src->y[j * src->npoints + i];
    int rc = dragarc_drag_spin_table_set(dst, src->x, src->npoints, src->s, src->ns, cd, err);
    free(cd);
    return rc;
}

int dragarc_drag_check(const dragarc_drag *d, dragarc_error *err)
{
    if (!(d->scale >= 0.0 && d->scale <= 100.0))
        return dragarc_error_set(err, DRAGARC_EINVAL, "cd_scale", "must be positive and at most 100 (got %g)",
                                 d->scale);
    switch (d->model) {
    case DRAGARC_DRAG_NONE:
    case DRAGARC_DRAG_SPHERE: return DRAGARC_OK;
    case DRAGARC_DRAG_CONSTANT:
        if (!(d->cd > 0.0 && d->cd < 100.0))
            return dragarc_error_set(err, DRAGARC_EINVAL, "cd", "must be positive and below 100 (got %g)", d->cd);
        return DRAGARC_OK;
    case DRAGARC_DRAG_LINEAR:
        if (!(d->k > 0.0 && isfinite(d->k)))
            return dragarc_error_set(err, DRAGARC_EINVAL, "k", "must be positive, in N s/m (got %g)", d->k);
        return DRAGARC_OK;
    case DRAGARC_DRAG_QUADRATIC:
        if (!(d->c > 0.0 && isfinite(d->c)))
            return dragarc_error_set(err, DRAGARC_EINVAL, "c", "must be positive, in kg/m (got %g)", d->c);
        return DRAGARC_OK;
    case DRAGARC_DRAG_TABLE:
        if (d->npoints < 2 || !d->interp)
            return dragarc_error_set(err, DRAGARC_EINVAL, "points", "needs at least 2 points");
        return DRAGARC_OK;
    case DRAGARC_DRAG_SPIN_TABLE:
        if (d->npoints < 2 || d->ns < 2 || !d->interp)
            return dragarc_error_set(err, DRAGARC_EINVAL, "cd", "needs a grid of at least 2 x 2 values");
        return DRAGARC_OK;
    }
    return dragarc_error_set(err, DRAGARC_EINVAL, "model", "unknown drag model %d", (int)d->model);
}
