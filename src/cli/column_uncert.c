/* The reflux command's uncertainty options: design results under the fit's parameter
 * uncertainty, the feasibility risk, where to measure next, and other models of the same data. */
#include "column_uncert.h"

#include "cli.h"

#include <math.h>
#include <stdio.h>
#include <stdlib.h>
#include <string.h>

static pw_status compare_models(const cli_column_args *a, const cli_column_run *run, cli_column_uncert *u,
                          pw_error *err)
{
    pw_fit_result *fits = calloc(u->n_compare, sizeof *fits);
    const pw_fit_result *ptr[CLI_MAX_COMPARE + 1];
    if (!fits)
        return pw_error_set(err, PW_ENOMEM, NULL, 0, "out of memory");
    ptr[0] = &run->fit;
    snprintf(u->paths[0], sizeof u->paths[0], "%s", a->fit_path);
    pw_status st = PW_OK;
    size_t n_read = 0;
    for (size_t i = 0; i < u->n_compare && st == PW_OK; i++) {
        st = cli_read_fit("reflux", u->compare_paths[i], a->components, &fits[i], err);
        if (st != PW_OK)
            break;
        n_read++;
        ptr[i + 1] = &fits[i];
        snprintf(u->paths[i + 1], sizeof u->paths[i + 1], "%s", u->compare_paths[i]);
    }
    if (st == PW_OK) {
        st = pw_unc_compare_models(ptr, u->n_compare + 1, pw_unc_column_fn, &u->col,
                                   PW_UNC_COLUMN_NOUT, &u->models);
        if (st == PW_EINVAL)
            pw_error_set(err, st, NULL, 0,
                         "--compare: the fit files must be fits of the same data set (same points "
                         "and objective) with a usable AICc");
        else if (st != PW_OK)
            pw_error_set(err, st, NULL, 0, "model comparison failed: %s", pw_strerror(st));
    }
    for (size_t i = 0; i < n_read; i++)
        pw_fit_result_free(&fits[i]);
    free(fits);
    return st == PW_OK ? 0 : st;
}

pw_status cli_column_uncert_run(const cli_column_args *a, const cli_column_run *run, cli_column_uncert *u,
                         pw_error *err)
{
    memset(u, 0, sizeof *u);
    u->opt = pw_unc_default_options();
    u->propagate = a->unc.on;
    if (a->unc.have_samples)
        u->opt.samples = (size_t)a->unc.samples;
    if (a->unc.have_seed)
        u->opt.seed = (unsigned long)a->unc.seed;
    u->n_compare = a->n_compare;
    memcpy(u->compare_paths, a->compare, a->n_compare * sizeof a->compare[0]);
    u->col = pw_unc_column_ctx_make(run->P_Pa, &run->spec);
    u->col.opt = a->opt;
    if (run->energy)
        u->col.heat = &run->heat; /* energy balances in every draw */
    /* the stages quoted are at one of the factors asked for: 1.3 R_min when it is among them
     * (the default list holds it), else the first one given */
    bool has_default = false;
    for (size_t k = 0; k < a->opt.n_factors; k++)
        has_default = has_default || fabs(a->opt.factors[k] - u->col.factor) < 1e-12;
    if (!has_default && a->opt.n_factors > 0)
        u->col.factor = a->opt.factors[0];
    u->plan_status = PW_EINVAL;
    if (u->propagate) {
        cli_progress_ctx pc = {"reflux", "parameter sets sampled"};
        cli_progress_attach(&u->opt.progress, &u->opt.progress_ctx, &pc);
        pw_unc_column_assessment as;
        pw_status st = pw_reflux_unc_run(&run->fit, &u->col, &u->opt, a->fit_path, &as, err);
        u->opt.progress = NULL;
        u->opt.progress_ctx = NULL;
        if (st != PW_OK)
            return st;
        u->res = as.res;
        u->plan_status = as.plan_status;
        u->plan = as.plan;
    }
    return u->n_compare ? compare_models(a, run, u, err) : 0;
}

json_t *cli_json_pair(const double v[2])
{
    return pw_json_pair(v);
}

json_t *cli_unc_output_json(const pw_unc_output *o)
{
    return pw_unc_output_doc(o);
}

static const char *class_name(pw_unc_model_class c)
{
    switch (c) {
    case PW_UNC_MODEL_BEST: return "best";
    case PW_UNC_MODEL_EQUAL: return "indistinguishable";
    case PW_UNC_MODEL_CONSIDERED: return "less supported";
    default: return "not supported";
    }
}

