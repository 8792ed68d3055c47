/* test_bounce.c: a rigid sphere bouncing on and rolling along flat ground (src/physics/bounce.c).
 * SPDX-License-Identifier: GPL-3.0-or-later
 *
 * The model is the elementary rigid-ball bounce of Brody (1984, Phys. Teach. 22:494) and Cross (2002,
 * "Grip-slip behavior of a bouncing ball", Am. J. Phys. 70:1093, section I): normal restitution e, and
 * Coulomb friction that either acts throughout the impact or stops the contact point's slip (the ball leaves
 * rolling). Every expected value below is a closed form of that model, derived in bounce.c from impulse and
 * momentum, so the tolerances are round-off: each check evaluates a few dozen floating-point operations on
 * values of order 1 to 1000, and a relative error of 1e-14 (about 50 ulp) or an absolute one scaled the
 * same way is far above what they can accumulate and far below any modelling error worth catching.
 */
#include "check.h"
#include "helpers.h"
#include "dragarc/bounce.h"

static dragarc_surface surface(double e, double mu, double mu_r, double e_t)
{
    dragarc_surface s = {.restitution = e, .friction = mu, .rolling_resistance = mu_r, .tangential_restitution = e_t};
    return s;
}

static dragarc_sphere sphere(double radius, double alpha)
{
    dragarc_sphere b = {.radius = radius, .inertia_factor = alpha};
    return b;
}

/* Angular momentum per unit mass about the contact point, alpha r^2 w + r z^ x v. */
static void contact_momentum(const dragarc_sphere *b, const double v[3], const double w[3], double L[3])
{
    double k = b->inertia_factor * b->radius * b->radius;
    L[0] = k * w[0] - b->radius * v[1];
    L[1] = k * w[1] + b->radius * v[0];
    L[2] = k * w[2];
}

static void rotate_z(double phi, const double a[3], double out[3])
{
    out[0] = cos(phi) * a[0] - sin(phi) * a[1];
    out[1] = sin(phi) * a[0] + cos(phi) * a[1];
    out[2] = a[2];
}

/* Elementary kinematics (exact): a ball dropped from h lands at sqrt(2 g h); rising at e sqrt(2 g h) it
 * climbs, in vacuum, to e^2 h. A vertical impact without spin has no slip, so no friction acts. */
TEST(dropped_ball_rebounds_at_e_times_its_speed_to_e_squared_of_its_height)
{
    const double g = 9.81, h = 2.0;
    const double es[] = {0.0, 0.3, 0.75, 1.0};
    dragarc_sphere b = sphere(0.11, DRAGARC_INERTIA_SHELL);
    for (size_t i = 0; i < sizeof es / sizeof es[0]; i++) {
        dragarc_surface s = surface(es[i], 0.6, 0.05, 0.0);
        double v[3] = {0.0, 0.0, -sqrt(2.0 * g * h)}, w[3] = {0.0, 0.0, 0.0};
        dragarc_bounce out;
        CHECK(dragarc_bounce_impact(&s, &b, v, w, &out, NULL) == DRAGARC_OK);
        CHECK_ABS(out.velocity[2], es[i] * sqrt(2.0 * g * h), 1e-15 * sqrt(2.0 * g * h));
        CHECK_ABS(out.velocity[2] * out.velocity[2] / (2.0 * g), es[i] * es[i] * h, 1e-14 * h);
        CHECK(out.velocity[0] == 0.0 && out.velocity[1] == 0.0);
        CHECK(out.spin[0] == 0.0 && out.spin[1] == 0.0 && out.spin[2] == 0.0);
        CHECK_ABS(out.energy_after, es[i] * es[i] * out.energy_before, 1e-14 * out.energy_before);
    }
}

/* Brody 1984; Cross 2002, section I: with enough friction the contact point stops and the ball leaves
 * rolling. Angular momentum about the contact point, m r v_x = m r v_x' + alpha m r^2 w_y' with
 * w_y' = v_x'/r, gives v_x' = v_x / (1 + alpha): 5/7 for a solid sphere, 3/5 for a thin shell; the spin is
 * forward (about +y for motion along +x: the top of the ball moves ahead). */
