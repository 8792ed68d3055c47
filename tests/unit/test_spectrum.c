/* test_spectrum.c: droplet size spectra: the two parametric forms against their defining equations and an
 * independent numerical integration, measured tables, discretisation into classes, checks and ownership.
 * SPDX-License-Identifier: GPL-3.0-or-later
 *
 * The spectra here are example values (dv50 0.9 mm and spread 2.4, dv50 250 um and sigma 0.6, an invented table),
 * not measurements of any nozzle.
 */
#include <stdlib.h>

#include <gsl/gsl_cdf.h>
#include <gsl/gsl_integration.h>

#include "check.h"
#include "core/constants.h"
#include "dragarc/spectrum.h"

/* ---- an independent integration of the volume density f = dF/dd, written out from the defining equations ---- */

/* Rosin & Rammler (1933), J. Inst. Fuel 7:29: F = 1 - exp(-(d/X)^n), so f = (n/X) (d/X)^(n-1) exp(-(d/X)^n), with
 * X = dv50 / (ln 2)^(1/n) from F(dv50) = 1/2. */
static double rr_scale(const dragarc_spectrum *s) { return s->dv50 / pow(log(2.0), 1.0 / s->spread); }

static double density(double d, const dragarc_spectrum *s)
{
    if (s->form == DRAGARC_SPECTRUM_ROSIN_RAMMLER) {
        double n = s->spread, X = rr_scale(s), x = d / X;
        return n / X * pow(x, n - 1.0) * exp(-pow(x, n));
    }
    /* log-normal in volume: F = Phi(ln(d/dv50)/sigma), f = phi(z) / (sigma d) */
    double z = log(d / s->dv50) / s->sigma;
    return exp(-0.5 * z * z) / (s->sigma * d * sqrt(2.0 * DRAGARC_PI));
}

typedef struct {
    const dragarc_spectrum *s;
    int moment; /* 0: int f, 1: int d f */
} integrand;

static double integrand_eval(double d, void *p)
{
    const integrand *q = p;
    return (q->moment ? d : 1.0) * density(d, q->s);
}

/* GSL's adaptive Gauss-Kronrod (QAGS) asked for 1e-13 relative. */
static double integrate(const dragarc_spectrum *s, double a, double b, int moment)
{
    integrand q = {s, moment};
    gsl_function f = {integrand_eval, &q};
    gsl_integration_workspace *w = gsl_integration_workspace_alloc(200);
    double result = NAN, abserr;
    int st = gsl_integration_qags(&f, a, b, 0.0, 1e-13, 200, w, &result, &abserr);
    gsl_integration_workspace_free(w);
    CHECK(st == 0);
    return result;
}

/* Discretise s into k classes and hold each against the integration: the fraction inside the bounds (fraction minus
 * tail) and the volume-weighted mean diameter. Tolerance 1e-12 relative: the integration is asked for 1e-13, and the
 * closed forms lose at most log10(1 / relative class width) digits to cancellation (classes here are at least 1 %
 * wide, so under 1e-13); 1e-12 leaves a margin of ten over both. Returns the worst relative differences. */
static void check_classes_against_integration(const dragarc_spectrum *s, size_t k, dragarc_spectrum_spacing spacing,
                                              double *worst_fraction, double *worst_diameter)
{
    dragarc_spectrum_class *c = malloc(k * sizeof *c);
    dragarc_error e;
    CHECK(dragarc_spectrum_discretise(s, k, spacing, c, &e) == DRAGARC_OK);
    double sum = 0.0;
    for (size_t j = 0; j < k; j++) {
        double mass = integrate(s, c[j].lower, c[j].upper, 0), moment = integrate(s, c[j].lower, c[j].upper, 1);
        CHECK_REL(c[j].fraction - c[j].tail, mass, 1e-12);
        CHECK_REL(c[j].diameter, moment / mass, 1e-12);
        *worst_fraction = fmax(*worst_fraction, fabs((c[j].fraction - c[j].tail) / mass - 1.0));
        *worst_diameter = fmax(*worst_diameter, fabs(c[j].diameter / (moment / mass) - 1.0));
        CHECK(c[j].lower < c[j].diameter && c[j].diameter < c[j].upper);
        CHECK(j == 0 || c[j].lower == c[j - 1].upper);
        CHECK_REL(c[j].drops_per_volume, 6.0 / (DRAGARC_PI * pow(c[j].diameter, 3)), 1e-15);
        sum += c[j].fraction;
    }
    /* The fractions telescope to 1: 1e-12 is the documented promise (K additions of 1e-16 round-offs). */
    CHECK_ABS(sum, 1.0, 1e-12);
    /* The ends lie at the 0.1 % and 99.9 % volume quantiles; the 0.1 % beyond each rides in the end class. */
    CHECK_REL(dragarc_spectrum_fraction_below(s, c[0].lower), 0.001, 1e-12);
    CHECK_REL(dragarc_spectrum_fraction_below(s, c[k - 1].upper), 0.999, 1e-14);
    CHECK_REL(c[0].tail, 0.001, 1e-12);
    CHECK_REL(c[k - 1].tail, 0.001, 1e-12);
    for (size_t j = 1; j + 1 < k; j++)
        CHECK(c[j].tail == 0.0);
    free(c);
}

