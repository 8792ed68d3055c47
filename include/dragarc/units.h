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

#ifdef __cplusplus
}
#endif
#endif
