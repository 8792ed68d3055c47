/* fragment_csv.c: a fragment catalogue from CSV, one class a row (footprint.h, docs/footprint.md).
 * SPDX-License-Identifier: GPL-3.0-or-later
 *
 * The CSV dialect is the one of every dragarc reader (io/csv_in.h). Values are in SI units (kg, m^2, kg/m^2,
 * m/s) and the cone in degrees; each row is checked as a JSON class is (dragarc_fragment_class_check).
 */
#include <math.h>
#include <stdio.h>
#include <stdlib.h>
#include <string.h>

#include "core/constants.h"
#include "dragarc/footprint.h"
#include "io/csv_in.h"

enum { C_NAME, C_COUNT, C_MASS, C_AREA, C_BETA, C_DRAG, C_BETA_SPREAD, C_DV_DIST, C_DV_SPEED, C_CONE, NCOLS };
static const char *const NAMES[NCOLS] = {"name", "count", "mass", "area", "ballistic_coefficient", "drag",
                                         "beta_spread", "dv_distribution", "dv_speed", "cone"};
#define COLUMN_LIST                                                                                              \
    "mass, drag, area or ballistic_coefficient, and optionally name, count, beta_spread, dv_distribution, "      \
    "dv_speed, cone"
static const dragarc_csv_columns COLUMNS = {NAMES, NCOLS, COLUMN_LIST};

typedef struct catalogue {
    const dragarc_named_drag *laws;
    size_t nlaws, n, cap;
    dragarc_fragment_class *c;
} catalogue;

static int check_header(const int *where, const char *at, void *ctx, dragarc_error *err)
{
    (void)ctx;
    if (where[C_MASS] < 0 || where[C_DRAG] < 0)
        return dragarc_error_set(err, DRAGARC_EINVAL, at, "no %s column: the header must name " COLUMN_LIST,
                                 where[C_MASS] < 0 ? "mass" : "drag");
    if ((where[C_AREA] < 0) == (where[C_BETA] < 0))
        return dragarc_error_set(err, DRAGARC_EINVAL, at, "name one of area and ballistic_coefficient, not %s",
                                 where[C_AREA] < 0 ? "neither" : "both");
    return DRAGARC_OK;
}

static int fail(size_t line, const char *col, dragarc_error *err, const char *fmt, const char *text)
{
    char at[64];
    snprintf(at, sizeof at, "line %zu: %s", line, col);
    return dragarc_error_set(err, DRAGARC_EINVAL, at, fmt, text);
}

static int read_row(char **field, const int *where, size_t line, void *ctx, dragarc_error *err)
{
    catalogue *k = ctx;
    if (k->n == DRAGARC_FOOTPRINT_MAX_CLASSES) {
        char at[32];
        snprintf(at, sizeof at, "line %zu", line);
        return dragarc_error_set(err, DRAGARC_EINVAL, at, "more than %d classes", DRAGARC_FOOTPRINT_MAX_CLASSES);
    }
    if (k->n == k->cap) {
        size_t m = k->cap ? 2 * k->cap : 64;
        dragarc_fragment_class *p = realloc(k->c, m * sizeof *p);
        if (!p)
            return dragarc_error_set(err, DRAGARC_ENOMEM, "", "out of memory after %zu classes", k->n);
        k->c = p, k->cap = m;
    }
    dragarc_fragment_class *c = &k->c[k->n];
    memset(c, 0, sizeof *c);
    c->count = 1.0;
    c->cone_half_angle = DRAGARC_PI;
    double beta = 0.0, cone = 180.0;
#define NUM(col, dst)                                                                                            \
    do {                                                                                                         \
        if (where[col] >= 0 && field[where[col]][0]) {                                                           \
            int rc_ = dragarc_csv_number(field[where[col]], line, NAMES[col], dst, err);                        \
            if (rc_ != DRAGARC_OK)                                                                               \
                return rc_;                                                                                      \
        }                                                                                                        \
    } while (0)
    NUM(C_COUNT, &c->count);
    NUM(C_MASS, &c->mass);
    NUM(C_AREA, &c->area);
    NUM(C_BETA, &beta);
    NUM(C_BETA_SPREAD, &c->beta_sd);
    NUM(C_DV_SPEED, &c->dv_speed);
    NUM(C_CONE, &cone);
#undef NUM
    c->cone_half_angle = cone * DRAGARC_DEG;
    if (where[C_NAME] >= 0)
        snprintf(c->name, sizeof c->name, "%s", field[where[C_NAME]]);
    /* the drag law: a constant C_D, or a named law */
    const char *d = field[where[C_DRAG]];
    char *end = NULL;
    double cd = strtod(d, &end);
    if (d[0] && end && *end == '\0') {
        c->drag.model = DRAGARC_DRAG_CONSTANT;
        c->drag.cd = cd;
    } else {
        size_t j = 0;
        while (j < k->nlaws && strcmp(k->laws[j].name, d) != 0)
            j++;
        if (j == k->nlaws)
            return fail(line, "drag", err, "\"%s\" is neither a number (a constant C_D) nor a name in the scenario's "
                        "drag_laws", d);
        if (dragarc_drag_copy(&c->drag, &k->laws[j].drag, err) != DRAGARC_OK)
            return DRAGARC_ENOMEM;
    }
    k->n++; /* from here the class owns its drag and is freed with the rest */
    const char *dist = where[C_DV_DIST] >= 0 ? field[where[C_DV_DIST]] : "";
    if (dragarc_dv_distribution_from_name(dist, &c->dv) != DRAGARC_OK)
        return fail(line, "dv_distribution", err, "unknown distribution \"%s\" (none, fixed, uniform, maxwellian)",
                    dist);
    if (where[C_BETA] >= 0) {
        double cdn = dragarc_fragment_nominal_cd(&c->drag);
        if (!(beta > 0.0 && beta <= 1e6 && cdn > 0.0 && isfinite(cdn)))
            return fail(line, "ballistic_coefficient", err, "%s", "must be above 0 and at most 1e6 kg/m^2, with a drag "
                        "law whose C_D at Mach 0.5 is positive");
        c->area = c->mass / (cdn * beta);
    }
    int rc = dragarc_fragment_class_check(c, err);
    if (rc != DRAGARC_OK && err) {
        char at[sizeof err->field];
        snprintf(at, sizeof at, "line %zu: %s", line, err->field);
        memcpy(err->field, at, sizeof at);
    }
    return rc;
}

int dragarc_fragment_catalogue_parse(char *text, const dragarc_named_drag *laws, size_t nlaws,
                                     dragarc_fragment_class **classes, size_t *n, dragarc_error *err)
{
    catalogue k = {laws, nlaws, 0, 0, NULL};
    int header = 0;
    int rc = dragarc_csv_read(text + (dragarc_csv_skip_bom(text) - text), &COLUMNS, check_header, read_row, &k,
                              &header, err);
    if (rc == DRAGARC_OK && !header)
        rc = dragarc_error_set(err, DRAGARC_EINVAL, "", "the file is empty: expected a header row naming "
                               COLUMN_LIST ", then one class a row");
    else if (rc == DRAGARC_OK && k.n == 0)
        rc = dragarc_error_set(err, DRAGARC_EINVAL, "", "no classes: the header row is followed by no data rows");
    if (rc != DRAGARC_OK) {
        for (size_t i = 0; i < k.n; i++)
            dragarc_drag_clear(&k.c[i].drag);
        free(k.c);
        return rc;
    }
    *classes = k.c, *n = k.n;
    return DRAGARC_OK;
}
