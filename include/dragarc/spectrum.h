/* spectrum.h: the volume distribution of droplet diameters from a nozzle, and its discretisation into size classes.
 *
 * Copyright (C) 2026 the dragarc developers. SPDX-License-Identifier: GPL-3.0-or-later
 *
 * F(d) is the fraction of the liquid's volume in drops smaller than d. Forms:
 *   rosin_rammler  F(d) = 1 - exp(-(d/X)^n), X = dv50 / (ln 2)^(1/n)     (Rosin & Rammler 1933, J. Inst. Fuel 7:29)
 *   log_normal     F(d) = Phi((ln d - ln dv50) / sigma); a relative span s gives sigma = asinh(s/2) / Phi^-1(0.9)
 *   table          measured classes: F rises linearly in ln d across each class
 * Discretised, a spectrum becomes K classes, each with its bounds, the volume-weighted mean diameter of the drops
 * inside them and the volume fraction it carries; the fractions sum to 1 (the end classes carry the tails).
 * Pure functions on doubles: no I/O, no global state.
 */
#ifndef DRAGARC_SPECTRUM_H
#define DRAGARC_SPECTRUM_H

#include <stddef.h>

#include "dragarc/dragarc.h"

#ifdef __cplusplus
extern "C" {
#endif

/* Diameters accepted anywhere in a spectrum, m: a design range (1 um to 20 mm), not a physical limit. */
#define DRAGARC_SPECTRUM_DIAMETER_MIN 1e-6
#define DRAGARC_SPECTRUM_DIAMETER_MAX 20e-3
/* The parametric forms are laid out between their 0.1 % and 99.9 % volume quantiles; the 0.1 % beyond each end is
 * carried by the end class. */
#define DRAGARC_SPECTRUM_COVERAGE 0.001
#define DRAGARC_SPECTRUM_MAX_CLASSES 1000
/* A table's fractions may sum to 1 within this and are then scaled to sum to 1 (rounding of printed percentages);
 * further off, the table is refused. */
#define DRAGARC_SPECTRUM_TABLE_SUM_TOLERANCE 0.005
/* The "driftable" threshold of spray practice, m: common practice, no source (other thresholds are used too). */
#define DRAGARC_SPECTRUM_DRIFTABLE_DIAMETER 100e-6

typedef enum dragarc_spectrum_form {
    DRAGARC_SPECTRUM_NONE = 0,
    DRAGARC_SPECTRUM_ROSIN_RAMMLER, /* dv50 and spread n */
    DRAGARC_SPECTRUM_LOG_NORMAL,    /* dv50 and sigma */
    DRAGARC_SPECTRUM_TABLE          /* measured classes */
} dragarc_spectrum_form;

typedef enum dragarc_spectrum_spacing {
    DRAGARC_SPECTRUM_GEOMETRIC = 0, /* bounds in geometric progression: resolves the fine, drifting end */
    DRAGARC_SPECTRUM_EQUAL_VOLUME   /* bounds at the k/K volume quantiles: each class carries the same water */
} dragarc_spectrum_spacing;

/* A spectrum. Make one with a setter below (or fill the parametric fields and call dragarc_spectrum_check); a table
 * owns its arrays: free with dragarc_spectrum_clear, copy with dragarc_spectrum_copy. */
typedef struct dragarc_spectrum {
    dragarc_spectrum_form form;
    double dv50;        /* m, volume median diameter Dv0.5 (rosin_rammler, log_normal) */
    double spread;      /* rosin_rammler: the exponent n, dimensionless, > 0 */
    double sigma;       /* log_normal: standard deviation of ln d, dimensionless, > 0 */
    size_t npoints;     /* table: number of points, >= 2 */
    double *diameter;   /* m, table: class upper bounds, strictly increasing; diameter[0] is the lowest bound */
    double *fraction;   /* table: volume fraction in (diameter[i-1], diameter[i]]; fraction[0] = 0; sum 1 */
    double *cumulative; /* table: volume fraction below diameter[i]; 0 first, 1 last */
} dragarc_spectrum;

/* One size class of a discretised spectrum. */
typedef struct dragarc_spectrum_class {
    double lower, upper;     /* m, class bounds */
    double diameter;         /* m, volume-weighted mean diameter of the drops between the bounds */
    double fraction;         /* volume fraction the class carries, tail included */
    double tail;             /* the part of fraction that lies beyond the bounds (end classes of a parametric form) */
    double drops_per_volume; /* 1/m^3: drops of `diameter` per m^3 of liquid, 6 / (pi diameter^3) */
} dragarc_spectrum_class;

/* Volume quantiles and width of a spectrum. */
typedef struct dragarc_spectrum_summary {
    double dv10, dv50, dv90;   /* m, diameters below which 10, 50, 90 % of the volume lies */
    double relative_span;      /* (dv90 - dv10) / dv50 */
    double driftable_fraction; /* volume fraction below DRAGARC_SPECTRUM_DRIFTABLE_DIAMETER */
} dragarc_spectrum_summary;

/* "none", "rosin_rammler", "log_normal", "table" / "geometric", "equal_volume"; NULL for an unknown value;
 * from_name returns DRAGARC_EINVAL for an unknown name. */
const char *dragarc_spectrum_form_name(dragarc_spectrum_form form);
int dragarc_spectrum_form_from_name(const char *name, dragarc_spectrum_form *out);
const char *dragarc_spectrum_spacing_name(dragarc_spectrum_spacing spacing);
int dragarc_spectrum_spacing_from_name(const char *name, dragarc_spectrum_spacing *out);

/* Parametric setters: the size as dv50 (m) or as the Rosin-Rammler scale X (m); the width as the spread n, as
 * sigma, or as the relative span (dv90 - dv10) / dv50. Each checks its inputs (err->field names the argument:
 * "dv50", "scale", "spread", "sigma", "span"); on success the spectrum is cleared (a table freed) and set, on
 * failure it is untouched. */
int dragarc_spectrum_rosin_rammler(dragarc_spectrum *s, double dv50, double spread, dragarc_error *err);
int dragarc_spectrum_rosin_rammler_scale(dragarc_spectrum *s, double scale, double spread, dragarc_error *err);
int dragarc_spectrum_log_normal(dragarc_spectrum *s, double dv50, double sigma, dragarc_error *err);
int dragarc_spectrum_log_normal_span(dragarc_spectrum *s, double dv50, double span, dragarc_error *err);

/* Make `s` a measured table: copies n >= 2 points. diameter[i] (m) are class upper bounds, strictly increasing from
 * 1 um to 20 mm; diameter[0] is the lower bound of the first class and must carry fraction[0] = 0. The fractions
 * (>= 0) must sum to 1 within DRAGARC_SPECTRUM_TABLE_SUM_TOLERANCE and are scaled to sum to 1. On failure the
 * spectrum is untouched and err->field names "points" or "points[i]". */
int dragarc_spectrum_table_set(dragarc_spectrum *s, const double *diameter, const double *fraction, size_t n,
                               dragarc_error *err);

/* Deep copy (dst overwritten without being cleared); free a table's storage and reset to none (NULL is safe). */
int dragarc_spectrum_copy(dragarc_spectrum *dst, const dragarc_spectrum *src, dragarc_error *err);
void dragarc_spectrum_clear(dragarc_spectrum *s);

/* Check a spectrum; err->field relative to the spectrum object ("form", "dv50", "spread", "sigma", "points[i]").
 * A parametric form is refused when its 0.1 % or 99.9 % volume quantile falls outside 1 um to 20 mm. */
int dragarc_spectrum_check(const dragarc_spectrum *s, dragarc_error *err);

/* Log-normal width from the relative span and back, closed form: span = 2 sinh(sigma Phi^-1(0.9)). */
double dragarc_spectrum_sigma_from_span(double span);
double dragarc_spectrum_span_from_sigma(double sigma);

/* On a checked spectrum: the volume fraction in drops smaller than d (m), 0 for d <= 0. */
double dragarc_spectrum_fraction_below(const dragarc_spectrum *s, double d);

/* On a checked spectrum: the diameter (m) below which the volume fraction p lies, 0 < p < 1 (err->field "p"). */
int dragarc_spectrum_quantile(const dragarc_spectrum *s, double p, double *d, dragarc_error *err);

/* Dv0.1, Dv0.5, Dv0.9, the relative span and the driftable fraction. Checks the spectrum first. */
int dragarc_spectrum_summarise(const dragarc_spectrum *s, dragarc_spectrum_summary *out, dragarc_error *err);

/* Number of drops of diameter d (m) in a cubic metre of liquid: 6 / (pi d^3), 1/m^3. */
double dragarc_spectrum_drops_per_volume(double d);

/* Discretise a spectrum into k classes (1 to 1000), written to the caller's array classes[0..k-1], smallest first.
 * A parametric form is laid out between its 0.1 % and 99.9 % volume quantiles, a table between its first and last
 * diameters. Checks the spectrum (err->field relative to it), then "classes" (the count) and "spacing". */
int dragarc_spectrum_discretise(const dragarc_spectrum *s, size_t k, dragarc_spectrum_spacing spacing,
                                dragarc_spectrum_class *classes, dragarc_error *err);

#ifdef __cplusplus
}
#endif
#endif
