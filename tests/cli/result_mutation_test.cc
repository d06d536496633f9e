// Value-level mutations of what the hand-off commands read: the demo's result
// file (for `export`, `tune` and `verify`) and the demo's datasheet (for
// `verify`), run as the command line runs them (cli::RunExport, RunTune,
// RunVerify, in process). Every run must end in exit status 0 or 1, or 2 (an
// InputError, and the output file that was there before left byte for byte). A
// crash, an abort or any other exception fails the test (issue 10: every input
// ends in 0, 1 or 2).
//
// Mutations of the result: a number replaced by an extreme (±1e308, 5e-324,
// 0, a negative, 1e9), a value of another type (a string, null, an empty
// array), a key removed, a matrix row shortened. Of the datasheet: a figure's
// number replaced by an extreme or made negative. Fixed seed; 300 runs of each,
// a few seconds. COILSPIN_MUTATION_RUNS and COILSPIN_MUTATION_SEED run more.

#include <gtest/gtest.h>

#include <cstdlib>
#include <map>
#include <random>
#include <regex>
#include <sstream>
#include <string>
#include <vector>

#include <nlohmann/json.hpp>

#include "cli/run_coilspin.h"
#include "result/fitted_results.h"
#include "src/cli/export_command.h"
#include "src/cli/tune_command.h"
#include "src/cli/verify_command.h"
#include "src/ingest/input_error.h"

