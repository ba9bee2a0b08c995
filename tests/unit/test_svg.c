/* The report's SVG writer: coordinate mapping, tick choice, escaping, non-finite input, growth.
 * Expected tick sets follow the 1-2-5 rule (common practice in plotting; e.g. Heckbert,
 * "Nice numbers for graph labels", Graphics Gems, 1990, from memory). */
#include "pw_test.h"

#include "report/svg.h"

#include <math.h>
#include <stdio.h>
#include <stdlib.h>
#include <string.h>

static void frame_maps_corners_and_centre(void **state)
{
    (void)state;
    pw_frame f;
    assert_int_equal(pw_frame_init(&f, "t1", 500, 400, 0.0, 1.0, 300.0, 400.0, 5, 5), PW_OK);
    /* plot area: x from ml to width-mr, y from mt (top, = y_hi) to height-mb (bottom, = y_lo) */
    pw_assert_close(pw_frame_px(&f, 0.0), f.ml, 0, 1e-12, "x_lo -> left edge");
    pw_assert_close(pw_frame_px(&f, 1.0), 500.0 - f.mr, 0, 1e-12, "x_hi -> right edge");
    pw_assert_close(pw_frame_px(&f, 0.5), (f.ml + 500.0 - f.mr) / 2.0, 0, 1e-12, "x mid");
    pw_assert_close(pw_frame_py(&f, 300.0), 400.0 - f.mb, 0, 1e-12, "y_lo -> bottom");
    pw_assert_close(pw_frame_py(&f, 400.0), f.mt, 0, 1e-12, "y_hi -> top");
    pw_assert_close(pw_frame_py(&f, 325.0), f.mt + 0.75 * (400.0 - f.mt - f.mb), 0, 1e-12, "y quarter");
    assert_int_not_equal(pw_frame_init(&f, "bad id", 500, 400, 0, 1, 0, 1, 5, 5), PW_OK);
    assert_int_not_equal(pw_frame_init(&f, "t2", 500, 400, 1, 1, 0, 1, 5, 5), PW_OK);
    assert_int_not_equal(pw_frame_init(&f, "t3", 500, 400, 0, NAN, 0, 1, 5, 5), PW_OK);
    assert_int_not_equal(pw_frame_init(&f, "t4", 50, 40, 0, 1, 0, 1, 5, 5), PW_OK);
}

static void ticks_follow_one_two_five(void **state)
{
    (void)state;
    static const struct {
        double lo, hi;
        size_t target;
        double step, first, last;
        size_t n;
        int decimals;
    } cases[] = {
        {0.0, 1.0, 5, 0.2, 0.0, 1.0, 6, 1},
        {0.0, 1.0, 10, 0.1, 0.0, 1.0, 11, 1},
        {330.0, 372.0, 6, 5.0, 330.0, 370.0, 9, 0},
        {-0.013, 0.021, 5, 0.005, -0.01, 0.02, 7, 3},
        {-0.013, 0.021, 3, 0.01, -0.01, 0.02, 4, 2},
        {0.0, 101.325, 5, 20.0, 0.0, 100.0, 6, 0},
        {1e-4, 9e-4, 4, 2e-4, 2e-4, 8e-4, 4, 4},
        {-3.0, 3.0, 6, 1.0, -3.0, 3.0, 7, 0},
    };
    for (size_t i = 0; i < sizeof cases / sizeof cases[0]; i++) {
        pw_ticks t;
        assert_int_equal(pw_svg_ticks(cases[i].lo, cases[i].hi, cases[i].target, &t), PW_OK);
        pw_assert_close(t.step, cases[i].step, 1e-12, 0, "step");
        assert_int_equal(t.n, cases[i].n);
        pw_assert_close(t.v[0], cases[i].first, 1e-12, 1e-15, "first tick");
        pw_assert_close(t.v[t.n - 1], cases[i].last, 1e-12, 1e-15, "last tick");
        assert_int_equal(t.decimals, cases[i].decimals);
    }
    /* a huge span with a greedy target still fits the tick array */
    pw_ticks t;
    assert_int_equal(pw_svg_ticks(0.0, 1000.0, 1000, &t), PW_OK);
    assert_true(t.n <= PW_SVG_MAX_TICKS);
    assert_true(t.n >= 2);
    assert_int_equal(pw_svg_ticks(1.0, 0.0, 5, &t), PW_EINVAL);
    assert_int_equal(pw_svg_ticks(0.0, INFINITY, 5, &t), PW_EINVAL);

    double lo = 331.7, hi = 371.2;
    pw_svg_nice_range(&lo, &hi, 5);
    pw_assert_close(lo, 330.0, 0, 1e-9, "nice lo");
    pw_assert_close(hi, 380.0, 0, 1e-9, "nice hi");
    lo = hi = 2.0;
    pw_svg_nice_range(&lo, &hi, 5);
    assert_true(lo < 2.0 && hi > 2.0);

    char buf[32];
    assert_string_equal(pw_svg_format_tick(-0.0000001, 2, buf, sizeof buf), "0.00");
    assert_string_equal(pw_svg_format_tick(0.3, 1, buf, sizeof buf), "0.3");
    assert_string_equal(pw_svg_format_tick(-2.0, 0, buf, sizeof buf), "\xe2\x88\x92" "2");
}