TEST(oblique_impact_without_spin_on_a_rough_surface_leaves_rolling_at_one_over_one_plus_alpha)
{
    const double r = 0.11;
    const double alphas[] = {DRAGARC_INERTIA_SOLID, DRAGARC_INERTIA_SHELL};
    const double ratio[] = {5.0 / 7.0, 3.0 / 5.0};
    dragarc_surface s = surface(0.5, 1.0, 0.05, 0.0);
    for (int i = 0; i < 2; i++) {
        dragarc_sphere b = sphere(r, alphas[i]);
        double v[3] = {5.0, 0.0, -5.0}, w[3] = {0.0, 0.0, 0.0};
        dragarc_bounce out;
        CHECK(dragarc_bounce_impact(&s, &b, v, w, &out, NULL) == DRAGARC_OK);
        CHECK(out.regime == DRAGARC_BOUNCE_GRIPS);
        CHECK_ABS(out.velocity[0], ratio[i] * 5.0, 1e-14 * 5.0);
        CHECK_ABS(out.velocity[1], 0.0, 0.0);
        CHECK_ABS(out.velocity[2], 2.5, 1e-15 * 2.5);
        CHECK_ABS(out.spin[1], ratio[i] * 5.0 / r, 1e-14 * 5.0 / r);
        CHECK_ABS(out.spin[0], 0.0, 0.0);
        CHECK_ABS(hypot(out.slip_after[0], out.slip_after[1]), 0.0, 1e-14 * 5.0);

        /* the same in an arbitrary horizontal direction: v_t' = v_t / (1 + alpha), w' = (z^ x v') / r */
        double v3[3] = {3.0, -4.0, -6.0};
        CHECK(dragarc_bounce_impact(&s, &b, v3, w, &out, NULL) == DRAGARC_OK);
        CHECK_ABS(out.velocity[0], ratio[i] * 3.0, 1e-14 * 5.0);
        CHECK_ABS(out.velocity[1], ratio[i] * -4.0, 1e-14 * 5.0);
        CHECK_ABS(out.spin[0], ratio[i] * 4.0 / r, 1e-14 * 5.0 / r);
        CHECK_ABS(out.spin[1], ratio[i] * 3.0 / r, 1e-14 * 5.0 / r);
    }
}

/* Brody 1984; Cross 2002, section I: at grazing incidence on a slippery surface the ball slides throughout,
 * the friction impulse is mu times the normal impulse m (1 + e) |v_z|: dv_x = -mu (1 + e) |v_z|, and the same
 * impulse at lever arm r spins the ball forward by dw_y = mu (1 + e) |v_z| / (alpha r). */
TEST(oblique_impact_on_a_slippery_surface_slides_throughout)
{
    const double r = 0.0335, mu = 0.05, e = 0.6;
    dragarc_surface s = surface(e, mu, 0.05, 0.0);
    dragarc_sphere b = sphere(r, DRAGARC_INERTIA_SOLID);
    double v[3] = {10.0, 0.0, -3.0}, w[3] = {0.0, 0.0, 0.0};
    dragarc_bounce out;
    CHECK(dragarc_bounce_impact(&s, &b, v, w, &out, NULL) == DRAGARC_OK);
    CHECK(out.regime == DRAGARC_BOUNCE_SLIDES);
    double dv = mu * (1.0 + e) * 3.0; /* 0.24 m/s */
    CHECK_ABS(out.velocity[0], 10.0 - dv, 1e-14 * 10.0);
    CHECK_ABS(out.velocity[2], e * 3.0, 1e-15 * 3.0);
    CHECK_ABS(out.spin[1], dv / (DRAGARC_INERTIA_SOLID * r), 1e-14 * dv / (DRAGARC_INERTIA_SOLID * r));
    /* still sliding forward at lift-off: u' = 10 - dv (1 + 1/alpha) = 9.16 m/s */
    CHECK_ABS(out.slip_after[0], 10.0 - dv * (1.0 + 1.0 / DRAGARC_INERTIA_SOLID), 1e-13);
}

/* Backspin w_y = -W on a ball moving along +x. Gripping: angular momentum about the contact point gives
 * v_x' = (v_x - alpha r W) / (1 + alpha), for a solid sphere (5 v_x - 2 r W) / 7 (the form in Cross 2002,
 * recalled), which is backward when alpha r W > v_x. Sliding: v_x' = v_x - mu (1 + e) |v_z|, backward when
 * friction takes more than v_x before the slip can stop. */
