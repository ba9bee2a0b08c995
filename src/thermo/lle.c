/* Binary liquid-liquid equilibrium at fixed T: D-scan for existence, Maxwell bisection on the
 * common tangent's slope between two convex pieces of G (named by the convex hull when the model
 * has several unstable regions), the 1e-12 floor decided exactly, Newton polish in logit
 * variables, tangent-plane verification. See include/pinchwise/lle.h and
 * docs/heterogeneous.md. */
#include <pinchwise/lle.h>

#include <float.h>
#include <gsl/gsl_errno.h>
#include <gsl/gsl_min.h>
#include <math.h>
#include <stdlib.h>
#include <string.h>

#define GRID_UNIFORM 2001 /* interior points k/(GRID_UNIFORM+1) */
#define GRID_TAIL 120     /* geometric points from PW_LLE_X_MIN to 1e-3 at each end */
#define GRID_N (GRID_UNIFORM + 2 * GRID_TAIL)
#define TPD_POINTS 20000
#define TPD_TOL 1e-10
#define RES_TOL 1e-11 /* accepted max |ln a_i(I) - ln a_i(II)| */
#define U_EXT 690.0 /* logit of about 1e-300: describes a pair beyond the floor */
#define BISECT_MAX 400
#define NEWTON_MAX 60

bool pw_model_can_split(const pw_model_type *m)
{
    return m && m != &pw_model_wilson;
}

/* A composition held with its complement, so that 1 - x is exact near x = 1. */
typedef struct xpt {
    double x, xc;
} xpt;

static xpt xp_of(double x) { return (xpt){x, 1.0 - x}; }
static xpt xp_near1(double e) { return (xpt){1.0 - e, e}; }
/* From the logit u = ln[x/(1-x)]. */
static xpt xp_logit(double u)
{
    if (u > 0.0) {
        double e = exp(-u);
        return (xpt){1.0 / (1.0 + e), e / (1.0 + e)};
    }
    double e = exp(u);
    return (xpt){e / (1.0 + e), 1.0 / (1.0 + e)};
}
static double logit(xpt p) { return log(p.x) - log(p.xc); }

typedef struct lle_eval {
    double g, dg, D;        /* Gmix/RT, dG/dx, d2G/dx2 */
    double lna[2], dlna[2]; /* ln a_i and d ln a_i / dx */
} lle_eval;

static pw_status eval_at(const pw_system *s, double T, xpt p, lle_eval *e)
{
    pw_activity a;
    pw_status st = pw_system_activity(s, p.x, T, &a);
    if (st != PW_OK)
        return st;
    double lx = log(p.x), lxc = log(p.xc);
    e->g = p.x * lx + p.xc * lxc + a.gE_RT;
    e->dg = lx - lxc + a.lngamma[0] - a.lngamma[1];
    e->D = 1.0 / (p.x * p.xc) + a.d2gE_dx2;
    e->lna[0] = lx + a.lngamma[0];
    e->lna[1] = lxc + a.lngamma[1];
    e->dlna[0] = 1.0 / p.x + a.dlngamma_dx1[0];
    e->dlna[1] = -1.0 / p.xc + a.dlngamma_dx1[1];
    if (!isfinite(e->g) || !isfinite(e->dg) || !isfinite(e->D))
        return PW_EDOM;
    return PW_OK;
}

pw_status pw_lle_gmix(const pw_system *s, double T_K, double x, double *g, double *dg)
{
    if (!s || !s->model || !g)
        return PW_EINVAL;
    if (!(x > 0.0 && x < 1.0) || !(T_K > 0.0) || !isfinite(T_K))
        return PW_EDOM;
    lle_eval e;
    pw_status st = eval_at(s, T_K, xp_of(x), &e);
    if (st != PW_OK)
        return st;
    *g = e.g;
    if (dg)
        *dg = e.dg;
    return PW_OK;
}

/* The fixed grid, increasing in x: geometric tails from just below PW_LLE_X_MIN up to half the
 * uniform spacing, and the uniform interior points k/(GRID_UNIFORM+1). Near x = 1 the points are
 * held by their complements, so the tail there is as fine as at x = 0. */
