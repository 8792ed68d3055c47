/* sweep.c: tables of flights: scenario parameters set by name, value ranges, and the parallel loop
 * that flies one copy of the scenario per combination of values.
 * SPDX-License-Identifier: GPL-3.0-or-later
 *
 * Row r of a table with axes of n_0, n_1, ..., n_{k-1} values takes value i_j of axis j, where
 * r = ((i_0 n_1 + i_1) n_2 + i_2) ...: the first axis varies slowest, as in nested loops.
 * A new diameter d keeps the body geometrically similar (Buckingham 1914, Phys. Rev. 4:345, on
 * similar systems): area A = A0 (d/d0)^2, volume V = V0 (d/d0)^3, and a mass given as a density
 * becomes rho V. The rows are independent, so OpenMP spreads them over threads with dynamic
 * scheduling (flight times differ widely along an axis); each row flies a shallow copy of the base
 * scenario whose scalars it changes, and shares the read-only drag table (GSL interpolation with a
 * NULL accelerator: no state is written) and wind layers with the others.
 */
#include <float.h>
#include <math.h>
#include <stdio.h>
#include <stdlib.h>
#include <string.h>

#include "core/constants.h"
#include "dragarc/flight.h"
#include "dragarc/sweep.h"
#include "numerics/progress.h"

typedef enum param_id {
    P_SPEED,
    P_ELEVATION,
    P_AZIMUTH,
    P_HEIGHT,
    P_WIND_SPEED,
    P_WIND_FROM,
    P_MASS,
    P_DIAMETER,
    P_CD,
    P_SITE_ELEVATION,
    P_TEMPERATURE_OFFSET,
    P_GROUND_ELEVATION,
    P_GRAVITY,
    P_SPIN_RATE,
    P_SPIN_TILT,
    P_COUNT
} param_id;

/* In param_id order. */
static const dragarc_scenario_param PARAMS[P_COUNT] = {
    {"launch.speed", "speed", "m/s", DRAGARC_Q_SPEED},
    {"launch.elevation", "elevation", "degree", DRAGARC_Q_ANGLE},
    {"launch.azimuth", "azimuth", "degree", DRAGARC_Q_ANGLE},
    {"launch.height", "height", "m", DRAGARC_Q_LENGTH},
    {"environment.wind.speed", "wind_speed", "m/s", DRAGARC_Q_SPEED},
    {"environment.wind.from", "wind_from", "degree", DRAGARC_Q_ANGLE},
    {"projectile.mass", "mass", "kg", DRAGARC_Q_MASS},
    {"projectile.diameter", "diameter", "m", DRAGARC_Q_LENGTH},
    {"projectile.drag.cd", "cd", "", DRAGARC_Q_NUMBER},
    {"environment.atmosphere.site_elevation", "site_elevation", "m", DRAGARC_Q_LENGTH},
    {"environment.atmosphere.temperature_offset", "temperature_offset", "K", DRAGARC_Q_TEMPERATURE_DIFFERENCE},
    {"ground.elevation", "ground_elevation", "m", DRAGARC_Q_LENGTH},
    {"environment.gravity", "gravity", "m/s^2", DRAGARC_Q_ACCELERATION},
    {"launch.spin.rate", "spin_rate", "rpm", DRAGARC_Q_ANGULAR_SPEED},
    {"launch.spin.tilt", "spin_tilt", "degree", DRAGARC_Q_ANGLE},
};

const dragarc_scenario_param *dragarc_scenario_params(size_t *count)
{
    if (count)
        *count = P_COUNT;
    return PARAMS;
}

const dragarc_scenario_param *dragarc_scenario_param_find(const char *name)
{
    if (!name)
        return NULL;
    for (size_t i = 0; i < P_COUNT; i++)
        if (strcmp(name, PARAMS[i].path) == 0 || strcmp(name, PARAMS[i].alias) == 0)
            return &PARAMS[i];
    return NULL;
}

const char *dragarc_scenario_param_path(const char *name)
{
    const dragarc_scenario_param *p = dragarc_scenario_param_find(name);
    return p ? p->path : NULL;
}

