/* fit.c: drag, lift, wind and launch parameters fitted to a measured track by nonlinear least squares.
 * SPDX-License-Identifier: GPL-3.0-or-later
 *
 * The residuals r_ik = (x_ik - X_k(t_i; p)) / sigma_ik compare the track with the scenario flown at the candidate
 * parameters p (dragarc_flight_track: the flight sampled at the track's times, through the ground plane if a
 * candidate comes down early). GSL's multifit_nlinear minimises |r|^2 with its trust-region Levenberg-Marquardt
 * method (More 1978, "The Levenberg-Marquardt algorithm: implementation and theory", in Numerical Analysis,
 * ed. G. A. Watson, Springer LNM 630), optionally with the geodesic acceleration of Transtrum & Sethna (2012, "Improvements to the Levenberg-
 * Marquardt algorithm for nonlinear least-squares minimization", arXiv:1201.5885). The Jacobian is by central
 * differences, with the flights integrated tightly enough (rtol 1e-10) that their error stays far below the
 * difference. At the solution the covariance is C = (J^T J)^-1 (Seber & Wild 1989, "Nonlinear Regression", ch. 2),
 * times s^2 = |r|^2 / (N - P) when the track gives no standard deviations. A candidate that cannot be flown (a
 * negative speed, a C_L above 1) gets a large residual, so the trust region turns the step down.
 */
#include <math.h>
#include <stdlib.h>
#include <string.h>

#include <gsl/gsl_blas.h>
#include <gsl/gsl_cdf.h>
#include <gsl/gsl_errno.h>
#include <gsl/gsl_linalg.h>
#include <gsl/gsl_matrix.h>
#include <gsl/gsl_multifit.h>
#include <gsl/gsl_multifit_nlinear.h>
#include <gsl/gsl_vector.h>

#include "core/constants.h"
#include "dragarc/atmosphere.h"
#include "dragarc/fit.h"
#include "dragarc/footprint.h"
#include "dragarc/lift.h"
#include "numerics/flight_track.h"

/* Residual of a candidate that cannot be flown: far beyond any real misfit, finite for GSL's norms. */
#define UNFLYABLE 1e8

static const struct {
    const char *name;
    double typical; /* a size of the parameter: sets the difference step where the value is near 0 */
} PARAMS[DRAGARC_FIT_NPARAMS] = {
    {"cd", 0.5},
    {"cd_scale", 1.0},
    {"cl", 0.2},
    {"bc", 10.0},
    {"wind.speed", 5.0},
    {"wind.from", 1.0},
    {"launch.speed", 10.0},
    {"launch.elevation", 0.5},
    {"launch.azimuth", 1.0},
    {"launch.height", 1.0},
    {"launch.east", 1.0},
    {"launch.north", 1.0},
};

const char *dragarc_fit_param_name(dragarc_fit_param p)
{
    return (unsigned)p < DRAGARC_FIT_NPARAMS ? PARAMS[p].name : NULL;
}

int dragarc_fit_param_from_name(const char *name, dragarc_fit_param *out)
{
    for (int k = 0; k < DRAGARC_FIT_NPARAMS; k++)
        if (strcmp(name, PARAMS[k].name) == 0) {
            *out = (dragarc_fit_param)k;
            return DRAGARC_OK;
        }
    return DRAGARC_EINVAL;
}

int dragarc_fit_params_parse(const char *list, unsigned *mask, dragarc_error *err)
{
    *mask = 0;
    const char *p = list;
    for (;;) {
        const char *end = strchr(p, ',');
        size_t len = end ? (size_t)(end - p) : strlen(p);
        char name[64];
        if (len == 0 || len >= sizeof name)
            return dragarc_error_set(err, DRAGARC_EINVAL, "estimate",
                                     len ? "'%.40s...' is no estimate" : "an empty name in '%s'", list);
        memcpy(name, p, len);
        name[len] = '\0';
        unsigned bits;
        dragarc_fit_param k;
        if (strcmp(name, "position") == 0)
            bits = 1u << DRAGARC_FIT_LAUNCH_EAST | 1u << DRAGARC_FIT_LAUNCH_NORTH;
        else if (dragarc_fit_param_from_name(name, &k) == DRAGARC_OK)
            bits = 1u << k;
        else
            return dragarc_error_set(err, DRAGARC_EINVAL, "estimate",
                                     "unknown estimate '%s' (cd, cd_scale, cl, bc, wind.speed, wind.from, "
                                     "launch.speed, launch.elevation, launch.azimuth, launch.height, launch.east, "
                                     "launch.north, position)",
                                     name);
        if (*mask & bits)
            return dragarc_error_set(err, DRAGARC_EINVAL, "estimate", "'%s' is named twice", name);
        *mask |= bits;
        if (!end)
            break;
        p = end + 1;
    }
    const unsigned drag = *mask & (1u << DRAGARC_FIT_CD | 1u << DRAGARC_FIT_CD_SCALE | 1u << DRAGARC_FIT_BC);
    if (drag & (drag - 1))
        return dragarc_error_set(err, DRAGARC_EINVAL, "estimate",
                                 "cd, cd_scale and bc are one drag parameter three ways: estimate one of them");
    return DRAGARC_OK;
}

void dragarc_fit_options_default(dragarc_fit_options *o)
{
    memset(o, 0, sizeof *o);
    o->accel = DRAGARC_FIT_ACCEL_AUTO;
    o->max_iterations = 200;
    o->xtol = 1e-10;
    o->gtol = 1e-12;
}

