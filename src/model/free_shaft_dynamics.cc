#include "src/model/free_shaft_dynamics.h"

#include <algorithm>
#include <cmath>
#include <limits>
#include <sstream>
#include <stdexcept>
#include <string>

#include "src/model/free_shaft_time_constants.h"

namespace coilspin::model {

namespace {

// How a variable with a sign term (i with Vb, ω with Tc) behaves in the present regime.
enum class Branch {
  kFree,      // no sign term (Vb = 0 or Tc = 0): no switching
  kPositive,  // moving with sgn = +1 until it reaches zero
  kNegative,  // moving with sgn = −1 until it reaches zero
  kHeld,      // held at exactly zero (brushes blocking, rotor stuck, or terminals open)
};

struct Regime {
  Branch current;
  Branch speed;
};

// Safety net against a regime that switches back and forth without end.
constexpr long kMaxSwitchesPerSubStep = 4;
constexpr double kNoSwitch = std::numeric_limits<double>::infinity();

void Require(bool condition, const std::string& what) {
  if (!condition) throw std::invalid_argument("free-shaft integration: " + what);
}

bool NonNegative(double value) { return std::isfinite(value) && value >= 0.0; }

void Validate(const MotorParameters& motor, const FreeShaftInput& input, double duration_s) {
  Require(NonNegative(duration_s), "the duration must be >= 0");
  Require(std::isfinite(motor.inertia_kg_m2) && motor.inertia_kg_m2 > 0.0, "J must be > 0");
  Require(NonNegative(motor.back_emf_constant_V_s_per_rad) &&
              NonNegative(motor.torque_constant_N_m_per_A),
          "Ke and Kt must be >= 0");
  Require(NonNegative(motor.viscous_friction_N_m_s_per_rad) && NonNegative(motor.coulomb_friction_N_m),
          "B and Tc must be >= 0");
  Require(NonNegative(motor.brush_drop_V), "Vb must be >= 0");
  Require(NonNegative(input.drag_N_m_s2_per_rad2), "the drag coefficient must be >= 0");
  Require(std::isfinite(input.load_torque_N_m), "the load torque must be finite");
  if (input.open_circuit) return;
  Require(std::isfinite(input.supply_V), "the supply voltage must be finite");
  Require(NonNegative(motor.resistance_ohm) && NonNegative(input.supply_resistance_ohm) &&
              motor.resistance_ohm + input.supply_resistance_ohm > 0.0,
          "R and R_s must be >= 0 with R + R_s > 0");
  Require(std::isfinite(motor.inductance_H) && motor.inductance_H > 0.0,
          "L must be > 0 with a source connected");
}

double SignOf(Branch branch) {
  if (branch == Branch::kPositive) return 1.0;
  if (branch == Branch::kNegative) return -1.0;
  return 0.0;
}

class FreeShaftModel {
 public:
  FreeShaftModel(const MotorParameters& motor, const FreeShaftInput& input)
      : motor_(motor), input_(input), loop_ohm_(motor.resistance_ohm + input.supply_resistance_ohm) {}

  // u = V_s − Ke·ω: what drives the current when it is zero
  double CurrentDrive_V(const FreeShaftState& s) const {
    return input_.supply_V - motor_.back_emf_constant_V_s_per_rad * s.speed_rad_s;
  }
  // τ_d = Kt·i − τ_load: what turns the rotor when it is at rest
  double DriveTorque_N_m(const FreeShaftState& s) const {
    return motor_.torque_constant_N_m_per_A * s.current_A - input_.load_torque_N_m;
  }

  // The brush rule (see the header).
  Branch CurrentBranch(const FreeShaftState& s) const {
    if (input_.open_circuit) return Branch::kHeld;
    const double vb_V = motor_.brush_drop_V;
    if (vb_V == 0.0) return Branch::kFree;
    return BranchOf(s.current_A, CurrentDrive_V(s), vb_V);
  }
  // The stiction rule (see the header).
  Branch SpeedBranch(const FreeShaftState& s) const {
    const double tc_N_m = motor_.coulomb_friction_N_m;
    if (tc_N_m == 0.0) return Branch::kFree;
    return BranchOf(s.speed_rad_s, DriveTorque_N_m(s), tc_N_m);
  }
  Regime RegimeAt(const FreeShaftState& s) const { return {CurrentBranch(s), SpeedBranch(s)}; }

