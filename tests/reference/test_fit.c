/* test_fit.c: parameters fitted to measured tracks (fit.h), against closed forms, GSL's linear regression, the
 * truth of synthetic tracks, and the coverage of the stated intervals over many noisy tracks.
 * SPDX-License-Identifier: GPL-3.0-or-later
 *
 * Sources:
 *  - In vacuum, a horizontal launch east at speed v from x0 follows x = x0 + v t exactly, so fitting launch.east and
 *    launch.speed to the east positions is weighted linear regression, whose estimates and covariance
 *    (X^T W X)^-1 are what GSL's gsl_fit_wlinear returns (GSL Reference Manual, "Linear Regression", gsl_fit_wlinear;
 *    Draper & Smith 1998, "Applied Regression Analysis", 3rd ed., ch. 9). Unweighted, the covariance is scaled by
 *    s^2 = RSS / (N - P) over all N residuals (gsl_fit_linear's RSS / (n - 2) over the n east ones).
 *  - A nonlinear least-squares fit with Gaussian errors of known sd gives, asymptotically, estimates whose
 *    linearised 95 % intervals cover the truth 95 % of the time, and chi^2 ~ chi-square with N - P degrees of
 *    freedom (Seber & Wild 1989, "Nonlinear Regression", Wiley, sections 2.2 and 5.1); over K independent tracks the
 *    count of covering intervals is Binomial(K, 0.95).
 *  - A noise-free track made by the model itself is fitted exactly: the estimates return to the truth to the
 *    flights' accuracy (rtol 1e-12 for the truth, 1e-10 in the fit), asked to 1e-6 relative by the issue.
 * The ball and launch values are invented (a 57 g, 66 mm ball); none is a measurement.
 */
#include <stdlib.h>

#include <gsl/gsl_fit.h>
#include <gsl/gsl_randist.h>
#include <gsl/gsl_rng.h>

#include "check.h"
#include "helpers.h"
#include "core/constants.h"
#include "dragarc/fit.h"
#include "dragarc/flight.h"
#include "dragarc/footprint.h"
#include "dragarc/output.h"
#include "numerics/flight_track.h"

/* The invented test ball: 57 g, 66 mm, C_D 0.55, C_L 0.18 with 1500 rpm backspin, 30 m/s at 15 deg, azimuth 10 deg,
 * from 1 m, in a 2.5 m/s wind from 240 deg; truth flights at rtol 1e-12. */
static void ball(dragarc_scenario *s)
{
    static const char text[] =
        "{\"projectile\": {\"mass\": 0.057, \"diameter\": 0.066, \"drag\": {\"model\": \"constant\", \"cd\": 0.55},"
        " \"lift\": {\"model\": \"constant\", \"cl\": 0.18}},"
        " \"launch\": {\"speed\": 30, \"elevation\": 15, \"azimuth\": 10, \"height\": 1.0,"
        "  \"spin\": {\"rate\": 1500, \"tilt\": 0}},"
        " \"environment\": {\"atmosphere\": {\"model\": \"isa\", \"site_elevation\": 120},"
        "  \"wind\": {\"speed\": 2.5, \"from\": 240}},"
        " \"solver\": {\"rtol\": 1e-12, \"atol\": 1e-12}}";
    dragarc_error e;
    int rc = dragarc_scenario_parse(text, NULL, NULL, s, &e);
    if (rc)
        printf("  ball: %s: %s\n", e.field, e.message);
    CHECK(rc == DRAGARC_OK);
}

/* n times evenly from t0 to t1. */
static double *times(size_t n, double t0, double t1)
{
    double *t = malloc(n * sizeof *t);
    for (size_t i = 0; i < n; i++)
        t[i] = t0 + (t1 - t0) * (double)i / (double)(n - 1);
    return t;
}

/* A track of truth s at times t (taken over), with Gaussian noise of sd (0: none) from rng; velocities when vsd > 0
 * (their noise vsd). sd_given: the track states sd (and vsd). */
static void make_track(const dragarc_scenario *s, double *t, size_t n, double sd, double vsd, int sd_given,
                       gsl_rng *rng, dragarc_track *tr)
{
    memset(tr, 0, sizeof *tr);
    tr->n = n;
    tr->t = t;
    tr->pos = malloc(3 * n * sizeof *tr->pos);
    double *st = malloc(6 * n * sizeof *st);
    dragarc_error e;
    int rc = dragarc_flight_track(s, t, n, st, &e);
    if (rc)
        printf("  track: %s: %s\n", e.field, e.message);
    CHECK(rc == DRAGARC_OK);
    if (vsd > 0.0)
        tr->vel = malloc(3 * n * sizeof *tr->vel);
    if (sd_given) {
        tr->pos_sd = malloc(3 * n * sizeof *tr->pos_sd);
        if (vsd > 0.0)
            tr->vel_sd = malloc(3 * n * sizeof *tr->vel_sd);
    }
    for (size_t i = 0; i < 3 * n; i++) {
        size_t p = i / 3, k = i % 3;
        tr->pos[i] = st[6 * p + k] + (sd > 0.0 ? gsl_ran_gaussian(rng, sd) : 0.0);
        if (tr->vel)
            tr->vel[i] = st[6 * p + 3 + k] + (vsd > 0.0 && rng ? gsl_ran_gaussian(rng, vsd) : 0.0);
        if (tr->pos_sd)
            tr->pos_sd[i] = sd;
        if (tr->vel_sd)
            tr->vel_sd[i] = vsd;
    }
    free(st);
}

