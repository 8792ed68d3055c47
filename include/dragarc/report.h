/* report.h: one self-contained HTML page per job: inputs, results, figures, cautions, models and sources.
 *
 * Copyright (C) 2026 the dragarc developers. SPDX-License-Identifier: GPL-3.0-or-later
 *
 * A report is a small document model built in order: a title and the command, then sections, each holding
 * paragraphs, key-value tables, data tables (units in the column headings), figures (SVG text, inlined), a list
 * of cautions and a list of the models used with their sources; a footer gives the dragarc version and the date.
 * dragarc_report_write_html writes it as one HTML file with its CSS and SVG inline: no scripts, no external
 * references, print rules for A4 and Letter (src/io/report_html.c). Every text is escaped when written.
 *
 * A report kind (one per command: fly, aim, sprinkler, drift, footprint, fit) is one function that fills a report from the
 * command's results, such as dragarc_report_fly below (DEVELOPERS.md: "How to add a report kind").
 */
#ifndef DRAGARC_REPORT_H
#define DRAGARC_REPORT_H

#include <stddef.h>
#include <time.h>

#include "dragarc/aim.h"
#include "dragarc/dragarc.h"
#include "dragarc/drift.h"
#include "dragarc/fit.h"
#include "dragarc/flight.h"
#include "dragarc/footprint.h"
#include "dragarc/plot.h"
#include "dragarc/scenario.h"
#include "dragarc/sprinkler.h"
#include "dragarc/units.h"

