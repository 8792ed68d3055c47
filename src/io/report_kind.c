/* report_kind.c: what the report kinds share (report_kind.h): tables of formatted text, values in the user's units,
 * a scenario's inputs, and the models of its flights with the sources docs/models.md gives.
 * SPDX-License-Identifier: GPL-3.0-or-later
 */
#include <math.h>
#include <stdarg.h>
#include <stdio.h>
#include <stdlib.h>
#include <string.h>

#include "dragarc/casualty.h"
#include "io/report_kind.h"

#define DEG REPORT_DEG
#define RPM (60.0 / (2.0 * REPORT_PI)) /* rpm per rad/s */
#define SHOW REPORT_SHOW

void report_add(report_pairs *p, const char *key, const char *fmt, ...)
{
    if (p->n == REPORT_MAX_PAIRS)
        return;
    snprintf(p->text[2 * p->n], REPORT_MAX_TEXT, "%s", key);
    va_list ap;
    va_start(ap, fmt);
    vsnprintf(p->text[2 * p->n + 1], REPORT_MAX_TEXT, fmt, ap);
    va_end(ap);
    p->ptr[2 * p->n] = p->text[2 * p->n];
    p->ptr[2 * p->n + 1] = p->text[2 * p->n + 1];
    p->n++;
}

int report_pairs_emit(dragarc_report *r, const char *caption, const report_pairs *p, dragarc_error *err)
{
    return dragarc_report_pairs(r, caption, p->n, p->ptr, err);
}

int report_grid_init(report_grid *g, size_t nrows, size_t ncols, dragarc_error *err)
{
    g->nrows = nrows;
    g->ncols = ncols;
    g->cell = calloc(nrows * ncols + 1, sizeof *g->cell);
    g->ptr = calloc(nrows * ncols + 1, sizeof *g->ptr);
    if (!g->cell || !g->ptr) {
        dragarc_error_set(err, DRAGARC_ENOMEM, "", "out of memory for a table of %zu rows", nrows);
        return DRAGARC_ENOMEM;
    }
    for (size_t k = 0; k < nrows * ncols; k++)
        g->ptr[k] = g->cell[k];
    return DRAGARC_OK;
}

void report_grid_set(report_grid *g, size_t i, size_t j, const char *fmt, ...)
{
    va_list ap;
    va_start(ap, fmt);
    vsnprintf(g->cell[i * g->ncols + j], REPORT_CELL, fmt, ap);
    va_end(ap);
}

void report_grid_number(report_grid *g, size_t i, size_t j, int decimals, double v)
{
    if (isfinite(v))
        report_number(g->cell[i * g->ncols + j], decimals, v);
    else
        g->cell[i * g->ncols + j][0] = '\0';
}

int report_grid_emit(dragarc_report *r, const char *caption, const report_grid *g, const char *const *headings,
                     const int *numeric, dragarc_error *err)
{
    return dragarc_report_table(r, caption, g->ncols, headings, numeric, g->nrows, g->ptr, err);
}

void report_grid_free(report_grid *g)
{
    free(g->cell);
    free((void *)g->ptr);
    g->cell = NULL;
    g->ptr = NULL;
}

double report_shown(const dragarc_display *d, const char *field, dragarc_quantity q, double si)
{
    return dragarc_display_value(dragarc_display_unit(d, field, q), si);
}

const char *report_unit(const dragarc_display *d, const char *field, dragarc_quantity q)
{
    const char *u = dragarc_display_unit(d, field, q)->symbol;
    return strcmp(u, "degree") == 0 ? "deg" : u;
}

void report_number(char *cell, int decimals, double v)
{
    if (fabs(v) < 0.5 * pow(10.0, -decimals))
        v = 0.0;
    snprintf(cell, 32, "%.*f", decimals, v);
}

static void drag_input(report_pairs *p, const dragarc_drag *g)
{
    switch (g->model) {
    case DRAGARC_DRAG_CONSTANT: report_add(p, "drag", "constant drag coefficient, Cd %.4g", g->cd); break;
    case DRAGARC_DRAG_LINEAR: report_add(p, "drag", "linear, k %.4g N s/m", g->k); break;
    case DRAGARC_DRAG_QUADRATIC: report_add(p, "drag", "quadratic, c %.4g kg/m", g->c); break;
    case DRAGARC_DRAG_SPHERE: report_add(p, "drag", "smooth sphere, Cd against Reynolds number"); break;
    case DRAGARC_DRAG_TABLE:
        report_add(p, "drag", "table of Cd against %s, %zu points", dragarc_drag_axis_name(g->axis), g->npoints);
        break;
    case DRAGARC_DRAG_SPIN_TABLE:
        report_add(p, "drag", "table of Cd against Reynolds number and spin factor, %zu x %zu", g->npoints, g->ns);
        break;
    default: report_add(p, "drag", "none"); break;
    }
    if (dragarc_drag_scale(g) != 1.0 && g->model != DRAGARC_DRAG_NONE)
        report_add(p, "drag scale", "the law's drag times cd_scale %.4g", dragarc_drag_scale(g));
}

