/* test_scatter.c: statistics of weighted impact points against hand arithmetic, GSL and the bivariate normal:
 * moments, dispersion ellipses and their containment, weighted quantiles, the density grid and the
 * highest-density regions traced as polygons; every refused input.
 * SPDX-License-Identifier: GPL-3.0-or-later
 *
 * Sources: the unweighted mean and covariance of GSL (GSL Reference Manual, Statistics: gsl_stats_mean,
 * gsl_stats_covariance, divisor n - 1). The squared Mahalanobis distance of a 2-D normal is chi-square with 2
 * degrees of freedom, P(d <= k) = 1 - exp(-k^2/2) (GSL Reference Manual, gsl_cdf_chisq_P; any statistics text).
 * Normal quantiles: GSL gsl_cdf_gaussian_Pinv; the sample quantile's asymptotic standard deviation
 * sqrt(p (1 - p) / n) / f(x_p) (Cramer, H. 1946, Mathematical Methods of Statistics, section 28.5; recalled).
 * The weighted quantile is Hyndman and Fan's (1996, The American Statistician 50(4):361-365) definition 5 with
 * weights for counts (the library's convention, docs/models.md). The highest-density region of a 2-D normal
 * is the ellipse of containment p, area pi sqrt(det Sigma) (-2 ln(1 - p)) (from the same chi-square law).
 *
 * Tolerances: hand values are a few dozen double operations from exact rationals, held to 1e-12; sampled
 * statistics to 4 of their own standard deviations (the reason is given at each test); ring coordinates are
 * x0 + i cell computed the same way, held to 1e-9 m.
 */
#include <math.h>
#include <stdlib.h>
#include <string.h>

#include <gsl/gsl_cdf.h>
#include <gsl/gsl_randist.h>
#include <gsl/gsl_rng.h>
#include <gsl/gsl_statistics_double.h>

#include "check.h"
#include "dragarc/scatter.h"

#define PI 3.14159265358979323846
#define EXACT 1e-12
#define DEG (PI / 180.0)

/* A sample of n points of a 2-D normal: mean (me, mn), standard deviations se, sn, correlation rho. */
static void normal_sample(unsigned long seed, size_t n, double me, double mn, double se, double sn, double rho,
                          double *east, double *north)
{
    gsl_rng *r = gsl_rng_alloc(gsl_rng_mt19937);
    gsl_rng_set(r, seed);
    for (size_t i = 0; i < n; i++) {
        double x, y;
        gsl_ran_bivariate_gaussian(r, se, sn, rho, &x, &y);
        east[i] = me + x;
        north[i] = mn + y;
    }
    gsl_rng_free(r);
}

/* ---- moments ------------------------------------------------------------------------------------------- */

/* (0, 0) weight 1, (2, 0) weight 1, (0, 4) weight 2: W = 4, mean (2/4, 8/4) = (0.5, 2);
 *   ee: 0.25 + 2.25 + 2 (0.25) = 3;  en: (-0.5)(-2) + (1.5)(-2) + 2 (-0.5)(2) = -4;  nn: 4 + 4 + 2 (4) = 16;
 *   divided by W - 1 = 3: (1, -4/3, 16/3). The same as (0, 4) given twice with weight 1 (GSL, n - 1 = 3). */
TEST(weighted_moments_of_three_points_by_hand)
{
    const double e[3] = {0, 2, 0}, n[3] = {0, 0, 4}, w[3] = {1, 1, 2};
    double mean[2], cov[3];
    CHECK(dragarc_scatter_moments(3, e, n, w, mean, cov, NULL) == DRAGARC_OK);
    CHECK_ABS(mean[0], 0.5, EXACT);
    CHECK_ABS(mean[1], 2.0, EXACT);
    CHECK_ABS(cov[0], 1.0, EXACT);
    CHECK_ABS(cov[1], -4.0 / 3.0, EXACT);
    CHECK_ABS(cov[2], 16.0 / 3.0, EXACT);
    const double e4[4] = {0, 2, 0, 0}, n4[4] = {0, 0, 4, 4};
    CHECK_ABS(gsl_stats_covariance(e4, 1, n4, 1, 4), -4.0 / 3.0, EXACT);
    CHECK_ABS(gsl_stats_variance(n4, 1, 4), 16.0 / 3.0, EXACT);
}

/* dragarc's moments of the n points with these weights are GSL's unweighted ones of the m points re, rn. */
static void check_like_gsl(size_t n, const double *e, const double *nn, const double *w, const double *re,
                           const double *rn, size_t m)
{
    double mean[2], cov[3];
    CHECK(dragarc_scatter_moments(n, e, nn, w, mean, cov, NULL) == DRAGARC_OK);
    CHECK_REL(mean[0], gsl_stats_mean(re, 1, m), EXACT);
    CHECK_REL(mean[1], gsl_stats_mean(rn, 1, m), EXACT);
    CHECK_REL(cov[0], gsl_stats_variance(re, 1, m), EXACT);
    CHECK_REL(cov[1], gsl_stats_covariance(re, 1, rn, 1, m), EXACT);
    CHECK_REL(cov[2], gsl_stats_variance(rn, 1, m), EXACT);
}

/* With every weight 1 (and with NULL weights) the moments are GSL's mean, variance and covariance (n - 1);
 * integer weights equal GSL's on the sample with each point repeated. 1e-12 relative: both are a few thousand
 * additions of terms of one sign or of size ~ the result. */
TEST(unit_weights_give_gsl_covariance_and_integer_weights_repeat_points)
{
    enum { N = 1000 };
    static double e[N], n[N], ones[N], w[N], re[3 * N], rn[3 * N];
    normal_sample(11, N, 100.0, -40.0, 30.0, 12.0, -0.4, e, n);
    size_t m = 0;
    for (size_t i = 0; i < N; i++) {
        ones[i] = 1.0;
        w[i] = (double)(1 + i % 3);
        for (size_t k = 0; k < 1 + i % 3; k++) {
            re[m] = e[i];
            rn[m++] = n[i];
        }
    }
    check_like_gsl(N, e, n, NULL, e, n, N);
    check_like_gsl(N, e, n, ones, e, n, N);
    check_like_gsl(N, e, n, w, re, rn, m);
}

/* ---- ellipses ------------------------------------------------------------------------------------------ */

/* Eigenvalues and axes by hand:
 *   ee 3, en 1, nn 3: lambda = 3 +- 1 = 4, 2; the major axis along (1, 1), north-east: azimuth 45 degrees;
 *     k = 2: semi-axes 2 sqrt 4 = 4 and 2 sqrt 2.  With en = -1 the major axis runs south-east: 135 degrees.
 *   ee 1, en 0, nn 4: major along north (0 degrees), semi-axes 2k and k.  ee 4, nn 1: along east (90).
 *   ee = nn, en = 0: a circle, azimuth 0 by convention. */
