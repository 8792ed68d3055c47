/* plot.c: figures drawn by PLplot into SVG, PNG and PDF files; the only file that includes PLplot.
 * SPDX-License-Identifier: GPL-3.0-or-later
 *
 * A figure is one page of panels stacked top to bottom, one PLplot subpage each (plssub(1, n)). The page is drawn
 * by PLplot's cairo drivers (svgcairo, pngcairo, pdfcairo: Debian's plplot-driver-cairo) into a temporary file
 * made beside the destination by dragarc_output_open, which PLplot reopens by name (plsfnam), and is renamed
 * onto the destination only when plend has finished it.
 *
 * Colours: the eight colours of Okabe and Ito, "Color Universal Design (CUD): how to make figures and
 * presentations that are friendly to colorblind people" (2008), black, orange, sky blue, bluish green, yellow,
 * blue, vermillion, reddish purple, with the RGB values given there (recalled: 0/0/0, 230/159/0, 86/180/233,
 * 0/158/115, 240/228/66, 0/114/178, 213/94/0, 204/121/167). Printed in grey, series still differ: each has its own
 * line style (solid, dashed, dotted) or marker shape, and the callers pair the darkest colours with the lines.
 *
 * Errors: PLplot reports recoverable errors through plabort, which with plsError fills a buffer of ours instead
 * of printing, and fatal ones through plexit, which would print and exit after calling the handler set by
 * plsexit. Our handler records the message and longjmps back to dragarc_plot_write, which closes PLplot and
 * removes the temporary file. PLplot's state is global (plsc, its streams), so one figure is drawn at a time and
 * only on one thread: a call while another is drawing is refused. Checks made before PLplot is called (the
 * extension, the figure, the drivers present) keep PLplot from its interactive device prompt and its warnings.
 */
#define _DEFAULT_SOURCE /* M_PI */
#include <math.h>
#include <setjmp.h>
#include <stdlib.h>
#include <string.h>
#include <strings.h>

#include <plplot.h>

#include "dragarc/output.h"
#include "dragarc/plot.h"

/* cmap0 indices: 0 the background (white), 1 + c palette colour c, then a light grey for the grid, then the light
 * tints of the palette colours that fill polygons (TINT_SHARE of the colour, the rest white). */
#define PAL0 1
#define GRID_COLOUR (PAL0 + DRAGARC_PLOT_NCOLOURS)
#define TINT0 (GRID_COLOUR + 1)
#define NCOL0 (TINT0 + DRAGARC_PLOT_NCOLOURS)
#define TINT_SHARE 0.3

/* Page size: 600 x 900 points (8.3 x 12.5 in) for SVG and PDF, the same at 108 pixels an inch for PNG. */
#define PAGE_W_PT 600
#define PAGE_H_PT 900 /* the default; a figure may ask for another (dragarc_plot_figure.page_height) */
#define PAGE_H_MIN 200.0
#define PAGE_H_MAX 3000.0
#define PNG_DPI 108.0

/* The panel's viewport within its subpage (normalised): room for the title and legend above, labels left and
 * below. */
#define VP_XMIN 0.13
#define VP_XMAX 0.96
#define VP_XMAX_RASTER 0.80 /* with a colour bar at the right */
#define VP_YMIN 0.17
#define VP_YMAX 0.78
/* The least height and width of an equal-scale viewport, as shares of the room there is. */
#define MIN_HEIGHT 0.45
#define MIN_WIDTH 0.6

/* The sequential colour map viridis of van der Walt and Smith (matplotlib, 2015), as RGB at nine evenly spaced
 * stops, linearly interpolated between them by PLplot (plscmap1l) (recalled from matplotlib's table, rounded to
 * whole numbers). Its lightness rises monotonically from dark purple to yellow. */
#define NVIRIDIS 9
static const unsigned char VIRIDIS[NVIRIDIS][3] = {
    {68, 1, 84}, {71, 44, 122}, {59, 81, 139}, {44, 113, 142}, {33, 144, 141},
    {39, 173, 129}, {92, 200, 99}, {170, 220, 50}, {253, 231, 37},
};

static const unsigned char OKABE_ITO[DRAGARC_PLOT_NCOLOURS][3] = {
    {0, 0, 0}, {230, 159, 0}, {86, 180, 233}, {0, 158, 115}, {240, 228, 66}, {0, 114, 178}, {213, 94, 0}, {204, 121, 167},
};

/* The markers as UTF-8 glyphs, for the legend (pllegend draws its symbols as text, with the system's sans-serif
 * font through the cairo drivers); in the panels they are polygons, centred on their points exactly. */
/* Sizes on the page: a marker's radius and the wind arrow's length, mm. */
#define MARKER_MM 1.6
#define ARROW_MM 14.0

static const char *const MARKER_GLYPH[DRAGARC_PLOT_NMARKERS] = {
    "\xe2\x97\x8f", /* U+25CF black circle */
    "\xe2\x96\xb2", /* U+25B2 black up-pointing triangle */
    "\xe2\x96\xa0", /* U+25A0 black square */
    "\xe2\x97\x86", /* U+25C6 black diamond */
    "\xe2\x9c\x95", /* U+2715 multiplication x */
};

/* PLplot's predefined line styles (pllsty): 1 solid, 3 long dashes and gaps (2 mm), 2 short ones (1 mm). */
static const int LINE_STYLE[] = {1, 3, 2, 1};

