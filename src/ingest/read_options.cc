#include "src/ingest/read_options.h"

#include <cmath>

#include "src/ingest/error_text.h"
#include "src/ingest/input_error.h"

namespace coilspin {
namespace {

void RequirePositive(double value, const std::string& what) {
  if (std::isfinite(value) && value > 0.0) return;
  throw InputError(InputErrorKind::kBadOption, "", 0, 0,
                   what + " must be a finite number > 0, got " + ingest::FormatNumber(value));
}

}  // namespace

void ValidateReadOptions(const ReadOptions& options) {
  RequirePositive(options.gear_ratio, "the gear ratio (motor turns per output turn)");
  if (options.counts_per_rev) RequirePositive(*options.counts_per_rev, "the encoder counts per revolution");
  for (const auto& [quantity, header] : options.column_for) {
    if (header.empty()) {
      throw InputError(InputErrorKind::kBadOption, "", 0, 0,
                       "--column " + std::string(units::QuantityName(quantity)) + " names an empty header");
    }
  }
  for (const auto& [quantity, spelling] : options.unit_for) {
    if (units::LookUpUnit(quantity, spelling)) continue;
    throw InputError(InputErrorKind::kUnknownUnit, "", 0, 0,
                     "--unit " + std::string(units::QuantityName(quantity)) + "=" + spelling +
                         ": unknown unit; accepted: " + ingest::AcceptedUnitList(quantity));
  }
}

}  // namespace coilspin
