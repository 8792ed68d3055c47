/* report_fly.c: the `fly` report kind: one flight's inputs, results, figure, cautions and models with sources.
 * SPDX-License-Identifier: GPL-3.0-or-later
 *
 * Fills a dragarc_report (report.h) from a scenario and its flight. Values are shown in the units of the display
 * the user chose (--units, --unit), as the `fly` summary shows them; the cautions are the ones `fly` prints
 * (cautions.c); the sources are those docs/models.md gives for each model the scenario uses.
 */
#include <math.h>
#include <stdarg.h>
#include <stdio.h>
#include <string.h>

#include "dragarc/cautions.h"
#include "dragarc/report.h"

#define PI 3.14159265358979323846
#define DEG (180.0 / PI)
#define RPM (60.0 / (2.0 * PI)) /* rpm per rad/s */

#define MAX_PAIRS 32
#define MAX_TEXT 160

/* Rows of a key-value table being filled, text kept in the table itself. */
typedef struct pairs {
    char text[2 * MAX_PAIRS][MAX_TEXT];
    const char *ptr[2 * MAX_PAIRS];
    size_t n;
} pairs;

static void add(pairs *p, const char *key, const char *fmt, ...) __attribute__((format(printf, 3, 4)));
static void add(pairs *p, const char *key, const char *fmt, ...)
{
    if (p->n == MAX_PAIRS)
        return;
    snprintf(p->text[2 * p->n], MAX_TEXT, "%s", key);
    va_list ap;
    va_start(ap, fmt);
    vsnprintf(p->text[2 * p->n + 1], MAX_TEXT, fmt, ap);
    va_end(ap);
    p->ptr[2 * p->n] = p->text[2 * p->n];
    p->ptr[2 * p->n + 1] = p->text[2 * p->n + 1];
    p->n++;
}

/* A value of output field `field` (quantity q) in the display's unit, and that unit's symbol ("deg" for degrees). */
static double shown(const dragarc_display *d, const char *field, dragarc_quantity q, double si)
{
    return dragarc_display_value(dragarc_display_unit(d, field, q), si);
}

static const char *unit(const dragarc_display *d, const char *field, dragarc_quantity q)
{
    const char *u = dragarc_display_unit(d, field, q)->symbol;
    return strcmp(u, "degree") == 0 ? "deg" : u;
}

#define SHOW(field, q, v) shown(d, field, q, v), unit(d, field, q)

static void drag_input(pairs *p, const dragarc_drag *g)
{
    switch (g->model) {
    case DRAGARC_DRAG_CONSTANT: add(p, "drag", "constant drag coefficient, Cd %.4g", g->cd); break;
    case DRAGARC_DRAG_LINEAR: add(p, "drag", "linear, k %.4g N s/m", g->k); break;
    case DRAGARC_DRAG_QUADRATIC: add(p, "drag", "quadratic, c %.4g kg/m", g->c); break;
    case DRAGARC_DRAG_SPHERE: add(p, "drag", "smooth sphere, Cd against Reynolds number"); break;
    case DRAGARC_DRAG_TABLE:
        add(p, "drag", "table of Cd against %s, %zu points", dragarc_drag_axis_name(g->axis), g->npoints);
        break;
    case DRAGARC_DRAG_SPIN_TABLE:
        add(p, "drag", "table of Cd against Reynolds number and spin factor, %zu x %zu", g->npoints, g->ns);
        break;
    default: add(p, "drag", "none"); break;
    }
}

