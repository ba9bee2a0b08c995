/* The report's lifecycle: build (compute and render into memory), save (atomic files), free. */
#include "report/report_internal.h"

#include <errno.h>
#include <math.h>
#include <pinchwise/column_direction.h>
#include <pinchwise/fileio.h>
#include <stdio.h>
#include <stdlib.h>
#include <string.h>
#include <sys/stat.h>
#include <time.h>
#include <unistd.h>

pw_report_input pw_report_default_input(void)
{
    pw_report_input in;
    memset(&in, 0, sizeof in);
    in.column_P_Pa = PW_NAN;
    in.unc = pw_unc_default_options();
    in.units = pw_units_display_default();
    return in;
}

void pw_report_free(pw_report *rep)
{
    if (!rep)
        return;
    pw_sbuf_free(&rep->html);
    for (size_t i = 0; i < rep->n_svg; i++)
        pw_sbuf_free(&rep->svg[i].text);
    for (size_t i = 0; i < rep->n_csv; i++)
        pw_sbuf_free(&rep->csv[i].text);
    free(rep);
}

static pw_status check_input(const pw_report_input *in, pw_error *err)
{
    if (!in || !in->fit || !in->fit->sys.model)
        return pw_error_set(err, PW_EINVAL, NULL, 0, "the report needs a fit result with a model");
    if (in->operating_factor != 0.0 && !(in->operating_factor > 1.0 && isfinite(in->operating_factor)))
        return pw_error_set(err, PW_EINVAL, NULL, 0,
                            "operating factor %g: R / R_min must be greater than 1",
                            in->operating_factor);
    if (in->column) {
        const pw_column_spec *s = in->column;
        if (!(isfinite(in->column_P_Pa) && in->column_P_Pa > 0.0))
            return pw_error_set(err, PW_EINVAL, NULL, 0, "a column needs a positive pressure");
        if (!(fmin(s->xb, s->xd) >= 0.0 && fmax(s->xb, s->xd) <= 1.0) || !isfinite(s->q) ||
            pw_column_direction_of(s) == PW_DIRECTION_NONE)
            return pw_error_set(err, PW_EINVAL, NULL, 0,
                                "the column targets must satisfy 0 <= xb < zf < xd <= 1 or "
                                "0 <= xd < zf < xb <= 1 (got xb %g, zf %g, xd %g)",
                                s->xb, s->zf, s->xd);
    }
    return PW_OK;
}

pw_status pw_report_build(const pw_report_input *in, pw_report **out, pw_error *err)
{
    *out = NULL;
    pw_status st = check_input(in, err);
    if (st != PW_OK)
        return st;
    pw_report *rep = calloc(1, sizeof *rep);
    pw_report_curves *c = malloc(sizeof *c);
    if (!rep || !c) {
        free(rep);
        free(c);
        return pw_error_set(err, PW_ENOMEM, NULL, 0, "out of memory");
    }
    pw_sbuf_init(&rep->html);
    pw_report_input local = *in;
    char date[40];
    if (!local.date_utc) {
        time_t now = time(NULL);
        struct tm tm;
        if (now != (time_t)-1 && gmtime_r(&now, &tm) && strftime(date, sizeof date, "%Y-%m-%dT%H:%M:%SZ", &tm))
            local.date_utc = date;
        else
            local.date_utc = "unknown";
    }
    st = pw_report_curves_compute(c, &local);
    if (st == PW_OK && local.uncertainty)
        st = pw_report_unc_compute(c, &local);
    if (st == PW_OK)
        st = pw_report_render_plots(rep, c);
    if (st == PW_OK)
        st = pw_report_render_csv(rep, c);
    if (st == PW_OK)
        st = pw_report_render_html(rep, c, &local);
    pw_report_curves_free(c);
    free(c);
    if (st != PW_OK) {
        pw_report_free(rep);
        return pw_error_set(err, st, NULL, 0, "cannot build the report: %s", pw_strerror(st));
    }
    *out = rep;
    return PW_OK;
}

size_t pw_report_plot_count(const pw_report *rep)
{
    return rep ? rep->n_svg : 0;
}

const char *pw_report_html(const pw_report *rep)
{
    return pw_sbuf_str(&rep->html);
}

