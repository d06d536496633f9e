#pragma once
// Reads a coilspin result file (docs/file-formats.md) back into the estimate
// it was written from, for the commands that start from a fit rather than from
// logs: export, tune, and datasheet verification.
//
// Format 2 reads back exactly: writing what was read gives the same bytes
// (output::ResultJson). Format 1 files are read too, into the same type:
//   - its correlation (over the estimated parameters) and standard errors give
//     the covariance, C_ab = ρ_ab·se_a·se_b (exact for Wald intervals; with
//     profile or bootstrap intervals se is not √C_aa, and the covariance so made
//     is the one those intervals imply);
//   - `speed_torque_gradient` is read as `speed_torque_slope`, its name in format 2;
//   - settings, text there, stay text.
// Keys the reader does not know are ignored, so later formats that only add
// keys read as well.

#include <nlohmann/json.hpp>
#include <optional>
#include <string>

#include "fitters/core/motor_estimate.h"
#include "src/result/result_file_error.h"

namespace coilspin::result {

inline constexpr const char* kResultFormat1 = "coilspin.result/1";
inline constexpr const char* kResultFormat2 = "coilspin.result/2";

struct ResultFile {
  int format_version = 0;  // 1 or 2
  MotorEstimate estimate;
  // The "verification" block of a fit with --datasheet, kept as written
  // (src/verify recomputes a verification from the estimate; writing this back
  // with output::ResultJson(estimate, block) gives the same bytes).
  std::optional<nlohmann::ordered_json> verification;
};

// `file` names the text in errors. Throws ResultFileError.
ResultFile ParseResult(const std::string& text, const std::string& file);

// Throws InputError (kCannotOpen) when the file cannot be read, ResultFileError otherwise.
ResultFile ReadResultFile(const std::string& path);

}  // namespace coilspin::result
