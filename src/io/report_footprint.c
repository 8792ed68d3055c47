/* report_footprint.c: the `footprint` report kind: a breakup's inputs and fragment classes, where the fragments come
 * down (per class and all together), the contours, the impact energies, the casualty expectation against the
 * published criteria (references, not approval), the maps, the cautions and the models with their sources.
 * SPDX-License-Identifier: GPL-3.0-or-later
 *
 * Fills a dragarc_report (report.h) from a footprint scenario, its impacts and their summary (footprint.h), in SI
 * units as `footprint` prints them; the numbers are the summary's own, the cautions the same texts.
 */
#include <math.h>
#include <stdio.h>
#include <string.h>

#include "dragarc/cautions.h"
#include "dragarc/casualty.h"
#include "dragarc/geodesy.h"
#include "dragarc/plot.h"
#include "dragarc/report.h"
#include "io/report_kind.h"

#define DEG REPORT_DEG

static const char *const DV_NAME[] = {"none", "fixed", "uniform", "Maxwellian"};

static int inputs(dragarc_report *r, const dragarc_footprint_spec *sp, const dragarc_footprint_summary *s,
                  dragarc_error *err)
{
    report_pairs p = {.n = 0};
    const dragarc_breakup *b = &sp->breakup;
    const double *v = b->velocity;
    double vh = hypot(v[0], v[1]), lon = dragarc_geo_normalize_longitude(b->longitude);
    report_add(&p, "breakup", "%.5f%s %.5f%s, %.0f m above the datum", fabs(b->latitude), b->latitude >= 0 ? "N" : "S",
               fabs(lon), lon >= 0 ? "E" : "W", b->altitude);
    report_add(&p, "velocity", "%.1f m/s at %.1f deg, heading %.0f deg", hypot(vh, v[2]), atan2(v[2], vh) * DEG,
               fmod(s->azimuth * DEG + 360.0, 360.0));
    if (b->covariance_given)
        report_add(&p, "spread", "a 6 x 6 covariance of position and velocity");
    else
        report_add(&p, "spread (1 sd)", "position %.3g, %.3g, %.3g m; speed %.3g m/s; path angle %.3g deg; heading %.3g "
                   "deg", b->sd_position[0], b->sd_position[1], b->sd_position[2], b->sd_speed,
                   b->sd_path_angle * DEG, b->sd_heading * DEG);
    const dragarc_wind_spread *w = &sp->wind_spread;
    if (w->nprofiles > 0)
        report_add(&p, "wind", "one of %zu profiles, picked at random for each sample", w->nprofiles);
    else
        report_add(&p, "wind spread (1 sd)", "speed factor %.3g, direction %.3g deg", w->speed_sd, w->direction_sd * DEG);
    report_add(&p, "samples", "%zu per class, %zu flights, seed %llu", sp->samples, sp->samples * sp->nclasses,
               (unsigned long long)sp->seed);
    report_add(&p, "hazard energy", "%.4g J", sp->hazard.energy_threshold);
    const dragarc_hazard_options *h = &sp->hazard;
    if (!h->population_given)
        report_add(&p, "population", "none given: no casualty expectation");
    else if (h->population_file[0])
        report_add(&p, "population", "from %.100s (%.3g people/km2 outside it)", h->population_file, h->background);
    else
        report_add(&p, "population", "%.4g people/km2 everywhere", h->density);
    if (h->population_given)
        report_add(&p, "sheltering", "%.0f %% sheltered at %.0f %% protection", 100.0 * h->sheltered_share,
                   100.0 * h->shelter_protection);
    dragarc_display si;
    dragarc_display_si(&si);
    report_air_inputs(&p, &sp->base, &si);
    int rc = report_pairs_emit(r, "Breakup", &p, err);
    if (rc != DRAGARC_OK)
        return rc;

    /* the fragment classes */
    enum { COLS = 8 };
    static const char *const head[COLS] = {"class", "count", "mass (kg)", "area (m2)", "ballistic coefficient (kg/m2)",
                                           "beta spread (sd of ln)", "delta-V", "delta-V speed (m/s)"};
    static const int numeric[COLS] = {0, 1, 1, 1, 1, 1, 0, 1};
    report_grid g;
    rc = report_grid_init(&g, sp->nclasses, COLS, err);
    for (size_t i = 0; rc == DRAGARC_OK && i < sp->nclasses; i++) {
        const dragarc_fragment_class *c = &sp->classes[i];
        report_grid_set(&g, i, 0, "%s", c->name[0] ? c->name : "(unnamed)");
        report_grid_set(&g, i, 1, "%.4g", c->count);
        report_grid_set(&g, i, 2, "%.4g", c->mass);
        report_grid_set(&g, i, 3, "%.4g", c->area);
        report_grid_set(&g, i, 4, "%.4g", dragarc_fragment_beta(c));
        report_grid_number(&g, i, 5, 2, c->beta_sd);
        report_grid_set(&g, i, 6, "%s", DV_NAME[c->dv >= 0 && c->dv <= DRAGARC_DV_MAXWELLIAN ? c->dv : 0]);
        report_grid_number(&g, i, 7, 1, c->dv_speed);
    }
    if (rc == DRAGARC_OK)
        rc = report_grid_emit(r, "Fragment classes", &g, head, numeric, err);
    report_grid_free(&g);
    return rc;
}