TEST(backspin_reverses_or_slows_the_ball_as_the_closed_forms_say)
{
    const double r = 0.0214, W = 500.0, a = DRAGARC_INERTIA_SOLID;
    dragarc_sphere b = sphere(r, a);
    double w[3] = {0.0, -W, 0.0};
    dragarc_bounce out;

    dragarc_surface rough = surface(0.5, 0.5, 0.05, 0.0);
    double v[3] = {2.0, 0.0, -10.0};
    CHECK(dragarc_bounce_impact(&rough, &b, v, w, &out, NULL) == DRAGARC_OK);
    CHECK(out.regime == DRAGARC_BOUNCE_GRIPS);
    double vx = (2.0 - a * r * W) / (1.0 + a); /* -1.6286 m/s: it comes back */
    CHECK(out.velocity[0] < 0.0);
    CHECK_ABS(out.velocity[0], vx, 1e-14 * 5.0);
    CHECK_ABS(out.spin[1], vx / r, 1e-14 * W);

    dragarc_surface slick = surface(0.5, 0.1, 0.05, 0.0);
    CHECK(dragarc_bounce_impact(&slick, &b, v, w, &out, NULL) == DRAGARC_OK);
    CHECK(out.regime == DRAGARC_BOUNCE_SLIDES);
    double dv = 0.1 * 1.5 * 10.0; /* 1.5 m/s, short of the 3.63 m/s that would stop the slip */
    CHECK(out.velocity[0] > 0.0);
    CHECK_ABS(out.velocity[0], 2.0 - dv, 1e-14 * 5.0);
    CHECK_ABS(out.spin[1], -W + dv / (a * r), 1e-14 * W);

    v[0] = 1.0; /* friction takes 1.5 m/s from 1 m/s while the slip is still forward: it comes back sliding */
    CHECK(dragarc_bounce_impact(&slick, &b, v, w, &out, NULL) == DRAGARC_OK);
    CHECK(out.regime == DRAGARC_BOUNCE_SLIDES);
    CHECK(out.velocity[0] < 0.0);
    CHECK_ABS(out.velocity[0], 1.0 - dv, 1e-14 * 5.0);
}

/* The two regimes meet where friction just stops the slip, mu* = alpha |u| / ((1 + alpha)(1 + e)|v_z|): the
 * model is continuous there, so the results on either side differ by about (mu - mu*) (1 + e) |v_z|. */
TEST(sliding_and_gripping_meet_continuously)
{
    dragarc_sphere b = sphere(0.02, DRAGARC_INERTIA_SOLID);
    double v[3] = {6.0, -2.0, -4.0}, w[3] = {30.0, 80.0, 5.0};
    double ux = 6.0 - 0.02 * 80.0, uy = -2.0 + 0.02 * 30.0;
    double mu_star = 0.4 * hypot(ux, uy) / (1.4 * 1.5 * 4.0);
    dragarc_surface lo = surface(0.5, mu_star * (1.0 - 1e-9), 0.05, 0.0);
    dragarc_surface hi = surface(0.5, mu_star * (1.0 + 1e-9), 0.05, 0.0);
    dragarc_bounce a, c;
    CHECK(dragarc_bounce_impact(&lo, &b, v, w, &a, NULL) == DRAGARC_OK);
    CHECK(dragarc_bounce_impact(&hi, &b, v, w, &c, NULL) == DRAGARC_OK);
    CHECK(a.regime == DRAGARC_BOUNCE_SLIDES && c.regime == DRAGARC_BOUNCE_GRIPS);
    for (int i = 0; i < 3; i++) {
        CHECK_ABS(a.velocity[i], c.velocity[i], 1e-8);
        CHECK_ABS(a.spin[i] * b.radius, c.spin[i] * b.radius, 1e-8);
    }
}

/* Isotropy of a horizontal plane: turning the whole problem about z turns the result with it; and a mirror
 * y -> -y turns velocities (vx, -vy, vz) and spins, axial vectors, (-wx, wy, -wz). Exact symmetries of the
 * law; the rotation is checked to 1e-12 m/s (values up to a few hundred, times 1e-14), the mirror bit for
 * bit (the code only negates). */
