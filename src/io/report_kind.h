/* report_kind.h: what the report kinds (report_fly.c, report_aim.c, report_sprinkler.c, report_drift.c) share.
 * SPDX-License-Identifier: GPL-3.0-or-later
 *
 * Private to src/io: key-value rows and data tables filled with formatted text, values in a display's units, the
 * scenario's inputs as the fly report shows them, and the models of a scenario's flights with the sources
 * docs/models.md gives for them.
 */
#ifndef DRAGARC_REPORT_KIND_H
#define DRAGARC_REPORT_KIND_H

#include <stddef.h>

#include "dragarc/report.h"
#include "dragarc/scenario.h"
#include "dragarc/spectrum.h"
#include "dragarc/units.h"

#define REPORT_PI 3.14159265358979323846
#define REPORT_DEG (180.0 / REPORT_PI)

#define REPORT_MAX_PAIRS 32
#define REPORT_MAX_TEXT 160

/* Rows of a key-value table being filled, text kept in the table itself. */
typedef struct report_pairs {
    char text[2 * REPORT_MAX_PAIRS][REPORT_MAX_TEXT];
    const char *ptr[2 * REPORT_MAX_PAIRS];
    size_t n;
} report_pairs;

/* Add a row: key and a printf-formatted value. Rows past REPORT_MAX_PAIRS are dropped. */
void report_add(report_pairs *p, const char *key, const char *fmt, ...) __attribute__((format(printf, 3, 4)));

/* Add the rows to r under caption (dragarc_report_pairs). */
int report_pairs_emit(dragarc_report *r, const char *caption, const report_pairs *p, dragarc_error *err);

/* A data table being filled: nrows x ncols cells of formatted text (malloc'd by report_grid_init). */
#define REPORT_CELL 48
typedef struct report_grid {
    size_t nrows, ncols;
    char (*cell)[REPORT_CELL];
    const char **ptr;
} report_grid;

/* DRAGARC_OK or DRAGARC_ENOMEM. report_grid_free frees it (also after failure). */
int report_grid_init(report_grid *g, size_t nrows, size_t ncols, dragarc_error *err);
void report_grid_set(report_grid *g, size_t i, size_t j, const char *fmt, ...) __attribute__((format(printf, 4, 5)));
/* Cell (i, j) as v to `decimals` decimals, never "-0.00"; empty when v is not finite. */
void report_grid_number(report_grid *g, size_t i, size_t j, int decimals, double v);
/* Add the table to r (dragarc_report_table): headings[ncols], numeric[ncols] (may be NULL). */
int report_grid_emit(dragarc_report *r, const char *caption, const report_grid *g, const char *const *headings,
                     const int *numeric, dragarc_error *err);
void report_grid_free(report_grid *g);

/* A value of output field `field` (quantity q) in the display's unit, and that unit's symbol ("deg" for degrees). */
double report_shown(const dragarc_display *d, const char *field, dragarc_quantity q, double si);
const char *report_unit(const dragarc_display *d, const char *field, dragarc_quantity q);
#define REPORT_SHOW(field, q, v) report_shown(d, field, q, v), report_unit(d, field, q)

/* v to `decimals` decimals in a 32-byte cell, never "-0.00". */
void report_number(char *cell, int decimals, double v);

/* The rows that describe a scenario's air: the atmosphere and the wind, in the units of d. */
void report_air_inputs(report_pairs *p, const dragarc_scenario *s, const dragarc_display *d);

/* The scenario's main fields (projectile, launch, air, gravity, Earth, ground, solver) as the fly report shows them,
 * added to r as the table "Scenario". */
int report_scenario_inputs(dragarc_report *r, const dragarc_scenario *s, const dragarc_display *d, dragarc_error *err);

/* The models a flight of scenario s used (equations of motion, atmosphere, drag, spin lift, wind, evaporation,
 * bounce, Earth, the integrator `method`; DRAGARC_METHOD_AUTO names both the integrators auto may choose) with the
 * sources docs/models.md gives, added to r's list (dragarc_report_source). */
int report_flight_sources(dragarc_report *r, const dragarc_scenario *s, dragarc_method method, dragarc_error *err);

/* The rows that describe a spray's drop sizes: the spectrum's form, its Dv10, Dv50, Dv90 and span, the classes. */
void report_spectrum_inputs(report_pairs *p, const dragarc_spectrum *sp, size_t nclasses,
                            dragarc_spectrum_spacing spacing);

/* The published casualty criteria as a key-value table, captioned as references for comparison only. */
int report_published_criteria(dragarc_report *r, dragarc_error *err);

/* The models of a spray's flights (report_flight_sources of its base scenario) and of its drop sizes, with sources. */
int report_spray_sources(dragarc_report *r, const dragarc_scenario *base, dragarc_spectrum_form form,
                         dragarc_error *err);

#endif
