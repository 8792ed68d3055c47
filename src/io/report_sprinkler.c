/* report_sprinkler.c: the `sprinkler` report kind: a sprinkler's inputs, its throw by drop size, the radial
 * application-rate profile, the pattern's and the layout's statistics, the figure, the cautions and the models with
 * their sources.
 * SPDX-License-Identifier: GPL-3.0-or-later
 *
 * Fills a dragarc_report (report.h) from a sprinkler scenario and its pattern (sprinkler.h), in SI units as
 * `sprinkler` prints them; the tables are the ones `sprinkler` prints and the cautions the same texts.
 */
#include <math.h>
#include <stdio.h>
#include <string.h>

#include "dragarc/cautions.h"
#include "dragarc/report.h"
#include "io/report_kind.h"

#define DEG REPORT_DEG

static int inputs(dragarc_report *r, const dragarc_sprinkler_spec *sp, dragarc_error *err)
{
    report_pairs p = {.n = 0};
    const dragarc_nozzle *n = &sp->nozzle;
    report_add(&p, "nozzle", "%.4g mm at %.4g kPa, velocity coefficient %.3g, discharge coefficient %.3g",
               n->diameter * 1e3, n->pressure * 1e-3, n->velocity_coefficient, n->discharge_coefficient);
    report_add(&p, "water", "density %.4g kg/m\xc2\xb3", n->liquid_density);
    report_add(&p, "nozzle height", "%.3g m above the ground", sp->base.launch.height - sp->base.ground_elevation);
    report_add(&p, "elevation", "%.3g deg", sp->base.launch.elevation * DEG);
    report_add(&p, "arc", "%.4g to %.4g deg clockwise from north, %zu directions", sp->arc_from * DEG,
               sp->arc_to * DEG, sp->ndirections);
    report_spectrum_inputs(&p, &sp->spectrum, sp->nclasses, sp->spacing);
    report_add(&p, "evaporation", "%s", sp->base.projectile.evaporation.enabled
                                            ? "the drops evaporate in the day's air"
                                            : "none (the atmosphere is not the local model)");
    dragarc_display si;
    dragarc_display_si(&si);
    report_air_inputs(&p, &sp->base, &si);
    report_add(&p, "profile and grid", "rings %.3g m wide, cells %.3g m square", sp->ring_width, sp->cell);
    if (sp->layout_given) {
        static const char *const KIND[] = {"square", "rectangular", "triangular"};
        if (sp->layout.kind == DRAGARC_LAYOUT_RECTANGULAR)
            report_add(&p, "layout", "rectangular, %.4g m along the rows, %.4g m between rows; %zu catch points a side",
                       sp->layout.spacing, sp->layout.row_spacing, sp->layout_points);
        else
            report_add(&p, "layout", "%s, %.4g m spacing; %zu catch points a side", KIND[sp->layout.kind],
                       sp->layout.spacing, sp->layout_points);
    }
    return report_pairs_emit(r, "Sprinkler", &p, err);
}

static int pattern(dragarc_report *r, const dragarc_sprinkler_result *res, dragarc_error *err)
{
    report_pairs p = {.n = 0};
    report_add(&p, "jet", "%.3f m/s", res->exit_speed);
    report_add(&p, "flow", "%.3f L/min (%.4g m\xc2\xb3/h)", res->flow * 6e4, res->flow * 3600.0);
    report_add(&p, "wetted radius", "%.2f m (to the last ring at %.2f mm/h or more)", res->wetted_radius,
               DRAGARC_WETTED_RATE);
    double peak = 0.0;
    for (size_t k = 0; k < res->nx * res->ny; k++)
        peak = fmax(peak, res->grid_rate[k]);
    report_add(&p, "highest rate", "%.3f mm/h on one %.3g m cell of the grid", peak, res->cell);
    report_add(&p, "water", "%.3f %% lands, %.3f %% evaporates in the air", 100.0 * res->deposited_fraction,
               100.0 * res->evaporated_fraction);
    if (res->nfailed)
        report_add(&p, "failed flights", "%zu of %zu (their water is not counted as landed)", res->nfailed,
                   res->nclasses * res->ndirections);
    int rc = report_pairs_emit(r, "Pattern", &p, err);
    if (rc != DRAGARC_OK || !res->layout_done)
        return rc;
    const dragarc_uniformity *u = &res->layout_stats;
    p.n = 0;
    report_add(&p, "cell", "%.4g x %.4g m, %zu x %zu catch points", res->cell_width, res->cell_height,
               res->layout_points, res->layout_points);
    report_add(&p, "mean rate", "%.3f mm/h (least %.3f, greatest %.3f)", u->mean, u->min, u->max);
    report_add(&p, "Christiansen's CU", "%.1f %%", u->cu);
    report_add(&p, "low-quarter DU", "%.1f %%", u->du_lq);
    report_add(&p, "coefficient of variation", "%.3f", u->cv);
    return report_pairs_emit(r, "Overlapped on the layout", &p, err);
}

