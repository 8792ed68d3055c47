/* fuzz_campaign.c: the campaign reader (dragarc_campaign_parse) and, for each case that changes its scenario, the
 * JSON Merge Patch applied to an example footprint scenario (dragarc_footprint_spec_read_patched).
 * SPDX-License-Identifier: GPL-3.0-or-later
 */
#include "dragarc/campaign.h"
#include "fuzz.h"

/* an example scenario of the source tree (PROFILE_DIR is its profiles/ folder) */
static const char *const SCENARIO = PROFILE_DIR "/../docs/examples/footprint-rocket.json";

int LLVMFuzzerTestOneInput(const uint8_t *data, size_t size)
{
    char *text = fuzz_text(data, size);
    if (!text)
        return 0;
    dragarc_campaign c;
    dragarc_error err;
    if (dragarc_campaign_parse(text, "", &c, &err) == DRAGARC_OK)
        for (size_t i = 0; i < c.ncases && i < 4; i++) {
            if (!c.cases[i].patch)
                continue;
            dragarc_footprint_spec spec;
            if (dragarc_footprint_spec_read_patched(SCENARIO, c.cases[i].patch, &spec, &err) == DRAGARC_OK)
                (void)dragarc_footprint_check(&spec, &err);
            dragarc_footprint_spec_clear(&spec);
        }
    dragarc_campaign_clear(&c); /* also after a failure: the reader's partial work must be freeable */
    free(text);
    return 0;
}