/* ---- Rosin-Rammler ---- */

TEST(rosin_rammler_puts_half_the_volume_below_dv50)
{
    /* Definition of the volume median diameter: F(dv50) = 1/2. 1 - exp(-ln 2) in floating point: one rounding of
     * 0.5, a tolerance of 1.2e-16 (one unit in the last place of 0.5 is 1.1e-16). */
    dragarc_spectrum s = {0};
    dragarc_error e;
    CHECK(dragarc_spectrum_rosin_rammler(&s, 0.9e-3, 2.4, &e) == DRAGARC_OK);
    CHECK_ABS(dragarc_spectrum_fraction_below(&s, 0.9e-3), 0.5, 1.2e-16);
    double d;
    CHECK(dragarc_spectrum_quantile(&s, 0.5, &d, &e) == DRAGARC_OK);
    CHECK_REL(d, 0.9e-3, 4e-16);
    /* Given by its scale X instead: dv50 = X (ln 2)^(1/n) (the same equation solved for dv50). */
    dragarc_spectrum t = {0};
    CHECK(dragarc_spectrum_rosin_rammler_scale(&t, rr_scale(&s), 2.4, &e) == DRAGARC_OK);
    CHECK_REL(t.dv50, 0.9e-3, 4e-16);
    CHECK(t.form == DRAGARC_SPECTRUM_ROSIN_RAMMLER && t.spread == 2.4);
}

TEST(rosin_rammler_quantiles_invert_the_cumulative)
{
    /* Rosin & Rammler (1933): F = 1 - exp(-(d/X)^n) solved for d: d_p = X (-ln(1 - p))^(1/n). A handful of
     * round-offs: 1e-14 relative. */
    dragarc_spectrum s = {0};
    dragarc_error e;
    CHECK(dragarc_spectrum_rosin_rammler(&s, 0.9e-3, 2.4, &e) == DRAGARC_OK);
    const double p[] = {0.001, 0.01, 0.1, 0.25, 0.5, 0.75, 0.9, 0.99, 0.999};
    for (size_t i = 0; i < sizeof p / sizeof *p; i++) {
        double d;
        CHECK(dragarc_spectrum_quantile(&s, p[i], &d, &e) == DRAGARC_OK);
        CHECK_REL(d, rr_scale(&s) * pow(-log(1.0 - p[i]), 1.0 / 2.4), 1e-14);
        CHECK_REL(dragarc_spectrum_fraction_below(&s, d), p[i], 1e-14);
    }
}

TEST(rosin_rammler_classes_match_an_independent_integration)
{
    double wf = 0.0, wd = 0.0;
    dragarc_spectrum s = {0};
    dragarc_error e;
    CHECK(dragarc_spectrum_rosin_rammler(&s, 0.9e-3, 2.4, &e) == DRAGARC_OK);
    check_classes_against_integration(&s, 40, DRAGARC_SPECTRUM_GEOMETRIC, &wf, &wd);
    check_classes_against_integration(&s, 40, DRAGARC_SPECTRUM_EQUAL_VOLUME, &wf, &wd);
    /* a very wide spectrum: spread 0.9 puts the 0.1 % and 99.9 % quantiles at 1.05 um and 19.3 mm */
    CHECK(dragarc_spectrum_rosin_rammler(&s, 1.5e-3, 0.9, &e) == DRAGARC_OK);
    check_classes_against_integration(&s, 25, DRAGARC_SPECTRUM_GEOMETRIC, &wf, &wd);
    printf("  worst relative difference from QAGS: fraction %.2g, mean diameter %.2g\n", wf, wd);
}

/* ---- log-normal ---- */

