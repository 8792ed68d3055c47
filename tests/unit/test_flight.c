/* test_flight.c: the integrator driver: method choice, events, sampling, failure paths.
 * SPDX-License-Identifier: GPL-3.0-or-later
 */
#include "check.h"
#include "helpers.h"
#include "dragarc/forces.h"

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

TEST(ball_flight_takes_the_explicit_path)
{
    dragarc_scenario s;
    dragarc_flight f;
    make_scenario(&s, 1.2, 0.145, 0.074, 1.0, 40.0, 30.0, 9.80665, 1e-8);
    s.projectile.drag.model = DRAGARC_DRAG_CONSTANT;
    s.projectile.drag.cd = 0.35;
    CHECK(dragarc_flight_run(&s, 0.0, &f, NULL) == DRAGARC_OK);
    CHECK(f.method == DRAGARC_METHOD_DOP853);
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

TEST(samples_between_steps_agree_with_steps_taken_to_them)
{
    /* DOP853 samples come from its continuous extension (order 7); rk8pd's from a step of the method itself
     * to each sample time. At rtol = atol = 1e-10 both are within about 1e-9 m of the true path, so they
     * must agree to 1e-7 relative (positions) over a whole flight in a layered wind. */
    dragarc_scenario s;
    dragarc_flight f[2];
    dragarc_wind_layer rows[] = {{0.0, 2.0, 250.0 * DEG}, {20.0, 7.0, 280.0 * DEG}, {60.0, 11.0, 300.0 * DEG}};
    make_scenario(&s, 1.2, 0.145, 0.074, 1.0, 40.0, 35.0, 9.80665, 1e-10);
    s.projectile.drag.model = DRAGARC_DRAG_CONSTANT;
    s.projectile.drag.cd = 0.35;
    s.wind.model = DRAGARC_WIND_LAYERED;
    s.wind.layers = rows;
    s.wind.nlayers = 3;
    const dragarc_method m[2] = {DRAGARC_METHOD_DOP853, DRAGARC_METHOD_RK8PD};
    for (int k = 0; k < 2; k++) {
        s.solver.method = m[k];
        CHECK(dragarc_flight_run(&s, 0.05, &f[k], NULL) == DRAGARC_OK);
    }
    CHECK(f[0].npoints == f[1].npoints && f[0].npoints > 50);
    double worst = 0.0;
    for (size_t i = 0; i < f[0].npoints && i < f[1].npoints; i++) {
        CHECK_ABS(f[0].points[i].t, f[1].points[i].t, 1e-9);
        for (int j = 0; j < 3; j++) {
            double d = fabs(f[0].points[i].pos[j] - f[1].points[i].pos[j]);
            worst = fmax(worst, d);
            CHECK(d <= 1e-7 * (1.0 + f[0].range));
            CHECK_ABS(f[0].points[i].vel[j], f[1].points[i].vel[j], 1e-7 * 40.0);
        }
    }
    printf("  %zu samples, largest position difference %.2e m\n", f[0].npoints, worst);
    s.wind.layers = NULL; /* borrowed rows */
    s.wind.nlayers = 0;
    dragarc_flight_clear(&f[0]);
    dragarc_flight_clear(&f[1]);
}

/* A ball with constant lift (0.0459 kg, 42.7 mm, Cd 0.25, CL 0.15; invented) driven at 67 m/s, 12 deg. */
static void spinning_ball(dragarc_scenario *s, double rpm, double tilt_deg, double azimuth_deg)
{
    make_scenario(s, 1.2, 0.0459, 0.0427, 0.0, 67.0, 12.0, 9.80665, 1e-10);
    s->projectile.drag.model = DRAGARC_DRAG_CONSTANT;
    s->projectile.drag.cd = 0.25;
    s->projectile.lift.model = DRAGARC_LIFT_CONSTANT;
    s->projectile.lift.cl = 0.15;
    s->launch.azimuth = azimuth_deg * DEG;
    s->launch.spin_rate = rpm * 2.0 * PI / 60.0;
    s->launch.spin_tilt = tilt_deg * DEG;
}

TEST(spin_lift_behaves_as_its_geometry_says)
{
    /* Properties of the lift law itself (F_L perpendicular to v_rel, along w x v_rel): no spin is the flight
     * core to the last digit; a lift model without spin does nothing; tilts of +t and -t mirror each
     * other about the launch line; backspin lengthens the flight and raises the apex, topspin (tilt 180)
     * shortens it; the crossrange follows the sign of the tilt at any azimuth. */
    dragarc_scenario s;
    dragarc_flight none, zero, back, top, right, left, right_east;
    spinning_ball(&s, 0.0, 0.0, 0.0);
    s.projectile.lift.model = DRAGARC_LIFT_NONE;
    CHECK(dragarc_flight_run(&s, 0.0, &none, NULL) == DRAGARC_OK);
    spinning_ball(&s, 0.0, 0.0, 0.0);
    CHECK(dragarc_flight_run(&s, 0.0, &zero, NULL) == DRAGARC_OK);
    CHECK(zero.range == none.range && zero.time_of_flight == none.time_of_flight &&
          zero.apex_height == none.apex_height && zero.impact_speed == none.impact_speed);
    spinning_ball(&s, 2700.0, 0.0, 0.0);
    CHECK(dragarc_flight_run(&s, 0.0, &back, NULL) == DRAGARC_OK);
    spinning_ball(&s, 2700.0, 180.0, 0.0);
    CHECK(dragarc_flight_run(&s, 0.0, &top, NULL) == DRAGARC_OK);
    spinning_ball(&s, 2700.0, 15.0, 0.0);
    CHECK(dragarc_flight_run(&s, 0.0, &right, NULL) == DRAGARC_OK);
    spinning_ball(&s, 2700.0, -15.0, 0.0);
    CHECK(dragarc_flight_run(&s, 0.0, &left, NULL) == DRAGARC_OK);
    spinning_ball(&s, 2700.0, 15.0, 90.0);
    CHECK(dragarc_flight_run(&s, 0.0, &right_east, NULL) == DRAGARC_OK);
    printf("  range: no spin %.3f m, backspin %.3f m, topspin %.3f m; tilt +15 %.3f m (%.3f m right), -15 %.3f m "
           "(%.3f m)\n", none.range, back.range, top.range, right.range, right.crossrange, left.range, left.crossrange);
    CHECK(back.range > none.range && back.apex_height > none.apex_height && back.time_of_flight > none.time_of_flight);
    CHECK(top.range < none.range && top.apex_height < none.apex_height);
    CHECK_ABS(back.crossrange, 0.0, 1e-9);
    CHECK(right.crossrange > 1.0 && left.crossrange < -1.0);
    CHECK_ABS(right.range, left.range, 1e-9 * right.range);
    CHECK_ABS(right.crossrange, -left.crossrange, 1e-9 * right.range);
    CHECK_ABS(right.apex_height, left.apex_height, 1e-9 * right.apex_height);
    CHECK_ABS(right_east.crossrange, right.crossrange, 1e-9 * right.range); /* the same shot, turned to the east */
    CHECK_ABS(right_east.downrange, right.downrange, 1e-9 * right.range);
    dragarc_flight *all[] = {&none, &zero, &back, &top, &right, &left, &right_east};
    for (size_t i = 0; i < sizeof all / sizeof all[0]; i++)
        dragarc_flight_clear(all[i]);
}

TEST(exponential_spin_decay_follows_its_closed_form)
{
    /* dw/dt = -w / tau has w(t) = w0 exp(-t / tau) whatever the flight does (the law itself; no source
     * needed). The integrator carries w with the flight, so the landing spin tests it at the impact time to
     * the integration tolerance: 1e-10 relative, allowed 1e-8 for the impact time's own error. */
    dragarc_scenario s;
    dragarc_flight f;
    spinning_ball(&s, 3000.0, 0.0, 0.0);
    s.projectile.lift.model = DRAGARC_LIFT_SAWICKI2003; /* C_L grows with the spin (a constant C_L would not) */
    s.launch.spin_decay_time = 20.0;
    CHECK(dragarc_flight_run(&s, 0.5, &f, NULL) == DRAGARC_OK);
    double w0 = 3000.0 * 2.0 * PI / 60.0;
    CHECK_ABS(f.impact[6], w0 * exp(-f.time_of_flight / 20.0), 1e-8 * w0);
    for (size_t i = 0; i < f.npoints; i++)
        CHECK_ABS(f.points[i].spin, w0 * exp(-f.points[i].t / 20.0), 1e-8 * w0);
    /* less spin, less lift: a shorter carry than the same shot with the spin held */
    dragarc_flight held;
    s.launch.spin_decay_time = 0.0;
    CHECK(dragarc_flight_run(&s, 0.0, &held, NULL) == DRAGARC_OK);
    printf("  landing spin %.1f rpm after %.3f s; range %.3f m against %.3f m with the spin held\n",
           f.impact[6] * 60.0 / (2.0 * PI), f.time_of_flight, f.range, held.range);
    CHECK(f.range < held.range && f.apex_height < held.apex_height);
    CHECK(held.impact[6] == w0);
    dragarc_flight_clear(&f);
    dragarc_flight_clear(&held);
}

TEST(air_torque_spin_decay_follows_its_closed_form_in_a_vacuum_drop)
{
    /* dw/dt = -k w |v| / r (Smits & Smith 1994, as used by Penner 2001) integrates to
     * w = w0 exp(-(k / r) L), L the path length through the air. A ball dropped from rest in a vacuum has
     * |v| = g t and L = g t^2 / 2 = the drop height, so it lands with w0 exp(-k h / r) exactly (closed form).
     * k = 2e-5, r = 21.35 mm, h = 50 m: w falls to 95.4 % of w0. Tolerance 1e-9 relative: the integration's. */
    dragarc_scenario s;
    dragarc_flight f;
    make_scenario(&s, 0.0, 0.0459, 0.0427, 50.0, 0.0, 0.0, 9.80665, 1e-11);
    s.projectile.spin_decay_coefficient = 2e-5;
    s.launch.spin_rate = 300.0;
    CHECK(dragarc_flight_run(&s, 0.0, &f, NULL) == DRAGARC_OK);
    double want = 300.0 * exp(-2e-5 * 50.0 / (0.5 * 0.0427));
    printf("  landing spin %.9f rad/s, closed form %.9f rad/s\n", f.impact[6], want);
    CHECK_ABS(f.impact[6], want, 1e-9 * 300.0);
    CHECK_ABS(f.time_of_flight, sqrt(2.0 * 50.0 / 9.80665), 1e-9);
    dragarc_flight_clear(&f);
}

TEST(a_spin_vector_is_the_same_spin_as_its_rate_and_tilt)
{
    /* launch.spin.vector = rate x the axis that rate and tilt describe: the same equations, the same flight
     * to round-off (the axis is rebuilt from a normalised vector, 1e-16). */
    dragarc_scenario s;
    dragarc_flight a, b;
    spinning_ball(&s, 2500.0, 20.0, 30.0);
    s.projectile.lift.model = DRAGARC_LIFT_SAWICKI2003;
    CHECK(dragarc_flight_run(&s, 0.0, &a, NULL) == DRAGARC_OK);
    double axis[3];
    dragarc_spin_axis(20.0 * DEG, 30.0 * DEG, axis);
    s.launch.spin_axis_given = 1;
    memcpy(s.launch.spin_axis, axis, sizeof axis);
    s.launch.spin_tilt = 0.0;
    CHECK(dragarc_flight_run(&s, 0.0, &b, NULL) == DRAGARC_OK);
    CHECK_ABS(a.range, b.range, 1e-12 * a.range);
    CHECK_ABS(a.crossrange, b.crossrange, 1e-12 * a.range);
    dragarc_flight_clear(&a);
    dragarc_flight_clear(&b);
}

TEST(spin_about_the_direction_of_flight_gives_no_lift)
{
    /* A pure gyrospin (axis along the velocity) turns no air sideways: w x v_rel = 0, so F_L = 0 and the
     * flight is the one without spin (in still air, a vertical shot keeps its velocity on the axis). */
    dragarc_scenario s;
    dragarc_flight gyro, plain;
    spinning_ball(&s, 0.0, 0.0, 0.0);
    s.launch.elevation = 90.0 * DEG;
    s.launch.speed = 20.0;
    s.projectile.lift.model = DRAGARC_LIFT_SAWICKI2003;
    CHECK(dragarc_flight_run(&s, 0.0, &plain, NULL) == DRAGARC_OK);
    s.launch.spin_rate = 300.0;
    s.launch.spin_axis_given = 1;
    s.launch.spin_axis[0] = s.launch.spin_axis[1] = 0.0;
    s.launch.spin_axis[2] = 1.0;
    CHECK(dragarc_flight_run(&s, 0.1, &gyro, NULL) == DRAGARC_OK);
    CHECK_ABS(gyro.apex_height, plain.apex_height, 1e-9);
    CHECK_ABS(gyro.range, 0.0, 1e-9);
    for (size_t i = 0; i < gyro.npoints; i++)
        CHECK(gyro.points[i].lift_coefficient == 0.0 && gyro.points[i].spin_factor == 0.0);
    dragarc_flight_clear(&gyro);
    dragarc_flight_clear(&plain);
}

TEST(the_spin_factor_and_lift_along_a_flight_follow_the_fit)
{
    /* Each trajectory row reports S = r w_perp / |v_rel| and C_L(S) of the Sawicki et al. (2003) fit; both
     * are recomputed here from the row's own velocity (still air, pure backspin: w_perp = w). */
    dragarc_scenario s;
    dragarc_flight f;
    spinning_ball(&s, 2000.0, 0.0, 0.0);
    s.projectile.lift.model = DRAGARC_LIFT_SAWICKI2003;
    CHECK(dragarc_flight_run(&s, 0.25, &f, NULL) == DRAGARC_OK);
    for (size_t i = 0; i < f.npoints; i++) {
        const dragarc_flight_point *p = &f.points[i];
        double S = 0.5 * 0.0427 * p->spin / p->speed;
        CHECK_ABS(p->spin_factor, S, 1e-14);
        CHECK_ABS(p->lift_coefficient, S < 0.1 ? 1.5 * S : 0.09 + 0.6 * S, 1e-14);
        CHECK_ABS(p->drag_coefficient, 0.25, 1e-14);
    }
    dragarc_flight_clear(&f);
}

TEST(the_integrators_agree_on_a_decaying_spinning_flight)
{
    /* The spin rate as a seventh state value on every path: DOP853, rk8pd, Adams and BDF agree on a ball with
     * the Sawicki lift fit and air-torque decay to the tolerance (1e-10), allowed 1e-7 m as in the grid test. */
    dragarc_scenario s;
    dragarc_flight f[4];
    const dragarc_method m[4] = {DRAGARC_METHOD_DOP853, DRAGARC_METHOD_RK8PD, DRAGARC_METHOD_ADAMS, DRAGARC_METHOD_BDF};
    for (int i = 0; i < 4; i++) {
        spinning_ball(&s, 3200.0, -10.0, 0.0);
        s.projectile.lift.model = DRAGARC_LIFT_SAWICKI2003;
        s.projectile.spin_decay_coefficient = 2e-5;
        s.solver.method = m[i];
        CHECK(dragarc_flight_run(&s, 0.0, &f[i], NULL) == DRAGARC_OK);
    }
    for (int i = 1; i < 4; i++) {
        CHECK_ABS(f[i].range, f[0].range, 1e-7);
        CHECK_ABS(f[i].crossrange, f[0].crossrange, 1e-7);
        CHECK_ABS(f[i].impact[6], f[0].impact[6], 1e-6);
    }
    printf("  range %.6f m, crossrange %.6f m, landing spin %.2f rpm (dop853)\n", f[0].range, f[0].crossrange,
           f[0].impact[6] * 60.0 / (2.0 * PI));
    for (int i = 0; i < 4; i++)
        dragarc_flight_clear(&f[i]);
}

TEST(a_ball_dropped_in_a_vacuum_rebounds_to_e_squared_of_its_height)
{
    /* Newton's rule v_z' = -e v_z (Brody 1984, "That's how the ball bounces", Phys. Teach. 22:494; the model of
     * bounce.h): dropped from h in a vacuum it lands at sqrt(2 g h), leaves at e sqrt(2 g h), so it is in the
     * air 2 e sqrt(2 g h) / g before landing again and rises to e^2 h (closed forms). Each rebound repeats
     * with one more factor e, until the rebound would rise less than ground.bounce.min_height. Tolerance
     * 1e-9: the integration's (rtol 1e-11). */
    dragarc_scenario s;
    dragarc_flight f;
    const double h = 2.0, e = 0.7, g = 9.80665;
    make_scenario(&s, 0.0, 0.0577, 0.067, h, 0.0, 0.0, g, 1e-11);
    s.ground_surface_given = 1;
    s.surface.restitution = e;
    s.surface.friction = 0.5;
    s.surface.rolling_resistance = 0.1;
    s.bounce.min_height = 0.01;
    CHECK(dragarc_flight_run(&s, 0.01, &f, NULL) == DRAGARC_OK);
    /* rebounds rise e^2 h, e^4 h, ...: 0.98, 0.48, 0.235, 0.115, 0.0565, 0.0277, 0.0136 m, then 0.0066 < 0.01 */
    CHECK(f.bounces == 7 && f.nlandings == 8);
    double v = sqrt(2.0 * g * h);
    for (size_t i = 0; i + 1 < f.nlandings; i++) {
        CHECK_ABS(f.landings[i].speed_in, v, 1e-9);
        CHECK_ABS(f.landings[i].speed_out, e * v, 1e-9);
        CHECK_ABS(f.landings[i + 1].t - f.landings[i].t, 2.0 * e * v / g, 1e-9);
        v *= e;
    }
    /* the samples of the first rebound peak at e^2 h (sampled every 0.01 s: within g (0.005 s)^2 / 2) */
    double top = 0.0;
    for (size_t i = 0; i < f.npoints; i++)
        if (f.points[i].t > f.landings[0].t && f.points[i].t < f.landings[1].t)
            top = fmax(top, f.points[i].pos[2]);
    printf("  first rebound peaks at %.6f m (e^2 h = %.6f m); %d bounces\n", top, e * e * h, f.bounces);
    CHECK_ABS(top, e * e * h, 0.5 * g * 0.005 * 0.005 + 1e-9);
    CHECK_ABS(f.total_distance, 0.0, 1e-12);
    CHECK(f.landings[f.nlandings - 1].rolls == 1);
    dragarc_flight_clear(&f);
}

TEST(a_ball_that_lands_gripping_rolls_out_as_the_closed_forms_say)
{
    /* Thrown level at u from height h in a vacuum onto a surface with e = 0 and ample friction: it lands at
     * x = u sqrt(2 h / g), its contact point stops during the impact, and it leaves rolling at 5/7 u (a solid
     * sphere without spin: Brody 1984; the rolling condition of bounce.h), then decelerates at mu_r g, so it
     * rolls (5u/7)^2 / (2 mu_r g) further and rests after (5u/7) / (mu_r g) (closed forms). */
    dragarc_scenario s;
    dragarc_flight f;
    const double h = 1.2, u = 6.0, g = 9.80665, mu_r = 0.3;
    make_scenario(&s, 0.0, 0.16, 0.072, h, u, 0.0, g, 1e-11);
    s.projectile.inertia_factor = 0.4;
    s.ground_surface_given = 1;
    s.surface.restitution = 0.0;
    s.surface.friction = 2.0;
    s.surface.rolling_resistance = mu_r;
    CHECK(dragarc_flight_run(&s, 0.0, &f, NULL) == DRAGARC_OK);
    double t1 = sqrt(2.0 * h / g), vr = 5.0 * u / 7.0;
    CHECK(f.bounces == 0 && f.nlandings == 1 && f.landings[0].grips == 1);
    CHECK_ABS(f.range, u * t1, 1e-9);
    CHECK_ABS(f.roll_distance, vr * vr / (2.0 * mu_r * g), 1e-9);
    CHECK_ABS(f.total_distance, u * t1 + vr * vr / (2.0 * mu_r * g), 1e-9);
    CHECK_ABS(f.rest_time, t1 + vr / (mu_r * g), 1e-9);
    CHECK_ABS(f.rest_position[0], 0.0, 1e-12); /* launched north: it stays on the line */
    printf("  carry %.6f m, roll %.6f m, total %.6f m\n", f.range, f.roll_distance, f.total_distance);
    dragarc_flight_clear(&f);
}

TEST(backspin_checks_a_ball_up_and_topspin_runs_it_on)
{
    /* The same carry with and without spin lift is not comparable, so the lift model is off: only the spin's
     * effect at the ground is left. A backspinning ball's contact point slides forward fast, so friction takes
     * more of its speed than a ball landing without spin; topspin leaves it faster (sign of the impulse in
     * bounce.h, Cross 2002). */
    dragarc_scenario s;
    dragarc_flight none, back, top;
    const double rpm[3] = {0.0, 3000.0, 3000.0}, tilt[3] = {0.0, 0.0, 180.0};
    dragarc_flight *out[3] = {&none, &back, &top};
    for (int i = 0; i < 3; i++) {
        spinning_ball(&s, rpm[i], tilt[i], 0.0);
        s.projectile.lift.model = DRAGARC_LIFT_NONE;
        s.ground_surface_given = 1;
        s.surface = (dragarc_surface){0.4, 0.4, 0.25, 0.0};
        CHECK(dragarc_flight_run(&s, 0.0, out[i], NULL) == DRAGARC_OK);
    }
    printf("  run after landing: no spin %.2f m, backspin %.2f m, topspin %.2f m\n", none.total_distance - none.range,
           back.total_distance - back.range, top.total_distance - top.range);
    CHECK(none.range == back.range && none.range == top.range);
    CHECK(back.total_distance < none.total_distance && top.total_distance > none.total_distance);
    dragarc_flight_clear(&none);
    dragarc_flight_clear(&back);
    dragarc_flight_clear(&top);
}

TEST(thinner_air_at_a_high_site_carries_a_batted_ball_farther)
{
    /* The same batted ball (145.29 g, 73.78 mm, Cd 0.33, the Sawicki et al. 2003 lift fit, 46 m/s at 28 deg
     * with 2200 rpm backspin from 1 m) on a standard day at sea level and at a 1600 m site. Less dense air
     * means less drag and less lift; drag wins, and the carry grows. Published range: the "widely held
     * assumption" of 10 % farther at Denver (about 1600 m), which Chambers, Page & Zaidins (2003), "Atmosphere,
     * weather, and baseball: how much farther do baseballs really fly at Denver's Coors Field?", Professional
     * Geographer 55:491 (abstract read) find to be an overestimate; physics estimates of about 5 % for a long
     * fly ball (Nathan's analyses of Coors Field; recalled). So the gain must lie between 3 % and 10 %. */
    dragarc_scenario s;
    dragarc_flight low, high;
    for (int i = 0; i < 2; i++) {
        dragarc_scenario_default(&s);
        s.projectile.mass = 0.14529;
        s.projectile.diameter = 0.07378;
        s.projectile.area = 0.25 * PI * 0.07378 * 0.07378;
        s.projectile.volume = PI * 0.07378 * 0.07378 * 0.07378 / 6.0;
        s.projectile.drag.model = DRAGARC_DRAG_CONSTANT;
        s.projectile.drag.cd = 0.33;
        s.projectile.lift.model = DRAGARC_LIFT_SAWICKI2003;
        s.launch.speed = 46.0;
        s.launch.elevation = 28.0 * DEG;
        s.launch.height = 1.0;
        s.launch.spin_rate = 2200.0 * 2.0 * PI / 60.0;
        s.atmosphere.site_elevation = i ? 1600.0 : 0.0;
        CHECK(dragarc_flight_run(&s, 0.0, i ? &high : &low, NULL) == DRAGARC_OK);
    }
    double gain = high.range / low.range - 1.0;
    printf("  carry %.2f m at sea level, %.2f m at 1600 m: %+.1f %%\n", low.range, high.range, 100.0 * gain);
    CHECK(gain > 0.03 && gain < 0.10);
    dragarc_flight_clear(&low);
    dragarc_flight_clear(&high);
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

TEST(running_out_of_steps_is_an_error_naming_the_limit)
{
    dragarc_scenario s;
    dragarc_flight f;
    dragarc_error e;
    make_scenario(&s, 1.2, 0.145, 0.074, 1.0, 40.0, 30.0, 9.80665, 1e-12);
    s.projectile.drag.model = DRAGARC_DRAG_CONSTANT;
    s.projectile.drag.cd = 0.35;
    s.solver.max_steps = 10;
    CHECK(dragarc_flight_run(&s, 0.0, &f, &e) == DRAGARC_ESOLVER);
    CHECK(strcmp(e.field, "solver.max_steps") == 0 && strstr(e.message, "DOP853: more than 10 steps"));
    dragarc_flight_clear(&f);
    s.solver.method = DRAGARC_METHOD_ADAMS; /* CVODE's path names its own flag */
    CHECK(dragarc_flight_run(&s, 0.0, &f, &e) == DRAGARC_ESOLVER);
    CHECK(strcmp(e.field, "solver.max_steps") == 0 && strstr(e.message, "CV_TOO_MUCH_WORK"));
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

TEST(the_four_integrators_agree_on_a_grid_of_flights)
{
    /* One accuracy contract across paths: at rtol = atol = 1e-10 the explicit DOP853 and rk8pd paths and
     * CVODE's Adams and BDF give the same time of flight, range, crossrange, apex and impact speed to 1e-7 relative
     * (1e-6 m absolute), each path's global error being about 10-100 times the tolerance. Cases: a ball in
     * wind (constant Cd, ISA), a sphere-drag drop of 0.4 mm from 2 m, a linear-drag body in vacuum from a
     * hill, a layered-wind fragment falling 3 km through ISA air, a throw onto a terrace above the launch. */
    dragarc_scenario cases[5];
    make_scenario(&cases[0], 1.2, 0.145, 0.074, 1.0, 40.0, 30.0, 9.80665, 1e-10);
    cases[0].atmosphere.model = DRAGARC_ATMOSPHERE_ISA;
    cases[0].projectile.drag.model = DRAGARC_DRAG_CONSTANT;
    cases[0].projectile.drag.cd = 0.35;
    cases[0].wind.model = DRAGARC_WIND_CONSTANT;
    cases[0].wind.speed = 6.0;
    cases[0].wind.from = 300.0 * DEG;
    sphere_drop(&cases[1], 4e-4, 2.0);
    cases[1].launch.speed = 8.0;
    cases[1].launch.elevation = 20.0 * DEG;
    cases[1].solver.rtol = cases[1].solver.atol = 1e-10;
    make_scenario(&cases[2], 0.0, 2.0, 0.1, 40.0, 25.0, 50.0, 9.81, 1e-10);
    cases[2].projectile.drag.model = DRAGARC_DRAG_LINEAR;
    cases[2].projectile.drag.k = 0.05;
    dragarc_wind_layer rows[] = {{0.0, 3.0, 200.0 * DEG}, {1000.0, 9.0, 240.0 * DEG}, {3000.0, 16.0, 260.0 * DEG}};
    make_scenario(&cases[3], 0.0, 0.04, 0.03, 3000.0, 120.0, 5.0, 9.80665, 1e-10);
    cases[3].atmosphere.model = DRAGARC_ATMOSPHERE_ISA;
    cases[3].projectile.drag.model = DRAGARC_DRAG_CONSTANT;
    cases[3].projectile.drag.cd = 1.1;
    cases[3].wind.model = DRAGARC_WIND_LAYERED;
    cases[3].wind.layers = rows;
    cases[3].wind.nlayers = 3;
    make_scenario(&cases[4], 1.2, 0.145, 0.074, 1.0, 15.0, 60.0, 9.80665, 1e-10);
    cases[4].projectile.drag.model = DRAGARC_DRAG_CONSTANT;
    cases[4].projectile.drag.cd = 0.35;
    cases[4].ground_elevation = 6.0;
    const dragarc_method methods[] = {DRAGARC_METHOD_DOP853, DRAGARC_METHOD_RK8PD, DRAGARC_METHOD_ADAMS,
                                      DRAGARC_METHOD_BDF};
    for (size_t i = 0; i < 5; i++) {
        dragarc_flight f[4];
        for (size_t m = 0; m < 4; m++) {
            cases[i].solver.method = methods[m];
            dragarc_error e;
            int rc = dragarc_flight_run(&cases[i], 0.0, &f[m], &e);
            if (rc != DRAGARC_OK)
                printf("  case %zu, %s: %s\n", i, dragarc_method_name(methods[m]), e.message);
            CHECK(rc == DRAGARC_OK);
        }
        printf("  case %zu: dop853 %ld steps, rk8pd %ld, adams %ld, bdf %ld; range %.9f / %.9f / %.9f / %.9f m\n", i,
               f[0].steps, f[1].steps, f[2].steps, f[3].steps, f[0].range, f[1].range, f[2].range, f[3].range);
        for (size_t m = 1; m < 4; m++) {
            CHECK_ABS(f[m].time_of_flight, f[0].time_of_flight, 1e-7 * f[0].time_of_flight);
            CHECK_ABS(f[m].range, f[0].range, 1e-6 + 1e-7 * f[0].range);
            CHECK_ABS(f[m].crossrange, f[0].crossrange, 1e-6 + 1e-7 * f[0].range);
            CHECK_ABS(f[m].apex_height, f[0].apex_height, 1e-6 + 1e-7 * f[0].apex_height);
            CHECK_ABS(f[m].impact_speed, f[0].impact_speed, 1e-7 * f[0].impact_speed);
        }
        for (size_t m = 0; m < 4; m++)
            dragarc_flight_clear(&f[m]);
    }
}

int main(void)
{
    dragarc_init();
    RUN(fine_drop_goes_to_bdf_and_agrees_with_adams);
    RUN(ball_flight_takes_the_explicit_path);
    RUN(the_four_integrators_agree_on_a_grid_of_flights);
    RUN(samples_are_evenly_spaced_and_end_on_the_ground);
    RUN(samples_between_steps_agree_with_steps_taken_to_them);
    RUN(spin_lift_behaves_as_its_geometry_says);
    RUN(exponential_spin_decay_follows_its_closed_form);
    RUN(air_torque_spin_decay_follows_its_closed_form_in_a_vacuum_drop);
    RUN(a_spin_vector_is_the_same_spin_as_its_rate_and_tilt);
    RUN(spin_about_the_direction_of_flight_gives_no_lift);
    RUN(the_spin_factor_and_lift_along_a_flight_follow_the_fit);
    RUN(the_integrators_agree_on_a_decaying_spinning_flight);
    RUN(a_ball_dropped_in_a_vacuum_rebounds_to_e_squared_of_its_height);
    RUN(a_ball_that_lands_gripping_rolls_out_as_the_closed_forms_say);
    RUN(backspin_checks_a_ball_up_and_topspin_runs_it_on);
    RUN(thinner_air_at_a_high_site_carries_a_batted_ball_farther);
    RUN(downward_launch_has_its_apex_at_the_launch_point);
    RUN(landing_on_raised_ground_counts_only_the_descending_crossing);
    RUN(wind_from_the_left_pushes_the_impact_to_the_right);
    RUN(buoyant_body_that_never_lands_is_an_error_not_a_number);
    RUN(leaving_the_standard_atmosphere_is_reported_with_the_time);
    RUN(running_out_of_steps_is_an_error_naming_the_limit);
    RUN(invalid_scenario_is_refused_before_flying);
    return check_summary();
}
