/* flight.c: the integrator driver. Flies a scenario from launch to ground impact.
 * SPDX-License-Identifier: GPL-3.0-or-later
 *
 * Four paths under one accuracy contract (rtol, atol on each component of the state):
 * - DOP853, the default for non-stiff flights (dop853.c: Dormand & Prince's 8(5,3) pair with its order-7
 *   continuous extension; Hairer, Norsett & Wanner 1993, Solving ODEs I, section II.10). Apex, impact and
 *   leaving the atmosphere are found on the continuous extension; the impact state is then taken from a
 *   step of the method itself; samples come from the extension. Steps are cut to end on the heights where
 *   the wind or the atmosphere has a kink (kink_limit).
 * - rk8pd (GSL odeiv2, Prince & Dormand 1981): events by regula falsi on partial steps. Kept selectable as
 *   an independent explicit check.
 * - CVODE (Hindmarsh et al. 2005, "SUNDIALS: Suite of nonlinear and differential/algebraic equation
 *   solvers", ACM TOMS 31:363): BDF with Newton iteration and a dense difference-quotient Jacobian when drag
 *   relaxes the velocity much faster than the flight lasts (fine droplets, light debris on a long fall);
 *   variable-order Adams-Moulton with fixed-point iteration on request. Events by CVODE's root finding:
 *   g0 = z - z_ground (impact, descending), g1 = vz (apex, descending), g2 = z - z_top (leaving the top of
 *   the atmosphere model, ascending: an error); samples from CVODE's dense output (CVodeGetDky).
 * Every path runs one step at a time, so sampling never shortens the steps.
 * On a spherical Earth (earth.h) every event, the step limit at kinks and the apex watch the height above the
 * sphere h = |r| - R and its rate (r . v) / |r| in place of z and vz; samples and the impact are reported as
 * dragarc_earth_report gives them (great-circle offsets, h, the velocity in the local frame there).
 */
#include <float.h>
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
#include "dragarc/evaporation.h"
#include "dragarc/forces.h"
#include "numerics/dop853.h"
#include "numerics/flight_track.h"

/* Most samples one flight may keep (80 bytes each): beyond this the sampling interval is unreasonable. */
#define MAX_SAMPLES 2000000

/* m below the datum: the impact plane of a track (dragarc_flight_track), which flies on through the ground to its
 * last time; deep enough never to be reached, finite for CVODE's root functions. */
#define TRACK_DEPTH 1e30

/* Flights whose estimated duration exceeds this many drag relaxation times go to BDF. An explicit method
 * needs steps of about a relaxation time for stability, so its cost grows with the ratio while BDF's does
 * not. Measured on water drops falling 1 m in a 2 m/s wind (rtol 1e-8; flight time / relaxation time in
 * brackets): 60 um (939) DOP853 179 us against BDF 305 us; 50 um (1862) DOP853 331 us against BDF 270 us;
 * 40 um (4394) 739 us against 261 us. The costs cross between the two, near 1000 on the estimate below. */
#define STIFF_RATIO 1000.0

#define NS DRAGARC_STATE_DIM

typedef struct flight_ctx {
    dragarc_forces forces;
    int n;                 /* components integrated: 6; 7 with the spin rate; 8 with the mass of an evaporating drop */
    double spin0;          /* rad/s, the launch spin rate: the spin throughout when n = 6 */
    double mass_stop;      /* an evaporating drop that shrinks to this fraction of its launch mass has evaporated
                            * (0: never) */
    double ceiling;        /* m, local height where the atmosphere model ends (INFINITY if it does not) */
    dragarc_error rhs_err; /* first failure seen inside the right-hand side */
    int rhs_failed;
    char cvode_msg[256];   /* last message from CVODE's error handler */
    dragarc_flow flow;     /* what the evaluation at the end of the last DOP853 step saw */
    const dop853 *stepper; /* the DOP853 stepper, while it runs */
    double *breaks;        /* m above the datum: heights where the equations of motion are not smooth */
    size_t nbreaks;
    const double *times;   /* s since launch, non-decreasing: sample there instead of every dt (NULL: every dt) */
    size_t ntimes;
    size_t next_time;      /* the first of times not yet sampled */
    double t_offset;       /* s, launch -> the start of the segment being integrated (a rebound's landing) */
    double plane;          /* m above the datum: the impact plane (the ground, or far below for a track) */
    double t_limit;        /* s: the flight ends here without an impact (solver.max_time, or a track's last time) */
} flight_ctx;

/* When the next sample is due, in s from the start of the segment: sample k (from 1) every dt, or the next of the
 * listed times; INFINITY when none is. */
static double sample_due(const flight_ctx *c, double dt, long k)
{
    if (c->times)
        return c->next_time < c->ntimes ? c->times[c->next_time] - c->t_offset : INFINITY;
    return dt > 0.0 ? (double)k * dt : INFINITY;
}

/* The sample due has been taken. */
static void sample_taken(flight_ctx *c, long *k)
{
    if (c->times)
        c->next_time++;
    else
        (*k)++;
}

/* The state y of c->n values as NS values (the launch spin and mass where they are not integrated), with the height
 * held at the top of the atmosphere model: trial states of a step may poke above it, and see the air at the top
 * (continuous, and all but vacuum there), while the events stop a flight that really climbs past it. */
static void full_state(const struct flight_ctx *c, const double *y, double ys[NS]);

/* The height above the datum that the events watch: z on the flat Earth, |r| - R on the sphere (earth.h). */
static double height(const flight_ctx *c, const double *y)
{
    return c->forces.spherical ? dragarc_earth_height(c->forces.earth_radius, y) : y[2];
}

/* Its rate of change: vz, or (r . v) / |r|. */
static double climb(const flight_ctx *c, const double *y)
{
    return c->forces.spherical ? dragarc_earth_climb(c->forces.earth_radius, y, y + 3) : y[5];
}

/* What an event watches, by the state index it is named after: 2 the height, 5 its rate, 7 the mass. */
static double event_value(const flight_ctx *c, const double *y, int k)
{
    return k == 2 ? height(c, y) : k == 5 ? climb(c, y) : y[k];
}

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
    double ys[NS], d[NS];
    full_state(c, yv, ys);
    int rc = dragarc_forces_eval(&c->forces, ys, d, NULL, &e);
    memcpy(dv, d, (size_t)c->n * sizeof *dv);
    if (rc != DRAGARC_OK) {
        if (!c->rhs_failed) {
            c->rhs_err = e;
            c->rhs_failed = 1;
        }
        return -1;
    }
    for (int i = 0; i < c->n; i++)
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
    const double h = height(c, yv);
    g[0] = h - c->plane;
    g[1] = climb(c, yv);
    g[2] = isfinite(c->ceiling) ? h - c->ceiling : -1.0;
    g[3] = c->n == NS && c->mass_stop > 0.0 ? yv[7] - c->mass_stop : 1.0;
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
    case DRAGARC_METHOD_DOP853: return "dop853";
    default: return "auto";
    }
}

void dragarc_flight_clear(dragarc_flight *f)
{
    if (!f)
        return;
    free(f->points);
    free(f->landings);
    memset(f, 0, sizeof *f);
}