TEST(log_normal_puts_half_the_volume_below_dv50_and_its_quantiles_follow_pinv)
{
    /* Log-normal in volume: F = Phi(ln(d/dv50)/sigma), quantile dv50 exp(sigma Phi^-1(p)) with GSL's
     * gsl_cdf_ugaussian_Pinv; Phi(0) = 1/2 exactly. Round-offs of exp and log: 1e-14 relative. */
    dragarc_spectrum s = {0};
    dragarc_error e;
    CHECK(dragarc_spectrum_log_normal(&s, 250e-6, 0.6, &e) == DRAGARC_OK);
    CHECK(dragarc_spectrum_fraction_below(&s, 250e-6) == 0.5);
    const double p[] = {0.001, 0.1, 0.3, 0.5, 0.7, 0.9, 0.999};
    for (size_t i = 0; i < sizeof p / sizeof *p; i++) {
        double d;
        CHECK(dragarc_spectrum_quantile(&s, p[i], &d, &e) == DRAGARC_OK);
        CHECK_REL(d, 250e-6 * exp(0.6 * gsl_cdf_ugaussian_Pinv(p[i])), 1e-14);
        CHECK_REL(dragarc_spectrum_fraction_below(&s, d), p[i], 1e-13);
    }
}

TEST(log_normal_span_and_sigma_go_round_trip)
{
    /* span = (dv90 - dv10)/dv50 = e^(sigma z90) - e^(sigma z10) with z10 = -z90 = Phi^-1(0.1): the closed form
     * 2 sinh(sigma z90) and its inverse asinh(span/2)/z90. The summary measures the span from the two quantiles
     * (Pinv(0.1) and Pinv(0.9) separately), so it also checks the symmetry the closed form leans on. 1e-13. */
    dragarc_error e;
    const double spans[] = {0.3, 0.8, 1.2, 2.0};
    for (size_t i = 0; i < sizeof spans / sizeof *spans; i++) {
        dragarc_spectrum s = {0};
        CHECK(dragarc_spectrum_log_normal_span(&s, 400e-6, spans[i], &e) == DRAGARC_OK);
        dragarc_spectrum_summary sum;
        CHECK(dragarc_spectrum_summarise(&s, &sum, &e) == DRAGARC_OK);
        CHECK_REL(sum.relative_span, spans[i], 1e-13);
        CHECK_REL(dragarc_spectrum_span_from_sigma(s.sigma), spans[i], 1e-14);
        CHECK_REL(sum.dv90 - sum.dv10,
                  400e-6 * (exp(s.sigma * gsl_cdf_ugaussian_Pinv(0.9)) - exp(s.sigma * gsl_cdf_ugaussian_Pinv(0.1))),
                  1e-13);
    }
    CHECK_REL(dragarc_spectrum_sigma_from_span(dragarc_spectrum_span_from_sigma(0.45)), 0.45, 1e-14);
}

TEST(log_normal_classes_match_an_independent_integration)
{
    double wf = 0.0, wd = 0.0;
    dragarc_spectrum s = {0};
    dragarc_error e;
    CHECK(dragarc_spectrum_log_normal(&s, 250e-6, 0.6, &e) == DRAGARC_OK);
    check_classes_against_integration(&s, 40, DRAGARC_SPECTRUM_GEOMETRIC, &wf, &wd);
    check_classes_against_integration(&s, 40, DRAGARC_SPECTRUM_EQUAL_VOLUME, &wf, &wd);
    check_classes_against_integration(&s, 3, DRAGARC_SPECTRUM_GEOMETRIC, &wf, &wd);
    printf("  worst relative difference from QAGS: fraction %.2g, mean diameter %.2g\n", wf, wd);
}

/* ---- class layouts ---- */

TEST(equal_volume_classes_carry_equal_water_and_geometric_classes_equal_ratios)
{
    /* By construction (bounds at the k/K volume quantiles; the 0.1 % tails fill the end classes up to 1/K).
     * Fractions to 1e-12 absolute, the documented promise. */
    dragarc_spectrum forms[2] = {{0}, {0}};
    dragarc_error e;
    CHECK(dragarc_spectrum_rosin_rammler(&forms[0], 0.9e-3, 2.4, &e) == DRAGARC_OK);
    CHECK(dragarc_spectrum_log_normal(&forms[1], 250e-6, 0.6, &e) == DRAGARC_OK);
    const size_t ks[] = {1, 2, 7, 40, 1000};
    dragarc_spectrum_class *c = malloc(1000 * sizeof *c);
    for (int f = 0; f < 2; f++)
        for (size_t i = 0; i < sizeof ks / sizeof *ks; i++) {
            size_t k = ks[i];
            CHECK(dragarc_spectrum_discretise(&forms[f], k, DRAGARC_SPECTRUM_EQUAL_VOLUME, c, &e) == DRAGARC_OK);
            double sum = 0.0;
            for (size_t j = 0; j < k; j++) {
                CHECK_ABS(c[j].fraction, 1.0 / (double)k, 1e-12);
                CHECK(c[j].lower <= c[j].diameter && c[j].diameter <= c[j].upper);
                sum += c[j].fraction;
            }
            CHECK_ABS(sum, 1.0, 1e-12);
            CHECK(dragarc_spectrum_discretise(&forms[f], k, DRAGARC_SPECTRUM_GEOMETRIC, c, &e) == DRAGARC_OK);
            double ratio = c[0].upper / c[0].lower;
            sum = 0.0;
            for (size_t j = 0; j < k; j++) {
                CHECK_REL(c[j].upper / c[j].lower, ratio, 1e-12);
                sum += c[j].fraction;
            }
            CHECK_ABS(sum, 1.0, 1e-12);
        }
    free(c);
}