static int fit(const dragarc_scenario *s, const dragarc_track *tr, const char *names, dragarc_fit_accel accel,
               dragarc_fit_result *r, int verbose)
{
    dragarc_fit_options o;
    dragarc_fit_options_default(&o);
    o.accel = accel;
    dragarc_error e;
    CHECK(dragarc_fit_params_parse(names, &o.estimate, &e) == DRAGARC_OK);
    int rc = dragarc_fit_run(s, tr, &o, r, NULL, &e);
    if (rc)
        printf("  fit %s: %s: %s\n", names, e.field, e.message);
    else if (verbose)
        for (int k = 0; k < r->np; k++)
            printf("  %-17s %.12g +- %.3g (start %.6g); %d iterations, %ld flights%s, rcond %.3g, warnings %u\n",
                   dragarc_fit_param_name(r->param[k]), r->value[k], r->se[k], r->start[k], r->iterations, r->flights,
                   r->accel_used ? ", accelerated" : "", r->rcond, r->warnings);
    return rc;
}

/* The estimate of p in r (NaN when not there). */
static double value_of(const dragarc_fit_result *r, dragarc_fit_param p, double *se)
{
    for (int k = 0; k < r->np; k++)
        if (r->param[k] == p) {
            if (se)
                *se = r->se[k];
            return r->value[k];
        }
    return NAN;
}

/* The test ball's noise-free track of n points from 0.02 to 1.9 s, and a copy of the truth to start a fit from. */
typedef struct fixture {
    dragarc_scenario truth, start;
    dragarc_track tr;
} fixture;

static void fixture_set(fixture *f, size_t n)
{
    dragarc_error e;
    ball(&f->truth);
    make_track(&f->truth, times(n, 0.02, 1.9), n, 0.0, 0.0, 0, NULL, &f->tr);
    CHECK(dragarc_scenario_copy(&f->start, &f->truth, &e) == DRAGARC_OK);
}

static void fixture_clear(fixture *f)
{
    dragarc_scenario_clear(&f->start);
    dragarc_scenario_clear(&f->truth);
    dragarc_track_clear(&f->tr);
}

TEST(flight_run_at_matches_the_fixed_interval_samples)
{
    /* the same steps, the same dense output: sampling at listed times k dt equals sampling every dt, bit for bit
     * up to the rounding of k dt */
    dragarc_scenario s;
    ball(&s);
    dragarc_flight a, b;
    dragarc_error e;
    CHECK(dragarc_flight_run(&s, 0.1, &a, &e) == DRAGARC_OK);
    size_t n = a.npoints - 2;
    double *t = malloc(n * sizeof *t);
    for (size_t i = 0; i < n; i++)
        t[i] = a.points[i + 1].t;
    CHECK(dragarc_flight_run_at(&s, t, n, &b, &e) == DRAGARC_OK);
    CHECK(b.npoints == a.npoints);
    double worst = 0.0;
    for (size_t i = 0; i < a.npoints && i < b.npoints; i++)
        for (int k = 0; k < 3; k++)
            worst = fmax(worst, fabs(a.points[i].pos[k] - b.points[i].pos[k]));
    CHECK_ABS(worst, 0.0, 1e-12);
    CHECK_ABS(b.range, a.range, 1e-12);
    CHECK_ABS(b.time_of_flight, a.time_of_flight, 1e-12);
    dragarc_flight_clear(&b);
    /* a bad list is refused by index */
    double bad[3] = {0.1, 0.3, 0.2};
    CHECK_ERROR(dragarc_flight_run_at(&s, bad, 3, &b, &e), DRAGARC_EINVAL, e, "times[2]", "must not come before");
    bad[2] = NAN;
    CHECK_ERROR(dragarc_flight_run_at(&s, bad, 3, &b, &e), DRAGARC_EINVAL, e, "times[2]", "finite time");
    dragarc_flight_clear(&a);
    dragarc_flight_clear(&b);
    free(t);
    dragarc_scenario_clear(&s);
}

TEST(flight_track_flies_on_through_the_ground_in_closed_form)
{
    /* vacuum: z = h + v sin(theta) t - g t^2 / 2 and x = v cos(theta) t for all t, below the ground too
     * (Newton's laws); DOP853 follows a quadratic to rounding */
    dragarc_scenario s;
    dragarc_error e;
    const char text[] = "{\"projectile\": {\"mass\": 1, \"diameter\": 0.1, \"drag\": {\"model\": \"none\"}},"
                        " \"launch\": {\"speed\": 20, \"elevation\": 30, \"azimuth\": 90, \"height\": 2},"
                        " \"environment\": {\"gravity\": 9.81, \"atmosphere\": {\"model\": \"constant\", \"density\": 0, \"viscosity\": 1.8e-5}}}";
    CHECK(dragarc_scenario_parse(text, NULL, NULL, &s, &e) == DRAGARC_OK);
    double t[4] = {0.5, 1.5, 3.0, 6.0}, st[24]; /* it lands near 2.2 s */
    CHECK(dragarc_flight_track(&s, t, 4, st, &e) == DRAGARC_OK);
    for (int i = 0; i < 4; i++) {
        CHECK_ABS(st[6 * i], 20.0 * cos(30 * DEG) * t[i], 1e-9);
        CHECK_ABS(st[6 * i + 2], 2.0 + 20.0 * sin(30 * DEG) * t[i] - 0.5 * 9.81 * t[i] * t[i], 1e-9);
        CHECK_ABS(st[6 * i + 5], 20.0 * sin(30 * DEG) - 9.81 * t[i], 1e-9);
    }
    double bad[2] = {1.0, 1.0};
    CHECK_ERROR(dragarc_flight_track(&s, bad, 2, st, &e), DRAGARC_EINVAL, e, "times", "increasing");
    dragarc_scenario_clear(&s);
}