TEST(ellipse_axes_and_azimuth_by_hand)
{
    const double c0[2] = {10.0, -5.0};
    const struct {
        double cov[3], k, major, minor, azimuth;
    } cases[] = {
        {{3, 1, 3}, 2.0, 4.0, 2.0 * sqrt(2.0), 45.0},  {{3, -1, 3}, 2.0, 4.0, 2.0 * sqrt(2.0), 135.0},
        {{1, 0, 4}, 3.0, 6.0, 3.0, 0.0},               {{4, 0, 1}, 1.0, 2.0, 1.0, 90.0},
        {{2.25, 0, 2.25}, 1.0, 1.5, 1.5, 0.0},
    };
    for (size_t c = 0; c < sizeof cases / sizeof cases[0]; c++) {
        dragarc_scatter_ellipse ell;
        CHECK(dragarc_scatter_ellipse_of(c0, cases[c].cov, cases[c].k, &ell, NULL) == DRAGARC_OK);
        CHECK_ABS(ell.semi_major, cases[c].major, EXACT);
        CHECK_ABS(ell.semi_minor, cases[c].minor, EXACT);
        CHECK_ABS(ell.azimuth / DEG, cases[c].azimuth, EXACT);
        CHECK(ell.centre[0] == 10.0 && ell.centre[1] == -5.0 && ell.k_sigma == cases[c].k);
        /* containment against GSL's chi-square law with 2 degrees of freedom */
        CHECK_ABS(ell.probability, gsl_cdf_chisq_P(cases[c].k * cases[c].k, 2.0), 1e-15);
    }
    /* the figures quoted in the header: 39.3 %, 86.5 %, 98.9 % */
    dragarc_scatter_ellipse ell;
    const double cov[3] = {1, 0, 1};
    const double quoted[3] = {0.393, 0.865, 0.989};
    for (int k = 1; k <= 3; k++) {
        CHECK(dragarc_scatter_ellipse_of(c0, cov, k, &ell, NULL) == DRAGARC_OK);
        CHECK_ABS(ell.probability, quoted[k - 1], 5e-4);
    }
}

/* k for a probability is the inverse of the containment: sqrt of GSL's chi-square quantile with 2 degrees of
 * freedom; 90 % is 2.146 and 99 % 3.035 (rounded figures). */
TEST(ellipse_k_inverts_the_containment)
{
    const double p[4] = {0.5, 0.9, 0.99, 0.999};
    for (int i = 0; i < 4; i++) {
        double k;
        CHECK(dragarc_scatter_ellipse_k(p[i], &k, NULL) == DRAGARC_OK);
        CHECK_ABS(k, sqrt(gsl_cdf_chisq_Pinv(p[i], 2.0)), 1e-12);
    }
    double k;
    CHECK(dragarc_scatter_ellipse_k(0.9, &k, NULL) == DRAGARC_OK);
    CHECK_ABS(k, 2.146, 5e-4);
    CHECK(dragarc_scatter_ellipse_k(0.99, &k, NULL) == DRAGARC_OK);
    CHECK_ABS(k, 3.035, 5e-4);
}

/* The ring: closed, every point on the ellipse, counter-clockwise with the area of the inscribed polygon at
 * equal steps of the eccentric angle, (m/2) sin(2 pi / m) a b (the affine image of a regular m-gon in the
 * unit circle, area (m/2) sin(2 pi/m)). */
TEST(ellipse_ring_is_closed_counter_clockwise_and_on_the_ellipse)
{
    const double mean[2] = {300.0, -120.0}, cov[3] = {900.0, 400.0, 500.0};
    dragarc_scatter_ellipse ell;
    CHECK(dragarc_scatter_ellipse_of(mean, cov, 2.0, &ell, NULL) == DRAGARC_OK);
    enum { M = 72 };
    double ring[2 * (M + 1)];
    dragarc_scatter_ellipse_ring(&ell, M, ring);
    CHECK(ring[0] == ring[2 * M] && ring[1] == ring[2 * M + 1]);
    double area2 = 0.0, worst = 0.0;
    const double det = cov[0] * cov[2] - cov[1] * cov[1];
    for (int k = 0; k < M; k++) {
        area2 += ring[2 * k] * ring[2 * k + 3] - ring[2 * k + 2] * ring[2 * k + 1];
        double de = ring[2 * k] - mean[0], dn = ring[2 * k + 1] - mean[1];
        double d2 = (cov[2] * de * de - 2.0 * cov[1] * de * dn + cov[0] * dn * dn) / det; /* Mahalanobis^2 */
        worst = fmax(worst, fabs(d2 - 4.0));
    }
    CHECK(worst <= 1e-12);
    CHECK_REL(0.5 * area2, 0.5 * M * sin(2.0 * PI / M) * ell.semi_major * ell.semi_minor, 1e-12);
    CHECK_REL(ell.semi_major * ell.semi_minor, 4.0 * sqrt(det), 1e-12);
}

/* A correlated normal sample (n = 200000, fixed seed): the weighted fractions inside the 1, 2 and 3 sigma
 * ellipses of its own mean and covariance against 1 - exp(-k^2/2) = gsl_cdf_chisq_P(k^2, 2). The count inside
 * is binomial, standard error sqrt(p (1 - p) / n) (0.0011, 0.00076, 0.00023); 4 of them: the chance that a
 * correct implementation fails on an arbitrary seed is 2 P(Z > 4) = 6.3e-5 per check, under 2e-4 for the
 * three (n p (1 - p) >= 2000, so the normal approximation holds). Using the sample's own mean and covariance
 * moves the expected fraction by O(1/n) (recalled: then n d^2 / (n - 1)^2 follows Beta(1, (n - 3)/2),
 * Gnanadesikan, R. and Kettenring, J. R. 1972, Biometrics 28:81-124), about 1e-5 here, negligible. Weights:
 * every point repeated by weight 2 changes nothing. */
TEST(fractions_inside_the_sigma_ellipses_match_the_chi_square_law)
{
    enum { N = 200000 };
    double *e = malloc(N * sizeof *e), *n = malloc(N * sizeof *n), *w = malloc(N * sizeof *w);
    normal_sample(2026, N, 500.0, -200.0, 300.0, 120.0, 0.6, e, n);
    for (size_t i = 0; i < N; i++)
        w[i] = 2.0;
    double mean[2], cov[3];
    CHECK(dragarc_scatter_moments(N, e, n, NULL, mean, cov, NULL) == DRAGARC_OK);
    for (int k = 1; k <= 3; k++) {
        dragarc_scatter_ellipse ell;
        double f, fw, p = gsl_cdf_chisq_P((double)(k * k), 2.0);
        CHECK(dragarc_scatter_ellipse_of(mean, cov, k, &ell, NULL) == DRAGARC_OK);
        CHECK(dragarc_scatter_fraction_inside(N, e, n, NULL, &ell, &f, NULL) == DRAGARC_OK);
        CHECK(dragarc_scatter_fraction_inside(N, e, n, w, &ell, &fw, NULL) == DRAGARC_OK);
        printf("  %d sigma: inside %.5f, chi-square %.5f, %+.2f standard errors\n", k, f, p,
               (f - p) / sqrt(p * (1 - p) / N));
        CHECK_ABS(f, p, 4.0 * sqrt(p * (1.0 - p) / N));
        CHECK_ABS(fw, f, 1e-15);
    }
    free(e), free(n), free(w);
}

/* By hand: the ellipse of cov (4, 0, 1), k = 1, centred at 0: semi-axes 2 (east) and 1. Points (1.9, 0) in,
 * (0, 1.1) out, (2, 0) on the boundary (in), (0, 0.9) in, weights 1, 2, 3, 4: (1 + 3 + 4) / 10 = 0.8. */
