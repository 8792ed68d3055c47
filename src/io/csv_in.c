/* csv_in.c: the shared pieces of the CSV readers: lines, fields, column names (see csv_in.h).
 * SPDX-License-Identifier: GPL-3.0-or-later
 */
#include <math.h>
#include <stdio.h>
#include <stdlib.h>
#include <string.h>

#include "io/csv_in.h"

const char *dragarc_csv_skip_bom(const char *text)
{
    return strncmp(text, "\xEF\xBB\xBF", 3) == 0 ? text + 3 : text;
}

char *dragarc_csv_next_line(char **cursor, size_t *line)
{
    while (*cursor) {
        char *p = *cursor, *next = strchr(p, '\n');
        if (next)
            *next++ = '\0';
        *cursor = next;
        ++*line;
        size_t len = strlen(p);
        if (len > 0 && p[len - 1] == '\r')
            p[--len] = '\0';
        if (strspn(p, " \t") != len)
            return p;
    }
    return NULL;
}

size_t dragarc_csv_split(char *line, char **field)
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
        if (n == DRAGARC_CSV_MAX_FIELDS)
            return DRAGARC_CSV_MAX_FIELDS + 1;
        field[n++] = start;
        int more = *p == ',';
        *end = '\0';
        if (!more)
            return n;
        p++;
    }
}

int dragarc_csv_same_name(const char *name, const char *lower)
{
    for (; *name && *lower; name++, lower++) {
        char c = *name >= 'A' && *name <= 'Z' ? (char)(*name - 'A' + 'a') : *name;
        if (c != *lower)
            return 0;
    }
    return *name == *lower;
}

/* The error for a row with nf fields under a header of `columns` columns, or with more fields than a reader
 * takes. */
static int count_error(dragarc_error *err, const char *at, size_t nf, size_t columns)
{
    if (nf > DRAGARC_CSV_MAX_FIELDS)
        return dragarc_error_set(err, DRAGARC_EINVAL, at, "more than %d fields", DRAGARC_CSV_MAX_FIELDS);
    return dragarc_error_set(err, DRAGARC_EINVAL, at, "%zu fields, but the header names %zu column%s%s", nf, columns,
                             columns == 1 ? "" : "s", nf > columns ? " (a decimal comma? write 1.5, not 1,5)" : "");
}

int dragarc_csv_number(const char *text, size_t line, const char *name, double *out, dragarc_error *err)
{
    char *end;
    double v = strtod(text, &end);
    if (end == text || *end != '\0' || !isfinite(v)) {
        char at[48];
        snprintf(at, sizeof at, "line %zu: %s", line, name);
        return dragarc_error_set(err, DRAGARC_EINVAL, at, "not a number ('%.40s')", text);
    }
    *out = v;
    return DRAGARC_OK;
}

/* The header's fields mapped to the columns. */
static int map_header(char **field, size_t nf, const dragarc_csv_columns *cols, const char *at, int *where,
                      dragarc_error *err)
{
    for (int k = 0; k < cols->count; k++)
        where[k] = -1;
    for (size_t f = 0; f < nf; f++) {
        int k = 0;
        while (k < cols->count && !dragarc_csv_same_name(field[f], cols->names[k]))
            k++;
        if (k == cols->count)
            return dragarc_error_set(err, DRAGARC_EINVAL, at, "unknown column '%.40s' (the columns are %s)", field[f],
                                     cols->known);
        if (where[k] >= 0)
            return dragarc_error_set(err, DRAGARC_EINVAL, at, "column '%s' appears twice", cols->names[k]);
        where[k] = (int)f;
    }
    return DRAGARC_OK;
}

int dragarc_csv_read(char *text, const dragarc_csv_columns *cols, dragarc_csv_header_fn header,
                     dragarc_csv_row_fn row, void *ctx, int *header_seen, dragarc_error *err)
{
    int where[DRAGARC_CSV_MAX_FIELDS], rc = DRAGARC_OK;
    size_t line = 0, columns = 0;
    char *field[DRAGARC_CSV_MAX_FIELDS], *cursor = text, *p;
    *header_seen = 0;
    while (rc == DRAGARC_OK && (p = dragarc_csv_next_line(&cursor, &line))) {
        size_t nf = dragarc_csv_split(p, field);
        char at[32];
        snprintf(at, sizeof at, "line %zu", line);
        if (nf > DRAGARC_CSV_MAX_FIELDS || (*header_seen && nf != columns)) {
            rc = count_error(err, at, nf, columns);
        } else if (!*header_seen) {
            *header_seen = 1;
            columns = nf;
            rc = map_header(field, nf, cols, at, where, err);
            if (rc == DRAGARC_OK)
                rc = header(where, at, ctx, err);
        } else {
            rc = row(field, where, line, ctx, err);
        }
    }
    return rc;
}
