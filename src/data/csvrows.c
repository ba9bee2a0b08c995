/* Row reader on top of libcsv with physical line numbers; see csvrows.h. */
#include "data/csvrows.h"

#include "base/decimal_internal.h"
#include "base/fileio_internal.h"

#include <ctype.h>
#include <errno.h>
#include <float.h>
#include <math.h>
#include <stdint.h>
#include <stdio.h>
#include <stdlib.h>
#include <string.h>
#include <unistd.h>

static const unsigned char utf8_bom[3] = {0xEF, 0xBB, 0xBF};

/* libcsv's field-buffer growth step (bytes); see pw_csvrows_init. */
#define CSVROWS_BLOCK ((size_t)1 << 20)

static bool grow(void **buf, size_t *cap, size_t need, size_t elem)
{
    if (need <= *cap)
        return true;
    size_t n = *cap ? *cap : 16;
    while (n < need)
        n *= 2;
    void *p = realloc(*buf, n * elem);
    if (!p)
        return false;
    *buf = p;
    *cap = n;
    return true;
}

static void fail(pw_csvrows *r, pw_status st, long line, const char *msg)
{
    if (r->status != PW_OK)
        return;
    r->status = pw_error_set(r->err, st, r->name, line, "%s", msg);
}

static void reset_row(pw_csvrows *r)
{
    r->row_len = 0;
    r->nfields = 0;
    r->row_newlines = 0;
}

static void on_field(void *s, size_t len, void *data)
{
    pw_csvrows *r = data;
    if (r->status != PW_OK)
        return;
    const char *f = s ? s : "";
    if (len && memchr(f, '\0', len)) {
        fail(r, PW_EPARSE, r->line, "NUL byte inside a field (expected text)");
        return;
    }
    if (!grow((void **)&r->rowbuf, &r->row_cap, r->row_len + len + 1, 1) ||
        !grow((void **)&r->offs, &r->offs_cap, r->nfields + 1, sizeof *r->offs)) {
        fail(r, PW_ENOMEM, 0, "out of memory while reading a row");
        return;
    }
    for (size_t i = 0; i < len; i++)
        if (f[i] == '\n')
            r->row_newlines++;
    r->offs[r->nfields++] = r->row_len;
    memcpy(r->rowbuf + r->row_len, f, len);
    r->row_len += len;
    r->rowbuf[r->row_len++] = '\0';
}

static void on_row(int c, void *data)
{
    (void)c;
    pw_csvrows *r = data;
    long line = r->line - r->row_newlines;
    if (r->status != PW_OK) {
        reset_row(r);
        return;
    }
    if (!grow((void **)&r->ptrs, &r->ptrs_cap, r->nfields + 1, sizeof *r->ptrs)) {
        fail(r, PW_ENOMEM, 0, "out of memory while reading a row");
        reset_row(r);
        return;
    }
    bool all_empty = true;
    for (size_t i = 0; i < r->nfields; i++) {
        r->ptrs[i] = r->rowbuf + r->offs[i];
        if (r->ptrs[i][0] != '\0')
            all_empty = false;
    }
    if (!all_empty) {
        pw_status st = r->row_fn(r->ctx, r->ptrs, r->nfields, line, r->err);
        if (st != PW_OK && r->status == PW_OK)
            r->status = st;
    }
    reset_row(r);
}

/* Passes one piece of CSV text that holds at most one LF, at its end. */
static void csv_segment(pw_csvrows *r, const char *s, size_t len)
{
    if (r->status != PW_OK || len == 0)
        return;
    /* In pieces of at most CSVROWS_BLOCK bytes, the growth step set before each to the field
     * buffer's current size (at least CSVROWS_BLOCK): the buffer then doubles, so a field of any
     * length costs linear time (a fixed step copies the buffer once per step: quadratic). */
    size_t done = 0;
    while (done < len && r->status == PW_OK) {
        size_t piece = len - done < CSVROWS_BLOCK ? len - done : CSVROWS_BLOCK;
        size_t step = r->parser.entry_size > CSVROWS_BLOCK ? r->parser.entry_size : CSVROWS_BLOCK;
        csv_set_blk_size(&r->parser, step);
        size_t used = csv_parse(&r->parser, s + done, piece, on_field, on_row, r);
        done += used;
        if (used != piece)
            break;
    }
    if (r->status == PW_OK && done != len) {
        char msg[200];
        snprintf(msg, sizeof msg,
                 "malformed CSV: %s (a quote may only open or close a whole field; a quote "
                 "inside a quoted field is written twice)",
                 csv_strerror(csv_error(&r->parser)));
        fail(r, PW_EPARSE, r->line, msg);
    }
    if (s[len - 1] == '\n')
        r->line++;
}