static int unknown_name(const char *name, dragarc_error *err)
{
    char list[256] = "";
    for (size_t i = 0; i < P_COUNT; i++) {
        strncat(list, PARAMS[i].alias, sizeof list - strlen(list) - 1);
        if (i + 1 < P_COUNT)
            strncat(list, ", ", sizeof list - strlen(list) - 1);
    }
    return dragarc_error_set(err, DRAGARC_EINVAL, "",
                             "unknown parameter '%s'; accepted: %s, or their scenario key paths (launch.speed, ...)",
                             name ? name : "", list);
}

static param_id id_of(const dragarc_scenario_param *p) { return (param_id)(p - PARAMS); }

/* Whether p points into PARAMS (compared one by one: ordering unrelated pointers is undefined). */
static int known(const dragarc_scenario_param *p)
{
    for (size_t i = 0; i < P_COUNT; i++)
        if (p == &PARAMS[i])
            return 1;
    return 0;
}

static const char *atmosphere_model_name(dragarc_atmosphere_model m)
{
    switch (m) {
    case DRAGARC_ATMOSPHERE_ISA: return "isa";
    case DRAGARC_ATMOSPHERE_CONSTANT: return "constant";
    case DRAGARC_ATMOSPHERE_EXPONENTIAL: return "exponential";
    case DRAGARC_ATMOSPHERE_LOCAL: return "local";
    }
    return "unknown";
}

/* Whether scenario s has parameter id at all (its models decide). */
static int applicable(const dragarc_scenario *s, param_id id, dragarc_error *err)
{
    const char *path = PARAMS[id].path;
    switch (id) {
    case P_CD:
        if (s->projectile.drag.model != DRAGARC_DRAG_CONSTANT) {
            const char *m = dragarc_drag_model_name(s->projectile.drag.model);
            return dragarc_error_set(err, DRAGARC_EINVAL, path,
                                     "the drag model is '%s': only the 'constant' model has a single cd to set",
                                     m ? m : "unknown");
        }
        return DRAGARC_OK;
    case P_WIND_SPEED:
    case P_WIND_FROM:
        if (s->wind.model == DRAGARC_WIND_LAYERED)
            return dragarc_error_set(err, DRAGARC_EINVAL, path,
                                     "the wind is layered: its speed and direction are given layer by layer, so "
                                     "there is no single value to set (use a constant, power or log wind)");
        return DRAGARC_OK;
    case P_TEMPERATURE_OFFSET:
        if (s->atmosphere.model != DRAGARC_ATMOSPHERE_ISA)
            return dragarc_error_set(err, DRAGARC_EINVAL, path,
                                     "the atmosphere model is '%s': only the 'isa' model has a temperature offset",
                                     atmosphere_model_name(s->atmosphere.model));
        return DRAGARC_OK;
    case P_SITE_ELEVATION:
        if (s->atmosphere.model == DRAGARC_ATMOSPHERE_CONSTANT || s->atmosphere.model == DRAGARC_ATMOSPHERE_LOCAL)
            return dragarc_error_set(err, DRAGARC_EINVAL, path,
                                     "the atmosphere model is '%s': only the 'isa' and 'exponential' models "
                                     "have a site elevation",
                                     atmosphere_model_name(s->atmosphere.model));
        return DRAGARC_OK;
    case P_SPIN_TILT:
        if (s->launch.spin_axis_given)
            return dragarc_error_set(err, DRAGARC_EINVAL, path,
                                     "the spin is given as a vector (launch.spin.vector), which fixes its axis: there "
                                     "is no tilt to set (give launch.spin.rate and tilt instead)");
        return DRAGARC_OK;
    default: return DRAGARC_OK;
    }
}

static int lookup(const char *name, const dragarc_scenario *s, param_id *id, dragarc_error *err)
{
    const dragarc_scenario_param *p = dragarc_scenario_param_find(name);
    if (!p)
        return unknown_name(name, err);
    *id = id_of(p);
    return applicable(s, *id, err);
}

/* A wind of model none becomes a constant wind that blows with zero speed until its speed is set:
 * the same still air, now with a speed and a direction to change. */
