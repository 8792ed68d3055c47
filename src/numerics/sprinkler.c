/* sprinkler.c: a sprinkler's drops flown class by class and direction by direction, and the water they lay down.
 * SPDX-License-Identifier: GPL-3.0-or-later
 *
 * Each drop (class i, direction j) carries the volume rate W_ij = Q f_i / N_dir (the sprinkler spends equal time
 * on each of the N_dir directions of its arc) times the share of its liquid that reaches the ground. To turn the
 * finite set of landing points into a pattern, each drop stands for a patch of the (class, direction) plane,
 * [i - 1/2, i + 1/2] x [j - 1/2, j + 1/2]: its water is split among K x K sub-samples whose landing points are
 * interpolated bilinearly, in distance and direction from the sprinkler, between the neighbouring drops' (held at
 * the end classes and, on a part circle, at the end directions; wrapped round on a full circle). Every sub-sample's water goes to one grid cell and one ring,
 * so the water is conserved exactly: deposited + evaporated (+ failed flights) = emitted.
 */
#include <math.h>
#include <stdlib.h>
#include <string.h>


#include "core/constants.h"
#include "dragarc/flight.h"
#include "dragarc/sprinkler.h"
#include "dragarc/sweep.h"
#include "numerics/progress.h"

#define SUBSAMPLES 8             /* K: sub-samples per drop and dimension */
#define MAX_CELLS 4000000        /* grid cells allowed */
#define MAX_RINGS 1000000        /* profile rings allowed */

double dragarc_sprinkler_memory_estimate(const dragarc_sprinkler_spec *spec)
{
    const double flights = (double)spec->nclasses * (double)spec->ndirections;
    const double points = spec->layout_given ? (double)spec->layout_points * (double)spec->layout_points : 0.0;
    return flights * (sizeof(dragarc_sprinkler_drop) + sizeof(unsigned)) +
           (double)MAX_CELLS * sizeof(double) + (double)MAX_RINGS * sizeof(double) +
           (double)spec->nclasses * (2.0 * sizeof(double) + sizeof(dragarc_spectrum_class)) +
           points * sizeof(double);
}

void dragarc_sprinkler_clear(dragarc_sprinkler_result *r)
{
    if (!r)
        return;
    free(r->drops);
    free(r->ring_rate);
    free(r->grid_rate);
    memset(r, 0, sizeof *r);
}

void dragarc_sprinkler_class_summary(const dragarc_sprinkler_result *r, size_t i, dragarc_sprinkler_class_stats *o)
{
    double dist = 0.0, time = 0.0, left = 0.0, dmin = INFINITY, dmax = 0.0;
    size_t ok = 0;
    for (size_t j = 0; j < r->ndirections; j++) {
        const dragarc_sprinkler_drop *dr = &r->drops[i * r->ndirections + j];
        if (dr->status != DRAGARC_OK)
            continue;
        ok++;
        dist += dr->distance, time += dr->time, left += dr->water_left;
        dmin = fmin(dmin, dr->distance), dmax = fmax(dmax, dr->distance);
    }
    o->flown = ok;
    o->distance = ok ? dist / ok : NAN;
    o->distance_min = ok ? dmin : NAN;
    o->distance_max = ok ? dmax : NAN;
    o->time = ok ? time / ok : NAN;
    o->water_left = ok ? left / ok : NAN;
}

static int check_request(const dragarc_sprinkler_request *q, dragarc_error *err)
{
    int rc = dragarc_nozzle_check(&q->nozzle, err);
    if (rc != DRAGARC_OK) {
        dragarc_error_prefix(err, "nozzle");
        return rc;
    }
    double arc = q->arc_to - q->arc_from;
    if (!(arc > 0.0 && arc <= 2.0 * DRAGARC_PI * (1.0 + 1e-12)))
        return dragarc_error_set(err, DRAGARC_EINVAL, "arc", "must turn through more than 0 and at most 360 degrees");
    if (q->ndirections < 1 || q->ndirections > 3600)
        return dragarc_error_set(err, DRAGARC_EINVAL, "directions", "must be 1 to 3600 (got %zu)", q->ndirections);
    if (q->nclasses < 1 || q->nclasses > 1000)
        return dragarc_error_set(err, DRAGARC_EINVAL, "classes", "must be 1 to 1000 (got %zu)", q->nclasses);
    double sum = 0.0;
    for (size_t i = 0; i < q->nclasses; i++) {
        if (!(q->diameters[i] > 0.0) || (i > 0 && !(q->diameters[i] > q->diameters[i - 1])))
            return dragarc_error_set(err, DRAGARC_EINVAL, "diameters", "must be positive and increasing");
        if (!(q->fractions[i] >= 0.0))
            return dragarc_error_set(err, DRAGARC_EINVAL, "fractions", "must be 0 or more");
        sum += q->fractions[i];
    }
    if (!(fabs(sum - 1.0) <= 1e-9))
        return dragarc_error_set(err, DRAGARC_EINVAL, "fractions", "must sum to 1 (got %.12g)", sum);
    if (!(q->ring_width > 0.0) || !(q->cell > 0.0))
        return dragarc_error_set(err, DRAGARC_EINVAL, q->ring_width > 0.0 ? "cell" : "ring_width", "must be positive");
    return DRAGARC_OK;
}

