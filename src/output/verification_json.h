#pragma once
// Datasheet verification as JSON (docs/file-formats.md, schema
// docs/verification-format-1.schema.json). SI in the units named; a band's
// open side, and a value or interval a line does not have, are null.
//   VerificationJson: what `coilspin verify --json` writes, "coilspin.verification/1";
//   ResultVerificationBlock: the "verification" block of a result file written by
//   `fit --datasheet` (the same datasheet and consistency entries, and the one
//   motor's lines).

#include <nlohmann/json.hpp>
#include <string>

#include "src/verify/verification.h"

namespace coilspin::output {

inline constexpr const char* kVerificationFormat = "coilspin.verification/1";

std::string VerificationJson(const verify::Verification& verification);

nlohmann::ordered_json ResultVerificationBlock(const verify::Verification& verification);

}  // namespace coilspin::output
