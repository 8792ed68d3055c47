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

enum { COL_DEPTH, COL_X, COL_Y, COL_AREA, NCOLS };
static const char *const COL_NAMES[NCOLS] = {"depth", "x", "y", "area"};

#define MAX_FIELDS 64 /* columns in one row */

void dragarc_catches_clear(dragarc_catches *c)
{
    if (!c)
        return;
    double *cols[NCOLS] = {c->depth, c->x, c->y, c->area};
    for (int k = 0; k < NCOLS; k++)
        free(cols[k]);
    memset(c, 0, sizeof *c);
}

/* One line's fields, cut in place (the commas and the closing quotes become NULs). Returns the count, or
 * MAX_FIELDS + 1 when there are more. */
static size_t split(char *line, char **field)
{
    size_t n = 0;
    char *p = line;
    for (;;) {
        while (*p == ' ' || *p == '\t')
            p++;
        char *start = p, *end;
        if (*p == '"') {
            start = ++p;
            while (*p && *p != '"')
                p++;
            end = p;
            if (*p == '"')
                p++;
            while (*p && *p != ',')
                p++;
        } else {
            while (*p && *p != ',')
                p++;
            end = p;
            while (end > start && (end[-1] == ' ' || end[-1] == '\t'))
                end--;
        }
        if (n == MAX_FIELDS)
            return MAX_FIELDS + 1;
        field[n++] = start;
        int more = *p == ',';
        *end = '\0';
        if (!more)
            return n;
        p++;
    }
}

static int same_name(const char *a, const char *b)
{
    for (; *a && *b; a++, b++) {
        char ca = *a >= 'A' && *a <= 'Z' ? (char)(*a - 'A' + 'a') : *a;
        if (ca != *b)
            return 0;
    }
    return *a == *b;
}

/* The header: which field holds each column (-1: absent). */
static int read_header(char **field, size_t nf, const char *at, int *where, dragarc_error *err)
{
    for (int k = 0; k < NCOLS; k++)
        where[k] = -1;
    for (size_t f = 0; f < nf; f++) {
        int k = 0;
        while (k < NCOLS && !same_name(field[f], COL_NAMES[k]))
            k++;
        if (k == NCOLS)
            return dragarc_error_set(err, DRAGARC_EINVAL, at, "unknown column '%.40s' (the columns are depth, and "
                                     "optionally x and y, area)", field[f]);
        if (where[k] >= 0)
            return dragarc_error_set(err, DRAGARC_EINVAL, at, "column '%s' appears twice", COL_NAMES[k]);
        where[k] = (int)f;
    }
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
    char at[48];
    snprintf(at, sizeof at, "line %zu: %s", line, COL_NAMES[k]);
    char *end;
    double v = strtod(text, &end);
    if (end == text || *end != '\0' || !isfinite(v))
        return dragarc_error_set(err, DRAGARC_EINVAL, at, "not a number ('%.40s')", text);
    if (k == COL_DEPTH || k == COL_AREA) {
        dragarc_error why;
        int rc = dragarc_uniformity_check_catch(k == COL_DEPTH ? v : 0.0, k == COL_AREA ? v : NAN, &why);
        if (rc != DRAGARC_OK)
            return dragarc_error_set(err, rc, at, "%s", why.message);
    }
    *out = v;
    return DRAGARC_OK;
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

int dragarc_catches_parse(const char *text, dragarc_catches *c, dragarc_error *err)
{
    memset(c, 0, sizeof *c);
    if (strncmp(text, "\xEF\xBB\xBF", 3) == 0)
        text += 3;
    char *copy = strdup(text);
    if (!copy)
        return dragarc_error_set(err, DRAGARC_ENOMEM, "", "out of memory reading the catches");
    int where[NCOLS], header = 0, rc = DRAGARC_OK;
    size_t line = 0, cap = 0, columns = 0;
    char *field[MAX_FIELDS];
    for (char *p = copy, *next; p && rc == DRAGARC_OK; p = next) {
        line++;
        next = strchr(p, '\n');
        if (next)
            *next++ = '\0';
        size_t len = strlen(p);
        if (len > 0 && p[len - 1] == '\r')
            p[--len] = '\0';
        if (strspn(p, " \t") == len)
            continue; /* blank */
        size_t nf = split(p, field);
        char at[32];
        snprintf(at, sizeof at, "line %zu", line);
        if (nf > MAX_FIELDS) {
            rc = dragarc_error_set(err, DRAGARC_EINVAL, at, "more than %d fields", MAX_FIELDS);
        } else if (!header) {
            rc = read_header(field, nf, at, where, err);
            header = 1;
            columns = nf;
        } else if (nf != columns) {
            rc = dragarc_error_set(err, DRAGARC_EINVAL, at, "%zu fields, but the header names %zu column%s%s", nf,
                                   columns, columns == 1 ? "" : "s",
                                   nf > columns ? " (a decimal comma? write 1.5, not 1,5)" : "");
        } else if ((rc = grow(c, &cap, where, err)) == DRAGARC_OK) {
            double *cols[NCOLS] = {c->depth, c->x, c->y, c->area};
            for (int k = 0; k < NCOLS && rc == DRAGARC_OK; k++)
                if (where[k] >= 0)
                    rc = read_value(field[where[k]], k, line, &cols[k][c->n], err);
            c->n += rc == DRAGARC_OK;
        }
    }
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