static json_t *models_json(const cli_column_uncert *u)
{
    const pw_unc_models *m = &u->models;
    json_t *j = json_object(), *rows = json_array();
    for (size_t i = 0; i < m->n; i++) {
        const pw_unc_model_row *r = &m->rows[i];
        json_t *o = json_object();
        json_object_set_new(o, "model", json_string(r->model->name));
        json_object_set_new(o, "fit_file", json_string(u->paths[i]));
        json_object_set_new(o, "aicc", cli_json_num(r->aicc));
        json_object_set_new(o, "delta_aicc", cli_json_num(r->delta_aicc));
        json_object_set_new(o, "akaike_weight", cli_json_num(r->weight));
        json_object_set_new(o, "support", json_string(class_name(r->cls)));
        json_object_set_new(o, "feasible", r->status == PW_OK        ? json_true()
                                           : r->status == PW_EINFEASIBLE ? json_false()
                                                                         : json_null());
        json_object_set_new(o, "error", r->status == PW_OK || r->status == PW_EINFEASIBLE
                                            ? json_null()
                                            : json_string(pw_strerror(r->status)));
        json_object_set_new(o, "r_min", cli_json_num(r->out[PW_UNC_RMIN]));
        json_object_set_new(o, "boilup_min", cli_json_num(r->out[PW_UNC_SMIN]));
        json_object_set_new(o, "stages_operating", cli_json_num(r->out[PW_UNC_STAGES]));
        json_array_append_new(rows, o);
    }
    json_object_set_new(j, "models", rows);
    json_object_set_new(j, "r_min_range", cli_json_pair((const double[2]){m->lo[PW_UNC_RMIN],
                                                                 m->hi[PW_UNC_RMIN]}));
    json_object_set_new(j, "feasibility_differs", json_boolean(m->feasibility_differs));
    json_object_set_new(j, "operating_factor", cli_json_num(u->col.factor));
    json_object_set_new(j, "balance", json_string(pw_balance_name(u->col.heat ? PW_BALANCE_ENERGY
                                                                              : PW_BALANCE_CMO)));
    json_object_set_new(j, "basis",
                        json_string("models within delta AICc < 10 of the best are compared; "
                                    "< 2: indistinguishable (Burnham & Anderson 2002)"));
    return j;
}

void cli_column_uncert_json(const cli_column_uncert *u, json_t *o)
{
    if (u->propagate)
        pw_reflux_unc_doc(o, &u->res, &u->opt, u->col.factor, u->plan_status, &u->plan);
    if (u->n_compare)
        json_object_set_new(o, "model_comparison", models_json(u));
}

static void print_output(const char *label, const pw_unc_output *o)
{
    if (!isfinite(o->ci[0])) {
        printf("  %-28s no interval (too few feasible parameter sets)\n", label);
        return;
    }
    printf("  %-28s %.5g, 95 %% interval %.5g to %.5g (%s)\n", label, o->value, o->ci[0], o->ci[1],
           o->ci_sampled ? "sampled" : "linearised");
    if (o->disagree)
        printf("  %-28s linearised %.5g to %.5g differs: the result is not linear in the "
               "parameters over this range\n", "", o->ci_lin[0], o->ci_lin[1]);
}

void cli_column_uncert_print(const cli_column_uncert *u, const cli_column_run *run)
{
    (void)run;
    char words[PW_REASON_MAX * 2];
    if (u->propagate) {
        const pw_unc_result *r = &u->res;
        printf("\nuncertainty from the fit's parameter covariance (%zu draws, seed %lu):\n",
               r->n_samples, u->opt.seed);
        print_output("minimum reflux R_min", &r->out[PW_UNC_RMIN]);
        if (!u->col.heat) /* not defined at R_min with energy balances */
            print_output("minimum boil-up Vbar/B", &r->out[PW_UNC_SMIN]);
        char label[64];
        snprintf(label, sizeof label, "stages at %.2g R_min", u->col.factor);
        print_output(label, &r->out[PW_UNC_STAGES]);
        printf("  feasibility: %s\n", pw_unc_risk_words(r, words, sizeof words));
        if (r->n_redrawn)
            printf("  (%zu draws fell outside the model's parameter domain and were redrawn)\n",
                   r->n_redrawn);
        if (u->plan_status == PW_OK)
            printf("  next measurements: %s\n", pw_unc_plan_words(&u->plan, "R_min", words,
                                                                 sizeof words));
        printf("  These intervals cover the scatter of the fitted data only, not the choice of\n"
               "  model, the vapor-pressure constants or %s.\n",
               u->col.heat ? "the heat data" : "constant molal overflow");
    }
    if (u->n_compare) {
        const pw_unc_models *m = &u->models;
        printf("\nother models of the same data (delta AICc; Burnham & Anderson 2002; %s):\n",
               u->col.heat ? "energy balances with the same heat data" : "constant molal overflow");
        printf("  %-10s %9s %8s %-18s %10s %10s\n", "model", "dAICc", "weight", "support", "R_min",
               "stages");
        for (size_t i = 0; i < m->n; i++) {
            const pw_unc_model_row *r = &m->rows[i];
            if (r->status == PW_OK)
                printf("  %-10s %9.2f %8.3f %-18s %10.5g %10.4g\n", r->model->name, r->delta_aicc,
                       r->weight, class_name(r->cls), r->out[PW_UNC_RMIN], r->out[PW_UNC_STAGES]);
            else
                printf("  %-10s %9.2f %8.3f %-18s %21s\n", r->model->name, r->delta_aicc,
                       r->weight, class_name(r->cls),
                       r->status == PW_EINFEASIBLE ? "split not feasible" : pw_strerror(r->status));
        }
        if (m->n_considered_ok > 1)
            printf("  R_min over the supported models: %.5g to %.5g\n", m->lo[PW_UNC_RMIN],
                   m->hi[PW_UNC_RMIN]);
        if (m->feasibility_differs)
            printf("  WARNING: supported models disagree on whether the split can be made.\n");
    }
}
