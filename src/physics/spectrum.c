/* spectrum.c: droplet size spectra, the volume distribution of drop diameters from a nozzle, and their
 * discretisation into size classes for flight.
 * SPDX-License-Identifier: GPL-3.0-or-later
 *
 * F(d) is the volume fraction in drops smaller than d; dv50 the volume median diameter, F(dv50) = 1/2.
 * rosin_rammler: F(d) = 1 - exp(-(d/X)^n) (Rosin, P. & Rammler, E. 1933, "The laws governing the fineness of
 *                powdered coal", J. Inst. Fuel 7:29, title recalled; the same form describes the volume of rain in
 *                drops below d in Best, A. C. 1950, "The size distribution of raindrops", Q. J. R. Meteorol. Soc.
 *                76:16, journal and page recalled). Written with dv50: u = ln 2 (d/dv50)^n, F = 1 - e^-u,
 *                X = dv50 / (ln 2)^(1/n); quantile d_p = dv50 (-ln(1 - p) / ln 2)^(1/n). Volume-weighted mean
 *                over [a, b] (substituting u):
 *                int d dF = X Gamma(1 + 1/n) [P(1 + 1/n, u_b) - P(1 + 1/n, u_a)], P the regularised lower
 *                incomplete gamma function (GSL gsl_sf_gamma_inc_P/Q).
 * log_normal:    F(d) = Phi(z), z = ln(d/dv50) / sigma; quantile d_p = dv50 exp(sigma Phi^-1(p)) (GSL's
 *                gsl_cdf_ugaussian_P / _Pinv). int_a^b d dF = dv50 e^(sigma^2/2) [Phi(z_b - sigma) - Phi(z_a - sigma)]
 *                (the first moment of a log-normal, completing the square). Relative span s = (dv90 - dv10)/dv50
 *                = e^(sigma z90) - e^(-sigma z90) = 2 sinh(sigma z90), z90 = Phi^-1(0.9): sigma = asinh(s/2)/z90.
 * table:         measured classes (diameter[i-1], diameter[i]] with volume fractions w_i; inside a class F rises
 *                linearly in ln d (a constant volume per unit ln d), so the class's volume-weighted mean over
 *                [a, b] is the logarithmic mean (b - a) / ln(b/a), and quantiles interpolate ln d linearly in F.
 * Differences of F near 1 are taken as differences of 1 - F, so that no digits are lost in the upper tail.
 */
#include <math.h>
#include <stdio.h>
#include <stdlib.h>
#include <string.h>

#include <gsl/gsl_cdf.h>
#include <gsl/gsl_errno.h>
#include <gsl/gsl_sf_gamma.h>

#include "core/constants.h"
#include "dragarc/spectrum.h"

static const char *const FORM_NAMES[] = {"none", "rosin_rammler", "log_normal", "table"};
static const char *const SPACING_NAMES[] = {"geometric", "equal_volume"};

const char *dragarc_spectrum_form_name(dragarc_spectrum_form form)
{
    return (unsigned)form < sizeof FORM_NAMES / sizeof *FORM_NAMES ? FORM_NAMES[form] : NULL;
}

const char *dragarc_spectrum_spacing_name(dragarc_spectrum_spacing spacing)
{
    return (unsigned)spacing < sizeof SPACING_NAMES / sizeof *SPACING_NAMES ? SPACING_NAMES[spacing] : NULL;
}

static int index_of(const char *const *names, size_t count, const char *name)
{
    for (size_t i = 0; name && i < count; i++)
        if (strcmp(name, names[i]) == 0)
            return (int)i;
    return -1;
}

int dragarc_spectrum_form_from_name(const char *name, dragarc_spectrum_form *out)
{
    int i = index_of(FORM_NAMES, sizeof FORM_NAMES / sizeof *FORM_NAMES, name);
    if (i < 0)
        return DRAGARC_EINVAL;
    *out = (dragarc_spectrum_form)i;
    return DRAGARC_OK;
}

int dragarc_spectrum_spacing_from_name(const char *name, dragarc_spectrum_spacing *out)
{
    int i = index_of(SPACING_NAMES, sizeof SPACING_NAMES / sizeof *SPACING_NAMES, name);
    if (i < 0)
        return DRAGARC_EINVAL;
    *out = (dragarc_spectrum_spacing)i;
    return DRAGARC_OK;
}

