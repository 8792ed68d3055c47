/* test_earth.c: flights over a spherical Earth, turning or not, against closed forms of classical mechanics.
 * SPDX-License-Identifier: GPL-3.0-or-later
 *
 * Sources:
 *  - the eastward deflection of a body dropped from rest from height h: x = (1/3) w cos(phi) sqrt(8 h^3 / g), to
 *    first order in w, g the (plumb-line) gravity (Landau, L. D. & Lifshitz, E. M. 1976, Mechanics, 3rd ed.,
 *    Pergamon, section 39, problem 1, x = (1/3) (2h/g)^(3/2) g w cos(phi); recalled, and worked again here: the
 *    Coriolis acceleration -2 Omega x v of the fall v = -g t z^ is 2 w g t cos(phi) eastward, twice integrated
 *    (1/3) w g t^3 cos(phi), with t = sqrt(2 h / g));
 *  - a radial fall from rest at r0 in the field -mu r / |r|^3, mu = g0 R^2: energy conservation, v^2 = 2 mu (1/r -
 *    1/r0), so at the surface v^2 = 2 g0 R h / (R + h); integrating dt = -dr / v with r = r0 cos^2(eta) gives
 *    t = sqrt(r0^3 / (2 mu)) (eta + sin(eta) cos(eta)), cos^2(eta) = R / r0 (the radial case of Kepler motion,
 *    e.g. Landau & Lifshitz 1976, section 15; the substitution is worked here, exact);
 *  - the Jacobi integral: in a frame turning at a constant Omega about the centre of a fixed potential U, the
 *    energy 1/2 v^2 + U - 1/2 |Omega x r|^2 is conserved (Landau & Lifshitz 1976, section 39, eq. 39.13;
 *    recalled).
 * The flights are in vacuum (a fluid of density 0, no drag), so these are exact statements about the equations
 * dragarc integrates; each tolerance says what it allows for.
 */
#include <stdlib.h>

#include "check.h"
#include "dragarc/flight.h"
#include "dragarc/scenario.h"
#include "helpers.h"

#define G0 9.80665 /* m/s^2, standard gravity: the gravitation at the surface in these tests */

static const dragarc_method METHODS[] = {DRAGARC_METHOD_DOP853, DRAGARC_METHOD_RK8PD, DRAGARC_METHOD_ADAMS,
                                         DRAGARC_METHOD_BDF};
#define NMETHODS (sizeof METHODS / sizeof METHODS[0])

/* A vacuum flight over a sphere of the default radius; rotation at latitude lat_deg when turning. */
static void make_sphere(dragarc_scenario *s, double h, double v, double el_deg, int turning, double lat_deg,
                        double tol)
{
    make_scenario(s, 0.0, 1.0, 0.05, h, v, el_deg, G0, tol);
    s->earth.model = DRAGARC_EARTH_SPHERICAL;
    s->earth.rotation = turning;
    if (turning)
        CHECK(dragarc_scenario_set_latitude(s, lat_deg * DEG, NULL) == DRAGARC_OK);
    s->solver.max_time = 20000.0;
}

static int fly(const dragarc_scenario *s, double dt, dragarc_flight *f)
{
    dragarc_error e;
    int rc = dragarc_flight_run(s, dt, f, &e);
    if (rc != DRAGARC_OK)
        printf("  flight failed (%s): %s: %s\n", dragarc_method_name(s->solver.method), e.field, e.message);
    CHECK(rc == DRAGARC_OK);
    return rc;
}

