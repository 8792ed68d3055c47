/* bounce.c: a rigid sphere bouncing on, then rolling along, flat horizontal ground.
 * SPDX-License-Identifier: GPL-3.0-or-later
 *
 * Impact. Sphere of mass m, radius r, I = alpha m r^2; ground normal n = z^; contact point at -r n from
 * the centre, moving with the slip velocity u = v_t + w x (-r n) = v_t - r w x n (horizontal). A contact
 * impulse J = J_n n + J_t gives m dv = J, I dw = (-r n) x J_t, hence
 *   du = J_t (1/m + r^2/I) = J_t (1 + alpha) / (alpha m),   using (n x J_t) x n = J_t,
 * so a tangential impulse along -u^ only shortens u: the slip keeps its direction during the impact.
 *   normal:  v_z' = -e v_z,   J_n = m (1 + e) |v_z|   (Newton's restitution)
 *   grip:    J_t = -m alpha (1 + e_t) u / (1 + alpha)   (the slip leaves as -e_t u; e_t = 0: rolling)
 *   slide:   J_t = -mu J_n u^ = -mu m (1 + e) |v_z| u^  when that is the smaller of the two
 * This is the elementary rigid-ball model of Brody, H. (1984), "That's how the ball bounces", Phys.
 * Teach. 22:494, and of the "elementary bounce models" of Cross, R. (2002), "Grip-slip behavior of a
 * bouncing ball", Am. J. Phys. 70:1093 (section I: a ball slides throughout at low angles of incidence,
 * and at higher angles starts to roll when the contact point comes to rest); the same model, with a
 * tangential restitution for balls that grip, in three dimensions in Domenech, A. (2005), "A classical
 * experiment revisited: The bounce of balls and superballs in three dimensions", Am. J. Phys. 73:28
 * (doi 10.1119/1.1794755; page recalled). Taking whichever of the two impulses is smaller, with e_t in the
 * role of beta0, is the three-parameter (e, mu, beta0) rule of Foerster, S. F., Louge, M. Y., Chang, H. &
 * Allia, K. (1994), "Measurements of the collision properties of small spheres", Phys. Fluids 6:1108
 * (recalled); it keeps the result continuous where the two regimes meet. Because the
 * contact point lies on the normal through the centre, the normal and tangential impulses do not couple:
 * Newton's, Poisson's and Stronge's energetic restitution agree here (Stronge, W. J. 2000, Impact
 * Mechanics, ch. 4; recalled), and the energy never grows for e, e_t <= 1. Both impulses act at the
 * contact point, so the angular momentum about it, I w + m r n x v, is the same before and after.
 *
 * Roll-out. Sliding: dv/dt = -mu g u^, dw/dt = (mu g / (alpha r)) n x u^, so du/dt = -mu g (1 + alpha) u^ /
 * alpha: u^ stays fixed and the slip stops after t_s = alpha |u| / ((1 + alpha) mu g); with no spin
 * v_roll = v0 / (1 + alpha) = 5/7 v0 for a solid sphere (e.g. Beer, F. P. & Johnston, E. R., Vector
 * Mechanics for Engineers: Dynamics, the sample problem of a sphere projected on a rough floor; recalled).
 * Rolling resistance is left out while the ball slides (sliding friction dominates; the 5/7 law assumes it).
 * Rolling: a constant deceleration mu_r g against the motion, so d = v^2 / (2 mu_r g) and t = v / (mu_r g).
 * mu_r is defined here by that deceleration. A constant coefficient of rolling friction describes a ball
 * rolling to a stop on grass ("Rolling to a stop down an inclined golf green", Phys. Teach. 63(1):29),
 * and Penner, A. R. (2002), "The run of a golf ball", Can. J. Phys. 80:931, ends the run of a golf ball
 * with a rolling resistance (recalled); sources that define the coefficient by a force or a torque need
 * converting to this deceleration. Air drag during the roll is neglected.
 */
#include <math.h>

#include "dragarc/bounce.h"
#include "dragarc/projectile.h"

static double dot3(const double a[3], const double b[3]) { return a[0] * b[0] + a[1] * b[1] + a[2] * b[2]; }

static int finite3(const double a[3]) { return isfinite(a[0]) && isfinite(a[1]) && isfinite(a[2]); }

/* Slip velocity of the contact point: u = v_t - r w x z^ = (v_x - r w_y, v_y + r w_x, 0). */
static void contact_slip(double radius, const double v[3], const double w[3], double u[3])
{
    u[0] = v[0] - radius * w[1];
    u[1] = v[1] + radius * w[0];
    u[2] = 0.0;
}

