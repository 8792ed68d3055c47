/* fuzz_scenario.c: the scenario reader (dragarc_scenario_parse) and the whole-scenario check on any text.
 * SPDX-License-Identifier: GPL-3.0-or-later
 *
 * Profiles named in a scenario are searched in the project's profiles/ folder, so that the corpus's named
 * projectiles are read as they are by the CLI. Whatever the outcome, the scenario is cleared: a leak fails.
 */
#include "dragarc/scenario.h"
#include "fuzz.h"

int LLVMFuzzerTestOneInput(const uint8_t *data, size_t size)
{
    char *text = fuzz_text(data, size);
    if (!text)
        return 0;
    dragarc_scenario s;
    dragarc_error err;
    if (dragarc_scenario_parse(text, NULL, PROFILE_DIR, &s, &err) == DRAGARC_OK)
        (void)dragarc_scenario_check(&s, &err);
    dragarc_scenario_clear(&s);
    free(text);
    return 0;
}
