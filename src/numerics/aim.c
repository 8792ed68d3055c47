/* aim.c: the shooting method. Find the launch elevations (or the speed), and the azimuth, that put the
 * impact on a target, by flying candidate launches and solving for the miss.
 * SPDX-License-Identifier: GPL-3.0-or-later
 *
 * For a fixed azimuth psi the miss along the line to the target, f(x) = along(x) - |T|, is a function
 * of one variable x (the elevation, or the speed). Roots are bracketed by a scan (elevation every
 * degree from -89 to 89.5; speed on a geometric ladder), with every local maximum of along(x) refined by
 * Brent's minimiser first, so that two roots inside one scan cell on either side of the maximum-range
 * elevation are still separated; where the flight stops reaching the target plane (the apex falls
 * below it), the edge is found by bisection and used as a sample. Each bracket is refined by Brent's
 * root finder (Brent 1973, Algorithms for Minimization without Derivatives, ch. 4 and 5; GSL
 * gsl_root_fsolver_brent and gsl_min_fminimizer_brent).
 * With wind or a crossrange, the launch is then pointed at an aim point A that starts on the target T
 * and moves by the miss (A += T - P, halving the step when the miss grows), x re-solved on the same branch
 * each time, until the horizontal miss is below 1/1000 of the tolerance: in still air the first shot is
 * exact, a cross wind needs a few.
 */
#include <math.h>
#include <stdio.h>
#include <stdlib.h>
#include <string.h>

#include <gsl/gsl_errno.h>
#include <gsl/gsl_min.h>
#include <gsl/gsl_roots.h>

#include "core/constants.h"
#include "dragarc/aim.h"
#include "dragarc/flight.h"

#define MAX_SAMPLES 1024 /* scan points (at most 400) plus the extrema and edges refined between them */
#define MAX_TURNS 40

typedef struct aim_ctx {
    dragarc_scenario s;  /* shallow working copy: launch and ground change, tables are shared read-only */
    dragarc_aim_mode mode;
    double tx, ty;       /* target, m east and north */
    double dist;         /* |T| */
    double ux, uy;       /* unit vector toward the target */
    double psi;          /* azimuth being tried */
    double min_along;    /* shortest distance along the line seen by the last scan */
    long flights;
    int hard;            /* a failure that is not "never reaches the plane" */
    dragarc_error err;
} aim_ctx;

/* Fly at variable x (elevation or speed) and azimuth c->psi. Returns 1 when the flight reaches the target
 * plane (filling *along and, if wanted, the whole flight), 0 when it never comes down onto it, -1 on a
 * hard failure (kept in c->err). */
static int shoot(aim_ctx *c, double x, double *along, dragarc_flight *keep)
{
    dragarc_scenario *s = &c->s;
    if (c->mode == DRAGARC_AIM_ELEVATION)
        s->launch.elevation = x;
    else
        s->launch.speed = x;
    s->launch.azimuth = c->psi;
    dragarc_flight f;
    dragarc_error e;
    c->flights++;
    int rc = dragarc_flight_run(s, 0.0, &f, &e);
    if (rc == DRAGARC_ENOLAND && strcmp(e.field, "ground.elevation") == 0) {
        dragarc_flight_clear(&f);
        return 0;
    }
    if (rc == DRAGARC_EINVAL && strcmp(e.field, "launch.height") == 0) {
        dragarc_flight_clear(&f); /* a launch below the target plane that does not climb */
        return 0;
    }
    if (rc != DRAGARC_OK) {
        if (!c->hard)
            c->err = e;
        c->hard = 1;
        dragarc_flight_clear(&f);
        return -1;
    }
    *along = f.impact[0] * c->ux + f.impact[1] * c->uy;
    if (keep)
        *keep = f;
    else
        dragarc_flight_clear(&f);
    return 1;
}

typedef struct sample {
    double x, along;
    int ok;
} sample;

static double neg_along(double x, void *user)
{
    double a;
    return shoot(user, x, &a, NULL) == 1 ? -a : 0.0; /* outside the valid region: no better than 0 */
}

static double miss_along(double x, void *user)
{
    aim_ctx *c = user;
    double a;
    return shoot(c, x, &a, NULL) == 1 ? a - c->dist : NAN;
}

