/* report_html.c: the report's document model and its HTML writer (one self-contained page).
 * SPDX-License-Identifier: GPL-3.0-or-later
 *
 * The page carries its CSS in a <style> element and its figures as inline <svg> elements: no scripts, no external
 * references, so it reads the same from a mail attachment or an archive years later, and prints to PDF from any
 * browser (print rules: @page margins that suit A4 and Letter, no page break inside a figure, a table or the
 * cautions). Text goes through one escaper (& < > " '). A figure's SVG is made fit to share a page with others:
 * the prolog goes, every id gets the figure's prefix ("f2-") and so does every reference to one, since cairo names
 * its glyphs, clips and surfaces alike in every file (glyph0-1, clip1, surface5) and ids are global in a page.
 */
#define _POSIX_C_SOURCE 200809L
#include <ctype.h>
#include <errno.h>
#include <stdio.h>
#include <stdlib.h>
#include <string.h>
#include <unistd.h>

#include "dragarc/output.h"
#include "dragarc/report.h"

typedef enum block_kind { B_SECTION, B_PARAGRAPH, B_PAIRS, B_TABLE, B_FIGURE, B_CAUTIONS } block_kind;

typedef struct block {
    block_kind kind;
    char *text;           /* heading, paragraph, caption (may be NULL) */
    char *svg;            /* figure: prepared <svg> element */
    size_t ncols, nrows;  /* pairs: 2 columns; table: headings, then nrows rows; cautions: nrows items */
    char **cells;         /* table: ncols headings first */
    int *numeric;         /* table: per column */
} block;

struct dragarc_report {
    char *title, *command, *scratch;
    char **subtitles;
    size_t nsubtitles;
    block *blocks;
    size_t nblocks, cap;
    char **sources; /* topic, model, source: three per model */
    size_t nsources;
    size_t nfigures;
    int date_set;
    time_t date;
};

static int nomem(dragarc_error *err)
{
    return dragarc_error_set(err, DRAGARC_ENOMEM, "", "out of memory building the report");
}

static char *copy_text(const char *s)
{
    if (!s)
        return NULL;
    size_t n = strlen(s) + 1;
    char *c = malloc(n);
    if (c)
        memcpy(c, s, n);
    return c;
}

/* Copies of n strings (NULL ones become ""), or NULL when out of memory. */
static char **copy_texts(size_t n, const char *const *s)
{
    char **c = calloc(n ? n : 1, sizeof *c);
    for (size_t i = 0; c && i < n; i++) {
        if (!(c[i] = copy_text(s[i] ? s[i] : ""))) {
            for (size_t k = 0; k < i; k++)
                free(c[k]);
            free(c);
            return NULL;
        }
    }
    return c;
}

static void free_texts(char **c, size_t n)
{
    for (size_t i = 0; c && i < n; i++)
        free(c[i]);
    free(c);
}

int dragarc_report_new(dragarc_report **out, const char *title, const char *command, dragarc_error *err)
{
    *out = NULL;
    dragarc_report *r = calloc(1, sizeof *r);
    if (!r)
        return nomem(err);
    r->title = copy_text(title ? title : "");
    r->command = copy_text(command ? command : "");
    r->scratch = copy_text("/tmp");
    if (!r->title || !r->command || !r->scratch) {
        dragarc_report_free(r);
        return nomem(err);
    }
    *out = r;
    return DRAGARC_OK;
}

static void block_clear(block *b)
{
    free(b->text);
    free(b->svg);
    free_texts(b->cells, b->ncols * (b->kind == B_TABLE ? b->nrows + 1 : b->nrows));
    free(b->numeric);
}

void dragarc_report_free(dragarc_report *r)
{
    if (!r)
        return;
    for (size_t i = 0; i < r->nblocks; i++)
        block_clear(&r->blocks[i]);
    free(r->blocks);
    free_texts(r->subtitles, r->nsubtitles);
    free_texts(r->sources, 3 * r->nsources);
    free(r->title);
    free(r->command);
    free(r->scratch);
    free(r);
}

void dragarc_report_set_date(dragarc_report *r, time_t when)
{
    r->date = when;
    r->date_set = 1;
}