double dragarc_spectrum_sigma_from_span(double span) { return asinh(0.5 * span) / gsl_cdf_ugaussian_Pinv(0.9); }

double dragarc_spectrum_span_from_sigma(double sigma) { return 2.0 * sinh(sigma * gsl_cdf_ugaussian_Pinv(0.9)); }

double dragarc_spectrum_drops_per_volume(double d) { return 6.0 / (DRAGARC_PI * d * d * d); }

/* u = ln 2 (d / dv50)^n, so that F = 1 - e^-u. */
static double rr_u(const dragarc_spectrum *s, double d) { return log(2.0) * pow(d / s->dv50, s->spread); }

/* Index i >= 1 of the table class (diameter[i-1], diameter[i]] holding d, for diameter[0] < d < diameter[n-1]. */
static size_t table_class(const dragarc_spectrum *s, double d)
{
    size_t lo = 1, hi = s->npoints - 1;
    while (lo < hi) {
        size_t mid = lo + (hi - lo) / 2;
        if (d <= s->diameter[mid])
            hi = mid;
        else
            lo = mid + 1;
    }
    return lo;
}

double dragarc_spectrum_fraction_below(const dragarc_spectrum *s, double d)
{
    if (!(d > 0.0))
        return 0.0;
    switch (s->form) {
    case DRAGARC_SPECTRUM_ROSIN_RAMMLER: return -expm1(-rr_u(s, d));
    case DRAGARC_SPECTRUM_LOG_NORMAL: return gsl_cdf_ugaussian_P(log(d / s->dv50) / s->sigma);
    case DRAGARC_SPECTRUM_TABLE: {
        size_t n = s->npoints;
        if (d <= s->diameter[0])
            return 0.0;
        if (d >= s->diameter[n - 1])
            return 1.0;
        size_t i = table_class(s, d);
        return s->cumulative[i - 1] +
               s->fraction[i] * log(d / s->diameter[i - 1]) / log(s->diameter[i] / s->diameter[i - 1]);
    }
    default: return NAN;
    }
}

/* 1 - F(d), without the cancellation of subtracting F from 1 in the upper tail. */
static double fraction_above(const dragarc_spectrum *s, double d)
{
    switch (s->form) {
    case DRAGARC_SPECTRUM_ROSIN_RAMMLER: return exp(-rr_u(s, d));
    case DRAGARC_SPECTRUM_LOG_NORMAL: return gsl_cdf_ugaussian_Q(log(d / s->dv50) / s->sigma);
    default: return 1.0 - dragarc_spectrum_fraction_below(s, d);
    }
}

/* The quantile of a checked spectrum, 0 < p < 1. */
static double quantile(const dragarc_spectrum *s, double p)
{
    switch (s->form) {
    case DRAGARC_SPECTRUM_ROSIN_RAMMLER: return s->dv50 * pow(-log1p(-p) / log(2.0), 1.0 / s->spread);
    case DRAGARC_SPECTRUM_LOG_NORMAL: return s->dv50 * exp(s->sigma * gsl_cdf_ugaussian_Pinv(p));
    case DRAGARC_SPECTRUM_TABLE: {
        size_t i = 1;
        while (i < s->npoints - 1 && s->cumulative[i] < p)
            i++;
        double w = s->fraction[i], t = w > 0.0 ? (p - s->cumulative[i - 1]) / w : 1.0;
        t = t < 0.0 ? 0.0 : t > 1.0 ? 1.0 : t;
        return s->diameter[i - 1] * exp(t * log(s->diameter[i] / s->diameter[i - 1]));
    }
    default: return NAN;
    }
}

int dragarc_spectrum_quantile(const dragarc_spectrum *s, double p, double *d, dragarc_error *err)
{
    if (!(p > 0.0 && p < 1.0))
        return dragarc_error_set(err, DRAGARC_EINVAL, "p", "volume fraction must be between 0 and 1, both excluded "
                                                           "(got %g)", p);
    *d = quantile(s, p);
    return DRAGARC_OK;
}

/* ---- checks ---- */

