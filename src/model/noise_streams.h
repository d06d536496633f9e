#pragma once
// The noise streams of BenchConditions::seed, one per logged channel
// (src/model/measurement_noise.h), so that the noise on one channel does not
// change when another channel's σ does or when another channel is logged.

#include <cstdint>

namespace coilspin::model {

inline constexpr std::uint32_t kVoltageNoiseStream = 0;
inline constexpr std::uint32_t kCurrentNoiseStream = 1;
inline constexpr std::uint32_t kSpeedNoiseStream = 2;
inline constexpr std::uint32_t kTorqueNoiseStream = 3;

}  // namespace coilspin::model
