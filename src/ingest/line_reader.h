#pragma once
// fast-cpp-csv-parser's io::LineReader (Debian libfccp-dev), included in one place.
// Its error types copy the file name with strncpy into a fixed buffer, which
// GCC's -Wstringop-truncation reports once the code is inlined into ours; the
// truncation is intended (the buffer is terminated by hand), so that warning is
// silenced for this header alone.

//
// It is used without its reading thread (CSV_IO_NO_THREAD): by default it reads
// each next block in a new thread while the current one is parsed, but parsing
// runs at some 30 MB/s and reading from the page cache at over 1 GB/s, so the
// overlap saved under 3 % (ingest_bench, 3·10^6 rows: the same rows/s either
// way), while a thread per log cost more than the parse of a short log and put
// a second thread into every read (docs/fuzzing.md).
#ifndef CSV_IO_NO_THREAD
#define CSV_IO_NO_THREAD
#endif

#if defined(__GNUC__) && !defined(__clang__)
#pragma GCC diagnostic push
#pragma GCC diagnostic ignored "-Wstringop-truncation"
#endif
#include <limits>  // csv.h uses std::numeric_limits; its thread headers included it
#include <libfccp/csv.h>
#if defined(__GNUC__) && !defined(__clang__)
#pragma GCC diagnostic pop
#endif