  // How far the state is from leaving the regime: ≥ 0 inside, < 0 once it has left.
  double CurrentMargin(Branch branch, const FreeShaftState& s) const {
    if (input_.open_circuit) return kNoSwitch;
    return Margin(branch, s.current_A, CurrentDrive_V(s), motor_.brush_drop_V);
  }
  double SpeedMargin(Branch branch, const FreeShaftState& s) const {
    return Margin(branch, s.speed_rad_s, DriveTorque_N_m(s), motor_.coulomb_friction_N_m);
  }
  bool LeavesRegime(const Regime& regime, const FreeShaftState& s) const {
    return CurrentMargin(regime.current, s) < 0.0 || SpeedMargin(regime.speed, s) < 0.0;
  }

  // d(i, ω, θ)/dt in the regime; a held variable does not change.
  FreeShaftState Rate(const Regime& regime, const FreeShaftState& s) const {
    FreeShaftState rate;
    if (regime.current != Branch::kHeld) {
      // L·di/dt = V_s − (R + R_s)·i − Ke·ω − Vb·sgn(i)
      rate.current_A = (input_.supply_V - loop_ohm_ * s.current_A -
                        motor_.back_emf_constant_V_s_per_rad * s.speed_rad_s -
                        motor_.brush_drop_V * SignOf(regime.current)) /
                       motor_.inductance_H;
    }
    if (regime.speed != Branch::kHeld) {
      // J·dω/dt = Kt·i − B·ω − c·ω·|ω| − Tc·sgn(ω) − τ_load
      rate.speed_rad_s = (DriveTorque_N_m(s) - motor_.viscous_friction_N_m_s_per_rad * s.speed_rad_s -
                          input_.drag_N_m_s2_per_rad2 * s.speed_rad_s * std::abs(s.speed_rad_s) -
                          motor_.coulomb_friction_N_m * SignOf(regime.speed)) /
                         motor_.inertia_kg_m2;
    }
    rate.position_rad = s.speed_rad_s;  // dθ/dt = ω
    return rate;
  }

  // One classical fourth-order Runge–Kutta step of length h.
  FreeShaftState RungeKuttaStep(const Regime& regime, const FreeShaftState& s, double h) const {
    const FreeShaftState k1 = Rate(regime, s);
    const FreeShaftState k2 = Rate(regime, Offset(s, k1, 0.5 * h));
    const FreeShaftState k3 = Rate(regime, Offset(s, k2, 0.5 * h));
    const FreeShaftState k4 = Rate(regime, Offset(s, k3, h));
    const double sixth = h / 6.0;
    FreeShaftState next;
    next.current_A = s.current_A + sixth * (k1.current_A + 2.0 * k2.current_A + 2.0 * k3.current_A + k4.current_A);
    next.speed_rad_s =
        s.speed_rad_s + sixth * (k1.speed_rad_s + 2.0 * k2.speed_rad_s + 2.0 * k3.speed_rad_s + k4.speed_rad_s);
    next.position_rad = s.position_rad + sixth * (k1.position_rad + 2.0 * k2.position_rad +
                                                  2.0 * k3.position_rad + k4.position_rad);
    return next;
  }

  // The state just past a switch with the variable that reached zero set to exactly zero.
  FreeShaftState AtSwitch(const Regime& regime, FreeShaftState s) const {
    if (IsMoving(regime.current) && CurrentMargin(regime.current, s) < 0.0) s.current_A = 0.0;
    if (IsMoving(regime.speed) && SpeedMargin(regime.speed, s) < 0.0) s.speed_rad_s = 0.0;
    return s;
  }

 private:
  static bool IsMoving(Branch branch) { return branch == Branch::kPositive || branch == Branch::kNegative; }

  // A nonzero value keeps its sign; from zero it starts in the direction of a drive that
  // exceeds the threshold, otherwise it is held.
  static Branch BranchOf(double value, double drive, double threshold) {
    if (value > 0.0) return Branch::kPositive;
    if (value < 0.0) return Branch::kNegative;
    if (drive > threshold) return Branch::kPositive;
    if (drive < -threshold) return Branch::kNegative;
    return Branch::kHeld;
  }