TEST(the_bounce_turns_with_the_frame_and_mirrors)
{
    dragarc_sphere b = sphere(0.0214, DRAGARC_INERTIA_SOLID);
    dragarc_surface surfaces[] = {surface(0.6, 0.05, 0.05, 0.0), surface(0.4, 0.8, 0.05, 0.0),
                                  surface(0.8, 0.8, 0.05, 0.5)};
    double v[3] = {3.0, 1.0, -4.0}, w[3] = {20.0, -350.0, 120.0};
    const double phis[] = {0.7, 2.0 * PI / 3.0, -2.5};
    for (size_t k = 0; k < 3; k++) {
        dragarc_bounce ref, turned, mirrored;
        CHECK(dragarc_bounce_impact(&surfaces[k], &b, v, w, &ref, NULL) == DRAGARC_OK);
        for (size_t j = 0; j < 3; j++) {
            double vr[3], wr[3], want_v[3], want_w[3];
            rotate_z(phis[j], v, vr);
            rotate_z(phis[j], w, wr);
            CHECK(dragarc_bounce_impact(&surfaces[k], &b, vr, wr, &turned, NULL) == DRAGARC_OK);
            rotate_z(phis[j], ref.velocity, want_v);
            rotate_z(phis[j], ref.spin, want_w);
            CHECK(turned.regime == ref.regime);
            for (int i = 0; i < 3; i++) {
                CHECK_ABS(turned.velocity[i], want_v[i], 1e-12);
                CHECK_ABS(turned.spin[i], want_w[i], 1e-12);
            }
        }
        double vm[3] = {v[0], -v[1], v[2]}, wm[3] = {-w[0], w[1], -w[2]};
        CHECK(dragarc_bounce_impact(&surfaces[k], &b, vm, wm, &mirrored, NULL) == DRAGARC_OK);
        CHECK(mirrored.velocity[0] == ref.velocity[0] && mirrored.velocity[1] == -ref.velocity[1] &&
              mirrored.velocity[2] == ref.velocity[2]);
        CHECK(mirrored.spin[0] == -ref.spin[0] && mirrored.spin[1] == ref.spin[1] && mirrored.spin[2] == -ref.spin[2]);
    }
}

/* Over a grid of surfaces, spheres and incoming states: the kinetic plus rotational energy never grows
 * (the friction impulse only shortens the slip or reverses it by e_t <= 1, and the normal part loses
 * 1 - e^2); the angular momentum about the contact point is the same after as before (both impulses act
 * there: elementary rigid-body mechanics); and with e = e_t = 1 a gripping bounce keeps all its energy (the
 * "ultraelastic rough ball" of Garwin, R. L. 1969, Am. J. Phys. 37:88; recalled). Tolerances: energies
 * to 1e-13 of the incoming energy and momenta to 1e-13 of their scale (round-off, see the file head). */
TEST(energy_never_grows_and_contact_point_angular_momentum_is_kept)
{
    const double es[] = {0.0, 0.5, 1.0}, ets[] = {0.0, 0.5, 1.0}, mus[] = {0.0, 0.05, 0.3, 2.0};
    const double alphas[] = {0.25, DRAGARC_INERTIA_SOLID, DRAGARC_INERTIA_SHELL};
    const double angles[] = {5.0, 30.0, 60.0, 89.0}, wys[] = {-600.0, 0.0, 600.0}, wxs[] = {-300.0, 0.0, 300.0};
    const double wzs[] = {0.0, 100.0};
    const double speed = 20.0, r = 0.02;
    int n = 0, grips = 0, slides = 0, worst_growth_ok = 1, momentum_ok = 1, elastic_ok = 1, elastic_cases = 0;
    double worst = -1.0;
    for (size_t ie = 0; ie < 3; ie++)
        for (size_t it = 0; it < 3; it++)
            for (size_t im = 0; im < 4; im++)
                for (size_t ia = 0; ia < 3; ia++)
                    for (size_t ig = 0; ig < 4; ig++)
                        for (size_t iy = 0; iy < 3; iy++)
                            for (size_t ix = 0; ix < 3; ix++)
                                for (size_t iz = 0; iz < 2; iz++) {
                                    dragarc_surface s = surface(es[ie], mus[im], 0.05, ets[it]);
                                    dragarc_sphere b = sphere(r, alphas[ia]);
                                    double th = angles[ig] * DEG, az = 0.3 * (double)(ig + iy);
                                    double v[3] = {speed * cos(th) * cos(az), speed * cos(th) * sin(az),
                                                   -speed * sin(th)};
                                    double w[3] = {wxs[ix], wys[iy], wzs[iz]};
                                    dragarc_bounce out;
                                    if (dragarc_bounce_impact(&s, &b, v, w, &out, NULL) != DRAGARC_OK) {
                                        CHECK(0);
                                        continue;
                                    }
                                    n++;
                                    if (out.regime == DRAGARC_BOUNCE_GRIPS)
                                        grips++;
                                    else
                                        slides++;
                                    double e0 = out.energy_before;
                                    double growth = (out.energy_after - e0) / e0;
                                    if (growth > worst)
                                        worst = growth;
                                    if (!(out.energy_after <= e0 * (1.0 + 1e-13)))
                                        worst_growth_ok = 0;
                                    double L0[3], L1[3];
                                    contact_momentum(&b, v, w, L0);
                                    contact_momentum(&b, out.velocity, out.spin, L1);
                                    double scale = r * speed + alphas[ia] * r * r * 700.0;
                                    for (int i = 0; i < 3; i++)
                                        if (!(fabs(L1[i] - L0[i]) <= 1e-13 * scale))
                                            momentum_ok = 0;
                                    if (es[ie] == 1.0 && ets[it] == 1.0 && out.regime == DRAGARC_BOUNCE_GRIPS) {
                                        elastic_cases++;
                                        if (!(fabs(out.energy_after - e0) <= 1e-13 * e0))
                                            elastic_ok = 0;
                                    }
                                }
    printf("  %d impacts (%d gripping, %d sliding); largest relative energy change %.3g; %d elastic grips\n", n,
           grips, slides, worst, elastic_cases);
    CHECK(n == 7776);
    CHECK(grips > 1000 && slides > 1000);
    CHECK(worst_growth_ok);
    CHECK(momentum_ok);
    CHECK(elastic_cases > 0 && elastic_ok);
}