int dragarc_report_set_scratch_dir(dragarc_report *r, const char *dir, dragarc_error *err)
{
    char *c = copy_text(dir && *dir ? dir : "/tmp");
    if (!c)
        return nomem(err);
    free(r->scratch);
    r->scratch = c;
    return DRAGARC_OK;
}

/* Append to a growing array of strings. */
static int push_text(char ***list, size_t *n, const char *text)
{
    char **grown = realloc(*list, (*n + 1) * sizeof **list);
    if (!grown)
        return -1;
    *list = grown;
    if (!(grown[*n] = copy_text(text ? text : "")))
        return -1;
    (*n)++;
    return 0;
}

int dragarc_report_subtitle(dragarc_report *r, const char *text, dragarc_error *err)
{
    return push_text(&r->subtitles, &r->nsubtitles, text) == 0 ? DRAGARC_OK : nomem(err);
}

/* A new zeroed block at the end, or NULL when out of memory. */
static block *new_block(dragarc_report *r, block_kind kind, const char *text)
{
    if (r->nblocks == r->cap) {
        size_t cap = r->cap ? 2 * r->cap : 16;
        block *grown = realloc(r->blocks, cap * sizeof *grown);
        if (!grown)
            return NULL;
        r->blocks = grown;
        r->cap = cap;
    }
    block *b = &r->blocks[r->nblocks];
    memset(b, 0, sizeof *b);
    b->kind = kind;
    if (text && !(b->text = copy_text(text)))
        return NULL;
    r->nblocks++;
    return b;
}

int dragarc_report_section(dragarc_report *r, const char *heading, dragarc_error *err)
{
    return new_block(r, B_SECTION, heading ? heading : "") ? DRAGARC_OK : nomem(err);
}

int dragarc_report_paragraph(dragarc_report *r, const char *text, dragarc_error *err)
{
    return new_block(r, B_PARAGRAPH, text ? text : "") ? DRAGARC_OK : nomem(err);
}

int dragarc_report_pairs(dragarc_report *r, const char *caption, size_t n, const char *const *pairs,
                         dragarc_error *err)
{
    block *b = new_block(r, B_PAIRS, caption);
    if (!b)
        return nomem(err);
    b->ncols = 2;
    if (!(b->cells = copy_texts(2 * n, pairs)))
        return nomem(err);
    b->nrows = n;
    return DRAGARC_OK;
}

int dragarc_report_table(dragarc_report *r, const char *caption, size_t ncols, const char *const *headings,
                         const int *numeric, size_t nrows, const char *const *cells, dragarc_error *err)
{
    if (ncols == 0)
        return dragarc_error_set(err, DRAGARC_EINVAL, "", "a report table needs at least one column");
    block *b = new_block(r, B_TABLE, caption);
    if (!b)
        return nomem(err);
    char **all = calloc(ncols * (nrows + 1), sizeof *all);
    b->numeric = calloc(ncols, sizeof *b->numeric);
    if (!all || !b->numeric) {
        free(all);
        return nomem(err);
    }
    for (size_t k = 0; k < ncols * (nrows + 1); k++) {
        const char *s = k < ncols ? headings[k] : cells[k - ncols];
        if (!(all[k] = copy_text(s ? s : ""))) {
            free_texts(all, k);
            return nomem(err);
        }
    }
    for (size_t j = 0; j < ncols; j++)
        b->numeric[j] = numeric ? numeric[j] : 0;
    b->cells = all;
    b->ncols = ncols;
    b->nrows = nrows;
    return DRAGARC_OK;
}

int dragarc_report_cautions(dragarc_report *r, size_t n, const char *const *cautions, dragarc_error *err)
{
    block *b = new_block(r, B_CAUTIONS, NULL);
    if (!b)
        return nomem(err);
    b->ncols = 1;
    if (!(b->cells = copy_texts(n, cautions)))
        return nomem(err);
    b->nrows = n;
    return DRAGARC_OK;
}