TEST(fraction_inside_weighs_the_points_by_hand)
{
    const double zero[2] = {0, 0}, cov[3] = {4, 0, 1}, e[4] = {1.9, 0, 2, 0}, n[4] = {0, 1.1, 0, 0.9},
                 w[4] = {1, 2, 3, 4};
    dragarc_scatter_ellipse ell;
    double f;
    CHECK(dragarc_scatter_ellipse_of(zero, cov, 1.0, &ell, NULL) == DRAGARC_OK);
    CHECK(dragarc_scatter_fraction_inside(4, e, n, w, &ell, &f, NULL) == DRAGARC_OK);
    CHECK_ABS(f, 0.8, EXACT);
}

/* ---- quantiles ----------------------------------------------------------------------------------------- */

/* Values 3, 1, 4, 2 with weights 2, 1, 4, 1 (W = 8): sorted 1, 2, 3, 4, cumulative 1, 2, 4, 8, positions
 * (C - w/2)/W = 0.0625, 0.1875, 0.375, 0.75.
 *   p 0.05 -> 1 (below the first);  p 0.25 -> 2 + (0.25 - 0.1875)/0.1875 = 7/3;  p 0.5 -> 3 + 0.125/0.375 =
 *   10/3;  p 0.75 -> 4;  p 1 -> 4;  p 0 -> 1.
 * The same values with weight 1 each repeated (1, 2, 3, 3, 4, 4, 4, 4) give the same quantiles (equal values
 * merge); a point of weight 0 is ignored. */
TEST(weighted_quantiles_of_four_values_by_hand)
{
    const double v[5] = {3, 1, 4, 2, 100}, w[5] = {2, 1, 4, 1, 0}, rep[8] = {4, 3, 1, 4, 2, 4, 3, 4};
    const double p[6] = {0.05, 0.25, 0.5, 0.75, 1.0, 0.0}, want[6] = {1, 7.0 / 3.0, 10.0 / 3.0, 4, 4, 1};
    double q[6], qr[6];
    CHECK(dragarc_scatter_quantiles(5, v, w, p, 6, q, NULL) == DRAGARC_OK);
    CHECK(dragarc_scatter_quantiles(8, rep, NULL, p, 6, qr, NULL) == DRAGARC_OK);
    for (int k = 0; k < 6; k++) {
        CHECK_ABS(q[k], want[k], EXACT);
        CHECK_ABS(qr[k], want[k], EXACT);
    }
    /* equal weights, no ties: Hyndman and Fan's definition 5, the median of 1..4 is 2.5, the 0.3 quantile at
     * position 4 (0.3) + 1/2 = 1.7: 1.7 */
    const double four[4] = {4, 1, 3, 2}, p2[2] = {0.5, 0.3};
    CHECK(dragarc_scatter_quantiles(4, four, NULL, p2, 2, q, NULL) == DRAGARC_OK);
    CHECK_ABS(q[0], 2.5, EXACT);
    CHECK_ABS(q[1], 1.7, EXACT);
}

/* A normal sample rotated onto an azimuth of 35 degrees: downrange N(1000, 300), crossrange N(-50, 80), n =
 * 100000. Each quantile against the normal's (GSL gsl_cdf_gaussian_Pinv) within 4 standard deviations of the
 * sample quantile, sqrt(p (1 - p) / n) / f(x_p) (Cramer 1946, recalled): false-failure chance 6.3e-5 per check
 * by the normal approximation that the asymptotic law gives. Downrange and crossrange point the right way: a
 * point east of the origin is right of north; a point south is right of east. */
TEST(downrange_and_crossrange_quantiles_of_a_rotated_normal_sample)
{
    enum { N = 100000 };
    double *e = malloc(N * sizeof *e), *n = malloc(N * sizeof *n), *d = malloc(N * sizeof *d),
           *c = malloc(N * sizeof *c);
    normal_sample(35, N, 1000.0, -50.0, 300.0, 80.0, 0.0, d, c);
    const double az = 35.0 * DEG;
    for (size_t i = 0; i < N; i++) {
        e[i] = d[i] * sin(az) + c[i] * cos(az);
        n[i] = d[i] * cos(az) - c[i] * sin(az);
    }
    const double p[5] = {0.01, 0.1, 0.5, 0.9, 0.99};
    double down[5], cross[5];
    CHECK(dragarc_scatter_extent(N, e, n, NULL, az, p, 5, down, cross, NULL) == DRAGARC_OK);
    for (int k = 0; k < 5; k++) {
        double z = gsl_cdf_ugaussian_Pinv(p[k]), sd = sqrt(p[k] * (1.0 - p[k]) / N) / gsl_ran_ugaussian_pdf(z);
        printf("  p %.2f: down %.2f (normal %.2f), cross %.2f (normal %.2f)\n", p[k], down[k],
               1000.0 + gsl_cdf_gaussian_Pinv(p[k], 300.0), cross[k], -50.0 + gsl_cdf_gaussian_Pinv(p[k], 80.0));
        CHECK_ABS(down[k], 1000.0 + gsl_cdf_gaussian_Pinv(p[k], 300.0), 4.0 * 300.0 * sd);
        CHECK_ABS(cross[k], -50.0 + gsl_cdf_gaussian_Pinv(p[k], 80.0), 4.0 * 80.0 * sd);
    }
    free(e), free(n), free(d), free(c);
    const double one_e[1] = {1.0}, one_n[1] = {0.0}, south_e[1] = {0.0}, south_n[1] = {-1.0}, half[1] = {0.5};
    double dd, cc;
    CHECK(dragarc_scatter_extent(1, one_e, one_n, NULL, 0.0, half, 1, &dd, &cc, NULL) == DRAGARC_OK);
    CHECK_ABS(dd, 0.0, EXACT);
    CHECK_ABS(cc, 1.0, EXACT);
    CHECK(dragarc_scatter_extent(1, south_e, south_n, NULL, 90.0 * DEG, half, 1, &dd, &cc, NULL) == DRAGARC_OK);
    CHECK_ABS(dd, 0.0, EXACT);
    CHECK_ABS(cc, 1.0, EXACT);
}

/* A value per point: energies 5, 20, 40, 10 J with weights 3, 1, 2, 4: mean (15 + 20 + 80 + 40)/10 = 15.5;
 * above 15 J: (1 + 2)/10 = 0.3; above 20 J (strictly): 0.2; above 100 J: 0. */
TEST(mean_and_fraction_above_a_threshold_by_hand)
{
    const double v[4] = {5, 20, 40, 10}, w[4] = {3, 1, 2, 4};
    double m, f;
    CHECK(dragarc_scatter_mean(4, v, w, &m, NULL) == DRAGARC_OK);
    CHECK_ABS(m, 15.5, EXACT);
    CHECK(dragarc_scatter_fraction_above(4, v, w, 15.0, &f, NULL) == DRAGARC_OK);
    CHECK_ABS(f, 0.3, EXACT);
    CHECK(dragarc_scatter_fraction_above(4, v, w, 20.0, &f, NULL) == DRAGARC_OK);
    CHECK_ABS(f, 0.2, EXACT);
    CHECK(dragarc_scatter_fraction_above(4, v, w, 100.0, &f, NULL) == DRAGARC_OK);
    CHECK(f == 0.0);
    CHECK(dragarc_scatter_fraction_above(4, v, NULL, 7.0, &f, NULL) == DRAGARC_OK);
    CHECK_ABS(f, 0.75, EXACT);
}

/* ---- density grid -------------------------------------------------------------------------------------- */