/* The drawing in progress: PLplot's handlers have no user pointer, so they reach it here (one at a time). */
static struct {
    int busy;
    jmp_buf recover;
    char message[512]; /* the first error PLplot reported */
    PLINT errcode;     /* set by plabort through plsError */
    char errmsg[1024]; /* plabort writes its text here (sprintf) instead of printing it */
    double page_h;     /* the page's height, points */
} g_plot;

static int on_plexit(PLCHAR_VECTOR msg)
{
    if (!g_plot.message[0])
        snprintf(g_plot.message, sizeof g_plot.message, "%s", msg && *msg ? msg : "fatal error");
    longjmp(g_plot.recover, 1);
    return 1; /* not reached */
}

static void on_plabort(PLCHAR_VECTOR msg)
{
    if (!g_plot.message[0])
        snprintf(g_plot.message, sizeof g_plot.message, "%s", msg && *msg ? msg : "error");
}

const unsigned char *dragarc_plot_palette(dragarc_plot_colour c)
{
    return (int)c >= 0 && c < DRAGARC_PLOT_NCOLOURS ? OKABE_ITO[c] : NULL;
}

/* A family's colours: Okabe and Ito's, yellow left out for its poor contrast on white. */
static const dragarc_plot_colour FAMILY[] = {DRAGARC_PLOT_BLUE,         DRAGARC_PLOT_VERMILLION,
                                             DRAGARC_PLOT_BLUISH_GREEN, DRAGARC_PLOT_REDDISH_PURPLE,
                                             DRAGARC_PLOT_ORANGE,       DRAGARC_PLOT_SKY_BLUE};
enum { NFAMILY = sizeof FAMILY / sizeof FAMILY[0] };

void dragarc_plot_family_look(size_t k, dragarc_plot_series *s)
{
    static const dragarc_plot_style lines[3] = {DRAGARC_PLOT_SOLID, DRAGARC_PLOT_DASHED, DRAGARC_PLOT_DOTTED};
    /* the line style steps once more after each round of colours, so that (colour, style) repeats only after
     * 3 rounds */
    s->colour = FAMILY[k % NFAMILY];
    s->style = lines[(k + k / NFAMILY) % 3];
    s->marker = (dragarc_plot_marker)(k % DRAGARC_PLOT_NMARKERS);
}

static const char *const EXTENSION[] = {"svg", "png", "pdf"};
static const char *const DRIVER[] = {"svgcairo", "pngcairo", "pdfcairo"};

int dragarc_plot_format_from_path(const char *path, dragarc_plot_format *fmt, dragarc_error *err)
{
    const char *slash = path ? strrchr(path, '/') : NULL;
    const char *base = slash ? slash + 1 : path;
    const char *dot = base ? strrchr(base, '.') : NULL;
    if (dot && dot != base) {
        for (int k = 0; k < 3; k++) {
            if (strcasecmp(dot + 1, EXTENSION[k]) == 0) {
                *fmt = (dragarc_plot_format)k;
                return DRAGARC_OK;
            }
        }
        return dragarc_error_set(err, DRAGARC_EINVAL, "", "'%s' ends in '.%s': a plot is drawn into an .svg, .png or .pdf file",
                                 path, dot + 1);
    }
    return dragarc_error_set(err, DRAGARC_EINVAL, "", "'%s' has no extension: a plot is drawn into an .svg, .png or .pdf file",
                             path ? path : "");
}

/* The limits of what panel p shows: its own, or every finite point with 6 % to spare on each side. */
static int panel_limits(const dragarc_plot_panel *p, double lim[4])
{
    if (p->limits_given) {
        lim[0] = p->xmin, lim[1] = p->xmax, lim[2] = p->ymin, lim[3] = p->ymax;
        return lim[1] > lim[0] && lim[3] > lim[2] && isfinite(lim[0] + lim[1] + lim[2] + lim[3]) ? 0 : -1;
    }
    lim[0] = lim[2] = INFINITY;
    lim[1] = lim[3] = -INFINITY;
    if (p->raster) {
        const dragarc_plot_raster *r = p->raster;
        lim[0] = fmin(r->x0, r->x1), lim[1] = fmax(r->x0, r->x1);
        lim[2] = fmin(r->y0, r->y1), lim[3] = fmax(r->y0, r->y1);
    }
    for (size_t k = 0; k < p->nseries; k++) {
        const dragarc_plot_series *s = &p->series[k];
        for (size_t i = 0; i < s->n; i++) {
            if (!isfinite(s->x[i]) || !isfinite(s->y[i]))
                continue;
            lim[0] = fmin(lim[0], s->x[i]), lim[1] = fmax(lim[1], s->x[i]);
            lim[2] = fmin(lim[2], s->y[i]), lim[3] = fmax(lim[3], s->y[i]);
        }
    }
    if (!(lim[1] >= lim[0]))
        return -1;
    for (int a = 0; a < 4; a += 2) {
        double span = lim[a + 1] - lim[a];
        if (!(span > 1e-12 * fmax(fabs(lim[a]), fabs(lim[a + 1])))) /* one value: a unit (or 10 %) around it */
            span = lim[a] != 0.0 ? 0.2 * fabs(lim[a]) : 2.0, lim[a] -= 0.5 * span, lim[a + 1] += 0.5 * span;
        lim[a] -= 0.06 * span, lim[a + 1] += 0.06 * span;
    }
    return 0;
}

