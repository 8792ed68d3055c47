/* report_fit.c: the `fit` report kind: parameters of a scenario fitted to a measured track, with the inputs (the
 * scenario, the track, what is estimated and how), the estimates with their standard errors and 95 % intervals, the
 * correlations, the goodness of fit, the conditioning, the warnings, the figure, the cautions and the models and
 * the method with their sources.
 * SPDX-License-Identifier: GPL-3.0-or-later
 *
 * Fills a dragarc_report (report.h) from a fit (fit.h) in the units `fit` prints: SI, angles in degrees
 * (dragarc_fit_param_unit), each value quoted to the decimals its standard error supports (dragarc_fit_decimals).
 * The numbers are the result's own; the warnings and cautions are the texts `fit` prints.
 */
#include <math.h>
#include <stdio.h>
#include <string.h>

#include "dragarc/cautions.h"
#include "dragarc/output.h"
#include "dragarc/plot.h"
#include "dragarc/report.h"
#include "io/report_kind.h"

/* The smallest and largest of n values taken every `stride` from v: "0.03" or "0.02 to 0.05". */
static void spread(char *out, size_t n_out, const double *v, size_t n, size_t stride)
{
    double lo = INFINITY, hi = -INFINITY;
    for (size_t i = 0; i < n; i += stride)
        lo = fmin(lo, v[i]), hi = fmax(hi, v[i]);
    if (lo == hi)
        snprintf(out, n_out, "%.4g", lo);
    else
        snprintf(out, n_out, "%.4g to %.4g", lo, hi);
}

static const char *accel_name(dragarc_fit_accel a)
{
    return a == DRAGARC_FIT_ACCEL_ON    ? "on: from the start"
           : a == DRAGARC_FIT_ACCEL_OFF ? "off: plain Levenberg-Marquardt only"
                                        : "auto: only if plain Levenberg-Marquardt fails";
}

static int track_inputs(dragarc_report *r, const char *track_file, const dragarc_track *t,
                        const dragarc_fit_result *res, dragarc_error *err)
{
    report_pairs p = {.n = 0};
    char sd[96];
    report_add(&p, "track file", "%s", track_file ? track_file : "");
    report_add(&p, "points", "%zu, from t = %.4g s to %.4g s after launch", t->n, t->t[0], t->t[t->n - 1]);
    report_add(&p, "measured", "%s", t->vel ? "positions and velocities (east, north, up)" : "positions (east, north, up)");
    if (t->pos_sd) {
        spread(sd, sizeof sd, t->pos_sd, 3 * t->n, 1);
        report_add(&p, "weights", "the track's standard deviations: positions %s m", sd);
    } else {
        report_add(&p, "weights", "none given: an unweighted fit, the errors estimated from the residuals");
    }
    if (t->vel && t->vel_sd) {
        spread(sd, sizeof sd, t->vel_sd, 3 * t->n, 1);
        report_add(&p, "velocity weights", "standard deviations %s m/s", sd);
    }
    report_add(&p, "residuals", "%zu (%zu a point), %zu degrees of freedom", res->nresiduals, t->vel ? (size_t)6 : 3,
               res->dof);
    return report_pairs_emit(r, "Track", &p, err);
}

static int fit_inputs(dragarc_report *r, const dragarc_fit_options *o, const dragarc_fit_result *res,
                      dragarc_error *err)
{
    report_pairs p = {.n = 0};
    char names[REPORT_MAX_TEXT] = "";
    size_t len = 0;
    for (int k = 0; k < res->np && len < sizeof names; k++)
        len += (size_t)snprintf(names + len, sizeof names - len, "%s%s", k ? ", " : "",
                                dragarc_fit_param_name(res->param[k]));
    report_add(&p, "estimates", "%s, starting from the scenario's values%s", names,
               res->start_from_track ? ", with the launch read off the track's first points" : "");
    report_add(&p, "method", "Levenberg-Marquardt in a trust region (GSL multifit_nlinear), central-difference Jacobian");
    report_add(&p, "geodesic acceleration", "%s", accel_name(o->accel));
    report_add(&p, "iterations", "at most %d per attempt", o->max_iterations);
    report_add(&p, "tolerances", "relative step %.1e, scaled gradient %.1e", o->xtol, o->gtol);
    report_add(&p, "flights", "integrated to rtol 1e-10 and atol 1e-9 or tighter, without bounces, through the "
               "ground plane as far as the track goes");
    return report_pairs_emit(r, "Fit", &p, err);
}

