/* Component files: reading, validation with line and reason, lookup precedence, suggestions,
 * chunk replay. The demo rows are invented and serve only these round-trip tests. */
#include "pw_test.h"

#include "data/complib_io.h"

#include <math.h>
#include <pinchwise/component.h>
#include <stdio.h>
#include <string.h>

#define HDR "name,A,B,C,log,P_unit,T_unit,T_min,T_max,source\n"

static pw_status parse_all_chunks(pw_complib *lib, const char *text, pw_error *err)
{
    size_t len = strlen(text), before = lib->n;
    pw_error_clear(err);
    pw_status st = pw_complib_parse_chunked(lib, text, len, "c.csv", 0, err);
    for (size_t chunk = 1; chunk <= len; chunk++) {
        pw_complib l2;
        pw_error e2;
        pw_complib_init(&l2);
        pw_error_clear(&e2);
        pw_status st2 = pw_complib_parse_chunked(&l2, text, len, "c.csv", chunk, &e2);
        assert_int_equal(st2, st);
        assert_int_equal(e2.line, err->line);
        assert_string_equal(e2.msg, err->msg);
        if (st == PW_OK) {
            assert_int_equal(l2.n, lib->n - before); /* lib may hold earlier files' rows */
            for (size_t i = 0; i < l2.n; i++) {
                const pw_component *a = &l2.items[i], *b = &lib->items[before + i];
                assert_string_equal(a->name, b->name);
                assert_string_equal(a->source, b->source);
                assert_true(a->A == b->A && a->B == b->B && a->C == b->C);
                assert_true(a->T_min_K == b->T_min_K && a->T_max_K == b->T_max_K);
            }
        }
        pw_complib_free(&l2);
    }
    return st;
}

static void reads_a_small_file(void **state)
{
    (void)state;
    char path[1024];
    pw_complib lib;
    pw_error err;
    pw_complib_init(&lib);
    pw_test_path(path, sizeof path, "tests/data/comp_small.csv");
    assert_int_equal(pw_complib_read(&lib, path, &err), PW_OK);
    assert_int_equal(lib.n, 2);
    const pw_component *a = pw_complib_find(&lib, "DEMO-A");
    assert_non_null(a);
    assert_int_equal(a->log, PW_LN);
    assert_int_equal(a->equation, PW_PSAT_ANTOINE);
    pw_assert_close(a->T_min_K, 273.15, 0, 0, "T_min in K");
    pw_assert_close(a->T_max_K, 373.15, 0, 0, "T_max in K");
    pw_assert_close(a->V_L_cm3mol, 50.0, 0, 0, "V_L");
    assert_string_equal(a->P_unit, "kPa");
    const pw_component *b = pw_complib_find(&lib, "demo, b");
    assert_non_null(b);
    assert_int_equal(b->log, PW_LOG10);
    assert_true(isnan(b->V_L_cm3mol));
    assert_string_equal(b->source, "invented demo row, with comma");
    assert_null(pw_complib_find(&lib, "demo"));
    pw_complib_free(&lib);
    assert_int_equal(lib.n, 0);
    pw_complib_free(NULL);
}

static void later_rows_take_precedence_and_failure_appends_nothing(void **state)
{
    (void)state;
    pw_complib lib;
    pw_error err;
    pw_complib_init(&lib);
    assert_int_equal(parse_all_chunks(&lib, HDR "water,1,100,200,ln,kPa,C,0,100,first\n", &err),
                     PW_OK);
    assert_int_equal(parse_all_chunks(&lib, HDR "Water,2,100,200,ln,kPa,C,0,100,second\n", &err),
                     PW_OK);
    assert_string_equal(pw_complib_find(&lib, "WATER")->source, "second");
    size_t n = lib.n;
    assert_int_equal(parse_all_chunks(&lib,
                                      HDR "ok,2,100,200,ln,kPa,C,0,100,s\n"
                                          "bad,x,100,200,ln,kPa,C,0,100,s\n",
                                      &err),
                     PW_EPARSE);
    assert_int_equal(lib.n, n);
    assert_null(pw_complib_find(&lib, "ok"));
    pw_complib_free(&lib);
}

typedef struct {
    const char *label, *text;
    long line;
    const char *fragment;
} bad_case;

