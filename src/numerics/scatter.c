/* scatter.c: statistics of a cloud of weighted impact points on the local flat ground.
 * SPDX-License-Identifier: GPL-3.0-or-later
 *
 * Points x_i = (east, north) with frequency weights w_i >= 0 (a sample standing for w_i fragments), W = sum w_i:
 *   mean  m = sum w_i x_i / W  (GSL gsl_stats_wmean);
 *   cov   C = sum w_i (x_i - m)(x_i - m)^T / (W - 1), the unbiased covariance of the sample in which point i is
 *         repeated w_i times (frequency weights; with every w_i = 1 it is GSL's gsl_stats_covariance). GSL's own
 *         weighted variance divides by W - sum w_i^2 / W instead, the unbiased form for reliability weights,
 *         which is not what a fragment count means, so the sums are written here.
 *   ellipse: the eigenvalues lambda_1 >= lambda_2 of C in closed form, lambda_1 = (a + c)/2 + hypot((a - c)/2, b),
 *         lambda_2 = det C / lambda_1, the major axis at angle theta = atan2(2b, a - c)/2 from east; the k-sigma
 *         ellipse {x : (x - m)^T C^-1 (x - m) <= k^2} has semi-axes k sqrt(lambda). For a 2-D normal the squared
 *         Mahalanobis distance is chi-square with 2 degrees of freedom, so the ellipse holds P = 1 - exp(-k^2/2)
 *         (GSL Reference Manual, gsl_cdf_chisq_P with nu = 2; any statistics text).
 *   quantiles: equal values merged, the distinct values at plotting positions P_k = (C_k - W_k/2)/W, linear in
 *         between (Hyndman, R. J. and Fan, Y. 1996, Sample quantiles in statistical packages, The American
 *         Statistician 50(4), 361-365, definition 5, with weights in place of counts).
 *   grid: GSL gsl_histogram2d accumulates the weights in square cells; the automatic cell is Scott's normal
 *         reference rule h_k = 2 3^(1/(d+2)) pi^(d/(2(d+2))) sigma_k n^(-1/(d+2)), which is 3.504 sigma n^(-1/4)
 *         for d = 2 (Scott, D. W. 1992, Multivariate Density Estimation, Wiley, section 3.4; recalled), with the
 *         smaller principal sigma so that the cloud spans several cells across its narrow way.
 *   highest-density region: the cells in decreasing density until their weight reaches p W (the smallest set that
 *         does: any k cells weigh at most the k densest); its boundary is traced along cell edges with the
 *         region on the left (so outer rings run counter-clockwise and holes clockwise), turning left where two
 *         selected cells meet at a corner only (so such cells stay apart: polygons are the 4-connected pieces),
 *         and a ring that then visits a point twice is cut there into two rings (each a hole of the same piece).
 */
#include <math.h>
#include <stdint.h>
#include <stdio.h>
#include <stdlib.h>
#include <string.h>

#include <gsl/gsl_errno.h>
#include <gsl/gsl_histogram2d.h>
#include <gsl/gsl_sort.h>
#include <gsl/gsl_statistics_double.h>

#include "dragarc/scatter.h"

#define PI 3.14159265358979323846
#define SINGULAR_RATIO 1e-10 /* lambda_2 / lambda_1 at or below which the covariance is taken as singular */
#define SCOTT_2D 3.504       /* 2 3^(1/4) pi^(1/4): Scott's bivariate normal reference constant */
#define AUTO_MIN_FRACTION 1e-3 /* the automatic cell is at least this share of the longer side of the extent */

/* ---- input checks ---------------------------------------------------------------------------------------- */

/* Every x[i] finite, else DRAGARC_EINVAL naming "name[i]". */
static int check_finite(size_t n, const double *x, const char *name, dragarc_error *err)
{
    for (size_t i = 0; i < n; i++)
        if (!isfinite(x[i])) {
            char field[48];
            snprintf(field, sizeof field, "%s[%zu]", name, i);
            return dragarc_error_set(err, DRAGARC_EINVAL, field, "must be a finite number (got %g)", x[i]);
        }
    return DRAGARC_OK;
}

/* Weights finite and >= 0 with a positive total (NULL: n ones); n >= 1. *total = W, *npos = points of weight > 0. */
static int check_weights(size_t n, const double *weight, double *total, size_t *npos, dragarc_error *err)
{
    *total = 0.0;
    *npos = 0;
    if (n == 0)
        return dragarc_error_set(err, DRAGARC_EINVAL, "weight", "needs at least one point (got none)");
    for (size_t i = 0; i < n; i++) {
        double w = weight ? weight[i] : 1.0;
        if (!(isfinite(w) && w >= 0.0)) {
            char field[48];
            snprintf(field, sizeof field, "weight[%zu]", i);
            return dragarc_error_set(err, DRAGARC_EINVAL, field, "must be a finite number >= 0 (got %g)", w);
        }
        *total += w;
        *npos += w > 0.0;
    }
    if (!(*total > 0.0) || !isfinite(*total))
        return dragarc_error_set(err, DRAGARC_EINVAL, "weight", "the weights must add up to a finite number above 0 "
                                 "(got %g)", *total);
    return DRAGARC_OK;
}

/* The checks on points: coordinates finite, weights as check_weights. */
static int check_points(size_t n, const double *east, const double *north, const double *weight, double *total,
                        size_t *npos, dragarc_error *err)
{
    int rc = check_weights(n, weight, total, npos, err);
    if (rc == DRAGARC_OK)
        rc = check_finite(n, east, "east", err);
    if (rc == DRAGARC_OK)
        rc = check_finite(n, north, "north", err);
    return rc;
}

