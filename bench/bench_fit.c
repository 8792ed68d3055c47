/* bench_fit.c: what a fit to a measured track costs, and where geodesic acceleration helps.
 * SPDX-License-Identifier: GPL-3.0-or-later
 *
 * Three invented problems, each a noisy synthetic track of a known truth (fixed seeds):
 *   ball-4  a 57 g, 66 mm ball with backspin: cd, cl, launch.speed, launch.elevation (97 points, sd 3 cm)
 *   ball-8  the same ball: cd, cl, launch.speed, .elevation, .azimuth, .height, launch.east, .north
 *   drop    a 150 um water drop from a nozzle in a cross wind: cd_scale, wind.speed, wind.from (87 points, 0.5 mm)
 * Each is started from many random points around the truth (every estimate off by up to +-10, 50 or 90 % of its
 * size, uniformly) and fitted with plain Levenberg-Marquardt, with geodesic acceleration from the start, and with
 * the default (accelerated only when plain steps stall), all from the random start, and with the default start
 * (launch estimates read off the track's first points when those fit better). Counted per fit: convergence to the best minimum (the
 * estimates within 0.1 standard error of the fit from the truth), iterations, flights and time; the time of one
 * flight of the truth at the fit's tolerances is the reference measured in the same run, so the ratio says how many
 * flights' worth of work a fit is.
 *   bench_fit [--starts N] [--json FILE]
 */
#define _POSIX_C_SOURCE 200809L
#include <math.h>
#include <stdio.h>
#include <stdlib.h>
#include <string.h>
#include <time.h>

#include <gsl/gsl_randist.h>
#include <gsl/gsl_rng.h>

#include "dragarc/fit.h"
#include "dragarc/flight.h"
#include "numerics/flight_track.h"

static double now(void)
{
    struct timespec ts;
    clock_gettime(CLOCK_MONOTONIC, &ts);
    return (double)ts.tv_sec + 1e-9 * (double)ts.tv_nsec;
}

typedef struct problem {
    const char *name, *json, *estimates;
    double t0, t1, sd;
    size_t n;
} problem;

static const problem PROBLEMS[] = {
    {"ball-4",
     "{\"projectile\": {\"mass\": 0.057, \"diameter\": 0.066, \"drag\": {\"model\": \"constant\", \"cd\": 0.55},"
     " \"lift\": {\"model\": \"constant\", \"cl\": 0.18}}, \"launch\": {\"speed\": 30, \"elevation\": 15, \"azimuth\": 10,"
     " \"height\": 1.0, \"spin\": {\"rate\": 1500}}, \"environment\": {\"atmosphere\": {\"model\": \"isa\","
     " \"site_elevation\": 120}, \"wind\": {\"speed\": 2.5, \"from\": 240}}}",
     "cd,cl,launch.speed,launch.elevation", 0.02, 1.94, 0.03, 97},
    {"ball-8",
     "{\"projectile\": {\"mass\": 0.057, \"diameter\": 0.066, \"drag\": {\"model\": \"constant\", \"cd\": 0.55},"
     " \"lift\": {\"model\": \"constant\", \"cl\": 0.18}}, \"launch\": {\"speed\": 30, \"elevation\": 15, \"azimuth\": 10,"
     " \"height\": 1.0, \"spin\": {\"rate\": 1500}}, \"environment\": {\"atmosphere\": {\"model\": \"isa\","
     " \"site_elevation\": 120}, \"wind\": {\"speed\": 2.5, \"from\": 240}}}",
     "cd,cl,launch.speed,launch.elevation,launch.azimuth,launch.height,position", 0.02, 1.94, 0.03, 97},
    {"drop",
     "{\"projectile\": {\"diameter\": 0.00015, \"density\": 998, \"drag\": {\"model\": \"sphere\", \"cd_scale\": 1.15}},"
     " \"launch\": {\"speed\": 8, \"elevation\": -60, \"azimuth\": 90, \"height\": 0.5},"
     " \"environment\": {\"atmosphere\": {\"model\": \"isa\"}, \"wind\": {\"speed\": 1.2, \"from\": 270}}}",
     "cd_scale,wind.speed,wind.from", 0.01, 0.87, 0.0005, 87},
};

