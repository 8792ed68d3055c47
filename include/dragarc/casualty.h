/* casualty.h: the casualty expectation of falling fragments: the casualty area of a fragment and a standing
 * person, sheltering, the hazardous-energy test, and E_c summed over Monte Carlo impact points.
 *
 * Copyright (C) 2026 the dragarc developers. SPDX-License-Identifier: GPL-3.0-or-later
 *
 *   A_C = pi (R_P + R_F)^2 + 2 (R_P + R_F) H_P cot(gamma),    R_F = sqrt(A_F / pi)
 *   E_c = sum_i w_i rho(x_i) s A_C,i   over the points with E_i >= E_hazard,   s = 1 - f_sheltered p_shelter
 * The person is a vertical cylinder of radius R_P and height H_P, the fragment a disc of its projected area
 * A_F, arriving along a straight path gamma below the horizontal (pi/2: straight down, where the second term
 * vanishes and A_C = (sqrt(A_P) + sqrt(A_F))^2 with A_P = pi R_P^2). Equations, defaults and their sources
 * are in docs/models.md, "Casualty expectation"; the criteria published by regulators and ranges are there
 * too, as references to compare with: whether a risk is acceptable is for the range's safety authority,
 * licensed practice and the regulations to decide, never for this library.
 */
#ifndef DRAGARC_CASUALTY_H
#define DRAGARC_CASUALTY_H

#include <stddef.h>

#include "dragarc/dragarc.h"
#include "dragarc/population.h"

#ifdef __cplusplus
extern "C" {
#endif

/* The standing person: a cylinder 1 ft in radius and 6 ft tall (recalled: RCC 321 Supplement and the FAA
 * Flight Safety Analysis Handbook, 2011, take a person of these dimensions; docs/models.md). */
#define DRAGARC_PERSON_RADIUS 0.3048 /* m */
#define DRAGARC_PERSON_HEIGHT 1.8288 /* m */

/* Kinetic energy at impact from which a fragment counts as hazardous: 11 ft lbf (14 CFR 417.107(c)(1), blunt
 * trauma from inert debris) = 11 x 0.3048 m x 4.4482216152605 N = 14.914 J. */
#define DRAGARC_HAZARD_ENERGY_DEFAULT (11.0 * 0.3048 * 4.4482216152605) /* J */

typedef struct dragarc_person {
    double radius; /* m, of the cylinder standing for a person seen from above */
    double height; /* m */
} dragarc_person;

/* Who is under a roof, and how much a roof protects: the density is scaled by 1 - sheltered_share x
 * protection. Both 0 (everyone in the open) is the conservative default. */
typedef struct dragarc_sheltering {
    double sheltered_share; /* 0 to 1, of the people under a roof */
    double protection;      /* 0 to 1, of the sheltered people a roof keeps from harm */
} dragarc_sheltering;

/* Check the fields (positive, finite; shares within 0 to 1); err->field names the bad one ("radius",
 * "sheltered_share", ...). */
int dragarc_person_check(const dragarc_person *p, dragarc_error *err);
int dragarc_sheltering_check(const dragarc_sheltering *s, dragarc_error *err);

/* 1 - sheltered_share x protection: the share of the density that stays exposed. */
double dragarc_sheltering_factor(const dragarc_sheltering *s);

/* The radius of the disc of a fragment's projected area A_F (m^2): sqrt(A_F / pi), m. */
double dragarc_fragment_radius(double projected_area);

/* The casualty area A_C (m^2) of a fragment of projected area A_F (m^2) reaching the ground gamma (rad) below
 * the horizontal, for the person p. NaN when A_F is negative or not finite, or gamma is not in (0, pi/2]. */
double dragarc_casualty_area(double projected_area, const dragarc_person *p, double path_angle);

/* 1/2 m v^2, J (mass kg, speed m/s). */
double dragarc_kinetic_energy(double mass, double speed);

/* Whether a fragment of impact energy E (J) counts as hazardous: E >= threshold ("or greater", as 14 CFR
 * 417.107(c)(1) words it). */
int dragarc_fragment_is_hazardous(double energy, double threshold);

/* One Monte Carlo impact: where a sampled fragment lands and what it stands for. */
typedef struct dragarc_impact_point {
    double east, north;   /* m, local frame */
    double weight;        /* real fragments this sample stands for (the class's count / its samples) */
    double casualty_area; /* m^2, A_C of the fragment at this impact */
    double energy;        /* J, kinetic energy at impact */
} dragarc_impact_point;

typedef struct dragarc_casualty_options {
    double hazard_energy;          /* J; fragments below it add nothing to E_c */
    dragarc_sheltering sheltering; /* {0, 0}: everyone in the open */
} dragarc_casualty_options;

#define DRAGARC_CASUALTY_OPTIONS_DEFAULT {DRAGARC_HAZARD_ENERGY_DEFAULT, {0.0, 0.0}}

typedef struct dragarc_casualty_result {
    double expected_casualties; /* E_c */
    double fragments;           /* sum of the weights */
    double hazardous_fragments; /* sum of the weights of the points at or above the hazard energy */
    double hazardous_share;     /* hazardous_fragments / fragments (0 when there are none) */
} dragarc_casualty_result;

/* E_c = sum_i w_i rho(x_i) s A_C,i over the n points at or above opt->hazard_energy, rho the density of pop
 * in people per m^2 (its people/km^2 x 1e-6), s the sheltering factor. contributions (may be NULL) receives
 * each point's term, 0 for the soft ones, so that per-class totals are sums over a class's points. Every
 * point's values must be finite, the weight, area and energy not negative: else DRAGARC_EINVAL with field
 * "points[i].weight" (and so on), or "hazard_energy", "sheltering.protection". */
int dragarc_casualty_expectation(const dragarc_impact_point *points, size_t n, const dragarc_population *pop,
                                 const dragarc_casualty_options *opt, double *contributions,
                                 dragarc_casualty_result *out, dragarc_error *err);

/* A published criterion to compare a result with: a reference, not an approval. */
typedef struct dragarc_risk_reference {
    const char *quantity; /* what it limits, in words */
    double limit;         /* the published upper limit */
    const char *source;   /* the document and paragraph */
} dragarc_risk_reference;

/* The published criteria (static storage; *n receives the count). */
const dragarc_risk_reference *dragarc_casualty_references(size_t *n);

#ifdef __cplusplus
}
#endif
#endif