/* Kinetic energy per unit mass, translation and rotation: v^2/2 + alpha r^2 w^2/2 (J/kg). */
static double energy(const dragarc_sphere *s, const double v[3], const double w[3])
{
    return 0.5 * dot3(v, v) + 0.5 * s->inertia_factor * s->radius * s->radius * dot3(w, w);
}

int dragarc_surface_check(const dragarc_surface *s, dragarc_error *err)
{
    if (!(s->restitution >= 0.0 && s->restitution <= 1.0))
        return dragarc_error_set(err, DRAGARC_EINVAL, "restitution", "must be between 0 and 1 (got %g)", s->restitution);
    if (!(s->friction >= 0.0 && isfinite(s->friction)))
        return dragarc_error_set(err, DRAGARC_EINVAL, "friction", "must be 0 or more (got %g)", s->friction);
    if (!(s->rolling_resistance > 0.0 && isfinite(s->rolling_resistance)))
        return dragarc_error_set(err, DRAGARC_EINVAL, "rolling_resistance",
                                 "must be above 0, or a rolling ball never stops (got %g)", s->rolling_resistance);
    if (!(s->tangential_restitution >= 0.0 && s->tangential_restitution <= 1.0))
        return dragarc_error_set(err, DRAGARC_EINVAL, "tangential_restitution", "must be between 0 and 1 (got %g)",
                                 s->tangential_restitution);
    return DRAGARC_OK;
}

int dragarc_sphere_check(const dragarc_sphere *s, dragarc_error *err)
{
    if (!(s->radius > 0.0 && isfinite(s->radius)))
        return dragarc_error_set(err, DRAGARC_EINVAL, "radius", "must be above 0 m (got %g)", s->radius);
    /* a shell, all mass at r, has the largest I of any sphere whose density depends only on the radius */
    if (!(s->inertia_factor > 0.0 && s->inertia_factor <= DRAGARC_INERTIA_FACTOR_MAX))
        return dragarc_error_set(err, DRAGARC_EINVAL, "inertia_factor",
                                 "must be above 0 and at most 0.667 (2/3, a thin shell) (got %g)", s->inertia_factor);
    return DRAGARC_OK;
}

int dragarc_bounce_limits_check(const dragarc_bounce_limits *l, dragarc_error *err)
{
    if (!(l->min_height >= 0.0 && isfinite(l->min_height)))
        return dragarc_error_set(err, DRAGARC_EINVAL, "min_height", "must be 0 m or more (got %g)", l->min_height);
    if (l->max_bounces < 1)
        return dragarc_error_set(err, DRAGARC_EINVAL, "max_bounces", "must be 1 or more (got %d)", l->max_bounces);
    return DRAGARC_OK;
}

static int check_motion(const dragarc_surface *surface, const dragarc_sphere *sphere, const double v[3],
                        const double w[3], dragarc_error *err)
{
    int rc = dragarc_surface_check(surface, err);
    if (rc == DRAGARC_OK)
        rc = dragarc_sphere_check(sphere, err);
    if (rc != DRAGARC_OK)
        return rc;
    if (!finite3(v))
        return dragarc_error_set(err, DRAGARC_EINVAL, "velocity", "must be finite (got %g, %g, %g m/s)", v[0], v[1], v[2]);
    if (!finite3(w))
        return dragarc_error_set(err, DRAGARC_EINVAL, "spin", "must be finite (got %g, %g, %g rad/s)", w[0], w[1], w[2]);
    return DRAGARC_OK;
}

int dragarc_bounce_impact(const dragarc_surface *surface, const dragarc_sphere *sphere, const double velocity[3],
                          const double spin[3], dragarc_bounce *out, dragarc_error *err)
{
    int rc = check_motion(surface, sphere, velocity, spin, err);
    if (rc != DRAGARC_OK)
        return rc;
    if (!(velocity[2] < 0.0))
        return dragarc_error_set(err, DRAGARC_EINVAL, "velocity",
                                 "must point into the ground for an impact (vertical component %g m/s, not below 0)",
                                 velocity[2]);
    const double r = sphere->radius, alpha = sphere->inertia_factor;
    double u[3];
    contact_slip(r, velocity, spin, u);
    double slip = hypot(u[0], u[1]);

    /* Tangential impulse per unit mass along -u^: what stops the slip and sends it back at e_t, or
     * all that sliding friction can give over the whole impact, whichever is smaller. */
    double grip = alpha * (1.0 + surface->tangential_restitution) * slip / (1.0 + alpha);
    double slide = surface->friction * (1.0 + surface->restitution) * -velocity[2];
    double k = grip <= slide ? grip : slide;
    out->regime = grip <= slide ? DRAGARC_BOUNCE_GRIPS : DRAGARC_BOUNCE_SLIDES;
    double jt[3] = {0.0, 0.0, 0.0}; /* J_t / m, m/s */
    if (slip > 0.0) {
        jt[0] = -k * u[0] / slip;
        jt[1] = -k * u[1] / slip;
    }

    out->velocity[0] = velocity[0] + jt[0];
    out->velocity[1] = velocity[1] + jt[1];
    out->velocity[2] = -surface->restitution * velocity[2];
    /* I dw = (-r z^) x J_t, so dw = -(z^ x J_t/m) / (alpha r) with z^ x (a, b, 0) = (-b, a, 0). */
    out->spin[0] = spin[0] + jt[1] / (alpha * r);
    out->spin[1] = spin[1] - jt[0] / (alpha * r);
    out->spin[2] = spin[2];

    for (int i = 0; i < 3; i++)
        out->slip_before[i] = u[i];
    contact_slip(r, out->velocity, out->spin, out->slip_after);
    out->energy_before = energy(sphere, velocity, spin);
    out->energy_after = energy(sphere, out->velocity, out->spin);
    return DRAGARC_OK;
}