/* ---- moments ------------------------------------------------------------------------------------------- */

int dragarc_scatter_moments(size_t n, const double *east, const double *north, const double *weight,
                            double mean[2], double cov[3], dragarc_error *err)
{
    mean[0] = mean[1] = 0.0;
    cov[0] = cov[1] = cov[2] = 0.0;
    double total;
    size_t npos;
    int rc = check_points(n, east, north, weight, &total, &npos, err);
    if (rc != DRAGARC_OK)
        return rc;
    if (!(total > 1.0))
        return dragarc_error_set(err, DRAGARC_EINVAL, "weight",
                                 "the covariance needs a total weight above 1, more than one fragment (got %g)",
                                 total);
    mean[0] = weight ? gsl_stats_wmean(weight, 1, east, 1, n) : gsl_stats_mean(east, 1, n);
    mean[1] = weight ? gsl_stats_wmean(weight, 1, north, 1, n) : gsl_stats_mean(north, 1, n);
    double see = 0.0, sen = 0.0, snn = 0.0;
    for (size_t i = 0; i < n; i++) {
        double w = weight ? weight[i] : 1.0, de = east[i] - mean[0], dn = north[i] - mean[1];
        see += w * de * de;
        sen += w * de * dn;
        snn += w * dn * dn;
    }
    cov[0] = see / (total - 1.0);
    cov[1] = sen / (total - 1.0);
    cov[2] = snn / (total - 1.0);
    return DRAGARC_OK;
}

/* ---- dispersion ellipses ------------------------------------------------------------------------------- */

int dragarc_scatter_ellipse_of(const double mean[2], const double cov[3], double k, dragarc_scatter_ellipse *ell,
                               dragarc_error *err)
{
    memset(ell, 0, sizeof *ell);
    if (!(isfinite(k) && k > 0.0))
        return dragarc_error_set(err, DRAGARC_EINVAL, "k", "must be a positive finite number (got %g)", k);
    if (!isfinite(mean[0]) || !isfinite(mean[1]))
        return dragarc_error_set(err, DRAGARC_EINVAL, "mean", "must be finite (got %g, %g)", mean[0], mean[1]);
    double a = cov[0], b = cov[1], c = cov[2];
    if (!isfinite(a) || !isfinite(b) || !isfinite(c))
        return dragarc_error_set(err, DRAGARC_EINVAL, "cov", "must be finite (got ee %g, en %g, nn %g)", a, b, c);
    if (a < 0.0 || c < 0.0)
        return dragarc_error_set(err, DRAGARC_EINVAL, "cov", "variances must not be negative (got ee %g, nn %g)", a,
                                 c);
    double r = hypot(0.5 * (a - c), b), lambda1 = 0.5 * (a + c) + r;
    if (!(lambda1 > 0.0))
        return dragarc_error_set(err, DRAGARC_EINVAL, "cov",
                                 "is zero: every point at one place, so there is no dispersion ellipse");
    double lambda2 = (a * c - b * b) / lambda1; /* det / lambda_1: no cancellation for a thin ellipse */
    double theta = 0.5 * atan2(2.0 * b, a - c); /* major axis from east, counter-clockwise, in (-pi/2, pi/2] */
    double azimuth = r > 0.0 ? 0.5 * PI - theta : 0.0;
    if (azimuth >= PI)
        azimuth -= PI;
    if (lambda2 < -SINGULAR_RATIO * lambda1)
        return dragarc_error_set(err, DRAGARC_EINVAL, "cov",
                                 "is not positive semi-definite (ee %g, en %g, nn %g: determinant %g)", a, b, c,
                                 a * c - b * b);
    if (lambda2 <= SINGULAR_RATIO * lambda1)
        return dragarc_error_set(err, DRAGARC_EINVAL, "cov",
                                 "is singular: the points lie on a line at azimuth %.6g degrees (variance %g m^2 "
                                 "along it, %g across), so there is no ellipse; use the extent along the line",
                                 azimuth * 180.0 / PI, lambda1, fmax(lambda2, 0.0));
    ell->centre[0] = mean[0];
    ell->centre[1] = mean[1];
    ell->semi_major = k * sqrt(lambda1);
    ell->semi_minor = k * sqrt(lambda2);
    ell->azimuth = azimuth;
    ell->k_sigma = k;
    ell->probability = -expm1(-0.5 * k * k);
    return DRAGARC_OK;
}

int dragarc_scatter_ellipse_k(double probability, double *k, dragarc_error *err)
{
    *k = 0.0;
    if (!(probability > 0.0 && probability < 1.0))
        return dragarc_error_set(err, DRAGARC_EINVAL, "probability", "must be above 0 and below 1 (got %g)",
                                 probability);
    *k = sqrt(-2.0 * log1p(-probability));
    return DRAGARC_OK;
}

/* The unit vectors of the major axis and of the minor axis a quarter turn counter-clockwise from it (east, north). */
static void ellipse_axes(const dragarc_scatter_ellipse *ell, double u[2], double v[2])
{
    u[0] = sin(ell->azimuth);
    u[1] = cos(ell->azimuth);
    v[0] = -u[1];
    v[1] = u[0];
}

