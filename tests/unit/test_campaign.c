/* test_campaign.c: campaign files (campaign.h) and footprint scenarios changed by a JSON Merge Patch
 * (dragarc_footprint_spec_read_patched), and the combined CSV table.
 * SPDX-License-Identifier: GPL-3.0-or-later
 */
#define _POSIX_C_SOURCE 200809L /* open_memstream */
#include <math.h>
#include <stdlib.h>
#include <string.h>

#include "check.h"
#include "dragarc/campaign.h"
#include "dragarc/footprint.h"
#include "helpers.h"

static const char *ROCKET = EXAMPLES_DIR "/footprint-rocket.json";

TEST(a_campaign_reads_its_cases_with_their_defaults)
{
    dragarc_campaign c;
    dragarc_error e;
    const char *json = "{\"name\": \"ascent\", \"scenario\": \"footprint-rocket.json\", \"samples\": 200, \"seed\": 3,"
                       " \"outputs\": [\"grid\", \"plot\"], \"plot_format\": \"png\", \"cases\": ["
                       " {\"name\": \"t+30 s\", \"folder\": \"t030\", \"set\": {\"breakup\": {\"altitude\": \"9 km\"}}},"
                       " {\"scenario\": \"/elsewhere/other.json\", \"samples\": 50, \"seed\": 0}]}";
    CHECK(dragarc_campaign_parse(json, "docs/examples", &c, &e) == DRAGARC_OK);
    CHECK(strcmp(c.name, "ascent") == 0 && c.ncases == 2);
    CHECK(c.outputs == (DRAGARC_CAMPAIGN_GRID | DRAGARC_CAMPAIGN_PLOT) && strcmp(c.plot_format, "png") == 0);
    const dragarc_campaign_case *a = &c.cases[0], *b = &c.cases[1];
    CHECK(strcmp(a->name, "t+30 s") == 0 && strcmp(a->folder, "t030") == 0);
    CHECK(strcmp(a->scenario, "docs/examples/footprint-rocket.json") == 0);
    CHECK(a->samples == 200 && a->seed == 3);
    CHECK(a->patch && strcmp(a->patch, "{\"breakup\":{\"altitude\":\"9 km\"}}") == 0);
    /* the second takes the numbered name and folder, its own absolute scenario, samples and seed */
    CHECK(strcmp(b->name, "case 2") == 0 && strcmp(b->folder, "case-002") == 0);
    CHECK(strcmp(b->scenario, "/elsewhere/other.json") == 0 && b->samples == 50 && b->seed == 0 && !b->patch);
    dragarc_campaign_clear(&c);
    /* without samples, seed or outputs: the scenarios' own, and summary.json alone; svg plots */
    CHECK(dragarc_campaign_parse("{\"cases\": [{\"scenario\": \"a.json\"}]}", "", &c, &e) == DRAGARC_OK);
    CHECK(c.cases[0].samples == 0 && c.cases[0].seed == -1 && c.outputs == 0 && strcmp(c.plot_format, "svg") == 0);
    CHECK(strcmp(c.cases[0].scenario, "a.json") == 0);
    dragarc_campaign_clear(&c);
    dragarc_campaign_clear(NULL);
}