void dragarc_fit_result_clear(dragarc_fit_result *r)
{
    if (!r)
        return;
    free(r->residuals);
    memset(r, 0, sizeof *r);
}

/* The air at the launch, and the flow there: Reynolds number, Mach number, speed. */
static void launch_flow(const dragarc_scenario *s, double *re, double *mach, double *speed)
{
    dragarc_air air;
    *re = 1e6, *mach = 0.5, *speed = s->launch.speed;
    if (dragarc_atmosphere_eval(&s->atmosphere, s->launch.height, &air, NULL) == DRAGARC_OK && air.viscosity > 0.0) {
        *re = air.density * s->launch.speed * s->projectile.diameter / air.viscosity;
        *mach = s->launch.speed / air.speed_of_sound;
    }
}

/* The law's nominal C_D without its scale. */
static double nominal_cd_unscaled(const dragarc_drag *d)
{
    dragarc_drag u = *d;
    u.scale = 1.0;
    return dragarc_fragment_nominal_cd(&u);
}

double dragarc_fit_value(const dragarc_scenario *s, dragarc_fit_param p)
{
    const dragarc_projectile *pr = &s->projectile;
    switch (p) {
    case DRAGARC_FIT_CD: {
        if (pr->drag.model == DRAGARC_DRAG_CONSTANT)
            return dragarc_drag_cd(&pr->drag, 0.0, 0.0, 0.0);
        double re, mach, v;
        launch_flow(s, &re, &mach, &v);
        return dragarc_drag_cd(&pr->drag, re, mach, v);
    }
    case DRAGARC_FIT_CD_SCALE: return dragarc_drag_scale(&pr->drag);
    case DRAGARC_FIT_CL: {
        if (pr->lift.model == DRAGARC_LIFT_CONSTANT)
            return pr->lift.cl;
        double S = s->launch.speed > 0.0 ? 0.5 * pr->diameter * s->launch.spin_rate / s->launch.speed : 0.0;
        return dragarc_lift_coefficient(&pr->lift, S);
    }
    case DRAGARC_FIT_BC: return pr->mass / (dragarc_fragment_nominal_cd(&pr->drag) * pr->area);
    case DRAGARC_FIT_WIND_SPEED: return s->wind.speed;
    case DRAGARC_FIT_WIND_FROM: return s->wind.from;
    case DRAGARC_FIT_LAUNCH_SPEED: return s->launch.speed;
    case DRAGARC_FIT_LAUNCH_ELEVATION: return s->launch.elevation;
    case DRAGARC_FIT_LAUNCH_AZIMUTH: return s->launch.azimuth;
    case DRAGARC_FIT_LAUNCH_HEIGHT: return s->launch.height;
    case DRAGARC_FIT_LAUNCH_EAST:
    case DRAGARC_FIT_LAUNCH_NORTH: return 0.0;
    case DRAGARC_FIT_NPARAMS: break;
    }
    return NAN;
}

/* Whether an estimate can be set on this scenario at all; the reason in err (field "estimate"). */
static int check_estimable(const dragarc_scenario *s, dragarc_fit_param p, dragarc_error *err)
{
    const dragarc_drag_model m = s->projectile.drag.model;
    const char *name = PARAMS[p].name;
    switch (p) {
    case DRAGARC_FIT_CD:
        if (m == DRAGARC_DRAG_NONE || m == DRAGARC_DRAG_LINEAR || m == DRAGARC_DRAG_QUADRATIC)
            return dragarc_error_set(err, DRAGARC_EINVAL, "estimate",
                                     "%s: the drag law is %s, with no C_D to start from: give the scenario a constant "
                                     "law with a starting value ({\"model\": \"constant\", \"cd\": 0.5})",
                                     name, dragarc_drag_model_name(m));
        break;
    case DRAGARC_FIT_CD_SCALE:
        if (m == DRAGARC_DRAG_NONE)
            return dragarc_error_set(err, DRAGARC_EINVAL, "estimate",
                                     "%s: the scenario's projectile has no drag to scale (drag model none)", name);
        break;
    case DRAGARC_FIT_BC:
        if (m == DRAGARC_DRAG_NONE || m == DRAGARC_DRAG_LINEAR || m == DRAGARC_DRAG_QUADRATIC)
            return dragarc_error_set(err, DRAGARC_EINVAL, "estimate",
                                     "%s: a ballistic coefficient needs a drag law written with C_D (constant, sphere, "
                                     "table, spin_table); this one is %s",
                                     name, dragarc_drag_model_name(m));
        break;
    case DRAGARC_FIT_CL:
        if (!(s->launch.spin_rate > 0.0))
            return dragarc_error_set(err, DRAGARC_EINVAL, "estimate",
                                     "%s: the ball does not spin (launch.spin.rate is 0), so C_L has no effect", name);
        break;
    case DRAGARC_FIT_WIND_SPEED:
    case DRAGARC_FIT_WIND_FROM:
        if (s->wind.model == DRAGARC_WIND_NONE || s->wind.model == DRAGARC_WIND_LAYERED)
            return dragarc_error_set(err, DRAGARC_EINVAL, "estimate",
                                     "%s: needs a starting wind of model constant, power or log in the scenario "
                                     "(this one is %s)",
                                     name, s->wind.model == DRAGARC_WIND_NONE ? "none" : "layered, a speed per row");
        break;
    default: break;
    }
    return DRAGARC_OK;
}

