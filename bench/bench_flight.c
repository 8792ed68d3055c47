/* bench_flight.c: time dragarc_flight_run on four problems against a tight GSL odeiv2 reference.
 * SPDX-License-Identifier: GPL-3.0-or-later
 *
 * The problems are of our own invention, defined once here as dragarc_scenario records and written
 * to a JSON file that bench/scipy_bench.py reads, so both sides fly the same equations:
 *   ball      0.15 kg, 0.073 m sphere, Cd(Re) table, ISA air, constant wind; about 5 s
 *   fragment  0.5 kg, 0.08 m, Cd(Mach) table through transonic, ISA air, layered wind, from 30 km
 *   drop      100 um water drop, smooth-sphere drag, constant air, 3 m/s wind: mildly stiff (~150
 *             relaxation times in the flight), still cheapest with an explicit method at rtol 1e-8
 *   fine_drop 20 um water drop, the same air and wind: stiff (~70,000 relaxation times), where an
 *             implicit method pays off
 * The equations of motion are those of forces.h:
 *   dx/dt = v,  dv/dt = -g z^ + (rho V g / m) z^ - (D(|v - w|) / m) (v - w)
 * The reference integrates the same right-hand side (dragarc_forces_eval) with GSL's explicit
 * Runge-Kutta-Prince-Dormand 8(9) pair (Prince & Dormand 1981, J. Comp. Appl. Math. 7:67) and, for the
 * stiff drop, GSL's multistep BDF (msbdf, after Byrne & Hindmarsh's variable-order BDF) with a
 * finite-difference Jacobian. Ground impact: integrate until z crosses the ground, then find the
 * crossing inside the last step by the Illinois variant of regula falsi (Dowell & Jarratt 1971,
 * BIT 11:168) on re-integration from the step's start, to 1e-9 s.
 *
 * Counting: the bench is linked with -Wl,--wrap=dragarc_forces_eval, so every evaluation of the
 * equations of motion, by dragarc's CVODE driver (right-hand side, difference-quotient Jacobian,
 * per-step diagnostics) or by the reference, passes through __wrap_dragarc_forces_eval and is
 * counted in a thread-local counter. The library's code is unchanged.
 *
 * Usage: bench_flight [--loop SECONDS] [--repeats N] [--threads N] [--json PATH]
 *        bench_flight --check [--json PATH]   (the agreement checks only, nothing timed: a ctest)
 *        bench_flight --profile PROBLEM   (only dragarc flights of one problem for about 3 s, to run under perf)
 * Exit status 0, 2 on bad usage, 3 when a flight fails or dragarc and the reference disagree.
 */
#include <math.h>
#include <stdio.h>
#include <stdlib.h>
#include <string.h>
#include <sys/resource.h>
#include <time.h>

#include <gsl/gsl_errno.h>
#include <gsl/gsl_odeiv2.h>
#include <omp.h>

#include "dragarc/dragarc.h"
#include "dragarc/flight.h"
#include "dragarc/forces.h"
#include "dragarc/scenario.h"

#define PI 3.14159265358979323846
#define DEG (PI / 180.0)
#define RANGE_RTOL 1e-6   /* agreement required between dragarc and the reference before timing */
#define ROOT_TTOL 1e-9    /* s, impact time tolerance of the reference */
#define NPROBLEMS 4
#define TIGHT_TOL 1e-12   /* rtol = atol of the rk8pd solution that measures every solver's range error */

/* ---- counting evaluations of the equations of motion (linker --wrap) ---- */

int __real_dragarc_forces_eval(const dragarc_forces *f, const double y[DRAGARC_STATE_DIM], double dydt[DRAGARC_STATE_DIM], dragarc_flow *flow,
                               dragarc_error *err);
int __wrap_dragarc_forces_eval(const dragarc_forces *f, const double y[DRAGARC_STATE_DIM], double dydt[DRAGARC_STATE_DIM], dragarc_flow *flow,
                               dragarc_error *err);

static _Thread_local long n_forces_eval;

int __wrap_dragarc_forces_eval(const dragarc_forces *f, const double y[DRAGARC_STATE_DIM], double dydt[DRAGARC_STATE_DIM], dragarc_flow *flow,
                               dragarc_error *err)
{
    n_forces_eval++;
    return __real_dragarc_forces_eval(f, y, dydt, flow, err);
}

/* ---- the problems ---- */

static const double BALL_RE[] = {2.0e4, 6.0e4, 1.2e5, 2.0e5, 3.0e5, 5.0e5};
static const double BALL_CD[] = {0.47, 0.46, 0.42, 0.35, 0.28, 0.24};
static const double FRAG_MACH[] = {0.0, 0.6, 0.85, 1.05, 1.3, 1.8, 2.5};
static const double FRAG_CD[] = {0.80, 0.82, 0.95, 1.20, 1.30, 1.18, 1.08};
static const dragarc_wind_layer FRAG_WIND[] = {
    {0.0, 4.0, 250.0 * DEG},     {2000.0, 12.0, 260.0 * DEG},  {8000.0, 28.0, 270.0 * DEG},
    {12000.0, 40.0, 280.0 * DEG}, {20000.0, 15.0, 300.0 * DEG}, {30000.0, 8.0, 90.0 * DEG},
};

