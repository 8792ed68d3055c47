/* fuzz_track.c: the measured-track CSV reader (dragarc_track_parse) on any text. A track it accepts must keep what
 * fit.h promises (at least one point, times finite, >= 0 and increasing, every value finite, standard deviations
 * positive, velocities only with theirs): a broken promise aborts, which libFuzzer reports as a crash.
 * SPDX-License-Identifier: GPL-3.0-or-later
 */
#include <math.h>

#include "dragarc/fit.h"
#include "fuzz.h"

static int all_finite(const double *v, size_t n, int positive)
{
    for (size_t i = 0; i < n; i++)
        if (!isfinite(v[i]) || (positive && !(v[i] > 0.0)))
            return 0;
    return 1;
}

static int keeps_promises(const dragarc_track *t)
{
    if (t->n == 0 || t->n > DRAGARC_TRACK_MAX_POINTS || !t->t || !t->pos || !all_finite(t->t, t->n, 0) ||
        !all_finite(t->pos, 3 * t->n, 0) || !(t->t[0] >= 0.0) || !t->vel != !t->vel_sd || (t->vel && !t->pos_sd))
        return 0;
    for (size_t i = 1; i < t->n; i++)
        if (!(t->t[i] > t->t[i - 1]))
            return 0;
    return (!t->vel || (all_finite(t->vel, 3 * t->n, 0) && all_finite(t->vel_sd, 3 * t->n, 1))) &&
           (!t->pos_sd || all_finite(t->pos_sd, 3 * t->n, 1));
}

int LLVMFuzzerTestOneInput(const uint8_t *data, size_t size)
{
    char *text = fuzz_text(data, size);
    if (!text)
        return 0;
    dragarc_track t;
    dragarc_error err;
    if (dragarc_track_parse(text, &t, &err) == DRAGARC_OK && !keeps_promises(&t))
        abort();
    dragarc_track_clear(&t); /* also after a failure (the reader cleared it already) */
    free(text);
    return 0;
}
