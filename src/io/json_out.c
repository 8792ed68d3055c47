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
#include "dragarc/catch_data.h"
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

static char *finish(cJSON *doc)
{
    char *text = doc ? cJSON_Print(doc) : NULL;
    cJSON_Delete(doc);
    return text;
}

static void add_caution_list(cJSON *doc, const char **cautions, size_t nc)
{
    cJSON *ca = cJSON_AddArrayToObject(doc, "cautions");
    for (size_t i = 0; i < nc; i++)
        cJSON_AddItemToArray(ca, cJSON_CreateString(cautions[i]));
}

static void add_cautions(cJSON *doc, unsigned notes)
{
    const char *cautions[DRAGARC_CAUTIONS_MAX];
    add_caution_list(doc, cautions, dragarc_cautions_notes(notes, cautions, DRAGARC_CAUTIONS_MAX));
}

/* A summary value in its display unit, with its unit recorded in `units`. */
static void add_shown(cJSON *o, cJSON *units, const dragarc_display *d, const char *key, dragarc_quantity q, double si)
{
    const dragarc_unit_out *u = dragarc_display_unit(d, key, q);
    add_num(o, key, dragarc_display_value(u, si));
    if (!cJSON_GetObjectItemCaseSensitive(units, key)) /* one entry per key name (aim: target and solution azimuth) */
        cJSON_AddStringToObject(units, key, u->symbol);
}