/* Points (0.5, 0.5) weight 1, (1.5, 0.5) weight 2, (1.2, 0.7) weight 3 on 1 m cells: the grid starts one cell
 * west and south of the cell of the smallest coordinates, x0 = y0 = -1, and ends one cell beyond the largest:
 * nx = 4, ny = 3. Cell (1, 1) holds 1, cell (2, 1) holds 5, over 1e-6 km^2: 1e6 and 5e6 per km^2; as
 * probability 1/6 and 5/6 of that. */
TEST(a_density_grid_by_hand)
{
    const double e[3] = {0.5, 1.5, 1.2}, n[3] = {0.5, 0.5, 0.7}, w[3] = {1, 2, 3};
    dragarc_scatter_grid g;
    CHECK(dragarc_scatter_grid_build(3, e, n, w, 1.0, DRAGARC_SCATTER_WEIGHT_PER_KM2, &g, NULL) == DRAGARC_OK);
    CHECK(g.nx == 4 && g.ny == 3 && g.x0 == -1.0 && g.y0 == -1.0 && g.cell == 1.0);
    CHECK_ABS(g.total_weight, 6.0, EXACT);
    for (size_t c = 0; c < g.nx * g.ny; c++) {
        double want = c == 1 * 4 + 1 ? 1e6 : c == 1 * 4 + 2 ? 5e6 : 0.0;
        CHECK_REL(g.value[c] + 1.0, want + 1.0, EXACT);
    }
    dragarc_scatter_grid_clear(&g);
    CHECK(dragarc_scatter_grid_build(3, e, n, w, 1.0, DRAGARC_SCATTER_PROBABILITY_PER_KM2, &g, NULL) == DRAGARC_OK);
    CHECK_REL(g.value[5], 1e6 / 6.0, EXACT);
    CHECK_REL(g.value[6], 5e6 / 6.0, EXACT);
    dragarc_scatter_grid_clear(&g);
    dragarc_scatter_grid_clear(NULL);
}

/* The total weight is kept: sum of value x cell area (km^2) = the total weight (or 1 as probability), to
 * rounding (1e-12 relative over 20000 terms). The automatic cell is Scott's 3.504 sigma_2 n^(-1/4): for this
 * sample the covariance's smaller eigenvalue from dragarc_scatter_moments. */
TEST(the_density_grid_keeps_the_total_weight_and_sizes_its_cells_by_scotts_rule)
{
    enum { N = 20000 };
    double *e = malloc(N * sizeof *e), *n = malloc(N * sizeof *n), *w = malloc(N * sizeof *w);
    normal_sample(7, N, -300.0, 800.0, 250.0, 90.0, -0.3, e, n);
    double total = 0.0;
    for (size_t i = 0; i < N; i++)
        total += (w[i] = 1.0 + (double)(i % 7));
    double mean[2], cov[3];
    CHECK(dragarc_scatter_moments(N, e, n, w, mean, cov, NULL) == DRAGARC_OK);
    double lambda2 = 0.5 * (cov[0] + cov[2]) - hypot(0.5 * (cov[0] - cov[2]), cov[1]);
    /* Scott's constant 2 3^(1/(d+2)) pi^(d/(2(d+2))) for d = 2 */
    CHECK_ABS(2.0 * pow(3.0, 0.25) * pow(PI, 0.25), 3.504, 5e-4);
    for (int kind = 0; kind < 2; kind++) {
        dragarc_scatter_grid g;
        CHECK(dragarc_scatter_grid_build(N, e, n, w, 0.0, (dragarc_scatter_density)kind, &g, NULL) == DRAGARC_OK);
        CHECK_REL(g.cell, 3.504 * sqrt(lambda2) * pow(N, -0.25), 1e-9);
        double sum = 0.0, area = g.cell * g.cell * 1e-6;
        for (size_t c = 0; c < g.nx * g.ny; c++)
            sum += g.value[c] * area;
        CHECK_REL(sum, kind == 0 ? total : 1.0, 1e-12);
        /* one empty cell all round */
        double edge = 0.0;
        for (size_t i = 0; i < g.nx; i++)
            edge += g.value[i] + g.value[(g.ny - 1) * g.nx + i];
        for (size_t j = 0; j < g.ny; j++)
            edge += g.value[j * g.nx] + g.value[j * g.nx + g.nx - 1];
        CHECK(edge == 0.0);
        if (kind == 0)
            printf("  auto cell %.3f m, %zu x %zu cells, sum %.12g for %.12g\n", g.cell, g.nx, g.ny, sum, total);
        dragarc_scatter_grid_clear(&g);
    }
    free(e), free(n), free(w);
}

/* ---- highest-density regions: hand-made cells ------------------------------------------------------------ */

#define X0 100.0
#define Y0 (-50.0)
#define CELL 10.0

/* A grid from rows of text, the first row northmost: 'X' a cell of density 1, '.' an empty cell. */
static dragarc_scatter_grid grid_of(const char *const *rows, size_t nrows)
{
    dragarc_scatter_grid g = {.x0 = X0, .y0 = Y0, .cell = CELL, .nx = strlen(rows[0]), .ny = nrows};
    g.value = calloc(g.nx * g.ny, sizeof *g.value);
    for (size_t r = 0; r < nrows; r++)
        for (size_t i = 0; i < g.nx; i++)
            g.value[(nrows - 1 - r) * g.nx + i] = rows[r][i] == 'X' ? 1.0 : 0.0;
    return g;
}

/* Twice the signed area of a closed ring (the shoelace formula about its first point, free of the cancellation
 * that coordinates far from the origin would bring). */
static double ring_area2(const dragarc_scatter_ring *r)
{
    double a = 0.0, e0 = r->xy[0], n0 = r->xy[1];
    for (size_t k = 0; k + 1 < r->n; k++)
        a += (r->xy[2 * k] - e0) * (r->xy[2 * k + 3] - n0) - (r->xy[2 * k + 2] - e0) * (r->xy[2 * k + 1] - n0);
    return a;
}

/* A ring is well formed: closed, at least a rectangle, no point twice (so no repeated consecutive points and
 * no self-touching), edges along the axes. */
static void check_ring(const dragarc_scatter_ring *r)
{
    CHECK(r->n >= 5);
    CHECK(r->xy[0] == r->xy[2 * (r->n - 1)] && r->xy[1] == r->xy[2 * (r->n - 1) + 1]);
    int twice = 0, slanted = 0;
    for (size_t a = 0; a + 1 < r->n; a++) {
        for (size_t b = a + 1; b + 1 < r->n; b++)
            twice += r->xy[2 * a] == r->xy[2 * b] && r->xy[2 * a + 1] == r->xy[2 * b + 1];
        slanted += r->xy[2 * a] != r->xy[2 * a + 2] && r->xy[2 * a + 1] != r->xy[2 * a + 3];
    }
    CHECK(twice == 0);
    CHECK(slanted == 0);
}

/* Every ring well formed, exteriors counter-clockwise, holes clockwise; each polygon's area its exterior's less
 * its holes'; the areas add up to the region's, ncells cells. */