static void atmosphere_input(pairs *p, const dragarc_scenario *s, const dragarc_display *d)
{
    const dragarc_atmosphere *a = &s->atmosphere;
    switch (a->model) {
    case DRAGARC_ATMOSPHERE_ISA:
        add(p, "atmosphere", "U.S. Standard Atmosphere 1976, site at %.4g %s, temperature offset %.3g K",
            SHOW("site_elevation", DRAGARC_Q_LENGTH, a->site_elevation), a->temperature_offset);
        break;
    case DRAGARC_ATMOSPHERE_CONSTANT:
        add(p, "atmosphere", "constant fluid, density %.4g kg/m\xc2\xb3, viscosity %.4g Pa s", a->density,
            a->viscosity);
        break;
    case DRAGARC_ATMOSPHERE_EXPONENTIAL:
        add(p, "atmosphere", "exponential, density %.4g kg/m\xc2\xb3 at the datum, scale height %.4g %s", a->density,
            SHOW(NULL, DRAGARC_Q_LENGTH, a->scale_height));
        break;
    case DRAGARC_ATMOSPHERE_LOCAL:
        add(p, "atmosphere", "the day's weather: %.4g %s, %.5g %s, relative humidity %.0f %%",
            SHOW("temperature", DRAGARC_Q_TEMPERATURE, a->temperature),
            SHOW("pressure", DRAGARC_Q_PRESSURE, a->pressure), 100.0 * a->relative_humidity);
        break;
    }
}

static void wind_input(pairs *p, const dragarc_wind *w, const dragarc_display *d)
{
    switch (w->model) {
    case DRAGARC_WIND_NONE: add(p, "wind", "none"); break;
    case DRAGARC_WIND_CONSTANT:
        add(p, "wind", "%.4g %s from %.4g deg", SHOW("wind_speed", DRAGARC_Q_SPEED, w->speed), w->from * DEG);
        break;
    case DRAGARC_WIND_LAYERED: add(p, "wind", "layered, %zu rows of height, speed and direction", w->nlayers); break;
    case DRAGARC_WIND_POWER:
        add(p, "wind", "power law, %.4g %s from %.4g deg at %.4g %s, exponent %.3g",
            SHOW("wind_speed", DRAGARC_Q_SPEED, w->speed), w->from * DEG,
            SHOW(NULL, DRAGARC_Q_LENGTH, w->ref_height), w->exponent);
        break;
    case DRAGARC_WIND_LOG:
        add(p, "wind", "logarithmic, %.4g %s from %.4g deg at %.4g %s, roughness %.3g %s",
            SHOW("wind_speed", DRAGARC_Q_SPEED, w->speed), w->from * DEG,
            SHOW(NULL, DRAGARC_Q_LENGTH, w->ref_height), SHOW(NULL, DRAGARC_Q_LENGTH, w->roughness));
        break;
    }
}

static int inputs(dragarc_report *r, const dragarc_scenario *s, const dragarc_display *d, dragarc_error *err)
{
    pairs p = {.n = 0};
    const dragarc_projectile *pr = &s->projectile;
    if (pr->name[0])
        add(&p, "projectile", "%s", pr->name);
    add(&p, "mass", "%.4g %s", SHOW("mass", DRAGARC_Q_MASS, pr->mass));
    add(&p, "diameter", "%.4g %s", SHOW("diameter", DRAGARC_Q_LENGTH, pr->diameter));
    drag_input(&p, &pr->drag);
    add(&p, "launch speed", "%.4g %s", SHOW("launch_speed", DRAGARC_Q_SPEED, s->launch.speed));
    add(&p, "elevation", "%.4g %s", SHOW(NULL, DRAGARC_Q_ANGLE, s->launch.elevation * DEG));
    add(&p, "azimuth", "%.4g %s clockwise from north", SHOW(NULL, DRAGARC_Q_ANGLE, s->launch.azimuth * DEG));
    add(&p, "launch height", "%.4g %s above the datum", SHOW("launch_height", DRAGARC_Q_LENGTH, s->launch.height));
    if (s->launch.spin_rate > 0.0) {
        if (s->launch.spin_axis_given)
            add(&p, "spin", "%.4g %s about (%.3f, %.3f, %.3f) east-north-up",
                SHOW("spin_rate", DRAGARC_Q_ANGULAR_SPEED, s->launch.spin_rate * RPM), s->launch.spin_axis[0],
                s->launch.spin_axis[1], s->launch.spin_axis[2]);
        else
            add(&p, "spin", "%.4g %s, tilt %.4g %s", SHOW("spin_rate", DRAGARC_Q_ANGULAR_SPEED, s->launch.spin_rate * RPM),
                SHOW(NULL, DRAGARC_Q_ANGLE, s->launch.spin_tilt * DEG));
        const char *lift[] = {"none: the spin has no effect", "constant lift coefficient",
                              "lift coefficient against spin factor, fit of Sawicki et al. (2003)",
                              "table of lift coefficient against spin factor"};
        add(&p, "lift", "%s", lift[pr->lift.model <= DRAGARC_LIFT_TABLE ? pr->lift.model : 0]);
    }
    if (pr->evaporation.enabled)
        add(&p, "evaporation", "a water drop, %.3g of its volume not volatile", pr->evaporation.nonvolatile_fraction);
    atmosphere_input(&p, s, d);
    wind_input(&p, &s->wind, d);
    add(&p, "gravity", "%.6g m/s\xc2\xb2", s->gravity);
    add(&p, "Earth", "%s", s->earth.model == DRAGARC_EARTH_FLAT ? "flat, not rotating"
                           : s->earth.rotation                  ? "a rotating sphere"
                                                                : "a sphere, not rotating");
    add(&p, "ground", "%.4g %s above the datum%s", SHOW("ground_elevation", DRAGARC_Q_LENGTH, s->ground_elevation),
        s->ground_surface_given ? "; the ball bounces and rolls" : "; the flight ends where it lands");
    add(&p, "solver", "%s, rtol %.1e, atol %.1e", s->solver.method == DRAGARC_METHOD_AUTO ? "auto"
                                                   : dragarc_method_name(s->solver.method),
        s->solver.rtol, s->solver.atol);
    return dragarc_report_pairs(r, "Scenario", p.n, p.ptr, err);
}

