/* campaign_json.c: campaign files (campaign.h): many footprint cases, each a scenario with changes, and the CSV
 * table of their results. The file format is documented in docs/cluster.md; the changes are JSON Merge Patches
 * (IETF RFC 7386, 2014), applied by dragarc_footprint_spec_read_patched.
 * SPDX-License-Identifier: GPL-3.0-or-later
 */
#include <cjson/cJSON.h>
#include <math.h>
#include <stdlib.h>
#include <string.h>

#include "core/constants.h"
#include "dragarc/campaign.h"
#include "dragarc/geodesy.h"
#include "io/text_file.h"

void dragarc_campaign_clear(dragarc_campaign *c)
{
    if (!c)
        return;
    for (size_t i = 0; c->cases && i < c->ncases; i++)
        free(c->cases[i].patch);
    free(c->cases);
    memset(c, 0, sizeof *c);
}

/* Only the keys in `keys` (NULL-terminated) may appear in object j (at path). */
static int only_keys(const cJSON *j, const char *path, const char *const *keys, dragarc_error *err)
{
    for (const cJSON *c = j->child; c; c = c->next) {
        size_t k = 0;
        while (keys[k] && strcmp(keys[k], c->string) != 0)
            k++;
        if (!keys[k])
            return dragarc_error_set(err, DRAGARC_EINVAL, path, "unknown key \"%s\"", c->string);
    }
    return DRAGARC_OK;
}

/* The field path of member key of the object at path. */
static const char *member(char *buf, size_t n, const char *path, const char *key)
{
    snprintf(buf, n, "%s%s%s", path, path[0] ? "." : "", key);
    return buf;
}

/* A string member `key` of j (at path) into out (n bytes), when present. */
static int take_string(const cJSON *j, const char *path, const char *key, char *out, size_t n, dragarc_error *err)
{
    const cJSON *v = cJSON_GetObjectItemCaseSensitive(j, key);
    char f[64];
    if (!v)
        return DRAGARC_OK;
    if (!cJSON_IsString(v) || !v->valuestring[0] || strlen(v->valuestring) >= n)
        return dragarc_error_set(err, DRAGARC_EINVAL, member(f, sizeof f, path, key),
                                 "must be a text of 1 to %zu characters", n - 1);
    snprintf(out, n, "%s", v->valuestring);
    return DRAGARC_OK;
}

/* A whole number member `key` of j (at path) from lo to hi into *out, when present. */
static int take_count(const cJSON *j, const char *path, const char *key, double lo, double hi, double *out,
                      dragarc_error *err)
{
    const cJSON *v = cJSON_GetObjectItemCaseSensitive(j, key);
    char f[64];
    if (!v)
        return DRAGARC_OK;
    if (!cJSON_IsNumber(v) || !(v->valuedouble >= lo && v->valuedouble <= hi && v->valuedouble == floor(v->valuedouble)))
        return dragarc_error_set(err, DRAGARC_EINVAL, member(f, sizeof f, path, key),
                                 "must be a whole number from %.0f to %.0f", lo, hi);
    *out = v->valuedouble;
    return DRAGARC_OK;
}

/* A folder name: letters, digits, '.', '_', '+' and '-', not starting with '.' (no "..", no hidden folder). */
static int plain_name(const char *s)
{
    if (!s[0] || s[0] == '.')
        return 0;
    for (const char *p = s; *p; p++)
        if (!((*p >= 'a' && *p <= 'z') || (*p >= 'A' && *p <= 'Z') || (*p >= '0' && *p <= '9') || strchr("._+-", *p)))
            return 0;
    return 1;
}

static int read_outputs(const cJSON *o, dragarc_campaign *c, dragarc_error *err)
{
    static const char *const NAMES[] = {"points", "grid", "geojson", "plot"};
    if (!cJSON_IsArray(o))
        return dragarc_error_set(err, DRAGARC_EINVAL, "outputs", "must be a list of \"points\", \"grid\", \"geojson\" "
                                                                  "and \"plot\"");
    int i = 0;
    for (const cJSON *v = o->child; v; v = v->next, i++) {
        int k = 0;
        while (k < 4 && !(cJSON_IsString(v) && strcmp(v->valuestring, NAMES[k]) == 0))
            k++;
        if (k == 4)
            return dragarc_error_set(err, DRAGARC_EINVAL, "outputs", "item %d must be \"points\", \"grid\", \"geojson\" "
                                                                      "or \"plot\"", i + 1);
        c->outputs |= 1u << k;
    }
    return DRAGARC_OK;
}

