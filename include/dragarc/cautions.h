/* cautions.h: the plain-language cautions that go with results a person could act on.
 *
 * Copyright (C) 2026 the dragarc developers. SPDX-License-Identifier: GPL-3.0-or-later
 */
#ifndef DRAGARC_CAUTIONS_H
#define DRAGARC_CAUTIONS_H

#include <stddef.h>
#include <stdio.h>

#include "dragarc/flight.h"
#include "dragarc/scenario.h"

#ifdef __cplusplus
extern "C" {
#endif

/* The most cautions any result carries. */
#define DRAGARC_CAUTIONS_MAX 10

/* Point out[0..max-1] at static caution strings for this flight (model limits first, then what the
 * flight's notes call for); returns how many were set. The strings are static: never free them. */
size_t dragarc_cautions_flight(const dragarc_scenario *s, const dragarc_flight *f, const char **out, size_t max);

/* The same for a set of DRAGARC_NOTE_* flags, e.g. the union over the rows of a table. */
size_t dragarc_cautions_notes(unsigned notes, const char **out, size_t max);

/* The cautions of an optimum (dragarc_optimize_solve) whose flight has these notes: those of the flight, then
 * that the optimum is that of one modelled flight. */
size_t dragarc_cautions_optimum(unsigned notes, const char **out, size_t max);
/* The cautions that go with a fit to a measured track (fit.h); static strings. */
size_t dragarc_cautions_fit(const char **out, size_t max);

/* The cautions that go with a uniformity result (catch-can tests, overlapped patterns); static strings. */
size_t dragarc_cautions_uniformity(const char **out, size_t max);
/* Print "Cautions:" and those cautions as wrapped "  - " items. */
void dragarc_cautions_print_uniformity(FILE *fp, int width);

#ifdef __cplusplus
}
#endif
#endif
