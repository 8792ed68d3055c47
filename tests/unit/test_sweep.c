/* test_sweep.c: tables of flights: parameters set by name, value ranges, the parallel loop and its rows.
 * SPDX-License-Identifier: GPL-3.0-or-later
 */
#include <omp.h>
#include <stdlib.h>

#include "check.h"
#include "helpers.h"
#include "dragarc/sweep.h"

/* A 145 g, 74 mm ball with constant Cd 0.35 in the ISA with a 3 m/s wind from the west: every
 * parameter of dragarc_scenario_params applies to it. */
static void ball(dragarc_scenario *s)
{
    make_scenario(s, 0.0, 0.145, 0.074, 1.0, 40.0, 30.0, 9.80665, 1e-9);
    s->atmosphere.model = DRAGARC_ATMOSPHERE_ISA;
    s->atmosphere.site_elevation = 0.0;
    s->atmosphere.temperature_offset = 0.0;
    s->projectile.drag.model = DRAGARC_DRAG_CONSTANT;
    s->projectile.drag.cd = 0.35;
    s->wind.model = DRAGARC_WIND_CONSTANT;
    s->wind.speed = 3.0;
    s->wind.from = 270.0 * DEG;
}

static void axis(dragarc_sweep_axis *a, const char *name, double start, double stop, double step)
{
    dragarc_error e;
    int rc = dragarc_sweep_axis_init(a, name, start, stop, step, &e);
    if (rc != DRAGARC_OK)
        printf("  axis %s: %s: %s\n", name, e.field, e.message);
    CHECK(rc == DRAGARC_OK);
}

/* Bitwise equality of two doubles (NaN equals NaN). */
static int same(double a, double b) { return memcmp(&a, &b, sizeof a) == 0; }

static int same_summary(const dragarc_sweep_row *r, const dragarc_flight *f)
{
    return same(r->range, f->range) && same(r->downrange, f->downrange) && same(r->crossrange, f->crossrange) &&
           same(r->time_of_flight, f->time_of_flight) && same(r->apex_height, f->apex_height) &&
           same(r->impact_speed, f->impact_speed) && same(r->impact_angle, f->impact_angle) &&
           same(r->impact_energy, f->impact_energy) && same(r->terminal_speed, f->terminal_speed) &&
           r->notes == f->notes;
}

static int same_row(const dragarc_sweep_row *a, const dragarc_sweep_row *b, size_t naxes)
{
    for (size_t k = 0; k < naxes; k++)
        if (!same(a->values[k], b->values[k]))
            return 0;
    if (a->status != b->status || !same(a->range, b->range) || !same(a->downrange, b->downrange) ||
        !same(a->crossrange, b->crossrange) || !same(a->time_of_flight, b->time_of_flight) ||
        !same(a->apex_height, b->apex_height) || !same(a->impact_speed, b->impact_speed) ||
        !same(a->impact_angle, b->impact_angle) || !same(a->impact_energy, b->impact_energy) ||
        !same(a->terminal_speed, b->terminal_speed) || a->notes != b->notes)
        return 0;
    if (!a->error != !b->error)
        return 0;
    return !a->error ||
           (strcmp(a->error->field, b->error->field) == 0 && strcmp(a->error->message, b->error->message) == 0);
}

TEST(a_two_parameter_table_equals_the_flights_flown_one_by_one)
{
    dragarc_scenario s;
    ball(&s);
    dragarc_sweep_axis ax[2];
    axis(&ax[0], "speed", 30.0, 40.0, 5.0);
    axis(&ax[1], "launch.elevation", 20.0, 40.0, 10.0);
    dragarc_sweep t;
    CHECK(dragarc_sweep_run(&s, ax, 2, &t, NULL) == DRAGARC_OK);
    CHECK(t.nrows == 9 && t.nfailed == 0 && t.naxes == 2);
    for (size_t i = 0; i < 3 && t.nrows == 9; i++)
        for (size_t j = 0; j < 3; j++) {
            const dragarc_sweep_row *r = &t.rows[3 * i + j]; /* the first axis varies slowest */
            double v = 30.0 + 5.0 * (double)i, el = 20.0 + 10.0 * (double)j;
            CHECK(r->values[0] == v && r->values[1] == el);
            dragarc_scenario one = s;
            one.launch.speed = v;
            one.launch.elevation = el * DEG;
            dragarc_flight f;
            CHECK(dragarc_flight_run(&one, 0.0, &f, NULL) == DRAGARC_OK);
            CHECK(r->status == DRAGARC_OK && r->error == NULL);
            CHECK(same_summary(r, &f));
            dragarc_flight_clear(&f);
        }
    dragarc_sweep_clear(&t);
    CHECK(t.rows == NULL && t.nrows == 0);
    dragarc_sweep_clear(&t); /* twice is harmless */
    dragarc_sweep_clear(NULL);
}

TEST(a_drag_free_table_of_elevations_gives_the_vacuum_range)
{
    /* Source: constant-acceleration kinematics without air (exact): from level ground, range
     * v^2 sin(2 theta) / g, apex v^2 sin^2(theta) / (2 g), time 2 v sin(theta) / g. With rtol = atol =
     * 1e-10 the integrator and its root finder keep 1e-8 relative (see test_closed_forms.c). */
    dragarc_scenario s;
    make_scenario(&s, 0.0, 0.2, 0.05, 0.0, 50.0, 45.0, 9.81, 1e-10);
    dragarc_sweep_axis ax;
    axis(&ax, "elevation", 15.0, 75.0, 15.0);
    dragarc_sweep t;
    CHECK(dragarc_sweep_run(&s, &ax, 1, &t, NULL) == DRAGARC_OK);
    CHECK(t.nrows == 5 && t.nfailed == 0);
    for (size_t i = 0; i < t.nrows; i++) {
        double th = t.rows[i].values[0] * DEG;
        CHECK_REL(t.rows[i].range, 2500.0 * sin(2.0 * th) / 9.81, 1e-8);
        CHECK_REL(t.rows[i].apex_height, 2500.0 * sin(th) * sin(th) / (2.0 * 9.81), 1e-8);
        CHECK_REL(t.rows[i].time_of_flight, 2.0 * 50.0 * sin(th) / 9.81, 1e-8);
        CHECK(isnan(t.rows[i].terminal_speed));
    }
    /* complementary elevations carry equally far (same formula) */
    if (t.nrows == 5)
        CHECK_REL(t.rows[0].range, t.rows[4].range, 1e-8);
    dragarc_sweep_clear(&t);
}