TEST(bad_campaigns_name_the_field)
{
    static const struct {
        const char *json, *field, *text;
    } BAD[] = {
        {"[1]", "", "must be a JSON object"},
        {"{\"cases\": [", "", "not valid JSON"},
        {"{\"cases\": []}", "cases", "1 to 10000 cases"},
        {"{\"case\": [{}]}", "", "unknown key \"case\""},
        {"{\"cases\": [{}]}", "cases[0].scenario", "is needed"},
        {"{\"cases\": [{\"scenario\": \"a.json\", \"folder\": \"../up\"}]}", "cases[0].folder", "plain name"},
        {"{\"cases\": [{\"scenario\": \"a.json\", \"folder\": \"a/b\"}]}", "cases[0].folder", "plain name"},
        {"{\"cases\": [{\"scenario\": \"a.json\", \"folder\": \".hidden\"}]}", "cases[0].folder", "plain name"},
        {"{\"scenario\": \"a.json\", \"cases\": [{\"folder\": \"x\"}, {\"folder\": \"x\"}]}", "cases[1].folder",
         "cases[0]'s folder too"},
        {"{\"scenario\": \"a.json\", \"cases\": [{\"samples\": 0}]}", "cases[0].samples", "from 1 to 10000000"},
        {"{\"scenario\": \"a.json\", \"cases\": [{\"seed\": 1.5}]}", "cases[0].seed", "whole number"},
        {"{\"scenario\": \"a.json\", \"cases\": [{\"set\": [1]}]}", "cases[0].set", "must be an object"},
        {"{\"scenario\": \"a.json\", \"cases\": [{\"name\": \"\"}]}", "cases[0].name", "1 to 127 characters"},
        {"{\"scenario\": \"a.json\", \"cases\": [{\"altitude\": 3}]}", "cases[0]", "unknown key \"altitude\""},
        {"{\"scenario\": \"a.json\", \"cases\": [7]}", "cases[0]", "must be an object"},
        {"{\"scenario\": \"a.json\", \"outputs\": [\"maps\"], \"cases\": [{}]}", "outputs", "item 1"},
        {"{\"scenario\": \"a.json\", \"outputs\": \"grid\", \"cases\": [{}]}", "outputs", "must be a list"},
        {"{\"scenario\": \"a.json\", \"plot_format\": \"gif\", \"cases\": [{}]}", "plot_format", "\"svg\", \"png\""},
    };
    for (size_t i = 0; i < sizeof BAD / sizeof BAD[0]; i++) {
        dragarc_campaign c;
        dragarc_error e;
        CHECK_ERROR(dragarc_campaign_parse(BAD[i].json, "", &c, &e), DRAGARC_EINVAL, e, BAD[i].field, BAD[i].text);
        CHECK(c.ncases == 0 && c.cases == NULL); /* cleared */
    }
    dragarc_campaign c;
    dragarc_error e;
    CHECK_ERROR(dragarc_campaign_read(DATA_DIR "/no-such-campaign.json", &c, &e), DRAGARC_EIO, e, "", "cannot open");
}

TEST(a_merge_patch_changes_the_scenario_as_rfc_7386_says)
{
    /* IETF RFC 7386 (2014), section 2: members of the patch replace the target's, objects merge member by member,
     * null removes a member; a patch with an object where the target has none adds it without its nulls. */
    dragarc_footprint_spec plain, patched;
    dragarc_error e;
    CHECK(dragarc_footprint_spec_read(ROCKET, &plain, &e) == DRAGARC_OK);
    CHECK(dragarc_footprint_spec_read_patched(ROCKET, "{\"breakup\": {\"altitude\": \"9 km\", \"spread\": null},"
                                                      " \"footprint\": {\"samples\": 77, \"cell\": null},"
                                                      " \"hazard\": {\"population\": {\"density\": 40, \"x\": null}}}",
                                              &patched, &e) == DRAGARC_OK);
    CHECK(patched.breakup.altitude == 9000.0 && plain.breakup.altitude == 18000.0);
    CHECK(patched.breakup.latitude == plain.breakup.latitude); /* the rest of the object kept */
    CHECK(memcmp(patched.breakup.velocity, plain.breakup.velocity, sizeof plain.breakup.velocity) == 0);
    CHECK(plain.breakup.sd_speed == 15.0 && patched.breakup.sd_speed == 0.0 && patched.breakup.sd_position[0] == 0.0);
    CHECK(patched.samples == 77 && patched.seed == plain.seed);
    CHECK(patched.hazard.density == 40.0 && patched.hazard.criterion == plain.hazard.criterion);
    CHECK(patched.nclasses == plain.nclasses && patched.classes[1].mass == plain.classes[1].mass);
    dragarc_footprint_spec_clear(&patched);
    /* NULL and {} change nothing */
    CHECK(dragarc_footprint_spec_read_patched(ROCKET, "{}", &patched, &e) == DRAGARC_OK);
    CHECK(patched.breakup.altitude == plain.breakup.altitude && patched.samples == plain.samples);
    dragarc_footprint_spec_clear(&patched);
    CHECK(dragarc_footprint_spec_read_patched(ROCKET, NULL, &patched, &e) == DRAGARC_OK);
    CHECK(patched.breakup.sd_speed == plain.breakup.sd_speed);
    dragarc_footprint_spec_clear(&patched);
    /* an object where the scenario has none: added, its nulls dropped */
    CHECK(dragarc_footprint_spec_read_patched(ROCKET, "{\"ground\": {\"elevation\": 1200, \"x\": null}}", &patched,
                                              &e) == DRAGARC_OK);
    CHECK(patched.base.ground_elevation == 1200.0);
    dragarc_footprint_spec_clear(&patched);
    /* the changed scenario is checked as any other, its fields named */
    CHECK_ERROR(dragarc_footprint_spec_read_patched(ROCKET, "{\"breakup\": {\"altitude\": -3}}", &patched, &e),
                DRAGARC_EINVAL, e, "breakup.altitude", "above the ground");
    CHECK_ERROR(dragarc_footprint_spec_read_patched(ROCKET, "{\"breakup\": {\"velocity\": [1, 2, 3]}}", &patched, &e),
                DRAGARC_EINVAL, e, "breakup.velocity", "not both");
    CHECK_ERROR(dragarc_footprint_spec_read_patched(ROCKET, "[1]", &patched, &e), DRAGARC_EINVAL, e, "",
                "must be a JSON object");
    CHECK_ERROR(dragarc_footprint_spec_read_patched(ROCKET, "{\"fragments\": null}", &patched, &e), DRAGARC_EINVAL, e,
                "fragments", "");
    CHECK_ERROR(dragarc_footprint_spec_read_patched(DATA_DIR "/none.json", "{}", &patched, &e), DRAGARC_EIO, e, "",
                "cannot open");
    dragarc_footprint_spec_clear(&plain);
}