int dragarc_fit_apply(dragarc_scenario *s, const dragarc_fit_param *param, const double *x, int np,
                      dragarc_error *err)
{
    dragarc_projectile *pr = &s->projectile;
    for (int k = 0; k < np; k++) {
        const double v = x[k];
        int rc = check_estimable(s, param[k], err);
        if (rc != DRAGARC_OK)
            return rc;
        switch (param[k]) {
        case DRAGARC_FIT_CD:
            dragarc_drag_clear(&pr->drag);
            pr->drag.model = DRAGARC_DRAG_CONSTANT;
            pr->drag.cd = v;
            break;
        case DRAGARC_FIT_CD_SCALE:
            if (!(v > 0.0)) /* a scale of 0 would read as 1 */
                return dragarc_error_set(err, DRAGARC_EINVAL, "cd_scale", "must be positive (got %g)", v);
            pr->drag.scale = v;
            break;
        case DRAGARC_FIT_BC: {
            double cd0 = nominal_cd_unscaled(&pr->drag);
            if (!(v > 0.0 && cd0 > 0.0))
                return dragarc_error_set(err, DRAGARC_EINVAL, "bc", "must be positive (got %g)", v);
            pr->drag.scale = pr->mass / (v * cd0 * pr->area);
            break;
        }
        case DRAGARC_FIT_CL:
            dragarc_lift_clear(&pr->lift);
            pr->lift.model = DRAGARC_LIFT_CONSTANT;
            pr->lift.cl = v;
            break;
        case DRAGARC_FIT_WIND_SPEED:
            /* a negative speed is the same wind from the other side, which keeps the residuals smooth through 0 */
            s->wind.speed = fabs(v);
            if (v < 0.0)
                s->wind.from = fmod(s->wind.from + DRAGARC_PI, 2.0 * DRAGARC_PI);
            break;
        case DRAGARC_FIT_WIND_FROM: s->wind.from = v; break;
        case DRAGARC_FIT_LAUNCH_SPEED: s->launch.speed = v; break;
        case DRAGARC_FIT_LAUNCH_ELEVATION: s->launch.elevation = v; break;
        case DRAGARC_FIT_LAUNCH_AZIMUTH: s->launch.azimuth = v; break;
        case DRAGARC_FIT_LAUNCH_HEIGHT: s->launch.height = v; break;
        case DRAGARC_FIT_LAUNCH_EAST:
        case DRAGARC_FIT_LAUNCH_NORTH:
        case DRAGARC_FIT_NPARAMS: break;
        }
    }
    /* wind.from before wind.speed in the list would undo a flip made for a negative speed: apply the speed last */
    for (int k = 0; k < np; k++)
        if (param[k] == DRAGARC_FIT_WIND_FROM)
            for (int j = 0; j < np; j++)
                if (param[j] == DRAGARC_FIT_WIND_SPEED && x[j] < 0.0)
                    s->wind.from = fmod(x[k] + DRAGARC_PI, 2.0 * DRAGARC_PI);
    return DRAGARC_OK;
}

/* What the residual and Jacobian functions share. */
typedef struct fit_ctx {
    const dragarc_scenario *base; /* the scenario as given, with the fit's solver settings */
    const dragarc_track *track;
    dragarc_fit_param param[DRAGARC_FIT_NPARAMS];
    int np;
    size_t width;       /* residuals a point: 3, or 6 with velocities */
    double *states;     /* n x 6, the last flight's */
    long flights;
    dragarc_error first_err; /* why the first unflyable candidate failed */
    int unflyable;
    unsigned one_sided; /* bit k: the last Jacobian's column k was one-sided (a side could not be flown) */
} fit_ctx;

/* Fly the candidate x; the predicted states (with the launch offsets) in c->states. */
static int fly(fit_ctx *c, const double *x, double *states, dragarc_error *err)
{
    dragarc_scenario s;
    int rc = dragarc_scenario_copy(&s, c->base, err);
    if (rc == DRAGARC_OK)
        rc = dragarc_fit_apply(&s, c->param, x, c->np, err);
    if (rc == DRAGARC_OK) {
        c->flights++;
        rc = dragarc_flight_track(&s, c->track->t, c->track->n, states, err);
    }
    dragarc_scenario_clear(&s);
    if (rc != DRAGARC_OK)
        return rc;
    for (int k = 0; k < c->np; k++)
        if (c->param[k] == DRAGARC_FIT_LAUNCH_EAST || c->param[k] == DRAGARC_FIT_LAUNCH_NORTH)
            for (size_t i = 0; i < c->track->n; i++)
                states[6 * i + (c->param[k] == DRAGARC_FIT_LAUNCH_EAST ? 0 : 1)] += x[k];
    return DRAGARC_OK;
}

/* The weighted residuals (measured - fitted) / sigma of states into f. */
static void weigh(const fit_ctx *c, const double *states, double *f)
{
    const dragarc_track *t = c->track;
    for (size_t i = 0; i < t->n; i++) {
        double *r = f + c->width * i;
        for (int k = 0; k < 3; k++) {
            r[k] = t->pos[3 * i + k] - states[6 * i + k];
            if (t->pos_sd)
                r[k] /= t->pos_sd[3 * i + k];
            if (c->width == 6)
                r[3 + k] = (t->vel[3 * i + k] - states[6 * i + 3 + k]) / t->vel_sd[3 * i + k];
        }
    }
}

