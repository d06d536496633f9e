#pragma once
// Reducing a long log for display without losing its extremes (the report's
// charts). The time axis from the first to the last sample is cut into
// `columns` bins of equal width, one per pixel column of a chart; in each bin
// every series keeps the sample of its smallest and of its largest value
// (NaN, a series absent there, is skipped). What a pixel column shows is then
// exactly the range [min, max] of the samples it covers: a spike of one sample
// stays, however long the log. The first and last samples and the samples
// asked for in `also` (readings set aside, the ends of a fitted span) are kept
// too. A chart holds at most 2·columns·(series) + 2 + |also| samples.
//
// A log with no more than that many samples is kept whole.

#include <cstddef>
#include <vector>

namespace coilspin::output {

// Indices of the samples to draw, increasing and distinct. `series` are the
// same length as `time_s`, which is non-decreasing.
std::vector<std::size_t> EnvelopeSamples(const std::vector<double>& time_s,
                                         const std::vector<const std::vector<double>*>& series, std::size_t columns,
                                         const std::vector<std::size_t>& also = {});

}  // namespace coilspin::output