TEST(a_body_dropped_on_a_turning_earth_lands_east_of_the_plumb_line_by_the_first_order_deflection)
{
    /* h = 100 m, fall time 4.5 s. Landau & Lifshitz's g is the plumb-line gravity g_e, here the gravitation g0 and
     * the centrifugal acceleration w^2 R (0, -sin phi cos phi, cos^2 phi) at the origin; its share is not small
     * against the tolerance (w^2 R = 0.034 m/s^2, 3.4e-3 of g). Away from the equator it also tilts the fall
     * toward the equator, and the Coriolis acceleration of the fall v = g_e t is then -2 (Omega x g_e) t, whose east
     * component is 2 w cos(phi) (g0 - w^2 R) t: the formula's g w cos(phi) with g0 - w^2 R for g (worked here from
     * Omega and g_e; the two agree at the equator, and differ by w^2 R sin^2(phi) / g, 2e-3 at 50 degrees). So the
     * deflection checked is x = (1/3) w cos(phi) (g0 - w^2 R) T^3, T = sqrt(2 h / g_up) the fall time under the
     * vertical part g_up = g0 - w^2 R cos^2(phi). What that leaves out, relative to x: terms in (w T)^2 = 1e-7 (the
     * east deflection is odd in w, so there is no term in w T itself); the gravitation's growth by 2 h / R = 3.1e-5
     * over the fall, which shortens it and changes x by about h / R = 1.6e-5; the curvature of the ground under the
     * 0.17 m southward drift, nothing. So 1e-4 relative, six times the largest. The reported east offset is the arc
     * along the ground; it differs from the frame's x by (x / R)^2, nothing here. */
    const double h = 100.0, w = DRAGARC_EARTH_ROTATION_RATE, R = DRAGARC_EARTH_RADIUS;
    const double lats[] = {0.0, 50.0, -35.0};
    for (size_t i = 0; i < sizeof lats / sizeof lats[0]; i++) {
        double phi = lats[i] * DEG, g_up = G0 - w * w * R * cos(phi) * cos(phi);
        double fall = sqrt(2.0 * h / g_up);
        double want = 1.0 / 3.0 * w * cos(phi) * (G0 - w * w * R) * fall * fall * fall, got = NAN;
        if (lats[i] == 0.0) /* the textbook's form, g = g_e */
            CHECK_REL(want, 1.0 / 3.0 * w * sqrt(8.0 * h * h * h / g_up), 1e-15);
        for (size_t m = 0; m < NMETHODS; m++) {
            dragarc_scenario s;
            dragarc_flight f;
            make_sphere(&s, h, 0.0, 0.0, 1, lats[i], 1e-12);
            s.solver.method = METHODS[m];
            if (fly(&s, 0.0, &f) == DRAGARC_OK) {
                CHECK_REL(f.impact[0], want, 1e-4);
                CHECK(f.impact[2] == 0.0);
                got = f.impact[0];
            }
            dragarc_flight_clear(&f);
        }
        printf("  latitude %g: east deflection %.9g m (bdf; the others alike), first order %.9g m (%.2g relative)\n",
               lats[i], got, want, (got - want) / want);
    }
}

TEST(a_radial_fall_under_inverse_square_gravity_takes_the_kepler_time_and_lands_at_the_energy_speed)
{
    /* From h = 1000 km, no rotation: the closed forms are exact for these equations. 1e-9 relative: the flight is
     * run at rtol = atol = 1e-12 and lasts some hundreds of steps, whose errors add to well under 1e-10; the
     * impact's root finding is at round-off. */
    const double h = 1.0e6, R = DRAGARC_EARTH_RADIUS, g0 = G0, mu = g0 * R * R, r0 = R + h;
    const double eta = acos(sqrt(R / r0));
    const double t_fall = sqrt(r0 * r0 * r0 / (2.0 * mu)) * (eta + sin(eta) * cos(eta));
    const double v_imp = sqrt(2.0 * g0 * R * h / (R + h));
    for (size_t m = 0; m < NMETHODS; m++) {
        dragarc_scenario s;
        dragarc_flight f;
        make_sphere(&s, h, 0.0, 0.0, 0, 0.0, 1e-12);
        s.solver.method = METHODS[m];
        if (fly(&s, 0.0, &f) == DRAGARC_OK) {
            CHECK_REL(f.time_of_flight, t_fall, 1e-9);
            CHECK_REL(f.impact_speed, v_imp, 1e-9);
            CHECK_ABS(f.impact_angle, 90.0 * DEG, 1e-9);
            CHECK(f.range == 0.0);
            CHECK_REL(f.apex_height, h, 1e-15);
            printf("  %s: time %+.2g, speed %+.2g relative\n", dragarc_method_name(METHODS[m]),
                   (f.time_of_flight - t_fall) / t_fall, (f.impact_speed - v_imp) / v_imp);
        }
        dragarc_flight_clear(&f);
    }
    printf("  fall from %g km: %.9g s, %.9g m/s (a flat Earth: %.6g s, %.6g m/s)\n", h / 1e3, t_fall, v_imp,
           sqrt(2.0 * h / g0), sqrt(2.0 * g0 * h));
}

