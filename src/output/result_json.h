#pragma once
// The result file, format "coilspin.result/2" (docs/file-formats.md, schema
// docs/result-format-2.schema.json): the product that simulators, controller
// tuning and firmware read. Values are SI in the units named beside them; keys
// keep a fixed order so the same fit gives byte-identical files.
// src/result/result_reader.h reads it back (and format 1).

#include <nlohmann/json.hpp>
#include <string>

#include "fitters/core/motor_estimate.h"

namespace coilspin::output {

inline constexpr const char* kResultFormat = "coilspin.result/2";

std::string ResultJson(const MotorEstimate& estimate);

// The same with a "verification" block (fit --datasheet; verification_json.h
// makes it), written before "settings".
std::string ResultJson(const MotorEstimate& estimate, const nlohmann::ordered_json& verification);

}  // namespace coilspin::output