/* A scenario whose flight reads a shared drag table and shared wind layers: a 1 mm sphere with a Cd
 * table against Reynolds number (values of the smooth-sphere curve, rounded) in a layered wind. */
static int shared_storage(dragarc_scenario *s)
{
    static const double re[] = {1.0, 10.0, 100.0, 1000.0, 10000.0};
    static const double cd[] = {26.5, 4.15, 1.09, 0.47, 0.41};
    make_scenario(s, 1.2, 5.2e-7, 0.001, 1.5, 6.0, 20.0, 9.80665, 1e-8);
    if (dragarc_drag_table_set(&s->projectile.drag, DRAGARC_AXIS_REYNOLDS, re, cd, 5, NULL) != DRAGARC_OK)
        return -1;
    s->wind.model = DRAGARC_WIND_LAYERED;
    s->wind.nlayers = 3;
    s->wind.layers = malloc(3 * sizeof *s->wind.layers);
    if (!s->wind.layers)
        return -1;
    const dragarc_wind_layer l[3] = {{0.5, 1.0, 200.0 * DEG}, {1.5, 2.5, 230.0 * DEG}, {3.0, 4.0, 260.0 * DEG}};
    memcpy(s->wind.layers, l, sizeof l);
    return 0;
}

/* 25 speeds (0 to 12 m/s) by 13 heights (-0.5 to 2.5 m): 325 rows, of which -0.5 and 0 m with a 0 m/s launch fail */
static void speed_height_axes(dragarc_sweep_axis ax[2])
{
    axis(&ax[0], "speed", 0.0, 12.0, 0.5);
    axis(&ax[1], "height", -0.5, 2.5, 0.25);
}

TEST(the_thread_count_changes_no_digit)
{
    dragarc_scenario s;
    CHECK(shared_storage(&s) == 0);
    dragarc_sweep_axis ax[2];
    speed_height_axes(ax); /* -0.5 and 0 with a 0 m/s launch fail: compared too */
    const double *x = s.projectile.drag.x;
    const dragarc_wind_layer *layers = s.wind.layers;
    dragarc_sweep one, two;
    omp_set_num_threads(1);
    CHECK(dragarc_sweep_run(&s, ax, 2, &one, NULL) == DRAGARC_OK);
    omp_set_num_threads(2);
    CHECK(dragarc_sweep_run(&s, ax, 2, &two, NULL) == DRAGARC_OK);
    CHECK(one.nrows == 25 * 13 && two.nrows == one.nrows);
    CHECK(one.nfailed > 0 && one.nfailed == two.nfailed && one.notes == two.notes);
    size_t differ = 0;
    for (size_t r = 0; r < one.nrows && one.nrows == two.nrows; r++)
        differ += !same_row(&one.rows[r], &two.rows[r], 2);
    CHECK(differ == 0);
    /* the rows only read the shared table and layers */
    CHECK(s.projectile.drag.x == x && s.wind.layers == layers && s.wind.layers[1].speed == 2.5);
    dragarc_sweep_clear(&one);
    dragarc_sweep_clear(&two);
    dragarc_scenario_clear(&s);
}

TEST(rows_flown_apart_make_the_whole_table)
{
    /* what an MPI run relies on (docs/cluster.md): row r depends on r alone, whatever range or step it is flown in;
     * the failing rows fall in every part */
    dragarc_scenario s;
    CHECK(shared_storage(&s) == 0);
    dragarc_sweep_axis ax[2];
    speed_height_axes(ax);
    dragarc_sweep whole, pieced, dealt;
    CHECK(dragarc_sweep_run(&s, ax, 2, &whole, NULL) == DRAGARC_OK);
    CHECK(dragarc_sweep_init(&s, ax, 2, &pieced, NULL) == DRAGARC_OK);
    CHECK(dragarc_sweep_init(&s, ax, 2, &dealt, NULL) == DRAGARC_OK);
    CHECK(pieced.nrows == 325 && pieced.nfailed == 0 && pieced.rows[7].status == DRAGARC_OK);
    const size_t cut[] = {0, 1, 14, 200, 325, 325};
    for (size_t b = 0; b + 1 < sizeof cut / sizeof cut[0]; b++) {
        omp_set_num_threads(1 + (int)(b % 2));
        CHECK(dragarc_sweep_run_range(&s, ax, 2, cut[b], cut[b + 1], 1, pieced.rows + cut[b], NULL, NULL, NULL) ==
              DRAGARC_OK);
    }
    /* dealt to 4 "processes", every 4th row each, put back at their row numbers */
    dragarc_sweep_row part[82];
    for (size_t r = 0; r < 4; r++) {
        CHECK(dragarc_sweep_run_range(&s, ax, 2, r, 325, 4, part, NULL, NULL, NULL) == DRAGARC_OK);
        for (size_t j = 0; r + 4 * j < 325; j++)
            dealt.rows[r + 4 * j] = part[j];
    }
    dragarc_sweep_tally(&pieced);
    dragarc_sweep_tally(&dealt);
    CHECK(pieced.nfailed > 0 && pieced.nfailed == whole.nfailed && pieced.notes == whole.notes);
    CHECK(dealt.nfailed == whole.nfailed && dealt.notes == whole.notes);
    size_t differ = 0;
    for (size_t r = 0; r < whole.nrows; r++)
        differ += !same_row(&whole.rows[r], &pieced.rows[r], 2) + !same_row(&whole.rows[r], &dealt.rows[r], 2);
    CHECK(differ == 0);
    dragarc_error e;
    dragarc_sweep_row row;
    CHECK_ERROR(dragarc_sweep_run_range(&s, ax, 2, 3, 2, 1, &row, NULL, NULL, &e), DRAGARC_EINVAL, e, "", "not within");
    CHECK_ERROR(dragarc_sweep_run_range(&s, ax, 2, 325, 326, 1, &row, NULL, NULL, &e), DRAGARC_EINVAL, e, "",
                "not within the table's 325");
    CHECK_ERROR(dragarc_sweep_run_range(&s, ax, 2, 0, 1, 0, &row, NULL, NULL, &e), DRAGARC_EINVAL, e, "", "by 0");
    CHECK_ERROR(dragarc_sweep_run_range(&s, ax, 0, 0, 1, 1, &row, NULL, NULL, &e), DRAGARC_EINVAL, e, "", "1 to 3");
    dragarc_sweep_clear(&whole);
    dragarc_sweep_clear(&pieced);
    dragarc_sweep_clear(&dealt);
    dragarc_scenario_clear(&s);
}