static void check_region(const dragarc_scatter_region *r, double cell)
{
    double sum = 0.0;
    for (size_t p = 0; p < r->npolygons; p++) {
        const dragarc_scatter_polygon *poly = &r->polygons[p];
        check_ring(&poly->exterior);
        double a = ring_area2(&poly->exterior);
        CHECK(a > 0.0);
        for (size_t h = 0; h < poly->nholes; h++) {
            check_ring(&poly->holes[h]);
            CHECK(ring_area2(&poly->holes[h]) < 0.0);
            a += ring_area2(&poly->holes[h]);
        }
        CHECK_REL(0.5 * a, poly->area, 1e-12);
        sum += poly->area;
    }
    CHECK_REL(sum, r->area, 1e-12);
    CHECK_REL(r->area, (double)r->ncells * cell * cell, 1e-15);
}

/* The ring is exactly the given corners (cell units from the grid's corner), closed. */
static void check_corners(const dragarc_scatter_ring *r, const int *ij, size_t m)
{
    CHECK(r->n == m + 1);
    if (r->n != m + 1)
        return;
    for (size_t k = 0; k <= m; k++) {
        CHECK_ABS(r->xy[2 * k], X0 + CELL * ij[2 * (k % m)], 1e-9);
        CHECK_ABS(r->xy[2 * k + 1], Y0 + CELL * ij[2 * (k % m) + 1], 1e-9);
    }
}

/* Whether (x, y) lies inside the ring, by the crossing number (W. R. Franklin's test; the point is never on a
 * vertex's level here: cell centres sit half a cell off every edge). */
static int inside_ring(const dragarc_scatter_ring *r, double x, double y)
{
    int in = 0;
    for (size_t k = 0; k + 1 < r->n; k++) {
        double xa = r->xy[2 * k], ya = r->xy[2 * k + 1], xb = r->xy[2 * k + 2], yb = r->xy[2 * k + 3];
        if ((ya > y) != (yb > y) && x < xa + (y - ya) * (xb - xa) / (yb - ya))
            in = !in;
    }
    return in;
}

/* The polygons hold exactly the cells of positive density (probability 1): every cell's centre lies in one
 * polygon (inside its exterior, outside its holes) when the cell has weight, in none otherwise. */
static void check_exact_cover(const dragarc_scatter_region *r, const dragarc_scatter_grid *g)
{
    int wrong = 0;
    for (size_t j = 0; j < g->ny; j++)
        for (size_t i = 0; i < g->nx; i++) {
            double x = g->x0 + ((double)i + 0.5) * g->cell, y = g->y0 + ((double)j + 0.5) * g->cell;
            int in = 0;
            for (size_t p = 0; p < r->npolygons; p++) {
                int here = inside_ring(&r->polygons[p].exterior, x, y);
                for (size_t h = 0; here && h < r->polygons[p].nholes; h++)
                    here = !inside_ring(&r->polygons[p].holes[h], x, y);
                in += here;
            }
            wrong += in != (g->value[j * g->nx + i] > 0.0);
        }
    CHECK(wrong == 0);
}

/* The region of every marked cell (probability 1) of the rows, checked as check_region and check_exact_cover. */
static void region_of_rows(const char *const *rows, size_t nrows, dragarc_scatter_region *r)
{
    dragarc_scatter_grid g = grid_of(rows, nrows);
    CHECK(dragarc_scatter_region_of(&g, 1.0, r, NULL) == DRAGARC_OK);
    check_region(r, CELL);
    check_exact_cover(r, &g);
    CHECK(r->fraction == 1.0);
    dragarc_scatter_grid_clear(&g);
}

/* The corners of one expected ring (cell units from the grid's corner), and of one expected polygon. */
typedef struct ring_want {
    size_t m;
    int ij[24];
} ring_want;

typedef struct polygon_want {
    ring_want exterior;
    size_t nholes;
    ring_want holes[2];
} polygon_want;

/* The region of the marked cells of the rows has ncells cells in the polygons want[0..npolygons-1], in order. */
static void check_hand_region(const char *const *rows, size_t nrows, size_t ncells, size_t npolygons,
                              const polygon_want *want)
{
    dragarc_scatter_region r;
    region_of_rows(rows, nrows, &r);
    CHECK(r.ncells == ncells);
    CHECK(r.npolygons == npolygons);
    for (size_t p = 0; p < r.npolygons && p < npolygons; p++) {
        check_corners(&r.polygons[p].exterior, want[p].exterior.ij, want[p].exterior.m);
        CHECK(r.polygons[p].nholes == want[p].nholes);
        for (size_t h = 0; h < r.polygons[p].nholes && h < want[p].nholes; h++)
            check_corners(&r.polygons[p].holes[h], want[p].holes[h].ij, want[p].holes[h].m);
    }
    dragarc_scatter_region_clear(&r);
}

/* An L of three cells: one counter-clockwise ring of six corners from its south-west corner. */
TEST(an_l_of_three_cells_is_one_ring_of_six_corners)
{
    const char *rows[] = {"....", ".X..", ".XX.", "...."};
    const polygon_want want[] = {{{6, {1, 1, 3, 1, 3, 2, 2, 2, 2, 3, 1, 3}}, 0, {{0, {0}}}}};
    check_hand_region(rows, 4, 3, 1, want);
}

/* A square frame of eight cells: an exterior and a clockwise hole of one cell, the hole from its south-west
 * corner going north first. */
TEST(a_frame_of_cells_has_a_clockwise_hole)
{
    const char *rows[] = {".....", ".XXX.", ".X.X.", ".XXX.", "....."};
    const polygon_want want[] = {{{4, {1, 1, 4, 1, 4, 4, 1, 4}}, 1, {{4, {2, 2, 2, 3, 3, 3, 3, 2}}}}};
    check_hand_region(rows, 5, 8, 1, want);
}

/* The outline of a region for plotting: the frame of eight cells (an exterior of 4 corners and a hole of 4, each
 * ring closed: 5 points) is 5 + 1 + 5 + 1 points, each ring followed by a NaN break, the coordinates those of the
 * rings times the scale; asked with too little room it writes no more than it may and still says what it needs. */
TEST(a_region_outline_is_its_rings_scaled_each_ended_by_a_break)
{
    const char *rows[] = {".....", ".XXX.", ".X.X.", ".XXX.", "....."};
    dragarc_scatter_region r;
    region_of_rows(rows, 5, &r);
    CHECK(dragarc_scatter_region_outline(&r, 1e-3, NULL, NULL, 0) == 12);
    double x[13], y[13];
    x[12] = y[12] = 7.0; /* beyond cap: must stay */
    CHECK(dragarc_scatter_region_outline(&r, 1e-3, x, y, 12) == 12);
    const dragarc_scatter_ring *ring[2] = {&r.polygons[0].exterior, &r.polygons[0].holes[0]};
    for (int k = 0; k < 2; k++) {
        CHECK(ring[k]->n == 5);
        for (size_t i = 0; i < 5; i++) {
            CHECK(x[6 * k + i] == 1e-3 * ring[k]->xy[2 * i]);
            CHECK(y[6 * k + i] == 1e-3 * ring[k]->xy[2 * i + 1]);
        }
        CHECK(isnan(x[6 * k + 5]) && isnan(y[6 * k + 5]));
    }
    CHECK(x[12] == 7.0 && y[12] == 7.0);
    x[3] = 7.0;
    CHECK(dragarc_scatter_region_outline(&r, 1.0, x, y, 3) == 12 && x[3] == 7.0 && x[2] == ring[0]->xy[4]);
    CHECK(dragarc_scatter_region_outline(NULL, 1.0, x, y, 3) == 0);
    dragarc_scatter_region_clear(&r);
}

