/* population_csv.c: a population density grid from a CSV file: a header naming east_m, north_m and
 * people_per_km2, then the centre and density of one cell a row, in any order.
 * SPDX-License-Identifier: GPL-3.0-or-later
 *
 * The CSV dialect is the one of every dragarc reader (io/csv_in.h). The grid is found from the centres: along
 * each axis the distinct coordinates (equal within 1e-9 of their magnitude, for values written by another
 * program with rounding) must lie a whole number of cells from the smallest, to within 1e-6 of a cell, the
 * cell size being the smallest gap between distinct coordinates; then each of the nx x ny cells must be given
 * exactly once. Refused: an irregular coordinate, a duplicate or missing cell, a negative, infinite or NaN
 * density, text in a number, a missing, unknown or repeated column, an empty file, more than
 * DRAGARC_POPULATION_MAX_CELLS cells.
 */
#define _POSIX_C_SOURCE 200809L
#include <math.h>
#include <stdio.h>
#include <stdlib.h>
#include <string.h>

#include <gsl/gsl_sort.h>

#include "dragarc/output.h"
#include "dragarc/population.h"
#include "io/csv_in.h"

enum { COL_EAST, COL_NORTH, COL_DENSITY, NCOLS };
static const char *const COL_NAMES[NCOLS] = {"east_m", "north_m", "people_per_km2"};
#define COLUMN_LIST "east_m, north_m, people_per_km2"

/* The cells as read, one entry a data row. */
typedef struct rows {
    size_t n, cap;
    double *col[NCOLS]; /* east, north (m), density (people/km^2) */
    size_t *line;       /* the line each row came from */
} rows;

static void rows_free(rows *r)
{
    for (int k = 0; k < NCOLS; k++)
        free(r->col[k]);
    free(r->line);
}

static int rows_grow(rows *r, dragarc_error *err)
{
    if (r->n < r->cap)
        return DRAGARC_OK;
    size_t m = r->cap ? 2 * r->cap : 256;
    for (int k = 0; k < NCOLS; k++) {
        double *p = realloc(r->col[k], m * sizeof *p);
        if (!p)
            return dragarc_error_set(err, DRAGARC_ENOMEM, "", "out of memory after %zu cells", r->n);
        r->col[k] = p;
    }
    size_t *l = realloc(r->line, m * sizeof *l);
    if (!l)
        return dragarc_error_set(err, DRAGARC_ENOMEM, "", "out of memory after %zu cells", r->n);
    r->line = l;
    r->cap = m;
    return DRAGARC_OK;
}

static const dragarc_csv_columns COLUMNS = {COL_NAMES, NCOLS, COLUMN_LIST};

/* The header names all three columns. */
static int check_header(const int *where, const char *at, void *ctx, dragarc_error *err)
{
    (void)ctx;
    for (int k = 0; k < NCOLS; k++)
        if (where[k] < 0)
            return dragarc_error_set(err, DRAGARC_EINVAL, at, "no %s column: the header must name " COLUMN_LIST,
                                     COL_NAMES[k]);
    return DRAGARC_OK;
}

/* One data row: a cell's centre and density, checked. */
static int read_row(char **field, const int *where, size_t line, void *ctx, dragarc_error *err)
{
    rows *r = ctx;
    if (r->n == DRAGARC_POPULATION_MAX_CELLS) {
        char at[32];
        snprintf(at, sizeof at, "line %zu", line);
        return dragarc_error_set(err, DRAGARC_EINVAL, at, "more than %u cells: a coarser grid is needed",
                                 DRAGARC_POPULATION_MAX_CELLS);
    }
    int rc = rows_grow(r, err);
    for (int k = 0; k < NCOLS && rc == DRAGARC_OK; k++)
        rc = dragarc_csv_number(field[where[k]], line, COL_NAMES[k], &r->col[k][r->n], err);
    if (rc != DRAGARC_OK)
        return rc;
    double density = r->col[COL_DENSITY][r->n];
    if (density < 0.0) {
        char at[48];
        snprintf(at, sizeof at, "line %zu: %s", line, COL_NAMES[COL_DENSITY]);
        return dragarc_error_set(err, DRAGARC_EINVAL, at, "must not be negative (got %g people per km^2)", density);
    }
    r->line[r->n++] = line;
    return DRAGARC_OK;
}

/* Every data row of the text (modified in place) into r. */
static int read_rows(char *text, rows *r, dragarc_error *err)
{
    int header;
    int rc = dragarc_csv_read(text, &COLUMNS, check_header, read_row, r, &header, err);
    if (rc == DRAGARC_OK && !header)
        rc = dragarc_error_set(err, DRAGARC_EINVAL, "", "the file is empty: expected a header row naming the "
                               "columns " COLUMN_LIST ", then one cell a row");
    else if (rc == DRAGARC_OK && r->n == 0)
        rc = dragarc_error_set(err, DRAGARC_EINVAL, "", "no cells: the header row is followed by no data rows");
    return rc;
}

/* One axis of the grid from the coordinates x[0..n) of column k: the smallest (*lo), the cell size (*size)
 * and the count of cells (*count). */