static int check_figure(const dragarc_plot_figure *fig, dragarc_error *err)
{
    if (!fig || fig->npanels == 0 || fig->npanels > DRAGARC_PLOT_MAX_PANELS || !fig->panels)
        return dragarc_error_set(err, DRAGARC_EINVAL, "", "a figure needs 1 to %d panels", DRAGARC_PLOT_MAX_PANELS);
    if (fig->page_height != 0.0 && !(fig->page_height >= PAGE_H_MIN && fig->page_height <= PAGE_H_MAX))
        return dragarc_error_set(err, DRAGARC_EINVAL, "", "a page is %g to %g points high", PAGE_H_MIN, PAGE_H_MAX);
    for (size_t k = 0; k < fig->npanels; k++) {
        const dragarc_plot_panel *p = &fig->panels[k];
        double lim[4];
        for (size_t j = 0; j < p->nseries; j++) {
            const dragarc_plot_series *s = &p->series[j];
            if ((s->n > 0 && (!s->x || !s->y)) || (int)s->colour < 0 || s->colour >= DRAGARC_PLOT_NCOLOURS ||
                (int)s->style < 0 || s->style > DRAGARC_PLOT_FILLED || (int)s->marker < 0 ||
                s->marker >= DRAGARC_PLOT_NMARKERS || !(s->marker_size >= 0.0 && s->marker_size <= 20.0))
                return dragarc_error_set(err, DRAGARC_EINVAL, "", "panel %zu, series %zu: no points, an unknown style "
                                         "or a marker size outside 0 to 20 mm",
                                         k + 1, j + 1);
        }
        const dragarc_plot_raster *r = p->raster;
        if (r && (!r->z || r->nx == 0 || r->ny == 0 || r->nx > 100000 || r->ny > 100000 ||
                  !(r->x1 > r->x0) || !(r->y1 > r->y0) || !isfinite(r->x0 + r->x1 + r->y0 + r->y1) ||
                  !isfinite(r->zmin) || !isfinite(r->zmax) || r->zmax < r->zmin))
            return dragarc_error_set(err, DRAGARC_EINVAL, "", "panel %zu: the colour map needs cells and finite, "
                                     "increasing limits", k + 1);
        if (panel_limits(p, lim) != 0)
            return dragarc_error_set(err, DRAGARC_EINVAL, "", "panel %zu ('%s') has no finite point to draw", k + 1,
                                     p->title ? p->title : "");
    }
    return DRAGARC_OK;
}

/* 1 when PLplot has driver `name` (a menu of its devices, without starting a device). */
static int driver_present(const char *name)
{
    enum { MAXDEV = 128 };
    const char *menu[MAXDEV], *dev[MAXDEV];
    const char **pm = menu, **pd = dev;
    int n = MAXDEV;
    plgDevs(&pm, &pd, &n);
    for (int i = 0; i < n; i++)
        if (dev[i] && strcmp(dev[i], name) == 0)
            return 1;
    return 0;
}

/* The finite points of series s into x, y (room for s->n); how many. */
static PLINT finite_points(const dragarc_plot_series *s, PLFLT *x, PLFLT *y)
{
    PLINT m = 0;
    for (size_t i = 0; i < s->n; i++)
        if (isfinite(s->x[i]) && isfinite(s->y[i]))
            x[m] = s->x[i], y[m] = s->y[i], m++;
    return m;
}

/* The current viewport's window and how long a millimetre of the page is in world units along each axis (signed:
 * a reversed axis has a negative one, so that offsets given "up the page" stay up the page). */
typedef struct frame {
    double wx0, wx1, wy0, wy1; /* the window as given to plwind: wx0 at the left, wy0 at the bottom */
    double mx, my;             /* world units per mm of the page */
} frame;

static void frame_get(frame *fr, double wx0, double wx1, double wy0, double wy1)
{
    PLFLT nx0, nx1, ny0, ny1;
    plgvpd(&nx0, &nx1, &ny0, &ny1); /* normalised coordinates of the whole page */
    fr->wx0 = wx0, fr->wx1 = wx1, fr->wy0 = wy0, fr->wy1 = wy1;
    fr->mx = (wx1 - wx0) / ((nx1 - nx0) * PAGE_W_PT * 25.4 / 72.0);
    fr->my = (wy1 - wy0) / ((ny1 - ny0) * g_plot.page_h * 25.4 / 72.0);
}

/* A marker of radius r (mm) at world point (x, y): a filled polygon (or a cross of two lines), so that its centre is
 * the point exactly, whatever the font. */
static void draw_marker(const frame *fr, dragarc_plot_marker m, double x, double y, double r)
{
    PLFLT px[24], py[24];
    PLINT k = 0;
    switch (m) {
    case DRAGARC_PLOT_TRIANGLE:
        for (int i = 0; i < 3; i++, k++) {
            double a = M_PI / 2.0 + 2.0 * M_PI * i / 3.0;
            px[k] = x + 1.3 * r * cos(a) * fr->mx, py[k] = y + 1.3 * r * sin(a) * fr->my;
        }
        break;
    case DRAGARC_PLOT_SQUARE:
    case DRAGARC_PLOT_DIAMOND: {
        double h = m == DRAGARC_PLOT_SQUARE ? 0.9 * r : 1.25 * r, a0 = m == DRAGARC_PLOT_SQUARE ? M_PI / 4.0 : 0.0;
        for (int i = 0; i < 4; i++, k++) {
            double a = a0 + M_PI / 2.0 * i, s = m == DRAGARC_PLOT_SQUARE ? M_SQRT2 : 1.0;
            px[k] = x + s * h * cos(a) * fr->mx, py[k] = y + s * h * sin(a) * fr->my;
        }
        break;
    }
    case DRAGARC_PLOT_CROSS: {
        PLFLT ax[2] = {x - r * fr->mx, x + r * fr->mx}, ay[2] = {y - r * fr->my, y + r * fr->my};
        PLFLT by[2] = {ay[1], ay[0]};
        plwidth(r < 1.0 ? 1.2 : 2.5);
        plline(2, ax, ay);
        plline(2, ax, by);
        plwidth(1.0);
        return;
    }
    default: { /* a small circle needs fewer sides to look round (and keeps a file of thousands of them small) */
        int sides = r < 1.0 ? 10 : 20;
        for (int i = 0; i < sides; i++, k++) {
            double a = 2.0 * M_PI * i / sides;
            px[k] = x + r * cos(a) * fr->mx, py[k] = y + r * sin(a) * fr->my;
        }
        break;
    }
    }
    plfill(k, px, py);
}

