/* test_closed_forms.c: flights whose equations of motion have exact solutions.
 * SPDX-License-Identifier: GPL-3.0-or-later
 *
 * Sources (closed forms, exact):
 *  - vacuum: range v^2 sin(2 theta) / g, apex v^2 sin^2(theta) / (2 g), time 2 v sin(theta) / g;
 *  - linear drag (F = -k v): dropped from rest v(t) = (m g / k)(1 - exp(-k t / m)); launched from the
 *    ground, time of flight T = [alpha + W0(-alpha e^-alpha)] / kappa, alpha = 1 + kappa w / g,
 *    kappa = k / m, range R = (u / kappa)(1 - exp(-kappa T)) (Warburton, R. D. H. & Wang, J. 2004,
 *    "Analysis of asymptotic projectile motion with air resistance using the Lambert W function",
 *    Am. J. Phys. 72:1404, eqs. 7-11; the Lambert W function from GSL, gsl_sf_lambert_W0);
 *  - quadratic drag (F = -c |v| v), vertical, v_t = sqrt(m g / c): fall from rest v = v_t tanh(g t/v_t),
 *    drop (v_t^2 / g) ln cosh(g t / v_t); rise from v0: t_apex = (v_t / g) atan(v0 / v_t), height
 *    (v_t^2 / 2g) ln(1 + v0^2 / v_t^2); return speed v0 v_t / sqrt(v0^2 + v_t^2) (Taylor, J. R. 2005,
 *    Classical Mechanics, University Science Books, section 2.4 and problems 2.35-2.42).
 * Tolerances: these runs use rtol = atol = 1e-10; CVODE's global error is then typically 10 to 100
 * times the local tolerance, so 1e-7 relative (1e-6 m absolute on positions) is demanding but honest.
 */
#include <gsl/gsl_sf_lambert.h>

#include "check.h"
#include "helpers.h"

#define G 9.81

static void fly(const dragarc_scenario *s, double dt, dragarc_flight *f)
{
    dragarc_error e;
    int rc = dragarc_flight_run(s, dt, f, &e);
    if (rc != DRAGARC_OK)
        printf("  flight failed: %s: %s\n", e.field, e.message);
    CHECK(rc == DRAGARC_OK);
}

TEST(vacuum_flight_matches_range_apex_and_time_formulas)
{
    dragarc_scenario s;
    dragarc_flight f;
    make_scenario(&s, 0.0, 0.2, 0.05, 0.0, 50.0, 35.0, G, 1e-10);
    fly(&s, 0.0, &f);
    double th = 35.0 * DEG, v = 50.0;
    CHECK_REL(f.range, v * v * sin(2 * th) / G, 1e-8);
    CHECK_REL(f.apex_height, v * v * sin(th) * sin(th) / (2 * G), 1e-8);
    CHECK_REL(f.apex_time, v * sin(th) / G, 1e-8);
    CHECK_REL(f.time_of_flight, 2 * v * sin(th) / G, 1e-8);
    CHECK_REL(f.impact_speed, v, 1e-8);
    CHECK_ABS(f.impact_angle, th, 1e-8);
    CHECK_REL(f.vacuum_range, v * v * sin(2 * th) / G, 1e-14);
    CHECK(isnan(f.terminal_speed));
    dragarc_flight_clear(&f);
}

TEST(linear_drag_drop_from_rest_follows_exponential_approach_to_terminal_speed)
{
    dragarc_scenario s;
    dragarc_flight f;
    const double m = 0.5, k = 0.05; /* kappa = 0.1 1/s, v_t = m g / k = 98.1 m/s */
    make_scenario(&s, 0.0, m, 0.05, 2000.0, 0.0, 0.0, G, 1e-10);
    s.projectile.drag.model = DRAGARC_DRAG_LINEAR;
    s.projectile.drag.k = k;
    fly(&s, 0.5, &f);
    CHECK(f.npoints > 20);
    double vt = m * G / k, worst_v = 0.0, worst_z = 0.0;
    for (size_t i = 0; i < f.npoints; i++) {
        double t = f.points[i].t;
        double v = -vt * (1.0 - exp(-k * t / m));
        double z = 2000.0 - vt * (t - m / k * (1.0 - exp(-k * t / m)));
        worst_v = fmax(worst_v, fabs(f.points[i].vel[2] - v));
        worst_z = fmax(worst_z, fabs(f.points[i].pos[2] - z));
    }
    CHECK_ABS(worst_v, 0.0, 1e-6); /* m/s, over speeds up to ~70 m/s: 1e-8 relative */
    CHECK_ABS(worst_z, 0.0, 1e-5); /* m, over a 2000 m fall */
    CHECK_REL(f.terminal_speed, vt, 1e-10);
    dragarc_flight_clear(&f);
}

