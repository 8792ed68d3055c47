/* flight.c: the integrator driver. Flies a scenario from launch to ground impact with SUNDIALS CVODE.
 * SPDX-License-Identifier: GPL-3.0-or-later
 *
 * Methods (Hindmarsh et al. 2005, "SUNDIALS: Suite of nonlinear and differential/algebraic equation
 * solvers", ACM TOMS 31:363): variable-order Adams-Moulton with fixed-point iteration for non-stiff
 * flights, BDF with Newton iteration and a dense difference-quotient Jacobian when drag relaxes the
 * velocity much faster than the flight lasts (fine droplets, light debris on a long fall).
 * Events by CVODE's root finding: g0 = z - z_ground (impact, descending), g1 = vz (apex, descending),
 * g2 = z - z_top (leaving the top of the atmosphere model, ascending: an error).
 * The integrator runs one step at a time; fixed-interval samples come from CVODE's dense output
 * (CVodeGetDky), so sampling does not shorten the steps.
 */
#include <math.h>
#include <stdio.h>
#include <stdlib.h>
#include <string.h>

#include <cvode/cvode.h>
#include <gsl/gsl_errno.h>
#include <gsl/gsl_odeiv2.h>
#include <nvector/nvector_serial.h>
#include <sundials/sundials_context.h>
#include <sunlinsol/sunlinsol_dense.h>
#include <sunmatrix/sunmatrix_dense.h>
#include <sunnonlinsol/sunnonlinsol_fixedpoint.h>
#include <sunnonlinsol/sunnonlinsol_newton.h>

#include "core/constants.h"
#include "dragarc/flight.h"
#include "dragarc/forces.h"

/* Most samples one flight may keep (80 bytes each): beyond this the sampling interval is unreasonable. */
#define MAX_SAMPLES 2000000

/* Flights whose estimated duration exceeds this many drag relaxation times go to BDF. An explicit method
 * needs steps of about a relaxation time for stability, so its cost grows with the ratio while BDF's does
 * not. Measured on water drops falling 1 m in a 2 m/s wind (rtol 1e-8): ratio ~160 (100 um), rk8pd 71 us
 * against BDF 375 us; ratio ~1900 (50 um), rk8pd 573 us against BDF 385 us; the costs cross near 1000. */
#define STIFF_RATIO 1000.0

typedef struct flight_ctx {
    dragarc_forces forces;
    double ceiling;        /* m, local height where the atmosphere model ends (INFINITY if it does not) */
    dragarc_error rhs_err; /* first failure seen inside the right-hand side */
    int rhs_failed;
    char cvode_msg[256];   /* last message from CVODE's error handler */
} flight_ctx;

static int rhs(sunrealtype t, N_Vector y, N_Vector ydot, void *user)
{
    (void)t;
    flight_ctx *c = user;
    const double *yv = N_VGetArrayPointer(y);
    double *dv = N_VGetArrayPointer(ydot);
    dragarc_error e;
    /* Trial states of a step may poke above the top of the atmosphere model; they see the air at the
     * top (continuous, and all but vacuum there), while the root function g2 stops a flight that
     * really climbs past it. */
    double ys[6] = {yv[0], yv[1], fmin(yv[2], c->ceiling), yv[3], yv[4], yv[5]};
    int rc = dragarc_forces_eval(&c->forces, ys, dv, NULL, &e);
    if (rc != DRAGARC_OK) {
        if (!c->rhs_failed) {
            c->rhs_err = e;
            c->rhs_failed = 1;
        }
        return -1;
    }
    for (int i = 0; i < 6; i++)
        if (!isfinite(dv[i])) {
            if (!c->rhs_failed) {
                dragarc_error_set(&c->rhs_err, DRAGARC_ESOLVER, "", "the equations of motion gave a non-finite value");
                c->rhs_failed = 1;
            }
            return 1;
        }
    return 0;
}