int dragarc_report_source(dragarc_report *r, const char *topic, const char *model, const char *source,
                          dragarc_error *err)
{
    size_t n = 3 * r->nsources;
    if (push_text(&r->sources, &n, topic) != 0 || push_text(&r->sources, &n, model) != 0 ||
        push_text(&r->sources, &n, source) != 0) {
        /* keep whole triples only */
        for (size_t k = 3 * r->nsources; k < n; k++)
            free(r->sources[k]);
        return nomem(err);
    }
    r->nsources++;
    return DRAGARC_OK;
}

/* ---- figures ---- */

/* The first place in s where word occurs, ignoring case; NULL when none. */
static const char *find_nocase(const char *s, const char *word)
{
    size_t n = strlen(word);
    for (; *s; s++) {
        size_t k = 0;
        while (k < n && s[k] && tolower((unsigned char)s[k]) == tolower((unsigned char)word[k]))
            k++;
        if (k == n)
            return s;
    }
    return NULL;
}

/* Why SVG text may not go into the page (a script, an event handler, a reference outside itself), or NULL. */
static const char *svg_refused(const char *svg)
{
    if (find_nocase(svg, "<script"))
        return "holds a script";
    if (find_nocase(svg, "<foreignObject"))
        return "holds foreign content";
    if (find_nocase(svg, "javascript:"))
        return "holds a script link";
    for (const char *p = svg; (p = find_nocase(p, "on")) != NULL; p++) {
        /* an attribute such as onload= : "on", letters, "=", after white space */
        if (p == svg || !isspace((unsigned char)p[-1]))
            continue;
        const char *q = p + 2;
        while (isalpha((unsigned char)*q))
            q++;
        if (q > p + 2 && *q == '=')
            return "holds an event handler";
    }
    for (const char *p = svg; (p = find_nocase(p, "href=")) != NULL; p++) {
        char c = p[5] == '"' || p[5] == '\'' ? p[6] : p[5];
        if (c != '#' && strncmp(p + (p[5] == '"' || p[5] == '\'' ? 6 : 5), "data:", 5) != 0)
            return "refers to something outside itself";
    }
    for (const char *p = svg; (p = find_nocase(p, "url(")) != NULL; p++)
        if (p[4] != '#')
            return "refers to something outside itself";
    return NULL;
}

/* The value of attribute name in the tag text [tag, end), into buf; 0 when found. */
static int attribute(const char *tag, const char *end, const char *name, char *buf, size_t size)
{
    size_t n = strlen(name);
    for (const char *p = tag; p + n + 2 < end; p++) {
        if (!isspace((unsigned char)p[0]) || strncmp(p + 1, name, n) != 0 || p[n + 1] != '=')
            continue;
        char q = p[n + 2];
        if (q != '"' && q != '\'')
            continue;
        const char *v = p + n + 3, *e = memchr(v, q, (size_t)(end - v));
        if (!e)
            return -1;
        snprintf(buf, size, "%.*s", (int)(e - v), v);
        return 0;
    }
    return -1;
}

/* The root tag rewritten: the viewBox kept (or made from width and height), width 100 %, no fixed height, no
 * namespace declarations (the HTML parser knows svg and xlink:href), the other attributes as they were. */
