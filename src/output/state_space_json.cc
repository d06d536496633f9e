#include "src/output/state_space_json.h"

#include <nlohmann/json.hpp>

namespace coilspin::output {
namespace {

using Json = nlohmann::ordered_json;

Json MatrixJson(const model::Matrix2& m) {
  Json rows = Json::array();
  for (const auto& row : m) rows.push_back(Json::array({row[0], row[1]}));
  return rows;
}

}  // namespace

std::string StateSpaceJson(const model::StateSpace& system, const result::ModelParameters& parameters,
                           const ExportSource& source) {
  Json j;
  j["format"] = kStateSpaceFormat;
  j["source"] = SourceJson(source);
  j["time"] = "continuous";
  j["states"] = {"current", "speed"};
  j["state_units"] = {"A", "rad/s"};
  j["inputs"] = {"voltage", "load_torque"};
  j["input_units"] = {"V", "N*m"};
  j["outputs"] = {"current", "speed"};
  j["output_units"] = {"A", "rad/s"};
  j["A"] = MatrixJson(system.a);
  j["B"] = MatrixJson(system.b);
  j["C"] = MatrixJson(system.c);
  j["D"] = MatrixJson(system.d);
  j["offsets"] = {{"brush_drop", {{"input", "voltage"},
                                  {"coefficient", -1},
                                  {"value", system.brush_drop_V},
                                  {"unit", "V"},
                                  {"sign_of", "current"}}},
                  {"coulomb_friction", {{"input", "load_torque"},
                                        {"coefficient", 1},
                                        {"value", system.coulomb_friction_N_m},
                                        {"unit", "N*m"},
                                        {"sign_of", "speed"}}}};
  j["taken_as_zero"] = parameters.taken_as_zero;
  return j.dump(2) + "\n";
}

}  // namespace coilspin::output