  // Moving: the value itself, signed by its direction. Held: threshold − |drive|.
  static double Margin(Branch branch, double value, double drive, double threshold) {
    switch (branch) {
      case Branch::kPositive:
        return value;
      case Branch::kNegative:
        return -value;
      case Branch::kHeld:
        return threshold - std::abs(drive);
      case Branch::kFree:
        break;
    }
    return kNoSwitch;
  }

  static FreeShaftState Offset(const FreeShaftState& s, const FreeShaftState& rate, double h) {
    return {s.current_A + h * rate.current_A, s.speed_rad_s + h * rate.speed_rad_s,
            s.position_rad + h * rate.position_rad};
  }

  const MotorParameters& motor_;
  const FreeShaftInput& input_;
  double loop_ohm_;
};

}  // namespace

long FreeShaftSubSteps(const MotorParameters& motor, const FreeShaftInput& input, double duration_s,
                       double speed_rad_s) {
  Validate(motor, input, duration_s);
  const double fastest_s =
      std::min(TimeConstantsOf(motor, input).fastest_s, DragTimeConstant_s(motor, input, speed_rad_s));
  const double wanted = std::ceil(duration_s / fastest_s * kRungeKuttaStepsPerTimeConstant);
  if (!(wanted <= static_cast<double>(kMaxSubStepsPerCall))) {
    std::ostringstream what;
    what << "a time constant of " << fastest_s << " s needs more than " << kMaxSubStepsPerCall
         << " sub-steps over " << duration_s << " s; use a shorter sample period";
    throw std::invalid_argument("free-shaft integration: " + what.str());
  }
  return std::max(static_cast<long>(wanted), static_cast<long>(kMinSubStepsPerCall));
}

FreeShaftState AdvanceFreeShaft(const MotorParameters& motor, const FreeShaftInput& input,
                                const FreeShaftState& start, double duration_s) {
  const long sub_steps = FreeShaftSubSteps(motor, input, duration_s, start.speed_rad_s);
  FreeShaftState state = start;
  if (input.open_circuit) state.current_A = 0.0;  // an ideal switch: i = 0 at once
  const FreeShaftModel model(motor, input);
  const double h = duration_s / static_cast<double>(sub_steps);
  const double done_within_s = kEventTimeRelativeTolerance * h;
  Regime regime = model.RegimeAt(state);
  double remaining_s = duration_s;
  long switches = 0;
  while (remaining_s > done_within_s) {
    const double step_s = std::min(h, remaining_s);
    const FreeShaftState next = model.RungeKuttaStep(regime, state, step_s);
    if (!model.LeavesRegime(regime, next)) {
      state = next;
      remaining_s -= step_s;
      continue;
    }
    // Bisect the step length: the regime still holds after `inside`, no longer after `beyond`.
    double inside_s = 0.0;
    double beyond_s = step_s;
    FreeShaftState past = next;
    while (beyond_s - inside_s > done_within_s) {
      const double middle_s = 0.5 * (inside_s + beyond_s);
      const FreeShaftState trial = model.RungeKuttaStep(regime, state, middle_s);
      if (model.LeavesRegime(regime, trial)) {
        beyond_s = middle_s;
        past = trial;
      } else {
        inside_s = middle_s;
      }
    }
    state = model.AtSwitch(regime, past);
    regime = model.RegimeAt(state);
    remaining_s -= beyond_s;
    if (++switches > kMaxSwitchesPerSubStep * sub_steps) {
      throw std::runtime_error("free-shaft integration: the brush or stiction rule switched " +
                               std::to_string(switches) + " times within " +
                               std::to_string(duration_s) + " s");
    }
  }
  return state;
}

double FreeShaftTerminalVoltage(const MotorParameters& motor, const FreeShaftInput& input,
                                const FreeShaftState& state) {
  if (input.open_circuit) return motor.back_emf_constant_V_s_per_rad * state.speed_rad_s;  // v = Ke·ω
  return input.supply_V - input.supply_resistance_ohm * state.current_A;                // v = V_s − R_s·i
}

}  // namespace coilspin::model