TEST(noise_free_tracks_return_the_truth)
{
    dragarc_scenario truth, start;
    ball(&truth);
    dragarc_error e;
    struct {
        const char *names;
        dragarc_fit_accel accel;
    } cases[] = {
        {"cd,cl,launch.speed,launch.elevation", DRAGARC_FIT_ACCEL_AUTO},
        {"cd,cl,launch.speed,launch.elevation", DRAGARC_FIT_ACCEL_ON},
        {"cd,launch.azimuth,launch.height,position", DRAGARC_FIT_ACCEL_AUTO},
        {"bc,wind.speed,wind.from", DRAGARC_FIT_ACCEL_AUTO},
    };
    for (size_t c = 0; c < sizeof cases / sizeof *cases; c++) {
        dragarc_track tr;
        make_track(&truth, times(60, 0.02, 1.9), 60, 0.0, 0.0, 0, NULL, &tr);
        dragarc_scenario_copy(&start, &truth, &e);
        /* starts 5-20 % off */
        start.projectile.drag.cd = 0.48, start.projectile.lift.cl = 0.15;
        start.launch.speed = 27.0, start.launch.elevation = 13.0 * DEG;
        start.launch.azimuth = 12.0 * DEG, start.launch.height = 1.2;
        start.wind.speed = 1.5, start.wind.from = 225.0 * DEG;
        if (strstr(cases[c].names, "launch.speed") == NULL)
            start.launch.speed = truth.launch.speed, start.launch.elevation = truth.launch.elevation;
        if (strstr(cases[c].names, "cl") == NULL)
            start.projectile.lift.cl = truth.projectile.lift.cl;
        if (strstr(cases[c].names, "azimuth") == NULL)
            start.launch.azimuth = truth.launch.azimuth, start.launch.height = truth.launch.height;
        if (strstr(cases[c].names, "wind") == NULL)
            start.wind = truth.wind;
        if (strstr(cases[c].names, "bc"))
            start.projectile.drag.cd = truth.projectile.drag.cd; /* bc moves the scale, from C_D 0.55 */
        dragarc_fit_result r;
        printf("  %s%s\n", cases[c].names, cases[c].accel == DRAGARC_FIT_ACCEL_ON ? " (accelerated)" : "");
        CHECK(fit(&start, &tr, cases[c].names, cases[c].accel, &r, 1) == DRAGARC_OK);
        CHECK(r.converged);
        CHECK(r.accel_used == (cases[c].accel == DRAGARC_FIT_ACCEL_ON) || cases[c].accel == DRAGARC_FIT_ACCEL_AUTO);
        const double bc_true = 0.057 / (0.55 * DRAGARC_PI * 0.066 * 0.066 / 4.0);
        const double want[DRAGARC_FIT_NPARAMS] = {
            [DRAGARC_FIT_CD] = 0.55, [DRAGARC_FIT_CL] = 0.18, [DRAGARC_FIT_BC] = bc_true,
            [DRAGARC_FIT_WIND_SPEED] = 2.5, [DRAGARC_FIT_WIND_FROM] = 240 * DEG, [DRAGARC_FIT_LAUNCH_SPEED] = 30.0,
            [DRAGARC_FIT_LAUNCH_ELEVATION] = 15 * DEG, [DRAGARC_FIT_LAUNCH_AZIMUTH] = 10 * DEG,
            [DRAGARC_FIT_LAUNCH_HEIGHT] = 1.0};
        for (int k = 0; k < r.np; k++) {
            double w = want[r.param[k]];
            if (w == 0.0) /* launch.east, launch.north: the truth is 0 m; 1e-6 of the 40 m flight */
                CHECK_ABS(r.value[k], 0.0, 4e-5);
            else
                CHECK_REL(r.value[k], w, 1e-6);
        }
        CHECK(r.rms_pos[3] < 1e-6);
        dragarc_fit_result_clear(&r);
        dragarc_scenario_clear(&start);
        dragarc_track_clear(&tr);
    }
    dragarc_scenario_clear(&truth);
}

TEST(velocities_join_the_residuals)
{
    dragarc_scenario truth, start;
    ball(&truth);
    dragarc_error e;
    dragarc_track tr;
    gsl_rng *rng = gsl_rng_alloc(gsl_rng_mt19937);
    gsl_rng_set(rng, 11);
    make_track(&truth, times(40, 0.05, 1.9), 40, 0.0, 0.1, 1, NULL, &tr);
    for (size_t i = 0; i < 3 * tr.n; i++)
        tr.pos_sd[i] = 0.03;
    dragarc_scenario_copy(&start, &truth, &e);
    start.projectile.drag.cd = 0.45, start.launch.speed = 28.0;
    dragarc_fit_result r;
    CHECK(fit(&start, &tr, "cd,launch.speed", DRAGARC_FIT_ACCEL_AUTO, &r, 1) == DRAGARC_OK);
    CHECK(r.nresiduals == 6 * tr.n);
    CHECK(r.dof == 6 * tr.n - 2);
    CHECK_REL(value_of(&r, DRAGARC_FIT_CD, NULL), 0.55, 1e-6);
    CHECK(isfinite(r.rms_vel[3]) && r.rms_vel[3] < 1e-6);
    dragarc_fit_result_clear(&r);
    dragarc_scenario_clear(&start);
    dragarc_track_clear(&tr);
    dragarc_scenario_clear(&truth);
    gsl_rng_free(rng);
}

