/* units.h: values with units at the interface, read with UDUNITS-2.
 *
 * Copyright (C) 2026 the dragarc developers. SPDX-License-Identifier: GPL-3.0-or-later
 *
 * Every numeric input may be a plain number in SI units (degrees for angles) or a string holding a number
 * and a unit ("89.5 mph", "250 um", "2.5 bar", "20 degC"). Each input has a quantity; a value whose unit
 * measures another quantity is an error that names both ("\"3 kg\" is a mass, expected a speed").
 * Temperature offsets are differences: "18 degF" is 10 K, not an absolute temperature.
 *
 * UDUNITS-2 (Unidata) does the parsing and conversion, with its own database; dragarc adds a few symbols
 * of the trades that UDUNITS reads otherwise (it takes "mph" as milli-phot and "nmi" as nano-mile) or
 * lacks ("deg", "gal", "gpm", "oz" as the avoirdupois ounce): see units.c. UDUNITS-2's parser keeps global
 * state, so one thread at a time may parse.
 */
#ifndef DRAGARC_UNITS_H
#define DRAGARC_UNITS_H

#include "dragarc/dragarc.h"
#include "dragarc/quantity.h"

#ifdef __cplusplus
extern "C" {
#endif

typedef struct dragarc_units dragarc_units;

/* Load UDUNITS-2's database (from UDUNITS2_XML_PATH, else the installed default) and dragarc's added
 * symbols; caller frees with dragarc_units_free. DRAGARC_EINVAL with a message when it cannot be read. */
int dragarc_units_new(dragarc_units **out, dragarc_error *err);

void dragarc_units_free(dragarc_units *u);

/* Read text ("89.5 mph", "-3 ft", "40": a number alone is in the quantity's own unit) as quantity q,
 * in SI units (degrees for angles) into *out. err->field is left empty for the caller to fill; the message
 * quotes the text. Errors: DRAGARC_EINVAL (no number, an unknown unit, a unit of another quantity, a pure
 * number given a unit, a result that is not finite). */
int dragarc_units_parse(dragarc_units *u, const char *text, dragarc_quantity q, double *out, dragarc_error *err);

/* ---- output units ---- */

/* One output unit: value_out = scale * value_SI + offset (offset only for absolute temperatures). */
typedef struct dragarc_unit_out {
    char symbol[24]; /* as printed: "m", "ft", "mph", "degree" */
    double scale, offset;
} dragarc_unit_out;

#define DRAGARC_DISPLAY_MAX_FIELDS 32

/* The units results are written in: one per quantity, and overrides for single output fields ("range"
 * in yards while other lengths are in feet). A plain struct: copy it freely. */
typedef struct dragarc_display {
    dragarc_unit_out quantity[DRAGARC_Q_COUNT];
    size_t nfields;
    struct {
        char name[32];
        dragarc_quantity q;
        dragarc_unit_out unit;
    } fields[DRAGARC_DISPLAY_MAX_FIELDS];
} dragarc_display;

/* SI units (degrees for angles); needs no units database. */
void dragarc_display_si(dragarc_display *d);

/* A named set: "si", or "us" (ft, mph, lb, degF, psi, ft.lbf, ...: docs/units.md). */
int dragarc_display_system(dragarc_display *d, dragarc_units *u, const char *name, dragarc_error *err);

/* Override KEY=UNIT: KEY is a quantity ("length", "speed", "energy", ...) or an output field ("range",
 * "impact_speed", ...: dragarc_display_fields); UNIT must measure the same quantity. */
int dragarc_display_set(dragarc_display *d, dragarc_units *u, const char *key, const char *unit, dragarc_error *err);

/* The unit for output field `field` (NULL: none) of quantity q. */
const dragarc_unit_out *dragarc_display_unit(const dragarc_display *d, const char *field, dragarc_quantity q);

/* A value in SI units (degrees for angles) in unit u. */
double dragarc_display_value(const dragarc_unit_out *u, double si);

/* The same to 15 significant digits, for values the user gave in that unit: "100 mph" went to 44.704 m/s
 * and would come back as 100.00000000000001; shown this way it is the 100 that was asked for. */
double dragarc_display_value_as_given(const dragarc_unit_out *u, double si);

/* The output fields that may be given a unit of their own, with their quantities; *count gets how many. */
typedef struct dragarc_output_field {
    const char *name;
    dragarc_quantity q;
} dragarc_output_field;
const dragarc_output_field *dragarc_display_fields(size_t *count);

#ifdef __cplusplus
}
#endif
#endif
