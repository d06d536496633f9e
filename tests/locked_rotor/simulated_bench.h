#pragma once
// Test helper: a simulated log as the fitters receive it (BenchLog, SI),
// without a round trip through a file, with isolated outliers set aside as the CLI does.

#include <string>

#include "src/ingest/bench_log.h"
#include "src/ingest/outliers.h"
#include "src/model/sampled_log.h"

namespace coilspin::testing {

inline BenchLog ToBenchLog(const model::SampledLog& s, const std::string& name) {
  BenchLog log;
  log.path = name;
  log.time_s = s.time_s;
  log.voltage_V = s.voltage_V;
  log.current_A = s.current_A;
  log.speed_rad_s = s.speed_rad_s;
  log.position_rad = s.position_rad;
  log.torque_N_m = s.torque_N_m;
  log.temperature_degC = s.temperature_degC;
  SetAsideOutliers(&log);  // as the CLI does after reading a log
  return log;
}

}  // namespace coilspin::testing
