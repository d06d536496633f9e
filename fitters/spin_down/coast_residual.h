#pragma once
// Residuals of a spin-down coast (coast_model.h), measured − model:
//   speed:     ω_k − ω(t_k)                 [rad/s]
//   position:  θ_k − (θ₀ + Θ(t_k))          [rad]   (encoder counts fitted directly)
//   voltage:   v_k − Ke·ω(t_k)              [V]     (open terminals show the back-EMF)
// t_k is measured from the power-off instant. The friction enters either as
// the ratios b = B/J, c = Tc/J (when no test fixes the absolute scale) or as
// B, Tc, J themselves (b = B/J, c = Tc/J computed inside), so the same coast
// informs absolute parameters shared with other tests.

#include <vector>

#include "fitters/spin_down/coast_model.h"

namespace coilspin::spin_down {

enum class Mechanics { kRatios, kAbsolute };

// b, c from the parameters starting at p[first]: (b, c) or (B, Tc, J).
template <typename T>
void FrictionRatios(Mechanics mechanics, T const* const* p, int first, T* b, T* c) {
  if (mechanics == Mechanics::kRatios) {
    *b = *p[first];
    *c = *p[first + 1];
  } else {
    *b = *p[first] / *p[first + 2];      // B/J
    *c = *p[first + 1] / *p[first + 2];  // Tc/J
  }
}

struct CoastSpeedResidual {
  std::vector<double> time_s;   // since power-off
  std::vector<double> speed_rad_s;
  Mechanics mechanics = Mechanics::kRatios;

  // p[0] = ω₀, then (b, c) or (B, Tc, J)
  template <typename T>
  bool operator()(T const* const* p, T* residual) const {
    T b, c;
    FrictionRatios(mechanics, p, 1, &b, &c);
    for (std::size_t k = 0; k < time_s.size(); ++k) residual[k] = speed_rad_s[k] - CoastSpeed(time_s[k], *p[0], b, c);
    return true;
  }
};

struct CoastPositionResidual {
  std::vector<double> time_s;
  std::vector<double> position_rad;
  Mechanics mechanics = Mechanics::kRatios;

  // p[0] = θ₀, p[1] = ω₀, then (b, c) or (B, Tc, J)
  template <typename T>
  bool operator()(T const* const* p, T* residual) const {
    T b, c;
    FrictionRatios(mechanics, p, 2, &b, &c);
    for (std::size_t k = 0; k < time_s.size(); ++k)
      residual[k] = position_rad[k] - (*p[0] + CoastAngle(time_s[k], *p[1], b, c));
    return true;
  }
};

struct CoastVoltageResidual {
  std::vector<double> time_s;
  std::vector<double> voltage_V;
  Mechanics mechanics = Mechanics::kRatios;

  // p[0] = Ke, p[1] = ω₀, then (b, c) or (B, Tc, J)
  template <typename T>
  bool operator()(T const* const* p, T* residual) const {
    T b, c;
    FrictionRatios(mechanics, p, 2, &b, &c);
    for (std::size_t k = 0; k < time_s.size(); ++k)
      residual[k] = voltage_V[k] - *p[0] * CoastSpeed(time_s[k], *p[1], b, c);
    return true;
  }
};

}  // namespace coilspin::spin_down