static void wind_from_none(dragarc_wind *w)
{
    if (w->model == DRAGARC_WIND_NONE) {
        w->model = DRAGARC_WIND_CONSTANT;
        w->speed = 0.0;
    }
}

int dragarc_scenario_set(dragarc_scenario *s, const char *name, double value, dragarc_error *err)
{
    param_id id = P_COUNT;
    int rc = lookup(name, s, &id, err);
    if (rc != DRAGARC_OK)
        return rc;
    const char *path = PARAMS[id].path;
    if (!isfinite(value))
        return dragarc_error_set(err, DRAGARC_EINVAL, path, "must be a finite number (got %g)", value);
    if ((id == P_AZIMUTH || id == P_WIND_FROM || id == P_SPIN_TILT) && !(value >= -360.0 && value <= 360.0))
        return dragarc_error_set(err, DRAGARC_EINVAL, path, "must be between -360 and 360 degrees (got %g)", value);
    if (id == P_DIAMETER && !(value > 0.0))
        return dragarc_error_set(err, DRAGARC_EINVAL, path, "must be positive, in m (got %g)", value);
    dragarc_projectile *p = &s->projectile;
    switch (id) {
    case P_SPEED: s->launch.speed = value; break;
    case P_ELEVATION: s->launch.elevation = value * DRAGARC_DEG; break;
    case P_AZIMUTH: s->launch.azimuth = value * DRAGARC_DEG; break;
    case P_HEIGHT: s->launch.height = value; break;
    case P_WIND_SPEED:
        wind_from_none(&s->wind);
        s->wind.speed = value;
        break;
    case P_WIND_FROM:
        wind_from_none(&s->wind);
        s->wind.from = value * DRAGARC_DEG;
        break;
    case P_MASS:
        p->mass = value;
        p->density = 0.0; /* the mass is now given, not derived */
        break;
    case P_DIAMETER:
        if (p->diameter > 0.0 && isfinite(p->diameter)) {
            double r = value / p->diameter;
            p->area *= r * r;
            p->volume *= r * r * r;
        } else {
            p->area = 0.25 * DRAGARC_PI * value * value;
            p->volume = DRAGARC_PI * value * value * value / 6.0;
        }
        p->diameter = value;
        if (p->density > 0.0)
            p->mass = p->density * p->volume;
        break;
    case P_CD: p->drag.cd = value; break;
    case P_SITE_ELEVATION: s->atmosphere.site_elevation = value; break;
    case P_TEMPERATURE_OFFSET: s->atmosphere.temperature_offset = value; break;
    case P_GROUND_ELEVATION: s->ground_elevation = value; break;
    case P_GRAVITY: s->gravity = value; break;
    case P_SPIN_RATE: s->launch.spin_rate = value * 2.0 * DRAGARC_PI / 60.0; break; /* rpm, as the reader does */
    case P_SPIN_TILT: s->launch.spin_tilt = value * DRAGARC_DEG; break;
    case P_COUNT: break;
    }
    return DRAGARC_OK;
}

int dragarc_scenario_get(const dragarc_scenario *s, const char *name, double *value, dragarc_error *err)
{
    param_id id = P_COUNT;
    int rc = lookup(name, s, &id, err);
    if (rc != DRAGARC_OK)
        return rc;
    double v = NAN;
    switch (id) {
    case P_SPEED: v = s->launch.speed; break;
    case P_ELEVATION: v = s->launch.elevation / DRAGARC_DEG; break;
    case P_AZIMUTH: v = s->launch.azimuth / DRAGARC_DEG; break;
    case P_HEIGHT: v = s->launch.height; break;
    case P_WIND_SPEED: v = s->wind.model == DRAGARC_WIND_NONE ? 0.0 : s->wind.speed; break;
    case P_WIND_FROM: v = s->wind.from / DRAGARC_DEG; break;
    case P_MASS: v = s->projectile.mass; break;
    case P_DIAMETER: v = s->projectile.diameter; break;
    case P_CD: v = s->projectile.drag.cd; break;
    case P_SITE_ELEVATION: v = s->atmosphere.site_elevation; break;
    case P_TEMPERATURE_OFFSET: v = s->atmosphere.temperature_offset; break;
    case P_GROUND_ELEVATION: v = s->ground_elevation; break;
    case P_GRAVITY: v = s->gravity; break;
    case P_SPIN_RATE: v = s->launch.spin_rate * 60.0 / (2.0 * DRAGARC_PI); break;
    case P_SPIN_TILT: v = s->launch.spin_tilt / DRAGARC_DEG; break;
    case P_COUNT: break;
    }
    *value = v;
    return DRAGARC_OK;
}