/* The state in the local frame (position from the origin, velocity) of a reported point: the arc s = R theta
 * along the azimuth az, the height h, and the velocity turned back from the frame carried along the great
 * circle (the inverse of earth.h's report, written from its definition). */
static void unreport(double R, const double pos[3], const double vel[3], double y[6])
{
    double s = hypot(pos[0], pos[1]), th = s / R, az = atan2(pos[0], pos[1]), rr = R + pos[2];
    y[0] = rr * sin(th) * sin(az);
    y[1] = rr * sin(th) * cos(az);
    y[2] = rr * cos(th) - R;
    if (!(s > 0.0)) {
        y[3] = vel[0], y[4] = vel[1], y[5] = vel[2];
        return;
    }
    /* rotate by +theta about k = (-cos az, sin az, 0) (the unit vector of z^ x r) */
    double k[3] = {-cos(az), sin(az), 0.0}, c = cos(th), sn = sin(th);
    double kxv[3] = {k[1] * vel[2] - k[2] * vel[1], k[2] * vel[0] - k[0] * vel[2], k[0] * vel[1] - k[1] * vel[0]};
    double kv = k[0] * vel[0] + k[1] * vel[1] + k[2] * vel[2];
    for (int i = 0; i < 3; i++)
        y[3 + i] = vel[i] * c + kxv[i] * sn + k[i] * kv * (1.0 - c);
}

/* 1/2 v^2 - mu / |r| - 1/2 |Omega x r|^2 at the local-frame state y. */
static double jacobi(double R, double g0, const double om[3], const double y[6])
{
    double r[3] = {y[0], y[1], y[2] + R}, rn = sqrt(r[0] * r[0] + r[1] * r[1] + r[2] * r[2]);
    double c[3] = {om[1] * r[2] - om[2] * r[1], om[2] * r[0] - om[0] * r[2], om[0] * r[1] - om[1] * r[0]};
    return 0.5 * (y[3] * y[3] + y[4] * y[4] + y[5] * y[5]) - g0 * R * R / rn - 0.5 * (c[0] * c[0] + c[1] * c[1] + c[2] * c[2]);
}

