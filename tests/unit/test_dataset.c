/* Dataset reader: good files of each kind, every rejected input with its line and message,
 * BOM + CRLF, quoted component names, replay at every chunk size, SHA-256.
 * Invented data here serve only these round-trip tests; the shipped published sets in
 * datasets/ are read as they are. */
#include "pw_test.h"

#include "data/dataset_io.h"

#include <math.h>
#include <pinchwise/dataset.h>
#include <stdio.h>
#include <stdlib.h>
#include <string.h>

/* Parses text at chunk 0 and at every chunk size from 1 to its length; all runs must agree. */
static pw_status parse_all_chunks(const char *text, size_t len, pw_dataset *ds, pw_error *err)
{
    pw_error_clear(err);
    pw_status st = pw_dataset_parse_chunked(text, len, "case.csv", 0, ds, err);
    for (size_t chunk = 1; chunk <= len; chunk++) {
        pw_dataset d2;
        pw_error e2;
        pw_error_clear(&e2);
        pw_status st2 = pw_dataset_parse_chunked(text, len, "case.csv", chunk, &d2, &e2);
        if (st2 != st || e2.line != err->line || strcmp(e2.msg, err->msg) != 0) {
            print_error("chunk %zu: status %d line %ld '%s' vs %d line %ld '%s'\n", chunk, st2,
                        e2.line, e2.msg, st, err->line, err->msg);
            fail();
        }
        if (st == PW_OK) {
            assert_int_equal(d2.n, ds->n);
            assert_int_equal(d2.kind, ds->kind);
            assert_int_equal(d2.has_y, ds->has_y);
            assert_string_equal(d2.names[0], ds->names[0]);
            assert_string_equal(d2.names[1], ds->names[1]);
            assert_string_equal(d2.source, ds->source);
            assert_memory_equal(d2.sha256, ds->sha256, 32);
            for (size_t i = 0; i < ds->n; i++) {
                assert_int_equal(d2.pts[i].line, ds->pts[i].line);
                pw_assert_close(d2.pts[i].x1, ds->pts[i].x1, 0, 0, "x1 replay");
                pw_assert_close(d2.pts[i].y1, ds->pts[i].y1, 0, 0, "y1 replay");
                pw_assert_close(d2.pts[i].T_K, ds->pts[i].T_K, 0, 0, "T replay");
                pw_assert_close(d2.pts[i].P_Pa, ds->pts[i].P_Pa, 0, 0, "P replay");
            }
            pw_dataset_free(&d2);
        } else {
            assert_null(d2.pts);
            assert_int_equal(d2.n, 0);
        }
    }
    return st;
}

static pw_status parse_text(const char *text, pw_dataset *ds, pw_error *err)
{
    return parse_all_chunks(text, strlen(text), ds, err);
}