static int check_size(const char *field, double v, dragarc_error *err)
{
    if (!(v > 0.0) || !isfinite(v))
        return dragarc_error_set(err, DRAGARC_EINVAL, field, "must be positive, in m (got %g)", v);
    if (v < DRAGARC_SPECTRUM_DIAMETER_MIN || v > DRAGARC_SPECTRUM_DIAMETER_MAX)
        return dragarc_error_set(err, DRAGARC_EINVAL, field, "must be from %g to %g m (1 um to 20 mm) (got %g)",
                                 DRAGARC_SPECTRUM_DIAMETER_MIN, DRAGARC_SPECTRUM_DIAMETER_MAX, v);
    return DRAGARC_OK;
}

/* A parametric spectrum t whose size was given as (size_field, size) and width as (width_field, width): both
 * positive, and the 0.1 % and 99.9 % volume quantiles distinct and inside the accepted diameters. */
static int check_parametric(const dragarc_spectrum *t, const char *size_field, double size, const char *width_field,
                            double width, dragarc_error *err)
{
    int rc = check_size(size_field, size, err);
    if (rc != DRAGARC_OK)
        return rc;
    if (!(width > 0.0) || !isfinite(width))
        return dragarc_error_set(err, DRAGARC_EINVAL, width_field, "must be positive (got %g)", width);
    double lo = quantile(t, DRAGARC_SPECTRUM_COVERAGE), hi = quantile(t, 1.0 - DRAGARC_SPECTRUM_COVERAGE);
    int low = !(lo >= DRAGARC_SPECTRUM_DIAMETER_MIN), high = !(hi <= DRAGARC_SPECTRUM_DIAMETER_MAX);
    if (low || high)
        return dragarc_error_set(err, DRAGARC_EINVAL, width_field,
                                 "%g with dv50 = %g m puts the %s %% volume quantile at %g m, %s the %g m accepted "
                                 "(diameters from 1 um to 20 mm)", width, t->dv50, low ? "0.1" : "99.9", low ? lo : hi,
                                 low ? "below" : "above",
                                 low ? DRAGARC_SPECTRUM_DIAMETER_MIN : DRAGARC_SPECTRUM_DIAMETER_MAX);
    if (!(hi > lo))
        return dragarc_error_set(err, DRAGARC_EINVAL, width_field,
                                 "%g is so narrow that the 0.1 %% and 99.9 %% volume quantiles coincide (%g m)", width,
                                 lo);
    return DRAGARC_OK;
}

/* Table points: diameters strictly increasing inside the accepted range, fractions >= 0 with the first 0, summing
 * to 1 within the tolerance; their sum is returned. */
static int check_points(const double *d, const double *v, size_t n, double *sum_out, dragarc_error *err)
{
    if (n < 2)
        return dragarc_error_set(err, DRAGARC_EINVAL, "points", "needs at least 2 points (got %zu)", n);
    double sum = 0.0;
    for (size_t i = 0; i < n; i++) {
        char field[48];
        snprintf(field, sizeof field, "points[%zu]", i);
        if (!(d[i] >= DRAGARC_SPECTRUM_DIAMETER_MIN && d[i] <= DRAGARC_SPECTRUM_DIAMETER_MAX))
            return dragarc_error_set(err, DRAGARC_EINVAL, field, "diameter must be from %g to %g m (1 um to 20 mm) "
                                     "(got %g)", DRAGARC_SPECTRUM_DIAMETER_MIN, DRAGARC_SPECTRUM_DIAMETER_MAX, d[i]);
        if (i > 0 && !(d[i] > d[i - 1]))
            return dragarc_error_set(err, DRAGARC_EINVAL, field, "diameters must increase strictly (%g m follows %g m)",
                                     d[i], d[i - 1]);
        if (!(v[i] >= 0.0) || !isfinite(v[i]))
            return dragarc_error_set(err, DRAGARC_EINVAL, field, "volume fraction must be 0 or more (got %g)", v[i]);
        if (i == 0 && v[0] != 0.0)
            return dragarc_error_set(err, DRAGARC_EINVAL, field, "the first diameter is the lower bound of the first "
                                     "class and holds no volume: its fraction must be 0 (got %g)", v[0]);
        sum += v[i];
    }
    if (!(fabs(sum - 1.0) <= DRAGARC_SPECTRUM_TABLE_SUM_TOLERANCE))
        return dragarc_error_set(err, DRAGARC_EINVAL, "points", "volume fractions sum to %g, not 1 (within %g)%s", sum,
                                 DRAGARC_SPECTRUM_TABLE_SUM_TOLERANCE,
                                 fabs(sum - 100.0) <= 100.0 * DRAGARC_SPECTRUM_TABLE_SUM_TOLERANCE
                                     ? ": percentages? give fractions of 1" : "");
    *sum_out = sum;
    return DRAGARC_OK;
}

