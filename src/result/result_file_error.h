#pragma once
// A result file that cannot be read: not JSON (with the line and column of the
// first byte the JSON parser stopped at), not a coilspin result, or a key that
// is missing or of the wrong type (with the key's path, e.g.
// "parameters.resistance.ci"). An InputError of kind kBadResultFile, so the
// command line exits 2 on it as on any bad input.

#include <string>

#include "src/ingest/input_error.h"

namespace coilspin::result {

class ResultFileError : public InputError {
 public:
  ResultFileError(std::string file, long line, long column, std::string key, const std::string& message)
      : InputError(InputErrorKind::kBadResultFile, std::move(file), line, column,
                   key.empty() ? message : "'" + key + "': " + message),
        key_(std::move(key)) {}

  // The path of the offending key ("parameters.resistance.value"); empty for a
  // file that is not JSON at all.
  const std::string& key() const { return key_; }

 private:
  std::string key_;
};

}  // namespace coilspin::result
