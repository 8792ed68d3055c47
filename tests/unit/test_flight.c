/* test_flight.c: the integrator driver: method choice, events, sampling, failure paths.
 * SPDX-License-Identifier: GPL-3.0-or-later
 */
#include "check.h"
#include "helpers.h"

static void sphere_drop(dragarc_scenario *s, double d, double h)
{
    make_scenario(s, 1.204, 998.2 * PI * d * d * d / 6.0, d, h, 0.0, 0.0, 9.80665, 1e-9);
    s->atmosphere.viscosity = 1.81e-5;
    s->projectile.drag.model = DRAGARC_DRAG_SPHERE;
    s->wind.model = DRAGARC_WIND_CONSTANT;
    s->wind.speed = 2.0;
    s->wind.from = 270.0 * DEG;
}

TEST(fine_drop_goes_to_bdf_and_agrees_with_adams)
{
    /* A 50 um drop (v_t ~ 7 cm/s, relaxation ~ 7 ms) falling 1 m: stiff. Both methods at rtol 1e-9 must
     * agree to 1e-6 relative; BDF must need fewer steps, which is why auto picks it. */
    dragarc_scenario s;
    dragarc_flight fa, fb, fx;
    sphere_drop(&s, 50e-6, 1.0);
    CHECK(dragarc_flight_run(&s, 0.0, &fx, NULL) == DRAGARC_OK);
    CHECK(fx.method == DRAGARC_METHOD_BDF);
    s.solver.method = DRAGARC_METHOD_ADAMS;
    CHECK(dragarc_flight_run(&s, 0.0, &fa, NULL) == DRAGARC_OK);
    s.solver.method = DRAGARC_METHOD_BDF;
    CHECK(dragarc_flight_run(&s, 0.0, &fb, NULL) == DRAGARC_OK);
    printf("  50 um drop: adams %ld steps, bdf %ld steps, drift %.4f m\n", fa.steps, fb.steps, fb.range);
    CHECK_REL(fa.time_of_flight, fb.time_of_flight, 1e-6);
    CHECK_REL(fa.range, fb.range, 1e-6);
    CHECK(fb.steps < fa.steps);
    /* the drop drifts with the wind: range = wind speed x fall time, to the relaxation length */
    CHECK_REL(fb.range, 2.0 * fb.time_of_flight, 1e-3);
    dragarc_flight_clear(&fa);
    dragarc_flight_clear(&fb);
    dragarc_flight_clear(&fx);
}

TEST(ball_flight_stays_on_adams)
{
    dragarc_scenario s;
    dragarc_flight f;
    make_scenario(&s, 1.2, 0.145, 0.074, 1.0, 40.0, 30.0, 9.80665, 1e-8);
    s.projectile.drag.model = DRAGARC_DRAG_CONSTANT;
    s.projectile.drag.cd = 0.35;
    CHECK(dragarc_flight_run(&s, 0.0, &f, NULL) == DRAGARC_OK);
    CHECK(f.method == DRAGARC_METHOD_ADAMS);
    dragarc_flight_clear(&f);
}

TEST(samples_are_evenly_spaced_and_end_on_the_ground)
{
    dragarc_scenario s;
    dragarc_flight f;
    make_scenario(&s, 1.2, 0.145, 0.074, 1.0, 40.0, 30.0, 9.80665, 1e-8);
    s.projectile.drag.model = DRAGARC_DRAG_CONSTANT;
    s.projectile.drag.cd = 0.35;
    CHECK(dragarc_flight_run(&s, 0.1, &f, NULL) == DRAGARC_OK);
    CHECK(f.npoints >= 3);
    for (size_t i = 0; i + 1 < f.npoints; i++)
        CHECK_ABS(f.points[i].t, 0.1 * (double)i, 1e-12);
    const dragarc_flight_point *last = &f.points[f.npoints - 1];
    CHECK_ABS(last->t, f.time_of_flight, 0.0);
    CHECK_ABS(last->pos[2], 0.0, 0.0);
    CHECK(last->t - f.points[f.npoints - 2].t <= 0.1 + 1e-12);
    dragarc_flight_clear(&f);
}

TEST(downward_launch_has_its_apex_at_the_launch_point)
{
    dragarc_scenario s;
    dragarc_flight f;
    make_scenario(&s, 1.2, 0.145, 0.074, 20.0, 10.0, -30.0, 9.80665, 1e-8);
    s.projectile.drag.model = DRAGARC_DRAG_CONSTANT;
    s.projectile.drag.cd = 0.35;
    CHECK(dragarc_flight_run(&s, 0.0, &f, NULL) == DRAGARC_OK);
    CHECK_ABS(f.apex_height, 20.0, 0.0);
    CHECK_ABS(f.apex_time, 0.0, 0.0);
    dragarc_flight_clear(&f);
}

TEST(landing_on_raised_ground_counts_only_the_descending_crossing)
{
    /* Vacuum, launched from 0 m at 20 m/s straight up... tilted 60 degrees, onto a terrace at 5 m:
     * z = w t - g t^2 / 2 = 5 on the way down: t = (w + sqrt(w^2 - 2 g 5)) / g (exact). */
    dragarc_scenario s;
    dragarc_flight f;
    make_scenario(&s, 0.0, 0.145, 0.074, 0.0, 20.0, 60.0, 9.81, 1e-10);
    s.launch.height = 5.0;
    s.ground_elevation = 5.0;
    s.launch.height = 5.0;
    CHECK(dragarc_flight_run(&s, 0.0, &f, NULL) == DRAGARC_OK);
    double w = 20.0 * sin(60 * DEG);
    CHECK_REL(f.time_of_flight, 2.0 * w / 9.81, 1e-8);
    dragarc_flight_clear(&f);
    s.ground_elevation = 5.0;
    s.launch.height = 5.0 + 1e-9;
    CHECK(dragarc_flight_run(&s, 0.0, &f, NULL) == DRAGARC_OK);
    dragarc_flight_clear(&f);
}

