/* table_plot.c: the pictures of tables (`dragarc table --plot`), drawn through plot.c.
 * SPDX-License-Identifier: GPL-3.0-or-later
 *
 * A table of flights: one summary column against the values of the first varied parameter, one curve per value of
 * the second (a table of one parameter is one curve). Rows are laid out with the last axis varying fastest, so
 * row i * n1 + j holds value i of the first axis and value j of the second. A failed row is a NaN in its curve,
 * which the plot layer draws as a gap.
 * An aim table: the low and the high elevation against the target range, and the maximum range at the scenario's
 * speed (the greatest downrange any elevation reaches) as a point, where the two branches meet.
 * Values are the tables' own, converted to the display's units: nothing is computed here.
 */
#include <math.h>
#include <stdio.h>
#include <stdlib.h>
#include <string.h>

#include "core/constants.h"
#include "dragarc/plot.h"

/* "speed (m/s)", or the name alone for a pure number. */
static void axis_label(char *buf, size_t n, const char *name, const char *unit)
{
    const char *u = dragarc_unit_abbrev(unit);
    if (u[0])
        snprintf(buf, n, "%s (%s)", name, u);
    else
        snprintf(buf, n, "%s", name);
}

static int any_finite(const double *v, size_t n)
{
    for (size_t i = 0; i < n; i++)
        if (isfinite(v[i]))
            return 1;
    return 0;
}

int dragarc_sweep_plot(const char *path, const dragarc_sweep *t, dragarc_sweep_column c, const dragarc_display *d,
                       const char *title, dragarc_error *err)
{
    const dragarc_sweep_column_info *about = dragarc_sweep_column_about(c);
    if (!about)
        return dragarc_error_set(err, DRAGARC_EINVAL, "", "no table column %d to plot", (int)c);
    if (t->naxes < 1 || t->naxes > 2)
        return dragarc_error_set(err, DRAGARC_EINVAL, "",
                                 "a table plot shows one or two varied parameters, not %zu", t->naxes);
    const dragarc_sweep_axis *a0 = &t->axes[0], *a1 = t->naxes == 2 ? &t->axes[1] : NULL;
    size_t n0 = a0->count, n1 = a1 ? a1->count : 1;
    if (n1 > DRAGARC_PLOT_MAX_CURVES)
        return dragarc_error_set(err, DRAGARC_EINVAL, "",
                                 "a table plot draws one curve per value of the second parameter, at most %d; %s has %zu",
                                 DRAGARC_PLOT_MAX_CURVES, a1->param->alias, n1);
    if (n0 * n1 != t->nrows)
        return dragarc_error_set(err, DRAGARC_EINVAL, "", "the table has %zu rows, not the %zu of its axes", t->nrows,
                                 n0 * n1);
    double *x = malloc(2 * t->nrows * sizeof *x);
    if (!x)
        return dragarc_error_set(err, DRAGARC_ENOMEM, "", "out of memory drawing %s", path);
    double *y = x + t->nrows;
    dragarc_plot_series series[DRAGARC_PLOT_MAX_CURVES];
    char labels[DRAGARC_PLOT_MAX_CURVES][128];
    for (size_t j = 0; j < n1; j++) {
        for (size_t i = 0; i < n0; i++) {
            const dragarc_sweep_row *row = &t->rows[i * n1 + j];
            x[j * n0 + i] = dragarc_sweep_axis_shown(d, a0, row->values[0]);
            y[j * n0 + i] = dragarc_sweep_shown(d, row, c);
        }
        series[j] = (dragarc_plot_series){.label = NULL, .x = x + j * n0, .y = y + j * n0, .n = n0};
        dragarc_plot_family_look(j, &series[j]);
        if (n0 == 1)
            series[j].style = DRAGARC_PLOT_MARKERS; /* one point per curve: no line to draw */
        if (a1) {
            /* four digits: a value converted to other units (2 m/s is 4.4738725841088 mph) stays readable */
            const char *u = dragarc_unit_abbrev(dragarc_sweep_axis_unit(d, a1));
            snprintf(labels[j], sizeof labels[j], "%s = %.4g%s%s", a1->param->alias,
                     dragarc_sweep_axis_shown(d, a1, t->rows[j].values[1]), u[0] ? " " : "", u);
            series[j].label = labels[j];
        }
    }
    int rc;
    if (!any_finite(y, t->nrows)) {
        rc = dragarc_error_set(err, DRAGARC_EINVAL, "", "no row of the table flew: there is nothing to draw");
    } else {
        char head[256], xl[96], yl[96];
        const char *name = title ? title : t->scenario[0] ? t->scenario : "table";
        snprintf(head, sizeof head, "%s: %s against %s", name, about->label, a0->param->alias);
        axis_label(xl, sizeof xl, a0->param->alias, dragarc_sweep_axis_unit(d, a0));
        axis_label(yl, sizeof yl, about->label, dragarc_sweep_column_unit(d, c));
        dragarc_plot_panel panel = {.title = head, .xlabel = xl, .ylabel = yl, .series = series, .nseries = n1};
        dragarc_plot_figure fig = {.panels = &panel, .npanels = 1, .page_height = 520.0};
        rc = dragarc_plot_write(path, &fig, err);
    }
    free(x);
    return rc;
}