/* One run of finite points of a line or filled series. */
static void draw_run(const dragarc_plot_series *s, PLINT m, PLFLT *x, PLFLT *y)
{
    if (s->style == DRAGARC_PLOT_FILLED) {
        if (m >= 3) {
            plcol0(TINT0 + s->colour);
            plfill(m, x, y);
        }
        plcol0(PAL0 + s->colour);
        pllsty(1);
        plwidth(1.5);
    } else {
        pllsty(LINE_STYLE[s->style]);
        plwidth(2.5);
    }
    if (m > 1)
        plline(m, x, y);
    if (s->style == DRAGARC_PLOT_FILLED && m >= 3) { /* close the outline */
        PLFLT cx[2] = {x[m - 1], x[0]}, cy[2] = {y[m - 1], y[0]};
        plline(2, cx, cy);
    }
    pllsty(1);
    plwidth(1.0);
}

static void draw_series(const frame *fr, const dragarc_plot_series *s, PLFLT *x, PLFLT *y)
{
    plcol0(PAL0 + s->colour);
    if (s->style == DRAGARC_PLOT_MARKERS) {
        PLINT m = finite_points(s, x, y);
        for (PLINT i = 0; i < m; i++)
            draw_marker(fr, s->marker, x[i], y[i], s->marker_size > 0.0 ? s->marker_size : MARKER_MM);
        return;
    }
    PLINT m = 0; /* the run being gathered: a point that is not finite ends it */
    for (size_t i = 0; i <= s->n; i++) {
        if (i < s->n && isfinite(s->x[i]) && isfinite(s->y[i])) {
            x[m] = s->x[i], y[m] = s->y[i], m++;
            continue;
        }
        if (m > 0)
            draw_run(s, m, x, y);
        m = 0;
    }
}

/* The arrow of a panel near the upper left corner of the viewport, ARROW_MM long on the page, pointing along
 * (dx, dy) taken in the axes' directions (a reversed axis turns it; unequal scales do not bend it), its label to the
 * right. */
static void draw_arrow(const frame *fr, const dragarc_plot_arrow *a)
{
    double len = hypot(a->dx, a->dy);
    if (!(len > 0.0) || !isfinite(len))
        return;
    double ux = a->dx / len, uy = a->dy / len; /* world directions; fr->mx, fr->my carry the axes' signs */
    double sx = fr->mx > 0.0 ? 1.0 : -1.0, sy = fr->my > 0.0 ? 1.0 : -1.0;
    ux *= sx, uy *= sy; /* now in page directions */
    /* the centre, ARROW_MM and a bit from the left and top edges of the viewport */
    double cx = fr->wx0 + 1.1 * ARROW_MM * fr->mx, cy = fr->wy1 - 1.1 * ARROW_MM * fr->my;
#define PX(u) (cx + (u) * fr->mx)
#define PY(v) (cy + (v) * fr->my)
    double h = 0.5 * ARROW_MM, head = ARROW_MM / 3.0, half = ARROW_MM / 6.0;
    PLFLT lx[2] = {PX(-h * ux), PX((h - 0.5 * head) * ux)}, ly[2] = {PY(-h * uy), PY((h - 0.5 * head) * uy)};
    PLFLT tx[3] = {PX(h * ux), PX((h - head) * ux - half * uy), PX((h - head) * ux + half * uy)};
    PLFLT ty[3] = {PY(h * uy), PY((h - head) * uy + half * ux), PY((h - head) * uy - half * ux)};
    plcol0(PAL0 + a->colour);
    plwidth(3.0);
    plline(2, lx, ly);
    plwidth(1.0);
    plfill(3, tx, ty);
    if (a->label) {
        /* on a white ground, so that a map or curves under it do not hide it: its width from the character height
         * (plgchr, mm) at about 0.6 of it per character, generous for the sans-serif fonts fontconfig gives */
        PLFLT def, ht;
        plgchr(&def, &ht);
        double w = 0.6 * ht * (double)strlen(a->label) + 2.0, x0 = 0.9 * ARROW_MM - 1.0;
        PLFLT bx[4] = {PX(x0), PX(x0 + w), PX(x0 + w), PX(x0)};
        PLFLT by[4] = {PY(-0.8 * ht), PY(-0.8 * ht), PY(0.8 * ht), PY(0.8 * ht)};
        plcol0(0);
        plfill(4, bx, by);
        plcol0(PAL0 + a->colour);
        plptex(PX(0.9 * ARROW_MM), PY(0.0), fr->wx1 - fr->wx0, 0.0, 0.0, a->label);
    }
#undef PX
#undef PY
}

/* A round length (1, 2 or 5 times a power of ten) near `want`. */
static double round_length(double want)
{
    double p = pow(10.0, floor(log10(want))), m = want / p;
    return (m < 1.5 ? 1.0 : m < 3.5 ? 2.0 : m < 7.5 ? 5.0 : 10.0) * p;
}

