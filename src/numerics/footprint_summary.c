/* footprint_summary.c: the statistics of a footprint's impacts, by class and together (footprint.h).
 * SPDX-License-Identifier: GPL-3.0-or-later
 *
 * Everything here is scatter.h's weighted statistics and casualty.h's expectation, applied to the landed samples
 * of each class and then of all classes. A sample stands for count / samples real fragments. The statistics of
 * where fragments land (moments, ellipses, quantiles) weigh each sample by that, scaled so that the weights sum
 * to the number of landed samples: the covariance's divisor is then n - 1, the unbiased one for n samples
 * (within one class every weight is 1), whatever the fragment count. Densities, hazardous shares and E_c count
 * real fragments.
 */
#include <math.h>
#include <stdio.h>
#include <stdlib.h>
#include <string.h>

#include "core/constants.h"
#include "dragarc/footprint.h"

const double dragarc_footprint_quantile_probs[DRAGARC_FOOTPRINT_NQ] = {0.0005, 0.005, 0.05, 0.5, 0.95, 0.995, 0.9995};
const double dragarc_footprint_value_probs[DRAGARC_FOOTPRINT_NVQ] = {0.05, 0.5, 0.95, 0.99};
const double dragarc_footprint_region_probs[DRAGARC_FOOTPRINT_NREGIONS] = {0.9, 0.99, 0.999};

void dragarc_footprint_summary_clear(dragarc_footprint_summary *s)
{
    if (!s)
        return;
    free(s->groups);
    dragarc_scatter_grid_clear(&s->grid);
    for (int k = 0; k < DRAGARC_FOOTPRINT_NREGIONS; k++)
        dragarc_scatter_region_clear(&s->region[k]);
    memset(s, 0, sizeof *s);
}

typedef struct columns {
    size_t n;
    double *e, *nn, *w, *speed, *energy, *time; /* w: the samples' weights scaled to sum to n */
    double scale;                               /* that scale: real fragments = w / scale */
} columns;

/* The landed impacts of class cls (or of all classes when cls is nclasses) into the columns. */
static void gather(const dragarc_footprint_spec *spec, const dragarc_impact *im, size_t cls, columns *c)
{
    size_t total = spec->nclasses * spec->samples, lo = 0, hi = total;
    if (cls < spec->nclasses)
        lo = cls * spec->samples, hi = lo + spec->samples;
    c->n = 0;
    double sum = 0.0;
    for (size_t k = lo; k < hi; k++) {
        if (im[k].status != DRAGARC_OK)
            continue;
        size_t i = c->n++;
        c->e[i] = im[k].east, c->nn[i] = im[k].north, c->w[i] = im[k].weight;
        c->speed[i] = im[k].speed, c->energy[i] = im[k].energy, c->time[i] = im[k].time;
        sum += im[k].weight;
    }
    c->scale = sum > 0.0 ? (double)c->n / sum : 1.0;
    for (size_t i = 0; i < c->n; i++)
        c->w[i] *= c->scale;
}

static double median(const columns *c, const double *v)
{
    double p = 0.5, q = NAN;
    if (dragarc_scatter_quantiles(c->n, v, c->w, &p, 1, &q, NULL) != DRAGARC_OK)
        return NAN;
    return q;
}

static double largest(const columns *c, const double *v)
{
    double m = 0.0;
    for (size_t i = 0; i < c->n; i++)
        m = fmax(m, v[i]);
    return m;
}

static void note(dragarc_footprint_summary *s, const char *what, const dragarc_error *e)
{
    if (!s->note[0])
        snprintf(s->note, sizeof s->note, "%s: %s", what, e->message);
}

static void group_stats(const dragarc_footprint_spec *spec, const columns *c, double azimuth, size_t flights,
                        dragarc_footprint_group *g, dragarc_footprint_summary *s, const char *name)
{
    dragarc_error e;
    g->flights = flights, g->landed = c->n;
    for (size_t i = 0; i < c->n; i++)
        g->fragments += c->w[i] / c->scale;
    for (int q = 0; q < DRAGARC_FOOTPRINT_NQ; q++)
        g->down[q] = g->cross[q] = NAN;
    g->speed_median = g->energy_mean = g->energy_median = g->time_median = NAN;
    for (int q = 0; q < DRAGARC_FOOTPRINT_NVQ; q++)
        g->speed_q[q] = g->energy_q[q] = NAN;
    if (c->n == 0)
        return;
    dragarc_scatter_quantiles(c->n, c->speed, c->w, dragarc_footprint_value_probs, DRAGARC_FOOTPRINT_NVQ, g->speed_q,
                              NULL);
    dragarc_scatter_quantiles(c->n, c->energy, c->w, dragarc_footprint_value_probs, DRAGARC_FOOTPRINT_NVQ,
                              g->energy_q, NULL);
    g->speed_median = median(c, c->speed), g->speed_max = largest(c, c->speed);
    g->energy_median = median(c, c->energy), g->energy_max = largest(c, c->energy);
    g->time_median = median(c, c->time);
    dragarc_scatter_mean(c->n, c->energy, c->w, &g->energy_mean, NULL);
    /* hazardous over all by weight: 1 - below / n went a rounding below 0 when no fragment was hazardous */
    double above = 0.0, all = 0.0;
    for (size_t i = 0; i < c->n; i++) {
        all += c->w[i];
        if (dragarc_fragment_is_hazardous(c->energy[i], spec->hazard.energy_threshold))
            above += c->w[i];
    }
    g->hazardous_share = all > 0.0 ? above / all : 0.0;
    if (dragarc_scatter_extent(c->n, c->e, c->nn, c->w, azimuth, dragarc_footprint_quantile_probs, DRAGARC_FOOTPRINT_NQ,
                               g->down, g->cross, &e) != DRAGARC_OK)
        note(s, name, &e);
    if (dragarc_scatter_moments(c->n, c->e, c->nn, c->w, g->mean, g->cov, &e) != DRAGARC_OK) {
        note(s, name, &e);
        return;
    }
    g->moments_ok = 1;
    for (int k = 0; k < 3; k++) {
        if (dragarc_scatter_ellipse_of(g->mean, g->cov, k + 1.0, &g->ellipse[k], &e) != DRAGARC_OK) {
            note(s, name, &e);
            return;
        }
        dragarc_scatter_fraction_inside(c->n, c->e, c->nn, c->w, &g->ellipse[k], &g->inside[k], NULL);
    }
    g->ellipses_ok = 1;
}