static void write_root_tag(FILE *o, const char *tag, const char *end, const char *label)
{
    char box[128], w[64], h[64];
    if (attribute(tag, end, "viewBox", box, sizeof box) != 0) {
        double wv = 0.0, hv = 0.0;
        if (attribute(tag, end, "width", w, sizeof w) == 0)
            wv = strtod(w, NULL);
        if (attribute(tag, end, "height", h, sizeof h) == 0)
            hv = strtod(h, NULL);
        snprintf(box, sizeof box, "0 0 %g %g", wv > 0.0 ? wv : 600.0, hv > 0.0 ? hv : 450.0);
    }
    fprintf(o, "<svg viewBox=\"%s\" width=\"100%%\" preserveAspectRatio=\"xMidYMid meet\" role=\"img\"", box);
    if (label && *label) {
        fputs(" aria-label=\"", o);
        for (const char *c = label; *c; c++) {
            if (*c == '"')
                fputs("&quot;", o);
            else if (*c == '&')
                fputs("&amp;", o);
            else if (*c == '<')
                fputs("&lt;", o);
            else
                fputc(*c, o);
        }
        fputc('"', o);
    }
    static const char *const dropped[] = {"xmlns", "xmlns:xlink", "width", "height", "viewBox", "version", "role",
                                          "aria-label", "preserveAspectRatio"};
    const char *p = tag + 4;
    while (p < end) {
        while (p < end && isspace((unsigned char)*p))
            p++;
        const char *name = p;
        while (p < end && *p != '=' && !isspace((unsigned char)*p) && *p != '/')
            p++;
        size_t nlen = (size_t)(p - name);
        if (nlen == 0 || p >= end || *p != '=') {
            if (p < end)
                p++;
            continue;
        }
        char q = p[1];
        const char *v = p + 2, *e = (q == '"' || q == '\'') ? memchr(v, q, (size_t)(end - v)) : NULL;
        if (!e)
            break;
        int keep = 1;
        for (size_t k = 0; k < sizeof dropped / sizeof dropped[0]; k++)
            if (strlen(dropped[k]) == nlen && strncmp(name, dropped[k], nlen) == 0)
                keep = 0;
        if (keep)
            fprintf(o, " %.*s", (int)(e + 1 - name), name);
        p = e + 1;
    }
    fputc('>', o);
}

/* Copy text to o with prefix before every id and every reference to one. */
static void write_prefixed(FILE *o, const char *s, const char *prefix)
{
    for (const char *p = s; *p;) {
        size_t skip = 0;
        int after_space = p > s && (isspace((unsigned char)p[-1]) || p[-1] == ':');
        if (after_space && (strncmp(p, "id=\"", 4) == 0 || strncmp(p, "id='", 4) == 0))
            skip = 4;
        else if (after_space && (strncmp(p, "href=\"#", 7) == 0 || strncmp(p, "href='#", 7) == 0))
            skip = 7;
        else if (strncmp(p, "url(#", 5) == 0)
            skip = 5;
        if (skip) {
            fwrite(p, 1, skip, o);
            fputs(prefix, o);
            p += skip;
        } else {
            fputc(*p++, o);
        }
    }
}

/* The <svg> element of svg text made fit for the page, into *out (caller frees). */
static int prepare_svg(const char *svg, const char *prefix, const char *label, char **out, dragarc_error *err)
{
    *out = NULL;
    const char *start = strstr(svg, "<svg");
    const char *tag_end = start ? strchr(start, '>') : NULL;
    const char *close = start ? strstr(start, "</svg>") : NULL;
    if (!start || !tag_end || !close)
        return dragarc_error_set(err, DRAGARC_EINVAL, "", "the figure is not SVG: no <svg> element");
    const char *last;
    for (last = close; (close = strstr(close + 6, "</svg>")) != NULL;)
        last = close;
    const char *why = svg_refused(start);
    if (why)
        return dragarc_error_set(err, DRAGARC_EINVAL, "", "the figure's SVG %s", why);
    char *root = NULL, *text = NULL;
    size_t rn = 0, tn = 0;
    FILE *o = open_memstream(&root, &rn);
    if (!o)
        return nomem(err);
    write_root_tag(o, start, tag_end, label);
    fwrite(tag_end + 1, 1, (size_t)(last + 6 - (tag_end + 1)), o);
    if (fclose(o) != 0) {
        free(root);
        return nomem(err);
    }
    o = open_memstream(&text, &tn);
    if (!o) {
        free(root);
        return nomem(err);
    }
    write_prefixed(o, root, prefix);
    free(root);
    if (fclose(o) != 0) {
        free(text);
        return nomem(err);
    }
    *out = text;
    return DRAGARC_OK;
}

int dragarc_report_figure_svg(dragarc_report *r, const char *caption, const char *svg, dragarc_error *err)
{
    char prefix[32], *prepared;
    snprintf(prefix, sizeof prefix, "f%zu-", r->nfigures + 1);
    int rc = prepare_svg(svg ? svg : "", prefix, caption, &prepared, err);
    if (rc != DRAGARC_OK)
        return rc;
    block *b = new_block(r, B_FIGURE, caption);
    if (!b) {
        free(prepared);
        return nomem(err);
    }
    b->svg = prepared;
    r->nfigures++;
    return DRAGARC_OK;
}