/* Case i (object j) into *k, with the campaign's scenario, samples and seed as defaults. */
static int read_case(const cJSON *j, size_t i, const char *base_dir, const char *scenario, double samples,
                     double seed, dragarc_campaign_case *k, dragarc_error *err)
{
    static const char *const KEYS[] = {"name", "scenario", "set", "samples", "seed", "folder", NULL};
    char path[48], file[4096] = "";
    snprintf(path, sizeof path, "cases[%zu]", i);
    if (!cJSON_IsObject(j))
        return dragarc_error_set(err, DRAGARC_EINVAL, path, "must be an object");
    int rc;
    snprintf(k->name, sizeof k->name, "case %zu", i + 1);
    snprintf(k->folder, sizeof k->folder, "case-%03zu", i + 1);
    snprintf(file, sizeof file, "%s", scenario);
    k->samples = samples, k->seed = seed;
    if ((rc = only_keys(j, path, KEYS, err)) != DRAGARC_OK ||
        (rc = take_string(j, path, "name", k->name, sizeof k->name, err)) != DRAGARC_OK ||
        (rc = take_string(j, path, "scenario", file, sizeof file, err)) != DRAGARC_OK ||
        (rc = take_string(j, path, "folder", k->folder, sizeof k->folder, err)) != DRAGARC_OK ||
        (rc = take_count(j, path, "samples", 1, DRAGARC_FOOTPRINT_MAX_SAMPLES, &k->samples, err)) != DRAGARC_OK ||
        (rc = take_count(j, path, "seed", 0, 9007199254740992.0, &k->seed, err)) != DRAGARC_OK)
        return rc;
    char f[64];
    if (!file[0])
        return dragarc_error_set(err, DRAGARC_EINVAL, member(f, sizeof f, path, "scenario"),
                                 "is needed (in the case or for the whole campaign)");
    if (!plain_name(k->folder))
        return dragarc_error_set(err, DRAGARC_EINVAL, member(f, sizeof f, path, "folder"),
                                 "must be a plain name: letters, digits, '.', '_', '+' and '-', not starting with '.' "
                                 "(got \"%s\")", k->folder);
    int n = file[0] == '/' || !base_dir[0] ? snprintf(k->scenario, sizeof k->scenario, "%s", file)
                                           : snprintf(k->scenario, sizeof k->scenario, "%s/%s", base_dir, file);
    if (n < 0 || (size_t)n >= sizeof k->scenario)
        return dragarc_error_set(err, DRAGARC_EINVAL, member(f, sizeof f, path, "scenario"), "the path is too long");
    const cJSON *set = cJSON_GetObjectItemCaseSensitive(j, "set");
    if (set && !cJSON_IsObject(set))
        return dragarc_error_set(err, DRAGARC_EINVAL, member(f, sizeof f, path, "set"),
                                 "must be an object of the scenario's keys to change");
    if (set && !(k->patch = cJSON_PrintUnformatted(set)))
        return dragarc_error_set(err, DRAGARC_ENOMEM, path, "out of memory");
    return DRAGARC_OK;
}

