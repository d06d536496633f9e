#pragma once
// The tuning of src/tune as JSON, format "coilspin.tuning/1" (docs/exports.md),
// and as a short text for people.

#include <string>
#include <vector>

#include "src/output/export_source.h"
#include "src/tune/tuning.h"

namespace coilspin::output {

inline constexpr const char* kTuningFormat = "coilspin.tuning/1";

// `taken_as_zero`: parameters the result does not determine, used as 0.
std::string TuningJson(const tune::Tuning& tuning, const std::vector<std::string>& taken_as_zero,
                       const ExportSource& source);
std::string TuningText(const tune::Tuning& tuning, const std::vector<std::string>& taken_as_zero,
                       const ExportSource& source);

}  // namespace coilspin::output