TEST(vacuum_fit_is_gsl_weighted_linear_regression)
{
    /* x = x0 + v t: launch.east and launch.speed of a horizontal launch east, against gsl_fit_wlinear */
    dragarc_scenario s;
    dragarc_error e;
    const char text[] = "{\"projectile\": {\"mass\": 1, \"diameter\": 0.1, \"drag\": {\"model\": \"none\"}},"
                        " \"launch\": {\"speed\": 20, \"elevation\": 0, \"azimuth\": 90, \"height\": 50},"
                        " \"environment\": {\"gravity\": 9.81, \"atmosphere\": {\"model\": \"constant\", \"density\": 0, \"viscosity\": 1.8e-5}},"
                        " \"solver\": {\"rtol\": 1e-12, \"atol\": 1e-12}}";
    CHECK(dragarc_scenario_parse(text, NULL, NULL, &s, &e) == DRAGARC_OK);
    const size_t n = 25;
    gsl_rng *rng = gsl_rng_alloc(gsl_rng_mt19937);
    gsl_rng_set(rng, 2026);
    for (int weighted = 1; weighted >= 0; weighted--) {
        dragarc_track tr;
        make_track(&s, times(n, 0.1, 2.5), n, 0.0, 0.0, weighted, NULL, &tr);
        double xs[25], ws[25], ts[25];
        for (size_t i = 0; i < n; i++) {
            /* east positions noisy, with a sd that changes along the track; north and up exact */
            double sd = 0.05 * (1.0 + (double)i / (double)n);
            tr.pos[3 * i] += gsl_ran_gaussian(rng, sd) + 0.7; /* launched 0.7 m east of the origin */
            if (weighted) {
                tr.pos_sd[3 * i] = sd;
                tr.pos_sd[3 * i + 1] = tr.pos_sd[3 * i + 2] = 0.01;
            }
            xs[i] = tr.pos[3 * i], ts[i] = tr.t[i], ws[i] = weighted ? 1.0 / (sd * sd) : 1.0;
        }
        dragarc_scenario start;
        dragarc_scenario_copy(&start, &s, &e);
        start.launch.speed = 18.0;
        dragarc_fit_result r;
        CHECK(fit(&start, &tr, "launch.speed,launch.east", DRAGARC_FIT_ACCEL_AUTO, &r, 1) == DRAGARC_OK);
        CHECK(r.converged);
        double c0, c1, cov00, cov01, cov11, chisq;
        gsl_fit_wlinear(ts, 1, ws, 1, xs, 1, n, &c0, &c1, &cov00, &cov01, &cov11, &chisq);
        double se_v = NAN, se_x = NAN;
        double v = value_of(&r, DRAGARC_FIT_LAUNCH_SPEED, &se_v), x0 = value_of(&r, DRAGARC_FIT_LAUNCH_EAST, &se_x);
        /* The same minimum. Near it the cost rises as (delta / se)^2, and the search stops where that rise is lost in
         * the cost's own rounding: the flights' positions carry ~1e-13 m of it (7e-14 m measured on this launch), a
         * cost of 16 over 75 residuals with sd 0.05 m then ~1e-10, so delta up to se sqrt(1e-10) = 1e-5 se. Exact
         * rational arithmetic on the same data confirmed GSL's values to the last digit. */
        CHECK_ABS(v, c1, 1e-5 * se_v);
        CHECK_ABS(x0, c0, 1e-5 * se_x);
        /* gsl_fit_wlinear's covariance is (X^T W X)^-1 with the weights as given; unweighted it is scaled by
         * chisq / (n - 2) there, by RSS / (3n - 2) here, where north and up add 2n residuals of exactly 0 */
        double scale = weighted ? 1.0 : chisq / (3.0 * (double)n - 2.0);
        CHECK_REL(se_v, sqrt(cov11 * scale), 1e-6);
        CHECK_REL(se_x, sqrt(cov00 * scale), 1e-6);
        int kv = r.param[0] == DRAGARC_FIT_LAUNCH_SPEED ? 0 : 1;
        CHECK_ABS(r.corr[kv * 2 + (1 - kv)], cov01 / sqrt(cov00 * cov11), 1e-6);
        if (weighted) {
            /* chi-square: the east misfit plus nothing from the exact north and up */
            CHECK_REL(r.chisq, chisq, 1e-8);
            CHECK(isnan(r.sigma));
        } else {
            CHECK_REL(r.sigma * r.sigma, chisq / (3.0 * (double)n - 2.0), 1e-8);
        }
        dragarc_fit_result_clear(&r);
        dragarc_scenario_clear(&start);
        dragarc_track_clear(&tr);
    }
    gsl_rng_free(rng);
    dragarc_scenario_clear(&s);
}