namespace coilspin::testing {
namespace {

using Json = nlohmann::json;

int EnvironmentNumber(const char* name, int fallback) {
  const char* text = std::getenv(name);
  return text ? std::atoi(text) : fallback;
}

// Every value of `j` that is not an object, as JSON pointers.
void Leaves(const Json& j, const Json::json_pointer& at, std::vector<Json::json_pointer>* out) {
  if (j.is_object()) {
    for (auto it = j.begin(); it != j.end(); ++it) Leaves(*it, at / it.key(), out);
    return;
  }
  out->push_back(at);
  if (j.is_array())
    for (std::size_t k = 0; k < j.size(); ++k) Leaves(j[k], at / k, out);
}

std::string MutateResult(Json& j, std::mt19937& random) {
  const auto pick = [&](std::size_t n) { return std::uniform_int_distribution<std::size_t>(0, n - 1)(random); };
  std::vector<Json::json_pointer> leaves;
  Leaves(j, Json::json_pointer(), &leaves);
  const Json::json_pointer at = leaves[pick(leaves.size())];
  const double extremes[] = {1e308, -1e308, 5e-324, -5e-324, 0.0, -1.0, 1e9, -1e9, 1e-300, 2.0};
  switch (pick(5)) {
    case 0:
    case 1:
      j[at] = extremes[pick(std::size(extremes))];
      return "extreme number";
    case 2: {
      const Json others[] = {Json("1e308"), Json(nullptr), Json::array(), Json::object(), Json(true)};
      j[at] = others[pick(std::size(others))];
      return "another type";
    }
    case 3:
      if (at.empty()) return "none";
      j[at.parent_pointer()].is_object() ? (void)j[at.parent_pointer()].erase(at.back())
                                         : (void)j[at.parent_pointer()].erase(std::stoul(at.back()));
      return "key removed";
    default:
      if (!j[at].is_array() || j[at].empty()) return "none";
      j[at].erase(j[at].size() - 1);
      return "array shortened";
  }
}

// A datasheet figure's number ("1.38 Ω" → "-1e308 Ω"); the text around it kept.
std::string MutateSheet(const std::string& sheet, std::mt19937& random) {
  static const std::regex number(R"(\"-?[0-9]+(\.[0-9]+)?)");
  std::vector<std::smatch> found;
  for (auto it = std::sregex_iterator(sheet.begin(), sheet.end(), number); it != std::sregex_iterator(); ++it)
    found.push_back(*it);
  const std::smatch& m = found[std::uniform_int_distribution<std::size_t>(0, found.size() - 1)(random)];
  const char* const extremes[] = {"\"1e308", "\"-1e308", "\"5e-324", "\"0", "\"-3", "\"1e-300", "\"nan", "\"inf"};
  const std::string replacement = extremes[std::uniform_int_distribution<std::size_t>(0, std::size(extremes) - 1)(random)];
  return sheet.substr(0, static_cast<std::size_t>(m.position())) + replacement +
         sheet.substr(static_cast<std::size_t>(m.position() + m.length()));
}

// Runs `command` (a cli::Run* call) as main does: InputError is exit status 2.
template <typename Command>
int AsMainDoes(Command command) {
  try {
    return command();
  } catch (const InputError&) {
    return 2;
  }
}

class ResultMutation : public ::testing::Test {
 protected:
  void Check(int status, const std::string& kept, const std::string& previous, const std::string& what) {
    SCOPED_TRACE(what);
    ASSERT_TRUE(status == 0 || status == 1 || status == 2) << status;
    if (status == 2) EXPECT_EQ(Slurp(kept), previous);  // refused: the old file untouched
    ++by_status_[status];
  }
  std::map<int, int> by_status_;
};

TEST_F(ResultMutation, ExportTuneAndVerifyEndInZeroOneOrTwoAndKeepTheOldFileOnTwo) {
  const int runs = EnvironmentNumber("COILSPIN_MUTATION_RUNS", 300);
  const int seed = EnvironmentNumber("COILSPIN_MUTATION_SEED", 20);
  std::mt19937 random(static_cast<unsigned>(seed));
  const Json demo = Json::parse(Slurp(FittedResult(kDemoResult)));
  const std::string sheet = std::string(COILSPIN_DEMO_DIR) + "/datasheet.toml";
  ScratchFolder folder("result_mutation");
  const std::string result = (folder.path() / "mutated.json").string();
  const std::string kept = (folder.path() / "kept.out").string();
  const std::string previous = "previous contents\n";
  const char* const formats[] = {"spice", "state-space", "c-header", "csv"};
  for (int run = 0; run < runs; ++run) {
    Json j = demo;
    std::string mutations;
    const int count = 1 + std::uniform_int_distribution<int>(0, 2)(random);
    for (int m = 0; m < count; ++m) mutations += (m ? " + " : "") + MutateResult(j, random);
    folder.Write("mutated.json", j.dump(1));
    const std::string what = "run " + std::to_string(run) + ": " + mutations;
    std::ostringstream out, err;

    folder.Write("kept.out", previous);
    cli::ExportArguments e;
    e.result_path = result;
    e.format = formats[run % std::size(formats)];
    e.out_path = kept;
    Check(AsMainDoes([&] { return cli::RunExport(e, out, err); }), kept, previous, what + ", export " + e.format);

    folder.Write("kept.out", previous);
    cli::TuneArguments t;
    t.result_path = result;
    t.json_path = kept;
    Check(AsMainDoes([&] { return cli::RunTune(t, out, err); }), kept, previous, what + ", tune");

    folder.Write("kept.out", previous);
    cli::VerifyArguments v;
    v.datasheet_path = sheet;
    v.result_paths = {result};
    v.json_path = kept;
    Check(AsMainDoes([&] { return cli::RunVerify(v, out, err); }), kept, previous, what + ", verify");
  }
  std::printf("%d mutated result files (seed %d), 3 commands each: exit 0 %d, exit 1 %d, exit 2 %d\n", runs, seed,
              by_status_[0], by_status_[1], by_status_[2]);
  // Not vacuous: some mutations are harmless and some are refused.
  EXPECT_GT(by_status_[0] + by_status_[1], 0);
  EXPECT_GT(by_status_[2], 0);
}

TEST_F(ResultMutation, VerifyAgainstAMutatedDatasheetEndsInZeroOneOrTwo) {
  const int runs = EnvironmentNumber("COILSPIN_MUTATION_RUNS", 300);
  const int seed = EnvironmentNumber("COILSPIN_MUTATION_SEED", 21);
  std::mt19937 random(static_cast<unsigned>(seed));
  const std::string result = FittedResult(kDemoResult).string();
  const std::string sheet = Slurp(std::string(COILSPIN_DEMO_DIR) + "/datasheet.toml");
  ScratchFolder folder("sheet_mutation");
  const std::string kept = (folder.path() / "kept.csv").string();
  const std::string previous = "previous contents\n";
  for (int run = 0; run < runs; ++run) {
    std::string mutated = sheet;
    const int count = 1 + std::uniform_int_distribution<int>(0, 2)(random);
    for (int m = 0; m < count; ++m) mutated = MutateSheet(mutated, random);
    folder.Write("sheet.toml", mutated);
    folder.Write("kept.csv", previous);
    cli::VerifyArguments v;
    v.datasheet_path = (folder.path() / "sheet.toml").string();
    v.result_paths = {result};
    v.csv_path = kept;
    std::ostringstream out, err;
    Check(AsMainDoes([&] { return cli::RunVerify(v, out, err); }), kept, previous, "run " + std::to_string(run));
  }
  std::printf("%d mutated datasheets (seed %d): exit 0 %d, exit 1 %d, exit 2 %d\n", runs, seed, by_status_[0],
              by_status_[1], by_status_[2]);
  EXPECT_GT(by_status_[1], 0);  // the demo's sheet fails a line on purpose
  EXPECT_GT(by_status_[2], 0);
}

}  // namespace
}  // namespace coilspin::testing
