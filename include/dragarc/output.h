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
#include "dragarc/scenario.h"
#include "dragarc/sweep.h"

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

/* The shortest "%.*g" (10 to 17 significant digits, C locale) that reads back to the same double, into
 * buf (32 bytes suffice); "" for a value that is not finite. The number form of every CSV and JSON table. */
void dragarc_number_format(char *buf, size_t size, double v);

/* Decimals (0 to 6) that print the largest finite |v[i]| with `digits` significant digits: one
 * decimal point for a whole column of a human-readable table. 0 when no value is finite. */
int dragarc_number_decimals(const double *v, size_t n, int digits);

/* Write the flight's sampled points as CSV with a header row:
 * t,x,y,z,vx,vy,vz,speed,mach,reynolds (SI units; the header names the unit of each column). */
int dragarc_flight_write_csv(FILE *fp, const dragarc_flight *f, dragarc_error *err);

/* The `fly --json` document: {"scenario", "summary": {...}, "solver": {...}, "cautions": [...]}.
 * Angles in degrees. Caller frees the returned string with free(); NULL when out of memory. */
char *dragarc_flight_json(const dragarc_scenario *s, const dragarc_flight *f);

/* The `atmosphere --json` document for n altitudes (m) and their states. Caller frees with free(). */
char *dragarc_atmosphere_json(const double *altitudes, const dragarc_air *levels, size_t n, double temperature_offset);

/* Tables of flights (sweep.h; formats in docs/table.md). Each returns DRAGARC_EIO when writing fails.
 * CSV: a header row, then one row per flight; varied parameters by key path with their unit, then
 * range_m, ..., terminal_speed_m_s, status ("ok" or the status name), message (why a row failed).
 * Pure data: no cautions, no comments. */
int dragarc_sweep_write_csv(FILE *fp, const dragarc_sweep *t, dragarc_error *err);
/* JSON: {"scenario", "dragarc_version", "varied": [...], "rows": [...], "failed_rows", "units",
 * "cautions"}; angles in degrees, values that do not exist as null. Written as it goes, one row a line. */
int dragarc_sweep_write_json(FILE *fp, const dragarc_sweep *t, dragarc_error *err);
/* Markdown: a heading line, a pipe table of every column rounded for reading, then the cautions. */
int dragarc_sweep_write_markdown(FILE *fp, const dragarc_sweep *t, dragarc_error *err);

#ifdef __cplusplus
}
#endif
#endif
