/* roots.c: one bracketed root by GSL's Brent solver.
 * SPDX-License-Identifier: GPL-3.0-or-later
 */
#include <math.h>

#include <gsl/gsl_errno.h>
#include <gsl/gsl_roots.h>

#include "numerics/roots.h"

int dragarc_brent_root(double (*f)(double, void *), void *user, double lo, double hi, double rel, double *x)
{
    gsl_function fn = {f, user};
    gsl_root_fsolver *solver = gsl_root_fsolver_alloc(gsl_root_fsolver_brent);
    if (!solver)
        return GSL_ENOMEM;
    int status = gsl_root_fsolver_set(solver, &fn, lo, hi);
    for (int iter = 0; status == GSL_SUCCESS; iter++) {
        if (iter == 200) {
            status = GSL_EMAXITER;
            break;
        }
        if ((status = gsl_root_fsolver_iterate(solver)) != GSL_SUCCESS)
            break;
        status = gsl_root_test_interval(gsl_root_fsolver_x_lower(solver), gsl_root_fsolver_x_upper(solver), 0.0, rel);
        if (status == GSL_SUCCESS) {
            *x = gsl_root_fsolver_root(solver);
            break;
        }
        if (status == GSL_CONTINUE)
            status = GSL_SUCCESS;
    }
    gsl_root_fsolver_free(solver);
    return status;
}