static int roots(sunrealtype t, N_Vector y, sunrealtype *g, void *user)
{
    (void)t;
    const flight_ctx *c = user;
    const double *yv = N_VGetArrayPointer(y);
    g[0] = yv[2] - c->forces.ground_elevation;
    g[1] = yv[5];
    g[2] = isfinite(c->ceiling) ? yv[2] - c->ceiling : -1.0;
    return 0;
}

static void on_cvode_error(int code, const char *module, const char *function, char *msg, void *user)
{
    (void)code;
    flight_ctx *c = user;
    snprintf(c->cvode_msg, sizeof c->cvode_msg, "%s/%s: %s", module, function, msg);
}

const char *dragarc_method_name(dragarc_method m)
{
    switch (m) {
    case DRAGARC_METHOD_ADAMS: return "adams";
    case DRAGARC_METHOD_BDF: return "bdf";
    case DRAGARC_METHOD_RK8PD: return "rk8pd";
    default: return "auto";
    }
}

void dragarc_flight_clear(dragarc_flight *f)
{
    if (!f)
        return;
    free(f->points);
    memset(f, 0, sizeof *f);
}

static void launch_state(const dragarc_scenario *s, double y[6])
{
    const dragarc_launch *l = &s->launch;
    double ch = cos(l->elevation);
    y[0] = 0.0;
    y[1] = 0.0;
    y[2] = l->height;
    y[3] = l->speed * ch * sin(l->azimuth);
    y[4] = l->speed * ch * cos(l->azimuth);
    y[5] = l->speed * sin(l->elevation);
}

/* Time to fall from the launch to the ground in vacuum; NaN if it never gets there. */
static double vacuum_time(const dragarc_scenario *s)
{
    double y[6];
    launch_state(s, y);
    double dz = y[2] - s->ground_elevation, g = s->gravity;
    double disc = y[5] * y[5] + 2.0 * g * dz;
    if (disc < 0.0)
        return NAN;
    return (y[5] + sqrt(disc)) / g;
}

double dragarc_vacuum_range(const dragarc_scenario *s)
{
    double t = vacuum_time(s);
    return s->launch.speed * cos(s->launch.elevation) * t;
}

static int push_point(dragarc_flight *f, size_t *cap, const flight_ctx *c, double t, const double *y)
{
    if (f->npoints == *cap) {
        size_t nc = *cap ? 2 * *cap : 64;
        dragarc_flight_point *np = realloc(f->points, nc * sizeof *np);
        if (!np)
            return DRAGARC_ENOMEM;
        f->points = np;
        *cap = nc;
    }
    dragarc_flight_point *p = &f->points[f->npoints++];
    double d[6];
    dragarc_flow flow;
    p->t = t;
    for (int i = 0; i < 3; i++) {
        p->pos[i] = y[i];
        p->vel[i] = y[i + 3];
    }
    p->speed = sqrt(y[3] * y[3] + y[4] * y[4] + y[5] * y[5]);
    if (dragarc_forces_eval(&c->forces, y, d, &flow, NULL) == DRAGARC_OK) {
        p->mach = flow.mach;
        p->reynolds = flow.reynolds;
    } else {
        p->mach = p->reynolds = NAN;
    }
    return DRAGARC_OK;
}

/* Record what the cautions need to know about the state reached by an accepted step. */
static void observe(dragarc_flight *f, const flight_ctx *c, const double *y)
{
    double d[6];
    dragarc_flow flow;
    if (dragarc_forces_eval(&c->forces, y, d, &flow, NULL) != DRAGARC_OK)
        return;
    const dragarc_drag *dr = &c->forces.projectile->drag;
    if (flow.mach > f->max_mach)
        f->max_mach = flow.mach;
    if (flow.reynolds > f->max_reynolds)
        f->max_reynolds = flow.reynolds;
    if (flow.mach > 0.6 && !(dr->model == DRAGARC_DRAG_TABLE && dr->axis == DRAGARC_AXIS_MACH) &&
        dr->model != DRAGARC_DRAG_NONE)
        f->notes |= DRAGARC_NOTE_TRANSONIC;
    if (dr->model == DRAGARC_DRAG_SPHERE && flow.reynolds > 2e5 && flow.reynolds < 1e6)
        f->notes |= DRAGARC_NOTE_DRAG_CRISIS;
    if (dr->model == DRAGARC_DRAG_TABLE && flow.air.density > 0.0) {
        double x = dr->axis == DRAGARC_AXIS_REYNOLDS ? flow.reynolds : dr->axis == DRAGARC_AXIS_MACH ? flow.mach : flow.airspeed;
        /* Launch from rest and the last instants near zero airspeed always read below the table;
         * only note a clamp when the body actually moves through the air. */
        if ((x < dr->x[0] && flow.airspeed > 0.5) || x > dr->x[dr->npoints - 1])
            f->notes |= DRAGARC_NOTE_TABLE_CLAMPED;
    }
}

