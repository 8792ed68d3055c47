/* plot.h: pictures of results, drawn by PLplot into SVG, PNG or PDF files.
 *
 * Copyright (C) 2026 the dragarc developers. SPDX-License-Identifier: GPL-3.0-or-later
 *
 * A figure is described in plain structs (panels, each with series of points and an optional arrow) and drawn
 * whole by dragarc_plot_write, the one call that touches PLplot (src/io/plot.c). The format follows the file
 * name's extension: .svg, .png or .pdf (PLplot's svgcairo, pngcairo and pdfcairo drivers). Series take their
 * colours from the palette of Okabe and Ito (2008), which stays apart for the common colour-vision deficiencies,
 * and each also has its own line style or marker shape, so that they stay apart printed in grey.
 *
 * PLplot keeps global state: plotting is not thread-safe. Draw one figure at a time, on the main thread (a
 * second call while one is drawing is refused with DRAGARC_EINVAL).
 */
#ifndef DRAGARC_PLOT_H
#define DRAGARC_PLOT_H

#include <stddef.h>

#include "dragarc/aim.h"
#include "dragarc/dragarc.h"
#include "dragarc/drift.h"
#include "dragarc/flight.h"
#include "dragarc/output.h"
#include "dragarc/scenario.h"
#include "dragarc/sweep.h"
#include "dragarc/sprinkler.h"
#include "dragarc/units.h"

