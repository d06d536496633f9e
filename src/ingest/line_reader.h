#pragma once
// fast-cpp-csv-parser's io::LineReader (Debian libfccp-dev), included in one place.
// Its error types copy the file name with strncpy into a fixed buffer, which
// GCC's -Wstringop-truncation reports once the code is inlined into ours; the
// truncation is intended (the buffer is terminated by hand), so that warning is
// silenced for this header alone.

#if defined(__GNUC__) && !defined(__clang__)
#pragma GCC diagnostic push
#pragma GCC diagnostic ignored "-Wstringop-truncation"
#endif
#include <libfccp/csv.h>
#if defined(__GNUC__) && !defined(__clang__)
#pragma GCC diagnostic pop
#endif
