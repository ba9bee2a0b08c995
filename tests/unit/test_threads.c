/* Thread safety (identity check): the library keeps no global state, so fits and analyses of
 * different datasets run on several threads at once give the same results as serial runs, bit
 * for bit. The documents compared are the library's JSON texts (17 significant digits, which
 * reproduce every double exactly) and the fitted parameters themselves. Datasets: every shipped
 * one in datasets/ (published data and the invented demo). */
#include "pw_test.h"

#include <math.h>
#include <pinchwise/api.h>
#include <pinchwise/component.h>
#include <pinchwise/dataset.h>
#include <pinchwise/fit.h>
#include <pthread.h>
#include <stdio.h>
#include <stdlib.h>
#include <string.h>

#define N_THREADS 4
#define REPEATS 2

static const char *const datasets[] = {
    "datasets/demo_acetone_water.csv",  "datasets/ethanol_water_1atm.csv",
    "datasets/mek_toluene_50C_px.csv",  "datasets/mek_toluene_50C_pxy.csv",
    "datasets/methanol_water_1atm.csv",
};
static const char *const models[] = {"nrtl", "wilson", "margules"};
enum {
    N_DATA = sizeof datasets / sizeof datasets[0],
    N_MODELS = sizeof models / sizeof models[0],
    N_JOBS = N_DATA * N_MODELS
};

typedef struct outcome {
    pw_status fit_st, az_st;
    char *fit_doc, *fit_text, *az_doc;
    double params[PW_MAX_PARAMS], chi2;
} outcome;

typedef struct job {
    char path[1024];
    const char *model;
} job;

static job jobs[N_JOBS];

/* The fit file records when it was made ("created": "2026-...Z"), the one value that may
 * differ between two runs: blank it. */
static void blank_created(char *text)
{
    for (char *p = text; text && (p = strstr(p, "\"created\": \"")) != NULL;) {
        p += strlen("\"created\": \"");
        for (; *p && *p != '"'; p++)
            *p = '-';
    }
}

static void run_job(const job *j, outcome *o)
{
    pw_error err;
    pw_error_clear(&err);
    memset(o, 0, sizeof *o);
    o->fit_st = pw_api_fit(j->path, j->model, NULL, NULL, 0, &o->fit_doc, &o->fit_text, &err);
    if (o->fit_st != PW_OK)
        return;
    blank_created(o->fit_doc);
    blank_created(o->fit_text);
    /* the parameters as the fit file holds them, read back from its text */
    pw_fit_result r;
    if (pw_fitfile_parse(o->fit_text, strlen(o->fit_text), "fit", &r, &err) == PW_OK) {
        memcpy(o->params, r.sys.params, sizeof o->params);
        o->chi2 = r.chi2;
        pw_fit_result_free(&r);
    }
    o->az_st =
        pw_api_azeotrope(NULL, o->fit_text, "fit", NULL, NULL, NULL, 0, -1, -1, &o->az_doc, &err);
}

static void free_outcome(outcome *o)
{
    pw_api_free(o->fit_doc);
    pw_api_free(o->fit_text);
    pw_api_free(o->az_doc);
}

typedef struct pool {
    pthread_mutex_t lock;
    size_t next;
    outcome out[N_JOBS * REPEATS];
} pool;

static void *worker(void *arg)
{
    pool *p = arg;
    for (;;) {
        pthread_mutex_lock(&p->lock);
        size_t i = p->next++;
        pthread_mutex_unlock(&p->lock);
        if (i >= N_JOBS * REPEATS)
            return NULL;
        /* interleave: neighbouring tasks are different datasets, so threads overlap on them */
        run_job(&jobs[i % N_JOBS], &p->out[i]);
    }
}

static void same(const outcome *serial, const outcome *par, const char *label)
{
    assert_int_equal(par->fit_st, serial->fit_st);
    if (serial->fit_st != PW_OK)
        return;
    if (strcmp(par->fit_doc, serial->fit_doc) != 0 || strcmp(par->fit_text, serial->fit_text) != 0)
        fail_msg("%s: the fit on a thread differs from the serial fit", label);
    if (memcmp(par->params, serial->params, sizeof par->params) != 0 || par->chi2 != serial->chi2)
        fail_msg("%s: parameters differ in their bits", label);
    assert_int_equal(par->az_st, serial->az_st);
    if (serial->az_st == PW_OK && strcmp(par->az_doc, serial->az_doc) != 0)
        fail_msg("%s: the azeotrope document differs", label);
}

static void test_parallel_equals_serial(void **state)
{
    (void)state;
    for (size_t d = 0; d < N_DATA; d++)
        for (size_t m = 0; m < N_MODELS; m++) {
            job *j = &jobs[d * N_MODELS + m];
            pw_test_path(j->path, sizeof j->path, datasets[d]);
            j->model = models[m];
        }
    outcome *serial = calloc(N_JOBS, sizeof *serial);
    pool *p = calloc(1, sizeof *p);
    assert_non_null(serial);
    assert_non_null(p);
    for (size_t i = 0; i < N_JOBS; i++) {
        run_job(&jobs[i], &serial[i]);
        /* every shipped dataset fits with these models: a failure would make the check empty */
        if (serial[i].fit_st != PW_OK)
            fail_msg("%s %s: serial fit failed", jobs[i].path, jobs[i].model);
    }
    pthread_mutex_init(&p->lock, NULL);
    pthread_t th[N_THREADS];
    for (int t = 0; t < N_THREADS; t++)
        assert_int_equal(pthread_create(&th[t], NULL, worker, p), 0);
    for (int t = 0; t < N_THREADS; t++)
        pthread_join(th[t], NULL);
    pthread_mutex_destroy(&p->lock);
    for (size_t i = 0; i < N_JOBS * REPEATS; i++) {
        char label[1200];
        snprintf(label, sizeof label, "%s %s (task %zu)", jobs[i % N_JOBS].path,
                 jobs[i % N_JOBS].model, i);
        same(&serial[i % N_JOBS], &p->out[i], label);
        free_outcome(&p->out[i]);
    }
    for (size_t i = 0; i < N_JOBS; i++)
        free_outcome(&serial[i]);
    free(serial);
    free(p);
}

/* The comparison itself can fail: a fit of other data differs (guards against comparing
 * a document with itself). */
static void test_comparison_detects_difference(void **state)
{
    (void)state;
    job a, b;
    pw_test_path(a.path, sizeof a.path, datasets[0]);
    pw_test_path(b.path, sizeof b.path, datasets[4]);
    a.model = b.model = "wilson";
    outcome oa, ob;
    run_job(&a, &oa);
    run_job(&b, &ob);
    assert_int_equal(oa.fit_st, PW_OK);
    assert_int_equal(ob.fit_st, PW_OK);
    assert_true(strcmp(oa.fit_doc, ob.fit_doc) != 0);
    assert_true(memcmp(oa.params, ob.params, sizeof oa.params) != 0);
    free_outcome(&oa);
    free_outcome(&ob);
}

int main(void)
{
    pw_test_init();
    pw_api_init();
    const struct CMUnitTest tests[] = {
        cmocka_unit_test(test_comparison_detects_difference),
        cmocka_unit_test(test_parallel_equals_serial),
    };
    return cmocka_run_group_tests(tests, NULL, NULL);
}
