/* scenario_json.c: the scenario file reader (the only place that includes cJSON).
 * SPDX-License-Identifier: GPL-3.0-or-later
 *
 * Parse, validate every key against the documented schema (docs/scenario.md), copy into plain
 * structs in SI units and radians, delete the cJSON tree. Every error names the field path.
 */
#include <errno.h>
#include <math.h>
#include <stddef.h>
#include <stdio.h>
#include <stdlib.h>
#include <string.h>

#include <cjson/cJSON.h>

#include "core/constants.h"
#include "dragarc/scenario.h"
#include "dragarc/drift.h"
#include "dragarc/casualty.h"
#include "dragarc/footprint.h"
#include "io/text_file.h"
#include "dragarc/sprinkler.h"
#include "dragarc/output.h"
#include "dragarc/units.h"

#define PATH_MAX_LEN 128

/* ---- small helpers ------------------------------------------------------------------------ */

static void join(char *dst, size_t n, const char *path, const char *key)
{
    if (!path || !*path)
        snprintf(dst, n, "%s", key);
    else
        snprintf(dst, n, "%s.%s", path, key);
}

static const char *type_name(const cJSON *j)
{
    if (cJSON_IsNumber(j)) return "a number";
    if (cJSON_IsString(j)) return "a string";
    if (cJSON_IsBool(j)) return "a boolean";
    if (cJSON_IsNull(j)) return "null";
    if (cJSON_IsArray(j)) return "an array";
    if (cJSON_IsObject(j)) return "an object";
    return "an unknown value";
}

/* Every key of obj must be in allowed (NULL-terminated) and appear once. */
static int check_keys(const cJSON *obj, const char *path, const char *const *allowed, dragarc_error *err)
{
    for (const cJSON *it = obj->child; it; it = it->next) {
        char field[PATH_MAX_LEN];
        join(field, sizeof field, path, it->string ? it->string : "");
        int known = 0;
        for (const char *const *a = allowed; *a; a++)
            if (it->string && strcmp(it->string, *a) == 0)
                known = 1;
        if (!known) {
            char list[256] = "";
            for (const char *const *a = allowed; *a; a++) {
                strncat(list, *a, sizeof list - strlen(list) - 1);
                if (a[1])
                    strncat(list, ", ", sizeof list - strlen(list) - 1);
            }
            return dragarc_error_set(err, DRAGARC_EINVAL, field, "unknown key (allowed here: %s)", list);
        }
        for (const cJSON *jt = it->next; jt; jt = jt->next)
            if (jt->string && strcmp(jt->string, it->string) == 0)
                return dragarc_error_set(err, DRAGARC_EINVAL, field, "key appears more than once");
    }
    return DRAGARC_OK;
}

static int want_object(const cJSON *j, const char *field, dragarc_error *err)
{
    if (!cJSON_IsObject(j))
        return dragarc_error_set(err, DRAGARC_EINVAL, field, "must be an object, not %s", type_name(j));
    return DRAGARC_OK;
}

/* Number at obj[key]: *present = 0 when absent (and not required). */
static int get_number(const cJSON *obj, const char *path, const char *key, int required, double *out,
                      int *present, dragarc_error *err)
{
    char field[PATH_MAX_LEN];
    join(field, sizeof field, path, key);
    const cJSON *j = cJSON_GetObjectItemCaseSensitive(obj, key);
    if (present)
        *present = j != NULL;
    if (!j) {
        if (required)
            return dragarc_error_set(err, DRAGARC_EINVAL, field, "is required");
        return DRAGARC_OK;
    }
    if (!cJSON_IsNumber(j))
        return dragarc_error_set(err, DRAGARC_EINVAL, field, "must be a number, not %s", type_name(j));
    if (!isfinite(j->valuedouble))
        return dragarc_error_set(err, DRAGARC_EINVAL, field, "must be a finite number");
    *out = j->valuedouble;
    return DRAGARC_OK;
}

static int get_string(const cJSON *obj, const char *path, const char *key, int required, const char **out,
                      dragarc_error *err)
{
    char field[PATH_MAX_LEN];
    join(field, sizeof field, path, key);
    const cJSON *j = cJSON_GetObjectItemCaseSensitive(obj, key);
    if (!j) {
        if (required)
            return dragarc_error_set(err, DRAGARC_EINVAL, field, "is required");
        return DRAGARC_OK;
    }
    if (!cJSON_IsString(j) || !j->valuestring)
        return dragarc_error_set(err, DRAGARC_EINVAL, field, "must be a string, not %s", type_name(j));
    *out = j->valuestring;
    return DRAGARC_OK;
}

#define TRY(expr)                                                                                              \
    do {                                                                                                       \
        int rc_ = (expr);                                                                                      \
        if (rc_ != DRAGARC_OK)                                                                                 \
            return rc_;                                                                                        \
    } while (0)

/* Parse JSON text, reporting a syntax error by line and column. */
static int parse_text(const char *text, const char *what, cJSON **out, dragarc_error *err)
{
    const char *end = NULL;
    cJSON *root = cJSON_ParseWithOpts(text, &end, 1);
    if (!root) {
        /* cJSON refuses nesting deeper than CJSON_NESTING_LIMIT: say so rather than "not valid". */
        int depth = 0, max_depth = 0, in_string = 0;
        for (const char *p = text; end && p < end && *p; p++) {
            if (in_string) {
                if (*p == '\\' && p[1])
                    p++;
                else if (*p == '"')
                    in_string = 0;
            } else if (*p == '"') {
                in_string = 1;
            } else if (*p == '[' || *p == '{') {
                if (++depth > max_depth)
                    max_depth = depth;
            } else if (*p == ']' || *p == '}') {
                depth--;
            }
        }
        if (max_depth >= CJSON_NESTING_LIMIT)
            return dragarc_error_set(err, DRAGARC_EINVAL, "", "%s nests arrays or objects deeper than %d levels", what,
                                     CJSON_NESTING_LIMIT);
        int line = 1, col = 1;
        for (const char *p = text; end && p < end && *p; p++) {
            if (*p == '\n')
                line++, col = 1;
            else
                col++;
        }
        return dragarc_error_set(err, DRAGARC_EINVAL, "", "%s is not valid JSON (line %d, column %d)", what, line, col);
    }
    *out = root;
    return DRAGARC_OK;
}

/* "source": a citation string, or an object of citation strings keyed by the field they support. */
static int check_source(const cJSON *obj, const char *path, dragarc_error *err)
{
    const cJSON *src = cJSON_GetObjectItemCaseSensitive(obj, "source");
    char field[PATH_MAX_LEN];
    join(field, sizeof field, path, "source");
    if (!src || cJSON_IsString(src))
        return DRAGARC_OK;
    if (!cJSON_IsObject(src))
        return dragarc_error_set(err, DRAGARC_EINVAL, field, "must be a string or an object of strings, not %s",
                                 type_name(src));
    for (const cJSON *it = src->child; it; it = it->next)
        if (!cJSON_IsString(it)) {
            char sub[PATH_MAX_LEN];
            join(sub, sizeof sub, field, it->string ? it->string : "");
            return dragarc_error_set(err, DRAGARC_EINVAL, sub, "must be a string, not %s", type_name(it));
        }
    return DRAGARC_OK;
}

/* ---- values with units ---------------------------------------------------------------------- */

/* The quantity of every numeric field that may be written with a unit, by its path with array indices
 * written "[]". A string at any of these paths is read as a value with a unit (units.h) and replaced by
 * its number in SI units (degrees for angles) before the scenario is read; a string anywhere else is left
 * for the reader to refuse. docs/scenario.md lists the same fields. */
static const struct {
    const char *path;
    dragarc_quantity q;
} UNIT_FIELDS[] = {
    {"projectile.mass", DRAGARC_Q_MASS},
    {"projectile.density", DRAGARC_Q_DENSITY},
    {"projectile.diameter", DRAGARC_Q_LENGTH},
    {"projectile.area", DRAGARC_Q_AREA},
    {"projectile.volume", DRAGARC_Q_VOLUME},
    {"projectile.drag.cd", DRAGARC_Q_NUMBER},
    {"projectile.drag.cd_scale", DRAGARC_Q_NUMBER},
    {"projectile.drag.k", DRAGARC_Q_LINEAR_DRAG},
    {"projectile.drag.c", DRAGARC_Q_QUADRATIC_DRAG},
    {"launch.speed", DRAGARC_Q_SPEED},
    {"launch.elevation", DRAGARC_Q_ANGLE},
    {"launch.azimuth", DRAGARC_Q_ANGLE},
    {"launch.height", DRAGARC_Q_LENGTH},
    {"launch.spin.rate", DRAGARC_Q_ANGULAR_SPEED},
    {"launch.spin.tilt", DRAGARC_Q_ANGLE},
    {"launch.spin.decay_time", DRAGARC_Q_TIME},
    {"projectile.lift.cl", DRAGARC_Q_NUMBER},
    {"projectile.spin_decay_coefficient", DRAGARC_Q_NUMBER},
    {"projectile.inertia_factor", DRAGARC_Q_NUMBER},
    {"projectile.evaporation.nonvolatile_fraction", DRAGARC_Q_NUMBER},
    {"environment.gravity", DRAGARC_Q_ACCELERATION},
    {"environment.atmosphere.site_elevation", DRAGARC_Q_LENGTH},
    {"environment.atmosphere.temperature_offset", DRAGARC_Q_TEMPERATURE_DIFFERENCE},
    {"environment.atmosphere.density", DRAGARC_Q_DENSITY},
    {"environment.atmosphere.viscosity", DRAGARC_Q_VISCOSITY},
    {"environment.atmosphere.temperature", DRAGARC_Q_TEMPERATURE},
    {"environment.atmosphere.speed_of_sound", DRAGARC_Q_SPEED},
    {"environment.atmosphere.scale_height", DRAGARC_Q_LENGTH},
    {"environment.atmosphere.pressure", DRAGARC_Q_PRESSURE},
    {"environment.atmosphere.relative_humidity", DRAGARC_Q_NUMBER},
    {"environment.earth.latitude", DRAGARC_Q_ANGLE},
    {"environment.earth.radius", DRAGARC_Q_LENGTH},
    {"environment.wind.speed", DRAGARC_Q_SPEED},
    {"environment.wind.from", DRAGARC_Q_ANGLE},
    {"environment.wind.ref_height", DRAGARC_Q_LENGTH},
    {"environment.wind.exponent", DRAGARC_Q_NUMBER},
    {"environment.wind.roughness", DRAGARC_Q_LENGTH},
    {"environment.wind.layers[].height", DRAGARC_Q_LENGTH},
    {"environment.wind.layers[].speed", DRAGARC_Q_SPEED},
    {"environment.wind.layers[].from", DRAGARC_Q_ANGLE},
    {"ground.elevation", DRAGARC_Q_LENGTH},
    {"ground.bounce.min_height", DRAGARC_Q_LENGTH},
    {"solver.max_time", DRAGARC_Q_TIME},
    {"sprinkler.nozzle.diameter", DRAGARC_Q_LENGTH},
    {"sprinkler.nozzle.pressure", DRAGARC_Q_PRESSURE},
    {"sprinkler.height", DRAGARC_Q_LENGTH},
    {"sprinkler.elevation", DRAGARC_Q_ANGLE},
    {"sprinkler.liquid_density", DRAGARC_Q_DENSITY},
    {"sprinkler.spectrum.dv50", DRAGARC_Q_LENGTH},
    {"sprinkler.spectrum.scale", DRAGARC_Q_LENGTH},
    {"sprinkler.ring_width", DRAGARC_Q_LENGTH},
    {"sprinkler.cell", DRAGARC_Q_LENGTH},
    {"sprinkler.layout.spacing", DRAGARC_Q_LENGTH},
    {"sprinkler.layout.row_spacing", DRAGARC_Q_LENGTH},
    {"drift.release.height", DRAGARC_Q_LENGTH},
    {"drift.release.pressure", DRAGARC_Q_PRESSURE},
    {"drift.release.elevation", DRAGARC_Q_ANGLE},
    {"drift.release.azimuth", DRAGARC_Q_ANGLE},
    {"drift.travel.speed", DRAGARC_Q_SPEED},
    {"drift.travel.direction", DRAGARC_Q_ANGLE},
    {"drift.liquid_density", DRAGARC_Q_DENSITY},
    {"drift.spectrum.dv50", DRAGARC_Q_LENGTH},
    {"drift.spectrum.scale", DRAGARC_Q_LENGTH},
    {"drift.bin_width", DRAGARC_Q_LENGTH},
    {"drift.buffer", DRAGARC_Q_LENGTH},
    {"breakup.altitude", DRAGARC_Q_LENGTH},
    {"breakup.speed", DRAGARC_Q_SPEED},
    {"breakup.flight_path_angle", DRAGARC_Q_ANGLE},
    {"breakup.heading", DRAGARC_Q_ANGLE},
    {"breakup.spread.speed", DRAGARC_Q_SPEED},
    {"breakup.spread.flight_path_angle", DRAGARC_Q_ANGLE},
    {"breakup.spread.heading", DRAGARC_Q_ANGLE},
    {"fragments[].mass", DRAGARC_Q_MASS},
    {"fragments[].area", DRAGARC_Q_AREA},
    {"fragments[].delta_v.speed", DRAGARC_Q_SPEED},
    {"fragments[].delta_v.cone", DRAGARC_Q_ANGLE},
    {"uncertainty.wind.direction", DRAGARC_Q_ANGLE},
    {"uncertainty.wind.profiles[].speed", DRAGARC_Q_SPEED},
    {"uncertainty.wind.profiles[].from", DRAGARC_Q_ANGLE},
    {"uncertainty.wind.profiles[].layers[].height", DRAGARC_Q_LENGTH},
    {"uncertainty.wind.profiles[].layers[].speed", DRAGARC_Q_SPEED},
    {"uncertainty.wind.profiles[].layers[].from", DRAGARC_Q_ANGLE},
    {"footprint.cell", DRAGARC_Q_LENGTH},
    {"hazard.energy_threshold", DRAGARC_Q_ENERGY},
};

typedef struct unit_pass {
    dragarc_units *units; /* loaded at the first string that needs it */
} unit_pass;

