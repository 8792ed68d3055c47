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
#include "dragarc/drift.h"
#include "dragarc/fit.h"
#include "dragarc/footprint.h"
#include "dragarc/campaign.h"
#include "dragarc/geodesy.h"
#include "dragarc/optimize.h"
#include "dragarc/sprinkler.h"
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

static void add_caution_list(cJSON *doc, const char *const *cautions, size_t n)
{
    cJSON *ca = cJSON_AddArrayToObject(doc, "cautions");
    for (size_t i = 0; i < n; i++)
        cJSON_AddItemToArray(ca, cJSON_CreateString(cautions[i]));
}

static void add_cautions(cJSON *doc, unsigned notes)
{
    const char *cautions[DRAGARC_CAUTIONS_MAX];
    add_caution_list(doc, cautions, dragarc_cautions_notes(notes, cautions, DRAGARC_CAUTIONS_MAX));
}

/* A new document for scenario s ("scenario" and "dragarc_version" first; none for NULL) and its units object
 * *un, to be added to it; *d becomes SI (held in *si) when NULL. NULL when out of memory. */
/* A new document naming its scenario and the dragarc version; NULL when out of memory. */
static cJSON *start(const char *scenario)
{
    cJSON *doc = cJSON_CreateObject();
    if (doc) {
        cJSON_AddStringToObject(doc, "scenario", scenario);
        cJSON_AddStringToObject(doc, "dragarc_version", DRAGARC_VERSION_STRING);
    }
    return doc;
}

/* The "units" object of a document whose units are fixed: n pairs of key and unit. */
static void add_units(cJSON *doc, const char *const (*units)[2], size_t n)
{
    cJSON *un = cJSON_AddObjectToObject(doc, "units");
    for (size_t k = 0; k < n; k++)
        cJSON_AddStringToObject(un, units[k][0], units[k][1]);
}

