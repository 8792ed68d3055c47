/* test_report.c: the HTML report writer: text escaped, figures' ids prefixed so that several share a page, SVG
 * that could reach outside the page refused, files written whole or not at all; each kind (fly, aim, sprinkler,
 * drift, footprint, fit, campaign) holds its tables and its figure, and exactly the cautions its command prints.
 * SPDX-License-Identifier: GPL-3.0-or-later
 */
#define _POSIX_C_SOURCE 200809L
#include <dirent.h>
#include <math.h>
#include <signal.h>
#include <stdio.h>
#include <stdlib.h>
#include <string.h>
#include <sys/resource.h>
#include <sys/stat.h>
#include <unistd.h>

#include "check.h"
#include "dragarc/campaign.h"
#include "dragarc/geodesy.h"
#include "dragarc/cautions.h"
#include "dragarc/output.h"
#include "dragarc/report.h"
#include "helpers.h"

static char dir[64]; /* a fresh folder for this run's files */

static int entries(const char *folder)
{
    return folder_entries(folder);
}

static char *slurp(const char *path)
{
    char *text = NULL;
    dragarc_error e;
    return dragarc_text_file_read(path, 1 << 26, &text, &e) == DRAGARC_OK ? text : NULL;
}

static int count(const char *hay, const char *needle)
{
    int n = 0;
    for (const char *p = hay; (p = strstr(p, needle)) != NULL; p += strlen(needle))
        n++;
    return n;
}

/* A report with one paragraph, written to name in dir; its text (caller frees), NULL on failure. */
static char *written(dragarc_report *r, const char *name)
{
    char path[128];
    snprintf(path, sizeof path, "%s/%s", dir, name);
    dragarc_error e;
    if (dragarc_report_write_html(r, path, &e) != DRAGARC_OK)
        return NULL;
    char *text = slurp(path);
    unlink(path);
    return text;
}

TEST(every_text_is_escaped)
{
    dragarc_report *r;
    dragarc_error e;
    CHECK(dragarc_report_new(&r, "a <b> & \"c\" 'd'", "fly", &e) == DRAGARC_OK);
    const char *pair[2] = {"<key>", "x & y"};
    const char *head[1] = {"h <1>"}, *cell[1] = {"'q'"};
    const char *caution[1] = {"don't <stand> here"};
    CHECK(dragarc_report_section(r, "S&S", &e) == DRAGARC_OK);
    CHECK(dragarc_report_paragraph(r, "<script>alert(1)</script>", &e) == DRAGARC_OK);
    CHECK(dragarc_report_pairs(r, "cap<", 1, pair, &e) == DRAGARC_OK);
    CHECK(dragarc_report_table(r, NULL, 1, head, NULL, 1, cell, &e) == DRAGARC_OK);
    CHECK(dragarc_report_cautions(r, 1, caution, &e) == DRAGARC_OK);
    CHECK(dragarc_report_source(r, "t>", "m\"", "s'", &e) == DRAGARC_OK);
    char *html = written(r, "esc.html");
    dragarc_report_free(r);
    CHECK(html != NULL);
    if (!html)
        return;
    CHECK(strstr(html, "<h1>a &lt;b&gt; &amp; &quot;c&quot; &#39;d&#39;</h1>") != NULL);
    CHECK(strstr(html, "<title>a &lt;b&gt; &amp; &quot;c&quot; &#39;d&#39;") != NULL);
    CHECK(strstr(html, "&lt;script&gt;alert(1)&lt;/script&gt;") != NULL);
    CHECK(strstr(html, "<script") == NULL);
    CHECK(strstr(html, "<h2>S&amp;S</h2>") != NULL);
    CHECK(strstr(html, "&lt;key&gt;</th><td>x &amp; y</td>") != NULL);
    CHECK(strstr(html, "<caption>cap&lt;</caption>") != NULL);
    CHECK(strstr(html, ">h &lt;1&gt;</th>") != NULL && strstr(html, "<td>&#39;q&#39;</td>") != NULL);
    CHECK(strstr(html, "<li>don&#39;t &lt;stand&gt; here</li>") != NULL);
    CHECK(strstr(html, "t&gt;:</span> m&quot;") != NULL && strstr(html, "s&#39;</span>") != NULL);
    free(html);
}

/* An SVG as cairo writes it: prolog, namespaces, glyphs used by xlink:href, a clip path by url(#). */
static const char SVG[] =
    "<?xml version=\"1.0\" encoding=\"UTF-8\"?>\n"
    "<!DOCTYPE svg PUBLIC \"-//W3C//DTD SVG 1.1//EN\" \"http://www.w3.org/Graphics/SVG/1.1/DTD/svg11.dtd\">\n"
    "<svg xmlns=\"http://www.w3.org/2000/svg\" xmlns:xlink=\"http://www.w3.org/1999/xlink\" width=\"600pt\" "
    "height=\"450pt\" viewBox=\"0 0 600 450\" version=\"1.1\">\n"
    "<defs><g><symbol overflow=\"visible\" id=\"glyph0-1\"><path d=\"M 0 0 L 1 1\"/></symbol></g>\n"
    "<clipPath id=\"clip1\"><path d=\"M 0 0 L 9 9 Z\"/></clipPath></defs>\n"
    "<g clip-path=\"url(#clip1)\"><use xlink:href=\"#glyph0-1\" x=\"1\" y=\"2\"/><use href='#glyph0-1'/></g>\n"
    "</svg>\n";