static void launch_state(const dragarc_scenario *s, double y[NS])
{
    const dragarc_launch *l = &s->launch;
    double ch = cos(l->elevation);
    y[0] = 0.0;
    y[1] = 0.0;
    y[2] = l->height;
    y[3] = l->speed * ch * sin(l->azimuth);
    y[4] = l->speed * ch * cos(l->azimuth);
    y[5] = l->speed * sin(l->elevation);
    y[6] = l->spin_rate;
    y[7] = 1.0;
}

/* Time to fall from the launch to the ground in vacuum; NaN if it never gets there. */
static double vacuum_time(const dragarc_scenario *s)
{
    double y[NS];
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
    double d[NS];
    dragarc_flow flow;
    p->t = t;
    if (c->forces.spherical) {
        double rep[6];
        dragarc_earth_report(c->forces.earth_radius, y, y + 3, rep);
        memcpy(p->pos, rep, sizeof p->pos);
        memcpy(p->vel, rep + 3, sizeof p->vel);
    } else {
        for (int i = 0; i < 3; i++) {
            p->pos[i] = y[i];
            p->vel[i] = y[i + 3];
        }
    }
    p->speed = sqrt(y[3] * y[3] + y[4] * y[4] + y[5] * y[5]);
    double ys[NS];
    memcpy(ys, y, sizeof ys);
    if (c->n < 7)
        ys[6] = c->spin0;
    if (c->n < 8)
        ys[7] = 1.0;
    p->spin = ys[6];
    if (dragarc_forces_eval(&c->forces, ys, d, &flow, NULL) == DRAGARC_OK) {
        p->mach = flow.mach;
        p->reynolds = flow.reynolds;
        p->spin_factor = flow.spin_factor;
        p->lift_coefficient = flow.lift_coefficient;
        p->drag_coefficient = flow.drag_coefficient;
        p->diameter = flow.diameter;
    } else {
        p->mach = p->reynolds = p->spin_factor = p->lift_coefficient = p->drag_coefficient = p->diameter = NAN;
    }
    return DRAGARC_OK;
}

/* Record what the cautions need to know about the flow at a state reached by an accepted step. */
static void observe_flow(dragarc_flight *f, const flight_ctx *c, dragarc_flow flow)
{
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
    if (dr->model == DRAGARC_DRAG_SPIN_TABLE && flow.air.density > 0.0 && flow.airspeed > 0.5 &&
        (flow.reynolds < dr->x[0] || flow.reynolds > dr->x[dr->npoints - 1] || flow.spin_factor > dr->s[dr->ns - 1] ||
         flow.spin_factor < dr->s[0]))
        f->notes |= DRAGARC_NOTE_TABLE_CLAMPED;
    if (dr->model == DRAGARC_DRAG_TABLE && flow.air.density > 0.0) {
        double x = dr->axis == DRAGARC_AXIS_REYNOLDS ? flow.reynolds : dr->axis == DRAGARC_AXIS_MACH ? flow.mach : flow.airspeed;
        /* Launch from rest and the last instants near zero airspeed always read below the table;
         * only note a clamp when the body actually moves through the air. */
        if ((x < dr->x[0] && flow.airspeed > 0.5) || x > dr->x[dr->npoints - 1])
            f->notes |= DRAGARC_NOTE_TABLE_CLAMPED;
    }
}

