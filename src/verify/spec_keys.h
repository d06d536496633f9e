#pragma once
// The lines a datasheet may state, as the result file spells their keys: the
// one table of them (spec_keys.cc). Each names the dimension of its figures
// (for the units a datasheet may write, src/units/datasheet_units.h), whether
// the result holds it as a parameter or a derived quantity, and which result
// key or derived formula (src/model/derived_quantities.h) gives the value it
// is compared with. Derived quantities are evaluated at the datasheet's rated
// voltage, from the parameters and their covariance.

#include <string>
#include <string_view>
#include <vector>

#include "src/units/datasheet_units.h"

namespace coilspin::verify {

enum class KeySource { kParameter, kDerived };

struct SpecKey {
  std::string_view key;           // "resistance", "no_load_speed" (the result file's key)
  std::string_view symbol;        // "R", "w_nl" (the result file's symbol)
  units::Dimension dimension;
  KeySource source;
  std::string_view evaluated_as;  // the parameter or derived formula giving the SI value compared
};

const std::vector<SpecKey>& SpecKeys();

// Nothing (nullptr) for a key no datasheet line may name.
const SpecKey* FindSpecKey(std::string_view key);

}  // namespace coilspin::verify