TEST(figures_get_ids_of_their_own_and_scale_to_the_page)
{
    dragarc_report *r;
    dragarc_error e;
    CHECK(dragarc_report_new(&r, "figures", "fly", &e) == DRAGARC_OK);
    CHECK(dragarc_report_figure_svg(r, "one", SVG, &e) == DRAGARC_OK);
    CHECK(dragarc_report_figure_svg(r, "two", SVG, &e) == DRAGARC_OK);
    char *html = written(r, "fig.html");
    dragarc_report_free(r);
    CHECK(html != NULL);
    if (!html)
        return;
    CHECK(strstr(html, "<?xml") == NULL && strstr(html, "<!DOCTYPE svg") == NULL);
    CHECK(strstr(html, "http:") == NULL); /* the namespaces go: the HTML parser knows svg and xlink */
    CHECK(count(html, "<svg viewBox=\"0 0 600 450\" width=\"100%\"") == 2);
    CHECK(strstr(html, "height=\"450pt\"") == NULL);
    CHECK(count(html, "id=\"f1-glyph0-1\"") == 1 && count(html, "id=\"f2-glyph0-1\"") == 1);
    CHECK(count(html, "id=\"f1-clip1\"") == 1 && count(html, "id=\"f2-clip1\"") == 1);
    CHECK(count(html, "url(#f1-clip1)") == 1 && count(html, "url(#f2-clip1)") == 1);
    CHECK(count(html, "xlink:href=\"#f1-glyph0-1\"") == 1 && count(html, "href='#f2-glyph0-1'") == 1);
    CHECK(count(html, "id=\"glyph") == 0 && count(html, "url(#clip") == 0 && count(html, "href=\"#glyph") == 0);
    CHECK(strstr(html, "<b>Figure 2.</b> two") != NULL);
    /* every id in the page is unique */
    int dup = 0;
    for (const char *p = html; (p = strstr(p, " id=\"")) != NULL; p += 5) {
        char id[96];
        if (sscanf(p + 5, "%95[^\"]", id) == 1) {
            char pat[128];
            snprintf(pat, sizeof pat, " id=\"%s\"", id);
            dup += count(html, pat) != 1;
        }
    }
    CHECK(dup == 0);
    free(html);
}

TEST(svg_that_reaches_outside_the_page_is_refused)
{
    dragarc_report *r;
    dragarc_error e;
    CHECK(dragarc_report_new(&r, "bad", "fly", &e) == DRAGARC_OK);
    CHECK_ERROR(dragarc_report_figure_svg(r, "x", "<p>no svg</p>", &e), DRAGARC_EINVAL, e, "", "no <svg> element");
    CHECK_ERROR(dragarc_report_figure_svg(r, "x", "<svg><script>1</script></svg>", &e), DRAGARC_EINVAL, e, "",
                "script");
    CHECK_ERROR(dragarc_report_figure_svg(r, "x", "<svg><image href=\"http://x/y.png\"/></svg>", &e), DRAGARC_EINVAL,
                e, "", "outside itself");
    CHECK_ERROR(dragarc_report_figure_svg(r, "x", "<svg><g fill=\"url(other.svg#a)\"/></svg>", &e), DRAGARC_EINVAL,
                e, "", "outside itself");
    CHECK_ERROR(dragarc_report_figure_svg(r, "x", "<svg><g onload=\"f()\"/></svg>", &e), DRAGARC_EINVAL, e, "",
                "event handler");
    /* a raster embedded as data is its own */
    CHECK(dragarc_report_figure_svg(r, "x", "<svg width=\"10\" height=\"5\"><image href=\"data:image/png;base64,AA\"/>"
                                            "</svg>", &e) == DRAGARC_OK);
    char *html = written(r, "refused.html");
    CHECK(html && count(html, "<figure>") == 1 && strstr(html, "viewBox=\"0 0 10 5\""));
    free(html);
    dragarc_report_free(r);
}

static int draw_nothing(const char *path, const void *ctx, dragarc_error *err)
{
    (void)ctx;
    FILE *f = fopen(path, "w"); /* a half-drawn file, then a failure */
    if (f)
        fclose(f);
    return dragarc_error_set(err, DRAGARC_EIO, "", "the plot failed");
}

TEST(a_failed_figure_leaves_the_scratch_folder_clean)
{
    dragarc_report *r;
    dragarc_error e;
    char scratch[128];
    snprintf(scratch, sizeof scratch, "%s/scratch", dir);
    CHECK(mkdir(scratch, 0700) == 0);
    CHECK(dragarc_report_new(&r, "t", "fly", &e) == DRAGARC_OK);
    CHECK(dragarc_report_set_scratch_dir(r, scratch, &e) == DRAGARC_OK);
    CHECK_ERROR(dragarc_report_figure_draw(r, "x", draw_nothing, NULL, &e), DRAGARC_EIO, e, "", "the plot failed");
    CHECK(entries(scratch) == 0);
    CHECK(dragarc_report_set_scratch_dir(r, "/nonexistent-dragarc-folder", &e) == DRAGARC_OK);
    CHECK_ERROR(dragarc_report_figure_draw(r, "x", draw_nothing, NULL, &e), DRAGARC_EIO, e, "",
                "cannot make a scratch folder");
    dragarc_report_free(r);
    rmdir(scratch);
}

TEST(a_failed_write_leaves_no_file_and_an_old_one_untouched)
{
    dragarc_report *r;
    dragarc_error e;
    CHECK(dragarc_report_new(&r, "t", "fly", &e) == DRAGARC_OK);
    for (int i = 0; i < 200; i++)
        dragarc_report_paragraph(r, "a paragraph long enough that two hundred of them fill many kilobytes of HTML", &e);
    int before = entries(dir);
    CHECK_ERROR(dragarc_report_write_html(r, "/nonexistent-dragarc-folder/r.html", &e), DRAGARC_EIO, e, "",
                "cannot write");
    /* an existing report, then a write cut short by a file-size limit (EFBIG): the old file stays as it was */
    char path[128];
    snprintf(path, sizeof path, "%s/old.html", dir);
    FILE *f = fopen(path, "w");
    fputs("old report\n", f);
    fclose(f);
    struct rlimit old, small;
    getrlimit(RLIMIT_FSIZE, &old);
    small = old;
    small.rlim_cur = 4096;
    signal(SIGXFSZ, SIG_IGN);
    CHECK(setrlimit(RLIMIT_FSIZE, &small) == 0);
    int rc = dragarc_report_write_html(r, path, &e);
    setrlimit(RLIMIT_FSIZE, &old);
    CHECK(rc == DRAGARC_EIO);
    char *text = slurp(path);
    CHECK(text && strcmp(text, "old report\n") == 0);
    free(text);
    CHECK(entries(dir) == before + 1); /* old.html alone: no temporary file left */
    /* and a write that succeeds replaces it */
    CHECK(dragarc_report_write_html(r, path, &e) == DRAGARC_OK);
    text = slurp(path);
    CHECK(text && strncmp(text, "<!DOCTYPE html>", 15) == 0 && count(text, "<p>a paragraph") == 200);
    free(text);
    unlink(path);
    dragarc_report_free(r);
}

