/* wind.c: horizontal wind against height above ground.
 * SPDX-License-Identifier: GPL-3.0-or-later
 *
 * Power law u = u_ref (h / h_ref)^alpha: the wind-engineering profile (e.g. Counihan 1975,
 * Atmospheric Environment 9:871; alpha ~ 0.14 over open country is common practice, no source).
 * Log law u = (u* / kappa) ln(h / z0), here normalised by the reference speed so that
 * u = u_ref ln(h / z0) / ln(h_ref / z0): the neutral surface layer (Stull 1988, An Introduction to
 * Boundary Layer Meteorology, section 9.7). Layered tables interpolate speed linearly and the
 * direction along the shorter arc, since components interpolated separately would slow the wind
 * through a veer.
 */
#include <math.h>
#include <stdio.h>
#include <stdlib.h>
#include <string.h>

#include "core/constants.h"
#include "dragarc/wind.h"

void dragarc_wind_default(dragarc_wind *w)
{
    memset(w, 0, sizeof *w);
    w->model = DRAGARC_WIND_NONE;
    w->ref_height = 10.0;
    w->exponent = 1.0 / 7.0;
    w->roughness = 0.03;
}

void dragarc_wind_toward(double from, double *east, double *north)
{
    /* A wind from the north (0) blows toward the south: -y. */
    *east = -sin(from);
    *north = -cos(from);
}

static double layered_speed_dir(const dragarc_wind *w, double h, double *from)
{
    const dragarc_wind_layer *l = w->layers;
    size_t n = w->nlayers;
    if (h <= l[0].height) {
        *from = l[0].from;
        return l[0].speed;
    }
    if (h >= l[n - 1].height) {
        *from = l[n - 1].from;
        return l[n - 1].speed;
    }
    size_t lo = 0, hi = n - 1; /* bisection: l[lo].height <= h < l[hi].height */
    while (hi - lo > 1) {
        size_t mid = (lo + hi) / 2;
        if (l[mid].height <= h)
            lo = mid;
        else
            hi = mid;
    }
    double s = (h - l[lo].height) / (l[hi].height - l[lo].height);
    double d = l[hi].from - l[lo].from; /* shorter arc, in [-pi, pi] (remainder leaves |d| <= pi as it is) */
    if (fabs(d) > DRAGARC_PI)
        d = remainder(d, 2.0 * DRAGARC_PI);
    *from = l[lo].from + s * d;
    return l[lo].speed + s * (l[hi].speed - l[lo].speed);
}

void dragarc_wind_eval(const dragarc_wind *w, double h, double out[3])
{
    dragarc_wind_eval_toward(w, h, NULL, out);
}

void dragarc_wind_eval_toward(const dragarc_wind *w, double h, const double toward[2], double out[3])
{
    double speed = 0.0, from = w->from;
    switch (w->model) {
    case DRAGARC_WIND_NONE: break;
    case DRAGARC_WIND_CONSTANT: speed = w->speed; break;
    case DRAGARC_WIND_LAYERED: speed = layered_speed_dir(w, h, &from); break;
    case DRAGARC_WIND_POWER: speed = h > 0.0 ? w->speed * pow(h / w->ref_height, w->exponent) : 0.0; break;
    case DRAGARC_WIND_LOG:
        speed = h > w->roughness ? w->speed * log(h / w->roughness) / log(w->ref_height / w->roughness) : 0.0;
        break;
    }
    if (speed == 0.0) { /* still air: no trigonometry on the hot path */
        out[0] = out[1] = out[2] = 0.0;
        return;
    }
    double e, n;
    if (toward && w->model != DRAGARC_WIND_LAYERED)
        e = toward[0], n = toward[1];
    else
        dragarc_wind_toward(from, &e, &n);
    out[0] = speed * e;
    out[1] = speed * n;
    out[2] = 0.0;
}