/* The coordinate writer prints the digits of round(100 v) itself; it must give the same text as
 * the formatted print it replaced: "%.2f" of round(100 v)/100, trailing zeros and "-0" trimmed. */
static void coord_text_equals_the_formatted_print(void **state)
{
    (void)state;
    unsigned long long st = 0x2545f4914f6cdd1dULL;
    for (int i = 0; i < 200000; i++) {
        st ^= st << 13;
        st ^= st >> 7;
        st ^= st << 17;
        double u = (double)(st >> 11) / 9007199254740992.0;
        /* magnitudes from 1e-4 to 1e6, both signs, and exact halves of the last digit */
        double v = (i % 2 ? -1.0 : 1.0) * pow(10.0, -4.0 + 10.0 * u);
        if (i % 7 == 0)
            v = (double)((long long)(v * 100.0)) / 100.0 + (i % 14 == 0 ? 0.005 : 0.0);
        if (v > 1e6 || v < -1e6)
            continue;
        char want[48];
        double r = round(v * 100.0) / 100.0;
        if (r == 0.0)
            r = 0.0;
        int n = snprintf(want, sizeof want, "%.2f", r);
        while (n > 0 && want[n - 1] == '0')
            want[--n] = '\0';
        if (n > 0 && want[n - 1] == '.')
            want[--n] = '\0';
        if (!strcmp(want, "-0"))
            strcpy(want, "0");
        pw_sbuf b;
        pw_sbuf_init(&b);
        assert_int_equal(pw_sbuf_coord(&b, v), PW_OK);
        if (strcmp(pw_sbuf_str(&b), want) != 0)
            fail_msg("v = %.17g: wrote %s, the formatted print gives %s", v, pw_sbuf_str(&b), want);
        pw_sbuf_free(&b);
    }
}

static void text_is_escaped(void **state)
{
    (void)state;
    pw_sbuf b;
    pw_sbuf_init(&b);
    assert_int_equal(pw_sbuf_escape(&b, "a<b & c>d \"q\" 'r'\x01z"), PW_OK);
    assert_string_equal(pw_sbuf_str(&b), "a&lt;b &amp; c&gt;d &quot;q&quot; &#39;r&#39;z");
    pw_sbuf_free(&b);

    pw_frame f;
    assert_int_equal(pw_frame_init(&f, "esc", 400, 300, 0, 1, 0, 1, 5, 5), PW_OK);
    pw_sbuf_init(&b);
    pw_svg_begin(&b, &f, "<script>alert(1)</script>", "x & y", "T / K");
    pw_svg_end_data(&b);
    pw_svg_end(&b, &f);
    assert_int_equal(pw_sbuf_status(&b), PW_OK);
    assert_null(strstr(pw_sbuf_str(&b), "<script>"));
    assert_non_null(strstr(pw_sbuf_str(&b), "&lt;script&gt;"));
    assert_non_null(strstr(pw_sbuf_str(&b), "x &amp; y"));
    pw_sbuf_free(&b);
}