/* The residual vector at x, or UNFLYABLE everywhere when x cannot be flown. */
static int eval_f(fit_ctx *c, const double *x, double *f)
{
    dragarc_error e = {0};
    if (fly(c, x, c->states, &e) != DRAGARC_OK) {
        if (!c->unflyable)
            c->first_err = e;
        c->unflyable++;
        const size_t n = c->width * c->track->n;
        for (size_t i = 0; i < n; i++)
            f[i] = UNFLYABLE;
        return -1;
    }
    weigh(c, c->states, f);
    return 0;
}

/* DRAGARC_OK when the squared residuals of the flown states sum to a finite number, weighted and in metres; else an
 * error naming the track. A position or standard deviation far out of scale (x = 1e300 m, sd = 1e-200 m) would
 * give an infinite chi-square, and standard errors of 0 or infinity printed as a result. */
static int check_scale(const fit_ctx *c, const double *states, dragarc_error *err)
{
    const dragarc_track *t = c->track;
    double *f = malloc(c->width * t->n * sizeof *f);
    if (!f)
        return dragarc_error_set(err, DRAGARC_ENOMEM, "", "out of memory for the residuals");
    weigh(c, states, f);
    double sw = 0.0, su = 0.0;
    for (size_t i = 0; i < c->width * t->n; i++)
        sw += f[i] * f[i];
    free(f);
    for (size_t i = 0; i < t->n; i++)
        for (int k = 0; k < 3; k++) {
            const double dp = t->pos[3 * i + k] - states[6 * i + k];
            const double dv = t->vel ? t->vel[3 * i + k] - states[6 * i + 3 + k] : 0.0;
            su += dp * dp + dv * dv;
        }
    if (isfinite(sw) && isfinite(su))
        return DRAGARC_OK;
    return dragarc_error_set(err, DRAGARC_EINVAL, "track",
                             "the residuals of the starting flight are too large to square: a position, velocity or "
                             "standard deviation is far out of scale (metres and metres per second)");
}

static int gsl_f(const gsl_vector *x, void *params, gsl_vector *f)
{
    fit_ctx *c = params;
    double xv[DRAGARC_FIT_NPARAMS];
    for (int k = 0; k < c->np; k++)
        xv[k] = gsl_vector_get(x, (size_t)k);
    eval_f(c, xv, f->data); /* f is GSL's own contiguous vector */
    return GSL_SUCCESS;
}

/* The difference step of parameter k at value v. */
static double step(const fit_ctx *c, int k, double v)
{
    return 1e-5 * fmax(fabs(v), PARAMS[c->param[k]].typical);
}

/* The Jacobian of the residuals by central differences (one-sided where a side cannot be flown). */
static int jacobian(fit_ctx *c, const double *x, gsl_matrix *J)
{
    const size_t m = c->width * c->track->n;
    double *fp = malloc(2 * m * sizeof *fp);
    if (!fp)
        return GSL_ENOMEM;
    double *fm = fp + m;
    double *f0 = NULL; /* the centre, flown when a side cannot be */
    int status = GSL_SUCCESS;
    c->one_sided = 0;
    for (int k = 0; k < c->np && status == GSL_SUCCESS; k++) {
        double xv[DRAGARC_FIT_NPARAMS];
        memcpy(xv, x, (size_t)c->np * sizeof *xv);
        const double h = step(c, k, x[k]);
        xv[k] = x[k] + h;
        int okp = eval_f(c, xv, fp) == 0;
        xv[k] = x[k] - h;
        int okm = eval_f(c, xv, fm) == 0;
        double span = 2.0 * h;
        if (!okp || !okm) {
            /* one side: against the centre */
            if (!f0) {
                f0 = malloc(m * sizeof *f0);
                if (!f0 || eval_f(c, x, f0) != 0) {
                    status = f0 ? GSL_EBADFUNC : GSL_ENOMEM;
                    break;
                }
            }
            if (!okp && !okm) {
                status = GSL_EBADFUNC;
                break;
            }
            if (!okp)
                memcpy(fp, f0, m * sizeof *fp);
            else
                memcpy(fm, f0, m * sizeof *fm);
            span = h;
            c->one_sided |= 1u << k;
        }
        for (size_t i = 0; i < m; i++)
            gsl_matrix_set(J, i, (size_t)k, (fp[i] - fm[i]) / span);
    }
    free(f0);
    free(fp);
    return status;
}

static int gsl_df(const gsl_vector *x, void *params, gsl_matrix *J)
{
    fit_ctx *c = params;
    double xv[DRAGARC_FIT_NPARAMS];
    for (int k = 0; k < c->np; k++)
        xv[k] = gsl_vector_get(x, (size_t)k);
    return jacobian(c, xv, J);
}

/* The launch read off the track: a quadratic in t fitted by least squares to each coordinate of its first points
 * (at most START_POINTS), taken at t = 0: position p0 (m) and velocity v0 (m/s). -1 when the track is too short or
 * GSL fails. */
