/* fuzz_fly.c: the `fly` pipeline on any text: read the scenario, check it, fly it to the ground and format the
 * `fly --json` summary, as src/cli/cmd_fly.c does (without the files it may write).
 * SPDX-License-Identifier: GPL-3.0-or-later
 */
#include "dragarc/flight.h"
#include "dragarc/output.h"
#include "dragarc/scenario.h"
#include "fuzz.h"

/* The solver's budget after parsing: at most this many steps and this much flight time, so that each input takes
 * milliseconds and libFuzzer tries thousands a minute. This hides no bug: a longer budget runs the same step loop
 * longer and reaches no other code, and running out of steps or time is a normal outcome (DRAGARC_ESOLVER,
 * DRAGARC_ENOIMPACT) whose path the clamp makes more common, so it is fuzzed more, not less. Values smaller than
 * the caps (and the reader's own checks of them) are left as the file gave them. */
#define FUZZ_MAX_STEPS 20000L
#define FUZZ_MAX_TIME 120.0 /* s */

int LLVMFuzzerTestOneInput(const uint8_t *data, size_t size)
{
    char *text = fuzz_text(data, size);
    if (!text)
        return 0;
    dragarc_scenario s;
    dragarc_error err;
    if (dragarc_scenario_parse(text, NULL, PROFILE_DIR, &s, &err) == DRAGARC_OK &&
        dragarc_scenario_check(&s, &err) == DRAGARC_OK) {
        if (s.solver.max_steps > FUZZ_MAX_STEPS)
            s.solver.max_steps = FUZZ_MAX_STEPS;
        if (s.solver.max_time > FUZZ_MAX_TIME)
            s.solver.max_time = FUZZ_MAX_TIME;
        dragarc_flight f;
        if (dragarc_flight_run(&s, 0.0, &f, &err) == DRAGARC_OK) {
            char *json = dragarc_flight_json(&s, &f, NULL);
            free(json);
        }
        dragarc_flight_clear(&f); /* the header asks for it also after a failure */
    }
    dragarc_scenario_clear(&s);
    free(text);
    return 0;
}