static void make_grid(xpt *g)
{
    size_t k = 0;
    double top = 0.5 / (GRID_UNIFORM + 1);
    double r = pow(top / PW_LLE_X_MIN, 1.0 / (GRID_TAIL - 1));
    for (size_t i = 0; i < GRID_TAIL; i++)
        g[k++] = xp_of(PW_LLE_X_MIN * pow(r, (double)i) * 0.999);
    for (size_t i = 1; i <= GRID_UNIFORM; i++)
        g[k++] = xp_of((double)i / (GRID_UNIFORM + 1));
    for (size_t i = 0; i < GRID_TAIL; i++)
        g[k++] = xp_near1(PW_LLE_X_MIN * pow(r, (double)(GRID_TAIL - 1 - i)) * 0.999);
}

typedef struct dctx {
    const pw_system *s;
    double T;
    pw_status st;
} dctx;

/* D as a function of the logit u (the complement exact near x = 1). */
static double D_fn(double u, void *p)
{
    dctx *c = p;
    lle_eval e;
    pw_status st = eval_at(c->s, c->T, xp_logit(u), &e);
    if (st != PW_OK) {
        if (c->st == PW_OK)
            c->st = st;
        return GSL_NAN;
    }
    return e.D;
}

/* Refines a grid minimum of D on [a, b] around m (logits); returns the smaller of the grid and
 * the refined value. */
static pw_status refine_min(dctx *c, gsl_min_fminimizer *mn, double a, double m, double b,
                            double *u_min, double *D_min)
{
    gsl_function F = {D_fn, c};
    double fa = D_fn(a, c), fm = D_fn(m, c), fb = D_fn(b, c);
    if (c->st != PW_OK)
        return c->st;
    *u_min = m;
    *D_min = fm;
    if (!(fm < fa && fm < fb) || !(a < m && m < b))
        return PW_OK;
    if (gsl_min_fminimizer_set_with_values(mn, &F, m, fm, a, fa, b, fb) != GSL_SUCCESS)
        return PW_OK;
    for (int it = 0; it < 100; it++) {
        if (gsl_min_fminimizer_iterate(mn) != GSL_SUCCESS)
            break;
        if (c->st != PW_OK)
            return c->st;
        double lo = gsl_min_fminimizer_x_lower(mn), hi = gsl_min_fminimizer_x_upper(mn);
        if (gsl_min_test_interval(lo, hi, 1e-13, 1e-12) == GSL_SUCCESS)
            break;
    }
    double f = gsl_min_fminimizer_f_minimum(mn);
    if (isfinite(f) && f < *D_min) {
        *D_min = f;
        *u_min = gsl_min_fminimizer_x_minimum(mn);
    }
    return PW_OK;
}

/* Root of D between the logits a and b (D of opposite signs there) by bisection in u: the
 * spinodal, to the last bits of u (so of x, or of 1 - x near x = 1). */
static pw_status D_root(dctx *c, double a, double b, double *u)
{
    double fa = D_fn(a, c);
    for (int it = 0; it < 200; it++) {
        double m = 0.5 * (a + b);
        if (m == a || m == b)
            break;
        double fm = D_fn(m, c);
        if (c->st != PW_OK)
            return c->st;
        if ((fm > 0.0) == (fa > 0.0)) {
            a = m;
            fa = fm;
        } else {
            b = m;
        }
    }
    *u = 0.5 * (a + b);
    return c->st;
}

/* Tangent point on one convex branch: G'(x) = m with x in (ulo, uhi) given in logit u (G' is
 * increasing there since D > 0; the caller has checked G'(ulo) < m < G'(uhi)). */
static pw_status branch_point(const pw_system *s, double T, double m, double ulo, double uhi,
                              xpt *out, lle_eval *e)
{
    /* Newton in u (dG'/du = D x (1 - x) > 0 on the branch) kept inside the bracket, with
     * bisection wherever a step would leave it or shrink less than half the step before (the
     * safeguard of Numerical Recipes' rtsafe); once Newton's step is below the tolerance, one
     * step just past the estimated root closes the bracket. The bracket shrinks to the same width
     * as plain bisection. */
    pw_status st;
    double u = 0.5 * (ulo + uhi), dx = uhi - ulo, dx_old = dx;
    for (int it = 0; it < 200; it++) {
        double tol = 1e-14 * fmax(1.0, fabs(ulo));
        if (uhi - ulo <= tol)
            break;
        lle_eval em;
        xpt pu = xp_logit(u);
        st = eval_at(s, T, pu, &em);
        if (st != PW_OK)
            return st;
        if (em.dg == m) {
            *out = pu;
            *e = em;
            return PW_OK;
        }
        if (em.dg < m)
            ulo = u;
        else
            uhi = u;
        double slope = em.D * pu.x * pu.xc, un = u - (em.dg - m) / slope;
        if (!(slope > 0.0) || !(un > ulo && un < uhi) || fabs(2.0 * (un - u)) > fabs(dx_old)) {
            dx_old = dx;
            dx = 0.5 * (uhi - ulo);
            un = ulo + dx;
        } else {
            dx_old = dx;
            dx = un - u;
            if (fabs(dx) < 0.25 * tol) /* step just past the root estimate */
                un = fmin(fmax(un + (dx > 0.0 ? 0.25 : -0.25) * tol, ulo), uhi);
        }
        if (!(un > ulo && un < uhi))
            un = 0.5 * (ulo + uhi);
        u = un;
    }
    *out = xp_logit(0.5 * (ulo + uhi));
    return eval_at(s, T, *out, e);
}

