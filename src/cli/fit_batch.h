/* Batch fitting of every dataset in a folder. */
#ifndef CLI_FIT_BATCH_H
#define CLI_FIT_BATCH_H

#include "fit_common.h"

/* Fits every *.csv in dir (name order) with model (NULL: every model, one fit file each) into
 * out_dir using two worker threads; goes
 * on past files that fail. Prints a summary table or the JSON of CONTRACT.md. Exit code 0 when
 * at least one file was fitted. */
pw_status cli_fit_batch(const char *dir, const char *out_dir, const pw_model_type *model,
                 const cli_fit_opts *co);

#endif