/* ---- measured tables ---- */

/* An invented table: class bounds 50 um x 2^(i/2), i = 0..10 (50 um to 1.6 mm), fractions summing to 1. */
static const double TABLE_D[] = {50e-6,  70.71067811865476e-6, 100e-6,  141.4213562373095e-6,
                                 200e-6, 282.842712474619e-6,  400e-6,  565.685424949238e-6,
                                 800e-6, 1131.370849898476e-6, 1600e-6};
static const double TABLE_V[] = {0.0, 0.01, 0.03, 0.06, 0.10, 0.15, 0.20, 0.18, 0.14, 0.09, 0.04};

TEST(a_table_keeps_its_fractions_when_the_classes_are_its_own)
{
    /* Geometric classes over a geometric table, one class per row: the bounds fall on the table's (to the rounding
     * of exp and log, ~1e-16 relative), so each fraction is the table's to 1e-14 and each diameter the logarithmic
     * mean (b - a)/ln(b/a), the volume-weighted mean under the table's constant volume per unit ln d. */
    dragarc_spectrum s = {0};
    dragarc_error e;
    CHECK(dragarc_spectrum_table_set(&s, TABLE_D, TABLE_V, 11, &e) == DRAGARC_OK);
    dragarc_spectrum_class c[10];
    CHECK(dragarc_spectrum_discretise(&s, 10, DRAGARC_SPECTRUM_GEOMETRIC, c, &e) == DRAGARC_OK);
    double sum = 0.0;
    for (int j = 0; j < 10; j++) {
        CHECK_REL(c[j].lower, TABLE_D[j], 1e-14);
        CHECK_REL(c[j].upper, TABLE_D[j + 1], 1e-14);
        CHECK_ABS(c[j].fraction, TABLE_V[j + 1], 1e-14);
        CHECK_REL(c[j].diameter, (TABLE_D[j + 1] - TABLE_D[j]) / log(TABLE_D[j + 1] / TABLE_D[j]), 1e-13);
        CHECK(c[j].tail == 0.0);
        sum += c[j].fraction;
    }
    CHECK_ABS(sum, 1.0, 1e-15);
    /* Equal-volume classes: 1/4 each, bounds at the table's interpolated quartiles. */
    dragarc_spectrum_class q[4];
    CHECK(dragarc_spectrum_discretise(&s, 4, DRAGARC_SPECTRUM_EQUAL_VOLUME, q, &e) == DRAGARC_OK);
    for (int j = 0; j < 4; j++)
        CHECK_ABS(q[j].fraction, 0.25, 1e-15);
    /* 0.25 lies in the row (200 um, 283 um] that takes the cumulative from 0.20 to 0.35: a third of its ln d width */
    CHECK_REL(q[0].upper, 200e-6 * pow(2.0, 0.5 / 3.0), 1e-14);
    dragarc_spectrum_clear(&s);
}

