// The one spelling of each test kind (docs/cli-and-results.md, session file `kind`).

#include "src/ingest/test_kind.h"

#include <gtest/gtest.h>

namespace coilspin {
namespace {

TEST(TestKind, SpellingsOfTheInterfaceContract) {
  // docs/cli-and-results.md: locked-rotor | no-load | spin-down | step
  EXPECT_EQ(TestKindToString(TestKind::kLockedRotor), "locked-rotor");
  EXPECT_EQ(TestKindToString(TestKind::kNoLoad), "no-load");
  EXPECT_EQ(TestKindToString(TestKind::kSpinDown), "spin-down");
  EXPECT_EQ(TestKindToString(TestKind::kStep), "step");
}

TEST(TestKind, FromStringRoundTripsAndRejectsOtherSpellings) {
  ASSERT_EQ(AllTestKinds().size(), 4u);  // docs/cli-and-results.md lists four kinds
  for (TestKind kind : AllTestKinds()) EXPECT_EQ(TestKindFromString(TestKindToString(kind)), kind);
  // docs/cli-and-results.md: no other spelling anywhere
  EXPECT_FALSE(TestKindFromString("locked_rotor").has_value());
  EXPECT_FALSE(TestKindFromString("Step").has_value());
  EXPECT_FALSE(TestKindFromString("").has_value());
}

}  // namespace
}  // namespace coilspin
