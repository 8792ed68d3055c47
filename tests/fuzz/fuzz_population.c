/* fuzz_population.c: the population-grid CSV reader (dragarc_population_parse) on any text, then a few
 * look-ups inside, on the edges of and outside the grid.
 * SPDX-License-Identifier: GPL-3.0-or-later
 */
#include "dragarc/population.h"
#include "fuzz.h"

int LLVMFuzzerTestOneInput(const uint8_t *data, size_t size)
{
    char *text = fuzz_text(data, size);
    if (!text)
        return 0;
    dragarc_population p;
    memset(&p, 0, sizeof p);
    dragarc_error err;
    if (dragarc_population_parse(text, &p, &err) == DRAGARC_OK) {
        static const double at[][2] = {{0, 0}, {50, 25}, {-1e9, 0}, {1e9, 1e9}, {100, 50}, {-0.0, 1e-300}};
        for (size_t i = 0; i < sizeof at / sizeof at[0]; i++)
            (void)dragarc_population_density(&p, at[i][0], at[i][1]);
    }
    dragarc_population_clear(&p); /* the header asks for it also after a failure */
    free(text);
    return 0;
}