static int summary(dragarc_report *r, const dragarc_scenario *s, const dragarc_flight *f, const dragarc_display *d,
                   dragarc_error *err)
{
    pairs p = {.n = 0};
    double cross = shown(d, "crossrange", DRAGARC_Q_LENGTH, f->crossrange);
    add(&p, "range (carry)", "%.2f %s", SHOW("range", DRAGARC_Q_LENGTH, f->range));
    add(&p, "downrange", "%.2f %s", SHOW("downrange", DRAGARC_Q_LENGTH, f->downrange));
    add(&p, "crossrange", "%.2f %s %s", fabs(cross), unit(d, "crossrange", DRAGARC_Q_LENGTH),
        cross >= -0.005 ? "right" : "left");
    add(&p, "time of flight", "%.3f %s", SHOW("time_of_flight", DRAGARC_Q_TIME, f->time_of_flight));
    add(&p, "apex height", "%.2f %s at %.3f %s", SHOW("apex_height", DRAGARC_Q_LENGTH, f->apex_height),
        SHOW("apex_time", DRAGARC_Q_TIME, f->apex_time));
    add(&p, "impact speed", "%.2f %s", SHOW("impact_speed", DRAGARC_Q_SPEED, f->impact_speed));
    add(&p, "impact angle", "%.1f %s below horizontal", SHOW("impact_angle", DRAGARC_Q_ANGLE, f->impact_angle * DEG));
    add(&p, "impact energy", "%.3g %s", SHOW("impact_energy", DRAGARC_Q_ENERGY, f->impact_energy));
    if (f->evaporated)
        add(&p, "evaporated", "before landing: the impact values are where the drop vanished");
    if (s->launch.spin_rate > 0.0)
        add(&p, "spin at landing", "%.4g %s", SHOW("spin_rate", DRAGARC_Q_ANGULAR_SPEED, f->impact[6] * RPM));
    if (s->ground_surface_given) {
        add(&p, "bounces", "%d", f->bounces);
        add(&p, "roll", "%.2f %s", SHOW("roll_distance", DRAGARC_Q_LENGTH, f->roll_distance));
        add(&p, "total distance", "%.2f %s at rest after %.3f %s",
            SHOW("total_distance", DRAGARC_Q_LENGTH, f->total_distance), SHOW("rest_time", DRAGARC_Q_TIME, f->rest_time));
    }
    if (isfinite(f->terminal_speed))
        add(&p, "terminal speed", "%.3f %s in still air at the launch height",
            SHOW("terminal_speed", DRAGARC_Q_SPEED, f->terminal_speed));
    else
        add(&p, "terminal speed", "none (no drag, or the body does not sink)");
    if (isfinite(f->vacuum_range))
        add(&p, "vacuum range", "%.2f %s for the same launch without air",
            SHOW("vacuum_range", DRAGARC_Q_LENGTH, f->vacuum_range));
    add(&p, "solver", "%s, %ld steps", dragarc_method_name(f->method), f->steps);
    return dragarc_report_pairs(r, "Summary", p.n, p.ptr, err);
}