/* A convex piece of G: D > 0 on the open logit interval (ua, ub), whose ends are spinodal
 * points or the solubility floor (PW_LLE_X_MIN, or U_EXT when describing a refused pair). */
typedef struct piece {
    double ua, ub;
    bool floor_a, floor_b; /* the end is a floor, not a spinodal point */
    lle_eval ea, eb;       /* G and its derivatives at the ends */
} piece;

/* The point of piece p minimising G - m x: where G' = m, or the end where that is clamped
 * (*clamp -1 at ua, +1 at ub, 0 inside). */
static pw_status piece_point(const pw_system *s, double T, double m, const piece *p, xpt *x,
                             lle_eval *e, int *clamp)
{
    if (!(m > p->ea.dg)) {
        *clamp = -1;
        *x = xp_logit(p->ua);
        *e = p->ea;
        return PW_OK;
    }
    if (!(m < p->eb.dg)) {
        *clamp = 1;
        *x = xp_logit(p->ub);
        *e = p->eb;
        return PW_OK;
    }
    *clamp = 0;
    return branch_point(s, T, m, p->ua, p->ub, x, e);
}

/* x_b - x_a without cancellation near either pure end (complements near x = 1). */
static double xdiff(xpt b, xpt a)
{
    return (a.x > 0.5 && b.x > 0.5) ? a.xc - b.xc : b.x - a.x;
}

typedef struct maxwell_out {
    xpt pI, pII;
    lle_eval eI, eII;
    int clampI, clampII;
} maxwell_out;

/* Common tangent of the convex pieces A (left) and B (right) by bisection on its slope m.
 * With phi_P(m) = min over P of (G - m x) (the end values when the tangent point is clamped at an
 * end of P), h(m) = phi_A(m) - phi_B(m) is continuous and increasing on the whole real line:
 * dh/dm = x_B(m) - x_A(m) >= gap = x(B.ua) - x(A.ub) > 0 (envelope theorem). So h has exactly
 * one root; it is bracketed from G'(B.ua) and G'(A.ub) (which already bracket it when one
 * unstable region lies between the pieces: Maxwell's construction), and otherwise by steps of
 * 2|h|/gap, each of which is guaranteed to change the sign. A tangent point clamped at a floor
 * at the root means the true layer lies beyond that floor: phi is a minimum over a subset there,
 * so the unclamped h is on the same side (docs/heterogeneous.md). */
