#pragma once
// One motor, all its bench tests: runs the fitter of each test kind present,
// gathers their parameters into one MotorEstimate, says for every model
// parameter that no test determined which test would, and adds the derived
// quantities that the estimated parameters support.
//
// Test kinds whose fitter is not built yet are rejected by the caller before
// this point (the CLI says "not yet supported").

#include <string>
#include <vector>

#include "fitters/core/motor_estimate.h"
#include "fitters/locked_rotor/locked_rotor_fit.h"
#include "src/ingest/bench_log.h"
#include "src/ingest/test_kind.h"

namespace coilspin::joint {

struct TestLog {
  TestKind kind;
  BenchLog log;
};

struct MotorFitOptions {
  std::string motor_label;
  double confidence = 0.95;
  locked_rotor::LockedRotorOptions locked_rotor;

  bool IsValid(std::string* error) const;
};

// True for the kinds this build can fit.
bool IsSupported(TestKind kind);

MotorEstimate FitMotor(const std::vector<TestLog>& tests, const MotorFitOptions& options);

}  // namespace coilspin::joint
