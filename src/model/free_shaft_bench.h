#pragma once
// A free-shaft bench run sample by sample (the common part of the no-load and
// spin-down simulations).
//
// Timing, as for the locked-rotor bench: samples at t_k = k·Δ; the segment
// that covers sample k sets the terminals over [t_k, t_k+1) from t_k on, so
// the first sample of a segment already logs the new connection. The motor
// starts from rest (i = 0, ω = 0, θ = 0). Opening the terminals sets i = 0 at
// once (an ideal switch; the inductive kick is not modelled); a braking
// resistor keeps the current continuous through L.
//
// Logged at each t_k, exactly: v_k (src/model/free_shaft_dynamics.h:
// V_s − R_s·i, or Ke·ω with the terminals open), i_k, and the shaft channels
// (src/model/shaft_channels.h); then commutation ripple on i_k (and on v_k
// where the back-EMF drives the terminals: open, or V_s = 0), and the sensors
// (src/model/bench_noise.h). R is taken at the bench's winding temperature by
// the copper law (docs/methods.md §7) and held there for the run, or follows
// the winding's warm-up (src/model/winding_warm_up.h). The rig's drag and
// wandering friction, when set, act on the shaft (docs/bench-artefacts.md).

#include <cstddef>
#include <string>
#include <vector>

#include "src/model/bench_conditions.h"
#include "src/model/free_shaft_dynamics.h"
#include "src/model/motor_parameters.h"
#include "src/model/sampled_log.h"
#include "src/model/shaft_channels.h"

namespace coilspin::model {

struct FreeShaftSegment {
  FreeShaftInput input;
  std::size_t samples = 0;
};

// Which channels the log carries besides time.
struct FreeShaftChannels {
  bool voltage = true;
  bool current = true;
  ShaftChannels shaft = ShaftChannels::kSpeed;
  bool temperature = false;  // the winding temperature (constant unless it warms up)
};

// Throws std::invalid_argument (its message starting with `simulation`) for a
// sample period ≤ 0, Ke ≤ 0 or Kt ≤ 0 (a free shaft without them has no
// no-load point), parameters the integrator rejects, and bad noise, artefact or
// shaft readout settings.
SampledLog RunFreeShaftBench(const MotorParameters& motor, const std::vector<FreeShaftSegment>& segments,
                             double sample_period_s, const FreeShaftChannels& channels,
                             const BenchConditions& bench, const std::string& simulation);

}  // namespace coilspin::model