static void good_isobaric_txy(void **state)
{
    (void)state;
    const char *text = "# components: ethanol, water\n"
                       "# Pressure: 101.325 kPa\n"
                       "# source: invented demo data (round-trip test only)\n"
                       "# sigma_T: 0.05 K\n"
                       "# sigma_P: 0.2 %\n"
                       "# SIGMA_Y: 0.003\n"
                       "# sigma_x: 0.002\n"
                       "x1,y1,T[C]\n"
                       "0.1,0.4,86.0\n"
                       "\n"
                       "  0.5 , 0.65 ,\"79.5\"\n";
    pw_dataset ds;
    pw_error err;
    assert_int_equal(parse_text(text, &ds, &err), PW_OK);
    assert_int_equal(ds.kind, PW_DATA_ISOBARIC);
    assert_string_equal(ds.names[0], "ethanol");
    assert_string_equal(ds.names[1], "water");
    assert_string_equal(ds.source, "invented demo data (round-trip test only)");
    assert_string_equal(ds.T_unit, "C");
    assert_string_equal(ds.P_unit, "kPa");
    assert_true(ds.has_y);
    assert_int_equal(ds.n, 2);
    pw_assert_close(ds.P_fixed_Pa, 101325.0, 1e-15, 0, "P fixed");
    assert_true(isnan(ds.T_fixed_K));
    pw_assert_close(ds.pts[0].T_K, 359.15, 1e-15, 0, "86.0 C in K");
    pw_assert_close(ds.pts[0].P_Pa, 101325.0, 1e-15, 0, "P on the point");
    pw_assert_close(ds.pts[1].x1, 0.5, 0, 0, "x1 with blanks");
    pw_assert_close(ds.pts[1].y1, 0.65, 0, 0, "y1 with blanks");
    pw_assert_close(ds.pts[1].T_K, 352.65, 1e-15, 0, "quoted number");
    assert_int_equal(ds.pts[0].line, 9);
    assert_int_equal(ds.pts[1].line, 11); /* the blank line 10 is skipped but counted */
    pw_assert_close(ds.sigma_T_K, 0.05, 0, 0, "sigma_T");
    pw_assert_close(ds.sigma_P_rel, 0.002, 1e-15, 0, "sigma_P 0.2 %");
    assert_true(isnan(ds.sigma_P_abs_Pa));
    pw_assert_close(ds.sigma_y, 0.003, 0, 0, "sigma_y");
    pw_assert_close(ds.sigma_x, 0.002, 0, 0, "sigma_x");
    pw_dataset_free(&ds);
    assert_null(ds.pts);
}

static void good_isothermal_px_and_defaults(void **state)
{
    (void)state;
    const char *text = "# components: acetone, methanol\n"
                       "# temperature: 328.15K\n"
                       "P[mmHg],x1\n"
                       "760,0.5\n"
                       "600,0\n";
    pw_dataset ds;
    pw_error err;
    assert_int_equal(parse_text(text, &ds, &err), PW_OK);
    assert_int_equal(ds.kind, PW_DATA_ISOTHERMAL);
    assert_false(ds.has_y);
    assert_true(isnan(ds.pts[0].y1));
    assert_true(isnan(ds.P_fixed_Pa));
    pw_assert_close(ds.T_fixed_K, 328.15, 0, 0, "T fixed");
    pw_assert_close(ds.pts[0].P_Pa, 101325.0, 1e-14, 0, "760 mmHg = 1 atm");
    pw_assert_close(ds.pts[1].T_K, 328.15, 0, 0, "T on the point");
    assert_string_equal(ds.source, "");
    /* documented defaults (methods brief 3.1: a suggestion, common practice) */
    pw_assert_close(ds.sigma_T_K, 0.1, 0, 0, "default sigma_T");
    pw_assert_close(ds.sigma_P_rel, 0.001, 0, 0, "default sigma_P");
    assert_true(isnan(ds.sigma_P_abs_Pa));
    pw_assert_close(ds.sigma_y, 0.004, 0, 0, "default sigma_y");
    pw_assert_close(ds.sigma_x, 0.001, 0, 0, "default sigma_x");
    pw_dataset_free(&ds);
}

static void y_column_all_empty_means_no_y(void **state)
{
    (void)state;
    const char *text = "# components: a, b\n# temperature: 50 C\nx1,y1,P[kPa]\n0.2,,30\n0.4,,35\n";
    pw_dataset ds;
    pw_error err;
    assert_int_equal(parse_text(text, &ds, &err), PW_OK);
    assert_false(ds.has_y);
    assert_true(isnan(ds.pts[1].y1));
    pw_dataset_free(&ds);
}

typedef struct {
    const char *label, *text;
    pw_status status;
    long line;
    const char *fragment;
} bad_case;

#define META "# components: ethanol, water\n# pressure: 101.325 kPa\n"