TEST(the_csv_table_has_a_row_per_case_and_exact_numbers)
{
    dragarc_campaign_row rows[2];
    memset(rows, 0, sizeof rows);
    snprintf(rows[0].name, sizeof rows[0].name, "t+30 \"s\"");
    snprintf(rows[0].folder, sizeof rows[0].folder, "t030");
    rows[0].latitude = 0.1, rows[0].altitude = 9000, rows[0].speed = 520, rows[0].samples = 10, rows[0].seed = 7;
    rows[0].flights = 30, rows[0].landed = 29, rows[0].fragments = 1.0 / 3.0;
    rows[0].mean_ok = 1, rows[0].ellipse_ok = 1, rows[0].azimuth = -30.0 * DEG, rows[0].semi_major = 2;
    rows[0].casualty_done = 1, rows[0].expected_casualties = 2e-4, rows[0].criterion = 1e-4;
    rows[1] = rows[0];
    rows[1].ellipse_ok = 0, rows[1].casualty_done = 0, rows[1].expected_casualties = NAN, rows[1].criterion = 0;
    rows[1].mean_east = NAN;
    char *text = NULL;
    size_t len = 0;
    FILE *fp = open_memstream(&text, &len);
    dragarc_error e;
    CHECK(fp && dragarc_campaign_write_csv(fp, rows, 2, &e) == DRAGARC_OK);
    fclose(fp);
    char *l1 = strchr(text, '\n') + 1, *l2 = strchr(l1, '\n') + 1;
    const char *head = "case,folder,breakup_latitude,",
               *first = "\"t+30 \"\"s\"\"\",\"t030\",0.10000000000000001,0,9000,520,10,7,30,29,0.33333333333333331,";
    CHECK(strncmp(text, head, strlen(head)) == 0);
    CHECK(strncmp(l1, first, strlen(first)) == 0);
    CHECK(strstr(l1, ",150,") && strstr(l1, ",0.00020000000000000001,0.0001,no\n"));
    CHECK(strstr(l2, ",29,0.33333333333333331,,") && strstr(l2, ",,,\n"));
    free(text);
}

int main(void)
{
    RUN(a_campaign_reads_its_cases_with_their_defaults);
    RUN(bad_campaigns_name_the_field);
    RUN(a_merge_patch_changes_the_scenario_as_rfc_7386_says);
    RUN(the_csv_table_has_a_row_per_case_and_exact_numbers);
    return check_summary();
}