static int cvode_failure(flight_ctx *c, int flag, double t, dragarc_error *err)
{
    if (c->rhs_failed && (flag == CV_RHSFUNC_FAIL || flag == CV_REPTD_RHSFUNC_ERR || flag == CV_FIRST_RHSFUNC_ERR ||
                          flag == CV_UNREC_RHSFUNC_ERR || flag == CV_CONV_FAILURE || flag == CV_ERR_FAILURE)) {
        return dragarc_error_set(err, c->rhs_err.code == DRAGARC_ERANGE ? DRAGARC_ERANGE : DRAGARC_ESOLVER,
                                 c->rhs_err.field, "at t = %.6g s: %s", t, c->rhs_err.message);
    }
    char *name = CVodeGetReturnFlagName(flag);
    int rc = dragarc_error_set(err, DRAGARC_ESOLVER, "", "CVode: %s at t = %.6g s%s%s", name ? name : "unknown flag", t,
                               c->cvode_msg[0] ? " (" : "", c->cvode_msg[0] ? ")" : "");
    if (err && c->cvode_msg[0]) {
        /* Put CVODE's own words inside the brackets, trimmed to fit. */
        size_t len = strlen(err->message);
        if (len >= 1) {
            err->message[len - 1] = '\0';
            strncat(err->message, c->cvode_msg, sizeof err->message - strlen(err->message) - 2);
            strcat(err->message, ")");
        }
    }
    free(name);
    return rc;
}

/* The errors both integrators report in the same words. */
static int err_left_atmosphere(dragarc_error *err, double t)
{
    return dragarc_error_set(err, DRAGARC_ERANGE, "environment.atmosphere",
                             "at t = %.6g s the flight climbs above %g m altitude, the top of the U.S. Standard "
                             "Atmosphere 1976 model",
                             t, DRAGARC_ISA_Z_MAX);
}

static int err_peaks_below(dragarc_error *err, double z_apex, double z_ground)
{
    return dragarc_error_set(err, DRAGARC_ENOLAND, "ground.elevation",
                             "the flight peaks at %.6g m, below the ground plane at %g m, so it never comes down "
                             "onto it",
                             z_apex, z_ground);
}

static int err_no_impact(dragarc_error *err, const dragarc_scenario *s, double z)
{
    return dragarc_error_set(err, DRAGARC_ENOLAND, "solver.max_time",
                             "no ground impact within %g s (height %.6g m, still %.6g m above the ground); raise "
                             "solver.max_time or check buoyancy and wind",
                             s->solver.max_time, z, z - s->ground_elevation);
}

/* Integrate with CVODE from y0 to impact, filling samples, apex, notes and steps; impact state in out->impact,
 * impact time in *t_end. */