static bool has_nonfinite_text(const char *s)
{
    return strstr(s, "nan") || strstr(s, "NaN") || strstr(s, "NAN") || strstr(s, "inf") ||
           strstr(s, "Inf") || strstr(s, "INF");
}

static void non_finite_never_reaches_the_output(void **state)
{
    (void)state;
    pw_frame f;
    assert_int_equal(pw_frame_init(&f, "nf", 400, 300, 0, 1, 0, 1, 5, 5), PW_OK);
    double x[7] = {0.0, 0.1, NAN, 0.3, 0.4, INFINITY, 0.6};
    double y[7] = {0.0, 0.2, 0.3, -INFINITY, 0.5, 0.6, 0.7};
    pw_sbuf b;
    pw_sbuf_init(&b);
    pw_style s = pw_style_series(0);
    pw_svg_begin(&b, &f, "t", "x", "y");
    pw_svg_polyline(&b, &f, x, y, 7, &s, "curve");
    pw_svg_markers(&b, &f, x, y, 7, &s, NULL);
    pw_svg_segment(&b, &f, NAN, 0.0, 1.0, 1.0, &s, NULL);
    pw_svg_annotate(&b, &f, NAN, 0.5, 10, -10, NULL, "pinch", NULL);
    pw_svg_text_px(&b, INFINITY, 3.0, "start", 12, false, NULL, "x", NULL);
    pw_svg_end_data(&b);
    pw_svg_end(&b, &f);
    assert_int_equal(pw_sbuf_status(&b), PW_OK);
    const char *out = pw_sbuf_str(&b);
    assert_false(has_nonfinite_text(out));
    /* only the run (0,0)-(0.1,0.2) survives: one M, one L in the curve path */
    const char *p = strstr(out, "class=\"curve\"");
    assert_non_null(p);
    /* the curve's path: only the run (0,0)-(0.1,0.2) has two finite points in a row, so the
     * d attribute is exactly one move and one line */
    const char *d = strstr(out, "<path d=\"");
    assert_non_null(d);
    assert_true(d < p);
    d += strlen("<path d=\"");
    const char *q = strchr(d, '"');
    size_t nl = 0, nm = 0;
    for (const char *c = d; c < q; c++) {
        nl += *c == 'L';
        nm += *c == 'M';
    }
    assert_int_equal(nm, 1);
    assert_int_equal(nl, 1);
    char want[64];
    pw_sbuf w;
    pw_sbuf_init(&w);
    pw_sbuf_puts(&w, "M");
    pw_sbuf_coord(&w, pw_frame_px(&f, 0.0));
    pw_sbuf_puts(&w, " ");
    pw_sbuf_coord(&w, pw_frame_py(&f, 0.0));
    pw_sbuf_puts(&w, " L");
    pw_sbuf_coord(&w, pw_frame_px(&f, 0.1));
    pw_sbuf_puts(&w, " ");
    pw_sbuf_coord(&w, pw_frame_py(&f, 0.2));
    snprintf(want, sizeof want, "%s\"", pw_sbuf_str(&w));
    pw_sbuf_free(&w);
    assert_memory_equal(d, want, strlen(want));

    /* a series with no two consecutive finite points writes no path at all */
    pw_sbuf c;
    pw_sbuf_init(&c);
    double xs[3] = {NAN, 0.5, NAN}, ys[3] = {0.1, 0.2, 0.3};
    pw_svg_polyline(&c, &f, xs, ys, 3, &s, NULL);
    assert_int_equal(c.len, 0);
    pw_sbuf_coord(&c, NAN);
    assert_string_equal(pw_sbuf_str(&c), "0");
    pw_sbuf_free(&c);
    pw_sbuf_free(&b);
}