static pw_status maxwell(const pw_system *s, double T, const piece *A, const piece *B,
                         maxwell_out *o)
{
    double gap = xdiff(xp_logit(B->ua), xp_logit(A->ub));
    if (!(gap > 0.0))
        return PW_ENOCONV;
    double m_lo = fmin(B->ea.dg, A->eb.dg), m_hi = fmax(B->ea.dg, A->eb.dg);
    double h_lo = NAN, h_hi = NAN;
    pw_status st;
    /* h at one slope; fills o */
    for (int side = 0; side < 2; side++) {
        double *mm = side ? &m_hi : &m_lo, *hh = side ? &h_hi : &h_lo;
        for (int k = 0; k < 80; k++) {
            st = piece_point(s, T, *mm, A, &o->pI, &o->eI, &o->clampI);
            if (st == PW_OK)
                st = piece_point(s, T, *mm, B, &o->pII, &o->eII, &o->clampII);
            if (st != PW_OK)
                return st;
            *hh = (o->eI.g - o->eII.g) + *mm * xdiff(o->pII, o->pI);
            if (side ? *hh >= 0.0 : *hh <= 0.0)
                break;
            double step = 2.0 * fabs(*hh) / gap + 1e-12 * fmax(1.0, fabs(*mm));
            *mm += side ? step : -step;
            if (!isfinite(*mm))
                return PW_ENOCONV;
        }
        if (!(side ? *hh >= 0.0 : *hh <= 0.0))
            return PW_ENOCONV;
    }
    if (h_lo == 0.0)
        m_hi = m_lo;
    else if (h_hi == 0.0)
        m_lo = m_hi;
    double m = 0.5 * (m_lo + m_hi);
    for (int it = 0; it < BISECT_MAX; it++) {
        m = 0.5 * (m_lo + m_hi);
        if (m <= m_lo || m >= m_hi)
            break;
        st = piece_point(s, T, m, A, &o->pI, &o->eI, &o->clampI);
        if (st == PW_OK)
            st = piece_point(s, T, m, B, &o->pII, &o->eII, &o->clampII);
        if (st != PW_OK)
            return st;
        double h = (o->eI.g - o->eII.g) + m * xdiff(o->pII, o->pI);
        if (h == 0.0)
            return PW_OK;
        if (h < 0.0)
            m_lo = m;
        else
            m_hi = m;
        if (m_hi - m_lo <= 1e-15 * fmax(1.0, fabs(m)))
            break;
    }
    m = 0.5 * (m_lo + m_hi);
    st = piece_point(s, T, m, A, &o->pI, &o->eI, &o->clampI);
    if (st == PW_OK)
        st = piece_point(s, T, m, B, &o->pII, &o->eII, &o->clampII);
    return st;
}

/* Residual scale: what double precision resolves in ln a_i at the pair. */
static double res_of(const lle_eval *a, const lle_eval *b)
{
    return fmax(fabs(a->lna[0] - b->lna[0]), fabs(a->lna[1] - b->lna[1]));
}

/* Newton polish in logit variables, each kept inside its piece (so the pair keeps straddling the
 * unstable region between them: never the trivial solution); a step is taken only when it lowers
 * the residual. */
static pw_status newton(const pw_system *s, double T, const piece *A, const piece *B, xpt *pI,
                        xpt *pII, double *res)
{
    double u = logit(*pI), v = logit(*pII);
    lle_eval a, b;
    pw_status st = eval_at(s, T, *pI, &a);
    if (st == PW_OK)
        st = eval_at(s, T, *pII, &b);
    if (st != PW_OK)
        return st;
    double nrm = res_of(&a, &b);
    for (int it = 0; it < NEWTON_MAX && nrm > 0.0; it++) {
        double F1 = a.lna[0] - b.lna[0], F2 = a.lna[1] - b.lna[1];
        double ja = pI->x * pI->xc, jb = pII->x * pII->xc;
        double J11 = a.dlna[0] * ja, J12 = -b.dlna[0] * jb;
        double J21 = a.dlna[1] * ja, J22 = -b.dlna[1] * jb;
        double det = J11 * J22 - J12 * J21;
        if (!isfinite(det) || det == 0.0)
            break;
        double du = -(F1 * J22 - F2 * J12) / det, dv = -(J11 * F2 - J21 * F1) / det;
        double sc = fmax(fabs(du), fabs(dv)) > 2.0 ? 2.0 / fmax(fabs(du), fabs(dv)) : 1.0;
        bool improved = false;
        for (int ls = 0; ls < 30; ls++, sc *= 0.5) {
            double un = u + sc * du, vn = v + sc * dv;
            if (!(un > A->ua && un < A->ub && vn > B->ua && vn < B->ub))
                continue;
            lle_eval an, bn;
            xpt xa = xp_logit(un), xb = xp_logit(vn);
            if (eval_at(s, T, xa, &an) != PW_OK || eval_at(s, T, xb, &bn) != PW_OK)
                continue;
            double n2 = res_of(&an, &bn);
            if (n2 < nrm) {
                u = un, v = vn, a = an, b = bn, nrm = n2;
                *pI = xa, *pII = xb;
                improved = true;
                break;
            }
        }
        if (!improved)
            break;
    }
    *res = nrm;
    return PW_OK;
}