/* What a progress callback saw: how often it was called, the last count, whether the counts stayed within the
 * total, and whether two calls ever overlapped. */
typedef struct progress_log {
    size_t calls, last, total, most;
    int beyond, inside, overlapped;
} progress_log;

static void log_progress(size_t done, size_t total, void *user)
{
    progress_log *l = user;
    if (l->inside++)
        l->overlapped = 1;
    l->calls++;
    l->last = done, l->total = total;
    l->most = done > l->most ? done : l->most;
    if (done == 0 || done > total)
        l->beyond = 1;
    l->inside--;
}

TEST(a_progress_callback_sees_every_row_done_and_changes_no_digit)
{
    dragarc_scenario s;
    CHECK(shared_storage(&s) == 0);
    dragarc_sweep_axis ax[2];
    speed_height_axes(ax);
    for (int threads = 1; threads <= 2; threads++) {
        omp_set_num_threads(threads);
        dragarc_sweep plain, watched;
        progress_log l = {0};
        CHECK(dragarc_sweep_run(&s, ax, 2, &plain, NULL) == DRAGARC_OK);
        CHECK(dragarc_sweep_run_progress(&s, ax, 2, log_progress, &l, &watched, NULL) == DRAGARC_OK);
        CHECK(watched.nrows == 325 && plain.nrows == watched.nrows && plain.nfailed == watched.nfailed);
        size_t differ = 0;
        for (size_t r = 0; r < plain.nrows && plain.nrows == watched.nrows; r++)
            differ += !same_row(&plain.rows[r], &watched.rows[r], 2);
        CHECK(differ == 0);
        /* every 16 rows and at the end: 325 / 16 = 20 calls and the last (325 is no multiple of 16) */
        CHECK(l.calls == 21 && l.most == 325 && l.total == 325 && !l.beyond && !l.overlapped);
        if (threads == 1)
            CHECK(l.last == 325);
        dragarc_sweep_clear(&plain);
        dragarc_sweep_clear(&watched);
    }
    /* a refused table calls nothing */
    dragarc_sweep_axis bad;
    axis(&bad, "cd", 0.3, 0.4, 0.1); /* the scenario's drag is a table, not the constant model */
    progress_log l = {0};
    dragarc_sweep t;
    CHECK(dragarc_sweep_run_progress(&s, &bad, 1, log_progress, &l, &t, NULL) == DRAGARC_EINVAL && l.calls == 0);
    dragarc_sweep_clear(&t);
    dragarc_scenario_clear(&s);
}

/* The field each parameter lands in, in its own units (degrees for angles). */
static double field_of(const dragarc_scenario *s, const char *path)
{
    if (strcmp(path, "launch.speed") == 0) return s->launch.speed;
    if (strcmp(path, "launch.elevation") == 0) return s->launch.elevation / DEG;
    if (strcmp(path, "launch.azimuth") == 0) return s->launch.azimuth / DEG;
    if (strcmp(path, "launch.height") == 0) return s->launch.height;
    if (strcmp(path, "environment.wind.speed") == 0) return s->wind.speed;
    if (strcmp(path, "environment.wind.from") == 0) return s->wind.from / DEG;
    if (strcmp(path, "projectile.mass") == 0) return s->projectile.mass;
    if (strcmp(path, "projectile.diameter") == 0) return s->projectile.diameter;
    if (strcmp(path, "projectile.drag.cd") == 0) return s->projectile.drag.cd;
    if (strcmp(path, "environment.atmosphere.site_elevation") == 0) return s->atmosphere.site_elevation;
    if (strcmp(path, "environment.atmosphere.temperature_offset") == 0) return s->atmosphere.temperature_offset;
    if (strcmp(path, "ground.elevation") == 0) return s->ground_elevation;
    if (strcmp(path, "environment.gravity") == 0) return s->gravity;
    if (strcmp(path, "launch.spin.rate") == 0) return s->launch.spin_rate * 60.0 / (2.0 * PI);
    if (strcmp(path, "launch.spin.tilt") == 0) return s->launch.spin_tilt / DEG;
    return NAN;
}

TEST(every_name_and_alias_sets_its_field)
{
    size_t n = 0;
    const dragarc_scenario_param *p = dragarc_scenario_params(&n);
    CHECK(n == 15);
    for (size_t i = 0; i < n; i++) {
        const char *names[2] = {p[i].path, p[i].alias};
        CHECK(dragarc_scenario_param_find(p[i].alias) == &p[i]);
        CHECK(strcmp(dragarc_scenario_param_path(p[i].alias), p[i].path) == 0);
        CHECK(strcmp(dragarc_scenario_param_path(p[i].path), p[i].path) == 0);
        for (int k = 0; k < 2; k++) {
            dragarc_scenario s;
            ball(&s);
            double v = 1.25 + (double)i, got = NAN;
            dragarc_error e = {0};
            int rc = dragarc_scenario_set(&s, names[k], v, &e);
            if (rc != DRAGARC_OK)
                printf("  %s: %s: %s\n", names[k], e.field, e.message);
            CHECK(rc == DRAGARC_OK);
            CHECK_REL(field_of(&s, p[i].path), v, 1e-15); /* degrees -> radians -> degrees: round-off only */
            CHECK(dragarc_scenario_get(&s, names[k], &got, NULL) == DRAGARC_OK);
            CHECK_REL(got, v, 1e-15);
        }
    }
    CHECK(dragarc_scenario_param_find("Speed") == NULL); /* names are case-sensitive */
    CHECK(dragarc_scenario_param_path("launch") == NULL);
    CHECK(dragarc_scenario_param_find(NULL) == NULL);
    /* the angles are stored in radians: exactly value * pi / 180 */
    dragarc_scenario s;
    ball(&s);
    CHECK(dragarc_scenario_set(&s, "elevation", 30.0, NULL) == DRAGARC_OK);
    CHECK(s.launch.elevation == 30.0 * DEG);
}

