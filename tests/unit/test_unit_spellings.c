/* The engineer's spellings: unit aliases (degC, degF, degree signs, torr, psi, bara) against their
 * definitions, a blank between number and unit, uncertainty and composition syntax, the mass to
 * mole conversion, and the dataset reader's w1 / wy1 columns and spreadsheet header spellings.
 *
 * Sources: NIST SP 811 (2008) B.8 and B.9 for the unit definitions (1 torr = 101325/760 Pa;
 * psi = lbf/in2 = 6894.757 Pa; 1 bar = 1e5 Pa; T/K = t/C + 273.15). Molar masses computed from
 * the IUPAC standard atomic weights (CIAAW, abridged conventional values: H 1.008, C 12.011,
 * O 15.999): water 18.015 g/mol, ethanol 46.069 g/mol. The ethanol-water azeotrope at 1 atm,
 * 95.57 wt% = 89.43 mol% ethanol, is the handbook pair (Perry's Chemical Engineers' Handbook,
 * azeotrope table; from memory) that checks the conversion. The two-component file in this test
 * uses invented Antoine constants: only the molar masses matter here. */
#include "pw_test.h"

#include "data/dataset_io.h"

#include <math.h>
#include <pinchwise/composition.h>
#include <pinchwise/dataset.h>
#include <pinchwise/units.h>
#include <stdio.h>
#include <string.h>

static double parse_ok(pw_quantity q, const char *text)
{
    double si = -1.0;
    pw_error err;
    pw_error_clear(&err);
    pw_status st = pw_units_parse_quantity(q, text, &si, &err);
    if (st != PW_OK) {
        print_error("'%s' refused: %s\n", text, err.msg);
        fail();
    }
    return si;
}

static void aliases_by_definition(void **state)
{
    (void)state;
    const double psi = 0.45359237 * 9.80665 / (0.0254 * 0.0254); /* SP 811 B.8, exact */
    pw_assert_close(parse_ok(PW_QTY_PRESSURE, "760torr"), 101325.0, 1e-15, 0, "760 torr = 1 atm");
    pw_assert_close(parse_ok(PW_QTY_PRESSURE, "14.7psi"), 14.7 * psi, 1e-15, 0, "psi = psia");
    pw_assert_close(parse_ok(PW_QTY_PRESSURE, "2bara"), 2e5, 0, 0, "bara = bar");
    pw_assert_close(parse_ok(PW_QTY_TEMPERATURE, "78.3degC"), 351.45, 1e-15, 0, "degC");
    pw_assert_close(parse_ok(PW_QTY_TEMPERATURE, "212degF"), 373.15, 1e-14, 0, "degF");
    pw_assert_close(parse_ok(PW_QTY_TEMPERATURE, "25\xc2\xb0"
                                                 "C"),
                    298.15, 1e-15, 0, "degree sign C");
    pw_assert_close(parse_ok(PW_QTY_TEMPERATURE, "32 \xc2\xb0"
                                                 "F"),
                    273.15, 1e-14, 0, "degree sign F");
    pw_assert_close(parse_ok(PW_QTY_TEMPERATURE, "100\xe2\x84\x83"), 373.15, 1e-15, 0, "U+2103");
    assert_string_equal(pw_units_canonical(PW_QTY_TEMPERATURE, "DEGC"), "C");
    assert_string_equal(pw_units_canonical(PW_QTY_PRESSURE, "Torr"), "mmHg");
    assert_string_equal(pw_units_canonical(PW_QTY_PRESSURE, "psi"), "psia");
    assert_null(pw_units_canonical(PW_QTY_PRESSURE, "psig")); /* gauge: never guessed */
    assert_null(pw_units_canonical(PW_QTY_TEMPERATURE, "R"));
}

