#pragma once
// A misspelt option ("--colum") names itself. Left to CLI11, an unknown
// "--word" of a command that takes a positional argument is read as that
// argument, and the user is told about a session file that does not exist.

#include <CLI/CLI.hpp>
#include <optional>
#include <string>

namespace coilspin::cli {

// "unknown option --colum for coilspin fit (did you mean --column?) ...", for the
// first "--word" (or "--word=value") after the command's name in argv that the
// command does not know; nothing when every one is known or no command is named.
// Scanning stops at "--"; what follows an option that takes a value is not judged.
std::optional<std::string> UnknownOptionMessage(const CLI::App& app, int argc, const char* const* argv);

}  // namespace coilspin::cli
