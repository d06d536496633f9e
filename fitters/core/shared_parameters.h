#pragma once
// Parameters shared by the residuals of several bench tests: each test asks for
// a parameter by name; the first request adds it to the problem (with that
// request's starting value and bounds), later ones reuse it. This is how R from
// a locked-rotor log and R in a no-load log become one R.

#include <algorithm>
#include <map>
#include <string>
#include <vector>

#include "fitters/core/least_squares.h"

namespace coilspin::core {

class SharedParameters {
 public:
  explicit SharedParameters(LeastSquaresProblem* problem) : problem_(problem) {}

  // The index of `spec.name`, adding it on first use.
  int Ensure(const ParameterSpec& spec) {
    const auto it = index_.find(spec.name);
    if (it != index_.end()) return it->second;
    const int index = problem_->AddParameter(spec);
    index_[spec.name] = index;
    return index;
  }
  int Index(const std::string& name) const {
    const auto it = index_.find(name);
    return it == index_.end() ? -1 : it->second;
  }
  bool Has(const std::string& name) const { return index_.count(name) > 0; }

  // Records that residuals of `test` (a test kind) involve parameter `name`.
  void Use(const std::string& name, const std::string& test) {
    auto& tests = used_by_[name];
    if (std::find(tests.begin(), tests.end(), test) == tests.end()) tests.push_back(test);
  }
  std::vector<std::string> TestsFor(const std::string& name) const {
    const auto it = used_by_.find(name);
    return it == used_by_.end() ? std::vector<std::string>{} : it->second;
  }
  LeastSquaresProblem& problem() { return *problem_; }

 private:
  LeastSquaresProblem* problem_;
  std::map<std::string, int> index_;
  std::map<std::string, std::vector<std::string>> used_by_;
};

}  // namespace coilspin::core
