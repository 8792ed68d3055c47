/* test_dop853.c: the DOP853 stepper behind the default explicit path.
 * SPDX-License-Identifier: GPL-3.0-or-later
 *
 * Checks against closed forms, not against the code's own numbers:
 * - Quadrature conditions. A Runge-Kutta method of order p integrates y' = t^k exactly for k < p, since its
 *   weights then satisfy sum_i b_i c_i^k = 1/(k+1) (Hairer, Norsett & Wanner 1993, Solving ODEs I, 2nd ed.,
 *   section II.2, the conditions for the "bushy trees"). So one step of y' = t^7 on [0, 1] gives 1/8, and
 *   the continuous extension of order 7 gives theta^7 / 7 for y' = t^6 at any theta. A single wrong digit
 *   in a weight or a dense-output coefficient shows at once.
 * - Convergence order on the harmonic oscillator x'' = -x (solution cos t, -sin t): the local error of one
 *   step falls as h^9 and that of the continuous extension as h^8 (orders 8 and 7; same source, II.10).
 *   Halving h must divide them by at least 2^8.5 and 2^7.5: half an order below the theory, which allows
 *   for the next term of the error expansion at the step sizes used.
 */
#include <math.h>
#include <string.h>

#include "check.h"
#include "numerics/dop853.h"

static int powers(double t, const double y[DOP853_N], double f[DOP853_N], void *user)
{
    (void)y, (void)user;
    for (int i = 0; i < 6; i++)
        f[i] = pow(t, 7 - i); /* y_i' = t^(7 - i): degrees 7 down to 2 */
    f[6] = f[7] = 0.0;
    return 0;
}

/* One step of exactly h from (t0, y0) with the error test switched off (huge tolerances). */
static void one_step(dop853 *s, dop853_rhs f, double t0, const double y0[DOP853_N], double h)
{
    CHECK(dop853_init(s, f, NULL, 1e30, 1e30, t0, y0, t0 + h) == DOP853_OK);
    s->h = h;
    CHECK(dop853_step(s, t0 + h) == DOP853_OK);
    CHECK(s->t == t0 + h);
}

TEST(one_step_integrates_polynomials_up_to_degree_seven_exactly)
{
    dop853 s;
    const double y0[DOP853_N] = {0};
    one_step(&s, powers, 0.0, y0, 1.0);
    for (int i = 0; i < 6; i++)
        CHECK_ABS(s.y[i], 1.0 / (8 - i), 4e-16);
    CHECK(s.y[6] == 0.0 && s.y[7] == 0.0);
}

TEST(continuous_extension_integrates_degree_six_exactly_inside_the_step)
{
    dop853 s;
    const double y0[DOP853_N] = {0};
    one_step(&s, powers, 0.0, y0, 1.0);
    CHECK(dop853_dense(&s) == DOP853_OK);
    for (double th = 0.0; th <= 1.0; th += 0.125) {
        double y[DOP853_N];
        dop853_dense_eval(&s, th, y);
        /* y_1' = t^6: the continuous extension is of order 7, so exact; y_0' = t^7 is not expected to be. */
        for (int i = 1; i < 6; i++)
            CHECK_ABS(y[i], pow(th, 8 - i) / (8 - i), 4e-16);
        CHECK_ABS(dop853_dense_component(&s, th, 3), y[3], 0.0);
    }
}

static int oscillator(double t, const double y[DOP853_N], double f[DOP853_N], void *user)
{
    (void)t, (void)user;
    for (int i = 0; i < 3; i++) {
        f[i] = y[i + 3];
        f[i + 3] = -y[i];
    }
    f[6] = f[7] = 0.0;
    return 0;
}

static void oscillator_errors(double h, double *step_err, double *dense_err)
{
    const double t0 = 0.3;
    double y0[DOP853_N] = {cos(t0), 2.0 * cos(t0), 0.0, -sin(t0), -2.0 * sin(t0), 0.0};
    dop853 s;
    one_step(&s, oscillator, t0, y0, h);
    *step_err = fabs(s.y[0] - cos(t0 + h)) + fabs(s.y[3] + sin(t0 + h));
    CHECK(dop853_dense(&s) == DOP853_OK);
    double tm = t0 + 0.37 * h;
    *dense_err = fabs(dop853_dense_component(&s, tm, 0) - cos(tm)) + fabs(dop853_dense_component(&s, tm, 3) + sin(tm));
}

