/* The rate command's computation and its `--json` document (moved from src/cli/cmd_rate.c). */
#include <math.h>
#include <pinchwise/commands.h>
#include <pinchwise/design_doc.h>
#include <stdio.h>
#include <string.h>

pw_status pw_rate_run(const pw_system *sys, double P_Pa, const pw_rate_spec *spec, bool energy,
                      const char *where, pw_rate_result *r, pw_rate_energy_out *en, pw_error *err)
{
    memset(r, 0, sizeof *r);
    r->xd = r->xb = r->residual = NAN;
    *en = (pw_rate_energy_out){.Q_C = NAN, .Q_R = NAN};
    pw_status st;
    if (energy) {
        pw_heat_data heat;
        st = pw_heat_data_from_system(sys, &heat, err);
        if (st == PW_OK)
            st = pw_rate_energy(sys, &heat, P_Pa, spec, r, &en->Q_C, &en->Q_R, &en->n_roots, err);
    } else {
        st = pw_rate_cmo(sys, P_Pa, spec, r, err);
    }
    if (st != PW_OK && err) {
        char msg[PW_ERROR_MSG_MAX];
        snprintf(msg, sizeof msg, "%s", err->msg);
        pw_error_set(err, st, where, 0, "%s%s", energy ? "--energy: " : "", msg);
    }
    return st;
}

json_t *pw_rate_doc(const pw_system *sys, double P_Pa, const pw_rate_spec *spec, bool energy,
                    const pw_rate_result *r, const pw_rate_energy_out *en)
{
    json_t *o = json_object();
    json_object_set_new(o, "xd", pw_json_num(r->xd));
    json_object_set_new(o, "xb", pw_json_num(r->xb));
    json_object_set_new(o, "stages", pw_profile_doc(&r->profile));
    json_object_set_new(o, "balance",
                        json_string(pw_balance_name(energy ? PW_BALANCE_ENERGY : PW_BALANCE_CMO)));
    if (energy) {
        json_object_set_new(o, "condenser_kJ_per_mol_feed", pw_json_num(en->Q_C / 1e3));
        json_object_set_new(o, "reboiler_kJ_per_mol_feed", pw_json_num(en->Q_R / 1e3));
        json_object_set_new(o, "steady_states_found", json_integer((json_int_t)en->n_roots));
    }
    json_object_set_new(o, "components", json_pack("[s,s]", sys->comp[0].name, sys->comp[1].name));
    json_t *sp = json_object();
    json_object_set_new(sp, "P_kPa", pw_json_num(P_Pa / 1e3));
    json_object_set_new(sp, "stages", json_integer(spec->n_stages));
    json_object_set_new(sp, "feed_stage", json_integer(spec->feed_stage));
    json_object_set_new(sp, "reflux", pw_json_num(spec->R));
    json_object_set_new(sp, "zf", pw_json_num(spec->zf));
    json_object_set_new(sp, "q", pw_json_num(spec->q));
    json_object_set_new(sp, "distillate_per_mol_feed", pw_json_num(spec->d_frac));
    json_object_set_new(o, "spec", sp);
    json_object_set_new(o, "feed_stage_mismatch", pw_json_num(r->residual));
    json_object_set_new(o, "stage_convention",
                        json_string("equilibrium stages counted from the top, the partial reboiler "
                                    "as the last; total condenser not counted; L and V leave the "
                                    "stage, moles per mole of feed"));
    json_object_set_new(
        o, "caution",
        json_string(energy ? "Screening estimate (energy balance on every stage with the component "
                             "data's heats, equilibrium stages, fitted model). Real trays need an "
                             "efficiency. Verify with rigorous simulation and plant data; operate "
                             "and modify equipment per local codes under licensed review."
                           : "Screening estimate (constant molal overflow, equilibrium "
                             "stages, fitted model). Real trays need an efficiency. Verify "
                             "with rigorous simulation and plant data; operate and modify "
                             "equipment per local codes under licensed review."));
    return o;
}
