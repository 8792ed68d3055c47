/* optimize.c: the launch that carries farthest within bounds, and the sensitivity of the result.
 * SPDX-License-Identifier: GPL-3.0-or-later
 *
 * The objective F(x) is the carry (range to the first landing) or the total distance (to rest) of the flight
 * with the varied parameters set to x; each evaluation flies the whole scenario. A trial that fails (no
 * landing, a solver failure, a value the scenario refuses) is worse than every flight that lands: the
 * minimisers, which need finite numbers, see -F = -range <= 0 for a flight and +1 m for a failure.
 * Each variable is scaled to t in [0, 1] of its bounds, x = lo + t (hi - lo).
 *
 * One variable: F is sampled at 33 equally spaced t (32 intervals: range against elevation can have more
 * than one local maximum with lift, and Brent needs a bracket a < m < b with F(m) above F(a) and F(b));
 * the best sample and its neighbours bracket the maximum, refined by GSL's Brent minimiser (Brent 1973,
 * Algorithms for Minimization without Derivatives, ch. 5; gsl_min_fminimizer_brent) until the bracket is
 * below size_tolerance. A best sample on a bound is compared with a probe 1e-6 of the width inside: if
 * the probe is worse the optimum is on the bound (a constrained optimum), else the last cell is bracketed.
 *
 * Several variables: each is mapped onto the whole line by x = lo + (hi - lo) (1 + sin u) / 2, Box's
 * transformation for bounds (Box, M. J. 1966, "A comparison of several current optimization methods, and
 * the use of transformations in constrained problems", Computer J. 9:67; recalled), which reaches both
 * bounds at finite u, so that an optimum on a bound is found too. F is sampled on a grid of k points a
 * side (k = 11, 6, 4, 3 for 2, 3, 4, 5 variables); from each of the (up to) three best grid points that are
 * local maxima among their neighbours, GSL's Nelder-Mead simplex (Nelder, J. A. & Mead, R. 1965, "A simplex
 * method for function minimization", Computer J. 7:308; gsl_multimin_fminimizer_nmsimplex2, whose size
 * is the RMS distance of the vertices from their centre) runs in u, with a first step of 2 / (k - 1) rad
 * (about one grid cell at mid-range), until that size is below size_tolerance (radians of u: x then moves
 * by at most (hi - lo) / 2 times it). The best of the runs is the optimum; a coordinate within 1e-6 of the
 * width of a bound is moved onto it when that is no worse.
 *
 * Sensitivities at the optimum x*, the slope with step h = fd_step (hi - lo) and the curvature with 10 h (the
 * second difference divides the flights' own error by the step squared), per variable (Nocedal, J. & Wright,
 * S. J. 2006, Numerical Optimization, 2nd ed., sec. 8.1; recalled): inside, central differences
 *   F' = (F(x+h) - F(x-h)) / 2h,  F'' = (F(x+h) - 2 F(x) + F(x-h)) / h^2   (errors O(h^2));
 * within the step of a bound, one-sided ones that stay inside the bounds (s = +1 forward, -1 backward):
 *   F' = s (-3 F(x) + 4 F(x+sh) - F(x+2sh)) / 2h (O(h^2)),  F'' = (F(x) - 2 F(x+sh) + F(x+2sh)) / h^2 (O(h)).
 */
#include <math.h>
#include <stdio.h>
#include <stdlib.h>
#include <string.h>

#include <gsl/gsl_errno.h>
#include <gsl/gsl_min.h>
#include <gsl/gsl_multimin.h>
#include <gsl/gsl_vector.h>

#include "dragarc/optimize.h"

#define SCAN_POINTS 33   /* one variable */
#define MAX_GRID 256     /* several: k^n points at most (11^2, 6^3, 4^4, 3^5) */
#define MAX_STARTS 3     /* Nelder-Mead runs from the best grid maxima */
#define BOUND_SNAP 1e-6  /* fraction of the width: a bound this close is tried as the optimum */
#define FAILED_VALUE 1.0 /* what the minimisers see for a failed trial; every flight that lands has -F <= 0 */

typedef struct opt_ctx {
    const dragarc_scenario *base;
    const dragarc_optimize_request *req;
    long flights, failed;
    dragarc_error first, last; /* the first and the latest failure, with their codes */
} opt_ctx;