/* Stages each of files as dir/<name> (dir created by the set when missing). */
static pw_status stage_files(const pw_report_file *files, size_t n, const char *dir, bool svg,
                             pw_outset *set, pw_error *err)
{
    pw_status st = pw_outset_mkdir(set, dir, err);
    char path[PW_PATH_MAX];
    for (size_t i = 0; st == PW_OK && i < n; i++) {
        int k = snprintf(path, sizeof path, "%s/%s", dir, files[i].name);
        if (k < 0 || (size_t)k >= sizeof path)
            return pw_error_set(err, PW_EINVAL, dir, 0, "path too long");
        if (!svg) {
            st = pw_outset_add(set, path, pw_sbuf_str(&files[i].text), files[i].text.len, err);
            continue;
        }
        /* standalone files need the XML declaration the inline copies do without */
        pw_sbuf t;
        pw_sbuf_init(&t);
        pw_sbuf_puts(&t, "<?xml version=\"1.0\" encoding=\"UTF-8\"?>\n");
        pw_sbuf_puts(&t, pw_sbuf_str(&files[i].text));
        st = pw_sbuf_status(&t);
        if (st != PW_OK)
            pw_error_set(err, st, path, 0, "out of memory");
        else
            st = pw_outset_add(set, path, pw_sbuf_str(&t), t.len, err);
        pw_sbuf_free(&t);
    }
    return st;
}

pw_status pw_report_stage(const pw_report *rep, pw_outset *set, const char *html_path,
                          const char *svg_dir, const char *csv_dir, pw_error *err)
{
    pw_status st = PW_OK;
    if (html_path)
        st = pw_outset_add(set, html_path, pw_sbuf_str(&rep->html), rep->html.len, err);
    if (st == PW_OK && svg_dir)
        st = stage_files(rep->svg, rep->n_svg, svg_dir, true, set, err);
    if (st == PW_OK && csv_dir)
        st = stage_files(rep->csv, rep->n_csv, csv_dir, false, set, err);
    return st;
}

/* One set with what is asked, committed all or none. */
static pw_status save_set(const pw_report *rep, const char *html_path, const char *svg_dir,
                          const char *csv_dir, bool force, pw_error *err)
{
    pw_outset *set = NULL;
    pw_status st = pw_outset_new(force, NULL, &set, err);
    if (st == PW_OK)
        st = pw_report_stage(rep, set, html_path, svg_dir, csv_dir, err);
    if (st == PW_OK)
        st = pw_outset_commit(set, err);
    pw_outset_free(set);
    return st;
}

pw_status pw_report_save_html(const pw_report *rep, const char *path, bool force, pw_error *err)
{
    return save_set(rep, path, NULL, NULL, force, err);
}

pw_status pw_report_save_svg(const pw_report *rep, const char *dir, bool force, size_t *n_files,
                             pw_error *err)
{
    pw_status st = save_set(rep, NULL, dir, NULL, force, err);
    if (n_files)
        *n_files = st == PW_OK ? rep->n_svg : 0;
    return st;
}

pw_status pw_report_save_csv(const pw_report *rep, const char *dir, bool force, size_t *n_files,
                             pw_error *err)
{
    pw_status st = save_set(rep, NULL, NULL, dir, force, err);
    if (n_files)
        *n_files = st == PW_OK ? rep->n_csv : 0;
    return st;
}

static pw_status check_dir(const pw_report_file *files, size_t n, const char *dir, pw_error *err)
{
    char path[PW_PATH_MAX];
    for (size_t i = 0; dir && i < n; i++) {
        int k = snprintf(path, sizeof path, "%s/%s", dir, files[i].name);
        if (k < 0 || (size_t)k >= sizeof path)
            return pw_error_set(err, PW_EINVAL, dir, 0, "path too long");
        if (access(path, F_OK) == 0)
            return pw_error_set(err, PW_EEXIST, path, 0, "file exists (pass --force to replace it)");
    }
    return PW_OK;
}

pw_status pw_report_check_targets(const pw_report *rep, const char *html_path, const char *svg_dir,
                                  const char *csv_dir, pw_error *err)
{
    if (html_path && access(html_path, F_OK) == 0)
        return pw_error_set(err, PW_EEXIST, html_path, 0,
                            "file exists (pass --force to replace it, or choose another --out)");
    pw_status st = check_dir(rep->svg, rep->n_svg, svg_dir, err);
    return st == PW_OK ? check_dir(rep->csv, rep->n_csv, csv_dir, err) : st;
}

pw_status pw_report_write(const char *path, const pw_report_input *in, bool force, size_t *n_plots,
                          pw_error *err)
{
    pw_report *rep = NULL;
    pw_status st = pw_report_build(in, &rep, err);
    if (st != PW_OK)
        return st;
    st = pw_report_save_html(rep, path, force, err);
    if (st == PW_OK && n_plots)
        *n_plots = pw_report_plot_count(rep);
    pw_report_free(rep);
    return st;
}