TEST(table_quantiles_interpolate_in_log_diameter)
{
    /* Hand-worked example: rows (100, 200] um with 0.4 and (200, 400] um with 0.6. The cumulative rises linearly in
     * ln d across a row, so Dv0.1 = 100 x 2^(0.1/0.4), Dv0.5 = 200 x 2^(0.1/0.6), Dv0.9 = 200 x 2^(0.5/0.6), and
     * F(150 um) = 0.4 ln 1.5 / ln 2. Exact arithmetic up to round-off: 1e-14. */
    const double d[] = {100e-6, 200e-6, 400e-6}, v[] = {0.0, 0.4, 0.6};
    dragarc_spectrum s = {0};
    dragarc_error e;
    CHECK(dragarc_spectrum_table_set(&s, d, v, 3, &e) == DRAGARC_OK);
    dragarc_spectrum_summary sum;
    CHECK(dragarc_spectrum_summarise(&s, &sum, &e) == DRAGARC_OK);
    CHECK_REL(sum.dv10, 100e-6 * pow(2.0, 0.25), 1e-14);
    CHECK_REL(sum.dv50, 200e-6 * pow(2.0, 1.0 / 6.0), 1e-14);
    CHECK_REL(sum.dv90, 200e-6 * pow(2.0, 5.0 / 6.0), 1e-14);
    CHECK_REL(sum.relative_span, (sum.dv90 - sum.dv10) / sum.dv50, 1e-15);
    CHECK_REL(dragarc_spectrum_fraction_below(&s, 150e-6), 0.4 * log(1.5) / log(2.0), 1e-14);
    CHECK(dragarc_spectrum_fraction_below(&s, 100e-6) == 0.0 && dragarc_spectrum_fraction_below(&s, 1e-3) == 1.0);
    /* the driftable fraction: nothing below 100 um here */
    CHECK(sum.driftable_fraction == 0.0);
    for (double p = 0.05; p < 1.0; p += 0.05) {
        double q;
        CHECK(dragarc_spectrum_quantile(&s, p, &q, &e) == DRAGARC_OK);
        CHECK_REL(dragarc_spectrum_fraction_below(&s, q), p, 1e-14);
    }
    dragarc_spectrum_clear(&s);
}

TEST(a_class_without_volume_gets_the_log_mean_of_its_bounds)
{
    /* A table with an empty row (200, 1600] um, cut into 7 geometric classes of ratio 32^(1/7) = 1.64 from 100 um:
     * the classes from 269 to 1190 um lie wholly inside the empty row and carry nothing, and each takes the
     * logarithmic mean of its bounds (what a constant volume per unit ln d would give). Round-off only: 1e-15. */
    const double d[] = {100e-6, 200e-6, 1600e-6, 3200e-6}, v[] = {0.0, 0.5, 0.0, 0.5};
    dragarc_spectrum s = {0};
    dragarc_error e;
    CHECK(dragarc_spectrum_table_set(&s, d, v, 4, &e) == DRAGARC_OK);
    dragarc_spectrum_class c[7];
    CHECK(dragarc_spectrum_discretise(&s, 7, DRAGARC_SPECTRUM_GEOMETRIC, c, &e) == DRAGARC_OK);
    for (int j = 2; j <= 4; j++) {
        CHECK(c[j].lower > 200e-6 && c[j].upper < 1600e-6);
        CHECK(c[j].fraction == 0.0);
        CHECK_REL(c[j].diameter, (c[j].upper - c[j].lower) / log(c[j].upper / c[j].lower), 1e-15);
    }
    double dv50;
    CHECK(dragarc_spectrum_quantile(&s, 0.5, &dv50, &e) == DRAGARC_OK);
    CHECK_REL(dv50, 200e-6, 1e-15); /* the smallest diameter with half the volume below it */
    /* Bounds that fall on the empty row's ends only to within round-off may take a sliver (~1e-16) of the next
     * row; the class then keeps a negligible fraction and a diameter inside its bounds. */
    const double d3[] = {100e-6, 200e-6, 400e-6, 800e-6}, v3[] = {0.0, 0.5, 0.0, 0.5};
    CHECK(dragarc_spectrum_table_set(&s, d3, v3, 4, &e) == DRAGARC_OK);
    CHECK(dragarc_spectrum_discretise(&s, 3, DRAGARC_SPECTRUM_GEOMETRIC, c, &e) == DRAGARC_OK);
    CHECK_ABS(c[1].fraction, 0.0, 1e-15);
    CHECK(c[1].lower <= c[1].diameter && c[1].diameter <= c[1].upper);
    dragarc_spectrum_clear(&s);
}

TEST(a_table_is_scaled_to_one_within_the_tolerance_and_copied_deeply)
{
    /* Fractions summing to 1.002 (inside the documented 0.005) are scaled by 1/1.002. */
    const double d[] = {100e-6, 200e-6, 400e-6}, v[] = {0.0, 0.401, 0.601};
    dragarc_spectrum s = {0}, copy;
    dragarc_error e;
    CHECK(dragarc_spectrum_table_set(&s, d, v, 3, &e) == DRAGARC_OK);
    CHECK_REL(s.fraction[1], 0.401 / 1.002, 1e-15);
    CHECK(s.cumulative[0] == 0.0 && s.cumulative[2] == 1.0);
    CHECK(dragarc_spectrum_copy(&copy, &s, &e) == DRAGARC_OK);
    CHECK(copy.diameter != s.diameter && copy.fraction[1] == s.fraction[1] && copy.npoints == 3);
    dragarc_spectrum_clear(&s);
    CHECK(s.form == DRAGARC_SPECTRUM_NONE && s.diameter == NULL);
    CHECK_REL(dragarc_spectrum_fraction_below(&copy, 150e-6), 0.401 / 1.002 * log(1.5) / log(2.0), 1e-14);
    /* a parametric setter frees the table it replaces (valgrind and the sanitizer build would see a leak) */
    CHECK(dragarc_spectrum_rosin_rammler(&copy, 0.9e-3, 2.4, &e) == DRAGARC_OK && copy.diameter == NULL);
    dragarc_spectrum_clear(&copy);
    dragarc_spectrum_clear(NULL);
}

