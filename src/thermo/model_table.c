/* The table of activity models: lookup by name and by parameter name. */
#include <pinchwise/model.h>

#include <string.h>
#include <strings.h>

static const pw_model_type *const all_models[] = {
    &pw_model_margules,
    &pw_model_vanlaar,
    &pw_model_wilson,
    &pw_model_nrtl,
};

const pw_model_type *const *pw_model_all(size_t *n)
{
    if (n)
        *n = sizeof all_models / sizeof *all_models;
    return all_models;
}

const pw_model_type *pw_model_find(const char *name)
{
    if (!name)
        return NULL;
    for (size_t i = 0; i < sizeof all_models / sizeof *all_models; i++)
        if (strcasecmp(all_models[i]->name, name) == 0) /* "NRTL" is nrtl */
            return all_models[i];
    return NULL;
}

int pw_model_param_index(const pw_model_type *m, const char *name)
{
    if (!m || !name)
        return -1;
    for (size_t i = 0; i < m->n_params; i++)
        if (strcmp(m->param_names[i], name) == 0)
            return (int)i;
    return -1;
}