/* Two blobs apart: two polygons, in the order of their south-west cells (south row first, then west). */
TEST(two_separate_blobs_are_two_polygons)
{
    const char *rows[] = {"......", ".X....", ".X..X.", "......"};
    const polygon_want want[] = {{{4, {1, 1, 2, 1, 2, 3, 1, 3}}, 0, {{0, {0}}}},
                                 {{4, {4, 1, 5, 1, 5, 2, 4, 2}}, 0, {{0, {0}}}}};
    check_hand_region(rows, 4, 3, 2, want);
}

/* Two cells touching at a corner only are two polygons that share that corner (the convention: cells join
 * across an edge, never across a corner, so no ring passes through a point twice). */
TEST(cells_touching_at_a_corner_are_two_polygons)
{
    const char *rows[] = {"....", "..X.", ".X..", "...."};
    const polygon_want want[] = {{{4, {1, 1, 2, 1, 2, 2, 1, 2}}, 0, {{0, {0}}}},
                                 {{4, {2, 2, 3, 2, 3, 3, 2, 3}}, 0, {{0, {0}}}}};
    check_hand_region(rows, 4, 2, 2, want);
}

/* An empty cell inside that touches an outside notch at a corner: the boundary walk passes (3, 2) twice; it is
 * cut there into the exterior and a one-cell hole, which touch at that corner. */
TEST(a_hole_touching_the_outside_at_a_corner_is_cut_off_as_a_hole)
{
    const char *rows[] = {".....", ".XXX.", ".X.X.", ".XX..", "....."};
    const polygon_want want[] = {{{6, {1, 1, 3, 1, 3, 2, 4, 2, 4, 4, 1, 4}}, 1, {{4, {2, 2, 2, 3, 3, 3, 3, 2}}}}};
    check_hand_region(rows, 5, 7, 1, want);
}

/* Four bars joined only at their corners around an empty square: four polygons (south, west, east, north), no
 * hole: the empty square is not enclosed by any one piece. */
TEST(bars_joined_at_corners_are_separate_polygons_without_holes)
{
    const char *rows[] = {"......", "..XX..", ".X..X.", ".X..X.", "..XX..", "......"};
    const polygon_want want[] = {{{4, {2, 1, 4, 1, 4, 2, 2, 2}}, 0, {{0, {0}}}},
                                 {{4, {1, 2, 2, 2, 2, 4, 1, 4}}, 0, {{0, {0}}}},
                                 {{4, {4, 2, 5, 2, 5, 4, 4, 4}}, 0, {{0, {0}}}},
                                 {{4, {2, 4, 4, 4, 4, 5, 2, 5}}, 0, {{0, {0}}}}};
    check_hand_region(rows, 6, 8, 4, want);
}

/* An island inside a lake inside a frame: two polygons, the frame with one hole, the island with none. */
TEST(an_island_in_a_hole_is_a_polygon_of_its_own)
{
    const char *rows[] = {".......", ".XXXXX.", ".X...X.", ".X.X.X.", ".X...X.", ".XXXXX.", "......."};
    const polygon_want want[] = {{{4, {1, 1, 6, 1, 6, 6, 1, 6}}, 1, {{4, {2, 2, 2, 5, 5, 5, 5, 2}}}},
                                 {{4, {3, 3, 4, 3, 4, 4, 3, 4}}, 0, {{0, {0}}}}};
    check_hand_region(rows, 7, 17, 2, want);
}

/* Random cells (40 x 30, each marked with probability 0.3, 0.5, 0.7; 20 seeds each): full of corners where
 * cells meet only diagonally, holes that touch, islands in holes. Every ring simple, oriented, areas adding up,
 * and the polygons holding exactly the marked cells (check_exact_cover). */
TEST(random_cells_give_simple_rings_that_hold_exactly_those_cells)
{
    gsl_rng *rng = gsl_rng_alloc(gsl_rng_mt19937);
    size_t most = 0, holes = 0;
    for (int fill = 3; fill <= 7; fill += 2)
        for (unsigned long seed = 1; seed <= 20; seed++) {
            gsl_rng_set(rng, seed);
            dragarc_scatter_grid g = {.x0 = -1234.5, .y0 = 678.25, .cell = 2.5, .nx = 40, .ny = 30};
            g.value = calloc(g.nx * g.ny, sizeof *g.value);
            for (size_t c = 0; c < g.nx * g.ny; c++)
                g.value[c] = gsl_rng_uniform(rng) < 0.1 * fill ? 1.0 + (double)(c % 5) : 0.0;
            dragarc_scatter_region r;
            CHECK(dragarc_scatter_region_of(&g, 1.0, &r, NULL) == DRAGARC_OK);
            check_region(&r, g.cell);
            check_exact_cover(&r, &g);
            most = r.npolygons > most ? r.npolygons : most;
            for (size_t p = 0; p < r.npolygons; p++)
                holes += r.polygons[p].nholes;
            dragarc_scatter_region_clear(&r);
            dragarc_scatter_grid_clear(&g);
        }
    printf("  60 random grids: up to %zu polygons, %zu holes in all\n", most, holes);
    gsl_rng_free(rng);
}

/* The smallest set: densities 1..9 on a 3 x 3 grid (total 45); half of it needs 9 + 8 + 7 = 24 (24/45), since
 * 9 + 8 = 17 < 22.5. Equal densities are taken south row first, then west: four equal cells in a row, half
 * of them is the two westmost. */
TEST(the_region_is_the_smallest_set_of_densest_cells)
{
    dragarc_scatter_grid g = {.x0 = X0, .y0 = Y0, .cell = CELL, .nx = 3, .ny = 3};
    const double v[9] = {4, 9, 1, 7, 8, 2, 3, 5, 6};
    g.value = malloc(9 * sizeof *g.value);
    memcpy(g.value, v, sizeof v);
    dragarc_scatter_region r;
    CHECK(dragarc_scatter_region_of(&g, 0.5, &r, NULL) == DRAGARC_OK);
    CHECK(r.ncells == 3 && r.density_threshold == 7.0 && r.probability == 0.5);
    CHECK_ABS(r.fraction, 24.0 / 45.0, EXACT);
    check_region(&r, CELL);
    CHECK(r.npolygons == 1);
    if (r.npolygons == 1) /* cells (1, 0), (0, 1), (1, 1): an L */
        check_corners(&r.polygons[0].exterior, (const int[]){1, 0, 2, 0, 2, 2, 0, 2, 0, 1, 1, 1}, 6);
    dragarc_scatter_region_clear(&r);
    dragarc_scatter_grid_clear(&g);

    const char *row[] = {"XXXX"};
    g = grid_of(row, 1);
    CHECK(dragarc_scatter_region_of(&g, 0.5, &r, NULL) == DRAGARC_OK);
    CHECK(r.ncells == 2 && r.npolygons == 1);
    if (r.npolygons == 1)
        check_corners(&r.polygons[0].exterior, (const int[]){0, 0, 2, 0, 2, 1, 0, 1}, 4);
    dragarc_scatter_region_clear(&r);
    dragarc_scatter_grid_clear(&g);
}

/* ---- highest-density regions of a normal sample ---------------------------------------------------------- */

