#pragma once
// User-data problems found while reading logs, session files or options.
// Each carries the file, the 1-based line and column where it applies (0 when
// it does not), and a message that says what was expected. Only the CLI turns
// these into exit status 2.

#include <stdexcept>
#include <string>
#include <string_view>

namespace coilspin {

enum class InputErrorKind {
  kCannotOpen,
  kEmptyFile,
  kBinaryFile,
  kMissingHeader,
  kMissingColumn,
  kUnknownQuantity,
  kUnknownUnit,
  kNonNumericCell,
  kNotFinite,
  kTimeNotIncreasing,
  kTruncatedRow,
  kTooFewSamples,
  kConstantSignal,
  kCountsWithoutCpr,
  kBadOption,
  kBadSession,
  kDuplicateColumn,  // two header cells name the same quantity
  kBadOutputPath,    // an output file that cannot be written there (checked before the work)
  kTooLarge,         // a request or a log beyond what the machine or a stated cap allows
  kOutOfRange,       // a value outside what physics allows (a temperature below copper's −234.5 °C)
  kBadResultFile,    // a result file that is not JSON, not a coilspin result, or lacks a key
  kBadDatasheet,     // a datasheet file (TOML) that names an unknown key, a wrong unit, no nominal, ...
};

std::string_view InputErrorKindName(InputErrorKind kind);

class InputError : public std::runtime_error {
 public:
  InputError(InputErrorKind kind, std::string file, long line, long column, const std::string& message);

  InputErrorKind kind() const { return kind_; }
  const std::string& file() const { return file_; }
  long line() const { return line_; }
  long column() const { return column_; }
  // The message alone, without the "file:line:column: " prefix that what() carries.
  const std::string& message() const { return message_; }

 private:
  InputErrorKind kind_;
  std::string file_;
  long line_;
  long column_;
  std::string message_;
};

}  // namespace coilspin
