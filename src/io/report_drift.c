/* report_drift.c: the `drift` report kind: a spray's inputs, where each drop size comes down, the deposit downwind,
 * the distances and the airborne share, the figure, the cautions and the models with their sources.
 * SPDX-License-Identifier: GPL-3.0-or-later
 *
 * Fills a dragarc_report (report.h) from a drift scenario and its result (drift.h), in SI units as `drift` prints
 * them; the class table is the one `drift` prints and the cautions the same texts.
 */
#include <math.h>
#include <stdio.h>
#include <string.h>

#include "dragarc/cautions.h"
#include "dragarc/report.h"
#include "io/report_kind.h"

#define DEG REPORT_DEG

static int inputs(dragarc_report *r, const dragarc_drift_spec *sp, const dragarc_drift_result *res,
                  dragarc_error *err)
{
    report_pairs p = {.n = 0};
    const dragarc_scenario *b = &sp->base;
    report_add(&p, "release", "%.3g m above the ground, jet %.2f m/s at %.3g deg", b->launch.height - b->ground_elevation,
               b->launch.speed, b->launch.elevation * DEG);
    report_add(&p, "sprayer", "moving %.2f m/s toward %.0f deg", hypot(sp->travel[0], sp->travel[1]),
               fmod(atan2(sp->travel[0], sp->travel[1]) * DEG + 360.0, 360.0));
    report_add(&p, "downwind", "toward %.0f deg", fmod(res->wind_toward * DEG + 360.0, 360.0));
    report_spectrum_inputs(&p, &sp->spectrum, sp->nclasses, sp->spacing);
    report_add(&p, "evaporation", "%s", b->projectile.evaporation.enabled
                                            ? "the drops evaporate in the day's air"
                                            : "none (the atmosphere is not the local model)");
    if (b->projectile.evaporation.enabled)
        report_add(&p, "not volatile", "%.3g of the drops' volume", b->projectile.evaporation.nonvolatile_fraction);
    dragarc_display si;
    dragarc_display_si(&si);
    report_air_inputs(&p, b, &si);
    report_add(&p, "deposit bins", "%.3g m wide", sp->bin_width);
    report_add(&p, "buffer", "%.3g m downwind", sp->buffer);
    report_add(&p, "flight-time limit", "%g s", b->solver.max_time);
    return report_pairs_emit(r, "Spray", &p, err);
}

static int summary(dragarc_report *r, const dragarc_drift_spec *sp, const dragarc_drift_result *res,
                   dragarc_error *err)
{
    report_pairs p = {.n = 0};
    report_add(&p, "deposited", "%.3f %% of the volume", 100.0 * res->deposited_fraction);
    report_add(&p, "airborne", "%.3f %% of the volume: %.3f %% evaporates, %.3f %% still aloft after %g s",
               100.0 * (res->evaporated_fraction + res->aloft_fraction), 100.0 * res->evaporated_fraction,
               100.0 * res->aloft_fraction, sp->base.solver.max_time);
    if (res->failed_fraction > 0.0)
        report_add(&p, "failed flights", "%.3f %% of the volume", 100.0 * res->failed_fraction);
    if (isfinite(res->distance90))
        report_add(&p, "90 % deposits", "within %.2f m downwind", res->distance90);
    else
        report_add(&p, "90 % deposits", "nowhere: less than 90 %% of the volume deposits");
    if (isfinite(res->distance99))
        report_add(&p, "99 % deposits", "within %.2f m downwind", res->distance99);
    else
        report_add(&p, "99 % deposits", "nowhere: less than 99 %% of the volume deposits");
    report_add(&p, "beyond the buffer", "%.3f %% of the volume is not deposited before %.3g m", 100.0 * res->beyond_buffer,
               res->buffer);
    if (isfinite(res->diameter_at_buffer))
        report_add(&p, "drops past the buffer", "under %.0f \xc2\xb5m come down beyond it", res->diameter_at_buffer * 1e6);
    return report_pairs_emit(r, "Summary", &p, err);
}

#define CLASS_COLS 8
static int classes_table(dragarc_report *r, const dragarc_drift_result *res, dragarc_error *err)
{
    static const char *const OUTCOME[] = {"lands", "evaporates", "still aloft", "failed"};
    static const char *const head[CLASS_COLS] = {"class", "diameter (\xc2\xb5m)", "volume (%)", "outcome", "downwind (m)",
                                                 "crosswind, right + (m)", "time aloft (s)", "water landing (%)"};
    static const int numeric[CLASS_COLS] = {1, 1, 1, 0, 1, 1, 1, 1};
    report_grid g;
    int rc = report_grid_init(&g, res->nclasses, CLASS_COLS, err);
    for (size_t i = 0; rc == DRAGARC_OK && i < res->nclasses; i++) {
        const dragarc_drift_class *c = &res->classes[i];
        report_grid_set(&g, i, 0, "%zu", i + 1);
        report_grid_number(&g, i, 1, 1, c->diameter * 1e6);
        report_grid_number(&g, i, 2, 3, 100.0 * c->fraction);
        report_grid_set(&g, i, 3, "%s", OUTCOME[c->outcome >= 0 && c->outcome <= 3 ? c->outcome : 3]);
        if (c->outcome > DRAGARC_DRIFT_EVAPORATED)
            continue;
        report_grid_number(&g, i, 4, 2, c->downwind);
        report_grid_number(&g, i, 5, 2, c->crosswind);
        report_grid_number(&g, i, 6, 2, c->time);
        report_grid_number(&g, i, 7, 2, c->outcome == DRAGARC_DRIFT_LANDED ? 100.0 * c->water_left : 0.0);
    }
    if (rc == DRAGARC_OK)
        rc = report_grid_emit(r, "Where each drop size comes down", &g, head, numeric, err);
    report_grid_free(&g);
    return rc;
}