int dragarc_spectrum_check(const dragarc_spectrum *s, dragarc_error *err)
{
    switch (s->form) {
    case DRAGARC_SPECTRUM_NONE: return dragarc_error_set(err, DRAGARC_EINVAL, "form", "no spectrum form given");
    case DRAGARC_SPECTRUM_ROSIN_RAMMLER: return check_parametric(s, "dv50", s->dv50, "spread", s->spread, err);
    case DRAGARC_SPECTRUM_LOG_NORMAL: return check_parametric(s, "dv50", s->dv50, "sigma", s->sigma, err);
    case DRAGARC_SPECTRUM_TABLE: {
        if (s->npoints < 2 || !s->diameter || !s->fraction || !s->cumulative)
            return dragarc_error_set(err, DRAGARC_EINVAL, "points", "needs at least 2 points (got %zu)", s->npoints);
        double sum;
        return check_points(s->diameter, s->fraction, s->npoints, &sum, err);
    }
    }
    return dragarc_error_set(err, DRAGARC_EINVAL, "form", "unknown spectrum form %d", (int)s->form);
}

/* ---- construction and ownership ---- */

void dragarc_spectrum_clear(dragarc_spectrum *s)
{
    if (!s)
        return;
    free(s->diameter);
    free(s->fraction);
    free(s->cumulative);
    memset(s, 0, sizeof *s);
}

/* Replace s by the checked parametric spectrum t. */
static int set_parametric(dragarc_spectrum *s, dragarc_spectrum t, const char *size_field, double size,
                          const char *width_field, double width, dragarc_error *err)
{
    int rc = check_parametric(&t, size_field, size, width_field, width, err);
    if (rc != DRAGARC_OK)
        return rc;
    dragarc_spectrum_clear(s);
    *s = t;
    return DRAGARC_OK;
}

int dragarc_spectrum_rosin_rammler(dragarc_spectrum *s, double dv50, double spread, dragarc_error *err)
{
    dragarc_spectrum t = {.form = DRAGARC_SPECTRUM_ROSIN_RAMMLER, .dv50 = dv50, .spread = spread};
    return set_parametric(s, t, "dv50", dv50, "spread", spread, err);
}

int dragarc_spectrum_rosin_rammler_scale(dragarc_spectrum *s, double scale, double spread, dragarc_error *err)
{
    /* Only a positive spread converts; a bad one is reported by the check under its own name. */
    double dv50 = spread > 0.0 ? scale * pow(log(2.0), 1.0 / spread) : scale;
    dragarc_spectrum t = {.form = DRAGARC_SPECTRUM_ROSIN_RAMMLER, .dv50 = dv50, .spread = spread};
    return set_parametric(s, t, "scale", scale, "spread", spread, err);
}

int dragarc_spectrum_log_normal(dragarc_spectrum *s, double dv50, double sigma, dragarc_error *err)
{
    dragarc_spectrum t = {.form = DRAGARC_SPECTRUM_LOG_NORMAL, .dv50 = dv50, .sigma = sigma};
    return set_parametric(s, t, "dv50", dv50, "sigma", sigma, err);
}

int dragarc_spectrum_log_normal_span(dragarc_spectrum *s, double dv50, double span, dragarc_error *err)
{
    dragarc_spectrum t = {.form = DRAGARC_SPECTRUM_LOG_NORMAL, .dv50 = dv50,
                          .sigma = dragarc_spectrum_sigma_from_span(span)};
    return set_parametric(s, t, "dv50", dv50, "span", span, err);
}