#define START_POINTS 7
static int track_launch(const dragarc_track *t, double p0[3], double v0[3])
{
    const size_t m = t->n < START_POINTS ? t->n : START_POINTS;
    if (m < 3)
        return -1;
    gsl_matrix *X = gsl_matrix_alloc(m, 3), *cov = gsl_matrix_alloc(3, 3);
    gsl_vector *y = gsl_vector_alloc(m), *c = gsl_vector_alloc(3);
    gsl_multifit_linear_workspace *w = gsl_multifit_linear_alloc(m, 3);
    int rc = X && cov && y && c && w ? 0 : -1;
    for (size_t i = 0; i < m && rc == 0; i++) {
        gsl_matrix_set(X, i, 0, 1.0);
        gsl_matrix_set(X, i, 1, t->t[i]);
        gsl_matrix_set(X, i, 2, t->t[i] * t->t[i]);
    }
    for (int k = 0; k < 3 && rc == 0; k++) {
        double chisq;
        for (size_t i = 0; i < m; i++)
            gsl_vector_set(y, i, t->pos[3 * i + k]);
        if (gsl_multifit_linear(X, y, c, cov, &chisq, w) != GSL_SUCCESS)
            rc = -1;
        p0[k] = gsl_vector_get(c, 0);
        v0[k] = gsl_vector_get(c, 1);
    }
    gsl_matrix_free(X), gsl_matrix_free(cov), gsl_vector_free(y), gsl_vector_free(c);
    if (w)
        gsl_multifit_linear_free(w);
    return rc == 0 && isfinite(p0[0] + p0[1] + p0[2] + v0[0] + v0[1] + v0[2]) ? 0 : -1;
}

/* The start: the scenario's values, or, when launch values are estimated, those read off the track in their place,
 * whichever fits the track better (a placeholder launch in the scenario then does no harm). Returns 1 when the
 * track's were taken. */
static int choose_start(fit_ctx *c, double *x, double *f)
{
    double p0[3], v0[3], xt[DRAGARC_FIT_NPARAMS];
    if (track_launch(c->track, p0, v0) != 0)
        return 0;
    int any = 0;
    for (int k = 0; k < c->np; k++) {
        double v = x[k];
        switch (c->param[k]) {
        case DRAGARC_FIT_LAUNCH_SPEED: v = sqrt(v0[0] * v0[0] + v0[1] * v0[1] + v0[2] * v0[2]); break;
        case DRAGARC_FIT_LAUNCH_ELEVATION: v = atan2(v0[2], hypot(v0[0], v0[1])); break;
        case DRAGARC_FIT_LAUNCH_AZIMUTH:
            if (hypot(v0[0], v0[1]) > 0.0)
                v = atan2(v0[0], v0[1]);
            break;
        case DRAGARC_FIT_LAUNCH_HEIGHT: v = p0[2]; break;
        case DRAGARC_FIT_LAUNCH_EAST: v = p0[0]; break;
        case DRAGARC_FIT_LAUNCH_NORTH: v = p0[1]; break;
        default: break;
        }
        any |= v != x[k];
        xt[k] = v;
    }
    if (!any)
        return 0;
    const size_t m = c->width * c->track->n;
    if (eval_f(c, x, f) != 0)
        return eval_f(c, xt, f) == 0 ? (memcpy(x, xt, (size_t)c->np * sizeof *x), 1) : 0;
    double cost_scenario = 0.0, cost_track = 0.0;
    for (size_t i = 0; i < m; i++)
        cost_scenario += f[i] * f[i];
    if (eval_f(c, xt, f) != 0)
        return 0;
    for (size_t i = 0; i < m; i++)
        cost_track += f[i] * f[i];
    if (!(cost_track < cost_scenario))
        return 0;
    memcpy(x, xt, (size_t)c->np * sizeof *x);
    return 1;
}

/* One attempt from x0; the status of GSL's driver, the workspace left for the caller to read. */
static int attempt(fit_ctx *c, const dragarc_fit_options *o, int accel, const gsl_vector *x0,
                   gsl_multifit_nlinear_fdf *fdf, gsl_multifit_nlinear_workspace **wout, int *info)
{
    gsl_multifit_nlinear_parameters params = gsl_multifit_nlinear_default_parameters();
    params.trs = accel ? gsl_multifit_nlinear_trs_lmaccel : gsl_multifit_nlinear_trs_lm;
    gsl_multifit_nlinear_workspace *w =
        gsl_multifit_nlinear_alloc(gsl_multifit_nlinear_trust, &params, fdf->n, fdf->p);
    *wout = w;
    if (!w)
        return GSL_ENOMEM;
    int st = gsl_multifit_nlinear_init(x0, fdf, w);
    if (st != GSL_SUCCESS)
        return st;
    (void)c;
    *info = 0;
    return gsl_multifit_nlinear_driver((size_t)o->max_iterations, o->xtol, o->gtol, 0.0, NULL, NULL, info, w);
}