/* The cautions `fly` prints, escaped as the page shows them. */
static void escaped(char *out, size_t n, const char *s)
{
    size_t k = 0;
    for (; *s && k + 7 < n; s++) {
        const char *rep = *s == '&' ? "&amp;" : *s == '<' ? "&lt;" : *s == '>' ? "&gt;" : *s == '"' ? "&quot;"
                        : *s == '\'' ? "&#39;" : NULL;
        if (rep)
            k += (size_t)snprintf(out + k, n - k, "%s", rep);
        else
            out[k++] = *s;
    }
    out[k] = '\0';
}

TEST(the_fly_report_holds_the_inputs_results_figure_cautions_and_sources)
{
    dragarc_scenario s;
    dragarc_error e;
    CHECK(dragarc_scenario_read(DATA_DIR "/ball-in-wind.json", "", &s, &e) == DRAGARC_OK);
    dragarc_flight f, g;
    CHECK(dragarc_flight_run(&s, 0.0, &f, &e) == DRAGARC_OK);
    CHECK(dragarc_flight_run(&s, 0.05, &g, &e) == DRAGARC_OK);
    dragarc_report *r;
    CHECK(dragarc_report_new(&r, s.name, "fly", &e) == DRAGARC_OK);
    CHECK(dragarc_report_set_scratch_dir(r, dir, &e) == DRAGARC_OK);
    dragarc_report_set_date(r, 86400);
    CHECK(dragarc_report_fly(r, "ball-in-wind.json", &s, &f, &g, NULL, NULL, &e) == DRAGARC_OK);
    char *html = written(r, "fly.html");
    CHECK(html != NULL);
    if (html) {
        CHECK(strstr(html, "<h1>ball in a west wind</h1>") != NULL);
        CHECK(strstr(html, "range (carry)</th><td>91.15 m</td>") != NULL); /* as `fly` prints it */
        CHECK(strstr(html, "<th scope=\"col\" class=\"num\">height above ground (m)</th>") != NULL);
        CHECK(count(html, "<figure>") == 1 && count(html, "<svg ") == 1);
        CHECK(strstr(html, "U.S. Standard Atmosphere 1976") != NULL && strstr(html, "Hairer") != NULL);
        CHECK(strstr(html, "on 1970-01-02 00:00 UTC") != NULL);
        const char *c[DRAGARC_CAUTIONS_MAX];
        size_t nc = dragarc_cautions_flight(&s, &f, c, DRAGARC_CAUTIONS_MAX);
        CHECK(nc >= 3); /* limits, who decides, and the impact energy above 15 J */
        for (size_t i = 0; i < nc; i++) {
            char want[2048];
            escaped(want, sizeof want, c[i]);
            CHECK(strstr(html, want) != NULL);
        }
    }
    CHECK(entries(dir) == 0); /* the figure's scratch files are gone */
    free(html);
    dragarc_report_free(r);
    dragarc_flight_clear(&f);
    dragarc_flight_clear(&g);
    dragarc_scenario_clear(&s);
}

/* The cautions box holds exactly these cautions: each one, escaped, and no other item. */
static int cautions_exactly(const char *html, const char *const *c, size_t nc)
{
    const char *box = strstr(html, "class=\"cautions\"");
    const char *end = box ? strstr(box, "</ul>") : NULL;
    if (!end)
        return 0;
    size_t items = 0;
    for (const char *p = box; (p = strstr(p, "<li>")) != NULL && p < end; p += 4)
        items++;
    for (size_t i = 0; i < nc; i++) {
        char want[2048];
        escaped(want, sizeof want, c[i]);
        const char *at = strstr(box, want);
        if (!at || at > end)
            return 0;
    }
    return items == nc;
}

TEST(the_aim_report_holds_every_solution_the_figure_and_the_cautions_aim_prints)
{
    dragarc_scenario s;
    dragarc_error e;
    CHECK(dragarc_scenario_read(DATA_DIR "/ball-in-wind.json", "", &s, &e) == DRAGARC_OK);
    dragarc_aim_request q;
    dragarc_aim_request_default(&q);
    q.range = 60.0;
    dragarc_aim_result a;
    CHECK(dragarc_aim_solve(&s, &q, &a, &e) == DRAGARC_OK);
    CHECK(a.nsolutions == 2);
    dragarc_report *r;
    CHECK(dragarc_report_new(&r, s.name, "aim", &e) == DRAGARC_OK);
    CHECK(dragarc_report_set_scratch_dir(r, dir, &e) == DRAGARC_OK);
    CHECK(dragarc_report_aim(r, "ball-in-wind.json", &s, &q, &a, NULL, &e) == DRAGARC_OK);
    char *html = written(r, "aim.html");
    CHECK(html != NULL);
    if (html) {
        char cell[64];
        snprintf(cell, sizeof cell, "<td class=\"num\">%.4f</td>", a.solutions[1].elevation * 180.0 / 3.14159265358979323846);
        CHECK(strstr(html, "<td>1 (direct)</td>") != NULL && strstr(html, "<td>2 (lofted)</td>") != NULL);
        CHECK(strstr(html, cell) != NULL); /* the lofted elevation, as `aim` prints it */
        CHECK(strstr(html, "<th scope=\"col\" class=\"num\">impact speed (m/s)</th>") != NULL);
        CHECK(strstr(html, "maximum range</th><td>96.31 m at 40.557 deg") != NULL); /* as `aim` prints it */
        CHECK(count(html, "<figure>") == 1 && count(html, "<svg ") == 1);
        CHECK(strstr(html, "Brent, R. P. (1973)") != NULL);
        unsigned notes = a.solutions[0].notes | a.solutions[1].notes;
        const char *c[DRAGARC_CAUTIONS_MAX];
        size_t nc = dragarc_cautions_notes(notes, c, DRAGARC_CAUTIONS_MAX);
        CHECK(nc >= 2 && cautions_exactly(html, c, nc));
    }
    CHECK(entries(dir) == 0);
    free(html);
    dragarc_report_free(r);
    dragarc_scenario_clear(&s);
}