void dragarc_optimize_request_default(dragarc_optimize_request *r)
{
    memset(r, 0, sizeof *r);
    r->objective = DRAGARC_OPTIMIZE_CARRY;
    r->size_tolerance = 1e-7;
    r->max_iterations = 500;
    r->fd_step = 1e-3;
}

const char *dragarc_optimize_objective_name(dragarc_optimize_objective o)
{
    return o == DRAGARC_OPTIMIZE_TOTAL ? "total" : "carry";
}

int dragarc_optimize_objective_from_name(const char *name, dragarc_optimize_objective *out)
{
    if (name && strcmp(name, "carry") == 0)
        *out = DRAGARC_OPTIMIZE_CARRY;
    else if (name && strcmp(name, "total") == 0)
        *out = DRAGARC_OPTIMIZE_TOTAL;
    else
        return DRAGARC_EINVAL;
    return DRAGARC_OK;
}

/* v to 12 significant digits: a bound derived from a scenario value read back from radians or rad/s (2000 rpm
 * reads as 2000.0000000000002) is the round number the file gave. */
static double round12(double v)
{
    char buf[32];
    snprintf(buf, sizeof buf, "%.12g", v);
    return strtod(buf, NULL) + 0.0;
}

int dragarc_optimize_default_bounds(const dragarc_scenario *s, const char *name, double *lo, double *hi,
                                    dragarc_error *err)
{
    const dragarc_scenario_param *p = dragarc_scenario_param_find(name);
    if (!p)
        return dragarc_scenario_get(s, name, lo, err); /* the unknown-name message with the accepted names */
    double v = 0.0;
    int rc = dragarc_scenario_get(s, p->path, &v, err);
    if (rc != DRAGARC_OK)
        return rc;
    if (strcmp(p->alias, "elevation") == 0) {
        *lo = 0.0;
        *hi = 80.0;
    } else if (strcmp(p->alias, "speed") == 0) {
        if (!(v > 0.0))
            return dragarc_error_set(err, DRAGARC_EINVAL, p->path,
                                     "is 0, so there is no default range around it: give bounds (speed=LO:HI)");
        *lo = round12(0.8 * v);
        *hi = round12(1.2 * v);
    } else if (strcmp(p->alias, "spin_rate") == 0) {
        *lo = 0.0;
        *hi = v > 0.0 ? fmin(round12(2.0 * v), 60000.0) : 6000.0;
    } else if (strcmp(p->alias, "spin_tilt") == 0) {
        *lo = -45.0;
        *hi = 45.0;
    } else if (strcmp(p->alias, "azimuth") == 0) {
        double a = remainder(v, 360.0);
        *lo = round12(a - 45.0);
        *hi = round12(a + 45.0);
    } else {
        return dragarc_error_set(err, DRAGARC_EINVAL, p->path,
                                 "has no default bounds (only elevation, speed, spin_rate, spin_tilt and azimuth "
                                 "have them): give them as %s=LO:HI", p->alias);
    }
    return DRAGARC_OK;
}

int dragarc_optimize_add(dragarc_optimize_request *r, const char *name, double lo, double hi, dragarc_error *err)
{
    const dragarc_scenario_param *p = dragarc_scenario_param_find(name);
    if (!p) {
        dragarc_scenario none;
        dragarc_scenario_default(&none);
        double v;
        return dragarc_scenario_get(&none, name, &v, err); /* the unknown-name message */
    }
    if (r->nvars >= DRAGARC_OPTIMIZE_MAX_VARS)
        return dragarc_error_set(err, DRAGARC_EINVAL, p->path, "at most %d parameters can be varied at once",
                                 DRAGARC_OPTIMIZE_MAX_VARS);
    for (size_t i = 0; i < r->nvars; i++)
        if (r->vars[i].param == p)
            return dragarc_error_set(err, DRAGARC_EINVAL, p->path, "varied twice: give each parameter once");
    if (!(isfinite(lo) && isfinite(hi)))
        return dragarc_error_set(err, DRAGARC_EINVAL, p->path, "the bounds must be finite numbers");
    if (!(lo < hi))
        return dragarc_error_set(err, DRAGARC_EINVAL, p->path,
                                 "the lower bound (%.10g) must be below the upper bound (%.10g)", lo, hi);
    r->vars[r->nvars].param = p;
    r->vars[r->nvars].lo = lo;
    r->vars[r->nvars].hi = hi;
    r->nvars++;
    return DRAGARC_OK;
}

