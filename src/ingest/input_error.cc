#include "src/ingest/input_error.h"

#include <array>
#include <utility>

namespace coilspin {
namespace {

constexpr std::array<std::pair<InputErrorKind, std::string_view>, 22> kKindNames = {{
    {InputErrorKind::kCannotOpen, "cannot-open"},
    {InputErrorKind::kEmptyFile, "empty-file"},
    {InputErrorKind::kBinaryFile, "binary-file"},
    {InputErrorKind::kMissingHeader, "missing-header"},
    {InputErrorKind::kMissingColumn, "missing-column"},
    {InputErrorKind::kUnknownQuantity, "unknown-quantity"},
    {InputErrorKind::kUnknownUnit, "unknown-unit"},
    {InputErrorKind::kNonNumericCell, "non-numeric-cell"},
    {InputErrorKind::kNotFinite, "not-finite"},
    {InputErrorKind::kTimeNotIncreasing, "time-not-increasing"},
    {InputErrorKind::kTruncatedRow, "truncated-row"},
    {InputErrorKind::kTooFewSamples, "too-few-samples"},
    {InputErrorKind::kConstantSignal, "constant-signal"},
    {InputErrorKind::kCountsWithoutCpr, "counts-without-cpr"},
    {InputErrorKind::kBadOption, "bad-option"},
    {InputErrorKind::kBadSession, "bad-session"},
    {InputErrorKind::kDuplicateColumn, "duplicate-column"},
    {InputErrorKind::kBadOutputPath, "bad-output-path"},
    {InputErrorKind::kTooLarge, "too-large"},
    {InputErrorKind::kOutOfRange, "out-of-range"},
    {InputErrorKind::kBadResultFile, "bad-result-file"},
    {InputErrorKind::kBadDatasheet, "bad-datasheet"},
}};

// "file:line:column: message"; the line is left out when 0, the column when it
// or the line is 0, the file when empty.
std::string WithLocation(const std::string& file, long line, long column, const std::string& message) {
  std::string text = file;
  if (line > 0) {
    text += ':' + std::to_string(line);
    if (column > 0) text += ':' + std::to_string(column);
  }
  if (!text.empty()) text += ": ";
  return text + message;
}

}  // namespace

std::string_view InputErrorKindName(InputErrorKind kind) {
  for (const auto& [known, name] : kKindNames) {
    if (known == kind) return name;
  }
  return {};  // unreachable: every enumerator has a name
}

InputError::InputError(InputErrorKind kind, std::string file, long line, long column,
                       const std::string& message)
    : std::runtime_error(WithLocation(file, line, column, message)),
      kind_(kind),
      file_(std::move(file)),
      line_(line),
      column_(column),
      message_(message) {}

}  // namespace coilspin
