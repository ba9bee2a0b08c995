/* Heterogeneous azeotropes: the three-phase state at the search's condition, and removal of the
 * y = x crossings that lie inside the two-liquid region (METHODS2 3.2). */
#include <pinchwise/azeotrope.h>
#include <pinchwise/lle.h>

#include <string.h>

#include "analysis/az_internal.h"

pw_status pw_three_phase_at(const pw_system *s, int mode, double at, pw_three_phase *tp)
{
    return mode == PW_AZ_ISOBARIC ? pw_three_phase_at_P(s, at, tp) : pw_three_phase_at_T(s, at, tp);
}

pw_status pw_az_drop_inside(const pw_system *s, struct pw_az_result *r, size_t *n_removed)
{
    bool drop[PW_AZ_MAX] = {false};
    size_t n_drop = 0;
    for (size_t i = 0; i < r->n; i++) {
        pw_lle_result l;
        pw_status st = pw_lle_solve(s, r->az[i].T_K, &l);
        if (st != PW_OK)
            return st;
        bool inside = false;
        for (size_t p = 0; l.split && p < l.n_pairs; p++)
            if (r->az[i].x1 > l.pairs[p][0] && r->az[i].x1 < l.pairs[p][1])
                inside = true;
        drop[i] = inside;
        n_drop += inside;
    }
    size_t keep = 0;
    for (size_t i = 0; i < r->n; i++)
        if (!drop[i])
            r->az[keep++] = r->az[i];
    r->n = keep;
    if (n_removed)
        *n_removed += n_drop;
    return PW_OK;
}

pw_status pw_azeotrope_heterogeneous(const pw_system *s, int mode, double fixed,
                                     struct pw_az_result *r, pw_three_phase *tp,
                                     size_t *n_removed)
{
    if (!s || !r || !tp || (mode != PW_AZ_ISOBARIC && mode != PW_AZ_ISOTHERMAL))
        return PW_EINVAL;
    if (n_removed)
        *n_removed = 0;
    pw_status st = pw_three_phase_at(s, mode, fixed, tp);
    return st != PW_OK ? st : pw_az_drop_inside(s, r, n_removed);
}

pw_status pw_azeotrope_search(const pw_system *s, int mode, double fixed, struct pw_az_result *r,
                              pw_three_phase *tp, size_t *n_removed, bool *het_failed)
{
    return pw_azeotrope_search_opt(s, mode, fixed, NULL, r, tp, n_removed, het_failed);
}

pw_status pw_azeotrope_search_opt(const pw_system *s, int mode, double fixed,
                                  const struct pw_az_options *opt, struct pw_az_result *r,
                                  pw_three_phase *tp, size_t *n_removed, bool *het_failed)
{
    if (het_failed)
        *het_failed = false;
    if (n_removed)
        *n_removed = 0;
    if (!s || !tp || !r || (mode != PW_AZ_ISOBARIC && mode != PW_AZ_ISOTHERMAL))
        return PW_EINVAL;
    memset(tp, 0, sizeof *tp);
    pw_az_options o = opt ? *opt : pw_azeotrope_default_options();
    /* the three-phase state first: its layers are left out of the one-liquid search (no
     * azeotrope can lie there, and a strongly non-ideal model may have no one-liquid bubble
     * point inside them) */
    pw_status st_tp = pw_three_phase_at(s, mode, fixed, tp);
    if (st_tp == PW_OK && tp->exists) {
        o.skip_x1[0] = tp->x[0];
        o.skip_x1[1] = tp->x[1];
    }
    pw_status st = pw_azeotrope_find(s, (pw_az_mode)mode, fixed, &o, r);
    if (st != PW_OK)
        return st;
    if (st_tp == PW_OK)
        st_tp = pw_az_drop_inside(s, r, n_removed);
    if (st_tp != PW_OK && het_failed)
        *het_failed = true;
    return st_tp;
}