int dragarc_optimize_apply(dragarc_scenario *s, const dragarc_optimize_request *req, const double *x,
                           dragarc_error *err)
{
    for (size_t i = 0; i < req->nvars; i++) {
        int rc = dragarc_scenario_set(s, req->vars[i].param->path, x[i], err);
        if (rc != DRAGARC_OK)
            return rc;
    }
    return DRAGARC_OK;
}

void dragarc_optimize_clear(dragarc_optimize_result *r)
{
    if (!r)
        return;
    dragarc_flight_clear(&r->flight);
    memset(r, 0, sizeof *r);
}

/* ---- the objective ------------------------------------------------------------------------------------ */

/* F(x), x in the variables' units; -INFINITY when the trial fails. The flight goes to *keep when asked. */
static double objective(opt_ctx *c, const double *x, dragarc_flight *keep)
{
    /* A fresh shallow copy each time: set() scales a diameter from the current one, so reusing a copy would
     * let rounding drift from trial to trial. */
    dragarc_scenario s = *c->base;
    dragarc_flight f;
    dragarc_error e = {0};
    memset(&f, 0, sizeof f);
    c->flights++;
    int rc = dragarc_optimize_apply(&s, c->req, x, &e);
    if (rc == DRAGARC_OK)
        rc = dragarc_flight_run(&s, 0.0, &f, &e);
    double v = NAN;
    if (rc == DRAGARC_OK)
        v = c->req->objective == DRAGARC_OPTIMIZE_TOTAL ? f.total_distance : f.range;
    if (rc != DRAGARC_OK || !isfinite(v)) {
        dragarc_flight_clear(&f);
        c->last = e;
        c->last.code = rc != DRAGARC_OK ? rc : DRAGARC_ESOLVER;
        if (c->failed++ == 0)
            c->first = c->last;
        return -INFINITY;
    }
    if (keep)
        *keep = f;
    else
        dragarc_flight_clear(&f);
    return v;
}

static double x_of(const dragarc_optimize_var *v, double t)
{
    if (!(t > 0.0))
        return v->lo;
    if (t >= 1.0)
        return v->hi;
    return fmin(fmax(v->lo + t * (v->hi - v->lo), v->lo), v->hi);
}

/* -F at scaled point t[0..n-1], as the minimisers see it. */
static double minus_f(opt_ctx *c, const double *t)
{
    double x[DRAGARC_OPTIMIZE_MAX_VARS];
    for (size_t i = 0; i < c->req->nvars; i++)
        x[i] = x_of(&c->req->vars[i], t[i]);
    double v = objective(c, x, NULL);
    return isfinite(v) ? -v : FAILED_VALUE;
}

/* ---- one variable: scan, then Brent ------------------------------------------------------------------- */

static double line_f(double t, void *user) { return minus_f(user, &t); }

static void flat_note(dragarc_optimize_result *out)
{
    out->converged = 0;
    snprintf(out->note, sizeof out->note,
             "the objective is flat around the best point of the scan: the optimum is not unique");
}