/* Over K tracks with Gaussian noise, how often each 95 % interval holds the truth. */
static void coverage(int weighted, const char *names, int K)
{
    dragarc_scenario truth, start;
    ball(&truth);
    dragarc_error e;
    dragarc_scenario_copy(&start, &truth, &e);
    start.projectile.drag.cd = 0.5, start.projectile.lift.cl = 0.15, start.launch.speed = 28.0;
    gsl_rng *rng = gsl_rng_alloc(gsl_rng_mt19937);
    gsl_rng_set(rng, weighted ? 95 : 59);
    int hits[DRAGARC_FIT_NPARAMS] = {0}, np = 0, fails = 0;
    double truth_of[DRAGARC_FIT_NPARAMS] = {[DRAGARC_FIT_CD] = 0.55, [DRAGARC_FIT_CL] = 0.18,
                                            [DRAGARC_FIT_LAUNCH_SPEED] = 30.0};
    double chisq_sum = 0.0, se_sum[DRAGARC_FIT_NPARAMS] = {0}, dev2[DRAGARC_FIT_NPARAMS] = {0};
    for (int k = 0; k < K; k++) {
        dragarc_track tr;
        make_track(&truth, times(30, 0.05, 1.9), 30, 0.05, 0.0, weighted, rng, &tr);
        dragarc_fit_result r;
        dragarc_fit_options o;
        dragarc_fit_options_default(&o);
        dragarc_fit_params_parse(names, &o.estimate, &e);
        if (dragarc_fit_run(&start, &tr, &o, &r, NULL, &e) != DRAGARC_OK || !r.converged) {
            fails++;
        } else {
            np = r.np;
            for (int j = 0; j < r.np; j++) {
                double t = truth_of[r.param[j]];
                hits[j] += r.lower[j] <= t && t <= r.upper[j];
                se_sum[j] += r.se[j];
                dev2[j] += (r.value[j] - t) * (r.value[j] - t);
            }
            chisq_sum += r.chisq / (double)r.dof;
        }
        dragarc_fit_result_clear(&r);
        dragarc_track_clear(&tr);
    }
    CHECK(fails == 0);
    /* Binomial(K, 0.95): sd sqrt(0.95 0.05 / K) = 0.0097 for K = 500; 3 sd either side */
    const double band = 3.0 * sqrt(0.95 * 0.05 / K);
    for (int j = 0; j < np; j++) {
        double rate = (double)hits[j] / (double)(K - fails);
        double rms_dev = sqrt(dev2[j] / (double)(K - fails)), mean_se = se_sum[j] / (double)(K - fails);
        printf("  %s %s: coverage %.3f (%d of %d), mean se %.4g against the spread of the estimates %.4g\n",
               weighted ? "weighted" : "unweighted", names, rate, hits[j], K - fails, mean_se, rms_dev);
        CHECK_ABS(rate, 0.95, band);
        /* the spread of K estimates is known to 1 / sqrt(2K) = 3.2 % (K = 500): agree within 3 of those */
        CHECK_REL(mean_se, rms_dev, 3.0 / sqrt(2.0 * K));
    }
    /* the mean reduced chi-square of K tracks (each chi^2 / dof of variance 2 / dof, dof = 87 - 3): 1 within
     * 3 sqrt(2 / (dof K)) */
    double mean_chi = chisq_sum / (double)(K - fails);
    if (weighted)
        CHECK_ABS(mean_chi, 1.0, 3.0 * sqrt(2.0 / (84.0 * K)));
    else /* unweighted, chi-square is the residual sum of squares: sigma^2 = 0.0025 m^2 on average */
        CHECK_REL(mean_chi, 0.0025, 3.0 * sqrt(2.0 / (84.0 * K)));
    gsl_rng_free(rng);
    dragarc_scenario_clear(&start);
    dragarc_scenario_clear(&truth);
}

TEST(intervals_cover_the_truth_at_the_stated_rate)
{
    coverage(1, "cd,cl,launch.speed", 500);
    coverage(0, "cd,cl,launch.speed", 500);
}

TEST(a_late_short_track_cannot_tell_drag_from_the_release_height)
{
    /* A ball dropped from 1000 m falls at its terminal speed v_t(C_D) after a few seconds, z ~ z_0 - v_t t. Seen
     * only from 20 to 21 s, the track fixes the height then and v_t, but the release height z_0 only through the
     * extrapolation back to t = 0, as the intercept of a straight line fitted far from its origin: the estimates
     * of intercept and slope correlate as -mean(t) / rms(t), -0.9999 here (Draper & Smith 1998, ch. 1 and 3).
     * Tracked from the release, the same two separate. */
    dragarc_scenario truth, start;
    ball(&truth);
    truth.launch.speed = 0.0, truth.launch.height = 1000.0, truth.launch.spin_rate = 0.0;
    dragarc_error e;
    dragarc_scenario_copy(&start, &truth, &e);
    start.projectile.drag.cd = 0.5, start.launch.height = 980.0;
    gsl_rng *rng = gsl_rng_alloc(gsl_rng_mt19937);
    gsl_rng_set(rng, 3);
    dragarc_fit_result r;
    dragarc_track tr;
    make_track(&truth, times(21, 20.0, 21.0), 21, 0.3, 0.0, 1, rng, &tr);
    CHECK(fit(&start, &tr, "cd,launch.height", DRAGARC_FIT_ACCEL_AUTO, &r, 1) == DRAGARC_OK);
    printf("  late track: correlation %.6f, rcond %.3g\n", r.worst_corr, r.rcond);
    CHECK(r.warnings & DRAGARC_FIT_CORRELATED);
    CHECK(r.warnings & DRAGARC_FIT_ILL_CONDITIONED);
    CHECK(r.worst_corr < -0.99);
    /* the weak direction mixes both */
    CHECK(fabs(r.weak_direction[0]) > 0.3 && fabs(r.weak_direction[1]) > 0.3);
    char warn[8][512];
    size_t nw = dragarc_fit_warnings(&r, warn, 8);
    CHECK(nw == 2 && strstr(warn[0], "cd and launch.height correlate") && strstr(warn[1], "poorly conditioned"));
    dragarc_fit_result_clear(&r);
    dragarc_track_clear(&tr);
    make_track(&truth, times(40, 0.5, 20.0), 40, 0.3, 0.0, 1, rng, &tr);
    CHECK(fit(&start, &tr, "cd,launch.height", DRAGARC_FIT_ACCEL_AUTO, &r, 1) == DRAGARC_OK);
    printf("  whole fall: correlation %.6f, rcond %.3g\n", r.worst_corr, r.rcond);
    CHECK(!(r.warnings & (DRAGARC_FIT_CORRELATED | DRAGARC_FIT_ILL_CONDITIONED)));
    dragarc_fit_result_clear(&r);
    dragarc_track_clear(&tr);
    gsl_rng_free(rng);
    dragarc_scenario_clear(&start);
    dragarc_scenario_clear(&truth);
}