static int read_campaign(const cJSON *root, const char *base_dir, dragarc_campaign *c, dragarc_error *err)
{
    static const char *const KEYS[] = {"name", "description", "scenario", "samples", "seed", "outputs", "plot_format",
                                       "cases", NULL};
    if (!cJSON_IsObject(root))
        return dragarc_error_set(err, DRAGARC_EINVAL, "", "a campaign must be a JSON object");
    char scenario[4096] = "";
    double samples = 0.0, seed = -1.0;
    snprintf(c->plot_format, sizeof c->plot_format, "svg");
    int rc;
    if ((rc = only_keys(root, "", KEYS, err)) != DRAGARC_OK ||
        (rc = take_string(root, "", "name", c->name, sizeof c->name, err)) != DRAGARC_OK ||
        (rc = take_string(root, "", "scenario", scenario, sizeof scenario, err)) != DRAGARC_OK ||
        (rc = take_count(root, "", "samples", 1, DRAGARC_FOOTPRINT_MAX_SAMPLES, &samples, err)) != DRAGARC_OK ||
        (rc = take_count(root, "", "seed", 0, 9007199254740992.0, &seed, err)) != DRAGARC_OK ||
        (rc = take_string(root, "", "plot_format", c->plot_format, sizeof c->plot_format, err)) != DRAGARC_OK)
        return rc;
    if (strcmp(c->plot_format, "svg") != 0 && strcmp(c->plot_format, "png") != 0 && strcmp(c->plot_format, "pdf") != 0)
        return dragarc_error_set(err, DRAGARC_EINVAL, "plot_format", "must be \"svg\", \"png\" or \"pdf\" (got \"%s\")",
                                 c->plot_format);
    const cJSON *o = cJSON_GetObjectItemCaseSensitive(root, "outputs");
    if (o && (rc = read_outputs(o, c, err)) != DRAGARC_OK)
        return rc;
    const cJSON *cases = cJSON_GetObjectItemCaseSensitive(root, "cases");
    int n = cJSON_IsArray(cases) ? cJSON_GetArraySize(cases) : -1;
    if (n < 1 || n > DRAGARC_CAMPAIGN_MAX_CASES)
        return dragarc_error_set(err, DRAGARC_EINVAL, "cases", "must be a list of 1 to %d cases",
                                 DRAGARC_CAMPAIGN_MAX_CASES);
    if (!(c->cases = calloc((size_t)n, sizeof *c->cases)))
        return dragarc_error_set(err, DRAGARC_ENOMEM, "cases", "out of memory");
    for (const cJSON *j = cases->child; j; j = j->next) {
        dragarc_campaign_case *k = &c->cases[c->ncases];
        if ((rc = read_case(j, c->ncases, base_dir, scenario, samples, seed, k, err)) != DRAGARC_OK) {
            free(k->patch);
            return rc;
        }
        c->ncases++;
        for (size_t i = 0; i + 1 < c->ncases; i++)
            if (strcmp(c->cases[i].folder, k->folder) == 0) {
                char f[64];
                snprintf(f, sizeof f, "cases[%zu].folder", c->ncases - 1);
                return dragarc_error_set(err, DRAGARC_EINVAL, f, "\"%s\" is cases[%zu]'s folder too: give each case "
                                         "a folder of its own", k->folder, i);
            }
    }
    return DRAGARC_OK;
}

int dragarc_campaign_parse(const char *json, const char *base_dir, dragarc_campaign *out, dragarc_error *err)
{
    memset(out, 0, sizeof *out);
    cJSON *root = cJSON_Parse(json);
    int rc = root ? read_campaign(root, base_dir ? base_dir : "", out, err)
                  : dragarc_error_set(err, DRAGARC_EINVAL, "", "the campaign is not valid JSON");
    if (rc != DRAGARC_OK)
        dragarc_campaign_clear(out);
    cJSON_Delete(root);
    return rc;
}

int dragarc_campaign_read(const char *path, dragarc_campaign *out, dragarc_error *err)
{
    memset(out, 0, sizeof *out);
    char *text = NULL, dir[4096];
    int rc = dragarc_io_read_file_and_folder(path, &text, dir, sizeof dir, err);
    if (rc == DRAGARC_OK)
        rc = dragarc_campaign_parse(text, dir, out, err);
    free(text);
    return rc;
}