#ifdef __cplusplus
extern "C" {
#endif

typedef enum dragarc_plot_format {
    DRAGARC_PLOT_SVG = 0,
    DRAGARC_PLOT_PNG,
    DRAGARC_PLOT_PDF
} dragarc_plot_format;

/* The format of a file name by its extension (.svg, .png, .pdf, in any case). DRAGARC_EINVAL naming the
 * extension and the three allowed when it is none of them; err->field is left empty for the caller. */
int dragarc_plot_format_from_path(const char *path, dragarc_plot_format *fmt, dragarc_error *err);

/* How a series is drawn. */
typedef enum dragarc_plot_style {
    DRAGARC_PLOT_SOLID = 0, /* a solid line through the points */
    DRAGARC_PLOT_DASHED,    /* a dashed line */
    DRAGARC_PLOT_DOTTED,    /* a dotted line */
    DRAGARC_PLOT_MARKERS,   /* a marker at each point, no line */
    DRAGARC_PLOT_FILLED     /* a closed polygon filled with a light tint of the colour, outlined in the colour */
} dragarc_plot_style;

/* The palette of Okabe and Ito (2008), in their order; DRAGARC_PLOT_BLACK is the axes' colour. */
typedef enum dragarc_plot_colour {
    DRAGARC_PLOT_BLACK = 0,
    DRAGARC_PLOT_ORANGE,
    DRAGARC_PLOT_SKY_BLUE,
    DRAGARC_PLOT_BLUISH_GREEN,
    DRAGARC_PLOT_YELLOW,
    DRAGARC_PLOT_BLUE,
    DRAGARC_PLOT_VERMILLION,
    DRAGARC_PLOT_REDDISH_PURPLE,
    DRAGARC_PLOT_NCOLOURS
} dragarc_plot_colour;

/* Marker shapes (filled unless said), for DRAGARC_PLOT_MARKERS. */
typedef enum dragarc_plot_marker {
    DRAGARC_PLOT_CIRCLE = 0,
    DRAGARC_PLOT_TRIANGLE,
    DRAGARC_PLOT_SQUARE,
    DRAGARC_PLOT_DIAMOND,
    DRAGARC_PLOT_CROSS, /* an x, not filled */
    DRAGARC_PLOT_NMARKERS
} dragarc_plot_marker;

/* Red, green and blue (0-255) of palette colour c (NULL outside the palette). */
const unsigned char *dragarc_plot_palette(dragarc_plot_colour c);

/* One series: n points (x[i], y[i]) in the panel's axis units. Borrows the arrays. A point that is not finite ends
 * a line (or a filled polygon) and the next finite point starts a new one, so one series can hold several rings
 * (ellipses, contours) separated by NaN; markers are not drawn at such points. */
typedef struct dragarc_plot_series {
    const char *label; /* legend text; NULL: not in the legend */
    const double *x, *y;
    size_t n;
    dragarc_plot_style style;
    dragarc_plot_colour colour;
    dragarc_plot_marker marker; /* DRAGARC_PLOT_MARKERS only */
    double marker_size;         /* mm, a marker's radius on the page; 0: 1.6 (small ones, ~0.5, for clouds of points) */
} dragarc_plot_series;

/* An arrow of fixed length on the page, drawn at a corner of a panel, pointing along (dx, dy) in the axis
 * directions as the ground has them (an axis drawn reversed reverses it; unequal axis scales do not bend it). */
typedef struct dragarc_plot_arrow {
    double dx, dy;     /* direction, in any units alike on both axes */
    const char *label; /* printed beside it ("wind 4.0 m/s"); NULL: none */
    dragarc_plot_colour colour;
} dragarc_plot_arrow;

/* A grid of cell values drawn as a colour map under the series, with a colour bar at the panel's right. Cell
 * (i, j), i = 0 .. nx-1 along x, j = 0 .. ny-1 along y, holds z[j * nx + i] and covers
 * [x0 + i (x1 - x0)/nx, x0 + (i + 1)(x1 - x0)/nx] x [y0 + j (y1 - y0)/ny, ...]. Cells that are not finite, or below
 * zmin, are left white. The colours run through the sequential map viridis (dark purple, blue, green, yellow),
 * whose lightness rises steadily, so that it reads in grey and with the common colour-vision deficiencies. */
typedef struct dragarc_plot_raster {
    const double *z;
    size_t nx, ny;
    double x0, x1, y0, y1;
    double zmin, zmax; /* the colour bar's range; zmin == zmax: from the finite cells */
    const char *label; /* the colour bar's label, with its unit */
} dragarc_plot_raster;

/* The look of curve k (0, 1, ...) of a family drawn together (solutions, a table's curves): a colour and a line
 * style both different from curve k - 1's, and no (colour, style) pair repeated before curve 18; also a marker
 * shape of its own among the first five, for a caller that draws markers. Sets s->colour, s->style, s->marker. */
void dragarc_plot_family_look(size_t k, dragarc_plot_series *s);

/* One panel: axes with labels, a title, series, a legend when more than one series is labelled. Borrows
 * everything. The axis limits enclose every series (and the raster) with a margin unless given. */
typedef struct dragarc_plot_panel {
    const char *title, *xlabel, *ylabel;
    const dragarc_plot_series *series;
    size_t nseries;
    int equal_scale; /* 1: one unit of y as long on the page as one unit of x (the viewport shrinks to fit) */
    int y_reversed;  /* 1: y grows downward */
    int limits_given; /* 1: xmin .. ymax below are the axis limits */
    double xmin, xmax, ymin, ymax;
    const dragarc_plot_arrow *arrow; /* NULL: none */
    const dragarc_plot_raster *raster; /* NULL: none */
    const char *scale_bar_unit; /* non-NULL: a scale bar of a round length along x, in this unit, at the lower right */
    int north_arrow;            /* 1: an arrow marked N at the upper right, pointing up the page (y is north) */
    const char *note;           /* non-NULL: one line of small print under the x axis's label (a caution) */
} dragarc_plot_panel;

/* A figure: one page of panels stacked top to bottom. Borrows the panels. */
typedef struct dragarc_plot_figure {
    const dragarc_plot_panel *panels;
    size_t npanels; /* 1 .. DRAGARC_PLOT_MAX_PANELS */
    double page_height; /* points (1/72 in) of the 600-point-wide page; 0: 900 (room for three panels) */
} dragarc_plot_figure;

#define DRAGARC_PLOT_MAX_PANELS 6

/* Draw figure fig into the file at path, in the format of its extension, written to a temporary file beside it
 * and renamed onto path only when complete (the temporary file is removed on failure, path left as it was).
 * PLplot's errors come back as return codes; it prints nothing. Errors: DRAGARC_EINVAL (the extension, an empty
 * figure, no finite point in a panel, a plot already being drawn), DRAGARC_EIO (the file cannot be written, or
 * PLplot or its driver failed: the message says which). Not thread-safe (see above). */
int dragarc_plot_write(const char *path, const dragarc_plot_figure *fig, dragarc_error *err);

/* ---- the picture of a fit (src/io/fit_plot.c; described in docs/plots.md) ---- */

struct dragarc_track;
struct dragarc_fit_result;

/* The track's points over the fitted flight, side on and in plan, and the residuals against time, into path.
 * `fitted` is the scenario with the estimates in it (dragarc_fit_run's), r the fit. Errors as dragarc_plot_write,
 * and those of flying the fitted scenario. */
int dragarc_fit_plot(const char *path, const dragarc_scenario *fitted, const struct dragarc_track *track,
                     const struct dragarc_fit_result *r, dragarc_error *err);

/* ---- the pictures of a flight (src/io/flight_plot.c; described in docs/plots.md) ---- */

/* The same launch as scenario s without air, over flat ground at s's ground elevation: n points (n >= 2) evenly in
 * time from launch to the ground, downrange along the launch azimuth (m) and height above the ground (m), in
 * closed form. Returns n, or 0 when the launch never reaches the ground (then nothing is written). */
size_t dragarc_vacuum_path(const dragarc_scenario *s, size_t n, double *downrange, double *height);

typedef struct dragarc_flight_plot_options {
    const char *title;   /* names the scenario in every panel's title (NULL: the scenario's name) */
    int free_scale;      /* 0: the side view has equal scales on both axes; 1: each axis fits its own data */
} dragarc_flight_plot_options;

/* The `fly --plot` figure of flight f of scenario s, sampled (dragarc_flight_run with dt > 0), into path: the side
 * view (height above the ground against downrange, with the vacuum path of the same launch, the apex and the
 * impact marked), the plan view (crossrange against downrange, the wind at the launch height as an arrow), and
 * the speed against time; lengths in the length unit of display d, speeds in its speed unit, times in its time
 * unit (NULL: SI). Errors as dragarc_plot_write; DRAGARC_EINVAL when f holds fewer than two samples. */
int dragarc_flight_plot(const char *path, const dragarc_scenario *s, const dragarc_flight *f,
                        const dragarc_display *d, const dragarc_flight_plot_options *o, dragarc_error *err);

/* ---- the pictures of aims and tables (src/io/aim_plot.c, src/io/table_plot.c; docs/plots.md) ---- */

/* The `aim --plot` figure: one side view (height above s's ground against downrange along s's launch azimuth) of
 * every solution of r, each flown again sampled about 600 times (dragarc_aim_solution_fly), each its own series
 * labelled with its branch and the solved quantity ("direct, elevation 12.34°"), with the launch point and the
 * target (at req->range, on the target plane) marked; lengths in the length unit of display d (NULL: SI), the
 * title naming the scenario (title; NULL: s's name). Errors as dragarc_plot_write and dragarc_flight_run;
 * DRAGARC_EINVAL when r holds no solution. */
int dragarc_aim_plot(const char *path, const dragarc_scenario *s, const dragarc_aim_request *req,
                     const dragarc_aim_result *r, const dragarc_display *d, const char *title, dragarc_error *err);

/* The most curves of a table plot (one per value of the second varied parameter): three rows of legend. */
#define DRAGARC_PLOT_MAX_CURVES 9

/* The `table --plot` figure of table t: column c of the rows that flew (failed rows leave gaps) against the first
 * varied parameter, one curve per value of the second (legend "wind_speed = 2 m/s"), in the units of display d
 * (NULL: SI, degrees for angles); title naming the scenario (title; NULL: t's). DRAGARC_EINVAL when t varies more
 * than two parameters, the second has more than DRAGARC_PLOT_MAX_CURVES values, c is no column, or no row flew;
 * otherwise errors as dragarc_plot_write. */
int dragarc_sweep_plot(const char *path, const dragarc_sweep *t, dragarc_sweep_column c, const dragarc_display *d,
                       const char *title, dragarc_error *err);

/* The `table --ranges --plot` figure: the low and the high elevation of the n rows of an aim table against the
 * target range, with the maximum range marked when the rows know it; ranges out of reach leave gaps. Units of
 * display d (NULL: SI, degrees); `scenario` names it in the title. DRAGARC_EINVAL when no range was reached;
 * otherwise errors as dragarc_plot_write. */
int dragarc_aim_table_plot(const char *path, const char *scenario, const dragarc_aim_table_row *rows, size_t n,
                           const dragarc_display *d, dragarc_error *err);
/* ---- the pictures of a sprinkler and of a spray's drift (src/io/spray_plot.c; described in docs/plots.md) ---- */

/* The `sprinkler --plot` figure of pattern r, run from spec, into path: the radial application-rate profile (mm/h
 * against the distance from the sprinkler, m) with the wetted radius; the grid's rates as a colour map (cells under
 * DRAGARC_WETTED_RATE white) at equal scales, with the sprinkler, the wind at the nozzle's height, a scale bar and
 * north; and, when r was overlapped on a layout, the overlapped rates over the layout's cell at its catch points,
 * with the sprinklers at the cell's corners. title names the scenario (NULL: spec's name). Errors as
 * dragarc_plot_write, and those of dragarc_sprinkler_overlap. */
int dragarc_sprinkler_plot(const char *path, const dragarc_sprinkler_spec *spec, const dragarc_sprinkler_result *r,
                           const char *title, dragarc_error *err);

/* The `drift --plot` figure of result r, run from spec with classes (spec->nclasses of them), into path: the
 * deposit (% of the emitted volume per metre) against the distance downwind, in total and in four bands of drop
 * size split at the spectrum's Dv10, Dv50 and Dv90, with the buffer; the share deposited within each distance,
 * with the 90 % and 99 % distances; and the spectrum's cumulative volume fraction against the diameter (um) with
 * Dv10, Dv50, Dv90 and the smallest drop that lands before the buffer. title as above. Errors as dragarc_plot_write;
 * DRAGARC_EINVAL when nothing was deposited. */
int dragarc_drift_plot(const char *path, const dragarc_drift_spec *spec, const dragarc_spectrum_class *classes,
                       const dragarc_drift_result *r, const char *title, dragarc_error *err);
/* ---- the pictures of a debris footprint (src/io/footprint_plot.c; described in docs/plots.md) ---- */

struct dragarc_footprint_spec;
struct dragarc_footprint_summary;
struct dragarc_impact;

/* The most impact points a footprint plot draws; above it, every k-th landed sample (k the smallest that fits),
 * and the panel's title says so. */
#define DRAGARC_FOOTPRINT_PLOT_POINTS 12000

typedef struct dragarc_footprint_plot_options {
    const char *title; /* names the scenario in every panel's title (NULL: the scenario's name) */
} dragarc_footprint_plot_options;

/* The `footprint --plot` figure of a run (spec, its impacts and their summary s) into path: a map of the impact
 * points (those at or above the hazard energy with their own marker), the 1 and 3 sigma ellipses of all fragments
 * (and the 3 sigma ellipse of each class when there are at most four), the point below the breakup and the mean
 * impact; and a map of the density of fragments per km^2 with the 90, 99 and 99.9 % contours. East and north of
 * the point below the breakup, in m, or km when the maps span more than 5 km; equal scales, a scale bar and a
 * north arrow. Reads only; the numbers of the run are not changed. Errors as dragarc_plot_write; DRAGARC_EINVAL
 * when no sample landed. */
int dragarc_footprint_plot(const char *path, const struct dragarc_footprint_spec *spec,
                           const struct dragarc_impact *impacts, const struct dragarc_footprint_summary *s,
                           const dragarc_footprint_plot_options *o, dragarc_error *err);

#ifdef __cplusplus
}
#endif
#endif