/* The warnings `fit` prints, one paragraph each; a paragraph saying there are none otherwise. */
static int warnings(dragarc_report *r, const dragarc_fit_result *res, dragarc_error *err)
{
    char warn[8][512], line[540];
    size_t nw = dragarc_fit_warnings(res, warn, 8);
    if (nw == 0)
        return dragarc_report_paragraph(r,
                                        res->weighted
                                            ? "No warnings: the fit converged, no two estimates correlate beyond 0.99, "
                                              "the scaled Jacobian is not near singular, and chi-square agrees with "
                                              "the track's standard deviations."
                                            : "No warnings: the fit converged, no two estimates correlate beyond 0.99 "
                                              "and the scaled Jacobian is not near singular.",
                                        err);
    for (size_t i = 0; i < nw; i++) {
        snprintf(line, sizeof line, "Warning: %s", warn[i]);
        int rc = dragarc_report_paragraph(r, line, err);
        if (rc != DRAGARC_OK)
            return rc;
    }
    return DRAGARC_OK;
}

static int summary(dragarc_report *r, const dragarc_track *t, const dragarc_fit_result *res, dragarc_error *err)
{
    report_pairs p = {.n = 0};
    if (res->converged)
        report_add(&p, "outcome", "converged after %d iterations, %ld flights", res->iterations, res->flights);
    else if (res->warnings & DRAGARC_FIT_AT_LIMIT)
        report_add(&p, "outcome", "NOT converged: the search ended against a limit after %d iterations, %ld "
                   "flights; the last values are shown", res->iterations, res->flights);
    else
        report_add(&p, "outcome", "NOT converged: the iterations ran out after %d, %ld flights; the last values are "
                   "shown", res->iterations, res->flights);
    report_add(&p, "method used", "Levenberg-Marquardt%s", res->accel_used ? " with geodesic acceleration" : "");
    if (res->weighted)
        report_add(&p, "chi-square", "%.4g on %zu degrees of freedom (p = %.3g), %.4g a degree of freedom", res->chisq,
                   res->dof, res->chisq_p, res->chisq / (double)res->dof);
    else
        report_add(&p, "residual standard deviation", "%.4g m on %zu degrees of freedom (chi-square %.4g m\xc2\xb2)",
                   res->sigma, res->dof, res->chisq);
    report_add(&p, "residual RMS, positions", "%.4g m (east %.4g, north %.4g, up %.4g)", res->rms_pos[3],
               res->rms_pos[0], res->rms_pos[1], res->rms_pos[2]);
    if (t->vel)
        report_add(&p, "residual RMS, velocities", "%.4g m/s (east %.4g, north %.4g, up %.4g)", res->rms_vel[3],
                   res->rms_vel[0], res->rms_vel[1], res->rms_vel[2]);
    report_add(&p, "conditioning", "reciprocal condition number %.3g of the scaled Jacobian", res->rcond);
    if (res->np > 1) {
        char dir[REPORT_MAX_TEXT] = "";
        size_t len = 0;
        for (int k = 0; k < res->np && len < sizeof dir; k++)
            if (fabs(res->weak_direction[k]) >= 0.2)
                len += (size_t)snprintf(dir + len, sizeof dir - len, "%s%s %+.2f", len ? ", " : "",
                                        dragarc_fit_param_name(res->param[k]), res->weak_direction[k]);
        report_add(&p, "weakest combination", "%s (the components of 0.2 or more, each estimate scaled by its "
                   "effect on the track)", dir);
        if (res->worst_pair[0] >= 0)
            report_add(&p, "most correlated", "%s and %s, %.3f", dragarc_fit_param_name(res->param[res->worst_pair[0]]),
                       dragarc_fit_param_name(res->param[res->worst_pair[1]]), res->worst_corr);
    }
    return report_pairs_emit(r, "Summary", &p, err);
}

#define EST_COLS 7
static int estimates(dragarc_report *r, const dragarc_fit_result *res, dragarc_error *err)
{
    static const char *const head[EST_COLS] = {"estimate", "unit", "start", "value", "standard error",
                                               "95 % interval, from", "to"};
    static const int numeric[EST_COLS] = {0, 0, 1, 1, 1, 1, 1};
    report_grid g;
    int rc = report_grid_init(&g, (size_t)res->np, EST_COLS, err);
    for (int k = 0; rc == DRAGARC_OK && k < res->np; k++) {
        const size_t i = (size_t)k;
        const int p = res->param[k];
        const double se = dragarc_fit_param_shown(p, res->se[k]);
        const int d = dragarc_fit_decimals(se);
        report_grid_set(&g, i, 0, "%s", dragarc_fit_param_name(res->param[k]));
        report_grid_set(&g, i, 1, "%s", dragarc_fit_param_unit(p));
        report_grid_number(&g, i, 2, d < 4 ? 4 : d, dragarc_fit_param_shown(p, res->start[k]));
        report_grid_number(&g, i, 3, d, dragarc_fit_param_shown(p, res->value[k]));
        if (isfinite(se))
            report_grid_set(&g, i, 4, "%.2g", se);
        report_grid_number(&g, i, 5, d, dragarc_fit_param_shown(p, res->lower[k]));
        report_grid_number(&g, i, 6, d, dragarc_fit_param_shown(p, res->upper[k]));
    }
    if (rc == DRAGARC_OK)
        rc = report_grid_emit(r, res->weighted ? "Estimates (95 % intervals linearised, from the normal law)"
                                               : "Estimates (95 % intervals linearised, from Student's t)",
                              &g, head, numeric, err);
    report_grid_free(&g);
    return rc;
}

