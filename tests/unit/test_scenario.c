/* test_scenario.c: the scenario reader: the documented form, defaults, profiles, error paths.
 * SPDX-License-Identifier: GPL-3.0-or-later
 */
#include <stdlib.h>

#include "check.h"
#include "helpers.h"
#include "dragarc/output.h"

#ifndef PROFILE_DIR
#define PROFILE_DIR "profiles"
#endif

static const char ISSUE_FORM[] =
    "{\"projectile\": {\"mass\": 0.145, \"diameter\": 0.074, \"drag\": {\"model\": \"constant\", \"cd\": 0.35}},"
    " \"launch\": {\"speed\": 40.0, \"elevation\": 30.0, \"azimuth\": 0.0, \"height\": 1.0},"
    " \"environment\": {\"gravity\": 9.80665,"
    "   \"atmosphere\": {\"model\": \"isa\", \"site_elevation\": 0.0, \"temperature_offset\": 0.0},"
    "   \"wind\": {\"speed\": 3.0, \"from\": 270.0}},"
    " \"ground\": {\"elevation\": 0.0}, \"solver\": {\"rtol\": 1e-9, \"atol\": 1e-9}}";

TEST(the_documented_form_is_read_into_si_units_and_radians)
{
    dragarc_scenario s;
    dragarc_error e;
    CHECK(dragarc_scenario_parse(ISSUE_FORM, NULL, NULL, &s, &e) == DRAGARC_OK);
    CHECK_ABS(s.projectile.mass, 0.145, 0.0);
    CHECK_REL(s.projectile.area, PI * 0.074 * 0.074 / 4.0, 1e-15);
    CHECK_REL(s.projectile.volume, PI * 0.074 * 0.074 * 0.074 / 6.0, 1e-15);
    CHECK_REL(s.launch.elevation, 30.0 * DEG, 1e-15);
    CHECK(s.wind.model == DRAGARC_WIND_CONSTANT);
    CHECK_REL(s.wind.from, 270.0 * DEG, 1e-15);
    CHECK_ABS(s.solver.rtol, 1e-9, 0.0);
    CHECK(s.solver.method == DRAGARC_METHOD_AUTO);
    dragarc_scenario_clear(&s);
}

TEST(density_gives_the_mass_of_the_volume)
{
    dragarc_scenario s;
    const char *j = "{\"projectile\": {\"density\": 1000, \"diameter\": 0.001, \"drag\": {\"model\": \"sphere\"}},"
                    " \"launch\": {\"speed\": 0, \"elevation\": 0, \"height\": 2}}";
    CHECK(dragarc_scenario_parse(j, NULL, NULL, &s, NULL) == DRAGARC_OK);
    CHECK_REL(s.projectile.mass, 1000.0 * PI * 1e-9 / 6.0, 1e-14);
    dragarc_scenario_clear(&s);
}

TEST(every_shipped_profile_loads_by_name)
{
    const char *names[] = {"golf-ball", "baseball", "soccer-ball", "tennis-ball", "table-tennis-ball",
                           "water-drop-0.5mm", "water-drop-1mm", "water-drop-2mm", "steel-sphere-10mm",
                           "aluminium-plate-fragment", "steel-bolt-fragment", "steel-cube-fragment-12mm"};
    for (size_t i = 0; i < sizeof names / sizeof names[0]; i++) {
        char json[512];
        snprintf(json, sizeof json, "{\"projectile\": \"%s\", \"launch\": {\"speed\": 20, \"elevation\": 30, \"height\": 1}}",
                 names[i]);
        dragarc_scenario s;
        dragarc_error e = {0};
        int rc = dragarc_scenario_parse(json, NULL, "/nonexistent:" PROFILE_DIR, &s, &e);
        if (rc != DRAGARC_OK)
            printf("  %s: %s: %s\n", names[i], e.field, e.message);
        CHECK(rc == DRAGARC_OK);
        CHECK(s.projectile.mass > 0.0 && s.projectile.diameter > 0.0);
        CHECK(strcmp(s.projectile.name, names[i]) == 0);
        dragarc_flight f;
        CHECK(dragarc_flight_run(&s, 0.0, &f, NULL) == DRAGARC_OK);
        dragarc_flight_clear(&f);
        dragarc_scenario_clear(&s);
    }
}

TEST(a_profile_can_be_named_by_path_relative_to_the_scenario)
{
    dragarc_scenario s;
    const char *j = "{\"projectile\": \"golf-ball.json\", \"launch\": {\"speed\": 60, \"elevation\": 12, \"height\": 0.02}}";
    CHECK(dragarc_scenario_parse(j, PROFILE_DIR, NULL, &s, NULL) == DRAGARC_OK);
    CHECK_ABS(s.projectile.diameter, 0.04267, 1e-5);
    dragarc_scenario_clear(&s);
}