/* Brent's root finder on miss_along in [a, b] (a sign change); NaN if it fails. */
static double refine_root(aim_ctx *c, double a, double b)
{
    gsl_function fn = {miss_along, c};
    gsl_root_fsolver *r = gsl_root_fsolver_alloc(gsl_root_fsolver_brent);
    if (!r)
        return NAN;
    double root = NAN;
    if (gsl_root_fsolver_set(r, &fn, a, b) == GSL_SUCCESS) {
        for (int it = 0; it < 200; it++) {
            if (gsl_root_fsolver_iterate(r) != GSL_SUCCESS)
                break;
            double lo = gsl_root_fsolver_x_lower(r), hi = gsl_root_fsolver_x_upper(r);
            if (gsl_root_test_interval(lo, hi, 0.0, 1e-14) == GSL_SUCCESS) {
                root = gsl_root_fsolver_root(r);
                break;
            }
        }
    }
    gsl_root_fsolver_free(r);
    return root;
}

/* Brent's minimiser of -along in [a, b] around m; fills the maximum. */
static void refine_max(aim_ctx *c, double a, double m, double b, double fm, sample *out)
{
    out->x = m;
    out->along = fm;
    out->ok = 1;
    gsl_function fn = {neg_along, c};
    gsl_min_fminimizer *mn = gsl_min_fminimizer_alloc(gsl_min_fminimizer_brent);
    if (!mn)
        return;
    if (gsl_min_fminimizer_set_with_values(mn, &fn, m, -fm, a, neg_along(a, c), b, neg_along(b, c)) == GSL_SUCCESS) {
        for (int it = 0; it < 100; it++) {
            if (gsl_min_fminimizer_iterate(mn) != GSL_SUCCESS)
                break;
            double lo = gsl_min_fminimizer_x_lower(mn), hi = gsl_min_fminimizer_x_upper(mn);
            if (gsl_min_test_interval(lo, hi, 1e-10, 0.0) == GSL_SUCCESS)
                break;
        }
        double xm = gsl_min_fminimizer_x_minimum(mn), fx = -gsl_min_fminimizer_f_minimum(mn);
        if (fx >= fm) {
            out->x = xm;
            out->along = fx;
        }
    }
    gsl_min_fminimizer_free(mn);
}

/* Bisect between a valid sample and an invalid one for the edge of the region that reaches the plane. */
static sample find_edge(aim_ctx *c, sample ok, sample bad)
{
    for (int it = 0; it < 60 && fabs(ok.x - bad.x) > 1e-12 * fmax(1.0, fabs(ok.x)); it++) {
        sample m = {0.5 * (ok.x + bad.x), 0.0, 0};
        int r = shoot(c, m.x, &m.along, NULL);
        if (r < 0)
            break;
        m.ok = r;
        if (m.ok)
            ok = m;
        else
            bad = m;
    }
    return ok;
}

static int cmp_sample(const void *a, const void *b)
{
    double d = ((const sample *)a)->x - ((const sample *)b)->x;
    return d < 0 ? -1 : d > 0;
}

/* All roots of along(x) = dist at the current azimuth, in increasing x, each with the sign of the slope;
 * and the largest along(x) seen (refined). Returns -1 on a hard failure. */