typedef struct problem {
    const char *name;
    const char *what;
    dragarc_scenario s;
    int stiff; /* also time GSL's implicit method */
} problem;

/* A water drop of diameter d (m): a sphere of density 998.2 kg/m^3. */
static void water_drop(dragarc_scenario *s, double d)
{
    s->projectile.diameter = d;
    s->projectile.area = 0.25 * PI * d * d;
    s->projectile.volume = PI * d * d * d / 6.0;
    s->projectile.density = 998.2;
    s->projectile.mass = 998.2 * s->projectile.volume;
}

static int make_problems(problem *pb, dragarc_error *err)
{
    int rc;
    /* 1: a ball struck at 42 m/s, 40 degrees up, north-east, from 1 m, in a 5 m/s wind from the west. */
    dragarc_scenario *s = &pb[0].s;
    pb[0].name = "ball";
    pb[0].what = "0.15 kg, 0.073 m ball, Cd(Re) table (6 points), ISA air, 5 m/s constant wind, ~5 s";
    pb[0].stiff = 0;
    dragarc_scenario_default(s);
    snprintf(s->name, sizeof s->name, "bench ball");
    s->projectile.mass = 0.15;
    s->projectile.diameter = 0.073;
    s->projectile.area = 0.25 * PI * 0.073 * 0.073;
    s->projectile.volume = PI * 0.073 * 0.073 * 0.073 / 6.0;
    if ((rc = dragarc_drag_table_set(&s->projectile.drag, DRAGARC_AXIS_REYNOLDS, BALL_RE, BALL_CD, 6, err)))
        return rc;
    s->launch = (dragarc_launch){.speed = 42.0, .elevation = 40.0 * DEG, .azimuth = 45.0 * DEG, .height = 1.0};
    s->wind.model = DRAGARC_WIND_CONSTANT;
    s->wind.speed = 5.0;
    s->wind.from = 270.0 * DEG;
    s->solver.rtol = 1e-8;
    s->solver.atol = 1e-8;

    /* 2: a fragment shed at 30 km, 300 m/s, 10 degrees down, heading east, through a layered wind. */
    s = &pb[1].s;
    pb[1].name = "fragment";
    pb[1].what = "0.5 kg, 0.08 m fragment from 30 km at 300 m/s, Cd(Mach) table (7 points), ISA, layered wind";
    pb[1].stiff = 0;
    dragarc_scenario_default(s);
    snprintf(s->name, sizeof s->name, "bench fragment");
    s->projectile.mass = 0.5;
    s->projectile.diameter = 0.08;
    s->projectile.area = 0.25 * PI * 0.08 * 0.08;
    s->projectile.volume = PI * 0.08 * 0.08 * 0.08 / 6.0;
    if ((rc = dragarc_drag_table_set(&s->projectile.drag, DRAGARC_AXIS_MACH, FRAG_MACH, FRAG_CD, 7, err)))
        return rc;
    s->launch = (dragarc_launch){.speed = 300.0, .elevation = -10.0 * DEG, .azimuth = 90.0 * DEG, .height = 30000.0};
    s->wind.model = DRAGARC_WIND_LAYERED;
    s->wind.nlayers = sizeof FRAG_WIND / sizeof FRAG_WIND[0];
    s->wind.layers = malloc(sizeof FRAG_WIND);
    if (!s->wind.layers)
        return dragarc_error_set(err, DRAGARC_ENOMEM, "", "out of memory");
    memcpy(s->wind.layers, FRAG_WIND, sizeof FRAG_WIND);
    s->solver.rtol = 1e-8;
    s->solver.atol = 1e-8;
    s->solver.max_time = 3000.0;

    /* 3: a 100 um water drop released at rest 1 m up in a 3 m/s wind from the west. */
    s = &pb[2].s;
    pb[2].name = "drop";
    pb[2].what = "100 um water drop from rest at 1 m, sphere drag, constant air 1.2 kg/m^3, 3 m/s wind (mildly "
                 "stiff: about 150 relaxation times)";
    pb[2].stiff = 1;
    dragarc_scenario_default(s);
    snprintf(s->name, sizeof s->name, "bench drop");
    water_drop(s, 100e-6);
    s->projectile.drag.model = DRAGARC_DRAG_SPHERE;
    s->launch = (dragarc_launch){.speed = 0.0, .elevation = 0.0, .azimuth = 0.0, .height = 1.0};
    s->atmosphere.model = DRAGARC_ATMOSPHERE_CONSTANT;
    s->atmosphere.density = 1.2;
    s->atmosphere.viscosity = 1.8e-5;
    s->atmosphere.temperature = 288.15;
    s->atmosphere.speed_of_sound = 0.0;
    s->wind.model = DRAGARC_WIND_CONSTANT;
    s->wind.speed = 3.0;
    s->wind.from = 270.0 * DEG;
    s->solver.rtol = 1e-8;
    s->solver.atol = 1e-8;

    /* 4: the same release with a 20 um drop, which drifts for about 80 s. */
    s = &pb[3].s;
    pb[3].name = "fine_drop";
    pb[3].what = "20 um water drop from rest at 1 m, sphere drag, constant air 1.2 kg/m^3, 3 m/s wind (stiff: "
                 "about 70,000 relaxation times)";
    pb[3].stiff = 1;
    dragarc_scenario_default(s);
    if ((rc = dragarc_scenario_copy(s, &pb[2].s, err)) != DRAGARC_OK)
        return rc;
    snprintf(s->name, sizeof s->name, "bench fine drop");
    water_drop(s, 20e-6);
    return DRAGARC_OK;
}

