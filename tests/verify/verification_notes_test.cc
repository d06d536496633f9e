// The words of a verification (src/output/verification_notes.h): what an
// inconclusive line needs, in the figures conformity.h computes (the interval
// must shrink by k; an interval from n samples narrows as 1/√n, so about 1/k²
// times the data), the sheet's own figures in the units it wrote them in, and
// whether one line explains the whole sheet.

#include "src/output/verification_notes.h"

#include <gtest/gtest.h>

#include <limits>

namespace coilspin::output {
namespace {

verify::SpecLine ResistanceLine(double low, double high) {
  verify::SpecLine line;
  line.spec = verify::FindSpecKey("resistance");
  line.key = "resistance";
  line.band = {low, high};
  line.unit = "mohm";
  line.unit_factor_to_si = 1e-3;  // NIST SP 811 4.3: milli
  return line;
}

TEST(VerificationNotes, AnInconclusiveLineSaysHowMuchNarrowerAndWhichTests) {
  verify::LineCheck c;
  c.line = ResistanceLine(1.0, 2.0);
  c.key = "resistance";
  c.value = 1.9;
  c.ci_low = 1.7;
  c.ci_high = 2.1;
  c.tests = {"locked-rotor"};
  c.decision = verify::Decide(c.line.band, 1.9, 1.7, 2.1);
  ASSERT_EQ(c.decision.verdict, verify::Verdict::kInconclusive);
  const std::string note = LineNote(c, 0.95);
  EXPECT_NE(note.find("straddles the band's upper edge"), std::string::npos) << note;
  EXPECT_NE(note.find("decides (pass) once the interval narrows to 50 % of its width"), std::string::npos) << note;
  EXPECT_NE(note.find("about 4 times the data"), std::string::npos) << note;  // 1/0.5²
  EXPECT_NE(note.find("longer or repeated locked-rotor logs"), std::string::npos) << note;
  c.rests_on_kt_equal_to_ke = true;
  EXPECT_NE(LineNote(c, 0.95).find("a measured Kt"), std::string::npos);
}

TEST(VerificationNotes, FiguresAreShownInTheSheetsUnits) {
  const verify::SpecLine line = ResistanceLine(1.0, 2.0);
  EXPECT_EQ(InSheetUnit(1.5, line), "1500 mohm");
  EXPECT_EQ(BandInSheetUnit(line), "[1000, 2000] mohm");
  EXPECT_EQ(BandInSheetUnit(ResistanceLine(1.0, std::numeric_limits<double>::infinity())), ">= 1000 mohm");
}

TEST(VerificationNotes, NotTestedLinesGiveTheResultsReason) {
  verify::LineCheck c;
  c.line = ResistanceLine(1.0, 2.0);
  c.not_tested = verify::LineCheck::NotTested::kNotDetermined;
  c.missing = {{"inertia", "needs a spin-down"}};
  c.decision.verdict = verify::Verdict::kNotTested;
  EXPECT_EQ(LineNote(c, 0.95), "not determined by the given tests: inertia: needs a spin-down");
}

TEST(VerificationNotes, OneLineForTheWholeSheetOrOnlyForThisRelation) {
  verify::Datasheet sheet;
  sheet.rated_voltage_V = 6.0;
  sheet.lines = {ResistanceLine(1.0, 2.0)};
  verify::RelationCheck c;
  c.lines = {"resistance"};
  c.consistent = false;
  c.predicted_low = 3.0;
  c.predicted_high = 4.0;
  c.mismatch = -0.5;
  verify::Explanation e;
  e.line = "resistance";
  e.cause = verify::Explanation::Cause::kDecimalSlip;
  e.decimal_exponent = 1;
  e.whole_sheet = true;
  c.explained_by = {e};
  EXPECT_NE(RelationNote(c, sheet).find("Explained by one line alone: resistance looks off by a decimal slip of 10^1"),
            std::string::npos)
      << RelationNote(c, sheet);
  c.explained_by[0].whole_sheet = false;
  EXPECT_NE(RelationNote(c, sheet).find("No one line explains all the sheet's mismatches"), std::string::npos);
  c.explained_by.clear();
  EXPECT_NE(RelationNote(c, sheet).find("no single line explains it"), std::string::npos);
}

}  // namespace
}  // namespace coilspin::output
