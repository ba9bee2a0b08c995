/* Private: the dataset reader's state and its "# key: value" metadata lines. */
#ifndef PW_DATA_DATASET_META_H
#define PW_DATA_DATASET_META_H

#include <pinchwise/dataset.h>

#define PW_DS_KEY_MAX 64

typedef struct {
    char key[PW_DS_KEY_MAX];
    long line;
} pw_ds_key;

typedef struct pw_ds_reader {
    const char *name;
    pw_dataset ds; /* being filled; ds.pts owned until handed over */
    size_t cap;    /* capacity of ds.pts */
    pw_ds_key *keys; /* metadata keys seen so far (lower case), for duplicates */
    size_t nkeys, keys_cap;
    bool have_components, have_pressure, have_temperature;
    char fixed_unit[PW_UNIT_MAX]; /* unit of the pressure/temperature metadata */
    bool header_seen;
    long header_line;
    size_t ncols;
    long col_x, col_y, col_m; /* column indexes; col_m is T (isobaric) or P (isothermal) */
    long y_first_line;        /* first data line, where y was seen given or empty */
    bool y_given;
    char delim;               /* field separator of the file (',', or ';' or tab from a spreadsheet) */
    bool decimal_comma;       /* numbers may use ',' as the decimal mark (';' or tab separated) */
} pw_ds_reader;

/* Sets defaults: sigma_T 0.1 K, sigma_P 0.1 % (rel 0.001), sigma_y 0.004, sigma_x 0.001. */
void pw_ds_reader_init(pw_ds_reader *rd, const char *name);
void pw_ds_reader_free(pw_ds_reader *rd);

/* text with its decimal commas made points when the file uses them (rd->decimal_comma); false
 * (and out empty, so that it reads as no number) when text does not fit in cap. */
bool pw_ds_decimal_point(const pw_ds_reader *rd, const char *text, char *out, size_t cap);

/* One metadata line (starting with '#'). Lines without ':' are free comments. */
pw_status pw_ds_meta_line(pw_ds_reader *rd, const char *text, size_t len, long line,
                          pw_error *err);

/* Checks that the required metadata were given; line is where the check happens. */
pw_status pw_ds_meta_complete(pw_ds_reader *rd, long line, pw_error *err);

#endif