/* Constant deceleration a = mu_r g (the law of bounce.c): a ball rolling at v stops after v^2 / (2 a) and
 * v / a, along its direction of motion. */
TEST(a_rolling_ball_stops_after_v_squared_over_two_mu_r_g)
{
    const double g = 9.81, mu_r = 0.05, r = 0.0214;
    dragarc_surface s = surface(0.4, 0.4, mu_r, 0.0);
    dragarc_sphere b = sphere(r, DRAGARC_INERTIA_SOLID);
    double v[3] = {3.0, 4.0, 0.0}, w[3] = {-4.0 / r, 3.0 / r, 0.0}; /* rolling: w = (z^ x v) / r */
    dragarc_roll out;
    CHECK(dragarc_bounce_roll(&s, &b, g, v, w, &out, NULL) == DRAGARC_OK);
    double d = 25.0 / (2.0 * mu_r * g);
    CHECK(out.slide_time == 0.0);
    CHECK_ABS(out.roll_speed, 5.0, 1e-14 * 5.0);
    CHECK_ABS(out.roll_distance, d, 1e-14 * d);
    CHECK_ABS(out.roll_time, 5.0 / (mu_r * g), 1e-14 * 10.0);
    CHECK_ABS(out.time, out.roll_time, 0.0);
    CHECK_ABS(out.offset[0], 0.6 * d, 1e-14 * d);
    CHECK_ABS(out.offset[1], 0.8 * d, 1e-14 * d);

    double still[3] = {0.0, 0.0, 0.0};
    CHECK(dragarc_bounce_roll(&s, &b, g, still, still, &out, NULL) == DRAGARC_OK);
    CHECK(out.roll_distance == 0.0 && out.time == 0.0 && out.offset[0] == 0.0 && out.offset[1] == 0.0);
}

/* A sphere set sliding without spin on a floor with friction mu: a = -mu g, angular acceleration
 * mu g / (alpha r), rolling when v = r w, after t = alpha v0 / ((1 + alpha) mu g), at v = v0 / (1 + alpha)
 * (5/7 v0 for a solid sphere, the textbook result, e.g. Beer & Johnston, Vector Mechanics for Engineers:
 * Dynamics, recalled), having slid v0 t - mu g t^2 / 2 (12/49 v0^2 / (mu g) for a solid sphere). */
