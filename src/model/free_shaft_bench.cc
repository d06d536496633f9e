#include "src/model/free_shaft_bench.h"

#include <algorithm>
#include <cmath>
#include <stdexcept>
#include <utility>

#include "src/model/bench_noise.h"
#include "src/model/commutation_ripple.h"
#include "src/model/copper_resistance.h"
#include "src/model/sample_plan.h"
#include "src/model/wandering_friction.h"
#include "src/model/winding_warm_up.h"

namespace coilspin::model {

namespace {

// The exact, motor-side record of a run.
struct FreeShaftRecord {
  std::vector<double> time_s;
  std::vector<double> voltage_V;
  std::vector<double> current_A;
  std::vector<double> speed_rad_s;
  std::vector<double> position_rad;
  std::vector<double> temperature_degC;  // θ_w
  std::vector<char> back_emf_driven;     // the terminals are open or closed by a resistor only (V_s = 0)
};

std::size_t TotalSamples(const std::vector<FreeShaftSegment>& segments) {
  std::size_t total = 0;
  for (const FreeShaftSegment& segment : segments) total += segment.samples;
  return total;
}

// `motor` holds R at the starting winding temperature; with warm-up R follows
// θ_w(t_k), and with a wandering friction Tc becomes max(0, Tc + δ_k), each
// held over [t_k, t_k+1).
FreeShaftRecord Integrate(const MotorParameters& motor, const std::vector<FreeShaftSegment>& segments,
                          double sample_period_s, const BenchConditions& bench) {
  const std::vector<double> wander_N_m =
      FrictionWander_N_m(bench.discrepancy, sample_period_s, TotalSamples(segments), bench.seed);
  const bool warms = HasWarmUp(bench.warm_up);
  FreeShaftRecord record;
  FreeShaftState state;  // from rest
  MotorParameters now = motor;
  std::size_t k = 0;
  for (const FreeShaftSegment& segment : segments) {
    FreeShaftInput input = segment.input;
    input.drag_N_m_s2_per_rad2 = bench.discrepancy.drag_N_m_s2_per_rad2;
    if (input.open_circuit) state.current_A = 0.0;  // the ideal switch opens
    const bool back_emf_driven = input.open_circuit || input.supply_V == 0.0;
    for (std::size_t n = 0; n < segment.samples; ++n, ++k) {
      const double t_s = static_cast<double>(k) * sample_period_s;  // t_k = k·Δ
      const double temperature_degC = WindingTemperatureAt_degC(bench, t_s);
      if (warms) {
        now.resistance_ohm = CopperResistanceAt(motor.resistance_ohm, bench.winding_temperature_degC,
                                                temperature_degC);  // R(θ_w(t_k)), from R(θ_w0)
      }
      if (!wander_N_m.empty()) now.coulomb_friction_N_m = std::max(0.0, motor.coulomb_friction_N_m + wander_N_m[k]);
      record.time_s.push_back(t_s);
      record.voltage_V.push_back(FreeShaftTerminalVoltage(now, input, state));
      record.current_A.push_back(state.current_A);
      record.speed_rad_s.push_back(state.speed_rad_s);
      record.position_rad.push_back(state.position_rad);
      record.temperature_degC.push_back(temperature_degC);
      record.back_emf_driven.push_back(back_emf_driven);
      state = AdvanceFreeShaft(now, input, state, sample_period_s);
    }
  }
  return record;
}

// x·(1 + a·cos(N·θ + φ0)) on the current, and on the voltage where the back-EMF drives it.
void AddRipple(const CommutationRipple& ripple, FreeShaftRecord& record) {
  ValidateRipple(ripple);
  if (!HasRipple(ripple)) return;
  for (std::size_t k = 0; k < record.time_s.size(); ++k) {
    const double factor = RippleFactor(ripple, record.position_rad[k]);
    record.current_A[k] *= factor;
    if (record.back_emf_driven[k]) record.voltage_V[k] *= factor;
  }
}

SampledLog LogOf(const MotorParameters& motor, const std::vector<FreeShaftSegment>& segments,
                 double sample_period_s, const FreeShaftChannels& channels, const BenchConditions& bench) {
  ValidateShaftReadout(bench);
  ValidateWarmUp(bench.warm_up);
  ValidateDiscrepancy(bench.discrepancy);
  MotorParameters warm = motor;
  warm.resistance_ohm = CopperResistanceAt(motor.resistance_ohm, bench.resistance_reference_temperature_degC,
                                           bench.winding_temperature_degC);
  FreeShaftRecord record = Integrate(warm, segments, sample_period_s, bench);
  AddRipple(bench.ripple, record);
  SampledLog log;
  log.time_s = std::move(record.time_s);
  if (channels.voltage) log.voltage_V = std::move(record.voltage_V);
  if (channels.current) log.current_A = std::move(record.current_A);
  LogShaft(record.speed_rad_s, record.position_rad, channels.shaft, bench, log);
  if (channels.temperature) log.temperature_degC = std::move(record.temperature_degC);
  AddBenchNoise(bench, log);
  return log;
}

}  // namespace

SampledLog RunFreeShaftBench(const MotorParameters& motor, const std::vector<FreeShaftSegment>& segments,
                             double sample_period_s, const FreeShaftChannels& channels,
                             const BenchConditions& bench, const std::string& simulation) {
  RequireSamplePeriod(sample_period_s, simulation);
  const auto positive = [](double value) { return std::isfinite(value) && value > 0.0; };
  RequirePlan(positive(motor.back_emf_constant_V_s_per_rad) && positive(motor.torque_constant_N_m_per_A),
              simulation, "Ke and Kt must be > 0");
  try {
    return LogOf(motor, segments, sample_period_s, channels, bench);
  } catch (const std::invalid_argument& e) {
    throw std::invalid_argument(simulation + ": " + e.what());
  }
}

}  // namespace coilspin::model