int dragarc_report_figure_draw(dragarc_report *r, const char *caption, dragarc_report_draw_fn draw, const void *ctx,
                               dragarc_error *err)
{
    char dir[4096], path[4200];
    if (snprintf(dir, sizeof dir, "%s/dragarc-report-XXXXXX", r->scratch) >= (int)sizeof dir)
        return dragarc_error_set(err, DRAGARC_EIO, "", "the scratch folder's name is too long: %s", r->scratch);
    if (!mkdtemp(dir))
        return dragarc_error_set(err, DRAGARC_EIO, "", "cannot make a scratch folder in %s for the figure: %s",
                                 r->scratch, strerror(errno));
    snprintf(path, sizeof path, "%s/figure.svg", dir);
    char *svg = NULL;
    int rc = draw(path, ctx, err);
    if (rc == DRAGARC_OK && (rc = dragarc_text_file_read(path, (size_t)256 << 20, &svg, err)) != DRAGARC_OK)
        dragarc_error_set(err, rc, "", "cannot read the figure drawn into %s back: %s", path, err->message);
    unlink(path);
    rmdir(dir);
    if (rc == DRAGARC_OK)
        rc = dragarc_report_figure_svg(r, caption, svg, err);
    free(svg);
    return rc;
}

static int draw_plot(const char *path, const void *ctx, dragarc_error *err)
{
    return dragarc_plot_write(path, ctx, err);
}

int dragarc_report_figure_plot(dragarc_report *r, const char *caption, const dragarc_plot_figure *fig,
                               dragarc_error *err)
{
    return dragarc_report_figure_draw(r, caption, draw_plot, fig, err);
}

/* ---- the HTML page ---- */

static const char CSS[] =
    ":root{--ink:#1c2430;--muted:#566170;--rule:#d6dbe1;--accent:#0b5cad;--band:#f2f5f8;--warn:#9a4300;"
    "--warnbg:#fff7ea;--warnline:#e3a857}\n"
    "html{font-family:\"DejaVu Sans\",\"Helvetica Neue\",Arial,sans-serif;font-size:15px;line-height:1.5;"
    "color:var(--ink);background:#fff}\n"
    "body{max-width:56rem;margin:0 auto;padding:2rem 2.2rem 2.5rem}\n"
    "header{border-bottom:3px solid var(--accent);padding-bottom:.8rem;margin-bottom:1.2rem}\n"
    "header .kind{margin:0;font-size:.78rem;font-weight:bold;letter-spacing:.09em;text-transform:uppercase;"
    "color:var(--accent)}\n"
    "h1{font-size:1.85rem;line-height:1.2;margin:.25rem 0 .45rem}\n"
    "header .meta{margin:.1rem 0;color:var(--muted);font-size:.9rem}\n"
    "h2{font-size:1.2rem;margin:1.9rem 0 .7rem;padding-bottom:.25rem;border-bottom:1px solid var(--rule)}\n"
    "p{margin:.5rem 0 .9rem}\n"
    ".wide{overflow-x:auto}\n"
    "table{border-collapse:collapse;margin:.3rem 0 1.3rem;font-size:.9rem}\n"
    "caption{caption-side:top;text-align:left;font-weight:bold;padding:0 0 .35rem}\n"
    "th,td{padding:.28rem .75rem;border-bottom:1px solid var(--rule);text-align:left;vertical-align:top}\n"
    "thead th{background:var(--band);border-bottom:2px solid var(--ink)}\n"
    "table.pairs{width:100%}\n"
    "table.pairs th{width:13rem;font-weight:normal;color:var(--muted);white-space:nowrap}\n"
    ".num{text-align:right;font-variant-numeric:tabular-nums;white-space:nowrap}\n"
    "thead th.num{white-space:normal}\n"
    "tbody tr:nth-child(even) td{background:#fafbfc}\n"
    "figure{margin:.6rem 0 1.6rem}\n"
    "figure svg{display:block;width:100%;height:auto;border:1px solid var(--rule)}\n"
    "figcaption{margin-top:.45rem;font-size:.88rem;color:var(--muted)}\n"
    "figcaption b{color:var(--ink)}\n"
    ".cautions{border:1px solid var(--warnline);border-left:6px solid var(--warn);background:var(--warnbg);"
    "border-radius:3px;padding:.7rem 1.1rem .5rem;margin:.4rem 0 1.2rem}\n"
    ".cautions .head{margin:0 0 .3rem;font-weight:bold;color:var(--warn)}\n"
    ".cautions ul{margin:.2rem 0 .4rem;padding-left:1.2rem}\n"
    ".cautions li{margin:.35rem 0}\n"
    "ul.sources{padding-left:1.2rem}\n"
    "ul.sources li{margin:.4rem 0}\n"
    "ul.sources .topic{font-weight:bold}\n"
    "ul.sources .source{color:var(--muted)}\n"
    "footer{margin-top:2.4rem;padding-top:.6rem;border-top:1px solid var(--rule);color:var(--muted);"
    "font-size:.85rem}\n"
    "@page{margin:18mm 16mm}\n"
    "@media print{html{font-size:10pt}body{max-width:none;margin:0;padding:0}"
    "*{-webkit-print-color-adjust:exact;print-color-adjust:exact}"
    "figure,table,.cautions,tr,li{break-inside:avoid;page-break-inside:avoid}"
    "h2,caption{break-after:avoid;page-break-after:avoid}"
    "thead{display:table-header-group}"
    "figure svg{max-height:228mm;border:none}"
    ".wide{overflow:visible}}\n";