TEST(a_new_diameter_keeps_the_body_geometrically_similar)
{
    dragarc_scenario s;
    ball(&s);
    s.projectile.area = 4.0e-3; /* given, not pi d^2 / 4: the scaling must keep the ratio */
    s.projectile.volume = 2.0e-4;
    CHECK(dragarc_scenario_set(&s, "diameter", 0.148, NULL) == DRAGARC_OK); /* twice the diameter */
    CHECK_REL(s.projectile.area, 4.0 * 4.0e-3, 1e-15);
    CHECK_REL(s.projectile.volume, 8.0 * 2.0e-4, 1e-15);
    CHECK(s.projectile.mass == 0.145); /* a given mass stays */
    CHECK(s.projectile.diameter == 0.148);

    /* a mass given as density follows the volume */
    make_scenario(&s, 1.2, 998.2 * PI * 1e-9 / 6.0, 0.001, 1.0, 5.0, 10.0, 9.80665, 1e-8);
    s.projectile.density = 998.2;
    CHECK(dragarc_scenario_set(&s, "projectile.diameter", 0.0005, NULL) == DRAGARC_OK);
    CHECK_REL(s.projectile.volume, PI * 0.0005 * 0.0005 * 0.0005 / 6.0, 1e-15);
    CHECK_REL(s.projectile.area, 0.25 * PI * 0.0005 * 0.0005, 1e-15);
    CHECK(s.projectile.mass == 998.2 * s.projectile.volume);

    /* a new mass is given, not derived: the density goes, and a later diameter leaves the mass */
    CHECK(dragarc_scenario_set(&s, "mass", 1e-6, NULL) == DRAGARC_OK);
    CHECK(s.projectile.density == 0.0 && s.projectile.mass == 1e-6);
    CHECK(dragarc_scenario_set(&s, "diameter", 0.002, NULL) == DRAGARC_OK);
    CHECK(s.projectile.mass == 1e-6);

    /* with no diameter to scale from, the sphere's area and volume */
    s.projectile.diameter = 0.0;
    CHECK(dragarc_scenario_set(&s, "diameter", 0.01, NULL) == DRAGARC_OK);
    CHECK_REL(s.projectile.area, 0.25 * PI * 1e-4, 1e-15);
    CHECK_REL(s.projectile.volume, PI * 1e-6 / 6.0, 1e-15);

    /* a diameter that is not positive is refused and changes nothing */
    dragarc_scenario before = s;
    dragarc_error e;
    CHECK(dragarc_scenario_set(&s, "diameter", 0.0, &e) == DRAGARC_EINVAL);
    CHECK(strcmp(e.field, "projectile.diameter") == 0);
    CHECK(s.projectile.area == before.projectile.area && s.projectile.diameter == before.projectile.diameter);
}

TEST(unknown_names_are_refused_with_the_accepted_ones)
{
    dragarc_scenario s;
    ball(&s);
    dragarc_error e;
    CHECK(dragarc_scenario_set(&s, "spede", 1.0, &e) == DRAGARC_EINVAL);
    CHECK(e.field[0] == '\0');
    CHECK(strstr(e.message, "unknown parameter 'spede'") != NULL);
    CHECK(strstr(e.message, "speed, elevation, azimuth, height, wind_speed, wind_from, mass, diameter, cd, "
                            "site_elevation, temperature_offset, ground_elevation, gravity, spin_rate, "
                            "spin_tilt") != NULL);
    double v;
    CHECK(dragarc_scenario_get(&s, "launch.sped", &v, &e) == DRAGARC_EINVAL);
    dragarc_sweep_axis a;
    CHECK(dragarc_sweep_axis_init(&a, "solver.rtol", 1e-8, 1e-6, 1e-7, &e) == DRAGARC_EINVAL);
    CHECK(strstr(e.message, "unknown parameter 'solver.rtol'") != NULL);
    CHECK(dragarc_sweep_axis_parse(&a, "spin=1:2:1", &e) == DRAGARC_EINVAL);
    CHECK(strstr(e.message, "unknown parameter 'spin'") != NULL);
}

TEST(cd_needs_the_constant_drag_model)
{
    dragarc_scenario s;
    ball(&s);
    s.projectile.drag.model = DRAGARC_DRAG_SPHERE;
    dragarc_error e;
    CHECK(dragarc_scenario_set(&s, "cd", 0.4, &e) == DRAGARC_EINVAL);
    CHECK(strcmp(e.field, "projectile.drag.cd") == 0);
    CHECK(strstr(e.message, "'sphere'") != NULL && strstr(e.message, "'constant'") != NULL);
    CHECK(s.projectile.drag.cd == 0.35);
    dragarc_sweep_axis a;
    axis(&a, "cd", 0.3, 0.5, 0.1);
    dragarc_sweep t;
    CHECK(dragarc_sweep_run(&s, &a, 1, &t, &e) == DRAGARC_EINVAL); /* refused before any flight */
    CHECK(strcmp(e.field, "projectile.drag.cd") == 0 && t.rows == NULL);
    dragarc_sweep_clear(&t);
}

