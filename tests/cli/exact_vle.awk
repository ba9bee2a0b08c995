# Writes an INVENTED, noise-free binary VLE dataset (docs/inputs.md format) from modified
# Raoult's law with a temperature-independent two-parameter Margules G^E (A12 = A21 = 0 gives
# Raoult's law), every value printed with 17 significant digits. Used by the CLI tests of exact
# fits and consistency; never to stand in for measured data.
#
#   awk -f exact_vle.awk -v n1=NAME1 -v a1=A -v b1=B -v c1=C -v n2=NAME2 -v a2=.. -v b2=.. -v c2=..
#       [-v P=101.325 | -v t=50] [-v A12=0 -v A21=0] [-v n=15] [-v dT=0] [-v dP=0]
#       [-v sy=0.002 -v sT=0.05]  (states sigma_y / sigma_T in the metadata when given)
#
# Antoine rows as in datasets/components.csv with log = ln, P in kPa, T in C:
# ln(P/kPa) = a - b/(t/C + c). P (kPa) gives isobaric T-x-y data at that pressure (bubble T by
# bisection to 1e-13 K); t (C) gives isothermal P-x-y data. dT (K) is added to the measured T of
# the mixture rows (isobaric), dP (relative) to their P (isothermal): a deliberate systematic error.
# Pure-component rows (x1 = 0 and 1) are written exactly.
function psat(a, b, c, tc) { return exp(a - b / (tc + c)) }
function lng1(x) { return (1 - x) * (1 - x) * (A12 + 2 * (A21 - A12) * x) }
function lng2(x) { return x * x * (A21 + 2 * (A12 - A21) * (1 - x)) }
function ptot(x, tc) {
    return x * exp(lng1(x)) * psat(a1, b1, c1, tc) + (1 - x) * exp(lng2(x)) * psat(a2, b2, c2, tc)
}
function bubble_t(x,    lo, hi, mid, k) {
    lo = -100; hi = 400
    for (k = 0; k < 200; k++) {
        mid = 0.5 * (lo + hi)
        if (ptot(x, mid) > P) hi = mid; else lo = mid
        if (hi - lo < 1e-13) break
    }
    return 0.5 * (lo + hi)
}
BEGIN {
    if (n == "") n = 15
    if (A12 == "") A12 = 0
    if (A21 == "") A21 = 0
    if (dT == "") dT = 0
    if (dP == "") dP = 0
    printf "# components: %s, %s\n", n1, n2
    if (P != "") printf "# pressure: %.17g kPa\n", P
    else printf "# temperature: %.17g C\n", t
    printf "# source: INVENTED noise-free data, modified Raoult's law with Margules A12 = %g, A21 = %g\n", A12, A21
    if (sy != "") printf "# sigma_y: %.17g\n", sy
    if (sT != "") printf "# sigma_T: %.17g K\n", sT
    if (P != "") print "x1,y1,T[K]"; else print "x1,y1,P[kPa]"
    for (i = 0; i <= n + 1; i++) {
        x = i / (n + 1)
        tc = (P != "") ? bubble_t(x) : t
        p = ptot(x, tc)
        y = x * exp(lng1(x)) * psat(a1, b1, c1, tc) / p
        pure = (i == 0 || i == n + 1)
        if (P != "") printf "%.17g,%.17g,%.17g\n", x, y, tc + 273.15 + (pure ? 0 : dT)
        else printf "%.17g,%.17g,%.17g\n", x, y, p * (pure ? 1 : 1 + dP)
    }
}