/* Replace the string node j (at field, whose quantity is q) by its value in SI units. */
static int convert_value(unit_pass *up, cJSON *j, const char *field, dragarc_quantity q, dragarc_error *err)
{
    /* A string is for a number with its unit; a number alone belongs outside quotes. */
    char *end = NULL;
    strtod(j->valuestring, &end);
    while (end && *end == ' ')
        end++;
    if (end != j->valuestring && end && *end == '\0')
        return q == DRAGARC_Q_NUMBER
                   ? dragarc_error_set(err, DRAGARC_EINVAL, field, "\"%s\" is a string: write the number without quotes",
                                       j->valuestring)
                   : dragarc_error_set(err, DRAGARC_EINVAL, field,
                                       "\"%s\" has no unit: write the number without quotes (in %s), or add its unit",
                                       j->valuestring, dragarc_quantity_unit(q));
    if (!up->units) {
        int rc = dragarc_units_new(&up->units, err);
        if (rc != DRAGARC_OK) {
            dragarc_error_prefix(err, field);
            return rc;
        }
    }
    double v;
    int rc = dragarc_units_parse(up->units, j->valuestring, q, &v, err);
    if (rc != DRAGARC_OK) {
        dragarc_error_prefix(err, field);
        return rc;
    }
    cJSON_free(j->valuestring);
    j->valuestring = NULL;
    j->type = cJSON_Number;
    cJSON_SetNumberValue(j, v);
    return DRAGARC_OK;
}

/* Walk node j at field (with indices) and pattern (indices as "[]"), converting strings with units. */
static int convert_units(unit_pass *up, cJSON *j, const char *field, const char *pattern, dragarc_error *err)
{
    if (cJSON_IsString(j) && j->valuestring) {
        for (size_t i = 0; i < sizeof UNIT_FIELDS / sizeof UNIT_FIELDS[0]; i++)
            if (strcmp(pattern, UNIT_FIELDS[i].path) == 0)
                return convert_value(up, j, field, UNIT_FIELDS[i].q, err);
        return DRAGARC_OK;
    }
    if (strcmp(pattern, "projectile.drag") == 0 && cJSON_IsObject(j)) {
        /* Table points are [x, cd]: x takes a unit when the table is against speed. */
        const cJSON *axis = cJSON_GetObjectItemCaseSensitive(j, "x");
        cJSON *pts = cJSON_GetObjectItemCaseSensitive(j, "points");
        int by_speed = cJSON_IsString(axis) && axis->valuestring && strcmp(axis->valuestring, "speed") == 0;
        if (by_speed && cJSON_IsArray(pts)) {
            int i = 0;
            for (cJSON *p = pts->child; p; p = p->next, i++) {
                if (cJSON_IsArray(p) && cJSON_IsString(p->child) && p->child->valuestring) {
                    char pf[PATH_MAX_LEN];
                    snprintf(pf, sizeof pf, "%s.points[%d][0]", field, i);
                    TRY(convert_value(up, p->child, pf, DRAGARC_Q_SPEED, err));
                }
            }
        }
    }
    if (cJSON_IsObject(j) || cJSON_IsArray(j)) {
        int i = 0;
        for (cJSON *c = j->child; c; c = c->next, i++) {
            char cf[PATH_MAX_LEN], cp[PATH_MAX_LEN];
            if (cJSON_IsArray(j)) {
                snprintf(cf, sizeof cf, "%s[%d]", field, i);
                snprintf(cp, sizeof cp, "%s[]", pattern);
            } else {
                if (!c->string)
                    continue;
                join(cf, sizeof cf, field, c->string);
                join(cp, sizeof cp, pattern, c->string);
            }
            TRY(convert_units(up, c, cf, cp, err));
        }
    }
    return DRAGARC_OK;
}

/* The pass over a whole scenario (path "") or a profile (path "projectile"). */
static int with_units(cJSON *root, const char *path, dragarc_error *err)
{
    unit_pass up = {NULL};
    int rc = convert_units(&up, root, path, path, err);
    dragarc_units_free(up.units);
    return rc;
}

/* ---- drag ----------------------------------------------------------------------------------- */

/* A table's "points": an array of 2 to 100000 pairs of numbers (what, e.g. "[x, cd]", names them in messages),
 * copied into two new arrays (caller frees both, also after failure). */
static int read_pairs(const cJSON *pts, const char *field, const char *what, double **xs, double **ys, int *count,
                      dragarc_error *err)
{
    *xs = *ys = NULL;
    if (!pts)
        return dragarc_error_set(err, DRAGARC_EINVAL, field, "is required");
    if (!cJSON_IsArray(pts))
        return dragarc_error_set(err, DRAGARC_EINVAL, field, "must be an array of %s pairs, not %s", what, type_name(pts));
    int n = cJSON_GetArraySize(pts);
    if (n < 2)
        return dragarc_error_set(err, DRAGARC_EINVAL, field, "needs at least 2 points (got %d)", n);
    if (n > 100000)
        return dragarc_error_set(err, DRAGARC_EINVAL, field, "has %d points; at most 100000 are allowed", n);
    double *x = malloc((size_t)n * sizeof *x), *y = malloc((size_t)n * sizeof *y);
    *xs = x, *ys = y, *count = n;
    if (!x || !y)
        return dragarc_error_set(err, DRAGARC_ENOMEM, field, "out of memory");
    int i = 0;
    for (const cJSON *p = pts->child; p; p = p->next, i++) {
        char pf[PATH_MAX_LEN];
        snprintf(pf, sizeof pf, "%s[%d]", field, i);
        if (!cJSON_IsArray(p) || cJSON_GetArraySize(p) != 2 || !cJSON_IsNumber(p->child) ||
            !cJSON_IsNumber(p->child->next))
            return dragarc_error_set(err, DRAGARC_EINVAL, pf, "must be a pair of numbers %s", what);
        x[i] = p->child->valuedouble;
        y[i] = p->child->next->valuedouble;
    }
    return DRAGARC_OK;
}

/* An array of 2 to 10000 numbers at path.key into a new array (caller frees, also after failure). */
static int read_numbers(const cJSON *obj, const char *path, const char *key, double **out, size_t *count,
                        dragarc_error *err)
{
    char field[PATH_MAX_LEN];
    join(field, sizeof field, path, key);
    const cJSON *a = cJSON_GetObjectItemCaseSensitive(obj, key);
    *out = NULL;
    if (!a)
        return dragarc_error_set(err, DRAGARC_EINVAL, field, "is required");
    int n = cJSON_IsArray(a) ? cJSON_GetArraySize(a) : -1;
    if (n < 2 || n > 10000)
        return dragarc_error_set(err, DRAGARC_EINVAL, field, "must be an array of 2 to 10000 numbers");
    double *v = malloc((size_t)n * sizeof *v);
    *out = v;
    if (!v)
        return dragarc_error_set(err, DRAGARC_ENOMEM, field, "out of memory");
    int i = 0;
    for (const cJSON *c = a->child; c; c = c->next, i++) {
        if (!cJSON_IsNumber(c)) {
            char f[PATH_MAX_LEN + 16];
            snprintf(f, sizeof f, "%s[%d]", field, i);
            return dragarc_error_set(err, DRAGARC_EINVAL, f, "must be a number, not %s", type_name(c));
        }
        v[i] = c->valuedouble;
    }
    *count = (size_t)n;
    return DRAGARC_OK;
}

/* drag {"model": "spin_table", "reynolds": [...], "spin_factor": [...], "cd": [[Cd at each S] for each Re]}. */
static int read_spin_table(const cJSON *j, const char *path, dragarc_drag *d, dragarc_error *err)
{
    double *re = NULL, *sf = NULL, *cd = NULL;
    size_t nre = 0, ns = 0;
    char field[PATH_MAX_LEN];
    join(field, sizeof field, path, "cd");
    int rc = read_numbers(j, path, "reynolds", &re, &nre, err);
    if (rc == DRAGARC_OK)
        rc = read_numbers(j, path, "spin_factor", &sf, &ns, err);
    const cJSON *rows = cJSON_GetObjectItemCaseSensitive(j, "cd");
    if (rc == DRAGARC_OK && (!cJSON_IsArray(rows) || (size_t)cJSON_GetArraySize(rows) != nre))
        rc = dragarc_error_set(err, DRAGARC_EINVAL, field,
                               "must be an array of %zu rows (one per Reynolds number) of %zu numbers (one per spin "
                               "factor)",
                               nre, ns);
    if (rc == DRAGARC_OK && !(cd = malloc(nre * ns * sizeof *cd)))
        rc = dragarc_error_set(err, DRAGARC_ENOMEM, field, "out of memory");
    size_t i = 0;
    for (const cJSON *row = rc == DRAGARC_OK ? rows->child : NULL; row && rc == DRAGARC_OK; row = row->next, i++) {
        size_t k = 0;
        if (!cJSON_IsArray(row) || (size_t)cJSON_GetArraySize(row) != ns)
            rc = -1;
        for (const cJSON *c = rc == DRAGARC_OK ? row->child : NULL; c && rc == DRAGARC_OK; c = c->next, k++) {
            if (!cJSON_IsNumber(c))
                rc = -1;
            else
                cd[i * ns + k] = c->valuedouble;
        }
        if (rc == -1) {
            char f[PATH_MAX_LEN + 16];
            snprintf(f, sizeof f, "%s[%zu]", field, i);
            rc = dragarc_error_set(err, DRAGARC_EINVAL, f, "must be an array of %zu numbers (one per spin factor)", ns);
        }
    }
    if (rc == DRAGARC_OK && (rc = dragarc_drag_spin_table_set(d, re, nre, sf, ns, cd, err)) != DRAGARC_OK)
        dragarc_error_prefix(err, path);
    free(re), free(sf), free(cd);
    return rc;
}

static int read_drag(const cJSON *j, const char *path, dragarc_drag *d, dragarc_error *err)
{
    TRY(want_object(j, path, err));
    const char *model = NULL;
    TRY(get_string(j, path, "model", 1, &model, err));
    char field[PATH_MAX_LEN];
    join(field, sizeof field, path, "model");
    dragarc_drag_model m;
    if (dragarc_drag_model_from_name(model, &m) != DRAGARC_OK)
        return dragarc_error_set(err, DRAGARC_EINVAL, field,
                                 "unknown drag model \"%s\" (none, constant, linear, quadratic, sphere, table, spin_table)", model);
    TRY(check_source(j, path, err));
    memset(d, 0, sizeof *d);
    d->model = m;
    switch (m) {
    case DRAGARC_DRAG_NONE: {
        static const char *const keys[] = {"model", "source", NULL};
        TRY(check_keys(j, path, keys, err));
        break;
    }
    case DRAGARC_DRAG_SPHERE: {
        static const char *const keys[] = {"model", "cd_scale", "source", NULL};
        TRY(check_keys(j, path, keys, err));
        break;
    }
    case DRAGARC_DRAG_CONSTANT: {
        static const char *const keys[] = {"model", "cd", "cd_scale", "source", NULL};
        TRY(check_keys(j, path, keys, err));
        TRY(get_number(j, path, "cd", 1, &d->cd, NULL, err));
        break;
    }
    case DRAGARC_DRAG_LINEAR: {
        static const char *const keys[] = {"model", "k", "cd_scale", "source", NULL};
        TRY(check_keys(j, path, keys, err));
        TRY(get_number(j, path, "k", 1, &d->k, NULL, err));
        break;
    }
    case DRAGARC_DRAG_QUADRATIC: {
        static const char *const keys[] = {"model", "c", "cd_scale", "source", NULL};
        TRY(check_keys(j, path, keys, err));
        TRY(get_number(j, path, "c", 1, &d->c, NULL, err));
        break;
    }
    case DRAGARC_DRAG_SPIN_TABLE: {
        static const char *const keys[] = {"model", "reynolds", "spin_factor", "cd", "cd_scale", "source", NULL};
        TRY(check_keys(j, path, keys, err));
        TRY(read_spin_table(j, path, d, err));
        break;
    }
    case DRAGARC_DRAG_TABLE: {
        static const char *const keys[] = {"model", "x", "points", "cd_scale", "source", NULL};
        TRY(check_keys(j, path, keys, err));
        const char *axis = NULL;
        TRY(get_string(j, path, "x", 1, &axis, err));
        dragarc_drag_axis ax;
        join(field, sizeof field, path, "x");
        if (dragarc_drag_axis_from_name(axis, &ax) != DRAGARC_OK)
            return dragarc_error_set(err, DRAGARC_EINVAL, field, "unknown table axis \"%s\" (reynolds, mach, speed)", axis);
        double *x = NULL, *y = NULL;
        int n = 0;
        join(field, sizeof field, path, "points");
        int rc = read_pairs(cJSON_GetObjectItemCaseSensitive(j, "points"), field, "[x, cd]", &x, &y, &n, err);
        if (rc == DRAGARC_OK) {
            rc = dragarc_drag_table_set(d, ax, x, y, (size_t)n, err);
            if (rc != DRAGARC_OK)
                dragarc_error_prefix(err, path);
        }
        free(x), free(y);
        if (rc != DRAGARC_OK)
            return rc;
        break;
    }
    }
    if (m != DRAGARC_DRAG_NONE) {
        int has_scale = 0;
        double scale = 1.0;
        TRY(get_number(j, path, "cd_scale", 0, &scale, &has_scale, err));
        join(field, sizeof field, path, "cd_scale");
        if (has_scale && !(scale > 0.0 && scale <= 100.0))
            return dragarc_error_set(err, DRAGARC_EINVAL, field, "must be positive and at most 100 (got %g)", scale);
        d->scale = has_scale ? scale : 0.0;
    }
    int rc = dragarc_drag_check(d, err);
    if (rc != DRAGARC_OK)
        dragarc_error_prefix(err, path);
    return rc;
}

/* projectile.lift: {"model": "constant", "cl"}, {"model": "sawicki2003"} or {"model": "table", "points": [[S, cl],
 * ...]}. */
