/* Text of design rows and stage profiles (design_out.h). */
#include "design_out.h"

#include "cli.h"

#include <math.h>
#include <pinchwise/design_doc.h>
#include <stdio.h>

void cli_design_print(const pw_design_table *t)
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
                   pw_design_unreachable_text(r->why));
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

void cli_profile_print(const pw_profile *p, const pw_display_units *u)
{
    char head[16];
    snprintf(head, sizeof head, "T %s", pw_units_display_T_symbol(u));
    printf("  %5s %10s %10s %*s %9s %9s\n", "stage", "x1", "y1", cli_width(9, head), head, "L/F",
           "V/F");
    for (size_t i = 0; i < p->n; i++) {
        const pw_stage *s = &p->stage[i];
        printf("  %5zu %10.6f %10.6f %9.3f %9.4f %9.4f%s\n", i + 1, s->x, s->y,
               pw_units_display_T(u, s->T_K), s->L, s->V,
               (int)i + 1 == p->feed_stage ? "  feed"
               : i + 1 == p->n             ? "  reboiler"
                                           : "");
    }
}
