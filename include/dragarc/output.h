/* output.h: files written whole or not at all, and the text forms of results (JSON, CSV).
 *
 * Copyright (C) 2026 the dragarc developers. SPDX-License-Identifier: GPL-3.0-or-later
 *
 * An output file is written to a temporary name beside its destination and renamed over it only when
 * complete, so a failed or interrupted run never leaves a partial or misleading file.
 */
#ifndef DRAGARC_OUTPUT_H
#define DRAGARC_OUTPUT_H

#include <stddef.h>
#include <stdio.h>

#include "dragarc/atmosphere.h"
#include "dragarc/dragarc.h"
#include "dragarc/flight.h"
#include "dragarc/optimize.h"
#include "dragarc/scenario.h"
#include "dragarc/sweep.h"
#include "dragarc/units.h"

#ifdef __cplusplus
extern "C" {
#endif

/* Read a whole text file (at most max_bytes) into a NUL-terminated buffer; caller frees *out with
 * free(). DRAGARC_EIO with the reason (errno text) in the message; the caller names the file. */
int dragarc_text_file_read(const char *path, size_t max_bytes, char **out, dragarc_error *err);

/* An output file being written. */
typedef struct dragarc_output {
    FILE *fp;            /* write here */
    char path[4096];     /* destination */
    char tmp_path[4096]; /* temporary file beside it */
} dragarc_output;

/* Open a temporary file beside `path` for writing. "-" writes to standard output directly. */
int dragarc_output_open(dragarc_output *o, const char *path, dragarc_error *err);
/* Flush, close and rename the temporary file onto the destination. On failure the temporary file is
 * removed and the destination is untouched. */
int dragarc_output_commit(dragarc_output *o, dragarc_error *err);
/* Close and remove the temporary file; the destination is untouched. Safe after commit. */
void dragarc_output_abort(dragarc_output *o);

/* Remove every temporary file that an open dragarc_output holds (those opened and not yet committed or aborted):
 * for a program's SIGINT / SIGTERM handler, so that an interrupted run leaves no partial file behind. It only
 * calls unlink and reads lock-free atomics, so it is async-signal-safe; the library installs no handler itself.
 * At most DRAGARC_OUTPUT_PENDING_MAX outputs are tracked at once (more are still written whole, but one that is
 * interrupted may leave its temporary file). */
#define DRAGARC_OUTPUT_PENDING_MAX 32
void dragarc_output_remove_pending(void);

/* The shortest "%.*g" (10 to 17 significant digits, C locale) that reads back to the same double, into
 * buf (32 bytes suffice); "" for a value that is not finite. The number form of every CSV and JSON table. */
void dragarc_number_format(char *buf, size_t size, double v);

/* The same number written to fp ("" when not finite); as a JSON value (null when not finite). */
void dragarc_number_write(FILE *fp, double v);
void dragarc_json_number(FILE *fp, double v);
/* A CSV field (quoted, quotes doubled, when it holds a comma, a quote or a line break; line breaks become
 * spaces), and a JSON string with its quotes and escapes. */
void dragarc_csv_text(FILE *fp, const char *s);
void dragarc_json_text(FILE *fp, const char *s);

/* Print text after `prefix`, wrapped at `width` columns, continuation lines indented by `indent`. */
void dragarc_text_wrap(FILE *fp, const char *prefix, int indent, int width, const char *text);

/* Print "Cautions:" and the cautions for these DRAGARC_NOTE_* flags as wrapped "  - " items. */
void dragarc_cautions_print(FILE *fp, unsigned notes, int width);
/* The same for a list of n cautions (dragarc_cautions_*). */
void dragarc_cautions_print_list(FILE *fp, const char *const *cautions, size_t n, int width);

/* Write the flight's sampled points as CSV with a header row whose names carry the units of display d
 * (NULL: SI): t_s,x_m,y_m,z_m,vx_m_s,vy_m_s,vz_m_s,speed_m_s,mach,reynolds. */
int dragarc_flight_write_csv(FILE *fp, const dragarc_flight *f, const dragarc_display *d, dragarc_error *err);

/* The `fly --json` document: {"scenario", "summary": {...}, "solver": {...}, "units": {...}, "cautions": [...]},
 * values in the units of display d (NULL: SI, degrees for angles), each named in "units". Caller frees the
 * returned string with free(); NULL when out of memory. */
char *dragarc_flight_json(const dragarc_scenario *s, const dragarc_flight *f, const dragarc_display *d);

/* "m/s" -> "m_s", "ft.lbf" -> "ft_lbf": a unit as the tail of a column name (n bytes at most). */
void dragarc_unit_column_suffix(const char *symbol, char *out, size_t n);

/* The `aim --json` document: {"scenario", "target", "solutions": [...], "max_range",
 * "max_range_elevation", "flights", "units", "cautions"}, in the units of display d (NULL: SI, degrees for
 * angles) named in "units". Caller frees with free(). */
struct dragarc_aim_request;
struct dragarc_aim_result;
char *dragarc_aim_json(const dragarc_scenario *s, const struct dragarc_aim_request *req,
                       const struct dragarc_aim_result *r, const dragarc_display *d);

/* ---- fits to measured tracks (fit.h; the output is documented in docs/fit.md) ---- */

struct dragarc_fit_result;
struct dragarc_track;

/* The unit an estimate is shown in ("", "m/s", "deg", "kg/m^2", "m") and its value in that unit (angles in
 * degrees; everything else SI). */
const char *dragarc_fit_param_unit(int param);
double dragarc_fit_param_shown(int param, double si);

/* The decimals that quote a value with standard error se to two significant figures of se (common practice, no
 * source), between 0 and 12. */
int dragarc_fit_decimals(double se);

/* The result's warnings as sentences, one per DRAGARC_FIT_* flag set, into out[k] (at most max, each n bytes);
 * returns how many. */
size_t dragarc_fit_warnings(const struct dragarc_fit_result *r, char (*out)[512], size_t max);

/* The `fit --json` document: the scenario and track, the method and its convergence, the estimates (start, value,
 * standard error, 95 % interval, in the units of dragarc_fit_param_unit), the correlation matrix, chi-square, the
 * residual RMS, the conditioning, the warnings and cautions. Caller frees with free(); NULL when out of memory. */
char *dragarc_fit_json(const char *scenario, const char *track_file, const struct dragarc_track *track,
                       const struct dragarc_fit_result *r);

/* The residuals (measured - fitted) as CSV: t_s, dx_m, dy_m, dz_m (and dvx_m_s, dvy_m_s, dvz_m_s with velocities). */
int dragarc_fit_write_residuals_csv(FILE *fp, const struct dragarc_track *track, const struct dragarc_fit_result *r,
                                    dragarc_error *err);

/* ---- optima (optimize.h; the output is documented in docs/optimize.md) ---- */

/* The unit the objective of an optimisation is shown in: the "range" field's for the carry, the length
 * unit's for the total distance. */
const dragarc_unit_out *dragarc_optimize_objective_unit(const dragarc_display *d, dragarc_optimize_objective o);

/* A derivative of the objective with respect to parameter p, given in m per unit of p to the power `order`
 * (1: the slope, 2: the curvature), in the units of display d (NULL: SI); its unit goes to unit[n] as
 * "m/degree^2" ("deg" for "degree" when abbrev; the objective's unit alone for a pure number). */
double dragarc_optimize_derivative_shown(const dragarc_display *d, dragarc_optimize_objective o,
                                         const dragarc_scenario_param *p, double value, int order, int abbrev,
                                         char *unit, size_t n);

/* The `optimize --json` document: {"scenario", "dragarc_version", "maximize", "objective", "varied": [...],
 * "search": {...}, "summary": {...}, "solver": {...}, "units", "cautions"} for the optimum r of req, s being
 * the scenario with the optimum applied; values in the units of display d (NULL: SI, degrees for angles).
 * Caller frees with free(); NULL when out of memory. */
char *dragarc_optimize_json(const dragarc_scenario *s, const dragarc_optimize_request *req,
                            const dragarc_optimize_result *r, const dragarc_display *d);

/* Output forms of the tables. */
typedef enum dragarc_table_format {
    DRAGARC_TABLE_TEXT = 0, /* aligned columns for a 100-column terminal, then the cautions */
    DRAGARC_TABLE_CSV,      /* header row with SI units in the names; data only */
    DRAGARC_TABLE_JSON,     /* rows, units and cautions */
    DRAGARC_TABLE_MARKDOWN  /* a pipe table, then the cautions */
} dragarc_table_format;

/* Write an aim table (dragarc_aim_table's rows for target plane `height`, m) in the given form, in the units
 * of display d (NULL: SI, degrees for angles). */
struct dragarc_aim_table_row;
int dragarc_aim_table_write(FILE *fp, dragarc_table_format format, const char *scenario, double height,
                            const struct dragarc_aim_table_row *rows, size_t n, const dragarc_display *d,
                            dragarc_error *err);

/* The `atmosphere --json` document for atmosphere atm (isa: its temperature offset, n geometric altitudes in
 * m; local: the site's weather, n heights above the site in m) and the states there, in the units of
 * display d (NULL: SI) named in "units". Borrows everything; caller frees the text with free(). */
/* A sprinkler's result as one JSON document (SI units): the nozzle, the classes flown and where each landed (its
 * mean distance and time over the directions), the radial profile, the wetted radius, the shares of the flow
 * deposited and evaporated, and the cautions. Caller frees with free(); NULL when out of memory. */
struct dragarc_sprinkler_spec;
struct dragarc_sprinkler_result;
struct dragarc_spectrum_class;
char *dragarc_sprinkler_json(const struct dragarc_sprinkler_spec *spec, const struct dragarc_spectrum_class *classes,
                             const struct dragarc_sprinkler_result *r);

/* The radial profile (r_inner_m,r_outer_m,rate_mm_h) and the grid (x_m,y_m,rate_mm_h at cell centres) as CSV. */
int dragarc_sprinkler_write_profile_csv(FILE *fp, const struct dragarc_sprinkler_result *r, double ring_width,
                                        dragarc_error *err);
int dragarc_sprinkler_write_grid_csv(FILE *fp, const struct dragarc_sprinkler_result *r, dragarc_error *err);

/* A drift result as one JSON document (SI units) and its deposit per metre as CSV (bin bounds, the total, then one
 * column per class). */
struct dragarc_drift_spec;
struct dragarc_drift_result;
char *dragarc_drift_json(const struct dragarc_drift_spec *spec, const struct dragarc_drift_result *r);
int dragarc_drift_write_csv(FILE *fp, const struct dragarc_drift_result *r, dragarc_error *err);

/* A footprint's result as one JSON document (SI units, angles in degrees): the breakup, every class and all
 * fragments together (mean impact with its latitude and longitude, covariance, 1-3 sigma ellipses, downrange and
 * crossrange quantiles, impact speeds and energies, the hazardous share, E_c), the contours, the published
 * criteria (as references), the cautions. Caller frees with free(); NULL when out of memory. */
struct dragarc_footprint_spec;
struct dragarc_footprint_summary;
struct dragarc_impact;
char *dragarc_footprint_json(const struct dragarc_footprint_spec *spec, const struct dragarc_impact *impacts,
                             const struct dragarc_footprint_summary *s);
/* Every sample's impact as CSV: class,sample,outcome,east_m,north_m,longitude,latitude,impact_speed_m_s,
 * impact_angle_deg (below the horizontal),energy_j,time_s,fragments (the empty string where a flight did not
 * land). */
int dragarc_footprint_write_csv(FILE *fp, const struct dragarc_footprint_spec *spec,
                                const struct dragarc_impact *impacts, dragarc_error *err);
/* The density of impacts on the summary's grid as CSV, a cell a row (all cells, rows south to north, west to east
 * within a row): east_m,north_m (the cell's centre),longitude,latitude,fragments_per_km2,probability_per_km2. */
struct dragarc_footprint_summary;
int dragarc_footprint_write_grid_csv(FILE *fp, const struct dragarc_footprint_spec *spec,
                                     const struct dragarc_footprint_summary *s, dragarc_error *err);
/* The footprint as an RFC 7946 FeatureCollection written to path (src/io/footprint_geojson.c): the breakup point,
 * the impact points (at most DRAGARC_FOOTPRINT_GEOJSON_POINTS, evenly taken), the 1 and 3 sigma ellipses of every
 * class and of all fragments, and the contours. */
#define DRAGARC_FOOTPRINT_GEOJSON_POINTS 20000
int dragarc_footprint_write_geojson(const char *path, const struct dragarc_footprint_spec *spec,
                                    const struct dragarc_impact *impacts, const struct dragarc_footprint_summary *s,
                                    dragarc_error *err);

char *dragarc_atmosphere_json(const dragarc_atmosphere *atm, const double *altitudes, const dragarc_air *levels,
                              size_t n, const dragarc_display *d);

/* ---- tables of flights (sweep.h; the formats are documented in docs/table.md) ---- */

/* The summary columns of every table format, in their order. */
typedef enum dragarc_sweep_column {
    DRAGARC_SWEEP_RANGE = 0,
    DRAGARC_SWEEP_DOWNRANGE,
    DRAGARC_SWEEP_CROSSRANGE,
    DRAGARC_SWEEP_TIME_OF_FLIGHT,
    DRAGARC_SWEEP_APEX_HEIGHT,
    DRAGARC_SWEEP_IMPACT_SPEED,
    DRAGARC_SWEEP_IMPACT_ANGLE,
    DRAGARC_SWEEP_IMPACT_ENERGY,
    DRAGARC_SWEEP_TERMINAL_SPEED,
    DRAGARC_SWEEP_NCOLUMNS
} dragarc_sweep_column;

/* Names of a column. Static storage. */
typedef struct dragarc_sweep_column_info {
    const char *key;   /* JSON key, "time_of_flight" */
    const char *csv;   /* CSV name with its SI unit, "time_of_flight_s" */
    const char *label; /* readable name, "time of flight" */
    const char *brief; /* short heading, "time" */
    const char *unit;  /* SI unit, "s"; "degree" for the angle */
    dragarc_quantity quantity;
} dragarc_sweep_column_info;

/* The names of column c (NULL outside 0 .. DRAGARC_SWEEP_NCOLUMNS-1). */
const dragarc_sweep_column_info *dragarc_sweep_column_about(dragarc_sweep_column c);

/* Column c of a row in SI units (degrees for the impact angle); NaN in a failed row. */
double dragarc_sweep_column_value(const dragarc_sweep_row *row, dragarc_sweep_column c);

/* The same in the units of display d (NULL: SI), and that unit. */
double dragarc_sweep_shown(const dragarc_display *d, const dragarc_sweep_row *row, dragarc_sweep_column c);
const char *dragarc_sweep_column_unit(const dragarc_display *d, dragarc_sweep_column c);

/* A value of parameter p (in its own units: degrees, rpm, SI) in the units of display d (NULL: as it is),
 * to 15 significant digits when as_given (a value the user typed: dragarc_display_value_as_given); and that
 * unit ("" for a pure number). */
double dragarc_scenario_param_shown(const dragarc_display *d, const dragarc_scenario_param *p, double v, int as_given);
const char *dragarc_scenario_param_unit(const dragarc_display *d, const dragarc_scenario_param *p);

/* A value of a varied parameter (in its SI unit, degrees for angles) in the units of display d, and that
 * unit ("" for a pure number). */
double dragarc_sweep_axis_shown(const dragarc_display *d, const dragarc_sweep_axis *axis, double v);
const char *dragarc_sweep_axis_unit(const dragarc_display *d, const dragarc_sweep_axis *axis);

/* Decimals for printing column c (in the units of d) of a readable table with one decimal point for all
 * rows: five significant digits at the column's largest value among the rows that flew (0 to 6 decimals),
 * one for the angle. The energy, which spans many orders of magnitude, is printed "%.3g" instead. */
int dragarc_sweep_column_decimals(const dragarc_sweep *t, dragarc_sweep_column c, const dragarc_display *d);

/* Readable cell of column c in the units of d (decimals from dragarc_sweep_column_decimals): "" in a failed
 * row, "none" for a value that does not exist (no terminal speed). */
void dragarc_sweep_cell_format(char *buf, size_t size, const dragarc_sweep_row *row, dragarc_sweep_column c,
                               int decimals, const dragarc_display *d);

/* "degree" -> "deg"; other units as they are. */
const char *dragarc_unit_abbrev(const char *unit);

/* "from 30 to 45 by 5 m/s": the range of an axis in the units of d, numbers in their exact form. */
void dragarc_sweep_axis_describe(char *buf, size_t size, const dragarc_sweep_axis *axis, const dragarc_display *d);

/* CSV: a header row, then one row per flight; the varied parameters by key path with their unit, then
 * range_m, ..., terminal_speed_m_s (the units of display d, NULL: SI), status ("ok" or the status name),
 * message (why a row failed). Pure data: no cautions, no comments. DRAGARC_EIO when writing fails, as for
 * the writers below. */
int dragarc_sweep_write_csv(FILE *fp, const dragarc_sweep *t, const dragarc_display *d, dragarc_error *err);

/* JSON: {"scenario", "dragarc_version", "varied": [...], "rows": [...], "failed_rows", "units",
 * "cautions"}; values in the units of d (NULL: SI, degrees for angles) named in "units", values that do
 * not exist as null. Written as it goes, one row a line. */
int dragarc_sweep_write_json(FILE *fp, const dragarc_sweep *t, const dragarc_display *d, dragarc_error *err);

/* Markdown: a heading line, a pipe table of every column rounded for reading, then the cautions. */
int dragarc_sweep_write_markdown(FILE *fp, const dragarc_sweep *t, const dragarc_display *d, dragarc_error *err);

#ifdef __cplusplus
}
#endif
#endif
