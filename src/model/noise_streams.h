#pragma once
// The noise streams of BenchConditions::seed, one per logged channel and
// artefact (src/model/measurement_noise.h), so that the noise on one channel
// does not change when another channel's σ does, when another channel is
// logged, or when an artefact is turned on. New streams take new numbers:
// the old ones keep theirs, and with them every log made before.

#include <cstdint>

namespace coilspin::model {

// White or AR(1) noise of each channel (src/model/ar1_noise.h).
inline constexpr std::uint32_t kVoltageNoiseStream = 0;
inline constexpr std::uint32_t kCurrentNoiseStream = 1;
inline constexpr std::uint32_t kSpeedNoiseStream = 2;
inline constexpr std::uint32_t kTorqueNoiseStream = 3;
// Single-sample dropouts (src/model/sensor_chain.h).
inline constexpr std::uint32_t kVoltageDropoutStream = 4;
inline constexpr std::uint32_t kCurrentDropoutStream = 5;
inline constexpr std::uint32_t kSpeedDropoutStream = 6;
inline constexpr std::uint32_t kTorqueDropoutStream = 7;
// Spikes: whether a sample has one, and its sign (src/model/sensor_chain.h).
inline constexpr std::uint32_t kVoltageSpikeStream = 8;
inline constexpr std::uint32_t kCurrentSpikeStream = 9;
inline constexpr std::uint32_t kSpeedSpikeStream = 10;
inline constexpr std::uint32_t kTorqueSpikeStream = 11;
// The wandering Coulomb friction of a free shaft (src/model/wandering_friction.h).
inline constexpr std::uint32_t kFrictionWanderStream = 12;

}  // namespace coilspin::model
