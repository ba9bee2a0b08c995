/* Assessments: the judgements that the command line and the report show, computed once here as
 * plain results (they only render them).
 *
 * Model ranking. Every fit of the same data is ranked by one rule: sound fits first (converged,
 * and no liquid split predicted unless the data hold three-phase points or tie lines), then by
 * AICc (Hurvich & Tsai 1989). delta = AICc - AICc of the
 * best sound fit; the classes follow Burnham & Anderson (2002, Model Selection and Multimodel
 * Inference, 2nd ed., sec. 2.6): delta < 2 the data cannot tell the model from the best, < 10
 * considered, >= 10 essentially no support. Akaike weights exp(-delta/2), normalised over the
 * considered sound fits. Beside the ranking, each fit's azeotropes at its data's condition and,
 * when targets are given, its column (R_min); the considered fits' disagreement on these is the
 * model risk the parameter intervals do not show. Disagreement thresholds (this project's
 * choice, documented in docs/assess.md): azeotrope placements more than 0.01 in x1 apart
 * (about twice the scatter of a good measurement of y), R_min more than 10 % apart. */
#ifndef PINCHWISE_ASSESS_H
#define PINCHWISE_ASSESS_H

#include <pinchwise/azeotrope.h>
#include <pinchwise/column.h>
#include <pinchwise/fit.h>
#include <pinchwise/lle.h>
#include <pinchwise/status.h>
#include <stdbool.h>
#include <stddef.h>

#ifdef __cplusplus
extern "C" {
#endif

#define PW_RANK_MAX 16
#define PW_AICC_EQUAL 2.0       /* Burnham & Anderson (2002), sec. 2.6 */
#define PW_AICC_CONSIDERED 10.0 /* Burnham & Anderson (2002), sec. 2.6 */
#define PW_AZ_DISAGREE_X 0.01   /* this project's choice (docs/assess.md) */
#define PW_RMIN_DISAGREE_REL 0.10 /* this project's choice (docs/assess.md) */

typedef enum {
    PW_RANK_BEST = 0,       /* the best sound fit */
    PW_RANK_EQUAL = 1,      /* delta < 2 */
    PW_RANK_CONSIDERED = 2, /* 2 <= delta < 10 */
    PW_RANK_DROPPED = 3,    /* delta >= 10 */
    PW_RANK_UNSOUND = 4,    /* did not converge, or predicts a liquid split */
    PW_RANK_FEWER = 5       /* fitted fewer residuals than the others (a model that cannot split
                               leaves three-phase points out): its AICc is not comparable */
} pw_rank_class;

/* Short words for a class: "best", "indistinguishable", "considered", "no support", "unsound",
 * "not comparable". */
const char *pw_rank_class_name(pw_rank_class c);

/* Column targets for the ranking: the same split solved with every model. */
typedef struct pw_rank_column {
    pw_column_spec spec;
    double P_Pa;
} pw_rank_column;

/* One azeotrope as the ranking lists it, in the azeotrope command's order: the homogeneous
 * roots outside the two-liquid region, then the heterogeneous one (heterogeneous true: x1 is the
 * three-phase vapor between the layers, T/P the three-phase condition; minimum-boiling). */
typedef struct pw_rank_az {
    double x1, T_K, P_Pa;
    pw_az_kind kind;
    bool heterogeneous;
} pw_rank_az;

typedef struct pw_rank_row {
    size_t index;              /* position in the caller's array of fits */
    const pw_fit_result *fit;  /* borrowed from the caller */
    bool sound;
    double delta_aicc;         /* NAN when no sound fit exists or the AICc is not finite */
    double weight;             /* Akaike weight; 0 outside the considered sound fits */
    pw_rank_class cls;
    pw_status az_status;       /* of pw_azeotrope_search at the data's condition */
    pw_az_result az;           /* its homogeneous roots outside the two-liquid region */
    pw_three_phase tp;         /* its three-phase state (tp.exists false: none) */
    pw_rank_az azs[PW_AZ_MAX + 1]; /* every azeotrope, as the azeotrope command lists them */
    size_t n_azs;
    bool column;               /* a column was asked for */
    pw_status col_status;      /* of pw_column_solve (PW_OK also when infeasible) */
    pw_column_result col;
} pw_rank_row;

typedef struct pw_ranking {
    pw_rank_row rows[PW_RANK_MAX]; /* sorted: rank 1 first */
    size_t n, n_considered;        /* considered = sound with delta < 10 */
    /* model risk among the considered fits */
    bool az_existence_differs;     /* some place an azeotrope at the data's condition, some none */
    bool az_place_differs;         /* placements spread more than PW_AZ_DISAGREE_X */
    double az_x_lo, az_x_hi;       /* spread of the first azeotrope's x1 (azs[0]; NAN when none) */
    bool feasibility_differs;      /* the column is feasible with some, not with others */
    bool rmin_differs;             /* R_min spread above PW_RMIN_DISAGREE_REL of the lowest */
    double rmin_lo, rmin_hi;       /* NAN when no considered fit gives one */
} pw_ranking;

/* Ranks n fits of the same data (1 <= n <= PW_RANK_MAX; PW_EINVAL otherwise, or for fits of
 * different data: other objectives or unequal dataset hashes). A fit with fewer residuals than
 * the most any fit has is ranked last as PW_RANK_FEWER (AICc compares fits of the same points
 * only). Classes and weights only; no equilibrium is computed. */
pw_status pw_rank_fits(const pw_fit_result *const *fits, size_t n, pw_ranking *out);

/* pw_rank_fits, then each fit's azeotropes at its data's condition (pw_azeotrope_search, the
 * azeotrope command's search, heterogeneous ones included) and, with col, its column;
 * fills the model-risk flags. A failed search or solve is recorded in the row, not returned. */
pw_status pw_rank_assess(const pw_fit_result *const *fits, size_t n, const pw_rank_column *col,
                         pw_ranking *out);

/* The azeotropes of one pw_azeotrope_search (r, tp) as one list in the azeotrope command's
 * order into out (room for PW_AZ_MAX + 1); returns how many. */
size_t pw_rank_az_list(const pw_az_result *r, const pw_three_phase *tp, pw_rank_az *out);

/* The sound-fit rule that applied to these fits, in words (static string): whether a predicted
 * liquid split made a fit unsound (one-liquid data) or was allowed (the data hold three-phase
 * points or tie lines). For the reasons the command line and the report print. */
const char *pw_rank_rule_text(const pw_ranking *rk);

/* True when a predicted liquid split is allowed for fits of these data (measured two liquids). */
bool pw_rank_split_allowed(const pw_fit_result *r);

#ifdef __cplusplus
}
#endif
#endif
