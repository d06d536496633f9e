#include "src/model/free_shaft_plan_defaults.h"

#include <algorithm>
#include <cmath>
#include <stdexcept>
#include <string>

#include "src/model/coast_closed_form.h"
#include "src/model/free_shaft_dynamics.h"
#include "src/model/free_shaft_time_constants.h"

namespace coilspin::model {

namespace {

void Require(bool condition, const char* what) {
  if (!condition) throw std::invalid_argument(std::string("free-shaft plan: ") + what);
}

void RequireTimeConstants(const MotorParameters& motor, const FreeShaftInput& input) {
  Require(motor.inertia_kg_m2 > 0.0, "J must be > 0");
  Require(motor.back_emf_constant_V_s_per_rad > 0.0, "Ke must be > 0");
  if (input.open_circuit) return;
  Require(motor.inductance_H > 0.0, "L must be > 0");
  Require(motor.resistance_ohm + input.supply_resistance_ohm > 0.0, "R + R_s must be > 0");
}

double Settling(const MotorParameters& motor, const FreeShaftInput& input) {
  RequireTimeConstants(motor, input);
  const double slowest_s = TimeConstantsOf(motor, input).slowest_s;
  Require(std::isfinite(slowest_s), "the coast never ends (B = Tc = 0 with the terminals open): give its duration");
  return kSettlingTimeConstants * slowest_s;
}

}  // namespace

double SettlingTime_s(const MotorParameters& motor, const BenchConditions& bench) {
  FreeShaftInput input;
  input.supply_resistance_ohm = bench.supply_resistance_ohm;
  return Settling(motor, input);
}

double CoastTime_s(const MotorParameters& motor, const SpinDownPlan& plan) {
  FreeShaftInput coast;
  coast.open_circuit = !plan.brake_resistance_ohm.has_value();
  coast.supply_resistance_ohm = plan.brake_resistance_ohm.value_or(0.0);
  RequireTimeConstants(motor, coast);
  if (coast.open_circuit && motor.coulomb_friction_N_m > 0.0) {
    // ω_ideal = (|V_s| − Vb)/Ke bounds the speed at t_off
    const double ideal_rad_s =
        std::max(std::abs(plan.supply_V) - motor.brush_drop_V, 0.0) / motor.back_emf_constant_V_s_per_rad;
    return kCoastMargin * CoastStopTime_s(motor, ideal_rad_s);
  }
  return Settling(motor, coast);
}

}  // namespace coilspin::model