/* ---- the GSL reference ---- */

typedef enum ref_method { REF_RK8PD = 0, REF_MSBDF } ref_method;
static const char *const REF_NAMES[] = {"gsl rk8pd", "gsl msbdf"};

typedef struct ref_ctx {
    dragarc_forces forces;
    int failed;
} ref_ctx;

static int ref_rhs(double t, const double y[], double dydt[], void *params)
{
    (void)t;
    ref_ctx *c = params;
    /* The bench's problems do not spin: six values, the spin rate held at zero. */
    double ys[DRAGARC_STATE_DIM] = {y[0], y[1], y[2], y[3], y[4], y[5], 0.0}, d[DRAGARC_STATE_DIM];
    if (dragarc_forces_eval(&c->forces, ys, d, NULL, NULL) != DRAGARC_OK) {
        c->failed = 1;
        return GSL_EBADFUNC;
    }
    memcpy(dydt, d, 6 * sizeof *dydt);
    return GSL_SUCCESS;
}

/* Forward-difference Jacobian; msbdf asks for it rarely, so its cost is small. */
static int ref_jac(double t, const double y[], double *dfdy, double dfdt[], void *params)
{
    double f0[6], f1[6], yp[6];
    int rc = ref_rhs(t, y, f0, params);
    if (rc != GSL_SUCCESS)
        return rc;
    memcpy(yp, y, sizeof yp);
    for (int j = 0; j < 6; j++) {
        double h = 1.4901161193847656e-08 * fmax(fabs(y[j]), 1.0); /* sqrt(DBL_EPSILON) */
        yp[j] = y[j] + h;
        if ((rc = ref_rhs(t, yp, f1, params)) != GSL_SUCCESS)
            return rc;
        for (int i = 0; i < 6; i++)
            dfdy[i * 6 + j] = (f1[i] - f0[i]) / h;
        yp[j] = y[j];
    }
    for (int i = 0; i < 6; i++)
        dfdt[i] = 0.0;
    return GSL_SUCCESS;
}

typedef struct ref_result {
    double range, time_of_flight;
    long steps;
    long evals;
} ref_result;

/* The reference's workspace: allocated once and reused across flights, as a tight loop would. */
typedef struct ref_solver {
    ref_method method;
    ref_ctx ctx;
    gsl_odeiv2_system sys;
    gsl_odeiv2_driver *drv;     /* the integrating driver */
    gsl_odeiv2_step *rk_step;   /* one-step re-integration for rk8pd root finding */
    double rtol, atol;
} ref_solver;

static int ref_solver_init(ref_solver *r, ref_method m, const dragarc_scenario *s, double rtol, double atol)
{
    memset(r, 0, sizeof *r);
    r->method = m;
    dragarc_forces_init(&r->ctx.forces, &s->projectile, &s->atmosphere, &s->wind, s->gravity, s->ground_elevation);
    r->sys = (gsl_odeiv2_system){ref_rhs, ref_jac, 6, &r->ctx};
    r->rtol = rtol;
    r->atol = atol;
    r->drv = gsl_odeiv2_driver_alloc_y_new(&r->sys, m == REF_RK8PD ? gsl_odeiv2_step_rk8pd : gsl_odeiv2_step_msbdf,
                                           1e-3, r->atol, r->rtol);
    if (m == REF_RK8PD)
        r->rk_step = gsl_odeiv2_step_alloc(gsl_odeiv2_step_rk8pd, 6);
    return r->drv && (m != REF_RK8PD || r->rk_step) ? 0 : -1;
}

static void ref_solver_free(ref_solver *r)
{
    if (r->drv)
        gsl_odeiv2_driver_free(r->drv);
    if (r->rk_step)
        gsl_odeiv2_step_free(r->rk_step);
}