static int read_lift(const cJSON *j, const char *path, dragarc_lift *l, dragarc_error *err)
{
    TRY(want_object(j, path, err));
    TRY(check_source(j, path, err));
    const char *model = NULL;
    TRY(get_string(j, path, "model", 1, &model, err));
    char field[PATH_MAX_LEN];
    dragarc_lift_model m;
    if (dragarc_lift_model_from_name(model, &m) != DRAGARC_OK || m == DRAGARC_LIFT_NONE) {
        join(field, sizeof field, path, "model");
        return dragarc_error_set(err, DRAGARC_EINVAL, field, "unknown lift model \"%s\" (constant, sawicki2003, table)",
                                 model);
    }
    static const char *const keys[][4] = {{0}, {"model", "cl", "source", NULL}, {"model", "source", NULL},
                                          {"model", "points", "source", NULL}};
    TRY(check_keys(j, path, keys[m], err));
    l->model = m;
    int rc = DRAGARC_OK;
    if (m == DRAGARC_LIFT_CONSTANT)
        TRY(get_number(j, path, "cl", 1, &l->cl, NULL, err));
    if (m == DRAGARC_LIFT_TABLE) {
        double *x = NULL, *y = NULL;
        int n = 0;
        join(field, sizeof field, path, "points");
        l->model = DRAGARC_LIFT_NONE; /* until the table is set */
        rc = read_pairs(cJSON_GetObjectItemCaseSensitive(j, "points"), field, "[S, cl]", &x, &y, &n, err);
        if (rc == DRAGARC_OK && (rc = dragarc_lift_table_set(l, x, y, (size_t)n, err)) != DRAGARC_OK)
            dragarc_error_prefix(err, path);
        free(x), free(y);
    }
    if (rc == DRAGARC_OK && (rc = dragarc_lift_check(l, err)) != DRAGARC_OK)
        dragarc_error_prefix(err, path);
    return rc;
}

/* ---- projectile ----------------------------------------------------------------------------- */

static int read_projectile_object(const cJSON *j, const char *path, dragarc_projectile *p, dragarc_error *err)
{
    static const char *const keys[] = {"name", "description", "source", "mass", "density", "diameter",
                                       "area", "volume", "drag", "lift", "spin_decay_coefficient",
                                       "inertia_factor", "evaporation", NULL};
    TRY(want_object(j, path, err));
    TRY(check_keys(j, path, keys, err));
    TRY(check_source(j, path, err));
    const char *name = NULL, *desc = NULL;
    TRY(get_string(j, path, "name", 0, &name, err));
    TRY(get_string(j, path, "description", 0, &desc, err));
    if (name)
        snprintf(p->name, sizeof p->name, "%s", name);
    double mass = 0.0, density = 0.0;
    int has_mass = 0, has_density = 0, has_area = 0, has_volume = 0;
    TRY(get_number(j, path, "mass", 0, &mass, &has_mass, err));
    TRY(get_number(j, path, "density", 0, &density, &has_density, err));
    TRY(get_number(j, path, "diameter", 1, &p->diameter, NULL, err));
    TRY(get_number(j, path, "area", 0, &p->area, &has_area, err));
    TRY(get_number(j, path, "volume", 0, &p->volume, &has_volume, err));
    char field[PATH_MAX_LEN];
    if (has_mass == has_density) {
        join(field, sizeof field, path, has_mass ? "density" : "mass");
        return dragarc_error_set(err, DRAGARC_EINVAL, field,
                                 has_mass ? "give either mass or density, not both" : "is required (or give density)");
    }
    if (!(p->diameter > 0.0)) {
        join(field, sizeof field, path, "diameter");
        return dragarc_error_set(err, DRAGARC_EINVAL, field, "must be positive, in m (got %g)", p->diameter);
    }
    if (!has_area)
        p->area = 0.25 * DRAGARC_PI * p->diameter * p->diameter;
    if (!has_volume)
        p->volume = DRAGARC_PI * p->diameter * p->diameter * p->diameter / 6.0;
    if (has_density) {
        join(field, sizeof field, path, "density");
        if (!(density > 0.0))
            return dragarc_error_set(err, DRAGARC_EINVAL, field, "must be positive, in kg/m^3 (got %g)", density);
        if (!(p->volume > 0.0))
            return dragarc_error_set(err, DRAGARC_EINVAL, field, "needs a positive volume to give a mass");
        mass = density * p->volume;
        p->density = density;
    }
    p->mass = mass;
    const cJSON *dj = cJSON_GetObjectItemCaseSensitive(j, "drag");
    join(field, sizeof field, path, "drag");
    if (!dj)
        return dragarc_error_set(err, DRAGARC_EINVAL, field, "is required (e.g. {\"model\": \"sphere\"})");
    TRY(read_drag(dj, field, &p->drag, err));
    const cJSON *lj = cJSON_GetObjectItemCaseSensitive(j, "lift");
    if (lj) {
        join(field, sizeof field, path, "lift");
        TRY(read_lift(lj, field, &p->lift, err));
    }
    const cJSON *ej = cJSON_GetObjectItemCaseSensitive(j, "evaporation");
    if (ej) {
        static const char *const ekeys[] = {"liquid", "nonvolatile_fraction", "source", NULL};
        join(field, sizeof field, path, "evaporation");
        TRY(want_object(ej, field, err));
        TRY(check_keys(ej, field, ekeys, err));
        TRY(check_source(ej, field, err));
        const char *liquid = "water";
        TRY(get_string(ej, field, "liquid", 0, &liquid, err));
        if (strcmp(liquid, "water") != 0) {
            char lf[PATH_MAX_LEN];
            join(lf, sizeof lf, field, "liquid");
            return dragarc_error_set(err, DRAGARC_EINVAL, lf,
                                     "only \"water\" evaporates in this model (got \"%s\"); put other non-volatile "
                                     "ingredients in nonvolatile_fraction",
                                     liquid);
        }
        p->evaporation.enabled = 1;
        TRY(get_number(ej, field, "nonvolatile_fraction", 0, &p->evaporation.nonvolatile_fraction, NULL, err));
    }
    TRY(get_number(j, path, "spin_decay_coefficient", 0, &p->spin_decay_coefficient, NULL, err));
    TRY(get_number(j, path, "inertia_factor", 0, &p->inertia_factor, NULL, err));
    int rc = dragarc_projectile_check(p, err);
    if (rc != DRAGARC_OK)
        dragarc_error_prefix(err, path);
    return rc;
}

static int is_path_like(const char *s)
{
    size_t n = strlen(s);
    return strchr(s, '/') != NULL || (n > 5 && strcmp(s + n - 5, ".json") == 0);
}

static int read_projectile_file(const char *file, dragarc_projectile *p, dragarc_error *err)
{
    char *text = NULL;
    int rc = dragarc_text_file_read(file, 4u << 20, &text, err);
    if (rc != DRAGARC_OK) {
        if (err) {
            char msg[sizeof err->message];
            snprintf(msg, sizeof msg, "%s", err->message);
            dragarc_error_set(err, rc, "projectile", "profile %s: %s", file, msg);
        }
        return rc;
    }
    cJSON *root = NULL;
    rc = parse_text(text, "the profile", &root, err);
    free(text);
    if (rc != DRAGARC_OK) {
        if (err) {
            char msg[sizeof err->message];
            snprintf(msg, sizeof msg, "%s: %s", file, err->message);
            dragarc_error_set(err, rc, "projectile", "%s", msg);
        }
        return rc;
    }
    rc = with_units(root, "projectile", err);
    if (rc == DRAGARC_OK)
        rc = read_projectile_object(root, "projectile", p, err);
    cJSON_Delete(root);
    if (rc != DRAGARC_OK && err) {
        char msg[sizeof err->message];
        snprintf(msg, sizeof msg, "%s (in profile %s)", err->message, file);
        snprintf(err->message, sizeof err->message, "%s", msg);
    }
    return rc;
}

static int read_projectile(const cJSON *j, const char *base_dir, const char *profile_path, dragarc_projectile *p,
                           dragarc_error *err)
{
    if (!cJSON_IsString(j) && !cJSON_IsObject(j))
        return dragarc_error_set(err, DRAGARC_EINVAL, "projectile",
                                 "must be an object, a profile name or a profile path, not %s", type_name(j));
    if (!cJSON_IsString(j))
        return read_projectile_object(j, "projectile", p, err);
    const char *ref = j->valuestring;
    char file[4096];
    if (is_path_like(ref)) {
        if (ref[0] == '/' || !base_dir || !*base_dir)
            snprintf(file, sizeof file, "%s", ref);
        else
            snprintf(file, sizeof file, "%s/%s", base_dir, ref);
        return read_projectile_file(file, p, err);
    }
    for (const char *c = ref; *c; c++)
        if (!((*c >= 'a' && *c <= 'z') || (*c >= 'A' && *c <= 'Z') || (*c >= '0' && *c <= '9') || *c == '-' ||
              *c == '_' || *c == '.'))
            return dragarc_error_set(err, DRAGARC_EINVAL, "projectile",
                                     "\"%s\" is neither a profile name (letters, digits, '-', '_', '.') nor a path", ref);
    const char *dirs = profile_path ? profile_path : "";
    while (*dirs) {
        const char *colon = strchr(dirs, ':');
        size_t len = colon ? (size_t)(colon - dirs) : strlen(dirs);
        if (len > 0 && len < 3000) {
            snprintf(file, sizeof file, "%.*s/%s.json", (int)len, dirs, ref);
            FILE *f = fopen(file, "rb");
            if (f) {
                fclose(f);
                int rc = read_projectile_file(file, p, err);
                if (rc == DRAGARC_OK && !p->name[0])
                    snprintf(p->name, sizeof p->name, "%s", ref);
                return rc;
            }
        }
        dirs += len;
        if (*dirs == ':')
            dirs++;
    }
    return dragarc_error_set(err, DRAGARC_EINVAL, "projectile", "no profile named \"%s\" in the profile folders (%s)", ref,
                             profile_path && *profile_path ? profile_path : "none set");
}

/* ---- launch, environment, ground, solver ----------------------------------------------------- */

/* Named ground surfaces. INVENTED EXAMPLES, not measurements: they show the form and give plausible
 * orders of magnitude for trying the model; give measured values for real work (docs/scenario.md). */
static const struct {
    const char *name;
    dragarc_surface surface;
} SURFACE_EXAMPLES[] = {
    {"example-firm-turf", {0.4, 0.4, 0.25, 0.0}},
    {"example-soft-wet-grass", {0.2, 0.5, 0.4, 0.0}},
    {"example-smooth-pavement", {0.7, 0.6, 0.02, 0.0}},
};

/* ground.surface: {"restitution", "friction", "rolling_resistance", "tangential_restitution"} or the name of
 * an example; ground.bounce: {"min_height", "max_bounces"}. */
static int read_ground(const cJSON *g, dragarc_scenario *s, dragarc_error *err)
{
    static const char *const gkeys[] = {"elevation", "surface", "bounce", NULL};
    TRY(want_object(g, "ground", err));
    TRY(check_keys(g, "ground", gkeys, err));
    TRY(get_number(g, "ground", "elevation", 0, &s->ground_elevation, NULL, err));
    const cJSON *sf = cJSON_GetObjectItemCaseSensitive(g, "surface");
    if (sf && cJSON_IsString(sf)) {
        size_t n = sizeof SURFACE_EXAMPLES / sizeof *SURFACE_EXAMPLES, i;
        for (i = 0; i < n && strcmp(sf->valuestring, SURFACE_EXAMPLES[i].name) != 0; i++)
            ;
        if (i == n)
            return dragarc_error_set(err, DRAGARC_EINVAL, "ground.surface",
                                     "no example surface named \"%s\" (example-firm-turf, example-soft-wet-grass, "
                                     "example-smooth-pavement), and no object of surface values",
                                     sf->valuestring);
        s->surface = SURFACE_EXAMPLES[i].surface;
        s->ground_surface_given = 1;
    } else if (sf) {
        static const char *const keys[] = {"restitution", "friction", "rolling_resistance", "tangential_restitution",
                                           "source", NULL};
        if (!cJSON_IsObject(sf))
            return dragarc_error_set(err, DRAGARC_EINVAL, "ground.surface",
                                     "must be an object of surface values or the name of an example surface, not %s",
                                     type_name(sf));
        TRY(check_keys(sf, "ground.surface", keys, err));
        TRY(check_source(sf, "ground.surface", err));
        TRY(get_number(sf, "ground.surface", "restitution", 1, &s->surface.restitution, NULL, err));
        TRY(get_number(sf, "ground.surface", "friction", 1, &s->surface.friction, NULL, err));
        TRY(get_number(sf, "ground.surface", "rolling_resistance", 1, &s->surface.rolling_resistance, NULL, err));
        TRY(get_number(sf, "ground.surface", "tangential_restitution", 0, &s->surface.tangential_restitution, NULL,
                       err));
        s->ground_surface_given = 1;
    }
    const cJSON *b = cJSON_GetObjectItemCaseSensitive(g, "bounce");
    if (b) {
        static const char *const keys[] = {"min_height", "max_bounces", NULL};
        TRY(want_object(b, "ground.bounce", err));
        TRY(check_keys(b, "ground.bounce", keys, err));
        if (!sf)
            return dragarc_error_set(err, DRAGARC_EINVAL, "ground.bounce", "needs a ground.surface to bounce on");
        double mb = s->bounce.max_bounces;
        TRY(get_number(b, "ground.bounce", "min_height", 0, &s->bounce.min_height, NULL, err));
        TRY(get_number(b, "ground.bounce", "max_bounces", 0, &mb, NULL, err));
        if (!(mb >= 1.0 && mb <= 1000.0 && mb == floor(mb)))
            return dragarc_error_set(err, DRAGARC_EINVAL, "ground.bounce.max_bounces",
                                     "must be a whole number from 1 to 1000 (got %g)", mb);
        s->bounce.max_bounces = (int)mb;
    }
    return DRAGARC_OK;
}