static const bad_case bad_cases[] = {
    {"empty file", "", 0, "the file is empty"},
    {"header only", HDR, 2, "no component rows"},
    {"wrong header", "name,A,B,C,log,P_unit,T_unit,Tmin,T_max,source\nx,1,1,1,ln,kPa,C,0,1,s\n", 1, "not a component file header"},
    {"header case", "Name,A,B,C,log,P_unit,T_unit,T_min,T_max,source\n", 1, "not a component file header"},
    {"duplicate optional column", "name,A,B,C,log,P_unit,T_unit,T_min,T_max,source,V_L,V_L\n", 1, "column 'V_L' appears twice"},
    {"empty name", HDR "a,1,100,200,ln,kPa,C,0,100,s\n,1,100,200,ln,kPa,C,0,100,s\n", 3, "component name is empty"},
    {"duplicate name", HDR "Acetone,1,100,200,ln,kPa,C,0,100,s\nx,1,100,200,ln,kPa,C,0,100,s\nacetone,1,100,200,ln,kPa,C,0,100,s\n", 4, "listed twice in this file (first on line 2"},
    {"bad A", HDR "a,1.2.3,100,200,ln,kPa,C,0,100,s\n", 2, "column A: '1.2.3' is not a number"},
    {"NaN B", HDR "a,1,nan,200,ln,kPa,C,0,100,s\n", 2, "column B: 'nan' is not a number"},
    {"Inf C", HDR "a,1,100,inf,ln,kPa,C,0,100,s\n", 2, "column C: 'inf' is not a number"},
    {"empty C", HDR "a,1,100,,ln,kPa,C,0,100,s\n", 2, "column C is empty"},
    {"negative B", HDR "a,1,-100,200,ln,kPa,C,0,100,s\n", 2, "expected B > 0"},
    {"bad log", HDR "a,1,100,200,log,kPa,C,0,100,s\n", 2, "log is 'log' (expected log10 or ln)"},
    {"bad P unit", HDR "a,1,100,200,ln,inHg,C,0,100,s\n", 2, "unknown P_unit 'inHg'"},
    {"bad T unit", HDR "a,1,100,200,ln,kPa,R,0,100,s\n", 2, "unknown T_unit 'R'"},
    {"range reversed", HDR "a,1,100,200,ln,kPa,C,100,0,s\n", 2, "T_min = 100 is not below T_max = 0"},
    {"range equal", HDR "a,1,100,200,ln,kPa,C,50,50,s\n", 2, "is not below T_max"},
    {"below absolute zero", HDR "a,1,100,200,ln,kPa,K,-5,100,s\n", 2, "not above absolute zero"},
    {"range across the pole", HDR "a,1,100,-250,ln,kPa,C,0,100,s\n", 2, "Antoine pole"},
    {"bad equation", "name,A,B,C,log,P_unit,T_unit,T_min,T_max,source,equation\na,1,100,200,ln,kPa,C,0,100,s,wagner\n", 2, "equation is 'wagner'"},
    {"bad V_L", "name,A,B,C,log,P_unit,T_unit,T_min,T_max,source,V_L\na,1,100,200,ln,kPa,C,0,100,s,-3\n", 2, "V_L = -3"},
    {"junk V_L", "name,A,B,C,log,P_unit,T_unit,T_min,T_max,source,V_L\na,1,100,200,ln,kPa,C,0,100,s,12ml\n", 2, "column V_L: '12ml' is not a number"},
    {"bad Tc", "name,A,B,C,log,P_unit,T_unit,T_min,T_max,source,Tc_K\na,1,100,200,ln,kPa,C,0,100,s,hot\n", 2, "column Tc_K"},
    {"too few fields", HDR "a,1,100,200,ln,kPa,C,0,100\n", 2, "row has 9 fields (expected 10"},
    {"name too long", HDR "aaaaaaaaaaaaaaaaaaaaaaaaaaaaaaaaaaaaaaaaaaaaaaaaaaaaaaaaaaaaaaaaaaaaaaaaaaaaaaaaaaaaaa,1,100,200,ln,kPa,C,0,100,s\n", 2, "component name is 86 characters long"},
    {"stray quote", HDR "a,1,100,200,ln,kPa,C,0,100,\"s\"x\n", 2, "malformed CSV"},
};

static void every_bad_row_names_line_and_reason(void **state)
{
    (void)state;
    for (size_t i = 0; i < sizeof bad_cases / sizeof *bad_cases; i++) {
        const bad_case *c = &bad_cases[i];
        pw_complib lib;
        pw_error err;
        pw_complib_init(&lib);
        pw_status st = parse_all_chunks(&lib, c->text, &err);
        if (st != PW_EPARSE || err.line != c->line || !strstr(err.msg, c->fragment) ||
            strcmp(err.file, "c.csv") != 0 || lib.n != 0) {
            print_error("case '%s': status %d line %ld msg '%s' (want line %ld, '%s')\n",
                        c->label, st, err.line, err.msg, c->line, c->fragment);
            fail();
        }
        pw_complib_free(&lib);
    }
}