void dragarc_scatter_ellipse_ring(const dragarc_scatter_ellipse *ell, size_t m, double *ring_xy)
{
    double u[2], v[2];
    ellipse_axes(ell, u, v);
    for (size_t k = 0; k < m; k++) {
        double t = 2.0 * PI * (double)k / (double)m, a = ell->semi_major * cos(t), b = ell->semi_minor * sin(t);
        ring_xy[2 * k] = ell->centre[0] + a * u[0] + b * v[0];
        ring_xy[2 * k + 1] = ell->centre[1] + a * u[1] + b * v[1];
    }
    ring_xy[2 * m] = ring_xy[0];
    ring_xy[2 * m + 1] = ring_xy[1];
}

int dragarc_scatter_fraction_inside(size_t n, const double *east, const double *north, const double *weight,
                                    const dragarc_scatter_ellipse *ell, double *fraction, dragarc_error *err)
{
    *fraction = 0.0;
    double total;
    size_t npos;
    int rc = check_points(n, east, north, weight, &total, &npos, err);
    if (rc != DRAGARC_OK)
        return rc;
    if (!(ell->semi_major > 0.0 && ell->semi_minor > 0.0 && isfinite(ell->semi_major) && isfinite(ell->azimuth)))
        return dragarc_error_set(err, DRAGARC_EINVAL, "ellipse", "needs finite semi-axes above 0 (got %g, %g)",
                                 ell->semi_major, ell->semi_minor);
    double u[2], v[2], inside = 0.0;
    ellipse_axes(ell, u, v);
    for (size_t i = 0; i < n; i++) {
        double de = east[i] - ell->centre[0], dn = north[i] - ell->centre[1];
        double a = (de * u[0] + dn * u[1]) / ell->semi_major, b = (de * v[0] + dn * v[1]) / ell->semi_minor;
        if (a * a + b * b <= 1.0)
            inside += weight ? weight[i] : 1.0;
    }
    *fraction = inside / total;
    return DRAGARC_OK;
}

/* ---- weighted quantiles -------------------------------------------------------------------------------- */

/* Quantiles of the finite value[] (weights checked) at the checked probs[]. */
static int quantiles_of(size_t n, const double *value, const double *weight, const double *probs, size_t nprob,
                        double *q, dragarc_error *err)
{
    double *buf = calloc(4 * n, sizeof *buf); /* the values and weights kept, then merged in order */
    size_t *order = malloc(n * sizeof *order);
    if (!buf || !order) {
        free(buf), free(order);
        return dragarc_error_set(err, DRAGARC_ENOMEM, "", "out of memory sorting %zu values", n);
    }
    double *v = buf, *w = buf + n, *sv = buf + 2 * n, *sw = buf + 3 * n, *pos = buf; /* pos reuses v after merging */
    size_t np = 0;
    for (size_t i = 0; i < n; i++)
        if (!weight || weight[i] > 0.0) {
            v[np] = value[i];
            w[np++] = weight ? weight[i] : 1.0;
        }
    gsl_sort_index(order, v, 1, np);
    size_t m = 0;
    for (size_t k = 0; k < np; k++) {
        size_t i = order[k];
        if (m > 0 && v[i] == sv[m - 1]) {
            sw[m - 1] += w[i];
        } else {
            sv[m] = v[i];
            sw[m++] = w[i];
        }
    }
    double cum = 0.0;
    for (size_t k = 0; k < m; k++) {
        pos[k] = cum + 0.5 * sw[k];
        cum += sw[k];
    }
    for (size_t k = 0; k < m; k++)
        pos[k] /= cum;
    for (size_t j = 0; j < nprob; j++) {
        double p = probs[j];
        if (p <= pos[0]) {
            q[j] = sv[0];
        } else if (p >= pos[m - 1]) {
            q[j] = sv[m - 1];
        } else {
            size_t lo = 0, hi = m - 1; /* pos[lo] < p < pos[hi] */
            while (hi - lo > 1) {
                size_t mid = lo + (hi - lo) / 2;
                if (pos[mid] <= p)
                    lo = mid;
                else
                    hi = mid;
            }
            double t = (p - pos[lo]) / (pos[hi] - pos[lo]);
            q[j] = sv[lo] + t * (sv[hi] - sv[lo]);
        }
    }
    free(buf), free(order);
    return DRAGARC_OK;
}

/* Every probs[k] in [0, 1]. */
static int check_probs(const double *probs, size_t nprob, dragarc_error *err)
{
    for (size_t k = 0; k < nprob; k++)
        if (!(probs[k] >= 0.0 && probs[k] <= 1.0)) {
            char field[48];
            snprintf(field, sizeof field, "probs[%zu]", k);
            return dragarc_error_set(err, DRAGARC_EINVAL, field, "must be between 0 and 1 (got %g)", probs[k]);
        }
    return DRAGARC_OK;
}

/* The checks on a value per point: weights, then values finite. */
static int check_values(size_t n, const double *value, const double *weight, double *total, dragarc_error *err)
{
    size_t npos;
    int rc = check_weights(n, weight, total, &npos, err);
    return rc != DRAGARC_OK ? rc : check_finite(n, value, "value", err);
}

int dragarc_scatter_quantiles(size_t n, const double *value, const double *weight, const double *probs, size_t nprob,
                              double *q, dragarc_error *err)
{
    double total;
    int rc = check_values(n, value, weight, &total, err);
    if (rc == DRAGARC_OK)
        rc = check_probs(probs, nprob, err);
    return rc != DRAGARC_OK ? rc : quantiles_of(n, value, weight, probs, nprob, q, err);
}