/* The correlation matrix: its lower triangle, the diagonal 1. */
static int correlations(dragarc_report *r, const dragarc_fit_result *res, dragarc_error *err)
{
    if (res->np < 2)
        return dragarc_report_paragraph(r, "One estimate: no correlations.", err);
    const size_t n = (size_t)res->np, ncols = n + 1;
    const char *head[DRAGARC_FIT_NPARAMS + 1];
    int numeric[DRAGARC_FIT_NPARAMS + 1];
    head[0] = "";
    numeric[0] = 0;
    for (size_t j = 0; j < n; j++)
        head[j + 1] = dragarc_fit_param_name(res->param[j]), numeric[j + 1] = 1;
    report_grid g;
    int rc = report_grid_init(&g, n, ncols, err);
    for (size_t i = 0; rc == DRAGARC_OK && i < n; i++) {
        report_grid_set(&g, i, 0, "%s", dragarc_fit_param_name(res->param[i]));
        for (size_t j = 0; j <= i; j++)
            report_grid_number(&g, i, j + 1, 3, res->corr[i * n + j]);
    }
    if (rc == DRAGARC_OK)
        rc = report_grid_emit(r, "Correlations of the estimates (symmetric: the lower half shown)", &g, head, numeric,
                              err);
    report_grid_free(&g);
    return rc;
}

/* About a dozen of the track's points, evenly by index, the first and the last among them: what was measured and
 * how far the fitted flight passes from it. */
#define RES_ROWS 13
#define RES_COLS 7
static int residual_table(dragarc_report *r, const dragarc_track *t, const dragarc_fit_result *res,
                          dragarc_error *err)
{
    static const char *const head[RES_COLS] = {"time (s)", "east (m)", "north (m)", "up (m)",
                                               "residual east (m)", "residual north (m)", "residual up (m)"};
    static const int numeric[RES_COLS] = {1, 1, 1, 1, 1, 1, 1};
    const size_t rows = t->n < RES_ROWS ? t->n : RES_ROWS;
    report_grid g;
    int rc = report_grid_init(&g, rows, RES_COLS, err);
    for (size_t i = 0; rc == DRAGARC_OK && i < rows; i++) {
        const size_t k = rows > 1 ? (size_t)llround((double)i * (double)(t->n - 1) / (double)(rows - 1)) : 0;
        report_grid_number(&g, i, 0, 3, t->t[k]);
        for (size_t j = 0; j < 3; j++) {
            report_grid_number(&g, i, 1 + j, 3, t->pos[3 * k + j]);
            report_grid_number(&g, i, 4 + j, 4, res->residuals[6 * k + j]);
        }
    }
    if (rc == DRAGARC_OK)
        rc = report_grid_emit(r, "Along the track: measured positions and residuals (measured minus fitted)", &g, head,
                              numeric, err);
    report_grid_free(&g);
    return rc;
}

typedef struct plot_job {
    const dragarc_scenario *fitted;
    const dragarc_track *track;
    const dragarc_fit_result *res;
} plot_job;

static int draw_fit(const char *path, const void *ctx, dragarc_error *err)
{
    const plot_job *j = ctx;
    return dragarc_fit_plot(path, j->fitted, j->track, j->res, err);
}