/* The deposit from the first bin holding any to the last, in at most about DEPOSIT_ROWS rows of whole bins. */
#define DEPOSIT_ROWS 24
static int deposit_table(dragarc_report *r, const dragarc_drift_result *res, dragarc_error *err)
{
    static const char *const head[4] = {"from (m downwind)", "to (m downwind)", "deposit (% of the volume per m)",
                                        "deposited within (% of the volume)"};
    static const int numeric[4] = {1, 1, 1, 1};
    size_t first = res->nbins, last = 0;
    for (size_t k = 0; k < res->nbins; k++)
        if (res->deposit[k] > 0.0) {
            first = k < first ? k : first;
            last = k;
        }
    if (first > last)
        return DRAGARC_OK;
    size_t n = last - first + 1, step = (n + DEPOSIT_ROWS - 1) / DEPOSIT_ROWS;
    report_grid g;
    int rc = report_grid_init(&g, (n + step - 1) / step, 4, err);
    for (size_t k = first, i = 0; rc == DRAGARC_OK && k <= last; k += step, i++) {
        size_t end = k + step <= last + 1 ? k + step : last + 1;
        double from = res->first_bin + (double)k * res->bin_width, to = res->first_bin + (double)end * res->bin_width;
        double sum = 0.0;
        for (size_t m = k; m < end; m++)
            sum += res->deposit[m];
        report_grid_number(&g, i, 0, 2, from);
        report_grid_number(&g, i, 1, 2, to);
        report_grid_set(&g, i, 2, "%.4g", 100.0 * sum / (double)(end - k));
        report_grid_number(&g, i, 3, 3, 100.0 * dragarc_drift_deposited_within(res, to));
    }
    if (rc == DRAGARC_OK)
        rc = report_grid_emit(r, "Deposit downwind", &g, head, numeric, err);
    report_grid_free(&g);
    return rc;
}

typedef struct plot_job {
    const dragarc_drift_spec *sp;
    const dragarc_spectrum_class *classes;
    const dragarc_drift_result *res;
} plot_job;

static int draw_drift(const char *path, const void *ctx, dragarc_error *err)
{
    const plot_job *j = ctx;
    return dragarc_drift_plot(path, j->sp, j->classes, j->res, NULL, err);
}

int dragarc_report_drift(dragarc_report *r, const char *where, const dragarc_drift_spec *sp,
                         const dragarc_spectrum_class *classes, const dragarc_drift_result *res, dragarc_error *err)
{
    char line[4200];
    snprintf(line, sizeof line, "Scenario file %s: how far a spray's drops drift and where its volume comes down. SI "
             "units.", where ? where : "");
    const char *cautions[DRAGARC_CAUTIONS_MAX];
    size_t nc = dragarc_cautions_notes(res->notes | DRAGARC_NOTE_SPRAY_DRIFT, cautions, DRAGARC_CAUTIONS_MAX);
    plot_job job = {sp, classes, res};
    int rc;
    if ((rc = dragarc_report_subtitle(r, line, err)) != DRAGARC_OK ||
        (rc = dragarc_report_section(r, "Inputs", err)) != DRAGARC_OK ||
        (rc = inputs(r, sp, res, err)) != DRAGARC_OK ||
        (rc = dragarc_report_section(r, "Results", err)) != DRAGARC_OK ||
        (rc = summary(r, sp, res, err)) != DRAGARC_OK || (rc = deposit_table(r, res, err)) != DRAGARC_OK ||
        (rc = dragarc_report_section(r, "Figures", err)) != DRAGARC_OK ||
        (rc = dragarc_report_figure_draw(r,
                                         "The deposit against the distance downwind, in total and by drop-size band, "
                                         "with the buffer; the share deposited within each distance; the spectrum's "
                                         "cumulative volume against the diameter with Dv10, Dv50 and Dv90.",
                                         draw_drift, &job, err)) != DRAGARC_OK ||
        (rc = dragarc_report_section(r, "By drop size", err)) != DRAGARC_OK ||
        (rc = classes_table(r, res, err)) != DRAGARC_OK ||
        (rc = dragarc_report_section(r, "Cautions", err)) != DRAGARC_OK ||
        (rc = dragarc_report_cautions(r, nc, cautions, err)) != DRAGARC_OK ||
        (rc = dragarc_report_source(r, "jet", "Bernoulli's equation for the jet from the nozzle's pressure",
                                    "Streeter, V. L. & Wylie, E. B., Fluid Mechanics, the orifice (recalled)",
                                    err)) != DRAGARC_OK ||
        (rc = report_spray_sources(r, &sp->base, sp->spectrum.form, err)) != DRAGARC_OK)
        return rc;
    return dragarc_report_source(r, "deposit", "each class's volume spread between the landing distances of its "
                                 "neighbours", "dragarc, docs/drift.md", err);
}