/* One row per class and one for all fragments, as `footprint` prints them. */
static int groups_table(dragarc_report *r, const dragarc_footprint_spec *sp, const dragarc_footprint_summary *s,
                        dragarc_error *err)
{
    enum { COLS = 9 };
    static const char *const head[COLS] = {
        "class", "fragments", "flights landed", "mean east, north (m)", "1\xcf\x83 ellipse (m \xc3\x97 m, deg)",
        "median speed (m/s)", "most energy (J)", "\xe2\x89\xa5 hazard energy (%)", "E_c"};
    static const int numeric[COLS] = {0, 1, 1, 1, 1, 1, 1, 1, 1};
    report_grid g;
    int rc = report_grid_init(&g, s->ngroups, COLS, err);
    for (size_t i = 0; rc == DRAGARC_OK && i < s->ngroups; i++) {
        const dragarc_footprint_group *q = &s->groups[i];
        report_grid_set(&g, i, 0, "%s", i + 1 == s->ngroups ? "all" : sp->classes[i].name[0] ? sp->classes[i].name : "-");
        report_grid_set(&g, i, 1, "%.4g", q->fragments);
        report_grid_set(&g, i, 2, "%zu/%zu", q->landed, q->flights);
        if (q->moments_ok)
            report_grid_set(&g, i, 3, "%.0f, %.0f", q->mean[0] + 0.0, q->mean[1] + 0.0);
        if (q->ellipses_ok)
            report_grid_set(&g, i, 4, "%.0f x %.0f, %.0f", q->ellipse[0].semi_major, q->ellipse[0].semi_minor,
                            fmod(q->ellipse[0].azimuth * DEG + 360.0, 180.0));
        if (q->landed > 0) {
            report_grid_number(&g, i, 5, 1, q->speed_median);
            report_grid_set(&g, i, 6, "%.3g", q->energy_max);
            report_grid_number(&g, i, 7, 1, 100.0 * q->hazardous_share);
        }
        if (s->casualty_done)
            report_grid_set(&g, i, 8, "%.2e", q->expected_casualties);
    }
    if (rc == DRAGARC_OK)
        rc = report_grid_emit(r, "Where the fragments come down", &g, head, numeric, err);
    report_grid_free(&g);
    return rc;
}

static int summary(dragarc_report *r, const dragarc_footprint_spec *sp, const dragarc_footprint_summary *s,
                   dragarc_error *err)
{
    report_pairs p = {.n = 0};
    const dragarc_footprint_group *all = &s->groups[s->ngroups - 1];
    if (all->landed > 0) {
        report_add(&p, "downrange", "99 %% between %.0f and %.0f m, 99.9 %% between %.0f and %.0f m (along %.0f deg)",
                   all->down[1] + 0.0, all->down[5] + 0.0, all->down[0] + 0.0, all->down[6] + 0.0,
                   fmod(s->azimuth * DEG + 360.0, 360.0));
        report_add(&p, "crossrange", "99 %% between %.0f and %.0f m, 99.9 %% between %.0f and %.0f m (right +)",
                   all->cross[1] + 0.0, all->cross[5] + 0.0, all->cross[0] + 0.0, all->cross[6] + 0.0);
        report_add(&p, "impacts", "speed up to %.1f m/s, energy up to %.4g J", all->speed_max, all->energy_max);
    }
    if (s->grid_ok)
        for (int k = 0; k < DRAGARC_FOOTPRINT_NREGIONS; k++) {
            char key[32];
            snprintf(key, sizeof key, "%g %% contour", 100.0 * s->region[k].probability);
            report_add(&p, key, "%.4g km2 in %zu piece%s (cells of %.4g m)", s->region[k].area * 1e-6,
                       s->region[k].npolygons, s->region[k].npolygons == 1 ? "" : "s", s->grid.cell);
        }
    if (s->note[0])
        report_add(&p, "note", "%.150s", s->note);
    if (s->casualty_done) {
        report_add(&p, "expected casualties", "E_c = %.3e", s->casualty.expected_casualties);
        if (sp->hazard.criterion > 0.0)
            report_add(&p, "your criterion", "%.3g: E_c is %s it", sp->hazard.criterion,
                       s->casualty.expected_casualties <= sp->hazard.criterion ? "within" : "ABOVE");
    } else {
        report_add(&p, "expected casualties", "not estimated: the scenario gives no hazard.population");
    }
    int rc = report_pairs_emit(r, "Summary", &p, err);
    return rc == DRAGARC_OK ? report_published_criteria(r, err) : rc;
}