int dragarc_spectrum_table_set(dragarc_spectrum *s, const double *diameter, const double *fraction, size_t n,
                               dragarc_error *err)
{
    double sum;
    int rc = check_points(diameter, fraction, n, &sum, err);
    if (rc != DRAGARC_OK)
        return rc;
    double *d = malloc(n * sizeof *d), *w = malloc(n * sizeof *w), *c = malloc(n * sizeof *c);
    if (!d || !w || !c) {
        free(d), free(w), free(c);
        return dragarc_error_set(err, DRAGARC_ENOMEM, "points", "out of memory for %zu points", n);
    }
    memcpy(d, diameter, n * sizeof *d);
    c[0] = w[0] = 0.0;
    for (size_t i = 1; i < n; i++) {
        w[i] = fraction[i] / sum;
        c[i] = fmin(c[i - 1] + w[i], 1.0); /* rounding must not carry the cumulative past 1 */
    }
    c[n - 1] = 1.0;
    dragarc_spectrum_clear(s);
    *s = (dragarc_spectrum){
        .form = DRAGARC_SPECTRUM_TABLE, .npoints = n, .diameter = d, .fraction = w, .cumulative = c};
    return DRAGARC_OK;
}

int dragarc_spectrum_copy(dragarc_spectrum *dst, const dragarc_spectrum *src, dragarc_error *err)
{
    *dst = *src;
    dst->diameter = dst->fraction = dst->cumulative = NULL;
    if (src->form != DRAGARC_SPECTRUM_TABLE)
        return DRAGARC_OK;
    dst->form = DRAGARC_SPECTRUM_NONE;
    dst->npoints = 0;
    return dragarc_spectrum_table_set(dst, src->diameter, src->fraction, src->npoints, err);
}

/* ---- derived quantities ---- */

int dragarc_spectrum_summarise(const dragarc_spectrum *s, dragarc_spectrum_summary *out, dragarc_error *err)
{
    int rc = dragarc_spectrum_check(s, err);
    if (rc != DRAGARC_OK)
        return rc;
    out->dv10 = quantile(s, 0.1);
    out->dv50 = quantile(s, 0.5);
    out->dv90 = quantile(s, 0.9);
    out->relative_span = (out->dv90 - out->dv10) / out->dv50;
    out->driftable_fraction = dragarc_spectrum_fraction_below(s, DRAGARC_SPECTRUM_DRIFTABLE_DIAMETER);
    return DRAGARC_OK;
}

/* P(z_b) - P(z_a) for the standard normal, from the tail that keeps its digits. */
static double ugaussian_between(double za, double zb)
{
    return za > 0.0 ? gsl_cdf_ugaussian_Q(za) - gsl_cdf_ugaussian_Q(zb)
                    : gsl_cdf_ugaussian_P(zb) - gsl_cdf_ugaussian_P(za);
}

/* P(a, u_b) - P(a, u_a), P the regularised lower incomplete gamma function, from the tail that keeps its digits. */
static int gamma_between(double a, double ua, double ub, double *out)
{
    gsl_sf_result ra, rb;
    int upper = ua > a, sa, sb;
    if (upper) {
        sa = gsl_sf_gamma_inc_Q_e(a, ua, &ra);
        sb = gsl_sf_gamma_inc_Q_e(a, ub, &rb);
    } else {
        sa = gsl_sf_gamma_inc_P_e(a, ua, &ra);
        sb = gsl_sf_gamma_inc_P_e(a, ub, &rb);
    }
    /* an underflow is a true value of 0 */
    if ((sa != GSL_SUCCESS && sa != GSL_EUNDRFLW) || (sb != GSL_SUCCESS && sb != GSL_EUNDRFLW))
        return sa != GSL_SUCCESS && sa != GSL_EUNDRFLW ? sa : sb;
    *out = upper ? ra.val - rb.val : rb.val - ra.val;
    return GSL_SUCCESS;
}