#define CLASS_COLS 8
static int classes_table(dragarc_report *r, const dragarc_spectrum_class *cl, const dragarc_sprinkler_result *res,
                         dragarc_error *err)
{
    static const char *const head[CLASS_COLS] = {"class", "diameter (mm)", "volume (%)", "throw, mean (m)",
                                                 "least (m)", "greatest (m)", "time aloft (s)", "water landing (%)"};
    static const int numeric[CLASS_COLS] = {1, 1, 1, 1, 1, 1, 1, 1};
    report_grid g;
    int rc = report_grid_init(&g, res->nclasses, CLASS_COLS, err);
    for (size_t i = 0; rc == DRAGARC_OK && i < res->nclasses; i++) {
        dragarc_sprinkler_class_stats st;
        dragarc_sprinkler_class_summary(res, i, &st);
        report_grid_set(&g, i, 0, "%zu", i + 1);
        report_grid_number(&g, i, 1, 3, cl[i].diameter * 1e3);
        report_grid_number(&g, i, 2, 2, 100.0 * cl[i].fraction);
        if (!st.flown) {
            report_grid_set(&g, i, 3, "every flight failed");
            continue;
        }
        report_grid_number(&g, i, 3, 2, st.distance);
        report_grid_number(&g, i, 4, 2, st.distance_min);
        report_grid_number(&g, i, 5, 2, st.distance_max);
        report_grid_number(&g, i, 6, 2, st.time);
        report_grid_number(&g, i, 7, 2, 100.0 * st.water_left);
    }
    if (rc == DRAGARC_OK)
        rc = report_grid_emit(r, "Throw by drop size (over the directions flown)", &g, head, numeric, err);
    report_grid_free(&g);
    return rc;
}

/* The profile in steps of about a metre, each the area-weighted mean of its rings, as `sprinkler` prints it. */
static int profile_table(dragarc_report *r, const dragarc_sprinkler_spec *sp, const dragarc_sprinkler_result *res,
                         dragarc_error *err)
{
    static const char *const head[3] = {"from (m)", "to (m)", "application rate (mm/h)"};
    static const int numeric[3] = {1, 1, 1};
    size_t step = (size_t)fmax(1.0, floor(1.0 / sp->ring_width + 0.5));
    report_grid g;
    int rc = report_grid_init(&g, (res->nrings + step - 1) / step, 3, err);
    for (size_t k = 0, i = 0; rc == DRAGARC_OK && k < res->nrings; k += step, i++) {
        double a = 0.0, w = 0.0;
        for (size_t m = k; m < k + step && m < res->nrings; m++) {
            double area = 2.0 * m + 1.0;
            a += res->ring_rate[m] * area, w += area;
        }
        report_grid_number(&g, i, 0, 2, k * sp->ring_width);
        report_grid_number(&g, i, 1, 2, fmin(k + step, res->nrings) * sp->ring_width);
        report_grid_number(&g, i, 2, 3, a / w);
    }
    if (rc == DRAGARC_OK)
        rc = report_grid_emit(r,
                              "Application rate by distance from the sprinkler, averaged round the arc (the whole "
                              "pattern in still air)",
                              &g, head, numeric, err);
    report_grid_free(&g);
    return rc;
}