int dragarc_scatter_extent(size_t n, const double *east, const double *north, const double *weight, double azimuth,
                           const double *probs, size_t nprob, double *down, double *cross, dragarc_error *err)
{
    double total;
    size_t npos;
    int rc = check_points(n, east, north, weight, &total, &npos, err);
    if (rc == DRAGARC_OK)
        rc = check_probs(probs, nprob, err);
    if (rc != DRAGARC_OK)
        return rc;
    if (!isfinite(azimuth))
        return dragarc_error_set(err, DRAGARC_EINVAL, "azimuth", "must be a finite angle (got %g)", azimuth);
    double *d = malloc(n * sizeof *d), *c = malloc(n * sizeof *c), s = sin(azimuth), co = cos(azimuth);
    if (!d || !c) {
        free(d), free(c);
        return dragarc_error_set(err, DRAGARC_ENOMEM, "", "out of memory projecting %zu points", n);
    }
    for (size_t i = 0; i < n; i++) {
        d[i] = east[i] * s + north[i] * co;
        c[i] = east[i] * co - north[i] * s;
    }
    rc = quantiles_of(n, d, weight, probs, nprob, down, err);
    if (rc == DRAGARC_OK)
        rc = quantiles_of(n, c, weight, probs, nprob, cross, err);
    free(d), free(c);
    return rc;
}

/* ---- a value per point --------------------------------------------------------------------------------- */

int dragarc_scatter_mean(size_t n, const double *value, const double *weight, double *mean, dragarc_error *err)
{
    *mean = 0.0;
    double total;
    int rc = check_values(n, value, weight, &total, err);
    if (rc != DRAGARC_OK)
        return rc;
    *mean = weight ? gsl_stats_wmean(weight, 1, value, 1, n) : gsl_stats_mean(value, 1, n);
    return DRAGARC_OK;
}

int dragarc_scatter_fraction_above(size_t n, const double *value, const double *weight, double threshold,
                                   double *fraction, dragarc_error *err)
{
    *fraction = 0.0;
    double total, above = 0.0;
    int rc = check_values(n, value, weight, &total, err);
    if (rc != DRAGARC_OK)
        return rc;
    if (isnan(threshold))
        return dragarc_error_set(err, DRAGARC_EINVAL, "threshold", "must be a number (got NaN)");
    for (size_t i = 0; i < n; i++)
        if (value[i] > threshold)
            above += weight ? weight[i] : 1.0;
    *fraction = above / total;
    return DRAGARC_OK;
}

/* ---- density grid -------------------------------------------------------------------------------------- */

void dragarc_scatter_grid_clear(dragarc_scatter_grid *g)
{
    if (!g)
        return;
    free(g->value);
    memset(g, 0, sizeof *g);
}

/* The automatic cell (m) for points of extent span (m, the longer side): Scott's rule on the smaller principal
 * standard deviation, at least AUTO_MIN_FRACTION of the span. */
static int auto_cell(size_t n, const double *east, const double *north, const double *weight, size_t npos,
                     double span, double *cell, dragarc_error *err)
{
    double mean[2], cov[3];
    int rc = dragarc_scatter_moments(n, east, north, weight, mean, cov, err);
    if (rc != DRAGARC_OK)
        return rc;
    if (!(span > 0.0))
        return dragarc_error_set(err, DRAGARC_EINVAL, "cell",
                                 "cannot be chosen automatically: every point is at one place; give a cell size");
    double r = hypot(0.5 * (cov[0] - cov[2]), cov[1]), lambda1 = 0.5 * (cov[0] + cov[2]) + r;
    double lambda2 = fmax((cov[0] * cov[2] - cov[1] * cov[1]) / lambda1, 0.0);
    *cell = fmax(SCOTT_2D * sqrt(lambda2) * pow((double)npos, -0.25), AUTO_MIN_FRACTION * span);
    return DRAGARC_OK;
}

double dragarc_scatter_grid_memory(size_t cells)
{
    /* build: g->value and the gsl_histogram2d bins, a double each; region_of: cells_by_density's values and order,
     * the cells list, in[], comp[], one visited byte and one stack_pos per vertex (about one vertex per cell), and
     * the two boundary paths of at most 4 vertices per cell */
    double per_cell = 2.0 * sizeof(double) + sizeof(double) + 2.0 * sizeof(size_t) + 1.0 + sizeof(uint32_t) + 1.0 +
                      sizeof(uint32_t) + 2.0 * 4.0 * sizeof(uint32_t);
    return (double)cells * per_cell;
}