/* Smallest height of G above the line through (pI, G(pI)) and (pII, G(pII)) on n points. */
static pw_status tpd_min_xp(const pw_system *s, double T_K, xpt pI, xpt pII, size_t n,
                            double *min_tpd, double *x_at)
{
    lle_eval eI, eII;
    pw_status st = eval_at(s, T_K, pI, &eI);
    if (st == PW_OK)
        st = eval_at(s, T_K, pII, &eII);
    if (st != PW_OK)
        return st;
    double slope = (eII.g - eI.g) / xdiff(pII, pI);
    double best = INFINITY, xb = NAN;
    size_t nt = n / 4, nu = n - 2 * nt;
    double r = pow(0.25 / PW_LLE_X_MIN, 1.0 / (double)(nt - 1));
    for (size_t k = 0; k < n; k++) {
        xpt p;
        if (k < nt)
            p = xp_of(PW_LLE_X_MIN * pow(r, (double)k));
        else if (k < nt + nu)
            p = xp_of(0.25 + 0.5 * (double)(k - nt + 1) / (double)(nu + 1));
        else
            p = xp_near1(PW_LLE_X_MIN * pow(r, (double)(n - 1 - k)));
        lle_eval e;
        st = eval_at(s, T_K, p, &e);
        if (st != PW_OK)
            return st;
        /* the line measured from the nearer layer, its offset without cancellation */
        double tpd = p.x < 0.5 ? e.g - (eI.g + slope * xdiff(p, pI))
                               : e.g - (eII.g - slope * xdiff(pII, p));
        if (tpd < best) {
            best = tpd;
            xb = p.x;
        }
    }
    *min_tpd = best;
    if (x_at)
        *x_at = xb;
    return PW_OK;
}

pw_status pw_lle_tpd_min(const pw_system *s, double T_K, double x_I, double x_II, size_t n,
                         double *min_tpd, double *x_at)
{
    if (!s || !s->model || !min_tpd || n < 100)
        return PW_EINVAL;
    if (!(x_I > 0.0 && x_I < x_II && x_II < 1.0))
        return PW_EDOM;
    return tpd_min_xp(s, T_K, xp_of(x_I), xp_of(x_II), n, min_tpd, x_at);
}

/* Lower convex hull of the grid (monotone chain); idx receives the hull's grid indices. */
static size_t lower_hull(const xpt *g, const double *G, size_t n, size_t *idx)
{
    size_t m = 0;
    for (size_t i = 0; i < n; i++) {
        while (m >= 2) {
            size_t a = idx[m - 2], b = idx[m - 1];
            double cross = xdiff(g[b], g[a]) * (G[i] - G[a]) - (G[b] - G[a]) * xdiff(g[i], g[a]);
            if (cross <= 0.0)
                m--;
            else
                break;
        }
        idx[m++] = i;
    }
    return m;
}

/* An unstable region: D >= 0 at the logits lo and hi, D < 0 at neg_lo <= neg_hi between them;
 * its spinodal points s1 < s2. */
typedef struct region {
    double lo, neg_lo, neg_hi, hi;
    double s1, s2;
} region;

#define MAX_REGIONS (PW_LLE_MAX_PAIRS * 4)

static pw_status make_piece(const pw_system *s, double T, double ua, double ub, bool fa, bool fb,
                            piece *p)
{
    p->ua = ua;
    p->ub = ub;
    p->floor_a = fa;
    p->floor_b = fb;
    pw_status st = eval_at(s, T, xp_logit(ua), &p->ea);
    if (st == PW_OK)
        st = eval_at(s, T, xp_logit(ub), &p->eb);
    return st;
}

/* The pieces between the regions: piece 0 from the floor (logit -u_floor) to region 0's s1,
 * piece k from region k-1's s2 to region k's s1, the last one up to the floor +u_floor. */
static pw_status make_pieces(const pw_system *s, double T, const region *reg, size_t nreg,
                             double u_floor, piece *pc)
{
    for (size_t k = 0; k <= nreg; k++) {
        double ua = k == 0 ? -u_floor : reg[k - 1].s2, ub = k == nreg ? u_floor : reg[k].s1;
        pw_status st = make_piece(s, T, ua, ub, k == 0, k == nreg, &pc[k]);
        if (st != PW_OK)
            return st;
    }
    return PW_OK;
}

static int cmp_region(const void *a, const void *b)
{
    double x = ((const region *)a)->neg_lo, y = ((const region *)b)->neg_lo;
    return (x > y) - (x < y);
}