static int solve_1d(aim_ctx *c, double *roots, int *slopes, size_t *nroots, double *best_x, double *best_along)
{
    sample smp[MAX_SAMPLES];
    size_t n = 0;
    if (c->mode == DRAGARC_AIM_ELEVATION) {
        for (double deg = -89.0; deg <= 89.5 + 1e-9 && n < 400; deg += 1.0, n++) {
            smp[n].x = deg * DRAGARC_DEG;
            smp[n].ok = shoot(c, smp[n].x, &smp[n].along, NULL);
            if (smp[n].ok < 0)
                return -1;
        }
    } else {
        for (double v = 0.25; v <= 2.0e4 && n < 400; v *= 1.25, n++) {
            smp[n].x = v;
            smp[n].ok = shoot(c, v, &smp[n].along, NULL);
            if (smp[n].ok < 0)
                return -1;
        }
    }
    /* Extra samples: refined local maxima and the edges of the region that reaches the plane. */
    size_t base = n;
    for (size_t i = 0; i + 1 < base && n < MAX_SAMPLES; i++) {
        if (smp[i].ok != smp[i + 1].ok) {
            smp[n++] = smp[i].ok ? find_edge(c, smp[i], smp[i + 1]) : find_edge(c, smp[i + 1], smp[i]);
            if (c->hard)
                return -1;
        }
        if (i > 0 && smp[i - 1].ok && smp[i].ok && smp[i + 1].ok && smp[i].along >= smp[i - 1].along &&
            smp[i].along >= smp[i + 1].along && n < MAX_SAMPLES) {
            refine_max(c, smp[i - 1].x, smp[i].x, smp[i + 1].x, smp[i].along, &smp[n]);
            if (c->hard)
                return -1;
            n++;
        }
    }
    qsort(smp, n, sizeof smp[0], cmp_sample);
    *best_along = -INFINITY;
    *best_x = NAN;
    c->min_along = INFINITY;
    for (size_t i = 0; i < n; i++) {
        if (smp[i].ok && smp[i].along > *best_along) {
            *best_along = smp[i].along;
            *best_x = smp[i].x;
        }
        if (smp[i].ok && smp[i].along < c->min_along)
            c->min_along = smp[i].along;
    }
    *nroots = 0;
    for (size_t i = 0; i + 1 < n && *nroots < DRAGARC_AIM_MAX_SOLUTIONS; i++) {
        if (!smp[i].ok || !smp[i + 1].ok || smp[i + 1].x <= smp[i].x)
            continue;
        double fa = smp[i].along - c->dist, fb = smp[i + 1].along - c->dist;
        double root = NAN;
        if (fa == 0.0)
            root = smp[i].x;
        else if (fa * fb < 0.0)
            root = refine_root(c, smp[i].x, smp[i + 1].x);
        if (c->hard)
            return -1;
        if (isfinite(root) && (*nroots == 0 || root - roots[*nroots - 1] > 1e-9)) {
            slopes[*nroots] = fb > fa ? 1 : -1;
            roots[(*nroots)++] = root;
        }
    }
    return 0;
}

/* Re-solve x on the same branch (slope sign) near x0 after the azimuth turned a little. */
static double resolve_near(aim_ctx *c, double x0, int slope)
{
    double f0 = miss_along(x0, c);
    if (!isfinite(f0))
        return NAN;
    if (f0 == 0.0)
        return x0;
    /* the root lies below x0 when f and the slope have the same sign */
    double dir = (f0 > 0) == (slope > 0) ? -1.0 : 1.0;
    double h = c->mode == DRAGARC_AIM_ELEVATION ? 1e-4 : 1e-4 * fmax(1.0, x0);
    for (int it = 0; it < 40; it++, h *= 2.0) {
        double x1 = x0 + dir * h;
        if (c->mode == DRAGARC_AIM_ELEVATION && fabs(x1) > 0.5 * DRAGARC_PI)
            return NAN;
        if (c->mode == DRAGARC_AIM_SPEED && x1 <= 0.0)
            return NAN;
        double f1 = miss_along(x1, c);
        if (!isfinite(f1))
            return NAN;
        if (f1 * f0 <= 0.0)
            return refine_root(c, fmin(x0, x1), fmax(x0, x1));
    }
    return NAN;
}

void dragarc_aim_request_default(dragarc_aim_request *r)
{
    r->range = 0.0;
    r->height = NAN;
    r->crossrange = 0.0;
    r->mode = DRAGARC_AIM_ELEVATION;
    r->solve_azimuth = -1;
    r->miss_tolerance = 1e-3;
}

static int has_wind(const dragarc_wind *w)
{
    if (w->model == DRAGARC_WIND_NONE)
        return 0;
    if (w->model != DRAGARC_WIND_LAYERED)
        return w->speed > 0.0;
    for (size_t i = 0; i < w->nlayers; i++)
        if (w->layers[i].speed > 0.0)
            return 1;
    return 0;
}