/* Height above ground at t0 + tau, re-integrated from the step start (t0, y0) into y. */
static int height_at(ref_solver *r, double t0, const double y0[6], double tau, double y[6])
{
    memcpy(y, y0, 6 * sizeof *y);
    if (tau == 0.0)
        return GSL_SUCCESS;
    if (r->method == REF_RK8PD) {
        double yerr[6];
        gsl_odeiv2_step_reset(r->rk_step);
        return gsl_odeiv2_step_apply(r->rk_step, t0, tau, y, yerr, NULL, NULL, &r->sys);
    }
    /* A multistep method has no one-step form: restart it and integrate to the trial time. */
    double t = t0;
    gsl_odeiv2_driver_reset(r->drv);
    gsl_odeiv2_driver_reset_hstart(r->drv, fmin(tau, 1e-3));
    return gsl_odeiv2_driver_apply(r->drv, &t, t0 + tau, y);
}

static int ref_fly(ref_solver *r, const dragarc_scenario *s, ref_result *out)
{
    const dragarc_launch *l = &s->launch;
    double ch = cos(l->elevation);
    double y[6] = {0.0, 0.0, l->height, l->speed * ch * sin(l->azimuth), l->speed * ch * cos(l->azimuth),
                   l->speed * sin(l->elevation)};
    double zg = s->ground_elevation, t = 0.0, h = 1e-3;
    long evals0 = n_forces_eval;
    gsl_odeiv2_driver_reset(r->drv);
    gsl_odeiv2_evolve *e = r->drv->e;
    gsl_odeiv2_control *c = r->drv->c;
    gsl_odeiv2_step *st = r->drv->s;
    double t0 = 0.0, y0[6];
    long steps = 0;
    r->ctx.failed = 0;
    for (;;) {
        t0 = t;
        memcpy(y0, y, sizeof y0);
        int rc = gsl_odeiv2_evolve_apply(e, c, st, &r->sys, &t, s->solver.max_time, &h, y);
        if (rc != GSL_SUCCESS)
            return -1;
        steps++;
        if (y[2] <= zg)
            break;
        if (t >= s->solver.max_time)
            return -1;
    }
    /* Illinois regula falsi on tau in [0, t - t0], bracket [a, b] with f(a) > 0 >= f(b). */
    double a = 0.0, fa = y0[2] - zg, b = t - t0, fb = y[2] - zg, tau = b, yb[6], yc[6];
    memcpy(yb, y, sizeof yb);
    int side = 0;
    for (int it = 0; it < 200 && fb != 0.0 && b - a > ROOT_TTOL; it++) {
        double cc = b - fb * (b - a) / (fb - fa);
        if (!(cc > a && cc < b))
            cc = 0.5 * (a + b);
        if (height_at(r, t0, y0, cc, yc) != GSL_SUCCESS)
            return -1;
        double fc = yc[2] - zg;
        tau = cc;
        memcpy(yb, yc, sizeof yb);
        if (fc <= 0.0) { /* c replaces b; when b moves twice running, halve f(a) so that a moves too */
            b = cc, fb = fc;
            if (side == -1)
                fa *= 0.5;
            side = -1;
            if (fc == 0.0)
                break;
        } else {
            a = cc, fa = fc;
            if (side == +1)
                fb *= 0.5;
            side = +1;
        }
    }
    out->range = hypot(yb[0], yb[1]);
    out->time_of_flight = t0 + tau;
    out->steps = steps;
    out->evals = n_forces_eval - evals0;
    return 0;
}

/* ---- timing ---- */

static double now(void)
{
    struct timespec ts;
    clock_gettime(CLOCK_MONOTONIC, &ts);
    return (double)ts.tv_sec + 1e-9 * (double)ts.tv_nsec;
}

static int cmp_double(const void *a, const void *b)
{
    double x = *(const double *)a, y = *(const double *)b;
    return (x > y) - (x < y);
}

typedef int (*fly_fn)(void *arg);

/* Median over `repeats` loops of n flights of the time per flight (s), n chosen so a loop takes
 * about `loop` seconds. */
static int time_per_flight(fly_fn fly, void *arg, double loop, int repeats, double *per, long *n_out)
{
    if (loop == 0.0) { /* --check: agreement only, nothing timed */
        *per = 0.0;
        *n_out = 0;
        return 0;
    }
    double t_start = now();
    long n = 0;
    while (now() - t_start < 0.1 * loop || n < 1) {
        if (fly(arg))
            return -1;
        n++;
    }
    double est = (now() - t_start) / (double)n;
    n = (long)ceil(loop / est);
    if (n < 1)
        n = 1;
    double times[64];
    if (repeats > 64)
        repeats = 64;
    for (int r = 0; r < repeats; r++) {
        double t0 = now();
        for (long i = 0; i < n; i++)
            if (fly(arg))
                return -1;
        times[r] = (now() - t0) / (double)n;
    }
    qsort(times, (size_t)repeats, sizeof *times, cmp_double);
    *per = times[repeats / 2];
    *n_out = n;
    return 0;
}