/* launch.spin: {"rate": rpm, "tilt": degrees} or {"vector": [east, north, up] in rpm}, and "decay_time": s. */
static int read_spin(const cJSON *j, dragarc_launch *l, dragarc_error *err)
{
    static const char *const keys[] = {"rate", "tilt", "vector", "decay_time", NULL};
    TRY(want_object(j, "launch.spin", err));
    TRY(check_keys(j, "launch.spin", keys, err));
    double rpm = 0.0, tilt = 0.0;
    const cJSON *vec = cJSON_GetObjectItemCaseSensitive(j, "vector");
    if (vec) {
        if (cJSON_GetObjectItemCaseSensitive(j, "rate") || cJSON_GetObjectItemCaseSensitive(j, "tilt"))
            return dragarc_error_set(err, DRAGARC_EINVAL, "launch.spin.vector",
                                     "give either the vector or the rate and tilt, not both");
        if (!cJSON_IsArray(vec) || cJSON_GetArraySize(vec) != 3)
            return dragarc_error_set(err, DRAGARC_EINVAL, "launch.spin.vector",
                                     "must be an array of three numbers [east, north, up] in rpm");
        double w[3];
        int i = 0;
        for (const cJSON *c = vec->child; c; c = c->next, i++) {
            if (!cJSON_IsNumber(c) || !isfinite(c->valuedouble))
                return dragarc_error_set(err, DRAGARC_EINVAL, "launch.spin.vector",
                                         "must be an array of three numbers [east, north, up] in rpm");
            w[i] = c->valuedouble;
        }
        rpm = sqrt(w[0] * w[0] + w[1] * w[1] + w[2] * w[2]);
        if (rpm > 0.0) {
            l->spin_axis_given = 1;
            for (i = 0; i < 3; i++)
                l->spin_axis[i] = w[i] / rpm;
        }
    } else {
        TRY(get_number(j, "launch.spin", "rate", 1, &rpm, NULL, err));
        TRY(get_number(j, "launch.spin", "tilt", 0, &tilt, NULL, err));
    }
    TRY(get_number(j, "launch.spin", "decay_time", 0, &l->spin_decay_time, NULL, err));
    if (!(rpm >= 0.0 && rpm <= 60000.0))
        return dragarc_error_set(err, DRAGARC_EINVAL, vec ? "launch.spin.vector" : "launch.spin.rate",
                                 "must be between 0 and 60000 rpm (got %g)", rpm);
    if (!(tilt >= -180.0 && tilt <= 180.0))
        return dragarc_error_set(err, DRAGARC_EINVAL, "launch.spin.tilt", "must be between -180 and 180 degrees (got %g)",
                                 tilt);
    if (cJSON_GetObjectItemCaseSensitive(j, "decay_time") && !(l->spin_decay_time > 0.0))
        return dragarc_error_set(err, DRAGARC_EINVAL, "launch.spin.decay_time", "must be positive, in s (got %g)",
                                 l->spin_decay_time);
    l->spin_rate = rpm * 2.0 * DRAGARC_PI / 60.0;
    l->spin_tilt = tilt * DRAGARC_DEG;
    return DRAGARC_OK;
}

static int read_launch(const cJSON *j, dragarc_launch *l, dragarc_error *err)
{
    static const char *const keys[] = {"speed", "elevation", "azimuth", "height", "spin", NULL};
    TRY(want_object(j, "launch", err));
    TRY(check_keys(j, "launch", keys, err));
    double elev = 0.0, az = 0.0;
    TRY(get_number(j, "launch", "speed", 1, &l->speed, NULL, err));
    TRY(get_number(j, "launch", "elevation", 1, &elev, NULL, err));
    TRY(get_number(j, "launch", "azimuth", 0, &az, NULL, err));
    TRY(get_number(j, "launch", "height", 0, &l->height, NULL, err));
    if (!(l->speed >= 0.0))
        return dragarc_error_set(err, DRAGARC_EINVAL, "launch.speed", "must be zero or positive, in m/s (got %g)", l->speed);
    if (!(elev >= -90.0 && elev <= 90.0))
        return dragarc_error_set(err, DRAGARC_EINVAL, "launch.elevation", "must be between -90 and 90 degrees (got %g)", elev);
    if (!(az >= -360.0 && az <= 360.0))
        return dragarc_error_set(err, DRAGARC_EINVAL, "launch.azimuth", "must be between -360 and 360 degrees (got %g)", az);
    l->elevation = elev * DRAGARC_DEG;
    l->azimuth = az * DRAGARC_DEG;
    const cJSON *spin = cJSON_GetObjectItemCaseSensitive(j, "spin");
    if (spin)
        TRY(read_spin(spin, l, err));
    return DRAGARC_OK;
}

/* The atmosphere models and their keys besides "model", in the order they are read: a name, the double it
 * fills in dragarc_atmosphere, and whether it must be given. A new model is one row. */
typedef struct atmosphere_key {
    const char *name;
    size_t offset;
    int required;
} atmosphere_key;

#define ATMOSPHERE_KEY(field, required) {#field, offsetof(dragarc_atmosphere, field), required}
#define ATMOSPHERE_MAX_KEYS 4

static const struct {
    const char *name;
    dragarc_atmosphere_model model;
    atmosphere_key keys[ATMOSPHERE_MAX_KEYS]; /* ends at the first without a name */
} ATMOSPHERE_MODELS[] = {
    {"isa", DRAGARC_ATMOSPHERE_ISA, {ATMOSPHERE_KEY(site_elevation, 0), ATMOSPHERE_KEY(temperature_offset, 0)}},
    {"constant",
     DRAGARC_ATMOSPHERE_CONSTANT,
     {ATMOSPHERE_KEY(density, 1), ATMOSPHERE_KEY(viscosity, 1), ATMOSPHERE_KEY(temperature, 0),
      ATMOSPHERE_KEY(speed_of_sound, 0)}},
    {"exponential",
     DRAGARC_ATMOSPHERE_EXPONENTIAL,
     {ATMOSPHERE_KEY(density, 1), ATMOSPHERE_KEY(scale_height, 1), ATMOSPHERE_KEY(temperature, 0)}},
    {"local",
     DRAGARC_ATMOSPHERE_LOCAL,
     {ATMOSPHERE_KEY(temperature, 1), ATMOSPHERE_KEY(pressure, 1), ATMOSPHERE_KEY(relative_humidity, 1)}},
};
#define NATMOSPHERE_MODELS (sizeof ATMOSPHERE_MODELS / sizeof ATMOSPHERE_MODELS[0])

static int read_atmosphere(const cJSON *j, dragarc_atmosphere *a, dragarc_error *err)
{
    const char *path = "environment.atmosphere";
    TRY(want_object(j, path, err));
    const char *model = "isa";
    TRY(get_string(j, path, "model", 0, &model, err));
    dragarc_atmosphere_default(a);
    size_t m = 0;
    while (m < NATMOSPHERE_MODELS && strcmp(model, ATMOSPHERE_MODELS[m].name) != 0)
        m++;
    if (m == NATMOSPHERE_MODELS) {
        char names[128] = "";
        for (size_t i = 0; i < NATMOSPHERE_MODELS; i++)
            snprintf(names + strlen(names), sizeof names - strlen(names), "%s%s", i ? ", " : "",
                     ATMOSPHERE_MODELS[i].name);
        return dragarc_error_set(err, DRAGARC_EINVAL, "environment.atmosphere.model",
                                 "unknown atmosphere model \"%s\" (%s)", model, names);
    }
    const atmosphere_key *keys = ATMOSPHERE_MODELS[m].keys;
    const char *allowed[ATMOSPHERE_MAX_KEYS + 2] = {"model"};
    for (size_t k = 0; k < ATMOSPHERE_MAX_KEYS && keys[k].name; k++)
        allowed[k + 1] = keys[k].name;
    TRY(check_keys(j, path, allowed, err));
    a->model = ATMOSPHERE_MODELS[m].model;
    if (a->model == DRAGARC_ATMOSPHERE_CONSTANT)
        a->temperature = 293.15; /* a room, not the standard's sea level */
    for (size_t k = 0; k < ATMOSPHERE_MAX_KEYS && keys[k].name; k++)
        TRY(get_number(j, path, keys[k].name, keys[k].required, (double *)((char *)a + keys[k].offset), NULL, err));
    int rc = dragarc_atmosphere_check(a, err);
    if (rc != DRAGARC_OK)
        dragarc_error_prefix(err, path);
    return rc;
}

static int read_direction(const cJSON *j, const char *path, const char *key, int required, double *out,
                          dragarc_error *err)
{
    double deg = 0.0;
    int present = 0;
    TRY(get_number(j, path, key, required, &deg, &present, err));
    if (present && !(deg >= -360.0 && deg <= 360.0)) {
        char field[PATH_MAX_LEN];
        join(field, sizeof field, path, key);
        return dragarc_error_set(err, DRAGARC_EINVAL, field, "must be between -360 and 360 degrees (got %g)", deg);
    }
    if (present)
        *out = deg * DRAGARC_DEG;
    return DRAGARC_OK;
}

static int read_layers(const cJSON *arr, const char *path, dragarc_wind *w, dragarc_error *err)
{
    char field[PATH_MAX_LEN];
    join(field, sizeof field, path, "layers");
    if (!arr)
        return dragarc_error_set(err, DRAGARC_EINVAL, field, "is required for a layered wind");
    if (!cJSON_IsArray(arr))
        return dragarc_error_set(err, DRAGARC_EINVAL, field, "must be an array of {height, speed, from}, not %s",
                                 type_name(arr));
    int n = cJSON_GetArraySize(arr);
    if (n < 1 || n > 100000)
        return dragarc_error_set(err, DRAGARC_EINVAL, field, "needs between 1 and 100000 rows (got %d)", n);
    w->layers = calloc((size_t)n, sizeof *w->layers);
    if (!w->layers)
        return dragarc_error_set(err, DRAGARC_ENOMEM, field, "out of memory");
    w->nlayers = (size_t)n;
    int i = 0;
    for (const cJSON *row = arr->child; row; row = row->next, i++) {
        static const char *const keys[] = {"height", "speed", "from", NULL};
        char rf[PATH_MAX_LEN];
        snprintf(rf, sizeof rf, "%s[%d]", field, i);
        TRY(want_object(row, rf, err));
        TRY(check_keys(row, rf, keys, err));
        TRY(get_number(row, rf, "height", 1, &w->layers[i].height, NULL, err));
        TRY(get_number(row, rf, "speed", 1, &w->layers[i].speed, NULL, err));
        TRY(read_direction(row, rf, "from", 1, &w->layers[i].from, err));
    }
    return DRAGARC_OK;
}

/* A wind object at path ("environment.wind", or a profile of a footprint's wind uncertainty). */
static int read_wind_at(const cJSON *j, const char *path, dragarc_wind *w, dragarc_error *err)
{
    TRY(want_object(j, path, err));
    const char *model = NULL;
    TRY(get_string(j, path, "model", 0, &model, err));
    if (!model)
        model = cJSON_GetObjectItemCaseSensitive(j, "layers") ? "layered" : "constant";
    dragarc_wind_default(w);
    if (strcmp(model, "none") == 0) {
        static const char *const keys[] = {"model", NULL};
        TRY(check_keys(j, path, keys, err));
        return DRAGARC_OK;
    } else if (strcmp(model, "constant") == 0) {
        static const char *const keys[] = {"model", "speed", "from", NULL};
        TRY(check_keys(j, path, keys, err));
        w->model = DRAGARC_WIND_CONSTANT;
        TRY(get_number(j, path, "speed", 1, &w->speed, NULL, err));
        TRY(read_direction(j, path, "from", 1, &w->from, err));
    } else if (strcmp(model, "layered") == 0) {
        static const char *const keys[] = {"model", "layers", NULL};
        TRY(check_keys(j, path, keys, err));
        w->model = DRAGARC_WIND_LAYERED;
        TRY(read_layers(cJSON_GetObjectItemCaseSensitive(j, "layers"), path, w, err));
    } else if (strcmp(model, "power") == 0) {
        static const char *const keys[] = {"model", "speed", "from", "ref_height", "exponent", NULL};
        TRY(check_keys(j, path, keys, err));
        w->model = DRAGARC_WIND_POWER;
        TRY(get_number(j, path, "speed", 1, &w->speed, NULL, err));
        TRY(read_direction(j, path, "from", 1, &w->from, err));
        TRY(get_number(j, path, "ref_height", 0, &w->ref_height, NULL, err));
        TRY(get_number(j, path, "exponent", 0, &w->exponent, NULL, err));
    } else if (strcmp(model, "log") == 0) {
        static const char *const keys[] = {"model", "speed", "from", "ref_height", "roughness", NULL};
        TRY(check_keys(j, path, keys, err));
        w->model = DRAGARC_WIND_LOG;
        TRY(get_number(j, path, "speed", 1, &w->speed, NULL, err));
        TRY(read_direction(j, path, "from", 1, &w->from, err));
        TRY(get_number(j, path, "ref_height", 0, &w->ref_height, NULL, err));
        TRY(get_number(j, path, "roughness", 0, &w->roughness, NULL, err));
    } else {
        char field[PATH_MAX_LEN];
        join(field, sizeof field, path, "model");
        return dragarc_error_set(err, DRAGARC_EINVAL, field,
                                 "unknown wind model \"%s\" (none, constant, layered, power, log)", model);
    }
    int rc = dragarc_wind_check(w, err);
    if (rc != DRAGARC_OK)
        dragarc_error_prefix(err, path);
    return rc;
}

static int read_wind(const cJSON *j, dragarc_wind *w, dragarc_error *err)
{
    return read_wind_at(j, "environment.wind", w, err);
}

/* environment.earth: {"model": "flat"} or {"model": "spherical", "rotation", "latitude" (degrees), "radius" (m),
 * "rotation_rate" (rad/s)}. */
static int read_earth(const cJSON *j, dragarc_earth *e, dragarc_error *err)
{
    const char *path = "environment.earth";
    TRY(want_object(j, path, err));
    const char *model = NULL;
    TRY(get_string(j, path, "model", 1, &model, err));
    dragarc_earth_default(e);
    if (strcmp(model, "flat") == 0) {
        static const char *const keys[] = {"model", NULL};
        return check_keys(j, path, keys, err);
    }
    if (strcmp(model, "spherical") != 0)
        return dragarc_error_set(err, DRAGARC_EINVAL, "environment.earth.model",
                                 "unknown Earth model \"%s\" (flat, spherical)", model);
    static const char *const keys[] = {"model", "rotation", "latitude", "radius", "rotation_rate", NULL};
    TRY(check_keys(j, path, keys, err));
    e->model = DRAGARC_EARTH_SPHERICAL;
    const cJSON *rot = cJSON_GetObjectItemCaseSensitive(j, "rotation");
    if (rot && !cJSON_IsBool(rot))
        return dragarc_error_set(err, DRAGARC_EINVAL, "environment.earth.rotation", "must be true or false, not %s",
                                 type_name(rot));
    if (rot)
        e->rotation = cJSON_IsTrue(rot);
    double deg = 0.0;
    TRY(get_number(j, path, "latitude", 0, &deg, &e->latitude_given, err));
    e->latitude = deg * DRAGARC_DEG;
    TRY(get_number(j, path, "radius", 0, &e->radius, NULL, err));
    TRY(get_number(j, path, "rotation_rate", 0, &e->rotation_rate, NULL, err));
    int rc = dragarc_earth_check(e, err);
    if (rc != DRAGARC_OK)
        dragarc_error_prefix(err, path);
    return rc;
}