TEST(wind_from_the_left_pushes_the_impact_to_the_right)
{
    dragarc_scenario s;
    dragarc_flight f;
    make_scenario(&s, 1.2, 0.145, 0.074, 1.0, 40.0, 30.0, 9.80665, 1e-8);
    s.projectile.drag.model = DRAGARC_DRAG_CONSTANT;
    s.projectile.drag.cd = 0.35;
    s.launch.azimuth = 90.0 * DEG; /* toward the east */
    s.wind.model = DRAGARC_WIND_CONSTANT;
    s.wind.speed = 5.0;
    s.wind.from = 0.0; /* from the north: from the shooter's left */
    CHECK(dragarc_flight_run(&s, 0.0, &f, NULL) == DRAGARC_OK);
    CHECK(f.crossrange > 0.5);
    CHECK_ABS(f.crossrange, -f.impact[1], 1e-12);
    CHECK_ABS(f.downrange, f.impact[0], 1e-12);
    dragarc_flight_clear(&f);
}

TEST(buoyant_body_that_never_lands_is_an_error_not_a_number)
{
    dragarc_scenario s;
    dragarc_flight f;
    dragarc_error e;
    make_scenario(&s, 1.2, 0.001, 0.3, 2.0, 1.0, 0.0, 9.80665, 1e-8);
    s.projectile.drag.model = DRAGARC_DRAG_CONSTANT;
    s.projectile.drag.cd = 0.47;
    s.solver.max_time = 5.0;
    CHECK(dragarc_flight_run(&s, 0.0, &f, &e) == DRAGARC_ENOLAND);
    CHECK(strcmp(e.field, "solver.max_time") == 0);
    CHECK(strstr(e.message, "no ground impact within 5 s") != NULL);
    CHECK(isnan(f.terminal_speed));
    dragarc_flight_clear(&f);
}

TEST(leaving_the_standard_atmosphere_is_reported_with_the_time)
{
    dragarc_scenario s;
    dragarc_flight f;
    dragarc_error e;
    make_scenario(&s, 0.0, 1.0, 0.1, 0.0, 3000.0, 90.0, 9.80665, 1e-8);
    s.atmosphere.model = DRAGARC_ATMOSPHERE_ISA;
    CHECK(dragarc_flight_run(&s, 0.0, &f, &e) == DRAGARC_ERANGE);
    CHECK(strstr(e.message, "86000") != NULL && strstr(e.message, "at t = ") != NULL);
    dragarc_flight_clear(&f);
}

TEST(running_out_of_steps_names_the_cvode_flag)
{
    dragarc_scenario s;
    dragarc_flight f;
    dragarc_error e;
    make_scenario(&s, 1.2, 0.145, 0.074, 1.0, 40.0, 30.0, 9.80665, 1e-12);
    s.projectile.drag.model = DRAGARC_DRAG_CONSTANT;
    s.projectile.drag.cd = 0.35;
    s.solver.max_steps = 10;
    CHECK(dragarc_flight_run(&s, 0.0, &f, &e) == DRAGARC_ESOLVER);
    CHECK(strstr(e.message, "CV_TOO_MUCH_WORK") != NULL);
    dragarc_flight_clear(&f);
}

TEST(invalid_scenario_is_refused_before_flying)
{
    dragarc_scenario s;
    dragarc_flight f;
    dragarc_error e;
    make_scenario(&s, 1.2, -1.0, 0.074, 1.0, 40.0, 30.0, 9.80665, 1e-8);
    CHECK(dragarc_flight_run(&s, 0.0, &f, &e) == DRAGARC_EINVAL);
    CHECK(strcmp(e.field, "projectile.mass") == 0);
    make_scenario(&s, 1.2, 1.0, 0.074, 0.0, 40.0, -10.0, 9.80665, 1e-8);
    CHECK(dragarc_flight_run(&s, 0.0, &f, &e) == DRAGARC_EINVAL);
    CHECK(strcmp(e.field, "launch.height") == 0);
    make_scenario(&s, 1.2, 1.0, 0.074, 1.0, 40.0, 10.0, 9.80665, 1e-8);
    CHECK(dragarc_flight_run(&s, -1.0, &f, &e) == DRAGARC_EINVAL);
    dragarc_flight_clear(&f);
}

int main(void)
{
    dragarc_init();
    RUN(fine_drop_goes_to_bdf_and_agrees_with_adams);
    RUN(ball_flight_stays_on_adams);
    RUN(samples_are_evenly_spaced_and_end_on_the_ground);
    RUN(downward_launch_has_its_apex_at_the_launch_point);
    RUN(landing_on_raised_ground_counts_only_the_descending_crossing);
    RUN(wind_from_the_left_pushes_the_impact_to_the_right);
    RUN(buoyant_body_that_never_lands_is_an_error_not_a_number);
    RUN(leaving_the_standard_atmosphere_is_reported_with_the_time);
    RUN(running_out_of_steps_names_the_cvode_flag);
    RUN(invalid_scenario_is_refused_before_flying);
    return check_summary();
}
