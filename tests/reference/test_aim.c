/* test_aim.c: the shooting-method solvers against closed forms, and fly(aim(R)) round trips.
 * SPDX-License-Identifier: GPL-3.0-or-later
 *
 * Sources (closed forms, exact):
 *  - vacuum, level ground: R = v^2 sin(2 theta) / g, so theta = asin(g R / v^2) / 2 and 90 deg - theta;
 *    maximum range v^2 / g at 45 deg; speed for a given elevation v = sqrt(g R / sin 2 theta);
 *  - vacuum, launch from height h above the landing plane: the best elevation satisfies
 *    tan theta* = v / sqrt(v^2 + 2 g h) and reaches R* = (v / g) sqrt(v^2 + 2 g h) (Lichtenberg, D. B. &
 *    Wills, J. G. 1978, "Maximizing the range of the shot put", Am. J. Phys. 46:546);
 *  - linear drag: range at a given elevation from the Lambert W closed form (Warburton & Wang 2004,
 *    Am. J. Phys. 72:1404), so an aimed elevation must give back the target range;
 *  - quadratic drag: the maximum-range elevation is below 45 deg and tends to 45 deg as the drag goes to
 *    zero (physics: drag costs the lofted, longer flight more; checked numerically).
 * Tolerances: flights at rtol = atol = 1e-10. An aimed angle is exact to the flight's accuracy, about
 * 1e-9 rad; 1e-7 rad is asked. A maximum is flat: a range error dR moves the arg-max by about
 * sqrt(2 dR / |R''|), so 1e-4 rad is asked of the maximum-range elevation and 1e-8 relative of the range.
 */
#include <gsl/gsl_sf_lambert.h>

#include "check.h"
#include "helpers.h"
#include "dragarc/aim.h"

#define G 9.81

static int aim(const dragarc_scenario *s, double range, double height, dragarc_aim_mode mode, dragarc_aim_result *r,
               dragarc_error *e)
{
    dragarc_aim_request q;
    dragarc_aim_request_default(&q);
    q.range = range;
    q.height = height;
    q.mode = mode;
    return dragarc_aim_solve(s, &q, r, e);
}

TEST(vacuum_aim_finds_both_elevations_and_the_45_degree_maximum)
{
    dragarc_scenario s;
    dragarc_aim_result r;
    dragarc_error e;
    make_scenario(&s, 0.0, 0.2, 0.05, 0.0, 30.0, 10.0, G, 1e-10);
    CHECK(aim(&s, 60.0, NAN, DRAGARC_AIM_ELEVATION, &r, &e) == DRAGARC_OK);
    double th = 0.5 * asin(G * 60.0 / (30.0 * 30.0));
    CHECK(r.nsolutions == 2);
    CHECK_ABS(r.solutions[0].elevation, th, 1e-7);
    CHECK_ABS(r.solutions[1].elevation, 0.5 * PI - th, 1e-7);
    CHECK(r.solutions[0].miss < 1e-3 && r.solutions[1].miss < 1e-3);
    CHECK_REL(r.max_range, 30.0 * 30.0 / G, 1e-8);
    CHECK_ABS(r.max_range_elevation, 0.25 * PI, 1e-4);
    CHECK_ABS(r.solutions[0].azimuth_correction, 0.0, 0.0); /* still air, no crossrange: the azimuth is kept */
}

TEST(vacuum_speed_solve_matches_closed_form)
{
    dragarc_scenario s;
    dragarc_aim_result r;
    make_scenario(&s, 0.0, 0.2, 0.05, 0.0, 10.0, 30.0, G, 1e-10);
    CHECK(aim(&s, 50.0, NAN, DRAGARC_AIM_SPEED, &r, NULL) == DRAGARC_OK);
    CHECK(r.nsolutions == 1);
    CHECK_REL(r.solutions[0].speed, sqrt(G * 50.0 / sin(60.0 * DEG)), 1e-8);
}

TEST(launch_above_ground_maximum_matches_lichtenberg_wills)
{
    dragarc_scenario s;
    dragarc_aim_result r;
    const double v = 14.0, h = 2.0;
    make_scenario(&s, 0.0, 7.26, 0.12, h, v, 40.0, G, 1e-10);
    CHECK(aim(&s, 10.0, NAN, DRAGARC_AIM_ELEVATION, &r, NULL) == DRAGARC_OK);
    double best = atan(v / sqrt(v * v + 2 * G * h));
    CHECK_ABS(r.max_range_elevation, best, 1e-4);
    CHECK_REL(r.max_range, v / G * sqrt(v * v + 2 * G * h), 1e-8);
    CHECK(r.max_range_elevation < 0.25 * PI);
}