static int read_environment(const cJSON *j, dragarc_scenario *s, dragarc_error *err)
{
    static const char *const keys[] = {"gravity", "atmosphere", "wind", "earth", NULL};
    TRY(want_object(j, "environment", err));
    TRY(check_keys(j, "environment", keys, err));
    TRY(get_number(j, "environment", "gravity", 0, &s->gravity, NULL, err));
    const cJSON *ea = cJSON_GetObjectItemCaseSensitive(j, "earth");
    if (ea)
        TRY(read_earth(ea, &s->earth, err));
    const cJSON *a = cJSON_GetObjectItemCaseSensitive(j, "atmosphere");
    if (a)
        TRY(read_atmosphere(a, &s->atmosphere, err));
    const cJSON *w = cJSON_GetObjectItemCaseSensitive(j, "wind");
    if (w)
        TRY(read_wind(w, &s->wind, err));
    return DRAGARC_OK;
}

static int read_solver(const cJSON *j, dragarc_solver_options *o, dragarc_error *err)
{
    static const char *const keys[] = {"rtol", "atol", "max_time", "max_steps", "method", NULL};
    TRY(want_object(j, "solver", err));
    TRY(check_keys(j, "solver", keys, err));
    TRY(get_number(j, "solver", "rtol", 0, &o->rtol, NULL, err));
    TRY(get_number(j, "solver", "atol", 0, &o->atol, NULL, err));
    TRY(get_number(j, "solver", "max_time", 0, &o->max_time, NULL, err));
    double steps = (double)o->max_steps;
    TRY(get_number(j, "solver", "max_steps", 0, &steps, NULL, err));
    if (!(steps >= 10.0 && steps <= 1e8 && steps == floor(steps)))
        return dragarc_error_set(err, DRAGARC_EINVAL, "solver.max_steps", "must be a whole number from 10 to 1e8 (got %g)", steps);
    o->max_steps = (long)steps;
    const char *method = NULL;
    TRY(get_string(j, "solver", "method", 0, &method, err));
    if (method) {
        if (strcmp(method, "auto") == 0)
            o->method = DRAGARC_METHOD_AUTO;
        else if (strcmp(method, "adams") == 0)
            o->method = DRAGARC_METHOD_ADAMS;
        else if (strcmp(method, "bdf") == 0)
            o->method = DRAGARC_METHOD_BDF;
        else if (strcmp(method, "rk8pd") == 0)
            o->method = DRAGARC_METHOD_RK8PD;
        else if (strcmp(method, "dop853") == 0)
            o->method = DRAGARC_METHOD_DOP853;
        else
            return dragarc_error_set(err, DRAGARC_EINVAL, "solver.method",
                                     "unknown method \"%s\" (auto, dop853, rk8pd, adams, bdf)", method);
    }
    return DRAGARC_OK;
}

static int read_scenario(const cJSON *root, const char *base_dir, const char *profile_path, dragarc_scenario *s,
                         dragarc_error *err)
{
    static const char *const keys[] = {"name", "description", "projectile", "launch", "environment", "ground", "solver",
                                       NULL};
    if (!cJSON_IsObject(root))
        return dragarc_error_set(err, DRAGARC_EINVAL, "", "a scenario must be a JSON object, not %s", type_name(root));
    TRY(check_keys(root, "", keys, err));
    const char *name = NULL, *desc = NULL;
    TRY(get_string(root, "", "name", 0, &name, err));
    TRY(get_string(root, "", "description", 0, &desc, err));
    if (name)
        snprintf(s->name, sizeof s->name, "%s", name);
    const cJSON *p = cJSON_GetObjectItemCaseSensitive(root, "projectile");
    if (!p)
        return dragarc_error_set(err, DRAGARC_EINVAL, "projectile", "is required");
    TRY(read_projectile(p, base_dir, profile_path, &s->projectile, err));
    const cJSON *l = cJSON_GetObjectItemCaseSensitive(root, "launch");
    if (!l)
        return dragarc_error_set(err, DRAGARC_EINVAL, "launch", "is required");
    TRY(read_launch(l, &s->launch, err));
    const cJSON *e = cJSON_GetObjectItemCaseSensitive(root, "environment");
    if (e)
        TRY(read_environment(e, s, err));
    const cJSON *g = cJSON_GetObjectItemCaseSensitive(root, "ground");
    if (g)
        TRY(read_ground(g, s, err));
    const cJSON *so = cJSON_GetObjectItemCaseSensitive(root, "solver");
    if (so)
        TRY(read_solver(so, &s->solver, err));
    return dragarc_scenario_check(s, err);
}

int dragarc_scenario_parse(const char *json, const char *base_dir, const char *profile_path, dragarc_scenario *out,
                           dragarc_error *err)
{
    dragarc_scenario_default(out);
    cJSON *root = NULL;
    int rc = parse_text(json, "the scenario", &root, err);
    if (rc != DRAGARC_OK)
        return rc;
    rc = with_units(root, "", err);
    if (rc == DRAGARC_OK)
        rc = read_scenario(root, base_dir, profile_path, out, err);
    cJSON_Delete(root);
    if (rc != DRAGARC_OK)
        dragarc_scenario_clear(out);
    return rc;
}

int dragarc_io_read_file_and_folder(const char *path, char **text, char *dir, size_t n, dragarc_error *err)
{
    int rc = dragarc_text_file_read(path, 16u << 20, text, err);
    if (rc != DRAGARC_OK)
        return rc;
    snprintf(dir, n, "%s", path);
    char *slash = strrchr(dir, '/');
    if (slash)
        *slash = '\0';
    else
        snprintf(dir, n, ".");
    return DRAGARC_OK;
}

int dragarc_scenario_read(const char *path, const char *profile_path, dragarc_scenario *out, dragarc_error *err)
{
    dragarc_scenario_default(out);
    char *text = NULL, dir[4096];
    int rc = dragarc_io_read_file_and_folder(path, &text, dir, sizeof dir, err);
    if (rc != DRAGARC_OK)
        return rc;
    rc = dragarc_scenario_parse(text, dir, profile_path, out, err);
    free(text);
    return rc;
}

/* ---- sprinkler scenarios ---------------------------------------------------------------------------------- */

/* sprinkler.spectrum: {"form": "rosin_rammler" | "log_normal" | "table", "dv50" or "scale", "spread" | "sigma" or
 * "span", "points": [[d, fraction], ...], "classes", "spacing"}. */
static int read_spectrum(const cJSON *j, const char *path, dragarc_spectrum *spectrum, size_t *nclasses,
                         dragarc_spectrum_spacing *spacing_out, dragarc_error *err)
{
    static const char *const keys[] = {"form", "dv50", "scale", "spread", "sigma", "span", "points", "classes",
                                       "spacing", "source", NULL};
    TRY(want_object(j, path, err));
    TRY(check_keys(j, path, keys, err));
    TRY(check_source(j, path, err));
    const char *form = NULL, *spacing = "geometric";
    TRY(get_string(j, path, "form", 1, &form, err));
    TRY(get_string(j, path, "spacing", 0, &spacing, err));
    char field[PATH_MAX_LEN];
    dragarc_spectrum_form f;
    if (dragarc_spectrum_form_from_name(form, &f) != DRAGARC_OK || f == DRAGARC_SPECTRUM_NONE) {
        join(field, sizeof field, path, "form");
        return dragarc_error_set(err, DRAGARC_EINVAL, field, "unknown spectrum form \"%s\" (rosin_rammler, log_normal, "
                                 "table)", form);
    }
    if (dragarc_spectrum_spacing_from_name(spacing, spacing_out) != DRAGARC_OK) {
        join(field, sizeof field, path, "spacing");
        return dragarc_error_set(err, DRAGARC_EINVAL, field, "unknown spacing \"%s\" (geometric, equal_volume)",
                                 spacing);
    }
    double classes = 40.0, dv50 = NAN, scale = NAN, spread = NAN, sigma = NAN, span = NAN;
    TRY(get_number(j, path, "classes", 0, &classes, NULL, err));
    if (!(classes >= 1.0 && classes <= DRAGARC_SPECTRUM_MAX_CLASSES && classes == floor(classes))) {
        join(field, sizeof field, path, "classes");
        return dragarc_error_set(err, DRAGARC_EINVAL, field, "must be a whole number from 1 to %d (got %g)",
                                 DRAGARC_SPECTRUM_MAX_CLASSES, classes);
    }
    *nclasses = (size_t)classes;
    TRY(get_number(j, path, "dv50", 0, &dv50, NULL, err));
    TRY(get_number(j, path, "scale", 0, &scale, NULL, err));
    TRY(get_number(j, path, "spread", 0, &spread, NULL, err));
    TRY(get_number(j, path, "sigma", 0, &sigma, NULL, err));
    TRY(get_number(j, path, "span", 0, &span, NULL, err));
    int rc = DRAGARC_OK;
    if (f == DRAGARC_SPECTRUM_ROSIN_RAMMLER) {
        if (isnan(dv50) == isnan(scale) || isnan(spread))
            return dragarc_error_set(err, DRAGARC_EINVAL, path, "rosin_rammler needs dv50 (or scale) and spread");
        rc = !isnan(dv50) ? dragarc_spectrum_rosin_rammler(spectrum, dv50, spread, err)
                          : dragarc_spectrum_rosin_rammler_scale(spectrum, scale, spread, err);
    } else if (f == DRAGARC_SPECTRUM_LOG_NORMAL) {
        if (isnan(dv50) || isnan(sigma) == isnan(span))
            return dragarc_error_set(err, DRAGARC_EINVAL, path, "log_normal needs dv50 and one of sigma or span");
        rc = !isnan(sigma) ? dragarc_spectrum_log_normal(spectrum, dv50, sigma, err)
                           : dragarc_spectrum_log_normal_span(spectrum, dv50, span, err);
    } else {
        double *x = NULL, *y = NULL;
        int n = 0;
        join(field, sizeof field, path, "points");
        rc = read_pairs(cJSON_GetObjectItemCaseSensitive(j, "points"), field, "[diameter, fraction]", &x, &y, &n, err);
        if (rc == DRAGARC_OK)
            rc = dragarc_spectrum_table_set(spectrum, x, y, (size_t)n, err);
        free(x), free(y);
    }
    if (rc != DRAGARC_OK && err && strncmp(err->field, path, strlen(path)) != 0)
        dragarc_error_prefix(err, path);
    return rc;
}

/* The drop of a sprinkler or a sprayer: water of the liquid's density with sphere drag (each class sets its own
 * diameter), evaporating in the day's air when the atmosphere is the local model (set by read_drop_rest). */
static void water_drop(dragarc_projectile *p, double density, double nonvolatile_fraction)
{
    p->density = density;
    p->diameter = 1e-3;
    p->area = 0.25 * DRAGARC_PI * p->diameter * p->diameter;
    p->volume = DRAGARC_PI / 6.0 * p->diameter * p->diameter * p->diameter;
    p->mass = p->density * p->volume;
    p->drag.model = DRAGARC_DRAG_SPHERE;
    p->evaporation.nonvolatile_fraction = nonvolatile_fraction;
    snprintf(p->name, sizeof p->name, "water drop");
}

/* sprinkler.layout: {"kind": "square" | "rectangular" | "triangular", "spacing", "row_spacing", "points"}. */
static int read_layout(const cJSON *j, dragarc_sprinkler_spec *sp, dragarc_error *err)
{
    static const char *const keys[] = {"kind", "spacing", "row_spacing", "points", NULL};
    static const char *const KINDS[] = {"square", "rectangular", "triangular"};
    const char *path = "sprinkler.layout";
    TRY(want_object(j, path, err));
    TRY(check_keys(j, path, keys, err));
    const char *kind = NULL;
    TRY(get_string(j, path, "kind", 1, &kind, err));
    size_t k = 0;
    while (k < 3 && strcmp(kind, KINDS[k]) != 0)
        k++;
    if (k == 3)
        return dragarc_error_set(err, DRAGARC_EINVAL, "sprinkler.layout.kind",
                                 "unknown layout \"%s\" (square, rectangular, triangular)", kind);
    sp->layout.kind = (dragarc_layout_kind)k;
    TRY(get_number(j, path, "spacing", 1, &sp->layout.spacing, NULL, err));
    sp->layout.row_spacing = sp->layout.spacing;
    TRY(get_number(j, path, "row_spacing", k == DRAGARC_LAYOUT_RECTANGULAR, &sp->layout.row_spacing, NULL, err));
    double pts = 20.0;
    TRY(get_number(j, path, "points", 0, &pts, NULL, err));
    if (!(pts >= 2.0 && pts <= DRAGARC_OVERLAP_MAX_POINTS && pts == floor(pts)))
        return dragarc_error_set(err, DRAGARC_EINVAL, "sprinkler.layout.points",
                                 "must be a whole number from 2 to %d (got %g)", DRAGARC_OVERLAP_MAX_POINTS, pts);
    sp->layout_points = (size_t)pts;
    int rc = dragarc_layout_check(&sp->layout, err);
    if (rc != DRAGARC_OK)
        dragarc_error_prefix(err, "sprinkler");
    sp->layout_given = rc == DRAGARC_OK;
    return rc;
}