/* One drop: class diameter d, azimuth az. */
static void fly_drop(const dragarc_scenario *base, double speed, double d, double az, dragarc_sprinkler_drop *o,
                     unsigned *notes)
{
    dragarc_scenario s = *base; /* shallow: the drag table and wind layers are only read */
    dragarc_error e;
    s.launch.speed = speed;
    s.launch.azimuth = az;
    o->status = dragarc_scenario_set(&s, "projectile.diameter", d, &e);
    if (o->status != DRAGARC_OK)
        return;
    dragarc_flight f;
    o->status = dragarc_flight_run(&s, 0.0, &f, &e);
    if (o->status == DRAGARC_OK) {
        o->x = f.impact[0], o->y = f.impact[1];
        o->distance = hypot(o->x, o->y);
        o->time = f.time_of_flight;
        o->evaporated = f.evaporated;
        /* the liquid that reached the ground, as a share of what left the nozzle (the residue has the drop's
         * density; a drop that vanished in the air delivers nothing) */
        double res = s.projectile.evaporation.enabled ? s.projectile.evaporation.nonvolatile_fraction : 0.0;
        o->water_left = f.evaporated ? 0.0 : s.projectile.evaporation.enabled ? fmax(f.impact[7], res) : 1.0;
        *notes = f.notes;
    }
    dragarc_flight_clear(&f);
}

/* The landing point at (class coordinate c, direction coordinate a) by bilinear interpolation between drops. */
static void landing_at(const dragarc_sprinkler_result *r, int full, double c, double a, const dragarc_sprinkler_drop *own,
                       double *x, double *y)
{
    const size_t nc = r->nclasses, nd = r->ndirections;
    c = fmin(fmax(c, 0.0), (double)(nc - 1));
    if (!full)
        a = fmin(fmax(a, 0.0), (double)(nd - 1));
    double fc = floor(c), fa = floor(a);
    size_t i0 = (size_t)fc, i1 = i0 + 1 < nc ? i0 + 1 : i0;
    long j0l = (long)fa;
    size_t j0 = (size_t)((j0l % (long)nd + (long)nd) % (long)nd), j1 = (j0 + 1) % nd;
    if (!full && j0 + 1 >= nd)
        j1 = j0;
    const dragarc_sprinkler_drop *p[4] = {&r->drops[i0 * nd + j0], &r->drops[i0 * nd + j1], &r->drops[i1 * nd + j0],
                                          &r->drops[i1 * nd + j1]};
    for (int k = 0; k < 4; k++)
        if (p[k]->status != DRAGARC_OK || p[k]->evaporated) {
            *x = own->x, *y = own->y; /* a neighbour that never landed: the drop's own point */
            return;
        }
    /* In polar form about the sprinkler: the radius and the direction (unwrapped about the first corner's)
     * interpolated, so that points between two directions lie on the arc between them, not on its chord. */
    double u = c - fc, v = a - fa, rr[4], ph[4];
    for (int k = 0; k < 4; k++) {
        rr[k] = hypot(p[k]->x, p[k]->y);
        ph[k] = atan2(p[k]->x, p[k]->y);
        if (k > 0)
            ph[k] = ph[0] + remainder(ph[k] - ph[0], 2.0 * DRAGARC_PI);
    }
    double rad = (1 - u) * ((1 - v) * rr[0] + v * rr[1]) + u * ((1 - v) * rr[2] + v * rr[3]);
    double phi = (1 - u) * ((1 - v) * ph[0] + v * ph[1]) + u * ((1 - v) * ph[2] + v * ph[3]);
    *x = rad * sin(phi);
    *y = rad * cos(phi);
}