/* ---- axes ----------------------------------------------------------------------------------------- */

/* How far short of a whole number of steps (in steps) stop may fall and still be included: 1e-9 of a
 * step for decimal steps that binary floating point cannot hold exactly (0.9 / 0.3 = 2.9999999999999996),
 * plus the rounding of start and stop themselves, which dominates when they are large against the
 * step (1e6 to 1000000.1 by 0.01: 1000000.1 is stored 2.3e-9 steps low). */
static double slack(double start, double stop, double step)
{
    return 1e-9 + 4.0 * DBL_EPSILON * fmax(fabs(start), fabs(stop)) / fabs(step);
}

int dragarc_sweep_axis_init(dragarc_sweep_axis *axis, const char *name, double start, double stop, double step,
                            dragarc_error *err)
{
    memset(axis, 0, sizeof *axis);
    const dragarc_scenario_param *p = dragarc_scenario_param_find(name);
    if (!p)
        return unknown_name(name, err);
    if (!isfinite(start) || !isfinite(stop) || !isfinite(step))
        return dragarc_error_set(err, DRAGARC_EINVAL, p->path, "START, STOP and STEP must be finite numbers");
    if (step == 0.0)
        return dragarc_error_set(err, DRAGARC_EINVAL, p->path, "STEP must not be 0");
    if (stop > start && step < 0.0)
        return dragarc_error_set(err, DRAGARC_EINVAL, p->path,
                                 "STEP must be positive when STOP (%.10g) is above START (%.10g)", stop, start);
    if (stop < start && step > 0.0)
        return dragarc_error_set(err, DRAGARC_EINVAL, p->path,
                                 "STEP must be negative when STOP (%.10g) is below START (%.10g)", stop, start);
    double q = (stop - start) / step;
    double n = floor(q + slack(start, stop, step)) + 1.0;
    if (!(n <= DRAGARC_SWEEP_MAX_VALUES))
        return dragarc_error_set(err, DRAGARC_EINVAL, p->path,
                                 "%.10g to %.10g by %.10g gives %.0f values; at most %d are allowed on one axis",
                                 start, stop, step, isfinite(n) ? n : HUGE_VAL, DRAGARC_SWEEP_MAX_VALUES);
    axis->param = p;
    axis->start = start;
    axis->stop = stop;
    axis->step = step;
    axis->count = (size_t)n;
    return DRAGARC_OK;
}

static int parse_number(const char *text, size_t len, double *out)
{
    char buf[64];
    if (len == 0 || len >= sizeof buf)
        return -1;
    memcpy(buf, text, len);
    buf[len] = '\0';
    char *end = NULL;
    double v = strtod(buf, &end);
    if (end == buf || *end != '\0' || !isfinite(v))
        return -1;
    *out = v;
    return 0;
}

int dragarc_sweep_axis_parse(dragarc_sweep_axis *axis, const char *spec, dragarc_error *err)
{
    memset(axis, 0, sizeof *axis);
    const char *eq = spec ? strchr(spec, '=') : NULL;
    if (!eq || eq == spec)
        return dragarc_error_set(err, DRAGARC_EINVAL, "", "needs NAME=START:STOP:STEP");
    char name[64];
    size_t nlen = (size_t)(eq - spec);
    if (nlen >= sizeof name)
        nlen = sizeof name - 1;
    memcpy(name, spec, nlen);
    name[nlen] = '\0';
    const dragarc_scenario_param *p = dragarc_scenario_param_find(name);
    if (!p)
        return unknown_name(name, err);
    const char *r = eq + 1, *c1 = strchr(r, ':'), *c2 = c1 ? strchr(c1 + 1, ':') : NULL;
    double v[3];
    if (!c1 || !c2 || strchr(c2 + 1, ':') || parse_number(r, (size_t)(c1 - r), &v[0]) != 0 ||
        parse_number(c1 + 1, (size_t)(c2 - c1 - 1), &v[1]) != 0 || parse_number(c2 + 1, strlen(c2 + 1), &v[2]) != 0)
        return dragarc_error_set(err, DRAGARC_EINVAL, p->path,
                                 "the range must be START:STOP:STEP, three finite numbers (got '%s')", r);
    return dragarc_sweep_axis_init(axis, p->path, v[0], v[1], v[2], err);
}