TEST(the_sprinkler_report_holds_the_throw_profile_layout_figure_and_cautions)
{
    dragarc_sprinkler_spec sp;
    dragarc_error e;
    CHECK(dragarc_sprinkler_spec_read(EXAMPLES_DIR "/sprinkler-garden.json", &sp, &e) == DRAGARC_OK);
    dragarc_spectrum_class *cl = calloc(sp.nclasses, sizeof *cl);
    dragarc_sprinkler_result res;
    CHECK(cl && dragarc_sprinkler_spec_run(&sp, cl, NULL, NULL, &res, &e) == DRAGARC_OK);
    dragarc_report *r;
    CHECK(dragarc_report_new(&r, sp.base.name, "sprinkler", &e) == DRAGARC_OK);
    CHECK(dragarc_report_set_scratch_dir(r, dir, &e) == DRAGARC_OK);
    CHECK(dragarc_report_sprinkler(r, "sprinkler-garden.json", &sp, cl, &res, &e) == DRAGARC_OK);
    char *html = written(r, "sprinkler.html");
    CHECK(html != NULL);
    if (html) {
        CHECK(strstr(html, "<th scope=\"col\" class=\"num\">throw, mean (m)</th>") != NULL);
        CHECK(strstr(html, "<th scope=\"col\" class=\"num\">application rate (mm/h)</th>") != NULL);
        CHECK(count(html, "<table class=\"data\">") == 2); /* the throw by size and the profile */
        CHECK(strstr(html, "wetted radius</th><td>10.00 m") != NULL); /* as `sprinkler` prints it */
        CHECK(strstr(html, "Christiansen&#39;s CU</th><td>") != NULL && strstr(html, "Christiansen, J. E. (1942)") != NULL);
        CHECK(strstr(html, "Rosin, P. &amp; Rammler, E. (1933)") != NULL && strstr(html, "Ranz") != NULL);
        CHECK(count(html, "<figure>") == 1 && count(html, "<svg ") == 1);
        const char *c[DRAGARC_CAUTIONS_MAX];
        size_t nc = dragarc_cautions_notes(res.notes | DRAGARC_NOTE_IRRIGATION, c, DRAGARC_CAUTIONS_MAX);
        CHECK(nc >= 3 && cautions_exactly(html, c, nc));
    }
    CHECK(entries(dir) == 0);
    free(html);
    dragarc_report_free(r);
    dragarc_sprinkler_clear(&res);
    free(cl);
    dragarc_sprinkler_spec_clear(&sp);
}

TEST(the_drift_report_holds_the_deposit_distances_spectrum_figure_and_cautions)
{
    dragarc_drift_spec sp;
    dragarc_error e;
    CHECK(dragarc_drift_spec_read(EXAMPLES_DIR "/drift-boom.json", &sp, &e) == DRAGARC_OK);
    dragarc_spectrum_class *cl = calloc(sp.nclasses, sizeof *cl);
    dragarc_drift_result res;
    CHECK(cl && dragarc_drift_spec_run(&sp, cl, &res, &e) == DRAGARC_OK);
    dragarc_report *r;
    CHECK(dragarc_report_new(&r, sp.base.name, "drift", &e) == DRAGARC_OK);
    CHECK(dragarc_report_set_scratch_dir(r, dir, &e) == DRAGARC_OK);
    CHECK(dragarc_report_drift(r, "drift-boom.json", &sp, cl, &res, &e) == DRAGARC_OK);
    char *html = written(r, "drift.html");
    CHECK(html != NULL);
    if (html) {
        dragarc_spectrum_summary sum;
        CHECK(dragarc_spectrum_summarise(&sp.spectrum, &sum, &e) == DRAGARC_OK);
        char want[96];
        snprintf(want, sizeof want, "Dv10 %.4g \xc2\xb5m, Dv50 %.4g \xc2\xb5m, Dv90 %.4g \xc2\xb5m", sum.dv10 * 1e6,
                 sum.dv50 * 1e6, sum.dv90 * 1e6);
        CHECK(strstr(html, want) != NULL);
        CHECK(strstr(html, "90 % deposits</th><td>within 0.47 m downwind") != NULL); /* as `drift` prints it */
        CHECK(strstr(html, "airborne</th><td>1.220 % of the volume") != NULL);
        CHECK(strstr(html, "<th scope=\"col\" class=\"num\">deposit (% of the volume per m)</th>") != NULL);
        CHECK(strstr(html, "<th scope=\"col\">outcome</th>") != NULL && count(html, "<td>lands</td>") == 40);
        CHECK(count(html, "<figure>") == 1 && count(html, "<svg ") == 1);
        CHECK(strstr(html, "Picard, A.") != NULL && strstr(html, "Stull, R. B. (1988)") != NULL);
        const char *c[DRAGARC_CAUTIONS_MAX];
        size_t nc = dragarc_cautions_notes(res.notes | DRAGARC_NOTE_SPRAY_DRIFT, c, DRAGARC_CAUTIONS_MAX);
        CHECK(nc >= 3 && cautions_exactly(html, c, nc));
    }
    CHECK(entries(dir) == 0);
    free(html);
    dragarc_report_free(r);
    dragarc_drift_clear(&res);
    free(cl);
    dragarc_drift_spec_clear(&sp);
}

/* The footprint report: the summary's own numbers (the E_c of all fragments, each class's landed flights), the
 * published criteria as references, the maps, and exactly the debris cautions `footprint` prints. A small run
 * (60 samples a class) of the invented example keeps it quick; the numbers are compared with the same run's
 * summary, not with fixed values. */