static void atmosphere_input(report_pairs *p, const dragarc_scenario *s, const dragarc_display *d)
{
    const dragarc_atmosphere *a = &s->atmosphere;
    switch (a->model) {
    case DRAGARC_ATMOSPHERE_ISA:
        report_add(p, "atmosphere", "U.S. Standard Atmosphere 1976, site at %.4g %s, temperature offset %.3g K",
            SHOW("site_elevation", DRAGARC_Q_LENGTH, a->site_elevation), a->temperature_offset);
        break;
    case DRAGARC_ATMOSPHERE_CONSTANT:
        report_add(p, "atmosphere", "constant fluid, density %.4g kg/m\xc2\xb3, viscosity %.4g Pa s", a->density,
            a->viscosity);
        break;
    case DRAGARC_ATMOSPHERE_EXPONENTIAL:
        report_add(p, "atmosphere", "exponential, density %.4g kg/m\xc2\xb3 at the datum, scale height %.4g %s", a->density,
            SHOW(NULL, DRAGARC_Q_LENGTH, a->scale_height));
        break;
    case DRAGARC_ATMOSPHERE_LOCAL:
        report_add(p, "atmosphere", "the day's weather: %.5g %s, %.6g %s, relative humidity %.0f %%",
            SHOW("temperature", DRAGARC_Q_TEMPERATURE, a->temperature),
            SHOW("pressure", DRAGARC_Q_PRESSURE, a->pressure), 100.0 * a->relative_humidity);
        break;
    }
}

static void wind_input(report_pairs *p, const dragarc_wind *w, const dragarc_display *d)
{
    switch (w->model) {
    case DRAGARC_WIND_NONE: report_add(p, "wind", "none"); break;
    case DRAGARC_WIND_CONSTANT:
        report_add(p, "wind", "%.4g %s from %.4g deg", SHOW("wind_speed", DRAGARC_Q_SPEED, w->speed), w->from * DEG);
        break;
    case DRAGARC_WIND_LAYERED: report_add(p, "wind", "layered, %zu rows of height, speed and direction", w->nlayers); break;
    case DRAGARC_WIND_POWER:
        report_add(p, "wind", "power law, %.4g %s from %.4g deg at %.4g %s, exponent %.3g",
            SHOW("wind_speed", DRAGARC_Q_SPEED, w->speed), w->from * DEG,
            SHOW(NULL, DRAGARC_Q_LENGTH, w->ref_height), w->exponent);
        break;
    case DRAGARC_WIND_LOG:
        report_add(p, "wind", "logarithmic, %.4g %s from %.4g deg at %.4g %s, roughness %.3g %s",
            SHOW("wind_speed", DRAGARC_Q_SPEED, w->speed), w->from * DEG,
            SHOW(NULL, DRAGARC_Q_LENGTH, w->ref_height), SHOW(NULL, DRAGARC_Q_LENGTH, w->roughness));
        break;
    }
}

void report_air_inputs(report_pairs *p, const dragarc_scenario *s, const dragarc_display *d)
{
    atmosphere_input(p, s, d);
    wind_input(p, &s->wind, d);
}