int dragarc_footprint_summarise(const dragarc_footprint_spec *spec, const dragarc_impact *im,
                                const dragarc_population *pop, dragarc_footprint_summary *out, dragarc_error *err)
{
    memset(out, 0, sizeof *out);
    const size_t total = spec->nclasses * spec->samples;
    const double *v = spec->breakup.velocity;
    out->azimuth = hypot(v[0], v[1]) > 0.0 ? atan2(v[0], v[1]) : 0.0;
    out->ngroups = spec->nclasses + 1;
    out->groups = calloc(out->ngroups, sizeof *out->groups);
    columns c = {0, malloc(total * sizeof(double)), malloc(total * sizeof(double)), malloc(total * sizeof(double)),
                 malloc(total * sizeof(double)), malloc(total * sizeof(double)), malloc(total * sizeof(double)), 1.0};
    dragarc_impact_point *pts = malloc(total * sizeof *pts);
    double *contrib = malloc(total * sizeof *contrib);
    int rc = DRAGARC_OK;
    if (!out->groups || !c.e || !c.nn || !c.w || !c.speed || !c.energy || !c.time || !pts || !contrib) {
        rc = dragarc_error_set(err, DRAGARC_ENOMEM, "", "out of memory for the statistics of %zu impacts", total);
        goto done;
    }
    for (size_t g = 0; g < out->ngroups; g++) {
        char name[96];
        if (g < spec->nclasses)
            snprintf(name, sizeof name, "fragments[%zu]", g);
        else
            snprintf(name, sizeof name, "all fragments");
        gather(spec, im, g, &c);
        group_stats(spec, &c, out->azimuth, g < spec->nclasses ? spec->samples : total, &out->groups[g], out, name);
    }
    /* c now holds every landed impact: the density grid and its regions */
    dragarc_error e;
    if (c.n > 0 && dragarc_scatter_grid_build(c.n, c.e, c.nn, c.w, spec->cell, DRAGARC_SCATTER_WEIGHT_PER_KM2,
                                              &out->grid, &e) == DRAGARC_OK) {
        /* built on the scaled weights (the automatic cell needs their sum above 1): back to fragments per km^2 */
        for (size_t k = 0; k < out->grid.nx * out->grid.ny; k++)
            out->grid.value[k] /= c.scale;
        out->grid.total_weight /= c.scale;
        out->grid_ok = 1;
        for (int k = 0; k < DRAGARC_FOOTPRINT_NREGIONS && out->grid_ok; k++)
            if (dragarc_scatter_region_of(&out->grid, dragarc_footprint_region_probs[k], &out->region[k], &e) !=
                DRAGARC_OK) {
                note(out, "contours", &e);
                out->grid_ok = 0;
            }
    } else if (c.n > 0) {
        note(out, "density grid", &e);
    }
    /* the casualty expectation, class by class from each point's term */
    if (pop) {
        const dragarc_person person = {DRAGARC_PERSON_RADIUS, DRAGARC_PERSON_HEIGHT};
        size_t n = 0;
        for (size_t k = 0; k < total; k++) {
            if (im[k].status != DRAGARC_OK)
                continue;
            double gam = fmin(fmax(im[k].angle, 1e-6), 0.5 * DRAGARC_PI);
            pts[n++] = (dragarc_impact_point){im[k].east, im[k].north, im[k].weight,
                                              dragarc_casualty_area(im[k].area, &person, gam), im[k].energy};
        }
        dragarc_casualty_options opt = {spec->hazard.energy_threshold,
                                        {spec->hazard.sheltered_share, spec->hazard.shelter_protection}};
        if ((rc = dragarc_casualty_expectation(pts, n, pop, &opt, contrib, &out->casualty, err)) != DRAGARC_OK)
            goto done;
        out->casualty_done = 1;
        n = 0;
        for (size_t k = 0; k < total; k++)
            if (im[k].status == DRAGARC_OK)
                out->groups[im[k].cls].expected_casualties += contrib[n++];
        out->groups[spec->nclasses].expected_casualties = out->casualty.expected_casualties;
    }
done:
    free(c.e), free(c.nn), free(c.w), free(c.speed), free(c.energy), free(c.time), free(pts), free(contrib);
    return rc;
}