double dragarc_sweep_axis_value(const dragarc_sweep_axis *a, size_t i)
{
    if (i == 0)
        return a->start;
    double v = a->start + (double)i * a->step;
    if (i + 1 == a->count && fabs(v - a->stop) <= slack(a->start, a->stop, a->step) * fabs(a->step))
        return a->stop;
    /* Round to 15 significant digits of the largest magnitude in the range: below the resolution of a
     * double at that magnitude, above the error of start + i step. */
    double mag = fmax(fmax(fabs(a->start), fabs(a->stop)), fabs(a->step));
    int decimals = 14 - (int)floor(log10(mag));
    if (decimals < 0 || decimals > 300)
        return v;
    char buf[400];
    snprintf(buf, sizeof buf, "%.*f", decimals, v);
    return strtod(buf, NULL) + 0.0; /* + 0.0 turns a rounded -0 into 0 */
}

/* ---- tables --------------------------------------------------------------------------------------- */

int dragarc_sweep_axes_check(const dragarc_sweep_axis *axes, size_t naxes, size_t *nrows, dragarc_error *err)
{
    if (nrows)
        *nrows = 0;
    if (naxes < 1 || naxes > DRAGARC_SWEEP_MAX_AXES)
        return dragarc_error_set(err, DRAGARC_EINVAL, "", "a table varies 1 to %d parameters (got %zu)",
                                 DRAGARC_SWEEP_MAX_AXES, naxes);
    size_t total = 1;
    for (size_t k = 0; k < naxes; k++) {
        const dragarc_sweep_axis *a = &axes[k];
        if (!known(a->param))
            return dragarc_error_set(err, DRAGARC_EINVAL, "", "axis %zu has no parameter: make it with "
                                                               "dragarc_sweep_axis_init", k + 1);
        if (a->count < 1 || a->count > DRAGARC_SWEEP_MAX_VALUES || !(a->step != 0.0 && isfinite(a->step)))
            return dragarc_error_set(err, DRAGARC_EINVAL, a->param->path, "the axis has %zu values or a bad step: make "
                                                                         "it with dragarc_sweep_axis_init", a->count);
        for (size_t j = 0; j < k; j++)
            if (axes[j].param == a->param)
                return dragarc_error_set(err, DRAGARC_EINVAL, a->param->path, "varied twice: one axis per parameter");
        if (total > DRAGARC_SWEEP_MAX_ROWS / a->count)
            return dragarc_error_set(err, DRAGARC_EINVAL, a->param->path,
                                     "the table would have more than %d rows; use larger steps or fewer values",
                                     DRAGARC_SWEEP_MAX_ROWS);
        total *= a->count;
    }
    if (nrows)
        *nrows = total;
    return DRAGARC_OK;
}

