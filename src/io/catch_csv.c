/* catch_csv.c: catch-can data from a CSV file: a header row naming the columns (depth; optionally x and y,
 * and area), then one can a row.
 * SPDX-License-Identifier: GPL-3.0-or-later
 *
 * Plain CSV as spreadsheets export it: fields separated by commas, spaces around a field ignored, a field
 * may sit in double quotes, a UTF-8 byte-order mark and CR LF line ends are accepted, blank lines skipped.
 * Names are matched without regard to case. Other columns are refused, so that a misspelt "area" is never
 * silently read as equal areas. Values are plain numbers; the depth may be in any unit, as long as every can
 * uses the same one.
 */
#define _POSIX_C_SOURCE 200809L
#include <math.h>
#include <stdio.h>
#include <stdlib.h>
#include <string.h>

#include <gsl/gsl_statistics_double.h>

#include "dragarc/catch_data.h"
#include "dragarc/output.h"
#include "io/csv_in.h"

enum { COL_DEPTH, COL_X, COL_Y, COL_AREA, NCOLS };
static const char *const COL_NAMES[NCOLS] = {"depth", "x", "y", "area"};

void dragarc_catches_clear(dragarc_catches *c)
{
    if (!c)
        return;
    double *cols[NCOLS] = {c->depth, c->x, c->y, c->area};
    for (int k = 0; k < NCOLS; k++)
        free(cols[k]);
    memset(c, 0, sizeof *c);
}

static const dragarc_csv_columns COLUMNS = {COL_NAMES, NCOLS, "depth, and optionally x and y, area"};

/* The header names depth, and x with y or neither. */
static int check_header(const int *where, const char *at, void *ctx, dragarc_error *err)
{
    (void)ctx;
    if (where[COL_DEPTH] < 0)
        return dragarc_error_set(err, DRAGARC_EINVAL, at, "no depth column: the header must name one (depth, and "
                                 "optionally x and y, area)");
    if ((where[COL_X] < 0) != (where[COL_Y] < 0))
        return dragarc_error_set(err, DRAGARC_EINVAL, at, "%s without %s: a grid position needs both",
                                 where[COL_X] >= 0 ? "x" : "y", where[COL_X] >= 0 ? "y" : "x");
    return DRAGARC_OK;
}

/* The value of column k on a row, checked. */
static int read_value(const char *text, int k, size_t line, double *out, dragarc_error *err)
{
    double v;
    int rc = dragarc_csv_number(text, line, COL_NAMES[k], &v, err);
    if (rc != DRAGARC_OK)
        return rc;
    if (k == COL_DEPTH || k == COL_AREA) {
        dragarc_error why;
        rc = dragarc_uniformity_check_catch(k == COL_DEPTH ? v : 0.0, k == COL_AREA ? v : NAN, &why);
        if (rc != DRAGARC_OK) {
            char at[48];
            snprintf(at, sizeof at, "line %zu: %s", line, COL_NAMES[k]);
            return dragarc_error_set(err, rc, at, "%s", why.message);
        }
    }
    *out = v;
    return rc;
}

/* Room for at least n + 1 catches in every column the file has. */
static int grow(dragarc_catches *c, size_t *cap, const int *where, dragarc_error *err)
{
    if (c->n < *cap)
        return DRAGARC_OK;
    size_t m = *cap ? 2 * *cap : 64;
    double **cols[NCOLS] = {&c->depth, &c->x, &c->y, &c->area};
    for (int k = 0; k < NCOLS; k++) {
        if (where[k] < 0)
            continue;
        double *p = realloc(*cols[k], m * sizeof *p);
        if (!p)
            return dragarc_error_set(err, DRAGARC_ENOMEM, "", "out of memory after %zu catches", c->n);
        *cols[k] = p;
    }
    *cap = m;
    return DRAGARC_OK;
}

/* The catches read so far. */
typedef struct reading {
    dragarc_catches *c;
    size_t cap;
} reading;

static int read_row(char **field, const int *where, size_t line, void *ctx, dragarc_error *err)
{
    reading *r = ctx;
    dragarc_catches *c = r->c;
    int rc = grow(c, &r->cap, where, err);
    double *cols[NCOLS] = {c->depth, c->x, c->y, c->area};
    for (int k = 0; k < NCOLS && rc == DRAGARC_OK; k++)
        if (where[k] >= 0)
            rc = read_value(field[where[k]], k, line, &cols[k][c->n], err);
    c->n += rc == DRAGARC_OK;
    return rc;
}

int dragarc_catches_parse(const char *text, dragarc_catches *c, dragarc_error *err)
{
    memset(c, 0, sizeof *c);
    char *copy = strdup(dragarc_csv_skip_bom(text));
    if (!copy)
        return dragarc_error_set(err, DRAGARC_ENOMEM, "", "out of memory reading the catches");
    reading r = {c, 0};
    int header;
    int rc = dragarc_csv_read(copy, &COLUMNS, check_header, read_row, &r, &header, err);
    free(copy);
    if (rc == DRAGARC_OK && !header)
        rc = dragarc_error_set(err, DRAGARC_EINVAL, "", "the file is empty: expected a header row naming the columns "
                               "(depth, and optionally x and y, area), then one can a row");
    else if (rc == DRAGARC_OK && c->n == 0)
        rc = dragarc_error_set(err, DRAGARC_EINVAL, "", "no catches: the header row is followed by no data rows");
    return rc;
}

int dragarc_catches_read(const char *path, dragarc_catches *c, dragarc_error *err)
{
    memset(c, 0, sizeof *c);
    char *text;
    int rc = dragarc_text_file_read(path, DRAGARC_CATCHES_MAX_BYTES, &text, err);
    if (rc != DRAGARC_OK)
        return rc;
    rc = dragarc_catches_parse(text, c, err);
    free(text);
    return rc;
}

int dragarc_catches_extent(const dragarc_catches *c, double ext[4])
{
    if (!c->x || !c->y || c->n == 0)
        return -1;
    gsl_stats_minmax(&ext[0], &ext[1], c->x, 1, c->n);
    gsl_stats_minmax(&ext[2], &ext[3], c->y, 1, c->n);
    return 0;
}