size_t dragarc_wind_breaks(const dragarc_wind *w, double *out, size_t max)
{
    switch (w->model) {
    case DRAGARC_WIND_LAYERED:
        for (size_t i = 0; i < w->nlayers && i < max; i++)
            out[i] = w->layers[i].height;
        return w->nlayers;
    case DRAGARC_WIND_POWER:
        if (max > 0)
            out[0] = 0.0;
        return 1;
    case DRAGARC_WIND_LOG:
        if (max > 0)
            out[0] = w->roughness;
        return 1;
    default: return 0;
    }
}

int dragarc_wind_check(const dragarc_wind *w, dragarc_error *err)
{
    if (w->model == DRAGARC_WIND_NONE)
        return DRAGARC_OK;
    if (w->model != DRAGARC_WIND_LAYERED) {
        if (!(w->speed >= 0.0 && w->speed < 300.0))
            return dragarc_error_set(err, DRAGARC_EINVAL, "speed", "must be between 0 and 300 m/s (got %g)", w->speed);
        if (!isfinite(w->from))
            return dragarc_error_set(err, DRAGARC_EINVAL, "from", "must be a finite direction in degrees");
    }
    if (w->model == DRAGARC_WIND_POWER || w->model == DRAGARC_WIND_LOG) {
        if (!(w->ref_height > 0.0 && isfinite(w->ref_height)))
            return dragarc_error_set(err, DRAGARC_EINVAL, "ref_height", "must be positive (got %g)", w->ref_height);
    }
    if (w->model == DRAGARC_WIND_POWER && !(w->exponent > 0.0 && w->exponent < 1.0))
        return dragarc_error_set(err, DRAGARC_EINVAL, "exponent", "must be between 0 and 1 (got %g)", w->exponent);
    if (w->model == DRAGARC_WIND_LOG) {
        if (!(w->roughness > 0.0 && isfinite(w->roughness)))
            return dragarc_error_set(err, DRAGARC_EINVAL, "roughness", "must be positive, in m (got %g)", w->roughness);
        if (!(w->ref_height > w->roughness))
            return dragarc_error_set(err, DRAGARC_EINVAL, "ref_height",
                                     "must be above the roughness length (%g m <= %g m)", w->ref_height, w->roughness);
    }
    if (w->model == DRAGARC_WIND_LAYERED) {
        if (w->nlayers < 1 || !w->layers)
            return dragarc_error_set(err, DRAGARC_EINVAL, "layers", "needs at least one row");
        for (size_t i = 0; i < w->nlayers; i++) {
            const dragarc_wind_layer *l = &w->layers[i];
            char field[48];
            if (!isfinite(l->height) || (i > 0 && !(l->height > w->layers[i - 1].height))) {
                snprintf(field, sizeof field, "layers[%zu].height", i);
                return dragarc_error_set(err, DRAGARC_EINVAL, field, "heights must be finite and increase strictly (got %g)",
                                         l->height);
            }
            if (!(l->speed >= 0.0 && l->speed < 300.0)) {
                snprintf(field, sizeof field, "layers[%zu].speed", i);
                return dragarc_error_set(err, DRAGARC_EINVAL, field, "must be between 0 and 300 m/s (got %g)", l->speed);
            }
            if (!isfinite(l->from)) {
                snprintf(field, sizeof field, "layers[%zu].from", i);
                return dragarc_error_set(err, DRAGARC_EINVAL, field, "must be a finite direction in degrees");
            }
        }
    }
    return DRAGARC_OK;
}

int dragarc_wind_copy(dragarc_wind *dst, const dragarc_wind *src, dragarc_error *err)
{
    *dst = *src;
    dst->layers = NULL;
    if (src->nlayers) {
        dst->layers = malloc(src->nlayers * sizeof *dst->layers);
        if (!dst->layers) {
            dst->nlayers = 0;
            return dragarc_error_set(err, DRAGARC_ENOMEM, "layers", "out of memory");
        }
        memcpy(dst->layers, src->layers, src->nlayers * sizeof *dst->layers);
    }
    return DRAGARC_OK;
}

void dragarc_wind_clear(dragarc_wind *w)
{
    if (!w)
        return;
    free(w->layers);
    dragarc_wind_default(w);
}
