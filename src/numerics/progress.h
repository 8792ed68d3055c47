/* progress.h: the progress count of a parallel loop of flights, shared by the table, sprinkler and footprint runs.
 * SPDX-License-Identifier: GPL-3.0-or-later
 *
 * Private to src/numerics. Each finished flight calls progress_step from its thread: the count is an OpenMP atomic,
 * and every `every` flights (and at the last) the caller's callback is called inside a critical section, so it runs
 * on one thread at a time, and only with a count above the last one shown, so the counts it sees rise and the last
 * call is (total, total). Flights never read the count: results do not depend on it.
 */
#ifndef DRAGARC_NUMERICS_PROGRESS_H
#define DRAGARC_NUMERICS_PROGRESS_H

#include <stddef.h>

typedef struct progress_count {
    void (*fn)(size_t done, size_t total, void *user); /* NULL: count nothing */
    void *user;
    size_t total, every;
    size_t done, shown;
} progress_count;

static inline progress_count progress_start(void (*fn)(size_t, size_t, void *), void *user, size_t total,
                                            size_t every)
{
    return (progress_count){.fn = fn, .user = user, .total = total, .every = every ? every : 1};
}

static inline void progress_step(progress_count *p)
{
    if (!p->fn)
        return;
    size_t d;
#pragma omp atomic capture
    d = ++p->done;
    if (d % p->every != 0 && d != p->total)
        return;
#pragma omp critical(dragarc_progress)
    {
        if (d > p->shown) {
            p->shown = d;
            p->fn(d, p->total, p->user);
        }
    }
}

#endif