int dragarc_scenario_params_check(const dragarc_scenario *base, const dragarc_scenario_param *const *params, size_t n,
                                  dragarc_error *err)
{
    unsigned varied = 0; /* bit i: PARAMS[i] */
    for (size_t k = 0; k < n; k++) {
        if (!params[k] || !known(params[k]))
            return dragarc_error_set(err, DRAGARC_EINVAL, "", "parameter %zu is not one of dragarc_scenario_params",
                                     k + 1);
        param_id id = id_of(params[k]);
        int rc = applicable(base, id, err);
        if (rc != DRAGARC_OK)
            return rc;
        varied |= 1u << id;
    }
#define VARIED(id) ((varied >> (id)) & 1u)
    if (VARIED(P_WIND_FROM) && !VARIED(P_WIND_SPEED) && base->wind.model == DRAGARC_WIND_NONE)
        return dragarc_error_set(err, DRAGARC_EINVAL, PARAMS[P_WIND_FROM].path,
                                 "the scenario has no wind, so its direction changes nothing: vary wind_speed too, "
                                 "or give environment.wind in the scenario");
    param_id spin = VARIED(P_SPIN_RATE) ? P_SPIN_RATE : P_SPIN_TILT;
    if ((VARIED(P_SPIN_RATE) || VARIED(P_SPIN_TILT)) && base->projectile.lift.model == DRAGARC_LIFT_NONE)
        return dragarc_error_set(err, DRAGARC_EINVAL, PARAMS[spin].path,
                                 "the projectile has no lift model, so its spin changes nothing: give projectile.lift "
                                 "in the scenario");
    if (VARIED(P_SPIN_TILT) && !VARIED(P_SPIN_RATE) && !(base->launch.spin_rate > 0.0))
        return dragarc_error_set(err, DRAGARC_EINVAL, PARAMS[P_SPIN_TILT].path,
                                 "the scenario's spin rate is 0, so the tilt of its axis changes nothing: vary "
                                 "spin_rate too, or give launch.spin.rate in the scenario");
#undef VARIED
    return DRAGARC_OK;
}

int dragarc_sweep_check(const dragarc_scenario *base, const dragarc_sweep_axis *axes, size_t naxes, size_t *nrows,
                        dragarc_error *err)
{
    size_t total = 0;
    if (nrows)
        *nrows = 0;
    int rc = dragarc_sweep_axes_check(axes, naxes, &total, err);
    if (rc != DRAGARC_OK)
        return rc;
    if ((rc = dragarc_scenario_check(base, err)) != DRAGARC_OK)
        return rc;
    const dragarc_scenario_param *params[DRAGARC_SWEEP_MAX_AXES];
    for (size_t k = 0; k < naxes; k++)
        params[k] = axes[k].param;
    if ((rc = dragarc_scenario_params_check(base, params, naxes, err)) != DRAGARC_OK)
        return rc;
    if (nrows)
        *nrows = total;
    return DRAGARC_OK;
}

double dragarc_sweep_memory_estimate(size_t nrows)
{
    return (double)nrows * sizeof(dragarc_sweep_row);
}

/* Rows between two calls of a progress callback. */
#define PROGRESS_EVERY 16

static void fail_row(dragarc_sweep_row *row, const dragarc_error *e)
{
    row->status = e->code < 0 ? e->code : DRAGARC_ESOLVER;
    row->error = malloc(sizeof *row->error); /* NULL leaves the status name as the only reason */
    if (row->error)
        *row->error = *e;
}

static void fly_row(const dragarc_scenario *base, const dragarc_sweep_axis *axes, size_t naxes, size_t r,
                    dragarc_sweep_row *row)
{
    row->range = row->downrange = row->crossrange = row->time_of_flight = NAN;
    row->apex_height = row->impact_speed = row->impact_angle = row->impact_energy = row->terminal_speed = NAN;
    size_t idx = r;
    for (size_t k = naxes; k-- > 0;) {
        row->values[k] = dragarc_sweep_axis_value(&axes[k], idx % axes[k].count);
        idx /= axes[k].count;
    }
    dragarc_scenario s = *base; /* shallow: shares the drag table and wind layers, changes scalars only */
    dragarc_error e = {0};
    for (size_t k = 0; k < naxes; k++)
        if (dragarc_scenario_set(&s, axes[k].param->path, row->values[k], &e) != DRAGARC_OK) {
            fail_row(row, &e);
            return;
        }
    dragarc_flight f;
    int rc = dragarc_flight_run(&s, 0.0, &f, &e);
    if (rc != DRAGARC_OK) {
        e.code = rc;
        fail_row(row, &e);
    } else {
        row->status = DRAGARC_OK;
        row->range = f.range;
        row->downrange = f.downrange;
        row->crossrange = f.crossrange;
        row->time_of_flight = f.time_of_flight;
        row->apex_height = f.apex_height;
        row->impact_speed = f.impact_speed;
        row->impact_angle = f.impact_angle;
        row->impact_energy = f.impact_energy;
        row->terminal_speed = f.terminal_speed;
        row->notes = f.notes;
    }
    dragarc_flight_clear(&f);
}