/* Minimise -F over t in [0, 1]; *t_best receives the optimum. DRAGARC_ENOMEM when GSL cannot allocate. */
static int solve_line(opt_ctx *c, dragarc_optimize_result *out, double *t_best)
{
    const int n = SCAN_POINTS;
    double t[SCAN_POINTS], g[SCAN_POINTS];
    int best = 0;
    for (int i = 0; i < n; i++) {
        t[i] = (double)i / (double)(n - 1);
        g[i] = line_f(t[i], c);
        if (g[i] < g[best])
            best = i;
    }
    out->method = "brent";
    out->grid = SCAN_POINTS;
    out->starts = 1;
    *t_best = t[best];
    if (g[best] == FAILED_VALUE)
        return DRAGARC_OK; /* every trial failed: the caller says so */
    double a, m, b, ga, gm, gb;
    if (best == 0 || best == n - 1) {
        int up = best == n - 1;
        double tp = up ? 1.0 - BOUND_SNAP : BOUND_SNAP, gp = line_f(tp, c);
        if (gp > g[best]) { /* worse just inside: the optimum is on the bound */
            out->converged = 1;
            out->size = 0.0;
            return DRAGARC_OK;
        }
        a = up ? t[n - 2] : 0.0;
        ga = up ? g[n - 2] : g[0];
        b = up ? 1.0 : t[1];
        gb = up ? g[n - 1] : g[1];
        m = tp;
        gm = gp;
    } else {
        a = t[best - 1], m = t[best], b = t[best + 1];
        ga = g[best - 1], gm = g[best], gb = g[best + 1];
    }
    if (!(gm < ga && gm < gb)) {
        *t_best = gm < g[best] ? m : t[best];
        flat_note(out);
        return DRAGARC_OK;
    }
    gsl_min_fminimizer *mn = gsl_min_fminimizer_alloc(gsl_min_fminimizer_brent);
    if (!mn)
        return DRAGARC_ENOMEM;
    gsl_function fn = {line_f, c};
    int st = gsl_min_fminimizer_set_with_values(mn, &fn, m, gm, a, ga, b, gb);
    *t_best = m;
    out->size = b - a;
    if (st != GSL_SUCCESS) {
        snprintf(out->note, sizeof out->note, "GSL's Brent minimiser could not start: %s", gsl_strerror(st));
        gsl_min_fminimizer_free(mn);
        return DRAGARC_OK;
    }
    int it = 0;
    while (it < c->req->max_iterations) {
        st = gsl_min_fminimizer_iterate(mn);
        it++;
        if (st != GSL_SUCCESS) {
            snprintf(out->note, sizeof out->note, "GSL's Brent minimiser stopped: %s", gsl_strerror(st));
            break;
        }
        double lo = gsl_min_fminimizer_x_lower(mn), hi = gsl_min_fminimizer_x_upper(mn);
        out->size = hi - lo;
        if (gsl_min_test_interval(lo, hi, c->req->size_tolerance, 0.0) == GSL_SUCCESS) {
            out->converged = 1;
            break;
        }
    }
    if (!out->converged && !out->note[0])
        snprintf(out->note, sizeof out->note, "%d iterations without reaching the size tolerance", it);
    out->iterations = it;
    if (gsl_min_fminimizer_f_minimum(mn) <= gm)
        *t_best = gsl_min_fminimizer_x_minimum(mn);
    gsl_min_fminimizer_free(mn);
    return DRAGARC_OK;
}

/* ---- several variables: grid, then Nelder-Mead in the mapped variables ---------------------------------- */

static double t_of_u(double u) { return 0.5 * (1.0 + sin(u)); }

static double simplex_f(const gsl_vector *u, void *user)
{
    opt_ctx *c = user;
    double t[DRAGARC_OPTIMIZE_MAX_VARS];
    for (size_t i = 0; i < c->req->nvars; i++)
        t[i] = t_of_u(gsl_vector_get(u, i));
    return minus_f(c, t);
}

/* The best point and the state of one Nelder-Mead run. */
typedef struct run {
    double t[DRAGARC_OPTIMIZE_MAX_VARS];
    double g;
    int iterations, converged;
    double size;
    char note[160];
} run;

static int simplex_run(opt_ctx *c, const double *t0, double first_step, run *r)
{
    size_t n = c->req->nvars;
    gsl_multimin_fminimizer *mm = gsl_multimin_fminimizer_alloc(gsl_multimin_fminimizer_nmsimplex2, n);
    gsl_vector *u0 = gsl_vector_alloc(n), *step = gsl_vector_alloc(n);
    int rc = DRAGARC_OK;
    if (!mm || !u0 || !step) {
        rc = DRAGARC_ENOMEM;
        goto done;
    }
    for (size_t i = 0; i < n; i++) {
        gsl_vector_set(u0, i, asin(2.0 * t0[i] - 1.0));
        gsl_vector_set(step, i, first_step);
    }
    gsl_multimin_function fn = {simplex_f, n, c};
    memset(r, 0, sizeof *r);
    memcpy(r->t, t0, n * sizeof *t0);
    r->g = FAILED_VALUE;
    int st = gsl_multimin_fminimizer_set(mm, &fn, u0, step);
    if (st != GSL_SUCCESS) {
        snprintf(r->note, sizeof r->note, "GSL's nmsimplex2 could not start: %s", gsl_strerror(st));
        goto done;
    }
    while (r->iterations < c->req->max_iterations) {
        st = gsl_multimin_fminimizer_iterate(mm);
        r->iterations++;
        if (st != GSL_SUCCESS) {
            snprintf(r->note, sizeof r->note, "GSL's nmsimplex2 stopped: %s", gsl_strerror(st));
            break;
        }
        r->size = gsl_multimin_fminimizer_size(mm);
        if (gsl_multimin_test_size(r->size, c->req->size_tolerance) == GSL_SUCCESS) {
            r->converged = 1;
            break;
        }
    }
    if (!r->converged && !r->note[0])
        snprintf(r->note, sizeof r->note, "%d iterations without reaching the size tolerance", r->iterations);
    r->g = gsl_multimin_fminimizer_minimum(mm);
    for (size_t i = 0; i < n; i++)
        r->t[i] = t_of_u(gsl_vector_get(gsl_multimin_fminimizer_x(mm), i));
done:
    gsl_vector_free(step);
    gsl_vector_free(u0);
    gsl_multimin_fminimizer_free(mm);
    return rc;
}

