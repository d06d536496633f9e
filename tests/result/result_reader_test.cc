// The result reader (src/result/result_reader.h): format 2 reads back exactly
// (write → read → write gives the same bytes), format 1 files written by
// coilspin 0.1.0 (tests/result/data/demo-format-1.json, `coilspin demo --json`
// at commit dee14f6) read into the same type, and a file that is not a result
// is an InputError naming the file, the line and column (not JSON) or the key.

#include <gtest/gtest.h>

#include <cmath>
#include <nlohmann/json.hpp>

#include "result/fitted_results.h"
#include "src/output/result_json.h"
#include "src/result/parameter_covariance.h"
#include "src/result/result_reader.h"

namespace coilspin::testing {
namespace {

const std::string kFormat1Demo = std::string(COILSPIN_TEST_SOURCE_DIR) + "/result/data/demo-format-1.json";

class RoundTrip : public ::testing::TestWithParam<const char*> {};

TEST_P(RoundTrip, WriteReadWriteIsByteIdentical) {
  const auto path = FittedResult(GetParam());
  const std::string written = Slurp(path);
  const result::ResultFile read = result::ParseResult(written, path.string());
  EXPECT_EQ(read.format_version, 2);
  // The demo's result holds the verification of its datasheet (fit --datasheet), kept as written.
  EXPECT_EQ(read.verification.has_value(), std::string(GetParam()) == kDemoResult);
  EXPECT_EQ(read.verification ? output::ResultJson(read.estimate, *read.verification) : output::ResultJson(read.estimate),
            written);
}

INSTANTIATE_TEST_SUITE_P(FittedResults, RoundTrip,
                         ::testing::Values(kDemoResult, kGivenInertiaResult, kBootstrapResult));

// Index of `key` in a names array of the result file.
std::size_t IndexIn(const nlohmann::json& names, const char* key) {
  for (std::size_t k = 0; k < names.size(); ++k)
    if (names[k] == key) return k;
  ADD_FAILURE() << key << " not among " << names;
  return 0;
}

TEST(ResultFormat2, CovarianceHoldsKtTakenEqualToKeAsKe) {
  const auto j = nlohmann::json::parse(Slurp(FittedResult(kDemoResult)));
  ASSERT_EQ(j["parameters"]["torque_constant"]["basis"], "equal-to-Ke");
  const auto& names = j["covariance"]["names"];
  const auto& c = j["covariance"]["matrix"];
  EXPECT_EQ(names.size(), j["parameters"].size());  // every parameter
  const std::size_t kt = IndexIn(names, "torque_constant"), ke = IndexIn(names, "back_emf_constant");
  for (std::size_t k = 0; k < names.size(); ++k) EXPECT_EQ(c[kt][k], c[ke][k]) << names[k];  // the same parameter
  // Var(Ke) is the square of its standard error (Wald intervals).
  const double se = j["parameters"]["back_emf_constant"]["std_error"];
  EXPECT_NEAR(std::sqrt(c[ke][ke].get<double>()), se, 1e-12 * se);
  const auto& r = j["correlation"]["matrix"];
  const auto& rn = j["correlation"]["names"];
  EXPECT_EQ(r[IndexIn(rn, "torque_constant")][IndexIn(rn, "back_emf_constant")], 1.0);
}

TEST(ResultFormat2, CovarianceHoldsAGivenValueAsAConstant) {
  const auto j = nlohmann::json::parse(Slurp(FittedResult(kGivenInertiaResult)));
  ASSERT_EQ(j["parameters"]["inertia"]["basis"], "given");
  const auto& names = j["covariance"]["names"];
  const std::size_t inertia = IndexIn(names, "inertia");
  for (std::size_t k = 0; k < names.size(); ++k) EXPECT_EQ(j["covariance"]["matrix"][inertia][k].get<double>(), 0.0);
  const auto& rn = j["correlation"]["names"];
  EXPECT_EQ(std::count(rn.begin(), rn.end(), "inertia"), 0);  // no correlation without a variance
}

TEST(ResultFormat2, OperatingVoltageAndSettingsAreTheNumbersGiven) {
  const auto j = nlohmann::json::parse(Slurp(FittedResult(kGivenInertiaResult)));
  EXPECT_EQ(j["settings"]["at_voltage_V"], 12);  // a number, as given, not a logged plateau's mean
  EXPECT_EQ(j["settings"]["known_inertia_kg_m2"].get<double>(), 3.2e-5);
  EXPECT_EQ(j["settings"]["intervals"], "wald");
  EXPECT_EQ(j["derived"]["stall_current"]["at_voltage"].get<double>(), 12.0);
  EXPECT_EQ(j["torque_speed"]["at_voltage"].get<double>(), 12.0);
  // Kv in SI is 1/Ke (rad/(s*V)); in rpm/V 60/(2π) of that (definition of rpm).
  const double ke = j["parameters"]["back_emf_constant"]["value"];
  EXPECT_NEAR(j["derived"]["speed_constant_si"]["value"].get<double>(), 1.0 / ke, 1e-12 / ke);
  EXPECT_NEAR(j["derived"]["speed_constant"]["value"].get<double>(), 60.0 / (2.0 * M_PI * ke), 1e-10 / ke);
  // One stall torque each way, named: Kt·(V − Vb)/R without friction, less Tc with it.
  const double tc = j["parameters"]["coulomb_friction"]["value"];
  EXPECT_NEAR(j["derived"]["stall_torque"]["value"].get<double>() - tc,
              j["derived"]["stall_torque_with_friction"]["value"].get<double>(), 1e-12);
  EXPECT_EQ(j["derived"]["stall_torque_with_friction"]["value"], j["torque_speed"]["points"][0]["torque"]);
  EXPECT_FALSE(j["derived"].contains("speed_torque_gradient"));
  EXPECT_TRUE(j["derived"].contains("speed_torque_slope"));
}

TEST(ResultFormat1, ReadsIntoTheSameTypeWithItsCovarianceFromTheCorrelation) {
  const result::ResultFile read = result::ReadResultFile(kFormat1Demo);
  const auto j = nlohmann::json::parse(Slurp(kFormat1Demo));
  EXPECT_EQ(read.format_version, 1);
  const MotorEstimate& e = read.estimate;
  EXPECT_EQ(e.motor_label, "dome rotator DR-2");
  EXPECT_EQ(e.Find("resistance")->value, j["parameters"]["resistance"]["value"].get<double>());
  EXPECT_EQ(e.Find("torque_constant")->basis, "equal-to-Ke");
  // C_ab = ρ_ab·se_a·se_b over the correlation's names (Kt not among them in format 1).
  ASSERT_EQ(e.correlation_names, j["correlation"]["names"].get<std::vector<std::string>>());
  const std::size_t r = 0, l = 1;
  ASSERT_EQ(e.correlation_names[r], "resistance");
  ASSERT_EQ(e.correlation_names[l], "inductance");
  const double rho = 0.5 * (j["correlation"]["matrix"][r][l].get<double>() + j["correlation"]["matrix"][l][r].get<double>());
  EXPECT_DOUBLE_EQ(e.covariance[r][l], rho * e.Find("resistance")->std_error * e.Find("inductance")->std_error);
  EXPECT_EQ(e.covariance[r][l], e.covariance[l][r]);
  // Renamed key; settings stay text.
  bool slope = false;
  for (const auto& q : e.derived) slope = slope || q.key == "speed_torque_slope";
  EXPECT_TRUE(slope);
  EXPECT_EQ(e.settings.front().first, "confidence");
  EXPECT_EQ(e.settings.front().second, "0.95");
}

TEST(ResultFormat1, WrittenAgainItIsAValidFormat2File) {
  ScratchFolder folder("format1");
  const auto out = folder.Write("again.json", output::ResultJson(result::ReadResultFile(kFormat1Demo).estimate));
  ExpectValidResultFile(out);
  const auto j = nlohmann::json::parse(Slurp(out));
  EXPECT_EQ(j["settings"]["confidence"], 0.95);  // text "0.95" in format 1, a number now
}

// The error a text raises, as (kind, line, column, key, message).
struct Caught {
  bool thrown = false;
  long line = 0, column = 0;
  std::string key, what;
};

Caught ParseError(const std::string& text) {
  Caught c;
  try {
    result::ParseResult(text, "r.json");
  } catch (const result::ResultFileError& e) {
    c = {true, e.line(), e.column(), e.key(), e.what()};
    EXPECT_EQ(e.kind(), InputErrorKind::kBadResultFile);
    EXPECT_EQ(e.file(), "r.json");
  }
  return c;
}

TEST(ResultReaderErrors, NotJsonGivesLineAndColumn) {
  const Caught c = ParseError("{\n  \"format\": \"coilspin.result/2\",\n  \"confidence\": 0.95,,\n}");
  ASSERT_TRUE(c.thrown);
  EXPECT_EQ(c.line, 3);
  EXPECT_EQ(c.column, 22);  // the second comma
  EXPECT_EQ(c.key, "");
  EXPECT_NE(c.what.find("r.json:3:22: not a JSON file"), std::string::npos) << c.what;
}

TEST(ResultReaderErrors, AnotherFormatIsNamed) {
  const Caught c = ParseError(R"({"format": "coilspin.consistency/1", "kt": {}})");
  ASSERT_TRUE(c.thrown);
  EXPECT_EQ(c.key, "format");
  EXPECT_NE(c.what.find("not a coilspin result file"), std::string::npos) << c.what;
  EXPECT_NE(ParseError(R"({"format": "coilspin.result/3"})").what.find("newer"), std::string::npos);
  EXPECT_EQ(ParseError("[1, 2]").key, "");
  EXPECT_TRUE(ParseError("[1, 2]").thrown);
}

TEST(ResultReaderErrors, MissingOrMistypedKeysAreNamedByTheirPath) {
  auto j = nlohmann::ordered_json::parse(Slurp(FittedResult(kDemoResult)));
  auto missing = j;
  missing["parameters"]["inductance"].erase("ci");
  EXPECT_EQ(ParseError(missing.dump()).key, "parameters.inductance.ci");
  auto mistyped = j;
  mistyped["parameters"]["resistance"]["value"] = "1.37";
  const Caught c = ParseError(mistyped.dump());
  EXPECT_EQ(c.key, "parameters.resistance.value");
  EXPECT_NE(c.what.find("expected a number, found string"), std::string::npos) << c.what;
  auto short_ci = j;
  short_ci["derived"]["stall_current"]["ci"] = {1.0};
  EXPECT_EQ(ParseError(short_ci.dump()).key, "derived.stall_current.ci");
  auto asymmetric = j;
  asymmetric["covariance"]["matrix"][0][1] = 1.0;
  EXPECT_EQ(ParseError(asymmetric.dump()).key, "covariance.matrix");
  auto stranger = j;
  stranger["covariance"]["names"][0] = "winding_colour";
  EXPECT_EQ(ParseError(stranger.dump()).key, "covariance");
  auto no_tests = j;
  no_tests.erase("tests");
  EXPECT_EQ(ParseError(no_tests.dump()).key, "tests");
}

TEST(ResultReaderErrors, UnreadableFilesAreCannotOpen) {
  ScratchFolder folder("unreadable");
  for (const auto& path : {folder.path() / "missing.json", folder.path()}) {
    try {
      result::ReadResultFile(path.string());
      ADD_FAILURE() << path;
    } catch (const InputError& e) {
      EXPECT_EQ(e.kind(), InputErrorKind::kCannotOpen) << e.what();
    }
  }
}

}  // namespace
}  // namespace coilspin::testing