int dragarc_bounce_land(const dragarc_surface *surface, const dragarc_sphere *sphere,
                        const dragarc_bounce_limits *limits, double gravity, int count, const double velocity[3],
                        const double spin[3], dragarc_bounce *out, dragarc_bounce_next *next, dragarc_error *err)
{
    int rc = dragarc_bounce_limits_check(limits, err);
    if (rc != DRAGARC_OK)
        return rc;
    if (!(gravity > 0.0 && isfinite(gravity)))
        return dragarc_error_set(err, DRAGARC_EINVAL, "gravity", "must be above 0 m/s^2 (got %g)", gravity);
    if (count < 1)
        return dragarc_error_set(err, DRAGARC_EINVAL, "count", "the first landing is 1 (got %d)", count);
    rc = dragarc_bounce_impact(surface, sphere, velocity, spin, out, err);
    if (rc != DRAGARC_OK)
        return rc;
    /* Compared as speeds, v_z'^2 < 2 g h_min, so that a threshold of 0 still rolls a ball that stays down. */
    double vz = out->velocity[2];
    int low = vz * vz < 2.0 * gravity * limits->min_height || !(vz > 0.0);
    *next = low || count >= limits->max_bounces ? DRAGARC_BOUNCE_ROLL : DRAGARC_BOUNCE_AGAIN;
    return DRAGARC_OK;
}

int dragarc_bounce_roll(const dragarc_surface *surface, const dragarc_sphere *sphere, double gravity,
                        const double velocity[3], const double spin[3], dragarc_roll *out, dragarc_error *err)
{
    int rc = check_motion(surface, sphere, velocity, spin, err);
    if (rc != DRAGARC_OK)
        return rc;
    if (!(gravity > 0.0 && isfinite(gravity)))
        return dragarc_error_set(err, DRAGARC_EINVAL, "gravity", "must be above 0 m/s^2 (got %g)", gravity);
    const double r = sphere->radius, alpha = sphere->inertia_factor;
    double u[3];
    contact_slip(r, velocity, spin, u);
    double slip = hypot(u[0], u[1]);
    /* A slip at round-off of the speeds involved (a ball that left a gripping bounce rolling) is none. */
    double scale = hypot(velocity[0], velocity[1]) + r * hypot(spin[0], spin[1]);
    double v[2] = {velocity[0], velocity[1]};
    out->slide_time = 0.0;
    out->slide_offset[0] = out->slide_offset[1] = 0.0;
    if (slip > 1e-12 * scale) {
        if (!(surface->friction > 0.0))
            return dragarc_error_set(err, DRAGARC_EINVAL, "friction",
                                     "must be above 0 for a ball that lands sliding (slip %g m/s): it would never roll",
                                     slip);
        double a = surface->friction * gravity; /* m/s^2, along -u^ */
        double t = alpha * slip / ((1.0 + alpha) * a);
        double uh[2] = {u[0] / slip, u[1] / slip};
        out->slide_time = t;
        for (int i = 0; i < 2; i++) {
            out->slide_offset[i] = v[i] * t - 0.5 * a * t * t * uh[i];
            v[i] -= a * t * uh[i];
        }
    }
    double speed = hypot(v[0], v[1]);
    double decel = surface->rolling_resistance * gravity;
    out->roll_speed = speed;
    out->direction[0] = speed > 0.0 ? v[0] / speed : 0.0;
    out->direction[1] = speed > 0.0 ? v[1] / speed : 0.0;
    out->roll_distance = speed * speed / (2.0 * decel);
    out->roll_time = speed / decel;
    out->time = out->slide_time + out->roll_time;
    for (int i = 0; i < 2; i++)
        out->offset[i] = out->slide_offset[i] + out->roll_distance * out->direction[i];
    return DRAGARC_OK;
}