/* The sprinkler object: the nozzle, its height and elevation, its arc, the drops, and the pattern's resolution. */
static int read_sprinkler(const cJSON *j, dragarc_sprinkler_spec *sp, dragarc_error *err)
{
    static const char *const keys[] = {"nozzle", "height", "elevation", "arc", "directions", "spectrum",
                                       "liquid_density", "nonvolatile_fraction", "ring_width", "cell", "layout", NULL};
    static const char *const nkeys[] = {"diameter", "pressure", "velocity_coefficient", "discharge_coefficient",
                                        "source", NULL};
    const char *path = "sprinkler";
    TRY(want_object(j, path, err));
    TRY(check_keys(j, path, keys, err));
    const cJSON *n = cJSON_GetObjectItemCaseSensitive(j, "nozzle");
    if (!n)
        return dragarc_error_set(err, DRAGARC_EINVAL, "sprinkler.nozzle", "is required");
    TRY(want_object(n, "sprinkler.nozzle", err));
    TRY(check_keys(n, "sprinkler.nozzle", nkeys, err));
    TRY(check_source(n, "sprinkler.nozzle", err));
    dragarc_nozzle *nz = &sp->nozzle;
    nz->liquid_density = 998.2;
    TRY(get_number(j, path, "liquid_density", 0, &nz->liquid_density, NULL, err));
    TRY(get_number(n, "sprinkler.nozzle", "diameter", 1, &nz->diameter, NULL, err));
    TRY(get_number(n, "sprinkler.nozzle", "pressure", 1, &nz->pressure, NULL, err));
    TRY(get_number(n, "sprinkler.nozzle", "velocity_coefficient", 1, &nz->velocity_coefficient, NULL, err));
    TRY(get_number(n, "sprinkler.nozzle", "discharge_coefficient", 1, &nz->discharge_coefficient, NULL, err));
    int rc = dragarc_nozzle_check(nz, err);
    if (rc != DRAGARC_OK) {
        dragarc_error_prefix(err, strcmp(err->field, "liquid_density") == 0 ? "sprinkler" : "sprinkler.nozzle");
        return rc;
    }
    double elev = 0.0, dirs = 72.0, phi = 0.0;
    dragarc_launch *l = &sp->base.launch;
    TRY(get_number(j, path, "height", 1, &l->height, NULL, err));
    TRY(get_number(j, path, "elevation", 1, &elev, NULL, err));
    if (!(elev >= -90.0 && elev <= 90.0))
        return dragarc_error_set(err, DRAGARC_EINVAL, "sprinkler.elevation", "must be between -90 and 90 degrees (got %g)",
                                 elev);
    l->elevation = elev * DRAGARC_DEG;
    l->speed = dragarc_nozzle_exit_speed(nz);
    sp->arc_from = 0.0, sp->arc_to = 2.0 * DRAGARC_PI;
    const cJSON *arc = cJSON_GetObjectItemCaseSensitive(j, "arc");
    if (arc) {
        if (!cJSON_IsArray(arc) || cJSON_GetArraySize(arc) != 2 || !cJSON_IsNumber(arc->child) ||
            !cJSON_IsNumber(arc->child->next))
            return dragarc_error_set(err, DRAGARC_EINVAL, "sprinkler.arc",
                                     "must be [from, to] in degrees clockwise from north, e.g. [0, 180]");
        double a = arc->child->valuedouble, b = arc->child->next->valuedouble;
        if (!(a >= -360.0 && a <= 360.0 && b > a && b - a <= 360.0))
            return dragarc_error_set(err, DRAGARC_EINVAL, "sprinkler.arc",
                                     "must turn clockwise through more than 0 and at most 360 degrees (got [%g, %g])",
                                     a, b);
        sp->arc_from = a * DRAGARC_DEG, sp->arc_to = b * DRAGARC_DEG;
    }
    TRY(get_number(j, path, "directions", 0, &dirs, NULL, err));
    if (!(dirs >= 1.0 && dirs <= 3600.0 && dirs == floor(dirs)))
        return dragarc_error_set(err, DRAGARC_EINVAL, "sprinkler.directions",
                                 "must be a whole number from 1 to 3600 (got %g)", dirs);
    sp->ndirections = (size_t)dirs;
    sp->ring_width = 0.25, sp->cell = 0.5;
    TRY(get_number(j, path, "ring_width", 0, &sp->ring_width, NULL, err));
    TRY(get_number(j, path, "cell", 0, &sp->cell, NULL, err));
    if (!(sp->ring_width >= 0.01 && sp->ring_width <= 100.0))
        return dragarc_error_set(err, DRAGARC_EINVAL, "sprinkler.ring_width", "must be 0.01 to 100 m (got %g)",
                                 sp->ring_width);
    if (!(sp->cell >= 0.01 && sp->cell <= 100.0))
        return dragarc_error_set(err, DRAGARC_EINVAL, "sprinkler.cell", "must be 0.01 to 100 m (got %g)", sp->cell);
    TRY(get_number(j, path, "nonvolatile_fraction", 0, &phi, NULL, err));
    const cJSON *spec = cJSON_GetObjectItemCaseSensitive(j, "spectrum");
    if (!spec)
        return dragarc_error_set(err, DRAGARC_EINVAL, "sprinkler.spectrum", "is required");
    TRY(read_spectrum(spec, "sprinkler.spectrum", &sp->spectrum, &sp->nclasses, &sp->spacing, err));
    water_drop(&sp->base.projectile, nz->liquid_density, phi);
    const cJSON *lay = cJSON_GetObjectItemCaseSensitive(j, "layout");
    if (lay)
        TRY(read_layout(lay, sp, err));
    return DRAGARC_OK;
}

/* environment, ground and solver of a sprinkler or drift scenario, then the whole scenario checked; a launch error
 * is the `owner` object's (its nozzle makes the launch). */
static int read_drop_rest(const cJSON *root, const char *owner, dragarc_scenario *s, dragarc_error *err)
{
    const cJSON *e = cJSON_GetObjectItemCaseSensitive(root, "environment");
    if (e)
        TRY(read_environment(e, s, err));
    const cJSON *g = cJSON_GetObjectItemCaseSensitive(root, "ground");
    if (g)
        TRY(read_ground(g, s, err));
    const cJSON *so = cJSON_GetObjectItemCaseSensitive(root, "solver");
    if (so)
        TRY(read_solver(so, &s->solver, err));
    /* evaporation needs the air's humidity: on with the local atmosphere, off otherwise */
    s->projectile.evaporation.enabled = s->atmosphere.model == DRAGARC_ATMOSPHERE_LOCAL;
    if (s->ground_surface_given)
        return dragarc_error_set(err, DRAGARC_EINVAL, "ground.surface", "drops do not bounce: leave it out");
    dragarc_error ce;
    int rc = dragarc_scenario_check(s, &ce);
    if (rc != DRAGARC_OK)
        return dragarc_error_set(err, rc, strncmp(ce.field, "launch.", 7) == 0 ? owner : ce.field, "%s", ce.message);
    return rc;
}

/* Parse json into *root (the caller deletes it, also after failure), with its values' units converted, its keys
 * checked against `keys`, and its name copied into base. */
static int open_root(const char *json, const char *const *keys, dragarc_scenario *base, cJSON **root,
                     dragarc_error *err)
{
    TRY(parse_text(json, "the scenario", root, err));
    const char *name = NULL, *desc = NULL;
    TRY(with_units(*root, "", err));
    if (!cJSON_IsObject(*root))
        return dragarc_error_set(err, DRAGARC_EINVAL, "", "a scenario must be a JSON object, not %s", type_name(*root));
    TRY(check_keys(*root, "", keys, err));
    TRY(get_string(*root, "", "name", 0, &name, err));
    TRY(get_string(*root, "", "description", 0, &desc, err));
    if (name)
        snprintf(base->name, sizeof base->name, "%s", name);
    return DRAGARC_OK;
}

/* A sprinkler or drift scenario: {"name", "description", KEY, "environment", "ground", "solver"}; the KEY object is
 * read by read_key into spec, then the rest into base (the launch is owner's). */
static int parse_drop_scenario(const char *json, const char *key, const char *owner, dragarc_scenario *base, void *spec,
                               int (*read_key)(const cJSON *, void *, dragarc_error *), dragarc_error *err)
{
    const char *const keys[] = {"name", "description", key, "environment", "ground", "solver", NULL};
    cJSON *root = NULL;
    const cJSON *j = NULL;
    int rc = open_root(json, keys, base, &root, err);
    if (rc != DRAGARC_OK)
        goto done;
    if (!(j = cJSON_GetObjectItemCaseSensitive(root, key))) {
        rc = dragarc_error_set(err, DRAGARC_EINVAL, key, "is required");
        goto done;
    }
    if ((rc = read_key(j, spec, err)) == DRAGARC_OK)
        rc = read_drop_rest(root, owner, base, err);
done:
    cJSON_Delete(root);
    return rc;
}

static int read_sprinkler_key(const cJSON *j, void *spec, dragarc_error *err)
{
    return read_sprinkler(j, spec, err);
}

int dragarc_sprinkler_spec_parse(const char *json, dragarc_sprinkler_spec *out, dragarc_error *err)
{
    memset(out, 0, sizeof *out);
    dragarc_scenario_default(&out->base);
    int rc = parse_drop_scenario(json, "sprinkler", "sprinkler", &out->base, out, read_sprinkler_key, err);
    if (rc != DRAGARC_OK)
        dragarc_sprinkler_spec_clear(out);
    return rc;
}

/* Read the file at path (at most 16 MiB) and parse it into out with parse. */
static int read_with(const char *path, void *out, size_t size, int (*parse)(const char *, void *, dragarc_error *),
                     dragarc_error *err)
{
    memset(out, 0, size);
    char *text = NULL;
    int rc = dragarc_text_file_read(path, 16u << 20, &text, err);
    if (rc != DRAGARC_OK)
        return rc;
    rc = parse(text, out, err);
    free(text);
    return rc;
}

static int parse_sprinkler(const char *text, void *out, dragarc_error *err)
{
    return dragarc_sprinkler_spec_parse(text, out, err);
}

int dragarc_sprinkler_spec_read(const char *path, dragarc_sprinkler_spec *out, dragarc_error *err)
{
    return read_with(path, out, sizeof *out, parse_sprinkler, err);
}

/* ---- drift scenarios --------------------------------------------------------------------------------------- */

static int read_drift(const cJSON *j, dragarc_drift_spec *sp, dragarc_error *err)
{
    static const char *const keys[] = {"release", "travel", "spectrum", "liquid_density", "nonvolatile_fraction",
                                       "bin_width", "buffer", NULL};
    static const char *const rkeys[] = {"height", "pressure", "velocity_coefficient", "elevation", "azimuth", NULL};
    static const char *const tkeys[] = {"speed", "direction", NULL};
    TRY(want_object(j, "drift", err));
    TRY(check_keys(j, "drift", keys, err));
    const cJSON *r = cJSON_GetObjectItemCaseSensitive(j, "release");
    if (!r)
        return dragarc_error_set(err, DRAGARC_EINVAL, "drift.release", "is required");
    TRY(want_object(r, "drift.release", err));
    TRY(check_keys(r, "drift.release", rkeys, err));
    double rho = 998.2, p = 0.0, cv = 0.0, elev = -90.0, az = 0.0, phi = 0.0;
    dragarc_launch *l = &sp->base.launch;
    TRY(get_number(j, "drift", "liquid_density", 0, &rho, NULL, err));
    if (!(rho > 0.0 && rho <= 2e4))
        return dragarc_error_set(err, DRAGARC_EINVAL, "drift.liquid_density", "must be above 0 and at most 20000 "
                                 "kg/m^3 (got %g)", rho);
    TRY(get_number(r, "drift.release", "height", 1, &l->height, NULL, err));
    TRY(get_number(r, "drift.release", "pressure", 1, &p, NULL, err));
    TRY(get_number(r, "drift.release", "velocity_coefficient", 1, &cv, NULL, err));
    TRY(get_number(r, "drift.release", "elevation", 0, &elev, NULL, err));
    TRY(get_number(r, "drift.release", "azimuth", 0, &az, NULL, err));
    if (!(p > 0.0 && p <= 2e7))
        return dragarc_error_set(err, DRAGARC_EINVAL, "drift.release.pressure", "must be above 0 and at most 200 bar "
                                 "(got %g Pa)", p);
    if (!(cv > 0.0 && cv <= 1.0))
        return dragarc_error_set(err, DRAGARC_EINVAL, "drift.release.velocity_coefficient",
                                 "must be above 0 and at most 1 (got %g)", cv);
    if (!(elev >= -90.0 && elev <= 90.0))
        return dragarc_error_set(err, DRAGARC_EINVAL, "drift.release.elevation",
                                 "must be between -90 and 90 degrees (got %g)", elev);
    l->speed = cv * sqrt(2.0 * p / rho); /* Bernoulli's jet speed */
    l->elevation = elev * DRAGARC_DEG;
    l->azimuth = az * DRAGARC_DEG;
    const cJSON *t = cJSON_GetObjectItemCaseSensitive(j, "travel");
    if (t) {
        double v = 0.0, dir = 0.0;
        TRY(want_object(t, "drift.travel", err));
        TRY(check_keys(t, "drift.travel", tkeys, err));
        TRY(get_number(t, "drift.travel", "speed", 1, &v, NULL, err));
        TRY(get_number(t, "drift.travel", "direction", 0, &dir, NULL, err));
        if (!(v >= 0.0 && v <= 100.0))
            return dragarc_error_set(err, DRAGARC_EINVAL, "drift.travel.speed", "must be 0 to 100 m/s (got %g)", v);
        sp->travel[0] = v * sin(dir * DRAGARC_DEG), sp->travel[1] = v * cos(dir * DRAGARC_DEG);
    }
    sp->bin_width = 0.5, sp->buffer = 5.0;
    TRY(get_number(j, "drift", "bin_width", 0, &sp->bin_width, NULL, err));
    TRY(get_number(j, "drift", "buffer", 0, &sp->buffer, NULL, err));
    if (!(sp->bin_width >= 0.01 && sp->bin_width <= 100.0))
        return dragarc_error_set(err, DRAGARC_EINVAL, "drift.bin_width", "must be 0.01 to 100 m (got %g)",
                                 sp->bin_width);
    if (!(sp->buffer >= 0.0 && sp->buffer <= 1e5))
        return dragarc_error_set(err, DRAGARC_EINVAL, "drift.buffer", "must be 0 to 100000 m (got %g)", sp->buffer);
    TRY(get_number(j, "drift", "nonvolatile_fraction", 0, &phi, NULL, err));
    const cJSON *spec = cJSON_GetObjectItemCaseSensitive(j, "spectrum");
    if (!spec)
        return dragarc_error_set(err, DRAGARC_EINVAL, "drift.spectrum", "is required");
    TRY(read_spectrum(spec, "drift.spectrum", &sp->spectrum, &sp->nclasses, &sp->spacing, err));
    water_drop(&sp->base.projectile, rho, phi);
    return DRAGARC_OK;
}

