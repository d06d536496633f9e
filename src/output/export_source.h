#pragma once
// What every export says about where its numbers come from: the result file it
// was made from, that file's format and the motor's label.

#include <nlohmann/json.hpp>
#include <string>

namespace coilspin::output {

struct ExportSource {
  std::string result_file;   // as the user named it
  std::string result_format; // "coilspin.result/2"
  std::string motor_label;   // may be empty
  double confidence = 0.95;
};

// {"result": ..., "format": ..., "motor": ...} (motor only when labelled), the
// "source" entry of the JSON exports.
nlohmann::ordered_json SourceJson(const ExportSource& source);

// "dome rotator DR-2" → "dome_rotator_DR_2": letters, digits and '_', not
// starting with a digit; `fallback` when nothing is left.
std::string IdentifierFrom(const std::string& text, const std::string& fallback);

}  // namespace coilspin::output