TEST(wind_needs_one_speed_and_direction)
{
    dragarc_scenario s;
    ball(&s);
    dragarc_wind_layer layer = {10.0, 5.0, 0.0};
    s.wind.model = DRAGARC_WIND_LAYERED;
    s.wind.nlayers = 1;
    s.wind.layers = &layer;
    dragarc_error e;
    CHECK(dragarc_scenario_set(&s, "wind_speed", 2.0, &e) == DRAGARC_EINVAL);
    CHECK(strcmp(e.field, "environment.wind.speed") == 0 && strstr(e.message, "layered") != NULL);
    CHECK(dragarc_scenario_set(&s, "environment.wind.from", 90.0, &e) == DRAGARC_EINVAL);
    CHECK(strcmp(e.field, "environment.wind.from") == 0 && strstr(e.message, "layered") != NULL);
    CHECK(s.wind.model == DRAGARC_WIND_LAYERED && layer.speed == 5.0);

    /* power and log winds: the speed at ref_height */
    s.wind.model = DRAGARC_WIND_POWER;
    CHECK(dragarc_scenario_set(&s, "wind_speed", 2.0, NULL) == DRAGARC_OK && s.wind.speed == 2.0);
    s.wind.model = DRAGARC_WIND_LOG;
    CHECK(dragarc_scenario_set(&s, "wind_from", 90.0, NULL) == DRAGARC_OK && s.wind.from == 90.0 * DEG);

    /* no wind: a speed makes it a constant wind from 0 (north) unless a direction was set */
    ball(&s);
    dragarc_wind_default(&s.wind);
    double v = -1.0;
    CHECK(dragarc_scenario_get(&s, "wind_speed", &v, NULL) == DRAGARC_OK && v == 0.0);
    CHECK(dragarc_scenario_set(&s, "wind_speed", 4.0, NULL) == DRAGARC_OK);
    CHECK(s.wind.model == DRAGARC_WIND_CONSTANT && s.wind.speed == 4.0 && s.wind.from == 0.0);
    dragarc_wind_default(&s.wind);
    CHECK(dragarc_scenario_set(&s, "wind_from", 90.0, NULL) == DRAGARC_OK);
    CHECK(s.wind.model == DRAGARC_WIND_CONSTANT && s.wind.speed == 0.0); /* still air, now with a direction */
    CHECK(dragarc_scenario_set(&s, "wind_speed", 4.0, NULL) == DRAGARC_OK && s.wind.from == 90.0 * DEG);

    /* a table that varies only the direction of no wind is refused; with the speed it is fine */
    dragarc_wind_default(&s.wind);
    dragarc_sweep_axis ax[2];
    axis(&ax[0], "wind_from", 0.0, 90.0, 90.0);
    axis(&ax[1], "wind_speed", 0.0, 2.0, 2.0);
    CHECK(dragarc_sweep_check(&s, ax, 1, NULL, &e) == DRAGARC_EINVAL);
    CHECK(strcmp(e.field, "environment.wind.from") == 0 && strstr(e.message, "no wind") != NULL);
    size_t n = 0;
    CHECK(dragarc_sweep_check(&s, ax, 2, &n, NULL) == DRAGARC_OK && n == 4);
}

TEST(atmosphere_parameters_need_their_models)
{
    dragarc_scenario s;
    ball(&s);
    s.atmosphere.model = DRAGARC_ATMOSPHERE_EXPONENTIAL;
    dragarc_error e;
    CHECK(dragarc_scenario_set(&s, "temperature_offset", 5.0, &e) == DRAGARC_EINVAL);
    CHECK(strcmp(e.field, "environment.atmosphere.temperature_offset") == 0 && strstr(e.message, "'exponential'"));
    CHECK(dragarc_scenario_set(&s, "site_elevation", 500.0, NULL) == DRAGARC_OK);
    s.atmosphere.model = DRAGARC_ATMOSPHERE_CONSTANT;
    CHECK(dragarc_scenario_set(&s, "site_elevation", 500.0, &e) == DRAGARC_EINVAL);
    CHECK(strcmp(e.field, "environment.atmosphere.site_elevation") == 0);
}

TEST(values_must_be_finite_and_directions_within_a_turn)
{
    dragarc_scenario s;
    ball(&s);
    dragarc_error e;
    CHECK(dragarc_scenario_set(&s, "speed", NAN, &e) == DRAGARC_EINVAL && strcmp(e.field, "launch.speed") == 0);
    CHECK(dragarc_scenario_set(&s, "gravity", INFINITY, &e) == DRAGARC_EINVAL);
    CHECK(dragarc_scenario_set(&s, "azimuth", 360.5, &e) == DRAGARC_EINVAL && strstr(e.message, "-360 and 360"));
    CHECK(dragarc_scenario_set(&s, "wind_from", -361.0, &e) == DRAGARC_EINVAL);
    CHECK(dragarc_scenario_set(&s, "azimuth", -360.0, NULL) == DRAGARC_OK);
    CHECK(s.launch.speed == 40.0 && s.gravity == 9.80665);
}

/* A ball with backspin and the Sawicki et al. (2003) lift fit, read from scenario text as a user writes it. */
static int spinning_ball(dragarc_scenario *s, double rpm, double tilt)
{
    char text[512];
    snprintf(text, sizeof text,
             "{\"projectile\": {\"mass\": 0.145, \"diameter\": 0.074,"
             " \"drag\": {\"model\": \"constant\", \"cd\": 0.35},"
             " \"lift\": {\"model\": \"sawicki2003\"}},"
             " \"launch\": {\"speed\": 40, \"elevation\": 25, \"height\": 1,"
             " \"spin\": {\"rate\": %.17g, \"tilt\": %.17g}},"
             " \"solver\": {\"rtol\": 1e-9, \"atol\": 1e-9}}",
             rpm, tilt);
    dragarc_error e;
    int rc = dragarc_scenario_parse(text, NULL, NULL, s, &e);
    if (rc != DRAGARC_OK)
        printf("  scenario: %s: %s\n", e.field, e.message);
    return rc;
}

