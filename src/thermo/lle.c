/* Binary liquid-liquid equilibrium at fixed T: D-scan for existence, Maxwell bisection on the
 * common tangent's slope (or convex-hull starts when the model has several unstable regions),
 * Newton polish in logit variables, tangent-plane verification. See include/pinchwise/lle.h and
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
#define TRIVIAL_TOL 1e-6
#define BISECT_MAX 200
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

/* The fixed grid: uniform interior points plus geometric tails, sorted. */
static void make_grid(xpt *g)
{
    size_t k = 0;
    double r = pow(1e-3 / PW_LLE_X_MIN, 1.0 / (GRID_TAIL - 1));
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

static double D_fn(double x, void *p)
{
    dctx *c = p;
    lle_eval e;
    pw_status st = eval_at(c->s, c->T, xp_of(x), &e);
    if (st != PW_OK) {
        if (c->st == PW_OK)
            c->st = st;
        return GSL_NAN;
    }
    return e.D;
}

/* Refines a grid minimum of D on [a, b] around m; returns the smaller of the grid and refined. */
static pw_status refine_min(dctx *c, gsl_min_fminimizer *mn, double a, double m, double b,
                            double *x_min, double *D_min)
{
    gsl_function F = {D_fn, c};
    double fa = D_fn(a, c), fm = D_fn(m, c), fb = D_fn(b, c);
    if (c->st != PW_OK)
        return c->st;
    *x_min = m;
    *D_min = fm;
    if (!(fm < fa && fm < fb))
        return PW_OK;
    if (gsl_min_fminimizer_set_with_values(mn, &F, m, fm, a, fa, b, fb) != GSL_SUCCESS)
        return PW_OK;
    for (int it = 0; it < 100; it++) {
        if (gsl_min_fminimizer_iterate(mn) != GSL_SUCCESS)
            break;
        if (c->st != PW_OK)
            return c->st;
        double lo = gsl_min_fminimizer_x_lower(mn), hi = gsl_min_fminimizer_x_upper(mn);
        if (gsl_min_test_interval(lo, hi, 1e-13, 1e-10) == GSL_SUCCESS)
            break;
    }
    double f = gsl_min_fminimizer_f_minimum(mn);
    if (isfinite(f) && f < *D_min) {
        *D_min = f;
        *x_min = gsl_min_fminimizer_x_minimum(mn);
    }
    return PW_OK;
}

/* Root of D between a (D > 0 side or < 0) and b (opposite sign), by bisection (monotone enough;
 * bisection cannot leave the bracket). */
static pw_status D_root(dctx *c, double a, double b, double *x)
{
    double fa = D_fn(a, c);
    for (int it = 0; it < 200 && fabs(b - a) > 1e-15 * fmax(1.0, fabs(a)); it++) {
        double m = 0.5 * (a + b), fm = D_fn(m, c);
        if (c->st != PW_OK)
            return c->st;
        if ((fm > 0.0) == (fa > 0.0)) {
            a = m;
            fa = fm;
        } else {
            b = m;
        }
    }
    *x = 0.5 * (a + b);
    return c->st;
}

/* Tangent point on one convex branch: G'(x) = m with x in (lo, hi) given in logit u (G' is
 * increasing there since D > 0). Bisection in u; PW_ERANGE when the root lies outside. */
static pw_status branch_point(const pw_system *s, double T, double m, double ulo, double uhi,
                              xpt *out, lle_eval *e)
{
    lle_eval el, eh;
    pw_status st = eval_at(s, T, xp_logit(ulo), &el);
    if (st == PW_OK)
        st = eval_at(s, T, xp_logit(uhi), &eh);
    if (st != PW_OK)
        return st;
    if (el.dg > m || eh.dg < m)
        return PW_ERANGE;
    /* Newton in u (dG'/du = D x (1 - x) > 0 on the branch) kept inside the bracket, with
     * bisection wherever a step would leave it or shrink less than half the step before (the
     * safeguard of Numerical Recipes' rtsafe); once Newton's step is below the tolerance, one
     * step just past the estimated root closes the bracket. The bracket shrinks to the same width
     * as plain bisection. */
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

/* Maxwell's construction for one unstable region (s1, s2) with D > 0 outside it on (lo1, s1) and
 * (s2, hi2) (logit bounds): bisection on the tangent's slope. */
static pw_status maxwell(const pw_system *s, double T, double u_lo, double u_s1, double u_s2,
                         double u_hi, xpt *pI, xpt *pII)
{
    lle_eval e1, e2;
    pw_status st = eval_at(s, T, xp_logit(u_s1), &e1);
    if (st == PW_OK)
        st = eval_at(s, T, xp_logit(u_s2), &e2);
    if (st != PW_OK)
        return st;
    double m_lo = e2.dg, m_hi = e1.dg; /* G'(s2) <= m <= G'(s1) */
    if (!(m_lo <= m_hi))
        return PW_ENOCONV;
    for (int it = 0; it < BISECT_MAX; it++) {
        double m = 0.5 * (m_lo + m_hi);
        xpt xl, xr;
        lle_eval el, er;
        st = branch_point(s, T, m, u_lo, u_s1, &xl, &el);
        if (st == PW_OK)
            st = branch_point(s, T, m, u_s2, u_hi, &xr, &er);
        if (st != PW_OK)
            return st;
        *pI = xl;
        *pII = xr;
        double h = (el.g - m * xl.x) - (er.g - m * xr.x);
        if (h < 0.0)
            m_lo = m;
        else
            m_hi = m;
        if (m_hi - m_lo <= 1e-13 * fmax(1.0, fabs(m)))
            break;
    }
    return PW_OK;
}

/* Newton polish in logit variables; keeps the pair apart. */
static pw_status newton(const pw_system *s, double T, xpt *pI, xpt *pII, double *res)
{
    double u = logit(*pI), v = logit(*pII);
    lle_eval a, b;
    pw_status st;
    double best = INFINITY;
    for (int it = 0; it < NEWTON_MAX; it++) {
        st = eval_at(s, T, xp_logit(u), &a);
        if (st == PW_OK)
            st = eval_at(s, T, xp_logit(v), &b);
        if (st != PW_OK)
            return st;
        double F1 = a.lna[0] - b.lna[0], F2 = a.lna[1] - b.lna[1];
        double nrm = fmax(fabs(F1), fabs(F2));
        best = nrm;
        *pI = xp_logit(u);
        *pII = xp_logit(v);
        if (nrm < 1e-14)
            break;
        xpt xa = xp_logit(u), xb = xp_logit(v);
        double ja = xa.x * xa.xc, jb = xb.x * xb.xc;
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
            if (!(un < vn))
                continue;
            lle_eval an, bn;
            if (eval_at(s, T, xp_logit(un), &an) != PW_OK || eval_at(s, T, xp_logit(vn), &bn) != PW_OK)
                continue;
            double n2 = fmax(fabs(an.lna[0] - bn.lna[0]), fabs(an.lna[1] - bn.lna[1]));
            if (n2 < nrm) {
                u = un;
                v = vn;
                improved = true;
                break;
            }
        }
        if (!improved)
            break;
    }
    *res = best;
    st = eval_at(s, T, xp_logit(u), &a);
    if (st == PW_OK)
        st = eval_at(s, T, xp_logit(v), &b);
    if (st != PW_OK)
        return st;
    *res = fmax(fabs(a.lna[0] - b.lna[0]), fabs(a.lna[1] - b.lna[1]));
    *pI = xp_logit(u);
    *pII = xp_logit(v);
    return PW_OK;
}

pw_status pw_lle_tpd_min(const pw_system *s, double T_K, double x_I, double x_II, size_t n,
                         double *min_tpd, double *x_at)
{
    if (!s || !s->model || !min_tpd || n < 100)
        return PW_EINVAL;
    if (!(x_I > 0.0 && x_I < x_II && x_II < 1.0))
        return PW_EDOM;
    lle_eval eI, eII;
    pw_status st = eval_at(s, T_K, xp_of(x_I), &eI);
    if (st == PW_OK)
        st = eval_at(s, T_K, xp_of(x_II), &eII);
    if (st != PW_OK)
        return st;
    double slope = (eII.g - eI.g) / (x_II - x_I);
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
        double tpd = e.g - (eI.g + slope * (p.x - x_I));
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

/* Lower convex hull of the grid (monotone chain); idx receives the hull's grid indices. */
static size_t lower_hull(const xpt *g, const double *G, size_t n, size_t *idx)
{
    size_t m = 0;
    for (size_t i = 0; i < n; i++) {
        while (m >= 2) {
            size_t a = idx[m - 2], b = idx[m - 1];
            double cross = (g[b].x - g[a].x) * (G[i] - G[a]) - (G[b] - G[a]) * (g[i].x - g[a].x);
            if (cross <= 0.0)
                m--;
            else
                break;
        }
        idx[m++] = i;
    }
    return m;
}

typedef struct region {
    size_t k0, k1; /* grid indices: D < 0 on k0..k1 (inclusive) */
} region;

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
    /* Every local minimum of D on the grid, refined: where D dips below zero between points. */
    region reg[PW_LLE_MAX_PAIRS * 4];
    size_t nreg = 0;
    out->min_D = INFINITY;
    bool neg_prev = false;
    for (size_t k = 0; k < GRID_N; k++) {
        bool neg = D[k] < 0.0;
        if (k > 0 && k + 1 < GRID_N && D[k] <= D[k - 1] && D[k] <= D[k + 1]) {
            double xm, Dm;
            st = refine_min(&c, mn, grid[k - 1].x, grid[k].x, grid[k + 1].x, &xm, &Dm);
            if (st != PW_OK) {
                gsl_min_fminimizer_free(mn);
                return st;
            }
            if (Dm < out->min_D) {
                out->min_D = Dm;
                out->x_min_D = xm;
            }
            if (Dm < 0.0 && !neg && !neg_prev && nreg < sizeof reg / sizeof reg[0]) {
                /* a thin unstable region between grid points: k-1 .. k+1 brackets it */
                reg[nreg++] = (region){k, k};
                neg_prev = true;
                continue;
            }
        }
        if (neg && !neg_prev) {
            if (nreg < sizeof reg / sizeof reg[0])
                reg[nreg++] = (region){k, k};
        } else if (neg && nreg > 0) {
            reg[nreg - 1].k1 = k;
        }
        neg_prev = neg;
    }
    gsl_min_fminimizer_free(mn);
    out->split = false;
    out->n_pairs = 0;
    if (nreg == 0)
        return PW_OK;
    xpt pI, pII;
    double res = INFINITY;
    if (nreg == 1) {
        /* One unstable region: spinodal by bisection, then Maxwell. */
        size_t k0 = reg[0].k0, k1 = reg[0].k1;
        if (k0 == 0 || k1 + 1 >= GRID_N)
            return PW_ERANGE;
        double s1, s2;
        double a = grid[k0 - 1].x, b = grid[k1 + 1].x;
        double xm = out->x_min_D;
        if (!(xm > a && xm < b))
            xm = 0.5 * (grid[k0].x + grid[k1].x);
        st = D_root(&c, a, xm, &s1);
        if (st == PW_OK)
            st = D_root(&c, xm, b, &s2);
        if (st != PW_OK)
            return st;
        out->spinodal[0] = s1;
        out->spinodal[1] = s2;
        double u_lo = logit(xp_of(PW_LLE_X_MIN)), u_hi = -u_lo;
        st = maxwell(s, T, u_lo, logit(xp_of(s1)), logit(xp_of(s2)), u_hi, &pI, &pII);
        if (st != PW_OK)
            return st;
        st = newton(s, T, &pI, &pII, &res);
        if (st != PW_OK)
            return st;
        out->pairs[0][0] = pI.x;
        out->pairs[0][1] = pII.x;
        out->n_pairs = 1;
    } else {
        /* Several unstable regions: every hull segment covering a region is a split. */
        size_t m = lower_hull(grid, G, GRID_N, hull);
        res = 0.0;
        for (size_t h = 0; h + 1 < m && out->n_pairs < PW_LLE_MAX_PAIRS; h++) {
            size_t i = hull[h], j = hull[h + 1];
            bool covers = false;
            for (size_t r = 0; r < nreg; r++)
                if (reg[r].k0 > i && reg[r].k1 < j)
                    covers = true;
            if (!covers)
                continue;
            pI = grid[i];
            pII = grid[j];
            double r1;
            st = newton(s, T, &pI, &pII, &r1);
            if (st != PW_OK)
                return st;
            res = fmax(res, r1);
            out->pairs[out->n_pairs][0] = pI.x;
            out->pairs[out->n_pairs][1] = pII.x;
            out->n_pairs++;
        }
        if (out->n_pairs == 0)
            return PW_ENOCONV;
        out->spinodal[0] = out->spinodal[1] = NAN;
    }
    out->residual = res;
    if (!(res <= RES_TOL))
        return PW_ENOCONV;
    size_t wide = 0;
    for (size_t p = 0; p < out->n_pairs; p++) {
        if (!(out->pairs[p][1] - out->pairs[p][0] > TRIVIAL_TOL))
            return PW_ENOCONV; /* never the trivial solution */
        if (out->pairs[p][0] < PW_LLE_X_MIN || out->pairs[p][1] > 1.0 - PW_LLE_X_MIN)
            return PW_ERANGE;
        if (out->pairs[p][1] - out->pairs[p][0] > out->pairs[wide][1] - out->pairs[wide][0])
            wide = p;
    }
    out->min_tpd = INFINITY;
    for (size_t p = 0; p < out->n_pairs; p++) {
        double tpd;
        st = pw_lle_tpd_min(s, T, out->pairs[p][0], out->pairs[p][1], tpd_points, &tpd, NULL);
        if (st != PW_OK)
            return st;
        out->min_tpd = fmin(out->min_tpd, tpd);
    }
    if (!(out->min_tpd >= -TPD_TOL))
        return PW_ENOCONV;
    out->split = true;
    out->x[0] = out->pairs[wide][0];
    out->x[1] = out->pairs[wide][1];
    lle_eval e;
    st = eval_at(s, T, xp_of(out->x[0]), &e);
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
