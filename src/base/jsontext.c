/* Shortest round-trip reals in JSON text; see include/pinchwise/jsontext.h. */
#include <pinchwise/jsontext.h>

#include <stdbool.h>
#include <stdio.h>
#include <stdlib.h>
#include <string.h>

char *pw_json_format_real(double v, char *buf, size_t cap)
{
    for (int p = 15; p <= 17; p++) {
        snprintf(buf, cap, "%.*g", p, v);
        if (p == 17 || strtod(buf, NULL) == v)
            break;
    }
    if (!strpbrk(buf, ".eEn")) { /* keep it a real: 2 -> 2.0 */
        size_t n = strlen(buf);
        if (n + 2 < cap)
            memcpy(buf + n, ".0", 3);
    }
    return buf;
}

static bool number_char(char c)
{
    return (c >= '0' && c <= '9') || c == '-' || c == '+' || c == '.' || c == 'e' || c == 'E';
}

char *pw_json_shortest_reals(const char *text)
{
    if (!text)
        return NULL;
    size_t len = strlen(text);
    /* a rewritten real grows by at most 2 characters and is at least 3 long: 2 len bounds it */
    char *out = malloc(2 * len + 16);
    if (!out)
        return NULL;
    size_t o = 0;
    bool in_string = false;
    for (size_t i = 0; i < len;) {
        char c = text[i];
        if (in_string) {
            out[o++] = c;
            i++;
            if (c == '\\' && i < len)
                out[o++] = text[i++];
            else if (c == '"')
                in_string = false;
            continue;
        }
        if (c == '"') {
            in_string = true;
            out[o++] = c;
            i++;
            continue;
        }
        if (c == '-' || (c >= '0' && c <= '9')) {
            size_t j = i;
            bool real = false;
            while (j < len && number_char(text[j])) {
                real = real || text[j] == '.' || text[j] == 'e' || text[j] == 'E';
                j++;
            }
            if (real && j - i < 64) {
                char tok[64], buf[40];
                memcpy(tok, text + i, j - i);
                tok[j - i] = '\0';
                pw_json_format_real(strtod(tok, NULL), buf, sizeof buf);
                size_t n = strlen(buf);
                if (n <= j - i + 2) { /* never grows beyond the bound above */
                    memcpy(out + o, buf, n);
                    o += n;
                    i = j;
                    continue;
                }
            }
            memcpy(out + o, text + i, j - i);
            o += j - i;
            i = j;
            continue;
        }
        out[o++] = c;
        i++;
    }
    out[o] = '\0';
    return out;
}