int dragarc_aim_solve(const dragarc_scenario *s, const dragarc_aim_request *req, dragarc_aim_result *out,
                      dragarc_error *err)
{
    memset(out, 0, sizeof *out);
    out->max_range = out->max_range_elevation = NAN;
    if (!(req->range > 0.0 && isfinite(req->range)))
        return dragarc_error_set(err, DRAGARC_EINVAL, "range", "the target range must be positive (got %g m)", req->range);
    if (!isfinite(req->crossrange))
        return dragarc_error_set(err, DRAGARC_EINVAL, "crossrange", "must be a finite distance in m");
    if (!(isnan(req->height) || isfinite(req->height)))
        return dragarc_error_set(err, DRAGARC_EINVAL, "height", "must be a finite height in m");
    if (!(req->miss_tolerance > 0.0 && req->miss_tolerance < 1e3))
        return dragarc_error_set(err, DRAGARC_EINVAL, "miss_tolerance", "must be positive (got %g m)", req->miss_tolerance);
    aim_ctx c;
    memset(&c, 0, sizeof c);
    c.s = *s;
    c.mode = req->mode;
    if (!isnan(req->height))
        c.s.ground_elevation = req->height;
    if (req->mode == DRAGARC_AIM_ELEVATION && !(s->launch.speed > 0.0))
        return dragarc_error_set(err, DRAGARC_EINVAL, "launch.speed", "is 0: there is nothing to aim (give a speed)");
    /* Check the scenario once with a launch that certainly climbs, so that input errors are not mistaken
     * for "out of reach" later. */
    {
        dragarc_scenario probe = c.s;
        probe.launch.elevation = 45.0 * DRAGARC_DEG;
        if (probe.launch.speed <= 0.0)
            probe.launch.speed = 1.0;
        int rc = dragarc_scenario_check(&probe, err);
        if (rc != DRAGARC_OK)
            return rc;
    }
    double psi0 = s->launch.azimuth;
    c.tx = req->range * sin(psi0) + req->crossrange * cos(psi0);
    c.ty = req->range * cos(psi0) - req->crossrange * sin(psi0);
    c.dist = hypot(req->range, req->crossrange);
    const double target_dist = c.dist;
    int turn = req->solve_azimuth > 0 || (req->solve_azimuth < 0 && (req->crossrange != 0.0 || has_wind(&s->wind)));
    double bearing_t = atan2(c.tx, c.ty);
    /* Without turning, the miss is measured along the nominal line; turning starts from the target's bearing. */
    c.psi = turn ? bearing_t : psi0;
    c.ux = sin(c.psi);
    c.uy = cos(c.psi);
    if (!turn)
        c.dist = req->range;

    double roots[DRAGARC_AIM_MAX_SOLUTIONS];
    int slopes[DRAGARC_AIM_MAX_SOLUTIONS];
    size_t nroots = 0;
    double best_x, best_along;
    if (solve_1d(&c, roots, slopes, &nroots, &best_x, &best_along) < 0)
        goto hard;
    if (req->mode == DRAGARC_AIM_ELEVATION && isfinite(best_along)) {
        out->max_range = best_along;
        out->max_range_elevation = best_x;
    }
    if (nroots == 0) {
        out->flights = c.flights;
        if (req->mode == DRAGARC_AIM_ELEVATION) {
            if (!isfinite(best_along))
                return dragarc_error_set(err, DRAGARC_ENOSOLUTION, "height",
                                         "no launch at %g m/s comes down onto the target plane at %g m", s->launch.speed,
                                         c.s.ground_elevation);
            if (c.dist < c.min_along)
                return dragarc_error_set(err, DRAGARC_ENOSOLUTION, "range",
                                         "the target at %g m is closer than any launch at %g m/s lands: the shortest "
                                         "range is %.6g m (the maximum %.6g m)",
                                         c.dist, s->launch.speed, c.min_along, best_along);
            return dragarc_error_set(err, DRAGARC_ENOSOLUTION, "range",
                                     "the target at %g m is out of reach: the maximum range at %g m/s is %.6g m, at "
                                     "%.4g degrees elevation",
                                     c.dist, s->launch.speed, best_along, best_x / DRAGARC_DEG);
        }
        return dragarc_error_set(err, DRAGARC_ENOSOLUTION, "range",
                                 "no launch speed up to 20000 m/s at %.4g degrees elevation reaches the target at %g m",
                                 s->launch.elevation / DRAGARC_DEG, c.dist);
    }

    for (size_t j = 0; j < nroots; j++) {
        double x = roots[j];
        /* Aim point A: the launch is pointed at A (azimuth = bearing of A) and x solved so that the impact
         * lies |A| along that line; A is then moved by the miss, A += T - P, until P = T. Drift that
         * changes little with the aim makes this contract fast (one step in still air); when a step makes
         * the miss worse it is halved. */
        double ax = c.tx, ay = c.ty, gain = 1.0, last_miss = INFINITY;
        double prev_ax = ax, prev_ay = ay, prev_px = 0.0, prev_py = 0.0;
        dragarc_flight f;
        double along, best_miss = INFINITY;
        dragarc_aim_solution *sol = &out->solutions[out->nsolutions];
        for (int it = 0; it < MAX_TURNS; it++) {
            if (turn) {
                c.psi = atan2(ax, ay);
                c.dist = hypot(ax, ay);
                c.ux = sin(c.psi);
                c.uy = cos(c.psi);
                if (it > 0) {
                    double xn = resolve_near(&c, x, slopes[j]);
                    if (!isfinite(xn) && !c.hard) {
                        /* The local search lost the branch (close to the maximum range): solve afresh at
                         * this aim and keep the root of the same branch nearest the last one. */
                        double r2[DRAGARC_AIM_MAX_SOLUTIONS], bx, ba;
                        int s2[DRAGARC_AIM_MAX_SOLUTIONS];
                        size_t n2 = 0;
                        if (solve_1d(&c, r2, s2, &n2, &bx, &ba) < 0)
                            break;
                        for (size_t k = 0; k < n2; k++)
                            if (s2[k] == slopes[j] && (!isfinite(xn) || fabs(r2[k] - x) < fabs(xn - x)))
                                xn = r2[k];
                    }
                    if (!isfinite(xn))
                        break;
                    x = xn;
                }
            }
            if (shoot(&c, x, &along, &f) != 1)
                break;
            double miss = turn ? hypot(f.impact[0] - c.tx, f.impact[1] - c.ty) : fabs(along - c.dist);
            if (miss < best_miss) {
                best_miss = miss;
                sol->elevation = c.s.launch.elevation;
                sol->speed = c.s.launch.speed;
                sol->azimuth = c.psi;
                sol->azimuth_correction = remainder(c.psi - psi0, 2.0 * DRAGARC_PI);
                sol->time_of_flight = f.time_of_flight;
                sol->apex_height = f.apex_height;
                sol->impact_speed = f.impact_speed;
                sol->impact_angle = f.impact_angle;
                sol->impact_energy = f.impact_energy;
                sol->miss = hypot(f.impact[0] - c.tx, f.impact[1] - c.ty);
                sol->notes = f.notes;
            }
            double px = f.impact[0], py = f.impact[1];
            dragarc_flight_clear(&f);
            /* Well inside the tolerance (1/1000 of it), or no azimuth to turn: done. */
            if (!turn || miss <= 1e-3 * req->miss_tolerance)
                break;
            if (miss > last_miss) { /* overshot: take half the step from the last good aim point */
                gain *= 0.5;
                ax = prev_ax + gain * (c.tx - prev_px);
                ay = prev_ay + gain * (c.ty - prev_py);
                continue;
            }
            last_miss = miss;
            prev_ax = ax;
            prev_ay = ay;
            prev_px = px;
            prev_py = py;
            ax += gain * (c.tx - px);
            ay += gain * (c.ty - py);
            gain = fmin(1.0, 2.0 * gain); /* a good step earns the full step back */
        }
        int converged = best_miss <= req->miss_tolerance;
        if (c.hard)
            goto hard;
        if (!converged)
            continue;
        /* the same launch reached from two brackets is one solution */
        int dup = 0;
        for (size_t k = 0; k < out->nsolutions; k++) {
            const dragarc_aim_solution *o = &out->solutions[k];
            if (fabs(o->elevation - out->solutions[out->nsolutions].elevation) < 1e-7 &&
                fabs(o->speed - out->solutions[out->nsolutions].speed) < 1e-7 * fmax(1.0, o->speed) &&
                fabs(remainder(o->azimuth - out->solutions[out->nsolutions].azimuth, 2.0 * DRAGARC_PI)) < 1e-7)
                dup = 1;
        }
        if (!dup)
            out->nsolutions++;
    }
    out->flights = c.flights;
    if (out->nsolutions == 0)
        return dragarc_error_set(err, DRAGARC_ENOSOLUTION, "range",
                                 "the target at %g m is at the edge of reach: the maximum range along the line is "
                                 "%.6g m, but no launch turned to correct the drift lands within %g m of the target",
                                 target_dist, out->max_range, req->miss_tolerance);
    /* order by elevation (then speed), lowest first */
    for (size_t a = 1; a < out->nsolutions; a++)
        for (size_t b = a; b > 0; b--) {
            dragarc_aim_solution *p = &out->solutions[b - 1], *q = &out->solutions[b];
            if (q->elevation < p->elevation || (q->elevation == p->elevation && q->speed < p->speed)) {
                dragarc_aim_solution t = *p;
                *p = *q;
                *q = t;
            }
        }
    return DRAGARC_OK;
hard:
    out->flights = c.flights;
    if (err)
        *err = c.err;
    return c.err.code ? c.err.code : DRAGARC_ESOLVER;
}