typedef struct plot_job {
    const dragarc_sprinkler_spec *sp;
    const dragarc_sprinkler_result *res;
} plot_job;

static int draw_sprinkler(const char *path, const void *ctx, dragarc_error *err)
{
    const plot_job *j = ctx;
    return dragarc_sprinkler_plot(path, j->sp, j->res, NULL, err);
}

int dragarc_report_sprinkler(dragarc_report *r, const char *where, const dragarc_sprinkler_spec *sp,
                             const dragarc_spectrum_class *classes, const dragarc_sprinkler_result *res,
                             dragarc_error *err)
{
    char line[4200];
    snprintf(line, sizeof line, "Scenario file %s: where a sprinkler's drops land and the water they lay down. SI "
             "units.", where ? where : "");
    const char *cautions[DRAGARC_CAUTIONS_MAX];
    size_t nc = dragarc_cautions_notes(res->notes | DRAGARC_NOTE_IRRIGATION, cautions, DRAGARC_CAUTIONS_MAX);
    plot_job job = {sp, res};
    int rc;
    if ((rc = dragarc_report_subtitle(r, line, err)) != DRAGARC_OK ||
        (rc = dragarc_report_section(r, "Inputs", err)) != DRAGARC_OK || (rc = inputs(r, sp, err)) != DRAGARC_OK ||
        (rc = dragarc_report_section(r, "Results", err)) != DRAGARC_OK ||
        (rc = pattern(r, res, err)) != DRAGARC_OK || (rc = profile_table(r, sp, res, err)) != DRAGARC_OK ||
        (rc = dragarc_report_section(r, "Figures", err)) != DRAGARC_OK ||
        (rc = dragarc_report_figure_draw(r,
                                         res->layout_done
                                             ? "The radial profile with the wetted radius; the pattern as a colour "
                                               "map with the wind at the nozzle, a scale bar and north; the rates "
                                               "overlapped on the layout over its cell, the sprinklers at its corners."
                                             : "The radial profile with the wetted radius; the pattern as a colour "
                                               "map with the wind at the nozzle, a scale bar and north.",
                                         draw_sprinkler, &job, err)) != DRAGARC_OK ||
        (rc = dragarc_report_section(r, "By drop size", err)) != DRAGARC_OK ||
        (rc = classes_table(r, classes, res, err)) != DRAGARC_OK ||
        (rc = dragarc_report_section(r, "Cautions", err)) != DRAGARC_OK ||
        (rc = dragarc_report_cautions(r, nc, cautions, err)) != DRAGARC_OK ||
        (rc = dragarc_report_source(r, "nozzle", "Bernoulli's equation for the jet and the orifice equation for the "
                                    "flow", "Streeter, V. L. & Wylie, E. B., Fluid Mechanics, the orifice (recalled)",
                                    err)) != DRAGARC_OK ||
        (rc = report_spray_sources(r, &sp->base, sp->spectrum.form, err)) != DRAGARC_OK ||
        (rc = dragarc_report_source(r, "wetted radius", "the edge at 0.26 mm/h",
                                    "ISO 15886-3 / ASABE S398.1, sprinkler test practice (recalled)", err)) != DRAGARC_OK)
        return rc;
    if (!res->layout_done)
        return DRAGARC_OK;
    if ((rc = dragarc_report_source(r, "uniformity", "Christiansen's uniformity coefficient CU",
                                    "Christiansen, J. E. (1942), Irrigation by sprinkling, University of California "
                                    "Agricultural Experiment Station Bulletin 670 (recalled)",
                                    err)) != DRAGARC_OK)
        return rc;
    return dragarc_report_source(r, "uniformity", "the low-quarter distribution uniformity DU_lq",
                                 "Merriam, J. L. & Keller, J. (1978), Farm irrigation system evaluation: a guide for "
                                 "management, Utah State University (recalled)",
                                 err);
}
