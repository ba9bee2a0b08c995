/* Status codes and error records (project-internal identities). */
#include "pw_test.h"

#include <pinchwise/status.h>
#include <string.h>

static void every_status_has_a_message(void **state)
{
    (void)state;
    for (int s = 0; s < PW_STATUS_COUNT; s++) {
        assert_non_null(pw_strerror((pw_status)s));
        assert_true(strlen(pw_strerror((pw_status)s)) > 0);
    }
    assert_string_equal(pw_strerror((pw_status)999), "unknown status");
}

static void error_format_names_file_and_line(void **state)
{
    (void)state;
    pw_error e;
    char buf[800];
    pw_error_clear(&e);
    pw_error_set(&e, PW_EPARSE, "data.csv", 12, "x1 = %g is outside [0, 1]", 1.5);
    assert_int_equal(e.status, PW_EPARSE);
    assert_string_equal(pw_error_format(&e, buf, sizeof buf), "data.csv:12: x1 = 1.5 is outside [0, 1]");
    pw_error_set(&e, PW_EIO, "data.csv", 0, "cannot open");
    assert_string_equal(pw_error_format(&e, buf, sizeof buf), "data.csv: cannot open");
}

int main(void)
{
    pw_test_init();
    const struct CMUnitTest tests[] = {
        cmocka_unit_test(every_status_has_a_message),
        cmocka_unit_test(error_format_names_file_and_line),
    };
    return cmocka_run_group_tests(tests, NULL, NULL);
}