static void blank_between_number_and_unit(void **state)
{
    (void)state;
    pw_assert_close(parse_ok(PW_QTY_PRESSURE, "1 atm"), 101325.0, 0, 0, "1 atm");
    pw_assert_close(parse_ok(PW_QTY_PRESSURE, "101.325 kPa"), 101325.0, 1e-15, 0, "spaced kPa");
    pw_assert_close(parse_ok(PW_QTY_TEMPERATURE, " 350 K "), 350.0, 0, 0, "blanks around");
    pw_assert_close(parse_ok(PW_QTY_PRESSURE, "1.01325e2 kPa"), 101325.0, 1e-15, 0, "exponent");
    static const char *const bad[] = {"1 k Pa", "1 atm atm", "1,5 bar", "atm 1", "1", "0x1atm"};
    for (size_t i = 0; i < sizeof bad / sizeof *bad; i++) {
        double si;
        pw_error err;
        pw_error_clear(&err);
        if (pw_units_parse_quantity(PW_QTY_PRESSURE, bad[i], &si, &err) == PW_OK) {
            print_error("'%s' was accepted\n", bad[i]);
            fail();
        }
        assert_true(strlen(err.msg) > 0);
    }
}

static void uncertainty_syntax(void **state)
{
    (void)state;
    double K, rel, abs_Pa;
    pw_error err;
    assert_int_equal(pw_units_parse_temperature_difference("0.05K", &K, &err), PW_OK);
    pw_assert_close(K, 0.05, 0, 0, "0.05 K");
    assert_int_equal(pw_units_parse_temperature_difference("0.1 degC", &K, &err), PW_OK);
    pw_assert_close(K, 0.1, 0, 0, "a difference in C has no offset");
    assert_int_equal(pw_units_parse_temperature_difference("0.9 \xc2\xb0"
                                                           "F",
                                                           &K, &err),
                     PW_OK);
    pw_assert_close(K, 0.5, 1e-15, 0, "0.9 F = 0.5 K");
    assert_int_equal(pw_units_parse_temperature_difference("-0.1K", &K, &err), PW_EINVAL);
    assert_int_equal(pw_units_parse_temperature_difference("0.1 kPa", &K, &err), PW_EINVAL);
    assert_non_null(strstr(err.msg, "unknown unit 'kPa'"));
    assert_int_equal(pw_units_parse_pressure_uncertainty("0.2%", &rel, &abs_Pa, &err), PW_OK);
    pw_assert_close(rel, 0.002, 1e-15, 0, "0.2 %");
    assert_true(isnan(abs_Pa));
    assert_int_equal(pw_units_parse_pressure_uncertainty("0.05kPa", &rel, &abs_Pa, &err), PW_OK);
    pw_assert_close(abs_Pa, 50.0, 1e-15, 0, "0.05 kPa");
    assert_true(isnan(rel));
    assert_int_equal(pw_units_parse_pressure_uncertainty("0.4 torr", &rel, &abs_Pa, &err), PW_OK);
    pw_assert_close(abs_Pa, 0.4 * 101325.0 / 760.0, 1e-15, 0, "0.4 torr");
    assert_int_equal(pw_units_parse_pressure_uncertainty("0.2", &rel, &abs_Pa, &err), PW_EINVAL);
}

static void composition_syntax(void **state)
{
    (void)state;
    struct {
        const char *text;
        double value;
        pw_basis basis;
    } ok[] = {{"0.95", 0.95, PW_BASIS_MOLE},     {"95mol%", 0.95, PW_BASIS_MOLE},
              {"95 mol%", 0.95, PW_BASIS_MOLE},  {"0.995wt", 0.995, PW_BASIS_MASS},
              {"99.5wt%", 0.995, PW_BASIS_MASS}, {"0 wt%", 0.0, PW_BASIS_MASS},
              {"100WT%", 1.0, PW_BASIS_MASS},    {"1e-3", 1e-3, PW_BASIS_MOLE}};
    for (size_t i = 0; i < sizeof ok / sizeof *ok; i++) {
        double v = -1.0;
        pw_basis b = PW_BASIS_MOLE;
        pw_error err;
        pw_error_clear(&err);
        if (pw_units_parse_composition(ok[i].text, &v, &b, &err) != PW_OK) {
            print_error("'%s' refused: %s\n", ok[i].text, err.msg);
            fail();
        }
        pw_assert_close(v, ok[i].value, 1e-15, 0, ok[i].text);
        assert_int_equal(b, ok[i].basis);
    }
    static const char *const bad[] = {"95%", "1.5", "101wt%", "-0.1", "0.5 ppm", "", "wt%"};
    for (size_t i = 0; i < sizeof bad / sizeof *bad; i++) {
        double v;
        pw_basis b;
        pw_error err;
        pw_error_clear(&err);
        if (pw_units_parse_composition(bad[i], &v, &b, &err) == PW_OK) {
            print_error("'%s' was accepted\n", bad[i]);
            fail();
        }
        assert_true(strlen(err.msg) > 0);
    }
    double v;
    pw_basis b;
    pw_error err;
    assert_int_not_equal(pw_units_parse_composition("95%", &v, &b, &err), PW_OK);
    assert_non_null(strstr(err.msg, "mol%"));
    assert_int_not_equal(pw_units_parse_composition("95", &v, &b, &err), PW_OK);
    assert_non_null(strstr(err.msg, "looks like a percentage"));
}