TEST(local_errors_fall_as_h9_for_the_step_and_h8_for_the_continuous_extension)
{
    double s1, d1, s2, d2;
    oscillator_errors(0.8, &s1, &d1);
    oscillator_errors(0.4, &s2, &d2);
    printf("  h = 0.8: step %.3e, dense %.3e; h = 0.4: step %.3e, dense %.3e; ratios %.0f, %.0f\n", s1, d1, s2, d2,
           s1 / s2, d1 / d2);
    CHECK(s1 / s2 >= pow(2.0, 8.5));
    CHECK(d1 / d2 >= pow(2.0, 7.5));
}

TEST(adaptive_steps_meet_the_tolerance_over_ten_periods)
{
    /* Global error over t = 0..20 pi at rtol = atol = 1e-10: bounded by a small multiple of the tolerance
     * times the number of steps (errors add up at most linearly for this non-dissipative problem). */
    double y0[DOP853_N] = {1.0, 0.0, 0.0, 0.0, 1.0, 0.0};
    dop853 s;
    const double tend = 20.0 * 3.14159265358979323846;
    CHECK(dop853_init(&s, oscillator, NULL, 1e-10, 1e-10, 0.0, y0, tend) == DOP853_OK);
    int rc;
    while ((rc = dop853_step(&s, tend)) == DOP853_OK && s.t < tend)
        ;
    CHECK(rc == DOP853_OK && s.t == tend);
    double e = fabs(s.y[0] - 1.0) + fabs(s.y[1]);
    printf("  %ld steps, %ld rejected, %ld evaluations; error %.2e\n", s.nsteps, s.nrejected, s.nfev, e);
    CHECK(e < 10.0 * 1e-10 * (double)s.nsteps);
    CHECK(s.nsteps < 250); /* an eighth-order method: under 20 steps a period at this tolerance (174 seen) */
}

static double cap_at(double t, const double y[DOP853_N], const double f[DOP853_N], double h, void *user)
{
    (void)t, (void)y, (void)f;
    return fmin(h, *(const double *)user);
}

TEST(a_step_limit_shortens_the_step_and_the_proposal_survives_it)
{
    double y0[DOP853_N] = {1.0, 0.0, 0.0, 0.0, 1.0, 0.0}, cap = 1e-3;
    dop853 s;
    CHECK(dop853_init(&s, oscillator, &cap, 1e-8, 1e-8, 0.0, y0, 10.0) == DOP853_OK);
    s.limit = cap_at;
    CHECK(dop853_step(&s, 10.0) == DOP853_OK);
    CHECK_ABS(s.t, 1e-3, 1e-18);
    CHECK(s.h > 1e-2); /* the next proposal is the error control's, not the cut step grown by at most 6 */
}

static int fails_above(double t, const double y[DOP853_N], double f[DOP853_N], void *user)
{
    (void)t;
    if (y[0] > *(const double *)user)
        return -1;
    for (int i = 0; i < DOP853_N; i++)
        f[i] = 1.0;
    return 0;
}

TEST(failed_evaluations_are_retried_shorter_then_reported)
{
    double y0[DOP853_N] = {0}, wall = 0.5;
    dop853 s;
    CHECK(dop853_init(&s, fails_above, &wall, 1e-8, 1e-8, 0.0, y0, 10.0) == DOP853_OK);
    s.h = 2.0; /* would step past the wall */
    CHECK(dop853_step(&s, 10.0) == DOP853_OK);
    CHECK(s.y[0] <= wall && s.t > 0.0);
    CHECK_ABS(s.y[0], s.t, 1e-12);
    wall = -1.0; /* now nothing can be evaluated */
    s.h = 0.1;
    CHECK(dop853_step(&s, 10.0) == DOP853_ERHS);
}

TEST(stepping_at_the_end_time_is_refused)
{
    double y0[DOP853_N] = {1.0, 0.0, 0.0, 0.0, 1.0, 0.0};
    dop853 s;
    CHECK(dop853_init(&s, oscillator, NULL, 1e-8, 1e-8, 0.0, y0, 0.5) == DOP853_OK);
    while (s.t < 0.5)
        CHECK(dop853_step(&s, 0.5) == DOP853_OK);
    CHECK(s.t == 0.5);
    CHECK(dop853_step(&s, 0.5) == DOP853_EEND);
}

int main(void)
{
    RUN(one_step_integrates_polynomials_up_to_degree_seven_exactly);
    RUN(continuous_extension_integrates_degree_six_exactly_inside_the_step);
    RUN(local_errors_fall_as_h9_for_the_step_and_h8_for_the_continuous_extension);
    RUN(adaptive_steps_meet_the_tolerance_over_ten_periods);
    RUN(a_step_limit_shortens_the_step_and_the_proposal_survives_it);
    RUN(failed_evaluations_are_retried_shorter_then_reported);
    RUN(stepping_at_the_end_time_is_refused);
    return check_summary();
}
