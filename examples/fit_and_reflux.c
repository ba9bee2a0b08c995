/* Example: pinchwise used as a library from C.
 *
 * Fits the NRTL model to a measured binary VLE file, lists the azeotropes at a pressure and
 * finds the minimum reflux of a column, then prints the same reflux document that
 * `pinchwise reflux --json` prints.
 *
 *     fit_and_reflux DATA.csv PRESSURE XD XB ZF      e.g. demo_acetone_water.csv 101.325kPa 0.95
 * 0.02 0.10
 *
 * Build against an installed pinchwise with pkg-config:
 *     cc -std=c17 fit_and_reflux.c $(pkg-config --cflags --libs pinchwise) -o fit_and_reflux
 * or with CMake: find_package(pinchwise) and target_link_libraries(... pinchwise::pinchwise)
 * (examples/CMakeLists.txt). Screening results only: see the README's cautions. */
#include <pinchwise/api.h>
#include <pinchwise/azeotrope.h>
#include <pinchwise/column.h>
#include <pinchwise/commands.h>
#include <pinchwise/component.h>
#include <pinchwise/curve.h>
#include <pinchwise/dataset.h>
#include <pinchwise/design_doc.h>
#include <pinchwise/fit.h>
#include <pinchwise/units.h>
#include <stdio.h>
#include <stdlib.h>

static int fail(const pw_error *err)
{
    char buf[PW_PATH_MAX + PW_ERROR_MSG_MAX + 8];
    fprintf(stderr, "fit_and_reflux: %s\n", pw_error_format(err, buf, sizeof buf));
    return 1;
}

int main(int argc, char **argv)
{
    if (argc != 6) {
        fprintf(stderr, "usage: fit_and_reflux DATA.csv PRESSURE XD XB ZF\n");
        return 2;
    }
    pw_api_init(); /* GSL reports errors as statuses instead of aborting */
    pw_error err;
    pw_error_clear(&err);

    char lib_path[PW_PATH_MAX];
    if (pw_complib_default_path(lib_path, sizeof lib_path))
        printf("component library: %s\n", lib_path);
    pw_complib lib;
    if (pw_complib_load_default(&lib, NULL, &err) != PW_OK)
        return fail(&err);

    pw_dataset ds;
    if (pw_dataset_read(argv[1], &ds, &err) != PW_OK) {
        pw_complib_free(&lib);
        return fail(&err);
    }
    pw_component comp[2];
    pw_fit_result fit;
    pw_fit_options fo = pw_fit_default_options();
    pw_status st = pw_dataset_components(&lib, &ds, comp, &err);
    if (st == PW_OK)
        st = pw_fit_run(&ds, &comp[0], &comp[1], pw_model_find("nrtl"), &fo, &fit, &err);
    pw_dataset_free(&ds);
    pw_complib_free(&lib);
    if (st != PW_OK)
        return fail(&err);
    printf("fit: %s / %s, nrtl, converged %s, chi2/dof %.6g\n", fit.sys.comp[0].name,
           fit.sys.comp[1].name, fit.converged ? "yes" : "no", fit.chi2_red);

    double P_Pa;
    if (pw_units_parse_quantity(PW_QTY_PRESSURE, argv[2], &P_Pa, &err) != PW_OK) {
        pw_fit_result_free(&fit);
        return fail(&err);
    }
    pw_az_result az;
    if (pw_azeotrope_find(&fit.sys, PW_AZ_ISOBARIC, P_Pa, NULL, &az) == PW_OK)
        for (size_t i = 0; i < az.n; i++)
            printf("azeotrope: x1 = %.6f at %.3f K (%s)\n", az.az[i].x1, az.az[i].T_K,
                   pw_az_kind_name(az.az[i].kind));

    pw_column_spec spec = {.xd = atof(argv[3]), .xb = atof(argv[4]), .zf = atof(argv[5]), .q = 1.0};
    pw_column_options opt = pw_column_default_options(), opt_col = opt;
    opt_col.n_factors = 0; /* the design rows, with stage profiles, come from pw_reflux_design */
    pw_column_result col;
    double T_top, T_bottom;
    pw_design_table design;
    st = pw_reflux_solve(&fit.sys, P_Pa, &spec, &opt_col, argv[1], &col, &T_top, &T_bottom, &err);
    if (st == PW_OK)
        st = pw_reflux_design(&fit.sys, P_Pa, &spec, &opt, &col, NULL, &design, NULL);
    if (st != PW_OK) {
        pw_fit_result_free(&fit);
        return fail(&err);
    }
    if (col.feasible)
        printf("r_min: %.17g (%s pinch)\n", col.r_min,
               col.pinch.kind == PW_PINCH_FEED ? "feed" : "tangent");
    else
        printf("not feasible: %s\n", col.reason);

    json_t *doc = pw_reflux_command_doc(&fit.sys, &col, &design, NULL, P_Pa, &spec, T_top,
                                        T_bottom);
    pw_design_table_free(&design);
    char *text = pw_json_text(doc);
    json_decref(doc);
    if (text)
        printf("%s\n", text);
    free(text);
    pw_fit_result_free(&fit);
    return text ? 0 : 1;
}