int dragarc_sweep_run(const dragarc_scenario *base, const dragarc_sweep_axis *axes, size_t naxes, dragarc_sweep *out,
                      dragarc_error *err)
{
    return dragarc_sweep_run_progress(base, axes, naxes, NULL, NULL, out, err);
}

int dragarc_sweep_run_progress(const dragarc_scenario *base, const dragarc_sweep_axis *axes, size_t naxes,
                               void (*progress)(size_t done, size_t total, void *user), void *user,
                               dragarc_sweep *out, dragarc_error *err)
{
    int rc = dragarc_sweep_init(base, axes, naxes, out, err);
    if (rc != DRAGARC_OK)
        return rc;
    rc = dragarc_sweep_run_range(base, out->axes, naxes, 0, out->nrows, 1, out->rows, progress, user, err);
    if (rc == DRAGARC_OK)
        dragarc_sweep_tally(out);
    return rc;
}

int dragarc_sweep_init(const dragarc_scenario *base, const dragarc_sweep_axis *axes, size_t naxes, dragarc_sweep *out,
                       dragarc_error *err)
{
    memset(out, 0, sizeof *out);
    size_t n = 0;
    int rc = dragarc_sweep_check(base, axes, naxes, &n, err);
    if (rc != DRAGARC_OK)
        return rc;
    out->rows = calloc(n, sizeof *out->rows);
    if (!out->rows)
        return dragarc_error_set(err, DRAGARC_ENOMEM, "", "out of memory for %zu table rows", n);
    snprintf(out->scenario, sizeof out->scenario, "%s", base->name);
    out->naxes = naxes;
    memcpy(out->axes, axes, naxes * sizeof *axes);
    out->nrows = n;
    return DRAGARC_OK;
}

int dragarc_sweep_run_range(const dragarc_scenario *base, const dragarc_sweep_axis *axes, size_t naxes, size_t r0,
                            size_t r1, size_t step, dragarc_sweep_row *rows,
                            void (*progress)(size_t done, size_t total, void *user), void *user, dragarc_error *err)
{
    size_t n = 0;
    int rc = dragarc_sweep_check(base, axes, naxes, &n, err);
    if (rc != DRAGARC_OK)
        return rc;
    if (!(r0 <= r1 && r1 <= n && step >= 1))
        return dragarc_error_set(err, DRAGARC_EINVAL, "", "rows %zu to %zu by %zu are not within the table's %zu", r0,
                                 r1, step, n);
    const size_t count = (r1 - r0 + step - 1) / step;
    progress_count prog = progress_start(progress, user, count, PROGRESS_EVERY);
#pragma omp parallel for schedule(dynamic) default(none) shared(base, axes, naxes, r0, step, count, rows, prog)
    for (size_t i = 0; i < count; i++) {
        memset(&rows[i], 0, sizeof rows[i]);
        fly_row(base, axes, naxes, r0 + i * step, &rows[i]);
        progress_step(&prog);
    }
    return DRAGARC_OK;
}

void dragarc_sweep_tally(dragarc_sweep *t)
{
    t->nfailed = 0;
    t->notes = 0;
    for (size_t r = 0; r < t->nrows; r++) {
        if (t->rows[r].status != DRAGARC_OK)
            t->nfailed++;
        else
            t->notes |= t->rows[r].notes;
    }
}

void dragarc_sweep_clear(dragarc_sweep *t)
{
    if (!t)
        return;
    for (size_t r = 0; t->rows && r < t->nrows; r++)
        free(t->rows[r].error);
    free(t->rows);
    memset(t, 0, sizeof *t);
}

void dragarc_sweep_row_message(const dragarc_sweep_row *row, char *buf, size_t size)
{
    if (size == 0)
        return;
    if (row->status == DRAGARC_OK)
        buf[0] = '\0';
    else if (!row->error)
        snprintf(buf, size, "%s", dragarc_status_name(row->status));
    else if (row->error->field[0])
        snprintf(buf, size, "%s: %s", row->error->field, row->error->message);
    else
        snprintf(buf, size, "%s", row->error->message);
}