/* x (1 - x) D as a function of the logit: about 1 where the ideal part dominates, so its grid
 * minima are not hidden by the 1/x trend of D on a coarse geometric grid. */
static double xD_fn(double u, void *p)
{
    double D = D_fn(u, p);
    xpt q = xp_logit(u);
    return q.x * q.xc * D;
}

/* Whether Gmix/RT is unstable somewhere beyond the floor (x or 1 - x from PW_LLE_X_MIN down to
 * about 1e-300): then a split has a layer there. Coarse geometric grid (a factor of about 7.4 in
 * x per point) of x(1 - x) D with every grid minimum below DIP refined by Brent (a dip to
 * below zero between two points a factor 7.4 apart that leaves both within 0.1 % of the ideal
 * value is not found). */
#define DIP 0.999 /* x (1 - x) D = 1 for an ideal solution: minima below this are refined */
static pw_status unstable_beyond_floor(dctx *c, gsl_min_fminimizer *mn, bool *found)
{
    *found = false;
    double u_floor = -logit(xp_of(PW_LLE_X_MIN)), du = 2.0;
    size_t n = (size_t)((U_EXT - u_floor) / du) + 1;
    gsl_function F = {xD_fn, c};
    for (int side = -1; side <= 1; side += 2) {
        double f_prev2 = NAN, f_prev = NAN;
        for (size_t k = 0; k <= n; k++) {
            double u = side * (u_floor + du * (double)k), f = xD_fn(u, c);
            if (c->st != PW_OK)
                return c->st;
            if (f < 0.0) {
                *found = true;
                return PW_OK;
            }
            if (k >= 2 && f_prev <= f_prev2 && f_prev <= f) {
                double a = side * (u_floor + du * (double)(k - 2)), m = u - side * du;
                double lo = fmin(a, u), hi = fmax(a, u);
                if (f_prev < f_prev2 && f_prev < f && f_prev < DIP
                    && gsl_min_fminimizer_set_with_values(mn, &F, m, f_prev, lo,
                                                          side < 0 ? f : f_prev2, hi,
                                                          side < 0 ? f_prev2 : f) == GSL_SUCCESS) {
                    for (int it = 0; it < 100; it++) {
                        if (gsl_min_fminimizer_iterate(mn) != GSL_SUCCESS || c->st != PW_OK)
                            break;
                        if (gsl_min_fminimizer_f_minimum(mn) < 0.0)
                            break;
                        if (gsl_min_test_interval(gsl_min_fminimizer_x_lower(mn),
                                                  gsl_min_fminimizer_x_upper(mn), 1e-10,
                                                  0.0) == GSL_SUCCESS)
                            break;
                    }
                    if (c->st != PW_OK)
                        return c->st;
                    if (gsl_min_fminimizer_f_minimum(mn) < 0.0) {
                        *found = true;
                        return PW_OK;
                    }
                }
            }
            f_prev2 = f_prev;
            f_prev = f;
        }
    }
    return PW_OK;
}