static void missing_file(void **state)
{
    (void)state;
    pw_complib lib;
    pw_error err;
    pw_complib_init(&lib);
    assert_int_equal(pw_complib_read(&lib, "/nonexistent/components.csv", &err), PW_EIO);
    assert_non_null(strstr(err.msg, "cannot open"));
    assert_int_equal(lib.n, 0);
}

static void suggestions_for_misspelled_names(void **state)
{
    (void)state;
    char path[1024];
    pw_complib lib;
    pw_error err;
    pw_complib_init(&lib);
    pw_test_path(path, sizeof path, "datasets/components.csv");
    assert_int_equal(pw_complib_read(&lib, path, &err), PW_OK);
    const char *out[5];
    size_t n = pw_complib_suggest(&lib, "ethanl", out, 5);
    assert_true(n >= 1);
    assert_string_equal(out[0], "ethanol");
    n = pw_complib_suggest(&lib, "dioxane", out, 5);
    assert_true(n >= 1);
    assert_string_equal(out[0], "1,4-dioxane");
    n = pw_complib_suggest(&lib, "Tolune", out, 5);
    assert_true(n >= 1);
    assert_string_equal(out[0], "toluene");
    n = pw_complib_suggest(&lib, "xylene", out, 2);
    assert_int_equal(n, 2);
    assert_non_null(strstr(out[0], "xylene"));
    assert_int_equal(pw_complib_suggest(&lib, "unobtainium", out, 5), 0);
    pw_complib_free(&lib);
}

/* The shipped library: every row valid, replayable at every chunk size, and the required
 * solvents present. */
static void shipped_library(void **state)
{
    (void)state;
    char path[1024];
    pw_test_path(path, sizeof path, "datasets/components.csv");
    FILE *f = fopen(path, "rb");
    assert_non_null(f);
    static char buf[65536];
    size_t len = fread(buf, 1, sizeof buf - 1, f);
    fclose(f);
    buf[len] = '\0';
    pw_complib lib;
    pw_error err;
    pw_complib_init(&lib);
    assert_int_equal(parse_all_chunks(&lib, buf, &err), PW_OK);
    assert_true(lib.n >= 32);
    for (size_t i = 0; i < lib.n; i++) {
        assert_true(strlen(lib.items[i].source) > 0);
        assert_true(lib.items[i].V_L_cm3mol > 0.0);
    }
    assert_int_equal(pw_complib_find(&lib, "water")->equation, PW_PSAT_IAPWS_IF97);
    assert_non_null(pw_complib_find(&lib, "1,4-dioxane"));
    assert_non_null(pw_complib_find(&lib, "2-butanone"));
    pw_complib_free(&lib);
}

/* The optional aliases column: names are found by alias, case-insensitively, exact names first. */
static void aliases_find_components(void **state)
{
    (void)state;
    static const char text[] =
        "name,A,B,C,log,P_unit,T_unit,T_min,T_max,source,aliases\n"
        "2-propanol,16.6796,3640.20,219.610,ln,kPa,C,8,100,from memory,IPA; isopropanol ;propan-2-ol\n"
        "ipa-solvent,16.0,3600.0,220.0,ln,kPa,C,8,100,invented,\n";
    pw_complib lib;
    pw_error err;
    pw_complib_init(&lib);
    assert_int_equal(pw_complib_parse(&lib, text, sizeof text - 1, "aliases.csv", &err), PW_OK);
    const char *names[] = {"IPA", "isopropanol", "Propan-2-ol", "2-PROPANOL"};
    for (int i = 0; i < 4; i++) {
        const pw_component *c = pw_complib_find(&lib, names[i]);
        assert_non_null(c);
        assert_string_equal(c->name, "2-propanol");
    }
    assert_null(pw_complib_find(&lib, "iso"));   /* no prefix matches */
    assert_null(pw_complib_find(&lib, "IPA;"));  /* separators are not part of a name */
    assert_string_equal(pw_complib_find(&lib, "ipa-solvent")->name, "ipa-solvent");
    pw_complib_free(&lib);
}

int main(void)
{
    pw_test_init();
    const struct CMUnitTest tests[] = {
        cmocka_unit_test(reads_a_small_file),
        cmocka_unit_test(later_rows_take_precedence_and_failure_appends_nothing),
        cmocka_unit_test(every_bad_row_names_line_and_reason),
        cmocka_unit_test(missing_file),
        cmocka_unit_test(suggestions_for_misspelled_names),
        cmocka_unit_test(shipped_library),
        cmocka_unit_test(aliases_find_components),
    };
    return cmocka_run_group_tests(tests, NULL, NULL);
}