typedef struct plot_job {
    const dragarc_footprint_spec *sp;
    const dragarc_impact *impacts;
    const dragarc_footprint_summary *s;
} plot_job;

static int draw_footprint(const char *path, const void *ctx, dragarc_error *err)
{
    const plot_job *j = ctx;
    return dragarc_footprint_plot(path, j->sp, j->impacts, j->s, NULL, err);
}

int dragarc_report_footprint(dragarc_report *r, const char *where, const dragarc_footprint_spec *sp,
                             const dragarc_impact *impacts, const dragarc_footprint_summary *s, dragarc_error *err)
{
    if (!s || s->ngroups != sp->nclasses + 1 || !s->groups)
        return dragarc_error_set(err, DRAGARC_EINVAL, "", "a footprint report needs a summarised run");
    char line[4200];
    snprintf(line, sizeof line, "Scenario file %s: where the fragments of a breakup come down, Monte Carlo. SI units; "
             "east and north of the point below the breakup.", where ? where : "");
    const char *cautions[DRAGARC_CAUTIONS_MAX];
    size_t nc = dragarc_cautions_notes(DRAGARC_NOTE_DEBRIS, cautions, DRAGARC_CAUTIONS_MAX);
    plot_job job = {sp, impacts, s};
    int rc;
    if ((rc = dragarc_report_subtitle(r, line, err)) != DRAGARC_OK ||
        (rc = dragarc_report_section(r, "Inputs", err)) != DRAGARC_OK ||
        (rc = inputs(r, sp, s, err)) != DRAGARC_OK ||
        (rc = dragarc_report_section(r, "Results", err)) != DRAGARC_OK ||
        (rc = groups_table(r, sp, s, err)) != DRAGARC_OK || (rc = summary(r, sp, s, err)) != DRAGARC_OK ||
        (rc = dragarc_report_section(r, "Figures", err)) != DRAGARC_OK ||
        (rc = dragarc_report_figure_draw(r,
                                         "The impact points (those at or above the hazard energy marked apart) with the "
                                         "1 and 3 sigma ellipses; the density of fragments per km2 with the 90, 99 and "
                                         "99.9 % contours. East and north of the point below the breakup.",
                                         draw_footprint, &job, err)) != DRAGARC_OK ||
        (rc = dragarc_report_section(r, "Cautions", err)) != DRAGARC_OK ||
        (rc = dragarc_report_cautions(r, nc, cautions, err)) != DRAGARC_OK ||
        (rc = report_flight_sources(r, &sp->base, sp->base.solver.method, err)) != DRAGARC_OK ||
        (rc = dragarc_report_source(r, "random streams", "GSL's MT19937 for each sample, seeded by SplitMix64 of the "
                                    "run's seed, the class and the sample",
                                    "Matsumoto, M. & Nishimura, T. (1998), ACM TOMACS 8(1); Steele, G. L., Lea, D. & "
                                    "Flood, C. H. (2014), OOPSLA", err)) != DRAGARC_OK ||
        (rc = dragarc_report_source(r, "ellipses", "k-sigma ellipses of the weighted covariance, containment "
                                    "1 - exp(-k^2/2) of a 2-D normal", "dragarc, docs/models.md (impact statistics)",
                                    err)) != DRAGARC_OK ||
        (rc = dragarc_report_source(r, "geodesy", "WGS 84 geodesics through PROJ",
                                    "Karney, C. F. F. (2013), Algorithms for geodesics, J. Geodesy 87", err)) !=
            DRAGARC_OK)
        return rc;
    if (!s->casualty_done)
        return DRAGARC_OK;
    return dragarc_report_source(r, "casualty expectation", "E_c = sum of w rho A_C over the impacts at or above the "
                                 "hazard energy, casualty area pi (R_P + R_F)^2 with a slant term",
                                 "RCC 321 supplement and the FAA Flight Safety Analysis Handbook (2011), recalled; "
                                 "14 CFR 417.107(c)(1) for the 11 ft-lbf threshold", err);
}