typedef struct grid_point {
    size_t index;
    double g;
} grid_point;

static int cmp_grid(const void *a, const void *b)
{
    double ga = ((const grid_point *)a)->g, gb = ((const grid_point *)b)->g;
    if (ga != gb)
        return ga < gb ? -1 : 1;
    size_t ia = ((const grid_point *)a)->index, ib = ((const grid_point *)b)->index;
    return ia < ib ? -1 : ia > ib; /* the same order on every machine */
}

static int solve_simplex(opt_ctx *c, dragarc_optimize_result *out, double *t_best)
{
    static const size_t K[DRAGARC_OPTIMIZE_MAX_VARS + 1] = {0, SCAN_POINTS, 11, 6, 4, 3};
    size_t n = c->req->nvars, k = K[n], total = 1;
    for (size_t i = 0; i < n; i++)
        total *= k;
    double g[MAX_GRID];
    grid_point maxima[MAX_GRID];
    size_t nmax = 0;
    out->method = "nmsimplex2";
    out->grid = total;
    for (size_t p = 0; p < total; p++) {
        double t[DRAGARC_OPTIMIZE_MAX_VARS];
        for (size_t i = 0, q = p; i < n; i++, q /= k)
            t[i] = (double)(q % k) / (double)(k - 1);
        g[p] = minus_f(c, t);
    }
    /* grid points no worse than their neighbours along each axis */
    for (size_t p = 0, stride; p < total; p++) {
        int local = g[p] < FAILED_VALUE;
        stride = 1;
        for (size_t i = 0; i < n && local; i++, stride *= k) {
            size_t digit = (p / stride) % k;
            if (digit > 0 && g[p - stride] < g[p])
                local = 0;
            if (digit + 1 < k && g[p + stride] < g[p])
                local = 0;
        }
        if (local)
            maxima[nmax++] = (grid_point){p, g[p]};
    }
    for (size_t i = 0; i < n; i++)
        t_best[i] = 0.0;
    if (nmax == 0)
        return DRAGARC_OK; /* every trial failed */
    qsort(maxima, nmax, sizeof maxima[0], cmp_grid);
    run best = {.g = FAILED_VALUE};
    for (size_t s = 0; s < nmax && s < MAX_STARTS; s++) {
        double t0[DRAGARC_OPTIMIZE_MAX_VARS];
        for (size_t i = 0, q = maxima[s].index; i < n; i++, q /= k)
            t0[i] = (double)(q % k) / (double)(k - 1);
        run r;
        int rc = simplex_run(c, t0, fmin(1.0, 2.0 / (double)(k - 1)), &r);
        if (rc != DRAGARC_OK)
            return rc;
        out->starts++;
        if (s == 0 || r.g < best.g)
            best = r;
    }
    memcpy(t_best, best.t, n * sizeof *t_best);
    out->iterations = best.iterations;
    out->converged = best.converged;
    out->size = best.size;
    snprintf(out->note, sizeof out->note, "%s", best.note);
    return DRAGARC_OK;
}

/* ---- checks, bounds, sensitivities --------------------------------------------------------------------- */

