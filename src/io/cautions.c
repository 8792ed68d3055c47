/* cautions.c: plain-language cautions for results a person could act on.
 * SPDX-License-Identifier: GPL-3.0-or-later
 */
#include "dragarc/cautions.h"
#include "dragarc/output.h"

static const char LIMITS[] =
    "Model limits: a point mass with drag, gravity, buoyancy and (only where a lift model is given) spin lift "
    "about a fixed axis, on a flat, non-rotating Earth; no gusts or turbulence, no tumbling. Treat results as "
    "estimates and check them against measurement before relying on them.";
static const char LIMITS_SPHERE[] =
    "Model limits: a point mass with drag, gravity, buoyancy and (only where a lift model is given) spin lift "
    "about a fixed axis, on a spherical, non-rotating Earth with inverse-square gravity; no gusts or turbulence, no "
    "tumbling. Treat results as estimates and check them against measurement before relying on them.";
static const char LIMITS_TURNING[] =
    "Model limits: a point mass with drag, gravity, buoyancy and (only where a lift model is given) spin lift "
    "about a fixed axis, on a spherical, rotating Earth with inverse-square gravity; no gusts or turbulence, no "
    "tumbling. Treat results as estimates and check them against measurement before relying on them.";
static const char DECIDE[] =
    "Safety distances, spectator and worker exclusion zones, spray buffer zones and debris hazard areas are set "
    "by local codes, product labels, regulations and licensed practice, not by this estimate.";
static const char ENERGY[] =
    "The impact energy is at or above 15 J, about the 11 ft-lbf (14.9 J) that U.S. launch-safety rules count as "
    "able to cause a casualty (14 CFR 417.107(c)(1)): keep people out of the landing area.";
static const char TRANSONIC[] =
    "The flight goes faster than Mach 0.6 but the drag law ignores Mach number: drag rises steeply near Mach 1, "
    "so use a Mach table for this projectile.";
static const char CLAMPED[] =
    "The flight left the range of the drag table; Cd was held at the table's end value there.";
static const char CRISIS[] =
    "The Reynolds number passed through the drag crisis of a smooth sphere (2e5 to 1e6), where Cd falls sharply "
    "and depends on surface roughness and turbulence: ranges there are sensitive to the ball's surface.";
static const char SPECTATORS[] =
    "A struck or thrown ball can injure spectators, players and passers-by where it lands or bounces: netting, "
    "fencing, stands and venue layouts follow local codes and the sport's own safety guidance, not this "
    "estimate; real balls scatter more than one modelled flight.";
static const char IRRIGATION[] =
    "Sprinkler layouts, application rates and watering schedules follow local codes and water-use rules; the "
    "pattern is modelled for one sprinkler on flat ground, and catch-can tests under the applicable test standard "
    "decide what a sprinkler actually lays down.";
static const char DRIFT[] =
    "Pesticide and other spray applications follow the product label, buffer-zone rules and local regulations; "
    "this drift estimate (one nozzle, steady wind without turbulence, flat open ground) does not replace them or "
    "field measurement.";
static const char DEBRIS[] =
    "Debris footprints come from point-mass fragments with the spreads given: real breakups also shed pieces that "
    "glide, tumble, burn or explode, and fragments can slide and bounce after impact. Hazard areas, evacuation, "
    "sheltering and the acceptability of a risk are decided by the range's safety authority, the applicable "
    "regulations and licensed practice; the published criteria quoted are references for comparison, not "
    "approval.";
static const char DENSE[] =
    "The fluid's density is more than 1 % of the body's: buoyancy is included, but added mass and unsteady "
    "(history) forces are not, so the acceleration phase is only approximate.";

static const char FIT_MODEL[] =
    "The estimates describe this track under this model (its drag and lift laws, wind and air): they carry over to "
    "other flights only as far as those flights resemble this one in speed, spin and conditions.";
static const char FIT_ERRORS[] =
    "The standard errors and 95 % intervals are linearised and assume independent Gaussian measurement errors: "
    "tracking systems that smooth or filter positions, or a biased calibration, make them too narrow.";
static const char FIT_USE[] =
    "Predictions made with fitted values, such as where balls land near spectators or how far drops drift, are "
    "estimates: safety margins, local codes, product labels, regulations and licensed practice decide.";