TEST(a_sliding_ball_rolls_at_five_sevenths_of_its_speed)
{
    const double g = 9.81, mu = 0.3, mu_r = 0.05, r = 0.0214, v0 = 4.0;
    dragarc_surface s = surface(0.4, mu, mu_r, 0.0);
    dragarc_sphere solid = sphere(r, DRAGARC_INERTIA_SOLID), shell = sphere(r, DRAGARC_INERTIA_SHELL);
    double v[3] = {0.6 * v0, -0.8 * v0, -0.01}, w[3] = {0.0, 0.0, 0.0}; /* v_z is ignored */
    dragarc_roll out;
    CHECK(dragarc_bounce_roll(&s, &solid, g, v, w, &out, NULL) == DRAGARC_OK);
    CHECK_ABS(out.roll_speed, 5.0 / 7.0 * v0, 1e-14 * v0);
    CHECK_ABS(out.slide_time, 2.0 * v0 / (7.0 * mu * g), 1e-14);
    double slid = 12.0 / 49.0 * v0 * v0 / (mu * g);
    CHECK_ABS(hypot(out.slide_offset[0], out.slide_offset[1]), slid, 1e-14 * slid);
    double rolled = (25.0 / 49.0) * v0 * v0 / (2.0 * mu_r * g);
    CHECK_ABS(out.roll_distance, rolled, 1e-14 * rolled);
    CHECK_ABS(out.offset[0], 0.6 * (slid + rolled), 1e-14 * rolled);
    CHECK_ABS(out.offset[1], -0.8 * (slid + rolled), 1e-14 * rolled);
    CHECK_ABS(out.direction[0], 0.6, 1e-15);

    CHECK(dragarc_bounce_roll(&s, &shell, g, v, w, &out, NULL) == DRAGARC_OK);
    CHECK_ABS(out.roll_speed, 3.0 / 5.0 * v0, 1e-14 * v0);
    CHECK_ABS(out.slide_time, 2.0 * v0 / (5.0 * mu * g), 1e-14);

    /* enough backspin brings it back: v_roll = (v0 - alpha r W) / (1 + alpha), here (1 - 2) / 1.4 = -5/7 m/s */
    double vb[3] = {1.0, 0.0, 0.0}, wb[3] = {0.0, -2.0 / (DRAGARC_INERTIA_SOLID * r), 0.0};
    CHECK(dragarc_bounce_roll(&s, &solid, g, vb, wb, &out, NULL) == DRAGARC_OK);
    CHECK_ABS(out.roll_speed, 5.0 / 7.0, 1e-14);
    CHECK_ABS(out.direction[0], -1.0, 1e-15);
}

/* A ball that left a gripping bounce rolls from the start: its slip is round-off, not sliding. */
TEST(a_ball_leaving_a_gripping_bounce_rolls_at_once)
{
    dragarc_surface s = surface(0.4, 0.8, 0.05, 0.0);
    dragarc_sphere b = sphere(0.0214, DRAGARC_INERTIA_SOLID);
    double v[3] = {7.3, -2.9, -3.0}, w[3] = {40.0, 150.0, -20.0};
    dragarc_bounce hit;
    dragarc_roll out;
    CHECK(dragarc_bounce_impact(&s, &b, v, w, &hit, NULL) == DRAGARC_OK);
    CHECK(hit.regime == DRAGARC_BOUNCE_GRIPS);
    CHECK(dragarc_bounce_roll(&s, &b, 9.81, hit.velocity, hit.spin, &out, NULL) == DRAGARC_OK);
    CHECK(out.slide_time == 0.0);
    CHECK_ABS(out.roll_speed, hypot(hit.velocity[0], hit.velocity[1]), 0.0);
}

/* The driver's decision: fly again while the vacuum rebound height v_z'^2 / 2g reaches min_height and the
 * count is below max_bounces (a drop from 1 m with e = 0.5 rebounds to 0.25 m). */