/* n = 200000 from a correlated normal, the grid's automatic cell h. For p = 0.9, 0.99: the fraction reached is
 * at least p and minimal (less the last cell's share it falls under p); every ring well formed. The 90 %
 * region's area against the normal's 90 % ellipse, pi sqrt(det Sigma) (-2 ln 0.1). Tolerance: the cells the
 * true contour crosses form a band of mean area (4/pi) L h (Cauchy-Crofton: a curve of length L meets (4/pi) L /
 * h lines of a square lattice of spacing h on average, each crossing in one cell; recalled); the region can
 * differ from the ellipse only in cells near the contour, so (4/pi) L h with L the ellipse's perimeter
 * (Ramanujan's approximation). The sampling noise in the cell counts (about 10 % at the contour, 88 points a
 * cell) moves the boundary by under a cell where the density falls 30 % a cell, so stays within that band. */
TEST(the_90_percent_region_of_a_normal_sample_matches_its_ellipse)
{
    enum { N = 200000 };
    const double se = 400.0, sn = 150.0, rho = 0.5;
    double *e = malloc(N * sizeof *e), *n = malloc(N * sizeof *n);
    normal_sample(90, N, 2000.0, 1000.0, se, sn, rho, e, n);
    dragarc_scatter_grid g;
    CHECK(dragarc_scatter_grid_build(N, e, n, NULL, 0.0, DRAGARC_SCATTER_PROBABILITY_PER_KM2, &g, NULL) ==
          DRAGARC_OK);
    const double p[2] = {0.9, 0.99};
    for (int k = 0; k < 2; k++) {
        dragarc_scatter_region r;
        CHECK(dragarc_scatter_region_of(&g, p[k], &r, NULL) == DRAGARC_OK);
        check_region(&r, g.cell);
        double last = r.density_threshold * g.cell * g.cell * 1e-6; /* the last cell's share (probability/km^2) */
        CHECK(r.fraction >= p[k]);
        CHECK(r.fraction - last < p[k]);
        double det = se * se * sn * sn * (1.0 - rho * rho), want = PI * sqrt(det) * (-2.0 * log(1.0 - p[k]));
        /* semi-axes k sqrt(lambda_1), k sqrt(lambda_2) of the true covariance */
        double ka = sqrt(-2.0 * log(1.0 - p[k]));
        double l1 = 0.5 * (se * se + sn * sn) + hypot(0.5 * (se * se - sn * sn), rho * se * sn);
        double l2 = det / l1, A = ka * sqrt(l1), B = ka * sqrt(l2), hh = (A - B) * (A - B) / ((A + B) * (A + B));
        double perimeter = PI * (A + B) * (1.0 + 3.0 * hh / (10.0 + sqrt(4.0 - 3.0 * hh)));
        double tol = 4.0 / PI * perimeter * g.cell;
        printf("  p %.2f: %zu cells of %.2f m in %zu polygons, fraction %.5f; area %.0f m^2, ellipse %.0f "
               "(%+.2f %%), tolerance %.0f (%.1f %%)\n", p[k], r.ncells, g.cell, r.npolygons, r.fraction, r.area,
               want, 100.0 * (r.area - want) / want, tol, 100.0 * tol / want);
        if (k == 0)
            CHECK_ABS(r.area, want, tol);
        dragarc_scatter_region_clear(&r);
    }
    dragarc_scatter_grid_clear(&g);
    free(e), free(n);
}

/* ---- refused inputs ------------------------------------------------------------------------------------ */

/* The error names the field; checks the code and the field. */
static void check_refused(int rc, const dragarc_error *err, const char *field)
{
    CHECK(rc == DRAGARC_EINVAL);
    if (strcmp(err->field, field) != 0 || rc != DRAGARC_EINVAL)
        printf("  got %d, field '%s' (want '%s'): %s\n", rc, err->field, field, err->message);
    CHECK(strcmp(err->field, field) == 0);
}