static cJSON *vec3_shown(cJSON *units, const dragarc_display *d, const char *key, dragarc_quantity q, const double *v)
{
    const dragarc_unit_out *u = dragarc_display_unit(d, key, q);
    double w[3] = {dragarc_display_value(u, v[0]), dragarc_display_value(u, v[1]), dragarc_display_value(u, v[2])};
    if (!cJSON_GetObjectItemCaseSensitive(units, key))
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
    if (s->ground_surface_given) {
        cJSON_AddNumberToObject(sum, "bounces", f->bounces);
        add_shown(sum, un, d, "total_distance", DRAGARC_Q_LENGTH, f->total_distance);
        add_shown(sum, un, d, "roll_distance", DRAGARC_Q_LENGTH, f->roll_distance);
        add_shown(sum, un, d, "rest_time", DRAGARC_Q_TIME, f->rest_time);
        double rest[3] = {f->rest_position[0], f->rest_position[1], s->ground_elevation};
        cJSON_AddItemToObject(sum, "rest_position", vec3_shown(un, d, "rest_position", DRAGARC_Q_LENGTH, rest));
        cJSON *ls = cJSON_AddArrayToObject(doc, "landings");
        for (size_t i = 0; i < f->nlandings; i++) {
            const dragarc_landing *L = &f->landings[i];
            cJSON *o = cJSON_CreateObject();
            double pos[3] = {L->pos[0], L->pos[1], s->ground_elevation};
            add_shown(o, un, d, "time", DRAGARC_Q_TIME, L->t);
            cJSON_AddItemToObject(o, "position", vec3_shown(un, d, "position", DRAGARC_Q_LENGTH, pos));
            add_shown(o, un, d, "speed_in", DRAGARC_Q_SPEED, L->speed_in);
            add_shown(o, un, d, "angle_in", DRAGARC_Q_ANGLE, L->angle_in / DRAGARC_DEG);
            add_shown(o, un, d, "spin_in", DRAGARC_Q_ANGULAR_SPEED, L->spin_in * 60.0 / (2.0 * DRAGARC_PI));
            add_shown(o, un, d, "speed_out", DRAGARC_Q_SPEED, L->speed_out);
            add_shown(o, un, d, "angle_out", DRAGARC_Q_ANGLE, L->angle_out / DRAGARC_DEG);
            add_shown(o, un, d, "spin_out", DRAGARC_Q_ANGULAR_SPEED, L->spin_out * 60.0 / (2.0 * DRAGARC_PI));
            cJSON_AddStringToObject(o, "contact", L->grips ? "grips" : "slides");
            cJSON_AddStringToObject(o, "then", L->rolls ? "rolls" : "bounces");
            cJSON_AddItemToArray(ls, o);
        }
    }
    if (s->launch.spin_rate > 0.0)
        add_shown(sum, un, d, "landing_spin_rate", DRAGARC_Q_ANGULAR_SPEED, f->impact[6] * 60.0 / (2.0 * DRAGARC_PI));
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

char *dragarc_aim_json(const dragarc_scenario *s, const dragarc_aim_request *req, const dragarc_aim_result *r,
                       const dragarc_display *d)
{
    dragarc_display si;
    if (!d) {
        dragarc_display_si(&si);
        d = &si;
    }
    cJSON *doc = cJSON_CreateObject();
    if (!doc)
        return NULL;
    cJSON *un = cJSON_CreateObject();
    cJSON_AddStringToObject(doc, "scenario", s->name);
    cJSON_AddStringToObject(doc, "dragarc_version", DRAGARC_VERSION_STRING);
    cJSON *t = cJSON_AddObjectToObject(doc, "target");
    add_shown(t, un, d, "range", DRAGARC_Q_LENGTH, req->range);
    add_shown(t, un, d, "crossrange", DRAGARC_Q_LENGTH, req->crossrange);
    add_shown(t, un, d, "height", DRAGARC_Q_LENGTH, isnan(req->height) ? s->ground_elevation : req->height);
    add_shown(t, un, d, "azimuth", DRAGARC_Q_ANGLE, s->launch.azimuth / DRAGARC_DEG);
    cJSON_AddStringToObject(t, "solve", req->mode == DRAGARC_AIM_SPEED ? "speed" : "elevation");
    cJSON *arr = cJSON_AddArrayToObject(doc, "solutions");
    unsigned notes = 0;
    /* Units are recorded once per key, from the first solution (or from a throw-away object). */
    for (size_t i = 0; i < (r->nsolutions ? r->nsolutions : 1); i++) {
        const dragarc_aim_solution empty = {0};
        const dragarc_aim_solution *q = r->nsolutions ? &r->solutions[i] : &empty;
        cJSON *o = cJSON_CreateObject();
        cJSON *u = i == 0 ? un : cJSON_CreateObject();
        add_shown(o, u, d, "elevation", DRAGARC_Q_ANGLE, q->elevation / DRAGARC_DEG);
        add_shown(o, u, d, "azimuth", DRAGARC_Q_ANGLE, q->azimuth / DRAGARC_DEG);
        add_shown(o, u, d, "azimuth_correction", DRAGARC_Q_ANGLE, q->azimuth_correction / DRAGARC_DEG);
        const dragarc_unit_out *us = dragarc_display_unit(d, "launch_speed", DRAGARC_Q_SPEED);
        add_num(o, "speed", dragarc_display_value(us, q->speed));
        if (i == 0)
            cJSON_AddStringToObject(un, "speed", us->symbol);
        add_shown(o, u, d, "time_of_flight", DRAGARC_Q_TIME, q->time_of_flight);
        add_shown(o, u, d, "apex_height", DRAGARC_Q_LENGTH, q->apex_height);
        add_shown(o, u, d, "impact_speed", DRAGARC_Q_SPEED, q->impact_speed);
        add_shown(o, u, d, "impact_angle", DRAGARC_Q_ANGLE, q->impact_angle / DRAGARC_DEG);
        add_shown(o, u, d, "impact_energy", DRAGARC_Q_ENERGY, q->impact_energy);
        add_shown(o, u, d, "miss", DRAGARC_Q_LENGTH, q->miss);
        if (u != un)
            cJSON_Delete(u);
        if (r->nsolutions) {
            cJSON_AddItemToArray(arr, o);
            notes |= q->notes;
        } else {
            cJSON_Delete(o);
        }
    }
    add_shown(doc, un, d, "max_range", DRAGARC_Q_LENGTH, r->max_range);
    const dragarc_unit_out *ua = dragarc_display_unit(d, NULL, DRAGARC_Q_ANGLE);
    add_num(doc, "max_range_elevation", dragarc_display_value(ua, r->max_range_elevation / DRAGARC_DEG));
    cJSON_AddStringToObject(un, "max_range_elevation", ua->symbol);
    cJSON_AddNumberToObject(doc, "flights", (double)r->flights);
    cJSON_AddItemToObject(doc, "units", un);
    add_cautions(doc, notes);
    return finish(doc);
}

char *dragarc_atmosphere_json(const dragarc_atmosphere *atm, const double *altitudes, const dragarc_air *levels,
                              size_t n, const dragarc_display *d)
{
    int local = atm->model == DRAGARC_ATMOSPHERE_LOCAL;
    dragarc_display si;
    if (!d) {
        dragarc_display_si(&si);
        d = &si;
    }
    cJSON *doc = cJSON_CreateObject();
    if (!doc)
        return NULL;
    cJSON *un = cJSON_CreateObject();
    if (local) {
        cJSON_AddStringToObject(doc, "model", "local");
        add_shown(doc, un, d, "temperature", DRAGARC_Q_TEMPERATURE, atm->temperature);
        add_shown(doc, un, d, "pressure", DRAGARC_Q_PRESSURE, atm->pressure);
        add_num(doc, "relative_humidity", atm->relative_humidity);
        cJSON_AddStringToObject(un, "relative_humidity", "1");
    } else {
        cJSON_AddStringToObject(doc, "model", "U.S. Standard Atmosphere 1976");
        add_shown(doc, un, d, "temperature_offset", DRAGARC_Q_TEMPERATURE_DIFFERENCE, atm->temperature_offset);
    }
    cJSON *arr = cJSON_AddArrayToObject(doc, "levels");
    for (size_t i = 0; i < n; i++) {
        cJSON *l = cJSON_CreateObject();
        cJSON *u = i == 0 ? un : cJSON_CreateObject();
        add_shown(l, u, d, local ? "height" : "altitude", DRAGARC_Q_LENGTH, altitudes[i]);
        add_shown(l, u, d, "temperature", DRAGARC_Q_TEMPERATURE, levels[i].temperature);
        add_shown(l, u, d, "pressure", DRAGARC_Q_PRESSURE, levels[i].pressure);
        add_shown(l, u, d, "density", DRAGARC_Q_DENSITY, levels[i].density);
        add_shown(l, u, d, "speed_of_sound", DRAGARC_Q_SPEED, levels[i].speed_of_sound);
        add_shown(l, u, d, "viscosity", DRAGARC_Q_VISCOSITY, levels[i].viscosity);
        if (u != un)
            cJSON_Delete(u);
        cJSON_AddItemToArray(arr, l);
    }
    cJSON_AddItemToObject(doc, "units", un);
    return finish(doc);
}

char *dragarc_uniformity_json(const char *file, const dragarc_catches *c, const dragarc_uniformity *u)
{
    cJSON *doc = cJSON_CreateObject();
    if (!doc)
        return NULL;
    cJSON *un = cJSON_CreateObject();
    cJSON_AddStringToObject(doc, "file", file);
    cJSON_AddStringToObject(doc, "dragarc_version", DRAGARC_VERSION_STRING);
    cJSON_AddNumberToObject(doc, "catches", (double)u->n);
    cJSON_AddStringToObject(doc, "areas", c->area ? "weighted" : "equal");
    if (c->area) {
        add_num(doc, "total_area", u->total_area);
        cJSON_AddStringToObject(un, "total_area", "as area");
    }
    /* depths are in the file's own unit; the coefficients are ratios */
    static const char *const DEPTHS[] = {"mean", "min", "max", "sd"};
    const double depth_values[] = {u->mean, u->min, u->max, u->sd};
    for (size_t k = 0; k < 4; k++) {
        add_num(doc, DEPTHS[k], depth_values[k]);
        cJSON_AddStringToObject(un, DEPTHS[k], "as depth");
    }
    add_num(doc, "cv", u->cv);
    cJSON_AddStringToObject(un, "cv", "1");
    add_num(doc, "cu", u->cu);
    cJSON_AddStringToObject(un, "cu", "%");
    add_num(doc, "low_quarter_mean", u->low_quarter_mean);
    cJSON_AddStringToObject(un, "low_quarter_mean", "as depth");
    add_num(doc, "du_lq", u->du_lq);
    cJSON_AddStringToObject(un, "du_lq", "%");
    double ext[4];
    if (dragarc_catches_extent(c, ext) == 0) {
        cJSON *g = cJSON_AddObjectToObject(doc, "grid");
        add_num(g, "x_min", ext[0]);
        add_num(g, "x_max", ext[1]);
        add_num(g, "y_min", ext[2]);
        add_num(g, "y_max", ext[3]);
        cJSON_AddStringToObject(un, "grid", "as x and y");
    }
    cJSON_AddItemToObject(doc, "units", un);
    const char *cautions[DRAGARC_CAUTIONS_MAX];
    add_caution_list(doc, cautions, dragarc_cautions_uniformity(cautions, DRAGARC_CAUTIONS_MAX));
    return finish(doc);
}