TEST(landing_says_bounce_again_or_roll)
{
    const double g = 9.81;
    dragarc_surface s = surface(0.5, 0.4, 0.05, 0.0);
    dragarc_sphere b = sphere(0.0214, DRAGARC_INERTIA_SOLID);
    double v[3] = {1.0, 0.0, -sqrt(2.0 * g * 1.0)}, w[3] = {0.0, 0.0, 0.0};
    dragarc_bounce out;
    dragarc_bounce_next next;
    dragarc_bounce_limits lim = {.min_height = 0.2, .max_bounces = 5};
    CHECK(dragarc_bounce_land(&s, &b, &lim, g, 1, v, w, &out, &next, NULL) == DRAGARC_OK);
    CHECK(next == DRAGARC_BOUNCE_AGAIN);
    lim.min_height = 0.3;
    CHECK(dragarc_bounce_land(&s, &b, &lim, g, 1, v, w, &out, &next, NULL) == DRAGARC_OK);
    CHECK(next == DRAGARC_BOUNCE_ROLL);
    lim.min_height = 0.2;
    CHECK(dragarc_bounce_land(&s, &b, &lim, g, 5, v, w, &out, &next, NULL) == DRAGARC_OK);
    CHECK(next == DRAGARC_BOUNCE_ROLL);
    dragarc_surface dead = surface(0.0, 0.4, 0.05, 0.0);
    lim.min_height = 0.0;
    CHECK(dragarc_bounce_land(&dead, &b, &lim, g, 1, v, w, &out, &next, NULL) == DRAGARC_OK);
    CHECK(next == DRAGARC_BOUNCE_ROLL);
}

#define CHECK_REFUSED(call, want_field, want_text)                                                             \
    do {                                                                                                       \
        dragarc_error e_ = {0, "", ""};                                                                        \
        int rc_ = (call);                                                                                      \
        CHECK(rc_ == DRAGARC_EINVAL);                                                                          \
        CHECK(strcmp(e_.field, want_field) == 0);                                                              \
        CHECK(strstr(e_.message, want_text) != NULL);                                                          \
        if (strcmp(e_.field, want_field) != 0 || !strstr(e_.message, want_text))                               \
            printf("  got %s: %s\n", e_.field, e_.message);                                                    \
    } while (0)

TEST(every_surface_rule_names_its_field_and_value)
{
    dragarc_surface ok = surface(0.4, 0.4, 0.06, 0.0), s;
    CHECK(dragarc_surface_check(&ok, NULL) == DRAGARC_OK);
    s = surface(0.0, 0.0, 0.06, 1.0); /* the ends of each range are allowed */
    CHECK(dragarc_surface_check(&s, NULL) == DRAGARC_OK);
    s = surface(1.0, 3.0, 0.06, 0.0);
    CHECK(dragarc_surface_check(&s, NULL) == DRAGARC_OK);

    s = ok, s.restitution = 1.2;
    CHECK_REFUSED(dragarc_surface_check(&s, &e_), "restitution", "must be between 0 and 1 (got 1.2)");
    s = ok, s.restitution = -0.1;
    CHECK_REFUSED(dragarc_surface_check(&s, &e_), "restitution", "(got -0.1)");
    s = ok, s.restitution = NAN;
    CHECK_REFUSED(dragarc_surface_check(&s, &e_), "restitution", "between 0 and 1");
    s = ok, s.friction = -0.2;
    CHECK_REFUSED(dragarc_surface_check(&s, &e_), "friction", "must be 0 or more (got -0.2)");
    s = ok, s.friction = INFINITY;
    CHECK_REFUSED(dragarc_surface_check(&s, &e_), "friction", "(got inf)");
    s = ok, s.rolling_resistance = 0.0;
    CHECK_REFUSED(dragarc_surface_check(&s, &e_), "rolling_resistance", "must be above 0");
    s = ok, s.rolling_resistance = NAN;
    CHECK_REFUSED(dragarc_surface_check(&s, &e_), "rolling_resistance", "(got nan)");
    s = ok, s.tangential_restitution = 1.5;
    CHECK_REFUSED(dragarc_surface_check(&s, &e_), "tangential_restitution", "must be between 0 and 1 (got 1.5)");
    s = ok, s.tangential_restitution = -0.5;
    CHECK_REFUSED(dragarc_surface_check(&s, &e_), "tangential_restitution", "(got -0.5)");
}