/* v to `decimals` decimals in a 32-byte cell, never "-0.00". */
static void number(char *cell, int decimals, double v)
{
    if (fabs(v) < 0.5 * pow(10.0, -decimals))
        v = 0.0;
    snprintf(cell, 32, "%.*f", decimals, v);
}

/* About a dozen rows of the sampled flight, evenly in time, the last one the impact (or where the ball rests). */
#define TRACK_ROWS 13
#define TRACK_COLS 5
static int track(dragarc_report *r, const dragarc_scenario *s, const dragarc_flight *g, const dragarc_display *d,
                 dragarc_error *err)
{
    if (g->npoints < 2)
        return DRAGARC_OK;
    char head[TRACK_COLS][64], cell[TRACK_ROWS][TRACK_COLS][32];
    const char *hp[TRACK_COLS], *cp[TRACK_ROWS * TRACK_COLS];
    snprintf(head[0], sizeof head[0], "time (%s)", unit(d, "time_of_flight", DRAGARC_Q_TIME));
    snprintf(head[1], sizeof head[1], "downrange (%s)", unit(d, "downrange", DRAGARC_Q_LENGTH));
    snprintf(head[2], sizeof head[2], "crossrange, right + (%s)", unit(d, "crossrange", DRAGARC_Q_LENGTH));
    snprintf(head[3], sizeof head[3], "height above ground (%s)", unit(d, "apex_height", DRAGARC_Q_LENGTH));
    snprintf(head[4], sizeof head[4], "speed (%s)", unit(d, "impact_speed", DRAGARC_Q_SPEED));
    int numeric[TRACK_COLS] = {1, 1, 1, 1, 1};
    size_t rows = g->npoints < TRACK_ROWS ? g->npoints : TRACK_ROWS;
    double t_end = g->points[g->npoints - 1].t, az = s->launch.azimuth;
    size_t k = 0;
    for (size_t i = 0; i < rows; i++) {
        /* the sample nearest each of `rows` evenly spaced times (the first and the last exactly) */
        double want = t_end * (double)i / (double)(rows - 1);
        while (k + 1 < g->npoints && fabs(g->points[k + 1].t - want) <= fabs(g->points[k].t - want))
            k++;
        const dragarc_flight_point *q = &g->points[k];
        double down = q->pos[0] * sin(az) + q->pos[1] * cos(az), cross = q->pos[0] * cos(az) - q->pos[1] * sin(az);
        number(cell[i][0], 3, shown(d, "time_of_flight", DRAGARC_Q_TIME, q->t));
        number(cell[i][1], 2, shown(d, "downrange", DRAGARC_Q_LENGTH, down));
        number(cell[i][2], 2, shown(d, "crossrange", DRAGARC_Q_LENGTH, cross));
        number(cell[i][3], 2, shown(d, "apex_height", DRAGARC_Q_LENGTH, q->pos[2] - s->ground_elevation));
        number(cell[i][4], 2, shown(d, "impact_speed", DRAGARC_Q_SPEED, q->speed));
        for (size_t j = 0; j < TRACK_COLS; j++)
            cp[i * TRACK_COLS + j] = cell[i][j];
    }
    for (size_t j = 0; j < TRACK_COLS; j++)
        hp[j] = head[j];
    return dragarc_report_table(r, "Along the flight", TRACK_COLS, hp, numeric, rows, cp, err);
}

