/* The shipped component library against handbook normal boiling points.
 *
 * Every row's saturation temperature at 101.325 kPa (pw_tsat) must lie within 0.3 K of the
 * normal boiling point listed here, and inside the row's own validity range. Reference values:
 * CRC Handbook of Chemistry and Physics (e.g. 85th ed. 2004, "Physical Constants of Organic
 * Compounds"), except where a row names Riddick, Bunger & Sakano, Organic Solvents, 4th ed.
 * 1986, and water, whose value is the IAPWS-IF97 region 4 saturation temperature at
 * 101.325 kPa (IAPWS R7-97(2012)). All values are from memory, not read from the books. */
#include "pw_test.h"

#include <math.h>
#include <pinchwise/component.h>
#include <stdio.h>
#include <string.h>

typedef struct {
    const char *name;
    double tb_C;
    const char *source;
} nbp;

static const nbp table[] = {
    {"water", 99.974, "IAPWS-IF97 Tsat(101.325 kPa) = 373.124 K (from memory)"},
    {"methanol", 64.6, "CRC (from memory)"},
    {"ethanol", 78.29, "CRC (from memory)"},
    {"1-propanol", 97.2, "CRC (from memory)"},
    {"2-propanol", 82.3, "CRC (from memory)"},
    {"1-butanol", 117.73, "CRC (from memory)"},
    {"2-butanol", 99.51, "CRC (from memory)"},
    {"isobutanol", 107.89, "CRC (from memory)"},
    {"tert-butanol", 82.4, "CRC (from memory)"},
    {"acetone", 56.05, "CRC (from memory)"},
    {"2-butanone", 79.59, "CRC (from memory)"},
    {"methyl acetate", 56.87, "CRC (from memory)"},
    {"ethyl acetate", 77.11, "CRC (from memory)"},
    {"benzene", 80.09, "CRC (from memory)"},
    {"toluene", 110.63, "CRC (from memory)"},
    {"o-xylene", 144.5, "CRC (from memory)"},
    {"m-xylene", 139.12, "CRC (from memory)"},
    {"p-xylene", 138.37, "CRC (from memory)"},
    {"ethylbenzene", 136.19, "CRC (from memory)"},
    {"n-pentane", 36.06, "CRC (from memory)"},
    {"n-hexane", 68.73, "CRC (from memory)"},
    {"n-heptane", 98.38, "CRC (from memory)"},
    {"n-octane", 125.62, "CRC (from memory)"},
    {"cyclohexane", 80.73, "CRC (from memory)"},
    {"chloroform", 61.17, "CRC (from memory)"},
    {"dichloromethane", 39.64, "Riddick, Bunger & Sakano (from memory)"},
    {"carbon tetrachloride", 76.8, "CRC (from memory)"},
    {"1,4-dioxane", 101.5, "CRC (from memory)"},
    {"tetrahydrofuran", 65.97, "Riddick, Bunger & Sakano (from memory)"},
    {"acetonitrile", 81.65, "CRC (from memory)"},
    {"acetic acid", 117.9, "CRC (from memory)"},
    {"diethyl ether", 34.5, "CRC (from memory)"},
    {"chlorobenzene", 131.72, "CRC (from memory)"},
    {"nitromethane", 101.19, "CRC (from memory)"},
    {"pyridine", 115.23, "CRC (from memory)"},
};
enum { N_TABLE = sizeof table / sizeof *table };

static const double tolerance_K = 0.3;

static void load(pw_complib *lib)
{
    char path[1024];
    pw_error err;
    pw_complib_init(lib);
    pw_test_path(path, sizeof path, "datasets/components.csv");
    if (pw_complib_read(lib, path, &err) != PW_OK) {
        print_error("%s:%ld: %s\n", err.file, err.line, err.msg);
        fail();
    }
}

static void every_row_has_a_reference_and_back(void **state)
{
    (void)state;
    pw_complib lib;
    load(&lib);
    assert_int_equal(lib.n, N_TABLE);
    for (size_t i = 0; i < N_TABLE; i++)
        if (!pw_complib_find(&lib, table[i].name)) {
            print_error("'%s' is not in the library\n", table[i].name);
            fail();
        }
    pw_complib_free(&lib);
}

static const nbp *reference(const char *name)
{
    for (size_t i = 0; i < N_TABLE; i++)
        if (strcmp(table[i].name, name) == 0)
            return &table[i];
    return NULL;
}

static void check_row(const pw_component *c, const nbp *ref, const char *label)
{
    double T = NAN;
    pw_status st = pw_tsat(c, 101325.0, &T);
    if (st != PW_OK) {
        print_error("%s: pw_tsat failed: %s\n", label, pw_strerror(st));
        fail();
    }
    char what[200];
    snprintf(what, sizeof what, "%s: normal boiling point vs %s", label, ref->source);
    pw_assert_close(T, ref->tb_C + 273.15, 0.0, tolerance_K, what);
    double tb_K = ref->tb_C + 273.15;
    if (!(c->T_min_K <= tb_K && tb_K <= c->T_max_K)) {
        print_error("%s: validity range %.2f-%.2f K does not contain Tb = %.2f K\n", label,
                    c->T_min_K, c->T_max_K, tb_K);
        fail();
    }
}

static void normal_boiling_points_within_tolerance(void **state)
{
    (void)state;
    pw_complib lib;
    load(&lib);
    for (size_t i = 0; i < lib.n; i++) {
        const pw_component *c = &lib.items[i];
        const nbp *ref = reference(c->name);
        if (!ref) {
            print_error("'%s' has no reference boiling point in this test\n", c->name);
            fail();
        }
        check_row(c, ref, c->name);
        /* water also carries Antoine constants; they must be valid on their own */
        if (c->equation == PW_PSAT_IAPWS_IF97) {
            pw_component antoine = *c;
            antoine.equation = PW_PSAT_ANTOINE;
            check_row(&antoine, ref, "water (Antoine constants)");
        }
    }
    pw_complib_free(&lib);
}

int main(void)
{
    pw_test_init();
    const struct CMUnitTest tests[] = {
        cmocka_unit_test(every_row_has_a_reference_and_back),
        cmocka_unit_test(normal_boiling_points_within_tolerance),
    };
    return cmocka_run_group_tests(tests, NULL, NULL);
}