TEST(spin_rate_is_set_in_rpm_and_tilt_in_degrees_as_the_scenario_file_reads_them)
{
    /* A row of a spin table must be the flight of the scenario file that says the same spin: the rate in
     * rpm becomes rad/s and the tilt in degrees radians by the reader's own arithmetic, to the last bit. */
    dragarc_scenario base, file;
    CHECK(spinning_ball(&base, 0.0, 0.0) == DRAGARC_OK);
    CHECK(spinning_ball(&file, 2345.5, -7.25) == DRAGARC_OK);
    dragarc_scenario s = base;
    CHECK(dragarc_scenario_set(&s, "spin_rate", 2345.5, NULL) == DRAGARC_OK);
    CHECK(dragarc_scenario_set(&s, "launch.spin.tilt", -7.25, NULL) == DRAGARC_OK);
    CHECK(s.launch.spin_rate == file.launch.spin_rate && s.launch.spin_tilt == file.launch.spin_tilt);
    double v = NAN;
    CHECK(dragarc_scenario_get(&s, "spin_rate", &v, NULL) == DRAGARC_OK);
    CHECK_REL(v, 2345.5, 1e-15);
    CHECK(dragarc_scenario_get(&s, "spin_tilt", &v, NULL) == DRAGARC_OK);
    CHECK_REL(v, -7.25, 1e-15);

    dragarc_sweep_axis ax[2];
    axis(&ax[0], "spin_rate", 1000.0, 3000.0, 1000.0);
    axis(&ax[1], "spin_tilt", -10.0, 10.0, 20.0);
    dragarc_sweep t;
    CHECK(dragarc_sweep_run(&base, ax, 2, &t, NULL) == DRAGARC_OK);
    CHECK(t.nrows == 6 && t.nfailed == 0);
    for (size_t r = 0; r < t.nrows && t.nrows == 6; r++) {
        dragarc_scenario one;
        CHECK(spinning_ball(&one, t.rows[r].values[0], t.rows[r].values[1]) == DRAGARC_OK);
        dragarc_flight f;
        CHECK(dragarc_flight_run(&one, 0.0, &f, NULL) == DRAGARC_OK);
        CHECK(same_summary(&t.rows[r], &f));
        dragarc_flight_clear(&f);
        dragarc_scenario_clear(&one);
    }
    /* Backspin lifts the ball (Sawicki et al. 2003: C_L grows with the spin factor): more spin, higher apex;
     * a tilt to the right moves the landing to the right (positive crossrange), to the left the other way. */
    if (t.nrows == 6) {
        CHECK(t.rows[4].apex_height > t.rows[2].apex_height && t.rows[2].apex_height > t.rows[0].apex_height);
        CHECK(t.rows[1].crossrange > 0.0 && t.rows[0].crossrange < 0.0);
    }
    dragarc_sweep_clear(&t);
    dragarc_scenario_clear(&base);
    dragarc_scenario_clear(&file);
}

TEST(spin_parameters_need_a_spin_that_can_change_the_flight)
{
    dragarc_scenario s;
    CHECK(spinning_ball(&s, 0.0, 0.0) == DRAGARC_OK);
    dragarc_error e;
    dragarc_sweep_axis a;
    dragarc_sweep t;
    /* a tilt alone over a ball that does not spin changes nothing */
    axis(&a, "spin_tilt", -10.0, 10.0, 10.0);
    CHECK(dragarc_sweep_run(&s, &a, 1, &t, &e) == DRAGARC_EINVAL);
    CHECK(strcmp(e.field, "launch.spin.tilt") == 0 && strstr(e.message, "spin rate is 0") != NULL);
    dragarc_sweep_clear(&t);
    dragarc_sweep_axis two[2];
    axis(&two[0], "spin_tilt", -10.0, 10.0, 10.0);
    axis(&two[1], "spin_rate", 1000.0, 2000.0, 1000.0);
    dragarc_error none = {0};
    CHECK(dragarc_sweep_check(&s, two, 2, NULL, &none) == DRAGARC_OK);
    s.launch.spin_rate = 100.0;
    CHECK(dragarc_sweep_check(&s, &a, 1, NULL, &e) == DRAGARC_OK);
    /* no lift model: the spin changes nothing */
    s.projectile.lift.model = DRAGARC_LIFT_NONE;
    axis(&a, "spin_rate", 0.0, 3000.0, 1000.0);
    CHECK(dragarc_sweep_check(&s, &a, 1, NULL, &e) == DRAGARC_EINVAL);
    CHECK(strcmp(e.field, "launch.spin.rate") == 0 && strstr(e.message, "no lift model") != NULL);
    /* a spin vector fixes the axis: no tilt to set, and the rate may still change */
    s.projectile.lift.model = DRAGARC_LIFT_SAWICKI2003;
    s.launch.spin_axis_given = 1;
    s.launch.spin_axis[0] = 1.0;
    s.launch.spin_axis[1] = s.launch.spin_axis[2] = 0.0;
    CHECK(dragarc_scenario_set(&s, "spin_tilt", 5.0, &e) == DRAGARC_EINVAL);
    CHECK(strcmp(e.field, "launch.spin.tilt") == 0 && strstr(e.message, "launch.spin.vector") != NULL);
    CHECK(dragarc_scenario_set(&s, "spin_rate", 1500.0, NULL) == DRAGARC_OK);
    /* the tilt, like the other directions, within a turn at set(); the scenario check keeps it to +-180 */
    s.launch.spin_axis_given = 0;
    CHECK(dragarc_scenario_set(&s, "spin_tilt", 361.0, &e) == DRAGARC_EINVAL && strstr(e.message, "-360 and 360"));
    CHECK(dragarc_scenario_set(&s, "spin_tilt", 270.0, NULL) == DRAGARC_OK);
    CHECK(dragarc_scenario_check(&s, &e) == DRAGARC_EINVAL && strcmp(e.field, "launch.spin.tilt") == 0);
    /* the documented largest spin rate, 60000 rpm, is itself accepted; a little more is not */
    s.launch.spin_tilt = 0.0;
    CHECK(dragarc_scenario_set(&s, "spin_rate", 60000.0, NULL) == DRAGARC_OK);
    CHECK(dragarc_scenario_check(&s, &e) == DRAGARC_OK);
    CHECK(dragarc_scenario_set(&s, "spin_rate", 60000.001, NULL) == DRAGARC_OK);
    CHECK(dragarc_scenario_check(&s, &e) == DRAGARC_EINVAL && strcmp(e.field, "launch.spin.rate") == 0);
    dragarc_scenario_clear(&s);
}