static int integrate_cvode(const dragarc_scenario *s, flight_ctx *cx, dragarc_method method, double dt,
                           const double y0[6], dragarc_flight *out, size_t *cap_, double *t_end, dragarc_error *err)
{
    int rc = DRAGARC_OK;
    SUNContext sun = NULL;
    N_Vector y = NULL, ytmp = NULL;
    SUNMatrix A = NULL;
    SUNLinearSolver LS = NULL;
    SUNNonlinearSolver NLS = NULL;
    void *mem = NULL;

    if (SUNContext_Create(NULL, &sun) != 0) {
        rc = dragarc_error_set(err, DRAGARC_ENOMEM, "", "could not create a SUNDIALS context");
        goto done;
    }
    y = N_VNew_Serial(6, sun);
    ytmp = N_VNew_Serial(6, sun);
    mem = CVodeCreate(method == DRAGARC_METHOD_BDF ? CV_BDF : CV_ADAMS, sun);
    if (!y || !ytmp || !mem) {
        rc = dragarc_error_set(err, DRAGARC_ENOMEM, "", "could not allocate the integrator");
        goto done;
    }
    memcpy(N_VGetArrayPointer(y), y0, 6 * sizeof *y0);
    int flag = CVodeSetErrHandlerFn(mem, on_cvode_error, cx);
    if (flag == CV_SUCCESS)
        flag = CVodeInit(mem, rhs, 0.0, y);
    if (flag == CV_SUCCESS)
        flag = CVodeSetUserData(mem, cx);
    if (flag == CV_SUCCESS)
        flag = CVodeSStolerances(mem, s->solver.rtol, s->solver.atol);
    if (flag == CV_SUCCESS)
        flag = CVodeSetStopTime(mem, s->solver.max_time);
    if (flag == CV_SUCCESS)
        flag = CVodeSetMaxNumSteps(mem, s->solver.max_steps);
    if (flag == CV_SUCCESS)
        flag = CVodeRootInit(mem, 3, roots);
    int dirs[3] = {-1, -1, +1};
    if (flag == CV_SUCCESS)
        flag = CVodeSetRootDirection(mem, dirs);
    if (flag == CV_SUCCESS)
        flag = CVodeSetNoInactiveRootWarn(mem);
    if (flag == CV_SUCCESS) {
        if (method == DRAGARC_METHOD_BDF) {
            A = SUNDenseMatrix(6, 6, sun);
            LS = A ? SUNLinSol_Dense(y, A, sun) : NULL;
            flag = LS ? CVodeSetLinearSolver(mem, LS, A) : CV_MEM_FAIL;
        } else {
            NLS = SUNNonlinSol_FixedPoint(y, 0, sun);
            flag = NLS ? CVodeSetNonlinearSolver(mem, NLS) : CV_MEM_FAIL;
        }
    }
    if (flag != CV_SUCCESS) {
        rc = cvode_failure(cx, flag, 0.0, err);
        goto done;
    }

    if ((rc = push_point(out, cap_, cx, 0.0, y0)) != DRAGARC_OK)
        goto nomem;
    observe(out, cx, y0);
    out->apex_height = y0[2];
    out->apex_time = 0.0;

    long k = 1; /* index of the next sample */
    double t = 0.0;
    int landed = 0;
    while (!landed) {
        flag = CVode(mem, s->solver.max_time, y, &t, CV_ONE_STEP);
        if (flag < 0) {
            rc = cvode_failure(cx, flag, t, err);
            goto done;
        }
        cx->rhs_failed = 0; /* a recovered trial failure is not an error */
        /* In one-step mode CVODE's own step limit counts per call, so the total is checked here. */
        long nsteps = 0;
        CVodeGetNumSteps(mem, &nsteps);
        if (nsteps > s->solver.max_steps) {
            rc = dragarc_error_set(err, DRAGARC_ESOLVER, "solver.max_steps",
                                   "CVode: CV_TOO_MUCH_WORK: more than %ld steps by t = %.6g s; raise "
                                   "solver.max_steps or loosen solver.rtol",
                                   s->solver.max_steps, t);
            goto done;
        }
        const double *yv = N_VGetArrayPointer(y);
        while (dt > 0.0 && k * dt < t) {
            double ts = k * dt;
            if (out->npoints >= MAX_SAMPLES) {
                rc = dragarc_error_set(err, DRAGARC_EINVAL, "dt",
                                       "a sampling interval of %g s gives more than %d rows over this flight; "
                                       "use a larger interval",
                                       dt, MAX_SAMPLES);
                goto done;
            }
            if (CVodeGetDky(mem, ts, 0, ytmp) != CV_SUCCESS)
                break;
            if ((rc = push_point(out, cap_, cx, ts, N_VGetArrayPointer(ytmp))) != DRAGARC_OK)
                goto nomem;
            k++;
        }
        observe(out, cx, yv);
        if (flag == CV_ROOT_RETURN) {
            int found[3] = {0, 0, 0};
            CVodeGetRootInfo(mem, found);
            if (found[2]) {
                rc = err_left_atmosphere(err, t);
                goto done;
            }
            if (found[1] && yv[2] > out->apex_height) {
                out->apex_height = yv[2];
                out->apex_time = t;
            }
            if (found[1] && yv[2] < s->ground_elevation) {
                rc = err_peaks_below(err, yv[2], s->ground_elevation);
                goto done;
            }
            if (found[0])
                landed = 1;
        } else if (flag == CV_TSTOP_RETURN || t >= s->solver.max_time) {
            rc = err_no_impact(err, s, yv[2]);
            goto done;
        }
        if (!landed && yv[2] > out->apex_height) { /* a flight that climbs to the end of a step */
            out->apex_height = yv[2];
            out->apex_time = t;
        }
    }

    const double *yi = N_VGetArrayPointer(y);
    memcpy(out->impact, yi, sizeof out->impact);
    out->impact[2] = s->ground_elevation; /* the root finder leaves |z - z_g| at round-off level */
    if ((rc = push_point(out, cap_, cx, t, out->impact)) != DRAGARC_OK)
        goto nomem;
    CVodeGetNumSteps(mem, &out->steps);

    *t_end = t;
    rc = DRAGARC_OK;
    goto done;
nomem:
    rc = dragarc_error_set(err, DRAGARC_ENOMEM, "", "out of memory for trajectory samples");
done:
    if (mem)
        CVodeFree(&mem);
    if (NLS)
        SUNNonlinSolFree(NLS);
    if (LS)
        SUNLinSolFree(LS);
    if (A)
        SUNMatDestroy(A);
    if (y)
        N_VDestroy(y);
    if (ytmp)
        N_VDestroy(ytmp);
    if (sun)
        SUNContext_Free(&sun);
    return rc;
}