/* The models the flight used, with the sources docs/models.md gives. */
static int sources(dragarc_report *r, const dragarc_scenario *s, const dragarc_flight *f, dragarc_error *err)
{
    const char *topic[12], *model[12], *source[12];
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
    switch (f->method) {
    case DRAGARC_METHOD_ADAMS:
    case DRAGARC_METHOD_BDF:
        SRC("integrator", f->method == DRAGARC_METHOD_BDF ? "SUNDIALS CVODE, BDF" : "SUNDIALS CVODE, Adams-Moulton",
            "Hindmarsh, A. C. et al. (2005), SUNDIALS: Suite of nonlinear and differential/algebraic equation "
            "solvers, ACM TOMS 31:363");
        break;
    case DRAGARC_METHOD_RK8PD:
        SRC("integrator", "GSL's Runge-Kutta-Prince-Dormand 8(9) pair",
            "Prince, P. J. & Dormand, J. R. (1981), High order embedded Runge-Kutta formulae, J. Comput. Appl. Math. 7:67");
        break;
    default:
        SRC("integrator", "Dormand and Prince's Runge-Kutta pair of order 8 (DOP853) with its continuous extension",
            "Hairer, E., N\xc3\xb8rsett, S. P. & Wanner, G. (1993), Solving Ordinary Differential Equations I: "
            "Nonstiff Problems, 2nd ed., Springer, section II.10");
        break;
    }
#undef SRC
    for (size_t i = 0; i < n; i++) {
        int rc = dragarc_report_source(r, topic[i], model[i], source[i], err);
        if (rc != DRAGARC_OK)
            return rc;
    }
    return DRAGARC_OK;
}

typedef struct plot_job {
    const dragarc_scenario *s;
    const dragarc_flight *f;
    const dragarc_display *d;
    const dragarc_flight_plot_options *po;
} plot_job;

static int draw_flight(const char *path, const void *ctx, dragarc_error *err)
{
    const plot_job *j = ctx;
    return dragarc_flight_plot(path, j->s, j->f, j->d, j->po, err);
}

int dragarc_report_fly(dragarc_report *r, const char *where, const dragarc_scenario *s, const dragarc_flight *f,
                       const dragarc_flight *sampled, const dragarc_display *d,
                       const dragarc_flight_plot_options *po, dragarc_error *err)
{
    dragarc_display si;
    if (!d) {
        dragarc_display_si(&si);
        d = &si;
    }
    char line[4200];
    snprintf(line, sizeof line, "Scenario file %s: one flight from launch to ground impact.", where ? where : "");
    const char *cautions[DRAGARC_CAUTIONS_MAX];
    size_t nc = dragarc_cautions_flight(s, f, cautions, DRAGARC_CAUTIONS_MAX);
    plot_job job = {s, sampled, d, po};
    int rc;
    if ((rc = dragarc_report_subtitle(r, line, err)) != DRAGARC_OK ||
        (rc = dragarc_report_section(r, "Inputs", err)) != DRAGARC_OK || (rc = inputs(r, s, d, err)) != DRAGARC_OK ||
        (rc = dragarc_report_section(r, "Results", err)) != DRAGARC_OK ||
        (rc = summary(r, s, f, d, err)) != DRAGARC_OK || (rc = track(r, s, sampled, d, err)) != DRAGARC_OK ||
        (rc = dragarc_report_section(r, "Figures", err)) != DRAGARC_OK ||
        (rc = dragarc_report_figure_draw(r,
                                         "Side view (height against downrange, with the path the same launch would "
                                         "take without air), plan view (crossrange against downrange, with the wind "
                                         "at the launch height) and the speed over ground against time.",
                                         draw_flight, &job, err)) != DRAGARC_OK ||
        (rc = dragarc_report_section(r, "Cautions", err)) != DRAGARC_OK ||
        (rc = dragarc_report_cautions(r, nc, cautions, err)) != DRAGARC_OK)
        return rc;
    return sources(r, s, f, err);
}