static void mass_to_mole(void **state)
{
    (void)state;
    const double M_ethanol = 2 * 12.011 + 6 * 1.008 + 15.999; /* C2H6O, IUPAC weights */
    const double M_water = 2 * 1.008 + 15.999;                /* H2O */
    pw_assert_close(M_ethanol, 46.069, 0, 1e-9, "M ethanol");
    pw_assert_close(M_water, 18.015, 0, 1e-9, "M water");
    /* the azeotrope: 95.57 wt% ethanol is 89.43 mol% (handbook pair, from memory) */
    pw_assert_close(pw_units_mass_to_mole(0.9557, M_ethanol, M_water), 0.8943, 0, 5e-4,
                    "ethanol-water azeotrope by mass and by mole");
    /* identities: equal molar masses; round trip; ends exact */
    for (int i = 0; i <= 20; i++) {
        double w = i / 20.0;
        pw_assert_close(pw_units_mass_to_mole(w, 30.0, 30.0), w, 1e-15, 1e-16, "equal M");
        double x = pw_units_mass_to_mole(w, M_ethanol, M_water);
        pw_assert_close(pw_units_mole_to_mass(x, M_ethanol, M_water), w, 1e-14, 1e-16,
                        "round trip");
    }
    assert_true(pw_units_mass_to_mole(0.0, 46.0, 18.0) == 0.0);
    assert_true(pw_units_mass_to_mole(1.0, 46.0, 18.0) == 1.0);
}

#define COMP_HDR "name,A,B,C,log,P_unit,T_unit,T_min,T_max,source,M_g_mol\n"
static const char comp_text[] = COMP_HDR
    "ethanol,16.9,3795,230.9,ln,kPa,C,0,150,INVENTED test row (M from IUPAC weights),46.069\n"
    "water,16.4,3885,230.2,ln,kPa,C,0,200,INVENTED test row (M from IUPAC weights),18.015\n"
    "mystery,16.4,3885,230.2,ln,kPa,C,0,200,INVENTED test row without M,\n";

static void dataset_mass_columns(void **state)
{
    (void)state;
    pw_complib lib;
    pw_complib_init(&lib);
    pw_error err;
    pw_error_clear(&err);
    assert_int_equal(pw_complib_parse(&lib, comp_text, strlen(comp_text), "c.csv", &err), PW_OK);
    const pw_component *e = pw_complib_find(&lib, "ethanol"), *w = pw_complib_find(&lib, "water");
    const pw_component *m = pw_complib_find(&lib, "mystery");
    const char *text = "# components: ethanol, water\n# pressure: 1 atm\n"
                       "w1,wy1,T (\xc2\xb0"
                       "C)\n0.9557,0.9557,78.15\n0.5,0.8,82\n";
    pw_dataset ds;
    assert_int_equal(pw_dataset_parse(text, strlen(text), "w.csv", &ds, &err), PW_OK);
    assert_true(ds.mass_x && ds.mass_y);
    assert_string_equal(ds.T_unit, "C");
    pw_assert_close(ds.pts[0].T_K, 351.30, 1e-12, 0, "T (degree C) header");
    assert_int_equal(ds.composition_line, 3);
    /* a molar mass unknown: refused naming the column, the component and the column to add */
    assert_int_equal(pw_dataset_to_mole(&ds, e, m, &err), PW_ENOTFOUND);
    assert_non_null(strstr(err.msg, "w1"));
    assert_non_null(strstr(err.msg, "'mystery'"));
    assert_non_null(strstr(err.msg, "M_g_mol"));
    assert_int_equal(err.line, 3);
    pw_assert_close(ds.pts[0].x1, 0.9557, 0, 0, "unchanged after a refusal");
    assert_int_equal(pw_dataset_to_mole(&ds, e, w, &err), PW_OK);
    assert_false(ds.mass_x || ds.mass_y);
    pw_assert_close(ds.pts[0].x1, 0.8943, 0, 5e-4, "w1 converted (azeotrope pair)");
    pw_assert_close(ds.pts[0].y1, 0.8943, 0, 5e-4, "wy1 converted");
    pw_assert_close(ds.pts[1].x1, (0.5 / 46.069) / (0.5 / 46.069 + 0.5 / 18.015), 1e-14, 0,
                    "w1 = 0.5");
    pw_dataset_free(&ds);

    /* a mass-fraction dataset may not reach the fit unconverted; both x1 and w1 is refused */
    const char *both = "# components: ethanol, water\n# pressure: 1 atm\nx1,w1,T[C]\n0.5,0.5,80\n";
    assert_int_equal(pw_dataset_parse(both, strlen(both), "b.csv", &ds, &err), PW_EPARSE);
    assert_non_null(strstr(err.msg, "x1 for mole fractions or w1 for mass fractions"));
    const char *pct = "# components: ethanol, water\n# pressure: 1 atm\nw1,T[C]\n50,80\n";
    assert_int_equal(pw_dataset_parse(pct, strlen(pct), "p.csv", &ds, &err), PW_EPARSE);
    assert_non_null(strstr(err.msg, "looks like mass percent; divide by 100"));
    pw_complib_free(&lib);
}