/* ---- the explicit path: GSL odeiv2 rk8pd with events located inside the step ---------------------- */

/* Right-hand side in GSL's form; the same clamp at the top of the atmosphere as for CVODE. */
static int rk_rhs(double t, const double y[], double dydt[], void *user)
{
    (void)t;
    flight_ctx *c = user;
    double ys[6] = {y[0], y[1], fmin(y[2], c->ceiling), y[3], y[4], y[5]};
    dragarc_error e;
    if (dragarc_forces_eval(&c->forces, ys, dydt, NULL, &e) != DRAGARC_OK) {
        if (!c->rhs_failed)
            c->rhs_err = e;
        c->rhs_failed = 1;
        return GSL_EBADFUNC;
    }
    for (int i = 0; i < 6; i++)
        if (!isfinite(dydt[i])) {
            if (!c->rhs_failed)
                dragarc_error_set(&c->rhs_err, DRAGARC_ESOLVER, "", "the equations of motion gave a non-finite value");
            c->rhs_failed = 1;
            return GSL_EBADFUNC;
        }
    return GSL_SUCCESS;
}

/* The state at t0 + tau from (t0, y0) by one rk8pd step of size tau (tau no longer than the step the error
 * control accepted, so the eighth-order step is at least as accurate). */
static int rk_partial(gsl_odeiv2_step *st, const gsl_odeiv2_system *sys, double t0, const double y0[6], double tau,
                      double y[6])
{
    double yerr[6];
    memcpy(y, y0, 6 * sizeof *y);
    if (tau == 0.0)
        return GSL_SUCCESS;
    gsl_odeiv2_step_reset(st);
    return gsl_odeiv2_step_apply(st, t0, tau, y, yerr, NULL, NULL, sys);
}

/* The time in (ta, t1] where g = sign (y[k] - level) falls through zero, by the Illinois variant of regula
 * falsi (Dowell & Jarratt 1971, BIT 11:168) on states from rk_partial out of (t0, y0), the start of the step;
 * ystar gets the state there. g(ta) > 0 >= g(t1) on entry. */
