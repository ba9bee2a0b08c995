/* The table of activity models: lookup by name and by parameter name. */
#include <pinchwise/model.h>

#include <stdio.h>
#include <string.h>
#include <strings.h>

static const pw_model_type *const all_models[] = {
    &pw_model_margules,
    &pw_model_vanlaar,
    &pw_model_wilson,
    &pw_model_nrtl,
    &pw_model_uniquac,
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
        if (strcasecmp(all_models[i]->name, name) == 0)
            return all_models[i];
    return NULL;
}

char *pw_model_names(char *buf, size_t len)
{
    if (!buf || len == 0)
        return buf;
    buf[0] = '\0';
    size_t used = 0;
    for (size_t i = 0; i < sizeof all_models / sizeof *all_models && used < len; i++) {
        int w = snprintf(buf + used, len - used, "%s%s", i ? ", " : "", all_models[i]->name);
        if (w < 0)
            break;
        used += (size_t)w;
    }
    return buf;
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

int pw_model_param_lookup(const pw_model_type *m, const char *name)
{
    int k = pw_model_param_index(m, name);
    if (k >= 0 || !m || !name || !m->param_aliases)
        return k;
    for (size_t i = 0; i < m->n_params; i++)
        if (m->param_aliases[i] && strcmp(m->param_aliases[i], name) == 0)
            return (int)i;
    return -1;
}
