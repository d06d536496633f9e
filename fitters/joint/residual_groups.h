#pragma once
// Every residual group of the joint problem, with what it stands for: the test
// it belongs to, its channel, and where its residuals sit in the test's log —
// one sample each for a step or a coast (fitted sample by sample), one settled
// plateau each for locked-rotor and no-load levels (fitted as plateau means).
//
// The fitters keep the measured side of each residual r = measured − model in
// their own form: a coast is turned to run forward (its samples times the sign
// s of the speed at power-off), so there  r = s·y − model'  and in the log's own
// sign  model = y − s·r,  residual = s·r.  A plateau's measured side is its mean
// ȳ, so  model = ȳ − r.

#include <cstddef>
#include <optional>
#include <utility>
#include <vector>

#include <Eigen/Dense>
#include "fitters/core/model_trace.h"
#include "fitters/locked_rotor/locked_rotor_fit.h"
#include "fitters/no_load/no_load_fit.h"
#include "fitters/spin_down/spin_down_fit.h"
#include "fitters/step/step_fit.h"

namespace coilspin::joint {

struct ResidualGroup {
  std::size_t summary;  // index into MotorEstimate::tests
  int group;            // -1 when the test did not add it
  const char* channel;
  const char* unit;  // of the channel's residuals
  bool sample_by_sample;
  // Sample by sample: residual k is log sample first_sample + k of `logged`, fitted as sign·y.
  const std::vector<double>* logged = nullptr;
  std::size_t first_sample = 0;
  double sign = 1.0;
  // Plateau means: residual k is the mean `means[k]` of the settled samples spans[k].
  std::vector<std::pair<std::size_t, std::size_t>> spans;
  std::vector<double> means;
};

std::vector<ResidualGroup> ResidualGroups(const locked_rotor::LockedRotorPlan& lr, const no_load::NoLoadPlan& nl,
                                          const spin_down::SpinDownPlan& sd, const step::StepTestPlan& st);

// The model and residuals of every group added, from the problem's residuals at the
// solution (core::LeastSquaresProblem::Residuals, one vector per group index).
std::vector<ModelTrace> ModelTraces(const std::vector<ResidualGroup>& groups,
                                    const std::vector<Eigen::VectorXd>& residuals);

}  // namespace coilspin::joint