/* Range and time of flight with linear drag from the Lambert W closed form. */
static void lambert_range(double v0, double th, double kappa, double *range, double *tof)
{
    double u = v0 * cos(th), w = v0 * sin(th);
    double alpha = 1.0 + kappa * w / G;
    *tof = (alpha + gsl_sf_lambert_W0(-alpha * exp(-alpha))) / kappa;
    *range = u / kappa * (1.0 - exp(-kappa * *tof));
}

TEST(linear_drag_range_matches_lambert_w_closed_form)
{
    /* Published example values, computed from eqs. 7-11 of Warburton & Wang (2004) for v0 = 50 m/s,
     * 45 degrees, kappa = 0.1 1/s, g = 9.81: R = 169.11554 m, T = 6.50722 s (quoted to 8 and 6 figures). */
    double r, t;
    lambert_range(50.0, 45.0 * DEG, 0.1, &r, &t);
    CHECK_ABS(r, 169.11554, 5e-6);
    CHECK_ABS(t, 6.50722, 5e-6);
    const double angles[] = {10.0, 30.0, 45.0, 60.0, 80.0};
    for (size_t i = 0; i < sizeof angles / sizeof angles[0]; i++) {
        dragarc_scenario s;
        dragarc_flight f;
        make_scenario(&s, 0.0, 1.0, 0.05, 0.0, 50.0, angles[i], G, 1e-10);
        s.projectile.drag.model = DRAGARC_DRAG_LINEAR;
        s.projectile.drag.k = 0.1; /* kappa = k / m = 0.1 1/s */
        fly(&s, 0.0, &f);
        lambert_range(50.0, angles[i] * DEG, 0.1, &r, &t);
        CHECK_REL(f.range, r, 1e-7);
        CHECK_REL(f.time_of_flight, t, 1e-7);
        dragarc_flight_clear(&f);
    }
}

TEST(error_shrinks_as_tolerances_tighten)
{
    double r, t, first = NAN, prev = INFINITY;
    lambert_range(50.0, 45.0 * DEG, 0.1, &r, &t);
    const double tols[] = {1e-5, 1e-7, 1e-9, 1e-11};
    for (size_t i = 0; i < sizeof tols / sizeof tols[0]; i++) {
        dragarc_scenario s;
        dragarc_flight f;
        make_scenario(&s, 0.0, 1.0, 0.05, 0.0, 50.0, 45.0, G, tols[i]);
        s.projectile.drag.model = DRAGARC_DRAG_LINEAR;
        s.projectile.drag.k = 0.1;
        fly(&s, 0.0, &f);
        double e = fabs(f.range - r);
        printf("  rtol %.0e: range error %.3e m (%ld steps)\n", tols[i], e, f.steps);
        /* The contract: the range is good to the relative tolerance asked for. An eighth-order method often
         * does far better at loose tolerances (DOP853 at 1e-5 lands within 1e-9 of the range here), so the
         * error need not shrink in proportion at every step; it must never grow by more than round-off as
         * the tolerance tightens, and over the six decades it must fall by at least three. */
        CHECK(e <= tols[i] * r);
        CHECK(e <= prev + 1e-12 * r);
        if (i == 0)
            first = e;
        prev = e;
        dragarc_flight_clear(&f);
    }
    CHECK(prev <= 1e-3 * first);
}

