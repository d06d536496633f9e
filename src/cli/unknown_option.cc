#include "src/cli/unknown_option.h"

#include <algorithm>
#include <vector>

namespace coilspin::cli {
namespace {

// A misspelling this many edits away (or fewer) from a known option is suggested (common practice).
constexpr std::size_t kSuggestionEdits = 2;

// Levenshtein distance: the fewest one-character insertions, deletions and replacements.
std::size_t EditDistance(const std::string& a, const std::string& b) {
  std::vector<std::size_t> row(b.size() + 1);
  for (std::size_t j = 0; j <= b.size(); ++j) row[j] = j;
  for (std::size_t i = 1; i <= a.size(); ++i) {
    std::size_t diagonal = row[0];
    row[0] = i;
    for (std::size_t j = 1; j <= b.size(); ++j) {
      const std::size_t above = row[j];
      row[j] = std::min({row[j] + 1, row[j - 1] + 1, diagonal + (a[i - 1] == b[j - 1] ? 0 : 1)});
      diagonal = above;
    }
  }
  return row[b.size()];
}

// The command's long option nearest to `name`, when near enough.
std::optional<std::string> Nearest(const CLI::App& command, const std::string& name) {
  std::optional<std::string> best;
  std::size_t best_edits = kSuggestionEdits + 1;
  for (const CLI::Option* option : command.get_options()) {
    for (const std::string& long_name : option->get_lnames()) {
      const std::string known = "--" + long_name;
      const std::size_t edits = EditDistance(name, known);
      if (edits < best_edits) {
        best_edits = edits;
        best = known;
      }
    }
  }
  return best;
}

}  // namespace

std::optional<std::string> UnknownOptionMessage(const CLI::App& app, int argc, const char* const* argv) {
  const CLI::App* command = nullptr;
  for (int i = 1; i < argc; ++i) {
    const std::string argument = argv[i];
    if (command == nullptr) {
      if (argument.rfind("-", 0) == 0) continue;  // an option of coilspin itself (--help, --version)
      for (const CLI::App* sub : app.get_subcommands({})) {
        if (sub->check_name(argument)) command = sub;
      }
      if (command == nullptr) return std::nullopt;  // CLI11 reports an unknown command
      continue;
    }
    if (argument == "--") return std::nullopt;
    if (argument.size() <= 2 || argument.rfind("--", 0) != 0) continue;
    const std::string name = argument.substr(0, argument.find('='));
    const CLI::Option* option = command->get_option_no_throw(name);
    if (option != nullptr) {
      if (option->get_type_size_max() > 0 && argument.find('=') == std::string::npos) ++i;  // skip its value
      continue;
    }
    std::string message = "unknown option " + name + " for coilspin " + command->get_name();
    if (const auto near = Nearest(*command, name)) message += " (did you mean " + *near + "?)";
    return message + "; coilspin " + command->get_name() + " --help lists its options";
  }
  return std::nullopt;
}

}  // namespace coilspin::cli