TEST(the_footprint_report_holds_the_classes_summary_criteria_maps_and_cautions)
{
    dragarc_footprint_spec sp;
    dragarc_error e;
    CHECK(dragarc_footprint_spec_read(EXAMPLES_DIR "/footprint-rocket.json", &sp, &e) == DRAGARC_OK);
    sp.samples = 60;
    dragarc_impact *im = malloc(sp.nclasses * sp.samples * sizeof *im);
    dragarc_population pop;
    dragarc_footprint_summary s;
    memset(&pop, 0, sizeof pop);
    memset(&s, 0, sizeof s);
    CHECK(im && dragarc_population_uniform(&pop, sp.hazard.density, &e) == DRAGARC_OK);
    CHECK(dragarc_footprint_run(&sp, im, NULL, NULL, &e) == DRAGARC_OK);
    CHECK(dragarc_footprint_summarise(&sp, im, &pop, &s, &e) == DRAGARC_OK);
    dragarc_report *r;
    CHECK(dragarc_report_new(&r, sp.base.name, "footprint", &e) == DRAGARC_OK);
    CHECK(dragarc_report_set_scratch_dir(r, dir, &e) == DRAGARC_OK);
    /* a summary of another run is refused */
    dragarc_footprint_summary other = s;
    other.ngroups = 1;
    CHECK_ERROR(dragarc_report_footprint(r, "x.json", &sp, im, &other, &e), DRAGARC_EINVAL, e, "", "summarised run");
    CHECK(dragarc_report_footprint(r, "footprint-rocket.json", &sp, im, &s, &e) == DRAGARC_OK);
    char *html = written(r, "footprint.html");
    CHECK(html != NULL);
    if (html) {
        char want[128];
        snprintf(want, sizeof want, "expected casualties</th><td>E_c = %.3e</td>", s.casualty.expected_casualties);
        CHECK(strstr(html, want) != NULL);
        snprintf(want, sizeof want, "<td class=\"num\">%zu/%zu</td>", s.groups[0].landed, s.groups[0].flights);
        CHECK(strstr(html, want) != NULL);
        CHECK(strstr(html, "Published criteria, for comparison only (not an approval)") != NULL);
        CHECK(strstr(html, "14 CFR 450.101") != NULL);
        CHECK(count(html, "<figure>") == 1 && count(html, "<svg ") == 1);
        CHECK(strstr(html, "Matsumoto, M. &amp; Nishimura") != NULL && strstr(html, "Karney") != NULL);
        const char *c[DRAGARC_CAUTIONS_MAX];
        size_t nc = dragarc_cautions_notes(DRAGARC_NOTE_DEBRIS, c, DRAGARC_CAUTIONS_MAX);
        CHECK(nc >= 2 && cautions_exactly(html, c, nc));
    }
    CHECK(entries(dir) == 0);
    free(html);
    dragarc_report_free(r);
    dragarc_footprint_summary_clear(&s);
    dragarc_population_clear(&pop);
    free(im);
    dragarc_footprint_spec_clear(&sp);
}

/* Every warning `fit` prints for r is a paragraph "Warning: ..." of the page, and there are no others. */
static int fit_warnings_exactly(const char *html, const dragarc_fit_result *r)
{
    char warn[8][512], want[1200];
    size_t nw = dragarc_fit_warnings(r, warn, 8);
    for (size_t i = 0; i < nw; i++) {
        strcpy(want, "<p>Warning: "); /* the tags as they are, the text escaped */
        escaped(want + strlen(want), sizeof want - strlen(want) - 8, warn[i]);
        strcat(want, "</p>");
        if (!strstr(html, want))
            return 0;
    }
    return count(html, "<p>Warning: ") == (int)nw;
}

/* The row of the estimates table for estimate k of r: name, unit, start, value, standard error, 95 % interval, each
 * as `fit` quotes it (the value to the decimals its standard error supports, dragarc_fit_decimals). */
static void estimate_row(char *out, size_t n, const dragarc_fit_result *r, int k)
{
    const int p = r->param[k];
    const double se = dragarc_fit_param_shown(p, r->se[k]);
    const int d = dragarc_fit_decimals(se);
    snprintf(out, n,
             "<tr><td>%s</td><td>%s</td><td class=\"num\">%.*f</td><td class=\"num\">%.*f</td><td class=\"num\">%.2g"
             "</td><td class=\"num\">%.*f</td><td class=\"num\">%.*f</td></tr>",
             dragarc_fit_param_name(r->param[k]), dragarc_fit_param_unit(p), d < 4 ? 4 : d,
             dragarc_fit_param_shown(p, r->start[k]), d, dragarc_fit_param_shown(p, r->value[k]), se, d,
             dragarc_fit_param_shown(p, r->lower[k]), d, dragarc_fit_param_shown(p, r->upper[k]));
}

/* A fit and what it was made from: the launcher example (docs/examples), its track, the result and the fitted
 * scenario. */
typedef struct fit_case {
    dragarc_scenario s, fitted;
    dragarc_track track;
    dragarc_fit_result res;
    dragarc_fit_options o;
} fit_case;

/* The example's scenario and track, options at their defaults estimating `estimate`; 1 when read. */
static int fit_case_read(fit_case *c, const char *estimate)
{
    dragarc_error e;
    memset(c, 0, sizeof *c);
    dragarc_fit_options_default(&c->o);
    return dragarc_fit_params_parse(estimate, &c->o.estimate, &e) == DRAGARC_OK &&
           dragarc_scenario_read(EXAMPLES_DIR "/launcher-ball.json", "", &c->s, &e) == DRAGARC_OK &&
           dragarc_track_read(EXAMPLES_DIR "/launcher-ball-track.csv", &c->track, &e) == DRAGARC_OK;
}

static void fit_case_clear(fit_case *c)
{
    dragarc_fit_result_clear(&c->res);
    dragarc_scenario_clear(&c->fitted);
    dragarc_track_clear(&c->track);
    dragarc_scenario_clear(&c->s);
}

