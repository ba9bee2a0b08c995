/* Private: a row reader on top of libcsv that knows physical line numbers.
 *
 * libcsv is a push parser that reports fields and row ends through callbacks but knows nothing
 * of line numbers and cannot be stopped from a callback. This wrapper
 *   - strips a UTF-8 byte-order mark at the start of the input,
 *   - optionally hands whole "preamble" lines (before the CSV part starts) to a line callback,
 *     which the dataset reader uses for its "# key: value" metadata,
 *   - feeds libcsv (CSV_STRICT | CSV_APPEND_NULL) one physical line at a time so that every row
 *     is reported with the 1-based line on which it starts (lines are counted at LF; a CRLF pair
 *     counts once; newlines inside quoted fields are counted too),
 *   - copies each row's fields into its own storage and hands them to a row callback,
 *   - keeps the first error (from libcsv or from a callback) and ignores everything after it.
 * Input may arrive in chunks of any size; the results do not depend on where chunks split. */
#ifndef PW_DATA_CSVROWS_H
#define PW_DATA_CSVROWS_H

#include <csv.h>
#include <pinchwise/status.h>
#include <stdbool.h>
#include <stddef.h>

/* A complete preamble line (no line terminator, NUL-terminated, BOM removed). Set *is_csv to
 * true to make this line the first line of the CSV part (it is then parsed as CSV); leave it
 * false to consume the line. Return PW_OK or an error status (after filling err). */
typedef pw_status (*pw_csvrows_line_fn)(void *ctx, const char *text, size_t len, long line,
                                        bool *is_csv, pw_error *err);

/* One CSV row: n NUL-terminated fields (leading/trailing blanks of unquoted fields removed by
 * libcsv), starting on line. Blank lines produce no row. Return PW_OK or an error status. */
typedef pw_status (*pw_csvrows_row_fn)(void *ctx, char **fields, size_t n, long line,
                                       pw_error *err);

typedef struct pw_csvrows {
    struct csv_parser parser;
    bool parser_ready;
    const char *name; /* file name for messages (not owned) */
    pw_csvrows_line_fn line_fn; /* NULL: no preamble, CSV from the first line */
    pw_csvrows_row_fn row_fn;
    void *ctx;
    pw_error *err;   /* where the first error goes (caller-owned, may be NULL) */
    pw_status status; /* first error, PW_OK while all is well */
    bool in_csv;
    size_t bytes_seen; /* for the byte-order mark, which may be split across chunks */
    unsigned char bom[3];
    size_t bom_len;
    long line;          /* current physical line, 1-based */
    long row_newlines;  /* LF characters inside fields of the row being assembled */
    /* the preamble line being assembled */
    char *pre;
    size_t pre_len, pre_cap;
    /* the row being assembled: fields stored back to back, NUL-terminated */
    char *rowbuf;
    size_t row_len, row_cap;
    size_t *offs;
    size_t nfields, offs_cap;
    char **ptrs;
    size_t ptrs_cap;
} pw_csvrows;

/* Prepares a reader. Returns PW_ENOMEM when libcsv cannot allocate. */
pw_status pw_csvrows_init(pw_csvrows *r, const char *name, pw_csvrows_line_fn line_fn,
                          pw_csvrows_row_fn row_fn, void *ctx, pw_error *err);

/* The field separator of the CSV part (default ','); call before feeding. */
void pw_csvrows_set_delim(pw_csvrows *r, char delim);

/* The field separator of a spreadsheet export: looks at the first line that is not blank and not
 * a '#' comment (quoted or not) and returns ';' or '\t' when that line is separated by them (more
 * of them than commas outside quotes), else ','. */
char pw_csvrows_detect_delim(const char *buf, size_t len);

/* Feeds the next len bytes. Returns the reader's status (the first error so far). */
pw_status pw_csvrows_feed(pw_csvrows *r, const char *buf, size_t len);

/* Ends the input: flushes a last line without terminator and the last row. */
pw_status pw_csvrows_finish(pw_csvrows *r);

/* Feeds the whole buffer in pieces of chunk bytes (0: all at once), then finishes: the same rows
 * and errors whatever the chunk size (the readers' tests replay every size). */
pw_status pw_csvrows_feed_all(pw_csvrows *r, const char *buf, size_t len, size_t chunk);

/* Releases everything (csv_fini was done by finish; csv_free here). Accepts a zeroed reader. */
void pw_csvrows_free(pw_csvrows *r);

/* Strict decimal number: optional sign, digits with optional '.', optional exponent; no hex,
 * no inf/nan, nothing after it, finite. Returns false when text is not such a number. */
bool pw_csvrows_number(const char *text, double *out);

/* Reads a whole file into a malloc'd buffer (*buf, owned by the caller; NUL-terminated for
 * convenience, *len excludes the NUL). PW_EIO with the system's reason when it cannot be read;
 * PW_EPARSE when it is longer than max_bytes (0 = no limit). */
pw_status pw_csvrows_slurp(const char *path, size_t max_bytes, char **buf, size_t *len,
                           pw_error *err);

/* PW_OK when buf[0..len) is valid UTF-8 (RFC 3629: no overlong forms, no surrogates, nothing
 * above U+10FFFF); otherwise PW_EPARSE naming the line and byte. */
pw_status pw_check_utf8(const char *buf, size_t len, const char *name, pw_error *err);

#endif
