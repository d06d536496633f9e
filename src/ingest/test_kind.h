#pragma once
// The bench tests coilspin knows, shared by the CLI, the session file and the
// result file (one to/from-string pair, no other spelling anywhere).

#include <optional>
#include <string_view>
#include <vector>

namespace coilspin {

enum class TestKind { kLockedRotor, kNoLoad, kSpinDown, kStep };

std::string_view TestKindToString(TestKind kind);  // "locked-rotor", "no-load", ...
std::optional<TestKind> TestKindFromString(std::string_view text);
const std::vector<TestKind>& AllTestKinds();

}  // namespace coilspin