TEST(cd_scale_is_read_on_every_drag_law)
{
    const char *j = "{\"projectile\": {\"mass\": 1, \"diameter\": 0.1, \"drag\": {\"model\": \"table\", \"x\": "
                    "\"mach\", \"points\": [[0.5, 0.3], [1.0, 0.6]], \"cd_scale\": 1.1}}, \"launch\": {\"speed\": 1, "
                    "\"elevation\": 5}}";
    dragarc_scenario s;
    CHECK(dragarc_scenario_parse(j, NULL, NULL, &s, NULL) == DRAGARC_OK);
    CHECK(s.projectile.drag.scale == 1.1);
    dragarc_scenario_clear(&s);
    const char *k = "{\"projectile\": {\"mass\": 1, \"diameter\": 0.1, \"drag\": {\"model\": \"constant\", \"cd\": 0.4}},"
                    " \"launch\": {\"speed\": 1, \"elevation\": 5}}";
    CHECK(dragarc_scenario_parse(k, NULL, NULL, &s, NULL) == DRAGARC_OK);
    CHECK(dragarc_drag_scale(&s.projectile.drag) == 1.0);
    dragarc_scenario_clear(&s);
}

TEST(errors_name_the_field_path)
{
    struct {
        const char *json, *field, *text;
    } cases[] = {
        {"{\"projectile\": {\"mass\": 1, \"diameter\": 0.1, \"drag\": {\"model\": \"none\"}}, \"launch\": {\"speed\": 1, \"elevation\": 95, \"height\": 1}}",
         "launch.elevation", "must be between -90 and 90 degrees"},
        {"{\"projectile\": {\"mass\": 1, \"diameter\": 0.1, \"drag\": {\"model\": \"table\", \"x\": \"mach\", \"points\": [[0.5, 0.3], [0.4, 0.4]]}}, \"launch\": {\"speed\": 1, \"elevation\": 5, \"height\": 1}}",
         "projectile.drag.points[1]", "increase strictly"},
        {"{\"projectile\": {\"mass\": 1, \"diameter\": 0.1, \"drag\": {\"model\": \"none\"}}, \"launch\": {\"speed\": 1, \"elevation\": 5, \"height\": 1}, \"environment\": {\"wind\": {\"layers\": [{\"height\": 0, \"speed\": 1, \"from\": 0}, {\"height\": 0, \"speed\": 1, \"from\": 0}]}}}",
         "environment.wind.layers[1].height", "increase strictly"},
        {"{\"projectile\": {\"mass\": 1, \"diameter\": 0.1, \"drag\": {\"model\": \"none\"}}, \"launch\": {\"speed\": 1, \"elevation\": 5, \"hieght\": 1}}",
         "launch.hieght", "unknown key"},
        {"{\"projectile\": \"no-such-ball\", \"launch\": {\"speed\": 1, \"elevation\": 5}}", "projectile", "no profile named"},
        {"{\"projectile\": {\"mass\": 1, \"diameter\": 0.1}, \"launch\": {\"speed\": 1, \"elevation\": 5}}",
         "projectile.drag", "is required"},
        {"{\"projectile\": {\"mass\": 1, \"diameter\": 0.1, \"drag\": {\"model\": \"sphere\", \"cd_scale\": 0}}, \"launch\": {\"speed\": 1, \"elevation\": 5}}",
         "projectile.drag.cd_scale", "must be positive and at most 100"},
        {"{\"projectile\": {\"mass\": 1, \"diameter\": 0.1, \"drag\": {\"model\": \"none\", \"cd_scale\": 2}}, \"launch\": {\"speed\": 1, \"elevation\": 5}}",
         "projectile.drag.cd_scale", "unknown key"},
        {"[1, 2]", "", "must be a JSON object"},
        {"{\"launch\": {\"speed\": 1, \"elevation\": 5}", "", "not valid JSON (line 1, column"},
    };
    for (size_t i = 0; i < sizeof cases / sizeof cases[0]; i++) {
        dragarc_scenario s;
        dragarc_error e = {0};
        CHECK(dragarc_scenario_parse(cases[i].json, NULL, PROFILE_DIR, &s, &e) == DRAGARC_EINVAL);
        if (strcmp(e.field, cases[i].field) != 0 || !strstr(e.message, cases[i].text))
            printf("  case %zu: got '%s: %s'\n", i, e.field, e.message);
        CHECK(strcmp(e.field, cases[i].field) == 0);
        CHECK(strstr(e.message, cases[i].text) != NULL);
        CHECK(s.projectile.drag.x == NULL && s.wind.layers == NULL);
    }
}

int main(void)
{
    dragarc_init();
    RUN(the_documented_form_is_read_into_si_units_and_radians);
    RUN(density_gives_the_mass_of_the_volume);
    RUN(every_shipped_profile_loads_by_name);
    RUN(a_profile_can_be_named_by_path_relative_to_the_scenario);
    RUN(cd_scale_is_read_on_every_drag_law);
    RUN(errors_name_the_field_path);
    return check_summary();
}