/* Volume fraction between a < b and its first moment, int_a^b d dF(d) (m). */
static int between(const dragarc_spectrum *s, double a, double b, double *mass, double *moment, dragarc_error *err)
{
    switch (s->form) {
    case DRAGARC_SPECTRUM_ROSIN_RAMMLER: {
        double n = s->spread, ua = rr_u(s, a), ub = rr_u(s, b), g;
        *mass = exp(-ua) * -expm1(ua - ub);
        int st = gamma_between(1.0 + 1.0 / n, ua, ub, &g);
        if (st != GSL_SUCCESS)
            return dragarc_error_set(err, DRAGARC_ESOLVER, "", "GSL gamma_inc (a = %g, x from %g to %g): %s",
                                     1.0 + 1.0 / n, ua, ub, gsl_strerror(st));
        *moment = s->dv50 * pow(log(2.0), -1.0 / n) * tgamma(1.0 + 1.0 / n) * g;
        return DRAGARC_OK;
    }
    case DRAGARC_SPECTRUM_LOG_NORMAL: {
        double sg = s->sigma, za = log(a / s->dv50) / sg, zb = log(b / s->dv50) / sg;
        *mass = ugaussian_between(za, zb);
        *moment = s->dv50 * exp(0.5 * sg * sg) * ugaussian_between(za - sg, zb - sg);
        return DRAGARC_OK;
    }
    case DRAGARC_SPECTRUM_TABLE:
        *mass = *moment = 0.0;
        for (size_t i = 1; i < s->npoints; i++) {
            double lo = fmax(a, s->diameter[i - 1]), hi = fmin(b, s->diameter[i]);
            if (!(hi > lo) || s->fraction[i] == 0.0)
                continue;
            double per_log = s->fraction[i] / log(s->diameter[i] / s->diameter[i - 1]);
            *mass += per_log * log(hi / lo);
            *moment += per_log * (hi - lo);
        }
        return DRAGARC_OK;
    default: return dragarc_error_set(err, DRAGARC_EINVAL, "form", "unknown spectrum form %d", (int)s->form);
    }
}

int dragarc_spectrum_discretise(const dragarc_spectrum *s, size_t k, dragarc_spectrum_spacing spacing,
                                dragarc_spectrum_class *cls, dragarc_error *err)
{
    int rc = dragarc_spectrum_check(s, err);
    if (rc != DRAGARC_OK)
        return rc;
    if (k < 1 || k > DRAGARC_SPECTRUM_MAX_CLASSES)
        return dragarc_error_set(err, DRAGARC_EINVAL, "classes", "must be from 1 to %d (got %zu)",
                                 DRAGARC_SPECTRUM_MAX_CLASSES, k);
    if (!cls)
        return dragarc_error_set(err, DRAGARC_EINVAL, "classes", "no array given for %zu classes", k);
    if (!dragarc_spectrum_spacing_name(spacing))
        return dragarc_error_set(err, DRAGARC_EINVAL, "spacing", "unknown spacing %d", (int)spacing);

    int table = s->form == DRAGARC_SPECTRUM_TABLE;
    double dmin = table ? s->diameter[0] : quantile(s, DRAGARC_SPECTRUM_COVERAGE);
    double dmax = table ? s->diameter[s->npoints - 1] : quantile(s, 1.0 - DRAGARC_SPECTRUM_COVERAGE);
    double below = table ? 0.0 : dragarc_spectrum_fraction_below(s, dmin);
    double above = table ? 0.0 : fraction_above(s, dmax);
    double lower = dmin, sum = 0.0;
    for (size_t j = 0; j < k; j++) {
        double upper = dmax, t = (double)(j + 1) / (double)k;
        if (j + 1 < k)
            upper = spacing == DRAGARC_SPECTRUM_GEOMETRIC ? dmin * exp(t * log(dmax / dmin)) : quantile(s, t);
        double mass = 0.0, moment = 0.0;
        if ((rc = between(s, lower, upper, &mass, &moment, err)) != DRAGARC_OK)
            return rc;
        /* A class without volume (a zero row of a table, or a zero width) takes the logarithmic mean of its bounds,
         * the volume-weighted mean under a constant volume per unit ln d. */
        double d = mass > 0.0 && upper > lower ? moment / mass
                   : upper > lower             ? (upper - lower) / log(upper / lower)
                                               : lower;
        dragarc_spectrum_class *c = &cls[j];
        c->lower = lower;
        c->upper = upper;
        c->diameter = fmin(fmax(d, lower), upper); /* rounding in a very narrow class must not leave it */
        c->tail = (j == 0 ? below : 0.0) + (j + 1 == k ? above : 0.0);
        c->fraction = mass + c->tail;
        c->drops_per_volume = dragarc_spectrum_drops_per_volume(c->diameter);
        sum += c->fraction;
        lower = upper;
    }
    /* The fractions telescope to F(inf) - F(0) = 1; dividing by their sum removes the rounding left over. */
    for (size_t j = 0; j < k; j++) {
        cls[j].fraction /= sum;
        cls[j].tail /= sum;
    }
    return DRAGARC_OK;
}