int dragarc_scatter_grid_build(size_t n, const double *east, const double *north, const double *weight, double cell,
                               dragarc_scatter_density density, dragarc_scatter_grid *g, dragarc_error *err)
{
    memset(g, 0, sizeof *g);
    double total;
    size_t npos;
    int rc = check_points(n, east, north, weight, &total, &npos, err);
    if (rc != DRAGARC_OK)
        return rc;
    if (density != DRAGARC_SCATTER_WEIGHT_PER_KM2 && density != DRAGARC_SCATTER_PROBABILITY_PER_KM2)
        return dragarc_error_set(err, DRAGARC_EINVAL, "density", "unknown density kind %d", (int)density);
    if (!(isfinite(cell) && cell >= 0.0))
        return dragarc_error_set(err, DRAGARC_EINVAL, "cell", "must be a finite size >= 0 m (0: automatic; got %g)",
                                 cell);
    double lo[2] = {INFINITY, INFINITY}, hi[2] = {-INFINITY, -INFINITY};
    for (size_t i = 0; i < n; i++)
        if (!weight || weight[i] > 0.0) {
            lo[0] = fmin(lo[0], east[i]), hi[0] = fmax(hi[0], east[i]);
            lo[1] = fmin(lo[1], north[i]), hi[1] = fmax(hi[1], north[i]);
        }
    if (cell == 0.0) {
        rc = auto_cell(n, east, north, weight, npos, fmax(hi[0] - lo[0], hi[1] - lo[1]), &cell, err);
        if (rc != DRAGARC_OK)
            return rc;
    }
    /* aligned on multiples of the cell, one empty cell on each side */
    double first[2], count[2];
    for (int a = 0; a < 2; a++) {
        first[a] = floor(lo[a] / cell) - 1.0;
        count[a] = floor(hi[a] / cell) - first[a] + 2.0;
    }
    if (!(count[0] * count[1] <= DRAGARC_SCATTER_GRID_MAX_CELLS))
        return dragarc_error_set(err, DRAGARC_EINVAL, "cell",
                                 "a %g m cell makes a grid of %.0f x %.0f cells, over the limit of %d "
                                 "(DRAGARC_SCATTER_GRID_MAX_CELLS); take a larger cell", cell, count[0], count[1],
                                 DRAGARC_SCATTER_GRID_MAX_CELLS);
    size_t nx = (size_t)count[0], ny = (size_t)count[1];
    double x0 = first[0] * cell, y0 = first[1] * cell;
    gsl_histogram2d *h = gsl_histogram2d_alloc(nx, ny);
    g->value = malloc(nx * ny * sizeof *g->value);
    if (!h || !g->value) {
        gsl_histogram2d_free(h);
        dragarc_scatter_grid_clear(g);
        return dragarc_error_set(err, DRAGARC_ENOMEM, "", "out of memory for a %zu x %zu grid", nx, ny);
    }
    int status = gsl_histogram2d_set_ranges_uniform(h, x0, x0 + (double)nx * cell, y0, y0 + (double)ny * cell);
    for (size_t i = 0; i < n && status == GSL_SUCCESS; i++)
        if (!weight || weight[i] > 0.0)
            status = gsl_histogram2d_accumulate(h, east[i], north[i], weight ? weight[i] : 1.0);
    if (status != GSL_SUCCESS) {
        gsl_histogram2d_free(h);
        dragarc_scatter_grid_clear(g);
        return dragarc_error_set(err, DRAGARC_ESOLVER, "cell", "GSL could not bin the points (%s)",
                                 gsl_strerror(status));
    }
    double scale = 1.0 / (cell * cell * 1e-6); /* per km^2 */
    if (density == DRAGARC_SCATTER_PROBABILITY_PER_KM2)
        scale /= total;
    for (size_t j = 0; j < ny; j++)
        for (size_t i = 0; i < nx; i++)
            g->value[j * nx + i] = gsl_histogram2d_get(h, i, j) * scale;
    gsl_histogram2d_free(h);
    *g = (dragarc_scatter_grid){x0, y0, cell, nx, ny, g->value, density, total};
    return DRAGARC_OK;
}

/* ---- highest-density regions --------------------------------------------------------------------------- */

/* Directions along cell edges, counter-clockwise, so that d + 1 is a left turn. Vertex (i, j) is the south-west
 * corner of cell (i, j). The edge leaving vertex (i, j) in direction d has the cell at offset LEFT[d] on its left
 * and the one at RIGHT[d] on its right; it is a boundary edge of the region when the left one is in the region
 * and the right one is not, so the region lies on the left of every boundary edge. */
static const int STEP[4][2] = {{1, 0}, {0, 1}, {-1, 0}, {0, -1}}; /* east, north, west, south */
static const int LEFT[4][2] = {{0, 0}, {-1, 0}, {-1, -1}, {0, -1}};
static const int RIGHT[4][2] = {{0, -1}, {0, 0}, {-1, 0}, {-1, -1}};

/* One traced ring: vertices as indices j (nx + 1) + i, without the closing repeat. */
typedef struct loop {
    uint32_t comp;  /* the 4-connected piece of the region on its left */
    size_t n;       /* vertices (corners only) */
    uint32_t *v;    /* owned */
    long long area; /* twice the signed area, in cells: > 0 counter-clockwise */
} loop;

typedef struct tracer {
    const unsigned char *in; /* in[j nx + i]: cell (i, j) is in the region */
    const uint32_t *comp;    /* its piece */
    long nx, ny;
    unsigned char *visited; /* per vertex, bit d: the edge leaving it in direction d is traced */
    uint32_t *path, *stack; /* a traced ring's vertices; the ring being cut at repeated vertices */
    uint32_t *stack_pos;    /* per vertex: its position on the stack + 1, 0 when not on it */
    loop *loops;
    size_t nloops, cap;
} tracer;

static int in_region(const tracer *t, long i, long j)
{
    return i >= 0 && j >= 0 && i < t->nx && j < t->ny && t->in[j * t->nx + i];
}

static int boundary_edge(const tracer *t, long i, long j, int d)
{
    return in_region(t, i + LEFT[d][0], j + LEFT[d][1]) && !in_region(t, i + RIGHT[d][0], j + RIGHT[d][1]);
}

/* Keep the ring v[0..n-1] (a closed walk along cell edges) as a loop: its corners only, starting at the
 * southernmost, then westernmost, corner. */