/* A scale bar at the lower right of the viewport: a round length near a fifth of the x span, with end ticks and its
 * length above it, on a white ground so that points under it do not hide it. */
static void draw_scale_bar(const frame *fr, const char *unit)
{
    double span = fabs(fr->wx1 - fr->wx0), len = round_length(0.2 * span);
    if (!(len > 0.0) || !isfinite(len))
        return;
    double sx = fr->wx1 > fr->wx0 ? 1.0 : -1.0;
    double xr = fr->wx1 - 6.0 * fr->mx, xl = xr - sx * len, yb = fr->wy0 + 6.0 * fr->my;
    PLFLT bx[4] = {xl - 2.0 * fr->mx, xr + 2.0 * fr->mx, xr + 2.0 * fr->mx, xl - 2.0 * fr->mx};
    PLFLT by[4] = {yb - 2.5 * fr->my, yb - 2.5 * fr->my, yb + 6.5 * fr->my, yb + 6.5 * fr->my};
    plcol0(0);
    plfill(4, bx, by);
    plcol0(PAL0 + DRAGARC_PLOT_BLACK);
    PLFLT lx[2] = {xl, xr}, ly[2] = {yb, yb};
    plwidth(3.0);
    plline(2, lx, ly);
    for (int k = 0; k < 2; k++) {
        PLFLT tx[2] = {lx[k], lx[k]}, ty[2] = {yb - 1.2 * fr->my, yb + 1.2 * fr->my};
        plline(2, tx, ty);
    }
    plwidth(1.0);
    char text[64];
    snprintf(text, sizeof text, "%g %s", len, unit);
    plptex(0.5 * (xl + xr), yb + 2.2 * fr->my, 1.0, 0.0, 0.5, text);
}

/* An arrow pointing up the page at the upper right of the viewport, N above its head. */
static void draw_north_arrow(const frame *fr)
{
    double cx = fr->wx1 - 8.0 * fr->mx, cy = fr->wy1 - 14.0 * fr->my, h = 0.5 * ARROW_MM * 0.8;
    PLFLT lx[2] = {cx, cx}, ly[2] = {cy - h * fr->my, cy + (h - 3.0) * fr->my};
    PLFLT tx[3] = {cx, cx - 2.0 * fr->mx, cx + 2.0 * fr->mx};
    PLFLT ty[3] = {cy + h * fr->my, cy + (h - 4.5) * fr->my, cy + (h - 4.5) * fr->my};
    plcol0(PAL0 + DRAGARC_PLOT_BLACK);
    plwidth(3.0);
    plline(2, lx, ly);
    plwidth(1.0);
    plfill(3, tx, ty);
    plptex(cx, cy + (h + 4.0) * fr->my, 1.0, 0.0, 0.5, "N");
}

/* The colour range of raster r: its own, or that of its finite cells (a unit around one value). */
static void raster_range(const dragarc_plot_raster *r, double *zmin, double *zmax)
{
    if (r->zmax > r->zmin) {
        *zmin = r->zmin, *zmax = r->zmax;
        return;
    }
    double lo = INFINITY, hi = -INFINITY;
    for (size_t i = 0; i < r->nx * r->ny; i++)
        if (isfinite(r->z[i]))
            lo = fmin(lo, r->z[i]), hi = fmax(hi, r->z[i]);
    if (!(hi >= lo))
        lo = 0.0, hi = 1.0;
    if (!(hi > lo))
        hi = lo + (lo != 0.0 ? 0.1 * fabs(lo) : 1.0);
    *zmin = lo, *zmax = hi;
}

/* The raster of a panel as an image under the series (its colour bar is drawn last, by draw_colour_bar). Cells that
 * are not finite or below the range get a value below it, which plimage leaves undrawn. */
static void draw_raster(const dragarc_plot_raster *r)
{
    double zmin, zmax;
    raster_range(r, &zmin, &zmax);
    PLFLT *cells = malloc(r->nx * r->ny * sizeof *cells);
    PLFLT **cols = malloc(r->nx * sizeof *cols);
    PLFLT *xg = malloc((r->nx + 1 + r->ny + 1) * sizeof *xg);
    if (!cells || !cols || !xg) {
        free(cells);
        free(cols);
        free(xg);
        if (!g_plot.message[0])
            snprintf(g_plot.message, sizeof g_plot.message, "out of memory for the colour map");
        return;
    }
    double below = zmin - 1.0 - fabs(zmin);
    for (size_t i = 0; i < r->nx; i++) {
        cols[i] = cells + i * r->ny;
        for (size_t j = 0; j < r->ny; j++) {
            double z = r->z[j * r->nx + i];
            cols[i][j] = isfinite(z) && z >= zmin ? fmin(z, zmax) : below;
        }
    }
    /* the cells' edges, through pltr1: plimagefr maps cell (i, j) onto [xg[i], xg[i+1]] x [yg[j], yg[j+1]] */
    PLFLT *yg = xg + r->nx + 1;
    for (size_t i = 0; i <= r->nx; i++)
        xg[i] = r->x0 + (r->x1 - r->x0) * (double)i / (double)r->nx;
    for (size_t j = 0; j <= r->ny; j++)
        yg[j] = r->y0 + (r->y1 - r->y0) * (double)j / (double)r->ny;
    PLcGrid grid = {.xg = xg, .yg = yg, .nx = (PLINT)r->nx + 1, .ny = (PLINT)r->ny + 1};
    plimagefr((PLFLT_MATRIX)cols, (PLINT)r->nx, (PLINT)r->ny, r->x0, r->x1, r->y0, r->y1, zmin, zmax, zmin, zmax,
              pltr1, &grid);
    free(cells);
    free(cols);
    free(xg);
}