static cJSON *begin(const dragarc_scenario *s, const dragarc_display **d, dragarc_display *si, cJSON **un)
{
    if (!*d) {
        dragarc_display_si(si);
        *d = si;
    }
    cJSON *doc = cJSON_CreateObject();
    *un = doc ? cJSON_CreateObject() : NULL;
    if (!*un) {
        cJSON_Delete(doc);
        return NULL;
    }
    if (s) {
        cJSON_AddStringToObject(doc, "scenario", s->name);
        cJSON_AddStringToObject(doc, "dragarc_version", DRAGARC_VERSION_STRING);
    }
    return doc;
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

/* The flight's "summary" and "solver" objects in doc, their units in un. */
static void add_flight(cJSON *doc, cJSON *un, const dragarc_scenario *s, const dragarc_flight *f,
                       const dragarc_display *d)
{
    cJSON *sum = cJSON_AddObjectToObject(doc, "summary");
    cJSON *sol = cJSON_AddObjectToObject(doc, "solver");
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
    if (s->projectile.evaporation.enabled) {
        const dragarc_projectile *p = &s->projectile;
        double v_end = fmax(f->impact[7] * p->volume, p->evaporation.nonvolatile_fraction * p->volume), v_res = p->evaporation.nonvolatile_fraction * p->volume;
        cJSON_AddBoolToObject(sum, "evaporated", f->evaporated);
        add_shown(sum, un, d, "final_diameter", DRAGARC_Q_LENGTH, cbrt(6.0 / DRAGARC_PI * v_end));
        add_num(sum, "water_evaporated", (p->volume - v_end) / (p->volume - v_res));
        add_shown(sum, un, d, "wet_bulb_temperature", DRAGARC_Q_TEMPERATURE, f->wet_bulb);
        add_shown(sum, un, d, "drop_temperature", DRAGARC_Q_TEMPERATURE, f->drop_temperature);
    }
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
}

char *dragarc_flight_json(const dragarc_scenario *s, const dragarc_flight *f, const dragarc_display *d)
{
    dragarc_display si;
    cJSON *un, *doc = begin(s, &d, &si, &un);
    if (!doc)
        return NULL;
    add_flight(doc, un, s, f, d);
    cJSON_AddItemToObject(doc, "units", un);
    add_cautions(doc, f->notes);
    return finish(doc);
}

char *dragarc_optimize_json(const dragarc_scenario *s, const dragarc_optimize_request *req,
                            const dragarc_optimize_result *r, const dragarc_display *d)
{
    dragarc_display si;
    cJSON *un, *doc = begin(s, &d, &si, &un);
    if (!doc)
        return NULL;
    cJSON_AddStringToObject(doc, "maximize", dragarc_optimize_objective_name(req->objective));
    const dragarc_unit_out *ul = dragarc_optimize_objective_unit(d, req->objective);
    add_num(doc, "objective", dragarc_display_value(ul, r->objective));
    cJSON_AddStringToObject(un, "objective", ul->symbol);
    cJSON *arr = cJSON_AddArrayToObject(doc, "varied");
    for (size_t i = 0; i < req->nvars; i++) {
        const dragarc_scenario_param *p = req->vars[i].param;
        char slope_unit[64], curvature_unit[64];
        double slope = dragarc_optimize_derivative_shown(d, req->objective, p, r->slope[i], 1, 0, slope_unit,
                                                         sizeof slope_unit);
        double curvature = dragarc_optimize_derivative_shown(d, req->objective, p, r->curvature[i], 2, 0,
                                                             curvature_unit, sizeof curvature_unit);
        cJSON *o = cJSON_CreateObject();
        cJSON_AddStringToObject(o, "name", p->alias);
        cJSON_AddStringToObject(o, "path", p->path);
        add_num(o, "lower", dragarc_scenario_param_shown(d, p, req->vars[i].lo, 1));
        add_num(o, "upper", dragarc_scenario_param_shown(d, p, req->vars[i].hi, 1));
        add_num(o, "optimum", dragarc_scenario_param_shown(d, p, r->x[i], 0));
        if (r->bound[i])
            cJSON_AddStringToObject(o, "on_bound", r->bound[i] < 0 ? "lower" : "upper");
        else
            cJSON_AddNullToObject(o, "on_bound");
        add_num(o, "slope", slope);
        add_num(o, "curvature", curvature);
        /* differences: no zero-point offset */
        double zero = dragarc_scenario_param_shown(d, p, 0.0, 0);
        add_num(o, "slope_step", dragarc_scenario_param_shown(d, p, r->step[i], 0) - zero);
        add_num(o, "curvature_step", dragarc_scenario_param_shown(d, p, r->curvature_step[i], 0) - zero);
        cJSON *vu = cJSON_AddObjectToObject(o, "units");
        cJSON_AddStringToObject(vu, "value", dragarc_scenario_param_unit(d, p));
        cJSON_AddStringToObject(vu, "slope", slope_unit);
        cJSON_AddStringToObject(vu, "curvature", curvature_unit);
        cJSON_AddItemToArray(arr, o);
    }
    cJSON *search = cJSON_AddObjectToObject(doc, "search");
    cJSON_AddStringToObject(search, "method", r->method ? r->method : "");
    cJSON_AddNumberToObject(search, "grid", (double)r->grid);
    cJSON_AddNumberToObject(search, "starts", (double)r->starts);
    cJSON_AddNumberToObject(search, "iterations", r->iterations);
    cJSON_AddBoolToObject(search, "converged", r->converged);
    add_num(search, "size", r->size);
    cJSON_AddNumberToObject(search, "size_tolerance", req->size_tolerance);
    cJSON_AddStringToObject(search, "note", r->note);
    cJSON_AddNumberToObject(search, "flights", (double)r->flights);
    cJSON_AddNumberToObject(search, "failed_flights", (double)r->failed);
    add_flight(doc, un, s, &r->flight, d);
    cJSON_AddItemToObject(doc, "units", un);
    const char *cautions[DRAGARC_CAUTIONS_MAX];
    add_caution_list(doc, cautions, dragarc_cautions_optimum(r->flight.notes, cautions, DRAGARC_CAUTIONS_MAX));
    return finish(doc);
}

char *dragarc_aim_json(const dragarc_scenario *s, const dragarc_aim_request *req, const dragarc_aim_result *r,
                       const dragarc_display *d)
{
    dragarc_display si;
    cJSON *un, *doc = begin(s, &d, &si, &un);
    if (!doc)
        return NULL;
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
    cJSON *un, *doc = begin(NULL, &d, &si, &un);
    if (!doc)
        return NULL;
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

char *dragarc_sprinkler_json(const dragarc_sprinkler_spec *spec, const dragarc_spectrum_class *classes,
                             const dragarc_sprinkler_result *r)
{
    cJSON *doc = start(spec->base.name);
    if (!doc)
        return NULL;
    cJSON *nz = cJSON_AddObjectToObject(doc, "nozzle");
    add_num(nz, "exit_speed", r->exit_speed);
    add_num(nz, "flow", r->flow);
    add_num(nz, "height", spec->base.launch.height);
    add_num(nz, "elevation", spec->base.launch.elevation / DRAGARC_DEG);
    cJSON *sum = cJSON_AddObjectToObject(doc, "summary");
    add_num(sum, "wetted_radius", r->wetted_radius);
    add_num(sum, "deposited_fraction", r->deposited_fraction);
    add_num(sum, "evaporated_fraction", r->evaporated_fraction);
    cJSON_AddNumberToObject(sum, "failed_flights", (double)r->nfailed);
    cJSON *cl = cJSON_AddArrayToObject(doc, "classes");
    for (size_t i = 0; i < r->nclasses; i++) {
        dragarc_sprinkler_class_stats st;
        dragarc_sprinkler_class_summary(r, i, &st);
        cJSON *o = cJSON_CreateObject();
        add_num(o, "diameter", classes[i].diameter);
        add_num(o, "fraction", classes[i].fraction);
        add_num(o, "distance", st.distance);
        add_num(o, "distance_min", st.distance_min);
        add_num(o, "distance_max", st.distance_max);
        add_num(o, "time", st.time);
        add_num(o, "water_left", st.water_left);
        cJSON_AddItemToArray(cl, o);
    }
    if (r->layout_done) {
        static const char *const KIND[] = {"square", "rectangular", "triangular"};
        cJSON *lo = cJSON_AddObjectToObject(doc, "layout");
        cJSON_AddStringToObject(lo, "kind", KIND[r->layout.kind]);
        add_num(lo, "spacing", r->layout.spacing);
        add_num(lo, "row_spacing", r->layout.row_spacing);
        add_num(lo, "cell_width", r->cell_width);
        add_num(lo, "cell_height", r->cell_height);
        cJSON_AddNumberToObject(lo, "points", (double)(r->layout_points * r->layout_points));
        add_num(lo, "mean_rate", r->layout_stats.mean);
        add_num(lo, "cu", r->layout_stats.cu);
        add_num(lo, "du_lq", r->layout_stats.du_lq);
        add_num(lo, "cv", r->layout_stats.cv);
    }
    cJSON *prof = cJSON_AddArrayToObject(doc, "radial_profile");
    for (size_t k = 0; k < r->nrings; k++) {
        cJSON *o = cJSON_CreateObject();
        add_num(o, "r_inner", k * spec->ring_width);
        add_num(o, "r_outer", (k + 1) * spec->ring_width);
        add_num(o, "rate", r->ring_rate[k]);
        cJSON_AddItemToArray(prof, o);
    }
    static const char *const U[][2] = {{"exit_speed", "m/s"}, {"flow", "m3/s"}, {"height", "m"},
                                       {"elevation", "degree"}, {"wetted_radius", "m"}, {"diameter", "m"},
                                       {"distance", "m"}, {"time", "s"}, {"r_inner", "m"}, {"r_outer", "m"},
                                       {"rate", "mm/h"}};
    add_units(doc, U, sizeof U / sizeof U[0]);
    add_cautions(doc, r->notes | DRAGARC_NOTE_IRRIGATION);
    return finish(doc);
}

char *dragarc_drift_json(const dragarc_drift_spec *spec, const dragarc_drift_result *r)
{
    static const char *const OUTCOME[] = {"landed", "evaporated", "aloft", "failed"};
    cJSON *doc = start(spec->base.name);
    if (!doc)
        return NULL;
    cJSON *sum = cJSON_AddObjectToObject(doc, "summary");
    add_num(sum, "downwind_direction", r->wind_toward / DRAGARC_DEG);
    add_num(sum, "deposited_fraction", r->deposited_fraction);
    add_num(sum, "evaporated_fraction", r->evaporated_fraction);
    add_num(sum, "aloft_fraction", r->aloft_fraction);
    add_num(sum, "failed_fraction", r->failed_fraction);
    add_num(sum, "distance90", r->distance90);
    add_num(sum, "distance99", r->distance99);
    add_num(sum, "buffer", r->buffer);
    add_num(sum, "beyond_buffer", r->beyond_buffer);
    add_num(sum, "diameter_at_buffer", r->diameter_at_buffer);
    cJSON *cl = cJSON_AddArrayToObject(doc, "classes");
    for (size_t i = 0; i < r->nclasses; i++) {
        const dragarc_drift_class *c = &r->classes[i];
        cJSON *o = cJSON_CreateObject();
        add_num(o, "diameter", c->diameter);
        add_num(o, "fraction", c->fraction);
        cJSON_AddStringToObject(o, "outcome", OUTCOME[c->outcome]);
        add_num(o, "downwind", c->outcome <= DRAGARC_DRIFT_EVAPORATED ? c->downwind : NAN);
        add_num(o, "crosswind", c->outcome <= DRAGARC_DRIFT_EVAPORATED ? c->crosswind : NAN);
        add_num(o, "time", c->time);
        add_num(o, "water_left", c->outcome == DRAGARC_DRIFT_LANDED ? c->water_left : 0.0);
        cJSON_AddItemToArray(cl, o);
    }
    cJSON *dep = cJSON_AddArrayToObject(doc, "deposit");
    for (size_t b = 0; b < r->nbins; b++) {
        cJSON *o = cJSON_CreateObject();
        add_num(o, "from", r->first_bin + b * r->bin_width);
        add_num(o, "to", r->first_bin + (b + 1) * r->bin_width);
        add_num(o, "per_metre", r->deposit[b]);
        cJSON_AddItemToArray(dep, o);
    }
    static const char *const U[][2] = {{"downwind_direction", "degree"}, {"distance90", "m"}, {"distance99", "m"},
                                       {"buffer", "m"}, {"diameter_at_buffer", "m"}, {"diameter", "m"},
                                       {"downwind", "m"}, {"crosswind", "m"}, {"time", "s"}, {"from", "m"},
                                       {"to", "m"}, {"per_metre", "1/m"}};
    add_units(doc, U, sizeof U / sizeof U[0]);
    add_cautions(doc, r->notes | DRAGARC_NOTE_SPRAY_DRIFT);
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


/* The east and north of a point as an object, with its latitude and longitude when they can be had. */
static cJSON *place(const dragarc_footprint_spec *spec, double east, double north)
{
    cJSON *o = cJSON_CreateObject();
    double lat = NAN, lon = NAN;
    if (!(isfinite(east) && isfinite(north)) ||
        dragarc_geo_from_local(spec->breakup.latitude, spec->breakup.longitude, east, north, &lat, &lon, NULL) !=
            DRAGARC_OK)
        lat = lon = NAN;
    add_num(o, "east", east);
    add_num(o, "north", north);
    add_num(o, "latitude", lat);
    add_num(o, "longitude", lon);
    return o;
}

static cJSON *footprint_group(const dragarc_footprint_spec *spec, const dragarc_footprint_group *g, int hazard)
{
    cJSON *o = cJSON_CreateObject();
    cJSON_AddNumberToObject(o, "flights", (double)g->flights);
    cJSON_AddNumberToObject(o, "landed", (double)g->landed);
    add_num(o, "fragments", g->fragments);
    if (g->moments_ok) {
        cJSON_AddItemToObject(o, "mean_impact", place(spec, g->mean[0], g->mean[1]));
        cJSON *c = cJSON_AddObjectToObject(o, "covariance");
        add_num(c, "east_east", g->cov[0]);
        add_num(c, "east_north", g->cov[1]);
        add_num(c, "north_north", g->cov[2]);
    }
    if (g->ellipses_ok) {
        cJSON *el = cJSON_AddArrayToObject(o, "ellipses");
        for (int k = 0; k < 3; k++) {
            cJSON *e = cJSON_CreateObject();
            add_num(e, "sigma", g->ellipse[k].k_sigma);
            add_num(e, "probability", g->ellipse[k].probability);
            add_num(e, "inside", g->inside[k]);
            add_num(e, "semi_major", g->ellipse[k].semi_major);
            add_num(e, "semi_minor", g->ellipse[k].semi_minor);
            add_num(e, "azimuth", g->ellipse[k].azimuth / DRAGARC_DEG);
            cJSON_AddItemToArray(el, e);
        }
    }
    cJSON *q = cJSON_AddArrayToObject(o, "extent");
    for (int k = 0; k < DRAGARC_FOOTPRINT_NQ && g->landed > 0; k++) {
        cJSON *e = cJSON_CreateObject();
        add_num(e, "probability", dragarc_footprint_quantile_probs[k]);
        add_num(e, "downrange", g->down[k]);
        add_num(e, "crossrange", g->cross[k]);
        cJSON_AddItemToArray(q, e);
    }
    cJSON *vq = cJSON_AddArrayToObject(o, "impact_quantiles");
    for (int k = 0; k < DRAGARC_FOOTPRINT_NVQ && g->landed > 0; k++) {
        cJSON *e = cJSON_CreateObject();
        add_num(e, "probability", dragarc_footprint_value_probs[k]);
        add_num(e, "impact_speed", g->speed_q[k]);
        add_num(e, "impact_energy", g->energy_q[k]);
        cJSON_AddItemToArray(vq, e);
    }
    add_num(o, "impact_speed_median", g->speed_median);
    add_num(o, "impact_speed_max", g->speed_max);
    add_num(o, "impact_energy_mean", g->energy_mean);
    add_num(o, "impact_energy_median", g->energy_median);
    add_num(o, "impact_energy_max", g->energy_max);
    add_num(o, "time_median", g->time_median);
    add_num(o, "hazardous_share", g->hazardous_share);
    if (hazard)
        add_num(o, "expected_casualties", g->expected_casualties);
    return o;
}

/* The published casualty criteria, as references to compare with (not approvals). */
static void add_published_criteria(cJSON *doc)
{
    size_t nref = 0;
    const dragarc_risk_reference *refs = dragarc_casualty_references(&nref);
    cJSON *rf = cJSON_AddArrayToObject(doc, "published_criteria");
    for (size_t i = 0; i < nref; i++) {
        cJSON *o = cJSON_CreateObject();
        cJSON_AddStringToObject(o, "quantity", refs[i].quantity);
        add_num(o, "limit", refs[i].limit);
        cJSON_AddStringToObject(o, "source", refs[i].source);
        cJSON_AddItemToArray(rf, o);
    }
}

char *dragarc_footprint_json(const dragarc_footprint_spec *spec, const dragarc_impact *impacts,
                             const dragarc_footprint_summary *s)
{
    (void)impacts;
    cJSON *doc = start(spec->base.name);
    if (!doc)
        return NULL;
    const dragarc_breakup *b = &spec->breakup;
    cJSON *br = cJSON_AddObjectToObject(doc, "breakup");
    add_num(br, "latitude", b->latitude);
    add_num(br, "longitude", b->longitude);
    add_num(br, "altitude", b->altitude);
    cJSON_AddItemToObject(br, "velocity", vec3(b->velocity));
    cJSON *run = cJSON_AddObjectToObject(doc, "run");
    cJSON_AddNumberToObject(run, "samples", (double)spec->samples);
    cJSON_AddNumberToObject(run, "seed", (double)spec->seed);
    cJSON_AddNumberToObject(run, "classes", (double)spec->nclasses);
    const dragarc_footprint_group *all = &s->groups[spec->nclasses];
    cJSON *sum = cJSON_AddObjectToObject(doc, "summary");
    add_num(sum, "downrange_azimuth", s->azimuth / DRAGARC_DEG);
    cJSON_AddNumberToObject(sum, "flights", (double)all->flights);
    cJSON_AddNumberToObject(sum, "landed", (double)all->landed);
    add_num(sum, "fragments", all->fragments);
    add_num(sum, "hazard_energy", spec->hazard.energy_threshold);
    add_num(sum, "hazardous_share", all->hazardous_share);
    if (s->casualty_done) {
        add_num(sum, "expected_casualties", s->casualty.expected_casualties);
        if (spec->hazard.criterion > 0.0) {
            add_num(sum, "criterion", spec->hazard.criterion);
            cJSON_AddBoolToObject(sum, "within_criterion", s->casualty.expected_casualties <= spec->hazard.criterion);
        }
    }
    if (s->note[0])
        cJSON_AddStringToObject(sum, "note", s->note);
    cJSON *cl = cJSON_AddArrayToObject(doc, "classes");
    for (size_t i = 0; i < spec->nclasses; i++) {
        const dragarc_fragment_class *c = &spec->classes[i];
        cJSON *o = footprint_group(spec, &s->groups[i], s->casualty_done);
        cJSON_AddStringToObject(o, "name", c->name);
        add_num(o, "count", c->count);
        add_num(o, "mass", c->mass);
        add_num(o, "area", c->area);
        add_num(o, "ballistic_coefficient", dragarc_fragment_beta(c));
        cJSON_AddItemToArray(cl, o);
    }
    cJSON_AddItemToObject(doc, "all", footprint_group(spec, all, s->casualty_done));
    cJSON *ct = cJSON_AddArrayToObject(doc, "contours");
    for (int k = 0; k < DRAGARC_FOOTPRINT_NREGIONS && s->grid_ok; k++) {
        cJSON *o = cJSON_CreateObject();
        add_num(o, "probability", s->region[k].probability);
        add_num(o, "fraction", s->region[k].fraction);
        add_num(o, "area", s->region[k].area);
        add_num(o, "density_threshold", s->region[k].density_threshold);
        cJSON_AddNumberToObject(o, "polygons", (double)s->region[k].npolygons);
        cJSON_AddItemToArray(ct, o);
    }
    if (s->grid_ok)
        add_num(doc, "grid_cell", s->grid.cell);
    add_published_criteria(doc);
    static const char *const U[][2] = {
        {"latitude", "degree"}, {"longitude", "degree"}, {"altitude", "m"}, {"velocity", "m/s"},
        {"downrange_azimuth", "degree"}, {"hazard_energy", "J"}, {"east", "m"}, {"north", "m"},
        {"covariance", "m^2"}, {"semi_major", "m"}, {"semi_minor", "m"}, {"azimuth", "degree"},
        {"downrange", "m"}, {"crossrange", "m"}, {"impact_speed_median", "m/s"}, {"impact_speed_max", "m/s"},
        {"impact_energy_mean", "J"}, {"impact_energy_median", "J"}, {"impact_energy_max", "J"},
        {"time_median", "s"}, {"impact_speed", "m/s"}, {"impact_energy", "J"}, {"mass", "kg"}, {"area", "m^2"}, {"ballistic_coefficient", "kg/m^2"},
        {"density_threshold", "1/km^2"}, {"grid_cell", "m"}};
    add_units(doc, U, sizeof U / sizeof U[0]);
    add_cautions(doc, DRAGARC_NOTE_DEBRIS);
    return finish(doc);
}

/* ---- campaigns of footprint cases ---- */

char *dragarc_campaign_json(const dragarc_campaign *c, const dragarc_campaign_row *rows, size_t n)
{
    cJSON *doc = cJSON_CreateObject();
    if (!doc)
        return NULL;
    cJSON_AddStringToObject(doc, "campaign", c->name);
    cJSON_AddStringToObject(doc, "dragarc_version", DRAGARC_VERSION_STRING);
    cJSON *cases = cJSON_AddArrayToObject(doc, "cases");
    for (size_t i = 0; i < n; i++) {
        const dragarc_campaign_row *r = &rows[i];
        cJSON *o = cJSON_CreateObject();
        cJSON_AddStringToObject(o, "name", r->name);
        cJSON_AddStringToObject(o, "folder", r->folder);
        cJSON *b = cJSON_AddObjectToObject(o, "breakup");
        add_num(b, "latitude", r->latitude);
        add_num(b, "longitude", r->longitude);
        add_num(b, "altitude", r->altitude);
        add_num(b, "speed", r->speed);
        cJSON_AddNumberToObject(o, "samples", (double)r->samples);
        cJSON_AddNumberToObject(o, "seed", (double)r->seed);
        cJSON_AddNumberToObject(o, "flights", (double)r->flights);
        cJSON_AddNumberToObject(o, "landed", (double)r->landed);
        add_num(o, "fragments", r->fragments);
        if (r->mean_ok) {
            cJSON *m = cJSON_AddObjectToObject(o, "mean_impact");
            add_num(m, "east", r->mean_east);
            add_num(m, "north", r->mean_north);
            add_num(m, "latitude", r->mean_latitude);
            add_num(m, "longitude", r->mean_longitude);
        }
        if (r->ellipse_ok) {
            cJSON *e = cJSON_AddObjectToObject(o, "ellipse_1sigma");
            add_num(e, "semi_major", r->semi_major);
            add_num(e, "semi_minor", r->semi_minor);
            add_num(e, "azimuth", r->azimuth / DRAGARC_DEG);
        }
        add_num(o, "hazardous_share", r->hazardous_share);
        add_num(o, "impact_energy_max", r->energy_max);
        if (r->casualty_done) {
            add_num(o, "expected_casualties", r->expected_casualties);
            if (r->criterion > 0.0) {
                add_num(o, "criterion", r->criterion);
                cJSON_AddBoolToObject(o, "within_criterion", r->expected_casualties <= r->criterion);
            }
        }
        if (r->note[0])
            cJSON_AddStringToObject(o, "note", r->note);
        cJSON_AddItemToArray(cases, o);
    }
    add_published_criteria(doc);
    static const char *const U[][2] = {{"latitude", "degree"}, {"longitude", "degree"}, {"altitude", "m"},
                                       {"speed", "m/s"},       {"east", "m"},          {"north", "m"},
                                       {"semi_major", "m"},    {"semi_minor", "m"},    {"azimuth", "degree"},
                                       {"impact_energy_max", "J"}};
    add_units(doc, U, sizeof U / sizeof U[0]);
    add_cautions(doc, DRAGARC_NOTE_DEBRIS);
    return finish(doc);
}

/* ---- fits to measured tracks ---- */

/* The RMS residuals east, north, up and all three together. */
static cJSON *rms_object(const double *v)
{
    cJSON *o = cJSON_CreateObject();
    add_num(o, "east", v[0]);
    add_num(o, "north", v[1]);
    add_num(o, "up", v[2]);
    add_num(o, "all", v[3]);
    return o;
}

char *dragarc_fit_json(const char *scenario, const char *track_file, const dragarc_track *track,
                       const dragarc_fit_result *r)
{
    cJSON *doc = start(scenario);
    if (!doc)
        return NULL;
    cJSON *tr = cJSON_AddObjectToObject(doc, "track");
    cJSON_AddStringToObject(tr, "file", track_file);
    cJSON_AddNumberToObject(tr, "points", (double)r->npoints);
    cJSON_AddNumberToObject(tr, "residuals", (double)r->nresiduals);
    cJSON_AddBoolToObject(tr, "velocities", track->vel != NULL);
    cJSON_AddBoolToObject(tr, "weighted", r->weighted);
    add_num(tr, "first_time", track->n ? track->t[0] : NAN);
    add_num(tr, "last_time", track->n ? track->t[track->n - 1] : NAN);
    cJSON_AddStringToObject(doc, "method", r->accel_used ? "levenberg-marquardt with geodesic acceleration"
                                                          : "levenberg-marquardt");
    cJSON_AddBoolToObject(doc, "converged", r->converged);
    cJSON_AddStringToObject(doc, "start", r->start_from_track ? "track" : "scenario");
    cJSON_AddNumberToObject(doc, "iterations", r->iterations);
    cJSON_AddNumberToObject(doc, "flights", (double)r->flights);
    cJSON *est = cJSON_AddArrayToObject(doc, "estimates");
    for (int k = 0; k < r->np; k++) {
        const int p = r->param[k];
        cJSON *e = cJSON_CreateObject();
        cJSON_AddStringToObject(e, "name", dragarc_fit_param_name(r->param[k]));
        cJSON_AddStringToObject(e, "unit", dragarc_fit_param_unit(p));
        add_num(e, "start", dragarc_fit_param_shown(p, r->start[k]));
        add_num(e, "value", dragarc_fit_param_shown(p, r->value[k]));
        add_num(e, "std_error", dragarc_fit_param_shown(p, r->se[k]));
        add_num(e, "lower_95", dragarc_fit_param_shown(p, r->lower[k]));
        add_num(e, "upper_95", dragarc_fit_param_shown(p, r->upper[k]));
        cJSON_AddBoolToObject(e, "at_limit", (r->at_limit >> k) & 1u);
        cJSON_AddItemToArray(est, e);
    }
    cJSON *corr = cJSON_AddArrayToObject(doc, "correlation");
    for (int i = 0; i < r->np; i++) {
        cJSON *row = cJSON_CreateArray();
        for (int j = 0; j < r->np; j++) {
            double v = r->corr[i * r->np + j];
            cJSON_AddItemToArray(row, isfinite(v) ? cJSON_CreateNumber(v) : cJSON_CreateNull());
        }
        cJSON_AddItemToArray(corr, row);
    }
    cJSON_AddNumberToObject(doc, "degrees_of_freedom", (double)r->dof);
    add_num(doc, "chi_square", r->chisq);
    add_num(doc, "chi_square_p", r->chisq_p);
    add_num(doc, "residual_sd", r->sigma);
    cJSON *rm = cJSON_AddObjectToObject(doc, "rms_residual");
    cJSON_AddItemToObject(rm, "position", rms_object(r->rms_pos));
    cJSON_AddItemToObject(rm, "velocity", track->vel ? rms_object(r->rms_vel) : cJSON_CreateNull());
    cJSON *cond = cJSON_AddObjectToObject(doc, "conditioning");
    add_num(cond, "rcond", r->rcond);
    cJSON *weak = cJSON_AddObjectToObject(cond, "weakest_combination");
    for (int k = 0; k < r->np; k++)
        add_num(weak, dragarc_fit_param_name(r->param[k]), r->weak_direction[k]);
    cJSON *units = cJSON_AddObjectToObject(doc, "units");
    cJSON_AddStringToObject(units, "rms_residual.position", "m");
    cJSON_AddStringToObject(units, "rms_residual.velocity", "m/s");
    cJSON_AddStringToObject(units, "residual_sd", "m");
    char warn[8][512];
    size_t nw = dragarc_fit_warnings(r, warn, 8);
    cJSON *wa = cJSON_AddArrayToObject(doc, "warnings");
    for (size_t i = 0; i < nw; i++)
        cJSON_AddItemToArray(wa, cJSON_CreateString(warn[i]));
    const char *cautions[DRAGARC_CAUTIONS_MAX];
    add_caution_list(doc, cautions, dragarc_cautions_fit(cautions, DRAGARC_CAUTIONS_MAX));
    return finish(doc);
}