static void observe(dragarc_flight *f, const flight_ctx *c, const double *y)
{
    double d[NS], ys[NS];
    memcpy(ys, y, sizeof ys);
    if (c->n < 7)
        ys[6] = c->spin0;
    if (c->n < 8)
        ys[7] = 1.0;
    dragarc_flow flow;
    if (dragarc_forces_eval(&c->forces, ys, d, &flow, NULL) == DRAGARC_OK)
        observe_flow(f, c, flow);
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
static int err_left_atmosphere(const flight_ctx *c, dragarc_error *err, double t)
{
    if (c->forces.atmosphere->model == DRAGARC_ATMOSPHERE_LOCAL)
        return dragarc_error_set(err, DRAGARC_ERANGE, "environment.atmosphere",
                                 "at t = %.6g s the flight climbs more than %g m above the site datum, the top of the "
                                 "'local' model (the standard troposphere's lapse rate)",
                                 t, DRAGARC_LOCAL_Z_MAX);
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

/* A state of cx->n values as NS values (the launch spin rate and mass where they are not integrated). */
static double *widen(const flight_ctx *cx, const double *y, double out[NS])
{
    for (int i = 0; i < NS; i++)
        out[i] = i < cx->n ? y[i] : i == 6 ? cx->spin0 : 1.0;
    return out;
}

static void full_state(const flight_ctx *c, const double *y, double ys[NS])
{
    widen(c, y, ys);
    if (!c->forces.spherical && !(ys[2] < c->ceiling)) /* on the sphere the forces hold the height (height_cap) */
        ys[2] = c->ceiling;
}

/* Integrate with CVODE from y0 to impact, filling samples, apex, notes and steps; impact state in out->impact,
 * impact time in *t_end. */
static int integrate_cvode(const dragarc_scenario *s, flight_ctx *cx, dragarc_method method, double dt,
                           const double y0[NS], dragarc_flight *out, size_t *cap_, double *t_end, dragarc_error *err)
{
    int rc = DRAGARC_OK;
    const int n = cx->n;
    double yw[NS]; /* a CVODE state widened to NS values */
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
    y = N_VNew_Serial(n, sun);
    ytmp = N_VNew_Serial(n, sun);
    mem = CVodeCreate(method == DRAGARC_METHOD_BDF ? CV_BDF : CV_ADAMS, sun);
    if (!y || !ytmp || !mem) {
        rc = dragarc_error_set(err, DRAGARC_ENOMEM, "", "could not allocate the integrator");
        goto done;
    }
    memcpy(N_VGetArrayPointer(y), y0, (size_t)n * sizeof *y0);
    int flag = CVodeSetErrHandlerFn(mem, on_cvode_error, cx);
    if (flag == CV_SUCCESS)
        flag = CVodeInit(mem, rhs, 0.0, y);
    if (flag == CV_SUCCESS)
        flag = CVodeSetUserData(mem, cx);
    if (flag == CV_SUCCESS)
        flag = CVodeSStolerances(mem, s->solver.rtol, s->solver.atol);
    if (flag == CV_SUCCESS)
        flag = CVodeSetStopTime(mem, cx->t_limit);
    if (flag == CV_SUCCESS)
        flag = CVodeSetMaxNumSteps(mem, s->solver.max_steps);
    if (flag == CV_SUCCESS)
        flag = CVodeRootInit(mem, 4, roots);
    int dirs[4] = {-1, -1, +1, -1};
    if (flag == CV_SUCCESS)
        flag = CVodeSetRootDirection(mem, dirs);
    if (flag == CV_SUCCESS)
        flag = CVodeSetNoInactiveRootWarn(mem);
    if (flag == CV_SUCCESS) {
        if (method == DRAGARC_METHOD_BDF) {
            A = SUNDenseMatrix(n, n, sun);
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
        flag = CVode(mem, cx->t_limit, y, &t, CV_ONE_STEP);
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
        for (double ts; (ts = sample_due(cx, dt, k)) < t;) {
            if (out->npoints >= MAX_SAMPLES) {
                rc = dragarc_error_set(err, DRAGARC_EINVAL, "dt",
                                       "a sampling interval of %g s gives more than %d rows over this flight; "
                                       "use a larger interval",
                                       dt, MAX_SAMPLES);
                goto done;
            }
            if (CVodeGetDky(mem, ts, 0, ytmp) != CV_SUCCESS)
                break;
            if ((rc = push_point(out, cap_, cx, ts, widen(cx, N_VGetArrayPointer(ytmp), yw))) != DRAGARC_OK)
                goto nomem;
            sample_taken(cx, &k);
        }
        observe(out, cx, widen(cx, yv, yw));
        if (flag == CV_ROOT_RETURN) {
            int found[4] = {0, 0, 0, 0};
            CVodeGetRootInfo(mem, found);
            if (found[2]) {
                rc = err_left_atmosphere(cx, err, t);
                goto done;
            }
            const double h = height(cx, yv);
            if (found[1] && h > out->apex_height) {
                out->apex_height = h;
                out->apex_time = t;
            }
            if (found[1] && h < cx->plane) {
                rc = err_peaks_below(err, h, cx->plane);
                goto done;
            }
            if (found[3])
                out->evaporated = 1;
            if (found[0] || found[3])
                landed = 1;
        } else if (flag == CV_TSTOP_RETURN || t >= cx->t_limit) {
            rc = err_no_impact(err, s, height(cx, yv));
            goto done;
        }
        if (!landed && height(cx, yv) > out->apex_height) { /* a flight that climbs to the end of a step */
            out->apex_height = height(cx, yv);
            out->apex_time = t;
        }
    }

    widen(cx, N_VGetArrayPointer(y), out->impact);
    if (out->evaporated)
        out->impact[7] = cx->mass_stop; /* the root finder leaves it at round-off level */
    else if (!cx->forces.spherical)
        out->impact[2] = cx->plane; /* the root finder leaves |z - z_g| at round-off level */
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

/* The equations of motion for the explicit paths: 0, or -1 with the first failure recorded in c. Trial states
 * of a step may poke above the top of the atmosphere model; they see the air at the top (continuous, and all
 * but vacuum there), while the events stop a flight that really climbs past it. A NaN or an infinity in any
 * component carries into the sum that is tested. */
static int eval_checked(flight_ctx *c, const double *y, double *dydt, dragarc_flow *flow)
{
    double ys[NS], d[NS];
    full_state(c, y, ys);
    dragarc_error e;
    int rc = dragarc_forces_eval(&c->forces, ys, d, flow, &e);
    memcpy(dydt, d, (size_t)c->n * sizeof *dydt);
    if (rc != DRAGARC_OK) {
        if (!c->rhs_failed)
            c->rhs_err = e;
        c->rhs_failed = 1;
        return -1;
    }
    if (!isfinite(dydt[3] + dydt[4] + dydt[5] + y[0] + y[1] + y[2] + y[3] + y[4] + y[5])) {
        if (!c->rhs_failed)
            dragarc_error_set(&c->rhs_err, DRAGARC_ESOLVER, "", "the equations of motion gave a non-finite value");
        c->rhs_failed = 1;
        return -1;
    }
    return 0;
}

/* ---- the explicit path: GSL odeiv2 rk8pd with events located inside the step ---------------------- */

/* Right-hand side in GSL's form; the same clamp at the top of the atmosphere as for CVODE. */
static int rk_rhs(double t, const double y[], double dydt[], void *user)
{
    (void)t;
    return eval_checked(user, y, dydt, NULL) == 0 ? GSL_SUCCESS : GSL_EBADFUNC;
}

/* The state at t0 + tau from (t0, y0) by one rk8pd step of size tau (tau no longer than the step the error
 * control accepted, so the eighth-order step is at least as accurate). */
static int rk_partial(gsl_odeiv2_step *st, const gsl_odeiv2_system *sys, double t0, const double y0[NS], double tau,
                      double y[NS])
{
    double yerr[NS];
    memcpy(y, y0, NS * sizeof *y);
    if (tau == 0.0)
        return GSL_SUCCESS;
    gsl_odeiv2_step_reset(st);
    return gsl_odeiv2_step_apply(st, t0, tau, y, yerr, NULL, NULL, sys);
}

/* The Illinois variant of regula falsi (Dowell & Jarratt 1971, BIT 11:168) on a bracket [a, b] with
 * g(a) = fa > 0 >= g(b) = fb: the next trial time, and the bracket after g(m) = fm is known (the value kept
 * at the end that stays put twice running is halved, which makes the convergence superlinear). */
typedef struct bracket {
    double a, fa, b, fb;
    int side; /* which end moved last: -1 a, +1 b, 0 none yet */
} bracket;

static double bracket_trial(const bracket *br)
{
    double m = br->b - br->fb * (br->b - br->a) / (br->fb - br->fa);
    return m > br->a && m < br->b ? m : 0.5 * (br->a + br->b);
}

static void bracket_update(bracket *br, double m, double fm)
{
    if (fm > 0.0) {
        br->a = m, br->fa = fm;
        if (br->side == -1)
            br->fb *= 0.5;
        br->side = -1;
    } else {
        br->b = m, br->fb = fm;
        if (br->side == 1)
            br->fa *= 0.5;
        br->side = 1;
    }
}

/* The time in (ta, t1] where g = sign (y[k] - level) falls through zero, by the Illinois variant of regula
 * falsi (Dowell & Jarratt 1971, BIT 11:168) on states from rk_partial out of (t0, y0), the start of the step;
 * ystar gets the state there. g(ta) > 0 >= g(t1) on entry. */
static int rk_locate(gsl_odeiv2_step *st, const gsl_odeiv2_system *sys, double t0, const double y0[NS], double ta,
                     const double ya[NS], double t1, const double y1[NS], int k, double level, double sign,
                     double *tstar, double ystar[NS])
{
    const flight_ctx *c = sys->params;
    bracket br = {ta, sign * (event_value(c, ya, k) - level), t1, sign * (event_value(c, y1, k) - level), 0};
    memcpy(ystar, y1, NS * sizeof *ystar);
    *tstar = t1;
    /* Close enough when g is within 1e-12 of its change over the bracket: the crossing time is then known to
     * about 1e-12 of the step, far inside the integration's own accuracy. */
    const double gtol = 1e-12 * (fabs(br.fa) + fabs(br.fb));
    for (int it = 0; it < 100 && br.b - br.a > 1e-13 * fmax(1.0, fabs(br.b)); it++) {
        double m = bracket_trial(&br), ym[NS];
        if (rk_partial(st, sys, t0, y0, m - t0, ym) != GSL_SUCCESS)
            return -1;
        double fm = sign * (event_value(c, ym, k) - level);
        if (fm <= 0.0 || fabs(fm) <= gtol) {
            memcpy(ystar, ym, NS * sizeof *ystar);
            *tstar = m;
        }
        if (fabs(fm) <= gtol || fm == 0.0)
            break;
        bracket_update(&br, m, fm);
    }
    return 0;
}

/* Integrate with rk8pd (Prince & Dormand 1981, J. Comput. Appl. Math. 7:67; GSL odeiv2) under GSL's
 * standard error control (|err_i| <= atol + rtol |y_i|), one accepted step at a time. Events are found
 * inside the step that contains them by regula falsi on partial steps from its start; samples likewise. */
static int integrate_rk(const dragarc_scenario *s, flight_ctx *cx, double dt, const double y0[NS],
                        dragarc_flight *out, size_t *cap, double *t_end, dragarc_error *err)
{
    const size_t n = (size_t)cx->n;
    gsl_odeiv2_system sys = {rk_rhs, NULL, n, cx};
    gsl_odeiv2_step *step = gsl_odeiv2_step_alloc(gsl_odeiv2_step_rk8pd, n);
    gsl_odeiv2_step *part = gsl_odeiv2_step_alloc(gsl_odeiv2_step_rk8pd, n);
    gsl_odeiv2_control *con = gsl_odeiv2_control_standard_new(s->solver.atol, s->solver.rtol, 1.0, 0.0);
    gsl_odeiv2_evolve *ev = gsl_odeiv2_evolve_alloc(n);
    int rc = DRAGARC_OK;
    if (!step || !part || !con || !ev) {
        rc = dragarc_error_set(err, DRAGARC_ENOMEM, "", "could not allocate the integrator");
        goto done;
    }
    double y[NS], yprev[NS], ytmp[NS];
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
        int st = gsl_odeiv2_evolve_apply(ev, con, step, &sys, &t, cx->t_limit, &h, y);
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
        double y_apex[NS], y_hit[NS], y_top[NS];
        const double zg = cx->plane;
        const double zh = height(cx, y), zhprev = height(cx, yprev);
        if (isfinite(cx->ceiling) && zh > cx->ceiling && zhprev <= cx->ceiling &&
            rk_locate(part, &sys, tprev, yprev, tprev, yprev, t, y, 2, cx->ceiling, -1.0, &t_top, y_top) != 0)
            goto partial_failed;
        if (climb(cx, yprev) > 0.0 && climb(cx, y) <= 0.0 &&
            rk_locate(part, &sys, tprev, yprev, tprev, yprev, t, y, 5, 0.0, 1.0, &t_apex, y_apex) != 0)
            goto partial_failed;
        /* The descent through the ground plane: from the apex when the step holds one (a long step may climb
         * from the plane, or from below it, and come back down through it), else from the step's start. */
        {
            double ta = isfinite(t_apex) ? t_apex : tprev;
            const double *ya = isfinite(t_apex) ? y_apex : yprev;
            if (height(cx, ya) > zg && zh <= zg &&
                rk_locate(part, &sys, tprev, yprev, ta, ya, t, y, 2, zg, 1.0, &t_hit, y_hit) != 0)
                goto partial_failed;
        }
        /* An evaporating drop that shrinks away before it lands ends the flight there. */
        if (cx->n == NS && cx->mass_stop > 0.0 && y[7] <= cx->mass_stop && yprev[7] > cx->mass_stop) {
            double t_van, y_van[NS];
            if (rk_locate(part, &sys, tprev, yprev, tprev, yprev, t, y, 7, cx->mass_stop, 1.0, &t_van, y_van) != 0)
                goto partial_failed;
            if (t_van < t_hit) {
                t_hit = t_van;
                memcpy(y_hit, y_van, sizeof y_hit);
                out->evaporated = 1;
            }
        }
        double t_stop = fmin(t, fmin(t_hit, t_top));
        for (double ts; (ts = sample_due(cx, dt, k)) < t_stop;) {
            if (out->npoints >= MAX_SAMPLES) {
                rc = dragarc_error_set(err, DRAGARC_EINVAL, "dt",
                                       "a sampling interval of %g s gives more than %d rows over this flight; use a "
                                       "larger interval",
                                       dt, MAX_SAMPLES);
                goto done;
            }
            if (rk_partial(part, &sys, tprev, yprev, ts - tprev, ytmp) != GSL_SUCCESS)
                goto partial_failed;
            if ((rc = push_point(out, cap, cx, ts, ytmp)) != DRAGARC_OK)
                goto done;
            sample_taken(cx, &k);
        }
        if (isfinite(t_top) && t_top <= fmin(t_hit, t_apex)) {
            rc = err_left_atmosphere(cx, err, t_top);
            goto done;
        }
        if (t_apex < t_hit) {
            const double ha = height(cx, y_apex);
            if (ha > out->apex_height) {
                out->apex_height = ha;
                out->apex_time = t_apex;
            }
            if (ha < cx->plane) {
                rc = err_peaks_below(err, ha, cx->plane);
                goto done;
            }
        }
        if (isfinite(t_hit)) {
            observe(out, cx, y_hit);
            memcpy(out->impact, y_hit, sizeof out->impact);
            if (out->evaporated)
                out->impact[7] = cx->mass_stop;
            else if (!cx->forces.spherical)
                out->impact[2] = cx->plane; /* the crossing is located to round-off */
            if ((rc = push_point(out, cap, cx, t_hit, out->impact)) != DRAGARC_OK)
                goto done;
            *t_end = t_hit;
            break;
        }
        observe(out, cx, y);
        if (zh > out->apex_height) {
            out->apex_height = zh;
            out->apex_time = t;
        }
        if (t >= cx->t_limit) {
            rc = err_no_impact(err, s, zh);
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

/* ---- the explicit default: DOP853 with events and samples from its continuous extension ------------- */

/* Right-hand side in the stepper's form, keeping what the flow looked like at the end of each accepted step
 * (the stepper evaluates f there anyway), so the diagnostics of a step cost no extra evaluation. */
static int dop_rhs(double t, const double y[NS], double dydt[NS], void *user)
{
    (void)t;
    flight_ctx *c = user;
    for (int i = c->n; i < NS; i++)
        dydt[i] = 0.0; /* what is not integrated stays constant */
    return eval_checked(c, y, dydt, c->stepper && c->stepper->at_step_end ? &c->flow : NULL);
}

/* Gather the heights (above the datum) where the atmosphere's or the wind's slope jumps. */
static int gather_breaks(const dragarc_scenario *s, flight_ctx *cx)
{
    size_t na = dragarc_atmosphere_breaks(&s->atmosphere, NULL, 0), nw = dragarc_wind_breaks(&s->wind, NULL, 0);
    cx->nbreaks = 0;
    if (na + nw == 0)
        return DRAGARC_OK;
    cx->breaks = malloc((na + nw) * sizeof *cx->breaks);
    if (!cx->breaks)
        return DRAGARC_ENOMEM;
    dragarc_atmosphere_breaks(&s->atmosphere, cx->breaks, na);
    dragarc_wind_breaks(&s->wind, cx->breaks + na, nw);
    for (size_t i = na; i < na + nw; i++)
        cx->breaks[i] += s->ground_elevation;
    cx->nbreaks = na + nw;
    return DRAGARC_OK;
}

/* The step limit for DOP853. A Runge-Kutta step is only as good as the smoothness of f over it; where the
 * equations of motion have a kink (a wind row, an atmosphere layer) a step that crosses it has its error
 * estimate spoilt, at either end, by the jump in slope times the distance it reaches past the kink, and is
 * rejected again and again. So a step that would cross one is cut to end just short of it, where the height
 * predicted from z + vz tau + az tau^2 / 2 meets it (0.1 % short, to allow for the prediction's error), and
 * the next, tiny, step closes the gap exactly; the step after that starts on the kink, within 1e-8 of a
 * step's reach (gaps that small are ignored), and sees only the smooth side. */
static double kink_limit(double t, const double y[NS], const double f[NS], double h, void *user)
{
    (void)t;
    const flight_ctx *c = user;
    double z = y[2], vz = y[5], a = 0.5 * f[5];
    if (c->forces.spherical) {
        /* h, dh/dt and d2h/dt2 = (|v|^2 - (dh/dt)^2 + r . a) / |r| on the sphere */
        const double R = c->forces.earth_radius, r[3] = {y[0], y[1], y[2] + R};
        const double rn = sqrt(r[0] * r[0] + r[1] * r[1] + r[2] * r[2]);
        z = height(c, y);
        vz = climb(c, y);
        a = 0.5 * ((y[3] * y[3] + y[4] * y[4] + y[5] * y[5] - vz * vz + r[0] * f[3] + r[1] * f[4] + r[2] * f[5]) / rn);
    }
    const double reach = fabs(vz) * h + fabs(a) * h * h;
    double best = INFINITY, gap = 0.0;
    for (size_t i = 0; i < c->nbreaks; i++) {
        double d = c->breaks[i] - z;
        if (fabs(d) > reach || fabs(d) <= 1e-8 * reach)
            continue;
        /* first positive root of a tau^2 + vz tau - d = 0 */
        double tau = INFINITY;
        if (fabs(a) * h < 1e-12 * fabs(vz)) {
            if (d / vz > 0.0)
                tau = d / vz;
        } else {
            double disc = vz * vz + 4.0 * a * d;
            if (disc >= 0.0) {
                double q = -0.5 * (vz + copysign(sqrt(disc), vz));
                double r1 = q / a, r2 = q != 0.0 ? -d / q : INFINITY;
                if (r1 > 0.0)
                    tau = r1;
                if (r2 > 0.0 && r2 < tau)
                    tau = r2;
            }
        }
        if (tau < best)
            best = tau, gap = fabs(d);
    }
    if (!(best < h))
        return h;
    /* Close a gap of under 1e-3 of the reach in one step: the prediction is then exact to far below it. */
    return gap < 1e-3 * reach ? best : 0.999 * best;
}

/* The time in (ta, t] of the last step where g = sign (y_k - level) falls through zero, by the Illinois
 * variant of regula falsi (Dowell & Jarratt 1971, BIT 11:168) on the continuous extension, to round-off:
 * each trial costs a polynomial, not a step. g(ta) > 0 >= g(t) on entry. */
static double dense_value(const flight_ctx *c, const dop853 *st, double t, int k)
{
    if (!c->forces.spherical)
        return dop853_dense_component(st, t, k);
    double y[NS];
    dop853_dense_eval(st, t, y);
    return event_value(c, y, k);
}

static double dense_locate(const flight_ctx *c, const dop853 *st, double ta, int k, double level, double sign)
{
    bracket br = {ta, sign * (dense_value(c, st, ta, k) - level), st->t, sign * (event_value(c, st->y, k) - level), 0};
    for (int it = 0; it < 200 && br.b - br.a > 4.0 * DBL_EPSILON * fmax(fabs(br.a), fabs(br.b)); it++) {
        double m = bracket_trial(&br), fm = sign * (dense_value(c, st, m, k) - level);
        bracket_update(&br, m, fm);
        if (fm == 0.0)
            break;
    }
    return br.b;
}

/* The impact from the continuous extension is as good as an order-7 interpolant; the range, time and
 * impact speed are the results people use, so they get the eighth-order solution itself: one step of the
 * method from the start of the step to t*, then a first-order correction of t* by the height left over
 * (|dt| is at round-off of the dense root, so the neglected term is far below the step's error). Measured
 * on the bench's ball (rtol 1e-8): the range error against a 1e-12 solution drops from 1.6e-8 to 9.6e-9;
 * on the 100 um drop from 5.9e-9 to 1e-11; cost: 12 evaluations per flight. */
static int polish_impact(const dop853 *st, flight_ctx *cx, double zg, double *t_hit, double y_hit[NS])
{
    double ys[NS], f[NS];
    if (dop853_partial(st, *t_hit - st->t_old, ys) != DOP853_OK || dop_rhs(*t_hit, ys, f, cx) != 0)
        return -1;
    const double vh = climb(cx, ys);
    double dtc = vh < 0.0 ? -(height(cx, ys) - zg) / vh : 0.0;
    if (!(fabs(dtc) <= 1e-6 * (st->t - st->t_old)))
        return 0; /* a grazing crossing: keep the interpolated state */
    *t_hit += dtc;
    for (int i = 0; i < NS; i++)
        y_hit[i] = ys[i] + dtc * f[i];
    return 0;
}

static int dop_failure(const flight_ctx *cx, int st, double t, dragarc_error *err)
{
    if (cx->rhs_failed)
        return dragarc_error_set(err, cx->rhs_err.code == DRAGARC_ERANGE ? DRAGARC_ERANGE : DRAGARC_ESOLVER,
                                 cx->rhs_err.field, "at t = %.6g s: %s", t, cx->rhs_err.message);
    return dragarc_error_set(err, DRAGARC_ESOLVER, "", "DOP853: %s at t = %.6g s",
                             st == DOP853_ESTEPSIZE ? "the step size fell to round-off" : "the step failed", t);
}

/* The events and samples inside the step just taken, from its continuous extension: leaving the atmosphere
 * (an error), the apex, the impact (*landed = 1, *t_end its time), and the samples due before them. */
static int dop_step_events(flight_ctx *cx, dop853 *st, double dt, long *k, int crosses_top,
                           int apex, dragarc_flight *out, size_t *cap, int *landed, double *t_end, dragarc_error *err)
{
    const double zg = cx->plane, *yp = st->y_old, *y = st->y;
    int rc;
    if (dop853_dense(st) != DOP853_OK)
        return dop_failure(cx, DOP853_ERHS, st->t, err);
    cx->rhs_failed = 0;
    /* Events inside this step, in time order: leaving the atmosphere, the apex, the impact. */
    double t_top = INFINITY, t_apex = INFINITY, t_hit = INFINITY;
    double y_apex[NS], y_hit[NS];
    if (crosses_top)
        t_top = dense_locate(cx, st, st->t_old, 2, cx->ceiling, -1.0);
    if (apex) {
        t_apex = dense_locate(cx, st, st->t_old, 5, 0.0, 1.0);
        dop853_dense_eval(st, t_apex, y_apex);
    }
    /* The descent through the ground plane: from the apex when the step holds one (a long step may climb
     * from the plane, or from below it, and come back down through it), else from the step's start. */
    {
        double ta = isfinite(t_apex) ? t_apex : st->t_old;
        double za = height(cx, isfinite(t_apex) ? y_apex : yp);
        if (za > zg && height(cx, y) <= zg) {
            t_hit = dense_locate(cx, st, ta, 2, zg, 1.0);
            dop853_dense_eval(st, t_hit, y_hit);
            if (polish_impact(st, cx, zg, &t_hit, y_hit) != 0)
                return dop_failure(cx, DOP853_ERHS, t_hit, err);
        }
    }
    /* An evaporating drop that shrinks away before it lands ends the flight there. */
    if (cx->n == NS && cx->mass_stop > 0.0 && y[7] <= cx->mass_stop && yp[7] > cx->mass_stop) {
        double t_van = dense_locate(cx, st, st->t_old, 7, cx->mass_stop, 1.0);
        if (t_van < t_hit) {
            t_hit = t_van;
            dop853_dense_eval(st, t_hit, y_hit);
            out->evaporated = 1;
        }
    }
    double t_stop = fmin(st->t, fmin(t_hit, t_top));
    for (double ts; (ts = sample_due(cx, dt, *k)) < t_stop;) {
        if (out->npoints >= MAX_SAMPLES)
            return dragarc_error_set(err, DRAGARC_EINVAL, "dt",
                                     "a sampling interval of %g s gives more than %d rows over this flight; use "
                                     "a larger interval",
                                     dt, MAX_SAMPLES);
        double ys[NS];
        dop853_dense_eval(st, ts, ys);
        if ((rc = push_point(out, cap, cx, ts, ys)) != DRAGARC_OK)
            return rc;
        sample_taken(cx, k);
    }
    if (isfinite(t_top) && t_top <= fmin(t_hit, t_apex))
        return err_left_atmosphere(cx, err, t_top);
    if (t_apex < t_hit) {
        const double ha = height(cx, y_apex);
        if (ha > out->apex_height) {
            out->apex_height = ha;
            out->apex_time = t_apex;
        }
        if (ha < zg)
            return err_peaks_below(err, ha, zg);
    }
    if (isfinite(t_hit)) {
        observe(out, cx, y_hit);
        memcpy(out->impact, y_hit, sizeof out->impact);
        if (out->evaporated)
            out->impact[7] = cx->mass_stop;
        else if (!cx->forces.spherical)
            out->impact[2] = zg; /* the crossing is located to round-off */
        if ((rc = push_point(out, cap, cx, t_hit, out->impact)) != DRAGARC_OK)
            return rc;
        *t_end = t_hit;
        *landed = 1;
    }
    return DRAGARC_OK;
}

/* Integrate with DOP853 (Hairer, Norsett & Wanner 1993) under its error control (weighted RMS norm of the
 * local error, weights 1 / (atol + rtol max(|y_i|, |y_new_i|)), as CVODE's), one accepted step at a time.
 * Events and samples inside a step come from the step's continuous extension of order 7. */
static int integrate_dop853(const dragarc_scenario *s, flight_ctx *cx, double dt, const double y0[NS],
                            dragarc_flight *out, size_t *cap, double *t_end, dragarc_error *err)
{
    dop853 st;
    cx->stepper = &st; /* for dop_rhs: which evaluation ends a step */
    double ys0[NS];
    memcpy(ys0, y0, sizeof ys0);
    for (int i = cx->n; i < NS; i++)
        ys0[i] = 0.0; /* not integrated: kept out of the starting-step estimate (eval_checked uses spin0, the launch mass) */
    if (cx->n == NS && !(cx->spin0 > 0.0))
        ys0[6] = 0.0;
    int rc, ds = dop853_init(&st, dop_rhs, cx, s->solver.rtol, s->solver.atol, 0.0, ys0, cx->t_limit);
    if (ds != DOP853_OK)
        return dop_failure(cx, ds, 0.0, err);
    /* components that stay exactly zero (a spin rate not integrated, no spin on an evaporating drop) do not
     * dilute the error norm */
    st.n_err = cx->n == NS && !(cx->spin0 > 0.0) ? NS - 1 : cx->n;
    st.n = cx->n == 6 ? 6 : NS; /* the spin and mass, when not integrated, keep their zero values and slopes */
    if (gather_breaks(s, cx) != DRAGARC_OK)
        return dragarc_error_set(err, DRAGARC_ENOMEM, "", "could not allocate the integrator");
    if (cx->nbreaks)
        st.limit = kink_limit;
    cx->rhs_failed = 0;
    if ((rc = push_point(out, cap, cx, 0.0, y0)) != DRAGARC_OK)
        return rc;
    observe(out, cx, y0);
    out->apex_height = y0[2];
    out->apex_time = 0.0;
    const double zg = cx->plane;
    long k = 1;
    for (;;) {
        ds = dop853_step(&st, cx->t_limit);
        if (ds == DOP853_EEND) {
            return err_no_impact(err, s, height(cx, st.y));
        }
        if (ds != DOP853_OK)
            return dop_failure(cx, ds, st.t, err);
        cx->rhs_failed = 0; /* a trial that failed and was retried shorter is not an error */
        out->steps = st.nsteps;
        if (out->steps > s->solver.max_steps)
            return dragarc_error_set(err, DRAGARC_ESOLVER, "solver.max_steps",
                                     "DOP853: more than %ld steps by t = %.6g s; raise solver.max_steps or loosen "
                                     "solver.rtol",
                                     s->solver.max_steps, st.t);
        const double *yp = st.y_old, *y = st.y;
        const dragarc_flow step_flow = cx->flow; /* the flow at the step's end */
        const double h = height(cx, y), hp = height(cx, yp);
        int crosses_top = isfinite(cx->ceiling) && h > cx->ceiling && hp <= cx->ceiling;
        int apex = climb(cx, yp) > 0.0 && climb(cx, y) <= 0.0;
        int may_land = fmax(hp, h) > zg || apex;
        int sample = sample_due(cx, dt, k) < st.t;
        int vanishes = cx->n == NS && cx->mass_stop > 0.0 && y[7] <= cx->mass_stop;
        if (crosses_top || apex || (may_land && h <= zg) || sample || vanishes) {
            int landed = 0;
            rc = dop_step_events(cx, &st, dt, &k, crosses_top, apex, out, cap, &landed, t_end, err);
            if (rc != DRAGARC_OK || landed)
                return rc;
        }
        observe_flow(out, cx, step_flow);
        if (h > out->apex_height) {
            out->apex_height = h;
            out->apex_time = st.t;
        }
        if (st.t >= cx->t_limit)
            return err_no_impact(err, s, h);
    }
}

/* Spin about the unit vector axis at rate (rad/s; NULL or 0: none). The spin rate joins the state only when
 * something acts on it or through it. */
static void set_spin(const dragarc_scenario *s, flight_ctx *c, const double axis[3], double rate)
{
    dragarc_forces_spin(&c->forces, rate > 0.0 ? axis : NULL, s->launch.spin_decay_time);
    int spin_matters = rate > 0.0 && (s->projectile.lift.model != DRAGARC_LIFT_NONE || s->launch.spin_decay_time > 0.0 ||
                                      s->projectile.spin_decay_coefficient > 0.0 ||
                                      s->projectile.drag.model == DRAGARC_DRAG_SPIN_TABLE);
    c->n = s->projectile.evaporation.enabled ? 8 : spin_matters ? 7 : 6;
    c->spin0 = rate;
}

/* Fly from y0 (at local time 0) to the ground with the given method. */
static int integrate(const dragarc_scenario *s, flight_ctx *c, dragarc_method method, double dt, const double y0[NS],
                     dragarc_flight *out, size_t *cap, double *t, dragarc_error *err)
{
    int rc;
    if (method == DRAGARC_METHOD_DOP853) {
        rc = integrate_dop853(s, c, dt, y0, out, cap, t, err);
        free(c->breaks);
        c->breaks = NULL;
        c->nbreaks = 0;
    } else if (method == DRAGARC_METHOD_RK8PD) {
        rc = integrate_rk(s, c, dt, y0, out, cap, t, err);
    } else {
        rc = integrate_cvode(s, c, method, dt, y0, out, cap, t, err);
    }
    if (rc == DRAGARC_OK && c->n < 7)
        out->impact[6] = c->spin0;
    if (rc == DRAGARC_OK && c->n < 8)
        out->impact[7] = 1.0;
    return rc;
}

/* Append the samples of a rebound flight `seg` (its times from 0) to `out`, shifted to start at t0. */
static int append_segment(dragarc_flight *out, size_t *cap, const dragarc_flight *seg, double t0)
{
    if (out->npoints + seg->npoints > *cap) {
        size_t nc = out->npoints + seg->npoints + 64;
        dragarc_flight_point *np = realloc(out->points, nc * sizeof *np);
        if (!np)
            return DRAGARC_ENOMEM;
        out->points = np;
        *cap = nc;
    }
    for (size_t i = 0; i < seg->npoints; i++) {
        dragarc_flight_point p = seg->points[i];
        p.t += t0;
        out->points[out->npoints++] = p;
    }
    return DRAGARC_OK;
}

/* After the first landing on a ground surface: each landing resolved by the rigid-sphere impact of bounce.h,
 * each rebound flown like the launch (same method, spin about the axis the impact leaves), until a rebound is
 * too low or too many; then the slide and roll-out to rest. The summary of the first flight stays as it is. */
static int bounce_and_roll(const dragarc_scenario *s, flight_ctx *c, dragarc_method method, double dt,
                           dragarc_flight *out, size_t *cap, double t_land, dragarc_error *err)
{
    const dragarc_sphere ball = {0.5 * s->projectile.diameter,
                                 s->projectile.inertia_factor > 0.0 ? s->projectile.inertia_factor : DRAGARC_INERTIA_SOLID};
    double state[NS];
    memcpy(state, out->impact, sizeof state);
    double t = t_land;
    int rc = DRAGARC_OK;
    out->landings = calloc((size_t)s->bounce.max_bounces + 1, sizeof *out->landings);
    if (!out->landings)
        return dragarc_error_set(err, DRAGARC_ENOMEM, "", "out of memory for the landings");
    for (int count = 1;; count++) {
        double v[3] = {state[3], state[4], state[5]}, w[3];
        for (int i = 0; i < 3; i++)
            w[i] = state[6] * c->forces.spin_axis[i];
        dragarc_bounce b;
        dragarc_bounce_next next;
        rc = dragarc_bounce_land(&s->surface, &ball, &s->bounce, s->gravity, count, v, w, &b, &next, err);
        if (rc != DRAGARC_OK) {
            dragarc_error_prefix(err, "ground.surface");
            return rc;
        }
        dragarc_landing *L = &out->landings[out->nlandings++];
        double vh = hypot(v[0], v[1]), vh2 = hypot(b.velocity[0], b.velocity[1]);
        L->t = t;
        L->pos[0] = state[0], L->pos[1] = state[1];
        L->speed_in = sqrt(vh * vh + v[2] * v[2]);
        L->angle_in = atan2(-v[2], vh);
        L->spin_in = state[6];
        L->speed_out = sqrt(vh2 * vh2 + b.velocity[2] * b.velocity[2]);
        L->angle_out = atan2(b.velocity[2], vh2);
        L->spin_out = sqrt(b.spin[0] * b.spin[0] + b.spin[1] * b.spin[1] + b.spin[2] * b.spin[2]);
        L->grips = b.regime == DRAGARC_BOUNCE_GRIPS;
        if (next == DRAGARC_BOUNCE_ROLL) {
            L->rolls = 1;
            dragarc_roll roll;
            rc = dragarc_bounce_roll(&s->surface, &ball, s->gravity, b.velocity, b.spin, &roll, err);
            if (rc != DRAGARC_OK) {
                dragarc_error_prefix(err, "ground.surface");
                return rc;
            }
            out->rest_position[0] = state[0] + roll.offset[0];
            out->rest_position[1] = state[1] + roll.offset[1];
            out->rest_time = t + roll.time;
            out->roll_distance = hypot(roll.offset[0], roll.offset[1]);
            out->total_distance = hypot(out->rest_position[0], out->rest_position[1]);
            /* one row where the ball comes to rest */
            dragarc_flight_point p = {.t = out->rest_time,
                                      .pos = {out->rest_position[0], out->rest_position[1], s->ground_elevation},
                                      .mach = 0.0, .reynolds = 0.0, .drag_coefficient = NAN};
            dragarc_flight one = {.npoints = 1, .points = &p};
            if (append_segment(out, cap, &one, 0.0) != DRAGARC_OK)
                return dragarc_error_set(err, DRAGARC_ENOMEM, "", "out of memory for trajectory samples");
            return DRAGARC_OK;
        }
        /* the rebound: a new flight from the ground, spinning about the axis the impact left */
        double rate = L->spin_out, axis[3] = {0.0, 0.0, 0.0};
        if (rate > 0.0)
            for (int i = 0; i < 3; i++)
                axis[i] = b.spin[i] / rate;
        set_spin(s, c, axis, rate);
        double y0[NS] = {state[0], state[1], s->ground_elevation, b.velocity[0], b.velocity[1], b.velocity[2], rate};
        dragarc_flight seg;
        memset(&seg, 0, sizeof seg);
        size_t segcap = 0;
        double t_seg = 0.0;
        c->t_offset = t;
        rc = integrate(s, c, method, dt, y0, &seg, &segcap, &t_seg, err);
        if (rc == DRAGARC_OK && (rc = append_segment(out, cap, &seg, t)) != DRAGARC_OK)
            dragarc_error_set(err, DRAGARC_ENOMEM, "", "out of memory for trajectory samples");
        if (rc == DRAGARC_OK) {
            out->notes |= seg.notes;
            out->max_mach = fmax(out->max_mach, seg.max_mach);
            out->max_reynolds = fmax(out->max_reynolds, seg.max_reynolds);
            out->steps += seg.steps;
            out->bounces++;
            memcpy(state, seg.impact, sizeof state);
            t += t_seg;
        }
        dragarc_flight_clear(&seg);
        if (rc != DRAGARC_OK)
            return rc;
    }
}

/* Fly s, sampling every dt or at the listed times (times non-NULL). A track (track = 1) flies through the
 * ground to the last listed time, and ends there with the samples only (no summary). */
static int run(const dragarc_scenario *s, double dt, const double *times, size_t ntimes, int track,
               dragarc_flight *out, dragarc_error *err)
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
    c.times = times;
    c.ntimes = ntimes;
    c.plane = s->ground_elevation;
    c.t_limit = s->solver.max_time;
    if (track) {
        c.plane = -TRACK_DEPTH;
        /* just past the last time, so that the last step holds it */
        if (ntimes > 0)
            c.t_limit = fmin(c.t_limit, times[ntimes - 1] + 1e-9 * (1.0 + times[ntimes - 1]));
    }
    dragarc_forces_init(&c.forces, &s->projectile, &s->atmosphere, &s->wind, s->gravity, s->ground_elevation);
    if (s->projectile.evaporation.enabled) {
        /* The drop's temperature comes from its heat balance at each evaluation (forces.c); reported here is the
         * temperature of a drop at rest in the air at the launch height, and the air's wet bulb there. */
        dragarc_air a0;
        double tw, ts;
        if ((rc = dragarc_atmosphere_eval(&s->atmosphere, s->launch.height, &a0, err)) != DRAGARC_OK ||
            (rc = dragarc_wet_bulb_temperature(a0.temperature, a0.pressure, s->atmosphere.relative_humidity, &tw, err)) !=
                DRAGARC_OK ||
            (rc = dragarc_drop_temperature(a0.temperature, a0.pressure, s->atmosphere.relative_humidity, 1.0, &ts,
                                           err)) != DRAGARC_OK)
            return rc;
        dragarc_forces_evaporation(&c.forces, s->atmosphere.relative_humidity);
        const double dstop = DRAGARC_EVAPORATED_DIAMETER;
        double vstop = DRAGARC_PI / 6.0 * dstop * dstop * dstop;
        c.mass_stop = c.forces.residue_volume < vstop ? vstop / s->projectile.volume : 0.0;
        out->wet_bulb = tw;
        out->drop_temperature = ts;
    }
    if (s->launch.spin_rate > 0.0) {
        double axis[3];
        if (s->launch.spin_axis_given)
            memcpy(axis, s->launch.spin_axis, sizeof axis);
        else
            dragarc_spin_axis(s->launch.spin_tilt, s->launch.azimuth, axis);
        set_spin(s, &c, axis, s->launch.spin_rate);
    } else {
        set_spin(s, &c, NULL, 0.0);
    }
    c.ceiling = dragarc_atmosphere_ceiling(&s->atmosphere);
    dragarc_forces_earth(&c.forces, &s->earth, c.ceiling);
    if (c.forces.spherical)
        out->notes |= DRAGARC_NOTE_SPHERICAL_EARTH;
    if (c.forces.omega[1] != 0.0 || c.forces.omega[2] != 0.0)
        out->notes |= DRAGARC_NOTE_ROTATING_EARTH;

    double y0[NS];
    launch_state(s, y0);
    out->launch_energy = 0.5 * s->projectile.mass * s->launch.speed * s->launch.speed;
    out->vacuum_range = dragarc_vacuum_range(s);
    rc = dragarc_terminal_speed(s, s->launch.height, &out->terminal_speed, err);
    if (rc != DRAGARC_OK)
        return rc;
    out->relaxation_time = out->terminal_speed / s->gravity;

    dragarc_method method = s->solver.method;
    if (method == DRAGARC_METHOD_AUTO) {
        method = DRAGARC_METHOD_DOP853;
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
    rc = integrate(s, &c, method, dt, y0, out, &cap, &t, err);
    if (track && rc == DRAGARC_ENOLAND && c.next_time == ntimes)
        return DRAGARC_OK; /* every listed time flown */
    if (rc != DRAGARC_OK)
        return rc;
    if (track)
        return dragarc_error_set(err, DRAGARC_EINVAL, "track",
                                 "the flight ends (%s) at t = %.6g s, before the track's last point at %.6g s",
                                 out->evaporated ? "the drop evaporates" : "it lands", t, times[ntimes - 1]);
    if (c.forces.spherical) {
        /* the impact as reported on the sphere (earth.h): offsets along the great circle, the height, the velocity
         * in the local frame there; the last row (the impact's) on the ground exactly, as on the flat Earth */
        double cart[6];
        memcpy(cart, out->impact, sizeof cart);
        dragarc_earth_report(c.forces.earth_radius, cart, cart + 3, out->impact);
        if (!out->evaporated) {
            out->impact[2] = s->ground_elevation;
            out->points[out->npoints - 1].pos[2] = s->ground_elevation;
        }
    }
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
    out->total_distance = out->range;
    out->rest_position[0] = ex, out->rest_position[1] = ny;
    out->rest_time = t;
    if (out->evaporated)
        return DRAGARC_OK; /* it never lands: no impact energy, no bounce */
    if (out->impact_energy >= 15.0)
        out->notes |= DRAGARC_NOTE_HIGH_ENERGY;
    if (s->launch.spin_rate > 0.0 || s->ground_surface_given)
        out->notes |= DRAGARC_NOTE_BALL;
    if (s->ground_surface_given)
        return bounce_and_roll(s, &c, method, dt, out, &cap, t, err);
    return DRAGARC_OK;
}

int dragarc_flight_run(const dragarc_scenario *s, double dt, dragarc_flight *out, dragarc_error *err)
{
    return run(s, dt, NULL, 0, 0, out, err);
}

int dragarc_flight_run_at(const dragarc_scenario *s, const double *times, size_t n, dragarc_flight *out,
                          dragarc_error *err)
{
    memset(out, 0, sizeof *out);
    out->terminal_speed = out->vacuum_range = out->relaxation_time = NAN;
    if (n > MAX_SAMPLES)
        return dragarc_error_set(err, DRAGARC_EINVAL, "times", "%zu sample times are more than the %d a flight keeps",
                                 n, MAX_SAMPLES);
    if (n > 0 && !times)
        return dragarc_error_set(err, DRAGARC_EINVAL, "times", "no array of %zu sample times", n);
    for (size_t i = 0; i < n; i++) {
        char field[48];
        snprintf(field, sizeof field, "times[%zu]", i);
        if (!(times[i] >= 0.0 && isfinite(times[i])))
            return dragarc_error_set(err, DRAGARC_EINVAL, field, "must be a finite time since launch, >= 0 (got %g)",
                                     times[i]);
        if (i > 0 && times[i] < times[i - 1])
            return dragarc_error_set(err, DRAGARC_EINVAL, field, "must not come before the time before it (%g < %g)",
                                     times[i], times[i - 1]);
    }
    static const double none = INFINITY; /* no sample due */
    return run(s, 0.0, n ? times : &none, n, 0, out, err);
}

int dragarc_flight_track(const dragarc_scenario *s, const double *times, size_t n, double *states,
                         dragarc_error *err)
{
    if (n == 0 || n > MAX_SAMPLES)
        return dragarc_error_set(err, DRAGARC_EINVAL, "times", "a track needs 1 to %d sample times (got %zu)",
                                 MAX_SAMPLES, n);
    for (size_t i = 0; i < n; i++)
        if (!(times[i] >= 0.0 && isfinite(times[i])) || (i > 0 && !(times[i] > times[i - 1])))
            return dragarc_error_set(err, DRAGARC_EINVAL, "times", "times[%zu] = %g: sample times must be finite, "
                                     ">= 0 and increasing", i, times[i]);
    dragarc_flight f;
    dragarc_error e = {0}; /* the integrator's "no impact" at the last time is no error here */
    int rc = run(s, 0.0, times, n, 1, &f, &e);
    if (rc != DRAGARC_OK && err)
        *err = e;
    if (rc == DRAGARC_OK && f.npoints != n + 1)
        rc = dragarc_error_set(err, DRAGARC_ESOLVER, "track", "the flight kept %zu samples for %zu times",
                               f.npoints - 1, n);
    for (size_t i = 0; rc == DRAGARC_OK && i < n; i++) {
        memcpy(states + 6 * i, f.points[i + 1].pos, 3 * sizeof *states);
        memcpy(states + 6 * i + 3, f.points[i + 1].vel, 3 * sizeof *states);
    }
    dragarc_flight_clear(&f);
    return rc;
}