/* The fit report of c (options o, NULL: the defaults), written as `name`: its text (caller frees), NULL on failure.
 * The figure's scratch files are gone afterwards. */
static char *fit_report(const fit_case *c, const dragarc_fit_options *o, const char *track_file, const char *name)
{
    dragarc_report *r;
    dragarc_error e;
    char *html = NULL;
    if (dragarc_report_new(&r, c->s.name, "fit", &e) != DRAGARC_OK)
        return NULL;
    dragarc_report_set_date(r, 86400);
    if (dragarc_report_set_scratch_dir(r, dir, &e) == DRAGARC_OK &&
        dragarc_report_fit(r, "launcher-ball.json", track_file, &c->s, o, &c->track, &c->res, &c->fitted, &e) ==
            DRAGARC_OK)
        html = written(r, name);
    dragarc_report_free(r);
    CHECK(entries(dir) == 0);
    return html;
}

/* The fit report of the invented launcher example (a track with standard deviations, four estimates): the numbers
 * are dragarc_fit_run's own for the same inputs, formatted as `fit` prints them, not fixed values. */
TEST(the_fit_report_holds_the_track_estimates_correlations_figure_and_cautions)
{
    fit_case c;
    dragarc_error e;
    CHECK(fit_case_read(&c, "cd,cl,launch.speed,launch.elevation"));
    CHECK(dragarc_fit_run(&c.s, &c.track, &c.o, &c.res, &c.fitted, &e) == DRAGARC_OK);
    const dragarc_fit_result *res = &c.res;
    const dragarc_track *track = &c.track;
    CHECK(res->converged && res->np == 4 && res->weighted);
    /* a result that is not a fit of this track is refused */
    dragarc_report *r;
    CHECK(dragarc_report_new(&r, c.s.name, "fit", &e) == DRAGARC_OK);
    dragarc_fit_result other = c.res;
    other.npoints = track->n - 1;
    CHECK_ERROR(dragarc_report_fit(r, "x.json", "t.csv", &c.s, &c.o, track, &other, &c.fitted, &e), DRAGARC_EINVAL, e,
                "", "a fit of this track");
    dragarc_report_free(r);
    char *html = fit_report(&c, &c.o, "launcher-ball-track.csv", "fit.html");
    CHECK(html != NULL);
    if (html) {
        char want[1024];
        CHECK(strstr(html, "<h1>launcher ball test</h1>") != NULL);
        CHECK(strstr(html, "track file launcher-ball-track.csv") != NULL);
        snprintf(want, sizeof want, "points</th><td>%zu, from t = %.4g s to %.4g s after launch</td>", track->n,
                 track->t[0], track->t[track->n - 1]);
        CHECK(strstr(html, want) != NULL);
        CHECK(strstr(html, "weights</th><td>the track&#39;s standard deviations: positions 0.03 m</td>") != NULL);
        CHECK(strstr(html, "measured</th><td>positions (east, north, up)</td>") != NULL);
        for (int k = 0; k < res->np; k++) {
            estimate_row(want, sizeof want, res, k);
            CHECK(strstr(html, want) != NULL);
        }
        CHECK(strstr(html, "<td>launch.elevation</td><td>deg</td>") != NULL);
        /* the correlation of the two most correlated estimates, in the lower half of the matrix */
        int a = res->worst_pair[0], b = res->worst_pair[1], hi = a > b ? a : b;
        CHECK(fabs(res->worst_corr) > 0.5 && fabs(res->corr[hi * res->np + (a + b - hi)] - res->worst_corr) < 1e-15);
        char row[512];
        snprintf(row, sizeof row, "<tr><td>%s</td>", dragarc_fit_param_name(res->param[hi]));
        for (int j = 0; j < res->np; j++) {
            char cell[64] = "<td class=\"num\"></td>";
            if (j <= hi)
                snprintf(cell, sizeof cell, "<td class=\"num\">%.3f</td>", res->corr[hi * res->np + j]);
            strcat(row, cell);
        }
        CHECK(strstr(html, row) != NULL);
        snprintf(want, sizeof want, "chi-square</th><td>%.4g on %zu degrees of freedom (p = %.3g)", res->chisq,
                 res->dof, res->chisq_p);
        CHECK(strstr(html, want) != NULL);
        snprintf(want, sizeof want, "residual RMS, positions</th><td>%.4g m (east %.4g, north %.4g, up %.4g)</td>",
                 res->rms_pos[3], res->rms_pos[0], res->rms_pos[1], res->rms_pos[2]);
        CHECK(strstr(html, want) != NULL);
        snprintf(want, sizeof want, "reciprocal condition number %.3g of the scaled Jacobian", res->rcond);
        CHECK(strstr(html, want) != NULL);
        snprintf(want, sizeof want, "outcome</th><td>converged after %d iterations, %ld flights</td>", res->iterations,
                 res->flights);
        CHECK(strstr(html, want) != NULL);
        /* the last row along the track: the last point and its residuals */
        const size_t n = track->n - 1;
        snprintf(want, sizeof want, "<td class=\"num\">%.3f</td><td class=\"num\">%.3f</td>", track->t[n],
                 track->pos[3 * n]);
        CHECK(strstr(html, want) != NULL);
        CHECK(res->warnings == 0 && fit_warnings_exactly(html, res) && strstr(html, "<p>No warnings: the fit "));
        CHECK(count(html, "<table class=\"data\">") == 3 && count(html, "<table class=\"pairs\">") == 4);
        CHECK(count(html, "<figure>") == 1 && count(html, "<svg ") == 1 && strstr(html, "id=\"f1-") != NULL);
        CHECK(strstr(html, "Mor\xc3\xa9, J. J. (1978)") != NULL && strstr(html, "Transtrum, M. K. &amp; Sethna") != NULL &&
              strstr(html, "Seber, G. A. F. &amp; Wild, C. J. (1989)") != NULL);
        CHECK(strstr(html, "not needed in this fit") != NULL); /* auto, and plain steps sufficed */
        CHECK(strstr(html, "U.S. Standard Atmosphere 1976") != NULL);
        CHECK(strstr(html, "on 1970-01-02 00:00 UTC") != NULL);
        const char *cautions[DRAGARC_CAUTIONS_MAX];
        size_t nc = dragarc_cautions_fit(cautions, DRAGARC_CAUTIONS_MAX);
        CHECK(nc == 3 && cautions_exactly(html, cautions, nc));
    }
    free(html);
    fit_case_clear(&c);
}