static size_t count_of(const char *spec)
{
    dragarc_sweep_axis a;
    dragarc_error e;
    if (dragarc_sweep_axis_parse(&a, spec, &e) != DRAGARC_OK) {
        printf("  %s: %s: %s\n", spec, e.field, e.message);
        return 0;
    }
    return a.count;
}

TEST(ranges_include_stop_within_rounding)
{
    CHECK(count_of("speed=0:1:0.1") == 11);
    CHECK(count_of("speed=0:0.9:0.3") == 4);    /* 0.9 / 0.3 = 2.9999999999999996 */
    CHECK(count_of("speed=0:1:0.3") == 4);      /* 0, 0.3, 0.6, 0.9: stop not reached */
    CHECK(count_of("speed=0:1:0.7") == 2);
    CHECK(count_of("elevation=10:0:-2.5") == 5);
    CHECK(count_of("speed=5:5:1") == 1);
    CHECK(count_of("speed=5:5:-1") == 1);
    CHECK(count_of("height=-3:-1:1") == 3);
    CHECK(count_of("mass=1e-3:2e-3:2.5e-4") == 5);
    CHECK(count_of("speed=1:100000:1") == 100000); /* the most one axis may have */
    CHECK(count_of("launch.speed=0:1:1") == 2);
    CHECK(count_of("speed=0:1:1.00001") == 1);         /* stop short of one step by 1e-5 of a step */
    CHECK(count_of("speed=0:1:1.000000000001") == 2);  /* ... by 1e-12 of a step: rounding, stop included */
    CHECK(count_of("speed=0:1:0.9999999999999") == 2); /* past one step by 1e-13 of a step: no third value */

    dragarc_sweep_axis a;
    CHECK(dragarc_sweep_axis_parse(&a, "speed=0:1:0.1", NULL) == DRAGARC_OK);
    CHECK(dragarc_sweep_axis_value(&a, 3) == 0.3);  /* not 0.30000000000000004 */
    CHECK(dragarc_sweep_axis_value(&a, 7) == 0.7);
    CHECK(dragarc_sweep_axis_value(&a, 10) == 1.0); /* the last is stop itself */
    CHECK(dragarc_sweep_axis_parse(&a, "speed=0:1:1.000000000001", NULL) == DRAGARC_OK);
    CHECK(dragarc_sweep_axis_value(&a, 1) == 1.0);
    CHECK(dragarc_sweep_axis_parse(&a, "speed=-0.3:0.3:0.1", NULL) == DRAGARC_OK);
    double zero = dragarc_sweep_axis_value(&a, 3);
    CHECK(zero == 0.0 && !signbit(zero));           /* -0.3 + 3 x 0.1 = 5.6e-17 rounds to 0 */
    CHECK(dragarc_sweep_axis_value(&a, 0) == -0.3);
    CHECK(dragarc_sweep_axis_parse(&a, "speed=0:0.9:0.3", NULL) == DRAGARC_OK);
    CHECK(dragarc_sweep_axis_value(&a, 3) == 0.9);
    CHECK(dragarc_sweep_axis_parse(&a, "diameter=0.0001:0.0002:0.00001", NULL) == DRAGARC_OK);
    CHECK(a.count == 11 && dragarc_sweep_axis_value(&a, 3) == 0.00013);
    CHECK(dragarc_sweep_axis_parse(&a, "speed=1e6:1.0000001e6:0.01", NULL) == DRAGARC_OK);
    CHECK(a.count == 11 && dragarc_sweep_axis_value(&a, 7) == 1000000.07);
}

static void bad_range(const char *spec, const char *field, const char *text)
{
    dragarc_sweep_axis a;
    dragarc_error e = {0};
    int rc = dragarc_sweep_axis_parse(&a, spec, &e);
    int ok = rc == DRAGARC_EINVAL && strcmp(e.field, field) == 0 && strstr(e.message, text) != NULL;
    if (!ok)
        printf("  %s: rc %d, field '%s', message '%s'\n", spec, rc, e.field, e.message);
    CHECK(ok);
}

TEST(bad_ranges_say_what_is_wrong)
{
    bad_range("speed=0:1:0", "launch.speed", "STEP must not be 0");
    bad_range("speed=0:1:-0.5", "launch.speed", "STEP must be positive");
    bad_range("speed=1:0:0.5", "launch.speed", "STEP must be negative");
    bad_range("speed=0:100000:1", "launch.speed", "100001 values; at most 100000");
    bad_range("speed=0:1", "launch.speed", "START:STOP:STEP");
    bad_range("speed=0:1:0.1:2", "launch.speed", "START:STOP:STEP");
    bad_range("speed=a:1:0.1", "launch.speed", "START:STOP:STEP");
    bad_range("speed=0:1:0.1x", "launch.speed", "START:STOP:STEP");
    bad_range("speed=::", "launch.speed", "START:STOP:STEP");
    bad_range("speed=nan:1:1", "launch.speed", "finite");
    bad_range("speed=0:inf:1", "launch.speed", "finite");
    bad_range("speed=0:1e999:1", "launch.speed", "finite");
    bad_range("speed=", "launch.speed", "START:STOP:STEP");
    bad_range("speed", "", "NAME=START:STOP:STEP");
    bad_range("=0:1:1", "", "NAME=START:STOP:STEP");
    bad_range("", "", "NAME=START:STOP:STEP");
    dragarc_sweep_axis a;
    dragarc_error e;
    CHECK(dragarc_sweep_axis_init(&a, "speed", 0.0, 1e308, 1e-308, &e) == DRAGARC_EINVAL); /* q overflows */
    CHECK(dragarc_sweep_axis_init(&a, "speed", 0.0, 1.0, NAN, &e) == DRAGARC_EINVAL);
}