TEST(the_jacobi_integral_holds_along_a_long_ballistic_flight_on_a_turning_earth)
{
    /* 2 km/s at 45 degrees toward 030 from the ground at latitude 40: some 400 km downrange and 100 km up, 290 s.
     * The integral is held against the launch energy 1/2 v0^2 = 2e6 J/kg: position errors dr of rtol times the
     * range (4e-7 m at rtol 1e-12) move it by g dr, 4e-6 J/kg, 2e-12 of the scale; error growth over the few
     * hundred steps and the round-off of the sums (mu / R is 6.2e7 J/kg: 1e-8 J/kg) stay far below the 1e-9
     * allowed. Every sample is taken back to the local frame (unreport), so the reported offsets are checked too. */
    const double R = DRAGARC_EARTH_RADIUS, g0 = G0, v0 = 2000.0;
    for (size_t m = 0; m < NMETHODS; m++) {
        dragarc_scenario s;
        dragarc_flight f;
        make_sphere(&s, 0.0, v0, 45.0, 1, 40.0, 1e-12);
        s.launch.azimuth = 30.0 * DEG;
        s.solver.method = METHODS[m];
        double om[3];
        dragarc_earth_omega(&s.earth, om);
        if (fly(&s, 1.0, &f) == DRAGARC_OK) {
            double y[6], worst = 0.0;
            unreport(R, f.points[0].pos, f.points[0].vel, y);
            double j0 = jacobi(R, g0, om, y);
            for (size_t i = 1; i < f.npoints; i++) {
                unreport(R, f.points[i].pos, f.points[i].vel, y);
                worst = fmax(worst, fabs(jacobi(R, g0, om, y) - j0));
            }
            CHECK(f.npoints > 200);
            CHECK(f.range > 3e5 && f.apex_height > 8e4);
            CHECK_ABS(worst / (0.5 * v0 * v0), 0.0, 1e-9);
            printf("  %s: %zu samples, range %.6g m, crossrange %.6g m; worst change of the integral %.3g J/kg\n",
                   dragarc_method_name(METHODS[m]), f.npoints, f.range, f.crossrange, worst);
        }
        dragarc_flight_clear(&f);
    }
}

TEST(without_rotation_a_vacuum_flight_keeps_to_its_vertical_plane_and_its_energy)
{
    /* No rotation: the orbit lies in the plane of the launch and the centre, so the crossrange is zero (to the
     * integrator's round-off); the energy 1/2 v^2 - mu / r at impact equals that at launch, to the same 1e-9 of the
     * launch energy as above. */
    const double R = DRAGARC_EARTH_RADIUS, g0 = G0, v0 = 1500.0;
    dragarc_scenario s;
    dragarc_flight f;
    make_sphere(&s, 0.0, v0, 40.0, 0, 0.0, 1e-12);
    s.launch.azimuth = 123.0 * DEG;
    if (fly(&s, 0.0, &f) == DRAGARC_OK) {
        CHECK_ABS(f.crossrange, 0.0, 1e-6);
        double e0 = 0.5 * v0 * v0 - g0 * R, e1 = 0.5 * f.impact_speed * f.impact_speed - g0 * R;
        CHECK_ABS((e1 - e0) / (0.5 * v0 * v0), 0.0, 1e-9);
    }
    dragarc_flight_clear(&f);
}

TEST(bad_earth_inputs_are_refused_naming_the_field)
{
    static const struct {
        const char *earth, *field, *text;
    } cases[] = {
        {"{\"model\": \"spherical\", \"latitude\": 91}", "environment.earth.latitude",
         "must be between -90 and 90 degrees (got 91)"},
        {"{\"model\": \"oblate\"}", "environment.earth.model", "unknown Earth model \"oblate\" (flat, spherical)"},
        {"{\"model\": \"spherical\", \"rotation\": false, \"radius\": -5}", "environment.earth.radius",
         "must be between 1000 m and 1e8 m (got -5)"},
        {"{\"model\": \"spherical\"}", "environment.earth.latitude", "is required with rotation"},
        {"{\"model\": \"spherical\", \"rotation\": 1, \"latitude\": 10}", "environment.earth.rotation",
         "must be true or false, not a number"},
        {"{\"model\": \"flat\", \"latitude\": 10}", "environment.earth.latitude", "unknown key (allowed here: model)"},
        {"{\"model\": \"spherical\", \"latitude\": 10, \"rotation_rate\": 1}", "environment.earth.rotation_rate",
         "must be between 0 and 0.01 rad/s (got 1)"},
        {"{\"latitude\": 10}", "environment.earth.model", "is required"},
    };
    for (size_t i = 0; i < sizeof cases / sizeof cases[0]; i++) {
        char text[1024];
        snprintf(text, sizeof text,
                 "{\"projectile\": {\"mass\": 1, \"diameter\": 0.1, \"drag\": {\"model\": \"constant\", \"cd\": 0.5}},"
                 " \"launch\": {\"speed\": 10, \"elevation\": 10, \"height\": 1}, \"environment\": {\"earth\": %s}}",
                 cases[i].earth);
        dragarc_scenario s;
        dragarc_error e;
        int rc = dragarc_scenario_parse(text, NULL, NULL, &s, &e);
        CHECK_ERROR(rc, DRAGARC_EINVAL, e, cases[i].field, cases[i].text);
        dragarc_scenario_clear(&s);
    }
    /* a surface to bounce on only on the flat Earth; the latitude setter's range */
    dragarc_scenario s;
    dragarc_error e;
    dragarc_flight f;
    make_sphere(&s, 10.0, 0.0, 0.0, 0, 0.0, 1e-8);
    s.ground_surface_given = 1;
    s.surface = (dragarc_surface){0.5, 0.4, 0.1, 0.0};
    CHECK_ERROR(dragarc_flight_run(&s, 0.0, &f, &e), DRAGARC_EINVAL, e, "ground.surface",
                "bouncing and rolling are modelled on a flat Earth only");
    dragarc_flight_clear(&f);
    CHECK_ERROR(dragarc_scenario_set_latitude(&s, -1.6, &e), DRAGARC_EINVAL, e, "environment.earth.latitude",
                "must be between -90 and 90 degrees");
    CHECK(dragarc_scenario_set_latitude(&s, 0.5, &e) == DRAGARC_OK && s.earth.latitude == 0.5);
}