/* ---- derived quantities ---- */

TEST(summary_quantiles_span_and_driftable_fraction_follow_the_closed_forms)
{
    /* Rosin & Rammler (1933) solved for d at p = 0.1, 0.5, 0.9; the volume below 100 um from F itself. 1e-14. */
    dragarc_spectrum s = {0};
    dragarc_error e;
    dragarc_spectrum_summary sum;
    CHECK(dragarc_spectrum_rosin_rammler(&s, 0.9e-3, 2.4, &e) == DRAGARC_OK);
    CHECK(dragarc_spectrum_summarise(&s, &sum, &e) == DRAGARC_OK);
    double X = rr_scale(&s);
    CHECK_REL(sum.dv10, X * pow(-log(0.9), 1.0 / 2.4), 1e-14);
    CHECK_REL(sum.dv50, 0.9e-3, 1e-15);
    CHECK_REL(sum.dv90, X * pow(log(10.0), 1.0 / 2.4), 1e-14);
    CHECK_REL(sum.relative_span, (pow(log(10.0), 1 / 2.4) - pow(-log(0.9), 1 / 2.4)) / pow(log(2.0), 1 / 2.4), 1e-13);
    CHECK_REL(sum.driftable_fraction, 1.0 - exp(-pow(100e-6 / X, 2.4)), 1e-13);
    /* log-normal: Phi((ln 100 um - ln dv50)/sigma) by GSL's gsl_cdf_ugaussian_P */
    CHECK(dragarc_spectrum_log_normal(&s, 250e-6, 0.6, &e) == DRAGARC_OK);
    CHECK(dragarc_spectrum_summarise(&s, &sum, &e) == DRAGARC_OK);
    CHECK_REL(sum.driftable_fraction, gsl_cdf_ugaussian_P(log(100.0 / 250.0) / 0.6), 1e-14);
    CHECK(sum.dv50 == 250e-6);
}

TEST(drops_per_volume_is_six_over_pi_d_cubed)
{
    /* A sphere of diameter d holds pi d^3 / 6: a cubic metre of 1 mm drops is 6/(pi 1e-9) = 1.909859e9 drops. */
    CHECK_REL(dragarc_spectrum_drops_per_volume(1e-3), 6.0 / (DRAGARC_PI * 1e-9), 1e-15);
    CHECK_REL(dragarc_spectrum_drops_per_volume(1e-3), 1.909859317102744e9, 1e-15);
}

/* ---- failure paths ---- */

static int refused(int rc, const dragarc_error *e, const char *field, const char *fragment)
{
    return rc == DRAGARC_EINVAL && e->code == DRAGARC_EINVAL && strcmp(e->field, field) == 0 &&
           strstr(e->message, fragment) != NULL;
}

