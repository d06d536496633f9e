#pragma once
// Figures as datasheets print them: "<number> <unit>", with the unit in any of
// the spellings people write for the same thing.
//
// A unit spelling is brought to the form the unit tables hold before it is
// looked up (nothing is guessed; only the way the operators are written changes):
//   '·' (U+00B7)                              → '*'
//   '-' or '.' between two letters ("N-m", "mN.m", "oz-in") → '*'
//   '²' (U+00B2)                              → "^2"
//   "√X" (U+221A)                             → "sqrt(X)"; "√(…)" → "sqrt(…)"
//   'µ' (U+00B5, MICRO SIGN), 'μ' (U+03BC)    → 'u'
//   whitespace                                → dropped

#include <optional>
#include <string>
#include <string_view>

namespace coilspin::units {

std::string NormalisedUnitSpelling(std::string_view spelling);

struct NumberAndUnit {
  std::optional<double> value;  // finite; nothing when `error` says why
  std::string unit;             // the text after the number, trimmed (may be empty)
  std::string trimmed;          // the whole text, trimmed
  std::string error;            // "… does not start with a number …"
};

// Splits "<number> <unit>". The number must be finite and written with '.' as
// the decimal separator; its sign is not judged here. `example` ("2.2 oz*in/A")
// is shown in the messages.
NumberAndUnit SplitNumberAndUnit(std::string_view text, std::string_view example);

}  // namespace coilspin::units
