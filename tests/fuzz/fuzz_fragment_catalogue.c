/* fuzz_fragment_catalogue.c: the fragment catalogue CSV reader (dragarc_fragment_catalogue_parse) on any text,
 * with two named drag laws rows may refer to ("motor", a constant, and "tumbling", a table in Mach number).
 * SPDX-License-Identifier: GPL-3.0-or-later
 */
#include "dragarc/footprint.h"
#include "fuzz.h"

int LLVMFuzzerTestOneInput(const uint8_t *data, size_t size)
{
    char *text = fuzz_text(data, size);
    if (!text)
        return 0;
    dragarc_named_drag laws[2];
    memset(laws, 0, sizeof laws);
    dragarc_error err;
    strcpy(laws[0].name, "motor");
    laws[0].drag.model = DRAGARC_DRAG_CONSTANT;
    laws[0].drag.cd = 0.8;
    strcpy(laws[1].name, "tumbling");
    static const double mach[] = {0.2, 0.8, 1.2, 3.0}, cd[] = {1.1, 1.2, 1.6, 1.3};
    if (dragarc_drag_table_set(&laws[1].drag, DRAGARC_AXIS_MACH, mach, cd, 4, &err) != DRAGARC_OK)
        abort(); /* fixed, valid numbers: a failure here is a bug of its own */
    dragarc_fragment_class *classes = NULL;
    size_t n = 0;
    if (dragarc_fragment_catalogue_parse(text, laws, 2, &classes, &n, &err) == DRAGARC_OK) {
        for (size_t i = 0; i < n; i++) {
            (void)dragarc_fragment_class_check(&classes[i], &err);
            dragarc_drag_clear(&classes[i].drag);
        }
        free(classes);
    }
    dragarc_drag_clear(&laws[1].drag);
    free(text);
    return 0;
}