static int fly_dragarc(void *arg)
{
    const dragarc_scenario *s = arg;
    dragarc_flight f;
    int rc = dragarc_flight_run(s, 0.0, &f, NULL);
    dragarc_flight_clear(&f);
    return rc;
}

typedef struct ref_arg {
    ref_solver *r;
    const dragarc_scenario *s;
} ref_arg;

static int fly_ref(void *arg)
{
    ref_arg *a = arg;
    ref_result res;
    return ref_fly(a->r, a->s, &res);
}

/* Flights of s per second on `threads` threads, each flying its own copy of the scenario, for about
 * `seconds` in all; the range of one flight in *range. Returns the number of failed flights. */
static int throughput(const dragarc_scenario *s, int threads, double seconds, double loop, long *n, double *secs,
                      double *range)
{
    double t_one;
    long n_one;
    dragarc_flight one;
    if (dragarc_flight_run(s, 0.0, &one, NULL) != DRAGARC_OK) {
        dragarc_flight_clear(&one);
        return 1;
    }
    *range = one.range;
    dragarc_flight_clear(&one);
    if (time_per_flight(fly_dragarc, (void *)s, 0.2 * loop, 1, &t_one, &n_one) != 0)
        return 1;
    *n = (long)ceil(seconds * threads / t_one);
    const long total = *n;
    int fails = 0;
    double t0 = now();
#pragma omp parallel num_threads(threads) reduction(+ : fails)
    {
        dragarc_scenario mine;
        dragarc_scenario_default(&mine);
        if (dragarc_scenario_copy(&mine, s, NULL) != DRAGARC_OK)
            fails++;
        else {
#pragma omp for schedule(dynamic, 64)
            for (long i = 0; i < total; i++) {
                dragarc_flight f;
                if (dragarc_flight_run(&mine, 0.0, &f, NULL) != DRAGARC_OK)
                    fails++;
                dragarc_flight_clear(&f);
            }
        }
        dragarc_scenario_clear(&mine);
    }
    *secs = now() - t0;
    return fails;
}

/* ---- JSON output of the problems for the SciPy side ---- */

static void json_problem(FILE *fp, const problem *p)
{
    const dragarc_scenario *s = &p->s;
    const dragarc_projectile *pr = &s->projectile;
    const dragarc_atmosphere *at = &s->atmosphere;
    const dragarc_wind *w = &s->wind;
    fprintf(fp, "    {\"name\": \"%s\", \"what\": \"%s\",\n", p->name, p->what);
    fprintf(fp, "     \"mass\": %.17g, \"diameter\": %.17g, \"area\": %.17g, \"volume\": %.17g,\n", pr->mass,
            pr->diameter, pr->area, pr->volume);
    fprintf(fp, "     \"drag\": {\"model\": \"%s\"", dragarc_drag_model_name(pr->drag.model));
    if (pr->drag.model == DRAGARC_DRAG_TABLE) {
        fprintf(fp, ", \"axis\": \"%s\", \"x\": [", dragarc_drag_axis_name(pr->drag.axis));
        for (size_t i = 0; i < pr->drag.npoints; i++)
            fprintf(fp, "%s%.17g", i ? ", " : "", pr->drag.x[i]);
        fprintf(fp, "], \"cd\": [");
        for (size_t i = 0; i < pr->drag.npoints; i++)
            fprintf(fp, "%s%.17g", i ? ", " : "", pr->drag.y[i]);
        /* dragarc's own Cd at points between the table's, for the SciPy side to check its interpolation. */
        fprintf(fp, "], \"check\": [");
        double lo = pr->drag.u[0], hi = pr->drag.u[pr->drag.npoints - 1];
        for (int i = 0; i <= 40; i++) {
            double u = lo - 0.1 * (hi - lo) + 1.2 * (hi - lo) * i / 40.0;
            double x = pr->drag.axis == DRAGARC_AXIS_REYNOLDS ? exp(u) : fmax(u, 0.0);
            double cd = dragarc_drag_cd(&pr->drag, x, x, x);
            fprintf(fp, "%s[%.17g, %.17g]", i ? ", " : "", x, cd);
        }
        fprintf(fp, "]");
    }
    fprintf(fp, "},\n");
    fprintf(fp, "     \"launch\": {\"speed\": %.17g, \"elevation\": %.17g, \"azimuth\": %.17g, \"height\": %.17g},\n",
            s->launch.speed, s->launch.elevation, s->launch.azimuth, s->launch.height);
    fprintf(fp, "     \"gravity\": %.17g, \"ground_elevation\": %.17g,\n", s->gravity, s->ground_elevation);
    if (at->model == DRAGARC_ATMOSPHERE_ISA)
        fprintf(fp, "     \"atmosphere\": {\"model\": \"isa\", \"site_elevation\": %.17g, \"temperature_offset\": %.17g},\n",
                at->site_elevation, at->temperature_offset);
    else
        fprintf(fp, "     \"atmosphere\": {\"model\": \"constant\", \"density\": %.17g, \"viscosity\": %.17g, "
                "\"temperature\": %.17g},\n", at->density, at->viscosity, at->temperature);
    if (w->model == DRAGARC_WIND_CONSTANT)
        fprintf(fp, "     \"wind\": {\"model\": \"constant\", \"speed\": %.17g, \"from\": %.17g},\n", w->speed, w->from);
    else {
        fprintf(fp, "     \"wind\": {\"model\": \"layered\", \"layers\": [");
        for (size_t i = 0; i < w->nlayers; i++)
            fprintf(fp, "%s[%.17g, %.17g, %.17g]", i ? ", " : "", w->layers[i].height, w->layers[i].speed,
                    w->layers[i].from);
        fprintf(fp, "]},\n");
    }
    fprintf(fp, "     \"rtol\": %.17g, \"atol\": %.17g, \"max_time\": %.17g,\n", s->solver.rtol, s->solver.atol,
            s->solver.max_time);
}