static pw_status solve_impl(const pw_system *s, double T, pw_lle_result *out, xpt *grid,
                            double *G, double *D, size_t *hull, size_t tpd_points)
{
    pw_status st;
    make_grid(grid);
    for (size_t k = 0; k < GRID_N; k++) {
        lle_eval e;
        st = eval_at(s, T, grid[k], &e);
        if (st != PW_OK)
            return st;
        G[k] = e.g;
        D[k] = e.D;
    }
    gsl_min_fminimizer *mn = gsl_min_fminimizer_alloc(gsl_min_fminimizer_brent);
    if (!mn)
        return PW_ENOMEM;
    dctx c = {s, T, PW_OK};
    region reg[MAX_REGIONS];
    size_t nreg = 0;
    bool at_floor = D[0] < 0.0 || D[GRID_N - 1] < 0.0;
    st = PW_OK;
    out->min_D = INFINITY;
    /* every local minimum of D on the grid, refined: a dip below zero between grid points is a
     * region of its own */
    for (size_t k = 0; k < GRID_N; k++) {
        if (D[k] < out->min_D) {
            out->min_D = D[k];
            out->x_min_D = grid[k].x;
        }
        if (!(k > 0 && k + 1 < GRID_N && D[k] <= D[k - 1] && D[k] <= D[k + 1]))
            continue;
        double um, Dm, ua = logit(grid[k - 1]), ub = logit(grid[k + 1]);
        st = refine_min(&c, mn, ua, logit(grid[k]), ub, &um, &Dm);
        if (st != PW_OK) {
            gsl_min_fminimizer_free(mn);
            return st;
        }
        if (Dm < out->min_D) {
            out->min_D = Dm;
            out->x_min_D = xp_logit(um).x;
        }
        if (Dm < 0.0 && D[k] >= 0.0 && nreg < MAX_REGIONS)
            reg[nreg++] = (region){ua, um, um, ub, NAN, NAN};
    }
    bool beyond_unstable = false;
    if (!(D[0] < 0.0 || D[GRID_N - 1] < 0.0))
        st = unstable_beyond_floor(&c, mn, &beyond_unstable);
    gsl_min_fminimizer_free(mn);
    if (st != PW_OK)
        return st;
    /* runs of negative grid points */
    for (size_t k = 1; k + 1 < GRID_N; k++) {
        if (!(D[k] < 0.0) || D[k - 1] < 0.0)
            continue;
        size_t k1 = k;
        while (k1 + 1 < GRID_N - 1 && D[k1 + 1] < 0.0)
            k1++;
        if (D[k1 + 1] < 0.0)
            break; /* reaches the floor: at_floor */
        if (nreg < MAX_REGIONS)
            reg[nreg++] = (region){logit(grid[k - 1]), logit(grid[k]), logit(grid[k1]),
                                   logit(grid[k1 + 1]), NAN, NAN};
    }
    out->split = false;
    out->n_pairs = 0;
    if (at_floor || beyond_unstable)
        return PW_ERANGE; /* D < 0 at or beyond the floor: a layer lies beyond it (the pair is
                           * not described) */
    if (nreg == 0)
        return PW_OK;
    qsort(reg, nreg, sizeof reg[0], cmp_region);
    for (size_t r = 0; r < nreg; r++) {
        st = D_root(&c, reg[r].lo, reg[r].neg_lo, &reg[r].s1);
        if (st == PW_OK)
            st = D_root(&c, reg[r].neg_hi, reg[r].hi, &reg[r].s2);
        if (st != PW_OK)
            return st;
    }
    piece pc[MAX_REGIONS + 1];
    double u_floor = -logit(xp_of(PW_LLE_X_MIN));
    st = make_pieces(s, T, reg, nreg, u_floor, pc);
    if (st != PW_OK)
        return st;
    /* which pieces hold the two layers of each split */
    size_t pa[PW_LLE_MAX_PAIRS], pb[PW_LLE_MAX_PAIRS], npair = 0;
    if (nreg == 1) {
        pa[0] = 0, pb[0] = 1, npair = 1;
    } else {
        /* the lower convex hull of G on the grid: each hull segment over an unstable region is
         * one split; its end points name the pieces */
        size_t m = lower_hull(grid, G, GRID_N, hull);
        for (size_t h = 0; h + 1 < m && npair < PW_LLE_MAX_PAIRS; h++) {
            double ui = logit(grid[hull[h]]), uj = logit(grid[hull[h + 1]]);
            size_t a = nreg + 1, b = nreg + 1;
            for (size_t r = 0; r < nreg; r++)
                if (reg[r].neg_lo > ui && reg[r].neg_hi < uj) {
                    if (a > nreg)
                        a = r; /* left of region r */
                    b = r + 1; /* right of region r */
                }
            if (a > nreg || (npair > 0 && pa[npair - 1] == a && pb[npair - 1] == b))
                continue;
            pa[npair] = a, pb[npair] = b, npair++;
        }
        if (npair == 0)
            return PW_ENOCONV;
    }
    double res_all = 0.0;
    bool beyond = false;
    xpt lay[PW_LLE_MAX_PAIRS][2];
    for (size_t p = 0; p < npair; p++) {
        maxwell_out mo;
        st = maxwell(s, T, &pc[pa[p]], &pc[pb[p]], &mo);
        if (st != PW_OK)
            return st;
        bool fl = (mo.clampI < 0 && pc[pa[p]].floor_a) || (mo.clampII > 0 && pc[pb[p]].floor_b);
        if (fl) {
            /* the layer lies beyond the floor: describe the pair in the extended range */
            if (!beyond) {
                piece A = pc[pa[p]], B = pc[pb[p]];
                if ((!A.floor_a || make_piece(s, T, -U_EXT, A.ub, true, false, &A) == PW_OK)
                    && (!B.floor_b || make_piece(s, T, B.ua, U_EXT, false, true, &B) == PW_OK)
                    && maxwell(s, T, &A, &B, &mo) == PW_OK) {
                    out->x[0] = mo.pI.x, out->x[1] = mo.pII.x;
                    out->x2[0] = mo.pI.xc, out->x2[1] = mo.pII.xc;
                    const lle_eval *in = mo.clampI ? &mo.eII : &mo.eI; /* the resolved layer */
                    out->a[0] = exp(in->lna[0]);
                    out->a[1] = exp(in->lna[1]);
                }
            }
            beyond = true;
            continue;
        }
        /* A root clamped at a spinodal point is either no common tangent of these pieces (a
         * hull that named the wrong piece: the residual test below fails) or, next to a
         * critical point, one that double precision cannot tell from it (G' over the unstable
         * region varies by less than its rounding: the residual and tangent-plane tests pass). */
        double res;
        st = newton(s, T, &pc[pa[p]], &pc[pb[p]], &mo.pI, &mo.pII, &res);
        if (st != PW_OK)
            return st;
        res_all = fmax(res_all, res);
        lay[p][0] = mo.pI;
        lay[p][1] = mo.pII;
    }
    if (beyond)
        return PW_ERANGE;
    out->residual = res_all;
    for (size_t p = 0; p < npair; p++) {
        out->pairs[p][0] = lay[p][0].x;
        out->pairs[p][1] = lay[p][1].x;
    }
    out->n_pairs = npair;
    if (nreg == 1) {
        out->spinodal[0] = xp_logit(reg[0].s1).x;
        out->spinodal[1] = xp_logit(reg[0].s2).x;
    }
    if (!(res_all <= RES_TOL))
        return PW_ENOCONV;
    size_t wide = 0;
    for (size_t p = 1; p < npair; p++)
        if (xdiff(lay[p][1], lay[p][0]) > xdiff(lay[wide][1], lay[wide][0]))
            wide = p;
    out->min_tpd = INFINITY;
    for (size_t p = 0; p < npair; p++) {
        double tpd;
        st = tpd_min_xp(s, T, lay[p][0], lay[p][1], tpd_points, &tpd, NULL);
        if (st != PW_OK)
            return st;
        out->min_tpd = fmin(out->min_tpd, tpd);
    }
    if (!(out->min_tpd >= -TPD_TOL))
        return PW_ENOCONV;
    out->split = true;
    out->x[0] = lay[wide][0].x;
    out->x[1] = lay[wide][1].x;
    out->x2[0] = lay[wide][0].xc;
    out->x2[1] = lay[wide][1].xc;
    lle_eval e;
    st = eval_at(s, T, lay[wide][0], &e);
    if (st != PW_OK)
        return st;
    out->a[0] = exp(e.lna[0]);
    out->a[1] = exp(e.lna[1]);
    return PW_OK;
}