/* Sizes the random starts are scaled by, for estimates whose value may be 0 or an angle. */
static double spread_scale(dragarc_fit_param p, double v)
{
    switch (p) {
    case DRAGARC_FIT_LAUNCH_ELEVATION:
    case DRAGARC_FIT_LAUNCH_AZIMUTH:
    case DRAGARC_FIT_WIND_FROM: return 0.5; /* rad */
    case DRAGARC_FIT_LAUNCH_EAST:
    case DRAGARC_FIT_LAUNCH_NORTH: return 1.0; /* m */
    default: return fabs(v);
    }
}

int main(int argc, char **argv)
{
    int starts = 40;
    const char *json = NULL;
    for (int i = 1; i < argc; i++) {
        if (strcmp(argv[i], "--starts") == 0 && i + 1 < argc)
            starts = atoi(argv[++i]);
        else if (strcmp(argv[i], "--json") == 0 && i + 1 < argc)
            json = argv[++i];
        else {
            fprintf(stderr, "usage: bench_fit [--starts N] [--json FILE]\n");
            return 2;
        }
    }
    dragarc_init();
    FILE *js = json ? fopen(json, "w") : NULL;
    if (js)
        fprintf(js, "{\"starts\": %d, \"problems\": [", starts);
    static const double SPREADS[] = {0.1, 0.5, 0.9};
    /* plain, accelerated, the default policy (all from the random start), and the default with its track start */
    static const dragarc_fit_accel MODES[] = {DRAGARC_FIT_ACCEL_OFF, DRAGARC_FIT_ACCEL_ON, DRAGARC_FIT_ACCEL_AUTO,
                                              DRAGARC_FIT_ACCEL_AUTO};
    static const char *const MODE_NAMES[] = {"lm", "lm+geodesic", "auto", "auto+track"};
    for (size_t pi = 0; pi < sizeof PROBLEMS / sizeof *PROBLEMS; pi++) {
        const problem *P = &PROBLEMS[pi];
        dragarc_scenario truth;
        dragarc_error e;
        if (dragarc_scenario_parse(P->json, NULL, NULL, &truth, &e) != DRAGARC_OK) {
            fprintf(stderr, "bench_fit: %s: %s: %s\n", P->name, e.field, e.message);
            return 1;
        }
        truth.solver.rtol = 1e-10, truth.solver.atol = 1e-9; /* as the fit flies */
        double *t = malloc(P->n * sizeof *t), *st = malloc(6 * P->n * sizeof *st);
        dragarc_track tr = {.n = P->n, .t = t};
        tr.pos = malloc(3 * P->n * sizeof *tr.pos);
        tr.pos_sd = malloc(3 * P->n * sizeof *tr.pos_sd);
        for (size_t i = 0; i < P->n; i++)
            t[i] = P->t0 + (P->t1 - P->t0) * (double)i / (double)(P->n - 1);
        /* the reference: one flight of the truth over the track */
        int reps = 0;
        double t_start = now(), t_flight;
        do {
            dragarc_flight_track(&truth, t, P->n, st, &e);
            reps++;
        } while (now() - t_start < 0.3);
        t_flight = (now() - t_start) / reps;
        gsl_rng *rng = gsl_rng_alloc(gsl_rng_mt19937);
        gsl_rng_set(rng, 1000 + pi);
        for (size_t i = 0; i < 3 * P->n; i++) {
            tr.pos[i] = st[6 * (i / 3) + i % 3] + gsl_ran_gaussian(rng, P->sd);
            tr.pos_sd[i] = P->sd;
        }
        dragarc_fit_options o;
        dragarc_fit_options_default(&o);
        dragarc_fit_params_parse(P->estimates, &o.estimate, &e);
        /* the best fit, from the truth */
        dragarc_fit_result best;
        dragarc_fit_run(&truth, &tr, &o, &best, NULL, &e);
        printf("%s (%s): one flight %.1f us; best fit chi-square %.2f on %zu dof\n", P->name, P->estimates,
               1e6 * t_flight, best.chisq, best.dof);
        if (js)
            fprintf(js, "%s{\"name\": \"%s\", \"estimates\": \"%s\", \"flight_seconds\": %.6g, \"cases\": [",
                    pi ? ", " : "", P->name, P->estimates, t_flight);
        for (size_t si = 0; si < sizeof SPREADS / sizeof *SPREADS; si++) {
            for (size_t mi = 0; mi < sizeof MODES / sizeof *MODES; mi++) {
                gsl_rng_set(rng, 7 + si); /* the same starts for every mode */
                int ok = 0;
                long iters = 0, flights = 0, accelerated = 0;
                double seconds = 0.0;
                for (int k = 0; k < starts; k++) {
                    dragarc_scenario start;
                    dragarc_scenario_copy(&start, &truth, &e);
                    double x[DRAGARC_FIT_NPARAMS];
                    for (int j = 0; j < best.np; j++) {
                        double v = dragarc_fit_value(&truth, best.param[j]);
                        x[j] = v + SPREADS[si] * spread_scale(best.param[j], v) * (2.0 * gsl_rng_uniform(rng) - 1.0);
                    }
                    dragarc_fit_apply(&start, best.param, x, best.np, &e);
                    o.accel = MODES[mi];
                    o.scenario_start = mi < 3; /* the random start as it is (the solver's own reach), or the default */
                    dragarc_fit_result r;
                    double t0 = now();
                    int rc = dragarc_fit_run(&start, &tr, &o, &r, NULL, &e);
                    seconds += now() - t0;
                    if (rc == DRAGARC_OK) {
                        int good = r.converged;
                        for (int j = 0; j < r.np && good; j++) {
                            double d = r.value[j] - best.value[j];
                            if (r.param[j] == DRAGARC_FIT_WIND_FROM || r.param[j] == DRAGARC_FIT_LAUNCH_AZIMUTH)
                                d = remainder(d, 2.0 * 3.141592653589793);
                            good = fabs(d) < 0.1 * best.se[j];
                        }
                        ok += good;
                        iters += r.iterations;
                        accelerated += r.accel_used;
                    }
                    flights += r.flights;
                    dragarc_fit_result_clear(&r);
                    dragarc_scenario_clear(&start);
                }
                double per_fit = seconds / starts;
                printf("  starts +-%2.0f %%  %-12s found the minimum %3d of %d; %5.1f iterations, %6.1f flights, "
                       "%7.2f ms a fit (%5.0f flights' time)%s\n",
                       100 * SPREADS[si], MODE_NAMES[mi], ok, starts, (double)iters / starts,
                       (double)flights / starts, 1e3 * per_fit, per_fit / t_flight,
                       MODES[mi] == DRAGARC_FIT_ACCEL_AUTO && accelerated ? " (some retried accelerated)" : "");
                if (js)
                    fprintf(js,
                            "%s{\"spread\": %g, \"mode\": \"%s\", \"found\": %d, \"iterations\": %.3g, "
                            "\"flights\": %.4g, \"seconds_per_fit\": %.6g, \"accelerated\": %ld}",
                            si || mi ? ", " : "", SPREADS[si], MODE_NAMES[mi], ok, (double)iters / starts,
                            (double)flights / starts, per_fit, accelerated);
            }
        }
        if (js)
            fprintf(js, "]}");
        dragarc_fit_result_clear(&best);
        gsl_rng_free(rng);
        free(st);
        free(tr.pos);
        free(tr.pos_sd);
        free(t);
        dragarc_scenario_clear(&truth);
    }
    if (js) {
        fprintf(js, "]}\n");
        fclose(js);
    }
    return 0;
}