int dragarc_sprinkler_run(const dragarc_scenario *base, const dragarc_sprinkler_request *req,
                          dragarc_sprinkler_result *out, dragarc_error *err)
{
    memset(out, 0, sizeof *out);
    int rc = check_request(req, err);
    if (rc != DRAGARC_OK)
        return rc;
    const size_t nc = req->nclasses, nd = req->ndirections, n = nc * nd;
    const double arc = fmin(req->arc_to - req->arc_from, 2.0 * DRAGARC_PI);
    const int full = arc >= 2.0 * DRAGARC_PI * (1.0 - 1e-12);
    out->exit_speed = dragarc_nozzle_exit_speed(&req->nozzle);
    out->flow = dragarc_nozzle_flow(&req->nozzle);
    out->nclasses = nc, out->ndirections = nd;
    out->drops = calloc(n, sizeof *out->drops);
    unsigned *notes = calloc(n, sizeof *notes);
    if (!out->drops || !notes) {
        free(notes);
        return dragarc_error_set(err, DRAGARC_ENOMEM, "", "out of memory for %zu flights", n);
    }
    const double speed = out->exit_speed;
    dragarc_sprinkler_drop *drops = out->drops;
    progress_count prog = progress_start(req->progress, req->progress_user, n, 16);
#pragma omp parallel for schedule(dynamic) default(none) shared(base, req, drops, notes, n, nd, speed, arc, full, prog)
    for (size_t k = 0; k < n; k++) {
        size_t i = k / nd, j = k % nd;
        double az = req->arc_from + arc * (full ? (j + 0.5) / nd : nd > 1 ? (double)j / (nd - 1) : 0.5);
        fly_drop(base, speed, req->diameters[i], az, &drops[k], &notes[k]);
        progress_step(&prog);
    }
    double xmin = 0.0, xmax = 0.0, ymin = 0.0, ymax = 0.0, rmax = 0.0;
    for (size_t k = 0; k < n; k++) {
        out->notes |= notes[k];
        if (drops[k].status != DRAGARC_OK) {
            out->nfailed++;
            continue;
        }
        xmin = fmin(xmin, drops[k].x), xmax = fmax(xmax, drops[k].x);
        ymin = fmin(ymin, drops[k].y), ymax = fmax(ymax, drops[k].y);
        rmax = fmax(rmax, drops[k].distance);
    }
    free(notes);
    if (out->nfailed == n) {
        /* every flight failed: report the first one's error */
        dragarc_scenario s = *base;
        s.launch.speed = speed;
        dragarc_flight f;
        dragarc_scenario_set(&s, "projectile.diameter", req->diameters[0], NULL);
        rc = dragarc_flight_run(&s, 0.0, &f, err);
        dragarc_flight_clear(&f);
        return rc != DRAGARC_OK ? rc : dragarc_error_set(err, DRAGARC_ESOLVER, "", "no drop could be flown");
    }
    const double c = req->cell;
    out->cell = c;
    out->x0 = c * (floor(xmin / c) - 1.0), out->y0 = c * (floor(ymin / c) - 1.0);
    double nxd = ceil((xmax - out->x0) / c) + 1.0, nyd = ceil((ymax - out->y0) / c) + 1.0;
    double nrd = ceil(rmax / req->ring_width) + 1.0;
    if (!(nxd * nyd <= MAX_CELLS) || !(nrd <= MAX_RINGS))
        return dragarc_error_set(err, DRAGARC_EINVAL, !(nrd <= MAX_RINGS) ? "ring_width" : "cell",
                                 "too fine for a pattern %.4g m across: more than %d cells", 2.0 * rmax,
                                 !(nrd <= MAX_RINGS) ? MAX_RINGS : MAX_CELLS);
    out->nx = (size_t)nxd, out->ny = (size_t)nyd, out->nrings = (size_t)nrd;
    out->grid_rate = calloc(out->nx * out->ny, sizeof *out->grid_rate);
    out->ring_rate = calloc(out->nrings, sizeof *out->ring_rate);
    if (!out->grid_rate || !out->ring_rate)
        return dragarc_error_set(err, DRAGARC_ENOMEM, "", "out of memory for the pattern");
    /* Spread the water (m^3/s) over cells and rings. */
    double emitted = 0.0, deposited = 0.0, evaporated = 0.0;
    for (size_t i = 0; i < nc; i++)
        for (size_t j = 0; j < nd; j++) {
            const dragarc_sprinkler_drop *dr = &drops[i * nd + j];
            double w = out->flow * req->fractions[i] / nd;
            emitted += w;
            if (dr->status != DRAGARC_OK)
                continue;
            evaporated += w * (1.0 - dr->water_left);
            double wl = w * dr->water_left / (SUBSAMPLES * SUBSAMPLES);
            if (!(wl > 0.0))
                continue;
            for (int a = 0; a < SUBSAMPLES; a++)
                for (int b = 0; b < SUBSAMPLES; b++) {
                    double x, y;
                    landing_at(out, full, i + (a + 0.5) / SUBSAMPLES - 0.5, j + (b + 0.5) / SUBSAMPLES - 0.5, dr, &x, &y);
                    size_t ci = (size_t)fmax(0.0, fmin((double)out->nx - 1, floor((x - out->x0) / c)));
                    size_t cj = (size_t)fmax(0.0, fmin((double)out->ny - 1, floor((y - out->y0) / c)));
                    size_t rk = (size_t)fmin((double)out->nrings - 1, floor(hypot(x, y) / req->ring_width));
                    out->grid_rate[cj * out->nx + ci] += wl;
                    out->ring_rate[rk] += wl;
                    deposited += wl;
                }
        }
    out->deposited_fraction = deposited / emitted;
    out->evaporated_fraction = evaporated / emitted;
    /* m^3/s over an area -> mm/h */
    const double to_mm_h = 1000.0 * 3600.0;
    for (size_t k = 0; k < out->nx * out->ny; k++)
        out->grid_rate[k] *= to_mm_h / (c * c);
    for (size_t k = 0; k < out->nrings; k++) {
        double w = req->ring_width, area = 0.5 * arc * ((k + 1.0) * (k + 1.0) - (double)k * k) * w * w;
        out->ring_rate[k] *= to_mm_h / area;
        if (out->ring_rate[k] >= DRAGARC_WETTED_RATE)
            out->wetted_radius = (k + 1.0) * w;
    }
    return DRAGARC_OK;
}