static int keep_loop(tracer *t, const uint32_t *v, size_t n, uint32_t comp)
{
    if (t->nloops == t->cap) {
        size_t cap = t->cap ? 2 * t->cap : 16;
        loop *l = realloc(t->loops, cap * sizeof *l);
        if (!l)
            return DRAGARC_ENOMEM;
        t->loops = l;
        t->cap = cap;
    }
    uint32_t *c = malloc(n * sizeof *c);
    if (!c)
        return DRAGARC_ENOMEM;
    long w = t->nx + 1;
    size_t m = 0, first = 0;
    for (size_t k = 0; k < n; k++) {
        uint32_t a = v[(k + n - 1) % n], b = v[k], e = v[(k + 1) % n];
        if ((long)b - (long)a == (long)e - (long)b)
            continue; /* straight on: not a corner */
        if (m > 0 && (b / w < c[first] / w || (b / w == c[first] / w && b % w < c[first] % w)))
            first = m;
        c[m++] = b;
    }
    loop *l = &t->loops[t->nloops++];
    l->comp = comp;
    l->n = m;
    l->v = malloc(m * sizeof *l->v);
    if (!l->v) {
        free(c);
        return DRAGARC_ENOMEM;
    }
    long long area = 0;
    for (size_t k = 0; k < m; k++) {
        l->v[k] = c[(first + k) % m];
        uint32_t a = c[(first + k) % m], b = c[(first + k + 1) % m];
        area += (long long)(a % w) * (long long)(b / w) - (long long)(b % w) * (long long)(a / w);
    }
    l->area = area;
    free(c);
    return DRAGARC_OK;
}

/* Walk the boundary from the edge leaving vertex (i, j) in direction d back to it, turning left where two
 * boundary edges leave a vertex (two cells of the region meeting only at that corner), and keep the rings,
 * cut wherever the walk comes back to a vertex it has already passed. */
static int trace_from(tracer *t, long i, long j, int d, dragarc_error *err)
{
    const long w = t->nx + 1, i0 = i, j0 = j;
    const int d0 = d;
    const uint32_t comp = t->comp[(j + LEFT[d][1]) * t->nx + i + LEFT[d][0]];
    size_t n = 0;
    for (;;) {
        t->visited[j * w + i] |= (unsigned char)(1u << d);
        t->path[n++] = (uint32_t)(j * w + i);
        i += STEP[d][0];
        j += STEP[d][1];
        int next = -1;
        for (int turn = 1; turn <= 3 && next < 0; turn++) { /* left, straight on, right (turn 2 is back) */
            int nd = (d + (turn == 1 ? 1 : turn == 2 ? 0 : 3)) % 4;
            if (boundary_edge(t, i, j, nd))
                next = nd;
        }
        if (next < 0 || (!(i == i0 && j == j0 && next == d0) && (t->visited[j * w + i] & (1u << next))))
            return dragarc_error_set(err, DRAGARC_ESOLVER, "", "internal error tracing a region boundary at "
                                     "vertex (%ld, %ld)", i, j);
        d = next;
        if (i == i0 && j == j0 && d == d0)
            break;
    }
    size_t top = 0;
    int rc = DRAGARC_OK;
    for (size_t k = 0; k < n && rc == DRAGARC_OK; k++) {
        uint32_t v = t->path[k];
        if (t->stack_pos[v]) { /* back at v: the walk since then is a ring of its own */
            size_t s = t->stack_pos[v] - 1;
            rc = keep_loop(t, t->stack + s, top - s, comp);
            for (size_t q = s + 1; q < top; q++)
                t->stack_pos[t->stack[q]] = 0;
            top = s + 1;
        } else {
            t->stack[top++] = v;
            t->stack_pos[v] = (uint32_t)top;
        }
    }
    if (rc == DRAGARC_OK)
        rc = keep_loop(t, t->stack, top, comp);
    for (size_t q = 0; q < top; q++)
        t->stack_pos[t->stack[q]] = 0;
    return rc == DRAGARC_ENOMEM ? dragarc_error_set(err, rc, "", "out of memory keeping a region's rings") : rc;
}

/* Label the 4-connected pieces of the region, numbered in the order of their first cell (south row first, then
 * west first); *ncomp pieces. work holds as many cells as the region. */
static uint32_t label_pieces(const unsigned char *in, long nx, long ny, uint32_t *comp, uint32_t *work)
{
    uint32_t ncomp = 0;
    for (long c = 0; c < nx * ny; c++)
        comp[c] = UINT32_MAX;
    for (long c = 0; c < nx * ny; c++) {
        if (!in[c] || comp[c] != UINT32_MAX)
            continue;
        size_t top = 0;
        comp[c] = ncomp;
        work[top++] = (uint32_t)c;
        while (top > 0) {
            long cur = work[--top], i = cur % nx, j = cur / nx;
            const long nb[4][2] = {{i + 1, j}, {i - 1, j}, {i, j + 1}, {i, j - 1}};
            for (int k = 0; k < 4; k++) {
                long a = nb[k][0], b = nb[k][1];
                if (a >= 0 && b >= 0 && a < nx && b < ny && in[b * nx + a] && comp[b * nx + a] == UINT32_MAX) {
                    comp[b * nx + a] = ncomp;
                    work[top++] = (uint32_t)(b * nx + a);
                }
            }
        }
        ncomp++;
    }
    return ncomp;
}