static const bad_case bad_cases[] = {
    {"x1 above 1", META "x1,y1,T[C]\n0.5,0.6,80\n1.5,0.9,79\n", PW_EPARSE, 5, "x1 = 1.5 is outside [0, 1]"},
    {"y1 negative", META "x1,y1,T[C]\n0.5,-0.1,80\n", PW_EPARSE, 4, "y1 = -0.1 is outside [0, 1]"},
    {"y on some rows only", META "x1,y1,T[C]\n0.5,0.6,80\n0.6,,79\n", PW_EPARSE, 5, "y1 is empty here but given on line 4"},
    {"y missing first", META "x1,y1,T[C]\n0.5,,80\n0.6,0.7,79\n", PW_EPARSE, 5, "y1 is given here but empty on line 4"},
    {"T zero kelvin", META "x1,T[K]\n0.5,0\n", PW_EPARSE, 4, "is not positive"},
    {"T below absolute zero", META "x1,T[C]\n0.5,-300\n", PW_EPARSE, 4, "is not positive"},
    {"P negative", "# components: a, b\n# temperature: 50 C\nx1,P[kPa]\n0.5,-2\n", PW_EPARSE, 4, "P = -2 kPa is not positive"},
    {"NaN", META "x1,T[C]\nnan,80\n", PW_EPARSE, 4, "x1 = 'nan' is not a number"},
    {"Inf", META "x1,T[C]\n0.5,inf\n", PW_EPARSE, 4, "T = 'inf' is not a number"},
    {"hex", META "x1,T[C]\n0.5,0x50\n", PW_EPARSE, 4, "T = '0x50' is not a number"},
    {"overflow", META "x1,T[C]\n0.5,1e999\n", PW_EPARSE, 4, "is not a number"},
    {"empty number", META "x1,T[C]\n,80\n", PW_EPARSE, 4, "x1 is empty"},
    {"empty T", META "x1,T[C]\n0.5,\n", PW_EPARSE, 4, "T is empty"},
    {"trailing junk", META "x1,T[C]\n0.5abc,80\n", PW_EPARSE, 4, "x1 = '0.5abc' is not a number"},
    {"comma decimal", META "x1,T[C]\n\"0,5\",80\n", PW_EPARSE, 4, "x1 = '0,5' is not a number"},
    {"unknown unit in header", META "x1,T[Kelvin]\n0.5,350\n", PW_EPARSE, 3, "unknown temperature unit 'Kelvin'"},
    {"header column without unit", META "x1,T\n0.5,350\n", PW_EPARSE, 3, "column 'T' has no unit"},
    {"unknown unit in metadata", "# components: a, b\n# pressure: 1 bars\nx1,T[K]\n0.5,350\n", PW_EPARSE, 2, "unknown unit 'bars'"},
    {"pressure without unit", "# components: a, b\n# pressure: 101.325\nx1,T[K]\n0.5,350\n", PW_EPARSE, 2, "is not a number with a unit"},
    {"pressure not positive", "# components: a, b\n# pressure: 0 kPa\nx1,T[K]\n0.5,350\n", PW_EPARSE, 2, "is not positive"},
    {"too few fields", META "x1,y1,T[C]\n0.5,0.6,80\n0.6,79\n", PW_EPARSE, 5, "row has 2 fields (expected 3"},
    {"too many fields", META "x1,y1,T[C]\n0.5,0.6,80,1\n", PW_EPARSE, 4, "row has 4 fields (expected 3"},
    {"no data rows", META "x1,y1,T[C]\n\n", PW_EPARSE, 3, "no data rows"},
    {"no header", META, PW_EPARSE, 3, "no header row"},
    {"empty file", "", PW_EPARSE, 1, "no '# components"},
    {"components missing", "# pressure: 1 atm\nx1,T[C]\n0.5,80\n", PW_EPARSE, 2, "no '# components"},
    {"state missing", "# components: a, b\nx1,T[C]\n0.5,80\n", PW_EPARSE, 2, "neither '# pressure"},
    {"both pressure and temperature", META "# temperature: 50 C\nx1,T[C]\n0.5,80\n", PW_EPARSE, 3, "both '# pressure:' and '# temperature:'"},
    {"duplicate key", META "# Components: a, b\nx1,T[C]\n0.5,80\n", PW_EPARSE, 3, "metadata key 'components' is given twice (first on line 1"},
    {"duplicate unknown key", META "# lab: A\n# LAB: B\nx1,T[C]\n0.5,80\n", PW_EPARSE, 4, "'lab' is given twice"},
    {"three components", "# components: a, b, c\n# pressure: 1 atm\nx1,T[C]\n0.5,80\n", PW_EPARSE, 1, "found 3 names"},
    {"one component", "# components: a\n# pressure: 1 atm\nx1,T[C]\n0.5,80\n", PW_EPARSE, 1, "found 1 name "},
    {"same component twice", "# components: Water, water\n# pressure: 1 atm\nx1,T[C]\n0.5,80\n", PW_EPARSE, 1, "is given twice"},
    {"bad quoting in components", "# components: a\"b, c\n# pressure: 1 atm\nx1,T[C]\n0.5,80\n", PW_EPARSE, 1, "components: malformed CSV"},
    {"duplicate x1", META "x1,x1,T[C]\n0.5,0.5,80\n", PW_EPARSE, 3, "column 'x1' appears twice"},
    {"duplicate T", META "x1,T[C],T[K]\n0.5,80,353\n", PW_EPARSE, 3, "column 'T[K]' appears twice"},
    {"P column in isobaric data", META "x1,T[C],P[kPa]\n0.5,80,101\n", PW_EPARSE, 3, "column 'P[kPa]' contradicts the metadata"},
    {"T column in isothermal data", "# components: a, b\n# temperature: 50 C\nx1,P[kPa],T[C]\n0.5,30,50\n", PW_EPARSE, 3, "column 'T[C]' contradicts the metadata"},
    {"no x1 column", META "y1,T[C]\n0.5,80\n", PW_EPARSE, 3, "no x1 column"},
    {"no T column", META "x1,y1\n0.5,0.6\n", PW_EPARSE, 3, "no T[UNIT] column"},
    {"P-x data given as T", "# components: a, b\n# temperature: 50 C\nx1\n0.5\n", PW_EPARSE, 3, "no P[UNIT] column"},
    {"metadata after header", META "x1,T[C]\n0.5,80\n# sigma_T: 1 K\n", PW_EPARSE, 5, "metadata line after the header row"},
    {"stray quote", META "x1,T[C]\n0.5,\"80\"1\n", PW_EPARSE, 4, "malformed CSV"},
    {"unclosed quote", META "x1,T[C]\n0.5,\"80\n", PW_EPARSE, 5, "never closed"},
    {"sigma_y out of range", META "# sigma_y: 2\nx1,T[C]\n0.5,80\n", PW_EPARSE, 3, "sigma_y: '2'"},
    {"sigma_T without unit", META "# sigma_T: 0.1\nx1,T[C]\n0.5,80\n", PW_EPARSE, 3, "sigma_T: '0.1'"},
    {"sigma_P unknown unit", META "# sigma_P: 3 furlongs\nx1,T[C]\n0.5,80\n", PW_EPARSE, 3, "sigma_P: unknown unit 'furlongs'"},
    {"unknown sigma key", META "# sigma_q: 3\nx1,T[C]\n0.5,80\n", PW_EPARSE, 3, "unknown uncertainty key 'sigma_q'"},
    {"empty components", "# components:\n# pressure: 1 atm\nx1,T[C]\n0.5,80\n", PW_EPARSE, 1, "components: the value is empty"},
};

