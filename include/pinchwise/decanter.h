/* The two-column scheme for a partly miscible binary with a heterogeneous azeotrope, and the
 * single column's refusal to cross one.
 *
 * Scheme (METHODS2 4.1, constant molal overflow): fresh feed F (x1 = z, thermal condition q) and
 * both condensed overhead vapors enter one decanter at the three-phase temperature T3; the layer
 * rich in component 1 (x_II) is the liquid top feed of stripping column A (bottoms x_rich > x_II),
 * the other layer (x_I) tops stripping column B (bottoms x_lean < x_I). Each column has a partial
 * reboiler and no condenser of its own. With boil-up ratio S = V/B the operating line of either
 * column is y = x + (x - x_B)/S (x_B its bottoms), and
 *     S_min = max over x between x_B and the top layer of (x - x_B)/(y*(x) - x),
 * reached at the top (the layer's vapor is the three-phase vapor y3: a top pinch) or inside the
 * column (a tangent pinch). The maximum is found by the single column's section search
 * (docs/column.md section 3: a branch and bound over the cells of a coarse table of `grid` points,
 * each cell bounded under a checked bound on the curve's convexity, local maxima refined by GSL
 * Brent), which cannot miss a tangent pinch and does not depend on `grid`; a column whose bottoms
 * is rich in 1 is searched on the mirror image x -> 1 - x. Stages are stepped from
 * the top on the single-liquid branch of the curve (the partial reboiler counted, the last step
 * fractional as in pw_column_total_reflux). q changes no flow (the feed enters the decanter).
 * Methods and sources: docs/heterogeneous.md. */
#ifndef PINCHWISE_DECANTER_H
#define PINCHWISE_DECANTER_H

#include <pinchwise/column.h>
#include <pinchwise/equilibrium.h>
#include <pinchwise/lle.h>
#include <pinchwise/status.h>

