#include "src/ingest/test_kind.h"

#include <array>
#include <utility>

namespace coilspin {
namespace {

constexpr std::array<std::pair<TestKind, std::string_view>, 4> kTestKindNames = {{
    {TestKind::kLockedRotor, "locked-rotor"},
    {TestKind::kNoLoad, "no-load"},
    {TestKind::kSpinDown, "spin-down"},
    {TestKind::kStep, "step"},
}};

}  // namespace

std::string_view TestKindToString(TestKind kind) {
  for (const auto& [known, name] : kTestKindNames) {
    if (known == kind) return name;
  }
  return {};  // unreachable: every enumerator has a name
}

std::optional<TestKind> TestKindFromString(std::string_view text) {
  for (const auto& [kind, name] : kTestKindNames) {
    if (name == text) return kind;
  }
  return std::nullopt;
}

const std::vector<TestKind>& AllTestKinds() {
  static const std::vector<TestKind> all = [] {
    std::vector<TestKind> kinds;
    for (const auto& entry : kTestKindNames) kinds.push_back(entry.first);
    return kinds;
  }();
  return all;
}

}  // namespace coilspin