static void every_bad_input_is_rejected_with_line_and_reason(void **state)
{
    (void)state;
    for (size_t i = 0; i < sizeof bad_cases / sizeof *bad_cases; i++) {
        const bad_case *c = &bad_cases[i];
        pw_dataset ds;
        pw_error err;
        pw_status st = parse_text(c->text, &ds, &err);
        if (st != c->status || err.line != c->line || !strstr(err.msg, c->fragment) ||
            strcmp(err.file, "case.csv") != 0) {
            print_error("case '%s': status %d line %ld msg '%s' (want %d, line %ld, '%s')\n",
                        c->label, st, err.line, err.msg, c->status, c->line, c->fragment);
            fail();
        }
        assert_null(ds.pts);
    }
}

static void bom_crlf_quoted_names_and_multiline_field(void **state)
{
    (void)state;
    char path[1024];
    pw_dataset ds;
    pw_error err;
    pw_error_clear(&err);
    pw_test_path(path, sizeof path, "tests/data/ds_bom_crlf.csv");
    assert_int_equal(pw_dataset_read(path, &ds, &err), PW_OK);
    assert_string_equal(ds.names[0], "chloroform");
    assert_string_equal(ds.names[1], "1,4-dioxane");
    assert_int_equal(ds.kind, PW_DATA_ISOTHERMAL);
    assert_true(ds.has_y);
    assert_int_equal(ds.n, 3);
    assert_int_equal(ds.pts[0].line, 7);
    assert_int_equal(ds.pts[1].line, 8);
    assert_int_equal(ds.pts[2].line, 10); /* the quoted note of line 8 spans two lines */
    pw_assert_close(ds.sigma_P_abs_Pa, 30.0, 1e-14, 0, "sigma_P 0.03 kPa");
    assert_true(isnan(ds.sigma_P_rel));
    pw_assert_close(ds.pts[2].P_Pa, 69360.0, 1e-14, 0, "P in Pa");
    assert_string_equal(ds.path, path);
    pw_dataset_free(&ds);
}