void dragarc_scatter_region_clear(dragarc_scatter_region *r)
{
    if (!r)
        return;
    for (size_t k = 0; k < r->npolygons; k++) {
        dragarc_scatter_polygon *p = &r->polygons[k];
        free(p->exterior.xy);
        for (size_t h = 0; p->holes && h < p->nholes; h++)
            free(p->holes[h].xy);
        free(p->holes);
    }
    free(r->polygons);
    memset(r, 0, sizeof *r);
}

/* One ring and the break after it, scaled, at x + m, y + m when it fits within cap. */
static size_t outline_ring(const dragarc_scatter_ring *ring, double scale, double *x, double *y, size_t m, size_t cap)
{
    for (size_t i = 0; i < ring->n; i++, m++)
        if (m < cap)
            x[m] = scale * ring->xy[2 * i], y[m] = scale * ring->xy[2 * i + 1];
    if (m < cap)
        x[m] = y[m] = NAN;
    return m + 1;
}

size_t dragarc_scatter_region_outline(const dragarc_scatter_region *r, double scale, double *x, double *y, size_t cap)
{
    size_t m = 0;
    for (size_t k = 0; r && k < r->npolygons; k++) {
        const dragarc_scatter_polygon *p = &r->polygons[k];
        m = outline_ring(&p->exterior, scale, x, y, m, cap);
        for (size_t h = 0; h < p->nholes; h++)
            m = outline_ring(&p->holes[h], scale, x, y, m, cap);
    }
    return m;
}

/* Descending cell indices, to break ties in density (taken from the end: south row first, west first). */
static int by_index_descending(const void *a, const void *b)
{
    size_t x = *(const size_t *)a, y = *(const size_t *)b;
    return (x < y) - (x > y);
}

/* The cells of grid g (checked) in increasing density, ties by decreasing index, into cells[0..*npos-1]: those
 * of positive density only. */
static int cells_by_density(const dragarc_scatter_grid *g, size_t *cells, size_t *npos, dragarc_error *err)
{
    size_t ncell = g->nx * g->ny, np = 0;
    double *v = malloc(ncell * sizeof *v);
    size_t *order = malloc(ncell * sizeof *order);
    if (!v || !order) {
        free(v), free(order);
        return dragarc_error_set(err, DRAGARC_ENOMEM, "", "out of memory sorting %zu cells", ncell);
    }
    for (size_t c = 0; c < ncell; c++)
        if (g->value[c] > 0.0) {
            cells[np] = c;
            v[np++] = g->value[c];
        }
    gsl_sort_index(order, v, 1, np);
    for (size_t k = 0; k < np; k++)
        order[k] = cells[order[k]];
    for (size_t k = 0; k < np;) {
        size_t e = k + 1;
        while (e < np && g->value[order[e]] == g->value[order[k]])
            e++;
        qsort(order + k, e - k, sizeof *order, by_index_descending);
        k = e;
    }
    memcpy(cells, order, np * sizeof *cells);
    free(v), free(order);
    *npos = np;
    return DRAGARC_OK;
}

static int check_grid(const dragarc_scatter_grid *g, dragarc_error *err)
{
    if (g->nx < 1 || g->ny < 1 || (double)g->nx * (double)g->ny > DRAGARC_SCATTER_GRID_MAX_CELLS)
        return dragarc_error_set(err, DRAGARC_EINVAL, "grid.nx", "the grid must have 1 to %d cells (got %zu x %zu)",
                                 DRAGARC_SCATTER_GRID_MAX_CELLS, g->nx, g->ny);
    if (!(isfinite(g->cell) && g->cell > 0.0))
        return dragarc_error_set(err, DRAGARC_EINVAL, "grid.cell", "must be a positive finite size (got %g)", g->cell);
    if (!isfinite(g->x0) || !isfinite(g->y0))
        return dragarc_error_set(err, DRAGARC_EINVAL, "grid.x0", "the corner must be finite (got %g, %g)", g->x0,
                                 g->y0);
    if (!g->value)
        return dragarc_error_set(err, DRAGARC_EINVAL, "grid.value", "is missing");
    int any = 0;
    for (size_t c = 0; c < g->nx * g->ny; c++) {
        if (!(isfinite(g->value[c]) && g->value[c] >= 0.0))
            return dragarc_error_set(err, DRAGARC_EINVAL, "grid.value", "value[%zu] must be a finite density >= 0 "
                                     "(got %g)", c, g->value[c]);
        any |= g->value[c] > 0.0;
    }
    if (!any)
        return dragarc_error_set(err, DRAGARC_EINVAL, "grid.value", "every cell is empty: there is no region");
    return DRAGARC_OK;
}

/* A ring in metres from a loop's vertices, closed. */
static int ring_of(const dragarc_scatter_grid *g, const loop *l, dragarc_scatter_ring *ring)
{
    long w = (long)g->nx + 1;
    ring->xy = malloc(2 * (l->n + 1) * sizeof *ring->xy);
    if (!ring->xy)
        return DRAGARC_ENOMEM;
    ring->n = l->n + 1;
    for (size_t k = 0; k <= l->n; k++) {
        uint32_t v = l->v[k % l->n];
        ring->xy[2 * k] = g->x0 + (double)(v % w) * g->cell;
        ring->xy[2 * k + 1] = g->y0 + (double)(v / w) * g->cell;
    }
    return DRAGARC_OK;
}