int dragarc_aim_table_plot(const char *path, const char *scenario, const dragarc_aim_table_row *rows, size_t n,
                           const dragarc_display *d, dragarc_error *err)
{
    dragarc_display si;
    if (!d) {
        dragarc_display_si(&si);
        d = &si;
    }
    if (n == 0)
        return dragarc_error_set(err, DRAGARC_EINVAL, "", "an aim table plot needs at least one range");
    const dragarc_unit_out *ul = dragarc_display_unit(d, "range", DRAGARC_Q_LENGTH);
    const dragarc_unit_out *ua = dragarc_display_unit(d, "elevation", DRAGARC_Q_ANGLE);
    double *x = malloc(3 * n * sizeof *x);
    if (!x)
        return dragarc_error_set(err, DRAGARC_ENOMEM, "", "out of memory drawing %s", path);
    double *low = x + n, *high = low + n, max_x = NAN, max_y = NAN;
    for (size_t i = 0; i < n; i++) {
        const dragarc_aim_table_row *r = &rows[i];
        int ok = r->status == DRAGARC_OK;
        x[i] = dragarc_display_value_as_given(ul, r->range);
        low[i] = ok ? dragarc_display_value(ua, r->low.elevation / DRAGARC_DEG) : NAN;
        high[i] = ok && r->nsolutions >= 2 ? dragarc_display_value(ua, r->high.elevation / DRAGARC_DEG) : NAN;
        if (isnan(max_x) && isfinite(r->max_range) && isfinite(r->max_range_elevation)) {
            max_x = dragarc_display_value(ul, r->max_range);
            max_y = dragarc_display_value(ua, r->max_range_elevation / DRAGARC_DEG);
        }
    }
    dragarc_plot_style line = n == 1 ? DRAGARC_PLOT_MARKERS : DRAGARC_PLOT_SOLID;
    dragarc_plot_series series[3] = {
        {.label = "low elevation", .x = x, .y = low, .n = n, .style = line, .colour = DRAGARC_PLOT_BLUE,
         .marker = DRAGARC_PLOT_CIRCLE},
        {.label = "high elevation", .x = x, .y = high, .n = n, .style = n == 1 ? line : DRAGARC_PLOT_DASHED,
         .colour = DRAGARC_PLOT_VERMILLION, .marker = DRAGARC_PLOT_TRIANGLE},
        {.label = "maximum range", .x = &max_x, .y = &max_y, .n = 1, .style = DRAGARC_PLOT_MARKERS,
         .colour = DRAGARC_PLOT_BLACK, .marker = DRAGARC_PLOT_DIAMOND},
    };
    int rc;
    if (!any_finite(low, n)) {
        rc = dragarc_error_set(err, DRAGARC_EINVAL, "", "no range of the aim table was reached: there is nothing to draw");
    } else {
        char head[256], xl[96], yl[96];
        snprintf(head, sizeof head, "%s: elevation against target range", scenario && scenario[0] ? scenario : "aim table");
        axis_label(xl, sizeof xl, "target range", ul->symbol);
        axis_label(yl, sizeof yl, "elevation", ua->symbol);
        dragarc_plot_panel panel = {.title = head, .xlabel = xl, .ylabel = yl, .series = series,
                                    .nseries = isnan(max_x) ? 2 : 3};
        dragarc_plot_figure fig = {.panels = &panel, .npanels = 1, .page_height = 520.0};
        rc = dragarc_plot_write(path, &fig, err);
    }
    free(x);
    return rc;
}