/* The statistics of the solution: covariance, intervals, conditioning, residual summaries. */
static int summarise(fit_ctx *c, const gsl_vector *x, gsl_matrix *J, double chisq, dragarc_fit_result *r,
                     dragarc_error *err)
{
    const int np = c->np;
    const size_t m = J->size1, p = (size_t)np;
    gsl_matrix *cov = gsl_matrix_alloc(p, p), *A = gsl_matrix_alloc(m, p), *V = gsl_matrix_alloc(p, p);
    gsl_vector *S = gsl_vector_alloc(p), *work = gsl_vector_alloc(p);
    int rc = DRAGARC_OK;
    if (!cov || !A || !V || !S || !work) {
        rc = dragarc_error_set(err, DRAGARC_ENOMEM, "", "out of memory for the fit's statistics");
        goto done;
    }
    r->chisq = chisq;
    if (gsl_multifit_nlinear_covar(J, 0.0, cov) != GSL_SUCCESS) {
        rc = dragarc_error_set(err, DRAGARC_ESOLVER, "estimate", "GSL could not form the covariance matrix");
        goto done;
    }
    double scale2 = 1.0, q;
    if (r->weighted) {
        r->chisq_p = gsl_cdf_chisq_Q(chisq, (double)r->dof);
        r->sigma = NAN;
        q = gsl_cdf_ugaussian_Pinv(0.975);
        if (r->chisq_p < 1e-3)
            r->warnings |= DRAGARC_FIT_CHISQ_HIGH;
        else if (r->chisq_p > 0.999)
            r->warnings |= DRAGARC_FIT_CHISQ_LOW;
    } else {
        scale2 = chisq / (double)r->dof;
        r->chisq_p = NAN;
        r->sigma = sqrt(scale2);
        q = gsl_cdf_tdist_Pinv(0.975, (double)r->dof);
    }
    for (int k = 0; k < np; k++) {
        r->value[k] = gsl_vector_get(x, (size_t)k);
        r->se[k] = sqrt(scale2 * gsl_matrix_get(cov, (size_t)k, (size_t)k));
    }
    r->worst_pair[0] = r->worst_pair[1] = -1;
    r->worst_corr = 0.0;
    for (int i = 0; i < np; i++)
        for (int j = 0; j < np; j++) {
            double cij = gsl_matrix_get(cov, (size_t)i, (size_t)j) /
                         sqrt(gsl_matrix_get(cov, (size_t)i, (size_t)i) * gsl_matrix_get(cov, (size_t)j, (size_t)j));
            r->corr[i * np + j] = i == j ? 1.0 : cij;
            if (i < j && fabs(cij) > fabs(r->worst_corr)) {
                r->worst_corr = cij;
                r->worst_pair[0] = i, r->worst_pair[1] = j;
            }
        }
    if (fabs(r->worst_corr) > 0.99)
        r->warnings |= DRAGARC_FIT_CORRELATED;
    /* conditioning of J with unit columns: free of the parameters' units (Golub & Van Loan, 4th ed., 2013, 8.6) */
    gsl_matrix_memcpy(A, J);
    for (size_t k = 0; k < p; k++) {
        gsl_vector_view col = gsl_matrix_column(A, k);
        double nrm = gsl_blas_dnrm2(&col.vector);
        if (nrm > 0.0)
            gsl_vector_scale(&col.vector, 1.0 / nrm);
    }
    if (m >= p && gsl_linalg_SV_decomp(A, V, S, work) == GSL_SUCCESS) {
        double smax = gsl_vector_get(S, 0), smin = gsl_vector_get(S, p - 1);
        r->rcond = smax > 0.0 ? smin / smax : 0.0;
        for (size_t k = 0; k < p; k++)
            r->weak_direction[k] = gsl_matrix_get(V, k, p - 1);
        /* a sign that makes the largest component positive, so the direction reads the same on every machine */
        size_t big = 0;
        for (size_t k = 1; k < p; k++)
            if (fabs(r->weak_direction[k]) > fabs(r->weak_direction[big]))
                big = k;
        if (r->weak_direction[big] < 0.0)
            for (size_t k = 0; k < p; k++)
                r->weak_direction[k] = -r->weak_direction[k];
    }
    /* With two estimates whose columns meet at correlation rho, rcond = sqrt((1 - rho) / (1 + rho)): 0.05 is a
     * pair at 0.995, just past the correlation warning's 0.99, and the same bar catches near-dependences among
     * three or more estimates that no pair shows (threshold: common practice, no source) */
    if (r->rcond < 0.05)
        r->warnings |= DRAGARC_FIT_ILL_CONDITIONED;
    for (int k = 0; k < np; k++) {
        r->lower[k] = r->value[k] - q * r->se[k];
        r->upper[k] = r->value[k] + q * r->se[k];
    }
done:
    gsl_matrix_free(cov), gsl_matrix_free(A), gsl_matrix_free(V);
    gsl_vector_free(S), gsl_vector_free(work);
    return rc;
}

/* The unweighted residuals (measured - fitted) at the solution, and their RMS. */
static int residuals(fit_ctx *c, const double *x, dragarc_fit_result *r, dragarc_error *err)
{
    const dragarc_track *t = c->track;
    int rc = fly(c, x, c->states, err);
    if (rc != DRAGARC_OK)
        return rc;
    r->residuals = malloc(6 * t->n * sizeof *r->residuals);
    if (!r->residuals)
        return dragarc_error_set(err, DRAGARC_ENOMEM, "", "out of memory for the residuals");
    double sp[4] = {0, 0, 0, 0}, sv[4] = {0, 0, 0, 0};
    for (size_t i = 0; i < t->n; i++)
        for (int k = 0; k < 3; k++) {
            double dp = t->pos[3 * i + k] - c->states[6 * i + k];
            double dv = t->vel ? t->vel[3 * i + k] - c->states[6 * i + 3 + k] : NAN;
            r->residuals[6 * i + k] = dp;
            r->residuals[6 * i + 3 + k] = dv;
            sp[k] += dp * dp, sp[3] += dp * dp;
            sv[k] += dv * dv, sv[3] += dv * dv;
        }
    const double n = (double)t->n;
    for (int k = 0; k < 4; k++) {
        r->rms_pos[k] = sqrt(sp[k] / (k == 3 ? 3.0 * n : n));
        r->rms_vel[k] = t->vel ? sqrt(sv[k] / (k == 3 ? 3.0 * n : n)) : NAN;
    }
    return DRAGARC_OK;
}