TEST(a_spherical_earth_is_read_with_its_defaults_and_flat_is_the_default)
{
    dragarc_scenario s;
    dragarc_error e;
    const char *flat = "{\"projectile\": {\"mass\": 1, \"diameter\": 0.1, \"drag\": {\"model\": \"constant\", \"cd\": "
                       "0.5}}, \"launch\": {\"speed\": 10, \"elevation\": 10, \"height\": 1}}";
    CHECK(dragarc_scenario_parse(flat, NULL, NULL, &s, &e) == DRAGARC_OK);
    CHECK(s.earth.model == DRAGARC_EARTH_FLAT);
    dragarc_scenario_clear(&s);
    const char *sphere = "{\"projectile\": {\"mass\": 1, \"diameter\": 0.1, \"drag\": {\"model\": \"constant\", \"cd\":"
                         " 0.5}}, \"launch\": {\"speed\": 10, \"elevation\": 10, \"height\": 1}, \"environment\": "
                         "{\"earth\": {\"model\": \"spherical\", \"latitude\": \"-33.5 degree\"}}}";
    int rc = dragarc_scenario_parse(sphere, NULL, NULL, &s, &e);
    CHECK(rc == DRAGARC_OK);
    if (rc == DRAGARC_OK) {
        CHECK(s.earth.model == DRAGARC_EARTH_SPHERICAL && s.earth.rotation && s.earth.latitude_given);
        CHECK_ABS(s.earth.latitude, -33.5 * DEG, 1e-15);
        CHECK(s.earth.radius == 6371008.8 && s.earth.rotation_rate == 7.292115e-5);
    }
    dragarc_scenario_clear(&s);
}

int main(void)
{
    dragarc_init();
    RUN(a_body_dropped_on_a_turning_earth_lands_east_of_the_plumb_line_by_the_first_order_deflection);
    RUN(a_radial_fall_under_inverse_square_gravity_takes_the_kepler_time_and_lands_at_the_energy_speed);
    RUN(the_jacobi_integral_holds_along_a_long_ballistic_flight_on_a_turning_earth);
    RUN(without_rotation_a_vacuum_flight_keeps_to_its_vertical_plane_and_its_energy);
    RUN(bad_earth_inputs_are_refused_naming_the_field);
    RUN(a_spherical_earth_is_read_with_its_defaults_and_flat_is_the_default);
    return check_summary();
}
