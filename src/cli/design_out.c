/* Rendering of design rows, stage profiles and the energy-balance summary (design_out.h). */
#include "design_out.h"

#include "cli.h"

#include <math.h>
#include <stdio.h>

json_t *pw_cli_profile_json(const pw_profile *p)
{
    json_t *a = json_array();
    for (size_t i = 0; p && i < p->n; i++) {
        const pw_stage *s = &p->stage[i];
        json_t *o = json_object();
        json_object_set_new(o, "stage", json_integer((json_int_t)i + 1));
        json_object_set_new(o, "x1", pw_cli_json_num(s->x));
        json_object_set_new(o, "y1", pw_cli_json_num(s->y));
        json_object_set_new(o, "T_K", pw_cli_json_num(s->T_K));
        json_object_set_new(o, "L", pw_cli_json_num(s->L));
        json_object_set_new(o, "V", pw_cli_json_num(s->V));
        json_array_append_new(a, o);
    }
    return a;
}

static const char *unreachable_text(pw_status why)
{
    if (why == PW_EMAXITER)
        return "not reached: more stages than the stepping limit at this reflux";
    if (why == PW_EINVAL)
        return "not reached: no boil-up at this reflux (the feed brings all the vapor)";
    return "not reached: the operating line meets the equilibrium curve at this reflux (a pinch)";
}

json_t *pw_cli_design_json(const pw_design_table *t)
{
    json_t *d = json_array();
    for (size_t i = 0; i < t->n; i++) {
        const pw_design_case *r = &t->row[i];
        json_t *row = json_object();
        json_object_set_new(row, "factor", pw_cli_json_num(r->factor));
        json_object_set_new(row, "R", pw_cli_json_num(r->R));
        json_object_set_new(row, "boilup", pw_cli_json_num(r->boilup));
        json_object_set_new(row, "reachable", json_boolean(r->reachable));
        json_object_set_new(row, "stages", r->reachable ? pw_cli_json_num(r->stages) : json_null());
        json_object_set_new(row, "feed_stage",
                            r->reachable ? json_integer(r->feed_stage) : json_null());
        if (!r->reachable)
            json_object_set_new(row, "limit", json_string(unreachable_text(r->why)));
        if (t->balance == PW_BALANCE_CMO)
            json_object_set_new(row, "gilliland_stages", pw_cli_json_num(r->gilliland_stages));
        if (t->balance == PW_BALANCE_ENERGY) {
            json_object_set_new(row, "condenser_kJ_per_mol_feed",
                                pw_cli_json_num(r->reachable ? r->Q_C / 1e3 : (double)NAN));
            json_object_set_new(row, "reboiler_kJ_per_mol_feed",
                                pw_cli_json_num(r->reachable ? r->Q_R / 1e3 : (double)NAN));
        }
        json_object_set_new(row, "profile", pw_cli_profile_json(r->reachable ? &r->profile : NULL));
        json_array_append_new(d, row);
    }
    return d;
}

json_t *pw_cli_energy_json(const pw_energy_result *e, double r_min_cmo)
{
    json_t *o = json_object();
    json_object_set_new(o, "r_min_constant_molal_overflow", pw_cli_json_num(r_min_cmo));
    json_object_set_new(o, "r_min_rectifying", pw_cli_json_num(e->r_rect));
    json_object_set_new(o, "r_min_stripping", pw_cli_json_num(e->r_strip));
    json_object_set_new(
        o, "feed_tie_line",
        json_pack("{s:o,s:o}", "x", pw_cli_json_num(e->x_feed), "y", pw_cli_json_num(e->y_feed)));
    json_object_set_new(o, "h_feed_J_mol", pw_cli_json_num(e->h_F));
    json_object_set_new(o, "h_distillate_J_mol", pw_cli_json_num(e->h_D));
    json_object_set_new(o, "h_bottoms_J_mol", pw_cli_json_num(e->h_B));
    json_object_set_new(o, "H_top_vapor_J_mol", pw_cli_json_num(e->H_top));
    json_object_set_new(o, "enthalpy_reference", json_string("pure liquids at 298.15 K"));
    return o;
}

void pw_cli_design_print(const pw_design_table *t)
{
    bool energy = t->balance == PW_BALANCE_ENERGY;
    printf("\n  %-8s %9s %9s %9s %6s", "R/R_min", "R", "Vbar/B", "stages", "feed");
    if (energy)
        printf(" %11s %11s\n", "Q_C kJ/mol", "Q_R kJ/mol");
    else
        printf(" %12s\n", "Gilliland*");
    for (size_t i = 0; i < t->n; i++) {
        const pw_design_case *r = &t->row[i];
        if (!r->reachable) {
            printf("  %-8.3g %9.4f %9.4f  %s\n", r->factor, r->R, r->boilup,
                   unreachable_text(r->why));
            continue;
        }
        printf("  %-8.3g %9.4f %9.4f %9.3f %6d", r->factor, r->R, r->boilup, r->stages,
               r->feed_stage);
        if (energy)
            printf(" %11.4f %11.4f\n", r->Q_C / 1e3, r->Q_R / 1e3);
        else
            printf(" %12.2f\n", r->gilliland_stages);
    }
    printf("  stages include the partial reboiler; feed stage counted from the top.\n");
    if (energy)
        printf("  duties per mole of feed; Vbar/B at the reboiler. Stage profiles: --json.\n");
    else
        printf(
            "  * Molokanov et al. (1972) form of the Gilliland correlation, for comparison only.\n"
            "  Stage profiles: --json.\n");
    printf("  Design reflux of 1.2-1.5 R_min is common practice.\n");
}

void pw_cli_profile_print(const pw_profile *p)
{
    printf("  %5s %10s %10s %9s %9s %9s\n", "stage", "x1", "y1", "T K", "L/F", "V/F");
    for (size_t i = 0; i < p->n; i++) {
        const pw_stage *s = &p->stage[i];
        printf("  %5zu %10.6f %10.6f %9.3f %9.4f %9.4f%s\n", i + 1, s->x, s->y, s->T_K, s->L, s->V,
               (int)i + 1 == p->feed_stage ? "  feed"
               : i + 1 == p->n             ? "  reboiler"
                                           : "");
    }
}