static int find_axis(const rows *r, int k, double *lo, double *size, size_t *count, dragarc_error *err)
{
    const double *x = r->col[k];
    size_t n = r->n;
    double *s = malloc(n * sizeof *s);
    if (!s)
        return dragarc_error_set(err, DRAGARC_ENOMEM, "", "out of memory sorting %zu cells", n);
    memcpy(s, x, n * sizeof *s);
    gsl_sort(s, 1, n);
    double first = s[0], last = s[n - 1];
    double same = 1e-9 * fmax(fmax(fabs(first), fabs(last)), last - first), gap = INFINITY;
    for (size_t i = 1; i < n; i++)
        if (s[i] - s[i - 1] > same && s[i] - s[i - 1] < gap)
            gap = s[i] - s[i - 1];
    free(s);
    if (!isfinite(gap))
        return dragarc_error_set(err, DRAGARC_EINVAL, "", "every cell has %s = %g: a grid needs at least two cells "
                                 "in each direction to fix its spacing", COL_NAMES[k], first);
    for (size_t i = 0; i < n; i++) {
        double u = (x[i] - first) / gap;
        if (fabs(u - floor(u + 0.5)) > 1e-6) {
            char at[48];
            snprintf(at, sizeof at, "line %zu: %s", r->line[i], COL_NAMES[k]);
            return dragarc_error_set(err, DRAGARC_EINVAL, at, "%g is not on the grid: the cells are %g m apart from "
                                     "%s = %g, and %g is %.3g cells from there (irregular spacing)",
                                     x[i], gap, COL_NAMES[k], first, x[i], u);
        }
    }
    double cells = floor((last - first) / gap + 0.5) + 1.0;
    if (cells > (double)DRAGARC_POPULATION_MAX_CELLS)
        return dragarc_error_set(err, DRAGARC_EINVAL, "", "the %s values %g to %g at a spacing of %g m span more "
                                 "than %u cells", COL_NAMES[k], first, last, gap, DRAGARC_POPULATION_MAX_CELLS);
    /* the cell size from the whole span: the rounding of each written coordinate averages out */
    double step = (last - first) / (cells - 1.0);
    *lo = first;
    *size = step;
    *count = (size_t)cells;
    return DRAGARC_OK;
}

/* The grid of p from the rows: each cell once, none missing. */
static int fill_grid(const rows *r, dragarc_population *p, dragarc_error *err)
{
    int rc = find_axis(r, COL_EAST, &p->east0, &p->dx, &p->nx, err);
    if (rc == DRAGARC_OK)
        rc = find_axis(r, COL_NORTH, &p->north0, &p->dy, &p->ny, err);
    if (rc != DRAGARC_OK)
        return rc;
    if ((double)p->nx * (double)p->ny > (double)DRAGARC_POPULATION_MAX_CELLS)
        return dragarc_error_set(err, DRAGARC_EINVAL, "", "the cells span a grid of %zu x %zu, more than %u cells",
                                 p->nx, p->ny, DRAGARC_POPULATION_MAX_CELLS);
    size_t cells = p->nx * p->ny;
    size_t *owner = calloc(cells, sizeof *owner); /* the line of each cell's row, 0 while none */
    p->density = malloc(cells * sizeof *p->density);
    if (!owner || !p->density) {
        free(owner);
        return dragarc_error_set(err, DRAGARC_ENOMEM, "", "out of memory for a grid of %zu cells", cells);
    }
    for (size_t m = 0; m < r->n && rc == DRAGARC_OK; m++) {
        size_t i = (size_t)floor((r->col[COL_EAST][m] - p->east0) / p->dx + 0.5);
        size_t j = (size_t)floor((r->col[COL_NORTH][m] - p->north0) / p->dy + 0.5);
        size_t c = j * p->nx + i;
        if (owner[c]) {
            char at[32];
            snprintf(at, sizeof at, "line %zu", r->line[m]);
            rc = dragarc_error_set(err, DRAGARC_EINVAL, at, "duplicate cell (east_m %g, north_m %g): line %zu gives "
                                   "it too", r->col[COL_EAST][m], r->col[COL_NORTH][m], owner[c]);
        }
        owner[c] = r->line[m];
        p->density[c] = r->col[COL_DENSITY][m];
    }
    for (size_t c = 0; c < cells && rc == DRAGARC_OK; c++)
        if (!owner[c])
            rc = dragarc_error_set(err, DRAGARC_EINVAL, "", "no cell at east_m %g, north_m %g: every cell of the "
                                   "%zu x %zu grid (%g m east by %g m north) must be given",
                                   p->east0 + (double)(c % p->nx) * p->dx, p->north0 + (double)(c / p->nx) * p->dy,
                                   p->nx, p->ny, p->dx, p->dy);
    free(owner);
    return rc;
}

/* Parse text that may be modified in place. */
static int parse_in_place(char *text, dragarc_population *p, dragarc_error *err)
{
    memset(p, 0, sizeof *p);
    rows r = {0};
    int rc = read_rows(text, &r, err);
    if (rc == DRAGARC_OK)
        rc = fill_grid(&r, p, err);
    rows_free(&r);
    return rc;
}

int dragarc_population_parse(const char *text, dragarc_population *p, dragarc_error *err)
{
    memset(p, 0, sizeof *p);
    char *copy = strdup(dragarc_csv_skip_bom(text));
    if (!copy)
        return dragarc_error_set(err, DRAGARC_ENOMEM, "", "out of memory reading the population grid");
    int rc = parse_in_place(copy, p, err);
    free(copy);
    return rc;
}

int dragarc_population_read(const char *path, dragarc_population *p, dragarc_error *err)
{
    memset(p, 0, sizeof *p);
    char *text;
    int rc = dragarc_text_file_read(path, DRAGARC_POPULATION_MAX_BYTES, &text, err);
    if (rc == DRAGARC_OK) {
        size_t bom = (size_t)(dragarc_csv_skip_bom(text) - text);
        rc = parse_in_place(text + bom, p, err);
        free(text);
    }
    if (rc != DRAGARC_OK && err) {
        char field[sizeof err->field];
        snprintf(field, sizeof field, "%s%s%s", path, err->field[0] ? ": " : "", err->field);
        memcpy(err->field, field, sizeof field);
    }
    return rc;
}