/* The polygons of the region from its loops: per piece, its one counter-clockwise loop and its clockwise ones. */
static int polygons_of(const dragarc_scatter_grid *g, const tracer *t, uint32_t ncomp, dragarc_scatter_region *r,
                       dragarc_error *err)
{
    r->polygons = calloc(ncomp, sizeof *r->polygons);
    if (!r->polygons)
        return dragarc_error_set(err, DRAGARC_ENOMEM, "", "out of memory for %u polygons", (unsigned)ncomp);
    r->npolygons = ncomp;
    long long twice = 0;
    for (size_t k = 0; k < t->nloops; k++) {
        dragarc_scatter_polygon *p = &r->polygons[t->loops[k].comp];
        if (t->loops[k].area > 0)
            p->exterior.n++; /* counts the outer rings until they are made */
        else
            p->nholes++;
        twice += t->loops[k].area;
    }
    for (size_t c = 0; c < ncomp; c++) {
        if (r->polygons[c].exterior.n != 1)
            return dragarc_error_set(err, DRAGARC_ESOLVER, "", "internal error: piece %zu has %zu outer rings", c,
                                     r->polygons[c].exterior.n);
        r->polygons[c].exterior.n = 0;
    }
    if (twice != 2 * (long long)r->ncells)
        return dragarc_error_set(err, DRAGARC_ESOLVER, "", "internal error: the rings enclose %lld half cells, not "
                                 "%zu cells", twice, r->ncells);
    for (size_t c = 0; c < ncomp; c++) {
        dragarc_scatter_polygon *p = &r->polygons[c];
        p->holes = p->nholes ? calloc(p->nholes, sizeof *p->holes) : NULL;
        if (p->nholes && !p->holes)
            return dragarc_error_set(err, DRAGARC_ENOMEM, "", "out of memory for %zu holes", p->nholes);
        p->nholes = 0;
    }
    const double cell_area = g->cell * g->cell;
    for (size_t k = 0; k < t->nloops; k++) {
        const loop *l = &t->loops[k];
        dragarc_scatter_polygon *p = &r->polygons[l->comp];
        if (ring_of(g, l, l->area > 0 ? &p->exterior : &p->holes[p->nholes++]) != DRAGARC_OK)
            return dragarc_error_set(err, DRAGARC_ENOMEM, "", "out of memory for a ring of %zu points", l->n + 1);
        p->area += 0.5 * (double)l->area * cell_area;
    }
    return DRAGARC_OK;
}

int dragarc_scatter_region_of(const dragarc_scatter_grid *g, double probability, dragarc_scatter_region *r,
                              dragarc_error *err)
{
    memset(r, 0, sizeof *r);
    if (!(probability > 0.0 && probability <= 1.0))
        return dragarc_error_set(err, DRAGARC_EINVAL, "probability", "must be above 0 and at most 1 (got %g)",
                                 probability);
    int rc = check_grid(g, err);
    if (rc != DRAGARC_OK)
        return rc;
    const long nx = (long)g->nx, ny = (long)g->ny, nvert = (nx + 1) * (ny + 1);
    const size_t ncell = g->nx * g->ny;
    size_t *cells = malloc(ncell * sizeof *cells), npos = 0;
    unsigned char *in = calloc(ncell, 1);
    uint32_t *comp = malloc(ncell * sizeof *comp);
    tracer t = {.in = in, .comp = comp, .nx = nx, .ny = ny};
    t.visited = calloc((size_t)nvert, 1);
    t.stack_pos = calloc((size_t)nvert, sizeof *t.stack_pos);
    if (!cells || !in || !comp || !t.visited || !t.stack_pos) {
        rc = dragarc_error_set(err, DRAGARC_ENOMEM, "", "out of memory for a region on %zu cells", ncell);
        goto done;
    }
    rc = cells_by_density(g, cells, &npos, err);
    if (rc != DRAGARC_OK)
        goto done;
    double total = 0.0, taken = 0.0; /* summed in the same order, so that probability 1 takes every cell */
    for (size_t k = npos; k-- > 0;)
        total += g->value[cells[k]];
    size_t k = npos;
    while (k > 0 && (k == npos || taken < probability * total)) {
        k--;
        taken += g->value[cells[k]];
        in[cells[k]] = 1;
    }
    r->probability = probability;
    r->fraction = taken / total;
    r->density_threshold = g->value[cells[k]];
    r->ncells = npos - k;
    r->area = (double)r->ncells * g->cell * g->cell;
    /* the boundary has at most 4 edges per cell */
    t.path = malloc((4 * r->ncells + 1) * sizeof *t.path);
    t.stack = malloc((4 * r->ncells + 1) * sizeof *t.stack);
    if (!t.path || !t.stack) {
        rc = dragarc_error_set(err, DRAGARC_ENOMEM, "", "out of memory tracing %zu cells", r->ncells);
        goto done;
    }
    uint32_t ncomp = label_pieces(in, nx, ny, comp, t.path);
    for (long j = 0; j <= ny && rc == DRAGARC_OK; j++)
        for (long i = 0; i <= nx && rc == DRAGARC_OK; i++)
            for (int d = 0; d < 4 && rc == DRAGARC_OK; d++)
                if (!(t.visited[j * (nx + 1) + i] & (1u << d)) && boundary_edge(&t, i, j, d))
                    rc = trace_from(&t, i, j, d, err);
    if (rc == DRAGARC_OK)
        rc = polygons_of(g, &t, ncomp, r, err);
done:
    for (size_t q = 0; q < t.nloops; q++)
        free(t.loops[q].v);
    free(t.loops), free(t.path), free(t.stack), free(t.stack_pos), free(t.visited);
    free(cells), free(in), free(comp);
    return rc;
}