/* A track of positions and velocities flown from the example itself at 30 m/s, each value moved by a fixed pattern of
 * about its standard deviation; one estimate (launch.speed): the velocity rows, one estimate's paragraph for the
 * correlations, and the warnings, if any, exactly as `fit` words them. */
TEST(the_fit_report_of_a_track_with_velocities_shows_their_weights_and_residuals)
{
    fit_case c;
    dragarc_error e;
    CHECK(fit_case_read(&c, "launch.speed"));
    dragarc_track_clear(&c.track);
    c.s.launch.speed = 30.0;
    enum { N = 30 };
    double times[N];
    for (int i = 0; i < N; i++)
        times[i] = 0.05 * (i + 1);
    dragarc_flight f;
    CHECK(dragarc_flight_run_at(&c.s, times, N, &f, &e) == DRAGARC_OK);
    char *csv = malloc(N * 200 + 100);
    CHECK(csv != NULL);
    if (!csv)
        return;
    size_t len = (size_t)sprintf(csv, "t,x,y,z,vx,vy,vz,sd,sd_v\n");
    for (size_t k = 1, i = 0; k < f.npoints && i < N; k++) {
        const dragarc_flight_point *q = &f.points[k];
        if (fabs(q->t - times[i]) > 1e-12)
            continue;
        const double m = sin(7.0 * (double)i); /* a fixed pattern in [-1, 1] */
        len += (size_t)sprintf(csv + len, "%.6f,%.6f,%.6f,%.6f,%.6f,%.6f,%.6f,0.02,0.1\n", q->t, q->pos[0] + 0.02 * m,
                               q->pos[1] - 0.02 * m, q->pos[2] + 0.02 * m, q->vel[0] - 0.1 * m, q->vel[1] + 0.1 * m,
                               q->vel[2] - 0.1 * m);
        i++;
    }
    dragarc_flight_clear(&f);
    CHECK(dragarc_track_parse(csv, &c.track, &e) == DRAGARC_OK && c.track.n == N && c.track.vel != NULL);
    free(csv);
    c.s.launch.speed = 28.0; /* the start */
    CHECK(dragarc_fit_run(&c.s, &c.track, &c.o, &c.res, &c.fitted, &e) == DRAGARC_OK);
    CHECK(c.res.np == 1 && c.res.nresiduals == 6 * N && fabs(c.res.value[0] - 30.0) < 0.1);
    char *html = fit_report(&c, NULL, "memory.csv", "fit-velocities.html");
    CHECK(html != NULL);
    if (html) {
        char want[512];
        CHECK(strstr(html, "measured</th><td>positions and velocities (east, north, up)</td>") != NULL);
        CHECK(strstr(html, "velocity weights</th><td>standard deviations 0.1 m/s</td>") != NULL);
        snprintf(want, sizeof want, "residuals</th><td>%d (6 a point), %d degrees of freedom</td>", 6 * N, 6 * N - 1);
        CHECK(strstr(html, want) != NULL);
        snprintf(want, sizeof want, "residual RMS, velocities</th><td>%.4g m/s (east %.4g, north %.4g, up %.4g)</td>",
                 c.res.rms_vel[3], c.res.rms_vel[0], c.res.rms_vel[1], c.res.rms_vel[2]);
        CHECK(strstr(html, want) != NULL);
        estimate_row(want, sizeof want, &c.res, 0);
        CHECK(strstr(html, want) != NULL && strstr(html, "<td>launch.speed</td><td>m/s</td>") != NULL);
        CHECK(strstr(html, "<p>One estimate: no correlations.</p>") != NULL);
        CHECK(strstr(html, "weakest combination") == NULL && strstr(html, "most correlated") == NULL);
        CHECK(fit_warnings_exactly(html, &c.res));
        CHECK(count(html, "<table class=\"data\">") == 2); /* the estimates and the track's points */
        const char *cautions[DRAGARC_CAUTIONS_MAX];
        CHECK(cautions_exactly(html, cautions, dragarc_cautions_fit(cautions, DRAGARC_CAUTIONS_MAX)));
    }
    free(html);
    fit_case_clear(&c);
}

/* The example's positions without their standard deviations (an unweighted fit) and one iteration allowed: the
 * residual standard deviation instead of chi-square, and the warning that the fit did not converge, first. */
TEST(the_fit_report_of_an_unweighted_fit_that_ran_out_of_iterations_says_so_first)
{
    fit_case c;
    dragarc_error e;
    CHECK(fit_case_read(&c, "cd,cl,launch.speed,launch.elevation"));
    free(c.track.pos_sd);
    c.track.pos_sd = NULL;
    c.o.max_iterations = 1;
    c.o.accel = DRAGARC_FIT_ACCEL_OFF;
    CHECK(dragarc_fit_run(&c.s, &c.track, &c.o, &c.res, &c.fitted, &e) == DRAGARC_OK);
    CHECK(!c.res.converged && !c.res.weighted && (c.res.warnings & DRAGARC_FIT_NOT_CONVERGED));
    char *html = fit_report(&c, &c.o, "t.csv", "fit-unweighted.html");
    CHECK(html != NULL);
    if (html) {
        char want[512];
        CHECK(fit_warnings_exactly(html, &c.res) && strstr(html, "<p>No warnings") == NULL);
        /* the first warning comes before the estimates */
        const char *w = strstr(html, "<p>Warning: The fit did not converge in 1 iteration:");
        CHECK(w != NULL && w < strstr(html, "<td>cd</td>"));
        snprintf(want, sizeof want, "residual standard deviation</th><td>%.4g m on %zu degrees of freedom",
                 c.res.sigma, c.res.dof);
        CHECK(strstr(html, want) != NULL && strstr(html, "chi-square</th>") == NULL);
        CHECK(strstr(html, "weights</th><td>none given: an unweighted fit") != NULL);
        CHECK(strstr(html, "geodesic acceleration</th><td>off: plain Levenberg-Marquardt only</td>") != NULL);
        CHECK(strstr(html, "iterations</th><td>at most 1 per attempt</td>") != NULL);
        CHECK(strstr(html, "outcome</th><td>NOT converged") != NULL);
        CHECK(strstr(html, "from Student&#39;s t") != NULL);
        for (int k = 0; k < c.res.np; k++) {
            estimate_row(want, sizeof want, &c.res, k);
            CHECK(strstr(html, want) != NULL);
        }
    }
    free(html);
    fit_case_clear(&c);
}