static void header_spellings(void **state)
{
    (void)state;
    static const char *const headers[] = {"T[C]",
                                          "T [C]",
                                          "T (C)",
                                          "T(C)",
                                          "T[degC]",
                                          "T[\xc2\xb0"
                                          "C]",
                                          "t ( degc )"};
    for (size_t i = 0; i < sizeof headers / sizeof *headers; i++) {
        char text[200];
        snprintf(text, sizeof text,
                 "# components: a, b\n# pressure: 760 torr\nx1,\"%s\"\n0.5,80\n0.6,79\n",
                 headers[i]);
        pw_dataset ds;
        pw_error err;
        pw_error_clear(&err);
        if (pw_dataset_parse(text, strlen(text), "h.csv", &ds, &err) != PW_OK) {
            print_error("header '%s' refused: %s\n", headers[i], err.msg);
            fail();
        }
        pw_assert_close(ds.pts[0].T_K, 353.15, 1e-15, 0, headers[i]);
        pw_assert_close(ds.P_fixed_Pa, 101325.0, 1e-15, 0, "760 torr");
        assert_string_equal(ds.P_unit, "mmHg");
        pw_dataset_free(&ds);
    }
    const char *pct = "# components: a, b\n# pressure: 1 atm\nx1,T[C]\n10,80\n";
    pw_dataset ds;
    pw_error err;
    assert_int_equal(pw_dataset_parse(pct, strlen(pct), "p.csv", &ds, &err), PW_EPARSE);
    assert_non_null(strstr(err.msg, "x1 = 10 is outside [0, 1]"));
    assert_non_null(strstr(err.msg, "looks like mole percent; divide by 100"));
    const char *sig = "# components: a, b\n# pressure: 1 atm\n# sigma_P: 0.3 torr\n"
                      "# sigma_T: 0.18 degF\nx1,T[C]\n0.5,80\n";
    assert_int_equal(pw_dataset_parse(sig, strlen(sig), "s.csv", &ds, &err), PW_OK);
    pw_assert_close(ds.sigma_P_abs_Pa, 0.3 * 101325.0 / 760.0, 1e-15, 0, "sigma_P in torr");
    pw_assert_close(ds.sigma_T_K, 0.1, 1e-14, 0, "sigma_T in degF");
    pw_dataset_free(&ds);
}