int report_scenario_inputs(dragarc_report *r, const dragarc_scenario *s, const dragarc_display *d, dragarc_error *err)
{
    report_pairs p = {.n = 0};
    const dragarc_projectile *pr = &s->projectile;
    if (pr->name[0])
        report_add(&p, "projectile", "%s", pr->name);
    report_add(&p, "mass", "%.4g %s", SHOW("mass", DRAGARC_Q_MASS, pr->mass));
    report_add(&p, "diameter", "%.4g %s", SHOW("diameter", DRAGARC_Q_LENGTH, pr->diameter));
    drag_input(&p, &pr->drag);
    report_add(&p, "launch speed", "%.4g %s", SHOW("launch_speed", DRAGARC_Q_SPEED, s->launch.speed));
    report_add(&p, "elevation", "%.4g %s", SHOW(NULL, DRAGARC_Q_ANGLE, s->launch.elevation * DEG));
    report_add(&p, "azimuth", "%.4g %s clockwise from north", SHOW(NULL, DRAGARC_Q_ANGLE, s->launch.azimuth * DEG));
    report_add(&p, "launch height", "%.4g %s above the datum", SHOW("launch_height", DRAGARC_Q_LENGTH, s->launch.height));
    if (s->launch.spin_rate > 0.0) {
        if (s->launch.spin_axis_given)
            report_add(&p, "spin", "%.4g %s about (%.3f, %.3f, %.3f) east-north-up",
                SHOW("spin_rate", DRAGARC_Q_ANGULAR_SPEED, s->launch.spin_rate * RPM), s->launch.spin_axis[0],
                s->launch.spin_axis[1], s->launch.spin_axis[2]);
        else
            report_add(&p, "spin", "%.4g %s, tilt %.4g %s", SHOW("spin_rate", DRAGARC_Q_ANGULAR_SPEED, s->launch.spin_rate * RPM),
                SHOW(NULL, DRAGARC_Q_ANGLE, s->launch.spin_tilt * DEG));
        const char *lift[] = {"none: the spin has no effect", "constant lift coefficient",
                              "lift coefficient against spin factor, fit of Sawicki et al. (2003)",
                              "table of lift coefficient against spin factor"};
        report_add(&p, "lift", "%s", lift[pr->lift.model <= DRAGARC_LIFT_TABLE ? pr->lift.model : 0]);
    }
    if (pr->evaporation.enabled)
        report_add(&p, "evaporation", "a water drop, %.3g of its volume not volatile", pr->evaporation.nonvolatile_fraction);
    report_air_inputs(&p, s, d);
    report_add(&p, "gravity", "%.6g m/s\xc2\xb2", s->gravity);
    report_add(&p, "Earth", "%s", s->earth.model == DRAGARC_EARTH_FLAT ? "flat, not rotating"
                           : s->earth.rotation                  ? "a rotating sphere"
                                                                : "a sphere, not rotating");
    report_add(&p, "ground", "%.4g %s above the datum%s", SHOW("ground_elevation", DRAGARC_Q_LENGTH, s->ground_elevation),
        s->ground_surface_given ? "; the ball bounces and rolls" : "; the flight ends where it lands");
    report_add(&p, "solver", "%s, rtol %.1e, atol %.1e", s->solver.method == DRAGARC_METHOD_AUTO ? "auto"
                                                   : dragarc_method_name(s->solver.method),
        s->solver.rtol, s->solver.atol);
    return dragarc_report_pairs(r, "Scenario", p.n, p.ptr, err);
}

