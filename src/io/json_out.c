/* json_out.c: JSON documents of results (cJSON builds them; numbers print in the C locale).
 * SPDX-License-Identifier: GPL-3.0-or-later
 *
 * A value that is not finite (no terminal speed, a vacuum flight that never lands) is written as
 * null, never as NaN or Infinity, which are not JSON.
 */
#include <math.h>
#include <stdlib.h>
#include <string.h>

#include <cjson/cJSON.h>

#include "core/constants.h"
#include "dragarc/aim.h"
#include "dragarc/cautions.h"
#include "dragarc/output.h"
#include "dragarc/units.h"

static void add_num(cJSON *o, const char *key, double v)
{
    if (isfinite(v))
        cJSON_AddNumberToObject(o, key, v);
    else
        cJSON_AddNullToObject(o, key);
}

static cJSON *vec3(const double *v)
{
    cJSON *o = cJSON_CreateObject();
    add_num(o, "x", v[0]);
    add_num(o, "y", v[1]);
    add_num(o, "z", v[2]);
    return o;
}

static void add_units(cJSON *doc, const char *const *pairs)
{
    cJSON *u = cJSON_AddObjectToObject(doc, "units");
    for (; pairs[0]; pairs += 2)
        cJSON_AddStringToObject(u, pairs[0], pairs[1]);
}

static char *finish(cJSON *doc)
{
    char *text = doc ? cJSON_Print(doc) : NULL;
    cJSON_Delete(doc);
    return text;
}

static void add_cautions(cJSON *doc, unsigned notes)
{
    const char *cautions[8];
    size_t nc = dragarc_cautions_notes(notes, cautions, 8);
    cJSON *ca = cJSON_AddArrayToObject(doc, "cautions");
    for (size_t i = 0; i < nc; i++)
        cJSON_AddItemToArray(ca, cJSON_CreateString(cautions[i]));
}

/* A summary value in its display unit, with its unit recorded in `units`. */
static void add_shown(cJSON *o, cJSON *units, const dragarc_display *d, const char *key, dragarc_quantity q, double si)
{
    const dragarc_unit_out *u = dragarc_display_unit(d, key, q);
    add_num(o, key, dragarc_display_value(u, si));
    cJSON_AddStringToObject(units, key, u->symbol);
}

static cJSON *vec3_shown(cJSON *units, const dragarc_display *d, const char *key, dragarc_quantity q, const double *v)
{
    const dragarc_unit_out *u = dragarc_display_unit(d, key, q);
    double w[3] = {dragarc_display_value(u, v[0]), dragarc_display_value(u, v[1]), dragarc_display_value(u, v[2])};
    cJSON_AddStringToObject(units, key, u->symbol);
    return vec3(w);
}

char *dragarc_flight_json(const dragarc_scenario *s, const dragarc_flight *f, const dragarc_display *d)
{
    dragarc_display si;
    if (!d) {
        dragarc_display_si(&si);
        d = &si;
    }
    cJSON *doc = cJSON_CreateObject();
    if (!doc)
        return NULL;
    cJSON_AddStringToObject(doc, "scenario", s->name);
    cJSON_AddStringToObject(doc, "dragarc_version", DRAGARC_VERSION_STRING);
    cJSON *sum = cJSON_AddObjectToObject(doc, "summary");
    cJSON *sol = cJSON_AddObjectToObject(doc, "solver");
    cJSON *un = cJSON_CreateObject();
    add_shown(sum, un, d, "range", DRAGARC_Q_LENGTH, f->range);
    add_shown(sum, un, d, "downrange", DRAGARC_Q_LENGTH, f->downrange);
    add_shown(sum, un, d, "crossrange", DRAGARC_Q_LENGTH, f->crossrange);
    add_shown(sum, un, d, "time_of_flight", DRAGARC_Q_TIME, f->time_of_flight);
    add_shown(sum, un, d, "apex_height", DRAGARC_Q_LENGTH, f->apex_height);
    add_shown(sum, un, d, "apex_time", DRAGARC_Q_TIME, f->apex_time);
    add_shown(sum, un, d, "impact_speed", DRAGARC_Q_SPEED, f->impact_speed);
    add_shown(sum, un, d, "impact_angle", DRAGARC_Q_ANGLE, f->impact_angle / DRAGARC_DEG);
    add_shown(sum, un, d, "impact_energy", DRAGARC_Q_ENERGY, f->impact_energy);
    add_shown(sum, un, d, "launch_energy", DRAGARC_Q_ENERGY, f->launch_energy);
    add_shown(sum, un, d, "terminal_speed", DRAGARC_Q_SPEED, f->terminal_speed);
    add_shown(sum, un, d, "vacuum_range", DRAGARC_Q_LENGTH, f->vacuum_range);
    cJSON_AddItemToObject(sum, "impact_position", vec3_shown(un, d, "impact_position", DRAGARC_Q_LENGTH, f->impact));
    cJSON_AddItemToObject(sum, "impact_velocity",
                          vec3_shown(un, d, "impact_velocity", DRAGARC_Q_SPEED, f->impact + 3));
    add_num(sum, "max_mach", f->max_mach);
    add_num(sum, "max_reynolds", f->max_reynolds);
    cJSON_AddStringToObject(sol, "method", dragarc_method_name(f->method));
    cJSON_AddNumberToObject(sol, "steps", (double)f->steps);
    cJSON_AddNumberToObject(sol, "rtol", s->solver.rtol);
    cJSON_AddNumberToObject(sol, "atol", s->solver.atol);
    add_shown(sol, un, d, "relaxation_time", DRAGARC_Q_TIME, f->relaxation_time);
    cJSON_AddItemToObject(doc, "units", un);
    add_cautions(doc, f->notes);
    return finish(doc);
}