#ifdef __cplusplus
extern "C" {
#endif

typedef struct dragarc_report dragarc_report;

/* A new, empty report titled `title` (the scenario's name) for `command` ("fly"), both copied. Caller frees with
 * dragarc_report_free. DRAGARC_ENOMEM. */
int dragarc_report_new(dragarc_report **out, const char *title, const char *command, dragarc_error *err);

/* Free a report and everything it copied; NULL is fine. */
void dragarc_report_free(dragarc_report *r);

/* The footer's date (UTC). Without it the footer gives the version only. */
void dragarc_report_set_date(dragarc_report *r, time_t when);

/* Where figures are drawn for a moment before they are read back (a folder that exists; copied). NULL or
 * unset: "/tmp". */
int dragarc_report_set_scratch_dir(dragarc_report *r, const char *dir, dragarc_error *err);

/* A line under the title ("scenario file ball.json, units SI"); copied. Several lines are kept in order. */
int dragarc_report_subtitle(dragarc_report *r, const char *text, dragarc_error *err);

/* Start a section headed `heading`; the blocks added next go under it. Copied. */
int dragarc_report_section(dragarc_report *r, const char *heading, dragarc_error *err);

/* A paragraph of plain text; copied. */
int dragarc_report_paragraph(dragarc_report *r, const char *text, dragarc_error *err);

/* A table of n rows of two cells, name and value: pairs[2 i] and pairs[2 i + 1] (values carry their unit).
 * caption may be NULL. Copied. */
int dragarc_report_pairs(dragarc_report *r, const char *caption, size_t n, const char *const *pairs,
                         dragarc_error *err);

/* A data table of nrows rows and ncols columns: headings[j] (with its unit, "height (m)") and cells[i * ncols + j].
 * Numeric columns are right-aligned when numeric[j] is 1 (numeric may be NULL). caption may be NULL. Copied. */
int dragarc_report_table(dragarc_report *r, const char *caption, size_t ncols, const char *const *headings,
                         const int *numeric, size_t nrows, const char *const *cells, dragarc_error *err);

/* A figure from SVG text (an SVG document as PLplot's cairo driver writes it): the XML prolog and doctype are
 * dropped, every id and every reference to one (url(#..), href="#..", xlink:href="#..") gets a prefix unique to
 * the figure ("f3-"), and the outer <svg> keeps its viewBox and scales to the page width. Copied. DRAGARC_EINVAL
 * when the text holds no <svg> element, or holds a script, an event handler or a reference outside itself. */
int dragarc_report_figure_svg(dragarc_report *r, const char *caption, const char *svg, dragarc_error *err);

/* Draws a picture into the SVG file at path (e.g. with dragarc_plot_write); returns a DRAGARC_* status. */
typedef int (*dragarc_report_draw_fn)(const char *path, const void *ctx, dragarc_error *err);

/* A figure drawn by draw(path, ctx, err) into a temporary SVG file in the scratch folder, read back, added as by
 * dragarc_report_figure_svg, and removed (also on failure). Errors: draw's own, DRAGARC_EIO (the scratch folder). */
int dragarc_report_figure_draw(dragarc_report *r, const char *caption, dragarc_report_draw_fn draw, const void *ctx,
                               dragarc_error *err);

/* The same for a figure described in plot.h's structs. */
int dragarc_report_figure_plot(dragarc_report *r, const char *caption, const dragarc_plot_figure *fig,
                               dragarc_error *err);

/* The cautions (dragarc_cautions_*), shown as a marked box. Copied. */
int dragarc_report_cautions(dragarc_report *r, size_t n, const char *const *cautions, dragarc_error *err);

/* One model used and its source: what it is for ("atmosphere"), the model ("U.S. Standard Atmosphere 1976") and
 * the source (author, title, year; may be NULL or "" when the model is the user's own data). Added to the
 * report's list of models and sources, written after the last section. Copied. */
int dragarc_report_source(dragarc_report *r, const char *topic, const char *model, const char *source,
                          dragarc_error *err);

/* Write the report as one HTML file at path, whole or not at all (dragarc_output_open / commit: on failure
 * nothing is left and an existing file at path is untouched); "-" writes to standard output. DRAGARC_EIO. */
int dragarc_report_write_html(const dragarc_report *r, const char *path, dragarc_error *err);

/* ---- report kinds: one function each, filling a new report from a command's results ---- */

/* The `fly` report of scenario s (read from file `where`), flown to impact as f, with its samples in `sampled`
 * (dragarc_flight_run with dt > 0) for the figure and the trajectory table; values in the units of display d
 * (NULL: SI). Adds the inputs, the results, the figure of dragarc_flight_plot (options po, may be NULL), the
 * cautions and the models used. Errors as dragarc_flight_plot, DRAGARC_ENOMEM. */
int dragarc_report_fly(dragarc_report *r, const char *where, const dragarc_scenario *s, const dragarc_flight *f,
                       const dragarc_flight *sampled, const dragarc_display *d,
                       const dragarc_flight_plot_options *po, dragarc_error *err);

/* The `aim` report of scenario s (read from file `where`) for request q solved as a (dragarc_aim_solve, at least one
 * solution): the target and the scenario, the maximum range, a table of every solution (elevation, speed, azimuth,
 * aim correction, time of flight, apex, impact speed, angle and energy, miss), the figure of dragarc_aim_plot, the
 * cautions `aim` prints and the models used; values in the units of display d (NULL: SI). Errors as
 * dragarc_aim_plot, DRAGARC_ENOMEM. */
int dragarc_report_aim(dragarc_report *r, const char *where, const dragarc_scenario *s, const dragarc_aim_request *q,
                       const dragarc_aim_result *a, const dragarc_display *d, dragarc_error *err);

/* The `sprinkler` report of spec (read from file `where`), run as res with its drop classes (spec->nclasses of
 * them; dragarc_sprinkler_spec_run): the nozzle, arc, spectrum, air and layout; the jet, the pattern's statistics,
 * the throw of every class and the radial profile as `sprinkler` prints them, the layout's uniformity when it has
 * one; the figure of dragarc_sprinkler_plot, the cautions `sprinkler` prints and the models used. SI units. Errors
 * as dragarc_sprinkler_plot, DRAGARC_ENOMEM. */
int dragarc_report_sprinkler(dragarc_report *r, const char *where, const dragarc_sprinkler_spec *spec,
                             const dragarc_spectrum_class *classes, const dragarc_sprinkler_result *res,
                             dragarc_error *err);

/* The `drift` report of spec (read from file `where`), run as res with its classes (dragarc_drift_spec_run): the
 * release, the travel, the spectrum (Dv10, Dv50, Dv90) and the air; the deposited and airborne shares, the 90 % and
 * 99 % distances, the buffer, the class table `drift` prints and the deposit downwind; the figure of
 * dragarc_drift_plot, the cautions `drift` prints and the models used. SI units. Errors as dragarc_drift_plot,
 * DRAGARC_ENOMEM. */
int dragarc_report_drift(dragarc_report *r, const char *where, const dragarc_drift_spec *spec,
                         const dragarc_spectrum_class *classes, const dragarc_drift_result *res, dragarc_error *err);

/* The `footprint` report of footprint scenario sp (read from file `where`), its impacts and their summary s
 * (dragarc_footprint_run, dragarc_footprint_summarise): the breakup and its spreads, the fragment classes, where each
 * class and all fragments come down (mean, 1 sigma ellipse, impact speeds and energies, the share at or above the
 * hazard energy, E_c), the extents and contours, the published criteria as references, the `footprint --plot`
 * maps, the debris cautions and the models used; SI units. DRAGARC_EINVAL when s is not a summary of sp's run;
 * otherwise errors as dragarc_footprint_plot, DRAGARC_ENOMEM. */
int dragarc_report_footprint(dragarc_report *r, const char *where, const dragarc_footprint_spec *sp,
                             const dragarc_impact *impacts, const dragarc_footprint_summary *s, dragarc_error *err);

/* The `fit` report of scenario s (read from file `where`) fitted to the track read from track_file with options o
 * (NULL: the defaults) as res, the fitted scenario `fitted` (dragarc_fit_run): the scenario, the track (points, time
 * span, weights, velocities) and what is fitted how; the warnings `fit` prints; the estimates (start, value,
 * standard error, 95 % interval, unit; values to dragarc_fit_decimals of their standard error), the correlations,
 * chi-square or the residual standard deviation, the residual RMS, the conditioning, residuals along the track; the
 * figure of dragarc_fit_plot, the fit cautions and the models and method with their sources. SI units, angles in
 * degrees, as `fit` prints them. DRAGARC_EINVAL when res is not a fit of track; otherwise errors as
 * dragarc_fit_plot, DRAGARC_ENOMEM. */
int dragarc_report_fit(dragarc_report *r, const char *where, const char *track_file, const dragarc_scenario *s,
                       const dragarc_fit_options *o, const dragarc_track *track, const dragarc_fit_result *res,
                       const dragarc_scenario *fitted, dragarc_error *err);

/* The `campaign` report of campaign c (read from file `where`) from its cases' rows (dragarc_campaign_row_fill, n
 * of them): every case's breakup, mean impact, 1 sigma ellipse, hazardous share and E_c against its criterion, the
 * published criteria as references, the map of dragarc_campaign_plot, the debris cautions and the sources. SI
 * units. Errors as dragarc_campaign_plot, DRAGARC_ENOMEM. */
struct dragarc_campaign;
struct dragarc_campaign_row;
int dragarc_report_campaign(dragarc_report *r, const char *where, const struct dragarc_campaign *c,
                            const struct dragarc_campaign_row *rows, size_t n, dragarc_error *err);

#ifdef __cplusplus
}
#endif
#endif