static void usage(void)
{
    fprintf(stderr, "usage: bench_flight [--loop SECONDS] [--repeats N] [--threads N] [--json PATH]\n"
                    "       bench_flight --check [--json PATH]\n"
                    "       bench_flight --profile ball|fragment|drop|fine_drop\n");
}

int main(int argc, char **argv)
{
    double loop = 0.5, mt_seconds = 2.0;
    int repeats = 5, threads = 2;
    const char *json_path = NULL, *profile = NULL;
    int check = 0;
    for (int i = 1; i < argc; i++) {
        if (strcmp(argv[i], "--loop") == 0 && i + 1 < argc)
            loop = atof(argv[++i]);
        else if (strcmp(argv[i], "--repeats") == 0 && i + 1 < argc)
            repeats = atoi(argv[++i]);
        else if (strcmp(argv[i], "--threads") == 0 && i + 1 < argc)
            threads = atoi(argv[++i]);
        else if (strcmp(argv[i], "--json") == 0 && i + 1 < argc)
            json_path = argv[++i];
        else if (strcmp(argv[i], "--check") == 0)
            check = 1;
        else if (strcmp(argv[i], "--profile") == 0 && i + 1 < argc)
            profile = argv[++i];
        else {
            usage();
            return 2;
        }
    }
    if (!(loop > 0.0) || repeats < 1 || threads < 1) {
        usage();
        return 2;
    }
    if (check)
        loop = 0.0;
    dragarc_init();

    problem pb[NPROBLEMS];
    dragarc_error err;
    if (make_problems(pb, &err) != DRAGARC_OK) {
        fprintf(stderr, "bench_flight: %s: %s\n", err.field, err.message);
        return 3;
    }
    if (profile) {
        int k = 0;
        while (k < NPROBLEMS && strcmp(pb[k].name, profile) != 0)
            k++;
        long n = 0;
        int rc = DRAGARC_OK;
        for (double t0 = now(); k < NPROBLEMS && rc == DRAGARC_OK && now() - t0 < 3.0; n++)
            rc = fly_dragarc(&pb[k].s);
        if (k < NPROBLEMS)
            printf("%s: %ld dragarc flights%s\n", profile, n, rc == DRAGARC_OK ? "" : ", the last one failed");
        for (int j = 0; j < NPROBLEMS; j++)
            dragarc_scenario_clear(&pb[j].s);
        if (k == NPROBLEMS) {
            usage();
            return 2;
        }
        return rc == DRAGARC_OK ? 0 : 3;
    }
    FILE *fp = json_path ? fopen(json_path, "w") : NULL;
    if (json_path && !fp) {
        fprintf(stderr, "bench_flight: %s: cannot write\n", json_path);
        return 3;
    }
    if (fp)
        fprintf(fp, "{\n  \"problems\": [\n");
    int status = 0;
    if (!check)
        printf("%-9s %-10s %12s %8s %10s %16s %s\n", "problem", "solver", "us/flight", "steps", "f-evals", "range m",
           "method");
    for (int k = 0; k < NPROBLEMS && status == 0; k++) {
        problem *p = &pb[k];
        dragarc_flight f;
        long ev0 = n_forces_eval;
        if (dragarc_flight_run(&p->s, 0.0, &f, &err) != DRAGARC_OK) {
            fprintf(stderr, "bench_flight: %s: %s: %s\n", p->name, err.field, err.message);
            dragarc_flight_clear(&f);
            status = 3;
            break;
        }
        long d_evals = n_forces_eval - ev0;
        ref_result ref[2];
        ref_solver rs[2];
        int nref = p->stiff ? 2 : 1;
        for (int m = 0; m < nref; m++) {
            if (ref_solver_init(&rs[m], (ref_method)m, &p->s, p->s.solver.rtol, p->s.solver.atol) != 0 || ref_fly(&rs[m], &p->s, &ref[m]) != 0) {
                fprintf(stderr, "bench_flight: %s: the %s reference failed\n", p->name, REF_NAMES[m]);
                status = 3;
            }
        }
        /* A much tighter rk8pd solution, to state each solver's actual range error. */
        ref_solver tight;
        ref_result tight_res = {NAN, NAN, 0, 0};
        if (ref_solver_init(&tight, REF_RK8PD, &p->s, TIGHT_TOL, TIGHT_TOL) != 0 || ref_fly(&tight, &p->s, &tight_res) != 0) {
            fprintf(stderr, "bench_flight: %s: the tight rk8pd reference failed\n", p->name);
            status = 3;
        }
        ref_solver_free(&tight);
        /* The same flight with the method dragarc did not choose, forced: BDF for an explicit choice, DOP853
         * for an implicit one. */
        dragarc_scenario other = p->s; /* shallow: shares the tables, read only */
        other.solver.method = f.method == DRAGARC_METHOD_BDF ? DRAGARC_METHOD_DOP853 : DRAGARC_METHOD_BDF;
        dragarc_flight fo;
        memset(&fo, 0, sizeof fo);
        long ev1 = n_forces_eval;
        if (status == 0 && dragarc_flight_run(&other, 0.0, &fo, &err) != DRAGARC_OK) {
            fprintf(stderr, "bench_flight: %s (forced %s): %s: %s\n", p->name, dragarc_method_name(other.solver.method),
                    err.field, err.message);
            status = 3;
        }
        long o_evals = n_forces_eval - ev1;
        if (status == 0 && !(fabs(fo.range - f.range) <= RANGE_RTOL * fabs(f.range))) {
            fprintf(stderr, "bench_flight: %s: dragarc's range %.12g m (%s) and %.12g m (%s) differ by more than %g\n",
                    p->name, f.range, dragarc_method_name(f.method), fo.range, dragarc_method_name(other.solver.method),
                    RANGE_RTOL);
            status = 3;
        }
        /* The accuracy contract: the global range error of a flight at tolerance rtol stays within 10 rtol (the
         * local error per step is held to rtol; a few tens of steps add up to a few rtol at most here). */
        double tight_err = fabs(f.range - tight_res.range) / fabs(tight_res.range);
        if (status == 0 && !(tight_err <= 10.0 * p->s.solver.rtol)) {
            fprintf(stderr, "bench_flight: %s: dragarc's range %.12g m is %.3g from the 1e-12 solution %.12g m "
                    "(more than 10 rtol)\n", p->name, f.range, tight_err, tight_res.range);
            status = 3;
        }
        for (int m = 0; m < nref && status == 0; m++) {
            double rel = fabs(f.range - ref[m].range) / fabs(ref[m].range);
            if (!(rel <= RANGE_RTOL)) {
                fprintf(stderr,
                        "bench_flight: %s: dragarc range %.12g m and %s range %.12g m differ by %.3g relative "
                        "(more than %g); no times printed\n",
                        p->name, f.range, REF_NAMES[m], ref[m].range, rel, RANGE_RTOL);
                status = 3;
            }
        }
        if (check && status == 0) {
            printf("%-9s agree: dragarc (%s) %.12g m, %.1e from the 1e-12 solution; %s forced %.1e;", p->name,
                   dragarc_method_name(f.method), f.range, tight_err, dragarc_method_name(other.solver.method),
                   fabs(fo.range - f.range) / f.range);
            for (int m = 0; m < nref; m++)
                printf(" %s %.1e;", REF_NAMES[m], fabs(ref[m].range - f.range) / f.range);
            printf("\n");
        }
        if (status != 0) {
            for (int m = 0; m < nref; m++)
                ref_solver_free(&rs[m]);
            dragarc_flight_clear(&f);
            dragarc_flight_clear(&fo);
            break;
        }
        double t_d;
        long n_d;
        if (time_per_flight(fly_dragarc, &p->s, loop, repeats, &t_d, &n_d) != 0) {
            status = 3;
            break;
        }
        if (!check)
            printf("%-9s %-10s %12.2f %8ld %10ld %16.9f %s\n", p->name, "dragarc", 1e6 * t_d, f.steps, d_evals, f.range,
               dragarc_method_name(f.method));
        double t_o;
        long n_o;
        if (time_per_flight(fly_dragarc, &other, loop, repeats, &t_o, &n_o) != 0) {
            status = 3;
            break;
        }
        if (!check)
            printf("%-9s %-10s %12.2f %8ld %10ld %16.9f forced %s\n", p->name, "dragarc", 1e6 * t_o, fo.steps, o_evals,
               fo.range, dragarc_method_name(fo.method));
        double t_r[2] = {NAN, NAN};
        long n_r[2] = {0, 0};
        for (int m = 0; m < nref; m++) {
            ref_arg a = {&rs[m], &p->s};
            if (time_per_flight(fly_ref, &a, loop, repeats, &t_r[m], &n_r[m]) != 0) {
                status = 3;
                break;
            }
            if (!check)
                printf("%-9s %-10s %12.2f %8ld %10ld %16.9f\n", p->name, REF_NAMES[m], 1e6 * t_r[m], ref[m].steps,
                   ref[m].evals, ref[m].range);
        }
        if (fp) {
            json_problem(fp, p);
            fprintf(fp, "     \"dragarc\": {\"seconds_per_flight\": %.6g, \"loop_flights\": %ld, \"steps\": %ld, "
                    "\"forces_evals\": %ld, \"method\": \"%s\", \"range\": %.17g, \"time_of_flight\": %.17g},\n",
                    t_d, n_d, f.steps, d_evals, dragarc_method_name(f.method), f.range, f.time_of_flight);
            fprintf(fp, "     \"dragarc_forced\": {\"seconds_per_flight\": %.6g, \"loop_flights\": %ld, \"steps\": %ld, "
                    "\"forces_evals\": %ld, \"method\": \"%s\", \"range\": %.17g},\n",
                    t_o, n_o, fo.steps, o_evals, dragarc_method_name(fo.method), fo.range);
            fprintf(fp, "     \"tight_range\": %.17g, \"tight_tol\": %g,\n", tight_res.range, TIGHT_TOL);
            fprintf(fp, "     \"reference\": [");
            for (int m = 0; m < nref; m++)
                fprintf(fp, "%s\n       {\"solver\": \"%s\", \"seconds_per_flight\": %.6g, \"loop_flights\": %ld, "
                        "\"steps\": %ld, \"forces_evals\": %ld, \"range\": %.17g, \"time_of_flight\": %.17g}",
                        m ? "," : "", REF_NAMES[m], t_r[m], n_r[m], ref[m].steps, ref[m].evals, ref[m].range,
                        ref[m].time_of_flight);
            fprintf(fp, "]}%s\n", k + 1 < NPROBLEMS ? "," : "");
        }
        for (int m = 0; m < nref; m++)
            ref_solver_free(&rs[m]);
        dragarc_flight_clear(&f);
        dragarc_flight_clear(&fo);
    }
    if (fp && status == 0)
        fprintf(fp, "  ],\n");

    /* Fragment flights per second on `threads` threads: the problem as defined (rtol 1e-8), and at rtol =
     * atol = 1e-6, a tolerance a footprint study might choose (its range error is stated beside it). */
    double rate[2] = {NAN, NAN}, t_mt[2] = {NAN, NAN}, tol_mt[2] = {1e-8, 1e-6}, range_mt[2] = {NAN, NAN};
    long n_mt[2] = {0, 0};
    for (int v = 0; v < 2 && status == 0 && !check; v++) {
        dragarc_scenario frag = pb[1].s; /* shallow: shares the tables, read only */
        frag.solver.rtol = frag.solver.atol = tol_mt[v];
        if (throughput(&frag, threads, mt_seconds, loop, &n_mt[v], &t_mt[v], &range_mt[v]) != 0) {
            fprintf(stderr, "bench_flight: fragment flights failed on %d threads\n", threads);
            status = 3;
            break;
        }
        rate[v] = (double)n_mt[v] / t_mt[v];
        printf("fragment at rtol %g on %d threads: %ld flights in %.3f s = %.0f flights/s (1e6 flights in %.1f s)\n",
               tol_mt[v], threads, n_mt[v], t_mt[v], rate[v], 1e6 / rate[v]);
    }
    struct rusage ru;
    getrusage(RUSAGE_SELF, &ru);
    printf("peak memory (ru_maxrss): %ld KiB\n", ru.ru_maxrss);
    if (fp) {
        if (status == 0)
            for (int v = 0; v < 2 && !check; v++)
                fprintf(fp, "  \"%s\": {\"problem\": \"fragment\", \"rtol\": %g, \"threads\": %d, "
                        "\"max_threads\": %d, \"flights\": %ld, \"seconds\": %.6g, \"flights_per_second\": %.6g, "
                        "\"range\": %.17g},\n",
                        v ? "parallel_loose" : "parallel", tol_mt[v], threads, omp_get_num_procs(), n_mt[v], t_mt[v],
                        rate[v], range_mt[v]);
        if (status == 0)
            fprintf(fp, "  \"peak_rss_kib\": %ld\n}\n", ru.ru_maxrss);
        if (fclose(fp) != 0)
            status = 3;
    }
    for (int k = 0; k < NPROBLEMS; k++)
        dragarc_scenario_clear(&pb[k].s);
    return status;
}