static int check_request(const dragarc_scenario *s, const dragarc_optimize_request *req, dragarc_error *err)
{
    if (req->nvars < 1 || req->nvars > DRAGARC_OPTIMIZE_MAX_VARS)
        return dragarc_error_set(err, DRAGARC_EINVAL, "", "an optimisation varies 1 to %d parameters (got %zu)",
                                 DRAGARC_OPTIMIZE_MAX_VARS, req->nvars);
    if (!(req->size_tolerance > 0.0 && req->size_tolerance < 1.0))
        return dragarc_error_set(err, DRAGARC_EINVAL, "size_tolerance", "must be between 0 and 1 (got %g)",
                                 req->size_tolerance);
    if (req->max_iterations < 1)
        return dragarc_error_set(err, DRAGARC_EINVAL, "max_iterations", "must be at least 1 (got %d)",
                                 req->max_iterations);
    if (!(req->fd_step > 0.0 && req->fd_step <= 0.025))
        return dragarc_error_set(err, DRAGARC_EINVAL, "fd_step", "must be above 0 and at most 0.025 (got %g)",
                                 req->fd_step);
    const dragarc_scenario_param *params[DRAGARC_OPTIMIZE_MAX_VARS];
    for (size_t i = 0; i < req->nvars; i++) {
        const dragarc_optimize_var *v = &req->vars[i];
        if (!v->param || dragarc_scenario_param_find(v->param->path) != v->param)
            return dragarc_error_set(err, DRAGARC_EINVAL, "", "variable %zu has no parameter: add it with "
                                                               "dragarc_optimize_add", i + 1);
        for (size_t j = 0; j < i; j++)
            if (req->vars[j].param == v->param)
                return dragarc_error_set(err, DRAGARC_EINVAL, v->param->path, "varied twice: give each parameter once");
        if (!(isfinite(v->lo) && isfinite(v->hi) && v->lo < v->hi))
            return dragarc_error_set(err, DRAGARC_EINVAL, v->param->path,
                                     "the bounds must be finite with the lower (%g) below the upper (%g)", v->lo,
                                     v->hi);
        params[i] = v->param;
    }
    int rc = dragarc_scenario_check(s, err);
    if (rc == DRAGARC_OK)
        rc = dragarc_scenario_params_check(s, params, req->nvars, err);
    if (rc != DRAGARC_OK)
        return rc;
    /* Each bound must be a value the parameter may take: one past its own rule (an elevation of 95 degrees) is
     * a mistake in the request. A bound that only makes the launch fail with the rest of the scenario (an
     * elevation of 0 from the ground) is a trial that fails, not a mistake. */
    for (size_t i = 0; i < req->nvars; i++)
        for (int side = 0; side < 2; side++) {
            const dragarc_optimize_var *v = &req->vars[i];
            double value = side ? v->hi : v->lo;
            dragarc_scenario t = *s;
            dragarc_error e;
            rc = dragarc_scenario_set(&t, v->param->path, value, &e);
            if (rc == DRAGARC_OK && dragarc_scenario_check(&t, &e) != DRAGARC_OK &&
                strcmp(e.field, v->param->path) == 0)
                rc = e.code;
            const char *unit = strcmp(v->param->unit, "degree") == 0 ? "degrees" : v->param->unit;
            if (rc != DRAGARC_OK)
                return dragarc_error_set(err, rc, e.field[0] ? e.field : v->param->path,
                                         "at the %s bound of %s (%.10g%s%s): %s", side ? "upper" : "lower",
                                         v->param->alias, value, unit[0] ? " " : "", unit, e.message);
        }
    return DRAGARC_OK;
}

/* Move a coordinate within BOUND_SNAP of a bound onto it when the objective there is no worse than at the
 * probe BOUND_SNAP inside, as for one variable. (Comparing with the simplex's own point, a hair from the bound,
 * would let the flights' rounding decide.) */
static void snap_to_bounds(opt_ctx *c, double *t)
{
    for (size_t i = 0; i < c->req->nvars; i++) {
        if (t[i] >= BOUND_SNAP && t[i] <= 1.0 - BOUND_SNAP)
            continue;
        double keep = t[i], edge = t[i] < BOUND_SNAP ? 0.0 : 1.0;
        t[i] = edge == 0.0 ? BOUND_SNAP : 1.0 - BOUND_SNAP;
        double inside = minus_f(c, t);
        t[i] = edge;
        if (!(minus_f(c, t) <= inside))
            t[i] = keep;
    }
}