TEST(degenerate_and_bad_inputs_are_refused_naming_the_field)
{
    dragarc_error err;
    double mean[2], cov[3], f, q, k;
    const double one[1] = {3.0}, p5[1] = {0.5};
    /* n = 0, n = 1 (a covariance needs more than one fragment); one point of weight 5 is fine, cov 0 */
    check_refused(dragarc_scatter_moments(0, one, one, NULL, mean, cov, &err), &err, "weight");
    check_refused(dragarc_scatter_moments(1, one, one, NULL, mean, cov, &err), &err, "weight");
    const double five[1] = {5.0};
    CHECK(dragarc_scatter_moments(1, one, one, five, mean, cov, NULL) == DRAGARC_OK);
    CHECK(cov[0] == 0.0 && cov[1] == 0.0 && cov[2] == 0.0 && mean[0] == 3.0);
    /* all points identical: cov 0, no ellipse, no automatic cell; a given cell makes a 3 x 3 grid */
    const double same_e[5] = {3, 3, 3, 3, 3}, same_n[5] = {4, 4, 4, 4, 4};
    CHECK(dragarc_scatter_moments(5, same_e, same_n, NULL, mean, cov, NULL) == DRAGARC_OK);
    dragarc_scatter_ellipse ell;
    check_refused(dragarc_scatter_ellipse_of(mean, cov, 2.0, &ell, &err), &err, "cov");
    CHECK(strstr(err.message, "one place") != NULL);
    CHECK(ell.semi_major == 0.0 && ell.semi_minor == 0.0); /* zeroed, never NaN */
    dragarc_scatter_grid g;
    check_refused(dragarc_scatter_grid_build(5, same_e, same_n, NULL, 0.0, 0, &g, &err), &err, "cell");
    dragarc_scatter_grid_clear(&g);
    CHECK(dragarc_scatter_grid_build(5, same_e, same_n, NULL, 1.0, 0, &g, NULL) == DRAGARC_OK);
    CHECK(g.nx == 3 && g.ny == 3 && g.value[4] == 5e6);
    dragarc_scatter_region r;
    CHECK(dragarc_scatter_region_of(&g, 0.9, &r, NULL) == DRAGARC_OK);
    CHECK(r.ncells == 1 && r.npolygons == 1 && r.fraction == 1.0);
    dragarc_scatter_region_clear(&r);
    dragarc_scatter_grid_clear(&g);
    /* points on a line: a singular covariance, refused with the line's azimuth (north-east: 45 degrees) */
    const double line_e[4] = {0, 1, 2, 3}, line_n[4] = {0, 1, 2, 3};
    CHECK(dragarc_scatter_moments(4, line_e, line_n, NULL, mean, cov, NULL) == DRAGARC_OK);
    check_refused(dragarc_scatter_ellipse_of(mean, cov, 1.0, &ell, &err), &err, "cov");
    CHECK(strstr(err.message, "line at azimuth 45 degrees") != NULL);
    /* not positive semi-definite, not finite, k */
    const double bad_cov[3] = {1, 2, 1}, neg_cov[3] = {-1, 0, 1}, nan_cov[3] = {1, NAN, 1}, good[3] = {1, 0, 1};
    check_refused(dragarc_scatter_ellipse_of(mean, bad_cov, 1.0, &ell, &err), &err, "cov");
    check_refused(dragarc_scatter_ellipse_of(mean, neg_cov, 1.0, &ell, &err), &err, "cov");
    check_refused(dragarc_scatter_ellipse_of(mean, nan_cov, 1.0, &ell, &err), &err, "cov");
    check_refused(dragarc_scatter_ellipse_of(mean, good, 0.0, &ell, &err), &err, "k");
    check_refused(dragarc_scatter_ellipse_of(mean, good, INFINITY, &ell, &err), &err, "k");
    const double nan_mean[2] = {NAN, 0};
    check_refused(dragarc_scatter_ellipse_of(nan_mean, good, 1.0, &ell, &err), &err, "mean");
    check_refused(dragarc_scatter_ellipse_k(1.0, &k, &err), &err, "probability");
    check_refused(dragarc_scatter_ellipse_k(0.0, &k, &err), &err, "probability");
    check_refused(dragarc_scatter_ellipse_k(NAN, &k, &err), &err, "probability");
    dragarc_scatter_ellipse flat = {.semi_major = 1.0};
    check_refused(dragarc_scatter_fraction_inside(1, one, one, NULL, &flat, &f, &err), &err, "ellipse");
    /* NaN and infinite coordinates, bad weights */
    const double e3[3] = {0, 1, NAN}, n3[3] = {0, INFINITY, 1}, ok3[3] = {0, 1, 2};
    const double wneg[3] = {1, -1, 1}, wnan[3] = {1, 1, NAN}, wzero[3] = {0, 0, 0};
    check_refused(dragarc_scatter_moments(3, e3, ok3, NULL, mean, cov, &err), &err, "east[2]");
    check_refused(dragarc_scatter_moments(3, ok3, n3, NULL, mean, cov, &err), &err, "north[1]");
    check_refused(dragarc_scatter_moments(3, ok3, ok3, wneg, mean, cov, &err), &err, "weight[1]");
    check_refused(dragarc_scatter_moments(3, ok3, ok3, wnan, mean, cov, &err), &err, "weight[2]");
    check_refused(dragarc_scatter_moments(3, ok3, ok3, wzero, mean, cov, &err), &err, "weight");
    check_refused(dragarc_scatter_extent(3, e3, ok3, NULL, 0.0, p5, 1, &q, &f, &err), &err, "east[2]");
    check_refused(dragarc_scatter_extent(3, ok3, ok3, NULL, NAN, p5, 1, &q, &f, &err), &err, "azimuth");
    check_refused(dragarc_scatter_grid_build(3, ok3, n3, NULL, 1.0, 0, &g, &err), &err, "north[1]");
    check_refused(dragarc_scatter_fraction_inside(3, e3, ok3, NULL, &ell, &f, &err), &err, "east[2]");
    check_refused(dragarc_scatter_fraction_inside(0, e3, ok3, NULL, &ell, &f, &err), &err, "weight");
    /* quantiles and values */
    const double probs[2] = {0.5, 1.5};
    double q2[2];
    check_refused(dragarc_scatter_quantiles(3, ok3, NULL, probs, 2, q2, &err), &err, "probs[1]");
    check_refused(dragarc_scatter_quantiles(3, e3, NULL, probs, 1, q2, &err), &err, "value[2]");
    check_refused(dragarc_scatter_quantiles(0, ok3, NULL, probs, 1, q2, &err), &err, "weight");
    check_refused(dragarc_scatter_mean(3, ok3, wzero, &f, &err), &err, "weight");
    check_refused(dragarc_scatter_mean(3, e3, NULL, &f, &err), &err, "value[2]");
    check_refused(dragarc_scatter_fraction_above(3, ok3, NULL, NAN, &f, &err), &err, "threshold");
    check_refused(dragarc_scatter_fraction_above(3, ok3, wneg, 1.0, &f, &err), &err, "weight[1]");
    /* grids: a negative or NaN cell, an unknown density, over the size limit (the message names it) */
    check_refused(dragarc_scatter_grid_build(3, ok3, ok3, NULL, -1.0, 0, &g, &err), &err, "cell");
    check_refused(dragarc_scatter_grid_build(3, ok3, ok3, NULL, NAN, 0, &g, &err), &err, "cell");
    check_refused(dragarc_scatter_grid_build(3, ok3, ok3, NULL, 1.0, (dragarc_scatter_density)7, &g, &err), &err,
                  "density");
    const double far_e[2] = {0, 1e6}, far_n[2] = {0, 1e4};
    check_refused(dragarc_scatter_grid_build(2, far_e, far_n, NULL, 1.0, 0, &g, &err), &err, "cell");
    CHECK(strstr(err.message, "4000000") != NULL);
    CHECK(g.value == NULL);
    /* regions: probability, an empty grid, a NaN density, a grid over the limit */
    const char *rows[] = {"..", "X."};
    g = grid_of(rows, 2);
    check_refused(dragarc_scatter_region_of(&g, 0.0, &r, &err), &err, "probability");
    check_refused(dragarc_scatter_region_of(&g, 1.5, &r, &err), &err, "probability");
    check_refused(dragarc_scatter_region_of(&g, NAN, &r, &err), &err, "probability");
    g.value[0] = NAN;
    check_refused(dragarc_scatter_region_of(&g, 0.5, &r, &err), &err, "grid.value");
    g.value[0] = 0.0;
    check_refused(dragarc_scatter_region_of(&g, 0.5, &r, &err), &err, "grid.value");
    g.value[0] = 1.0;
    g.cell = 0.0;
    check_refused(dragarc_scatter_region_of(&g, 0.5, &r, &err), &err, "grid.cell");
    g.cell = CELL;
    size_t nx = g.nx;
    g.nx = 3000, g.ny = 3000;
    check_refused(dragarc_scatter_region_of(&g, 0.5, &r, &err), &err, "grid.nx");
    g.nx = nx, g.ny = 2;
    dragarc_scatter_region_clear(&r);
    dragarc_scatter_region_clear(NULL);
    dragarc_scatter_grid_clear(&g);
}

int main(void)
{
    dragarc_init();
    RUN(weighted_moments_of_three_points_by_hand);
    RUN(unit_weights_give_gsl_covariance_and_integer_weights_repeat_points);
    RUN(ellipse_axes_and_azimuth_by_hand);
    RUN(ellipse_k_inverts_the_containment);
    RUN(ellipse_ring_is_closed_counter_clockwise_and_on_the_ellipse);
    RUN(fractions_inside_the_sigma_ellipses_match_the_chi_square_law);
    RUN(fraction_inside_weighs_the_points_by_hand);
    RUN(weighted_quantiles_of_four_values_by_hand);
    RUN(downrange_and_crossrange_quantiles_of_a_rotated_normal_sample);
    RUN(mean_and_fraction_above_a_threshold_by_hand);
    RUN(a_density_grid_by_hand);
    RUN(the_density_grid_keeps_the_total_weight_and_sizes_its_cells_by_scotts_rule);
    RUN(an_l_of_three_cells_is_one_ring_of_six_corners);
    RUN(a_frame_of_cells_has_a_clockwise_hole);
    RUN(a_region_outline_is_its_rings_scaled_each_ended_by_a_break);
    RUN(two_separate_blobs_are_two_polygons);
    RUN(cells_touching_at_a_corner_are_two_polygons);
    RUN(a_hole_touching_the_outside_at_a_corner_is_cut_off_as_a_hole);
    RUN(bars_joined_at_corners_are_separate_polygons_without_holes);
    RUN(an_island_in_a_hole_is_a_polygon_of_its_own);
    RUN(random_cells_give_simple_rings_that_hold_exactly_those_cells);
    RUN(the_region_is_the_smallest_set_of_densest_cells);
    RUN(the_90_percent_region_of_a_normal_sample_matches_its_ellipse);
    RUN(degenerate_and_bad_inputs_are_refused_naming_the_field);
    return check_summary();
}
