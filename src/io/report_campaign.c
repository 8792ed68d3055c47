/* report_campaign.c: the `campaign` report (report.h): one page for many footprint cases: the cases' table (the
 * breakup, where the fragments land, the hazardous share, E_c against the criterion), the map of every case, the
 * published criteria as references, the debris cautions and the models with their sources.
 * SPDX-License-Identifier: GPL-3.0-or-later
 */
#include <math.h>
#include <stdio.h>
#include <string.h>

#include "dragarc/campaign.h"
#include "dragarc/cautions.h"
#include "dragarc/report.h"
#include "io/report_kind.h"

enum { NCOLS = 9 };

static int cases_table(dragarc_report *r, const dragarc_campaign_row *rows, size_t n, dragarc_error *err)
{
    static const char *const HEAD[NCOLS] = {"case", "breakup altitude (m)", "breakup speed (m/s)", "landed",
                                            "mean impact east, north (m)", "1 sigma a x b (m), az (deg)",
                                            "hazardous (%)", "E_c", "vs criterion"};
    static const int NUMERIC[NCOLS] = {0, 1, 1, 1, 1, 1, 1, 1, 0};
    report_grid g;
    int rc = report_grid_init(&g, n, NCOLS, err);
    for (size_t i = 0; rc == DRAGARC_OK && i < n; i++) {
        const dragarc_campaign_row *w = &rows[i];
        char a[32], b[32], az[32];
        report_grid_set(&g, i, 0, "%.40s", w->name);
        report_grid_number(&g, i, 1, 0, w->altitude);
        report_grid_number(&g, i, 2, 1, w->speed);
        report_grid_set(&g, i, 3, "%zu of %zu", w->landed, w->flights);
        if (w->mean_ok) {
            report_number(a, 0, w->mean_east);
            report_number(b, 0, w->mean_north);
            report_grid_set(&g, i, 4, "%s, %s", a, b);
        }
        if (w->ellipse_ok) {
            report_number(a, 0, w->semi_major);
            report_number(b, 0, w->semi_minor);
            report_number(az, 0, fmod(w->azimuth * REPORT_DEG + 360.0, 180.0));
            report_grid_set(&g, i, 5, "%s x %s, %s", a, b, az);
        }
        report_grid_number(&g, i, 6, 1, 100.0 * w->hazardous_share);
        if (w->casualty_done)
            report_grid_set(&g, i, 7, "%.3e", w->expected_casualties);
        report_grid_set(&g, i, 8, "%s", !w->casualty_done || !(w->criterion > 0.0) ? ""
                                        : w->expected_casualties <= w->criterion ? "within"
                                                                                 : "ABOVE");
    }
    if (rc == DRAGARC_OK)
        rc = report_grid_emit(r, "Every case: its fragments' mean impact from the point below its own breakup, their "
                                 "1 sigma ellipse, the share at or above the hazard energy, and E_c",
                              &g, HEAD, NUMERIC, err);
    report_grid_free(&g);
    return rc;
}

typedef struct map_job {
    const dragarc_campaign *c;
    const dragarc_campaign_row *rows;
    size_t n;
} map_job;

static int draw_map(const char *path, const void *ctx, dragarc_error *err)
{
    const map_job *j = ctx;
    return dragarc_campaign_plot(path, j->c, j->rows, j->n, err);
}

int dragarc_report_campaign(dragarc_report *r, const char *where, const dragarc_campaign *c,
                            const dragarc_campaign_row *rows, size_t n, dragarc_error *err)
{
    if (n == 0)
        return dragarc_error_set(err, DRAGARC_EINVAL, "", "a campaign report needs at least one case");
    char line[4200];
    snprintf(line, sizeof line, "Campaign file %s: %zu footprint case%s, each a scenario with its own breakup; every "
             "case's own files are in its folder. SI units.", where ? where : "", n, n == 1 ? "" : "s");
    const char *cautions[DRAGARC_CAUTIONS_MAX];
    size_t nc = dragarc_cautions_notes(DRAGARC_NOTE_DEBRIS, cautions, DRAGARC_CAUTIONS_MAX);
    map_job job = {c, rows, n};
    int rc;
    if ((rc = dragarc_report_subtitle(r, line, err)) != DRAGARC_OK ||
        (rc = dragarc_report_section(r, "Cases", err)) != DRAGARC_OK || (rc = cases_table(r, rows, n, err)) != DRAGARC_OK ||
        (rc = report_published_criteria(r, err)) != DRAGARC_OK ||
        (rc = dragarc_report_section(r, "Map", err)) != DRAGARC_OK ||
        (rc = dragarc_report_figure_draw(r,
                                         "Every case's breakup point (the point below it), its fragments' mean impact "
                                         "and 1 sigma ellipse, east and north of the first case's breakup point.",
                                         draw_map, &job, err)) != DRAGARC_OK ||
        (rc = dragarc_report_section(r, "Cautions", err)) != DRAGARC_OK ||
        (rc = dragarc_report_cautions(r, nc, cautions, err)) != DRAGARC_OK ||
        (rc = dragarc_report_source(r, "cases", "each case a footprint scenario changed by a JSON Merge Patch, flown "
                                    "as `dragarc footprint` flies it (see each case's summary.json)",
                                    "IETF RFC 7386 (2014), JSON Merge Patch", err)) != DRAGARC_OK ||
        (rc = dragarc_report_source(r, "map", "points placed by WGS 84 geodesics through PROJ, azimuthal "
                                    "equidistant about the first breakup point",
                                    "Karney, C. F. F. (2013), Algorithms for geodesics, J. Geodesy 87", err)) !=
            DRAGARC_OK)
        return rc;
    return DRAGARC_OK;
}