/* The colour bar of raster r, to the right of the current viewport: COLOUR_BAR_STEPS bands of the colour map
 * (filled polygons, so that the bar is vector in SVG and PDF), a frame with the values on its right, the raster's
 * label beyond them. PLplot's own plcolorbar is not used: on a page of several subpages it drew nothing on any
 * subpage but the last. Changes the viewport: call it last on a panel. */
#define COLOUR_BAR_STEPS 64
static void draw_colour_bar(const dragarc_plot_raster *r)
{
    double zmin, zmax;
    raster_range(r, &zmin, &zmax);
    /* the viewport and the subpage, both normalised to the page (the subpage as the viewport that fills it), and
     * the bar 4 mm right of the viewport, 5 mm wide, in the subpage's normalised coordinates that plvpor takes */
    PLFLT nx0, nx1, ny0, ny1, sx0, sx1, sy0, sy1;
    plgvpd(&nx0, &nx1, &ny0, &ny1);
    plvpor(0.0, 1.0, 0.0, 1.0);
    plgvpd(&sx0, &sx1, &sy0, &sy1);
    double mm = 72.0 / 25.4 / PAGE_W_PT / (sx1 - sx0); /* one mm of the page, as a share of the subpage's width */
    double x0 = (nx1 - sx0) / (sx1 - sx0) + 4.0 * mm;
    plvpor(x0, x0 + 5.0 * mm, (ny0 - sy0) / (sy1 - sy0), (ny1 - sy0) / (sy1 - sy0));
    plwind(0.0, 1.0, zmin, zmax);
    for (int k = 0; k < COLOUR_BAR_STEPS; k++) {
        /* each band reaches a little into the next, so that no seam of the background shows between them */
        double a = zmin + (zmax - zmin) * k / COLOUR_BAR_STEPS,
               b = zmin + (zmax - zmin) * fmin(k + 1.3, COLOUR_BAR_STEPS) / COLOUR_BAR_STEPS;
        PLFLT bx[4] = {0.0, 1.0, 1.0, 0.0}, by[4] = {a, a, b, b};
        plcol1((k + 0.5) / COLOUR_BAR_STEPS);
        plfill(4, bx, by);
    }
    plcol0(PAL0 + DRAGARC_PLOT_BLACK);
    plbox("bc", 0.0, 0, "bcmstv", 0.0, 0);
    plmtex("r", 5.0, 0.5, 0.5, r->label ? r->label : "");
}

/* The legend sits between the title and the viewport, in rows of at most this many entries. */
#define LEGEND_COLUMNS 3
/* pllegend's text and symbols scale with the subpage's character height differently from plmtex's: at this
 * character scale (that of three panels) a text scale of 0.9 matches the axis labels, and it is kept in
 * proportion for other numbers of panels. */
#define LEGEND_CHR (0.55 * 1.7320508075688772)
/* Points between the legend and the viewport: a fiftieth of the viewport of one of three panels on the 900-point
 * page. */
#define LEGEND_GAP_PT (0.02 * (VP_YMAX - VP_YMIN) * PAGE_H_PT / 3.0)

/* Returns the rows the legend takes (0: none), and in *top how far its top lies above the viewport, mm. */
static int draw_legend(const dragarc_plot_panel *p, PLFLT chr, double *top)
{
    enum { MAXL = 16 };
    *top = 0.0;
    PLINT opt[MAXL], text_colours[MAXL], line_colours[MAXL], line_styles[MAXL], symbol_colours[MAXL],
        symbol_numbers[MAXL], box_colours[MAXL] = {0}, box_patterns[MAXL] = {0};
    PLFLT line_widths[MAXL], symbol_scales[MAXL], box_scales[MAXL] = {0}, box_widths[MAXL] = {0};
    const char *text[MAXL], *symbols[MAXL];
    PLINT n = 0;
    for (size_t k = 0; k < p->nseries && n < MAXL; k++) {
        const dragarc_plot_series *s = &p->series[k];
        if (!s->label)
            continue;
        int markers = s->style == DRAGARC_PLOT_MARKERS, filled = s->style == DRAGARC_PLOT_FILLED;
        opt[n] = markers ? PL_LEGEND_SYMBOL : filled ? PL_LEGEND_COLOR_BOX : PL_LEGEND_LINE;
        box_colours[n] = TINT0 + s->colour;
        box_scales[n] = 0.8;
        box_widths[n] = 1.0;
        text[n] = s->label;
        text_colours[n] = PAL0 + DRAGARC_PLOT_BLACK;
        line_colours[n] = symbol_colours[n] = PAL0 + s->colour;
        line_styles[n] = filled ? 1 : LINE_STYLE[s->style];
        line_widths[n] = 2.5;
        symbol_scales[n] = chr / LEGEND_CHR;
        symbol_numbers[n] = 1;
        symbols[n] = MARKER_GLYPH[markers ? s->marker : 0];
        n++;
    }
    if (n < 2)
        return 0; /* one series speaks for itself through the axis labels */
    PLINT rows = (n + LEGEND_COLUMNS - 1) / LEGEND_COLUMNS;
    PLFLT w, h, nx0, nx1, ny0, ny1;
    /* the gap under the legend is a share of the viewport's height: kept at LEGEND_GAP_PT on the page, so that the
     * title above (placed in character heights) clears it on a page of any height and number of panels */
    plgvpd(&nx0, &nx1, &ny0, &ny1);
    double gap = ny1 > ny0 ? LEGEND_GAP_PT / ((ny1 - ny0) * g_plot.page_h) : 0.02;
    pllegend(&w, &h, PL_LEGEND_BACKGROUND | PL_LEGEND_BOUNDING_BOX,
             PL_POSITION_TOP | PL_POSITION_OUTSIDE | PL_POSITION_VIEWPORT, 0.0, gap, 0.06, 0, PAL0, 1,
             rows, n < LEGEND_COLUMNS ? n : LEGEND_COLUMNS, n, opt,
             0.8, 0.9 * chr / LEGEND_CHR, 1.8, 0.0, text_colours, text, box_colours, box_patterns, box_scales, box_widths,
             line_colours, line_styles, line_widths, symbol_colours, symbol_scales, symbol_numbers, symbols);
    *top = (gap + h) * (ny1 - ny0) * g_plot.page_h * 25.4 / 72.0;
    return rows;
}