TEST(linear_drag_aim_gives_back_the_lambert_w_range)
{
    dragarc_scenario s;
    dragarc_aim_result r;
    make_scenario(&s, 0.0, 1.0, 0.05, 0.0, 50.0, 10.0, G, 1e-10);
    s.projectile.drag.model = DRAGARC_DRAG_LINEAR;
    s.projectile.drag.k = 0.1;
    CHECK(aim(&s, 150.0, NAN, DRAGARC_AIM_ELEVATION, &r, NULL) == DRAGARC_OK);
    CHECK(r.nsolutions == 2);
    for (size_t i = 0; i < r.nsolutions; i++) {
        double th = r.solutions[i].elevation, u = 50.0 * cos(th), w = 50.0 * sin(th), kappa = 0.1;
        double alpha = 1.0 + kappa * w / G;
        double t = (alpha + gsl_sf_lambert_W0(-alpha * exp(-alpha))) / kappa;
        CHECK_REL(u / kappa * (1.0 - exp(-kappa * t)), 150.0, 1e-7);
        CHECK_REL(r.solutions[i].time_of_flight, t, 1e-7);
    }
    CHECK(r.max_range_elevation < 0.25 * PI); /* drag lowers the best elevation (Warburton & Wang, fig. 3) */
}

TEST(quadratic_drag_best_elevation_rises_toward_45_degrees_as_drag_vanishes)
{
    const double cs[] = {1e-2, 1e-3, 1e-4, 1e-6};
    double prev = 0.0;
    for (size_t i = 0; i < sizeof cs / sizeof cs[0]; i++) {
        dragarc_scenario s;
        dragarc_aim_result r;
        make_scenario(&s, 0.0, 1.0, 0.05, 0.0, 40.0, 10.0, G, 1e-10);
        s.projectile.drag.model = DRAGARC_DRAG_QUADRATIC;
        s.projectile.drag.c = cs[i];
        CHECK(aim(&s, 10.0, NAN, DRAGARC_AIM_ELEVATION, &r, NULL) == DRAGARC_OK);
        printf("  c = %.0e kg/m: best elevation %.4f deg, max range %.3f m\n", cs[i], r.max_range_elevation / DEG,
               r.max_range);
        CHECK(r.max_range_elevation < 0.25 * PI);
        CHECK(r.max_range_elevation > prev);
        prev = r.max_range_elevation;
    }
    CHECK_ABS(prev, 0.25 * PI, 1e-3); /* c = 1e-6: k v^2/g ~ 2e-3, the shift is of that order */
}

TEST(flying_the_aimed_launch_lands_within_a_millimetre_across_ranges_in_wind)
{
    dragarc_scenario s;
    make_scenario(&s, 1.2, 0.145, 0.074, 1.0, 40.0, 10.0, 9.80665, 1e-9);
    s.projectile.drag.model = DRAGARC_DRAG_CONSTANT;
    s.projectile.drag.cd = 0.35;
    s.wind.model = DRAGARC_WIND_CONSTANT;
    s.wind.speed = 4.0;
    s.wind.from = 300.0 * DEG;
    s.launch.azimuth = 20.0 * DEG;
    double worst = 0.0;
    int solved = 0;
    for (double range = 5.0; range <= 85.0; range += 10.0) {
        dragarc_aim_result r;
        dragarc_error e;
        int rc = aim(&s, range, NAN, DRAGARC_AIM_ELEVATION, &r, &e);
        if (rc != DRAGARC_OK)
            printf("  R = %g: %s\n", range, e.message);
        CHECK(rc == DRAGARC_OK);
        for (size_t i = 0; i < r.nsolutions; i++) {
            dragarc_scenario t = s;
            t.launch.elevation = r.solutions[i].elevation;
            t.launch.azimuth = r.solutions[i].azimuth;
            dragarc_flight f;
            CHECK(dragarc_flight_run(&t, 0.0, &f, NULL) == DRAGARC_OK);
            /* target: `range` along the nominal azimuth (20 deg), on the line */
            double tx = range * sin(20.0 * DEG), ty = range * cos(20.0 * DEG);
            double miss = hypot(f.impact[0] - tx, f.impact[1] - ty);
            worst = fmax(worst, miss);
            CHECK(miss < 1e-3);
            dragarc_flight_clear(&f);
            solved++;
        }
    }
    printf("  %d aimed flights, worst miss %.3g mm\n", solved, worst * 1e3);
    CHECK(solved == 18);
    /* At the edge of reach (maximum 95.30 m along the line) the answer is a solution or a clear "out of
     * reach", never another failure. */
    dragarc_aim_result r;
    dragarc_error e;
    int rc = aim(&s, 95.0, NAN, DRAGARC_AIM_ELEVATION, &r, &e);
    CHECK(rc == DRAGARC_OK || (rc == DRAGARC_ENOSOLUTION && strstr(e.message, "edge of reach")));
}

