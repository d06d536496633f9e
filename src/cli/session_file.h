#pragma once
// The session file (TOML): one motor, its bench settings and its test logs.
//
//   [motor]  label
//   [bench]  encoder_cpr, gear_ratio, winding_temperature, reference_temperature, known_inertia
//   [fit]    confidence
//   [[test]] kind, file (relative to the session file), columns = { quantity = "header" },
//            units = { quantity = "unit" }
//
// Unknown tables or keys are errors with their line and column, so that a
// misspelt setting never silently falls back to a default.

#include <optional>
#include <string>
#include <vector>

#include "src/ingest/read_bench_log.h"
#include "src/ingest/test_kind.h"

namespace coilspin::cli {

struct SessionTest {
  TestKind kind;
  std::string path;          // resolved against the session file's folder
  std::string written_path;  // as written in the session file (shown in the result)
  std::map<units::Quantity, std::string> column_for;
  std::map<units::Quantity, std::string> unit_for;
};

struct Session {
  std::string path;
  std::string motor_label;
  std::optional<double> counts_per_rev;
  std::optional<double> gear_ratio;
  std::optional<double> winding_temperature_degC;
  std::optional<double> reference_temperature_degC;
  std::optional<double> known_inertia_kg_m2;
  std::optional<std::string> current_sensors;  // "one" | "per-log"
  std::optional<double> confidence;
  std::vector<SessionTest> tests;
};

// Throws InputError (kBadSession, kCannotOpen) naming the line and column.
Session LoadSession(const std::string& path);

}  // namespace coilspin::cli