int dragarc_aim_solution_fly(const dragarc_scenario *s, const dragarc_aim_request *req, const dragarc_aim_solution *sol,
                             double dt, dragarc_flight *f, dragarc_error *err)
{
    dragarc_scenario t = *s; /* shallow: only scalars change, the tables stay shared and read-only */
    if (!isnan(req->height))
        t.ground_elevation = req->height;
    t.ground_surface_given = 0;
    t.launch.elevation = sol->elevation;
    t.launch.azimuth = sol->azimuth;
    t.launch.speed = sol->speed;
    return dragarc_flight_run(&t, dt, f, err);
}

int dragarc_aim_table(const dragarc_scenario *s, const dragarc_aim_request *req, const double *ranges, size_t n,
                      dragarc_aim_table_row *rows, dragarc_error *err)
{
    /* One check up front, so that a bad scenario is one error and not n failed rows. */
    dragarc_aim_request probe = *req;
    probe.range = 1.0;
    if (!(probe.miss_tolerance > 0.0))
        return dragarc_error_set(err, DRAGARC_EINVAL, "miss_tolerance", "must be positive");
    if (req->mode == DRAGARC_AIM_ELEVATION && !(s->launch.speed > 0.0))
        return dragarc_error_set(err, DRAGARC_EINVAL, "launch.speed", "is 0: there is nothing to aim (give a speed)");
    {
        dragarc_scenario t = *s;
        t.launch.elevation = 45.0 * DRAGARC_DEG;
        if (t.launch.speed <= 0.0)
            t.launch.speed = 1.0;
        if (!isnan(req->height))
            t.ground_elevation = req->height;
        int rc = dragarc_scenario_check(&t, err);
        if (rc != DRAGARC_OK)
            return rc;
    }
    for (size_t i = 0; i < n; i++)
        if (!(ranges[i] > 0.0 && isfinite(ranges[i])))
            return dragarc_error_set(err, DRAGARC_EINVAL, "ranges", "every target range must be positive (got %g m)",
                                     ranges[i]);
    long count = (long)n;
#pragma omp parallel for schedule(dynamic)
    for (long i = 0; i < count; i++) {
        dragarc_aim_table_row *row = &rows[i];
        dragarc_aim_request q = *req;
        q.range = ranges[i];
        dragarc_aim_result r;
        dragarc_error e;
        memset(row, 0, sizeof *row);
        row->range = ranges[i];
        row->status = dragarc_aim_solve(s, &q, &r, &e);
        row->max_range = r.max_range;
        row->max_range_elevation = r.max_range_elevation;
        dragarc_aim_solution none = {.elevation = NAN, .azimuth = NAN, .azimuth_correction = NAN, .speed = NAN,
                                     .time_of_flight = NAN, .apex_height = NAN, .impact_speed = NAN,
                                     .impact_angle = NAN, .impact_energy = NAN, .miss = NAN, .notes = 0};
        row->low = row->high = none;
        if (row->status != DRAGARC_OK) {
            snprintf(row->message, sizeof row->message, "%s%s%s", e.field, e.field[0] ? ": " : "", e.message);
            continue;
        }
        row->nsolutions = r.nsolutions;
        row->low = r.solutions[0];
        if (r.nsolutions > 1)
            row->high = r.solutions[r.nsolutions - 1];
    }
    return DRAGARC_OK;
}