TEST(chi_square_tells_wrong_standard_deviations)
{
    dragarc_scenario truth;
    ball(&truth);
    gsl_rng *rng = gsl_rng_alloc(gsl_rng_mt19937);
    gsl_rng_set(rng, 5);
    for (int c = 0; c < 2; c++) {
        dragarc_track tr;
        make_track(&truth, times(60, 0.02, 1.9), 60, 0.05, 0.0, 1, rng, &tr);
        /* claimed sd 5 times too small, or 5 times too large: chi^2 / dof near 25 or 0.04, beyond p 1e-3 */
        for (size_t i = 0; i < 3 * tr.n; i++)
            tr.pos_sd[i] = c == 0 ? 0.01 : 0.25;
        dragarc_fit_result r;
        CHECK(fit(&truth, &tr, "cd", DRAGARC_FIT_ACCEL_AUTO, &r, 0) == DRAGARC_OK);
        CHECK(r.warnings & (c == 0 ? DRAGARC_FIT_CHISQ_HIGH : DRAGARC_FIT_CHISQ_LOW));
        CHECK(c == 0 ? r.chisq_p < 1e-3 : r.chisq_p > 0.999);
        dragarc_fit_result_clear(&r);
        dragarc_track_clear(&tr);
    }
    gsl_rng_free(rng);
    dragarc_scenario_clear(&truth);
}

TEST(wind_found_from_the_other_side)
{
    /* started with the wind from the opposite side, the speed passes through 0 and the direction turns round */
    fixture f;
    fixture_set(&f, 60);
    f.start.wind.speed = 1.0, f.start.wind.from = 70.0 * DEG;
    dragarc_fit_result r;
    CHECK(fit(&f.start, &f.tr, "wind.speed,wind.from", DRAGARC_FIT_ACCEL_AUTO, &r, 1) == DRAGARC_OK);
    CHECK_REL(value_of(&r, DRAGARC_FIT_WIND_SPEED, NULL), 2.5, 1e-6);
    CHECK_ABS(value_of(&r, DRAGARC_FIT_WIND_FROM, NULL), 240.0 * DEG, 1e-6);
    dragarc_fit_result_clear(&r);
    /* a track longer than solver.max_time is refused, naming the track (times in ms instead of s, say) */
    f.start.solver.max_time = 0.5;
    dragarc_fit_options o;
    dragarc_error e;
    dragarc_fit_options_default(&o);
    o.estimate = 1u << DRAGARC_FIT_WIND_SPEED;
    CHECK_ERROR(dragarc_fit_run(&f.start, &f.tr, &o, &r, NULL, &e), DRAGARC_EINVAL, e, "track", "solver.max_time");
    dragarc_fit_result_clear(&r);
    fixture_clear(&f);
}

TEST(fitted_scenario_holds_the_estimates)
{
    dragarc_scenario truth, fitted;
    ball(&truth);
    dragarc_error e;
    dragarc_track tr;
    make_track(&truth, times(40, 0.02, 1.9), 40, 0.0, 0.0, 0, NULL, &tr);
    dragarc_fit_options o;
    dragarc_fit_options_default(&o);
    dragarc_fit_params_parse("bc", &o.estimate, &e);
    truth.projectile.drag.scale = 1.3; /* start 30 % draggier */
    dragarc_fit_result r;
    CHECK(dragarc_fit_run(&truth, &tr, &o, &r, &fitted, &e) == DRAGARC_OK);
    /* bc = m / (C_D A) back at C_D 0.55 through the scale: the fitted scenario's scale returns to 1 */
    CHECK_REL(dragarc_drag_scale(&fitted.projectile.drag), 1.0, 1e-6);
    CHECK_REL(dragarc_fit_value(&fitted, DRAGARC_FIT_BC), r.value[0], 1e-12);
    CHECK(fitted.solver.rtol == truth.solver.rtol); /* the user's settings, not the fit's */
    dragarc_fit_result_clear(&r);
    dragarc_scenario_clear(&fitted);
    dragarc_track_clear(&tr);
    dragarc_scenario_clear(&truth);
}