static void csv_bytes(pw_csvrows *r, const char *s, size_t len)
{
    while (len && r->status == PW_OK) {
        const char *nl = memchr(s, '\n', len);
        size_t n = nl ? (size_t)(nl - s) + 1 : len;
        csv_segment(r, s, n);
        s += n;
        len -= n;
    }
}

static bool blank(const char *s, size_t len)
{
    for (size_t i = 0; i < len; i++)
        if (s[i] != ' ' && s[i] != '\t')
            return false;
    return true;
}

/* A whole preamble line is in r->pre (without LF). */
static void preamble_line(pw_csvrows *r)
{
    size_t len = r->pre_len;
    if (len && r->pre[len - 1] == '\r')
        len--;
    r->pre[len] = '\0';
    if (blank(r->pre, len)) {
        r->line++;
        return;
    }
    bool is_csv = false;
    pw_status st = r->line_fn(r->ctx, r->pre, len, r->line, &is_csv, r->err);
    if (st != PW_OK) {
        if (r->status == PW_OK)
            r->status = st;
        return;
    }
    if (is_csv) {
        r->in_csv = true;
        r->pre[len] = '\n';
        csv_segment(r, r->pre, len + 1);
    } else {
        r->line++;
    }
}

static void process(pw_csvrows *r, const char *s, size_t len)
{
    while (len && r->status == PW_OK) {
        if (r->in_csv) {
            csv_bytes(r, s, len);
            return;
        }
        const char *nl = memchr(s, '\n', len);
        size_t n = nl ? (size_t)(nl - s) : len;
        if (!grow((void **)&r->pre, &r->pre_cap, r->pre_len + n + 2, 1)) {
            fail(r, PW_ENOMEM, 0, "out of memory while reading a line");
            return;
        }
        memcpy(r->pre + r->pre_len, s, n);
        r->pre_len += n;
        if (!nl)
            return;
        preamble_line(r);
        r->pre_len = 0;
        s += n + 1;
        len -= n + 1;
    }
}

pw_status pw_csvrows_init(pw_csvrows *r, const char *name, pw_csvrows_line_fn line_fn,
                          pw_csvrows_row_fn row_fn, void *ctx, pw_error *err)
{
    memset(r, 0, sizeof *r);
    r->name = name;
    r->line_fn = line_fn;
    r->row_fn = row_fn;
    r->ctx = ctx;
    r->err = err;
    r->line = 1;
    r->in_csv = line_fn == NULL;
    if (csv_init(&r->parser, CSV_STRICT | CSV_STRICT_FINI | CSV_APPEND_NULL) != 0)
        return r->status = pw_error_set(err, PW_ENOMEM, name, 0, "out of memory (CSV parser)");
    r->parser_ready = true;
    /* libcsv grows its field buffer by the block size (default 128 bytes), copying it each
     * time: quadratic in a field's length. See csv_segment for the growth used here. */
    csv_set_blk_size(&r->parser, CSVROWS_BLOCK);
    return PW_OK;
}

void pw_csvrows_set_delim(pw_csvrows *r, char delim)
{
    if (r->parser_ready)
        csv_set_delim(&r->parser, (unsigned char)delim);
}