/* One panel on the current subpage. x and y: room for the longest series. */
static void draw_panel(const dragarc_plot_panel *p, PLFLT *x, PLFLT *y, PLFLT chr)
{
    double lim[4];
    (void)panel_limits(p, lim); /* checked by check_figure */
    pladv(0);
    plschr(0.0, chr);
    double vx1 = p->raster ? VP_XMAX_RASTER : VP_XMAX;
    plvpor(VP_XMIN, vx1, VP_YMIN, VP_YMAX);
    if (p->equal_scale) {
        /* A long, flat path at equal scales would leave a sliver too thin for its axis: the window then reaches
         * higher above the path (the scales stay equal), up to MIN_HEIGHT of the room there is; a tall, narrow one
         * reaches wider, up to MIN_WIDTH. */
        PLFLT nx0, nx1, ny0, ny1;
        plgvpd(&nx0, &nx1, &ny0, &ny1);
        double room = (ny1 - ny0) * g_plot.page_h / ((nx1 - nx0) * PAGE_W_PT); /* height / width on the page */
        if ((lim[3] - lim[2]) / (lim[1] - lim[0]) < MIN_HEIGHT * room)
            lim[3] = lim[2] + MIN_HEIGHT * room * (lim[1] - lim[0]);
        if ((lim[3] - lim[2]) / (lim[1] - lim[0]) > room / MIN_WIDTH) { /* a tall one widens about its middle */
            double mid = 0.5 * (lim[0] + lim[1]), half = 0.5 * MIN_WIDTH * (lim[3] - lim[2]) / room;
            lim[0] = mid - half, lim[1] = mid + half;
        }
        plvpas(VP_XMIN, vx1, VP_YMIN, VP_YMAX, (lim[3] - lim[2]) / (lim[1] - lim[0]));
    }
    double y0 = p->y_reversed ? lim[3] : lim[2], y1 = p->y_reversed ? lim[2] : lim[3];
    plwind(lim[0], lim[1], y0, y1);
    if (p->raster)
        draw_raster(p->raster);
    plcol0(GRID_COLOUR);
    plbox("g", 0.0, 0, "g", 0.0, 0);
    plcol0(PAL0 + DRAGARC_PLOT_BLACK);
    plbox("bcnst", 0.0, 0, "bcnstv", 0.0, 0);
    plmtex("b", 3.0, 0.5, 0.5, p->xlabel ? p->xlabel : "");
    plmtex("l", 5.2, 0.5, 0.5, p->ylabel ? p->ylabel : "");
    if (p->note) { /* small print, a line and a half below the label */
        plschr(0.0, 0.8 * chr);
        plmtex("b", 5.9, 0.5, 0.5, p->note);
        plschr(0.0, chr);
    }
    frame fr;
    frame_get(&fr, lim[0], lim[1], y0, y1);
    for (size_t k = 0; k < p->nseries; k++)
        draw_series(&fr, &p->series[k], x, y);
    if (p->arrow)
        draw_arrow(&fr, p->arrow);
    if (p->scale_bar_unit)
        draw_scale_bar(&fr, p->scale_bar_unit);
    if (p->north_arrow)
        draw_north_arrow(&fr);
    plcol0(PAL0 + DRAGARC_PLOT_BLACK);
    double legend_top;
    int rows = draw_legend(p, chr, &legend_top);
    /* the title's baseline: 2 character heights above the viewport, or 1.1 above the legend's top (room for
     * descenders), whichever is higher (the legend's height in character heights changes with the page's and the
     * panels' sizes) */
    PLFLT def_mm, chr_mm;
    plgchr(&def_mm, &chr_mm);
    plschr(0.0, 1.15 * chr);
    double title_at = 2.0 + 1.6 * rows;
    if (rows > 0 && chr_mm > 0.0)
        title_at = fmax(title_at, legend_top / chr_mm + 1.1);
    plmtex("t", title_at / 1.15, 0.5, 0.5, p->title ? p->title : "");
    plschr(0.0, chr);
    if (p->raster)
        draw_colour_bar(p->raster);
}

