#pragma once
// A covariance term the least-squares solve does not see (e.g. noise on a
// logged input that drives a model), added to a FitResult after the solve:
//     Cov ← Cov + ΔCov
// and every estimate's standard error, Wald interval (same Student-t quantile,
// same degrees of freedom) and the correlation matrix updated to match.

#include <Eigen/Dense>

#include "fitters/core/least_squares.h"

namespace coilspin::core {

// `extra` is in physical units, laid out as fit->covariance.
void AddCovariance(const Eigen::MatrixXd& extra, FitResult* fit);

// Replaces fit->covariance and recomputes fit->correlation from it (the
// estimates' standard errors and intervals are the caller's to set).
void SetCovariance(const Eigen::MatrixXd& covariance, FitResult* fit);

}  // namespace coilspin::core