static int rk_locate(gsl_odeiv2_step *st, const gsl_odeiv2_system *sys, double t0, const double y0[6], double ta,
                     const double ya[6], double t1, const double y1[6], int k, double level, double sign,
                     double *tstar, double ystar[6])
{
    double a = ta, b = t1, fa = sign * (ya[k] - level), fb = sign * (y1[k] - level);
    memcpy(ystar, y1, 6 * sizeof *ystar);
    *tstar = t1;
    /* Close enough when g is within 1e-12 of its change over the bracket: the crossing time is then known to
     * about 1e-12 of the step, far inside the integration's own accuracy. */
    const double gtol = 1e-12 * (fabs(fa) + fabs(fb));
    int side = 0;
    for (int it = 0; it < 100 && b - a > 1e-13 * fmax(1.0, fabs(b)); it++) {
        double m = b - fb * (b - a) / (fb - fa);
        if (!(m > a && m < b))
            m = 0.5 * (a + b);
        double ym[6];
        if (rk_partial(st, sys, t0, y0, m - t0, ym) != GSL_SUCCESS)
            return -1;
        double fm = sign * (ym[k] - level);
        if (fabs(fm) <= gtol) {
            memcpy(ystar, ym, 6 * sizeof *ystar);
            *tstar = m;
            break;
        }
        if (fm > 0.0) {
            a = m, fa = fm;
            if (side == -1)
                fb *= 0.5;
            side = -1;
        } else {
            b = m, fb = fm;
            memcpy(ystar, ym, 6 * sizeof *ystar);
            *tstar = m;
            if (side == 1)
                fa *= 0.5;
            side = 1;
            if (fm == 0.0)
                break;
        }
    }
    return 0;
}

/* Integrate with rk8pd (Prince & Dormand 1981, J. Comput. Appl. Math. 7:67; GSL odeiv2) under GSL's
 * standard error control (|err_i| <= atol + rtol |y_i|), one accepted step at a time. Events are found
 * inside the step that contains them by regula falsi on partial steps from its start; samples likewise. */