TEST(bad_parametric_spectra_are_refused_naming_the_field_and_value)
{
    dragarc_spectrum s = {0};
    dragarc_error e;
    CHECK(refused(dragarc_spectrum_rosin_rammler(&s, -1.0, 2.4, &e), &e, "dv50", "must be positive, in m (got -1)"));
    CHECK(refused(dragarc_spectrum_rosin_rammler(&s, 0.05, 2.4, &e), &e, "dv50", "(got 0.05)"));
    CHECK(refused(dragarc_spectrum_rosin_rammler(&s, 0.5e-6, 2.4, &e), &e, "dv50", "1 um to 20 mm"));
    CHECK(refused(dragarc_spectrum_rosin_rammler(&s, 0.9e-3, 0.0, &e), &e, "spread", "must be positive (got 0)"));
    CHECK(refused(dragarc_spectrum_rosin_rammler(&s, 0.9e-3, NAN, &e), &e, "spread", "got nan"));
    /* a spread so wide that the finest 0.1 % lies below 1 um, or the coarsest above 20 mm */
    CHECK(refused(dragarc_spectrum_rosin_rammler(&s, 100e-6, 0.8, &e), &e, "spread", "0.1 % volume quantile"));
    CHECK(refused(dragarc_spectrum_rosin_rammler(&s, 5e-3, 1.5, &e), &e, "spread", "99.9 % volume quantile"));
    CHECK(refused(dragarc_spectrum_rosin_rammler_scale(&s, 0.0, 2.4, &e), &e, "scale", "must be positive"));
    CHECK(refused(dragarc_spectrum_rosin_rammler_scale(&s, 1e-3, -2.0, &e), &e, "spread", "(got -2)"));
    CHECK(refused(dragarc_spectrum_log_normal(&s, 250e-6, -0.3, &e), &e, "sigma", "(got -0.3)"));
    CHECK(refused(dragarc_spectrum_log_normal(&s, 250e-6, 3.0, &e), &e, "sigma", "volume quantile"));
    CHECK(refused(dragarc_spectrum_log_normal_span(&s, 250e-6, 0.0, &e), &e, "span", "(got 0)"));
    CHECK(refused(dragarc_spectrum_log_normal_span(&s, INFINITY, 1.0, &e), &e, "dv50", "(got inf)"));
    CHECK(s.form == DRAGARC_SPECTRUM_NONE); /* untouched */
    /* a hand-filled spectrum is checked the same way */
    dragarc_spectrum h = {.form = DRAGARC_SPECTRUM_ROSIN_RAMMLER, .dv50 = -1.0, .spread = 2.4};
    CHECK(refused(dragarc_spectrum_check(&h, &e), &e, "dv50", "must be positive, in m (got -1)"));
    h = (dragarc_spectrum){.form = DRAGARC_SPECTRUM_LOG_NORMAL, .dv50 = 250e-6};
    CHECK(refused(dragarc_spectrum_check(&h, &e), &e, "sigma", "must be positive (got 0)"));
    h = (dragarc_spectrum){0};
    CHECK(refused(dragarc_spectrum_check(&h, &e), &e, "form", "no spectrum form"));
    h.form = (dragarc_spectrum_form)9;
    CHECK(refused(dragarc_spectrum_check(&h, &e), &e, "form", "unknown spectrum form 9"));
}

TEST(bad_tables_are_refused_naming_the_point)
{
    dragarc_spectrum s = {0};
    dragarc_error e;
    const double d[] = {100e-6, 200e-6, 400e-6}, v[] = {0.0, 0.4, 0.6};
    const double dback[] = {100e-6, 400e-6, 200e-6}, dtiny[] = {0.5e-6, 200e-6, 400e-6};
    const double vneg[] = {0.0, -0.1, 1.1}, vfirst[] = {0.1, 0.4, 0.5}, vshort[] = {0.0, 0.4, 0.5};
    const double vpercent[] = {0.0, 40.0, 60.0};
    CHECK(refused(dragarc_spectrum_table_set(&s, d, v, 1, &e), &e, "points", "at least 2 points (got 1)"));
    CHECK(refused(dragarc_spectrum_table_set(&s, dback, v, 3, &e), &e, "points[2]", "increase strictly"));
    CHECK(refused(dragarc_spectrum_table_set(&s, dtiny, v, 3, &e), &e, "points[0]", "(got 5e-07)"));
    CHECK(refused(dragarc_spectrum_table_set(&s, d, vneg, 3, &e), &e, "points[1]", "0 or more (got -0.1)"));
    CHECK(refused(dragarc_spectrum_table_set(&s, d, vfirst, 3, &e), &e, "points[0]", "must be 0 (got 0.1)"));
    CHECK(refused(dragarc_spectrum_table_set(&s, d, vshort, 3, &e), &e, "points", "sum to 0.9, not 1"));
    CHECK(refused(dragarc_spectrum_table_set(&s, d, vpercent, 3, &e), &e, "points", "percentages?"));
    CHECK(s.form == DRAGARC_SPECTRUM_NONE && s.diameter == NULL); /* untouched */
    /* a table stays as it was when a replacement is refused */
    CHECK(dragarc_spectrum_table_set(&s, d, v, 3, &e) == DRAGARC_OK);
    CHECK(refused(dragarc_spectrum_table_set(&s, d, vshort, 3, &e), &e, "points", "sum"));
    CHECK(s.form == DRAGARC_SPECTRUM_TABLE && s.npoints == 3 && s.fraction[1] == 0.4);
    dragarc_spectrum_clear(&s);
}