TEST(unreachable_and_degenerate_targets_are_clear_errors)
{
    dragarc_scenario s;
    dragarc_aim_result r;
    dragarc_error e;
    make_scenario(&s, 0.0, 0.2, 0.05, 0.0, 20.0, 10.0, G, 1e-10);
    CHECK(aim(&s, 100.0, NAN, DRAGARC_AIM_ELEVATION, &r, &e) == DRAGARC_ENOSOLUTION);
    CHECK(strstr(e.message, "out of reach") && strstr(e.message, "maximum range"));
    CHECK_REL(r.max_range, 400.0 / G, 1e-8);
    /* from 1 m up at 20 m/s the steepest launch searched (-89 deg) still carries about 2 cm, so a spot
     * 1 um away is reported as closer than any launch lands, with that shortest range */
    s.launch.height = 1.0;
    CHECK(aim(&s, 1e-6, NAN, DRAGARC_AIM_ELEVATION, &r, &e) == DRAGARC_ENOSOLUTION);
    CHECK(strstr(e.message, "closer than any launch") != NULL);
    s.launch.height = 0.0;
    CHECK(aim(&s, 0.0, NAN, DRAGARC_AIM_ELEVATION, &r, &e) == DRAGARC_EINVAL);
    CHECK(strcmp(e.field, "range") == 0);
    /* 20 m/s reaches at most 20.4 m up: a target plane at 30 m is above every trajectory */
    CHECK(aim(&s, 5.0, 30.0, DRAGARC_AIM_ELEVATION, &r, &e) == DRAGARC_ENOSOLUTION);
    CHECK(strcmp(e.field, "height") == 0);
    s.launch.speed = 0.0;
    s.launch.height = 1.0;
    CHECK(aim(&s, 5.0, NAN, DRAGARC_AIM_ELEVATION, &r, &e) == DRAGARC_EINVAL);
    CHECK(strcmp(e.field, "launch.speed") == 0);
}

TEST(aim_table_rows_equal_single_solves_bit_for_bit)
{
    /* The table is the single solve run per range (in parallel): the same numbers to the last bit, and an
     * out-of-reach range keeps its reason without stopping the others. */
    dragarc_scenario s;
    make_scenario(&s, 1.2, 0.145, 0.074, 1.0, 30.0, 10.0, 9.80665, 1e-9);
    s.projectile.drag.model = DRAGARC_DRAG_CONSTANT;
    s.projectile.drag.cd = 0.35;
    s.wind.model = DRAGARC_WIND_CONSTANT;
    s.wind.speed = 3.0;
    s.wind.from = 250.0 * DEG;
    const double ranges[] = {10.0, 25.0, 40.0, 55.0, 200.0};
    dragarc_aim_table_row rows[5];
    dragarc_aim_request q;
    dragarc_aim_request_default(&q);
    CHECK(dragarc_aim_table(&s, &q, ranges, 5, rows, NULL) == DRAGARC_OK);
    for (size_t i = 0; i < 5; i++) {
        dragarc_aim_result r;
        int rc = aim(&s, ranges[i], NAN, DRAGARC_AIM_ELEVATION, &r, NULL);
        CHECK(rc == rows[i].status);
        if (rc != DRAGARC_OK)
            continue;
        CHECK(memcmp(&r.solutions[0], &rows[i].low, sizeof rows[i].low) == 0);
        CHECK(memcmp(&r.solutions[r.nsolutions - 1], &rows[i].high, sizeof rows[i].high) == 0);
    }
    CHECK(rows[4].status == DRAGARC_ENOSOLUTION && strstr(rows[4].message, "out of reach"));
    CHECK(isnan(rows[4].low.elevation));
    const double bad[] = {10.0, -1.0};
    dragarc_error e;
    CHECK(dragarc_aim_table(&s, &q, bad, 2, rows, &e) == DRAGARC_EINVAL && strcmp(e.field, "ranges") == 0);
}

int main(void)
{
    dragarc_init();
    RUN(vacuum_aim_finds_both_elevations_and_the_45_degree_maximum);
    RUN(vacuum_speed_solve_matches_closed_form);
    RUN(launch_above_ground_maximum_matches_lichtenberg_wills);
    RUN(linear_drag_aim_gives_back_the_lambert_w_range);
    RUN(quadratic_drag_best_elevation_rises_toward_45_degrees_as_drag_vanishes);
    RUN(flying_the_aimed_launch_lands_within_a_millimetre_across_ranges_in_wind);
    RUN(unreachable_and_degenerate_targets_are_clear_errors);
    RUN(aim_table_rows_equal_single_solves_bit_for_bit);
    return check_summary();
}