static void extra_columns_blank_lines_and_comments(void **state)
{
    (void)state;
    char path[1024];
    pw_dataset ds;
    pw_error err;
    pw_test_path(path, sizeof path, "tests/data/ds_isobaric_px_ignored.csv");
    assert_int_equal(pw_dataset_read(path, &ds, &err), PW_OK);
    assert_false(ds.has_y);
    assert_int_equal(ds.n, 3);
    assert_int_equal(ds.pts[2].line, 9); /* after the blank line 8 */
    pw_assert_close(ds.pts[2].x1, 0.05, 0, 0, "x1");
    pw_assert_close(ds.P_fixed_Pa, 101325.0, 0, 0, "1 atm");
    pw_dataset_free(&ds);
}

static void missing_file_is_an_io_error(void **state)
{
    (void)state;
    pw_dataset ds;
    pw_error err;
    assert_int_equal(pw_dataset_read("/nonexistent/dir/none.csv", &ds, &err), PW_EIO);
    assert_string_equal(err.file, "/nonexistent/dir/none.csv");
    assert_non_null(strstr(err.msg, "cannot open"));
    assert_null(ds.pts);
}

/* Every test file and shipped dataset gives the same result at every chunk size. */
static void replay_every_file_at_every_chunk_size(void **state)
{
    (void)state;
    static const char *const files[] = {
        "tests/data/ds_bom_crlf.csv",       "tests/data/ds_isobaric_px_ignored.csv",
        "datasets/ethanol_water_1atm.csv",  "datasets/methanol_water_1atm.csv",
        "datasets/mek_toluene_50C_pxy.csv", "datasets/mek_toluene_50C_px.csv",
    };
    for (size_t i = 0; i < sizeof files / sizeof *files; i++) {
        char path[1024];
        pw_test_path(path, sizeof path, files[i]);
        FILE *f = fopen(path, "rb");
        assert_non_null(f);
        char buf[8192];
        size_t len = fread(buf, 1, sizeof buf, f);
        fclose(f);
        assert_true(len < sizeof buf);
        pw_dataset ds;
        pw_error err;
        assert_int_equal(parse_all_chunks(buf, len, &ds, &err), PW_OK);
        pw_dataset_free(&ds);
    }
}