int dragarc_plot_write(const char *path, const dragarc_plot_figure *fig, dragarc_error *err)
{
    dragarc_plot_format fmt;
    int rc = dragarc_plot_format_from_path(path, &fmt, err);
    if (rc != DRAGARC_OK)
        return rc;
    if ((rc = check_figure(fig, err)) != DRAGARC_OK)
        return rc;
    if (g_plot.busy)
        return dragarc_error_set(err, DRAGARC_EINVAL, "", "a plot is already being drawn: PLplot draws one at a time");
    size_t most = 2;
    for (size_t k = 0; k < fig->npanels; k++)
        for (size_t j = 0; j < fig->panels[k].nseries; j++)
            most = fig->panels[k].series[j].n > most ? fig->panels[k].series[j].n : most;
    PLFLT *x = malloc(most * sizeof *x), *y = malloc(most * sizeof *y);
    if (!x || !y) {
        free(x);
        free(y);
        return dragarc_error_set(err, DRAGARC_ENOMEM, "", "out of memory drawing %s", path);
    }
    dragarc_output out;
    if ((rc = dragarc_output_open(&out, path, err)) != DRAGARC_OK) {
        free(x);
        free(y);
        return rc;
    }
    if (out.fp == stdout) { /* "-": the plot needs a file of its own */
        dragarc_output_abort(&out);
        free(x);
        free(y);
        return dragarc_error_set(err, DRAGARC_EINVAL, "", "a plot is written to a file, not to standard output");
    }
    /* PLplot opens the temporary file again by name and writes it; ours stays empty and is only closed. */
    memset(&g_plot, 0, sizeof g_plot);
    g_plot.busy = 1;
    g_plot.page_h = fig->page_height > 0.0 ? fig->page_height : PAGE_H_PT;
    volatile int ended = 0; /* plend has been called: PLplot has let go of everything it took */
    plsexit(on_plexit);
    plsabort(on_plabort);
    if (setjmp(g_plot.recover) != 0)
        goto fail; /* PLplot called plexit */
    plsError(&g_plot.errcode, g_plot.errmsg); /* before anything that may call plabort */
    if (!driver_present(DRIVER[fmt])) {
        if (!g_plot.message[0])
            snprintf(g_plot.message, sizeof g_plot.message, "no %s driver (Debian's plplot-driver-cairo provides it)",
                     DRIVER[fmt]);
        goto fail;
    }
    plsdev(DRIVER[fmt]);
    plsfnam(out.tmp_path);
    double dpi = fmt == DRAGARC_PLOT_PNG ? PNG_DPI : 72.0;
    plspage(dpi, dpi, (PLINT)lround(PAGE_W_PT * dpi / 72.0), (PLINT)lround(g_plot.page_h * dpi / 72.0), 0, 0);
    plscmap0n(NCOL0);
    plscol0(0, 255, 255, 255);
    for (int c = 0; c < DRAGARC_PLOT_NCOLOURS; c++)
        plscol0(PAL0 + c, OKABE_ITO[c][0], OKABE_ITO[c][1], OKABE_ITO[c][2]);
    plscol0(GRID_COLOUR, 215, 215, 215);
    for (int c = 0; c < DRAGARC_PLOT_NCOLOURS; c++) {
        int tint[3];
        for (int k = 0; k < 3; k++)
            tint[k] = (int)lround(255.0 - TINT_SHARE * (255.0 - OKABE_ITO[c][k]));
        plscol0(TINT0 + c, tint[0], tint[1], tint[2]);
    }
    {
        PLFLT at[NVIRIDIS], rr[NVIRIDIS], gg[NVIRIDIS], bb[NVIRIDIS];
        for (int k = 0; k < NVIRIDIS; k++) {
            at[k] = (double)k / (NVIRIDIS - 1);
            rr[k] = VIRIDIS[k][0] / 255.0, gg[k] = VIRIDIS[k][1] / 255.0, bb[k] = VIRIDIS[k][2] / 255.0;
        }
        plscmap1n(256);
        plscmap1l(1, NVIRIDIS, at, rr, gg, bb, NULL);
    }
    plssub(1, (PLINT)fig->npanels);
    plinit();
    plsfont(PL_FCI_SANS, PL_FCI_UPRIGHT, PL_FCI_MEDIUM);
    /* PLplot sizes text in proportion to the mean of the page's width and height and shrinks it by the square root
     * of the number of subpages; undone here, so that text is the same size on every page (about 9 pt printed), that
     * of three panels on the default 600 x 900 point page */
    PLFLT chr = 0.55 * sqrt((double)fig->npanels) * (PAGE_W_PT + PAGE_H_PT) / (PAGE_W_PT + g_plot.page_h);
    for (size_t k = 0; k < fig->npanels && !g_plot.errcode && !g_plot.message[0]; k++)
        draw_panel(&fig->panels[k], x, y, chr);
    ended = 1;
    plend();
    if (g_plot.errcode || g_plot.message[0])
        goto fail;
    plsexit(NULL);
    plsabort(NULL);
    g_plot.busy = 0;
    free(x);
    free(y);
    return dragarc_output_commit(&out, err);

fail:
    if (!ended) { /* close what PLplot opened (its drivers, the file), unless closing is what failed */
        ended = 1;
        if (setjmp(g_plot.recover) == 0)
            plend();
    }
    plsexit(NULL);
    plsabort(NULL);
    g_plot.busy = 0;
    free(x);
    free(y);
    dragarc_output_abort(&out);
    {
        const char *why = g_plot.message[0] ? g_plot.message : g_plot.errmsg;
        while (*why == '\n' || *why == '*' || *why == ' ')
            why++;
        char clean[512];
        snprintf(clean, sizeof clean, "%s", *why ? why : "failed");
        for (char *c = clean; *c; c++)
            if (*c == '\n')
                *c = ' ';
        return dragarc_error_set(err, DRAGARC_EIO, "", "cannot draw %s: PLplot: %s", path, clean);
    }
}
