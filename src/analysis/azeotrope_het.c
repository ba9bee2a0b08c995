/* Heterogeneous azeotropes: the three-phase state at the search's condition, and removal of the
 * y = x crossings that lie inside the two-liquid region (METHODS2 3.2). */
#include <pinchwise/azeotrope.h>
#include <pinchwise/lle.h>

#include <string.h>

pw_status pw_azeotrope_heterogeneous(const pw_system *s, int mode, double fixed,
                                     struct pw_az_result *r, pw_three_phase *tp,
                                     size_t *n_removed)
{
    if (!s || !r || !tp || (mode != PW_AZ_ISOBARIC && mode != PW_AZ_ISOTHERMAL))
        return PW_EINVAL;
    if (n_removed)
        *n_removed = 0;
    pw_status st = mode == PW_AZ_ISOBARIC ? pw_three_phase_at_P(s, fixed, tp)
                                          : pw_three_phase_at_T(s, fixed, tp);
    if (st != PW_OK)
        return st;
    size_t keep = 0;
    for (size_t i = 0; i < r->n; i++) {
        pw_lle_result l;
        st = pw_lle_solve(s, r->az[i].T_K, &l);
        if (st != PW_OK)
            return st;
        bool inside = false;
        for (size_t p = 0; l.split && p < l.n_pairs; p++)
            if (r->az[i].x1 > l.pairs[p][0] && r->az[i].x1 < l.pairs[p][1])
                inside = true;
        if (inside) {
            if (n_removed)
                (*n_removed)++;
            continue;
        }
        if (keep != i)
            r->az[keep] = r->az[i];
        keep++;
    }
    r->n = keep;
    return PW_OK;
}

pw_status pw_azeotrope_search(const pw_system *s, int mode, double fixed, struct pw_az_result *r,
                              pw_three_phase *tp, size_t *n_removed, bool *het_failed)
{
    if (het_failed)
        *het_failed = false;
    if (n_removed)
        *n_removed = 0;
    if (!tp || !r)
        return PW_EINVAL;
    memset(tp, 0, sizeof *tp);
    pw_status st = pw_azeotrope_find(s, (pw_az_mode)mode, fixed, NULL, r);
    if (st != PW_OK)
        return st;
    st = pw_azeotrope_heterogeneous(s, mode, fixed, r, tp, n_removed);
    if (st != PW_OK && het_failed)
        *het_failed = true;
    return st;
}