char *dragarc_aim_json(const dragarc_scenario *s, const dragarc_aim_request *req, const dragarc_aim_result *r)
{
    cJSON *doc = cJSON_CreateObject();
    if (!doc)
        return NULL;
    cJSON_AddStringToObject(doc, "scenario", s->name);
    cJSON_AddStringToObject(doc, "dragarc_version", DRAGARC_VERSION_STRING);
    cJSON *t = cJSON_AddObjectToObject(doc, "target");
    add_num(t, "range", req->range);
    add_num(t, "crossrange", req->crossrange);
    add_num(t, "height", isnan(req->height) ? s->ground_elevation : req->height);
    add_num(t, "azimuth", s->launch.azimuth / DRAGARC_DEG);
    cJSON_AddStringToObject(t, "solve", req->mode == DRAGARC_AIM_SPEED ? "speed" : "elevation");
    cJSON *arr = cJSON_AddArrayToObject(doc, "solutions");
    unsigned notes = 0;
    for (size_t i = 0; i < r->nsolutions; i++) {
        const dragarc_aim_solution *q = &r->solutions[i];
        cJSON *o = cJSON_CreateObject();
        add_num(o, "elevation", q->elevation / DRAGARC_DEG);
        add_num(o, "azimuth", q->azimuth / DRAGARC_DEG);
        add_num(o, "azimuth_correction", q->azimuth_correction / DRAGARC_DEG);
        add_num(o, "speed", q->speed);
        add_num(o, "time_of_flight", q->time_of_flight);
        add_num(o, "apex_height", q->apex_height);
        add_num(o, "impact_speed", q->impact_speed);
        add_num(o, "impact_angle", q->impact_angle / DRAGARC_DEG);
        add_num(o, "impact_energy", q->impact_energy);
        add_num(o, "miss", q->miss);
        cJSON_AddItemToArray(arr, o);
        notes |= q->notes;
    }
    add_num(doc, "max_range", r->max_range);
    add_num(doc, "max_range_elevation", r->max_range_elevation / DRAGARC_DEG);
    cJSON_AddNumberToObject(doc, "flights", (double)r->flights);
    static const char *const units[] = {"range", "m", "crossrange", "m", "height", "m", "elevation", "degree",
                                        "azimuth", "degree", "azimuth_correction", "degree", "speed", "m/s",
                                        "time_of_flight", "s", "apex_height", "m", "impact_speed", "m/s",
                                        "impact_angle", "degree", "impact_energy", "J", "miss", "m",
                                        "max_range", "m", "max_range_elevation", "degree", NULL};
    add_units(doc, units);
    add_cautions(doc, notes);
    return finish(doc);
}

char *dragarc_atmosphere_json(const double *altitudes, const dragarc_air *levels, size_t n, double temperature_offset)
{
    cJSON *doc = cJSON_CreateObject();
    if (!doc)
        return NULL;
    cJSON_AddStringToObject(doc, "model", "U.S. Standard Atmosphere 1976");
    cJSON_AddNumberToObject(doc, "temperature_offset", temperature_offset);
    cJSON *arr = cJSON_AddArrayToObject(doc, "levels");
    for (size_t i = 0; i < n; i++) {
        cJSON *l = cJSON_CreateObject();
        add_num(l, "altitude", altitudes[i]);
        add_num(l, "temperature", levels[i].temperature);
        add_num(l, "pressure", levels[i].pressure);
        add_num(l, "density", levels[i].density);
        add_num(l, "speed_of_sound", levels[i].speed_of_sound);
        add_num(l, "viscosity", levels[i].viscosity);
        cJSON_AddItemToArray(arr, l);
    }
    static const char *const units[] = {"altitude", "m", "temperature", "K", "temperature_offset", "K",
                                        "pressure", "Pa", "density", "kg/m^3", "speed_of_sound", "m/s",
                                        "viscosity", "Pa s", NULL};
    add_units(doc, units);
    return finish(doc);
}