static const char UNIFORMITY_LIMITS[] =
    "CU and DU describe these catches only: wind, pressure, spacing, the number and placement of the cans and "
    "evaporation from them all change the result, and a test with few cans is a rough estimate.";
static const char UNIFORMITY_RULES[] =
    "Sprinkler design and watering schedules follow local codes and water-use rules; catch-can tests follow the "
    "applicable test standard.";

size_t dragarc_cautions_uniformity(const char **out, size_t max)
{
    const char *all[] = {UNIFORMITY_LIMITS, UNIFORMITY_RULES};
    size_t k = 0;
    for (; k < max && k < sizeof all / sizeof all[0]; k++)
        out[k] = all[k];
    return k;
}

static const char OPTIMUM[] =
    "The optimum is that of one modelled flight in the scenario's conditions: real launches scatter around it, and "
    "another ball, wind or air moves it. Where the curvature is small the distance changes little near the optimum, "
    "so its value matters more than its exact position.";

size_t dragarc_cautions_flight(const dragarc_scenario *s, const dragarc_flight *f, const char **out, size_t max)
{
    (void)s;
    return dragarc_cautions_notes(f->notes, out, max);
}

size_t dragarc_cautions_notes(unsigned notes, const char **out, size_t max)
{
    const char *all[DRAGARC_CAUTIONS_MAX];
    size_t n = 0;
    all[n++] = notes & DRAGARC_NOTE_ROTATING_EARTH     ? LIMITS_TURNING
               : notes & DRAGARC_NOTE_SPHERICAL_EARTH ? LIMITS_SPHERE
                                                       : LIMITS;
    all[n++] = DECIDE;
    if (notes & DRAGARC_NOTE_HIGH_ENERGY)
        all[n++] = ENERGY;
    if (notes & DRAGARC_NOTE_TRANSONIC)
        all[n++] = TRANSONIC;
    if (notes & DRAGARC_NOTE_TABLE_CLAMPED)
        all[n++] = CLAMPED;
    if (notes & DRAGARC_NOTE_DRAG_CRISIS)
        all[n++] = CRISIS;
    if (notes & DRAGARC_NOTE_DENSE_FLUID)
        all[n++] = DENSE;
    if (notes & DRAGARC_NOTE_BALL)
        all[n++] = SPECTATORS;
    if (notes & DRAGARC_NOTE_IRRIGATION)
        all[n++] = IRRIGATION;
    if (notes & DRAGARC_NOTE_SPRAY_DRIFT)
        all[n++] = DRIFT;
    if (notes & DRAGARC_NOTE_DEBRIS)
        all[n++] = DEBRIS;
    size_t k = n < max ? n : max;
    for (size_t i = 0; i < k; i++)
        out[i] = all[i];
    return k;
}

size_t dragarc_cautions_optimum(unsigned notes, const char **out, size_t max)
{
    size_t n = dragarc_cautions_notes(notes, out, max);
    if (n < max)
        out[n++] = OPTIMUM;
    return n;
}

size_t dragarc_cautions_fit(const char **out, size_t max)
{
    static const char *const all[] = {FIT_MODEL, FIT_ERRORS, FIT_USE};
    size_t n = 0;
    for (; n < max && n < sizeof all / sizeof *all; n++)
        out[n] = all[n];
    return n;
}

void dragarc_cautions_print_list(FILE *fp, const char *const *cautions, size_t n, int width)
{
    fputs("Cautions:\n", fp);
    for (size_t i = 0; i < n; i++)
        dragarc_text_wrap(fp, "  - ", 4, width, cautions[i]);
}

void dragarc_cautions_print(FILE *fp, unsigned notes, int width)
{
    const char *cautions[DRAGARC_CAUTIONS_MAX];
    size_t nc = dragarc_cautions_notes(notes, cautions, DRAGARC_CAUTIONS_MAX);
    dragarc_cautions_print_list(fp, cautions, nc, width);
}

void dragarc_cautions_print_uniformity(FILE *fp, int width)
{
    const char *cautions[DRAGARC_CAUTIONS_MAX];
    dragarc_cautions_print_list(fp, cautions, dragarc_cautions_uniformity(cautions, DRAGARC_CAUTIONS_MAX), width);
}