TEST(a_placeholder_launch_starts_from_the_track)
{
    /* the scenario's launch is a guess far off (10 m/s at 40 deg, due north, from 3 m); the track's first points
     * give a better start, and the fit returns to the truth from it, but not from the guess alone */
    fixture f;
    fixture_set(&f, 60);
    dragarc_error e;
    f.start.launch.speed = 10.0, f.start.launch.elevation = 40.0 * DEG, f.start.launch.azimuth = 0.0;
    f.start.launch.height = 3.0, f.start.projectile.drag.cd = 0.4;
    const char *names = "cd,launch.speed,launch.elevation,launch.azimuth,launch.height";
    dragarc_fit_result r;
    CHECK(fit(&f.start, &f.tr, names, DRAGARC_FIT_ACCEL_AUTO, &r, 1) == DRAGARC_OK);
    CHECK(r.start_from_track);
    CHECK(r.converged);
    CHECK_REL(value_of(&r, DRAGARC_FIT_CD, NULL), 0.55, 1e-6);
    CHECK_REL(value_of(&r, DRAGARC_FIT_LAUNCH_SPEED, NULL), 30.0, 1e-6);
    /* read off 7 points over 0.12 s by a quadratic: within a few per cent of the truth */
    CHECK_REL(r.start[1], 30.0, 0.05);
    CHECK_ABS(r.start[4], 1.0, 0.05);
    dragarc_fit_result_clear(&r);
    /* --start scenario keeps the guess */
    dragarc_fit_options o;
    dragarc_fit_options_default(&o);
    o.scenario_start = 1;
    dragarc_fit_params_parse(names, &o.estimate, &e);
    CHECK(dragarc_fit_run(&f.start, &f.tr, &o, &r, NULL, &e) == DRAGARC_OK);
    CHECK(!r.start_from_track && r.start[1] == 10.0);
    dragarc_fit_result_clear(&r);
    fixture_clear(&f);
}

TEST(an_estimate_held_at_a_limit_is_no_minimum)
{
    /* a scenario whose ball is 1000 times too heavy would need C_D near 550 to slow as the track does; the drag law
     * stops at 100, so the search ends against that wall: flagged, and not called converged */
    fixture f;
    fixture_set(&f, 40);
    f.start.projectile.mass *= 1000.0;
    dragarc_fit_result r;
    CHECK(fit(&f.start, &f.tr, "cd", DRAGARC_FIT_ACCEL_AUTO, &r, 1) == DRAGARC_OK);
    CHECK(r.warnings & DRAGARC_FIT_AT_LIMIT);
    CHECK(r.at_limit == 1u);
    CHECK(!r.converged);
    CHECK(r.value[0] > 99.0);
    char warn[8][512];
    size_t nw = dragarc_fit_warnings(&r, warn, 8);
    CHECK(nw >= 1 && strstr(warn[0], "against a limit of what can be flown (cd:"));
    for (size_t i = 0; i < nw; i++)
        printf("  warning: %s\n", warn[i]);
    dragarc_fit_result_clear(&r);
    fixture_clear(&f);
}

TEST(too_few_iterations_end_unconverged_not_in_error)
{
    fixture f;
    fixture_set(&f, 40);
    dragarc_error e;
    f.start.projectile.drag.cd = 0.3, f.start.launch.speed = 25.0;
    dragarc_fit_options o;
    dragarc_fit_options_default(&o);
    o.max_iterations = 1;
    o.accel = DRAGARC_FIT_ACCEL_OFF;
    dragarc_fit_params_parse("cd,launch.speed", &o.estimate, &e);
    dragarc_fit_result r;
    CHECK(dragarc_fit_run(&f.start, &f.tr, &o, &r, NULL, &e) == DRAGARC_OK);
    CHECK(!r.converged);
    CHECK(r.warnings & DRAGARC_FIT_NOT_CONVERGED);
    dragarc_fit_result_clear(&r);
    fixture_clear(&f);
}

