/* casualty.c: the casualty area of a fragment and a standing person, sheltering, the hazardous-energy test,
 * and the casualty expectation summed over Monte Carlo impact points.
 * SPDX-License-Identifier: GPL-3.0-or-later
 *
 *   A_C = pi (R_P + R_F)^2 + 2 (R_P + R_F) H_P cot(gamma),   R_F = sqrt(A_F / pi)
 * The ground points where a fragment's centre may land and still have passed within R_P + R_F (measured
 * across, horizontally) of the axis of a person standing there, below the person's height H_P: the disc of
 * radius R = R_P + R_F at the person's feet, swept back along the path by the run H_P cot(gamma) of its last
 * H_P of height, a stadium of area pi R^2 + 2 R H_P cot(gamma) (plane geometry). For a vertical fall this is
 * the basic casualty area pi (R_P + R_F)^2 = (sqrt(A_P) + sqrt(A_F))^2 of range-safety practice (recalled:
 * RCC 321 Supplement; the FAA Flight Safety Analysis Handbook, 2011), for inert fragments that neither slide,
 * bounce nor splatter (extensions left out).
 *
 *   E_c = sum_i w_i rho(x_i) (1 - f p) A_C,i   over the points with E_i >= E_hazard
 * Each sample stands for w_i real fragments; rho(x_i) A_C,i is the expected number of people within the
 * casualty area around its impact when people are spread at density rho (people per m^2) and each fragment
 * lands alone. A share f of the people is sheltered and a roof protects a share p of them (a simple scaling,
 * common practice, no source: roof penetration against energy is left out). A fragment below the hazard
 * energy adds nothing, as if it harmed no one (common practice: 14 CFR 417.107(c)(1) counts impacts of
 * 11 ft lbf or greater).
 */
#include <math.h>
#include <stdio.h>

#include "core/constants.h"
#include "dragarc/casualty.h"

static int check_share(double v, const char *field, dragarc_error *err)
{
    if (!(v >= 0.0 && v <= 1.0))
        return dragarc_error_set(err, DRAGARC_EINVAL, field, "must be within 0 to 1 (got %g)", v);
    return DRAGARC_OK;
}

int dragarc_person_check(const dragarc_person *p, dragarc_error *err)
{
    if (!(p->radius > 0.0 && p->radius <= 10.0))
        return dragarc_error_set(err, DRAGARC_EINVAL, "radius", "must be above 0 and at most 10 m (got %g)", p->radius);
    if (!(p->height > 0.0 && p->height <= 10.0))
        return dragarc_error_set(err, DRAGARC_EINVAL, "height", "must be above 0 and at most 10 m (got %g)", p->height);
    return DRAGARC_OK;
}

int dragarc_sheltering_check(const dragarc_sheltering *s, dragarc_error *err)
{
    int rc = check_share(s->sheltered_share, "sheltered_share", err);
    return rc == DRAGARC_OK ? check_share(s->protection, "protection", err) : rc;
}

double dragarc_sheltering_factor(const dragarc_sheltering *s)
{
    return 1.0 - s->sheltered_share * s->protection;
}

double dragarc_fragment_radius(double projected_area)
{
    return sqrt(projected_area / DRAGARC_PI);
}

double dragarc_casualty_area(double projected_area, const dragarc_person *p, double path_angle)
{
    if (!(projected_area >= 0.0 && isfinite(projected_area)) ||
        !(path_angle > 0.0 && path_angle <= 0.5 * DRAGARC_PI))
        return NAN;
    double r = p->radius + dragarc_fragment_radius(projected_area);
    /* cot at pi/2 is 6e-17, not 0: take the vertical fall exactly */
    double run = path_angle == 0.5 * DRAGARC_PI ? 0.0 : p->height / tan(path_angle);
    return DRAGARC_PI * r * r + 2.0 * r * run;
}

double dragarc_kinetic_energy(double mass, double speed)
{
    return 0.5 * mass * speed * speed;
}

int dragarc_fragment_is_hazardous(double energy, double threshold)
{
    return energy >= threshold;
}

/* The values of point i, checked. */
static int check_point(const dragarc_impact_point *q, size_t i, dragarc_error *err)
{
    const char *names[5] = {"east", "north", "weight", "casualty_area", "energy"};
    const double v[5] = {q->east, q->north, q->weight, q->casualty_area, q->energy};
    for (int k = 0; k < 5; k++) {
        if (isfinite(v[k]) && (k < 2 || v[k] >= 0.0))
            continue;
        char field[64];
        snprintf(field, sizeof field, "points[%zu].%s", i, names[k]);
        return dragarc_error_set(err, DRAGARC_EINVAL, field, "must be a finite number%s (got %g)",
                                 k < 2 ? "" : ", not negative", v[k]);
    }
    return DRAGARC_OK;
}

int dragarc_casualty_expectation(const dragarc_impact_point *points, size_t n, const dragarc_population *pop,
                                 const dragarc_casualty_options *opt, double *contributions,
                                 dragarc_casualty_result *out, dragarc_error *err)
{
    *out = (dragarc_casualty_result){0};
    if (!(opt->hazard_energy >= 0.0 && isfinite(opt->hazard_energy)))
        return dragarc_error_set(err, DRAGARC_EINVAL, "hazard_energy", "must be a finite energy, not negative (got "
                                 "%g J)", opt->hazard_energy);
    int rc = dragarc_sheltering_check(&opt->sheltering, err);
    if (rc != DRAGARC_OK) {
        dragarc_error_prefix(err, "sheltering");
        return rc;
    }
    for (size_t i = 0; i < n; i++)
        if ((rc = check_point(&points[i], i, err)) != DRAGARC_OK)
            return rc;
    const double exposed = 1e-6 * dragarc_sheltering_factor(&opt->sheltering); /* per km^2 to per m^2 */
    double ec = 0.0, all = 0.0, hazardous = 0.0;
    for (size_t i = 0; i < n; i++) {
        const dragarc_impact_point *q = &points[i];
        double term = 0.0;
        all += q->weight;
        if (dragarc_fragment_is_hazardous(q->energy, opt->hazard_energy)) {
            hazardous += q->weight;
            term = q->weight * dragarc_population_density(pop, q->east, q->north) * exposed * q->casualty_area;
        }
        ec += term;
        if (contributions)
            contributions[i] = term;
    }
    out->expected_casualties = ec;
    out->fragments = all;
    out->hazardous_fragments = hazardous;
    out->hazardous_share = all > 0.0 ? hazardous / all : 0.0;
    return DRAGARC_OK;
}

/* Published criteria, verified in the regulation's text (docs/models.md gives the wording and what is
 * recalled). */
static const dragarc_risk_reference REFERENCES[] = {
    {"expected casualties among the public (collective risk), per launch", 1e-4, "14 CFR 450.101(a)(1)(i)"},
    {"expected casualties among neighboring operations personnel, per launch", 2e-4, "14 CFR 450.101(a)(1)(ii)"},
    {"probability of casualty of any one member of the public (individual risk; not computed here)", 1e-6,
     "14 CFR 450.101(a)(2)(i); 14 CFR 435.35(c)"},
};

const dragarc_risk_reference *dragarc_casualty_references(size_t *n)
{
    *n = sizeof REFERENCES / sizeof REFERENCES[0];
    return REFERENCES;
}