TEST(tables_are_checked_before_any_flight)
{
    dragarc_scenario s;
    ball(&s);
    dragarc_sweep_axis ax[4];
    axis(&ax[0], "speed", 1.0, 1000.0, 1.0);
    axis(&ax[1], "elevation", 0.0, 999.0, 1.0);
    axis(&ax[2], "launch.speed", 1.0, 2.0, 1.0);
    axis(&ax[3], "mass", 0.1, 0.2, 0.1);
    dragarc_error e;
    size_t n = 7;
    CHECK(dragarc_sweep_axes_check(ax, 2, &n, &e) == DRAGARC_OK && n == 1000000); /* the most allowed */
    ax[1].count = 1001;
    CHECK(dragarc_sweep_axes_check(ax, 2, &n, &e) == DRAGARC_EINVAL && n == 0);
    CHECK(strstr(e.message, "more than 1000000 rows") != NULL && strcmp(e.field, "launch.elevation") == 0);
    CHECK(dragarc_sweep_axes_check(ax, 0, NULL, &e) == DRAGARC_EINVAL && strstr(e.message, "1 to 3"));
    CHECK(dragarc_sweep_axes_check(ax, 4, NULL, &e) == DRAGARC_EINVAL && strstr(e.message, "1 to 3"));
    ax[1].count = 1000;
    CHECK(dragarc_sweep_axes_check(ax, 3, NULL, &e) == DRAGARC_EINVAL && strstr(e.message, "twice"));
    dragarc_sweep_axis bare;
    memset(&bare, 0, sizeof bare);
    CHECK(dragarc_sweep_axes_check(&bare, 1, NULL, &e) == DRAGARC_EINVAL);
    /* an invalid base scenario is refused with its own field */
    s.gravity = -1.0;
    dragarc_sweep t;
    CHECK(dragarc_sweep_run(&s, &ax[3], 1, &t, &e) == DRAGARC_EINVAL && strcmp(e.field, "environment.gravity") == 0);
    dragarc_sweep_clear(&t);
}

TEST(a_failed_row_keeps_its_message_and_the_others_fly)
{
    dragarc_scenario s;
    ball(&s);
    s.launch.elevation = -30.0 * DEG; /* thrown downward: height 0 cannot start, below 0 is underground */
    dragarc_sweep_axis ax;
    axis(&ax, "height", -1.0, 2.0, 1.0);
    dragarc_sweep t;
    CHECK(dragarc_sweep_run(&s, &ax, 1, &t, NULL) == DRAGARC_OK);
    CHECK(t.nrows == 4 && t.nfailed == 2);
    if (t.nrows == 4) {
        CHECK(t.rows[0].status == DRAGARC_EINVAL && t.rows[0].error != NULL);
        CHECK(strcmp(t.rows[0].error->field, "launch.height") == 0);
        CHECK(strstr(t.rows[0].error->message, "below ground.elevation") != NULL);
        CHECK(isnan(t.rows[0].range) && isnan(t.rows[0].time_of_flight));
        CHECK(t.rows[1].status == DRAGARC_EINVAL && strstr(t.rows[1].error->message, "starts on the ground"));
        CHECK(t.rows[2].status == DRAGARC_OK && t.rows[2].error == NULL && t.rows[2].range > 0.0);
        CHECK(t.rows[3].status == DRAGARC_OK && t.rows[3].range > t.rows[2].range);
        char msg[sizeof(dragarc_error)];
        dragarc_sweep_row_message(&t.rows[0], msg, sizeof msg);
        CHECK(strncmp(msg, "launch.height: -1 m is below", 28) == 0);
        dragarc_sweep_row_message(&t.rows[2], msg, sizeof msg);
        CHECK(msg[0] == '\0');
    }
    dragarc_sweep_clear(&t);

    /* a flight that does not land in time fails its row with the solver's reason */
    ball(&s);
    s.solver.max_time = 3.0;
    axis(&ax, "speed", 10.0, 40.0, 30.0);
    CHECK(dragarc_sweep_run(&s, &ax, 1, &t, NULL) == DRAGARC_OK);
    CHECK(t.nrows == 2 && t.nfailed == 1);
    if (t.nrows == 2) {
        CHECK(t.rows[0].status == DRAGARC_OK);
        CHECK(t.rows[1].status == DRAGARC_ENOLAND && strcmp(t.rows[1].error->field, "solver.max_time") == 0);
    }
    dragarc_sweep_clear(&t);

    /* a value that set() refuses fails its row too */
    ball(&s);
    axis(&ax, "azimuth", 0.0, 540.0, 180.0);
    CHECK(dragarc_sweep_run(&s, &ax, 1, &t, NULL) == DRAGARC_OK);
    CHECK(t.nrows == 4 && t.nfailed == 1 && t.rows[3].status == DRAGARC_EINVAL);
    CHECK(t.rows[3].error && strcmp(t.rows[3].error->field, "launch.azimuth") == 0);
    dragarc_sweep_row message_only = {.status = DRAGARC_ENOMEM};
    char msg[64];
    dragarc_sweep_row_message(&message_only, msg, sizeof msg);
    CHECK(strcmp(msg, "out of memory") == 0);
    dragarc_sweep_clear(&t);
}

int main(void)
{
    dragarc_init();
    RUN(a_two_parameter_table_equals_the_flights_flown_one_by_one);
    RUN(a_drag_free_table_of_elevations_gives_the_vacuum_range);
    RUN(the_thread_count_changes_no_digit);
    RUN(rows_flown_apart_make_the_whole_table);
    RUN(a_progress_callback_sees_every_row_done_and_changes_no_digit);
    RUN(every_name_and_alias_sets_its_field);
    RUN(a_new_diameter_keeps_the_body_geometrically_similar);
    RUN(unknown_names_are_refused_with_the_accepted_ones);
    RUN(cd_needs_the_constant_drag_model);
    RUN(wind_needs_one_speed_and_direction);
    RUN(atmosphere_parameters_need_their_models);
    RUN(values_must_be_finite_and_directions_within_a_turn);
    RUN(spin_rate_is_set_in_rpm_and_tilt_in_degrees_as_the_scenario_file_reads_them);
    RUN(spin_parameters_need_a_spin_that_can_change_the_flight);
    RUN(ranges_include_stop_within_rounding);
    RUN(bad_ranges_say_what_is_wrong);
    RUN(tables_are_checked_before_any_flight);
    RUN(a_failed_row_keeps_its_message_and_the_others_fly);
    return check_summary();
}