char pw_csvrows_detect_delim(const char *buf, size_t len)
{
    size_t i = 0;
    if (len >= 3 && memcmp(buf, utf8_bom, 3) == 0)
        i = 3;
    while (i < len) {
        size_t end = i;
        while (end < len && buf[end] != '\n')
            end++;
        size_t k = i;
        while (k < end && (buf[k] == ' ' || buf[k] == '\t' || buf[k] == '\r'))
            k++;
        bool comment = k < end && (buf[k] == '#' || (buf[k] == '"' && k + 1 < end && buf[k + 1] == '#'));
        if (k < end && !comment) {
            size_t semis = 0, commas = 0, tabs = 0;
            bool quoted = false;
            for (size_t j = i; j < end; j++) {
                if (buf[j] == '"')
                    quoted = !quoted;
                else if (!quoted)
                    semis += buf[j] == ';', commas += buf[j] == ',', tabs += buf[j] == '\t';
            }
            if (semis > 0 && semis >= commas)
                return ';';
            if (tabs > 0 && commas == 0)
                return '\t';
            return ',';
        }
        i = end + 1;
    }
    return ',';
}

pw_status pw_csvrows_feed(pw_csvrows *r, const char *buf, size_t len)
{
    while (len && r->bytes_seen < 3 && r->status == PW_OK) {
        r->bom[r->bom_len++] = (unsigned char)*buf;
        r->bytes_seen++;
        buf++;
        len--;
        if (r->bom[r->bom_len - 1] != utf8_bom[r->bom_len - 1]) {
            process(r, (const char *)r->bom, r->bom_len); /* not a BOM: ordinary bytes */
            r->bytes_seen = 3;
        } else if (r->bom_len == 3) {
            r->bytes_seen = 3; /* a complete BOM: dropped */
        }
    }
    if (r->status == PW_OK)
        process(r, buf, len);
    return r->status;
}

pw_status pw_csvrows_finish(pw_csvrows *r)
{
    if (r->status == PW_OK && r->bytes_seen < 3 && r->bom_len)
        process(r, (const char *)r->bom, r->bom_len); /* a short input that began like a BOM */
    r->bytes_seen = 3;
    if (r->status == PW_OK && !r->in_csv && r->pre_len) {
        preamble_line(r);
        r->pre_len = 0;
    }
    if (r->parser_ready) {
        int rc = csv_fini(&r->parser, on_field, on_row, r);
        if (rc != 0 && r->status == PW_OK)
            fail(r, PW_EPARSE, r->line - r->row_newlines,
                 "malformed CSV: a quoted field opened on or before this line is never closed "
                 "(expected a closing '\"')");
    }
    return r->status;
}

void pw_csvrows_free(pw_csvrows *r)
{
    if (!r)
        return;
    if (r->parser_ready)
        csv_free(&r->parser);
    free(r->pre);
    free(r->rowbuf);
    free(r->offs);
    free(r->ptrs);
    memset(r, 0, sizeof *r);
}

/* strtod's value of a decimal (syntax already checked) by one correctly rounded IEEE operation
 * where that is exact: at most 15 significant digits D and a power of ten 10^|e| <= 10^22, both
 * exactly representable, so D * 10^e or D / 10^-e is the correctly rounded value (Clinger, PLDI
 * 1990), the value strtod gives. false: not in that range (the caller takes strtod). */
static bool decimal_fast(const char *t, double *out)
{
    static const double p10[23] = {1e0,  1e1,  1e2,  1e3,  1e4,  1e5,  1e6,  1e7,
                                   1e8,  1e9,  1e10, 1e11, 1e12, 1e13, 1e14, 1e15,
                                   1e16, 1e17, 1e18, 1e19, 1e20, 1e21, 1e22};
#if !defined(FLT_EVAL_METHOD) || FLT_EVAL_METHOD != 0
    return false; /* wider intermediate precision would round twice */
#endif
    bool neg = *t == '-';
    if (*t == '-' || *t == '+')
        t++;
    uint64_t D = 0;
    int nd = 0, e = 0;
    bool point = false, any = false;
    for (;; t++) {
        if (*t >= '0' && *t <= '9') {
            any = true;
            if (D == 0 && *t == '0') { /* a leading zero: no significant digit yet */
                if (point)
                    e--;
                continue;
            }
            if (++nd > 15)
                return false;
            D = 10 * D + (uint64_t)(*t - '0');
            if (point)
                e--;
        } else if (*t == '.' && !point) {
            point = true;
        } else {
            break;
        }
    }
    if (!any)
        return false;
    if (*t == 'e' || *t == 'E') {
        t++;
        bool eneg = *t == '-';
        if (*t == '-' || *t == '+')
            t++;
        int x = 0, nx = 0;
        for (; *t >= '0' && *t <= '9'; t++) {
            if (++nx > 4)
                return false;
            x = 10 * x + (*t - '0');
        }
        if (nx == 0)
            return false;
        e += eneg ? -x : x;
    }
    if (*t != '\0')
        return false;
    if (D == 0) {
        *out = neg ? -0.0 : 0.0;
        return true;
    }
    if (e > 22 || e < -22)
        return false;
    double v = e >= 0 ? (double)D * p10[e] : (double)D / p10[-e];
    *out = neg ? -v : v;
    return true;
}

