/* track_csv.c: a measured flight from a CSV file: a header row naming the columns (t, x, y, z; optionally the
 * velocities vx, vy, vz and standard deviations), then one point a row.
 * SPDX-License-Identifier: GPL-3.0-or-later
 *
 * Plain CSV as spreadsheets export it (csv_in.h). Values are SI numbers in the scenario's frame: seconds since
 * launch, metres east, north and up from the site datum, metres per second. Unknown columns are refused, so that a
 * misspelt "sd" is never silently read as an unweighted track.
 */
#define _POSIX_C_SOURCE 200809L
#include <math.h>
#include <stdio.h>
#include <stdlib.h>
#include <string.h>

#include "dragarc/fit.h"
#include "dragarc/output.h"
#include "io/csv_in.h"

enum {
    COL_T, COL_X, COL_Y, COL_Z, COL_VX, COL_VY, COL_VZ,
    COL_SD, COL_SD_X, COL_SD_Y, COL_SD_Z, COL_SD_V, COL_SD_VX, COL_SD_VY, COL_SD_VZ, NCOLS
};
static const char *const COL_NAMES[NCOLS] = {"t",  "x",    "y",    "z",    "vx",   "vy",    "vz",   "sd",
                                             "sd_x", "sd_y", "sd_z", "sd_v", "sd_vx", "sd_vy", "sd_vz"};
static const dragarc_csv_columns COLUMNS = {
    COL_NAMES, NCOLS,
    "t, x, y, z, and optionally vx, vy, vz; sd or sd_x, sd_y, sd_z; sd_v or sd_vx, sd_vy, sd_vz"};

void dragarc_track_clear(dragarc_track *t)
{
    if (!t)
        return;
    free(t->t), free(t->pos), free(t->vel), free(t->pos_sd), free(t->vel_sd);
    memset(t, 0, sizeof *t);
}

/* How many of the three columns from k are in the header; a group of three comes whole or not at all. */
static int group(const int *where, int k, const char *at, dragarc_error *err, int *count)
{
    *count = (where[k] >= 0) + (where[k + 1] >= 0) + (where[k + 2] >= 0);
    if (*count == 1 || *count == 2)
        return dragarc_error_set(err, DRAGARC_EINVAL, at, "%s, %s and %s come together: the header names %d of them",
                                 COL_NAMES[k], COL_NAMES[k + 1], COL_NAMES[k + 2], *count);
    return DRAGARC_OK;
}

static int check_header(const int *where, const char *at, void *ctx, dragarc_error *err)
{
    (void)ctx;
    for (int k = COL_T; k <= COL_Z; k++)
        if (where[k] < 0)
            return dragarc_error_set(err, DRAGARC_EINVAL, at, "no %s column: the header must name t, x, y and z",
                                     COL_NAMES[k]);
    int nv, nsd, nsdv, rc;
    if ((rc = group(where, COL_VX, at, err, &nv)) != DRAGARC_OK ||
        (rc = group(where, COL_SD_X, at, err, &nsd)) != DRAGARC_OK ||
        (rc = group(where, COL_SD_VX, at, err, &nsdv)) != DRAGARC_OK)
        return rc;
    if (where[COL_SD] >= 0 && nsd)
        return dragarc_error_set(err, DRAGARC_EINVAL, at, "give sd or sd_x, sd_y, sd_z, not both");
    if (where[COL_SD_V] >= 0 && nsdv)
        return dragarc_error_set(err, DRAGARC_EINVAL, at, "give sd_v or sd_vx, sd_vy, sd_vz, not both");
    int has_sd = where[COL_SD] >= 0 || nsd, has_sdv = where[COL_SD_V] >= 0 || nsdv;
    if ((has_sdv || where[COL_SD_V] >= 0) && !nv)
        return dragarc_error_set(err, DRAGARC_EINVAL, at, "velocity standard deviations without vx, vy, vz");
    if (nv && !(has_sd && has_sdv))
        return dragarc_error_set(err, DRAGARC_EINVAL, at,
                                 "vx, vy, vz need standard deviations for the positions (sd or sd_x, sd_y, sd_z) and "
                                 "the velocities (sd_v or sd_vx, sd_vy, sd_vz), to weigh metres against metres per "
                                 "second");
    return DRAGARC_OK;
}

/* The track read so far. */
typedef struct reading {
    dragarc_track *t;
    size_t cap;
} reading;

/* Room for n + 1 points in the arrays the header asks for. */
static int grow(reading *r, const int *where, dragarc_error *err)
{
    dragarc_track *t = r->t;
    if (t->n < r->cap)
        return DRAGARC_OK;
    size_t m = r->cap ? 2 * r->cap : 64;
    int has_vel = where[COL_VX] >= 0, has_sd = where[COL_SD] >= 0 || where[COL_SD_X] >= 0;
    struct {
        double **p;
        size_t width;
        int wanted;
    } arrays[] = {{&t->t, 1, 1}, {&t->pos, 3, 1}, {&t->vel, 3, has_vel}, {&t->pos_sd, 3, has_sd},
                  {&t->vel_sd, 3, has_vel}};
    for (size_t a = 0; a < sizeof arrays / sizeof *arrays; a++) {
        if (!arrays[a].wanted)
            continue;
        double *p = realloc(*arrays[a].p, m * arrays[a].width * sizeof *p);
        if (!p)
            return dragarc_error_set(err, DRAGARC_ENOMEM, "", "out of memory after %zu points", t->n);
        *arrays[a].p = p;
    }
    r->cap = m;
    return DRAGARC_OK;
}