/* The campaign report: every case's row (its name, landed flights, E_c against its criterion), the published
 * criteria, one map, the debris cautions exactly as `campaign` prints them, and the sources; no case refused. The
 * rows are made up here: the report only formats them. */
TEST(the_campaign_report_holds_every_case_the_criteria_the_map_and_the_cautions)
{
    dragarc_campaign c;
    dragarc_error e;
    CHECK(dragarc_campaign_parse("{\"name\": \"two breakups\", \"scenario\": \"x.json\", \"cases\": [{\"name\": "
                                 "\"early\"}, {\"name\": \"late <2>\"}]}", "", &c, &e) == DRAGARC_OK);
    dragarc_campaign_row rows[2];
    memset(rows, 0, sizeof rows);
    for (int i = 0; i < 2; i++) {
        dragarc_campaign_row *w = &rows[i];
        snprintf(w->name, sizeof w->name, "%s", c.cases[i].name);
        w->latitude = 34.5 + 0.05 * i, w->longitude = -106.5, w->altitude = 9000.0 * (i + 1), w->speed = 500;
        w->flights = 90, w->landed = 90 - i;
        w->mean_ok = w->ellipse_ok = w->casualty_done = 1;
        w->mean_east = 9000.0 * (i + 1), w->mean_north = 1000.0;
        CHECK(dragarc_geo_from_local(w->latitude, w->longitude, w->mean_east, w->mean_north, &w->mean_latitude,
                                     &w->mean_longitude, &e) == DRAGARC_OK);
        w->semi_major = 3000, w->semi_minor = 1500, w->azimuth = 1.6, w->hazardous_share = 0.18;
        w->expected_casualties = i ? 2e-4 : 5e-5, w->criterion = 1e-4;
    }
    dragarc_report *r;
    CHECK(dragarc_report_new(&r, c.name, "campaign", &e) == DRAGARC_OK);
    CHECK(dragarc_report_set_scratch_dir(r, dir, &e) == DRAGARC_OK);
    CHECK_ERROR(dragarc_report_campaign(r, "two.json", &c, rows, 0, &e), DRAGARC_EINVAL, e, "", "at least one case");
    CHECK(dragarc_report_campaign(r, "two.json", &c, rows, 2, &e) == DRAGARC_OK);
    char *html = written(r, "campaign.html");
    CHECK(html != NULL);
    if (html) {
        CHECK(strstr(html, "<td>early</td>") && strstr(html, "<td>late &lt;2&gt;</td>"));
        CHECK(strstr(html, "90 of 90") && strstr(html, "89 of 90"));
        CHECK(strstr(html, "5.000e-05") && strstr(html, "2.000e-04"));
        CHECK(strstr(html, "<td>within</td>") && strstr(html, "<td>ABOVE</td>"));
        CHECK(strstr(html, "9000, 1000") && strstr(html, "18000, 1000") && strstr(html, "3000 x 1500, 92"));
        CHECK(strstr(html, "Published criteria, for comparison only (not an approval)") != NULL);
        CHECK(count(html, "<figure>") == 1 && count(html, "<svg ") == 1);
        CHECK(strstr(html, "RFC 7386") && strstr(html, "Karney"));
        const char *k[DRAGARC_CAUTIONS_MAX];
        size_t nc = dragarc_cautions_notes(DRAGARC_NOTE_DEBRIS, k, DRAGARC_CAUTIONS_MAX);
        CHECK(nc >= 2 && cautions_exactly(html, k, nc));
    }
    CHECK(entries(dir) == 0);
    free(html);
    dragarc_report_free(r);
    dragarc_campaign_clear(&c);
}

int main(void)
{
    dragarc_init();
    snprintf(dir, sizeof dir, "/tmp/dragarc-test-report-XXXXXX");
    if (!mkdtemp(dir)) {
        perror("mkdtemp");
        return 2;
    }
    RUN(every_text_is_escaped);
    RUN(figures_get_ids_of_their_own_and_scale_to_the_page);
    RUN(svg_that_reaches_outside_the_page_is_refused);
    RUN(a_failed_figure_leaves_the_scratch_folder_clean);
    RUN(a_failed_write_leaves_no_file_and_an_old_one_untouched);
    RUN(the_fly_report_holds_the_inputs_results_figure_cautions_and_sources);
    RUN(the_aim_report_holds_every_solution_the_figure_and_the_cautions_aim_prints);
    RUN(the_sprinkler_report_holds_the_throw_profile_layout_figure_and_cautions);
    RUN(the_drift_report_holds_the_deposit_distances_spectrum_figure_and_cautions);
    RUN(the_footprint_report_holds_the_classes_summary_criteria_maps_and_cautions);
    RUN(the_fit_report_holds_the_track_estimates_correlations_figure_and_cautions);
    RUN(the_fit_report_of_a_track_with_velocities_shows_their_weights_and_residuals);
    RUN(the_fit_report_of_an_unweighted_fit_that_ran_out_of_iterations_says_so_first);
    RUN(the_campaign_report_holds_every_case_the_criteria_the_map_and_the_cautions);
    rmdir(dir);
    return check_summary();
}
