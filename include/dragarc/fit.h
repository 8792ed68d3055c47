/* fit.h: drag, lift, wind and launch parameters fitted to a measured flight (a track of positions over time).
 *
 * Copyright (C) 2026 the dragarc developers. SPDX-License-Identifier: GPL-3.0-or-later
 *
 * Weighted nonlinear least squares: the parameters p minimise
 *     chi^2(p) = sum_i sum_k ((x_ik - X_k(t_i; p)) / sigma_ik)^2
 * over the track's points i and components k (east, north, up; and the velocity's, when the track has them),
 * where X(t; p) is the scenario flown with the candidate parameters (dragarc_flight_run_at). Solved by GSL's
 * multifit_nlinear trust-region Levenberg-Marquardt (More 1978), with geodesic acceleration (Transtrum & Sethna
 * 2012) when asked or when plain steps fail. The covariance is (J^T W J)^-1 at the solution; without standard
 * deviations in the track (sigma = 1) it is scaled by the residual variance chi^2 / (N - P). The method and its
 * checks are in docs/fit.md.
 */
#ifndef DRAGARC_FIT_H
#define DRAGARC_FIT_H

#include <stddef.h>

#include "dragarc/dragarc.h"
#include "dragarc/scenario.h"

#ifdef __cplusplus
extern "C" {
#endif

/* The most points a track may hold (limits.md). */
#define DRAGARC_TRACK_MAX_POINTS 100000
/* The largest track file read, in bytes. */
#define DRAGARC_TRACK_MAX_BYTES (64u << 20)

/* A measured flight: positions (and optionally velocities) at times since launch, in the scenario's frame (x east,
 * y north, z up, metres above the site datum) and SI units. Arrays of n, or n x 3 row by row; owned (clear with
 * dragarc_track_clear). */
typedef struct dragarc_track {
    size_t n;
    double *t;      /* s since launch, >= 0, strictly increasing */
    double *pos;    /* m, n x 3 */
    double *vel;    /* m/s, n x 3, or NULL */
    double *pos_sd; /* m, n x 3 standard deviations of the positions, > 0; NULL: unknown (an unweighted fit) */
    double *vel_sd; /* m/s, n x 3, > 0; given whenever vel is */
} dragarc_track;

/* Parse a track from CSV text: a header naming the columns t, x, y, z; optionally vx, vy, vz (all three); sd (one
 * standard deviation for x, y and z) or sd_x, sd_y, sd_z; sd_v or sd_vx, sd_vy, sd_vz. Velocities need standard
 * deviations for both (they weigh metres against metres per second). Errors name "line N: column". *out is
 * cleared on failure. */
int dragarc_track_parse(const char *text, dragarc_track *out, dragarc_error *err);

/* Read and parse a track file. */
int dragarc_track_read(const char *path, dragarc_track *out, dragarc_error *err);

/* Free the arrays and zero the record; safe on a zeroed one. */
void dragarc_track_clear(dragarc_track *t);

/* What can be estimated. */
typedef enum dragarc_fit_param {
    DRAGARC_FIT_CD = 0,           /* a constant C_D (the drag law becomes constant) */
    DRAGARC_FIT_CD_SCALE,         /* a factor on the drag law's C_D curve (drag.cd_scale) */
    DRAGARC_FIT_CL,               /* a constant C_L (the lift law becomes constant; the ball must spin) */
    DRAGARC_FIT_BC,               /* kg/m^2, ballistic coefficient m / (C_D A), C_D the law's nominal one
                                   * (dragarc_fragment_nominal_cd): sets drag.cd_scale */
    DRAGARC_FIT_WIND_SPEED,       /* m/s, the wind's speed (its reference speed for power and log profiles) */
    DRAGARC_FIT_WIND_FROM,        /* rad, the direction it blows from */
    DRAGARC_FIT_LAUNCH_SPEED,     /* m/s */
    DRAGARC_FIT_LAUNCH_ELEVATION, /* rad */
    DRAGARC_FIT_LAUNCH_AZIMUTH,   /* rad */
    DRAGARC_FIT_LAUNCH_HEIGHT,    /* m */
    DRAGARC_FIT_LAUNCH_EAST,      /* m, the launch point's offset east of the frame's origin in the track */
    DRAGARC_FIT_LAUNCH_NORTH,     /* m, ... north */
    DRAGARC_FIT_NPARAMS
} dragarc_fit_param;

/* The name of an estimate ("cd", "launch.speed", ...), and the reverse. dragarc_fit_params_parse also takes
 * "position" for launch.east and launch.north together. */
const char *dragarc_fit_param_name(dragarc_fit_param p);
int dragarc_fit_param_from_name(const char *name, dragarc_fit_param *out);

/* A comma-separated list of names ("cd,launch.speed") into a bit mask of (1u << param); DRAGARC_EINVAL (field
 * "estimate") names an unknown or repeated one, or a pair that is one parameter twice (cd, cd_scale, bc). */
int dragarc_fit_params_parse(const char *list, unsigned *mask, dragarc_error *err);

typedef enum dragarc_fit_accel {
    DRAGARC_FIT_ACCEL_AUTO = 0, /* plain Levenberg-Marquardt; again with geodesic acceleration if that fails */
    DRAGARC_FIT_ACCEL_OFF,      /* plain Levenberg-Marquardt only */
    DRAGARC_FIT_ACCEL_ON        /* geodesic acceleration from the start */
} dragarc_fit_accel;

typedef struct dragarc_fit_options {
    unsigned estimate;      /* bit mask of (1u << dragarc_fit_param), at least one */
    dragarc_fit_accel accel;
    int scenario_start;     /* 1: start from the scenario's values only, never from the track's first points */
    int max_iterations;     /* per attempt (default 200) */
    double xtol;            /* relative step size that ends the search (default 1e-10) */
    double gtol;            /* scaled gradient that ends it (default 1e-12) */
} dragarc_fit_options;

/* Defaults: nothing estimated, accel auto, 200 iterations, xtol 1e-10, gtol 1e-12. */
void dragarc_fit_options_default(dragarc_fit_options *o);

/* Warnings about the result (bit flags). */
enum {
    DRAGARC_FIT_ILL_CONDITIONED = 1u << 0, /* rcond < 0.05: the scaled Jacobian is near singular (see weak_direction) */
    DRAGARC_FIT_CORRELATED = 1u << 1,      /* two estimates correlate beyond 0.99: see worst_pair */
    DRAGARC_FIT_CHISQ_HIGH = 1u << 2,      /* given sigmas: chi^2 / dof far above 1 (p < 0.001), model or sigmas wrong */
    DRAGARC_FIT_CHISQ_LOW = 1u << 3,       /* given sigmas: chi^2 / dof far below 1 (p > 0.999), sigmas too large */
    DRAGARC_FIT_NOT_CONVERGED = 1u << 4,   /* the iterations ran out before a tolerance was met */
    DRAGARC_FIT_AT_LIMIT = 1u << 5         /* an estimate ended against a limit of what can be flown: see at_limit */
};

/* The fit. Arrays are of np (or np x np), in the order of dragarc_fit_param; SI units and radians. */
typedef struct dragarc_fit_result {
    int np;
    dragarc_fit_param param[DRAGARC_FIT_NPARAMS];
    double start[DRAGARC_FIT_NPARAMS];    /* the starting values */
    double value[DRAGARC_FIT_NPARAMS];    /* the estimates */
    double se[DRAGARC_FIT_NPARAMS];       /* their standard errors */
    double lower[DRAGARC_FIT_NPARAMS];    /* 95 % confidence interval (linearised): value -/+ q se, q from */
    double upper[DRAGARC_FIT_NPARAMS];    /* Student's t with dof (unweighted) or the normal law (weighted) */
    double corr[DRAGARC_FIT_NPARAMS * DRAGARC_FIT_NPARAMS]; /* correlation matrix, row by row */
    size_t npoints;      /* track points */
    size_t nresiduals;   /* 3 a point, 6 with velocities */
    size_t dof;          /* nresiduals - np */
    int weighted;        /* 1: the track's standard deviations were used */
    double chisq;        /* sum of squared weighted residuals (unweighted: in m^2) */
    double chisq_p;      /* weighted: probability of a chi^2 at least this large; NaN unweighted */
    double sigma;        /* unweighted: the residual standard deviation sqrt(chisq / dof), m; NaN weighted */
    double rms_pos[4];   /* m: RMS position residual east, north, up, and all three together */
    double rms_vel[4];   /* m/s: the same for velocities (NaN without them) */
    double rcond;        /* reciprocal condition number of the Jacobian with its columns scaled to unit length */
    double weak_direction[DRAGARC_FIT_NPARAMS]; /* the unit combination of (scaled) estimates the data pin least */
    int worst_pair[2];   /* indices of the two most correlated estimates (-1 with one estimate) */
    double worst_corr;
    int iterations;      /* of the attempt that ended the fit */
    long flights;        /* flights flown in all */
    int accel_used;      /* 1: geodesic acceleration */
    int converged;       /* 1: a tolerance was met, with no estimate held at a limit */
    int start_from_track; /* 1: the launch estimates started from values read off the track's first points */
    unsigned at_limit;   /* bit k: estimate k ended against a limit (a side of it could not be flown) */
    unsigned warnings;   /* DRAGARC_FIT_* */
    double *residuals;   /* owned: npoints x 6 (measured minus fitted: position, velocity or NaN), row by row */
} dragarc_fit_result;

/* Fit the estimates o->estimate of scenario s to the track. Starting values are the scenario's; launch estimates
 * start instead from the track's first points (a quadratic in t per coordinate over up to 7 points, at t = 0) when
 * those fit the track better. The flights go on
 * below the scenario's ground as far as the track needs, have no bounces, and are integrated with tolerances at
 * least as tight as rtol 1e-10, atol 1e-9. fitted (NULL: not wanted) receives a copy of s with the estimates in
 * it (caller clears). *r is filled (caller frees with dragarc_fit_result_clear, also after failure).
 * Errors: DRAGARC_EINVAL for a track or estimate the fit cannot use (too few points, residuals at the start too
 * large to square, an estimate without effect or without a starting value, the starting flight ending before the
 * track does), with the field ("track", "estimate", a scenario path); the scenario's own errors from flying it at
 * the start; DRAGARC_ESOLVER when GSL's solver fails. A fit that ends without meeting a tolerance is returned with
 * DRAGARC_FIT_NOT_CONVERGED, not an error. */
int dragarc_fit_run(const dragarc_scenario *s, const dragarc_track *track, const dragarc_fit_options *o,
                    dragarc_fit_result *r, dragarc_scenario *fitted, dragarc_error *err);

/* Free the residuals and zero the record. */
void dragarc_fit_result_clear(dragarc_fit_result *r);

/* Put the values x[0..np-1] of the estimates param[] into scenario s (which owns its drag and lift: a cd estimate
 * makes the drag law constant, a cl estimate the lift law constant); launch.east and .north are not part of a
 * scenario and are skipped. DRAGARC_EINVAL names the field when a value cannot be set (a bc on a law without
 * C_D). */
int dragarc_fit_apply(dragarc_scenario *s, const dragarc_fit_param *param, const double *x, int np,
                      dragarc_error *err);

/* The scenario's current value of an estimate (NaN where it has none: cd of a law that is not constant is its
 * nominal C_D; launch.east and .north are 0). */
double dragarc_fit_value(const dragarc_scenario *s, dragarc_fit_param p);

#ifdef __cplusplus
}
#endif
#endif