TEST(estimates_the_fit_cannot_use_are_refused)
{
    dragarc_scenario s;
    ball(&s);
    dragarc_error e;
    unsigned mask;
    CHECK_ERROR(dragarc_fit_params_parse("cd,bc", &mask, &e), DRAGARC_EINVAL, e, "estimate", "one drag parameter");
    CHECK_ERROR(dragarc_fit_params_parse("cd,cd", &mask, &e), DRAGARC_EINVAL, e, "estimate", "named twice");
    CHECK_ERROR(dragarc_fit_params_parse("drag", &mask, &e), DRAGARC_EINVAL, e, "estimate", "unknown estimate 'drag'");
    CHECK_ERROR(dragarc_fit_params_parse("cd,", &mask, &e), DRAGARC_EINVAL, e, "estimate", "empty name");
    CHECK(dragarc_fit_params_parse("position,cd", &mask, &e) == DRAGARC_OK);
    CHECK(mask == (1u << DRAGARC_FIT_CD | 1u << DRAGARC_FIT_LAUNCH_EAST | 1u << DRAGARC_FIT_LAUNCH_NORTH));
    CHECK_ERROR(dragarc_fit_params_parse("position,launch.east", &mask, &e), DRAGARC_EINVAL, e, "estimate", "twice");

    dragarc_track tr;
    make_track(&s, times(10, 0.1, 1.0), 10, 0.0, 0.0, 0, NULL, &tr);
    dragarc_fit_options o;
    dragarc_fit_options_default(&o);
    dragarc_fit_result r;
    CHECK_ERROR(dragarc_fit_run(&s, &tr, &o, &r, NULL, &e), DRAGARC_EINVAL, e, "estimate", "at least one");
    dragarc_fit_result_clear(&r);
    /* cl without spin */
    dragarc_scenario ns;
    dragarc_scenario_copy(&ns, &s, &e);
    ns.launch.spin_rate = 0.0;
    o.estimate = 1u << DRAGARC_FIT_CL;
    CHECK_ERROR(dragarc_fit_run(&ns, &tr, &o, &r, NULL, &e), DRAGARC_EINVAL, e, "estimate", "does not spin");
    dragarc_fit_result_clear(&r);
    /* a wind estimate without a wind */
    ns.wind.model = DRAGARC_WIND_NONE;
    o.estimate = 1u << DRAGARC_FIT_WIND_FROM;
    CHECK_ERROR(dragarc_fit_run(&ns, &tr, &o, &r, NULL, &e), DRAGARC_EINVAL, e, "estimate", "starting wind");
    dragarc_fit_result_clear(&r);
    /* bc on a quadratic law */
    dragarc_drag_clear(&ns.projectile.drag);
    ns.projectile.drag.model = DRAGARC_DRAG_QUADRATIC, ns.projectile.drag.c = 1e-3;
    o.estimate = 1u << DRAGARC_FIT_BC;
    CHECK_ERROR(dragarc_fit_run(&ns, &tr, &o, &r, NULL, &e), DRAGARC_EINVAL, e, "estimate", "written with C_D");
    dragarc_fit_result_clear(&r);
    o.estimate = 1u << DRAGARC_FIT_CD;
    CHECK_ERROR(dragarc_fit_run(&ns, &tr, &o, &r, NULL, &e), DRAGARC_EINVAL, e, "estimate", "no C_D to start from");
    dragarc_fit_result_clear(&r);
    /* cd_scale with no drag */
    ns.projectile.drag.model = DRAGARC_DRAG_NONE;
    o.estimate = 1u << DRAGARC_FIT_CD_SCALE;
    CHECK_ERROR(dragarc_fit_run(&ns, &tr, &o, &r, NULL, &e), DRAGARC_EINVAL, e, "estimate", "no drag to scale");
    dragarc_fit_result_clear(&r);
    /* a drag estimate on a vacuum flight moves nothing */
    ns.projectile.drag.model = DRAGARC_DRAG_CONSTANT, ns.projectile.drag.cd = 0.5;
    ns.atmosphere.model = DRAGARC_ATMOSPHERE_CONSTANT;
    ns.atmosphere.density = 0.0;
    o.estimate = 1u << DRAGARC_FIT_CD;
    CHECK_ERROR(dragarc_fit_run(&ns, &tr, &o, &r, NULL, &e), DRAGARC_EINVAL, e, "estimate", "cd has no effect");
    dragarc_fit_result_clear(&r);
    dragarc_scenario_clear(&ns);
    /* too few points, too few residuals */
    o.estimate = 1u << DRAGARC_FIT_CD;
    tr.n = 2;
    CHECK_ERROR(dragarc_fit_run(&s, &tr, &o, &r, NULL, &e), DRAGARC_EINVAL, e, "track", "2 points are too few");
    dragarc_fit_result_clear(&r);
    tr.n = 3;
    dragarc_fit_params_parse("cd,cl,launch.speed,launch.elevation,launch.azimuth,launch.height,position,wind.speed,"
                             "wind.from",
                             &o.estimate, &e);
    CHECK_ERROR(dragarc_fit_run(&s, &tr, &o, &r, NULL, &e), DRAGARC_EINVAL, e, "track", "no more than the 10");
    dragarc_fit_result_clear(&r);
    tr.n = 10;
    dragarc_track_clear(&tr);
    dragarc_scenario_clear(&s);
}

TEST(a_start_that_cannot_fly_names_its_field)
{
    dragarc_scenario s;
    ball(&s);
    dragarc_error e;
    dragarc_track tr;
    make_track(&s, times(10, 0.1, 1.0), 10, 0.0, 0.0, 0, NULL, &tr);
    s.projectile.lift.cl = 1.5; /* beyond the lift law's limit of 1 */
    dragarc_fit_options o;
    dragarc_fit_options_default(&o);
    o.estimate = 1u << DRAGARC_FIT_CD;
    dragarc_fit_result r;
    CHECK_ERROR(dragarc_fit_run(&s, &tr, &o, &r, NULL, &e), DRAGARC_EINVAL, e, "projectile.lift.cl", "");
    dragarc_fit_result_clear(&r);
    dragarc_track_clear(&tr);
    dragarc_scenario_clear(&s);
}

int main(void)
{
    dragarc_init();
    RUN(flight_run_at_matches_the_fixed_interval_samples);
    RUN(flight_track_flies_on_through_the_ground_in_closed_form);
    RUN(noise_free_tracks_return_the_truth);
    RUN(velocities_join_the_residuals);
    RUN(vacuum_fit_is_gsl_weighted_linear_regression);
    RUN(intervals_cover_the_truth_at_the_stated_rate);
    RUN(a_late_short_track_cannot_tell_drag_from_the_release_height);
    RUN(chi_square_tells_wrong_standard_deviations);
    RUN(wind_found_from_the_other_side);
    RUN(fitted_scenario_holds_the_estimates);
    RUN(a_placeholder_launch_starts_from_the_track);
    RUN(an_estimate_held_at_a_limit_is_no_minimum);
    RUN(too_few_iterations_end_unconverged_not_in_error);
    RUN(estimates_the_fit_cannot_use_are_refused);
    RUN(a_start_that_cannot_fly_names_its_field);
    return check_summary();
}
