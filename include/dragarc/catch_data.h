/* catch_data.h: catch-can test data: read from a CSV file, reported with its uniformity as JSON.
 *
 * Copyright (C) 2026 the dragarc developers. SPDX-License-Identifier: GPL-3.0-or-later
 *
 * The CSV format (a header row; a depth column, optional x and y, optional area) is in docs/uniformity.md.
 */
#ifndef DRAGARC_CATCH_DATA_H
#define DRAGARC_CATCH_DATA_H

#include <stddef.h>

#include "dragarc/dragarc.h"
#include "dragarc/uniformity.h"

#ifdef __cplusplus
extern "C" {
#endif

/* The catches of one test, in the file's units (depth in any one unit; x, y in any one unit). */
typedef struct dragarc_catches {
    size_t n;      /* catches (data rows) */
    double *depth; /* n depths, owned */
    double *area;  /* n areas, owned; NULL when the file has no area column (equal areas) */
    double *x, *y; /* n positions, owned; NULL when the file has no x and y columns */
} dragarc_catches;

/* Largest catch file read, bytes. */
#define DRAGARC_CATCHES_MAX_BYTES (64u << 20)

/* Parse CSV text into *c (caller frees with dragarc_catches_clear, also after a failure). DRAGARC_EINVAL
 * with field "line N: column" (or "line N", or "" for the file as a whole) and a message quoting the bad
 * text; DRAGARC_ENOMEM. Every value is checked as dragarc_uniformity_check_catch checks it. */
int dragarc_catches_parse(const char *text, dragarc_catches *c, dragarc_error *err);

/* Read and parse the file at path; DRAGARC_EIO (reason in the message) when it cannot be read. */
int dragarc_catches_read(const char *path, dragarc_catches *c, dragarc_error *err);

/* Free the arrays; the struct may then be reused. NULL is fine. */
void dragarc_catches_clear(dragarc_catches *c);

/* The grid's extent when the catches have x and y: ext = {x_min, x_max, y_min, y_max}; 0 when they do, -1
 * when they have no positions. */
int dragarc_catches_extent(const dragarc_catches *c, double ext[4]);

/* The `uniformity --json` document: {"file", "dragarc_version", "catches", "areas", "mean", "min", "max",
 * "sd", "cv", "cu", "low_quarter_mean", "du_lq", ["total_area"], ["grid"], "units", "cautions"}. Borrows
 * everything; caller frees the text with free(); NULL when out of memory. */
char *dragarc_uniformity_json(const char *file, const dragarc_catches *c, const dragarc_uniformity *u);

#ifdef __cplusplus
}
#endif
#endif