static int read_drift_key(const cJSON *j, void *spec, dragarc_error *err)
{
    return read_drift(j, spec, err);
}

int dragarc_drift_spec_parse(const char *json, dragarc_drift_spec *out, dragarc_error *err)
{
    memset(out, 0, sizeof *out);
    dragarc_scenario_default(&out->base);
    out->base.solver.max_time = 600.0; /* a drop still aloft after 10 minutes is counted as drift, not flown on */
    int rc = parse_drop_scenario(json, "drift", "drift.release", &out->base, out, read_drift_key, err);
    if (rc != DRAGARC_OK)
        dragarc_drift_spec_clear(out);
    return rc;
}

static int parse_drift(const char *text, void *out, dragarc_error *err)
{
    return dragarc_drift_spec_parse(text, out, err);
}

int dragarc_drift_spec_read(const char *path, dragarc_drift_spec *out, dragarc_error *err)
{
    return read_with(path, out, sizeof *out, parse_drift, err);
}


/* ---- footprint scenarios ----------------------------------------------------------------------------------- */

/* A list of n numbers at j (field names it) into out. */
static int read_vector(const cJSON *j, const char *field, int n, double *out, dragarc_error *err)
{
    if (!cJSON_IsArray(j) || cJSON_GetArraySize(j) != n)
        return dragarc_error_set(err, DRAGARC_EINVAL, field, "must be an array of %d numbers", n);
    int i = 0;
    for (const cJSON *c = j->child; c; c = c->next, i++) {
        if (!cJSON_IsNumber(c) || !isfinite(c->valuedouble))
            return dragarc_error_set(err, DRAGARC_EINVAL, field, "item %d must be a finite number, not %s", i + 1,
                                     type_name(c));
        out[i] = c->valuedouble;
    }
    return DRAGARC_OK;
}

static int read_breakup(const cJSON *j, dragarc_breakup *b, dragarc_error *err)
{
    static const char *const keys[] = {"latitude", "longitude", "altitude", "speed", "flight_path_angle", "heading",
                                       "velocity", "spread", "covariance", NULL};
    static const char *const skeys[] = {"position", "speed", "flight_path_angle", "heading", NULL};
    const char *p = "breakup";
    TRY(want_object(j, p, err));
    TRY(check_keys(j, p, keys, err));
    TRY(get_number(j, p, "latitude", 1, &b->latitude, NULL, err));
    TRY(get_number(j, p, "longitude", 1, &b->longitude, NULL, err));
    TRY(get_number(j, p, "altitude", 1, &b->altitude, NULL, err));
    const cJSON *v = cJSON_GetObjectItemCaseSensitive(j, "velocity");
    int has_speed = cJSON_GetObjectItemCaseSensitive(j, "speed") != NULL;
    if (v && (has_speed || cJSON_GetObjectItemCaseSensitive(j, "flight_path_angle") ||
              cJSON_GetObjectItemCaseSensitive(j, "heading")))
        return dragarc_error_set(err, DRAGARC_EINVAL, "breakup.velocity",
                                 "give either the velocity vector or speed, flight_path_angle and heading, not both");
    if (v) {
        TRY(read_vector(v, "breakup.velocity", 3, b->velocity, err));
    } else {
        double speed = 0.0, gam = 0.0, psi = 0.0;
        TRY(get_number(j, p, "speed", 1, &speed, NULL, err));
        TRY(get_number(j, p, "flight_path_angle", 0, &gam, NULL, err));
        TRY(get_number(j, p, "heading", 0, &psi, NULL, err));
        if (!(speed >= 0.0 && speed <= 2e4))
            return dragarc_error_set(err, DRAGARC_EINVAL, "breakup.speed", "must be 0 to 20000 m/s (got %g)", speed);
        if (!(gam >= -90.0 && gam <= 90.0))
            return dragarc_error_set(err, DRAGARC_EINVAL, "breakup.flight_path_angle",
                                     "must be between -90 and 90 degrees (got %g)", gam);
        if (!(psi >= -360.0 && psi <= 360.0))
            return dragarc_error_set(err, DRAGARC_EINVAL, "breakup.heading",
                                     "must be between -360 and 360 degrees (got %g)", psi);
        gam *= DRAGARC_DEG, psi *= DRAGARC_DEG;
        b->velocity[0] = speed * cos(gam) * sin(psi);
        b->velocity[1] = speed * cos(gam) * cos(psi);
        b->velocity[2] = speed * sin(gam);
    }
    const cJSON *s = cJSON_GetObjectItemCaseSensitive(j, "spread");
    const cJSON *c = cJSON_GetObjectItemCaseSensitive(j, "covariance");
    if (s && c)
        return dragarc_error_set(err, DRAGARC_EINVAL, "breakup.covariance", "give either spread or covariance, not both");
    if (s) {
        TRY(want_object(s, "breakup.spread", err));
        TRY(check_keys(s, "breakup.spread", skeys, err));
        const cJSON *pos = cJSON_GetObjectItemCaseSensitive(s, "position");
        if (pos)
            TRY(read_vector(pos, "breakup.spread.position", 3, b->sd_position, err));
        TRY(get_number(s, "breakup.spread", "speed", 0, &b->sd_speed, NULL, err));
        TRY(get_number(s, "breakup.spread", "flight_path_angle", 0, &b->sd_path_angle, NULL, err));
        TRY(get_number(s, "breakup.spread", "heading", 0, &b->sd_heading, NULL, err));
        b->sd_path_angle *= DRAGARC_DEG, b->sd_heading *= DRAGARC_DEG;
    }
    if (c) {
        if (!cJSON_IsArray(c) || cJSON_GetArraySize(c) != 6)
            return dragarc_error_set(err, DRAGARC_EINVAL, "breakup.covariance",
                                     "must be 6 rows of 6 numbers (east, north, up in m; their velocities in m/s)");
        int i = 0;
        for (const cJSON *row = c->child; row; row = row->next, i++) {
            char f[PATH_MAX_LEN];
            snprintf(f, sizeof f, "breakup.covariance[%d]", i);
            TRY(read_vector(row, f, 6, b->covariance + 6 * i, err));
        }
        b->covariance_given = 1;
    }
    return DRAGARC_OK;
}

static int read_fragment(const cJSON *j, const char *p, dragarc_fragment_class *c, dragarc_error *err)
{
    static const char *const keys[] = {"name", "count", "mass", "area", "ballistic_coefficient", "drag",
                                       "beta_spread", "delta_v", "source", NULL};
    static const char *const dkeys[] = {"distribution", "speed", "cone", "axis", NULL};
    TRY(want_object(j, p, err));
    TRY(check_keys(j, p, keys, err));
    TRY(check_source(j, p, err));
    const char *name = NULL;
    TRY(get_string(j, p, "name", 0, &name, err));
    if (name)
        snprintf(c->name, sizeof c->name, "%s", name);
    c->count = 1.0;
    TRY(get_number(j, p, "count", 0, &c->count, NULL, err));
    TRY(get_number(j, p, "mass", 1, &c->mass, NULL, err));
    char f[PATH_MAX_LEN];
    const cJSON *d = cJSON_GetObjectItemCaseSensitive(j, "drag");
    join(f, sizeof f, p, "drag");
    if (!d)
        return dragarc_error_set(err, DRAGARC_EINVAL, f, "is required (e.g. {\"model\": \"constant\", \"cd\": 1.0}, or a "
                                 "table against Mach number)");
    TRY(read_drag(d, f, &c->drag, err));
    int has_area = 0, has_beta = 0;
    double beta = 0.0;
    TRY(get_number(j, p, "area", 0, &c->area, &has_area, err));
    TRY(get_number(j, p, "ballistic_coefficient", 0, &beta, &has_beta, err));
    join(f, sizeof f, p, "area");
    if (has_area == has_beta)
        return dragarc_error_set(err, DRAGARC_EINVAL, f, "give either area or ballistic_coefficient (one of them)");
    if (has_beta) {
        join(f, sizeof f, p, "ballistic_coefficient");
        double cd = dragarc_fragment_nominal_cd(&c->drag);
        if (!(beta > 0.0 && beta <= 1e6))
            return dragarc_error_set(err, DRAGARC_EINVAL, f, "must be above 0 and at most 1e6 kg/m^2 (got %g)", beta);
        if (!(cd > 0.0 && isfinite(cd)))
            return dragarc_error_set(err, DRAGARC_EINVAL, f, "needs a drag law with a positive C_D at Mach 0.5");
        c->area = c->mass / (cd * beta);
    }
    TRY(get_number(j, p, "beta_spread", 0, &c->beta_sd, NULL, err));
    c->cone_half_angle = DRAGARC_PI;
    const cJSON *dv = cJSON_GetObjectItemCaseSensitive(j, "delta_v");
    if (dv) {
        join(f, sizeof f, p, "delta_v");
        TRY(want_object(dv, f, err));
        TRY(check_keys(dv, f, dkeys, err));
        const char *dist = NULL;
        TRY(get_string(dv, f, "distribution", 1, &dist, err));
        if (!dist[0] || dragarc_dv_distribution_from_name(dist, &c->dv) != DRAGARC_OK) {
            char ff[PATH_MAX_LEN];
            join(ff, sizeof ff, f, "distribution");
            return dragarc_error_set(err, DRAGARC_EINVAL, ff,
                                     "unknown distribution \"%s\" (none, fixed, uniform, maxwellian)", dist);
        }
        TRY(get_number(dv, f, "speed", c->dv != DRAGARC_DV_NONE, &c->dv_speed, NULL, err));
        double cone = 180.0;
        TRY(get_number(dv, f, "cone", 0, &cone, NULL, err));
        c->cone_half_angle = cone * DRAGARC_DEG;
        const cJSON *ax = cJSON_GetObjectItemCaseSensitive(dv, "axis");
        if (ax) {
            char ff[PATH_MAX_LEN];
            join(ff, sizeof ff, f, "axis");
            TRY(read_vector(ax, ff, 3, c->cone_axis, err));
            double n = sqrt(c->cone_axis[0] * c->cone_axis[0] + c->cone_axis[1] * c->cone_axis[1] +
                            c->cone_axis[2] * c->cone_axis[2]);
            if (!(n > 0.0))
                return dragarc_error_set(err, DRAGARC_EINVAL, ff, "must not be the zero vector");
            for (int i = 0; i < 3; i++)
                c->cone_axis[i] /= n;
            c->cone_axis_given = 1;
        }
    }
    return DRAGARC_OK;
}

static int read_fragment_array(const cJSON *fr, dragarc_footprint_spec *sp, dragarc_error *err)
{
    int n = cJSON_GetArraySize(fr);
    if (n > DRAGARC_FOOTPRINT_MAX_CLASSES)
        return dragarc_error_set(err, DRAGARC_EINVAL, "fragments", "holds %d classes: at most %d", n,
                                 DRAGARC_FOOTPRINT_MAX_CLASSES);
    sp->classes = calloc((size_t)n, sizeof *sp->classes);
    if (!sp->classes)
        return dragarc_error_set(err, DRAGARC_ENOMEM, "fragments", "out of memory");
    sp->nclasses = (size_t)n;
    int i = 0;
    for (const cJSON *c = fr->child; c; c = c->next, i++) {
        char f[PATH_MAX_LEN];
        snprintf(f, sizeof f, "fragments[%d]", i);
        TRY(read_fragment(c, f, &sp->classes[i], err));
    }
    return DRAGARC_OK;
}

/* `path` resolved against the scenario's folder into out (n bytes); field names it in the error. */
static int resolve(const char *base_dir, const char *path, char *out, size_t n, const char *field, dragarc_error *err)
{
    int k = path[0] == '/' || !base_dir || !base_dir[0] ? snprintf(out, n, "%s", path)
                                                        : snprintf(out, n, "%s/%s", base_dir, path);
    if (k < 0 || (size_t)k >= n)
        return dragarc_error_set(err, DRAGARC_EINVAL, field, "path too long");
    return DRAGARC_OK;
}

/* The scenario's drag_laws (named drag objects) and a CSV fragment catalogue at `file` read with them. */
static int read_catalogue(const cJSON *root, const char *file, const char *base_dir, dragarc_footprint_spec *sp,
                          dragarc_error *err)
{
    const cJSON *dl = cJSON_GetObjectItemCaseSensitive(root, "drag_laws");
    int nl = dl ? cJSON_GetArraySize(dl) : 0;
    if (dl && (!cJSON_IsObject(dl) || nl > 1000))
        return dragarc_error_set(err, DRAGARC_EINVAL, "drag_laws", "must be an object of at most 1000 named drag laws");
    dragarc_named_drag *laws = calloc((size_t)nl + 1, sizeof *laws);
    char path[4096], *text = NULL;
    int rc = laws ? DRAGARC_OK : dragarc_error_set(err, DRAGARC_ENOMEM, "drag_laws", "out of memory");
    int done = 0;
    for (const cJSON *c = dl ? dl->child : NULL; c && rc == DRAGARC_OK; c = c->next, done++) {
        char f[PATH_MAX_LEN];
        join(f, sizeof f, "drag_laws", c->string);
        snprintf(laws[done].name, sizeof laws[done].name, "%s", c->string);
        rc = read_drag(c, f, &laws[done].drag, err);
    }
    if (rc == DRAGARC_OK)
        rc = resolve(base_dir, file, path, sizeof path, "fragments", err);
    if (rc == DRAGARC_OK)
        rc = dragarc_text_file_read(path, 64u << 20, &text, err);
    if (rc == DRAGARC_OK)
        rc = dragarc_fragment_catalogue_parse(text, laws, (size_t)nl, &sp->classes, &sp->nclasses, err);
    if (rc != DRAGARC_OK && err && strncmp(err->field, path, strlen(path)) != 0) {
        char field[sizeof err->field];
        snprintf(field, sizeof field, "%s%s%s", path, err->field[0] ? ": " : "", err->field);
        memcpy(err->field, field, sizeof field);
    }
    for (int i = 0; i < done && laws; i++)
        dragarc_drag_clear(&laws[i].drag);
    free(laws);
    free(text);
    return rc;
}

