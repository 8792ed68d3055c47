/* drift.c: spray drops of each size flown downwind; the deposit per metre, the airborne share, the drift distances.
 * SPDX-License-Identifier: GPL-3.0-or-later
 *
 * Class i lands (or vanishes) at x_i downwind. Its deposited volume, f_i times the share of its liquid that reached
 * the ground, is spread evenly over [x_i - (x_i - x_prev)/2, x_i + (x_next - x_i)/2], where prev and next are the
 * classes landing nearest on either side (at the ends the half-width of the one neighbour is mirrored): the same
 * size-and-distance patches as the sprinkler's pattern, in one dimension. Every class's water is counted once:
 * deposited + evaporated + still aloft (a flight that reaches solver.max_time) + failed = emitted.
 */
#include <math.h>
#include <stdlib.h>
#include <string.h>

#include "core/constants.h"
#include "dragarc/drift.h"
#include "dragarc/flight.h"
#include "dragarc/sweep.h"

#define MAX_BINS 1000000

void dragarc_drift_clear(dragarc_drift_result *r)
{
    if (!r)
        return;
    free(r->classes);
    free(r->deposit);
    free(r->class_deposit);
    memset(r, 0, sizeof *r);
}

double dragarc_drift_deposited_within(const dragarc_drift_result *r, double x)
{
    double before = 0.0, w = r->bin_width;
    for (size_t b = 0; b < r->nbins; b++) {
        double s0 = r->first_bin + b * w, v = r->deposit[b] * w;
        if (s0 + w <= x)
            before += v;
        else if (s0 < x)
            before += v * (x - s0) / w;
    }
    return before;
}

static void fly_class(const dragarc_scenario *base, const double v0[3], const double toward[2], double d,
                      dragarc_drift_class *c, unsigned *notes)
{
    dragarc_scenario s = *base; /* shallow: the drag table and wind layers are only read */
    dragarc_error e;
    double vh = hypot(v0[0], v0[1]);
    s.launch.speed = sqrt(vh * vh + v0[2] * v0[2]);
    s.launch.elevation = atan2(v0[2], vh);
    s.launch.azimuth = vh > 0.0 ? atan2(v0[0], v0[1]) : 0.0;
    c->outcome = DRAGARC_DRIFT_FAILED;
    if (dragarc_scenario_set(&s, "projectile.diameter", d, &e) != DRAGARC_OK)
        return;
    dragarc_flight f;
    int rc = dragarc_flight_run(&s, 0.0, &f, &e);
    if (rc == DRAGARC_OK) {
        c->downwind = f.impact[0] * toward[0] + f.impact[1] * toward[1];
        c->crosswind = f.impact[0] * toward[1] - f.impact[1] * toward[0];
        c->time = f.time_of_flight;
        double res = s.projectile.evaporation.enabled ? s.projectile.evaporation.nonvolatile_fraction : 0.0;
        c->outcome = f.evaporated ? DRAGARC_DRIFT_EVAPORATED : DRAGARC_DRIFT_LANDED;
        c->water_left = f.evaporated ? 0.0 : s.projectile.evaporation.enabled ? fmax(f.impact[7], res) : 1.0;
        *notes = f.notes;
    } else if (rc == DRAGARC_ENOLAND) {
        c->outcome = DRAGARC_DRIFT_ALOFT;
        c->time = s.solver.max_time;
    }
    dragarc_flight_clear(&f);
}

