/* The fit-file reader hands jansson the text without the blanks and tabs that follow each newline
 * (src/fit/fitfile_read.c, without_indentation; docs/performance.md, "Fit-file reading"). That
 * must read every text exactly as jansson reads the text as given. The independent computation
 * here is jansson itself on the text as given:
 *  - where jansson rejects it, the reader fails with jansson's message and line;
 *  - where jansson accepts it, the reader gives what it gives for jansson's own compact dump of
 *    the same JSON (no newlines, so nothing to leave out): the same status and message, or the
 *    same parameters, statistics, minima and points to the bit.
 * Texts: a fit of the invented demo data as written, re-indented with tabs, with CRLF line ends
 * and with no indentation, and 600 seeded random mutations of it (newlines and blanks inserted
 * anywhere, inside strings and numbers too, and bytes replaced by JSON's delimiters). */
#include "pw_test.h"

#include <jansson.h>
#include <math.h>
#include <pinchwise/commands.h>
#include <pinchwise/component.h>
#include <pinchwise/dataset.h>
#include <pinchwise/fileio.h>
#include <pinchwise/fit.h>
#include <stdio.h>
#include <stdlib.h>
#include <string.h>
#include <unistd.h>

static char *written; /* the demo fit file's text */
static size_t written_len;

static unsigned long long rng_state = 0x2026120217ULL;
static unsigned long long next_rand(void)
{
    rng_state ^= rng_state << 13;
    rng_state ^= rng_state >> 7;
    rng_state ^= rng_state << 17;
    return rng_state;
}

static int setup(void **state)
{
    (void)state;
    char data[512], comps[512], dir[64], path[128];
    pw_test_path(data, sizeof data, "datasets/demo_acetone_water.csv");
    pw_test_path(comps, sizeof comps, "datasets/components.csv");
    pw_complib lib;
    pw_complib_init(&lib);
    pw_error err;
    pw_dataset ds;
    pw_component c[2];
    pw_fit_result r;
    pw_fit_options o = pw_fit_default_options();
    o.n_starts = 1;
    snprintf(dir, sizeof dir, "/tmp/pw_fitindent_XXXXXX");
    if (!mkdtemp(dir) || pw_complib_read(&lib, comps, &err) != PW_OK ||
        pw_dataset_read(data, &ds, &err) != PW_OK)
        return -1;
    snprintf(path, sizeof path, "%s/f.json", dir);
    int rc = pw_dataset_components(&lib, &ds, c, &err) == PW_OK &&
                     pw_fit_run(&ds, &c[0], &c[1], pw_model_find("nrtl"), &o, &r, &err) == PW_OK
                 ? 0
                 : -1;
    if (rc == 0) {
        rc = pw_fitfile_write(path, &r, true, &err) == PW_OK &&
                     pw_read_file(path, 1u << 26, &written, &written_len, &err) == PW_OK
                 ? 0
                 : -1;
        pw_fit_result_free(&r);
    }
    pw_dataset_free(&ds);
    pw_complib_free(&lib);
    unlink(path);
    rmdir(dir);
    return rc;
}

static int teardown(void **state)
{
    (void)state;
    free(written);
    return 0;
}

static bool same_bits(double a, double b) { return memcmp(&a, &b, sizeof a) == 0; }

static void assert_same_result(const pw_fit_result *a, const pw_fit_result *b)
{
    assert_string_equal(a->sys.model->name, b->sys.model->name);
    for (size_t k = 0; k < PW_MAX_PARAMS; k++) {
        assert_true(same_bits(a->sys.params[k], b->sys.params[k]));
        assert_true(same_bits(a->stderr_[k], b->stderr_[k]));
    }
    assert_true(same_bits(a->chi2, b->chi2));
    assert_true(same_bits(a->split_min_D, b->split_min_D));
    assert_int_equal(a->fit_class, b->fit_class);
    assert_int_equal(a->n_minima, b->n_minima);
    for (size_t i = 0; i < a->n_minima; i++)
        assert_true(same_bits(a->minima[i].chi2, b->minima[i].chi2));
    assert_int_equal(a->n_pts, b->n_pts);
    for (size_t i = 0; i < a->n_pts; i++) {
        assert_true(same_bits(a->pts[i].meas.x1, b->pts[i].meas.x1));
        assert_true(same_bits(a->pts[i].T_calc_K, b->pts[i].T_calc_K));
        assert_true(same_bits(a->pts[i].y_calc, b->pts[i].y_calc));
        assert_int_equal(a->pts[i].meas.line, b->pts[i].meas.line);
    }
    assert_string_equal(a->source, b->source);
    assert_string_equal(a->dataset_sha256, b->dataset_sha256);
}