/* The estimates in a form that reads well: angles in [0, 2 pi), a negative wind speed turned round when its
 * direction is estimated too (with the signs of its correlations). */
static void tidy(dragarc_fit_result *r)
{
    int ks = -1, kf = -1;
    for (int k = 0; k < r->np; k++) {
        if (r->param[k] == DRAGARC_FIT_WIND_SPEED)
            ks = k;
        if (r->param[k] == DRAGARC_FIT_WIND_FROM)
            kf = k;
    }
    if (ks >= 0 && kf >= 0 && r->value[ks] < 0.0) {
        r->value[ks] = -r->value[ks];
        double lo = r->lower[ks];
        r->lower[ks] = -r->upper[ks], r->upper[ks] = -lo;
        r->value[kf] += DRAGARC_PI, r->lower[kf] += DRAGARC_PI, r->upper[kf] += DRAGARC_PI;
        for (int j = 0; j < r->np; j++)
            if (j != ks) {
                r->corr[ks * r->np + j] = -r->corr[ks * r->np + j];
                r->corr[j * r->np + ks] = -r->corr[j * r->np + ks];
            }
        if (r->worst_pair[0] == ks || r->worst_pair[1] == ks)
            r->worst_corr = -r->worst_corr;
        r->weak_direction[ks] = -r->weak_direction[ks];
    }
    for (int k = 0; k < r->np; k++)
        if (r->param[k] == DRAGARC_FIT_WIND_FROM || r->param[k] == DRAGARC_FIT_LAUNCH_AZIMUTH) {
            double turn = floor(r->value[k] / (2.0 * DRAGARC_PI)) * 2.0 * DRAGARC_PI;
            r->value[k] -= turn, r->lower[k] -= turn, r->upper[k] -= turn, r->start[k] = fmod(r->start[k], 2.0 * DRAGARC_PI);
        }
}