#ifdef __cplusplus
extern "C" {
#endif

/* A stripping column fed with saturated liquid x_top on its top stage. */
typedef struct pw_stripper_spec {
    double x_top;     /* liquid fed to the top stage */
    double x_bottom;  /* bottoms */
} pw_stripper_spec;

typedef struct pw_stripper_result {
    bool feasible;
    char reason[PW_REASON_MAX];
    double boilup_min;          /* S_min = V/B */
    bool tangent;               /* the limit lies inside the column, not at its top */
    double x_pinch, y_pinch;    /* where the operating line at S_min touches the curve */
    double n_min;               /* stages at total boil-up (S -> infinity) */
    double y_top_min;           /* vapor leaving the top at S_min */
    size_t n_design;
    struct {
        double factor, boilup, stages, y_top;
    } design[PW_COLUMN_MAX_FACTORS];
} pw_stripper_result;

/* Minimum boil-up, n_min and the design rows (opt->factors) of one stripping column on the
 * equilibrium curve y*(x) (any pw_curve: a fitted model, or a closed form in tests). The curve
 * is evaluated on the side of x_top towards x_bottom and beyond to the pure end; it must not
 * reach y* = x strictly between x_bottom and x_top (feasible false with a reason otherwise).
 * opt may be NULL for the defaults; PW_EINVAL for options outside pw_column_solve's ranges,
 * PW_ENOCONV when the search's convexity bound had to be raised too often (no unproved answer). */
pw_status pw_stripper_solve(const pw_curve *curve, const pw_stripper_spec *spec,
                            const pw_column_options *opt, pw_stripper_result *out);

/* Stages from the top at boil-up S (INFINITY for total boil-up), fractional last step.
 * PW_EINFEASIBLE when S is at or below the minimum (no progress, or the operating line beyond
 * the curve), PW_EMAXITER beyond max_stages. */
pw_status pw_stripper_stages(const pw_curve *curve, const pw_stripper_spec *spec, double S,
                             size_t max_stages, double *stages);

typedef struct pw_decanter_spec {
    double P_Pa, zf, q;
    double x_rich, x_lean;      /* bottoms of column A (rich in 1) and of column B */
    double T_decanter_K;        /* the decanter's temperature: 0 or NAN for the three-phase
                                 * temperature T3 (the default). Below T3 (a cooled decanter)
                                 * the layers are pw_lle_solve's at this temperature, and each
                                 * is heated back to its bubble point before it tops its column
                                 * (the reheat duty below); docs/heterogeneous.md section 3. */
} pw_decanter_spec;

typedef struct pw_decanter_result {
    bool feasible;
    char reason[PW_REASON_MAX];
    pw_three_phase decanter;    /* T3, layers x[0] < x[1], vapor y1 */
    pw_stripper_result col[2];  /* [0]: column A (layer II -> x_rich), [1]: column B */
    double top_x1[2];           /* x_II, x_I */
    double bottoms_per_mol_feed[2]; /* B_A/F, B_B/F */
    double closure;             /* largest |component balance of the decanter| over the design
                                 * rows (the minimum when there are none), per mole of feed */
    /* Streams per mole of fresh feed at design row k of column i (as col[i].design[k]): the
     * vapor V = S B its reboiler sends up, condensed into the decanter, and the layer
     * L = V + B the decanter returns to its top stage. The decanter's layers leave as L_A + L_B
     * = 1 + V_A + V_B (a total balance the test checks). */
    size_t n_rows;              /* design rows both columns have (the rows below; feasible) */
    double vapor_per_mol_feed[2][PW_COLUMN_MAX_FACTORS];
    double layer_per_mol_feed[2][PW_COLUMN_MAX_FACTORS];
    double T_decanter_K;        /* the decanter's temperature (T3 unless cooled) */
    bool cooled;                /* T_decanter_K lies below T3 */
    /* Duties per mole of fresh feed at design row k, J/mol (the project's enthalpy model,
     * include/pinchwise/enthalpy.h, on the constant-molal-overflow flows above), filled when
     * duties is true (both components' heat data known; else NAN and duties_note says why):
     * reboiler of column i, V_i [H_V(y*, T_B) - h_L(x_B, T_B)] at its bottoms' bubble point;
     * reheat of the layer returned to column i, L_i [h_L(x, T_bubble) - h_L(x, T_decanter)]
     * (0 when the decanter is not cooled); the one condenser, which condenses both top vapors
     * (each at its top stage's temperature) and takes the fresh feed (enthalpy from q, as
     * pw_enthalpy_feed, a liquid feed inside the two-liquid region as two layers at T3) to
     * the decanter's layers at T_decanter_K. All three are positive for heat moved as named. */
    bool duties;
    char duties_note[PW_REASON_MAX];
    /* The plant's first-law residual at each design row, J per mole of feed: h_F + sum Q_R +
     * sum Q_H - Q_C - sum_i B_i h_L(x_B,i, T_B,i). Zero for an exact energy balance; here it
     * measures how far the constant-molal-overflow flows are from one (a few percent of the
     * reboilers' duty for 1-butanol/water). NAN without duties. */
    double energy_closure_J[PW_COLUMN_MAX_FACTORS];
    bool condenser_negative;    /* some row's condenser duty is negative: the feed is cold
                                 * enough to take up more heat than the top vapors give off */
    double reboiler_J[2][PW_COLUMN_MAX_FACTORS];
    double reheat_J[2][PW_COLUMN_MAX_FACTORS];
    double condenser_J[PW_COLUMN_MAX_FACTORS];
    double T_lo_K, T_hi_K;      /* temperatures the scheme used, for range warnings
                                 * (pw_fit_range_check): the three-phase temperature and, when
                                 * feasible, the bottoms' bubble points; NAN when no three-phase
                                 * state was found */
} pw_decanter_result;

/* Sizes the scheme at P for the fitted system (its curve y*(x) by pw_system_curve). Infeasible
 * specifications are PW_OK with feasible false and a reason: among them a cooled decanter above
 * T3, one whose temperature gives no split, and one whose layer lies inside the layers that
 * boil at T3 (heated back, it would boil as two liquids on its column's top stage, which the
 * single-liquid stage model does not describe). Errors: PW_EINVAL for values outside (0, 1),
 * P not positive or a decanter temperature not positive; solver failures. */
pw_status pw_decanter_solve(const pw_system *s, const pw_decanter_spec *spec,
                            const pw_column_options *opt, pw_decanter_result *out);

/* The single column's check: when a heterogeneous azeotrope at P lies strictly between x_a and
 * x_b (either order), *blocked is true and reason says why and names the decanter scheme; tp
 * receives the three-phase state (tp->exists false when there is none). */
pw_status pw_column_hetero_block(const pw_system *s, double P_Pa, double x_a, double x_b,
                                 pw_three_phase *tp, bool *blocked, char *reason, size_t len);

/* The single column's wider check: blocked as pw_column_hetero_block (its reason kept), and also
 * when the products' interval [min, max] of x_a, x_b overlaps the open two-liquid interval
 * (x_I, x_II) at P, where the single-liquid column does not apply (docs/heterogeneous.md, "The
 * single column and the two-liquid region"); reason names the layers and the decanter scheme. */
pw_status pw_column_two_liquid_block(const pw_system *s, double P_Pa, double x_a, double x_b,
                                     pw_three_phase *tp, bool *blocked, char *reason, size_t len);

/* true when the system's data show two liquids (s->measured.n > 0, filled from the fit) that
 * its model cannot represent (pw_model_can_split false: Wilson's equation). Its one-liquid
 * answers across the measured range are then not valid (docs/heterogeneous.md section 3). */
bool pw_system_split_unmodelled(const pw_system *s);

/* true when the closed interval between x_a and x_b (either order) meets the measured range
 * [m->x_lo, m->x_hi]: a target inside it, or targets on both sides. false when m->n is 0. */
bool pw_measured_split_overlaps(const pw_measured_split *m, double x_a, double x_b);

/* The single column's guard for a model that cannot split: *blocked when
 * pw_system_split_unmodelled(s) and the targets x_a, x_b overlap the measured range; reason then
 * names the range, the measured condition, the models that can split (fit --lle) and the
 * decanter scheme. PW_EINVAL for NULL arguments or len 0. */
pw_status pw_column_measured_split_block(const pw_system *s, double x_a, double x_b,
                                         bool *blocked, char *reason, size_t len);

/* The single column of a fitted system at P, either direction: refused (PW_OK, feasible false,
 * reason from pw_column_two_liquid_block) for a model that splits when the targets reach into the
 * two-liquid region, and (reason from pw_column_measured_split_block, out->measured_split set)
 * for a model that cannot split when the targets overlap the two liquids its data show; else
 * pw_column_solve_any on the system's bubble-point curve. Every command
 * that solves the single column calls this. tp_out (may be NULL) receives the three-phase state
 * (exists false when none or the model cannot split); *hetero_az (may be NULL) is true when the
 * refusal is a heterogeneous azeotrope between the targets. */
pw_status pw_column_solve_system(const pw_system *s, double P_Pa, const pw_column_spec *spec,
                                 const pw_column_options *opt, pw_column_result *out,
                                 pw_three_phase *tp_out, bool *hetero_az);

#ifdef __cplusplus
}
#endif
#endif