/* The value of column k on a row; a standard deviation must be positive. */
static int number(char **field, const int *where, int k, size_t line, double *out, dragarc_error *err)
{
    int rc = dragarc_csv_number(field[where[k]], line, COL_NAMES[k], out, err);
    if (rc == DRAGARC_OK && k >= COL_SD && !(*out > 0.0)) {
        char at[48];
        snprintf(at, sizeof at, "line %zu: %s", line, COL_NAMES[k]);
        return dragarc_error_set(err, DRAGARC_EINVAL, at, "a standard deviation must be positive (got %g)", *out);
    }
    return rc;
}

static int read_row(char **field, const int *where, size_t line, void *ctx, dragarc_error *err)
{
    reading *r = ctx;
    dragarc_track *t = r->t;
    char at[48];
    /* checked on every row, not only when the arrays grow (their capacity passes the limit between doublings) */
    if (t->n >= DRAGARC_TRACK_MAX_POINTS) {
        snprintf(at, sizeof at, "line %zu", line);
        return dragarc_error_set(err, DRAGARC_EINVAL, at, "more than %d points: thin the track first",
                                 DRAGARC_TRACK_MAX_POINTS);
    }
    int rc = grow(r, where, err);
    if (rc != DRAGARC_OK)
        return rc;
    const size_t i = t->n;
    if ((rc = number(field, where, COL_T, line, &t->t[i], err)) != DRAGARC_OK)
        return rc;
    snprintf(at, sizeof at, "line %zu: t", line);
    if (t->t[i] < 0.0)
        return dragarc_error_set(err, DRAGARC_EINVAL, at, "must be a time since launch, >= 0 (got %g)", t->t[i]);
    if (i > 0 && !(t->t[i] > t->t[i - 1]))
        return dragarc_error_set(err, DRAGARC_EINVAL, at,
                                 "times must increase from row to row (%g does not follow %g): sort the track and "
                                 "drop repeated times",
                                 t->t[i], t->t[i - 1]);
    for (int k = 0; k < 3; k++)
        if ((rc = number(field, where, COL_X + k, line, &t->pos[3 * i + k], err)) != DRAGARC_OK)
            return rc;
    if (t->vel)
        for (int k = 0; k < 3; k++)
            if ((rc = number(field, where, COL_VX + k, line, &t->vel[3 * i + k], err)) != DRAGARC_OK)
                return rc;
    if (t->pos_sd)
        for (int k = 0; k < 3; k++)
            if ((rc = number(field, where, where[COL_SD] >= 0 ? COL_SD : COL_SD_X + k, line, &t->pos_sd[3 * i + k],
                             err)) != DRAGARC_OK)
                return rc;
    if (t->vel_sd)
        for (int k = 0; k < 3; k++)
            if ((rc = number(field, where, where[COL_SD_V] >= 0 ? COL_SD_V : COL_SD_VX + k, line,
                             &t->vel_sd[3 * i + k], err)) != DRAGARC_OK)
                return rc;
    t->n++;
    return DRAGARC_OK;
}

int dragarc_track_parse(const char *text, dragarc_track *out, dragarc_error *err)
{
    memset(out, 0, sizeof *out);
    char *copy = strdup(dragarc_csv_skip_bom(text));
    if (!copy)
        return dragarc_error_set(err, DRAGARC_ENOMEM, "", "out of memory reading the track");
    reading r = {out, 0};
    int header;
    int rc = dragarc_csv_read(copy, &COLUMNS, check_header, read_row, &r, &header, err);
    free(copy);
    if (rc == DRAGARC_OK && !header)
        rc = dragarc_error_set(err, DRAGARC_EINVAL, "", "the file is empty: expected a header row naming the columns "
                               "(t, x, y, z, ...), then one point a row");
    else if (rc == DRAGARC_OK && out->n == 0)
        rc = dragarc_error_set(err, DRAGARC_EINVAL, "", "no points: the header row is followed by no data rows");
    if (rc != DRAGARC_OK)
        dragarc_track_clear(out);
    return rc;
}

int dragarc_track_read(const char *path, dragarc_track *out, dragarc_error *err)
{
    memset(out, 0, sizeof *out);
    char *text;
    int rc = dragarc_text_file_read(path, DRAGARC_TRACK_MAX_BYTES, &text, err);
    if (rc != DRAGARC_OK)
        return rc;
    rc = dragarc_track_parse(text, out, err);
    free(text);
    return rc;
}