void dragarc_sprinkler_spec_clear(dragarc_sprinkler_spec *spec)
{
    if (!spec)
        return;
    dragarc_scenario_clear(&spec->base);
    dragarc_spectrum_clear(&spec->spectrum);
    memset(spec, 0, sizeof *spec);
}

int dragarc_sprinkler_overlap(const dragarc_sprinkler_result *r, const dragarc_layout *l, size_t points,
                              dragarc_overlap *o, dragarc_error *err)
{
    memset(o, 0, sizeof *o);
    dragarc_spray_pattern *pat = NULL;
    int rc = dragarc_spray_pattern_grid(r->x0 + 0.5 * r->cell, r->y0 + 0.5 * r->cell, r->cell, r->cell, r->nx, r->ny,
                                        r->grid_rate, &pat, err);
    if (rc == DRAGARC_OK)
        rc = dragarc_overlap_run(pat, l, points, points, o, err);
    dragarc_spray_pattern_free(pat);
    return rc;
}

int dragarc_sprinkler_spec_run(const dragarc_sprinkler_spec *spec, dragarc_spectrum_class *classes,
                               void (*progress)(size_t done, size_t total, void *user), void *user,
                               dragarc_sprinkler_result *out, dragarc_error *err)
{
    memset(out, 0, sizeof *out);
    int rc = dragarc_spectrum_discretise(&spec->spectrum, spec->nclasses, spec->spacing, classes, err);
    if (rc != DRAGARC_OK) {
        dragarc_error_prefix(err, "sprinkler.spectrum");
        return rc;
    }
    double *d = malloc(spec->nclasses * sizeof *d), *f = malloc(spec->nclasses * sizeof *f);
    if (!d || !f) {
        free(d), free(f);
        return dragarc_error_set(err, DRAGARC_ENOMEM, "", "out of memory for %zu classes", spec->nclasses);
    }
    for (size_t i = 0; i < spec->nclasses; i++)
        d[i] = classes[i].diameter, f[i] = classes[i].fraction;
    dragarc_sprinkler_request q = {spec->nozzle, spec->arc_from, spec->arc_to, spec->ndirections, spec->nclasses,
                                   d, f, spec->ring_width, spec->cell, progress, user};
    rc = dragarc_sprinkler_run(&spec->base, &q, out, err);
    if (rc != DRAGARC_OK)
        dragarc_error_prefix(err, "sprinkler");
    free(d), free(f);
    if (rc == DRAGARC_OK && spec->layout_given) {
        /* the pattern on the grid's cell centres, overlapped with its neighbours on the layout */
        dragarc_overlap ov;
        rc = dragarc_sprinkler_overlap(out, &spec->layout, spec->layout_points, &ov, err);
        if (rc == DRAGARC_OK) {
            out->layout_done = 1;
            out->layout = spec->layout;
            out->layout_points = spec->layout_points;
            out->cell_width = ov.width, out->cell_height = ov.height;
            out->layout_stats = ov.stats;
        } else {
            dragarc_error_prefix(err, "sprinkler");
        }
        dragarc_overlap_clear(&ov);
    }
    return rc;
}