pw_status pw_lle_solve(const pw_system *s, double T_K, pw_lle_result *out)
{
    return pw_lle_solve_n(s, T_K, TPD_POINTS, out);
}

pw_status pw_lle_solve_n(const pw_system *s, double T_K, size_t tpd_points, pw_lle_result *out)
{
    if (tpd_points < 100)
        return PW_EINVAL;
    if (!s || !s->model || !s->model->eval || !out)
        return PW_EINVAL;
    memset(out, 0, sizeof *out);
    out->T_K = T_K;
    out->x[0] = out->x[1] = NAN;
    out->a[0] = out->a[1] = NAN;
    out->x2[0] = out->x2[1] = NAN;
    out->spinodal[0] = out->spinodal[1] = NAN;
    out->min_tpd = NAN;
    out->residual = NAN;
    if (!isfinite(T_K) || T_K <= 0.0)
        return PW_EDOM;
    xpt *grid = malloc(GRID_N * sizeof *grid);
    double *G = malloc(GRID_N * sizeof *G), *D = malloc(GRID_N * sizeof *D);
    size_t *hull = malloc(GRID_N * sizeof *hull);
    pw_status st = PW_ENOMEM;
    if (grid && G && D && hull)
        st = solve_impl(s, T_K, out, grid, G, D, hull, tpd_points);
    free(grid);
    free(G);
    free(D);
    free(hull);
    if (st != PW_OK)
        out->split = false;
    return st;
}