static void shipped_mek_toluene_set(void **state)
{
    (void)state;
    char path[1024];
    pw_dataset ds;
    pw_error err;
    pw_test_path(path, sizeof path, "datasets/mek_toluene_50C_pxy.csv");
    assert_int_equal(pw_dataset_read(path, &ds, &err), PW_OK);
    assert_int_equal(ds.n, 11);
    assert_true(ds.has_y);
    /* SVNA 7th ed. Example 12.1 (from memory): P1sat = 36.09 kPa, P2sat = 12.30 kPa at 50 C */
    pw_assert_close(ds.pts[0].P_Pa, 12300.0, 1e-12, 0, "P2sat");
    pw_assert_close(ds.pts[10].P_Pa, 36090.0, 1e-12, 0, "P1sat");
    pw_assert_close(ds.T_fixed_K, 323.15, 1e-15, 0, "50 C");
    pw_dataset_free(&ds);
    pw_test_path(path, sizeof path, "datasets/mek_toluene_50C_px.csv");
    assert_int_equal(pw_dataset_read(path, &ds, &err), PW_OK);
    assert_int_equal(ds.n, 11);
    assert_false(ds.has_y);
    pw_dataset_free(&ds);
}

static void sha256_known_answers(void **state)
{
    (void)state;
    unsigned char d[32];
    char hex[65];
    /* FIPS 180-2, Appendix B.1 ("abc") and B.2 (the 448-bit message) */
    pw_sha256("abc", 3, d);
    pw_sha256_hex(d, hex);
    assert_string_equal(hex, "ba7816bf8f01cfea414140de5dae2223b00361a396177a9cb410ff61f20015ad");
    const char *m2 = "abcdbcdecdefdefgefghfghighijhijkijkljklmklmnlmnomnopnopq";
    pw_sha256(m2, strlen(m2), d);
    pw_sha256_hex(d, hex);
    assert_string_equal(hex, "248d6a61d20638b8e5c026930c3e6039a33ce45964ff2167f6ecedd419db06c1");
    /* the empty message (FIPS 180-4 examples, from memory) */
    pw_sha256("", 0, d);
    pw_sha256_hex(d, hex);
    assert_string_equal(hex, "e3b0c44298fc1c149afbf4c8996fb92427ae41e4649b934ca495991b7852b855");
    /* the dataset's digest is of the file bytes */
    const char *text = "# components: a, b\n# temperature: 50 C\nx1,P[kPa]\n0.5,30\n";
    pw_dataset ds;
    pw_error err;
    assert_int_equal(pw_dataset_parse(text, strlen(text), "t.csv", &ds, &err), PW_OK);
    pw_sha256(text, strlen(text), d);
    assert_memory_equal(ds.sha256, d, 32);
    pw_dataset_free(&ds);
}

static void quantity_splitting(void **state)
{
    (void)state;
    double v;
    char u[8];
    assert_true(pw_dataset_split_quantity("101.325 kPa", &v, u, sizeof u));
    pw_assert_close(v, 101.325, 0, 0, "value");
    assert_string_equal(u, "kPa");
    assert_true(pw_dataset_split_quantity("1e2kPa", &v, u, sizeof u));
    pw_assert_close(v, 100.0, 0, 0, "exponent");
    assert_true(pw_dataset_split_quantity("0.2 %", &v, u, sizeof u));
    assert_string_equal(u, "%");
    assert_false(pw_dataset_split_quantity("101.325", &v, u, sizeof u));
    assert_false(pw_dataset_split_quantity("kPa", &v, u, sizeof u));
    assert_false(pw_dataset_split_quantity("1 k Pa", &v, u, sizeof u));
    assert_false(pw_dataset_split_quantity("inf kPa", &v, u, sizeof u));
}

int main(void)
{
    pw_test_init();
    const struct CMUnitTest tests[] = {
        cmocka_unit_test(good_isobaric_txy),
        cmocka_unit_test(good_isothermal_px_and_defaults),
        cmocka_unit_test(y_column_all_empty_means_no_y),
        cmocka_unit_test(every_bad_input_is_rejected_with_line_and_reason),
        cmocka_unit_test(bom_crlf_quoted_names_and_multiline_field),
        cmocka_unit_test(extra_columns_blank_lines_and_comments),
        cmocka_unit_test(missing_file_is_an_io_error),
        cmocka_unit_test(replay_every_file_at_every_chunk_size),
        cmocka_unit_test(shipped_mek_toluene_set),
        cmocka_unit_test(sha256_known_answers),
        cmocka_unit_test(quantity_splitting),
    };
    return cmocka_run_group_tests(tests, NULL, NULL);
}
