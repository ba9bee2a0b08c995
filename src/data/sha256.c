/* SHA-256 of a buffer (FIPS 180-4) through libmd, a small maintained message-digest library
 * (Debian's libmd-dev): no crypto-library initialisation for one hash per fit file. */
#include <pinchwise/dataset.h>

#include <sha2.h>
#include <string.h>

void pw_sha256(const void *buf, size_t len, unsigned char out[32])
{
    SHA2_CTX ctx;
    SHA256Init(&ctx);
    SHA256Update(&ctx, buf, len);
    SHA256Final(out, &ctx);
}

void pw_sha256_hex(const unsigned char digest[32], char out[65])
{
    static const char hex[] = "0123456789abcdef";
    for (size_t i = 0; i < 32; i++) {
        out[2 * i] = hex[digest[i] >> 4];
        out[2 * i + 1] = hex[digest[i] & 0x0F];
    }
    out[64] = '\0';
}