int dragarc_fit_run(const dragarc_scenario *s, const dragarc_track *track, const dragarc_fit_options *o,
                    dragarc_fit_result *r, dragarc_scenario *fitted, dragarc_error *err)
{
    memset(r, 0, sizeof *r);
    if (fitted)
        dragarc_scenario_default(fitted);
    if (!o->estimate || o->estimate >> DRAGARC_FIT_NPARAMS)
        return dragarc_error_set(err, DRAGARC_EINVAL, "estimate", "name at least one parameter to estimate");
    if (!(o->max_iterations > 0 && o->xtol > 0.0 && o->gtol > 0.0))
        return dragarc_error_set(err, DRAGARC_EINVAL, "options", "iterations and tolerances must be positive");
    fit_ctx c = {.base = NULL, .track = track};
    for (int k = 0; k < DRAGARC_FIT_NPARAMS; k++)
        if (o->estimate & (1u << k))
            c.param[c.np++] = (dragarc_fit_param)k;
    c.width = track->vel ? 6 : 3;
    r->np = c.np;
    memcpy(r->param, c.param, sizeof r->param);
    r->npoints = track->n;
    r->nresiduals = c.width * track->n;
    r->weighted = track->pos_sd != NULL;
    if (track->n < 3)
        return dragarc_error_set(err, DRAGARC_EINVAL, "track", "%zu point%s too few: a fit needs at least 3",
                                 track->n, track->n == 1 ? " is" : "s are");
    if (r->nresiduals <= (size_t)c.np)
        return dragarc_error_set(err, DRAGARC_EINVAL, "track",
                                 "%zu points give %zu residuals, no more than the %d estimates: measure more points",
                                 track->n, r->nresiduals, c.np);
    r->dof = r->nresiduals - (size_t)c.np;
    /* flown past solver.max_time, a track would fail as "no ground impact", blaming the scenario */
    if (track->t[track->n - 1] > s->solver.max_time)
        return dragarc_error_set(err, DRAGARC_EINVAL, "track",
                                 "the last point is at t = %g s, after the scenario's solver.max_time of %g s: the "
                                 "times must be seconds since launch (or raise solver.max_time)",
                                 track->t[track->n - 1], s->solver.max_time);
    for (int k = 0; k < c.np; k++) {
        int rc = check_estimable(s, c.param[k], err);
        if (rc != DRAGARC_OK)
            return rc;
        r->start[k] = dragarc_fit_value(s, c.param[k]);
        if (!isfinite(r->start[k]))
            return dragarc_error_set(err, DRAGARC_EINVAL, "estimate", "%s: the scenario gives no starting value",
                                     PARAMS[c.param[k]].name);
    }

    dragarc_scenario base;
    int rc = dragarc_scenario_copy(&base, s, err);
    if (rc != DRAGARC_OK)
        return rc;
    base.solver.rtol = fmin(base.solver.rtol, 1e-10);
    base.solver.atol = fmin(base.solver.atol, 1e-9);
    base.ground_surface_given = 0;
    c.base = &base;
    const size_t m = r->nresiduals, p = (size_t)c.np;
    c.states = malloc(6 * track->n * sizeof *c.states);
    gsl_vector *x0 = gsl_vector_alloc(p);
    gsl_matrix *J0 = gsl_matrix_alloc(m, p);
    gsl_multifit_nlinear_workspace *w = NULL, *w2 = NULL;
    if (!c.states || !x0 || !J0) {
        rc = dragarc_error_set(err, DRAGARC_ENOMEM, "", "out of memory for a fit of %zu residuals", m);
        goto done;
    }
    {
        double *f = malloc(m * sizeof *f);
        if (!f) {
            rc = dragarc_error_set(err, DRAGARC_ENOMEM, "", "out of memory for a fit of %zu residuals", m);
            goto done;
        }
        r->start_from_track = o->scenario_start ? 0 : choose_start(&c, r->start, f);
        free(f);
        c.unflyable = 0;
    }
    for (int k = 0; k < c.np; k++)
        gsl_vector_set(x0, (size_t)k, r->start[k]);
    /* the start must fly, and every estimate must move the track */
    if ((rc = fly(&c, r->start, c.states, err)) != DRAGARC_OK ||
        (rc = check_scale(&c, c.states, err)) != DRAGARC_OK)
        goto done;
    if (jacobian(&c, r->start, J0) != GSL_SUCCESS) {
        rc = c.unflyable ? (*err = c.first_err, err->code) :
                           dragarc_error_set(err, DRAGARC_ENOMEM, "", "out of memory for the Jacobian");
        goto done;
    }
    for (size_t k = 0; k < p; k++) {
        gsl_vector_view col = gsl_matrix_column(J0, k);
        if (!(gsl_blas_dnrm2(&col.vector) > 0.0)) {
            rc = dragarc_error_set(err, DRAGARC_EINVAL, "estimate", "%s has no effect on this track",
                                   PARAMS[c.param[k]].name);
            goto done;
        }
    }
    gsl_multifit_nlinear_fdf fdf = {.f = gsl_f, .df = gsl_df, .fvv = NULL, .n = m, .p = p, .params = &c};
    int info = 0, st;
    int accel = o->accel == DRAGARC_FIT_ACCEL_ON;
    st = attempt(&c, o, accel, x0, &fdf, &w, &info);
    if (st == GSL_ENOMEM || !w) {
        rc = dragarc_error_set(err, DRAGARC_ENOMEM, "", "out of memory for GSL's least-squares workspace");
        goto done;
    }
    if (st != GSL_SUCCESS && o->accel == DRAGARC_FIT_ACCEL_AUTO) {
        /* plain steps stalled: again from the start with geodesic acceleration, kept if it does better */
        int info2 = 0;
        int st2 = attempt(&c, o, 1, x0, &fdf, &w2, &info2);
        if (w2 && (st2 == GSL_SUCCESS || (st2 != GSL_EBADFUNC && st2 != GSL_ENOMEM &&
                                          gsl_blas_dnrm2(gsl_multifit_nlinear_residual(w2)) <
                                              gsl_blas_dnrm2(gsl_multifit_nlinear_residual(w))))) {
            gsl_multifit_nlinear_free(w);
            w = w2, w2 = NULL, st = st2, info = info2, accel = 1;
        }
    }
    if (st == GSL_EBADFUNC || st == GSL_ENOMEM) {
        rc = c.unflyable ? (*err = c.first_err, err->code)
                         : dragarc_error_set(err, DRAGARC_ESOLVER, "estimate", "GSL's least-squares solver failed: %s",
                                             gsl_strerror(st));
        goto done;
    }
    r->accel_used = accel;
    r->iterations = (int)gsl_multifit_nlinear_niter(w);
    r->converged = st == GSL_SUCCESS;
    if (!r->converged)
        r->warnings |= DRAGARC_FIT_NOT_CONVERGED;
    const gsl_vector *x = gsl_multifit_nlinear_position(w);
    double xs[DRAGARC_FIT_NPARAMS];
    for (size_t k = 0; k < p; k++)
        xs[k] = gsl_vector_get(x, k);
    /* the statistics from a fresh Jacobian at the solution */
    if (jacobian(&c, xs, J0) != GSL_SUCCESS) {
        rc = c.unflyable ? (*err = c.first_err, err->code)
                         : dragarc_error_set(err, DRAGARC_ENOMEM, "", "out of memory for the Jacobian");
        goto done;
    }
    /* an estimate held against a limit of what can be flown (C_D near 0, C_L at 1) was stopped there, not at a
     * minimum of the residuals: the search ended on the wall the unflyable side makes */
    r->at_limit = c.one_sided;
    if (r->at_limit) {
        r->warnings |= DRAGARC_FIT_AT_LIMIT;
        r->converged = 0;
    }
    double chi = gsl_blas_dnrm2(gsl_multifit_nlinear_residual(w));
    if ((rc = summarise(&c, x, J0, chi * chi, r, err)) != DRAGARC_OK)
        goto done;
    if ((rc = residuals(&c, xs, r, err)) != DRAGARC_OK)
        goto done;
    tidy(r);
    if (fitted) {
        if ((rc = dragarc_scenario_copy(fitted, s, err)) == DRAGARC_OK)
            rc = dragarc_fit_apply(fitted, r->param, r->value, r->np, err);
    }
done:
    r->flights = c.flights;
    dragarc_scenario_clear(&base);
    free(c.states);
    gsl_vector_free(x0);
    gsl_matrix_free(J0);
    if (w)
        gsl_multifit_nlinear_free(w);
    if (w2)
        gsl_multifit_nlinear_free(w2);
    if (rc != DRAGARC_OK && fitted)
        dragarc_scenario_clear(fitted);
    return rc;
}