TEST(every_sphere_state_and_limit_rule_names_its_field)
{
    dragarc_surface s = surface(0.4, 0.4, 0.06, 0.0);
    dragarc_sphere ok = sphere(0.0214, DRAGARC_INERTIA_SOLID), b;
    double v[3] = {3.0, 0.0, -2.0}, w[3] = {0.0, 0.0, 0.0};
    dragarc_bounce out;
    dragarc_roll roll;
    dragarc_bounce_next next;
    dragarc_bounce_limits lim = {.min_height = 0.005, .max_bounces = 10};

    CHECK(dragarc_sphere_check(&ok, NULL) == DRAGARC_OK);
    b = ok, b.radius = 0.0;
    CHECK_REFUSED(dragarc_sphere_check(&b, &e_), "radius", "must be above 0 m (got 0)");
    b = ok, b.radius = NAN;
    CHECK_REFUSED(dragarc_bounce_impact(&s, &b, v, w, &out, &e_), "radius", "(got nan)");
    b = ok, b.inertia_factor = 0.0;
    CHECK_REFUSED(dragarc_sphere_check(&b, &e_), "inertia_factor", "(got 0)");
    b = ok, b.inertia_factor = 0.7;
    CHECK_REFUSED(dragarc_bounce_roll(&s, &b, 9.81, v, w, &roll, &e_), "inertia_factor", "at most 0.667");
    b = ok, b.inertia_factor = DRAGARC_INERTIA_SHELL;
    CHECK(dragarc_sphere_check(&b, NULL) == DRAGARC_OK);

    double up[3] = {3.0, 0.0, 0.5}, level[3] = {3.0, 0.0, 0.0}, bad[3] = {NAN, 0.0, -1.0};
    CHECK_REFUSED(dragarc_bounce_impact(&s, &ok, up, w, &out, &e_), "velocity", "must point into the ground");
    CHECK_REFUSED(dragarc_bounce_impact(&s, &ok, level, w, &out, &e_), "velocity", "(vertical component 0 m/s");
    CHECK_REFUSED(dragarc_bounce_impact(&s, &ok, bad, w, &out, &e_), "velocity", "must be finite");
    double wbad[3] = {0.0, INFINITY, 0.0};
    CHECK_REFUSED(dragarc_bounce_impact(&s, &ok, v, wbad, &out, &e_), "spin", "must be finite");
    dragarc_surface sbad = s;
    sbad.restitution = 2.0;
    CHECK_REFUSED(dragarc_bounce_impact(&sbad, &ok, v, w, &out, &e_), "restitution", "(got 2)");

    CHECK_REFUSED(dragarc_bounce_land(&s, &ok, &lim, 0.0, 1, v, w, &out, &next, &e_), "gravity", "(got 0)");
    CHECK_REFUSED(dragarc_bounce_land(&s, &ok, &lim, 9.81, 0, v, w, &out, &next, &e_), "count", "(got 0)");
    lim.min_height = -1.0;
    CHECK_REFUSED(dragarc_bounce_land(&s, &ok, &lim, 9.81, 1, v, w, &out, &next, &e_), "min_height", "(got -1)");
    lim.min_height = 0.005, lim.max_bounces = 0;
    CHECK_REFUSED(dragarc_bounce_limits_check(&lim, &e_), "max_bounces", "must be 1 or more (got 0)");
    CHECK_REFUSED(dragarc_bounce_roll(&s, &ok, -9.81, v, w, &roll, &e_), "gravity", "(got -9.81)");

    /* no friction: a ball that lands sliding never rolls; one that lands rolling is fine */
    dragarc_surface ice = surface(0.4, 0.0, 0.06, 0.0);
    CHECK_REFUSED(dragarc_bounce_roll(&ice, &ok, 9.81, v, w, &roll, &e_), "friction", "never roll");
    double wroll[3] = {0.0, 3.0 / ok.radius, 0.0};
    CHECK(dragarc_bounce_roll(&ice, &ok, 9.81, v, wroll, &roll, NULL) == DRAGARC_OK);
}

int main(void)
{
    RUN(dropped_ball_rebounds_at_e_times_its_speed_to_e_squared_of_its_height);
    RUN(oblique_impact_without_spin_on_a_rough_surface_leaves_rolling_at_one_over_one_plus_alpha);
    RUN(oblique_impact_on_a_slippery_surface_slides_throughout);
    RUN(backspin_reverses_or_slows_the_ball_as_the_closed_forms_say);
    RUN(sliding_and_gripping_meet_continuously);
    RUN(the_bounce_turns_with_the_frame_and_mirrors);
    RUN(energy_never_grows_and_contact_point_angular_momentum_is_kept);
    RUN(a_rolling_ball_stops_after_v_squared_over_two_mu_r_g);
    RUN(a_sliding_ball_rolls_at_five_sevenths_of_its_speed);
    RUN(a_ball_leaving_a_gripping_bounce_rolls_at_once);
    RUN(landing_says_bounce_again_or_roll);
    RUN(every_surface_rule_names_its_field_and_value);
    RUN(every_sphere_state_and_limit_rule_names_its_field);
    return check_summary();
}