TEST(bad_discretisations_and_quantiles_are_refused)
{
    dragarc_spectrum s = {0};
    dragarc_error e;
    dragarc_spectrum_class c[4];
    CHECK(dragarc_spectrum_rosin_rammler(&s, 0.9e-3, 2.4, &e) == DRAGARC_OK);
    CHECK(refused(dragarc_spectrum_discretise(&s, 0, DRAGARC_SPECTRUM_GEOMETRIC, c, &e), &e, "classes",
                  "from 1 to 1000 (got 0)"));
    CHECK(refused(dragarc_spectrum_discretise(&s, 1001, DRAGARC_SPECTRUM_GEOMETRIC, c, &e), &e, "classes",
                  "(got 1001)"));
    CHECK(refused(dragarc_spectrum_discretise(&s, 4, (dragarc_spectrum_spacing)5, c, &e), &e, "spacing",
                  "unknown spacing 5"));
    CHECK(refused(dragarc_spectrum_discretise(&s, 4, DRAGARC_SPECTRUM_GEOMETRIC, NULL, &e), &e, "classes",
                  "no array"));
    dragarc_spectrum bad = {.form = DRAGARC_SPECTRUM_ROSIN_RAMMLER, .dv50 = 0.9e-3, .spread = -1.0};
    CHECK(refused(dragarc_spectrum_discretise(&bad, 4, DRAGARC_SPECTRUM_GEOMETRIC, c, &e), &e, "spread", "(got -1)"));
    dragarc_spectrum_summary sum;
    CHECK(refused(dragarc_spectrum_summarise(&bad, &sum, &e), &e, "spread", "(got -1)"));
    double d;
    CHECK(refused(dragarc_spectrum_quantile(&s, 0.0, &d, &e), &e, "p", "(got 0)"));
    CHECK(refused(dragarc_spectrum_quantile(&s, 1.0, &d, &e), &e, "p", "(got 1)"));
    CHECK(refused(dragarc_spectrum_quantile(&s, NAN, &d, &e), &e, "p", "(got nan)"));
    CHECK(dragarc_spectrum_fraction_below(&s, 0.0) == 0.0 && dragarc_spectrum_fraction_below(&s, -1.0) == 0.0);
}

TEST(form_and_spacing_names_read_both_ways)
{
    const char *forms[] = {"rosin_rammler", "log_normal", "table"};
    for (int i = 0; i < 3; i++) {
        dragarc_spectrum_form f;
        CHECK(dragarc_spectrum_form_from_name(forms[i], &f) == DRAGARC_OK);
        CHECK(strcmp(dragarc_spectrum_form_name(f), forms[i]) == 0);
    }
    const char *spacings[] = {"geometric", "equal_volume"};
    for (int i = 0; i < 2; i++) {
        dragarc_spectrum_spacing sp;
        CHECK(dragarc_spectrum_spacing_from_name(spacings[i], &sp) == DRAGARC_OK);
        CHECK(strcmp(dragarc_spectrum_spacing_name(sp), spacings[i]) == 0);
    }
    dragarc_spectrum_form f;
    dragarc_spectrum_spacing sp;
    CHECK(dragarc_spectrum_form_from_name("weibull", &f) == DRAGARC_EINVAL);
    CHECK(dragarc_spectrum_form_from_name(NULL, &f) == DRAGARC_EINVAL);
    CHECK(dragarc_spectrum_spacing_from_name("linear", &sp) == DRAGARC_EINVAL);
    CHECK(dragarc_spectrum_form_name((dragarc_spectrum_form)7) == NULL);
    CHECK(dragarc_spectrum_spacing_name((dragarc_spectrum_spacing)7) == NULL);
}

int main(void)
{
    dragarc_init();
    RUN(rosin_rammler_puts_half_the_volume_below_dv50);
    RUN(rosin_rammler_quantiles_invert_the_cumulative);
    RUN(rosin_rammler_classes_match_an_independent_integration);
    RUN(log_normal_puts_half_the_volume_below_dv50_and_its_quantiles_follow_pinv);
    RUN(log_normal_span_and_sigma_go_round_trip);
    RUN(log_normal_classes_match_an_independent_integration);
    RUN(equal_volume_classes_carry_equal_water_and_geometric_classes_equal_ratios);
    RUN(a_table_keeps_its_fractions_when_the_classes_are_its_own);
    RUN(table_quantiles_interpolate_in_log_diameter);
    RUN(a_class_without_volume_gets_the_log_mean_of_its_bounds);
    RUN(a_table_is_scaled_to_one_within_the_tolerance_and_copied_deeply);
    RUN(summary_quantiles_span_and_driftable_fraction_follow_the_closed_forms);
    RUN(drops_per_volume_is_six_over_pi_d_cubed);
    RUN(bad_parametric_spectra_are_refused_naming_the_field_and_value);
    RUN(bad_tables_are_refused_naming_the_point);
    RUN(bad_discretisations_and_quantiles_are_refused);
    RUN(form_and_spacing_names_read_both_ways);
    return check_summary();
}