int dragarc_drift_run(const dragarc_scenario *base, const double travel[2], const dragarc_spectrum_class *classes,
                      size_t n, double bin_width, double buffer, dragarc_drift_result *out, dragarc_error *err)
{
    memset(out, 0, sizeof *out);
    out->distance90 = out->distance99 = out->diameter_at_buffer = NAN;
    if (n < 1 || n > DRAGARC_SPECTRUM_MAX_CLASSES)
        return dragarc_error_set(err, DRAGARC_EINVAL, "classes", "must be 1 to %d (got %zu)",
                                 DRAGARC_SPECTRUM_MAX_CLASSES, n);
    if (!(bin_width > 0.0 && isfinite(bin_width)))
        return dragarc_error_set(err, DRAGARC_EINVAL, "bin_width", "must be positive (got %g)", bin_width);
    if (!(buffer >= 0.0 && isfinite(buffer)))
        return dragarc_error_set(err, DRAGARC_EINVAL, "buffer", "must be 0 or more (got %g)", buffer);
    /* downwind: where the wind at the release height blows (the wind's own direction when it is calm there) */
    double w[3], toward[2];
    dragarc_wind_eval(&base->wind, base->launch.height - base->ground_elevation, w);
    if (hypot(w[0], w[1]) > 0.0)
        toward[0] = w[0] / hypot(w[0], w[1]), toward[1] = w[1] / hypot(w[0], w[1]);
    else
        dragarc_wind_toward(base->wind.from, &toward[0], &toward[1]);
    out->wind_toward = atan2(toward[0], toward[1]);
    const dragarc_launch *l = &base->launch;
    double v0[3] = {l->speed * cos(l->elevation) * sin(l->azimuth) + travel[0],
                    l->speed * cos(l->elevation) * cos(l->azimuth) + travel[1], l->speed * sin(l->elevation)};
    out->nclasses = n;
    out->classes = calloc(n, sizeof *out->classes);
    unsigned *notes = calloc(n, sizeof *notes);
    if (!out->classes || !notes) {
        free(notes);
        return dragarc_error_set(err, DRAGARC_ENOMEM, "", "out of memory for %zu classes", n);
    }
    dragarc_drift_class *cl = out->classes;
#pragma omp parallel for schedule(dynamic) default(none) shared(base, v0, toward, classes, cl, notes, n)
    for (size_t i = 0; i < n; i++) {
        cl[i].diameter = classes[i].diameter;
        cl[i].fraction = classes[i].fraction;
        fly_class(base, v0, toward, classes[i].diameter, &cl[i], &notes[i]);
    }
    /* the landed classes in order of distance */
    size_t *ord = malloc(n * sizeof *ord), m = 0;
    if (!ord) {
        free(notes);
        return dragarc_error_set(err, DRAGARC_ENOMEM, "", "out of memory");
    }
    double lo = 0.0, hi = 0.0;
    for (size_t i = 0; i < n; i++) {
        out->notes |= notes[i];
        const dragarc_drift_class *c = &cl[i];
        if (c->outcome == DRAGARC_DRIFT_LANDED) {
            ord[m++] = i;
            out->evaporated_fraction += c->fraction * (1.0 - c->water_left);
        } else if (c->outcome == DRAGARC_DRIFT_EVAPORATED) {
            out->evaporated_fraction += c->fraction;
        } else {
            *(c->outcome == DRAGARC_DRIFT_ALOFT ? &out->aloft_fraction : &out->failed_fraction) += c->fraction;
        }
    }
    free(notes);
    if (m == 0) {
        free(ord);
        return DRAGARC_OK; /* nothing lands: every share is airborne */
    }
    for (size_t a = 1; a < m; a++) /* insertion sort by distance: n is at most 1000 */
        for (size_t b = a; b > 0 && cl[ord[b]].downwind < cl[ord[b - 1]].downwind; b--) {
            size_t t = ord[b];
            ord[b] = ord[b - 1], ord[b - 1] = t;
        }
    double *a0 = malloc(m * sizeof *a0), *a1 = malloc(m * sizeof *a1);
    if (!a0 || !a1) {
        free(ord), free(a0), free(a1);
        return dragarc_error_set(err, DRAGARC_ENOMEM, "", "out of memory");
    }
    for (size_t k = 0; k < m; k++) {
        double x = cl[ord[k]].downwind;
        double left = k > 0 ? 0.5 * (x - cl[ord[k - 1]].downwind) : -1.0;
        double right = k + 1 < m ? 0.5 * (cl[ord[k + 1]].downwind - x) : -1.0;
        if (left < 0.0)
            left = right > 0.0 ? right : 0.5 * bin_width;
        if (right < 0.0)
            right = left;
        a0[k] = x - left, a1[k] = x + right;
        lo = k == 0 ? a0[k] : fmin(lo, a0[k]);
        hi = k == 0 ? a1[k] : fmax(hi, a1[k]);
    }
    out->bin_width = bin_width;
    out->first_bin = bin_width * floor(fmin(lo, 0.0) / bin_width);
    double nb = ceil((fmax(hi, buffer) - out->first_bin) / bin_width) + 1.0;
    if (!(nb <= MAX_BINS)) {
        free(ord), free(a0), free(a1);
        return dragarc_error_set(err, DRAGARC_EINVAL, "bin_width", "too fine: the deposit spans %.4g m", hi - lo);
    }
    out->nbins = (size_t)nb;
    out->deposit = calloc(out->nbins, sizeof *out->deposit);
    out->class_deposit = calloc(out->nbins * n, sizeof *out->class_deposit);
    if (!out->deposit || !out->class_deposit) {
        free(ord), free(a0), free(a1);
        return dragarc_error_set(err, DRAGARC_ENOMEM, "", "out of memory for %zu bins", out->nbins);
    }
    /* each class's deposit over its interval, split among the bins it overlaps (per metre: / bin_width) */
    for (size_t k = 0; k < m; k++) {
        const dragarc_drift_class *c = &cl[ord[k]];
        double vol = c->fraction * c->water_left, len = a1[k] - a0[k];
        out->deposited_fraction += vol;
        size_t b0 = (size_t)floor((a0[k] - out->first_bin) / bin_width);
        for (size_t b = b0; b < out->nbins; b++) {
            double s0 = out->first_bin + b * bin_width, s1 = s0 + bin_width;
            double ov = fmin(s1, a1[k]) - fmax(s0, a0[k]);
            if (s0 >= a1[k])
                break;
            if (ov > 0.0) {
                double share = len > 0.0 ? vol * ov / len : vol;
                out->deposit[b] += share / bin_width;
                out->class_deposit[ord[k] * out->nbins + b] += share / bin_width;
            }
        }
    }
    /* 90 % and 99 % distances; what is not deposited before the buffer */
    double cum = 0.0;
    for (size_t b = 0; b < out->nbins; b++) {
        double s0 = out->first_bin + b * bin_width, v = out->deposit[b] * bin_width;
        if (isnan(out->distance90) && cum + v >= 0.9)
            out->distance90 = s0 + bin_width * (0.9 - cum) / v;
        if (isnan(out->distance99) && cum + v >= 0.99)
            out->distance99 = s0 + bin_width * (0.99 - cum) / v;
        cum += v;
    }
    out->buffer = buffer;
    out->beyond_buffer = 1.0 - dragarc_drift_deposited_within(out, buffer);
    /* the size whose landing distance is the buffer: interpolated between the classes on either side (by size) */
    for (size_t i = 0; i + 1 < n; i++) {
        const dragarc_drift_class *p = &cl[i], *q = &cl[i + 1];
        if (p->outcome == DRAGARC_DRIFT_LANDED && q->outcome == DRAGARC_DRIFT_LANDED && p->downwind >= buffer &&
            q->downwind < buffer) {
            double u = (p->downwind - buffer) / (p->downwind - q->downwind);
            out->diameter_at_buffer = exp((1.0 - u) * log(p->diameter) + u * log(q->diameter));
        }
    }
    free(ord), free(a0), free(a1);
    return DRAGARC_OK;
}

void dragarc_drift_spec_clear(dragarc_drift_spec *spec)
{
    if (!spec)
        return;
    dragarc_scenario_clear(&spec->base);
    dragarc_spectrum_clear(&spec->spectrum);
    memset(spec, 0, sizeof *spec);
}

int dragarc_drift_spec_run(const dragarc_drift_spec *spec, dragarc_spectrum_class *classes, dragarc_drift_result *out,
                           dragarc_error *err)
{
    memset(out, 0, sizeof *out);
    int rc = dragarc_spectrum_discretise(&spec->spectrum, spec->nclasses, spec->spacing, classes, err);
    if (rc != DRAGARC_OK) {
        dragarc_error_prefix(err, "drift.spectrum");
        return rc;
    }
    rc = dragarc_drift_run(&spec->base, spec->travel, classes, spec->nclasses, spec->bin_width, spec->buffer, out, err);
    if (rc != DRAGARC_OK)
        dragarc_error_prefix(err, "drift");
    return rc;
}