TEST(default_tolerances_give_a_millimetre_on_a_300_m_flight)
{
    /* Issue requirement: default solver options hold 1 mm on a 300 m flight. Linear drag with
     * kappa = 0.02 1/s at 58 m/s, 40 degrees: about 305 m, against the Lambert W closed form. */
    double r, t;
    dragarc_scenario s;
    dragarc_flight f;
    make_scenario(&s, 0.0, 1.0, 0.05, 0.0, 58.0, 40.0, G, 0.0);
    dragarc_scenario d;
    dragarc_scenario_default(&d);
    s.solver = d.solver;
    s.projectile.drag.model = DRAGARC_DRAG_LINEAR;
    s.projectile.drag.k = 0.02;
    fly(&s, 0.0, &f);
    double u = 58.0 * cos(40 * DEG), w = 58.0 * sin(40 * DEG), kappa = 0.02;
    double alpha = 1.0 + kappa * w / G;
    t = (alpha + gsl_sf_lambert_W0(-alpha * exp(-alpha))) / kappa;
    r = u / kappa * (1.0 - exp(-kappa * t));
    CHECK(r > 290.0 && r < 320.0);
    printf("  default tolerances: range %.6f m, closed form %.6f m, error %.2e m\n", f.range, r, f.range - r);
    CHECK_ABS(f.range, r, 1e-3);
    dragarc_flight_clear(&f);
}

TEST(quadratic_drag_fall_from_rest_follows_tanh_and_log_cosh)
{
    dragarc_scenario s;
    dragarc_flight f;
    const double m = 1.0, vt = 30.0, c = m * G / (vt * vt);
    make_scenario(&s, 0.0, m, 0.1, 1500.0, 0.0, 0.0, G, 1e-10);
    s.projectile.drag.model = DRAGARC_DRAG_QUADRATIC;
    s.projectile.drag.c = c;
    fly(&s, 0.25, &f);
    double worst_v = 0.0, worst_z = 0.0;
    for (size_t i = 0; i < f.npoints; i++) {
        double t = f.points[i].t;
        worst_v = fmax(worst_v, fabs(-f.points[i].vel[2] - vt * tanh(G * t / vt)));
        worst_z = fmax(worst_z, fabs(1500.0 - f.points[i].pos[2] - vt * vt / G * log(cosh(G * t / vt))));
    }
    CHECK_ABS(worst_v, 0.0, 1e-6);
    CHECK_ABS(worst_z, 0.0, 1e-5);
    CHECK_REL(f.terminal_speed, vt, 1e-10);
    dragarc_flight_clear(&f);
}

TEST(quadratic_drag_rise_matches_apex_time_height_and_return_speed)
{
    /* v_t = 30, v0 = 40, g = 9.81: t_apex = 2.835765 s, H = 46.86474 m, return speed 24.000 m/s
     * (computed from the closed forms above). */
    dragarc_scenario s;
    dragarc_flight f;
    const double m = 1.0, vt = 30.0, v0 = 40.0, c = m * G / (vt * vt);
    make_scenario(&s, 0.0, m, 0.1, 0.0, v0, 90.0, G, 1e-10);
    s.projectile.drag.model = DRAGARC_DRAG_QUADRATIC;
    s.projectile.drag.c = c;
    fly(&s, 0.0, &f);
    double t_apex = vt / G * atan(v0 / vt), h = vt * vt / (2 * G) * log(1 + v0 * v0 / (vt * vt));
    CHECK_ABS(t_apex, 2.835765, 1e-6);
    CHECK_ABS(h, 46.86474, 1e-5);
    CHECK_REL(f.apex_time, t_apex, 1e-7);
    CHECK_REL(f.apex_height, h, 1e-7);
    CHECK_REL(f.impact_speed, v0 * vt / sqrt(v0 * v0 + vt * vt), 1e-7);
    CHECK_ABS(f.impact_speed, 24.000, 1e-6);
    /* descent from rest through H: cosh(g t / v_t) = exp(g H / v_t^2) */
    double t_down = vt / G * acosh(exp(G * h / (vt * vt)));
    CHECK_REL(f.time_of_flight, t_apex + t_down, 1e-7);
    CHECK_ABS(f.range, 0.0, 1e-6);
    dragarc_flight_clear(&f);
}

int main(void)
{
    dragarc_init();
    RUN(vacuum_flight_matches_range_apex_and_time_formulas);
    RUN(linear_drag_drop_from_rest_follows_exponential_approach_to_terminal_speed);
    RUN(linear_drag_range_matches_lambert_w_closed_form);
    RUN(error_shrinks_as_tolerances_tighten);
    RUN(default_tolerances_give_a_millimetre_on_a_300_m_flight);
    RUN(quadratic_drag_fall_from_rest_follows_tanh_and_log_cosh);
    RUN(quadratic_drag_rise_matches_apex_time_height_and_return_speed);
    return check_summary();
}
