/* dop853.h: an explicit Runge-Kutta stepper of order 8 with error estimators of orders 5 and 3 and a
 * continuous extension of order 7, for the state of one flight (private to numerics/).
 * SPDX-License-Identifier: GPL-3.0-or-later
 *
 * The method is Dormand & Prince's 8(5,3) pair as published by Hairer, Norsett & Wanner (1993),
 * Solving Ordinary Differential Equations I, 2nd ed., Springer, section II.10 and the code DOP853
 * described there. The caller drives it one accepted step at a time and asks for the continuous
 * extension only on the steps where it needs states between the step's ends (events, samples).
 */
#ifndef DRAGARC_DOP853_H
#define DRAGARC_DOP853_H

#define DOP853_N 8 /* position, velocity, spin rate, mass */

/* Right-hand side f(t, y) -> dydt; returns 0, or non-zero when y cannot be evaluated (the stepper then
 * retries with a shorter step, and gives up after DOP853_MAX_RETRIES in a row). */
typedef int (*dop853_rhs)(double t, const double y[DOP853_N], double dydt[DOP853_N], void *user);

/* Optional: the longest step worth trying from (t, y), f = f(t, y), when the error control proposes h; for
 * right-hand sides with known places where they are not smooth, so that a step ends just past such a
 * place instead of being rejected over it. Return h itself for no limit. */
typedef double (*dop853_limit)(double t, const double y[DOP853_N], const double f[DOP853_N], double h, void *user);

enum {
    DOP853_OK = 0,
    DOP853_ERHS = -1,      /* the right-hand side failed DOP853_MAX_RETRIES times running */
    DOP853_ESTEPSIZE = -2, /* the step size fell below round-off of t */
    DOP853_EEND = -3       /* t has reached the end time: no step to take */
};
#define DOP853_MAX_RETRIES 30

typedef struct dop853 {
    dop853_rhs f;
    dop853_limit limit; /* NULL: none (set after dop853_init) */
    void *user;
    double rtol, atol; /* per component: |local error_i| weighted by 1 / (atol + rtol max(|y_i|, |y_new_i|)) */
    int n_err;         /* components counted in the error norm's mean (DOP853_N after init): a component the
                        * caller knows to stay exactly zero may be left out, so as not to dilute the others */
    int n;             /* components stepped: 6 (the last two then keep their values and zero slopes: the caller
                        * guarantees both) or DOP853_N (after init) */
    double t, y[DOP853_N], fy[DOP853_N];                 /* the last accepted state and f there */
    double t_old, y_old[DOP853_N], f_old[DOP853_N], h_old; /* the start of the last accepted step */
    double h;                                            /* the next step to try */
    double facold;                                       /* for step-size control */
    int rejected;                                        /* the last attempt was rejected */
    int dense_ready;                                     /* cont[] holds the last step's extension */
    int at_step_end;     /* set while f is evaluated at the end of a step just accepted (its diagnostics) */
    double k[16][DOP853_N];                              /* stages (k[12] = f at the step's end) */
    double cont[7][DOP853_N];                            /* coefficients of the continuous extension */
    long nfev, nsteps, nrejected;
} dop853;

/* Start at (t0, y0): one evaluation of f there, and Hairer's starting-step algorithm (one more). */
int dop853_init(dop853 *s, dop853_rhs f, void *user, double rtol, double atol, double t0, const double y0[DOP853_N],
                double t_end);

/* Take one accepted step, not past t_end; the previous state moves to t_old, y_old. */
int dop853_step(dop853 *s, double t_end);

/* Prepare the continuous extension of the last accepted step (three more evaluations of f). */
int dop853_dense(dop853 *s);

/* The state at t in [t_old, t] from the continuous extension (dop853_dense first). */
void dop853_dense_eval(const dop853 *s, double t, double y[DOP853_N]);

/* Component i only (cheap: for root finding). */
double dop853_dense_component(const dop853 *s, double t, int i);

/* One step of length tau from the start of the last accepted step (no error control). */
int dop853_partial(const dop853 *s, double tau, double y[DOP853_N]);

#endif