/* The method's sources, after those of the fitted flight's models. */
static int fit_sources(dragarc_report *r, const dragarc_fit_options *o, const dragarc_fit_result *res,
                       dragarc_error *err)
{
    const char *geodesic = res->accel_used ? "geodesic acceleration, used in this fit"
                           : o->accel == DRAGARC_FIT_ACCEL_OFF
                               ? "geodesic acceleration, turned off for this fit"
                               : "geodesic acceleration, tried only when plain steps fail: not needed in this fit";
    int rc;
    if ((rc = dragarc_report_source(r, "least squares",
                                    "weighted nonlinear least squares by GSL's trust-region Levenberg-Marquardt "
                                    "(multifit_nlinear), the Jacobian by central differences of flights",
                                    "Mor\xc3\xa9, J. J. (1978), The Levenberg-Marquardt algorithm: implementation and "
                                    "theory, in Numerical Analysis, ed. G. A. Watson, Springer LNM 630, 105-116",
                                    err)) != DRAGARC_OK ||
        (rc = dragarc_report_source(r, "acceleration", geodesic,
                                    "Transtrum, M. K. & Sethna, J. P. (2012), Improvements to the Levenberg-Marquardt "
                                    "algorithm for nonlinear least-squares minimization, arXiv:1201.5885",
                                    err)) != DRAGARC_OK ||
        (rc = dragarc_report_source(r, "standard errors",
                                    "the covariance (J^T W J)^-1 at the solution, scaled by chi-square / (N - P) when "
                                    "the track gives no standard deviations; linearised 95 % intervals and "
                                    "correlations from it",
                                    "Seber, G. A. F. & Wild, C. J. (1989), Nonlinear Regression, Wiley, chapter 2",
                                    err)) != DRAGARC_OK ||
        (rc = dragarc_report_source(r, "conditioning",
                                    "the reciprocal condition number of the Jacobian with its columns scaled to unit "
                                    "length, and the singular vector of its smallest singular value",
                                    "Golub, G. H. & Van Loan, C. F. (2013), Matrix Computations, 4th ed., Johns "
                                    "Hopkins University Press, section 8.6",
                                    err)) != DRAGARC_OK)
        return rc;
    return dragarc_report_source(r, "fit", "the whole method and its checks", "dragarc, docs/fit.md", err);
}

int dragarc_report_fit(dragarc_report *r, const char *where, const char *track_file, const dragarc_scenario *s,
                       const dragarc_fit_options *o, const dragarc_track *track, const dragarc_fit_result *res,
                       const dragarc_scenario *fitted, dragarc_error *err)
{
    if (!track || track->n == 0 || !res || res->np < 1 || !res->residuals || res->npoints != track->n)
        return dragarc_error_set(err, DRAGARC_EINVAL, "", "the fit report needs a fit of this track");
    dragarc_fit_options defaults;
    if (!o) {
        dragarc_fit_options_default(&defaults);
        o = &defaults;
    }
    dragarc_display si;
    dragarc_display_si(&si);
    char line[4200];
    snprintf(line, sizeof line, "Scenario file %s, track file %s: the values that bring the scenario's flight "
             "closest to the measured track. SI units, angles in degrees.", where ? where : "",
             track_file ? track_file : "");
    const char *cautions[DRAGARC_CAUTIONS_MAX];
    size_t nc = dragarc_cautions_fit(cautions, DRAGARC_CAUTIONS_MAX);
    plot_job job = {fitted, track, res};
    int rc;
    if ((rc = dragarc_report_subtitle(r, line, err)) != DRAGARC_OK ||
        (rc = dragarc_report_section(r, "Inputs", err)) != DRAGARC_OK ||
        (rc = report_scenario_inputs(r, s, &si, err)) != DRAGARC_OK ||
        (rc = track_inputs(r, track_file, track, res, err)) != DRAGARC_OK ||
        (rc = fit_inputs(r, o, res, err)) != DRAGARC_OK ||
        (rc = dragarc_report_section(r, "Results", err)) != DRAGARC_OK ||
        (rc = warnings(r, res, err)) != DRAGARC_OK || (rc = estimates(r, res, err)) != DRAGARC_OK ||
        (rc = correlations(r, res, err)) != DRAGARC_OK || (rc = summary(r, track, res, err)) != DRAGARC_OK ||
        (rc = residual_table(r, track, res, err)) != DRAGARC_OK ||
        (rc = dragarc_report_section(r, "Figures", err)) != DRAGARC_OK ||
        (rc = dragarc_report_figure_draw(r,
                                         "The track's points over the fitted flight: side view (height above the "
                                         "ground against downrange along the fitted azimuth) and plan view (north "
                                         "against east); the residuals (measured minus fitted) east, north and up "
                                         "against time.",
                                         draw_fit, &job, err)) != DRAGARC_OK ||
        (rc = dragarc_report_section(r, "Cautions", err)) != DRAGARC_OK ||
        (rc = dragarc_report_cautions(r, nc, cautions, err)) != DRAGARC_OK ||
        (rc = report_flight_sources(r, fitted, fitted->solver.method, err)) != DRAGARC_OK)
        return rc;
    return fit_sources(r, o, res, err);
}
