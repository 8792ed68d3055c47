/* fit_out.c: a fit's units and decimals, its warnings as sentences, and its residuals as CSV (its JSON is in
 * json_out.c).
 * SPDX-License-Identifier: GPL-3.0-or-later
 *
 * Estimates are shown in SI units with angles in degrees (dragarc_fit_param_unit).
 */
#include <errno.h>
#include <math.h>
#include <stdio.h>
#include <stdlib.h>
#include <string.h>

#include "core/constants.h"
#include "dragarc/fit.h"
#include "dragarc/output.h"

static int is_angle(int p)
{
    return p == DRAGARC_FIT_WIND_FROM || p == DRAGARC_FIT_LAUNCH_ELEVATION || p == DRAGARC_FIT_LAUNCH_AZIMUTH;
}

const char *dragarc_fit_param_unit(int p)
{
    switch (p) {
    case DRAGARC_FIT_BC: return "kg/m^2";
    case DRAGARC_FIT_WIND_SPEED:
    case DRAGARC_FIT_LAUNCH_SPEED: return "m/s";
    case DRAGARC_FIT_LAUNCH_HEIGHT:
    case DRAGARC_FIT_LAUNCH_EAST:
    case DRAGARC_FIT_LAUNCH_NORTH: return "m";
    default: return is_angle(p) ? "deg" : "";
    }
}

double dragarc_fit_param_shown(int p, double si)
{
    return is_angle(p) ? si * 180.0 / DRAGARC_PI : si;
}

int dragarc_fit_decimals(double se)
{
    if (!(se > 0.0) || !isfinite(se))
        return 6;
    int d = 1 - (int)floor(log10(se));
    return d < 0 ? 0 : d > 12 ? 12 : d;
}

size_t dragarc_fit_warnings(const dragarc_fit_result *r, char (*out)[512], size_t max)
{
    size_t n = 0;
    if ((r->warnings & DRAGARC_FIT_NOT_CONVERGED) && n < max)
        snprintf(out[n++], sizeof *out,
                 "The fit did not converge in %d iteration%s: the values are the last iterate, not a minimum. Start "
                 "closer (the scenario's values are the start), estimate fewer parameters, or allow more iterations.",
                 r->iterations, r->iterations == 1 ? "" : "s");
    if ((r->warnings & DRAGARC_FIT_AT_LIMIT) && n < max) {
        char names[256] = "";
        size_t len = 0;
        for (int k = 0; k < r->np && len < sizeof names - 32; k++)
            if (r->at_limit & (1u << k))
                len += (size_t)snprintf(names + len, sizeof names - len, "%s%s", len ? ", " : "",
                                        dragarc_fit_param_name(r->param[k]));
        snprintf(out[n++], sizeof *out,
                 "The search ended against a limit of what can be flown (%s: a value just beyond it is refused, such "
                 "as a C_D at 0 or a C_L above 1): the values there are no minimum of the residuals, and no standard "
                 "errors hold for them. Start closer to the truth, or hold that parameter fixed in the scenario.",
                 names);
    }
    if ((r->warnings & DRAGARC_FIT_CORRELATED) && n < max && r->worst_pair[0] >= 0)
        snprintf(out[n++], sizeof *out,
                 "%s and %s correlate at %.3f: this track hardly tells them apart, so their standard errors are large "
                 "and each is only as good as the other is known. Fix one in the scenario, or measure a longer or "
                 "more varied track.",
                 dragarc_fit_param_name(r->param[r->worst_pair[0]]), dragarc_fit_param_name(r->param[r->worst_pair[1]]),
                 r->worst_corr);
    if ((r->warnings & DRAGARC_FIT_ILL_CONDITIONED) && n < max) {
        char dir[384] = "";
        size_t len = 0;
        for (int k = 0; k < r->np && len < sizeof dir - 64; k++)
            if (fabs(r->weak_direction[k]) >= 0.2)
                len += (size_t)snprintf(dir + len, sizeof dir - len, "%s%s %+.2f", len ? ", " : "",
                                        dragarc_fit_param_name(r->param[k]), r->weak_direction[k]);
        snprintf(out[n++], sizeof *out,
                 "The problem is poorly conditioned (reciprocal condition number %.2g of the scaled Jacobian): the "
                 "data cannot separate the combination %s of the estimates (each scaled by its effect on the track).",
                 r->rcond, dir);
    }
    if ((r->warnings & DRAGARC_FIT_CHISQ_HIGH) && n < max)
        snprintf(out[n++], sizeof *out,
                 "The residuals are larger than the track's standard deviations allow (chi-square %.4g on %zu degrees "
                 "of freedom, p = %.2g): the model misses something (wind, lift, a parameter held fixed) or the "
                 "standard deviations are too small; the standard errors are then too small as well.",
                 r->chisq, r->dof, r->chisq_p);
    if ((r->warnings & DRAGARC_FIT_CHISQ_LOW) && n < max)
        snprintf(out[n++], sizeof *out,
                 "The residuals are smaller than the track's standard deviations suggest (chi-square %.4g on %zu "
                 "degrees of freedom, p = %.4f): the standard deviations are probably too large, and so are the "
                 "standard errors.",
                 r->chisq, r->dof, r->chisq_p);
    return n;
}

int dragarc_fit_write_residuals_csv(FILE *fp, const dragarc_track *track, const dragarc_fit_result *r,
                                    dragarc_error *err)
{
    const int ncol = track->vel ? 7 : 4;
    fputs(track->vel ? "t_s,dx_m,dy_m,dz_m,dvx_m_s,dvy_m_s,dvz_m_s\n" : "t_s,dx_m,dy_m,dz_m\n", fp);
    for (size_t i = 0; i < r->npoints && r->residuals; i++) {
        dragarc_number_write(fp, track->t[i]);
        for (int k = 0; k < ncol - 1; k++) {
            fputc(',', fp);
            dragarc_number_write(fp, r->residuals[6 * i + k]);
        }
        fputc('\n', fp);
    }
    if (ferror(fp))
        return dragarc_error_set(err, DRAGARC_EIO, "", "write failed: %s", strerror(errno));
    return DRAGARC_OK;
}