static void buffer_grows_without_a_fixed_size(void **state)
{
    (void)state;
    pw_sbuf b;
    pw_sbuf_init(&b);
    assert_string_equal(pw_sbuf_str(&b), "");
    for (int i = 0; i < 20000; i++)
        assert_int_equal(pw_sbuf_printf(&b, "%05d,", i), PW_OK);
    assert_int_equal(b.len, 20000u * 6u);
    assert_true(b.cap > b.len);
    assert_memory_equal(b.data + 6 * 12345, "12345,", 6);
    /* one piece longer than the printf scratch buffer */
    char big[3000];
    memset(big, 'a', sizeof big - 1);
    big[sizeof big - 1] = '\0';
    size_t before = b.len;
    assert_int_equal(pw_sbuf_printf(&b, "[%s]", big), PW_OK);
    assert_int_equal(b.len, before + 3001);
    assert_int_equal(b.data[b.len - 1], ']');
    pw_sbuf_free(&b);
    assert_null(b.data);
    pw_sbuf_free(NULL);
}

static void palette_styles_differ_without_colour(void **state)
{
    (void)state;
    /* neighbouring series must differ in dash and marker, not only colour */
    for (size_t k = 0; k + 1 < PW_PALETTE_N; k++) {
        pw_style a = pw_style_series(k), c = pw_style_series(k + 1);
        assert_int_not_equal(a.marker, c.marker);
        bool same_dash = (!a.dash && !c.dash) || (a.dash && c.dash && !strcmp(a.dash, c.dash));
        assert_false(same_dash);
        /* relative luminance (sRGB, WCAG 2.x definition) differs by at least 0.05 */
        double lum[2];
        const char *hex[2] = {a.stroke, c.stroke};
        for (int j = 0; j < 2; j++) {
            unsigned v = (unsigned)strtoul(hex[j] + 1, NULL, 16);
            double ch[3] = {(double)((v >> 16) & 255) / 255.0, (double)((v >> 8) & 255) / 255.0,
                            (double)(v & 255) / 255.0};
            for (int m = 0; m < 3; m++)
                ch[m] = ch[m] <= 0.04045 ? ch[m] / 12.92 : pow((ch[m] + 0.055) / 1.055, 2.4);
            lum[j] = 0.2126 * ch[0] + 0.7152 * ch[1] + 0.0722 * ch[2];
        }
        assert_true(fabs(lum[0] - lum[1]) >= 0.05);
    }
}

static void legend_and_markers_render(void **state)
{
    (void)state;
    pw_frame f;
    assert_int_equal(pw_frame_init(&f, "lg", 400, 300, 0, 1, 0, 1, 5, 5), PW_OK);
    pw_legend l = {0};
    for (size_t k = 0; k < PW_LEGEND_MAX + 3; k++) {
        pw_style s = pw_style_series(k);
        pw_legend_add(&l, "series", &s, k % 2 == 0);
    }
    assert_int_equal(l.n, PW_LEGEND_MAX);
    pw_sbuf b;
    pw_sbuf_init(&b);
    assert_int_equal(pw_svg_legend(&b, &f, &l, PW_CORNER_BR), PW_OK);
    const char *out = pw_sbuf_str(&b);
    size_t labels = 0;
    for (const char *p = out; (p = strstr(p, "pw-legend-label")); p++)
        labels++;
    assert_int_equal(labels, PW_LEGEND_MAX);
    for (int m = PW_MARK_CIRCLE; m <= PW_MARK_STAR; m++) {
        pw_style s = pw_style_series(0);
        s.marker = (pw_marker)m;
        size_t before = b.len;
        pw_svg_marker_px(&b, 50, 50, &s);
        assert_true(b.len > before);
    }
    assert_false(has_nonfinite_text(pw_sbuf_str(&b)));
    pw_sbuf_free(&b);
}

int main(void)
{
    pw_test_init();
    const struct CMUnitTest tests[] = {
        cmocka_unit_test(frame_maps_corners_and_centre),
        cmocka_unit_test(ticks_follow_one_two_five),
        cmocka_unit_test(coord_text_equals_the_formatted_print),
        cmocka_unit_test(text_is_escaped),
        cmocka_unit_test(non_finite_never_reaches_the_output),
        cmocka_unit_test(buffer_grows_without_a_fixed_size),
        cmocka_unit_test(palette_styles_differ_without_colour),
        cmocka_unit_test(legend_and_markers_render),
    };
    return cmocka_run_group_tests(tests, NULL, NULL);
}