static int read_footprint(const cJSON *root, dragarc_footprint_spec *sp, const char *base_dir, dragarc_error *err)
{
    TRY(read_breakup(cJSON_GetObjectItemCaseSensitive(root, "breakup"), &sp->breakup, err));
    const cJSON *fr = cJSON_GetObjectItemCaseSensitive(root, "fragments");
    if (cJSON_IsString(fr) && fr->valuestring)
        TRY(read_catalogue(root, fr->valuestring, base_dir, sp, err));
    else if (cJSON_GetObjectItemCaseSensitive(root, "drag_laws"))
        return dragarc_error_set(err, DRAGARC_EINVAL, "drag_laws", "is for a CSV catalogue: give fragments as a file");
    else if (cJSON_IsArray(fr) && cJSON_GetArraySize(fr) >= 1)
        TRY(read_fragment_array(fr, sp, err));
    else
        return dragarc_error_set(err, DRAGARC_EINVAL, "fragments", "must be a non-empty array of fragment classes, "
                                 "or the name of a CSV catalogue");
    const cJSON *u = cJSON_GetObjectItemCaseSensitive(root, "uncertainty");
    if (u) {
        static const char *const ukeys[] = {"wind", NULL};
        static const char *const wkeys[] = {"speed", "direction", "profiles", NULL};
        TRY(want_object(u, "uncertainty", err));
        TRY(check_keys(u, "uncertainty", ukeys, err));
        const cJSON *w = cJSON_GetObjectItemCaseSensitive(u, "wind");
        if (w) {
            TRY(want_object(w, "uncertainty.wind", err));
            TRY(check_keys(w, "uncertainty.wind", wkeys, err));
            TRY(get_number(w, "uncertainty.wind", "speed", 0, &sp->wind_spread.speed_sd, NULL, err));
            TRY(get_number(w, "uncertainty.wind", "direction", 0, &sp->wind_spread.direction_sd, NULL, err));
            sp->wind_spread.direction_sd *= DRAGARC_DEG;
            const cJSON *pr = cJSON_GetObjectItemCaseSensitive(w, "profiles");
            if (pr) {
                int np = cJSON_IsArray(pr) ? cJSON_GetArraySize(pr) : -1;
                if (np < 1 || np > 100000)
                    return dragarc_error_set(err, DRAGARC_EINVAL, "uncertainty.wind.profiles",
                                             "must be an array of 1 to 100000 wind objects");
                sp->wind_spread.profiles = calloc((size_t)np, sizeof *sp->wind_spread.profiles);
                if (!sp->wind_spread.profiles)
                    return dragarc_error_set(err, DRAGARC_ENOMEM, "uncertainty.wind.profiles", "out of memory");
                sp->wind_spread.nprofiles = (size_t)np;
                int k = 0;
                for (const cJSON *c = pr->child; c; c = c->next, k++) {
                    char f[PATH_MAX_LEN];
                    snprintf(f, sizeof f, "uncertainty.wind.profiles[%d]", k);
                    TRY(read_wind_at(c, f, &sp->wind_spread.profiles[k], err));
                }
            }
        }
    }
    sp->samples = 1000, sp->seed = 1;
    const cJSON *fp = cJSON_GetObjectItemCaseSensitive(root, "footprint");
    if (fp) {
        static const char *const fkeys[] = {"samples", "seed", "cell", NULL};
        double ns = 1000.0, seed = 1.0;
        TRY(want_object(fp, "footprint", err));
        TRY(check_keys(fp, "footprint", fkeys, err));
        TRY(get_number(fp, "footprint", "samples", 0, &ns, NULL, err));
        TRY(get_number(fp, "footprint", "seed", 0, &seed, NULL, err));
        TRY(get_number(fp, "footprint", "cell", 0, &sp->cell, NULL, err));
        if (!(ns >= 1.0 && ns <= DRAGARC_FOOTPRINT_MAX_SAMPLES && ns == floor(ns)))
            return dragarc_error_set(err, DRAGARC_EINVAL, "footprint.samples", "must be a whole number from 1 to %d "
                                     "(got %.15g)", DRAGARC_FOOTPRINT_MAX_SAMPLES, ns);
        if (!(seed >= 0.0 && seed <= 9007199254740992.0 && seed == floor(seed)))
            return dragarc_error_set(err, DRAGARC_EINVAL, "footprint.seed", "must be a whole number from 0 to 2^53 "
                                     "(got %.15g)", seed);
        if (!(sp->cell >= 0.0 && sp->cell <= 1e5))
            return dragarc_error_set(err, DRAGARC_EINVAL, "footprint.cell", "must be 0 (automatic) to 100 km (got %g m)",
                                     sp->cell);
        sp->samples = (size_t)ns, sp->seed = (uint64_t)seed;
    }
    dragarc_hazard_options *h = &sp->hazard;
    h->energy_threshold = DRAGARC_HAZARD_ENERGY_DEFAULT;
    const cJSON *hz = cJSON_GetObjectItemCaseSensitive(root, "hazard");
    if (hz) {
        static const char *const hkeys[] = {"energy_threshold", "population", "sheltered_share", "shelter_protection",
                                            "criterion", NULL};
        static const char *const pkeys[] = {"density", "file", "background", NULL};
        TRY(want_object(hz, "hazard", err));
        TRY(check_keys(hz, "hazard", hkeys, err));
        TRY(get_number(hz, "hazard", "energy_threshold", 0, &h->energy_threshold, NULL, err));
        TRY(get_number(hz, "hazard", "sheltered_share", 0, &h->sheltered_share, NULL, err));
        TRY(get_number(hz, "hazard", "shelter_protection", 0, &h->shelter_protection, NULL, err));
        TRY(get_number(hz, "hazard", "criterion", 0, &h->criterion, NULL, err));
        if (!(h->energy_threshold >= 0.0 && h->energy_threshold <= 1e12))
            return dragarc_error_set(err, DRAGARC_EINVAL, "hazard.energy_threshold", "must be 0 to 1e12 J (got %g)",
                                     h->energy_threshold);
        if (!(h->sheltered_share >= 0.0 && h->sheltered_share <= 1.0))
            return dragarc_error_set(err, DRAGARC_EINVAL, "hazard.sheltered_share", "must be 0 to 1 (got %g)",
                                     h->sheltered_share);
        if (!(h->shelter_protection >= 0.0 && h->shelter_protection <= 1.0))
            return dragarc_error_set(err, DRAGARC_EINVAL, "hazard.shelter_protection", "must be 0 to 1 (got %g)",
                                     h->shelter_protection);
        if (!(h->criterion >= 0.0 && h->criterion <= 1.0))
            return dragarc_error_set(err, DRAGARC_EINVAL, "hazard.criterion",
                                     "must be 0 (none) to 1 expected casualties (got %g)", h->criterion);
        const cJSON *pop = cJSON_GetObjectItemCaseSensitive(hz, "population");
        if (pop) {
            TRY(want_object(pop, "hazard.population", err));
            TRY(check_keys(pop, "hazard.population", pkeys, err));
            const char *file = NULL;
            int has_density = 0;
            TRY(get_number(pop, "hazard.population", "density", 0, &h->density, &has_density, err));
            TRY(get_string(pop, "hazard.population", "file", 0, &file, err));
            TRY(get_number(pop, "hazard.population", "background", 0, &h->background, NULL, err));
            if (has_density == (file != NULL))
                return dragarc_error_set(err, DRAGARC_EINVAL, "hazard.population",
                                         "give either a uniform density or a file, one of them");
            if (has_density && !(h->density >= 0.0 && h->density <= 1e6))
                return dragarc_error_set(err, DRAGARC_EINVAL, "hazard.population.density",
                                         "must be 0 to 1e6 people per km^2 (got %g)", h->density);
            if (!(h->background >= 0.0 && h->background <= 1e6))
                return dragarc_error_set(err, DRAGARC_EINVAL, "hazard.population.background",
                                         "must be 0 to 1e6 people per km^2 (got %g)", h->background);
            if (file)
                TRY(resolve(base_dir, file, h->population_file, sizeof h->population_file, "hazard.population.file",
                            err));
            h->population_given = 1;
        }
    }
    return DRAGARC_OK;
}

static int parse_footprint(const char *json, const char *base_dir, dragarc_footprint_spec *out, dragarc_error *err)
{
    static const char *const keys[] = {"name", "description", "breakup", "fragments", "drag_laws", "uncertainty",
                                       "footprint", "hazard", "environment", "ground", "solver", NULL};
    memset(out, 0, sizeof *out);
    dragarc_scenario_default(&out->base);
    cJSON *root = NULL;
    int rc = open_root(json, keys, &out->base, &root, err);
    if (rc != DRAGARC_OK)
        goto done;
    if (!cJSON_GetObjectItemCaseSensitive(root, "breakup")) {
        rc = dragarc_error_set(err, DRAGARC_EINVAL, "breakup", "is required");
        goto done;
    }
    /* a placeholder body and launch, replaced by each sample's, so that the shared rest checks */
    out->base.projectile.mass = 1.0, out->base.projectile.diameter = 0.1;
    out->base.projectile.area = 0.25 * DRAGARC_PI * 0.01;
    out->base.atmosphere.model = DRAGARC_ATMOSPHERE_ISA;
    out->base.solver.max_time = 36000.0;
    if ((rc = read_footprint(root, out, base_dir, err)) != DRAGARC_OK)
        goto done;
    out->base.launch.height = out->breakup.altitude;
    /* a spherical Earth turns about the breakup's latitude: it is taken from there, not given twice */
    cJSON *env = cJSON_GetObjectItemCaseSensitive(root, "environment");
    cJSON *earth = cJSON_IsObject(env) ? cJSON_GetObjectItemCaseSensitive(env, "earth") : NULL;
    if (cJSON_IsObject(earth)) {
        if (cJSON_GetObjectItemCaseSensitive(earth, "latitude")) {
            rc = dragarc_error_set(err, DRAGARC_EINVAL, "environment.earth.latitude",
                                   "is the breakup's in a footprint scenario: leave it out");
            goto done;
        }
        const cJSON *model = cJSON_GetObjectItemCaseSensitive(earth, "model");
        if (cJSON_IsString(model) && model->valuestring && strcmp(model->valuestring, "spherical") == 0 &&
            !cJSON_AddNumberToObject(earth, "latitude", out->breakup.latitude)) {
            rc = dragarc_error_set(err, DRAGARC_ENOMEM, "environment.earth", "out of memory");
            goto done;
        }
    }
    if ((rc = read_drop_rest(root, "breakup", &out->base, err)) != DRAGARC_OK) {
        /* the shared check words an altitude problem for a launch (which has no speed here): the breakup's own
         * rule names breakup.altitude */
        dragarc_error fe;
        if (err && strcmp(err->field, "breakup") == 0 && dragarc_footprint_check(out, &fe) != DRAGARC_OK)
            *err = fe, rc = fe.code;
        goto done;
    }
    out->base.projectile.evaporation.enabled = 0;
    rc = dragarc_footprint_check(out, err);
done:
    cJSON_Delete(root);
    if (rc != DRAGARC_OK)
        dragarc_footprint_spec_clear(out);
    return rc;
}

int dragarc_footprint_spec_parse(const char *json, dragarc_footprint_spec *out, dragarc_error *err)
{
    return parse_footprint(json, NULL, out, err);
}

/* RFC 7386 (JSON Merge Patch): each member of patch replaces target's member of that name, objects are merged member
 * by member, and null removes the member. Both are objects. -1 when out of memory. */
static int merge_patch(cJSON *target, const cJSON *patch)
{
    for (const cJSON *p = patch->child; p; p = p->next) {
        cJSON *t = cJSON_GetObjectItemCaseSensitive(target, p->string);
        if (cJSON_IsNull(p)) {
            cJSON_DeleteItemFromObjectCaseSensitive(target, p->string);
            continue;
        }
        if (cJSON_IsObject(p) && cJSON_IsObject(t)) {
            if (merge_patch(t, p) != 0)
                return -1;
            continue;
        }
        /* a new or replaced member: an object patched onto nothing, so that its nulls are dropped too */
        cJSON *v = cJSON_IsObject(p) ? cJSON_CreateObject() : cJSON_Duplicate(p, 1);
        if (!v || (cJSON_IsObject(p) && merge_patch(v, p) != 0)) {
            cJSON_Delete(v);
            return -1;
        }
        if (t ? !cJSON_ReplaceItemInObjectCaseSensitive(target, p->string, v)
              : !cJSON_AddItemToObject(target, p->string, v)) {
            cJSON_Delete(v);
            return -1;
        }
    }
    return 0;
}

int dragarc_footprint_spec_read_patched(const char *path, const char *patch, dragarc_footprint_spec *out,
                                        dragarc_error *err)
{
    if (!patch)
        return dragarc_footprint_spec_read(path, out, err);
    memset(out, 0, sizeof *out);
    char *text = NULL, *merged = NULL, dir[4096];
    cJSON *root = NULL, *p = NULL;
    int rc = dragarc_io_read_file_and_folder(path, &text, dir, sizeof dir, err);
    if (rc == DRAGARC_OK)
        rc = parse_text(text, "the scenario", &root, err);
    if (rc == DRAGARC_OK && (rc = parse_text(patch, "the changes", &p, err)) == DRAGARC_OK && !cJSON_IsObject(p))
        rc = dragarc_error_set(err, DRAGARC_EINVAL, "", "the changes to a scenario must be a JSON object");
    /* a root that is no object is left to the reader to refuse, in its own words */
    if (rc == DRAGARC_OK && cJSON_IsObject(root) && merge_patch(root, p) != 0)
        rc = dragarc_error_set(err, DRAGARC_ENOMEM, "", "out of memory applying the changes to the scenario");
    if (rc == DRAGARC_OK && !(merged = cJSON_PrintUnformatted(root)))
        rc = dragarc_error_set(err, DRAGARC_ENOMEM, "", "out of memory applying the changes to the scenario");
    if (rc == DRAGARC_OK)
        rc = parse_footprint(merged, dir, out, err); /* numbers print so that they read back exactly */
    cJSON_Delete(root);
    cJSON_Delete(p);
    free(text);
    free(merged);
    return rc;
}

int dragarc_footprint_spec_read(const char *path, dragarc_footprint_spec *out, dragarc_error *err)
{
    memset(out, 0, sizeof *out);
    char *text = NULL, dir[4096];
    int rc = dragarc_io_read_file_and_folder(path, &text, dir, sizeof dir, err);
    if (rc != DRAGARC_OK)
        return rc;
    rc = parse_footprint(text, dir, out, err);
    free(text);
    return rc;
}