/* Text with & < > " ' escaped. */
static void esc(FILE *fp, const char *s)
{
    for (; s && *s; s++) {
        switch (*s) {
        case '&': fputs("&amp;", fp); break;
        case '<': fputs("&lt;", fp); break;
        case '>': fputs("&gt;", fp); break;
        case '"': fputs("&quot;", fp); break;
        case '\'': fputs("&#39;", fp); break;
        default: fputc(*s, fp); break;
        }
    }
}

static void write_caption(FILE *fp, const char *caption)
{
    if (caption && *caption) {
        fputs("<caption>", fp);
        esc(fp, caption);
        fputs("</caption>\n", fp);
    }
}

static void write_block(FILE *fp, const block *b, size_t figure_no)
{
    switch (b->kind) {
    case B_SECTION: break; /* opened by the caller */
    case B_PARAGRAPH:
        fputs("<p>", fp);
        esc(fp, b->text);
        fputs("</p>\n", fp);
        break;
    case B_PAIRS:
        fputs("<table class=\"pairs\">\n", fp);
        write_caption(fp, b->text);
        fputs("<tbody>\n", fp);
        for (size_t i = 0; i < b->nrows; i++) {
            fputs("<tr><th scope=\"row\">", fp);
            esc(fp, b->cells[2 * i]);
            fputs("</th><td>", fp);
            esc(fp, b->cells[2 * i + 1]);
            fputs("</td></tr>\n", fp);
        }
        fputs("</tbody></table>\n", fp);
        break;
    case B_TABLE:
        fputs("<div class=\"wide\"><table class=\"data\">\n", fp);
        write_caption(fp, b->text);
        fputs("<thead><tr>", fp);
        for (size_t j = 0; j < b->ncols; j++) {
            fputs(b->numeric[j] ? "<th scope=\"col\" class=\"num\">" : "<th scope=\"col\">", fp);
            esc(fp, b->cells[j]);
            fputs("</th>", fp);
        }
        fputs("</tr></thead>\n<tbody>\n", fp);
        for (size_t i = 0; i < b->nrows; i++) {
            fputs("<tr>", fp);
            for (size_t j = 0; j < b->ncols; j++) {
                fputs(b->numeric[j] ? "<td class=\"num\">" : "<td>", fp);
                esc(fp, b->cells[(i + 1) * b->ncols + j]);
                fputs("</td>", fp);
            }
            fputs("</tr>\n", fp);
        }
        fputs("</tbody></table></div>\n", fp);
        break;
    case B_FIGURE:
        fputs("<figure>\n", fp);
        fputs(b->svg, fp);
        fprintf(fp, "\n<figcaption><b>Figure %zu.</b> ", figure_no);
        esc(fp, b->text);
        fputs("</figcaption>\n</figure>\n", fp);
        break;
    case B_CAUTIONS:
        fputs("<div class=\"cautions\" role=\"note\">\n<p class=\"head\">&#9888; Read before acting on these "
              "results</p>\n<ul>\n",
              fp);
        for (size_t i = 0; i < b->nrows; i++) {
            fputs("<li>", fp);
            esc(fp, b->cells[i]);
            fputs("</li>\n", fp);
        }
        fputs("</ul>\n</div>\n", fp);
        break;
    }
}