int report_flight_sources(dragarc_report *r, const dragarc_scenario *s, dragarc_method method, dragarc_error *err)
{
    const char *topic[14], *model[14], *source[14];
    size_t n = 0;
#define SRC(t, m, src) (topic[n] = (t), model[n] = (m), source[n] = (src), n++)
    SRC("equations of motion", "a point mass under gravity, buoyancy, drag and (given a lift model) spin lift",
        "dragarc, docs/models.md");
    switch (s->atmosphere.model) {
    case DRAGARC_ATMOSPHERE_ISA:
        SRC("atmosphere", "U.S. Standard Atmosphere 1976 (Sutherland's law for the viscosity)",
            "NOAA, NASA, USAF (1976), U.S. Standard Atmosphere, 1976, NASA-TM-X-74335");
        break;
    case DRAGARC_ATMOSPHERE_LOCAL:
        SRC("atmosphere", "CIPM-2007 density of moist air at the site, the standard's lapse rate above and below it",
            "Picard, A., Davis, R. S., Gl\xc3\xa4ser, M. & Fujii, K. (2008), Revised formula for the density of moist "
            "air (CIPM-2007), Metrologia 45:149-155");
        break;
    case DRAGARC_ATMOSPHERE_EXPONENTIAL:
        SRC("atmosphere", "an isothermal, exponential atmosphere with the scenario's density and scale height", "");
        break;
    default: SRC("atmosphere", "a fluid of constant properties, as the scenario gives them", ""); break;
    }
    switch (s->projectile.drag.model) {
    case DRAGARC_DRAG_SPHERE:
        SRC("drag", "the smooth sphere's drag coefficient against Reynolds number",
            "Clift, R., Grace, J. R. & Weber, M. E. (1978), Bubbles, Drops, and Particles, Academic Press, Table 5.2");
        break;
    case DRAGARC_DRAG_TABLE:
    case DRAGARC_DRAG_SPIN_TABLE:
        SRC("drag", "the scenario's table of drag coefficients, interpolated monotonically",
            "Steffen, M. (1990), A simple method for monotonic interpolation in one dimension, Astron. Astrophys. "
            "239:443");
        break;
    case DRAGARC_DRAG_NONE: break;
    default: SRC("drag", "the scenario's drag law and coefficient", ""); break;
    }
    if (s->launch.spin_rate > 0.0 && s->projectile.lift.model != DRAGARC_LIFT_NONE) {
        SRC("spin lift", "the Magnus lift in the form that defines the lift coefficient",
            "Nathan, A. M. (2008), The effect of spin on the flight of a baseball, Am. J. Phys. 76:119");
        if (s->projectile.lift.model == DRAGARC_LIFT_SAWICKI2003)
            SRC("lift coefficient", "the baseball fit of the lift coefficient against the spin factor",
                "Sawicki, G. S., Hubbard, M. & Stronge, W. J. (2003), How to hit home runs: optimum baseball bat "
                "swing parameters for maximum range trajectories, Am. J. Phys. 71:1152");
        if (s->projectile.spin_decay_coefficient > 0.0 && !(s->launch.spin_decay_time > 0.0))
            SRC("spin decay", "air-friction spin-down",
                "Smits, A. J. & Smith, D. R. (1994), A new aerodynamic model of a golf ball in flight, Science and "
                "Golf II, 340-347");
    }
    if (s->wind.model == DRAGARC_WIND_LOG)
        SRC("wind", "the neutral surface layer's logarithmic profile",
            "Stull, R. B. (1988), An Introduction to Boundary Layer Meteorology, section 9.7");
    else if (s->wind.model == DRAGARC_WIND_POWER)
        SRC("wind", "a power-law profile", "common practice, no source");
    else if (s->wind.model != DRAGARC_WIND_NONE)
        SRC("wind", "the scenario's wind, held steady", "");
    if (s->projectile.evaporation.enabled)
        SRC("evaporation", "the ventilated evaporation of a water drop",
            "Ranz, W. E. & Marshall, W. R. (1952), Evaporation from drops, Chem. Eng. Prog. 48:141; Pruppacher, H. R. "
            "& Klett, J. D. (1997), Microphysics of Clouds and Precipitation");
    if (s->ground_surface_given)
        SRC("bounce and roll", "a rigid ball's impact with restitution and friction, then the roll-out",
            "Brody, H. (1984), That's how the ball bounces, Phys. Teach. 22:494; Cross, R. (2002), Grip-slip behavior "
            "of a bouncing ball, Am. J. Phys. 70:1093");
    if (s->earth.model == DRAGARC_EARTH_SPHERICAL)
        SRC("Earth", s->earth.rotation ? "a rotating sphere: inverse-square gravity, Coriolis and centrifugal terms"
                                       : "a sphere with inverse-square gravity",
            "Landau, L. D. & Lifshitz, E. M. (1976), Mechanics, 3rd ed., Pergamon, section 39");
    /* auto: DOP853, or CVODE's BDF for a body whose drag relaxation time is short against its flight (flight.c) */
    if (method == DRAGARC_METHOD_AUTO || method == DRAGARC_METHOD_DOP853)
        SRC("integrator", "Dormand and Prince's Runge-Kutta pair of order 8 (DOP853) with its continuous extension",
            "Hairer, E., N\xc3\xb8rsett, S. P. & Wanner, G. (1993), Solving Ordinary Differential Equations I: "
            "Nonstiff Problems, 2nd ed., Springer, section II.10");
    switch (method) {
    case DRAGARC_METHOD_AUTO:
        SRC("integrator", "SUNDIALS CVODE, BDF, for the flights whose drag relaxation time is short against the flight",
            "Hindmarsh, A. C. et al. (2005), SUNDIALS: Suite of nonlinear and differential/algebraic equation "
            "solvers, ACM TOMS 31:363");
        break;
    case DRAGARC_METHOD_ADAMS:
    case DRAGARC_METHOD_BDF:
        SRC("integrator", method == DRAGARC_METHOD_BDF ? "SUNDIALS CVODE, BDF" : "SUNDIALS CVODE, Adams-Moulton",
            "Hindmarsh, A. C. et al. (2005), SUNDIALS: Suite of nonlinear and differential/algebraic equation "
            "solvers, ACM TOMS 31:363");
        break;
    case DRAGARC_METHOD_RK8PD:
        SRC("integrator", "GSL's Runge-Kutta-Prince-Dormand 8(9) pair",
            "Prince, P. J. & Dormand, J. R. (1981), High order embedded Runge-Kutta formulae, J. Comput. Appl. Math. 7:67");
        break;
    default: break;
    }
#undef SRC
    for (size_t i = 0; i < n; i++) {
        int rc = dragarc_report_source(r, topic[i], model[i], source[i], err);
        if (rc != DRAGARC_OK)
            return rc;
    }
    return DRAGARC_OK;
}