/* Slope and curvature of F along variable i at xs (F(xs) = f0) with step h: central inside the bounds,
 * one-sided within h of one. NaN when a flight failed. */
static void differences(opt_ctx *c, const double *xs, double f0, size_t i, double h, double *slope, double *curv)
{
    const dragarc_optimize_var *v = &c->req->vars[i];
    double x[DRAGARC_OPTIMIZE_MAX_VARS];
    memcpy(x, xs, c->req->nvars * sizeof *x);
    if (xs[i] - h >= v->lo && xs[i] + h <= v->hi) {
        x[i] = xs[i] + h;
        double fp = objective(c, x, NULL);
        x[i] = xs[i] - h;
        double fm = objective(c, x, NULL);
        *slope = (fp - fm) / (2.0 * h);
        *curv = (fp - 2.0 * f0 + fm) / (h * h);
    } else {
        double s = xs[i] + h > v->hi ? -1.0 : 1.0;
        x[i] = xs[i] + s * h;
        double f1 = objective(c, x, NULL);
        x[i] = xs[i] + 2.0 * s * h;
        double f2 = objective(c, x, NULL);
        *slope = s * (-3.0 * f0 + 4.0 * f1 - f2) / (2.0 * h);
        *curv = (f0 - 2.0 * f1 + f2) / (h * h);
    }
    if (!isfinite(*slope) || !isfinite(*curv))
        *slope = *curv = NAN; /* a difference flight failed */
}

/* The slope with step h = fd_step x width; the curvature with 10 h, because the second difference divides
 * the flights' own error by the step squared (1e-6 m over (0.08 deg)^2 would be 2e-4 m/deg^2). */
static void sensitivities(opt_ctx *c, const double *xs, double f0, dragarc_optimize_result *out)
{
    for (size_t i = 0; i < c->req->nvars; i++) {
        const dragarc_optimize_var *v = &c->req->vars[i];
        double unused;
        out->step[i] = c->req->fd_step * (v->hi - v->lo);
        out->curvature_step[i] = 10.0 * out->step[i];
        differences(c, xs, f0, i, out->step[i], &out->slope[i], &unused);
        differences(c, xs, f0, i, out->curvature_step[i], &unused, &out->curvature[i]);
    }
}

int dragarc_optimize_solve(const dragarc_scenario *s, const dragarc_optimize_request *req,
                           dragarc_optimize_result *out, dragarc_error *err)
{
    memset(out, 0, sizeof *out);
    out->objective = NAN;
    int rc = check_request(s, req, err);
    if (rc != DRAGARC_OK)
        return rc;
    opt_ctx c = {.base = s, .req = req};
    double t[DRAGARC_OPTIMIZE_MAX_VARS];
    rc = req->nvars == 1 ? solve_line(&c, out, t) : solve_simplex(&c, out, t);
    if (rc == DRAGARC_OK && c.failed == c.flights) {
        int code = c.first.code == DRAGARC_ENOLAND || c.first.code == DRAGARC_EINVAL ? DRAGARC_ENOSOLUTION
                                                                                       : c.first.code;
        rc = dragarc_error_set(err, code, c.first.field,
                               "no launch within the bounds lands: all %ld trial flights failed; the first: %s",
                               c.flights, c.first.message);
        out->flights = c.flights;
        out->failed = c.failed;
        return rc;
    }
    if (rc != DRAGARC_OK) {
        out->flights = c.flights;
        out->failed = c.failed;
        return dragarc_error_set(err, rc, "", "out of memory for the minimiser");
    }
    if (req->nvars > 1)
        snap_to_bounds(&c, t);
    for (size_t i = 0; i < req->nvars; i++) {
        out->x[i] = x_of(&req->vars[i], t[i]);
        out->bound[i] = t[i] <= 0.0 ? -1 : t[i] >= 1.0 ? 1 : 0;
    }
    out->objective = objective(&c, out->x, &out->flight);
    if (!isfinite(out->objective)) { /* the same flight landed before: only a non-deterministic failure */
        out->flights = c.flights;
        out->failed = c.failed;
        return dragarc_error_set(err, c.last.code, c.last.field, "the flight at the optimum failed: %s",
                                 c.last.message);
    }
    sensitivities(&c, out->x, out->objective, out);
    out->flights = c.flights;
    out->failed = c.failed;
    return DRAGARC_OK;
}