/* The reader on text against jansson on it; true when jansson accepted the text. */
static bool reads_as_jansson_does(const char *text, size_t len)
{
    json_error_t jerr;
    json_t *j = json_loadb(text, len, JSON_REJECT_DUPLICATES, &jerr);
    pw_fit_result a, b;
    pw_error ea, eb;
    pw_status sa = pw_fitfile_parse(text, len, "t.json", &a, &ea);
    if (!j) {
        char want[PW_ERROR_MSG_MAX];
        snprintf(want, sizeof want, "not valid JSON: %s (expected a pinchwise fit file)",
                 jerr.text);
        assert_int_equal(sa, PW_EPARSE);
        assert_int_equal(ea.line, jerr.line > 0 ? jerr.line : 0);
        assert_string_equal(ea.msg, want);
        return false;
    }
    char *compact = json_dumps(j, JSON_COMPACT | JSON_REAL_PRECISION(17) | JSON_PRESERVE_ORDER);
    json_decref(j);
    assert_non_null(compact);
    assert_null(strchr(compact, '\n'));
    pw_status sb = pw_fitfile_parse(compact, strlen(compact), "t.json", &b, &eb);
    free(compact);
    assert_int_equal(sa, sb);
    if (sa != PW_OK) {
        assert_int_equal(ea.line, eb.line);
        assert_string_equal(ea.msg, eb.msg);
        return true;
    }
    assert_same_result(&a, &b);
    pw_fit_result_free(&a);
    pw_fit_result_free(&b);
    return true;
}

/* text with each run of blanks after a newline replaced by repl_indent, and each newline by nl */
static char *reindent(const char *nl, const char *repl_indent, size_t *len)
{
    size_t cap = written_len * 4 + 1, n = 0;
    char *out = malloc(cap);
    assert_non_null(out);
    for (size_t i = 0; i < written_len; i++) {
        if (written[i] != '\n') {
            out[n++] = written[i];
            continue;
        }
        for (const char *p = nl; *p; p++)
            out[n++] = *p;
        while (i + 1 < written_len && written[i + 1] == ' ')
            i++;
        for (const char *p = repl_indent; *p; p++)
            out[n++] = *p;
        assert_true(n + 8 < cap);
    }
    *len = n;
    return out;
}

static void reindented_texts(void **state)
{
    (void)state;
    assert_true(reads_as_jansson_does(written, written_len));
    const char *const variants[][2] = {{"\n", ""}, {"\n", "\t \t"}, {"\r\n", "  "}, {"\n\n", " "}};
    for (size_t v = 0; v < sizeof variants / sizeof variants[0]; v++) {
        size_t len;
        char *t = reindent(variants[v][0], variants[v][1], &len);
        assert_true(reads_as_jansson_does(t, len));
        free(t);
    }
}

static void mutated_texts(void **state)
{
    (void)state;
    static const char delims[] = "\"\\ \n\t,:{}[]-1e";
    size_t n_valid = 0, n_invalid = 0;
    char *t = malloc(written_len + 16);
    assert_non_null(t);
    for (int trial = 0; trial < 600; trial++) {
        size_t pos = (size_t)(next_rand() % written_len), len = 0;
        int kind = (int)(next_rand() % 3);
        memcpy(t, written, pos);
        len = pos;
        if (kind == 0) { /* a newline and blanks or tabs anywhere */
            t[len++] = '\n';
            for (int k = (int)(next_rand() % 4); k > 0; k--)
                t[len++] = next_rand() % 2 ? ' ' : '\t';
        } else if (kind == 1) { /* blanks after the next newline */
            const char *nl = memchr(written + pos, '\n', written_len - pos);
            size_t upto = nl ? (size_t)(nl - written) + 1 : written_len;
            memcpy(t + len, written + pos, upto - pos);
            len = upto;
            pos = upto;
            for (int k = 1 + (int)(next_rand() % 3); k > 0; k--)
                t[len++] = ' ';
        } else { /* one byte replaced by a delimiter */
            t[len++] = delims[next_rand() % (sizeof delims - 1)];
            pos++;
        }
        if (pos < written_len) {
            memcpy(t + len, written + pos, written_len - pos);
            len += written_len - pos;
        }
        if (reads_as_jansson_does(t, len))
            n_valid++;
        else
            n_invalid++;
    }
    free(t);
    /* both kinds of text were met */
    assert_true(n_valid > 100 && n_invalid > 100);
}

int main(void)
{
    pw_test_init();
    const struct CMUnitTest tests[] = {
        cmocka_unit_test(reindented_texts),
        cmocka_unit_test(mutated_texts),
    };
    return cmocka_run_group_tests(tests, setup, teardown);
}