void report_spectrum_inputs(report_pairs *p, const dragarc_spectrum *sp, size_t nclasses,
                            dragarc_spectrum_spacing spacing)
{
    switch (sp->form) {
    case DRAGARC_SPECTRUM_ROSIN_RAMMLER:
        report_add(p, "drop sizes", "Rosin-Rammler, Dv50 %.4g \xc2\xb5m, spread %.3g", sp->dv50 * 1e6, sp->spread);
        break;
    case DRAGARC_SPECTRUM_LOG_NORMAL:
        report_add(p, "drop sizes", "log-normal, Dv50 %.4g \xc2\xb5m, sigma %.3g", sp->dv50 * 1e6, sp->sigma);
        break;
    default:
        report_add(p, "drop sizes", "a table of %zu diameters, %.4g to %.4g \xc2\xb5m", sp->npoints,
                   sp->npoints ? sp->diameter[0] * 1e6 : NAN, sp->npoints ? sp->diameter[sp->npoints - 1] * 1e6 : NAN);
        break;
    }
    dragarc_spectrum_summary sum;
    if (dragarc_spectrum_summarise(sp, &sum, NULL) == DRAGARC_OK)
        report_add(p, "spectrum", "Dv10 %.4g \xc2\xb5m, Dv50 %.4g \xc2\xb5m, Dv90 %.4g \xc2\xb5m, relative span %.3g; %.3g %% of the "
                   "volume in drops under 100 \xc2\xb5m", sum.dv10 * 1e6, sum.dv50 * 1e6, sum.dv90 * 1e6, sum.relative_span,
                   100.0 * sum.driftable_fraction);
    report_add(p, "classes", "%zu, %s spacing", nclasses,
               spacing == DRAGARC_SPECTRUM_EQUAL_VOLUME ? "equal-volume" : "geometric");
}

int report_spray_sources(dragarc_report *r, const dragarc_scenario *base, dragarc_spectrum_form form,
                         dragarc_error *err)
{
    int rc = report_flight_sources(r, base, base->solver.method, err);
    if (rc != DRAGARC_OK)
        return rc;
    if (form == DRAGARC_SPECTRUM_ROSIN_RAMMLER)
        rc = dragarc_report_source(r, "drop sizes", "the Rosin-Rammler distribution of the volume over the diameter",
                                   "Rosin, P. & Rammler, E. (1933), The laws governing the fineness of powdered coal, "
                                   "J. Inst. Fuel 7:29",
                                   err);
    else if (form == DRAGARC_SPECTRUM_LOG_NORMAL)
        rc = dragarc_report_source(r, "drop sizes", "a log-normal distribution of the volume over the diameter",
                                   "the normal distribution of ln d (GSL's gsl_cdf_ugaussian_P); docs/models.md", err);
    else
        rc = dragarc_report_source(r, "drop sizes", "the scenario's table of size classes, linear in ln d inside each",
                                   "", err);
    if (rc != DRAGARC_OK)
        return rc;
    return dragarc_report_source(r, "size classes", "the spectrum cut into classes, each flown at its volume-weighted "
                                 "mean diameter", "dragarc, docs/models.md (Droplet size spectra)", err);
}

int report_published_criteria(dragarc_report *r, dragarc_error *err)
{
    size_t nref = 0;
    const dragarc_risk_reference *refs = dragarc_casualty_references(&nref);
    report_pairs q = {.n = 0};
    for (size_t i = 0; i < nref; i++)
        report_add(&q, refs[i].quantity, "%.3g (%s)", refs[i].limit, refs[i].source);
    return report_pairs_emit(r, "Published criteria, for comparison only (not an approval)", &q, err);
}