static int integrate_rk(const dragarc_scenario *s, flight_ctx *cx, double dt, const double y0[6],
                        dragarc_flight *out, size_t *cap, double *t_end, dragarc_error *err)
{
    gsl_odeiv2_system sys = {rk_rhs, NULL, 6, cx};
    gsl_odeiv2_step *step = gsl_odeiv2_step_alloc(gsl_odeiv2_step_rk8pd, 6);
    gsl_odeiv2_step *part = gsl_odeiv2_step_alloc(gsl_odeiv2_step_rk8pd, 6);
    gsl_odeiv2_control *con = gsl_odeiv2_control_standard_new(s->solver.atol, s->solver.rtol, 1.0, 0.0);
    gsl_odeiv2_evolve *ev = gsl_odeiv2_evolve_alloc(6);
    int rc = DRAGARC_OK;
    if (!step || !part || !con || !ev) {
        rc = dragarc_error_set(err, DRAGARC_ENOMEM, "", "could not allocate the integrator");
        goto done;
    }
    double y[6], yprev[6], ytmp[6];
    memcpy(y, y0, sizeof y);
    double t = 0.0, h = 1e-3;
    if ((rc = push_point(out, cap, cx, 0.0, y)) != DRAGARC_OK)
        goto done;
    observe(out, cx, y);
    out->apex_height = y[2];
    out->apex_time = 0.0;
    long k = 1;
    for (;;) {
        double tprev = t;
        memcpy(yprev, y, sizeof y);
        int st = gsl_odeiv2_evolve_apply(ev, con, step, &sys, &t, s->solver.max_time, &h, y);
        if (st != GSL_SUCCESS) {
            if (cx->rhs_failed)
                rc = dragarc_error_set(err, cx->rhs_err.code == DRAGARC_ERANGE ? DRAGARC_ERANGE : DRAGARC_ESOLVER,
                                       cx->rhs_err.field, "at t = %.6g s: %s", t, cx->rhs_err.message);
            else
                rc = dragarc_error_set(err, DRAGARC_ESOLVER, "", "GSL odeiv2 rk8pd: %s at t = %.6g s", gsl_strerror(st), t);
            goto done;
        }
        out->steps++;
        if (out->steps > s->solver.max_steps) {
            rc = dragarc_error_set(err, DRAGARC_ESOLVER, "solver.max_steps",
                                   "GSL odeiv2 rk8pd: more than %ld steps by t = %.6g s; raise solver.max_steps or "
                                   "loosen solver.rtol",
                                   s->solver.max_steps, t);
            goto done;
        }
        /* Events inside this step, in time order: leaving the atmosphere, the apex, the impact. */
        double t_top = INFINITY, t_apex = INFINITY, t_hit = INFINITY;
        double y_apex[6], y_hit[6], y_top[6];
        const double zg = s->ground_elevation;
        if (isfinite(cx->ceiling) && y[2] > cx->ceiling && yprev[2] <= cx->ceiling &&
            rk_locate(part, &sys, tprev, yprev, tprev, yprev, t, y, 2, cx->ceiling, -1.0, &t_top, y_top) != 0)
            goto partial_failed;
        if (yprev[5] > 0.0 && y[5] <= 0.0 &&
            rk_locate(part, &sys, tprev, yprev, tprev, yprev, t, y, 5, 0.0, 1.0, &t_apex, y_apex) != 0)
            goto partial_failed;
        /* The descent through the ground plane: from the apex when the step holds one (a long step may climb
         * from the plane, or from below it, and come back down through it), else from the step's start. */
        {
            double ta = isfinite(t_apex) ? t_apex : tprev;
            const double *ya = isfinite(t_apex) ? y_apex : yprev;
            if (ya[2] > zg && y[2] <= zg &&
                rk_locate(part, &sys, tprev, yprev, ta, ya, t, y, 2, zg, 1.0, &t_hit, y_hit) != 0)
                goto partial_failed;
        }
        double t_stop = fmin(t, fmin(t_hit, t_top));
        while (dt > 0.0 && k * dt < t_stop) {
            if (out->npoints >= MAX_SAMPLES) {
                rc = dragarc_error_set(err, DRAGARC_EINVAL, "dt",
                                       "a sampling interval of %g s gives more than %d rows over this flight; use a "
                                       "larger interval",
                                       dt, MAX_SAMPLES);
                goto done;
            }
            if (rk_partial(part, &sys, tprev, yprev, k * dt - tprev, ytmp) != GSL_SUCCESS)
                goto partial_failed;
            if ((rc = push_point(out, cap, cx, k * dt, ytmp)) != DRAGARC_OK)
                goto done;
            k++;
        }
        if (isfinite(t_top) && t_top <= fmin(t_hit, t_apex)) {
            rc = err_left_atmosphere(err, t_top);
            goto done;
        }
        if (t_apex < t_hit) {
            if (y_apex[2] > out->apex_height) {
                out->apex_height = y_apex[2];
                out->apex_time = t_apex;
            }
            if (y_apex[2] < s->ground_elevation) {
                rc = err_peaks_below(err, y_apex[2], s->ground_elevation);
                goto done;
            }
        }
        if (isfinite(t_hit)) {
            observe(out, cx, y_hit);
            memcpy(out->impact, y_hit, sizeof out->impact);
            out->impact[2] = s->ground_elevation; /* the crossing is located to round-off */
            if ((rc = push_point(out, cap, cx, t_hit, out->impact)) != DRAGARC_OK)
                goto done;
            *t_end = t_hit;
            break;
        }
        observe(out, cx, y);
        if (y[2] > out->apex_height) {
            out->apex_height = y[2];
            out->apex_time = t;
        }
        if (t >= s->solver.max_time) {
            rc = err_no_impact(err, s, y[2]);
            goto done;
        }
    }
    goto done;
partial_failed:
    rc = cx->rhs_failed ? dragarc_error_set(err, cx->rhs_err.code, cx->rhs_err.field, "%s", cx->rhs_err.message)
                        : dragarc_error_set(err, DRAGARC_ESOLVER, "", "GSL odeiv2 rk8pd: a partial step failed");
done:
    if (ev)
        gsl_odeiv2_evolve_free(ev);
    if (con)
        gsl_odeiv2_control_free(con);
    if (part)
        gsl_odeiv2_step_free(part);
    if (step)
        gsl_odeiv2_step_free(step);
    return rc;
}

