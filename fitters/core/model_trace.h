#pragma once
// The fitted model beside a logged channel, for display (the report): what each
// residual of one residual group stands for in the test's log, the model's value
// there and the residual r = measured − model. For a group fitted sample by
// sample (a step, a coast) residual k belongs to one log sample; for a group of
// plateau means (locked-rotor and no-load levels) residual k is the mean of
// the settled samples of plateau k, and the model is constant over them.
// Data only: nothing here is written into the result file.

#include <cstddef>
#include <string>
#include <utility>
#include <vector>

namespace coilspin {

struct ModelTrace {
  std::size_t test = 0;     // index into MotorEstimate::tests
  std::string channel;      // "current", "voltage", "speed", "position", "torque"
  std::string unit;         // SI unit of model and residual ("A", "V", "rad/s", "rad", "N*m")
  bool plateau_means = false;
  // Sample by sample: residual k stands for log sample first_sample + k.
  std::size_t first_sample = 0;
  // Plateau means: residual k stands for the settled samples spans[k] = [begin, end).
  std::vector<std::pair<std::size_t, std::size_t>> spans;
  std::vector<double> model;     // the model's reading, in the log's own sign
  std::vector<double> residual;  // measured − model, in the log's own sign
};

}  // namespace coilspin