/* Files as spreadsheets export them (invented numbers, reader round trips only). */
static void spreadsheet_exports(void **state)
{
    (void)state;
    const char *semi = "\xef\xbb\xbf\"# components: ethanol; water\";;\r\n"
                       "# pressure: 101,325 kPa;;\r\n"
                       "# sigma_T: 0,1 K;;\r\n"
                       "x1;y1;T (\xc2\xb0"
                       "C)\r\n"
                       "0,1;0,43;86,7\r\n"
                       "0,5;0,65;79,8\r\n";
    pw_dataset ds;
    pw_error err;
    pw_error_clear(&err);
    if (pw_dataset_parse(semi, strlen(semi), "semi.csv", &ds, &err) != PW_OK) {
        print_error("semicolon file refused: %s:%ld: %s\n", err.file, err.line, err.msg);
        fail();
    }
    assert_string_equal(ds.names[0], "ethanol");
    assert_string_equal(ds.names[1], "water");
    pw_assert_close(ds.P_fixed_Pa, 101325.0, 1e-15, 0, "101,325 kPa");
    pw_assert_close(ds.sigma_T_K, 0.1, 1e-15, 0, "0,1 K");
    assert_int_equal(ds.n, 2);
    pw_assert_close(ds.pts[0].x1, 0.1, 0, 0, "0,1");
    pw_assert_close(ds.pts[0].y1, 0.43, 0, 0, "0,43");
    pw_assert_close(ds.pts[1].T_K, 352.95, 1e-14, 0, "79,8 C");
    pw_dataset_free(&ds);

    const char *dioxane =
        "# components: chloroform; \"1,4-dioxane\"\n# temperature: 50 C\nx1;P[kPa]\n"
        "0,5;20,1\n";
    assert_int_equal(pw_dataset_parse(dioxane, strlen(dioxane), "d.csv", &ds, &err), PW_OK);
    assert_string_equal(ds.names[1], "1,4-dioxane");
    pw_assert_close(ds.pts[0].P_Pa, 20100.0, 1e-15, 0, "20,1 kPa");
    pw_dataset_free(&ds);

    const char *tabs = "# components: a, b\n# pressure: 1 atm\nx1\tT[K]\n0.5\t350\n0.6\t349\n";
    assert_int_equal(pw_dataset_parse(tabs, strlen(tabs), "tabs.csv", &ds, &err), PW_OK);
    pw_assert_close(ds.pts[1].T_K, 349.0, 0, 0, "tab separated");
    pw_dataset_free(&ds);

    const char *cells = "\"# components: a, b\",,\n# pressure: 1 atm,,\nx1,y1,T[K]\n0.5,0.6,350\n";
    assert_int_equal(pw_dataset_parse(cells, strlen(cells), "cells.csv", &ds, &err), PW_OK);
    assert_string_equal(ds.names[1], "b");
    pw_dataset_free(&ds);

    /* decimal commas in a comma-separated file: refused with what was found and what to do */
    const char *dc = "# components: a, b\n# pressure: 1 atm\nx1,y1,T[K]\n0,5,0,6,350\n";
    assert_int_equal(pw_dataset_parse(dc, strlen(dc), "dc.csv", &ds, &err), PW_EPARSE);
    assert_non_null(strstr(err.msg, "row has 5 fields"));
    assert_non_null(strstr(err.msg, "decimal commas"));
    const char *dq = "# components: a, b\n# pressure: 1 atm\nx1,T[K]\n\"0,5\",350\n";
    assert_int_equal(pw_dataset_parse(dq, strlen(dq), "dq.csv", &ds, &err), PW_EPARSE);
    assert_non_null(strstr(err.msg, "'0,5' is not a number"));
    assert_non_null(strstr(err.msg, "decimal comma"));
    const char *pc = "# components: a, b\n# pressure: 101,325 kPa\nx1,T[K]\n0.5,350\n";
    assert_int_equal(pw_dataset_parse(pc, strlen(pc), "pc.csv", &ds, &err), PW_EPARSE);
    assert_non_null(strstr(err.msg, "decimal comma"));
    /* the first line after the metadata names what the reader saw */
    const char *nox = "# components: a, b\n# pressure: 1 atm\nX_1|T[K]\n0.5|350\n";
    assert_int_equal(pw_dataset_parse(nox, strlen(nox), "nox.csv", &ds, &err), PW_EPARSE);
    assert_non_null(strstr(err.msg, "no x1 column"));
}

int main(void)
{
    pw_test_init();
    const struct CMUnitTest tests[] = {
        cmocka_unit_test(aliases_by_definition), cmocka_unit_test(blank_between_number_and_unit),
        cmocka_unit_test(uncertainty_syntax),    cmocka_unit_test(composition_syntax),
        cmocka_unit_test(mass_to_mole),          cmocka_unit_test(dataset_mass_columns),
        cmocka_unit_test(header_spellings),      cmocka_unit_test(spreadsheet_exports),
    };
    return cmocka_run_group_tests(tests, NULL, NULL);
}
