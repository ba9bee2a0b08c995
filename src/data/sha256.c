/* SHA-256 of a buffer through OpenSSL's EVP interface (FIPS 180-4). */
#include <pinchwise/dataset.h>

#include <openssl/evp.h>
#include <string.h>

void pw_sha256(const void *buf, size_t len, unsigned char out[32])
{
    unsigned int n = 0;
    /* EVP_Digest only fails on allocation failure inside OpenSSL; then the digest is zeroed so
     * that it can never match a real file. */
    if (EVP_Digest(buf, len, out, &n, EVP_sha256(), NULL) != 1 || n != 32)
        memset(out, 0, 32);
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
