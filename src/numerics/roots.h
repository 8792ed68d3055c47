/* roots.h: one bracketed root by GSL's Brent solver (private to numerics/).
 * SPDX-License-Identifier: GPL-3.0-or-later
 */
#ifndef DRAGARC_ROOTS_H
#define DRAGARC_ROOTS_H

/* The root of f in [lo, hi] (f(lo) and f(hi) of opposite signs) to within rel * |x| (+1e-300) by Brent's method
 * (Brent 1973, Algorithms for Minimization without Derivatives, ch. 4; GSL gsl_root_fsolver_brent), at most 200
 * iterations. Returns 0 with *x set, or a GSL status (GSL_ENOMEM when the solver cannot be allocated). */
int dragarc_brent_root(double (*f)(double, void *), void *user, double lo, double hi, double rel, double *x);

#endif