bool pw_csvrows_number(const char *text, double *out)
{
    if (!pw_decimal_syntax_ok(text))
        return false;
    if (decimal_fast(text, out))
        return true;
    double v = strtod(text, NULL);
    if (!isfinite(v))
        return false;
    *out = v;
    return true;
}

pw_status pw_check_utf8(const char *buf, size_t len, const char *name, pw_error *err)
{
    const unsigned char *u = (const unsigned char *)buf;
    long line = 1;
    size_t col = 1;
    for (size_t i = 0; i < len;) {
        unsigned c = u[i];
        size_t n = c < 0x80 ? 1 : (c >= 0xC2 && c <= 0xDF) ? 2 : (c >= 0xE0 && c <= 0xEF) ? 3
                                : (c >= 0xF0 && c <= 0xF4) ? 4 : 0;
        bool ok = n > 0 && i + n <= len;
        for (size_t k = 1; ok && k < n; k++)
            ok = (u[i + k] & 0xC0) == 0x80;
        if (ok && n == 3)
            ok = !(c == 0xE0 && u[i + 1] < 0xA0) && !(c == 0xED && u[i + 1] >= 0xA0);
        if (ok && n == 4)
            ok = !(c == 0xF0 && u[i + 1] < 0x90) && !(c == 0xF4 && u[i + 1] >= 0x90);
        if (!ok)
            return pw_error_set(err, PW_EPARSE, name, line,
                                "byte 0x%02X at column %zu is not valid UTF-8 (expected UTF-8 text; "
                                "re-save the file as UTF-8)",
                                c, col);
        if (c == '\n') {
            line++;
            col = 0;
        }
        i += n;
        col++;
    }
    return PW_OK;
}

pw_status pw_csvrows_slurp(const char *path, size_t max_bytes, char **buf, size_t *len,
                           pw_error *err)
{
    *buf = NULL;
    *len = 0;
    int fd;
    pw_status ost = pw_file_open_regular(path, max_bytes, &fd, err);
    if (ost != PW_OK)
        return ost;
    FILE *f = fdopen(fd, "rb");
    if (!f) {
        close(fd);
        return pw_error_set(err, PW_ENOMEM, path, 0, "out of memory");
    }
    size_t cap = 0, n = 0;
    char *data = NULL;
    for (;;) {
        if (!grow((void **)&data, &cap, n + 65536 + 1, 1)) {
            free(data);
            fclose(f);
            return pw_error_set(err, PW_ENOMEM, path, 0, "out of memory while reading the file");
        }
        size_t got = fread(data + n, 1, cap - n - 1, f);
        n += got;
        if (max_bytes && n > max_bytes) {
            free(data);
            fclose(f);
            return pw_error_set(err, PW_EPARSE, path, 0,
                                "the file is larger than %zu bytes, the reader's limit", max_bytes);
        }
        if (got == 0)
            break;
    }
    int bad = ferror(f);
    int saved = errno;
    fclose(f);
    if (bad) {
        free(data);
        return pw_error_set(err, PW_EIO, path, 0, "read error: %s", strerror(saved));
    }
    data[n] = '\0';
    *buf = data;
    *len = n;
    return PW_OK;
}

pw_status pw_csvrows_feed_all(pw_csvrows *r, const char *buf, size_t len, size_t chunk)
{
    if (chunk == 0)
        chunk = len ? len : 1;
    pw_status st = PW_OK;
    for (size_t off = 0; st == PW_OK && off < len; off += chunk)
        st = pw_csvrows_feed(r, buf + off, len - off < chunk ? len - off : chunk);
    return st == PW_OK ? pw_csvrows_finish(r) : st;
}