void dragarc_campaign_row_fill(dragarc_campaign_row *row, const dragarc_campaign_case *c,
                               const dragarc_footprint_spec *spec, const dragarc_footprint_summary *s)
{
    memset(row, 0, sizeof *row);
    const dragarc_breakup *b = &spec->breakup;
    const dragarc_footprint_group *all = &s->groups[spec->nclasses];
    snprintf(row->name, sizeof row->name, "%s", c->name);
    snprintf(row->folder, sizeof row->folder, "%s", c->folder);
    row->latitude = b->latitude, row->longitude = b->longitude, row->altitude = b->altitude;
    row->speed = sqrt(b->velocity[0] * b->velocity[0] + b->velocity[1] * b->velocity[1] + b->velocity[2] * b->velocity[2]);
    row->samples = spec->samples, row->seed = spec->seed;
    row->flights = all->flights, row->landed = all->landed, row->fragments = all->fragments;
    row->mean_ok = all->moments_ok;
    row->mean_east = row->mean_north = row->mean_latitude = row->mean_longitude = NAN;
    if (all->moments_ok) {
        row->mean_east = all->mean[0], row->mean_north = all->mean[1];
        if (dragarc_geo_from_local(b->latitude, b->longitude, all->mean[0], all->mean[1], &row->mean_latitude,
                                   &row->mean_longitude, NULL) != DRAGARC_OK)
            row->mean_latitude = row->mean_longitude = NAN;
    }
    row->ellipse_ok = all->ellipses_ok;
    row->semi_major = row->semi_minor = row->azimuth = NAN;
    if (all->ellipses_ok)
        row->semi_major = all->ellipse[0].semi_major, row->semi_minor = all->ellipse[0].semi_minor,
        row->azimuth = all->ellipse[0].azimuth;
    row->hazardous_share = all->landed > 0 ? all->hazardous_share : NAN;
    row->energy_max = all->landed > 0 ? all->energy_max : NAN;
    row->casualty_done = s->casualty_done;
    row->expected_casualties = s->casualty_done ? s->casualty.expected_casualties : NAN;
    row->criterion = spec->hazard.criterion;
    snprintf(row->note, sizeof row->note, "%s", s->note);
}

/* A CSV field for a name: quoted, with its quotes doubled. */
static void csv_text(FILE *fp, const char *s)
{
    fputc('"', fp);
    for (const char *p = s; *p; p++) {
        if (*p == '"')
            fputc('"', fp);
        fputc(*p, fp);
    }
    fputc('"', fp);
}

/* ",v" with 17 significant digits, or "," when v is not known */
static void csv_num(FILE *fp, double v)
{
    if (isfinite(v))
        fprintf(fp, ",%.17g", v);
    else
        fputc(',', fp);
}

int dragarc_campaign_write_csv(FILE *fp, const dragarc_campaign_row *rows, size_t n, dragarc_error *err)
{
    fputs("case,folder,breakup_latitude,breakup_longitude,breakup_altitude_m,breakup_speed_m_s,samples,seed,flights,"
          "landed,fragments,mean_east_m,mean_north_m,mean_latitude,mean_longitude,ellipse_1sigma_major_m,"
          "ellipse_1sigma_minor_m,ellipse_azimuth_deg,hazardous_share,impact_energy_max_j,expected_casualties,"
          "criterion,within_criterion\n", fp);
    for (size_t i = 0; i < n; i++) {
        const dragarc_campaign_row *r = &rows[i];
        csv_text(fp, r->name);
        fputc(',', fp);
        csv_text(fp, r->folder);
        csv_num(fp, r->latitude);
        csv_num(fp, r->longitude);
        csv_num(fp, r->altitude);
        csv_num(fp, r->speed);
        fprintf(fp, ",%zu,%llu,%zu,%zu", r->samples, (unsigned long long)r->seed, r->flights, r->landed);
        csv_num(fp, r->fragments);
        csv_num(fp, r->mean_east);
        csv_num(fp, r->mean_north);
        csv_num(fp, r->mean_latitude);
        csv_num(fp, r->mean_longitude);
        csv_num(fp, r->semi_major);
        csv_num(fp, r->semi_minor);
        csv_num(fp, r->ellipse_ok ? fmod(r->azimuth / DRAGARC_DEG + 360.0, 180.0) : NAN);
        csv_num(fp, r->hazardous_share);
        csv_num(fp, r->energy_max);
        csv_num(fp, r->expected_casualties);
        csv_num(fp, r->criterion > 0.0 ? r->criterion : NAN);
        fputs(r->casualty_done && r->criterion > 0.0 ? (r->expected_casualties <= r->criterion ? ",yes" : ",no") : ",",
              fp);
        fputc('\n', fp);
    }
    if (ferror(fp))
        return dragarc_error_set(err, DRAGARC_EIO, "", "write failed");
    return DRAGARC_OK;
}