static void write_page(FILE *fp, const dragarc_report *r)
{
    fputs("<!DOCTYPE html>\n<html lang=\"en\">\n<head>\n<meta charset=\"utf-8\">\n"
          "<meta name=\"viewport\" content=\"width=device-width, initial-scale=1\">\n",
          fp);
    fprintf(fp, "<meta name=\"generator\" content=\"dragarc %s\">\n<title>", dragarc_version());
    esc(fp, r->title);
    fputs(" &#8212; dragarc ", fp);
    esc(fp, r->command);
    fprintf(fp, "</title>\n<style>\n%s</style>\n</head>\n<body>\n<header>\n<p class=\"kind\">dragarc ", CSS);
    esc(fp, r->command);
    fputs(" report</p>\n<h1>", fp);
    esc(fp, r->title);
    fputs("</h1>\n", fp);
    for (size_t i = 0; i < r->nsubtitles; i++) {
        fputs("<p class=\"meta\">", fp);
        esc(fp, r->subtitles[i]);
        fputs("</p>\n", fp);
    }
    fputs("</header>\n<main>\n", fp);
    int open = 0;
    size_t figure_no = 0;
    for (size_t i = 0; i < r->nblocks; i++) {
        const block *b = &r->blocks[i];
        if (b->kind == B_SECTION) {
            fputs(open ? "</section>\n<section>\n<h2>" : "<section>\n<h2>", fp);
            esc(fp, b->text);
            fputs("</h2>\n", fp);
            open = 1;
            continue;
        }
        if (b->kind == B_FIGURE)
            figure_no++;
        write_block(fp, b, figure_no);
    }
    if (open)
        fputs("</section>\n", fp);
    if (r->nsources > 0) {
        fputs("<section>\n<h2>Models and sources</h2>\n<ul class=\"sources\">\n", fp);
        for (size_t i = 0; i < r->nsources; i++) {
            char *const *t = r->sources + 3 * i;
            fputs("<li><span class=\"topic\">", fp);
            esc(fp, t[0]);
            fputs(":</span> ", fp);
            esc(fp, t[1]);
            if (t[2][0]) {
                fputs(" &#8212; <span class=\"source\">", fp);
                esc(fp, t[2]);
                fputs("</span>", fp);
            }
            fputs("</li>\n", fp);
        }
        fputs("</ul>\n</section>\n", fp);
    }
    fprintf(fp, "</main>\n<footer>\n<p>Made by dragarc %s", dragarc_version());
    if (r->date_set) {
        struct tm tm;
        char when[64];
        if (gmtime_r(&r->date, &tm) && strftime(when, sizeof when, "%Y-%m-%d %H:%M UTC", &tm) > 0)
            fprintf(fp, " on %s", when);
    }
    fputs(". dragarc is free software under the GNU General Public License, version 3 or later; its results are "
          "estimates from the models listed above.</p>\n</footer>\n</body>\n</html>\n",
          fp);
}

int dragarc_report_write_html(const dragarc_report *r, const char *path, dragarc_error *err)
{
    dragarc_output out;
    int rc = dragarc_output_open(&out, path, err);
    if (rc != DRAGARC_OK)
        return rc;
    write_page(out.fp, r);
    if (ferror(out.fp)) {
        dragarc_output_abort(&out);
        return dragarc_error_set(err, DRAGARC_EIO, "", "cannot write %s", path);
    }
    return dragarc_output_commit(&out, err);
}