int dragarc_flight_run(const dragarc_scenario *s, double dt, dragarc_flight *out, dragarc_error *err)
{
    memset(out, 0, sizeof *out);
    out->terminal_speed = out->vacuum_range = out->relaxation_time = NAN;
    int rc = dragarc_scenario_check(s, err);
    if (rc != DRAGARC_OK)
        return rc;
    if (!(dt >= 0.0 && isfinite(dt)))
        return dragarc_error_set(err, DRAGARC_EINVAL, "dt", "sampling interval must be zero or positive (got %g)", dt);

    flight_ctx c;
    memset(&c, 0, sizeof c);
    c.forces.projectile = &s->projectile;
    c.forces.atmosphere = &s->atmosphere;
    c.forces.wind = &s->wind;
    c.forces.gravity = s->gravity;
    c.forces.ground_elevation = s->ground_elevation;
    c.ceiling = s->atmosphere.model == DRAGARC_ATMOSPHERE_ISA ? DRAGARC_ISA_Z_MAX - s->atmosphere.site_elevation : INFINITY;

    double y0[6];
    launch_state(s, y0);
    out->launch_energy = 0.5 * s->projectile.mass * s->launch.speed * s->launch.speed;
    out->vacuum_range = dragarc_vacuum_range(s);
    rc = dragarc_terminal_speed(s, s->launch.height, &out->terminal_speed, err);
    if (rc != DRAGARC_OK)
        return rc;
    out->relaxation_time = out->terminal_speed / s->gravity;

    dragarc_method method = s->solver.method;
    if (method == DRAGARC_METHOD_AUTO) {
        method = DRAGARC_METHOD_RK8PD;
        if (isfinite(out->terminal_speed)) {
            double rise = y0[5] > 0.0 ? y0[5] * y0[5] / (2.0 * s->gravity) : 0.0;
            double t_fall = (s->launch.height + rise - s->ground_elevation) / out->terminal_speed;
            double t_est = fmax(vacuum_time(s), t_fall);
            if (t_est > STIFF_RATIO * out->relaxation_time)
                method = DRAGARC_METHOD_BDF;
        }
    }
    out->method = method;
    {
        dragarc_air air;
        if (dragarc_atmosphere_eval(&s->atmosphere, s->launch.height, &air, NULL) == DRAGARC_OK &&
            s->projectile.volume > 0.0 && air.density > 0.01 * s->projectile.mass / s->projectile.volume)
            out->notes |= DRAGARC_NOTE_DENSE_FLUID;
    }

    size_t cap = 0;
    double t = 0.0;
    if (method == DRAGARC_METHOD_RK8PD)
        rc = integrate_rk(s, &c, dt, y0, out, &cap, &t, err);
    else
        rc = integrate_cvode(s, &c, method, dt, y0, out, &cap, &t, err);
    if (rc != DRAGARC_OK)
        return rc;
    double ex = out->impact[0], ny = out->impact[1];
    double az = s->launch.azimuth;
    out->time_of_flight = t;
    out->range = hypot(ex, ny);
    out->downrange = ex * sin(az) + ny * cos(az);
    out->crossrange = ex * cos(az) - ny * sin(az);
    double vh = hypot(out->impact[3], out->impact[4]);
    out->impact_speed = sqrt(vh * vh + out->impact[5] * out->impact[5]);
    out->impact_angle = atan2(-out->impact[5], vh);
    out->impact_energy = 0.5 * s->projectile.mass * out->impact_speed * out->impact_speed;
    if (out->impact_energy >= 15.0)
        out->notes |= DRAGARC_NOTE_HIGH_ENERGY;
    return DRAGARC_OK;
}
