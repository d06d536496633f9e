#include "src/cli/session_file.h"

#include <cctype>
#include <filesystem>
#include <fstream>
#include <set>
#include <toml++/toml.h>

#include "src/ingest/input_error.h"

namespace coilspin::cli {
namespace {

[[noreturn]] void Fail(const std::string& path, const toml::source_region& where, const std::string& message) {
  throw InputError(InputErrorKind::kBadSession, path, static_cast<long>(where.begin.line),
                   static_cast<long>(where.begin.column), message);
}

void RejectUnknownKeys(const std::string& path, const toml::table& table, const std::string& where,
                       const std::set<std::string>& allowed) {
  for (const auto& [key, node] : table) {
    if (!allowed.count(std::string(key.str()))) {
      std::string list;
      for (const auto& a : allowed) list += (list.empty() ? "" : ", ") + a;
      Fail(path, node.source(), "unknown key '" + std::string(key.str()) + "' in " + where + " (expected one of: " + list + ")");
    }
  }
}

std::optional<double> Number(const std::string& path, const toml::table& table, const char* key) {
  const toml::node* node = table.get(key);
  if (!node) return std::nullopt;
  if (auto v = node->value<double>()) return *v;  // integers convert too
  Fail(path, node->source(), std::string("'") + key + "' must be a number");
}

std::string Text(const std::string& path, const toml::table& table, const char* key, const toml::source_region& owner) {
  const toml::node* node = table.get(key);
  if (!node) Fail(path, owner, std::string("missing key '") + key + "'");
  if (auto v = node->value<std::string>()) return *v;
  Fail(path, node->source(), std::string("'") + key + "' must be a string");
}

std::map<units::Quantity, std::string> QuantityMap(const std::string& path, const toml::table& test, const char* key) {
  std::map<units::Quantity, std::string> result;
  const toml::node* node = test.get(key);
  if (!node) return result;
  const toml::table* table = node->as_table();
  if (!table) Fail(path, node->source(), std::string("'") + key + "' must be a table like { speed = \"Tach (RPM)\" }");
  for (const auto& [name, value] : *table) {
    const auto quantity = units::QuantityFromName(name.str());
    if (!quantity) Fail(path, value.source(), "unknown quantity '" + std::string(name.str()) + "' in '" + key + "'");
    const auto text = value.value<std::string>();
    if (!text) Fail(path, value.source(), std::string("values in '") + key + "' must be strings");
    result[*quantity] = *text;
  }
  return result;
}

// A bench log given where the session file goes (`coilspin fit log.csv`): a .csv,
// or .tsv name, or a first line that is not a comment and holds a unit in
// brackets and a delimiter ("time [s],voltage [V]").
bool LooksLikeBenchLog(const std::string& path) {
  std::string extension = std::filesystem::path(path).extension().string();
  for (char& c : extension) c = static_cast<char>(std::tolower(static_cast<unsigned char>(c)));
  if (extension == ".csv" || extension == ".tsv") return true;
  std::ifstream in(path, std::ios::binary);
  std::string line;
  while (std::getline(in, line)) {
    const auto first = line.find_first_not_of(" \t\r");
    if (first == std::string::npos || line[first] == '#') continue;
    const bool unit = line.find('[') != std::string::npos || line.find('(') != std::string::npos;
    const bool delimited = line.find_first_of(",;\t") != std::string::npos;
    return unit && delimited && line.find('=') == std::string::npos;
  }
  return false;
}

}  // namespace

Session LoadSession(const std::string& path) {
  toml::table root;
  try {
    root = toml::parse_file(path);
  } catch (const toml::parse_error& error) {
    const auto& where = error.source();
    if (where.begin.line == 0 && !std::filesystem::exists(path))
      throw InputError(InputErrorKind::kCannotOpen, path, 0, 0, "cannot open the session file");
    if (LooksLikeBenchLog(path))
      throw InputError(InputErrorKind::kBadSession, path, 0, 0,
                       "this looks like a bench log (CSV), not a session file (TOML); give a log with the flag of "
                       "its test: --locked-rotor, --no-load, --spin-down or --step FILE (e.g. coilspin fit "
                       "--locked-rotor " + path + ")");
    throw InputError(InputErrorKind::kBadSession, path, static_cast<long>(where.begin.line),
                     static_cast<long>(where.begin.column),
                     std::string(error.description()) + " (expected a session file in TOML: docs/file-formats.md)");
  }
  Session session;
  session.path = path;
  RejectUnknownKeys(path, root, "the session file", {"motor", "bench", "fit", "test"});
  if (const toml::table* motor = root["motor"].as_table()) {
    RejectUnknownKeys(path, *motor, "[motor]", {"label"});
    if (const toml::node* label = motor->get("label")) session.motor_label = label->value_or<std::string>("");
  }
  if (const toml::table* bench = root["bench"].as_table()) {
    RejectUnknownKeys(path, *bench, "[bench]",
                      {"encoder_cpr", "gear_ratio", "winding_temperature", "reference_temperature", "known_inertia",
                       "current_sensors"});
    session.counts_per_rev = Number(path, *bench, "encoder_cpr");
    session.gear_ratio = Number(path, *bench, "gear_ratio");
    session.winding_temperature_degC = Number(path, *bench, "winding_temperature");
    session.reference_temperature_degC = Number(path, *bench, "reference_temperature");
    session.known_inertia_kg_m2 = Number(path, *bench, "known_inertia");
    if (const toml::node* sensors = bench->get("current_sensors")) {
      const std::optional<std::string> word = sensors->value<std::string>();
      if (!word || (*word != "one" && *word != "per-log"))
        Fail(path, sensors->source(), "current_sensors is \"one\" or \"per-log\"");
      session.current_sensors = word;
    }
  }
  if (const toml::table* fit = root["fit"].as_table()) {
    RejectUnknownKeys(path, *fit, "[fit]", {"confidence"});
    session.confidence = Number(path, *fit, "confidence");
  }
  const std::filesystem::path folder = std::filesystem::path(path).parent_path();
  if (const toml::node* tests = root.get("test")) {
    const toml::array* list = tests->as_array();
    if (!list) Fail(path, tests->source(), "tests are written as [[test]] tables");
    for (const toml::node& node : *list) {
      const toml::table* test = node.as_table();
      if (!test) Fail(path, node.source(), "each [[test]] must be a table");
      RejectUnknownKeys(path, *test, "[[test]]", {"kind", "file", "columns", "units"});
      const std::string kind_text = Text(path, *test, "kind", node.source());
      const auto kind = TestKindFromString(kind_text);
      if (!kind)
        Fail(path, test->get("kind")->source(),
             "unknown test kind '" + kind_text + "' (expected locked-rotor, no-load, spin-down or step)");
      const std::string file = Text(path, *test, "file", node.source());
      SessionTest t{*kind, (folder / file).string(), file, {}, {}};
      t.column_for = QuantityMap(path, *test, "columns");
      t.unit_for = QuantityMap(path, *test, "units");
      session.tests.push_back(t);
    }
  }
  return session;
}

}  // namespace coilspin::cli
